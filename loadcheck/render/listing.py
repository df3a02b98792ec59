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
from typing import IO

__all__ = ["PLAIN_ROWS", "plain_listing", "use_plain"]

PLAIN_ROWS = 200
"""Listings longer than this many rows are printed as plain aligned text."""


def use_plain(rows: int) -> bool:
    """Whether a listing of ``rows`` rows is printed as plain text rather than a rich table."""
    return rows > PLAIN_ROWS


def plain_listing(out: IO[str], title: str, headers: Sequence[str], rows: Sequence[Sequence[str]],
                  right: Sequence[int] = (), width: int | None = None) -> None:
    """Write a listing: title, header, rule, one line per row, columns two spaces apart.

    Where the columns do not all fit in ``width``, each row's line holds the leading
    columns that fit, and every other column follows on lines of its own ("  Header:
    value"), wrapped at spaces only: no number, verdict or unit is ever cut.

    Parameters
    ----------
    out : where to write (the console's file)
    title : the first line
    headers : column names
    rows : cells of each row, as text (several lines in a cell are joined with "; ")
    right : indices of the columns aligned to the right (numbers)
    width : the terminal's width [characters]; None for no limit
    """
    import textwrap

    columns = [list(column) for column in zip(*rows)] if rows else [[] for _ in headers]
    for column in columns:
        if any("\n" in cell for cell in column):
            column[:] = ["; ".join(cell.splitlines()) for cell in column]
    widths = [max(len(h), max(map(len, column), default=0)) for h, column in zip(headers, columns)]
    shown = len(headers)
    if width is not None:
        used, shown = -2, 0
        while shown < len(headers) and used + 2 + widths[shown] <= width:
            used += 2 + widths[shown]
            shown += 1
        shown = max(shown, 1)
    cells = list(zip(*columns))
    last = shown - 1
    aligned = set(right)
    pattern = "  ".join("{:>%d}" % w if k in aligned else ("{}" if k == last else "{:<%d}" % w)
                        for k, w in enumerate(widths[:shown]))
    wrap = width if width is not None else 10**6

    def more(row: Sequence[str]) -> str:
        lines = []
        for header, cell in zip(headers[shown:], row[shown:]):
            if cell:
                lines += textwrap.wrap(f"{header}: {cell}", wrap, initial_indent="  ", subsequent_indent="    ",
                                       break_long_words=False, break_on_hyphens=False)
        return "".join(line + "\n" for line in lines)

    out.write(title + "\n")
    out.write(pattern.format(*headers[:shown]).rstrip() + "\n")
    out.write("  ".join("-" * w for w in widths[:shown]) + "\n")
    out.write("".join(pattern.format(*row[:shown]).rstrip() + "\n" + more(row) for row in cells))
    out.flush()
