"""The pilot's loading check: every condition, every limit, the whole burn path.

:func:`check_loading` is the one entry point. It resolves the loading against the
aircraft, computes the moment table and the four conditions (:mod:`loadcheck.balance`),
tests each against the weight limits and the category's envelopes, follows the fuel
burn from takeoff to landing as the curve it is (:mod:`loadcheck.envelope`), and returns
a frozen :class:`~loadcheck.results.CheckResult`.

Severity (DESIGN.md): every exceedance is a ``limit``, except the zero-fuel CG outside
the envelope (a ``warning`` unless the aircraft file sets ``zero_fuel_cg = "limit"``),
landing fuel below the reserve, and things taken for granted (a tank not mentioned is
empty), which are warnings.
"""

from __future__ import annotations

from collections.abc import Sequence

import numpy as np

from .aircraft import Aircraft, Envelope
from .balance import moment_items
from .caution import PILOT_CAUTION
from .engine import CONDITIONS, WEIGHT_TOLERANCE, Evaluation, envelope_state, evaluate, load_limits, loading_arrays, path_states, weight_limits
from .envelope import EnvelopeShape, Vary
from .loading import Loading, ResolvedLoading, require_usable, resolve_loading
from .results import (
    AircraftInfo,
    BurnPath,
    CheckResult,
    Condition,
    ConditionName,
    Excursion,
    Finding,
    LeavePoint,
    Margins,
    PathSample,
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
    reserve_message,
    weight_limit_message,
)

__all__ = ["WEIGHT_TOLERANCE", "check_loading"]

_SAMPLES = 40  # evenly spaced points along the burn path for drawing it, besides where it leaves


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
    if isinstance(loading, ResolvedLoading):
        require_usable(loading, aircraft)  # a loading resolved by hand is held to the same rules
        resolved = loading
    else:
        resolved = resolve_loading(loading, aircraft, category=category)
    units = aircraft.units
    rows = loading_arrays(aircraft, resolved)
    found = evaluate(aircraft, rows.stations[None, :], rows.fuel[None, :], np.array([rows.taxi]), np.array([rows.trip]),
                     order=rows.order, category=resolved.category, density=rows.density, explain=True)
    envelopes = aircraft.envelopes_for(resolved.category)
    findings: list[Finding] = []
    conditions = [_condition(aircraft, found, envelopes, name, findings) for name in CONDITIONS]  # type: ignore[arg-type]
    burn_path = _burn_path(aircraft, resolved, found, conditions, findings, samples)
    findings.extend(_load_findings(aircraft, resolved, found))

    landing_fuel = conditions[2].fuel
    if resolved.reserve is not None and landing_fuel < resolved.reserve * (1 - WEIGHT_TOLERANCE):
        findings.append(
            Finding(
                code="reserve", severity="warning", condition="landing",
                message=reserve_message(landing_fuel, resolved.reserve, units.fuel_volume),
                excess=resolved.reserve - landing_fuel, unit=units.fuel_volume, limit=resolved.reserve,
            )
        )
    findings.extend(Finding(code="assumption", severity="warning", message=note) for note in resolved.notes)
    ok = not any(f.severity == "limit" for f in findings)
    assert ok == bool(found.ok[0]), "the explanation must carry the engine's verdict"
    return CheckResult(
        ok=ok,
        category=resolved.category,
        aircraft=AircraftInfo(
            name=aircraft.name,
            registration=aircraft.registration,
            fingerprint=aircraft.fingerprint,
            empty_weight_date=aircraft.empty.date.isoformat() if aircraft.empty.date else None,
        ),
        items=moment_items(aircraft, resolved),
        conditions=conditions,
        burn_path=burn_path,
        findings=findings,
        units=UnitsInfo(mass=units.mass, arm=units.arm, fuel_volume=units.fuel_volume, moment=units.moment),
        caution=PILOT_CAUTION,
    )


# -- conditions -----------------------------------------------------------------------


def _condition(
    aircraft: Aircraft,
    found: Evaluation,
    envelopes: Sequence[Envelope],
    name: ConditionName,
    findings: list[Finding],
) -> Condition:
    units = aircraft.units
    weight, moment, lateral = float(found.weight[name][0]), float(found.moment[name][0]), float(found.lateral_moment[name][0])
    table = weight_limits(aircraft)[name]
    for (code, limit), good in zip(table, found.weight_ok[name], strict=True):
        if not good[0]:
            findings.append(
                Finding(
                    code=code, severity="limit", condition=name,
                    message=weight_limit_message(name, weight, code, limit, units.mass),
                    excess=weight - limit, unit=units.mass, limit=limit, side="above",
                )
            )
    if not found.min_weight_ok[name][0]:
        minimum = aircraft.limits.min_flight_weight
        assert minimum is not None
        findings.append(
            Finding(
                code="min_flight_weight", severity="limit", condition=name,
                message=weight_limit_message(name, weight, "min_flight_weight", minimum, units.mass),
                excess=minimum - weight, unit=units.mass, limit=minimum, side="below",
            )
        )
    severity: Severity = "warning" if name == "zero_fuel" and aircraft.limits.zero_fuel_cg == "warning" else "limit"
    for envelope, inside in zip(envelopes, found.envelope_inside[name], strict=True):
        if not inside[0]:
            tested = envelope_state(envelope.shape, name, weight, moment, lateral)
            label = f"the {envelope.label or envelope.category + '-category'} envelope"
            label = label.replace("envelope envelope", "envelope")
            findings.append(_outside_finding(aircraft, envelope.shape, label, name, *tested, severity))

    has_lateral = aircraft.has_lateral
    weight_limit = min((value for _, value in table), default=None)
    return Condition(
        condition=name,
        weight=weight,
        arm=moment / weight,
        moment=moment,
        lateral_arm=lateral / weight if has_lateral else None,
        lateral_moment=lateral if has_lateral else None,
        mac_percent=aircraft.mac.percent(moment / weight) if aircraft.mac else None,
        fuel=float(found.fuel[name][0].sum()),
        fuel_weight=float(found.fuel_weight[name][0]),
        max_weight=weight_limit,
        ok=bool(found.condition_ok[name][0]),
        margins=_margins([e.shape for e in envelopes], name, weight, moment, lateral, weight_limit),
    )


def _pick(intervals: list[tuple[float, float]], value: float) -> tuple[float, float]:
    """The interval holding ``value``, else the nearest one."""
    return min(intervals, key=lambda iv: max(iv[0] - value, value - iv[1], 0.0))


def _margins(
    shapes: Sequence[EnvelopeShape], name: str, weight: float, moment: float, lateral: float, weight_limit: float | None
) -> Margins:
    values: dict[str, float] = {}

    def keep(key: str, value: float) -> None:
        values[key] = min(values.get(key, value), value)

    if weight_limit is not None:
        keep("weight", weight_limit - weight)
    for shape in shapes:
        w, m, lat = envelope_state(shape, name, weight, moment, lateral)
        arm, lateral_arm = m / w, lat / w
        if shape.is_lateral:
            across = shape.slice(w, arm, lateral_arm, "lateral")
            if across:
                lo, hi = _pick(across, lateral_arm)
                keep("left", lateral_arm - lo)
                keep("right", hi - lateral_arm)
        else:
            along = shape.slice(w, arm, lateral_arm, "arm")
            if along:
                lo, hi = _pick(along, arm)
                keep("forward", arm - lo)
                keep("aft", hi - arm)
        if name != "ramp" and not shape.is_lateral:
            heights = shape.slice(w, arm, lateral_arm, "weight")
            if heights:
                keep("weight", _pick(heights, w)[1] - w)
    return Margins(**values)


def _outside_finding(
    aircraft: Aircraft,
    shape: EnvelopeShape,
    label: str,
    name: ConditionName,
    weight: float,
    moment: float,
    lateral_moment: float,
    severity: Severity,
) -> Finding:
    """Say in plain words where a point outside an envelope lies, and by how much.

    The CG is compared with the limits at the point's weight (forward/aft, or left/right
    for a lateral envelope); a weight beyond the envelope's weight range is reported as
    above or below it, with the CG compared at the envelope's top or bottom as well.
    """
    units = aircraft.units
    arm, lateral = moment / weight, lateral_moment / weight
    value = lateral if shape.is_lateral else arm
    sides = ("left", "right") if shape.is_lateral else ("forward", "aft")
    vary: Vary = "lateral" if shape.is_lateral else "arm"

    def across(at_weight: float) -> tuple[str, float, float] | None:
        intervals = shape.slice(at_weight, arm, lateral, vary)
        if not intervals:
            return None
        low, high = intervals[0][0], intervals[-1][1]
        if value < low:
            return sides[0], low - value, low
        if value > high:
            return sides[1], value - high, high
        lo, hi = _pick(intervals, value)
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
        excess, limit, unit = abs(weight - edge), edge, units.mass
        there = across(edge)
        text = envelope_weight_message(name, label, weight, edge, units.mass,
                                       None if there is None else (there[0], value, there[2], units.arm))
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
                text = envelope_gap_message(name, label, shape.is_lateral, value, limit, weight, units.arm, units.mass)
            else:
                text = envelope_side_message(name, label, shape.is_lateral, side, value, limit, weight, units.arm, units.mass)
        else:
            text = envelope_point_message(name, label, shape.is_lateral, weight, value, units.arm, units.mass)
    if severity == "warning":
        text += ZERO_FUEL_WARNING
    return Finding(
        code="envelope", severity=severity, condition=name, message=text,
        excess=excess, unit=unit, limit=limit, side=side, subject=label,
    )


# -- burn path --------------------------------------------------------------------------


def _burn_path(
    aircraft: Aircraft,
    resolved: ResolvedLoading,
    found: Evaluation,
    conditions: Sequence[Condition],
    findings: list[Finding],
    with_samples: bool = True,
) -> BurnPath:
    start, end = resolved.taxi, resolved.taxi + resolved.trip
    takeoff = conditions[1]
    takeoff_in = bool(found.envelope_ok["takeoff"][0])
    landing_in = bool(found.envelope_ok["landing"][0])
    ok = bool(found.burn_path_ok[0])
    units = aircraft.units
    lateral = aircraft.has_lateral
    assert found.path_outside is not None
    stretches = found.path_outside[0]
    rows = loading_arrays(aircraft, resolved)

    marks = [start + (end - start) * k / _SAMPLES for k in range(_SAMPLES + 1)] if with_samples and end > start else []
    ends = [b for stretch in stretches for b in stretch]
    middle = [0.5 * (stretches[0][0] + stretches[0][1])] if stretches else []
    points = sorted(set(marks + ends)) + middle
    if points:
        weights, moments, laterals, quantities = path_states(
            aircraft, rows.stations, rows.fuel, np.array(points), order=rows.order, density=rows.density
        )
    state = {b: (float(weights[i]), float(moments[i]), float(laterals[i]), float(quantities[i].sum()))
             for i, b in enumerate(points)} if points else {}
    samples = [
        PathSample(fuel_burned=takeoff.weight - state[b][0], weight=state[b][0], arm=state[b][1] / state[b][0],
                   lateral_arm=state[b][2] / state[b][0] if lateral else None)
        for b in sorted(set(marks + ends))
    ] if with_samples else []
    if not stretches:
        return BurnPath(ok=ok, samples=samples)

    excursions = [Excursion(from_burned=takeoff.weight - state[b][0], to_burned=takeoff.weight - state[e][0])
                  for b, e in stretches]
    first = state[stretches[0][0]]
    w_mid, m_mid, l_mid, _ = state[middle[0]]
    left = next(
        (i for i, e in enumerate(aircraft.envelope)
         if e.category == resolved.category and not e.shape.covers(w_mid, m_mid, l_mid)),
        None,
    )
    payload_weight = float(found.weight["zero_fuel"][0])
    leaves = LeavePoint(
        fuel_burned=takeoff.weight - first[0],
        fuel_remaining=first[0] - payload_weight,
        weight=first[0],
        arm=first[1] / first[0],
        lateral_arm=first[2] / first[0] if lateral else None,
        fuel_burned_volume=stretches[0][0] - start,
        fuel_remaining_volume=first[3],
        envelope=left,
    )
    scale = max(1.0, end)
    for (begin, finish), excursion in zip(stretches, excursions, strict=True):
        if (not takeoff_in and begin - start <= 1e-9 * scale) or (not landing_in and end - finish <= 1e-9 * scale):
            continue  # the same excursion is already reported at takeoff or landing
        w, m, _, on_board = state[begin]
        findings.append(
            Finding(
                code="burn_path", severity="limit",
                message=burn_path_message(excursion.from_burned, excursion.to_burned, w, m / w, on_board,
                                          units.mass, units.arm, units.fuel_volume),
                excess=excursion.to_burned - excursion.from_burned,
                unit=units.mass,
            )
        )
    return BurnPath(ok=False, leaves_at=leaves, excursions=excursions, samples=samples)


# -- stations and groups ------------------------------------------------------------------


def _load_findings(aircraft: Aircraft, resolved: ResolvedLoading, found: Evaluation) -> list[Finding]:
    mass = aircraft.units.mass
    ids = [s.id for s in aircraft.station]
    findings = []
    for column, rule in enumerate(load_limits(aircraft)):
        if not found.load_exceeded[0, column]:
            continue
        loaded = sum(resolved.stations.get(ids[i], 0.0) for i in rule.members)
        findings.append(
            Finding(
                code=rule.code, severity="limit",
                message=load_limit_message(rule.label, loaded, rule.limit, rule.is_max, mass),
                excess=abs(loaded - rule.limit), unit=mass, limit=rule.limit,
                side="above" if rule.is_max else "below", subject=rule.subject,
            )
        )
    return findings
