"""Planning answers: most fuel, most payload, least ballast, weight shift, fuel against payload.

Every answer honours every limit the check enforces (four conditions, the whole burn
path, weight, station and group limits, tank capacities, the chosen category), because
feasibility is decided by the engine (:mod:`loadcheck.engine`), the same engine that
:func:`~loadcheck.check.check_loading` runs on one loading.

Method: the quantity asked about (ramp fuel, a station's weight, ballast, weight moved)
is one number x. The set of x for which the loading is within limits is found on a grid
whose step is finer than the stated tolerance (0.05 of the aircraft's mass unit, in mass
terms), so no feasible stretch wider than the tolerance can be missed; each boundary is
then refined by bisection to 1e-6 of the range, keeping the side that is within limits.
Where the envelope's shape makes the feasible set several intervals, all are reported.
Answers are shown rounded in the safe direction (never more fuel or payload than allowed,
never less ballast or shift than needed).

The weight-shift answer to a target CG uses the published relation (FAA-H-8083-1B
chapter 2; FAA-H-8083-25, Weight and Balance chapter): weight moved / total weight =
CG change / distance moved.
"""

from __future__ import annotations

from collections.abc import Callable, Sequence
from dataclasses import dataclass, field, replace
from typing import Literal

import numpy as np

from .aircraft import Aircraft
from .caution import PILOT_CAUTION
from .check import check_loading
from .display import fmt, round_safe
from .engine import Evaluation, LoadingArrays, evaluate_arrays, loading_arrays
from .errors import InputError, Problem, UnknownNameError
from .loading import BurnPlan, ResolvedLoading
from .results import CheckResult, Finding, Result

__all__ = [
    "Interval",
    "PlanResult",
    "TableRow",
    "most_fuel",
    "longest_trip",
    "most_payload",
    "fuel_to_leave",
    "least_ballast",
    "weight_shift",
    "fuel_payload_table",
    "MASS_TOLERANCE",
    "feasible_intervals",
    "limit_words",
    "ScheduleCase",
    "loading_schedule",
]

MASS_TOLERANCE = 0.1
"""Boundaries are found to within this much of the aircraft's mass unit."""

_GRID_STEP = 0.05  # grid step in mass units: half the tolerance
_MAX_GRID = 400_001


@dataclass(frozen=True, kw_only=True, slots=True)
class Interval(Result):
    """A stretch of feasible values [unit of the answer]."""

    low: float
    high: float


@dataclass(frozen=True, kw_only=True, slots=True)
class PlanResult(Result):
    """An answer to a planning question.

    Attributes
    ----------
    question : what was asked, in words
    variable : the quantity solved for
    unit : its unit
    feasible : True when some value brings the loading within limits
    intervals : every feasible stretch of the variable [unit]
    answer : the value to use (the most fuel or payload, the least ballast or shift),
        at full precision, on the safe side of the boundary [unit]
    answer_display : the answer rounded in the safe direction, with its unit
    governing : the limit that stops the answer going further, in words
    governing_code : its finding code
    check : the check of the loading at the answer
    extra : further figures (for example the time a trip allows) [as labelled]
    """

    question: str
    variable: str
    unit: str
    feasible: bool
    intervals: list[Interval]
    answer: float | None
    answer_display: str
    governing: str | None = None
    governing_code: str | None = None
    check: CheckResult | None = None
    extra: dict[str, str] = field(default_factory=dict)
    caution: str = PILOT_CAUTION


# -- the search --------------------------------------------------------------------------------


def feasible_intervals(
    ok: Callable[[np.ndarray], np.ndarray], low: float, high: float, step: float
) -> list[tuple[float, float]]:
    """Stretches of [low, high] where ``ok`` holds.

    Parameters
    ----------
    ok : vectorised predicate on an array of values
    low, high : the range searched
    step : the grid step; stretches narrower than it may be missed

    Returns
    -------
    list of (low, high)
        Each boundary refined by bisection to 1e-6 of the range (or 1e-9 absolute), every
        returned end itself within limits.
    """
    if high < low:
        return []
    count = int(min(_MAX_GRID, max(3, np.ceil((high - low) / step) + 1))) if high > low else 1
    xs = np.linspace(low, high, count)
    good = ok(xs)
    if count == 1:
        return [(low, high)] if good[0] else []
    tolerance = max(1e-9, 1e-6 * (high - low))
    changes = np.nonzero(good[1:] != good[:-1])[0]
    # refine all boundaries together: bracket [a, b] with good(a) != good(b)
    a, b = xs[changes].copy(), xs[changes + 1].copy()
    good_a = good[changes].copy()
    for _ in range(64):
        if len(a) == 0 or np.all(b - a <= tolerance):
            break
        mid = 0.5 * (a + b)
        good_mid = ok(mid)
        same = good_mid == good_a
        a = np.where(same, mid, a)
        b = np.where(same, b, mid)
    edges = np.where(good_a, a, b)  # the side that is within limits
    intervals: list[tuple[float, float]] = []
    start = low if good[0] else None
    for edge, rising in zip(edges, ~good_a):
        if rising:
            start = float(edge)
        else:
            intervals.append((float(start if start is not None else low), float(edge)))
            start = None
    if start is not None:
        intervals.append((float(start), high))
    return intervals


def _ok(result: Evaluation) -> np.ndarray:
    return result.ok


# -- helpers -------------------------------------------------------------------------------


def _with(loading: ResolvedLoading, **changes: object) -> ResolvedLoading:
    return replace(loading, **changes)  # type: ignore[arg-type]


def _with_fuel(loading: ResolvedLoading, fuel: dict[str, float]) -> ResolvedLoading:
    return replace(loading, fuel=fuel, plan=BurnPlan(fuel, loading.plan.order))


def _station(aircraft: Aircraft, station: str) -> int:
    ids = [s.id for s in aircraft.station]
    if station not in ids:
        raise UnknownNameError(Problem("station", f"unknown station {station!r}", expected="one of " + ", ".join(ids)))
    return ids.index(station)


_LIMIT_WORDS = {
    "max_ramp_weight": "maximum ramp weight",
    "max_takeoff_weight": "maximum takeoff weight",
    "max_landing_weight": "maximum landing weight",
    "max_zero_fuel_weight": "maximum zero-fuel weight",
    "min_flight_weight": "minimum flight weight",
    "burn_path": "the CG along the fuel burn",
}


def limit_words(finding: Finding) -> str:
    """The limit a finding is about, in a few words ("aft limit at landing")."""
    where = {"zero_fuel": "zero fuel"}.get(finding.condition or "", finding.condition or "")
    if finding.code == "envelope":
        side = finding.side if finding.side in ("forward", "aft", "left", "right") else None
        what = f"{side} limit" if side else ("envelope's top" if finding.side == "above" else "envelope")
        return f"{what} at {where}" if where else what
    if finding.code in ("station_max", "group_max", "station_min", "group_min"):
        kind = "maximum" if finding.code.endswith("max") else "minimum"
        return f"{kind} of {finding.subject}"
    return _LIMIT_WORDS.get(finding.code, finding.code)


def _first_limit(check: CheckResult) -> tuple[str | None, str | None]:
    finding = next((f for f in check.findings if f.severity == "limit"), None)
    return (limit_words(finding), finding.code) if finding else (None, None)


def _why_not(aircraft: Aircraft, loading: ResolvedLoading) -> str:
    """Why a loading cannot be made feasible by the variable: the limits its own check exceeds."""
    try:
        check = check_loading(aircraft, loading)
    except ValueError:
        return "the trip cannot be flown with the fuel this loading may carry"
    words = sorted({limit_words(f) for f in check.findings if f.severity == "limit"})
    return "with this load and trip: " + ("; ".join(words) if words else "the trip needs more fuel than is allowed")


def _fill_order(aircraft: Aircraft, loading: ResolvedLoading, fill: Sequence[str] | None) -> list[str] | None:
    """Tanks in the order they are filled; None fills every tank in proportion to its capacity."""
    if fill is not None:
        unknown = [t for t in fill if t not in aircraft.tanks]
        if unknown:
            raise UnknownNameError(Problem("fill", f"unknown tank(s) {', '.join(unknown)}",
                                           expected="one of " + ", ".join(aircraft.tanks)))
        return list(fill)
    if loading.plan.order is None:
        return None
    return list(reversed(loading.plan.order))  # the tank burned last is filled first


def _distribute(aircraft: Aircraft, base: LoadingArrays, fill: list[str] | None, totals: np.ndarray) -> np.ndarray:
    """Fuel per tank (N, T) for total ramp fuel values, in the fill order."""
    usable = np.array([t.usable for t in aircraft.tank])
    ids = [t.id for t in aircraft.tank]
    out = np.tile(base.fuel, (len(totals), 1))
    if fill is None:
        out[:] = np.minimum(totals[:, None] / usable.sum(), 1.0) * usable
        return out
    remaining = totals.copy()
    for tank in fill:
        index = ids.index(tank)
        take = np.clip(remaining, 0.0, usable[index])
        out[:, index] = take
        remaining = remaining - take
    return out


def _fuel_capacity(aircraft: Aircraft, fill: list[str] | None) -> float:
    tanks = aircraft.tank if fill is None else [aircraft.tanks[t] for t in fill]
    return sum(t.usable for t in tanks)


def _fuel_loading(aircraft: Aircraft, loading: ResolvedLoading, fill: list[str] | None, total: float) -> ResolvedLoading:
    base = loading_arrays(aircraft, loading)
    row = _distribute(aircraft, base, fill, np.array([total]))[0]
    return _with_fuel(loading, {t.id: float(row[i]) for i, t in enumerate(aircraft.tank)})


def _mean_density(aircraft: Aircraft, loading: ResolvedLoading) -> float:
    values = [loading.density[t.id] for t in aircraft.tank]
    return float(np.mean(values)) if values else 1.0


def _intervals(pairs: list[tuple[float, float]]) -> list[Interval]:
    return [Interval(low=lo, high=hi) for lo, hi in pairs]


def _most(
    aircraft: Aircraft,
    pairs: list[tuple[float, float]],
    unit: str,
    at: Callable[[float], ResolvedLoading],
    beyond: Callable[[float], ResolvedLoading] | None,
    question: str,
    variable: str,
    ceiling: tuple[float, str] | None,
    why_not: str | None = None,
) -> PlanResult:
    """An answer that is the largest feasible value (fuel, payload)."""
    if not pairs:
        return PlanResult(question=question, variable=variable, unit=unit, feasible=False, intervals=[], answer=None,
                          answer_display="no amount is within limits", governing=why_not)
    best = pairs[-1][1]
    check = check_loading(aircraft, at(best))
    governing, code = None, None
    if ceiling is not None and best >= ceiling[0] - 1e-9 * max(1.0, abs(ceiling[0])):
        governing, code = ceiling[1], "capacity"
    elif beyond is not None:
        governing, code = _first_limit(check_loading(aircraft, beyond(best)))
    places = 1
    return PlanResult(
        question=question, variable=variable, unit=unit, feasible=True, intervals=_intervals(pairs), answer=best,
        answer_display=f"{round_safe(best, places, 'down'):,.{places}f} {unit}", governing=governing,
        governing_code=code, check=check,
    )


# -- the questions -------------------------------------------------------------------------------


def most_fuel(aircraft: Aircraft, loading: ResolvedLoading, *, fill: Sequence[str] | None = None) -> PlanResult:
    """The largest ramp fuel for which the whole flight is within limits.

    Fuel goes into the tanks in ``fill`` order (default: the reverse of the burn order, or
    every tank in proportion to its capacity when they burn together); taxi and trip fuel
    are the loading's.

    Returns
    -------
    PlanResult
        ``variable`` is ramp fuel [fuel volume unit]; ``extra`` gives its mass.
    """
    order = _fill_order(aircraft, loading, fill)
    base = loading_arrays(aircraft, loading)
    capacity = _fuel_capacity(aircraft, order)
    step = _GRID_STEP / _mean_density(aircraft, loading)
    pairs = feasible_intervals(
        lambda x: _ok(evaluate_arrays(aircraft, base, fuel=_distribute(aircraft, base, order, x))), 0.0, capacity, step
    )
    unit = aircraft.units.fuel_volume
    result = _most(
        aircraft, pairs, unit,
        at=lambda v: _fuel_loading(aircraft, loading, order, v),
        beyond=lambda v: _fuel_loading(aircraft, loading, order, min(capacity, v + 2 * step)),
        question="most fuel at engine start with this load",
        variable="ramp fuel", ceiling=(capacity, "the tanks' usable capacity"),
        why_not=None if pairs else _why_not(aircraft, loading),
    )
    if result.answer is not None and result.check is not None:
        mass = result.check.condition("ramp").fuel_weight
        extra = {"ramp fuel weight": fmt(mass, aircraft.units.mass, "down")}
        return replace(result, extra=extra)
    return result


def longest_trip(
    aircraft: Aircraft, loading: ResolvedLoading, *, rate: float, reserve: float = 0.0, fill: Sequence[str] | None = None
) -> PlanResult:
    """The longest trip the most fuel allows, landing with ``reserve`` left.

    Parameters
    ----------
    rate : fuel used per hour [fuel volume unit / h]
    reserve : fuel to land with [fuel volume unit]

    Returns
    -------
    PlanResult
        ``variable`` is trip fuel [fuel volume unit]; ``extra`` gives the time.
    """
    if rate <= 0:
        raise InputError(Problem("rate", "must be above zero", value=rate))
    fuel = most_fuel(aircraft, loading, fill=fill)
    unit = aircraft.units.fuel_volume
    if fuel.answer is None:
        return replace(fuel, question="longest trip", variable="trip fuel")
    fuelled = _fuel_loading(aircraft, loading, _fill_order(aircraft, loading, fill), fuel.answer)
    base = loading_arrays(aircraft, fuelled)
    top = fuelled.plan.burnable - fuelled.taxi - reserve
    step = _GRID_STEP / _mean_density(aircraft, loading)
    pairs = feasible_intervals(lambda x: _ok(evaluate_arrays(aircraft, base, trip=x)), 0.0, max(top, 0.0), step) if top >= 0 else []
    result = _most(
        aircraft, pairs, unit,
        at=lambda v: _with(fuelled, trip=v),
        beyond=lambda v: _with(fuelled, trip=min(fuelled.plan.burnable - fuelled.taxi, v + 2 * step)),
        question=f"longest trip with {fuel.answer_display} at engine start, landing with at least {reserve:g} {unit}",
        variable="trip fuel", ceiling=(top, "the fuel on board less taxi fuel and reserve"),
    )
    if result.answer is not None:
        minutes = int(np.floor(result.answer / rate * 60.0 + 1e-9))
        return replace(result, extra={"ramp fuel": fuel.answer_display, "time at the rate": f"{minutes // 60}:{minutes % 60:02d}"})
    return result


def most_payload(aircraft: Aircraft, loading: ResolvedLoading, station: str) -> PlanResult:
    """The largest weight at one station with everything else as given.

    Returns
    -------
    PlanResult
        ``variable`` is the station's weight [mass unit].
    """
    index = _station(aircraft, station)
    base = loading_arrays(aircraft, loading)
    limit = aircraft.station[index].max_weight
    top = limit if limit is not None else aircraft.limits.ramp
    columns = np.tile(base.stations, (1, 1))

    def rows(x: np.ndarray) -> np.ndarray:
        out = np.repeat(columns, len(x), axis=0)
        out[:, index] = x
        return out

    pairs = feasible_intervals(lambda x: _ok(evaluate_arrays(aircraft, base, stations=rows(x))), 0.0, top, _GRID_STEP)

    def at(value: float) -> ResolvedLoading:
        return _with(loading, stations={**loading.stations, station: value})

    return _most(
        aircraft, pairs, aircraft.units.mass, at=at, beyond=lambda v: at(v + 2 * _GRID_STEP),
        question=f"most weight at {aircraft.station[index].name}", variable=f"weight at {station}",
        ceiling=(limit, f"the station's maximum of {fmt(limit, aircraft.units.mass)}") if limit is not None else None,
    )


def fuel_to_leave(aircraft: Aircraft, loading: ResolvedLoading, station: str, payload: float,
                  *, fill: Sequence[str] | None = None) -> PlanResult:
    """The fuel to leave behind to carry ``payload`` at ``station`` [fuel volume unit]."""
    _station(aircraft, station)
    with_payload = _with(loading, stations={**loading.stations, station: payload})
    fuel = most_fuel(aircraft, with_payload, fill=fill)
    unit = aircraft.units.fuel_volume
    now = sum(loading.fuel.values())
    question = f"fuel to leave behind to carry {fmt(payload, aircraft.units.mass)} at {station}"
    if fuel.answer is None:
        return replace(fuel, question=question, variable="fuel left behind", answer_display="no fuel load is within limits")
    leave = max(0.0, now - fuel.answer)
    return replace(
        fuel, question=question, variable="fuel left behind", answer=leave,
        answer_display=f"{round_safe(leave, 1, 'up'):,.1f} {unit}",
        extra={**fuel.extra, "most ramp fuel with that payload": fuel.answer_display,
               "ramp fuel in the loading": f"{now:,.1f} {unit}"},
    )


def _least(
    aircraft: Aircraft, pairs: list[tuple[float, float]], unit: str, at: Callable[[float], ResolvedLoading],
    question: str, variable: str, reason: str,
) -> PlanResult:
    if not pairs:
        return PlanResult(question=question, variable=variable, unit=unit, feasible=False, intervals=[], answer=None,
                          answer_display=f"no amount can: {reason}")
    best = pairs[0][0]
    return PlanResult(
        question=question, variable=variable, unit=unit, feasible=True, intervals=_intervals(pairs), answer=best,
        answer_display=f"{round_safe(best, 1, 'up'):,.1f} {unit}", check=check_loading(aircraft, at(best)),
    )


def least_ballast(aircraft: Aircraft, loading: ResolvedLoading, station: str | None = None) -> PlanResult:
    """The least ballast at a station that brings every condition within limits.

    ``station`` defaults to the aircraft's ballast station (kind ``ballast``).
    """
    if station is None:
        ballast = [s.id for s in aircraft.station if s.kind == "ballast"]
        if not ballast:
            raise InputError(Problem("station", "this aircraft declares no ballast station; name one with --station"))
        station = ballast[0]
    index = _station(aircraft, station)
    base = loading_arrays(aircraft, loading)
    limit = aircraft.station[index].max_weight
    top = limit if limit is not None else aircraft.limits.ramp
    already = loading.stations.get(station, 0.0)

    def rows(x: np.ndarray) -> np.ndarray:
        out = np.repeat(base.stations[None, :], len(x), axis=0)
        out[:, index] = already + x
        return out

    pairs = feasible_intervals(lambda x: _ok(evaluate_arrays(aircraft, base, stations=rows(x))), 0.0, max(0.0, top - already),
                               _GRID_STEP)
    reason = (f"no weight up to the station's maximum ({fmt(top, aircraft.units.mass)}) at {station} "
              "brings every condition within limits")
    return _least(
        aircraft, pairs, aircraft.units.mass, lambda v: _with(loading, stations={**loading.stations, station: already + v}),
        f"least ballast at {aircraft.station[index].name}", f"ballast at {station}", reason,
    )


def weight_shift(
    aircraft: Aircraft,
    loading: ResolvedLoading,
    source: str,
    target_station: str,
    *,
    target_arm: float | None = None,
    condition: Literal["ramp", "takeoff", "landing", "zero_fuel"] = "takeoff",
) -> PlanResult:
    """Weight to move from one station to another.

    With ``target_arm``: the weight that puts the CG of ``condition`` at that arm, by the
    published relation weight moved = total weight x CG change / distance moved
    (FAA-H-8083-1B chapter 2). Without it: the least weight to move that brings every
    condition within limits.
    """
    i, j = _station(aircraft, source), _station(aircraft, target_station)
    units = aircraft.units
    available = loading.stations.get(source, 0.0)
    distance = aircraft.station[j].arm - aircraft.station[i].arm
    if distance == 0:
        raise InputError(Problem("to", "the two stations have the same arm: moving weight does not move the CG"))

    def at(value: float) -> ResolvedLoading:
        stations = {**loading.stations, source: available - value, target_station: loading.stations.get(target_station, 0.0) + value}
        return _with(loading, stations=stations)

    if target_arm is not None:
        now = check_loading(aircraft, loading).condition(condition)
        moved = now.weight * (target_arm - now.arm) / distance
        question = f"weight to move from {source} to {target_station} to put the {condition} CG at {fmt(target_arm, units.arm)}"
        if moved < -1e-9 or moved > available + 1e-9:
            why = ("moving weight that way moves the CG away from the target" if moved < 0
                   else f"it needs {fmt(moved, units.mass, 'up')} but {source} holds {fmt(available, units.mass)}")
            return PlanResult(question=question, variable="weight moved", unit=units.mass, feasible=False, intervals=[],
                              answer=None, answer_display=f"no solution: {why}")
        check = check_loading(aircraft, at(moved))
        return PlanResult(question=question, variable="weight moved", unit=units.mass, feasible=True,
                          intervals=[Interval(low=moved, high=moved)], answer=moved,
                          answer_display=f"{round_safe(moved, 1, 'nearest'):,.1f} {units.mass}", check=check,
                          extra={"resulting CG": fmt(check.condition(condition).arm, units.arm)})
    base = loading_arrays(aircraft, loading)

    def rows(x: np.ndarray) -> np.ndarray:
        out = np.repeat(base.stations[None, :], len(x), axis=0)
        out[:, i] -= x
        out[:, j] += x
        return out

    pairs = feasible_intervals(lambda x: _ok(evaluate_arrays(aircraft, base, stations=rows(x))), 0.0, available, _GRID_STEP)
    return _least(aircraft, pairs, units.mass, at, f"least weight to move from {source} to {target_station}",
                  "weight moved", f"moving up to all {fmt(available, units.mass)} from {source} is not enough")


@dataclass(frozen=True, kw_only=True, slots=True)
class TableRow(Result):
    """Allowed ramp fuel for one payload: payload [mass unit]; intervals of ramp fuel
    [fuel volume unit]; most, the largest allowed (None where none is)."""

    payload: float
    intervals: list[Interval]
    most: float | None


def fuel_payload_table(
    aircraft: Aircraft, loading: ResolvedLoading, station: str, *, steps: int = 11, top: float | None = None,
    fill: Sequence[str] | None = None,
) -> list[TableRow]:
    """Allowed ramp fuel against payload added at ``station`` (0 to ``top``, ``steps`` rows)."""
    index = _station(aircraft, station)
    limit = aircraft.station[index].max_weight
    already = loading.stations.get(station, 0.0)
    top = top if top is not None else ((limit - already) if limit is not None else aircraft.useful_load)
    rows = []
    for payload in np.linspace(0.0, max(0.0, top), max(2, steps)):
        answer = most_fuel(aircraft, _with(loading, stations={**loading.stations, station: already + float(payload)}), fill=fill)
        rows.append(TableRow(payload=float(payload), intervals=answer.intervals, most=answer.answer))
    return rows


# -- the loading schedule (AC 43.13-1B 10-18) ----------------------------------------------


@dataclass(frozen=True, kw_only=True, slots=True)
class ScheduleCase(Result):
    """One of the three loading conditions of AC 43.13-1B 10-18.

    Attributes: question; occupants per seat station (count); load per station [mass
    unit]; fuel per tank [fuel volume unit]; check of that loading; notes.
    """

    question: str
    occupants: dict[str, int]
    load: dict[str, float]
    fuel: dict[str, float]
    check: CheckResult
    notes: list[str] = field(default_factory=list)


def _seat_order(aircraft: Aircraft) -> list[str]:
    seats = [s for s in aircraft.station if s.kind == "seat"]
    pilots = [s for s in seats if s.controls] or seats[:1]
    return [s.id for s in pilots] + [s.id for s in seats if s not in pilots]


def _empty_loading(aircraft: Aircraft, category: str, fuel: dict[str, float]) -> ResolvedLoading:
    density = {t.id: aircraft.density(t) for t in aircraft.tank}
    full = {t.id: fuel.get(t.id, 0.0) for t in aircraft.tank}
    return ResolvedLoading(category, {}, full, density, 0.0, 0.0, None, BurnPlan(full, None))


def _seat_occupants(aircraft: Aircraft, loading: ResolvedLoading, occupant: float) -> tuple[ResolvedLoading, dict[str, int]]:
    """Seat occupants one at a time, pilot's seat first, while the loading stays within limits."""
    counts: dict[str, int] = {}
    for station_id in _seat_order(aircraft):
        station = aircraft.stations[station_id]
        for _ in range(station.seats or 1):
            trial = _with(loading, stations={**loading.stations, station_id: loading.stations.get(station_id, 0.0) + occupant})
            if not check_loading(aircraft, trial).ok:
                break
            loading = trial
            counts[station_id] = counts.get(station_id, 0) + 1
    return loading, counts


def _fill_baggage(aircraft: Aircraft, loading: ResolvedLoading) -> ResolvedLoading:
    for station in aircraft.station:
        if station.kind not in ("baggage", "cargo"):
            continue
        answer = most_payload(aircraft, loading, station.id)
        if answer.answer is not None:
            loading = _with(loading, stations={**loading.stations, station.id: round_safe(answer.answer, 1, "down")})
    return loading


def _schedule_case(aircraft: Aircraft, question: str, loading: ResolvedLoading, occupants: dict[str, int],
                   notes: list[str]) -> ScheduleCase:
    return ScheduleCase(question=question, occupants=occupants, load=dict(loading.stations), fuel=dict(loading.fuel),
                        check=check_loading(aircraft, loading), notes=notes)


def loading_schedule(aircraft: Aircraft, *, category: str | None = None, occupant_weight: float | None = None) -> list[ScheduleCase]:
    """AC 43.13-1B paragraph 10-18: the three loading conditions to settle when placards do not.

    1. With full fuel: how many occupants and how much baggage.
    2. With every seat filled: how much fuel and baggage.
    3. With maximum baggage: how much fuel, how many occupants and where they sit.

    Occupants are seated one at a time at the standard occupant weight, the pilot's seat
    first, while the loading stays within every limit; baggage is then the most each
    baggage station takes; fuel is the most the tanks take in proportion to capacity. No
    taxi or trip fuel is burned (the loading at engine start is what is checked, with the
    zero-fuel condition).
    """
    from .extremes import standard_occupant

    chosen = aircraft.category(category)
    occupant = standard_occupant(aircraft, occupant_weight)
    mass = aircraft.units.mass
    cases = []

    full = _empty_loading(aircraft, chosen, {t.id: t.usable for t in aircraft.tank})
    seated, counts = _seat_occupants(aircraft, full, occupant)
    cases.append(_schedule_case(aircraft, "with full fuel: occupants and baggage", _fill_baggage(aircraft, seated), counts,
                                [f"occupants at {occupant:g} {mass} each"]))

    everyone = _empty_loading(aircraft, chosen, {})
    counts = {}
    for station_id in _seat_order(aircraft):
        station = aircraft.stations[station_id]
        counts[station_id] = station.seats or 1
        everyone = _with(everyone, stations={**everyone.stations, station_id: counts[station_id] * occupant})
    fuel = most_fuel(aircraft, everyone)
    notes = [f"every seat filled at {occupant:g} {mass}"]
    if fuel.answer is None:
        notes.append("no fuel load is within limits with every seat filled")
        cases.append(_schedule_case(aircraft, "with every seat filled: fuel and baggage", everyone, counts, notes))
    else:
        fuelled = _fuel_loading(aircraft, everyone, None, round_safe(fuel.answer, 1, "down"))
        cases.append(_schedule_case(aircraft, "with every seat filled: fuel and baggage", _fill_baggage(aircraft, fuelled),
                                    counts, notes))

    bags = _empty_loading(aircraft, chosen, {})
    for station in aircraft.station:
        if station.kind in ("baggage", "cargo") and station.max_weight is not None:
            room = station.max_weight
            for group in aircraft.station_group:
                if station.id in group.stations and group.max_weight is not None:
                    used = sum(bags.stations.get(s, 0.0) for s in group.stations)
                    room = min(room, group.max_weight - used)
            bags = _with(bags, stations={**bags.stations, station.id: max(0.0, room)})
    pilot = _seat_order(aircraft)[:1]
    if pilot:
        bags = _with(bags, stations={**bags.stations, pilot[0]: occupant})
    fuel = most_fuel(aircraft, bags)
    notes = ["baggage at each station's maximum (within group limits); the pilot aboard"]
    if fuel.answer is None:
        notes.append("no fuel load is within limits with maximum baggage")
        cases.append(_schedule_case(aircraft, "with maximum baggage: fuel and occupants", bags, {pilot[0]: 1} if pilot else {}, notes))
    else:
        fuelled = _fuel_loading(aircraft, bags, None, round_safe(fuel.answer, 1, "down"))
        without_pilot = _with(fuelled, stations={k: v for k, v in fuelled.stations.items() if k not in pilot})
        seated, counts = _seat_occupants(aircraft, without_pilot, occupant)
        cases.append(_schedule_case(aircraft, "with maximum baggage: fuel and occupants", seated, counts, notes))
    return cases
