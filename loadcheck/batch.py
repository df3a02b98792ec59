"""Vectorised evaluation of many loadings of one aircraft at once (numpy + shapely).

:func:`evaluate` takes arrays (N loadings x stations, N x tanks, taxi, trip) in the
aircraft's own units and returns arrays: weight, arm, moment (and lateral CG) of each
condition, the verdict of each condition and limit, the burn-path verdict and the first
limit exceeded. It applies the same rules as :func:`loadcheck.check.check_loading`, and
the tests hold the two to the same verdict on large random sets
(``tests/test_batch.py``).

The burn path is checked exactly, not by sampling. For every axis pair an envelope may
use (weight against arm, moment, %MAC or lateral arm; lateral arm against arm), the
condition "the path meets an edge line" is a polynomial of degree at most two in the
fuel burned (after multiplying through by the positive weight), also for tanks whose
arm moves with quantity. Its roots are found in closed form for all loadings at once.
A piece of path on which no root falls on an actual edge stays on one side of the
boundary, so one containment test at its middle settles it; the few pieces that do
touch an edge are split at every root and each part is tested at its middle, as the
single check does.
"""

from __future__ import annotations

from collections.abc import Sequence
from dataclasses import dataclass, fields
from typing import Any

import numpy as np

from .aircraft import Aircraft, Envelope
from .check import WEIGHT_TOLERANCE
from .envelope import quadratic_roots
from .loading import ResolvedLoading

__all__ = ["BatchResult", "LoadingArrays", "evaluate", "evaluate_arrays", "loading_arrays", "CONDITIONS"]

CONDITIONS = ("ramp", "takeoff", "landing", "zero_fuel")
_EDGE_SLACK = 1e-9  # how far past an edge's ends a crossing still counts (scaled units)


@dataclass(frozen=True)
class BatchResult:
    """Arrays of N results (one per loading).

    Attributes
    ----------
    weight, moment, arm, lateral_arm : per condition, shape (N,) [mass unit, mass unit *
        arm unit, arm unit, arm unit]
    condition_ok : per condition, inside its envelope(s) and weight limits
    envelope_ok : per condition, inside every envelope of the category
    limit_ok : per weight limit code (``max_takeoff_weight`` ...) and ``stations``
        (every station and group limit), True where it holds
    burn_path_ok : the whole path from takeoff to landing inside the envelopes
    valid : the row could be used (no negative, NaN, over-capacity or over-burn input)
    ok : valid and no limit exceeded (the single check's ``ok``)
    first_finding : code of the first limit exceeded, in the single check's order
        ("" where none, "input" where the row is not valid)
    first_condition : the condition of that finding ("" where none applies)
    """

    weight: dict[str, np.ndarray]
    moment: dict[str, np.ndarray]
    arm: dict[str, np.ndarray]
    lateral_arm: dict[str, np.ndarray]
    condition_ok: dict[str, np.ndarray]
    envelope_ok: dict[str, np.ndarray]
    limit_ok: dict[str, np.ndarray]
    burn_path_ok: np.ndarray
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
) -> BatchResult:
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


# -- fuel ---------------------------------------------------------------------------------


def _quantities(fuel: np.ndarray, burned: np.ndarray, order: Sequence[int] | None) -> np.ndarray:
    """Tank quantities after ``burned`` (shape (N, K)) from ``fuel`` (N, T): (N, K, T)."""
    start = fuel[:, None, :]
    if order is None:
        total = fuel.sum(axis=1)[:, None]
        with np.errstate(divide="ignore", invalid="ignore"):
            share = np.where(total > 0, np.clip(1.0 - burned / total, 0.0, 1.0), 0.0)
        return start * share[:, :, None]
    left = np.broadcast_to(start, (*burned.shape, fuel.shape[1])).copy()
    remaining = burned.copy()
    for tank in order:
        used = np.minimum(left[:, :, tank], remaining)
        left[:, :, tank] -= used
        remaining -= used
    return left


def _tank_arms(aircraft: Aircraft, quantities: np.ndarray) -> np.ndarray:
    """Arm of each tank's fuel at the given quantities (..., T) [arm unit]."""
    arms = np.empty_like(quantities)
    for index, tank in enumerate(aircraft.tank):
        if tank.arm_table is None:
            arms[..., index] = tank.arm
        else:
            table = np.asarray(tank.arm_table, dtype=float)
            arms[..., index] = np.interp(quantities[..., index], table[:, 0], table[:, 1])
    return arms


# -- geometry -------------------------------------------------------------------------------


def _covers(envelope: Envelope, weight: np.ndarray, moment: np.ndarray, lateral: np.ndarray) -> np.ndarray:
    return envelope.shape.covers(weight, moment, lateral)


def _polyval(c: np.ndarray, u: np.ndarray | float) -> np.ndarray:
    return c[..., 0] + u * (c[..., 1] + u * c[..., 2])


# -- evaluation -----------------------------------------------------------------------------


CHUNK = 32_768
"""Loadings evaluated together; larger batches are cut into chunks of this size so that
the working arrays stay in cache and memory stays bounded."""


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
) -> BatchResult:
    """Evaluate N loadings of one aircraft.

    Parameters
    ----------
    aircraft : the aircraft
    stations : (N, S) weight at each station, in ``aircraft.station`` order [mass unit]
    fuel : (N, T) quantity in each tank at engine start, ``aircraft.tank`` order [fuel volume unit]
    taxi, trip : (N,) fuel used before takeoff and from takeoff to landing [fuel volume unit]
    order : None to burn together, or tank ids in burn order
    category : envelope category (default the aircraft's first)
    density : per tank [mass unit per fuel volume unit] (default the tanks' own)

    Returns
    -------
    BatchResult
    """
    stations = np.atleast_2d(np.asarray(stations, dtype=float))
    n = stations.shape[0]
    fuel = np.asarray(fuel, dtype=float).reshape(n, len(aircraft.tank))
    taxi = np.broadcast_to(np.asarray(taxi, dtype=float), (n,))
    trip = np.broadcast_to(np.asarray(trip, dtype=float), (n,))
    if n <= CHUNK:
        return _evaluate(aircraft, stations, fuel, taxi, trip, order, category, density)
    parts = [
        _evaluate(aircraft, stations[i : i + CHUNK], fuel[i : i + CHUNK], taxi[i : i + CHUNK], trip[i : i + CHUNK],
                  order, category, density)
        for i in range(0, n, CHUNK)
    ]

    def join(field: str) -> Any:
        first = getattr(parts[0], field)
        if isinstance(first, dict):
            return {k: np.concatenate([getattr(p, field)[k] for p in parts]) for k in first}
        return np.concatenate([getattr(p, field) for p in parts])

    return BatchResult(**{f.name: join(f.name) for f in fields(BatchResult)})


def _evaluate(
    aircraft: Aircraft,
    stations: np.ndarray,
    fuel: np.ndarray,
    taxi: np.ndarray,
    trip: np.ndarray,
    order: Sequence[str] | None,
    category: str | None,
    density: Sequence[float] | np.ndarray | None,
) -> BatchResult:
    n = stations.shape[0]
    fuel = np.asarray(fuel, dtype=float).reshape(n, len(aircraft.tank))
    taxi = np.broadcast_to(np.asarray(taxi, dtype=float), (n,)).copy()
    trip = np.broadcast_to(np.asarray(trip, dtype=float), (n,)).copy()
    category = aircraft.category(category)
    envelopes = aircraft.envelopes_for(category)
    tank_index = {t.id: i for i, t in enumerate(aircraft.tank)}
    order_index = None if order is None else [tank_index[t] for t in order]
    rho = np.array(density if density is not None else [aircraft.density(t) for t in aircraft.tank], dtype=float)
    usable = np.array([t.usable for t in aircraft.tank], dtype=float)
    burnable = fuel.sum(axis=1) if order_index is None else fuel[:, order_index].sum(axis=1)

    finite = np.isfinite(stations).all(axis=1) & np.isfinite(fuel).all(axis=1) & np.isfinite(taxi) & np.isfinite(trip)
    valid = (
        finite
        & (stations >= 0).all(axis=1)
        & (fuel >= 0).all(axis=1)
        & (fuel <= usable * (1 + 1e-9)).all(axis=1)
        & (taxi >= 0)
        & (trip >= 0)
        & (taxi + trip <= burnable * (1 + 1e-9))
    )
    stations = np.where(np.isfinite(stations), stations, 0.0)
    fuel = np.where(np.isfinite(fuel), np.clip(fuel, 0.0, usable), 0.0)
    taxi = np.where(np.isfinite(taxi), np.maximum(taxi, 0.0), 0.0)
    trip = np.where(np.isfinite(trip), np.maximum(trip, 0.0), 0.0)

    # payload: empty weight and every station (the zero-fuel state)
    empty = aircraft.empty
    arms = np.array([s.arm for s in aircraft.station], dtype=float)
    lats = np.array([s.lateral_arm or 0.0 for s in aircraft.station], dtype=float)
    tank_lats = np.array([t.lateral_arm or 0.0 for t in aircraft.tank], dtype=float)
    pay_w = empty.weight + stations.sum(axis=1)
    pay_m = empty.weight * empty.arm + stations @ arms
    pay_l = empty.weight * (empty.lateral_arm or 0.0) + stations @ lats

    burned = np.stack([np.zeros(n), taxi, taxi + trip], axis=1)
    q = _quantities(fuel, burned, order_index)  # (N, 3, T)
    mass = q * rho
    tank_arm = _tank_arms(aircraft, q)
    weight = {"zero_fuel": pay_w}
    moment = {"zero_fuel": pay_m}
    lateral = {"zero_fuel": pay_l}
    for k, name in enumerate(("ramp", "takeoff", "landing")):
        weight[name] = pay_w + mass[:, k].sum(axis=1)
        moment[name] = pay_m + (mass[:, k] * tank_arm[:, k]).sum(axis=1)
        lateral[name] = pay_l + mass[:, k] @ tank_lats

    limits = aircraft.limits
    limit_ok: dict[str, np.ndarray] = {}
    weight_limits: dict[str, list[tuple[str, float | None]]] = {
        "ramp": [("max_ramp_weight", limits.ramp)],
        "takeoff": [("max_takeoff_weight", limits.max_takeoff_weight)],
        "landing": [("max_landing_weight", limits.landing)],
        "zero_fuel": [("max_zero_fuel_weight", limits.max_zero_fuel_weight)],
    }
    weight_ok: dict[str, np.ndarray] = {}
    minimum_ok: dict[str, np.ndarray] = {}
    for name in CONDITIONS:
        good = np.ones(n, dtype=bool)
        for code, value in weight_limits[name]:
            if value is not None:
                limit_ok[code] = weight[name] <= value * (1 + WEIGHT_TOLERANCE)
                good &= limit_ok[code]
        weight_ok[name] = good
        minimum_ok[name] = np.ones(n, dtype=bool)
        if name in ("takeoff", "landing") and limits.min_flight_weight is not None:
            minimum_ok[name] = weight[name] >= limits.min_flight_weight * (1 - WEIGHT_TOLERANCE)
    if limits.min_flight_weight is not None:
        limit_ok["min_flight_weight"] = minimum_ok["takeoff"] & minimum_ok["landing"]

    envelope_ok: dict[str, np.ndarray] = {}
    per_envelope: dict[str, list[np.ndarray]] = {}
    for name in CONDITIONS:
        inside = []
        for envelope in envelopes:
            w, m, lat = weight[name], moment[name], lateral[name]
            top = envelope.shape.max_weight
            if name == "ramp" and top is not None:
                clamp = w > top
                scale = np.where(clamp, top / w, 1.0)
                w, m, lat = w * scale, m * scale, lat * scale
            inside.append(_covers(envelope, w, m, lat))
        per_envelope[name] = inside
        envelope_ok[name] = np.logical_and.reduce(inside)

    condition_ok = {name: weight_ok[name] & minimum_ok[name] & envelope_ok[name] for name in CONDITIONS}

    station_findings = _station_findings(aircraft, stations)
    limit_ok["stations"] = np.asarray(~station_findings.any(axis=1))

    # a path with an end outside is out already; only paths with both ends inside need the exact test
    path_ok = envelope_ok["takeoff"] & envelope_ok["landing"]
    open_path = np.flatnonzero(path_ok & (trip > 0))
    if len(open_path):
        path_ok[open_path] = _burn_path_ok(
            aircraft, envelopes, fuel[open_path], taxi[open_path], trip[open_path], order_index, rho, tank_lats,
            pay_w[open_path], pay_m[open_path], pay_l[open_path],
        )
    path_ok = np.where(trip > 0, path_ok, envelope_ok["takeoff"])

    zero_fuel_cg_is_limit = limits.zero_fuel_cg == "limit"
    first_finding = np.full(n, "", dtype=object)
    first_condition = np.full(n, "", dtype=object)
    open_rows = np.ones(n, dtype=bool)

    def mark(rows: np.ndarray, code: str, condition: str = "") -> None:
        nonlocal open_rows
        hit = open_rows & rows
        first_finding[hit] = code
        first_condition[hit] = condition
        open_rows = open_rows & ~hit

    for name in CONDITIONS:
        for code, value in weight_limits[name]:
            if value is not None:
                mark(~limit_ok[code], code, name)
        mark(~minimum_ok[name], "min_flight_weight", name)
        if name != "zero_fuel" or zero_fuel_cg_is_limit:
            for inside_one in per_envelope[name]:
                mark(~inside_one, "envelope", name)
    mark(~path_ok, "burn_path")
    codes = _station_codes(aircraft)
    for column, code in enumerate(codes):
        mark(station_findings[:, column], code)
    first_finding[~valid] = "input"
    first_condition[~valid] = ""

    ok = valid & (first_finding == "")
    return BatchResult(
        weight=weight,
        moment=moment,
        arm={k: moment[k] / weight[k] for k in CONDITIONS},
        lateral_arm={k: lateral[k] / weight[k] for k in CONDITIONS},
        condition_ok=condition_ok,
        envelope_ok=envelope_ok,
        limit_ok=limit_ok,
        burn_path_ok=path_ok,
        valid=valid,
        ok=ok,
        first_finding=first_finding,
        first_condition=first_condition,
    )


def _station_codes(aircraft: Aircraft) -> list[str]:
    return ["station_max", "station_min"] * len(aircraft.station) + ["group_max", "group_min"] * len(aircraft.station_group)


def _station_findings(aircraft: Aircraft, stations: np.ndarray) -> np.ndarray:
    """(N, 2 x (stations + groups)) True where a max (then min) limit is exceeded."""
    columns = []
    index = {s.id: i for i, s in enumerate(aircraft.station)}
    subjects = [([index[s.id]], s.max_weight, s.min_weight) for s in aircraft.station]
    subjects += [([index[m] for m in g.stations], g.max_weight, g.min_weight) for g in aircraft.station_group]
    for members, most, least in subjects:
        loaded = stations[:, members].sum(axis=1)
        columns.append(loaded > most * (1 + WEIGHT_TOLERANCE) + 1e-12 if most is not None else np.zeros(len(loaded), bool))
        columns.append(loaded < least * (1 - WEIGHT_TOLERANCE) if least is not None else np.zeros(len(loaded), bool))
    if not columns:
        return np.zeros((stations.shape[0], 0), dtype=bool)
    return np.stack(columns, axis=1)


def _burn_path_ok(
    aircraft: Aircraft,
    envelopes: Sequence[Envelope],
    fuel: np.ndarray,
    taxi: np.ndarray,
    trip: np.ndarray,
    order: Sequence[int] | None,
    rho: np.ndarray,
    tank_lats: np.ndarray,
    pay_w: np.ndarray,
    pay_m: np.ndarray,
    pay_l: np.ndarray,
) -> np.ndarray:
    """True where the path from takeoff to landing stays inside every envelope."""
    n = fuel.shape[0]
    start, end = taxi, taxi + trip
    cuts = [start, end]
    if order is not None:
        running = np.zeros(n)
        for tank in order:
            running = running + fuel[:, tank]
            cuts.append(running.copy())
    total = fuel.sum(axis=1) if order is None else None
    for index, tank_data in enumerate(aircraft.tank):
        for knot in tank_data.arm_knots():
            held = fuel[:, index]
            with np.errstate(divide="ignore", invalid="ignore"):
                if order is None:
                    assert total is not None
                    t = np.where(held > knot, total * (1.0 - knot / held), np.nan)
                elif index in order:
                    before = sum(fuel[:, j] for j in order[: order.index(index)]) if order.index(index) else 0.0
                    t = np.where(held > knot, before + held - knot, np.nan)
                else:
                    t = np.full(n, np.nan)
            cuts.append(t)
    points = np.stack(cuts, axis=1)
    points = np.where(np.isfinite(points), np.clip(points, start[:, None], end[:, None]), end[:, None])
    if points.shape[1] > 2:  # two columns (takeoff, landing) are in order already
        points.sort(axis=1)
    live = points[:, 1:] - points[:, :-1] > 0  # (N, P)
    rows, cols = np.nonzero(live)
    if len(rows) == 0:
        return np.ones(n, dtype=bool)
    a, b = points[rows, cols], points[rows, cols + 1]  # the K live pieces
    piece_fuel = fuel[rows]

    qa = _quantities(piece_fuel, a[:, None], order)[:, 0]
    qb = _quantities(piece_fuel, b[:, None], order)[:, 0]
    arm_a, arm_b = _tank_arms(aircraft, qa), _tank_arms(aircraft, qb)
    count = len(a)
    w, m, lat = np.zeros((count, 3)), np.zeros((count, 3)), np.zeros((count, 3))
    w[:, 0], m[:, 0], lat[:, 0] = pay_w[rows], pay_m[rows], pay_l[rows]
    for ti in range(qa.shape[1]):  # a few tanks: a loop beats reductions over a short axis
        ma, dm = qa[:, ti] * rho[ti], (qb[:, ti] - qa[:, ti]) * rho[ti]
        arm, da = arm_a[:, ti], arm_b[:, ti] - arm_a[:, ti]
        w[:, 0] += ma
        w[:, 1] += dm
        m[:, 0] += ma * arm
        m[:, 1] += ma * da + dm * arm
        m[:, 2] += dm * da
        lat[:, 0] += ma * tank_lats[ti]
        lat[:, 1] += dm * tank_lats[ti]

    # pieces that touch no edge stay on one side of the boundary: their middle settles them
    inside = np.ones(len(a), dtype=bool)
    for envelope in envelopes:
        inside &= _covers(envelope, _polyval(w, 0.5), _polyval(m, 0.5), _polyval(lat, 0.5))
    touched = np.zeros(len(a), dtype=bool)
    candidates = []
    for envelope in envelopes:
        f = envelope.shape.edge_polynomials(w, m, lat)  # (K, 3, E)
        c, b, q = f[:, 0], f[:, 1], f[:, 2]
        # only where the polynomial can vanish on [0, 1]: a sign change between the ends,
        # or a turning point inside with the other sign
        with np.errstate(divide="ignore", invalid="ignore"):
            turn = -b / (2.0 * q)
            maybe = (c * (q + b + c) <= 0) | ((turn > 0) & (turn < 1) & (c * (c + turn * (b + turn * q)) <= 0))
        k_all, e_all = np.nonzero(maybe)
        if len(k_all) == 0:
            continue
        for r in quadratic_roots(q[k_all, e_all], b[k_all, e_all], c[k_all, e_all]):
            in_piece = (r >= -1e-12) & (r <= 1 + 1e-12)
            if not in_piece.any():
                continue
            k, e = k_all[in_piece], e_all[in_piece]
            u = np.clip(r[in_piece], 0.0, 1.0)
            s = envelope.shape.edge_position(e, _polyval(w[k], u), _polyval(m[k], u), _polyval(lat[k], u))
            touched[k[(s >= -_EDGE_SLACK) & (s <= 1 + _EDGE_SLACK)]] = True
            column = np.full(f.shape[0] * f.shape[2], np.nan)
            column[k * f.shape[2] + e] = u
            candidates.append(column.reshape(f.shape[0], f.shape[2]))
    # pieces that touch an edge: split at every root, test each part at its middle
    hit = np.nonzero(touched)[0]
    if len(hit):
        cuts_u = np.concatenate([np.zeros((len(hit), 1)), *(c[hit] for c in candidates), np.ones((len(hit), 1))], axis=1)
        cuts_u = np.sort(np.where(np.isfinite(cuts_u), cuts_u, 1.0), axis=1)
        lo, hi = cuts_u[:, :-1], cuts_u[:, 1:]
        mids = 0.5 * (lo + hi)
        sub = [_polyval(c[hit][:, None, :], mids) for c in (w, m, lat)]
        good = hi - lo <= 1e-12
        both = np.ones(mids.shape, dtype=bool)
        for envelope in envelopes:
            both &= _covers(envelope, *sub)
        inside[hit] = (good | both).all(axis=1)
    result = np.ones(n, dtype=bool)
    result[rows[~inside]] = False  # a loading is out if any of its pieces is
    return result
