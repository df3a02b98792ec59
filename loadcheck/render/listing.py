"""Long listings as plain aligned text: one line per row, at any length, quickly.

A rich table lays out every cell of every row before printing (about half a millisecond a
row), so a listing of a day of flights or of the check log is printed as plain text
once it has more than :data:`PLAIN_ROWS` rows: a title, a header, a rule, then each row with
its columns padded to the widest cell of the column. Nothing is cut or wrapped: a cell
wider than the terminal runs on, and the verdict words are the same as in the table (no
meaning rests on colour).
"""

from __future__ import annotations

from collections.abc import Iterable, Iterator, Sequence
from typing import IO

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

    Each line is one format string applied to the row's cells and the lines are joined
    with the string methods, so that no Python code runs per row: 100,000 rows take about
    a tenth of a second (docs/performance.md, "Records list and start-up").
    """
    import textwrap

    columns = [
        ["; ".join(cell.splitlines()) for cell in column] if "\n" in "\x00".join(column) else column
        for column in columns
    ]  # the test in C, the join only where a cell has several lines
    headers = [" ".join(h.splitlines()) for h in headers]  # a table's two-line header on one line
    if len({len(headers), len(columns)}) > 1 or len(set(map(len, columns))) > 1:
        raise ValueError("plain_columns: one column for each header, every column as long")
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

    def lines_of(cells: Sequence[Sequence[str]]) -> Iterator[str]:
        # one format per row does the padding of all its cells in C; the last column is not padded
        spec = [
            "{:>%d}" % widths[k] if k in aligned else "{}" if k == last else "{:<%d}" % widths[k] for k in range(shown)
        ]
        return map(str.rstrip, map("  ".join(spec).format, *cells))

    out.write(title + "\n")
    out.write(next(lines_of([[h] for h in headers[:shown]])) + "\n")
    out.write("  ".join("-" * w for w in widths[:shown]) + "\n")
    wrap = width if width is not None else 10**6
    # A column that does not fit goes on a line of its own under its row, "  Header: value";
    # empty cells are left out, and a line too long for the width is wrapped at spaces.
    blocks: Iterable[str] = lines_of(columns[:shown])  # each row's line, then its cells that did not fit
    for k in range(shown, len(headers)):
        label = f"  {headers[k]}: "
        extra: Iterable[str]
        if all(columns[k]) and len(label) + widths[k] <= wrap:
            extra = map(f"\n{label}".__add__, columns[k])
        else:
            extra = [
                "\n"
                + "\n".join(
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
                else ""
                for cell in columns[k]
            ]
        blocks = map(str.__add__, blocks, extra)
    text = "\n".join(blocks)
    out.write(text + "\n" if text else "")
    out.flush()
