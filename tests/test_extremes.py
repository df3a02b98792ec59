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
    assert "2 occupants at 77.0 kg (154.0 kg)" in notes and "maximum (154" not in notes


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


def _pilot_ahead_of_the_forward_limit(front_max: float = 250.0):
    """A single-seat front (the required pilot's seat, minimum 120 lb) at +30 in, ahead of the
    +35 in forward limit; a 50 lb nose locker at +10 in; a rear seat at +70 in behind the
    +48 in rearward limit; 120 hp METO (minimum fuel for balance 10 US gal). Invented."""
    return simple_aircraft(
        station=[
            {"id": "locker", "arm": 10.0, "kind": "baggage", "max_weight": 50.0},
            {
                "id": "front",
                "arm": 30.0,
                "kind": "seat",
                "controls": True,
                "min_weight": 120.0,
                "max_weight": front_max,
            },
            {"id": "rear", "arm": 70.0, "kind": "seat"},
        ],
        meto_power_hp=120,
    )


def test_forward_extreme_seats_a_pilot_ahead_of_the_limit_at_the_heavy_weight():
    # regression: the pilot's seat (ahead of the forward limit) kept its 120 lb minimum, because
    # the room left above that minimum (130 lb) was less than one 170 lb occupant, and no note
    # named the pilot. AC 43.13-1B 10-17, figure 10-10: items ahead of the forward limit at
    # their maximum, the pilot aboard at the 170 lb standard occupant.
    aircraft = _pilot_ahead_of_the_forward_limit()
    case = extremes(aircraft).forward
    load = {i.id: i.weight for i in case.check.items}
    assert load["front"] == pytest.approx(170.0) and load["locker"] == pytest.approx(50.0)
    assert "rear" not in load or load["rear"] == 0.0
    # worked by hand, zero usable fuel: empty 1,000 lb x 40 in = 40,000 in-lb;
    # pilot 170 lb x 30 in = 5,100 in-lb; locker 50 lb x 10 in = 500 in-lb;
    # 1,000 + 170 + 50 = 1,220 lb; 40,000 + 5,100 + 500 = 45,600 in-lb; CG 45,600 / 1,220 = 37.377 in
    zero = case.check.condition("zero_fuel")
    assert zero.weight == pytest.approx(1220.0)
    assert zero.arm == pytest.approx(45600.0 / 1220.0)
    # at engine start, plus the minimum fuel for balance: 120 hp / 12 = 10 US gal (AC 43.13-1B 10-2 p)
    # x 6 lb/US gal (avgas, common practice) = 60 lb x 45 in = 2,700 in-lb;
    # 1,280 lb, 48,300 in-lb, CG 48,300 / 1,280 = 37.734 in
    ramp = case.check.condition("ramp")
    assert ramp.weight == pytest.approx(1280.0)
    assert ramp.arm == pytest.approx(48300.0 / 1280.0)
    # a lighter pilot (the 120 lb minimum) would put the CG aft of this: 45,600 - 50 x 30 = 44,100 in-lb
    # over 1,170 lb = 37.692 in at zero fuel, so the heavy pilot is the more forward case
    assert zero.arm < 44100.0 / 1170.0
    assert "front: the pilot (170.0 lb), ahead of the forward limit" in case.notes
    assert case.ok == case.check.ok


def test_forward_extreme_pilot_seat_below_a_standard_occupant_is_at_its_maximum():
    # a pilot's seat ahead of the forward limit whose maximum (150 lb) is below the 170 lb
    # standard occupant: the pilot is there at that maximum, the heaviest it allows
    # (AC 43.13-1B 10-17: items ahead of the forward limit at their maximum), never above it
    aircraft = _pilot_ahead_of_the_forward_limit(front_max=150.0)
    case = extremes(aircraft).forward
    assert {i.id: i.weight for i in case.check.items}["front"] == pytest.approx(150.0)
    assert "front: the pilot at the station's maximum (150.0 lb), ahead of the forward limit" in case.notes
    assert not any(f.code == "station_max" for f in case.check.findings)


def test_extreme_notes_say_one_occupant_once_and_the_pilot_not_alone_beside_a_passenger():
    # regression: "Rear seat: 1 occupant at 77 kg (77.0 kg)" and "the pilot alone" while a
    # rear occupant was also aboard (tandem2's rearward extreme)
    case = extremes(_pilot_ahead_of_the_forward_limit()).rearward
    assert "rear: 1 occupant at 170.0 lb, behind the rearward limit" in case.notes
    pilot = [n for n in case.notes if n.startswith("front:")]
    assert pilot == ["front: the pilot (170.0 lb), in the most rearward seat with controls"]
    tandem = extremes(load_aircraft(sample("tandem2/aircraft.toml")))
    notes = " ".join(tandem.rearward.notes + tandem.forward.notes)
    assert "(77.0 kg), behind" not in notes and "alone" not in notes
    assert "Front seat (pilot): the pilot (77.0 kg), ahead of the forward limit" in tandem.forward.notes


def test_regression_extreme_notes_show_figures_at_display_precision():
    # a 170 lb occupant on a kg aircraft read "1 occupant at 77.1107 kg" and the minimum fuel
    # "25.24 l": every figure goes through loadcheck.display.fmt (0.1 kg, 0.1 l), the minimum
    # fuel rounded up, so that the fuel range stated never reaches below the one checked
    import re

    from loadcheck.display import fmt
    from loadcheck.units import convert

    tandem = load_aircraft(sample("tandem2/aircraft.toml"))
    occupant = convert(170.0, "lb", "kg")  # 77.11070 kg (1 lb = 0.45359237 kg exactly, NIST SP 811 B.8)
    result = extremes(tandem, occupant_weight=occupant)
    notes = result.forward.notes + result.rearward.notes
    assert any(f"occupant at {fmt(occupant, 'kg')}" in n for n in notes) and "77.1 kg" == fmt(occupant, "kg")
    fuel = next(n for n in notes if n.startswith("minimum fuel for balance"))
    shown = float(re.search(r"balance, ([\d.,]+) l", fuel).group(1))
    assert shown >= minimum_fuel(tandem, tandem.meto_power_hp) and shown == pytest.approx(
        minimum_fuel(tandem, tandem.meto_power_hp), abs=0.1
    )
    assert not [n for n in notes if re.search(r"\d\.\d\d", n)], notes  # no figure past 0.1 kg or 0.1 l


def test_without_the_meto_power_a_side_that_needs_the_minimum_fuel_is_refused_not_guessed():
    """The minimum fuel for balance is METO/12 US gal (AC 43.13-1B, 10-2 p): with no METO power given,
    a side whose tank carries that minimum is refused naming meto_power_hp (never a guessed fuel);
    the AC's example aircraft (fig. 10-10 to 10-14, tank at +22 in between its CG limits) needs it on
    both sides."""
    data = ac_example_aircraft().model_dump(mode="json", exclude_none=True)
    data.pop("meto_power_hp")
    from loadcheck.files import parse_aircraft

    with pytest.raises(InputError) as refused:
        extremes(parse_aircraft(data))
    (problem,) = refused.value.problems
    assert problem.field == "meto_power_hp" and "maximum-except-takeoff power" in problem.message


@pytest.mark.parametrize("plane", ["tandem2", "trainer4", "twin6", "heli2"])
def test_regression_the_minimum_fuel_read_as_two_figures(plane):
    """An outside trial: ``extremes --meto 100`` said "minimum fuel for balance, 8.4 usgal" and then
    "fuel states checked: at 8.3 usgal" for the one amount 100/12 = 8.333 US gal (AC 43.13-1B 10-2 p).
    The states say the same figure as the note (rounded up), and the range they state lies within the
    range checked: its top rounded down, its foot up."""
    import re

    aircraft = load_aircraft(sample(f"{plane}/aircraft.toml"))
    result = extremes(aircraft)
    cases = [c for c in (result.forward, result.rearward) if any(n.startswith("minimum fuel") for n in c.notes)]
    assert cases  # every sample has a tank on the better side of a limit, loaded to the minimum fuel
    for case in cases:
        [note] = [n for n in case.notes if n.startswith("minimum fuel for balance")]
        figure = re.search(r"balance, ([\d.,]+ \w+)", note).group(1)
        assert figure in case.fuel_states, (note, case.fuel_states)
        [checked] = re.findall(r"\(([\d.,]+) \w+\)|at ([\d.,]+) \w+ of fuel", case.fuel_states)
        foot = float((checked[0] or checked[1]).replace(",", ""))
        assert foot >= minimum_fuel(aircraft, aircraft.meto_power_hp) - 1e-9
