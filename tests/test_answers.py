"""One verdict: every loading an answer proposes passes the full check over the fuel range it covers.

Property tests over random aircraft (tests/test_oracle.py's generator, with seats, a
fixed-weight station, a utility category and the engine's power added): non-convex
envelopes, station groups, minimum and fixed-weight stations, sequential and proportional
burns, tanks ahead of and behind the CG (the CG moving aft or forward as fuel burns),
lateral envelopes, arm tables. For each planning answer, each schedule case and each
extreme loading:

- a feasible answer carries the full check of the loading at the figure it shows, and
  that check passes; an infeasible one blesses nothing;
- every stated maximum (most fuel, most payload) plus the tolerance fails the check,
  unless a capacity or station maximum stops it; every stated minimum (least ballast,
  least weight moved) less the tolerance fails it, unless it is zero;
- placard-type answers (schedule, extremes) hold at every fuel state they cover;
- the command line's exit status agrees with the answers.
"""

from __future__ import annotations

import random

import numpy as np
from hypothesis import given, settings
from hypothesis import strategies as st

from loadcheck import planning as P
from loadcheck.check import check_loading
from loadcheck.errors import LoadcheckError
from loadcheck.extremes import extremes
from loadcheck.files import parse_aircraft
from loadcheck.loading import BurnPlan, Loading, ResolvedLoading, resolve_loading
from loadcheck.schedule import loading_schedule

from .helpers import examples
from .test_oracle import random_case
from .test_planning import _filled

TOLERANCE = 2 * P.MASS_TOLERANCE  # [mass unit]: past a stated maximum by this much is out of limits


def _aircraft_and_loading(seed: int):
    data, given = random_case(seed)
    rng = random.Random(seed + 1)
    for i, station in enumerate(data["station"]):
        station["kind"] = "seat" if i < 2 else rng.choice(["baggage", "cargo"])
        if i == 0:
            station["controls"] = True
    if rng.random() < 0.4:  # a fixed item listed as its own station
        arm = data["empty"]["arm"] + rng.uniform(-30, 30)
        data["station"].append(
            {"id": "fixed", "arm": round(arm, 2), "kind": "other", "min_weight": 15.0, "max_weight": 15.0}
        )
        given["load"]["fixed"] = 15.0
    if rng.random() < 0.4:  # a utility category inside the normal one, with a lower top
        normal = data["envelope"][0]
        ys = [p[1] for p in normal["points"]]
        cut = min(ys) + 0.8 * (max(ys) - min(ys))
        data["envelope"].append(
            {**normal, "category": "utility", "points": [[p[0], min(p[1], cut)] for p in normal["points"]]}
        )
    data["meto_power_hp"] = 150
    try:
        aircraft = parse_aircraft(data)
    except LoadcheckError:
        return None, None
    category = rng.choice(aircraft.categories)
    loading = Loading(
        category=category,
        load=given["load"],
        fuel=given["fuel"],
        burn={"taxi": given["taxi"], "trip": given["trip"], "order": given["order"] or "together"},
    )
    try:
        return aircraft, resolve_loading(loading, aircraft)
    except LoadcheckError:
        return aircraft, None


def _ok(aircraft, loading) -> bool:
    try:
        return check_loading(aircraft, loading).ok
    except LoadcheckError:
        return False


def _carries_its_check(answer) -> None:
    if answer.feasible:
        assert answer.check is not None and answer.check.ok, answer.question
    else:
        assert answer.check is None or not answer.check.ok, answer.question


SETTINGS = settings(max_examples=examples(12))


@SETTINGS
@given(st.integers(0, 10**6))
def test_most_fuel_and_most_payload_are_checked_and_maximal(seed):
    aircraft, loading = _aircraft_and_loading(seed)
    if loading is None:
        return
    fuel = P.most_fuel(aircraft, loading)
    _carries_its_check(fuel)
    if fuel.feasible and fuel.governing_code != "capacity":
        # the default fill (docs/planning.md): the tank burned last first, or all in proportion
        order = None if loading.plan.order is None else list(reversed(loading.plan.order))
        density = float(np.mean([loading.density[t.id] for t in aircraft.tank]))
        more = _filled(aircraft, loading, order, fuel.answer + TOLERANCE / density)
        assert not _ok(aircraft, more)
    station = random.Random(seed).choice(aircraft.station).id
    payload = P.most_payload(aircraft, loading, station)
    _carries_its_check(payload)
    if payload.feasible and payload.governing_code != "capacity":
        heavier = loading.but(stations={**loading.stations, station: payload.answer + TOLERANCE})
        assert not _ok(aircraft, heavier)


@SETTINGS
@given(st.integers(0, 10**6))
def test_least_amounts_leave_and_shift_are_checked_and_minimal(seed):
    aircraft, loading = _aircraft_and_loading(seed)
    if loading is None:
        return
    rng = random.Random(seed)
    station = rng.choice(aircraft.station).id
    ballast = P.least_ballast(aircraft, loading, station)
    _carries_its_check(ballast)
    already = loading.stations.get(station, 0.0)
    if ballast.feasible and ballast.answer > already + TOLERANCE:  # the answer is the station's whole weight
        lighter = loading.but(stations={**loading.stations, station: ballast.answer - TOLERANCE})
        assert not _ok(aircraft, lighter)
    leave = P.fuel_to_leave(aircraft, loading, station, rng.uniform(0, 200))
    _carries_its_check(leave)
    now = sum(loading.fuel.values())
    assert all(0.0 <= i.low <= i.high <= now + 1e-9 for i in leave.intervals)
    source, target = rng.sample([s.id for s in aircraft.station], 2)
    if aircraft.station_by_id[source].arm != aircraft.station_by_id[target].arm:
        shift = P.weight_shift(aircraft, loading, source, target)
        _carries_its_check(shift)
        to_arm = P.weight_shift(aircraft, loading, source, target, target_arm=rng.uniform(20, 100))
        _carries_its_check(to_arm)


def _holds_over(aircraft, case_check, category: str, down_to: float) -> bool:
    """The case's loading, started at several fuel states between its stated fuel and
    ``down_to``, each flown down to ``down_to``: all within limits."""
    stations = {i.id: i.weight for i in case_check.items if i.id in aircraft.station_by_id}
    fuel = {t.id: 0.0 for t in aircraft.tank}
    fuel.update({i.id: i.fuel_volume for i in case_check.items if i.id in aircraft.tank_by_id})
    total = sum(fuel.values())
    density = {t.id: aircraft.density(t) for t in aircraft.tank}
    for share in np.linspace(1.0, down_to / total if total else 1.0, 6):
        state = {t: q * share for t, q in fuel.items()}
        plan = BurnPlan(state, None)
        trip = max(0.0, plan.burnable - down_to)
        if not check_loading(aircraft, ResolvedLoading(category, stations, state, density, 0.0, trip, None, plan)).ok:
            return False
    return True


@settings(max_examples=examples(25))
@given(st.integers(0, 10**6))
def test_schedule_and_extremes_hold_over_their_fuel_range(seed):
    aircraft, _ = _aircraft_and_loading(seed)
    if aircraft is None:
        return
    schedule = loading_schedule(aircraft)
    assert schedule.ok == all(case.ok for case in schedule.cases)
    for case in schedule.cases:
        assert case.ok == case.check.ok
        if case.ok:
            assert _holds_over(aircraft, case.check, schedule.category, 0.0)
    try:
        result = extremes(aircraft)
    except LoadcheckError:
        return
    # every case the extremes check (left and right too, where the aircraft has a lateral envelope)
    assert result.ok == all(case.ok for case in result.cases)
    for case in result.cases:
        assert case.ok == case.check.ok == (not case.check.limits_exceeded)
        if case.ok:
            landing = case.check.condition("landing").fuel
            assert _holds_over(aircraft, case.check, result.category, landing)
