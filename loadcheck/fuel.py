"""Fuel grades and their default densities.

The default densities are facts of the trade (common practice for weight-and-balance
work): aviation gasoline 6.0 lb/US gal and kerosene jet fuel 6.7 lb/US gal. Both sit
inside the density ranges of their specifications (ASTM D1655 Jet A/A-1: 775-840 kg/m^3
at 15 degC, from memory; avgas to ASTM D910 is about 0.69-0.72 kg/L at 15 degC, from
memory). A tank or a loading may give its own density where the flight manual does.
"""

from __future__ import annotations

from typing import Literal

from .units import convert

__all__ = ["FUEL_DENSITY_LB_PER_USGAL", "FuelGrade", "default_density"]

FuelGrade = Literal["avgas", "mogas", "jet"]

FUEL_DENSITY_LB_PER_USGAL: dict[str, float] = {
    "avgas": 6.0,  # common practice
    "mogas": 6.0,  # common practice (motor gasoline treated as avgas)
    "jet": 6.7,  # common practice
}
"""Default density per fuel grade [lb/US gal]."""


def default_density(grade: str, mass_unit: str, volume_unit: str) -> float:
    """Default density of a fuel grade in the aircraft's units.

    Parameters
    ----------
    grade : one of ``avgas``, ``mogas``, ``jet``
    mass_unit, volume_unit : the aircraft's units (``lb``/``kg``; ``usgal``/``impgal``/``l``)

    Returns
    -------
    float
        Density [mass unit per volume unit].

    Examples
    --------
    >>> round(default_density("avgas", "kg", "l"), 5)
    0.71896
    """
    per_usgal = FUEL_DENSITY_LB_PER_USGAL[grade]
    mass = convert(per_usgal, "lb", mass_unit)
    return mass / convert(1.0, "usgal", volume_unit)


_SPELLINGS = {
    "avgas": "avgas", "100ll": "avgas", "avgas 100ll": "avgas", "avgas100ll": "avgas", "100/130": "avgas",
    "mogas": "mogas",
    "jet": "jet", "jet-a": "jet", "jet a": "jet", "jet_a": "jet", "jeta": "jet",
    "jet-a1": "jet", "jet a-1": "jet", "jet a1": "jet", "jet-a-1": "jet", "jet_a1": "jet", "jeta1": "jet",
}


def grade_name(text: object) -> object:
    """The grade a common spelling stands for (``"Jet A-1"`` -> ``"jet"``); others unchanged.

    Examples
    --------
    >>> grade_name("100LL"), grade_name("Jet A-1"), grade_name("diesel")
    ('avgas', 'jet', 'diesel')
    """
    if isinstance(text, str):
        return _SPELLINGS.get(" ".join(text.strip().lower().split()), text)
    return text
