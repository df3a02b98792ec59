"""An independent, deliberately simple reference implementation of the loading verdict.

It shares no code with loadcheck: it reads the same plain aircraft and loading data,
computes weights and moments in exact rational arithmetic (``fractions``), tests points
against polygons with its own crossing-number method (exact, boundary inclusive), and
checks the fuel-burn path by dense stepping with an error bound.

Each verdict is ``True`` (within), ``False`` (out) or ``None`` (undecided: within the
library's documented tolerance of a limit, or too close to the boundary for the stepping
to be sure). Only decided verdicts are compared with the library.
"""

from __future__ import annotations

import math
from fractions import Fraction as F
from typing import Any

LB_PER_KG = None  # the oracle works in the file's own units only

DENSITY_LB_PER_USGAL = {"avgas": F(6), "mogas": F(6), "jet": F(67, 10)}
TOLERANCE = 1e-9  # the library's documented containment tolerance (fraction of the envelope's extent)
STEPS = 400  # samples along the burn path


def fr(value: float) -> F:
    return F(value)


# -- geometry, exact ----------------------------------------------------------------------


def _on_segment(px: F, py: F, ax: F, ay: F, bx: F, by: F) -> bool:
    cross = (bx - ax) * (py - ay) - (by - ay) * (px - ax)
    if cross != 0:
        return False
    return min(ax, bx) <= px <= max(ax, bx) and min(ay, by) <= py <= max(ay, by)


def point_status(px: F, py: F, polygon: list[tuple[F, F]]) -> str:
    """'in', 'on' or 'out' by the crossing-number rule, in exact arithmetic."""
    n = len(polygon)
    inside = False
    for i in range(n):
        ax, ay = polygon[i]
        bx, by = polygon[(i + 1) % n]
        if _on_segment(px, py, ax, ay, bx, by):
            return "on"
        if (ay > py) != (by > py):
            x_cross = ax + (py - ay) * (bx - ax) / (by - ay)
            if px < x_cross:
                inside = not inside
    return "in" if inside else "out"


def scaled_distance(px: float, py: float, polygon: list[tuple[float, float]]) -> float:
    """Distance from a point to the polygon's boundary, each axis scaled by the polygon's extent."""
    xs, ys = [p[0] for p in polygon], [p[1] for p in polygon]
    sx, sy = (max(xs) - min(xs)) or 1.0, (max(ys) - min(ys)) or 1.0
    best = math.inf
    for i in range(len(polygon)):
        ax, ay = polygon[i][0] / sx, polygon[i][1] / sy
        bx, by = polygon[(i + 1) % len(polygon)][0] / sx, polygon[(i + 1) % len(polygon)][1] / sy
        x, y = px / sx, py / sy
        dx, dy = bx - ax, by - ay
        if dx == 0 and dy == 0:  # a repeated corner
            best = min(best, math.hypot(x - ax, y - ay))
            continue
        t = max(0.0, min(1.0, ((x - ax) * dx + (y - ay) * dy) / (dx * dx + dy * dy)))
        best = min(best, math.hypot(x - ax - t * dx, y - ay - t * dy))
    return best


def inside_verdict(px: F, py: F, polygon: list[tuple[F, F]]) -> bool | None:
    """True inside or on; False outside by more than twice the tolerance; None in between."""
    status = point_status(px, py, polygon)
    if status != "out":
        return True
    distance = scaled_distance(float(px), float(py), [(float(a), float(b)) for a, b in polygon])
    return False if distance > 2 * TOLERANCE else None


# -- the aircraft and loading, from plain data ----------------------------------------------


def density(tank: dict[str, Any]) -> F:
    if "density" in tank:
        return fr(tank["density"])
    return DENSITY_LB_PER_USGAL[tank["fuel"]]  # the oracle's aircraft are in lb and US gal


def tank_arm(tank: dict[str, Any], quantity: F) -> F:
    table = tank.get("arm_table")
    if not table:
        return fr(tank["arm"])
    points = [(fr(q), fr(a)) for q, a in table]
    if quantity <= points[0][0]:
        return points[0][1]
    for (q0, a0), (q1, a1) in zip(points, points[1:], strict=False):
        if quantity <= q1:
            return a0 + (a1 - a0) * (quantity - q0) / (q1 - q0)
    return points[-1][1]


def fuel_left(fuel: dict[str, F], order: list[str] | None, burned: F) -> dict[str, F]:
    left = dict(fuel)
    if order is None:
        total = sum(fuel.values(), F(0))
        share = max(F(0), 1 - burned / total) if total > 0 else F(0)
        return {k: v * share for k, v in left.items()}
    remaining = burned
    for tank in order:
        used = min(left[tank], remaining)
        left[tank] -= used
        remaining -= used
    return left


def state(aircraft: dict[str, Any], load: dict[str, F], fuel: dict[str, F]) -> tuple[F, F, F]:
    empty = aircraft["empty"]
    w, m, lat = (
        fr(empty["weight"]),
        fr(empty["weight"]) * fr(empty["arm"]),
        fr(empty["weight"]) * fr(empty.get("lateral_arm", 0.0)),
    )
    stations = {s["id"]: s for s in aircraft["station"]}
    for sid, weight in load.items():
        w += weight
        m += weight * fr(stations[sid]["arm"])
        lat += weight * fr(stations[sid].get("lateral_arm", 0.0))
    for tank in aircraft["tank"]:
        q = fuel.get(tank["id"], F(0))
        mass = q * density(tank)
        w += mass
        m += mass * tank_arm(tank, q)
        lat += mass * fr(tank.get("lateral_arm", 0.0))
    return w, m, lat


def coordinates(envelope: dict[str, Any], mac: dict[str, Any] | None, w: F, m: F, lat: F) -> tuple[F, F]:
    def axis(name: str) -> F:
        if name == "weight":
            return w
        if name == "moment":
            return m / fr(envelope.get("moment_scale", 1.0))
        if name == "arm":
            return m / w
        if name == "lateral_arm":
            return lat / w
        if name == "lateral_moment":
            return lat / fr(envelope.get("moment_scale", 1.0))
        assert mac is not None
        return 100 * (m / w - fr(mac["leading_edge_arm"])) / fr(mac["length"])

    return axis(envelope["axes"][0]), axis(envelope["axes"][1])


def _top(envelope: dict[str, Any]) -> F | None:
    if "weight" not in envelope["axes"]:
        return None
    index = envelope["axes"].index("weight")
    return max(fr(p[index]) for p in envelope["points"])


def weight_verdict(weight: F, limit: F, above: bool = True) -> bool | None:
    """Within a weight limit; None within the library's 1e-9 relative tolerance of it."""
    if above:
        if weight <= limit:
            return True
        return False if weight > limit * (1 + F(2, 10**9)) else None
    if weight >= limit:
        return True
    return False if weight < limit * (1 - F(2, 10**9)) else None


def _and(*verdicts: bool | None) -> bool | None:
    if any(v is False for v in verdicts):
        return False
    if any(v is None for v in verdicts):
        return None
    return True


def verdicts(aircraft: dict[str, Any], loading: dict[str, Any]) -> dict[str, bool | None]:
    """The oracle's verdicts: each condition, the burn path, and the whole loading."""
    category = loading.get("category") or aircraft["envelope"][0]["category"]
    envelopes = [e for e in aircraft["envelope"] if e["category"] == category]
    polygons = [[(fr(x), fr(y)) for x, y in e["points"]] for e in envelopes]
    mac = aircraft.get("mac")
    limits = aircraft["limits"]
    mtow = fr(limits["max_takeoff_weight"])
    max_weight = {
        "ramp": fr(limits.get("max_ramp_weight", limits["max_takeoff_weight"])),
        "takeoff": mtow,
        "landing": fr(limits.get("max_landing_weight", limits["max_takeoff_weight"])),
        "zero_fuel": fr(limits["max_zero_fuel_weight"]) if "max_zero_fuel_weight" in limits else None,
    }
    load = {k: fr(v) for k, v in loading["load"].items()}
    fuel = {t["id"]: fr(loading["fuel"].get(t["id"], 0.0)) for t in aircraft["tank"]}
    order = loading.get("order")
    taxi, trip = fr(loading["taxi"]), fr(loading["trip"])
    burned = {"ramp": F(0), "takeoff": taxi, "landing": taxi + trip}
    states = {name: state(aircraft, load, fuel_left(fuel, order, b)) for name, b in burned.items()}
    states["zero_fuel"] = state(aircraft, load, {})
    out: dict[str, bool | None] = {}
    zero_fuel_cg_limit = limits.get("zero_fuel_cg") == "limit"
    overall: list[bool | None] = []
    for name, (w, m, lat) in states.items():
        parts: list[bool | None] = []
        if max_weight[name] is not None:
            parts.append(weight_verdict(w, max_weight[name]))
        if name in ("takeoff", "landing") and "min_flight_weight" in limits:
            parts.append(weight_verdict(w, fr(limits["min_flight_weight"]), above=False))
        weight_part = _and(*parts)
        cg_parts = []
        for envelope, polygon in zip(envelopes, polygons, strict=True):
            tw, tm, tl = w, m, lat
            top = _top(envelope)
            if name == "ramp" and top is not None and w > top:
                tw, tm, tl = top, m / w * top, lat / w * top
            cg_parts.append(inside_verdict(*coordinates(envelope, mac, tw, tm, tl), polygon))
        cg = _and(*cg_parts)
        out[name] = _and(weight_part, cg)
        overall.append(weight_part)
        if name != "zero_fuel" or zero_fuel_cg_limit:
            overall.append(cg)
    out["burn_path"] = _path_verdict(aircraft, envelopes, polygons, mac, load, fuel, order, taxi, trip, out["takeoff"])
    overall.append(out["burn_path"])
    for station in aircraft["station"]:
        weight = load.get(station["id"], F(0))
        if "max_weight" in station:
            overall.append(weight_verdict(weight, fr(station["max_weight"])))
        if "min_weight" in station:
            overall.append(weight_verdict(weight, fr(station["min_weight"]), above=False))
    for group in aircraft.get("station_group", []):
        weight = sum((load.get(s, F(0)) for s in group["stations"]), F(0))
        if "max_weight" in group:
            overall.append(weight_verdict(weight, fr(group["max_weight"])))
    out["ok"] = _and(*overall)
    return out


def _path_verdict(aircraft, envelopes, polygons, mac, load, fuel, order, taxi, trip, takeoff_in) -> bool | None:
    """Dense stepping along the burn with an error bound (in floats, vectorised over the steps).

    Between two samples the path moves by at most its arc length, bounded by 1.01 times the
    chord between them (the pieces are gently curved), in the envelope's scaled axes: if
    every sample lies inside by more than the chords on either side of it, the whole path
    is inside; if some sample lies outside by more than twice the tolerance, the path
    leaves; otherwise the oracle does not decide.
    """
    import numpy as np

    if trip == 0:
        w, m, lat = state(aircraft, load, fuel_left(fuel, order, taxi))
        return _and(
            *(inside_verdict(*coordinates(e, mac, w, m, lat), p) for e, p in zip(envelopes, polygons, strict=True))
        )
    burned = float(taxi) + float(trip) * np.linspace(0.0, 1.0, STEPS + 1)
    start = {k: float(v) for k, v in fuel.items()}
    if order is None:
        total = sum(start.values())
        share = np.clip(1.0 - burned / total, 0.0, 1.0)
        left = {k: v * share for k, v in start.items()}
    else:
        left = {k: np.full_like(burned, v) for k, v in start.items()}
        remaining = burned.copy()
        for tank in order:
            used = np.minimum(left[tank], remaining)
            left[tank] = left[tank] - used
            remaining = remaining - used
    empty = aircraft["empty"]
    w = float(empty["weight"]) + sum(float(v) for v in load.values()) + np.zeros_like(burned)
    stations = {s["id"]: s for s in aircraft["station"]}
    m = (
        float(empty["weight"]) * float(empty["arm"])
        + sum(float(v) * stations[k]["arm"] for k, v in load.items())
        + np.zeros_like(burned)
    )
    lat = (
        float(empty["weight"]) * empty.get("lateral_arm", 0.0)
        + sum(float(v) * stations[k].get("lateral_arm", 0.0) for k, v in load.items())
        + np.zeros_like(burned)
    )
    for tank in aircraft["tank"]:
        q = left[tank["id"]]
        mass = q * float(density(tank))
        if tank.get("arm_table"):
            table = np.array(tank["arm_table"], dtype=float)
            arm = np.interp(q, table[:, 0], table[:, 1])
        else:
            arm = tank["arm"]
        w, m, lat = w + mass, m + mass * arm, lat + mass * tank.get("lateral_arm", 0.0)
    decided_in = True
    for envelope, polygon in zip(envelopes, polygons, strict=True):
        axes = []
        for name in envelope["axes"]:
            if name == "weight":
                axes.append(w)
            elif name == "moment":
                axes.append(m / envelope.get("moment_scale", 1.0))
            elif name == "arm":
                axes.append(m / w)
            elif name == "lateral_arm":
                axes.append(lat / w)
            elif name == "lateral_moment":
                axes.append(lat / envelope.get("moment_scale", 1.0))
            else:
                axes.append(100.0 * (m / w - mac["leading_edge_arm"]) / mac["length"])
        px, py = axes
        corners = np.array([(float(a), float(b)) for a, b in polygon])
        span = corners.max(axis=0) - corners.min(axis=0)
        x, y = px / span[0], py / span[1]
        cx, cy = corners[:, 0] / span[0], corners[:, 1] / span[1]
        inside = np.zeros_like(x, dtype=bool)
        distance = np.full_like(x, np.inf)
        for i in range(len(cx)):
            ax, ay, bx, by = cx[i], cy[i], cx[(i + 1) % len(cx)], cy[(i + 1) % len(cy)]
            crosses = (ay > y) != (by > y)
            with np.errstate(divide="ignore", invalid="ignore"):
                x_cross = ax + (y - ay) * (bx - ax) / (by - ay)
            inside ^= crosses & (x < x_cross)
            dx, dy = bx - ax, by - ay
            if dx == 0 and dy == 0:  # a repeated corner
                distance = np.minimum(distance, np.hypot(x - ax, y - ay))
                continue
            t = np.clip(((x - ax) * dx + (y - ay) * dy) / (dx * dx + dy * dy), 0.0, 1.0)
            distance = np.minimum(distance, np.hypot(x - ax - t * dx, y - ay - t * dy))
        if np.any(~inside & (distance > 2 * TOLERANCE)):
            return False
        chord = np.hypot(np.diff(x), np.diff(y)) * 1.01
        reach = np.maximum(np.concatenate([[0.0], chord]), np.concatenate([chord, [0.0]]))
        if np.any(~inside) or np.any(distance <= reach):
            decided_in = False
    return True if decided_in else None
