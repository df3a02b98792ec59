"""Fuel densities: facts of the trade, checked against the specification ranges."""

from __future__ import annotations

import pint
import pytest

from loadcheck.fuel import FUEL_DENSITY_LB_PER_USGAL, default_density

ureg = pint.UnitRegistry()


def test_defaults_are_the_trade_values():
    # common practice: avgas 6.0 lb/US gal, jet fuel 6.7 lb/US gal (DESIGN.md)
    assert FUEL_DENSITY_LB_PER_USGAL["avgas"] == 6.0
    assert FUEL_DENSITY_LB_PER_USGAL["jet"] == 6.7


def _kg_per_m3(grade: str) -> float:
    value = ureg.Quantity(FUEL_DENSITY_LB_PER_USGAL[grade], "pound / gallon")
    return float(value.to("kilogram / meter ** 3").magnitude)


def test_jet_default_inside_astm_d1655_range():
    # ASTM D1655 (Jet A / Jet A-1): density at 15 degC 775 to 840 kg/m^3 (from memory)
    assert 775.0 <= _kg_per_m3("jet") <= 840.0


def test_avgas_default_is_typical_avgas():
    # avgas (ASTM D910) is about 690-720 kg/m^3 at 15 degC (from memory; D910 sets no density limit)
    assert 690.0 <= _kg_per_m3("avgas") <= 725.0


@pytest.mark.parametrize("mass, volume", [("lb", "usgal"), ("kg", "l"), ("kg", "impgal"), ("lb", "l")])
def test_default_density_in_any_units_agrees_with_pint(mass, volume):
    names = {"lb": "pound", "kg": "kilogram", "usgal": "gallon", "l": "liter", "impgal": "imperial_gallon"}
    expected = ureg.Quantity(6.0, "pound / gallon").to(f"{names[mass]} / {names[volume]}").magnitude
    assert default_density("avgas", mass, volume) == pytest.approx(expected, rel=1e-12)
