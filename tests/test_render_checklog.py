"""Tests of loadcheck/render/checklog.py: the check log's listing as the user reads it."""

from __future__ import annotations

from loadcheck.checklog import CheckLog
from loadcheck.cli import app

from .helpers import tamper_check_log


def test_a_long_listing_reads_only_what_it_shows(runner, db):
    # log list of 10,000 records took 5 s: it read and parsed every stored result and
    # laid out a rich table; it now reads the columns it shows and prints plain aligned
    # text past the threshold. A record whose stored result cannot be parsed still lists.
    from loadcheck.render.listing import PLAIN_ROWS

    with CheckLog(db) as log:
        log.add_many(
            [
                {
                    "aircraft_data": {"x": 1},
                    "fingerprint": "f" * 16,
                    "inputs": {},
                    "result": {"ok": i % 2 == 0},
                    "registration": "DEMO-4T",
                    "reference": f"R{i}",
                    "pilot": "A. Pilot",
                }
                for i in range(PLAIN_ROWS + 5)
            ]
        )
    tamper_check_log(db, "UPDATE checks SET result = 'not json' WHERE id = 3")
    result = runner.invoke(app, ["log", "list"])
    assert result.exit_code == 0, result.output
    lines = result.stdout.splitlines()
    rows = [line for line in lines if "DEMO-4T" in line]
    assert len(rows) == PLAIN_ROWS + 5 and "│" not in result.stdout
    assert len({line.index("DEMO-4T") for line in rows}) == 1  # aligned
    assert sum("OUT OF LIMITS" in line for line in rows) == (PLAIN_ROWS + 5) // 2
    from loadcheck.caution import PILOT_CAUTION

    assert " ".join(result.stdout.split()).endswith("CAUTION: " + " ".join(PILOT_CAUTION.split()))
