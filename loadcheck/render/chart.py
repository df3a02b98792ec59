"""Envelope charts with matplotlib (imported only inside the functions that draw).

Meaning never rests on colour alone: each condition has its own marker shape and a text
label, the chosen category's envelope is a solid outline with a light fill, other
categories are dashed and faint, weight limits are dotted lines with their names, and
the burn path is a solid dark line with each point where it leaves ringed and each point
where it comes back inside marked by a hollow diamond (a path outside at takeoff is labelled
as outside from takeoff: it does not leave there). Colours come
from a palette chosen to stay distinct for colour-blind readers and to stay readable in
greyscale print.

Nothing hides anything else: the markers are drawn largest first (a point on top of
another leaves the one below showing around it) and the ring where the path leaves is
hollow; every label is placed where it overlaps no other label and no marker and lies
wholly inside the plot, with a leader line when it had to move away from its point
(:func:`_place`); the legend sits below the plot, off the envelope; long titles wrap.

Every artist that carries a meaning has a ``gid`` (``point-takeoff``, ``burn-path``,
``leaves-at``, ``envelope-normal-0``; in a second panel ``point-takeoff-1`` and so on),
which the SVG output keeps as element ids.
"""

from __future__ import annotations

import io
import textwrap
from collections.abc import Sequence
from pathlib import Path
from typing import TYPE_CHECKING, Any

from ..aircraft import Aircraft, Envelope
from ..display import unit_label
from ..errors import InputError, Problem
from ..results import CheckResult, Condition

if TYPE_CHECKING:
    from matplotlib.axes import Axes
    from matplotlib.backends.backend_agg import FigureCanvasAgg, RendererAgg
    from matplotlib.figure import Figure

__all__ = [
    "FORMATS",
    "check_figure",
    "envelope_figure",
    "fuel_payload_figure",
    "save_figure",
    "figure_svg",
    "trip_figure",
]

FORMATS = ("png", "svg", "pdf")

# (marker, colour, label, marker size in points): distinct shapes first, colours second; drawn
# in this order, largest first, so that a point on top of another never hides it
_POINTS = {
    "ramp": ("s", "#0072B2", "ramp", 12.0),
    "takeoff": ("^", "#D55E00", "takeoff", 10.0),
    "landing": ("v", "#009E73", "landing", 8.5),
    "zero_fuel": ("o", "#555555", "zero fuel", 7.0),
}
_LEAVE_SIZE = 17.0
_LIMIT_LINES = {
    "max_ramp_weight": "max ramp",
    "max_takeoff_weight": "max takeoff",
    "max_landing_weight": "max landing",
    "max_zero_fuel_weight": "max zero fuel",
}


def _axis_label(axis: str, aircraft: Aircraft, envelope: Envelope) -> str:
    units = aircraft.units
    if axis == "weight":
        return f"Weight ({units.mass})"
    if axis == "arm":
        return f"CG, aft of datum ({units.arm})"
    if axis == "lateral_arm":
        return f"Lateral CG, + right ({units.arm})"
    if axis == "mac":
        return "CG (% MAC)"
    scale = envelope.moment_scale
    moment = unit_label(units.moment)
    return f"Moment / {scale:g} ({moment})" if scale != 1 else f"Moment ({moment})"


def _panels(aircraft: Aircraft, category: str) -> list[list[Envelope]]:
    """Envelopes grouped by axes: one panel for the longitudinal, one for the lateral."""
    chosen = aircraft.envelopes_for(category)
    groups: dict[tuple[str, str], list[Envelope]] = {}
    for envelope in chosen:
        groups.setdefault(envelope.axes, []).append(envelope)
    return list(groups.values())


def _draw_envelopes(ax: Axes, aircraft: Aircraft, category: str, panel: Sequence[Envelope]) -> None:
    axes_pair = panel[0].axes
    for index, other in enumerate(aircraft.envelope):
        if other.axes != axes_pair:
            continue
        ring = list(other.shape.corners) + [other.shape.corners[0]]
        xs, ys = [p[0] for p in ring], [p[1] for p in ring]
        if other.category == category:
            ax.fill(xs, ys, color="#CFE3F2", alpha=0.6, zorder=1, gid=f"envelope-fill-{other.category}-{index}")
            ax.plot(
                xs,
                ys,
                color="#1B3A57",
                linewidth=1.6,
                zorder=2,
                label=f"{other.category} envelope",
                gid=f"envelope-{other.category}-{index}",
            )
        else:
            ax.plot(
                xs,
                ys,
                color="#8A8A8A",
                linewidth=1.0,
                linestyle="--",
                zorder=1,
                label=f"{other.category} envelope",
                gid=f"envelope-{other.category}-{index}",
            )


def _weight_limits(aircraft: Aircraft, axes_pair: tuple[str, str]) -> list[tuple[float, str, str]]:
    """The weight limits to draw: (value, words, code); limits of the same value share one line."""
    if "weight" not in axes_pair:
        return []
    limits = aircraft.limits
    values = {
        "max_ramp_weight": limits.max_ramp_weight,
        "max_takeoff_weight": limits.max_takeoff_weight,
        "max_landing_weight": limits.max_landing_weight,
        "max_zero_fuel_weight": limits.max_zero_fuel_weight,
    }
    lines: dict[float, list[str]] = {}
    codes: dict[float, str] = {}
    for code, value in values.items():
        if value is None:
            continue
        lines.setdefault(value, []).append(_LIMIT_LINES[code])
        codes.setdefault(value, code)
    return [(value, " = ".join(words), codes[value]) for value, words in lines.items()]


def _draw_weight_limits(
    ax: Axes, aircraft: Aircraft, axes_pair: tuple[str, str], tag: str
) -> list[tuple[float, str, str]]:
    limits = _weight_limits(aircraft, axes_pair)
    vertical = axes_pair[0] == "weight"
    for value, words, code in limits:
        line = ax.axvline if vertical else ax.axhline
        line(value, color="#444444", linestyle=":", linewidth=0.9, zorder=1, gid=f"limit-{code}{tag}")
        _limit_name(ax, words, value, f"limitname-{code}{tag}", vertical)
    return limits


def _limit_name(ax: Axes, words: str, value: float, code: str, vertical: bool, shift: float = 0.0) -> Any:
    """The name of a weight limit beside the frame at its line's end, outside the plot (so it covers
    nothing); moved ``shift`` points along the frame, with a leader to the line, where names crowd."""
    leader = {"arrowstyle": "-", "color": "#888888", "linewidth": 0.6, "shrinkA": 0, "shrinkB": 0} if shift else None
    if vertical:
        return ax.annotate(
            words,
            (value, 1.0),
            xycoords=("data", "axes fraction"),
            xytext=(shift, 4 + (6 if shift else 0)),
            textcoords="offset points",
            rotation=90,
            fontsize=7,
            color="#444444",
            ha="center",
            va="bottom",
            annotation_clip=False,
            arrowprops=leader,
            gid=code,
        )
    return ax.annotate(
        words,
        (1.0, value),
        xycoords=("axes fraction", "data"),
        xytext=(4 + (6 if shift else 0), shift),
        textcoords="offset points",
        fontsize=7,
        color="#444444",
        ha="left",
        va="center",
        annotation_clip=False,
        arrowprops=leader,
        gid=code,
    )


def _spread_limit_names(ax: Axes, vertical: bool, renderer: RendererAgg) -> None:
    """Move apart, along the frame, the names of weight limits that lie close together."""
    from matplotlib.text import Annotation

    names = sorted(
        (t for t in ax.texts if isinstance(t, Annotation) and (t.get_gid() or "").startswith("limitname-")),
        key=lambda t: t.xy[0] if vertical else t.xy[1],
    )
    scale = ax.figure.dpi / 72.0
    previous_end: float | None = None
    for text in names:
        box = text.get_window_extent(renderer)
        start, end = (box.x0, box.x1) if vertical else (box.y0, box.y1)
        shift = 0.0 if previous_end is None else max(0.0, previous_end + 1.5 - start)
        if shift:
            value = text.xy[0] if vertical else text.xy[1]
            words, gid = text.get_text(), text.get_gid() or ""
            text.remove()
            text = _limit_name(ax, words, value, gid, vertical, shift / scale)
            box = text.get_window_extent(renderer)
            end = box.x1 if vertical else box.y1
        previous_end = end


def _coords(envelope: Envelope, weight: float, arm: float, lateral_arm: float | None) -> tuple[float, float]:
    x, y = envelope.shape.coords(weight, arm * weight, (lateral_arm or 0.0) * weight)
    return float(x), float(y)


def _draw_loading(ax: Axes, envelope: Envelope, result: CheckResult, indices: set[int], tag: str) -> list[_Label]:
    """Draw the burn path, the four conditions and where the path leaves; return their labels to place."""
    labels: list[_Label] = []
    samples = result.burn_path.samples
    if len(samples) > 1:
        path = [_coords(envelope, s.weight, s.arm, s.lateral_arm) for s in samples]
        ax.plot(
            [p[0] for p in path],
            [p[1] for p in path],
            color="#222222",
            linewidth=1.8,
            zorder=3,
            label="fuel burn, takeoff to landing",
            gid=f"burn-path{tag}",
        )
    for condition in result.conditions:
        marker, colour, words, size = _POINTS[condition.condition]
        x, y = _coords(envelope, condition.weight, condition.arm, condition.lateral_arm)
        ax.plot(
            [x],
            [y],
            marker=marker,
            markersize=size,
            color=colour,
            markeredgecolor="black",
            linestyle="none",
            zorder=4,
            label=words,
            gid=f"point-{condition.condition}{tag}",
        )
        labels.append(
            _Label(_point_words(condition, words, result, indices), (x, y), size, f"label-{condition.condition}{tag}")
        )
    in_legend: set[str] = set()
    for k, excursion in enumerate(result.burn_path.excursions):
        if excursion.envelope is not None and excursion.envelope not in indices:
            continue  # drawn in the panel of the envelope it leaves
        suffix = "" if k == 0 else f"-{k + 1}"
        for point, (words, legend, marker, colour, gid) in (
            (excursion.leaves, _LEAVES),
            (excursion.returns, _RETURNS),
        ):
            if point is None:  # starts outside at takeoff, or is still outside at landing
                continue
            x, y = _coords(envelope, point.weight, point.arm, point.lateral_arm)
            ax.plot(
                [x],
                [y],
                marker=marker,
                markersize=_LEAVE_SIZE,
                markerfacecolor="none",
                markeredgecolor=colour,
                markeredgewidth=2.2,
                linestyle="none",
                zorder=5,
                label=None if gid in in_legend else legend,
                gid=f"{gid}{tag}{suffix}",
            )
            in_legend.add(gid)
            labels.append(_Label(words, (x, y), _LEAVE_SIZE, f"label-{gid}{tag}{suffix}"))
    return labels


_LEAVES = ("path leaves", "path leaves the envelope (ring)", "o", "#CC0000", "leaves-at")
_RETURNS = ("path back inside", "path comes back inside (diamond)", "D", "#0072B2", "returns-at")
"""The marks where the burn path leaves an envelope and where it comes back inside: the label
beside the point, the legend's words, the hollow marker, its colour and the element id."""


def _point_words(condition: Condition, words: str, result: CheckResult, indices: set[int]) -> str:
    """A condition's label: its name, "(outside)" where it is out of limits, and at takeoff where the
    burn path starts outside this panel's envelope, that it is outside from takeoff (it does not leave)."""
    if condition.ok:
        return words
    first = result.burn_path.excursions[0] if result.burn_path.excursions else None
    if (
        condition.condition == "takeoff"
        and first is not None
        and first.from_takeoff
        and (first.envelope is None or first.envelope in indices)
    ):
        return f"{words} (outside: path outside from takeoff)"
    return f"{words} (outside)"


class _Label:
    """A label to place beside a point: its words, the point [data], the marker's size [points], an id."""

    __slots__ = ("gid", "point", "size", "words")

    def __init__(self, words: str, point: tuple[float, float], size: float, gid: str) -> None:
        self.words, self.point, self.size, self.gid = words, point, size, gid


# where a label may go around its point: directions, tried nearest first at each distance
_DIRECTIONS = [(1, 0), (-1, 0), (1, 1), (1, -1), (-1, 1), (-1, -1), (0, 1), (0, -1)]
_DISTANCES = [1.0, 2.0, 3.2, 4.6, 6.5, 9.0]  # in marker half-sizes plus a gap
_LEADER_FROM = 1  # from this distance on (and above or below its point), a leader line joins a label to its point


def _overlap(a: Any, b: Any, pad: float = 1.0) -> float:
    """Area [pixels²] shared by two boxes, each grown by ``pad`` pixels."""
    width = min(a.x1, b.x1) - max(a.x0, b.x0) + 2 * pad
    height = min(a.y1, b.y1) - max(a.y0, b.y0) + 2 * pad
    return max(width, 0.0) * max(height, 0.0)


def _inside(box: Any, frame: Any, pad: float = 2.0) -> bool:
    return (
        box.x0 >= frame.x0 + pad and box.x1 <= frame.x1 - pad and box.y0 >= frame.y0 + pad and box.y1 <= frame.y1 - pad
    )


def _place(
    canvas: FigureCanvasAgg,
    ax: Axes,
    labels: Sequence[_Label],
    limits: Sequence[tuple[float, str, str]],
    vertical: bool,
    tag: str,
) -> None:
    """Place the weight-limit names and the point labels so that none overlaps another label or a
    marker and each lies wholly inside the plot; where none of the places tried is free, the one
    overlapping least is used. Call after the layout is fixed (positions are in display pixels)."""
    from matplotlib.text import Text
    from matplotlib.transforms import Bbox

    renderer = canvas.get_renderer()
    frame = ax.get_window_extent(renderer)
    scale = canvas.figure.dpi / 72.0
    markers = []
    for label in labels:
        px, py = ax.transData.transform(label.point)
        half = label.size / 2 * scale + 1.0
        markers.append(Bbox([[px - half, py - half], [px + half, py + half]]))
    placed: list[Any] = []

    def cost(box: Any) -> float:
        return sum(_overlap(box, other) for other in placed + markers) + (0.0 if _inside(box, frame) else 1e9)

    _spread_limit_names(ax, vertical, renderer)

    segments: list[tuple[tuple[float, float], tuple[float, float]]] = []  # leader lines drawn so far

    def text_box(text: Any) -> Any:
        text.update_positions(renderer)
        return Text.get_window_extent(text, renderer)  # the words alone, without the leader line

    for label, marker in zip(labels, markers, strict=True):
        half = (marker.x1 - marker.x0) / 2 / scale  # [points]
        point = ((marker.x0 + marker.x1) / 2, (marker.y0 + marker.y1) / 2)
        best_label: tuple[float, Any, Any] | None = None
        for step, distance in enumerate(_DISTANCES):
            for dx, dy in _DIRECTIONS:
                gap = half * distance + 3.0
                offset = (dx * gap, dy * gap)
                leader = {"arrowstyle": "-", "color": "#444444", "linewidth": 0.7, "shrinkA": 0, "shrinkB": half}
                with_leader = step >= _LEADER_FROM or dy != 0
                text = ax.annotate(
                    label.words,
                    label.point,
                    textcoords="offset points",
                    xytext=offset,
                    fontsize=8,
                    zorder=6,
                    ha="left" if dx > 0 else "right" if dx < 0 else "center",
                    va="bottom" if dy > 0 else "top" if dy < 0 else "center",
                    gid=label.gid,
                    bbox={"boxstyle": "square,pad=0.1", "facecolor": "white", "edgecolor": "none", "alpha": 0.85},
                    arrowprops=leader if with_leader else None,
                )
                box = text_box(text)
                segment = (_nearest_corner(box, point), point)
                score = cost(box) + sum(100.0 for seg in segments if _crosses(seg, box))
                if with_leader:
                    score += sum(100.0 for other in placed if _crosses(segment, other))
                if best_label is None or score < best_label[0]:
                    if best_label is not None:
                        best_label[1].remove()
                    best_label = (score, text, segment if with_leader else None)
                else:
                    text.remove()
                if score == 0:
                    break
            if best_label is not None and best_label[0] == 0:
                break
        if best_label is not None:
            placed.append(text_box(best_label[1]))
            if best_label[2] is not None:
                segments.append(best_label[2])


def _nearest_corner(box: Any, point: tuple[float, float]) -> tuple[float, float]:
    x = min(max(point[0], box.x0), box.x1)
    y = min(max(point[1], box.y0), box.y1)
    return x, y


def _crosses(segment: tuple[tuple[float, float], tuple[float, float]], box: Any, pad: float = 1.0) -> bool:
    """Whether a line segment passes through a box [display pixels] (sampled every few pixels)."""
    (x0, y0), (x1, y1) = segment
    steps = max(2, int(abs(x1 - x0) + abs(y1 - y0)) // 3)
    for k in range(1, steps):
        x, y = x0 + (x1 - x0) * k / steps, y0 + (y1 - y0) * k / steps
        if box.x0 - pad < x < box.x1 + pad and box.y0 - pad < y < box.y1 + pad:
            return True
    return False


def _figure(aircraft: Aircraft, category: str, title: str, result: CheckResult | None, compact: bool = False) -> Figure:
    from matplotlib.backends.backend_agg import FigureCanvasAgg
    from matplotlib.figure import Figure

    panels = _panels(aircraft, category)
    if not panels:
        raise InputError(Problem("category", f"no envelope for category {category!r}"))
    width, height = (4.6, 3.6) if compact else (6.4, 5.6)  # [in]
    figure = Figure(figsize=(width * len(panels), height), layout="constrained")
    canvas = FigureCanvasAgg(figure)  # measures text, to place the labels
    placing = []
    for index, panel in enumerate(panels):
        ax = figure.add_subplot(1, len(panels), index + 1)
        envelope = panel[0]
        _draw_envelopes(ax, aircraft, category, panel)
        limits = _draw_weight_limits(ax, aircraft, envelope.axes, "" if index == 0 else f"-{index}")
        labels: list[_Label] = []
        if result is not None:
            indices = {i for i, e in enumerate(aircraft.envelope) if any(e is p for p in panel)}
            labels = _draw_loading(ax, envelope, result, indices, "" if index == 0 else f"-{index}")
        ax.set_xlabel(_axis_label(envelope.axes[0], aircraft, envelope))
        ax.set_ylabel(_axis_label(envelope.axes[1], aircraft, envelope))
        ax.grid(True, color="#DDDDDD", linewidth=0.6, zorder=0)
        ax.set_title(envelope.label or ("lateral" if envelope.is_lateral else "longitudinal"), fontsize=10)
        ax.margins(0.08)
        placing.append((ax, labels, limits, envelope.axes[0] == "weight", "" if index == 0 else f"-{index}"))
    _legend(figure)
    figure.suptitle("\n".join(textwrap.wrap(title, int((44 if compact else 64) * len(panels)))), fontsize=11)
    figure.draw_without_rendering()  # lay out once, then keep that layout while labels are placed
    figure.set_layout_engine("none")
    for ax, labels, limits, vertical, tag in placing:
        _place(canvas, ax, labels, limits, vertical, tag)
    return figure


def _legend(figure: Figure) -> None:
    """One legend for the figure, below the plots (never on an envelope); one entry per meaning."""
    handles: dict[str, Any] = {}
    for ax in figure.axes:
        for handle, words in zip(*ax.get_legend_handles_labels(), strict=True):
            handles.setdefault(words, handle)
    if handles:
        figure.legend(
            list(handles.values()),
            list(handles),
            loc="outside lower center",
            ncol=min(3, len(handles)),
            fontsize=7,
            frameon=False,
            markerscale=0.7,
        )


def _title(aircraft: Aircraft, extra: str | None) -> str:
    text = aircraft.name + (f" · {aircraft.registration}" if aircraft.registration else "")
    return f"{text}: {extra}" if extra else text


def check_figure(
    aircraft: Aircraft, result: CheckResult, loading_label: str | None = None, *, compact: bool = False
) -> Figure:
    """A chart of a check: envelopes, the four conditions, the burn path, weight limits.

    ``compact`` draws it smaller (4.6 in by 3.6 in a panel, the same type sizes) for a page
    that holds other things too, such as the load sheet.
    """
    caption = f"{result.category} category" + (f", {loading_label}" if loading_label else "")
    return _figure(aircraft, result.category, _title(aircraft, caption), result, compact)


def envelope_figure(aircraft: Aircraft, category: str | None = None) -> Figure:
    """A chart of the aircraft's envelopes alone (the chosen category, others fainter)."""
    chosen = aircraft.category(category)
    return _figure(aircraft, chosen, _title(aircraft, f"{chosen} category envelope"), None)


def fuel_payload_figure(aircraft: Aircraft, table: Any) -> Figure:
    """Allowed ramp fuel against payload added at a station (a :class:`~loadcheck.planning.FuelPayloadTable`).

    Each row is drawn where it was computed: a bar at its payload over each stretch of ramp
    fuel within limits, and a marker at its most fuel. Nothing is drawn between rows, since
    nothing between them was checked (a band spanning payloads would show fuel that no
    check allowed).
    """
    from matplotlib.figure import Figure

    units = aircraft.units
    station = table.station
    figure = Figure(figsize=(6.4, 4.8), layout="constrained")
    ax = figure.add_subplot(1, 1, 1)
    segments = [((row.payload, i.low), (row.payload, i.high)) for row in table.rows for i in row.intervals]
    if segments:
        from matplotlib.collections import LineCollection

        ax.add_collection(
            LineCollection(
                segments,
                colors="#1B3A57",
                linewidths=5,
                alpha=0.45,
                capstyle="butt",
                label="ramp fuel within limits (rows computed)",
                gid="within-limits",
            )
        )
    most = [(row.payload, row.most) for row in table.rows if row.most is not None]
    if most:
        ax.plot(
            [p for p, _ in most],
            [m for _, m in most],
            linestyle="none",
            marker="o",
            color="#1B3A57",
            label="most ramp fuel",
            gid="most-fuel",
        )
    none = [row.payload for row in table.rows if row.most is None]
    if none:
        ax.plot(
            none,
            [0.0] * len(none),
            linestyle="none",
            marker="x",
            color="#555555",
            label="no fuel within limits",
            gid="no-fuel",
        )
    payloads = [row.payload for row in table.rows] or [0.0]
    span = max(payloads) - min(payloads) or 1.0
    ax.set_xlim(min(payloads) - 0.04 * span, max(payloads) + 0.04 * span)
    ax.autoscale_view(scalex=False)
    ax.set_ylim(bottom=0.0)
    ax.set_xlabel(f"Weight added at {station} ({units.mass})")
    ax.set_ylabel(f"Ramp fuel ({units.fuel_volume})")
    ax.grid(True, color="#DDDDDD", linewidth=0.6)
    _legend(figure)
    figure.suptitle(
        "\n".join(textwrap.wrap(_title(aircraft, f"ramp fuel against payload at {station}"), 64)), fontsize=11
    )
    return figure


def save_figure(figure: Any, path: str | Path) -> None:
    """Write a figure as PNG, SVG or PDF by the file's ending, all at once.

    Raises
    ------
    InputError
        For another ending, naming the file and the formats known.
    """
    from ..files import write_atomic

    suffix = Path(path).suffix.lower().lstrip(".")
    if suffix not in FORMATS:
        raise InputError(
            Problem(
                "--chart",
                f"unknown chart format {suffix or '(none)'!r}",
                value=str(path),
                expected="a file ending in .png, .svg or .pdf",
            )
        )
    buffer = io.BytesIO()
    figure.savefig(buffer, format=suffix, dpi=150 if suffix == "png" else 72, metadata=_metadata(suffix))
    write_atomic(path, buffer.getvalue())


def figure_svg(figure: Any) -> str:
    """The figure as an SVG document (for embedding in a page)."""
    buffer = io.StringIO()
    figure.savefig(buffer, format="svg", metadata=_metadata("svg"))
    text = buffer.getvalue()
    start, end = text.find("<metadata>"), text.find("</metadata>")
    if start != -1 and end != -1:
        text = text[:start] + text[end + len("</metadata>") :]
    return text


def _metadata(suffix: str) -> dict[str, Any]:
    # no creation dates (the same input gives the same file) and no links to the web
    if suffix == "svg":
        return {"Date": None, "Creator": None, "Type": None, "Format": None}
    if suffix == "pdf":
        return {"CreationDate": None}
    return {}


# -- trips of several legs -------------------------------------------------------------------

# one dash pattern and one marker per leg, so the legs stay apart without colour
_LEG_LINES = ("-", "--", ":", "-.", (0, (5, 1, 1, 1, 1, 1)), (0, (1, 3)))
_LEG_MARKERS = ("^", "D", "P", "*", "h", "8")


def trip_figure(aircraft: Aircraft, trip: Any, loading_label: str | None = None) -> Figure:
    """A chart of a trip: the envelopes, and for each leg its burn path from takeoff to
    landing, drawn with its own dash pattern and marker and labelled with the leg's number
    (``gid`` ``leg-2-burn-path``, ``leg-2-takeoff``, ``leg-2-landing``; ``-1`` suffixed in a
    second panel).

    Parameters
    ----------
    trip : a :class:`~loadcheck.results.TripResult`
    """
    caption = f"{trip.category} category, {len(trip.legs)} legs" + (f", {loading_label}" if loading_label else "")
    figure = _figure(aircraft, trip.category, _title(aircraft, caption), None)
    for index, (ax, panel) in enumerate(zip(figure.axes, _panels(aircraft, trip.category), strict=True)):
        envelope, tag = panel[0], "" if index == 0 else f"-{index}"
        for number, leg in enumerate(trip.legs):
            check, style = leg.check, _LEG_LINES[number % len(_LEG_LINES)]
            marker, name = _LEG_MARKERS[number % len(_LEG_MARKERS)], f"leg {leg.leg}"
            samples = check.burn_path.samples
            if len(samples) > 1:
                path = [_coords(envelope, s.weight, s.arm, s.lateral_arm) for s in samples]
                ax.plot(
                    [p[0] for p in path],
                    [p[1] for p in path],
                    color="#222222",
                    linestyle=style,
                    linewidth=1.6,
                    zorder=3,
                    label=f"{name}: fuel burn",
                    gid=f"leg-{leg.leg}-burn-path{tag}",
                )
            for condition in (check.condition("takeoff"), check.condition("landing")):
                x, y = _coords(envelope, condition.weight, condition.arm, condition.lateral_arm)
                ax.plot(
                    [x],
                    [y],
                    marker=marker,
                    markersize=7,
                    color="white" if condition.condition == "landing" else "#222222",
                    markeredgecolor="black",
                    linestyle="none",
                    zorder=4,
                    gid=f"leg-{leg.leg}-{condition.condition}{tag}",
                )
                words = f"{leg.leg} {'T/O' if condition.condition == 'takeoff' else 'LDG'}"
                ax.annotate(
                    words + ("" if condition.ok else " (outside)"),
                    (x, y),
                    textcoords="offset points",
                    xytext=(7, 4 if condition.condition == "takeoff" else -9),
                    fontsize=7,
                )
        ax.legend(fontsize=7, loc="best", framealpha=0.9)
    return figure
