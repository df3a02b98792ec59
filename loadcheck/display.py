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

__all__ = ["DECIMALS", "decimals", "fmt", "round_safe"]

Direction = Literal["nearest", "up", "down"]

DECIMALS: dict[str, int] = {
    "lb": 1, "kg": 1,
    "in": 2, "mm": 0, "cm": 1, "m": 3,
    "usgal": 1, "impgal": 1, "l": 1,
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


def fmt(value: float, unit: str, direction: Direction = "nearest", *, with_unit: bool = True) -> str:
    """Format a value for display with its unit's precision and thousands separators.

    Examples
    --------
    >>> fmt(2550.04, "lb")
    '2,550.0 lb'
    >>> fmt(0.321, "in", "up")
    '0.33 in'
    """
    places = decimals(unit)
    text = f"{round_safe(value, places, direction):,.{places}f}"
    if text.startswith("-") and float(text.replace(",", "")) == 0.0:
        text = text[1:]
    return f"{text} {unit}" if with_unit else text
