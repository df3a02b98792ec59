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
    data = json.loads(stop.output)
    assert stop.exit_code == 0 and data["feasible"] and data["trip"]["ok"] and len(data["trip"]["legs"]) == 2
    assert runner.invoke(app, ["plan", "stop", path, "--leg", "3"]).exit_code == 2
