"""What every command shares (loadcheck/cli/common.py): input errors printed with the file, the
field and the value, exit 2 and no traceback; the version and help; the check log's options,
one convention on every command (--db FILE; --log/--no-log where a command may record)."""

from __future__ import annotations

from pathlib import Path

import pytest

from loadcheck.cli import app

from .helpers import assert_input_error, invoke, logged_checks, sample, write_file

TRAINER = str(sample("trainer4/aircraft.toml"))
WITHIN = str(sample("trainer4/within.toml"))
DAY = str(sample("fleet_day.csv"))
SAMPLES_DIR = str(sample("."))


def test_missing_file():
    assert_input_error(invoke("check", "no/such/file.toml"), "no/such/file.toml", "not found")


def test_toml_syntax_error_gives_the_line(tmp_path):
    path = write_file(tmp_path, 'format = 1\nname = "x"\n[units\nmass = "lb"\n')
    assert_input_error(invoke("check", path), "aircraft.toml", "TOML syntax error", "line 3")


def test_unknown_station_lists_the_known_ones():
    assert_input_error(invoke("check", TRAINER, "--load", "frnt=100"), "frnt", "front, rear, hold")


@pytest.mark.parametrize("value", ["-20", "nan", "inf"])
def test_negative_or_nan_weight(value):
    assert_input_error(invoke("check", TRAINER, "--load", f"front={value}"), f"--load front={value}:")


def test_negative_weight_in_a_file(tmp_path):
    text = Path(sample("trainer4/within.toml")).read_text().replace("front = 340", "front = -340")
    text = text.replace('aircraft = "aircraft.toml"', f'aircraft = "{TRAINER}"')
    assert_input_error(
        invoke("check", write_file(tmp_path, text, "loading.toml")), "loading.toml", "load.front", "-340"
    )


def test_unknown_unit(tmp_path):
    text = Path(TRAINER).read_text().replace('mass = "lb"', 'mass = "lbm"')
    assert_input_error(invoke("check", write_file(tmp_path, text)), "aircraft.toml", "units.mass", "lbm")
    assert_input_error(invoke("check", TRAINER, "--load", "front=20 kgs x"), "--load 'front=20 kgs x':")


def test_fuel_above_capacity():
    assert_input_error(invoke("check", TRAINER, "--fuel", "mains=55"), "--fuel mains=55:", "usable capacity", "44")


def test_unknown_category():
    assert_input_error(invoke("check", TRAINER, "--category", "aerobatic"), "category", "normal, utility")


def test_unknown_fill_level():
    assert_input_error(invoke("check", TRAINER, "--fuel", "mains=brim"), "--fuel mains=brim:", "full, school")


def test_binary_and_non_utf8_files(tmp_path):
    assert_input_error(invoke("check", write_file(tmp_path, b"\x00\x01\x02")), "binary")
    assert_input_error(invoke("check", write_file(tmp_path, b"name = '\xe9'\n")), "UTF-8")


def test_empty_file(tmp_path):
    assert_input_error(invoke("check", write_file(tmp_path, "")), "aircraft.toml")


def test_bad_assignment_syntax():
    assert_input_error(invoke("check", TRAINER, "--load", "front"), "--load", "NAME=VALUE")


def test_version_and_help():
    assert invoke("--version").exit_code == 0
    help_text = invoke("check", "--help").output
    assert "Examples" in help_text and "--load" in help_text


def test_every_command_of_the_check_log_takes_db(runner):
    for args in (
        ["check"],
        ["fleet", "check"],
        ["log", "list"],
        ["log", "show"],
        ["log", "export"],
        ["log", "verify"],
        ["serve"],
    ):
        shown = runner.invoke(app, [*args, "--help"], env={"COLUMNS": "200"})
        assert shown.exit_code == 0 and "--db" in shown.output, args
    for args in (["check"], ["fleet", "check"]):
        shown = runner.invoke(app, [*args, "--help"], env={"COLUMNS": "200"}).output
        assert "--log" in shown and "--no-log" in shown, args


def test_old_log_options_and_group_are_refused_with_the_new_names(runner, tmp_path):
    db = tmp_path / "old.sqlite3"
    old = runner.invoke(app, ["check", TRAINER, WITHIN, "--record", str(db)])  # rename.py: keep
    assert_input_error(old, "--record", "--log", "--db")  # rename.py: keep
    assert not db.exists()
    old = runner.invoke(app, ["fleet", "check", SAMPLES_DIR, DAY, "--no-record"])  # rename.py: keep
    assert_input_error(old, "--no-record", "--no-log")  # rename.py: keep
    assert_input_error(
        runner.invoke(app, ["records", "list", "--db", str(db)]), "records", "loadcheck log list"
    )  # rename.py: keep


def test_old_log_variable_is_refused_not_ignored(runner, tmp_path, monkeypatch):
    # fail closed: a path the user set in the variable's old name is never passed over for the default
    old = tmp_path / "old.sqlite3"
    monkeypatch.setenv("LOADCHECK_RECORDS", str(old))  # rename.py: keep
    monkeypatch.delenv("LOADCHECK_LOG", raising=False)
    result = runner.invoke(app, ["check", TRAINER, WITHIN, "--log"])
    assert_input_error(result, "LOADCHECK_RECORDS", "LOADCHECK_LOG", "rename")  # rename.py: keep
    assert not old.exists()
    assert_input_error(runner.invoke(app, ["log", "list"]), "LOADCHECK_LOG")
    assert_input_error(runner.invoke(app, ["fleet", "check", SAMPLES_DIR, DAY]), "LOADCHECK_LOG")
    monkeypatch.setenv("LOADCHECK_LOG", str(tmp_path / "new.sqlite3"))  # both set, to different files: refused too
    assert_input_error(runner.invoke(app, ["check", TRAINER, WITHIN, "--log"]), "different files")
    given = tmp_path / "given.sqlite3"  # --db given: no variable is read
    assert runner.invoke(app, ["check", TRAINER, WITHIN, "--log", "--db", str(given)]).exit_code == 0
    assert logged_checks(given) == 1
