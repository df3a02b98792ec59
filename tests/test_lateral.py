"""Lateral balance and tanks whose arm moves with the fuel (issue: two-axis balance)."""

from __future__ import annotations

import copy

import pytest
from hypothesis import given, settings
from hypothesis import strategies as st

from loadcheck import check_loading, load_check_inputs
from loadcheck.files import parse_aircraft
from loadcheck.loading import Loading

from .helpers import examples, sample, sample_data, simple_aircraft

HELI = sample_data("heli2/aircraft.toml")


def run(name: str):
    inputs = load_check_inputs(sample(name))
    return check_loading(inputs.aircraft, inputs.loading)


@pytest.mark.parametrize("name", ["heli2/dual.toml", "heli2/solo.toml"])
def test_helicopter_within_limits(name):
    result = run(name)
    assert result.ok
    assert all(c.lateral_arm is not None for c in result.conditions)
    assert all(i.lateral_arm is not None for i in result.items)


def test_heavy_solo_on_the_right_fails_only_laterally():
    result = run("heli2/solo_heavy_right.toml")
    assert not result.ok
    limits = [f for f in result.findings if f.severity == "limit"]
    assert limits and all(f.code == "envelope" and f.side == "right" and "lateral" in (f.subject or "") for f in limits)
    assert "right of the right limit" in limits[0].message
    # the longitudinal margins hold everywhere
    assert all(c.margins.forward > 0 and c.margins.aft > 0 for c in result.conditions)
    assert not result.burn_path.ok


def test_heavy_solo_on_the_left_is_left_of_the_limit():
    result = run("heli2/heavy_left.toml")
    sides = {f.side for f in result.findings if f.code == "envelope"}
    assert sides == {"left"}


def test_lateral_moment_by_hand():
    result = run("heli2/dual.toml")
    ramp = result.condition("ramp")
    # 962*0.4 + 170*-13.0 + 190*13.0 + 10*-19.0 + 192*-11.5
    expected = 962 * 0.4 - 2210.0 + 2470.0 - 190.0 - 2208.0
    assert ramp.lateral_moment == pytest.approx(expected)
    assert ramp.lateral_arm == pytest.approx(expected / ramp.weight)


def _mirror(data):
    out = copy.deepcopy(data)
    out["empty"]["lateral_arm"] = -out["empty"]["lateral_arm"]
    for item in out["station"] + out["tank"]:
        item["lateral_arm"] = -item["lateral_arm"]
    for envelope in out["envelope"]:
        if envelope["axes"][0] == "lateral_arm":
            envelope["points"] = [[-x, y] for x, y in envelope["points"]]
    return out


MIRRORED = parse_aircraft(_mirror(HELI))
HELICOPTER = parse_aircraft(HELI)

heli_loadings = st.fixed_dictionaries(
    {
        "left": st.floats(0, 250),
        "right": st.floats(0, 250),
        "bag_left": st.floats(0, 35),
        "bag_right": st.floats(0, 35),
        "fuel": st.floats(2, 32.0),
        "trip": st.floats(0, 1),
    }
)


def _heli_loading(v, swap=False):
    load = {"left": v["left"], "right": v["right"], "bag_left": v["bag_left"], "bag_right": v["bag_right"]}
    return Loading(load=load, fuel={"main": v["fuel"]}, burn={"taxi": 0.5, "trip": (v["fuel"] - 0.5) * v["trip"]})


@settings(max_examples=examples(100), deadline=None)
@given(heli_loadings)
def test_mirroring_lateral_arms_mirrors_the_lateral_cg(values):
    a = check_loading(HELICOPTER, _heli_loading(values))
    b = check_loading(MIRRORED, _heli_loading(values))
    for x, y in zip(a.conditions, b.conditions, strict=True):
        assert y.lateral_arm == pytest.approx(-x.lateral_arm, abs=1e-12)
        assert y.arm == x.arm and y.weight == x.weight
        assert (y.margins.left, y.margins.right) == (pytest.approx(x.margins.right), pytest.approx(x.margins.left))
        assert y.ok == x.ok
    assert a.ok == b.ok and a.burn_path.ok == b.burn_path.ok
    flip = {"left": "right", "right": "left"}
    assert sorted((f.code, f.condition, flip.get(f.side, f.side)) for f in a.findings) == sorted(
        (f.code, f.condition, f.side) for f in b.findings
    )


@settings(max_examples=examples(100), deadline=None)
@given(st.floats(30, 60), st.floats(0, 40), st.floats(0, 1), st.sampled_from(["together", "sequence"]))
def test_constant_arm_table_equals_fixed_arm(arm, fuel, share, order):
    fixed = simple_aircraft(
        tank=[
            {"id": "main", "arm": arm, "usable": 40, "fuel": "avgas"},
            {"id": "aux", "arm": 50.0, "usable": 10, "fuel": "avgas"},
        ]
    )
    table = simple_aircraft(
        tank=[
            {"id": "main", "arm_table": [[0, arm], [15, arm], [40, arm]], "usable": 40, "fuel": "avgas"},
            {"id": "aux", "arm": 50.0, "usable": 10, "fuel": "avgas"},
        ]
    )
    burn = {"trip": (fuel + 5) * share, "order": "together" if order == "together" else ["main", "aux"]}
    loading = Loading(load={"front": 200}, fuel={"main": fuel, "aux": 5}, burn=burn)
    first, second = check_loading(fixed, loading), check_loading(table, loading)
    a, b = first.to_dict(), second.to_dict()
    assert a == b | {"aircraft": a["aircraft"]}
    # the drawing samples may differ in the last bits (the table cuts the path into more pieces)
    for x, y in zip(first.burn_path.samples, second.burn_path.samples, strict=True):
        assert x.to_dict() == pytest.approx(y.to_dict(), rel=1e-12, abs=1e-9)


def _sump(table: bool):
    tank = {"id": "main", "usable": 40, "fuel": "avgas"}
    if table:
        tank["arm_table"] = [[0, 45.0], [20, -40.0], [40, 45.0]]
    else:
        tank["arm"] = 45.0
    return simple_aircraft(tank=[tank])


def test_burn_path_that_only_the_variable_arm_pushes_out():
    loading = Loading(load={"front": 200}, fuel={"main": 40}, burn={"taxi": 0, "trip": 35})
    fixed, moving = check_loading(_sump(False), loading), check_loading(_sump(True), loading)
    assert fixed.ok and fixed.burn_path.ok
    assert moving.condition("takeoff").ok and moving.condition("landing").ok
    assert not moving.burn_path.ok and not moving.ok
    leave = moving.burn_path.leaves_at
    assert leave is not None and leave.arm == pytest.approx(35.0, abs=1e-6)
    # it leaves on the way down to the 20 gal point, where the fuel's arm is furthest forward
    assert 20.0 < leave.fuel_remaining_volume < 40.0
    assert [f.code for f in moving.findings] == ["burn_path"]


def test_arm_table_in_the_moment_table():
    aircraft = _sump(True)
    result = check_loading(aircraft, Loading(load={"front": 200}, fuel={"main": 10}))
    fuel = next(i for i in result.items if i.kind == "fuel")
    assert fuel.arm == pytest.approx(45.0 + (-85.0) * 10 / 20)


# -- issue 16: a lateral envelope drawn as lateral moment, and trips -----------------------------

from loadcheck.trip import check_trip  # noqa: E402

from .test_trip import HANDBOOK_HELICOPTER  # noqa: E402


def _mirror_moment(data):
    """Every lateral arm and the lateral-moment envelope mirrored about butt line 0."""
    out = copy.deepcopy(data)
    out["empty"]["lateral_arm"] = -out["empty"]["lateral_arm"]
    for item in out["station"] + out["tank"]:
        item["lateral_arm"] = -item["lateral_arm"]
    for envelope in out["envelope"]:
        if envelope["axes"][0] == "lateral_moment":
            envelope["points"] = [[-x, y] for x, y in envelope["points"]]
    return out


HANDBOOK = parse_aircraft(HANDBOOK_HELICOPTER)
HANDBOOK_MIRRORED = parse_aircraft(_mirror_moment(HANDBOOK_HELICOPTER))


@settings(max_examples=examples(60), deadline=None)
@given(st.floats(0, 300), st.floats(0, 300), st.floats(5, 48), st.floats(0, 1), st.floats(0, 1))
def test_mirroring_every_lateral_arm_mirrors_a_trips_lateral_results(pilot, passenger, fuel, first, second):
    # FAA-H-8083-1B ch. 8 layout (published arms), invented limits: see tests/test_trip.py
    trip1 = (fuel - 1) * first
    data = {
        "load": {"pilot_seat": pilot, "passenger_seat": passenger},
        "fuel": {"main": fuel},
        "burn": {"taxi": 0.5, "trip": trip1},
        "leg": [{"load": {"passenger_seat": 0}, "burn": {"taxi": 0, "trip": (fuel - 0.5 - trip1) * second}}],
    }
    a, b = (
        check_trip(HANDBOOK, Loading.model_validate(data)),
        check_trip(HANDBOOK_MIRRORED, Loading.model_validate(data)),
    )
    assert a.ok == b.ok
    flip = {"left": "right", "right": "left"}
    for x, y in zip(a.legs, b.legs, strict=True):
        assert x.check.ok == y.check.ok and x.check.burn_path.ok == y.check.burn_path.ok
        for p, q in zip(x.check.conditions, y.check.conditions, strict=True):
            assert q.lateral_moment == pytest.approx(-p.lateral_moment, abs=1e-9)
            assert q.lateral_arm == pytest.approx(-p.lateral_arm, abs=1e-12)
            assert (q.weight, q.arm, q.ok) == (p.weight, p.arm, p.ok)
    assert sorted((f.leg, f.code, f.condition, flip.get(f.side, f.side)) for f in a.findings) == sorted(
        (f.leg, f.code, f.condition, f.side) for f in b.findings
    )


def _notched_lateral_aircraft():
    """An invented aircraft whose burn path leaves a lateral envelope and comes back: the pilot
    sits right (+10 in), the only tank is left (-10 in), every fore-and-aft arm is 40 in, and the
    lateral envelope's right limit has a notch down to 0 in at 1,350 lb."""
    return simple_aircraft(
        empty={"weight": 1000.0, "arm": 40.0, "lateral_arm": 0.0},
        station=[{"id": "seat", "arm": 40.0, "lateral_arm": 10.0, "kind": "seat"}],
        tank=[{"id": "main", "arm": 40.0, "lateral_arm": -10.0, "usable": 50.0, "fuel": "avgas"}],
        envelope=[
            {"category": "normal", "axes": ["arm", "weight"], "points": [[35, 900], [35, 2000], [48, 2000], [48, 900]]},
            {
                "category": "normal",
                "label": "lateral",
                "axes": ["lateral_arm", "weight"],
                "points": [[-2, 900], [-2, 2000], [2, 2000], [2, 1450], [0, 1350], [2, 1250], [2, 900]],
            },
        ],
    )


def test_regression_a_burn_path_leaving_a_lateral_envelope_was_told_in_fore_and_aft_words_only():
    """The finding said "the CG leaves the envelope ... CG 40.00 in" where the path leaves the lateral
    envelope: it named no envelope and gave no lateral CG, so a pilot could not tell which limit or
    which way. Worked by hand with the moment method (FAA-H-8083-1B, ch. 2; lateral CG likewise, ch. 7, from memory),
    avgas at 6.0 lb/US gal (common practice): with f lb of fuel on board the weight is W = 1,200 + f and
    the lateral moment 2,000 - 10 f, so the lateral CG is (14,000 - 10 W) / W. It meets the notch's upper
    edge x = (W - 1,350) / 50 where W^2 - 850 W - 700,000 = 0 and its lower edge x = (1,350 - W) / 50
    where W^2 - 1,850 W + 700,000 = 0."""
    aircraft = _notched_lateral_aircraft()
    loading = Loading(load={"seat": 200.0}, fuel={"main": 50.0}, burn={"taxi": 0.0, "trip": 40.0})
    result = check_loading(aircraft, loading)
    assert result.condition("takeoff").ok and result.condition("landing").ok and not result.ok
    leaves_w = (850 + (850**2 + 4 * 700_000) ** 0.5) / 2  # 1,363.42 lb
    back_w = (1850 + (1850**2 - 4 * 700_000) ** 0.5) / 2  # 1,319.49 lb
    leave = result.burn_path.leaves_at
    assert leave is not None and leave.weight == pytest.approx(leaves_w, abs=0.01)
    assert leave.lateral_arm == pytest.approx((14_000 - 10 * leaves_w) / leaves_w, abs=1e-3)
    assert leave.envelope == 1 and leave.subject == "the lateral envelope"
    (excursion,) = result.burn_path.excursions
    assert excursion.from_burned == pytest.approx(1500 - leaves_w, abs=0.01)
    assert excursion.to_burned == pytest.approx(1500 - back_w, abs=0.01)
    (finding,) = [f for f in result.findings if f.code == "burn_path"]
    assert finding.subject == "the lateral envelope"
    assert finding.message == (
        "the CG leaves the lateral envelope during the fuel burn after 136.5 lb of fuel is burned "
        "(at 1,363.4 lb, CG 40.00 in, lateral CG 0.27 in, 27.2 usgal on board) and stays out until 180.6 lb is burned, "
        "where it comes back inside"
    )
    from loadcheck.words import burn_path_summary

    assert "leaves the lateral envelope after 136.5 lb burned" in burn_path_summary(result)
    assert "lateral CG 0.27 in" in burn_path_summary(result)
