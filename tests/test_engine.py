"""The vectorised engine agrees with the single check on every loading."""

from __future__ import annotations

import numpy as np
import pytest
from hypothesis import given, settings
from hypothesis import strategies as st

from loadcheck import check_loading, load_aircraft
from loadcheck.engine import CONDITIONS, evaluate
from loadcheck.loading import Loading

from .helpers import examples, random_loadings, sample, simple_aircraft

AIRCRAFT = {name: load_aircraft(sample(f"{name}/aircraft.toml")) for name in ("trainer4", "tandem2", "twin6", "heli2")}
ORDERS = {"trainer4": [None], "tandem2": [None], "twin6": [None, ("aux", "mains"), ("mains", "aux")], "heli2": [None]}


def single(aircraft, stations, fuel, taxi, trip, order, category):
    return check_loading(
        aircraft,
        Loading(
            category=category,
            load={s.id: float(stations[j]) for j, s in enumerate(aircraft.station)},
            fuel={t.id: float(fuel[j]) for j, t in enumerate(aircraft.tank)},
            burn={"taxi": float(taxi), "trip": float(trip), "order": list(order) if order else "together"},
        ),
    )


def assert_agree(aircraft, stations, fuel, taxi, trip, order=None, category=None):
    category = category or aircraft.categories[0]
    batch = evaluate(aircraft, stations, fuel, taxi, trip, order=order, category=category)
    for i in range(len(taxi)):
        result = single(aircraft, stations[i], fuel[i], taxi[i], trip[i], order, category)
        first = next(((f.code, f.condition or "") for f in result.findings if f.severity == "limit"), ("", ""))
        assert (batch.first_finding[i], batch.first_condition[i]) == first, i
        assert batch.ok[i] == result.ok, i
        assert batch.burn_path_ok[i] == result.burn_path.ok, i
        for condition in result.conditions:
            name = condition.condition
            assert batch.condition_ok[name][i] == condition.ok, (i, name)
            assert batch.weight[name][i] == pytest.approx(condition.weight, rel=1e-12)
            assert batch.arm[name][i] == pytest.approx(condition.arm, rel=1e-12)


@settings(max_examples=examples(12), deadline=None)
@given(st.sampled_from(sorted(AIRCRAFT)), st.integers(0, 2**32 - 1), st.data())
def test_random_loadings_agree(name, seed, data):
    aircraft = AIRCRAFT[name]
    order = data.draw(st.sampled_from(ORDERS[name]))
    category = data.draw(st.sampled_from(aircraft.categories))
    assert_agree(
        aircraft, *random_loadings(aircraft, 60, order, seed, over=1.1, zero_trip=0.05), order=order, category=category
    )


def test_points_exactly_on_limits_agree():
    # the simple box (35..48 in, 900..2000 lb): CG put exactly on the aft or forward limit
    aircraft = simple_aircraft(
        tank=[{"id": "main", "arm": 48.0, "usable": 40, "fuel": "avgas"}],
        station=[{"id": "front", "arm": 35.0}, {"id": "rear", "arm": 70.0}, {"id": "nose", "arm": 0.0}],
    )
    rows = []
    for front in np.linspace(0, 400, 21):
        w0, m0 = 1000.0 + front, 40_000.0 + 35.0 * front
        rows.append([front, (48.0 * w0 - m0) / (70.0 - 48.0), 0.0])  # aft limit, fuel at the aft limit too
        rows.append([front, 0.0, (m0 - 35.0 * w0) / 35.0])  # forward limit
    stations = np.array(rows)
    fuel = np.full((len(rows), 1), 20.0)
    taxi, trip = np.full(len(rows), 1.0), np.full(len(rows), 15.0)
    batch = evaluate(aircraft, stations, np.zeros((len(rows), 1)), np.zeros(len(rows)), np.zeros(len(rows)))
    assert batch.envelope_ok["zero_fuel"][batch.weight["zero_fuel"] <= 2000].all()
    assert_agree(aircraft, stations, fuel, taxi, trip)


def test_path_running_along_an_edge_agrees():
    # everything at 35 in: the CG sits on the forward limit for the whole burn
    aircraft = simple_aircraft(
        empty={"weight": 1000.0, "arm": 35.0}, tank=[{"id": "main", "arm": 35.0, "usable": 40, "fuel": "avgas"}]
    )
    stations = np.array([[200.0, 0.0, 0.0], [0.0, 0.0, 0.0]])
    fuel = np.array([[40.0], [10.0]])
    batch = evaluate(aircraft, stations, fuel, np.array([1.0, 0.0]), np.array([30.0, 10.0]))
    assert batch.burn_path_ok.all() and batch.ok.all()
    assert_agree(aircraft, stations, fuel, np.array([1.0, 0.0]), np.array([30.0, 10.0]))


def notch_case(n):
    """The box with a notch in its forward limit, a tank aft of it, n random loadings."""
    notch = [[35.0, 900.0], [35.0, 1500.0], [40.0, 1800.0], [40.0, 2000.0], [48.0, 2000.0], [48.0, 900.0]]
    aircraft = simple_aircraft(
        envelope=[{"category": "normal", "axes": ["arm", "weight"], "points": notch}],
        tank=[{"id": "main", "arm": 55.0, "usable": 100, "fuel": "avgas"}],
    )
    rng = np.random.default_rng(3)
    stations = np.stack([rng.uniform(0, 400, n), rng.uniform(0, 150, n), rng.uniform(0, 100, n)], axis=1)
    fuel = rng.uniform(0, 100, (n, 1))
    return aircraft, (stations, fuel, np.zeros(n), fuel[:, 0] * rng.uniform(0.3, 1.0, n))


def test_path_grazing_a_notch_corner_agrees():
    aircraft, (stations, fuel, taxi, trip) = notch_case(300)
    assert_agree(aircraft, stations, fuel, taxi, trip)
    assert not evaluate(aircraft, stations, fuel, taxi, trip).burn_path_ok.all()


def test_bad_rows_are_marked_not_raised():
    aircraft = AIRCRAFT["trainer4"]
    stations = np.array([[340.0, 150.0, 0.0], [np.nan, 0, 0], [-5.0, 0, 0], [300.0, 0, 0]])
    fuel = np.array([[30.0, 0.0], [30.0, 0.0], [30.0, 0.0], [80.0, 0.0]])
    result = evaluate(aircraft, stations, fuel, np.zeros(4), np.full(4, 10.0))
    assert result.valid.tolist() == [True, False, False, False]
    assert result.first_finding.tolist()[1:] == ["input"] * 3
    assert result.ok.tolist() == [True, False, False, False]


def test_large_batches_are_chunked_identically():
    aircraft = AIRCRAFT["twin6"]
    data = random_loadings(aircraft, 70_000, ("aux", "mains"), 11, over=1.1, zero_trip=0.05)
    whole = evaluate(aircraft, *data, order=("aux", "mains"))
    part = evaluate(aircraft, *(a[-500:] for a in data), order=("aux", "mains"))
    assert (whole.ok[-500:] == part.ok).all()
    for name in CONDITIONS:
        assert np.array_equal(whole.weight[name][-500:], part.weight[name])


# -- the ramp weight above an envelope's top (issue: the utility ramp at 2,388 lb reported within) ----
#
# The ramp allowance is for start, taxi and run-up fuel: max ramp weight less max takeoff weight
# (common practice). At ramp a weight above an envelope's top is held to the top only while it is
# within that allowance of the top; above that the ramp state is tested as it is.


def trainer_ramp(front, rear, category="utility"):
    """The trainer with 30 US gal in the mains (180 lb) and a 2 US gal taxi: ramp weight
    1,718 + front + rear + 180 lb (sample_aircraft/trainer4)."""
    return check_loading(
        AIRCRAFT["trainer4"],
        Loading(
            category=category,
            load={"front": front, "rear": rear},
            fuel={"mains": 30.0, "centre": 0.0},
            burn={"taxi": 2.0, "trip": 0.0},
        ),
    )


def ramp_findings(result):
    return [(f.code, f.severity) for f in result.findings if f.condition == "ramp"]


def test_regression_utility_ramp_weight_far_above_the_envelope_top_was_reported_within():
    # utility top 2,290 lb, max ramp 2,462, max takeoff 2,450: the allowance is 12 lb. A ramp weight
    # of 2,388 lb was held to the top (and passed the max ramp weight), so the ramp was "within".
    result = trainer_ramp(270.0, 220.0)
    ramp = result.conditions[0]
    assert ramp.weight == pytest.approx(2388.0)
    assert not ramp.ok
    assert ("envelope", "limit") in ramp_findings(result)
    assert ramp.margins.weight == pytest.approx(2290.0 + 12.0 - 2388.0)  # room to top + allowance, negative
    assert not evaluate(
        AIRCRAFT["trainer4"], [[270.0, 220.0, 0.0]], [[30.0, 0.0]], [2.0], [0.0], category="utility"
    ).envelope_ok["ramp"][0]


def test_regression_ramp_finding_and_ramp_margin_gave_two_excesses():
    # the ramp weight margin measured from top + allowance (-86 lb) while the finding measured from the
    # bare top (98 lb): one excess, the margin's, and the words say the allowance is counted
    result = trainer_ramp(270.0, 220.0)
    (finding,) = [f for f in result.findings if f.condition == "ramp" and f.code == "envelope"]
    assert finding.excess == pytest.approx(-result.conditions[0].margins.weight) == pytest.approx(86.0)
    assert finding.limit == pytest.approx(2302.0)
    assert "2,290.0 lb (2,302.0 lb at ramp with the 12.0 lb ramp allowance), by 86.0 lb" in finding.message


def test_ramp_weight_exactly_at_the_top_plus_the_allowance_is_within():
    # 1,718 + 200 + 204 + 180 = 2,302 lb = 2,290 + 12, CG 40.75 in (utility limits at 2,290 lb: 38.0 to 41.6)
    result = trainer_ramp(200.0, 204.0)
    ramp = result.conditions[0]
    assert ramp.weight == 2302.0 and ramp.ok and result.ok
    assert ramp.margins.weight == pytest.approx(0.0, abs=1e-9)
    assert trainer_ramp(200.0 + 2302.0 * 0.5e-9, 204.0).conditions[0].ok  # within the 1e-9 weight tolerance


@pytest.mark.parametrize("over", [2302.0 * 2e-9, 0.01, 1.0])
def test_ramp_weight_just_above_the_top_plus_the_allowance_is_outside(over):
    result = trainer_ramp(200.0 + over, 204.0)
    assert not result.conditions[0].ok and not result.ok
    assert ramp_findings(result) == [("envelope", "limit")]  # under the max ramp weight, outside the envelope


def test_normal_envelope_top_at_max_takeoff_keeps_the_ramp_allowance():
    # normal top 2,450 lb = max takeoff: the ramp is held up to the max ramp weight 2,462 lb as before
    result = trainer_ramp(300.0, 264.0, category="normal")
    assert result.conditions[0].weight == 2462.0 and result.ok
    assert result.conditions[0].margins.weight == pytest.approx(0.0, abs=1e-9)
    over = trainer_ramp(300.01, 264.0, category="normal")
    assert {"max_ramp_weight", "envelope"} <= {code for code, _ in ramp_findings(over)}


def test_no_max_ramp_weight_means_no_ramp_allowance():
    # no max ramp weight: the allowance is 0, so a ramp above a utility top of 1,800 lb is outside it
    utility = {
        "category": "utility",
        "axes": ["arm", "weight"],
        "points": [[35.0, 900], [35.0, 1800], [46.0, 1800], [46.0, 900]],
    }
    aircraft = simple_aircraft(envelope=[utility])
    loading = Loading(
        category="utility",
        load={"front": 500.0, "rear": 100.0},
        fuel={"main": 205.0 / 6.0},
        burn={"taxi": 1.0, "trip": 0.0},
    )
    result = check_loading(aircraft, loading)
    assert result.conditions[0].weight == pytest.approx(1805.0)
    assert result.conditions[1].ok and not result.conditions[0].ok
    assert ramp_findings(result) == [("envelope", "limit")]


# -- the burn path settled by its ends (engine._path_settled, envelope._Locator) ------------------
#
# A piece of path between two states strictly inside one straight convex part of an envelope stays
# inside it (docs/computation.md, "A path settled by its ends"): these rows skip the exact test. Each
# case below compares every field with the exact test alone (the shortcut switched off) and checks
# that the case holds both settled rows and rows whose path leaves the envelope between inside ends.


def _exact_only(monkeypatch):
    from loadcheck import engine

    monkeypatch.setattr(engine, "_path_settled", lambda tables, shapes, parts, fuel, *rest: np.zeros(len(fuel), bool))


def _fields_equal(a, b):
    if isinstance(a, dict):
        return a.keys() == b.keys() and all(_fields_equal(a[k], b[k]) for k in a)
    if isinstance(a, list):
        return len(a) == len(b) and all(_fields_equal(x, y) for x, y in zip(a, b, strict=True))
    if a is None or isinstance(a, tuple):
        return a == b
    return np.array_equal(np.asarray(a), np.asarray(b))


def assert_same_as_exact(monkeypatch, aircraft, data, order=None, category=None):
    """Every field of evaluate, with and without explain, equals the exact test's; returns the
    number of rows settled by their ends and the number whose path leaves between inside ends."""
    from loadcheck import engine

    settled_rows = []
    real = engine._path_settled

    def spy(*args):
        settled = real(*args)
        settled_rows.append(int(settled.sum()))
        return settled

    with monkeypatch.context() as m:
        m.setattr(engine, "_path_settled", spy)
        fast = [evaluate(aircraft, *data, order=order, category=category, explain=e) for e in (False, True)]
    with monkeypatch.context() as m:
        _exact_only(m)
        exact = [evaluate(aircraft, *data, order=order, category=category, explain=e) for e in (False, True)]
    for a, b in zip(fast, exact, strict=True):
        for field in a.__dataclass_fields__:
            assert _fields_equal(getattr(a, field), getattr(b, field)), field
    ends_in = exact[0].envelope_ok["takeoff"] & exact[0].envelope_ok["landing"]
    left_between = int((ends_in & ~exact[0].burn_path_ok).sum())
    return sum(settled_rows), left_between  # none settled where no part is straight (not called)


def test_settled_paths_agree_with_the_exact_test_on_a_non_convex_envelope(monkeypatch):
    # twin6: moment against weight, the forward limit bent in (one reflex corner): two overlapping parts
    aircraft = AIRCRAFT["twin6"]
    assert not aircraft.envelope[0].shape.convex
    for order in ORDERS["twin6"]:
        settled, left = assert_same_as_exact(
            monkeypatch, aircraft, random_loadings(aircraft, 20_000, order, 5, over=1.1), order=order
        )
        assert settled > 5_000 and left > 0, order


def test_settled_paths_agree_with_the_exact_test_where_a_tank_runs_dry(monkeypatch):
    # trainer4 burning one tank after the other: the path bends where the first runs dry
    aircraft = AIRCRAFT["trainer4"]
    for order in (("mains", "centre"), ("centre", "mains")):
        data = random_loadings(aircraft, 20_000, order, 6, over=1.1)
        settled, _ = assert_same_as_exact(monkeypatch, aircraft, data, order=order, category="normal")
        assert settled > 5_000


def test_a_path_bent_out_where_a_tank_runs_dry_is_tested_exactly(monkeypatch):
    # box 35..48 in; aft tank (90 in, 20 gal) burns first, then the nose tank (0 in): at takeoff
    # 1,360 lb at 37.35 in, where the aft tank runs dry 1,240 lb at 32.26 in (forward of 35),
    # at landing (30 gal of the nose tank burned) 1,060 lb at 37.74 in: both ends inside, the path not
    aircraft = simple_aircraft(
        tank=[
            {"id": "aft", "arm": 90.0, "usable": 20.0, "fuel": "avgas"},
            {"id": "nose", "arm": 0.0, "usable": 40.0, "fuel": "avgas"},
        ]
    )
    data = (np.zeros((1, 3)), np.array([[20.0, 40.0]]), np.zeros(1), np.array([50.0]))
    result = evaluate(aircraft, *data, order=("aft", "nose"), explain=True)
    assert result.envelope_ok["takeoff"][0] and result.envelope_ok["landing"][0]
    assert not result.burn_path_ok[0]
    (low, high), *_ = result.path_outside[0]
    assert low < 20.0 < high  # the stretch outside holds the point where the aft tank runs dry
    settled, left = assert_same_as_exact(monkeypatch, aircraft, data, order=("aft", "nose"))
    assert settled == 0 and left == 1


def test_a_path_grazing_an_edge_or_running_along_it_agrees_with_the_exact_test(monkeypatch):
    # the cases above (tests of the single check): on an edge the ends are not inside by the margin
    along = simple_aircraft(
        empty={"weight": 1000.0, "arm": 35.0}, tank=[{"id": "main", "arm": 35.0, "usable": 40, "fuel": "avgas"}]
    )
    data = (np.array([[200.0, 0.0, 0.0], [0.0, 0.0, 0.0]]), np.array([[40.0], [10.0]]), np.array([1.0, 0.0]))
    settled, _ = assert_same_as_exact(monkeypatch, along, (*data, np.array([30.0, 10.0])))
    assert settled == 0
    settled, _ = assert_same_as_exact(monkeypatch, *notch_case(3000))
    assert settled > 500


def test_a_lateral_envelope_settles_paths_as_the_exact_test_does(monkeypatch):
    # lateral CG against weight (FAA-H-8083-1B chapter 8, figure 8-3 draws one), a tank off the centreline
    lateral = [[-3.0, 900.0], [-3.0, 1500.0], [-1.0, 2000.0], [2.0, 2000.0], [3.0, 1500.0], [3.0, 900.0]]
    aircraft = simple_aircraft(
        empty={"weight": 1000.0, "arm": 40.0, "lateral_arm": 0.0},
        station=[
            {"id": "left", "arm": 38.0, "lateral_arm": -14.0, "kind": "seat"},
            {"id": "right", "arm": 38.0, "lateral_arm": 14.0, "kind": "seat"},
            {"id": "bag", "arm": 45.0, "lateral_arm": 0.0, "kind": "baggage"},
        ],
        tank=[
            {"id": "port", "arm": 45.0, "lateral_arm": -40.0, "usable": 20.0, "fuel": "avgas"},
            {"id": "starboard", "arm": 45.0, "lateral_arm": 40.0, "usable": 20.0, "fuel": "avgas"},
        ],
        envelope=[
            {"category": "normal", "axes": ["arm", "weight"], "points": [[35, 900], [35, 2000], [48, 2000], [48, 900]]},
            {"category": "normal", "label": "lateral", "axes": ["lateral_arm", "weight"], "points": lateral},
        ],
    )
    assert all(e.shape.has_straight_parts for e in aircraft.envelope)
    # burning the port tank first swings the lateral CG to starboard until it runs dry, then back
    for order in (None, ("port", "starboard")):
        data = random_loadings(aircraft, 20_000, order, 8, over=1.0, default_max=300.0)
        settled, left = assert_same_as_exact(monkeypatch, aircraft, data, order=order)
        assert settled > 1_000 and (order is None or left > 0), order


def test_an_edge_not_concave_along_the_path_is_tested_exactly(monkeypatch):
    # the forward limit moves forward with weight (40 in at 900 lb, 35 in at 2,000 lb): in arm and
    # weight the path x = 30 + C / W (fuel at 30 in) can cross it between two inside ends. From
    # 2,000 lb at 35.45 in to 1,400 lb (all 100 gal burned) the CG reaches the limit line
    # 44.09 - 0.004545 W nearest at about 1,549 lb, 0.013 in forward of it.
    aircraft = simple_aircraft(
        empty={"weight": 1400.0, "arm": (2000 * 35.45 - 600 * 30.0) / 1400.0},
        tank=[{"id": "main", "arm": 30.0, "usable": 100.0, "fuel": "avgas"}],
        envelope=[
            {"category": "normal", "axes": ["arm", "weight"], "points": [[40, 900], [35, 2000], [48, 2000], [48, 900]]}
        ],
    )
    assert aircraft.envelope[0].shape._locator.straight_parts == [False]
    data = (np.zeros((1, 3)), np.array([[100.0]]), np.zeros(1), np.array([100.0]))
    result = evaluate(aircraft, *data)
    assert result.envelope_ok["takeoff"][0] and result.envelope_ok["landing"][0]
    assert not result.burn_path_ok[0]
    assert assert_same_as_exact(monkeypatch, aircraft, data) == (0, 1)
