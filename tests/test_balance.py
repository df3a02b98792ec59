"""Moment arithmetic checked against published worked examples and formulas.

Sources:
- FAA-H-8083-1A, Aircraft Weight and Balance Handbook (2007), chapter 5, "Weight
  Shifting": 8,000 lb with 616,000 in-lb; 100 lb moved from station 30 to station 150
  gives CG 78.5 in.
- FAA-H-8083-25 (Pilot's Handbook of Aeronautical Knowledge), chapter "Weight and
  Balance", weight-shifting example: 7,800 lb at CG 81.5 in, aft limit 80.5 in; 65 lb
  moved from station 150 to station 30 brings the CG to the limit (the handbook rounds
  the 65.0 lb result; we check the arithmetic of the published relation).
- FAA-H-8083-25, same chapter, weight addition and removal: 6,860 lb at CG 80.0 in with
  140 lb added at station 150 gives 81.4 in; 6,100 lb at CG 78.0 in with 100 lb removed
  from station 150 gives 76.8 in (the removal example from memory).
- FAA-H-8083-1B chapter 2: CG = total moment / total weight; percent MAC =
  100 (CG - LEMAC) / MAC.

The relations themselves are not computed here: each check is a published figure. The
check's arithmetic on random aircraft and loadings is compared with the independent
oracle (tests/test_oracle.py).
"""

from __future__ import annotations

import pytest

from loadcheck.check import check_loading
from loadcheck.loading import Loading

from .helpers import simple_aircraft


def _mass(weight: float, arm: float, stations: dict[str, float], loads: dict[str, float]):
    """The zero-fuel condition of an aircraft of ``weight`` at ``arm`` (its empty weight)
    carrying ``loads`` at stations of the given arms, as the check computes it."""
    aircraft = simple_aircraft(
        empty={"weight": weight, "arm": arm},
        limits={"max_takeoff_weight": 1e7},
        station=[{"id": k, "arm": a, "kind": "cargo"} for k, a in stations.items()],
        envelope=[
            {"category": "normal", "axes": ["arm", "weight"], "points": [[-1e4, 1], [-1e4, 1e7], [1e4, 1e7], [1e4, 1]]}
        ],
    )
    return check_loading(aircraft, Loading(load=loads, fuel={"main": 0})).condition("zero_fuel")


def test_faa_h_8083_1a_chapter_5_weight_shift_to_78_5_in():
    # FAA-H-8083-1A ch. 5: 8,000 lb, 616,000 in-lb; 100 lb from sta 30 to sta 150
    stations = {"sta30": 30.0, "sta150": 150.0}
    rest = 8000.0 - 100.0
    before = _mass(rest, (616_000.0 - 100.0 * 30.0) / rest, stations, {"sta30": 100.0})
    after = _mass(rest, (616_000.0 - 100.0 * 30.0) / rest, stations, {"sta150": 100.0})
    assert before.moment == pytest.approx(616_000.0, rel=1e-12) and before.arm == pytest.approx(77.0, rel=1e-12)
    assert after.moment - before.moment == pytest.approx(12_000.0, rel=1e-12)
    assert after.arm == pytest.approx(78.5, abs=1e-12)


def test_phak_weight_shift_to_the_aft_limit():
    # FAA-H-8083-25, Weight and Balance chapter: 7,800 lb at 81.5 in, aft limit 80.5 in,
    # cargo moved from station 150 to station 30 -> 65 lb brings the CG to the limit
    stations = {"sta30": 30.0, "sta150": 150.0}
    rest = 7800.0 - 65.0
    empty_arm = (7800.0 * 81.5 - 65.0 * 150.0) / rest
    assert _mass(rest, empty_arm, stations, {"sta150": 65.0}).arm == pytest.approx(81.5, abs=1e-12)
    assert _mass(rest, empty_arm, stations, {"sta30": 65.0}).arm == pytest.approx(80.5, abs=1e-12)


def test_phak_weight_added_moves_the_cg_1_4_in_aft():
    # FAA-H-8083-25, Weight and Balance chapter, weight addition: 6,860 lb at CG 80.0 in;
    # 140 lb of baggage added at station 150 -> 140 / 7,000 = CG change / 70 in: 1.4 in aft
    before = _mass(6860.0, 80.0, {"sta150": 150.0}, {})
    after = _mass(6860.0, 80.0, {"sta150": 150.0}, {"sta150": 140.0})
    assert before.arm == pytest.approx(80.0, abs=1e-12)
    assert after.weight == pytest.approx(7000.0, rel=1e-12)
    assert after.arm == pytest.approx(81.4, abs=1e-12)


def test_phak_weight_removed_moves_the_cg_1_2_in_forward():
    # FAA-H-8083-25, Weight and Balance chapter, weight removal (from memory): 6,100 lb at CG
    # 78.0 in; 100 lb removed from station 150 -> 100 / 6,000 = CG change / 72 in: 1.2 in
    # forward, to 76.8 in. The aircraft here is the 6,000 lb left, with 100 lb at station 150.
    rest = 6100.0 - 100.0
    empty_arm = (6100.0 * 78.0 - 100.0 * 150.0) / rest
    before = _mass(rest, empty_arm, {"sta150": 150.0}, {"sta150": 100.0})
    after = _mass(rest, empty_arm, {"sta150": 150.0}, {})
    assert before.weight == pytest.approx(6100.0, rel=1e-12) and before.arm == pytest.approx(78.0, abs=1e-12)
    assert after.arm == pytest.approx(76.8, abs=1e-12)


def test_percent_mac(trainer):
    # FAA-H-8083-1B ch. 2: %MAC = 100 (CG - LEMAC) / MAC
    assert trainer.mac.percent(trainer.mac.leading_edge_arm) == 0.0
    assert trainer.mac.percent(trainer.mac.leading_edge_arm + trainer.mac.length / 4) == pytest.approx(25.0)


def test_moment_table_and_conditions_by_hand():
    aircraft = simple_aircraft()
    result = check_loading(
        aircraft, Loading(load={"front": 170, "rear": 150, "bag": 30}, fuel={"main": 30}, burn={"taxi": 1, "trip": 20})
    )
    # by hand: 1000*40 + 170*35 + 150*70 + 30*95 + 180*45 = 40000+5950+10500+2850+8100 = 67400; W = 1530
    ramp = result.condition("ramp")
    assert ramp.weight == pytest.approx(1530.0)
    assert ramp.moment == pytest.approx(67_400.0)
    assert ramp.arm == pytest.approx(67_400.0 / 1530.0)
    takeoff, landing, zero = (result.condition(n) for n in ("takeoff", "landing", "zero_fuel"))
    assert takeoff.weight == pytest.approx(1524.0) and takeoff.moment == pytest.approx(67_400.0 - 6 * 45)
    assert landing.weight == pytest.approx(1404.0) and landing.fuel == pytest.approx(9.0)
    assert zero.weight == pytest.approx(1350.0) and zero.moment == pytest.approx(59_300.0)
    assert [i.id for i in result.items] == ["empty", "front", "rear", "bag", "main"]
    assert sum(i.moment for i in result.items) == pytest.approx(ramp.moment)
