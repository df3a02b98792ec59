"""Envelope charts with matplotlib (imported only inside the functions that draw).

Meaning never rests on colour alone: each condition has its own marker shape and a text
label, the chosen category's envelope is a solid outline with a light fill, other
categories are dashed and faint, weight limits are dotted lines with their names, and
the burn path is a solid dark line with the point where it leaves marked by a cross.
Colours come from a palette chosen to stay distinct for colour-blind readers and to stay
readable in greyscale print.

Every artist that carries a meaning has a ``gid`` (``point-takeoff``, ``burn-path``,
``leaves-at``, ``envelope-normal-0``; in a second panel ``point-takeoff-1`` and so on),
which the SVG output keeps as element ids.
"""

from __future__ import annotations

import io
from collections.abc import Sequence
from pathlib import Path
from typing import TYPE_CHECKING, Any

from ..aircraft import Aircraft, Envelope
from ..errors import InputError, Problem
from ..results import CheckResult

if TYPE_CHECKING:
    from matplotlib.axes import Axes
    from matplotlib.figure import Figure

__all__ = ["FORMATS", "check_figure", "envelope_figure", "fuel_payload_figure", "save_figure", "figure_svg", "trip_figure"]

FORMATS = ("png", "svg", "pdf")

# (marker, colour, label, label offset in points): distinct shapes first, colours second
_POINTS = {
    "ramp": ("s", "#0072B2", "ramp", (-9, 6)),
    "takeoff": ("^", "#D55E00", "takeoff", (9, -3)),
    "landing": ("v", "#009E73", "landing", (9, -8)),
    "zero_fuel": ("o", "#555555", "zero fuel", (9, 3)),
}
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
    return f"Moment / {scale:g} ({units.moment})" if scale != 1 else f"Moment ({units.moment})"


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
            ax.plot(xs, ys, color="#1B3A57", linewidth=1.6, zorder=2, label=f"{other.category} envelope",
                    gid=f"envelope-{other.category}-{index}")
        else:
            ax.plot(xs, ys, color="#8A8A8A", linewidth=1.0, linestyle="--", zorder=1,
                    label=f"{other.category} envelope", gid=f"envelope-{other.category}-{index}")


def _draw_weight_limits(ax: Axes, aircraft: Aircraft, axes_pair: tuple[str, str]) -> None:
    if "weight" not in axes_pair:
        return
    limits = aircraft.limits
    values = {
        "max_ramp_weight": limits.max_ramp_weight,
        "max_takeoff_weight": limits.max_takeoff_weight,
        "max_landing_weight": limits.max_landing_weight,
        "max_zero_fuel_weight": limits.max_zero_fuel_weight,
    }
    shown: list[float] = []
    vertical = axes_pair[0] == "weight"
    for code, value in values.items():
        if value is None or value in shown:
            continue
        right = any(abs(value - other) < 0.02 * value for other in shown) and len(shown) % 2 == 1
        shown.append(value)
        line = ax.axvline if vertical else ax.axhline
        line(value, color="#444444", linestyle=":", linewidth=0.9, zorder=1, gid=f"limit-{code}")
        if vertical:
            ax.annotate(_LIMIT_LINES[code], (value, 1.0), xycoords=("data", "axes fraction"), rotation=90,
                        fontsize=7, va="top", ha="right", color="#444444")
        else:
            ax.annotate(_LIMIT_LINES[code], (1.0 if right else 0.0, value), xycoords=("axes fraction", "data"),
                        fontsize=7, va="bottom", ha="right" if right else "left", color="#444444")


def _coords(envelope: Envelope, weight: float, arm: float, lateral_arm: float | None) -> tuple[float, float]:
    x, y = envelope.shape.coords(weight, arm * weight, (lateral_arm or 0.0) * weight)
    return float(x), float(y)


def _draw_loading(ax: Axes, envelope: Envelope, result: CheckResult, indices: set[int], tag: str) -> None:
    samples = result.burn_path.samples
    if len(samples) > 1:
        path = [_coords(envelope, s.weight, s.arm, s.lateral_arm) for s in samples]
        ax.plot([p[0] for p in path], [p[1] for p in path], color="#222222", linewidth=1.8, zorder=3,
                label="fuel burn, takeoff to landing", gid=f"burn-path{tag}")
    leave = result.burn_path.leaves_at
    if leave is not None and (leave.envelope is None or leave.envelope in indices):
        x, y = _coords(envelope, leave.weight, leave.arm, leave.lateral_arm)
        ax.plot([x], [y], marker="X", markersize=11, color="#CC0000", markeredgecolor="black", linestyle="none",
                zorder=5, label="path leaves the envelope", gid=f"leaves-at{tag}")
    for condition in result.conditions:
        marker, colour, words, offset = _POINTS[condition.condition]
        x, y = _coords(envelope, condition.weight, condition.arm, condition.lateral_arm)
        ax.plot([x], [y], marker=marker, markersize=8, color=colour, markeredgecolor="black", linestyle="none",
                zorder=4, label=words, gid=f"point-{condition.condition}{tag}")
        ax.annotate(f"{words}{'' if condition.ok else ' (outside)'}", (x, y), textcoords="offset points",
                    xytext=offset, fontsize=8, ha="right" if offset[0] < 0 else "left", gid=f"label-{condition.condition}{tag}")


def _figure(aircraft: Aircraft, category: str, title: str, result: CheckResult | None) -> Figure:
    from matplotlib.figure import Figure

    panels = _panels(aircraft, category)
    if not panels:
        raise InputError(Problem("category", f"no envelope for category {category!r}"))
    figure = Figure(figsize=(6.4 * len(panels), 5.2), layout="constrained")
    for index, panel in enumerate(panels):
        ax = figure.add_subplot(1, len(panels), index + 1)
        envelope = panel[0]
        _draw_envelopes(ax, aircraft, category, panel)
        _draw_weight_limits(ax, aircraft, envelope.axes)
        if result is not None:
            indices = {i for i, e in enumerate(aircraft.envelope) if any(e is p for p in panel)}
            _draw_loading(ax, envelope, result, indices, "" if index == 0 else f"-{index}")
        ax.set_xlabel(_axis_label(envelope.axes[0], aircraft, envelope))
        ax.set_ylabel(_axis_label(envelope.axes[1], aircraft, envelope))
        ax.grid(True, color="#DDDDDD", linewidth=0.6, zorder=0)
        ax.set_title(envelope.label or ("lateral" if envelope.is_lateral else "longitudinal"), fontsize=10)
        ax.legend(fontsize=7, loc="best", framealpha=0.9)
    figure.suptitle(title, fontsize=11)
    return figure


def _title(aircraft: Aircraft, extra: str | None) -> str:
    text = aircraft.name + (f" ({aircraft.registration})" if aircraft.registration else "")
    return f"{text}: {extra}" if extra else text


def check_figure(aircraft: Aircraft, result: CheckResult, loading_label: str | None = None) -> Figure:
    """A chart of a check: envelopes, the four conditions, the burn path, weight limits."""
    caption = f"{result.category} category" + (f", {loading_label}" if loading_label else "")
    return _figure(aircraft, result.category, _title(aircraft, caption), result)


def envelope_figure(aircraft: Aircraft, category: str | None = None) -> Figure:
    """A chart of the aircraft's envelopes alone (the chosen category, others fainter)."""
    chosen = aircraft.category(category)
    return _figure(aircraft, chosen, _title(aircraft, f"{chosen} category envelope"), None)


def fuel_payload_figure(aircraft: Aircraft, rows: Sequence[Any], station: str) -> Figure:
    """Allowed ramp fuel against payload added at a station; the region within limits shaded."""
    from matplotlib.figure import Figure

    units = aircraft.units
    figure = Figure(figsize=(6.4, 4.8), layout="constrained")
    ax = figure.add_subplot(1, 1, 1)
    payloads = [row.payload for row in rows]
    step = (payloads[1] - payloads[0]) if len(payloads) > 1 else 1.0
    labelled = False
    for row in rows:
        for interval in row.intervals:
            ax.fill_between([row.payload - step / 2, row.payload + step / 2], interval.low, interval.high,
                            color="#CFE3F2", edgecolor="#1B3A57", linewidth=0.6, hatch="//",
                            label=None if labelled else "within limits", gid="within-limits")
            labelled = True
    most = [(row.payload, row.most) for row in rows if row.most is not None]
    if most:
        ax.plot([p for p, _ in most], [m for _, m in most], marker="o", color="#1B3A57", label="most ramp fuel",
                gid="most-fuel")
    ax.set_xlabel(f"Weight added at {station} ({units.mass})")
    ax.set_ylabel(f"Ramp fuel ({units.fuel_volume})")
    ax.grid(True, color="#DDDDDD", linewidth=0.6)
    ax.legend(fontsize=8)
    figure.suptitle(_title(aircraft, f"ramp fuel against payload at {station}"), fontsize=11)
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
        raise InputError(Problem("--chart", f"unknown chart format {suffix or '(none)'!r}", value=str(path),
                                 expected="a file ending in .png, .svg or .pdf"))
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
        text = text[:start] + text[end + len("</metadata>"):]
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
                ax.plot([p[0] for p in path], [p[1] for p in path], color="#222222", linestyle=style, linewidth=1.6,
                        zorder=3, label=f"{name}: fuel burn", gid=f"leg-{leg.leg}-burn-path{tag}")
            for condition in (check.condition("takeoff"), check.condition("landing")):
                x, y = _coords(envelope, condition.weight, condition.arm, condition.lateral_arm)
                ax.plot([x], [y], marker=marker, markersize=7, color="white" if condition.condition == "landing" else "#222222",
                        markeredgecolor="black", linestyle="none", zorder=4,
                        gid=f"leg-{leg.leg}-{condition.condition}{tag}")
                words = f"{leg.leg} {'T/O' if condition.condition == 'takeoff' else 'LDG'}"
                ax.annotate(words + ("" if condition.ok else " (outside)"), (x, y), textcoords="offset points",
                            xytext=(7, 4 if condition.condition == "takeoff" else -9), fontsize=7)
        ax.legend(fontsize=7, loc="best", framealpha=0.9)
    return figure
