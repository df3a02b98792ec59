"""A printable load sheet: one self-contained HTML page (no network fetches).

The page holds the aircraft and registration, the aircraft data's fingerprint, the date
and time, the moment table, the conditions with their margins, the burn path, the
findings, the chart as inline SVG, the caution, and blank lines for the pilot's name and
signature. A print stylesheet fits it to A4 or US letter.
"""

from __future__ import annotations

import datetime as dt
from html import escape
from typing import Any

from ..display import fmt
from ..results import CheckResult

__all__ = ["load_sheet_html", "mechanic_sheet_html"]

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


def _n(value: float | None, unit: str, direction: str = "nearest") -> str:
    if value is None:
        return ""
    return escape(fmt(value, unit, direction, with_unit=False))  # type: ignore[arg-type]


def load_sheet_html(
    result: CheckResult,
    chart_svg: str | None = None,
    *,
    loading_label: str | None = None,
    when: dt.datetime | None = None,
) -> str:
    """The load sheet of a check as one HTML document.

    Parameters
    ----------
    result : the check
    chart_svg : an SVG document to embed (its XML header is dropped)
    loading_label : the loading's label, if any
    when : time of the check (default: now, local time)
    """
    units = result.units
    info = result.aircraft
    when = when or dt.datetime.now().astimezone()
    title = f"Load sheet: {info.name}" + (f" ({info.registration})" if info.registration else "")
    parts = [
        "<!DOCTYPE html>",
        '<html lang="en"><head><meta charset="utf-8">',
        f"<title>{escape(title)}</title>",
        f"<style>{_STYLE}</style></head><body>",
        f"<h1>{escape(title)}</h1>",
        '<table class="meta">',
        f"<tr><td>Aircraft</td><td>{escape(info.name)}</td></tr>",
        f"<tr><td>Registration</td><td>{escape(info.registration or '')}</td></tr>",
        f"<tr><td>Aircraft data fingerprint</td><td><code>{escape(info.fingerprint)}</code></td></tr>",
        f"<tr><td>Empty-weight record of</td><td>{escape(info.empty_weight_date or 'not dated')}</td></tr>",
        f"<tr><td>Category</td><td>{escape(result.category)}</td></tr>",
        f"<tr><td>Loading</td><td>{escape(loading_label or '')}</td></tr>",
        f"<tr><td>Checked</td><td>{escape(when.strftime('%Y-%m-%d %H:%M %Z').strip())}</td></tr>",
        "</table>",
        f'<p class="verdict">{"WITHIN LIMITS" if result.ok else "OUT OF LIMITS"}</p>',
        "<h2>Moment table (engine start)</h2>",
        "<table><tr><th>Item</th>"
        f"<th>Weight ({units.mass})</th><th>Arm ({units.arm})</th><th>Moment ({units.moment})</th></tr>",
    ]
    for item in result.items:
        name = item.name + (f" ({fmt(item.fuel_volume, units.fuel_volume)})" if item.fuel_volume is not None else "")
        parts.append(
            f"<tr><td>{escape(name)}</td><td class='n'>{_n(item.weight, units.mass)}</td>"
            f"<td class='n'>{_n(item.arm, units.arm)}</td><td class='n'>{_n(item.moment, units.moment)}</td></tr>"
        )
    parts.append("</table>")

    mac = any(c.mac_percent is not None for c in result.conditions)
    lateral = any(c.lateral_arm is not None for c in result.conditions)
    head = ["Condition", f"Fuel ({units.fuel_volume})", f"Weight ({units.mass})", f"CG ({units.arm})"]
    head += ["CG (% MAC)"] if mac else []
    head += [f"Lateral CG ({units.arm}, + right)"] if lateral else []
    head += [f"Fwd margin ({units.arm})", f"Aft margin ({units.arm})", f"Weight margin ({units.mass})", "Result"]
    parts.append("<h2>Conditions</h2><table><tr>" + "".join(f"<th>{escape(h)}</th>" for h in head) + "</tr>")
    for c in result.conditions:
        cells = [
            escape(_NAMES[c.condition]), _n(c.fuel, units.fuel_volume), _n(c.weight, units.mass), _n(c.arm, units.arm)
        ]
        cells += [_n(c.mac_percent, "%MAC")] if mac else []
        cells += [_n(c.lateral_arm, units.arm)] if lateral else []
        cells += [
            _n(c.margins.forward, units.arm, "down"), _n(c.margins.aft, units.arm, "down"),
            _n(c.margins.weight, units.mass, "down"), "within" if c.ok else "OUTSIDE",
        ]
        row = "".join(
            f"<td class='n' data-condition='{c.condition}'>{cell}</td>" if 0 < i < len(cells) - 1 else f"<td>{cell}</td>"
            for i, cell in enumerate(cells)
        )
        parts.append(f"<tr id='condition-{c.condition}'>{row}</tr>")
    parts.append("</table><p>Margins are rounded down; an excess is rounded up.</p>")

    path = result.burn_path
    parts.append("<h2>Fuel burn, takeoff to landing</h2>")
    if path.ok:
        parts.append("<p>The CG stays inside the envelope all the way.</p>")
    elif path.leaves_at is not None:
        leave = path.leaves_at
        parts.append(
            f"<p class='limit'>The CG leaves the envelope after {escape(fmt(leave.fuel_burned, units.mass, 'down'))} "
            f"burned, at {escape(fmt(leave.weight, units.mass))} and CG {escape(fmt(leave.arm, units.arm))}.</p>"
        )
    else:
        parts.append("<p class='limit'>The takeoff point is outside the envelope.</p>")

    parts.append("<h2>Findings</h2>")
    if result.findings:
        parts.append("<ul>")
        for finding in result.findings:
            tag = "LIMIT" if finding.severity == "limit" else "WARNING"
            parts.append(f"<li class='{finding.severity}'>{tag}: {escape(finding.message)}</li>")
        parts.append("</ul>")
    else:
        parts.append("<p>No findings.</p>")

    if chart_svg:
        svg = chart_svg[chart_svg.find("<svg"):]
        parts.append(f"<div class='chart'><h2>Envelope</h2>{svg}</div>")

    parts += [
        f"<p class='caution'>CAUTION: {escape(result.caution)}</p>",
        "<table class='sign'>",
        "<tr><td>Pilot in command</td><td><span class='line'>&nbsp;</span></td></tr>",
        "<tr><td>Signature</td><td><span class='line'>&nbsp;</span></td></tr>",
        "<tr><td>Date</td><td><span class='line'>&nbsp;</span></td></tr>",
        "</table>",
        "</body></html>",
    ]
    return "\n".join(parts)


def _table(head: list[str], rows: list[list[str]]) -> str:
    out = ["<table><tr>" + "".join(f"<th>{escape(h)}</th>" for h in head) + "</tr>"]
    numeric = ["(" in h for h in head]  # columns with a unit hold numbers
    for row in rows:
        out.append("<tr>" + "".join(f"<td{' class=n' if numeric[i] else ''}>{escape(c)}</td>" for i, c in enumerate(row))
                   + "</tr>")
    out.append("</table>")
    return "\n".join(out)


def mechanic_sheet_html(result: Any, units: Any, *, extremes: Any = None, source: str | None = None,
                        when: dt.datetime | None = None) -> str:
    """A printable record of a weighing or an equipment change, for the mechanic to sign.

    Holds the inputs, the corrections or changes, the new empty-weight record and the change
    from the current one, the extreme-loading checks where given, blank lines for name,
    certificate number and signature, and the caution that the record is made and signed
    under the local authority's rules.
    """
    when = when or dt.datetime.now().astimezone()
    weighing = hasattr(result, "points")
    title = ("Weighing record" if weighing else "Equipment change record") + f": {result.aircraft}"
    if result.registration:
        title += f" ({result.registration})"
    m, a, mo = units.mass, units.arm, units.moment

    def n(value: float, unit: str) -> str:
        return fmt(value, unit, with_unit=False)

    parts = [
        "<!DOCTYPE html>", '<html lang="en"><head><meta charset="utf-8">', f"<title>{escape(title)}</title>",
        f"<style>{_STYLE}</style></head><body>", f"<h1>{escape(title)}</h1>",
        f"<p>Computed {escape(when.strftime('%Y-%m-%d %H:%M %Z').strip())}"
        + (f" from <code>{escape(source)}</code>" if source else "") + "</p>",
    ]
    if weighing:
        parts.append("<h2>Weighing points</h2>")
        parts.append(_table(["Point", f"Reading ({m})", f"Tare ({m})", f"Net ({m})", f"Arm ({a})", f"Moment ({mo})"],
                            [[p.label, n(p.reading, m), n(p.tare, m), n(p.net, m), n(p.arm, a), n(p.moment, mo)]
                             for p in result.points]))
        if result.corrections:
            parts.append("<h2>Corrections</h2>")
            parts.append(_table(["Item", "", f"Weight ({m})", f"Arm ({a})", f"Moment ({mo})"],
                                [[c.label, c.action, n(c.weight, m), n(c.arm, a), n(c.moment, mo)] for c in result.corrections]))
        records = [("As weighed", result.as_weighed), ("New basic empty weight", result.new), ("Previous record", result.previous)]
    else:
        parts.append("<h2>Changes</h2>")
        parts.append(_table(["Action", "Item", f"Weight ({m})", f"Arm ({a})", f"New arm ({a})", f"Moment change ({mo})"],
                            [[c.action, c.label, n(c.weight, m), n(c.arm, a), "" if c.new_arm is None else n(c.new_arm, a),
                              n(c.moment_change, mo)] for c in result.lines]))
        records = [("Previous record", result.previous), ("New basic empty weight", result.new)]
        verdict = {True: "negligible", False: "not negligible", None: "cannot be judged"}[result.negligible.overall]
        parts.append(f"<p>AC 43.13-1B 10-2 c: the change is {escape(verdict)} ({escape(result.negligible.weight_threshold)}; "
                     f"{escape(result.negligible.cg_threshold)}).</p>")
    parts.append("<h2>Empty-weight record</h2>")
    parts.append(_table(["", f"Weight ({m})", f"Arm ({a})", f"Moment ({mo})"],
                        [[name, n(r.weight, m), n(r.arm, a), n(r.moment, mo)] for name, r in records]))
    parts.append(f"<p>Change: weight {escape(fmt(result.change_weight, m))}, CG {escape(fmt(result.change_arm, a))}; "
                 f"useful load {escape(fmt(result.useful_load, m))}.</p>")
    for warning in getattr(result, "warnings", []):
        parts.append(f"<p class='limit'>WARNING: {escape(warning)}</p>")
    if extremes is not None:
        parts.append("<h2>Weight and balance extremes (AC 43.13-1B 10-17)</h2>")
        for case in (extremes.forward, extremes.rearward):
            ramp = case.check.condition("ramp")
            parts.append(f"<p><b>Most {case.side} loading</b>: {escape(fmt(ramp.weight, m))} at CG {escape(fmt(ramp.arm, a))}: "
                         f"{'within limits' if case.ok else 'NOT within limits'}</p>")
            parts.append(_table(["Item", f"Weight ({m})", f"Arm ({a})", f"Moment ({mo})"],
                                [[i.name, n(i.weight, m), n(i.arm, a), n(i.moment, mo)] for i in case.check.items]))
    parts += [
        f"<p class='caution'>CAUTION: {escape(result.caution)}</p>",
        "<table class='sign'>",
        "<tr><td>Name</td><td><span class='line'>&nbsp;</span></td></tr>",
        "<tr><td>Certificate number</td><td><span class='line'>&nbsp;</span></td></tr>",
        "<tr><td>Signature</td><td><span class='line'>&nbsp;</span></td></tr>",
        "<tr><td>Date</td><td><span class='line'>&nbsp;</span></td></tr>",
        "</table>", "</body></html>",
    ]
    return "\n".join(parts)
