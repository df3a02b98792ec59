"""Moment arithmetic checked against published worked examples and formulas.

Sources:
- FAA-H-8083-1A, Aircraft Weight and Balance Handbook (2007), chapter 5, "Weight
  Shifting": 8,000 lb with 616,000 in-lb; 100 lb moved from station 30 to station 150
  gives CG 78.5 in.
- FAA-H-8083-25 (Pilot's Handbook of Aeronautical Knowledge), chapter "Weight and
  Balance", weight-shifting example: 7,800 lb at CG 81.5 in, aft limit 80.5 in; 65 lb
  moved from station 150 to station 30 brings the CG to the limit (the handbook rounds
  the 65.0 lb result; we check the arithmetic of the published relation).
- FAA-H-8083-1B chapter 2: CG = total moment / total weight; weight-shift relation
  (weight shifted / total weight = CG change / distance shifted); added or removed
  weight (weight added / new total weight = CG change / distance from old CG);
  percent MAC = 100 (CG - LEMAC) / MAC.
"""

from __future__ import annotations

import pytest
from hypothesis import given
from hypothesis import strategies as st

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
        envelope=[{"category": "normal", "axes": ["arm", "weight"], "points": [[-1e4, 1], [-1e4, 1e7], [1e4, 1e7], [1e4, 1]]}],
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


@given(
    st.floats(500, 10_000), st.floats(0, 200), st.floats(1, 500), st.floats(-100, 300), st.floats(-100, 300)
)
def test_weight_shift_relation_agrees_with_the_check(total, cg, shifted, from_arm, to_arm):
    # FAA-H-8083-1B ch. 2: CG change = weight shifted x distance / total weight
    stations = {"a": from_arm, "b": to_arm}
    rest = total - shifted if total > shifted else total
    empty_arm = (total * cg - shifted * from_arm) / rest
    before = _mass(rest, empty_arm, stations, {"a": shifted})
    after = _mass(rest, empty_arm, stations, {"b": shifted})
    assert after.arm - before.arm == pytest.approx(shifted * (to_arm - from_arm) / before.weight, rel=1e-9, abs=1e-9)


@given(st.floats(500, 10_000), st.floats(0, 200), st.floats(1, 400), st.floats(-100, 300))
def test_added_weight_relation_agrees_with_the_check(total, cg, added, arm):
    # FAA-H-8083-1B ch. 2: weight added / new total weight = CG change / (arm - old CG)
    after = _mass(total, cg, {"x": arm}, {"x": added})
    assert after.arm - cg == pytest.approx(added * (arm - cg) / (total + added), rel=1e-9, abs=1e-9)


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
