"""The dispatcher's commands: the fleet and the log of checks."""

from __future__ import annotations

import json
import os
import sys
from pathlib import Path
from typing import TYPE_CHECKING, Annotated, Literal

import typer

from .. import __version__
from ..errors import InputError, LoadcheckError, Problem
from .common import (
    EXIT_INPUT,
    EXIT_LIMIT,
    EXIT_OK,
    DbOpt,
    JsonOpt,
    _console,
    app,
    input_errors,
)

if TYPE_CHECKING:
    import datetime as dt

    from ..checklog import CheckLog

# -- the dispatcher's commands ---------------------------------------------------------------

fleet_app = typer.Typer(
    short_help="A fleet, and a day of loadings.",
    help="A fleet of aircraft files addressed by registration, and a day of loadings.",
    no_args_is_help=True,
)
app.add_typer(fleet_app, name="fleet")
log_app = typer.Typer(
    short_help="The check log.",
    help="The check log (every check recorded): list, show, export, verify (reproduce).",
    no_args_is_help=True,
)
app.add_typer(log_app, name="log")


@fleet_app.command("list", short_help="Each aircraft of a fleet folder.")
@input_errors
def fleet_list(
    folder: Annotated[
        Path, typer.Argument(metavar="FOLDER", help="Folder of aircraft files (sub-folders searched too).")
    ],
    max_age: Annotated[
        int | None,
        typer.Option(
            min=1,
            metavar="DAYS",
            help="Flag empty-weight records older than this many days (default: 1,095, 36 months).",
            show_default=False,
        ),
    ] = None,
    json_out: JsonOpt = False,
) -> None:
    """Each aircraft: registration, empty weight, record date, useful load, data fingerprint, problems.

    Exit status: 0 every file usable, 2 a file does not validate or a registration is in two files.

    Example:

    \b
      loadcheck fleet list sample_aircraft
    """
    from ..caution import PILOT_CAUTION
    from ..fleet import fleet_listing, load_fleet

    lines = fleet_listing(load_fleet(folder), max_age)
    if json_out:
        typer.echo(json.dumps({"aircraft": [line.to_dict() for line in lines], "caution": PILOT_CAUTION}, indent=2))
    else:
        from ..render.terminal import render_fleet_list

        render_fleet_list(lines, folder, _console())
    bad = not all(line.usable for line in lines)
    raise typer.Exit(EXIT_INPUT if bad else EXIT_OK)


@fleet_app.command("check", short_help="Check a day of loadings; log every check.")
@input_errors
def fleet_check(
    folder: Annotated[Path, typer.Argument(metavar="FOLDER", help="Folder of aircraft files (the fleet).")],
    loadings: Annotated[
        Path,
        typer.Argument(
            metavar="LOADINGS", help="Loadings: a CSV file (one row per flight) or a folder of loading files."
        ),
    ],
    db: DbOpt = None,
    log_checks: Annotated[
        bool, typer.Option("--log/--no-log", help="Record every check in the check log (default) or not.")
    ] = True,
    json_out: Annotated[bool, typer.Option("--json", help="Print JSON Lines: one object per flight.")] = False,
    workers: Annotated[
        int | None,
        typer.Option(
            min=1,
            help="Processes checking flights (default: two on a machine of two cores or more, "
            "a short day in one; see docs/performance.md).",
        ),
    ] = None,
) -> None:
    """Check a day of loadings against the fleet; record every check in the check log (--no-log: do not).

    Exit status: 0 every flight within limits, 1 a flight is out of limits, 2 a row could not
    be used (the other rows are still checked and reported), the file has a problem of its own
    (an unknown column) or there was nothing to check.

    Example:

    \b
      loadcheck fleet check sample_aircraft \\
        sample_aircraft/fleet_day.csv --no-log
    """
    from contextlib import nullcontext

    from ..checklog import CheckLog, log_path
    from ..fleet import check_flights, default_workers, load_fleet, read_loadings

    path = log_path(log_checks, db)  # before any work: --db without logging, or the old variable, refused here
    fleet = load_fleet(folder)
    if json_out:
        import orjson  # JSON Lines as UTF-8 bytes, about four times faster than the json module

        out = getattr(sys.stdout, "buffer", None)
        write_bytes = out.write if out is not None else (lambda text: sys.stdout.write(text.decode()))
        write_line = lambda line: write_bytes(orjson.dumps(line, option=orjson.OPT_APPEND_NEWLINE))  # noqa: E731

    def file_refused(problems: list[str]) -> None:
        """A problem of the file as a whole, as one JSON line with no ``line`` (docs/fleet.md)."""
        if json_out:
            write_line({"source": str(loadings), "ok": False, "input_error": problems})
            sys.stdout.flush()

    try:
        rows, file_problems = read_loadings(loadings, fleet)
    except LoadcheckError as error:  # not a CSV file at all (binary, no header): nothing to check
        file_refused(error.lines())
        raise
    err = _console(stderr=True)
    for problem in file_problems:
        err.print(f"error: {problem}", markup=False, soft_wrap=True)
    log = CheckLog(path) if path is not None else None
    flights = []  # for the table only: one brief line per flight; JSON Lines are streamed
    if file_problems:  # the file's own problems first, so that the lines say why the exit status is 2
        file_refused(file_problems)
    counts = {"checked": 0, "out": 0, "bad": 0}
    show_progress = err.is_terminal and not json_out and not os.environ.get("NO_COLOR")  # a bar is escape codes
    say = (
        (lambda text: err.print(text, markup=False, soft_wrap=True))
        if show_progress
        else (lambda text: err.file.write(text + "\n"))
    )
    if show_progress:
        from rich.progress import Progress
    with Progress(console=err, transient=True) if show_progress else nullcontext() as progress:
        task = progress.add_task("checking", total=None) if progress is not None else None
        try:
            for flight in check_flights(fleet, rows, log, __version__, workers=workers or default_workers()):
                counts["checked"] += 1
                if flight.stored is None:  # not checked: why is said (the result is not read here)
                    counts["bad"] += 1
                    for problem in flight.problems:
                        say(f"error: {problem}")
                elif not flight.ok:
                    counts["out"] += 1
                if json_out:
                    write_bytes(flight.json_line())
                else:
                    flights.append(flight.brief())
                if progress is not None and task is not None:
                    progress.advance(task)
            sys.stdout.flush()
            err.file.flush()
        except LoadcheckError as error:  # the file went wrong further on (docs/fleet.md): said as a file problem
            file_refused(error.lines())
            raise
        finally:
            if log is not None:
                log.close()
    if not json_out:
        from ..render.terminal import render_fleet

        render_fleet(flights, _console(), file_problems)
    if log is not None:
        err.print(f"{counts['checked'] - counts['bad']} check(s) recorded in the check log {log.path}", markup=False)
    if counts["bad"] or file_problems:
        raise typer.Exit(EXIT_INPUT)
    raise typer.Exit(EXIT_LIMIT if counts["out"] else EXIT_OK)


def _date(text: str | None, option: str) -> dt.date | None:
    if text is None:
        return None
    import datetime as dt

    try:
        return dt.date.fromisoformat(text)
    except ValueError:
        raise InputError(Problem(option, "expected a date", value=text, expected="YYYY-MM-DD")) from None


SinceOpt = Annotated[str | None, typer.Option(metavar="DATE", help="From this date (YYYY-MM-DD, UTC).")]
UntilOpt = Annotated[str | None, typer.Option(metavar="DATE", help="To this date, inclusive.")]
RegOpt = Annotated[
    str | None,
    typer.Option(
        "--registration",
        "-r",
        metavar="REGISTRATION",
        help="Only this aircraft (compared without case, spaces or hyphens: demo4t is DEMO-4T).",
    ),
]
VerdictOpt = Annotated[
    str | None,
    typer.Option(
        metavar="within|out", help="Only checks within limits, or only those out of limits.", show_default=False
    ),
]


def _log(db: Path | None) -> CheckLog:
    from ..checklog import CheckLog, default_path

    path = db or default_path()
    if not path.exists():
        raise InputError(Problem("--db", f"no check log at {path}"))
    return CheckLog(path)


@log_app.command("list", short_help="List recorded checks.")
@input_errors
def log_list(
    db: DbOpt = None,
    since: SinceOpt = None,
    until: UntilOpt = None,
    registration: RegOpt = None,
    verdict: VerdictOpt = None,
) -> None:
    """List recorded checks.

    Example:

    \b
      loadcheck log list --registration DEMO-4T \\
        --since 2026-11-01
    """
    from ..caution import PILOT_CAUTION
    from ..render.checklog import render_check_log

    with _log(db) as log:
        records = list(
            log.listing(
                since=_date(since, "--since"), until=_date(until, "--until"), registration=registration, verdict=verdict
            )
        )
    render_check_log(log.path, records, PILOT_CAUTION, _console())


@log_app.command("show", short_help="One record: its inputs and result.")
@input_errors
def log_show(record_id: Annotated[int, typer.Argument(metavar="ID", help="Record id.")], db: DbOpt = None) -> None:
    """Show one record: its inputs and its full result (JSON)."""
    with _log(db) as log:
        record = log.get(record_id)
    typer.echo(json.dumps({**record.summary(), "inputs": record.inputs, "result": record.result}, indent=2))


@log_app.command("export", short_help="Export records as CSV or JSON Lines.")
@input_errors
def log_export(
    db: DbOpt = None,
    since: SinceOpt = None,
    until: UntilOpt = None,
    registration: RegOpt = None,
    verdict: VerdictOpt = None,
    format: Annotated[
        Literal["csv", "jsonl"],
        typer.Option(metavar="csv|jsonl", help="csv (one line per record) or jsonl (everything)."),
    ] = "jsonl",
    out: Annotated[
        Path | None, typer.Option(metavar="FILE", help="Write to this file (default: standard output).")
    ] = None,
) -> None:
    """Export records between dates or for one registration, as CSV or JSON Lines.

    Example:

    \b
      loadcheck log export --format csv \\
        --since 2026-11-01 --out november.csv
    """
    from ..caution import PILOT_CAUTION
    from ..checklog import export_text
    from ..render.terminal import caution_text

    with _log(db) as log:
        text = export_text(
            log.find(
                since=_date(since, "--since"), until=_date(until, "--until"), registration=registration, verdict=verdict
            ),
            format,
        )
    if out is None:
        typer.echo(text, nl=False)
    else:
        from ..files import write_atomic

        write_atomic(out, text)
        _console(stderr=True).print(f"written: {out}", markup=False)
    if format == "csv":  # JSON Lines carry the caution inside each result; CSV rows have no room for it
        _console(stderr=True).print(caution_text(PILOT_CAUTION))


@log_app.command("verify", short_help="Recompute a record; does it match?")
@input_errors
def log_verify(
    record_id: Annotated[
        int | None,
        typer.Argument(
            metavar="ID", help="Record id (with --current: optional, else every record the filters select)."
        ),
    ] = None,
    db: DbOpt = None,
    current: Annotated[
        Path | None, typer.Option(help="Fleet folder: check the recorded loadings with its current aircraft data.")
    ] = None,
    since: SinceOpt = None,
    until: UntilOpt = None,
    registration: RegOpt = None,
    json_out: JsonOpt = False,
) -> None:
    """Recompute a recorded check from its stored inputs and aircraft data; say whether every stored field matches.

    Exit status: 0 reproduced, 1 not, 2 bad input.

    With --current FOLDER: which recorded checks were made with aircraft data that has
    changed since, and what their loadings give with the fleet's current data. Exit status:
    0 no check recorded within limits is out of limits now, 1 at least one is, 2 a record
    could not be checked with the current data.

    Example:

      loadcheck log verify --current sample_aircraft --since 2026-11-01
    """
    from ..caution import PILOT_CAUTION
    from ..render.terminal import caution_text

    console = _console()
    if current is not None:
        from ..checklog import verify_current
        from ..fleet import load_fleet

        fleet = load_fleet(current)
        with _log(db) as log:
            chosen = (
                [log.get(record_id)]
                if record_id is not None
                else log.find(since=_date(since, "--since"), until=_date(until, "--until"), registration=registration)
            )
            outcome = verify_current(chosen, fleet)
        if json_out:
            typer.echo(outcome.to_json())
        else:
            from ..render.checklog import render_current_verification

            render_current_verification(outcome, console)
        raise typer.Exit(outcome.status)
    if record_id is None:
        raise InputError(
            Problem("ID", "give the record id to verify (or --current FOLDER to check records against it)")
        )
    if since or until or registration:
        raise InputError(Problem("--since", "--since, --until and --registration go with --current"))
    from ..checklog import verify

    with _log(db) as log:
        verification = verify(log, record_id)
    if json_out:
        typer.echo(verification.to_json())
    elif verification.reproduced:
        console.print(
            f"record {record_id}: reproduced; the same result "
            f"({'within limits' if verification.ok else 'out of limits'}) from the recorded inputs and aircraft "
            f"data {verification.fingerprint}, and every stored field matches",
            markup=False,
        )
    else:
        console.print(f"record {record_id}: NOT reproduced", markup=False)
        for difference in verification.differences:
            console.print(f"  {difference}", markup=False)
    if not json_out:
        for note in verification.notes:
            console.print(f"note: {note}", markup=False)
        console.print(caution_text(PILOT_CAUTION))
    raise typer.Exit(EXIT_OK if verification.reproduced else EXIT_LIMIT)
