"""Rich terminal output of a loading check: moment table, conditions, findings, caution.

Renderers compute nothing: every figure comes from the result; they only round (in the
safe direction for margins and excesses, see :mod:`loadcheck.display`) and lay out.
Meaning never rests on colour alone: every verdict is also written in words.

Tables are laid out for the console's width (:func:`fitted_tables`): a number, a verdict
or a unit is never cut. Where all the columns do not fit side by side, the table is split
into blocks stacked one under the other, each repeating the row names; where even that
does not fit, each row is listed as "column: value" lines.
"""

from __future__ import annotations

from collections.abc import Sequence
from dataclasses import dataclass
from itertools import combinations, pairwise
from typing import TYPE_CHECKING, Any

from rich.cells import cell_len
from rich.console import Console
from rich.padding import Padding
from rich.panel import Panel
from rich.table import Table
from rich.text import Text

from ..display import fmt, unit_label
from ..results import CheckResult, Condition
from ..words import burn_path_summary, stretch_text, within_limits_text

if TYPE_CHECKING:  # the aircraft models (pydantic, numpy, shapely) are not loaded to print a listing
    from ..aircraft import Aircraft
    from ..planning import PlanResult, TableRow

__all__ = [
    "EDGE_NOTE",
    "MARGIN_NOTE",
    "NO_RANGE_NOTE",
    "CONDITION_STATE_HEADING",
    "Column",
    "condition_verdict",
    "LATERAL_CELL_NOTE",
    "fleet_condition_cell",
    "moment_axis",
    "moment_table_columns",
    "moment_table_figures",
    "scaled_moment",
    "scaled_moment_header",
    "weight_margin",
    "caution_text",
    "checked_loading",
    "fitted_tables",
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
_WEIGHT_CODES = (
    "max_ramp_weight",
    "max_takeoff_weight",
    "max_landing_weight",
    "max_zero_fuel_weight",
    "min_flight_weight",
)

Cell = str | Text


def caution_text(caution: str) -> Text:
    """The caution, set apart at the end of every human-readable output."""
    return Text(f"CAUTION: {caution}", style="italic")


# -- tables laid out for the width ---------------------------------------------------------------


@dataclass(frozen=True)
class Column:
    """A column of a fitted table.

    ``numeric`` columns are right-aligned and each line of a cell is kept whole (a number
    with its unit never wraps); other columns wrap at spaces. ``key`` columns name the
    row and are repeated in every block when a table is split.
    """

    header: str
    numeric: bool = True
    key: bool = False


def _plain(cell: Cell) -> str:
    return cell.plain if isinstance(cell, Text) else cell


def _longest_word(text: str) -> int:
    return max((cell_len(word) for word in text.split()), default=0)


def _span(column: Column, cells: Sequence[Cell]) -> tuple[int, int, int]:
    """Narrowest width of a column's text, the width its cells need unwrapped, and its natural
    width with the header unwrapped too (padding and borders not included)."""
    lines = [line for cell in cells for line in _plain(cell).split("\n")]
    if column.numeric:
        narrowest = max([_longest_word(column.header)] + [cell_len(line) for line in lines])
    else:
        narrowest = max([_longest_word(column.header)] + [_longest_word(line) for line in lines])
    body = max([narrowest] + [cell_len(line) for line in lines])
    natural = max(body, cell_len(column.header))
    return max(narrowest, 1), max(body, 1), max(natural, 1)


def _outer(widths: Sequence[int]) -> int:
    """Width of a boxed table with these column widths: one space of padding each side, rules between."""
    return sum(widths) + 3 * len(widths) + 1


def fitted_tables(
    width: int,
    title: str,
    columns: Sequence[Column],
    rows: Sequence[Sequence[Cell]],
    total: Sequence[Cell] | None = None,
    row_styles: Sequence[str | None] | None = None,
) -> list[Table | Text]:
    """Lay a table out for ``width`` character cells without cutting any cell.

    Parameters
    ----------
    width : console width [characters]
    title : table title; one wider than the table is printed on a line of its own above it
        (wrapping only at ``width``), never wrapped to the table's width
    columns : the columns, in the order they read
    rows : cells, one sequence per row
    total : an optional last row set apart by a rule and shown in bold

    Returns
    -------
    One table when every column fits side by side; else several tables (the key columns
    repeated in each, titled "continued"); else, where a key column and one other do not
    fit, the rows listed as "column: value" lines.
    """
    body = [list(r) for r in rows] + ([list(total)] if total is not None else [])
    spans = [_span(c, [r[i] for r in body]) for i, c in enumerate(columns)]
    keys = [i for i, c in enumerate(columns) if c.key]
    others = [i for i in range(len(columns)) if i not in keys]
    blocks = _blocks([s[0] for s in spans], keys, others, width)
    if blocks is None:
        return [_listed(title, columns, body, keys)]
    tables: list[Table | Text] = []
    for number, block in enumerate(blocks):
        widths = [spans[j][0] for j in block]
        spare = width - _outer(widths)
        # the room left goes first to the cells (an item name on one line), then to the headers;
        # within each, to the columns that need the least more first
        for need in (1, 2):
            for k in sorted(range(len(block)), key=lambda k: spans[block[k]][need] - widths[k]):
                grow = min(spare, spans[block[k]][need] - widths[k])
                widths[k] += grow
                spare -= grow
        heading = title if number == 0 else f"{title} (continued)"
        if cell_len(heading) > _outer(widths):  # a title wider than its table: on a line of its own, not
            tables.append(Text(heading, style="italic"))  # wrapped to the table's few columns
            heading = ""
        table = Table(title=heading or None, title_justify="left")
        for j, w in zip(block, widths, strict=True):
            table.add_column(
                columns[j].header,
                justify="right" if columns[j].numeric else "left",
                width=w,
                overflow="fold",
                no_wrap=False,
            )
        for r, row in enumerate(rows):
            style = row_styles[r] if row_styles is not None else None
            table.add_row(*[row[j] for j in block], style=style)
        if total is not None:
            table.add_section()
            table.add_row(*[total[j] for j in block], style="bold")
        tables.append(table)
    return tables


def _blocks(narrowest: Sequence[int], keys: list[int], others: list[int], width: int) -> list[list[int]] | None:
    """Columns in as few blocks as fit ``width``, the blocks as even as can be; None if none fits.

    Columns keep their order; each block starts with the key columns.
    """
    if _outer(narrowest) <= width:
        return [list(range(len(narrowest)))]

    def outer(part: Sequence[int]) -> int:
        return _outer([narrowest[j] for j in keys + list(part)])

    if not others or any(outer([i]) > width for i in others):
        return None
    for count in range(2, len(others) + 1):
        best: tuple[int, list[list[int]]] | None = None
        for cuts in combinations(range(1, len(others)), count - 1):
            edges = (0, *cuts, len(others))
            parts = [others[a:b] for a, b in pairwise(edges)]
            widest = max(outer(part) for part in parts)
            if widest <= width and (best is None or widest < best[0]):
                best = (widest, [keys + part for part in parts])
        if best is not None:
            return best[1]
    return None  # pragma: no cover  (one column per block always fits, checked above)


def _listed(title: str, columns: Sequence[Column], body: Sequence[Sequence[Cell]], keys: Sequence[int]) -> Text:
    """A table too wide even in blocks: one paragraph per row, "column: value" lines."""
    text = Text(title, style="bold")
    for row in body:
        name = " ".join(_plain(row[k]) for k in keys)
        text.append("\n" + (name or "-"), style="bold")
        for i, column in enumerate(columns):
            if i in keys:
                continue
            text.append(f"\n  {column.header}: ")
            cell = row[i]
            text.append(cell if isinstance(cell, Text) else Text(cell.replace("\n", "; ")))
    return text


def _print_table(
    console: Console,
    title: str,
    columns: Sequence[Column],
    rows: Sequence[Sequence[Cell]],
    total: Sequence[Cell] | None = None,
) -> None:
    for table in fitted_tables(console.width, title, columns, rows, total):
        console.print(table)


def _indented(console: Console, text: str) -> None:
    """A note under a heading, indented by two, its wrapped lines too (never back at the margin)."""
    console.print(Padding(Text(text), (0, 0, 0, 2), expand=False))


def _lines(console: Console, tag_rows: Sequence[tuple[Text, Text]]) -> None:
    """Tagged lines ("LIMIT", "WARNING") whose words wrap under the message, not under the tag."""
    grid = Table.grid(padding=(0, 1))
    grid.add_column(no_wrap=True)
    grid.add_column(overflow="fold")
    for tag, message in tag_rows:
        grid.add_row(tag, message)
    console.print(grid)


# -- the check -------------------------------------------------------------------------------------


def moment_axis(aircraft: Aircraft | None, category: str) -> Any:
    """The envelope of this category read as moment / scale (scale other than 1), if any."""
    if aircraft is None:
        return None
    for envelope in aircraft.envelopes_for(category):
        if "moment" in envelope.axes and envelope.moment_scale != 1:
            return envelope
    return None


def scaled_moment(envelope: Any, weight: float, moment: float) -> float:
    """The moment as the envelope reads it (moment / scale), from the envelope's own coordinates."""
    x, y = envelope.shape.coords(weight, moment, 0.0)
    return float(x if envelope.axes[0] == "moment" else y)


def scaled_moment_header(envelope: Any, moment_unit: str) -> str:
    return f"Moment / {envelope.moment_scale:g} ({unit_label(moment_unit)})"


def moment_table_columns(result: CheckResult, aircraft: Aircraft | None = None) -> tuple[list[str], Any, bool]:
    """The headings of the moment table's figure columns, with the scaled-moment envelope (or None)
    and whether the lateral columns are there: the terminal's table and the load sheet's share them.

    Parameters
    ----------
    result : the check
    aircraft : the aircraft checked; where its envelope is read as moment / 1000, that column is there

    Returns
    -------
    headings : weight [mass unit], arm [arm unit], moment [moment unit], then the scaled moment and the
        lateral arm and moment [arm unit, moment unit] where the check has them
    scaled : the envelope read on a scaled moment axis, or None
    lateral : True where the check computed lateral arms (FAA-H-8083-1B ch. 8, lateral balance)
    """
    units = result.units
    lateral = any(i.lateral_arm is not None for i in result.items)
    scaled = moment_axis(aircraft, result.category)
    moment = unit_label(units.moment)
    heads = [f"Weight ({units.mass})", f"Arm ({units.arm})", f"Moment ({moment})"]
    if scaled is not None:
        heads.append(scaled_moment_header(scaled, units.moment))
    if lateral:
        heads += [f"Lateral arm ({units.arm})", f"Lateral moment ({moment})"]
    return heads, scaled, lateral


def moment_table_figures(
    result: CheckResult,
    scaled: Any,
    lateral: bool,
    weight: float,
    arm: float,
    mom: float,
    lat: float | None,
    lat_mom: float | None,
) -> list[str]:
    """One row's figures of the moment table, in the columns of :func:`moment_table_columns`.

    Parameters
    ----------
    result : the check (for its units)
    scaled : the scaled-moment envelope, or None
    lateral : whether the lateral columns are there
    weight : [mass unit]
    arm : [arm unit]
    mom : moment [moment unit]
    lat : lateral arm, + right [arm unit]; none (0) for an item on the centre line
    lat_mom : lateral moment [moment unit]
    """
    units = result.units
    row = [
        fmt(weight, units.mass, with_unit=False),
        fmt(arm, units.arm, with_unit=False),
        fmt(mom, units.moment, with_unit=False),
    ]
    if scaled is not None:
        row.append(fmt(scaled_moment(scaled, weight, mom), units.moment, with_unit=False, places=1))
    if lateral:
        row += [fmt(lat or 0.0, units.arm, with_unit=False), fmt(lat_mom or 0.0, units.moment, with_unit=False)]
    return row


def _moment_table(result: CheckResult, console: Console, aircraft: Aircraft | None = None) -> None:
    units = result.units
    heads, scaled, lateral = moment_table_columns(result, aircraft)
    columns = [Column("Item", numeric=False, key=True), *(Column(h) for h in heads)]

    def cells(name: str, weight: float, arm: float, mom: float, lat: float | None, lat_mom: float | None) -> list[Cell]:
        return [name, *moment_table_figures(result, scaled, lateral, weight, arm, mom, lat, lat_mom)]

    rows = []
    for item in result.items:
        name = item.name + (f" ({fmt(item.fuel_volume, units.fuel_volume)})" if item.fuel_volume is not None else "")
        rows.append(cells(name, item.weight, item.arm, item.moment, item.lateral_arm, item.lateral_moment))
    ramp = result.condition("ramp")
    total = cells("Total at ramp", ramp.weight, ramp.arm, ramp.moment, ramp.lateral_arm, ramp.lateral_moment)
    _print_table(console, "Moment table (engine start)", columns, rows, total)
    console.print(
        Text(
            "Each figure is rounded on its own; totals come from the unrounded figures, "
            "so a column may differ from its total in the last digit."
            + (" Lateral figures are + right of the centre line." if lateral else ""),
            style="dim",
        )
    )


def _margin(value: float | None, unit: str) -> str:
    return "" if value is None else fmt(value, unit, "down", with_unit=False)


NO_RANGE = "—"
"""A CG margin cell where the envelope has no CG range at the condition's weight (:func:`cg_margin`)."""
NO_RANGE_NOTE = (
    "—: the envelope has no CG range at that weight (the weight is above its top or below its bottom), so "
    "there is no CG margin; the weight margin says how far."
)


def cg_margin(value: float | None, unit: str) -> str:
    """A CG margin (fore and aft, or lateral) as shown: rounded down, or :data:`NO_RANGE` where none
    is given (the envelope's slice at that weight is empty: every longitudinal category has an
    envelope, so a missing CG margin means the weight is outside the envelope's weights; the
    margins' rule is docs/computation.md, "Margins")."""
    return NO_RANGE if value is None else fmt(value, unit, "down", with_unit=False)


def no_cg_range(result: CheckResult) -> bool:
    """True where some condition shows :data:`NO_RANGE` (so :data:`NO_RANGE_NOTE` is said)."""
    lateral = any(c.lateral_arm is not None for c in result.conditions)
    keys = ("forward", "aft", "left", "right") if lateral else ("forward", "aft")
    return any(getattr(c.margins, key) is None for c in result.conditions for key in keys)


CONDITION_STATE_HEADING = "Limits"
"""Heading of the column giving each condition's own state against the envelope and the weight limits
(:func:`condition_verdict`)."""


def condition_verdict(c: Condition, result: CheckResult) -> tuple[str, str]:
    """A condition's state against the envelope and the weight limits, in words, and its severity
    (``ok``, ``warning`` or ``limit``): inside, inside with a warning, outside only against a
    warning (the zero-fuel CG), or outside.

    The words are "inside" / "OUTSIDE", never "within": a condition can be inside while the
    loading is out of limits (the CG leaving the envelope during the burn), and the loading's
    verdict is said once, by :func:`checked_loading`.
    """
    mine = [f for f in result.findings if f.condition == c.condition]
    if c.ok:
        return ("inside (warning)", "warning") if any(f.severity == "warning" for f in mine) else ("inside", "ok")
    if all(f.severity == "warning" for f in mine):
        return "OUTSIDE (warning)", "warning"
    return "OUTSIDE", "limit"


def _result_cell(c: Condition, result: CheckResult) -> Text:
    words, severity = condition_verdict(c, result)
    return Text(words, style={"ok": _OK_STYLE, "warning": _WARN_STYLE, "limit": _LIMIT_STYLE}[severity])


MARGIN_NOTE = (
    "Margins: room left to each limit at that condition, rounded down; below zero, the excess, rounded up, "
    "unless marked otherwise. CG margins run along the CG axis at that weight; the weight margin is the room "
    "to the maximum weight or to the envelope's boundary straight above the point (its top edge, or a "
    "sloping side edge, of any envelope: the lateral one too), whichever is lower."
)
EDGE_NOTE = (
    "(edge): set by the envelope's edge straight above or below the point at that CG; no maximum weight is "
    "exceeded, and it does not say which way to go: below zero it is the weight over an edge above, or the "
    "weight short of the part of the envelope above it (below its bottom, or in a notch), where taking the "
    "weight off does not bring it inside; 0: no weight at that CG is inside. The findings say which limit "
    "is exceeded."
)


def weight_margin(c: Condition, result: CheckResult) -> tuple[str, bool]:
    """The weight margin as shown, and whether it is marked "(edge)": shown below zero with no
    maximum weight exceeded, so the envelope's edge at this CG sets it (a CG matter, not an
    overweight one), or zero at a condition outside the envelope (no weight at all is inside
    at that CG). A margin that shows as zero at a condition inside is no mark: the point is on
    the limit, which holds (limits are inclusive, docs/computation.md), whatever noise far below
    the display precision its figure carries."""
    text = _margin(c.margins.weight, result.units.mass)
    outside_with_no_room = not c.ok and c.margins.weight is not None and c.margins.weight <= 0
    if c.margins.weight is None or not (text.startswith("-") or outside_with_no_room):
        return text, False
    weight_finding = any(f.code in _WEIGHT_CODES and f.condition == c.condition for f in result.findings)
    return (text, False) if weight_finding else (f"{text} (edge)", True)


def _conditions_table(result: CheckResult, console: Console, aircraft: Aircraft | None = None) -> None:
    units = result.units
    conditions = result.conditions
    mac = any(c.mac_percent is not None for c in conditions)
    lateral = any(c.lateral_arm is not None for c in conditions)
    scaled = moment_axis(aircraft, result.category)
    columns = [
        Column("Condition", numeric=False, key=True),
        Column(f"Fuel ({units.fuel_volume})"),
        Column(f"Weight ({units.mass})"),
        Column(f"CG ({units.arm})"),
    ]
    if mac:
        columns.append(Column("CG (% MAC)"))
    if scaled is not None:
        columns.append(Column(scaled_moment_header(scaled, units.moment)))
    if lateral:
        columns.append(Column(f"Lateral CG ({units.arm})"))
    columns.append(Column(CONDITION_STATE_HEADING, numeric=False))
    columns += [Column(f"CG margin forward ({units.arm})"), Column(f"CG margin aft ({units.arm})")]
    if lateral:
        columns += [Column(f"Lateral margin left ({units.arm})"), Column(f"Lateral margin right ({units.arm})")]
    columns.append(Column(f"Weight margin ({units.mass})"))
    rows = []
    edge = False
    for c in conditions:
        row: list[Cell] = [
            _NAMES[c.condition],
            fmt(c.fuel, units.fuel_volume, with_unit=False),
            fmt(c.weight, units.mass, with_unit=False),
            fmt(c.arm, units.arm, with_unit=False),
        ]
        if mac:
            row.append("" if c.mac_percent is None else fmt(c.mac_percent, "%MAC", with_unit=False))
        if scaled is not None:
            row.append(fmt(scaled_moment(scaled, c.weight, c.moment), units.moment, with_unit=False, places=1))
        if lateral:
            row.append("" if c.lateral_arm is None else fmt(c.lateral_arm, units.arm, with_unit=False))
        row.append(_result_cell(c, result))
        row += [cg_margin(c.margins.forward, units.arm), cg_margin(c.margins.aft, units.arm)]
        if lateral:
            row += [cg_margin(c.margins.left, units.arm), cg_margin(c.margins.right, units.arm)]
        weight, marked = weight_margin(c, result)
        edge = edge or marked
        row.append(weight)
        rows.append(row)
    _print_table(console, f"Conditions ({result.category} category)", columns, rows)
    notes = MARGIN_NOTE
    if lateral:
        notes += " Lateral figures are + right of the centre line."
    if edge:
        notes += " " + EDGE_NOTE
    if no_cg_range(result):
        notes += " " + NO_RANGE_NOTE
    console.print(Text(notes, style="dim"))


def _burn_line(result: CheckResult) -> Text:
    return Text(burn_path_summary(result), style="" if result.burn_path.ok else _LIMIT_STYLE)


def _findings(result: CheckResult, console: Console) -> None:
    if not result.findings:
        console.print("No findings.")
        return
    console.print(Text("Findings", style="bold"))
    _lines(
        console,
        [
            (
                Text("LIMIT", style=_LIMIT_STYLE) if f.severity == "limit" else Text("WARNING", style=_WARN_STYLE),
                Text(f.message),
            )
            for f in result.findings
        ],
    )


def _verdict(result: CheckResult) -> Text:
    if result.ok:
        warnings = sum(f.severity == "warning" for f in result.findings)
        return Text(f"WITHIN LIMITS: {within_limits_text(warnings)}", style=_OK_STYLE)
    count = len(result.limits_exceeded)
    return Text(f"OUT OF LIMITS: {count} {'limit' if count == 1 else 'limits'} exceeded.", style=_LIMIT_STYLE)


def checked_loading(result: CheckResult, console: Console, aircraft: Aircraft | None = None) -> None:
    """Print a checked loading as ``check`` shows it: the moment table (every station's weight and
    every tank's fuel), the conditions, the burn-path line, the findings and the verdict.

    Every output that proposes or reports a loading (a planning answer, a schedule case, an
    extreme) prints it through here, so that a pilot can load what was checked and reads
    the same findings and verdict as ``check`` gives for that loading.
    """
    _moment_table(result, console, aircraft)
    _conditions_table(result, console, aircraft)
    console.print(_burn_line(result))
    _findings(result, console)
    console.print(Panel(_verdict(result), expand=False))


def render_check(
    result: CheckResult, console: Console, plot: Sequence[str] = (), aircraft: Aircraft | None = None
) -> None:
    """Print a check: header, moment table, conditions, burn path, findings, verdict, the
    lines of a text plot if given, and last the caution.

    With ``aircraft``, a loading whose envelope is read as moment / 1000 (``moment_scale``)
    also shows that column, in the units the pilot reads off the chart.
    """
    info = result.aircraft
    console.print(Text(info.name + (f" · {info.registration}" if info.registration else ""), style="bold"))
    header = f"{result.category} category · aircraft data {info.fingerprint}"
    if info.empty_weight_date:
        header += f" · empty weight of {info.empty_weight_date}"
    console.print(header, markup=False)
    checked_loading(result, console, aircraft)
    for line in plot:
        console.print(line, markup=False, highlight=False, overflow="fold")
    console.print(caution_text(result.caution))


# -- the aircraft ------------------------------------------------------------------------------------


def render_aircraft(aircraft: Aircraft, console: Console, caution: str, warnings: Sequence[str] = ()) -> None:
    """Print an aircraft's data: units, empty weight (and ``warnings`` about that record, such
    as a CG outside its empty-weight CG range), limits, stations, groups, tanks, envelopes."""
    units = aircraft.units
    empty = aircraft.empty
    limits = aircraft.limits
    console.print(Text(aircraft.name + (f" · {aircraft.registration}" if aircraft.registration else ""), style="bold"))
    console.print(
        f"Units: mass {units.mass}, arm {units.arm} (aft of datum; lateral + right), fuel {units.fuel_volume}"
        f" · data {aircraft.fingerprint}",
        markup=False,
    )
    record: list[list[Cell]] = [
        ["Basic empty weight", fmt(empty.weight, units.mass)],
        ["Empty-weight CG", fmt(empty.arm, units.arm)],
    ]
    if empty.lateral_arm is not None:
        record.append(["Empty-weight lateral CG", fmt(empty.lateral_arm, units.arm)])
    record += [
        ["Empty-weight moment", fmt(empty.moment, units.moment)],
        ["Record dated", str(empty.date or "not dated")],
    ]
    if empty.basis:
        record.append(["Basis", empty.basis])
    if empty.cg_range is not None:
        record.append(
            ["Empty-weight CG range", f"{fmt(empty.cg_range[0], units.arm)} to {fmt(empty.cg_range[1], units.arm)}"]
        )
    record += [
        ["Useful load (max takeoff less empty)", fmt(aircraft.useful_load, units.mass)],
        ["Max ramp weight", fmt(limits.ramp, units.mass)],
        ["Max takeoff weight", fmt(limits.max_takeoff_weight, units.mass)],
        ["Max landing weight", fmt(limits.landing, units.mass)],
    ]
    if limits.max_zero_fuel_weight is not None:
        record.append(["Max zero-fuel weight", fmt(limits.max_zero_fuel_weight, units.mass)])
    if limits.min_flight_weight is not None:
        record.append(["Min flight weight", fmt(limits.min_flight_weight, units.mass)])
    record.append(["Zero-fuel CG", "a limit" if limits.zero_fuel_cg == "limit" else "checked as a warning"])
    if aircraft.mac:
        record.append(
            ["MAC", f"{fmt(aircraft.mac.length, units.arm)} from {fmt(aircraft.mac.leading_edge_arm, units.arm)}"]
        )
    _print_table(
        console,
        "Empty-weight record and limits",
        [Column("What", numeric=False, key=True), Column("Value", numeric=False)],
        record,
    )
    if warnings:
        _lines(console, [(Text("WARNING", style=_WARN_STYLE), Text(w)) for w in warnings])

    _print_table(
        console,
        "Stations",
        [
            Column("Id", numeric=False, key=True),
            Column("Label", numeric=False),
            Column("Kind", numeric=False),
            Column(f"Arm ({units.arm})"),
            Column(f"Lateral arm ({units.arm})"),
            Column(f"Min ({units.mass})"),
            Column(f"Max ({units.mass})"),
        ],
        [
            [
                s.id,
                s.name,
                s.kind,
                fmt(s.arm, units.arm, with_unit=False),
                "" if s.lateral_arm is None else fmt(s.lateral_arm, units.arm, with_unit=False),
                "" if s.min_weight is None else fmt(s.min_weight, units.mass, with_unit=False),
                "" if s.max_weight is None else fmt(s.max_weight, units.mass, with_unit=False),
            ]
            for s in aircraft.station
        ],
    )
    if aircraft.station_group:
        _print_table(
            console,
            "Station groups",
            [
                Column("Label", numeric=False, key=True),
                Column("Stations", numeric=False),
                Column(f"Min ({units.mass})"),
                Column(f"Max ({units.mass})"),
            ],
            [
                [
                    g.label,
                    ", ".join(g.stations),
                    "" if g.min_weight is None else fmt(g.min_weight, units.mass, with_unit=False),
                    "" if g.max_weight is None else fmt(g.max_weight, units.mass, with_unit=False),
                ]
                for g in aircraft.station_group
            ],
        )
    if aircraft.tank:
        rows: list[list[Cell]] = []
        for t in aircraft.tank:
            arm = (
                fmt(t.arm_at(t.usable), units.arm, with_unit=False)
                if t.arm_table is None
                else "table:\n" + "\n".join(f"{q:g} -> {a:g}" for q, a in t.arm_table)
            )
            density = f"{aircraft.density(t):.3g} {units.mass}/{units.fuel_volume}"
            rows.append(
                [
                    t.id,
                    t.name,
                    arm,
                    fmt(t.usable, units.fuel_volume, with_unit=False),
                    fmt(aircraft.usable_fuel_weight(t), units.mass, with_unit=False),
                    f"{t.fuel}\n{density}" if t.fuel else density,
                    "\n".join(f"{k} {fmt(v, units.fuel_volume, with_unit=False)}" for k, v in t.levels.items()),
                ]
            )
        _print_table(
            console,
            "Fuel tanks",
            [
                Column("Id", numeric=False, key=True),
                Column("Label", numeric=False),
                Column(f"Arm ({units.arm})"),
                Column(f"Usable ({units.fuel_volume})"),
                Column(f"Usable ({units.mass})"),
                Column("Fuel and density"),
                Column(f"Levels ({units.fuel_volume})"),
            ],
            rows,
        )
    envelopes: list[list[Cell]] = []
    for e in aircraft.envelope:
        axes = ", ".join(e.axes) + (
            f" (moment / {e.moment_scale:g})" if "moment" in e.axes and e.moment_scale != 1 else ""
        )
        envelopes.append([e.category, e.label or "", axes, "\n".join(f"({x:g}, {y:g})" for x, y in e.points)])
    _print_table(
        console,
        "CG envelopes (the first category is the default)",
        [
            Column("Category", numeric=False, key=True),
            Column("Label", numeric=False),
            Column("Axes (x, y)", numeric=False),
            Column("Corners"),
        ],
        envelopes,
    )
    console.print(caution_text(caution))


# -- planning ---------------------------------------------------------------------------------------


def render_plan(result: PlanResult, console: Console) -> None:
    """Print a planning answer: the answer, every feasible stretch, what limits it, and the loading
    checked at it as ``check`` shows it (:func:`checked_loading`)."""
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
        _print_table(
            console,
            f"{result.variable} within limits ({result.unit})",
            [Column("within limits")],
            [[stretch_text(i.low, i.high, result.unit)] for i in result.intervals],
        )
        console.print(Text("Stretches are rounded inward: the ends shown are within limits.", style="dim"))
    if result.check is not None:
        console.print(Text("The loading checked at this answer", style="bold"))
        checked_loading(result.check, console)
    console.print(caution_text(result.caution))


def render_table(aircraft: Aircraft, rows: list[TableRow], station: str, console: Console) -> None:
    """Print allowed ramp fuel against payload at a station."""
    units = aircraft.units
    cells: list[list[Cell]] = []
    for row in rows:
        most = "none" if row.most is None else fmt(row.most, units.fuel_volume, "down", with_unit=False)
        stretches = "\n".join(stretch_text(i.low, i.high, units.fuel_volume) for i in row.intervals) or "none"
        cells.append([fmt(row.payload, units.mass, with_unit=False), most, stretches])
    _print_table(
        console,
        f"Ramp fuel within limits against weight added at {station}",
        [
            Column(f"Added at {station} ({units.mass})", key=True),
            Column(f"Most ramp fuel ({units.fuel_volume})"),
            Column(f"Within limits ({units.fuel_volume})"),
        ],
        cells,
    )
    # what each row's check found: the limit that stops its fuel, or why no fuel is within limits
    console.print(Text("Limited by, row by row", style="bold"))
    for row in rows:
        if row.limited_by:
            console.print(f"{fmt(row.payload, units.mass)}: {row.limited_by}", markup=False)
    console.print(
        Text(
            "Each row's most ramp fuel is the figure whose loading passed the full check (plan fuel with that "
            "weight added shows it); between rows nothing is claimed.",
            style="dim",
        )
    )
    from ..caution import PILOT_CAUTION

    console.print(caution_text(PILOT_CAUTION))


# -- the mechanic -------------------------------------------------------------------------------------


def _record_table(title: str, rows: list[tuple[str, Any]], units: Any, console: Console) -> None:
    _print_table(
        console,
        title,
        [
            Column("", numeric=False, key=True),
            Column(f"Weight ({units.mass})"),
            Column(f"Arm ({units.arm})"),
            Column(f"Moment ({unit_label(units.moment)})"),
        ],
        [
            [
                name,
                fmt(r.weight, units.mass, with_unit=False),
                fmt(r.arm, units.arm, with_unit=False),
                fmt(r.moment, units.moment, with_unit=False),
            ]
            for name, r in rows
        ],
    )


def render_history(listing: Any, console: Console) -> None:
    """Print the empty-weight records, oldest first, then the current one, then the caution."""
    units = listing.units
    rows = []
    for row in listing.records:
        why = row.reason + (f": {row.note}" if row.note else "") + (" (OVERRIDE)" if row.overrides else "")
        rows.append(
            [
                row.replaced,
                why,
                fmt(row.weight, units["mass"], with_unit=False),
                fmt(row.arm, units["arm"], with_unit=False),
                row.date,
                row.by or "",
            ]
        )
    _print_table(
        console,
        f"Empty-weight records of {listing.aircraft}",
        [
            Column("Replaced", key=True),
            Column("Why", numeric=False),
            Column(f"Weight ({units['mass']})"),
            Column(f"Arm ({units['arm']})"),
            Column("Record of"),
            Column("By", numeric=False),
        ],
        rows,
    )
    if listing.cg_range is not None:
        console.print(
            f"Empty-weight CG range: {listing.cg_range[0]:g} to {listing.cg_range[1]:g} {units['arm']}", markup=False
        )
    for row in listing.records:
        for override in row.overrides:
            console.print(f"OVERRIDE when {row.replaced}: {override}", markup=False)
    _warnings_and_refusals(listing, console)
    console.print(caution_text(listing.caution))


def render_comparison(rows: list[Any], console: Console) -> None:
    """Print the current and the new record side by side (before confirming a write), with each change
    (never shown as zero unless it is: :func:`~loadcheck.display.fmt` with ``signed``)."""
    cells = [
        [
            row.quantity,
            *(c if isinstance(c, str) else ("" if c is None else fmt(c, row.unit)) for c in (row.current, row.new)),
            "" if row.change is None else fmt(row.change, row.unit, signed=True),
        ]
        for row in rows
    ]
    _print_table(
        console,
        "Current and new empty-weight record",
        [Column("", numeric=False, key=True), Column("Current"), Column("New"), Column("Change")],
        cells,
    )


def _warnings_and_refusals(result: Any, console: Console) -> None:
    lines = [(Text("WARNING", style=_WARN_STYLE), Text(warning)) for warning in getattr(result, "warnings", [])]
    for refusal in getattr(result, "refusals", []):
        head = "NOT WRITTEN WITHOUT AN OVERRIDE" if refusal.overridable else "NEVER WRITTEN"
        lines.append((Text(head, style=_LIMIT_STYLE), Text(refusal.message)))
    if lines:
        _lines(console, lines)


def render_weighing(result: Any, units: Any, console: Console) -> None:
    """Print a weighing: points, as-weighed, corrections, new record, change.

    Where the points or the records give a lateral CG, the lateral arms are shown in the
    tables and the new lateral CG with its change from the current record on a line of its own.
    """
    console.print(
        Text(
            f"Weighing of {result.aircraft}" + (f" · {result.registration}" if result.registration else ""),
            style="bold",
        )
    )
    moment = unit_label(units.moment)
    lateral_points = any(p.lateral_arm is not None for p in result.points)
    lateral_column = [Column(f"Lateral arm ({units.arm}, + right)")] if lateral_points else []

    def lateral_cell(arm: float | None) -> list[str]:
        if not lateral_points:
            return []
        return ["" if arm is None else fmt(arm, units.arm, with_unit=False)]

    _print_table(
        console,
        "Weighing points",
        [
            Column("Point", numeric=False, key=True),
            Column(f"Reading ({units.mass})"),
            Column(f"Tare ({units.mass})"),
            Column(f"Net ({units.mass})"),
            Column(f"Arm ({units.arm})"),
            *lateral_column,
            Column(f"Moment ({moment})"),
        ],
        [
            [
                p.label,
                fmt(p.reading, units.mass, with_unit=False),
                fmt(p.tare, units.mass, with_unit=False),
                fmt(p.net, units.mass, with_unit=False),
                fmt(p.arm, units.arm, with_unit=False),
                *lateral_cell(p.lateral_arm),
                fmt(p.moment, units.moment, with_unit=False),
            ]
            for p in result.points
        ],
    )
    if result.formula_cg is not None:
        console.print(
            f"As-weighed CG by the FAA-H-8083-1 formula for this gear and datum: {fmt(result.formula_cg, units.arm)}",
            markup=False,
        )
    if result.corrections:
        _print_table(
            console,
            "Corrections to the as-weighed aircraft",
            [
                Column("Item", numeric=False, key=True),
                Column("", numeric=False),
                Column(f"Weight ({units.mass})"),
                Column(f"Arm ({units.arm})"),
                *lateral_column,
                Column(f"Moment ({moment})"),
            ],
            [
                [
                    c.label,
                    c.action,
                    fmt(c.weight, units.mass, with_unit=False, nonzero=True),
                    fmt(c.arm, units.arm, with_unit=False),
                    *lateral_cell(c.lateral_arm),
                    fmt(c.moment, units.moment, with_unit=False),
                ]
                for c in result.corrections
            ],
        )
    rows = [
        ("As weighed", result.as_weighed),
        ("New basic empty weight", result.new),
        ("Current record", result.previous),
    ]
    _record_table("Empty-weight record", rows, units, console)
    _changes_line(result, units, console)
    if result.new.lateral_arm is not None or result.previous.lateral_arm is not None:
        shown = (
            []
            if result.as_weighed.lateral_arm is None
            else [f"as weighed {fmt(result.as_weighed.lateral_arm, units.arm)}"]
        )
        shown.append("new " + ("none" if result.new.lateral_arm is None else fmt(result.new.lateral_arm, units.arm)))
        shown.append(
            "current record "
            + ("none" if result.previous.lateral_arm is None else fmt(result.previous.lateral_arm, units.arm))
        )
        change = (
            ""
            if result.change_lateral_arm is None
            else f"; change {fmt(result.change_lateral_arm, units.arm, signed=True)}"
        )
        console.print(f"Lateral CG (+ right): {', '.join(shown)}{change}", markup=False)
    _warnings_and_refusals(result, console)
    console.print(caution_text(result.caution))


def _changes_line(result: Any, units: Any, console: Console) -> None:
    console.print(
        f"Change from the current record: weight {fmt(result.change_weight, units.mass, signed=True)}, CG "
        f"{fmt(result.change_arm, units.arm, signed=True)}; useful load {fmt(result.useful_load, units.mass)} "
        f"({fmt(result.change_useful_load, units.mass, signed=True)})",
        markup=False,
    )


def render_alteration(result: Any, units: Any, console: Console) -> None:
    """Print equipment changes: each change's moment, the new record, negligibility."""
    console.print(
        Text(
            f"Equipment changes to {result.aircraft}" + (f" · {result.registration}" if result.registration else ""),
            style="bold",
        )
    )
    moment = unit_label(units.moment)
    _print_table(
        console,
        "Changes",
        [
            Column("Action", numeric=False),
            Column("Item", numeric=False, key=True),
            Column(f"Weight ({units.mass})"),
            Column(f"Arm ({units.arm})"),
            Column(f"New arm ({units.arm})"),
            Column(f"Weight change ({units.mass})"),
            Column(f"Moment change ({moment})"),
        ],
        [
            [
                line.action,
                line.label,
                fmt(line.weight, units.mass, with_unit=False, nonzero=True),  # a light item is never shown as 0.0
                fmt(line.arm, units.arm, with_unit=False),
                "" if line.new_arm is None else fmt(line.new_arm, units.arm, with_unit=False),
                fmt(line.weight_change, units.mass, with_unit=False, signed=True),
                fmt(line.moment_change, units.moment, with_unit=False, signed=True),
            ]
            for line in result.lines
        ],
    )
    _record_table(
        "Empty-weight record", [("Current record", result.previous), ("After the changes", result.new)], units, console
    )
    _changes_line(result, units, console)
    if result.new.lateral_arm is not None or result.previous.lateral_arm is not None:
        shown = [
            f"{name} " + ("none" if record.lateral_arm is None else fmt(record.lateral_arm, units.arm))
            for name, record in (("current record", result.previous), ("after the changes", result.new))
        ]
        change = (
            ""
            if result.change_lateral_arm is None
            else f"; change {fmt(result.change_lateral_arm, units.arm, signed=True)}"
        )
        console.print(f"Lateral CG (+ right): {', '.join(shown)}{change}", markup=False)
    console.print(result.negligible.text, markup=False)
    _warnings_and_refusals(result, console)
    console.print(caution_text(result.caution))


def render_extremes(result: Any, console: Console) -> None:
    """Print each extreme loading (forward, rearward, and left and right where the aircraft has a
    lateral envelope), each with its moment table, fuel range and verdict."""
    console.print(Text(f"Weight and balance extremes of {result.aircraft} ({result.category} category)", style="bold"))
    titles = {
        "forward": "Most forward loading",
        "rearward": "Most rearward loading",
        "left": "Loading farthest left",
        "right": "Loading farthest right",
    }
    for case in result.cases:
        lateral = case.side in ("left", "right")
        console.print(
            Text(
                f"{titles[case.side]} (the {'lateral ' if lateral else ''}{case.side} limit at its weight: "
                f"{fmt(case.limit_arm, case.check.units.arm)})",
                style="bold",
            )
        )
        for note in case.notes:
            _indented(console, note)
        _indented(console, f"fuel states checked: {case.fuel_states}")
        checked_loading(case.check, console)
        ramp = case.check.condition("ramp")
        words = (
            ("within limits" if case.complete else "within limits for this loading, but NOT ESTABLISHED as the extreme")
            if case.ok
            else "NOT within limits"
        )
        where = (
            f"lateral CG {fmt(ramp.lateral_arm or 0.0, case.check.units.arm)}"
            if lateral
            else (f"CG {fmt(ramp.arm, case.check.units.arm)}")
        )
        console.print(
            Text(
                f"{case.side} extreme: {fmt(ramp.weight, case.check.units.mass)} at {where}: {words}",
                style=_OK_STYLE if case.ok and case.complete else _LIMIT_STYLE,
            )
        )
    console.print(caution_text(result.caution))


def render_schedule(result: Any, aircraft: Aircraft, console: Console) -> None:
    """Print the three loading conditions of AC 43.13-1B 10-18, each with the fuel range it holds over."""
    units = aircraft.units
    for case in result.cases:
        console.print(Text(case.question[:1].upper() + case.question[1:], style="bold"))
        for note in case.notes:
            _indented(console, note)
        seats = ", ".join(f"{aircraft.station_by_id[s].name}: {n}" for s, n in case.occupants.items()) or "none"
        _indented(console, f"occupants: {seats}")
        other = [
            f"{aircraft.station_by_id[s].name} {fmt(w, units.mass, 'down')}"
            + (" (NOT every smaller load: see the note above)" if s in case.not_one_stretch else "")
            for s, w in case.load.items()
            if aircraft.station_by_id[s].kind != "seat" and w > 0
        ]
        # the most of each a case may carry, rounded down (the tables round to the nearest figure)
        _indented(console, f"baggage, cargo and fixed items (each rounded down): {', '.join(other) or 'none'}")
        fuel = ", ".join(
            f"{aircraft.tank_by_id[t].name} {fmt(q, units.fuel_volume, 'down')}" for t, q in case.fuel.items()
        )
        _indented(console, f"fuel (each tank rounded down): {fuel or 'none'}")
        _indented(console, f"fuel states checked: {case.fuel_states}")
        checked_loading(case.check, console, aircraft)
    console.print(caution_text(result.caution))


# -- the dispatcher ----------------------------------------------------------------------------------


def _flight_result(result: dict[str, Any]) -> tuple[Text, str]:
    """The result cell of a checked flight and its first finding: a limit first, else a warning."""
    limits = [f["message"] for f in result["findings"] if f["severity"] == "limit"]
    warnings = [f["message"] for f in result["findings"] if f["severity"] == "warning"]
    if limits:
        return Text("OUT", style=_LIMIT_STYLE), limits[0] + (
            f" (and {len(limits) - 1} more)" if len(limits) > 1 else ""
        )
    if warnings:
        count = f"{len(warnings)} {'warning' if len(warnings) == 1 else 'warnings'}"
        return Text(f"within, {count}", style=_WARN_STYLE), "WARNING: " + warnings[0] + (
            f" (and {len(warnings) - 1} more)" if len(warnings) > 1 else ""
        )
    return Text("within", style=_OK_STYLE), ""


def flight_reference(row: Any) -> str:
    """A fleet row's reference, with the flight's date under it where the row gives one."""
    return (row.reference or "") + (f"\n{row.date}" if row.date else "")


LATERAL_CELL_NOTE = "lat.: the lateral CG, + right of the centre line, under the fore-and-aft CG."


def fleet_condition_cell(condition: dict[str, Any], units: dict[str, str]) -> str:
    r"""A condition in the fleet table: weight over CG and, for an aircraft with lateral arms, the
    lateral CG under them (as the single check's conditions table shows it), each with its unit.

    Parameters
    ----------
    condition : a condition of a check's JSON form (``weight`` [mass unit], ``arm`` and
        ``lateral_arm``? [arm unit])
    units : the check's JSON ``units``

    Examples
    --------
    >>> units = {"mass": "lb", "arm": "in"}
    >>> fleet_condition_cell({"weight": 1774.0, "arm": 40.17, "lateral_arm": 1.556}, units)
    '1,774.0 lb\n40.17 in\nlat. 1.56 in'
    >>> fleet_condition_cell({"weight": 2450.0, "arm": 88.1}, units)
    '2,450.0 lb\n88.10 in'
    """
    cell = f"{fmt(condition['weight'], units['mass'])}\n{fmt(condition['arm'], units['arm'])}"
    lateral = condition.get("lateral_arm")
    return cell if lateral is None else f"{cell}\nlat. {fmt(lateral, units['arm'])}"


def render_fleet(flights: list[Any], console: Console, file_problems: Sequence[str] = ()) -> None:
    """One row per flight: line, registration, the verdict and under it the first finding,
    reference, takeoff and landing weight over CG, and under them the lateral CG for an aircraft
    with lateral arms (:func:`fleet_condition_cell`; the verdict and its reason come first, so
    that they stay beside the flight's name however narrow the terminal).

    A flight within limits but with warnings (fuel below the reserve, an assumption made)
    says so in its result and shows the first warning. ``file_problems`` are the problems of
    the loadings file as a whole (an unknown column, :func:`loadcheck.fleet.read_loadings`):
    printed to standard error before the table, and counted in the closing line, since they
    make the exit status 2 however the flights went.
    """
    rows: list[list[Cell]] = []
    warned = 0
    for flight in flights:
        row = flight.row
        if flight.result is None:
            verdict = Text("INPUT ERROR", style=_WARN_STYLE)
            lines = f"{row.lines[0]}-{row.lines[-1]}" if len(row.lines) > 1 else str(row.line)  # a trip's rows
            rows.append(
                [
                    lines,
                    row.registration or "",
                    verdict + Text("\n" + "\n".join(flight.problems)),
                    flight_reference(row),
                    "",
                    "",
                ]
            )
            continue
        result = flight.result
        if "legs" in result:  # a trip: its verdict, then a line for each leg (loadcheck.render.trip)
            from .trip import fleet_trip_rows

            rows += fleet_trip_rows(flight)
            warned += bool(result["ok"]) and _flight_result(result)[0].plain != "within"
            continue
        units = result["units"]
        conditions = {c["condition"]: c for c in result["conditions"]}
        takeoff, landing = conditions["takeoff"], conditions["landing"]
        verdict, first = _flight_result(result)
        warned += bool(result["ok"]) and verdict.plain != "within"
        rows.append(
            [
                str(row.line),
                row.registration or "",
                verdict + Text(f"\n{first}" if first else ""),
                flight_reference(row),
                fleet_condition_cell(takeoff, units),
                fleet_condition_cell(landing, units),
            ]
        )
    columns = [
        Column("Line", key=True),
        Column("Aircraft", numeric=False, key=True),
        Column("Result and first finding", numeric=False),
        Column("Reference\ndate" if any(f.row.date for f in flights) else "Reference", numeric=False),
        Column("Takeoff"),  # weight over CG, each with its unit: a header no wider than "2,450.0 lb"
        Column("Landing"),  # leaves the spare width to the result (a trip's verdict kept on its lines)
    ]
    from .listing import plain_listing, use_plain

    if use_plain(len(rows)):  # a long day: plain aligned text, quick at any length, nothing cut
        plain_listing(
            console.file,
            "Flights",
            [c.header for c in columns],
            [[_plain(c) for c in r] for r in rows],
            right=(0,),
            width=console.width,
        )
    else:
        _print_table(console, "Flights", columns, rows)
    if any("\nlat. " in _plain(c) for r in rows for c in r[4:]):
        console.print(Text(LATERAL_CELL_NOTE, style="dim"))
    out = sum(1 for f in flights if f.result is not None and not f.ok)
    bad = sum(1 for f in flights if f.result is None)
    within = len(flights) - out - bad
    console.print(
        f"{len(flights)} {'flight' if len(flights) == 1 else 'flights'}: {within} within limits"
        + (f" ({warned} with warnings)" if warned else "")
        + f", {out} out of limits, {bad} could not be used"
        + (
            f"; {len(file_problems)} {'problem' if len(file_problems) == 1 else 'problems'} with the loadings file"
            " (the errors above)."
            if file_problems
            else "."
        ),
        markup=False,
    )
    from ..caution import PILOT_CAUTION

    console.print(caution_text(PILOT_CAUTION))


def render_fleet_list(lines: list[Any], folder: Any, console: Console) -> None:
    """The fleet listing: one row per aircraft file."""
    from ..caution import PILOT_CAUTION

    rows: list[list[Cell]] = []
    for line in lines:
        unit = line.mass_unit or ""
        rows.append(
            [
                line.registration or "?",
                line.name or line.file,
                fmt(line.empty_weight, unit) if line.empty_weight is not None else "",
                line.record_date or "",
                fmt(line.useful_load, unit) if line.useful_load is not None else "",
                line.fingerprint or "",
                Text("\n".join(line.problems), style=_WARN_STYLE) if line.problems else "none",
            ]
        )
    _print_table(
        console,
        f"Fleet in {folder}",
        [
            Column("Registration", numeric=False, key=True),
            Column("Aircraft", numeric=False),
            Column("Empty weight"),
            Column("Record of"),
            Column("Useful load"),
            Column("Data"),
            Column("Problems", numeric=False),
        ],
        rows,
    )
    console.print(caution_text(PILOT_CAUTION))
