"""The aircraft's empty-weight record: a new one from a weighing or from equipment changes,
what it takes to make it current, the record to sign, and the history.

These are the mechanic's jobs, for any front end (the command line, the web desk):

- :func:`propose` reads the aircraft file and a readings or changes file and computes the
  new record (:func:`~loadcheck.weighing.weigh`, :func:`~loadcheck.alterations.alter`),
  with the warnings and the refusals of :func:`~loadcheck.weighing.record_checks`;
- :func:`make_current` writes it into the aircraft file, keeping the old one in the
  history. It needs a confirmation (a person saw the old and the new record and said
  yes: the front end asks, or is told so explicitly), and an explicit override for a
  record that the checks refuse; the override is kept in the history with who made the
  record, when and why. A record whose empty weight reaches the maximum takeoff weight is
  never written: the aircraft file would be refused;
- :func:`write_record_sheet` writes the printable record to sign;
- :func:`history` lists the empty-weight records, oldest first.

The history keeps what the record needs, bounded: the computed inputs (points, corrections
or changes), the note cut to :data:`NOTE_CHARS` characters, the file name and a SHA-256
digest of the readings or changes file as read; where that is still more than
:data:`HISTORY_INPUTS_BYTES`, only the file, its size and digest and a count of its
entries (AC 43.13-1B 10-2 and FAA-H-8083-1B chapter 2 ask for the weighing record and the
equipment changes to be kept with the aircraft's records, not for copies of the files).
"""

from __future__ import annotations

import datetime as dt
import hashlib
from collections.abc import Callable
from dataclasses import dataclass, field
from functools import cached_property
from pathlib import Path
from typing import TYPE_CHECKING, Any, Literal

from pydantic import ValidationError

from .aircraft import Aircraft
from .caution import MECHANIC_CAUTION
from .errors import InputError, LoadcheckError, Problem
from .results import Result

if TYPE_CHECKING:
    from .extremes import ExtremesResult

__all__ = [
    "HISTORY_INPUTS_BYTES",
    "CategoryExtremes",
    "ComparisonRow",
    "NOTE_CHARS",
    "HistoryListing",
    "HistoryRow",
    "NotConfirmedError",
    "OverrideNeededError",
    "Proposal",
    "history",
    "categories_words",
    "make_current",
    "not_computed",
    "propose",
    "write_record_sheet",
]

Kind = Literal["weighing", "alteration"]

NOTE_CHARS = 500
"""Longest note kept in a history entry [characters]; the digest identifies the whole file."""

HISTORY_INPUTS_BYTES = 16 * 1024
"""Largest inputs kept in one history entry [bytes of TOML]; beyond it only the file's digest."""


class NotConfirmedError(LoadcheckError):
    """A record was to be written without the confirmation that a person saw it."""


class OverrideNeededError(LoadcheckError):
    """A record the checks refuse was to be written without an override (or cannot be written at all)."""

    def __init__(self, problems: list[Problem], *, overridable: bool, file: str | Path | None = None):
        super().__init__(problems, file)
        self.overridable = overridable

    def with_file(self, file: str | Path) -> OverrideNeededError:
        """The same error, naming ``file``."""
        return OverrideNeededError(self.problems, overridable=self.overridable, file=file)


def _digest(path: Path) -> tuple[str, int]:
    from .files import read_text

    raw = read_text(path).encode("utf-8")
    return hashlib.sha256(raw).hexdigest(), len(raw)


def _bounded_inputs(source: Path, parsed: Any) -> dict[str, Any]:
    """What the history keeps of a readings or changes file: bounded (module docstring)."""
    import tomlkit

    from .files import _plain

    digest, size = _digest(source)
    data = _plain(parsed.model_dump(mode="python", exclude_none=True, exclude_defaults=True))
    for key in ("aircraft", "format"):
        data.pop(key, None)
    note = data.get("note")
    if isinstance(note, str) and len(note) > NOTE_CHARS:
        data["note"] = note[:NOTE_CHARS]
        data["note_cut"] = (
            f"the note was cut to {NOTE_CHARS} of its {len(note):,} characters; the file's digest identifies it"
        )
    head = {"file": str(source), "sha256": digest, "bytes": size}
    kept = {**head, **data}
    if len(tomlkit.dumps(kept).encode("utf-8")) <= HISTORY_INPUTS_BYTES:
        return kept
    counts = {key: len(value) for key, value in data.items() if isinstance(value, list)}
    return {
        **head,
        "abridged": f"more than {HISTORY_INPUTS_BYTES:,} bytes; kept: the file's digest and its counts",
        **{f"{key}_count": n for key, n in counts.items()},
    }


@dataclass(frozen=True, kw_only=True, slots=True)
class ComparisonRow(Result):
    """One line of the old-and-new comparison shown before writing [aircraft units]; ``change`` is
    ``new - current`` where both are figures (None for the date, or a figure one record lacks)."""

    quantity: str
    unit: str
    current: float | str | None
    new: float | str | None
    change: float | None = None


def _row(quantity: str, unit: str, current: float | str | None, new: float | str | None) -> ComparisonRow:
    """A line of the comparison, with its change where both records give a figure."""
    change = None
    if isinstance(current, (int, float)) and isinstance(new, (int, float)):
        change = float(new - current)
    return ComparisonRow(quantity=quantity, unit=unit, current=current, new=new, change=change)


@dataclass(frozen=True, kw_only=True, slots=True)
class CategoryExtremes(Result):
    """The extreme-loading checks (AC 43.13-1B 10-17) of one category with the new record.

    ``checks`` is :func:`loadcheck.extremes.extremes` of the category, or None with
    ``not_computed`` saying why it could not be made. ``ok`` is the checks' own ``ok`` (every
    extreme within limits and established); ``complete`` is True where every extreme's search
    was complete. Checks not made are neither (fail closed).
    """

    category: str
    ok: bool
    complete: bool
    checks: ExtremesResult | None = None
    not_computed: str | None = None


def not_computed(entries: list[CategoryExtremes]) -> dict[str, list[str]]:
    """Why extreme checks could not be made, each reason with the categories it stopped, in order."""
    found: dict[str, list[str]] = {}
    for entry in entries:
        if entry.not_computed is not None:
            found.setdefault(entry.not_computed, []).append(entry.category)
    return found


def categories_words(names: list[str]) -> str:
    """``the utility category`` or ``the normal and utility categories``."""
    if len(names) == 1:
        return f"the {names[0]} category"
    return f"the {', '.join(names[:-1])} and {names[-1]} categories"


class Proposal:
    """A new empty-weight record, computed and checked, not yet written.

    Attributes
    ----------
    kind : ``weighing`` or ``alteration``
    aircraft_path, source_path : the files it was made from
    aircraft : the aircraft with its current record
    result : the :class:`~loadcheck.weighing.WeighResult` or :class:`~loadcheck.alterations.AlterResult`
    """

    def __init__(
        self,
        kind: Kind,
        aircraft_path: Path,
        source_path: Path,
        aircraft: Aircraft,
        original: bytes,
        parsed: Any,
        result: Any,
    ):
        self.kind = kind
        self.aircraft_path = aircraft_path
        self.source_path = source_path
        self.aircraft = aircraft
        self.original = original
        self.parsed = parsed
        self.result = result

    @property
    def overridable(self) -> bool:
        """True when no refusal is of the kind that no override can lift."""
        return all(r.overridable for r in self.result.refusals)

    @property
    def date(self) -> dt.date | None:
        """The date of the weighing or of the changes (becomes the record's date)."""
        value: dt.date | None = self.parsed.date
        return value

    @property
    def made_by(self) -> str | None:
        """Who weighed or made the changes, as the readings or changes file says."""
        value = self.parsed.weighed_by if self.kind == "weighing" else self.parsed.by
        return None if value is None else str(value)

    @property
    def why(self) -> str | None:
        """The file's own words: the weighing's note or the changes' description."""
        value = self.parsed.note if self.kind == "weighing" else self.parsed.description
        return None if value is None else str(value)

    def comparison(self) -> list[ComparisonRow]:
        """The current and the new record side by side: what a person confirms before writing."""
        units = self.aircraft.units
        old, new = self.result.previous, self.result.new
        rows = [
            _row("empty weight", units.mass, old.weight, new.weight),
            _row("empty-weight CG", units.arm, old.arm, new.arm),
            _row("empty-weight moment", units.moment, old.moment, new.moment),
        ]
        if old.lateral_arm is not None or new.lateral_arm is not None:
            rows.append(_row("lateral CG (+ right)", units.arm, old.lateral_arm, new.lateral_arm))
        rows.append(_row("useful load", units.mass, self.aircraft.useful_load, self.result.useful_load))
        current_date = self.aircraft.empty.date
        rows.append(
            _row(
                "record date",
                "",
                None if current_date is None else str(current_date),
                str(self.date) if self.date is not None else "missing (the date field of the file)",
            )
        )
        return rows

    @cached_property
    def extremes(self) -> list[CategoryExtremes]:
        """The extreme-loading checks (AC 43.13-1B 10-17) with the new record, one per category
        of the aircraft, in the file's order: each is :func:`loadcheck.extremes.extremes` of that
        category, or why it could not be made."""
        from .extremes import extremes

        result = self.result
        try:
            aircraft = self.aircraft.with_empty(result.new.weight, result.new.arm, result.new.lateral_arm)
        except ValidationError as error:  # the new record does not make a valid aircraft
            from .files import problems_from_validation

            reasons = "; ".join(p.describe() for p in problems_from_validation(error))
            why = f"the new record does not make a valid aircraft ({reasons})"
            return [
                CategoryExtremes(category=name, ok=False, complete=False, not_computed=why)
                for name in self.aircraft.categories
            ]
        found = []
        for name in aircraft.categories:
            try:
                checks = extremes(aircraft, category=name)
            except LoadcheckError as error:
                why = "; ".join(p.describe() for p in error.problems)
                found.append(CategoryExtremes(category=name, ok=False, complete=False, not_computed=why))
                continue
            complete = all(case.complete for case in checks.cases)
            found.append(CategoryExtremes(category=name, ok=checks.ok, complete=complete, checks=checks))
        return found

    @property
    def extremes_not_ok(self) -> list[str]:
        """The categories whose extreme checks with the new record are not all within limits,
        or not established, or could not be made."""
        return [entry.category for entry in self.extremes if not entry.ok]

    def to_dict(self) -> dict[str, Any]:
        """The result as JSON data, with the comparison and the extreme checks of each category."""
        return {
            **self.result.to_dict(),
            "kind": self.kind,
            "comparison": [r.to_dict() for r in self.comparison()],
            "extremes": [entry.to_dict() for entry in self.extremes],
        }


def propose(
    aircraft_path: str | Path,
    source_path: str | Path,
    kind: Kind,
    now: dt.datetime | None = None,
    *,
    relative_to: str | Path | None = None,
) -> Proposal:
    """Compute a new empty-weight record from a readings file (``weighing``) or a changes file (``alteration``).

    Nothing is written. ``now`` is the moment the file's date is checked against (default the
    system clock; :func:`~loadcheck.weighing.date_checks`). A readings or changes file that names
    its aircraft (``aircraft = "..."``) is refused for any other aircraft file: a weighing or an
    alteration record belongs to the aircraft weighed or changed, and is never written into
    another's (FAA-H-8083-1B chapter 3, from memory; common practice). The name is read relative to
    ``relative_to`` (default the file's own folder; a front end that keeps the file elsewhere, as
    the desk keeps an upload, gives the folder it stands for) and compared as
    :func:`~loadcheck.files.named_elsewhere` compares a loading's.

    Raises
    ------
    LoadcheckError
        Naming the file and every problem found in it; an ``InputError`` at ``aircraft`` for a file
        that names another aircraft file.
    """
    from .files import load_aircraft_for_update, load_changes, load_readings, named_elsewhere, read_toml

    aircraft_path, source_path = Path(aircraft_path), Path(source_path)
    aircraft, original = load_aircraft_for_update(aircraft_path)
    named = read_toml(source_path).get("aircraft")
    if isinstance(named, str) and named.strip():  # another type, or a blank, is refused by the file's model
        other = named_elsewhere(named, source_path.parent if relative_to is None else relative_to, aircraft_path)
        if other is not None:
            what, record, done = (
                ("readings", "a weighing", "weighed") if kind == "weighing" else ("changes", "an alteration", "changed")
            )
            raise InputError(
                Problem(
                    "aircraft",
                    f"these {what} are for the aircraft file {other}, but the aircraft file given is "
                    f"{aircraft_path}: {record} record belongs to the aircraft {done}, so nothing is "
                    "computed for another; give the aircraft file the file names (or correct its aircraft key)",
                    value=named,
                ),
                file=source_path,
            )
    from .alterations import alter
    from .weighing import weigh

    compute: Callable[[Aircraft, Any, dt.datetime | None], Result]
    if kind == "weighing":
        compute, parsed = weigh, load_readings(source_path, aircraft)
    else:
        compute, parsed = alter, load_changes(source_path, aircraft)
    try:
        result = compute(aircraft, parsed, now)
    except LoadcheckError as error:
        raise error.with_file(source_path) from None
    return Proposal(kind, aircraft_path, source_path, aircraft, original, parsed, result)


def make_current(
    proposal: Proposal,
    *,
    confirmed: bool,
    override: bool = False,
    by: str | None = None,
    note: str | None = None,
) -> Path:
    """Make a proposed record the aircraft's current one; keep the old one in the history.

    Parameters
    ----------
    proposal : from :func:`propose`
    confirmed : a person saw the comparison (:meth:`Proposal.comparison`) and said yes,
        or said so explicitly for an unattended run
    override : write a record that the checks refuse (an overridable refusal); the
        refusals are kept in the history entry
    by : who makes the record (default: the readings' ``weighed_by`` or the changes' ``by``)
    note : why (default: the readings' note or the changes' description)

    Returns
    -------
    Path
        The file written (the target where the aircraft file is a symlink).

    Raises
    ------
    NotConfirmedError
        Without the confirmation; nothing is written.
    OverrideNeededError
        For a refused record without an override, or one no override can write.
    FileFormatError
        When the file changed since it was read, or cannot be written (it is unchanged).
    """
    from .files import write_new_record

    result = proposal.result
    refusals = result.refusals
    where = proposal.source_path
    if not proposal.overridable:
        raise OverrideNeededError(
            [Problem(r.field or "empty", f"not written: {r.message}") for r in refusals if not r.overridable],
            overridable=False,
            file=where,
        )
    if refusals and not override:
        raise OverrideNeededError(
            [Problem(r.field or "empty", f"not written: {r.message}") for r in refusals]
            + [Problem("empty", "an explicit override writes it anyway, and is kept in the history")],
            overridable=True,
            file=where,
        )
    if not confirmed:
        raise NotConfirmedError(
            Problem(
                "empty",
                "not written: a new record is written only once a person has seen the "
                "current and the new record and confirmed",
            ),
            file=proposal.aircraft_path,
        )
    inputs = _bounded_inputs(proposal.source_path, proposal.parsed)
    made_by = by or proposal.made_by
    why = note or proposal.why
    if why is not None and len(why) > NOTE_CHARS:
        why = why[:NOTE_CHARS] + " [cut]"
    return write_new_record(
        proposal.aircraft_path,
        proposal.original,
        weight=result.new.weight,
        arm=result.new.arm,
        lateral_arm=result.new.lateral_arm,
        date=proposal.date,
        reason=proposal.kind,
        inputs=inputs,
        equipment=result.equipment if proposal.kind == "alteration" else None,
        by=made_by,
        note=why,
        overrides=[f"{r.code}: {r.message}" for r in refusals] if override else None,
    )


def write_record_sheet(
    path: str | Path, proposal: Proposal, when: dt.datetime | None = None
) -> tuple[Path, list[CategoryExtremes]]:
    """Write the printable record to sign (HTML), with the extreme-loading checks of the new record.

    Returns
    -------
    (Path, list of CategoryExtremes)
        The file written, and the extreme checks it shows, one per category
        (:attr:`Proposal.extremes`).

    Raises
    ------
    InputError
        For a name that does not end in .html.
    FileFormatError
        When the file cannot be written (it is unchanged).
    """
    from .files import write_atomic
    from .render.sheet import mechanic_sheet_html

    path = Path(path)
    if path.suffix.lower() not in (".html", ".htm"):
        raise InputError(
            Problem("sheet", "the record is an HTML file", value=str(path), expected="a name ending in .html")
        )
    checks = proposal.extremes
    write_atomic(
        path,
        mechanic_sheet_html(
            proposal.result,
            proposal.aircraft.units,
            extremes=checks,
            source=str(proposal.source_path),
            when=when,
            comparison=proposal.comparison(),
        ),
    )
    return path, checks


@dataclass(frozen=True, kw_only=True, slots=True)
class HistoryRow(Result):
    """One empty-weight record: weight [mass unit], arm [arm unit], its date, and what replaced it when."""

    replaced: str
    reason: str
    weight: float
    arm: float
    date: str
    lateral_arm: float | None = None
    by: str | None = None
    note: str | None = None
    overrides: list[str] = field(default_factory=list)


@dataclass(frozen=True, kw_only=True, slots=True)
class HistoryListing(Result):
    """The empty-weight records of an aircraft, oldest first, the current one last."""

    aircraft: str
    registration: str | None
    records: list[HistoryRow]
    units: dict[str, str]
    cg_range: tuple[float, float] | None = None
    warnings: list[str] = field(default_factory=list)
    caution: str = MECHANIC_CAUTION


def history(aircraft: Aircraft) -> HistoryListing:
    """The aircraft's empty-weight records, oldest first, then the current one.

    Each earlier record says when it was replaced, why, by whom and with which overrides.
    """
    from .weighing import current_record_warnings

    rows = [
        HistoryRow(
            replaced=str(h.recorded),
            reason=h.reason,
            weight=h.previous.weight,
            arm=h.previous.arm,
            lateral_arm=h.previous.lateral_arm,
            date=str(h.previous.date or ""),
            by=h.by,
            note=h.note,
            overrides=list(h.overrides),
        )
        for h in aircraft.history
    ]
    empty = aircraft.empty
    rows.append(
        HistoryRow(
            replaced="current",
            reason="",
            weight=empty.weight,
            arm=empty.arm,
            lateral_arm=empty.lateral_arm,
            date=str(empty.date or ""),
        )
    )
    return HistoryListing(
        aircraft=aircraft.name,
        registration=aircraft.registration,
        records=rows,
        units={"mass": aircraft.units.mass, "arm": aircraft.units.arm},
        cg_range=empty.cg_range,
        warnings=current_record_warnings(aircraft),
    )
