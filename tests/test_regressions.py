"""Regression tests, each named after what broke (most found by tests/test_fuzz.py)."""

from __future__ import annotations

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
