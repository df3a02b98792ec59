"""The pilot's commands: check, show, validate, schema, and the planning answers."""

from __future__ import annotations

import json
from pathlib import Path
from typing import TYPE_CHECKING, Annotated, Any, Literal

import typer

from .. import __version__
from ..errors import InputError, Problem
from .common import (
    EXIT_INPUT,
    EXIT_LIMIT,
    EXIT_OK,
    AircraftArg,
    CategoryOpt,
    DbOpt,
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
    options_as_typed,
)

if TYPE_CHECKING:
    from ..files import CheckInputs
    from ..loading import ResolvedTrip
    from ..planning import PlanResult
    from ..results import CheckResult, ConditionName, TripResult

LegLoadOpt = Annotated[
    list[str],
    typer.Option(
        "--leg-load",
        metavar="LEG:STATION=WEIGHT",
        help="From leg 2 on: new weight at the stop before that leg (0: off); repeat.",
    ),
]
LegFuelOpt = Annotated[
    list[str],
    typer.Option(
        "--leg-fuel",
        metavar="LEG:TANK=QUANTITY",
        help="Fuel put in at the stop before that leg: a volume, '120 lb', 'full' or a level.",
    ),
]
LegBurnOpt = Annotated[
    list[str],
    typer.Option(
        "--leg-burn", metavar="LEG:NAME=VALUE", help="That leg's taxi, trip, trip_time, rate, order or reserve; repeat."
    ),
]


def _legs(leg_load: list[str], leg_fuel: list[str], leg_burn: list[str]) -> dict[int, dict[str, dict[str, Any]]]:
    """The legs' options as loading-file values (loadcheck.loading.leg_assignments)."""
    from ..loading import leg_assignments

    legs: dict[int, dict[str, dict[str, Any]]] = {}
    for option, values in (("--leg-load", leg_load), ("--leg-fuel", leg_fuel), ("--leg-burn", leg_burn)):
        for number, tables in leg_assignments(option, values).items():
            legs.setdefault(number, {}).update(tables)
    return legs


@app.command(short_help="Check a loading against every limit.")
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
    chart: Annotated[
        Path | None, typer.Option(metavar="FILE", help="Write the envelope chart: .png, .svg or .pdf.")
    ] = None,
    sheet: Annotated[
        Path | None, typer.Option(metavar="FILE.html", help="Write a printable load sheet (.html).")
    ] = None,
    plot: Annotated[
        bool, typer.Option("--plot", help="Draw a small text plot of the envelope under the tables.")
    ] = False,
    to_log: Annotated[
        bool, typer.Option("--log/--no-log", help="Record the check in the check log (default: not).")
    ] = False,
    db: DbOpt = None,
    leg_load: LegLoadOpt = [],  # noqa: B006
    leg_fuel: LegFuelOpt = [],  # noqa: B006
    leg_burn: LegBurnOpt = [],  # noqa: B006
) -> None:
    """Check a loading: moment table, ramp/takeoff/landing/zero-fuel conditions, the burn path.

    Examples:

    \b
      loadcheck check \\
        sample_aircraft/trainer4/aircraft.toml \\
        sample_aircraft/trainer4/within.toml

    \b
      loadcheck check \\
        sample_aircraft/trainer4/aircraft.toml \\
        --load front=340 --load rear=150 \\
        --fuel mains=school --fuel centre=0 \\
        --taxi 1.2 --trip 18

    \b
      loadcheck check \\
        sample_aircraft/twin6/leaves_path.toml --json

      loadcheck check sample_aircraft/heli2/trip_drop_off.toml   (a trip: every leg is checked)

    Exit status: 0 within limits, 1 a limit is exceeded (on any leg of a trip), 2 the input could not be used.
    """
    from ..check import check_loading
    from ..userdata import log_path

    record = log_path(to_log, db)
    inputs = _inputs(
        aircraft,
        loading,
        load,
        fuel,
        taxi,
        trip,
        trip_time,
        rate,
        order,
        reserve,
        category,
        legs=_legs(leg_load, leg_fuel, leg_burn),
        allow_trip=True,
    )
    if inputs.is_trip and inputs.trip is not None:
        _check_trip(inputs, inputs.trip, json_out, chart, sheet, plot, record)
    result = check_loading(inputs.aircraft, inputs.loading)
    if record is not None:
        _record(record, inputs, result)
    if chart is not None or sheet is not None:
        _write_pictures(inputs, result, chart, sheet)
    if json_out:
        typer.echo(result.to_json())
    else:
        from ..render.terminal import render_check

        console = _console()
        lines: list[str] = []
        if plot:
            from ..render.textplot import text_plot

            lines = text_plot(inputs.aircraft, result, width=console.width)
        render_check(result, console, lines, aircraft=inputs.aircraft)
    raise typer.Exit(EXIT_OK if result.ok else EXIT_LIMIT)


def _check_trip(
    inputs: CheckInputs,
    trip: ResolvedTrip,
    json_out: bool,
    chart: Path | None,
    sheet: Path | None,
    plot: bool,
    record: Path | None,
) -> None:
    """Check every leg of a trip, render it, and exit 1 when any leg is out of limits."""
    from ..trip import check_trip

    result = check_trip(inputs.aircraft, trip)
    if record is not None:
        _record(record, inputs, result)
    if chart is not None or sheet is not None:
        from ..files import write_atomic
        from ..render.chart import figure_svg, save_figure, trip_figure

        if sheet is not None and sheet.suffix.lower() not in (".html", ".htm"):
            raise InputError(
                Problem("--sheet", "a load sheet is an HTML file", value=str(sheet), expected="a name ending in .html")
            )
        figure = trip_figure(inputs.aircraft, result, inputs.label)
        if chart is not None:
            save_figure(figure, chart)
            _console(stderr=True).print(f"chart written: {chart}", markup=False)
        if sheet is not None:
            from ..render.sheet import trip_sheet_html

            write_atomic(
                sheet, trip_sheet_html(result, figure_svg(figure), loading_label=inputs.label, trip_loading=inputs.trip)
            )
            _console(stderr=True).print(f"load sheet written: {sheet}", markup=False)
    if json_out:
        typer.echo(result.to_json())
    else:
        from ..render.trip import render_trip

        plots: list[list[str]] = []
        if plot:
            from ..render.textplot import text_plot

            plots = [text_plot(inputs.aircraft, leg.check) for leg in result.legs]
        render_trip(result, _console(), plots)
    raise typer.Exit(EXIT_OK if result.ok else EXIT_LIMIT)


def _record(path: Path, inputs: CheckInputs, result: CheckResult | TripResult) -> None:
    """Record one check (of a single loading or of a whole trip, as one record): the loading as
    given (file and options merged) and the full result."""
    from ..checklog import CheckLog, log_check

    with CheckLog(path) as log:
        record_id = log_check(
            log, inputs, result, source=str(inputs.loading_file or "command line"), version=__version__
        )
    _console(stderr=True).print(f"recorded as {record_id} in the check log {path}", markup=False)


def _write_pictures(inputs: CheckInputs, result: CheckResult, chart: Path | None, sheet: Path | None) -> None:
    """Write the chart and/or the load sheet; report each file written on stderr."""
    from ..files import write_atomic
    from ..render.chart import check_figure, figure_svg, save_figure

    if sheet is not None and sheet.suffix.lower() not in (".html", ".htm"):
        raise InputError(
            Problem("--sheet", "a load sheet is an HTML file", value=str(sheet), expected="a name ending in .html")
        )
    err = _console(stderr=True)
    if chart is not None:
        save_figure(check_figure(inputs.aircraft, result, inputs.label), chart)
        err.print(f"chart written: {chart}", markup=False)
    if sheet is not None:
        from ..render.sheet import load_sheet_html

        page_chart = figure_svg(check_figure(inputs.aircraft, result, inputs.label, compact=True))
        write_atomic(
            sheet,
            load_sheet_html(
                result,
                page_chart,
                loading_label=inputs.label,
                loading=inputs.loading,
                pilot=inputs.given.pilot if inputs.given is not None else None,
                aircraft=inputs.aircraft,
            ),
        )
        err.print(f"load sheet written: {sheet}", markup=False)


@app.command(short_help="An aircraft's data and envelopes.")
@input_errors
def show(
    aircraft: Annotated[Path, typer.Argument(metavar="AIRCRAFT", help="Aircraft file (TOML).")],
    chart: Annotated[
        Path | None, typer.Option(metavar="FILE", help="Write a chart of the envelopes: .png, .svg or .pdf.")
    ] = None,
    category: Annotated[
        str | None, typer.Option("--category", "-c", metavar="CATEGORY", help="Category to draw in full.")
    ] = None,
) -> None:
    """Show an aircraft's data: units, empty weight, limits, stations, tanks, envelopes.

    Example:

    \b
      loadcheck show sample_aircraft/twin6/aircraft.toml \\
        --chart twin-envelope.png
    """
    from ..caution import PILOT_CAUTION
    from ..files import load_aircraft
    from ..render.terminal import render_aircraft
    from ..weighing import current_record_warnings

    data = load_aircraft(aircraft)
    data.category(category)  # fail on an unknown category before printing anything
    render_aircraft(data, _console(), PILOT_CAUTION, current_record_warnings(data))
    if chart is not None:
        from ..render.chart import envelope_figure, save_figure

        save_figure(envelope_figure(data, category), chart)
        _console(stderr=True).print(f"chart written: {chart}", markup=False)


@app.command(short_help="Check files; list every problem.")
@input_errors
def validate(
    files: Annotated[
        list[Path], typer.Argument(metavar="FILES", help="Aircraft and loading files to check.", show_default=False)
    ],
) -> None:
    """Check aircraft, loading, readings and changes files and report every problem at once.

    A loading file that names its aircraft is checked against it too (station, tank and
    level names, capacities); a readings or changes file that names its aircraft is computed
    as weigh or alter computes it (nothing is written).

    Example:

    \b
      loadcheck validate sample_aircraft/*/*.toml
    """
    from ..files import validate as validate_one
    from ..render.terminal import caution_text

    console = _console()
    found = [validate_one(path) for path in files]
    for path, each in zip(files, found, strict=True):
        if each.ok:
            console.print(f"ok: {path}: {each.summary}", markup=False)
        for line in each.problems:
            _console(stderr=True).print(f"error: {line}", markup=False, soft_wrap=True)
    for caution in dict.fromkeys(each.caution for each in found):  # each that applies, once
        console.print(caution_text(caution))
    raise typer.Exit(EXIT_OK if all(each.ok for each in found) else EXIT_INPUT)


@app.command(short_help="JSON Schema of the files, for editors.")
@input_errors
def schema(
    kind: Annotated[
        Literal["aircraft", "loading", "all"],
        typer.Argument(metavar="KIND", help="Which file's schema: aircraft, loading or all."),
    ] = "all",
) -> None:
    """Print the JSON Schema of the aircraft and loading files, for editors.

    Example:

    \b
      loadcheck schema aircraft > aircraft.schema.json
    """
    from ..aircraft import Aircraft
    from ..loading import Loading

    schemas = {"aircraft": Aircraft.model_json_schema(), "loading": Loading.model_json_schema()}
    typer.echo(json.dumps(schemas if kind == "all" else schemas[kind], indent=2))


plan_app = typer.Typer(
    short_help="Planning: fuel, trip, payload, ballast, shift.",
    help=(
        "Planning answers: most fuel, longest trip, most payload, fuel to leave behind, least ballast, "
        "weight shift, fuel against payload. Each honours every limit the check enforces.\n\n"
        "Exit status: 0 an answer was found, 1 no amount brings the loading within limits, 2 bad input."
    ),
    no_args_is_help=True,
)
app.add_typer(plan_app, name="plan")

StationOpt = Annotated[str | None, typer.Option("--station", "-s", metavar="STATION", help="Station id.")]
FillOpt = Annotated[
    str | None,
    typer.Option(metavar="TANKS", help="Tanks in the order they are filled: mains,aux (default: reverse burn order)."),
]


def _fill(fill: str | None) -> list[str] | None:
    import shlex

    from ..loading import tank_list

    return None if fill is None else tank_list(fill, f"--fill {shlex.quote(fill)}", with_value=False)


def _answer(result: PlanResult, json_out: bool) -> None:
    """Print a planning answer (a trip's too) and exit with its verdict."""
    from ..trip import TripPlan

    if json_out:
        typer.echo(result.to_json())
    elif isinstance(result, TripPlan):
        from ..render.trip import render_trip_plan

        render_trip_plan(result, _console())
    else:
        from ..render.terminal import render_plan

        render_plan(result, _console())
    raise typer.Exit(EXIT_OK if result.feasible else EXIT_LIMIT)


@plan_app.command("fuel", short_help="The most fuel at engine start.")
@input_errors
def plan_fuel(
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
    fill: FillOpt = None,
    json_out: JsonOpt = False,
    leg_load: LegLoadOpt = [],  # noqa: B006
    leg_fuel: LegFuelOpt = [],  # noqa: B006
    leg_burn: LegBurnOpt = [],  # noqa: B006
) -> None:
    """The most fuel at engine start for which the whole flight (every leg of a trip) is within limits.

    Example:

    \b
      loadcheck plan fuel \\
        sample_aircraft/trainer4/within.toml
      loadcheck plan fuel \\
        sample_aircraft/heli2/trip_drop_off.toml
    """
    from ..planning import most_fuel

    inputs = _inputs(
        aircraft,
        loading,
        load,
        fuel,
        taxi,
        trip,
        trip_time,
        rate,
        order,
        reserve,
        category,
        fuel_to_plan=True,
        legs=_legs(leg_load, leg_fuel, leg_burn),
        allow_trip=True,
    )
    from ..trip import trip_most_fuel

    with options_as_typed({"fill": ("--fill", fill)}):
        result = (
            trip_most_fuel(inputs.aircraft, inputs.trip, fill=_fill(fill))
            if inputs.is_trip and inputs.trip is not None
            else most_fuel(inputs.aircraft, inputs.loading, fill=_fill(fill))
        )
    _answer(result, json_out)


@plan_app.command("stop", short_help="Fuel to put in at a stop of a trip.")
@input_errors
def plan_stop(
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
    fill: FillOpt = None,
    leg: Annotated[int | None, typer.Option(metavar="N", help="The leg the stop comes before (2 or more).")] = None,
    json_out: JsonOpt = False,
    leg_load: LegLoadOpt = [],  # noqa: B006
    leg_fuel: LegFuelOpt = [],  # noqa: B006
    leg_burn: LegBurnOpt = [],  # noqa: B006
) -> None:
    """The fuel to put in at the stop before a leg of a trip so that every leg is within limits.

    Example:

    \b
      loadcheck plan stop \\
        sample_aircraft/heli2/trip_drop_off.toml --leg 2
    """
    from ..trip import fuel_to_add

    inputs = _inputs(
        aircraft,
        loading,
        load,
        fuel,
        taxi,
        trip,
        trip_time,
        rate,
        order,
        reserve,
        category,
        stop_to_plan=leg,
        legs=_legs(leg_load, leg_fuel, leg_burn),
        allow_trip=True,
    )
    # a loading of one leg (no trip resolved) goes as given: fuel_to_add refuses it, naming its legs
    trip_data = inputs.trip if inputs.trip is not None else _need(inputs.given, "LOADING")
    with options_as_typed({"leg": ("--leg", leg), "fill": ("--fill", fill)}):
        result = fuel_to_add(inputs.aircraft, trip_data, _need(leg, "--leg"), fill=_fill(fill))
    _answer(result, json_out)


@plan_app.command("trip", short_help="The longest trip at a burn rate.")
@input_errors
def plan_trip(
    aircraft: AircraftArg,
    loading: LoadingArg = None,
    load: LoadOpt = [],  # noqa: B006
    fuel: FuelOpt = [],  # noqa: B006
    taxi: TaxiOpt = None,
    order: OrderOpt = None,
    category: CategoryOpt = None,
    fill: FillOpt = None,
    rate: Annotated[str | None, typer.Option(metavar="AMOUNT", help="Fuel used per hour [fuel volume unit].")] = None,
    reserve: Annotated[
        str | None,
        typer.Option(
            metavar="AMOUNT", help="Fuel to land with [fuel volume unit] (default: the loading's reserve, else none)."
        ),
    ] = None,
    json_out: JsonOpt = False,
) -> None:
    """The longest trip the most fuel allows at a burn rate, landing with a reserve.

    Example:

    \b
      loadcheck plan trip \\
        sample_aircraft/trainer4/within.toml --rate 9.5 \\
        --reserve 8
    """
    from ..planning import longest_trip
    from ..units import read_rate

    # the reserve is read as the loading's own (a volume, or a mass at the tanks' density), and asked for
    inputs = _inputs(aircraft, loading, load, fuel, taxi, None, None, None, order, reserve, category, fuel_to_plan=True)
    volume = inputs.aircraft.units.fuel_volume
    with options_as_typed({"rate": ("--rate", rate), "fill": ("--fill", fill)}):
        result = longest_trip(
            inputs.aircraft,
            inputs.loading,
            rate=read_rate(_need(rate, "--rate"), volume, "--rate"),
            reserve=None if reserve is None else inputs.loading.reserve,
            fill=_fill(fill),
        )
    _answer(result, json_out)


@plan_app.command("payload", short_help="The most weight at a station.")
@input_errors
def plan_payload(
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
    station: StationOpt = None,
    json_out: JsonOpt = False,
) -> None:
    """The most weight a station can take with everything else as given.

    Example:

    \b
      loadcheck plan payload \\
        sample_aircraft/trainer4/within.toml \\
        --station hold
    """
    from ..planning import most_payload

    inputs = _inputs(aircraft, loading, load, fuel, taxi, trip, trip_time, rate, order, reserve, category)
    with options_as_typed({"station": ("--station", station)}):
        result = most_payload(inputs.aircraft, inputs.loading, _need(station, "--station"))
    _answer(result, json_out)


@plan_app.command("leave", short_help="Fuel to leave behind for a payload.")
@input_errors
def plan_leave(
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
    station: StationOpt = None,
    payload: Annotated[
        str | None, typer.Option(metavar="WEIGHT", help="Weight to carry at the station (mass, or with a unit).")
    ] = None,
    fill: FillOpt = None,
    json_out: JsonOpt = False,
) -> None:
    """The fuel to leave behind to carry a payload at a station.

    Example:

    \b
      loadcheck plan leave \\
        sample_aircraft/twin6/within.toml --station row3 \\
        --payload 340
    """
    from ..planning import fuel_to_leave
    from ..units import read_amount

    inputs = _inputs(
        aircraft, loading, load, fuel, taxi, trip, trip_time, rate, order, reserve, category, station_to_plan=station
    )
    weight = read_amount(_need(payload, "--payload"), inputs.aircraft.units.mass, "--payload")
    named = {"station": ("--station", station), "payload": ("--payload", payload), "fill": ("--fill", fill)}
    with options_as_typed(named):
        result = fuel_to_leave(inputs.aircraft, inputs.loading, _need(station, "--station"), weight, fill=_fill(fill))
    _answer(result, json_out)


@plan_app.command("ballast", short_help="The least ballast that is enough.")
@input_errors
def plan_ballast(
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
    station: StationOpt = None,
    json_out: JsonOpt = False,
) -> None:
    """The least ballast (at the aircraft's ballast station, or --station) that brings the loading within limits.

    Example:

    \b
      loadcheck plan ballast \\
        sample_aircraft/tandem2/aft_heavy.toml
    """
    from ..planning import least_ballast

    inputs = _inputs(aircraft, loading, load, fuel, taxi, trip, trip_time, rate, order, reserve, category)
    with options_as_typed({"station": ("--station", station)}):
        result = least_ballast(inputs.aircraft, inputs.loading, station)
    _answer(result, json_out)


@plan_app.command("shift", short_help="Weight to move between stations.")
@input_errors
def plan_shift(
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
    source: Annotated[
        str | None, typer.Option("--from", metavar="STATION", help="Station the weight comes from.")
    ] = None,
    to: Annotated[str | None, typer.Option("--to", metavar="STATION", help="Station it goes to.")] = None,
    target: Annotated[
        str | None, typer.Option(metavar="ARM", help="CG to reach (arm, or with a unit); default: back within limits.")
    ] = None,
    condition: Annotated[
        str,
        typer.Option(metavar="CONDITION", help="Condition whose CG --target sets: ramp, takeoff, landing, zero_fuel."),
    ] = "takeoff",
    json_out: JsonOpt = False,
) -> None:
    """Weight to move from one station to another: to a target CG, or back within limits.

    Example:

    \b
      loadcheck plan shift \\
        sample_aircraft/tandem2/aft_heavy.toml \\
        --from baggage --to front
    """
    from ..planning import weight_shift
    from ..units import read_amount

    conditions: dict[str, ConditionName] = {
        "ramp": "ramp",
        "takeoff": "takeoff",
        "landing": "landing",
        "zero_fuel": "zero_fuel",
    }
    chosen = conditions.get(condition)
    if chosen is None:
        raise InputError(
            Problem("--condition", f"unknown condition {condition!r}", expected="ramp, takeoff, landing or zero_fuel")
        )
    inputs = _inputs(aircraft, loading, load, fuel, taxi, trip, trip_time, rate, order, reserve, category)
    arm = None if target is None else read_amount(target, inputs.aircraft.units.arm, "--target")
    with options_as_typed(
        {"source": ("--from", source), "target_station": ("--to", to), "target_arm": ("--target", target)}
    ):
        result = weight_shift(
            inputs.aircraft,
            inputs.loading,
            _need(source, "--from"),
            _need(to, "--to"),
            target_arm=arm,
            condition=chosen,
        )
    _answer(result, json_out)


@plan_app.command("table", short_help="Ramp fuel against payload.")
@input_errors
def plan_table(
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
    station: StationOpt = None,
    steps: Annotated[int, typer.Option(min=2, max=201, metavar="ROWS", help="Rows of payload.")] = 11,
    fill: FillOpt = None,
    chart: Annotated[Path | None, typer.Option(metavar="FILE", help="Also draw it: .png, .svg or .pdf.")] = None,
    json_out: JsonOpt = False,
) -> None:
    """Allowed ramp fuel against payload added at a station, as a table (and a chart).

    Example:

    \b
      loadcheck plan table \\
        sample_aircraft/trainer4/within.toml \\
        --station rear --chart fuel-payload.png
    """
    from ..planning import fuel_payload_table

    inputs = _inputs(
        aircraft, loading, load, fuel, taxi, trip, trip_time, rate, order, reserve, category, fuel_to_plan=True
    )
    name = _need(station, "--station")
    with options_as_typed({"station": ("--station", station), "steps": ("--steps", steps), "fill": ("--fill", fill)}):
        table = fuel_payload_table(inputs.aircraft, inputs.loading, name, steps=steps, fill=_fill(fill))
    if chart is not None:
        from ..render.chart import fuel_payload_figure, save_figure

        save_figure(fuel_payload_figure(inputs.aircraft, table), chart)
        _console(stderr=True).print(f"chart written: {chart}", markup=False)
    if json_out:
        typer.echo(table.to_json())
    else:
        from ..render.terminal import render_table

        render_table(inputs.aircraft, table.rows, name, _console())
    raise typer.Exit(EXIT_OK if table.ok else EXIT_LIMIT)
