"""Envelope geometry: inclusive limits, slices, and the exact burn-path test."""

from __future__ import annotations

import numpy as np
import pytest

from loadcheck.engine import evaluate
from loadcheck.envelope import EnvelopeShape, polygon_problem

from .helpers import simple_aircraft

SQUARE = [[35.0, 1000.0], [35.0, 2000.0], [48.0, 2000.0], [48.0, 1000.0]]
# non-convex: forward limit 35 in to 1,500 lb, moves aft to 40 in at 1,800, then holds
NOTCH = [[35.0, 1000.0], [35.0, 1500.0], [40.0, 1800.0], [40.0, 2000.0], [48.0, 2000.0], [48.0, 1000.0]]


def arm_shape(points=SQUARE) -> EnvelopeShape:
    return EnvelopeShape(("arm", "weight"), points)


def covers(shape: EnvelopeShape, arm: float, weight: float) -> bool:
    return bool(shape.covers(weight, arm * weight, 0.0))


@pytest.mark.parametrize("arm, weight", SQUARE + [[35.0, 1500.0], [41.5, 2000.0], [48.0, 1234.5], [41.5, 1000.0]])
def test_vertices_and_edges_are_inside(arm, weight):
    assert covers(arm_shape(), arm, weight)


@pytest.mark.parametrize("arm, weight", [[34.99, 1500.0], [48.01, 1500.0], [40.0, 2000.5], [40.0, 999.0]])
def test_just_outside(arm, weight):
    assert not covers(arm_shape(), arm, weight)


def test_sloped_edge_point_inside_despite_rounding():
    # a point computed on the sloped forward edge of the notch shape, through a moment
    shape = arm_shape(NOTCH)
    weight = 1650.0
    arm = 35.0 + (weight - 1500.0) / 300.0 * 5.0
    moment = arm * weight
    assert bool(shape.covers(weight, moment, 0.0))
    assert not bool(shape.covers(weight, (arm - 1e-5) * weight, 0.0))


def test_polygon_problem_reasons():
    assert polygon_problem(SQUARE) is None
    # a bow tie: its two crossing edges (0,0)-(1,1) and (1,0)-(0,1) meet at (0.5, 0.5) (plane geometry)
    assert polygon_problem([[0, 0], [1, 1], [1, 0], [0, 1]]).startswith("its edges cross each other near (0.5, 0.5)")
    # a ring that touches itself at a corner: (1, 0) lies on the edge (0, 0)-(2, 0)
    assert polygon_problem([[0, 0], [2, 0], [2, 2], [1, 0], [0, 2]]).startswith("its edges touch each other at (1, 0)")
    assert polygon_problem([[0, 0], [1, 1], [2, 2]]) is not None
    assert "three" in polygon_problem([[0, 0], [1, 1], [0, 0]])


def test_slice_along_arm_and_weight():
    shape = arm_shape(NOTCH)
    assert shape.slice(1650.0, 40.0, 0.0, "arm") == [pytest.approx((37.5, 48.0))]
    assert shape.slice(1000.0 - 1, 40.0, 0.0, "arm") == []
    lo, hi = shape.slice(0.0, 42.0, 0.0, "weight")[0]
    assert (lo, hi) == (pytest.approx(1000.0), pytest.approx(2000.0))
    assert shape.slice(0.0, 37.5, 0.0, "weight")[0][1] == pytest.approx(1650.0)
    # at arm 36 the weight range stops at the sloped forward limit
    assert shape.slice(0.0, 36.0, 0.0, "weight")[0][1] == pytest.approx(1560.0)
    assert shape.slice(1500.0, 40.0, 0.0, "lateral") is None


def test_slice_on_moment_axes():
    corners = [[a * w / 1000, w] for a, w in NOTCH]
    shape = EnvelopeShape(("moment", "weight"), corners, moment_scale=1000)
    # at 1,500 lb the forward limit is 35 in, in moment terms as well
    lo, hi = shape.slice(1500.0, 40.0, 0.0, "arm")[0]
    assert lo == pytest.approx(35.0) and hi == pytest.approx(48.0)


def _straight_path(start: tuple[float, float], end: tuple[float, float], points=NOTCH):
    """An aircraft whose burn path runs from (arm, weight) ``start`` down to ``end``.

    The path is straight in moment-weight space: the payload is the end state and one tank
    (avgas at 6 lb/US gal, burned completely) holds the difference. Returns the path's
    stretches outside the envelope as fractions of the burn, and the state at a fraction.
    """
    (a0, w0), (a1, w1) = start, end
    assert w0 > w1
    aircraft = simple_aircraft(
        empty={"weight": w1, "arm": a1},
        limits={"max_takeoff_weight": 1e6},
        station=[{"id": "front", "arm": 35.0, "kind": "seat"}],
        tank=[{"id": "main", "arm": (a0 * w0 - a1 * w1) / (w0 - w1), "usable": (w0 - w1) / 6.0, "density": 6.0}],
        envelope=[{"category": "normal", "axes": ["arm", "weight"], "points": points}],
    )
    fuel = (w0 - w1) / 6.0
    found = evaluate(aircraft, [[0.0]], [[fuel]], [0.0], [fuel], explain=True)

    def state(u: float) -> tuple[float, float, float]:
        return (w0 + (w1 - w0) * u, a0 * w0 + (a1 * w1 - a0 * w0) * u, 0.0)

    return [(b / fuel, e / fuel) for b, e in found.path_outside[0]], bool(found.burn_path_ok[0]), state


def test_path_cutting_a_non_convex_corner_is_caught():
    shape = arm_shape(NOTCH)
    # both ends inside; the straight line passes forward of the corner at (40, 1800)
    assert covers(shape, 41.0, 1950.0) and covers(shape, 36.0, 1400.0)
    out, ok, state = _straight_path((41.0, 1950.0), (36.0, 1400.0))
    assert not ok and len(out) == 1
    begin, end = out[0]
    w, m, _ = state(begin)
    # it leaves on the vertical forward limit at 40 in
    assert m / w == pytest.approx(40.0, abs=1e-9)
    assert 0.0 < begin < end < 1.0


def test_path_inside_a_convex_envelope_stays_inside():
    out, ok, _ = _straight_path((47.0, 1990.0), (36.0, 1100.0), SQUARE)
    assert out == [] and ok


def test_path_along_an_edge_is_inside():
    out, ok, _ = _straight_path((35.0, 1990.0), (35.0, 1100.0), SQUARE)
    assert out == [] and ok


def test_crossings_agree_with_dense_sampling():
    rng = np.random.default_rng(7)
    shape = arm_shape(NOTCH)
    for _ in range(200):
        a0, a1 = rng.uniform(33, 50, 2)
        w0, w1 = np.sort(rng.uniform(950, 2050, 2))[::-1]
        out, ok, state = _straight_path((a0, w0), (a1, w1))
        u = np.linspace(0, 1, 4001)
        w = w0 + (w1 - w0) * u
        m = a0 * w0 + (a1 * w1 - a0 * w0) * u
        inside = shape.covers(w, m, np.zeros_like(w))
        for k in np.flatnonzero(~inside):
            assert any(b - 1e-9 <= u[k] <= e + 1e-9 for b, e in out), (a0, w0, a1, w1, u[k])
        for b, e in out:
            mid = 0.5 * (b + e)
            assert not bool(shape.covers(*state(mid)))
        assert ok == (not out and inside[0] and inside[-1])


def test_every_axis_is_one_entry_of_the_table():
    # adding an axis is one entry of loadcheck.envelope.AXES; each entry gives the handbook's
    # definition: CG = M / W and %MAC = 100 (CG - LEMAC) / MAC (FAA-H-8083-1B chapter 2)
    from typing import get_args

    from loadcheck.aircraft import Mac
    from loadcheck.envelope import AXES, Axis

    assert set(get_args(Axis)) == set(AXES)
    mac = Mac(leading_edge_arm=30.0, length=50.0)
    w, m, lat = 1500.0, 1500.0 * 42.0, 1500.0 * -1.5
    expected = {"weight": w, "moment": m / 1000.0, "arm": 42.0, "lateral_arm": -1.5, "mac": 100 * (42.0 - 30.0) / 50.0}
    for axis, value in expected.items():
        other = "arm" if axis == "weight" else "weight"
        shape = EnvelopeShape((axis, other), [[0, 1], [0, 2], [1, 2]], moment_scale=1000.0, mac=mac)
        x, _ = shape.coords(w, m, lat)
        assert float(x) == pytest.approx(value, rel=1e-12), axis
        assert shape.is_lateral == (axis == "lateral_arm")


# -- containment of many points: convex parts and half-planes (envelope._Locator) ----------------

ZIGZAG = [
    [35.0, 1000.0],
    [38.0, 1300.0],
    [35.5, 1600.0],
    [39.0, 2000.0],
    [48.0, 2000.0],
    [44.0, 1500.0],
    [48.0, 1000.0],
]


def _near_edges(shape: EnvelopeShape, n: int, seed: int) -> tuple[np.ndarray, np.ndarray]:
    """Points on, just inside and just outside every edge and corner (scaled distances of
    0 to 1e-8, about the tolerance), and anywhere around the envelope."""
    rng = np.random.default_rng(seed)
    corners = shape.corners
    ends = np.roll(corners, -1, axis=0)
    pick = rng.integers(0, len(corners), n)
    t = rng.choice([0.0, 1.0, 0.5, rng.uniform()], n)
    on = corners[pick] + t[:, None] * (ends[pick] - corners[pick])
    offset = rng.choice([0.0, 1e-12, 5e-10, 1e-9, 1.9e-9, 2.1e-9, 1e-8, 0.05], (n, 2)) * rng.choice([-1, 1], (n, 2))
    near = on + offset * shape.span
    anywhere = shape.origin + rng.uniform(-0.2, 1.2, (n, 2)) * shape.span
    points = np.concatenate([near, anywhere])
    return points[:, 0], points[:, 1]


@pytest.mark.parametrize("points", [SQUARE, NOTCH, ZIGZAG], ids=["convex", "notch", "zigzag"])
def test_many_points_are_contained_as_shapely_finds_them(points):
    # the half-plane test settles what it can and asks shapely the rest: the same answer as one
    # shapely.intersects_xy call on the covering for every point, on edges and corners as well
    import shapely

    from loadcheck.envelope import FAST_COVERS_FROM

    shape = arm_shape(points)
    arm, weight = _near_edges(shape, 20_000, 1)
    assert len(arm) >= FAST_COVERS_FROM
    state = (weight, arm * weight, np.zeros_like(weight))
    x, y = shape.coords(*state)
    (ox, oy), (wx, wy) = shape._origin_span
    expected = shapely.intersects_xy(shape.covering, (x - ox) / wx, (y - oy) / wy)
    assert np.array_equal(shape.covers(*state), expected)
    assert 0.2 < expected.mean() < 0.9


@pytest.mark.parametrize("points", [SQUARE, NOTCH, ZIGZAG], ids=["convex", "notch", "zigzag"])
def test_the_convex_parts_lie_within_the_envelope_and_cover_it(points):
    # every point inside a part by the margin is inside the polygon; every point well inside the
    # polygon (1e-6 of its extent from the boundary) is inside some part
    import shapely

    from loadcheck.envelope import STRICT_MARGIN

    shape = arm_shape(points)
    arm, weight = _near_edges(shape, 20_000, 3)
    x, y = shape.coords(weight, arm * weight, np.zeros_like(weight))
    locator = shape._locator
    in_part = np.zeros(len(x), dtype=bool)
    for piece in locator.pieces:
        in_part |= locator._least(x, y, piece) >= STRICT_MARGIN
    normal = shapely.Polygon((shape.corners - shape.origin) / shape.span)
    sx, sy = (x - shape.origin[0]) / shape.span[0], (y - shape.origin[1]) / shape.span[1]
    well_inside = shapely.contains_xy(normal.buffer(-1e-6), sx, sy)
    inside = shapely.intersects_xy(normal, sx, sy)
    assert inside[in_part].all()
    assert in_part[well_inside].all()
    assert well_inside.sum() > 1_000
    assert shape.convex == (points is SQUARE)


def test_a_point_inside_a_straight_part_is_inside_the_envelope():
    # moment against weight: every part is straight, so each has a bit in parts()
    shape = EnvelopeShape(("moment", "weight"), [[a * w / 1000, w] for a, w in ZIGZAG], moment_scale=1000.0)
    assert not shape.convex and all(shape._locator.straight_parts)
    rng = np.random.default_rng(2)
    weight = rng.uniform(900, 2100, 20_000)
    moment = rng.uniform(30, 50, 20_000) * weight
    parts = shape.parts(weight, moment, np.zeros_like(weight))
    inside = shape.covers(weight, moment, np.zeros_like(weight))
    assert (parts != 0).sum() > 1_000
    assert inside[parts != 0].all()
    assert ((parts != 0) | ~inside).mean() > 0.99  # nearly every point inside is in a part


def test_arm_range_of_a_lateral_envelope_is_a_programming_error():
    # a lateral envelope does not limit the longitudinal CG: asking it is the caller's mistake
    # (TypeError), not an input problem (ValueError), and says which envelope it was
    lateral = EnvelopeShape(("lateral_arm", "weight"), [[-3.0, 900.0], [-3.0, 2000.0], [3.0, 2000.0], [3.0, 900.0]])
    with pytest.raises(TypeError, match=r"lateral envelope .*lateral_arm, weight"):
        lateral.arm_range()
    assert arm_shape().arm_range() == (35.0, 48.0)


@pytest.mark.parametrize("points", [SQUARE, NOTCH], ids=["convex", "notch"])
def test_regression_a_repeated_corner_made_every_point_of_a_large_batch_outside(points):
    # a repeated corner (allowed: polygon_problem) is an edge of no length, whose half-plane was
    # NaN: the half-plane test then called every one of 256 or more points outside
    import shapely

    repeated = [*points[:2], points[1], *points[2:]]
    assert polygon_problem(repeated) is None
    shape = arm_shape(repeated)
    arm, weight = _near_edges(shape, 2_000, 4)
    state = (weight, arm * weight, np.zeros_like(weight))
    x, y = shape.coords(*state)
    (ox, oy), (wx, wy) = shape._origin_span
    with np.errstate(all="raise"):
        got = shape.covers(*state)
    assert np.array_equal(got, shapely.intersects_xy(shape.covering, (x - ox) / wx, (y - oy) / wy))
    assert got.any()
