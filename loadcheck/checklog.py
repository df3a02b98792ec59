"""The check log: an embedded SQLite log of checks that is only ever appended to.

(The aircraft's own weight-and-balance record, its empty weight and CG, is
:mod:`loadcheck.empty_record`'s; this is the log of the checks made.)

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

Each record also carries a seal: the SHA-256 of every stored field a person reads (time,
registration, reference, pilot, source, category, verdict, fingerprint, inputs, result,
version). :func:`verify` recomputes the check and the seal and compares the stored verdict,
category and registration with the recomputed ones, so an edit made behind the triggers'
back (with the triggers dropped) is found. The seal is not a signature: someone who can
rewrite the database can recompute it; it finds edits, it does not prevent them.
"""

from __future__ import annotations

import csv
import datetime as dt
import gc
import hashlib
import io
import json
import math
import sqlite3
import time
from collections.abc import Callable, Iterable, Iterator
from contextlib import contextmanager
from dataclasses import dataclass
from pathlib import Path
from typing import TYPE_CHECKING, Any, NamedTuple

from .caution import PILOT_CAUTION
from .errors import FileFormatError, InputError, LoadcheckError, Problem
from .registration import registration_key, required_key
from .results import Result

# where the log is and whether a command records (loadcheck.userdata, light enough for a start-up), under
# the check log's own names
from .userdata import default_log_path as default_path
from .userdata import log_path

if TYPE_CHECKING:
    from .aircraft import Aircraft
    from .files import CheckInputs
    from .fleet import Fleet
    from .results import CheckResult, TripResult

__all__ = [
    "CurrentCheck",
    "CurrentVerification",
    "VERDICTS",
    "Listed",
    "Stored",
    "LoggedCheck",
    "CheckLog",
    "Verification",
    "default_path",
    "export_text",
    "filters_ok",
    "log_check",
    "log_path",
    "first_difference",
    "results_match",
    "stored",
    "verify",
    "verify_current",
]

_COLUMNS = (
    "id, checked_at, registration, reference, pilot, source, category, ok, fingerprint, inputs, result, version, "
    "seal, legs, flight_date"
)

_LISTED = "id, checked_at, registration, reference, pilot, ok, fingerprint, legs"
"""The columns a listing shows, in the order of the covering index ``checks_listing``: a listing
reads that index alone (a few dozen bytes a record), never the table's rows with their stored
results (kilobytes each)."""

Listed = tuple[int, str, str | None, str | None, str | None, int, str, int]
"""One record as a listing shows it (:meth:`CheckLog.listing`)."""

VERDICTS = {"within": True, "out": False}
"""The verdicts a listing is filtered by, and the stored ``ok`` of each: ``within`` limits, ``out`` of limits."""


def verdict_ok(verdict: str) -> bool:
    """The stored ``ok`` of a verdict a listing is filtered by (:data:`VERDICTS`), the word as written.

    Raises
    ------
    InputError
        Any other word (``WITHIN``, ``bogus``): refused naming the verdicts, never read as no filter.

    Examples
    --------
    >>> verdict_ok("out")
    False
    """
    if verdict not in VERDICTS:
        raise InputError(Problem("verdict", f"unknown verdict {verdict!r}", expected=" or ".join(VERDICTS)))
    return VERDICTS[verdict]


def filters_ok(registration: str | None, verdict: str | None) -> None:
    """Refuse the filters of a listing that the check log does not take; ``None`` is no filter.

    The one rule of :meth:`CheckLog.find` and :meth:`CheckLog.listing` (which apply it before any
    record is read), for a front end that has no log to look in yet: a registration with no letter
    or digit (``""``, ``-``: :func:`~loadcheck.registration.required_key`) and a verdict other than
    ``within`` or ``out`` (:func:`verdict_ok`, ``""`` included) are refused, never read as no filter.

    Parameters
    ----------
    registration : the registration to list the records of, as typed (``None``: every aircraft)
    verdict : ``within`` or ``out`` (``None``: any verdict)

    Raises
    ------
    InputError
        Naming the field (``registration``, ``verdict``) in the words of the command line's refusal.

    Examples
    --------
    >>> filters_ok("demo4t", "out")
    >>> filters_ok(None, None)
    >>> filters_ok("", None)
    Traceback (most recent call last):
    ...
    loadcheck.errors.InputError: registration: '' is not a registration: it has no letter or digit
    >>> filters_ok(None, "")
    Traceback (most recent call last):
    ...
    loadcheck.errors.InputError: verdict: unknown verdict ''; expected within or out
    """
    if verdict is not None:
        verdict_ok(verdict)
    if registration is not None:
        required_key(registration)


def _seal(
    checked_at: str,
    registration: str | None,
    reference: str | None,
    pilot: str | None,
    source: str | None,
    category: str | None,
    ok: int,
    fingerprint: str,
    inputs: str,
    result: str,
    version: str,
    flight_date: str | None = None,
) -> str:
    """SHA-256 over a record's stored fields, as stored (the JSON texts byte for byte); the flight's
    date is sealed where the record has one (a record made before dates were recorded has none, and
    its seal is over the other fields alone, as it was made)."""
    fields = [
        checked_at,
        registration,
        reference,
        pilot,
        source,
        category,
        int(ok),
        fingerprint,
        inputs,
        result,
        version,
    ]
    if flight_date is not None:
        fields.append(flight_date)
    return hashlib.sha256(_seal_text(fields)).hexdigest()


def _seal_text(fields: list[Any]) -> bytes:
    """The text a seal is taken over: ``json.dumps(fields, separators=(",", ":"))`` as UTF-8.

    Where every text is ASCII without DEL, orjson writes those same bytes (it differs only in
    writing other characters as they are, where the json module escapes them), about five times
    quicker on a record's fields; otherwise the json module writes them.
    """
    import orjson

    try:
        text = orjson.dumps(fields)
    except orjson.JSONEncodeError:  # a lone surrogate (a command-line byte that is not UTF-8): json escapes it
        text = b"\x80"
    # orjson writes a character past ASCII, and DEL, as it is (the json module escapes them), so
    # its text is ASCII without DEL exactly where every text of the fields is: looked at once, in C
    if text.isascii() and b"\x7f" not in text:
        return text
    return json.dumps(fields, separators=(",", ":")).encode("utf-8")


def _stored_json(data: Any, default: Any = None) -> str:
    """A record's inputs or result as the JSON text stored: compact, written by orjson (about ten
    times quicker than the json module on a check's result; the same numbers, read back by
    ``json.loads``). The seal is over the text as stored, so how it was written does not matter
    to verification; NaN and infinities never reach a record (refused at the boundary)."""
    import orjson

    return orjson.dumps(data, default=default).decode()


class Stored(NamedTuple):
    """A check as the log stores it: its result's JSON text and what is read off the result beside it.

    Made by :func:`stored`, in the process that checked the flight (a fleet check's worker), so
    that the text written to the log and the line printed are the one serialization."""

    result: str  # the result's JSON text (:func:`_stored_json`)
    ok: bool  # the result's verdict
    category: str | None  # the result's envelope category
    inputs: str | None = None  # the inputs' JSON text, where they are to be recorded
    legs: int = 1  # the number of legs of the inputs (1 for a single loading)


def stored(result: dict[str, Any], inputs: dict[str, Any] | None = None) -> Stored:
    """``result`` (a check's JSON form) and ``inputs`` (:func:`~loadcheck.loading.recorded_inputs`;
    None where not recorded) as the log stores them."""
    return stored_text(_stored_json(result), bool(result.get("ok")), result.get("category"), inputs)


def stored_text(result: str, ok: bool, category: str | None, inputs: dict[str, Any] | None = None) -> Stored:
    """A check as the log stores it, from its result's JSON text as :func:`_stored_json` writes it
    (:func:`loadcheck.result_json.result_texts` writes the same text) and the verdict and category
    read off that result; ``inputs`` as :func:`stored` takes them."""
    return Stored(
        result,
        ok,
        category,
        None if inputs is None else _stored_json(inputs, default=str),
        1 + len((inputs or {}).get("leg") or ()),
    )


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
    version TEXT NOT NULL,
    seal TEXT,
    legs INTEGER,
    flight_date TEXT
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


@dataclass(frozen=True)
class LoggedCheck:
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
    seal: str | None = None
    stored: tuple[Any, ...] = ()  # the row as stored, for the seal
    legs: int | None = None  # legs of the loading recorded (None: recorded before trips were, one leg)
    flight_date: str | None = None  # the flight's date as the dispatcher gave it (YYYY-MM-DD), sealed

    def summary(self) -> dict[str, Any]:
        """The record without its inputs and result, for listings."""
        return {
            k: getattr(self, k)
            for k in (
                "id",
                "checked_at",
                "registration",
                "reference",
                "pilot",
                "source",
                "flight_date",
                "category",
                "ok",
                "fingerprint",
                "version",
            )
        }


class CheckLog:
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
            raise FileFormatError(f"cannot use the check log: {error}", file=self.path) from None
        except OSError as error:
            raise FileFormatError(f"cannot open the check log: {error.strerror or error}", file=self.path) from None
        self._known: set[str] = set()

    def _create(self) -> None:
        """Create the tables in one write transaction (taken up front, so writers queue)."""
        self._db.execute("BEGIN IMMEDIATE")
        try:
            for statement in _SCHEMA.split(";\n"):
                if statement.strip():
                    self._db.execute(statement)
            columns = {row[1] for row in self._db.execute("PRAGMA table_info(checks)")}
            if "seal" not in columns:  # a database made before records were sealed
                self._db.execute("ALTER TABLE checks ADD COLUMN seal TEXT")
            if "legs" not in columns:  # made before trips were recorded: every record is one leg (NULL)
                self._db.execute("ALTER TABLE checks ADD COLUMN legs INTEGER")
            if "flight_date" not in columns:  # made before flight dates were recorded: none has one (NULL)
                self._db.execute("ALTER TABLE checks ADD COLUMN flight_date TEXT")
            self._db.execute(f"CREATE INDEX IF NOT EXISTS checks_listing ON checks({_LISTED})")
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

    def __enter__(self) -> CheckLog:
        return self

    def __exit__(self, *exc: object) -> None:
        self.close()

    def add(self, **record: Any) -> int:
        """Append one record (one transaction); return its id. See :meth:`add_many`."""
        return self.add_many([record])[0]

    def add_many(self, records: list[dict[str, Any]]) -> list[int]:
        """Append records in one transaction; return their ids.

        Each record has ``aircraft_data`` (or a function giving it: called only the first
        time a fingerprint is recorded), ``fingerprint``, ``inputs`` and ``result`` (or
        ``stored``, the two as :func:`stored` gives them, inputs included) and
        optionally ``registration``, ``reference``, ``pilot``, ``source``, ``version`` and
        ``flight_date`` (the flight's date, YYYY-MM-DD: a fleet row's ``date``).
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
                    self._db.execute(
                        "INSERT OR IGNORE INTO aircraft_data (fingerprint, data) VALUES (?, ?)",
                        (fingerprint, json.dumps(data, sort_keys=True, separators=(",", ":"))),
                    )
                kept = record.get("stored") or stored(record["result"], record["inputs"])
                if kept.inputs is None:
                    raise ValueError("a record needs the inputs of its check")
                values = (
                    now,
                    record.get("registration"),
                    record.get("reference"),
                    record.get("pilot"),
                    record.get("source"),
                    kept.category,
                    int(kept.ok),
                    fingerprint,
                    kept.inputs,
                    kept.result,
                    record.get("version", ""),
                )
                flight_date = record.get("flight_date")
                cursor = self._db.execute(
                    "INSERT INTO checks (checked_at, registration, reference, pilot, source, category, ok, "
                    "fingerprint, inputs, result, version, seal, legs, flight_date) "
                    "VALUES (?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?)",
                    (*values, _seal(*values, flight_date), kept.legs, flight_date),
                )
                ids.append(int(cursor.lastrowid or 0))
            self._db.execute("COMMIT")
        except (sqlite3.Error, TypeError, ValueError) as error:
            if self._db.in_transaction:
                self._db.execute("ROLLBACK")
            raise FileFormatError(
                f"could not record the checks (nothing of this batch was recorded): {error}", file=self.path
            ) from None
        self._known.update(r["fingerprint"] for r in records)
        return ids

    def _row(self, row: tuple[Any, ...]) -> LoggedCheck:
        return LoggedCheck(
            id=row[0],
            checked_at=row[1],
            registration=row[2],
            reference=row[3],
            pilot=row[4],
            source=row[5],
            category=row[6],
            ok=bool(row[7]),
            fingerprint=row[8],
            inputs=json.loads(row[9]),
            result=json.loads(row[10]),
            version=row[11],
            seal=row[12],
            stored=(*row[1:12], row[14]),
            legs=row[13],
            flight_date=row[14],
        )

    def get(self, record_id: int) -> LoggedCheck:
        """One record by id.

        Raises
        ------
        InputError
            When there is no such record.
        """
        row = self._db.execute(f"SELECT {_COLUMNS} FROM checks WHERE id = ?", (record_id,)).fetchone()
        if row is None:
            raise InputError(Problem("ID", f"no record {record_id} in {self.path}"))
        return self._row(row)

    def missing_ids(self) -> list[tuple[int, int]]:
        """The record ids the log has given out and no longer holds, as stretches (first, last).

        Ids are given by SQLite's AUTOINCREMENT, which never gives one twice and leaves no gap (an
        insert rolled back takes its id back with it), and a record is never deleted (a trigger
        refuses it): a missing id is a record removed from the file by other means."""
        ids = [row[0] for row in self._db.execute("SELECT id FROM checks ORDER BY id")]
        top = self._db.execute("SELECT seq FROM sqlite_sequence WHERE name = 'checks'").fetchone()
        last = max(int(top[0]) if top and top[0] is not None else 0, ids[-1] if ids else 0)
        gaps, expected = [], 1
        for present in [*ids, last + 1]:
            if present > expected:
                gaps.append((expected, present - 1))
            expected = present + 1
        return gaps

    def sealed_beside(self, record_id: int, checked_at: str) -> bool:
        """True where a record before this one, or one of its own batch (the same time), carries a seal:
        the version that wrote this record sealed every record, so it had a seal."""
        row = self._db.execute(
            "SELECT 1 FROM checks WHERE seal IS NOT NULL AND (id < ? OR checked_at = ?) LIMIT 1",
            (record_id, checked_at),
        ).fetchone()
        return row is not None

    def aircraft_data(self, fingerprint: str) -> dict[str, Any]:
        """The canonical aircraft data recorded under a fingerprint."""
        row = self._db.execute("SELECT data FROM aircraft_data WHERE fingerprint = ?", (fingerprint,)).fetchone()
        if row is None:
            raise InputError(Problem("fingerprint", f"no aircraft data recorded under {fingerprint}"))
        data: dict[str, Any] = json.loads(row[0])
        return data

    def find(
        self,
        *,
        since: dt.date | None = None,
        until: dt.date | None = None,
        registration: str | None = None,
        verdict: str | None = None,
    ) -> Iterator[LoggedCheck]:
        """Records in order, between two dates (inclusive, UTC), for one registration and/or of one verdict.

        ``registration`` is compared as the fleet compares registrations
        (:func:`~loadcheck.aircraft.registration_key`: ``demo4t`` finds the records of ``DEMO-4T``); one
        with no letter or digit is refused. ``verdict`` is ``within`` or ``out`` (:func:`verdict_ok`;
        any other word refused). The filters are checked when this is called, before any record is read.

        Raises
        ------
        InputError
            A registration with no letter or digit, or an unknown verdict.
        """
        cursor = self._select(_COLUMNS, since, until, registration, verdict)
        return (self._row(row) for row in cursor)

    def listing(
        self,
        *,
        since: dt.date | None = None,
        until: dt.date | None = None,
        registration: str | None = None,
        verdict: str | None = None,
    ) -> list[Listed]:
        """What a listing shows of each record, in order, without reading its result:
        (id, checked_at, registration, reference, pilot, ok (1 or 0), fingerprint, legs); the filters
        (and refusals) of :meth:`find`.

        ``legs`` is the number of legs of the loading recorded: 1 for a single loading (and for
        a record made before trips were recorded), the legs of a trip. Read from the covering
        index ``checks_listing`` alone, all at once: the rows are tuples of numbers and strings,
        so the cycle collector, whose passes over 100,000 of them free nothing (about a tenth of
        the listing's time), is paused while they are read.
        """
        with _no_cycle_collection():
            return self._select(
                _LISTED.replace("legs", "coalesce(legs, 1)"), since, until, registration, verdict
            ).fetchall()

    def _spellings(self, registration: str) -> list[str]:
        """Every registration text stored whose :func:`~loadcheck.aircraft.registration_key` is the
        given one's (``DEMO-4T`` and ``demo4t`` alike, where records hold both).

        The stored texts are few (one or two an aircraft): they are read by skipping along the index
        ``checks_by_registration`` (a seek per distinct text, not a pass over every record), keyed here
        by the library's one rule, and the records then selected by ``registration IN (...)`` on that index.
        """
        key = required_key(registration)  # as Fleet.aircraft finds an aircraft
        stored = self._db.execute(
            "WITH RECURSIVE texts(text) AS ("
            " SELECT min(registration) FROM checks"
            " UNION ALL SELECT (SELECT min(registration) FROM checks WHERE registration > text)"
            " FROM texts WHERE text IS NOT NULL)"
            " SELECT text FROM texts WHERE text IS NOT NULL"
        )
        return [text for (text,) in stored if registration_key(text) == key]

    def _select(
        self,
        columns: str,
        since: dt.date | None,
        until: dt.date | None,
        registration: str | None,
        verdict: str | None = None,
    ) -> sqlite3.Cursor:
        filters_ok(registration, verdict)  # both refused before anything is read
        clauses: list[str] = []
        args: list[Any] = []
        if since is not None and until is not None and until < since:  # no day is in it: said, not listed empty
            raise InputError(
                Problem(
                    "until",
                    f"{until.isoformat()} is before the first day, {since.isoformat()}",
                    expected="a day on or after it",
                )
            )
        if verdict is not None:
            clauses.append("ok = ?")
            args.append(int(verdict_ok(verdict)))
        if since is not None:
            clauses.append("checked_at >= ?")
            args.append(since.isoformat())
        if until is not None:
            clauses.append("checked_at < ?")
            args.append((until + dt.timedelta(days=1)).isoformat())
        if registration is not None:
            spellings = self._spellings(registration)
            clauses.append(f"registration IN ({', '.join('?' * len(spellings))})" if spellings else "0")
            args.extend(spellings)
        where = f" WHERE {' AND '.join(clauses)}" if clauses else ""
        return self._db.execute(f"SELECT {columns} FROM checks{where} ORDER BY id", args)


@contextmanager
def _no_cycle_collection() -> Iterator[None]:
    """No pass of the cycle collector inside: for reading many rows that hold no cycle.

    What was made inside goes to the collector's oldest generation unscanned (``gc.freeze``
    then ``gc.unfreeze``), as if it had survived two collections: otherwise the first
    allocation after the block would start a pass over all of it (about 40 ms at 100,000 rows).
    """
    enabled = gc.isenabled()
    gc.disable()
    try:
        yield
    finally:
        gc.freeze()
        gc.unfreeze()
        if enabled:
            gc.enable()


def log_check(
    log: CheckLog,
    inputs: CheckInputs,
    result: CheckResult | TripResult,
    *,
    source: str,
    version: str,
    pilot: str | None = None,
) -> int:
    """Record one check: the loading as given (file and options or form merged) and the full result.

    The one way a check is recorded, for every front end (``check --log``, ``fleet check``, the web desk):
    a single loading with its :class:`~loadcheck.results.CheckResult`, or a trip of several
    legs with its :class:`~loadcheck.results.TripResult` (one record: the trip's inputs, every
    leg in them, and the trip's result; its verdict is the trip's).

    Parameters
    ----------
    log : the check log to append to
    inputs : the :class:`~loadcheck.files.CheckInputs` that were checked
    result : the :class:`~loadcheck.results.CheckResult` or :class:`~loadcheck.results.TripResult` of ``inputs``
    source : where the loading came from (a file name, "command line", "web desk")
    version : the loadcheck version that made the check
    pilot : who recorded it, where the loading does not name its pilot

    Returns
    -------
    int
        The new record's id.
    """
    from .loading import recorded_inputs

    given = inputs.given
    if given is None:
        raise InputError(Problem("inputs", "holds no loading as given, so there is nothing to record"))
    data = result.to_dict()
    if bool(given.leg) != ("legs" in data):
        raise InputError(
            Problem(
                "result",
                "the result is not the check of these inputs: a trip of several legs is "
                "recorded with its trip check, a single loading with its single check",
            )
        )
    return log.add(
        aircraft_data=inputs.aircraft.model_dump(mode="json"),
        fingerprint=inputs.aircraft.fingerprint,
        inputs=recorded_inputs(given),
        result=data,
        registration=inputs.aircraft.registration,
        reference=given.reference,  # as given: a label is not taken for a reference (it is in the inputs)
        pilot=given.pilot or pilot,
        source=source,
        version=version,
    )


_CSV_HEAD = [
    "id",
    "checked_at",
    "registration",
    "reference",
    "pilot",
    "source",
    "category",
    "ok",
    "fingerprint",
    "mass_unit",
    "arm_unit",
    "takeoff_weight",
    "takeoff_arm",
    "landing_weight",
    "landing_arm",
    "first_finding",
    "legs",
    "leg",
    "leg_ok",
    "flight_date",
]


def _csv_lines(record: LoggedCheck) -> list[list[Any]]:
    """One record's key figures: takeoff and landing weight and arm in the units of the record's
    aircraft (named in its own columns: a fleet may mix lb/in and kg/m), the first limit finding.

    A single loading is one line (``legs`` 1, ``leg`` and ``leg_ok`` empty). A trip is one
    line per leg: the record's fields (``ok`` the trip's verdict) with that leg's figures and
    first limit finding, its number and its own verdict."""
    units = record.result.get("units", {})
    head = [
        record.id,
        record.checked_at,
        record.registration,
        record.reference,
        record.pilot,
        record.source,
        record.category,
        record.ok,
        record.fingerprint,
        units.get("mass"),
        units.get("arm"),
    ]

    def figures(check: dict[str, Any]) -> list[Any]:
        conditions = {c["condition"]: c for c in check.get("conditions", [])}
        takeoff, landing = conditions.get("takeoff", {}), conditions.get("landing", {})
        first = next((f["message"] for f in check.get("findings", []) if f["severity"] == "limit"), "")
        return [takeoff.get("weight"), takeoff.get("arm"), landing.get("weight"), landing.get("arm"), first]

    legs = record.result.get("legs")
    if legs is None:
        return [head + figures(record.result) + [1, "", "", record.flight_date or ""]]
    return [head + figures(leg) + [len(legs), leg["leg"], bool(leg["ok"]), record.flight_date or ""] for leg in legs]


def export_text(records: Iterable[LoggedCheck], format: str) -> str:
    """Records as JSON Lines (``jsonl``: everything) or CSV (``csv``: one line of key figures each)."""
    buffer = io.StringIO()
    if format == "jsonl":
        for r in records:
            buffer.write(
                json.dumps({**r.summary(), "inputs": r.inputs, "result": r.result}, separators=(",", ":")) + "\n"
            )
    elif format == "csv":
        writer = csv.writer(buffer)
        writer.writerow(_CSV_HEAD)
        for r in records:
            writer.writerows(_csv_lines(r))
    else:
        raise InputError(Problem("format", "unknown export format", value=format, expected="csv or jsonl"))
    return buffer.getvalue()


def results_match(a: object, b: object, rel: float = 1e-9, *, newer_fields: bool = False) -> bool:
    """Whether two JSON results are the same, numbers within a relative tolerance.

    With ``newer_fields``, ``a`` is a stored result and ``b`` the same check recomputed: ``b``
    may hold fields ``a`` has none of (fields results gained after the record was written, such
    as a trip leg's ``stop``); every field ``a`` holds is compared.

    Examples
    --------
    >>> results_match({"ok": True}, {"ok": True, "stop": {}}), results_match({"ok": True}, {"ok": True, "stop": {}},
    ...                                                                       newer_fields=True)
    (False, True)
    >>> results_match({"ok": True, "x": 1.0}, {"ok": True}, newer_fields=True)  # a stored field is never skipped
    False
    """
    return first_difference(a, b, rel, newer_fields=newer_fields) is None


def first_difference(
    a: object, b: object, rel: float = 1e-9, path: str = "", *, newer_fields: bool = False
) -> str | None:
    """Where two JSON results first differ, and how (``findings[2].code: "assumption", now "no_pilot"``);
    None where they are the same, numbers within a relative tolerance (:func:`results_match`, whose
    ``newer_fields`` this takes too).

    Examples
    --------
    >>> first_difference({"ok": True, "w": [1.0, 2.0]}, {"ok": True, "w": [1.0, 2.5]})
    'w[1]: 2.0, now 2.5'
    >>> first_difference({"a": 1}, {"a": 1.0 + 1e-12}) is None
    True
    """
    where = path or "the result"
    if isinstance(a, dict) and isinstance(b, dict):
        gone, new = sorted(set(a) - set(b)), sorted(set(b) - set(a))
        if gone or (new and not newer_fields):
            return f"{where}: " + "; ".join(
                [
                    *(f"{k!r} recorded, not recomputed" for k in gone),
                    *(f"{k!r} recomputed, not recorded" for k in ([] if newer_fields else new)),
                ]
            )
        for k in a:
            found = first_difference(a[k], b[k], rel, f"{path}.{k}" if path else str(k), newer_fields=newer_fields)
            if found is not None:
                return found
        return None
    if isinstance(a, list) and isinstance(b, list):
        if len(a) != len(b):
            return f"{where}: {len(a)} recorded, {len(b)} now"
        for i, (x, y) in enumerate(zip(a, b, strict=True)):
            found = first_difference(x, y, rel, f"{path}[{i}]", newer_fields=newer_fields)
            if found is not None:
                return found
        return None
    if isinstance(a, bool) or isinstance(b, bool):
        same = a == b
    elif isinstance(a, (int, float)) and isinstance(b, (int, float)):
        same = math.isclose(a, b, rel_tol=rel, abs_tol=1e-12)
    else:
        same = bool(a == b)
    return None if same else f"{where}: {json.dumps(a)}, now {json.dumps(b)}"


# -- verification ------------------------------------------------------------------------------


@dataclass(frozen=True, kw_only=True, slots=True)
class Verification(Result):
    """Whether a recorded check is what it says: recomputed from its inputs and recorded
    aircraft data, with every stored field a person reads compared.

    ``differences`` lists each field that does not match (empty when reproduced); ``notes``
    what could not be verified (a record made before seals).
    """

    record_id: int
    reproduced: bool
    ok: bool
    fingerprint: str
    differences: list[str]
    notes: list[str]
    caution: str = PILOT_CAUTION


def _check_again(aircraft: Aircraft, inputs: dict[str, Any], where: str) -> CheckResult | TripResult:
    """The recorded loading (its inputs) checked against an aircraft: the CheckResult, or for a
    trip of several legs the TripResult (:func:`~loadcheck.trip.check_trip`, every leg)."""
    from .check import check_loading
    from .files import parse_loading
    from .loading import resolve_loading

    loading = parse_loading(inputs, where)
    try:
        if loading.leg:
            from .trip import check_trip

            return check_trip(aircraft, loading, samples=False)
        resolved = resolve_loading(loading, aircraft)
    except LoadcheckError as error:
        raise error.with_file(where) from None
    return check_loading(aircraft, resolved)


def verify(log: CheckLog, record_id: int) -> Verification:
    """Recompute a recorded check from its stored inputs and aircraft data and compare every stored field.

    Compared: the result (every stored field; numbers within a relative 1e-9; a field results
    gained after the record was written is not in it, so not compared), the aircraft data's fingerprint,
    the stored verdict (``ok``), category and registration against the recomputed ones, and
    the seal over all stored fields (time, reference, pilot and source included).

    Raises
    ------
    InputError
        When there is no such record, or its stored data cannot be read.
    """
    record = log.get(record_id)
    from .files import parse_aircraft

    aircraft = parse_aircraft(log.aircraft_data(record.fingerprint), f"record {record_id}")
    again = _check_again(aircraft, record.inputs, f"record {record_id}").to_dict()
    differences = []
    if aircraft.fingerprint != record.fingerprint:
        differences.append(
            f"the recorded aircraft data gives the fingerprint {aircraft.fingerprint}, "
            f"not the recorded {record.fingerprint}"
        )
    difference = first_difference(record.result, again, newer_fields=True)  # a record predates fields added since
    if difference is not None:
        differences.append(f"the stored result differs from the recomputed one, first at {difference}")
    if record.ok != bool(again.get("ok")):
        differences.append(
            f"the stored verdict ({'within' if record.ok else 'out of'} limits) is not the recomputed one "
            f"({'within' if again.get('ok') else 'out of'} limits)"
        )
    if record.category != again.get("category"):
        differences.append(f"the stored category {record.category!r} is not the recomputed {again.get('category')!r}")
    if record.registration != aircraft.registration:
        differences.append(
            f"the stored registration {record.registration!r} is not the recorded aircraft data's "
            f"{aircraft.registration!r}"
        )
    legs = 1 + len(record.inputs.get("leg") or ())
    stored_legs = 1 if record.legs is None else record.legs
    if stored_legs != legs or len(again.get("legs", (again,))) != legs:
        differences.append(
            f"the stored number of legs ({stored_legs}, which log list shows) is not the recorded loading's ({legs})"
        )
    given = record.inputs.get("registration")
    if given is not None and given != record.registration:
        differences.append(f"the stored registration {record.registration!r} is not the loading's {given!r}")
    notes = []
    for first, last in log.missing_ids():
        which = f"record {first} is" if first == last else f"records {first} to {last} are"
        differences.append(
            f"the log has been altered: {which} missing (ids are never given twice and records are never "
            "deleted, so they were removed from the file)"
        )
    if record.seal is None and log.sealed_beside(record.id, record.checked_at):
        differences.append(
            "the record's seal was removed: records before it (or of its own batch) are sealed, so the version "
            "that wrote it sealed it; its time, reference, pilot and source may have been changed"
        )
    elif record.seal is None:
        notes.append(
            "this record has no seal (recorded by an earlier version): its time, reference, pilot and source "
            "cannot be verified"
        )
    elif _seal(*record.stored) != record.seal:
        differences.append(
            "the stored fields do not match the record's seal: a field (time, registration, reference, "
            "pilot, source, flight date, category, verdict, inputs, result or version) was changed after recording"
        )
    return Verification(
        record_id=record_id,
        reproduced=not differences,
        ok=bool(again.get("ok")),
        fingerprint=record.fingerprint,
        differences=differences,
        notes=notes,
    )


@dataclass(frozen=True, kw_only=True, slots=True)
class CurrentCheck(Result):
    """One recorded check against the aircraft's current data.

    ``data_changed`` is True where the current aircraft data's fingerprint is not the
    recorded one; ``current_ok`` is the verdict with the current data (None where the
    loading cannot be checked with it: ``problem`` says why); ``current_findings`` its limit
    findings.
    """

    record_id: int
    checked_at: str
    registration: str | None
    reference: str | None
    recorded_ok: bool
    recorded_fingerprint: str
    current_fingerprint: str | None
    data_changed: bool
    current_ok: bool | None
    current_findings: list[str]
    problem: str | None = None

    @property
    def now_out_of_limits(self) -> bool:
        """Recorded within limits, out of limits with the current data."""
        return self.recorded_ok and self.current_ok is False


@dataclass(frozen=True, kw_only=True, slots=True)
class CurrentVerification(Result):
    """Recorded checks against the current aircraft data of a fleet.

    ``status``: 0 no check recorded within limits is out of limits with the current data;
    1 at least one is; 2 a record could not be checked with the current data.
    """

    checks: list[CurrentCheck]
    fleet: str
    status: int
    changed: int
    now_out_of_limits: int
    caution: str = PILOT_CAUTION


def verify_current(records: Iterable[LoggedCheck], fleet: Fleet) -> CurrentVerification:
    """Check recorded loadings again with the current aircraft data of a fleet.

    Parameters
    ----------
    records : the recorded checks (e.g. :meth:`CheckLog.find`)
    fleet : a :class:`~loadcheck.fleet.Fleet` holding the current aircraft files, by registration

    Returns
    -------
    CurrentVerification
        Which checks were made with aircraft data that has changed since, and what their
        loadings give with the current data; the exit status it calls for.
    """
    checks = []
    for record in records:
        common: dict[str, Any] = {
            "record_id": record.id,
            "checked_at": record.checked_at,
            "registration": record.registration,
            "reference": record.reference,
            "recorded_ok": record.ok,
            "recorded_fingerprint": record.fingerprint,
        }
        try:
            if record.registration is None:
                raise InputError(
                    Problem(
                        "registration",
                        "the record names no registration, so its aircraft's current data cannot be found",
                    )
                )
            aircraft = fleet.aircraft(record.registration)
        except LoadcheckError as error:
            checks.append(
                CurrentCheck(
                    **common,
                    current_fingerprint=None,
                    data_changed=True,
                    current_ok=None,
                    current_findings=[],
                    problem="; ".join(p.describe() for p in error.problems),
                )
            )
            continue
        changed = aircraft.fingerprint != record.fingerprint
        try:
            result = _check_again(aircraft, record.inputs, f"record {record.id}")
        except LoadcheckError as error:
            checks.append(
                CurrentCheck(
                    **common,
                    current_fingerprint=aircraft.fingerprint,
                    data_changed=changed,
                    current_ok=None,
                    current_findings=[],
                    problem="the loading cannot be checked with the current data: "
                    + "; ".join(p.describe() for p in error.problems),
                )
            )
            continue
        checks.append(
            CurrentCheck(
                **common,
                current_fingerprint=aircraft.fingerprint,
                data_changed=changed,
                current_ok=result.ok,
                current_findings=[f.message for f in result.findings if f.severity == "limit"],
            )
        )
    worse = sum(1 for c in checks if c.now_out_of_limits)
    status = 2 if any(c.problem for c in checks) else 1 if worse else 0
    return CurrentVerification(
        checks=checks,
        fleet=str(fleet.folder),
        status=status,
        changed=sum(1 for c in checks if c.data_changed and c.current_fingerprint is not None),
        now_out_of_limits=worse,
    )
