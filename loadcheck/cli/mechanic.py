"""The mechanic's commands: weigh, alter, history, extremes, schedule."""

from __future__ import annotations

import json
import sys
from pathlib import Path
from typing import Annotated, Literal

import typer

from ..errors import InputError, Problem
from .common import (
    EXIT_LIMIT,
    EXIT_OK,
    CategoryOpt,
    JsonOpt,
    _console,
    _fail_input,
    app,
    input_errors,
    options_as_typed,
)

# -- the mechanic's commands -----------------------------------------------------------------

WriteOpt = Annotated[
    bool, typer.Option("--write", help="Make the new record current and keep the old one in the history.")
]
YesOpt = Annotated[
    bool, typer.Option("--yes", "-y", help="With --write: confirmed, do not ask (needed when not run from a terminal).")
]
ForceOpt = Annotated[
    bool, typer.Option("--force", help="With --write: write a record the checks refuse; kept in the history.")
]
ByOpt = Annotated[
    str | None, typer.Option("--by", metavar="NAME", help="Who made the record (default: the file's weighed_by or by).")
]
WhyOpt = Annotated[
    str | None,
    typer.Option("--why", metavar="TEXT", help="Why, kept in the history (default: the file's note or description)."),
]
SheetOpt = Annotated[Path | None, typer.Option(metavar="FILE.html", help="Write a printable record (.html) to sign.")]
OccupantOpt = Annotated[
    str | None,
    typer.Option(metavar="WEIGHT", help="Standard occupant weight (default: the aircraft file's, else 170 lb)."),
]
MetoOpt = Annotated[
    str | None,
    typer.Option(metavar="HP", help="Maximum-except-takeoff power [hp] for the minimum fuel (default: the file's)."),
]


def _interactive() -> bool:
    """Whether a person can answer at standard input."""
    return sys.stdin.isatty()


def _new_empty_weight(
    aircraft: Path,
    source: Path,
    kind: Literal["weighing", "alteration"],
    write: bool,
    yes: bool,
    force: bool,
    by: str | None,
    why: str | None,
    sheet: Path | None,
    json_out: bool,
) -> None:
    """A new empty-weight record: propose (library), print, write the sheet, and with
    ``write`` confirm and make it current (library)."""
    from ..empty_record import OverrideNeededError, make_current, propose, write_record_sheet

    if (yes or force or by or why) and not write:
        raise InputError(Problem("--write", "--yes, --force, --by and --why go with --write; nothing was written"))
    proposal = propose(aircraft, source, kind)
    err = _console(stderr=True)
    if sheet is not None:
        from ..empty_record import categories_words, not_computed

        written, checks = write_record_sheet(sheet, proposal)
        for reason, names in not_computed(checks).items():
            err.print(
                f"note: the extreme checks of {categories_words(names)} could not be made: {reason}",
                markup=False,
                soft_wrap=True,
            )
        err.print(f"record sheet written (to print and sign): {written}", markup=False, soft_wrap=True)
        failed = proposal.extremes_not_ok
        if failed:  # the sheet says so: never only there
            err.print(
                "warning: the record sheet's extreme checks with the new record are NOT all within limits "
                f"(or not established) in {categories_words(failed)}; "
                f"see loadcheck extremes {aircraft} --category {failed[0]}"
                + ("" if len(failed) == 1 else " (and each other one)"),
                markup=False,
                soft_wrap=True,
            )
    if json_out:
        typer.echo(json.dumps(proposal.to_dict(), indent=2))
    else:
        from ..render.terminal import render_alteration, render_weighing

        render = render_weighing if kind == "weighing" else render_alteration
        render(proposal.result, proposal.aircraft.units, _console())
    if not write:
        raise typer.Exit(EXIT_OK)
    confirmed = yes
    if not yes and proposal.overridable and (force or not proposal.result.refusals):
        if not _interactive():
            raise InputError(
                Problem(
                    "--write",
                    "nothing was written: the new record must be confirmed, and standard input is not a "
                    "terminal, so nobody can answer the question; run the command in a terminal to be asked, "
                    "or add --yes to confirm it on the command line",
                )
            )
        from ..render.terminal import render_comparison

        render_comparison(proposal.comparison(), err)
        confirmed = typer.confirm(f"Make this the current record of {aircraft}?", default=False, err=True)
        if not confirmed:
            err.print("nothing was written", markup=False)
            raise typer.Exit(EXIT_OK)
    try:
        target = make_current(proposal, confirmed=confirmed, override=force, by=by, note=why)
    except OverrideNeededError as error:
        lines = error.lines()
        if error.overridable:
            lines.append("give --force with --write to write it anyway (the override is kept in the history)")
        _fail_input(lines)
    where = f" (through the link, to {target})" if target != aircraft else ""
    err.print(
        f"new empty-weight record written to {aircraft}{where}; the old one is in its history",
        markup=False,
        soft_wrap=True,
    )
    raise typer.Exit(EXIT_OK)


@app.command(short_help="Empty weight and CG from scale readings.")
@input_errors
def weigh(
    aircraft: Annotated[Path, typer.Argument(metavar="AIRCRAFT", help="Aircraft file (TOML).")],
    readings: Annotated[
        Path, typer.Argument(metavar="READINGS", help="Readings file (TOML): weighing points and corrections.")
    ],
    write: WriteOpt = False,
    yes: YesOpt = False,
    force: ForceOpt = False,
    by: ByOpt = None,
    why: WhyOpt = None,
    sheet: SheetOpt = None,
    json_out: JsonOpt = False,
) -> None:
    """Basic empty weight and CG from scale readings (AC 43.13-1B ch. 10; FAA-H-8083-1 ch. 3).

    Without --write nothing is changed. With it, the old and new record are shown and you
    are asked (or give --yes); the new record becomes the aircraft file's [empty] table and
    the old one is kept in [[history]] with who, when, why and a digest of the readings.

    Example:

    \b
      loadcheck weigh \\
        sample_aircraft/trainer4/aircraft.toml \\
        sample_aircraft/trainer4/weighing.toml
    """
    _new_empty_weight(aircraft, readings, "weighing", write, yes, force, by, why, sheet, json_out)


@app.command(short_help="Empty weight after equipment changes.")
@input_errors
def alter(
    aircraft: Annotated[Path, typer.Argument(metavar="AIRCRAFT", help="Aircraft file (TOML).")],
    changes: Annotated[
        Path, typer.Argument(metavar="CHANGES", help="Changes file (TOML): items installed, removed, relocated.")
    ],
    write: WriteOpt = False,
    yes: YesOpt = False,
    force: ForceOpt = False,
    by: ByOpt = None,
    why: WhyOpt = None,
    sheet: SheetOpt = None,
    json_out: JsonOpt = False,
) -> None:
    """New empty weight and CG after equipment changes, and whether they are negligible.

    Items removed or relocated must be in the aircraft file's [[equipment]] list; --write
    updates that list too (confirmed as for weigh).

    Example:

    \b
      loadcheck alter \\
        sample_aircraft/trainer4/aircraft.toml \\
        sample_aircraft/trainer4/changes.toml
    """
    _new_empty_weight(aircraft, changes, "alteration", write, yes, force, by, why, sheet, json_out)


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
    from ..empty_record import history as listing
    from ..files import load_aircraft

    result = listing(load_aircraft(aircraft))
    if json_out:
        typer.echo(result.to_json())
    else:
        from ..render.terminal import render_history

        render_history(result, _console())


@app.command(short_help="Extreme loadings: forward, rearward, lateral.")
@input_errors
def extremes(
    aircraft: Annotated[Path, typer.Argument(metavar="AIRCRAFT", help="Aircraft file (TOML).")],
    category: CategoryOpt = None,
    occupant: OccupantOpt = None,
    meto: MetoOpt = None,
    json_out: JsonOpt = False,
) -> None:
    """The worst loadings the limits permit (AC 43.13-1B 10-17): most forward and most rearward, and
    farthest left and right where a lateral envelope limits, each found by a search and checked.

    Exit status: 0 every case within limits and its search complete, 1 one is not, 2 bad input.

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
    named = {
        "category": ("--category", category),
        "occupant_weight": ("--occupant", occupant),
        "meto_hp": ("--meto", meto),
    }
    with options_as_typed(named):
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

    Each case holds from the fuel it states down to zero usable fuel.

    Exit status: 0 every case within limits, 1 a case is not, 2 bad input.

    Example:

    \b
      loadcheck schedule \\
        sample_aircraft/twin6/aircraft.toml
    """
    from ..files import load_aircraft
    from ..schedule import loading_schedule
    from ..units import read_amount

    data = load_aircraft(aircraft)
    weight = None if occupant is None else read_amount(occupant, data.units.mass, "--occupant")
    with options_as_typed({"category": ("--category", category), "occupant_weight": ("--occupant", occupant)}):
        result = loading_schedule(data, category=category, occupant_weight=weight)
    if json_out:
        typer.echo(result.to_json())
    else:
        from ..render.terminal import render_schedule

        render_schedule(result, data, _console())
    raise typer.Exit(EXIT_OK if result.ok else EXIT_LIMIT)
