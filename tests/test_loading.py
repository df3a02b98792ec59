"""The loading file model and its resolution against an aircraft (loadcheck/loading.py): a trip's
fuel carried over tank by tank in the burn order, fuel added at a stop, and what is refused.

The loading checks themselves (verdicts of resolved loadings) are in tests/test_check.py and
tests/test_trip.py. Sample aircraft here are invented (tests/helpers.simple_aircraft); 6.0 lb
per US gal of avgas is the trade's customary figure (common practice).
"""

from __future__ import annotations

import pytest

from loadcheck.errors import InputError, UnknownNameError
from loadcheck.loading import Loading, apply_overrides, leg_of_field, resolve_trip
from loadcheck.trip import check_trip

from .helpers import sample_data, simple_aircraft

# -- fuel carried over and added ------------------------------------------------------------

TWO_TANKS = simple_aircraft(
    tank=[
        {"id": "aux", "arm": 60.0, "usable": 10.0, "fuel": "avgas"},
        {"id": "mains", "arm": 45.0, "usable": 40.0, "fuel": "avgas", "levels": {"local": 25.0}},
    ]
)


def _trip(*legs, **first):
    base = {
        "load": {"front": 180},
        "fuel": {"aux": 10, "mains": 30},
        "burn": {"taxi": 1, "trip": 14, "order": ["aux", "mains"]},
    }
    return Loading.model_validate({**base, **first, "leg": list(legs)})


def test_fuel_carries_over_tank_by_tank_in_the_burn_order():
    trip = resolve_trip(_trip({"burn": {"trip": 5}}, {"burn": {"trip": 3, "order": "together"}}), TWO_TANKS)
    _, two, three = trip.legs
    # leg 1 burns 15 gal, aux first: aux 10 -> 0, mains 30 -> 25
    assert two.fuel == pytest.approx({"aux": 0.0, "mains": 25.0})
    assert two.plan.order == ("aux", "mains")  # the order carries over where the leg gives none
    assert three.fuel == pytest.approx({"aux": 0.0, "mains": 20.0}) and three.plan.order is None


@pytest.mark.parametrize(
    "add, aux, mains",
    [
        ({"aux": 4}, 4.0, 25.0),
        ({"mains": "full"}, 0.0, 40.0),
        ({"mains": "local"}, 0.0, 25.0),
        ({"aux": "12 lb", "mains": "3 usgal"}, 2.0, 28.0),  # 12 lb of avgas at 6.0 lb/US gal is 2 US gal
    ],
)
def test_fuel_added_at_a_stop(add, aux, mains):
    trip = resolve_trip(_trip({"add_fuel": add, "burn": {"trip": 5}}), TWO_TANKS)
    assert trip.legs[1].fuel == pytest.approx({"aux": aux, "mains": mains})
    result = check_trip(TWO_TANKS, trip)
    assert result.legs[1].check.condition("ramp").fuel == pytest.approx(aux + mains)


@pytest.mark.parametrize(
    "add, words, error",
    [
        ({"mains": 20}, "above the tank's usable capacity", InputError),
        ({"aux": "local"}, "unknown fill level", UnknownNameError),
        ({"wing": 5}, "unknown tank", UnknownNameError),
    ],
)
def test_fuel_that_cannot_go_in_is_refused(add, words, error):
    with pytest.raises(error, match=words):
        resolve_trip(_trip({"add_fuel": add, "burn": {"trip": 5}}), TWO_TANKS)


def test_a_level_below_the_fuel_on_board_is_refused():
    with pytest.raises(InputError, match="more than the level"):  # 29 gal on board, the local level is 25
        resolve_trip(
            _trip(
                {"add_fuel": {"mains": "local"}, "burn": {"trip": 5}},
                burn={"taxi": 1, "trip": 10, "order": ["aux", "mains"]},
            ),
            TWO_TANKS,
        )


def test_a_leg_that_burns_more_than_it_carries_is_refused():
    with pytest.raises(InputError, match=r"^leg 2, burn: taxi and trip fuel"):
        resolve_trip(_trip({"burn": {"trip": 30}}), TWO_TANKS)


def test_a_legs_problem_is_named_as_the_user_counts_legs():
    # the field was leg[0].load.cargo (the array index of the first [[leg]] table) beside "leg 2: ..."
    with pytest.raises(UnknownNameError) as caught:
        resolve_trip(_trip({"load": {"cargo": 10}, "burn": {"trip": 5}}), TWO_TANKS)
    problem = caught.value.problems[0]
    assert problem.field == "leg 2, load.cargo" and problem.message.startswith("unknown station 'cargo'")
    assert leg_of_field(problem.field) == (2, "load.cargo") and leg_of_field("load.cargo") is None
    with pytest.raises(InputError) as over:
        resolve_trip(_trip({"burn": {"trip": 5}}, {"add_fuel": {"mains": 99}, "burn": {"trip": 5}}), TWO_TANKS)
    assert over.value.problems[0].field == "leg 3, add_fuel.mains"


def test_values_for_a_leg_the_trip_does_not_have_are_refused_not_made_a_leg():
    # --leg-load 3:... on a trip of 2 legs added an empty leg 3 (then "leg[1].burn: this field is required")
    data = {"load": {"front": 170}, "leg": [{"burn": {"trip": 5}}]}
    with pytest.raises(InputError) as caught:
        apply_overrides(data, legs={3: {"load": {"front": "0"}, "add_fuel": {"mains": "5"}}})
    fields = [p.field for p in caught.value.problems]
    assert fields == ["leg 3, load.front", "leg 3, add_fuel.mains"]
    message = caught.value.problems[0].message
    assert "the trip has 2 legs, so it has no leg 3" in message and "--leg-burn" not in message
    assert caught.value.problems[0].expected == "leg 3, burn as well, or leg 2"
    with pytest.raises(InputError, match="the loading has one leg, so it has no leg 2"):
        apply_overrides({}, legs={2: {"load": {"front": "0"}}})
    added = apply_overrides(data, legs={3: {"load": {"front": "0"}, "burn": {"trip": "4"}}})  # its burn adds it
    assert added["leg"][1] == {"load": {"front": "0"}, "burn": {"trip": "4"}}
    with pytest.raises(InputError, match="leg 4 skips leg 3: the trip has 2 legs"):
        apply_overrides(data, legs={4: {"burn": {"trip": "4"}}})


@pytest.mark.parametrize(
    "amount, said",
    [
        (60, "fuel.mains: 60 usgal is above the tank's usable capacity; expected at most 40 usgal"),
        (60.5, "fuel.mains: 60.5 usgal is above the tank's usable capacity; expected at most 40 usgal"),
        ("60 usgal", "fuel.mains: 60 usgal is above the tank's usable capacity; expected at most 40 usgal"),
        # 300 lb / 6.0 lb per US gal (avgas, common practice) = 50 US gal
        ("300 lb", "fuel.mains: 300 lb is 50 usgal, above the tank's usable capacity; expected at most 40 usgal"),
        # an outside trial: 250 lb / 6.0 = 41.666... was said with 15 digits; six significant are plenty
        ("250 lb", "fuel.mains: 250 lb is 41.6667 usgal, above the tank's usable capacity; expected at most 40 usgal"),
    ],
)
def test_fuel_above_the_usable_capacity_is_said_once_as_given(amount, said):
    # the refusal said the amount twice, the second time as a float ("60 usgal ...; got 60.0")
    from loadcheck.loading import resolve_loading

    with pytest.raises(InputError) as caught:
        resolve_loading(Loading(fuel={"mains": amount, "aux": 0}), TWO_TANKS)
    assert [p.describe() for p in caught.value.problems] == [said]


def test_regression_gph_was_read_as_us_gallons_for_an_aircraft_fuelled_in_imperial_gallons():
    """`rate = "9.5 gph"` is US gallons per hour (common practice in US usage), but for an aircraft whose
    fuel is in imperial gallons a pilot may mean imperial ones: read as US gallons, the trip fuel came
    out 17 % low (1 US gal = 3.785411784 L, 1 imp gal = 4.54609 L; NIST SP 811 B.8), and a reserve
    warning could be missed. There it is refused, asking for the gallon; elsewhere gph is read as before."""
    from loadcheck.loading import resolve_loading

    imperial = simple_aircraft(units={"mass": "lb", "arm": "in", "fuel_volume": "impgal"})
    timed = {"load": {"front": 180}, "fuel": {"main": 30}}
    with pytest.raises(InputError) as refused:
        resolve_loading(Loading(**timed, burn={"trip_time": "1:00", "rate": "9.5 gph"}), imperial)
    (problem,) = refused.value.problems
    assert problem.field == "burn.rate" and "'9.5 impgal/h' or '9.5 usgal/h'" in problem.message
    said = resolve_loading(Loading(**timed, burn={"trip_time": "1:00", "rate": "9.5 impgal/h"}), imperial)
    assert said.trip == pytest.approx(9.5)
    us = resolve_loading(Loading(**timed, burn={"trip_time": "1:00", "rate": "9.5 usgal/h"}), imperial)
    assert us.trip == pytest.approx(9.5 * 3.785411784 / 4.54609)
    assert resolve_loading(Loading(**timed, burn={"trip_time": "1:00", "rate": "9.5 gph"}), _us_box()).trip == 9.5


def _us_box():  # the US-gallon test box
    return simple_aircraft()


def test_regression_no_weight_at_the_pilots_seat_was_within_limits_without_a_word():
    """An outside trial: a fleet row with the front seat's cell blank, an API body without ``load`` and a
    blank form field all said "Within limits" with no finding, while a blank tank cell warns "taken as
    empty". Every flight carries its pilot at a seat with flight controls (``controls = true``): where no
    such seat holds any weight, the check says so as a warning (the verdict is the limits'; common
    practice)."""
    from loadcheck import check_loading, load_aircraft

    from .helpers import sample

    trainer = load_aircraft(sample("trainer4/aircraft.toml"))
    assert trainer.control_seats == ("front",)
    said = (
        "no weight at the seat with flight controls (Pilot and front passenger): "
        "a flight needs its pilot's weight there"
    )
    for load in ({"rear": 100.0}, {"front": 0.0, "rear": 100.0}):
        result = check_loading(trainer, Loading(load=load, fuel={"mains": 20.0, "centre": 0.0}))
        assert [(f.code, f.severity, f.message) for f in result.findings if f.code == "no_pilot"] == [
            ("no_pilot", "warning", said)
        ]
        assert result.ok  # a warning: the limits decide the verdict
    with_pilot = check_loading(trainer, Loading(load={"front": 80.0}, fuel={"mains": 20.0}))
    assert not [f for f in with_pilot.findings if f.code == "no_pilot"]
    heli = load_aircraft(sample("heli2/aircraft.toml"))  # two seats with controls: either one will do
    assert heli.control_seats == ("left", "right")
    assert not [f for f in check_loading(heli, Loading(load={"right": 80.0})).findings if f.code == "no_pilot"]
    assert [
        f.message for f in check_loading(heli, Loading(load={"bag_left": 9.0})).findings if f.code == "no_pilot"
    ] == [
        "no weight at any seat with flight controls (Left seat, Right seat (solo from here)): "
        "a flight needs its pilot's weight at one"
    ]
    assert simple_aircraft().control_seats == ()  # no seat said to have controls: nothing to say


@pytest.mark.parametrize("written", ["", "   ", "-", "..."])
def test_a_registration_with_no_letter_or_digit_is_refused_in_a_file(written):
    # an outside trial's find: registration = "" in a loading file was taken as no registration (the check
    # went on, within limits), while '-' was refused as a mismatch and the log filters refuse both; a
    # registration names an aircraft or is left out (the aircraft file's own key too)
    from loadcheck.errors import InputError
    from loadcheck.files import parse_aircraft, parse_loading

    with pytest.raises(InputError, match="is not a registration: it has no letter or digit"):
        parse_loading({"registration": written, "load": {"front": 170}}, "day.toml")
    data = sample_data("trainer4/aircraft.toml")
    data["registration"] = written
    with pytest.raises(InputError, match="is not a registration: it has no letter or digit"):
        parse_aircraft(data, "aircraft.toml")
    assert parse_loading({"registration": "g-abcd"}, "day.toml").registration == "g-abcd"  # as written


@pytest.mark.parametrize(
    "data, legs, said, expected",
    [
        ({}, {2: {"load": {"front": "0"}}}, "the loading has one leg, so it has no leg 2", "leg 2, burn as well"),
        (
            {"leg": [{"burn": {"trip": 5}}, {"burn": {"trip": 5}}]},
            {4: {"add_fuel": {"mains": "5"}}},
            "the trip has 3 legs, so it has no leg 4",
            "leg 4, burn as well, or a leg from 2 to 3",
        ),
        ({}, {3: {"burn": {"trip": "4"}}}, "leg 3 skips leg 2: the loading has one leg", "leg 2, burn first"),
    ],
)
def test_regression_a_leg_without_its_burn_was_refused_in_command_line_words_from_any_source(
    data, legs, said, expected
):
    # the refusal named `--leg-burn N:trip=AMOUNT on the command line` and "the loading file" for a
    # loading given by the library or the desk (no option typed, maybe no file): the words are now the
    # loading's own, the leg's burn named by its field (the command line names its option itself)
    with pytest.raises(InputError) as caught:
        apply_overrides(data, legs=legs)
    for problem in caught.value.problems:
        assert said in problem.message and "with its own burn (its taxi and trip fuel)" in problem.message
        assert problem.expected == expected
        assert "--" not in problem.describe() and "command line" not in problem.describe()
        assert "loading file" not in problem.describe()


# -- fill-level names: one rule for the built-in level and the tank's own ----------------------


@pytest.mark.parametrize(
    "typed, volume",
    [("full", 40.0), ("FULL", 40.0), (" Full ", 40.0), ("local", 25.0), ("LOCAL", 25.0), (" Local ", 25.0)],
)
def test_regression_a_named_level_was_matched_in_its_letter_case_where_full_was_not(typed, volume):
    # trial 13 D5: 'FULL' was read as the built-in level, 'TABS' refused for the tank's level 'tabs':
    # every level name is now matched without regard to letter case or the spaces around it, at engine
    # start and at a stop alike (the aircraft file refuses levels differing only in case, so no doubt)
    from loadcheck.loading import resolve_loading

    start = Loading.model_validate({"load": {"front": 180}, "fuel": {"mains": typed}, "burn": {"taxi": 0, "trip": 0}})
    assert resolve_loading(start, TWO_TANKS).fuel["mains"] == volume
    trip = resolve_trip(
        _trip({"add_fuel": {"mains": typed}, "burn": {"trip": 5}}, fuel={"aux": 10, "mains": 20}), TWO_TANKS
    )
    assert trip.legs[1].fuel["mains"] == volume


@pytest.mark.parametrize("field", ["fuel", "add_fuel"])
def test_an_unknown_level_in_any_case_is_refused_with_the_levels_the_tank_has(field):
    from loadcheck.loading import resolve_loading

    with pytest.raises(UnknownNameError) as caught:
        if field == "fuel":
            resolve_loading(Loading.model_validate({"fuel": {"mains": "LOCL"}}), TWO_TANKS)
        else:
            resolve_trip(_trip({"add_fuel": {"mains": "LOCL"}, "burn": {"trip": 5}}), TWO_TANKS)
    problem = caught.value.problems[0]
    assert problem.field == ("fuel.mains" if field == "fuel" else "leg 2, add_fuel.mains")
    assert problem.message == "unknown fill level 'LOCL' for tank 'mains' (did you mean 'local'?)"
    assert problem.expected == "one of full, local"


def test_levels_whose_names_differ_only_in_surrounding_spaces_are_never_chosen_between():
    # fail closed: 'tabs' and ' tabs' in one tank would both be the level typed 'tabs'
    from loadcheck.loading import resolve_loading

    aircraft = simple_aircraft(
        tank=[{"id": "mains", "arm": 45.0, "usable": 40.0, "fuel": "avgas", "levels": {"tabs": 25.0, " tabs": 20.0}}]
    )
    with pytest.raises(UnknownNameError, match=r"fill level 'tabs' matches 'tabs' and ' tabs' of tank 'mains'"):
        resolve_loading(Loading.model_validate({"fuel": {"mains": "tabs"}}), aircraft)
