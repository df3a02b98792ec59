"""Weighing (loadcheck/weighing.py): scale readings to the empty weight and CG, checked against
the published formulas and examples.

Sources named beside each check:
- FAA-H-8083-1B, chapter "Use of Computer for Weight and Balance Computations" (electronic
  calculator example): nose-wheel net weight F = 340 lb, main wheels to nose wheel
  L = -78 in, total W = 2,006 lb: CG = F x L / W = -13.2 in from the main-wheel weighing points.
- FAA-H-8083-1 chapter 3, the four empty-weight CG formulas (from memory).
- FAA-H-8083-1B (2016) chapters 3 and 10, the four formulas' printed examples.

What the mechanic's record of a weighing does (refusals, confirmation, history) is in
tests/test_empty_record.py.
"""

from __future__ import annotations

import pytest
from hypothesis import given, settings
from hypothesis import strategies as st

from loadcheck import load_aircraft
from loadcheck.errors import InputError
from loadcheck.files import parse_aircraft
from loadcheck.weighing import Readings, weigh

from .helpers import examples, sample, sample_data


def box(**changes):
    data = {
        "name": "Weighing box",
        "units": {"mass": "lb", "arm": "in", "fuel_volume": "usgal"},
        "empty": {"weight": 2000.0, "arm": 0.0},
        "limits": {"max_takeoff_weight": 3000},
        "envelope": [
            {
                "category": "normal",
                "axes": ["arm", "weight"],
                "points": [[-50, 500], [-50, 3000], [90, 3000], [90, 500]],
            }
        ],
    }
    data.update(changes)
    return parse_aircraft(data)


def test_faa_h_8083_1b_electronic_calculator_example():
    # FAA-H-8083-1B: F = 340 lb, L = -78 in (nose ahead of mains), W = 2,006 lb -> -13.2 in
    readings = Readings.model_validate(
        {
            "geometry": {"gear": "nosewheel", "datum": "forward", "main_distance": 0.0, "wheelbase": 78.0},
            "point": [
                {"label": "nose", "wheel": "nose", "reading": 340.0},
                {"label": "left", "wheel": "main", "reading": 833.0},
                {"label": "right", "wheel": "main", "reading": 833.0},
            ],
        }
    )
    result = weigh(box(), readings)
    assert result.as_weighed.weight == pytest.approx(2006.0)
    assert result.as_weighed.arm == pytest.approx(340.0 * -78.0 / 2006.0)
    assert round(result.as_weighed.arm, 1) == -13.2
    assert result.formula_cg == pytest.approx(result.as_weighed.arm)


@settings(max_examples=examples(200), deadline=None)
@given(
    st.sampled_from(["nosewheel", "tailwheel"]),
    st.sampled_from(["forward", "aft"]),
    st.floats(0, 200),
    st.floats(20, 300),
    st.floats(10, 2000),
    st.floats(100, 5000),
    st.floats(100, 5000),
)
def test_four_formulas_agree_with_the_sum_of_moments(gear, datum, d, length, other, left, right):
    # FAA-H-8083-1 ch. 3 (from memory): D - F L/W; -(D + F L/W); D + R L/W; -D + R L/W
    wheel = "nose" if gear == "nosewheel" else "tail"
    readings = Readings.model_validate(
        {
            "geometry": {"gear": gear, "datum": datum, "main_distance": d, "wheelbase": length},
            "point": [
                {"label": wheel, "wheel": wheel, "reading": other},
                {"label": "l", "wheel": "main", "reading": left},
                {"label": "r", "wheel": "main", "reading": right},
            ],
        }
    )
    result = weigh(box(), readings)
    w = other + left + right
    expected = {
        ("nosewheel", "forward"): d - other * length / w,
        ("nosewheel", "aft"): -(d + other * length / w),
        ("tailwheel", "forward"): d + other * length / w,
        ("tailwheel", "aft"): -d + other * length / w,
    }[(gear, datum)]
    assert result.as_weighed.arm == pytest.approx(expected, rel=1e-9, abs=1e-9)
    assert result.formula_cg == pytest.approx(expected, rel=1e-9, abs=1e-9)


def test_corrections_and_lateral_readings():
    readings = Readings.model_validate(
        {
            "point": [
                {"label": "nose", "arm": -10.0, "reading": 300.0, "tare": 5.0},
                {"label": "left", "arm": 60.0, "lateral_arm": -50.0, "reading": 800.0, "tare": 4.0},
                {"label": "right", "arm": 60.0, "lateral_arm": 50.0, "reading": 820.0, "tare": 4.0},
            ],
            "on_board": [{"label": "fuel", "weight": 30.0, "arm": 48.0}],
            "missing": [{"label": "battery", "weight": 25.0, "arm": -20.0}],
        }
    )
    result = weigh(box(), readings)
    w = 295 + 796 + 816
    m = 295 * -10 + (796 + 816) * 60
    assert result.as_weighed.weight == pytest.approx(w)
    assert result.new.weight == pytest.approx(w - 30 + 25)
    assert result.new.moment == pytest.approx(m - 30 * 48 + 25 * -20)
    assert result.as_weighed.lateral_arm == pytest.approx((816 - 796) * 50 / w)


def test_empty_weight_cg_range_warning():
    aircraft = box(empty={"weight": 2000.0, "arm": 0.0, "cg_range": [10.0, 20.0]})
    readings = Readings.model_validate({"point": [{"label": "p", "arm": 0.0, "reading": 2000.0}]})
    assert any("empty-weight CG range" in w for w in weigh(aircraft, readings).warnings)


def test_readings_with_units_and_fuel_item():
    aircraft = load_aircraft(sample("tandem2/aircraft.toml"))
    data = sample_data("trainer4/weighing.toml")
    del data["geometry"]
    data["point"] = [
        {"label": "tail", "arm": "4.2 m", "reading": "30 kg"},
        {"label": "mains", "arm": 0.0, "reading": "400 kg"},
    ]
    data["on_board"] = [{"label": "fuel", "tank": "wing", "fuel": "2 usgal"}]
    data["missing"] = []
    result = weigh(aircraft, Readings.model_validate(data, context={"units": aircraft.units}))
    assert result.as_weighed.weight == pytest.approx(430.0)
    assert result.as_weighed.arm == pytest.approx(30 * 4200 / 430)
    assert result.corrections[0].weight == pytest.approx(
        2 * 3.785411784 * aircraft.density(aircraft.tank_by_id["wing"])
    )


def test_regression_fuel_aboard_above_the_tanks_capacity_gave_an_empty_weight():
    # usable fuel taken off can be at most what the tank holds; the unusable fuel is part of the
    # basic empty weight (FAA-H-8083-1B, from memory)
    aircraft = load_aircraft(sample("tandem2/aircraft.toml"))
    usable = aircraft.tank_by_id["wing"].usable
    point = [{"label": "mains", "arm": 0.0, "reading": 400.0}]
    over = {"point": point, "on_board": [{"label": "fuel", "tank": "wing", "fuel": usable + 0.1}]}
    with pytest.raises(InputError, match=r"on_board\[0\]\.fuel: .* above the usable capacity of tank 'wing'"):
        weigh(aircraft, Readings.model_validate(over))
    full = {"point": point, "on_board": [{"label": "fuel", "tank": "wing", "fuel": usable}]}
    assert weigh(aircraft, Readings.model_validate(full)).corrections[0].weight == pytest.approx(
        usable * aircraft.density(aircraft.tank_by_id["wing"])
    )


def test_regression_a_fuel_items_weight_was_dropped_for_its_tanks_density():
    with pytest.raises(ValueError, match="not a weight"):
        Readings.model_validate(
            {
                "point": [{"label": "mains", "arm": 0.0, "reading": 400.0}],
                "on_board": [{"label": "fuel", "tank": "wing", "fuel": 5.0, "weight": 30.0}],
            }
        )


# -- the published empty-weight CG formulas (issue 16) -----------------------------------------
# FAA-H-8083-1B (2016) chapter 3 ("Locating the CG", datum forward of / aft of the main wheels,
# nosewheel and tailwheel) and chapter 10: D datum to main wheels, L main wheels to the nose or
# tail wheel, F nosewheel and R tailwheel net weight, W total. Compared to the printed value
# within one unit of its last printed digit (0.1 in).


def _formula_readings(gear, datum, d, other, length, total):
    wheel = "nose" if gear == "nosewheel" else "tail"
    main = (total - other) / 2
    return Readings.model_validate(
        {
            "geometry": {"gear": gear, "datum": datum, "main_distance": d, "wheelbase": length},
            "point": [
                {"label": wheel, "wheel": wheel, "reading": other},
                {"label": "left main", "wheel": "main", "reading": main},
                {"label": "right main", "wheel": "main", "reading": main},
            ],
        }
    )


@pytest.mark.parametrize(
    "gear, datum, d, other, length, total, published",
    [
        ("nosewheel", "forward", 128.0, 340.0, 78.0, 2006.0, 114.8),  # CG = D - F L / W
        ("nosewheel", "aft", 75.0, 340.0, 78.0, 2006.0, -88.2),  # CG = -(D + F L / W)
        ("tailwheel", "forward", 7.5, 67.0, 222.0, 1218.0, 19.7),  # CG = D + R L / W
        ("tailwheel", "aft", 80.0, 67.0, 222.0, 1218.0, -67.8),  # CG = -D + R L / W
    ],
)
def test_faa_h_8083_1b_empty_weight_cg_formulas(gear, datum, d, other, length, total, published):
    aircraft = parse_aircraft(
        {
            "name": "Weighing box",
            "units": {"mass": "lb", "arm": "in", "fuel_volume": "usgal"},
            "empty": {"weight": total, "arm": 0.0},
            "limits": {"max_takeoff_weight": 3000},
            "envelope": [
                {
                    "category": "normal",
                    "axes": ["arm", "weight"],
                    "points": [[-150, 500], [-150, 3000], [150, 3000], [150, 500]],
                }
            ],
        }
    )
    result = weigh(aircraft, _formula_readings(gear, datum, d, other, length, total))
    assert result.as_weighed.weight == pytest.approx(total)
    assert abs(result.as_weighed.arm - published) <= 0.1
    assert round(result.as_weighed.arm, 1) == published
    assert result.formula_cg == pytest.approx(result.as_weighed.arm)


def test_regression_a_weighings_warnings_round_as_its_tables_do(tmp_path):
    """The CG-range warning printed "398.84 mm" beside a table showing 399 mm (mm are shown whole,
    docs/computation.md "Rounding"); every figure of the warnings and refusals now goes through the one
    display rule, and the excess past the range is said. Invented readings: 200 + 200 kg at the datum and
    31.9 kg at 5,400 mm give a CG of 31.9 x 5400 / 431.9 = 398.8 mm (FAA-H-8083-1B chapter 3, sum of
    moments over the sum of weights), aft of tandem2's empty-weight CG range 240 to 380 mm by 18.8 mm."""

    aircraft = load_aircraft(sample("tandem2/aircraft.toml"))
    points = [{"label": "left", "arm": 0.0, "reading": 200.0}, {"label": "right", "arm": 0.0, "reading": 200.0}]
    points.append({"label": "tail", "arm": 5400.0, "reading": 31.9})
    result = weigh(aircraft, Readings.model_validate({"format": 1, "point": points}))
    assert result.new.arm == pytest.approx(31.9 * 5400 / 431.9)
    (warning,) = result.warnings
    assert warning.startswith("the new empty-weight CG 399 mm is outside the empty-weight CG range 240 mm to 380 mm")
    assert "(aft of it by 19 mm)" in warning and "398.84" not in warning


# -- an aircraft that limits the lateral CG: no lateral arm is guessed ---------------------------
# Invented readings on the sample heli2 (a lateral envelope; empty 962.0 lb, lateral CG +0.40 in):
# a centreline point 320 lb at 84.0 in, left 322 lb at 107.0 in, 18.0 in left; right 318 lb at
# 107.0 in, 18.0 in right. Sum of moments over sum of weights (FAA-H-8083-1B chapter 2, moment
# method; chapter 3, weighing): W = 960 lb, CG = (320 x 84 + 640 x 107) / 960 = 95,360 / 960 =
# 99.33 in; lateral CG = (322 x -18 + 318 x 18) / 960 = -72 / 960 = -0.075 in.


def _heli_points(front_lateral=None):
    front = {"label": "front", "arm": 84.0, "reading": 320.0}
    if front_lateral is not None:
        front["lateral_arm"] = front_lateral
    return [
        front,
        {"label": "rear left", "arm": 107.0, "lateral_arm": -18.0, "reading": 322.0},
        {"label": "rear right", "arm": 107.0, "lateral_arm": 18.0, "reading": 318.0},
    ]


def test_a_lateral_aircraft_refuses_a_weighing_point_without_its_lateral_arm():
    aircraft = load_aircraft(sample("heli2/aircraft.toml"))
    with pytest.raises(InputError, match=r"point\[0\]\.lateral_arm: point 'front' gives no lateral arm: .*lateral CG"):
        weigh(aircraft, Readings.model_validate({"point": _heli_points()}))
    result = weigh(aircraft, Readings.model_validate({"point": _heli_points(0.0)}))
    assert result.new.weight == pytest.approx(960.0)
    assert result.new.arm == pytest.approx(95360.0 / 960.0)
    assert result.new.lateral_arm == pytest.approx(-72.0 / 960.0)


@pytest.mark.parametrize("table", ["on_board", "missing"])
def test_a_lateral_aircraft_refuses_a_correction_without_its_lateral_arm(table):
    # a 20 lb item at 60.0 in: taken off (on board when weighed) or put on (missing), 8.0 in right
    aircraft = load_aircraft(sample("heli2/aircraft.toml"))
    item = {"label": "battery", "weight": 20.0, "arm": 60.0}
    with pytest.raises(InputError, match=rf"{table}\[0\]\.lateral_arm: item 'battery' gives no lateral arm"):
        weigh(aircraft, Readings.model_validate({"point": _heli_points(0.0), table: [item]}))
    result = weigh(
        aircraft, Readings.model_validate({"point": _heli_points(0.0), table: [{**item, "lateral_arm": 8.0}]})
    )
    sign = -1.0 if table == "on_board" else 1.0
    assert result.new.weight == pytest.approx(960.0 + sign * 20.0)
    assert result.new.lateral_arm == pytest.approx((-72.0 + sign * 20.0 * 8.0) / (960.0 + sign * 20.0))


def test_regression_a_weighing_said_its_first_problem_only():
    """An outside trial: readings with no lateral arm on a lateral aircraft and a fuel item of a tank the
    aircraft does not have were refused for the lateral arm alone; the unknown tank came only on the next
    try. Every problem of the readings with this aircraft is said at once, as validate says a file's."""
    aircraft = load_aircraft(sample("heli2/aircraft.toml"))
    readings = Readings.model_validate(
        {"point": _heli_points(), "on_board": [{"label": "fuel", "tank": "wing", "fuel": 5.0}]}
    )
    with pytest.raises(InputError) as refused:
        weigh(aircraft, readings)
    fields = [p.field for p in refused.value.problems]
    assert "point[0].lateral_arm" in fields and "on_board[0].tank" in fields, fields


def test_regression_the_readings_date_was_not_checked():
    # a weighing without a date, or dated after today or before the current record (2026-02-09), was
    # proposed with no refusal; the record carries the date of the work (14 CFR 43.9 (a) (2), from memory)
    import datetime as dt

    aircraft = load_aircraft(sample("trainer4/aircraft.toml"))
    data = sample_data("trainer4/weighing.toml")
    now = dt.datetime(2026, 12, 3, 8, 0, tzinfo=dt.UTC)  # the latest date on Earth is 2026-12-03 until 10:00 UTC
    expected = {
        None: ("no_date", False),
        "2030-01-01": ("future_date", False),
        "2026-12-04": ("future_date", False),
        "2020-01-01": ("date_before_current", True),
    }
    for date, (code, overridable) in expected.items():
        readings = Readings.model_validate({**data, "date": date})
        (refusal,) = weigh(aircraft, readings, now=now).refusals
        assert (refusal.code, refusal.overridable, refusal.field) == (code, overridable, "date"), date
    for date in ("2026-12-03", "2026-02-09"):
        assert weigh(aircraft, Readings.model_validate({**data, "date": date}), now=now).refusals == []


def test_regression_a_point_with_both_an_arm_and_a_wheel_read_as_if_neither_was_given(tmp_path):
    """Trial 9, item 12: ``arm = 170.0`` with ``wheel = "tail"`` was refused with "give the point's arm,
    or its wheel ...". Both given is its own refusal, naming both; neither given keeps its words."""
    from .helpers import assert_input_error, invoke

    data = sample_data("trainer4/weighing.toml")
    data["point"][1]["arm"] = 170.0
    with pytest.raises(
        ValueError, match=r"both the point's arm \(170\) and its wheel \('main'\) are given: give only one"
    ):
        Readings.model_validate(data)
    del data["point"][1]["arm"], data["point"][1]["wheel"]
    with pytest.raises(ValueError, match="give the point's arm, or its wheel"):
        Readings.model_validate(data)
    text = sample("trainer4/weighing.toml").read_text().replace('wheel = "nose"', 'wheel = "nose"\narm = -6.8', 1)
    text = text.replace('aircraft = "aircraft.toml"\n', "")  # kept away from its aircraft file
    readings = tmp_path / "w.toml"
    readings.write_text(text)
    result = invoke("weigh", str(sample("trainer4/aircraft.toml")), str(readings))
    assert_input_error(result, "point[0]: both the point's arm (-6.8) and its wheel ('nose') are given")
