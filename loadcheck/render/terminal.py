"""Rich terminal output of a loading check: moment table, conditions, findings, caution.

Renderers compute nothing: every figure comes from the result; they only round (in the
safe direction for margins and excesses, see :mod:`loadcheck.display`) and lay out.
Meaning never rests on colour alone: every verdict is also written in words.
"""

from __future__ import annotations

from collections.abc import Sequence
from typing import TYPE_CHECKING, Any

from rich.console import Console, Group
from rich.panel import Panel
from rich.table import Table
from rich.text import Text

from ..aircraft import Aircraft
from ..display import fmt
from ..results import CheckResult, Condition
from ..words import burn_path_summary, stretch_text

if TYPE_CHECKING:
    from ..planning import PlanResult, TableRow

__all__ = [
    "caution_text",
    "render_aircraft",
    "render_alteration",
    "render_check",
    "render_comparison",
    "render_extremes",
    "render_fleet",
    "render_fleet_list",
    "render_history",
    "render_plan",
    "render_schedule",
    "render_table",
    "render_weighing",
]

_NAMES = {"ramp": "Ramp", "takeoff": "Takeoff", "landing": "Landing", "zero_fuel": "Zero fuel"}
_OK_STYLE, _LIMIT_STYLE, _WARN_STYLE = "bold green", "bold red", "bold yellow"


def caution_text(caution: str) -> Text:
    """The caution, set apart at the end of every human-readable output."""
    return Text(f"CAUTION: {caution}", style="italic")


def _moment_table(result: CheckResult) -> Table:
    units = result.units
    lateral = any(i.lateral_arm is not None for i in result.items)
    table = Table(title="Moment table (engine start)", title_justify="left", expand=False)
    table.add_column("Item")
    table.add_column(f"Weight ({units.mass})", justify="right")
    table.add_column(f"Arm ({units.arm})", justify="right")
    table.add_column(f"Moment ({units.moment})", justify="right")
    if lateral:
        table.add_column(f"Lat. arm ({units.arm}, + right)", justify="right")
        table.add_column(f"Lat. moment ({units.moment})", justify="right")
    for item in result.items:
        name = item.name
        if item.fuel_volume is not None:
            name += f" ({fmt(item.fuel_volume, units.fuel_volume)})"
        row = [name, fmt(item.weight, units.mass, with_unit=False), fmt(item.arm, units.arm, with_unit=False),
               fmt(item.moment, units.moment, with_unit=False)]
        if lateral:
            row += [fmt(item.lateral_arm or 0.0, units.arm, with_unit=False),
                    fmt(item.lateral_moment or 0.0, units.moment, with_unit=False)]
        table.add_row(*row)
    ramp = result.condition("ramp")
    total = ["Total at ramp", fmt(ramp.weight, units.mass, with_unit=False), fmt(ramp.arm, units.arm, with_unit=False),
             fmt(ramp.moment, units.moment, with_unit=False)]
    if lateral:
        total += [fmt(ramp.lateral_arm or 0.0, units.arm, with_unit=False),
                  fmt(ramp.lateral_moment or 0.0, units.moment, with_unit=False)]
    table.add_section()
    table.add_row(*total, style="bold")
    return table


def _margin(value: float | None, unit: str) -> str:
    return "" if value is None else fmt(value, unit, "down", with_unit=False)


def _conditions_table(result: CheckResult) -> Table:
    units = result.units
    conditions = result.conditions
    mac = any(c.mac_percent is not None for c in conditions)
    lateral = any(c.lateral_arm is not None for c in conditions)
    table = Table(title=f"Conditions ({result.category} category)", title_justify="left")
    table.add_column("Condition")
    table.add_column(f"Fuel ({units.fuel_volume})", justify="right")
    table.add_column(f"Weight ({units.mass})", justify="right")
    table.add_column(f"CG ({units.arm})", justify="right")
    if mac:
        table.add_column("CG (%MAC)", justify="right")
    if lateral:
        table.add_column(f"Lat. CG ({units.arm})", justify="right")
    table.add_column(f"Fwd margin ({units.arm})", justify="right")
    table.add_column(f"Aft margin ({units.arm})", justify="right")
    if lateral:
        table.add_column(f"Left / right margin ({units.arm})", justify="right")
    table.add_column(f"Weight margin ({units.mass})", justify="right")
    table.add_column("Result")
    for condition in conditions:
        table.add_row(*_condition_row(condition, result, mac, lateral))
    return table


def _condition_row(c: Condition, result: CheckResult, mac: bool, lateral: bool) -> list[str | Text]:
    units = result.units
    row: list[str | Text] = [
        _NAMES[c.condition],
        fmt(c.fuel, units.fuel_volume, with_unit=False),
        fmt(c.weight, units.mass, with_unit=False),
        fmt(c.arm, units.arm, with_unit=False),
    ]
    if mac:
        row.append("" if c.mac_percent is None else fmt(c.mac_percent, "%MAC", with_unit=False))
    if lateral:
        row.append("" if c.lateral_arm is None else fmt(c.lateral_arm, units.arm, with_unit=False))
    row += [_margin(c.margins.forward, units.arm), _margin(c.margins.aft, units.arm)]
    if lateral:
        row.append(f"{_margin(c.margins.left, units.arm)} / {_margin(c.margins.right, units.arm)}")
    row.append(_margin(c.margins.weight, units.mass))
    if c.ok:
        row.append(Text("within", style=_OK_STYLE))
    else:
        only_warnings = all(
            f.severity == "warning" for f in result.findings if f.condition == c.condition
        )
        row.append(Text("OUTSIDE (warning)" if only_warnings else "OUTSIDE", style=_WARN_STYLE if only_warnings else _LIMIT_STYLE))
    return row


def _burn_line(result: CheckResult) -> Text:
    return Text(burn_path_summary(result), style="" if result.burn_path.ok else _LIMIT_STYLE)


def _findings(result: CheckResult) -> Group | Text:
    if not result.findings:
        return Text("No findings.")
    lines = []
    for finding in result.findings:
        tag = "LIMIT  " if finding.severity == "limit" else "WARNING"
        style = _LIMIT_STYLE if finding.severity == "limit" else _WARN_STYLE
        line = Text()
        line.append(f"{tag} ", style=style)
        line.append(finding.message)
        lines.append(line)
    return Group(Text("Findings", style="bold"), *lines)


def render_check(result: CheckResult, console: Console, plot: Sequence[str] = ()) -> None:
    """Print a check: header, moment table, conditions, burn path, findings, verdict, the
    lines of a text plot if given, and last the caution."""
    info = result.aircraft
    header = info.name + (f" · {info.registration}" if info.registration else "")
    header += f" · {result.category} category · data {info.fingerprint}"
    if info.empty_weight_date:
        header += f" · empty weight of {info.empty_weight_date}"
    console.print(Text(header, style="bold"))
    console.print(_moment_table(result))
    console.print(_conditions_table(result))
    console.print(Text("Margins are rounded down; an excess is rounded up.", style="dim"))
    console.print(_burn_line(result))
    console.print(_findings(result))
    verdict = (
        Text("WITHIN LIMITS: every condition, the burn path and every weight limit hold.", style=_OK_STYLE)
        if result.ok
        else Text(f"OUT OF LIMITS: {len(result.limits_exceeded)} limit(s) exceeded.", style=_LIMIT_STYLE)
    )
    console.print(Panel(verdict, expand=False))
    for line in plot:
        console.print(line, markup=False, highlight=False)
    console.print(caution_text(result.caution))


def render_aircraft(aircraft: Aircraft, console: Console, caution: str) -> None:
    """Print an aircraft's data: units, empty weight, limits, stations, groups, tanks, envelopes."""
    units = aircraft.units
    empty = aircraft.empty
    limits = aircraft.limits
    console.print(Text(aircraft.name + (f" · {aircraft.registration}" if aircraft.registration else ""), style="bold"))
    console.print(f"Units: mass {units.mass}, arm {units.arm} (aft of datum; lateral + right), fuel {units.fuel_volume}"
                  f" · data {aircraft.fingerprint}")
    record = Table(title="Empty-weight record and limits", title_justify="left", show_header=False)
    record.add_column("What")
    record.add_column("Value", justify="right")
    record.add_row("Basic empty weight", fmt(empty.weight, units.mass))
    record.add_row("Empty-weight CG", fmt(empty.arm, units.arm))
    if empty.lateral_arm is not None:
        record.add_row("Empty-weight lateral CG", fmt(empty.lateral_arm, units.arm))
    record.add_row("Empty-weight moment", fmt(empty.moment, units.moment))
    record.add_row("Record dated", str(empty.date or "not dated"))
    if empty.basis:
        record.add_row("Basis", empty.basis)
    record.add_row("Useful load (max takeoff less empty)", fmt(aircraft.useful_load, units.mass))
    record.add_row("Max ramp weight", fmt(limits.ramp, units.mass))
    record.add_row("Max takeoff weight", fmt(limits.max_takeoff_weight, units.mass))
    record.add_row("Max landing weight", fmt(limits.landing, units.mass))
    if limits.max_zero_fuel_weight is not None:
        record.add_row("Max zero-fuel weight", fmt(limits.max_zero_fuel_weight, units.mass))
    if limits.min_flight_weight is not None:
        record.add_row("Min flight weight", fmt(limits.min_flight_weight, units.mass))
    record.add_row("Zero-fuel CG", "a limit" if limits.zero_fuel_cg == "limit" else "checked as a warning")
    if aircraft.mac:
        record.add_row("MAC", f"{fmt(aircraft.mac.length, units.arm)} from {fmt(aircraft.mac.leading_edge_arm, units.arm)}")
    console.print(record)

    stations = Table(title="Stations", title_justify="left")
    for column in ("Id", "Label", "Kind", f"Arm ({units.arm})", f"Lat. arm ({units.arm})", f"Min ({units.mass})",
                   f"Max ({units.mass})"):
        stations.add_column(column)
    for s in aircraft.station:
        stations.add_row(s.id, s.name, s.kind, fmt(s.arm, units.arm, with_unit=False),
                         "" if s.lateral_arm is None else fmt(s.lateral_arm, units.arm, with_unit=False),
                         "" if s.min_weight is None else fmt(s.min_weight, units.mass, with_unit=False),
                         "" if s.max_weight is None else fmt(s.max_weight, units.mass, with_unit=False))
    console.print(stations)
    if aircraft.station_group:
        groups = Table(title="Station groups", title_justify="left")
        for column in ("Label", "Stations", f"Min ({units.mass})", f"Max ({units.mass})"):
            groups.add_column(column)
        for g in aircraft.station_group:
            groups.add_row(g.label, ", ".join(g.stations),
                           "" if g.min_weight is None else fmt(g.min_weight, units.mass, with_unit=False),
                           "" if g.max_weight is None else fmt(g.max_weight, units.mass, with_unit=False))
        console.print(groups)
    if aircraft.tank:
        tanks = Table(title="Fuel tanks", title_justify="left")
        for column in ("Id", "Label", f"Arm ({units.arm})", f"Usable ({units.fuel_volume})", f"Usable ({units.mass})",
                       "Fuel", "Levels"):
            tanks.add_column(column)
        for t in aircraft.tank:
            arm = (fmt(t.arm_at(t.usable), units.arm, with_unit=False) if t.arm_table is None
                   else "table: " + ", ".join(f"{q:g}->{a:g}" for q, a in t.arm_table))
            density = f"{t.fuel or ''} {aircraft.density(t):.3g} {units.mass}/{units.fuel_volume}".strip()
            tanks.add_row(t.id, t.name, arm, fmt(t.usable, units.fuel_volume, with_unit=False),
                          fmt(aircraft.usable_fuel_weight(t), units.mass, with_unit=False), density,
                          ", ".join(f"{k} {v:g}" for k, v in t.levels.items()))
        console.print(tanks)
    envelopes = Table(title="CG envelopes (the first category is the default)", title_justify="left")
    for column in ("Category", "Label", "Axes (x, y)", "Corners"):
        envelopes.add_column(column)
    for e in aircraft.envelope:
        axes = ", ".join(e.axes) + (f" (moment / {e.moment_scale:g})" if "moment" in e.axes and e.moment_scale != 1 else "")
        envelopes.add_row(e.category, e.label or "", axes, "  ".join(f"({x:g}, {y:g})" for x, y in e.points))
    console.print(envelopes)
    console.print(caution_text(caution))


def render_plan(result: PlanResult, console: Console) -> None:
    """Print a planning answer: the answer, every feasible stretch, what limits it, the check at it."""
    console.print(Text(result.question[:1].upper() + result.question[1:], style="bold"))
    style = _OK_STYLE if result.feasible else _LIMIT_STYLE
    console.print(Text(f"{result.variable}: {result.answer_display}", style=style))
    if result.governing:
        console.print(f"limited by: {result.governing}", markup=False)
    for key, value in result.extra.items():
        console.print(f"{key}: {value}", markup=False)
    if len(result.intervals) > 1:
        console.print("The values within limits form more than one stretch:", markup=False)
    if result.intervals:
        stretches = Table(title=f"{result.variable} within limits ({result.unit})", title_justify="left")
        stretches.add_column("within limits")
        for interval in result.intervals:
            stretches.add_row(stretch_text(interval.low, interval.high, result.unit))
        console.print(stretches)
        console.print(Text("Stretches are rounded inward: the ends shown are within limits.", style="dim"))
    if result.check is not None:
        console.print(_conditions_table(result.check))
        verdict = "The loading at this answer is within limits." if result.check.ok else "The loading is NOT within limits:"
        console.print(Text(verdict, style=_OK_STYLE if result.check.ok else _LIMIT_STYLE))
        for finding in result.check.findings:
            if finding.severity == "limit":
                console.print(f"  LIMIT {finding.message}", markup=False)
    console.print(caution_text(result.caution))


def render_table(aircraft: Aircraft, rows: list[TableRow], station: str, console: Console) -> None:
    """Print allowed ramp fuel against payload at a station."""
    units = aircraft.units
    table = Table(title=f"Ramp fuel within limits against weight added at {station}", title_justify="left")
    table.add_column(f"Added at {station} ({units.mass})", justify="right")
    table.add_column(f"Most ramp fuel ({units.fuel_volume})", justify="right")
    table.add_column(f"Ramp fuel within limits ({units.fuel_volume})")
    for row in rows:
        most = "none" if row.most is None else fmt(row.most, units.fuel_volume, "down", with_unit=False)
        stretches = ", ".join(stretch_text(i.low, i.high, units.fuel_volume) for i in row.intervals) or "none"
        table.add_row(fmt(row.payload, units.mass, with_unit=False), most, stretches)
    console.print(table)
    from ..caution import PILOT_CAUTION

    console.print(caution_text(PILOT_CAUTION))


def _record_table(title: str, rows: list[tuple[str, Any]], units: Any) -> Table:
    table = Table(title=title, title_justify="left")
    table.add_column("")
    table.add_column(f"Weight ({units.mass})", justify="right")
    table.add_column(f"Arm ({units.arm})", justify="right")
    table.add_column(f"Moment ({units.moment})", justify="right")
    for name, record in rows:
        table.add_row(name, fmt(record.weight, units.mass, with_unit=False), fmt(record.arm, units.arm, with_unit=False),
                      fmt(record.moment, units.moment, with_unit=False))
    return table


def render_history(listing: Any, console: Console) -> None:
    """Print the empty-weight records, oldest first, then the current one, then the caution."""
    units = listing.units
    table = Table(title=f"Empty-weight records of {listing.aircraft}", title_justify="left")
    for column in ("Replaced", "Why", f"Weight ({units['mass']})", f"Arm ({units['arm']})", "Record of", "By"):
        table.add_column(column)
    for row in listing.records:
        why = row.reason + (f": {row.note}" if row.note else "") + (" (OVERRIDE)" if row.overrides else "")
        table.add_row(row.replaced, why, fmt(row.weight, units["mass"], with_unit=False),
                      fmt(row.arm, units["arm"], with_unit=False), row.date, row.by or "")
    console.print(table)
    if listing.cg_range is not None:
        console.print(f"Empty-weight CG range: {listing.cg_range[0]:g} to {listing.cg_range[1]:g} {units['arm']}", markup=False)
    for row in listing.records:
        for override in row.overrides:
            console.print(f"OVERRIDE when {row.replaced}: {override}", markup=False)
    _warnings_and_refusals(listing, console)
    console.print(caution_text(listing.caution))


def render_comparison(rows: list[Any], console: Console) -> None:
    """Print the current and the new record side by side (before confirming a write)."""
    table = Table(title="Current and new empty-weight record", title_justify="left")
    for column in ("", "Current", "New"):
        table.add_column(column, justify="left" if not column else "right")
    for row in rows:
        cells = [c if isinstance(c, str) else ("" if c is None else fmt(c, row.unit)) for c in (row.current, row.new)]
        table.add_row(row.quantity, *cells)
    console.print(table)


def _warnings_and_refusals(result: Any, console: Console) -> None:
    for warning in getattr(result, "warnings", []):
        console.print(Text("WARNING ", style=_WARN_STYLE) + Text(warning))
    for refusal in getattr(result, "refusals", []):
        head = "NOT WRITTEN WITHOUT AN OVERRIDE " if refusal.overridable else "NEVER WRITTEN "
        console.print(Text(head, style=_LIMIT_STYLE) + Text(refusal.message))


def render_weighing(result: Any, units: Any, console: Console) -> None:
    """Print a weighing: points, as-weighed, corrections, new record, change."""
    console.print(Text(f"Weighing of {result.aircraft}" + (f" · {result.registration}" if result.registration else ""),
                       style="bold"))
    points = Table(title="Weighing points", title_justify="left")
    for column in ("Point", f"Reading ({units.mass})", f"Tare ({units.mass})", f"Net ({units.mass})",
                   f"Arm ({units.arm})", f"Moment ({units.moment})"):
        points.add_column(column, justify="left" if column == "Point" else "right")
    for p in result.points:
        points.add_row(p.label, fmt(p.reading, units.mass, with_unit=False), fmt(p.tare, units.mass, with_unit=False),
                       fmt(p.net, units.mass, with_unit=False), fmt(p.arm, units.arm, with_unit=False),
                       fmt(p.moment, units.moment, with_unit=False))
    console.print(points)
    if result.formula_cg is not None:
        console.print(f"As-weighed CG by the FAA-H-8083-1 formula for this gear and datum: {fmt(result.formula_cg, units.arm)}",
                      markup=False)
    corrections = Table(title="Corrections to the as-weighed aircraft", title_justify="left")
    for column in ("Item", "", f"Weight ({units.mass})", f"Arm ({units.arm})", f"Moment ({units.moment})"):
        corrections.add_column(column, justify="right" if "(" in column else "left")
    for c in result.corrections:
        corrections.add_row(c.label, c.action, fmt(c.weight, units.mass, with_unit=False), fmt(c.arm, units.arm, with_unit=False),
                            fmt(c.moment, units.moment, with_unit=False))
    rows = [("As weighed", result.as_weighed), ("New basic empty weight", result.new), ("Current record", result.previous)]
    if result.corrections:
        console.print(corrections)
    console.print(_record_table("Empty-weight record", rows, units))
    _changes_line(result, units, console)
    _warnings_and_refusals(result, console)
    console.print(caution_text(result.caution))


def _changes_line(result: Any, units: Any, console: Console) -> None:
    console.print(
        f"Change from the current record: weight {fmt(result.change_weight, units.mass)}, CG {fmt(result.change_arm, units.arm)}; "
        f"useful load {fmt(result.useful_load, units.mass)} ({fmt(result.change_useful_load, units.mass)})",
        markup=False,
    )


def render_alteration(result: Any, units: Any, console: Console) -> None:
    """Print equipment changes: each change's moment, the new record, negligibility."""
    console.print(Text(f"Equipment changes to {result.aircraft}" + (f" · {result.registration}" if result.registration else ""),
                       style="bold"))
    table = Table(title="Changes", title_justify="left")
    for column in ("Action", "Item", f"Weight ({units.mass})", f"Arm ({units.arm})", f"New arm ({units.arm})",
                   f"Weight change ({units.mass})", f"Moment change ({units.moment})"):
        table.add_column(column, justify="right" if "(" in column else "left")
    for line in result.lines:
        table.add_row(line.action, line.label, fmt(line.weight, units.mass, with_unit=False), fmt(line.arm, units.arm, with_unit=False),
                      "" if line.new_arm is None else fmt(line.new_arm, units.arm, with_unit=False),
                      fmt(line.weight_change, units.mass, with_unit=False), fmt(line.moment_change, units.moment, with_unit=False))
    console.print(table)
    console.print(_record_table("Empty-weight record", [("Current record", result.previous), ("After the changes", result.new)], units))
    _changes_line(result, units, console)
    n = result.negligible
    verdict = {True: "negligible", False: "not negligible", None: "cannot be judged"}[n.overall]
    console.print(f"AC 43.13-1B 10-2 c: the change is {verdict} (weight: {'yes' if n.weight else 'no'}, "
                  f"{n.weight_threshold}; CG: {'cannot be judged' if n.cg is None else ('yes' if n.cg else 'no')}, {n.cg_threshold})",
                  markup=False)
    _warnings_and_refusals(result, console)
    console.print(caution_text(result.caution))


def render_extremes(result: Any, console: Console) -> None:
    """Print the forward and rearward extreme loadings, each with its moment table, fuel range and verdict."""
    console.print(Text(f"Weight and balance extremes of {result.aircraft} ({result.category} category)", style="bold"))
    for case in (result.forward, result.rearward):
        console.print(Text(f"Most {case.side} loading (sorted against the {case.side} limit "
                           f"{fmt(case.limit_arm, case.check.units.arm)})", style="bold"))
        for note in case.notes:
            console.print(f"  {note}", markup=False)
        console.print(f"  fuel states checked: {case.fuel_states}", markup=False)
        console.print(_moment_table(case.check))
        console.print(_conditions_table(case.check))
        ramp = case.check.condition("ramp")
        words = "within limits" if case.ok else "NOT within limits"
        console.print(Text(f"{case.side} extreme: {fmt(ramp.weight, case.check.units.mass)} at CG "
                           f"{fmt(ramp.arm, case.check.units.arm)}: {words}", style=_OK_STYLE if case.ok else _LIMIT_STYLE))
        for finding in case.check.findings:
            if finding.severity == "limit":
                console.print(f"  LIMIT {finding.message}", markup=False)
    console.print(caution_text(result.caution))


def render_schedule(result: Any, aircraft: Aircraft, console: Console) -> None:
    """Print the three loading conditions of AC 43.13-1B 10-18, each with the fuel range it holds over."""
    units = aircraft.units
    for case in result.cases:
        console.print(Text(case.question[:1].upper() + case.question[1:], style="bold"))
        for note in case.notes:
            console.print(f"  {note}", markup=False)
        seats = ", ".join(f"{aircraft.stations[s].name}: {n}" for s, n in case.occupants.items()) or "none"
        console.print(f"  occupants: {seats}", markup=False)
        other = [f"{aircraft.stations[s].name} {fmt(w, units.mass, 'down')}" for s, w in case.load.items()
                 if aircraft.stations[s].kind != "seat" and w > 0]
        console.print(f"  baggage, cargo and fixed items: {', '.join(other) or 'none'}", markup=False)
        fuel = ", ".join(f"{aircraft.tanks[t].name} {fmt(q, units.fuel_volume, 'down')}" for t, q in case.fuel.items())
        console.print(f"  fuel: {fuel or 'none'}", markup=False)
        console.print(f"  fuel states checked: {case.fuel_states}", markup=False)
        console.print(_conditions_table(case.check))
        console.print(Text("  within limits" if case.ok else "  NOT within limits", style=_OK_STYLE if case.ok else _LIMIT_STYLE))
        for finding in case.check.findings:
            if finding.severity == "limit":
                console.print(f"  LIMIT {finding.message}", markup=False)
    console.print(caution_text(result.caution))


def render_fleet(flights: list[Any], console: Console) -> None:
    """One line per flight: registration, reference, takeoff and landing, verdict, first finding."""
    from .listing import render_fleet_plain, use_plain

    if use_plain(len(flights)):  # a long day: plain aligned text, at any length
        return render_fleet_plain(flights, console)
    table = Table(title="Flights", title_justify="left")
    for column in ("Line", "Registration", "Reference", "Takeoff", "Landing", "Result", "First finding"):
        table.add_column(column, justify="right" if column == "Line" else "left")
    for flight in flights:
        row = flight.row
        if flight.result is None:
            table.add_row(str(row.line), row.registration or "", row.reference or "", "", "",
                          Text("INPUT ERROR", style=_WARN_STYLE), "; ".join(flight.problems)[:160])
            continue
        result = flight.result
        units = result["units"]
        conditions = {c["condition"]: c for c in result["conditions"]}
        takeoff, landing = conditions["takeoff"], conditions["landing"]
        first = next((f["message"] for f in result["findings"] if f["severity"] == "limit"), "")
        table.add_row(
            str(row.line), row.registration or "", row.reference or "",
            f"{fmt(takeoff['weight'], units['mass'])} / {fmt(takeoff['arm'], units['arm'])}",
            f"{fmt(landing['weight'], units['mass'])} / {fmt(landing['arm'], units['arm'])}",
            Text("within", style=_OK_STYLE) if result["ok"] else Text("OUT", style=_LIMIT_STYLE), first,
        )
    console.print(table)
    out = sum(1 for f in flights if f.result is not None and not f.ok)
    bad = sum(1 for f in flights if f.result is None)
    console.print(f"{len(flights)} flight(s): {len(flights) - out - bad} within limits, {out} out of limits, "
                  f"{bad} could not be used.", markup=False)
    from ..caution import PILOT_CAUTION

    console.print(caution_text(PILOT_CAUTION))


def render_fleet_list(lines: list[Any], folder: Any, console: Console) -> None:
    """The fleet listing: one row per aircraft file."""
    from ..caution import PILOT_CAUTION

    table = Table(title=f"Fleet in {folder}", title_justify="left")
    for column in ("Registration", "Aircraft", "Empty weight", "Record of", "Useful load", "Data", "Problems"):
        table.add_column(column)
    for line in lines:
        unit = line.mass_unit or ""
        table.add_row(
            line.registration or "?", line.name or line.file,
            fmt(line.empty_weight, unit) if line.empty_weight is not None else "",
            line.record_date or "", fmt(line.useful_load, unit) if line.useful_load is not None else "",
            line.fingerprint or "", Text("\n".join(line.problems), style=_WARN_STYLE) if line.problems else "none",
        )
    console.print(table)
    console.print(caution_text(PILOT_CAUTION))
