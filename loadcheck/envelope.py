"""CG envelope geometry: containment, limits at a weight, and the fuel-burn path.

An envelope is a polygon on two of the axes ``arm``, ``moment`` (read as moment /
moment_scale), ``mac`` (percent of MAC), ``lateral_arm`` and ``weight``. A loading state
is described by its weight W, moment M and lateral moment L; each axis is a ratio of
polynomials in those:

=============  ==========================  ===========
axis           numerator                   denominator
=============  ==========================  ===========
weight         W                           1
moment         M / moment_scale            1
arm            M                           W
lateral_arm    L                           W
mac            100 (M - LEMAC W) / MAC     W
=============  ==========================  ===========

(CG = moment / weight, FAA-H-8083-1B chapter 2; percent MAC, same chapter.)

Limits are inclusive. A point counts as inside when it lies within ``TOLERANCE`` of the
polygon, measured after scaling each axis by the envelope's extent on it: one part in
10^9, far below any display precision, so that floating-point noise cannot move a point
that sits exactly on a limit line to the outside.

Along the fuel burn, W is linear and M and L are at most quadratic in the fuel burned
(quadratic only for tanks whose arm moves with quantity), so the path meets an edge line
where a polynomial of degree at most two has a root (:meth:`EnvelopeShape.edge_polynomials`).
The engine (:mod:`loadcheck.engine`) splits the path at every such root and tests each
piece at its middle: an exact test of the curve, not sampling.
"""

from __future__ import annotations

from collections.abc import Sequence
from typing import TYPE_CHECKING, Literal

import numpy as np
import shapely

if TYPE_CHECKING:
    from .aircraft import Mac

__all__ = [
    "TOLERANCE",
    "Axis",
    "EnvelopeShape",
    "Vary",
    "polygon_problem",
]

Axis = Literal["arm", "moment", "mac", "lateral_arm", "weight"]

TOLERANCE = 1e-9
"""Containment tolerance, as a fraction of the envelope's extent on each axis."""

Vary = Literal["arm", "weight", "lateral"]


def polygon_problem(points: Sequence[Sequence[float]]) -> str | None:
    """Why a list of corners is not a usable envelope polygon, or None when it is.

    The ring is closed automatically (repeating the first corner is allowed). The reason
    for an invalid shape is the one shapely/GEOS gives (``is_valid_reason``).
    """
    corners = [tuple(map(float, p)) for p in points]
    if len(corners) > 1 and corners[0] == corners[-1]:
        corners = corners[:-1]
    if len(set(corners)) < 3:
        return "it needs at least three distinct corners"
    polygon = shapely.Polygon(corners)
    if not polygon.is_valid:
        return str(shapely.is_valid_reason(polygon))
    if polygon.area <= 0:
        return "its corners enclose no area"
    return None


class EnvelopeShape:
    """Prepared geometry of one envelope (built once, by the aircraft model).

    Parameters
    ----------
    axes : x and y axis names
    points : polygon corners [axis units]
    moment_scale : divisor of a moment axis [-]
    mac : the aircraft's MAC, needed for a ``mac`` axis
    """

    def __init__(
        self,
        axes: tuple[Axis, Axis],
        points: Sequence[Sequence[float]],
        moment_scale: float = 1.0,
        mac: Mac | None = None,
    ):
        corners = np.asarray(points, dtype=float)
        if np.array_equal(corners[0], corners[-1]):
            corners = corners[:-1]
        if shapely.Polygon(corners).exterior.is_ccw is False:
            corners = corners[::-1]
        self.axes = axes
        self.moment_scale = float(moment_scale)
        self.mac = mac
        self.corners = corners
        self.origin = corners.min(axis=0)
        self.span = corners.max(axis=0) - self.origin
        self.polygon = shapely.Polygon(corners)
        normal = (corners - self.origin) / self.span
        self._edges = np.stack([normal, np.roll(normal, -1, axis=0)], axis=1)  # (n, 2 ends, xy)
        self._origin_span = ((float(self.origin[0]), float(self.origin[1])), (float(self.span[0]), float(self.span[1])))
        self._edge_list = [(float(p[0]), float(p[1]), float(q[0] - p[0]), float(q[1] - p[1])) for p, q in self._edges]
        (x1, y1), (x2, y2) = self._edges[:, 0].T, self._edges[:, 1].T
        # weights of the edge-crossing polynomial's basis (see loadcheck.engine)
        self.edge_weights = np.stack([y2 - y1, (x2 - x1) * y1 - (y2 - y1) * x1, -(x2 - x1)])  # (3, n)
        self.covering = shapely.Polygon(normal).buffer(TOLERANCE, quad_segs=16)
        shapely.prepare(self.covering)

    # -- coordinates ----------------------------------------------------------------

    @property
    def is_lateral(self) -> bool:
        """True where one axis is the lateral arm."""
        return "lateral_arm" in self.axes

    @property
    def max_weight(self) -> float | None:
        """Highest weight of the polygon, where weight is an axis [mass unit]."""
        band = self.weight_range
        return None if band is None else band[1]

    @property
    def weight_range(self) -> tuple[float, float] | None:
        """Lowest and highest weight of the polygon, where weight is an axis [mass unit]."""
        if "weight" not in self.axes:
            return None
        column = self.corners[:, self.axes.index("weight")]
        return float(column.min()), float(column.max())

    def arm_range(self) -> tuple[float, float]:
        """Most forward and most rearward CG arm anywhere on the envelope [arm unit].

        The arm is a linear-fractional function of the axes, so its extremes lie at corners.
        """
        columns = {axis: self.corners[:, i] for i, axis in enumerate(self.axes)}
        if "arm" in columns:
            arms = columns["arm"]
        elif "mac" in columns:
            assert self.mac is not None
            arms = self.mac.leading_edge_arm + columns["mac"] * self.mac.length / 100.0
        elif "moment" in columns and "weight" in columns:
            arms = columns["moment"] * self.moment_scale / columns["weight"]
        else:
            raise ValueError("this envelope does not limit the longitudinal CG")
        return float(arms.min()), float(arms.max())

    def _axis(self, axis: str, weight: np.ndarray, moment: np.ndarray, lateral: np.ndarray) -> np.ndarray:
        if axis == "weight":
            return weight
        if axis == "moment":
            return moment / self.moment_scale
        if axis == "arm":
            return moment / weight
        if axis == "lateral_arm":
            return lateral / weight
        assert self.mac is not None
        return 100.0 * (moment / weight - self.mac.leading_edge_arm) / self.mac.length

    def coords(self, weight: float | np.ndarray, moment: float | np.ndarray, lateral: float | np.ndarray) -> tuple[np.ndarray, np.ndarray]:
        """Envelope coordinates of loading states given by weight, moment, lateral moment."""
        w, m, lat = (np.asarray(v, dtype=float) for v in (weight, moment, lateral))
        return self._axis(self.axes[0], w, m, lat), self._axis(self.axes[1], w, m, lat)

    def covers(self, weight: float | np.ndarray, moment: float | np.ndarray, lateral: float | np.ndarray) -> np.ndarray:
        """True where a loading state lies inside or on the envelope (within TOLERANCE)."""
        x, y = self.coords(weight, moment, lateral)
        return np.asarray(
            shapely.intersects_xy(self.covering, (x - self.origin[0]) / self.span[0], (y - self.origin[1]) / self.span[1])
        )

    def _at(self, weight: float, arm: float, lateral_arm: float) -> tuple[float, float]:
        """Envelope coordinates of a CG position (arm, lateral arm) at a weight (plain floats)."""
        x, y = (self._axis_at(a, weight, arm, lateral_arm) for a in self.axes)
        return x, y

    def _axis_at(self, axis: str, weight: float, arm: float, lateral_arm: float) -> float:
        if axis == "weight":
            return weight
        if axis == "moment":
            return arm * weight / self.moment_scale
        if axis == "arm":
            return arm
        if axis == "lateral_arm":
            return lateral_arm
        assert self.mac is not None
        return 100.0 * (arm - self.mac.leading_edge_arm) / self.mac.length

    # -- slices ---------------------------------------------------------------------

    def slice(self, weight: float, arm: float, lateral_arm: float, vary: Vary) -> list[tuple[float, float]] | None:
        """Intervals of one quantity that lie inside the envelope, the others held.

        Parameters
        ----------
        weight : [mass unit]
        arm, lateral_arm : CG position [arm unit]
        vary : which quantity runs along the line: ``arm``, ``weight`` or ``lateral``

        Returns
        -------
        list of (low, high) or None
            Inside intervals of the varying quantity [its unit], in increasing order
            (empty where the line misses the envelope); None where this envelope does
            not depend on that quantity. Every axis is affine in each of weight, arm and
            lateral arm with the other two held, so the line is straight on the envelope.
        """

        def point(value: float) -> tuple[float, float]:
            if vary == "arm":
                return self._at(weight, value, lateral_arm)
            if vary == "weight":
                return self._at(value, arm, lateral_arm)
            return self._at(weight, arm, value)

        (x0, y0), (x1, y1) = point(0.0), point(1.0)
        sx, sy = x1 - x0, y1 - y0
        if sx == 0.0 and sy == 0.0:
            return None
        (ox, oy), (wx, wy) = self._origin_span
        return self._line_intervals((x0 - ox) / wx, (y0 - oy) / wy, sx / wx, sy / wy)

    def _line_intervals(self, ax: float, ay: float, dx: float, dy: float) -> list[tuple[float, float]]:
        """Parameters s where the scaled line a + s d lies inside the polygon, as intervals.

        The line is cut at every edge it crosses (and at the ends of edges it runs along);
        each stretch between cuts is inside or outside as its middle is (containment with
        the same tolerance as everywhere else); a lone cut that touches the polygon from
        outside gives a zero-length interval.
        """
        scale = max(abs(dx), abs(dy))
        cuts: list[float] = []
        for x1, y1, ex, ey in self._edge_list:  # a handful of edges: plain floats beat numpy here
            wx, wy = x1 - ax, y1 - ay
            denom = dx * ey - dy * ex
            if abs(denom) > 1e-14 * scale:
                t = (wx * dy - wy * dx) / denom
                if -1e-12 <= t <= 1 + 1e-12:
                    cuts.append((wx * ey - wy * ex) / denom)
            elif abs(wx * dy - wy * dx) <= 1e-12 * scale:  # the line runs along this edge
                norm = dx * dx + dy * dy
                cuts.append((wx * dx + wy * dy) / norm)
                cuts.append(((wx + ex) * dx + (wy + ey) * dy) / norm)
        points = np.array(sorted(set(cuts)))
        mids = 0.5 * (points[:-1] + points[1:])
        # one containment call for every middle and every cut point
        probe = np.concatenate([mids, points])
        inside = shapely.intersects_xy(self.covering, ax + probe * dx, ay + probe * dy)
        inside_mid, inside_cut = inside[: len(mids)], inside[len(mids):]
        intervals: list[tuple[float, float]] = []
        for k in np.flatnonzero(inside_mid):
            lo, hi = float(points[k]), float(points[k + 1])
            if intervals and intervals[-1][1] == lo:
                intervals[-1] = (intervals[-1][0], hi)
            else:
                intervals.append((lo, hi))
        for k in np.flatnonzero(inside_cut):  # a cut touching the polygon from outside
            if (k == 0 or not inside_mid[k - 1]) and (k == len(mids) or not inside_mid[k]):
                intervals.append((float(points[k]), float(points[k])))
        return sorted(intervals)

    # -- fuel-burn path -------------------------------------------------------------

    def _fraction(self, axis: str, w: np.ndarray, m: np.ndarray, lat: np.ndarray) -> tuple[np.ndarray, bool]:
        """Numerator coefficients (..., 3) of an axis along a path, and whether its denominator is W."""
        if axis == "weight":
            return w, False
        if axis == "moment":
            return m / self.moment_scale, False
        if axis == "arm":
            return m, True
        if axis == "lateral_arm":
            return lat, True
        assert self.mac is not None
        return (m - self.mac.leading_edge_arm * w) * (100.0 / self.mac.length), True

    def edge_polynomials(self, w: np.ndarray, m: np.ndarray, lat: np.ndarray) -> np.ndarray:
        """Coefficients (..., 3, E) of "the path meets edge line e", lowest power first.

        ``w``, ``m``, ``lat``: weight, moment and lateral moment along a path piece as
        (..., 3) coefficient arrays in the piece parameter u. For an edge from (x1, y1) to
        (x2, y2) in the scaled axes, with x = Nx/Dx and y = Ny/Dy along the path, the
        condition (y2-y1)(x-x1) - (x2-x1)(y-y1) = 0 times Dx Dy (both positive) combines
        three basis polynomials, Nx Dy, Dx Dy and Ny Dx, with weights (y2-y1),
        (x2-x1) y1 - (y2-y1) x1 and -(x2-x1); where Dx = Dy the common factor is dropped
        and the basis is Nx, D, Ny. For every axis pair an envelope may use (one axis is
        weight, or the pair is lateral arm and arm) each basis polynomial is of degree two
        at most, so the condition is a quadratic.
        """
        (nx, x_over_w), (ny, y_over_w) = (self._fraction(a, w, m, lat) for a in self.axes)
        one = np.zeros_like(w)
        one[..., 0] = 1.0
        dx = w if x_over_w else one
        dy = w if y_over_w else one
        nx = (nx - self.origin[0] * dx) / self.span[0]
        ny = (ny - self.origin[1] * dy) / self.span[1]
        if x_over_w == y_over_w:
            basis = np.stack([nx, dx, ny], axis=-1)
        elif x_over_w:  # Dy = 1
            basis = np.stack([nx, dx, _times(ny, dx)], axis=-1)
        else:  # Dx = 1
            basis = np.stack([_times(nx, dy), dy, ny], axis=-1)
        shape = basis.shape[:-2]
        flat = basis.reshape(-1, 3) @ self.edge_weights  # one matrix product for every edge
        return flat.reshape(*shape, 3, -1)

    def edge_position(self, edges: np.ndarray, w: np.ndarray, m: np.ndarray, lat: np.ndarray) -> np.ndarray:
        """Where points fall along edges, projected: 0 at an edge's start, 1 at its end."""
        x, y = self.coords(w, m, lat)
        x = (x - self.origin[0]) / self.span[0]
        y = (y - self.origin[1]) / self.span[1]
        start, end = self._edges[edges, 0], self._edges[edges, 1]
        d = end - start
        return ((x - start[..., 0]) * d[..., 0] + (y - start[..., 1]) * d[..., 1]) / (d * d).sum(axis=-1)


def _times(a: np.ndarray, b: np.ndarray) -> np.ndarray:
    """Product of polynomials given as (..., 3) coefficient arrays, truncated to degree 2.

    Used only where the product is of degree two at most (one factor is linear, the
    other at most linear), so nothing is lost.
    """
    out = np.empty_like(a)
    out[..., 0] = a[..., 0] * b[..., 0]
    out[..., 1] = a[..., 0] * b[..., 1] + a[..., 1] * b[..., 0]
    out[..., 2] = a[..., 0] * b[..., 2] + a[..., 1] * b[..., 1] + a[..., 2] * b[..., 0]
    return out


def quadratic_roots(a: np.ndarray, b: np.ndarray, c: np.ndarray) -> tuple[np.ndarray, np.ndarray]:
    """Real roots of a u^2 + b u + c, elementwise (NaN where there is none).

    The stable form (q = -(b + sign(b) sqrt(b^2 - 4ac)) / 2; roots q/a and c/q) avoids
    cancellation; a leading coefficient below 1e-13 of the largest is taken as zero (the
    linear root), a discriminant a hair below zero as a double root (a path grazing an edge).
    """
    size = np.maximum(np.maximum(np.abs(a), np.abs(b)), np.abs(c))
    with np.errstate(divide="ignore", invalid="ignore", over="ignore"):
        quadratic = np.abs(a) > 1e-13 * size
        disc = b * b - 4.0 * a * c
        disc = np.where((disc < 0) & (disc > -1e-12 * b * b), 0.0, disc)
        root = np.sqrt(np.where(disc >= 0, disc, np.nan))
        q = -0.5 * (b + np.copysign(root, b))
        r1 = np.where(quadratic, q / a, np.where(np.abs(b) > 1e-13 * size, -c / b, np.nan))
        r2 = np.where(quadratic, c / q, np.nan)
    return r1, r2
