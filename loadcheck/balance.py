"""The moment table: one line per item of the loading at engine start.

The method is the sum of moments (FAA-H-8083-1B, chapter 2, "Basic Weight and Balance
Equation"; AC 43.13-1B chapter 10, section 1): the moment of each item is its weight
times its arm, the total weight and total moment are the sums, and the CG is the total
moment divided by the total weight. Lateral CG is found the same way with lateral arms
(FAA-H-8083-1B chapter 7, helicopter lateral balance). Arms are aft of the datum and
lateral arms right of the centreline, looking forward, in the aircraft's arm unit.
"""

from __future__ import annotations

import numpy as np

from .aircraft import Aircraft
from .loading import ResolvedLoading
from .results import Item, ItemColumns

__all__ = ["moment_items", "moment_tables"]


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

    Lateral arms are given where the aircraft limits the lateral CG. This is
    :func:`moment_tables` of one loading.
    """
    stations = np.array([[loading.stations.get(s.id, 0.0) for s in aircraft.station]], dtype=float)
    fuel = np.array([[loading.fuel[t.id] for t in aircraft.tank]], dtype=float)
    density = np.array([loading.density[t.id] for t in aircraft.tank], dtype=float)
    return moment_tables(aircraft, stations.reshape(1, -1), fuel.reshape(1, -1), density).table(0)


def moment_tables(aircraft: Aircraft, stations: np.ndarray, fuel: np.ndarray, density: np.ndarray) -> ItemColumns:
    """The moment table of each of N loadings at engine start (:func:`moment_items`'s lines), by column.

    Parameters
    ----------
    aircraft : the aircraft
    stations : (N, S) weight per station, ``aircraft.station`` order [mass unit]
    fuel : (N, T) quantity per tank at engine start, ``aircraft.tank`` order [fuel volume unit]
    density : (T,) fuel density per tank [mass unit per fuel volume unit]

    Returns
    -------
    ItemColumns
        ``table(i)`` is loading ``i``'s: the empty weight, each station with a weight other
        than zero, each tank holding fuel (its weight = volume * density, its arm at that
        volume).
    """
    lateral = aircraft.has_lateral
    empty = aircraft.empty
    first = _item(
        "empty", "Basic empty weight", "empty", empty.weight, empty.arm, (empty.lateral_arm or 0.0) if lateral else None
    )
    n = len(stations)
    # every line's moment = weight * arm (and its lateral moment) a column at a time: the same
    # products, element by element, as _item makes of one line
    station_arms = np.array([s.arm for s in aircraft.station], dtype=float)
    station_laterals = np.array([s.lateral_arm or 0.0 for s in aircraft.station], dtype=float)
    no_lateral: list[list[float | None]] = [[None] * len(aircraft.station)] * n
    fuel_weights = fuel * density
    # each tank's arm at each loading's volume, one call per tank (Tank.arm_at)
    arms = np.array(
        [np.asarray(t.arm_at(fuel[:, j]), dtype=float) for j, t in enumerate(aircraft.tank)], dtype=float
    ).T.reshape(n, len(aircraft.tank))
    tank_laterals = np.array([t.lateral_arm or 0.0 for t in aircraft.tank], dtype=float)
    no_fuel_lateral: list[list[float | None]] = [[None] * len(aircraft.tank)] * n
    return ItemColumns(
        empty=first,
        stations=[(s.id, s.name, s.kind, s.arm, (s.lateral_arm or 0.0) if lateral else None) for s in aircraft.station],
        weights=stations.tolist(),
        moments=(stations * station_arms).tolist(),
        lateral_moments=(stations * station_laterals).tolist() if lateral else no_lateral,
        tanks=[(t.id, t.name, (t.lateral_arm or 0.0) if lateral else None) for t in aircraft.tank],
        volumes=fuel.tolist(),
        fuel_weights=fuel_weights.tolist(),
        arms=arms.tolist(),
        fuel_moments=(fuel_weights * arms).tolist(),
        fuel_lateral_moments=(fuel_weights * tank_laterals).tolist() if lateral else no_fuel_lateral,
    )
