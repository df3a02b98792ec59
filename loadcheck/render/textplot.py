"""A small text picture of the envelope and the condition points, for a terminal.

Characters only: the envelope outline in ``#`` (other categories are not drawn), the burn
path in ``.``, the conditions as ``R`` (ramp), ``T`` (takeoff), ``L`` (landing), ``Z``
(zero fuel), ``X`` where the path leaves, ``O`` where it comes back inside (a path outside
at takeoff has no ``X`` there: it does not leave). Resolution is one character: the tables
above it carry the numbers; marks that fall in one character are said under the legend ("R is under
T"), so that no mark hides another unsaid. The picture is drawn for the width it is given (the console's), and
the words around it wrap to that width.
"""

from __future__ import annotations

import textwrap

from ..aircraft import Aircraft, Envelope
from ..results import CheckResult

__all__ = ["text_plot"]

_MARKS = {"ramp": "R", "takeoff": "T", "landing": "L", "zero_fuel": "Z"}


_LEGEND = ("R ramp", "T takeoff", "L landing", "Z zero fuel", ". burn path", "X leaves", "O back inside")
_LEFT = 12  # the y labels and the left frame: "{label:>10} +"
_MIN_GRID = 20


def text_plot(aircraft: Aircraft, result: CheckResult, width: int = 80, height: int = 18) -> list[str]:
    """Lines of a character plot of each envelope of the category, longitudinal first.

    Parameters
    ----------
    width : the whole line width [characters]; no line is longer (the grid is never
        narrower than 20 characters, so below 33 columns lines are longer)
    height : rows of the grid [characters]
    """
    grid = max(_MIN_GRID, width - _LEFT - 1)
    chosen = sorted(aircraft.envelopes_for(result.category), key=lambda e: e.is_lateral)
    lines: list[str] = []
    for envelope in chosen:
        lines += _panel(envelope, result, grid, height, max(width, grid + _LEFT + 1)) + [""]
    return lines


def _xy(envelope: Envelope, weight: float, arm: float, lateral: float | None) -> tuple[float, float]:
    x, y = envelope.shape.coords(weight, arm * weight, (lateral or 0.0) * weight)
    return float(x), float(y)


def _panel(envelope: Envelope, result: CheckResult, width: int, height: int, line_width: int) -> list[str]:
    corners = [tuple(map(float, c)) for c in envelope.shape.corners]
    points = {c.condition: _xy(envelope, c.weight, c.arm, c.lateral_arm) for c in result.conditions}
    path = [_xy(envelope, s.weight, s.arm, s.lateral_arm) for s in result.burn_path.samples]
    xs = [p[0] for p in corners] + [p[0] for p in points.values()]
    ys = [p[1] for p in corners] + [p[1] for p in points.values()]
    x0, x1, y0, y1 = min(xs), max(xs), min(ys), max(ys)
    pad_x, pad_y = (x1 - x0) * 0.05 or 1.0, (y1 - y0) * 0.05 or 1.0
    x0, x1, y0, y1 = x0 - pad_x, x1 + pad_x, y0 - pad_y, y1 + pad_y
    grid = [[" "] * width for _ in range(height)]

    def cell(x: float, y: float) -> tuple[int, int]:
        col = round((x - x0) / (x1 - x0) * (width - 1))
        row = round((y1 - y) / (y1 - y0) * (height - 1))
        return min(max(row, 0), height - 1), min(max(col, 0), width - 1)

    def put(x: float, y: float, mark: str) -> None:
        row, col = cell(x, y)
        grid[row][col] = mark

    for (ax, ay), (bx, by) in zip(corners, corners[1:] + corners[:1], strict=True):
        steps = 2 * max(width, height)
        for k in range(steps + 1):
            put(ax + (bx - ax) * k / steps, ay + (by - ay) * k / steps, "#")
    for x, y in path:
        put(x, y, ".")
    marks: dict[tuple[int, int], list[str]] = {}  # the marks that fall in each character cell, in drawing order
    for excursion in result.burn_path.excursions:  # a path outside at takeoff does not leave there
        for point, mark in ((excursion.leaves, "X"), (excursion.returns, "O")):
            if point is not None:
                marks.setdefault(cell(*_xy(envelope, point.weight, point.arm, point.lateral_arm)), []).append(mark)
    for name, (x, y) in points.items():
        marks.setdefault(cell(x, y), []).append(_MARKS[name])
    hidden: list[str] = []  # no mark hides another unsaid: the ones under the mark shown are listed
    for (row, col), here in marks.items():
        grid[row][col] = here[-1]
        if len(here) > 1:
            under = " and ".join(here[:-1])
            hidden.append(f"{under} {'is' if len(here) == 2 else 'are'} under {here[-1]} (the same character)")
    x_name, y_name = (
        f"moment / {envelope.moment_scale:g}" if axis == "moment" and envelope.moment_scale != 1 else axis
        for axis in envelope.axes
    )
    title = (
        f"{envelope.label or ('lateral' if envelope.is_lateral else 'longitudinal')} envelope: {y_name} "
        f"(up) against {x_name} (across)"
    )
    rows = textwrap.wrap(title, line_width)
    rows.append(f"{y1:>10.4g} +" + "-" * width + "+")
    rows += [" " * 11 + "|" + "".join(r) + "|" for r in grid]
    rows.append(f"{y0:>10.4g} +" + "-" * width + "+")
    left, right = f"{x0:.4g}", f"{x1:.4g}"
    rows.append(" " * _LEFT + left + " " * max(1, width - len(left) - len(right) + 1) + right)
    legend = " " * _LEFT
    for entry in _LEGEND:
        if legend.strip() and len(legend) + 2 + len(entry) > line_width:
            rows.append(legend)
            legend = " " * _LEFT
        legend += ("  " if legend.strip() else "") + entry
    rows.append(legend)
    rows += [" " * _LEFT + line for text in hidden for line in textwrap.wrap(text, max(20, line_width - _LEFT))]
    return rows
