"""What every command shares: the application, the console, input errors, the loading options.

Exit status (DESIGN.md): 0 within limits, 1 a limit is exceeded, 2 the input could not be
used. Errors in the input are printed to stderr with the file, the field and the value,
never as a traceback (set LOADCHECK_DEBUG=1 to see one).
"""

from __future__ import annotations

import functools
import os
import re
import shlex
from collections.abc import Callable, Iterator, Mapping
from contextlib import contextmanager
from dataclasses import replace
from pathlib import Path
from typing import TYPE_CHECKING, Annotated, Any, NoReturn, ParamSpec, TypeVar

import typer
from pydantic import ValidationError
from typer.core import TyperCommand, TyperGroup, TyperOption

from .. import __version__
from ..errors import InputError, LoadcheckError, Problem

if TYPE_CHECKING:  # rich loads only when something is printed through it (not for --json)
    from rich.console import Console

    from ..files import CheckInputs

__all__ = [
    "EXIT_INPUT",
    "EXIT_LIMIT",
    "EXIT_OK",
    "AircraftArg",
    "CategoryOpt",
    "DbOpt",
    "FuelOpt",
    "JsonOpt",
    "LoadOpt",
    "LoadingArg",
    "OrderOpt",
    "RateOpt",
    "ReserveOpt",
    "TaxiOpt",
    "TripOpt",
    "TripTimeOpt",
    "app",
    "input_errors",
    "options_as_typed",
]

EXIT_OK, EXIT_LIMIT, EXIT_INPUT = 0, 1, 2

DbOpt = Annotated[
    Path | None,
    typer.Option(
        "--db",
        metavar="FILE",
        help="The check log, an SQLite file (default: $LOADCHECK_LOG, else the user data folder).",
    ),
]


def _repeated_option(command: TyperCommand | TyperGroup, args: list[str]) -> str | None:
    """Why ``args`` cannot be used: an option that takes one value given more than once.

    click keeps the last of the values (``--taxi 1 --taxi 2`` gives 2); a value the user gave
    must be used or refused, never dropped.
    """
    options: dict[str, TyperOption] = {}
    for param in command.params:
        if isinstance(param, TyperOption):
            for name in (*param.opts, *param.secondary_opts):
                options[name] = param
    seen: dict[str, tuple[str, str]] = {}
    tokens = iter(args)
    for token in tokens:
        if token == "--":
            break
        if not token.startswith("-") or token == "-":
            continue
        name, inline, value = token.partition("=") if token.startswith("--") else (token[:2], "", token[2:])
        option = options.get(name)
        if option is None or option.is_flag or option.count:
            continue
        if not inline and not value:
            value = next(tokens, "")
        if option.multiple or option.nargs != 1:
            continue
        key = option.name or name
        if key in seen:
            first_name, first_value = seen[key]
            return (
                f"{name} is given twice ({first_name} {first_value!r}, then {name} {value!r}): "
                "it takes one value; give it once"
            )
        seen[key] = (name, value)
    return None


_RENAMED_OPTIONS = {  # rename.py: keep (the options before issue 21's one convention)
    "--record": "the check log is now --log (record this check) with --db FILE (which log)",  # rename.py: keep
    "--no-record": "the check log is now --no-log",  # rename.py: keep
}

_RENAMED_COMMANDS = {  # rename.py: keep (the command group before issue 21)
    "records": "the check log's commands are now loadcheck log list, show, verify and export",  # rename.py: keep
}


def _renamed_option(command: TyperCommand | TyperGroup, args: list[str]) -> str | None:
    """A hint for an option of an earlier release that ``command`` no longer takes (refused
    all the same: click would refuse it as unknown, without saying what it became)."""
    known = {
        name
        for param in command.params
        if isinstance(param, TyperOption)
        for name in (*param.opts, *param.secondary_opts)
    }
    for token in args:
        if token == "--":
            break
        name = token.partition("=")[0]
        if name in _RENAMED_OPTIONS and name not in known:
            return f"no such option {name}: {_RENAMED_OPTIONS[name]}"
    return None


class _Group(TyperGroup):
    """The command group: refuses an option that takes one value given twice (any command)."""

    def resolve_command(self, ctx: Any, args: list[str]) -> Any:  # click's own types, vendored inside typer
        if args and args[0] in _RENAMED_COMMANDS and self.get_command(ctx, args[0]) is None:
            _fail_input([f"no such command {args[0]}: {_RENAMED_COMMANDS[args[0]]}"])
        name, command, rest = super().resolve_command(ctx, args)
        target, remaining = command, list(rest)
        while isinstance(target, TyperGroup) and remaining and not remaining[0].startswith("-"):
            target, remaining = target.get_command(ctx, remaining[0]), remaining[1:]
        if isinstance(target, (TyperCommand, TyperGroup)):  # every command here is typer's
            problem = _renamed_option(target, remaining) or _repeated_option(target, remaining)
            if problem:
                _fail_input([problem])
        return name, command, rest


app = typer.Typer(
    cls=_Group,
    name="loadcheck",
    help=(
        "Aircraft weight and balance: check a loading against every limit at ramp, takeoff, "
        "landing and zero fuel and along the whole fuel burn.\n\n"
        "Advisory only: the approved flight manual and the current weight-and-balance record "
        "govern, and the pilot in command decides."
    ),
    no_args_is_help=True,
    add_completion=True,  # --install-completion and --show-completion (docs/cli.md, "Shell completion")
    pretty_exceptions_enable=False,
    rich_markup_mode=None,
    context_settings={"help_option_names": ["-h", "--help"]},
)

P = ParamSpec("P")
R = TypeVar("R")
T = TypeVar("T")


def _console(stderr: bool = False) -> Console:
    """The console for human-readable output.

    Its width is the terminal's; when the output is piped or redirected, ``COLUMNS`` if set,
    else 80 (tables are laid out for that width, see loadcheck.render.terminal). With
    ``NO_COLOR`` set (https://no-color.org) no escape codes at all are written, styles included.
    """
    from rich.console import Console

    no_color = bool(os.environ.get("NO_COLOR"))
    return Console(stderr=stderr, highlight=False, color_system=None if no_color else "auto", no_color=no_color)


def _fail_input(lines: list[str]) -> NoReturn:
    err = _console(stderr=True)
    for line in lines:
        err.print(f"error: {line}", markup=False, soft_wrap=True)
    raise typer.Exit(EXIT_INPUT)


def input_errors(func: Callable[P, R]) -> Callable[P, R]:
    """Turn bad input into exit 2 with a plain message, never a traceback."""

    @functools.wraps(func)
    def wrapper(*args: P.args, **kwargs: P.kwargs) -> R:
        try:
            return func(*args, **kwargs)
        except LoadcheckError as error:
            _fail_input(error.lines())
        except ValidationError as error:
            from ..files import problems_from_validation

            _fail_input([p.describe() for p in problems_from_validation(error)])
        except (typer.Exit, typer.Abort, KeyboardInterrupt):
            raise
        except Exception as error:  # a bug must never read as "within limits" (0) or "exceeded" (1)
            if os.environ.get("LOADCHECK_DEBUG"):
                raise
            _fail_input(
                [
                    f"internal error ({type(error).__name__}: {error}); no result was produced. "
                    "Please report it; LOADCHECK_DEBUG=1 shows the traceback."
                ]
            )

    return wrapper  # functools.wraps keeps the signature typer reads


@contextmanager
def options_as_typed(options: Mapping[str, tuple[str, object | None]]) -> Iterator[None]:
    """Name a library job's parameters in its input errors by the options as the user typed them.

    ``options`` maps each parameter the job names in its problems (``station``, ``fill``,
    ``rate``, ``leg``, ``category`` ...) to ``(option, value as typed)``; a problem about one is
    named ``--station aft_bag`` as ``load_check_inputs(command_line=True)`` names the loading's
    options (loadcheck.files), by the same rule. A parameter the user did not give (value None)
    is named by its bare option, the option to give.
    """
    from ..files import _named_as_typed

    typed = {
        field: option if value is None else f"{option} {shlex.quote(str(value))}"
        for field, (option, value) in options.items()
    }
    try:
        yield
    except LoadcheckError as error:
        raise _named_as_typed(error, typed) from None


def _assignments(values: list[str], option: str) -> dict[str, str]:
    """``["front=340", "hold=20 kg"]`` -> ``{"front": "340", "hold": "20 kg"}``."""
    result: dict[str, str] = {}
    problems = []
    for value in values:
        name, sep, amount = value.partition("=")
        if not sep or not name.strip() or not amount.strip():
            problems.append(
                Problem(option, "expected NAME=VALUE", value=value, expected="e.g. front=340 or hold='20 kg'")
            )
            continue
        if name.strip() in result:
            what = "station takes one weight: add the weights up" if option == "--load" else "tank takes one quantity"
            problems.append(
                Problem(
                    f"{option} {name.strip()}",
                    f"given twice ({result[name.strip()]!r} and {amount.strip()!r}); a {what} and give it once",
                    value=value,
                )
            )
            continue
        result[name.strip()] = amount.strip()
    if problems:
        raise InputError(problems)
    return result


def _version(value: bool) -> None:
    if value:
        typer.echo(f"loadcheck {__version__}")
        raise typer.Exit()


@app.callback()
def _main(
    version: Annotated[
        bool, typer.Option("--version", callback=_version, is_eager=True, help="Show the version.")
    ] = False,
) -> None:
    """Aircraft weight and balance."""


# Options shared by `check` and the `plan` commands.
AircraftArg = Annotated[
    Path, typer.Argument(metavar="AIRCRAFT", help="Aircraft file (TOML), or a loading file that names its aircraft.")
]
LoadingArg = Annotated[Path | None, typer.Argument(metavar="LOADING", help="Loading file (TOML); optional.")]
LoadOpt = Annotated[
    list[str],
    typer.Option(
        "--load",
        "-l",
        metavar="STATION=WEIGHT",
        help="A weight at a station; repeat the option for each. e.g. front=340, hold='20 kg'.",
    ),
]
FuelOpt = Annotated[
    list[str],
    typer.Option(
        "--fuel",
        "-f",
        metavar="TANK=QUANTITY",
        help="Fuel in a tank at engine start; repeat for each tank. A volume, 'full', a level name or '120 lb'.",
    ),
]
TaxiOpt = Annotated[
    str | None, typer.Option(metavar="AMOUNT", help="Fuel used before takeoff (volume, or with a unit).")
]
TripOpt = Annotated[
    str | None, typer.Option(metavar="AMOUNT", help="Fuel used from takeoff to landing (volume, or with a unit).")
]
TripTimeOpt = Annotated[
    str | None, typer.Option("--trip-time", metavar="H:MM", help="Flight time, e.g. 2:15; with --rate.")
]
RateOpt = Annotated[str | None, typer.Option(metavar="AMOUNT", help="Fuel used per hour (with --trip-time).")]
OrderOpt = Annotated[
    str | None, typer.Option(metavar="ORDER", help="'together', or tank ids in burn order: aux,mains.")
]
ReserveOpt = Annotated[str | None, typer.Option(metavar="AMOUNT", help="Warn when landing fuel is below this.")]
CategoryOpt = Annotated[
    str | None,
    typer.Option("--category", "-c", metavar="CATEGORY", help="Envelope category (default: the file's first)."),
]
JsonOpt = Annotated[bool, typer.Option("--json", help="Print one JSON object instead of tables.")]


def _inputs(
    aircraft: Path,
    loading: Path | None,
    load: list[str],
    fuel: list[str],
    taxi: str | None,
    trip: str | None,
    trip_time: str | None,
    rate: str | None,
    order: str | None,
    reserve: str | None,
    category: str | None,
    *,
    fuel_to_plan: bool = False,
    stop_to_plan: int | None = None,
    station_to_plan: str | None = None,
    legs: Mapping[int, Mapping[str, Mapping[str, object]]] | None = None,
    allow_trip: bool = False,
) -> CheckInputs:
    """Read the files and lay the options over them (loadcheck.files.load_check_inputs).

    ``fuel_to_plan``: the answer chooses the fuel, so the fuel given need not cover taxi and
    trip; ``stop_to_plan``: the answer chooses the fuel put in at the stop before that leg;
    ``station_to_plan``: the answer puts its payload at that station, in place of its weight;
    ``legs`` are the legs' options (loadcheck.loading.leg_assignments); ``allow_trip``
    admits a trip.
    """
    from ..files import load_check_inputs
    from ..loading import burn_order

    burn: dict[str, str | list[str]] = {}
    for key, value in (("taxi", taxi), ("trip", trip), ("trip_time", trip_time), ("rate", rate), ("reserve", reserve)):
        if value is not None:
            burn[key] = value
    if order is not None:
        burn["order"] = burn_order(order, f"--order {shlex.quote(order)}", with_value=False)
    try:
        inputs = load_check_inputs(
            aircraft,
            loading,
            load=_assignments(load, "--load"),
            fuel=_assignments(fuel, "--fuel"),
            burn=burn,
            category=category,
            fuel_to_plan=fuel_to_plan,
            stop_to_plan=stop_to_plan,
            station_to_plan=station_to_plan,
            legs=legs,
            allow_trip=allow_trip,
            command_line=True,
        )
    except LoadcheckError as error:
        raise _leg_burn_named(error) from None
    for note in inputs.notes:
        _console(stderr=True).print(f"note: {note}", markup=False)
    return inputs


_LEG_BURN = re.compile(r"(?<![\w.])leg (\d+), burn(?![\w.])")


def _leg_burn_named(error: LoadcheckError) -> LoadcheckError:
    """``error`` with the leg burn that a typed leg option's problem asks for (``expected leg 3, burn as
    well``: loadcheck.loading.apply_overrides names it by its field, whatever the source) named as the
    command line gives it: ``--leg-burn 3:trip=AMOUNT (or a [[leg]] table in a loading file)``. Only the
    problems of a ``--leg-*`` option typed are touched; a problem of the file's own legs keeps its words.
    """
    problems = [
        replace(
            problem,
            expected=_LEG_BURN.sub(
                lambda leg: f"--leg-burn {leg[1]}:trip=AMOUNT (or a [[leg]] table in a loading file)",
                problem.expected,
            ),
        )
        if problem.field.startswith("--leg-") and problem.expected
        else problem
        for problem in error.problems
    ]
    return error if problems == error.problems else type(error)(problems, file=error.file)


def _need(value: T | None, option: str) -> T:
    if value is None:
        raise InputError(Problem(option, "this option is required here"))
    return value
