"""Lateral balance and tanks whose arm moves with the fuel (issue: two-axis balance)."""

from __future__ import annotations

import copy

import pytest
from hypothesis import given, settings
from hypothesis import strategies as st

from loadcheck import check_loading, load_check_inputs
from loadcheck.files import parse_aircraft
from loadcheck.loading import Loading

from .helpers import examples, sample, sample_data, simple_aircraft

HELI = sample_data("heli2/aircraft.toml")


def run(name: str):
    inputs = load_check_inputs(sample(name))
    return check_loading(inputs.aircraft, inputs.loading)


@pytest.mark.parametrize("name", ["heli2/dual.toml", "heli2/solo.toml"])
def test_helicopter_within_limits(name):
    result = run(name)
    assert result.ok
    assert all(c.lateral_arm is not None for c in result.conditions)
    assert all(i.lateral_arm is not None for i in result.items)


def test_heavy_solo_on_the_right_fails_only_laterally():
    result = run("heli2/solo_heavy_right.toml")
    assert not result.ok
    limits = [f for f in result.findings if f.severity == "limit"]
    assert limits and all(f.code == "envelope" and f.side == "right" and "lateral" in (f.subject or "") for f in limits)
    assert "right of the right limit" in limits[0].message
    # the longitudinal margins hold everywhere
    assert all(c.margins.forward > 0 and c.margins.aft > 0 for c in result.conditions)
    assert not result.burn_path.ok


def test_heavy_solo_on_the_left_is_left_of_the_limit():
    result = run("heli2/heavy_left.toml")
    sides = {f.side for f in result.findings if f.code == "envelope"}
    assert sides == {"left"}


def test_lateral_moment_by_hand():
    result = run("heli2/dual.toml")
    ramp = result.condition("ramp")
    # 962*0.4 + 170*-13.0 + 190*13.0 + 10*-19.0 + 192*-11.5
    expected = 962 * 0.4 - 2210.0 + 2470.0 - 190.0 - 2208.0
    assert ramp.lateral_moment == pytest.approx(expected)
    assert ramp.lateral_arm == pytest.approx(expected / ramp.weight)


def _mirror(data):
    out = copy.deepcopy(data)
    out["empty"]["lateral_arm"] = -out["empty"]["lateral_arm"]
    for item in out["station"] + out["tank"]:
        item["lateral_arm"] = -item["lateral_arm"]
    for envelope in out["envelope"]:
        if envelope["axes"][0] == "lateral_arm":
            envelope["points"] = [[-x, y] for x, y in envelope["points"]]
    return out


MIRRORED = parse_aircraft(_mirror(HELI))
HELICOPTER = parse_aircraft(HELI)

heli_loadings = st.fixed_dictionaries(
    {
        "left": st.floats(0, 250),
        "right": st.floats(0, 250),
        "bag_left": st.floats(0, 35),
        "bag_right": st.floats(0, 35),
        "fuel": st.floats(2, 32.0),
        "trip": st.floats(0, 1),
    }
)


def _heli_loading(v, swap=False):
    load = {"left": v["left"], "right": v["right"], "bag_left": v["bag_left"], "bag_right": v["bag_right"]}
    return Loading(load=load, fuel={"main": v["fuel"]}, burn={"taxi": 0.5, "trip": (v["fuel"] - 0.5) * v["trip"]})


@settings(max_examples=examples(100), deadline=None)
@given(heli_loadings)
def test_mirroring_lateral_arms_mirrors_the_lateral_cg(values):
    a = check_loading(HELICOPTER, _heli_loading(values))
    b = check_loading(MIRRORED, _heli_loading(values))
    for x, y in zip(a.conditions, b.conditions, strict=True):
        assert y.lateral_arm == pytest.approx(-x.lateral_arm, abs=1e-12)
        assert y.arm == x.arm and y.weight == x.weight
        assert (y.margins.left, y.margins.right) == (pytest.approx(x.margins.right), pytest.approx(x.margins.left))
        assert y.ok == x.ok
    assert a.ok == b.ok and a.burn_path.ok == b.burn_path.ok
    flip = {"left": "right", "right": "left"}
    assert sorted((f.code, f.condition, flip.get(f.side, f.side)) for f in a.findings) == sorted(
        (f.code, f.condition, f.side) for f in b.findings
    )


@settings(max_examples=examples(100), deadline=None)
@given(st.floats(30, 60), st.floats(0, 40), st.floats(0, 1), st.sampled_from(["together", "sequence"]))
def test_constant_arm_table_equals_fixed_arm(arm, fuel, share, order):
    fixed = simple_aircraft(
        tank=[
            {"id": "main", "arm": arm, "usable": 40, "fuel": "avgas"},
            {"id": "aux", "arm": 50.0, "usable": 10, "fuel": "avgas"},
        ]
    )
    table = simple_aircraft(
        tank=[
            {"id": "main", "arm_table": [[0, arm], [15, arm], [40, arm]], "usable": 40, "fuel": "avgas"},
            {"id": "aux", "arm": 50.0, "usable": 10, "fuel": "avgas"},
        ]
    )
    burn = {"trip": (fuel + 5) * share, "order": "together" if order == "together" else ["main", "aux"]}
    loading = Loading(load={"front": 200}, fuel={"main": fuel, "aux": 5}, burn=burn)
    first, second = check_loading(fixed, loading), check_loading(table, loading)
    a, b = first.to_dict(), second.to_dict()
    assert a == b | {"aircraft": a["aircraft"]}
    # the drawing samples may differ in the last bits (the table cuts the path into more pieces)
    for x, y in zip(first.burn_path.samples, second.burn_path.samples, strict=True):
        assert x.to_dict() == pytest.approx(y.to_dict(), rel=1e-12, abs=1e-9)


def _sump(table: bool):
    tank = {"id": "main", "usable": 40, "fuel": "avgas"}
    if table:
        tank["arm_table"] = [[0, 45.0], [20, -40.0], [40, 45.0]]
    else:
        tank["arm"] = 45.0
    return simple_aircraft(tank=[tank])


def test_burn_path_that_only_the_variable_arm_pushes_out():
    loading = Loading(load={"front": 200}, fuel={"main": 40}, burn={"taxi": 0, "trip": 35})
    fixed, moving = check_loading(_sump(False), loading), check_loading(_sump(True), loading)
    assert fixed.ok and fixed.burn_path.ok
    assert moving.condition("takeoff").ok and moving.condition("landing").ok
    assert not moving.burn_path.ok and not moving.ok
    leave = moving.burn_path.leaves_at
    assert leave is not None and leave.arm == pytest.approx(35.0, abs=1e-6)
    # it leaves on the way down to the 20 gal point, where the fuel's arm is furthest forward
    assert 20.0 < leave.fuel_remaining_volume < 40.0
    assert [f.code for f in moving.findings] == ["burn_path"]


def test_arm_table_in_the_moment_table():
    aircraft = _sump(True)
    result = check_loading(aircraft, Loading(load={"front": 200}, fuel={"main": 10}))
    fuel = next(i for i in result.items if i.kind == "fuel")
    assert fuel.arm == pytest.approx(45.0 + (-85.0) * 10 / 20)


# -- issue 16: a lateral envelope drawn as lateral moment, and trips -----------------------------

from loadcheck.trip import check_trip  # noqa: E402

from .test_trip import HANDBOOK_HELICOPTER  # noqa: E402


def _mirror_moment(data):
    """Every lateral arm and the lateral-moment envelope mirrored about butt line 0."""
    out = copy.deepcopy(data)
    out["empty"]["lateral_arm"] = -out["empty"]["lateral_arm"]
    for item in out["station"] + out["tank"]:
        item["lateral_arm"] = -item["lateral_arm"]
    for envelope in out["envelope"]:
        if envelope["axes"][0] == "lateral_moment":
            envelope["points"] = [[-x, y] for x, y in envelope["points"]]
    return out


HANDBOOK = parse_aircraft(HANDBOOK_HELICOPTER)
HANDBOOK_MIRRORED = parse_aircraft(_mirror_moment(HANDBOOK_HELICOPTER))


@settings(max_examples=examples(60), deadline=None)
@given(st.floats(0, 300), st.floats(0, 300), st.floats(5, 48), st.floats(0, 1), st.floats(0, 1))
def test_mirroring_every_lateral_arm_mirrors_a_trips_lateral_results(pilot, passenger, fuel, first, second):
    # FAA-H-8083-1B ch. 8 layout (published arms), invented limits: see tests/test_trip.py
    trip1 = (fuel - 1) * first
    data = {
        "load": {"pilot_seat": pilot, "passenger_seat": passenger},
        "fuel": {"main": fuel},
        "burn": {"taxi": 0.5, "trip": trip1},
        "leg": [{"load": {"passenger_seat": 0}, "burn": {"taxi": 0, "trip": (fuel - 0.5 - trip1) * second}}],
    }
    a, b = (
        check_trip(HANDBOOK, Loading.model_validate(data)),
        check_trip(HANDBOOK_MIRRORED, Loading.model_validate(data)),
    )
    assert a.ok == b.ok
    flip = {"left": "right", "right": "left"}
    for x, y in zip(a.legs, b.legs, strict=True):
        assert x.check.ok == y.check.ok and x.check.burn_path.ok == y.check.burn_path.ok
        for p, q in zip(x.check.conditions, y.check.conditions, strict=True):
            assert q.lateral_moment == pytest.approx(-p.lateral_moment, abs=1e-9)
            assert q.lateral_arm == pytest.approx(-p.lateral_arm, abs=1e-12)
            assert (q.weight, q.arm, q.ok) == (p.weight, p.arm, p.ok)
    assert sorted((f.leg, f.code, f.condition, flip.get(f.side, f.side)) for f in a.findings) == sorted(
        (f.leg, f.code, f.condition, f.side) for f in b.findings
    )
