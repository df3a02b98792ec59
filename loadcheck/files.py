"""Reading and writing loadcheck's files, with errors that name the file and field.

Reading: :func:`read_toml` refuses files that are missing, too large, not UTF-8 or not
valid TOML, with the line and column from the TOML parser. :func:`load_aircraft` and
:func:`load_loading` validate the content and turn every pydantic error into a
:class:`~loadcheck.errors.Problem` with a dotted field path (``station[2].max_weight``).

Writing: :func:`write_atomic` writes a whole file or nothing: the new content goes to a
temporary file in the same folder, is flushed to disk, and replaces the old file in one
``os.replace``; if anything fails the old file is left byte for byte.
"""

from __future__ import annotations

import os
import re
import tempfile
import tomllib
from collections.abc import Mapping
from dataclasses import dataclass, field
from pathlib import Path
from typing import Any

from pydantic import BaseModel, ValidationError

from .aircraft import Aircraft, Units
from .errors import FileFormatError, InputError, LoadcheckError, Problem
from .loading import Loading, ResolvedLoading, apply_overrides, resolve_loading

__all__ = [
    "MAX_FILE_BYTES",
    "CheckInputs",
    "file_kind",
    "load_aircraft",
    "load_aircraft_for_update",
    "load_check_inputs",
    "load_loading",
    "parse_aircraft",
    "parse_loading",
    "problems_from_validation",
    "read_text",
    "read_toml",
    "validate_file",
    "write_atomic",
]

MAX_FILE_BYTES = 5 * 1024 * 1024
"""Largest input file read [bytes]; aircraft and loading files are a few kilobytes."""


def read_text(path: str | Path, *, limit: int = MAX_FILE_BYTES) -> str:
    """Read a UTF-8 text file, refusing missing, oversized, binary or non-UTF-8 files.

    Raises
    ------
    FileFormatError
        With the file name and the reason.
    """
    path = Path(path)
    try:
        if path.is_dir():
            raise FileFormatError("is a folder, not a file", file=path)
        size = path.stat().st_size
        if size > limit:
            raise FileFormatError(f"file is too large ({size:,} bytes; at most {limit:,})", file=path)
        raw = path.read_bytes()
    except FileNotFoundError:
        raise FileFormatError("file not found", file=path) from None
    except PermissionError:
        raise FileFormatError("permission denied", file=path) from None
    except OSError as error:
        raise FileFormatError(f"cannot read the file: {error.strerror or error}", file=path) from None
    if b"\x00" in raw:
        raise FileFormatError("this is a binary file, not a text file", file=path)
    try:
        return raw.decode("utf-8-sig")
    except UnicodeDecodeError as error:
        raise FileFormatError(f"not UTF-8 text (bad byte at offset {error.start})", file=path) from None


def read_toml(path: str | Path) -> dict[str, Any]:
    """Read a TOML file into plain data.

    Raises
    ------
    FileFormatError
        With the parser's message, which gives the line and column.
    """
    text = read_text(path)
    try:
        return tomllib.loads(text)
    except tomllib.TOMLDecodeError as error:
        raise FileFormatError(f"TOML syntax error: {error}", file=path) from None


_TAG = re.compile(r"\[|^(str|float|int|bool)$")  # pydantic's names for union branches and wrapped validators
_PATH_PREFIX = re.compile(r"^([A-Za-z_][\w.\[\]]*): (.+)$")


def _field_path(location: tuple[Any, ...]) -> str:
    """``("station", 2, "max_weight")`` -> ``station[2].max_weight``."""
    text = ""
    for part in location:
        if isinstance(part, int):
            text += f"[{part}]"
        elif not _TAG.search(str(part)):
            text += f".{part}" if text else str(part)
    return text


def problems_from_validation(error: ValidationError) -> list[Problem]:
    """Turn a pydantic ValidationError into problems with dotted field paths.

    A union field is reported once, with its first reason. Whole-model checks (a group
    naming an unknown station) come as lines ``path: message``; each becomes a problem
    of that path.
    """
    problems: list[Problem] = []
    seen: set[tuple[str, str]] = set()
    for item in error.errors(include_url=False):
        field = _field_path(tuple(item.get("loc", ())))
        kind = item.get("type")
        message = str(item.get("msg", "invalid value")).removeprefix("Value error, ")
        if kind == "missing":
            message = "this field is required"
        elif kind == "extra_forbidden":
            message = "unknown field (misspelt?)"
        if (field, message) in seen:
            continue
        seen.add((field, message))
        if not field:
            for line in message.splitlines():
                match = _PATH_PREFIX.match(line)
                problems.append(Problem(match.group(1), match.group(2)) if match else Problem("", line))
            continue
        value = item.get("input") if kind not in ("missing", "model_type", "dict_type") else None
        problems.append(Problem(field, message, None if isinstance(value, (dict, list)) else value))
    return problems


def _validate(model: type[BaseModel], data: Any, file: str | Path | None, context: dict[str, Any] | None = None) -> Any:
    try:
        return model.model_validate(data, context=context)
    except ValidationError as error:
        raise InputError(problems_from_validation(error), file=file) from None
    except LoadcheckError as error:
        raise error.with_file(file) if file else error from None


def parse_aircraft(data: Mapping[str, Any], file: str | Path | None = None) -> Aircraft:
    """Validate aircraft data (as read from TOML) into an :class:`Aircraft`."""
    if not isinstance(data, Mapping):
        raise InputError("an aircraft file must be a TOML table", file=file)
    context: dict[str, Any] = {}
    try:
        context["units"] = Units.model_validate(data.get("units"))
    except ValidationError:
        pass  # reported with everything else below
    result: Aircraft = _validate(Aircraft, data, file, context)
    return result


def load_aircraft_for_update(path: str | Path) -> tuple[Aircraft, bytes]:
    """Read an aircraft file for changing it: the model and the exact bytes read.

    The bytes go back to :func:`write_new_record`, which refuses to write if the file no
    longer holds them.
    """
    text = read_text(path)
    try:
        data = tomllib.loads(text)
    except tomllib.TOMLDecodeError as error:
        raise FileFormatError(f"TOML syntax error: {error}", file=path) from None
    return parse_aircraft(data, path), text.encode("utf-8")


def load_aircraft(path: str | Path) -> Aircraft:
    """Read and validate an aircraft file.

    Raises
    ------
    FileFormatError, InputError
        Naming the file, every bad field and its value.
    """
    return parse_aircraft(read_toml(path), path)


def parse_loading(data: Mapping[str, Any], file: str | Path | None = None) -> Loading:
    """Validate loading data (as read from TOML) into a :class:`Loading`."""
    result: Loading = _validate(Loading, data, file)
    return result


def load_loading(path: str | Path | None, **overrides: Any) -> tuple[Loading, Path | None]:
    """Read a loading file (or none) with command-line values on top.

    Parameters
    ----------
    path : the loading file, or None for a loading made of the overrides alone
    overrides : ``load``, ``fuel``, ``burn`` mappings and ``category`` (see
        :func:`~loadcheck.loading.apply_overrides`)

    Returns
    -------
    (Loading, Path or None)
        The loading, and the aircraft file it names (resolved against the loading
        file's folder), if it names one.
    """
    data = read_toml(path) if path is not None else {}
    merged = apply_overrides(data, **overrides)
    loading = parse_loading(merged, path if path is not None else "command line")
    aircraft_path = None
    if loading.aircraft:
        base = Path(path).parent if path is not None else Path.cwd()
        aircraft_path = base / loading.aircraft
    return loading, aircraft_path


@dataclass(frozen=True)
class CheckInputs:
    """An aircraft and a loading resolved against it, ready to check."""

    aircraft: Aircraft
    loading: ResolvedLoading
    loading_file: Path | None = None
    notes: list[str] = field(default_factory=list)
    label: str | None = None
    given: Loading | None = None  # the loading as given (file and options merged), for the record


def load_check_inputs(
    aircraft_path: str | Path, loading_path: str | Path | None = None, **overrides: Any
) -> CheckInputs:
    """Read an aircraft and a loading (file and/or overrides) and resolve one against the other.

    ``aircraft_path`` may also be a loading file that names its aircraft
    (``aircraft = "trainer.toml"``), when no separate loading file is given.

    Raises
    ------
    LoadcheckError
        Naming the file (or "command line") and every problem found.
    """
    notes: list[str] = []
    data = read_toml(aircraft_path)
    if loading_path is None and file_kind(data) == "loading":
        loading_path = aircraft_path
        loading, named = load_loading(loading_path, **overrides)
        if named is None:
            raise InputError(
                Problem("aircraft", "this loading file names no aircraft file; give the aircraft file first"),
                file=loading_path,
            )
        try:
            named_data = read_toml(named)
        except LoadcheckError as error:
            reason = "; ".join(p.describe() for p in error.problems)
            raise InputError(Problem("aircraft", f"names {named}, which cannot be read: {reason}"),
                             file=loading_path) from None
        if file_kind(named_data) != "aircraft":
            raise InputError(Problem("aircraft", f"names {named}, which is not an aircraft file"), file=loading_path)
        aircraft = parse_aircraft(named_data, named)
    else:
        aircraft = parse_aircraft(data, aircraft_path)
        loading, named = load_loading(loading_path, **overrides)
        if named is not None and named.resolve() != Path(aircraft_path).resolve():
            notes.append(f"the loading names {named}, but {aircraft_path} was given and is used")
    try:
        resolved = resolve_loading(loading, aircraft, category=overrides.get("category"))
    except LoadcheckError as error:
        raise error.with_file(loading_path if loading_path is not None else "command line") from None
    label = loading.label or (Path(loading_path).stem if loading_path is not None else None)
    return CheckInputs(aircraft, resolved, Path(loading_path) if loading_path else None, notes, label, loading)


def validate_file(path: str | Path) -> str:
    """Validate one aircraft or loading file; return a one-line summary.

    A loading that names its aircraft is resolved against it (names, capacities).

    Raises
    ------
    LoadcheckError
        Listing every problem found in the file.
    """
    data = read_toml(path)
    kind = file_kind(data)
    if kind == "aircraft":
        aircraft = parse_aircraft(data, path)
        return (
            f"aircraft {aircraft.name!r}, {len(aircraft.station)} station{'' if len(aircraft.station) == 1 else 's'}, "
            f"{len(aircraft.tank)} tank{'' if len(aircraft.tank) == 1 else 's'}, "
            f"categories {', '.join(aircraft.categories)}"
        )
    if kind == "loading":
        inputs = load_check_inputs(path) if data.get("aircraft") else None
        if inputs is None:
            parse_loading(data, path)
            return "loading (names no aircraft, so station and tank names were not checked)"
        return f"loading for {inputs.aircraft.name!r}"
    if kind in ("readings", "changes"):
        named = data.get("aircraft")
        if not named:
            from .alterations import Changes
            from .weighing import Readings

            _validate(Readings if kind == "readings" else Changes, data, path)
            return f"{kind} (names no aircraft, so tanks, equipment and units were not checked)"
        aircraft = load_aircraft(Path(path).parent / str(named))
        (load_readings if kind == "readings" else load_changes)(path, aircraft)
        return f"{kind} for {aircraft.name!r}"
    raise InputError("cannot tell what this file is: no [units]/[empty]/[[envelope]] (aircraft), no [load]/[fuel]/[burn] "
                     "(loading), no [[point]] (readings) and no [[change]] (changes)", file=path)


def file_kind(data: Mapping[str, Any]) -> str:
    """Guess what a TOML file holds: ``aircraft``, ``loading``, ``readings``, ``changes`` or ``unknown``."""
    if "units" in data or "envelope" in data or "empty" in data:
        return "aircraft"
    if "point" in data:
        return "readings"
    if "change" in data:
        return "changes"
    if any(k in data for k in ("load", "fuel", "burn", "aircraft")):
        return "loading"
    return "unknown"


def write_atomic(path: str | Path, content: str | bytes) -> None:
    """Replace a file's content all at once, or leave it as it was.

    The content is written to a temporary file beside the target, flushed and synced,
    then renamed over the target (``os.replace``, atomic on POSIX and Windows). On any
    error the temporary file is removed and the target is untouched.

    Raises
    ------
    FileFormatError
        When the file cannot be written (full disk, no permission), naming the file.
    """
    path = Path(path)
    data = content.encode("utf-8") if isinstance(content, str) else content
    folder = path.parent if str(path.parent) else Path(".")
    try:
        handle, temporary = tempfile.mkstemp(prefix=f".{path.name}.", suffix=".tmp", dir=folder)
    except OSError as error:
        raise FileFormatError(f"cannot write here: {error.strerror or error}", file=path) from None
    try:
        with os.fdopen(handle, "wb") as stream:
            stream.write(data)
            stream.flush()
            os.fsync(stream.fileno())
        if path.exists():
            os.chmod(temporary, path.stat().st_mode & 0o7777)
        os.replace(temporary, path)
    except OSError as error:
        try:
            os.unlink(temporary)
        except OSError:
            pass
        raise FileFormatError(f"could not write the file, it is unchanged: {error.strerror or error}", file=path) from None


# -- the mechanic's files ------------------------------------------------------------------


def load_readings(path: str | Path, aircraft: Aircraft) -> Any:
    """Read and validate a readings file (quantities with units use the aircraft's units)."""
    from .weighing import Readings

    return _validate(Readings, read_toml(path), path, {"units": aircraft.units})


def load_changes(path: str | Path, aircraft: Aircraft) -> Any:
    """Read and validate a changes file (quantities with units use the aircraft's units)."""
    from .alterations import Changes

    return _validate(Changes, read_toml(path), path, {"units": aircraft.units})


def _plain(value: Any) -> Any:
    """Data fit for TOML: no None values (TOML has no null)."""
    if isinstance(value, dict):
        return {k: _plain(v) for k, v in value.items() if v is not None}
    if isinstance(value, list):
        return [_plain(v) for v in value if v is not None]
    return value


def write_new_record(
    path: str | Path,
    original: bytes,
    *,
    weight: float,
    arm: float,
    lateral_arm: float | None,
    date: Any,
    reason: str,
    inputs: Mapping[str, Any],
    equipment: list[dict[str, Any]] | None = None,
) -> None:
    """Make a new empty-weight record current and keep the old one in ``[[history]]``.

    The file keeps its comments and layout (tomlkit). It is written atomically
    (:func:`write_atomic`), and only if it still holds exactly ``original``: a file that
    changed since it was read is refused, and nothing is written. The new content is
    validated as an aircraft file before it replaces the old one.

    Raises
    ------
    FileFormatError
        The file changed since it was read, or could not be written (it is unchanged).
    """
    import datetime as dt

    import tomlkit

    path = Path(path)
    doc = tomlkit.parse(original.decode("utf-8"))
    previous = _plain(dict(doc["empty"].unwrap()))  # type: ignore[union-attr]
    entry = tomlkit.table()
    entry["recorded"] = dt.datetime.now().astimezone().replace(microsecond=0)
    entry["reason"] = reason
    entry["new_weight"] = round(weight, 4)
    entry["new_arm"] = round(arm, 4)
    entry["previous"] = previous
    entry["inputs"] = _plain(dict(inputs))
    empty = doc["empty"]
    empty["weight"] = round(weight, 4)  # type: ignore[index]
    empty["arm"] = round(arm, 4)  # type: ignore[index]
    if lateral_arm is not None:
        empty["lateral_arm"] = round(lateral_arm, 4)  # type: ignore[index]
    if date is not None:
        empty["date"] = date  # type: ignore[index]
    if "history" not in doc:
        doc["history"] = tomlkit.aot()
    doc["history"].append(entry)  # type: ignore[union-attr]
    if equipment is not None:
        table = tomlkit.aot()
        for item in equipment:
            table.append(_plain(item))
        doc["equipment"] = table
    text = tomlkit.dumps(doc)
    parse_aircraft(tomllib.loads(text), path)  # fail closed: never write a file we could not read back
    try:
        current = path.read_bytes()
    except OSError as error:
        raise FileFormatError(f"cannot read the file again before writing: {error.strerror or error}", file=path) from None
    if current.decode("utf-8-sig", errors="replace").encode("utf-8") != original:
        raise FileFormatError("the file changed since it was read; nothing was written (run the command again)", file=path)
    write_atomic(path, text)
