"""Long listings as plain aligned text: one line per row, at any length, quickly.

A rich table lays out every cell of every row before printing (about half a millisecond a
row), so a listing of a day of flights or of the record of checks is printed as plain text
once it has more than :data:`PLAIN_ROWS` rows: a title, a header, a rule, then each row with
its columns padded to the widest cell of the column. Nothing is cut or wrapped: a cell
wider than the terminal runs on, and the verdict words are the same as in the table (no
meaning rests on colour).
"""

from __future__ import annotations

from collections.abc import Sequence
from typing import IO, Any

__all__ = ["PLAIN_ROWS", "plain_listing", "render_fleet_plain", "use_plain"]

PLAIN_ROWS = 200
"""Listings longer than this many rows are printed as plain aligned text."""


def use_plain(rows: int) -> bool:
    """Whether a listing of ``rows`` rows is printed as plain text rather than a rich table."""
    return rows > PLAIN_ROWS


def plain_listing(out: IO[str], title: str, headers: Sequence[str], rows: Sequence[Sequence[str]],
                  right: Sequence[int] = ()) -> None:
    """Write a listing: title, header, rule, one line per row, columns two spaces apart.

    Parameters
    ----------
    out : where to write (the console's file)
    title : the first line
    headers : column names
    rows : cells of each row, as text (several lines in a cell are joined with "; ")
    right : indices of the columns aligned to the right (numbers)
    """
    columns = [list(column) for column in zip(*rows)] if rows else [[] for _ in headers]
    for column in columns:
        if any("\n" in cell for cell in column):
            column[:] = ["; ".join(cell.splitlines()) for cell in column]
    widths = [max(len(h), max(map(len, column), default=0)) for h, column in zip(headers, columns)]
    cells = list(zip(*columns))
    last = len(headers) - 1
    aligned = set(right)
    pattern = "  ".join("{:>%d}" % w if k in aligned else ("{}" if k == last else "{:<%d}" % w)
                        for k, w in enumerate(widths))
    out.write(title + "\n")
    out.write(pattern.format(*headers).rstrip() + "\n")
    out.write("  ".join("-" * w for w in widths) + "\n")
    out.write("".join(pattern.format(*row).rstrip() + "\n" for row in cells))
    out.flush()


def render_fleet_plain(flights: Sequence[Any], console: Any) -> None:
    """The flights of a fleet check as plain aligned text: the columns, summary and caution of
    :func:`loadcheck.render.terminal.render_fleet` (which hands long listings here)."""
    from ..caution import PILOT_CAUTION
    from ..display import fmt
    from .terminal import caution_text

    rows = []
    for flight in flights:
        row = flight.row
        if flight.result is None:
            rows.append((str(row.line), row.registration or "", row.reference or "", "", "", "INPUT ERROR",
                         "; ".join(flight.problems)))
            continue
        result = flight.result
        units = result["units"]
        conditions = {c["condition"]: c for c in result["conditions"]}
        takeoff, landing = conditions["takeoff"], conditions["landing"]
        first = next((f["message"] for f in result["findings"] if f["severity"] == "limit"), "")
        rows.append((str(row.line), row.registration or "", row.reference or "",
                     f"{fmt(takeoff['weight'], units['mass'])} / {fmt(takeoff['arm'], units['arm'])}",
                     f"{fmt(landing['weight'], units['mass'])} / {fmt(landing['arm'], units['arm'])}",
                     "within" if result["ok"] else "OUT", first))
    plain_listing(console.file, "Flights", ("Line", "Registration", "Reference", "Takeoff", "Landing", "Result",
                                            "First finding"), rows, right=(0,))
    out = sum(1 for f in flights if f.result is not None and not f.ok)
    bad = sum(1 for f in flights if f.result is None)
    console.print(f"{len(flights)} flight(s): {len(flights) - out - bad} within limits, {out} out of limits, "
                  f"{bad} could not be used.", markup=False)
    console.print(caution_text(PILOT_CAUTION))
