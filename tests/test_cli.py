"""The command line as a whole (loadcheck/cli/__init__.py, python -m loadcheck): the console
entry, start-up (what it imports), output into a closed pipe, help that reads well. Each
user's commands are in tests/test_cli_pilot.py, test_cli_dispatcher.py, test_cli_mechanic.py
and test_cli_desk.py; what they share in tests/test_cli_common.py."""

from __future__ import annotations

import json
import re
import shutil
import subprocess
import sys

import pytest

from loadcheck.cli import app

from . import helpers
from .helpers import sample

# names this file's tests used before they moved to tests/test_cli_*.py, kept for the tests other
# engineers append to its end this round (new tests: use helpers.invoke, helpers.assert_input_error, ...)
invoke = helpers.invoke
_assert_input_error = helpers.assert_input_error
_logged = helpers.logged_checks
_bad = helpers.write_file
TRAINER = str(sample("trainer4/aircraft.toml"))
WITHIN = str(sample("trainer4/within.toml"))
DAY = str(sample("fleet_day.csv"))
SAMPLES_DIR = str(sample("."))


def test_no_matplotlib_on_a_plain_check():
    code = (
        "import sys, runpy; sys.argv=['loadcheck','check',%r,'--load','front=300'];"
        "import loadcheck.cli as c\n"
        "try:\n c.main()\nexcept SystemExit as e:\n code=e.code\n"
        "print('MPL' if 'matplotlib' in sys.modules else 'NOMPL', code)" % TRAINER
    )
    out = subprocess.run([sys.executable, "-c", code], capture_output=True, text=True, check=False)
    assert "NOMPL 0" in out.stdout, out.stdout + out.stderr  # python -m loadcheck: the console entry's tests below


@pytest.mark.skipif(sys.platform == "win32", reason="SIGPIPE is POSIX")
def test_regression_output_into_a_closed_pipe_exited_1_or_was_an_internal_error():
    # `check within.toml | head -1` exited 1 (the "limit exceeded" status) and `fleet check --json | head -1`
    # said "internal error (BrokenPipeError)": a reader that stops early ends the process by SIGPIPE
    import os
    import signal

    for args in (
        ["check", str(sample("twin6/within.toml"))],
        ["fleet", "check", str(sample(".")), str(sample("fleet_day.csv")), "--no-log", "--json"],
    ):
        # the reader has stopped before the first write: `| head -c 10` raced the command (a
        # short output fits the pipe's buffer whole, and the command could end before head did)
        reader, writer = os.pipe()
        os.close(reader)
        try:
            run = subprocess.run(
                [sys.executable, "-m", "loadcheck", *args],
                stdout=writer,
                stderr=subprocess.PIPE,
                text=True,
                check=False,
            )
        finally:
            os.close(writer)
        assert run.returncode == -signal.SIGPIPE, (args, run.returncode, run.stderr)
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


def test_unknown_export_format_is_an_input_error_naming_the_field():
    # issue 21 (smaller): export_text raised a bare ValueError, outside the error hierarchy
    # the front ends turn into exit 2
    from loadcheck.checklog import export_text
    from loadcheck.errors import InputError

    with pytest.raises(InputError) as raised:
        export_text([], "xml")
    (problem,) = raised.value.problems
    assert problem.field == "format" and problem.value == "xml" and "csv or jsonl" in (problem.expected or "")


# `check within.toml --json` in a process of its own, once for the start-up tests below: its exit status, which of
# the modules it need not import it did import, whether main() froze the start-up's objects (gc.freeze)
_CHECK_JSON = (
    "import gc, sys; sys.argv = ['loadcheck', 'check', sys.argv[1], '--json']\n"
    "import loadcheck.cli as cli\n"
    "try:\n    cli.main()\nexcept SystemExit as stop:\n    code = stop.code\n"
    "loaded = [m for m in ('rich', 'loadcheck.checklog', 'sqlite3', 'csv') if m in sys.modules]\n"
    "print(code, loaded, file=sys.stderr)\n"
    "print(code, gc.get_freeze_count() > 10_000, file=sys.stderr)"
)


@pytest.fixture(scope="module")
def check_json_run() -> subprocess.CompletedProcess[str]:
    """One ``check within.toml --json`` run through ``cli.main()`` in a new process (``_CHECK_JSON``)."""
    return subprocess.run([sys.executable, "-c", _CHECK_JSON, WITHIN], capture_output=True, text=True, check=True)


def test_check_json_imports_neither_rich_nor_the_check_log_nor_sqlite(check_json_run, tmp_path):
    # start-up (issue 18 item 4): a check that records nothing asked the check log's module whether it
    # records (loadcheck.checklog.log_path), importing sqlite3 and csv for nothing; rich is for tables only
    assert check_json_run.stderr.splitlines()[0] == "0 []", check_json_run.stderr
    assert json.loads(check_json_run.stdout)["ok"] is True
    logged = subprocess.run(  # with --log it is imported and records
        [
            sys.executable,
            "-c",
            _CHECK_JSON.replace("'--json']", "'--json', '--log', '--db', sys.argv[2]]"),
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


def test_the_console_entry_leaves_its_objects_to_the_exit_untraversed(check_json_run):
    # start-up (issue 18 item 4): the interpreter's collections at exit went over every object once more
    # (about 5 % of a check's instructions, valgrind); main() freezes them once the command is done
    assert check_json_run.stderr.splitlines()[1] == "0 True", check_json_run.stderr
    assert json.loads(check_json_run.stdout)["ok"] is True  # the output is whole
