"""A loading: what is in each station and tank, and how the fuel is burned.

:class:`Loading` mirrors the loading file of DESIGN.md; values may be written with a
unit. :func:`resolve_loading` checks a loading against one aircraft (station, tank,
level and category names; tank capacities; fuel available for the burn) and returns a
:class:`ResolvedLoading` with every amount in the aircraft's own units.

Fuel burn (DESIGN.md, "Conditions checked"): with the order ``together`` every tank gives
fuel in proportion to what it held at engine start; with a list, each tank is emptied to
zero before the next one feeds. Taxi fuel comes out the same way, before takeoff.

A taxi, trip, reserve or rate given as a mass is the mass burned: it becomes the volume
that burns exactly that mass in the burn order, tank by tank at each tank's density
(:meth:`BurnPlan.volume_for_mass`), never a volume at an average density.
"""

from __future__ import annotations

import math
import re
import unicodedata
from collections.abc import Mapping, Sequence
from dataclasses import dataclass, field, replace
from typing import Annotated, Any, Literal

from pydantic import BeforeValidator, Field, field_validator, model_validator

from .aircraft import BURN_TOGETHER, Aircraft, Tank
from .errors import InputError, LoadcheckError, Problem, UnitError, UnknownNameError, spelling_hint
from .filemodel import AircraftKey, FileModel, Registration
from .fuel import density_problem
from .registration import registration_key
from .units import (
    MAX_MAGNITUDE,
    Quantity,
    convert,
    in_unit,
    level_key,
    names_a_level,
    parse_duration_hours,
    parse_quantity,
    parse_rate,
    unit_kind,
)
from .words import count

__all__ = [
    "recorded_inputs",
    "Burn",
    "BurnPlan",
    "Leg",
    "Loading",
    "MAX_NAME_LENGTH",
    "ResolvedLoading",
    "ResolvedTrip",
    "StopFuel",
    "apply_overrides",
    "landing_fuel",
    "leg_assignments",
    "leg_field",
    "leg_of_field",
    "resolve_loading",
    "tank_list",
    "burn_order",
    "resolve_trip",
    "unknown_station",
]

Amount = Annotated[float | str, Field(union_mode="left_to_right")]
"""A number in the aircraft's unit, or a string with a unit (``"20 kg"``)."""


_LIST_SEPARATORS = {",": r"\s*,\s*", "csv": r"\s*[;|/]\s*|\s+"}


def tank_list(text: str, field: str, separators: Literal[",", "csv"] = ",", *, with_value: bool = True) -> list[str]:
    """Tank ids from a list as typed (``--order aux,mains``, ``--fill``; in a CSV cell ``aux;mains``,
    ``aux mains``), every entry as given: an empty one (two separators together, or one at an end)
    is refused, never dropped.

    Raises
    ------
    InputError
        For an empty entry, naming ``field`` and (``with_value``) the text as typed; an option
        named with its value (``--order aux,,mains``) is given ``with_value=False``.

    Examples
    --------
    >>> tank_list("aux, mains", "--order")
    ['aux', 'mains']
    >>> tank_list("aux mains", "order", "csv")
    ['aux', 'mains']
    """
    names = re.split(_LIST_SEPARATORS[separators], text.strip())
    if not all(names):
        raise InputError(
            Problem(
                field,
                "the list of tanks has an empty entry (two separators together, or one at an end)",
                value=text if with_value else None,
                expected="tank ids separated by commas, e.g. aux,mains"
                if separators == ","
                else "tank ids separated by ';', '|', '/' or spaces",
            )
        )
    return names


NO_TAXI_NOTE = "no taxi fuel given; takeoff is checked at the engine-start fuel"
"""The note of a loading that gives no taxi fuel (an answer that finds its taxi fuel drops it)."""

NO_TRIP_NOTE = "no trip fuel given; landing is checked at the takeoff fuel"
"""The note of a loading that gives no trip fuel (an answer that finds its trip fuel drops it)."""


def burn_order(
    text: str, field: str, separators: Literal[",", "csv"] = ",", *, with_value: bool = True
) -> Literal["together"] | list[str]:
    """A burn order as typed: ``together``, or the tanks in the order they are burned (:func:`tank_list`)."""
    return "together" if text.strip() == BURN_TOGETHER else tank_list(text, field, separators, with_value=with_value)


def _check_amount(value: Any, kinds: tuple[str, ...]) -> Any:
    """Syntax check of an amount: a non-negative finite number with a unit of ``kinds``."""
    if type(value) is float and 0.0 <= value <= MAX_MAGNITUDE:  # a plain number that holds: the usual amount
        return value
    quantity = parse_quantity(value)
    if quantity.value < 0:
        raise ValueError("must not be negative")
    if quantity.unit is not None and unit_kind(quantity.unit) not in kinds:
        raise ValueError(f"expected a {' or '.join(kinds)}, got the unit {quantity.unit!r}")
    return value


def _mass_amount(value: Any) -> Any:
    return _check_amount(value, ("mass",))


def _fuel_amount(value: Any) -> Any:
    return _check_amount(value, ("mass", "volume"))


def _fuel_start(value: Any) -> Any:
    """A tank's fuel at engine start: an amount, ``full`` or a fill-level name."""
    if names_a_level(value):
        return value.strip()  # 'full' or a level name, looked up against the tank later
    return _fuel_amount(value)


def _fuel_rate(value: Any) -> Any:
    """Syntax check of a burn rate: per hour, a volume or a mass (``"36 l/h"``, ``"60 lb/h"``)."""
    quantity = parse_rate(value)
    if quantity.value < 0:
        raise ValueError("must not be negative")
    return value


MAX_NAME_LENGTH = 60
"""The longest name of a person at a station [characters]: it must fit the load sheet's seat line."""


def _person_name(value: Any) -> Any:
    """Syntax check of a person's name at a station: text, not empty, at most MAX_NAME_LENGTH
    characters, no control characters (a new line, a tab); surrounding spaces are not kept."""
    if not isinstance(value, str):
        raise ValueError("a name is text (in quotes)")
    text = value.strip()
    if not text:
        raise ValueError("an empty name: give the person's name or leave the station out of [names]")
    if len(text) > MAX_NAME_LENGTH:
        raise ValueError(f"a name of {len(text)} characters; at most {MAX_NAME_LENGTH}")
    if any(unicodedata.category(ch).startswith("C") for ch in text):
        raise ValueError("a name must not hold control characters (a new line, a tab)")
    return text


PersonName = Annotated[str, BeforeValidator(_person_name)]
MassAmount = Annotated[float | str, BeforeValidator(_mass_amount)]
FuelAmount = Annotated[float | str, BeforeValidator(_fuel_amount)]
FuelStart = Annotated[float | str, BeforeValidator(_fuel_start)]
FuelRate = Annotated[float | str, BeforeValidator(_fuel_rate)]


class _Model(FileModel):
    """Common configuration (loadcheck.filemodel): unknown keys, and true/false for a number, are errors."""


class Burn(_Model):
    """How fuel is used: taxi before takeoff, trip from takeoff to landing."""

    taxi: FuelAmount | None = Field(None, description="fuel used before takeoff [fuel volume unit, or with unit]")
    trip: FuelAmount | None = Field(None, description="fuel used from takeoff to landing [fuel volume unit]")
    trip_time: float | str | None = Field(None, description="'2:15', '2.25 h' or hours; needs rate")
    rate: FuelRate | None = Field(
        None, description="fuel used per hour with trip_time [fuel volume unit / h]; or '36 l/h', '9.5 gph', '60 lb/h'"
    )
    order: Literal["together"] | list[str] = Field("together", description="'together' or tank ids in burn order")
    reserve: FuelAmount | None = Field(None, description="warn when landing fuel is below it [fuel volume unit]")

    @field_validator("trip_time", mode="before")
    @classmethod
    def _duration(cls, value: Any) -> Any:
        if value is not None:
            parse_duration_hours(value)
        return value

    @field_validator("order")
    @classmethod
    def _distinct(cls, value: Any) -> Any:
        if isinstance(value, list):
            if not value:
                raise ValueError("an empty burn order burns nothing; give tank ids or 'together'")
            repeated = sorted({t for t in value if value.count(t) > 1})
            if repeated:
                raise ValueError(f"tank(s) named twice in the burn order: {', '.join(repeated)}")
        return value

    @model_validator(mode="after")
    def _trip_given_once(self) -> Burn:
        if self.trip is not None and self.trip_time is not None:
            raise ValueError("give the trip fuel or a trip time with a fuel rate, not both")
        if self.trip_time is not None and self.rate is None:
            raise ValueError("a trip time needs a fuel rate (fuel per hour) to give the trip fuel")
        if self.rate is not None and self.trip_time is None:
            raise ValueError(
                "a fuel rate is used only with a trip time: give the trip time too, or the trip fuel alone"
            )
        return self


class Leg(_Model):
    """A leg of a trip after the first: what changes at the stop before it, and its own burn.

    The first leg is the loading's own ``[load]``, ``[fuel]`` and ``[burn]``; each ``[[leg]]``
    table is the next leg (docs/file-format.md, "Trips of several legs").
    """

    label: str | None = Field(None, description="free text: where the leg goes")
    load: dict[str, MassAmount] = Field(
        default_factory=dict,
        description="new weight at each station whose weight changes at the stop; 0 when a person or bag gets off "
        "[mass unit]; stations not named keep their weight",
    )
    names: dict[str, PersonName] = Field(
        default_factory=dict,
        description="who is at each station from this leg on, where that changes: a person's name per station id "
        f"[text, at most {MAX_NAME_LENGTH} characters]; a station whose weight this leg changes loses "
        "its name unless named here, the others keep theirs",
    )
    add_fuel: dict[str, FuelStart] = Field(
        default_factory=dict,
        description="fuel put into each tank at the stop: a quantity added [fuel volume unit] or '120 lb', "
        "'full', or a level name in any letter case (filled up to it); tanks not named get none",
    )
    burn: Burn = Field(
        description="this leg's taxi, trip (or trip_time and rate) and reserve; the burn order "
        "and the reserve are the previous leg's unless given (reserve = 0 drops it)"
    )


class Loading(_Model):
    """A loading file (DESIGN.md, 'Loading file'); with ``leg`` tables, a trip of several legs."""

    format: Literal[1] = 1
    aircraft: AircraftKey | None = Field(None, description="aircraft file, relative to this file")
    category: str | None = None
    label: str | None = Field(
        None,
        description="free text naming the loading (the load sheet's 'Loading'); a flight or booking reference "
        "is given as reference",
    )
    registration: Registration | None = Field(None, description="the aircraft, by registration, in a fleet")
    reference: str | None = Field(None, description="flight or booking reference")
    pilot: str | None = Field(None, description="the pilot in command")
    fuel_density: float | None = Field(None, gt=0, description="overrides every tank [mass unit / volume unit]")
    load: dict[str, MassAmount] = Field(default_factory=dict, description="mass per station [mass unit]")
    names: dict[str, PersonName] = Field(
        default_factory=dict,
        description="optional: who is at each station, a person's name per station id (shown beside the seat on the "
        f"load sheet) [text, at most {MAX_NAME_LENGTH} characters]; only at a station with a weight in [load]",
    )
    fuel: dict[str, FuelStart] = Field(
        default_factory=dict,
        description="quantity per tank at engine start: number [fuel volume unit], 'full', a level, '120 lb'; "
        "a level name in any letter case",
    )
    burn: Burn = Field(default_factory=Burn)
    leg: list[Leg] = Field(
        default_factory=list, description="the legs after the first, in the order flown (a trip); none: one leg"
    )


def recorded_inputs(loading: Loading) -> dict[str, Any]:
    """A loading as a check log records it, to be checked again from the record (``log verify``):
    the fields given and only those, as JSON data.

    A field left out is not written with its default: a leg's burn ``order`` and ``reserve`` left
    out are the previous leg's when the trip is resolved (:func:`resolve_trip`), so a default written
    in their place (``order = "together"``) would make the record another trip than the one checked.
    """
    return loading.model_dump(mode="json", exclude_unset=True, exclude_none=True)


def leg_field(number: int, path: str = "") -> str:
    """The field of a problem of a trip's leg, as the user counts legs (leg 1 is the loading itself).

    Examples
    --------
    >>> leg_field(2, "burn.taxi"), leg_field(3)
    ('leg 2, burn.taxi', 'leg 3')
    """
    return f"leg {number}, {path}" if path else f"leg {number}"


_LEG_FIELD = re.compile(r"leg (\d+)(?:, (.*))?")


def leg_of_field(field: str) -> tuple[int, str] | None:
    """The leg number and the path within the leg of a field written by :func:`leg_field`; None
    for a field of the loading itself.

    Examples
    --------
    >>> leg_of_field("leg 2, add_fuel.main"), leg_of_field("burn.taxi")
    ((2, 'add_fuel.main'), None)
    """
    match = _LEG_FIELD.fullmatch(field or "")
    return None if match is None else (int(match.group(1)), match.group(2) or "")


def apply_overrides(
    data: dict[str, Any],
    *,
    load: Mapping[str, str] | None = None,
    fuel: Mapping[str, str] | None = None,
    burn: Mapping[str, Any] | None = None,
    category: str | None = None,
    legs: Mapping[int, Mapping[str, Any]] | None = None,
    names: Mapping[str, str] | None = None,
) -> dict[str, Any]:
    """Return loading-file data with command-line values laid on top (they win).

    ``names`` are people's names by station id (the ``[names]`` table). ``legs`` maps a leg
    number (2 for the first ``[[leg]]`` table) to its ``load``, ``add_fuel`` and ``burn``
    values and, optionally, its ``label`` and ``names`` (see :func:`leg_assignments`). A leg
    number one past the trip's last leg adds a leg only with that leg's ``burn`` (every leg
    has its own burn, as every ``[[leg]]`` table must): a station weight or fuel for a leg the
    trip does not have is refused, never made into a new leg.

    Raises
    ------
    InputError
        A leg number that skips a leg, or values for a leg the trip does not have without
        that leg's burn; each problem's field is the value's (``leg 3, load.left``).
    """
    merged = {key: (dict(value) if isinstance(value, dict) else value) for key, value in data.items()}
    _lay_over(merged, {"load": load, "fuel": fuel, "burn": burn, "names": names})
    if category is not None:
        merged["category"] = category
    if legs:
        tables = merged.get("leg", [])
        tables = [dict(t) if isinstance(t, dict) else t for t in tables] if isinstance(tables, list) else tables
        if not isinstance(tables, list):  # a 'leg' of the wrong type is left for validation to report
            return merged
        problems: list[Problem] = []
        for number in sorted(legs):
            index = number - 2
            # source-neutral words: the remedy names the leg's burn by its field (leg_field), which the
            # command line names by its option (loadcheck.cli.common) and the desk by its form field
            has = f"the trip has {count(len(tables) + 1, 'leg')}" if tables else "the loading has one leg"
            next_burn = leg_field(len(tables) + 2, "burn")
            if index > len(tables):
                problems += [
                    Problem(
                        where,
                        f"leg {number} skips leg {len(tables) + 2}: {has}; every leg is given in order, "
                        "each after the first with its own burn (its taxi and trip fuel)",
                        value=value,
                        expected=f"{next_burn} first",
                    )
                    for where, value in _leg_values(number, legs[number])
                ]
                continue
            if index == len(tables):
                if "burn" not in legs[number]:
                    existing = (f"a leg from 2 to {len(tables) + 1}" if len(tables) > 1 else "leg 2") if tables else ""
                    problems += [
                        Problem(
                            where,
                            f"{has}, so it has no leg {number}: a leg after the first is added only with its own "
                            "burn (its taxi and trip fuel)",
                            value=value,
                            expected=f"{next_burn} as well" + (f", or {existing}" if existing else ""),
                        )
                        for where, value in _leg_values(number, legs[number])
                    ]
                    continue
                tables.append({})
            if isinstance(tables[index], dict):
                tables[index] = {k: (dict(v) if isinstance(v, dict) else v) for k, v in tables[index].items()}
                _lay_over(tables[index], legs[number])
        if problems:
            raise InputError(problems)
        merged["leg"] = tables
    return merged


def _leg_values(number: int, tables: Mapping[str, Any]) -> list[tuple[str, Any]]:
    """The field (:func:`leg_field`) and value of each value given for a leg."""
    out: list[tuple[str, Any]] = []
    for table, values in tables.items():
        if isinstance(values, Mapping) and values:
            out += [(leg_field(number, f"{table}.{name}"), value) for name, value in values.items()]
        else:
            out.append((leg_field(number, table), None if isinstance(values, Mapping) else values))
    return out


def _lay_over(merged: dict[str, Any], tables: Mapping[str, Any]) -> None:
    """Lay the values of each table over ``merged``'s table of that name (in place); a value
    that is not a table (a leg's ``label``) replaces the field of that name."""
    for table, values in tables.items():
        if values is not None and not isinstance(values, Mapping):
            merged[table] = values  # a value of the wrong type is left for validation to report
            continue
        if values is not None:  # an empty table given (a leg's burn = {}) is a table all the same
            existing = merged.setdefault(table, {})
            if isinstance(existing, dict):  # a table of the wrong type is left for validation to report
                if table == "burn" and "trip" in values:  # a trip given here replaces the file's trip time
                    existing.pop("trip_time", None)
                    existing.pop("rate", None)
                if table == "burn" and "trip_time" in values:  # and a trip time replaces its trip
                    existing.pop("trip", None)
                existing.update(values)


_LEG_TABLES = {"--leg-load": "load", "--leg-fuel": "add_fuel", "--leg-burn": "burn"}
_LEG_BURN_KEYS = ("taxi", "trip", "trip_time", "rate", "order", "reserve")


def leg_assignments(option: str, values: Sequence[str]) -> dict[int, dict[str, dict[str, Any]]]:
    """Read ``N:NAME=VALUE`` command-line values of one leg option.

    ``--leg-load 2:right=0`` (station weight from leg 2 on), ``--leg-fuel 2:main=full``
    (fuel added at the stop before leg 2), ``--leg-burn 2:trip=12`` (leg 2's taxi, trip,
    trip_time, rate, order or reserve; an order is ``together`` or ``aux,mains``).

    Returns
    -------
    dict
        ``{leg number: {table: {name: value}}}``, ready for :func:`apply_overrides`.

    Raises
    ------
    InputError
        A value not of the form ``N:NAME=VALUE``, a leg number below 2, a burn name that
        is not one of the leg's burn fields, or a name given twice for one leg.
    """
    table = _LEG_TABLES[option]
    out: dict[int, dict[str, dict[str, Any]]] = {}
    problems = []
    for value in values:
        number, colon, rest = value.partition(":")
        name, equals, amount = rest.partition("=")
        name, amount = name.strip(), amount.strip()
        if not (colon and equals and number.strip().isdigit() and name and amount):
            problems.append(Problem(option, "expected LEG:NAME=VALUE", value=value, expected="e.g. 2:right=0"))
            continue
        leg = int(number)
        if leg < 2:
            problems.append(
                Problem(
                    option,
                    "legs given here are numbered from 2 (leg 1 is the loading itself: "
                    "use --load, --fuel and the burn options)",
                    value=value,
                )
            )
            continue
        if table == "burn" and name not in _LEG_BURN_KEYS:
            problems.append(
                Problem(option, f"unknown burn field {name!r}", value=value, expected=", ".join(_LEG_BURN_KEYS))
            )
            continue
        entries = out.setdefault(leg, {}).setdefault(table, {})
        if name in entries:
            problems.append(Problem(f"{option} {leg}:{name}", "given twice; give it once", value=value))
            continue
        if table == "burn" and name == "order":
            entries[name] = burn_order(amount, f"{option} {leg}:{name}")
        else:
            entries[name] = amount
    if problems:
        raise InputError(problems)
    return out


@dataclass(frozen=True)
class BurnPlan:
    """Tank quantities as fuel is burned from engine start.

    Parameters
    ----------
    start : quantity in each tank at engine start [fuel volume unit]
    order : None to burn every tank together (in proportion to what it held at engine
        start), or tank ids emptied one after another
    """

    start: Mapping[str, float]
    order: tuple[str, ...] | None = None

    @property
    def burnable(self) -> float:
        """Fuel the burn order can use [fuel volume unit]."""
        tanks = self.start if self.order is None else self.order
        return sum(self.start[t] for t in tanks)

    def quantities(self, burned: float) -> dict[str, float]:
        """Quantity in each tank after ``burned`` has been used [fuel volume unit].

        The rule is the engine's (:func:`loadcheck.engine.tank_quantities`), for one loading.

        Examples
        --------
        >>> BurnPlan({"aux": 10.0, "mains": 20.0}, ("aux", "mains")).quantities(15.0)
        {'aux': 0.0, 'mains': 15.0}
        >>> BurnPlan({"left": 10.0, "right": 30.0}).quantities(20.0)
        {'left': 5.0, 'right': 15.0}
        """
        import numpy as np

        from .engine import tank_quantities

        tanks = list(self.start)
        order = None if self.order is None else [tanks.index(t) for t in self.order]
        left = tank_quantities(np.array([[self.start[t] for t in tanks]], dtype=float), np.array([[burned]]), order)
        return {tank: float(left[0, 0, i]) for i, tank in enumerate(tanks)}

    def volume_for_mass(self, mass: float, density: Mapping[str, float], after: float = 0.0) -> float:
        """The volume that burns exactly ``mass``, starting once ``after`` has been burned.

        Together, every tank gives fuel in proportion to its start quantity, so a unit
        volume burned weighs the start fuel's mass over its volume; in a sequence, each
        tank's fuel weighs its own density, tank after tank. Past the fuel the burn order
        can use, the last tank's density goes on (such a burn is refused by
        :func:`require_usable`).

        Parameters
        ----------
        mass : fuel mass to burn [mass unit]
        density : density per tank [mass unit per fuel volume unit]
        after : fuel already burned [fuel volume unit]

        Returns
        -------
        float
            Fuel volume [fuel volume unit].

        Examples
        --------
        >>> plan = BurnPlan({"aux": 10.0, "mains": 20.0}, ("aux", "mains"))
        >>> plan.volume_for_mass(80.0, {"aux": 5.0, "mains": 6.0})  # 10 at 5 (50), then 5 at 6 (30)
        15.0
        """
        if mass <= 0:
            return 0.0
        if self.order is None:
            volume = sum(self.start.values())
            fuel_mass = sum(q * density[t] for t, q in self.start.items())
            per_volume = fuel_mass / volume if volume > 0 else sum(density.values()) / len(density)
            return mass / per_volume
        remaining, volume, begin = mass, 0.0, 0.0
        for tank in self.order:
            end = begin + self.start[tank]
            available = max(0.0, end - max(after, begin))
            begin = end
            if available <= 0:
                continue
            if available * density[tank] >= remaining:
                return volume + remaining / density[tank]
            remaining -= available * density[tank]
            volume += available
        return volume + remaining / density[self.order[-1]]


@dataclass(frozen=True)
class ResolvedLoading:
    """A loading checked against one aircraft, every amount in the aircraft's units.

    Attributes
    ----------
    category : envelope category to check
    stations : mass per station id [mass unit]
    fuel : quantity per tank at engine start, every tank present [fuel volume unit]
    density : density per tank [mass unit per fuel volume unit]
    taxi, trip : fuel used before takeoff and from takeoff to landing [fuel volume unit]
    reserve : landing fuel below which to warn [fuel volume unit] or None
    plan : the burn order
    notes : things taken for granted, reported as warnings
    names : who is at each station, by station id, where the loading names them
    """

    category: str
    stations: dict[str, float]
    fuel: dict[str, float]
    density: dict[str, float]
    taxi: float
    trip: float
    reserve: float | None
    plan: BurnPlan
    notes: list[str] = field(default_factory=list)
    names: dict[str, str] = field(default_factory=dict)

    def but(
        self,
        *,
        stations: dict[str, float] | None = None,
        taxi: float | None = None,
        trip: float | None = None,
        reserve: float | None = None,
    ) -> ResolvedLoading:
        """The same loading with the amounts given changed (planning tries loadings this way).

        Parameters
        ----------
        stations : mass per station id [mass unit]
        taxi, trip, reserve : fuel [fuel volume unit]; reserve None keeps this loading's
        """
        return replace(
            self,
            stations=self.stations if stations is None else stations,
            taxi=self.taxi if taxi is None else taxi,
            trip=self.trip if trip is None else trip,
            reserve=self.reserve if reserve is None else reserve,
        )


def _per_aircraft(aircraft: Aircraft) -> tuple[list[str], dict[str, float], str | None]:
    """What :func:`resolve_loading` reads of the aircraft alone, found once for it (an aircraft
    model is immutable): its categories, each tank's own density (``Aircraft.density``, by tank
    id, in tank order) and its registration as compared (``registration_key``)."""
    kept = _PER_AIRCRAFT.get(id(aircraft))
    if kept is not None and kept[0] is aircraft:
        return kept[1]
    registration = aircraft.registration
    found = (
        aircraft.categories,
        {t.id: aircraft.density(t) for t in aircraft.tank},
        registration_key(registration) if registration else None,
    )
    if len(_PER_AIRCRAFT) >= 64:
        _PER_AIRCRAFT.clear()
    _PER_AIRCRAFT[id(aircraft)] = (aircraft, found)
    return found


_PER_AIRCRAFT: dict[int, tuple[Aircraft, tuple[list[str], dict[str, float], str | None]]] = {}


def resolve_loading(
    loading: Loading, aircraft: Aircraft, *, category: str | None = None, fuel_to_plan: bool = False
) -> ResolvedLoading:
    """Check a loading against an aircraft and convert it to the aircraft's units.

    Parameters
    ----------
    loading : the loading, as read from a file or built in code
    aircraft : the aircraft it is for
    category : overrides the loading's category; default: the aircraft's first
    fuel_to_plan : the fuel is what a planning answer will choose ("how much fuel can I
        take?"): the fuel given need not cover taxi and trip, and none given is no warning

    Returns
    -------
    ResolvedLoading

    Raises
    ------
    UnknownNameError
        An unknown station, tank, fill level or category (the message lists the known ones).
    InputError
        Fuel above a tank's usable capacity, more fuel burned than the burn order can
        use, or an amount in a unit that does not fit. Every problem is reported at once.
        A loading with legs is refused: it is a trip (:func:`resolve_trip`).
    """
    if loading.leg:
        raise InputError(
            Problem(
                "leg",
                f"this loading is a trip of {len(loading.leg) + 1} legs; this job takes a "
                "single loading and never checks a trip's first leg alone (a trip is checked leg by "
                "leg: `check`, `plan fuel`, `plan stop`; loadcheck.trip)",
            )
        )
    units = aircraft.units
    problems: list[Problem] = []
    unknown: list[Problem] = []

    categories, own_density, own_key = _per_aircraft(aircraft)
    # a category given, even an empty one, is used as given (and refused where it is not one of the
    # aircraft's): only a category not given at all takes the loading's, then the aircraft's first
    chosen = category if category is not None else loading.category if loading.category is not None else categories[0]
    if chosen not in categories:
        try:
            aircraft.category(chosen)  # the refusal, with the categories there are
        except UnknownNameError as error:
            unknown += error.problems

    stations: dict[str, float] = {}
    for name, amount in loading.load.items():
        if name not in aircraft.station_by_id:
            unknown.append(unknown_station(f"load.{name}", name, aircraft))
            continue
        if type(amount) is float and math.isfinite(amount):  # a plain number: already in the mass unit
            stations[name] = amount
            continue
        quantity = parse_quantity(amount)
        stations[name] = quantity.value if quantity.unit is None else convert(quantity.value, quantity.unit, units.mass)

    names: dict[str, str] = {}
    for name, person in loading.names.items():
        if name not in aircraft.station_by_id:
            unknown.append(unknown_station(f"names.{name}", name, aircraft))
        elif not stations.get(name, 0.0) > 0:  # a name without a weight: a person left out of the sums
            problems.append(
                Problem(
                    f"names.{name}",
                    f"{person!r} is named at {name!r}, which carries no weight",
                    expected=f"a weight at load.{name}, or no name there",
                )
            )
        else:
            names[name] = person

    if loading.fuel_density is not None:
        problem = density_problem(loading.fuel_density, units.mass, units.fuel_volume)
        if problem:
            problems.append(Problem("fuel_density", problem, value=loading.fuel_density))
    notes: list[str] = []
    if loading.registration and aircraft.registration:
        if registration_key(loading.registration) != own_key:
            problems.append(
                Problem(
                    "registration",
                    f"this loading is for {loading.registration!r}, but the aircraft "
                    f"file is {aircraft.registration!r}: check the loading against its own aircraft",
                )
            )
    elif loading.registration:
        notes.append(f"the loading is for {loading.registration!r}; the aircraft file gives no registration to compare")
    density = dict(own_density) if not loading.fuel_density else dict.fromkeys(own_density, loading.fuel_density)
    fuel: dict[str, float] = dict.fromkeys(own_density, 0.0)
    for name, amount in loading.fuel.items():
        tank = aircraft.tank_by_id.get(name)
        if tank is None:
            unknown.append(
                Problem(
                    f"fuel.{name}",
                    f"unknown tank {name!r}{spelling_hint(name, aircraft.tank_by_id)}",
                    expected=_known(aircraft.tank_by_id),
                )
            )
            continue
        level = _fill_level(tank, amount, f"fuel.{name}")
        if isinstance(level, Problem):
            unknown.append(level)
            continue
        if level is not None:
            fuel[name] = level
            continue
        quantity = parse_quantity(amount)
        volume = _to_volume(quantity, density[name], units.mass, units.fuel_volume)
        if volume > tank.usable * (1 + 1e-9):
            problems.append(
                Problem(
                    f"fuel.{name}",
                    _over_capacity(amount, quantity, volume, units.fuel_volume),
                    expected=f"at most {tank.usable:g} {units.fuel_volume}",
                )
            )
        fuel[name] = volume
    missing = [t.id for t in aircraft.tank if t.id not in loading.fuel]
    if missing and loading.fuel:
        notes.append(f"no fuel given for {', '.join(missing)}; taken as empty")
    elif aircraft.tank and not loading.fuel and not fuel_to_plan:
        notes.append("no fuel given; every tank taken as empty")

    order: tuple[str, ...] | None = None
    if isinstance(loading.burn.order, list):
        bad = [t for t in loading.burn.order if t not in aircraft.tank_by_id]
        if bad:
            unknown.append(
                Problem(
                    "burn.order", f"unknown tank(s) {', '.join(map(repr, bad))}", expected=_known(aircraft.tank_by_id)
                )
            )
        else:
            order = tuple(loading.burn.order)
            idle = [t for t in aircraft.tank_by_id if t not in order and fuel[t] > 0]
            if idle:
                notes.append(f"tank(s) {', '.join(idle)} not in the burn order: their fuel is not used in flight")
    if unknown:
        raise UnknownNameError(unknown + problems)
    if problems:
        raise InputError(problems)

    plan = BurnPlan(fuel, order)
    burn = loading.burn
    if not aircraft.tank:  # a fuel mass needs a tank's density to be burned
        given = [(name, getattr(burn, name)) for name in ("taxi", "trip", "rate", "reserve")]
        masses = [name for name, amount in given if amount is not None and _is_mass(amount, name == "rate")]
        if masses:
            raise InputError(
                [Problem(f"burn.{name}", "a fuel mass cannot be burned: the aircraft has no tanks") for name in masses]
            )

    def volume_of(amount: float | str | None, after: float = 0.0) -> float:
        """A fuel amount as the volume burned from ``after`` on [fuel volume unit]."""
        if amount is None:
            return 0.0
        quantity = parse_quantity(amount)
        if quantity.unit is not None and unit_kind(quantity.unit) == "mass":
            return plan.volume_for_mass(convert(quantity.value, quantity.unit, units.mass), density, after)
        return in_unit(quantity, units.fuel_volume)

    taxi = volume_of(burn.taxi)
    if burn.trip_time is not None:
        hours = parse_duration_hours(burn.trip_time)
        try:
            rate = parse_rate(burn.rate if burn.rate is not None else 0.0, units.fuel_volume)
        except UnitError as error:  # read in the aircraft's units: a rate its fuel unit makes ambiguous
            raise InputError([Problem("burn.rate", p.message, burn.rate) for p in error.problems]) from None
        if rate.unit is not None and unit_kind(rate.unit) == "mass":
            trip = plan.volume_for_mass(convert(hours * rate.value, rate.unit, units.mass), density, taxi)
        else:
            trip = hours * in_unit(rate, units.fuel_volume)
    else:
        trip = volume_of(burn.trip, taxi)
    if burn.taxi is None:  # never a silent zero: a leg added on the command line with only its trip, say
        notes.append(NO_TAXI_NOTE)
    if burn.trip is None and burn.trip_time is None:
        notes.append(NO_TRIP_NOTE)
    reserve = None if burn.reserve is None else volume_of(burn.reserve, taxi + trip)
    resolved = ResolvedLoading(chosen, stations, fuel, density, taxi, trip, reserve, plan, notes, names)
    require_usable(resolved, aircraft, burn_covered=not fuel_to_plan)
    return resolved


def require_usable(loading: ResolvedLoading, aircraft: Aircraft, *, burn_covered: bool = True) -> None:
    """Fail closed on a resolved loading that no flight can have.

    ``burn_covered=False`` leaves out the test that the fuel covers taxi and trip (a
    loading whose fuel a planning answer is about to choose).

    Raises
    ------
    InputError
        Fuel above a tank's usable capacity or below zero, a negative station weight, or
        more taxi and trip fuel than the burn order can use.
    """
    units = aircraft.units
    problems = []
    for tank in aircraft.tank:
        quantity = loading.fuel.get(tank.id, 0.0)
        if not (0.0 <= quantity <= tank.usable * (1 + 1e-9)):
            problems.append(
                Problem(
                    f"fuel.{tank.id}",
                    "outside 0 and the tank's usable capacity",
                    value=quantity,
                    expected=f"0 to {tank.usable:g} {units.fuel_volume}",
                )
            )
    for station, weight in loading.stations.items():
        if not weight >= 0.0:
            problems.append(Problem(f"load.{station}", "must not be negative", value=weight))
    if not (loading.taxi >= 0 and loading.trip >= 0):
        problems.append(Problem("burn", "taxi and trip fuel must not be negative"))
    elif burn_covered and loading.taxi + loading.trip > loading.plan.burnable * (1 + 1e-9):
        problems.append(
            Problem(
                "burn",
                f"taxi and trip fuel ({loading.taxi + loading.trip:g} {units.fuel_volume}) exceed the fuel "
                "the burn order can use",
                expected=f"at most {loading.plan.burnable:g} {units.fuel_volume}: less taxi or trip fuel, more fuel "
                "in the tanks the burn order uses, or a burn order with more tanks",
            )
        )
    if problems:
        raise InputError(problems)


@dataclass(frozen=True)
class StopFuel:
    """Fuel put in at a stop, in the aircraft's units.

    Attributes
    ----------
    to : tanks filled up to a quantity (``full`` or a level) [fuel volume unit]
    added : tanks given a volume on top of what they hold [fuel volume unit]
    given : each tank's amount as the loading gives it (a number in the fuel volume unit,
        ``"30 lb"``, ``"full"``, a level name); empty where a planning answer chose the fuel
    """

    to: Mapping[str, float] = field(default_factory=dict)
    added: Mapping[str, float] = field(default_factory=dict)
    given: Mapping[str, float | str] = field(default_factory=dict)

    def apply(self, on_board: Mapping[str, Any]) -> dict[str, Any]:
        """Fuel in each tank after the stop, from what it held at landing.

        Works on numbers or on numpy arrays (one value per loading) alike.

        Examples
        --------
        >>> StopFuel(to={"main": 29.5}, added={"aux": 5.0}).apply({"main": 12.0, "aux": 1.0})
        {'main': 29.5, 'aux': 6.0}
        """
        out = dict(on_board)
        for tank, volume in self.added.items():
            out[tank] = on_board[tank] + volume
        for tank, quantity in self.to.items():
            out[tank] = on_board[tank] * 0.0 + quantity
        return out

    def fills_up(self, on_board: Mapping[str, Any]) -> Any:
        """True where no tank filled up to a level already holds more than that level
        (fuel is never taken out to reach a level); a bool or an array, as ``on_board``."""
        result: Any = True
        for tank, quantity in self.to.items():
            result = result & (on_board[tank] <= quantity * (1 + 1e-9))
        return result


@dataclass(frozen=True)
class ResolvedTrip:
    """A trip resolved against one aircraft: every leg as a single loading.

    Attributes
    ----------
    legs : each leg, resolved as a single loading is (its fuel at engine start is what the
        previous leg landed with, tank by tank, plus the fuel put in at the stop)
    stops : ``stops[i]`` is the fuel put in at the stop before ``legs[i + 1]``
    labels : each leg's label, or None
    """

    legs: tuple[ResolvedLoading, ...]
    stops: tuple[StopFuel, ...] = ()
    labels: tuple[str | None, ...] = ()


def landing_fuel(leg: ResolvedLoading) -> dict[str, float]:
    """Fuel in each tank at a leg's landing, after its taxi and trip in its burn order [fuel volume unit]."""
    return leg.plan.quantities(leg.taxi + leg.trip)


def resolve_trip(
    loading: Loading, aircraft: Aircraft, *, category: str | None = None, fuel_to_plan: bool = False
) -> ResolvedTrip:
    """Resolve a loading of one or more legs against an aircraft.

    The first leg is the loading's own load, fuel and burn (:func:`resolve_loading`). Each
    later leg starts from the previous one: every station keeps its weight unless the leg
    gives it a new one (and keeps its occupant's name unless the leg changes its weight or
    names someone else there), and each tank holds what it held at the previous landing (taxi and
    trip burned in the previous leg's burn order, :meth:`BurnPlan.quantities`) plus the fuel
    put in at the stop. The burn order and the reserve are the previous leg's unless the leg gives them. The
    leg is then resolved exactly as a single loading (names, capacities, fuel for the burn).

    With ``fuel_to_plan`` the fuel at the first engine start is what a planning answer will
    choose (:func:`loadcheck.trip.trip_most_fuel`): as for a single loading, the fuel given need
    not cover the legs' taxi and trip fuel (each answer is checked leg by leg at its own fuel).

    Returns
    -------
    ResolvedTrip
        One leg for a loading without legs.

    Raises
    ------
    UnknownNameError, InputError
        As :func:`resolve_loading`, each problem of a later leg with the leg's number and the
        path within the leg as its field (:func:`leg_field`: ``leg 2, burn.taxi``);
        also fuel put in above a tank's usable capacity, or a level below what the tank
        already holds.
    """
    first = resolve_loading(
        loading.model_copy(update={"leg": []}), aircraft, category=category, fuel_to_plan=fuel_to_plan
    )
    legs, stops = [first], []
    units = aircraft.units
    for index, leg in enumerate(loading.leg):
        number, previous = index + 2, legs[-1]
        on_board = landing_fuel(previous)
        stop, unknown = _stop_fuel(leg, aircraft, previous.density, number)
        fuel = stop.apply(on_board)
        problems: list[Problem] = []
        for tank in aircraft.tank:
            if tank.id in stop.to and on_board[tank.id] > stop.to[tank.id] * (1 + 1e-9):
                problems.append(
                    Problem(
                        leg_field(number, f"add_fuel.{tank.id}"),
                        f"the tank holds {on_board[tank.id]:g} "
                        f"{units.fuel_volume} at the landing of leg {number - 1}, more than the level",
                        value=leg.add_fuel[tank.id],
                        expected=f"a level of at least {on_board[tank.id]:g}",
                    )
                )
            elif fuel[tank.id] > tank.usable * (1 + 1e-9):
                problems.append(
                    Problem(
                        leg_field(number, f"add_fuel.{tank.id}"),
                        f"{on_board[tank.id]:g} {units.fuel_volume} on "
                        f"board at the landing of leg {number - 1} plus the fuel put in makes "
                        f"{fuel[tank.id]:g}, above the tank's usable capacity",
                        value=leg.add_fuel[tank.id],
                        expected=f"at most {tank.usable - on_board[tank.id]:g} {units.fuel_volume} added, or 'full'",
                    )
                )
        if unknown:
            raise UnknownNameError(unknown + problems)
        if problems:
            raise InputError(problems)
        order: Literal["together"] | list[str] = (
            leg.burn.order
            if "order" in leg.burn.model_fields_set
            else "together"
            if previous.plan.order is None
            else list(previous.plan.order)
        )
        kept = {station: person for station, person in previous.names.items() if station not in leg.load}
        single = Loading(
            category=first.category,
            fuel_density=loading.fuel_density,
            load={**previous.stations, **leg.load},
            names={**kept, **leg.names},
            fuel=fuel,
            burn=leg.burn.model_copy(update={"order": order, **_reserve_kept(leg.burn, previous)}),
        )
        try:
            legs.append(resolve_loading(single, aircraft, fuel_to_plan=fuel_to_plan))
        except LoadcheckError as error:
            raise type(error)(
                [Problem(leg_field(number, p.field), p.message, p.value, p.expected) for p in error.problems]
            ) from None
        stops.append(stop)
    return ResolvedTrip(tuple(legs), tuple(stops), (None, *(leg.label for leg in loading.leg)))


def _reserve_kept(burn: Burn, previous: ResolvedLoading) -> dict[str, float]:
    """A leg that gives no reserve keeps the previous leg's (the pilot's reserve holds for every
    landing of the trip, as the burn order does; ``reserve = 0`` there drops it): the field to set."""
    if "reserve" in burn.model_fields_set or previous.reserve is None:
        return {}
    return {"reserve": previous.reserve}


def _stop_fuel(
    leg: Leg, aircraft: Aircraft, density: Mapping[str, float], number: int
) -> tuple[StopFuel, list[Problem]]:
    """The fuel a leg puts in at its stop, in the aircraft's units, and the unknown tank and
    level names found."""
    to: dict[str, float] = {}
    added: dict[str, float] = {}
    given: dict[str, float | str] = {}
    unknown: list[Problem] = []
    for name, amount in leg.add_fuel.items():
        tank = aircraft.tank_by_id.get(name)
        if tank is not None:
            given[name] = _as_given(amount)
        if tank is None:
            unknown.append(
                Problem(
                    leg_field(number, f"add_fuel.{name}"),
                    f"unknown tank {name!r}{spelling_hint(name, aircraft.tank_by_id)}",
                    expected=_known(aircraft.tank_by_id),
                )
            )
        elif isinstance(level := _fill_level(tank, amount, leg_field(number, f"add_fuel.{name}")), Problem):
            unknown.append(level)
        elif level is not None:
            to[name] = level
        else:
            added[name] = _to_volume(
                parse_quantity(amount), density[name], aircraft.units.mass, aircraft.units.fuel_volume
            )
    return StopFuel(to, added, given), unknown


def _fill_level(tank: Tank, amount: object, field: str) -> float | Problem | None:
    """The quantity [fuel volume unit] that ``full`` or one of ``tank``'s level names stands for,
    matched by :func:`~loadcheck.units.level_key` (letter case and surrounding spaces aside, for the
    built-in level and the tank's own alike); None for an amount; the problem, at ``field``, of a
    level name the tank does not have."""
    if not names_a_level(amount):
        return None
    levels = {"full": tank.usable, **tank.levels}
    key = level_key(str(amount))
    matches = [level for level in levels if level_key(level) == key]
    if len(matches) == 1:
        return levels[matches[0]]
    if matches:  # names differing only in the spaces around them (the file refuses a difference of case)
        return Problem(
            field,
            f"fill level {amount!r} matches {' and '.join(map(repr, matches))} of tank {tank.id!r}, whose names "
            "differ only in the spaces around them; give the tank's levels other names in the aircraft file",
        )
    hint = spelling_hint(key, {level_key(level): level for level in levels})
    return Problem(field, f"unknown fill level {amount!r} for tank {tank.id!r}{hint}", expected=_known(levels))


def _as_given(amount: float | str) -> float | str:
    """A fuel amount as the user gave it, said one way whichever front end it came through: a
    plain number (``5`` or ``"5"``) as a number [fuel volume unit], any other text as written."""
    if isinstance(amount, str) and not names_a_level(amount):
        quantity = parse_quantity(amount)
        if quantity.unit is None:
            return quantity.value
    return amount.strip() if isinstance(amount, str) else float(amount)


def _known(names: Mapping[str, Any]) -> str:
    return "one of " + ", ".join(names) if names else "none is defined"


def unknown_station(field: str, name: str, aircraft: Aircraft) -> Problem:
    """The problem of a station id the aircraft does not have, with a spelling hint and the ids it has."""
    return Problem(
        field,
        f"unknown station {name!r}{spelling_hint(name, aircraft.station_by_id)}",
        expected=_known(aircraft.station_by_id),
    )


def _over_capacity(amount: float | str, quantity: Quantity, volume: float, volume_unit: str) -> str:
    """Why a tank's fuel at engine start is refused, with the amount said once, as given: a
    number in the fuel volume unit (``60 usgal is above ...``), a quantity in that unit as
    typed (``60 usgal``), another unit as typed with its volume (``300 lb is 50 usgal, above ...``)."""
    if quantity.unit is None:
        return f"{quantity.value:.15g} {volume_unit} is above the tank's usable capacity"
    typed = str(amount).strip()
    if quantity.unit == volume_unit:
        return f"{typed} is above the tank's usable capacity"
    return f"{typed} is {volume:.6g} {volume_unit}, above the tank's usable capacity"


def _to_volume(quantity: Quantity, density: float, mass_unit: str, volume_unit: str) -> float:
    """A fuel amount as a volume [volume unit]; a mass is divided by the density."""
    if quantity.unit is None:
        return quantity.value
    if unit_kind(quantity.unit) == "volume":
        return convert(quantity.value, quantity.unit, volume_unit)
    return convert(quantity.value, quantity.unit, mass_unit) / density


def _is_mass(amount: float | str, rate: bool = False) -> bool:
    quantity = parse_rate(amount) if rate else parse_quantity(amount)
    return quantity.unit is not None and unit_kind(quantity.unit) == "mass"
