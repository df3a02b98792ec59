"""Property tests (hypothesis): invariants the check must keep for any loading."""

from __future__ import annotations

import copy
import random

import pytest
from hypothesis import assume, given, settings
from hypothesis import strategies as st

from loadcheck import check_loading
from loadcheck.files import parse_aircraft
from loadcheck.loading import Loading
from loadcheck.units import KG_PER_LB, L_PER_USGAL, MM_PER_IN

from .helpers import examples, sample_data, simple_aircraft

TRAINER = sample_data("trainer4/aircraft.toml")

loadings = st.fixed_dictionaries(
    {
        "front": st.floats(0, 460, allow_subnormal=False),  # a subnormal weight in lb is 0 in kg: another loading
        "rear": st.floats(0, 400),
        "hold": st.floats(0, 150),
        "fuel": st.floats(0, 44),
        "taxi": st.floats(0, 2),
        "trip_share": st.floats(0, 1),
    }
)


def _loading(values, mass=1.0, volume=1.0, category="normal") -> Loading:
    taxi = min(values["taxi"], values["fuel"])
    trip = (values["fuel"] - taxi) * values["trip_share"]
    return Loading(
        category=category,
        load={k: values[k] * mass for k in ("front", "rear", "hold")},
        fuel={"mains": values["fuel"] * volume},
        burn={"taxi": taxi * volume, "trip": trip * volume},
    )


def _metric(data):
    """The trainer's data converted to kg, mm and litres with the exact constants."""
    out = copy.deepcopy(data)
    out["units"] = {"mass": "kg", "arm": "mm", "fuel_volume": "l"}
    out["empty"]["weight"] *= KG_PER_LB
    out["empty"]["arm"] *= MM_PER_IN
    for key in ("max_ramp_weight", "max_takeoff_weight", "max_landing_weight"):
        out["limits"][key] *= KG_PER_LB
    out["mac"] = {k: v * MM_PER_IN for k, v in out["mac"].items()}
    for station in out["station"]:
        station["arm"] *= MM_PER_IN
        station["max_weight"] *= KG_PER_LB
    for group in out["station_group"]:
        group["max_weight"] *= KG_PER_LB
    for tank in out["tank"]:
        tank["arm"] *= MM_PER_IN
        tank["usable"] *= L_PER_USGAL
        tank["levels"] = {k: v * L_PER_USGAL for k, v in tank["levels"].items()}
    for envelope in out["envelope"]:
        envelope["points"] = [[a * MM_PER_IN, w * KG_PER_LB] for a, w in envelope["points"]]
    return out


IMPERIAL = parse_aircraft(TRAINER)
METRIC = parse_aircraft(_metric(TRAINER))


def _clear_of_limits(result, room: float = 1e-6) -> bool:
    """True when no condition sits within ``room`` of a limit (the verdict is then robust)."""
    for c in result.conditions:
        for value in c.margins.to_dict().values():
            if value is not None and abs(value) < room * 100:
                return False
    return all(f.excess is None or f.excess > room * 100 for f in result.findings)


@settings(max_examples=examples(60))
@given(loadings, st.sampled_from(["normal", "utility"]))
def test_same_loading_in_kg_mm_and_lb_in_gives_the_same_answer(values, category):
    imperial = check_loading(IMPERIAL, _loading(values, category=category))
    metric = check_loading(METRIC, _loading(values, KG_PER_LB, L_PER_USGAL, category))
    assume(_clear_of_limits(imperial))
    assert imperial.ok == metric.ok
    assert imperial.burn_path.ok == metric.burn_path.ok
    for a, b in zip(imperial.conditions, metric.conditions, strict=True):
        assert a.ok == b.ok
        assert b.weight == pytest.approx(a.weight * KG_PER_LB, rel=1e-9)
        assert b.arm == pytest.approx(a.arm * MM_PER_IN, rel=1e-9)
        assert b.mac_percent == pytest.approx(a.mac_percent, rel=1e-9, abs=1e-9)
    assert sorted(f.code for f in imperial.findings) == sorted(f.code for f in metric.findings)


@settings(max_examples=examples(60))
@given(loadings)
def test_moments_add_up(values):
    result = check_loading(IMPERIAL, _loading(values))
    ramp = result.condition("ramp")
    assert sum(i.weight for i in result.items) == pytest.approx(ramp.weight, rel=1e-12)
    assert sum(i.moment for i in result.items) == pytest.approx(ramp.moment, rel=1e-12)
    assert ramp.arm == pytest.approx(ramp.moment / ramp.weight, rel=1e-12)


@settings(max_examples=examples(30))
@given(loadings, st.randoms(use_true_random=False))
def test_order_of_items_does_not_matter(values, rng: random.Random):
    base = _loading(values)
    shuffled_load = dict(rng.sample(list(base.load.items()), len(base.load)))
    data = copy.deepcopy(TRAINER)
    rng.shuffle(data["station"])
    aircraft = parse_aircraft(data)
    a = check_loading(IMPERIAL, base)
    b = check_loading(aircraft, base.model_copy(update={"load": shuffled_load}))
    assert a.ok == b.ok
    for x, y in zip(a.conditions, b.conditions, strict=True):
        assert y.weight == pytest.approx(x.weight, rel=1e-12)
        assert y.arm == pytest.approx(x.arm, rel=1e-12)
    assert sorted((f.code, f.condition) for f in a.findings) == sorted((f.code, f.condition) for f in b.findings)


@settings(max_examples=examples(60))
@given(st.floats(0, 400), st.sampled_from([35.0, 48.0]))
def test_cg_exactly_on_a_limit_is_within(front, limit):
    # the simple box: aft limit 48.0 in, forward 35.0 in, 900..2000 lb; no fuel
    aircraft = simple_aircraft(tank=[])
    empty_w, empty_m = 1000.0, 40_000.0
    w0, m0 = empty_w + front, empty_m + 35.0 * front
    # one more station's weight that puts the CG exactly on the limit
    if limit == 48.0:
        arm = 70.0
        extra = (limit * w0 - m0) / (arm - limit)
        assume(0 <= extra and w0 + extra <= 2000.0)
        load = {"front": front, "rear": extra}
    else:
        # forward limit: put everything at 35 in is not enough; use a ballast-like negative arm
        aircraft = simple_aircraft(tank=[], station=[{"id": "front", "arm": 35.0}, {"id": "nose", "arm": 0.0}])
        extra = (m0 - limit * w0) / limit
        assume(0 <= extra and w0 + extra <= 2000.0)
        load = {"front": front, "nose": extra}
    result = check_loading(aircraft, Loading(load=load))
    ramp = result.condition("ramp")
    assert ramp.arm == pytest.approx(limit, abs=1e-9)
    assert result.ok, result.findings


def test_weight_exactly_on_the_limit_is_within():
    aircraft = simple_aircraft(tank=[], station=[{"id": "cg", "arm": 40.0}])
    result = check_loading(aircraft, Loading(load={"cg": 1000.0}))
    assert result.condition("ramp").weight == 2000.0
    assert result.ok
