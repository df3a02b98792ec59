"""Aircraft file validation: every bad field is an error naming its path."""

from __future__ import annotations

import pytest

from loadcheck.errors import InputError
from loadcheck.files import parse_aircraft

from .helpers import sample_data, simple_aircraft


def _problems(data) -> str:
    with pytest.raises(InputError) as info:
        parse_aircraft(data, "test.toml")
    return str(info.value)


def test_samples_load(trainer, tandem, twin):
    assert trainer.categories == ["normal", "utility"]
    assert tandem.units.mass == "kg" and tandem.units.arm == "mm" and tandem.units.fuel_volume == "l"
    assert twin.envelope[0].axes == ("moment", "weight")


def test_defaults_of_limits(trainer, tandem):
    assert tandem.limits.ramp == tandem.limits.max_takeoff_weight == 680
    assert tandem.limits.landing == 680
    assert trainer.limits.ramp == 2462


def test_quantities_with_units_are_converted():
    aircraft = simple_aircraft(empty={"weight": "500 kg", "arm": "1 m"})
    assert aircraft.empty.weight == pytest.approx(500 / 0.45359237)
    assert aircraft.empty.arm == pytest.approx(1000 / 25.4)


def test_unknown_unit_lists_choices():
    data = sample_data("trainer4/aircraft.toml")
    data["units"]["mass"] = "stone"
    text = _problems(data)
    assert "units.mass" in text and "'lb' or 'kg'" in text and "stone" in text


@pytest.mark.parametrize("value", [-5, float("nan"), float("inf")])
def test_negative_or_nan_station_limit(value):
    data = sample_data("trainer4/aircraft.toml")
    data["station"][2]["max_weight"] = value
    text = _problems(data)
    assert "test.toml: station[2].max_weight" in text


def test_every_problem_is_reported_at_once():
    data = sample_data("trainer4/aircraft.toml")
    data["empty"]["weight"] = -1
    data["tank"][0]["usable"] = 0
    text = _problems(data)
    assert "empty.weight" in text and "tank[0].usable" in text


def test_closed_ring_is_accepted():
    aircraft = simple_aircraft(
        envelope=[
            {
                "category": "normal",
                "axes": ["arm", "weight"],
                "points": [[35, 900], [35, 2000], [48, 2000], [48, 900], [35, 900]],
            }
        ]
    )
    assert len(aircraft.envelope[0].shape.corners) == 4


def test_mac_axis_needs_mac():
    text = _problems(
        {
            **sample_data("trainer4/aircraft.toml"),
            "mac": None,
            "envelope": [
                {
                    "category": "normal",
                    "axes": ["mac", "weight"],
                    "points": [[10, 1500], [10, 2450], [30, 2450], [30, 1500]],
                }
            ],
        }
    )
    assert "envelope[0].axes" in text and "[mac]" in text


def test_lateral_envelope_without_lateral_arms_fails_closed():
    data = sample_data("trainer4/aircraft.toml")
    data["envelope"].append(
        {
            "category": "normal",
            "axes": ["lateral_arm", "weight"],
            "points": [[-3, 1500], [-3, 2450], [3, 2450], [3, 1500]],
        }
    )
    assert "lateral arms" in _problems(data)


def test_duplicate_ids():
    data = sample_data("trainer4/aircraft.toml")
    data["tank"][0]["id"] = "front"
    assert "used twice" in _problems(data)


def test_group_names_unknown_station():
    data = sample_data("trainer4/aircraft.toml")
    data["station_group"][0]["stations"] = ["hold", "bag3"]
    text = _problems(data)
    assert "station_group[0].stations" in text and "bag3" in text and "rear" in text


def test_tank_needs_grade_or_density():
    data = sample_data("trainer4/aircraft.toml")
    del data["tank"][0]["fuel"]
    assert "fuel grade" in _problems(data)


def test_level_above_capacity():
    data = sample_data("trainer4/aircraft.toml")
    data["tank"][0]["levels"] = {"school": 60}
    assert "above the usable capacity" in _problems(data)


@pytest.mark.parametrize(
    "table, words",
    [([[0, 46], [30, 47], [20, 48]], "increase"), ([[0, 46], [60, 48]], "usable"), ([[0, 46]], "two points")],
)
def test_bad_arm_tables(table, words):
    data = sample_data("trainer4/aircraft.toml")
    del data["tank"][0]["arm"]
    data["tank"][0]["arm_table"] = table
    assert words in _problems(data)


def test_regression_a_tank_with_both_arm_and_arm_table_used_the_table_without_a_word():
    data = sample_data("trainer4/aircraft.toml")
    data["tank"][0]["arm_table"] = [[0, 43], [20, 44], [30, 45]]  # beside its arm = 44.0
    assert "not both" in _problems(data)


def test_regression_a_category_with_a_trailing_space_was_a_second_category():
    # 'utility ' beside 'utility' made an envelope no loading checked as 'utility' was held to
    data = sample_data("trainer4/aircraft.toml")
    data["envelope"][1]["category"] = "utility "
    assert "spaces at its start or end" in _problems(data)
    data["envelope"][1]["category"] = "NORMAL"
    assert "only in letter case" in _problems(data)


def test_a_zero_fuel_limit_above_the_takeoff_limit_is_refused():
    # the zero-fuel weight is the aircraft's weight without usable fuel (FAA-H-8083-1B glossary, "zero fuel
    # weight", from memory), so it never exceeds the takeoff weight: such a limit could never hold a loading back
    data = sample_data("trainer4/aircraft.toml")
    data["limits"]["max_zero_fuel_weight"] = data["limits"]["max_takeoff_weight"] + 1
    assert "could never limit" in _problems(data)
    data["limits"]["max_zero_fuel_weight"] = data["limits"]["max_takeoff_weight"]
    assert parse_aircraft(data, "test.toml").limits.max_zero_fuel_weight == data["limits"]["max_takeoff_weight"]


def test_arm_table_interpolates():
    aircraft = simple_aircraft(tank=[{"id": "main", "usable": 40, "fuel": "avgas", "arm_table": [[0, 44], [40, 48]]}])
    tank = aircraft.tank_by_id["main"]
    assert tank.arm_at(0) == 44 and tank.arm_at(40) == 48 and tank.arm_at(10) == pytest.approx(45)


def test_missing_max_takeoff_weight():
    data = sample_data("trainer4/aircraft.toml")
    del data["limits"]["max_takeoff_weight"]
    assert "limits.max_takeoff_weight: this field is required" in _problems(data)


def test_fingerprint_changes_with_data(trainer):
    data = sample_data("trainer4/aircraft.toml")
    data["empty"]["weight"] += 1
    assert parse_aircraft(data).fingerprint != trainer.fingerprint
    assert parse_aircraft(sample_data("trainer4/aircraft.toml")).fingerprint == trainer.fingerprint


@pytest.mark.parametrize(
    "units, density",
    [
        ({"mass": "lb", "arm": "in", "fuel_volume": "usgal"}, 6.0),
        ({"mass": "kg", "arm": "mm", "fuel_volume": "l"}, 0.72),
        ({"mass": "lb", "arm": "in", "fuel_volume": "impgal"}, 7.2),
        ({"mass": "kg", "arm": "m", "fuel_volume": "usgal"}, 3.04),
    ],
)
def test_a_plausible_tank_density_is_accepted_in_any_units(units, density):
    # avgas about 0.72 kg/L (ASTM D910 figure, from memory) written in each pair of units
    aircraft = simple_aircraft(units=units, tank=[{"id": "main", "arm": 45.0, "usable": 40.0, "density": density}])
    assert aircraft.density(aircraft.tank_by_id["main"]) == density


@pytest.mark.parametrize("density", [0.72, 720, 1.0, 9.0])
def test_a_tank_density_no_fuel_has_is_refused(density):
    # a lb / US gal file: 0.72 is a kg/L figure, 720 kg/m^3, 1.0 water, 9.0 no fuel
    with pytest.raises(InputError, match=r"tank\[0\].density: .* is not the density of an aviation fuel"):
        simple_aircraft(tank=[{"id": "main", "arm": 45.0, "usable": 40.0, "density": density}])


@pytest.mark.parametrize(
    "name", ["pilot", "Date", "RESERVE", "trip_time", "order", "label", "registration", "trip_id", "Leg"]
)
def test_a_station_or_tank_may_not_take_a_fleet_csv_column_name(name):
    # trip_id and leg were left out: an aircraft with a station 'leg' passed validate, then fleet check
    # read every CSV with a 'leg' column as a trip's legs (an outside trial's find)
    from loadcheck.aircraft import RESERVED_IDS
    from loadcheck.fleet import LEG_COLUMN, RESERVED_COLUMNS, TRIP_COLUMN

    assert RESERVED_COLUMNS == RESERVED_IDS and name.lower() in RESERVED_IDS
    assert {TRIP_COLUMN, LEG_COLUMN} <= set(RESERVED_IDS)
    with pytest.raises(InputError, match=rf"station\[0\].id: {name!r} is a reserved name"):
        simple_aircraft(station=[{"id": name, "arm": 35.0}])
    with pytest.raises(InputError, match=rf"tank\[0\].id: {name!r} is a reserved name"):
        simple_aircraft(tank=[{"id": name, "arm": 45.0, "usable": 40.0, "fuel": "avgas"}])


def test_every_category_must_limit_the_fore_and_aft_cg():
    lateral = {
        "category": "utility",
        "axes": ["lateral_arm", "weight"],
        "points": [[-2, 900], [-2, 2000], [2, 2000], [2, 900]],
    }
    box = {
        "category": "normal",
        "axes": ["arm", "weight"],
        "points": [[35.0, 900], [35.0, 2000], [48.0, 2000], [48.0, 900]],
    }
    centred = {  # every item on the centreline, said (a lateral limit needs every lateral arm)
        "empty": {"weight": 1000.0, "arm": 40.0, "lateral_arm": 0.0},
        "station": [
            {"id": "front", "arm": 35.0, "lateral_arm": 0.0, "kind": "seat"},
            {"id": "rear", "arm": 70.0, "lateral_arm": 0.0, "kind": "seat"},
        ],
        "tank": [{"id": "main", "arm": 45.0, "lateral_arm": 0.0, "usable": 40.0, "fuel": "avgas"}],
    }
    with pytest.raises(InputError, match=r"envelope\[1\].category: category 'utility' has only lateral envelopes"):
        simple_aircraft(**centred, envelope=[box, lateral])
    both = {**lateral, "axes": ["lateral_arm", "arm"], "points": [[-2, 35], [-2, 48], [2, 48], [2, 35]]}
    aircraft = simple_aircraft(**centred, envelope=[box, both])
    assert aircraft.categories == ["normal", "utility"]  # a lateral_arm-arm envelope limits both


def test_regression_self_crossing_envelope_is_said_in_words_in_the_aircrafts_units():
    """validate showed shapely's raw text ("Self-intersection[42.75 2222.09]"); it now says which envelope,
    that its edges cross, and near which point, in the aircraft's units."""
    data = sample_data("tandem2/aircraft.toml")  # kg and mm
    data["envelope"][1]["label"] = "flaps down"
    # a bow tie: the edges (300, 400)-(500, 700) and (500, 400)-(300, 700) cross at their midpoint (400, 550)
    data["envelope"][1]["points"] = [[300.0, 400.0], [500.0, 700.0], [500.0, 400.0], [300.0, 700.0]]
    with pytest.raises(InputError) as caught:
        parse_aircraft(data)
    (problem,) = caught.value.problems
    assert problem.field == "envelope[1]"
    assert problem.message.startswith(
        "the flaps down envelope is not usable: its edges cross each other near CG 400 mm, weight 550.0 kg"
    )
    assert "Self-intersection" not in problem.message


def test_regression_an_arm_beyond_any_aircraft_is_refused_not_overflowed():
    """tests/test_fuzz.py found a station arm of 1.5e306 in accepted and extremes ending in an internal
    error (the moments overflow to infinity); such a figure is refused at the boundary, naming the field."""
    data = sample_data("trainer4/aircraft.toml")
    data["station"][2]["arm"] = 1.4980776123852632e306
    with pytest.raises(InputError) as caught:
        parse_aircraft(data)
    (problem,) = caught.value.problems
    assert problem.field == "station[2].arm" and "beyond any aircraft" in problem.message
    data["station"][2]["arm"] = 9_999_999.0  # large, but within the bound: used as given
    assert parse_aircraft(data).station[2].arm == 9_999_999.0


def test_regression_a_lateral_limit_took_an_items_missing_lateral_arm_as_the_centreline():
    """An aircraft with a lateral envelope whose baggage station and tank gave no lateral arm was checked
    with both on the centreline, a guess beside a limit (an outside trial's find, in the mechanic's
    commands; the aircraft file is where it starts). Every item now gives its own lateral arm, 0 for
    one on the centreline (fail closed, common practice); an aircraft without lateral limits needs none."""
    lateral = {
        "category": "normal",
        "axes": ["lateral_arm", "weight"],
        "points": [[-2, 900], [-2, 2000], [2, 2000], [2, 900]],
    }
    box = {"category": "normal", "axes": ["arm", "weight"], "points": [[35, 900], [35, 2000], [48, 2000], [48, 900]]}
    with pytest.raises(InputError) as refused:
        simple_aircraft(
            empty={"weight": 1000.0, "arm": 40.0, "lateral_arm": 0.0},
            station=[{"id": "left", "arm": 35.0, "lateral_arm": -10.0}, {"id": "bag", "arm": 95.0}],
            envelope=[box, lateral],
        )
    fields = [p.field for p in refused.value.problems]
    assert fields == ["station[1].lateral_arm", "tank[0].lateral_arm"], fields
    assert all("0 for one on the centreline" in p.message for p in refused.value.problems)
    assert simple_aircraft(station=[{"id": "bag", "arm": 95.0}]).has_lateral is False  # no lateral limit: none needed


def test_regression_a_station_named_twice_in_a_group_was_counted_once():
    """An outside trial: ``stations = ["rear", "rear"]`` (a typo for ``["rear", "hold"]``) was taken as
    ``["rear"]``: the hold was left out of the combined limit without a word. A station named twice in
    a group is refused, as a station id given twice is (fail closed, common practice)."""
    data = sample_data("trainer4/aircraft.toml")
    data["station_group"][0]["stations"] = ["rear", "rear"]
    assert "station_group[0].stations: station(s) named twice in the group: rear" in _problems(data)


@pytest.mark.parametrize("registration", ["  ", "-", ""])
def test_regression_a_registration_of_spaces_passed_as_an_ordinary_aircraft(registration):
    """An outside trial: ``registration = "  "`` passed ``fleet list`` with "Problems: none" and a blank
    registration (registrations are compared by their letters and digits alone, ``registration_key``):
    a registration with no letter or digit is refused in the aircraft file (fail closed, common practice)."""
    data = sample_data("trainer4/aircraft.toml")
    data["registration"] = registration
    assert "registration: " in _problems(data) and "has no letter or digit" in _problems(data)


@pytest.mark.parametrize(("where", "other"), [("station", 1), ("tank", 0)])
def test_regression_ids_differing_only_in_letter_case_passed(where, other):
    """An outside trial: station ids ``Front`` and ``front`` could stand side by side in one aircraft,
    though categories differing only in case are refused: a loading's ``front`` or a fleet column
    ``Front`` would name one where the other was meant. Ids of stations and tanks that differ only in
    letter case are refused (fail closed, common practice)."""
    data = sample_data("trainer4/aircraft.toml")
    first = data["station"][0]["id"]
    twin = {**data[where][other], "id": first.upper()}
    data[where].append(twin)
    index = len(data[where]) - 1
    assert f"{where}[{index}].id: {first.upper()!r} differs from {first!r} only in letter case" in _problems(data)


@pytest.mark.parametrize("name", ["   ", "\t"])
def test_regression_a_blank_aircraft_name_passed(name):
    """An outside trial: ``name = "   "`` passed validate (``aircraft '   '``) though it heads every table
    and record; a blank registration is refused already. A blank name is refused too (common practice)."""
    data = sample_data("trainer4/aircraft.toml")
    data["name"] = name
    assert "name: " in _problems(data) and "name is blank" in _problems(data)


@pytest.mark.parametrize("name", ["12", "12.0", "5 l", "3 usgal", " 7 ", ".5"])
def test_a_level_name_that_reads_as_an_amount_is_refused(name):
    # an outside trial's find: a level "12" (3 gal) took the place of the 12 gal typed as fuel = "12",
    # and the check said within limits where 12 gal is out; the TOML number 12 and the fleet CSV cell
    # were read as 12 gal. A name that reads as an amount would always be ambiguous (fail closed)
    data = sample_data("trainer4/aircraft.toml")
    data["tank"][0]["levels"] = {name: 3}
    assert "reads as an amount" in _problems(data)


def test_level_names_that_differ_only_in_case_are_refused():
    # as station and tank ids are: 'HALF' and 'half' in one file, one of them unreachable as typed
    data = sample_data("trainer4/aircraft.toml")
    data["tank"][0]["levels"] = {"half": 20, "HALF": 10}
    assert "differ only in letter case" in _problems(data)
    data["tank"][0]["levels"] = {"half": 20, "tabs": 10, "low 2": 5}  # words
    parse_aircraft(data, "test.toml")


@pytest.mark.parametrize("name", ["1st", "-low", "+tabs", ".5x", "１st"])
def test_a_level_name_a_loading_reads_as_an_amount_is_refused(name):
    # a review: '1st' or '-low' passed the aircraft file, but a loading reads a text that begins with a
    # digit (of any script), a sign or a point as an amount, so the level could never be used; one rule
    # for both (loadcheck.units.names_a_level)
    from loadcheck.units import names_a_level

    assert not names_a_level(name)
    data = sample_data("trainer4/aircraft.toml")
    data["tank"][0]["levels"] = {name: 3}
    assert "so a loading reads it as an amount" in _problems(data)


def test_a_tank_may_not_take_the_burn_orders_keyword():
    # an outside trial's find: a tank 'together' could not be burned alone from the command line, the
    # CSV or the desk: the order 'together' is always read as every tank burned together. The order reads
    # the keyword as written (loadcheck.loading.burn_order), so 'Together' names that tank
    with pytest.raises(InputError, match=r"tank\[0\].id: 'together' is the burn order's word"):
        simple_aircraft(tank=[{"id": "together", "arm": 45.0, "usable": 40.0, "fuel": "avgas"}])
    simple_aircraft(tank=[{"id": "Together", "arm": 45.0, "usable": 40.0, "fuel": "avgas"}])
    simple_aircraft(station=[{"id": "together", "arm": 35.0}])  # a station of that name is never a burn order


@pytest.mark.parametrize("kind", ["baggage", "cargo", "ballast"])
@pytest.mark.parametrize("field, value", [("controls", True), ("seats", 2)])
def test_seat_fields_on_a_station_that_is_no_seat_are_refused(kind, field, value):
    # an outside trial's find: controls = true on a baggage station made 10 kg of baggage count as
    # the pilot (no no-pilot warning with the front seat empty); seats = 3 on baggage was accepted
    with pytest.raises(InputError, match=rf"{field} given on a {kind} station, which is no seat"):
        simple_aircraft(station=[{"id": "s", "arm": 35.0, "kind": kind, field: value}])
    simple_aircraft(station=[{"id": "s", "arm": 35.0, "kind": "seat", field: value}])


def test_a_moment_scale_on_an_envelope_with_no_moment_axis_is_refused():
    # an outside trial's find: moment_scale = 100 on an arm/weight envelope was dropped without a word;
    # its author meant a moment envelope, and the points were read as arms
    data = sample_data("trainer4/aircraft.toml")
    data["envelope"][0]["moment_scale"] = 100
    assert "moment_scale = 100 on an envelope with no moment axis" in _problems(data)
    data["envelope"][0]["moment_scale"] = 1  # the default, written out: nothing is dropped
    parse_aircraft(data, "test.toml")


def test_envelopes_of_one_category_without_labels_are_told_apart_in_words():
    # an outside trial's find: with a longitudinal and a lateral envelope of one category, neither
    # labelled, a weight finding was printed twice word for word ("... below the normal-category
    # envelope ..."), and the reader could not tell which envelope each line was about
    two = simple_aircraft(
        station=[{"id": "front", "arm": 35.0, "lateral_arm": 0.0}],
        tank=[{"id": "main", "arm": 45.0, "lateral_arm": 0.0, "usable": 40.0, "fuel": "avgas"}],
        empty={"weight": 1200.0, "arm": 38.0, "lateral_arm": 0.0},
        envelope=[
            {
                "category": "normal",
                "axes": ["arm", "weight"],
                "points": [[30, 1000], [45, 1000], [45, 2000], [30, 2000]],
            },
            {
                "category": "normal",
                "axes": ["lateral_arm", "weight"],
                "points": [[-4, 1000], [4, 1000], [4, 2000], [-4, 2000]],
            },
            {
                "category": "utility",
                "axes": ["arm", "weight"],
                "points": [[30, 1000], [40, 1000], [40, 2000], [30, 2000]],
            },
        ],
    )
    normal, lateral, utility = (e.subject for e in two.envelope)
    assert normal == "the normal-category envelope of CG and weight"
    assert lateral == "the normal-category envelope of lateral CG and weight"
    assert utility == "the utility-category envelope"  # alone in its category: its words as before
