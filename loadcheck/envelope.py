"""CG envelope geometry: containment, limits at a weight, and the fuel-burn path.

An envelope is a polygon on two of the axes of :data:`AXES`: ``arm``, ``moment`` (read as
moment / moment_scale), ``mac`` (percent of MAC), ``lateral_arm``, ``lateral_moment`` (read
as lateral moment / moment_scale, as FAA-H-8083-1B chapter 8, figure 8-3, draws a
helicopter's lateral envelope) and ``weight``. A loading
state is described by its weight W, moment M and lateral moment L; each axis is a linear
combination of W, M and L, divided by W or not:

=============  ==========================  ===========
axis           numerator                   denominator
=============  ==========================  ===========
weight         W                           1
moment         M / moment_scale            1
arm            M                           W
lateral_arm    L                           W
lateral_moment L / moment_scale            1
mac            100 (M - LEMAC W) / MAC     W
=============  ==========================  ===========

(CG = moment / weight, FAA-H-8083-1B chapter 2; percent MAC, same chapter.) The table is
data (:class:`AxisSpec`): every computation below reads it, so an axis is added by one
entry (and its tests).

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

import itertools
import re
from collections.abc import Callable, Sequence
from dataclasses import dataclass
from typing import TYPE_CHECKING, Literal

import numpy as np
import shapely

if TYPE_CHECKING:
    from .aircraft import Mac

__all__ = [
    "AXES",
    "FAST_COVERS_FROM",
    "STRICT_MARGIN",
    "TOLERANCE",
    "Axis",
    "AxisSpec",
    "EnvelopeShape",
    "Vary",
    "polygon_problem",
]

Axis = Literal["arm", "moment", "mac", "lateral_arm", "lateral_moment", "weight"]

TOLERANCE = 1e-9
"""Containment tolerance, as a fraction of the envelope's extent on each axis."""

Vary = Literal["arm", "weight", "lateral"]

STRICT_MARGIN = 1e-12
"""Inside the polygon itself by at least this signed distance (scaled axes, a thousandth of
:data:`TOLERANCE`): far beyond the rounding of the coordinates (about 1e-16), so a point
found inside by the margin is inside whatever the rounding (:meth:`EnvelopeShape.interior`)."""

FAST_COVERS_FROM = 256
"""From this many points, a convex envelope's containment is settled by its edges'
half-planes with numpy, shapely testing only the points near an edge; below, one shapely
call is cheaper (the single check)."""


@dataclass(frozen=True)
class AxisSpec:
    """One envelope axis: what it is computed from, and how it is named.

    Attributes
    ----------
    label : the axis in words, for charts and tables
    unit : which of the aircraft's units it is in: ``mass``, ``arm``, ``moment`` or ``percent``
    per_weight : the value is the numerator divided by the weight W
    lateral : the axis limits the lateral CG
    coefficients : (a, b, c) of the numerator a W + b M + c L, given the envelope's
        moment scale and the aircraft's MAC
    """

    label: str
    unit: Literal["mass", "arm", "moment", "percent"]
    per_weight: bool
    lateral: bool
    coefficients: Callable[[float, Mac | None], tuple[float, float, float]]


def _mac_coefficients(_scale: float, mac: Mac | None) -> tuple[float, float, float]:
    if mac is None:
        # ValueError on purpose: shapes are built in Aircraft's pydantic validator, where pydantic expects one
        raise ValueError("a 'mac' axis needs the aircraft's [mac] table")
    return -100.0 * mac.leading_edge_arm / mac.length, 100.0 / mac.length, 0.0


AXES: dict[str, AxisSpec] = {
    "weight": AxisSpec("Weight", "mass", False, False, lambda _s, _m: (1.0, 0.0, 0.0)),
    "moment": AxisSpec("Moment", "moment", False, False, lambda s, _m: (0.0, 1.0 / s, 0.0)),
    "arm": AxisSpec("CG, aft of datum", "arm", True, False, lambda _s, _m: (0.0, 1.0, 0.0)),
    "lateral_arm": AxisSpec("Lateral CG, + right", "arm", True, True, lambda _s, _m: (0.0, 0.0, 1.0)),
    "mac": AxisSpec("CG", "percent", True, False, _mac_coefficients),
    "lateral_moment": AxisSpec("Lateral moment, + right", "moment", False, True, lambda s, _m: (0.0, 0.0, 1.0 / s)),
}
"""Every envelope axis: its numerator in W, M and L, its denominator, its name (FAA-H-8083-1B chapter 2)."""


_GEOS_REASON = re.compile(r"^(?P<what>.*?)\s*\[(?P<x>\S+) (?P<y>\S+)\]$")


def polygon_problem(
    points: Sequence[Sequence[float]], describe: Callable[[float, float], str] | None = None
) -> str | None:
    """Why a list of corners is not a usable envelope polygon, or None when it is.

    The ring is closed automatically (repeating the first corner is allowed). An invalid shape
    is found by shapely/GEOS (``is_valid``) and said in words: edges that cross or touch are
    said so, near the point GEOS gives, which ``describe`` words in the axes' units
    (default: the two numbers, x then y).

    Examples
    --------
    >>> polygon_problem([[0, 0], [1, 1], [1, 0], [0, 1]]).split(":")[0]  # a bow tie
    'its edges cross each other near (0.5, 0.5)'
    """
    corners = [tuple(map(float, p)) for p in points]
    if len(corners) > 1 and corners[0] == corners[-1]:
        corners = corners[:-1]
    if len(set(corners)) < 3:
        return "it needs at least three distinct corners"
    polygon = shapely.Polygon(corners)
    if not polygon.is_valid:
        reason = str(shapely.is_valid_reason(polygon))
        match = _GEOS_REASON.match(reason)
        if match is None:
            return f"its corners do not make a simple polygon ({reason})"
        try:
            x, y = float(match["x"]), float(match["y"])
        except ValueError:
            return f"its corners do not make a simple polygon ({reason})"
        near = describe(x, y) if describe is not None else f"({x:g}, {y:g})"
        what = match["what"].lower()
        if "self-intersection" in what:
            how = "touch each other at" if what.startswith("ring") else "cross each other near"
            return (
                f"its edges {how} {near}: list the corners in order around the envelope, "
                "so that each edge meets only the next"
            )
        return f"its corners do not make a simple polygon ({match['what'].lower()} near {near})"
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
        self._coefficients = [AXES[a].coefficients(self.moment_scale, mac) for a in axes]
        self._per_weight = [AXES[a].per_weight for a in axes]
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
        self._edge_sources, self._edge_map = self._edge_basis()
        self.covering = shapely.Polygon(normal).buffer(TOLERANCE, quad_segs=16)
        self._locator = _Locator(self, normal)
        self.convex = self._locator.convex
        column = corners[:, axes.index("weight")] if "weight" in axes else None
        self._weight_range = None if column is None else (float(column.min()), float(column.max()))
        self._is_lateral = any(AXES[a].lateral for a in axes)
        shapely.prepare(self.covering)

    # -- coordinates ----------------------------------------------------------------

    @property
    def is_lateral(self) -> bool:
        """True where an axis limits the lateral CG (found once, with the shape)."""
        return self._is_lateral

    @property
    def max_weight(self) -> float | None:
        """Highest weight of the polygon, where weight is an axis [mass unit]."""
        band = self.weight_range
        return None if band is None else band[1]

    @property
    def weight_range(self) -> tuple[float, float] | None:
        """Lowest and highest weight of the polygon, where weight is an axis [mass unit]."""
        return self._weight_range

    # -- containment ----------------------------------------------------------------

    def locate(self, weight: np.ndarray, moment: np.ndarray, lateral: np.ndarray) -> tuple[np.ndarray, np.ndarray]:
        """Containment (:meth:`covers`) and the convex parts each state lies in by the margin.

        Returns
        -------
        covers : bool array, the shape of the states
        parts : int64 array: bit j set where the state lies inside convex part j of the
            envelope by at least :data:`STRICT_MARGIN` (:class:`_Locator`); only the parts on
            which a straight piece of burn path between two such states stays inside
            (:attr:`_Locator.straight_parts`) have a bit
        """
        x, y = self.coords(weight, moment, lateral)
        return self._locator.locate(x, y)

    def parts(self, weight: np.ndarray, moment: np.ndarray, lateral: np.ndarray) -> np.ndarray:
        """The ``parts`` of :meth:`locate` alone."""
        x, y = self.coords(weight, moment, lateral)
        return self._locator.parts(x, y)

    @property
    def has_straight_parts(self) -> bool:
        """True where some convex part of the envelope keeps a straight piece of path inside (:meth:`locate`)."""
        return bool(self._locator.bits.any())

    def arm_range(self) -> tuple[float, float]:
        """Most forward and most rearward CG arm anywhere on the envelope [arm unit].

        The arm is a linear-fractional function of the axes, so its extremes lie at corners.
        Only for an envelope that limits the longitudinal CG: a lateral one raises TypeError
        (a programming error; its callers skip lateral envelopes).
        """
        if self.is_lateral:  # a caller's mistake, not the user's (the callers skip lateral envelopes)
            raise TypeError(
                f"arm_range() of a lateral envelope (axes {self.axes[0]}, {self.axes[1]}): it does not limit "
                "the longitudinal CG; ask only an envelope whose is_lateral is False"
            )
        if "arm" in self.axes:
            arms = self.corners[:, self.axes.index("arm")]
        else:  # weight and an axis whose numerator is a W + b M (b != 0): M = (value * D - a W) / b
            k = 1 - self.axes.index("weight")
            a, b, _ = self._coefficients[k]
            value, weight = self.corners[:, k], self.corners[:, 1 - k]
            scale = weight if AXES[self.axes[k]].per_weight else 1.0
            arms = (value * scale - a * weight) / b / weight
        return float(arms.min()), float(arms.max())

    def _axis(self, k: int, weight: np.ndarray, moment: np.ndarray, lateral: np.ndarray) -> np.ndarray:
        value = _combine(self._coefficients[k], weight, moment, lateral)
        return value / weight if self._per_weight[k] else value

    def coords(
        self, weight: float | np.ndarray, moment: float | np.ndarray, lateral: float | np.ndarray
    ) -> tuple[np.ndarray, np.ndarray]:
        """Envelope coordinates of loading states given by weight, moment, lateral moment."""
        w, m, lat = (np.asarray(v, dtype=float) for v in (weight, moment, lateral))
        return self._axis(0, w, m, lat), self._axis(1, w, m, lat)

    def covers(self, weight: float | np.ndarray, moment: float | np.ndarray, lateral: float | np.ndarray) -> np.ndarray:
        """True where a loading state lies inside or on the envelope (within TOLERANCE)."""
        x, y = self.coords(weight, moment, lateral)
        if x.size >= FAST_COVERS_FROM and self._locator.pieces:
            return self._locator.locate(x, y)[0]
        (ox, oy), (wx, wy) = self._origin_span
        return np.asarray(shapely.intersects_xy(self.covering, (x - ox) / wx, (y - oy) / wy))

    def _at(self, weight: float, arm: float, lateral_arm: float) -> tuple[float, float]:
        """Envelope coordinates of a CG position (arm, lateral arm) at a weight (plain floats)."""
        out = []
        for k in (0, 1):
            a, b, c = self._coefficients[k]
            per_weight = a + b * arm + c * lateral_arm  # the numerator over W
            out.append(per_weight if self._per_weight[k] else per_weight * weight)
        return out[0], out[1]

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
        return self.slices([(weight, arm, lateral_arm, vary)])[0]

    def slices(self, lines: Sequence[tuple[float, float, float, Vary]]) -> list[list[tuple[float, float]] | None]:
        """:meth:`slice` of several lines (weight, arm, lateral arm, vary), with one containment call for all."""
        scaled = [self._scaled_line(*line) for line in lines]
        cuts = [None if line is None else self._line_cuts(*line) for line in scaled]
        xs: list[float] = []
        ys: list[float] = []
        for line, points in zip(scaled, cuts, strict=True):
            if line is None or points is None:
                continue
            ax, ay, dx, dy = line
            probe = [0.5 * (lo + hi) for lo, hi in itertools.pairwise(points)] + points
            xs += [ax + p * dx for p in probe]
            ys += [ay + p * dy for p in probe]
        flags: list[bool] = shapely.intersects_xy(self.covering, np.array(xs), np.array(ys)).tolist() if xs else []
        out: list[list[tuple[float, float]] | None] = []
        at = 0
        for points in cuts:
            if points is None:
                out.append(None)
                continue
            gaps = len(points) - 1 if points else 0
            inside_mid, inside_cut = flags[at : at + gaps], flags[at + gaps : at + gaps + len(points)]
            at += gaps + len(points)
            out.append(_intervals(points, inside_mid, inside_cut))
        return out

    def _scaled_line(
        self, weight: float, arm: float, lateral_arm: float, vary: Vary
    ) -> tuple[float, float, float, float] | None:
        """The line of a slice in the scaled axes: start and direction; None where the
        envelope does not depend on the varying quantity."""

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
        return (x0 - ox) / wx, (y0 - oy) / wy, sx / wx, sy / wy

    def _line_cuts(self, ax: float, ay: float, dx: float, dy: float) -> list[float]:
        """Parameters s where the scaled line a + s d is cut, in increasing order, once each.

        The line is cut at every edge it crosses (and at the ends of edges it runs along);
        each stretch between cuts is inside or outside as its middle is (containment with
        the same tolerance as everywhere else, :func:`_intervals`).
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
        return sorted(set(cuts))

    # -- fuel-burn path -------------------------------------------------------------

    def _edge_basis(self) -> tuple[tuple[str, ...], np.ndarray]:
        """The edge polynomials as one linear map, built once (see :meth:`edge_polynomials`).

        Each basis polynomial (Nx Dy, Dx Dy, Ny Dx, or Nx, D, Ny) is a combination of the
        sources W, M, L, 1 and, where one axis is divided by W and the other is not, of the
        products W W, W M, W L; the edge polynomials are that combination times
        ``edge_weights``. Returns the sources used and the (sources, E) map.
        """
        names = ("w", "m", "lat")
        per = self._per_weight

        def numerator(k: int) -> dict[str, float]:  # (N_k - origin D_k) / span, in the sources
            terms = {n: c for n, c in zip(names, self._coefficients[k], strict=True) if c != 0.0}
            denominator = "w" if per[k] else "one"
            terms[denominator] = terms.get(denominator, 0.0) - float(self.origin[k])
            return {n: c / float(self.span[k]) for n, c in terms.items()}

        def times_w(terms: dict[str, float]) -> dict[str, float]:
            product = {"w": "ww", "m": "wm", "lat": "wl", "one": "w"}
            out: dict[str, float] = {}
            for n, c in terms.items():
                out[product[n]] = out.get(product[n], 0.0) + c
            return out

        nx, ny = numerator(0), numerator(1)
        dx = {"w": 1.0} if per[0] else {"one": 1.0}
        dy = {"w": 1.0} if per[1] else {"one": 1.0}
        if per[0] == per[1]:
            basis = [nx, dx, ny]
        elif per[0]:  # Dy = 1
            basis = [nx, dx, times_w(ny)]
        else:  # Dx = 1
            basis = [times_w(nx), dy, ny]
        sources = tuple(n for n in ("w", "m", "lat", "one", "ww", "wm", "wl") if any(n in b for b in basis))
        rows = np.zeros((len(sources), self.edge_weights.shape[1]))
        for j, terms in enumerate(basis):
            for n, c in terms.items():
                rows[sources.index(n)] += c * self.edge_weights[j]
        return sources, rows

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
        # the basis polynomials are combined with the edge weights once per envelope
        # (_edge_basis): here only the sources it uses are stacked, and one matrix product
        # gives every edge
        given = {"w": w, "m": m, "lat": lat}
        sources = []
        for name in self._edge_sources:
            if name in given:
                sources.append(given[name])
            elif name == "one":
                one = np.zeros_like(w)
                one[..., 0] = 1.0
                sources.append(one)
            else:  # a product with W: of degree two at most (see above)
                sources.append(_times(w, given[{"ww": "w", "wm": "m", "wl": "lat"}[name]]))
        stacked = np.array(sources)  # (S, ..., 3)
        flat = self._edge_map.T @ stacked.reshape(len(sources), -1)  # (E, ... * 3): one product for every edge
        out = flat.reshape(-1, *stacked.shape[1:])  # (E, ..., 3)
        return out.transpose(*range(1, out.ndim), 0)  # (..., 3, E), a view

    def edge_position(self, edges: np.ndarray, w: np.ndarray, m: np.ndarray, lat: np.ndarray) -> np.ndarray:
        """Where points fall along edges, projected: 0 at an edge's start, 1 at its end."""
        x, y = self.coords(w, m, lat)
        x = (x - self.origin[0]) / self.span[0]
        y = (y - self.origin[1]) / self.span[1]
        start, end = self._edges[edges, 0], self._edges[edges, 1]
        d = end - start
        return ((x - start[..., 0]) * d[..., 0] + (y - start[..., 1]) * d[..., 1]) / (d * d).sum(axis=-1)


class _Locator:
    """An envelope as convex parts and half-planes: containment of many points with numpy.

    The envelope (in the scaled axes) is cut into convex parts (a constrained Delaunay
    triangulation, neighbours merged while their union stays convex: Hertel and Mehlhorn,
    1983); each part is the intersection of its edges' inner half-planes, each written as a
    signed distance a X + b Y + c in the envelope's own axes (positive inside). A point
    inside a part by :data:`STRICT_MARGIN` is inside the envelope, so inside its covering;
    a point more than twice :data:`TOLERANCE` outside an edge line of the envelope's convex
    hull is more than the tolerance from the envelope, so outside the covering (every point
    of the covering lies within the tolerance of the polygon, and a signed distance to a
    line bounding a convex set never falls below minus the distance to the set). The points
    neither settles (within about 2e-9 of an edge, or in a notch of a non-convex envelope)
    are tested by shapely against the covering, so :meth:`locate` answers as
    ``shapely.intersects_xy(covering, ...)`` does for every point.

    A part is *straight* where a straight line of states (weight W, moment M, lateral
    moment L, each affine in the fuel burned) cannot leave it between two points inside it:
    each edge's inner side times the positive denominators of the axes (Dx Dy, see
    :meth:`EnvelopeShape.edge_polynomials`) is a polynomial of degree two in (W, M, L),
    concave along every line where its quadratic part is negative semidefinite, and a
    concave function on a segment is at least the least of its end values. Multiplying by
    Dy alone (an edge along the x axis) or Dx alone (along y) leaves an affine function.
    Where both axes are divided by W, or neither, every edge is affine in (W, M, L).
    """

    def __init__(self, shape: EnvelopeShape, normal: np.ndarray):
        self.shape = shape
        ring = shapely.Polygon(normal)
        self.convex = bool(ring.convex_hull.area - ring.area <= 1e-14 * ring.convex_hull.area) and _turns_left(normal)
        try:
            pieces = [_ring(ring)] if self.convex else _convex_pieces(ring)  # _ring: no repeated corner
        except (shapely.errors.GEOSException, ValueError):  # a shape GEOS cannot cut: shapely tests every point
            pieces = []
        blocks = [] if self.convex else [_ring(ring.convex_hull)]
        blocks += pieces
        planes = [_half_planes(b, shape.origin, shape.span) for b in blocks]
        self.hull: list[tuple[float, float, float]] | None = None if self.convex else planes[0].tolist()
        self.pieces: list[list[tuple[float, float, float]]] = [p.tolist() for p in planes[0 if self.convex else 1 :]]
        self.straight_parts = [self._straight(p) for p in planes[0 if self.convex else 1 :]]
        self.bits = np.array([1 << j if ok else 0 for j, ok in enumerate(self.straight_parts)], dtype=np.int64)

    def _straight(self, planes: np.ndarray) -> bool:
        per = self.shape._per_weight
        if per[0] == per[1]:
            return True
        k = 1 if per[0] else 0  # the axis not divided by W: its edge term is multiplied by W
        coefficient = planes[:, k]  # a (k = 0) or b (k = 1) of each edge
        other = planes[:, 1 - k]
        w, m, lat = self.shape._coefficients[k]
        if m != 0.0 or lat != 0.0:  # (coefficient N_k) W has W M or W L terms: indefinite
            return bool(((coefficient == 0.0) | (other == 0.0)).all())
        # its quadratic part is coefficient * w W^2: negative semidefinite where coefficient * w <= 0
        return bool(((coefficient * w <= 0.0) | (other == 0.0) | (coefficient == 0.0)).all())

    @staticmethod
    def _least(x: np.ndarray, y: np.ndarray, planes: list[tuple[float, float, float]]) -> np.ndarray:
        """Each point's least signed distance to the half-planes (flat x, y): a running
        minimum, in place, one edge at a time (the arrays stay in cache; an edge along an
        axis costs two passes)."""
        least = np.full(x.shape, np.inf)
        term = np.empty_like(least)
        other = np.empty_like(least)
        for a, b, c in planes:
            if b == 0.0:
                np.multiply(x, a, out=term)
            elif a == 0.0:
                np.multiply(y, b, out=term)
            else:
                np.multiply(x, a, out=term)
                np.multiply(y, b, out=other)
                term += other
            term += c
            np.minimum(least, term, out=least)
        return least

    def _bits(self, leasts: list[np.ndarray]) -> np.ndarray:
        bits = np.zeros(leasts[0].shape, dtype=np.int64)
        for least, bit in zip(leasts, self.bits.tolist(), strict=True):
            if bit:
                bits[least >= STRICT_MARGIN] |= bit
        return bits

    def parts(self, x: np.ndarray, y: np.ndarray) -> np.ndarray:
        fx, fy = x.reshape(-1), y.reshape(-1)
        leasts = [
            self._least(fx, fy, piece) if bit else np.full(fx.shape, -np.inf)
            for piece, bit in zip(self.pieces, self.bits.tolist(), strict=True)
        ]
        return np.asarray(self._bits(leasts).reshape(np.shape(x)))

    def locate(self, x: np.ndarray, y: np.ndarray) -> tuple[np.ndarray, np.ndarray]:
        fx, fy = x.reshape(-1), y.reshape(-1)
        leasts = [self._least(fx, fy, piece) for piece in self.pieces]
        inside = leasts[0] >= STRICT_MARGIN
        for least in leasts[1:]:
            inside |= least >= STRICT_MARGIN
        if self.hull is None:  # convex: the envelope is its own hull
            near = np.flatnonzero(~inside & (leasts[0] >= -2 * TOLERANCE))
        else:  # the hull only for the points inside no part
            rest = np.flatnonzero(~inside)
            near = rest[self._least(fx[rest], fy[rest], self.hull) >= -2 * TOLERANCE]
        if len(near):
            (ox, oy), (wx, wy) = self.shape._origin_span
            inside[near] = shapely.intersects_xy(self.shape.covering, (fx[near] - ox) / wx, (fy[near] - oy) / wy)
        return np.asarray(inside.reshape(np.shape(x))), np.asarray(self._bits(leasts).reshape(np.shape(x)))


def _turns_left(corners: np.ndarray) -> bool:
    """Every corner of a counter-clockwise ring turns left or goes straight on (a convex ring)."""
    step = np.roll(corners, -1, axis=0) - corners
    turns = step[:, 0] * np.roll(step[:, 1], -1) - step[:, 1] * np.roll(step[:, 0], -1)
    return bool((turns >= 0).all())


def _ring(polygon: shapely.Polygon) -> np.ndarray:
    """A polygon's corners (scaled axes), counter-clockwise, the closing corner and repeated corners left out."""
    ring = shapely.Polygon(polygon.exterior.coords)
    if not ring.exterior.is_ccw:
        ring = ring.reverse()
    corners = np.asarray(ring.exterior.coords)[:-1]
    step = np.roll(corners, -1, axis=0) - corners
    keep = np.hypot(step[:, 0], step[:, 1]) > 1e-9  # a cut's corner a rounding away from another is that one
    return np.asarray(corners[keep])


_MOST_PARTS = 12
"""At most this many convex parts (each costs a pass over the points per edge)."""


def _convex_pieces(polygon: shapely.Polygon) -> list[np.ndarray]:
    """Convex polygons within a non-convex polygon, covering it, overlapping where they can.

    The polygon is cut at a reflex corner along the line of each of the corner's two edges,
    keeping the side the edge bounds, and each side is cut again until no reflex corner is
    left: large overlapping parts, so that a piece of path has both ends in one part more
    often than with a partition. Where that gives more than :data:`_MOST_PARTS` parts, the
    polygon's constrained Delaunay triangles merged with their neighbours while the union
    stays convex (Hertel and Mehlhorn, 1983) are the parts. Whatever the parts, the test of
    a part is the intersection of its edges' inner half-planes (its kernel), which lies
    within the part, so within the polygon (:class:`_Locator`).
    """
    found: list[shapely.Polygon] = []

    def split(piece: shapely.Polygon, depth: int) -> None:
        corners = _ring(piece)
        reflex = _reflex_corner(corners)
        if reflex is None or depth >= 8:
            found.append(piece)
            return
        for a, b in ((corners[reflex - 1], corners[reflex]), (corners[reflex], corners[(reflex + 1) % len(corners)])):
            d = (b - a) / np.hypot(*(b - a))
            left = np.array([-d[1], d[0]])
            side = shapely.Polygon([a - 10 * d, a + 10 * d, a + 10 * d + 10 * left, a - 10 * d + 10 * left])
            cut = piece.intersection(side)
            for g in getattr(cut, "geoms", [cut]):
                if isinstance(g, shapely.Polygon) and g.area > 1e-9 * polygon.area:
                    split(g, depth + 1)

    split(polygon, 0)
    kept: list[shapely.Polygon] = []
    for piece in sorted(found, key=lambda g: -g.area):
        if not any(k.buffer(1e-12).contains(piece) for k in kept):
            kept.append(piece)
    if len(kept) > _MOST_PARTS:
        kept = _merged_triangles(polygon)
    return [_ring(p) for p in kept]


def _reflex_corner(corners: np.ndarray) -> int | None:
    """The index of a corner of a counter-clockwise ring that turns right (by more than the
    rounding of a cut's new corners, between edges of some length), or None where there is none."""
    into = corners - np.roll(corners, 1, axis=0)
    out = np.roll(corners, -1, axis=0) - corners
    sine = (into[:, 0] * out[:, 1] - into[:, 1] * out[:, 0]) / (
        np.hypot(into[:, 0], into[:, 1]) * np.hypot(out[:, 0], out[:, 1])
    )
    long_enough = (np.hypot(into[:, 0], into[:, 1]) > 1e-9) & (np.hypot(out[:, 0], out[:, 1]) > 1e-9)
    right = np.flatnonzero((sine < -1e-7) & long_enough)
    return int(right[0]) if len(right) else None


def _merged_triangles(polygon: shapely.Polygon) -> list[shapely.Polygon]:
    """Convex polygons whose union is the polygon: its constrained Delaunay triangles, each
    merged with a neighbour while their union stays convex (Hertel and Mehlhorn, 1983)."""
    pieces = list(shapely.constrained_delaunay_triangles(polygon).geoms)
    merged = True
    while merged:
        merged = False
        for i, j in itertools.combinations(range(len(pieces)), 2):
            if pieces[i].intersection(pieces[j]).length <= 0:
                continue
            union = shapely.union(pieces[i], pieces[j])
            hull = union.convex_hull
            if isinstance(union, shapely.Polygon) and hull.area - union.area <= 1e-14 * hull.area:
                pieces[i] = hull
                del pieces[j]
                merged = True
                break
    return pieces


def _half_planes(corners: np.ndarray, origin: np.ndarray, span: np.ndarray) -> np.ndarray:
    """(E, 3): a, b, c of each edge of a counter-clockwise convex ring in the scaled axes, as
    a X + b Y + c in the envelope's own axes: the signed distance in the scaled axes, positive
    on the inner (left) side."""
    step = np.roll(corners, -1, axis=0) - corners
    length = np.hypot(step[:, 0], step[:, 1])
    a, b = -step[:, 1] / length, step[:, 0] / length
    c = -(a * corners[:, 0] + b * corners[:, 1])
    return np.stack([a / span[0], b / span[1], c - a * origin[0] / span[0] - b * origin[1] / span[1]], axis=1)


def _intervals(points: list[float], inside_mid: list[bool], inside_cut: list[bool]) -> list[tuple[float, float]]:
    """The inside intervals of a line cut at ``points``, from whether each stretch's middle
    and each cut lies inside: stretches that meet are merged; a cut touching the polygon
    from outside gives a zero-length interval."""
    intervals: list[tuple[float, float]] = []
    for k, inside in enumerate(inside_mid):
        if inside:
            lo, hi = points[k], points[k + 1]
            if intervals and intervals[-1][1] == lo:
                intervals[-1] = (intervals[-1][0], hi)
            else:
                intervals.append((lo, hi))
    last = len(inside_mid)
    for k, inside in enumerate(inside_cut):
        if inside and (k == 0 or not inside_mid[k - 1]) and (k == last or not inside_mid[k]):
            intervals.append((points[k], points[k]))
    return sorted(intervals)


def _combine(coefficients: tuple[float, float, float], w: np.ndarray, m: np.ndarray, lat: np.ndarray) -> np.ndarray:
    """a W + b M + c L for an axis's coefficients (:class:`AxisSpec`), leaving out the terms
    whose coefficient is 0 and the products by 1 (the same value, in fewer array operations)."""
    value: np.ndarray | None = None
    for coefficient, term in zip(coefficients, (w, m, lat), strict=True):
        if coefficient == 0.0:
            continue
        part = term if coefficient == 1.0 else coefficient * term
        value = part if value is None else value + part
    return np.zeros_like(w) if value is None else value


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
