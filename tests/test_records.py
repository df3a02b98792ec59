"""The record of checks: verification of every stored field, exports with their units, and
recorded checks against the current aircraft data (docs/fleet.md, "The record of checks")."""

from __future__ import annotations

import csv
import json
import shutil
import sqlite3
from pathlib import Path

import pytest
from typer.testing import CliRunner

from loadcheck.cli import app
from loadcheck.fleet import load_fleet
from loadcheck.records import RecordLog, verify, verify_current

from .helpers import sample

runner = CliRunner()
SAMPLES = Path(sample("trainer4/aircraft.toml")).parent.parent


@pytest.fixture
def db(tmp_path, monkeypatch):
    path = tmp_path / "records.sqlite3"
    monkeypatch.setenv("LOADCHECK_RECORDS", str(path))
    return path


def _record(db: Path, loading: str, *extra: str) -> int:
    result = runner.invoke(app, ["check", str(sample(loading)), "--record", str(db), *extra])
    assert result.exit_code in (0, 1), result.output
    with RecordLog(db) as log:
        return list(log.find())[-1].id


def _tamper(db: Path, statement: str, *args: object) -> None:
    """Edit a record behind the triggers' back, as someone with the database file could."""
    connection = sqlite3.connect(db)
    connection.execute("DROP TRIGGER checks_never_rewritten")
    connection.execute(statement, args)
    connection.commit()
    connection.close()


def test_an_untouched_record_is_reproduced(db):
    record_id = _record(db, "trainer4/over_weight.toml")
    with RecordLog(db) as log:
        verification = verify(log, record_id)
    assert verification.reproduced and not verification.differences and verification.ok is False
    result = runner.invoke(app, ["records", "verify", str(record_id)])
    assert result.exit_code == 0 and "every stored field matches" in result.output


@pytest.mark.parametrize(
    "column, value, words",
    [
        ("ok", 1, "stored verdict"),  # issue 13 item 9: an out-of-limits record listed as "within limits"
        ("registration", "DEMO-6P", "stored registration"),
        ("category", "utility", "stored category"),
        ("reference", "another flight", "seal"),
        ("pilot", "someone else", "seal"),
        ("source", "elsewhere.toml", "seal"),
        ("checked_at", "2020-01-01T00:00:00+00:00", "seal"),
    ],
)
def test_verify_finds_an_edit_to_any_stored_column(db, column, value, words):
    record_id = _record(db, "trainer4/over_weight.toml")
    _tamper(db, f"UPDATE checks SET {column} = ? WHERE id = ?", value, record_id)
    result = runner.invoke(app, ["records", "verify", str(record_id)])
    assert result.exit_code == 1, result.output
    assert "NOT reproduced" in result.output and words in result.output


def test_verify_finds_an_edited_result(db):
    record_id = _record(db, "trainer4/over_weight.toml")
    with RecordLog(db) as log:
        stored = log.get(record_id).result
    stored["ok"] = True
    stored["findings"] = []
    _tamper(db, "UPDATE checks SET result = ?, ok = 1 WHERE id = ?", json.dumps(stored), record_id)
    listing = runner.invoke(app, ["records", "list"])
    assert "within limits" in listing.output  # the listing shows the stored column ...
    result = runner.invoke(app, ["records", "verify", str(record_id), "--json"])
    assert result.exit_code == 1  # ... and verify says it is not what was recorded
    assert any("stored result differs" in d for d in json.loads(result.stdout)["differences"])


def test_a_record_from_before_seals_is_verified_and_says_what_it_cannot_check(tmp_path):
    path = tmp_path / "old.sqlite3"
    with RecordLog(path):
        pass
    connection = sqlite3.connect(path)  # the table as an earlier version made it: no seal column
    connection.executescript("DROP TRIGGER checks_never_deleted; DROP TABLE checks; CREATE TABLE checks ("
                             "id INTEGER PRIMARY KEY AUTOINCREMENT, checked_at TEXT NOT NULL, registration TEXT, "
                             "reference TEXT, pilot TEXT, source TEXT, category TEXT, ok INTEGER NOT NULL, "
                             "fingerprint TEXT NOT NULL, inputs TEXT NOT NULL, result TEXT NOT NULL, version TEXT NOT NULL);")
    connection.close()
    record_id = _record(path, "trainer4/within.toml")
    _tamper(path, "UPDATE checks SET seal = NULL WHERE id = ?", record_id)
    result = runner.invoke(app, ["records", "verify", str(record_id), "--db", str(path)])
    assert result.exit_code == 0 and "has no seal" in result.output


def test_csv_export_names_the_units_of_each_row_in_a_mixed_fleet(db):
    # trainer4 is in lb and in, tandem2 in kg and mm: each row's numbers are in its own aircraft's units
    runner.invoke(app, ["fleet", "check", str(SAMPLES), str(SAMPLES / "fleet_day.csv")])
    exported = runner.invoke(app, ["records", "export", "--format", "csv"])
    rows = list(csv.DictReader(exported.stdout.splitlines()))
    units = {r["registration"]: (r["mass_unit"], r["arm_unit"]) for r in rows}
    assert units["DEMO-4T"] == ("lb", "in") and units["DEMO-2T"] == ("kg", "mm")
    with RecordLog(db) as log:
        by_id = {r.id: r for r in log.find()}
    for row in rows:
        result = by_id[int(row["id"])].result
        assert (row["mass_unit"], row["arm_unit"]) == (result["units"]["mass"], result["units"]["arm"])
        takeoff = next(c for c in result["conditions"] if c["condition"] == "takeoff")
        assert float(row["takeoff_weight"]) == pytest.approx(takeoff["weight"])


def _fleet_copy(tmp_path: Path) -> Path:
    folder = tmp_path / "fleet"
    for name in ("trainer4", "tandem2"):
        shutil.copytree(SAMPLES / name, folder / name)
    return folder


def test_current_mode_unchanged_data_exits_0(db, tmp_path):
    fleet = _fleet_copy(tmp_path)
    _record(db, "trainer4/within.toml")
    result = runner.invoke(app, ["records", "verify", "--current", str(fleet)], env={"COLUMNS": "250"})  # one line a record
    assert result.exit_code == 0, result.output
    assert "0 made with aircraft data that has changed since" in result.output


def test_current_mode_finds_a_check_the_new_data_puts_out_of_limits(db, tmp_path):
    fleet = _fleet_copy(tmp_path)
    within = _record(db, "trainer4/within.toml")
    aircraft = fleet / "trainer4" / "aircraft.toml"
    # a heavier empty weight (a new weighing): the recorded loading now exceeds the maximum takeoff weight
    aircraft.write_text(aircraft.read_text().replace("weight = 1718.0", "weight = 2200.0"))
    with RecordLog(db) as log:
        outcome = verify_current(log.find(), load_fleet(fleet))
    (check,) = outcome.checks
    assert check.record_id == within and check.data_changed and check.recorded_ok and check.current_ok is False
    assert outcome.status == 1 and outcome.now_out_of_limits == 1
    result = runner.invoke(app, ["records", "verify", "--current", str(fleet)], env={"COLUMNS": "250"})  # one line a record
    assert result.exit_code == 1 and "changed since" in result.output and "(was within)" in result.output
    assert "LIMIT" in result.output
    # the plain verification still reproduces the record with the data it was made with
    assert runner.invoke(app, ["records", "verify", str(within)]).exit_code == 0


def test_current_mode_a_record_whose_aircraft_is_gone_exits_2(db, tmp_path):
    fleet = _fleet_copy(tmp_path)
    _record(db, "twin6/within.toml")
    result = runner.invoke(app, ["records", "verify", "--current", str(fleet), "--json"])
    assert result.exit_code == 2
    (check,) = json.loads(result.stdout)["checks"]
    assert "unknown registration 'DEMO-6P'" in check["problem"] and "current_ok" not in check


def test_verify_needs_an_id_without_current(db):
    _record(db, "trainer4/within.toml")
    result = runner.invoke(app, ["records", "verify"])
    assert result.exit_code == 2 and "record id" in result.output and "Traceback" not in result.output


def test_a_long_listing_reads_only_what_it_shows(db):
    # records list of 10,000 records took 5 s: it read and parsed every stored result and
    # laid out a rich table; it now reads the columns it shows and prints plain aligned
    # text past the threshold. A record whose stored result cannot be parsed still lists.
    from loadcheck.render.listing import PLAIN_ROWS

    with RecordLog(db) as log:
        log.add_many([{"aircraft_data": {"x": 1}, "fingerprint": "f" * 16, "inputs": {}, "result": {"ok": i % 2 == 0},
                       "registration": "DEMO-4T", "reference": f"R{i}", "pilot": "A. Pilot"} for i in range(PLAIN_ROWS + 5)])
    _tamper(db, "UPDATE checks SET result = 'not json' WHERE id = 3")
    result = runner.invoke(app, ["records", "list"])
    assert result.exit_code == 0, result.output
    lines = result.stdout.splitlines()
    rows = [line for line in lines if "DEMO-4T" in line]
    assert len(rows) == PLAIN_ROWS + 5 and "│" not in result.stdout
    assert len({line.index("DEMO-4T") for line in rows}) == 1  # aligned
    assert sum("OUT OF LIMITS" in line for line in rows) == (PLAIN_ROWS + 5) // 2
    from loadcheck.caution import PILOT_CAUTION

    assert " ".join(result.stdout.split()).endswith("CAUTION: " + " ".join(PILOT_CAUTION.split()))
