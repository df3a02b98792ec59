"""The pilot's loading check: every condition, every limit, the whole burn path.

:func:`check_loading` checks one loading: it resolves the loading against the aircraft,
evaluates it with the engine (:func:`loadcheck.engine.evaluate`: the four conditions, the
weight limits, the category's envelopes, the fuel burn from takeoff to landing as the
curve it is), and explains the engine's verdict in a frozen
:class:`~loadcheck.results.CheckResult` (the moment table from :mod:`loadcheck.balance`,
margins, findings in words, where the burn path leaves). :func:`check_many` does the same
for many resolved loadings of one aircraft with one engine call (the fleet check): each
result is the one :func:`check_loading` gives. No limit rule is decided here; the
assertion in :func:`_explain` holds every explanation to the engine's verdict.

Severity (DESIGN.md): every exceedance is a ``limit``, except the zero-fuel CG outside
the envelope (a ``warning`` unless the aircraft file sets ``zero_fuel_cg = "limit"``),
landing fuel below the reserve, and things taken for granted (a tank not mentioned is
empty), which are warnings.
"""

from __future__ import annotations

from collections.abc import Sequence
from dataclasses import dataclass
from typing import Any, Literal, TypeGuard

import numpy as np
import shapely

from .aircraft import Aircraft, Envelope
from .balance import moment_tables
from .caution import PILOT_CAUTION
from .engine import (
    CONDITIONS,
    WEIGHT_TOLERANCE,
    Evaluation,
    envelope_state,
    evaluate,
    path_states_many,
)
from .engine import _tables as engine_tables
from .envelope import TOLERANCE as ENVELOPE_TOLERANCE
from .envelope import EnvelopeShape, Vary
from .loading import Loading, ResolvedLoading, require_usable, resolve_loading
from .results import (
    AircraftInfo,
    BurnPath,
    CheckResult,
    ConditionColumns,
    ConditionName,
    Excursion,
    Finding,
    LeavePoint,
    Margins,
    PathSample,
    ResultColumns,
    Severity,
    UnitsInfo,
)
from .words import (
    ZERO_FUEL_WARNING,
    burn_path_message,
    envelope_gap_message,
    envelope_moment_message,
    envelope_point_message,
    envelope_side_message,
    envelope_weight_message,
    load_limit_message,
    no_pilot_message,
    reserve_message,
    weight_limit_message,
)

__all__ = ["WEIGHT_TOLERANCE", "below_reserve", "check_columns", "check_loading", "check_many"]

_SAMPLES = 40  # evenly spaced points along the burn path for drawing it, besides where it leaves


def below_reserve(landing_fuel: Any, reserve: float) -> Any:
    """True where landing fuel is below the reserve (the check's reserve warning), for a number or an array.

    Parameters
    ----------
    landing_fuel : fuel on board at landing [fuel volume unit], a float or an (N,) array
    reserve : the fuel to land with [fuel volume unit]

    The comparison allows the engine's weight tolerance, as every weight rule does (common practice).
    """
    return landing_fuel < reserve * (1 - WEIGHT_TOLERANCE)


def check_loading(
    aircraft: Aircraft, loading: Loading | ResolvedLoading, *, category: str | None = None, samples: bool = True
) -> CheckResult:
    """Check a loading against every limit of the aircraft.

    The verdicts are the engine's (:func:`loadcheck.engine.evaluate` on this one loading);
    this function adds the explanation: the moment table, margins to each limit, every
    finding in words, and where the burn path leaves the envelope.

    Parameters
    ----------
    aircraft : the aircraft, with its current empty-weight record
    loading : a loading (resolved here) or an already resolved one
    category : envelope category; default the loading's, else the aircraft's first
    samples : compute points along the burn path for drawing it (``burn_path.samples``);
        the verdict never depends on them

    Returns
    -------
    CheckResult
        ``ok`` is true exactly when no finding has severity ``limit``.

    Raises
    ------
    UnknownNameError, InputError
        When the loading cannot be used with this aircraft (see
        :func:`~loadcheck.loading.resolve_loading`).

    References
    ----------
    FAA-H-8083-1B chapter 2 (sum of moments, CG = total moment / total weight);
    AC 43.13-1B chapter 10 section 1 (loading conditions).
    """
    resolved = (
        loading if isinstance(loading, ResolvedLoading) else resolve_loading(loading, aircraft, category=category)
    )
    return check_many(aircraft, [resolved], samples=samples)[0]


def check_many(aircraft: Aircraft, loadings: Sequence[ResolvedLoading], *, samples: bool = False) -> list[CheckResult]:
    """Check many resolved loadings of one aircraft: the result of each is :func:`check_loading`'s.

    The loadings are evaluated by the engine together (one call for each burn order,
    category and set of densities among them), and each result is built from its row of
    the engine's arrays; the margins of every row are found together as well.

    Raises
    ------
    InputError
        When a loading resolved by hand is one no flight can have
        (:func:`~loadcheck.loading.require_usable`).
    """
    return [columns.result(k) for columns, k in check_columns(aircraft, loadings, samples=samples)]


def check_columns(
    aircraft: Aircraft, loadings: Sequence[ResolvedLoading], *, samples: bool = False
) -> list[tuple[ResultColumns, int]]:
    """:func:`check_many`'s results by column: for each loading, in order, the columns that hold
    its result and its place in them (``columns.result(k)`` is the loading's result;
    :func:`loadcheck.result_json.result_texts` writes the JSON form of all of them from the
    columns, for the fleet check)."""
    tables = engine_tables(aircraft)
    groups: dict[tuple[Any, ...], list[int]] = {}
    for index, resolved in enumerate(loadings):
        require_usable(resolved, aircraft)  # a loading resolved by hand is held to the same rules
        key = (resolved.plan.order, resolved.category, tuple(resolved.density[t] for t in tables.tank_ids))
        groups.setdefault(key, []).append(index)
    placed: list[tuple[ResultColumns, int] | None] = [None] * len(loadings)
    for (order, category, density), members in groups.items():
        chosen = [loadings[i] for i in members]
        n = len(chosen)
        stations = np.array([[ld.stations.get(s, 0.0) for s in tables.station_ids] for ld in chosen], dtype=float)
        fuel = np.array([[ld.fuel[t] for t in tables.tank_ids] for ld in chosen], dtype=float)
        stations, fuel = stations.reshape(n, len(tables.station_ids)), fuel.reshape(n, len(tables.tank_ids))
        rho = np.array(density, dtype=float)
        found = evaluate(
            aircraft,
            stations,
            fuel,
            np.array([ld.taxi for ld in chosen]),
            np.array([ld.trip for ld in chosen]),
            order=order,
            category=category,
            density=rho,
            explain=True,
        )
        columns = _explain(aircraft, chosen, found, category, samples, stations, fuel, rho)
        for k, index in enumerate(members):
            placed[index] = (columns, k)
    assert all(p is not None for p in placed), "every loading is in one group"
    return [p for p in placed if p is not None]


def _explain(
    aircraft: Aircraft,
    loadings: Sequence[ResolvedLoading],
    found: Evaluation,
    category: str,
    samples: bool,
    stations: np.ndarray,
    fuel: np.ndarray,
    density: np.ndarray,
) -> ResultColumns:
    """The results of the loadings from the engine's arrays, by column: the explanation of the verdicts.

    ``stations`` (N, S), ``fuel`` (N, T) and ``density`` (T,) are the arrays the engine was given."""
    units = aircraft.units
    tables = engine_tables(aircraft)
    shapes = tables.envelopes[category][1]
    rows = _Rows(found)
    margins = _margins(shapes, found, tables.weights, tables.allowance, aircraft.limits.min_flight_weight)
    once = _Once.all(aircraft, category)
    # many rows: every slice a finding outside an envelope is told on, cut together (as the margins are)
    cuts = _outside_cuts(shapes, found, tables.allowance) if len(loadings) > _ONE_BY_ONE else None
    paths = _path_points(aircraft, loadings, found, category, samples, (stations, fuel, density))
    seats = aircraft.control_seats
    # a weight at a seat with flight controls, every row at once (the engine's stations array)
    piloted: list[bool] = (
        np.any(stations[:, [tables.station_ids.index(s) for s in seats]] > 0, axis=1).tolist() if seats else []
    )
    oks: list[bool] = []
    burn_paths: list[BurnPath] = []
    all_findings: list[list[Finding]] = []
    for i, resolved in enumerate(loadings):
        findings: list[Finding] = []
        for fixed in once:
            name = fixed.name
            if not rows.condition_ok[name][i]:  # outside a limit of this condition (the engine's): say which
                _condition_findings(
                    aircraft,
                    rows,
                    i,
                    shapes,
                    fixed,
                    findings,
                    cuts,
                    rows.weight[name][i],
                    rows.moment[name][i],
                    rows.lateral[name][i],
                )
        burn_paths.append(
            _burn_path(aircraft, resolved, found, i, rows.weight["takeoff"][i], findings, samples, paths.get(i))
        )
        if not rows.loads_ok[i]:
            findings.extend(_load_findings(aircraft, resolved, found, i))
        landing_fuel = rows.fuel["landing"][i]
        if resolved.reserve is not None and below_reserve(landing_fuel, resolved.reserve):
            findings.append(
                Finding(
                    code="reserve",
                    severity="warning",
                    condition="landing",
                    message=reserve_message(landing_fuel, resolved.reserve, units.fuel_volume),
                    excess=resolved.reserve - landing_fuel,
                    unit=units.fuel_volume,
                    limit=resolved.reserve,
                )
            )
        if seats and not piloted[i]:
            findings.append(
                Finding(
                    code="no_pilot",
                    severity="warning",
                    message=no_pilot_message([aircraft.station_by_id[s].name for s in seats]),
                )
            )
        if resolved.notes:
            findings.extend(Finding(code="assumption", severity="warning", message=note) for note in resolved.notes)
        ok = not findings or not any(f.severity == "limit" for f in findings)
        assert ok == rows.ok[i], "the explanation must carry the engine's verdict"
        oks.append(ok)
        all_findings.append(findings)
    return ResultColumns(
        aircraft=AircraftInfo(
            name=aircraft.name,
            registration=aircraft.registration,
            fingerprint=aircraft.fingerprint,
            empty_weight_date=aircraft.empty.date.isoformat() if aircraft.empty.date else None,
        ),
        units=UnitsInfo(mass=units.mass, arm=units.arm, fuel_volume=units.fuel_volume, moment=units.moment),
        caution=PILOT_CAUTION,
        category=[resolved.category for resolved in loadings],
        ok=oks,
        items=moment_tables(aircraft, stations, fuel, density),
        conditions=[_conditions(aircraft, rows, fixed, margins[fixed.name]) for fixed in once],
        burn_path=burn_paths,
        findings=all_findings,
    )


class _Rows:
    """The engine's per-condition arrays as Python lists, read row by row without numpy scalars."""

    def __init__(self, found: Evaluation):
        # every row stacked and converted at once (two numpy calls for the numbers, two for the flags)
        stacked = np.array(
            [found.weight[k] for k in CONDITIONS]
            + [found.moment[k] for k in CONDITIONS]
            + [found.lateral_moment[k] for k in CONDITIONS]
            + [found.fuel_weight[k] for k in CONDITIONS]
        )
        # the CG and lateral CG of every condition and row (moment / weight, element by element;
        # a weight is never zero: the empty weight is above zero and no load is negative)
        self.arm_array = stacked[4:8] / stacked[0:4]
        arms: list[list[float]] = np.concatenate([self.arm_array, stacked[8:12] / stacked[0:4]]).tolist()
        self.arm = dict(zip(CONDITIONS, arms[0:4], strict=True))
        self.lateral_arm = dict(zip(CONDITIONS, arms[4:8], strict=True))
        numbers: list[list[float]] = stacked.tolist()
        self.weight = dict(zip(CONDITIONS, numbers[0:4], strict=True))
        self.moment = dict(zip(CONDITIONS, numbers[4:8], strict=True))
        self.lateral = dict(zip(CONDITIONS, numbers[8:12], strict=True))
        self.fuel_weight = dict(zip(CONDITIONS, numbers[12:16], strict=True))
        self.fuel = dict(
            zip(CONDITIONS, np.array([found.fuel[k] for k in CONDITIONS]).sum(axis=2).tolist(), strict=True)
        )
        counts = [(len(found.weight_ok[k]), len(found.envelope_inside[k])) for k in CONDITIONS]
        flags: list[list[bool]] = (
            np.array(
                [found.min_weight_ok[k] for k in CONDITIONS]
                + [found.condition_ok[k] for k in CONDITIONS]
                + [v for k in CONDITIONS for v in found.weight_ok[k]]
                + [v for k in CONDITIONS for v in found.envelope_inside[k]]
                + [found.limit_ok["stations"], found.ok],
                dtype=bool,
            )
            .reshape(-1, len(found.ok))
            .tolist()
        )
        self.loads_ok, self.ok = flags[-2], flags[-1]  # every station and group limit holds; the verdict
        self.min_weight_ok = dict(zip(CONDITIONS, flags[0:4], strict=True))
        self.condition_ok = dict(zip(CONDITIONS, flags[4:8], strict=True))
        self.weight_ok, self.inside = {}, {}
        at = 8
        for k, (limits, _) in zip(CONDITIONS, counts, strict=True):
            self.weight_ok[k] = flags[at : at + limits]
            at += limits
        for k, (_, envelopes) in zip(CONDITIONS, counts, strict=True):
            self.inside[k] = flags[at : at + envelopes]
            at += envelopes


# -- conditions -----------------------------------------------------------------------


@dataclass(frozen=True)
class _Once:
    """What the explanation of one condition takes from the aircraft alone, found once for all rows."""

    name: ConditionName
    table: list[tuple[str, float]]  # the weight limits in force (engine.weight_limits)
    weight_limit: float | None  # the lowest of them
    minimum: float | None  # the minimum flight weight
    severity: Severity  # of a point outside an envelope
    labels: list[str]  # each envelope's name in words
    allowance: float  # the ramp allowance [mass unit]
    has_lateral: bool

    @classmethod
    def all(cls, aircraft: Aircraft, category: str) -> list[_Once]:
        """Every condition's, in CONDITIONS order, for this aircraft and category (kept for it,
        as the engine keeps its tables: an aircraft model is immutable)."""
        key = (id(aircraft), category)
        kept = _ONCE.get(key)
        if kept is not None and kept[0] is aircraft:
            return kept[1]
        tables = engine_tables(aircraft)
        envelopes = tables.envelopes[category][0]
        once = [cls.of(aircraft, envelopes, name, tables.weights[name]) for name in CONDITIONS]
        if len(_ONCE) >= _ONCE_KEPT:
            _ONCE.clear()
        _ONCE[key] = (aircraft, once)
        return once

    @classmethod
    def of(cls, aircraft: Aircraft, envelopes: Sequence[Envelope], name: str, table: list[tuple[str, float]]) -> _Once:
        assert _is_condition(name)
        tables = engine_tables(aircraft)
        labels = [envelope.subject for envelope in envelopes]
        zero_fuel_warning = name == "zero_fuel" and aircraft.limits.zero_fuel_cg == "warning"
        return cls(
            name=name,
            table=table,
            weight_limit=min((value for _, value in table), default=None),
            minimum=aircraft.limits.min_flight_weight,
            severity="warning" if zero_fuel_warning else "limit",
            labels=labels,
            allowance=tables.allowance,
            has_lateral=tables.has_lateral,
        )


def _is_condition(name: str) -> TypeGuard[ConditionName]:
    """True for the name of one of the four conditions (:data:`~loadcheck.engine.CONDITIONS`)."""
    return name in CONDITIONS


_ONCE: dict[tuple[int, str], tuple[Aircraft, list[_Once]]] = {}
_ONCE_KEPT = 64


def _conditions(
    aircraft: Aircraft, rows: _Rows, once: _Once, margins: dict[str, list[float | None]]
) -> ConditionColumns:
    """One condition of every row, by column: its weight, CG, moment, fuel, the engine's verdict
    and its margins (``margins``: a column per :class:`~loadcheck.results.Margins` field).

    The findings of a condition outside a limit are :func:`_condition_findings`'."""
    name = once.name
    mac = aircraft.mac
    return ConditionColumns(
        condition=name,
        weight=rows.weight[name],
        arm=rows.arm[name],
        moment=rows.moment[name],
        lateral_arm=rows.lateral_arm[name] if once.has_lateral else None,
        lateral_moment=rows.lateral[name] if once.has_lateral else None,
        mac_percent=mac.percent(rows.arm_array[CONDITIONS.index(name)]).tolist() if mac else None,
        fuel=rows.fuel[name],
        fuel_weight=rows.fuel_weight[name],
        max_weight=once.weight_limit,
        ok=rows.condition_ok[name],
        margins=margins,
    )


def _condition_findings(
    aircraft: Aircraft,
    rows: _Rows,
    i: int,
    shapes: Sequence[EnvelopeShape],
    once: _Once,
    findings: list[Finding],
    cuts: dict[tuple[str, int], dict[int, _Cut | None]] | None,
    weight: float,
    moment: float,
    lateral: float,
) -> None:
    """The findings of one condition of row ``i`` that the engine found outside a limit: each
    weight limit, the minimum flight weight, each envelope."""
    units = aircraft.units
    name = once.name
    for (code, limit), good in zip(once.table, rows.weight_ok[name], strict=True):
        if not good[i]:
            findings.append(
                Finding(
                    code=code,
                    severity="limit",
                    condition=name,
                    message=weight_limit_message(name, weight, code, limit, units.mass),
                    excess=weight - limit,
                    unit=units.mass,
                    limit=limit,
                    side="above",
                )
            )
    if not rows.min_weight_ok[name][i]:
        minimum = once.minimum
        assert minimum is not None
        findings.append(
            Finding(
                code="min_flight_weight",
                severity="limit",
                condition=name,
                message=weight_limit_message(name, weight, "min_flight_weight", minimum, units.mass),
                excess=minimum - weight,
                unit=units.mass,
                limit=minimum,
                side="below",
            )
        )
    for k, (label, shape, inside) in enumerate(zip(once.labels, shapes, rows.inside[name], strict=True)):
        if not inside[i]:
            tested = envelope_state(shape, name, weight, moment, lateral, allowance=once.allowance)
            cut: _Cut | Literal[False] | None = False if cuts is None else cuts[(name, k)][i]
            findings.append(
                _outside_finding(
                    aircraft, shape, label, name, *tested, once.severity, allowance=once.allowance, cut=cut
                )
            )


def _pick(intervals: list[tuple[float, float]], value: float) -> tuple[float, float]:
    """The interval holding ``value``, else the nearest one."""
    if len(intervals) == 1:
        return intervals[0]
    return min(intervals, key=lambda iv: max(iv[0] - value, value - iv[1], 0.0))


# -- margins --------------------------------------------------------------------------
#
# The margin to a limit at a condition is read off a slice of each envelope: the line on
# which one quantity (arm, lateral arm or weight) runs with the others held, cut at every
# edge it crosses (EnvelopeShape.slice). Here every slice of every loading and condition
# is cut at once: the same arithmetic, in the same order, on arrays.

_MARGIN_KEYS = ("forward", "aft", "left", "right", "weight")
_ONE_BY_ONE = 2  # up to this many loadings, slices are cut one at a time (fewer numpy calls)


def _margins_one(
    shapes: Sequence[EnvelopeShape],
    states: Sequence[tuple[float, float, float]],
    weight_limits: Sequence[float | None],
    allowance: float,
    short: Sequence[float] = (),
) -> list[Margins]:
    """The margins of one loading at each condition (``states``: weight, moment, lateral
    moment in CONDITIONS order), from :meth:`EnvelopeShape.slices`: every slice of an
    envelope cut with one containment call."""
    values: list[dict[str, float]] = [{} for _ in CONDITIONS]

    def keep(k: int, key: str, value: float) -> None:
        held = values[k]
        held[key] = min(held.get(key, value), value)

    for k, (weight, _, _) in enumerate(states):
        limit = weight_limits[k]
        if limit is not None:
            keep(k, "weight", limit - weight)
        if short and short[k] == short[k]:  # not NaN: below the minimum flight weight
            keep(k, "weight", short[k])
    for shape in shapes:
        lines: list[tuple[float, float, float, Vary]] = []
        held: list[tuple[int, str, float]] = []  # per line: condition, what it gives, the value held
        for k, name in enumerate(CONDITIONS):
            w, m, lat = envelope_state(shape, name, *states[k], allowance=allowance)
            arm, lateral_arm = m / w, lat / w
            if shape.is_lateral:
                lines.append((w, arm, lateral_arm, "lateral"))
                held.append((k, "lateral", lateral_arm))
            else:
                lines.append((w, arm, lateral_arm, "arm"))
                held.append((k, "arm", arm))
            if shape.weight_range is not None:  # a lateral envelope drawn against weight limits it too
                lines.append((w, arm, lateral_arm, "weight"))
                held.append((k, "weight", w))
        for (k, what, value), intervals in zip(held, shape.slices(lines), strict=True):
            if not intervals:
                if what == "weight":  # no weight at all is inside at this CG
                    keep(k, "weight", _room_outside(shape, k, states[k][0], allowance))
                continue
            lo, hi = _pick(intervals, value)
            if what == "lateral":
                keep(k, "left", value - lo)
                keep(k, "right", hi - value)
            elif what == "arm":
                keep(k, "forward", value - lo)
                keep(k, "aft", hi - value)
            else:
                room = _room_to(shape, k, hi, allowance) - states[k][0]
                keep(k, "weight", min(room, value - lo) if value < lo - _weight_noise(shape) else room)
    return [Margins(**v) for v in values]


def _weight_noise(shape: EnvelopeShape) -> float:
    """How far below an envelope's weight slice a weight may lie and still count as on it:
    the containment tolerance of :data:`loadcheck.envelope.TOLERANCE` on the weight axis [mass unit]."""
    band = shape.weight_range
    return 0.0 if band is None else ENVELOPE_TOLERANCE * max(band[1] - band[0], 1.0)


def _room_outside(shape: EnvelopeShape, k: int, weight: Any, allowance: float) -> Any:
    """The weight margin an envelope gives where no weight is inside it at the CG tested:
    never positive, since no weight is allowed at that CG; negative by how far the weight is
    above the envelope's top (with the ramp allowance at ramp) where it is [mass unit]."""
    top = shape.max_weight
    if isinstance(weight, np.ndarray):
        return (
            np.full(weight.shape, np.nan)
            if top is None
            else np.minimum(_room_to(shape, k, top, allowance) - weight, 0.0)
        )
    return 0.0 if top is None else min(_room_to(shape, k, top, allowance) - weight, 0.0)


def _room_to(shape: EnvelopeShape, k: int, high: Any, allowance: float) -> Any:
    """The highest weight the envelope allows at condition ``k`` (CONDITIONS order) and the
    CG tested, from the top ``high`` of its weight slice: at ramp, where that is the
    envelope's top, the top plus the ramp allowance (:func:`loadcheck.engine.envelope_state`)
    [mass unit]."""
    top = shape.max_weight
    if k != 0 or top is None:
        return high
    return (
        np.where(high >= top * (1 - 1e-12), high + allowance, high)
        if isinstance(high, np.ndarray)
        else (high + allowance if high >= top * (1 - 1e-12) else high)
    )


def _margins(
    shapes: Sequence[EnvelopeShape],
    found: Evaluation,
    weights: dict[str, list[tuple[str, float]]],
    allowance: float,
    minimum: float | None = None,
) -> dict[str, dict[str, list[float | None]]]:
    """The margins of every loading at every condition, a column for each of
    :class:`~loadcheck.results.Margins`' fields (None where no envelope gives that limit).

    A few loadings are cut one slice at a time (:func:`_margins_one`, plain floats); many
    are cut together (the same arithmetic on arrays). The fleet check's agreement tests
    compare the two, row for row.
    """
    n = len(found.ok)
    # below the minimum flight weight, as the engine found it: minus the weight short of it
    short = {
        name: np.where(found.min_weight_ok[name], np.nan, found.weight[name] - (minimum or 0.0)) for name in CONDITIONS
    }
    if n <= _ONE_BY_ONE:
        limits = [min((value for _, value in weights[name]), default=None) for name in CONDITIONS]
        states = [
            (found.weight[name].tolist(), found.moment[name].tolist(), found.lateral_moment[name].tolist())
            for name in CONDITIONS
        ]
        per_row = [
            _margins_one(
                shapes,
                [(w[i], m[i], lat[i]) for w, m, lat in states],
                limits,
                allowance,
                [float(short[name][i]) for name in CONDITIONS],
            )
            for i in range(n)
        ]
        return {
            name: {key: [getattr(row[k], key) for row in per_row] for key in _MARGIN_KEYS}
            for k, name in enumerate(CONDITIONS)
        }
    values = {name: {key: np.full(n, np.nan) for key in _MARGIN_KEYS} for name in CONDITIONS}

    def keep(name: str, key: str, value: np.ndarray) -> None:
        held = values[name][key]
        values[name][key] = np.where(np.isnan(held), value, np.where(value < held, value, held))

    for name in CONDITIONS:
        weight_limit = min((value for _, value in weights[name]), default=None)
        if weight_limit is not None:
            keep(name, "weight", weight_limit - found.weight[name])
        if not np.isnan(short[name]).all():
            keep(name, "weight", short[name])
    for shape in shapes:
        tested = [
            envelope_state(
                shape, name, found.weight[name], found.moment[name], found.lateral_moment[name], allowance=allowance
            )
            for name in CONDITIONS
        ]
        w = np.concatenate([t[0] for t in tested])
        m = np.concatenate([t[1] for t in tested])
        lat = np.concatenate([t[2] for t in tested])
        arm, lateral_arm = m / w, lat / w
        vary: Vary = "lateral" if shape.is_lateral else "arm"
        lines = [(vary, w, arm, lateral_arm)]
        weighed = shape.weight_range is not None  # every longitudinal envelope, a lateral one drawn against weight
        if weighed:  # the weight margin, at every condition
            lines.append(("weight", w, arm, lateral_arm))
        lo, hi, _, _ = _slices(shape, lines)
        held = lateral_arm if shape.is_lateral else arm
        first, second = ("left", "right") if shape.is_lateral else ("forward", "aft")
        for k, name in enumerate(CONDITIONS):
            part = slice(k * n, (k + 1) * n)
            found_here = ~np.isnan(lo[part])
            if found_here.any():
                keep(name, first, np.where(found_here, held[part] - lo[part], np.nan))
                keep(name, second, np.where(found_here, hi[part] - held[part], np.nan))
            if weighed:
                part = slice(4 * n + k * n, 4 * n + (k + 1) * n)
                top, bottom, tested_weight = hi[part], lo[part], w[k * n : (k + 1) * n]
                weight = found.weight[name]
                with np.errstate(invalid="ignore"):
                    room = _room_to(shape, k, top, allowance) - weight
                    room = np.where(
                        tested_weight < bottom - _weight_noise(shape), np.minimum(room, tested_weight - bottom), room
                    )
                keep(name, "weight", np.where(np.isnan(top), _room_outside(shape, k, weight, allowance), room))
    return {name: {key: _none_for_nan(values[name][key]) for key in _MARGIN_KEYS} for name in CONDITIONS}


def _none_for_nan(column: np.ndarray) -> list[float | None]:
    """A column of margins as Python numbers, NaN (no envelope gives that limit) as None."""
    missing = np.isnan(column)
    if missing.all():
        return [None] * len(column)
    numbers: list[float | None] = (
        np.where(missing, np.array(None, dtype=object), column) if missing.any() else column
    ).tolist()  # floats, and None where missing
    return numbers


def _slice_lines(
    shape: EnvelopeShape, vary: str, weight: np.ndarray, arm: np.ndarray, lateral_arm: np.ndarray
) -> tuple[Any, ...]:
    """The scaled lines of :meth:`EnvelopeShape.slice` for arrays: start, direction, and the held value."""
    zero, one = np.zeros_like(weight), np.ones_like(weight)
    at: Any = shape._at  # plain arithmetic: works on arrays as on floats
    if vary == "arm":
        p0, p1, value = at(weight, zero, lateral_arm), at(weight, one, lateral_arm), arm
    elif vary == "weight":
        p0, p1, value = at(zero, arm, lateral_arm), at(one, arm, lateral_arm), weight
    else:
        p0, p1, value = at(weight, arm, zero), at(weight, arm, one), lateral_arm
    (x0, y0), (x1, y1) = p0, p1
    sx, sy = x1 - x0, y1 - y0
    (ox, oy), (wx, wy) = shape._origin_span
    return (x0 - ox) / wx, (y0 - oy) / wy, sx / wx, sy / wy, value, (sx == 0.0) & (sy == 0.0)


def _slices(
    shape: EnvelopeShape, lines: Sequence[tuple[str, Any, Any, Any]]
) -> tuple[np.ndarray, np.ndarray, np.ndarray, np.ndarray]:
    """For each line, the inside interval holding the held value, else the nearest one, and the
    lowest and highest inside value of the whole line (NaN where none).

    The arithmetic of :meth:`EnvelopeShape.slices` for many lines at once: every
    edge crossing is a cut, each stretch between cuts is inside as its middle is, a lone
    cut touching the polygon is an interval of zero length; the interval is then picked
    as :func:`_pick` does, and the extent is the first interval's start and the last one's end.
    """
    parts = [_slice_lines(shape, *line) for line in lines]
    ax, ay, dx, dy, value, flat = (np.concatenate([p[j] for p in parts]) for j in range(6))
    scale = np.maximum(np.abs(dx), np.abs(dy))
    # what every edge's test reads of the lines alone, found once for all edges
    parallel, on_edge, unflat = 1e-14 * scale, 1e-12 * scale, ~flat
    columns = []
    with np.errstate(divide="ignore", invalid="ignore"):
        for x1, y1, ex, ey in shape._edge_list:
            wx, wy = x1 - ax, y1 - ay
            denom = dx * ey - dy * ex
            crossing = np.abs(denom) > parallel
            across = wx * dy - wy * dx  # the line's offset from the edge's start (crossing and along alike)
            t = across / denom
            columns.append(np.where(crossing & (t >= -1e-12) & (t <= 1 + 1e-12), (wx * ey - wy * ex) / denom, np.nan))
            along = ~crossing & (np.abs(across) <= on_edge) & unflat
            if along.any():  # the line runs along this edge: cut at both its ends
                norm = dx * dx + dy * dy
                columns.append(np.where(along, (wx * dx + wy * dy) / norm, np.nan))
                columns.append(np.where(along, ((wx + ex) * dx + (wy + ey) * dy) / norm, np.nan))
    points = np.sort(np.stack(columns, axis=1), axis=1)
    points[flat] = np.nan
    repeated = np.zeros(points.shape, dtype=bool)
    repeated[:, 1:] = points[:, 1:] == points[:, :-1]
    if repeated.any():
        points = np.sort(np.where(repeated, np.nan, points), axis=1)
    cut = np.isfinite(points)
    # sorted, each line's NaNs come last: the columns that are NaN on every line hold no cut
    # (no stretch, no point, an infinite gap), nothing the rest reads, and are left out
    width = min(max(int((~np.isnan(points)).sum(axis=1).max(initial=0)), 2), points.shape[1])
    if width < points.shape[1]:
        points, cut = points[:, :width], cut[:, :width]
    low, high = points[:, :-1], points[:, 1:]
    stretch = cut[:, :-1] & cut[:, 1:]
    mids = 0.5 * (low + high)
    rs, cs = np.nonzero(stretch)
    rp, cp = np.nonzero(cut)
    probe_x = np.concatenate([ax[rs] + mids[rs, cs] * dx[rs], ax[rp] + points[rp, cp] * dx[rp]])
    probe_y = np.concatenate([ay[rs] + mids[rs, cs] * dy[rs], ay[rp] + points[rp, cp] * dy[rp]])
    hit = shapely.intersects_xy(shape.covering, probe_x, probe_y)
    inside = np.zeros(stretch.shape, dtype=bool)
    inside[rs, cs] = hit[: len(rs)]
    touch = np.zeros(cut.shape, dtype=bool)
    touch[rp, cp] = hit[len(rs) :]
    before = np.zeros(cut.shape, dtype=bool)
    before[:, 1:] = inside
    after = np.zeros(cut.shape, dtype=bool)
    after[:, :-1] = inside
    lone = touch & ~before & ~after
    any_lone = bool(lone.any())  # a line touching the envelope at a lone point: rare
    v = value[:, None]
    gap_stretch = np.where(inside, np.maximum(np.maximum(low - v, v - high), 0.0), np.inf)
    nearest = gap_stretch.min(axis=1, initial=np.inf)
    if any_lone:
        gap_lone = np.where(lone, np.maximum(np.maximum(points - v, v - points), 0.0), np.inf)
        nearest = np.minimum(nearest, gap_lone.min(axis=1, initial=np.inf))
    at_stretch = np.where(gap_stretch == nearest[:, None], low, np.inf)
    k_stretch = at_stretch.argmin(axis=1)
    rows = np.arange(len(ax))
    # the merged run of inside stretches around the chosen one
    index = np.arange(inside.shape[1])
    starts = inside & ~before[:, :-1]
    ends = inside & ~after[:, 1:]
    run_start = np.maximum.accumulate(np.where(starts, index, -1), axis=1)
    run_end = np.minimum.accumulate(np.where(ends, index, inside.shape[1])[:, ::-1], axis=1)[:, ::-1]
    lo = points[rows, np.clip(run_start[rows, k_stretch], 0, None)]
    hi = points[rows, np.clip(run_end[rows, k_stretch] + 1, None, points.shape[1] - 1)]
    first = np.where(inside, low, np.inf).min(axis=1, initial=np.inf)
    last = np.where(inside, high, -np.inf).max(axis=1, initial=-np.inf)
    if any_lone:  # a lone point may be the nearest part inside, and either end of the extent
        at_lone = np.where(gap_lone == nearest[:, None], points, np.inf)
        k_lone = at_lone.argmin(axis=1)
        use_lone = at_lone[rows, k_lone] < at_stretch[rows, k_stretch]
        lo = np.where(use_lone, points[rows, k_lone], lo)
        hi = np.where(use_lone, points[rows, k_lone], hi)
        first = np.minimum(first, np.where(lone, points, np.inf).min(axis=1, initial=np.inf))
        last = np.maximum(last, np.where(lone, points, -np.inf).max(axis=1, initial=-np.inf))
    # with no lone point, a line with no part inside has an infinite gap: said as none below
    none = ~np.isfinite(nearest) | flat
    return (
        np.where(none, np.nan, lo),
        np.where(none, np.nan, hi),
        np.where(none, np.nan, first),
        np.where(none, np.nan, last),
    )


_Cut = tuple[float, float, float, float]
"""A slice of an envelope as :func:`_outside_finding` reads it: the lowest and highest inside
value of the line, and the inside interval nearest the CG (low, high) [arm unit]."""


def _outside_cuts(
    shapes: Sequence[EnvelopeShape], found: Evaluation, allowance: float
) -> dict[tuple[str, int], dict[int, _Cut | None]]:
    """The slices :func:`_outside_finding` compares the CG on, for every row outside an envelope
    at a condition, cut together (one :func:`_slices` per envelope), by envelope index and
    condition, then row.

    Each row's line is the one :func:`_outside_finding` cuts by itself: the state the envelope
    tests (:func:`~loadcheck.engine.envelope_state`), at its weight or, beyond the envelope's
    weight range, at the nearer end of it; the arithmetic is the same, element by element.
    """
    out: dict[tuple[str, int], dict[int, _Cut | None]] = {}
    for k, shape in enumerate(shapes):
        parts = []
        for name in CONDITIONS:
            rows = np.flatnonzero(~np.asarray(found.envelope_inside[name][k], dtype=bool))
            if len(rows) == 0:
                continue
            w, m, lat = envelope_state(
                shape,
                name,
                found.weight[name][rows],
                found.moment[name][rows],
                found.lateral_moment[name][rows],
                allowance=allowance,
            )
            at = w
            band = shape.weight_range
            if band is not None:  # beyond the weight range: compared at its nearer end
                at = np.where((band[0] <= w) & (w <= band[1]), w, np.where(w > band[1], band[1], band[0]))
            parts.append((name, rows, at, m / w, lat / w))
        if not parts:
            continue
        vary = "lateral" if shape.is_lateral else "arm"
        at, arm, lateral_arm = (np.concatenate([part[j] for part in parts]) for j in (2, 3, 4))
        lo, hi, first, last = (v.tolist() for v in _slices(shape, [(vary, at, arm, lateral_arm)]))
        at_row = 0
        for name, rows, *_ in parts:
            cuts: dict[int, _Cut | None] = {}
            for i in rows.tolist():
                low, high = first[at_row], last[at_row]
                cuts[i] = None if low != low else (low, high, lo[at_row], hi[at_row])
                at_row += 1
            out[(name, k)] = cuts
    return out


def _outside_finding(
    aircraft: Aircraft,
    shape: EnvelopeShape,
    label: str,
    name: ConditionName,
    weight: float,
    moment: float,
    lateral_moment: float,
    severity: Severity,
    *,
    allowance: float = 0.0,
    cut: _Cut | Literal[False] | None = False,
) -> Finding:
    """Say in plain words where a point outside an envelope lies, and by how much.

    ``cut``: the slice of the envelope the CG is compared on (:data:`_Cut`: its extent and the
    interval nearest the CG), where it was cut with other rows' (:func:`_outside_cuts`); by
    default it is cut here (:meth:`EnvelopeShape.slice`).

    At ramp a weight above the envelope's top is measured from the top plus the ramp
    ``allowance`` [mass unit], the weight :func:`loadcheck.engine.envelope_state` holds to the
    top, so the excess is the one the ramp weight margin shows.

    The CG is compared with the limits at the point's weight (forward/aft, or left/right
    for a lateral envelope); a weight beyond the envelope's weight range is reported as
    above or below it, with the CG compared at the envelope's top or bottom as well.
    """
    units = aircraft.units
    arm, lateral = moment / weight, lateral_moment / weight
    is_lateral = shape.is_lateral
    value = lateral if is_lateral else arm
    sides = ("left", "right") if is_lateral else ("forward", "aft")
    vary: Vary = "lateral" if is_lateral else "arm"

    def across(at_weight: float) -> tuple[str, float, float] | None:
        if cut is False:
            intervals = shape.slice(at_weight, arm, lateral, vary)
            found = (intervals[0][0], intervals[-1][1], *_pick(intervals, value)) if intervals else None
        else:
            found = cut
        if found is None:
            return None
        low, high, lo, hi = found
        if value < low:
            return sides[0], low - value, low
        if value > high:
            return sides[1], value - high, high
        if lo <= value <= hi:
            return None
        nearest = lo if value < lo else hi
        return "outside", abs(value - nearest), nearest

    band = shape.weight_range
    side: str = "outside"
    excess: float | None = None
    limit: float | None = None
    unit: str | None = None
    if band is not None and not band[0] <= weight <= band[1]:
        edge = band[1] if weight > band[1] else band[0]
        side = "above" if weight > band[1] else "below"
        ramp_allowance = allowance if name == "ramp" and side == "above" else 0.0
        excess, limit, unit = abs(weight - (edge + ramp_allowance)), edge + ramp_allowance, units.mass
        there = across(edge)
        text = envelope_weight_message(
            name,
            label,
            weight,
            edge,
            units.mass,
            None if there is None else (there[0], value, there[2], units.arm),
            ramp_allowance=ramp_allowance,
        )
    else:
        found = across(weight)
        if found is not None and "lateral_moment" in shape.axes and found[0] != "outside":
            # drawn as lateral moment against weight: say it in moment (FAA-H-8083-1B ch. 8, fig. 8-3)
            side, excess, limit = found[0], found[1] * weight, found[2] * weight
            unit = units.moment
            text = envelope_moment_message(name, label, side, lateral_moment, limit, weight, units.moment, units.mass)
        elif found is not None:
            side, excess, limit = found
            unit = units.arm
            if side == "outside":
                text = envelope_gap_message(name, label, is_lateral, value, limit, weight, units.arm, units.mass)
            else:
                text = envelope_side_message(name, label, is_lateral, side, value, limit, weight, units.arm, units.mass)
        else:
            text = envelope_point_message(name, label, is_lateral, weight, value, units.arm, units.mass)
    if severity == "warning":
        text += ZERO_FUEL_WARNING
    return Finding(
        code="envelope",
        severity=severity,
        condition=name,
        message=text,
        excess=excess,
        unit=unit,
        limit=limit,
        side=side,
        subject=label,
    )


# -- burn path --------------------------------------------------------------------------


_PathPoints = tuple[list[float], list[float], dict[float, tuple[float, float, float, float]], list[int | None]]
"""What the explanation of one loading's burn path reads: the sample marks, the stretch ends,
the state (weight, moment, lateral moment, fuel on board) at each of them and at the middle of
each stretch outside, and for each stretch the index in the aircraft file of the first envelope
its middle lies outside (an empty list where the path stays inside)."""


def _path_points(
    aircraft: Aircraft,
    loadings: Sequence[ResolvedLoading],
    found: Evaluation,
    category: str,
    with_samples: bool,
    arrays: tuple[np.ndarray, np.ndarray, np.ndarray],
) -> dict[int, _PathPoints]:
    """The states along the burn path that :func:`_burn_path` tells of, for every loading whose path
    is explained (it leaves an envelope, or its samples are drawn), found together: one
    :func:`~loadcheck.engine.path_states_many` call, one containment call per envelope.

    ``arrays``: the stations (N, S), fuel (N, T) and densities (T,) the engine was given; the
    loadings share one burn order (:func:`check_many` groups them so)."""
    assert found.path_outside is not None
    chosen: list[int] = []
    plans: list[tuple[list[float], list[float], list[float]]] = []
    for i, resolved in enumerate(loadings):
        stretches = found.path_outside[i]
        if not stretches and not with_samples:  # inside all the way, nothing to draw
            continue
        start, end = resolved.taxi, resolved.taxi + resolved.trip
        marks = (
            [start + (end - start) * k / _SAMPLES for k in range(_SAMPLES + 1)] if with_samples and end > start else []
        )
        ends = [b for stretch in stretches for b in stretch]
        halfway = [0.5 * (begin + finish) for begin, finish in stretches]
        chosen.append(i)
        plans.append((marks, ends, sorted(set(marks + ends)) + halfway))
    if not chosen:
        return {}
    order = loadings[chosen[0]].plan.order
    states = path_states_many(
        aircraft,
        arrays[0][chosen],
        arrays[1][chosen],
        [np.array(points) for _, _, points in plans],
        order=order,
        density=arrays[2],
    )
    out: dict[int, _PathPoints] = {}
    middles: list[tuple[int, tuple[float, float, float, float]]] = []  # (loading, state) of every stretch's middle
    for i, (marks, ends, points), (weights, moments, laterals, quantities) in zip(chosen, plans, states, strict=True):
        state = dict(
            zip(
                points,
                zip(
                    weights.tolist(), moments.tolist(), laterals.tolist(), quantities.sum(axis=1).tolist(), strict=True
                ),
                strict=True,
            )
        )
        count = len(found.path_outside[i])
        middles.extend((i, state[point]) for point in points[len(points) - count :])
        out[i] = (marks, ends, state, [])
    if middles:  # the first envelope of the category each stretch's middle lies outside
        w, m, lat = (np.array([mid[k] for _, mid in middles]) for k in range(3))
        left: list[int | None] = [None] * len(middles)
        for index, envelope in enumerate(aircraft.envelope):
            if envelope.category != category:
                continue
            outside = (~np.asarray(envelope.shape.covers(w, m, lat), dtype=bool)).tolist()
            left = [index if here is None and away else here for here, away in zip(left, outside, strict=True)]
        for (i, _), stretch_left in zip(middles, left, strict=True):
            out[i][3].append(stretch_left)
    return out


def _burn_path(
    aircraft: Aircraft,
    resolved: ResolvedLoading,
    found: Evaluation,
    i: int,
    takeoff_weight: float,
    findings: list[Finding],
    with_samples: bool,
    points: _PathPoints | None,
) -> BurnPath:
    """The burn path explained: samples for drawing, where it leaves, each stretch outside.

    ``takeoff_weight``: the loading's weight at takeoff [mass unit]; ``points``: its states
    along its path (:func:`_path_points`; None where its path
    is inside all the way and not drawn)."""
    assert found.path_outside is not None
    stretches = found.path_outside[i]
    if points is None:  # inside all the way, nothing to draw
        return BurnPath(ok=bool(found.burn_path_ok[i]), samples=[])
    marks, ends, state, left = points
    start, end = resolved.taxi, resolved.taxi + resolved.trip
    takeoff_in = bool(found.envelope_ok["takeoff"][i])
    landing_in = bool(found.envelope_ok["landing"][i])
    ok = bool(found.burn_path_ok[i])
    units = aircraft.units
    lateral = engine_tables(aircraft).has_lateral

    top = takeoff_weight
    samples = (
        [
            PathSample(fuel_burned=top - w, weight=w, arm=m / w, lateral_arm=lat / w if lateral else None)
            for w, m, lat, _ in (state[b] for b in sorted(set(marks + ends)))
        ]
        if with_samples
        else []
    )
    if not stretches:
        return BurnPath(ok=ok, samples=samples)

    scale = max(1.0, end)

    def point(at: float) -> PathSample:
        w, m, lat, _ = state[at]
        return PathSample(fuel_burned=top - w, weight=w, arm=m / w, lateral_arm=lat / w if lateral else None)

    excursions = []
    for (b, e), envelope in zip(stretches, left, strict=True):
        from_takeoff = b - start <= 1e-9 * scale  # outside at takeoff: the path starts out, it does not leave
        to_landing = end - e <= 1e-9 * scale  # outside at landing: it does not come back in
        excursions.append(
            Excursion(
                from_burned=top - state[b][0],
                to_burned=top - state[e][0],
                from_takeoff=from_takeoff,
                to_landing=to_landing,
                leaves=None if from_takeoff else point(b),
                returns=None if to_landing else point(e),
                envelope=envelope,
            )
        )
    first = state[stretches[0][0]]
    payload_weight = float(found.weight["zero_fuel"][i])
    leaves = LeavePoint(
        fuel_burned=top - first[0],
        fuel_remaining=first[0] - payload_weight,
        weight=first[0],
        arm=first[1] / first[0],
        lateral_arm=first[2] / first[0] if lateral else None,
        fuel_burned_volume=stretches[0][0] - start,
        fuel_remaining_volume=first[3],
        envelope=left[0],
        subject=_envelope_subject(aircraft, left[0]),
    )
    for (begin, _), excursion, envelope in zip(stretches, excursions, left, strict=True):
        if (not takeoff_in and excursion.from_takeoff) or (not landing_in and excursion.to_landing):
            continue  # the same excursion is already reported at takeoff or landing
        w, m, lat, on_board = state[begin]
        subject = _envelope_subject(aircraft, envelope)
        findings.append(
            Finding(
                code="burn_path",
                severity="limit",
                message=burn_path_message(
                    excursion.from_burned,
                    excursion.to_burned,
                    w,
                    m / w,
                    on_board,
                    units.mass,
                    units.arm,
                    units.fuel_volume,
                    lateral_arm=lat / w if lateral else None,
                    envelope=subject,
                    to_landing=excursion.to_landing,
                ),
                excess=excursion.to_burned - excursion.from_burned,
                unit=units.mass,
                subject=subject,
            )
        )
    return BurnPath(ok=False, leaves_at=leaves, excursions=excursions, samples=samples)


def _envelope_subject(aircraft: Aircraft, index: int | None) -> str | None:
    """The envelope a stretch of the burn path leaves, in words (None where it is not known)."""
    return None if index is None else aircraft.envelope[index].subject


# -- stations and groups ------------------------------------------------------------------


def _load_findings(aircraft: Aircraft, resolved: ResolvedLoading, found: Evaluation, i: int) -> list[Finding]:
    mass = aircraft.units.mass
    ids = [s.id for s in aircraft.station]
    findings = []
    for column, rule in enumerate(engine_tables(aircraft).loads):
        if not found.load_exceeded[i, column]:
            continue
        loaded = sum(resolved.stations.get(ids[i], 0.0) for i in rule.members)
        findings.append(
            Finding(
                code=rule.code,
                severity="limit",
                message=load_limit_message(rule.label, loaded, rule.limit, rule.is_max, mass),
                excess=abs(loaded - rule.limit),
                unit=mass,
                limit=rule.limit,
                side="above" if rule.is_max else "below",
                subject=rule.subject,
            )
        )
    return findings
