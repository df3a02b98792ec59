"""The mechanic's commands: weigh, alter, history, extremes, schedule."""

from __future__ import annotations

import json
from collections.abc import Callable
from pathlib import Path
from typing import Annotated, Any

import typer

from ..errors import InputError, LoadcheckError, Problem
from .common import (
    EXIT_LIMIT,
    EXIT_OK,
    CategoryOpt,
    JsonOpt,
    _console,
    app,
    input_errors,
)

# -- the mechanic's commands -----------------------------------------------------------------

WriteOpt = Annotated[bool, typer.Option("--write", help="Make the new record current and keep the old one in the history.")]
SheetOpt = Annotated[Path | None, typer.Option(metavar="FILE.html", help="Write a printable record (.html) to sign.")]
OccupantOpt = Annotated[str | None, typer.Option(metavar="WEIGHT", help="Standard occupant weight (default: the aircraft file's, else 170 lb).")]
MetoOpt = Annotated[float | None, typer.Option(metavar="HP", help="Maximum-except-takeoff power [hp] for the minimum fuel (default: the file's).")]


def _new_empty_weight(
    aircraft: Path, source: Path, read: Callable[[Path, Any], Any], compute: Callable[[Any, Any], Any],
    render: Callable[[Any, Any, Any], None], reason: str, write: bool, sheet: Path | None, json_out: bool,
) -> None:
    """A new empty-weight record from a weighing or equipment changes: read the aircraft
    (once) and ``source``, compute, print, and with ``write`` keep it in the aircraft file."""
    from ..files import load_aircraft_for_update, read_toml, write_new_record

    data, original = load_aircraft_for_update(aircraft)
    parsed = read(source, data)
    try:
        result = compute(data, parsed)
    except LoadcheckError as error:
        raise error.with_file(source) from None
    _mechanic_sheet(sheet, result, data, source)
    if json_out:
        typer.echo(result.to_json())
    else:
        render(result, data.units, _console())
    if write:
        write_new_record(aircraft, original, weight=result.new.weight, arm=result.new.arm, lateral_arm=result.new.lateral_arm,
                         date=parsed.date, reason=reason, inputs={"file": str(source), **read_toml(source)},
                         equipment=getattr(result, "equipment", None))  # only equipment changes alter the list
        _console(stderr=True).print(f"new empty-weight record written to {aircraft}; the old one is in its history", markup=False)
    raise typer.Exit(EXIT_OK)


def _mechanic_sheet(sheet: Path | None, result: Any, aircraft: Any, source: Path) -> None:
    if sheet is None:
        return
    from ..extremes import extremes
    from ..files import write_atomic
    from ..render.sheet import mechanic_sheet_html

    if sheet.suffix.lower() not in (".html", ".htm"):
        raise InputError(Problem("--sheet", "the record is an HTML file", value=str(sheet), expected="a name ending in .html"))
    try:
        checks = extremes(aircraft.with_empty(result.new.weight, result.new.arm, result.new.lateral_arm))
    except LoadcheckError as error:
        _console(stderr=True).print(f"note: the extreme checks were left out of the record: {error}", markup=False)
        checks = None
    write_atomic(sheet, mechanic_sheet_html(result, aircraft.units, extremes=checks, source=str(source)))
    _console(stderr=True).print(f"record written: {sheet}", markup=False)


@app.command(short_help="Empty weight and CG from scale readings.")
@input_errors
def weigh(
    aircraft: Annotated[Path, typer.Argument(metavar="AIRCRAFT", help="Aircraft file (TOML).")],
    readings: Annotated[Path, typer.Argument(metavar="READINGS", help="Readings file (TOML): weighing points and corrections.")],
    write: WriteOpt = False,
    sheet: SheetOpt = None,
    json_out: JsonOpt = False,
) -> None:
    """Basic empty weight and CG from scale readings (AC 43.13-1B ch. 10; FAA-H-8083-1 ch. 3).

    Without --write nothing is changed. With it, the new record becomes the aircraft file's
    [empty] table and the old one is kept in [[history]], with the readings.

    Example:

    \b
      loadcheck weigh \\
        sample_aircraft/trainer4/aircraft.toml \\
        sample_aircraft/trainer4/weighing.toml
    """
    from ..files import load_readings
    from ..render.terminal import render_weighing
    from ..weighing import weigh as compute

    _new_empty_weight(aircraft, readings, load_readings, compute, render_weighing, "weighing", write, sheet, json_out)


@app.command(short_help="Empty weight after equipment changes.")
@input_errors
def alter(
    aircraft: Annotated[Path, typer.Argument(metavar="AIRCRAFT", help="Aircraft file (TOML).")],
    changes: Annotated[Path, typer.Argument(metavar="CHANGES", help="Changes file (TOML): items installed, removed, relocated.")],
    write: WriteOpt = False,
    sheet: SheetOpt = None,
    json_out: JsonOpt = False,
) -> None:
    """New empty weight and CG after equipment changes, and whether they are negligible.

    Items removed or relocated must be in the aircraft file's [[equipment]] list; --write
    updates that list too.

    Example:

    \b
      loadcheck alter \\
        sample_aircraft/trainer4/aircraft.toml \\
        sample_aircraft/trainer4/changes.toml
    """
    from ..alterations import alter as compute
    from ..files import load_changes
    from ..render.terminal import render_alteration

    _new_empty_weight(aircraft, changes, load_changes, compute, render_alteration, "alteration", write, sheet, json_out)


@app.command(short_help="The empty-weight records, oldest first.")
@input_errors
def history(
    aircraft: Annotated[Path, typer.Argument(metavar="AIRCRAFT", help="Aircraft file (TOML).")],
    json_out: JsonOpt = False,
) -> None:
    """List the aircraft's empty-weight records, oldest first, and the current one.

    Example:

    \b
      loadcheck history \\
        sample_aircraft/trainer4/aircraft.toml
    """
    from ..caution import MECHANIC_CAUTION
    from ..files import load_aircraft

    data = load_aircraft(aircraft)
    units = data.units
    rows = [{"replaced": str(h.recorded), "reason": h.reason, "weight": h.previous.weight, "arm": h.previous.arm,
             "date": str(h.previous.date or "")} for h in data.history]
    rows.append({"replaced": "current", "reason": "", "weight": data.empty.weight, "arm": data.empty.arm,
                 "date": str(data.empty.date or "")})
    if json_out:
        typer.echo(json.dumps({"records": rows, "units": {"mass": units.mass, "arm": units.arm},
                               "caution": MECHANIC_CAUTION}, indent=2))
    else:
        from ..render.terminal import render_history

        render_history(data, rows, _console(), MECHANIC_CAUTION)


@app.command(short_help="Most forward and most rearward loadings.")
@input_errors
def extremes(
    aircraft: Annotated[Path, typer.Argument(metavar="AIRCRAFT", help="Aircraft file (TOML).")],
    category: CategoryOpt = None,
    occupant: OccupantOpt = None,
    meto: MetoOpt = None,
    json_out: JsonOpt = False,
) -> None:
    """The most forward and most rearward loadings the stations permit (AC 43.13-1B 10-17), each checked.

    Exit status: 0 both within limits, 1 one is not, 2 bad input.

    Example:

    \b
      loadcheck extremes \\
        sample_aircraft/tandem2/aircraft.toml
    """
    from ..extremes import extremes as compute
    from ..files import load_aircraft
    from ..units import read_amount

    data = load_aircraft(aircraft)
    weight = None if occupant is None else read_amount(occupant, data.units.mass, "--occupant")
    result = compute(data, category=category, occupant_weight=weight, meto_hp=meto)
    if json_out:
        typer.echo(result.to_json())
    else:
        from ..render.terminal import render_extremes

        render_extremes(result, _console())
    raise typer.Exit(EXIT_OK if result.ok else EXIT_LIMIT)


@app.command(short_help="The loading schedule (AC 43.13-1B 10-18).")
@input_errors
def schedule(
    aircraft: Annotated[Path, typer.Argument(metavar="AIRCRAFT", help="Aircraft file (TOML).")],
    category: CategoryOpt = None,
    occupant: OccupantOpt = None,
    json_out: JsonOpt = False,
) -> None:
    """The loading schedule of AC 43.13-1B 10-18: full fuel; every seat filled; maximum baggage.

    Example:

    \b
      loadcheck schedule \\
        sample_aircraft/twin6/aircraft.toml
    """
    from ..caution import MECHANIC_CAUTION
    from ..files import load_aircraft
    from ..planning import loading_schedule
    from ..units import read_amount

    data = load_aircraft(aircraft)
    weight = None if occupant is None else read_amount(occupant, data.units.mass, "--occupant")
    cases = loading_schedule(data, category=category, occupant_weight=weight)
    if json_out:
        typer.echo(json.dumps({"cases": [c.to_dict() for c in cases], "caution": MECHANIC_CAUTION}, indent=2, default=str))
    else:
        from ..render.terminal import render_schedule

        render_schedule(cases, data, _console(), MECHANIC_CAUTION)
    raise typer.Exit(EXIT_OK)


