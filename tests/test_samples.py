"""Every sample loading shows the situation its name and header comment describe (issue 17).

The sample aircraft are re-invented from time to time (docs/samples.md); these tests make sure
that each loading file still shows what it is named for, for the one reason it is there, so
that a re-invented aircraft cannot silently turn `aft_heavy.toml` into a loading that is
within limits, or `two_stretches.toml` into one stretch. Every verdict comes from the one
engine (check_loading, check_trip, most_fuel); the tests only read its answers.
"""

from __future__ import annotations

import re
import shlex

import pytest

from loadcheck import check_loading, load_check_inputs
from loadcheck.cli import app
from loadcheck.planning import most_fuel
from loadcheck.trip import check_trip

from .helpers import SAMPLES, sample


def _check(name: str, **overrides):
    inputs = load_check_inputs(sample(name), **overrides)
    return check_loading(inputs.aircraft, inputs.loading)


def _limits(result):
    return [f for f in result.findings if f.severity == "limit"]


def _within(result):
    assert result.ok and not _limits(result)
    assert not [f for f in result.findings if f.code == "assumption"]  # every tank and the trip given


def _trainer_within(result):
    _within(result)
    assert not result.findings  # the README's demo: no warning either


def _trainer_over_weight(result):
    assert not result.ok
    codes = {f.code for f in _limits(result)}
    assert {"max_ramp_weight", "max_takeoff_weight"} <= codes
    # only weight limits: the envelope findings are the weight above its top, never a CG side
    assert codes <= {"max_ramp_weight", "max_takeoff_weight", "max_landing_weight", "envelope"}
    assert all(f.side == "above" for f in _limits(result) if f.code == "envelope")


def _trainer_utility_aft(result):
    assert result.category == "utility" and not result.ok
    assert all(f.code == "envelope" and f.side == "aft" for f in _limits(result))
    assert _check("trainer4/utility_aft.toml", category="normal").ok  # fine in the normal category


def _trainer_baggage_group(result):
    # each station within its own limit, the rear seats and the hold together over theirs
    assert [(f.code, f.severity) for f in _limits(result)] == [("group_max", "limit")]
    assert "hold" in (_limits(result)[0].message.lower())


def _tandem_light_solo(result):
    assert [(f.code, f.severity) for f in _limits(result)] == [("station_min", "limit")]


def _tandem_aft_heavy(result):
    assert not result.ok and _limits(result)
    assert all(f.code == "envelope" and f.side == "aft" for f in _limits(result))


def _tandem_aft_ballast(result):
    # within limits, the zero-fuel CG aft of the envelope as a warning only
    assert result.ok
    assert [(f.code, f.severity, f.condition) for f in result.findings] == [("envelope", "warning", "zero_fuel")]
    assert result.condition("zero_fuel").ok is False


def _twin_leaves_path(result):
    # both ends inside, the burn path leaves between them
    assert result.condition("takeoff").ok and result.condition("landing").ok
    assert not result.burn_path.ok and not result.ok
    leave = result.burn_path.leaves_at
    assert (
        leave is not None
        and 0 < leave.fuel_burned_volume < result.condition("takeoff").fuel - result.condition("landing").fuel
    )


def _twin_two_stretches(result):
    # with the file's full fuel the flight stays aft of the corner: within limits
    _within(result)
    inputs = load_check_inputs(sample("twin6/two_stretches.toml"))
    answer = most_fuel(inputs.aircraft, inputs.loading)
    assert len(answer.intervals) == 2  # ramp fuel within limits is two separate stretches
    # fuel between them (mains filled first, the reverse of the burn order): both ends inside,
    # the burn path across the corner
    between = (answer.intervals[0].high + answer.intervals[1].low) / 2
    mains = min(between, inputs.aircraft.tank_by_id["mains"].usable)
    _twin_leaves_path(_check("twin6/two_stretches.toml", fuel={"mains": str(mains), "aux": str(between - mains)}))


def _twin_zero_fuel_heavy(result):
    assert [c.condition for c in result.conditions if not c.ok] == ["zero_fuel"]
    assert [(f.code, f.severity) for f in _limits(result)] == [("max_zero_fuel_weight", "limit")]


def _heli_heavy_left(result):
    assert not result.condition("ramp").ok  # from engine start
    assert {f.side for f in result.findings if f.code == "envelope"} == {"left"}
    assert all(f.code == "envelope" and "lateral" in (f.subject or "") for f in _limits(result))


def _heli_solo_heavy_right(result):
    # inside at engine start and takeoff; the burn moves the lateral CG right, out before landing
    assert result.condition("ramp").ok and result.condition("takeoff").ok
    assert not result.burn_path.ok and not result.condition("landing").ok
    assert all(f.code == "envelope" and f.side == "right" and "lateral" in (f.subject or "") for f in _limits(result))
    assert all(c.margins.forward > 0 and c.margins.aft > 0 for c in result.conditions)


SITUATIONS = {
    "trainer4/within.toml": _trainer_within,
    "trainer4/over_weight.toml": _trainer_over_weight,
    "trainer4/utility_aft.toml": _trainer_utility_aft,
    "trainer4/baggage_group.toml": _trainer_baggage_group,
    "tandem2/solo.toml": _within,
    "tandem2/light_solo.toml": _tandem_light_solo,
    "tandem2/aft_heavy.toml": _tandem_aft_heavy,
    "tandem2/aft_ballast.toml": _tandem_aft_ballast,
    "twin6/within.toml": _within,
    "twin6/leaves_path.toml": _twin_leaves_path,
    "twin6/two_stretches.toml": _twin_two_stretches,
    "twin6/zero_fuel_heavy.toml": _twin_zero_fuel_heavy,
    "heli2/dual.toml": _within,
    "heli2/solo.toml": _within,
    "heli2/heavy_left.toml": _heli_heavy_left,
    "heli2/solo_heavy_right.toml": _heli_solo_heavy_right,
}
NOT_LOADINGS = {"aircraft.toml", "weighing.toml", "changes.toml"}
TRIPS = {"heli2/trip_drop_off.toml"}


def test_every_sample_loading_has_its_situation_here():
    found = {str(p.relative_to(SAMPLES)) for p in SAMPLES.glob("*/*.toml") if p.name not in NOT_LOADINGS}
    assert found == set(SITUATIONS) | TRIPS


@pytest.mark.parametrize("name", sorted(SITUATIONS))
def test_each_sample_loading_shows_its_situation(name):
    SITUATIONS[name](_check(name))


def test_the_drop_off_trip_is_within_on_both_legs_and_carries_its_fuel_over():
    inputs = load_check_inputs(sample("heli2/trip_drop_off.toml"), allow_trip=True)
    result = check_trip(inputs.aircraft, inputs.trip)
    assert result.ok and len(result.legs) == 2 and not [f for f in result.findings if f.severity == "limit"]
    first, second = (leg.check for leg in result.legs)
    # the passenger and their bag stay at the site; leg 2 starts with leg 1's landing fuel plus 5 US gal
    assert second.condition("ramp").weight < first.condition("landing").weight
    assert second.condition("ramp").fuel == pytest.approx(first.condition("landing").fuel + 5)


README = (SAMPLES.parent / "README.md").read_text(encoding="utf-8")


def _tour_commands_with_exit_codes():
    """The README tour's `loadcheck check` lines whose comment names the exit status."""
    block = README[README.index("## A short tour") :]
    block = block[block.index("```sh") + 5 : block.index("```", block.index("```sh") + 5)]
    joined = re.sub(r"\\\n\s*", " ", block)
    for line in joined.splitlines():
        match = re.match(r"^loadcheck (check .*?)\s+# exit (\d)", line.strip())
        if match:
            yield match.group(1), int(match.group(2))


def test_the_readme_tour_quotes_the_exit_status_the_samples_give(runner):
    commands = list(_tour_commands_with_exit_codes())
    assert len(commands) >= 2
    for command, status in commands:
        args = shlex.split(command)
        result = runner.invoke(app, [str(SAMPLES.parent / a) if a.startswith("sample_aircraft/") else a for a in args])
        assert result.exit_code == status, (command, result.output)


def test_the_readme_demo_check_is_within_limits(runner):
    # the first command a reader runs (Set up): the trainer's within.toml, exit 0
    assert "sample_aircraft/trainer4/aircraft.toml sample_aircraft/trainer4/within.toml" in README
    result = runner.invoke(app, ["check", str(sample("trainer4/aircraft.toml")), str(sample("trainer4/within.toml"))])
    assert result.exit_code == 0 and "WITHIN LIMITS" in result.output
