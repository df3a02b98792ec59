"""The dispatcher's commands (loadcheck/cli/dispatcher.py): fleet list, fleet check, the check
log's commands. The fleet's jobs behind them are in tests/test_fleet.py, the check log's in
tests/test_checklog.py."""

from __future__ import annotations

import re

from loadcheck.cli import app

from .helpers import assert_input_error, logged_checks, sample

DAY = str(sample("fleet_day.csv"))
SAMPLES_DIR = str(sample("."))


def test_fleet_check_logs_by_default_and_not_with_no_log(runner, tmp_path):
    db = tmp_path / "day.sqlite3"
    logged = runner.invoke(app, ["fleet", "check", SAMPLES_DIR, DAY, "--db", str(db)])
    assert logged.exit_code == 2  # the sample day holds malformed rows on purpose (docs/fleet.md)
    said = re.search(r"(\d+) check\(s\) recorded in the check log", logged.output)
    assert said and logged_checks(db) == int(said.group(1)) > 0, logged.output
    unlogged = tmp_path / "none.sqlite3"
    refused = runner.invoke(app, ["fleet", "check", SAMPLES_DIR, DAY, "--no-log", "--db", str(unlogged)])
    assert_input_error(refused, "--db", "--no-log")
    assert not unlogged.exists()
