"""A fleet of aircraft addressed by registration, and a day of loadings checked against it.

The fleet is a folder of aircraft files (searched with its sub-folders). Loadings come
from a CSV file (one row per flight; columns documented in docs/fleet.md) or a folder of
loading files. Each flight is resolved against its aircraft and checked with
:func:`~loadcheck.check.check_loading` (a trip of several legs, the rows of one trip id, with
:func:`~loadcheck.trip.check_trip`); a row that cannot be used is reported with its line
number and reason, never skipped, and the other rows are still checked.

Rows are streamed: :func:`read_loadings` reads the header at once and then one row at a
time, and :func:`check_flights` holds a few chunks of rows at a time, so memory does not
grow with the number of rows and the cost grows linearly with it. How a chunk is checked
(:func:`_check_chunk`) is kept apart from how rows are read and streamed; where worker processes
check the chunks, the rows of a CSV file are read in the workers (:func:`_check_units`).
"""

from __future__ import annotations

import csv
import datetime as dt
import gc
import io
import itertools
import math
import os
import re
import threading
import time
from collections import deque
from collections.abc import Iterable, Iterator, Mapping
from dataclasses import dataclass, field
from functools import cached_property, lru_cache
from pathlib import Path
from typing import Any

import orjson

from .aircraft import RESERVED_IDS, Aircraft
from .check import check_columns
from .checklog import Stored, stored, stored_text
from .errors import FileFormatError, InputError, LoadcheckError, Problem
from .files import (
    AIRCRAFT_ONLY_KEYS,
    encoding_problem,
    file_kind,
    named_elsewhere,
    open_regular,
    parse_aircraft,
    parse_loading,
    read_toml,
    reads_as,
)
from .loading import Loading, burn_order, recorded_inputs, resolve_loading
from .registration import registration_key, required_key
from .result_json import result_texts
from .weighing import latest_date

__all__ = [
    "AircraftFile",
    "Fleet",
    "FlightRow",
    "Flight",
    "load_fleet",
    "read_loadings",
    "check_flights",
    "RESERVED_COLUMNS",
    "MAX_CSV_BYTES",
    "TRIP_COLUMN",
    "LEG_COLUMN",
    "AircraftSummary",
    "fleet_listing",
    "record_age_days",
    "RECORD_AGE_DAYS",
    "default_workers",
]

RECORD_AGE_DAYS = 1095
"""Age [days] past which the fleet listing flags an empty-weight record: 36 months, the period
within which 14 CFR 125.91(b) requires an actual weighing (quoted in AC 120-27E, paragraph 1 b),
and a common re-weighing period of operators' programmes; a school sets its own with --max-age."""

MAX_CSV_BYTES = 50 * 1024 * 1024
"""Largest loadings CSV read [bytes] (about half a million flights)."""

RESERVED_COLUMNS = RESERVED_IDS
"""CSV columns that are not station or tank ids (an aircraft file may not use them as ids);
:data:`TRIP_COLUMN` and :data:`LEG_COLUMN` among them."""

TRIP_COLUMN = "trip_id"
"""CSV column grouping rows into one trip: the rows with one trip id are the legs of one trip,
in row order, one after another, of one aircraft (docs/fleet.md, "Trips")."""

LEG_COLUMN = "leg"
"""Optional CSV column numbering the legs of a trip (1, 2, ...): where given, a missing,
repeated or out-of-order leg is refused (docs/fleet.md, "Trips")."""

_HEADER = re.compile(r"^\s*([^\[\]]+?)\s*(?:\[\s*([^\]]+?)\s*\])?\s*$")


@dataclass(frozen=True)
class AircraftFile:
    """One aircraft file of the fleet: its data, or why it cannot be used."""

    path: Path
    registration: str | None
    aircraft: Aircraft | None
    problems: list[str] = field(default_factory=list)


_SPELLINGS_KEPT = 1024
"""Registration texts :meth:`Fleet.aircraft` keeps the aircraft of (a day with more spellings
than that finds the others by their key each time)."""


@dataclass(frozen=True)
class Fleet:
    """The aircraft of a folder, by registration."""

    folder: Path
    entries: list[AircraftFile]

    @cached_property
    def duplicates(self) -> dict[str, list[Path]]:
        """Registrations found in more than one file, by :func:`~loadcheck.aircraft.registration_key`
        (``G-ABCD`` in one file and ``gabcd`` in another are one aircraft in two files)."""
        seen: dict[str, list[Path]] = {}
        for entry in self.entries:
            if entry.registration:
                seen.setdefault(registration_key(entry.registration), []).append(entry.path)
        return {key: paths for key, paths in seen.items() if len(paths) > 1}

    @cached_property
    def _usable(self) -> dict[str, Aircraft]:
        """The usable aircraft by registration key (not one found in two files)."""
        duplicates = self.duplicates
        return {
            key: e.aircraft
            for e in self.entries
            if e.registration
            and e.aircraft is not None
            and (key := registration_key(e.registration))
            and key not in duplicates
        }

    @cached_property
    def _by_text(self) -> dict[str, Aircraft]:
        """The usable aircraft found so far by the text a row gave its registration in (each
        found by its key, :meth:`aircraft`; a refused text is not kept)."""
        return {}

    def aircraft(self, registration: str) -> Aircraft:
        """The usable aircraft of a registration.

        Raises
        ------
        InputError
            Unknown registration (the known ones listed), one found in two files, or one
            whose file does not validate.
        """
        seen = self._by_text.get(registration)
        if seen is not None:  # a fleet day asks once or twice a row, mostly in the same few spellings
            return seen
        key = required_key(registration)  # as a loading's registration is compared with its aircraft's
        usable = self._usable.get(key)
        if usable is not None:
            if len(self._by_text) < _SPELLINGS_KEPT:
                self._by_text[registration] = usable
            return usable
        if key in self.duplicates:
            files = ", ".join(str(p) for p in self.duplicates[key])
            raise InputError(Problem("registration", f"{registration!r} is in more than one fleet file ({files})"))
        entry = next((e for e in self.entries if e.registration and registration_key(e.registration) == key), None)
        if entry is None:
            known = ", ".join(sorted(e.registration for e in self.entries if e.registration)) or "none"
            raise InputError(
                Problem("registration", f"unknown registration {registration!r}", expected="one of " + known)
            )
        if entry.aircraft is None:
            raise InputError(Problem("registration", f"the file of {registration!r} ({entry.path}) does not validate"))
        return entry.aircraft

    def entry(self, registration: str) -> AircraftFile:
        """The file of the usable aircraft of a registration, found as :meth:`aircraft` finds it
        (by :func:`~loadcheck.aircraft.registration_key`: ``demo 4t`` is ``DEMO-4T``'s file).

        Raises
        ------
        InputError
            As :meth:`aircraft` does.
        """
        aircraft = self.aircraft(registration)
        return next(e for e in self.entries if e.aircraft is aircraft)  # the one entry that holds it

    @cached_property
    def station_and_tank_ids(self) -> set[str]:
        """Every station and tank id of any usable aircraft."""
        ids: set[str] = set()
        for entry in self.entries:
            if entry.aircraft is not None:
                ids |= set(entry.aircraft.station_by_id) | set(entry.aircraft.tank_by_id)
        return ids


def load_fleet(folder: str | Path) -> Fleet:
    """Read every aircraft file under a folder (loadings and other files are passed over).

    A file that is none of the known kinds but holds two tables or keys or more that only an
    aircraft file has (``name``, ``[limits]``, ``[[station]]``, ...; its ``[units]`` misspelt, say)
    is read as an aircraft file, so that it is flagged as one that does not validate rather than
    passed over (one such key alone, a notes file's ``name``, is not taken for an aircraft).

    Raises
    ------
    FileFormatError
        When the folder does not exist or holds no aircraft file.
    """
    folder = Path(folder)
    if folder.is_file():
        raise FileFormatError(
            "is a file, not a folder of aircraft files (the fleet folder comes first: fleet check FOLDER LOADINGS)",
            file=folder,
        )
    if not folder.is_dir():
        raise FileFormatError("not a folder of aircraft files", file=folder)
    entries = []
    for path in toml_files(folder):
        try:
            data = read_toml(path)
        except LoadcheckError as error:
            entries.append(AircraftFile(path, None, None, error.lines()))
            continue
        kind = file_kind(data)
        if kind != "aircraft" and not (kind == "unknown" and sum(key in data for key in AIRCRAFT_ONLY_KEYS) >= 2):
            continue  # a loading, readings or changes file; one with an aircraft's tables misspelt is flagged
        registration = data.get("registration") if isinstance(data.get("registration"), str) else None
        try:
            aircraft = parse_aircraft(data, path)
        except LoadcheckError as error:
            entries.append(AircraftFile(path, registration, None, error.lines()))
            continue
        problems = [] if registration else [f"{path}: no registration; the fleet cannot address this aircraft"]
        entries.append(AircraftFile(path, registration, aircraft, problems))
    if not entries:
        raise FileFormatError("holds no aircraft file", file=folder)
    return Fleet(folder, entries)


@dataclass(frozen=True)
class FlightRow:
    """One flight as read: where it came from and its loading, or why it cannot be used."""

    line: int
    source: str
    registration: str | None
    reference: str | None
    pilot: str | None
    loading: Loading | None
    problems: list[str] = field(default_factory=list)
    trip: str | None = None  # the trip id of a CSV whose rows are legs of one trip (TRIP_COLUMN)
    lines: tuple[int, ...] = ()  # the CSV lines of a trip's rows, leg by leg (a trip of a CSV only)
    date: str | None = None  # the date cell of a CSV row (YYYY-MM-DD), shown with the flight

    def without_loading(self) -> FlightRow:
        """This row without its loading model (the flight's check and stored inputs carry it): what
        is held of a flight once checked, and what a worker sends back."""
        return FlightRow(
            self.line,
            self.source,
            self.registration,
            self.reference,
            self.pilot,
            None,
            self.problems,
            self.trip,
            self.lines,
            self.date,
        )

    def where(self, leg: int = 1) -> str:
        """``file:line`` of the row of leg ``leg`` (the first row where not known)."""
        line = self.lines[leg - 1] if 1 <= leg <= len(self.lines) else self.line
        return f"{self.source}:{line}"


def _split_header(name: str) -> tuple[str, str | None]:
    match = _HEADER.match(name or "")
    if not match:
        return (name or "").strip(), None
    return match.group(1).strip(), match.group(2)


class _Counted(io.RawIOBase):
    """A binary stream that refuses to give more than ``limit`` bytes in all."""

    def __init__(self, raw: Any, limit: int, path: Path):
        super().__init__()
        self._raw, self._limit, self._path, self.count = raw, limit, path, 0

    def readable(self) -> bool:
        return True

    def readinto(self, buffer: Any) -> int:
        size = int(self._raw.readinto(buffer) or 0)
        self.count += size
        if self.count > self._limit:
            raise FileFormatError(f"file is too large (more than {self._limit:,} bytes)", file=self._path)
        return size

    def close(self) -> None:
        self._raw.close()
        super().close()


def _csv_rows(path: Path, fleet: Fleet) -> tuple[Iterator[FlightRow], list[str]]:
    """The header read at once (its problems raised or returned), the rows one at a time."""
    raw = open_regular(path, limit=MAX_CSV_BYTES)
    buffered = io.BufferedReader(_Counted(raw, MAX_CSV_BYTES, path), buffer_size=1 << 16)
    try:
        problem = encoding_problem(buffered.peek(4096)[:4096])
        if problem:
            raise FileFormatError(problem, file=path)
        text = io.TextIOWrapper(buffered, encoding="utf-8-sig", newline="")
        # strict: text after a closing quote ("1"70) is an error, never joined into another figure (170)
        reader = csv.reader(text, strict=True)
        try:
            header = next(reader)
        except StopIteration:
            raise FileFormatError("the CSV file is empty: it needs a header row", file=path) from None
        except csv.Error as error:
            raise FileFormatError(f"not a readable CSV file: {error}", file=path) from None
        except UnicodeDecodeError as error:
            raise FileFormatError(f"not UTF-8 text (bad byte in the header, {error.reason})", file=path) from None
        columns, file_problems, unknown = _read_header(path, header, fleet)
        names = [name for name, _ in columns]
        trip_at = names.index(TRIP_COLUMN) if TRIP_COLUMN in names else None
        reading = _CsvReading(
            path,
            columns,
            unknown,
            _roles(columns, unknown),
            _fixed_columns(columns),
            *(_scattered_trips(path, trip_at) if trip_at is not None else ({}, {})),
            trip_at,
        )
    except BaseException:
        buffered.close()
        raise
    return _CsvRows(reading, fleet, _stream_units(reading, text, reader)), file_problems


_Unit = list[tuple[int, list[str]]]
"""The records of one flight as the csv module reads them, each with the line it starts on: one
row, or the consecutive rows of one trip id."""


@dataclass(frozen=True)
class _CsvReading:
    """What reading a CSV file's rows takes from its header, found once for the file."""

    path: Path
    columns: list[tuple[str, str | None]]
    unknown: set[str]
    roles: list[tuple[int, str, str | None, str]]  # :func:`_roles`
    fixed: list[tuple[int, str]]  # :func:`_fixed_columns`
    scattered: dict[str, list[int]]  # :func:`_scattered_trips`
    clashes: dict[str, list[tuple[str, int]]]  # the trip ids differing only in case (the same)
    trip_at: int | None  # the place of the trip id column

    def trip(self, record: list[str]) -> str | None:
        """The trip id of a record, as :func:`_csv_cells` reads it (None: not a trip's row)."""
        at = self.trip_at
        if at is None or at >= min(len(record), len(self.columns)):
            return None
        return record[at].strip() or None

    def flight(self, unit: _Unit, fleet: Fleet) -> FlightRow:
        """One flight read from its records (the one place a CSV row becomes a flight)."""
        return _joined(
            [
                _csv_cells(self.path, line, self.columns, record, fleet, self.unknown, self.roles, self.fixed)
                for line, record in unit
            ],
            self.scattered,
            self.clashes,
        )


class _CsvRows(Iterator[FlightRow]):
    """The flights of a CSV file, read one at a time; or, through :meth:`units`, their records
    unread, for :func:`check_flights` to read where it checks them (in a worker process)."""

    def __init__(self, reading: _CsvReading, fleet: Fleet, units: Iterator[_Unit]):
        self.reading, self._fleet, self._units = reading, fleet, units

    def __next__(self) -> FlightRow:
        return self.reading.flight(next(self._units), self._fleet)

    def units(self) -> Iterator[_Unit]:
        """The records of each flight not yet read (the same stream: read one way only)."""
        return self._units


def _numbered(reader: Any) -> Iterator[tuple[int, list[str]]]:
    """Each record of a csv reader with the line it starts on (a quoted cell may hold line breaks,
    so a record can span lines; the reader's ``line_num`` is the line it ends on)."""
    first = reader.line_num + 1
    for record in reader:
        yield first, record
        first = reader.line_num + 1


def _scattered_trips(path: Path, trip_at: int) -> tuple[dict[str, list[int]], dict[str, list[tuple[str, int]]]]:
    """Trip ids whose rows do not all come one after another: each with the line where each
    of its runs of rows begins; and trip ids that differ from another only in letter case: each
    with the other spellings and the line each begins at (``A`` and ``a`` are refused, not taken
    as one trip or as two: either could be what was meant).

    A quick first pass over the file, reading only the trip id of each row, so that every
    part of such a trip is refused, the first part too (it would otherwise be checked
    before the rest is read). It holds one entry per trip id (a few tens of bytes each).
    A file that goes wrong part way is reported by the reading proper, at its line.
    """
    starts: dict[str, int] = {}
    scattered: dict[str, list[int]] = {}
    current: str | None = None
    with (
        open_regular(path, limit=MAX_CSV_BYTES) as raw,
        io.TextIOWrapper(raw, encoding="utf-8-sig", errors="replace", newline="") as text,
    ):
        reader = csv.reader(text)
        try:
            next(reader, None)
            for line, record in _numbered(reader):
                if not "".join(record).strip():  # a row of empty cells (or of spaces) is no flight
                    continue
                trip = record[trip_at].strip() if trip_at < len(record) else ""
                if trip and trip != current:
                    if trip in starts:
                        scattered.setdefault(trip, [starts[trip]]).append(line)
                    else:
                        starts[trip] = line
                current = trip or None
        except csv.Error:
            pass
    spellings: dict[str, list[str]] = {}
    for trip in starts:
        spellings.setdefault(trip.casefold(), []).append(trip)
    clashes = {
        trip: [(other, starts[other]) for other in alike if other != trip]
        for alike in spellings.values()
        if len(alike) > 1
        for trip in alike
    }
    return scattered, clashes


def _read_header(
    path: Path, header: list[str], fleet: Fleet
) -> tuple[list[tuple[str, str | None]], list[str], set[str]]:
    columns = [_split_header(h) for h in header]
    names = [c[0] for c in columns]
    if not names or all(not n for n in names):
        raise FileFormatError("the CSV header is empty", file=path)
    if "registration" not in names:
        line = ",".join(header)
        for separator, word in ((";", "semicolons"), ("\t", "tabs"), ("|", "bars")):
            if separator in line and "registration" in [n.strip() for n in line.split(separator)]:
                raise FileFormatError(
                    f"the file is separated by {word}, not by commas: save it as comma-separated "
                    "CSV (a decimal comma is not read either: write 170.5)",
                    file=path,
                )
        raise FileFormatError("the CSV header has no 'registration' column", file=path)
    repeated = sorted({n for n in names if names.count(n) > 1})
    if repeated:
        raise FileFormatError(f"column(s) named twice in the header: {', '.join(repeated)}", file=path)
    known = fleet.station_and_tank_ids
    for column, what in ((TRIP_COLUMN, "the trip id"), (LEG_COLUMN, "the leg number of a trip")):
        if column in names and column in known:
            raise FileFormatError(
                f"the column {column!r} could be {what} or a station or tank of that name in a "
                "fleet aircraft: rename that station or tank",
                file=path,
            )
    if LEG_COLUMN in names and TRIP_COLUMN not in names:
        raise FileFormatError(
            f"the column {LEG_COLUMN!r} numbers the legs of a trip, but the header has no "
            f"{TRIP_COLUMN!r} column saying which trip each row belongs to",
            file=path,
        )
    unitless = [
        f"{name} [{unit}]" for name, unit in columns if unit is not None and name in (*_NOT_AMOUNTS, *_TEXT_COLUMNS)
    ]
    if unitless:  # a unit there would be dropped without a word: the author meant something it cannot say
        raise FileFormatError(
            f"column(s) {', '.join(map(repr, unitless))}: a unit on a column that holds no amount; "
            "write the column name alone",
            file=path,
        )
    unknown = [n for n in names if n and n not in RESERVED_COLUMNS and n not in known]
    file_problems = [
        f"{path}: unknown column {name!r}: not a station or tank of any fleet aircraft, nor one of "
        f"{', '.join(RESERVED_COLUMNS)}; rows with a value in it are refused"
        for name in unknown
    ]
    file_problems += [
        f"{path}: column {index + 1} has no name in the header: name it or delete it; rows with a value "
        "in it are refused"
        for index, name in enumerate(names)
        if not name
    ]  # as an unknown column is: nothing typed under it may be dropped
    return columns, file_problems, set(unknown) | ({""} if "" in names else set())


def _stream_units(reading: _CsvReading, text: io.TextIOWrapper, reader: Any) -> Iterator[_Unit]:
    """The records of each flight, in order, as they are read (a trip's consecutive rows together)."""
    path = reading.path
    count = 0
    pending: _Unit = []
    pending_trip: str | None = None
    try:
        for line, record in _numbered(reader):
            if not "".join(record).strip():  # a row of empty cells (or of spaces) is no flight
                continue
            count += 1
            trip = reading.trip(record)
            if pending and trip is not None and trip == pending_trip:
                pending.append((line, record))
                continue
            if pending:
                yield pending
            pending, pending_trip = [(line, record)], trip
        if pending:
            yield pending
    except csv.Error as error:
        raise FileFormatError(f"CSV error at line {reader.line_num}: {error}", file=path) from None
    except UnicodeDecodeError as error:
        raise FileFormatError(f"not UTF-8 text (after line {reader.line_num}: {error.reason})", file=path) from None
    finally:
        text.close()
    if count == 0:
        raise FileFormatError("the CSV file has a header but no flights: there is nothing to check", file=path)


@dataclass
class _RawRow:
    """One CSV row read into loading-file values, before rows of one trip are joined."""

    where: str
    line: int
    source: str
    registration: str | None
    reference: str | None
    pilot: str | None
    trip: str | None
    data: dict[str, Any]
    problems: list[str]
    leg: int | None = None
    date: str | None = None  # the row's date cell, a calendar date (YYYY-MM-DD) as written
    leg_given: bool = False  # the row's leg cell holds something (a leg number, or a text refused as none)


def _lines_text(lines: Iterable[int]) -> str:
    """``lines 2, 3 and 7`` (the rows named in a message)."""
    shown = [str(line) for line in lines]
    return ("line " if len(shown) == 1 else "lines ") + (
        shown[0] if len(shown) == 1 else ", ".join(shown[:-1]) + " and " + shown[-1]
    )


def _trip_problems(
    rows: list[_RawRow], scattered: dict[str, list[int]], clashes: dict[str, list[tuple[str, int]]]
) -> list[str]:
    """Why the rows of one trip id do not make one trip (fail closed: the whole trip is then
    refused): rows of the trip id elsewhere in the file, a second aircraft, legs missing,
    repeated or out of order where the rows number them."""
    first = rows[0]
    trip = first.trip
    problems = []
    if trip in scattered:
        problems.append(
            f"{first.source}: trip {trip!r} is given in parts, with other flights between them (parts "
            f"beginning at {_lines_text(scattered[trip])}): the rows of one trip come one after another"
        )
    if trip in clashes:
        others = ", ".join(f"{other!r} (line {line})" for other, line in clashes[trip])
        problems.append(
            f"{first.where}: trip id {trip!r} differs from trip id {others} only in letter case: write them "
            "alike where the rows are one trip, or give another trip id"
        )
    for row in rows[1:]:
        if row.registration is not None and first.registration is not None and row.registration != first.registration:
            problems.append(
                f"{row.where}: registration {row.registration!r} differs from the first row of trip "
                f"{trip!r} ({first.registration!r} at line {first.line}): a trip is flown by one aircraft"
            )
    if any(row.leg is not None for row in rows):
        for expected, row in enumerate(rows, start=1):
            if row.leg is None:
                if not row.leg_given:  # a leg cell that holds no number is said where it is read
                    problems.append(
                        f"{row.where}: no {LEG_COLUMN} number, where other rows of trip {trip!r} give one: "
                        "number every leg of a trip or none"
                    )
            elif row.leg != expected and expected == 1:
                problems.append(
                    f"{row.where}: leg {row.leg} of trip {trip!r}, but no leg 1 of that trip comes before "
                    "it: the first row of a trip is its leg 1"
                )
            elif row.leg != expected:
                problems.append(
                    f"{row.where}: leg {row.leg} of trip {trip!r} where leg {expected} comes next: a leg is "
                    "missing, repeated or out of order"
                )
    return problems


def _joined(
    rows: list[_RawRow],
    scattered: dict[str, list[int]] | None = None,
    clashes: dict[str, list[tuple[str, int]]] | None = None,
) -> FlightRow:
    """One flight from one row, or one trip from the consecutive rows of one trip id: the first
    row is the first leg; each later row is the next leg, its station cells the new weights,
    its tank cells the fuel put in at the stop, its burn cells the leg's own burn. A trip
    with any problem in any of its rows is refused whole, its rows named."""
    first = rows[0]
    problems = [p for row in rows for p in row.problems]
    if first.trip is not None:
        problems += _trip_problems(rows, scattered or {}, clashes or {})
    data = first.data
    if len(rows) > 1:
        legs = []
        for row in rows[1:]:
            for name, value in (
                ("reference", row.reference),
                ("pilot", row.pilot),
                ("date", row.date),
                ("category", row.data.get("category")),
            ):
                given = first.data.get(name) if name == "category" else getattr(first, name)
                if value is not None and value != given:
                    problems.append(
                        f"{row.where}: {name} {value!r} differs from the trip's first row ({given!r}): "
                        "a trip is one flight record; leave it empty on later rows or give the same"
                    )
            leg = {"load": row.data["load"], "add_fuel": row.data["fuel"], "burn": row.data["burn"]}
            legs.append(leg | ({"label": row.data["label"]} if "label" in row.data else {}))
        data = data | {"leg": legs}
    if first.trip is not None and problems:  # said last, after every problem of its rows
        problems.append(
            f"{first.source}: trip {first.trip!r} ({_lines_text(r.line for r in rows)}) is not checked: "
            "a trip with a problem in any of its rows is refused whole, so none of its legs is checked"
        )
    loading = None
    if not problems:
        try:
            loading = parse_loading(data, first.where)
        except LoadcheckError as error:
            problems += error.lines()
    return FlightRow(
        first.line,
        first.source,
        first.registration,
        first.reference,
        first.pilot,
        loading,
        problems,
        first.trip,
        tuple(row.line for row in rows) if first.trip is not None else (),
        first.date,
    )


_TEXT_COLUMNS = ("category", "label", "order")
"""Loading columns that hold a text, not an amount (no unit may be given in their header)."""

_NOT_AMOUNTS = ("registration", "reference", "pilot", "date", TRIP_COLUMN, LEG_COLUMN)
"""Columns that are not a station, tank or burn value of the loading (read apart, or not at all)."""


def _roles(columns: list[tuple[str, str | None]], unknown: set[str]) -> list[tuple[int, str, str | None, str]]:
    """What each column with a loading value in it gives, found once for the file: ``unknown``,
    ``text`` (category, label), ``order``, ``burn`` (another burn column), ``aircraft`` (a
    station or tank of the row's aircraft, or an error of that row); with its place and unit."""
    roles = []
    for index, (name, unit) in enumerate(columns):
        if name in _NOT_AMOUNTS:
            continue
        if name in unknown:
            role = "unknown"
        elif name == "order":
            role = "order"
        elif name in _TEXT_COLUMNS:
            role = "text"
        elif name in RESERVED_COLUMNS:
            role = "burn"
        else:
            role = "aircraft"
        roles.append((index, name, unit, role))
    return roles


def _fixed_columns(columns: list[tuple[str, str | None]]) -> list[tuple[int, str]]:
    """The place and name of each column that is not a loading value (:data:`_NOT_AMOUNTS`)."""
    return [(index, name) for index, (name, _) in enumerate(columns) if name in _NOT_AMOUNTS]


def _csv_cells(
    path: Path,
    line: int,
    columns: list[tuple[str, str | None]],
    record: list[str],
    fleet: Fleet,
    unknown: set[str],
    roles: list[tuple[int, str, str | None, str]] | None = None,
    fixed: list[tuple[int, str]] | None = None,
) -> _RawRow:
    """One CSV row read into loading-file values; ``roles`` (:func:`_roles`) and ``fixed``
    (:func:`_fixed_columns`) are the header's, found once for the file where given."""
    source = str(path)
    where = f"{source}:{line}"
    problems: list[str] = []
    if len(record) != len(columns):
        problems.append(f"{where}: {len(record)} cells where the header has {len(columns)} columns")
    cells = [cell.strip() for cell in record[: len(columns)]]  # a row of other length: said above
    count = len(cells)
    given = {
        name: cells[index] for index, name in (fixed if fixed is not None else _fixed_columns(columns)) if index < count
    }
    registration = given.get("registration") or None
    reference = given.get("reference") or None
    pilot = given.get("pilot") or None
    date = given.get("date") or None
    if date is not None and not _calendar_date(date):
        problems.append(
            f"{where}: date {date!r} is not a calendar date: write it YYYY-MM-DD (ISO 8601), e.g. 2026-12-03"
        )
    if registration is None:
        problems.append(f"{where}: no registration")
    aircraft = None
    if registration is not None:
        try:
            aircraft = fleet.aircraft(registration)
        except LoadcheckError as error:
            problems += [f"{where}: {p.describe()}" for p in error.problems]
    placement = _placement(aircraft) if aircraft is not None else {}
    data: dict[str, Any] = {"load": {}, "fuel": {}, "burn": {}}
    trip = given.get(TRIP_COLUMN) or None
    leg_text = given.get(LEG_COLUMN, "")
    leg = None
    if leg_text:
        if not re.fullmatch(r"[0-9]+", leg_text) or int(leg_text) < 1:
            problems.append(f"{where}: {LEG_COLUMN} {leg_text!r} is not a leg number (1, 2, 3, ...)")
        elif trip is None:
            problems.append(
                f"{where}: leg {leg_text} of no trip: the {TRIP_COLUMN} cell is empty, so it is not known "
                "which trip this row is a leg of"
            )
        else:
            leg = int(leg_text)
    for index, name, unit, role in roles if roles is not None else _roles(columns, unknown):
        if index >= count:
            break
        value = cells[index]
        if not value:
            continue
        if role == "aircraft":  # the usual cell: a station's weight or a tank's fuel
            if aircraft is None:
                continue
            table = placement.get(name)
            if table is not None:
                data[table][name] = _typed(value, unit)
            else:
                problems.append(
                    f"{where}: column {name!r} is not a station or tank of {registration} "
                    f"(its stations: {', '.join(aircraft.station_by_id)}; tanks: {', '.join(aircraft.tank_by_id)})"
                )
        elif role == "unknown":
            column = f"unknown column {name!r}" if name else f"column {index + 1}, which has no name in the header"
            problems.append(f"{where}: value {value!r} in {column}")
        elif role == "text":
            data[name] = value
        elif role == "order":
            try:
                data["burn"]["order"] = burn_order(value, "order", "csv")
            except LoadcheckError as error:  # a problem of this row, not of the file: the other rows are checked
                problems += [f"{where}: {p.describe()}" for p in error.problems]
        elif role == "burn":
            data["burn"][name] = _typed(value, unit)
    return _RawRow(where, line, source, registration, reference, pilot, trip, data, problems, leg, date, bool(leg_text))


def _calendar_date(text: str) -> bool:
    """True where ``text`` is a calendar date written YYYY-MM-DD (ISO 8601; 2026-02-31 is not one)."""
    if not re.fullmatch(r"[0-9]{4}-[0-9]{2}-[0-9]{2}", text):
        return False
    try:
        dt.date.fromisoformat(text)
    except ValueError:
        return False
    return True


def _placement(aircraft: Aircraft) -> dict[str, str]:
    """Where a cell of each of the aircraft's station and tank columns goes in a loading file
    (``load`` or ``fuel``; a station first, as the ids are read), found once for an aircraft."""
    kept = _PLACEMENT.get(id(aircraft))
    if kept is not None and kept[0] is aircraft:
        return kept[1]
    placement = dict.fromkeys(aircraft.tank_by_id, "fuel") | dict.fromkeys(aircraft.station_by_id, "load")
    if len(_PLACEMENT) >= 64:
        _PLACEMENT.clear()
    _PLACEMENT[id(aircraft)] = (aircraft, placement)
    return placement


_PLACEMENT: dict[int, tuple[Aircraft, dict[str, str]]] = {}


_DECIMAL = re.compile(r"[0-9]+(?:\.[0-9]*)?|\.[0-9]+")


@lru_cache(maxsize=4096)  # a day repeats its amounts; the answer is a number or a text (immutable)
def _typed(value: str, unit: str | None) -> float | str:
    """A cell's amount as a loading file holds it: a plain decimal number (``190``, ``1.2``) as a
    number, as in a TOML file, so that the check log stores the same inputs whatever the source;
    with the column's unit, the quantity as text (``"0 l"``); anything else as written, for
    the loading's validation to read or refuse with the value as given."""
    if unit and _bare_number(value):
        return f"{value} {unit}"
    if unit is None and _DECIMAL.fullmatch(value):
        number = float(value)
        if math.isfinite(number):
            return number
    return value


def _bare_number(text: str) -> bool:
    try:
        float(text)
    except ValueError:
        return False
    return True


def _named_aircraft_problem(path: Path, loading: Loading, fleet: Fleet) -> str | None:
    """Where a loading file names both its aircraft file and a registration, and the fleet's file of
    that registration is another file: the contradiction. Stricter than the single check, which
    takes a copy of the same data (``files._another_aircraft``): a fleet is one folder, and a loading
    that names a file outside it is refused whatever that file holds."""
    if loading.aircraft is None or loading.registration is None:
        return None
    try:
        entry = fleet.entry(loading.registration)
    except LoadcheckError:
        return None  # an unknown registration is the row's own problem, said where the row is checked
    if named_elsewhere(loading.aircraft, path.parent, entry.path) is None:
        return None
    return (
        f"{path}: this loading names the aircraft file {loading.aircraft!r}, but its registration "
        f"{loading.registration!r} is the fleet's {entry.path}: give the one aircraft it is for"
    )


def toml_files(folder: Path) -> list[Path]:
    """Every TOML file under ``folder``, its sub-folders too, in order: ``.toml`` in any case
    (``DAY.TOML``), so that none is passed over for the case of its name."""
    return sorted(path for path in folder.rglob("*") if path.suffix.lower() == ".toml" and path.is_file())


def _is_other_kind(data: Mapping[str, Any], path: Path) -> bool:
    """True where a file of a folder of loadings is an aircraft, readings or changes file, which
    the day passes over: it is taken for one (:func:`~loadcheck.files.file_kind`) *and* reads as
    one (:func:`~loadcheck.files.reads_as`). A loading that holds one of their tables (``[units]``,
    ``[[point]]``) is no such file: it is read as a loading, and its problems reported."""
    kind = file_kind(data)
    return kind in ("aircraft", "readings", "changes") and reads_as(data, path, kind)


def _folder_rows(folder: Path, fleet: Fleet) -> Iterator[FlightRow]:
    count = 0
    fleet_files = {entry.path for entry in fleet.entries}  # the fleet's own files, when the folders are one
    for index, path in enumerate(toml_files(folder), start=1):
        shown = str(path).encode("utf-8", "surrogateescape").decode("utf-8", "backslashreplace")
        if shown != str(path):  # a name with bytes that are not UTF-8: no text can name it in a report
            count += 1
            yield FlightRow(
                index,
                shown,
                None,
                None,
                None,
                None,
                [f"{shown}: the file's name is not UTF-8 text, so it cannot be reported; rename the file"],
            )
            continue
        try:
            data = read_toml(path)
            if path in fleet_files or _is_other_kind(data, path):
                continue
            # a loading, or a file that is none of the other kinds (tables misspelt, `[loads]`; a loading
            # with an aircraft's table in it; no table at all): read as a loading, so that its problems
            # are reported, never passed over in silence
            loading = parse_loading(data, path)
            registration, reference, pilot = loading.registration, loading.reference, loading.pilot
            problem = (
                _named_aircraft_problem(path, loading, fleet)
                if registration
                else f"{path}: a fleet loading file names its aircraft by registration = ..."
            )
            row = FlightRow(index, str(path), registration, reference, pilot, loading, [problem] if problem else [])
        except LoadcheckError as error:
            row = FlightRow(index, str(path), None, path.stem, None, None, error.lines())
        count += 1
        yield row
    if count == 0:
        raise FileFormatError("holds no loading file: there is nothing to check", file=folder)


def read_loadings(source: str | Path, fleet: Fleet) -> tuple[Iterator[FlightRow], list[str]]:
    """Read a day of loadings: a CSV file, or a folder of loading files.

    The header is read at once; the rows come one at a time, as they are read (the
    iterator holds the file open until it ends).

    Returns
    -------
    (rows, file problems)
        An iterator of every row, usable or not; and problems of the file as a whole (an
        unknown column).

    Raises
    ------
    FileFormatError
        When the source cannot be read at all (missing, not an ordinary file, not UTF-8,
        not comma-separated, no header, no registration column); from the iterator, when
        the file goes wrong further on or holds no flight at all (nothing to check).
    """
    source = Path(source)
    if source.is_dir():
        return _folder_rows(source, fleet), []
    return _csv_rows(source, fleet)


@dataclass(frozen=True)
class Flight:
    """The outcome of one flight: the check as the log stores it, or the reasons it could not be made."""

    row: FlightRow
    stored: Stored | None  # the check's JSON text and verdict (checklog.stored); None: not checked
    problems: list[str]
    record_id: int | None = None

    @cached_property
    def result(self) -> dict[str, Any] | None:
        """The check's JSON form (that of ``check --json``; of a trip, ``legs`` and the trip's ``ok``)."""
        return None if self.stored is None else orjson.loads(self.stored.result)

    @property
    def ok(self) -> bool:
        """Checked and within limits."""
        return self.stored is not None and self.stored.ok

    @property
    def is_trip(self) -> bool:
        """A trip of several legs (its result is a trip's: ``legs`` and the trip's ``ok``)."""
        return self.result is not None and "legs" in self.result

    @property
    def warnings(self) -> list[str]:
        """The check's warnings (a tank taken as empty, landing fuel below the reserve), each
        naming its leg in a trip: a flight within limits that has any is not simply "within"."""
        if self.result is None:
            return []
        return [f["message"] for f in self.result["findings"] if f["severity"] == "warning"]

    def brief(self) -> Flight:
        """This flight with only what a one-line summary shows (verdict, units, each condition's
        weight, CG and lateral CG where the aircraft has lateral arms, each finding's code,
        severity and words; for a trip, those of each leg), for holding many flights at once."""
        row = self.row.without_loading()
        kept = None
        if self.stored is not None and self.result is not None:
            result = _brief(self.result)
            if self.is_trip:
                result["legs"] = [
                    _brief(leg) | {"leg": leg["leg"], "label": leg.get("label")} for leg in self.result["legs"]
                ]
                del result["conditions"]
            kept = self.stored._replace(result=orjson.dumps(result).decode(), inputs=None)
        return Flight(row, kept, self.problems, self.record_id)

    def _head(self) -> dict[str, Any]:
        """Where the flight came from: the fields a JSON line gives before the check's."""
        head: dict[str, Any] = {
            "line": self.row.line,
            "source": self.row.source,
            "registration": self.row.registration,
            "reference": self.row.reference,
            "pilot": self.row.pilot,
        }
        if self.row.date is not None:
            head["date"] = self.row.date
        if self.row.trip is not None:
            head |= {"trip_id": self.row.trip, "lines": list(self.row.lines)}
        return head

    def to_dict(self) -> dict[str, Any]:
        """The JSON Lines object: the fields of ``check --json`` (of a trip: ``legs`` and the trip's
        ``ok``) and where the flight came from (a trip's ``trip_id`` and the ``lines`` of its legs)."""
        head = self._head()
        if self.result is None:
            return {**head, "ok": False, "input_error": self.problems}
        head.update(self.result)  # a key of both keeps its place and takes the result's value, as {**head, **result}
        if self.record_id is not None:
            head["record"] = self.record_id
        return head

    def json_line(self) -> bytes:
        """:meth:`to_dict` as one line of JSON (UTF-8, newline at the end), written from the stored
        text of the check as it is: the record and the line are one serialization."""
        if self.stored is None:
            return orjson.dumps(self.to_dict(), option=orjson.OPT_APPEND_NEWLINE)
        head = orjson.dumps(self._head())
        tail = self.stored.result.encode()
        if self.record_id is not None:
            tail = b'%s,"record":%d}' % (tail[:-1], self.record_id)
        return b"%s,%s\n" % (head[:-1], tail[1:])


def _brief(result: dict[str, Any]) -> dict[str, Any]:
    """What a one-line summary shows of a check's JSON form (see :meth:`Flight.brief`)."""
    return {
        "ok": result["ok"],
        "category": result.get("category"),
        "units": result["units"],
        "conditions": [
            {k: c[k] for k in ("condition", "weight", "arm", "lateral_arm") if k in c}
            for c in result.get("conditions", ())
        ],
        "findings": [{k: f[k] for k in ("code", "severity", "message", "leg") if k in f} for f in result["findings"]],
    }


CHUNK = 1024
"""Flights checked, recorded (one transaction) and reported together (each aircraft's rows of a
chunk are explained together: the more rows, the fewer numpy calls a row; docs/performance.md)."""

IN_FLIGHT = 2
"""Chunks handed to each worker process ahead of the one being reported."""

PARENT_POLL = 0.2
"""How often a worker process looks whether its parent is still alive [s]."""

_FLEET: Fleet | None = None  # the fleet, inherited by worker processes
_READING: _CsvReading | None = None  # how the CSV being checked is read, inherited by worker processes
_RECORDING = False  # the checks are recorded: their inputs are stored with them (inherited by workers)


def default_workers() -> int:
    """Processes a fleet check uses unless told: two where the machine gives this process two
    cores or more, else one.

    Measured (docs/performance.md, benchmarks/fleet.py): a worker is given each flight's CSV
    records as read and sends back the check's stored JSON text, so little crosses between the
    processes, and two workers cut the wall time of a long day by about a third, for about a
    sixth more CPU time. Workers start only once
    a second chunk of flights comes: a short day is checked in this process alone.
    """
    try:
        cores = len(os.sched_getaffinity(0))
    except AttributeError:  # not on every platform
        cores = os.cpu_count() or 1
    return 2 if cores >= 2 else 1


def _inputs_of(row: FlightRow) -> dict[str, Any] | None:
    """The inputs of a checked flight as the log records them; None where nothing is recorded."""
    return recorded_inputs(row.loading) if _RECORDING and row.loading is not None else None


def _outcome(row: FlightRow, result: dict[str, Any]) -> Stored:
    """A checked flight's result as the log stores it, with its inputs where they are recorded."""
    return stored(result, _inputs_of(row))


def _check_chunk(rows: list[FlightRow]) -> list[tuple[Stored | None, list[str]]]:
    """Check a chunk of rows (the one place that decides how a row is checked).

    Each usable row is resolved against its aircraft; the rows of each aircraft are then
    checked together (:func:`~loadcheck.check.check_columns`: the engine once for all of
    them, each result the one :func:`~loadcheck.check.check_loading` gives for its row).
    """
    # No pass of the cycle collector while a chunk is checked: its rows, results and their JSON
    # forms hold no cycle and are freed by reference counting once the chunk is reported, but the
    # collector went over the live ones some 25 times a chunk (about 0.1 s of CPU at 10,000 rows,
    # a tenth of a check's; measured with gc.callbacks). Unlike checklog's _no_cycle_collection,
    # nothing is frozen here: check_flights keeps what existed before the check frozen, and a
    # cycle made here is found by the next ordinary pass.
    enabled = gc.isenabled()
    gc.disable()
    try:
        return _checked_rows(rows)
    finally:
        if enabled:
            gc.enable()


def _checked_rows(rows: list[FlightRow]) -> list[tuple[Stored | None, list[str]]]:
    """:func:`_check_chunk`'s work (there, with the cycle collector held off)."""
    assert _FLEET is not None
    out: list[tuple[Stored | None, list[str]]] = [(None, [])] * len(rows)
    by_aircraft: dict[str, tuple[Aircraft, list[int], list[Any]]] = {}
    for index, row in enumerate(rows):
        if row.problems or row.loading is None or row.registration is None:
            out[index] = (None, row.problems or ["this row cannot be used"])
            continue
        try:
            aircraft = _FLEET.aircraft(row.registration)
            if row.loading.leg:  # a trip: every leg checked as a single loading is (check_trip)
                from .trip import check_trip

                out[index] = (_outcome(row, check_trip(aircraft, row.loading, samples=False).to_dict()), [])
                continue
            resolved = resolve_loading(row.loading, aircraft)
        except LoadcheckError as error:
            out[index] = (None, [_row_problem(row, p) for p in error.problems])
            continue
        group = by_aircraft.setdefault(row.registration, (aircraft, [], []))
        group[1].append(index)
        group[2].append(resolved)
    for aircraft, indices, resolved_rows in by_aircraft.values():
        # each result's JSON text written from the chunk's columns (result_json: the text of
        # result.to_dict(), byte for byte), not from objects built for each row
        written: dict[int, list[bytes]] = {}
        for index, (columns, k) in zip(indices, check_columns(aircraft, resolved_rows, samples=False), strict=True):
            texts = written.get(id(columns))
            if texts is None:
                texts = written[id(columns)] = result_texts(columns)
            out[index] = (
                stored_text(texts[k].decode(), columns.ok[k], columns.category[k], _inputs_of(rows[index])),
                [],
            )
    return out


def _check_rows(rows: list[FlightRow]) -> list[tuple[FlightRow, tuple[Stored | None, list[str]]]]:
    """Each row of a chunk with its outcome (:func:`_check_chunk`)."""
    return list(zip(rows, _check_chunk(rows), strict=True))


def _check_units(units: list[_Unit]) -> list[tuple[FlightRow, tuple[Stored | None, list[str]]]]:
    """A worker's job: read each flight of a chunk from its CSV records, check the chunk
    (:func:`_check_chunk`) and give back each row, without its loading model (the stored
    inputs carry it), with its outcome."""
    assert _FLEET is not None and _READING is not None
    rows = [_READING.flight(unit, _FLEET) for unit in units]
    return [(row.without_loading(), outcome) for row, outcome in zip(rows, _check_chunk(rows), strict=True)]


def _row_problem(row: FlightRow, problem: Problem) -> str:
    """A problem of a row's loading, named by its row: for a trip of a CSV, the row of the leg
    the field belongs to (``leg 2, burn``: loadcheck.loading.leg_field), and the trip's rows where no leg is named."""
    match = re.match(r"leg (\d+)(?:,|$)", problem.field or "")
    if match:
        return f"{row.where(int(match.group(1)))}: {problem.describe()}"
    if row.loading is not None and row.loading.leg and row.trip is not None:
        return f"{row.where()}: trip {row.trip!r}: {problem.describe()}"
    return f"{row.where()}: {problem.describe()}"


def _end_with_parent(parent: int) -> None:
    """Worker start-up: end this process when its parent ends, however it ends (SIGKILL too).

    A worker whose parent is killed is handed to another parent; it would wait for work for
    ever, holding its memory. A daemon thread looks every :data:`PARENT_POLL` seconds.
    """

    def watch() -> None:
        while os.getppid() == parent:
            time.sleep(PARENT_POLL)
        os._exit(1)

    threading.Thread(target=watch, name="loadcheck-parent-watch", daemon=True).start()


def _chunks(items: Iterable[Any]) -> Iterator[list[Any]]:
    iterator = iter(items)
    while chunk := list(itertools.islice(iterator, CHUNK)):
        yield chunk


def _checked(
    rows: Iterable[FlightRow], workers: int
) -> Iterator[list[tuple[FlightRow, tuple[Stored | None, list[str]]]]]:
    """Each chunk's rows with their outcomes, in order; at most ``workers * IN_FLIGHT`` chunks held.

    With more than one worker, worker processes (forked, where the platform can) start only
    once a second chunk comes, and end with their parent. The rows of a CSV file are handed
    to them as the csv module read them (:func:`_check_units`), and come back without their
    loading models: reading and checking are both done where the flight is checked.
    """
    global _READING
    import multiprocessing

    parallel = workers > 1 and "fork" in multiprocessing.get_all_start_methods()
    job: Any = _check_rows
    chunks: Iterator[list[Any]]
    if parallel and isinstance(rows, _CsvRows):
        _READING, job, chunks = rows.reading, _check_units, _chunks(rows.units())
    else:
        chunks = _chunks(rows)
    first = next(chunks, None)
    if first is None:
        return
    second = next(chunks, None) if parallel else None
    if second is None:  # one process, or only one chunk: checked here, as a worker would
        yield job(first)
        for chunk in chunks:
            yield job(chunk)
        return
    from concurrent.futures import ProcessPoolExecutor

    pool = ProcessPoolExecutor(
        max_workers=workers,
        mp_context=multiprocessing.get_context("fork"),
        initializer=_end_with_parent,
        initargs=(os.getpid(),),
    )
    try:
        pending: deque[Any] = deque()
        try:
            for chunk in itertools.chain((first, second), chunks):
                pending.append(pool.submit(job, chunk))
                if len(pending) >= workers * IN_FLIGHT:
                    yield pending.popleft().result()
        except LoadcheckError:  # the file went wrong further on: the chunks read before it are reported first
            while pending:
                yield pending.popleft().result()
            raise
        while pending:
            yield pending.popleft().result()
    finally:
        pool.shutdown(wait=True, cancel_futures=True)
        _READING = None


def check_flights(
    fleet: Fleet, rows: Iterable[FlightRow], log: Any = None, version: str = "", workers: int = 1
) -> Iterator[Flight]:
    """Check every usable row, in order; record each check in ``log`` where one is given.

    Flights go in chunks of :data:`CHUNK`: a chunk is checked (by ``workers`` processes
    where more than one is asked for and the platform can fork), recorded in one
    transaction, and only then yielded, so everything reported has been recorded, and an
    interrupted batch leaves every earlier chunk recorded whole. ``rows`` is consumed as
    the checks go (a few chunks ahead), so a day of any length is checked in bounded
    memory; worker processes end when their parent does, even when it is killed.
    """
    global _FLEET, _RECORDING
    _FLEET, _RECORDING = fleet, log is not None
    # What exists before the check (the modules, the fleet's models) is set apart from the cycle
    # collector while it runs (gc.freeze): a chunk's thousands of rows and results, alive until
    # the chunk is reported, made its collections go over all of that again and again (about a
    # tenth of the CPU at chunks of 1,024). Set back as it was found once the check ends.
    freezing = gc.isenabled() and gc.get_freeze_count() == 0
    if freezing:
        gc.freeze()
    try:
        for checked in _checked(rows, workers):
            ids: list[int | None] = [None] * len(checked)
            if log is not None:
                entries = []
                for index, (row, (kept, _)) in enumerate(checked):
                    if kept is None or row.registration is None:
                        continue
                    aircraft = fleet.aircraft(row.registration)
                    entries.append(
                        (
                            index,
                            {
                                "aircraft_data": (lambda a=aircraft: a.model_dump(mode="json")),
                                "fingerprint": aircraft.fingerprint,
                                "stored": kept,  # the inputs as given (loading.recorded_inputs) and the result
                                # the aircraft's own, as `check --log` records it and `log verify` compares it
                                # (the row may write it in another case, or without its hyphen)
                                "registration": aircraft.registration or row.registration,
                                "reference": row.reference,
                                "pilot": row.pilot,
                                "source": f"{row.source}:{','.join(map(str, row.lines or (row.line,)))}",
                                "version": version,
                                "flight_date": row.date,
                            },
                        )
                    )
                for (index, _), record_id in zip(entries, log.add_many([e for _, e in entries]), strict=True):
                    ids[index] = record_id
            for (row, (kept, problems)), record_id in zip(checked, ids, strict=True):
                yield Flight(row, kept, problems, record_id)
    finally:
        _FLEET, _RECORDING = None, False
        if freezing:
            gc.unfreeze()


def record_age_days(aircraft: Aircraft, today: dt.date | None = None) -> int | None:
    """Days since the empty-weight record's date (None where the record is not dated)."""
    if aircraft.empty.date is None:
        return None
    return ((today or dt.date.today()) - aircraft.empty.date).days


@dataclass(frozen=True)
class AircraftSummary:
    """One aircraft of a fleet listing: its figures (mass unit of its own file) and problems."""

    file: str
    registration: str | None
    name: str | None
    empty_weight: float | None
    record_date: str | None
    useful_load: float | None
    fingerprint: str | None
    mass_unit: str | None
    problems: list[str]
    usable: bool

    def to_dict(self) -> dict[str, Any]:
        """JSON form."""
        return {k: getattr(self, k) for k in self.__dataclass_fields__}


def fleet_listing(fleet: Fleet, max_age_days: int | None = None, today: dt.date | None = None) -> list[AircraftSummary]:
    """The fleet, aircraft by aircraft, with every problem flagged.

    ``max_age_days``: an empty-weight record older than this many days is flagged (at least 1;
    None, as the command line and the desk give when none is asked for: :data:`RECORD_AGE_DAYS`).
    A record dated after today is flagged too: after ``today`` where it is given, else after
    the latest date anywhere on Earth (:func:`~loadcheck.weighing.latest_date`).

    Raises
    ------
    InputError
        For a ``max_age_days`` below 1.
    """
    if max_age_days is None:
        max_age_days = RECORD_AGE_DAYS
    if not max_age_days >= 1:
        raise InputError(Problem("max_age", "must be at least 1 day", value=max_age_days))
    duplicates = fleet.duplicates
    lines = []
    for entry in fleet.entries:
        flags = list(entry.problems)
        key = registration_key(entry.registration) if entry.registration else None
        if key in duplicates:
            others = ", ".join(str(p) for p in duplicates[key] if p != entry.path)
            flags.append(f"registration also in {others}")
        a = entry.aircraft
        age = record_age_days(a, today) if a is not None else None
        if a is not None and age is None:
            flags.append("the empty-weight record is not dated")
        elif a is not None and a.empty.date is not None and a.empty.date > (today or latest_date()):
            flags.append(f"the empty-weight record is dated {a.empty.date.isoformat()}, after today: check its date")
        elif age is not None and age > max_age_days:
            flags.append(f"empty-weight record is {age} days old (more than {max_age_days})")
        lines.append(
            AircraftSummary(
                file=str(entry.path),
                registration=entry.registration,
                name=a.name if a else None,
                empty_weight=a.empty.weight if a else None,
                record_date=a.empty.date.isoformat() if a and a.empty.date else None,
                useful_load=a.useful_load if a else None,
                fingerprint=a.fingerprint if a else None,
                mass_unit=a.units.mass if a else None,
                problems=flags,
                usable=a is not None and key not in duplicates,
            )
        )
    return lines
