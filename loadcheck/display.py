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

__all__ = ["DECIMALS", "EXTRA_DIGITS", "NOISE", "decimals", "fmt", "round_safe", "unit_label"]

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


EXTRA_DIGITS = 3
"""The most digits shown beyond a unit's places where a figure that is not zero would show as zero
(a change of +0.021 kg is ``+0.02 kg``, never ``0.0 kg``); the same three as an excess over a limit
(:func:`loadcheck.words.beyond`)."""

NOISE = 1e-6
"""Below this fraction of a figure's display step (0.1 lb, 0.01 in, 1 lb·in), a change is taken as
floating-point noise and shows as zero, with no sign: a sum that comes back to where it started
(1,710.0 + 4.2 - 4.2 lb is 1,710.0000000000002 lb) is no change. Far below any change a scale or an
equipment list gives (a millionth of 0.1 lb is 45 micrograms) and far above the noise of figures
of the size weight and balance handles (a moment of 10⁸ kg·mm carries noise of about 10⁻⁸)."""


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
    nonzero: bool = False,
) -> str:
    """Format a value for display with its unit's precision (or ``places``) and thousands separators.

    ``signed`` writes a change: ``+`` before a figure above zero, ``-`` below. A change is never
    shown as zero unless it is (``nonzero``): where it would round to zero at the unit's places, up
    to :data:`EXTRA_DIGITS` more are shown, and a change smaller still is shown at the last of them
    rounded away from zero (``+0.0001 lb``: there is a change, of at most that), as an excess over a
    limit is. Only zero, or floating-point noise below :data:`NOISE` of the display step, shows as
    zero, with no sign. ``nonzero`` alone does the same for a figure without a sign (the weight of an
    item installed: 0.021 kg is ``0.02 kg``).

    Examples
    --------
    >>> fmt(2550.04, "lb")
    '2,550.0 lb'
    >>> fmt(0.321, "in", "up")
    '0.33 in'
    >>> fmt(104337.0, "lb*in")
    '104,337 lb·in'
    >>> fmt(4.2, "lb", signed=True), fmt(-18.0, "lb", signed=True), fmt(0.0, "lb", signed=True)
    ('+4.2 lb', '-18.0 lb', '0.0 lb')
    >>> fmt(0.021, "kg", signed=True), fmt(-0.004, "in", signed=True), fmt(0.00001, "lb", signed=True)
    ('+0.02 kg', '-0.004 in', '+0.0001 lb')
    >>> fmt(1710.0 + 4.2 - 4.2 - 1710.0, "lb", signed=True), fmt(0.021, "kg", nonzero=True)
    ('0.0 lb', '0.02 kg')
    """
    places = decimals(unit) if places is None else places
    if (signed or nonzero) and abs(value) >= NOISE * 10.0**-places:
        most = places + EXTRA_DIGITS
        while places < most and round_safe(value, places, direction) == 0.0:
            places += 1
        if round_safe(value, places, direction) == 0.0:  # smaller than the last digit shown: away from zero
            direction = "up" if value > 0 else "down"
    text = f"{round_safe(value, places, direction):,.{places}f}"
    if text.startswith("-") and float(text.replace(",", "")) == 0.0:
        text = text[1:]
    if signed and not text.startswith("-") and float(text.replace(",", "")) != 0.0:
        text = "+" + text
    return f"{text} {unit_label(unit)}" if with_unit else text
