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
never less ballast or shift than needed), with more digits where the rounded figure would
leave the stretch within limits.

The reserve: a fuel figure an answer gives (a stretch, its most, its least) also lands with
at least the loading's reserve, by the check's own rule (:func:`~loadcheck.check.below_reserve`),
so the check at it gives no reserve warning; the file's reserve is used unless the caller
gives another.

One verdict: every answer carries the full check (:func:`~loadcheck.check.check_loading`)
of the loading it proposes, at the figure shown, and is feasible only where that check
finds the loading within limits.

The weight-shift answer to a target CG uses the published relation (FAA-H-8083-1B
chapter 2; FAA-H-8083-25, Weight and Balance chapter): weight moved / total weight =
CG change / distance moved.
"""

from __future__ import annotations

import math
from collections.abc import Callable, Iterable, Sequence
from dataclasses import dataclass, field, replace
from typing import Literal, TypeVar

import numpy as np

from .aircraft import Aircraft
from .caution import PILOT_CAUTION
from .check import below_reserve, check_loading
from .display import decimals, fmt, round_safe
from .engine import Evaluation, LoadingArrays, evaluate_arrays, loading_arrays
from .errors import InputError, LoadcheckError, Problem, UnknownNameError
from .loading import NO_TAXI_NOTE, NO_TRIP_NOTE, BurnPlan, ResolvedLoading, unknown_station
from .results import CheckResult, Finding, Result
from .words import LIMIT_NAMES, condition_words, stretch_text

__all__ = [
    "Interval",
    "PlanResult",
    "FuelPayloadTable",
    "TableRow",
    "most_fuel",
    "longest_trip",
    "most_payload",
    "fuel_to_leave",
    "least_ballast",
    "weight_shift",
    "shift_moves",
    "fuel_payload_table",
    "MASS_TOLERANCE",
    "feasible_intervals",
    "binding_limits",
    "limit_amount_words",
    "limit_words",
    "safe_value",
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
    answer_display : the answer rounded in the safe direction, with its unit; for a station's
        weight (payload, ballast) where the loading as given has some there, followed by what it
        has and what the answer adds or takes off ("3.1 lb (1.0 lb in the loading and 2.1 lb more)")
    given : for an answer that is a station's weight (payload, ballast), the weight the loading
        as given has at that station; None for other answers [unit]
    added : for such an answer found, the figure checked less ``given``: the weight to put in
        (below zero: to take out) to load what the answer says; None otherwise [unit]
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
    given: float | None = None
    added: float | None = None
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
    for edge, rising in zip(edges, ~good_a, strict=True):
        if rising:
            start = float(edge)
        else:
            intervals.append((float(start if start is not None else low), float(edge)))
            start = None
    if start is not None:
        intervals.append((float(start), high))
    return intervals


def _ok(result: Evaluation, reserve: float | None = None) -> np.ndarray:
    """Within limits, and, with a reserve, landing with at least it (no reserve warning of the check)."""
    if reserve is None:
        return result.ok
    return result.ok & ~below_reserve(result.fuel["landing"].sum(axis=1), reserve)


# -- helpers -------------------------------------------------------------------------------


def _with_fuel(loading: ResolvedLoading, fuel: dict[str, float]) -> ResolvedLoading:
    return replace(loading, fuel=fuel, plan=BurnPlan(fuel, loading.plan.order))


def _station(aircraft: Aircraft, station: str, field: str = "station") -> int:
    """The index of a station; an unknown one is refused, the problem named by the job's parameter ``field``."""
    ids = [s.id for s in aircraft.station]
    if station not in ids:
        raise UnknownNameError(unknown_station(field, station, aircraft))
    return ids.index(station)


def limit_words(finding: Finding) -> str:
    """The limit a finding is about, in a few words ("aft limit at landing")."""
    where = condition_words(finding.condition)
    if finding.code == "envelope":
        side = finding.side if finding.side in ("forward", "aft", "left", "right") else None
        what = f"{side} limit" if side else ("envelope's top" if finding.side == "above" else "envelope")
        return f"{what} at {where}" if where else what
    if finding.code in ("station_max", "group_max", "station_min", "group_min"):
        kind = "maximum" if finding.code.endswith("max") else "minimum"
        return f"{kind} of {finding.subject}"
    return LIMIT_NAMES.get(finding.code, finding.code)


_UPPER_SIDES = ("aft", "above", "right")  # limits a value must stay below


def limit_amount_words(finding: Finding) -> str:
    """The limit a finding is about with its amount ("maximum takeoff weight 2,450.0 lb").

    The amount is rounded to the safe side (docs/computation.md, "Rounding"): an upper limit
    (aft, above, right) down, a lower one up, so that it never shows more room than there is.
    """
    words = limit_words(finding)
    if finding.limit is None or finding.unit is None:
        return words
    direction: Literal["up", "down"] = "down" if finding.side in _UPPER_SIDES else "up"
    return f"{words} {fmt(finding.limit, finding.unit, direction)}"


F = TypeVar("F", bound=Finding)


def binding_limits(findings: Iterable[F], describe: Callable[[F], str] = limit_amount_words) -> str:
    """The limits a check's findings exceed, each once, in the check's order (its findings'),
    as ``describe`` words them (default: the limit and its amount), joined by "; "."""
    return "; ".join(dict.fromkeys(describe(f) for f in findings if f.severity == "limit"))


def _limits_past(check: CheckResult) -> tuple[str | None, str | None]:
    """What the check just past an answer exceeds: the limits with their amounts, and the first's code."""
    first = next((f for f in check.findings if f.severity == "limit"), None)
    return (binding_limits(check.findings), first.code) if first else (None, None)


def _exceeded(check: CheckResult) -> str:
    """The sentences of every limit a check finds exceeded (with the amounts), in the check's order."""
    return binding_limits(check.findings, lambda f: f.message)


_LOAD_CODES = ("station_max", "station_min", "group_max", "group_min")


def _why_not(
    aircraft: Aircraft, loading: ResolvedLoading, varies: str | None = None, state: str = "with this load and trip"
) -> tuple[str, str | None]:
    """Why no value of the variable brings a loading within limits, from the loading's own check
    (``state`` says which loading that is: the loading as given, or with the variable at one end),
    and the finding code of the first limit named (None where the check refuses the loading).

    A station or group limit that the variable does not change is the whole reason
    ("Rear seats: 255.0 kg exceeds the maximum 250.0 kg by 5.0 kg"); otherwise the limits the
    loading exceeds are named. ``varies`` is the station the variable changes, if any.
    """
    try:
        check = check_loading(aircraft, loading)
    except LoadcheckError as error:
        return "; ".join(p.message for p in error.problems), None
    fixed = [
        f
        for f in check.findings
        if f.severity == "limit" and f.code in _LOAD_CODES and (varies is None or f.subject != varies)
    ]
    if fixed:
        return "; ".join(f.message for f in fixed), fixed[0].code
    return f"{state}: " + (_exceeded(check) or "no amount is within limits"), _first_limit(check)


def _first_limit(check: CheckResult) -> str | None:
    """The code of the first limit a check finds exceeded, in the check's order; None where none is."""
    return next((f.code for f in check.findings if f.severity == "limit"), None)


def _why_no_fuel(
    aircraft: Aircraft,
    at: Callable[[float], ResolvedLoading],
    evaluate: Callable[[np.ndarray], Evaluation],
    covers: Callable[[np.ndarray], np.ndarray],
    least: float,
    capacity: float,
    step: float,
) -> tuple[str, str | None]:
    """Why no ramp fuel of the fill order (``least`` to ``capacity`` [fuel volume unit]) is within limits,
    and the first limit's finding code: from the full check of the candidate loadings (``at``), never of
    the loading's own fuel, which the answer replaces.

    Only the fuel that covers taxi and trip (``covers``) can be checked: where none does, the check's
    refusal of the fullest is the reason. A station or group limit, which no fuel changes, is then the
    one reason (at the least fuel that covers the burn); else what each ramp fuel from that least to the
    capacity exceeds, stretch by stretch (:func:`_exceeded_along`), or, where the stretches are too many,
    what the check at that least exceeds. ``step`` is the search's grid step [fuel volume unit].
    """
    unit = aircraft.units.fuel_volume
    if not covers(np.array([capacity]))[0]:
        return _why_not(aircraft, at(capacity))
    # more fuel covers more (the fill order only adds fuel): the least that covers, by bisection to the
    # last digits, so that the figure said is the threshold itself (260.0 l, not 260.1)
    low, start = least, capacity
    if covers(np.array([least]))[0]:
        start = least
    for _ in range(200):
        if start - low <= 1e-12 * max(1.0, capacity):
            break
        mid = 0.5 * (low + start)
        low, start = (low, mid) if covers(np.array([mid]))[0] else (mid, start)
    try:
        check = check_loading(aircraft, at(start))
    except LoadcheckError as error:
        return "; ".join(p.message for p in error.problems), None
    fixed = [f for f in check.findings if f.severity == "limit" and f.code in _LOAD_CODES]
    if fixed:
        return "; ".join(f.message for f in fixed), fixed[0].code
    along = _exceeded_along(
        aircraft,
        evaluate,
        at,
        capacity,
        unit,
        low=start,
        step=step,
        lead="ramp fuel",
        whole=f"any ramp fuel from {stretch_text(start, capacity, unit)}",
    )
    if along is None:
        along = f"at the least ramp fuel that covers taxi and trip, {fmt(start, unit, 'up')}: " + (
            _exceeded(check) or "no amount is within limits"
        )
    elif start > least + 1e-9 * max(1.0, capacity):
        # rounded down: every ramp fuel below the figure said is short of taxi and trip
        along += f". Less ramp fuel than {fmt(start, unit, 'down')} does not cover taxi and trip"
    return along, _first_limit(check)


def safe_value(low: float, high: float, unit: str, direction: Literal["up", "down"]) -> tuple[float, str]:
    """The figure to show for an answer at one end of a stretch within limits, and its text.

    ``down`` takes the high end rounded down (the most fuel or payload), ``up`` the low end
    rounded up (the least ballast or shift), at the unit's display precision, or with up to
    three more digits where the rounded figure would fall outside the stretch.

    Examples
    --------
    >>> safe_value(10.0, 37.46, "usgal", "down")
    (37.4, '37.4 usgal')
    >>> safe_value(46.84, 46.86, "lb", "up")
    (46.84, '46.84 lb')
    """
    places = decimals(unit)
    while True:
        value = round_safe(high, places, "down") if direction == "down" else round_safe(low, places, "up")
        if low - 1e-12 <= value <= high + 1e-12 or places >= decimals(unit) + 3:
            break
        places += 1
    if not low - 1e-12 <= value <= high + 1e-12:
        value = high if direction == "down" else low
    return value, f"{value:,.{places}f} {unit}"


def _fill_order(aircraft: Aircraft, loading: ResolvedLoading, fill: Sequence[str] | None) -> list[str] | None:
    """Tanks in the order they are filled; None fills every tank in proportion to its capacity."""
    if fill is not None:
        unknown = [t for t in fill if t not in aircraft.tank_by_id]
        if unknown:
            raise UnknownNameError(
                Problem(
                    "fill", f"unknown tank(s) {', '.join(unknown)}", expected="one of " + ", ".join(aircraft.tank_by_id)
                )
            )
        repeated = sorted({t for t in fill if list(fill).count(t) > 1})
        if repeated:  # a tank filled twice would count its fuel twice
            raise InputError(
                Problem(
                    "fill",
                    f"tank(s) named twice in the fill order: {', '.join(repeated)}",
                    expected="each tank once, e.g. " + ",".join(aircraft.tank_by_id),
                )
            )
        return list(fill)
    if loading.plan.order is None:
        return None
    return list(reversed(loading.plan.order))  # the tank burned last is filled first


def fill_words(aircraft: Aircraft, order: Sequence[str] | None, fill: Sequence[str] | None) -> str | None:
    """The order fuel goes into the tanks in a fuel answer, in words; None for one tank or none.

    An answer holds for this way of filling only (another may allow more or less fuel), so
    every fuel answer says it. ``order`` is :func:`_fill_order`'s, ``fill`` the order asked for.

    Examples
    --------
    >>> from loadcheck import load_aircraft
    >>> twin = load_aircraft("sample_aircraft/twin6/aircraft.toml")
    >>> fill_words(twin, ["mains", "aux"], None)
    'mains, then aux (the reverse of the burn order)'
    """
    if len(aircraft.tank) < 2:
        return None
    if order is None:
        return "every tank in proportion to its capacity (the tanks burn together)"
    kept = [t.id for t in aircraft.tank if t.id not in order]
    return (
        ", then ".join(order)
        + (" (as asked)" if fill is not None else " (the reverse of the burn order)")
        + (f"; {', '.join(kept)} as loaded" if kept else "")
    )


def _with_fill(result: PlanResult, words: str | None) -> PlanResult:
    """The answer with the way its fuel goes into the tanks among its further figures."""
    return result if words is None else replace(result, extra={**result.extra, "fill order": words})


def _distribute(aircraft: Aircraft, base: LoadingArrays, fill: list[str] | None, totals: np.ndarray) -> np.ndarray:
    """Fuel per tank (N, T) for total ramp fuel values [fuel volume unit]: the tanks of the fill
    order filled in turn with what the tanks left out of it do not already hold (as loaded)."""
    usable = np.array([t.usable for t in aircraft.tank])
    ids = [t.id for t in aircraft.tank]
    out = np.tile(base.fuel, (len(totals), 1))
    if fill is None:
        if usable.size:
            out[:] = np.minimum(totals[:, None] / usable.sum(), 1.0) * usable
        return out
    remaining = totals - _fuel_range(aircraft, base, fill)[0]
    for tank in fill:
        index = ids.index(tank)
        take = np.clip(remaining, 0.0, usable[index])
        out[:, index] = take
        remaining = remaining - take
    return out


def _fuel_range(aircraft: Aircraft, base: LoadingArrays, fill: list[str] | None) -> tuple[float, float]:
    """The least and most ramp fuel a fill order can give [fuel volume unit]: the fuel of the tanks
    left out of it, as loaded, and that with every tank of the order full."""
    if fill is None:
        return 0.0, sum(t.usable for t in aircraft.tank)
    kept = sum(float(base.fuel[i]) for i, t in enumerate(aircraft.tank) if t.id not in fill)
    return kept, kept + sum(aircraft.tank_by_id[t].usable for t in fill)


def _fuel_loading(
    aircraft: Aircraft, loading: ResolvedLoading, fill: list[str] | None, total: float, burn_to: float | None = None
) -> ResolvedLoading:
    """The loading with ``total`` ramp fuel in the fill order (and, with ``burn_to``, a burn
    from engine start down to that much fuel left [fuel volume unit])."""
    base = loading_arrays(aircraft, loading)
    row = _distribute(aircraft, base, fill, np.array([total]))[0]
    fuelled = _with_fuel(loading, {t.id: float(row[i]) for i, t in enumerate(aircraft.tank)})
    if burn_to is not None:  # the taxi and trip are the answer's: given, as check reads them given
        fuelled = _trip_found(fuelled.but(taxi=0.0), max(0.0, fuelled.plan.burnable - burn_to), taxi=True)
    return fuelled


def _trip_found(loading: ResolvedLoading, trip: float, *, taxi: bool = False) -> ResolvedLoading:
    """The loading with a trip fuel an answer found [fuel volume unit] (and, with ``taxi``, its taxi
    fuel too), as ``check`` reads it with that trip given: without the loading's note that none was
    given (one engine, one verdict)."""
    dropped = (NO_TRIP_NOTE, NO_TAXI_NOTE) if taxi else (NO_TRIP_NOTE,)
    notes = [note for note in loading.notes if note not in dropped]
    return replace(loading.but(trip=trip), notes=notes)


def _mean_density(aircraft: Aircraft, loading: ResolvedLoading) -> float:
    values = [loading.density[t.id] for t in aircraft.tank]
    return float(np.mean(values)) if values else 1.0


def _intervals(pairs: list[tuple[float, float]]) -> list[Interval]:
    return [Interval(low=lo, high=hi) for lo, hi in pairs]


def _answer(
    aircraft: Aircraft,
    pairs: list[tuple[float, float]],
    unit: str,
    at: Callable[[float], ResolvedLoading],
    question: str,
    variable: str,
    direction: Literal["up", "down"],
    why_not: Callable[[], str | tuple[str, str | None]],
    governing: Callable[[float, CheckResult], tuple[str | None, str | None]] = lambda _v, _c: (None, None),
    floor: float | None = None,
) -> PlanResult:
    """An answer at the best end of the stretches within limits, carrying the full check of
    the loading at the figure shown; infeasible unless that check finds it within limits.
    ``why_not`` gives the reason where no value is within limits, alone or with its finding code.
    ``floor``, for a least answer: the value the loading as given has (the search starts there);
    where it is within limits, it is the answer itself, not rounded up past what the loading has."""
    if not pairs:
        reason = why_not()
        text, code = reason if isinstance(reason, tuple) else (reason, None)
        return PlanResult(
            question=question,
            variable=variable,
            unit=unit,
            feasible=False,
            intervals=[],
            answer=None,
            answer_display="no amount is within limits",
            governing=text,
            governing_code=code,
        )
    low, high = pairs[-1] if direction == "down" else pairs[0]
    if direction == "up" and floor is not None and low <= floor:
        shown, text = floor, fmt(floor, unit)
    else:
        shown, text = safe_value(low, high, unit, direction)
    check = check_loading(aircraft, at(shown))
    if not check.ok:  # never bless a loading the check rejects
        return PlanResult(
            question=question,
            variable=variable,
            unit=unit,
            feasible=False,
            intervals=_intervals(pairs),
            answer=None,
            answer_display="no amount is within limits",
            governing=_exceeded(check),
            governing_code=_first_limit(check),
            check=check,
        )
    limit, code = governing(high if direction == "down" else low, check)
    return PlanResult(
        question=question,
        variable=variable,
        unit=unit,
        feasible=True,
        intervals=_intervals(pairs),
        answer=high if direction == "down" else low,
        answer_display=text,
        governing=limit,
        governing_code=code,
        check=check,
    )


def _places(text: str) -> int:
    """The decimal places of the figure that starts a text ("3.05 lb": 2)."""
    figure = text.split()[0]
    return len(figure.partition(".")[2])


def _at_station(result: PlanResult, station: str, given: float, direction: Literal["up", "down"]) -> PlanResult:
    """A station's-weight answer (payload, ballast: the station's whole weight) with what the loading
    as given has there (``given``) and what the answer puts in or takes out (``added``), said beside the
    figure where the loading has some there ("3.1 lb (1.0 lb in the loading and 2.1 lb more)").

    The figure is the station's weight in the check the answer carries, so what the pilot is told to
    load is what was checked; the weight to put in is rounded as the answer is (``direction``: up for a
    least, down for a most), a weight to take out the other way, at the answer's places.
    """
    if not result.feasible or result.check is None:
        return replace(result, given=given)
    total = next((item.weight for item in result.check.items if item.id == station), 0.0)
    added = total - given
    if given <= 0.0:
        return replace(result, given=given, added=added)
    unit, places = result.unit, _places(result.answer_display)
    have = fmt(given, unit, places=places)
    if abs(added) <= 1e-9 * max(1.0, given):
        words = "all of it in the loading: none to add"
    elif added > 0:
        words = f"{have} in the loading and {fmt(added, unit, direction, places=places, nonzero=True)} more"
    else:
        out: Literal["up", "down"] = "up" if direction == "down" else "down"
        words = f"{have} in the loading: {fmt(-added, unit, out, places=places, nonzero=True)} less"
    return replace(result, given=given, added=added, answer_display=f"{result.answer_display} ({words})")


def _beyond(
    ceiling: tuple[float, str] | None, past: Callable[[float], ResolvedLoading] | None, aircraft: Aircraft
) -> Callable[[float, CheckResult], tuple[str | None, str | None]]:
    """What stops the answer going further: a ceiling reached, else the first limit just past it."""

    def find(best: float, _check: CheckResult) -> tuple[str | None, str | None]:
        if ceiling is not None and best >= ceiling[0] - 1e-9 * max(1.0, abs(ceiling[0])):
            return ceiling[1], "capacity"
        if past is None:
            return None, None
        try:
            return _limits_past(check_loading(aircraft, past(best)))
        except LoadcheckError:
            return None, None

    return find


# -- the questions -------------------------------------------------------------------------------


def most_fuel(
    aircraft: Aircraft, loading: ResolvedLoading, *, fill: Sequence[str] | None = None, burn_to: float | None = None
) -> PlanResult:
    """The largest ramp fuel for which the whole flight is within limits and, where the loading
    gives a reserve, lands with at least it (no reserve warning in the check at any figure given).

    Fuel goes into the tanks in ``fill`` order (default: the reverse of the burn order, or
    every tank in proportion to its capacity when they burn together); taxi and trip fuel
    are the loading's, or, with ``burn_to``, the flight burns from engine start down to
    that much fuel left [fuel volume unit] (a placard's whole fuel range).

    Returns
    -------
    PlanResult
        ``variable`` is ramp fuel [fuel volume unit]; ``extra`` gives its mass.
    """
    order = _fill_order(aircraft, loading, fill)
    base = loading_arrays(aircraft, loading)
    least, capacity = _fuel_range(aircraft, base, order)
    step = _GRID_STEP / _mean_density(aircraft, loading)

    def evaluate(x: np.ndarray) -> Evaluation:
        fuel = _distribute(aircraft, base, order, x)
        if burn_to is None:
            return evaluate_arrays(aircraft, base, fuel=fuel)
        trip = np.maximum(0.0, x - burn_to)
        return evaluate_arrays(aircraft, base, fuel=fuel, taxi=np.zeros(len(x)), trip=trip)

    def ok(x: np.ndarray, reserve: float | None = loading.reserve) -> np.ndarray:
        return _ok(evaluate(x), reserve)

    def covers(x: np.ndarray) -> np.ndarray:
        """Ramp fuel whose tanks of the burn order hold its taxi and trip (a burn down to a fuel left always)."""
        if burn_to is not None:
            return np.ones(len(x), dtype=bool)
        uses = np.array([base.order is None or t.id in base.order for t in aircraft.tank], dtype=float)
        burn = loading.taxi + loading.trip
        return _distribute(aircraft, base, order, x) @ uses >= burn - 1e-9 * max(1.0, burn)

    pairs = feasible_intervals(ok, least, capacity, step) if aircraft.tank else []
    unit = aircraft.units.fuel_volume

    def at(value: float) -> ResolvedLoading:
        return _fuel_loading(aircraft, loading, order, value, burn_to)

    def why_not() -> tuple[str, str | None]:
        if not aircraft.tank:
            return "this aircraft has no fuel tanks", None
        if loading.reserve is not None and feasible_intervals(lambda x: ok(x, None), least, capacity, step):
            return (
                f"no ramp fuel within limits lands with the loading's reserve of {fmt(loading.reserve, unit)} "
                f"after taxi and trip of {fmt(loading.taxi + loading.trip, unit)}"
            ), "reserve"
        return _why_no_fuel(aircraft, at, evaluate, covers, least, capacity, step)

    result = _answer(
        aircraft,
        pairs,
        unit,
        at=at,
        question="most fuel at engine start with this load",
        variable="ramp fuel",
        direction="down",
        why_not=why_not,
        governing=_beyond(
            (capacity, "the tanks' usable capacity"),
            lambda v: _fuel_loading(aircraft, loading, order, min(capacity, v + 2 * step), burn_to),
            aircraft,
        ),
    )
    extra: dict[str, str] = {}
    if result.feasible and result.check is not None:
        extra["ramp fuel weight"] = fmt(result.check.condition("ramp").fuel_weight, aircraft.units.mass, "down")
    kept = [t.id for t in aircraft.tank if order is not None and t.id not in order]
    if kept and least > 0:  # the stretches start at the kept tanks' fuel, not at a least fuel the limits set
        extra["fuel kept as loaded"] = (
            f"{fmt(least, unit)} in {', '.join(kept)}, so no ramp fuel of this fill order is less"
        )
    return _with_fill(replace(result, extra={**result.extra, **extra}), fill_words(aircraft, order, fill))


def longest_trip(
    aircraft: Aircraft,
    loading: ResolvedLoading,
    *,
    rate: float,
    reserve: float | None = None,
    fill: Sequence[str] | None = None,
) -> PlanResult:
    """The longest trip the most fuel allows, landing with a reserve left.

    Parameters
    ----------
    rate : fuel used per hour [fuel volume unit / h]
    reserve : fuel to land with [fuel volume unit]; None: the loading's reserve, or none
        (0) where the loading gives none. A reserve given here replaces the loading's.

    Returns
    -------
    PlanResult
        ``variable`` is trip fuel [fuel volume unit]; ``extra`` gives the time, the fuel the
        answer lands with (``lands with``) and the reserve (``reserve``) and where it came from.
        ``check`` is the check of the loading with the trip found, as ``check`` gives it with that
        trip fuel: no note that no trip was given.
    """
    if not rate > 0:
        raise InputError(Problem("rate", "must be above zero", value=rate))
    if reserve is None:
        source = "the loading's reserve" if loading.reserve is not None else "no reserve given"
        reserve = loading.reserve if loading.reserve is not None else 0.0
    else:
        source = "the reserve asked for"
    if not reserve >= 0:
        raise InputError(Problem("reserve", "must not be negative", value=reserve))
    loading = loading.but(reserve=reserve)
    unit = aircraft.units.fuel_volume
    landing_words = f"landing with at least {fmt(reserve, unit)} ({source})"
    order = _fill_order(aircraft, loading, fill)
    fuel = most_fuel(aircraft, loading, fill=fill)  # with the loading's own trip: one candidate among many
    ramp = _longest_trip_fuel(aircraft, loading, order, reserve, fuel)
    if ramp is None:
        if fuel.answer is None or fuel.check is None:
            # no ramp fuel with any trip: the reason is the shortest trip's (none at all), not the loading's
            # own trip, which plays no part in this answer
            shortest = most_fuel(aircraft, _trip_found(loading, 0.0), fill=fill)
            why = shortest.governing if shortest.answer is None else fuel.governing
            return replace(
                fuel,
                question=f"longest trip, {landing_words}",
                variable="trip fuel",
                governing=f"even with no trip fuel: {why}" if shortest.answer is None and why else why,
                governing_code=shortest.governing_code if shortest.answer is None else fuel.governing_code,
            )
        ramp = safe_value(fuel.intervals[-1].low, fuel.answer, unit, "down")[0]
    if fuel.answer is None or not math.isclose(ramp, safe_value(fuel.intervals[-1].low, fuel.answer, unit, "down")[0]):
        fuel = replace(fuel, answer=ramp, answer_display=safe_value(ramp, ramp, unit, "down")[1])
    fuelled = _fuel_loading(aircraft, loading, order, ramp)
    base = loading_arrays(aircraft, fuelled)
    top = fuelled.plan.burnable - fuelled.taxi - reserve
    step = _GRID_STEP / _mean_density(aircraft, loading)
    pairs = (
        feasible_intervals(lambda x: _ok(evaluate_arrays(aircraft, base, trip=x)), 0.0, top, step) if top >= 0 else []
    )
    result = _answer(
        aircraft,
        pairs,
        unit,
        at=lambda v: _trip_found(fuelled, v),
        question=f"longest trip with {fuel.answer_display} at engine start, {landing_words}",
        variable="trip fuel",
        direction="down",
        why_not=lambda: (
            f"the fuel on board less taxi fuel does not cover the reserve of {fmt(reserve, unit)}"
            if top < 0
            else _why_not(aircraft, fuelled)
        ),
        governing=_beyond(
            (top, "the fuel on board less taxi fuel and reserve"),
            lambda v: _trip_found(fuelled, min(fuelled.plan.burnable - fuelled.taxi, v + 2 * step)),
            aircraft,
        ),
    )
    words = fill_words(aircraft, _fill_order(aircraft, loading, fill), fill)
    if result.feasible and result.answer is not None:
        shown = safe_value(result.intervals[-1].low, result.answer, unit, "down")[0]
        minutes = int(np.floor(shown / rate * 60.0 + 1e-9))
        extra = {"ramp fuel": fuel.answer_display, "time at the rate": f"{minutes // 60}:{minutes % 60:02d}"}
        if result.check is not None:  # the fuel the answer lands with, which the reserve is not
            extra["lands with"] = fmt(result.check.condition("landing").fuel, unit, "down")
        result = replace(result, extra={**extra, "reserve": f"{fmt(reserve, unit)} ({source})"})
        return _with_fill(result, words)
    return _with_fill(replace(result, extra={"reserve": f"{fmt(reserve, unit)} ({source})"}), words)


_TRIP_GRID = 201
"""Ramp fuel values and trip fuel values tried, each, by :func:`_longest_trip_fuel` (a grid of
201 x 201 loadings, evaluated together by the batch engine)."""


def _longest_trip_fuel(
    aircraft: Aircraft, loading: ResolvedLoading, order: list[str] | None, reserve: float, fuel: PlanResult
) -> float | None:
    """The ramp fuel [fuel volume unit] that allows the longest trip, landing with ``reserve``; None
    where no ramp fuel allows any trip.

    The trip the loading gives is not the question's: it is the unknown. Every ramp fuel of the fill
    order (a grid over its range, and the most fuel at the loading's own trip, ``fuel``) is tried with
    every trip it can fly (a grid from none to its fuel less taxi and reserve), all checked by the
    engine; the ramp fuel whose longest trip within limits is the longest is taken, and the grid is
    then drawn again, finer, around it (on a tie, the most-fuel answer at the loading's trip, else the
    most fuel). The trip itself is then found to the planner's precision at that fuel
    (:func:`longest_trip`).
    """
    base = loading_arrays(aircraft, loading)
    least, capacity = _fuel_range(aircraft, base, order)
    if not aircraft.tank or capacity <= least:
        return None
    given = None
    if fuel.answer is not None and fuel.intervals:
        given = safe_value(fuel.intervals[-1].low, fuel.answer, aircraft.units.fuel_volume, "down")[0]
    uses = np.array([base.order is None or t.id in base.order for t in aircraft.tank], dtype=float)
    fractions = np.linspace(0.0, 1.0, _TRIP_GRID)

    def longest(candidates: np.ndarray) -> np.ndarray:
        """The longest trip within limits of each ramp fuel (-1 where none is)."""
        per_fuel = _distribute(aircraft, base, order, candidates)
        room = per_fuel @ uses - base.taxi - reserve  # the most trip fuel each ramp fuel holds
        trips = np.clip(room, 0.0, None)[:, None] * fractions[None, :]
        n, m = trips.shape
        found = evaluate_arrays(aircraft, base, fuel=np.repeat(per_fuel, m, axis=0), trip=trips.reshape(-1))
        ok = _ok(found, reserve).reshape(n, m) & (room >= 0)[:, None]
        return np.where(ok, trips, -1.0).max(axis=1)

    low, high = least, capacity
    best_fuel, best_trip, step = None, -1.0, capacity - least
    for _ in range(2):  # a grid over the range, then a finer one around the best of it
        candidates = np.linspace(low, high, _TRIP_GRID)
        trips = longest(candidates)
        step = (high - low) / (_TRIP_GRID - 1)
        if trips.max() > best_trip + 1e-12:
            k = int(np.nonzero(trips >= trips.max() - 1e-9 * max(1.0, trips.max()))[0].max())
            best_fuel, best_trip = float(candidates[k]), float(trips[k])
        if best_fuel is None:
            return None
        low, high = max(least, best_fuel - step), min(capacity, best_fuel + step)
    if best_fuel is None:
        return None
    # the figure said is the one flown: the best fuel rounded down to the display precision, where that
    # still allows a trip within limits (else the best fuel itself)
    shown = safe_value(least, best_fuel, aircraft.units.fuel_volume, "down")[0]
    reach = float(longest(np.array([shown]))[0])
    if reach < 0:
        shown, reach = best_fuel, best_trip
    if given is not None and float(longest(np.array([given]))[0]) >= reach - 1e-9 * max(1.0, reach):
        return given  # the most fuel at the loading's own trip flies as far: the answer plan fuel gives
    return shown


def _station_rows(base: LoadingArrays, index: int, offset: float = 0.0) -> Callable[[np.ndarray], np.ndarray]:
    def rows(x: np.ndarray) -> np.ndarray:
        out = np.repeat(base.stations[None, :], len(x), axis=0)
        out[:, index] = offset + x
        return out

    return rows


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
    rows = _station_rows(base, index)
    pairs = feasible_intervals(lambda x: _ok(evaluate_arrays(aircraft, base, stations=rows(x))), 0.0, top, _GRID_STEP)

    def at(value: float) -> ResolvedLoading:
        return loading.but(stations={**loading.stations, station: value})

    answer = _answer(
        aircraft,
        pairs,
        aircraft.units.mass,
        at,
        question=f"most weight at {aircraft.station[index].name}",
        variable=f"weight at {station}",
        direction="down",
        why_not=lambda: _why_not(
            aircraft, at(0.0), station, f"with nothing at {aircraft.station[index].name} and the rest as given"
        ),
        governing=_beyond(
            (limit, f"the station's maximum of {fmt(limit, aircraft.units.mass)}") if limit is not None else None,
            lambda v: at(v + 2 * _GRID_STEP),
            aircraft,
        ),
    )
    return _at_station(answer, station, loading.stations.get(station, 0.0), "down")


def fuel_to_leave(
    aircraft: Aircraft, loading: ResolvedLoading, station: str, payload: float, *, fill: Sequence[str] | None = None
) -> PlanResult:
    """The least fuel to leave behind so that ``payload`` at ``station`` can be carried.

    The fuel taken is the loading's ramp fuel less the fuel left behind, put into the
    tanks in the fill order (as :func:`most_fuel` does); taxi and trip are the loading's.

    Returns
    -------
    PlanResult
        ``variable`` is the fuel left behind [fuel volume unit]; ``intervals`` are the
        stretches of fuel that may be left behind (0 up to all the ramp fuel); ``check``
        is the full check of the loading with the payload and the fuel that is taken.
    """
    _station(aircraft, station)
    if not payload >= 0:
        raise InputError(Problem("payload", "must not be negative", value=payload))
    order = _fill_order(aircraft, loading, fill)
    with_payload = loading.but(stations={**loading.stations, station: payload})
    fuel = most_fuel(aircraft, with_payload, fill=fill)
    unit = aircraft.units.fuel_volume
    now = sum(loading.fuel.values())
    question = f"fuel to leave behind to carry {fmt(payload, aircraft.units.mass)} at {station}"
    given = loading.stations.get(station, 0.0)
    if given > 0:  # the payload is the station's whole weight, in place of the loading's
        question += f" in all (in place of the {fmt(given, aircraft.units.mass)} in the loading there)"
    # fuel left behind = ramp fuel in the loading less the ramp fuel taken, within [0, now]
    pairs = sorted((max(0.0, now - i.high), now - i.low) for i in fuel.intervals if i.low <= now)
    result = _answer(
        aircraft,
        pairs,
        unit,
        at=lambda leave: _fuel_loading(aircraft, with_payload, order, now - leave),
        question=question,
        variable="fuel left behind",
        direction="up",
        why_not=lambda: (
            f"with that payload no ramp fuel that covers taxi and trip ({fmt(loading.taxi + loading.trip, unit)}) "
            f"is within limits: {fuel.governing}"
            if not fuel.intervals
            else f"the fuel taken would have to be more than the {fmt(now, unit)} in the loading: "
            "with that payload the ramp fuel within limits is "
            + ", ".join(stretch_text(i.low, i.high, unit) for i in fuel.intervals)
        ),
    )
    extra = {"ramp fuel in the loading": fmt(now, unit)}
    if result.feasible and result.check is not None:
        taken = result.check.condition("ramp").fuel
        extra["fuel taken"] = fmt(taken, unit)
    return _with_fill(replace(result, extra=extra), fill_words(aircraft, order, fill))


def least_ballast(aircraft: Aircraft, loading: ResolvedLoading, station: str | None = None) -> PlanResult:
    """The least ballast at a station that brings every condition within limits.

    ``station`` defaults to the aircraft's ballast station (kind ``ballast``). The answer is the
    station's whole weight, never less than the loading as given has there (the ballast already in
    it stays): ``given`` is that weight and ``added`` what to put in on top of it, both said beside
    the figure where the loading has some (``answer_display``: "3.1 lb (1.0 lb in the loading and
    2.1 lb more)"); where the loading's own ballast is enough, the answer is that, with none to add.

    Returns
    -------
    PlanResult
        ``variable`` is the ballast at the station, in all [mass unit]; ``check`` is the check of
        the loading with that weight there.
    """
    if station is None:
        ballast = [s.id for s in aircraft.station if s.kind == "ballast"]
        if not ballast:
            raise InputError(Problem("station", "this aircraft declares no ballast station; name the station to use"))
        station = ballast[0]
    index = _station(aircraft, station)
    base = loading_arrays(aircraft, loading)
    limit = aircraft.station[index].max_weight
    top = limit if limit is not None else aircraft.limits.ramp
    already = loading.stations.get(station, 0.0)
    rows = _station_rows(base, index)
    pairs = feasible_intervals(
        lambda x: _ok(evaluate_arrays(aircraft, base, stations=rows(x))), already, max(already, top), _GRID_STEP
    )
    start = f"from the {fmt(already, aircraft.units.mass)} in the loading " if already > 0 else ""
    reason = (
        f"no weight {start}up to the station's maximum ({fmt(top, aircraft.units.mass)}) at {station} "
        "brings every condition within limits"
    )

    def at(value: float) -> ResolvedLoading:
        return loading.but(stations={**loading.stations, station: value})

    answer = _answer(
        aircraft,
        pairs,
        aircraft.units.mass,
        at,
        f"least ballast at {aircraft.station[index].name}",
        "total ballast" if station == "ballast" else f"total ballast at {station}",  # never "ballast at ballast"
        "up",
        lambda: reason,
        governing=_beyond(  # what a little less ballast exceeds (none where none is needed)
            None, lambda v: at(max(already, v - 2 * _GRID_STEP)), aircraft
        ),
        floor=already,
    )
    if not answer.feasible:
        governing, code = _why_not(aircraft, loading, station)
        answer = replace(answer, answer_display=f"no amount can: {reason}", governing=governing, governing_code=code)
    if already > 0 and pairs and pairs[0][0] <= already:  # the stretch starts at the loading's ballast
        kept = f"{fmt(already, aircraft.units.mass)} in the loading, so no answer is less (less may also do)"
        answer = replace(answer, extra={**answer.extra, "ballast kept as loaded": kept})
    return _at_station(answer, station, already, "up")


def _limit_states(result: Evaluation) -> np.ndarray:
    """Every verdict of every rule the engine gives, one column each, (N, K): two loadings with the same
    row exceed the same limits."""
    columns: list[np.ndarray] = [result.valid, result.burn_path_ok]
    for name in sorted(result.condition_ok):
        columns += [result.condition_ok[name], result.min_weight_ok[name], *result.envelope_inside[name]]
        columns += list(result.weight_ok[name])
    columns += [result.limit_ok[name] for name in sorted(result.limit_ok)]
    states = np.column_stack(columns)
    return np.concatenate([states, result.load_exceeded.reshape(len(states), -1)], axis=1)


_MAX_RUNS = 8  # stretches of one set of limits exceeded named in a shift that no amount brings within limits
_MAX_STATES = 4 * _MAX_RUNS  # stretches of one set of verdicts looked at (a full check each) to find them


def _limits_met(aircraft: Aircraft, at: Callable[[float], ResolvedLoading], x: float) -> tuple[object, ...]:
    """Which limits the full check of the loading at ``x`` finds exceeded (each finding's code,
    condition, side and subject: not its amounts), or its refusal's words."""
    try:
        findings = check_loading(aircraft, at(x)).findings
    except LoadcheckError as error:
        return ("; ".join(p.message for p in error.problems),)
    return tuple((f.code, f.condition, f.side, f.subject) for f in findings if f.severity == "limit")


def _split_by_limits(
    aircraft: Aircraft, at: Callable[[float], ResolvedLoading], xs: np.ndarray, stretches: list[tuple[int, int]]
) -> list[tuple[int, int]] | None:
    """The stretches of one set of engine verdicts (places in ``xs``), each split again where the full
    check finds other limits exceeded at its two ends (one verdict per envelope cannot tell its aft edge
    from its top): by bisection, to the grid point. None where that makes too many stretches."""
    out: list[tuple[int, int]] = []
    pending = list(reversed(stretches))
    while pending:
        first, last = pending.pop()
        start = _limits_met(aircraft, at, float(xs[first]))
        if first == last or _limits_met(aircraft, at, float(xs[last])) == start:
            out.append((first, last))
        else:
            low, high = first, last  # start's limits at low; other limits at high
            while high - low > 1:
                mid = (low + high) // 2
                low, high = (mid, high) if _limits_met(aircraft, at, float(xs[mid])) == start else (low, mid)
            out.append((first, low))
            pending.append((high, last))
        if len(out) > _MAX_STATES:
            return None
    return out


def _exceeded_along(
    aircraft: Aircraft,
    ok_rows: Callable[[np.ndarray], Evaluation],
    at: Callable[[float], ResolvedLoading],
    top: float,
    unit: str,
    *,
    low: float = 0.0,
    step: float = _GRID_STEP,
    lead: str = "moving",
    whole: str | None = None,
) -> str | None:
    """What each amount from ``low`` to ``top`` exceeds, stretch by stretch, in the check's words
    ("moving 0.0 to 187.2 lb: left limit at takeoff -2.75 in. Moving 187.3 to 245.0 lb: maximum of
    right 250.0 lb", each stretch's ends rounded inward): where no amount is within limits, what limits
    the move (or, with ``lead`` "ramp fuel", the fuel). ``whole`` leads the words where one set of
    limits holds all the way (default: "moving any amount up to all" ``top``). ``step`` is the search's
    grid step in the variable's unit (default: the mass grid step).

    The engine gives every limit's verdict on the search's grid; each stretch of one set of verdicts
    is named by the full check (:func:`~loadcheck.check.check_loading`) of the loading at its middle.
    Where that makes more than a few stretches, each limit is named once whatever the condition
    ("left limit; maximum of bag_right"), joining the stretches it makes alike. None where the
    stretches are still too many (the loading's own check and the one with all of it moved then say
    what is exceeded).
    """
    count = int(min(_MAX_GRID, max(3, np.ceil((top - low) / step) + 1)))
    xs = np.linspace(low, top, count)
    states = _limit_states(ok_rows(xs))
    changes = np.nonzero(np.any(states[1:] != states[:-1], axis=1))[0]
    if len(changes) + 1 > _MAX_STATES:
        return None
    starts = np.concatenate([[0], changes + 1])
    ends = np.concatenate([changes, [count - 1]])
    pieces = _split_by_limits(aircraft, at, xs, list(zip(starts.tolist(), ends.tolist(), strict=True)))
    if pieces is None:
        return None
    fine: list[tuple[float, float, str]] = []  # each limit with its amount and condition
    coarse: list[tuple[float, float, str]] = []  # each limit once, whatever the condition
    for first, last in pieces:
        try:
            findings = check_loading(aircraft, at(float(xs[(first + last) // 2]))).findings
            words = (
                binding_limits(findings),
                binding_limits(findings, lambda f: limit_words(replace(f, condition=None))),
            )
        except LoadcheckError as error:
            words = ("; ".join(p.message for p in error.problems),) * 2
        for runs, said in zip((fine, coarse), words, strict=True):
            if runs and runs[-1][2] == said:
                runs[-1] = (runs[-1][0], float(xs[last]), said)
            else:
                runs.append((float(xs[first]), float(xs[last]), said))
    runs = fine if len(fine) <= _MAX_RUNS else coarse
    if len(runs) > _MAX_RUNS:
        return None
    if len(runs) == 1:
        return f"{whole or f'moving any amount up to all {fmt(top, unit)}'}: {runs[0][2]}"
    return ". ".join(
        f"{lead[0].upper() + lead[1:] if n else lead} {stretch_text(start, end, unit)}: {words}"
        for n, (start, end, words) in enumerate(runs)
    )


def shift_moves(aircraft: Aircraft, source: str, target_station: str) -> str | None:
    """Which CG a move between two stations moves, in words, where it is not both (or, without
    lateral data, not the CG): None where the stations differ in arm (and in lateral arm, where the
    aircraft gives lateral arms).

    Moving weight w over a distance d moves the CG by w x d / total weight (FAA-H-8083-1B chapter 2,
    weight shift), along each axis on its own: stations at the same arm but different lateral arms
    move the lateral CG only.

    Examples
    --------
    >>> from loadcheck import load_aircraft
    >>> heli = load_aircraft("sample_aircraft/heli2/aircraft.toml")
    >>> shift_moves(heli, "left", "right")
    'the lateral CG only: both stations are at arm 74.00 in'
    """
    units = aircraft.units
    a, b = aircraft.station_by_id[source], aircraft.station_by_id[target_station]
    lateral = (a.lateral_arm or 0.0) != (b.lateral_arm or 0.0)
    if a.arm != b.arm:
        if aircraft.has_lateral and not lateral:
            return f"the CG fore and aft only: both stations are at lateral arm {fmt(a.lateral_arm or 0.0, units.arm)}"
        return None
    if lateral:
        return f"the lateral CG only: both stations are at arm {fmt(a.arm, units.arm)}"
    where = f"arm {fmt(a.arm, units.arm)}"
    if aircraft.has_lateral:
        where += f" and lateral arm {fmt(a.lateral_arm or 0.0, units.arm)}"
    return f"neither CG: both stations are at {where}; only the stations' loads change"


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
    (FAA-H-8083-1B chapter 2); the answer is feasible only where the loading after the move
    passes the full check (every station and group limit at both ends of the move, every
    condition, the burn path, the lateral limits). Without it: the least weight to move that
    brings every condition within limits, searched with the engine on every amount from 0 to
    all the source holds, so every limit the move changes counts: the CG fore and aft, the
    lateral CG (stations side by side, at the same arm, move only it), the stations' and
    groups' own limits. ``extra["the move moves"]`` says which CG the move moves where it is
    not both (:func:`shift_moves`); an answer not found names what each amount moved exceeds.

    Raises
    ------
    InputError
        The source and target are one station; or, with ``target_arm``, the two stations
        have the same arm (moving weight between them does not move the CG fore and aft).
    """
    i, j = _station(aircraft, source, "source"), _station(aircraft, target_station, "target_station")
    if i == j:
        raise InputError(
            Problem(
                "target_station",
                f"{target_station} is also the source: weight moved within one station moves nothing",
                value=target_station,
                expected="another station",
            )
        )
    units = aircraft.units
    available = loading.stations.get(source, 0.0)
    distance = aircraft.station[j].arm - aircraft.station[i].arm
    moves = shift_moves(aircraft, source, target_station)

    def at(value: float) -> ResolvedLoading:
        stations = {
            **loading.stations,
            source: available - value,
            target_station: loading.stations.get(target_station, 0.0) + value,
        }
        return loading.but(stations=stations)

    if target_arm is not None:
        if distance == 0:
            raise InputError(
                Problem(
                    "target_station",
                    "the two stations have the same arm, so no amount moved between them puts the CG at a target "
                    f"arm: moving weight between them moves {moves}"
                    + (
                        "; without a target, the least weight that brings the loading within limits is found"
                        if moves is not None and moves.startswith("the lateral")
                        else ""
                    ),
                    value=target_station,
                )
            )
        now = check_loading(aircraft, loading).condition(condition)
        moved = now.weight * (target_arm - now.arm) / distance
        question = (
            f"weight to move from {source} to {target_station} to put the {condition_words(condition)} CG at "
            f"{fmt(target_arm, units.arm)}"
        )

        def refuse(why: str, check: CheckResult | None = None) -> PlanResult:
            return PlanResult(
                question=question,
                variable="weight moved",
                unit=units.mass,
                feasible=False,
                intervals=[],
                answer=None,
                answer_display=f"no solution: {why}",
                check=check,
            )

        if moved < -1e-9:
            return refuse("moving weight that way moves the CG away from the target")
        if moved > available + 1e-9:
            return refuse(f"it needs {fmt(moved, units.mass, 'up')} but {source} holds {fmt(available, units.mass)}")
        # the amount shown is the amount checked: the least weight that reaches the CG, rounded up (the
        # safe direction, as least ballast is), with more digits where that would pass what the source holds
        exact = max(0.0, moved)
        moved, shown = safe_value(exact, max(exact, available), units.mass, "up")
        check = check_loading(aircraft, at(moved))
        places = decimals(units.mass)
        while not check.ok and moved > exact and places < decimals(units.mass) + 3:
            # rounded up past a limit the move goes toward (a target on that limit): fewer digits cut off
            places += 1
            closer = min(max(exact, available), round_safe(exact, places, "up"))
            moved, shown, check = closer, f"{closer:,.{places}f} {units.mass}", check_loading(aircraft, at(closer))
        short = None
        if not check.ok and moved > exact:  # no figure rounded up holds: the closest below, short of the target
            under = round_safe(exact, places, "down")
            tried = check_loading(aircraft, at(under))
            if tried.ok:
                moved, shown, check = under, f"{under:,.{places}f} {units.mass}", tried
                short = (
                    "the CG falls short of the target by the rounding: any amount more, rounded up, passes a "
                    "limit the move goes toward"
                )
        if not check.ok:
            reached = fmt(check.condition(condition).arm, units.arm)
            return refuse(
                f"moving {fmt(moved, units.mass)} puts the {condition_words(condition)} CG at {reached}, but the "
                "loading is then not within limits: " + _exceeded(check),
                check,
            )
        return PlanResult(
            question=question,
            variable="weight moved",
            unit=units.mass,
            feasible=True,
            intervals=[Interval(low=moved, high=moved)],
            answer=moved,
            answer_display=shown,
            check=check,
            extra={"resulting CG": fmt(check.condition(condition).arm, units.arm)}
            | ({"note": short} if short else {})
            | _after_move(check, source, target_station, units.mass),
        )
    base = loading_arrays(aircraft, loading)

    def rows(x: np.ndarray) -> np.ndarray:
        out = np.repeat(base.stations[None, :], len(x), axis=0)
        out[:, i] -= x
        out[:, j] += x
        return out

    def evaluate(x: np.ndarray) -> Evaluation:
        return evaluate_arrays(aircraft, base, stations=rows(x))

    pairs = feasible_intervals(lambda x: _ok(evaluate(x)), 0.0, available, _GRID_STEP)
    empty = available <= 0.0
    moves_extra = {} if moves is None else {"the move moves": moves}
    reason = (
        f"{source} is empty: it holds no weight to move"
        if empty
        else f"no amount moved from {source}, up to all {fmt(available, units.mass)} it holds, brings the loading "
        "within limits"
    )

    def below(least: float, _check: CheckResult) -> tuple[str | None, str | None]:
        """What the loading with a little less moved exceeds: what makes the least amount needed."""
        if least <= 0:
            return None, None
        return _limits_past(check_loading(aircraft, at(max(0.0, least - 2 * _GRID_STEP))))

    answer = _answer(
        aircraft,
        pairs,
        units.mass,
        at,
        f"least weight to move from {source} to {target_station}",
        "weight moved",
        "up",
        lambda: reason,
        governing=below,
    )
    if not answer.feasible:  # the reason said once; "limited by" is what each amount moved still exceeds
        along = None if empty else _exceeded_along(aircraft, evaluate, at, available, units.mass)
        governing, code = (
            (along, _first_limit(check_loading(aircraft, at(0.0))))
            if along is not None
            else _why_not(aircraft, at(available))
        )
        return replace(
            answer,
            answer_display=f"no amount can: {reason}",
            governing=governing,
            governing_code=code,
            extra={**answer.extra, **moves_extra},
        )
    extra = {**answer.extra, **moves_extra}
    first = answer.intervals[0]
    if first.high < available - 1e-9 * max(1.0, available):
        past, _code = _limits_past(check_loading(aircraft, at(min(available, first.high + 2 * _GRID_STEP))))
        if past:
            extra["limited above by"] = f"{past} (moving more than {fmt(first.high, units.mass, 'down')})"
    if answer.check is not None:
        extra |= _after_move(answer.check, source, target_station, units.mass)
    return replace(answer, extra=extra)


def _after_move(check: CheckResult, source: str, target: str, unit: str) -> dict[str, str]:
    """What each station of a move holds in the loading checked: the weight moved is an amount, not
    a station's whole weight, so the answer also says the two stations' weights to load [mass unit]."""
    held = {item.id: item.weight for item in check.items}
    words = f"{fmt(held.get(source, 0.0), unit)} at {source}, {fmt(held.get(target, 0.0), unit)} at {target}"
    return {"after the move": words}


@dataclass(frozen=True, kw_only=True, slots=True)
class TableRow(Result):
    """Allowed ramp fuel for one payload: payload [mass unit]; intervals of ramp fuel
    [fuel volume unit]; most, the largest allowed (None where none is), the figure whose
    loading was checked in full; check, that check (at the figure shown), None where none is;
    limited_by, what stops the row's fuel going further or, where no fuel is within limits, what
    its check finds exceeded (:func:`most_fuel`'s ``governing``, in the check's words);
    limited_by_code, the finding code of its first limit (``governing_code``)."""

    payload: float
    intervals: list[Interval]
    most: float | None
    check: CheckResult | None = None
    limited_by: str | None = None
    limited_by_code: str | None = None


@dataclass(frozen=True, kw_only=True, slots=True)
class FuelPayloadTable(Result):
    """Allowed ramp fuel against payload added at a station.

    Attributes: station; rows (payload [mass unit], ramp fuel stretches and most [fuel
    volume unit]); units (``mass``, ``fuel_volume``); ok, some row has fuel within limits;
    caution.
    """

    station: str
    rows: list[TableRow]
    units: dict[str, str]
    ok: bool
    caution: str = PILOT_CAUTION


def fuel_payload_table(
    aircraft: Aircraft,
    loading: ResolvedLoading,
    station: str,
    *,
    steps: int = 11,
    top: float | None = None,
    fill: Sequence[str] | None = None,
) -> FuelPayloadTable:
    """Allowed ramp fuel against payload added at ``station`` (0 to ``top``, ``steps`` rows).

    Each row is :func:`most_fuel` at that payload, so each row's most fuel passed the full
    check. Between rows nothing is claimed: the rows are the payloads computed.
    """
    index = _station(aircraft, station)
    limit = aircraft.station[index].max_weight
    already = loading.stations.get(station, 0.0)
    top = top if top is not None else ((limit - already) if limit is not None else aircraft.useful_load)
    rows = []
    for payload in np.linspace(0.0, max(0.0, top), max(2, steps)):
        answer = most_fuel(
            aircraft, loading.but(stations={**loading.stations, station: already + float(payload)}), fill=fill
        )
        rows.append(
            TableRow(
                payload=float(payload),
                intervals=answer.intervals if answer.feasible else [],
                most=answer.answer if answer.feasible else None,
                check=answer.check if answer.feasible else None,
                limited_by=answer.governing,
                limited_by_code=answer.governing_code,
            )
        )
    units: dict[str, str] = {"mass": aircraft.units.mass, "fuel_volume": aircraft.units.fuel_volume}
    return FuelPayloadTable(station=station, rows=rows, units=units, ok=any(r.most is not None for r in rows))
