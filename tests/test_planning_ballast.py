"""Station's-weight answers say the station's whole weight, and what the loading already has there.

An outside trial (trial 13, D8) loaded 1 lb in a ballast box and asked for the least ballast: the
answer said "ballast: 2.1 lb", the weight to ADD, while the loading it checked had 3.1 lb in the
box; a pilot loading 2.1 lb in the box is out of limits. The answers now give the station's whole
weight (the figure whose loading was checked) and, where the loading has some there, what it has
and what to add.

Every figure below is worked by hand as the sum of moments (FAA-H-8083-1B, Aircraft Weight and
Balance Handbook, chapter 2: CG = total moment / total weight) on an invented aircraft whose
envelope has straight, upright forward and aft limits, so that the least ballast is linear:
(M0 + 135 b) / (W0 + b) >= 35  <=>  b >= (35 W0 - M0) / (135 - 35).
"""

from __future__ import annotations

import json

import pytest

from loadcheck import planning as P
from loadcheck.check import check_loading
from loadcheck.files import parse_aircraft
from loadcheck.loading import Loading, resolve_loading

from .helpers import invoke, write_file

# An invented aircraft (no real type's data): a flat forward limit at 35 in, aft at 45 in.
AIRCRAFT = """\
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

# Without ballast: W0 = 1500 + 300 + 41 = 1,841 lb; M0 = 51,000 + 9,000 + 410 = 60,410 lb.in
# (CG 32.81 in, forward of 35). Least total ballast: (35 x 1,841 - 60,410) / 100 = 40.25 lb.
W0, M0 = 1841.0, 60410.0
LEAST = (35.0 * W0 - M0) / (135.0 - 35.0)  # 40.25 lb, by hand


def _aircraft():
    import tomllib

    return parse_aircraft(tomllib.loads(AIRCRAFT))


def _loading(aircraft, **load: float):
    stations = {"front": 300.0, "nose": 41.0, **load}
    given = Loading(load=stations, fuel={"main": 0.0}, burn={"taxi": 0.0, "trip": 0.0})
    return resolve_loading(given, aircraft)


def _station_weight(check, station: str) -> float:
    return next((item.weight for item in check.items if item.id == station), 0.0)


def test_hand_figures_of_the_ballast_aircraft():
    """The hand sums above, by the check itself (FAA-H-8083-1B ch. 2, sum of moments)."""
    aircraft = _aircraft()
    bare = check_loading(aircraft, _loading(aircraft)).condition("takeoff")
    assert bare.weight == pytest.approx(W0) and bare.moment == pytest.approx(M0)
    assert LEAST == pytest.approx(40.25)


def test_regression_least_ballast_is_the_boxs_whole_weight_with_what_the_loading_has():
    """10 lb already in the box: the answer was "ballast: 30.3 lb" (the weight to add) with 40.3 lb in
    the loading checked. It is now the box's whole weight, 40.25 lb by hand, shown rounded up 40.3 lb,
    with the 10.0 lb in the loading and the 30.3 lb to add said beside it."""
    aircraft = _aircraft()
    answer = P.least_ballast(aircraft, _loading(aircraft, box=10.0))
    assert answer.feasible and answer.check is not None and answer.check.ok
    assert answer.answer == pytest.approx(LEAST, abs=1e-3)  # bisection to 1e-6 of the range
    assert answer.answer_display == "40.3 lb (10.0 lb in the loading and 30.3 lb more)"
    assert answer.given == 10.0 and answer.added == pytest.approx(30.3, abs=1e-9)
    # the headline's total is the box's weight in the loading checked
    assert _station_weight(answer.check, "box") == pytest.approx(40.3, abs=1e-9)
    assert answer.variable == "total ballast at box"
    # the figure as it used to be read, 30.3 lb in the box in all, is out of limits by hand:
    # (60,410 + 135 x 30.3) / (1,841 + 30.3) = 64,500.5 / 1,871.3 = 34.468 in, forward of 35 in
    misread = check_loading(aircraft, _loading(aircraft, box=30.3))
    assert not misread.ok
    assert misread.condition("takeoff").arm == pytest.approx(64500.5 / 1871.3, abs=1e-9)


def test_least_ballast_with_none_in_the_loading_says_the_figure_alone():
    aircraft = _aircraft()
    answer = P.least_ballast(aircraft, _loading(aircraft))
    assert answer.answer_display == "40.3 lb" and answer.given == 0.0
    assert answer.added == pytest.approx(40.3, abs=1e-9) and "ballast kept as loaded" not in answer.extra
    assert _station_weight(answer.check, "box") == pytest.approx(40.3, abs=1e-9)


def test_regression_ballast_already_enough_is_the_answer_not_zero():
    """45 lb in the box (more than the 40.25 lb needed, by hand): the answer read "ballast: 0.0 lb"
    beside a table with 45 lb in the box. It is now 45.0 lb, all of it in the loading, none to add,
    and says that the stretch starts at the loading's ballast (less may also do)."""
    aircraft = _aircraft()
    answer = P.least_ballast(aircraft, _loading(aircraft, box=45.0))
    assert answer.feasible and answer.check is not None and answer.check.ok
    assert answer.answer == 45.0 and answer.added == 0.0
    assert answer.answer_display == "45.0 lb (all of it in the loading: none to add)"
    assert _station_weight(answer.check, "box") == 45.0
    assert answer.intervals[0].low == 45.0 and "less may also do" in answer.extra["ballast kept as loaded"]


def test_regression_plan_ballast_terminal_and_json_say_the_total_and_what_to_add(tmp_path):
    """The command line: the headline's total is the moment table's weight in the box; the JSON gives
    the total (answer), what the loading had (given) and what to add (added)."""
    plane = write_file(tmp_path, AIRCRAFT)
    args = ["plan", "ballast", plane, "--load", "front=300", "--load", "nose=41", "--load", "box=10"]
    args += ["--fuel", "main=0", "--taxi", "0", "--trip", "0"]
    text = invoke(*args, env={"COLUMNS": "100"})
    assert text.exit_code == 0, text.output
    assert "total ballast at box: 40.3 lb (10.0 lb in the loading and 30.3 lb more)" in text.output
    row = next(line for line in text.output.splitlines() if line.startswith("│ Tail ballast box"))
    assert row.split("│")[2].strip() == "40.3"
    data = json.loads(invoke(*args, "--json").stdout)
    assert data["variable"] == "total ballast at box" and data["answer"] == pytest.approx(LEAST, abs=1e-3)
    assert data["given"] == 10.0 and data["added"] == pytest.approx(30.3)
    box = next(item for item in data["check"]["items"] if item["id"] == "box")
    assert box["weight"] == pytest.approx(data["given"] + data["added"])


def test_regression_plan_payload_says_what_the_loading_has_at_the_station():
    """plan payload answered the station's whole weight, but said nothing of the weight the loading
    already had there, so "weight at cargo" could be read as weight to add. With 45 lb in the box
    (CG 37.0 in, inside: (60,410 + 6,075) / 1,886 = 35.25 in) the cargo at 40 in stays inside the
    CG limits, and the maximum takeoff weight binds: 2,500 - 1,886 = 614.0 lb at cargo in all; with
    100 lb in the loading there, 514.0 lb more; with 700 lb there, 86.0 lb less."""
    aircraft = _aircraft()
    answer = P.most_payload(aircraft, _loading(aircraft, box=45.0, cargo=100.0), "cargo")
    assert answer.feasible and answer.answer == pytest.approx(614.0, abs=1e-3)
    assert answer.answer_display == "614.0 lb (100.0 lb in the loading and 514.0 lb more)"
    assert answer.given == 100.0 and answer.added == pytest.approx(514.0)
    assert _station_weight(answer.check, "cargo") == pytest.approx(614.0)
    over = P.most_payload(aircraft, _loading(aircraft, box=45.0, cargo=700.0), "cargo")
    assert over.answer_display == "614.0 lb (700.0 lb in the loading: 86.0 lb less)"
    assert over.added == pytest.approx(-86.0) and _station_weight(over.check, "cargo") == pytest.approx(614.0)
