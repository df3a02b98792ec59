"""Moment arithmetic: the moment table, the four conditions and the burn path.

The method is the sum of moments (FAA-H-8083-1B, chapter 2, "Basic Weight and Balance
Equation"; AC 43.13-1B chapter 10, section 1): the moment of each item is its weight
times its arm, the total weight and total moment are the sums, and the CG is the total
moment divided by the total weight. Lateral CG is found the same way with lateral arms
(FAA-H-8083-1B chapter 7, helicopter lateral balance). Arms are aft of the datum and
lateral arms right of the centreline, looking forward, in the aircraft's arm unit.
"""

from __future__ import annotations

from collections.abc import Mapping
from dataclasses import dataclass

import numpy as np

from .aircraft import Aircraft
from .envelope import PathPiece
from .loading import ResolvedLoading

__all__ = ["MassState", "MomentItem", "burn_pieces", "condition_states", "fuel_state", "moment_items", "payload_state"]

CONDITIONS = ("ramp", "takeoff", "landing", "zero_fuel")


@dataclass(frozen=True)
class MassState:
    """Total weight, moment and lateral moment of a loading state.

    Attributes
    ----------
    weight : [mass unit]
    moment : sum of weight * arm [mass unit * arm unit]
    lateral_moment : sum of weight * lateral arm [mass unit * arm unit]
    """

    weight: float
    moment: float
    lateral_moment: float = 0.0

    @property
    def arm(self) -> float:
        """CG: moment / weight [arm unit] (FAA-H-8083-1B chapter 2)."""
        return self.moment / self.weight

    @property
    def lateral_arm(self) -> float:
        """Lateral CG: lateral moment / weight [arm unit], + right."""
        return self.lateral_moment / self.weight

    def __add__(self, other: MassState) -> MassState:
        return MassState(
            self.weight + other.weight, self.moment + other.moment, self.lateral_moment + other.lateral_moment
        )


@dataclass(frozen=True)
class MomentItem:
    """One line of the moment table."""

    id: str
    name: str
    kind: str
    weight: float
    arm: float
    lateral_arm: float | None = None
    fuel_volume: float | None = None

    @property
    def moment(self) -> float:
        """weight * arm [mass unit * arm unit]."""
        return self.weight * self.arm

    @property
    def lateral_moment(self) -> float | None:
        """weight * lateral arm [mass unit * arm unit]."""
        return None if self.lateral_arm is None else self.weight * self.lateral_arm

    @property
    def state(self) -> MassState:
        """The item as a mass state."""
        return MassState(self.weight, self.moment, self.lateral_moment or 0.0)


def moment_items(aircraft: Aircraft, loading: ResolvedLoading) -> list[MomentItem]:
    """The moment table at engine start: empty weight, each loaded station, each tank."""
    lateral = aircraft.has_lateral
    empty = aircraft.empty
    items = [
        MomentItem(
            "empty", "Basic empty weight", "empty", empty.weight, empty.arm,
            (empty.lateral_arm or 0.0) if lateral else None,
        )
    ]
    for station in aircraft.station:
        if loading.stations.get(station.id, 0.0) != 0.0:
            items.append(
                MomentItem(
                    station.id, station.name, station.kind, loading.stations[station.id], station.arm,
                    (station.lateral_arm or 0.0) if lateral else None,
                )
            )
    for tank in aircraft.tank:
        volume = loading.fuel[tank.id]
        if volume > 0:
            items.append(
                MomentItem(
                    tank.id, tank.name, "fuel", volume * loading.density[tank.id], tank.arm_at(volume),
                    (tank.lateral_arm or 0.0) if lateral else None, volume,
                )
            )
    return items


def payload_state(aircraft: Aircraft, loading: ResolvedLoading) -> MassState:
    """Empty weight plus every station: the zero-fuel state."""
    empty = aircraft.empty
    total = MassState(empty.weight, empty.moment, empty.weight * (empty.lateral_arm or 0.0))
    for station_id, weight in loading.stations.items():
        station = aircraft.stations[station_id]
        total = total + MassState(weight, weight * station.arm, weight * (station.lateral_arm or 0.0))
    return total


def fuel_state(aircraft: Aircraft, density: Mapping[str, float], quantities: Mapping[str, float]) -> MassState:
    """Weight and moments of the fuel in the tanks at the given quantities."""
    total = MassState(0.0, 0.0, 0.0)
    for tank_id, volume in quantities.items():
        tank = aircraft.tanks[tank_id]
        mass = volume * density[tank_id]
        total = total + MassState(mass, mass * tank.arm_at(volume), mass * (tank.lateral_arm or 0.0))
    return total


def condition_states(aircraft: Aircraft, loading: ResolvedLoading) -> dict[str, tuple[MassState, dict[str, float]]]:
    """State and tank quantities at ramp, takeoff, landing and zero fuel (DESIGN.md table)."""
    payload = payload_state(aircraft, loading)
    plan = loading.plan
    quantities = {
        "ramp": dict(loading.fuel),
        "takeoff": plan.quantities(loading.taxi),
        "landing": plan.quantities(loading.taxi + loading.trip),
        "zero_fuel": {tank: 0.0 for tank in loading.fuel},
    }
    return {
        name: (payload + fuel_state(aircraft, loading.density, q), q) for name, q in quantities.items()
    }


def burn_pieces(aircraft: Aircraft, loading: ResolvedLoading, start: float, end: float) -> list[PathPiece]:
    """The fuel-burn path between two amounts burned, cut where it stops being polynomial.

    Cuts fall where a tank runs dry (sequential burn) and where a tank's quantity passes
    a point of its arm table. On each piece every tank drains linearly, its arm is linear
    in the fuel burned, so weight is linear and moments are at most quadratic.

    Parameters
    ----------
    start, end : fuel burned since engine start [fuel volume unit]
    """
    plan = loading.plan
    cuts = {start, end}
    cuts.update(b for b in plan.breakpoints() if start < b < end)
    for tank in aircraft.tank:
        for knot in tank.arm_knots():
            cuts.update(t for t in _times_at_quantity(loading, tank.id, knot) if start < t < end)
    payload = payload_state(aircraft, loading)
    ordered = sorted(cuts)
    pieces = []
    for a, b in zip(ordered, ordered[1:]):
        if b - a <= 0:
            continue
        qa, qb = plan.quantities(a), plan.quantities(b)
        weight = np.array([payload.weight, 0.0])
        moment = np.array([payload.moment, 0.0, 0.0])
        lateral = np.array([payload.lateral_moment, 0.0])
        for tank in aircraft.tank:
            rho = loading.density[tank.id]
            mass = np.array([rho * qa[tank.id], rho * (qb[tank.id] - qa[tank.id])])
            arm_a, arm_b = tank.arm_at(qa[tank.id]), tank.arm_at(qb[tank.id])
            weight += mass
            slope = arm_b - arm_a
            moment += [mass[0] * arm_a, mass[0] * slope + mass[1] * arm_a, mass[1] * slope]
            lateral += mass * (tank.lateral_arm or 0.0)
        pieces.append(PathPiece(a, b, weight, moment, lateral))
    return pieces


def _times_at_quantity(loading: ResolvedLoading, tank: str, quantity: float) -> list[float]:
    """Fuel burned at which ``tank`` holds ``quantity`` [fuel volume unit]."""
    plan = loading.plan
    held = plan.start[tank]
    if quantity >= held:
        return []
    if plan.order is None:
        return [plan.burnable * (1.0 - quantity / held)] if held > 0 else []
    if tank not in plan.order:
        return []
    before = sum(plan.start[t] for t in plan.order[: plan.order.index(tank)])
    return [before + held - quantity]
