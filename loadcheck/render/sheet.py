"""A printable load sheet: one self-contained HTML page (no network fetches).

The load sheet holds the aircraft and registration, the aircraft data's fingerprint, the
date and time, the verdict, the moment table with its total, the occupants' seats, the fuel
plan (taxi, trip, reserve, burn order, fuel at each condition), the conditions with their
margins, the burn path, the findings, the chart as inline SVG, the caution, and lines for
the pilot's name, signature and date; its print stylesheet keeps it to one page of A4 or US
letter (tests/test_sheet_print.py prints it through a headless browser to check).
"""

from __future__ import annotations

import datetime as dt
import re
from html import escape
from typing import TYPE_CHECKING, Any

from ..display import Direction, fmt, unit_label
from ..results import CheckResult
from ..words import burn_path_sentence, given_fuel_words, sheet_verdict, trip_leg_verdict

if TYPE_CHECKING:
    from ..aircraft import Aircraft
    from ..empty_record import CategoryExtremes
    from ..loading import ResolvedLoading, ResolvedTrip

__all__ = ["load_sheet_html", "mechanic_sheet_html", "trip_sheet_html"]

_NAMES = {"ramp": "Ramp", "takeoff": "Takeoff", "landing": "Landing", "zero_fuel": "Zero fuel"}

_STYLE = """
body { font-family: "DejaVu Sans", Arial, Helvetica, sans-serif; font-size: 10pt; color: #111; margin: 1.5em; }
h1 { font-size: 14pt; margin: 0 0 .2em 0; }
h2 { font-size: 11pt; margin: 1em 0 .3em 0; border-bottom: 1px solid #999; }
table { border-collapse: collapse; margin: .2em 0; }
th, td { border: 1px solid #999; padding: .15em .5em; }
td.n { text-align: right; font-variant-numeric: tabular-nums; }
.meta td { border: none; padding: 0 1em 0 0; }
.verdict { font-weight: bold; padding: .3em .6em; border: 2px solid #111; display: inline-block; }
.limit { font-weight: bold; }
.chart svg { max-width: 100%; height: auto; }
.caution { margin-top: 1em; font-style: italic; border-top: 1px solid #999; padding-top: .5em; }
.sign td { border: none; padding: 1.6em 1em 0 0; }
.line { border-bottom: 1px solid #111; min-width: 16em; display: inline-block; }
@page { size: auto; margin: 12mm; }
@media print {
  body { margin: 0; font-size: 9pt; }
  .chart { page-break-inside: avoid; break-inside: avoid; }
  .chart svg { max-height: 170mm; }
  table { page-break-inside: avoid; }
}
"""


_SHEET_STYLE = """
body { font-family: "DejaVu Sans", Arial, Helvetica, sans-serif; font-size: 9pt; color: #111; margin: 1.5em; }
h1 { font-size: 13pt; margin: 0 0 .15em 0; }
h2 { font-size: 9.5pt; margin: .55em 0 .2em 0; border-bottom: 1px solid #999; }
h3 { font-size: 9pt; margin: .3em 0 .1em 0; }
table { border-collapse: collapse; margin: .1em 0; }
th, td { border: 1px solid #999; padding: .05em .35em; vertical-align: top; }
th { font-weight: 600; background: #f0f0f0; }
td.n { text-align: right; font-variant-numeric: tabular-nums; white-space: nowrap; }
tr.total td { font-weight: bold; border-top: 2px solid #111; }
.meta { display: grid; grid-template-columns: repeat(4, auto); gap: 0 1.2em; justify-content: start; }
.meta span.k { color: #444; }
.cols { display: grid; grid-template-columns: auto auto; gap: 0 1.5em; justify-content: start; align-items: start; }
.verdict { font-weight: bold; font-size: 11pt; padding: .2em .6em; border: 2px solid #111; display: inline-block;
           margin: .35em 0 0 0; }
.limit { font-weight: bold; }
.who { font-style: italic; }
ul.findings { margin: .1em 0; padding-left: 1.3em; }
.note { font-size: 7.5pt; color: #333; margin: .15em 0; }
.chart { break-inside: avoid; page-break-inside: avoid; }
.chart svg { display: block; width: 100%; height: 82mm; }
.caution { margin: .5em 0 0 0; font-style: italic; border-top: 1px solid #999; padding-top: .3em; }
.sign { display: grid; grid-template-columns: repeat(3, 1fr); gap: 0 2em; margin-top: 1.4em; }
.sign div { border-top: 1px solid #111; padding-top: .15em; }
@page { size: auto; margin: 10mm; }
@media print {
  /* one page: the chart takes the height the rest leaves (100vh is the printed page's area) */
  html, body { height: 100%; }
  body { margin: 0; font-size: 8pt; display: flex; flex-direction: column; height: 100vh; }
  h1 { font-size: 12pt; }
  table, .cols, .sign, .verdict { break-inside: avoid; page-break-inside: avoid; }
  .chart { flex: 1 1 0; min-height: 45mm; display: flex; flex-direction: column; }
  .chart svg { flex: 1 1 0; height: auto; min-height: 0; }
  .meta, .cols, .sign, .caution, .verdict, table, h1, h2, p, ul { flex: none; }
  .verdict { align-self: flex-start; }
}
"""


def _n(value: float | None, unit: str, direction: Direction = "nearest") -> str:
    if value is None:
        return ""
    return escape(fmt(value, unit, direction, with_unit=False))


def _cells(cells: list[str], numeric_from: int = 1, attrs: str = "") -> str:
    """A row: the first ``numeric_from`` cells as words, the others as numbers (already escaped)."""
    return (
        f"<tr{attrs}>"
        + "".join(f"<td class='n'>{c}</td>" if i >= numeric_from else f"<td>{c}</td>" for i, c in enumerate(cells))
        + "</tr>"
    )


def _head(cells: list[str]) -> str:
    return "<tr>" + "".join(f"<th>{escape(c)}</th>" for c in cells) + "</tr>"


def load_sheet_html(
    result: CheckResult,
    chart_svg: str | None = None,
    *,
    loading_label: str | None = None,
    when: dt.datetime | None = None,
    loading: ResolvedLoading | None = None,
    pilot: str | None = None,
    aircraft: Aircraft | None = None,
    verdict: str | None = None,
) -> str:
    """The load sheet of a check as one HTML document, laid out to print on one page of
    A4 or US letter.

    Parameters
    ----------
    result : the check
    chart_svg : an SVG document to embed (its XML header, size and metadata are dropped; the
        page sizes it)
    loading_label : the loading's label, if any
    when : time of the check (default: now, local time)
    loading : the loading as checked, for the fuel plan (taxi, trip, reserve, burn order) and
        the names of the people at the stations, where it gives them (beside each seat)
    pilot : the pilot in command named in the loading, if any
    aircraft : the aircraft checked; where its envelope is read as moment / 1000, the moment
        table and the conditions show that column too
    verdict : the verdict line in place of the check's own (a trip's leg: the leg's and the
        trip's, :func:`~loadcheck.words.trip_leg_verdict`)

    The page holds the aircraft, its data fingerprint, the verdict, the moment table with its
    total, the occupants' seats, the fuel plan with the fuel at each condition, the conditions
    with their margins, the burn path, the findings, the chart, the caution and the signature
    block. Figures are rounded as in the terminal (margins down, excesses up).
    """
    units = result.units
    info = result.aircraft
    when = when or dt.datetime.now().astimezone()
    title = f"Load sheet: {info.name}" + (f" · {info.registration}" if info.registration else "")
    meta = [
        ("Registration", info.registration or ""),
        ("Category", result.category),
        ("Aircraft data", info.fingerprint),
        ("Empty weight of", info.empty_weight_date or "not dated"),
        ("Loading", loading_label or ""),
        ("Checked", when.strftime("%Y-%m-%d %H:%M %Z").strip()),
    ]
    if pilot:
        meta.append(("Pilot in command", pilot))
    from .terminal import moment_table_columns, moment_table_figures

    heads, scaled, lateral = moment_table_columns(result, aircraft)
    verdict = verdict or sheet_verdict(len(result.limits_exceeded))
    parts = [
        "<!DOCTYPE html>",
        '<html lang="en"><head><meta charset="utf-8">',
        f"<title>{escape(title)}</title>",
        f"<style>{_SHEET_STYLE}</style></head><body>",
        f"<h1>{escape(title)}</h1>",
        "<div class='meta'>"
        + "".join(f"<span><span class='k'>{escape(k)}:</span> {escape(v)}</span>" for k, v in meta)
        + "</div>",
        f"<p class='verdict' id='verdict'>{escape(verdict)}</p>",
        "<div class='cols'><div>",
        "<h2>Moment table (engine start)</h2><table id='moments'>",
        _head(["Item", *heads]),
    ]

    def figures(weight: float, arm: float, mom: float, lat: float | None, lat_mom: float | None) -> list[str]:
        return [escape(f) for f in moment_table_figures(result, scaled, lateral, weight, arm, mom, lat, lat_mom)]

    people = loading.names if loading is not None else {}
    for item in result.items:
        name = item.name + (f" ({fmt(item.fuel_volume, units.fuel_volume)})" if item.fuel_volume is not None else "")
        cell = escape(name) + (f" <span class='who'>· {escape(people[item.id])}</span>" if item.id in people else "")
        parts.append(
            _cells([cell, *figures(item.weight, item.arm, item.moment, item.lateral_arm, item.lateral_moment)])
        )
    ramp = result.condition("ramp")
    parts.append(
        _cells(
            ["Total at ramp", *figures(ramp.weight, ramp.arm, ramp.moment, ramp.lateral_arm, ramp.lateral_moment)],
            attrs=" class='total' id='total'",
        )
    )
    parts.append(
        "</table><p class='note'>Each figure is rounded on its own; the total is the sum of the unrounded "
        "figures." + (" Lateral figures are + right of the centre line." if lateral else "") + "</p></div><div>"
    )
    seats = [i for i in result.items if i.kind == "seat"]
    parts.append("<h2>Occupants</h2>")
    if seats:
        named = any(i.id in people for i in seats)
        parts.append("<table id='occupants'>" + _head(["Seat", *(["Name"] if named else []), f"Weight ({units.mass})"]))
        parts += [
            _cells(
                [escape(i.name), *([escape(people.get(i.id, ""))] if named else []), _n(i.weight, units.mass)],
                numeric_from=2 if named else 1,
            )
            for i in seats
        ]
        parts.append("</table>")
    else:
        parts.append("<p>No one in a seat station.</p>")
    parts.append(_fuel_plan(result, loading))
    parts.append("</div></div>")
    parts.append(_conditions(result, scaled))

    sentence = burn_path_sentence(result)
    parts.append("<h2>Fuel burn, takeoff to landing</h2>")
    style = "" if result.burn_path.ok else " class='limit'"
    parts.append(f"<p{style}>{escape(sentence[0].upper() + sentence[1:])}</p>")

    parts.append("<h2>Findings</h2>")
    if result.findings:
        parts.append("<ul class='findings'>")
        for finding in result.findings:
            tag = "LIMIT" if finding.severity == "limit" else "WARNING"
            parts.append(f"<li class='{finding.severity}'><b>{tag}</b>: {escape(finding.message)}</li>")
        parts.append("</ul>")
    else:
        parts.append("<p>No findings.</p>")

    if chart_svg:
        parts.append(f"<div class='chart'><h2>Envelope</h2>{_inline_svg(chart_svg)}</div>")

    parts += [
        f"<p class='caution'>CAUTION: {escape(result.caution)}</p>",
        "<div class='sign' id='signature'><div>Pilot in command</div><div>Signature</div><div>Date</div></div>",
        "</body></html>",
    ]
    return "\n".join(parts)


def _fuel_plan(result: CheckResult, loading: ResolvedLoading | None) -> str:
    """The fuel plan: taxi, trip, reserve and burn order where the loading is given; fuel on
    board at each condition from the check."""
    units = result.units
    volume = units.fuel_volume
    out = ["<h2>Fuel plan</h2>"]
    if loading is not None:
        names = {i.id: i.name for i in result.items if i.kind == "fuel"}
        order = (
            "every tank together, in proportion"
            if loading.plan.order is None
            else ", then ".join(names.get(t, t) for t in loading.plan.order)
        )
        rows = [
            ("Taxi and run-up", fmt(loading.taxi, volume)),
            ("Trip", fmt(loading.trip, volume)),
            ("Reserve", "none given" if loading.reserve is None else fmt(loading.reserve, volume)),
            ("Burn order", order),
        ]
        out.append(
            "<table id='fuel-plan'>"
            + "".join(f"<tr><td>{escape(k)}</td><td>{escape(v)}</td></tr>" for k, v in rows)
            + "</table>"
        )
    out.append("<table id='fuel-on-board'>" + _head(["On board at", f"Fuel ({volume})", f"Fuel ({units.mass})"]))
    for c in result.conditions:
        out.append(_cells([escape(_NAMES[c.condition]), _n(c.fuel, volume), _n(c.fuel_weight, units.mass)]))
    out.append("</table>")
    return "".join(out)


def _conditions(result: CheckResult, scaled: Any = None) -> str:
    from .terminal import (
        CONDITION_STATE_HEADING,
        EDGE_NOTE,
        MARGIN_NOTE,
        NO_RANGE_NOTE,
        cg_margin,
        condition_verdict,
        no_cg_range,
        scaled_moment,
        scaled_moment_header,
        weight_margin,
    )

    units = result.units
    mac = any(c.mac_percent is not None for c in result.conditions)
    lateral = any(c.lateral_arm is not None for c in result.conditions)
    head = ["Condition", f"Fuel ({units.fuel_volume})", f"Weight ({units.mass})", f"CG ({units.arm})"]
    head += ["CG (% MAC)"] if mac else []
    head += [scaled_moment_header(scaled, units.moment)] if scaled is not None else []
    head += [f"Lateral CG ({units.arm}, + right)"] if lateral else []
    head += [CONDITION_STATE_HEADING, f"CG margin forward ({units.arm})", f"CG margin aft ({units.arm})"]
    head += [f"Lateral margin left ({units.arm})", f"Lateral margin right ({units.arm})"] if lateral else []
    head += [f"Weight margin ({units.mass})"]
    out = ["<h2>Conditions</h2><table id='conditions'>", _head(head)]
    edge = False
    for c in result.conditions:
        verdict = condition_verdict(c, result)[0]
        margin, marked = weight_margin(c, result)
        edge = edge or marked
        cells = [
            escape(_NAMES[c.condition]),
            _n(c.fuel, units.fuel_volume),
            _n(c.weight, units.mass),
            _n(c.arm, units.arm),
        ]
        cells += [_n(c.mac_percent, "%MAC")] if mac else []
        if scaled is not None:
            cells.append(
                escape(fmt(scaled_moment(scaled, c.weight, c.moment), units.moment, with_unit=False, places=1))
            )
        cells += [_n(c.lateral_arm, units.arm)] if lateral else []
        cells += [verdict, escape(cg_margin(c.margins.forward, units.arm)), escape(cg_margin(c.margins.aft, units.arm))]
        cells += (
            [escape(cg_margin(c.margins.left, units.arm)), escape(cg_margin(c.margins.right, units.arm))]
            if lateral
            else []
        )
        cells += [escape(margin)]
        result_at = 4 + mac + (scaled is not None) + lateral
        row = "".join(
            f"<td>{cell}</td>" if i in (0, result_at) else f"<td class='n' data-condition='{c.condition}'>{cell}</td>"
            for i, cell in enumerate(cells)
        )
        out.append(f"<tr id='condition-{c.condition}'>{row}</tr>")
    notes = MARGIN_NOTE + (" " + EDGE_NOTE if edge else "") + (" " + NO_RANGE_NOTE if no_cg_range(result) else "")
    out.append(f"</table><p class='note'>{escape(notes)}</p>")
    return "".join(out)


def _stop_tables(number: int, stop: Any, units: Any) -> str:
    """What changes at the stop before a leg: the fuel put in, tank by tank (as given and as it
    goes in), and the stations whose load changes, from and to."""
    volume, mass = units.fuel_volume, units.mass
    out = ["<div class='cols'><div><h3>Fuel put in at the stop</h3>"]
    if stop.fuel:
        out.append(
            f"<table id='stop-fuel-{number}'>"
            + _head(["Tank", "As given", f"Put in ({volume})", f"Put in ({mass})", f"On board after ({volume})"])
        )
        for u in stop.fuel:
            given = given_fuel_words(u, units)
            out.append(
                _cells(
                    [escape(u.name), escape(given), _n(u.volume, volume), _n(u.weight, mass), _n(u.on_board, volume)],
                    numeric_from=2,
                )
            )
        out.append("</table>")
    else:
        out.append(f"<p id='stop-fuel-{number}'>None.</p>")
    out.append("</div><div><h3>Load changed at the stop</h3>")
    if stop.stations:
        out.append(f"<table id='stop-load-{number}'>" + _head(["Station", f"From ({mass})", f"To ({mass})"]))
        out += [_cells([escape(c.name), _n(c.from_weight, mass), _n(c.to_weight, mass)]) for c in stop.stations]
        out.append("</table>")
    else:
        out.append(f"<p id='stop-load-{number}'>None.</p>")
    out.append("</div></div>")
    return "".join(out)


def _inline_svg(svg: str) -> str:
    """The SVG element alone, without its fixed size (the page's style sizes it; the viewBox keeps its shape)."""
    svg = svg[svg.find("<svg") :]
    head_end = svg.find(">")
    head = re.sub(r'\s(width|height)="[^"]*"', "", svg[:head_end])
    return head + svg[head_end:]


def _table(head: list[str], rows: list[list[str]], css: str = "") -> str:
    out = [f"<table{f' class={css!r}' if css else ''}><tr>" + "".join(f"<th>{escape(h)}</th>" for h in head) + "</tr>"]
    numeric = ["(" in h for h in head]  # columns with a unit hold numbers
    for row in rows:
        out.append(
            "<tr>"
            + "".join(f"<td{' class=n' if numeric[i] else ''}>{escape(c)}</td>" for i, c in enumerate(row))
            + "</tr>"
        )
    out.append("</table>")
    return "\n".join(out)


_RECORD_STYLE = """
body.record { font-size: 9pt; margin: 1em; }
body.record h1 { font-size: 12pt; }
body.record h2 { font-size: 10pt; margin: .6em 0 .2em 0; }
body.record h3 { font-size: 9pt; margin: .3em 0 .1em 0; }
.extreme-items td { white-space: nowrap; }
body.record p { margin: .3em 0; }
body.record th, body.record td { padding: .05em .4em; }
.cols { display: flex; gap: 1.5em; flex-wrap: wrap; align-items: flex-start; }
.sign { margin-top: .6em; }
.sign td { padding: 1.2em 1em 0 0; }
.line { min-width: 14em; }
@media print { body.record { font-size: 8pt; } }
"""


def _geometry_words(geometry: dict[str, Any], arm: str) -> str:
    return (
        f"{geometry['gear']}, datum {geometry['datum']} of the main wheels; D (datum to the main-wheel centreline) "
        f"{fmt(geometry['main_distance'], arm)}, L (main wheels to the "
        f"{'nose' if geometry['gear'] == 'nosewheel' else 'tail'}"
        f" wheel) {fmt(geometry['wheelbase'], arm)}"
    )


def _case_words(case: Any) -> str:
    """A case's verdict as ``loadcheck extremes`` gives it (render_extremes), shortened for a cell."""
    if not case.ok:
        return "NOT within limits"
    return "within limits" if case.complete else "NOT ESTABLISHED (search cut)"


def _extremes_html(extremes: list[CategoryExtremes] | None, m: str, a: str) -> list[str]:
    """The record's extreme-loading section: a verdict naming the categories not all within
    limits, one summary row per category and side, and each category's loads and limit findings."""
    from ..empty_record import categories_words, not_computed

    if not extremes:
        return ["<p class='limit' id='extremes-verdict'>Not computed: no category to check.</p>"]
    failed = [entry.category for entry in extremes if not entry.ok]
    every = ", ".join(entry.category for entry in extremes)
    verdict = (
        f"NOT all within limits (or not established) in {categories_words(failed)}; checked: {every}"
        if failed
        else f"Within limits in every category of the aircraft: {every}"
    )
    parts = [f"<p class='limit' id='extremes-verdict'>{escape(verdict)}.</p>"]
    for reason, names in not_computed(extremes).items():
        parts.append(f"<p class='limit'>Not computed in {escape(categories_words(names))}: {escape(reason)}.</p>")

    def n(value: float | None, unit: str) -> str:
        return "" if value is None else fmt(value, unit, with_unit=False)

    summary = []
    for entry in extremes:
        if entry.checks is None:
            continue
        for case in entry.checks.cases:  # forward and rearward, and left and right where a lateral envelope limits
            ramp = case.check.condition("ramp")
            lateral = case.side in ("left", "right")
            summary.append(
                [
                    entry.category,
                    f"Most {case.side}",
                    n(ramp.weight, m),
                    n(ramp.lateral_arm if lateral else ramp.arm, a) + (" lateral" if lateral else ""),
                    n(case.limit_arm, a) + (" lateral" if lateral else ""),
                    _case_words(case),
                ]
            )
    if not summary:
        return parts
    parts.append(
        _table(
            ["Category", "Loading", f"Weight ({m})", f"CG ({a})", f"Limit at its weight ({a})", "Result"],
            summary,
            "extremes",
        )
    )
    shown = [(entry.category, case) for entry in extremes if entry.checks is not None for case in entry.checks.cases]
    if not shown:
        return parts
    states: dict[str, list[str]] = {}
    for category, case in shown:
        if case.fuel_states:
            states.setdefault(str(case.fuel_states), []).append(f"{category} {case.side}")
    if states:
        covered = "; ".join(f"{state} ({', '.join(where)})" for state, where in states.items())
        parts.append(f"<p>Fuel states covered: {escape(covered)}.</p>")
    names = list(dict.fromkeys(i.name for _, case in shown for i in case.check.items))
    by_case = [{i.name: i for i in case.check.items} for _, case in shown]
    rows = []
    for name in names:
        row = [name]
        for items in by_case:
            item = items.get(name)
            row.append("" if item is None else f"{n(item.weight, m)} at {n(item.arm, a)}")
        rows.append(row)
    heads = ["Item"] + [f"{category}, {case.side} ({m} at {a})" for category, case in shown]
    parts.append(_table(heads, rows, "extreme-items"))
    for category, case in shown:
        for finding in case.check.findings:
            if finding.severity == "limit" and finding.condition in ("ramp", "takeoff", None):
                parts.append(
                    f"<p class='limit'>{escape(category.capitalize())} category, most {case.side}: "
                    f"LIMIT {escape(finding.message)}</p>"
                )
    return parts


def mechanic_sheet_html(
    result: Any,
    units: Any,
    *,
    extremes: list[CategoryExtremes] | None = None,
    source: str | None = None,
    when: dt.datetime | None = None,
    comparison: list[Any] | None = None,
) -> str:
    """A printable record of a weighing or an equipment change, for the mechanic to sign.

    Holds what the record rests on (weighing: date, who weighed, the gear and datum geometry,
    the points with their lateral arms, the corrections; changes: their date, description,
    who made them and each change), the previous and the new record side by side (weight,
    CG, lateral CG, moment, useful load, date), the empty-weight CG range, the warnings and
    refusals, the extreme-loading checks (AC 43.13-1B 10-17) with the new record in each
    category, each named by its category, the caution
    that the record is made and signed under the local authority's rules, and blank lines for
    name, certificate number, signature and date. Laid out to fit one page of A4 or US letter.

    Parameters
    ----------
    result : a :class:`~loadcheck.weighing.WeighResult` or :class:`~loadcheck.alterations.AlterResult`
    units : the aircraft's units
    extremes : the :attr:`loadcheck.empty_record.Proposal.extremes` of the new record, one
        :class:`~loadcheck.empty_record.CategoryExtremes` per category
    source : the readings or changes file
    when : time of the computation (default: now, local time)
    comparison : the rows of :meth:`loadcheck.empty_record.Proposal.comparison`
    """
    when = when or dt.datetime.now().astimezone()
    weighing = hasattr(result, "points")
    title = ("Weighing record" if weighing else "Equipment change record") + f": {result.aircraft}"
    if result.registration:
        title += f" ({result.registration})"
    m, a, mo = units.mass, units.arm, units.moment
    moment_heading = unit_label(mo)  # lb·in, as every figure's unit and the load sheet write it

    def n(value: float | None, unit: str, *, nonzero: bool = False) -> str:
        return "" if value is None else fmt(value, unit, with_unit=False, nonzero=nonzero)

    meta = [("Aircraft", result.aircraft), ("Registration", result.registration or "")]
    if weighing:
        meta += [
            ("Weighed on", result.date or "not dated in the readings"),
            ("Weighed by", result.weighed_by or "not named in the readings"),
        ]
        if result.note:
            meta.append(("Note", result.note if len(result.note) <= 300 else result.note[:300] + " [cut]"))
    else:
        meta += [
            ("Changes of", result.date or "not dated in the changes file"),
            ("Description", result.description or "none given"),
            ("Changes made by", result.by or "not named"),
        ]
    meta += [("Computed from", source or ""), ("Computed", when.strftime("%Y-%m-%d %H:%M %Z").strip())]
    parts = [
        "<!DOCTYPE html>",
        '<html lang="en"><head><meta charset="utf-8">',
        f"<title>{escape(title)}</title>",
        f"<style>{_STYLE}{_RECORD_STYLE}</style></head><body class='record'>",
        f"<h1>{escape(title)}</h1>",
        "<table class='meta'>"
        + "".join(
            f"<tr><td>{escape(k)}</td><td id='meta-{escape(k.lower().replace(' ', '-'))}'>{escape(v)}</td></tr>"
            for k, v in meta
        )
        + "</table>",
    ]
    if weighing:
        lateral = any(p.lateral_arm is not None for p in result.points)
        parts.append("<h2>Weighing points</h2>")
        if result.geometry is not None:
            parts.append(f"<p id='geometry'>Geometry: {escape(_geometry_words(result.geometry, a))}.</p>")
        head = ["Point", f"Reading ({m})", f"Tare ({m})", f"Net ({m})", f"Arm ({a})", f"Moment ({moment_heading})"]
        head += [f"Lateral arm ({a}, + right)"] if lateral else []
        parts.append(
            _table(
                head,
                [
                    [p.label, n(p.reading, m), n(p.tare, m), n(p.net, m), n(p.arm, a), n(p.moment, mo)]
                    + ([n(p.lateral_arm, a)] if lateral else [])
                    for p in result.points
                ],
            )
        )
        if result.formula_cg is not None:
            parts.append(
                f"<p>As-weighed CG by the FAA-H-8083-1 formula for this gear and datum: "
                f"{escape(fmt(result.formula_cg, a))}.</p>"
            )
        if result.corrections:
            parts.append("<h2>Corrections</h2>")
            parts.append(
                _table(
                    ["Item", "", f"Weight ({m})", f"Arm ({a})", f"Moment ({moment_heading})"],
                    [[c.label, c.action, n(c.weight, m), n(c.arm, a), n(c.moment, mo)] for c in result.corrections],
                )
            )
    else:
        parts.append("<h2>Changes</h2>")
        parts.append(
            _table(
                [
                    "Action",
                    "Item",
                    f"Weight ({m})",
                    f"Arm ({a})",
                    f"New arm ({a})",
                    f"Moment change ({moment_heading})",
                ],
                [
                    [
                        c.action,
                        c.label,
                        n(c.weight, m, nonzero=True),  # a light item's weight never shows as 0.0
                        n(c.arm, a),
                        n(c.new_arm, a),
                        fmt(c.moment_change, mo, with_unit=False, signed=True),
                    ]
                    for c in result.lines
                ],
            )
        )
        parts.append(f"<p>{escape(result.negligible.text)}</p>")

    parts.append("<h2>Empty-weight record: previous and new</h2>")
    if comparison is not None:
        rows = []
        for row in comparison:
            cells = []
            for value in (row.current, row.new):
                cells.append(value if isinstance(value, str) else ("" if value is None else fmt(value, row.unit)))
            change = ""
            if isinstance(row.current, (int, float)) and isinstance(row.new, (int, float)):
                change = fmt(row.new - row.current, row.unit, signed=True)
            rows.append([row.quantity, *cells, change])
        head = ["", "Previous record", "New record", "Change"]
        if weighing:
            aw = result.as_weighed
            as_weighed = {
                "empty weight": fmt(aw.weight, m),
                "empty-weight CG": fmt(aw.arm, a),
                "empty-weight moment": fmt(aw.moment, mo),
                "lateral CG (+ right)": "" if aw.lateral_arm is None else fmt(aw.lateral_arm, a),
            }
            head = ["", "Previous record", "As weighed", "New record", "Change"]
            rows = [[r[0], r[1], as_weighed.get(r[0], ""), r[2], r[3]] for r in rows]
        parts.append(_table(head, rows, "record-table"))
    cg_range = result.cg_range
    if cg_range is None:
        parts.append("<p id='cg-range'>Empty-weight CG range: not given in the aircraft file.</p>")
    else:
        inside = cg_range[0] <= result.new.arm <= cg_range[1]
        parts.append(
            f"<p id='cg-range'>Empty-weight CG range: {escape(fmt(cg_range[0], a))} to {escape(fmt(cg_range[1], a))}; "
            f"the new CG {escape(fmt(result.new.arm, a))} is "
            f"{'within it' if inside else '<b>OUTSIDE IT</b>'}.</p>"
        )
    for warning in getattr(result, "warnings", []):
        parts.append(f"<p class='limit'>WARNING: {escape(warning)}</p>")
    for refusal in getattr(result, "refusals", []):
        head_words = "NOT WRITTEN WITHOUT AN OVERRIDE" if refusal.overridable else "NEVER WRITTEN"
        parts.append(f"<p class='limit'>{head_words}: {escape(refusal.message)}</p>")

    parts.append("<h2>Extreme loadings with the new record (AC 43.13-1B 10-17)</h2>")
    parts += _extremes_html(extremes, m, a)
    parts += [
        f"<p class='caution'>CAUTION: {escape(result.caution)}</p>",
        "<table class='sign' id='signature'>",
        "<tr><td>Name</td><td><span class='line'>&nbsp;</span></td>"
        "<td>Certificate number</td><td><span class='line'>&nbsp;</span></td></tr>",
        "<tr><td>Signature</td><td><span class='line'>&nbsp;</span></td>"
        "<td>Date</td><td><span class='line'>&nbsp;</span></td></tr>",
        "</table>",
        "</body></html>",
    ]
    return "\n".join(parts)


def trip_sheet_html(
    trip: Any,
    chart_svg: str | None = None,
    *,
    loading_label: str | None = None,
    when: dt.datetime | None = None,
    trip_loading: ResolvedTrip | None = None,
) -> str:
    """The load sheet of a trip: the trip's verdict naming each leg out of limits, then each
    leg's own load sheet section (:func:`load_sheet_html` of the leg's check), the chart
    with one path per leg, the caution and the signature block once.

    Parameters
    ----------
    trip : a :class:`~loadcheck.results.TripResult`
    trip_loading : the trip as checked, for each leg's fuel plan and the names of the people
        at its stations (as ``loading`` of :func:`load_sheet_html`)
    """
    when = when or dt.datetime.now().astimezone()
    page = load_sheet_html(trip.legs[0].check, None, loading_label=loading_label, when=when)
    head, _, rest = page.partition("<body>")
    tail = rest[rest.index("<p class='caution'>") :]
    title = rest[rest.index("<h1>") + 4 : rest.index("</h1>")]
    names = [f"Leg {leg.leg}" + (f" ({leg.label})" if leg.label else "") for leg in trip.legs]
    failed = [name for name, leg in zip(names, trip.legs, strict=True) if not leg.check.ok]
    from ..trip import leg_verdict_text
    from .trip import trip_verdict

    # the trip's and each leg's verdict in the terminal's words: the warnings of a leg within limits
    # (a landing below its reserve) are said, not left under a bare "within limits"
    parts = [
        head + "<body>",
        f"<h1>{title}: a trip of {len(trip.legs)} legs</h1>",
        f'<p class="verdict" id="trip-verdict">{escape(trip_verdict(trip))}</p>',
        "<table><tr><th>Leg</th><th>Result</th></tr>",
    ]
    parts += [
        f"<tr><td>{escape(name)}</td><td>{'within limits' if leg.check.ok else 'OUT OF LIMITS'}: "
        f"{escape(leg_verdict_text(leg.check))}</td></tr>"
        for name, leg in zip(names, trip.legs, strict=True)
    ]
    parts.append("</table>")
    resolved = list(trip_loading.legs) if trip_loading is not None else [None] * len(trip.legs)
    for name, leg, loading in zip(names, trip.legs, resolved, strict=True):
        section = load_sheet_html(
            leg.check,
            None,
            loading_label=f"{loading_label or 'trip'}, {name.lower()}",
            when=when,
            loading=loading,
            verdict=trip_leg_verdict(name, len(leg.check.limits_exceeded), failed),
        )
        body = section[section.index("<body>") + 6 : section.index("<p class='caution'>")]
        body = (
            body[: body.index("<h1>")]
            + f"<h2 id='leg-{leg.leg}'>{escape(name)}</h2>"
            + ("" if leg.stop is None else _stop_tables(leg.leg, leg.stop, trip.units))
            + body[body.index("</h1>") + 5 :]
        )
        parts.append(f"<section class='leg'>{body}</section>")
    if chart_svg:
        parts.append(f"<div class='chart'><h2>Envelope, every leg</h2>{chart_svg[chart_svg.find('<svg') :]}</div>")
    return "\n".join(parts) + "\n" + tail
