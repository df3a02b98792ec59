"""The pilot's commands (loadcheck/cli/pilot.py) through typer's CliRunner: check (exit codes,
JSON fields, options, the check log), validate, schema, plan. The trip's legs on the command
line are in tests/test_trip.py, the terminal's layout in tests/test_terminal_width.py."""

from __future__ import annotations

import json
from pathlib import Path

import pytest

from loadcheck.caution import PILOT_CAUTION
from loadcheck.cli import app

from .helpers import assert_input_error, invoke, logged_checks, sample, write_file

TRAINER = str(sample("trainer4/aircraft.toml"))
WITHIN = str(sample("trainer4/within.toml"))


def test_check_within_limits_prints_tables_and_caution():
    result = invoke("check", TRAINER, str(sample("trainer4/within.toml")))
    assert result.exit_code == 0, result.output
    assert "WITHIN LIMITS" in result.output
    assert "2,423.9" in result.output  # takeoff weight
    assert "CAUTION" in result.output and "pilot in command" in result.output


def test_loading_file_alone_names_its_aircraft():
    result = invoke("check", str(sample("twin6/leaves_path.toml")))
    assert result.exit_code == 1
    assert "leaves the normal-category envelope" in result.output


def test_json_fields_follow_design():
    result = invoke("check", str(sample("twin6/leaves_path.toml")), "--json")
    assert result.exit_code == 1
    data = json.loads(result.stdout)
    assert set(data) >= {"ok", "category", "items", "conditions", "burn_path", "findings", "units", "caution"}
    assert data["ok"] is False and data["category"] == "normal"
    assert {"name", "weight", "arm", "moment"} <= set(data["items"][0])
    assert [c["condition"] for c in data["conditions"]] == ["ramp", "takeoff", "landing", "zero_fuel"]
    for condition in data["conditions"]:
        assert {"condition", "weight", "arm", "moment", "mac_percent", "ok"} <= set(condition)
    leave = data["burn_path"]["leaves_at"]
    assert data["burn_path"]["ok"] is False
    assert {"fuel_burned", "fuel_remaining", "weight", "arm"} <= set(leave)
    assert {"code", "severity", "message"} <= set(data["findings"][0])
    assert data["units"]["mass"] == "lb"
    assert data["caution"] == PILOT_CAUTION


def test_options_alone_and_on_top_of_a_file():
    result = invoke(
        "check",
        TRAINER,
        "--load",
        "front=340",
        "--load",
        "rear=150",
        "--fuel",
        "mains=school",
        "--taxi",
        "1.2",
        "--trip",
        "18",
        "--json",
    )
    assert result.exit_code == 0, result.output
    data = json.loads(result.stdout)
    assert data["conditions"][0]["fuel"] == 30.0
    over = invoke("check", TRAINER, str(sample("trainer4/within.toml")), "--load", "rear=400", "--json")
    assert over.exit_code == 1
    assert any(f["code"] == "max_takeoff_weight" for f in json.loads(over.stdout)["findings"])


def test_category_option():
    result = invoke("check", TRAINER, str(sample("trainer4/utility_aft.toml")), "--category", "normal", "--json")
    assert result.exit_code == 0
    assert json.loads(result.stdout)["category"] == "normal"


def test_trip_time_rate_order_reserve_options():
    result = invoke(
        "check",
        str(sample("twin6/aircraft.toml")),
        "--load",
        "row1=380",
        "--fuel",
        "mains=full",
        "--fuel",
        "aux=40",
        "--trip-time",
        "1:30",
        "--rate",
        "30",
        "--order",
        "aux,mains",
        "--reserve",
        "100",
        "--json",
    )
    data = json.loads(result.stdout)
    assert result.exit_code == 0
    assert data["conditions"][2]["fuel"] == pytest.approx(95.0)
    assert any(f["code"] == "reserve" for f in data["findings"])


def test_validate_reports_everything(tmp_path):
    text = Path(TRAINER).read_text().replace("weight = 1718.0", "weight = -1").replace("usable = 44.0", "usable = 0")
    bad = write_file(tmp_path, text)
    result = invoke("validate", TRAINER, str(sample("twin6/within.toml")), bad)
    assert result.exit_code == 2
    assert "empty.weight" in result.output and "tank[0].usable" in result.output
    assert "ok: " in result.output


def test_validate_all_samples():
    files = sorted(str(p) for p in sample("").glob("*/*.toml"))
    result = invoke("validate", *files)
    assert result.exit_code == 0, result.output


# -- validate on the mechanic's files (trial 9, item 3): "ok" means weigh or alter accepts the file ---------


def _named(tmp_path: Path, name: str, aircraft: str, old: str = "", new: str = "") -> str:
    """The trainer's sample readings or changes file naming ``aircraft`` (an absolute path)."""
    text = sample(f"trainer4/{name}").read_text().replace('aircraft = "aircraft.toml"', f'aircraft = "{aircraft}"')
    return write_file(tmp_path, text.replace(old, new), name)


def test_regression_validate_said_ok_for_readings_weigh_refuses_for_their_aircraft(tmp_path):
    # the rotorcraft has a lateral envelope, and the trainer's readings give no lateral arm
    readings = _named(tmp_path, "weighing.toml", str(sample("heli2/aircraft.toml")))
    result = invoke("validate", readings)
    assert_input_error(result, "weighing.toml: point:", "lateral_arm")
    assert "ok:" not in result.output
    weigh = invoke("weigh", str(sample("heli2/aircraft.toml")), readings)
    assert_input_error(weigh, "lateral_arm")


def test_regression_validate_said_ok_for_changes_alter_refuses_for_their_aircraft(tmp_path):
    changes = _named(tmp_path, "changes.toml", str(sample("heli2/aircraft.toml")))
    result = invoke("validate", changes)
    assert_input_error(result, "change[0].lateral_arm", "change[1].item", "'fairings'")
    assert "ok:" not in result.output


def test_validate_says_why_the_new_record_would_not_be_written(tmp_path):
    # 400 lb more on the nose scale: more than 10 % off the current record (docs/mechanic.md; common practice)
    readings = _named(tmp_path, "weighing.toml", TRAINER, "reading = 541.0", "reading = 941.0")
    result = invoke("validate", readings)
    assert result.exit_code == 0, result.output
    text = " ".join(result.output.split())
    assert "ok: " in text and "readings for" in text
    assert "WARNING: the new record would not be written without an override: the new empty weight" in text
    assert Path(TRAINER).read_text() == sample("trainer4/aircraft.toml").read_text()  # nothing written


def test_regression_validate_said_ok_for_readings_whose_record_could_never_be_written(tmp_path):
    """A review: readings dated 2099 were "ok" with a warning and exit 0, while ``weigh --write --yes``
    refuses them outright (a record is never written with a date after today; 14 CFR 43.9 (a)(2), from
    memory: the record carries the date the work was done). A reason no override lifts makes the file
    fail validate; an overridable one stays a warning (the test above)."""
    aircraft = write_file(tmp_path, Path(TRAINER).read_text(), "aircraft.toml")  # a copy: weigh may write
    readings = _named(tmp_path, "weighing.toml", aircraft, "date = 2026-", "date = 2099-")
    assert "date = 2099-" in Path(readings).read_text()
    result = invoke("validate", readings)
    assert_input_error(result, "date: the new record could never be written", "has not come yet")
    assert "ok:" not in result.output
    assert_input_error(invoke("weigh", aircraft, readings, "--write", "--yes"), "has not come yet")
    assert Path(aircraft).read_text() == Path(TRAINER).read_text()


def test_validate_ends_with_the_caution_of_each_kind_of_file_once(tmp_path):
    from loadcheck.caution import MECHANIC_CAUTION

    def said(result, caution):
        return " ".join(result.output.split()).count(caution)

    mechanic = invoke("validate", str(sample("trainer4/weighing.toml")), str(sample("trainer4/changes.toml")))
    assert mechanic.exit_code == 0 and said(mechanic, MECHANIC_CAUTION) == 1 and said(mechanic, PILOT_CAUTION) == 0
    both = invoke("validate", TRAINER, str(sample("trainer4/weighing.toml")), str(sample("trainer4/within.toml")))
    assert both.exit_code == 0 and said(both, MECHANIC_CAUTION) == 1 and said(both, PILOT_CAUTION) == 1
    refused = invoke("validate", _named(tmp_path, "changes.toml", str(sample("heli2/aircraft.toml"))))
    assert refused.exit_code == 2 and said(refused, MECHANIC_CAUTION) == 1 and said(refused, PILOT_CAUTION) == 0


def test_schema_is_json_schema():
    result = invoke("schema")
    data = json.loads(result.stdout)
    assert data["aircraft"]["title"] == "Aircraft" and "envelope" in data["aircraft"]["properties"]
    assert json.loads(invoke("schema", "loading").stdout)["title"] == "Loading"


def test_check_records_in_the_check_log_only_with_log(runner, tmp_path, monkeypatch):
    monkeypatch.delenv("LOADCHECK_LOG", raising=False)
    db = tmp_path / "log.sqlite3"
    assert runner.invoke(app, ["check", TRAINER, WITHIN]).exit_code == 0
    assert not db.exists()
    logged = runner.invoke(app, ["check", TRAINER, WITHIN, "--log", "--db", str(db)])
    assert logged.exit_code == 0, logged.output
    assert logged_checks(db) == 1
    listed = runner.invoke(app, ["log", "list", "--db", str(db)])
    assert listed.exit_code == 0 and "DEMO-4T" in listed.output


def test_check_db_without_log_is_refused_not_ignored(runner, tmp_path):
    db = tmp_path / "log.sqlite3"
    result = runner.invoke(app, ["check", TRAINER, WITHIN, "--db", str(db)])
    assert_input_error(result, "--db", "--log")
    assert not db.exists()


def test_check_log_without_db_uses_loadcheck_log(runner, tmp_path, monkeypatch):
    db = tmp_path / "env.sqlite3"
    monkeypatch.setenv("LOADCHECK_LOG", str(db))
    assert runner.invoke(app, ["check", TRAINER, WITHIN, "--log"]).exit_code == 0
    assert logged_checks(db) == 1


def test_meto_power_under_its_old_key_is_refused_with_the_new_key(runner, tmp_path):
    text = (
        Path(TRAINER).read_text(encoding="utf-8").replace("meto_power_hp", "max_continuous_power_hp")
    )  # rename.py: keep
    path = tmp_path / "aircraft.toml"
    path.write_text(text, encoding="utf-8")
    result = runner.invoke(app, ["validate", str(path)])
    assert_input_error(result, "max_continuous_power_hp", "meto_power_hp")  # rename.py: keep


def test_plan_stop_of_a_loading_of_one_leg_was_an_internal_error(runner):
    # regression (found typing the front end, issue 21): plan stop on a loading without [[leg]] tables passed
    # no trip on and ended in "internal error (AttributeError ...)" instead of a field error
    result = runner.invoke(app, ["plan", "stop", TRAINER, WITHIN, "--leg", "2"])
    assert_input_error(result, "leg", "one leg")
    assert "internal error" not in result.output


def test_plan_trip_reserve_default_replaced_the_loading_s_reserve(runner):
    # regression (outside review): --reserve defaulted to 0 and silently replaced the file's reserve = 8, so the
    # longest trip landed with "at least 0 usgal"; fail closed: the file's value is used unless --reserve is given
    file = str(sample("trainer4/within.toml"))  # [burn] reserve = 8, taxi = 1.2
    plain = json.loads(runner.invoke(app, ["plan", "trip", file, "--rate", "9", "--json"]).stdout)
    assert "landing with at least 8.0 usgal (the loading's reserve)" in plain["question"]
    assert plain["extra"]["reserve"] == "8.0 usgal (the loading's reserve)"
    landing = next(c for c in plain["check"]["conditions"] if c["condition"] == "landing")
    assert landing["fuel"] >= 8.0 - 1e-6  # the check at the figure shown lands with the reserve
    assert not any(f["code"] == "reserve" for f in plain["check"]["findings"])
    asked = json.loads(runner.invoke(app, ["plan", "trip", file, "--rate", "9", "--reserve", "5", "--json"]).stdout)
    assert asked["extra"]["reserve"] == "5.0 usgal (the reserve asked for)"
    # 3 usgal less reserve is 3 usgal more trip fuel from the same ramp fuel (rounded down to 0.1 usgal)
    assert asked["answer"] - plain["answer"] == pytest.approx(3.0, abs=0.11)
    words = runner.invoke(app, ["plan", "trip", file, "--rate", "9"]).stdout
    assert "(the loading's reserve)" in words and "at least 0 " not in words


# The rule behind these (DESIGN.md, "Fail closed"; RULES.md): a refused value is named by the option as the
# user typed it, with its value, never by the library job's parameter.
@pytest.mark.parametrize(
    ("args", "named"),
    [
        (["plan", "payload", WITHIN, "--station", "aft_bag"], "--station aft_bag: unknown station 'aft_bag'"),
        (["plan", "table", WITHIN, "--station", "aft_bag"], "--station aft_bag: unknown station 'aft_bag'"),
        (["plan", "leave", WITHIN, "--station", "aft_bag", "--payload", "10"], "--station aft_bag: unknown"),
        (["plan", "ballast", str(sample("tandem2/aft_heavy.toml")), "--station", "aft_bag"], "--station aft_bag:"),
        (["plan", "ballast", WITHIN], "--station: this aircraft declares no ballast station"),
        (
            ["plan", "shift", str(sample("tandem2/aft_heavy.toml")), "--from", "aft_bag", "--to", "front"],
            "--from aft_bag:",
        ),
        (["plan", "shift", str(sample("tandem2/aft_heavy.toml")), "--from", "baggage", "--to", "fornt"], "--to fornt:"),
        (["plan", "fuel", WITHIN, "--fill", "aux"], "--fill aux: unknown tank(s) aux"),
        (["plan", "trip", WITHIN, "--rate", "-3"], "--rate -3: must be above zero"),
        (["plan", "trip", WITHIN, "--rate", "9", "--reserve", "-1"], "--reserve -1: must not be negative"),
        (["plan", "stop", str(sample("heli2/trip_drop_off.toml")), "--leg", "7"], "--leg 7: the trip has 2 legs"),
    ],
)
def test_regression_plan_refusals_name_the_option_as_typed(args, named):
    result = invoke(*args)
    assert_input_error(result, named)
    for field in ("error: station:", "error: fill:", "error: rate:", "error: reserve:", "error: leg:", "error: to:"):
        assert field not in result.output


def test_regression_trip_most_fuel_is_limited_by_the_legs_limits_with_amounts():
    """plan fuel on a trip said "limited by: leg 1: maximum ramp weight" (a name, no amount); with no
    amount within limits it now quotes the check's finding sentences, each with its leg: of the trip at
    the ramp fuels the answer tries (trial 11), here the least that covers the burn and full tanks, the
    file's own fuel (``main = "full"``: 32 US gal)."""
    trip = str(sample("heli2/trip_drop_off.toml"))
    heavy = ["--load", "left=250", "--load", "right=250", "--load", "bag_left=35", "--load", "bag_right=35"]
    none_fits = invoke("plan", "fuel", trip, *heavy, "--json")
    assert none_fits.exit_code == 1, none_fits.output
    governing = json.loads(none_fits.stdout)["governing"]
    checked = json.loads(invoke("check", trip, *heavy, "--json").stdout)
    sentences = [f["message"] for f in checked["findings"] if f["severity"] == "limit"]
    assert governing.startswith("with this load and these legs, at ") and "of ramp fuel: leg 1: " in governing
    assert governing.endswith("; at 32.0 usgal: " + "; ".join(sentences)), governing
    stops = invoke("plan", "fuel", trip, "--load", "left=240", "--load", "right=240", "--json")
    assert stops.exit_code == 0, stops.output
    # heli2/aircraft.toml: max_takeoff_weight = 1620 (the ramp weight defaults to it)
    assert json.loads(stops.stdout)["governing"].startswith("leg 1: maximum ramp weight 1,620.0 lb")


def test_regression_a_leg_added_on_the_command_line_took_taxi_zero_without_a_word(runner):
    """--leg-burn 3:trip=5 on a trip of two legs adds leg 3 with its trip only: its taxi is then 0
    (as for any burn without taxi), and the check says so beside the leg instead of silently."""
    path = str(sample("heli2/trip_drop_off.toml"))
    result = runner.invoke(app, ["check", path, "--leg-burn", "3:trip=5", "--json"])
    legs = json.loads(result.stdout)["legs"]
    added = [f["message"] for f in legs[2]["findings"] if f["code"] == "assumption"]
    assert "no taxi fuel given; takeoff is checked at the engine-start fuel" in added
    given = [f["message"] for f in legs[1]["findings"] if f["code"] == "assumption"]
    assert not any("taxi" in note for note in given)  # leg 2 gives its taxi


@pytest.mark.parametrize(
    "option, words",
    [
        (["--rate", "9"], "--rate 9: a fuel rate is used only with a trip time"),
        (["--trip-time", "1:30"], "--trip-time 1:30: a trip time needs a fuel rate"),
    ],
)
def test_regression_a_rate_or_trip_time_alone_was_refused_in_the_files_field_names(runner, option, words):
    """'--rate 9: rate is used only with trip_time' named a file field after the option the user typed."""
    result = runner.invoke(app, ["check", str(sample("trainer4/within.toml")), *option])
    assert result.exit_code == 2 and words in " ".join(result.output.split())
    assert "trip_time" not in result.output


@pytest.mark.parametrize(
    "option",
    [["--order", "aux,,mains"], ["--order", "mains,"], ["--leg-burn", "2:order=aux,,mains"]],
)
def test_regression_an_empty_entry_in_a_list_of_tanks_was_dropped(runner, option):
    """--order aft,,wing was read as aft,wing: an entry typed empty is refused, never dropped."""
    path = "twin6/within.toml" if option[0] == "--order" else "heli2/trip_drop_off.toml"
    result = runner.invoke(app, ["check", str(sample(path)), *option])
    assert result.exit_code == 2 and "the list of tanks has an empty entry" in result.output
    assert runner.invoke(app, ["check", str(sample("twin6/within.toml")), "--order", "aux, mains"]).exit_code in (0, 1)


HELI2 = str(sample("heli2/aircraft.toml"))


def test_regression_plan_shift_between_seats_side_by_side_was_refused_as_moving_nothing(runner, tmp_path):
    """An outside trial: plan shift --from left --to right on heli2 (seats side by side, arm 74 in,
    lateral arms -13 and +13 in) exited 2 with "moving weight does not move the CG"; the lateral CG moves.

    The loading (invented, written here): 230 lb in the left seat, 32 usgal of avgas (192 lb) in the
    tank at lateral arm -11.5 in, empty 962 lb at lateral arm +0.4 in (heli2/aircraft.toml). At engine
    start 1,384 lb, lateral moment 384.8 - 2,990 - 2,208 = -4,813.2 lb-in, lateral CG -3.4777 in; the left
    limit at 1,384 lb is -3.0 + 0.8 x 34 / 270 = -2.8993 in. Weight moved = total weight x CG change /
    distance moved (FAA-H-8083-1B chapter 2, weight shift, from memory) = 1,384 x 0.5785 / 26 = 30.79 lb,
    shown rounded up (30.8 lb)."""
    loading = write_file(
        tmp_path,
        'format = 1\n[load]\nleft = 230\n[fuel]\nmain = "full"\n[burn]\ntaxi = 0.5\ntrip = 20\n',
        "left_heavy.toml",
    )
    args = ["plan", "shift", HELI2, loading, "--from", "left", "--to", "right"]
    text = runner.invoke(app, args, env={"COLUMNS": "200"})
    assert text.exit_code == 0, text.output
    assert "weight moved: 30.8 lb" in text.output
    assert "the move moves: the lateral CG only: both stations are at arm 74.00 in" in text.output
    assert "does not move the CG" not in text.output and "WITHIN LIMITS" in text.output
    answer = json.loads(runner.invoke(app, [*args, "--json"]).stdout)
    assert answer["feasible"] and answer["check"]["ok"]
    assert answer["answer"] == pytest.approx(1384 * (-3.0 + 0.8 * 34 / 270 + 4813.2 / 1384) / 26, abs=0.1)


def test_plan_shift_that_fixes_the_lateral_cg_only_past_a_lockers_maximum_says_so_and_exits_1(runner, tmp_path):
    """heli2's lockers side by side (arm 112 in, lateral arms -19 and +19 in, maximum 35 lb each): 245 lb in
    the left seat, 35 lb in the left locker, 30 lb in the right one, full fuel. At engine start 1,464 lb,
    lateral moment 384.8 - 3,185 - 665 + 570 - 2,208 = -5,103.2 lb-in, lateral CG -3.4858 in; the left limit
    at 1,464 lb is -3.0 + 0.8 x 114 / 270 = -2.6622 in, so 1,464 x 0.8236 / 38 = 31.73 lb must move
    (FAA-H-8083-1B chapter 2, weight shift, from memory), but the right locker takes 5 lb more: no amount
    can (exit 1), and the answer says what each amount exceeds (the search's grid is 0.05 lb, its ends
    rounded inward: from 31.75 lb, "31.8", only the locker's maximum)."""
    loading = write_file(
        tmp_path,
        'format = 1\n[load]\nleft = 245\nbag_left = 35\nbag_right = 30\n[fuel]\nmain = "full"\n'
        "[burn]\ntaxi = 0.5\ntrip = 20\n",
        "lockers.toml",
    )
    args = ["plan", "shift", HELI2, loading, "--from", "bag_left", "--to", "bag_right", "--json"]
    result = runner.invoke(app, args)
    assert result.exit_code == 1, result.output
    answer = json.loads(result.stdout)
    assert not answer["feasible"] and "answer" not in answer  # no figure proposed
    assert answer["governing"].startswith("moving 0.0 to 5.0 lb: left limit at ramp -2.66 in")
    assert answer["governing"].endswith("Moving 31.8 to 35.0 lb: maximum of bag_right 35.0 lb")
    assert answer["extra"]["the move moves"].startswith("the lateral CG only")


def test_regression_plan_trip_refused_a_reserve_given_as_a_mass(runner):
    """An outside trial: ``plan trip --reserve "5 kg"`` was refused ("cannot convert kg (mass) to usgal")
    while ``check --reserve "5 kg"`` takes it: one rule now reads both, the loading's (a mass is turned
    into fuel at the tanks' density). Worked by hand: 5 kg / 0.45359237 kg/lb (NIST SP 811 appendix B.8)
    = 11.02 lb, at avgas 6.0 lb/US gal (common practice) 1.84 US gal."""
    path = str(sample("trainer4/within.toml"))
    said = runner.invoke(app, ["plan", "trip", path, "--rate", "8", "--reserve", "5 kg", "--json"])
    assert said.exit_code == 0, said.output
    assert json.loads(said.stdout)["extra"]["reserve"] == "1.8 usgal (the reserve asked for)"


def test_regression_plan_trip_s_check_had_one_finding_more_than_check_of_its_loading(tmp_path):
    """Trial 11, finding 7: ``plan trip`` carried "no trip fuel given" beside the 498.6 l trip it checked, so its
    words, JSON and findings differed from ``check`` of the same loading with that trip; and "reserve landed
    with: 45.0 l" read as the landing fuel where it lands with 161.4 l (670 l full less taxi 10 and trip
    498.6, sums of FAA-H-8083-1B chapter 2). The check carried is now ``check``'s, finding for finding."""
    from .test_planning import _HAULER

    aircraft = write_file(tmp_path, _HAULER)
    common = ["-l", "crew=180", "-l", "cab1=300", "-l", "cab2=100", "--taxi", "10", "--order", "aft,fwd,wings"]
    planned = invoke("plan", "trip", aircraft, *common, "--rate", "120", "--reserve", "45", "--json")
    assert planned.exit_code == 0, planned.output
    answer = json.loads(planned.stdout)
    assert answer["answer_display"] == "498.6 l"
    assert answer["extra"]["lands with"] == "161.4 l"
    assert answer["extra"]["reserve"] == "45.0 l (the reserve asked for)"
    full = ["-f", "fwd=full", "-f", "wings=full", "-f", "aft=full"]
    checked = invoke("check", aircraft, *common, *full, "--trip", "498.6", "--reserve", "45", "--json")
    assert checked.exit_code == planned.exit_code == 0
    plain = json.loads(checked.stdout)
    assert answer["check"]["findings"] == plain["findings"] and len(plain["findings"]) == 1
    assert answer["check"]["conditions"] == plain["conditions"]
    words = invoke("plan", "trip", aircraft, *common, "--rate", "120", "--reserve", "45").output
    assert "no trip fuel given" not in words and "lands with: 161.4 l" in words
    assert "reserve: 45.0 l (the reserve asked for)" in words and "reserve landed with" not in words


@pytest.mark.parametrize(
    "options, words",
    [
        (
            ["--leg-load", "2:front=100"],
            "--leg-load 2:front=100: the loading has one leg, so it has no leg 2: a leg after the first is added "
            "only with its own burn (its taxi and trip fuel); expected --leg-burn 2:trip=AMOUNT (or a [[leg]] "
            "table in a loading file) as well",
        ),
        (
            ["--leg-burn", "3:trip=5"],
            "--leg-burn 3:trip=5: leg 3 skips leg 2: the loading has one leg; every leg is given in order, each "
            "after the first with its own burn (its taxi and trip fuel); expected --leg-burn 2:trip=AMOUNT (or a "
            "[[leg]] table in a loading file) first",
        ),
    ],
)
def test_regression_the_command_line_names_the_leg_burn_option_the_library_leaves_out(options, words):
    """The library's refusal of a leg without its burn named ``--leg-burn`` whatever the source (a
    file, the desk); it now names the leg's burn by its field, and the command line, where the leg
    option was typed, names the option to give instead."""
    result = invoke("check", str(sample("trainer4/within.toml")), *options)
    assert_input_error(result, words)
    assert "leg 2, burn" not in result.output


def test_regression_plan_ballast_says_the_box_total_as_docs_planning_shows_it():
    """docs/planning.md ("A station's whole weight"): with 5 kg already in tandem2's ballast box the answer
    read as a weight to add; it is the box's whole weight, the figure in the moment table of the loading
    checked, with what the loading has and what to add beside it."""
    result = invoke("plan", "ballast", str(sample("tandem2/aft_heavy.toml")), "--load", "ballast=5")
    assert result.exit_code == 0, result.output
    assert "total ballast: 14.5 kg (5.0 kg in the loading and 9.5 kg more)" in result.output
    row = next(line for line in result.output.splitlines() if line.startswith("│ Firewall ballast box"))
    assert row.split("│")[2].strip() == "14.5"
    doc = (Path(__file__).parents[1] / "docs" / "planning.md").read_text(encoding="utf-8")
    assert "total ballast: 14.5 kg (5.0 kg in the loading and 9.5 kg more)" in doc
