"""The loading check on the sample aircraft: verdicts, findings, severities, burn path."""

from __future__ import annotations

import pytest

from loadcheck import check_loading, load_check_inputs
from loadcheck.errors import InputError, UnknownNameError
from loadcheck.files import parse_aircraft
from loadcheck.loading import Loading

from .helpers import sample, sample_data, simple_aircraft


def run(name: str):
    inputs = load_check_inputs(sample(name))
    return check_loading(inputs.aircraft, inputs.loading)


def codes(result) -> list[tuple[str, str, str | None]]:
    return [(f.code, f.severity, f.condition) for f in result.findings]


@pytest.mark.parametrize(
    "name", ["trainer4/within.toml", "tandem2/solo.toml", "twin6/within.toml", "tandem2/aft_ballast.toml"]
)
def test_within_limits(name):
    result = run(name)
    assert result.ok, result.findings
    assert all(f.severity == "warning" for f in result.findings)


def test_over_weight():
    result = run("trainer4/over_weight.toml")
    assert not result.ok
    found = codes(result)
    assert ("max_takeoff_weight", "limit", "takeoff") in found
    assert ("max_ramp_weight", "limit", "ramp") in found
    takeoff = next(f for f in result.findings if f.code == "max_takeoff_weight")
    assert takeoff.excess == pytest.approx(result.condition("takeoff").weight - 2450)


def _utility_aft(weight):
    # the sample's utility aft limit runs from 41.6 in at 2,290 lb to 42.4 in at 1,500 lb
    return 41.6 + (2290 - weight) / (2290 - 1500) * (42.4 - 41.6)


def test_utility_category_aft_limit():
    result = run("trainer4/utility_aft.toml")
    assert result.category == "utility"
    aft = [f for f in result.findings if f.code == "envelope" and f.condition == "takeoff"]
    takeoff = result.condition("takeoff")
    assert aft and aft[0].side == "aft" and aft[0].excess == pytest.approx(takeoff.arm - _utility_aft(takeoff.weight))
    # the same loading in the normal category is within limits
    inputs = load_check_inputs(sample("trainer4/utility_aft.toml"), category="normal")
    assert check_loading(inputs.aircraft, inputs.loading).ok


def test_baggage_group_limit():
    result = run("trainer4/baggage_group.toml")
    assert codes(result) == [("group_max", "limit", None)]
    assert result.findings[0].excess == pytest.approx(5.0)


def test_minimum_front_seat_weight():
    result = run("tandem2/light_solo.toml")
    assert codes(result) == [("station_min", "limit", None)]
    assert result.findings[0].excess == pytest.approx(55 - 115 * 0.45359237)


def test_aft_heavy_then_ballast():
    heavy = run("tandem2/aft_heavy.toml")
    assert not heavy.ok and {f.side for f in heavy.findings if f.code == "envelope"} == {"aft"}
    assert run("tandem2/aft_ballast.toml").ok


def test_non_convex_burn_path_leaves_between_inside_ends():
    result = run("twin6/leaves_path.toml")
    takeoff, landing = result.condition("takeoff"), result.condition("landing")
    assert takeoff.ok and landing.ok
    assert not result.burn_path.ok and not result.ok
    leave = result.burn_path.leaves_at
    assert leave is not None
    # it leaves on the forward limit just above the 5,000 lb corner (86.0 in there)
    assert 5000.0 < leave.weight < takeoff.weight
    assert leave.arm == pytest.approx(86.0, abs=0.01)
    assert leave.fuel_burned == pytest.approx(takeoff.weight - leave.weight)
    assert [f.code for f in result.findings] == ["burn_path"]


def test_only_zero_fuel_weight_fails():
    result = run("twin6/zero_fuel_heavy.toml")
    assert [c.condition for c in result.conditions if not c.ok] == ["zero_fuel"]
    assert codes(result) == [("max_zero_fuel_weight", "limit", "zero_fuel")]
    assert not result.ok


def test_zero_fuel_cg_is_a_warning_unless_the_file_says_limit():
    warned = run("tandem2/aft_ballast.toml")
    assert warned.ok
    assert codes(warned) == [("envelope", "warning", "zero_fuel")]
    assert not warned.condition("zero_fuel").ok
    data = sample_data("tandem2/aircraft.toml")
    data["limits"]["zero_fuel_cg"] = "limit"
    aircraft = parse_aircraft(data)
    inputs = load_check_inputs(sample("tandem2/aft_ballast.toml"))
    strict = check_loading(aircraft, inputs.loading)
    assert not strict.ok and codes(strict) == [("envelope", "limit", "zero_fuel")]


def test_ok_false_exactly_when_a_limit_finding_exists():
    for name in [
        "trainer4/within.toml",
        "trainer4/over_weight.toml",
        "tandem2/aft_ballast.toml",
        "twin6/leaves_path.toml",
        "twin6/zero_fuel_heavy.toml",
    ]:
        result = run(name)
        assert result.ok == (not any(f.severity == "limit" for f in result.findings))


def test_sequential_burn_empties_tanks_in_order(twin):
    loading = Loading(
        load={"row1": 380}, fuel={"mains": 100, "aux": 40}, burn={"taxi": 2, "trip": 50, "order": ["aux", "mains"]}
    )
    result = check_loading(twin, loading)
    assert result.condition("landing").fuel == pytest.approx(88.0)
    # the aux tank (aft, 104 in) empties first: landing moment has only mains fuel left
    landing = result.condition("landing")
    expected_fuel_moment = 88.0 * 6.0 * 95.0
    payload = 3680 * 84.5 + 380 * 88
    assert landing.moment == pytest.approx(payload + expected_fuel_moment)


def test_together_burn_is_proportional(twin):
    loading = Loading(load={"row1": 380}, fuel={"mains": 100, "aux": 40}, burn={"trip": 70})
    landing = check_loading(twin, loading).condition("landing")
    # half of each tank is left
    assert landing.moment == pytest.approx(3680 * 84.5 + 380 * 88 + 50 * 6 * 95 + 20 * 6 * 104)


def test_trip_time_and_rate(tandem):
    loading = Loading(load={"front": 80}, fuel={"wing": "full"}, burn={"trip_time": "1:30", "rate": 20})
    assert check_loading(tandem, loading).condition("landing").fuel == pytest.approx(50.0)


def test_fuel_as_mass_and_level(trainer):
    loading = Loading(load={"front": 200}, fuel={"mains": "120 lb"})
    assert check_loading(trainer, loading).condition("ramp").fuel == pytest.approx(20.0)
    loading = Loading(load={"front": 200}, fuel={"mains": "school"})
    assert check_loading(trainer, loading).condition("ramp").fuel == pytest.approx(30.0)


def test_reserve_warning(trainer):
    loading = Loading(load={"front": 200}, fuel={"mains": 20}, burn={"trip": 15, "reserve": 8})
    result = check_loading(trainer, loading)
    assert result.ok and ("reserve", "warning", "landing") in codes(result)


def test_ramp_may_exceed_envelope_top_up_to_max_ramp(trainer):
    # ramp weight between max takeoff (2,450) and max ramp (2,462): ramp is within limits
    loading = Loading(load={"front": 340, "rear": 134}, fuel={"mains": "full"}, burn={"taxi": 1.2, "trip": 10})
    result = check_loading(trainer, loading)
    ramp = result.condition("ramp")
    assert 2450 < ramp.weight <= 2462
    assert ramp.ok


@pytest.mark.parametrize(
    "loading, error, words",
    [
        (Loading(load={"frnt": 100}), UnknownNameError, "unknown station 'frnt'"),
        (Loading(fuel={"aux": 10}), UnknownNameError, "unknown tank 'aux'"),
        (Loading(fuel={"mains": "brim"}), UnknownNameError, "unknown fill level 'brim'"),
        (Loading(category="acrobatic"), UnknownNameError, "one of normal, utility"),
        (Loading(fuel={"mains": 45}), InputError, "above the tank's usable capacity"),
        (Loading(fuel={"mains": 10}, burn={"trip": 20}), InputError, "exceed the fuel"),
    ],
)
def test_loading_errors(trainer, loading, error, words):
    with pytest.raises(error, match=words):
        check_loading(trainer, loading)


def test_loading_syntax_errors():
    with pytest.raises(ValueError, match="negative"):
        Loading(load={"front": -1})
    with pytest.raises(ValueError):
        Loading(load={"front": float("nan")})
    with pytest.raises(ValueError, match="expected a mass"):
        Loading(load={"front": "3 usgal"})
    with pytest.raises(ValueError, match="a trip time needs a fuel rate"):
        Loading(burn={"trip_time": "1:00"})


def test_untold_tank_is_taken_as_empty_with_a_warning(twin):
    result = check_loading(twin, Loading(load={"row1": 300}, fuel={"mains": 50}))
    assert any(f.code == "assumption" and "aux" in f.message for f in result.findings)


def test_margins_on_simple_box():
    aircraft = simple_aircraft()
    result = check_loading(aircraft, Loading(load={"front": 200}))
    ramp = result.condition("ramp")
    assert ramp.margins.forward == pytest.approx(ramp.arm - 35.0)
    assert ramp.margins.aft == pytest.approx(48.0 - ramp.arm)
    assert ramp.margins.weight == pytest.approx(2000.0 - ramp.weight)


# regression (outside trial): where the vertical line at the CG missed the envelope, only the
# maximum weight counted, so a point above the envelope's top showed a positive weight margin
# beside the finding that it is above the top. The figures are worked by hand (FAA-H-8083-1B,
# chapter 2: CG = total moment / total weight) on the test box: empty 1000 lb at 40 in, front
# seat at 35 in, rear at 70 in, baggage at 95 in, envelope 35-48 in from 1200 to 2000 lb,
# maximum takeoff weight 2600 lb.
_OUTSIDE_CASES = [
    # load, weight [lb], CG [in], weight margin [lb]
    ({"rear": 1000, "bag": 100}, 2100.0, 119500 / 2100, -100.0),  # aft of the box and 100 lb above its top
    ({"rear": 400, "bag": 100}, 1500.0, 77500 / 1500, 0.0),  # aft of the box: no weight inside at that CG
    ({"front": 100}, 1100.0, 43500 / 1100, -100.0),  # inside in CG, 100 lb below the box's bottom
    ({"front": 500}, 1500.0, 57500 / 1500, 500.0),  # inside: 500 lb to the box's top
]


def _outside_box():
    return simple_aircraft(
        limits={"max_takeoff_weight": 2600.0},
        envelope=[
            {
                "category": "normal",
                "axes": ["arm", "weight"],
                "points": [[35, 1200], [35, 2000], [48, 2000], [48, 1200]],
            }
        ],
    )


def test_a_weight_margin_was_positive_beside_a_point_above_the_envelopes_top():
    from loadcheck.check import check_many
    from loadcheck.loading import resolve_loading

    aircraft = _outside_box()
    loadings = [Loading(load=load, fuel={"main": 0}) for load, *_ in _OUTSIDE_CASES]
    one_by_one = [check_loading(aircraft, loading) for loading in loadings]
    together = check_many(aircraft, [resolve_loading(loading, aircraft) for loading in loadings])  # the array path
    for (_, weight, cg, margin), single, batch in zip(_OUTSIDE_CASES, one_by_one, together, strict=True):
        for condition in ("ramp", "takeoff", "landing", "zero_fuel"):
            c = single.condition(condition)
            assert c.weight == pytest.approx(weight) and c.arm == pytest.approx(cg)
            assert c.margins.weight == pytest.approx(margin, abs=1e-9)
            assert batch.condition(condition).margins == c.margins
            if not c.ok:
                assert c.margins.weight <= 0
            assert single.to_dict()["conditions"][0]["margins"]["weight"] == pytest.approx(margin, abs=1e-9)


def test_a_zero_weight_margin_outside_the_envelope_is_marked_not_read_as_on_the_limit():
    from loadcheck.render.terminal import weight_margin

    aircraft = _outside_box()
    check = check_loading(aircraft, Loading(load={"rear": 400, "bag": 100}, fuel={"main": 0}))
    shown, marked = weight_margin(check.condition("takeoff"), check)
    assert marked and shown.endswith("(edge)")
    inside = check_loading(aircraft, Loading(load={"front": 500}, fuel={"main": 0}))
    assert weight_margin(inside.condition("takeoff"), inside) == ("500.0", False)


@pytest.mark.parametrize("name", ["trainer4", "twin6", "tandem2", "heli2"])
def test_no_margin_is_positive_beside_a_condition_outside_its_limits(name):
    # invariant (docs/computation.md, Margins): a condition inside its envelope and weight
    # limits has no margin below zero, and one outside them has no weight margin above zero
    # (a lateral envelope drawn against weight limits the weight too; every sample's is)
    from loadcheck.check import check_many
    from loadcheck.loading import resolve_loading

    from .helpers import random_loadings

    aircraft = parse_aircraft(sample_data(f"{name}/aircraft.toml"))
    stations, fuel, taxi, trip = random_loadings(aircraft, 80, seed=7, over=1.3)
    loadings = [
        resolve_loading(
            Loading(
                load={s.id: float(stations[i, j]) for j, s in enumerate(aircraft.station)},
                fuel={t.id: float(fuel[i, j]) for j, t in enumerate(aircraft.tank)},
                burn={"taxi": float(taxi[i]), "trip": float(trip[i])},
            ),
            aircraft,
        )
        for i in range(len(taxi))
    ]
    outside = 0
    for result in check_many(aircraft, loadings):
        for c in result.conditions:
            values = [v for v in (c.margins.forward, c.margins.aft, c.margins.left, c.margins.right, c.margins.weight)]
            if c.ok:
                assert all(v is None or v >= -1e-6 for v in values), (c.condition, c)
            else:
                outside += 1
                assert c.margins.weight is not None and c.margins.weight <= 1e-9, (c.condition, c)
    assert outside  # the random loadings reach outside the limits


def test_regression_a_weight_above_a_lateral_envelopes_top_showed_a_positive_weight_margin():
    """Only the longitudinal envelopes gave a weight margin, so a weight above a lateral envelope's
    top (the lateral envelope narrowing as weight grows) showed room to the maximum weight beside the
    finding that the point is outside. Worked by hand (moment method, FAA-H-8083-1B ch. 2; lateral CG
    likewise, ch. 7, from memory): the right seat at +10 in and a centre load at 0 give a lateral CG of
    10 x right / W; the lateral envelope's right edge runs from (3 in, 1,500 lb) to (1 in, 1,900 lb), so
    at a lateral CG of 2 in its top is 1,700 lb and its right limit at 1,650 lb is 3 - 150/200 = 2.25 in."""
    aircraft = simple_aircraft(
        empty={"weight": 1000.0, "arm": 40.0, "lateral_arm": 0.0},
        station=[
            {"id": "right", "arm": 40.0, "lateral_arm": 10.0, "kind": "seat"},
            {"id": "centre", "arm": 40.0, "lateral_arm": 0.0, "kind": "baggage"},
        ],
        tank=[{"id": "main", "arm": 40.0, "lateral_arm": 0.0, "usable": 40.0, "fuel": "avgas"}],
        envelope=[
            {"category": "normal", "axes": ["arm", "weight"], "points": [[35, 900], [35, 2000], [48, 2000], [48, 900]]},
            {
                "category": "normal",
                "label": "lateral",
                "axes": ["lateral_arm", "weight"],
                "points": [[-3, 900], [-3, 1500], [-1, 1900], [1, 1900], [3, 1500], [3, 900]],
            },
        ],
    )
    for right, centre, weight_margin, right_margin in ((360.0, 440.0, -100.0, None), (330.0, 320.0, 50.0, 0.25)):
        result = check_loading(aircraft, Loading(load={"right": right, "centre": centre}, fuel={"main": 0.0}))
        takeoff = result.condition("takeoff")
        assert takeoff.weight == pytest.approx(1000 + right + centre)
        assert takeoff.lateral_arm == pytest.approx(2.0)
        assert takeoff.ok == (weight_margin > 0)
        assert takeoff.margins.weight == pytest.approx(weight_margin, abs=1e-6)
        if right_margin is not None:
            assert takeoff.margins.right == pytest.approx(right_margin, abs=1e-6)
