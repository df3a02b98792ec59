"""The loading schedule: the three loading conditions of AC 43.13-1B paragraph 10-18.

When placards do not settle how an aircraft may be loaded, the schedule answers:

1. with full fuel: how many occupants and how much baggage;
2. with every seat filled: how much fuel and baggage;
3. with maximum baggage: how much fuel, how many occupants and where they sit.

Each answer is a placard: it must hold over the whole fuel range it covers, from the fuel
it states at engine start down to zero usable fuel, every tank burning in proportion to
its fuel. So each case is built and checked as a flight that burns all of its fuel
(taxi none, trip everything): the full check (:func:`~loadcheck.check.check_loading`)
then covers the stated fuel, the whole burn and the zero-fuel state as limits. Stations
with a minimum weight (a fixed item such as engine oil listed as a station) carry it in
every case. The case's verdict is that check's verdict.

A placard's figure reads as a maximum, so each case also gives, for every baggage and cargo
station, the stretches of its load within limits with the rest of the case as given (the
planning answer, :func:`loadcheck.planning.most_payload`), and says so in a note where they are
not one stretch from the station's minimum.

The cases are built without regard to side: where the aircraft has a lateral envelope, each
case's lateral CG is checked for its own loading only, and each case says so
(:data:`LATERAL_NOTE`); the loadings farthest left and right are the lateral extremes of
:func:`loadcheck.extremes.extremes`.
"""

from __future__ import annotations

from dataclasses import dataclass, field, replace

from .aircraft import Aircraft
from .caution import MECHANIC_CAUTION
from .check import check_loading
from .display import fmt
from .engine import load_room
from .extremes import seat_order, standard_occupant
from .loading import BurnPlan, ResolvedLoading
from .planning import Interval, most_fuel, most_payload, safe_value
from .results import CheckResult, Result
from .words import stretch_text

__all__ = ["LATERAL_NOTE", "ScheduleCase", "ScheduleResult", "loading_schedule"]

LATERAL_NOTE = (
    "lateral CG: checked for this loading only, as it seats its occupants and burns its fuel (every tank in "
    "proportion); a loading heavy on one side (one occupant, fuel in one tank) is not a case of the schedule: "
    "the loadings farthest left and right are checked by `loadcheck extremes`"
)
"""The note of every schedule case of an aircraft with a lateral envelope: what the case covers of the lateral CG."""


@dataclass(frozen=True, kw_only=True, slots=True)
class ScheduleCase(Result):
    """One of the three loading conditions of AC 43.13-1B 10-18.

    Attributes
    ----------
    question : the condition, in words
    ok : the case's loading passes the full check over the fuel range it covers
    occupants : occupants per seat station [count]
    load : weight per station [mass unit]
    fuel : quantity per tank at engine start [fuel volume unit]
    fuel_states : the fuel states the answer was checked at, in words
    check : the full check of the case, burning all its fuel
    notes : how the case was built
    load_stretches : for each baggage or cargo station, the stretches (low, high) of its load within
        limits with the rest of the case as given (:func:`loadcheck.planning.most_payload`) [mass unit]
    not_one_stretch : the stations among those whose loads within limits are not one stretch from
        their minimum: a smaller load than the case's is not always within limits (a note says which are)
    """

    question: str
    ok: bool
    occupants: dict[str, int]
    load: dict[str, float]
    fuel: dict[str, float]
    fuel_states: str
    check: CheckResult
    notes: list[str] = field(default_factory=list)
    load_stretches: dict[str, list[tuple[float, float]]] = field(default_factory=dict)
    not_one_stretch: list[str] = field(default_factory=list)


@dataclass(frozen=True, kw_only=True, slots=True)
class ScheduleResult(Result):
    """The loading schedule: ``ok`` when every case's loading is within limits."""

    aircraft: str
    category: str
    occupant_weight: float
    ok: bool
    cases: list[ScheduleCase]
    caution: str = MECHANIC_CAUTION


def _placard(aircraft: Aircraft, category: str, stations: dict[str, float], fuel: dict[str, float]) -> ResolvedLoading:
    """A loading that burns every drop of its fuel, tanks together: its check covers every
    fuel state from engine start down to zero usable fuel."""
    density = {t.id: aircraft.density(t) for t in aircraft.tank}
    full = {t.id: fuel.get(t.id, 0.0) for t in aircraft.tank}
    plan = BurnPlan(full, None)
    return ResolvedLoading(category, dict(stations), full, density, 0.0, plan.burnable, None, plan)


def _minimum_stations(aircraft: Aircraft) -> dict[str, float]:
    """Every station at its minimum weight (fixed items, minimum crew weight) [mass unit]."""
    return {s.id: s.min_weight for s in aircraft.station if s.min_weight}


def _add(loading: ResolvedLoading, station: str, weight: float) -> ResolvedLoading:
    return loading.but(stations={**loading.stations, station: loading.stations.get(station, 0.0) + weight})


def _occupy(aircraft: Aircraft, loading: ResolvedLoading, station: str, count: int, occupant: float) -> ResolvedLoading:
    """``count`` occupants in a seat station: their weight, or the station's minimum where that is
    more (a minimum crew weight is met by the occupants, not added to them) [mass unit]."""
    least = aircraft.station_by_id[station].min_weight or 0.0
    return loading.but(stations={**loading.stations, station: max(least, count * occupant)})


def _refuel(aircraft: Aircraft, loading: ResolvedLoading, total: float) -> ResolvedLoading:
    """The same stations with ``total`` fuel, tanks in proportion to capacity, burning it all."""
    capacity = sum(t.usable for t in aircraft.tank)
    fuel = {t.id: (min(total / capacity, 1.0) * t.usable if capacity else 0.0) for t in aircraft.tank}
    return _placard(aircraft, loading.category, loading.stations, fuel)


def _seat(
    aircraft: Aircraft, loading: ResolvedLoading, occupant: float, *, pilot_aboard: bool
) -> tuple[ResolvedLoading, dict[str, int]]:
    """Seat occupants one at a time, pilot's seat first, while the loading stays within limits.

    The pilot is seated even where the loading is then out of limits (no flight without a
    pilot; the case then fails and says so), unless ``pilot_aboard`` says the pilot is in
    the loading already.
    """
    counts: dict[str, int] = {}
    first = not pilot_aboard
    for station_id in seat_order(aircraft):
        for _ in range(aircraft.station_by_id[station_id].seats or 1):
            trial = _occupy(aircraft, loading, station_id, counts.get(station_id, 0) + 1, occupant)
            if not first and not check_loading(aircraft, trial).ok:
                return loading, counts
            loading, first = trial, False
            counts[station_id] = counts.get(station_id, 0) + 1
    return loading, counts


def _fill_baggage(aircraft: Aircraft, loading: ResolvedLoading) -> ResolvedLoading:
    """The most each baggage or cargo station takes, one after another, within every limit."""
    for station in aircraft.station:
        if station.kind not in ("baggage", "cargo"):
            continue
        answer = most_payload(aircraft, loading, station.id)
        if answer.feasible and answer.answer is not None:
            low = answer.intervals[-1].low
            loading = loading.but(
                stations={
                    **loading.stations,
                    station.id: safe_value(low, answer.answer, aircraft.units.mass, "down")[0],
                },
            )
    return loading


def _most_fuel(aircraft: Aircraft, loading: ResolvedLoading) -> ResolvedLoading | None:
    """The loading with the most fuel (tanks in proportion) for which it holds down to zero fuel."""
    answer = most_fuel(aircraft, loading, burn_to=0.0)
    if not answer.feasible or answer.answer is None:
        return None
    return _refuel(
        aircraft, loading, safe_value(answer.intervals[-1].low, answer.answer, aircraft.units.fuel_volume, "down")[0]
    )


def _load_stretches(aircraft: Aircraft, loading: ResolvedLoading) -> dict[str, list[Interval]]:
    """The stretches of each baggage or cargo station's load within limits, the rest of the case's
    loading as given: the planning answer's (:func:`loadcheck.planning.most_payload`) [mass unit]."""
    return {
        s.id: list(most_payload(aircraft, loading, s.id).intervals)
        for s in aircraft.station
        if s.kind in ("baggage", "cargo")
    }


def _one_stretch(aircraft: Aircraft, station_id: str, found: list[Interval]) -> bool:
    """True where a station's loads within limits are one stretch from its minimum (0 or its ``min_weight``)."""
    least = aircraft.station_by_id[station_id].min_weight or 0.0
    return len(found) == 1 and found[0].low <= least + 1e-6 * max(1.0, found[0].high)


def _stretch_notes(aircraft: Aircraft, apart: dict[str, list[Interval]]) -> list[str]:
    """Words for each station whose loads within limits are not one stretch from its minimum: a
    placard "up to" that load would be read as allowing every smaller load."""
    mass = aircraft.units.mass
    notes = []
    for station_id, found in apart.items():
        name = aircraft.station_by_id[station_id].name
        if not found:
            notes.append(f"{name}: no load is within limits with the rest of this case as given")
            continue
        within = " and ".join(stretch_text(i.low, i.high, mass) for i in found)
        if len(found) == 1:
            shown = safe_value(found[0].low, found[0].high, mass, "up")[1]
            notes.append(
                f"{name}: at least {shown} with the rest of this case as given; a smaller load is NOT within "
                f"limits (within limits: {within})"
            )
        else:
            notes.append(
                f"{name}: with the rest of this case as given, only these loads are within limits: {within}; "
                "a load between them is NOT"
            )
    return notes


def _case(
    aircraft: Aircraft, question: str, loading: ResolvedLoading, occupants: dict[str, int], notes: list[str]
) -> ScheduleCase:
    check = replace(check_loading(aircraft, loading), caution=MECHANIC_CAUTION)
    at_minimum = [aircraft.station_by_id[s].name for s in _minimum_stations(aircraft) if s not in occupants]
    if at_minimum:  # a seat's occupants meet its minimum (_occupy): only the stations left at theirs
        notes = [*notes, f"stations at their minimum weight: {', '.join(at_minimum)}"]
    volume = aircraft.units.fuel_volume
    start = sum(loading.fuel.values())
    states = (
        f"from {fmt(start, volume, 'down')} at engine start down to zero usable fuel, every tank burning in "
        "proportion to its fuel"
        if start > 0
        else "with no usable fuel"
    )
    stretches = _load_stretches(aircraft, loading)
    apart = {k: v for k, v in stretches.items() if not _one_stretch(aircraft, k, v)}
    notes = [*notes, *_stretch_notes(aircraft, apart)]
    if any(e.is_lateral for e in aircraft.envelopes_for(loading.category)):
        notes = [*notes, LATERAL_NOTE]
    if not check.ok:
        notes = [*notes, "this loading is NOT within limits over that fuel range: see the findings"]
    return ScheduleCase(
        question=question,
        ok=check.ok,
        occupants=occupants,
        load=dict(loading.stations),
        fuel=dict(loading.fuel),
        fuel_states=states,
        check=check,
        notes=notes,
        load_stretches={k: [(i.low, i.high) for i in v] for k, v in stretches.items()},
        not_one_stretch=list(apart),
    )


def loading_schedule(
    aircraft: Aircraft, *, category: str | None = None, occupant_weight: float | None = None
) -> ScheduleResult:
    """AC 43.13-1B paragraph 10-18: the three loading conditions to settle when placards do not.

    Occupants are seated one at a time at the standard occupant weight, the pilot's seat
    first, while the loading stays within every limit; baggage is then the most each
    baggage station takes; fuel is the most the tanks take in proportion to capacity. Every
    case is checked burning all its fuel, so it holds from the fuel it states down to zero
    usable fuel.

    Parameters
    ----------
    category : envelope category (default the aircraft's first)
    occupant_weight : standard occupant [mass unit]; default the aircraft file's, else
        170 lb (AC 43.13-1B figures 10-10 to 10-14)

    Returns
    -------
    ScheduleResult
        ``ok`` is false where some case's loading is not within limits.
    """
    chosen = aircraft.category(category)
    occupant = standard_occupant(aircraft, occupant_weight)
    mass = aircraft.units.mass
    fixed = _minimum_stations(aircraft)
    cases = []

    # 1. full fuel: occupants, then baggage
    full = _placard(aircraft, chosen, fixed, {t.id: t.usable for t in aircraft.tank})
    seated, counts = _seat(aircraft, full, occupant, pilot_aboard=False)
    cases.append(
        _case(
            aircraft,
            "with full fuel: occupants and baggage",
            _fill_baggage(aircraft, seated),
            counts,
            [f"occupants at {fmt(occupant, mass)} each"],
        )
    )

    # 2. every seat filled: fuel, then baggage
    everyone = _placard(aircraft, chosen, fixed, {})
    counts = {}
    for station_id in seat_order(aircraft):
        counts[station_id] = aircraft.station_by_id[station_id].seats or 1
        everyone = _occupy(aircraft, everyone, station_id, counts[station_id], occupant)
    notes = [f"every seat filled at {fmt(occupant, mass)}"]
    fuelled = _most_fuel(aircraft, everyone)
    if fuelled is None:
        notes.append("no fuel load is within limits with every seat filled")
        cases.append(_case(aircraft, "with every seat filled: fuel and baggage", everyone, counts, notes))
    else:
        cases.append(
            _case(aircraft, "with every seat filled: fuel and baggage", _fill_baggage(aircraft, fuelled), counts, notes)
        )

    # 3. maximum baggage: fuel, then occupants
    bags = _placard(aircraft, chosen, fixed, {})
    for station in aircraft.station:
        if station.kind in ("baggage", "cargo") and station.max_weight is not None:
            room = load_room(aircraft, bags.stations, station.id)
            if room > 0:
                bags = _add(bags, station.id, room)
    pilot = seat_order(aircraft)[:1]
    with_pilot = _occupy(aircraft, bags, pilot[0], 1, occupant) if pilot else bags
    notes = ["baggage at each station's maximum (within group limits); the pilot aboard"]
    fuelled = _most_fuel(aircraft, with_pilot)
    if fuelled is None:
        notes.append("no fuel load is within limits with maximum baggage")
        cases.append(
            _case(
                aircraft, "with maximum baggage: fuel and occupants", with_pilot, {pilot[0]: 1} if pilot else {}, notes
            )
        )
    else:
        seated, counts = _seat(
            aircraft, _refuel(aircraft, bags, sum(fuelled.fuel.values())), occupant, pilot_aboard=False
        )
        cases.append(_case(aircraft, "with maximum baggage: fuel and occupants", seated, counts, notes))
    return ScheduleResult(
        aircraft=aircraft.name, category=chosen, occupant_weight=occupant, ok=all(c.ok for c in cases), cases=cases
    )
