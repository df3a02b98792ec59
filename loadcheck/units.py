"""Units, exact conversion constants and quantities written with a unit.

All conversions use exact defined constants:

* 1 lb = 0.45359237 kg (international avoirdupois pound, 1959 agreement;
  NIST SP 811, 2008 edition, appendix B.8)
* 1 in = 25.4 mm (international inch, same agreement; NIST SP 811 B.8)
* 1 US gal = 231 in^3 = 3.785411784 L (NIST SP 811 B.8; NIST Handbook 44 appendix C)
* 1 imp gal = 4.54609 L (UK Weights and Measures Act 1985; NIST SP 811 B.8)

A quantity typed by a user may carry its unit: ``"20 kg"``, ``"48 usgal"``, ``"180lb"``.
"""

from __future__ import annotations

import math
import re
import sys
from collections.abc import Callable
from dataclasses import dataclass
from functools import lru_cache
from typing import Literal

from .errors import UnitError

__all__ = [
    "float_as_written",
    "ARM_UNITS",
    "KG_PER_LB",
    "L_PER_IMPGAL",
    "L_PER_USGAL",
    "MASS_UNITS",
    "MAX_MAGNITUDE",
    "MM_PER_IN",
    "VOLUME_UNITS",
    "ArmUnit",
    "MassUnit",
    "Quantity",
    "VolumeUnit",
    "canonical_unit",
    "convert",
    "in_unit",
    "level_key",
    "names_a_level",
    "parse_duration_hours",
    "parse_quantity",
    "parse_rate",
    "read_amount",
    "read_rate",
    "unit_kind",
]

MassUnit = Literal["lb", "kg"]
ArmUnit = Literal["in", "mm", "cm", "m"]
VolumeUnit = Literal["usgal", "impgal", "l"]

KG_PER_LB = 0.45359237
"""Exact: kilograms in one international pound [kg/lb]."""
MM_PER_IN = 25.4
"""Exact: millimetres in one international inch [mm/in]."""
L_PER_USGAL = 3.785411784
"""Exact: litres in one US liquid gallon [L/US gal]."""
L_PER_IMPGAL = 4.54609
"""Exact: litres in one imperial gallon [L/imp gal]."""

# Size of each unit in the base unit of its kind (kg, mm, L).
MASS_UNITS: dict[str, float] = {"lb": KG_PER_LB, "kg": 1.0}
ARM_UNITS: dict[str, float] = {"in": MM_PER_IN, "mm": 1.0, "cm": 10.0, "m": 1000.0}
VOLUME_UNITS: dict[str, float] = {"usgal": L_PER_USGAL, "impgal": L_PER_IMPGAL, "l": 1.0}

_KINDS: dict[str, dict[str, float]] = {
    "mass": MASS_UNITS,
    "length": ARM_UNITS,
    "volume": VOLUME_UNITS,
}

# Spellings accepted on input, folded to the canonical unit names above. A bare "gal" is
# refused on purpose: US and imperial gallons differ by 20 %.
_ALIASES: dict[str, str] = {
    "lb": "lb",
    "lbs": "lb",
    "pound": "lb",
    "pounds": "lb",
    "kg": "kg",
    "kgs": "kg",
    "kilogram": "kg",
    "kilograms": "kg",
    "in": "in",
    "inch": "in",
    "inches": "in",
    "mm": "mm",
    "cm": "cm",
    "m": "m",
    "usgal": "usgal",
    "us gal": "usgal",
    "impgal": "impgal",
    "imp gal": "impgal",
    "l": "l",
    "litre": "l",
    "litres": "l",
    "liter": "l",
    "liters": "l",
}

_QUANTITY_RE = re.compile(r"^\s*([-+]?(?:\d+(?:\.\d*)?|\.\d+)(?:[eE][-+]?\d+)?)\s*([A-Za-z][A-Za-z ]*?)?\s*$")


@dataclass(frozen=True)
class Quantity:
    """A number with an optional unit, as a user typed it.

    Attributes
    ----------
    value : the number [unit]
    unit : canonical unit name, or None where none was written
    """

    value: float
    unit: str | None = None

    @property
    def kind(self) -> str | None:
        """``"mass"``, ``"length"``, ``"volume"`` or None for a bare number."""
        return unit_kind(self.unit) if self.unit else None


def canonical_unit(text: str) -> str:
    """Return the canonical name of a unit spelling (``"lbs"`` -> ``"lb"``).

    Raises
    ------
    UnitError
        If the spelling is not a unit loadcheck knows; the message lists the known units.

    Examples
    --------
    >>> canonical_unit("Litres")
    'l'
    """
    key = " ".join(text.strip().lower().split())
    if key in _ALIASES:
        return _ALIASES[key]
    known = ", ".join(sorted({*MASS_UNITS, *ARM_UNITS, *VOLUME_UNITS}))
    raise UnitError(f"unknown unit {text!r} (known units: {known})")


def unit_kind(unit: str) -> str:
    """Return ``"mass"``, ``"length"`` or ``"volume"`` for a canonical unit name."""
    for kind, table in _KINDS.items():
        if unit in table:
            return kind
    raise UnitError(f"unknown unit {unit!r}")


MAX_MAGNITUDE = 1e7
"""The largest magnitude of any amount read (a mass, a length, a fuel volume, a rate per hour, a
duration in hours), in the unit it is written in: ten million (10 km in mm, over 4,500 t in lb) is
beyond any aircraft, and a figure beyond it (a mistyped exponent) would overflow the moments or print
hundreds of digits rather than be checked. Common practice: no aircraft figure comes near it."""


def _bounded(value: float, typed: object) -> float:
    """``value`` if it is finite and within :data:`MAX_MAGNITUDE`; else the refusal, with the value as typed."""
    if not math.isfinite(value):
        raise UnitError(f"{typed!r} is not a finite number")
    if abs(value) > MAX_MAGNITUDE:
        raise UnitError(f"{typed!r} is beyond any aircraft: at most {MAX_MAGNITUDE:,.0f} in the unit given")
    return value


def parse_quantity(text: str | float | int) -> Quantity:
    """Read a number, optionally followed by a unit.

    Parameters
    ----------
    text : ``"20 kg"``, ``"48usgal"``, ``"180"`` or a plain number

    Returns
    -------
    Quantity
        Value and canonical unit (None for a bare number).

    Raises
    ------
    UnitError
        If the text is not a finite number with an optional known unit, or its magnitude is
        above :data:`MAX_MAGNITUDE`.

    Examples
    --------
    >>> parse_quantity("20 kg")
    Quantity(value=20.0, unit='kg')
    >>> parse_quantity(12)
    Quantity(value=12.0, unit=None)
    """
    kind = type(text)
    if kind is float or kind is int or (kind is not bool and isinstance(text, (int, float))):
        try:
            value = float(text)
        except OverflowError:  # an integer too large for a float (a JSON or Python caller's): beyond the bound
            value = 2 * MAX_MAGNITUDE if isinstance(text, int) and text > 0 else -2 * MAX_MAGNITUDE
        return Quantity(_bounded(value, text), None)
    if kind is str:
        return _parse_text(text)
    if kind is bool:
        raise UnitError(f"expected a number, got {text!r}")
    return _read_quantity(str(text), text)


def names_a_level(text: object) -> bool:
    """True for a text read as ``full`` or a tank's fill-level name, not as an amount: its first
    character is no digit (of any script Unicode counts as decimal), sign or point. One rule for the
    loading that reads it and the aircraft file that names its levels.

    Examples
    --------
    >>> names_a_level("tabs"), names_a_level("12"), names_a_level("-low"), names_a_level("１２")
    (True, False, False, False)
    """
    if not isinstance(text, str) or not text.strip():
        return False
    first = text.strip()[0]
    return not (first.isdecimal() or first in ".+-")


def level_key(name: str) -> str:
    """The form in which a fill-level name is matched: the built-in ``full`` and a tank's own level
    names alike, without regard to letter case or to spaces around it (``FULL``, ``Tabs``, ``tabs``
    are one level). One rule for every loading (file, command line, CSV, desk): an aircraft file
    refuses two levels of a tank whose names differ only in letter case, and a level named ``full``
    in any case (loadcheck.aircraft), so a name matches one level at most.

    Examples
    --------
    >>> level_key(" TABS "), level_key("Full")
    ('tabs', 'full')
    """
    return name.strip().lower()


def float_as_written(number: str, typed: object = None) -> float:
    """The float of a decimal text, refused where a float cannot hold it as written: below the
    smallest normal double (IEEE 754 binary64, about 2.2e-308, from memory) it would be read as 0
    or with digits lost, another figure than the one typed; above the largest (about 1.8e308), as
    infinity. Also TOML's float reader
    (:func:`loadcheck.files.parse_toml`), so a bare ``1e-400`` in a file is refused too.

    Raises
    ------
    UnitError
        Naming ``typed`` (default ``number``) as given.
    """
    value = float(number)
    if math.isinf(value) and any(ch.isdecimal() for ch in number):  # 1e400: no float holds it (not TOML's inf)
        raise UnitError(f"{number if typed is None else typed!r} is not a finite number")
    if 0 < abs(value) < sys.float_info.min or (
        value == 0 and any(ch.isdecimal() and int(ch) for ch in re.split("[eE]", number)[0])
    ):
        shown = number if typed is None else typed
        raise UnitError(f"{shown!r} is too small to be read as written: write 0, or the figure without the exponent")
    return value


def _read_quantity(text: str, typed: object) -> Quantity:
    """:func:`parse_quantity` of a text; ``typed`` is the value as given, for the messages."""
    match = _QUANTITY_RE.match(text)
    if not match:
        raise UnitError(f"cannot read {typed!r} as a number with an optional unit (e.g. '20 kg')")
    value = _bounded(float_as_written(match.group(1), typed), typed)
    unit = canonical_unit(match.group(2)) if match.group(2) else None
    return Quantity(value, unit)


@lru_cache(maxsize=4096)
def _parse_text(text: str) -> Quantity:
    """:func:`_read_quantity` of a text, kept for the texts met again (a day of loadings repeats
    its amounts): a Quantity is immutable, and a text refused is refused again each time."""
    return _read_quantity(text, text)


def convert(value: float, from_unit: str, to_unit: str) -> float:
    """Convert ``value`` between two units of the same kind with exact constants.

    Parameters
    ----------
    value : amount [from_unit]
    from_unit, to_unit : canonical unit names of one kind (mass, length or volume)

    Returns
    -------
    float
        The amount [to_unit].

    Raises
    ------
    UnitError
        If the units are of different kinds.

    Examples
    --------
    >>> convert(1.0, "usgal", "l")
    3.785411784
    >>> round(convert(100.0, "kg", "lb"), 6)
    220.462262
    """
    if from_unit == to_unit:
        return value
    kind_from, kind_to = unit_kind(from_unit), unit_kind(to_unit)
    if kind_from != kind_to:
        raise UnitError(f"cannot convert {from_unit} ({kind_from}) to {to_unit} ({kind_to})")
    table = _KINDS[kind_from]
    return value * table[from_unit] / table[to_unit]


_DURATION_RE = re.compile(r"^\s*(\d+):([0-5]\d)\s*$")
_DURATION_UNIT_RE = re.compile(r"^\s*(\d+(?:\.\d*)?|\.\d+)\s*(h|hr|hours?|min|minutes?)\s*$", re.I)


def parse_duration_hours(text: str | float | int) -> float:
    """Read a duration and return it in hours.

    Accepts ``"2:15"`` (hours:minutes), ``"2.25 h"``, ``"135 min"`` or a number of hours.

    Raises
    ------
    UnitError
        If the text is not a non-negative duration.

    Examples
    --------
    >>> parse_duration_hours("2:15")
    2.25
    >>> parse_duration_hours("90 min")
    1.5
    """
    if isinstance(text, bool) or not isinstance(text, (str, int, float)):
        raise UnitError(f"expected a duration such as '2:15', '2.25 h' or a number of hours, got {text!r}")
    if isinstance(text, (int, float)):
        try:
            hours = float(text)
        except OverflowError:
            hours = math.inf
    elif match := _DURATION_RE.match(text):
        hours = int(match.group(1)) + int(match.group(2)) / 60.0
    elif match := _DURATION_UNIT_RE.match(text):
        number = float(match.group(1))
        hours = number if match.group(2).lower().startswith("h") else number / 60.0
    elif match := _DURATION_UNIT_RE.match(f"{text} h"):  # a number alone is hours, as a file's number is
        hours = float(match.group(1))
    else:
        raise UnitError(f"cannot read {text!r} as a duration (e.g. '2:15', '2.25 h', '135 min')")
    if not math.isfinite(hours) or hours < 0:
        raise UnitError(f"duration {text!r} must be a finite, non-negative time")
    return _bounded(hours, text)


_PER_HOUR_RE = re.compile(r"^(.*?)\s*(?:/\s*(?:h|hr|hrs|hour)|per\s+hour)\s*$", re.I)
_RATE_WORDS = {"gph": "usgal", "lph": "l", "pph": "lb"}  # common practice: gph is US gallons per hour
_RATE_WORD_RE = re.compile(r"^(.*?)\s*(gph|lph|pph)\s*$", re.I)


def parse_rate(text: str | float | int, volume_unit: str | None = None) -> Quantity:
    """Read a fuel burn rate: the amount used in one hour.

    Accepts a number (fuel volume unit per hour), a quantity per hour (``"36 l/h"``,
    ``"60 lb/h"``, ``"10 usgal per hour"``), the words ``gph`` (US gallons per hour,
    common practice in US usage), ``lph`` and ``pph`` (pounds per hour), or a quantity
    with no time (``"36 l"``, read as per hour).

    Returns
    -------
    Quantity
        The amount per hour and its unit (None for a bare number).

    Raises
    ------
    UnitError
        If the text is not a rate; or, given the aircraft's ``volume_unit`` and that unit is the
        imperial gallon, for ``gph``, which US usage reads as US gallons and a pilot of an
        aircraft fuelled in imperial gallons may mean as imperial ones (20 % apart): such a
        rate is written with its gallon instead (``impgal/h``, ``usgal/h``).

    Examples
    --------
    >>> parse_rate("36 l/h"), parse_rate("9.5 gph"), parse_rate("60 lb/hr")
    (Quantity(value=36.0, unit='l'), Quantity(value=9.5, unit='usgal'), Quantity(value=60.0, unit='lb'))
    """
    original = text
    if isinstance(text, str):
        words = _RATE_WORD_RE.match(text)
        if words and words.group(2).lower() == "gph" and volume_unit == "impgal":
            raise UnitError(
                f"{original!r}: gph is read as US gallons per hour, but this aircraft's fuel is in imperial "
                f"gallons (20 % apart): write '{words.group(1)} impgal/h' or '{words.group(1)} usgal/h'"
            )
        if words:
            text = f"{words.group(1)} {_RATE_WORDS[words.group(2).lower()]}"
        else:
            per_hour = _PER_HOUR_RE.match(text)
            if per_hour:
                text = per_hour.group(1)
    try:
        return parse_quantity(text)
    except UnitError as error:
        reason = "; ".join(p.message for p in error.problems)
        raise UnitError(
            f"cannot read {original!r} as a fuel rate ({reason}); e.g. '9.5' in the aircraft's fuel "
            "volume unit per hour, '36 l/h', '9.5 gph', '60 lb/h'"
        ) from None


def read_rate(text: str | float, unit: str, field: str = "") -> float:
    """Read a burn rate given as a volume per hour into ``unit`` per hour.

    Raises
    ------
    UnitError
        Naming ``field``: not a rate, or a mass per hour (which needs the burn order and
        the tanks' densities: give it in a loading's ``burn.rate`` instead).

    Examples
    --------
    >>> round(read_rate("36 l/h", "usgal"), 4)
    9.5102
    """

    def read() -> float:
        quantity = parse_rate(text, unit)
        if quantity.unit is not None and unit_kind(quantity.unit) == "mass":
            raise UnitError(
                f"a mass per hour cannot be used here: give the rate as a fuel volume per hour (e.g. '9.5 {unit}/h')"
            )
        return in_unit(quantity, unit)

    return _naming(field, text, read)


def read_amount(text: str | float, unit: str, field: str = "") -> float:
    """Read a typed amount into ``unit``: a bare number is already in it.

    Raises
    ------
    UnitError
        Naming ``field`` when the text is not a number or its unit is of another kind.

    Examples
    --------
    >>> round(read_amount("20 kg", "lb"), 3)
    44.092
    """
    return _naming(field, text, lambda: in_unit(parse_quantity(text), unit))


def in_unit(quantity: Quantity, unit: str) -> float:
    """A quantity in ``unit``; a bare number is already in it.

    Raises
    ------
    UnitError
        If the quantity's unit is of another kind than ``unit``.
    """
    return quantity.value if quantity.unit is None else convert(quantity.value, quantity.unit, unit)


def _naming(field: str, text: str | float, read: Callable[[], float]) -> float:
    """``read()``, its errors attributed to ``field`` with the text typed."""
    try:
        return read()
    except UnitError as error:
        raise UnitError([p.__class__(field or p.field, p.message, text) for p in error.problems]) from None
