"""Terminal output of the check log: recorded checks against the current aircraft data."""

from __future__ import annotations

from collections.abc import Sequence
from operator import itemgetter
from pathlib import Path
from typing import TYPE_CHECKING

from rich.console import Console

from .listing import plain_columns, use_plain
from .terminal import Column, _print_table, caution_text

if TYPE_CHECKING:
    from ..checklog import CurrentVerification, Listed

__all__ = ["render_current_verification", "render_check_log"]


def render_check_log(path: Path, records: Sequence[Listed], caution: str, console: Console) -> None:
    """The recorded checks, one line each (id, time, registration, reference, pilot, verdict,
    data), then the caution. A trip is one record: its verdict is the whole trip's, with its
    legs counted ("OUT OF LIMITS (2 legs)").

    ``records`` as :meth:`loadcheck.checklog.CheckLog.listing` gives them. A long listing is
    plain aligned text (:mod:`loadcheck.render.listing`).
    """
    title = f"Check log {path}"
    heads = ("Id", "Checked (UTC)", "Registration", "Reference", "Pilot", "Result", "Data")
    # column by column, each in one pass in C (a listing may hold 100,000 records)
    got = [list(map(itemgetter(k), records)) for k in range(8)]

    def verdict(ok: int, legs: int) -> str:
        words = "within limits" if ok else "OUT OF LIMITS"
        return words if legs == 1 else f"{words} ({legs} legs)"

    words = {key: verdict(*key) for key in set(zip(got[5], got[7], strict=True))}
    columns = [
        list(map(str, got[0])),
        [t[:19] for t in got[1]],
        *([c or "" for c in got[k]] for k in (2, 3, 4)),
        list(map(words.__getitem__, zip(got[5], got[7], strict=True))),
        got[6],
    ]
    if use_plain(len(columns[0])):
        plain_columns(console.file, title, heads, columns, right=(0,), width=console.width)
    else:  # laid out for the width, nothing cut
        table = [Column("Id", key=True)] + [Column(h, numeric=False) for h in heads[1:-1]] + [Column("Data")]
        _print_table(console, title, table, [list(row) for row in zip(*columns, strict=True)])
    console.print(caution_text(caution))


def render_current_verification(outcome: CurrentVerification, console: Console) -> None:
    """Print each recorded check with the verdict then and now, the data changes, then the caution."""
    rows = []
    for check in outcome.checks:
        if check.current_fingerprint is None:
            data = "not in the fleet"
        else:
            data = "changed since" if check.data_changed else "unchanged"
        if check.current_ok is None:
            now = "CANNOT BE CHECKED"
        else:
            now = "within limits" if check.current_ok else "OUT OF LIMITS"
            if check.now_out_of_limits:
                now += " (was within)"
        recorded = "within limits" if check.recorded_ok else "OUT OF LIMITS"
        checked = check.checked_at[:19]
        rows.append(
            [str(check.record_id), checked, check.registration or "", check.reference or "", data, recorded, now]
        )
    heads = ("Checked (UTC)", "Registration", "Reference", "Aircraft data", "Recorded", "With current data")
    # laid out for the width, nothing cut (the log's own listing does the same)
    columns = [Column("Id", key=True)] + [Column(h, numeric=h == "Checked (UTC)") for h in heads]
    _print_table(console, f"Recorded checks against the current data of {outcome.fleet}", columns, rows)
    for check in outcome.checks:
        if check.problem:
            console.print(f"record {check.record_id}: {check.problem}", markup=False)
        elif check.current_ok is False:
            for finding in check.current_findings:
                console.print(f"record {check.record_id}: LIMIT {finding}", markup=False)
    unchecked = sum(1 for check in outcome.checks if check.current_ok is None)
    console.print(
        f"{len(outcome.checks)} record(s); {outcome.changed} made with aircraft data that has changed since; "
        f"{outcome.now_out_of_limits} recorded within limits and now out of limits"
        + (f"; {unchecked} could not be checked with the current data" if unchecked else ""),
        markup=False,
    )
    console.print(caution_text(outcome.caution))
