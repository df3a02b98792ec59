"""The moment table: one line per item of the loading at engine start.

The method is the sum of moments (FAA-H-8083-1B, chapter 2, "Basic Weight and Balance
Equation"; AC 43.13-1B chapter 10, section 1): the moment of each item is its weight
times its arm, the total weight and total moment are the sums, and the CG is the total
moment divided by the total weight. Lateral CG is found the same way with lateral arms
(FAA-H-8083-1B chapter 7, helicopter lateral balance). Arms are aft of the datum and
lateral arms right of the centreline, looking forward, in the aircraft's arm unit.
"""

from __future__ import annotations

from .aircraft import Aircraft
from .loading import ResolvedLoading
from .results import Item

__all__ = ["moment_items"]


def _item(
    id: str,
    name: str,
    kind: str,
    weight: float,
    arm: float,
    lateral_arm: float | None,
    fuel_volume: float | None = None,
) -> Item:
    """One line: moment = weight * arm [mass unit * arm unit] (FAA-H-8083-1B chapter 2)."""
    return Item(
        id=id,
        name=name,
        kind=kind,
        weight=weight,
        arm=arm,
        moment=weight * arm,
        lateral_arm=lateral_arm,
        lateral_moment=None if lateral_arm is None else weight * lateral_arm,
        fuel_volume=fuel_volume,
    )


def moment_items(aircraft: Aircraft, loading: ResolvedLoading) -> list[Item]:
    """The moment table at engine start: empty weight, each loaded station, each tank.

    Lateral arms are given where the aircraft limits the lateral CG.
    """
    lateral = aircraft.has_lateral
    empty = aircraft.empty
    items = [
        _item(
            "empty",
            "Basic empty weight",
            "empty",
            empty.weight,
            empty.arm,
            (empty.lateral_arm or 0.0) if lateral else None,
        )
    ]
    for station in aircraft.station:
        if loading.stations.get(station.id, 0.0) != 0.0:
            items.append(
                _item(
                    station.id,
                    station.name,
                    station.kind,
                    loading.stations[station.id],
                    station.arm,
                    (station.lateral_arm or 0.0) if lateral else None,
                )
            )
    for tank in aircraft.tank:
        volume = loading.fuel[tank.id]
        if volume > 0:
            items.append(
                _item(
                    tank.id,
                    tank.name,
                    "fuel",
                    volume * loading.density[tank.id],
                    float(tank.arm_at(volume)),
                    (tank.lateral_arm or 0.0) if lateral else None,
                    volume,
                )
            )
    return items
