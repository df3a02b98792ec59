"""The extreme loadings (AC 43.13-1B 10-17): published figures, one verdict, group limits.

Sources named beside each check:
- AC 43.13-1B (1998) chapter 10, figure 10-10 (most forward extreme: 1,439 lb, 16,104
  in-lb, CG +11.2 in) and figure 10-11 (most rearward extreme: 2,036 lb, 43,428 in-lb, CG
  21.3 in against the 21.9 in limit); paragraph 10-2 p (minimum fuel, METO/12 US gal).
"""

from __future__ import annotations

import pytest

from loadcheck import load_aircraft
from loadcheck.caution import MECHANIC_CAUTION
from loadcheck.check import check_loading
from loadcheck.errors import InputError
from loadcheck.extremes import extremes, minimum_fuel

from .helpers import ac_example_aircraft, sample, simple_aircraft


def test_ac_43_13_1b_figures_10_10_and_10_11():
    # AC 43.13-1B figures 10-10 and 10-11; oil (17 lb at -49 in) is part of the empty weight here
    aircraft = ac_example_aircraft()
    result = extremes(aircraft)
    forward = result.forward.check.condition("ramp")
    # figure 10-10: 1,439 lb, 16,104 in-lb, +11.2 in; the figure rounds the 82.5 lb of fuel to 83 lb
    assert forward.weight == pytest.approx(1439.0, abs=0.5)
    assert forward.moment == pytest.approx(16104.0, abs=0.5 * 22 + 1)
    assert round(forward.arm, 1) == 11.2
    assert result.forward.ok
    rear = result.rearward.check.condition("ramp")
    # figure 10-11: 2,036 lb, 43,428 in-lb; 43,428 / 2,036 = 21.33 in, inside the 21.9 in limit
    assert rear.weight == pytest.approx(2036.0)
    assert rear.moment == pytest.approx(43428.0, abs=1.0)
    assert rear.arm < 21.9 and result.rearward.ok


def test_minimum_fuel_rule():
    # AC 43.13-1B 10-2 p: 1/12 US gal per METO hp; in pounds, METO / 2 (at 6 lb/gal, common practice)
    aircraft = simple_aircraft()
    assert minimum_fuel(aircraft, 165) == pytest.approx(13.75)
    assert minimum_fuel(aircraft, 165) * 6.0 == pytest.approx(165 / 2)
    metric = load_aircraft(sample("tandem2/aircraft.toml"))
    assert minimum_fuel(metric, 12) == pytest.approx(3.785411784)


def _two_holds(**changes):
    """Two baggage holds behind the aft limit, 50 and 20 lb each, but 60 lb together."""
    data = {
        "station": [
            {"id": "seat", "arm": 36.0, "kind": "seat", "controls": True},
            {"id": "hold_a", "arm": 95.0, "kind": "baggage", "max_weight": 50.0},
            {"id": "hold_b", "arm": 110.0, "kind": "baggage", "max_weight": 20.0},
        ],
        "station_group": [{"label": "All baggage", "stations": ["hold_a", "hold_b"], "max_weight": 60.0}],
        "meto_power_hp": 120,
    }
    data.update(changes)
    return simple_aircraft(**data)


def test_extremes_respect_station_group_limits():
    # regression: 50 + 20 lb were put in two holds limited to 60 lb together, and the
    # rearward extreme was printed "within limits" beside the group finding
    result = extremes(_two_holds())
    loads = result.rearward.check.items
    baggage = sum(i.weight for i in loads if i.id in ("hold_a", "hold_b"))
    assert baggage == pytest.approx(60.0)
    # the hold farthest aft is filled first, then the other up to the group's room
    assert {i.id: i.weight for i in loads}["hold_b"] == pytest.approx(20.0)
    assert not any(f.code == "group_max" for f in result.rearward.check.findings)
    assert result.rearward.ok == result.rearward.check.ok


def test_extremes_never_say_within_limits_beside_a_limit():
    # regression: the verdict of a side was its ramp and takeoff conditions only
    aircraft = _two_holds(limits={"max_takeoff_weight": 1200.0})  # the rearward extreme is overweight
    result = extremes(aircraft)
    for case in (result.forward, result.rearward):
        assert case.ok == case.check.ok == (not case.check.limits_exceeded)
    assert not result.rearward.ok and not result.ok


def test_extremes_name_the_occupants_not_a_maximum():
    # regression: "at its maximum (154 kg)" for a two-seat row whose maximum is 180 kg
    aircraft = simple_aircraft(
        units={"mass": "kg", "arm": "mm", "fuel_volume": "l"},
        empty={"weight": 600.0, "arm": 1000.0},
        limits={"max_takeoff_weight": 1000.0},
        station=[
            {"id": "front", "arm": 900.0, "kind": "seat", "controls": True},
            {"id": "rear", "arm": 1800.0, "kind": "seat", "seats": 2, "max_weight": 180.0},
        ],
        tank=[{"id": "main", "arm": 1000.0, "usable": 100.0, "fuel": "avgas"}],
        envelope=[
            {
                "category": "normal",
                "axes": ["arm", "weight"],
                "points": [[800, 500], [800, 1000], [1400, 1000], [1400, 500]],
            }
        ],
        meto_power_hp=100,
    )
    notes = " ".join(extremes(aircraft, occupant_weight=77.0).rearward.notes)
    assert "2 occupants at 77 kg (154.0 kg)" in notes and "maximum (154" not in notes


def test_each_extreme_holds_over_the_fuel_range_it_states():
    # a tank behind the rearward limit is full in the rearward extreme; burning it down to
    # the minimum fuel for balance must stay inside the envelope too (AC 43.13-1B 10-17)
    aircraft = ac_example_aircraft()
    case = extremes(aircraft).rearward
    assert "down to the minimum fuel for balance" in case.fuel_states
    landing = case.check.condition("landing")
    assert landing.fuel == pytest.approx(minimum_fuel(aircraft, 165))
    assert case.check.burn_path.ok
    # and the nested check carries the mechanic's caution, not the pilot's
    assert case.check.caution == MECHANIC_CAUTION


def test_every_extreme_loading_passes_the_check_it_carries():
    for name in ("trainer4", "tandem2", "twin6", "heli2"):
        aircraft = load_aircraft(sample(f"{name}/aircraft.toml"))
        try:
            result = extremes(aircraft, meto_hp=150)
        except InputError:
            continue
        for case in (result.forward, result.rearward):
            again = check_loading(aircraft, _loading_of(case.check, aircraft))
            assert again.ok == case.ok, name


def _loading_of(check, aircraft):
    from loadcheck.loading import Loading

    landing = check.condition("landing")
    ramp = check.condition("ramp")
    stations = {i.id: i.weight for i in check.items if i.id in aircraft.station_by_id}
    fuel = {i.id: i.fuel_volume for i in check.items if i.id in aircraft.tank_by_id}
    return Loading(load=stations, fuel=fuel, burn={"taxi": 0.0, "trip": ramp.fuel - landing.fuel})
