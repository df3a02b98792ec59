"""The engine: every limit rule, once, for N loadings of one aircraft at once.

:func:`evaluate` takes arrays (N loadings x stations, N x tanks, taxi, trip) in the
aircraft's own units and returns an :class:`Evaluation`: weight, moment and lateral
moment of each condition, the verdict of each condition, each weight limit, each
envelope, each station and group limit, and of the whole burn path. Every answer of the
library rests on it: :func:`loadcheck.check.check_loading` is this engine on one loading
plus an explanation (margins, findings in words, where the path leaves); planning, the
loading schedule, the extreme loadings and the fleet check call the same engine, through
the check or directly. No limit rule exists anywhere else in the library.

The rules (DESIGN.md, "Conditions checked"):

- the four conditions: ramp = empty weight + stations + fuel at engine start; takeoff =
  ramp less taxi fuel; landing = takeoff less trip fuel; zero fuel = ramp less all usable
  fuel (:data:`CONDITIONS`, :func:`tank_quantities`);
- the weight limits of each condition (:func:`weight_limits`) and the minimum flight
  weight at takeoff and landing;
- every envelope of the category at every condition; at ramp a weight above the
  envelope's top by no more than the ramp allowance (max ramp less max takeoff weight) is
  held to the top, with the CG kept; above that it is tested as it is (:func:`envelope_state`);
- each station's and each station group's maximum and minimum (:func:`load_limits`);
- the fuel-burn path from takeoff to landing, in the burn order, tested exactly.

The burn path is checked exactly, not by sampling. For every axis pair an envelope may
use, the condition "the path meets an edge line" is a polynomial of degree at most two in
the fuel burned (after multiplying through by the positive weight), also for tanks whose
arm moves with quantity (:meth:`loadcheck.envelope.EnvelopeShape.edge_polynomials`). Its
roots are found in closed form for all loadings at once. A piece of path on which no root
falls on an actual edge stays on one side of the boundary, so one containment test at its
middle settles it; the pieces that touch an edge are split at every root and each part is
tested at its middle. Before that, a loading whose path is shown inside by the ends of its
straight pieces alone (fixed tank arms; :func:`_path_settled`, a proven sufficient
condition, docs/computation.md) is settled without it, with the same verdict.

Limits are inclusive: a weight equal to its limit within :data:`WEIGHT_TOLERANCE` of the
limit is within it; envelope containment uses :data:`loadcheck.envelope.TOLERANCE`.

References
----------
FAA-H-8083-1B chapter 2 (sum of moments, CG = total moment / total weight);
AC 43.13-1B chapter 10 section 1 (loading conditions).
"""

from __future__ import annotations

from collections.abc import Sequence
from dataclasses import dataclass, fields
from typing import Any

import numpy as np

from .aircraft import Aircraft, Envelope
from .envelope import FAST_COVERS_FROM, EnvelopeShape, quadratic_roots
from .loading import ResolvedLoading

__all__ = [
    "BLAS_ONE_THREAD_ABOVE",
    "CHUNK",
    "CONDITIONS",
    "WEIGHT_TOLERANCE",
    "Evaluation",
    "LoadLimit",
    "LoadingArrays",
    "envelope_state",
    "evaluate",
    "evaluate_arrays",
    "load_limits",
    "load_room",
    "loading_arrays",
    "path_states",
    "path_states_many",
    "ramp_allowance",
    "tank_quantities",
    "weight_limits",
]

CONDITIONS = ("ramp", "takeoff", "landing", "zero_fuel")
"""The four loading conditions, in the order they are checked and reported."""

WEIGHT_TOLERANCE = 1e-9
"""A weight equal to its limit within this fraction of the limit is within the limit."""

CHUNK = 32_768
"""Loadings evaluated together; larger batches are cut into chunks of this size so that
the working arrays stay in cache and memory stays bounded."""

_EDGE_SLACK = 1e-9  # how far past an edge's ends a crossing still counts (scaled units)

BLAS_ONE_THREAD_ABOVE = 256
"""Batches larger than this are evaluated with the BLAS library held to one thread.

The engine's products are tiny (a few stations, tanks or edges wide): a BLAS thread pool
only wakes threads that spin for them, doubling the CPU time and halving the throughput
when another process is busy. Single-threaded BLAS is still the fastest way to take them
(measured on (32,768 x 6): matmul 89 us, einsum 301 us, a loop over columns 231 us), so
large batches run under a one-thread limit set with threadpoolctl (setting it costs about
20 us); smaller ones are below the size at which BLAS starts threads."""

_CONTROLLER: Any = None


def _dot(a: np.ndarray, b: np.ndarray) -> np.ndarray:
    """``a @ b`` over the last axis of ``a`` (one BLAS thread for large batches, see :data:`BLAS_ONE_THREAD_ABOVE`)."""
    return np.asarray(a @ b)


def _one_blas_thread() -> Any:
    """A context in which the BLAS library uses one thread (threadpoolctl, loaded on first use)."""
    global _CONTROLLER
    if _CONTROLLER is None:
        from threadpoolctl import ThreadpoolController

        _CONTROLLER = ThreadpoolController()
    return _CONTROLLER.limit(limits=1, user_api="blas")


# -- the rules as data ---------------------------------------------------------------------


def weight_limits(aircraft: Aircraft) -> dict[str, list[tuple[str, float]]]:
    """The weight limits of each condition: ``{condition: [(code, limit)]}`` [mass unit].

    Maximum ramp weight at ramp (it defaults to the maximum takeoff weight), maximum
    takeoff weight at takeoff, maximum landing weight at landing (default the maximum
    takeoff weight), maximum zero-fuel weight at zero fuel where the file gives one
    (DESIGN.md, "Conditions checked"). The minimum flight weight is not in this table: it
    holds at takeoff and landing, from below (:func:`evaluate`).
    """
    limits = aircraft.limits
    table: dict[str, list[tuple[str, float | None]]] = {
        "ramp": [("max_ramp_weight", limits.ramp)],
        "takeoff": [("max_takeoff_weight", limits.max_takeoff_weight)],
        "landing": [("max_landing_weight", limits.landing)],
        "zero_fuel": [("max_zero_fuel_weight", limits.max_zero_fuel_weight)],
    }
    return {name: [(code, value) for code, value in rows if value is not None] for name, rows in table.items()}


MIN_FLIGHT_WEIGHT_CONDITIONS = ("takeoff", "landing")
"""Conditions at which the minimum flight weight applies."""


@dataclass(frozen=True)
class LoadLimit:
    """A maximum or minimum of a station or of a station group.

    Attributes
    ----------
    code : finding code: station_max, station_min, group_max or group_min
    subject : the station id, or the group's id (its label where it has none)
    label : its name in words
    members : indices of the stations it sums, in ``aircraft.station`` order
    limit : the maximum or minimum [mass unit]
    """

    code: str
    subject: str
    label: str
    members: tuple[int, ...]
    limit: float

    @property
    def is_max(self) -> bool:
        """True for a maximum, False for a minimum."""
        return self.code.endswith("_max")

    @property
    def threshold(self) -> float:
        """The loaded weight past which the limit is exceeded: the limit widened by the
        tolerance (inclusive limits) [mass unit]."""
        return self.limit * (1 + WEIGHT_TOLERANCE) + 1e-12 if self.is_max else self.limit * (1 - WEIGHT_TOLERANCE)

    def exceeded(self, loaded: np.ndarray) -> np.ndarray:
        """True where the loaded weight [mass unit] is beyond this limit (inclusive limits)."""
        return _beyond(np.asarray(loaded), np.asarray(self.threshold), np.asarray(self.is_max))


def _beyond(loaded: np.ndarray, threshold: np.ndarray, is_max: np.ndarray) -> np.ndarray:
    """The rule of every station and group limit: above a maximum's threshold, below a minimum's."""
    return np.asarray(np.where(is_max, loaded > threshold, loaded < threshold))


def load_limits(aircraft: Aircraft) -> list[LoadLimit]:
    """Every station and station-group limit, stations first, each maximum before its minimum."""
    index = {s.id: i for i, s in enumerate(aircraft.station)}
    subjects: list[tuple[str, str, tuple[int, ...], float | None, float | None, str]] = [
        (s.id, s.name, (index[s.id],), s.max_weight, s.min_weight, "station") for s in aircraft.station
    ]
    subjects += [
        (g.id or g.label, g.label, tuple(index[m] for m in g.stations), g.max_weight, g.min_weight, "group")
        for g in aircraft.station_group
    ]
    out = []
    for key, label, members, most, least, kind in subjects:
        if most is not None:
            out.append(LoadLimit(f"{kind}_max", key, label, members, most))
        if least is not None:
            out.append(LoadLimit(f"{kind}_min", key, label, members, least))
    return out


def load_room(aircraft: Aircraft, stations: dict[str, float], station: str) -> float:
    """What a station can still take within its own maximum and its groups' maxima [mass unit].

    ``stations`` is the weight already at each station; infinite where no maximum applies.
    """
    ids = [s.id for s in aircraft.station]
    column = ids.index(station)
    room = float("inf")
    for rule in _tables(aircraft).loads:
        if rule.is_max and column in rule.members:
            loaded = sum(stations.get(ids[i], 0.0) for i in rule.members)
            room = min(room, rule.limit - loaded)
    return max(0.0, room)


def ramp_allowance(aircraft: Aircraft) -> float:
    """The ramp allowance: maximum ramp weight less maximum takeoff weight [mass unit].

    The weight allowed for start, taxi and run-up fuel; 0 where the file gives no maximum
    ramp weight (common practice).
    """
    limits = aircraft.limits
    return 0.0 if limits.max_ramp_weight is None else limits.max_ramp_weight - limits.max_takeoff_weight


def envelope_state(
    shape: EnvelopeShape, condition: str, weight: Any, moment: Any, lateral: Any, *, allowance: float
) -> tuple[Any, Any, Any]:
    """The state tested against an envelope: at ramp, a weight a little above the envelope's top is held to the top.

    The envelope is a flight envelope; before taxi the aircraft may be heavier than its
    top by the start, taxi and run-up fuel. At ramp a weight above the envelope's top is
    held to the top, with the CG kept, only while it is within the ramp allowance of that
    top: weight <= (top + allowance) (1 + WEIGHT_TOLERANCE), the allowance being the
    maximum ramp weight less the maximum takeoff weight (:func:`ramp_allowance`, 0 where
    the file gives no maximum ramp weight). Above that the state is tested as it is, so it
    is outside the envelope (fail closed; common practice). The ramp weight itself is
    tested against the maximum ramp weight as well (:func:`weight_limits`). Works on plain
    floats and on arrays alike.

    Parameters
    ----------
    shape : the envelope
    condition : one of :data:`CONDITIONS`; only ``ramp`` is ever held
    weight, moment, lateral : the state [mass unit, mass unit * arm unit]
    allowance : the ramp allowance [mass unit] (:func:`ramp_allowance`)
    """
    top = shape.max_weight
    if condition != "ramp" or top is None:
        return weight, moment, lateral
    reach = (top + allowance) * (1 + WEIGHT_TOLERANCE)
    if isinstance(weight, float):
        factor = top / weight if top < weight <= reach else 1.0
        return weight * factor, moment * factor, lateral * factor
    w = np.asarray(weight)
    scale = np.where((w > top) & (w <= reach), top / w, 1.0)
    if np.ndim(scale) == 0:
        factor = float(scale)
        return weight * factor, moment * factor, lateral * factor
    return weight * scale, moment * scale, lateral * scale


@dataclass(frozen=True)
class _Tables:
    """An aircraft's rules and arms as arrays, built once per aircraft."""

    arms: np.ndarray
    lats: np.ndarray
    tank_lats: np.ndarray
    usable: np.ndarray
    density: np.ndarray
    tank_index: dict[str, int]
    weights: dict[str, list[tuple[str, float]]]
    loads: list[LoadLimit]
    station_ids: list[str]
    tank_ids: list[str]
    envelopes: dict[str, tuple[list[Envelope], list[EnvelopeShape]]]
    has_lateral: bool
    load_members: np.ndarray  # (S, L): 1 where station S counts towards load limit L
    load_threshold: np.ndarray  # (L,) LoadLimit.threshold
    load_is_max: np.ndarray  # (L,) LoadLimit.is_max
    allowance: float  # ramp_allowance
    fixed_arms: np.ndarray  # (T,) each tank's arm (0 for a tank with an arm table)
    moving: tuple[int, ...]  # the tanks with an arm table (Tank.arm_at)
    test_order: dict[tuple[str, int, bool], tuple[np.ndarray, np.ndarray]]  # _test_order, filled as used


_TABLES: dict[int, tuple[Aircraft, _Tables]] = {}
_TABLES_KEPT = 64


def _tables(aircraft: Aircraft) -> _Tables:
    """The aircraft's tables (an aircraft model is immutable, so they are kept for it)."""
    kept = _TABLES.get(id(aircraft))
    if kept is not None and kept[0] is aircraft:
        return kept[1]
    loads = load_limits(aircraft)
    members = np.zeros((len(aircraft.station), len(loads)))
    for column, rule in enumerate(loads):
        members[list(rule.members), column] = 1.0
    tables = _Tables(
        arms=np.array([s.arm for s in aircraft.station], dtype=float),
        lats=np.array([s.lateral_arm or 0.0 for s in aircraft.station], dtype=float),
        tank_lats=np.array([t.lateral_arm or 0.0 for t in aircraft.tank], dtype=float),
        usable=np.array([t.usable for t in aircraft.tank], dtype=float),
        density=np.array([aircraft.density(t) for t in aircraft.tank], dtype=float),
        tank_index={t.id: i for i, t in enumerate(aircraft.tank)},
        weights=weight_limits(aircraft),
        loads=loads,
        station_ids=[s.id for s in aircraft.station],
        tank_ids=[t.id for t in aircraft.tank],
        envelopes={
            c: (aircraft.envelopes_for(c), [e.shape for e in aircraft.envelopes_for(c)]) for c in aircraft.categories
        },
        has_lateral=aircraft.has_lateral,
        load_members=members,
        load_threshold=np.array([rule.threshold for rule in loads], dtype=float),
        load_is_max=np.array([rule.is_max for rule in loads], dtype=bool),
        allowance=ramp_allowance(aircraft),
        fixed_arms=np.array([0.0 if t.arm_table is not None else t.arm_at(0.0) for t in aircraft.tank], dtype=float),
        moving=tuple(i for i, t in enumerate(aircraft.tank) if t.arm_table is not None),
        test_order={},
    )
    if len(_TABLES) >= _TABLES_KEPT:
        _TABLES.pop(next(iter(_TABLES)))
    _TABLES[id(aircraft)] = (aircraft, tables)
    return tables


# -- fuel ---------------------------------------------------------------------------------


def tank_quantities(fuel: np.ndarray, burned: np.ndarray, order: Sequence[int] | None) -> np.ndarray:
    """Quantity in each tank after fuel is burned, for every loading.

    With the order ``together`` (None) every tank gives fuel in proportion to what it held
    at engine start; with a list of tank indices each tank is emptied to zero before the
    next one feeds (DESIGN.md, "Conditions checked").

    Parameters
    ----------
    fuel : (N, T) quantity in each tank at engine start [fuel volume unit]
    burned : (N, K) fuel burned since engine start [fuel volume unit]
    order : None, or tank indices in burn order

    Returns
    -------
    numpy.ndarray
        (N, K, T) quantities [fuel volume unit].
    """
    start = fuel[:, None, :]
    if order is None:
        total = fuel.sum(axis=1)[:, None]
        # divided by a positive total or by 1: no warning to hold off (an errstate costs more than this)
        positive = total > 0  # np.minimum(np.maximum()) is np.clip, in two cheap calls
        share = np.where(positive, np.minimum(np.maximum(1.0 - burned / np.where(positive, total, 1.0), 0.0), 1.0), 0.0)
        return start * share[:, :, None]
    left = np.empty((*burned.shape, fuel.shape[1]))
    left[...] = start
    remaining = burned.copy()
    for tank in order:
        used = np.minimum(left[:, :, tank], remaining)
        left[:, :, tank] -= used
        remaining -= used
    return left


def _tank_arms(aircraft: Aircraft, quantities: np.ndarray) -> np.ndarray:
    """Arm of each tank's fuel at the given quantities (..., T) [arm unit] (:meth:`Tank.arm_at`).

    A tank without an arm table has the one arm whatever its quantity: those columns are
    the tables' ``fixed_arms``."""
    tables = _tables(aircraft)
    arms = np.empty_like(quantities)
    arms[...] = tables.fixed_arms
    for index in tables.moving:
        arms[..., index] = aircraft.tank[index].arm_at(quantities[..., index])
    return arms


def _tank_sums(tables: _Tables, mass: np.ndarray, arms: np.ndarray | None) -> tuple[np.ndarray, np.ndarray]:
    """Fuel weight and fuel moment summed over the tanks (..., T) -> (...) [mass unit, mass unit * arm unit].

    One tank at a time, each at its own arm (``arms``, :func:`_tank_arms`, where some arm
    moves with quantity; else the fixed arms): the same sums, in the same order, whether an
    arm is fixed or read from a constant table, and cheaper than a reduction over a short
    last axis."""
    if mass.shape[-1] == 0:  # no tank
        return np.zeros(mass.shape[:-1]), np.zeros(mass.shape[:-1])
    weight = mass[..., 0].copy()
    moment = np.empty_like(weight)
    for index in range(mass.shape[-1]):
        arm = arms[..., index] if arms is not None else tables.fixed_arms[index]
        if index == 0:
            np.multiply(mass[..., 0], arm, out=moment)
        else:
            weight += mass[..., index]
            moment += mass[..., index] * arm
    return weight, moment


def _burn_cuts(aircraft: Aircraft, fuel: np.ndarray, order: Sequence[int] | None) -> list[np.ndarray]:
    """Fuel burned since engine start where the path stops being one polynomial (N,) each.

    A tank running dry (sequential burn) and a tank's quantity passing a point of its arm
    table; NaN where a cut does not happen.
    """
    n = fuel.shape[0]
    cuts = []
    if order is not None:
        running = np.zeros(n)
        for tank in order:
            running = running + fuel[:, tank]  # a new array each time: kept as it is
            cuts.append(running)
    moving = _tables(aircraft).moving  # only a tank with an arm table has knots
    total = fuel.sum(axis=1) if moving else np.zeros(n)
    for index in moving:
        tank_data = aircraft.tank[index]
        for knot in tank_data.arm_knots():
            held = fuel[:, index]
            with np.errstate(divide="ignore", invalid="ignore", over="ignore"):
                if order is None:
                    t = np.where(held > knot, total * (1.0 - knot / held), np.nan)
                elif index in order:
                    position = list(order).index(index)
                    before = fuel[:, list(order[:position])].sum(axis=1) if position else 0.0
                    t = np.where(held > knot, before + held - knot, np.nan)
                else:
                    t = np.full(n, np.nan)
            cuts.append(t)
    return cuts


# -- the result -----------------------------------------------------------------------------


@dataclass(frozen=True)
class Evaluation:
    """Arrays of N results (one per loading), every verdict of every rule.

    Attributes
    ----------
    weight, moment, lateral_moment : per condition, (N,) [mass unit, mass unit * arm unit]
    arm, lateral_arm : per condition, (N,) CG and lateral CG [arm unit]
    fuel : per condition, (N, T) quantity in each tank [fuel volume unit]
    fuel_weight : per condition, (N,) mass of the fuel on board [mass unit]
    condition_ok : per condition, inside its envelope(s) and weight limits
    envelope_ok : per condition, inside every envelope of the category
    envelope_inside : per condition, one (N,) array per envelope of the category
    weight_ok : per condition, one (N,) array per entry of :func:`weight_limits`
    min_weight_ok : per condition, above the minimum flight weight where it applies
    limit_ok : per weight limit code (``max_takeoff_weight`` ...), ``min_flight_weight``
        and ``stations`` (every station and group limit), True where it holds
    load_exceeded : (N, L) True where :func:`load_limits` entry L is exceeded
    burn_path_ok : the whole path from takeoff to landing inside the envelopes
    path_outside : with ``explain``: per loading, the stretches of the path outside an
        envelope as (from, to) fuel burned since engine start [fuel volume unit]
    valid : the row could be used (no negative, NaN, over-capacity or over-burn input)
    ok : valid and no limit exceeded (the single check's ``ok``)
    first_finding : code of the first limit exceeded, in the single check's order
        ("" where none, "input" where the row is not valid)
    first_condition : the condition of that finding ("" where none applies)
    """

    weight: dict[str, np.ndarray]
    moment: dict[str, np.ndarray]
    lateral_moment: dict[str, np.ndarray]
    arm: dict[str, np.ndarray]
    lateral_arm: dict[str, np.ndarray]
    fuel: dict[str, np.ndarray]
    fuel_weight: dict[str, np.ndarray]
    condition_ok: dict[str, np.ndarray]
    envelope_ok: dict[str, np.ndarray]
    envelope_inside: dict[str, list[np.ndarray]]
    weight_ok: dict[str, list[np.ndarray]]
    min_weight_ok: dict[str, np.ndarray]
    limit_ok: dict[str, np.ndarray]
    load_exceeded: np.ndarray
    burn_path_ok: np.ndarray
    path_outside: list[list[tuple[float, float]]] | None
    valid: np.ndarray
    ok: np.ndarray
    first_finding: np.ndarray
    first_condition: np.ndarray


@dataclass(frozen=True)
class LoadingArrays:
    """One resolved loading as the engine's arrays (the rows of a batch of one).

    Attributes
    ----------
    stations : (S,) weight per station, ``aircraft.station`` order [mass unit]
    fuel : (T,) quantity per tank at engine start [fuel volume unit]
    taxi, trip : [fuel volume unit]
    order : None (together) or tank ids in burn order
    density : (T,) per tank [mass unit per fuel volume unit]
    category : envelope category
    """

    stations: np.ndarray
    fuel: np.ndarray
    taxi: float
    trip: float
    order: tuple[str, ...] | None
    density: np.ndarray
    category: str


def loading_arrays(aircraft: Aircraft, loading: ResolvedLoading) -> LoadingArrays:
    """The engine's arrays for one resolved loading."""
    return LoadingArrays(
        stations=np.array([loading.stations.get(s.id, 0.0) for s in aircraft.station], dtype=float),
        fuel=np.array([loading.fuel[t.id] for t in aircraft.tank], dtype=float),
        taxi=loading.taxi,
        trip=loading.trip,
        order=loading.plan.order,
        density=np.array([loading.density[t.id] for t in aircraft.tank], dtype=float),
        category=loading.category,
    )


def evaluate_arrays(
    aircraft: Aircraft,
    base: LoadingArrays,
    *,
    stations: np.ndarray | None = None,
    fuel: np.ndarray | None = None,
    taxi: np.ndarray | None = None,
    trip: np.ndarray | None = None,
) -> Evaluation:
    """Evaluate variations of one loading: any array given replaces the base's value.

    The arrays given must have N rows (stations (N, S), fuel (N, T), taxi and trip (N,));
    the others are repeated from ``base``.
    """
    n = next(len(a) for a in (stations, fuel, taxi, trip) if a is not None)
    return evaluate(
        aircraft,
        stations if stations is not None else np.tile(base.stations, (n, 1)),
        fuel if fuel is not None else np.tile(base.fuel, (n, 1)),
        taxi if taxi is not None else np.full(n, base.taxi),
        trip if trip is not None else np.full(n, base.trip),
        order=base.order,
        category=base.category,
        density=base.density,
    )


# -- evaluation -----------------------------------------------------------------------------


CHUNK_CELLS = 4_000_000
"""At most about this many loading-and-edge pairs are worked on at once: an envelope of
thousands of corners gets smaller chunks, so memory stays bounded and cost linear in
corners and loadings."""


def _chunk(aircraft: Aircraft, category: str | None) -> int:
    """Loadings per chunk for this aircraft's envelopes [count]."""
    edges = sum(len(e.points) for e in aircraft.envelopes_for(aircraft.category(category)))
    return max(64, min(CHUNK, CHUNK_CELLS // max(1, 3 * edges)))


def evaluate(
    aircraft: Aircraft,
    stations: np.ndarray,
    fuel: np.ndarray,
    taxi: np.ndarray,
    trip: np.ndarray,
    *,
    order: Sequence[str] | None = None,
    category: str | None = None,
    density: Sequence[float] | np.ndarray | None = None,
    explain: bool = False,
) -> Evaluation:
    """Evaluate N loadings of one aircraft against every limit.

    Parameters
    ----------
    aircraft : the aircraft
    stations : (N, S) weight at each station, in ``aircraft.station`` order [mass unit]
    fuel : (N, T) quantity in each tank at engine start, ``aircraft.tank`` order [fuel volume unit]
    taxi, trip : (N,) fuel used before takeoff and from takeoff to landing [fuel volume unit]
    order : None to burn together, or tank ids in burn order
    category : envelope category (default the aircraft's first)
    density : per tank [mass unit per fuel volume unit] (default the tanks' own)
    explain : also find every stretch of the burn path outside an envelope
        (``path_outside``), also where takeoff or landing is outside; the verdicts do not
        depend on it

    Returns
    -------
    Evaluation
    """
    stations = np.atleast_2d(np.asarray(stations, dtype=float))
    n = stations.shape[0]
    fuel = np.asarray(fuel, dtype=float).reshape(n, len(aircraft.tank))
    taxi, trip = np.asarray(taxi, dtype=float), np.asarray(trip, dtype=float)
    if taxi.shape != (n,):
        taxi = np.broadcast_to(taxi, (n,))
    if trip.shape != (n,):
        trip = np.broadcast_to(trip, (n,))
    if n <= BLAS_ONE_THREAD_ABOVE:
        return _evaluate(aircraft, stations, fuel, taxi, trip, order, category, density, explain)
    chunk = _chunk(aircraft, category)
    with _one_blas_thread():
        if n <= chunk:
            return _evaluate(aircraft, stations, fuel, taxi, trip, order, category, density, explain)
        parts = [
            _evaluate(
                aircraft,
                stations[i : i + chunk],
                fuel[i : i + chunk],
                taxi[i : i + chunk],
                trip[i : i + chunk],
                order,
                category,
                density,
                explain,
            )
            for i in range(0, n, chunk)
        ]

    def join(field: str) -> Any:
        first = getattr(parts[0], field)
        if first is None:
            return None
        if isinstance(first, dict):
            if isinstance(next(iter(first.values()), None), list):
                return {
                    k: [np.concatenate([getattr(p, field)[k][j] for p in parts]) for j in range(len(v))]
                    for k, v in first.items()
                }
            return {k: np.concatenate([getattr(p, field)[k] for p in parts]) for k in first}
        if isinstance(first, list):
            return [row for p in parts for row in getattr(p, field)]
        return np.concatenate([getattr(p, field) for p in parts])

    return Evaluation(**{f.name: join(f.name) for f in fields(Evaluation)})


def _evaluate(
    aircraft: Aircraft,
    stations: np.ndarray,
    fuel: np.ndarray,
    taxi: np.ndarray,
    trip: np.ndarray,
    order: Sequence[str] | None,
    category: str | None,
    density: Sequence[float] | np.ndarray | None,
    explain: bool,
) -> Evaluation:
    # Written for few numpy calls as well as for large N: the single check is this code at
    # N = 1, where each numpy call costs about a microsecond whatever its size.
    n = stations.shape[0]
    taxi = np.array(taxi, dtype=float)
    trip = np.array(trip, dtype=float)
    tables = _tables(aircraft)
    if category is None or category not in tables.envelopes:
        category = aircraft.category(category)  # the default, or an error naming the known ones
    shapes = tables.envelopes[category][1]
    order_index = None if order is None else [tables.tank_index[t] for t in order]
    rho = tables.density if density is None else np.asarray(density, dtype=float)
    usable = tables.usable
    burnable = fuel.sum(axis=1) if order_index is None else fuel[:, order_index].sum(axis=1)

    # every input finite and not negative, no tank above its capacity, no more burned than can be
    cells = np.concatenate([stations, fuel, taxi[:, None], trip[:, None]], axis=1)
    valid = (
        ((cells >= 0) & (cells < np.inf)).all(axis=1)
        & (fuel <= usable * (1 + 1e-9)).all(axis=1)
        & (taxi + trip <= burnable * (1 + 1e-9))
    )
    if not valid.all():  # an unusable row gets harmless numbers; its verdict is "input"
        stations = np.where(np.isfinite(stations), stations, 0.0)
        fuel = np.where(np.isfinite(fuel), np.clip(fuel, 0.0, usable), 0.0)
        taxi = np.where(np.isfinite(taxi), np.maximum(taxi, 0.0), 0.0)
        trip = np.where(np.isfinite(trip), np.maximum(trip, 0.0), 0.0)

    # payload: empty weight and every station (the zero-fuel state)
    empty = aircraft.empty
    arms, lats, tank_lats = tables.arms, tables.lats, tables.tank_lats
    pay_w = empty.weight + stations.sum(axis=1)
    pay_m = empty.weight * empty.arm + _dot(stations, arms)
    pay_l = empty.weight * (empty.lateral_arm or 0.0) + _dot(stations, lats)

    # fuel at ramp, takeoff and landing; rows of (4, N) in CONDITIONS order, zero fuel last
    burned = np.zeros((n, 3))
    burned[:, 1] = taxi
    burned[:, 2] = taxi + trip
    q = tank_quantities(fuel, burned, order_index)  # (N, 3, T)
    mass = q * rho
    fuel_w = np.zeros((4, n))
    all_m = np.empty((4, n))
    tank_arm = _tank_arms(aircraft, q) if tables.moving else None  # (N, 3, T) where an arm moves
    fuel_w[:3], all_m[:3] = (a.T for a in _tank_sums(tables, mass, tank_arm))
    all_w = pay_w + fuel_w
    all_m[:3] += pay_m
    all_m[3] = pay_m
    all_l = np.empty((4, n))
    all_l[:3] = _dot(mass, tank_lats).T
    all_l[:3] += pay_l
    all_l[3] = pay_l
    weight = dict(zip(CONDITIONS, all_w, strict=True))
    moment = dict(zip(CONDITIONS, all_m, strict=True))
    lateral = dict(zip(CONDITIONS, all_l, strict=True))
    fuel_weight = dict(zip(CONDITIONS, fuel_w, strict=True))
    quantities = {"ramp": q[:, 0], "takeoff": q[:, 1], "landing": q[:, 2], "zero_fuel": np.zeros_like(fuel)}

    limits = aircraft.limits
    table = tables.weights
    always = np.ones(n, dtype=bool)
    always.flags.writeable = False
    limit_ok: dict[str, np.ndarray] = {}
    weight_ok: dict[str, list[np.ndarray]] = {}
    minimum_ok: dict[str, np.ndarray] = {}
    for name in CONDITIONS:
        weight_ok[name] = []
        for code, value in table[name]:
            limit_ok[code] = weight[name] <= value * (1 + WEIGHT_TOLERANCE)
            weight_ok[name].append(limit_ok[code])
        minimum_ok[name] = always
        if name in MIN_FLIGHT_WEIGHT_CONDITIONS and limits.min_flight_weight is not None:
            minimum_ok[name] = weight[name] >= limits.min_flight_weight * (1 - WEIGHT_TOLERANCE)
    if limits.min_flight_weight is not None:
        limit_ok["min_flight_weight"] = _all([minimum_ok[c] for c in MIN_FLIGHT_WEIGHT_CONDITIONS])

    # every envelope at the four conditions at once: one containment call per envelope; where
    # a straight piece of path may be settled by its ends (_path_settled), also the convex
    # parts each state lies in
    # (for a few loadings shapely's containment is cheaper, and the parts are found later, if needed)
    straight = not tables.moving and all(shape.has_straight_parts for shape in shapes)
    together = straight and 4 * n >= FAST_COVERS_FROM
    inside_all = []
    parts_all = []
    for shape in shapes:
        states = _tested_states(shape, all_w, all_m, all_l, tables.allowance)
        if together:
            inside, parts = shape.locate(*states)
            parts_all.append(parts)
        else:
            inside = shape.covers(*states)
        inside_all.append(inside)  # (4, N) each
    per_envelope = {name: [inside[k] for inside in inside_all] for k, name in enumerate(CONDITIONS)}
    every = _all(inside_all) if inside_all else np.ones((4, n), dtype=bool)
    envelope_ok = dict(zip(CONDITIONS, every, strict=True))

    condition_ok = {name: _all([*weight_ok[name], minimum_ok[name], envelope_ok[name]]) for name in CONDITIONS}

    load_exceeded = _loads_exceeded(tables, stations)
    limit_ok["stations"] = np.asarray(~load_exceeded.any(axis=1))

    # a path with an end outside is out already; only paths with both ends inside need the exact test
    ends_in = envelope_ok["takeoff"] & envelope_ok["landing"]
    path_ok = ends_in.copy()
    flying = trip > 0
    rows = np.flatnonzero(flying if explain else (ends_in & flying))
    if straight and ends_in[rows].any():  # a path settled inside by its ends needs no exact test
        if not together:  # the parts of the takeoff and landing states (rows 1 and 2 of (4, N))
            for shape in shapes:
                parts = np.zeros((4, n), dtype=np.int64)
                parts[1:3] = shape.parts(all_w[1:3], all_m[1:3], all_l[1:3])
                parts_all.append(parts)
        settled = _path_settled(tables, shapes, parts_all, fuel, taxi, trip, order_index, rho, pay_w, pay_m, pay_l)
        rows = rows[~settled[rows]]
    path_outside: list[list[tuple[float, float]]] | None = [[] for _ in range(n)] if explain else None
    if len(rows):
        tested_ok, stretches = _burn_path(
            aircraft,
            shapes,
            fuel[rows],
            taxi[rows],
            trip[rows],
            order_index,
            rho,
            tank_lats,
            pay_w[rows],
            pay_m[rows],
            pay_l[rows],
            explain,
            (q[rows, 1:], None if tank_arm is None else tank_arm[rows, 1:]),
        )
        path_ok[rows] &= tested_ok
        if path_outside is not None:
            for k, row in enumerate(rows.tolist()):
                path_outside[row] = stretches[k]
    path_ok = np.where(flying, path_ok, envelope_ok["takeoff"])

    # the first limit exceeded, in the single check's order: every test that holds, stacked
    # (the order of the tests, with each one's code and condition, is _test_order's)
    zero_fuel_cg_is_limit = limits.zero_fuel_cg == "limit"
    holds: list[np.ndarray] = []
    for name in CONDITIONS:
        holds += weight_ok[name]
        holds.append(minimum_ok[name])
        if name != "zero_fuel" or zero_fuel_cg_is_limit:
            holds += per_envelope[name]
    holds.append(path_ok)
    tests = np.concatenate([np.array(holds), ~load_exceeded.T]) if len(tables.loads) else np.array(holds)
    codes, where = _test_order(tables, category, len(shapes), zero_fuel_cg_is_limit)
    first = tests.argmin(axis=0)  # the first test that fails (0 where none does)
    passed = tests.all(axis=0)
    first_finding = np.where(passed, "", codes[first])
    first_condition = np.where(passed, "", where[first])
    first_finding[~valid] = "input"
    first_condition[~valid] = ""

    ok = valid & passed
    return Evaluation(
        weight=weight,
        moment=moment,
        lateral_moment=lateral,
        arm=dict(zip(CONDITIONS, all_m / all_w, strict=True)),
        lateral_arm=dict(zip(CONDITIONS, all_l / all_w, strict=True)),
        fuel=quantities,
        fuel_weight=fuel_weight,
        condition_ok=condition_ok,
        envelope_ok=envelope_ok,
        envelope_inside=per_envelope,
        weight_ok=weight_ok,
        min_weight_ok=minimum_ok,
        limit_ok=limit_ok,
        load_exceeded=load_exceeded,
        burn_path_ok=path_ok,
        path_outside=path_outside,
        valid=valid,
        ok=ok,
        first_finding=first_finding,
        first_condition=first_condition,
    )


def _all(arrays: Sequence[np.ndarray]) -> np.ndarray:
    """Elementwise and of a few boolean arrays (chained ``&``: cheaper than a reduction over a short list)."""
    out = arrays[0]
    for more in arrays[1:]:
        out = out & more
    return out


def _test_order(
    tables: _Tables, category: str, envelopes: int, zero_fuel_cg_is_limit: bool
) -> tuple[np.ndarray, np.ndarray]:
    """The code and the condition of each test :func:`_evaluate` stacks, in the single check's
    order: per condition its weight limits, the minimum flight weight and each envelope (at
    zero fuel only where its CG is a limit), then the burn path, then every station and group
    limit. Object arrays, kept per aircraft and category."""
    key = (category, envelopes, zero_fuel_cg_is_limit)
    kept = tables.test_order.get(key)
    if kept is not None:
        return kept
    codes: list[str] = []
    where: list[str] = []
    for name in CONDITIONS:
        for code, _ in tables.weights[name]:
            codes.append(code)
            where.append(name)
        codes.append("min_flight_weight")
        where.append(name)
        if name != "zero_fuel" or zero_fuel_cg_is_limit:
            codes += ["envelope"] * envelopes
            where += [name] * envelopes
    codes.append("burn_path")
    where.append("")
    codes += [rule.code for rule in tables.loads]
    where += [""] * len(tables.loads)
    kept = (np.array(codes, dtype=object), np.array(where, dtype=object))
    tables.test_order[key] = kept
    return kept


def _loads_exceeded(tables: _Tables, stations: np.ndarray) -> np.ndarray:
    """(N, L): True where load limit L (:func:`load_limits`) is exceeded; each limit sums its stations."""
    return _beyond(_dot(stations, tables.load_members), tables.load_threshold, tables.load_is_max)


def _tested_states(
    shape: EnvelopeShape, weight: np.ndarray, moment: np.ndarray, lateral: np.ndarray, allowance: float
) -> tuple[np.ndarray, np.ndarray, np.ndarray]:
    """The states of the four conditions (rows of (4, N), CONDITIONS order) as tested against
    an envelope: the ramp row held to the envelope's top (:func:`envelope_state`)."""
    top = shape.max_weight
    if top is None or not (weight[0] > top).any():  # no ramp weight above the top: nothing is held
        return weight, moment, lateral
    w, m, lat = weight.copy(), moment.copy(), lateral.copy()
    w[0], m[0], lat[0] = envelope_state(shape, "ramp", weight[0], moment[0], lateral[0], allowance=allowance)
    return w, m, lat


# -- the burn path --------------------------------------------------------------------------


def path_states(
    aircraft: Aircraft,
    stations: np.ndarray,
    fuel: np.ndarray,
    burned: np.ndarray,
    *,
    order: Sequence[str] | None = None,
    density: Sequence[float] | np.ndarray | None = None,
) -> tuple[np.ndarray, np.ndarray, np.ndarray, np.ndarray]:
    """Weight, moment, lateral moment and tank quantities of one loading at points of its burn.

    :func:`path_states_many` of one loading.

    Parameters
    ----------
    stations : (S,) weight at each station [mass unit]
    fuel : (T,) quantity in each tank at engine start [fuel volume unit]
    burned : (K,) fuel burned since engine start [fuel volume unit]

    Returns
    -------
    weight, moment, lateral : (K,) [mass unit, mass unit * arm unit]
    quantities : (K, T) [fuel volume unit]
    """
    stations = np.asarray(stations, dtype=float)
    fuel = np.asarray(fuel, dtype=float)
    return path_states_many(
        aircraft, stations[None, :], fuel[None, :], [np.asarray(burned, dtype=float)], order=order, density=density
    )[0]


def path_states_many(
    aircraft: Aircraft,
    stations: np.ndarray,
    fuel: np.ndarray,
    burned: Sequence[np.ndarray],
    *,
    order: Sequence[str] | None = None,
    density: Sequence[float] | np.ndarray | None = None,
) -> list[tuple[np.ndarray, np.ndarray, np.ndarray, np.ndarray]]:
    """Weight, moment, lateral moment and tank quantities of N loadings, each at points of its burn.

    The loadings share one burn order and one set of densities. The tank quantities and the
    fuel's weight and moment of every point of every loading are found together (element by
    element, the arithmetic of one loading); each loading's payload sums are its own.

    Parameters
    ----------
    stations : (N, S) weight at each station [mass unit]
    fuel : (N, T) quantity in each tank at engine start [fuel volume unit]
    burned : N arrays (K_i,) of fuel burned since engine start [fuel volume unit]

    Returns
    -------
    list of (weight, moment, lateral, quantities)
        Per loading: (K_i,) [mass unit, mass unit * arm unit] and (K_i, T) [fuel volume unit].
    """
    tables = _tables(aircraft)
    order_index = None if order is None else [tables.tank_index[t] for t in order]
    rho = tables.density if density is None else np.asarray(density, dtype=float)
    empty = aircraft.empty
    stations = np.asarray(stations, dtype=float)
    fuel = np.asarray(fuel, dtype=float)
    counts = [len(points) for points in burned]
    if len(burned) == 1:  # one loading (the single check): its points as one row, (K, T)
        q = tank_quantities(fuel, np.asarray(burned[0], dtype=float)[None, :], order_index)[0]
    else:  # every point of every loading, one row each, (P, T)
        flat = np.concatenate(burned).astype(float) if burned else np.empty(0)
        q = tank_quantities(fuel[np.repeat(np.arange(len(counts)), counts)], flat[:, None], order_index)[:, 0, :]
    mass = q * rho
    fuel_weight = mass.sum(axis=1)
    fuel_moment = (mass * _tank_arms(aircraft, q)).sum(axis=1)
    out = []
    at = 0
    for row, count in zip(stations, counts, strict=True):
        part = slice(at, at + count)
        at += count
        pay_w = empty.weight + row.sum()
        pay_m = empty.weight * empty.arm + _dot(row, tables.arms)
        pay_l = empty.weight * (empty.lateral_arm or 0.0) + _dot(row, tables.lats)
        out.append(
            (pay_w + fuel_weight[part], pay_m + fuel_moment[part], pay_l + _dot(mass[part], tables.tank_lats), q[part])
        )
    return out


def _path_settled(
    tables: _Tables,
    shapes: Sequence[EnvelopeShape],
    parts_all: list[np.ndarray],
    fuel: np.ndarray,
    taxi: np.ndarray,
    trip: np.ndarray,
    order: Sequence[int] | None,
    rho: np.ndarray,
    pay_w: np.ndarray,
    pay_m: np.ndarray,
    pay_l: np.ndarray,
) -> np.ndarray:
    """(N,) True where the burn path is inside every envelope, shown by the ends of its pieces alone.

    Only for an aircraft without an arm table (every tank's arm fixed): between takeoff,
    the points where a tank runs dry in the burn order and landing, the fuel burns from
    tanks of fixed arms at a fixed ratio, so the weight, moment and lateral moment are
    affine in the fuel burned and each piece of path is a straight line of states. A piece
    whose two ends lie inside one straight convex part of an envelope by the margin stays
    inside that part (:class:`loadcheck.envelope._Locator`: a proven sufficient condition,
    docs/computation.md), so inside the envelope. The other rows get the exact test
    (:func:`_burn_path`); both give the same verdict and the same stretches (none).

    ``parts_all``: per envelope, the (4, N) parts of each condition's state (:meth:`EnvelopeShape.locate`).
    """
    start, end = taxi, taxi + trip
    settled = np.ones(len(taxi), dtype=bool)
    before = [parts[1] for parts in parts_all]  # takeoff
    if order is not None:
        # where tank j of the order runs dry, it and the tanks before it are empty and the
        # others hold what they held at engine start: that state, where it falls within the trip
        burned = np.zeros(len(taxi))
        kept = np.ones(len(rho))
        for tank in order:
            burned = burned + fuel[:, tank]
            kept[tank] = 0.0
            cut = (burned > start) & (burned < end)
            if not cut.any():
                continue
            w = pay_w + _dot(fuel, rho * kept)
            m = pay_m + _dot(fuel, rho * kept * tables.fixed_arms)
            lat = pay_l + _dot(fuel, rho * kept * tables.tank_lats)
            for k, shape in enumerate(shapes):
                here = shape.parts(w, m, lat)
                settled &= ~cut | ((before[k] & here) != 0)
                before[k] = np.where(cut, here, before[k])
    for k, parts in enumerate(parts_all):
        settled &= (before[k] & parts[2]) != 0  # landing
    return settled


_MIDDLE = np.array([1.0, 0.5, 0.25])  # the powers of u = 1/2: a piece's middle from its coefficients


def _polyval(c: np.ndarray, u: np.ndarray | float) -> np.ndarray:
    """Polynomials c[..., 0] + c[..., 1] u + c[..., 2] u^2 at u (Horner), broadcast."""
    return np.asarray(c[..., 0] + u * (c[..., 1] + u * c[..., 2]))


def _burn_path(
    aircraft: Aircraft,
    shapes: Sequence[EnvelopeShape],
    fuel: np.ndarray,
    taxi: np.ndarray,
    trip: np.ndarray,
    order: Sequence[int] | None,
    rho: np.ndarray,
    tank_lats: np.ndarray,
    pay_w: np.ndarray,
    pay_m: np.ndarray,
    pay_l: np.ndarray,
    explain: bool,
    known: tuple[np.ndarray, np.ndarray | None],
) -> tuple[np.ndarray, list[list[tuple[float, float]]]]:
    """Whether the path from takeoff to landing stays inside every envelope, and (with
    ``explain``) the stretches outside, as fuel burned since engine start [fuel volume unit].

    ``known``: the tank quantities and (where an arm moves with quantity, else None) arms at
    takeoff and landing, (N, 2, T), as the conditions have them; where the path is not cut
    they are the ends of its one piece."""
    n = fuel.shape[0]
    start, end = taxi, taxi + trip
    points = np.array([start, end, *_burn_cuts(aircraft, fuel, order)]).T
    points = np.where(np.isfinite(points), np.minimum(np.maximum(points, start[:, None]), end[:, None]), end[:, None])
    if points.shape[1] > 2:  # two columns (takeoff, landing) are in order already
        points.sort(axis=1)
    live = points[:, 1:] - points[:, :-1] > 0  # (N, P)
    rows, cols = np.nonzero(live)
    # the stretches outside, per loading: only with explain (a list per row costs more than the rest at large N)
    stretches: list[list[tuple[float, float]]] = [[] for _ in range(n)] if explain else []
    if len(rows) == 0:
        return np.ones(n, dtype=bool), stretches
    a, b = points[rows, cols], points[rows, cols + 1]  # the K live pieces
    if points.shape[1] == 2:  # not cut: each piece is takeoff to landing, the same quantities as the conditions'
        q_ends = known[0][rows]
        arm_ends = _tank_arms(aircraft, q_ends) if known[1] is None else known[1][rows]
    else:
        q_ends = tank_quantities(fuel[rows], np.array([a, b]).T, order)  # (K, 2, T): both ends at once
        arm_ends = _tank_arms(aircraft, q_ends)
    # each tank's mass ma + dm u and arm arm + da u on the piece (u from 0 to 1): weight, moment
    # and lateral moment as polynomials in u, (K, 3) coefficients each, lowest power first
    ma = q_ends[:, 0] * rho  # (K, T)
    dm = q_ends[:, 1] * rho - ma
    arm, da = arm_ends[:, 0], arm_ends[:, 1] - arm_ends[:, 0]
    terms = np.array([ma, dm, ma * arm, ma * da + dm * arm, dm * da])  # (5, K, T)
    sums = terms.sum(axis=2)  # (5, K)
    lat_terms = _dot(np.array([ma, dm]), tank_lats)  # (2, K)
    poly = np.zeros((3, len(a), 3))  # weight, moment, lateral moment
    w, m, lat = poly[0], poly[1], poly[2]
    w[:, 0] = pay_w[rows] + sums[0]
    w[:, 1] = sums[1]
    m[:, 0] = pay_m[rows] + sums[2]
    m[:, 1:] = sums[3:].T
    lat[:, 0] = pay_l[rows] + lat_terms[0]
    lat[:, 1] = lat_terms[1]

    # pieces that touch no edge stay on one side of the boundary: their middle settles them
    middle = poly @ _MIDDLE  # (3, K): weight, moment, lateral moment at u = 1/2
    inside = np.ones(len(a), dtype=bool)
    for shape in shapes:
        inside &= np.asarray(shape.covers(middle[0], middle[1], middle[2]))
    touched = np.zeros(len(a), dtype=bool)
    candidates = []
    for shape in shapes:
        f = shape.edge_polynomials(w, m, lat)  # (K, 3, E)
        c, lin, quad = f[:, 0], f[:, 1], f[:, 2]
        # only where the polynomial can vanish on [0, 1]: a sign change between the ends,
        # or a turning point inside with the other sign
        with np.errstate(divide="ignore", invalid="ignore"):
            turn = -lin / (2.0 * quad)
            maybe = (c * (quad + lin + c) <= 0) | (
                (turn > 0) & (turn < 1) & (c * (c + turn * (lin + turn * quad)) <= 0)
            )
        k_all, e_all = np.nonzero(maybe)
        if len(k_all) == 0:
            continue
        for r in quadratic_roots(quad[k_all, e_all], lin[k_all, e_all], c[k_all, e_all]):
            in_piece = (r >= -1e-12) & (r <= 1 + 1e-12)
            if not in_piece.any():
                continue
            k, e = k_all[in_piece], e_all[in_piece]
            u = np.clip(r[in_piece], 0.0, 1.0)
            at = _polyval(poly[:, k], u)  # (3, roots): weight, moment, lateral moment at each root
            s = shape.edge_position(e, at[0], at[1], at[2])
            touched[k[(s >= -_EDGE_SLACK) & (s <= 1 + _EDGE_SLACK)]] = True
            column = np.full(f.shape[0] * f.shape[2], np.nan)
            column[k * f.shape[2] + e] = u
            candidates.append(column.reshape(f.shape[0], f.shape[2]))
    # pieces that touch an edge: split at every root, test each part at its middle
    hit = np.nonzero(touched)[0]
    parts_out: np.ndarray | None = None
    if len(hit):
        cuts_u = np.concatenate(
            [np.zeros((len(hit), 1)), *(c[hit] for c in candidates), np.ones((len(hit), 1))], axis=1
        )
        cuts_u = np.sort(np.where(np.isfinite(cuts_u), cuts_u, 1.0), axis=1)
        lo, hi = cuts_u[:, :-1], cuts_u[:, 1:]
        mids = 0.5 * (lo + hi)
        sub = _polyval(poly[:, hit, None, :], mids)  # (3, H, parts): weight, moment, lateral moment
        short = hi - lo <= 1e-12
        both = np.ones(mids.shape, dtype=bool)
        for shape in shapes:
            both &= np.asarray(shape.covers(sub[0], sub[1], sub[2]))
        parts_out = ~(short | both)
        inside[hit] = ~parts_out.any(axis=1)
    result = np.ones(n, dtype=bool)
    result[rows[~inside]] = False  # a loading is out if any of its pieces is
    if explain:
        _collect_stretches(stretches, rows, a, b, inside, touched, hit, parts_out, cuts_u if len(hit) else None)
    return result, stretches


def _collect_stretches(
    stretches: list[list[tuple[float, float]]],
    rows: np.ndarray,
    a: np.ndarray,
    b: np.ndarray,
    inside: np.ndarray,
    touched: np.ndarray,
    hit: np.ndarray,
    parts_out: np.ndarray | None,
    cuts_u: np.ndarray | None,
) -> None:
    """Every piece, or part of a piece, outside: (from, to) fuel burned, merged where they meet."""
    position = {int(k): j for j, k in enumerate(hit)}
    for k in np.flatnonzero(~inside):
        row, begin, length = int(rows[k]), float(a[k]), float(b[k] - a[k])
        if touched[k]:
            assert parts_out is not None and cuts_u is not None
            j = position[int(k)]
            spans = [
                (begin + float(cuts_u[j, p]) * length, begin + float(cuts_u[j, p + 1]) * length)
                for p in np.flatnonzero(parts_out[j])
            ]
        else:
            spans = [(begin, begin + length)]
        for low, high in spans:
            out = stretches[row]
            if out and abs(out[-1][1] - low) <= 1e-9 * max(1.0, abs(low)):
                out[-1] = (out[-1][0], high)
            else:
                out.append((low, high))
