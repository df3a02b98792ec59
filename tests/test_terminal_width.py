"""Every command's terminal output at 60, 80 and 120 columns and piped (issue 15, item 1).

At each width, on standard output (error lines on stderr are written whole, one to a line,
so that they can be searched): no ellipsis, no line longer than the width, and every number of the wide
rendering (and of the check's JSON result, rounded as shown) present whole in the text.
A number cut at the edge of a column is as dangerous as a wrong one.

Paths are kept short (the tests run in a folder where ``s`` points at sample_aircraft/), so
every line, paths included, must fit.
"""

from __future__ import annotations

import json
import re
from collections import Counter
from typing import Any

import pytest

from loadcheck.cli import app
from loadcheck.display import fmt

from .helpers import SAMPLES, app_runner

WIDTHS = (60, 80, 120)
NUMBER = re.compile(r"-?\d[\d,]*(?:\.\d+)?")

COMMANDS = [
    ["check", "s/trainer4/aircraft.toml", "s/trainer4/within.toml"],
    ["check", "s/twin6/leaves_path.toml", "--plot"],
    ["check", "s/heli2/solo_heavy_right.toml", "--plot"],
    ["check", "s/tandem2/aft_heavy.toml"],
    ["check", "s/trainer4/over_weight.toml"],
    ["check", "s/twin6/zero_fuel_heavy.toml"],
    ["show", "s/trainer4/aircraft.toml"],
    ["show", "s/heli2/aircraft.toml"],
    ["show", "s/twin6/aircraft.toml"],
    ["show", "s/tandem2/aircraft.toml"],
    ["validate", "s/trainer4/aircraft.toml", "s/trainer4/within.toml"],
    ["plan", "fuel", "s/twin6/two_stretches.toml"],
    ["plan", "trip", "s/trainer4/within.toml", "--rate", "9.5", "--reserve", "8"],
    ["plan", "payload", "s/trainer4/within.toml", "--station", "hold"],
    ["plan", "leave", "s/twin6/within.toml", "--station", "row3", "--payload", "340"],
    ["plan", "ballast", "s/tandem2/aft_heavy.toml"],
    ["plan", "shift", "s/tandem2/aft_heavy.toml", "--from", "baggage", "--to", "front"],
    ["plan", "table", "s/trainer4/within.toml", "--station", "rear"],
    ["weigh", "s/trainer4/aircraft.toml", "s/trainer4/weighing.toml"],
    ["alter", "s/trainer4/aircraft.toml", "s/trainer4/changes.toml"],
    ["history", "s/trainer4/aircraft.toml"],
    ["extremes", "s/tandem2/aircraft.toml"],
    ["schedule", "s/twin6/aircraft.toml"],
    ["fleet", "list", "s"],
    ["fleet", "check", "s", "s/fleet_day.csv", "--log", "--db", "r.sqlite3"],
    ["log", "list", "--db", "r.sqlite3"],
    ["log", "verify", "1", "--db", "r.sqlite3"],
]
HELP = [
    [],
    ["check"],
    ["show"],
    ["validate"],
    ["schema"],
    ["plan"],
    ["plan", "fuel"],
    ["plan", "trip"],
    ["plan", "payload"],
    ["plan", "leave"],
    ["plan", "ballast"],
    ["plan", "shift"],
    ["plan", "table"],
    ["weigh"],
    ["alter"],
    ["history"],
    ["extremes"],
    ["schedule"],
    ["fleet"],
    ["fleet", "list"],
    ["fleet", "check"],
    ["log"],
    ["log", "list"],
    ["log", "show"],
    ["log", "export"],
    ["log", "verify"],
]


@pytest.fixture(scope="module")
def folder(tmp_path_factory):
    """A folder with ``s`` -> sample_aircraft and a check log ``r.sqlite3`` holding one day."""
    root = tmp_path_factory.mktemp("width")
    (root / "s").symlink_to(SAMPLES, target_is_directory=True)
    return root


def _run(folder, monkeypatch, args, columns, **env):
    monkeypatch.chdir(folder)
    if args[:2] != ["fleet", "check"] and not (folder / "r.sqlite3").exists():
        app_runner().invoke(
            app, ["fleet", "check", "s", "s/fleet_day.csv", "--log", "--db", "r.sqlite3"], env={"COLUMNS": "200"}
        )
    return app_runner().invoke(app, args, env={"COLUMNS": str(columns), **env})


def _fits(text: str, width: int) -> None:
    assert "…" not in text
    too_long = [line for line in text.splitlines() if len(line) > width]
    assert not too_long, f"lines over {width} columns:\n" + "\n".join(too_long)


def _numbers(text: str) -> Counter[str]:
    return Counter(NUMBER.findall(text))


_WIDE: dict[tuple[str, ...], Any] = {}


def _wide(folder, monkeypatch, args):
    """A command's output at 400 columns, the numbers every narrower rendering must keep (run
    once per command and process, however many widths are checked)."""
    key = tuple(args)
    if key not in _WIDE:
        _WIDE[key] = _run(folder, monkeypatch, args, 400)
    return _WIDE[key]


@pytest.mark.parametrize(
    "width", [WIDTHS[0], *(pytest.param(w, marks=pytest.mark.slow) for w in WIDTHS[1:])]
)  # the narrowest by default; 80 and 120 with --long (the check's numbers at every width: below)
@pytest.mark.parametrize("args", COMMANDS, ids=" ".join)
def test_every_command_fits_every_width_and_keeps_every_number(folder, monkeypatch, args, width):
    wide = _wide(folder, monkeypatch, args)
    assert wide.exit_code in (0, 1, 2) and "Traceback" not in wide.output
    assert "CAUTION" in wide.output
    narrow = _run(folder, monkeypatch, args, width)
    assert narrow.exit_code == wide.exit_code
    _fits(narrow.stdout, width)
    missing = _numbers(wide.stdout) - _numbers(narrow.stdout)
    assert not missing, f"numbers cut or lost at {width} columns: {sorted(missing)}"


_HELP_SCRIPT = """
import json, sys
from loadcheck.cli import app
out = {}
for args in json.loads(sys.argv[1]):
    import io, contextlib
    buffer = io.StringIO()
    with contextlib.redirect_stdout(buffer):
        try:
            app(args + ["--help"], prog_name="loadcheck")
        except SystemExit:
            pass
    out[" ".join(args)] = buffer.getvalue()
print(json.dumps(out))
"""


@pytest.mark.parametrize(
    "width", [WIDTHS[0], *(pytest.param(w, marks=pytest.mark.slow) for w in WIDTHS[1:])]
)  # the narrowest by default
def test_help_fits_and_never_breaks_a_word(width):
    # a real process: the test runner fixes help at 80 columns, a terminal does not
    import os
    import subprocess
    import sys

    env = {**os.environ, "COLUMNS": str(width), "PYTHONPATH": str(SAMPLES.parent)}
    done = subprocess.run(
        [sys.executable, "-c", _HELP_SCRIPT, json.dumps(HELP)],
        capture_output=True,
        text=True,
        env=env,
        check=True,
        cwd=SAMPLES.parent,
    )
    helps = json.loads(done.stdout)
    assert len(helps) == len(HELP)
    for name, text in helps.items():
        assert text.startswith("Usage: loadcheck"), name
        _fits(text, width)
        assert "<list[str]>" not in text and "<str>" not in text and "<float>" not in text, name
        # no option, path or example broken across lines (the "--no-" / "record" of issue 15)
        assert not re.search(r"(--[a-z-]*-|/)\n", text), name
        assert not re.search(r"\{[a-z]", text), name  # argument names in capitals, as everywhere else
        assert not re.search(r"[a-z,]\.\.\.$", text, re.M), name  # no command summary cut short with "..."


@pytest.mark.parametrize(
    "name",
    [
        "trainer4/within.toml",
        "twin6/leaves_path.toml",
        "heli2/solo_heavy_right.toml",
        "tandem2/aft_heavy.toml",
        "trainer4/over_weight.toml",
    ],
)
@pytest.mark.parametrize("width", (*WIDTHS, None))
def test_every_number_of_the_check_result_is_shown_whole(runner, folder, monkeypatch, name, width):
    data = json.loads(_run(folder, monkeypatch, ["check", f"s/{name}", "--json"], 80).output)
    env = {} if width is None else {"COLUMNS": str(width)}
    monkeypatch.delenv("COLUMNS", raising=False)
    out = runner.invoke(app, ["check", f"s/{name}"], env=env).output  # piped: COLUMNS, else 80
    _fits(out, width or 80)
    shown = set(NUMBER.findall(out))
    units = data["units"]
    expected = []
    for item in data["items"]:
        expected += [
            fmt(item["weight"], units["mass"], with_unit=False),
            fmt(item["arm"], units["arm"], with_unit=False),
            fmt(item["moment"], units["moment"], with_unit=False),
        ]
    for c in data["conditions"]:
        expected += [
            fmt(c["weight"], units["mass"], with_unit=False),
            fmt(c["arm"], units["arm"], with_unit=False),
            fmt(c["fuel"], units["fuel_volume"], with_unit=False),
        ]
        expected += [
            fmt(v, units["mass" if k == "weight" else "arm"], "down", with_unit=False) for k, v in c["margins"].items()
        ]
        if "mac_percent" in c:
            expected.append(fmt(c["mac_percent"], "%MAC", with_unit=False))
    missing = [n for n in expected if n not in shown]
    assert not missing, missing


def test_piped_output_defaults_to_80_columns(runner, folder, monkeypatch):
    monkeypatch.chdir(folder)
    monkeypatch.delenv("COLUMNS", raising=False)
    out = runner.invoke(app, ["check", "s/trainer4/aircraft.toml", "s/trainer4/within.toml"]).output
    assert max(len(line) for line in out.splitlines()) == 80  # the tables and the caution use the width


@pytest.mark.parametrize("args", [COMMANDS[1], COMMANDS[6], COMMANDS[24]], ids=" ".join)
def test_no_color_means_no_escape_codes(folder, monkeypatch, args):
    coloured = _run(folder, monkeypatch, args, 80, FORCE_COLOR="1")
    assert "\x1b[" in coloured.output  # forced to a terminal, the output is styled...
    plain = _run(folder, monkeypatch, args, 80, FORCE_COLOR="1", NO_COLOR="1")
    assert "\x1b" not in plain.output  # ...and NO_COLOR takes every escape code away
    assert "CAUTION" in plain.output


def test_fleet_check_row_with_warnings_is_not_shown_as_plain_within(folder, monkeypatch, tmp_path):
    # regression (issue 13 item 12): a flight within limits but landing below its reserve read "within"
    day = tmp_path / "day.csv"
    day.write_text(
        "registration,reference,front,rear,mains,centre,taxi,trip,reserve\nDEMO-4T,W1,340,150,school,0,1.2,18,20\n"
    )
    out = _run(folder, monkeypatch, ["fleet", "check", "s", str(day), "--no-log"], 120).output
    lines = out.splitlines()
    start = next(i for i, line in enumerate(lines) if "DEMO-4T" in line)
    row = " ".join(lines[start : start + 3])
    assert "within, 1 warning" in lines[start] and "WARNING:" in row and "reserve" in row
    assert "│ within " not in lines[start]
    assert "1 within limits (1 with warnings)" in out


def test_a_table_too_wide_even_in_blocks_is_listed_row_by_row():
    from rich.console import Console

    from loadcheck.render.terminal import Column, fitted_tables

    columns = [Column("Condition", numeric=False, key=True), Column("Weight (lb)"), Column("Moment (lb·in)")]
    rows = [["Ramp", "12,345,678.9", "1,234,567,890"], ["Takeoff", "12,345,600.0", "1,234,500,000"]]
    assert len(fitted_tables(80, "T", columns, rows)) == 1  # wide enough: one table
    assert len(fitted_tables(36, "T", columns, rows)) == 2  # two blocks, the condition repeated in each
    (listed,) = fitted_tables(24, "T", columns, rows)  # not even one number beside the names: listed
    console = Console(width=24, record=True, color_system=None)
    console.print(listed)
    text = console.export_text()
    _fits(text, 24)
    for row in rows:
        for cell in row:
            assert cell in text
