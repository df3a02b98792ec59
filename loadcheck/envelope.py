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
(quadratic only for tanks whose arm moves with quantity), so the path crosses an edge
where a polynomial of degree at most three has a root. The path is split at every such
root and each piece is tested at its middle: an exact test of the curve, not sampling.
"""

from __future__ import annotations

from collections.abc import Sequence
from typing import TYPE_CHECKING, Literal

import numpy as np
import shapely
from numpy.polynomial import polynomial as P

if TYPE_CHECKING:
    from .aircraft import Mac

__all__ = [
    "TOLERANCE",
    "Axis",
    "EnvelopeShape",
    "PathPiece",
    "Vary",
    "path_excursions",
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
        (x1, y1), (x2, y2) = self._edges[:, 0].T, self._edges[:, 1].T
        # weights of the edge-crossing polynomial's basis (see loadcheck.batch)
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

    def _at(self, weight: float, arm: float, lateral_arm: float) -> np.ndarray:
        """Envelope coordinates of a CG position (arm, lateral arm) at a weight."""
        return np.array(
            [float(v) for v in self.coords(weight, arm * weight, lateral_arm * weight)]
            if weight != 0
            else [self._axis_at_zero_weight(a, arm, lateral_arm) for a in self.axes]
        )

    def _axis_at_zero_weight(self, axis: str, arm: float, lateral_arm: float) -> float:
        if axis in ("weight", "moment"):
            return 0.0
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

        def point(value: float) -> np.ndarray:
            if vary == "arm":
                return self._at(weight, value, lateral_arm)
            if vary == "weight":
                return self._at(value, arm, lateral_arm)
            return self._at(weight, arm, value)

        start, step = point(0.0), point(1.0) - point(0.0)
        if not np.any(step):
            return None
        # parameter range that spans the polygon's bounding box, with room to spare
        bounds = np.array([self.origin, self.origin + self.span])
        moving = step != 0
        ends = (bounds[:, moving] - start[moving]) / step[moving]
        low, high = ends.min() - 1.0, ends.max() + 1.0
        line = shapely.LineString([start + low * step, start + high * step])
        pieces = shapely.get_parts(self.polygon.intersection(line))
        intervals: list[tuple[float, float]] = []
        norm = float(step @ step)
        for piece in pieces:
            xy = shapely.get_coordinates(piece)
            if len(xy) == 0:
                continue
            values = (xy - start) @ step / norm
            intervals.append((float(values.min()), float(values.max())))
        intervals.sort()
        merged: list[tuple[float, float]] = []
        for lo, hi in intervals:
            if merged and lo <= merged[-1][1]:
                merged[-1] = (merged[-1][0], max(hi, merged[-1][1]))
            else:
                merged.append((lo, hi))
        return merged

    # -- fuel-burn path -------------------------------------------------------------

    def _fraction(self, axis: str, w: np.ndarray, m: np.ndarray, lat: np.ndarray) -> tuple[np.ndarray, np.ndarray]:
        """Numerator and denominator polynomials of an axis (coefficients, low first)."""
        one = np.array([1.0])
        if axis == "weight":
            return w, one
        if axis == "moment":
            return m / self.moment_scale, one
        if axis == "arm":
            return m, w
        if axis == "lateral_arm":
            return lat, w
        assert self.mac is not None
        return P.polysub(m, self.mac.leading_edge_arm * w) * (100.0 / self.mac.length), w

    def crossings(self, weight: np.ndarray, moment: np.ndarray, lateral: np.ndarray) -> list[float]:
        """Parameters u in [0, 1] where a path piece meets an edge line of the envelope.

        Parameters
        ----------
        weight, moment, lateral : polynomial coefficients (lowest power first) of the
            loading state along the piece, in the piece parameter u in [0, 1]
        """
        (nx, dx), (ny, dy) = (self._fraction(a, weight, moment, lateral) for a in self.axes)
        # scale each axis the way the covering polygon is scaled
        nx = P.polysub(nx, self.origin[0] * dx) / self.span[0]
        ny = P.polysub(ny, self.origin[1] * dy) / self.span[1]
        found: list[float] = []
        for (x1, y1), (x2, y2) in self._edges:
            # (y2 - y1)(x - x1) - (x2 - x1)(y - y1) = 0, multiplied by dx * dy > 0
            f = P.polysub(
                (y2 - y1) * P.polymul(P.polysub(nx, x1 * dx), dy),
                (x2 - x1) * P.polymul(P.polysub(ny, y1 * dy), dx),
            )
            found.extend(_roots_in_unit_interval(f))
        return found


def _roots_in_unit_interval(coefficients: np.ndarray) -> list[float]:
    c = np.array(coefficients, dtype=float)
    size = np.abs(c).max(initial=0.0)
    if size == 0.0:
        return []  # the piece runs along the edge line: no crossing
    c[np.abs(c) < 1e-14 * size] = 0.0
    c = np.trim_zeros(c, "b")
    if len(c) < 2:
        return []
    roots = P.polyroots(c)
    near_real = roots[np.abs(roots.imag) <= 1e-7].real
    return [float(r) for r in near_real if -1e-12 <= r <= 1 + 1e-12]


class PathPiece:
    """One piece of the fuel-burn path on which every tank drains linearly.

    Attributes
    ----------
    start, end : fuel burned since engine start at the piece's ends [fuel volume unit]
    weight, moment, lateral : polynomial coefficients in u = (burned - start) / (end - start)
    """

    __slots__ = ("end", "lateral", "moment", "start", "weight")

    def __init__(self, start: float, end: float, weight: np.ndarray, moment: np.ndarray, lateral: np.ndarray):
        self.start, self.end = start, end
        self.weight, self.moment, self.lateral = weight, moment, lateral

    def state(self, u: float) -> tuple[float, float, float]:
        """Weight, moment and lateral moment at parameter u."""
        return (
            float(P.polyval(u, self.weight)),
            float(P.polyval(u, self.moment)),
            float(P.polyval(u, self.lateral)),
        )


def path_excursions(shapes: Sequence[EnvelopeShape], pieces: Sequence[PathPiece]) -> list[tuple[float, float]]:
    """Stretches of the fuel-burn path that lie outside any of the envelopes.

    Parameters
    ----------
    shapes : every envelope that must hold
    pieces : the path, in burn order

    Returns
    -------
    list of (from, to)
        Fuel burned since engine start where each excursion begins and ends
        [fuel volume unit]; empty when the whole path is inside.
    """
    outside: list[tuple[float, float]] = []
    for piece in pieces:
        cuts = {0.0, 1.0}
        for shape in shapes:
            cuts.update(min(max(u, 0.0), 1.0) for u in shape.crossings(piece.weight, piece.moment, piece.lateral))
        ordered = sorted(cuts)
        length = piece.end - piece.start
        for a, b in zip(ordered, ordered[1:]):
            if b - a <= 1e-12:
                continue
            w, m, lat = piece.state(0.5 * (a + b))
            if all(bool(shape.covers(w, m, lat)) for shape in shapes):
                continue
            begin, end = piece.start + a * length, piece.start + b * length
            if outside and abs(outside[-1][1] - begin) <= 1e-9 * max(1.0, abs(begin)):
                outside[-1] = (outside[-1][0], end)
            else:
                outside.append((begin, end))
    return outside
