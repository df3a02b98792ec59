"""Display precision and rounding in the safe direction.

Numbers are computed at full precision; they are rounded only for display, and where a
rounded figure could mislead it is rounded in the safe direction (docs/computation.md,
"Rounding"): an excess over a limit is rounded up, a margin or an allowance (fuel or
payload that may be added) is rounded down, so a display never shows more room than
there is. Neutral figures (weights, arms, moments of a table) round to nearest.
"""

from __future__ import annotations

import math
from typing import Literal

__all__ = ["DECIMALS", "decimals", "fmt", "round_safe", "unit_label"]

Direction = Literal["nearest", "up", "down"]

DECIMALS: dict[str, int] = {
    "lb": 1,
    "kg": 1,
    "in": 2,
    "mm": 0,
    "cm": 1,
    "m": 3,
    "usgal": 1,
    "impgal": 1,
    "l": 1,
    "%MAC": 1,
}
"""Decimal places shown per unit."""


def decimals(unit: str) -> int:
    """Decimal places for a unit; a moment unit (``lb*in``) shows whole numbers."""
    return DECIMALS.get(unit, 0)


def round_safe(value: float, places: int, direction: Direction = "nearest") -> float:
    """Round to ``places`` decimals: to nearest, or always up, or always down.

    Examples
    --------
    >>> round_safe(0.3201, 2, "up")
    0.33
    >>> round_safe(-0.3201, 2, "down")
    -0.33
    """
    scale = 10.0**places
    scaled = value * scale
    # absorb representation noise (0.1 + 0.2) before taking the floor or the ceiling
    snapped = round(scaled)
    if abs(scaled - snapped) < 1e-9 * max(1.0, abs(scaled)):
        scaled = snapped
    if direction == "up":
        return math.ceil(scaled) / scale
    if direction == "down":
        return math.floor(scaled) / scale
    return round(scaled) / scale


def unit_label(unit: str) -> str:
    """A unit as a reader sees it: a product of units with a middle dot (``lb*in`` -> ``lb·in``).

    The data (JSON ``units``) keeps the plain ``lb*in`` form; only what is shown changes.
    The middle dot for a product of units follows the SI Brochure, 9th edition (2019), 5.4.6.

    Examples
    --------
    >>> unit_label("kg*m")
    'kg·m'
    """
    return unit.replace("*", "\u00b7")


def fmt(
    value: float,
    unit: str,
    direction: Direction = "nearest",
    *,
    with_unit: bool = True,
    places: int | None = None,
    signed: bool = False,
) -> str:
    """Format a value for display with its unit's precision (or ``places``) and thousands separators.

    ``signed`` writes a change: ``+`` before a figure above zero as shown, ``-`` below (a figure
    that shows as zero has no sign: nothing changed at that precision).

    Examples
    --------
    >>> fmt(2550.04, "lb")
    '2,550.0 lb'
    >>> fmt(0.321, "in", "up")
    '0.33 in'
    >>> fmt(104337.0, "lb*in")
    '104,337 lb·in'
    >>> fmt(4.2, "lb", signed=True), fmt(-18.0, "lb", signed=True), fmt(0.04, "lb", signed=True)
    ('+4.2 lb', '-18.0 lb', '0.0 lb')
    """
    places = decimals(unit) if places is None else places
    text = f"{round_safe(value, places, direction):,.{places}f}"
    if text.startswith("-") and float(text.replace(",", "")) == 0.0:
        text = text[1:]
    if signed and not text.startswith("-") and float(text.replace(",", "")) != 0.0:
        text = "+" + text
    return f"{text} {unit_label(unit)}" if with_unit else text
