"""A trip of several legs on the terminal (loadcheck/render/trip.py): every leg shown, then the
trip's verdict naming the leg out of limits, then the caution; the trip's plans. The trip's
figures (FAA-H-8083-1B ch. 8, the helicopter of tests/test_trip.py) are checked there."""

from __future__ import annotations

import json

from loadcheck.cli import app

from .helpers import sample
from .test_trip import _write_files


def test_the_trip_exits_1_naming_leg_2(runner, tmp_path):
    path = _write_files(tmp_path)
    shown = runner.invoke(app, ["check", str(path)])
    assert shown.exit_code == 1, shown.output
    assert "OUT OF LIMITS on leg 2 (solo)" in shown.output and "Leg 1: within limits" in shown.output
    assert "leg 2 (solo): " in shown.output
    assert shown.output.rstrip().endswith("decides whether to fly.")
    data = json.loads(runner.invoke(app, ["check", str(path), "--json"]).output)
    assert data["ok"] is False and [leg["ok"] for leg in data["legs"]] == [True, False]
    assert data["legs"][1]["leg"] == 2 and data["legs"][1]["label"] == "solo"
    assert {"conditions", "burn_path", "findings", "items", "units", "caution"} <= set(data["legs"][0])
    assert {f["leg"] for f in data["findings"] if f["severity"] == "limit"} == {2}
    assert data["caution"] and data["units"]["mass"] == "lb"


def test_plan_commands_for_a_trip(runner):
    path = str(sample("heli2/trip_drop_off.toml"))
    fuel = runner.invoke(app, ["plan", "fuel", path])
    assert fuel.exit_code == 0 and "every leg" in fuel.output, fuel.output
    stop = runner.invoke(app, ["plan", "stop", path, "--leg", "2", "--json"])
    data = json.loads(stop.stdout)  # a note on standard error: the file's fuel at that stop is the answer's
    assert stop.exit_code == 0 and data["feasible"] and data["trip"]["ok"] and len(data["trip"]["legs"]) == 2
    assert runner.invoke(app, ["plan", "stop", path, "--leg", "3"]).exit_code == 2


def test_regression_the_trips_verdict_on_the_terminal_dropped_its_warnings(runner, tmp_path):
    """Trial 13 D3: "Leg 2 (two up): within limits" and "WITHIN LIMITS on every leg (2 legs): every
    condition, burn path and limit holds." over two legs landing below their reserves (the trip of
    tests/test_trip.WARNED_TRIP, worked by hand there). Each leg's line and the trip's verdict now
    carry the warnings in the single check's words (loadcheck.words.within_limits_text); the JSON
    carries every finding, each with its leg."""
    from loadcheck.words import within_limits_text

    from .test_trip import warned_trip

    path = str(warned_trip(tmp_path))
    shown = runner.invoke(app, ["check", path])
    assert shown.exit_code == 0, shown.output  # within limits: a reserve is a warning
    text = " ".join(shown.output.replace("│", " ").split())
    assert f"Leg 1: within limits: {within_limits_text(1)}" in text
    assert f"Leg 2 (two up): within limits: {within_limits_text(1)}" in text
    assert f"WITHIN LIMITS on every leg (2 legs): {within_limits_text(2)}" in text
    assert "2 warnings (see the findings)" in text
    assert within_limits_text(0) not in text and "limit holds." not in text  # never "all holds" over a warning
    for leg in ("leg 1", "leg 2 (two up)"):
        assert f"{leg}: landing fuel 19.0 usgal is below the reserve of 20.0 usgal by 1.0 usgal" in text
    data = json.loads(runner.invoke(app, ["check", path, "--json"]).output)
    assert data["ok"] is True and [leg["ok"] for leg in data["legs"]] == [True, True]
    assert [(f["leg"], f["code"], f["severity"]) for f in data["findings"]] == [
        (1, "reserve", "warning"),
        (2, "reserve", "warning"),
    ]
    assert [[f["code"] for f in leg["findings"]] for leg in data["legs"]] == [["reserve"], ["reserve"]]


def test_a_leg_within_limits_of_a_trip_out_of_limits_says_its_warnings(runner, tmp_path):
    """The leg within limits of a trip that is not says its own warnings; the trip's verdict names
    the leg out of limits (trip "A" of TEST-T, tests/helpers.py, worked by hand there: leg 2 aft
    of 86 in at ramp, takeoff and landing; leg 1 given a reserve of 20 gal, landing with 19)."""
    from loadcheck.words import within_limits_text

    from .helpers import TRIP_LOADING, trip_fleet

    folder = trip_fleet(tmp_path / "fleet")
    (folder / "reserve.toml").write_text(TRIP_LOADING.replace("trip = 10\n[[leg]]", "trip = 10\nreserve = 20\n[[leg]]"))
    shown = runner.invoke(app, ["check", str(folder / "reserve.toml")])
    assert shown.exit_code == 1, shown.output
    text = " ".join(shown.output.replace("│", " ").split())
    assert f"Leg 1: within limits: {within_limits_text(1)}" in text
    assert "Leg 2: OUT OF LIMITS: 3 limits exceeded." in text
    assert "OUT OF LIMITS on leg 2: 3 limits exceeded." in text and "WITHIN LIMITS on" not in text
