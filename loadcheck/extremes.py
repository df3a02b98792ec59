"""Weight and balance extreme conditions (AC 43.13-1B chapter 10, paragraph 10-17).

The most forward loading is the loading the aircraft's limits permit that comes closest to
(or goes past) the forward CG limit at its own weight; the most rearward loading the same
for the rearward limit; and where the category has a lateral envelope, the most left and
most right loadings the same for the lateral limits. AC 43.13-1B 10-17 (figures 10-10 and
10-11) builds them by loading the items ahead of (behind) the limit to their maximum; that
sort needs one limit arm, and a limit that moves with weight, a station group shared by
seats and baggage or a lateral limit defeats it. So each case here is found by a search:

- every station takes each of a few loads: its minimum, its maximum, and for a seat every
  whole number of standard occupants that fits (``seats = N``); the pilot's seat with
  flight controls (``controls = true``, else the first seat) always holds the pilot: one
  standard occupant (or the seat's maximum where that is less), and also the seat's
  ``min_weight`` where that is below the standard occupant (a lighter pilot the seat permits);
- where a station group limits several stations together, a baggage, cargo or other
  station also takes what the group leaves after every load of the others ("fill the rest";
  what a weight limit leaves is a load of the lines below, worked out for each loading's own
  fuel state);
- fuel: every choice of tanks filled full, and the minimum fuel for balance (1/12 US
  gallon per maximum-except-takeoff horsepower, AC 43.13-1B 10-2 p) less what those hold
  put tank by tank in every order of the other tanks;
- lines: from every one of those loadings the limits permit, each baggage, cargo or other
  station (and each tank) is moved alone, the rest held, to each load where the least margin
  can lie between its ends (:func:`_targets`): the load that brings the loading to a corner
  weight of any envelope of the category (at every fuel state; at zero fuel too where the
  zero-fuel CG is a limit), to a weight limit, or to what its station group leaves, and the
  load at which the margin to a sloping edge is least, in closed form;
- trades: a tank with an arm table is held at each quantity where trading it against another item at
  one weight can leave the least margin (:func:`_held_quantities`, closed form) and the rest of the
  loading searched again from there (:func:`_trade_loads`); two such tanks are also tried at each split
  of the minimum fuel where their moment is least or most (:func:`_pair_splits`) and along the ray where
  trading them against each other is stationary (:func:`_ray_loads`);
- every candidate is evaluated by the engine (:func:`~loadcheck.engine.evaluate`, in
  chunks); a candidate is permitted where it keeps every station, group and weight limit;
  the permitted ones are checked (:func:`~loadcheck.check.check_many`, after keeping, for
  each weight, those farthest toward the side) and the one with the least margin to that
  side's limit at its own weight is the extreme (a negative margin: out of limits); of
  equal margins, one out of another limit is taken (fail closed).

Why those loads: along one quantity m (the rest held) the loading's CG is
CG(m) = (M0 + a m) / (W0 + m) (FAA-H-8083-1B chapter 2). The limit at a weight is one edge of
the envelope between two corner weights, so the margin is smooth between the loads that bring
the weight to a corner's weight (or cut the range at a weight limit); on an edge linear in the
weight u = W0 + m (an arm, % MAC or lateral arm axis) it is a + c / u - p - q u, least or most
where u^2 = -c / q, and on a moment axis it is monotone. A least margin along a line therefore
lies at a range end, at a corner weight or weight limit, or at that point; and where the limits
permit a region of loadings, its least margin lies on such a line from a loading of the base
(the loads of two stations traded at one weight move the CG linearly). Seats hold whole
occupants (AC 43.13-1B 10-17), so a seat is not varied along a line. A tank whose arm moves with
its quantity (an arm table) is straight on each piece of its table, and its margin's least or most
point on a piece is closed form too (:func:`_stationary_weights`). Traded against another item at one
weight such a tank's moment is not linear, so the argument for two loads traded at one weight fails for it;
the trades above put back what it misses (the argument is in :func:`_trade_loads`). An envelope whose
slice at one weight holds more than one stretch of CG is outside this argument, and so are a tank with an
arm table traded against two or more items at once and an envelope on arm and lateral arm with such a tank.
At most :data:`SEARCH_BOUND` combinations, and :data:`LINE_BOUND` loadings along the lines,
are searched; where a bound cuts the search, it takes candidates spread evenly over all of
them, the case's notes say so, and the case establishes no extreme (``complete`` False).

Each extreme is a placard-type answer: it is checked in full
(:func:`~loadcheck.check.check_loading`) as a flight that burns from the fuel it states
down to the minimum fuel for balance, every tank burning in proportion to its fuel, and
its verdict is that check's verdict.
"""

from __future__ import annotations

import itertools
import math
from collections.abc import Callable, Sequence
from dataclasses import dataclass, replace
from typing import Literal

import numpy as np

from .aircraft import Aircraft, Station, Tank
from .caution import MECHANIC_CAUTION
from .check import check_loading, check_many
from .display import fmt
from .engine import evaluate, ramp_allowance, weight_limits
from .envelope import AXES, EnvelopeShape
from .errors import InputError, Problem, UnitError
from .loading import BurnPlan, ResolvedLoading
from .results import CheckResult, ConditionName, Result
from .units import convert, parse_quantity

__all__ = [
    "LINE_BOUND",
    "NOISE",
    "SEARCH_BOUND",
    "STANDARD_OCCUPANT_LB",
    "TRADE_BOUND",
    "ExtremeCase",
    "ExtremesResult",
    "Side",
    "extremes",
    "minimum_fuel",
    "seat_order",
    "standard_occupant",
]

Side = Literal["forward", "rearward", "left", "right"]
"""The side of an extreme loading: the CG limit it comes closest to."""

STANDARD_OCCUPANT_LB = 170.0
"""Standard occupant weight used by AC 43.13-1B figures 10-10 and 10-11 [lb]."""


@dataclass(frozen=True, kw_only=True, slots=True)
class ExtremeCase(Result):
    """One extreme loading: which side, how it was built, the fuel range covered, and its check.

    ``ok`` is the full check's verdict over the fuel range in ``fuel_states``. ``limit_arm`` is
    the side's limit at the loading's ramp weight: a CG arm for forward and rearward, a
    lateral arm for left and right [arm unit].
    """

    side: Side
    ok: bool
    limit_arm: float
    notes: list[str]
    fuel_states: str
    check: CheckResult
    complete: bool = True
    """False where a search bound left candidate loadings out: the loading shown is then the worst
    of those searched, not established as the extreme, and the aircraft's verdict is not "within
    limits" (fail closed)."""


@dataclass(frozen=True, kw_only=True, slots=True)
class ExtremesResult(Result):
    """The extreme checks; ``ok`` when every one is within limits and its search was complete.

    ``left`` and ``right`` are there where the category has a lateral envelope, else None.
    """

    aircraft: str
    category: str
    occupant_weight: float
    minimum_fuel: float | None
    ok: bool
    forward: ExtremeCase
    rearward: ExtremeCase
    left: ExtremeCase | None = None
    right: ExtremeCase | None = None
    caution: str = MECHANIC_CAUTION

    @property
    def cases(self) -> list[ExtremeCase]:
        """Every extreme checked: forward, rearward, then left and right where there are."""
        return [c for c in (self.forward, self.rearward, self.left, self.right) if c is not None]


def standard_occupant(aircraft: Aircraft, given: float | None = None) -> float:
    """The occupant weight to use [mass unit]: given, else the aircraft file's, else 170 lb
    (the standard occupant of AC 43.13-1B figures 10-10 to 10-14).

    Raises
    ------
    InputError
        For a given weight that is not a finite number above zero.
    """
    if given is not None:
        if not (math.isfinite(given) and given > 0):
            raise InputError(Problem("occupant_weight", "must be a weight above zero", value=given))
        return given
    return aircraft.standard_occupant_weight or convert(STANDARD_OCCUPANT_LB, "lb", aircraft.units.mass)


def seat_order(aircraft: Aircraft) -> list[str]:
    """Seat stations, the pilot's (with flight controls) first, then the others in file order."""
    seats = [s for s in aircraft.station if s.kind == "seat"]
    pilots = [s for s in seats if s.controls] or seats[:1]
    return [s.id for s in pilots] + [s.id for s in seats if s not in pilots]


def minimum_fuel(aircraft: Aircraft, meto_hp: float | str) -> float:
    """Minimum fuel for balance: METO hp / 12 US gallons, in the aircraft's fuel volume unit.

    AC 43.13-1B paragraph 10-2 p. ``meto_hp`` [hp] is a number or a text of one, as typed.

    Raises
    ------
    InputError
        For a power that is not a finite number above zero, or a text with a unit.

    Examples
    --------
    >>> # 165 hp -> 13.75 US gal (AC 43.13-1B figure 10-10)
    """
    typed = meto_hp
    try:
        quantity = parse_quantity(typed)
    except UnitError:
        quantity = None
    if quantity is None or quantity.unit is not None or not quantity.value > 0:
        raise InputError(
            Problem(
                "meto_hp",
                "the maximum-except-takeoff power must be a number above zero, in horsepower",
                value=typed,
                expected="horsepower as a bare number, e.g. 165",
            )
        )
    meto_hp = quantity.value
    return convert(meto_hp / 12.0, "usgal", aircraft.units.fuel_volume)


SEARCH_BOUND = 200_000
"""At most this many candidate loadings are searched for one aircraft [count]."""

_CHUNK = 20_000
"""Candidate loadings given to the engine at once [count]."""

_FILL_COMBOS = 4_096
"""At most this many loads of the other stations are combined into one station's "fill the rest" loads [count]."""

_ORDERS = 5_040
"""At most this many orders of the tanks are tried for the minimum fuel (7 tanks) [count]."""

_MARGIN = {"forward": "forward", "rearward": "aft", "left": "left", "right": "right"}
_TOWARD = {"forward": 1.0, "rearward": -1.0, "left": 1.0, "right": -1.0}
_BEYOND = {
    "forward": "ahead of the forward",
    "rearward": "behind the rearward",
    "left": "left of the left",
    "right": "right of the right",
}
_FARTHEST = {"forward": "farthest-forward", "rearward": "most rearward", "left": "leftmost", "right": "rightmost"}


def _lateral(value: float | None) -> float:
    return 0.0 if value is None else value


def _pilot_seats(aircraft: Aircraft) -> list[Station]:
    """The seats a pilot may sit in: those with flight controls, else the first seat."""
    seats = [s for s in aircraft.station if s.kind == "seat"]
    pilots = [s for s in seats if s.controls] or seats[:1]
    if not pilots:
        raise InputError(Problem("station", "the aircraft has no seat station for the pilot"))
    return pilots


def _occupant_weight(station: Station, occupant: float) -> float:
    """One standard occupant in a seat, or the seat's maximum where that is less [mass unit]."""
    return occupant if station.max_weight is None else min(occupant, station.max_weight)


def _pilot_weight(station: Station, occupant: float) -> float:
    """The least a seat holds with the pilot aboard [mass unit]: the seat's minimum weight where
    that is above zero and below one standard occupant (a lighter pilot the seat permits), else one
    standard occupant, or the seat's maximum where that is less."""
    least = station.min_weight or 0.0
    heavy = _occupant_weight(station, occupant)
    return least if 0.0 < least < heavy else heavy


def _station_loads(aircraft: Aircraft, occupant: float, pilots: Sequence[Station]) -> list[list[float]]:
    """The loads each station takes in the base of the search: its minimum, its maximum, and for a
    seat every whole number of occupants that fits (the pilot's seat: also the pilot at the seat's
    maximum where one occupant is above it) [mass unit]. Part loads come from :func:`_line_loads`."""
    loads = []
    for station in aircraft.station:
        least = station.min_weight or 0.0
        most = station.max_weight
        found = {least}
        if station.kind == "seat":
            for count in range(1, (station.seats or 1) + 1):
                weight = max(count * occupant, least)
                if most is not None and weight > most * (1 + 1e-12):
                    if count == 1 and station in pilots:  # the pilot at the seat's maximum
                        found.add(most)
                    break
                found.add(weight)
        elif most is not None:
            found.add(most)
        loads.append(sorted(found))
    return loads


def _group_limits(aircraft: Aircraft) -> list[tuple[tuple[int, ...], float]]:
    """Each station group's maximum, with the indices of its stations [mass unit]. (What a weight
    limit leaves is tried along the lines from every permitted loading, for its own fuel state:
    :func:`_targets`.)"""
    index = {s.id: i for i, s in enumerate(aircraft.station)}
    return [
        (tuple(index[m] for m in g.stations), g.max_weight) for g in aircraft.station_group if g.max_weight is not None
    ]


def _fill_loads(
    aircraft: Aircraft, loads: list[list[float]], shared: Sequence[tuple[tuple[int, ...], float]], rounds: int
) -> tuple[list[list[float]], bool]:
    """Add to each baggage, cargo or other station what a station group's maximum (``shared``: its
    stations and maximum) leaves after the other stations' loads ("fill the rest"), ``rounds``
    times over (a fill may make room for another).

    Returns the loads and whether :data:`_FILL_COMBOS` left some fills out.
    """
    cut = False
    for _ in range(rounds):
        grown = [set(v) for v in loads]
        for members, limit in shared:
            for j in members:
                station = aircraft.station[j]
                if station.kind == "seat":
                    continue
                others = [loads[i] for i in members if i != j]
                if math.prod(len(o) for o in others) > _FILL_COMBOS:
                    cut = True
                    continue
                least = station.min_weight or 0.0
                most = math.inf if station.max_weight is None else station.max_weight
                for combo in itertools.product(*others):
                    rest = limit - sum(combo)
                    if least < rest < most:
                        grown[j].add(rest)
        loads = [sorted(v) for v in grown]
    return loads, cut


def _fuel_loads(
    aircraft: Aircraft, min_fuel: float | None, fixed: dict[int, float] | None = None
) -> tuple[list[tuple[float, ...]], bool]:
    """The fuel states searched: each choice of full tanks, and the rest of the minimum fuel
    put tank by tank in each order of the other tanks [fuel volume unit]. A tank in ``fixed``
    (its index: its quantity) holds that quantity in every state; a state whose other tanks
    cannot make up the minimum fuel is then left out (it is not a loading the search permits).

    Returns the states and whether :data:`_ORDERS` left some orders out.

    Raises
    ------
    InputError
        Where the aircraft has tanks and no minimum fuel for balance is known.
    """
    tanks = aircraft.tank
    if not tanks:
        return [()], False
    if min_fuel is None:
        raise InputError(
            Problem(
                "meto_power_hp",
                "the minimum fuel for balance needs the engine's "
                "maximum-except-takeoff power: give meto_power_hp in the aircraft file",
            )
        )
    states: dict[tuple[float, ...], None] = {}
    cut = False
    count = len(tanks)
    held = fixed or {}
    free = [i for i in range(count) if i not in held]
    for size in range(len(free) + 1):
        for full in itertools.combinations(free, size):
            base = [held[i] if i in held else tanks[i].usable if i in full else 0.0 for i in range(count)]
            need = min_fuel - sum(base)
            rest = [i for i in free if i not in full]
            if need <= 1e-12 or not rest:
                if need <= 1e-12 or not held:
                    states[tuple(base)] = None
                continue
            for k, order in enumerate(itertools.permutations(rest)):
                if k >= _ORDERS:
                    cut = True
                    break
                state, left = list(base), need
                for i in order:
                    state[i] = min(tanks[i].usable, left)
                    left -= state[i]
                    if left <= 1e-12:
                        break
                if left <= 1e-12 or not held:
                    states[tuple(state)] = None
            # two tanks with arm tables sharing the rest of the minimum fuel, the others empty
            for i, j in itertools.combinations([r for r in rest if tanks[r].arm_table], 2):
                if not math.isclose(aircraft.density(tanks[i]), aircraft.density(tanks[j]), rel_tol=1e-12):
                    continue
                for q_i, q_j in _pair_splits(tanks[i], tanks[j], need):
                    state = list(base)
                    state[i], state[j] = q_i, q_j
                    states[tuple(state)] = None
    return list(states), cut


def _pair_splits(one: Tank, two: Tank, total: float) -> list[tuple[float, float]]:
    """The splits of a total quantity between two tanks with arm tables (of one fuel density) at which the
    loading's CG is least or most, the total held [fuel volume unit].

    With q in the first tank and total - q in the second, at the arms a1(q) = alpha1 + beta1 q and
    a2 = alpha2 + beta2 (total - q) on one piece of each table, the fuel's moment rho (alpha1 q + beta1 q^2 +
    alpha2 (total - q) + beta2 (total - q)^2) has the slope rho (alpha1 + 2 beta1 q - alpha2 - 2 beta2 (total -
    q)), zero where q = (alpha2 - alpha1 + 2 beta2 total) / (2 (beta1 + beta2)) (FAA-H-8083-1B chapter 2:
    moment = weight x arm); the weight is the same all along, so is the limit. Each such split inside both
    pieces and both tanks, and each split at a table quantity of either tank (where a slope jumps), is given.
    """
    found: dict[tuple[float, float], None] = {}
    for knot in one.arm_knots():
        if 0.0 <= knot <= one.usable and 0.0 <= total - knot <= two.usable:
            found[(float(knot), total - float(knot))] = None
    for knot in two.arm_knots():
        if 0.0 <= knot <= two.usable and 0.0 <= total - knot <= one.usable:
            found[(total - float(knot), float(knot))] = None
    for low1, high1, alpha1, beta1 in _table_pieces(one):
        for low2, high2, alpha2, beta2 in _table_pieces(two):
            if beta1 + beta2 == 0.0:
                continue
            q = (alpha2 - alpha1 + 2.0 * beta2 * total) / (2.0 * (beta1 + beta2))
            if low1 <= q <= high1 and low2 <= total - q <= high2:
                found[(q, total - q)] = None
    return list(found)


@dataclass(frozen=True)
class _Search:
    """The candidate loadings and the engine's verdicts on them."""

    stations: np.ndarray  # (N, S) [mass unit]
    fuel: np.ndarray  # (N, T) [fuel volume unit]
    permitted: np.ndarray  # (N,) every station, group and weight limit kept
    weight: dict[str, np.ndarray]  # ramp and zero fuel [mass unit]
    arm: dict[str, np.ndarray]  # [arm unit]
    lateral_arm: dict[str, np.ndarray]  # [arm unit]
    notes: list[str]
    enumerated: int


def _evaluate(aircraft: Aircraft, category: str, stations: np.ndarray, fuels: np.ndarray) -> dict[str, np.ndarray]:
    """The engine's verdict on candidate loadings (no taxi, no trip), in chunks: which keep every
    station, group and weight limit, and their ramp and zero-fuel weight, arm and lateral arm."""
    n = len(stations)
    density = np.array([aircraft.density(t) for t in aircraft.tank], dtype=float)
    out = {"permitted": np.zeros(n, dtype=bool)}
    for c in ("ramp", "zero_fuel"):
        out |= {f"weight.{c}": np.zeros(n), f"arm.{c}": np.zeros(n), f"lateral.{c}": np.zeros(n)}
    for start in range(0, n, _CHUNK):
        part = slice(start, min(n, start + _CHUNK))
        size = part.stop - part.start
        found = evaluate(
            aircraft, stations[part], fuels[part], np.zeros(size), np.zeros(size), category=category, density=density
        )
        kept = found.valid.copy()
        for holds in found.limit_ok.values():
            kept &= holds
        out["permitted"][part] = kept
        for c in ("ramp", "zero_fuel"):
            out[f"weight.{c}"][part] = found.weight[c]
            out[f"arm.{c}"][part] = found.arm[c]
            out[f"lateral.{c}"][part] = found.lateral_arm[c]
    return out


LINE_BOUND = 400_000
"""At most this many candidate loadings along the lines (one station's load or one tank's fuel
varied alone, the rest held) are searched [count]."""


@dataclass(frozen=True)
class _Line:
    """A quantity the search varies alone, every other load held: a station's load or a tank's fuel.

    ``per_unit`` is 1 for a station, the fuel density for a tank [mass unit per unit of the
    quantity]; ``arm`` is None for a tank whose arm moves with its quantity [arm unit]; ``low`` and
    ``high`` are its range [mass unit or fuel volume unit] (a tank's foot is raised per loading to
    keep the minimum fuel for balance).
    """

    column: int
    tank: bool
    name: str
    per_unit: float
    arm: float | None
    lateral: float
    low: float
    high: float


def _lines(aircraft: Aircraft) -> list[_Line]:
    """Every station with a range of loads that is not a seat (a seat holds whole occupants), and every tank."""
    lines = []
    for k, s in enumerate(aircraft.station):
        least = s.min_weight or 0.0
        most = math.inf if s.max_weight is None else s.max_weight
        if s.kind != "seat" and most > least:
            lines.append(_Line(k, False, s.name, 1.0, s.arm, _lateral(s.lateral_arm), least, most))
    for k, t in enumerate(aircraft.tank):
        arm = None if t.arm_table else float(t.arm_at(t.usable))
        lines.append(_Line(k, True, t.name, aircraft.density(t), arm, _lateral(t.lateral_arm), 0.0, t.usable))
    return lines


@dataclass(frozen=True)
class _State:
    """Rows of loadings at one fuel state: weight, moment and lateral moment with the fuel, and
    without it (zero fuel), and each row's station loads and fuel [mass unit, mass unit x arm unit]."""

    weight: np.ndarray
    moment: np.ndarray
    lateral: np.ndarray
    zero_weight: np.ndarray
    zero_moment: np.ndarray
    zero_lateral: np.ndarray
    stations: np.ndarray
    fuel: np.ndarray


def _targets(aircraft: Aircraft, category: str, line: _Line, state: _State) -> tuple[np.ndarray, list[str]]:
    """The loads of one line where, the rest held, the least margin to a CG limit can lie [line's unit].

    Along one quantity x (others held) the loading is W = W0 + m, M = M0 + a m (m = x times the
    mass per unit; a the arm), so its CG is CG(m) = (M0 + a m) / (W0 + m) (FAA-H-8083-1B chapter 2:
    CG = total moment / total weight). The limit at the loading's weight is one edge of the envelope
    between two of its corners' weights; so the margin is smooth between the loads that bring the
    weight to a corner's weight (of every envelope of the category) or to a weight limit, and it
    lies at a range end, at such a load, or where its slope is zero on an edge. On an edge of an
    envelope whose CG axis is an arm (or % MAC, or a lateral arm) against weight, the limit is linear
    in the weight u = W0 + m: X(u) = p + q u, and the margin CG(u) - X(u) = a + c / u - p - q u with
    c = M0 - a W0; its slope -c / u^2 - q is zero at u^2 = -c / q (where -c / q > 0). On a moment
    axis the limit is X(u) = p + r / u and the margin (a - p) + (c - r) / u has no such point. An
    envelope on arm and lateral arm changes edge where the held coordinate reaches a corner's.

    Returns
    -------
    loads : (N, K) the load of each row at each target, NaN where the row has none [line's unit]
    what : K words, what each target is
    """
    units = aircraft.units
    mass = units.mass
    now = (state.fuel if line.tank else state.stations)[:, line.column]
    m_now = now * line.per_unit
    # the line's own moment now: at its fixed arm, or at its arm table's arm for the quantity it holds
    own = m_now * (line.arm if line.arm is not None else aircraft.tank[line.column].arm_at(now))
    w0, m0, l0 = state.weight - m_now, state.moment - own, state.lateral - m_now * line.lateral
    z0 = state.zero_weight - m_now
    zm0, zl0 = state.zero_moment - m_now * (line.arm or 0.0), state.zero_lateral - m_now * line.lateral
    zero_limit = aircraft.limits.zero_fuel_cg == "limit" and not line.tank
    columns: list[np.ndarray] = []
    what: list[str] = []

    def add(mass_added: np.ndarray, words: str) -> None:
        columns.append(np.asarray(mass_added, dtype=float) / line.per_unit)
        what.append(words)

    if line.tank:
        for knot in aircraft.tank[line.column].arm_knots():
            add(np.full(len(w0), knot * line.per_unit), "a quantity of its arm table")
    else:
        station = aircraft.station[line.column]
        index = {s.id: i for i, s in enumerate(aircraft.station)}
        for group in aircraft.station_group:
            if station.id not in group.stations:
                continue
            others = sum((state.stations[:, index[m]] for m in group.stations if m != station.id), np.zeros(len(w0)))
            for bound, side in ((group.max_weight, "maximum"), (group.min_weight, "minimum")):
                if bound is not None:
                    add(bound - others, f"what the {side} of its station group ({group.label}) leaves")
    limits = aircraft.limits
    table = weight_limits(aircraft)
    named = {
        "max_ramp_weight": "maximum ramp weight",
        "max_takeoff_weight": "maximum takeoff weight",
        "max_landing_weight": "maximum landing weight",
        "max_zero_fuel_weight": "maximum zero-fuel weight",
    }
    seen: set[float] = set()
    for condition in ("ramp", "takeoff", "landing"):
        for code, value in table[condition]:
            if value not in seen:
                seen.add(value)
                add(value - w0, f"as much as the {named[code]} ({fmt(value, mass)}) allows")
    if limits.min_flight_weight is not None:
        add(
            limits.min_flight_weight - w0,
            f"the load that brings the loading to the minimum flight weight ({fmt(limits.min_flight_weight, mass)})",
        )
    if not line.tank:
        for code, value in table["zero_fuel"]:
            add(value - z0, f"as much as the {named[code]} ({fmt(value, mass)}) allows")
    allowance = ramp_allowance(aircraft)
    shapes = [e.shape for e in aircraft.envelopes_for(category)]
    corners = sorted({float(c[s.axes.index("weight")]) for s in shapes if "weight" in s.axes for c in s.corners})
    for corner in corners:
        add(corner - w0, f"the load that brings the loading to the envelope's corner weight ({fmt(corner, mass)})")
        if zero_limit:
            add(
                corner - z0,
                f"the load that brings the zero-fuel weight to the envelope's corner weight ({fmt(corner, mass)})",
            )
    for shape in shapes:
        top = shape.max_weight
        if top is not None and allowance > 0:
            add(
                top + allowance - w0,
                f"the load that brings the loading to the envelope's top and the ramp allowance "
                f"({fmt(top + allowance, mass)})",
            )
    if line.arm is None:
        _table_targets(aircraft.tank[line.column], line, shapes, w0, m0, l0, add, mass)
    else:
        for shape in shapes:
            if "weight" not in shape.axes:
                # arm and lateral arm: where the held coordinate (CG or lateral CG) reaches a corner's
                for arm_c in _lateral_corner_loads(shape, w0, l0, line.lateral, add):
                    with np.errstate(divide="ignore", invalid="ignore"):
                        add(
                            (arm_c * w0 - m0) / (line.arm - arm_c),
                            "the load that brings the CG to a corner of the envelope",
                        )
                continue
            k_w = shape.axes.index("weight")
            axis = AXES[shape.axes[1 - k_w]]
            if not axis.per_weight:  # a moment axis: the margin is monotone between corner weights
                continue
            _, b, c = axis.coefficients(shape.moment_scale, shape.mac)
            scale = c if axis.lateral else b
            ring = shape.corners
            for (v1, u1), (v2, u2) in zip(
                ring[:, [1 - k_w, k_w]], np.roll(ring, -1, axis=0)[:, [1 - k_w, k_w]], strict=True
            ):
                if u1 == u2 or v1 == v2:
                    continue
                q = (v2 - v1) / (u2 - u1) / scale  # the limit's slope [arm unit per mass unit]
                low_u, high_u = min(u1, u2), max(u1, u2)
                words = (
                    f"the load of least margin to the sloping {'lateral ' if axis.lateral else ''}limit "
                    f"between {fmt(low_u, mass)} and {fmt(high_u, mass)}"
                )
                rows = [(w0, (l0 - line.lateral * w0) if axis.lateral else (m0 - line.arm * w0))]
                if zero_limit:
                    rows.append((z0, (zl0 - line.lateral * z0) if axis.lateral else (zm0 - line.arm * z0)))
                for base, offset in rows:
                    square = -offset / q
                    with np.errstate(invalid="ignore"):
                        u = np.where(square > 0, np.sqrt(np.maximum(square, 0.0)), np.nan)
                    u = np.where((u >= low_u) & (u <= high_u), u, np.nan)
                    add(u - base, words)
    if not columns:
        return np.zeros((len(w0), 0)), []
    return np.stack(columns, axis=1), what


def _table_pieces(tank: Tank) -> list[tuple[float, float, float, float]]:
    """The straight pieces of a tank's arm table over its usable range: (from, to, alpha, beta), the arm
    a(q) = alpha + beta q on each [fuel volume unit, arm unit, arm unit per fuel volume unit]; beyond the
    table's ends the end arm holds (:meth:`~loadcheck.aircraft.Tank.arm_at`)."""
    assert tank.arm_table is not None
    table = tank.arm_table
    pieces = []
    if table[0][0] > 0:
        pieces.append((0.0, table[0][0], table[0][1], 0.0))
    for (q1, a1), (q2, a2) in itertools.pairwise(table):
        beta = (a2 - a1) / (q2 - q1)
        pieces.append((q1, q2, a1 - beta * q1, beta))
    if table[-1][0] < tank.usable:
        pieces.append((table[-1][0], tank.usable, table[-1][1], 0.0))
    return pieces


def _stationary_weights(
    density: float, w0: np.ndarray, n0: np.ndarray, alpha: float, beta: float, slope: float, moment: float
) -> np.ndarray:
    """The weight u = W0 + rho q at which the margin to one straight limit is least or most, as a tank's fuel
    q goes in at the arm a(q) = alpha + beta q (NaN where there is no such point) [mass unit].

    The tank holds rho q at a(q), so the loading's moment is N0 + rho (alpha q + beta q^2) over W = W0 + rho q,
    and its CG that over W (FAA-H-8083-1B chapter 2: CG = total moment / total weight). Against a limit
    whose moment at weight W is t + p W + s W^2 (an arm limit p + s W: t = 0; a moment limit t + p W: s = 0),
    the margin is (N - t - p W - s W^2) / W; its slope in q is zero where
    (N' - p rho - 2 s rho W) W - rho (N - t - p W - s W^2) = 0, that is, divided by rho,
    (beta rho - s rho^2) q^2 + 2 W0 (beta - s rho) q + (alpha W0 - N0 - s W0^2 + t) = 0 (p drops out).
    Divided by (beta - s rho) and times rho, (rho q + W0)^2 = W0^2 - rho C / (beta - s rho), with C the
    constant term: u^2 = W0^2 - rho C / (beta - s rho). Where beta = s rho the margin is monotone (or
    constant) in q. With beta = 0 (a fixed arm) this is u^2 = (alpha W0 - N0 + t) / s, the closed form of
    :func:`_targets`; with beta = 0 and s = 0 (a fixed arm against a moment limit) there is no such point.
    """
    lead = beta - slope * density
    if lead == 0.0:
        return np.full(len(w0), np.nan)
    constant = alpha * w0 - n0 - slope * w0**2 + moment
    square = w0**2 - density * constant / lead
    with np.errstate(invalid="ignore"):
        return np.where(square > 0, np.sqrt(np.maximum(square, 0.0)), np.nan)


def _lateral_corner_loads(
    shape: EnvelopeShape,
    w0: np.ndarray,
    l0: np.ndarray,
    lateral: float,
    add: Callable[[np.ndarray, str], None],
) -> list[float]:
    """For an envelope on arm and lateral arm: give ``add`` the load at lateral arm ``lateral`` [arm unit]
    that brings the lateral CG to each corner's (the rest of the loading of weight ``w0`` [mass unit] and
    lateral moment ``l0``), and return each corner's arm, for the caller's loads that bring the CG there."""
    arms = []
    for x_c, y_c in shape.corners:
        arm_c, lat_c = (x_c, y_c) if shape.axes[0] == "arm" else (y_c, x_c)
        with np.errstate(divide="ignore", invalid="ignore"):
            add(
                (lat_c * w0 - l0) / (lateral - lat_c), "the load that brings the lateral CG to a corner of the envelope"
            )
        arms.append(float(arm_c))
    return arms


def _table_targets(
    tank: Tank,
    line: _Line,
    shapes: Sequence[EnvelopeShape],
    w0: np.ndarray,
    m0: np.ndarray,
    l0: np.ndarray,
    add: Callable[[np.ndarray, str], None],
    mass: str,
) -> None:
    """The fuel quantities of a tank with an arm table where, the rest held (weight ``w0``, moment ``m0``,
    lateral moment ``l0`` without the tank), the margin to a straight limit is least or most inside one
    piece of its table (:func:`_stationary_weights`), and where an envelope on arm and lateral arm has a
    corner's CG; each given to ``add`` as the mass it adds [mass unit]."""
    rho = line.per_unit
    pieces = _table_pieces(tank)

    def within(u: np.ndarray, low: float, high: float) -> np.ndarray:
        return np.where((u >= w0 + rho * low) & (u <= w0 + rho * high), u, np.nan)

    for shape in shapes:
        if "weight" not in shape.axes:
            for arm_c in _lateral_corner_loads(shape, w0, l0, line.lateral, add):
                for low, high, alpha, beta in pieces:
                    # CG = arm_c: rho beta q^2 + rho (alpha - arm_c) q + (M0 - arm_c W0) = 0
                    for q in _roots(rho * beta, rho * (alpha - arm_c), m0 - arm_c * w0):
                        q = np.where((q >= low) & (q <= high), q, np.nan)
                        add(rho * q, "the quantity that brings the CG to a corner of the envelope")
            ring = shape.corners
            k_arm = 0 if shape.axes[0] == "arm" else 1
            for one, two in zip(ring, np.roll(ring, -1, axis=0), strict=True):
                (x1, y1), (x2, y2) = (one[k_arm], one[1 - k_arm]), (two[k_arm], two[1 - k_arm])
                for low, high, alpha, beta in pieces:
                    if y1 != y2:  # an arm limit x = p + s y: the margin (M - s L) / W - p
                        s = (x2 - x1) / (y2 - y1)
                        u = _stationary_weights(rho, w0, m0 - s * l0, alpha - s * line.lateral, beta, 0.0, 0.0)
                        add(within(u, low, high) - w0, "the quantity of least margin to a sloping limit")
                    if x1 != x2:  # a lateral limit y = p + s x: the margin (L - s M) / W - p
                        s = (y2 - y1) / (x2 - x1)
                        u = _stationary_weights(rho, w0, l0 - s * m0, line.lateral - s * alpha, -s * beta, 0.0, 0.0)
                        add(within(u, low, high) - w0, "the quantity of least margin to a sloping lateral limit")
            continue
        for lateral, slope, moment, low_u, high_u in _weight_edges(shape):
            words = (
                f"the quantity of least margin to the {'lateral ' if lateral else ''}limit between "
                f"{fmt(low_u, mass)} and {fmt(high_u, mass)}"
            )
            if lateral:  # the tank's lateral arm is fixed: one piece over its whole range
                parts = [(0.0, tank.usable, line.lateral, 0.0)]
                n0 = l0
            else:
                parts, n0 = pieces, m0
            for low, high, alpha, beta in parts:
                u = _stationary_weights(rho, w0, n0, alpha, beta, slope, moment)
                u = np.where((u >= low_u) & (u <= high_u), u, np.nan)
                add(within(u, low, high) - w0, words)


def _weight_edges(shape: EnvelopeShape) -> list[tuple[bool, float, float, float, float]]:
    """Each edge of an envelope drawn against weight that is not level, as a limit on the loading's moment
    (or lateral moment) at weight W of t + p W + s W^2: (lateral, s, t, from weight, to weight) [arm unit per
    mass unit, mass unit x arm unit, mass unit, mass unit] (p drops out of :func:`_stationary_weights`).

    The limit in the axis is v0 + k u at weight u; in arm (an axis per weight): (v0 - a0 + k u) / scale, an
    arm limit p + s u; in moment: (v0 - a0 + k u) / scale, a moment limit t + p u."""
    k_w = shape.axes.index("weight")
    axis = AXES[shape.axes[1 - k_w]]
    a0, b, c = axis.coefficients(shape.moment_scale, shape.mac)
    scale = c if axis.lateral else b
    ring = shape.corners
    edges = []
    for (v1, u1), (v2, u2) in zip(ring[:, [1 - k_w, k_w]], np.roll(ring, -1, axis=0)[:, [1 - k_w, k_w]], strict=True):
        if u1 == u2:
            continue
        k = (v2 - v1) / (u2 - u1)
        v0 = v1 - k * u1
        slope, moment = (k / scale, 0.0) if axis.per_weight else (0.0, (v0 - a0) / scale)
        edges.append((axis.lateral, float(slope), float(moment), float(min(u1, u2)), float(max(u1, u2))))
    return edges


def _roots(a: float, b: float, c: np.ndarray) -> list[np.ndarray]:
    """The real roots of a x^2 + b x + c = 0, row by row (NaN where none) [x's unit]."""
    if a == 0.0:
        if b == 0.0:
            return []
        return [-c / b]
    disc = b * b - 4.0 * a * c
    with np.errstate(invalid="ignore"):
        root = np.where(disc >= 0, np.sqrt(np.maximum(disc, 0.0)), np.nan)
    return [(-b - root) / (2.0 * a), (-b + root) / (2.0 * a)]


def _line_low(line: _Line, state: _State, min_fuel: float | None) -> np.ndarray:
    """Each row's least quantity of the line: a tank keeps the minimum fuel for balance with the others [unit]."""
    if not line.tank or min_fuel is None:
        return np.full(len(state.weight), line.low)
    others = state.fuel.sum(axis=1) - state.fuel[:, line.column]
    return np.maximum(line.low, min_fuel - others)


def _row_ids(rows: np.ndarray) -> tuple[np.ndarray, np.ndarray]:
    """Equal rows get equal ids (exact comparison; a sort of the columns, as np.unique(axis=0)
    does, but without its slow row view): the id of each row, and one row index of each id."""
    if not len(rows):
        return np.zeros(0, dtype=np.int64), np.zeros(0, dtype=np.int64)
    if not rows.shape[1]:
        return np.zeros(len(rows), dtype=np.int64), np.zeros(1, dtype=np.int64)
    order = np.lexsort(rows.T[::-1])
    ordered = rows[order]
    new = np.ones(len(rows), dtype=bool)
    new[1:] = (ordered[1:] != ordered[:-1]).any(axis=1)
    ids = np.empty(len(rows), dtype=np.int64)
    ids[order] = np.cumsum(new) - 1
    return ids, order[new]


NOISE = 1e-9
"""A load a target puts this little outside its range (a fraction of the range's larger end, at least one unit)
is float noise, not a load outside the range: it is taken at the range's end [fraction]."""


def _inward(loads: np.ndarray, low: np.ndarray, high: np.ndarray) -> tuple[np.ndarray, np.ndarray, np.ndarray]:
    """The targets of a line that lie in their row's range [low, high], each clamped into it [line's unit].

    A target can carry float noise: the load that brings the loading to a corner weight of 720 kg is the
    corner less the rest of the loading, and the loading then weighs 720.0000000000514 kg, or the load is a
    hair above the station's maximum. Such a target, within :data:`NOISE` of its range, is kept and moved to
    the range's end (never outward, never dropped); a target farther outside is not a permitted load.

    Returns the row and column of each target kept, and its load, inside its range.

    Examples
    --------
    >>> rows, cols, loads = _inward(np.array([[120.0000000000514, -1e-13, 150.0, np.nan]]),
    ...                             np.zeros((1, 4)), np.full((1, 4), 120.0))
    >>> cols.tolist(), loads.tolist()
    ([0, 1], [120.0, 0.0])
    """
    finite_high = np.where(np.isfinite(high), np.abs(high), 1.0)
    noise = NOISE * np.maximum(1.0, np.maximum(finite_high, np.abs(low)))
    with np.errstate(invalid="ignore"):
        inside = np.isfinite(loads) & (loads >= low - noise) & (loads <= high + noise)
    row, col = np.nonzero(inside)
    values = np.minimum(np.maximum(loads[row, col], low[row, col]), high[row, col])
    return row, col, values


def _line_loads(
    aircraft: Aircraft,
    category: str,
    stations: np.ndarray,
    fuels: np.ndarray,
    found: dict[str, np.ndarray],
    kept: np.ndarray,
    min_fuel: float | None,
) -> tuple[np.ndarray, np.ndarray, bool]:
    """Candidate loadings along each line from the permitted base loadings: one quantity moved to each
    of its :func:`_targets` within its range, the rest held.

    Returns the stations (M, S) and fuel (M, T) of the new candidates and whether :data:`LINE_BOUND`
    cut them.
    """

    def of(condition: str) -> tuple[np.ndarray, np.ndarray, np.ndarray]:
        weight = found[f"weight.{condition}"][kept]
        return weight, weight * found[f"arm.{condition}"][kept], weight * found[f"lateral.{condition}"][kept]

    state = _State(*of("ramp"), *of("zero_fuel"), stations, fuels)
    width = stations.shape[1]
    base = np.concatenate([stations, fuels], axis=1)
    keys = np.round(base, 9)  # equal candidates are found by their loads to 9 decimals; the loads stay as they are
    picks: list[tuple[int, np.ndarray, np.ndarray]] = []  # column, base row, new value
    for line in _lines(aircraft):
        loads, _ = _targets(aircraft, category, line, state)
        if not loads.shape[1]:
            continue
        low = np.broadcast_to(_line_low(line, state, min_fuel)[:, None], loads.shape)
        row, _, values = _inward(loads, low, np.full(loads.shape, line.high))
        if not len(row):
            continue
        column = width + line.column if line.tank else line.column
        # base loadings that differ only in this quantity give the same candidate: keep one of each
        rest, _ = _row_ids(np.delete(keys, column, axis=1))
        _, first = _row_ids(np.stack([rest[row].astype(float), np.round(values, 9)], axis=1))
        picks.append((column, row[first], values[first]))
    total = sum(len(r) for _, r, _ in picks)
    if not total:
        return np.zeros((0, width)), np.zeros((0, fuels.shape[1])), False
    cut = total > LINE_BOUND
    keep = np.unique(np.linspace(0, total - 1, min(total, LINE_BOUND)).round().astype(np.int64))  # spread evenly
    chosen, start = [], 0
    for column, row, values in picks:
        mine = keep[(keep >= start) & (keep < start + len(row))] - start
        start += len(row)
        rows = base[row[mine]].copy()
        rows[:, column] = values[mine]
        chosen.append(rows)
    both = np.concatenate(chosen)
    both = both[np.sort(_row_ids(np.round(both, 9))[1])]
    return both[:, :width], both[:, width:], cut


TRADE_BOUND = 200_000
"""At most this many candidate loadings with a tank with an arm table held at one of its trade quantities
(:func:`_held_quantities`) are searched, before the lines from them [count]."""


def _held_quantities(aircraft: Aircraft, column: int) -> list[tuple[float, str]]:
    """The quantities of a tank with an arm table at which the search holds it while the rest of the loading
    is searched again (:func:`_trade_loads`), each with words saying what it is [fuel volume unit].

    Traded against another item at one weight W (the tank's fuel mass up by rho dq, the other's down as
    much), the loading's moment changes by rho (a(q) + q a'(q) - a_j) dq, a_j the other item's arm
    (FAA-H-8083-1B chapter 2: moment = weight x arm). On a piece of the table a(q) = alpha + beta q, so the
    tank's moment rho (alpha q + beta q^2) has the slope rho (alpha + 2 beta q), and at one weight the CG is
    least or most where alpha + 2 beta q = a_j: q = (a_j - alpha) / (2 beta). The weight, and with it the
    limit, is the same all along the trade, so this holds against any edge of any envelope drawn against
    weight. These quantities, one for each item at a fixed arm that can move (a station that is not a seat,
    a tank without an arm table) and each piece of the table with beta not zero, and the table's own
    quantities (where the slope jumps), are the quantities at which the tank can sit at a least margin
    with another item traded against it; the rest of that loading is then a loading of items at fixed
    arms, which the base and the lines search."""
    tank = aircraft.tank[column]
    found: dict[float, str] = {}
    for knot in tank.arm_knots():
        if 0.0 < knot < tank.usable:
            found.setdefault(float(knot), "a quantity of its arm table, with the rest of the loading searched again")
    partners = [
        (line.name, line.arm)
        for line in _lines(aircraft)
        if line.arm is not None and not (line.tank and line.column == column)
    ]
    for k, other in enumerate(aircraft.tank):  # a flat piece of another tank's table is a fixed arm there
        if k != column and other.arm_table:
            partners += [(other.name, alpha) for _, _, alpha, beta in _table_pieces(other) if beta == 0.0]
    for low, high, alpha, beta in _table_pieces(tank):
        if beta == 0.0:
            continue
        for name, arm in partners:
            q = (arm - alpha) / (2.0 * beta)
            if low < q < high:
                found.setdefault(
                    q,
                    f"the quantity where its fuel's moment per {aircraft.units.mass} added equals the arm of "
                    f"{name} ({fmt(arm, aircraft.units.arm)}), traded against it at one weight",
                )
    return sorted(found.items())


def _trade_loads(
    aircraft: Aircraft, category: str, rows: np.ndarray, min_fuel: float | None
) -> tuple[np.ndarray, np.ndarray, dict[str, np.ndarray], list[str]]:
    """Candidate loadings with each tank with an arm table held at each of its :func:`_held_quantities` (and
    with several such tanks, each free or held, in every combination): every station row of the base
    (``rows``) with every fuel state that holds them there (:func:`_fuel_loads`), and the lines from those
    the limits permit (:func:`_line_loads`).

    Why it cannot miss what the base and the lines would find with that quantity given: take a least-margin
    loading; hold the tank's quantity at its value there and it is a least-margin loading of the rest, whose
    items have fixed arms (one tank with an arm table) or are held. Where another item can be traded
    against the tank at that weight, both ways, the margin is stationary in the trade, so the quantity is
    one of :func:`_held_quantities` (or a table quantity, where the slope jumps). Where none can, the
    tank moves only with the weight, along its own line from a loading of the base, which
    :func:`_targets` solves in closed form. With two tanks with arm tables traded against each other the
    stationary quantity depends on their total, which is not searched.

    Returns the stations (M, S) and fuel (M, T) of the candidates, the engine's verdict on them
    (:func:`_evaluate`) and notes where a bound cut them.
    """
    width, tanks = rows.shape[1], len(aircraft.tank)
    notes: list[str] = []
    blocks: list[tuple[np.ndarray, np.ndarray]] = []
    orders_cut = False
    # each tank with an arm table free or held at one of its quantities, at least one held: two such tanks can
    # each be traded against one item at a fixed arm at once
    tabled = [k for k, t in enumerate(aircraft.tank) if t.arm_table]
    choices = [[None] + [q for q, _ in _held_quantities(aircraft, k)] for k in tabled]
    for combo in itertools.product(*choices):
        fixed = {k: q for k, q in zip(tabled, combo, strict=True) if q is not None}
        if not fixed:
            continue
        states, cut = _fuel_loads(aircraft, min_fuel, fixed)
        orders_cut |= cut
        if not states:
            continue
        fuel = np.array(states, dtype=float).reshape(len(states), tanks)
        blocks.append((np.repeat(rows, len(fuel), axis=0), np.tile(fuel, (len(rows), 1))))
    empty = _evaluate(aircraft, category, np.zeros((0, width)), np.zeros((0, tanks)))
    if not blocks:
        return np.zeros((0, width)), np.zeros((0, tanks)), empty, notes
    if orders_cut:
        notes.append(
            f"search bound: with a tank held at a trade quantity, the minimum fuel was put in the first {_ORDERS:,} "
            "orders of the other tanks only"
        )
    stations = np.concatenate([b[0] for b in blocks])
    fuels = np.concatenate([b[1] for b in blocks])
    if len(stations) > TRADE_BOUND:  # spread evenly over all of them, and say so
        keep = np.unique(np.linspace(0, len(stations) - 1, TRADE_BOUND).round().astype(np.int64))
        notes.append(
            f"search bound: {len(keep):,} of {len(stations):,} loadings with a tank with an arm table held at a "
            "trade quantity searched; the answer may not be the extreme"
        )
        stations, fuels = stations[keep], fuels[keep]
    stations, fuels, found, cut = _with_line_loads(aircraft, category, stations, fuels, min_fuel)
    if cut:
        notes.append(
            f"search bound: {LINE_BOUND:,} of the part loads along one station or tank from a tank held at a trade "
            "quantity were searched; the answer may not be the extreme"
        )
    return stations, fuels, found, notes


def _with_line_loads(
    aircraft: Aircraft, category: str, stations: np.ndarray, fuels: np.ndarray, min_fuel: float | None
) -> tuple[np.ndarray, np.ndarray, dict[str, np.ndarray], bool]:
    """The loadings (``stations`` (N, S) [mass unit], ``fuels`` (N, T) [fuel volume unit]) evaluated,
    with the part loads along each line from every permitted one (:func:`_line_loads`: where the
    least margin can lie between a line's ends) added and evaluated too; and whether the line bound
    cut those part loads."""
    found = _evaluate(aircraft, category, stations, fuels)
    kept = found["permitted"]
    more_stations, more_fuels, cut = _line_loads(aircraft, category, stations[kept], fuels[kept], found, kept, min_fuel)
    if len(more_stations):
        more = _evaluate(aircraft, category, more_stations, more_fuels)
        stations = np.concatenate([stations, more_stations])
        fuels = np.concatenate([fuels, more_fuels])
        found = {key: np.concatenate([found[key], more[key]]) for key in found}
    return stations, fuels, found, cut


def _ray_loads(
    aircraft: Aircraft,
    category: str,
    stations: np.ndarray,
    fuels: np.ndarray,
    found: dict[str, np.ndarray],
    kept: np.ndarray,
    min_fuel: float | None,
) -> tuple[np.ndarray, np.ndarray, bool]:
    """Candidate loadings where two tanks with arm tables are traded against each other at one weight, from
    the permitted base loadings (``kept``): both tanks' fuel set along the ray where the trade is stationary,
    at each weight where the least margin along that ray can lie, the rest held [mass unit, fuel volume unit].

    Traded at one weight (rho1 dq1 = -rho2 dq2), the moment changes by rho1 (a1 + q1 a1' - a2 - q2 a2') dq1
    (FAA-H-8083-1B chapter 2), zero where alpha1 + 2 beta1 q1 = alpha2 + 2 beta2 q2 on a piece of each table:
    the ray q2 = c0 + c1 q1, c1 = beta1 / beta2, c0 = (alpha1 - alpha2) / (2 beta2). A least-margin loading
    with both tanks free to trade lies on it. Along it the fuel weighs rho2 c0 + (rho1 + rho2 c1) q1 and its
    moment is quadratic in q1, as one tank with an arm table is (:func:`_stationary_weights`, with the
    equivalent alpha and beta); so its least margin lies where the ray meets a piece's end (a table quantity,
    :func:`_held_quantities`), a tank's end or the minimum fuel (:func:`_pair_splits`), a corner weight or
    weight limit, or the closed-form point of an edge: the last two are given here.

    Returns the stations (M, S) and fuel (M, T) of the candidates, and whether :data:`LINE_BOUND` cut them
    (spread evenly over all of them).
    """
    tanks = aircraft.tank
    width = stations.shape[1]
    tabled = [k for k, t in enumerate(tanks) if t.arm_table]
    if len(tabled) < 2 or not kept.any():
        return np.zeros((0, width)), np.zeros((0, len(tanks))), False
    base_s, base_f = stations[kept], fuels[kept]
    weight = found["weight.ramp"][kept]
    moment, lateral = weight * found["arm.ramp"][kept], weight * found["lateral.ramp"][kept]
    shapes = [e.shape for e in aircraft.envelopes_for(category)]
    edges = [edge for shape in shapes if "weight" in shape.axes for edge in _weight_edges(shape)]
    table = weight_limits(aircraft)
    levels = {value for condition in ("ramp", "takeoff", "landing") for _, value in table[condition]}
    if aircraft.limits.min_flight_weight is not None:
        levels.add(aircraft.limits.min_flight_weight)
    allowance = ramp_allowance(aircraft)
    for shape in shapes:
        if "weight" in shape.axes:
            levels |= {float(c[shape.axes.index("weight")]) for c in shape.corners}
            if shape.max_weight is not None and allowance > 0:
                levels.add(shape.max_weight + allowance)
    out_s, out_f = [], []
    for i, j in itertools.combinations(tabled, 2):
        one, two = tanks[i], tanks[j]
        r1, r2 = aircraft.density(one), aircraft.density(two)
        lat1, lat2 = _lateral(one.lateral_arm), _lateral(two.lateral_arm)
        q1, q2 = base_f[:, i], base_f[:, j]
        w0 = weight - r1 * q1 - r2 * q2
        n0 = moment - r1 * q1 * one.arm_at(q1) - r2 * q2 * two.arm_at(q2)
        l0 = lateral - (r1 * q1 * lat1 + r2 * q2 * lat2)
        others = base_f.sum(axis=1) - q1 - q2
        # base loadings that differ only in these two tanks give the same rays: keep one of each
        _, first = _row_ids(np.round(np.delete(np.concatenate([base_s, base_f], axis=1), [width + i, width + j], 1), 9))
        w0, n0, l0, others = w0[first], n0[first], l0[first], others[first]
        for low1, high1, alpha1, beta1 in _table_pieces(one):
            for low2, high2, alpha2, beta2 in _table_pieces(two):
                if beta2 == 0.0 or beta1 == 0.0:  # one tank's quantity is fixed by the other's arm: held
                    continue
                c1, c0 = beta1 / beta2, (alpha1 - alpha2) / (2.0 * beta2)
                rho = r1 + r2 * c1
                if rho == 0.0:  # the ray keeps one weight
                    continue
                ends = sorted(((low2 - c0) / c1, (high2 - c0) / c1))
                t_low, t_high = max(low1, ends[0]), min(high1, ends[1])
                if t_low > t_high:
                    continue
                w00 = w0 + r2 * c0
                n00 = n0 + r2 * c0 * (alpha2 + beta2 * c0)
                alpha = (r1 * alpha1 + r2 * c1 * (alpha2 + 2.0 * beta2 * c0)) / rho
                beta = (r1 * beta1 + r2 * beta2 * c1 * c1) / rho
                columns = [(level - w00) / rho for level in sorted(levels)]
                for is_lateral, slope, limit_moment, low_u, high_u in edges:
                    if is_lateral:
                        lat = (r1 * lat1 + r2 * c1 * lat2) / rho
                        u = _stationary_weights(rho, w00, l0 + r2 * c0 * lat2, lat, 0.0, slope, limit_moment)
                    else:
                        u = _stationary_weights(rho, w00, n00, alpha, beta, slope, limit_moment)
                    columns.append(np.where((u >= low_u) & (u <= high_u), (u - w00) / rho, np.nan))
                loads = np.stack([np.broadcast_to(c, w00.shape) for c in columns], axis=1)
                row, _, t = _inward(loads, np.full(loads.shape, t_low), np.full(loads.shape, t_high))
                q2_new = np.minimum(np.maximum(c0 + c1 * t, low2), high2)
                total = others[row] + t + q2_new
                if min_fuel is not None:
                    keep = total >= min_fuel * (1 - NOISE)
                    row, t, q2_new = row[keep], t[keep], q2_new[keep]
                if not len(row):
                    continue
                fuel = base_f[first][row].copy()
                fuel[:, i], fuel[:, j] = t, q2_new
                out_s.append(base_s[first][row])
                out_f.append(fuel)
    if not out_s:
        return np.zeros((0, width)), np.zeros((0, len(tanks))), False
    both = np.concatenate([np.concatenate(out_s), np.concatenate(out_f)], axis=1)
    both = both[np.sort(_row_ids(np.round(both, 9))[1])]
    cut = len(both) > LINE_BOUND
    if cut:
        both = both[np.unique(np.linspace(0, len(both) - 1, LINE_BOUND).round().astype(np.int64))]
    return both[:, :width], both[:, width:], cut


def _search(aircraft: Aircraft, category: str, occupant: float, min_fuel: float | None) -> _Search:
    """Enumerate the candidate loadings (at most :data:`SEARCH_BOUND` in the base, :data:`LINE_BOUND`
    along the lines) and evaluate them with the engine."""
    pilots = _pilot_seats(aircraft)
    fuel_states, orders_cut = _fuel_loads(aircraft, min_fuel)
    groups = _group_limits(aircraft)
    room = max(1, SEARCH_BOUND // len(fuel_states))
    notes: list[str] = []
    base = _station_loads(aircraft, occupant, pilots)
    if len(pilots) == 1:  # the pilot is always aboard: the one pilot's seat takes no load without the pilot
        k = aircraft.station.index(pilots[0])
        base[k] = [w for w in base[k] if w >= _pilot_weight(pilots[0], occupant) * (1 - 1e-12)]
    grouped, groups_cut = _fill_loads(aircraft, base, groups, 2)
    if orders_cut:
        notes.append(f"search bound: the minimum fuel was put in the first {_ORDERS:,} orders of the tanks only")
    loads = grouped
    if math.prod(len(v) for v in loads) > room:
        loads, groups_cut = base, groups_cut or base != grouped
    if groups_cut:
        notes.append("search bound: some loads that fill a station group to its maximum were left out")
    total = math.prod(len(v) for v in loads)
    if total > room:
        notes.append(
            f"search bound: {room * len(fuel_states):,} of {total * len(fuel_states):,} candidate loadings "
            "searched; the answer may not be the extreme"
        )
    # a cut search takes combinations spread evenly over all of them, not the first ones
    sizes = [len(v) for v in loads]
    picked = np.unique(np.linspace(0, total - 1, min(total, room)).round().astype(np.int64))
    digits = np.unravel_index(picked, sizes) if sizes else ()
    rows = np.array([np.asarray(v, dtype=float)[d] for v, d in zip(loads, digits, strict=True)]).T.reshape(
        -1, len(aircraft.station)
    )
    index = {s.id: i for i, s in enumerate(aircraft.station)}
    seated = np.zeros(len(rows), dtype=bool)
    for pilot in pilots:
        seated |= rows[:, index[pilot.id]] >= _pilot_weight(pilot, occupant) * (1 - 1e-12)
    rows = rows[seated]
    if not len(rows):
        raise InputError(Problem("station", "no loading searched seats the pilot: the search bound cut them all"))
    fuel = np.array(fuel_states, dtype=float).reshape(len(fuel_states), len(aircraft.tank))
    stations = np.repeat(rows, len(fuel), axis=0)
    fuels = np.tile(fuel, (len(rows), 1))
    # along each line from a permitted base loading: the loads where the least margin can lie between its ends
    stations, fuels, found, cut = _with_line_loads(aircraft, category, stations, fuels, min_fuel)
    if cut:
        notes.append(
            f"search bound: {LINE_BOUND:,} of the part loads along one station or tank were searched; the answer may "
            "not be the extreme"
        )
    # two tanks with arm tables traded against each other at one weight, along the ray where that trade is
    # stationary, from the base
    ray_stations, ray_fuels, rays_cut = _ray_loads(
        aircraft, category, stations, fuels, found, found["permitted"], min_fuel
    )
    if rays_cut:
        notes.append(
            f"search bound: {LINE_BOUND:,} of the loadings with two tanks with arm tables traded against each other "
            "were searched; the answer may not be the extreme"
        )
    if len(ray_stations):
        ray = _evaluate(aircraft, category, ray_stations, ray_fuels)
        stations = np.concatenate([stations, ray_stations])
        fuels = np.concatenate([fuels, ray_fuels])
        found = {key: np.concatenate([found[key], ray[key]]) for key in found}
    # a tank with an arm table traded against another item at one weight: held at each quantity where that
    # trade can leave the least margin, the rest searched again
    held_stations, held_fuels, held, held_notes = _trade_loads(aircraft, category, rows, min_fuel)
    notes += held_notes
    if len(held_stations):
        stations = np.concatenate([stations, held_stations])
        fuels = np.concatenate([fuels, held_fuels])
        found = {key: np.concatenate([found[key], held[key]]) for key in found}
    n = len(stations)
    return _Search(
        stations,
        fuels,
        found["permitted"],
        {c: found[f"weight.{c}"] for c in ("ramp", "zero_fuel")},
        {c: found[f"arm.{c}"] for c in ("ramp", "zero_fuel")},
        {c: found[f"lateral.{c}"] for c in ("ramp", "zero_fuel")},
        notes,
        n,
    )


def _static(aircraft: Aircraft, category: str, stations: np.ndarray, fuel: np.ndarray) -> ResolvedLoading:
    """A candidate as a loading at one fuel state (no taxi, no trip)."""
    full = {t.id: float(fuel[k]) for k, t in enumerate(aircraft.tank)}
    load = {s.id: float(stations[k]) for k, s in enumerate(aircraft.station) if stations[k] != 0.0}
    density = {t.id: aircraft.density(t) for t in aircraft.tank}
    return ResolvedLoading(category, load, full, density, 0.0, 0.0, None, BurnPlan(full, None))


def _side_margin(check: CheckResult, side: Side, zero_fuel_limit: bool) -> float | None:
    """The least margin of a checked loading to that side's limit at its own weight [arm unit]."""
    names: tuple[ConditionName, ...] = ("ramp", "takeoff", "landing")
    if zero_fuel_limit:
        names += ("zero_fuel",)
    found = [getattr(check.condition(n).margins, _MARGIN[side]) for n in names]
    margins = [m for m in found if m is not None]
    return min(margins) if margins else None


def _shortlist(weights: np.ndarray, values: np.ndarray, rows: np.ndarray) -> np.ndarray:
    """Of the rows of each weight, those with the least value (every one of equals: they may
    differ on another limit)."""
    if not len(rows):
        return rows
    w = np.round(weights[rows], 6)
    v = values[rows]
    order = np.lexsort((rows, v, w))
    start = np.ones(len(order), dtype=bool)
    start[1:] = w[order][1:] != w[order][:-1]
    first = np.maximum.accumulate(np.where(start, np.arange(len(order)), 0))
    least = v[order][first]
    keep = v[order] <= least + 1e-9 * np.maximum(1.0, np.abs(least))
    return np.sort(rows[order[keep]])


def _pick(aircraft: Aircraft, category: str, found: _Search, side: Side) -> tuple[int, float | None, int]:
    """The candidate of least margin to the side's limit: its row, margin and the number of candidates checked."""
    zero_fuel_limit = aircraft.limits.zero_fuel_cg == "limit"
    rows = np.flatnonzero(found.permitted)
    if not len(rows):  # nothing permitted: the lightest candidate, which the check refuses (fail closed)
        return int(np.argmin(found.weight["ramp"])), None, 0
    lateral = side in ("left", "right")
    chosen = []
    for condition in ("ramp", "zero_fuel") if zero_fuel_limit else ("ramp",):
        values = (found.lateral_arm if lateral else found.arm)[condition] * _TOWARD[side]
        chosen.append(_shortlist(found.weight[condition], values, rows))
    short = np.unique(np.concatenate(chosen))
    best: tuple[float, int, bool] | None = None  # margin, row, within every limit
    for start in range(0, len(short), _CHUNK):
        part = short[start : start + _CHUNK]
        checks = check_many(aircraft, [_static(aircraft, category, found.stations[i], found.fuel[i]) for i in part])
        for i, check in zip(part, checks, strict=True):
            margin = _side_margin(check, side, zero_fuel_limit)
            if margin is None:
                continue
            # the least margin; of equal margins, one out of some other limit first (fail closed)
            if best is None or margin < best[0] - 1e-9 or (margin <= best[0] + 1e-9 and best[2] and not check.ok):
                best = (margin, int(i), check.ok)
    if best is None:
        return int(rows[0]), None, len(short)
    return best[1], best[0], len(short)


def _seat_note(
    name: str, people: int, aboard: int, occupant: float, total: float, least: float, mass: str, where: str
) -> str:
    """How a seat station was loaded, in words."""
    others = people - aboard
    plural = "s" if others > 1 else ""
    if aboard and not others:
        lighter = ""
        if total < occupant - 1e-9:
            lighter = "at the seat's minimum weight " if math.isclose(total, least) else "at the station's maximum "
        return f"{name}: the pilot {lighter}({fmt(total, mass)}), {where}"
    what = f"{others} occupant{plural} at {fmt(occupant, mass)}"
    if aboard:
        what = f"the pilot and {what}"
    if people > 1 or not math.isclose(total, people * occupant):
        what += f" ({fmt(total, mass)})"
    return f"{name}: {what}, {where}"


def _load_words(aircraft: Aircraft, category: str, check: CheckResult, loading: ResolvedLoading) -> dict[str, str]:
    """What each part load of the loading is (a station's load or a tank's fuel strictly inside its
    range), by the target of :func:`_targets` it equals: ``{station or tank id: words}``."""
    ramp, zero = check.condition("ramp"), check.condition("zero_fuel")
    state = _State(
        np.array([ramp.weight]),
        np.array([ramp.moment]),
        np.array([ramp.lateral_moment or 0.0]),
        np.array([zero.weight]),
        np.array([zero.moment]),
        np.array([zero.lateral_moment or 0.0]),
        np.array([[loading.stations.get(s.id, 0.0) for s in aircraft.station]]),
        np.array([[loading.fuel.get(t.id, 0.0) for t in aircraft.tank]]),
    )
    words = {}
    for line in _lines(aircraft):
        item = aircraft.tank[line.column] if line.tank else aircraft.station[line.column]
        value = float((state.fuel if line.tank else state.stations)[0, line.column])
        if not line.low + 1e-9 < value < line.high * (1 - 1e-12):
            continue
        loads, what = _targets(aircraft, category, line, state)
        for load, text in zip(loads[0], what, strict=True):
            if math.isfinite(load) and math.isclose(load, value, rel_tol=1e-6, abs_tol=1e-6):
                words[item.id] = text
                break
        else:
            if line.tank and line.arm is None:  # held where a trade at one weight leaves the least margin
                for load, text in _held_quantities(aircraft, line.column):
                    if math.isclose(load, value, rel_tol=1e-6, abs_tol=1e-6):
                        words[item.id] = text
                        break
    return words


def _limit_at_weight(aircraft: Aircraft, category: str, check: CheckResult, side: Side) -> float:
    """The side's limit at the loading's ramp weight: its CG less (or plus) the margin [arm unit];
    where the envelope gives no CG range at that weight, its most forward (rearward) arm, or
    the centreline for a lateral limit."""
    ramp = check.condition("ramp")
    margin = getattr(ramp.margins, _MARGIN[side])
    at = _lateral(ramp.lateral_arm) if side in ("left", "right") else ramp.arm
    if margin is not None:
        return at - margin if _TOWARD[side] > 0 else at + margin
    if side in ("left", "right"):
        return 0.0
    arms = [a for e in aircraft.envelopes_for(category) if not e.is_lateral for a in e.shape.arm_range()]
    if not arms:
        raise InputError(Problem("envelope", f"no longitudinal envelope in category {category!r}"))
    return min(arms) if side == "forward" else max(arms)


def _notes(
    aircraft: Aircraft,
    side: Side,
    limit: float,
    stations: dict[str, float],
    fuel: dict[str, float],
    occupant: float,
    min_fuel: float | None,
    parts: dict[str, str],
) -> list[str]:
    """How the extreme loading is made up, station by station and tank by tank, in words; ``parts``
    says what each part load is (:func:`_load_words`)."""
    units = aircraft.units
    mass = units.mass
    lateral = side in ("left", "right")
    toward = _TOWARD[side]

    def position(arm: float, lateral_arm: float | None) -> float:
        return _lateral(lateral_arm) if lateral else arm

    def beyond(where: float) -> bool:
        return (where - limit) * toward < 0

    words = _BEYOND[side]
    moving = f"not {words} limit at this weight, but loading it leaves less margin to that limit"
    least_here = f"not {words} limit at this weight, but this load leaves the least margin to that limit"
    pilots = _pilot_seats(aircraft)
    seated = [p for p in pilots if stations.get(p.id, 0.0) >= _pilot_weight(p, occupant) * (1 - 1e-12)]
    pilot = min(seated, key=lambda s: toward * position(s.arm, s.lateral_arm)) if seated else None
    extreme_seat = min(pilots, key=lambda s: toward * position(s.arm, s.lateral_arm))
    notes: list[str] = []
    loaded = sorted(
        (s for s in aircraft.station),
        key=lambda s: toward * (position(s.arm, s.lateral_arm) - limit),
    )
    seats_taken = [s for s in aircraft.station if s.kind == "seat" and stations.get(s.id, 0.0) > 0]
    for station in loaded:
        weight = stations.get(station.id, 0.0)
        least = station.min_weight or 0.0
        where = position(station.arm, station.lateral_arm)
        suffix = f"{words} limit" if beyond(where) else moving
        aboard_from = _pilot_weight(station, occupant) if station in pilots else _occupant_weight(station, occupant)
        if station.kind == "seat" and weight >= aboard_from * (1 - 1e-12):
            aboard = 1 if station is pilot else 0
            people = max(1, round(weight / occupant)) if weight >= occupant * (1 - 1e-12) else 1
            if aboard and people == 1 and not beyond(where):
                alone = "" if any(s is not station for s in seats_taken) else " alone"
                seat = f"the {_FARTHEST[side]} seat" if station is extreme_seat else "a seat"
                lighter = (
                    " at the seat's minimum weight" if weight < occupant - 1e-9 and math.isclose(weight, least) else ""
                )
                notes.append(
                    f"{station.name}: the pilot{alone}{lighter} ({fmt(weight, mass)}), in {seat} with controls"
                )
            else:
                notes.append(_seat_note(station.name, people, aboard, occupant, weight, least, mass, suffix))
        elif weight > least + 1e-9:
            full = station.max_weight is not None and weight >= station.max_weight * (1 - 1e-12)
            if full:
                notes.append(f"{station.name}: at its maximum ({fmt(weight, mass)}), {suffix}")
            else:
                what = parts.get(station.id, "a part load the search tried")
                notes.append(
                    f"{station.name}: {fmt(weight, mass)}, {what}, {f'{words} limit' if beyond(where) else least_here}"
                )
        elif least:
            notes.append(f"{station.name}: at its minimum ({fmt(least, mass)})")
        elif station.max_weight is None and station.kind != "seat" and beyond(where):
            notes.append(f"{station.name}: no maximum weight given, left at its minimum")
    volume = units.fuel_volume
    total = sum(fuel.values())
    at_minimum = min_fuel is not None and total <= min_fuel + 1e-9
    partial = [t for t in aircraft.tank if 0.0 < fuel.get(t.id, 0.0) < t.usable * (1 - 1e-12)]
    for tank in aircraft.tank:
        quantity = fuel.get(tank.id, 0.0)
        if quantity >= tank.usable * (1 - 1e-12) and not at_minimum:
            where = position(float(tank.arm_at(tank.usable)), tank.lateral_arm)
            lies = f", the tank lies {words} limit" if beyond(where) else ""
            notes.append(f"{tank.name}: full ({fmt(tank.usable, volume)}){lies}")
        elif tank in partial and not at_minimum:
            what = parts.get(tank.id, "a part load the search tried")
            notes.append(f"{tank.name}: {fmt(quantity, volume)}, {what}")
    if min_fuel is not None and aircraft.tank:
        holding = [
            t for t in aircraft.tank if fuel.get(t.id, 0.0) > 0 and (at_minimum or fuel[t.id] < t.usable * (1 - 1e-12))
        ]
        if at_minimum and len(holding) == 1:  # one figure for one amount: the tank holds all of it
            spread = holding[0].name
        else:
            spread = ", ".join(
                f"{t.name} {'full, ' if fuel[t.id] >= t.usable * (1 - 1e-12) else ''}{fmt(fuel[t.id], volume)}"
                for t in holding
            )
        if at_minimum:
            notes.append(f"minimum fuel for balance, {fmt(min_fuel, volume, 'up')} (METO/12 US gal), in {spread}")
        elif partial:
            notes.append(
                f"the fuel is more than the minimum fuel for balance ({fmt(min_fuel, volume, 'up')}, METO/12 US gal)"
            )
        else:
            notes.append(
                f"the full tanks hold the minimum fuel for balance ({fmt(min_fuel, volume, 'up')}, "
                "METO/12 US gal) and more; the others are empty"
            )
    return notes


def _case(
    aircraft: Aircraft,
    category: str,
    side: Side,
    found: _Search,
    occupant: float,
    min_fuel: float | None,
) -> ExtremeCase:
    row, _, checked = _pick(aircraft, category, found, side)
    units = aircraft.units
    stations = {
        s.id: float(found.stations[row, k]) for k, s in enumerate(aircraft.station) if found.stations[row, k] != 0.0
    }
    full = {t.id: float(found.fuel[row, k]) for k, t in enumerate(aircraft.tank)}
    density = {t.id: aircraft.density(t) for t in aircraft.tank}
    plan = BurnPlan(full, None)
    down_to = min(min_fuel if min_fuel is not None else 0.0, plan.burnable)
    loading = ResolvedLoading(category, stations, full, density, 0.0, plan.burnable - down_to, None, plan)
    check = replace(check_loading(aircraft, loading), caution=MECHANIC_CAUTION)
    limit = _limit_at_weight(aircraft, category, check, side)
    notes = _notes(
        aircraft, side, limit, stations, full, occupant, min_fuel, _load_words(aircraft, category, check, loading)
    )
    permitted = int(found.permitted.sum())
    if permitted:
        notes.append(
            f"found by a search of {found.enumerated:,} candidate loadings ({permitted:,} within the station, group "
            f"and weight limits, {checked:,} checked): the least margin to the {side} limit at its own weight"
        )
    else:
        notes.append(
            f"none of the {found.enumerated:,} candidate loadings, each with the pilot aboard and the minimum fuel, "
            "is within the station, group and weight limits: the lightest is shown"
        )
    heavier = [
        st.name
        for st in aircraft.station
        if st.kind == "seat" and (st.max_weight is None or st.max_weight > (st.seats or 1) * occupant * (1 + 1e-12))
    ]
    if heavier:  # the search's convention said where it is read, never only in the docs
        notes.append(
            f"occupants are at the standard weight ({fmt(occupant, aircraft.units.mass)} each), as AC 43.13-1B "
            "10-17 takes them: "
            f"a heavier occupant, which the maximum of {', '.join(heavier)} permits, is not covered by this check"
        )
    notes += found.notes
    start = plan.burnable
    volume = units.fuel_volume
    # the range stated lies within the range checked (its top rounded down, its foot up), and the
    # minimum fuel reads as in the note above (rounded up): one figure for one amount
    if start <= down_to + 1e-9:
        states = f"at {fmt(start, volume, 'up')} of fuel" if start > 0 else "with no usable fuel"
    else:
        end = "the minimum fuel for balance" if min_fuel is not None else "zero usable fuel"
        states = (
            f"from {fmt(start, volume, 'down')} at engine start down to {end} ({fmt(down_to, volume, 'up')}), "
            "every tank burning in proportion to its fuel"
        )
    complete = not any(note.startswith("search bound") for note in found.notes)
    return ExtremeCase(
        side=side, ok=check.ok, limit_arm=limit, notes=notes, fuel_states=states, check=check, complete=complete
    )


def extremes(
    aircraft: Aircraft,
    *,
    category: str | None = None,
    occupant_weight: float | None = None,
    meto_hp: float | str | None = None,
) -> ExtremesResult:
    """The most forward and most rearward loadings the stations permit, each checked in full.

    Parameters
    ----------
    category : envelope category (default the aircraft's first)
    occupant_weight : standard occupant [mass unit]; default the aircraft file's, else
        170 lb (AC 43.13-1B figures 10-10 and 10-11)
    meto_hp : maximum-except-takeoff power [hp]; default the aircraft file's

    Returns
    -------
    ExtremesResult
        ``ok`` where both extremes pass the full check over the fuel range each covers.

    References
    ----------
    AC 43.13-1B chapter 10, paragraph 10-17 and figures 10-10, 10-11; 10-2 p (minimum fuel).
    """
    chosen = aircraft.category(category)
    occupant = standard_occupant(aircraft, occupant_weight)
    hp = meto_hp if meto_hp is not None else aircraft.meto_power_hp
    min_fuel = minimum_fuel(aircraft, hp) if hp is not None else None
    envelopes = aircraft.envelopes_for(chosen)
    if not any(not e.is_lateral for e in envelopes):
        raise InputError(Problem("envelope", f"no longitudinal envelope in category {chosen!r}"))
    found = _search(aircraft, chosen, occupant, min_fuel)
    sides: list[Side] = ["forward", "rearward"]
    if any(e.is_lateral for e in envelopes):
        sides += ["left", "right"]
    cases = {side: _case(aircraft, chosen, side, found, occupant, min_fuel) for side in sides}
    return ExtremesResult(
        aircraft=aircraft.name,
        category=chosen,
        occupant_weight=occupant,
        minimum_fuel=min_fuel,
        ok=all(c.ok and c.complete for c in cases.values()),  # a search cut short establishes no extreme
        forward=cases["forward"],
        rearward=cases["rearward"],
        left=cases.get("left"),
        right=cases.get("right"),
    )
