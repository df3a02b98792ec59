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

from .aircraft import Aircraft
from .balance import CONDITIONS, MassState, burn_pieces, condition_states, fuel_state, moment_items, payload_state
from .caution import PILOT_CAUTION
from .display import fmt
from .envelope import EnvelopeShape, Vary, path_excursions
from .loading import Loading, ResolvedLoading, require_usable, resolve_loading
from .results import (
    AircraftInfo,
    BurnPath,
    CheckResult,
    Condition,
    ConditionName,
    Excursion,
    Finding,
    Item,
    LeavePoint,
    Margins,
    PathSample,
    Severity,
    UnitsInfo,
)

__all__ = ["WEIGHT_TOLERANCE", "check_loading"]

WEIGHT_TOLERANCE = 1e-9
"""A weight equal to its limit within this fraction of the limit is within the limit."""

_WORDS = {"ramp": "ramp", "takeoff": "takeoff", "landing": "landing", "zero_fuel": "zero fuel"}


def check_loading(
    aircraft: Aircraft, loading: Loading | ResolvedLoading, *, category: str | None = None, samples: bool = True
) -> CheckResult:
    """Check a loading against every limit of the aircraft.

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
    shapes = [e.shape for e in aircraft.envelopes_for(resolved.category)]
    findings: list[Finding] = []
    states = condition_states(aircraft, resolved)

    conditions = [
        _condition(aircraft, resolved, shapes, name, *states[name], findings)  # type: ignore[arg-type]
        for name in CONDITIONS
    ]
    burn_path = _burn_path(aircraft, resolved, shapes, conditions, findings, samples)
    findings.extend(_station_findings(aircraft, resolved))

    landing_fuel = conditions[2].fuel
    if resolved.reserve is not None and landing_fuel < resolved.reserve * (1 - WEIGHT_TOLERANCE):
        findings.append(
            Finding(
                code="reserve",
                severity="warning",
                condition="landing",
                message=(
                    f"landing fuel {fmt(landing_fuel, units.fuel_volume)} is below the reserve of "
                    f"{fmt(resolved.reserve, units.fuel_volume)} by "
                    f"{fmt(resolved.reserve - landing_fuel, units.fuel_volume, 'up')}"
                ),
                excess=resolved.reserve - landing_fuel,
                unit=units.fuel_volume,
                limit=resolved.reserve,
            )
        )
    findings.extend(Finding(code="assumption", severity="warning", message=note) for note in resolved.notes)

    items = [
        Item(
            id=i.id, name=i.name, kind=i.kind, weight=i.weight, arm=i.arm, moment=i.moment,
            lateral_arm=i.lateral_arm, lateral_moment=i.lateral_moment, fuel_volume=i.fuel_volume,
        )
        for i in moment_items(aircraft, resolved)
    ]
    return CheckResult(
        ok=not any(f.severity == "limit" for f in findings),
        category=resolved.category,
        aircraft=AircraftInfo(
            name=aircraft.name,
            registration=aircraft.registration,
            fingerprint=aircraft.fingerprint,
            empty_weight_date=aircraft.empty.date.isoformat() if aircraft.empty.date else None,
        ),
        items=items,
        conditions=conditions,
        burn_path=burn_path,
        findings=findings,
        units=UnitsInfo(mass=units.mass, arm=units.arm, fuel_volume=units.fuel_volume, moment=units.moment),
        caution=PILOT_CAUTION,
    )


# -- conditions -----------------------------------------------------------------------


def _weight_limits(aircraft: Aircraft, name: str) -> list[tuple[str, float, str]]:
    limits = aircraft.limits
    table: dict[str, list[tuple[str, float | None, str]]] = {
        "ramp": [("max_ramp_weight", limits.ramp, "maximum ramp weight")],
        "takeoff": [("max_takeoff_weight", limits.max_takeoff_weight, "maximum takeoff weight")],
        "landing": [("max_landing_weight", limits.landing, "maximum landing weight")],
        "zero_fuel": [("max_zero_fuel_weight", limits.max_zero_fuel_weight, "maximum zero-fuel weight")],
    }
    return [(code, value, words) for code, value, words in table[name] if value is not None]


def _envelope_state(shape: EnvelopeShape, name: str, state: MassState) -> MassState:
    """The state tested against an envelope: at ramp, weight is held to the envelope's top.

    The envelope is a flight envelope; before taxi the aircraft may be heavier than its
    top by the taxi fuel. Its ramp weight is held to the maximum ramp weight and its CG
    to the envelope's limits at the envelope's highest weight (common practice).
    """
    top = shape.max_weight
    if name != "ramp" or top is None or state.weight <= top:
        return state
    return MassState(top, state.arm * top, state.lateral_arm * top)


def _condition(
    aircraft: Aircraft,
    resolved: ResolvedLoading,
    shapes: Sequence[EnvelopeShape],
    name: ConditionName,
    state: MassState,
    quantities: dict[str, float],
    findings: list[Finding],
) -> Condition:
    units = aircraft.units
    where = _WORDS[name]
    ok = True
    weight_limits = _weight_limits(aircraft, name)
    for code, limit, words in weight_limits:
        if state.weight > limit * (1 + WEIGHT_TOLERANCE):
            ok = False
            excess = state.weight - limit
            findings.append(
                Finding(
                    code=code, severity="limit", condition=name,
                    message=(
                        f"{where} weight {fmt(state.weight, units.mass)} exceeds the {words} "
                        f"{fmt(limit, units.mass)} by {fmt(excess, units.mass, 'up')}"
                    ),
                    excess=excess, unit=units.mass, limit=limit, side="above",
                )
            )
    minimum = aircraft.limits.min_flight_weight
    if name in ("takeoff", "landing") and minimum is not None and state.weight < minimum * (1 - WEIGHT_TOLERANCE):
        ok = False
        findings.append(
            Finding(
                code="min_flight_weight", severity="limit", condition=name,
                message=(
                    f"{where} weight {fmt(state.weight, units.mass)} is below the minimum flight weight "
                    f"{fmt(minimum, units.mass)} by {fmt(minimum - state.weight, units.mass, 'up')}"
                ),
                excess=minimum - state.weight, unit=units.mass, limit=minimum, side="below",
            )
        )
    severity: Severity = "warning" if name == "zero_fuel" and aircraft.limits.zero_fuel_cg == "warning" else "limit"
    for envelope, shape in zip(aircraft.envelopes_for(resolved.category), shapes):
        tested = _envelope_state(shape, name, state)
        if not shape.covers(tested.weight, tested.moment, tested.lateral_moment):
            ok = False
            label = f"the {envelope.label or resolved.category + '-category'} envelope"
            label = label.replace("envelope envelope", "envelope")
            findings.append(_outside_finding(aircraft, shape, label, name, tested, severity))

    fuel_mass = sum(q * resolved.density[t] for t, q in quantities.items())
    has_lateral = aircraft.has_lateral
    weight_limit = min((value for _, value, _ in weight_limits), default=None)
    return Condition(
        condition=name,
        weight=state.weight,
        arm=state.arm,
        moment=state.moment,
        lateral_arm=state.lateral_arm if has_lateral else None,
        lateral_moment=state.lateral_moment if has_lateral else None,
        mac_percent=aircraft.mac.percent(state.arm) if aircraft.mac else None,
        fuel=sum(quantities.values()),
        fuel_weight=fuel_mass,
        max_weight=weight_limit,
        ok=ok,
        margins=_margins(shapes, name, state, weight_limit),
    )


def _pick(intervals: list[tuple[float, float]], value: float) -> tuple[float, float]:
    """The interval holding ``value``, else the nearest one."""
    return min(intervals, key=lambda iv: max(iv[0] - value, value - iv[1], 0.0))


def _margins(shapes: Sequence[EnvelopeShape], name: str, state: MassState, weight_limit: float | None) -> Margins:
    values: dict[str, float] = {}

    def keep(key: str, value: float) -> None:
        values[key] = min(values.get(key, value), value)

    if weight_limit is not None:
        keep("weight", weight_limit - state.weight)
    for shape in shapes:
        tested = _envelope_state(shape, name, state)
        weight, arm, lateral = tested.weight, tested.arm, tested.lateral_arm
        if shape.is_lateral:
            across = shape.slice(weight, arm, lateral, "lateral")
            if across:
                lo, hi = _pick(across, lateral)
                keep("left", lateral - lo)
                keep("right", hi - lateral)
        else:
            along = shape.slice(weight, arm, lateral, "arm")
            if along:
                lo, hi = _pick(along, arm)
                keep("forward", arm - lo)
                keep("aft", hi - arm)
        if name != "ramp" and not shape.is_lateral:
            heights = shape.slice(weight, arm, lateral, "weight")
            if heights:
                keep("weight", _pick(heights, weight)[1] - weight)
    return Margins(**values)


def _outside_finding(
    aircraft: Aircraft,
    shape: EnvelopeShape,
    label: str,
    name: ConditionName,
    state: MassState,
    severity: Severity,
) -> Finding:
    """Say in plain words where a point outside an envelope lies, and by how much.

    The CG is compared with the limits at the point's weight (forward/aft, or left/right
    for a lateral envelope); a weight beyond the envelope's weight range is reported as
    above or below it, with the CG compared at the envelope's top or bottom as well.
    """
    units = aircraft.units
    where = _WORDS[name]
    weight, arm, lateral = state.weight, state.arm, state.lateral_arm
    cg, value = ("lateral CG", lateral) if shape.is_lateral else ("CG", arm)
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
    text = ""
    if band is not None and not band[0] <= weight <= band[1]:
        edge = band[1] if weight > band[1] else band[0]
        side = "above" if weight > band[1] else "below"
        excess, limit, unit = abs(weight - edge), edge, units.mass
        text = (
            f"{where} weight {fmt(weight, units.mass)} is {side} {label}, whose "
            f"{'highest' if side == 'above' else 'lowest'} weight is {fmt(edge, units.mass)}, "
            f"by {fmt(excess, units.mass, 'up')}"
        )
        there = across(edge)
        if there is not None:
            text += (
                f"; its {cg} {fmt(value, units.arm)} is also {there[0]} of the limit there "
                f"({fmt(there[2], units.arm)}) by {fmt(there[1], units.arm, 'up')}"
            )
    else:
        found = across(weight)
        if found is not None:
            side, excess, limit = found
            unit = units.arm
            if side == "outside":
                text = (
                    f"{where} {cg} {fmt(value, units.arm)} falls in a gap of {label} at {fmt(weight, units.mass)}, "
                    f"{fmt(excess, units.arm, 'up')} from the nearest limit ({fmt(limit, units.arm)})"
                )
            else:
                text = (
                    f"{where} {cg} {fmt(value, units.arm)} is {side} of the {side} limit of {label} "
                    f"({fmt(limit, units.arm)} at {fmt(weight, units.mass)}) by {fmt(excess, units.arm, 'up')}"
                )
        else:
            text = f"{where} point ({fmt(weight, units.mass)}, {cg} {fmt(value, units.arm)}) is outside {label}"
    if severity == "warning":
        text += " (a warning: the zero-fuel CG is not a limit for this aircraft)"
    return Finding(
        code="envelope", severity=severity, condition=name, message=text,
        excess=excess, unit=unit, limit=limit, side=side, subject=label,
    )


# -- burn path --------------------------------------------------------------------------


def _burn_path(
    aircraft: Aircraft,
    resolved: ResolvedLoading,
    shapes: Sequence[EnvelopeShape],
    conditions: Sequence[Condition],
    findings: list[Finding],
    with_samples: bool = True,
) -> BurnPath:
    start, end = resolved.taxi, resolved.taxi + resolved.trip
    takeoff = conditions[1]
    takeoff_in = not any(f.code == "envelope" and f.condition == "takeoff" for f in findings)
    landing_in = not any(f.code == "envelope" and f.condition == "landing" for f in findings)
    units = aircraft.units
    payload = payload_state(aircraft, resolved)
    lateral = aircraft.has_lateral

    def state_at(burned: float) -> tuple[MassState, dict[str, float]]:
        quantities = resolved.plan.quantities(burned)
        return payload + fuel_state(aircraft, resolved.density, quantities), quantities

    pieces = burn_pieces(aircraft, resolved, start, end) if end > start else []
    stretches = path_excursions(shapes, pieces)
    marks = {start + (end - start) * k / 40 for k in range(41)} if with_samples else set()
    marks.update(b for stretch in stretches for b in stretch)
    samples = []
    for burned in sorted(marks) if with_samples else []:
        piece = next((p for p in pieces if p.start <= burned <= p.end), None)
        w, m, lat = piece.at(burned) if piece is not None else (takeoff.weight, takeoff.moment, takeoff.lateral_moment or 0.0)
        samples.append(
            PathSample(fuel_burned=takeoff.weight - w, weight=w, arm=m / w, lateral_arm=lat / w if lateral else None)
        )
    if not stretches:
        return BurnPath(ok=takeoff_in if end <= start else True, samples=samples)

    excursions = [
        Excursion(from_burned=takeoff.weight - state_at(b)[0].weight, to_burned=takeoff.weight - state_at(e)[0].weight)
        for b, e in stretches
    ]
    first_state, first_quantities = state_at(stretches[0][0])
    middle = state_at(0.5 * (stretches[0][0] + stretches[0][1]))[0]
    left = next(
        (i for i, e in enumerate(aircraft.envelope)
         if e.category == resolved.category and not e.shape.covers(middle.weight, middle.moment, middle.lateral_moment)),
        None,
    )
    leaves = LeavePoint(
        fuel_burned=takeoff.weight - first_state.weight,
        fuel_remaining=first_state.weight - payload.weight,
        weight=first_state.weight,
        arm=first_state.arm,
        lateral_arm=first_state.lateral_arm if lateral else None,
        fuel_burned_volume=stretches[0][0] - start,
        fuel_remaining_volume=sum(first_quantities.values()),
        envelope=left,
    )
    scale = max(1.0, end)
    for (begin, finish), excursion in zip(stretches, excursions):
        if (not takeoff_in and begin - start <= 1e-9 * scale) or (not landing_in and end - finish <= 1e-9 * scale):
            continue  # the same excursion is already reported at takeoff or landing
        state, quantities = state_at(begin)
        findings.append(
            Finding(
                code="burn_path", severity="limit",
                message=(
                    f"the CG leaves the envelope during the fuel burn after "
                    f"{fmt(excursion.from_burned, units.mass, 'down')} of fuel is burned "
                    f"(at {fmt(state.weight, units.mass)}, CG {fmt(state.arm, units.arm)}, "
                    f"{fmt(sum(quantities.values()), units.fuel_volume)} on board) and stays out until "
                    f"{fmt(excursion.to_burned, units.mass, 'up')} is burned"
                ),
                excess=excursion.to_burned - excursion.from_burned,
                unit=units.mass,
            )
        )
    return BurnPath(ok=False, leaves_at=leaves, excursions=excursions, samples=samples)


# -- stations and groups ------------------------------------------------------------------


def _station_findings(aircraft: Aircraft, resolved: ResolvedLoading) -> list[Finding]:
    mass = aircraft.units.mass
    findings = []
    subjects = [(s.id, s.name, [s.id], s.max_weight, s.min_weight, "station") for s in aircraft.station]
    subjects += [
        (g.id or g.label, g.label, g.stations, g.max_weight, g.min_weight, "group") for g in aircraft.station_group
    ]
    for key, label, members, most, least, kind in subjects:
        loaded = sum(resolved.stations.get(m, 0.0) for m in members)
        if most is not None and loaded > most * (1 + WEIGHT_TOLERANCE) + 1e-12:
            findings.append(
                Finding(
                    code=f"{kind}_max", severity="limit",
                    message=(
                        f"{label}: {fmt(loaded, mass)} exceeds the maximum {fmt(most, mass)} "
                        f"by {fmt(loaded - most, mass, 'up')}"
                    ),
                    excess=loaded - most, unit=mass, limit=most, side="above", subject=key,
                )
            )
        if least is not None and loaded < least * (1 - WEIGHT_TOLERANCE):
            findings.append(
                Finding(
                    code=f"{kind}_min", severity="limit",
                    message=(
                        f"{label}: {fmt(loaded, mass)} is below the minimum {fmt(least, mass)} "
                        f"by {fmt(least - loaded, mass, 'up')}"
                    ),
                    excess=least - loaded, unit=mass, limit=least, side="below", subject=key,
                )
            )
    return findings
