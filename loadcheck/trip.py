"""A trip of several legs: every leg checked as a single loading, and planning for the trip.

:func:`check_trip` resolves a trip (:func:`loadcheck.loading.resolve_trip`: each leg starts
with the stations as changed at the stop and the fuel the previous leg landed with, tank
by tank, plus the fuel put in) and runs :func:`~loadcheck.check.check_loading` on every leg,
so every leg is checked exactly as a single loading is: ramp, takeoff, the whole burn path,
landing, zero fuel, every limit. The trip is within limits exactly when every leg is.

Planning (:func:`trip_most_fuel`, :func:`fuel_to_add`) asks the engine
(:func:`loadcheck.engine.evaluate`) about every leg at once for many values of one
quantity, carrying each row's landing fuel into the next leg, and finds the stretches
within limits with :func:`loadcheck.planning.feasible_intervals`; the answer carries the
full trip check at the figure shown. Each leg's taxi, trip and reserve are held at the
volumes they resolve to in the loading as given (as :func:`loadcheck.planning.most_fuel`
holds a single loading's).

References
----------
FAA-H-8083-1B (2016) chapter 8, "Effects of Offloading Passengers and Using Fuel" (a
helicopter within limits at the first takeoff, out of limits aft and laterally after the
first leg's fuel is burned and a passenger gets off).
"""

from __future__ import annotations

from collections.abc import Callable, Sequence
from dataclasses import dataclass, replace

import numpy as np

from .aircraft import Aircraft
from .caution import PILOT_CAUTION
from .check import below_reserve, check_loading
from .display import fmt
from .engine import evaluate, loading_arrays
from .errors import InputError, LoadcheckError, Problem
from .loading import BurnPlan, Loading, ResolvedLoading, ResolvedTrip, StopFuel, landing_fuel, resolve_trip
from .planning import (
    _GRID_STEP,
    _LOAD_CODES,
    Interval,
    PlanResult,
    _distribute,
    _fill_order,
    _fuel_range,
    _mean_density,
    binding_limits,
    feasible_intervals,
    fill_words,
    limit_amount_words,
    safe_value,
)
from .results import CheckResult, StationChange, Stop, TripFinding, TripLeg, TripResult, Uplift
from .words import count, within_limits_text

__all__ = [
    "TripPlan",
    "check_trip",
    "fuel_to_add",
    "leg_name",
    "leg_verdict_text",
    "stop_changes",
    "trip_legs",
    "trip_most_fuel",
    "trip_verdict_text",
]


def leg_name(number: int, label: str | None = None) -> str:
    """A leg in words: ``leg 2`` or ``leg 2 (back to base)``."""
    return f"leg {number}" + (f" ({label})" if label else "")


def _warnings(check: CheckResult) -> int:
    """How many findings of a check are warnings."""
    return sum(f.severity == "warning" for f in check.findings)


def leg_verdict_text(check: CheckResult) -> str:
    """What a leg's check finds, in the single check's words: within limits, what holds and its
    warnings (:func:`loadcheck.words.within_limits_text`); out of limits, how many limits it exceeds.
    The front end puts its own "within limits" or "out of limits" before it.

    Examples
    --------
    >>> from types import SimpleNamespace as Found
    >>> leg_verdict_text(Found(ok=True, findings=[Found(severity="warning")], limits_exceeded=[]))
    'every limit holds at every condition and along the burn path; 1 warning (see the findings).'
    >>> leg_verdict_text(Found(ok=False, findings=[Found(severity="limit")] * 2, limits_exceeded=[0, 0]))
    '2 limits exceeded.'
    """
    if check.ok:
        return within_limits_text(_warnings(check))
    return f"{count(len(check.limits_exceeded), 'limit')} exceeded."


def trip_verdict_text(result: TripResult) -> str:
    """The trip's verdict after its "within limits" or "out of limits": within limits, on every leg,
    what holds and the warnings of every leg together (:func:`loadcheck.words.within_limits_text`,
    the single check's words); out of limits, each leg out of limits with how many limits it
    exceeds. Each leg's own warnings are in its verdict (:func:`leg_verdict_text`).

    Examples
    --------
    >>> from types import SimpleNamespace as Found
    >>> warned = Found(ok=True, findings=[Found(severity="warning")] * 2, limits_exceeded=[])
    >>> clean = Found(ok=True, findings=[], limits_exceeded=[])
    >>> legs = [Found(leg=1, label=None, check=clean), Found(leg=2, label="home", check=warned)]
    >>> trip_verdict_text(Found(ok=True, legs=legs, failed_legs=[])).endswith("; 2 warnings (see the findings).")
    True
    >>> out = Found(ok=False, findings=[], limits_exceeded=[0])
    >>> legs = [Found(leg=1, label=None, check=warned), Found(leg=2, label="home", check=out)]
    >>> trip_verdict_text(Found(ok=False, legs=legs, failed_legs=legs[1:]))
    'on leg 2 (home): 1 limit exceeded.'
    """
    if result.ok:
        warnings = sum(_warnings(leg.check) for leg in result.legs)
        return f"on every leg ({len(result.legs)} legs): {within_limits_text(warnings)}"
    failed = "; ".join(
        f"{leg_name(leg.leg, leg.label)}: {count(len(leg.check.limits_exceeded), 'limit')} exceeded"
        for leg in result.failed_legs
    )
    return f"on {failed}."


def _resolved(aircraft: Aircraft, trip: Loading | ResolvedTrip, category: str | None) -> ResolvedTrip:
    return trip if isinstance(trip, ResolvedTrip) else resolve_trip(trip, aircraft, category=category)


def _resolved_for_plan(
    aircraft: Aircraft, trip: Loading | ResolvedTrip, category: str | None, leg: int
) -> ResolvedTrip:
    """The trip to plan the fuel of ``leg`` (1: the first engine start; 2 or more: the stop
    before it) for: as given, or, where the fuel given there does not let the trip be
    resolved (too little for the burns), with every tank full there; that fuel is what
    the plan replaces."""
    try:
        return _resolved(aircraft, trip, category)
    except LoadcheckError:
        if isinstance(trip, ResolvedTrip) or not 1 <= leg <= len(trip.leg) + 1:
            raise
        full = dict.fromkeys(aircraft.tank_by_id, "full")
        if leg == 1:
            return resolve_trip(trip.model_copy(update={"fuel": full}), aircraft, category=category)
        legs = list(trip.leg)
        legs[leg - 2] = legs[leg - 2].model_copy(update={"add_fuel": full})
        return resolve_trip(trip.model_copy(update={"leg": legs}), aircraft, category=category)


def check_trip(
    aircraft: Aircraft, trip: Loading | ResolvedTrip, *, category: str | None = None, samples: bool = True
) -> TripResult:
    """Check every leg of a trip against every limit of the aircraft.

    Parameters
    ----------
    aircraft : the aircraft, with its current empty-weight record
    trip : a loading with or without legs (resolved here), or a resolved trip
    category : envelope category; default the loading's, else the aircraft's first
    samples : points along each burn path for drawing it (the verdict never depends on them)

    Returns
    -------
    TripResult
        ``ok`` is true exactly when every leg's check is within limits; each leg carries
        its full :class:`~loadcheck.results.CheckResult`; each finding names its leg.

    Raises
    ------
    UnknownNameError, InputError
        When the loading cannot be used with this aircraft (field paths name the leg).
    """
    resolved = _resolved(aircraft, trip, category)
    legs: list[TripLeg] = []
    findings: list[TripFinding] = []
    labels = resolved.labels or (None,) * len(resolved.legs)
    for number, (leg, label) in enumerate(zip(resolved.legs, labels, strict=True), start=1):
        check = check_loading(aircraft, leg, samples=samples)
        stop = (
            None if number == 1 else stop_changes(aircraft, resolved.legs[number - 2], leg, resolved.stops[number - 2])
        )
        legs.append(TripLeg(leg=number, label=label, stop=stop, check=check))
        findings += [
            TripFinding(
                leg=number,
                label=label,
                code=f.code,
                severity=f.severity,
                condition=f.condition,
                message=f"{leg_name(number, label)}: {f.message}",
                excess=f.excess,
                unit=f.unit,
                limit=f.limit,
                side=f.side,
                subject=f.subject,
            )
            for f in check.findings
        ]
    first = legs[0].check
    return TripResult(
        ok=all(leg.check.ok for leg in legs),
        category=first.category,
        aircraft=first.aircraft,
        legs=legs,
        findings=findings,
        units=first.units,
        caution=PILOT_CAUTION,
    )


def stop_changes(aircraft: Aircraft, previous: ResolvedLoading, leg: ResolvedLoading, fuel: StopFuel) -> Stop:
    """What changes at the stop between two legs: the fuel put in, tank by tank, and each
    station whose load changes.

    Parameters
    ----------
    aircraft : the aircraft
    previous : the leg before the stop, as resolved
    leg : the leg after it, as resolved (its fuel at engine start is ``fuel`` applied to what
        ``previous`` landed with, :func:`loadcheck.loading.landing_fuel`)
    fuel : the fuel put in at the stop

    Returns
    -------
    Stop
        Each tank the stop puts fuel in (as given, where the loading gives it): the volume that
        goes in [fuel volume unit] (a volume added is that volume; a fill to ``full`` or a level
        is the level less what the tank held at the previous landing), its mass at the tank's
        density [mass unit] and what the tank then holds [fuel volume unit]; each station whose
        weight differs between the legs, from and to [mass unit].
    """
    landed = landing_fuel(previous)
    uplift = []
    for tank in aircraft.tank:
        if tank.id in fuel.added:
            volume = fuel.added[tank.id]
        elif tank.id in fuel.to:
            volume = leg.fuel[tank.id] - landed[tank.id]
        else:
            continue
        if tank.id not in fuel.given and volume == 0.0:
            continue  # a tank a planning answer puts nothing in
        uplift.append(
            Uplift(
                tank=tank.id,
                name=tank.name,
                volume=volume,
                weight=volume * leg.density[tank.id],
                on_board=leg.fuel[tank.id],
                given=fuel.given.get(tank.id),
            )
        )
    stations = [
        StationChange(
            station=station.id,
            name=station.name,
            from_weight=previous.stations.get(station.id, 0.0),
            to_weight=leg.stations.get(station.id, 0.0),
        )
        for station in aircraft.station
        if previous.stations.get(station.id, 0.0) != leg.stations.get(station.id, 0.0)
    ]
    return Stop(fuel=uplift, stations=stations)


def trip_legs(aircraft: Aircraft, trip: ResolvedTrip, start: int, fuel: dict[str, float]) -> ResolvedTrip:
    """The trip with leg ``start`` (0-based) beginning with ``fuel`` in its tanks, and every
    later leg carrying its fuel over again (landing fuel plus the stop's fuel)."""
    legs = list(trip.legs)
    for index in range(start, len(legs)):
        legs[index] = replace(legs[index], fuel=fuel, plan=BurnPlan(fuel, legs[index].plan.order))
        if index + 1 < len(legs):
            fuel = trip.stops[index].apply(landing_fuel(legs[index]))
    return replace(trip, legs=tuple(legs))


def _legs_ok(aircraft: Aircraft, trip: ResolvedTrip, start: int, fuel: np.ndarray) -> np.ndarray:
    """Engine verdict of legs ``start`` onwards, for N rows of fuel at that leg's engine start (N, T)."""
    ids = [t.id for t in aircraft.tank]
    ok = np.ones(len(fuel), dtype=bool)
    for index in range(start, len(trip.legs)):
        leg = trip.legs[index]
        rows = loading_arrays(aircraft, leg)
        n = len(fuel)
        found = evaluate(
            aircraft,
            np.tile(rows.stations, (n, 1)),
            fuel,
            np.full(n, rows.taxi),
            np.full(n, rows.trip),
            order=rows.order,
            category=rows.category,
            density=rows.density,
        )
        ok &= found.ok
        if leg.reserve is not None:  # lands with at least its reserve: no reserve warning in its check
            ok &= ~below_reserve(found.fuel["landing"].sum(axis=1), leg.reserve)
        if index + 1 < len(trip.legs):
            landed = {t: found.fuel["landing"][:, i] for i, t in enumerate(ids)}
            stop = trip.stops[index]
            ok &= np.asarray(stop.fills_up(landed), dtype=bool)
            after = stop.apply(landed)
            fuel = np.column_stack([np.broadcast_to(after[t], (n,)) for t in ids]) if ids else fuel
    return ok


@dataclass(frozen=True, kw_only=True, slots=True)
class TripPlan(PlanResult):
    """A planning answer for a trip: a :class:`~loadcheck.planning.PlanResult` whose check is
    the trip's (``trip``, every leg at the figure shown); its own ``check`` stays None.
    ``least`` is the least of the variable that keeps every leg within limits and lands each
    leg with at least its reserve, as shown (rounded up) [fuel volume unit], ``least_trip``
    the trip's check at that figure; ``extra["least"]`` shows it where it is above zero."""

    trip: TripResult | None = None
    least: float | None = None
    least_trip: TripResult | None = None
    reserves: bool = False  # some leg gives a reserve to land with (the least lands each leg with its own)


def _limits_past(result: TripResult) -> str | None:
    """What the trip's check just past an answer exceeds: each leg's limits with their amounts."""
    return binding_limits(result.findings, lambda f: f"{leg_name(f.leg, f.label)}: {limit_amount_words(f)}") or None


def _exceeded(result: TripResult) -> str | None:
    """The sentences of every limit the trip's check finds exceeded, leg by leg, in its order."""
    return binding_limits(result.findings, lambda f: f.message) or None


def _plan(
    aircraft: Aircraft,
    pairs: list[tuple[float, float]],
    question: str,
    variable: str,
    ceiling: float,
    at: Callable[[float], ResolvedTrip],
    step: float,
    why_not: Callable[[], str],
) -> TripPlan:
    """The most of the variable within the stretches found, with the trip's check at the figure shown."""
    unit = aircraft.units.fuel_volume
    if not pairs:
        return TripPlan(
            question=question,
            variable=variable,
            unit=unit,
            feasible=False,
            intervals=[],
            answer=None,
            answer_display="no amount keeps every leg within limits",
            governing=why_not(),
        )
    low, high = pairs[-1]
    shown, text = safe_value(low, high, unit, "down")
    check = check_trip(aircraft, at(shown), samples=False)
    intervals = [Interval(low=lo, high=hi) for lo, hi in pairs]
    if not check.ok:  # never bless a trip the check rejects
        return TripPlan(
            question=question,
            variable=variable,
            unit=unit,
            feasible=False,
            intervals=intervals,
            answer=None,
            answer_display="no amount keeps every leg within limits",
            governing=_exceeded(check),
            trip=check,
        )
    if high >= ceiling - 1e-9 * max(1.0, ceiling):
        governing: str | None = "the tanks' usable capacity"
    else:
        try:
            governing = _limits_past(check_trip(aircraft, at(min(ceiling, high + 2 * step)), samples=False))
        except LoadcheckError:
            governing = None
    extra = {}
    least, least_text = safe_value(pairs[0][0], pairs[0][1], unit, "up")
    least_trip = check_trip(aircraft, at(least), samples=False)
    if not least_trip.ok:  # never offer a figure the check rejects
        extra["least"] = "none the check finds within limits: " + (_exceeded(least_trip) or "")
    elif pairs[0][0] > 0:
        extra["least"] = least_text
    return TripPlan(
        question=question,
        variable=variable,
        unit=unit,
        feasible=True,
        intervals=intervals,
        answer=high,
        answer_display=text,
        governing=governing,
        trip=check,
        extra=extra,
        least=least if least_trip.ok else None,
        least_trip=least_trip,
        reserves=any((leg.reserve or 0.0) > 0 for leg in at(least).legs),
    )


def _with_fill(plan: TripPlan, words: str | None) -> TripPlan:
    """The answer with the way its fuel goes into the tanks among its further figures."""
    return plan if words is None else replace(plan, extra={**plan.extra, "fill order": words})


def _why_not(aircraft: Aircraft, trip: ResolvedTrip) -> str:
    try:
        found = check_trip(aircraft, trip, samples=False)
    except LoadcheckError as error:
        return "; ".join(p.describe() for p in error.problems)
    reserves = [f.message for f in found.findings if f.code == "reserve"]
    reason = _exceeded(found) or (
        "no fuel within limits lands every leg with its reserve (" + "; ".join(reserves) + ")"
        if reserves
        else "no amount is within limits"
    )
    return "with this load and these legs: " + reason


def _why_no_trip_fuel(
    aircraft: Aircraft, trip: ResolvedTrip, at: Callable[[float], ResolvedTrip], least: float, capacity: float
) -> str:
    """Why no ramp fuel of the fill order (``least`` to ``capacity`` [fuel volume unit]) keeps every leg
    within limits: from the trip's full check at the ramp fuels the answer tries, never at the first
    leg's own fuel, which the answer replaces (a fuel too little for the burn is no reason then).

    The ramp fuels are tried on a grid from ``least`` to ``capacity``; the least one whose trip can be
    checked (every leg's taxi and trip covered, every stop's fuel taken) gives the reason, and full tanks
    too where theirs differs. Where none can be checked, the refusal at full tanks is the reason."""
    unit = aircraft.units.fuel_volume
    checked: list[tuple[float, TripResult]] = []
    refusal = ""
    for total in np.linspace(least, capacity, 41):
        try:
            checked.append((float(total), check_trip(aircraft, at(float(total)), samples=False)))
        except LoadcheckError as error:
            refusal = "; ".join(p.describe() for p in error.problems)
    if not checked:
        return refusal or _why_not(aircraft, trip)

    def reason(found: TripResult) -> str:
        reserves = [f.message for f in found.findings if f.code == "reserve"]
        return _exceeded(found) or (
            "no fuel within limits lands every leg with its reserve (" + "; ".join(reserves) + ")"
            if reserves
            else "no amount is within limits"
        )

    first, found = checked[0]
    fixed = [f for f in found.findings if f.severity == "limit" and f.code in _LOAD_CODES]
    if fixed:  # a station or group over its own limit: no fuel changes it, so it is the one reason
        return "; ".join(f.message for f in fixed)
    words = f"with this load and these legs, at {fmt(first, unit, 'up')} of ramp fuel: {reason(found)}"
    last, full = checked[-1]
    if last > first and reason(full) != reason(found):
        words += f"; at {fmt(last, unit, 'down')}: {reason(full)}"
    return words


def trip_most_fuel(
    aircraft: Aircraft, trip: Loading | ResolvedTrip, *, fill: Sequence[str] | None = None, category: str | None = None
) -> TripPlan:
    """The most fuel at the first engine start that keeps every leg of the trip within limits.

    Fuel goes into the tanks in ``fill`` order (default: the reverse of the first leg's burn
    order, or every tank in proportion to its capacity when they burn together), as
    :func:`loadcheck.planning.most_fuel` fills them; every later leg starts with what the
    leg before it landed with plus the fuel put in at its stop, as given.

    Returns
    -------
    TripPlan
        ``variable`` is the first leg's ramp fuel [fuel volume unit]; ``extra["least"]``
        the least fuel that keeps every leg within limits and lands each with its reserve,
        where it is above zero (``least`` and ``least_trip``: that figure and its check).
    """
    resolved = _resolved_for_plan(aircraft, trip, category, 1)
    first = resolved.legs[0]
    order = _fill_order(aircraft, first, fill)
    base = loading_arrays(aircraft, first)
    least, capacity = _fuel_range(aircraft, base, order)
    step = _GRID_STEP / _mean_density(aircraft, first)
    ids = [t.id for t in aircraft.tank]

    def at(total: float) -> ResolvedTrip:
        row = _distribute(aircraft, base, order, np.array([total]))[0]
        return trip_legs(aircraft, resolved, 0, {t: float(row[i]) for i, t in enumerate(ids)})

    pairs = (
        feasible_intervals(
            lambda x: _legs_ok(aircraft, resolved, 0, _distribute(aircraft, base, order, x)), least, capacity, step
        )
        if ids
        else []
    )
    plan = _plan(
        aircraft,
        pairs,
        "most fuel at the first engine start that keeps every leg within limits",
        "ramp fuel of leg 1",
        capacity,
        at,
        step,
        lambda: (
            "this aircraft has no fuel tanks" if not ids else _why_no_trip_fuel(aircraft, resolved, at, least, capacity)
        ),
    )
    return _with_fill(plan, fill_words(aircraft, order, fill))


def _added(aircraft: Aircraft, on_board: dict[str, float], fill: list[str] | None, totals: np.ndarray) -> np.ndarray:
    """Fuel in each tank (N, T) after putting ``totals`` in on top of ``on_board``: in the fill
    order, each tank up to its usable capacity; or (None) in proportion to each tank's room."""
    room = np.array([t.usable - on_board[t.id] for t in aircraft.tank]).clip(0.0)
    start = np.array([on_board[t.id] for t in aircraft.tank])
    out = np.tile(start, (len(totals), 1))
    if fill is None:
        if room.sum() > 0:
            out += np.minimum(totals[:, None] / room.sum(), 1.0) * room
        return out
    ids = [t.id for t in aircraft.tank]
    remaining = totals.copy()
    for tank in fill:
        index = ids.index(tank)
        take = np.clip(remaining, 0.0, room[index])
        out[:, index] += take
        remaining = remaining - take
    return out


def _stop_legs(legs: int) -> str:
    """The legs a stop comes before, in a trip of ``legs`` legs (2 or more): ``2``, ``2 or 3``, ``2 to 5``."""
    return "2" if legs == 2 else "2 or 3" if legs == 3 else f"2 to {legs}"


def _stops_words(legs: int) -> str:
    """Where the stops of a trip of ``legs`` legs (2 or more) are, in words that read right for one stop or several.

    Examples
    --------
    >>> _stops_words(2)
    'the trip has 2 legs: its one stop comes before leg 2'
    >>> _stops_words(3)
    'the trip has 3 legs: its 2 stops come before legs 2 and 3'
    >>> _stops_words(5)
    'the trip has 5 legs: its 4 stops come before legs 2 to 5'
    """
    if legs == 2:
        return "the trip has 2 legs: its one stop comes before leg 2"
    before = "2 and 3" if legs == 3 else f"2 to {legs}"
    return f"the trip has {legs} legs: its {legs - 1} stops come before legs {before}"


def fuel_to_add(
    aircraft: Aircraft,
    trip: Loading | ResolvedTrip,
    leg: int,
    *,
    fill: Sequence[str] | None = None,
    category: str | None = None,
) -> TripPlan:
    """The fuel to put in at the stop before leg ``leg`` (2 or more) so that every leg is within limits.

    Everything else is as given: the fuel at the first engine start, the loads, every other
    stop's fuel; the fuel this stop puts in is replaced by the amount asked about, added on
    top of what the previous leg landed with, in ``fill`` order (default: the reverse of that
    leg's burn order, or in proportion to each tank's room when they burn together).

    Returns
    -------
    TripPlan
        ``answer`` the most fuel that may be put in [fuel volume unit]; ``extra["least"]``
        the least that keeps every leg within limits and lands each with its reserve
        (enough for the legs' burns), where above zero (``least`` and ``least_trip``: that
        figure and its check); ``intervals`` every stretch within limits.

    Raises
    ------
    InputError
        A leg that is not a stop of this trip.
    """
    resolved = _resolved_for_plan(aircraft, trip, category, leg)
    if len(resolved.legs) < 2:
        raise InputError(
            Problem(
                "leg",
                "the loading has one leg, so no stop: a trip gives the legs after a stop as [[leg]] tables",
                value=leg,
                expected="a loading with [[leg]] tables",
            )
        )
    if not 2 <= leg <= len(resolved.legs):
        raise InputError(
            Problem("leg", _stops_words(len(resolved.legs)), value=leg, expected=_stop_legs(len(resolved.legs)))
        )
    index = leg - 1
    before = resolved.legs[index - 1]
    on_board = landing_fuel(before)
    order = _fill_order(aircraft, resolved.legs[index], fill)
    room = sum(
        max(0.0, t.usable - on_board[t.id])
        for t in (aircraft.tank if order is None else [aircraft.tank_by_id[n] for n in order])
    )
    ids = [t.id for t in aircraft.tank]
    earlier = all(check_loading(aircraft, resolved.legs[i], samples=False).ok for i in range(index))
    step = _GRID_STEP / _mean_density(aircraft, before)

    def at(total: float) -> ResolvedTrip:
        row = _added(aircraft, on_board, order, np.array([total]))[0]
        stops = list(resolved.stops)
        stops[index - 1] = StopFuel(added={t: float(row[i] - on_board[t]) for i, t in enumerate(ids)})
        return trip_legs(
            aircraft, replace(resolved, stops=tuple(stops)), index, {t: float(row[i]) for i, t in enumerate(ids)}
        )

    pairs = (
        feasible_intervals(
            lambda x: _legs_ok(aircraft, resolved, index, _added(aircraft, on_board, order, x)), 0.0, room, step
        )
        if ids and earlier
        else []
    )
    plan = _plan(
        aircraft,
        pairs,
        f"fuel to put in at the stop before {leg_name(leg, resolved.labels[index] if resolved.labels else None)}",
        f"fuel added before leg {leg}",
        room,
        at,
        step,
        lambda: "this aircraft has no fuel tanks" if not ids else _why_not(aircraft, resolved),
    )
    return _with_fill(plan, fill_words(aircraft, order, fill))
