"""The loading schedule (AC 43.13-1B 10-18): published figures, one verdict, the fuel range.

Sources named beside each check:
- AC 43.13-1B (1998) chapter 10, figures 10-12 to 10-14 (the three loading conditions of
  the example aircraft in tests/helpers.py: ac_example_aircraft).
"""

from __future__ import annotations

import numpy as np
import pytest

from loadcheck import load_aircraft
from loadcheck.check import check_loading
from loadcheck.loading import BurnPlan, ResolvedLoading
from loadcheck.schedule import loading_schedule

from .helpers import ac_example_aircraft, sample, simple_aircraft


def test_ac_43_13_1b_figures_10_12_to_10_14_loading_schedule():
    aircraft = ac_example_aircraft()
    full_fuel, all_seats, max_baggage = loading_schedule(aircraft).cases
    # figure 10-12: with full fuel, the pilot, two passengers and 100 lb of baggage (2,036 lb).
    # The AC seats both passengers behind; we seat the second in front: the same count and
    # baggage, and both loadings are within limits.
    assert full_fuel.fuel == {"main": 40.0}
    assert sum(full_fuel.occupants.values()) == 3 and full_fuel.load["bag"] == pytest.approx(100.0)
    assert full_fuel.check.condition("ramp").weight == pytest.approx(2036.0) and full_fuel.check.ok
    # figure 10-13: with every seat filled, 39 US gal of fuel and no baggage: 2,100 lb, 38,466 in-lb.
    # The figure prints the CG as +18.6 in, which does not follow from its own totals:
    # 38,466 / 2,100 = 18.32 in. We check the totals and their quotient.
    assert all_seats.occupants == {"front": 2, "rear": 2}
    assert all_seats.fuel["main"] == pytest.approx(39.0, abs=0.1)
    assert all_seats.load.get("bag", 0.0) == pytest.approx(0.0, abs=0.1)
    ramp = all_seats.check.condition("ramp")
    assert ramp.weight == pytest.approx(2100.0, abs=0.6) and ramp.moment == pytest.approx(38466.0, abs=1.0)
    assert ramp.arm == pytest.approx(38466.0 / 2100.0, abs=0.01)
    # figure 10-14: with maximum baggage, full fuel and two passengers, one front and one rear:
    # 2,036 lb, 37,988 in-lb, CG 18.7 in
    assert max_baggage.fuel == {"main": 40.0}
    assert max_baggage.occupants == {"front": 2, "rear": 1}
    ramp = max_baggage.check.condition("ramp")
    assert ramp.weight == pytest.approx(2036.0) and ramp.moment == pytest.approx(37988.0, abs=1.0)
    assert round(ramp.arm, 1) == 18.7


def _static(aircraft, case, share: float) -> bool:
    """The case's loading started with ``share`` of its fuel (tanks in proportion) and flown
    until the tanks are dry: every condition and the whole burn from that fuel state."""
    fuel = {t: q * share for t, q in case.fuel.items()}
    density = {t.id: aircraft.density(t) for t in aircraft.tank}
    plan = BurnPlan(fuel, None)
    loading = ResolvedLoading(case.check.category, dict(case.load), fuel, density, 0.0, plan.burnable, None, plan)
    return check_loading(aircraft, loading).ok


def _aft_moving():
    """An aircraft whose CG moves aft as fuel burns: the tank is far forward of the CG."""
    return simple_aircraft(
        empty={"weight": 1000.0, "arm": 42.0},
        limits={"max_takeoff_weight": 1900.0, "max_landing_weight": 1750.0},
        station=[
            {"id": "front", "arm": 38.0, "kind": "seat", "controls": True, "seats": 2},
            {"id": "rear", "arm": 60.0, "kind": "seat", "seats": 2},
            {"id": "bag", "arm": 80.0, "kind": "baggage", "max_weight": 150.0},
        ],
        tank=[{"id": "main", "arm": 20.0, "usable": 50.0, "fuel": "avgas"}],
        envelope=[
            {
                "category": "normal",
                "axes": ["arm", "weight"],
                "points": [[33.0, 900], [33.0, 1900], [47.0, 1900], [47.0, 900]],
            }
        ],
    )


def test_schedule_holds_as_the_fuel_is_burned():
    # regression: the full-fuel case was checked only at full fuel; with an ordinary burn
    # the CG went aft of the limit at takeoff and landing
    aircraft = _aft_moving()
    result = loading_schedule(aircraft)
    for case in result.cases:
        assert case.ok == case.check.ok
        if case.ok:
            assert "down to zero usable fuel" in case.fuel_states
            assert all(_static(aircraft, case, share) for share in np.linspace(0.0, 1.0, 21))


def test_schedule_is_not_capped_by_the_landing_weight_at_full_fuel():
    # regression: landing was taken at full fuel, so every answer was capped by the maximum landing weight
    aircraft = _aft_moving()
    full = loading_schedule(aircraft).cases[0]
    assert full.ok and full.check.condition("ramp").weight > 1750.0


def test_schedule_with_a_fixed_weight_station():
    # regression: a station with min_weight = max_weight (engine oil as its own line, as
    # AC 43.13-1B figures 10-10 to 10-14 list it) left every case empty, while the tables
    # said "within" and the command exited 0
    aircraft = simple_aircraft(
        empty={"weight": 1169.0, "arm": 10.6},
        limits={"max_takeoff_weight": 2100.0},
        meto_power_hp=165,
        station=[
            {"id": "oil", "arm": -49.0, "kind": "other", "min_weight": 17.0, "max_weight": 17.0},
            {"id": "front", "arm": 16.0, "kind": "seat", "seats": 2, "controls": True},
            {"id": "rear", "arm": 48.0, "kind": "seat", "seats": 2},
            {"id": "bag", "arm": 75.5, "kind": "baggage", "max_weight": 100.0},
        ],
        tank=[{"id": "main", "arm": 22.0, "usable": 40.0, "fuel": "avgas"}],
        envelope=[
            {
                "category": "normal",
                "axes": ["arm", "weight"],
                "points": [[8.5, 1000], [8.5, 2100], [21.9, 2100], [21.9, 1000]],
            }
        ],
    )
    result = loading_schedule(aircraft)
    assert result.ok and all(case.ok for case in result.cases)
    assert all(case.load["oil"] == 17.0 for case in result.cases)
    # the same answers as the published case with the oil inside the empty weight
    published = loading_schedule(ac_example_aircraft())
    for ours, theirs in zip(result.cases, published.cases, strict=True):
        assert ours.occupants == theirs.occupants
        assert ours.check.condition("ramp").weight == pytest.approx(theirs.check.condition("ramp").weight, abs=0.6)


def test_schedule_answers_are_within_limits_and_maximal():
    aircraft = load_aircraft(sample("twin6/aircraft.toml"))
    result = loading_schedule(aircraft)
    assert [c.ok for c in result.cases] == [c.check.ok for c in result.cases]
    full_fuel = result.cases[0]
    assert full_fuel.fuel == {"mains": 100.0, "aux": 40.0}
    # one more occupant anywhere breaks a limit somewhere over the fuel range
    density = {t.id: aircraft.density(t) for t in aircraft.tank}
    for station in ("row1", "row2", "row3"):
        if full_fuel.occupants.get(station, 0) >= (aircraft.station_by_id[station].seats or 1):
            continue
        load = dict(full_fuel.load)
        load[station] = load.get(station, 0.0) + 170.0
        plan = BurnPlan(full_fuel.fuel, None)
        trial = ResolvedLoading("normal", load, full_fuel.fuel, density, 0.0, plan.burnable, None, plan)
        assert not check_loading(aircraft, trial).ok


def test_regression_schedule_notes_show_the_occupant_at_display_precision():
    # a 170 lb occupant on a kg aircraft read "occupants at 77.1107 kg each": the weight goes
    # through loadcheck.display.fmt (0.1 kg), as every other mass the schedule shows
    from loadcheck.display import fmt
    from loadcheck.units import convert

    occupant = convert(170.0, "lb", "kg")  # 77.11070 kg (1 lb = 0.45359237 kg exactly, NIST SP 811 B.8)
    schedule = loading_schedule(load_aircraft(sample("tandem2/aircraft.toml")), occupant_weight=occupant)
    notes = [note for case in schedule.cases for note in case.notes]
    assert f"occupants at {fmt(occupant, 'kg')} each" in notes and "every seat filled at 77.1 kg" in notes
    assert not [n for n in notes if "77.11" in n]


def test_regression_a_seats_minimum_weight_is_met_by_its_occupant_not_added_to_it():
    # tandem2's pilot seat has min_weight 55 kg: the schedule put the seat at its minimum and then
    # seated the 77 kg pilot on top (132 kg, over the seat's 110 kg maximum), so every case read
    # NOT within limits. A minimum crew weight is met by the crew (common practice): the seat holds
    # the occupants' weight, or its minimum where that is more
    tandem = load_aircraft(sample("tandem2/aircraft.toml"))
    seat = tandem.station_by_id["front"]
    assert seat.min_weight == 55.0 and seat.max_weight == 110.0
    schedule = loading_schedule(tandem, occupant_weight=77.0)
    for case in schedule.cases:
        assert case.occupants["front"] == 1 and case.load["front"] == pytest.approx(77.0)
        assert case.ok == case.check.ok and not any(f.code == "station_max" for f in case.check.findings)
        assert not any("minimum weight: Front seat" in note for note in case.notes)
    light = loading_schedule(tandem, occupant_weight=50.0)  # a pilot lighter than the minimum: ballast to 55 kg
    assert all(case.load["front"] == pytest.approx(55.0) for case in light.cases)


def test_regression_schedule_says_the_lateral_axis_is_checked_by_extremes():
    # trial 10 finding 8: on a side-by-side aircraft with a lateral envelope every schedule case is
    # symmetric (both seats, tanks burning in proportion), so it never loads one side; each case
    # says its lateral CG is checked for that loading only, and that the lateral extremes are
    # extremes' (FAA-H-8083-1B chapter 8, lateral balance: common practice)
    from loadcheck.schedule import LATERAL_NOTE

    from .test_extremes import _side_by_side

    for case in loading_schedule(_side_by_side()).cases:
        assert LATERAL_NOTE in case.notes
        assert "loadcheck extremes" in LATERAL_NOTE and "one side" in LATERAL_NOTE
    # an aircraft without a lateral envelope says nothing of it
    assert not any(LATERAL_NOTE in c.notes for c in loading_schedule(ac_example_aircraft()).cases)


# -- trial 11 finding 3: a case's load that is not one stretch from zero ------------------------


def test_regression_a_schedule_case_names_the_stretches_of_a_hold_with_a_gap(tmp_path):
    """Trial 11 finding 3: on the kinked freighter (tests/test_extremes.py, KINK) the schedule said "hold 400.0
    kg" with full fuel and nothing of the loads in between that are out of limits. Worked by hand
    (FAA-H-8083-1B chapter 2), pilot 100 kg at 1.6 m, full fuel 14.4 kg at 2.5 m: the rest weighs 1,614.4 kg
    with 3,946 kg m; with h kg in the hold (3.2 m) the ramp CG is (3,946 + 3.2 h) / (1,614.4 + h). Below
    1,850 kg the forward limit is 2.0 + 0.555 (W - 1,500) / 350 m, so the gap opens where
    350 (3,946 + 3.2 h) = (763.492 + 0.555 h)(1,614.4 + h), h = 223.78 kg; above it the limit is 2.555 m, so
    the gap closes at h = (2.555 x 1,614.4 - 3,946) / (3.2 - 2.555) = 277.20 kg."""
    import json

    from .helpers import invoke, write_file
    from .test_extremes import KINK

    path = write_file(tmp_path, KINK)
    result = loading_schedule(load_aircraft(path))
    full_fuel = result.cases[0]
    roots = np.roots([0.555, 0.555 * 1614.4 + 763.492 - 350 * 3.2, 763.492 * 1614.4 - 350 * 3946])
    opens = float(next(r.real for r in roots if 0 < r.real < 400))
    closes = (2.555 * 1614.4 - 3946) / (3.2 - 2.555)
    (low, first), (second, high) = full_fuel.load_stretches["hold"]
    assert low == pytest.approx(0.0) and high == pytest.approx(400.0)
    assert first == pytest.approx(opens, abs=0.01) and second == pytest.approx(closes, abs=0.01)
    assert full_fuel.not_one_stretch == ["hold"] and full_fuel.load["hold"] == pytest.approx(400.0)
    note = next(n for n in full_fuel.notes if n.startswith("hold:"))
    assert "0.0 to 223.7 kg and 277.2 to 400.0 kg" in note and "NOT" in note
    # the case's loading itself is within limits, and the hand-worked load in the gap is not
    assert full_fuel.ok
    assert not _static_with(load_aircraft(path), full_fuel, hold=235.6)
    text = " ".join(invoke("schedule", path).stdout.split())  # the terminal wraps its lines
    assert "hold 400.0 kg (NOT every smaller load: see the note above)" in text
    assert "only these loads are within limits: 0.0 to 223.7 kg and 277.2 to 400.0 kg" in text
    data = json.loads(invoke("schedule", path, "--json").stdout)
    assert data["cases"][0]["not_one_stretch"] == ["hold"]
    assert data["cases"][0]["load_stretches"]["hold"][1][0] == pytest.approx(closes, abs=0.01)


def _static_with(aircraft, case, **load) -> bool:
    """The case's loading with other station loads, flown until its tanks are dry: within limits?"""
    fuel = dict(case.fuel)
    density = {t.id: aircraft.density(t) for t in aircraft.tank}
    plan = BurnPlan(fuel, None)
    loading = ResolvedLoading(case.check.category, {**case.load, **load}, fuel, density, 0.0, plan.burnable, None, plan)
    return check_loading(aircraft, loading).ok


def test_a_schedule_case_says_the_least_baggage_where_less_is_out_of_limits():
    """Invented: empty 1,000 lb at 36 in, the pilot's seat at 20 in, baggage at 95 in (100 lb), the tank on the
    35 in forward limit (its fuel moves the CG toward the limit, never across it). With the pilot alone the CG
    is (36,000 + 3,400) / 1,170 = 33.68 in, forward of 35 in; baggage b brings it to the limit where
    39,400 + 95 b = 35 (1,170 + b), b = 1,550 / 60 = 25.83 lb (FAA-H-8083-1B chapter 2)."""
    aircraft = simple_aircraft(
        station=[
            {"id": "front", "arm": 20.0, "kind": "seat", "controls": True},
            {"id": "bag", "arm": 95.0, "kind": "baggage", "max_weight": 100.0},
        ],
        empty={"weight": 1000.0, "arm": 36.0},
        tank=[{"id": "main", "arm": 35.0, "usable": 40.0, "fuel": "avgas"}],
    )
    full_fuel = loading_schedule(aircraft).cases[0]
    [(low, high)] = full_fuel.load_stretches["bag"]
    assert low == pytest.approx(1550 / 60, abs=0.01) and high == pytest.approx(100.0)
    assert full_fuel.not_one_stretch == ["bag"] and full_fuel.ok
    assert "bag: at least 25.9 lb with the rest of this case as given" in " ".join(full_fuel.notes)
    assert not _static_with(aircraft, full_fuel, bag=25.0) and _static_with(aircraft, full_fuel, bag=25.9)


def test_a_schedule_case_from_zero_says_nothing_of_stretches():
    # the published example (AC 43.13-1B figure 10-12): every baggage load up to the 100 lb maximum is
    # within limits with full fuel and three aboard, so no stretch note
    full_fuel = loading_schedule(ac_example_aircraft()).cases[0]
    assert full_fuel.not_one_stretch == [] and full_fuel.load_stretches["bag"][0][0] == pytest.approx(0.0)
    assert not any("within limits:" in n for n in full_fuel.notes)
