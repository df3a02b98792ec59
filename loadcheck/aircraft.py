"""The aircraft: units, empty-weight record, limits, stations, tanks and CG envelopes.

These pydantic models mirror the aircraft file described in DESIGN.md field by field. A
model that exists is valid: every field is checked here, at the boundary, and an error
names the field path and the bad value. Any mass, arm or fuel quantity may be written
with a unit (``"20 kg"``); it is converted to the aircraft's own units on the way in
with the exact constants of :mod:`loadcheck.units`.
"""

from __future__ import annotations

import datetime as dt
import hashlib
import json
from collections.abc import Callable
from functools import cached_property
from itertools import pairwise
from typing import Annotated, Any, Literal

import numpy as np
from pydantic import (
    AfterValidator,
    BeforeValidator,
    Field,
    PrivateAttr,
    ValidationInfo,
    WithJsonSchema,
    field_validator,
    model_validator,
)

from .display import fmt
from .envelope import AXES, Axis, EnvelopeShape, polygon_problem
from .errors import Problem, UnitError, UnknownNameError, spelling_hint
from .filemodel import FileModel, Flag, Registration
from .fuel import FuelGrade, default_density, density_problem, grade_name
from .registration import registration_key
from .units import (
    MAX_MAGNITUDE,
    ArmUnit,
    MassUnit,
    VolumeUnit,
    canonical_unit,
    convert,
    names_a_level,
    parse_quantity,
    unit_kind,
)

__all__ = [
    "RESERVED_IDS",
    "Aircraft",
    "EmptyWeight",
    "Envelope",
    "HistoryEntry",
    "Limits",
    "Mac",
    "Station",
    "StationGroup",
    "StationKind",
    "Tank",
    "registration_key",
    "Units",
]

StationKind = Literal["seat", "baggage", "cargo", "ballast", "other"]

_ID_PATTERN = r"^[A-Za-z0-9_][A-Za-z0-9_.-]*$"


RESERVED_IDS = (
    "registration",
    "reference",
    "pilot",
    "date",
    "category",
    "label",
    "taxi",
    "trip",
    "trip_time",
    "rate",
    "order",
    "reserve",
    "trip_id",
    "leg",
)
"""Names a station or tank may not take (in any letter case): they are the fleet CSV's own
columns (docs/fleet.md), so a station called ``pilot`` would be read as the pilot's name
and its weight lost, and one called ``leg`` would make every CSV with its column a trip."""


class _Model(FileModel):
    """Common configuration (loadcheck.filemodel): unknown keys, and true/false for a number, are errors."""


def _quantity_reader(kind: str, unit_field: str) -> Any:
    """A before-validator turning ``"20 kg"`` into a number in the aircraft's unit.

    The aircraft's units reach nested models through the validation context
    (``context={"units": Units}``); without it only plain numbers are accepted.
    """

    def read(value: Any, info: ValidationInfo) -> Any:
        if not isinstance(value, str):
            return value
        quantity = parse_quantity(value)
        if quantity.unit is None:
            return quantity.value
        units = (info.context or {}).get("units")
        if units is None:
            raise ValueError("a unit can be written here only when the file's [units] table is valid")
        if unit_kind(quantity.unit) != kind:
            raise ValueError(f"expected a {kind}, got the unit {quantity.unit!r}")
        return convert(quantity.value, quantity.unit, getattr(units, unit_field))

    return BeforeValidator(read)


_QUANTITY_SCHEMA = WithJsonSchema({"anyOf": [{"type": "number"}, {"type": "string"}]})


def _plausible(value: float) -> float:
    """A mass, arm or fuel volume in the file's units within :data:`loadcheck.units.MAX_MAGNITUDE`
    (after conversion from the unit written: a figure that grows past it in the file's units)."""
    if abs(value) > MAX_MAGNITUDE:
        raise ValueError(f"{value:g} is beyond any aircraft: at most {MAX_MAGNITUDE:,.0f} in the file's units")
    return value


Mass = Annotated[float, _quantity_reader("mass", "mass"), AfterValidator(_plausible), _QUANTITY_SCHEMA]
"""A mass [aircraft mass unit]; a string with a unit is converted."""
Arm = Annotated[float, _quantity_reader("length", "arm"), AfterValidator(_plausible), _QUANTITY_SCHEMA]
"""A distance from the datum [aircraft arm unit]; a string with a unit is converted."""
Volume = Annotated[float, _quantity_reader("volume", "fuel_volume"), AfterValidator(_plausible), _QUANTITY_SCHEMA]
"""A fuel volume [aircraft fuel volume unit]; a string with a unit is converted."""


def _unit_name(value: Any) -> Any:
    if isinstance(value, str):
        try:
            return canonical_unit(value)
        except UnitError:
            return value  # let the Literal report the valid choices
    return value


class Units(_Model):
    """The units every number of an aircraft file is written in."""

    mass: Annotated[MassUnit, BeforeValidator(_unit_name)] = Field(
        description="mass unit: lb or kg (another spelling of one, `lbs` or `LB`, is read as it)"
    )
    arm: Annotated[ArmUnit, BeforeValidator(_unit_name)] = Field(
        description="arm unit: in, mm, cm or m (`IN` or `inch` is read as `in`)"
    )
    fuel_volume: Annotated[VolumeUnit, BeforeValidator(_unit_name)] = Field(
        description="fuel volume unit: usgal, impgal or l (`US gal` or `L` is read as one)"
    )

    @property
    def moment(self) -> str:
        """Name of the moment unit, e.g. ``lb*in``."""
        return f"{self.mass}*{self.arm}"


class EmptyWeight(_Model):
    """The current basic empty weight record."""

    weight: Mass = Field(gt=0, description="basic empty weight [mass unit]")
    arm: Arm = Field(description="empty-weight CG, distance aft of datum [arm unit]")
    lateral_arm: Arm | None = Field(None, description="empty-weight lateral CG, + right [arm unit]")
    date: dt.date | None = Field(None, description="date of the record")
    basis: str | None = Field(None, description="what the empty weight includes (unusable fuel, oil)")
    cg_range: tuple[Arm, Arm] | None = Field(
        None, description="empty-weight CG range from the flight manual, if given [arm unit]"
    )

    @property
    def moment(self) -> float:
        """Empty-weight moment [mass unit * arm unit]."""
        return self.weight * self.arm

    @model_validator(mode="after")
    def _range_in_order(self) -> EmptyWeight:
        if self.cg_range is not None and self.cg_range[0] > self.cg_range[1]:
            raise ValueError(
                f"cg_range is reversed ({self.cg_range[0]:g} is aft of {self.cg_range[1]:g}); "
                "give the forward limit first"
            )
        return self


class Limits(_Model):
    """Weight limits from the flight manual; the CG limits are the envelopes."""

    max_takeoff_weight: Mass = Field(gt=0, description="maximum takeoff weight [mass unit]")
    max_ramp_weight: Mass | None = Field(None, gt=0, description="defaults to max takeoff [mass unit]")
    max_landing_weight: Mass | None = Field(None, gt=0, description="defaults to max takeoff [mass unit]")
    max_zero_fuel_weight: Mass | None = Field(None, gt=0, description="optional [mass unit]")
    min_flight_weight: Mass | None = Field(None, ge=0, description="optional [mass unit]")
    zero_fuel_cg: Literal["warning", "limit"] = Field(
        "warning", description="'limit' only where the flight manual limits the zero-fuel CG"
    )

    @property
    def ramp(self) -> float:
        """Maximum ramp weight in force [mass unit]."""
        return self.max_ramp_weight if self.max_ramp_weight is not None else self.max_takeoff_weight

    @property
    def landing(self) -> float:
        """Maximum landing weight in force [mass unit]."""
        return self.max_landing_weight if self.max_landing_weight is not None else self.max_takeoff_weight

    @model_validator(mode="after")
    def _ordered(self) -> Limits:
        if self.max_ramp_weight is not None and self.max_ramp_weight < self.max_takeoff_weight:
            raise ValueError("max_ramp_weight is below max_takeoff_weight")
        if self.max_landing_weight is not None and self.max_landing_weight > self.max_takeoff_weight:
            raise ValueError(
                f"max_landing_weight ({self.max_landing_weight:g}) is above max_takeoff_weight "
                f"({self.max_takeoff_weight:g})"
            )
        if self.max_zero_fuel_weight is not None and self.max_zero_fuel_weight > self.max_takeoff_weight:
            # the zero-fuel weight never exceeds the takeoff weight, so such a limit could never hold
            # anything back: a figure typed wrong, refused rather than carried as a limit that is not one
            raise ValueError(
                f"max_zero_fuel_weight ({self.max_zero_fuel_weight:g}) is above max_takeoff_weight "
                f"({self.max_takeoff_weight:g}), so it could never limit a loading: check the figure"
            )
        if self.min_flight_weight is not None and self.min_flight_weight >= self.max_takeoff_weight:
            raise ValueError("min_flight_weight is not below max_takeoff_weight")
        return self


class Mac(_Model):
    """Mean aerodynamic chord, for CG in percent of MAC."""

    leading_edge_arm: Arm = Field(description="arm of the MAC's leading edge [arm unit]")
    length: Arm = Field(gt=0, description="length of the MAC [arm unit]")

    def percent(self, arm: Any) -> Any:
        """CG position in percent of MAC: 100 * (arm - LEMAC) / MAC, of an arm or of an array of them.

        FAA-H-8083-1B chapter 2 (percent of MAC formula).
        """
        return 100.0 * (arm - self.leading_edge_arm) / self.length


class Station(_Model):
    """A place where people, baggage, cargo or ballast are carried."""

    id: str = Field(pattern=_ID_PATTERN, description="short name used in loadings")
    label: str | None = Field(None, description="name printed in tables")
    kind: StationKind = "other"
    arm: Arm = Field(description="distance aft of datum [arm unit]")
    lateral_arm: Arm | None = Field(None, description="distance right of centreline [arm unit]")
    max_weight: Mass | None = Field(None, ge=0, description="[mass unit]")
    min_weight: Mass | None = Field(None, ge=0, description="[mass unit]")
    seats: int | None = Field(None, ge=1, le=50, description="number of seats (seat stations), for the extreme checks")
    controls: Flag = Field(
        False,
        description="a pilot's seat: equipped with flight controls (no weight at any such seat is warned)",
    )

    @property
    def name(self) -> str:
        """Label, or id where no label is given."""
        return self.label or self.id

    @model_validator(mode="after")
    def _min_below_max(self) -> Station:
        if self.min_weight is not None and self.max_weight is not None and self.min_weight > self.max_weight:
            raise ValueError("min_weight is above max_weight")
        if self.kind in _NO_SEAT:  # a field a station of this kind cannot use would be read all the same
            given = [name for name, used in (("seats", self.seats is not None), ("controls", self.controls)) if used]
            if given:
                raise ValueError(
                    f"{' and '.join(given)} given on a {self.kind} station, which is no seat: give it "
                    "kind = 'seat' (or 'other'), or leave it out"
                )
        return self


_NO_SEAT = ("baggage", "cargo", "ballast")
"""Station kinds that are never a seat: ``seats`` and ``controls`` are refused there (a baggage
station with ``controls = true`` would count as the pilot's seat for the no-pilot warning)."""


class StationGroup(_Model):
    """Several stations under one combined limit (e.g. all baggage areas)."""

    id: str | None = Field(None, pattern=_ID_PATTERN)
    label: str
    stations: list[str] = Field(min_length=1)
    max_weight: Mass | None = Field(None, ge=0, description="[mass unit]")
    min_weight: Mass | None = Field(None, ge=0, description="[mass unit]")

    @field_validator("stations")
    @classmethod
    def _each_once(cls, value: list[str]) -> list[str]:
        repeated = sorted({s for s in value if value.count(s) > 1})
        if repeated:  # a typo for another station, most likely: that one would be left out of the limit
            raise ValueError(f"station(s) named twice in the group: {', '.join(repeated)}")
        return value

    @model_validator(mode="after")
    def _has_limit(self) -> StationGroup:
        if self.max_weight is None and self.min_weight is None:
            raise ValueError("a station group needs max_weight or min_weight")
        if self.min_weight is not None and self.max_weight is not None and self.min_weight > self.max_weight:
            raise ValueError("min_weight is above max_weight")
        return self


class Tank(_Model):
    """A fuel tank: usable capacity, arm (fixed or by quantity) and fuel density."""

    id: str = Field(pattern=_ID_PATTERN)
    label: str | None = None
    arm: Arm | None = Field(None, description="distance aft of datum [arm unit]; or give arm_table")
    lateral_arm: Arm | None = Field(None, description="distance right of centreline [arm unit]")
    usable: Volume = Field(gt=0, description="usable capacity [fuel volume unit]")
    fuel: Annotated[FuelGrade, BeforeValidator(grade_name)] | None = Field(
        None, description="fuel grade giving the default density: avgas, mogas or jet (Jet A, Jet A-1, 100LL accepted)"
    )
    density: float | None = Field(None, gt=0, description="[mass unit per fuel volume unit]")
    levels: dict[str, Volume] = Field(default_factory=dict, description="named fill levels [fuel volume unit]")
    arm_table: list[tuple[Volume, Arm]] | None = Field(
        None, description="quantity [fuel volume unit] -> arm [arm unit], linear between points"
    )

    @property
    def name(self) -> str:
        """Label, or id where no label is given."""
        return self.label or self.id

    @field_validator("levels")
    @classmethod
    def _level_names(cls, levels: dict[str, float]) -> dict[str, float]:
        seen: dict[str, str] = {}
        for name, quantity in levels.items():
            if name.lower() == "full":
                raise ValueError("'full' is built in and cannot be redefined as a level")
            if quantity < 0:
                raise ValueError(f"level {name!r} is negative ({quantity})")
            if _reads_as_amount(name):  # fail closed: "12" typed must be 12, never a level of another amount
                raise ValueError(
                    f"level {name!r} reads as an amount, so a loading's {name!r} could mean either; "
                    "name the level with a word (e.g. 'tabs', 'half')"
                )
            if not names_a_level(name):  # a loading reads it as an amount: the level could never be used
                raise ValueError(
                    f"level {name!r} begins with a digit, a sign or a point, so a loading reads it as an amount "
                    "and never as this level; name the level with a word (e.g. 'tabs', 'half')"
                )
            other = seen.setdefault(name.lower(), name)
            if other != name:
                raise ValueError(f"levels {other!r} and {name!r} differ only in letter case; give them other names")
        return levels

    @model_validator(mode="after")
    def _consistent(self) -> Tank:
        if self.fuel is None and self.density is None:
            raise ValueError("give the fuel grade (fuel = 'avgas' or 'jet') or its density")
        if self.arm is None and self.arm_table is None:
            raise ValueError("give the tank's arm or its arm_table")
        if self.arm is not None and self.arm_table is not None:
            # one of the two would be left unused: refused, never chosen for the user
            raise ValueError("give the tank's arm or its arm_table, not both")
        for name, quantity in self.levels.items():
            if quantity > self.usable:
                raise ValueError(f"level {name!r} ({quantity}) is above the usable capacity ({self.usable})")
        if self.arm_table is not None:
            table = self.arm_table
            if len(table) < 2:
                raise ValueError("arm_table needs at least two points")
            quantities = [q for q, _ in table]
            if any(b <= a for a, b in pairwise(quantities)):
                raise ValueError("arm_table quantities must increase strictly from point to point")
            if quantities[0] < 0 or quantities[-1] > self.usable * (1 + 1e-12):
                raise ValueError(f"arm_table quantities must lie within 0 and the usable capacity ({self.usable})")
        return self

    def arm_at(self, quantity: Any) -> Any:
        """Arm of the fuel in this tank at a quantity, or at an array of them [arm unit].

        Linear interpolation in ``arm_table``; beyond the table's ends the end arm holds.
        """
        if self.arm_table is None:
            assert self.arm is not None
            return self.arm if np.ndim(quantity) == 0 else np.full(np.shape(quantity), self.arm)
        table = self.arm_table
        return np.interp(quantity, [q for q, _ in table], [a for _, a in table])

    def arm_knots(self) -> list[float]:
        """Quantities at which the arm's slope may change [fuel volume unit]."""
        return [q for q, _ in self.arm_table] if self.arm_table else []


class Envelope(_Model):
    """A certified CG envelope: a polygon on two axes, for one category."""

    category: str = Field(min_length=1)
    label: str | None = None
    axes: tuple[Axis, Axis] = Field(
        description="x and y axes, from arm, moment, mac, lateral_arm, lateral_moment, weight"
    )
    points: list[tuple[float, float]] = Field(min_length=3, description="corners in the axes' units")
    moment_scale: float = Field(
        1.0, gt=0, description="a moment or lateral_moment axis is read as moment / moment_scale"
    )
    _shape: EnvelopeShape | None = PrivateAttr(None)
    _named: str | None = PrivateAttr(None)  # its subject where its category has other unlabelled envelopes

    @field_validator("category")
    @classmethod
    def _category_as_written(cls, name: str) -> str:
        # 'normal ' would be a category of its own, and its envelope would hold no loading checked
        # as 'normal': refused, never trimmed for the user
        if name != name.strip():
            raise ValueError(f"the category has spaces at its start or end; write {name.strip()!r}")
        return name

    @model_validator(mode="after")
    def _valid_polygon(self) -> Envelope:
        if self.axes[0] == self.axes[1]:
            raise ValueError(f"the two axes must differ (both are {self.axes[0]!r})")
        if "weight" not in self.axes and set(self.axes) != {"arm", "lateral_arm"}:
            raise ValueError("an envelope needs a weight axis, or the axes lateral_arm and arm")
        if self.moment_scale != 1 and not any(AXES[axis].unit == "moment" for axis in self.axes):
            # the author meant a moment envelope: its points would be read as arms, a guess
            raise ValueError(
                f"moment_scale = {self.moment_scale:g} on an envelope with no moment axis (axes "
                f"{', '.join(self.axes)}): give the moment axis, or leave moment_scale out"
            )
        return self  # the polygon is checked by the aircraft, which knows the units (_usable_polygon)

    @property
    def subject(self) -> str:
        """The envelope in words: its label, else its category ("the normal-category envelope"), with its
        axes where the category has another envelope without a label ("the normal-category envelope of
        lateral CG and weight"): two limits are never told in the same words."""
        if self._named is not None:
            return self._named
        return f"the {self.label or self.category + '-category'} envelope".replace("envelope envelope", "envelope")

    def point_words(self, units: Units) -> Callable[[float, float], str]:
        """A function that words a point of this envelope's axes in the aircraft's units
        ("CG 40.90 in, weight 1,975.0 lb")."""

        def one(axis: Axis, value: float) -> str:
            unit = {"mass": units.mass, "arm": units.arm, "percent": "%MAC", "moment": units.moment}[AXES[axis].unit]
            scaled = f" (/ {self.moment_scale:g})" if AXES[axis].unit == "moment" and self.moment_scale != 1 else ""
            return f"{_AXIS_WORDS[axis]} {fmt(value, unit)}{scaled}"

        return lambda x, y: f"{one(self.axes[0], x)}, {one(self.axes[1], y)}"

    @property
    def is_lateral(self) -> bool:
        """True for an envelope that limits the lateral CG."""
        return any(AXES[a].lateral for a in self.axes)

    @property
    def shape(self) -> EnvelopeShape:
        """The prepared geometry (built by the aircraft, which knows the MAC)."""
        assert self._shape is not None, "envelope geometry is built by Aircraft validation"
        return self._shape


_AXIS_WORDS: dict[str, str] = {
    "weight": "weight",
    "arm": "CG",
    "mac": "CG",
    "moment": "moment",
    "lateral_arm": "lateral CG",
    "lateral_moment": "lateral moment",
}


_AXIS_NAMES = _AXIS_WORDS | {"mac": "CG in %MAC"}
"""An envelope's axes in words, where its subject names them (:func:`_name_alike`)."""


def _name_alike(envelopes: list[Envelope]) -> None:
    """Give the envelopes without a label that share a category a subject naming their axes (and, where
    the axes are the same too, their place in the file), so that a finding says which one it is about."""
    unlabelled: dict[str, list[tuple[int, Envelope]]] = {}
    for index, envelope in enumerate(envelopes):
        if envelope.label is None:
            unlabelled.setdefault(envelope.category, []).append((index, envelope))
    for category, alike in unlabelled.items():
        if len(alike) < 2:
            continue
        named = {
            index: f"the {category}-category envelope of {_AXIS_NAMES[e.axes[0]]} and {_AXIS_NAMES[e.axes[1]]}"
            for index, e in alike
        }
        for index, envelope in alike:
            same = [i for i in named if named[i] == named[index]]
            envelope._named = named[index] + (f" (envelope {index + 1} of the file)" if len(same) > 1 else "")


def _usable_polygon(envelope: Envelope, info: ValidationInfo) -> Envelope:
    """An envelope of the aircraft whose corners make a usable polygon (:func:`~loadcheck.envelope.polygon_problem`);
    a problem names the envelope and, where the edges cross, the point near which they do in the aircraft's units."""
    units = info.data.get("units")
    describe = envelope.point_words(units) if isinstance(units, Units) else None
    problem = polygon_problem(envelope.points, describe)
    if problem:
        raise ValueError(f"{envelope.subject} is not usable: {problem}")
    return envelope


class HistoryEntry(_Model):
    """One earlier empty-weight record, kept when a new one is made current."""

    recorded: dt.datetime | dt.date = Field(description="when the new record replaced this one")
    reason: str = Field(description="weighing, alteration or other")
    previous: EmptyWeight
    new_weight: Mass | None = Field(None, description="the weight of the record that replaced it [mass unit]")
    new_arm: Arm | None = Field(None, description="the arm of the record that replaced it [arm unit]")
    inputs: dict[str, Any] = Field(default_factory=dict, description="what the new record was computed from")
    by: str | None = Field(None, description="who made the new record (weighed, altered)")
    note: str | None = Field(None, description="why, in the maker's words")
    overrides: list[str] = Field(default_factory=list, description="checks the maker overrode to write the record")


class EquipmentItem(_Model):
    """An item of installed equipment in the empty weight (the equipment list)."""

    id: str = Field(pattern=_ID_PATTERN)
    label: str | None = None
    weight: Mass = Field(ge=0, description="[mass unit]")
    arm: Arm = Field(description="[arm unit]")
    lateral_arm: Arm | None = Field(None, description="[arm unit], + right")

    @property
    def name(self) -> str:
        """Label, or id where no label is given."""
        return self.label or self.id


class Aircraft(_Model):
    """An aircraft data file (DESIGN.md, 'Aircraft file')."""

    format: Literal[1] = 1
    name: str = Field(min_length=1)
    registration: Registration | None = None
    units: Units
    empty: EmptyWeight
    limits: Limits
    mac: Mac | None = None
    station: list[Station] = Field(default_factory=list)
    station_group: list[StationGroup] = Field(default_factory=list)
    tank: list[Tank] = Field(default_factory=list)
    envelope: list[Annotated[Envelope, AfterValidator(_usable_polygon)]] = Field(min_length=1)
    history: list[HistoryEntry] = Field(default_factory=list)
    equipment: list[EquipmentItem] = Field(default_factory=list, description="installed equipment list")
    rotorcraft: Flag = Field(False, description="true for a helicopter or gyroplane (negligible-change rule)")
    standard_occupant_weight: Mass | None = Field(
        None, gt=0, description="weight per occupant for the extreme-loading checks [mass unit]"
    )
    meto_power_hp: float | None = Field(
        None, gt=0, description="maximum except takeoff power, for the minimum fuel for balance [hp]"
    )

    @field_validator("name")
    @classmethod
    def _named(cls, value: str) -> str:
        if not value.strip():  # "   " would head every table and record with nothing
            raise ValueError("the aircraft's name is blank: give the name printed on its tables and records")
        return value

    @field_validator("registration")
    @classmethod
    def _addressable(cls, value: str | None) -> str | None:
        if value is not None and not registration_key(value):  # "  " or "-" would match no aircraft, or every one
            raise ValueError(
                f"{value!r} has no letter or digit, so no loading or fleet row can name this aircraft; "
                "give its registration or leave the key out"
            )
        return value

    @model_validator(mode="after")
    def _cross_references(self) -> Aircraft:
        problems: list[str] = []
        seen: dict[str, str] = {}
        named = [("station", index, s.id) for index, s in enumerate(self.station)]
        named += [("tank", index, t.id) for index, t in enumerate(self.tank)]
        equipment_ids = [e.id for e in self.equipment]
        for index, name in enumerate(equipment_ids):
            if equipment_ids.index(name) != index:
                problems.append(f"equipment[{index}].id: {name!r} is used twice")
        folded: dict[str, str] = {}
        for where, index, name in named:
            if name in seen:
                problems.append(f"{where}[{index}].id: {name!r} is used twice (also a {seen[name]})")
            elif folded.setdefault(name.casefold(), name) != name:  # as categories are: one spelling each
                problems.append(
                    f"{where}[{index}].id: {name!r} differs from {folded[name.casefold()]!r} only in letter case; "
                    "give stations and tanks ids that differ in more than case (a loading or a fleet column "
                    "written the other way would name the other one)"
                )
            seen[name] = where
        stations = {s.id for s in self.station}
        for index, group in enumerate(self.station_group):
            for name in group.stations:
                if name not in stations:
                    known = ", ".join(sorted(stations)) or "none"
                    problems.append(f"station_group[{index}].stations: unknown station {name!r} (known: {known})")
        has_lateral = (
            self.empty.lateral_arm is not None
            or any(s.lateral_arm is not None for s in self.station)
            or any(t.lateral_arm is not None for t in self.tank)
        )
        spelled: dict[str, str] = {}
        for index, envelope in enumerate(self.envelope):
            first = spelled.setdefault(envelope.category.casefold(), envelope.category)
            if first != envelope.category:
                problems.append(
                    f"envelope[{index}].category: {envelope.category!r} differs from {first!r} only in letter "
                    "case; spell each category one way (they would be two categories)"
                )
            if "mac" in envelope.axes and self.mac is None:
                problems.append(f"envelope[{index}].axes: a 'mac' axis needs the aircraft's [mac] table")
            if envelope.is_lateral and not has_lateral:
                problems.append(
                    f"envelope[{index}].axes: a lateral envelope needs lateral arms, "
                    "and no empty weight, station or tank gives one"
                )
        if any(envelope.is_lateral for envelope in self.envelope) and has_lateral:
            # a lateral limit checked with a lateral arm guessed as the centreline would be a guess
            # beside a limit: every item gives its own (0 on the centreline), never taken as 0
            unit = self.units.arm
            missing = [("empty", self.empty.lateral_arm)]
            missing += [(f"station[{i}]", s.lateral_arm) for i, s in enumerate(self.station)]
            missing += [(f"tank[{i}]", t.lateral_arm) for i, t in enumerate(self.tank)]
            problems += [
                f"{where}.lateral_arm: this aircraft limits the lateral CG (a lateral envelope), so every "
                f"item gives its lateral arm [{unit}, + right]: 0 for one on the centreline"
                for where, arm in missing
                if arm is None
            ]
        problems += _boundary_problems(self)
        if problems:
            raise ValueError("\n".join(problems))
        for envelope in self.envelope:
            envelope._shape = EnvelopeShape(envelope.axes, envelope.points, envelope.moment_scale, self.mac)
        _name_alike(self.envelope)
        return self

    @model_validator(mode="after")
    def _empty_below_max_takeoff(self) -> Aircraft:
        if self.empty.weight >= self.limits.max_takeoff_weight:
            raise ValueError(
                f"empty.weight: the empty weight ({self.empty.weight:g}) is not below "
                f"limits.max_takeoff_weight ({self.limits.max_takeoff_weight:g}): no useful load is left"
            )
        return self

    # -- look-ups -------------------------------------------------------------------

    @cached_property
    def station_by_id(self) -> dict[str, Station]:
        """Stations by id."""
        return {s.id: s for s in self.station}

    @cached_property
    def control_seats(self) -> tuple[str, ...]:
        """Ids of the seats equipped with flight controls (``controls = true``), in file order."""
        return tuple(s.id for s in self.station if s.controls)

    @cached_property
    def tank_by_id(self) -> dict[str, Tank]:
        """Tanks by id."""
        return {t.id: t for t in self.tank}

    @property
    def categories(self) -> list[str]:
        """Categories in file order; the first is the default."""
        return list(dict.fromkeys(e.category for e in self.envelope))

    def category(self, name: str | None = None) -> str:
        """The category asked for, or the default (the file's first).

        Raises
        ------
        UnknownNameError
            For a category no envelope has, listing the known ones (fail closed).
        """
        chosen = self.categories[0] if name is None else name
        if chosen not in self.categories:
            raise UnknownNameError(
                Problem(
                    "category",
                    f"unknown category {chosen!r}{spelling_hint(chosen, self.categories)}",
                    expected="one of " + ", ".join(self.categories),
                )
            )
        return chosen

    def envelopes_for(self, category: str) -> list[Envelope]:
        """All envelopes of one category (every one must hold)."""
        return [e for e in self.envelope if e.category == category]

    @property
    def has_lateral(self) -> bool:
        """True where the aircraft limits the lateral CG."""
        return any(e.is_lateral for e in self.envelope)

    def density(self, tank: Tank) -> float:
        """Fuel density of a tank [mass unit per fuel volume unit]."""
        if tank.density is not None:
            return tank.density
        assert tank.fuel is not None
        return default_density(tank.fuel, self.units.mass, self.units.fuel_volume)

    def usable_fuel_weight(self, tank: Tank) -> float:
        """Weight of a tank's usable fuel at its default density [mass unit]."""
        return tank.usable * self.density(tank)

    @property
    def useful_load(self) -> float:
        """Maximum takeoff weight less basic empty weight [mass unit]."""
        return self.limits.max_takeoff_weight - self.empty.weight

    def with_empty(self, weight: float, arm: float, lateral_arm: float | None = None) -> Aircraft:
        """This aircraft with a new empty weight [mass unit] and CG [arm unit] (the lateral
        arm kept where none is given), validated afresh: nothing derived or cached from the
        old record (fingerprint, envelope shapes) carries over."""
        data = self.model_dump()
        data["empty"] = {**data["empty"], "weight": weight, "arm": arm}
        if lateral_arm is not None:
            data["empty"]["lateral_arm"] = lateral_arm
        return type(self).model_validate(data)

    @cached_property
    def fingerprint(self) -> str:
        """SHA-256 of the canonical JSON of the aircraft data (first 16 hex digits)."""
        canonical = json.dumps(self.model_dump(mode="json"), sort_keys=True, separators=(",", ":"))
        return hashlib.sha256(canonical.encode()).hexdigest()[:16]


def _reads_as_amount(text: str) -> bool:
    """True where ``text`` reads as an amount (``12``, ``5 l``, ``3.5 usgal``): no name for a level."""
    try:
        parse_quantity(text)
    except (UnitError, ValueError):
        return False
    return True


BURN_TOGETHER = "together"
"""The burn order's keyword for every tank burned together (loadcheck.loading.burn_order): no tank id."""


def _boundary_problems(aircraft: Aircraft) -> list[str]:
    """Rules that keep a value from being misread later: ids that a fleet CSV would read
    as its own columns, a category with no fore-and-aft CG limit, a fuel density no fuel
    has in the file's units."""
    problems: list[str] = []
    reserved = {name.lower() for name in RESERVED_IDS}
    named = [("station", index, s.id) for index, s in enumerate(aircraft.station)]
    named += [("tank", index, t.id) for index, t in enumerate(aircraft.tank)]
    for where, index, name in named:
        if name.lower() in reserved:
            problems.append(
                f"{where}[{index}].id: {name!r} is a reserved name (a column of the fleet CSV: "
                f"{', '.join(RESERVED_IDS)}), so its {'weight' if where == 'station' else 'fuel'} could be read as "
                f"something else; choose another id, e.g. {name + '_' + where!r}"
            )
    for index, tank in enumerate(aircraft.tank):
        if tank.id == BURN_TOGETHER:
            problems.append(
                f"tank[{index}].id: {tank.id!r} is the burn order's word for every tank burned together, so "
                f"an order naming this tank alone would be read as that; choose another id, e.g. {tank.id + '_tank'!r}"
            )
    for category in aircraft.categories:
        envelopes = aircraft.envelopes_for(category)
        if not any(axis in ("arm", "moment", "mac") for e in envelopes for axis in e.axes):
            index = next(i for i, e in enumerate(aircraft.envelope) if e.category == category)
            problems.append(
                f"envelope[{index}].category: category {category!r} has only lateral envelopes, so its fore-and-aft "
                "CG would never be checked; give it an envelope on arm, moment or mac as well"
            )
    units = aircraft.units
    for index, tank in enumerate(aircraft.tank):
        if tank.density is not None:
            problem = density_problem(tank.density, units.mass, units.fuel_volume)
            if problem:
                problems.append(f"tank[{index}].density: {problem}")
    return problems
