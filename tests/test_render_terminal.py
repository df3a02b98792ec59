"""The terminal tables (loadcheck/render/terminal.py): `show`, `validate`, the check's table and
its moment column, margins beside a finding."""

from __future__ import annotations

import json
import re

import pytest

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


# -- every answer that proposes a loading shows the loading it checked (outside review, 2026-12-02) ----

CHECKED_ANSWERS = [["plan", *c] for c in PLAN_COMMANDS if c[0] != "table"] + [
    ["schedule", "tandem2/aircraft.toml"],
    ["extremes", "tandem2/aircraft.toml"],
    ["extremes", "twin6/aircraft.toml"],
]


def _checks(answer: dict) -> list[dict]:
    """The checks an answer's JSON carries: a plan's, each leg of a trip plan's, each case's or extreme's."""
    if "cases" in answer:
        return [case["check"] for case in answer["cases"]]
    if "forward" in answer:
        return [answer["forward"]["check"], answer["rearward"]["check"]]
    if answer.get("trip") is not None:
        return [leg for leg in answer["trip"]["legs"]]
    return [answer["check"]]


def _flat(text: str) -> str:
    return " ".join(text.split())


@pytest.mark.parametrize("command", CHECKED_ANSWERS, ids=lambda c: " ".join(c[:3]))
def test_regression_planning_schedule_and_extremes_left_out_the_checked_loading(runner, command):
    # outside review item 1 (safety): `plan fuel trainer4/within.toml` printed only "ramp fuel: 34.3 usgal"
    # though the loading it checked puts 26.95 usgal in the mains and 7.35 in the centre tank (the fill
    # order), and `plan ballast` printed "within limits" with no finding text under an OUTSIDE (warning)
    # row. Each must show what `check` shows of that loading: every station's weight and every tank's
    # fuel (the moment table), the burn-path line, the findings and the verdict sentence. Common practice:
    # a pilot loads from the figures that were checked, and reads the findings beside the verdict.
    from loadcheck.words import within_limits_text

    name = 2 if command[0] == "plan" else 1  # the sample file's place in the command
    args = [*command[:name], str(sample(command[name])), *command[name + 1 :]]
    answer = json.loads(runner.invoke(app, [*args, "--json"]).stdout)
    out = runner.invoke(app, args, env={"COLUMNS": "200"}).stdout
    flat = _flat(out)
    checks = _checks(answer)
    assert out.count("Moment table (engine start)") == len(checks), out
    assert out.count("Fuel burn, takeoff to landing:") == len(checks), out
    assert "The loading at this answer is within limits." not in out
    for check in checks:
        units = check["units"]
        for item in check["items"]:
            label = item["name"]
            if item.get("fuel_volume") is not None:
                label += f" ({fmt(item['fuel_volume'], units['fuel_volume'])})"
            assert f"│ {label} │ {fmt(item['weight'], units['mass'], with_unit=False)} │" in flat, (label, out)
        for finding in check["findings"]:
            assert _flat(finding["message"]) in flat, (finding, out)
        if "leg" in check:  # a trip plan: each leg as `check` shows a trip's leg, then the trip's verdict
            continue
        warnings = sum(f["severity"] == "warning" for f in check["findings"])
        limits = sum(f["severity"] == "limit" for f in check["findings"])
        verdict = (
            f"WITHIN LIMITS: {within_limits_text(warnings)}"
            if check["ok"]
            else f"OUT OF LIMITS: {limits} {'limit' if limits == 1 else 'limits'} exceeded."
        )
        assert verdict in flat, (verdict, out)
    if answer.get("trip") is not None:
        assert ("WITHIN LIMITS on every leg" if answer["trip"]["ok"] else "OUT OF LIMITS on") in flat
    narrow = runner.invoke(app, args, env={"COLUMNS": "80"}).stdout
    assert all(len(line.rstrip()) <= 80 for line in narrow.splitlines()), narrow


def test_regression_plan_ballast_hid_the_zero_fuel_warning_that_check_prints(runner):
    # outside review item 1: `plan ballast tandem2/aft_heavy.toml` showed "Zero fuel ... OUTSIDE (warning)"
    # then "The loading at this answer is within limits." with no finding, while `check --load ballast=...`
    # of the same loading prints the warning, the burn-path line and the verdict. The answer must print
    # exactly what check prints from the burn-path line to the caution.
    loading = str(sample("tandem2/aft_heavy.toml"))
    answer = json.loads(runner.invoke(app, ["plan", "ballast", loading, "--json"]).stdout)
    plan = runner.invoke(app, ["plan", "ballast", loading], env={"COLUMNS": "80"}).stdout
    check = runner.invoke(
        app, ["check", loading, "--load", f"ballast={answer['answer']!r}"], env={"COLUMNS": "80"}
    ).stdout
    tail = check[check.index("Fuel burn, takeoff to landing:") : check.index("CAUTION:")]
    assert "WARNING zero fuel CG" in tail and "WITHIN LIMITS:" in tail and "1 warning" in tail
    assert tail in plan, (tail, plan)


def test_regression_condition_rows_read_within_beside_a_burn_path_limit(runner):
    # outside review item 2: in `check twin6/leaves_path.toml` every condition row's "Result" read "within"
    # beside the finding that the CG leaves the envelope during the burn (the loading is out of limits).
    # A condition's own state is now "inside"/"OUTSIDE" under a heading that says what it is; "within"
    # is said only of the loading, once, in its verdict.
    from loadcheck.render.terminal import CONDITION_STATE_HEADING, condition_verdict

    result = runner.invoke(app, ["check", str(sample("twin6/leaves_path.toml"))], env={"COLUMNS": "200"})
    assert result.exit_code == 1
    out = result.output
    rows = [line for line in out.splitlines() if re.match(r"│ (Ramp|Takeoff|Landing|Zero fuel) ", line)]
    assert len(rows) == 4 and all("│ inside " in row and "within" not in row for row in rows), rows
    assert f"┃ {CONDITION_STATE_HEADING} " in out and "┃ Result " not in out
    assert "LIMIT the CG leaves the normal-category envelope during the fuel burn" in out and "OUT OF LIMITS" in out
    _, check = _inputs("twin6/leaves_path.toml")
    assert not check.ok and all(condition_verdict(c, check) == ("inside", "ok") for c in check.conditions)
    _, warned = _inputs("tandem2/aft_ballast.toml")  # the zero-fuel CG checked only as a warning
    assert condition_verdict(warned.condition("zero_fuel"), warned) == ("OUTSIDE (warning)", "warning")


@pytest.mark.parametrize("name", ["twin6/within.toml", "heli2/dual.toml"])
def test_regression_item_names_take_the_room_they_need_and_no_number_is_cut(runner, monkeypatch, name):
    """twin6's and heli2's moment tables wrapped every item name one word per line at 80 columns while the
    number columns took the room for their headers. Names now get the room first (a header wraps sooner
    than a name); at 80 and 60 columns every figure of the table is still printed whole."""
    _, result = _inputs(name)
    units = result.units
    for width in ("80", "60"):
        monkeypatch.setenv("COLUMNS", width)
        out = runner.invoke(app, ["check", str(sample(name))]).stdout
        assert all(len(line.rstrip()) <= int(width) for line in out.splitlines())
        for item in result.items:
            for value, unit in ((item.weight, units.mass), (item.arm, units.arm), (item.moment, units.moment)):
                assert re.search(rf"(?<![\d,.]){re.escape(fmt(value, unit, with_unit=False))}(?![\d,])", out), (
                    width,
                    item.name,
                    value,
                )
        if width == "80":
            rows = [line for line in out.splitlines() if line.startswith("│")]
            for item in result.items:
                whole = item.name + (f" ({fmt(item.fuel_volume, units.fuel_volume)})" if item.fuel_volume else "")
                if len(whole) <= 27:  # the room left beside the numbers at 80 columns (the widest sample table)
                    assert any(f"│ {whole} " in row for row in rows), (item.name, out)


def test_regression_a_margin_shown_as_zero_is_on_the_edge_not_beyond_it(runner, monkeypatch):
    """schedule showed "0.0 (edge)" where docs/cli.md says (edge) marks a margin below zero: twin6's full-fuel
    case takes off at exactly its maximum takeoff weight (5,500 lb, the aircraft file), so its weight margin is
    zero to within floating-point noise and the condition is inside (limits are inclusive, DESIGN.md). A
    margin shown as 0.0 now carries no mark; one shown below zero still does (the test above)."""
    from loadcheck.files import load_aircraft
    from loadcheck.render.terminal import weight_margin
    from loadcheck.schedule import loading_schedule

    aircraft = load_aircraft(sample("twin6/aircraft.toml"))
    result = loading_schedule(aircraft)
    takeoffs = [case.check.condition("takeoff") for case in result.cases]
    at_maximum = [t for t in takeoffs if abs(t.weight - aircraft.limits.max_takeoff_weight) < 1e-6]
    assert at_maximum and all(t.ok for t in at_maximum)
    for case in result.cases:
        shown, marked = weight_margin(case.check.condition("takeoff"), case.check)
        assert marked == shown.startswith("-")
    monkeypatch.setenv("COLUMNS", "120")
    out = runner.invoke(app, ["schedule", str(sample("twin6/aircraft.toml"))]).stdout
    assert "0.0 (edge)" not in out and "(edge)" not in out


def test_regression_show_gives_the_fill_levels_unit(runner, monkeypatch):
    """show printed "Levels: standard 70" (no unit). trainer4's aircraft file gives mains levels
    { school = 30 } in its fuel volume unit, US gallons."""
    monkeypatch.setenv("COLUMNS", "120")
    out = runner.invoke(app, ["show", str(sample("trainer4/aircraft.toml"))]).stdout
    assert "Levels (usgal)" in out and "school 30.0" in out
    monkeypatch.setenv("COLUMNS", "30")  # the tanks' table in blocks: the levels' block keeps its unit
    narrow = runner.invoke(app, ["show", str(sample("trainer4/aircraft.toml"))]).stdout
    assert "┃ Levels (usgal) ┃" in narrow and "school 30.0" in narrow


def test_regression_the_desk_shows_the_terminals_units_and_condition_states(reading_desk, runner, monkeypatch):
    """The desk wrote the moment unit as kg*mm (the terminal: kg·mm, SI Brochure 5.4.6) and each condition's
    state as "within", the loading's verdict word; it now uses the terminal's helpers (unit_label,
    condition_verdict) and its one rounding rule (fmt): the same figures, units and words."""
    pytest.importorskip("fastapi")
    from .web_helpers import _client, _post_check

    values = {"load.front": "58", "load.rear": "110", "load.baggage": "20", "fuel.wing": "30"}
    values |= {"burn.taxi": "1", "burn.trip": "10"}
    page = _post_check(_client(reading_desk, "pia"), values, "DEMO-2T").text
    text = re.sub(r"\s+", " ", re.sub(r"<[^>]+>", " ", page))
    assert "Moment (kg·mm)" in text and "kg*mm" not in text
    monkeypatch.setenv("COLUMNS", "200")
    args = ["check", str(sample("tandem2/aircraft.toml"))]
    for key, value in values.items():
        table, name = key.split(".")
        args += {"load": ["--load"], "fuel": ["--fuel"], "burn": [f"--{name}"]}[table] + (
            [f"{name}={value}"] if table != "burn" else [value]
        )
    out = runner.invoke(app, args)
    rows = {line.split("│")[1].strip(): line for line in out.stdout.splitlines() if line.startswith("│")}
    for condition in ("Ramp", "Takeoff", "Landing"):
        cg, state = [cell.strip() for cell in rows[condition].split("│")][4], "OUTSIDE"
        assert re.search(rf"{condition.lower()} [\d.,]+ [\d.,]+ {cg} {state} ", text), (condition, cg, text)
    assert " within " not in text.split("Conditions and margins")[1].split("Margins are")[0]


def test_regression_a_recorded_checks_page_gives_each_condition_state_in_the_terminals_words(desk):
    """The record page said "within" of each condition (the loading's verdict word, DESIGN.md); it now says
    inside / OUTSIDE as the terminal does, by the same function, from the record's JSON."""
    pytest.importorskip("fastapi")
    from .web_helpers import _client, _post_check

    client = _client(desk, "pia")
    values = {"load.front": "58", "load.rear": "110", "load.baggage": "20", "fuel.wing": "30"}
    recorded = _post_check(client, {**values, "burn.taxi": "1", "burn.trip": "10"}, "DEMO-2T", route="record")
    assert recorded.status_code == 303, recorded.text
    page = client.get(recorded.headers["location"]).text
    table = page.split("Conditions")[1].split("</table>")[0]
    cells = re.findall(r"<td>(?:<strong>)?(inside|OUTSIDE|within|outside)[^<]*", table)
    # tandem2/aft_heavy's figures: ramp, takeoff and landing aft of the envelope, zero fuel a warning
    assert cells == ["OUTSIDE", "OUTSIDE", "OUTSIDE", "OUTSIDE"], table
    assert "OUTSIDE (warning)" in table and "within" not in table


def test_regression_a_wrapped_note_keeps_its_indent(runner, monkeypatch):
    """extremes and schedule printed their notes indented by two, but a note wrapped at 60 columns went on
    at the margin ("limit" alone under "  Left seat: ..."), reading as a heading of its own."""
    monkeypatch.setenv("COLUMNS", "60")
    out = runner.invoke(app, ["extremes", str(sample("heli2/aircraft.toml"))]).stdout.splitlines()
    start = next(i for i, line in enumerate(out) if line.startswith("  Left seat"))
    end = next(i for i, line in enumerate(out) if line.startswith("  fuel states checked"))
    assert end > start + 1 and all(line.startswith("  ") for line in out[start:end]), out[start:end]
    assert any(line.strip() == "limit" for line in out[start:end])  # the wrap this test is about happens


def test_regression_a_weight_margin_short_of_a_notch_is_not_called_exceeded():
    """Trial 13, D11: in a notch of a non-convex envelope a weight margin below zero (edge) is the weight
    SHORT of the part of the envelope above the point, but the note said "below zero: exceeded", which
    reads as that much too heavy; taking it off leaves the point in the notch. The notes now say that an
    (edge) margin below zero does not say which way to go, and that it can be the weight short.

    Invented aircraft (tests/helpers.py simple_aircraft) with a notch in its aft edge, (48, 1600) to
    (44, 1400) to (48, 1200). By hand (sum of moments, FAA-H-8083-1B chapter 2): 1,000 lb at 40 in,
    200 lb at 35, 200 lb at 70, 60 lb at 95: W = 1,460 lb, M = 66,700 lb.in, CG = 45.685 in. At that CG
    the envelope holds weights up to 1,400 - 84.2 = 1,315.8 lb and from 1,400 + 84.2 = 1,484.2 lb; the
    point is in the notch, 24.2 lb short of the part above (margin -24.2), and aft of the aft limit at
    its weight, 44 + 60 / 50 = 45.2 in, by 0.485 in."""
    from rich.console import Console

    from loadcheck.loading import Loading, resolve_loading
    from loadcheck.render.terminal import EDGE_NOTE, MARGIN_NOTE, render_check

    from .helpers import simple_aircraft

    notch = [[35.0, 900], [35.0, 2000], [48.0, 2000], [48.0, 1600], [44.0, 1400], [48.0, 1200], [48.0, 900]]
    aircraft = simple_aircraft(envelope=[{"category": "normal", "axes": ["arm", "weight"], "points": notch}])
    loading = Loading(load={"front": 200, "rear": 200, "bag": 60}, fuel={"main": 0}, burn={"taxi": 0, "trip": 0})
    check = check_loading(aircraft, resolve_loading(loading, aircraft))
    takeoff = check.condition("takeoff")
    cg = 66700.0 / 1460.0
    assert takeoff.weight == pytest.approx(1460.0) and takeoff.arm == pytest.approx(cg)
    assert takeoff.margins.weight == pytest.approx(1460.0 - (1400.0 + (cg - 44.0) * 50.0))  # -24.2: short
    assert takeoff.margins.aft == pytest.approx((44.0 + 60.0 / 50.0) - cg)  # -0.485
    console = Console(width=200, record=True, color_system=None)
    render_check(check, console)
    printed = console.export_text()
    text = " ".join(printed.split())
    row = next(line for line in printed.splitlines() if line.startswith("│ Takeoff"))
    assert "-24.3 (edge)" in row  # rounded down, as every margin
    assert "(below zero: exceeded)" not in text and "unless marked otherwise" in MARGIN_NOTE
    assert "weight short of the part of the envelope above it" in text
    assert "taking the weight off does not bring it inside" in text and "which way to go" in EDGE_NOTE
