"""The pilot's commands: check, show, validate, schema, and the planning answers."""

from __future__ import annotations

import json
from pathlib import Path
from typing import Annotated, Any, Literal

import typer

from .. import __version__
from ..errors import InputError, LoadcheckError, Problem
from .common import (
    EXIT_INPUT,
    EXIT_LIMIT,
    EXIT_OK,
    AircraftArg,
    CategoryOpt,
    FuelOpt,
    JsonOpt,
    LoadingArg,
    LoadOpt,
    OrderOpt,
    RateOpt,
    ReserveOpt,
    TaxiOpt,
    TripOpt,
    TripTimeOpt,
    _console,
    _inputs,
    _need,
    app,
    input_errors,
)


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
    from ..check import check_loading

    inputs = _inputs(aircraft, loading, load, fuel, taxi, trip, trip_time, rate, order, reserve, category)
    result = check_loading(inputs.aircraft, inputs.loading)
    if record is not None:
        _record_single(record, inputs, result)
    if chart is not None or sheet is not None:
        _write_pictures(inputs, result, chart, sheet)
    if json_out:
        typer.echo(result.to_json())
    else:
        from ..render.terminal import render_check

        lines: list[str] = []
        if plot:
            from ..render.textplot import text_plot

            lines = text_plot(inputs.aircraft, result)
        render_check(result, _console(), lines)
    raise typer.Exit(EXIT_OK if result.ok else EXIT_LIMIT)


def _record_single(record: str, inputs: Any, result: Any) -> None:
    """Record one check: the loading as given (file and options merged) and the full result."""
    from ..records import RecordLog, default_path, record_check

    path = default_path() if record == "default" else Path(record)
    with RecordLog(path) as log:
        record_id = record_check(log, inputs, result, source=str(inputs.loading_file or "command line"), version=__version__)
    _console(stderr=True).print(f"recorded as {record_id} in {path}", markup=False)


def _write_pictures(inputs: Any, result: Any, chart: Path | None, sheet: Path | None) -> None:
    """Write the chart and/or the load sheet; report each file written on stderr."""
    from ..files import write_atomic
    from ..render.chart import check_figure, figure_svg, save_figure

    if sheet is not None and sheet.suffix.lower() not in (".html", ".htm"):
        raise InputError(Problem("--sheet", "a load sheet is an HTML file", value=str(sheet), expected="a name ending in .html"))
    figure = check_figure(inputs.aircraft, result, inputs.label)
    err = _console(stderr=True)
    if chart is not None:
        save_figure(figure, chart)
        err.print(f"chart written: {chart}", markup=False)
    if sheet is not None:
        from ..render.sheet import load_sheet_html

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
    from ..caution import PILOT_CAUTION
    from ..files import load_aircraft
    from ..render.terminal import render_aircraft

    data = load_aircraft(aircraft)
    data.category(category)  # fail on an unknown category before printing anything
    render_aircraft(data, _console(), PILOT_CAUTION)
    if chart is not None:
        from ..render.chart import envelope_figure, save_figure

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
    from ..files import validate_file

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
    from ..caution import PILOT_CAUTION
    from ..render.terminal import caution_text

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
    from ..aircraft import Aircraft
    from ..loading import Loading

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
        from ..render.terminal import render_plan

        render_plan(result, _console())
    raise typer.Exit(EXIT_OK if result.feasible else EXIT_LIMIT)


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
    from ..planning import most_fuel

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
    from ..planning import longest_trip
    from ..units import read_amount, read_rate

    inputs = _inputs(aircraft, loading, load, fuel, taxi, None, None, None, order, None, category)
    volume = inputs.aircraft.units.fuel_volume
    result = longest_trip(inputs.aircraft, inputs.loading, rate=read_rate(_need(rate, "--rate"), volume, "--rate"),
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
    from ..planning import most_payload

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
    from ..planning import fuel_to_leave
    from ..units import read_amount

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
    from ..planning import least_ballast

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
    from ..planning import weight_shift
    from ..units import read_amount

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
    from ..planning import fuel_payload_table

    inputs = _inputs(aircraft, loading, load, fuel, taxi, trip, trip_time, rate, order, reserve, category)
    name = _need(station, "--station")
    table = fuel_payload_table(inputs.aircraft, inputs.loading, name, steps=steps, fill=_fill(fill))
    if chart is not None:
        from ..render.chart import fuel_payload_figure, save_figure

        save_figure(fuel_payload_figure(inputs.aircraft, table.rows, name), chart)
        _console(stderr=True).print(f"chart written: {chart}", markup=False)
    if json_out:
        typer.echo(table.to_json())
    else:
        from ..render.terminal import render_table

        render_table(inputs.aircraft, table.rows, name, _console())
    raise typer.Exit(EXIT_OK if table.ok else EXIT_LIMIT)


