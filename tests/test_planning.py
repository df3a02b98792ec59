"""Planning answers checked against brute force with the plain check, a published
weight-shift example, the two-stretch case and impossible requests."""

from __future__ import annotations

import json
import tempfile
from dataclasses import replace
from pathlib import Path

import numpy as np
import pytest
from hypothesis import HealthCheck, given, settings
from hypothesis import strategies as st

from loadcheck import check_loading, load_check_inputs
from loadcheck import planning as P
from loadcheck.cli import app
from loadcheck.display import round_safe
from loadcheck.errors import InputError, UnknownNameError
from loadcheck.files import parse_aircraft
from loadcheck.loading import BurnPlan, Loading, resolve_loading

from .helpers import TRIAL_GULL, examples, invoke, sample, simple_aircraft, write_file

TRAINER = load_check_inputs(sample("trainer4/within.toml")).aircraft
TWIN = load_check_inputs(sample("twin6/within.toml")).aircraft


def _ok(aircraft, loading) -> bool:
    try:
        return check_loading(aircraft, loading).ok
    except ValueError:
        return False


def _filled(aircraft, loading, fill, total):
    """``loading`` with ``total`` ramp fuel [fuel volume unit], put in as docs/planning.md says a fuel
    answer fills the tanks: each tank of ``fill`` full before the next, the other tanks keeping their
    fuel; with no order, every tank in proportion to its usable capacity. Written from the docs, not
    from planning's own filling, so that the brute-force checks test the answers against an
    independent filling."""
    fuel = dict(loading.fuel)
    if fill is None:
        capacity = sum(t.usable for t in aircraft.tank)
        fuel = {t.id: min(total, capacity) * t.usable / capacity for t in aircraft.tank}
    else:
        left = total
        for name in fill:
            fuel[name] = min(max(left, 0.0), aircraft.tank_by_id[name].usable)
            left -= fuel[name]
    return replace(loading, fuel=fuel, plan=BurnPlan(fuel, loading.plan.order))


def _brute(aircraft, make, low, high, n=301):
    """Feasible grid values found with the plain single check."""
    return [x for x in np.linspace(low, high, n) if _ok(aircraft, make(x))]


trainer_loads = st.fixed_dictionaries(
    {
        "front": st.floats(120, 420),
        "rear": st.floats(0, 380),
        "hold": st.floats(0, 120),
        "trip": st.floats(0, 30),
        "category": st.sampled_from(["normal", "utility"]),
    }
)


@settings(max_examples=examples(8), deadline=None, suppress_health_check=[HealthCheck.too_slow])
@given(trainer_loads)
def test_most_fuel_agrees_with_brute_force_and_is_never_unsafe(v):
    loading = resolve_loading(
        Loading(
            category=v["category"],
            load={k: v[k] for k in ("front", "rear", "hold")},
            fuel={"mains": 44, "centre": 12},
            burn={"taxi": 1, "trip": v["trip"]},
        ),
        TRAINER,
    )
    answer = P.most_fuel(TRAINER, loading)
    fill = lambda x: _filled(TRAINER, loading, None, x)  # noqa: E731
    feasible = _brute(TRAINER, fill, 0.0, 56.0)
    if not feasible:
        grid_step = 56.0 / 300
        assert answer.answer is None or answer.intervals[-1].high - answer.intervals[-1].low < 2 * grid_step
        return
    assert answer.answer is not None
    # never on the unsafe side: the answer and its displayed rounding are within limits
    assert _ok(TRAINER, fill(answer.answer))
    assert _ok(TRAINER, fill(round_safe(answer.answer, 1, "down")))
    # and not short of the brute-force best by more than the tolerance (0.1 lb = 0.017 gal)
    assert answer.answer >= max(feasible) - 0.1 / 6.0


twin_loads = st.fixed_dictionaries(
    {
        "row1": st.floats(150, 440),
        "row2": st.floats(0, 440),
        "row3": st.floats(0, 400),
        "nose": st.floats(0, 250),
        "aft": st.floats(0, 200),
        "trip": st.floats(5, 80),
        "order": st.sampled_from([["aux", "mains"], "together"]),
    }
)


@settings(max_examples=examples(6), deadline=None, suppress_health_check=[HealthCheck.too_slow])
@given(twin_loads, st.sampled_from(["row1", "row3", "nose", "aft"]))
def test_most_payload_agrees_with_brute_force(v, station):
    load = {k: v[k] for k in ("row1", "row2", "row3", "nose", "aft")}
    loading = resolve_loading(
        Loading(load=load, fuel={"mains": 100, "aux": 40}, burn={"taxi": 2, "trip": v["trip"], "order": v["order"]}),
        TWIN,
    )
    answer = P.most_payload(TWIN, loading, station)
    top = TWIN.station_by_id[station].max_weight
    make = lambda x: loading.but(stations={**loading.stations, station: x})  # noqa: E731
    feasible = _brute(TWIN, make, 0.0, top, 201)
    if answer.answer is None:
        assert not feasible
        return
    assert _ok(TWIN, make(answer.answer)) and _ok(TWIN, make(round_safe(answer.answer, 1, "down")))
    if feasible:
        assert answer.answer >= max(feasible) - 0.1


def test_two_stretches_of_fuel_on_the_non_convex_envelope():
    inputs = load_check_inputs(sample("twin6/two_stretches.toml"))
    answer = P.most_fuel(inputs.aircraft, inputs.loading)
    assert len(answer.intervals) == 2
    (a, b), (c, d) = ((i.low, i.high) for i in answer.intervals)
    assert a < b < c < d
    fill = lambda x: _filled(inputs.aircraft, inputs.loading, ["mains", "aux"], x)  # noqa: E731
    for x in (a, b, c, d, (a + b) / 2, (c + d) / 2):
        assert _ok(inputs.aircraft, fill(x))
    gap = check_loading(inputs.aircraft, fill((b + c) / 2))
    assert not gap.ok and not gap.burn_path.ok
    # brute force finds the same two stretches
    grid = np.linspace(0, 140, 1401)
    good = np.array([_ok(inputs.aircraft, fill(x)) for x in grid])
    assert np.count_nonzero(np.diff(good.astype(int)) == 1) + int(good[0]) == 2


def test_published_weight_shift_example():
    # FAA-H-8083-25 (Pilot's Handbook of Aeronautical Knowledge), Weight and Balance
    # chapter, weight shifting: 7,800 lb at CG 81.5 in, aft limit 80.5 in; cargo moved from
    # station 150 to station 30. Weight shifted = 7,800 x 1.0 / 120 = 65 lb.
    aircraft = parse_aircraft(
        {
            "name": "Shift example",
            "units": {"mass": "lb", "arm": "in", "fuel_volume": "usgal"},
            "empty": {"weight": 7300.0, "arm": (7800 * 81.5 - 500 * 150) / 7300},
            "limits": {"max_takeoff_weight": 8000},
            "station": [{"id": "fwd", "arm": 30.0, "kind": "cargo"}, {"id": "aft", "arm": 150.0, "kind": "cargo"}],
            "envelope": [
                {
                    "category": "normal",
                    "axes": ["arm", "weight"],
                    "points": [[70.0, 5000], [70.0, 8000], [80.5, 8000], [80.5, 5000]],
                }
            ],
        }
    )
    loading = resolve_loading(Loading(load={"aft": 500}), aircraft)
    assert check_loading(aircraft, loading).condition("takeoff").arm == pytest.approx(81.5)
    to_limit = P.weight_shift(aircraft, loading, "aft", "fwd", target_arm=80.5)
    assert to_limit.answer == pytest.approx(65.0, abs=1e-9)
    assert to_limit.check.condition("takeoff").arm == pytest.approx(80.5)
    least = P.weight_shift(aircraft, loading, "aft", "fwd")
    assert least.answer == pytest.approx(65.0, abs=0.1) and least.check.ok


def test_ballast_brings_the_tandem_within_limits():
    inputs = load_check_inputs(sample("tandem2/aft_heavy.toml"))
    answer = P.least_ballast(inputs.aircraft, inputs.loading)
    assert answer.feasible and answer.check.ok
    less = inputs.loading.but(stations={**inputs.loading.stations, "ballast": answer.answer - 0.2})
    assert not check_loading(inputs.aircraft, less).ok
    # ballast aft of the CG cannot help an aft CG
    wrong = P.least_ballast(inputs.aircraft, inputs.loading, "baggage")
    assert not wrong.feasible and "no amount can" in wrong.answer_display


def test_longest_trip_and_fuel_to_leave():
    inputs = load_check_inputs(sample("trainer4/within.toml"))
    trip = P.longest_trip(inputs.aircraft, inputs.loading, rate=9.5, reserve=8.0)
    fuel = P.most_fuel(inputs.aircraft, inputs.loading)
    # the trip is flown with the ramp fuel shown (rounded down), less taxi fuel and reserve
    shown = float(fuel.answer_display.split()[0])
    assert trip.answer == pytest.approx(shown - inputs.loading.taxi - 8.0, abs=0.02)
    minutes = int(trip.answer / 9.5 * 60)  # rounded down: never more time than the fuel gives
    assert trip.extra["time at the rate"] == f"{minutes // 60}:{minutes % 60:02d}"
    # 195 lb: with 220 lb the fuel within limits no longer lands with the loading's reserve of 8 usgal
    leave = P.fuel_to_leave(inputs.aircraft, inputs.loading, "rear", 195.0)
    assert leave.feasible and leave.answer > 0
    lighter = _filled(
        inputs.aircraft,
        inputs.loading.but(stations={**inputs.loading.stations, "rear": 195.0}),
        None,
        sum(inputs.loading.fuel.values()) - leave.answer,
    )
    assert check_loading(inputs.aircraft, lighter).ok


def test_impossible_requests():
    inputs = load_check_inputs(sample("trainer4/within.toml"))
    with pytest.raises(UnknownNameError, match="unknown station 'cargo'"):
        P.most_payload(inputs.aircraft, inputs.loading, "cargo")
    with pytest.raises(InputError, match="no ballast station"):
        P.least_ballast(inputs.aircraft, inputs.loading)
    far = P.weight_shift(inputs.aircraft, inputs.loading, "hold", "front", target_arm=10.0)
    assert not far.feasible and "no solution" in far.answer_display


@pytest.mark.parametrize(
    "args, code, words",
    [
        (["plan", "payload", "trainer4/within.toml", "--station", "nowhere"], 2, "unknown station"),
        (["plan", "ballast", "trainer4/within.toml"], 2, "no ballast station"),
        (["plan", "ballast", "tandem2/aft_heavy.toml", "--station", "baggage"], 1, "no amount can"),
        (
            ["plan", "shift", "tandem2/aft_heavy.toml", "--from", "baggage", "--to", "front", "--target", "2 m"],
            1,
            "no solution",
        ),
        (["plan", "fuel", "twin6/two_stretches.toml"], 0, "more than one stretch"),
        (["plan", "ballast", "tandem2/aft_heavy.toml"], 0, "Least ballast at Firewall ballast box"),
        (["plan", "payload", "trainer4/within.toml"], 2, "--station"),
    ],
)
def test_plan_command_line(runner, args, code, words):
    args = [str(sample(a)) if a.endswith(".toml") else a for a in args]
    result = runner.invoke(app, args)
    assert result.exit_code == code, result.output
    assert words in result.output
    assert "Traceback" not in result.output


def test_plan_table_and_chart(runner, tmp_path):
    result = runner.invoke(
        app,
        [
            "plan",
            "table",
            str(sample("trainer4/within.toml")),
            "--station",
            "rear",
            "--steps",
            "4",
            "--chart",
            str(tmp_path / "t.svg"),
        ],
    )
    assert result.exit_code == 0, result.output
    assert "Most ramp fuel" in result.output
    assert 'id="within-limits' in (tmp_path / "t.svg").read_text()
    as_json = runner.invoke(
        app, ["plan", "table", str(sample("trainer4/within.toml")), "--station", "rear", "--steps", "3", "--json"]
    )
    table = json.loads(as_json.stdout)
    assert table["station"] == "rear" and len(table["rows"]) == 3
    assert table["units"]["mass"] == "lb" and "flight manual" in table["caution"]


# -- one verdict: regressions of answers the full check rejected ------------------------------


def test_plan_leave_answers_fuel_left_behind_not_ramp_fuel():
    # regression: the stretches labelled "fuel left behind" were stretches of ramp fuel;
    # leaving behind what a stretch allowed put the aircraft over its maximum ramp weight
    # (200 lb: with 300 lb no fuel within limits lands with the loading's reserve)
    inputs = load_check_inputs(sample("twin6/within.toml"))
    aircraft, loading = inputs.aircraft, inputs.loading
    now = sum(loading.fuel.values())
    answer = P.fuel_to_leave(aircraft, loading, "row3", 200.0)
    assert answer.feasible and answer.check.ok
    assert all(0.0 <= i.low <= i.high <= now for i in answer.intervals)
    ramp = answer.check.condition("ramp")
    assert ramp.weight <= aircraft.limits.ramp
    assert ramp.fuel == pytest.approx(now - float(answer.answer_display.split()[0]), abs=1e-6)
    with_payload = loading.but(stations={**loading.stations, "row3": 200.0})
    for interval in answer.intervals:  # every amount the answer allows leaving behind is within limits
        for leave in (interval.low, interval.high, 0.5 * (interval.low + interval.high)):
            assert _ok(aircraft, _filled(aircraft, with_payload, ["mains", "aux"], now - leave))
    # leaving less than the answer is not enough
    assert not _ok(aircraft, _filled(aircraft, with_payload, ["mains", "aux"], now - answer.answer + 0.2))


def test_plan_shift_to_a_target_respects_the_seat_maximum(runner):
    # regression: a shift to a target CG proposed 332.9 lb for a seat whose maximum is
    # 250 lb, exited 0 and said nothing about the seat
    aircraft = parse_aircraft(
        {
            "name": "Shift box",
            "units": {"mass": "lb", "arm": "in", "fuel_volume": "usgal"},
            "empty": {"weight": 1200.0, "arm": 40.0},
            "limits": {"max_takeoff_weight": 2200},
            "station": [
                {"id": "front", "arm": 37.0, "kind": "seat", "max_weight": 400},
                {"id": "rear", "arm": 73.0, "kind": "seat", "max_weight": 250},
            ],
            "envelope": [
                {
                    "category": "normal",
                    "axes": ["arm", "weight"],
                    "points": [[30, 1000], [30, 2200], [55, 2200], [55, 1000]],
                }
            ],
        }
    )
    loading = resolve_loading(Loading(load={"front": 400, "rear": 0}), aircraft)
    answer = P.weight_shift(aircraft, loading, "front", "rear", target_arm=46.0)
    assert not answer.feasible and "maximum" in answer.answer_display and "rear" in answer.answer_display
    assert answer.check is not None and not answer.check.ok
    path = Path(tempfile.mkdtemp()) / "shift.toml"
    path.write_text("format = 1\n[load]\nfront = 400\n")
    files = Path(path.parent / "box.toml")
    files.write_text(_toml_of(aircraft))
    out = runner.invoke(
        app, ["plan", "shift", str(files), str(path), "--from", "front", "--to", "rear", "--target", "46"]
    )
    assert out.exit_code == 1 and "maximum" in out.output and "within limits." not in out.output


def _toml_of(aircraft) -> str:
    import tomlkit

    return tomlkit.dumps(aircraft.model_dump(mode="json", exclude_none=True, exclude_defaults=True))


def test_plan_reason_for_a_station_over_its_maximum_is_that_station():
    # regression: a station over its own maximum was reported as five "limited by" reasons
    inputs = load_check_inputs(sample("twin6/within.toml"))
    loading = inputs.loading.but(stations={**inputs.loading.stations, "row3": 405.0})
    answer = P.most_fuel(inputs.aircraft, loading)
    assert not answer.feasible
    assert answer.governing.count(";") == 0 and "exceeds the maximum 400.0 lb by 5.0 lb" in answer.governing


def test_plan_fuel_without_any_fuel_given_answers_with_the_taxi_and_trip(runner):
    # regression (issue 20): a loading with no fuel entry but taxi and trip was refused
    # (exit 2); "how much fuel can I take" is asked before any fuel is chosen
    args = [
        "plan",
        "fuel",
        str(sample("trainer4/aircraft.toml")),
        "--load",
        "front=340",
        "--load",
        "rear=150",
        "--taxi",
        "1.2",
        "--trip",
        "18",
        "--json",
    ]
    out = runner.invoke(app, args)
    assert out.exit_code == 0, out.output
    answer = json.loads(out.stdout)
    assert answer["feasible"] and answer["check"]["ok"]
    # the taxi and trip are the ones given, and the lowest fuel allowed covers them
    ramp, takeoff, landing = (
        next(c for c in answer["check"]["conditions"] if c["condition"] == n) for n in ("ramp", "takeoff", "landing")
    )
    assert ramp["fuel"] - takeoff["fuel"] == pytest.approx(1.2) and takeoff["fuel"] - landing["fuel"] == pytest.approx(
        18.0
    )
    assert answer["intervals"][0]["low"] >= 19.2 - 1e-6
    # the single check of the same loading still refuses it: the fuel does not cover the burn
    assert runner.invoke(app, ["check", *args[2:-1]]).exit_code == 2


def test_plan_table_chart_shows_only_the_fuel_each_row_allows():
    # regression: each row was drawn as a bar centred on its payload, so between rows the
    # chart showed more fuel than plan fuel allows for that payload, and bars began at a
    # negative payload
    from loadcheck.render.chart import fuel_payload_figure

    inputs = load_check_inputs(sample("trainer4/within.toml"))
    table = P.fuel_payload_table(inputs.aircraft, inputs.loading, "rear", steps=5)
    figure = fuel_payload_figure(inputs.aircraft, table)
    (ax,) = figure.axes
    (bars,) = [c for c in ax.collections if c.get_gid() == "within-limits"]
    drawn = sorted((float(s[0][0]), float(s[0][1]), float(s[1][1])) for s in bars.get_segments())
    allowed = sorted((r.payload, i.low, i.high) for r in table.rows for i in r.intervals)
    assert len(drawn) == len(allowed)
    assert [x for row in drawn for x in row] == pytest.approx([x for row in allowed for x in row])
    assert all(s[0][0] == s[1][0] >= 0.0 for s in bars.get_segments())  # a bar at one payload, never negative
    for row in table.rows:  # each row's most fuel passed the full check
        if row.most is not None:
            answer = P.most_fuel(
                inputs.aircraft,
                inputs.loading.but(
                    stations={
                        **inputs.loading.stations,
                        "rear": inputs.loading.stations.get("rear", 0.0) + row.payload,
                    },
                ),
            )
            assert answer.feasible and answer.check.ok and answer.answer == pytest.approx(row.most)


def test_plan_table_stretches_started_at_zero_landing_fuel_against_the_reserve():
    # regression (outside review): plan table trainer4/within.toml --station rear gave stretches of ramp fuel
    # whose low end landed with 0 usgal against the loading's reserve of 8 usgal; each row's low end now covers
    # taxi, trip and reserve (1.2 + 18 + 8 = 27.2 usgal, the file's [burn]), and each row carries its check
    inputs = load_check_inputs(sample("trainer4/within.toml"))
    loading = inputs.loading
    table = P.fuel_payload_table(inputs.aircraft, loading, "rear", steps=3)
    floor = loading.taxi + loading.trip + loading.reserve
    assert floor == pytest.approx(27.2)
    rows = [r for r in table.rows if r.most is not None]
    assert rows
    for row in rows:
        assert row.intervals[0].low >= floor - 0.01
        assert row.check is not None and row.check.ok
        assert not any(f.code == "reserve" for f in row.check.findings)
    # the low end itself: a loading just above it lands with the reserve, one 0.2 usgal below warns
    low = rows[0].intervals[0].low
    at = check_loading(inputs.aircraft, _filled(inputs.aircraft, loading, None, low + 0.05))
    assert not any(f.code == "reserve" for f in at.findings)
    under = check_loading(inputs.aircraft, _filled(inputs.aircraft, loading, None, low - 0.2))
    assert any(f.code == "reserve" for f in under.findings)


def test_regression_a_misspelt_planning_station_got_no_spelling_hint():
    # `plan payload --station frnt` said "unknown station 'frnt'" where a check's --load frnt=80 says
    # "(did you mean 'front'?)": both now come from loading.unknown_station
    from loadcheck.errors import UnknownNameError

    inputs = load_check_inputs(sample("trainer4/within.toml"))
    with pytest.raises(UnknownNameError) as error:
        P.most_payload(inputs.aircraft, inputs.loading, "frnt")
    (problem,) = error.value.problems
    assert problem.field == "station" and "did you mean 'front'?" in problem.message
    assert problem.expected == "one of front, rear, hold"


def test_regression_no_fuel_answer_is_limited_by_the_checks_sentences_in_its_order():
    """An over-weight loading: "limited by" gave the limits' names sorted, without amounts. It now
    gives each limit the check exceeds with its amount, in the check's order (RULES.md: one engine, one
    verdict), and (trial 11, finding 6) of the candidate loadings, every ramp fuel from the least that
    covers taxi 1.2 and trip 25 (26.2 US gal) to the tanks' 56, not of the loading's own 56 US gal alone.
    Worked by hand (sums of weights, FAA-H-8083-1B chapter 2; avgas 6.0 lb/US gal, common practice): the
    check of the loading says 2,834.0 lb at ramp with 56 US gal (336 lb), so 2,498 lb with none; with the
    least, 26.2 x 6 = 157.2 lb, 2,655.2 lb, still above the 2,462 lb maximum ramp weight."""
    inputs = load_check_inputs(sample("trainer4/over_weight.toml"), fuel_to_plan=True)
    answer = P.most_fuel(inputs.aircraft, inputs.loading)
    assert not answer.feasible
    own = check_loading(inputs.aircraft, inputs.loading)
    assert own.condition("ramp").weight == pytest.approx(2834.0) and own.condition("ramp").fuel == 56.0
    least = check_loading(inputs.aircraft, _filled(inputs.aircraft, inputs.loading, None, 26.2))
    assert least.condition("ramp").weight == pytest.approx(2834.0 - 336.0 + 157.2)
    assert answer.governing == (
        "any ramp fuel from 26.2 to 56.0 usgal: "
        + P.binding_limits(least.findings)
        + ". Less ramp fuel than 26.2 usgal does not cover taxi and trip"
    )
    assert answer.governing.count(";") > 1 and answer.governing_code == "max_ramp_weight"


def test_regression_most_fuel_is_limited_by_the_limit_with_its_amount():
    """trainer4/within.toml's most fuel stops at the maximum takeoff weight: "limited by" names it with
    its amount from the aircraft file, not its name alone."""
    inputs = load_check_inputs(sample("trainer4/within.toml"), fuel_to_plan=True)
    answer = P.most_fuel(inputs.aircraft, inputs.loading)
    assert answer.feasible and answer.governing is not None
    first = answer.governing.split("; ")[0]
    assert first == f"maximum takeoff weight {inputs.aircraft.limits.max_takeoff_weight:,.1f} lb"


def test_regression_shift_from_an_empty_station_says_so_once():
    """plan shift from an empty station said "moving up to all 0.0 kg ... is not enough" twice (answer and
    "limited by"); it now says once that the station is empty, and "limited by" gives what the loading's own
    check exceeds (tandem2/aft_heavy.toml carries no ballast and is aft of its envelope)."""
    inputs = load_check_inputs(sample("tandem2/aft_heavy.toml"))
    assert inputs.loading.stations.get("ballast", 0.0) == 0.0
    answer = P.weight_shift(inputs.aircraft, inputs.loading, "ballast", "front")
    assert not answer.feasible
    assert answer.answer_display == "no amount can: ballast is empty: it holds no weight to move"
    assert "not enough" not in answer.answer_display and "empty" not in (answer.governing or "")
    check = check_loading(inputs.aircraft, inputs.loading)
    assert answer.governing == "with this load and trip: " + "; ".join(f.message for f in check.limits_exceeded)


def test_regression_ballast_at_a_station_named_ballast_is_not_said_twice(runner):
    """tandem2's ballast station has the id "ballast": the answer read "ballast at ballast: 14.5 kg"."""
    result = runner.invoke(app, ["plan", "ballast", str(sample("tandem2/aft_heavy.toml"))])
    assert result.exit_code == 0, result.output
    assert "ballast at ballast" not in result.output
    assert "\ntotal ballast: " in result.output  # the answer's line, "total ballast: 14.5 kg" (the box's whole weight)
    other = runner.invoke(app, ["plan", "ballast", str(sample("tandem2/aft_heavy.toml")), "--station", "front"])
    assert "ballast at front" in other.output


def test_regression_a_fuel_answer_did_not_say_how_its_fuel_goes_into_the_tanks():
    """An outside trial read "no amount is within limits" where another way of filling the tanks was
    within limits: the answer holds for one fill order only, so it says which (common practice: a
    fuel answer for a multi-tank aircraft is read with its tank sequence)."""
    inputs = load_check_inputs(sample("twin6/within.toml"))
    twin, loading = inputs.aircraft, inputs.loading
    assert P.most_fuel(twin, loading).extra["fill order"] == "mains, then aux (the reverse of the burn order)"
    assert P.most_fuel(twin, loading, fill=["aux", "mains"]).extra["fill order"] == "aux, then mains (as asked)"
    assert P.fill_words(twin, None, None).startswith("every tank in proportion")  # the tanks burn together
    one = load_check_inputs(sample("tandem2/solo.toml"))
    assert "fill order" not in P.most_fuel(one.aircraft, one.loading).extra  # one tank: nothing to say


def test_regression_a_plan_table_row_reading_none_did_not_say_why(runner):
    """Each row is plan fuel at that payload: its "limited by" is plan fuel's, in the check's words,
    in the text and the JSON (a row without fuel named no reason)."""
    path = sample("trainer4/within.toml")
    table = json.loads(
        runner.invoke(app, ["plan", "table", str(path), "--station", "rear", "--steps", "3", "--json"]).stdout
    )
    inputs = load_check_inputs(path)
    for row in table["rows"]:
        loading = inputs.loading.but(stations={**inputs.loading.stations, "rear": 160.0 + row["payload"]})
        assert row["limited_by"] == P.most_fuel(inputs.aircraft, loading).governing
    text = runner.invoke(app, ["plan", "table", str(path), "--station", "rear", "--steps", "3"], env={"COLUMNS": "200"})
    said = " ".join(text.output.split())
    assert "Limited by, row by row" in said
    assert all(" ".join(row["limited_by"].split()) in said for row in table["rows"])


# -- weight shift between stations side by side (lateral limits) ---------------------------------


def _side_by_side(right_max: float) -> tuple:
    """An invented aircraft (tests/helpers.simple_aircraft) with two seats side by side at arm 35 in,
    lateral arms -10 in (left) and +10 in (right, maximum ``right_max`` lb), a seat behind the left one
    (arm 70 in, lateral arm -10 in), and a lateral envelope -1.0 to +1.0 in from 900 to 2,000 lb; the
    loading: 200 lb in the left seat, no fuel (every condition the same: 1,200 lb)."""
    aircraft = simple_aircraft(
        empty={"weight": 1000.0, "arm": 40.0, "lateral_arm": 0.0},
        tank=[{"id": "main", "arm": 45.0, "lateral_arm": 0.0, "usable": 40.0, "fuel": "avgas"}],
        station=[
            {"id": "left", "arm": 35.0, "lateral_arm": -10.0, "kind": "seat"},
            {"id": "right", "arm": 35.0, "lateral_arm": 10.0, "kind": "seat", "max_weight": right_max},
            {"id": "aft_left", "arm": 70.0, "lateral_arm": -10.0, "kind": "seat"},
        ],
        envelope=[
            {
                "category": "normal",
                "axes": ["arm", "weight"],
                "points": [[35.0, 900], [35.0, 2000], [48.0, 2000], [48.0, 900]],
            },
            {
                "category": "normal",
                "axes": ["lateral_arm", "weight"],
                "points": [[-1.0, 900], [-1.0, 2000], [1.0, 2000], [1.0, 900]],
            },
        ],
    )
    return aircraft, resolve_loading(Loading(load={"left": 200}), aircraft)


def test_regression_a_shift_between_seats_side_by_side_said_it_does_not_move_the_cg():
    """An outside trial: plan shift --from left --to right on stations at one arm but opposite lateral arms
    said "the two stations have the same arm: moving weight does not move the CG"; the lateral CG moves.

    Worked by hand with the weight-shift relation, weight moved = total weight x CG change / distance
    moved (FAA-H-8083-1B chapter 2, weight shift, from memory), along the lateral axis: 1,200 lb at lateral
    CG (200 x -10) / 1,200 = -1.667 in; the left limit -1.0 in is 0.667 in away and the seats 20 in apart,
    so 1,200 x 0.667 / 20 = 40.0 lb; the right limit +1.0 in is 2.667 in away: 1,200 x 2.667 / 20 =
    160.0 lb at most. The CG fore and aft stays at (1,000 x 40 + 200 x 35) / 1,200 = 39.17 in."""
    aircraft, loading = _side_by_side(right_max=250.0)
    assert not check_loading(aircraft, loading).ok
    answer = P.weight_shift(aircraft, loading, "left", "right")
    assert answer.feasible and answer.check is not None and answer.check.ok
    assert answer.answer == pytest.approx(1200 * (2 / 3) / 20, abs=P.MASS_TOLERANCE)
    assert [(i.low, i.high) for i in answer.intervals] == [
        (pytest.approx(40.0, abs=P.MASS_TOLERANCE), pytest.approx(1200 * (8 / 3) / 20, abs=P.MASS_TOLERANCE))
    ]
    takeoff = answer.check.condition("takeoff")
    assert takeoff.lateral_arm == pytest.approx(-1.0, abs=0.01)
    assert takeoff.arm == pytest.approx((1000 * 40 + 200 * 35) / 1200)
    assert answer.extra["the move moves"] == "the lateral CG only: both stations are at arm 35.00 in"
    # what makes 40 lb needed: the left limit at every condition of the flight (no fuel: one weight)
    assert (
        answer.governing
        == "left limit at ramp -1.00 in; left limit at takeoff -1.00 in; left limit at landing -1.00 in"
    )
    assert P.shift_moves(aircraft, "left", "aft_left") == (
        "the CG fore and aft only: both stations are at lateral arm -10.00 in"
    )


def test_a_shift_that_brings_the_lateral_cg_in_but_fills_the_seat_says_what_limits_it():
    """The same loading with the right seat's maximum 100 lb: 40.0 lb (worked above) brings the lateral CG
    to the left limit, and more than 100 lb moved exceeds the seat's maximum before the right limit
    (160.0 lb) is reached, so the stretch is 40.0 to 100.0 lb and says what stops it there."""
    aircraft, loading = _side_by_side(right_max=100.0)
    answer = P.weight_shift(aircraft, loading, "left", "right")
    assert answer.feasible and answer.check is not None and answer.check.ok
    assert answer.answer == pytest.approx(40.0, abs=P.MASS_TOLERANCE)
    assert answer.intervals[0].high == pytest.approx(100.0, abs=1e-6)
    assert answer.extra["limited above by"] == "maximum of right 100.0 lb (moving more than 100.0 lb)"


def test_a_shift_no_amount_of_which_is_within_limits_names_what_each_amount_exceeds():
    """The right seat's maximum 30 lb: the lateral CG needs 40.0 lb moved (worked above), the seat takes
    30 lb, so no amount can; up to 30.0 lb the left limit is what is exceeded, from 40.0 lb to 160.0 lb the
    seat's maximum alone (the lateral CG within -1.0 to +1.0 in), past 160.0 lb both it and the right limit."""
    aircraft, loading = _side_by_side(right_max=30.0)
    answer = P.weight_shift(aircraft, loading, "left", "right")
    assert not answer.feasible and answer.answer is None
    assert answer.extra["the move moves"].startswith("the lateral CG only")
    left = "left limit at ramp -1.00 in; left limit at takeoff -1.00 in; left limit at landing -1.00 in"
    right = "right limit at ramp 1.00 in; right limit at takeoff 1.00 in; right limit at landing 1.00 in"
    seat = "maximum of right 30.0 lb"
    # each stretch's ends are amounts of the search's grid (0.05 lb), rounded inward
    assert answer.governing == (
        f"moving 0.0 to 30.0 lb: {left}. Moving 30.1 to 39.9 lb: {left}; {seat}. Moving 40.0 to 160.0 lb: {seat}. "
        f"Moving 160.1 to 200.0 lb: {right}; {seat}"
    )


def test_regression_a_shift_with_many_stretches_named_only_what_moving_all_of_it_exceeds():
    """heli2 heavy_left, left -> bag_right: "limited by" named the locker's maximum alone (the check of
    all 245 lb moved), not the lateral and aft limits that make every amount fail, because the limits'
    verdicts changed ten times along the move. With more stretches than are named one by one, each limit
    is now named once whatever the condition, the stretches it makes alike joined.

    Worked by hand (weight moved = total weight x CG change / distance moved, FAA-H-8083-1B chapter 2,
    weight shift, from memory, along the lateral axis; avgas 6.0 lb/US gal, common practice): the
    side-by-side aircraft above with 250 lb in the left seat (minimum 100 lb), the right seat's maximum
    30 lb and 30 gal (180 lb) at lateral arm -5 in, taxi 5 gal and trip 20 gal: ramp 1,430 lb, lateral
    moment -2,500 - 900 = -3,400 in-lb, so the ramp CG reaches the left limit -1.0 in at (3,400 - 1,430)
    / 20 = 98.5 lb moved (takeoff: (3,250 - 1,400) / 20 = 92.5 lb; landing: (2,650 - 1,280) / 20 =
    68.5 lb); the landing CG reaches the right limit +1.0 in at (1,280 + 2,650) / 20 = 196.5 lb; more than
    150 lb moved leaves less than the left seat's minimum. Eight stretches of limits with their amounts
    (ramp, takeoff and landing part ways), five of limits named once."""
    aircraft, _ = _side_by_side(right_max=30.0)
    seats = [
        {**s.model_dump(exclude_none=True), "min_weight": 100.0} if s.id == "left" else s.model_dump(exclude_none=True)
        for s in aircraft.station
        if s.id != "aft_left"
    ]
    tank = [{**aircraft.tank[0].model_dump(exclude_none=True), "lateral_arm": -5.0}]
    data = {**aircraft.model_dump(mode="json", exclude_none=True), "station": seats, "tank": tank}
    aircraft = parse_aircraft(data)
    loading = resolve_loading(Loading(load={"left": 250}, fuel={"main": 30}, burn={"taxi": 5, "trip": 20}), aircraft)
    answer = P.weight_shift(aircraft, loading, "left", "right")
    assert not answer.feasible
    assert answer.governing == (
        "moving 0.0 to 30.0 lb: left limit. Moving 30.1 to 98.4 lb: left limit; maximum of right. "
        "Moving 98.5 to 150.0 lb: maximum of right. Moving 150.1 to 196.5 lb: minimum of left; maximum of right. "
        "Moving 196.6 to 250.0 lb: right limit; minimum of left; maximum of right"
    )
    heli = load_check_inputs(sample("heli2/heavy_left.toml"))
    said = P.weight_shift(heli.aircraft, heli.loading, "left", "bag_right").governing or ""
    assert said.startswith("moving 0.0 to ") and "left limit at ramp" in said and "aft limit at ramp" in said
    assert "maximum of bag_right 35.0 lb" in said


def test_a_shift_between_stations_at_one_arm_and_lateral_arm_moves_neither_cg():
    """Two stations at arm 35 in, no lateral arms: moving weight moves neither CG, only the stations' loads.
    200 lb in a seat of maximum 150 lb: 200 - 150 = 50.0 lb moved to the other seat brings it within
    limits, the CG unchanged at (1,000 x 40 + 200 x 35) / 1,200 = 39.17 in. With 700 lb in the rear
    seat the CG is (40,000 + 7,000 + 49,000) / 1,900 = 50.53 in, aft of 48 in, whatever is moved."""
    aircraft = simple_aircraft(
        station=[
            {"id": "front", "arm": 35.0, "kind": "seat", "max_weight": 150.0},
            {"id": "front2", "arm": 35.0, "kind": "seat"},
            {"id": "rear", "arm": 70.0, "kind": "seat"},
        ]
    )
    loading = resolve_loading(Loading(load={"front": 200}), aircraft)
    answer = P.weight_shift(aircraft, loading, "front", "front2")
    assert answer.feasible and answer.check is not None and answer.check.ok
    assert answer.answer == pytest.approx(200 - 150, abs=P.MASS_TOLERANCE)
    assert answer.check.condition("takeoff").arm == pytest.approx((1000 * 40 + 200 * 35) / 1200)
    assert (
        answer.extra["the move moves"]
        == "neither CG: both stations are at arm 35.00 in; only the stations' loads change"
    )
    aft = resolve_loading(Loading(load={"front": 200, "rear": 700}), aircraft)
    assert check_loading(aircraft, aft).condition("takeoff").arm == pytest.approx(96000 / 1900)
    none = P.weight_shift(aircraft, aft, "front", "front2")
    assert not none.feasible and none.extra["the move moves"].startswith("neither CG")
    assert "aft limit" in (none.governing or "")


def test_a_shift_to_a_target_arm_between_stations_side_by_side_is_refused_in_words_that_are_true():
    """A target CG fore and aft cannot be reached by moving weight between stations at one arm: the
    refusal says the move moves the lateral CG only, never that it does not move the CG; one station as
    both source and target is refused as such."""
    aircraft, loading = _side_by_side(right_max=250.0)
    with pytest.raises(InputError, match="moves the lateral CG only") as refused:
        P.weight_shift(aircraft, loading, "left", "right", target_arm=40.0)
    assert "does not move the CG" not in str(refused.value)
    with pytest.raises(InputError, match="left is also the source"):
        P.weight_shift(aircraft, loading, "left", "left")


@pytest.mark.parametrize(
    ("path", "source", "target", "arm", "condition"),
    [
        ("tandem2/aft_heavy.toml", "rear", "ballast", 430.0, "landing"),  # a target on the aft limit
        ("trainer4/within.toml", "hold", "rear", 40.4799, "takeoff"),  # it needs all the hold holds
    ],
)
def test_regression_a_target_shift_showed_a_rounded_amount_the_check_rejects(path, source, target, arm, condition):
    """The amount a target shift gives is the amount its check was made of: shown 9.6 kg failed
    the check (landing CG 430.09 mm aft of 430.00), and 33.1 lb was more than the 33.05 lb the
    hold held. Weight-shift relation: FAA-H-8083-1B, chapter 2 (from memory)."""
    inputs = load_check_inputs(sample(path))
    shift = P.weight_shift(inputs.aircraft, inputs.loading, source, target, target_arm=arm, condition=condition)
    if shift.feasible:
        held = inputs.loading.stations.get(source, 0.0)
        assert shift.answer <= held
        moved = inputs.loading.but(
            stations={
                **inputs.loading.stations,
                source: held - shift.answer,
                target: inputs.loading.stations.get(target, 0.0) + shift.answer,
            }
        )
        assert check_loading(inputs.aircraft, moved).ok and shift.check.ok
        # the figure shown is the one checked: rounded up to 0.1, or with more digits where that is more
        # than the source holds (33.06 lb of the 33.07 the hold holds)
        assert float(shift.answer_display.split()[0].replace(",", "")) == shift.answer
    else:
        assert shift.answer is None


# -- the fill order of a fuel answer ------------------------------------------------------------------


def test_regression_a_tank_named_twice_in_the_fill_order_counted_its_fuel_twice(runner):
    """An outside trial: ``plan fuel within.toml --fill mains,mains`` answered 78.3 US gal "within limits"
    (the aircraft holds 56 usable) while the loading it checked held 34.3: the tank was filled twice
    over. A tank named twice is refused, as it is in a burn order (fail closed, common practice)."""
    inputs = load_check_inputs(sample("trainer4/within.toml"))
    with pytest.raises(InputError, match="tank\\(s\\) named twice in the fill order: mains"):
        P.most_fuel(inputs.aircraft, inputs.loading, fill=["mains", "mains"])
    for command in (["plan", "fuel"], ["plan", "trip", "--rate", "8"], ["plan", "table", "--station", "hold"]):
        said = runner.invoke(app, [*command, str(sample("trainer4/within.toml")), "--fill", "mains,mains"])
        assert said.exit_code == 2 and "named twice in the fill order" in said.output


@pytest.mark.parametrize("fill", [None, ["centre"], ["mains"], ["centre", "mains"], ["mains", "centre"]])
def test_regression_a_fill_of_some_tanks_answered_their_fuel_as_the_ramp_fuel(fill):
    """``plan fuel within.toml --fill centre`` said "ramp fuel: 4.3 usgal" beside a check whose ramp fuel
    was 34.3 (the mains keep the loading's 30.0 US gal): the figure was the centre tank's alone. The ramp
    fuel of a fuel answer is the fuel at engine start of the loading it checked, whatever the fill order;
    the tanks left out of the order keep their fuel as loaded, so no less than it is offered.

    Worked by hand: the answer is limited by the maximum takeoff weight 2,450 lb (the aircraft file),
    so ramp fuel = (2,450 lb + taxi 1.2 US gal x 6.0 lb/US gal - zero-fuel weight) / 6.0 lb/US gal
    (avgas 6.0 lb/US gal, common practice; FAA-H-8083-1B chapter 2 sums weights this way)."""
    inputs = load_check_inputs(sample("trainer4/within.toml"))
    answer = P.most_fuel(inputs.aircraft, inputs.loading, fill=fill)
    assert answer.feasible and answer.check is not None and answer.check.ok and answer.answer is not None
    ramp = answer.check.condition("ramp")
    assert f"{ramp.fuel:.1f} usgal" == answer.answer_display  # the figure shown is the loading checked
    zero_fuel = answer.check.condition("zero_fuel").weight
    if fill is None or "centre" in fill:  # room left in a tank of the order: the weight limit decides
        assert answer.answer == pytest.approx((2450 + 1.2 * 6.0 - zero_fuel) / 6.0, abs=P.MASS_TOLERANCE / 6.0)
    kept = 30.0 if fill == ["centre"] else 0.0  # the mains' school fill, as loaded
    # no less than what lands with the reserve: taxi 1.2 + trip 18 + reserve 8 = 27.2 US gal
    assert answer.intervals[0].low == pytest.approx(max(kept, 1.2 + 18 + 8), abs=0.05)
    if fill == ["centre"]:
        assert answer.extra["fill order"] == "centre (as asked); mains as loaded"
        # the stretch "30.0 to 34.3 usgal" starts at the mains' fuel, which the answer says (a final review)
        assert answer.extra["fuel kept as loaded"] == "30.0 usgal in mains, so no ramp fuel of this fill order is less"
        trip = P.longest_trip(inputs.aircraft, inputs.loading, rate=8.0, fill=fill)
        assert trip.check is not None and trip.extra["ramp fuel"] == answer.answer_display
        assert trip.check.condition("ramp").fuel == pytest.approx(ramp.fuel, abs=0.05)
    else:
        assert "fuel kept as loaded" not in answer.extra  # every tank is in the fill order, or the kept one is empty


@pytest.mark.parametrize("given_trip", ["0", "18", "45"])
def test_regression_the_longest_trip_was_answered_from_the_trip_the_file_gives(given_trip):
    """An outside trial: ``plan trip`` on a loading whose own trip was long (more than any fuel within
    limits can carry past the reserve) said "no amount is within limits", for a false reason, where the
    same load with a shorter trip in the file had an answer. The trip is the question's unknown: the
    answer is the same whatever trip the file gives.

    Worked by hand on the sample trainer (FAA-H-8083-1B chapter 2, sums of weights; avgas 6.0 lb/US gal,
    common practice): the ramp fuel is held by the maximum takeoff weight, 2,450 lb, at the file's taxi
    of 1.2 US gal, and the trip is what it holds past taxi and the reserve of 8 US gal."""
    path = sample("trainer4/within.toml")
    inputs = load_check_inputs(path, burn={"trip": given_trip}, fuel_to_plan=True)
    trip = P.longest_trip(inputs.aircraft, inputs.loading, rate=9.5, reserve=8.0)
    assert trip.feasible and trip.check is not None and trip.check.ok and trip.answer is not None
    ramp = trip.check.condition("ramp")
    zero_fuel = trip.check.condition("zero_fuel").weight
    most = (2450 + 1.2 * 6.0 - zero_fuel) / 6.0
    assert trip.extra["ramp fuel"] == f"{ramp.fuel:.1f} usgal" and ramp.fuel == pytest.approx(most, abs=0.1)
    assert ramp.fuel <= most + 1e-9  # the takeoff weight holds
    assert trip.answer == pytest.approx(ramp.fuel - 1.2 - 8.0, abs=0.01)
    reference = P.longest_trip(*_trainer_within(), rate=9.5, reserve=8.0)
    assert trip.answer == pytest.approx(reference.answer) and trip.extra == reference.extra


def _trainer_within():
    inputs = load_check_inputs(sample("trainer4/within.toml"))
    return inputs.aircraft, inputs.loading


def test_regression_plan_ballast_said_no_limit_that_set_it():
    """An outside trial: ``plan ballast`` gave its answer with no "limited by" and no ``governing`` in the
    JSON, though docs/planning.md says every answer found names each limit the check just past it
    exceeds. For the least ballast, that is the check with a little less: its own limit findings."""
    inputs = load_check_inputs(sample("tandem2/aft_heavy.toml"))
    answer = P.least_ballast(inputs.aircraft, inputs.loading)
    assert answer.feasible and answer.answer is not None and answer.answer > 0 and answer.check is not None
    assert answer.check.ok
    station = next(s.id for s in inputs.aircraft.station if s.kind == "ballast")
    less = inputs.loading.but(stations={**inputs.loading.stations, station: answer.answer - 0.1})
    short = check_loading(inputs.aircraft, less)
    assert not short.ok and answer.governing is not None
    assert answer.governing_code in {f.code for f in short.findings if f.severity == "limit"}
    none_needed = P.least_ballast(*_loaded("tandem2/solo.toml"))
    assert none_needed.answer == 0 and none_needed.governing is None


def _loaded(name):
    inputs = load_check_inputs(sample(name))
    return inputs.aircraft, inputs.loading


def test_regression_no_payload_answer_quoted_another_loading_as_this_one():
    """An outside trial: ``plan payload --station left`` with no amount within limits said "with this load
    and trip: landing lateral CG 4.31 in ...", a figure of the check with the left seat emptied, while the
    loading as given lands at 3.07 in. The words now say which loading they quote (common practice: a
    figure is named with the loading it belongs to)."""
    inputs = load_check_inputs(sample("trainer4/over_weight.toml"))
    answer = P.most_payload(inputs.aircraft, inputs.loading, "hold")
    assert not answer.feasible and answer.governing is not None
    name = inputs.aircraft.station_by_id["hold"].name
    emptied = inputs.loading.but(stations={**inputs.loading.stations, "hold": 0.0})
    exceeded = [f.message for f in check_loading(inputs.aircraft, emptied).findings if f.severity == "limit"]
    assert answer.governing == f"with nothing at {name} and the rest as given: " + "; ".join(exceeded)


# -- an outside trial's invented aircraft (trial 11): the reason given, the check carried, the rounding ---------

_HAULER = """
format = 1
name = "Hauler three-tank (trial invention)"
registration = "TR-HAU"
[units]
mass = "kg"
arm = "m"
fuel_volume = "l"
[empty]
weight = 1500.0
arm = 2.50
[limits]
max_takeoff_weight = 2600
max_ramp_weight = 2615
max_landing_weight = 2500
max_zero_fuel_weight = 2300
[mac]
leading_edge_arm = 2.0
length = 1.6
[[station]]
id = "crew"
kind = "seat"
arm = 1.6
max_weight = 200
controls = true
[[station]]
id = "cab1"
kind = "cargo"
arm = 2.8
max_weight = 400
[[station]]
id = "cab2"
kind = "cargo"
arm = 3.6
max_weight = 400
[[station_group]]
label = "Cabin floor"
stations = ["cab1", "cab2"]
max_weight = 600
[[tank]]
id = "fwd"
arm = 2.0
usable = 150.0
density = 0.72
[[tank]]
id = "wings"
arm = 2.6
usable = 400.0
density = 0.72
[[tank]]
id = "aft"
arm = 3.4
usable = 120.0
density = 0.72
[[envelope]]
category = "normal"
axes = ["moment", "weight"]
moment_scale = 100
points = [[36.0, 1500], [52.0, 2000], [62.4, 2600], [70.2, 2600], [65.0, 2000], [40.5, 1500]]
[[envelope]]
category = "normal"
axes = ["mac", "weight"]
points = [[10, 1500], [10, 2600], [40, 2600], [40, 1500]]
"""


def _trial_aircraft(text: str):
    import tomllib

    return parse_aircraft(tomllib.loads(text))


GULL = _trial_aircraft(TRIAL_GULL)
HAULER = _trial_aircraft(_HAULER)


def test_regression_no_fuel_within_limits_named_taxi_and_trip_where_the_aft_limit_stops_it():
    """Trial 11, finding 6: with p1 60, p2 115 and no fuel given, ``plan fuel`` said "taxi and trip fuel
    (6.3 impgal) exceed the fuel the burn order can use", the fuel the answer replaces, not a reason.
    Worked by hand (FAA-H-8083-1B chapter 2: moment = weight x arm, CG = sum of moments / sum of weights):
    the least fuel that covers taxi 0.3 and trip 6 is 6.3 imp gal x 3.27 kg = 20.60 kg; ramp 650.60 kg,
    moment 19,110 - 1,200 + 8,625 + 1,236.06 = 27,771.06 kg·cm, CG 42.685 cm; the aft limit there is
    48 - 8 x 150.60 / 220 = 42.524 cm, so the aft limit is what stops it (and more fuel, at 60 cm, aft of
    that CG, only moves the CG further aft: full, 669.24 kg at 43.168 cm against 41.846 cm)."""
    loading = resolve_loading(
        Loading(load={"p1": 60, "p2": 115, "locker": 0}, burn={"taxi": 0.3, "trip": 6}), GULL, fuel_to_plan=True
    )
    least = P._fuel_loading(GULL, loading, None, 6.3)
    ramp = check_loading(GULL, least).condition("ramp")
    assert ramp.weight == pytest.approx(650.601, abs=1e-3) and ramp.arm == pytest.approx(42.6852, abs=1e-4)
    answer = P.most_fuel(GULL, loading)
    assert not answer.feasible and answer.governing is not None
    assert "exceed the fuel the burn order" not in answer.governing
    assert answer.governing.startswith("ramp fuel 6.3 to ")  # each stretch of ramp fuel, from the least
    assert answer.governing.endswith("Less ramp fuel than 6.3 impgal does not cover taxi and trip")
    assert "aft limit at ramp" in answer.governing and "forward" not in answer.governing
    assert answer.governing_code == "envelope"


def test_regression_no_fuel_within_limits_named_taxi_and_trip_where_a_group_is_over_its_maximum():
    """Trial 11, finding 6: cab1 300 + cab2 320 = 620 kg on a 600 kg cabin floor (sum of weights, FAA-H-8083-1B
    chapter 2): no fuel changes that, so it is the one reason given (docs/planning.md), not "taxi and trip
    fuel (260 l) exceed the fuel the burn order can use"; the same in each ``plan table`` row."""
    loading = resolve_loading(
        Loading(
            load={"crew": 180, "cab1": 300, "cab2": 320},
            burn={"taxi": 10, "trip": 250, "order": ["aft", "fwd", "wings"]},
        ),
        HAULER,
        fuel_to_plan=True,
    )
    answer = P.most_fuel(HAULER, loading)
    assert not answer.feasible
    assert answer.governing == "Cabin floor: 620.0 kg exceeds the maximum 600.0 kg by 20.0 kg"
    assert answer.governing_code == "group_max"
    table = P.fuel_payload_table(HAULER, loading.but(stations={"crew": 180, "cab1": 300, "cab2": 0}), "cab2", steps=3)
    last = table.rows[-1]  # 300 + 400 kg on the floor, hand-worked as above
    assert last.limited_by == "Cabin floor: 700.0 kg exceeds the maximum 600.0 kg by 100.0 kg"
    assert last.limited_by_code == "group_max"
    assert all("exceed the fuel the burn order" not in (row.limited_by or "") for row in table.rows)


def test_regression_plan_trip_carried_a_no_trip_fuel_warning_beside_the_trip_it_checked():
    """Trial 11, finding 7: the check ``plan trip`` carries said "no trip fuel given" beside its 498.6 l trip,
    one finding more than the check of that loading. Worked by hand (FAA-H-8083-1B chapter 2): full tanks
    670 l x 0.72 = 482.4 kg, ramp 2,562.4 kg; taxi 10 and trip 498.6 l burn aft 120, fwd 150 and 238.6 l of
    the wings, which land with 161.4 l (116.21 kg): 2,196.21 kg, moment 5,238 + 302.14 = 5,540.14 kg·m,
    CG 2.5226 m, on the forward edge (52.0 + 10.4 x 196.21 / 600) x 100 / 2,196.21 = 2.5226 m. It lands with
    161.4 l, not with the 45 l reserve, and says both."""
    order = ["aft", "fwd", "wings"]
    loading = resolve_loading(
        Loading(load={"crew": 180, "cab1": 300, "cab2": 100}, burn={"taxi": 10, "order": order}),
        HAULER,
        fuel_to_plan=True,
    )
    answer = P.longest_trip(HAULER, loading, rate=120, reserve=45)
    assert answer.feasible and answer.answer_display == "498.6 l" and answer.check is not None
    given = resolve_loading(
        Loading(
            load={"crew": 180, "cab1": 300, "cab2": 100},
            fuel={"fwd": "full", "wings": "full", "aft": "full"},
            burn={"taxi": 10, "trip": 498.6, "reserve": 45, "order": order},
        ),
        HAULER,
    )
    plain = check_loading(HAULER, given)
    assert answer.check.to_json() == plain.to_json()
    assert [f.code for f in answer.check.findings] == ["envelope"]  # the zero-fuel warning alone
    landing = answer.check.condition("landing")
    assert landing.fuel == pytest.approx(161.4, abs=1e-6) and landing.arm == pytest.approx(2.5226, abs=1e-4)
    assert answer.extra["lands with"] == "161.4 l"
    assert answer.extra["reserve"] == "45.0 l (the reserve asked for)"
    assert "reserve landed with" not in answer.extra


def test_regression_a_shift_to_a_target_cg_rounded_the_weight_down_and_fell_short_of_the_target():
    """Trial 11, finding 9: moving 36.6 kg from p2 to p1 put the takeoff CG at 40.0046 cm, aft of the 40 cm
    asked. Worked by hand (weight moved = total weight x CG change / distance moved, FAA-H-8083-1B
    chapter 2): takeoff 455 + 62 + 115 + 15 + 11.7 x 3.27 = 685.259 kg, moment 30,890.54 kg·cm, CG 45.0786 cm;
    the seats are 95 cm apart, so w = 685.259 x 5.0786 / 95 = 36.633 kg, shown as 36.7 kg (the least weight
    that reaches the CG, rounded up as least ballast is): (30,890.54 - 36.7 x 95) / 685.259 = 39.991 cm."""
    loading = resolve_loading(
        Loading(load={"p1": 62, "p2": 115, "locker": 15}, fuel={"fus": "full"}, burn={"taxi": 0.3, "trip": 3}), GULL
    )
    answer = P.weight_shift(GULL, loading, "p2", "p1", target_arm=40.0)
    assert answer.feasible and answer.answer == pytest.approx(36.7) and answer.answer_display == "36.7 kg"
    assert answer.check is not None
    takeoff = answer.check.condition("takeoff")
    assert takeoff.arm == pytest.approx((30890.54 - 36.7 * 95) / 685.259, abs=1e-4)
    assert takeoff.arm <= 40.0
    moved = loading.but(stations={"p1": 98.7, "p2": 78.3, "locker": 15})  # 62 + 36.7 and 115 - 36.7
    assert answer.check.to_json() == check_loading(GULL, moved).to_json()


def test_an_answer_with_no_amount_within_limits_gives_the_code_of_the_limit_it_names_first():
    """``governing_code`` beside ``governing`` where no amount is within limits (trial 11, finding 6: there was
    none): the finding code of the first limit the words name, from the same check (common practice: a
    machine-readable reason beside the words). The over-weight trainer: its 1,718 lb empty, 380 + 340 lb in
    the seats and full fuel (56 US gal x 6.0 lb, common practice) make 2,774 lb with nothing in the hold,
    over the 2,462 lb ramp maximum (sums of weights, FAA-H-8083-1B chapter 2), so neither bags nor ballast
    help."""
    inputs = load_check_inputs(sample("trainer4/over_weight.toml"))
    payload = P.most_payload(inputs.aircraft, inputs.loading, "hold")
    emptied = check_loading(inputs.aircraft, inputs.loading.but(stations={**inputs.loading.stations, "hold": 0.0}))
    assert not payload.feasible and payload.governing_code == emptied.limits_exceeded[0].code
    ballast = P.least_ballast(inputs.aircraft, inputs.loading, "hold")
    own = check_loading(inputs.aircraft, inputs.loading)
    assert not ballast.feasible and ballast.governing_code == own.limits_exceeded[0].code == "max_ramp_weight"


def test_a_burn_down_to_a_fuel_left_carries_the_check_of_its_taxi_and_trip_as_given():
    """``most_fuel(..., burn_to=0)`` (a placard's whole fuel range, common practice) chooses the taxi (none)
    and the trip (all the fuel); its check said "no taxi fuel given" and "no trip fuel given" beside them,
    as plan trip's did (trial 11, finding 7). It is now the check of the loading with that taxi and trip
    given, finding for finding. Hand-worked (FAA-H-8083-1B chapter 2): 455 + 80 + 80 kg and 12 imp gal x
    3.27 = 39.24 kg make 654.24 kg at (19,110 - 1,600 + 6,000 + 2,354.4) / 654.24 = 25,864.4 / 654.24 = 39.533 cm."""
    loading = resolve_loading(Loading(load={"p1": 80, "p2": 80}), GULL, fuel_to_plan=True)
    answer = P.most_fuel(GULL, loading, burn_to=0.0)
    assert answer.feasible and answer.answer_display == "12.0 impgal" and answer.check is not None
    given = resolve_loading(Loading(load={"p1": 80, "p2": 80}, fuel={"fus": 12}, burn={"taxi": 0, "trip": 12}), GULL)
    assert answer.check.to_json() == check_loading(GULL, given).to_json()
    assert not answer.check.findings
    assert answer.check.condition("ramp").arm == pytest.approx(25864.4 / 654.24)


def test_the_least_fuel_that_covers_taxi_and_trip_is_said_on_the_true_side():
    """Taxi 0.3 and trip 6.03 imp gal need 6.33 imp gal (common practice: taxi and trip come out of the
    tanks): "less ramp fuel than 6.3 impgal does not cover" is true, "than 6.4" would not be (6.35 covers);
    the stretch itself starts at 6.4, rounded inward."""
    loading = resolve_loading(
        Loading(load={"p1": 60, "p2": 115}, burn={"taxi": 0.3, "trip": 6.03}), GULL, fuel_to_plan=True
    )
    answer = P.most_fuel(GULL, loading)
    assert not answer.feasible and answer.governing is not None
    assert answer.governing.startswith("ramp fuel 6.4 to ")
    assert answer.governing.endswith("Less ramp fuel than 6.3 impgal does not cover taxi and trip")


def test_regression_a_trips_no_fuel_reason_named_the_first_legs_own_too_little_fuel():
    """Trial 11, finding 6 left for trips: for a trip whose first leg gives 1 imp gal against taxi 0.3 and
    trip 6, ``plan fuel`` said "taxi and trip fuel (6.3 impgal) exceed the fuel the burn order can use":
    the fuel the answer replaces. The reason is the trip's check at the ramp fuels tried: at the least that
    covers the burn, 6.3 imp gal, leg 1 is 650.60 kg at 42.685 cm against the 42.524 cm aft limit (worked by
    hand in the single-leg case above, FAA-H-8083-1B chapter 2)."""
    from loadcheck.trip import trip_most_fuel

    trip = Loading(
        load={"p1": 60, "p2": 115},
        fuel={"fus": 1},
        burn={"taxi": 0.3, "trip": 6},
        leg=[{"load": {"p2": 0, "locker": 15}, "add_fuel": {"fus": "full"}, "burn": {"taxi": 0.3, "trip": 4}}],
    )
    answer = trip_most_fuel(GULL, trip)
    assert not answer.feasible and answer.governing is not None
    assert "exceed the fuel the burn order" not in answer.governing, answer.governing
    assert answer.governing.startswith("with this load and these legs, at 6.3 impgal of ramp fuel: leg 1: ramp CG")
    assert "aft of the aft limit" in answer.governing and "(42.5 cm at 650.6 kg)" in answer.governing


def test_regression_a_stretch_of_ramp_fuel_was_named_by_one_verdict_per_envelope():
    """A review of trial 11's fix: with one inside/outside verdict per envelope, an aft-edge and a top-edge
    exceedance looked alike, so ``plan fuel`` of trainer4/utility_aft.toml said "ramp fuel 6.2 to 44.8
    usgal: envelope's top ..." where from 6.2 to about 18 usgal (the loading's own 10 usgal among them)
    ``check`` finds the aft limit exceeded and the weight below the top. Each stretch is now split where
    the full check finds other limits at its two ends; every stretch named must be what the check finds
    at its ends (sum of moments, FAA-H-8083-1B chapter 2, by the check itself)."""
    import re

    inputs = load_check_inputs(sample("trainer4/utility_aft.toml"), fuel_to_plan=True)
    answer = P.most_fuel(inputs.aircraft, inputs.loading)
    assert not answer.feasible and answer.governing is not None
    stretches = re.findall(r"[Rr]amp fuel ([0-9.]+) to ([0-9.]+) usgal: ([^.]*(?:\.[0-9][^.]*)*)", answer.governing)
    assert stretches, answer.governing
    low, high, words = stretches[0]
    assert float(low) <= 10 <= float(high) and "aft limit at ramp" in words and "envelope's top" not in words
    loading = inputs.loading
    for low, high, words in stretches:
        for fuel in (float(low), float(high)):
            findings = check_loading(inputs.aircraft, P._fuel_loading(inputs.aircraft, loading, None, fuel)).findings
            said = {
                ("aft limit" if f.side == "aft" else "top")
                for f in findings
                if f.severity == "limit" and f.code == "envelope"
            }
            assert ("aft limit" in said) == ("aft limit" in words), (low, high, fuel, words)


_SHIFT_140 = """format = 1
name = "Invented shift test (review 11)"
[units]
mass = "kg"
arm = "cm"
fuel_volume = "l"
[empty]
weight = 400.0
arm = 150.0
[limits]
max_takeoff_weight = 700
[[station]]
id = "fwd"
kind = "seat"
arm = 100.0
max_weight = 200
[[station]]
id = "aft"
arm = 200.0
max_weight = 200
[[tank]]
id = "t"
arm = 150.0
usable = 50.0
density = 0.72
[[envelope]]
category = "normal"
axes = ["arm", "weight"]
points = [[140.0, 400], [140.0, 700], [200.0, 700], [200.0, 400]]
"""


@pytest.mark.parametrize(
    ("aft", "shown", "short"),
    [
        # 400 x 150 + 80 x 100 + 30.05 x 200 = 74,010 kg cm at 510.05 kg; moving m from 200 to 100 cm takes
        # 100 m off the moment: m = (74,010 - 140 x 510.05) / 100 = 26.03 kg exactly, the CG then 140.0 cm
        (30.05, "26.03 kg", False),
        # 30.05003: m = (74,010.006 - 71,407.0042) / 100 = 26.030018 kg; 26.0301 passes the 140 cm limit
        # (CG 139.99998 cm), 26.0300 is inside (140.000006 cm): the closest below, said to fall short
        (30.05003, "26.0300 kg", True),
    ],
)
def test_regression_a_target_shift_onto_the_limit_it_moves_toward_was_refused(aft, shown, short):
    """A review of trial 11's rounding up: a target on the forward limit, moved toward, was refused ("no
    solution: moving 26.1 kg puts the CG at the target") though 26.03 kg reaches it within limits; the
    least amount that reaches the target within limits is found with more digits, else the closest
    below it with a note (the moment method of FAA-H-8083-1B chapter 2, worked beside each case)."""
    aircraft = _trial_aircraft(_SHIFT_140)
    loading = resolve_loading(
        Loading(load={"fwd": 80, "aft": aft}, fuel={"t": 0}, burn={"taxi": 0, "trip": 0}), aircraft
    )
    answer = P.weight_shift(aircraft, loading, "aft", "fwd", target_arm=140.0)
    assert answer.feasible and answer.answer_display == shown and answer.check is not None and answer.check.ok
    assert answer.check.condition("takeoff").arm >= 140.0 - 1e-9
    assert ("note" in answer.extra) is short


def test_regression_plan_trip_with_no_answer_gave_the_reason_of_the_loadings_own_trip():
    """A review: ``plan trip`` of twin6/zero_fuel_heavy.toml (over its maximum zero-fuel weight, whatever the
    fuel) said "... Less ramp fuel than 37.0 usgal does not cover taxi and trip": the loading's own trip,
    which plays no part where the trip is the answer. The reason is now the shortest trip's (none)."""
    inputs = load_check_inputs(sample("twin6/zero_fuel_heavy.toml"), fuel_to_plan=True)
    answer = P.longest_trip(inputs.aircraft, inputs.loading, rate=30.0)
    assert not answer.feasible and answer.governing is not None
    assert answer.governing.startswith("even with no trip fuel: ") and "37.0" not in answer.governing
    assert "maximum zero-fuel weight 5,000.0 lb" in answer.governing  # sample_aircraft/twin6/aircraft.toml
    assert answer.governing_code is not None


def test_regression_plan_shift_says_what_each_station_holds_after_the_move():
    """Trial 13 (D8, the same question for shift): "weight moved" is an amount, not a station's whole
    weight, and the answer said neither station's weight to load. It now says both, from the loading
    checked: heli2/heavy_left.toml has 245 lb on the left seat and none on the right, so moving 66.5 lb
    leaves 245 - 66.5 = 178.5 lb at left and puts 66.5 lb at right (sums of weights, FAA-H-8083-1B
    chapter 2, weight shift: the weight moved leaves one station and joins the other)."""
    inputs = load_check_inputs(sample("heli2/heavy_left.toml"))
    answer = P.weight_shift(inputs.aircraft, inputs.loading, "left", "right")
    assert answer.feasible and answer.answer_display == "66.5 lb" and answer.check is not None
    assert answer.extra["after the move"] == "178.5 lb at left, 66.5 lb at right"
    held = {item.id: item.weight for item in answer.check.items}
    assert held["left"] == pytest.approx(245 - 66.5) and held["right"] == pytest.approx(66.5)
    # to a target CG too: tandem2/aft_heavy.toml, 110 kg rear and 58 kg front, 19.3 kg moved
    tandem = load_check_inputs(sample("tandem2/aft_heavy.toml"))
    to_cg = P.weight_shift(tandem.aircraft, tandem.loading, "rear", "front", target_arm=430.0, condition="landing")
    assert to_cg.feasible and to_cg.answer_display == "19.3 kg"
    assert to_cg.extra["after the move"] == "90.7 kg at rear, 77.3 kg at front"  # 110 - 19.3, 58 + 19.3


def test_regression_plan_leave_says_its_payload_is_the_stations_whole_weight():
    """Trial 13 (D8, the same question for leave): "to carry 195.0 lb at rear" did not say whether the
    195 lb came on top of the 160 lb the loading (trainer4/within.toml) has there; it replaces it, as the
    check carried shows (195 lb at rear), and the question now says so."""
    inputs = load_check_inputs(sample("trainer4/within.toml"))
    assert inputs.loading.stations["rear"] == 160.0
    answer = P.fuel_to_leave(inputs.aircraft, inputs.loading, "rear", 195.0)
    assert answer.question == (
        "fuel to leave behind to carry 195.0 lb at rear in all (in place of the 160.0 lb in the loading there)"
    )
    assert answer.check is not None
    assert next(item.weight for item in answer.check.items if item.id == "rear") == 195.0


# -- station's-weight answers (trial 13, D8) --------------------------------------------------
# Station's-weight answers say the station's whole weight, and what the loading already has there.
#
# An outside trial (trial 13, D8) loaded 1 lb in a ballast box and asked for the least ballast: the
# answer said "ballast: 2.1 lb", the weight to ADD, while the loading it checked had 3.1 lb in the
# box; a pilot loading 2.1 lb in the box is out of limits. The answers now give the station's whole
# weight (the figure whose loading was checked) and, where the loading has some there, what it has
# and what to add.
#
# Every figure below is worked by hand as the sum of moments (FAA-H-8083-1B, Aircraft Weight and
# Balance Handbook, chapter 2: CG = total moment / total weight) on an invented aircraft whose
# envelope has straight, upright forward and aft limits, so that the least ballast is linear:
# (M0 + 135 b) / (W0 + b) >= 35  <=>  b >= (35 W0 - M0) / (135 - 35).

# An invented aircraft (no real type's data): a flat forward limit at 35 in, aft at 45 in.
BALLAST_AIRCRAFT = """\
format = 1
name = "Ballast test two-seat (invented)"
registration = "TEST-BAL"

[units]
mass = "lb"
arm = "in"
fuel_volume = "usgal"

[empty]
weight = 1500.0
arm = 34.0
date = 2026-01-01
basis = "test"

[limits]
max_takeoff_weight = 2500

[[station]]
id = "front"
label = "Front seats"
kind = "seat"
arm = 30.0
controls = true

[[station]]
id = "nose"
label = "Nose locker"
kind = "baggage"
arm = 10.0
max_weight = 60

[[station]]
id = "cargo"
label = "Cabin cargo"
kind = "cargo"
arm = 40.0
max_weight = 1000

[[station]]
id = "box"
label = "Tail ballast box"
kind = "ballast"
arm = 135.0
max_weight = 50

[[tank]]
id = "main"
arm = 35.0
usable = 20.0
fuel = "avgas"

[[envelope]]
category = "normal"
axes = ["arm", "weight"]
points = [[35.0, 1200], [35.0, 2500], [45.0, 2500], [45.0, 1200]]
"""

# Without ballast: BALLAST_W0 = 1500 + 300 + 41 = 1,841 lb; BALLAST_M0 = 51,000 + 9,000 + 410 = 60,410 lb.in
# (CG 32.81 in, forward of 35). Least total ballast: (35 x 1,841 - 60,410) / 100 = 40.25 lb.
BALLAST_W0, BALLAST_M0 = 1841.0, 60410.0
BALLAST_LEAST = (35.0 * BALLAST_W0 - BALLAST_M0) / (135.0 - 35.0)  # 40.25 lb, by hand


def _ballast_aircraft():
    import tomllib

    return parse_aircraft(tomllib.loads(BALLAST_AIRCRAFT))


def _ballast_loading(aircraft, **load: float):
    stations = {"front": 300.0, "nose": 41.0, **load}
    given = Loading(load=stations, fuel={"main": 0.0}, burn={"taxi": 0.0, "trip": 0.0})
    return resolve_loading(given, aircraft)


def _station_weight(check, station: str) -> float:
    return next((item.weight for item in check.items if item.id == station), 0.0)


def test_hand_figures_of_the_ballast_aircraft():
    """The hand sums above, by the check itself (FAA-H-8083-1B ch. 2, sum of moments)."""
    aircraft = _ballast_aircraft()
    bare = check_loading(aircraft, _ballast_loading(aircraft)).condition("takeoff")
    assert bare.weight == pytest.approx(BALLAST_W0) and bare.moment == pytest.approx(BALLAST_M0)
    assert BALLAST_LEAST == pytest.approx(40.25)


def test_regression_least_ballast_is_the_boxs_whole_weight_with_what_the_loading_has():
    """10 lb already in the box: the answer was "ballast: 30.3 lb" (the weight to add) with 40.3 lb in
    the loading checked. It is now the box's whole weight, 40.25 lb by hand, shown rounded up 40.3 lb,
    with the 10.0 lb in the loading and the 30.3 lb to add said beside it."""
    aircraft = _ballast_aircraft()
    answer = P.least_ballast(aircraft, _ballast_loading(aircraft, box=10.0))
    assert answer.feasible and answer.check is not None and answer.check.ok
    assert answer.answer == pytest.approx(BALLAST_LEAST, abs=1e-3)  # bisection to 1e-6 of the range
    assert answer.answer_display == "40.3 lb (10.0 lb in the loading and 30.3 lb more)"
    assert answer.given == 10.0 and answer.added == pytest.approx(30.3, abs=1e-9)
    # the headline's total is the box's weight in the loading checked
    assert _station_weight(answer.check, "box") == pytest.approx(40.3, abs=1e-9)
    assert answer.variable == "total ballast at box"
    # the figure as it used to be read, 30.3 lb in the box in all, is out of limits by hand:
    # (60,410 + 135 x 30.3) / (1,841 + 30.3) = 64,500.5 / 1,871.3 = 34.468 in, forward of 35 in
    misread = check_loading(aircraft, _ballast_loading(aircraft, box=30.3))
    assert not misread.ok
    assert misread.condition("takeoff").arm == pytest.approx(64500.5 / 1871.3, abs=1e-9)


def test_least_ballast_with_none_in_the_loading_says_the_figure_alone():
    aircraft = _ballast_aircraft()
    answer = P.least_ballast(aircraft, _ballast_loading(aircraft))
    assert answer.answer_display == "40.3 lb" and answer.given == 0.0
    assert answer.added == pytest.approx(40.3, abs=1e-9) and "ballast kept as loaded" not in answer.extra
    assert _station_weight(answer.check, "box") == pytest.approx(40.3, abs=1e-9)


def test_regression_ballast_already_enough_is_the_answer_not_zero():
    """45 lb in the box (more than the 40.25 lb needed, by hand): the answer read "ballast: 0.0 lb"
    beside a table with 45 lb in the box. It is now 45.0 lb, all of it in the loading, none to add,
    and says that the stretch starts at the loading's ballast (less may also do)."""
    aircraft = _ballast_aircraft()
    answer = P.least_ballast(aircraft, _ballast_loading(aircraft, box=45.0))
    assert answer.feasible and answer.check is not None and answer.check.ok
    assert answer.answer == 45.0 and answer.added == 0.0
    assert answer.answer_display == "45.0 lb (all of it in the loading: none to add)"
    assert _station_weight(answer.check, "box") == 45.0
    assert answer.intervals[0].low == 45.0 and "less may also do" in answer.extra["ballast kept as loaded"]


def test_regression_plan_ballast_terminal_and_json_say_the_total_and_what_to_add(tmp_path):
    """The command line: the headline's total is the moment table's weight in the box; the JSON gives
    the total (answer), what the loading had (given) and what to add (added)."""
    plane = write_file(tmp_path, BALLAST_AIRCRAFT)
    args = ["plan", "ballast", plane, "--load", "front=300", "--load", "nose=41", "--load", "box=10"]
    args += ["--fuel", "main=0", "--taxi", "0", "--trip", "0"]
    text = invoke(*args, env={"COLUMNS": "100"})
    assert text.exit_code == 0, text.output
    assert "total ballast at box: 40.3 lb (10.0 lb in the loading and 30.3 lb more)" in text.output
    row = next(line for line in text.output.splitlines() if line.startswith("│ Tail ballast box"))
    assert row.split("│")[2].strip() == "40.3"
    data = json.loads(invoke(*args, "--json").stdout)
    assert data["variable"] == "total ballast at box" and data["answer"] == pytest.approx(BALLAST_LEAST, abs=1e-3)
    assert data["given"] == 10.0 and data["added"] == pytest.approx(30.3)
    box = next(item for item in data["check"]["items"] if item["id"] == "box")
    assert box["weight"] == pytest.approx(data["given"] + data["added"])


def test_regression_plan_payload_says_what_the_loading_has_at_the_station():
    """plan payload answered the station's whole weight, but said nothing of the weight the loading
    already had there, so "weight at cargo" could be read as weight to add. With 45 lb in the box
    (CG 37.0 in, inside: (60,410 + 6,075) / 1,886 = 35.25 in) the cargo at 40 in stays inside the
    CG limits, and the maximum takeoff weight binds: 2,500 - 1,886 = 614.0 lb at cargo in all; with
    100 lb in the loading there, 514.0 lb more; with 700 lb there, 86.0 lb less."""
    aircraft = _ballast_aircraft()
    answer = P.most_payload(aircraft, _ballast_loading(aircraft, box=45.0, cargo=100.0), "cargo")
    assert answer.feasible and answer.answer == pytest.approx(614.0, abs=1e-3)
    assert answer.answer_display == "614.0 lb (100.0 lb in the loading and 514.0 lb more)"
    assert answer.given == 100.0 and answer.added == pytest.approx(514.0)
    assert _station_weight(answer.check, "cargo") == pytest.approx(614.0)
    over = P.most_payload(aircraft, _ballast_loading(aircraft, box=45.0, cargo=700.0), "cargo")
    assert over.answer_display == "614.0 lb (700.0 lb in the loading: 86.0 lb less)"
    assert over.added == pytest.approx(-86.0) and _station_weight(over.check, "cargo") == pytest.approx(614.0)


def test_regression_no_ballast_answer_says_it_searched_from_the_loadings_ballast():
    """With ballast in the loading the search starts there (the loading's ballast stays), but the
    refusal said "no weight up to the station's maximum", as if from none. tandem2/aft_heavy.toml is aft
    of its envelope; ballast at the tail-side baggage station cannot help it."""
    aircraft, loading = _loaded("tandem2/aft_heavy.toml")
    loading = loading.but(stations={**loading.stations, "baggage": 20.0})
    answer = P.least_ballast(aircraft, loading, "baggage")
    assert not answer.feasible and answer.given == 20.0 and answer.added is None
    assert "no weight from the 20.0 kg in the loading up to the station's maximum" in answer.answer_display
