"""The record of checks: an embedded SQLite log that is only ever appended to.

Each record holds the time, the registration, reference and pilot, the inputs (the
loading as given), the full result, the aircraft data's fingerprint, and the canonical
aircraft data itself (stored once per fingerprint), so that a past check can be
reproduced after the aircraft file has changed (:func:`verify`).

Writes are transactions (one per record, or one per chunk of a batch, so an interrupted
batch leaves every record written before it whole); the database runs in WAL mode with ``synchronous=NORMAL``
(a committed record survives a crash of the program; the last commits before a power
failure may be lost); a trigger refuses any UPDATE or DELETE, so a record is never
rewritten. Several processes may write at once: SQLite serialises them (each waits up to
30 s for the lock).
"""

from __future__ import annotations

import csv
import datetime as dt
import io
import json
import math
import os
import sqlite3
import time
from collections.abc import Callable, Iterable, Iterator
from dataclasses import dataclass
from pathlib import Path
from typing import Any

from .errors import FileFormatError, InputError, Problem

__all__ = ["Record", "RecordLog", "default_path", "export_text", "results_match"]

_SCHEMA = """
CREATE TABLE IF NOT EXISTS aircraft_data (
    fingerprint TEXT PRIMARY KEY,
    data TEXT NOT NULL
);
CREATE TABLE IF NOT EXISTS checks (
    id INTEGER PRIMARY KEY AUTOINCREMENT,
    checked_at TEXT NOT NULL,
    registration TEXT,
    reference TEXT,
    pilot TEXT,
    source TEXT,
    category TEXT,
    ok INTEGER NOT NULL,
    fingerprint TEXT NOT NULL REFERENCES aircraft_data(fingerprint),
    inputs TEXT NOT NULL,
    result TEXT NOT NULL,
    version TEXT NOT NULL
);
CREATE INDEX IF NOT EXISTS checks_by_registration ON checks(registration, checked_at);
CREATE INDEX IF NOT EXISTS checks_by_time ON checks(checked_at);
CREATE TRIGGER IF NOT EXISTS checks_never_rewritten BEFORE UPDATE ON checks
BEGIN SELECT RAISE(ABORT, 'a record of a check is never rewritten'); END;
CREATE TRIGGER IF NOT EXISTS checks_never_deleted BEFORE DELETE ON checks
BEGIN SELECT RAISE(ABORT, 'a record of a check is never deleted'); END;
CREATE TRIGGER IF NOT EXISTS aircraft_data_never_rewritten BEFORE UPDATE ON aircraft_data
BEGIN SELECT RAISE(ABORT, 'recorded aircraft data is never rewritten'); END;
CREATE TRIGGER IF NOT EXISTS aircraft_data_never_deleted BEFORE DELETE ON aircraft_data
BEGIN SELECT RAISE(ABORT, 'recorded aircraft data is never deleted'); END;
"""


def default_path() -> Path:
    """Where records go by default: $LOADCHECK_RECORDS, else the user data folder."""
    explicit = os.environ.get("LOADCHECK_RECORDS")
    if explicit:
        return Path(explicit)
    from platformdirs import user_data_path

    return user_data_path("loadcheck", appauthor=False) / "records.sqlite3"


@dataclass(frozen=True)
class Record:
    """One recorded check."""

    id: int
    checked_at: str
    registration: str | None
    reference: str | None
    pilot: str | None
    source: str | None
    category: str | None
    ok: bool
    fingerprint: str
    inputs: dict[str, Any]
    result: dict[str, Any]
    version: str

    def summary(self) -> dict[str, Any]:
        """The record without its inputs and result, for listings."""
        return {k: getattr(self, k) for k in ("id", "checked_at", "registration", "reference", "pilot", "source",
                                              "category", "ok", "fingerprint", "version")}


class RecordLog:
    """An append-only log of checks in one SQLite file.

    Parameters
    ----------
    path : the database file (created with its folder if missing)
    """

    def __init__(self, path: str | Path):
        self.path = Path(path)
        try:
            self.path.parent.mkdir(parents=True, exist_ok=True)
            self._db = sqlite3.connect(self.path, timeout=30.0, isolation_level=None)
            self._db.execute("PRAGMA busy_timeout=30000")
            self._retry(lambda: self._db.execute("PRAGMA journal_mode=WAL"))
            self._db.execute("PRAGMA synchronous=NORMAL")
            self._retry(self._create)
        except sqlite3.DatabaseError as error:
            raise FileFormatError(f"cannot use the record database: {error}", file=self.path) from None
        except OSError as error:
            raise FileFormatError(f"cannot open the record database: {error.strerror or error}", file=self.path) from None
        self._known: set[str] = set()

    def _create(self) -> None:
        """Create the tables in one write transaction (taken up front, so writers queue)."""
        self._db.execute("BEGIN IMMEDIATE")
        try:
            for statement in _SCHEMA.split(";\n"):
                if statement.strip():
                    self._db.execute(statement)
            self._db.execute("COMMIT")
        except sqlite3.Error:
            self._db.execute("ROLLBACK")
            raise

    @staticmethod
    def _retry(action: Callable[[], object], attempts: int = 50) -> None:
        """Run a statement again while another process holds the database (it may refuse at once)."""
        for attempt in range(attempts):
            try:
                action()
                return
            except sqlite3.OperationalError as error:
                if ("locked" not in str(error) and "busy" not in str(error)) or attempt == attempts - 1:
                    raise
                time.sleep(0.05 * (1 + attempt % 5))

    def close(self) -> None:
        """Close the database."""
        self._db.close()

    def __enter__(self) -> RecordLog:
        return self

    def __exit__(self, *exc: object) -> None:
        self.close()

    def add(self, **record: Any) -> int:
        """Append one record (one transaction); return its id. See :meth:`add_many`."""
        return self.add_many([record])[0]

    def add_many(self, records: list[dict[str, Any]]) -> list[int]:
        """Append records in one transaction; return their ids.

        Each record has ``aircraft_data`` (or a function giving it: called only the first
        time a fingerprint is recorded), ``fingerprint``, ``inputs``, ``result`` and
        optionally ``registration``, ``reference``, ``pilot``, ``source``, ``version``.
        Either every record is written or none is.
        """
        now = dt.datetime.now(dt.UTC).isoformat(timespec="microseconds")
        ids = []
        try:
            self._retry(lambda: self._db.execute("BEGIN IMMEDIATE"))
            for record in records:
                fingerprint = record["fingerprint"]
                if fingerprint not in self._known:
                    data = record["aircraft_data"]
                    data = data() if callable(data) else data
                    self._db.execute("INSERT OR IGNORE INTO aircraft_data (fingerprint, data) VALUES (?, ?)",
                                     (fingerprint, json.dumps(data, sort_keys=True, separators=(",", ":"))))
                result = record["result"]
                cursor = self._db.execute(
                    "INSERT INTO checks (checked_at, registration, reference, pilot, source, category, ok, fingerprint, "
                    "inputs, result, version) VALUES (?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?)",
                    (now, record.get("registration"), record.get("reference"), record.get("pilot"), record.get("source"),
                     result.get("category"), int(bool(result.get("ok"))), fingerprint,
                     json.dumps(record["inputs"], separators=(",", ":"), default=str),
                     json.dumps(result, separators=(",", ":")), record.get("version", "")),
                )
                ids.append(int(cursor.lastrowid or 0))
            self._db.execute("COMMIT")
        except (sqlite3.Error, TypeError, ValueError) as error:
            if self._db.in_transaction:
                self._db.execute("ROLLBACK")
            raise FileFormatError(f"could not record the checks (nothing of this batch was recorded): {error}",
                                  file=self.path) from None
        self._known.update(r["fingerprint"] for r in records)
        return ids

    def _row(self, row: tuple[Any, ...]) -> Record:
        return Record(
            id=row[0], checked_at=row[1], registration=row[2], reference=row[3], pilot=row[4], source=row[5],
            category=row[6], ok=bool(row[7]), fingerprint=row[8], inputs=json.loads(row[9]), result=json.loads(row[10]),
            version=row[11],
        )

    def get(self, record_id: int) -> Record:
        """One record by id.

        Raises
        ------
        InputError
            When there is no such record.
        """
        row = self._db.execute(
            "SELECT id, checked_at, registration, reference, pilot, source, category, ok, fingerprint, inputs, result, "
            "version FROM checks WHERE id = ?", (record_id,)).fetchone()
        if row is None:
            raise InputError(Problem("ID", f"no record {record_id} in {self.path}"))
        return self._row(row)

    def aircraft_data(self, fingerprint: str) -> dict[str, Any]:
        """The canonical aircraft data recorded under a fingerprint."""
        row = self._db.execute("SELECT data FROM aircraft_data WHERE fingerprint = ?", (fingerprint,)).fetchone()
        if row is None:
            raise InputError(Problem("fingerprint", f"no aircraft data recorded under {fingerprint}"))
        data: dict[str, Any] = json.loads(row[0])
        return data

    def find(self, *, since: dt.date | None = None, until: dt.date | None = None,
             registration: str | None = None) -> Iterator[Record]:
        """Records in order, between two dates (inclusive, UTC) and/or for one registration."""
        clauses, args = [], []
        if since is not None:
            clauses.append("checked_at >= ?")
            args.append(since.isoformat())
        if until is not None:
            clauses.append("checked_at < ?")
            args.append((until + dt.timedelta(days=1)).isoformat())
        if registration is not None:
            clauses.append("registration = ?")
            args.append(registration)
        where = f" WHERE {' AND '.join(clauses)}" if clauses else ""
        query = ("SELECT id, checked_at, registration, reference, pilot, source, category, ok, fingerprint, inputs, "
                 f"result, version FROM checks{where} ORDER BY id")
        for row in self._db.execute(query, args):
            yield self._row(row)


_CSV_HEAD = ["id", "checked_at", "registration", "reference", "pilot", "source", "category", "ok", "fingerprint",
             "takeoff_weight", "takeoff_arm", "landing_weight", "landing_arm", "first_finding"]


def _csv_row(record: Record) -> list[Any]:
    """One record's key figures: takeoff and landing weight and arm, the first limit finding."""
    conditions = {c["condition"]: c for c in record.result.get("conditions", [])}
    takeoff, landing = conditions.get("takeoff", {}), conditions.get("landing", {})
    first = next((f["message"] for f in record.result.get("findings", []) if f["severity"] == "limit"), "")
    return [record.id, record.checked_at, record.registration, record.reference, record.pilot, record.source,
            record.category, record.ok, record.fingerprint, takeoff.get("weight"), takeoff.get("arm"),
            landing.get("weight"), landing.get("arm"), first]


def export_text(records: Iterable[Record], format: str) -> str:
    """Records as JSON Lines (``jsonl``: everything) or CSV (``csv``: one line of key figures each)."""
    buffer = io.StringIO()
    if format == "jsonl":
        for r in records:
            buffer.write(json.dumps({**r.summary(), "inputs": r.inputs, "result": r.result}, separators=(",", ":")) + "\n")
    elif format == "csv":
        writer = csv.writer(buffer)
        writer.writerow(_CSV_HEAD)
        writer.writerows(_csv_row(r) for r in records)
    else:
        raise ValueError(f"unknown export format {format!r} (csv or jsonl)")
    return buffer.getvalue()


def results_match(a: Any, b: Any, rel: float = 1e-9) -> bool:
    """Whether two JSON results are the same, numbers within a relative tolerance."""
    if isinstance(a, dict) and isinstance(b, dict):
        return a.keys() == b.keys() and all(results_match(a[k], b[k], rel) for k in a)
    if isinstance(a, list) and isinstance(b, list):
        return len(a) == len(b) and all(results_match(x, y, rel) for x, y in zip(a, b))
    if isinstance(a, bool) or isinstance(b, bool):
        return a == b
    if isinstance(a, (int, float)) and isinstance(b, (int, float)):
        return math.isclose(a, b, rel_tol=rel, abs_tol=1e-12)
    return bool(a == b)
