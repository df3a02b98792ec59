"""The mechanic's commands (loadcheck/cli/mechanic.py): weigh, alter and history (asking before
a write, --write and --yes, the record sheet, inputs refused with nothing written), extremes
and schedule (exit status, JSON, the mechanic's caution). The jobs behind them are tested
against AC 43.13-1B and FAA-H-8083-1B in tests/test_weighing.py, test_alterations.py,
test_empty_record.py, test_extremes.py and test_schedule.py."""

from __future__ import annotations

import json
import shlex

import pytest

import loadcheck.cli.mechanic as mechanic_cli
from loadcheck import load_aircraft
from loadcheck.caution import MECHANIC_CAUTION
from loadcheck.cli import app

from .helpers import assert_input_error, invoke, sample
from .test_empty_record import _trainer, _weigh

# -- weigh, alter, history -----------------------------------------------------------------------


@pytest.mark.parametrize("answer, written", [("n\n", False), ("y\n", True), ("\n", False)])
def test_at_a_terminal_the_old_and_new_record_are_shown_and_asked(runner, tmp_path, monkeypatch, answer, written):
    path = _trainer(tmp_path)
    before = path.read_bytes()
    monkeypatch.setattr(mechanic_cli, "_interactive", lambda: True)
    result = runner.invoke(app, ["weigh", str(path), str(tmp_path / "weighing.toml"), "--write"], input=answer)
    assert result.exit_code == 0, result.output
    assert "Current and new empty-weight record" in result.output
    assert (
        "1,718.0 lb" in result.output
        and "1,685.8 lb" in result.output
        and "Make this the current record" in result.output
    )
    assert "-32.2 lb" in next(line for line in result.output.splitlines() if "│ empty weight" in line)  # its change
    assert (path.read_bytes() != before) is written


def test_options_without_write_are_refused(tmp_path):
    path = _trainer(tmp_path)
    result = _weigh(path, tmp_path / "weighing.toml", "--yes")
    assert result.exit_code == 2 and "go with --write" in result.output


# -- item 5: a bounded history ------------------------------------------------------------------


def test_history_keeps_every_record_and_the_comments(runner, tmp_path):
    path = _trainer(tmp_path)
    original = load_aircraft(path)
    # in the order of their dates (weighed 2026-11-28, altered 2026-11-29): an earlier date needs --force
    assert runner.invoke(app, ["weigh", str(path), str(tmp_path / "weighing.toml"), "--write", "--yes"]).exit_code == 0
    weighed = load_aircraft(path)
    assert runner.invoke(app, ["alter", str(path), str(tmp_path / "changes.toml"), "--write", "--yes"]).exit_code == 0
    final = load_aircraft(path)
    assert [h.reason for h in final.history] == ["weighing", "alteration"]
    assert final.history[0].previous == original.empty
    assert final.history[1].previous == weighed.empty
    assert "fairings" not in {e.id for e in final.equipment} and "com3" in {e.id for e in final.equipment}
    text = path.read_text()
    assert "# Four-seat nosewheel trainer: an aircraft of our own invention" in text
    assert "meto_power_hp = 160   # maximum except takeoff" in text
    listing = runner.invoke(app, ["history", str(path)])
    assert listing.exit_code == 0 and "alteration" in listing.output and "weighing" in listing.output


def test_without_write_nothing_changes(runner, tmp_path):
    path = _trainer(tmp_path)
    before = path.read_bytes()
    assert runner.invoke(app, ["weigh", str(path), str(tmp_path / "weighing.toml")]).exit_code == 0
    assert path.read_bytes() == before


@pytest.mark.parametrize(
    "command, text, words",
    [
        (
            "weigh",
            "[[point]]\nlabel = 'nose'\narm = -6.8\nreading = 10.0\ntare = 12.0\n",
            "tare (12) is above the reading (10)",
        ),
        ("alter", "[[change]]\naction = 'remove'\nitem = 'ghost'\n", "unknown item 'ghost'"),
        ("alter", "[[change]]\naction = 'relocate'\nitem = 'elt'\n", "needs its new_arm"),
        ("weigh", "[[point]]\nlabel = 'nose'\nwheel = 'nose'\nreading = 10.0\n", "[geometry]"),
        ("alter", "[[change]]\naction = 'install'\nitem = 'elt'\nweight = 1.0\narm = 2.0\n", "already installed"),
    ],
)
def test_bad_mechanic_inputs_write_nothing(runner, tmp_path, command, text, words):
    path = _trainer(tmp_path)
    before = path.read_bytes()
    bad = tmp_path / "bad.toml"
    bad.write_text("format = 1\n" + text)
    result = runner.invoke(app, [command, str(path), str(bad), "--write", "--yes"])
    assert result.exit_code == 2, result.output
    assert words in result.output and "Traceback" not in result.output
    assert path.read_bytes() == before


def test_mechanic_sheet(runner, tmp_path):
    sheet = tmp_path / "record.html"
    result = runner.invoke(
        app,
        ["weigh", str(sample("trainer4/aircraft.toml")), str(sample("trainer4/weighing.toml")), "--sheet", str(sheet)],
    )
    assert result.exit_code == 0
    html = sheet.read_text()
    for words in ("Certificate number", "Signature", "local aviation authority", "Most forward", "1,685.8"):
        assert words in html
    assert "http" not in html.replace("http-equiv", "")


# -- extremes, schedule --------------------------------------------------------------------------


def test_extremes_command_exit_status_follows_the_checks(runner):
    result = runner.invoke(app, ["extremes", str(sample("tandem2/aircraft.toml"))])
    assert result.exit_code == 0 and "Most forward loading" in result.output and "within limits" in result.output
    failing = runner.invoke(app, ["extremes", str(sample("twin6/aircraft.toml"))])
    assert failing.exit_code == 1 and "NOT within limits" in failing.output


@pytest.mark.parametrize(
    "option, value, words",
    [
        ("--occupant", "0", "--occupant"),
        ("--occupant", "-5", "--occupant"),
        ("--meto", "-100", "--meto"),
        ("--meto", "0", "--meto"),
    ],
)
def test_bad_occupant_and_power_are_refused_by_name(runner, option, value, words):
    # issue 13: --occupant 0 silently used the default; -5 seated negative people;
    # --meto -100 gave errors that did not name --meto
    result = runner.invoke(app, ["extremes", str(sample("tandem2/aircraft.toml")), option, value])
    assert result.exit_code == 2, result.output
    assert words in result.output and "Traceback" not in result.output


def test_schedule_command_verdict_json_and_caution(runner):
    out = runner.invoke(app, ["schedule", str(sample("twin6/aircraft.toml")), "--json"])
    data = json.loads(out.stdout)
    assert out.exit_code == (0 if data["ok"] else 1)
    assert data["ok"] == all(case["ok"] and case["check"]["ok"] for case in data["cases"])
    assert data["caution"] == MECHANIC_CAUTION and all(c["check"]["caution"] == MECHANIC_CAUTION for c in data["cases"])
    text = runner.invoke(app, ["schedule", str(sample("twin6/aircraft.toml"))])
    assert "With full fuel" in text.output and "fuel states checked" in text.output
    assert text.exit_code == out.exit_code


# DESIGN.md, "Fail closed": a refused option is named as the user typed it, with its value.
@pytest.mark.parametrize("command", ["schedule", "extremes"])
def test_regression_schedule_and_extremes_name_the_category_as_typed(command):
    result = invoke(command, str(sample("trainer4/aircraft.toml")), "--category", "aerobatic")
    assert_input_error(result, "--category aerobatic: unknown category 'aerobatic'")
    assert "error: category:" not in result.output


def test_regression_extremes_names_the_occupant_as_typed():
    result = invoke("extremes", str(sample("trainer4/aircraft.toml")), "--occupant", "0")
    assert_input_error(result, "--occupant 0: must be a weight above zero")


def test_regression_write_without_a_terminal_says_what_to_do_naming_what_was_typed(runner, tmp_path, monkeypatch):
    """alter --write </dev/null named --yes (which was not typed) as the field; it now names --write
    and says plainly what to do (DESIGN.md, "Fail closed": name the option as typed)."""
    path = _trainer(tmp_path)
    before = path.read_bytes()
    monkeypatch.setattr(mechanic_cli, "_interactive", lambda: False)
    result = runner.invoke(app, ["alter", str(path), str(tmp_path / "changes.toml"), "--write"])
    assert_input_error(result, "error: --write: nothing was written", "run the command in a terminal", "add --yes")
    assert "error: --yes" not in result.output
    assert path.read_bytes() == before


def test_regression_sheet_says_a_sheet_was_written_not_the_record(runner, tmp_path):
    path = _trainer(tmp_path)
    before = path.read_bytes()
    sheet = tmp_path / "record.html"
    result = runner.invoke(app, ["alter", str(path), str(tmp_path / "changes.toml"), "--sheet", str(sheet)])
    assert result.exit_code == 0, result.output
    assert f"record sheet written (to print and sign): {sheet}\n" in result.stderr  # one line, the path whole
    assert "record written" not in result.stderr
    assert sheet.exists() and path.read_bytes() == before


def test_regression_weigh_shows_the_sign_of_every_change(runner):
    """trainer4/weighing.toml gives 1,685.8 lb against the current 1,718.0 lb: -32.2 lb, so the useful
    load grows by +32.2 lb (useful load = maximum takeoff weight - empty weight, FAA-H-8083-1B chapter 1)."""
    result = runner.invoke(app, ["weigh", str(sample("trainer4/aircraft.toml")), str(sample("trainer4/weighing.toml"))])
    text = " ".join(result.output.split())
    assert "Change from the current record: weight -32.2 lb, CG -0.19 in; useful load 764.2 lb (+32.2 lb)" in text


@pytest.mark.parametrize(
    "command",
    [["schedule"], ["extremes"], ["history"], ["weigh", "trainer4/weighing.toml"], ["alter", "trainer4/changes.toml"]],
    ids=lambda c: c[0],
)
def test_regression_a_loading_given_for_the_aircraft_file_is_named_as_such(command):
    # a loading file given as AIRCRAFT was read as an aircraft and refused field by field
    # ("name: this field is required", "load: unknown field"); it is now said plainly
    # (files.load_aircraft and load_aircraft_for_update, so every command that reads an aircraft file)
    given = sample("trainer4/within.toml")
    rest = [str(sample(name)) for name in command[1:]]
    result = invoke(command[0], str(given), *rest)
    assert_input_error(
        result,
        f"{given}: this is a loading file, not an aircraft file: give the aircraft file here",
        f"this loading names {sample('trainer4/aircraft.toml')}",
    )
    assert "this field is required" not in result.output and "unknown field" not in result.output
    readings = invoke(command[0], str(sample("trainer4/weighing.toml")), *rest)
    assert_input_error(readings, "this is a readings file, not an aircraft file")


# -- an aircraft that limits the lateral CG: a lateral arm left out is refused, never taken as 0 -------


def _heli_copy(tmp_path):
    import shutil

    shutil.copy(sample("heli2/aircraft.toml"), tmp_path / "aircraft.toml")
    return tmp_path / "aircraft.toml"


def test_weigh_refuses_a_point_without_its_lateral_arm_on_a_lateral_aircraft(tmp_path):
    # invented readings on heli2 (a lateral envelope): the second point's lateral arm is left out;
    # it was taken as 0 (on the centreline) and the lateral CG so made was written into the record
    aircraft = _heli_copy(tmp_path)
    readings = tmp_path / "readings.toml"
    readings.write_text(
        "format = 1\n"
        "[[point]]\nlabel = 'front'\narm = 84.0\nlateral_arm = 0.0\nreading = 320.0\n"
        "[[point]]\nlabel = 'rear left'\narm = 107.0\nreading = 322.0\n"
        "[[point]]\nlabel = 'rear right'\narm = 107.0\nlateral_arm = 18.0\nreading = 318.0\n"
    )
    before = aircraft.read_bytes()
    result = invoke("weigh", str(aircraft), str(readings), "--write", "--yes")
    assert_input_error(
        result, "point[1].lateral_arm", "limits the lateral CG", "so its lateral arm is needed", "0 for one on the"
    )
    assert aircraft.read_bytes() == before


def test_alter_refuses_an_installed_item_without_its_lateral_arm_on_a_lateral_aircraft(tmp_path):
    # an invented cargo hook on heli2 (a lateral envelope) without a lateral arm: it was taken as 0
    aircraft = _heli_copy(tmp_path)
    changes = tmp_path / "changes.toml"
    changes.write_text("format = 1\n[[change]]\naction = 'install'\nitem = 'hook'\nweight = 6.0\narm = 105.0\n")
    before = aircraft.read_bytes()
    result = invoke("alter", str(aircraft), str(changes), "--write", "--yes")
    assert_input_error(result, "change[0].lateral_arm", "limits the lateral CG", "0 for one on the centreline")
    assert aircraft.read_bytes() == before


def test_weigh_shows_the_new_lateral_cg_and_its_change(tmp_path):
    """The lateral CG that --write puts into the record was shown only in --json. Invented readings on heli2
    (current record 962.0 lb, lateral CG +0.40 in): 320 lb on the centreline, 322 lb 18.0 in left and 317 lb
    18.0 in right, and a 20 lb battery missing, 8.0 in right. Sum of lateral moments over the sum of weights
    (FAA-H-8083-1B chapter 2, moment method; chapter 3, weighing): as weighed (-5,796 + 5,706) / 959 =
    -0.094 in; new (-90 + 160) / 979 = +0.0715 in; change 0.0715 - 0.40 = -0.3285 in."""
    aircraft = _heli_copy(tmp_path)
    readings = tmp_path / "readings.toml"
    readings.write_text(
        "format = 1\n"
        "[[point]]\nlabel = 'front'\narm = 84.0\nlateral_arm = 0.0\nreading = 320.0\n"
        "[[point]]\nlabel = 'rear left'\narm = 107.0\nlateral_arm = -18.0\nreading = 322.0\n"
        "[[point]]\nlabel = 'rear right'\narm = 107.0\nlateral_arm = 18.0\nreading = 317.0\n"
        "[[missing]]\nlabel = 'battery'\nweight = 20.0\narm = 60.0\nlateral_arm = 8.0\n"
    )
    result = invoke("weigh", str(aircraft), str(readings))
    assert result.exit_code == 0, result.output
    text = " ".join(result.output.split())
    assert "Lateral CG (+ right): as weighed -0.09 in, new 0.07 in, current record 0.40 in; change -0.33 in" in text
    rows = {line.split("│")[1].strip(): line for line in result.output.splitlines() if line.count("│") > 5}
    assert "-18.00" in rows["rear left"] and "18.00" in rows["rear right"] and "8.00" in rows["battery"]
    data = json.loads(invoke("weigh", str(aircraft), str(readings), "--json").stdout)
    assert data["change_lateral_arm"] == pytest.approx(70.0 / 979.0 - 0.4)
    plain = invoke("weigh", str(sample("trainer4/aircraft.toml")), str(sample("trainer4/weighing.toml")))
    assert plain.exit_code == 0 and "Lateral CG" not in plain.output  # no lateral arms: nothing to show


def test_alter_shows_the_new_lateral_cg_and_its_change(tmp_path):
    """An invented cargo hook on heli2, 6.0 lb at 105.0 in, 10.0 in right: lateral CG (962 x 0.40 + 6 x 10)
    / 968 = 444.8 / 968 = +0.4595 in, a change of +0.0595 in (FAA-H-8083-1B chapter 2, added weight)."""
    aircraft = _heli_copy(tmp_path)
    changes = tmp_path / "changes.toml"
    changes.write_text(
        "format = 1\n[[change]]\naction = 'install'\nitem = 'hook'\nweight = 6.0\narm = 105.0\nlateral_arm = 10.0\n"
    )
    result = invoke("alter", str(aircraft), str(changes))
    assert result.exit_code == 0, result.output
    text = " ".join(result.output.split())
    assert "Lateral CG (+ right): current record 0.40 in, after the changes 0.46 in; change +0.06 in" in text
    data = json.loads(invoke("alter", str(aircraft), str(changes), "--json").stdout)
    assert data["change_lateral_arm"] == pytest.approx(444.8 / 968.0 - 0.4)
    plain = invoke("alter", str(sample("trainer4/aircraft.toml")), str(sample("trainer4/changes.toml")))
    assert plain.exit_code == 0 and "Lateral CG" not in plain.output


def test_regression_alter_printed_a_light_item_as_no_change(tmp_path):
    """A placard of 0.021 kg installed at 1,500 mm on tandem2 (invented) printed "weight 0.0 kg":
    a change that is not zero is shown with its sign and the digits it needs, on the terminal and
    the record sheet alike; the JSON keeps the exact figures. New moment = old moment + 0.021 x 1,500
    kg-mm, new CG = new moment / new weight (FAA-H-8083-1B chapter 2, added weight)."""
    import shutil

    shutil.copy(sample("tandem2/aircraft.toml"), tmp_path / "aircraft.toml")
    aircraft = tmp_path / "aircraft.toml"
    empty = load_aircraft(aircraft).empty
    changes = tmp_path / "changes.toml"
    changes.write_text(
        "format = 1\ndate = 2026-11-01\n[[change]]\naction = 'install'\nitem = 'placard'\nlabel = 'Placard'\n"
        "weight = 0.021\narm = 1500.0\n"
    )
    new_arm = (empty.moment + 0.021 * 1500.0) / (empty.weight + 0.021)
    assert new_arm - empty.arm == pytest.approx(0.0597, abs=5e-5)  # shows as +0.1 mm (mm: whole numbers)
    sheet = tmp_path / "record.html"
    result = invoke("alter", str(aircraft), str(changes), "--sheet", str(sheet))
    assert result.exit_code == 0, result.output
    text = " ".join(result.output.split())
    assert "Change from the current record: weight +0.02 kg, CG +0.1 mm;" in text, text
    assert "(-0.02 kg)" in text and "weight 0.0 kg" not in text and "(0.0 kg)" not in text
    assert "the weight changes by +0.02 kg (+0.05 lb)" in text  # the negligible-change words
    row = next(line for line in result.output.splitlines() if "Placard" in line)
    assert row.split("│")[3].strip() == "0.02" and row.split("│")[6].strip() == "+0.02", row  # weight, change
    html = " ".join(sheet.read_text().split())
    for shown in ("+0.02 kg", "+0.1 mm"):
        assert f"<td>{shown}</td>" in html, shown
    data = json.loads(invoke("alter", str(aircraft), str(changes), "--json").stdout)
    assert data["change_weight"] == (empty.weight + 0.021) - empty.weight  # exact, as computed
    assert data["lines"][0]["weight_change"] == 0.021 and data["change_arm"] == pytest.approx(new_arm - empty.arm)


@pytest.mark.parametrize("typed", ["0", "160 hp", "abc", "-5"])
def test_regression_meto_was_named_as_read_or_refused_in_the_frameworks_words(runner, typed):
    """An outside trial: ``extremes --meto 0`` was named "--meto 0.0" (the value as read, not as typed) and
    ``--meto "160 hp"`` gave the command-line framework's "Input should be a valid number". The power is
    read by the library (loadcheck.extremes.minimum_fuel) and refused, naming the option as typed."""
    said = runner.invoke(app, ["extremes", str(sample("trainer4/aircraft.toml")), "--meto", typed])
    assert said.exit_code == 2
    assert f"--meto {shlex.quote(typed)}: the maximum-except-takeoff power must be a number above zero" in said.output
    assert "Input should be" not in said.output


def test_regression_schedule_fuel_did_not_add_up_to_the_fuel_checked(runner):
    """An outside trial: the schedule said "fuel: mains 34.9 usgal, aux 11.6 usgal" (46.5) beside "from
    46.6 usgal at engine start" and a moment table of 35.0: each tank's most is rounded down, the total
    and the tables are not. The line now says its figures are each rounded down, and each is the tank's
    fuel checked rounded down to 0.1 (common practice: a most is rounded down)."""
    import re

    plane = str(sample("twin6/aircraft.toml"))
    cases = json.loads(runner.invoke(app, ["schedule", plane, "--json"]).stdout)["cases"]
    text = " ".join(runner.invoke(app, ["schedule", plane]).output.split())
    lines = re.findall(r"fuel \(each tank rounded down\): (.*?) fuel states checked", text)
    assert len(lines) == len(cases) >= 1
    for line, case in zip(lines, cases, strict=True):
        shown = [float(x.replace(",", "")) for x in re.findall(r"([\d,]+\.\d) usgal", line)]
        checked = list(case["fuel"].values())
        assert len(shown) == len(checked)
        for figure, amount in zip(shown, checked, strict=True):
            assert figure <= amount + 1e-9 and amount - figure < 0.1 + 1e-9, (figure, amount)


def test_a_record_sheet_whose_extremes_are_out_of_limits_says_so_on_the_terminal_too(tmp_path):
    # trial 11, finding 1: the weighing's record sheet said "Most forward ... NOT within limits" (the
    # extremes of the new record) while the terminal only said "record sheet written": a limit finding
    # told in one place only. The invented kinked freighter of tests/test_extremes.py, weighed as it is.
    from .helpers import invoke, write_file
    from .test_extremes import KINK

    write_file(tmp_path, KINK, "kink.toml")
    readings = write_file(
        tmp_path,
        'format = 1\naircraft = "kink.toml"\ndate = 2026-11-22\n[[point]]\nlabel = "all"\narm = 2.5\nreading = 1500\n',
        "kw.toml",
    )
    ran = invoke("weigh", str(tmp_path / "kink.toml"), readings, "--sheet", str(tmp_path / "kw.html"))
    assert ran.exit_code == 0, ran.output
    assert "NOT within limits" in (tmp_path / "kw.html").read_text()
    assert "extreme checks with the new record are NOT all within limits" in ran.stderr
    # the sample trainer: its utility category's rearward extreme is out of limits
    # (`loadcheck extremes -c utility` exits 1), its normal category's not; the warning names utility only
    trainer = invoke(
        "weigh",
        str(sample("trainer4/aircraft.toml")),
        str(sample("trainer4/weighing.toml")),
        "--sheet",
        str(tmp_path / "t.html"),
    )
    assert trainer.exit_code == 0
    assert "NOT all within limits (or not established) in the utility category;" in trainer.stderr
    assert "normal" not in trainer.stderr
    from .test_empty_record import tandem_all_within

    aircraft, changes = tandem_all_within(tmp_path)
    ok = invoke("alter", str(aircraft), str(changes), "--sheet", str(tmp_path / "ok.html"))
    assert ok.exit_code == 0 and "NOT all within limits" not in ok.stderr and "warning" not in ok.stderr


def test_regression_weigh_and_alter_json_carried_no_extremes(tmp_path):
    # trial 12, finding 3: `alter --json` had no extreme checks, and the stderr warning looked at the
    # first category only. The trial's aircraft: its utility forward extreme is out of limits
    # (720.0 kg at 28.52 cm against 29.0 cm, hand-worked in tests/test_empty_record.py).
    from .test_empty_record import heron_u, tandem_all_within

    aircraft, changes = heron_u(tmp_path)
    ran = invoke("alter", str(aircraft), str(changes), "--json")
    assert ran.exit_code == 0, ran.output  # the weighing's or alteration's status (docs/mechanic.md)
    found = {entry["category"]: entry for entry in json.loads(ran.stdout)["extremes"]}
    assert list(found) == ["normal", "utility"]
    utility = found["utility"]
    assert utility["ok"] is False and utility["complete"] is True
    forward = utility["checks"]["forward"]
    assert forward["ok"] is False and forward["complete"] is True
    assert utility["checks"]["category"] == "utility" and utility["checks"]["ok"] is False
    ramp = next(c for c in forward["check"]["conditions"] if c["condition"] == "ramp")
    assert ramp["weight"] == pytest.approx(720.0, abs=0.05) and ramp["arm"] == pytest.approx(28.52, abs=0.01)
    assert forward["limit_arm"] == pytest.approx(29.0, abs=0.01)
    sheet = invoke("alter", str(aircraft), str(changes), "--sheet", str(tmp_path / "u.html"))
    assert sheet.exit_code == 0
    assert "NOT all within limits (or not established) in the utility category;" in sheet.stderr
    assert f"see loadcheck extremes {aircraft} --category utility" in sheet.stderr
    # every category within limits: each entry says so
    aircraft, changes = tandem_all_within(tmp_path)
    ran = invoke("alter", str(aircraft), str(changes), "--json")
    assert ran.exit_code == 0, ran.output
    entries = json.loads(ran.stdout)["extremes"]
    assert [e["category"] for e in entries] == ["normal", "aerobatic"]
    for entry in entries:
        assert entry["ok"] is True and entry["complete"] is True and entry["checks"]["ok"] is True
        assert all(entry["checks"][side]["ok"] for side in ("forward", "rearward"))
