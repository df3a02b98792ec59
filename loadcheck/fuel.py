"""Fuel grades and their default densities.

The default densities are facts of the trade (common practice for weight-and-balance
work): aviation gasoline 6.0 lb/US gal and kerosene jet fuel 6.7 lb/US gal. Both sit
inside the density ranges of their specifications (ASTM D1655 Jet A/A-1: 775-840 kg/m^3
at 15 degC, from memory; avgas to ASTM D910 is about 0.69-0.72 kg/L at 15 degC, from
memory). A tank or a loading may give its own density where the flight manual does.

A density given in a file must be one that an aviation fuel can have
(:data:`DENSITY_RANGE_KG_PER_L`): a figure written in the wrong units (0.72, a kg/L value,
in a lb / US gal file; 6.0, a lb / US gal value, in a lb / imp gal file) would make every
tank weigh a fraction or a multiple of what it does, so it is refused
(:func:`density_problem`).
"""

from __future__ import annotations

from typing import Literal

from .units import convert

__all__ = [
    "DENSITY_RANGE_KG_PER_L",
    "FUEL_DENSITY_LB_PER_USGAL",
    "FuelGrade",
    "default_density",
    "density_problem",
    "density_range",
]

FuelGrade = Literal["avgas", "mogas", "jet"]

FUEL_DENSITY_LB_PER_USGAL: dict[str, float] = {
    "avgas": 6.0,  # common practice
    "mogas": 6.0,  # common practice (motor gasoline treated as avgas)
    "jet": 6.7,  # common practice
}
"""Default density per fuel grade [lb/US gal]."""


DENSITY_RANGE_KG_PER_L: tuple[float, float] = (0.64, 0.90)
"""Densities an aviation fuel can have, at any temperature met in service [kg/L].

Lower end: the lightest avgas (about 0.69 kg/L at 15 degC; ASTM D910 sets no density limit,
figure from memory) warmed to +50 degC (about 0.1 % lighter per degC, common practice) is
about 0.66 kg/L; 0.64 leaves room. Upper end: the heaviest Jet A / Jet A-1 (0.840 kg/L at
15 degC, the ASTM D1655 limit, from memory) cooled to -40 degC is about 0.88 kg/L; 0.90
leaves room. The bounds themselves are common practice, not a specification's.
"""


def density_range(mass_unit: str, volume_unit: str) -> tuple[float, float]:
    """:data:`DENSITY_RANGE_KG_PER_L` in the aircraft's units [mass unit per volume unit].

    Examples
    --------
    >>> [round(v, 2) for v in density_range("lb", "usgal")]
    [5.34, 7.51]
    """
    per_l = convert(1.0, "kg", mass_unit) * convert(1.0, volume_unit, "l")
    low, high = DENSITY_RANGE_KG_PER_L
    return low * per_l, high * per_l


def density_problem(value: float, mass_unit: str, volume_unit: str) -> str | None:
    """Why a fuel density cannot be right in these units, or None where it can.

    Parameters
    ----------
    value : the density as written [mass unit per volume unit]
    mass_unit, volume_unit : the aircraft's units

    Examples
    --------
    >>> density_problem(6.0, "lb", "usgal") is None
    True
    >>> print(density_problem(0.72, "lb", "usgal"))
    0.72 lb/usgal is not the density of an aviation fuel (expected 5.34 to 7.51 lb/usgal; was it written in kg/l?)
    """
    low, high = density_range(mass_unit, volume_unit)
    if low <= value <= high:
        return None
    hints = []
    for mass, volume in (
        ("kg", "l"),
        ("lb", "usgal"),
        ("lb", "impgal"),
        ("kg", "usgal"),
        ("kg", "impgal"),
        ("lb", "l"),
    ):
        if (mass, volume) != (mass_unit, volume_unit):
            other_low, other_high = density_range(mass, volume)
            if other_low <= value <= other_high:
                hints.append(f"{mass}/{volume}")
    hint = f"; was it written in {' or '.join(hints)}?" if hints else ""
    return (
        f"{value:g} {mass_unit}/{volume_unit} is not the density of an aviation fuel "
        f"(expected {low:.2f} to {high:.2f} {mass_unit}/{volume_unit}{hint})"
    )


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
    "avgas": "avgas",
    "100ll": "avgas",
    "avgas 100ll": "avgas",
    "avgas100ll": "avgas",
    "100/130": "avgas",
    "mogas": "mogas",
    "jet": "jet",
    "jet-a": "jet",
    "jet a": "jet",
    "jet_a": "jet",
    "jeta": "jet",
    "jet-a1": "jet",
    "jet a-1": "jet",
    "jet a1": "jet",
    "jet-a-1": "jet",
    "jet_a1": "jet",
    "jeta1": "jet",
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
