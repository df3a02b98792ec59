"""The command line through typer's CliRunner: exit codes, JSON fields, bad input."""

from __future__ import annotations

import json
import re
import shutil
import subprocess
import sys
from pathlib import Path

import pytest

from loadcheck.caution import PILOT_CAUTION
from loadcheck.cli import app

from .helpers import app_runner, sample

TRAINER = str(sample("trainer4/aircraft.toml"))


def invoke(*args: str):
    return app_runner().invoke(app, list(args))


def test_check_within_limits_prints_tables_and_caution():
    result = invoke("check", TRAINER, str(sample("trainer4/within.toml")))
    assert result.exit_code == 0, result.output
    assert "WITHIN LIMITS" in result.output
    assert "2,423.9" in result.output  # takeoff weight
    assert "CAUTION" in result.output and "pilot in command" in result.output


def test_loading_file_alone_names_its_aircraft():
    result = invoke("check", str(sample("twin6/leaves_path.toml")))
    assert result.exit_code == 1
    assert "leaves the envelope" in result.output


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


def _bad(tmp_path: Path, text: str | bytes, name: str = "aircraft.toml") -> str:
    path = tmp_path / name
    if isinstance(text, bytes):
        path.write_bytes(text)
    else:
        path.write_text(text)
    return str(path)


def _assert_input_error(result, *words: str):
    assert result.exit_code == 2, result.output
    assert "Traceback" not in result.output
    for word in words:
        assert word in result.output, result.output


def test_missing_file():
    _assert_input_error(invoke("check", "no/such/file.toml"), "no/such/file.toml", "not found")


def test_toml_syntax_error_gives_the_line(tmp_path):
    path = _bad(tmp_path, 'format = 1\nname = "x"\n[units\nmass = "lb"\n')
    _assert_input_error(invoke("check", path), "aircraft.toml", "TOML syntax error", "line 3")


def test_unknown_station_lists_the_known_ones():
    _assert_input_error(invoke("check", TRAINER, "--load", "frnt=100"), "frnt", "front, rear, hold")


@pytest.mark.parametrize("value", ["-20", "nan", "inf"])
def test_negative_or_nan_weight(value):
    _assert_input_error(invoke("check", TRAINER, "--load", f"front={value}"), f"--load front={value}:")


def test_negative_weight_in_a_file(tmp_path):
    text = Path(sample("trainer4/within.toml")).read_text().replace("front = 340", "front = -340")
    text = text.replace('aircraft = "aircraft.toml"', f'aircraft = "{TRAINER}"')
    _assert_input_error(invoke("check", _bad(tmp_path, text, "loading.toml")), "loading.toml", "load.front", "-340")


def test_unknown_unit(tmp_path):
    text = Path(TRAINER).read_text().replace('mass = "lb"', 'mass = "lbm"')
    _assert_input_error(invoke("check", _bad(tmp_path, text)), "aircraft.toml", "units.mass", "lbm")
    _assert_input_error(invoke("check", TRAINER, "--load", "front=20 kgs x"), "--load 'front=20 kgs x':")


def test_fuel_above_capacity():
    _assert_input_error(invoke("check", TRAINER, "--fuel", "mains=55"), "--fuel mains=55:", "usable capacity", "44")


def test_unknown_category():
    _assert_input_error(invoke("check", TRAINER, "--category", "aerobatic"), "category", "normal, utility")


def test_unknown_fill_level():
    _assert_input_error(invoke("check", TRAINER, "--fuel", "mains=brim"), "--fuel mains=brim:", "full, school")


def test_binary_and_non_utf8_files(tmp_path):
    _assert_input_error(invoke("check", _bad(tmp_path, b"\x00\x01\x02")), "binary")
    _assert_input_error(invoke("check", _bad(tmp_path, b"name = '\xe9'\n")), "UTF-8")


def test_empty_file(tmp_path):
    _assert_input_error(invoke("check", _bad(tmp_path, "")), "aircraft.toml")


def test_bad_assignment_syntax():
    _assert_input_error(invoke("check", TRAINER, "--load", "front"), "--load", "NAME=VALUE")


def test_validate_reports_everything(tmp_path):
    text = Path(TRAINER).read_text().replace("weight = 1718.0", "weight = -1").replace("usable = 44.0", "usable = 0")
    bad = _bad(tmp_path, text)
    result = invoke("validate", TRAINER, str(sample("twin6/within.toml")), bad)
    assert result.exit_code == 2
    assert "empty.weight" in result.output and "tank[0].usable" in result.output
    assert "ok: " in result.output


def test_validate_all_samples():
    files = sorted(str(p) for p in sample("").glob("*/*.toml"))
    result = invoke("validate", *files)
    assert result.exit_code == 0, result.output


def test_schema_is_json_schema():
    result = invoke("schema")
    data = json.loads(result.stdout)
    assert data["aircraft"]["title"] == "Aircraft" and "envelope" in data["aircraft"]["properties"]
    assert json.loads(invoke("schema", "loading").stdout)["title"] == "Loading"


def test_version_and_help():
    assert invoke("--version").exit_code == 0
    help_text = invoke("check", "--help").output
    assert "Examples" in help_text and "--load" in help_text


def test_python_dash_m_and_no_matplotlib_on_a_plain_check():
    code = (
        "import sys, runpy; sys.argv=['loadcheck','check',%r,'--load','front=300'];"
        "import loadcheck.cli as c\n"
        "try:\n c.main()\nexcept SystemExit as e:\n code=e.code\n"
        "print('MPL' if 'matplotlib' in sys.modules else 'NOMPL', code)" % TRAINER
    )
    out = subprocess.run([sys.executable, "-c", code], capture_output=True, text=True, check=False)
    assert "NOMPL 0" in out.stdout, out.stdout + out.stderr
    run = subprocess.run([sys.executable, "-m", "loadcheck", "--version"], capture_output=True, text=True, check=False)
    assert run.returncode == 0 and "loadcheck" in run.stdout


@pytest.mark.skipif(sys.platform == "win32", reason="SIGPIPE is POSIX")
def test_regression_output_into_a_closed_pipe_exited_1_or_was_an_internal_error():
    # `check within.toml | head -1` exited 1 (the "limit exceeded" status) and `fleet check --json | head -1`
    # said "internal error (BrokenPipeError)": a reader that stops early ends the process by SIGPIPE
    import signal

    for args in (
        ["check", str(sample("twin6/within.toml"))],
        ["fleet", "check", str(sample(".")), str(sample("fleet_day.csv")), "--no-log", "--json"],
    ):
        run = subprocess.run(
            f"{sys.executable} -m loadcheck {' '.join(args)} | head -c 10; exit ${{PIPESTATUS[0]}}",
            shell=True,
            executable="/bin/bash",
            capture_output=True,
            text=True,
            check=False,
        )
        assert run.returncode == 128 + signal.SIGPIPE, (args, run.returncode, run.stderr)
        assert "internal error" not in run.stderr and "Traceback" not in run.stderr


@pytest.mark.skipif(shutil.which("loadcheck") is None, reason="console script not installed")
def test_console_script_exit_code_for_a_limit():
    run = subprocess.run(
        ["loadcheck", "check", str(sample("trainer4/over_weight.toml"))], capture_output=True, text=True, check=False
    )
    assert run.returncode == 1


@pytest.mark.parametrize(
    "args, code, words",
    [
        (["check", str(sample("trainer4/within.toml")), "--json"], 0, '"ok": true'),
        (["plan", "fuel", str(sample("trainer4/within.toml"))], 0, "ramp fuel"),
        (["--version"], 0, "loadcheck"),
        (["nope"], 2, "No such command"),
        ([], 2, "Usage"),
    ],
)
def test_the_console_entry_builds_just_the_command_asked_for(args, code, words):
    run = subprocess.run([sys.executable, "-m", "loadcheck", *args], capture_output=True, text=True, check=False)
    assert run.returncode == code, run.stderr
    assert words in run.stdout + run.stderr


def test_public_api_exposes_every_job_without_loading_them_at_start():
    code = (
        "import sys, loadcheck\nassert 'loadcheck.planning' not in sys.modules\n"
        "from loadcheck import most_fuel, weigh, alter, extremes, evaluate, loading_schedule\n"
        "print(most_fuel.__module__)"
    )
    run = subprocess.run([sys.executable, "-c", code], capture_output=True, text=True, check=False)
    assert run.returncode == 0 and "loadcheck.planning" in run.stdout, run.stderr


_STARTUP = """
import sys
sys.argv = ["loadcheck", "check", sys.argv[1], "--json"]
import loadcheck.cli as cli
try:
    cli.main()
except SystemExit as stop:
    code = stop.code
loaded = [name for name in ("importlib.metadata", "rich", "matplotlib") if name in sys.modules]
print(code, loaded, file=sys.stderr)
"""


def test_check_json_starts_without_importlib_metadata_rich_or_matplotlib(tmp_path):
    """Start-up (issue 18 item 4): pydantic's plugin loader imported importlib.metadata (about
    9 ms) to find no plugin; with plugins disabled its stand-in answers the same."""
    from .test_trip import trip_fleet

    loading = trip_fleet(tmp_path / "fleet") / "trip.toml"
    done = subprocess.run([sys.executable, "-c", _STARTUP, str(loading)], capture_output=True, text=True, check=True)
    assert done.stderr.strip() == "1 []", done.stderr
    assert json.loads(done.stdout)["ok"] is False


def test_pydantic_plugins_enabled_by_the_user_are_still_looked_for(tmp_path):
    import os

    from .test_trip import trip_fleet

    loading = trip_fleet(tmp_path / "fleet") / "trip.toml"
    env = {**os.environ, "PYDANTIC_DISABLE_PLUGINS": ""}  # the user's value is kept: plugins on
    done = subprocess.run(
        [sys.executable, "-c", _STARTUP, str(loading)], capture_output=True, text=True, check=True, env=env
    )
    assert done.stderr.startswith("1 ['importlib.metadata']"), done.stderr


def test_the_plugin_loader_stand_in_hands_over_when_plugins_are_enabled(monkeypatch):
    import sys as system

    import loadcheck.cli as cli

    monkeypatch.delitem(system.modules, "pydantic.plugin._loader", raising=False)
    cli._plugin_loader_without_metadata()
    stand_in = system.modules["pydantic.plugin._loader"]
    monkeypatch.setenv("PYDANTIC_DISABLE_PLUGINS", "1")
    assert stand_in.get_plugins() == ()
    monkeypatch.setenv("PYDANTIC_DISABLE_PLUGINS", "")
    assert list(stand_in.get_plugins()) == []  # no plugin is installed here: the real loader finds none
    assert system.modules["pydantic.plugin._loader"] is not stand_in  # the real loader is in place now


# -- help that reads well (issue 15, item 5: `<list[str]>` and `{AIRCRAFT}` in the help) -----------


def _every_command(command, path=()):
    yield list(path)
    for name, sub in getattr(command, "commands", {}).items():
        yield from _every_command(sub, (*path, name))


def test_no_command_help_shows_a_python_type_or_braces(runner):
    # regression: `loadcheck validate --help` printed `FILES <list[Path]>` and `{FILES}...`
    import typer

    commands = list(_every_command(typer.main.get_command(app)))
    assert len(commands) > 20
    for path in commands:
        text = runner.invoke(app, [*path, "--help"], env={"COLUMNS": "100"}).output
        odd = re.findall(r"<[A-Za-z_]+(?:\[[^>]*\])?>|\{[A-Za-z_]+\}", text)
        assert not odd, f"loadcheck {' '.join(path)} --help shows {odd}"
    validate = runner.invoke(app, ["validate", "--help"], env={"COLUMNS": "100"}).output
    assert "Usage: loadcheck validate [OPTIONS] FILES..." in validate
    assert re.search(r"^\s+FILES\s+Aircraft and loading files to check\.", validate, re.M)
    check = runner.invoke(app, ["check", "--help"], env={"COLUMNS": "100"}).output
    assert "Usage: loadcheck check [OPTIONS] AIRCRAFT [LOADING]" in check
    assert "-r, --role ROLE" in runner.invoke(app, ["users", "add", "--help"], env={"COLUMNS": "100"}).output


# -- the check log's options: --db FILE wherever the log is read or written, --log/--no-log where a command may
# record (issue 21: one convention instead of check --record, fleet check --no-record and records --db)

WITHIN = str(sample("trainer4/within.toml"))
DAY = str(sample("fleet_day.csv"))
SAMPLES_DIR = str(sample("."))


def _logged(db: Path) -> int:
    from loadcheck.checklog import CheckLog

    with CheckLog(db) as log:
        return len(list(log.listing()))


def test_check_records_in_the_check_log_only_with_log(runner, tmp_path, monkeypatch):
    monkeypatch.delenv("LOADCHECK_LOG", raising=False)
    db = tmp_path / "log.sqlite3"
    assert runner.invoke(app, ["check", TRAINER, WITHIN]).exit_code == 0
    assert not db.exists()
    logged = runner.invoke(app, ["check", TRAINER, WITHIN, "--log", "--db", str(db)])
    assert logged.exit_code == 0, logged.output
    assert _logged(db) == 1
    listed = runner.invoke(app, ["log", "list", "--db", str(db)])
    assert listed.exit_code == 0 and "DEMO-4T" in listed.output


def test_check_db_without_log_is_refused_not_ignored(runner, tmp_path):
    db = tmp_path / "log.sqlite3"
    result = runner.invoke(app, ["check", TRAINER, WITHIN, "--db", str(db)])
    _assert_input_error(result, "--db", "--log")
    assert not db.exists()


def test_check_log_without_db_uses_loadcheck_log(runner, tmp_path, monkeypatch):
    db = tmp_path / "env.sqlite3"
    monkeypatch.setenv("LOADCHECK_LOG", str(db))
    assert runner.invoke(app, ["check", TRAINER, WITHIN, "--log"]).exit_code == 0
    assert _logged(db) == 1


def test_fleet_check_logs_by_default_and_not_with_no_log(runner, tmp_path):
    db = tmp_path / "day.sqlite3"
    logged = runner.invoke(app, ["fleet", "check", SAMPLES_DIR, DAY, "--db", str(db)])
    assert logged.exit_code == 2  # the sample day holds malformed rows on purpose (docs/fleet.md)
    said = re.search(r"(\d+) check\(s\) recorded in the check log", logged.output)
    assert said and _logged(db) == int(said.group(1)) > 0, logged.output
    unlogged = tmp_path / "none.sqlite3"
    refused = runner.invoke(app, ["fleet", "check", SAMPLES_DIR, DAY, "--no-log", "--db", str(unlogged)])
    _assert_input_error(refused, "--db", "--no-log")
    assert not unlogged.exists()


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
    _assert_input_error(old, "--record", "--log", "--db")  # rename.py: keep
    assert not db.exists()
    old = runner.invoke(app, ["fleet", "check", SAMPLES_DIR, DAY, "--no-record"])  # rename.py: keep
    _assert_input_error(old, "--no-record", "--no-log")  # rename.py: keep
    _assert_input_error(
        runner.invoke(app, ["records", "list", "--db", str(db)]), "records", "loadcheck log list"
    )  # rename.py: keep


def test_old_log_variable_is_refused_not_ignored(runner, tmp_path, monkeypatch):
    # fail closed: a path the user set in the variable's old name is never passed over for the default
    old = tmp_path / "old.sqlite3"
    monkeypatch.setenv("LOADCHECK_RECORDS", str(old))  # rename.py: keep
    monkeypatch.delenv("LOADCHECK_LOG", raising=False)
    result = runner.invoke(app, ["check", TRAINER, WITHIN, "--log"])
    _assert_input_error(result, "LOADCHECK_RECORDS", "LOADCHECK_LOG", "rename")  # rename.py: keep
    assert not old.exists()
    _assert_input_error(runner.invoke(app, ["log", "list"]), "LOADCHECK_LOG")
    _assert_input_error(runner.invoke(app, ["fleet", "check", SAMPLES_DIR, DAY]), "LOADCHECK_LOG")
    monkeypatch.setenv("LOADCHECK_LOG", str(tmp_path / "new.sqlite3"))  # both set, to different files: refused too
    _assert_input_error(runner.invoke(app, ["check", TRAINER, WITHIN, "--log"]), "different files")
    given = tmp_path / "given.sqlite3"  # --db given: no variable is read
    assert runner.invoke(app, ["check", TRAINER, WITHIN, "--log", "--db", str(given)]).exit_code == 0
    assert _logged(given) == 1


def test_meto_power_under_its_old_key_is_refused_with_the_new_key(runner, tmp_path):
    text = (
        Path(TRAINER).read_text(encoding="utf-8").replace("meto_power_hp", "max_continuous_power_hp")
    )  # rename.py: keep
    path = tmp_path / "aircraft.toml"
    path.write_text(text, encoding="utf-8")
    result = runner.invoke(app, ["validate", str(path)])
    _assert_input_error(result, "max_continuous_power_hp", "meto_power_hp")  # rename.py: keep


def test_plan_stop_of_a_loading_of_one_leg_was_an_internal_error(runner):
    # regression (found typing the front end, issue 21): plan stop on a loading without [[leg]] tables passed
    # no trip on and ended in "internal error (AttributeError ...)" instead of a field error
    result = runner.invoke(app, ["plan", "stop", TRAINER, WITHIN, "--leg", "2"])
    _assert_input_error(result, "leg", "one leg")
    assert "internal error" not in result.output


def test_unknown_export_format_is_an_input_error_naming_the_field():
    # issue 21 (smaller): export_text raised a bare ValueError, outside the error hierarchy
    # the front ends turn into exit 2
    from loadcheck.checklog import export_text
    from loadcheck.errors import InputError

    with pytest.raises(InputError) as raised:
        export_text([], "xml")
    (problem,) = raised.value.problems
    assert problem.field == "format" and problem.value == "xml" and "csv or jsonl" in (problem.expected or "")


def test_check_json_imports_neither_rich_nor_the_check_log_nor_sqlite(tmp_path):
    # start-up (issue 18 item 4): a check that records nothing asked the check log's module whether it
    # records (loadcheck.checklog.log_path), importing sqlite3 and csv for nothing; rich is for tables only
    code = (
        "import sys; sys.argv = ['loadcheck', 'check', sys.argv[1], '--json']\n"
        "import loadcheck.cli as cli\n"
        "try:\n    cli.main()\nexcept SystemExit as stop:\n    code = stop.code\n"
        "loaded = [m for m in ('rich', 'loadcheck.checklog', 'sqlite3', 'csv') if m in sys.modules]\n"
        "print(code, loaded, file=sys.stderr)"
    )
    done = subprocess.run([sys.executable, "-c", code, WITHIN], capture_output=True, text=True, check=True)
    assert done.stderr.strip() == "0 []", done.stderr
    assert json.loads(done.stdout)["ok"] is True
    logged = subprocess.run(  # with --log it is imported and records
        [
            sys.executable,
            "-c",
            code.replace("'--json']", "'--json', '--log', '--db', sys.argv[2]]"),
            WITHIN,
            str(tmp_path / "l.db"),
        ],
        capture_output=True,
        text=True,
        check=True,
    )
    assert "'loadcheck.checklog'" in logged.stderr and (tmp_path / "l.db").is_file()


def test_the_cycle_collector_is_back_to_its_thresholds_after_the_first_collection():
    # start-up (issue 18 item 4): no pass of the cycle collector over the start-up's objects, which all live on;
    # from the first collection on (a long command) the process's usual thresholds hold
    import gc

    import loadcheck.cli as cli

    usual = gc.get_threshold()
    callbacks = list(gc.callbacks)
    try:
        gc.set_threshold(700, 10, 10)
        cli._collect_after_start_up()
        assert gc.get_threshold() == (cli._START_UP_OBJECTS, 10, 10)
        gc.collect()
        assert gc.get_threshold() == (700, 10, 10)
        gc.set_threshold(0)  # collection disabled by the process: left alone
        cli._collect_after_start_up()
        assert gc.get_threshold()[0] == 0
    finally:
        gc.callbacks[:] = callbacks
        gc.set_threshold(*usual)


def test_the_console_entry_leaves_its_objects_to_the_exit_untraversed():
    # start-up (issue 18 item 4): the interpreter's collections at exit went over every object once more
    # (about 5 % of a check's instructions, valgrind); main() freezes them once the command is done
    code = (
        "import gc, sys; sys.argv = ['loadcheck', 'check', sys.argv[1], '--json']\n"
        "import loadcheck.cli as cli\n"
        "try:\n    cli.main()\nexcept SystemExit as stop:\n    code = stop.code\n"
        "print(code, gc.get_freeze_count() > 10_000, file=sys.stderr)"
    )
    done = subprocess.run([sys.executable, "-c", code, WITHIN], capture_output=True, text=True, check=True)
    assert done.stderr.strip() == "0 True", done.stderr
    assert json.loads(done.stdout)["ok"] is True  # the output is whole
