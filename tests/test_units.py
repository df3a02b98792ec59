"""Units: exact constants checked against pint (a general-purpose unit library on PyPI,
whose definitions follow NIST SP 811) and against the NIST SP 811 (2008) appendix B.8
values themselves."""

from __future__ import annotations

import math

import pytest
from hypothesis import given
from hypothesis import strategies as st

from loadcheck.errors import UnitError
from loadcheck.units import (
    KG_PER_LB,
    L_PER_IMPGAL,
    L_PER_USGAL,
    MAX_MAGNITUDE,
    MM_PER_IN,
    Quantity,
    canonical_unit,
    convert,
    parse_duration_hours,
    parse_quantity,
    parse_rate,
    read_rate,
)

PINT_NAMES = {
    "lb": "pound",
    "kg": "kilogram",
    "in": "inch",
    "mm": "millimeter",
    "cm": "centimeter",
    "m": "meter",
    "usgal": "gallon",
    "impgal": "imperial_gallon",
    "l": "liter",
}


def test_constants_are_the_exact_nist_values():
    # NIST SP 811 (2008) appendix B.8: exact definitions
    assert KG_PER_LB == 0.45359237
    assert MM_PER_IN == 25.4
    assert L_PER_USGAL == 3.785411784
    assert L_PER_IMPGAL == 4.54609


@pytest.mark.parametrize(
    "a, b",
    [
        ("lb", "kg"),
        ("kg", "lb"),
        ("in", "mm"),
        ("mm", "in"),
        ("cm", "in"),
        ("m", "in"),
        ("usgal", "l"),
        ("l", "usgal"),
        ("impgal", "l"),
        ("impgal", "usgal"),
    ],
)
def test_conversions_agree_with_pint(ureg, a, b):
    expected = ureg.Quantity(123.456, PINT_NAMES[a]).to(PINT_NAMES[b]).magnitude
    assert convert(123.456, a, b) == pytest.approx(expected, rel=1e-12)


@given(st.floats(-1e6, 1e6, allow_nan=False), st.sampled_from(["lb", "kg"]), st.sampled_from(["lb", "kg"]))
def test_mass_round_trip(value, a, b):
    assert convert(convert(value, a, b), b, a) == pytest.approx(value, rel=1e-12, abs=1e-9)


def test_convert_refuses_different_kinds():
    with pytest.raises(UnitError, match="cannot convert"):
        convert(1.0, "lb", "in")


@pytest.mark.parametrize(
    "text, expected",
    [
        ("20 kg", Quantity(20.0, "kg")),
        ("48usgal", Quantity(48.0, "usgal")),
        ("180", Quantity(180.0, None)),
        (" 1.5e2 lbs ", Quantity(150.0, "lb")),
        ("40 L", Quantity(40.0, "l")),
        (12, Quantity(12.0, None)),
        ("-3 in", Quantity(-3.0, "in")),
    ],
)
def test_parse_quantity(text, expected):
    assert parse_quantity(text) == expected


@pytest.mark.parametrize("text", ["twenty kg", "20 kgg", "", "nan", "inf kg", "1e400 lb", "20 gal"])
def test_parse_quantity_refuses(text):
    with pytest.raises(UnitError):
        parse_quantity(text)


def test_bare_gallon_is_refused_as_ambiguous():
    with pytest.raises(UnitError, match="known units"):
        canonical_unit("gal")


def test_parse_quantity_refuses_bool():
    with pytest.raises(UnitError):
        parse_quantity(True)


@pytest.mark.parametrize("text, hours", [("2:15", 2.25), ("0:45", 0.75), ("1.5 h", 1.5), ("90 min", 1.5), (2, 2.0)])
def test_durations(text, hours):
    assert math.isclose(parse_duration_hours(text), hours)


@pytest.mark.parametrize("text", ["2:75", "soon", "-1", -1.0])
def test_bad_durations(text):
    with pytest.raises(UnitError):
        parse_duration_hours(text)


@pytest.mark.parametrize(
    "text, value, unit",
    [
        ("36 l/h", 36.0, "l"),
        ("9.5 gph", 9.5, "usgal"),
        ("60 lb/h", 60.0, "lb"),
        ("60 LB/HR", 60.0, "lb"),
        ("27 kg/h", 27.0, "kg"),
        ("8 impgal per hour", 8.0, "impgal"),
        ("120 pph", 120.0, "lb"),
        ("30 lph", 30.0, "l"),
        ("9.5", 9.5, None),
        (9.5, 9.5, None),
        ("10 usgal", 10.0, "usgal"),
    ],
)
def test_rates_are_read_with_their_units(text, value, unit):
    # "gph" is US gallons per hour and "pph" pounds per hour (common practice in US usage)
    assert parse_rate(text) == Quantity(value, unit)


@pytest.mark.parametrize("text", ["9.5 gal/h", "fast", "9.5 l/min", "1e999 l/h", "/h"])
def test_a_rate_that_cannot_be_read_is_refused_with_rate_examples(text):
    with pytest.raises(UnitError, match=r"as a fuel rate.*'36 l/h'"):
        parse_rate(text)


def test_read_rate_converts_a_volume_and_refuses_a_mass():
    # 1 US gal = 3.785411784 L exactly (NIST SP 811, 2008, appendix B.8)
    assert read_rate("36 l/h", "usgal") == pytest.approx(36 / 3.785411784, rel=1e-15)
    with pytest.raises(UnitError, match="--rate: a mass per hour cannot be used here"):
        read_rate("60 lb/h", "usgal", "--rate")


@pytest.mark.parametrize("typed", [1e300, -2e7, 10**400, "1e300 lb", "1.0000001e7 mm", "-1e8 in", "99999999999"])
def test_regression_a_mistyped_exponent_was_read_and_checked_with_hundreds_of_digits(typed):
    """`front = 1e300` was taken: the moment table printed a weight of 301 digits and the moments
    overflowed. Every amount read is bounded by MAX_MAGNITUDE (ten million in the unit written;
    common practice: no aircraft figure comes near it), a Python integer too large for a float
    included, and the refusal names the value as typed."""
    with pytest.raises(UnitError, match="beyond any aircraft") as refused:
        parse_quantity(typed)
    assert repr(typed)[:20] in str(refused.value)


@pytest.mark.parametrize("typed", [MAX_MAGNITUDE, -MAX_MAGNITUDE, "1e7 mm", "9999999 lb"])
def test_amounts_up_to_the_bound_are_read_as_given(typed):
    quantity = parse_quantity(typed)
    assert abs(quantity.value) <= MAX_MAGNITUDE and abs(quantity.value) >= 9_999_999


@pytest.mark.parametrize("typed", [1e300, "2e7 h", 10**400], ids=["1e300", "2e7 h", "10**400"])
def test_a_duration_beyond_any_flight_is_refused(typed):
    with pytest.raises(UnitError):
        parse_duration_hours(typed)


def test_gph_for_a_rate_in_imperial_gallons_is_refused_naming_the_option():
    # the command line's rate (plan trip --rate) is read into the aircraft's fuel unit: the same rule
    # as a loading's burn.rate (tests/test_loading.py), named by the option as typed
    with pytest.raises(UnitError) as refused:
        read_rate("9.5 gph", "impgal", "--rate")
    assert refused.value.problems[0].field == "--rate" and "imperial" in refused.value.problems[0].message
    assert read_rate("9.5 gph", "usgal", "--rate") == pytest.approx(9.5)


@pytest.mark.parametrize("text", ["1e-400", "1e-400 kg", "5e-324", "1e-310 lb"])
def test_regression_a_figure_below_the_smallest_float_was_read_as_zero(text):
    """An outside trial: ``front = "1e-400"`` was read as 0 (the station vanished from the moment
    table) while ``1e300`` is refused: a figure that a float cannot hold as typed (below the smallest
    normal double, 2.2e-308, IEEE 754-2019 binary64, from memory) is refused, never replaced."""
    with pytest.raises(UnitError, match="too small to be read as written"):
        parse_quantity(text)


@pytest.mark.parametrize("text", ["0", "0.0", "0e5", "-0", "1e-300", "٠"])
def test_zero_and_small_normal_figures_are_read(text):
    assert parse_quantity(text).value == float(text)  # Python reads the Arabic-Indic zero too


@pytest.mark.parametrize("text", ["1.5", " 2 ", "90", ".5"])
def test_a_duration_typed_as_a_bare_number_is_hours_as_in_a_file(text):
    # an outside trial's find: --trip-time 1.5 was refused, while a loading file's trip_time = 1.5 and the
    # fleet CSV cell 1.5 are 1.5 h (file-format.md: "'2:15', '2.25 h' or hours"); one rule for every input
    from loadcheck.units import parse_duration_hours

    assert parse_duration_hours(text) == pytest.approx(float(text)) == parse_duration_hours(float(text))
    assert parse_duration_hours(f"{text} h") == pytest.approx(float(text))
