"""Long listings as plain aligned text: one line per row, at any length, quickly.

A rich table lays out every cell of every row before printing (about half a millisecond a
row), so a listing of a day of flights or of the check log is printed as plain text
once it has more than :data:`PLAIN_ROWS` rows: a title, a header, a rule, then each row with
its columns padded to the widest cell of the column. Nothing is cut or wrapped: a cell
wider than the terminal runs on, and the verdict words are the same as in the table (no
meaning rests on colour).
"""

from __future__ import annotations

from collections.abc import Sequence
from typing import IO, Any

__all__ = ["PLAIN_ROWS", "plain_columns", "plain_listing", "use_plain"]

PLAIN_ROWS = 200
"""Listings longer than this many rows are printed as plain aligned text."""


def use_plain(rows: int) -> bool:
    """Whether a listing of ``rows`` rows is printed as plain text rather than a rich table."""
    return rows > PLAIN_ROWS


def plain_listing(
    out: IO[str],
    title: str,
    headers: Sequence[str],
    rows: Sequence[Sequence[str]],
    right: Sequence[int] = (),
    width: int | None = None,
) -> None:
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
    columns = [list(column) for column in zip(*rows, strict=True)] if rows else [[] for _ in headers]
    plain_columns(out, title, headers, columns, right, width)


def plain_columns(
    out: IO[str],
    title: str,
    headers: Sequence[str],
    columns: Sequence[Sequence[str]],
    right: Sequence[int] = (),
    width: int | None = None,
) -> None:
    """:func:`plain_listing` of cells given column by column (``columns[k]`` the cells of
    column ``k``, every column as long).

    Each column is padded as a whole with the string methods and the lines are joined
    with them, so that no Python code runs per row: 100,000 rows take a few tenths of a
    second (docs/performance.md, "Records list and start-up").
    """
    import textwrap
    from itertools import chain
    from operator import methodcaller

    columns = [
        ["; ".join(cell.splitlines()) for cell in column] if "\n" in "\x00".join(column) else column
        for column in columns
    ]  # the test in C, the join only where a cell has several lines
    widths = [max(len(h), max(map(len, column), default=0)) for h, column in zip(headers, columns, strict=True)]
    shown = len(headers)
    if width is not None:
        used, shown = -2, 0
        while shown < len(headers) and used + 2 + widths[shown] <= width:
            used += 2 + widths[shown]
            shown += 1
        shown = max(shown, 1)
    last = shown - 1
    aligned = set(right)

    def padded(k: int, cells: Sequence[str]) -> Any:
        if k in aligned:
            return map(methodcaller("rjust", widths[k]), cells)
        return cells if k == last else map(methodcaller("ljust", widths[k]), cells)

    def lines_of(cells: list[Sequence[str]]) -> Any:
        return map(str.rstrip, map("  ".join, zip(*(padded(k, c) for k, c in enumerate(cells)), strict=True)))

    out.write(title + "\n")
    out.write(next(iter(lines_of([[h] for h in headers[:shown]]))) + "\n")
    out.write("  ".join("-" * w for w in widths[:shown]) + "\n")
    wrap = width if width is not None else 10**6
    # A column that does not fit goes on a line of its own under its row, "  Header: value";
    # empty cells are left out, and a line too long for the width is wrapped at spaces.
    parts = [lines_of(columns[:shown])]
    for k in range(shown, len(headers)):
        label = f"  {headers[k]}: "
        if all(columns[k]) and len(label) + widths[k] <= wrap:
            parts.append(map(label.__add__, columns[k]))
        else:
            parts.append(
                [
                    "\n".join(
                        textwrap.wrap(
                            f"{headers[k]}: {cell}",
                            wrap,
                            initial_indent="  ",
                            subsequent_indent="    ",
                            break_long_words=False,
                            break_on_hyphens=False,
                        )
                    )
                    if cell
                    else None
                    for cell in columns[k]
                ]
            )
    lines = chain.from_iterable(zip(*parts, strict=True)) if len(parts) > 1 else parts[0]
    if any(isinstance(part, list) for part in parts[1:]):
        lines = (line for line in lines if line is not None)
    text = "\n".join(lines)
    out.write(text + "\n" if text else "")
    out.flush()
