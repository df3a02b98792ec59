"""Weighing: scale readings to basic empty weight and CG.

Method (AC 43.13-1B chapter 10, paragraphs 10-2 r and 10-15; FAA-H-8083-1B chapter 3):
the net weight at each weighing point is the scale reading less its tare; the as-weighed
weight is the sum of the net weights and its moment the sum of net weight x arm of each
point; items aboard that are not part of the empty weight are then taken off, and items
of the empty weight that were missing are put on, each with its own weight and arm. The
arms of the weighing points are given directly, or follow from two measured distances:
D, from the datum to the main-wheel centreline, and L, from the main wheels to the nose or
tail wheel. With them the sum of moments reproduces the four empty-weight CG formulas of
FAA-H-8083-1 (datum forward or aft of the main wheels, nosewheel or tailwheel; from
memory): CG = D - F L / W, -(D + F L / W), D + R L / W and -D + R L / W.
"""

from __future__ import annotations

import datetime as dt
from dataclasses import dataclass, field
from typing import Literal

from pydantic import BaseModel, ConfigDict, Field, model_validator

from .aircraft import Aircraft, Arm, Mass, Volume
from .caution import MECHANIC_CAUTION
from .errors import InputError, Problem, UnknownNameError
from .results import Result

__all__ = ["Readings", "WeighingPoint", "Geometry", "ReadingItem", "WeighResult", "WeighPoint", "Correction", "Record",
           "weigh", "point_arm"]


class _Model(BaseModel):
    model_config = ConfigDict(extra="forbid", frozen=True, allow_inf_nan=False)


class Geometry(_Model):
    """Measured distances that give the weighing points' arms."""

    gear: Literal["nosewheel", "tailwheel"]
    datum: Literal["forward", "aft"] = Field(description="where the datum is: forward or aft of the main wheels")
    main_distance: Arm = Field(ge=0, description="D: datum to the main-wheel centreline [arm unit]")
    wheelbase: Arm = Field(gt=0, description="L: main wheels to the nose or tail wheel [arm unit]")


class WeighingPoint(_Model):
    """One scale: where it is and what it read."""

    label: str
    wheel: Literal["main", "nose", "tail"] | None = Field(None, description="arm from [geometry]")
    arm: Arm | None = Field(None, description="arm of the point, when given directly [arm unit]")
    lateral_arm: Arm | None = Field(None, description="[arm unit], + right")
    reading: Mass = Field(ge=0, description="scale reading [mass unit]")
    tare: Mass = Field(0.0, ge=0, description="chocks, blocks, stands on the scale [mass unit]")

    @model_validator(mode="after")
    def _placed(self) -> WeighingPoint:
        if (self.wheel is None) == (self.arm is None):
            raise ValueError("give the point's arm, or its wheel (main, nose or tail) with a [geometry] table")
        if self.tare > self.reading:
            raise ValueError(f"the tare ({self.tare:g}) is above the reading ({self.reading:g})")
        return self


class ReadingItem(_Model):
    """An item aboard when weighed that is not part of the empty weight, or one missing that is."""

    label: str
    weight: Mass | None = Field(None, ge=0, description="[mass unit]")
    arm: Arm | None = Field(None, description="[arm unit]")
    lateral_arm: Arm | None = Field(None, description="[arm unit], + right")
    tank: str | None = Field(None, description="for fuel: the tank it is in (gives density and arm)")
    fuel: Volume | None = Field(None, ge=0, description="for fuel: quantity in that tank [fuel volume unit]")

    @model_validator(mode="after")
    def _complete(self) -> ReadingItem:
        if self.tank is not None:
            if self.fuel is None:
                raise ValueError("a fuel item names its tank and its quantity (fuel = ...)")
        elif self.weight is None or self.arm is None:
            raise ValueError("give the item's weight and arm (or, for fuel, its tank and quantity)")
        return self


class Readings(_Model):
    """A readings file: the weighing points and the corrections (docs/mechanic.md)."""

    format: Literal[1] = 1
    aircraft: str | None = None
    date: dt.date | None = None
    weighed_by: str | None = None
    note: str | None = None
    geometry: Geometry | None = None
    point: list[WeighingPoint] = Field(min_length=1)
    on_board: list[ReadingItem] = Field(default_factory=list, description="aboard, not part of the empty weight")
    missing: list[ReadingItem] = Field(default_factory=list, description="part of the empty weight, absent")

    @model_validator(mode="after")
    def _geometry_when_needed(self) -> Readings:
        if any(p.wheel is not None for p in self.point) and self.geometry is None:
            raise ValueError("points given by wheel need a [geometry] table (gear, datum, main_distance, wheelbase)")
        if self.geometry is not None:
            other = "tail" if self.geometry.gear == "nosewheel" else "nose"
            if any(p.wheel == other for p in self.point):
                raise ValueError(f"a {self.geometry.gear} aircraft has no {other} wheel")
        return self


def point_arm(point: WeighingPoint, geometry: Geometry | None) -> float:
    """Arm of a weighing point [arm unit]: given, or from D and L (FAA-H-8083-1 chapter 3)."""
    if point.arm is not None:
        return point.arm
    assert geometry is not None and point.wheel is not None
    main = geometry.main_distance if geometry.datum == "forward" else -geometry.main_distance
    if point.wheel == "main":
        return main
    return main - geometry.wheelbase if point.wheel == "nose" else main + geometry.wheelbase


@dataclass(frozen=True, kw_only=True, slots=True)
class WeighPoint(Result):
    """A weighing point: reading, tare, net [mass unit]; arm [arm unit]; moment."""

    label: str
    reading: float
    tare: float
    net: float
    arm: float
    moment: float
    lateral_arm: float | None = None


@dataclass(frozen=True, kw_only=True, slots=True)
class Correction(Result):
    """An item taken off (``removed``) or put on (``added``) the as-weighed aircraft."""

    label: str
    action: Literal["removed", "added"]
    weight: float
    arm: float
    moment: float
    lateral_arm: float | None = None


@dataclass(frozen=True, kw_only=True, slots=True)
class Record(Result):
    """An empty-weight state: weight [mass unit], arm [arm unit], moment, lateral arm."""

    weight: float
    arm: float
    moment: float
    lateral_arm: float | None = None


@dataclass(frozen=True, kw_only=True, slots=True)
class WeighResult(Result):
    """The outcome of a weighing (not yet the aircraft's record: ``--write`` makes it so)."""

    aircraft: str
    registration: str | None
    points: list[WeighPoint]
    as_weighed: Record
    corrections: list[Correction]
    new: Record
    previous: Record
    change_weight: float
    change_arm: float
    useful_load: float
    change_useful_load: float
    warnings: list[str] = field(default_factory=list)
    formula_cg: float | None = None
    caution: str = MECHANIC_CAUTION


def _item(aircraft: Aircraft, item: ReadingItem, where: str) -> tuple[float, float, float]:
    if item.tank is not None:
        tank = aircraft.tanks.get(item.tank)
        if tank is None:
            raise UnknownNameError(Problem(f"{where}.tank", f"unknown tank {item.tank!r}",
                                           expected="one of " + ", ".join(aircraft.tanks)))
        assert item.fuel is not None
        weight = item.fuel * aircraft.density(tank)
        arm = item.arm if item.arm is not None else tank.arm_at(item.fuel)
        return weight, arm, item.lateral_arm if item.lateral_arm is not None else (tank.lateral_arm or 0.0)
    assert item.weight is not None and item.arm is not None
    return item.weight, item.arm, item.lateral_arm or 0.0


def weigh(aircraft: Aircraft, readings: Readings) -> WeighResult:
    """Compute the basic empty weight and CG from scale readings.

    Parameters
    ----------
    aircraft : the aircraft, with its current empty-weight record (for the comparison)
    readings : the weighing points and corrections

    Returns
    -------
    WeighResult

    Raises
    ------
    InputError
        When the net weights add up to nothing, or a correction leaves no weight.

    References
    ----------
    AC 43.13-1B chapter 10, paragraphs 10-2 r (tare) and 10-15 (procedures);
    FAA-H-8083-1B chapter 3 (empty-weight CG, sum of moments).
    """
    lateral = any(p.lateral_arm is not None for p in readings.point)
    points = []
    for p in readings.point:
        arm = point_arm(p, readings.geometry)
        net = p.reading - p.tare
        points.append(WeighPoint(label=p.label, reading=p.reading, tare=p.tare, net=net, arm=arm, moment=net * arm,
                                 lateral_arm=(p.lateral_arm or 0.0) if lateral else None))
    weight = sum(p.net for p in points)
    if weight <= 0:
        raise InputError(Problem("point", "the net weights add up to nothing: check the readings and tares"))
    moment = sum(p.moment for p in points)
    lateral_moment = sum(p.net * (p.lateral_arm or 0.0) for p in points)
    as_weighed = Record(weight=weight, arm=moment / weight, moment=moment,
                        lateral_arm=lateral_moment / weight if lateral else None)
    warnings = [f"point {p.label!r} reads no weight after its tare" for p in points if p.net == 0]

    corrections = []
    for label, items, sign in (("on_board", readings.on_board, -1.0), ("missing", readings.missing, 1.0)):
        for index, item in enumerate(items):
            w, a, lat = _item(aircraft, item, f"{label}[{index}]")
            corrections.append(Correction(label=item.label, action="removed" if sign < 0 else "added", weight=w, arm=a,
                                          moment=w * a, lateral_arm=lat if lateral else None))
            weight += sign * w
            moment += sign * w * a
            lateral_moment += sign * w * lat
    if weight <= 0:
        raise InputError(Problem("on_board", "taking off the items aboard leaves no weight: check the corrections"))
    new = Record(weight=weight, arm=moment / weight, moment=moment, lateral_arm=lateral_moment / weight if lateral else None)
    empty = aircraft.empty
    previous = Record(weight=empty.weight, arm=empty.arm, moment=empty.moment, lateral_arm=empty.lateral_arm)
    if empty.cg_range is not None and not empty.cg_range[0] <= new.arm <= empty.cg_range[1]:
        warnings.append(
            f"the new empty-weight CG {new.arm:.2f} {aircraft.units.arm} is outside the empty-weight CG range "
            f"{empty.cg_range[0]:g} to {empty.cg_range[1]:g} {aircraft.units.arm}: check the readings and the arms"
        )
    if abs(new.weight - empty.weight) > 0.1 * empty.weight:
        warnings.append("the new empty weight differs from the current record by more than 10 %: check the readings")
    useful = aircraft.limits.max_takeoff_weight - new.weight
    return WeighResult(
        aircraft=aircraft.name, registration=aircraft.registration, points=points, as_weighed=as_weighed,
        corrections=corrections, new=new, previous=previous, change_weight=new.weight - empty.weight,
        change_arm=new.arm - empty.arm, useful_load=useful, change_useful_load=useful - aircraft.useful_load,
        warnings=warnings, formula_cg=_formula_cg(readings, points),
    )


def _formula_cg(readings: Readings, points: list[WeighPoint]) -> float | None:
    """The as-weighed CG by the FAA-H-8083-1 formula for the gear and datum (a cross-check)."""
    geometry = readings.geometry
    if geometry is None or any(p.wheel is None for p in readings.point):
        return None
    total = sum(p.net for p in points)
    other = sum(p.net for p, raw in zip(points, readings.point) if raw.wheel != "main")
    d, length = geometry.main_distance, geometry.wheelbase
    if geometry.gear == "nosewheel":
        return d - other * length / total if geometry.datum == "forward" else -(d + other * length / total)
    return d + other * length / total if geometry.datum == "forward" else -d + other * length / total
