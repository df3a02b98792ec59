"""The ``loadcheck`` command line: parse arguments, load files, call the library, render.

Exit status (DESIGN.md): 0 within limits, 1 a limit is exceeded, 2 the input could not be
used. Errors in the input are printed to stderr with the file, the field and the value,
never as a traceback (set LOADCHECK_DEBUG=1 to see one).
"""

from __future__ import annotations

import functools
import json
import os
import sys
from collections.abc import Callable
from pathlib import Path
from typing import Annotated, Any, Literal, TypeVar

import typer
from pydantic import ValidationError
from rich.console import Console

from . import __version__
from .errors import InputError, LoadcheckError, Problem

__all__ = ["app", "main"]

EXIT_OK, EXIT_LIMIT, EXIT_INPUT = 0, 1, 2

app = typer.Typer(
    name="loadcheck",
    help=(
        "Aircraft weight and balance: check a loading against every limit at ramp, takeoff, "
        "landing and zero fuel and along the whole fuel burn.\n\n"
        "Advisory only: the approved flight manual and the current weight-and-balance record "
        "govern, and the pilot in command decides."
    ),
    no_args_is_help=True,
    add_completion=False,
    pretty_exceptions_enable=False,
    rich_markup_mode=None,
    context_settings={"help_option_names": ["-h", "--help"]},
)

F = TypeVar("F", bound=Callable[..., Any])


def _console(stderr: bool = False) -> Console:
    console = Console(stderr=stderr, highlight=False)
    if not console.is_terminal:
        console = Console(stderr=stderr, highlight=False, width=max(console.width, 160))
    return console


def _fail_input(lines: list[str]) -> None:
    err = _console(stderr=True)
    for line in lines:
        err.print(f"error: {line}", markup=False, soft_wrap=True)
    raise typer.Exit(EXIT_INPUT)


def input_errors(func: F) -> F:
    """Turn bad input into exit 2 with a plain message, never a traceback."""

    @functools.wraps(func)
    def wrapper(*args: Any, **kwargs: Any) -> Any:
        try:
            return func(*args, **kwargs)
        except LoadcheckError as error:
            _fail_input(error.lines())
        except ValidationError as error:
            from .files import problems_from_validation

            _fail_input([p.describe() for p in problems_from_validation(error)])
        except (typer.Exit, typer.Abort, KeyboardInterrupt):
            raise
        except Exception as error:  # a bug must never read as "within limits" (0) or "exceeded" (1)
            if os.environ.get("LOADCHECK_DEBUG"):
                raise
            _fail_input([f"internal error ({type(error).__name__}: {error}); no result was produced. "
                         "Please report it; LOADCHECK_DEBUG=1 shows the traceback."])

    return wrapper  # type: ignore[return-value]


def _assignments(values: list[str], option: str) -> dict[str, str]:
    """``["front=340", "bag1=20 kg"]`` -> ``{"front": "340", "bag1": "20 kg"}``."""
    result: dict[str, str] = {}
    problems = []
    for value in values:
        name, sep, amount = value.partition("=")
        if not sep or not name.strip() or not amount.strip():
            problems.append(Problem(option, "expected NAME=VALUE", value=value, expected="e.g. front=340 or bag1='20 kg'"))
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
    version: Annotated[bool, typer.Option("--version", callback=_version, is_eager=True, help="Show the version.")] = False,
) -> None:
    """Aircraft weight and balance."""


# Options shared by `check` and the `plan` commands.
AircraftArg = Annotated[Path, typer.Argument(metavar="AIRCRAFT", help="Aircraft file (TOML), or a loading file that names its aircraft.")]
LoadingArg = Annotated[Path | None, typer.Argument(metavar="LOADING", help="Loading file (TOML); optional.")]
LoadOpt = Annotated[list[str], typer.Option("--load", "-l", help="STATION=WEIGHT; repeat. e.g. front=340, bag1='20 kg'.")]
FuelOpt = Annotated[list[str], typer.Option("--fuel", "-f", help="TANK=QUANTITY; repeat. A volume, 'full', a level name or '120 lb'.")]
TaxiOpt = Annotated[str | None, typer.Option(help="Fuel used before takeoff (volume, or with a unit).")]
TripOpt = Annotated[str | None, typer.Option(help="Fuel used from takeoff to landing.")]
TripTimeOpt = Annotated[str | None, typer.Option("--trip-time", help="Flight time, e.g. 2:15; with --rate.")]
RateOpt = Annotated[str | None, typer.Option(help="Fuel used per hour (with --trip-time).")]
OrderOpt = Annotated[str | None, typer.Option(help="'together', or tank ids in burn order: aux,mains.")]
ReserveOpt = Annotated[str | None, typer.Option(help="Warn when landing fuel is below this.")]
CategoryOpt = Annotated[str | None, typer.Option("--category", "-c", help="Envelope category (default: the file's first).")]
JsonOpt = Annotated[bool, typer.Option("--json", help="Print one JSON object instead of tables.")]


def _inputs(
    aircraft: Path, loading: Path | None, load: list[str], fuel: list[str], taxi: str | None, trip: str | None,
    trip_time: str | None, rate: str | None, order: str | None, reserve: str | None, category: str | None,
) -> Any:
    """Read the files and lay the options over them (loadcheck.files.load_check_inputs)."""
    from .files import load_check_inputs

    burn: dict[str, Any] = {}
    for key, value in (("taxi", taxi), ("trip", trip), ("trip_time", trip_time), ("rate", rate), ("reserve", reserve)):
        if value is not None:
            burn[key] = value
    if order is not None:
        burn["order"] = "together" if order.strip() == "together" else [t.strip() for t in order.split(",") if t.strip()]
    inputs = load_check_inputs(
        aircraft, loading, load=_assignments(load, "--load"), fuel=_assignments(fuel, "--fuel"),
        burn=burn, category=category,
    )
    for note in inputs.notes:
        _console(stderr=True).print(f"note: {note}", markup=False)
    return inputs


@app.command()
@input_errors
def check(
    aircraft: AircraftArg,
    loading: LoadingArg = None,
    load: LoadOpt = [],  # noqa: B006
    fuel: FuelOpt = [],  # noqa: B006
    taxi: TaxiOpt = None,
    trip: TripOpt = None,
    trip_time: TripTimeOpt = None,
    rate: RateOpt = None,
    order: OrderOpt = None,
    reserve: ReserveOpt = None,
    category: CategoryOpt = None,
    json_out: JsonOpt = False,
    chart: Annotated[Path | None, typer.Option(help="Write the envelope chart: .png, .svg or .pdf.")] = None,
    sheet: Annotated[Path | None, typer.Option(help="Write a printable load sheet (.html).")] = None,
    plot: Annotated[bool, typer.Option("--plot", help="Draw a small text plot of the envelope under the tables.")] = False,
    record: Annotated[str | None, typer.Option(help="Record the check in this SQLite file ('default': the user data folder).")] = None,
) -> None:
    """Check a loading: moment table, ramp/takeoff/landing/zero-fuel conditions, the burn path.

    Examples:

      loadcheck check sample_aircraft/trainer4/aircraft.toml sample_aircraft/trainer4/within.toml

      loadcheck check sample_aircraft/trainer4/aircraft.toml --load front=340 --load rear=150 --fuel mains=tabs --taxi 1.2 --trip 18

      loadcheck check sample_aircraft/twin6/leaves_path.toml --json

    Exit status: 0 within limits, 1 a limit is exceeded, 2 the input could not be used.
    """
    from .check import check_loading

    inputs = _inputs(aircraft, loading, load, fuel, taxi, trip, trip_time, rate, order, reserve, category)
    result = check_loading(inputs.aircraft, inputs.loading)
    if record is not None:
        _record_single(record, inputs, result)
    if chart is not None or sheet is not None:
        _write_pictures(inputs, result, chart, sheet)
    if json_out:
        typer.echo(result.to_json())
    else:
        from .render.terminal import render_check

        lines: list[str] = []
        if plot:
            from .render.textplot import text_plot

            lines = text_plot(inputs.aircraft, result)
        render_check(result, _console(), lines)
    raise typer.Exit(EXIT_OK if result.ok else EXIT_LIMIT)


def _record_single(record: str, inputs: Any, result: Any) -> None:
    """Record one check: the loading as given (file and options merged) and the full result."""
    from .records import RecordLog, default_path

    given = inputs.given
    path = default_path() if record == "default" else Path(record)
    with RecordLog(path) as log:
        record_id = log.add(
            aircraft_data=inputs.aircraft.model_dump(mode="json"), fingerprint=inputs.aircraft.fingerprint,
            inputs=given.model_dump(mode="json", exclude_none=True), result=result.to_dict(),
            registration=inputs.aircraft.registration, reference=given.reference or given.label, pilot=given.pilot,
            source=str(inputs.loading_file or "command line"), version=__version__,
        )
    _console(stderr=True).print(f"recorded as {record_id} in {path}", markup=False)


def _write_pictures(inputs: Any, result: Any, chart: Path | None, sheet: Path | None) -> None:
    """Write the chart and/or the load sheet; report each file written on stderr."""
    from .files import write_atomic
    from .render.chart import check_figure, figure_svg, save_figure

    if sheet is not None and sheet.suffix.lower() not in (".html", ".htm"):
        raise InputError(Problem("--sheet", "a load sheet is an HTML file", value=str(sheet), expected="a name ending in .html"))
    figure = check_figure(inputs.aircraft, result, inputs.label)
    err = _console(stderr=True)
    if chart is not None:
        save_figure(figure, chart)
        err.print(f"chart written: {chart}", markup=False)
    if sheet is not None:
        from .render.sheet import load_sheet_html

        write_atomic(sheet, load_sheet_html(result, figure_svg(figure), loading_label=inputs.label))
        err.print(f"load sheet written: {sheet}", markup=False)


@app.command()
@input_errors
def show(
    aircraft: Annotated[Path, typer.Argument(help="Aircraft file (TOML).")],
    chart: Annotated[Path | None, typer.Option(help="Write a chart of the envelopes: .png, .svg or .pdf.")] = None,
    category: Annotated[str | None, typer.Option("--category", "-c", help="Category to draw in full.")] = None,
) -> None:
    """Show an aircraft's data: units, empty weight, limits, stations, tanks, envelopes.

    Example:

      loadcheck show sample_aircraft/twin6/aircraft.toml --chart twin-envelope.png
    """
    from .caution import PILOT_CAUTION
    from .files import load_aircraft
    from .render.terminal import render_aircraft

    data = load_aircraft(aircraft)
    data.category(category)  # fail on an unknown category before printing anything
    render_aircraft(data, _console(), PILOT_CAUTION)
    if chart is not None:
        from .render.chart import envelope_figure, save_figure

        save_figure(envelope_figure(data, category), chart)
        _console(stderr=True).print(f"chart written: {chart}", markup=False)


@app.command()
@input_errors
def validate(
    files: Annotated[list[Path], typer.Argument(help="Aircraft and loading files to check.")],
) -> None:
    """Check aircraft and loading files and report every problem at once.

    A loading file that names its aircraft is checked against it too (station, tank and
    level names, capacities).

    Example:

      loadcheck validate sample_aircraft/*/*.toml
    """
    from .files import validate_file

    console = _console()
    failed = False
    for path in files:
        try:
            summary = validate_file(path)
        except LoadcheckError as error:
            failed = True
            for line in error.lines():
                _console(stderr=True).print(f"error: {line}", markup=False, soft_wrap=True)
            continue
        console.print(f"ok: {path}: {summary}", markup=False)
    from .caution import PILOT_CAUTION
    from .render.terminal import caution_text

    console.print(caution_text(PILOT_CAUTION))
    raise typer.Exit(EXIT_INPUT if failed else EXIT_OK)


@app.command()
@input_errors
def schema(
    kind: Annotated[Literal["aircraft", "loading", "all"], typer.Argument(help="Which file's schema.")] = "all",
) -> None:
    """Print the JSON Schema of the aircraft and loading files, for editors.

    Example:

      loadcheck schema aircraft > aircraft.schema.json
    """
    from .aircraft import Aircraft
    from .loading import Loading

    schemas = {"aircraft": Aircraft.model_json_schema(), "loading": Loading.model_json_schema()}
    typer.echo(json.dumps(schemas if kind == "all" else schemas[kind], indent=2))


plan_app = typer.Typer(
    help=(
        "Planning answers: most fuel, longest trip, most payload, fuel to leave behind, least ballast, "
        "weight shift, fuel against payload. Each honours every limit the check enforces.\n\n"
        "Exit status: 0 an answer was found, 1 no amount brings the loading within limits, 2 bad input."
    ),
    no_args_is_help=True,
)
app.add_typer(plan_app, name="plan")

StationOpt = Annotated[str | None, typer.Option("--station", "-s", help="Station id.")]
FillOpt = Annotated[str | None, typer.Option(help="Tanks in the order they are filled: mains,aux (default: reverse burn order).")]


def _fill(fill: str | None) -> list[str] | None:
    return None if fill is None else [t.strip() for t in fill.split(",") if t.strip()]


def _answer(result: Any, json_out: bool) -> None:
    if json_out:
        typer.echo(result.to_json())
    else:
        from .render.terminal import render_plan

        render_plan(result, _console())
    raise typer.Exit(EXIT_OK if result.feasible else EXIT_LIMIT)


def _need(value: Any, option: str) -> Any:
    if value is None:
        raise InputError(Problem(option, "this option is required here"))
    return value


@plan_app.command("fuel")
@input_errors
def plan_fuel(
    aircraft: AircraftArg, loading: LoadingArg = None, load: LoadOpt = [], fuel: FuelOpt = [],  # noqa: B006
    taxi: TaxiOpt = None, trip: TripOpt = None, trip_time: TripTimeOpt = None, rate: RateOpt = None,
    order: OrderOpt = None, reserve: ReserveOpt = None, category: CategoryOpt = None, fill: FillOpt = None,
    json_out: JsonOpt = False,
) -> None:
    """The most fuel at engine start for which the whole flight is within limits.

    Example:

      loadcheck plan fuel sample_aircraft/trainer4/within.toml
    """
    from .planning import most_fuel

    inputs = _inputs(aircraft, loading, load, fuel, taxi, trip, trip_time, rate, order, reserve, category)
    _answer(most_fuel(inputs.aircraft, inputs.loading, fill=_fill(fill)), json_out)


@plan_app.command("trip")
@input_errors
def plan_trip(
    aircraft: AircraftArg, loading: LoadingArg = None, load: LoadOpt = [], fuel: FuelOpt = [],  # noqa: B006
    taxi: TaxiOpt = None, order: OrderOpt = None, category: CategoryOpt = None, fill: FillOpt = None,
    rate: Annotated[str | None, typer.Option(help="Fuel used per hour [fuel volume unit].")] = None,
    reserve: Annotated[str, typer.Option(help="Fuel to land with [fuel volume unit].")] = "0",
    json_out: JsonOpt = False,
) -> None:
    """The longest trip the most fuel allows at a burn rate, landing with a reserve.

    Example:

      loadcheck plan trip sample_aircraft/trainer4/within.toml --rate 9.5 --reserve 8
    """
    from .planning import longest_trip
    from .units import read_amount

    inputs = _inputs(aircraft, loading, load, fuel, taxi, None, None, None, order, None, category)
    volume = inputs.aircraft.units.fuel_volume
    result = longest_trip(inputs.aircraft, inputs.loading, rate=read_amount(_need(rate, "--rate"), volume, "--rate"),
                          reserve=read_amount(reserve, volume, "--reserve"), fill=_fill(fill))
    _answer(result, json_out)


@plan_app.command("payload")
@input_errors
def plan_payload(
    aircraft: AircraftArg, loading: LoadingArg = None, load: LoadOpt = [], fuel: FuelOpt = [],  # noqa: B006
    taxi: TaxiOpt = None, trip: TripOpt = None, trip_time: TripTimeOpt = None, rate: RateOpt = None,
    order: OrderOpt = None, reserve: ReserveOpt = None, category: CategoryOpt = None, station: StationOpt = None,
    json_out: JsonOpt = False,
) -> None:
    """The most weight a station can take with everything else as given.

    Example:

      loadcheck plan payload sample_aircraft/trainer4/within.toml --station bag1
    """
    from .planning import most_payload

    inputs = _inputs(aircraft, loading, load, fuel, taxi, trip, trip_time, rate, order, reserve, category)
    _answer(most_payload(inputs.aircraft, inputs.loading, _need(station, "--station")), json_out)


@plan_app.command("leave")
@input_errors
def plan_leave(
    aircraft: AircraftArg, loading: LoadingArg = None, load: LoadOpt = [], fuel: FuelOpt = [],  # noqa: B006
    taxi: TaxiOpt = None, trip: TripOpt = None, trip_time: TripTimeOpt = None, rate: RateOpt = None,
    order: OrderOpt = None, reserve: ReserveOpt = None, category: CategoryOpt = None, station: StationOpt = None,
    payload: Annotated[str | None, typer.Option(help="Weight to carry at the station (mass, or with a unit).")] = None,
    fill: FillOpt = None, json_out: JsonOpt = False,
) -> None:
    """The fuel to leave behind to carry a payload at a station.

    Example:

      loadcheck plan leave sample_aircraft/twin6/within.toml --station row3 --payload 340
    """
    from .planning import fuel_to_leave
    from .units import read_amount

    inputs = _inputs(aircraft, loading, load, fuel, taxi, trip, trip_time, rate, order, reserve, category)
    weight = read_amount(_need(payload, "--payload"), inputs.aircraft.units.mass, "--payload")
    _answer(fuel_to_leave(inputs.aircraft, inputs.loading, _need(station, "--station"), weight, fill=_fill(fill)), json_out)


@plan_app.command("ballast")
@input_errors
def plan_ballast(
    aircraft: AircraftArg, loading: LoadingArg = None, load: LoadOpt = [], fuel: FuelOpt = [],  # noqa: B006
    taxi: TaxiOpt = None, trip: TripOpt = None, trip_time: TripTimeOpt = None, rate: RateOpt = None,
    order: OrderOpt = None, reserve: ReserveOpt = None, category: CategoryOpt = None, station: StationOpt = None,
    json_out: JsonOpt = False,
) -> None:
    """The least ballast (at the aircraft's ballast station, or --station) that brings the loading within limits.

    Example:

      loadcheck plan ballast sample_aircraft/tandem2/aft_heavy.toml
    """
    from .planning import least_ballast

    inputs = _inputs(aircraft, loading, load, fuel, taxi, trip, trip_time, rate, order, reserve, category)
    _answer(least_ballast(inputs.aircraft, inputs.loading, station), json_out)


@plan_app.command("shift")
@input_errors
def plan_shift(
    aircraft: AircraftArg, loading: LoadingArg = None, load: LoadOpt = [], fuel: FuelOpt = [],  # noqa: B006
    taxi: TaxiOpt = None, trip: TripOpt = None, trip_time: TripTimeOpt = None, rate: RateOpt = None,
    order: OrderOpt = None, reserve: ReserveOpt = None, category: CategoryOpt = None,
    source: Annotated[str | None, typer.Option("--from", help="Station the weight comes from.")] = None,
    to: Annotated[str | None, typer.Option("--to", help="Station it goes to.")] = None,
    target: Annotated[str | None, typer.Option(help="CG to reach (arm, or with a unit); default: back within limits.")] = None,
    condition: Annotated[str, typer.Option(help="Condition whose CG --target sets: ramp, takeoff, landing, zero_fuel.")] = "takeoff",
    json_out: JsonOpt = False,
) -> None:
    """Weight to move from one station to another: to a target CG, or back within limits.

    Example:

      loadcheck plan shift sample_aircraft/tandem2/aft_heavy.toml --from baggage --to front
    """
    from .planning import weight_shift
    from .units import read_amount

    if condition not in ("ramp", "takeoff", "landing", "zero_fuel"):
        raise InputError(Problem("--condition", f"unknown condition {condition!r}", expected="ramp, takeoff, landing or zero_fuel"))
    inputs = _inputs(aircraft, loading, load, fuel, taxi, trip, trip_time, rate, order, reserve, category)
    arm = None if target is None else read_amount(target, inputs.aircraft.units.arm, "--target")
    result = weight_shift(inputs.aircraft, inputs.loading, _need(source, "--from"), _need(to, "--to"),
                          target_arm=arm, condition=condition)  # type: ignore[arg-type]
    _answer(result, json_out)


@plan_app.command("table")
@input_errors
def plan_table(
    aircraft: AircraftArg, loading: LoadingArg = None, load: LoadOpt = [], fuel: FuelOpt = [],  # noqa: B006
    taxi: TaxiOpt = None, trip: TripOpt = None, trip_time: TripTimeOpt = None, rate: RateOpt = None,
    order: OrderOpt = None, reserve: ReserveOpt = None, category: CategoryOpt = None, station: StationOpt = None,
    steps: Annotated[int, typer.Option(min=2, max=201, help="Rows of payload.")] = 11,
    fill: FillOpt = None,
    chart: Annotated[Path | None, typer.Option(help="Also draw it: .png, .svg or .pdf.")] = None,
    json_out: JsonOpt = False,
) -> None:
    """Allowed ramp fuel against payload added at a station, as a table (and a chart).

    Example:

      loadcheck plan table sample_aircraft/trainer4/within.toml --station rear --chart fuel-payload.png
    """
    from .planning import fuel_payload_table

    inputs = _inputs(aircraft, loading, load, fuel, taxi, trip, trip_time, rate, order, reserve, category)
    name = _need(station, "--station")
    rows = fuel_payload_table(inputs.aircraft, inputs.loading, name, steps=steps, fill=_fill(fill))
    if chart is not None:
        from .render.chart import fuel_payload_figure, save_figure

        save_figure(fuel_payload_figure(inputs.aircraft, rows, name), chart)
        _console(stderr=True).print(f"chart written: {chart}", markup=False)
    if json_out:
        from .caution import PILOT_CAUTION

        units = inputs.aircraft.units
        typer.echo(json.dumps({"station": name, "rows": [r.to_dict() for r in rows],
                               "units": {"mass": units.mass, "fuel_volume": units.fuel_volume}, "caution": PILOT_CAUTION}, indent=2))
    else:
        from .render.terminal import render_table

        render_table(inputs.aircraft, rows, name, _console())
    raise typer.Exit(EXIT_OK if any(r.most is not None for r in rows) else EXIT_LIMIT)


# -- the mechanic's commands -----------------------------------------------------------------

WriteOpt = Annotated[bool, typer.Option("--write", help="Make the new record current and keep the old one in the history.")]
SheetOpt = Annotated[Path | None, typer.Option(help="Write a printable record (.html) to sign.")]
OccupantOpt = Annotated[str | None, typer.Option(help="Standard occupant weight (default: the aircraft file's, else 170 lb).")]
MetoOpt = Annotated[float | None, typer.Option(help="Maximum-except-takeoff power [hp] for the minimum fuel (default: the file's).")]


def _new_empty_weight(
    aircraft: Path, source: Path, read: Callable[[Path, Any], Any], compute: Callable[[Any, Any], Any],
    render: Callable[[Any, Any, Any], None], reason: str, write: bool, sheet: Path | None, json_out: bool,
) -> None:
    """A new empty-weight record from a weighing or equipment changes: read the aircraft
    (once) and ``source``, compute, print, and with ``write`` keep it in the aircraft file."""
    from .files import load_aircraft_for_update, read_toml, write_new_record

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
    from .extremes import extremes
    from .files import write_atomic
    from .render.sheet import mechanic_sheet_html

    if sheet.suffix.lower() not in (".html", ".htm"):
        raise InputError(Problem("--sheet", "the record is an HTML file", value=str(sheet), expected="a name ending in .html"))
    try:
        checks = extremes(aircraft.with_empty(result.new.weight, result.new.arm, result.new.lateral_arm))
    except LoadcheckError as error:
        _console(stderr=True).print(f"note: the extreme checks were left out of the record: {error}", markup=False)
        checks = None
    write_atomic(sheet, mechanic_sheet_html(result, aircraft.units, extremes=checks, source=str(source)))
    _console(stderr=True).print(f"record written: {sheet}", markup=False)


@app.command()
@input_errors
def weigh(
    aircraft: Annotated[Path, typer.Argument(help="Aircraft file (TOML).")],
    readings: Annotated[Path, typer.Argument(help="Readings file (TOML): weighing points and corrections.")],
    write: WriteOpt = False,
    sheet: SheetOpt = None,
    json_out: JsonOpt = False,
) -> None:
    """Basic empty weight and CG from scale readings (AC 43.13-1B ch. 10; FAA-H-8083-1 ch. 3).

    Without --write nothing is changed. With it, the new record becomes the aircraft file's
    [empty] table and the old one is kept in [[history]], with the readings.

    Example:

      loadcheck weigh sample_aircraft/trainer4/aircraft.toml sample_aircraft/trainer4/weighing.toml
    """
    from .files import load_readings
    from .render.terminal import render_weighing
    from .weighing import weigh as compute

    _new_empty_weight(aircraft, readings, load_readings, compute, render_weighing, "weighing", write, sheet, json_out)


@app.command()
@input_errors
def alter(
    aircraft: Annotated[Path, typer.Argument(help="Aircraft file (TOML).")],
    changes: Annotated[Path, typer.Argument(help="Changes file (TOML): items installed, removed, relocated.")],
    write: WriteOpt = False,
    sheet: SheetOpt = None,
    json_out: JsonOpt = False,
) -> None:
    """New empty weight and CG after equipment changes, and whether they are negligible.

    Items removed or relocated must be in the aircraft file's [[equipment]] list; --write
    updates that list too.

    Example:

      loadcheck alter sample_aircraft/trainer4/aircraft.toml sample_aircraft/trainer4/changes.toml
    """
    from .alterations import alter as compute
    from .files import load_changes
    from .render.terminal import render_alteration

    _new_empty_weight(aircraft, changes, load_changes, compute, render_alteration, "alteration", write, sheet, json_out)


@app.command()
@input_errors
def history(
    aircraft: Annotated[Path, typer.Argument(help="Aircraft file (TOML).")],
    json_out: JsonOpt = False,
) -> None:
    """List the aircraft's empty-weight records, oldest first, and the current one.

    Example:

      loadcheck history sample_aircraft/trainer4/aircraft.toml
    """
    from .caution import MECHANIC_CAUTION
    from .files import load_aircraft

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
        from .render.terminal import render_history

        render_history(data, rows, _console(), MECHANIC_CAUTION)


@app.command()
@input_errors
def extremes(
    aircraft: Annotated[Path, typer.Argument(help="Aircraft file (TOML).")],
    category: CategoryOpt = None,
    occupant: OccupantOpt = None,
    meto: MetoOpt = None,
    json_out: JsonOpt = False,
) -> None:
    """The most forward and most rearward loadings the stations permit (AC 43.13-1B 10-17), each checked.

    Exit status: 0 both within limits, 1 one is not, 2 bad input.

    Example:

      loadcheck extremes sample_aircraft/tandem2/aircraft.toml
    """
    from .extremes import extremes as compute
    from .files import load_aircraft
    from .units import read_amount

    data = load_aircraft(aircraft)
    weight = None if occupant is None else read_amount(occupant, data.units.mass, "--occupant")
    result = compute(data, category=category, occupant_weight=weight, meto_hp=meto)
    if json_out:
        typer.echo(result.to_json())
    else:
        from .render.terminal import render_extremes

        render_extremes(result, _console())
    raise typer.Exit(EXIT_OK if result.ok else EXIT_LIMIT)


@app.command()
@input_errors
def schedule(
    aircraft: Annotated[Path, typer.Argument(help="Aircraft file (TOML).")],
    category: CategoryOpt = None,
    occupant: OccupantOpt = None,
    json_out: JsonOpt = False,
) -> None:
    """The loading schedule of AC 43.13-1B 10-18: full fuel; every seat filled; maximum baggage.

    Example:

      loadcheck schedule sample_aircraft/twin6/aircraft.toml
    """
    from .caution import MECHANIC_CAUTION
    from .files import load_aircraft
    from .planning import loading_schedule
    from .units import read_amount

    data = load_aircraft(aircraft)
    weight = None if occupant is None else read_amount(occupant, data.units.mass, "--occupant")
    cases = loading_schedule(data, category=category, occupant_weight=weight)
    if json_out:
        typer.echo(json.dumps({"cases": [c.to_dict() for c in cases], "caution": MECHANIC_CAUTION}, indent=2, default=str))
    else:
        from .render.terminal import render_schedule

        render_schedule(cases, data, _console(), MECHANIC_CAUTION)
    raise typer.Exit(EXIT_OK)


# -- the dispatcher's commands ---------------------------------------------------------------

fleet_app = typer.Typer(help="A fleet of aircraft files addressed by registration, and a day of loadings.",
                        no_args_is_help=True)
app.add_typer(fleet_app, name="fleet")
records_app = typer.Typer(help="The record of checks: list, show, export, verify (reproduce).", no_args_is_help=True)
app.add_typer(records_app, name="records")

DbOpt = Annotated[Path | None, typer.Option("--db", help="Record database (default: $LOADCHECK_RECORDS or the user data folder).")]


@fleet_app.command("list")
@input_errors
def fleet_list(
    folder: Annotated[Path, typer.Argument(help="Folder of aircraft files (sub-folders searched too).")],
    max_age: Annotated[int, typer.Option(min=1, help="Flag empty-weight records older than this many days.")] = 1095,
    json_out: JsonOpt = False,
) -> None:
    """Each aircraft: registration, empty weight, record date, useful load, data fingerprint, problems.

    Exit status: 0 every file usable, 2 a file does not validate or a registration is in two files.

    Example:

      loadcheck fleet list sample_aircraft
    """
    from .caution import PILOT_CAUTION
    from .fleet import fleet_listing, load_fleet

    lines = fleet_listing(load_fleet(folder), max_age)
    if json_out:
        typer.echo(json.dumps({"aircraft": [line.to_dict() for line in lines], "caution": PILOT_CAUTION}, indent=2))
    else:
        from .render.terminal import render_fleet_list

        render_fleet_list(lines, folder, _console())
    bad = not all(line.usable for line in lines)
    raise typer.Exit(EXIT_INPUT if bad else EXIT_OK)


@fleet_app.command("check")
@input_errors
def fleet_check(
    folder: Annotated[Path, typer.Argument(help="Folder of aircraft files (the fleet).")],
    loadings: Annotated[Path, typer.Argument(help="Loadings: a CSV file (one row per flight) or a folder of loading files.")],
    record: Annotated[Path | None, typer.Option(help="Record database (default: $LOADCHECK_RECORDS or the user data folder).")] = None,
    no_record: Annotated[bool, typer.Option("--no-record", help="Do not record the checks.")] = False,
    json_out: Annotated[bool, typer.Option("--json", help="Print JSON Lines: one object per flight.")] = False,
) -> None:
    """Check a day of loadings against the fleet; record every check.

    Exit status: 0 every flight within limits, 1 a flight is out of limits, 2 a row could not
    be used (the other rows are still checked and reported).

    Example:

      loadcheck fleet check sample_aircraft sample_aircraft/fleet_day.csv --no-record
    """
    from contextlib import nullcontext

    from rich.progress import Progress

    from .fleet import check_flights, load_fleet, read_loadings
    from .records import RecordLog, default_path

    fleet = load_fleet(folder)
    rows, file_problems = read_loadings(loadings, fleet)
    err = _console(stderr=True)
    for problem in file_problems:
        err.print(f"error: {problem}", markup=False, soft_wrap=True)
    log = None if no_record else RecordLog(record or default_path())
    flights = []
    show_progress = len(rows) > 200 and err.is_terminal and not json_out
    with (Progress(console=err, transient=True) if show_progress else nullcontext()) as progress:
        task = progress.add_task("checking", total=len(rows)) if progress is not None else None  # type: ignore[union-attr]
        try:
            for flight in check_flights(fleet, rows, log, __version__, workers=os.cpu_count() or 1):
                flights.append(flight)
                if json_out:
                    sys.stdout.write(json.dumps(flight.to_dict(), separators=(",", ":")) + "\n")
                if progress is not None and task is not None:
                    progress.advance(task)
            sys.stdout.flush()
        finally:
            if log is not None:
                log.close()
    bad = [f for f in flights if f.result is None]
    for flight in bad:
        for problem in flight.problems:
            err.print(f"error: {problem}", markup=False, soft_wrap=True)
    if not json_out:
        from .render.terminal import render_fleet

        render_fleet(flights, _console())
    if log is not None:
        err.print(f"{len(flights) - len(bad)} check(s) recorded in {log.path}", markup=False)
    if bad or file_problems:
        raise typer.Exit(EXIT_INPUT)
    raise typer.Exit(EXIT_OK if all(f.ok for f in flights) else EXIT_LIMIT)


def _date(text: str | None, option: str) -> Any:
    if text is None:
        return None
    import datetime as dt

    try:
        return dt.date.fromisoformat(text)
    except ValueError:
        raise InputError(Problem(option, "expected a date", value=text, expected="YYYY-MM-DD")) from None


SinceOpt = Annotated[str | None, typer.Option(help="From this date (YYYY-MM-DD, UTC).")]
UntilOpt = Annotated[str | None, typer.Option(help="To this date, inclusive.")]
RegOpt = Annotated[str | None, typer.Option("--registration", "-r", help="Only this aircraft.")]


def _log(db: Path | None) -> Any:
    from .records import RecordLog, default_path

    path = db or default_path()
    if not path.exists():
        raise InputError(Problem("--db", f"no record database at {path}"))
    return RecordLog(path)


@records_app.command("list")
@input_errors
def records_list(db: DbOpt = None, since: SinceOpt = None, until: UntilOpt = None, registration: RegOpt = None) -> None:
    """List recorded checks.

    Example:

      loadcheck records list --registration DEMO-4T --since 2026-11-01
    """
    from rich.table import Table

    with _log(db) as log:
        table = Table(title=f"Records in {log.path}", title_justify="left")
        for column in ("Id", "Checked (UTC)", "Registration", "Reference", "Pilot", "Result", "Data"):
            table.add_column(column)
        for r in log.find(since=_date(since, "--since"), until=_date(until, "--until"), registration=registration):
            table.add_row(str(r.id), r.checked_at[:19], r.registration or "", r.reference or "", r.pilot or "",
                          "within limits" if r.ok else "OUT OF LIMITS", r.fingerprint)
    from .caution import PILOT_CAUTION
    from .render.terminal import caution_text

    console = _console()
    console.print(table)
    console.print(caution_text(PILOT_CAUTION))


@records_app.command("show")
@input_errors
def records_show(record_id: Annotated[int, typer.Argument(help="Record id.")], db: DbOpt = None) -> None:
    """Show one record: its inputs and its full result (JSON)."""
    with _log(db) as log:
        record = log.get(record_id)
    typer.echo(json.dumps({**record.summary(), "inputs": record.inputs, "result": record.result}, indent=2))


@records_app.command("export")
@input_errors
def records_export(
    db: DbOpt = None, since: SinceOpt = None, until: UntilOpt = None, registration: RegOpt = None,
    format: Annotated[Literal["csv", "jsonl"], typer.Option(help="csv (one line per record) or jsonl (everything).")] = "jsonl",
    out: Annotated[Path | None, typer.Option(help="Write to this file (default: standard output).")] = None,
) -> None:
    """Export records between dates or for one registration, as CSV or JSON Lines.

    Example:

      loadcheck records export --format csv --since 2026-11-01 --out november.csv
    """
    from .caution import PILOT_CAUTION
    from .records import export_text
    from .render.terminal import caution_text

    with _log(db) as log:
        text = export_text(log.find(since=_date(since, "--since"), until=_date(until, "--until"),
                                    registration=registration), format)
    if out is None:
        typer.echo(text, nl=False)
    else:
        from .files import write_atomic

        write_atomic(out, text)
        _console(stderr=True).print(f"written: {out}", markup=False)
    if format == "csv":  # JSON Lines carry the caution inside each result; CSV rows have no room for it
        _console(stderr=True).print(caution_text(PILOT_CAUTION))


@records_app.command("verify")
@input_errors
def records_verify(record_id: Annotated[int, typer.Argument(help="Record id.")], db: DbOpt = None) -> None:
    """Recompute a recorded check from its stored inputs and aircraft data; say whether it matches.

    Exit status: 0 the same result, 1 a different one, 2 bad input.
    """
    from .check import check_loading
    from .files import parse_aircraft, parse_loading
    from .loading import resolve_loading
    from .records import results_match

    with _log(db) as log:
        record = log.get(record_id)
        data = log.aircraft_data(record.fingerprint)
    aircraft = parse_aircraft(data, f"record {record_id}")
    loading = parse_loading(record.inputs, f"record {record_id}")
    again = check_loading(aircraft, resolve_loading(loading, aircraft)).to_dict()
    same = results_match(record.result, again) and aircraft.fingerprint == record.fingerprint
    from .caution import PILOT_CAUTION
    from .render.terminal import caution_text

    console = _console()
    if same:
        console.print(f"record {record_id}: reproduced; the same result "
                      f"({'within limits' if again['ok'] else 'out of limits'}) from the recorded inputs and aircraft data "
                      f"{record.fingerprint}", markup=False)
        console.print(caution_text(PILOT_CAUTION))
        raise typer.Exit(EXIT_OK)
    console.print(f"record {record_id}: NOT reproduced; recomputing gives a different result", markup=False)
    console.print(caution_text(PILOT_CAUTION))
    raise typer.Exit(EXIT_LIMIT)


def _just(name: str) -> typer.Typer | None:
    """The application with only the command ``name`` (and the version option), or None.

    typer builds every command of an application each time it starts; building just the
    one asked for keeps a plain ``loadcheck check`` quick to start (benchmarks/startup.py).
    """
    import copy

    small = copy.copy(app)
    small.registered_commands = [c for c in app.registered_commands
                                 if (c.name or c.callback.__name__.replace("_", "-")) == name]  # type: ignore[union-attr]
    small.registered_groups = [g for g in app.registered_groups if g.name == name]
    return small if small.registered_commands or small.registered_groups else None


def main() -> None:
    """Entry point of the console script."""
    words = [w for w in sys.argv[1:] if not w.startswith("-")]
    first = sys.argv[1] if len(sys.argv) > 1 else ""
    chosen = _just(words[0]) if words and first == words[0] else None
    (chosen or app)(prog_name="loadcheck")


if __name__ == "__main__":  # pragma: no cover
    main()
