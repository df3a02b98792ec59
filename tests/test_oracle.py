"""The library against an independent oracle (tests/oracle.py) on random aircraft and loadings.

Random aircraft: convex and non-convex (star-shaped) envelopes on arm-weight,
moment/1000-weight and %MAC-weight axes, with lateral envelopes (lateral arm or lateral
moment against weight) and tanks whose arm moves with the fuel; random loadings, sequential and proportional burns.
The default run checks
600 cases, `pytest --long` 10,000 (tests/conftest.py, ORACLE_CASES); the engine's batch
path is checked on rows of tests/helpers.random_loadings, one aircraft per 30 cases.

Zero disagreements are allowed where the oracle decides; the oracle declines to decide
only within the documented tolerance of a limit (and, for the burn path, where a sample
lies closer to the boundary than the distance to the next sample).
"""

from __future__ import annotations

import math
import random
from fractions import Fraction as F

import pytest

from loadcheck import check_loading
from loadcheck.engine import evaluate
from loadcheck.errors import LoadcheckError
from loadcheck.files import parse_aircraft
from loadcheck.loading import Loading

from . import oracle
from .helpers import random_loadings


def random_polygon(rng: random.Random, center: tuple[float, float], radius: tuple[float, float], convex: bool):
    count = rng.randint(4, 9)
    angles = sorted(rng.uniform(0, 2 * math.pi) for _ in range(count))
    points = []
    for angle in angles:
        scale = 1.0 if convex else rng.uniform(0.45, 1.0)
        points.append(
            (
                round(center[0] + scale * radius[0] * math.cos(angle), 3),
                round(center[1] + scale * radius[1] * math.sin(angle), 1),
            )
        )
    return points


def random_case(seed: int) -> tuple[dict, dict]:
    rng = random.Random(seed)
    arm_c, weight_c = rng.uniform(30, 90), rng.uniform(1500, 4000)
    ra, rw = rng.uniform(4, 12), rng.uniform(300, 1200)
    convex = rng.random() < 0.4
    base = random_polygon(rng, (arm_c, weight_c), (ra, rw), convex)
    axes = rng.choice(["arm", "moment", "mac"])
    mac = {"leading_edge_arm": round(arm_c - 15, 2), "length": round(rng.uniform(40, 70), 2)}
    if axes == "arm":
        points, envelope = base, {"axes": ["arm", "weight"]}
    elif axes == "moment":
        points, envelope = (
            [(round(a * w / 1000, 4), w) for a, w in base],
            {"axes": ["moment", "weight"], "moment_scale": 1000},
        )
    else:
        points, envelope = (
            [(round(100 * (a - mac["leading_edge_arm"]) / mac["length"], 4), w) for a, w in base],
            {"axes": ["mac", "weight"]},
        )
    envelope.update({"category": "normal", "points": [list(p) for p in points]})
    lateral = rng.random() < 0.3
    top = max(w for _, w in base)
    empty_weight = round(weight_c - rw * rng.uniform(0.3, 0.9), 1)
    aircraft = {
        "name": f"random {seed}",
        "registration": f"R{seed}",
        "units": {"mass": "lb", "arm": "in", "fuel_volume": "usgal"},
        "empty": {"weight": empty_weight, "arm": round(arm_c + rng.uniform(-3, 3), 2)},
        "limits": {"max_takeoff_weight": round(top * rng.uniform(0.95, 1.05), 1)},
        "mac": mac,
        "station": [],
        "tank": [],
        "envelope": [envelope],
    }
    aircraft["limits"]["max_ramp_weight"] = round(aircraft["limits"]["max_takeoff_weight"] + rng.uniform(0, 20), 1)
    if rng.random() < 0.3:
        aircraft["limits"]["max_zero_fuel_weight"] = round(aircraft["limits"]["max_takeoff_weight"] * 0.9, 1)
    if rng.random() < 0.2:
        aircraft["limits"]["zero_fuel_cg"] = "limit"
    if lateral:
        aircraft["empty"]["lateral_arm"] = round(rng.uniform(-0.5, 0.5), 3)
        lat_points = random_polygon(rng, (0.0, weight_c), (rng.uniform(2, 5), rw), rng.random() < 0.5)
        if rng.random() < 0.5:
            lateral_envelope = {"axes": ["lateral_arm", "weight"], "points": [list(p) for p in lat_points]}
        else:  # drawn as lateral moment against weight (FAA-H-8083-1B ch. 8, fig. 8-3), moment / 1 or / 100
            scale = rng.choice([1.0, 100.0])
            lateral_envelope = {
                "axes": ["lateral_moment", "weight"],
                "moment_scale": scale,
                "points": [[round(a * w / scale, 4), w] for a, w in lat_points],
            }
        aircraft["envelope"].append({"category": "normal", **lateral_envelope})
    for i in range(rng.randint(2, 4)):
        station = {
            "id": f"s{i}",
            "arm": round(arm_c + rng.uniform(-20, 45), 2),
            "max_weight": round(rng.uniform(100, 500), 1),
        }
        if lateral:
            station["lateral_arm"] = round(rng.uniform(-15, 15), 2)
        aircraft["station"].append(station)
    if rng.random() < 0.3:
        aircraft["station_group"] = [{"label": "pair", "stations": ["s0", "s1"], "max_weight": 500.0}]
    for i in range(rng.randint(1, 2)):
        usable = round(rng.uniform(20, 60), 1)
        tank = {"id": f"t{i}", "usable": usable, "fuel": "avgas"}
        if rng.random() < 0.3:
            knots = sorted({0.0, usable, *(round(rng.uniform(0, usable), 1) for _ in range(rng.randint(0, 2)))})
            tank["arm_table"] = [[q, round(arm_c + rng.uniform(-12, 12), 2)] for q in knots]
        else:
            tank["arm"] = round(arm_c + rng.uniform(-12, 12), 2)
        if lateral:
            tank["lateral_arm"] = round(rng.uniform(-10, 10), 2)
        aircraft["tank"].append(tank)
    load = {
        s["id"]: round(rng.uniform(0, s["max_weight"] * 1.05), 1) for s in aircraft["station"] if rng.random() < 0.8
    }
    fuel = {t["id"]: round(rng.uniform(0, t["usable"]), 2) for t in aircraft["tank"]}
    order = None if rng.random() < 0.5 else [t["id"] for t in aircraft["tank"]][:: rng.choice([1, -1])]
    burnable = sum(fuel.values()) if order is None else sum(fuel[t] for t in order)
    taxi = round(min(rng.uniform(0, 2), burnable), 2)
    trip = round((burnable - taxi) * rng.choice([0.0, rng.uniform(0, 1)]), 2)
    loading = {"load": load, "fuel": fuel, "order": order, "taxi": taxi, "trip": trip}
    return aircraft, loading


def compare(seed: int) -> list[str]:
    aircraft_data, loading_data = random_case(seed)
    try:
        aircraft = parse_aircraft(aircraft_data)
    except LoadcheckError:
        return []  # a random polygon may self-intersect after rounding: the library refuses it, fail closed
    loading = Loading(
        load=loading_data["load"],
        fuel=loading_data["fuel"],
        burn={"taxi": loading_data["taxi"], "trip": loading_data["trip"], "order": loading_data["order"] or "together"},
    )
    result = check_loading(aircraft, loading)
    expected = oracle.verdicts(aircraft_data, loading_data)
    got = {c.condition: c.ok for c in result.conditions} | {"burn_path": result.burn_path.ok, "ok": result.ok}
    return [
        f"seed {seed}: {key} library {got[key]} oracle {value}"
        for key, value in expected.items()
        if value is not None and got[key] != value
    ]


def test_oracle_agrees(oracle_cases):
    disagreements: list[str] = []
    for seed in range(oracle_cases):
        disagreements += compare(seed)
        if len(disagreements) > 20:
            break
    assert not disagreements, "\n".join(disagreements)


def test_the_batch_engine_agrees_with_the_oracle(oracle_cases):
    # the engine's arrays path (the fleet check, plan tables) on many loadings at once,
    # from the one random-loading generator of the tests and the benchmarks
    # 64 loadings a batch, so the containment of the four conditions (256 states) takes the
    # half-plane path (envelope.FAST_COVERS_FROM); the first 25 are compared with the oracle
    rows, compared = 64, 25
    disagreements: list[str] = []
    verdicts_seen: set[bool] = set()
    for seed in range(max(5, oracle_cases // 30)):
        aircraft_data, loading_data = random_case(seed)
        try:
            aircraft = parse_aircraft(aircraft_data)
        except LoadcheckError:
            continue
        order = loading_data["order"]
        stations, fuel, taxi, trip = random_loadings(aircraft, rows, order, seed=seed, zero_trip=0.1)
        batch = evaluate(aircraft, stations, fuel, taxi, trip, order=order)
        for i in range(compared):
            loading = {
                "load": {s.id: float(stations[i, j]) for j, s in enumerate(aircraft.station)},
                "fuel": {t.id: float(fuel[i, j]) for j, t in enumerate(aircraft.tank)},
                "order": order,
                "taxi": float(taxi[i]),
                "trip": float(trip[i]),
            }
            got = {name: bool(ok[i]) for name, ok in batch.condition_ok.items()}
            got |= {"burn_path": bool(batch.burn_path_ok[i]), "ok": bool(batch.ok[i])}
            verdicts_seen.add(got["ok"])
            disagreements += [
                f"seed {seed} row {i}: {key} engine {got[key]} oracle {value}"
                for key, value in oracle.verdicts(aircraft_data, loading).items()
                if value is not None and got[key] != value
            ]
        if len(disagreements) > 20:
            break
    assert not disagreements, "\n".join(disagreements)
    assert verdicts_seen == {True, False}  # loadings within limits and loadings out of them


def test_points_on_vertices_and_edges_are_inside():
    for seed in range(200):
        aircraft_data, _ = random_case(seed)
        try:
            aircraft = parse_aircraft(aircraft_data)
        except LoadcheckError:
            continue
        for envelope in aircraft.envelope:
            corners = [(F(x), F(y)) for x, y in envelope.points]
            for (ax, ay), (bx, by) in zip(corners, corners[1:] + corners[:1], strict=True):
                for t in (F(0), F(1, 3), F(1, 2)):
                    x, y = ax + t * (bx - ax), ay + t * (by - ay)
                    assert oracle.point_status(x, y, corners) == "on"
                    # through the library's own coordinates: weight and moment from the point
                    shape = envelope.shape
                    assert bool(shape.covers(*_state_at(envelope, aircraft, float(x), float(y))))


def _state_at(envelope, aircraft, x: float, y: float) -> tuple[float, float, float]:
    values = dict(zip(envelope.axes, (x, y), strict=True))
    weight = values.get("weight", 1000.0)
    if "arm" in values:
        arm = values["arm"]
    elif "moment" in values:
        arm = values["moment"] * envelope.moment_scale / weight
    elif "mac" in values:
        arm = aircraft.mac.leading_edge_arm + values["mac"] * aircraft.mac.length / 100.0
    else:
        arm = 0.0
    lateral = values.get("lateral_arm", values.get("lateral_moment", 0.0) * envelope.moment_scale / weight)
    return weight, arm * weight, lateral * weight


@pytest.mark.parametrize("seed", [0, 1, 2, 3])
def test_oracle_itself_on_a_hand_case(seed):
    # the oracle's arithmetic on the simple box is the textbook sum of moments
    aircraft = {
        "units": {"mass": "lb", "arm": "in", "fuel_volume": "usgal"},
        "empty": {"weight": 1000.0, "arm": 40.0},
        "limits": {"max_takeoff_weight": 2000.0},
        "station": [{"id": "a", "arm": 35.0}],
        "tank": [{"id": "t", "arm": 45.0, "usable": 40.0, "fuel": "avgas"}],
        "envelope": [
            {"category": "normal", "axes": ["arm", "weight"], "points": [[35, 900], [35, 2000], [48, 2000], [48, 900]]}
        ],
    }
    w, m, _ = oracle.state(aircraft, {"a": F(200)}, {"t": F(10 * seed)})
    assert w == 1200 + 60 * seed and m == 40000 + 7000 + 60 * seed * 45
