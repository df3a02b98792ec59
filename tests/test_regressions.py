"""Regression tests, each named after what broke (most found by tests/test_fuzz.py)."""

from __future__ import annotations

import json

import pytest
from typer.testing import CliRunner

from loadcheck.cli import app

from .helpers import sample

runner = CliRunner()


def test_load_table_given_as_a_list_with_command_line_loads(tmp_path):
    # fuzz: `load = []` in a loading file plus --load crashed while merging (AttributeError)
    path = tmp_path / "loading.toml"
    path.write_text("load = []\n")
    result = runner.invoke(app, ["check", str(sample("trainer4/aircraft.toml")), str(path), "--load", "front=100"])
    assert result.exit_code == 2 and "load" in result.output and "internal error" not in result.output


def test_trip_time_on_the_command_line_replaces_the_files_trip():
    # a --trip-time/--rate laid over a loading file with `trip` was refused as "both given"
    result = runner.invoke(app, ["check", str(sample("trainer4/within.toml")), "--trip-time", "1:00", "--rate", "9", "--json"])
    assert result.exit_code == 0, result.output
    landing = json.loads(result.stdout)["conditions"][2]
    assert landing["fuel"] == pytest.approx(32 - 1.2 - 9)  # tabs, less taxi, less one hour at 9 gal/h
    back = runner.invoke(app, ["check", str(sample("tandem2/solo.toml")), "--trip", "10", "--json"])
    assert back.exit_code == 0, back.output


def test_a_new_empty_weight_carries_no_cached_fingerprint():
    # the mechanic's record built the weighed aircraft with model_copy, which copied the
    # cached fingerprint (and envelope shapes) of the old empty-weight record
    from loadcheck.extremes import extremes
    from loadcheck.files import load_aircraft

    before = load_aircraft(sample("trainer4/aircraft.toml"))
    old = before.fingerprint
    after = before.with_empty(before.empty.weight + 25.0, before.empty.arm + 0.5)
    assert after.fingerprint != old
    assert after.empty.weight == before.empty.weight + 25.0 and after.empty.date == before.empty.date
    assert before.with_empty(before.empty.weight, before.empty.arm).fingerprint == old
    assert extremes(after).to_dict() != extremes(before).to_dict()
