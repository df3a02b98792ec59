"""Fuel densities: facts of the trade, checked against the specification ranges."""

from __future__ import annotations

import pytest

from loadcheck.fuel import (
    DENSITY_RANGE_KG_PER_L,
    FUEL_DENSITY_LB_PER_USGAL,
    default_density,
    density_problem,
    density_range,
)


def test_defaults_are_the_trade_values():
    # common practice: avgas 6.0 lb/US gal, jet fuel 6.7 lb/US gal (DESIGN.md)
    assert FUEL_DENSITY_LB_PER_USGAL["avgas"] == 6.0
    assert FUEL_DENSITY_LB_PER_USGAL["jet"] == 6.7


def _kg_per_m3(ureg, grade: str) -> float:
    value = ureg.Quantity(FUEL_DENSITY_LB_PER_USGAL[grade], "pound / gallon")
    return float(value.to("kilogram / meter ** 3").magnitude)


def test_jet_default_inside_astm_d1655_range(ureg):
    # ASTM D1655 (Jet A / Jet A-1): density at 15 degC 775 to 840 kg/m^3 (from memory)
    assert 775.0 <= _kg_per_m3(ureg, "jet") <= 840.0


def test_avgas_default_is_typical_avgas(ureg):
    # avgas (ASTM D910) is about 690-720 kg/m^3 at 15 degC (from memory; D910 sets no density limit)
    assert 690.0 <= _kg_per_m3(ureg, "avgas") <= 725.0


@pytest.mark.parametrize("mass, volume", [("lb", "usgal"), ("kg", "l"), ("kg", "impgal"), ("lb", "l")])
def test_default_density_in_any_units_agrees_with_pint(ureg, mass, volume):
    names = {"lb": "pound", "kg": "kilogram", "usgal": "gallon", "l": "liter", "impgal": "imperial_gallon"}
    expected = ureg.Quantity(6.0, "pound / gallon").to(f"{names[mass]} / {names[volume]}").magnitude
    assert default_density("avgas", mass, volume) == pytest.approx(expected, rel=1e-12)


@pytest.mark.parametrize(
    "mass, volume", [("lb", "usgal"), ("kg", "l"), ("kg", "impgal"), ("lb", "l"), ("lb", "impgal"), ("kg", "usgal")]
)
def test_the_plausible_density_range_in_any_units_agrees_with_pint(ureg, mass, volume):
    names = {"lb": "pound", "kg": "kilogram", "usgal": "gallon", "l": "liter", "impgal": "imperial_gallon"}
    low, high = density_range(mass, volume)
    for got, kg_per_l in ((low, DENSITY_RANGE_KG_PER_L[0]), (high, DENSITY_RANGE_KG_PER_L[1])):
        expected = ureg.Quantity(kg_per_l, "kilogram / liter").to(f"{names[mass]} / {names[volume]}").magnitude
        assert got == pytest.approx(expected, rel=1e-12)
    for grade in FUEL_DENSITY_LB_PER_USGAL:  # every default density is plausible in every unit
        assert density_problem(default_density(grade, mass, volume), mass, volume) is None


def test_the_plausible_range_holds_the_specification_figures():
    # ASTM D1655 Jet A / Jet A-1: 775 to 840 kg/m^3 at 15 degC (from memory); avgas to ASTM
    # D910 about 690-720 kg/m^3 at 15 degC (from memory); about 0.1 % per degC (common practice)
    low, high = DENSITY_RANGE_KG_PER_L
    assert low <= 0.690 * (1 - 0.001 * 35) and 0.840 * (1 + 0.001 * 55) <= high  # +50 degC and -40 degC


@pytest.mark.parametrize(
    "value, mass, volume, hint",
    [
        (0.72, "lb", "usgal", "kg/l"),  # a kg/L figure in a lb / US gal file
        (6.0, "kg", "l", "lb/usgal"),  # a lb / US gal figure in a kg / L file
        (6.0, "lb", "impgal", "lb/usgal"),  # avgas per US gallon in an imperial-gallon file (7.2 lb / imp gal)
        (720.0, "kg", "l", None),  # kg/m^3
        (1.0, "kg", "l", None),  # water
    ],
)
def test_a_density_in_the_wrong_units_is_refused_with_a_hint(value, mass, volume, hint):
    problem = density_problem(value, mass, volume)
    assert problem is not None and f"{mass}/{volume}" in problem
    assert (hint in problem) if hint else ("was it written" not in problem)
