"""Terminal output of a trip of several legs: every leg as a single check is shown, then the
trip's verdict naming each leg out of limits, then the caution.

Renderers compute nothing: every figure comes from the result. Meaning never rests on
colour alone: every verdict is written in words.
"""

from __future__ import annotations

from collections.abc import Sequence
from typing import TYPE_CHECKING, Any

from rich.console import Console
from rich.panel import Panel
from rich.text import Text

from ..display import fmt
from ..results import TripLeg, TripResult
from ..words import stop_lines, stretch_text
from .terminal import (
    Column,
    _burn_line,
    _conditions_table,
    _flight_result,
    _lines,
    _moment_table,
    _print_table,
    caution_text,
    fleet_condition_cell,
    flight_reference,
)

if TYPE_CHECKING:
    from ..trip import TripPlan

__all__ = ["fleet_trip_rows", "render_trip", "render_trip_plan", "trip_verdict"]

_OK_STYLE, _LIMIT_STYLE, _WARN_STYLE = "bold green", "bold red", "bold yellow"


def _leg_title(leg: TripLeg) -> str:
    return f"Leg {leg.leg}" + (f" ({leg.label})" if leg.label else "")


def trip_verdict(result: TripResult) -> str:
    """The trip's verdict in words: within limits with every leg's warnings together, or naming
    every leg out of limits (:func:`loadcheck.trip.trip_verdict_text`)."""
    from ..trip import trip_verdict_text

    return ("WITHIN LIMITS " if result.ok else "OUT OF LIMITS ") + trip_verdict_text(result)


def render_trip(result: TripResult, console: Console, plots: Sequence[Sequence[str]] = ()) -> None:
    """Print a trip: a header, then for each leg its moment table, conditions (with the
    conditions table's own note on how margins are rounded), burn path and findings (each
    finding tagged with its leg and condition), then the trip's verdict and last the
    caution. ``plots`` are text plots, one per leg, if given."""
    info = result.aircraft
    header = info.name + (f" · {info.registration}" if info.registration else "")
    header += f" · {result.category} category · data {info.fingerprint}"
    if info.empty_weight_date:
        header += f" · empty weight of {info.empty_weight_date}"
    console.print(Text(header, style="bold"))
    console.print(Text(f"A trip of {len(result.legs)} legs; each leg is checked as a single loading.", style="bold"))
    _legs(result, console, plots)
    console.print(Panel(Text(trip_verdict(result), style=_OK_STYLE if result.ok else _LIMIT_STYLE), expand=False))
    console.print(caution_text(result.caution))


def _legs(result: TripResult, console: Console, plots: Sequence[Sequence[str]] = ()) -> None:
    """Each leg as ``check`` shows a loading: its verdict, what changed at the stop before it
    (the fuel put in and the stations whose load changed), fuel, moment table, conditions, burn
    path and findings (tagged with the leg), and its text plot if given."""
    from ..trip import leg_verdict_text

    units = result.units
    for index, leg in enumerate(result.legs):
        check = leg.check
        state = "within limits" if check.ok else "OUT OF LIMITS"
        style = _OK_STYLE if check.ok else _LIMIT_STYLE
        console.print(Text(f"{_leg_title(leg)}: {state}: {leg_verdict_text(check)}", style=style))
        if leg.stop is not None:
            for line in stop_lines(leg.stop, units):
                console.print(line, markup=False)
        ramp, landing = check.condition("ramp"), check.condition("landing")
        console.print(
            f"fuel at engine start {fmt(ramp.fuel, units.fuel_volume)}, at landing "
            f"{fmt(landing.fuel, units.fuel_volume)}",
            markup=False,
        )
        _moment_table(check, console)
        _conditions_table(check, console)
        console.print(_burn_line(check))
        tagged = [
            (
                Text(
                    "LIMIT" if f.severity == "limit" else "WARNING",
                    style=_LIMIT_STYLE if f.severity == "limit" else _WARN_STYLE,
                ),
                Text(f"{_leg_title(leg).lower()}: {f.message}"),
            )
            for f in check.findings
        ]
        if tagged:
            _lines(console, tagged)
        if index < len(plots):
            for text in plots[index]:
                console.print(text, markup=False, highlight=False)


def render_trip_plan(plan: TripPlan, console: Console) -> None:
    """Print a trip planning answer: the answer, every stretch within limits, what limits it,
    and each leg's verdict at the answer."""
    console.print(Text(plan.question[:1].upper() + plan.question[1:], style="bold"))
    console.print(Text(f"{plan.variable}: {plan.answer_display}", style=_OK_STYLE if plan.feasible else _LIMIT_STYLE))
    if plan.governing:
        console.print(f"limited by: {plan.governing}", markup=False)
    if "least" in plan.extra:
        reserves = " and lands each with its reserve" if plan.reserves else ""
        console.print(f"least that keeps every leg within limits{reserves}: {plan.extra['least']}", markup=False)
    if plan.intervals:
        _print_table(
            console,
            f"{plan.variable} within limits ({plan.unit})",
            [Column("within limits")],
            [[stretch_text(i.low, i.high, plan.unit)] for i in plan.intervals],
        )
        console.print(Text("Stretches are rounded inward: the ends shown are within limits.", style="dim"))
    if plan.trip is not None:
        console.print(Text("The loading checked at this answer, leg by leg", style="bold"))
        _legs(plan.trip, console)
        console.print(
            Panel(Text(trip_verdict(plan.trip), style=_OK_STYLE if plan.trip.ok else _LIMIT_STYLE), expand=False)
        )
    console.print(caution_text(plan.caution))


def fleet_trip_rows(flight: Any) -> list[list[str | Text]]:
    """The rows of a trip in the fleet check's table (loadcheck.render.terminal.render_fleet):
    the trip's verdict and its first finding (which names its leg and condition), then one row
    per leg with its CSV line, its verdict and first finding (named by leg), its takeoff and
    landing weight and CG (and lateral CG, :func:`~loadcheck.render.terminal.fleet_condition_cell`).
    ``flight`` is a :class:`loadcheck.fleet.Flight` of a trip."""
    from ..trip import leg_name

    row, result = flight.row, flight.result
    units = result["units"]
    lines = row.lines or (row.line,)
    verdict, first = _flight_result(result)
    trip = f"trip {row.trip}, " if row.trip else ""
    rows: list[list[str | Text]] = [
        [
            f"{lines[0]}-{lines[-1]}" if len(lines) > 1 else str(lines[0]),
            row.registration or "",
            verdict + Text(f"\n({trip}{len(result['legs'])} legs)" + (f"\n{first}" if first else "")),
            flight_reference(row),
            "",
            "",
        ]
    ]
    for leg in result["legs"]:
        name = leg_name(leg["leg"], leg.get("label"))
        verdict, first = _flight_result(leg)
        conditions = {c["condition"]: c for c in leg["conditions"]}
        takeoff, landing = conditions["takeoff"], conditions["landing"]
        line = lines[leg["leg"] - 1] if leg["leg"] <= len(lines) else lines[0]
        rows.append(
            [
                str(line),
                row.registration or "",
                Text(f"{name}: ") + verdict + Text(f"\n{name}: {first}" if first else ""),
                name,
                fleet_condition_cell(takeoff, units),
                fleet_condition_cell(landing, units),
            ]
        )
    return rows
