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
from typing import Any, Literal

from pydantic import Field, model_validator

from .aircraft import Aircraft, Arm, Mass, Volume
from .caution import MECHANIC_CAUTION
from .display import fmt
from .errors import InputError, LoadcheckError, Problem, UnknownNameError
from .filemodel import AircraftKey, FileModel, Flag
from .results import Result
from .words import beyond

__all__ = [
    "Readings",
    "WeighingPoint",
    "Geometry",
    "ReadingItem",
    "WeighResult",
    "WeighPoint",
    "Correction",
    "EmptyWeightRecord",
    "Refusal",
    "PLAUSIBLE_CHANGE",
    "weigh",
    "point_arm",
    "lateral_arm_needed",
    "lateral_change",
    "record_checks",
    "date_checks",
    "latest_date",
    "EARLIEST_ZONE",
    "current_record_warnings",
]

PLAUSIBLE_CHANGE = 0.10
"""Largest change of empty weight written without an override, as a fraction of the current
record (common practice: a weighing or an ordinary alteration moves the empty weight by a few
per cent; ten per cent or more is a misread scale, a wrong unit or a major alteration)."""


EARLIEST_ZONE = dt.timedelta(hours=14)
"""How far the earliest time zone on Earth is ahead of UTC [hours]: UTC+14, the Line Islands of
Kiribati (from memory). A date is today somewhere on Earth until it is over there."""


def latest_date(now: dt.datetime | None = None) -> dt.date:
    """The latest date that is today somewhere on Earth: the date at UTC+14.

    It is the UTC date, or the day after it once UTC is past 10:00, so a record dated today
    where the aircraft was weighed is accepted in any time zone, and a date no place on Earth
    has reached yet is not.

    Parameters
    ----------
    now : the moment to read the date at (an aware datetime; a naive one is taken as UTC);
        default the system clock. Tests set it.

    Examples
    --------
    >>> import datetime as dt
    >>> latest_date(dt.datetime(2026, 12, 3, 8, 0, tzinfo=dt.UTC)).isoformat()
    '2026-12-03'
    >>> latest_date(dt.datetime(2026, 12, 3, 10, 0, tzinfo=dt.UTC)).isoformat()
    '2026-12-04'
    """
    if now is None:
        now = dt.datetime.now(dt.UTC)
    elif now.tzinfo is None:
        now = now.replace(tzinfo=dt.UTC)
    return (now.astimezone(dt.UTC) + EARLIEST_ZONE).date()


class _Model(FileModel):
    """Common configuration (loadcheck.filemodel): unknown keys, and true/false for a number, are errors."""


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
        if self.wheel is not None and self.arm is not None:
            raise ValueError(
                f"both the point's arm ({self.arm:g}) and its wheel ({self.wheel!r}) are given: give only one, "
                "the arm, or the wheel with a [geometry] table that gives its arm"
            )
        if self.wheel is None and self.arm is None:
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
            if self.weight is not None:
                # the tank's density gives a fuel item's weight: a weight given beside it would be left unused
                raise ValueError("a fuel item gives its tank and quantity, not a weight (the density gives it)")
        elif self.weight is None or self.arm is None:
            raise ValueError("give the item's weight and arm (or, for fuel, its tank and quantity)")
        return self


class Readings(_Model):
    """A readings file: the weighing points and the corrections (docs/mechanic.md)."""

    format: Literal[1] = 1
    aircraft: AircraftKey | None = None
    date: dt.date | None = None
    weighed_by: str | None = None
    note: str | None = None
    keep_lateral_arm: Flag = Field(False, description="no lateral readings: keep the current record's lateral CG")
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
        if self.keep_lateral_arm and any(p.lateral_arm is not None for p in self.point):
            raise ValueError(
                "keep_lateral_arm: the points give lateral arms, so the lateral CG is measured; "
                "leave keep_lateral_arm out"
            )
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
class EmptyWeightRecord(Result):
    """An empty-weight state: weight [mass unit], arm [arm unit], moment, lateral arm."""

    weight: float
    arm: float
    moment: float
    lateral_arm: float | None = None


@dataclass(frozen=True, kw_only=True, slots=True)
class Refusal(Result):
    """A reason a new empty-weight record is not written as it stands.

    ``overridable`` is False where the record could never be read back (an empty weight
    that reaches the maximum takeoff weight) or has no true date (none given, or one that
    has not come yet); True where an explicit override, kept in the history, may write it.
    """

    code: Literal[
        "no_useful_load", "cg_outside_envelopes", "implausible_change", "no_date", "future_date", "date_before_current"
    ]
    message: str
    overridable: bool
    field: str | None = None
    """The field of the readings or changes file at fault, where it is one (``date``)."""


@dataclass(frozen=True, kw_only=True, slots=True)
class WeighResult(Result):
    """The outcome of a weighing (not yet the aircraft's record: writing makes it so).

    ``date``, ``weighed_by``, ``note`` and ``geometry`` come from the readings;
    ``cg_range`` is the aircraft's empty-weight CG range [arm unit], where it gives one;
    ``refusals`` say why the record is not written without an override;
    ``change_lateral_arm`` is the new lateral CG less the current record's [arm unit], where
    both have one.
    """

    aircraft: str
    registration: str | None
    points: list[WeighPoint]
    as_weighed: EmptyWeightRecord
    corrections: list[Correction]
    new: EmptyWeightRecord
    previous: EmptyWeightRecord
    change_weight: float
    change_arm: float
    useful_load: float
    change_useful_load: float
    warnings: list[str] = field(default_factory=list)
    refusals: list[Refusal] = field(default_factory=list)
    formula_cg: float | None = None
    date: str | None = None
    weighed_by: str | None = None
    note: str | None = None
    geometry: dict[str, Any] | None = None
    cg_range: tuple[float, float] | None = None
    change_lateral_arm: float | None = None
    caution: str = MECHANIC_CAUTION


def lateral_change(new: EmptyWeightRecord, previous: EmptyWeightRecord) -> float | None:
    """The change of the lateral CG from ``previous`` to ``new`` [arm unit]; None unless both have one."""
    if new.lateral_arm is None or previous.lateral_arm is None:
        return None
    return new.lateral_arm - previous.lateral_arm


def _longitudinal_span(aircraft: Aircraft) -> tuple[float, float] | None:
    """Most forward and most rearward arm of all the aircraft's longitudinal envelopes [arm unit]."""
    spans = []
    for envelope in aircraft.envelope:
        if not envelope.shape.is_lateral:  # a lateral envelope does not limit the longitudinal CG
            spans.append(envelope.shape.arm_range())
    if not spans:
        return None
    return min(s[0] for s in spans), max(s[1] for s in spans)


def _outside_cg_range(aircraft: Aircraft, arm: float, what: str) -> str | None:
    cg_range = aircraft.empty.cg_range
    if cg_range is None or cg_range[0] <= arm <= cg_range[1]:
        return None
    unit = aircraft.units.arm
    aft = arm > cg_range[1]
    shown, bound, excess = beyond(arm, cg_range[1] if aft else cg_range[0], unit)  # the excess never hidden
    low, high = (fmt(cg_range[0], unit), bound) if aft else (bound, fmt(cg_range[1], unit))
    return (
        f"{what} {shown} is outside the empty-weight CG range {low} to {high} ({'aft' if aft else 'forward'} "
        f"of it by {excess}): check the inputs and the arms"
    )


def current_record_warnings(aircraft: Aircraft) -> list[str]:
    """Warnings about the aircraft's current empty-weight record (its CG outside its CG range).

    For ``show`` and ``validate``, which show the range and flag a record outside it.
    """
    warning = _outside_cg_range(aircraft, aircraft.empty.arm, "the empty-weight CG")
    return [warning] if warning else []


def record_checks(aircraft: Aircraft, new: EmptyWeightRecord) -> tuple[list[str], list[Refusal]]:
    """What a new empty-weight record must be checked for before it becomes current.

    Returns warnings (a CG outside the empty-weight CG range) and refusals: an empty
    weight that reaches the maximum takeoff weight (never written: the aircraft file
    would be refused), a CG outside every longitudinal envelope's arm span, a change of
    more than :data:`PLAUSIBLE_CHANGE` of the current empty weight (written only with an
    explicit override, kept in the history).

    Parameters
    ----------
    aircraft : the aircraft with its current record
    new : the proposed record [aircraft units]
    """
    units = aircraft.units
    warning = _outside_cg_range(aircraft, new.arm, "the new empty-weight CG")
    warnings = [warning] if warning else []
    refusals = []
    limit = aircraft.limits.max_takeoff_weight
    if new.weight >= limit:
        refusals.append(
            Refusal(
                code="no_useful_load",
                overridable=False,
                message=(
                    f"the new empty weight {fmt(new.weight, units.mass)} reaches the maximum takeoff weight "
                    f"{fmt(limit, units.mass)} (useful load {fmt(limit - new.weight, units.mass, 'down')}): "
                    "a misread scale or a wrong unit? Such a record is never written"
                ),
            )
        )
    span = _longitudinal_span(aircraft)
    if span is not None and not span[0] <= new.arm <= span[1]:
        refusals.append(
            Refusal(
                code="cg_outside_envelopes",
                overridable=True,
                message=(
                    f"the new empty-weight CG {fmt(new.arm, units.arm)} lies outside every envelope's arm span "
                    f"({fmt(span[0], units.arm)} to {fmt(span[1], units.arm)}): check the readings and the arms"
                ),
            )
        )
    current = aircraft.empty.weight
    if abs(new.weight - current) > PLAUSIBLE_CHANGE * current:
        refusals.append(
            Refusal(
                code="implausible_change",
                overridable=True,
                message=(
                    f"the new empty weight {fmt(new.weight, units.mass)} differs from the current record "
                    f"{fmt(current, units.mass)} by more than {PLAUSIBLE_CHANGE:.0%}: check the inputs"
                ),
            )
        )
    return warnings, refusals


def date_checks(
    aircraft: Aircraft, date: dt.date | None, source: Literal["readings", "changes"], now: dt.datetime | None = None
) -> list[Refusal]:
    """The refusals of a new record's date: missing, after today, or before the current record's.

    The date of the weighing or of the changes becomes the record's date, which every later
    check prints ("empty weight of ..."), so it is used as given or the record is refused:

    - no date: never written (the current record's date is not carried over to the new one);
    - a date after :func:`latest_date` (today somewhere on Earth: at most one day ahead of the
      UTC date, at UTC+14): never written, a date that has not come is a typing error;
    - a date before the current record's: written only with an explicit override (the new
      record would look older than the one it replaces; the override is for a current
      record whose own date is the one wrong).

    The weight and balance record is kept with the date of the weighing or of the change
    (14 CFR 43.9 (a) (2), the date the work was completed; FAA-H-8083-1B chapter 2, the
    current weight and balance record; from memory).

    Parameters
    ----------
    aircraft : the aircraft with its current record
    date : the readings' or the changes' ``date``
    source : which file it comes from, to name it: ``readings`` or ``changes``
    now : the moment the check is made (default the system clock); see :func:`latest_date`
    """
    what, file = ("weighing", "readings file") if source == "readings" else ("changes", "changes file")
    if date is None:
        return [
            Refusal(
                code="no_date",
                overridable=False,
                field="date",
                message=(
                    f"the {file} gives no date (its date field): a record is never written without the date of "
                    f"the {what}, which becomes the record's date; add date = YYYY-MM-DD to the {file}"
                ),
            )
        ]
    latest = latest_date(now)
    if date > latest:
        return [
            Refusal(
                code="future_date",
                overridable=False,
                field="date",
                message=(
                    f"the date of the {what}, {date.isoformat()} (the {file}'s date field), has not come yet: "
                    f"it is {latest.isoformat()} at the latest anywhere on Earth; a record is never written "
                    "with a date after today: check the date"
                ),
            )
        ]
    current = aircraft.empty.date
    if current is not None and date < current:
        return [
            Refusal(
                code="date_before_current",
                overridable=True,
                field="date",
                message=(
                    f"the date of the {what}, {date.isoformat()} (the {file}'s date field), is before the "
                    f"current record's date {current.isoformat()}: the new record would look older than the one "
                    "it replaces; check the date (an override is for a current record whose own date is wrong)"
                ),
            )
        ]
    return []


def _item(aircraft: Aircraft, item: ReadingItem, where: str) -> tuple[float, float, float]:
    if item.tank is not None:
        tank = aircraft.tank_by_id.get(item.tank)
        if tank is None:
            raise UnknownNameError(
                Problem(
                    f"{where}.tank", f"unknown tank {item.tank!r}", expected="one of " + ", ".join(aircraft.tank_by_id)
                )
            )
        assert item.fuel is not None
        if item.fuel > tank.usable:
            # the unusable fuel is part of the basic empty weight (FAA-H-8083-1B, from memory): the fuel
            # taken off is usable fuel, at most what the tank holds
            units = aircraft.units
            raise InputError(
                Problem(
                    f"{where}.fuel",
                    f"{item.fuel:g} {units.fuel_volume} is above the usable capacity of tank {tank.id!r}",
                    expected=f"at most {tank.usable:g} {units.fuel_volume}",
                )
            )
        weight = item.fuel * aircraft.density(tank)
        arm = item.arm if item.arm is not None else tank.arm_at(item.fuel)
        return weight, arm, item.lateral_arm if item.lateral_arm is not None else (tank.lateral_arm or 0.0)
    assert item.weight is not None and item.arm is not None
    return item.weight, item.arm, item.lateral_arm or 0.0


def lateral_arm_needed(aircraft: Aircraft, where: str, what: str) -> Problem:
    """The problem of a lateral arm left out on an aircraft that limits the lateral CG.

    Parameters
    ----------
    aircraft : the aircraft (for its arm unit)
    where : the field, e.g. ``point[1].lateral_arm`` or ``change[0].lateral_arm``
    what : the point or item, e.g. ``point 'rear left'``
    """
    return Problem(
        where,
        f"{what} gives no lateral arm: this aircraft limits the lateral CG (it has a lateral envelope), "
        "so its lateral arm is needed",
        expected=f"its lateral arm ({aircraft.units.arm}, + right): 0 for one on the centreline",
    )


def _require_lateral_arms(aircraft: Aircraft, readings: Readings, lateral: bool) -> None:
    """Refuse readings that leave a lateral arm to be guessed on an aircraft that limits the lateral CG.

    Where the aircraft has a lateral envelope, the readings measure the lateral CG (each
    weighing point gives its lateral arm, and so does each item taken off or put on, a fuel
    item through its tank) or say explicitly that the current lateral CG is kept
    (``keep_lateral_arm``). A lateral arm left out is never taken as the centreline.

    Raises
    ------
    InputError
        Naming every point and item whose lateral arm is missing.
    """
    if not aircraft.has_lateral:
        return
    if not lateral:
        if readings.keep_lateral_arm:
            return
        empty = aircraft.empty
        kept = "none" if empty.lateral_arm is None else fmt(empty.lateral_arm, aircraft.units.arm)
        raise InputError(
            Problem(
                "point",
                "this aircraft has a lateral envelope, and no weighing point gives its lateral_arm: give each "
                f"point's lateral_arm, or state keep_lateral_arm = true to keep the current lateral CG ({kept})",
            )
        )
    problems = [
        lateral_arm_needed(aircraft, f"point[{index}].lateral_arm", f"point {p.label!r}")
        for index, p in enumerate(readings.point)
        if p.lateral_arm is None
    ]
    for name, items in (("on_board", readings.on_board), ("missing", readings.missing)):
        for index, item in enumerate(items):
            if item.lateral_arm is None and item.tank is None:
                problems.append(lateral_arm_needed(aircraft, f"{name}[{index}].lateral_arm", f"item {item.label!r}"))
    if problems:
        raise InputError(problems)


def weigh(aircraft: Aircraft, readings: Readings, now: dt.datetime | None = None) -> WeighResult:
    """Compute the basic empty weight and CG from scale readings.

    Parameters
    ----------
    aircraft : the aircraft, with its current empty-weight record (for the comparison)
    readings : the weighing points and corrections
    now : the moment the readings' date is checked against (default the system clock;
        :func:`date_checks`)

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
    empty = aircraft.empty
    notes: list[str] = []
    problems: list[Problem] = []  # every problem of the readings with this aircraft, said together
    try:
        _require_lateral_arms(aircraft, readings, lateral)
    except LoadcheckError as error:
        problems += error.problems
    if not lateral and empty.lateral_arm is not None:
        why = (
            "as the readings state (keep_lateral_arm)"
            if readings.keep_lateral_arm
            else "the readings give no lateral arms"
        )
        notes.append(
            f"the lateral CG was not measured: the current record's {fmt(empty.lateral_arm, aircraft.units.arm)} "
            f"is kept ({why})"
        )
    points = []
    for p in readings.point:
        arm = point_arm(p, readings.geometry)
        net = p.reading - p.tare
        points.append(
            WeighPoint(
                label=p.label,
                reading=p.reading,
                tare=p.tare,
                net=net,
                arm=arm,
                moment=net * arm,
                lateral_arm=(p.lateral_arm or 0.0) if lateral else None,
            )
        )
    weight = sum(p.net for p in points)
    if weight <= 0:
        raise InputError(
            [*problems, Problem("point", "the net weights add up to nothing: check the readings and tares")]
        )
    moment = sum(p.moment for p in points)
    lateral_moment = sum(p.net * (p.lateral_arm or 0.0) for p in points)
    as_weighed = EmptyWeightRecord(
        weight=weight, arm=moment / weight, moment=moment, lateral_arm=lateral_moment / weight if lateral else None
    )
    warnings = [f"point {p.label!r} reads no weight after its tare" for p in points if p.net == 0]

    corrections = []
    for label, items, sign in (("on_board", readings.on_board, -1.0), ("missing", readings.missing, 1.0)):
        for index, item in enumerate(items):
            try:
                w, a, lat = _item(aircraft, item, f"{label}[{index}]")
            except LoadcheckError as error:
                problems += error.problems
                continue
            corrections.append(
                Correction(
                    label=item.label,
                    action="removed" if sign < 0 else "added",
                    weight=w,
                    arm=a,
                    moment=w * a,
                    lateral_arm=lat if lateral else None,
                )
            )
            weight += sign * w
            moment += sign * w * a
            lateral_moment += sign * w * lat
    if problems:
        raise InputError(problems)
    if weight <= 0:
        raise InputError(Problem("on_board", "taking off the items aboard leaves no weight: check the corrections"))
    new = EmptyWeightRecord(
        weight=weight,
        arm=moment / weight,
        moment=moment,
        lateral_arm=lateral_moment / weight if lateral else empty.lateral_arm,
    )
    previous = EmptyWeightRecord(weight=empty.weight, arm=empty.arm, moment=empty.moment, lateral_arm=empty.lateral_arm)
    record_warnings, refusals = record_checks(aircraft, new)
    refusals += date_checks(aircraft, readings.date, "readings", now)
    useful = aircraft.limits.max_takeoff_weight - new.weight
    return WeighResult(
        aircraft=aircraft.name,
        registration=aircraft.registration,
        points=points,
        as_weighed=as_weighed,
        corrections=corrections,
        new=new,
        previous=previous,
        change_weight=new.weight - empty.weight,
        change_arm=new.arm - empty.arm,
        change_lateral_arm=lateral_change(new, previous),
        useful_load=useful,
        change_useful_load=useful - aircraft.useful_load,
        warnings=notes + warnings + record_warnings,
        refusals=refusals,
        formula_cg=_formula_cg(readings, points),
        date=None if readings.date is None else readings.date.isoformat(),
        weighed_by=readings.weighed_by,
        note=readings.note,
        geometry=None if readings.geometry is None else readings.geometry.model_dump(),
        cg_range=empty.cg_range,
    )


def _formula_cg(readings: Readings, points: list[WeighPoint]) -> float | None:
    """The as-weighed CG by the FAA-H-8083-1 formula for the gear and datum (a cross-check)."""
    geometry = readings.geometry
    if geometry is None or any(p.wheel is None for p in readings.point):
        return None
    total = sum(p.net for p in points)
    other = sum(p.net for p, raw in zip(points, readings.point, strict=True) if raw.wheel != "main")
    d, length = geometry.main_distance, geometry.wheelbase
    if geometry.gear == "nosewheel":
        return d - other * length / total if geometry.datum == "forward" else -(d + other * length / total)
    return d + other * length / total if geometry.datum == "forward" else -d + other * length / total
