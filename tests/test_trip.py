"""Trips of several legs (issue 16 part 1): every leg checked as a single loading, fuel carried
over tank by tank, the trip's verdict and exit status, planning for a trip.

Source of the published case: FAA-H-8083-1B, *Aircraft Weight and Balance Handbook* (2016),
chapter 8, "Determining the Loaded CG of a Helicopter", p. 8-3 (the same data in chapter 10,
p. 10-5, figure 10-8), and "Effects of Offloading Passengers and Using Fuel" (26 gal burned,
the passenger off: CG too far aft and too far right). Lateral arms positive to the right of
butt line 0. The handbook prints some values truncated (-1,705.2 as -1,705, -0.774 as
-0.77): each published figure is compared within one unit of its last printed digit.

The envelope limits of the handbook's figure 8-3 are not given in its text: the limits of
the test aircraft below are INVENTED (a longitudinal CG range of 92.0 to 96.0 in and a
lateral offset moment range of -3,000 to +1,500 lb-in, 1,500 to 2,250 lb), chosen only so
that the published first leg is inside and the published second leg outside, as the
handbook finds.
"""

from __future__ import annotations

import json
import re
from pathlib import Path

import pytest
import tomlkit
from hypothesis import given, settings
from hypothesis import strategies as st

from loadcheck import check_loading, load_check_inputs
from loadcheck.cli import app
from loadcheck.errors import InputError
from loadcheck.files import parse_aircraft, read_toml
from loadcheck.loading import Loading
from loadcheck.trip import check_trip, fuel_to_add, trip_most_fuel

from .helpers import examples, sample, simple_aircraft, trip_fleet

# FAA-H-8083-1B (2016) ch. 8 p. 8-3: arms and weights as published; fuel 48 gal weighing
# 288 lb, i.e. 6.0 lb/gal (avgas). Maximum gross weight 2,250 lb (published). Usable fuel
# 48 gal and every envelope limit: INVENTED for the test.
HANDBOOK_HELICOPTER = {
    "name": "FAA-H-8083-1B ch. 8 helicopter (published arms, invented limits)",
    "units": {"mass": "lb", "arm": "in", "fuel_volume": "usgal"},
    "empty": {"weight": 1545.0, "arm": 101.4, "lateral_arm": 0.2},
    "limits": {"max_takeoff_weight": 2250.0},
    "station": [
        {"id": "pilot_seat", "arm": 64.0, "lateral_arm": 13.5, "kind": "seat"},
        {"id": "passenger_seat", "arm": 64.0, "lateral_arm": -13.5, "kind": "seat"},
    ],
    "tank": [{"id": "main", "arm": 96.0, "lateral_arm": -8.4, "usable": 48.0, "density": 6.0}],
    "envelope": [
        {
            "category": "normal",
            "label": "longitudinal",
            "axes": ["arm", "weight"],  # INVENTED limits
            "points": [[92.0, 1500], [92.0, 2250], [96.0, 2250], [96.0, 1500]],
        },
        {
            "category": "normal",
            "label": "lateral",
            "axes": ["lateral_moment", "weight"],  # INVENTED limits
            "points": [[-3000, 1500], [-3000, 2250], [1500, 2250], [1500, 1500]],
        },
    ],
}
HELICOPTER = parse_aircraft(HANDBOOK_HELICOPTER)

FIRST_LEG = {"load": {"pilot_seat": 200, "passenger_seat": 170}, "fuel": {"main": 48}, "burn": {"taxi": 0, "trip": 26}}
SECOND_LEG = {"label": "solo", "load": {"passenger_seat": 0}, "burn": {"taxi": 0, "trip": 10}}

LOADING_FILE = """
format = 1
aircraft = "helicopter.toml"

[load]
pilot_seat = 200
passenger_seat = 170

[fuel]
main = 48

[burn]
taxi = 0
trip = 26

[[leg]]
label = "solo"
load = { passenger_seat = 0 }
burn = { taxi = 0, trip = 10 }
"""


def _write_files(tmp_path, text=LOADING_FILE):
    (tmp_path / "helicopter.toml").write_bytes(tomlkit.dumps(HANDBOOK_HELICOPTER).encode())
    path = tmp_path / "trip.toml"
    path.write_text(text)
    return path


def _assert_published_first_leg(result):
    ramp = result.condition("ramp")
    # published: gross weight 2,203 lb; CG 94.4 in; within one unit of the last printed digit
    assert abs(ramp.weight - 2203) <= 1
    assert abs(ramp.arm - 94.4) <= 0.1
    # lateral offset moments +309, +2,700, -2,295, -2,419 lb-in, total -1,705 lb-in (printed truncated)
    moments = {i.id: i.lateral_moment for i in result.items}
    for item, published in (("empty", 309), ("pilot_seat", 2700), ("passenger_seat", -2295)):
        assert abs(moments[item] - published) <= 1
    fuel = next(i for i in result.items if i.kind == "fuel")
    assert abs(fuel.lateral_moment - (-2419)) <= 1
    assert abs(ramp.lateral_moment - (-1705)) <= 1
    # lateral CG -0.77 in (0.77 in left of butt line 0), printed truncated
    assert abs(ramp.lateral_arm - (-0.77)) <= 0.01
    assert ramp.weight <= 2250  # published maximum gross weight


def test_faa_helicopter_published_case_through_the_api():
    result = check_loading(HELICOPTER, Loading.model_validate(FIRST_LEG))
    _assert_published_first_leg(result)
    assert result.ok


def test_faa_helicopter_published_case_through_a_loading_file(tmp_path):
    path = _write_files(tmp_path, LOADING_FILE.split("[[leg]]")[0])
    inputs = load_check_inputs(path)
    result = check_loading(inputs.aircraft, inputs.loading)
    _assert_published_first_leg(result)
    assert result.ok


# The second leg by hand (FAA-H-8083-1B ch. 8 method: sum the weights, the moments and the
# lateral moments; CG = moment / weight):
#   fuel after 26 gal burned: 48 - 26 = 22 gal x 6.0 lb/gal = 132 lb; passenger off
#   weight   = 1,545 + 200 + 132                               = 1,877 lb
#   moment   = 1,545 x 101.4 + 200 x 64 + 132 x 96
#            = 156,663 + 12,800 + 12,672                        = 182,135 lb-in
#   CG       = 182,135 / 1,877                                  = 97.035 in  (aft of the invented 96.0 limit)
#   lateral  = 1,545 x 0.2 + 200 x 13.5 + 132 x (-8.4)
#            = 309 + 2,700 - 1,108.8                            = +1,900.2 lb-in (right of the invented +1,500)
LEG2_WEIGHT, LEG2_MOMENT, LEG2_LATERAL = 1877.0, 182135.0, 1900.2


def test_two_legs_the_second_alone_fails_aft_and_right():
    trip = check_trip(HELICOPTER, Loading.model_validate({**FIRST_LEG, "leg": [SECOND_LEG]}))
    first, second = trip.legs[0].check, trip.legs[1].check
    assert first.ok and not second.ok and not trip.ok
    ramp = second.condition("ramp")
    assert ramp.weight == pytest.approx(LEG2_WEIGHT)
    assert ramp.moment == pytest.approx(LEG2_MOMENT)
    assert ramp.lateral_moment == pytest.approx(LEG2_LATERAL)
    assert ramp.arm == pytest.approx(97.035, abs=5e-4)
    sides = {(f.side, f.subject) for f in second.limits_exceeded if f.condition == "ramp"}
    assert ("aft", "the longitudinal envelope") in sides and ("right", "the lateral envelope") in sides
    # every trip finding names its leg and condition; none belongs to leg 1
    assert trip.limits_exceeded and all(
        f.leg == 2 and f.message.startswith("leg 2 (solo): ") for f in trip.limits_exceeded
    )
    assert all(f.condition is not None for f in trip.limits_exceeded if f.code == "envelope")
    # the first leg alone, as a single loading, passes; the second, written out by hand, fails the same way
    assert check_loading(HELICOPTER, Loading.model_validate(FIRST_LEG)).to_dict() == trip.legs[0].check.to_dict()
    alone = check_loading(
        HELICOPTER,
        Loading.model_validate({"load": {"pilot_seat": 200}, "fuel": {"main": 22}, "burn": {"taxi": 0, "trip": 10}}),
    )
    assert alone.to_dict() == second.to_dict()


def test_the_command_line_takes_legs(runner, tmp_path):
    path = _write_files(tmp_path, LOADING_FILE.split("[[leg]]")[0])
    same = runner.invoke(
        app,
        [
            "check",
            str(path),
            "--leg-load",
            "2:passenger_seat=0",
            "--leg-burn",
            "2:trip=10",
            "--leg-burn",
            "2:taxi=0",
            "--json",
        ],
    )
    data = json.loads(same.output)
    assert same.exit_code == 1 and data["legs"][1]["conditions"][0]["weight"] == pytest.approx(LEG2_WEIGHT)
    # fuel put in at the stop moves the CG forward and left: 20 gal more at 96 in, -8.4 in
    fuelled = runner.invoke(
        app,
        [
            "check",
            str(path),
            "--leg-load",
            "2:passenger_seat=0",
            "--leg-fuel",
            "2:main=20",
            "--leg-burn",
            "2:trip=10",
            "--json",
        ],
    )
    ramp = json.loads(fuelled.output)["legs"][1]["conditions"][0]
    assert ramp["fuel"] == pytest.approx(42.0) and ramp["moment"] == pytest.approx(LEG2_MOMENT + 120 * 96)
    skipped = runner.invoke(app, ["check", str(path), "--leg-burn", "3:trip=10"])
    assert skipped.exit_code == 2 and "skips leg 2" in skipped.output


def test_a_bad_leg_is_refused_with_its_field_path(runner, tmp_path):
    path = _write_files(tmp_path, LOADING_FILE.replace("passenger_seat = 0 }", "cargo = 0 }"))
    result = runner.invoke(app, ["check", str(path)])
    assert result.exit_code == 2 and "leg 2, load.cargo: unknown station" in result.output
    assert "Traceback" not in result.output


def test_no_job_checks_a_trip_as_its_first_leg_alone(runner, tmp_path):
    loading = Loading.model_validate({**FIRST_LEG, "leg": [SECOND_LEG]})
    with pytest.raises(InputError, match="trip of 2 legs"):
        check_loading(HELICOPTER, loading)
    path = _write_files(tmp_path)
    refused = runner.invoke(app, ["plan", "payload", str(path), "--station", "pilot_seat"])
    assert refused.exit_code == 2 and "trip of 2 legs" in refused.output
    assert "a trip of 2 legs" in " ".join(runner.invoke(app, ["validate", str(path)]).output.split())


# -- one leg is today's check ----------------------------------------------------------------

loadings = st.fixed_dictionaries(
    {
        "front": st.floats(0, 400),
        "rear": st.floats(0, 400),
        "bag": st.floats(0, 120),
        "main": st.floats(0, 40),
        "taxi": st.floats(0, 1),
        "trip": st.floats(0, 1),
    }
)


@settings(max_examples=examples(60), deadline=None)
@given(loadings)
def test_a_trip_of_one_leg_equals_todays_single_check(v):
    aircraft = simple_aircraft()
    taxi = v["main"] * v["taxi"] * 0.1
    loading = Loading.model_validate(
        {
            "load": {"front": v["front"], "rear": v["rear"], "bag": v["bag"]},
            "fuel": {"main": v["main"]},
            "burn": {"taxi": taxi, "trip": (v["main"] - taxi) * v["trip"]},
        }
    )
    single = check_loading(aircraft, loading)
    trip = check_trip(aircraft, loading)
    assert len(trip.legs) == 1 and trip.ok == single.ok
    assert trip.legs[0].check.to_dict() == single.to_dict()
    assert [f.message for f in trip.findings] == [f"leg 1: {f.message}" for f in single.findings]


def test_a_loading_without_legs_prints_todays_json(runner):
    path = sample("heli2/dual.toml")
    data = json.loads(runner.invoke(app, ["check", str(path), "--json"]).output)
    inputs = load_check_inputs(path)
    assert data == json.loads(check_loading(inputs.aircraft, inputs.loading).to_json())
    assert "legs" not in data


# -- planning for a trip against brute force -------------------------------------------------


# For planning, a variant of the handbook helicopter with INVENTED limits that let fuel
# matter both ways: the aft limit at 98.0 in, a 60 gal tank. Then (FAA-H-8083-1B ch. 8
# method) the first leg's ramp weight 1,915 + 6 x <= 2,250 lb bounds the first fuel
# (x <= 55.8 gal), and leg 2, the passenger off, stays within the right lateral limit only with fuel on
# the left: 3,009 - 50.4 f <= 1,500 lb-in, f >= 29.9 gal all the way to its landing.
PLANNING = parse_aircraft(
    {
        **HANDBOOK_HELICOPTER,
        "tank": [{"id": "main", "arm": 96.0, "lateral_arm": -8.4, "usable": 60.0, "density": 6.0}],
        "envelope": [
            {**HANDBOOK_HELICOPTER["envelope"][0], "points": [[92.0, 1500], [92.0, 2250], [98.0, 2250], [98.0, 1500]]},
            HANDBOOK_HELICOPTER["envelope"][1],
        ],
    }
)


def _brute(high, build):
    """The values from 0 to ``high`` for which the whole trip checks within limits: check_trip
    on a 0.5 gal grid, then on a 0.01 gal grid across each change found (the stretches
    here are wider than 0.5 gal, by the hand figures in the tests)."""

    def good(value):
        try:
            return check_trip(PLANNING, Loading.model_validate(build(value)), samples=False).ok
        except InputError:
            return False

    coarse = [i * 0.5 for i in range(int(high * 2) + 1)]
    verdicts = [good(x) for x in coarse]
    found = [x for x, ok in zip(coarse, verdicts, strict=True) if ok]
    for a, ok_a, ok_b in zip(coarse, verdicts, verdicts[1:], strict=False):  # neighbouring pairs: one fewer
        if ok_a != ok_b:
            found += [x for x in (a + k * 0.01 for k in range(1, 50)) if good(x)]
    return sorted(found)


def test_most_fuel_for_a_trip_agrees_with_brute_force():
    data = {**FIRST_LEG, "burn": {"taxi": 0, "trip": 8}, "leg": [{"load": {"passenger_seat": 0}, "burn": {"trip": 6}}]}
    answer = trip_most_fuel(PLANNING, Loading.model_validate(data))
    good = _brute(60, lambda x: data | {"fuel": {"main": x}})
    assert good and answer.feasible and answer.trip is not None and answer.trip.ok
    assert max(good) == pytest.approx((2250 - 1915) / 6, abs=0.01)  # by hand, above
    assert min(good) == pytest.approx(8 + 6 + 1509 / 50.4, abs=0.01)
    # the answer within the brute force's 0.01 gal step; the least as shown (0.1 gal, rounded up)
    assert answer.answer == pytest.approx(max(good), abs=0.01 + 1e-9)
    least = float(answer.extra["least"].split()[0])
    assert least == pytest.approx(min(good), abs=0.1 + 1e-6) and least >= min(good) - 0.01  # never below what is needed
    assert answer.governing is not None and answer.governing.startswith("leg 1")


def test_fuel_to_add_at_a_stop_agrees_with_brute_force():
    leg = {"load": {"passenger_seat": 0}, "burn": {"trip": 6}}
    data = {**FIRST_LEG, "fuel": {"main": 40}, "burn": {"taxi": 0, "trip": 30}, "leg": [leg]}  # lands with 10 gal
    answer = fuel_to_add(PLANNING, Loading.model_validate(data), 2)
    good = _brute(50, lambda y: data | {"leg": [leg | {"add_fuel": {"main": y}}]})
    assert good and answer.feasible and answer.trip is not None and answer.trip.ok
    assert min(good) == pytest.approx(6 + 1509 / 50.4 - 10, abs=0.01)  # by hand: leg 2 lands with 29.9 gal
    assert answer.answer == pytest.approx(max(good), abs=0.01 + 1e-9)
    least = float(answer.extra["least"].split()[0])
    assert least == pytest.approx(min(good), abs=0.1 + 1e-6) and least >= min(good) - 0.01  # never below what is needed


def test_the_sample_trip_is_within_limits_on_every_leg(runner, tmp_path):
    result = runner.invoke(
        app,
        [
            "check",
            str(sample("heli2/trip_drop_off.toml")),
            "--chart",
            str(tmp_path / "t.svg"),
            "--sheet",
            str(tmp_path / "t.html"),
        ],
    )
    assert result.exit_code == 0, result.output
    svg = (tmp_path / "t.svg").read_text()
    assert 'id="leg-1-burn-path"' in svg and 'id="leg-2-burn-path"' in svg
    html = (tmp_path / "t.html").read_text()
    assert "WITHIN LIMITS on every leg" in html and "id='leg-2'" in html and html.count("CAUTION") == 1


# -- the fleet CSV: a trip id groups rows into one trip --------------------------------------

TRIP_CSV = """registration,reference,trip_id,left,right,bag_left,main,taxi,trip,reserve,label
DEMO-H2,T1,A,170,185,15,full,0.5,11,4,field site and back
DEMO-H2,,A,0,,0,5,0.5,12,4,"back to base, solo"
DEMO-H2,T2,,170,190,,full,0.5,20,,
"""


def test_the_fleet_csv_groups_the_rows_of_a_trip(tmp_path):
    from loadcheck.fleet import check_flights, load_fleet, read_loadings

    path = tmp_path / "day.csv"
    path.write_text(TRIP_CSV)
    fleet = load_fleet(sample(""))
    rows = list(read_loadings(path, fleet)[0])
    assert [(r.line, r.trip, r.reference, r.lines) for r in rows] == [(2, "A", "T1", (2, 3)), (4, None, "T2", ())]
    trip = rows[0].loading
    assert trip is not None and len(trip.leg) == 1 and not rows[0].problems
    assert trip.leg[0].load == {"left": 0.0, "bag_left": 0.0} and trip.leg[0].add_fuel == {"main": 5.0}
    # the same trip as the sample file: the same check, leg by leg
    aircraft = fleet.aircraft("DEMO-H2")
    from_csv = check_trip(aircraft, trip)
    inputs = load_check_inputs(sample("heli2/trip_drop_off.toml"), allow_trip=True)
    from_file = check_trip(inputs.aircraft, inputs.trip)
    assert [leg.check.to_dict() for leg in from_csv.legs] == [leg.check.to_dict() for leg in from_file.legs]
    # the fleet check checks the trip as check_trip does, every leg, never its first leg alone
    flights = list(check_flights(fleet, rows))
    assert flights[0].result == check_trip(aircraft, trip, samples=False).to_dict()
    assert len(flights[0].result["legs"]) == 2 and flights[0].to_dict()["lines"] == [2, 3]
    assert flights[1].result is not None and "legs" not in flights[1].result


def test_rows_of_one_trip_come_together(tmp_path):
    """Regression: a trip id given again after another flight refused only its later part, and
    its first part was checked as a trip of fewer legs; now every part is refused."""
    from loadcheck.fleet import load_fleet, read_loadings

    lines = TRIP_CSV.splitlines()
    path = tmp_path / "day.csv"
    path.write_text("\n".join([lines[0], lines[1], lines[3], lines[2].replace(",,A,", ",T9,A,")]) + "\n")
    rows = list(read_loadings(path, load_fleet(sample("")))[0])
    assert len(rows) == 3 and rows[1].loading is not None
    for row in (rows[0], rows[2]):
        words = " ".join(row.problems)
        assert (
            row.loading is None and "given in parts" in words and "lines 2 and 4" in words and "is not checked" in words
        )


def test_a_trip_is_recorded_as_one_record_and_plots_every_leg(runner, tmp_path):
    path = str(sample("heli2/trip_drop_off.toml"))
    recorded = runner.invoke(app, ["check", path, "--log", "--db", str(tmp_path / "log.db"), "--json"])
    assert recorded.exit_code == 0 and "recorded as 1" in recorded.stderr
    from loadcheck.checklog import CheckLog

    with CheckLog(tmp_path / "log.db") as log:
        record = log.get(1)
        assert record.result == json.loads(recorded.stdout) and len(record.inputs["leg"]) == 1
    plotted = runner.invoke(app, ["check", path, "--plot"])
    assert plotted.exit_code == 0 and plotted.output.count("Leg ") >= 2


# -- trips through the dispatcher's and the recording jobs (issue 16) --------------------------
#
# The trip test aircraft TEST-T (tests/helpers.TRIP_AIRCRAFT, its limits invented) and trip
# "A" on it, both worked by hand there with the moment method of FAA-H-8083-1B (2016) ch. 2.


def test_the_hand_worked_trip_of_the_test_aircraft(tmp_path):
    inputs = load_check_inputs(trip_fleet(tmp_path / "fleet") / "trip.toml", allow_trip=True)
    result = check_trip(inputs.aircraft, inputs.trip)
    one, two = result.legs
    assert one.check.ok and not two.check.ok and not result.ok
    assert one.check.condition("ramp").weight == pytest.approx(1360.0)
    assert one.check.condition("ramp").arm == pytest.approx(108800 / 1360)
    assert two.check.condition("ramp").arm == pytest.approx(146860 / 1694)
    assert two.check.condition("takeoff").arm == pytest.approx(146320 / 1688)
    assert two.check.condition("landing").weight == pytest.approx(1628.0)
    assert two.check.condition("landing").arm == pytest.approx(140920 / 1628)
    assert {f.condition for f in result.limits_exceeded} >= {"ramp", "takeoff", "landing"}
    assert all(f.leg == 2 for f in result.limits_exceeded)


def test_the_desks_hand_worked_trip_of_the_test_aircraft(tmp_path):
    """The desk's trip (tests/web_helpers.TRIP_LEG_2_AFT) as a loading file of TEST-T: the
    figures worked by hand beside it (FAA-H-8083-1B (2016) ch. 2 moment method): leg 1
    within, leg 2 aft of 86 in at every condition once a front occupant gets off."""
    folder = trip_fleet(tmp_path / "fleet")
    (folder / "desk_trip.toml").write_text(
        'format = 1\naircraft = "aircraft.toml"\n[load]\nfront = 340\nbags = 100\n[fuel]\nmain = "full"\n'
        '[burn]\ntaxi = 1\ntrip = 20\n[[leg]]\nlabel = "back solo"\nload = { front = 170 }\n'
        "add_fuel = { main = 5 }\nburn = { taxi = 1, trip = 10 }\n"
    )
    inputs = load_check_inputs(folder / "desk_trip.toml", allow_trip=True)
    result = check_trip(inputs.aircraft, inputs.trip)
    one, two = (leg.check for leg in result.legs)
    assert one.ok and not two.ok and not result.ok
    by_hand = {  # (leg, condition): (weight [lb], moment [lb-in]), worked in tests/web_helpers.py
        (1, "ramp"): (1680, 143400),
        (1, "takeoff"): (1674, 142860),
        (1, "landing"): (1554, 132060),
        (2, "ramp"): (1414, 122860),
        (2, "takeoff"): (1408, 122320),
        (2, "landing"): (1348, 116920),
    }
    for (leg, name), (weight, moment) in by_hand.items():
        condition = result.legs[leg - 1].check.condition(name)
        assert condition.weight == pytest.approx(weight) and condition.moment == pytest.approx(moment), (leg, name)
        assert (condition.arm <= 86.0) == (leg == 1), (leg, name, condition.arm)
    assert {f.condition for f in result.limits_exceeded} >= {"ramp", "takeoff", "landing"}
    assert all(f.leg == 2 and f.side == "aft" for f in result.limits_exceeded if f.code == "envelope")


# -- regressions of the trip's words (desk round, 2026-12) ----------------------------------------


def test_trip_output_repeated_the_margin_rounding_after_every_legs_own_note(runner):
    """The trip output ended with "Margins are rounded down; ..." after each leg's conditions
    table had said so in its own note: each leg's table says it, nothing says it again."""
    from loadcheck.render.terminal import MARGIN_NOTE

    shown = runner.invoke(app, ["check", str(sample("heli2/trip_drop_off.toml"))])
    assert shown.exit_code == 0, shown.output
    text = " ".join(shown.output.split())  # rich wraps the note at the terminal's width
    assert "A trip of 2 legs" in text  # the sample trip: out to the field site, back solo
    assert text.count(MARGIN_NOTE.split(". ")[0]) == 2 and text.count("rounded down") == 2
    assert "Margins are rounded down" not in text


def test_plan_stop_past_the_last_leg_said_legs_2_to_2(runner, tmp_path):
    """``plan stop --leg 3`` on a trip of two legs said "a stop comes before legs 2 to 2": the
    words now read right for one stop and for several."""
    path = str(sample("heli2/trip_drop_off.toml"))
    two = runner.invoke(app, ["plan", "stop", path, "--leg", "3"])
    assert two.exit_code == 2 and "legs 2 to 2" not in two.output
    assert "--leg 3: the trip has 2 legs: its one stop comes before leg 2; expected 2" in " ".join(two.output.split())
    three = runner.invoke(app, ["plan", "stop", path, "--leg", "4", "--leg-burn", "3:trip=5"])
    assert three.exit_code == 2
    assert "--leg 4: the trip has 3 legs: its 2 stops come before legs 2 and 3; expected 2 or 3" in " ".join(
        three.output.split()
    )
    four = runner.invoke(app, ["plan", "stop", path, "--leg", "1", "--leg-burn", "3:trip=5", "--leg-burn", "4:trip=5"])
    assert four.exit_code == 2
    assert "--leg 1: the trip has 4 legs: its 3 stops come before legs 2 to 4" in " ".join(four.output.split())


def test_trip_least_fuel_landed_below_the_reserve():
    # regression (outside review): plan fuel on heli2/trip_drop_off.toml gave "least that keeps every leg within
    # limits: 19.0 usgal", but at 19 usgal leg 2 lands with 0.0 usgal against the file's reserve of 4 (the check's
    # reserve warning). The least now lands every leg with its reserve, and the answer carries its check.
    inputs = load_check_inputs(sample("heli2/trip_drop_off.toml"), allow_trip=True, fuel_to_plan=True)
    plan = trip_most_fuel(inputs.aircraft, inputs.trip)
    assert plan.feasible and plan.least is not None and plan.least_trip is not None
    assert plan.least_trip.ok and not any(f.code == "reserve" for f in plan.least_trip.findings)
    assert plan.extra["least"] == f"{plan.least:.1f} usgal" and plan.least > 19.0
    reserves = [leg.reserve for leg in inputs.trip.legs]
    for leg, reserve in zip(plan.least_trip.legs, reserves, strict=True):
        assert reserve is None or leg.check.condition("landing").fuel >= reserve - 1e-6
    # 0.2 usgal less than the least: the check of that trip warns that a leg lands below its reserve
    # (or finds a limit), so the least is the least (common practice: a reserve is fuel landed with)
    below = check_trip(inputs.aircraft, _first_fuel(inputs, plan.least - 0.2), samples=False)
    assert not below.ok or any(f.code == "reserve" for f in below.findings)
    # the stop's answer too: the least fuel put in lands every later leg with its reserve
    stop = fuel_to_add(inputs.aircraft, inputs.trip, 2)
    assert stop.least_trip is not None and not any(f.code == "reserve" for f in stop.least_trip.findings)


def _first_fuel(inputs, total):
    """The trip with ``total`` ramp fuel at the first engine start, read as ``check --fuel main=TOTAL``
    reads it (the sample's one tank, so no fill order to choose)."""
    assert [t.id for t in inputs.aircraft.tank] == ["main"]
    return load_check_inputs(sample("heli2/trip_drop_off.toml"), allow_trip=True, fuel={"main": f"{total!r}"}).trip


def test_regression_the_loadings_reserve_stopped_at_the_first_landing():
    """An outside trial: ``check within.toml --leg-burn 2:trip=5`` landed leg 2 with 5.8 US gal, below the
    file's ``reserve = 8``, without a word: the reserve held for leg 1 alone. A pilot's reserve holds
    for every landing of the trip, as the burn order does, unless a leg gives its own (``reserve = 0``
    drops it). Worked by hand: 30.0 US gal (school fill) - taxi 1.2 - trip 18 = 10.8 landed after leg 1;
    leg 2 burns 5 (no taxi given): 5.8 landed, 2.2 below 8.0."""
    from loadcheck.loading import leg_assignments

    path = sample("trainer4/within.toml")
    inputs = load_check_inputs(path, allow_trip=True, legs=leg_assignments("--leg-burn", ["2:trip=5"]))
    assert inputs.trip is not None
    result = check_trip(inputs.aircraft, inputs.trip)
    [below] = [f for f in result.findings if "below the reserve" in f.message]
    assert below.message.startswith("leg 2: landing fuel 5.8 usgal is below the reserve of 8.0 usgal by 2.2")
    dropped = load_check_inputs(path, allow_trip=True, legs=leg_assignments("--leg-burn", ["2:trip=5", "2:reserve=0"]))
    assert dropped.trip is not None
    assert not any("below the reserve" in f.message for f in check_trip(dropped.aircraft, dropped.trip).findings)


def test_regression_a_legs_own_reserve_won_over_the_command_line_reserve_without_a_word(tmp_path):
    """A final review: ``check trip_drop_off.toml --reserve 6`` checked leg 2 against the file's own
    ``reserve = 4`` and said nothing, so the pilot believed both landings held 6 US gal. The leg's own
    reserve is used (the file says so for that leg) and a note says which reserve each leg is held to;
    where both are the same, or the leg's reserve is typed beside it (``--leg-burn 2:reserve=...``),
    nothing is said (common practice: the pilot's stated reserve governs each landing)."""
    from loadcheck.loading import leg_assignments

    path = sample("heli2/trip_drop_off.toml")
    inputs = load_check_inputs(path, allow_trip=True, burn={"reserve": "6"})
    assert inputs.trip is not None and [leg.reserve for leg in inputs.trip.legs] == [6.0, 4.0]
    said = (
        "not the reserve given over the file ({}), which is leg 1's: a leg keeps the reserve of the leg before it "
        "unless it gives its own"
    )
    assert inputs.notes == ["leg 2: held to a reserve of 4.0 usgal, " + said.format(6)]
    assert not load_check_inputs(path, allow_trip=True, burn={"reserve": "4"}).notes
    typed = load_check_inputs(
        path, allow_trip=True, burn={"reserve": "6"}, legs=leg_assignments("--leg-burn", ["2:reserve=5"])
    )
    assert typed.trip is not None and typed.trip.legs[1].reserve == 5.0 and not typed.notes
    # a review: three legs, only the middle one giving a reserve: leg 3 keeps leg 2's (10), and says so
    data = read_toml(path)
    data["leg"] = [
        {**data["leg"][0], "burn": {"taxi": 0.5, "trip": 5, "reserve": 10}},
        {"burn": {"taxi": 0.5, "trip": 3}},
    ]
    three = tmp_path / "three.toml"
    three.write_text(tomlkit.dumps({**data, "aircraft": str(Path(path).parent / "aircraft.toml")}))
    held = load_check_inputs(three, allow_trip=True, burn={"reserve": "2"})
    assert held.trip is not None and [leg.reserve for leg in held.trip.legs] == [2.0, 10.0, 10.0]
    assert held.notes == [f"leg {n}: held to a reserve of 10.0 usgal, " + said.format(2) for n in (2, 3)]


def test_regression_plan_stop_said_each_leg_lands_with_its_reserve_where_none_was_given():
    """An outside trial: ``plan stop`` said "the least that keeps every leg within limits and lands each
    with its reserve" for a trip that gave no reserve (its sheet said "Reserve none given"). The reserve
    clause is said where some leg gives one, and only there (common practice: say no limit not set)."""
    from loadcheck.loading import leg_assignments

    path = sample("heli2/trip_drop_off.toml")  # reserve = 4 on both legs
    given = load_check_inputs(path, allow_trip=True)
    assert given.trip is not None and fuel_to_add(given.aircraft, given.trip, 2).reserves
    dropped = load_check_inputs(
        path, allow_trip=True, burn={"reserve": "0"}, legs=leg_assignments("--leg-burn", ["2:reserve=0"])
    )
    assert dropped.trip is not None and not any(leg.reserve for leg in dropped.trip.legs)  # 0: none to land with
    assert not fuel_to_add(dropped.aircraft, dropped.trip, 2).reserves


# -- what changes at a stop: the fuel put in and the load changed (trial 10, finding 6) ------------
# Hand-worked on sample_aircraft/heli2/trip_drop_off.toml with sample_aircraft/heli2/aircraft.toml:
# leg 1 starts full (32.0 usgal usable), burns taxi 0.5 + trip 11 = 11.5 usgal and lands with
# 20.5 usgal; leg 2 puts in 5 usgal of avgas at 6.0 lb/usgal (DESIGN.md's default density,
# common practice) = 30.0 lb, so the tank holds 25.5 usgal; the left seat goes from 170 to 0 lb
# and the left side locker from 15 to 0 lb. Filling up to "full" instead puts in 32.0 - 20.5 =
# 11.5 usgal = 69.0 lb.

_DROP_OFF_STOP = {
    "fuel": [
        {"tank": "main", "name": "Saddle tank (left)", "volume": 5.0, "weight": 30.0, "on_board": 25.5, "given": 5.0}
    ],
    "stations": [
        {"station": "left", "name": "Left seat", "from_weight": 170.0, "to_weight": 0.0},
        {"station": "bag_left", "name": "Left side locker", "from_weight": 15.0, "to_weight": 0.0},
    ],
}


def _same(got, expected) -> bool:
    """Nested dictionaries and lists equal, floats within 1e-9 (the figures are exact sums of
    exact inputs, so only floating-point noise is allowed)."""
    if isinstance(expected, dict):
        return isinstance(got, dict) and got.keys() == expected.keys() and all(_same(got[k], expected[k]) for k in got)
    if isinstance(expected, list):
        return isinstance(got, list) and len(got) == len(expected) and all(map(_same, got, expected))
    if isinstance(expected, float):
        return got == pytest.approx(expected, abs=1e-9)
    return bool(got == expected)


def _drop_off(tmp_path, add_fuel: str | None = None):
    text = sample("heli2/trip_drop_off.toml").read_text()
    if add_fuel is not None:
        text = text.replace("add_fuel = { main = 5 }", f"add_fuel = {{ main = {add_fuel} }}")
        assert add_fuel in text
    path = tmp_path / "trip.toml"
    path.write_text(text.replace('aircraft = "aircraft.toml"', f'aircraft = "{sample("heli2/aircraft.toml")}"'))
    return path


def test_each_leg_after_the_first_carries_the_fuel_put_in_and_the_load_changed_at_its_stop(tmp_path):
    inputs = load_check_inputs(_drop_off(tmp_path), allow_trip=True)
    assert inputs.trip is not None
    result = check_trip(inputs.aircraft, inputs.trip)
    assert result.legs[0].stop is None
    stop = result.legs[1].stop
    assert stop is not None and _same(stop.to_dict(), _DROP_OFF_STOP)
    # the uplift agrees with the check's own fuel: leg 2's start is leg 1's landing plus the uplift
    landed = result.legs[0].check.condition("landing").fuel
    assert result.legs[1].check.condition("ramp").fuel == pytest.approx(landed + stop.fuel[0].volume)


def test_a_fill_to_full_at_a_stop_is_said_as_given_and_as_the_volume_that_goes_in(runner, tmp_path):
    result = runner.invoke(app, ["check", str(_drop_off(tmp_path, '"full"')), "--json"])
    assert result.exit_code in (0, 1), result.output
    leg2 = json.loads(result.output)["legs"][1]
    full = {"tank": "main", "name": "Saddle tank (left)", "volume": 11.5, "weight": 69.0, "on_board": 32.0}
    assert leg2["stop"]["fuel"] == [{**full, "given": "full"}]
    assert "stop" not in json.loads(result.output)["legs"][0]
    text = runner.invoke(app, ["check", str(_drop_off(tmp_path, '"full"'))]).output
    assert 'Saddle tank (left): 11.5 usgal put in (69.0 lb), as given "full", 32.0 usgal on board after' in " ".join(
        text.split()
    )


def test_the_trips_json_text_and_sheet_state_the_stop(runner, tmp_path):
    trip = str(sample("heli2/trip_drop_off.toml"))
    data = json.loads(runner.invoke(app, ["check", trip, "--json"]).output)
    assert _same(data["legs"][1]["stop"], _DROP_OFF_STOP)
    text = " ".join(runner.invoke(app, ["check", trip]).output.split())
    assert "fuel put in at the stop: Saddle tank (left): 5.0 usgal put in (30.0 lb), 25.5 usgal on board after" in text
    assert "load changed at the stop: Left seat: from 170.0 lb to 0.0 lb; Left side locker: from 15.0 lb to 0.0 lb" in (
        text
    )
    sheet = tmp_path / "trip.html"
    assert runner.invoke(app, ["check", trip, "--sheet", str(sheet)]).exit_code == 0
    html = sheet.read_text()

    def table(tag_id: str) -> str:
        start = html.index(f"id='{tag_id}'")
        return " ".join(re.sub(r"<[^>]+>", " ", html[start : html.index("</table>", start)]).split())

    assert "Saddle tank (left) 5 usgal 5.0 30.0 25.5" in table("stop-fuel-2")
    assert "Left seat 170.0 0.0" in table("stop-load-2") and "Left side locker 15.0 0.0" in table("stop-load-2")
    assert "id='stop-fuel-1'" not in html


def test_a_planned_stop_carries_the_fuel_the_answer_puts_in(tmp_path):
    inputs = load_check_inputs(_drop_off(tmp_path), allow_trip=True)
    assert inputs.given is not None
    plan = fuel_to_add(inputs.aircraft, inputs.given, 2)
    assert plan.trip is not None
    stop = plan.trip.legs[1].stop
    assert stop is not None
    (uplift,) = stop.fuel
    # the answer is the most that may be put in: the volume going in is the answer, chosen, not given
    assert uplift.given is None
    assert uplift.volume == pytest.approx(plan.answer, abs=0.05)
    assert uplift.on_board == pytest.approx(20.5 + uplift.volume)


def test_fuel_put_in_as_a_mass_or_a_typed_number_is_said_as_given(runner):
    # 30 lb of avgas at 6.0 lb/usgal (common practice) is 5.0 usgal; "5" typed on the command line
    # is the number 5 in the fuel volume unit, as 5 in the file is
    trip = str(sample("heli2/trip_drop_off.toml"))
    for typed, as_given in (("30 lb", "30 lb"), ("5", 5.0)):
        out = runner.invoke(app, ["check", trip, "--leg-fuel", f"2:main={typed}", "--json"]).output
        (uplift,) = json.loads(out)["legs"][1]["stop"]["fuel"]
        assert uplift["given"] == as_given and uplift["volume"] == pytest.approx(5.0, abs=1e-9)


def test_a_trips_no_fuel_reason_for_a_station_over_its_maximum_is_that_limit_alone():
    # a review: "with this load and these legs, at 19.2 usgal of ramp fuel: leg 1: Left side locker: 60.0 lb
    # exceeds the maximum 35.0 lb" named a ramp fuel for a limit no fuel changes; as for a single leg
    # (docs/planning.md), a station or group over its own limit is the one reason given
    from loadcheck.files import load_check_inputs

    inputs = load_check_inputs(sample("heli2/trip_drop_off.toml"), None, allow_trip=True, load={"bag_left": 60})
    assert inputs.trip is not None
    answer = trip_most_fuel(inputs.aircraft, inputs.trip)
    assert not answer.feasible
    assert answer.governing == "leg 1: Left side locker: 60.0 lb exceeds the maximum 35.0 lb by 25.0 lb"


# -- trial 13 D3: a trip's verdict carries the warnings of each leg and of the trip -----------------
#
# A trip of TEST-T (tests/helpers.TRIP_AIRCRAFT, limits invented) within limits on both legs, each
# landing below its reserve (a warning, not a limit: docs/file-format.md and DESIGN.md "landing fuel
# against a reserve ... a warning"). Worked by hand with the moment method of FAA-H-8083-1B (2016)
# ch. 2 (avgas 6.0 lb/US gal, common practice):
#   leg 1: pilot 180 lb at 70 in, 30 gal (180 lb) at 90 in: ramp 1,360 lb, 108,800 lb-in, CG 80.00 in;
#     lands with 30 - 1 - 10 = 19 gal, 1 gal below its reserve of 20 gal: 1 warning;
#   stop: a passenger boards the front seats (180 -> 340 lb), the tank filled "full": 40 - 19 = 21 gal
#     (126 lb) put in, 40 gal on board;
#   leg 2: ramp 1,000 + 340 + 240 = 1,580 lb, 80,000 + 23,800 + 21,600 = 125,400 lb-in, CG 79.37 in;
#     lands with 40 - 1 - 20 = 19 gal, 1 gal below its reserve of 20 gal: 1 warning;
#   zero fuel 1,180 lb at 78.47 in (leg 1) and 1,340 lb at 77.46 in (leg 2): inside 74 to 86 in.
# So: within limits on every leg, 1 warning on each leg, 2 warnings in all.
WARNED_TRIP = """format = 1
aircraft = "aircraft.toml"
[load]
front = 180
[fuel]
main = 30
[burn]
taxi = 1
trip = 10
reserve = 20
[[leg]]
label = "two up"
load = { front = 340 }
add_fuel = { main = "full" }
burn = { taxi = 1, trip = 20, reserve = 20 }
"""


def warned_trip(tmp_path: Path) -> Path:
    """TEST-T and WARNED_TRIP written into ``tmp_path``; the loading file's path."""
    folder = trip_fleet(tmp_path / "fleet")
    (folder / "warned_trip.toml").write_text(WARNED_TRIP)
    return folder / "warned_trip.toml"


def test_regression_a_trips_verdict_dropped_the_warnings_of_its_legs(tmp_path):
    """Trial 13 D3: the trip's verdict said "every condition, burn path and limit holds" over a leg
    landing below its reserve; it now says each leg's warnings and the trip's, in the single
    check's words (loadcheck.words.within_limits_text)."""
    from loadcheck.trip import leg_verdict_text, trip_verdict_text
    from loadcheck.words import within_limits_text

    inputs = load_check_inputs(warned_trip(tmp_path), allow_trip=True)
    result = check_trip(inputs.aircraft, inputs.trip)
    one, two = result.legs
    assert result.ok and one.check.ok and two.check.ok  # within limits: a reserve is a warning
    assert one.check.condition("ramp").moment == pytest.approx(108800)  # by hand above
    assert two.check.condition("ramp").weight == pytest.approx(1580)
    assert two.check.condition("ramp").moment == pytest.approx(125400)
    for leg in (one, two):
        assert [(f.code, f.severity) for f in leg.check.findings] == [("reserve", "warning")]
        assert leg.check.condition("landing").fuel == pytest.approx(19.0)
        assert leg_verdict_text(leg.check) == within_limits_text(1)
    assert "; 1 warning (see the findings)." in leg_verdict_text(one.check)
    assert trip_verdict_text(result) == f"on every leg (2 legs): {within_limits_text(2)}"
    assert "2 warnings (see the findings)" in trip_verdict_text(result)
