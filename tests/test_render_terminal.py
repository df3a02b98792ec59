"""The terminal tables (loadcheck/render/terminal.py): `show`, `validate`, the check's table and
its moment column, margins beside a finding."""

from __future__ import annotations

import re

from loadcheck import check_loading
from loadcheck.cli import app
from loadcheck.display import fmt

from .helpers import checked_sample as _inputs
from .helpers import sample


def test_show_lists_everything(runner, tmp_path):
    result = runner.invoke(
        app, ["show", str(sample("twin6/aircraft.toml")), "--chart", str(tmp_path / "e.png")], env={"COLUMNS": "200"}
    )  # every table side by side
    assert result.exit_code == 0, result.output
    for words in ["3,680.0 lb", "Main tanks", "600.0", "Middle seats", "(295.2, 3600)", "5,000.0 lb", "CAUTION"]:
        assert words in result.output
    assert (tmp_path / "e.png").stat().st_size > 2000
    assert runner.invoke(app, ["show", str(sample("twin6/aircraft.toml")), "--category", "nope"]).exit_code == 2


def test_moment_per_1000_column_where_the_envelope_is_read_so(runner, tmp_path):
    # issue 15, item 4: the twin's envelope is drawn as moment / 1000 (moment_scale = 1000 in its
    # file); the pilot compares that column with the chart
    inputs, check = _inputs("twin6/within.toml")
    (scale,) = {e.moment_scale for e in inputs.aircraft.envelope}
    assert scale == 1000
    out = runner.invoke(
        app, ["check", str(sample("twin6/within.toml")), "--sheet", str(tmp_path / "s.html")], env={"COLUMNS": "200"}
    ).output
    html = (tmp_path / "s.html").read_text()
    assert "Moment / 1000 (lb·in)" in out and "Moment / 1000 (lb·in)" in html
    for c in check.conditions:
        shown = f"{c.moment / scale:,.1f}"
        assert shown in out and shown in html
    plain = runner.invoke(app, ["check", str(sample("trainer4/within.toml"))], env={"COLUMNS": "200"}).output
    assert "Moment / 1000" not in plain  # the trainer's envelope is read as arm against weight


def test_weight_margin_set_by_a_sloping_edge_is_not_read_as_overweight():
    # regression (issue 15, item 4): beside a CG failure a negative weight margin read like overweight
    from rich.console import Console

    from loadcheck.loading import Loading, resolve_loading
    from loadcheck.render.terminal import render_check

    from .helpers import simple_aircraft

    aircraft = simple_aircraft(
        envelope=[
            {
                "category": "normal",
                "axes": ["arm", "weight"],
                "points": [[35.0, 900], [40.0, 1800], [40.0, 2000], [48.0, 2000], [48.0, 900]],
            }
        ]
    )
    loading = resolve_loading(Loading(load={"front": 500}, fuel={"main": 10}), aircraft)
    check = check_loading(aircraft, loading)
    takeoff = check.condition("takeoff")
    assert (
        takeoff.weight < aircraft.limits.max_takeoff_weight and takeoff.margins.weight < 0
    )  # under the maximum, over the edge
    assert not takeoff.ok
    console = Console(width=200, record=True, color_system=None)
    render_check(check, console)
    text = console.export_text()
    row = next(line for line in text.splitlines() if line.startswith("│ Takeoff"))
    assert f"{fmt(takeoff.margins.weight, 'lb', 'down', with_unit=False)} (edge)" in row
    assert "no maximum weight is exceeded" in text


def test_validate_counts_in_words(runner):
    # regression (issue 15, item 5): "1 tanks"
    out = runner.invoke(app, ["validate", str(sample("tandem2/aircraft.toml"))], env={"COLUMNS": "200"}).output
    assert "1 tank," in out and "1 tanks" not in out and "4 stations" in out


def test_regression_every_condition_holds_beside_a_zero_fuel_warning(runner):
    # tandem2/aft_ballast is within limits with a zero-fuel CG warning (zero_fuel_cg = "warning"):
    # the verdict said "every condition ... hold" under a Zero fuel row marked OUTSIDE (warning)
    result = runner.invoke(app, ["check", str(sample("tandem2/aft_ballast.toml"))], env={"COLUMNS": "120"})
    assert result.exit_code == 0, result.output
    assert "WARNING zero fuel" in result.output
    verdict = next(line for line in result.output.splitlines() if "WITHIN LIMITS" in line)
    assert "every condition, the burn path and every weight limit hold" not in verdict and "1 warning" in verdict
    within = runner.invoke(app, ["check", str(sample("trainer4/within.toml"))], env={"COLUMNS": "120"})
    assert "WITHIN LIMITS: every condition, the burn path and every weight limit hold." in within.output


PLAN_COMMANDS = [
    ["fuel", "trainer4/within.toml"],
    ["fuel", "heli2/trip_drop_off.toml"],
    ["stop", "heli2/trip_drop_off.toml", "--leg", "2"],
    ["trip", "trainer4/within.toml", "--rate", "9.5", "--reserve", "8"],
    ["payload", "trainer4/within.toml", "--station", "hold"],
    ["leave", "twin6/within.toml", "--station", "row3", "--payload", "200"],
    ["ballast", "tandem2/aft_heavy.toml"],
    ["shift", "tandem2/aft_heavy.toml", "--from", "baggage", "--to", "front"],
    ["table", "trainer4/within.toml", "--station", "rear"],
]


def test_plan_titles_wrapped_to_their_narrow_tables_at_80_columns(runner, monkeypatch):
    # "ramp fuel within limits (usgal)" was broken over two lines above a one-column table of 22 columns,
    # and plan table's header "Most ramp fuel (usgal)" over two lines of a table one column too wide
    from loadcheck.render.terminal import Column, fitted_tables

    monkeypatch.setenv("COLUMNS", "80")
    for command in PLAN_COMMANDS:
        out = runner.invoke(app, ["plan", command[0], str(sample(command[1])), *command[2:]]).stdout
        assert all(len(line.rstrip()) <= 80 for line in out.splitlines()), (command, out)
        assert not re.search(r"within\s*\n\s*limits|fuel\s*\n\s*\(usgal\)|limits\s*\n\s*\((usgal|lb|kg)\)", out), out
        if command[0] != "table":
            assert re.search(r"^\S.* within limits \((usgal|lb|kg)\)$", out, re.M), (command, out)  # a whole line
    table = runner.invoke(app, ["plan", "table", str(sample("trainer4/within.toml")), "--station", "rear"]).stdout
    assert "┃ Added at rear (lb) ┃ Most ramp fuel (usgal) ┃ Within limits (usgal) ┃" in table
    text, table = fitted_tables(80, "ramp fuel of leg 1 within limits (usgal)", [Column("within limits")], [["1"]])
    assert text.plain == "ramp fuel of leg 1 within limits (usgal)" and table.title is None
    (short,) = fitted_tables(80, "Conditions", [Column("within limits")], [["1"]])
    assert short.title == "Conditions"
