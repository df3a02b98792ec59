"""Tests of loadcheck/display.py: display precision and rounding in the safe direction.

The rule (docs/computation.md, "Rounding"; common practice, no published figure): an excess over
a limit is shown rounded up, a margin or an allowance rounded down, so a display never shows
more room than there is. The product of units is written with a middle dot (SI Brochure,
9th edition, 2019, 5.4.6).
"""

from __future__ import annotations

import math

import pytest

from loadcheck.display import decimals, fmt, round_safe, unit_label


@pytest.mark.parametrize(
    "value, places, direction, shown",
    [
        (0.3201, 2, "up", 0.33),  # an excess: never shown smaller than it is
        (0.3299, 2, "down", 0.32),  # a margin: never shown larger than it is
        (-0.3201, 2, "down", -0.33),
        (-0.3299, 2, "up", -0.32),
        (0.1 + 0.2, 1, "up", 0.3),  # 0.30000000000000004 is 0.3, not 0.4
        (0.7 - 0.4, 1, "down", 0.3),  # 0.29999999999999993 is 0.3, not 0.2
        (12.34, 1, "nearest", 12.3),
    ],
)
def test_a_figure_rounds_in_the_direction_asked(value, places, direction, shown):
    assert round_safe(value, places, direction) == pytest.approx(shown, abs=1e-12)


def test_a_rounded_margin_is_never_more_room_than_there_is():
    for k in range(1, 2000):
        value = k * 0.0137
        assert round_safe(value, 1, "down") <= value + 1e-9 and round_safe(value, 1, "up") >= value - 1e-9


def test_each_unit_shows_its_places_and_a_moment_whole_numbers():
    assert [decimals(u) for u in ("lb", "kg", "in", "mm", "usgal", "l", "%MAC")] == [1, 1, 2, 0, 1, 1, 1]
    assert decimals("lb*in") == 0 and decimals("kg*m") == 0


def test_the_shown_figure_has_thousands_separators_its_unit_and_no_negative_zero():
    assert fmt(2550.04, "lb") == "2,550.0 lb"
    assert fmt(104337.4, "lb*in") == "104,337 lb\u00b7in"  # SI Brochure 5.4.6: the middle dot
    assert fmt(-0.004, "lb") == "0.0 lb"  # rounds to zero: no "-0.0"
    assert fmt(0.321, "in", "up", with_unit=False) == "0.33"
    assert fmt(1.23456, "in", places=4) == "1.2346 in"
    assert unit_label("kg*m") == "kg\u00b7m" and unit_label("lb") == "lb"
    assert not math.isnan(round_safe(1e15, 2, "up"))


@pytest.mark.parametrize(
    "value, unit, kwargs, shown",
    [
        (0.021, "kg", {"signed": True}, "+0.02 kg"),  # regression: was '0.0 kg' (alter, a light placard)
        (-0.021, "kg", {"signed": True}, "-0.02 kg"),
        (0.004, "in", {"signed": True}, "+0.004 in"),
        (-0.0597, "mm", {"signed": True}, "-0.1 mm"),  # mm shows whole numbers: one more digit
        (0.4, "lb*in", {"signed": True}, "+0.4 lb·in"),
        (0.00001, "lb", {"signed": True}, "+0.0001 lb"),  # below the last digit shown: away from zero
        (-0.00001, "lb", {"signed": True}, "-0.0001 lb"),
        (4.2, "lb", {"signed": True}, "+4.2 lb"),  # at the unit's places, as before
        (0.0, "lb", {"signed": True}, "0.0 lb"),  # no change: zero, no sign
        (1710.0 + 4.2 - 4.2 - 1710.0, "lb", {"signed": True}, "0.0 lb"),  # floating-point noise is no change
        (0.021, "kg", {"nonzero": True}, "0.02 kg"),  # an item's weight
        (0.021, "kg", {}, "0.0 kg"),  # a neutral figure still rounds to nearest at the unit's places
    ],
)
def test_regression_a_change_that_is_not_zero_never_shows_as_zero(value, unit, kwargs, shown):
    """A change of +0.021 kg printed as 'weight 0.0 kg'. A change shows its sign and enough digits
    (up to three more than the unit's, as an excess over a limit does, docs/computation.md
    "Rounding") to be seen; common practice, no published figure."""
    assert value != 0.0 or shown.startswith("0")
    assert fmt(value, unit, **kwargs) == shown
