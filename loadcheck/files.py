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
import shlex
import stat
import tempfile
import tomllib
from collections.abc import Mapping
from dataclasses import dataclass, field, replace
from pathlib import Path
from typing import Any, BinaryIO, get_args

from pydantic import BaseModel, ValidationError

from .aircraft import Aircraft, Units
from .display import fmt
from .errors import FileFormatError, InputError, LoadcheckError, Problem, UnitError, spelling_hint
from .loading import (
    Loading,
    ResolvedLoading,
    ResolvedTrip,
    apply_overrides,
    leg_field,
    leg_of_field,
    resolve_loading,
    resolve_trip,
)

__all__ = [
    "MAX_FILE_BYTES",
    "MAX_NESTING",
    "RENAMED_KEYS",
    "CheckInputs",
    "allowed_keys",
    "encoding_problem",
    "file_kind",
    "load_aircraft",
    "load_aircraft_for_update",
    "load_check_inputs",
    "load_loading",
    "named_elsewhere",
    "open_regular",
    "parse_aircraft",
    "parse_loading",
    "parse_toml",
    "problems_from_validation",
    "read_text",
    "read_toml",
    "typed_options",
    "Validated",
    "validate",
    "validate_file",
    "write_atomic",
    "write_new_record",
    "write_target",
]

MAX_FILE_BYTES = 5 * 1024 * 1024
"""Largest input file read [bytes]; aircraft and loading files are a few kilobytes."""


def open_regular(path: str | Path, *, limit: int = MAX_FILE_BYTES) -> BinaryIO:
    """Open an ordinary file for reading, refusing anything else.

    A device (``/dev/zero``), a FIFO or a socket is refused before it is read (it could be
    read for ever); a folder, a missing file and a file larger than ``limit`` too. The
    file is opened without blocking (a FIFO put in its place between the look and the
    open is refused as well).

    Raises
    ------
    FileFormatError
        With the file name and the reason.
    """
    path = Path(path)
    try:
        info = os.stat(path)
        _require_regular(info.st_mode, path)
        handle = os.open(
            path, os.O_RDONLY | getattr(os, "O_NONBLOCK", 0) | getattr(os, "O_NOCTTY", 0) | getattr(os, "O_BINARY", 0)
        )
        try:
            info = os.fstat(handle)
            _require_regular(info.st_mode, path)
        except BaseException:
            os.close(handle)
            raise
    except FileNotFoundError:
        raise FileFormatError("file not found", file=path) from None
    except PermissionError:
        raise FileFormatError("permission denied", file=path) from None
    except OSError as error:
        raise FileFormatError(f"cannot read the file: {error.strerror or error}", file=path) from None
    if info.st_size > limit:
        os.close(handle)
        raise FileFormatError(f"file is too large ({info.st_size:,} bytes; at most {limit:,})", file=path)
    return open(handle, "rb", closefd=True)  # the caller closes it


def _require_regular(mode: int, path: Path) -> None:
    if stat.S_ISDIR(mode):
        raise FileFormatError("is a folder, not a file", file=path)
    if not stat.S_ISREG(mode):
        kind = (
            "a character device"
            if stat.S_ISCHR(mode)
            else "a block device"
            if stat.S_ISBLK(mode)
            else "a FIFO (named pipe)"
            if stat.S_ISFIFO(mode)
            else "a socket"
            if stat.S_ISSOCK(mode)
            else "not a file"
        )
        raise FileFormatError(f"is {kind}, not an ordinary file; loadcheck reads only ordinary files", file=path)


def encoding_problem(head: bytes) -> str | None:
    """Why the first bytes of a file are not UTF-8 text loadcheck can read, or None.

    Recognises UTF-16 and UTF-32 (by their byte-order mark, or by the zero bytes every
    other byte of UTF-16 text holds) and binary data (a zero byte).
    """
    for mark, name in (
        (b"\xff\xfe\x00\x00", "UTF-32"),
        (b"\x00\x00\xfe\xff", "UTF-32"),
        (b"\xff\xfe", "UTF-16"),
        (b"\xfe\xff", "UTF-16"),
    ):
        if head.startswith(mark):
            return f"this is {name} text; loadcheck reads UTF-8: save the file as UTF-8"
    sample = head[:4096]
    if b"\x00" not in sample:
        return None
    even, odd = sample[0::2], sample[1::2]
    little_endian = odd.count(0) >= 0.9 * len(odd) > 0 and even.count(0) == 0
    big_endian = even.count(0) >= 0.9 * len(even) > 0 and odd.count(0) == 0
    if len(sample) >= 4 and (little_endian or big_endian):
        return "this looks like UTF-16 text; loadcheck reads UTF-8: save the file as UTF-8"
    return "this is a binary file, not a text file"


def read_text(path: str | Path, *, limit: int = MAX_FILE_BYTES) -> str:
    """Read a UTF-8 text file, refusing missing, special, oversized, binary or non-UTF-8 files.

    At most ``limit`` bytes are read, whatever the file system says of the file's size.

    Raises
    ------
    FileFormatError
        With the file name and the reason.
    """
    with open_regular(path, limit=limit) as stream:
        try:
            raw = stream.read(limit + 1)
        except OSError as error:
            raise FileFormatError(f"cannot read the file: {error.strerror or error}", file=path) from None
    if len(raw) > limit:
        raise FileFormatError(f"file is too large (more than {limit:,} bytes)", file=path)
    problem = encoding_problem(raw)
    if problem:
        raise FileFormatError(problem, file=path)
    try:
        return raw.decode("utf-8-sig")
    except UnicodeDecodeError as error:
        raise FileFormatError(f"not UTF-8 text (bad byte at offset {error.start})", file=path) from None


MAX_NESTING = 32
"""Deepest nesting of tables and arrays read from a file; loadcheck's files nest a few levels."""


def _depth(data: Any) -> int:
    """How deeply tables and arrays nest (counted without recursion)."""
    deepest, stack = 0, [(data, 1)]
    while stack:
        value, depth = stack.pop()
        children = value.values() if isinstance(value, dict) else value if isinstance(value, list) else None
        if children is None:
            continue
        deepest = max(deepest, depth)
        if depth > MAX_NESTING:
            break
        stack.extend((child, depth + 1) for child in children)
    return deepest


def parse_toml(text: str, path: str | Path) -> dict[str, Any]:
    """Parse TOML text read from ``path``, refusing bad syntax and deep nesting.

    Raises
    ------
    FileFormatError
        With the parser's message (line and column), or the nesting found; for a float no float
        holds as written (``1e-400``, :func:`~loadcheck.units.float_as_written`), naming its field
        (``point[2].reading``), as every other refusal of a value does.
    """
    from .units import float_as_written

    unheld: list[_Unheld] = []

    def read_float(number: str) -> Any:
        try:
            return float_as_written(number)
        except UnitError as error:  # kept for now: refused below, once its field is known
            unheld.append(_Unheld(number, "; ".join(p.message for p in error.problems)))
            return unheld[-1]

    try:
        data = tomllib.loads(text, parse_float=read_float)
    except tomllib.TOMLDecodeError as error:
        raise FileFormatError(f"TOML syntax error: {error}", file=path) from None
    except RecursionError:
        raise FileFormatError(
            f"tables or arrays nested too deeply (loadcheck's files nest at most {MAX_NESTING} levels)", file=path
        ) from None
    if _depth(data) > MAX_NESTING:
        raise FileFormatError(
            f"tables or arrays nested more than {MAX_NESTING} levels deep; loadcheck's files nest a few levels",
            file=path,
        )
    if unheld:
        raise FileFormatError(
            [Problem(_field_path(where), found.message) for where, found in _unheld_fields(data)], file=path
        )
    return data


class _Unheld:
    """A float a TOML file writes that no float holds as written (:func:`~loadcheck.units.float_as_written`),
    kept in its place while the file is parsed so that its refusal can name its field."""

    __slots__ = ("message", "number")

    def __init__(self, number: str, message: str):
        self.number, self.message = number, message


def _unheld_fields(data: Any) -> list[tuple[tuple[Any, ...], _Unheld]]:
    """Where the :class:`_Unheld` floats of parsed data are (key and index paths), in file order."""
    found: list[tuple[tuple[Any, ...], _Unheld]] = []
    stack: list[tuple[tuple[Any, ...], Any]] = [((), data)]
    while stack:
        where, value = stack.pop()
        if isinstance(value, _Unheld):
            found.append((where, value))
        children = value.items() if isinstance(value, dict) else enumerate(value) if isinstance(value, list) else ()
        stack.extend(reversed([((*where, key), child) for key, child in children]))
    return found


def read_toml(path: str | Path) -> dict[str, Any]:
    """Read a TOML file into plain data.

    Raises
    ------
    FileFormatError
        With the parser's message, which gives the line and column.
    """
    return parse_toml(read_text(path), path)


_TAG = re.compile(r"\[|^(str|float|int|bool)$")  # pydantic's names for union branches and wrapped validators
_PATH_PREFIX = re.compile(r"^([A-Za-z_][\w.\[\]]*): (.+)$")


def _field_path(location: tuple[Any, ...]) -> str:
    """``("station", 2, "max_weight")`` -> ``station[2].max_weight``; a loading's later leg as the
    user counts legs (:func:`~loadcheck.loading.leg_field`): ``("leg", 0, "burn", "taxi")`` ->
    ``leg 2, burn.taxi``."""
    if len(location) >= 2 and location[0] == "leg" and isinstance(location[1], int):
        return leg_field(location[1] + 2, _field_path(location[2:]))
    text = ""
    for part in location:
        if isinstance(part, int):
            text += f"[{part}]"
        elif not _TAG.search(str(part)):
            text += f".{part}" if text else str(part)
    return text


RENAMED_KEYS = {
    "max_continuous_power_hp": "meto_power_hp",  # rename.py: keep (issue 21: it is the maximum-except-takeoff power)
}
"""Keys of earlier file formats that now have another name: still refused as unknown, with the new name."""


def _models(annotation: Any) -> list[type[BaseModel]]:
    """The models a field's type holds: ``Station``, ``list[Station]``, ``dict[str, Leg]``, ``X | None``."""
    if isinstance(annotation, type) and issubclass(annotation, BaseModel):
        return [annotation]
    return [model for arg in get_args(annotation) for model in _models(arg)]


def _file_model(name: str) -> type[BaseModel] | None:
    """The file model (loadcheck.filemodel.FileModel) of a ValidationError's title."""
    from .filemodel import FileModel

    pending: list[type[BaseModel]] = [FileModel]
    while pending:
        model = pending.pop()
        if model.__name__ == name:
            return model
        pending += model.__subclasses__()
    return None


def allowed_keys(model: type[BaseModel], location: tuple[Any, ...]) -> list[str]:
    """The keys a table takes at ``location`` (pydantic's error location of a key in it).

    Examples
    --------
    >>> from loadcheck.loading import Loading
    >>> allowed_keys(Loading, ("leg", 0, "burn", "taxy"))
    ['taxi', 'trip', 'trip_time', 'rate', 'order', 'reserve']
    """
    current = [model]
    for part in location[:-1]:
        if isinstance(part, int):
            continue  # an index into a list of tables: the same models
        inner = [
            found
            for candidate in current
            if (field := candidate.model_fields.get(str(part))) is not None
            for found in _models(field.annotation)
        ]
        if inner:
            current = inner
    keys: list[str] = []
    for candidate in current:
        keys += [f.alias or name for name, f in candidate.model_fields.items() if (f.alias or name) not in keys]
    return keys


def problems_from_validation(error: ValidationError, model: type[BaseModel] | None = None) -> list[Problem]:
    """Turn a pydantic ValidationError into problems with dotted field paths.

    A union field is reported once, with its first reason. Whole-model checks (a group
    naming an unknown station) come as lines ``path: message``; each becomes a problem
    of that path. An unknown key names the allowed key it is closest to, where one is close
    (:func:`~loadcheck.errors.spelling_hint` against the keys of ``model`` at that place;
    default: the file model the error is of).
    """
    model = model or _file_model(error.title)
    problems: list[Problem] = []
    seen: set[tuple[str, str]] = set()
    for item in error.errors(include_url=False):
        field = _field_path(tuple(item.get("loc", ())))
        kind = item.get("type")
        message = str(item.get("msg", "invalid value")).removeprefix("Value error, ")
        expected = None
        if kind == "missing":
            message = "this field is required"
        elif kind == "bool_type":  # a Flag given as a number or a text (loadcheck.filemodel.Flag)
            message, expected = "a yes/no field", "true or false (a TOML boolean, unquoted)"
        elif kind == "extra_forbidden":
            loc = item.get("loc", ())
            new = RENAMED_KEYS.get(str(loc[-1])) if loc else None
            keys = allowed_keys(model, tuple(loc)) if loc and model else []
            hint = spelling_hint(str(loc[-1]), keys)
            message = f"unknown field (renamed: write {new})" if new else f"unknown field{hint or ' (misspelt?)'}"
            expected = "a key of this table: " + ", ".join(keys) if keys and not (new or hint) else None
        if (field, message) in seen:
            continue
        seen.add((field, message))
        if not field or (kind == "value_error" and _PATH_PREFIX.match(message.partition("\n")[0])):
            # a table's own check, a line per problem naming its place in the table: at the top as
            # it is; inside a table after the table's place (burn + "taxi: ..." -> burn.taxi)
            loc = tuple(item.get("loc", ()))
            for line in message.splitlines():
                match = _PATH_PREFIX.match(line)
                if not match:
                    problems.append(Problem(field, line))
                    continue
                inner = tuple(int(p) if p.isdigit() else p for p in re.findall(r"[^.\[\]]+", match.group(1)))
                problems.append(Problem(_field_path(loc + inner) if loc else match.group(1), match.group(2)))
            continue
        value = item.get("input") if kind not in ("missing", "model_type", "dict_type", "boolean_for_number") else None
        problems.append(Problem(field, message, None if isinstance(value, (dict, list)) else value, expected))
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
    data = parse_toml(text, path)
    _refuse_other_kinds(data, path)
    return parse_aircraft(data, path), text.encode("utf-8")


def load_aircraft(path: str | Path) -> Aircraft:
    """Read and validate an aircraft file.

    Raises
    ------
    FileFormatError, InputError
        Naming the file, every bad field and its value; a file of another kind (a loading,
        readings, changes: :func:`file_kind`) refused as such, not with the aircraft fields it lacks.
    """
    data = read_toml(path)
    _refuse_other_kinds(data, path)
    return parse_aircraft(data, path)


def _refuse_other_kinds(data: Mapping[str, Any], path: str | Path) -> None:
    """Refuse a loading, readings or changes file given where an aircraft file goes, naming the
    aircraft file a loading names (relative to the loading's folder)."""
    kind = file_kind(data)
    if kind in ("aircraft", "unknown"):
        return
    named = data.get("aircraft") if kind == "loading" and isinstance(data.get("aircraft"), str) else None
    raise InputError(
        Problem(
            "",
            f"this is a {kind} file, not an aircraft file: give the aircraft file here"
            + (f"; this loading names {Path(path).parent / named}" if named else ""),
        ),
        file=path,
    )


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
    trip: ResolvedTrip | None = None  # every leg, where the loading is a trip of several legs (allow_trip)

    @property
    def is_trip(self) -> bool:
        """True for a loading of several legs."""
        return self.trip is not None and len(self.trip.legs) > 1


_BURN_OPTIONS = {
    "taxi": "--taxi",
    "trip": "--trip",
    "trip_time": "--trip-time",
    "rate": "--rate",
    "order": "--order",
    "reserve": "--reserve",
}
_LEG_OPTIONS = {"load": "--leg-load", "add_fuel": "--leg-fuel", "burn": "--leg-burn"}
_TRIP_KEYS = ("taxi", "trip", "trip_time", "rate")  # what a problem of a whole burn table is about


def _typed(value: Any) -> str:
    return ",".join(map(str, value)) if isinstance(value, list) else str(value)


def typed_options(overrides: Mapping[str, Any]) -> dict[str, str]:
    """Each command-line value of ``overrides`` (as :func:`load_check_inputs` takes them) by its
    loading field, written as the option the user typed.

    Examples
    --------
    >>> typed_options({"load": {"hold": "20 kg"}, "burn": {"trip_time": "2:00"}})
    {'load.hold': "--load 'hold=20 kg'", 'burn.trip_time': '--trip-time 2:00'}
    >>> typed_options({"legs": {2: {"burn": {"trip": "9"}}}})
    {'leg 2, burn.trip': '--leg-burn 2:trip=9'}
    """
    typed: dict[str, str] = {}
    for table, option in (("load", "--load"), ("fuel", "--fuel")):
        for name, value in (overrides.get(table) or {}).items():
            typed[f"{table}.{name}"] = f"{option} {shlex.quote(f'{name}={_typed(value)}')}"
    for key, value in (overrides.get("burn") or {}).items():
        if key in _BURN_OPTIONS:
            typed[f"burn.{key}"] = f"{_BURN_OPTIONS[key]} {shlex.quote(_typed(value))}"
    if overrides.get("category") is not None:
        typed["category"] = f"--category {shlex.quote(str(overrides['category']))}"
    for number, tables in (overrides.get("legs") or {}).items():
        for table, values in tables.items():
            if table in _LEG_OPTIONS and isinstance(values, Mapping):
                for name, value in values.items():
                    text = shlex.quote(f"{number}:{name}={_typed(value)}")
                    typed[leg_field(number, f"{table}.{name}")] = f"{_LEG_OPTIONS[table]} {text}"
    return typed


def _option_of(field: str, typed: Mapping[str, str]) -> str | None:
    """The command-line option(s) a problem's field is about, as typed; None for the file's own value."""
    if field in typed:
        return typed[field]
    for key, option in typed.items():
        if field.startswith((key + ".", key + "[")):
            return option
    if field == "burn" or field.endswith(", burn"):  # the burn as a whole: its taxi and trip
        given = [typed[f"{field}.{key}"] for key in _TRIP_KEYS if f"{field}.{key}" in typed]
        return " ".join(given) or None
    return None


def _named_as_typed(error: LoadcheckError, typed: Mapping[str, str]) -> LoadcheckError:
    """``error`` with every problem of a command-line value named by its option as typed
    (``--load front=80: unknown station 'front'``): the option shows the value."""
    problems = []
    for problem in error.problems:
        option = _option_of(problem.field, typed)
        if option is not None:
            problems.append(Problem(option, problem.message, None, problem.expected))
            continue
        # a problem of the file's that a typed value brings about names that value as typed too
        # (names.rear: ... expected a weight at load.rear (--load rear=0), where --load rear=0 emptied it)
        expected = problem.expected
        for path, shown in typed.items():
            if expected is not None:
                expected = re.sub(rf"(?<![\w.]){re.escape(path)}(?![\w.])", f"{path} ({shown})", expected)
        problems.append(problem if expected == problem.expected else replace(problem, expected=expected))
    return type(error)(problems, file=error.file)


def _trip_replaced(
    data: Mapping[str, Any], overrides: Mapping[str, Any], typed: Mapping[str, str]
) -> list[tuple[str, str, str]]:
    """Where an override's trip fuel replaces the file's in its other form (a trip time and rate
    for the file's trip, or a trip for its trip time): ``[(field of the burn, what the file
    gave, what replaces it)]`` as words, one per burn table. Command-line values are laid over
    the file's (docs/file-format.md, "Values given on the command line")."""
    tables = [("burn", data.get("burn"), overrides.get("burn"))]
    legs = data.get("leg")
    for number, values in (overrides.get("legs") or {}).items():
        index = number - 2
        file_leg = legs[index] if isinstance(legs, list) and 0 <= index < len(legs) else None
        if isinstance(file_leg, Mapping):
            tables.append((leg_field(number, "burn"), file_leg.get("burn"), values.get("burn")))
    out: list[tuple[str, str, str]] = []
    for where, file_burn, given in tables:
        if not isinstance(file_burn, Mapping) or not isinstance(given, Mapping):
            continue
        option = {key: typed.get(f"{where}.{key}", f"{key} {given[key]!r}") for key in given}
        if "trip_time" in given and "trip" in file_burn and "trip" not in given:
            rate = option["rate"] if "rate" in given else f"the file's rate = {file_burn.get('rate')!r}"
            out.append((where, f"{option['trip_time']} x {rate}", f"trip = {file_burn['trip']!r}"))
        elif "trip" in given and "trip_time" in file_burn:
            file_rate = f" x rate = {file_burn['rate']!r}" if "rate" in file_burn else ""
            out.append((where, option["trip"], f"trip_time = {file_burn['trip_time']!r}{file_rate}"))
    return out


def load_check_inputs(
    aircraft_path: str | Path,
    loading_path: str | Path | None = None,
    *,
    allow_trip: bool = False,
    command_line: bool = False,
    **overrides: Any,
) -> CheckInputs:
    """Read an aircraft and a loading (file and/or overrides) and resolve one against the other.

    ``aircraft_path`` may also be a loading file that names its aircraft
    (``aircraft = "trainer.toml"``), when no separate loading file is given. The override
    ``fuel_to_plan=True`` resolves a loading whose fuel a planning answer will choose
    (:func:`~loadcheck.loading.resolve_loading`). With ``allow_trip`` a loading of several
    legs is resolved leg by leg (``trip``; ``loading`` is its first leg); without it such a
    loading is refused, so that no job checks a trip's first leg alone. With ``command_line``
    the overrides are command-line options: a problem with one is named by the option as the
    user typed it, which shows the value (``--load front=80: unknown station 'front'``,
    :func:`typed_options`). A trip fuel of the overrides that replaces the loading file's in
    its other form (a trip time and rate for the file's trip, or a trip for its trip time) is
    said in ``notes``.

    Raises
    ------
    LoadcheckError
        Naming the file (or "command line") and every problem found.
    """
    notes: list[str] = []
    fuel_to_plan = bool(overrides.pop("fuel_to_plan", False))
    stop_to_plan: int | None = overrides.pop("stop_to_plan", None)
    station_to_plan: str | None = overrides.pop("station_to_plan", None)
    data = read_toml(aircraft_path)
    if loading_path is not None and file_kind(data) == "loading":
        second = file_kind(read_toml(loading_path))
        what = (
            "an aircraft file"
            if second == "aircraft"
            else f"a {second} file"
            if second != "unknown"
            else "not an aircraft file"
        )
        raise InputError(
            Problem(
                "",
                f"the first file is a loading file and the second ({loading_path}) is {what}: "
                "the aircraft file comes first (check AIRCRAFT LOADING)"
                + ("; the two are swapped" if second == "aircraft" else ""),
            ),
            file=aircraft_path,
        )
    typed = typed_options(overrides)

    def read_loading(path: str | Path | None) -> tuple[Loading, Path | None]:
        try:
            return load_loading(path, **overrides)
        except LoadcheckError as error:
            raise _named_as_typed(error, typed) if command_line else error from None

    if loading_path is None and file_kind(data) == "loading":
        loading_path = aircraft_path
        loading, named = read_loading(loading_path)
        aircraft = _named_aircraft(named, loading_path)
    else:
        aircraft = parse_aircraft(data, aircraft_path)
        loading, named = read_loading(loading_path)
        other = named_elsewhere(named, ".", aircraft_path)
        if other is not None and _another_aircraft(other, aircraft):  # which is meant is not guessed
            raise InputError(
                Problem(
                    "aircraft",
                    f"the loading names the aircraft file {named}, but {aircraft_path} was given: two aircraft "
                    f"for one check (an old copy would give the wrong empty weight); check the loading alone to "
                    f"use the one it names, or leave its aircraft key out to check it with {aircraft_path}",
                    value=str(named),
                ),
                file=loading_path,
            )
        if other is not None:
            notes.append(f"the loading names {named}, but {aircraft_path} was given and is used")
    try:
        trip = (
            resolve_trip(loading, aircraft, category=overrides.get("category"), fuel_to_plan=fuel_to_plan)
            if allow_trip and loading.leg
            else None
        )
        resolved = (
            trip.legs[0]
            if trip is not None
            else resolve_loading(loading, aircraft, category=overrides.get("category"), fuel_to_plan=fuel_to_plan)
        )
    except LoadcheckError as error:
        error = error.with_file(loading_path if loading_path is not None else "command line")
        raise _named_as_typed(error, typed) if command_line else error from None
    # fail closed: a value given is used or refused, never set aside (after the values' own problems)
    set_aside = _set_aside(overrides, fuel_to_plan, stop_to_plan, station_to_plan)
    if set_aside:
        refused = InputError(set_aside, file="command line")
        raise _named_as_typed(refused, typed) if command_line else refused
    if loading_path is not None:
        legs = trip.legs if trip is not None else (resolved,)
        volume = aircraft.units.fuel_volume
        for where, given, replaced in _trip_replaced(read_toml(loading_path), overrides, typed):
            number = leg_of_field(where)
            trip_fuel = legs[number[0] - 1].trip if number is not None and number[0] <= len(legs) else resolved.trip
            leg = f"leg {number[0]}: " if number is not None else ""
            notes.append(
                f"{leg}the trip fuel is {given} from the command line, {trip_fuel:g} {volume}; it replaces the "
                f"loading file's {replaced} (command-line values are laid over the file's)"
            )
    notes += _own_reserves(trip, overrides, aircraft.units.fuel_volume)
    if fuel_to_plan and loading.fuel:  # the file's fuel at engine start: the answer chooses it instead
        given = ", ".join(f"{name} {_typed(value)}" for name, value in loading.fuel.items())
        notes.append(f"the loading file's fuel at engine start ({given}) is not used: this answer chooses the fuel")
    planned_leg = None
    if stop_to_plan is not None and 2 <= stop_to_plan <= len(loading.leg) + 1:
        planned_leg = loading.leg[stop_to_plan - 2]
    if planned_leg is not None and planned_leg.add_fuel:  # the file's fuel at that stop: the answer chooses it
        given = ", ".join(f"{name} {_typed(value)}" for name, value in planned_leg.add_fuel.items())
        notes.append(
            f"the loading file's fuel put in at the stop before leg {stop_to_plan} ({given}) is not used: "
            "this answer chooses it"
        )
    label = loading.label or (Path(loading_path).stem if loading_path is not None else None)
    return CheckInputs(aircraft, resolved, Path(loading_path) if loading_path else None, notes, label, loading, trip)


def _set_aside(
    overrides: Mapping[str, Any], fuel_to_plan: bool, stop_to_plan: int | None, station_to_plan: str | None
) -> list[Problem]:
    """A problem for each value of ``overrides`` that the planning answer asked for would set aside:
    fuel at engine start where it chooses that fuel (``fuel_to_plan``), fuel put in at the stop before
    leg ``stop_to_plan`` where it chooses that, and the weight at ``station_to_plan`` where it puts
    its payload there in that weight's place."""
    problems = [
        Problem(
            f"fuel.{name}",
            "fuel given here would not be used: this answer chooses the fuel at engine start; "
            "give none (to check the fuel on board, check the loading with it)",
        )
        for name in (overrides.get("fuel") or {} if fuel_to_plan else {})
    ]
    if stop_to_plan is not None:
        at_stop = ((overrides.get("legs") or {}).get(stop_to_plan) or {}).get("add_fuel") or {}
        problems += [
            Problem(
                leg_field(stop_to_plan, f"add_fuel.{name}"),
                f"fuel given here would not be used: this answer chooses the fuel put in at the stop "
                f"before leg {stop_to_plan}; give none for that stop",
            )
            for name in at_stop
        ]
    if station_to_plan is not None and station_to_plan in (overrides.get("load") or {}):
        problems.append(
            Problem(
                f"load.{station_to_plan}",
                "weight given here would not be used: this answer puts the payload asked about at this "
                "station in its place; give none for it (or give the whole weight as the payload)",
            )
        )
    return problems


def _own_reserves(trip: ResolvedTrip | None, overrides: Mapping[str, Any], volume: str) -> list[str]:
    """A note for each later leg of a trip held to another reserve than the one given over the file
    (``--reserve``, the first leg's), said from the resolved trip (each leg's reserve as
    :func:`~loadcheck.loading.resolve_trip` set it: its own, else the leg before's), so that a pilot
    who typed one reserve is told where a landing is held to another."""
    given = (overrides.get("burn") or {}).get("reserve")
    if trip is None or given is None:
        return []
    typed = overrides.get("legs") or {}  # a leg's reserve typed beside it (--leg-burn 2:reserve=...)
    first = trip.legs[0].reserve
    return [
        f"leg {number}: held to a reserve of {'none' if checked.reserve is None else fmt(checked.reserve, volume)}, "
        f"not the reserve given over the file ({given}), which is leg 1's: a leg keeps the reserve of the leg "
        "before it unless it gives its own"
        for number, checked in enumerate(trip.legs[1:], start=2)
        if checked.reserve != first and "reserve" not in (typed.get(number) or {}).get("burn", {})
    ]


def _another_aircraft(path: Path, aircraft: Aircraft) -> bool:
    """True where ``path`` is an aircraft file of other data than ``aircraft`` (another fingerprint:
    another aircraft, or another empty-weight record of it); False for a copy of the same data and
    for a file that is not there or cannot be read as an aircraft (the one given is then used)."""
    try:
        return parse_aircraft(read_toml(path), path).fingerprint != aircraft.fingerprint
    except LoadcheckError:
        return False


def named_elsewhere(named: str | Path | None, relative_to: str | Path, given: str | Path) -> Path | None:
    """The aircraft file that a loading, readings or changes file names (its ``aircraft`` key, read
    relative to the folder ``relative_to``) where it is not the aircraft file ``given``; None where
    the file names none, or names the one given.

    One rule for every job that is given an aircraft file beside a file naming one (the check, the
    fleet, weigh and alter): the two are compared as resolved paths, so one file reached by two
    paths (``./a.toml``, a symlink) is the same aircraft, and a copy elsewhere is another.

    Examples
    --------
    >>> named_elsewhere("aircraft.toml", "fleet/trainer", "fleet/trainer/./aircraft.toml") is None
    True
    >>> str(named_elsewhere("other.toml", "fleet/trainer", "fleet/trainer/aircraft.toml"))
    'fleet/trainer/other.toml'
    """
    if not named:
        return None
    path = Path(relative_to) / named
    return None if path.resolve() == Path(given).resolve() else path


def _named_aircraft(named: Path | None, loading_path: str | Path) -> Aircraft:
    """The aircraft a loading file names (``aircraft = "trainer.toml"``).

    Raises
    ------
    InputError
        Attributed to the loading file: it names no aircraft, or one that cannot be read
        or is not an aircraft file.
    """
    if named is None:
        raise InputError(
            Problem("aircraft", "this loading file names no aircraft file; give the aircraft file first"),
            file=loading_path,
        )
    try:
        named_data = read_toml(named)
    except LoadcheckError as error:
        reason = "; ".join(p.describe() for p in error.problems)
        raise InputError(
            Problem("aircraft", f"names {named}, which cannot be read: {reason}"), file=loading_path
        ) from None
    if file_kind(named_data) != "aircraft":
        raise InputError(Problem("aircraft", f"names {named}, which is not an aircraft file"), file=loading_path)
    return parse_aircraft(named_data, named)


def _without(data: Mapping[str, Any], fields: list[str]) -> dict[str, Any]:
    """A copy of loading data without the fields named (dotted paths such as ``burn.taxi``)."""
    import copy

    result: dict[str, Any] = copy.deepcopy(dict(data))
    for dotted in fields:
        leg = leg_of_field(dotted)
        if leg is not None:  # leg 2, burn.taxi: the first [[leg]] table's burn.taxi
            dotted = f"leg[{leg[0] - 2}]" + (f".{leg[1]}" if leg[1] else "")
        keys = [k for k in re.split(r"\.|\[(\d+)\]", dotted) if k]
        parent: Any = result
        try:
            for key in keys[:-1]:
                parent = parent[int(key)] if isinstance(parent, list) else parent[key]
            if isinstance(parent, dict):
                parent.pop(keys[-1], None)
            elif isinstance(parent, list):
                parent.pop(int(keys[-1]))
        except (KeyError, IndexError, ValueError, TypeError):
            continue
    return result


def _validate_loading(path: str | Path, data: Mapping[str, Any]) -> str:
    """Validate a loading file and, where it names one, against its aircraft, reporting every
    problem at once: the fields that do not validate, then (the loading read without them)
    unknown stations, tanks and levels and fuel above capacity."""
    problems: list[Problem] = []
    try:
        loading = parse_loading(data, path)
    except InputError as error:
        problems += error.problems
        try:
            loading = parse_loading(_without(data, [p.field for p in error.problems if p.field]), path)
        except LoadcheckError:
            raise error from None
    if not loading.aircraft:
        if problems:
            raise InputError(problems, file=path)
        return "loading (names no aircraft, so station and tank names were not checked)"
    named = Path(path).parent / loading.aircraft
    try:
        aircraft = _named_aircraft(named, path)
    except LoadcheckError as error:
        if not problems:
            raise
        if error.file == str(path):  # already said of this loading (the file is missing, not an aircraft)
            raise InputError([*problems, *error.problems], file=path) from None
        lines = "; ".join(error.lines())
        raise InputError(
            [*problems, Problem("aircraft", f"names {named}, which does not validate: {lines}")], file=path
        ) from None
    try:
        resolve_trip(loading, aircraft)
    except LoadcheckError as error:
        problems += [p for p in error.problems if p not in problems]
    if problems:
        raise InputError(problems, file=path)
    legs = f", a trip of {len(loading.leg) + 1} legs" if loading.leg else ""
    return f"loading for {aircraft.name!r}{legs}"


@dataclass(frozen=True)
class Validated:
    """What :func:`validate` found of one file.

    Attributes
    ----------
    path : the file as given
    kind : what it holds (:func:`file_kind`; ``unknown`` where it could not be read)
    summary : the one-line summary of :func:`validate_file`, where the file validates
    problems : one line per problem (file name first, :meth:`LoadcheckError.lines`), where it does not
    """

    path: str
    kind: str
    summary: str | None = None
    problems: list[str] = field(default_factory=list)

    @property
    def ok(self) -> bool:
        """True when the file validates."""
        return self.summary is not None

    @property
    def caution(self) -> str:
        """The caution that goes with the file: the mechanic's for a readings or changes file, the
        pilot's for the others (DESIGN.md, "Cautions")."""
        from .caution import MECHANIC_CAUTION, PILOT_CAUTION

        return MECHANIC_CAUTION if self.kind in ("readings", "changes") else PILOT_CAUTION


def validate(path: str | Path) -> Validated:
    """:func:`validate_file` of one file, its problems collected rather than raised, with the file's kind
    (for the caution that goes with it)."""
    kind = "unknown"
    try:
        data = read_toml(path)
        kind = file_kind(data)
        return Validated(str(path), kind, summary=_validate_data(path, data, kind))
    except LoadcheckError as error:
        return Validated(str(path), kind, problems=error.lines())
    except ValidationError as error:  # a model built past the file's own validation (a new record's aircraft)
        return Validated(str(path), kind, problems=InputError(problems_from_validation(error), file=path).lines())


def validate_file(path: str | Path) -> str:
    """Validate one aircraft, loading, readings or changes file; return a one-line summary.

    A loading that names its aircraft is resolved against it (names, capacities). A readings or
    changes file that names its aircraft is given to the job that ``weigh`` or ``alter`` runs
    (:func:`~loadcheck.empty_record.propose`: the new record is computed, never written), so a file
    that validates is one that job accepts; the summary says the new record's warnings and why it
    would not be written as it stands.

    Raises
    ------
    LoadcheckError
        Listing every problem found in the file.
    """
    data = read_toml(path)
    return _validate_data(path, data, file_kind(data))


def _validate_data(path: str | Path, data: Mapping[str, Any], kind: str) -> str:
    """:func:`validate_file` of a file already read, of the ``kind`` found."""
    if kind == "aircraft":
        aircraft = parse_aircraft(data, path)
        from .weighing import current_record_warnings
        from .words import count

        summary = (
            f"aircraft {aircraft.name!r}, {count(len(aircraft.station), 'station')}, "
            f"{count(len(aircraft.tank), 'tank')}, "
            f"categories {', '.join(aircraft.categories)}"
        )
        cg_range = aircraft.empty.cg_range
        if cg_range is not None:
            summary += f"; empty-weight CG range {cg_range[0]:g} to {cg_range[1]:g} {aircraft.units.arm}"
        return "; ".join([summary, *(f"WARNING: {w}" for w in current_record_warnings(aircraft))])
    if kind == "loading":
        return _validate_loading(path, data)
    if kind in ("readings", "changes"):
        named = data.get("aircraft")
        if not named:
            from .alterations import Changes
            from .weighing import Readings

            _validate(Readings if kind == "readings" else Changes, data, path)
            return f"{kind} (names no aircraft, so tanks, equipment and units were not checked)"
        from .empty_record import propose

        proposal = propose(Path(path).parent / str(named), path, "weighing" if kind == "readings" else "alteration")
        result = proposal.result
        never = [r for r in result.refusals if not r.overridable]
        if never:  # no override writes it: the file cannot be used for a new record as it stands
            raise InputError(
                [Problem(r.field or "", f"the new record could never be written: {r.message}") for r in never],
                file=path,
            )
        notes = [f"WARNING: {w}" for w in result.warnings] + [
            f"WARNING: the new record would not be written without an override: {r.message}" for r in result.refusals
        ]
        return "; ".join([f"{kind} for {proposal.aircraft.name!r}", *notes])
    raise InputError(
        "cannot tell what this file is: no [units]/[empty]/[[envelope]] (aircraft), no [load]/[fuel]/[burn] "
        "(loading), no [[point]] (readings) and no [[change]] (changes)",
        file=path,
    )


AIRCRAFT_ONLY_KEYS = tuple(name for name in Aircraft.model_fields if name not in Loading.model_fields)
"""Top-level keys of an aircraft file that a loading file has not (no readings or changes file has them
either: tests/test_fleet.py)."""


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


def reads_as(data: Mapping[str, Any], path: str | Path, kind: str) -> bool:
    """True where ``data`` (read from ``path``) validates as a file of ``kind``: ``aircraft``,
    ``readings`` or ``changes`` (the models alone, not the aircraft a readings or changes file names)."""
    try:
        if kind == "aircraft":
            parse_aircraft(data, path)
        else:
            from .alterations import Changes
            from .weighing import Readings

            _validate(Readings if kind == "readings" else Changes, data, path)
    except LoadcheckError:
        return False
    return True


def write_target(path: str | Path) -> Path:
    """The file a write to ``path`` must replace: the path itself, or where its symlinks lead.

    A symlink is followed to its final target (so ``current.toml -> v7.toml`` updates
    ``v7.toml`` and the link stays), which may not exist yet. Anything there that is not
    a regular file (a FIFO, a device, a folder) is refused.

    Raises
    ------
    FileFormatError
        For a target that is not a regular file, naming the path given and the target.
    """
    path = Path(path)
    target = Path(os.path.realpath(path)) if path.is_symlink() else path
    try:
        mode = target.stat().st_mode
    except FileNotFoundError:
        return target
    except OSError as error:
        raise FileFormatError(f"cannot write here: {error.strerror or error}", file=path) from None
    if not stat.S_ISREG(mode):
        what = "a folder" if stat.S_ISDIR(mode) else "a FIFO" if stat.S_ISFIFO(mode) else "not a regular file"
        where = f" (the link leads to {target})" if target != path else ""
        raise FileFormatError(f"is {what}{where}; loadcheck writes only regular files, nothing was written", file=path)
    return target


def _new_file_mode() -> int:
    """Permissions of a newly created file: 0666 less the process's umask (as ``open`` gives)."""
    mask = os.umask(0o022)
    os.umask(mask)
    return 0o666 & ~mask


def write_atomic(path: str | Path, content: str | bytes) -> None:
    """Replace a file's content all at once, or leave it as it was.

    The content is written to a temporary file beside the target, flushed and synced,
    then renamed over the target (``os.replace``, atomic on POSIX and Windows). On any
    error the temporary file is removed and the target is untouched. A symlink is written
    through: its target is replaced, in the target's folder, and the link is kept
    (:func:`write_target`). An existing file keeps its permissions; a new one gets those
    the user's umask gives, as any other program's files do.

    Raises
    ------
    FileFormatError
        When the file cannot be written (full disk, no permission, not a regular file),
        naming the file.
    """
    given = Path(path)
    path = write_target(given)
    data = content.encode("utf-8") if isinstance(content, str) else content
    folder = path.parent if str(path.parent) else Path(".")
    try:
        handle, temporary = tempfile.mkstemp(prefix=f".{path.name}.", suffix=".tmp", dir=folder)
    except OSError as error:
        raise FileFormatError(f"cannot write here: {error.strerror or error}", file=given) from None
    try:
        with os.fdopen(handle, "wb") as stream:
            stream.write(data)
            stream.flush()
            os.fsync(stream.fileno())
        os.chmod(temporary, path.stat().st_mode & 0o7777 if path.exists() else _new_file_mode())
        os.replace(temporary, path)
    except OSError as error:
        try:
            os.unlink(temporary)
        except OSError:
            pass
        raise FileFormatError(
            f"could not write the file, it is unchanged: {error.strerror or error}", file=given
        ) from None


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


def _set_value(table: Any, key: str, value: Any) -> None:
    """Set ``table[key]`` and drop the trailing comment that belonged to the old value
    (``weight = 897.0  # last weighing 2019`` must not stay on the new weight)."""
    table[key] = value
    item = table.item(key) if hasattr(table, "item") else None
    if item is not None and getattr(item, "trivia", None) is not None:
        item.trivia.comment = ""
        item.trivia.comment_ws = ""


def _append_entry(doc: Any, key: str, entry: dict[str, Any]) -> None:
    """Append a table to an array of tables, in the layout the file already uses:
    ``[[key]]`` tables, or an inline array ``key = [{...}]``."""
    import tomlkit
    from tomlkit.items import AoT, Array

    existing = doc.get(key)
    if isinstance(existing, Array):
        inline = tomlkit.inline_table()
        inline.update(entry)
        existing.append(inline)
        return
    if existing is None:
        doc[key] = tomlkit.aot()
        existing = doc[key]
    if not isinstance(existing, AoT):
        raise FileFormatError(f"[{key}] is neither an array of tables nor an inline array; nothing was written")
    table = tomlkit.table()
    table.update(entry)
    existing.append(table)


def _replace_list(doc: Any, key: str, items: list[dict[str, Any]]) -> None:
    """Replace an array of tables with new items, keeping its layout (inline or ``[[key]]``)."""
    import tomlkit
    from tomlkit.items import Array

    if isinstance(doc.get(key), Array):
        array = tomlkit.array()
        for item in items:
            inline = tomlkit.inline_table()
            inline.update(item)
            array.append(inline)
        doc[key] = array
        return
    table = tomlkit.aot()
    for item in items:
        table.append(item)
    doc[key] = table


def _tidy_history(text: str) -> str:
    """``text`` with a blank line before each ``[[history]]`` table that has none: the one just
    appended came right after the table before it, and rebuilding the equipment list takes the blank
    line from the first entry; a table with blank lines before it keeps them as written, and ``text``
    is kept as it is where the change would alter any value."""
    tidy = re.sub(r"(?<=[^\n])\n(?=\[\[history\]\]\n)", "\n\n", text)
    return tidy if tidy == text or tomllib.loads(tidy) == tomllib.loads(text) else text


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
    by: str | None = None,
    note: str | None = None,
    overrides: list[str] | None = None,
    recorded: Any = None,
) -> Path:
    """Make a new empty-weight record current and keep the old one in ``[[history]]``.

    The file keeps its comments and layout (tomlkit), except the trailing comments of the
    values replaced. ``weight``, ``arm`` and ``lateral_arm`` are written at full precision (each
    float's repr, read back exactly), never rounded. The history entry holds when (``recorded``), why (``reason``,
    ``note``), who (``by``), the overrides given, the inputs (bounded by the caller; see
    :mod:`loadcheck.empty_record`) and the previous record. It is written atomically
    (:func:`write_atomic`, through a symlink to its target), and only if the file still
    holds exactly ``original``: a file that changed since it was read is refused, and
    nothing is written. The new content is validated as an aircraft file, and its size
    checked against :data:`MAX_FILE_BYTES`, before it replaces the old one: loadcheck
    never writes a file it would refuse to read.

    Returns
    -------
    Path
        The file written (the symlink's target where ``path`` is a symlink).

    Raises
    ------
    FileFormatError
        The file changed since it was read, the result would not be a valid or readable
        aircraft file, it could not be written (it is unchanged), or ``date`` is None (the
        new record is never given the old record's date).
    """
    import datetime as dt

    import tomlkit

    path = Path(path)
    if date is None:  # the replaced record's date is never carried over to the new one
        raise FileFormatError(
            "a new empty-weight record needs its own date (the weighing's or the changes'); nothing was written",
            file=path,
        )
    target = write_target(path)
    doc = tomlkit.parse(original.decode("utf-8"))
    previous = _plain(dict(doc["empty"].unwrap()))
    entry: dict[str, Any] = {
        "recorded": recorded or dt.datetime.now().astimezone().replace(microsecond=0),
        "reason": reason,
    }
    entry.update(_plain({"by": by, "note": note}))
    if overrides:
        entry["overrides"] = list(overrides)
    # the figures at full precision (a float's repr, which TOML reads back exactly): the record written
    # is the one shown and confirmed, and the next check uses the same moment (DESIGN.md, full precision)
    entry.update({"new_weight": weight, "new_arm": arm, "previous": previous, "inputs": _plain(dict(inputs))})
    empty = doc["empty"]
    _set_value(empty, "weight", weight)
    _set_value(empty, "arm", arm)
    if lateral_arm is not None:
        _set_value(empty, "lateral_arm", lateral_arm)
    _set_value(empty, "date", date)
    _append_entry(doc, "history", entry)
    if equipment is not None:
        _replace_list(doc, "equipment", [_plain(item) for item in equipment])
    text = _tidy_history(tomlkit.dumps(doc))
    size = len(text.encode("utf-8"))
    if size > MAX_FILE_BYTES:
        raise FileFormatError(
            f"the new file would be {size:,} bytes, more than loadcheck reads ({MAX_FILE_BYTES:,}); "
            "nothing was written (move old [[history]] entries to an archive file)",
            file=path,
        )
    try:
        parse_aircraft(tomllib.loads(text), path)  # fail closed: never write a file we could not read back
    except tomllib.TOMLDecodeError as error:
        raise FileFormatError(
            f"the updated file would not be valid TOML ({error}); nothing was written", file=path
        ) from None
    except LoadcheckError as error:
        reason_text = "; ".join(p.describe() for p in error.problems)
        raise FileFormatError(
            f"the updated file would not be a valid aircraft file ({reason_text}); nothing was written", file=path
        ) from None
    try:
        current = target.read_bytes()
    except OSError as error:
        raise FileFormatError(
            f"cannot read the file again before writing: {error.strerror or error}", file=path
        ) from None
    if current.decode("utf-8-sig", errors="replace").encode("utf-8") != original:
        raise FileFormatError(
            "the file changed since it was read; nothing was written (run the command again)", file=path
        )
    write_atomic(path, text)
    return target
