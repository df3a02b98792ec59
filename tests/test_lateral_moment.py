"""Lateral limits drawn as lateral moment against weight (FAA-H-8083-1B (2016) ch. 8, fig. 8-3).

The handbook draws a helicopter's lateral envelope as lateral offset moment against gross
weight. The limits of its figure are not given in its text, so the envelopes here are
invented: a lateral-arm box of +-2.5 in from 1,000 to 1,500 lb, and the same limits drawn in
lateral moment (+-2,500 lb-in at 1,000 lb, +-3,750 lb-in at 1,500 lb), which is exactly the
same region (a constant lateral arm is a straight line through the origin in moment-weight
space).
"""

from __future__ import annotations

import copy

import numpy as np
import pytest

from loadcheck import check_loading
from loadcheck.engine import CONDITIONS, evaluate
from loadcheck.files import parse_aircraft
from loadcheck.loading import Loading

from .helpers import random_loadings, sample_data

BOX = [[-2.5, 1000], [-2.5, 1500], [2.5, 1500], [2.5, 1000]]
MOMENTS = [[-2500.0, 1000], [-3750.0, 1500], [3750.0, 1500], [2500.0, 1000]]  # the same limits as lateral moment


def _heli(lateral_envelope: dict) -> object:
    data = sample_data("heli2/aircraft.toml")
    data["envelope"] = [e for e in data["envelope"] if "lateral_arm" not in e["axes"]] + [
        {"category": "normal", "label": "lateral", **lateral_envelope}
    ]
    return parse_aircraft(data)


ARM = _heli({"axes": ["lateral_arm", "weight"], "points": BOX})
MOMENT = _heli({"axes": ["lateral_moment", "weight"], "points": MOMENTS})
MOMENT_100 = _heli(
    {"axes": ["lateral_moment", "weight"], "moment_scale": 100.0, "points": [[m / 100.0, w] for m, w in MOMENTS]}
)


@pytest.mark.parametrize("seed", [1, 2, 3])
def test_a_lateral_moment_envelope_and_the_equivalent_lateral_arm_envelope_agree(seed):
    rows = random_loadings(ARM, 4000, seed=seed, default_max=120, taxi_max=1)
    by_arm = evaluate(ARM, *rows)
    for other in (MOMENT, MOMENT_100):
        by_moment = evaluate(other, *rows)
        for name in CONDITIONS:
            assert (by_arm.condition_ok[name] == by_moment.condition_ok[name]).all(), name
        assert (by_arm.burn_path_ok == by_moment.burn_path_ok).all()
        assert (by_arm.ok == by_moment.ok).all()
    assert 0 < by_arm.ok.sum() < len(by_arm.ok)  # the sample has loadings on both sides


def _solo_right(aircraft):
    """A heavy pilot alone in the right seat: the lateral CG goes right of the limit."""
    seats = [s for s in aircraft.station if s.kind == "seat"]
    right = max(seats, key=lambda s: s.lateral_arm or 0.0)
    tank = aircraft.tank[0]
    return Loading(
        load={right.id: right.max_weight or 110.0},
        fuel={tank.id: tank.usable * 0.02},
        burn={"trip": tank.usable * 0.01},
    )


def test_findings_of_a_lateral_moment_envelope_are_in_moment_units():
    # "right of the lateral limit by 240 lb-in at landing" (issue 16), in the aircraft's moment unit
    loading = _solo_right(MOMENT)
    result = check_loading(MOMENT, loading)
    lateral = [f for f in result.findings if f.code == "envelope" and f.side in ("left", "right")]
    assert lateral, [f.message for f in result.findings]
    for finding in lateral:
        condition = result.condition(finding.condition)
        assert finding.unit == result.units.moment
        assert "lateral moment" in finding.message and "of the lateral limit" in finding.message
        # the excess is the lateral moment beyond the limit at that weight: moment - 2.5 in x weight
        assert finding.excess == pytest.approx(abs(condition.lateral_moment) - 2.5 * condition.weight, rel=1e-9)
    # and the same loading is out of limits with the equivalent lateral-arm envelope too
    assert not check_loading(ARM, loading).ok and not result.ok


def _mirrored(aircraft):
    data = copy.deepcopy(aircraft.model_dump(mode="json", exclude_none=True))
    data["empty"]["lateral_arm"] = -data["empty"].get("lateral_arm", 0.0)
    for item in data["station"] + data["tank"]:
        if "lateral_arm" in item:
            item["lateral_arm"] = -item["lateral_arm"]
    return parse_aircraft(data)


def test_mirroring_every_lateral_arm_mirrors_the_lateral_results():
    mirrored = _mirrored(MOMENT)
    rows = random_loadings(MOMENT, 2000, seed=7, default_max=120, taxi_max=1)
    a, b = evaluate(MOMENT, *rows), evaluate(mirrored, *rows)
    assert (a.ok == b.ok).all()
    for name in CONDITIONS:
        assert np.allclose(a.lateral_moment[name], -b.lateral_moment[name], rtol=1e-12, atol=1e-9)
