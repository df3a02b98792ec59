"""The desk's application: pages and the JSON API over the library's jobs.

Routes parse a form or a JSON body, call one library job (the same as the command line:
:func:`~loadcheck.files.load_check_inputs`, :func:`~loadcheck.check.check_loading`,
:func:`~loadcheck.planning.most_fuel`, :func:`~loadcheck.checklog.log_check`,
:func:`~loadcheck.empty_record.propose` ...) and render its result. They hold no
arithmetic and no validation of their own; a bad value comes back as the library's
problems, with the field named and everything typed kept. The one rule checked here is one
the form would otherwise get round: a leg asked for is refused without its burn, as a loading
file's ``[[leg]]`` is (:func:`_refuse_legs_without_burn`), since the form, not the user, would
make up the empty one.
"""

from __future__ import annotations

import datetime as dt
import functools
import json
import re
import secrets
import shutil
import tempfile
import threading
import time
from collections import OrderedDict
from collections.abc import Callable, Coroutine, Iterable, Mapping
from dataclasses import dataclass
from pathlib import Path
from types import SimpleNamespace
from typing import TYPE_CHECKING, Annotated, NotRequired, TypedDict, cast

from fastapi import FastAPI, Form, HTTPException, Request, UploadFile
from fastapi.exceptions import RequestValidationError
from fastapi.responses import HTMLResponse, JSONResponse, PlainTextResponse, RedirectResponse, Response
from fastapi.routing import APIRoute, APIRouter
from fastapi.staticfiles import StaticFiles
from fastapi.templating import Jinja2Templates
from pydantic import BaseModel, ConfigDict, Field, JsonValue, ValidationError, WithJsonSchema
from starlette.datastructures import FormData
from starlette.datastructures import UploadFile as StarletteUpload
from starlette.exceptions import HTTPException as StarletteHTTPException
from starlette.middleware.sessions import SessionMiddleware

from .. import __version__
from ..caution import MECHANIC_CAUTION, PILOT_CAUTION
from ..display import fmt, unit_label
from ..errors import InputError, LoadcheckError, Problem
from ..loading import burn_order
from ..registration import registration_key
from ..units import parse_quantity
from ..words import burn_path_summary, condition_words, given_fuel_words, stretch_text, within_limits_text
from .form import FORM_FIELDS, one_source, refuse_query, refuse_repeated, refuse_unknown
from .security import MAX_BODY_BYTES, BodyLimit, SignInThrottle, csrf_ok, csrf_token
from .users import Account, UserStore

if TYPE_CHECKING:
    from ..aircraft import Aircraft
    from ..checklog import LoggedCheck
    from ..empty_record import Proposal
    from ..files import CheckInputs
    from ..fleet import Fleet
    from ..loading import Loading, ResolvedTrip
    from ..planning import PlanResult
    from ..results import CheckResult, Condition, TripResult

__all__ = ["MAX_LEGS", "CheckRequest", "PayloadRequest", "StopRequest", "create_app", "form_key", "leg_count"]

_HERE = Path(__file__).parent
_MAX_PENDING = 50
_CHART_LOCK = threading.Lock()  # matplotlib's figure machinery is not meant to be driven from many threads at once


class _SignInNeeded(Exception):
    """The request has no signed-in account."""


_Value = Annotated[JsonValue, WithJsonSchema({"not": {"type": "null"}})]
"""A loading value as JSON gives it, for the library to read; never null (refused by :func:`api_json`)."""


class CheckRequest(BaseModel):
    """A loading for the API: the same fields as a loading file's ``[load]``, ``[fuel]`` and ``[burn]``.

    The loading's tables are taken as JSON gives them (``JsonValue``: nothing converted here) and
    handed to :func:`~loadcheck.files.load_check_inputs`, the command line's job, so that every
    boundary rule is the library's, said in its words: a ``true`` where a weight goes is refused
    as in a loading file (pydantic's lax mode would read it as 1), so is NaN or an infinity
    (Python's ``json`` reads ``NaN`` and ``Infinity``). The desk's own fields are strict: a
    ``record`` of ``"yes"`` or ``1``, a ``stop`` of ``"2"`` or ``true`` is refused, never read.
    """

    model_config = ConfigDict(extra="forbid", strict=True)

    registration: str = Field(description="the aircraft, by registration, in the desk's fleet")
    load: dict[str, _Value] = Field(
        default_factory=dict, description="mass per station: a number [mass unit] or with a unit"
    )
    names: dict[str, _Value] = Field(
        default_factory=dict,
        description="optional: who is at each station, a person's name per station id (the loading file's [names])",
    )
    fuel: dict[str, _Value] = Field(
        default_factory=dict, description="quantity per tank at engine start: volume, 'full', a level name"
    )
    burn: dict[str, _Value] = Field(
        default_factory=dict, description="taxi, trip or trip_time and rate, order, reserve"
    )
    category: Annotated[str | None, WithJsonSchema({"type": "string"})] = Field(
        None, description="envelope category (default: the file's first); left out, never null"
    )
    leg: list[dict[str, _Value]] = Field(
        default_factory=list,
        description="the legs after the first, as the loading file's [[leg]] tables: label, load "
        "(new weight per station), add_fuel (fuel put in at the stop), burn",
    )
    record: bool = Field(False, description="record the check in the desk's log (POST /api/check only)")


class PayloadRequest(CheckRequest):
    """A loading and the station whose most payload is asked for."""

    station: str = Field(description="station id")


class StopRequest(CheckRequest):
    """A trip and the leg before whose stop the fuel to put in is asked for."""

    stop: int = Field(description="the leg the stop comes before (2 or more)")


class _BodyRefused(HTTPException):
    """An API body that is not read: not JSON, or a key given twice in one of its objects."""

    def __init__(self, problems: list[Problem]):
        super().__init__(422, "; ".join(p.describe() for p in problems))
        self.problems = problems


class _Pairs(list[tuple[str, object]]):
    """A JSON object's members in the order sent, every one kept (``object_pairs_hook``)."""


def _json_shown(value: object) -> str:
    return "{...}" if isinstance(value, _Pairs) else "[...]" if isinstance(value, list) else json.dumps(value)


class _Unheld:
    """A JSON number no float holds as written, kept in its place while the body is read, so that
    its refusal names its field (:func:`api_json`)."""

    __slots__ = ("message", "text")

    def __init__(self, text: str, message: str):
        self.text, self.message = text, message


def _json_number(text: str) -> object:
    """A JSON number as the library reads one typed (RFC 8259 section 6 leaves the range to the
    reader): its value where a float holds it as written, else an :class:`_Unheld` with the
    library's words for it (``'1e400' is not a finite number``, ``'1e-400' is too small ...``:
    :func:`loadcheck.units.parse_quantity`), never 0 or an infinity in its place. An integer
    beyond any float (more than 308 digits) is one too."""
    try:
        return parse_quantity(text).value
    except LoadcheckError as error:
        return _Unheld(text, "; ".join(p.message for p in error.problems))


def _json_integer(text: str) -> object:
    """A JSON integer: as Python reads it where a float can hold it (every figure loadcheck takes is
    one), else as :func:`_json_number` refuses it."""
    return int(text) if len(text.lstrip("-")) <= 308 else _json_number(text)


def api_json(body: bytes) -> object:
    """The data of an API body, refused where a JSON reader would drop or guess something.

    A key given twice in one object is refused at any depth (Python's ``json``, as most
    readers, keeps the last and drops the first without a word: ``{"front": 170, "front": 10}``
    would be checked with 10; RFC 8259 section 4 leaves duplicate names to the reader, and a
    TOML file or the command line refuses them). ``NaN`` and ``Infinity``, which Python's
    ``json`` reads though RFC 8259 section 6 has no such numbers, are kept for the library to
    refuse in its words, naming the field. A number no float holds as written (``1e-400``, which
    Python's ``json`` reads as 0, ``1e400``, which it reads as infinite: :func:`_json_number`) is
    refused here, naming its field in the library's words. A ``null`` is refused at its place: a
    field left out is not given, and a null had been read as that in some fields and refused in
    others.

    Raises
    ------
    _BodyRefused
        422: the body is not JSON, nests too deeply, or gives a key twice (each named by its
        path in the body, ``load.front`` or ``leg[0].burn.trip``, with both values).

    Examples
    --------
    >>> api_json(b'{"load": {"front": 170, "rear": [1, {"a": 2}]}}')
    {'load': {'front': 170, 'rear': [1, {'a': 2}]}}
    >>> api_json(b'{"load": {"front": 170, "front": 10}}')  # doctest: +ELLIPSIS
    Traceback (most recent call last):
    ...
    loadcheck.web.app._BodyRefused: 422: load.front: given twice in one JSON object (170, then 10); give each ...
    """
    try:
        parsed = json.loads(body, object_pairs_hook=_Pairs, parse_float=_json_number, parse_int=_json_integer)
    except RecursionError:
        raise _BodyRefused([Problem("", "the request body nests too deeply to be a loading")]) from None
    except json.JSONDecodeError as error:
        where = f"at line {error.lineno}, column {error.colno}"
        raise _BodyRefused([Problem("", f"the request body is not JSON: {error.msg} {where}")]) from None
    except ValueError as error:  # bytes that are no Unicode text
        raise _BodyRefused([Problem("", f"the request body is not JSON text: {error}")]) from None
    problems: list[Problem] = []
    out: list[object] = []
    pending: list[tuple[object, str, Callable[[object], None]]] = [(parsed, "", out.append)]
    while pending:  # made plain from the top down (no recursion), so that each key is named by its path
        value, path, put = pending.pop()
        if isinstance(value, _Pairs):
            table: dict[str, object] = {}
            first: dict[str, object] = {}
            for key, item in value:
                where = f"{path}.{key}" if path else key
                if key in first:
                    problems.append(
                        Problem(
                            where,
                            f"given twice in one JSON object ({_json_shown(first[key])}, then {_json_shown(item)}); "
                            "give each key once (a JSON reader would keep the last and drop the first)",
                        )
                    )
                    continue
                first[key] = table[key] = item
                pending.append((item, where, functools.partial(table.__setitem__, key)))
            put(table)
        elif isinstance(value, list):
            items: list[object] = list(value)
            pending.extend((v, f"{path}[{i}]", functools.partial(items.__setitem__, i)) for i, v in enumerate(value))
            put(items)
        elif isinstance(value, _Unheld):  # refused here, at its place: no job may read it as a text
            problems.append(Problem(path, value.message, value=value.text))  # as the library says it
        elif value is None:  # one rule for every field: a null was read as "not given" in some, refused in others
            problems.append(Problem(path, "null is not a value: leave the field out where it is not given"))
        else:
            put(value)
    if problems:
        raise _BodyRefused(sorted(problems, key=lambda p: p.field))
    return out[0]


class _ApiRequest(Request):
    """A request whose JSON body is read by :func:`api_json`."""

    async def json(self) -> object:
        if not hasattr(self, "_json"):
            self._json = api_json(await self.body())
        return self._json


def _request_problems(error: RequestValidationError, model: object) -> list[Problem]:
    """The problems of a request the API's models refuse, in the library's words.

    The body is validated again by its model and the error read by
    :func:`~loadcheck.files.problems_from_validation`, as a loading file's is: each field named
    with its value, an unknown one with the key it is closest to (``lod``: ``load``). A query
    value (``?max_age=``) is named by its parameter.
    """
    from ..files import problems_from_validation

    if isinstance(model, type) and issubclass(model, BaseModel):
        try:
            model.model_validate(error.body)
        except ValidationError as refused:
            return problems_from_validation(refused, model)
    return [
        Problem(
            ".".join(str(p) for p in e.get("loc", ())[1:]),
            str(e.get("msg", "invalid value")),
            None if e.get("type") == "missing" else e.get("input"),
        )
        for e in error.errors()
    ]


class _ApiRoute(APIRoute):
    """A route of the JSON API (FastAPI's custom route class): its body read by :func:`api_json`,
    a value its models refuse said in the library's words (:func:`_request_problems`)."""

    def get_route_handler(self) -> Callable[[Request], Coroutine[object, object, Response]]:
        handler = super().get_route_handler()
        model = self.body_field.field_info.annotation if self.body_field is not None else None

        async def read(request: Request) -> Response:
            try:
                return await handler(_ApiRequest(request.scope, request.receive))
            except RequestValidationError as error:
                raise _BodyRefused(_request_problems(error, model)) from None

        return read


class ProblemView(TypedDict):
    """A library problem as a page or the API shows it (no paths of this machine in it)."""

    field: str
    message: str
    value: str | None
    expected: str | None


FormValues = Mapping[str, str | StarletteUpload]
"""A posted form as read (starlette's :class:`~starlette.datastructures.FormData`, or a plain dict of texts)."""

JsonObject = dict[str, JsonValue]
"""A JSON object of the API's answers: the command line's ``--json`` shapes (``to_dict`` of a result)."""

_Signature = tuple[tuple[str, int, int, int], ...]
"""The fleet folder's aircraft files as (path, inode, size, modification time [ns])."""


class LegTables(TypedDict):
    """A leg after the first as the form gives it to the library: a loading file's ``[[leg]]`` table
    (its ``burn`` only where a field of the leg's fuel used was typed: the form never makes one up)."""

    label: str | None
    load: Mapping[str, str]
    names: Mapping[str, str]
    add_fuel: Mapping[str, str]
    burn: NotRequired[Mapping[str, str | list[str]]]


class Overrides(TypedDict):
    """A loading as the form or the API body gives it to :func:`~loadcheck.files.load_check_inputs`:
    the loading file's tables, as typed (the library reads and checks every value)."""

    load: Mapping[str, object]
    names: Mapping[str, object]
    fuel: Mapping[str, object]
    burn: Mapping[str, object]
    category: str | None
    legs: Mapping[int, Mapping[str, object]]


@dataclass
class _Pending:
    """A mechanic's proposed record, waiting for confirmation."""

    user: str
    registration: str
    proposal: Proposal
    source: Path
    made: float


class Desk:
    """What the routes share: the fleet folder, the check log's file, the accounts, the guards."""

    def __init__(self, fleet_dir: Path, db: Path, users: UserStore):
        self.fleet_dir = fleet_dir
        self.db = db
        self.users = users
        self.throttle = SignInThrottle()
        self.pending: OrderedDict[str, _Pending] = OrderedDict()
        self.workdir = Path(tempfile.mkdtemp(prefix="loadcheck-desk-"))
        self.lock = threading.Lock()
        self._fleet: tuple[_Signature, Fleet] | None = None

    def fleet(self) -> Fleet:
        """The fleet as its files are now: read again whenever any aircraft file changed (name, inode, size, time)."""
        from ..fleet import load_fleet

        try:
            signature = tuple(sorted((str(p), *self._stat(p)) for p in self.fleet_dir.rglob("*.toml")))
        except OSError:
            signature = None
        with self.lock:
            if signature is not None and self._fleet is not None and self._fleet[0] == signature:
                return self._fleet[1]
        fleet = load_fleet(self.fleet_dir)
        with self.lock:
            self._fleet = (signature, fleet) if signature is not None else None
        return fleet

    @staticmethod
    def _stat(path: Path) -> tuple[int, int, int]:
        info = path.stat()
        return info.st_ino, info.st_size, info.st_mtime_ns

    def aircraft_path(self, registration: str) -> tuple[Aircraft, Path]:
        """The usable aircraft of a registration and its file (the fleet read afresh: a new record shows at once)."""
        entry = self.fleet().entry(registration)  # the library's one registration comparison, as the command line's
        assert entry.aircraft is not None, "Fleet.entry gives a usable aircraft's file"
        return entry.aircraft, entry.path

    def public(self, text: str) -> str:
        """A message as a page may show it: no folder of this machine in it."""
        text = re.sub(re.escape(str(self.workdir)) + r"/[^/\s]+/", "", text)  # an upload is named by its own name
        for folder, name in (
            (self.workdir, "uploaded file"),
            (self.fleet_dir.resolve(), "fleet"),
            (self.fleet_dir, "fleet"),
        ):
            text = text.replace(str(folder) + "/", name + ": ").replace(str(folder), name)
        return text

    def problems(self, error: Exception) -> list[ProblemView]:
        """The problems of a library error, for a page or the API (no paths of this machine)."""
        if isinstance(error, ValidationError):
            from ..files import problems_from_validation

            found = problems_from_validation(error)
            prefix = ""
        else:
            assert isinstance(error, LoadcheckError)
            found = error.problems
            prefix = (
                f"{error.file}: " if error.file and str(error.file) != "command line" else ""
            )  # a form is not the command line
        return [
            ProblemView(
                field=p.field,
                message=self.public(prefix + p.describe()),
                value=None if p.value is None else str(p.value),
                expected=p.expected,
            )
            for p in found
        ]


def _account(request: Request) -> Account:
    name = request.session.get("user")
    account = request.app.state.desk.users.get(name) if isinstance(name, str) else None
    if account is None:
        raise _SignInNeeded()
    return account


def _need(request: Request, role: str, *also: str) -> Account:
    account = _account(request)
    if not any(account.has(r) for r in (role, *also)):
        raise HTTPException(403, f"this page is for the {' or '.join((role, *also))} role")
    return account


async def _form(request: Request, *fields: str) -> FormData:
    """The posted form, refused (403) without the session's CSRF token; with ``fields``, also
    refused (422) for a field that is not one of them (loadcheck.web.form.refuse_unknown), and always
    for a field posted twice (refuse_repeated). A
    form whose fields depend on the aircraft (the check form) is read without ``fields`` and
    checked by :func:`_overrides`, which knows them."""
    form = await request.form()
    if not csrf_ok(request.session, form.get("csrf")):
        raise HTTPException(403, "the form's security token is missing or out of date: reload the page and try again")
    refuse_repeated(form.multi_items())
    if fields:
        refuse_unknown(form, fields)
    return form


def _text(form: FormValues, key: str) -> str:
    """A text field of the form as posted ("" when it is not there).

    Raises
    ------
    HTTPException
        422 for a file sent in place of the text (a form the desk did not make): never read as text.
    """
    value = form.get(key, "")
    if not isinstance(value, str):
        raise HTTPException(422, f"{key}: a file was sent where the form has a text field")
    return value


_BURN_KEYS = ("taxi", "trip", "trip_time", "rate", "reserve", "order")
MAX_LEGS = 12
"""The most legs the check form holds: a guard on the size of the web page, not a rule of trips.

A trip has no most legs in the library (:func:`loadcheck.trip.check_trip`): the command line, the
fleet CSV and ``POST /api/check`` take a trip of any number of legs. The form is rebuilt from its
posted ``legs`` count, one block of fields per leg, so a crafted count (``legs=100000``) would
have the desk build and check that many legs from one small request; the form stops at this many
and says where a longer trip is checked."""


def leg_count(form: FormValues) -> int:
    """The number of legs the form holds (its ``legs`` field; 1 without it).

    Raises
    ------
    HTTPException
        422 for a count that is not a whole number from 1 to :data:`MAX_LEGS` (a form the desk did not
        make; the desk's own form never posts more).
    """
    raw = _text(form, "legs").strip() or "1"
    if not raw.isdigit() or not 1 <= int(raw) <= MAX_LEGS:
        raise HTTPException(
            422,
            f"legs: {raw[:20]!r} is not a number of legs this form holds; expected 1 to {MAX_LEGS} "
            "(a longer trip is checked from a loading file or through POST /api/check)",
        )
    return int(raw)


def _overrides(
    form: FormValues, aircraft: Aircraft, legs: int | None = None, also: tuple[str, ...] = ()
) -> tuple[dict[str, str], Overrides]:
    """The form's values as typed (to show again) and as the library's overrides (empty fields left out).

    ``names.STATION`` is the person at a station (the loading file's ``[names]``). Leg ``n`` (2 or
    more) has the fields ``leg.n.label``, ``leg.n.load.STATION`` (the new weight from that leg
    on), ``leg.n.names.STATION``, ``leg.n.fuel.TANK`` (fuel put in at the stop before it) and
    ``leg.n.burn.KEY``, given to the library as the loading file's ``[[leg]]`` tables.
    """
    typed: dict[str, str] = {}

    def read(key: str) -> str:
        typed[key] = value = _text(form, key).strip()
        return value

    def tables(prefix: str) -> tuple[dict[str, str], dict[str, str], dict[str, str], dict[str, str | list[str]]]:
        load = {s.id: v for s in aircraft.station if (v := read(f"{prefix}load.{s.id}"))}
        names = {s.id: v for s in aircraft.station if (v := read(f"{prefix}names.{s.id}"))}  # a person at a station
        fuel = {t.id: v for t in aircraft.tank if (v := read(f"{prefix}fuel.{t.id}"))}
        burn = {
            k: burn_order(v, f"{prefix}burn.order") if k == "order" else v
            for k in _BURN_KEYS
            if (v := read(f"{prefix}burn.{k}"))
        }
        return load, names, fuel, burn

    load, names, fuel, burn = tables("")
    count = leg_count(form) if legs is None else legs
    typed["legs"] = str(count)
    further: dict[int, LegTables] = {}
    for number in range(2, count + 1):
        label = read(f"leg.{number}.label")
        leg_load, leg_names, added, leg_burn = tables(f"leg.{number}.")
        further[number] = LegTables(label=label or None, load=leg_load, names=leg_names, add_fuel=added)
        if leg_burn:  # no field of the leg's fuel used typed: no burn, refused as such (_refuse_legs_without_burn)
            further[number]["burn"] = leg_burn
    category = _text(form, "category")  # as sent, never trimmed: 'utility ' is no category
    if "category" in form:  # a form without the field is sent on without it (the default category), not as ""
        typed["category"] = category
    read("station")
    read("stop")
    refuse_unknown(form, [*typed, *also])  # ``also``: the route's own fields besides the loading's
    chosen = category if "category" in form else None  # sent empty (no such choice on the form): refused as given
    return typed, Overrides(load=load, names=names, fuel=fuel, burn=burn, category=chosen, legs=further)


def _without_leg(typed: dict[str, str], number: int) -> dict[str, str]:
    """The typed values with leg ``number`` taken out and the later legs numbered down by one."""
    out: dict[str, str] = {}
    for key, value in typed.items():
        match = re.fullmatch(r"leg\.(\d+)\.(.+)", key)
        if match is None:
            out[key] = value
        elif int(match.group(1)) != number:
            leg = int(match.group(1))
            out[f"leg.{leg - 1 if leg > number else leg}.{match.group(2)}"] = value
    out["legs"] = str(max(1, int(typed.get("legs", "1")) - 1))
    return out


def form_key(field: str) -> str:
    """The check form's field for a library field path, to mark it on the form.

    A leg's problem is named as the user counts legs, ``leg 2, add_fuel.main``: that is the form's
    ``leg.2.fuel.main``. A path by list index, ``leg[0].add_fuel.main`` (``leg[0]`` is leg 2), is
    read too. Any other path is the form's field of that name.

    Examples
    --------
    >>> form_key("leg 2, add_fuel.main"), form_key("leg 3"), form_key("leg[0].burn.taxi"), form_key("load.front")
    ('leg.2.fuel.main', 'leg.3', 'leg.2.burn.taxi', 'load.front')
    """
    if match := re.fullmatch(r"leg (\d+)(?:, (.+))?", field):
        number, rest = int(match.group(1)), match.group(2) or ""
    elif match := re.fullmatch(r"leg\[(\d+)\]\.?(.*)", field):
        number, rest = int(match.group(1)) + 2, match.group(2)
    else:
        return field
    rest = "fuel" + rest[len("add_fuel") :] if rest.startswith("add_fuel") else rest
    return f"leg.{number}" + (f".{rest}" if rest else "")


def _refuse_legs_without_burn(legs: Mapping[int, Mapping[str, object]]) -> None:
    """Refuse a leg after the first given without its burn (its fuel used), on the form or in an API body.

    The loading file's rule (docs/file-format.md, "Trips of several legs"): every ``[[leg]]`` table
    has its own ``burn``, and a ``[[leg]]`` with nothing in it is refused (``leg 2, burn: this field is
    required``); on the command line a leg is added only with its ``--leg-burn``. A leg the form or
    the body asks for with nothing given for it would otherwise be checked as a leg that burns
    nothing, or left out (:func:`~loadcheck.loading.apply_overrides` adds no leg for an empty table),
    so it is refused here, where the form's legs come in. A burn given empty (the API's
    ``"burn": {}``, a file's ``burn = {}``) is a burn given: the library takes it, with its warnings.

    Raises
    ------
    InputError
        One problem per such leg, field ``leg N, burn`` (the library's way of naming a leg's field,
        :func:`~loadcheck.loading.leg_field`), saying what to give; nothing is checked or recorded.
    """
    from ..loading import leg_field

    missing = [number for number, tables in sorted(legs.items()) if "burn" not in tables]
    if missing:
        raise InputError(
            [
                Problem(
                    leg_field(number, "burn"),
                    f"no fuel used is given for leg {number}"
                    + ("" if legs[number] and any(legs[number].values()) else ", nor anything else")
                    + ": give its taxi and its trip fuel (or a trip time with a rate per hour), 0 for a leg that "
                    "burns none, or take the leg out; every leg after the first has its own, as each [[leg]] "
                    "table of a loading file has its burn; nothing was checked or recorded",
                )
                for number in missing
            ]
        )


def _inputs(
    desk: Desk, registration: str, overrides: Overrides, *, fuel_to_plan: bool = False, stop_to_plan: int | None = None
) -> CheckInputs:
    """The aircraft and the loading (one leg or a trip of several) resolved, as the command line reads them.

    ``fuel_to_plan`` for the most fuel: the answer chooses the fuel, so the fuel given (none, or
    too little for taxi and trip) is not refused, as ``plan fuel`` reads it. A leg given without its
    burn is refused first (:func:`_refuse_legs_without_burn`)."""
    from ..files import load_check_inputs

    _, path = desk.aircraft_path(registration)
    _refuse_legs_without_burn(overrides["legs"])
    return load_check_inputs(
        path, None, allow_trip=True, fuel_to_plan=fuel_to_plan, stop_to_plan=stop_to_plan, **overrides
    )


def _trip_or_given(inputs: CheckInputs) -> Loading | ResolvedTrip:
    """The trip to plan a stop of; a loading of one leg (no trip resolved) as given, which
    :func:`~loadcheck.trip.fuel_to_add` refuses in its own words (as ``plan stop`` gives it)."""
    trip = inputs.trip if inputs.trip is not None else inputs.given
    assert trip is not None, "load_check_inputs keeps the loading as given"
    return trip


def _checked_result(inputs: CheckInputs) -> CheckResult | TripResult:
    """The check of a loading.

    :func:`~loadcheck.trip.check_trip` for a trip, else :func:`~loadcheck.check.check_loading`.
    """
    if inputs.is_trip and inputs.trip is not None:
        from ..trip import check_trip

        return check_trip(inputs.aircraft, inputs.trip)
    from ..check import check_loading

    return check_loading(inputs.aircraft, inputs.loading)


def _chart_svg(inputs: CheckInputs, result: CheckResult | TripResult, *, compact: bool = False) -> str:
    """The envelope chart as SVG: a trip's with one path per leg (as ``check --chart`` draws them)."""
    from ..render.chart import check_figure, figure_svg, trip_figure
    from ..results import TripResult

    with _CHART_LOCK:
        if isinstance(result, TripResult):
            return figure_svg(trip_figure(inputs.aircraft, result, inputs.label))
        return figure_svg(check_figure(inputs.aircraft, result, inputs.label, compact=compact))


def _sheet(inputs: CheckInputs, result: CheckResult | TripResult) -> str:
    """The printable load sheet, made as ``check --sheet`` makes it (a trip's for a trip)."""
    from ..render.sheet import load_sheet_html, trip_sheet_html
    from ..results import TripResult

    if isinstance(result, TripResult):
        return trip_sheet_html(result, _chart_svg(inputs, result), loading_label=inputs.label, trip_loading=inputs.trip)
    return load_sheet_html(
        result,
        _chart_svg(inputs, result, compact=True),
        loading_label=inputs.label,
        loading=inputs.loading,
        pilot=inputs.given.pilot if inputs.given is not None else None,
        aircraft=inputs.aircraft,
    )


def _svg_body(svg: str) -> str:
    start = svg.find("<svg")
    return svg[start:] if start != -1 else svg


def create_app(
    fleet_dir: str | Path,
    *,
    db: str | Path | None = None,
    users: str | Path | None = None,
    secret: str | None = None,
    https_only: bool = False,
) -> FastAPI:
    """The desk as an ASGI application.

    Parameters
    ----------
    fleet_dir : the fleet folder (aircraft files; the mechanic's writes go there)
    db : the check log (default: the command line's, :func:`loadcheck.checklog.default_path`)
    users : the accounts file (default: :func:`loadcheck.web.users.default_users_path`)
    secret : the key signing session cookies (default: a new random one, so a restart signs everyone out)
    https_only : mark the session cookie Secure (behind a TLS proxy)
    """
    from ..checklog import default_path
    from ..fleet import load_fleet
    from .users import default_users_path

    folder = Path(fleet_dir)
    load_fleet(folder)  # refuse to start on a folder that is not a fleet
    desk = Desk(
        folder,
        Path(db) if db is not None else default_path(),
        UserStore(users if users is not None else default_users_path()),
    )
    app = FastAPI(
        title="loadcheck desk",
        version=__version__,
        docs_url=None,
        redoc_url=None,
        openapi_url=None,
        description="The flight school's desk: checks, planning, the check log and the empty-weight record, "
        "over loadcheck's library. Advisory: " + PILOT_CAUTION,
    )
    app.state.desk = desk
    app.add_middleware(
        SessionMiddleware,
        secret_key=secret or secrets.token_urlsafe(32),
        session_cookie="desk_session",
        max_age=12 * 3600,
        same_site="strict",
        https_only=https_only,
    )
    app.add_middleware(BodyLimit, limit=MAX_BODY_BYTES)
    app.mount("/static", StaticFiles(directory=_HERE / "static"), name="static")
    templates = Jinja2Templates(directory=str(_HERE / "templates"))
    env = templates.env
    from ..render.terminal import (
        CONDITION_STATE_HEADING,
        EDGE_NOTE,
        NO_RANGE_NOTE,
        cg_margin,
        condition_verdict,
        moment_table_columns,
        moment_table_figures,
        no_cg_range,
        weight_margin,
    )

    def recorded_state(condition: Mapping[str, object], result: Mapping[str, object]) -> tuple[str, str]:
        """A recorded condition's state (the check log keeps the result as its JSON), in the words of
        :func:`~loadcheck.render.terminal.condition_verdict`, by that same function."""
        found = result.get("findings")
        findings = [SimpleNamespace(**f) for f in found if isinstance(f, Mapping)] if isinstance(found, list) else []
        return condition_verdict(
            cast("Condition", SimpleNamespace(condition=condition.get("condition"), ok=bool(condition.get("ok")))),
            cast("CheckResult", SimpleNamespace(findings=findings)),
        )

    from ..empty_record import categories_words
    from ..trip import leg_verdict_text, trip_verdict_text

    env.globals.update(
        fmt=fmt,
        categories_words=categories_words,
        unit_label=unit_label,
        condition_verdict=condition_verdict,
        moment_table_columns=moment_table_columns,
        moment_table_figures=moment_table_figures,
        recorded_state=recorded_state,
        weight_margin=weight_margin,
        cg_margin=cg_margin,
        no_cg_range=no_cg_range,
        CONDITION_STATE_HEADING=CONDITION_STATE_HEADING,
        EDGE_NOTE=EDGE_NOTE,
        NO_RANGE_NOTE=NO_RANGE_NOTE,
        condition_words=condition_words,
        burn_path_summary=burn_path_summary,
        stretch_text=stretch_text,
        within_limits_text=within_limits_text,
        leg_verdict_text=leg_verdict_text,
        trip_verdict_text=trip_verdict_text,
        given_fuel_words=given_fuel_words,
        PILOT_CAUTION=PILOT_CAUTION,
        MECHANIC_CAUTION=MECHANIC_CAUTION,
        version=__version__,
    )

    def page(request: Request, template: str, status: int = 200, **context: object) -> HTMLResponse:
        account = None
        try:
            account = _account(request)
        except _SignInNeeded:
            pass
        return templates.TemplateResponse(
            request, template, {"account": account, "csrf": csrf_token(request.session), **context}, status_code=status
        )

    # -- errors: never a traceback, never a path of this machine ---------------------------------

    @app.exception_handler(_SignInNeeded)
    async def _sign_in(request: Request, _: Exception) -> Response:
        if request.url.path.startswith("/api/"):
            return JSONResponse({"detail": "sign in first"}, status_code=401)
        return RedirectResponse("/signin", status_code=303)

    @app.exception_handler(StarletteHTTPException)
    async def _http(request: Request, error: StarletteHTTPException) -> Response:
        detail = str(error.detail) if error.status_code != 404 else "There is no such page."
        if request.url.path.startswith("/api/"):
            return JSONResponse({"detail": detail}, status_code=error.status_code)
        return page(request, "message.html", error.status_code, title="Not possible here", message=detail)

    @app.exception_handler(RequestValidationError)
    async def _invalid(request: Request, error: RequestValidationError) -> Response:
        problems = [
            {"field": ".".join(str(p) for p in e.get("loc", ()) if p != "body"), "message": e.get("msg", "")}
            for e in error.errors()
        ]
        if request.url.path.startswith("/api/"):
            return JSONResponse({"problems": problems}, status_code=422)
        return page(
            request,
            "message.html",
            422,
            title="The request cannot be used",
            message="; ".join(f"{p['field']}: {p['message']}" for p in problems),
        )

    @app.exception_handler(LoadcheckError)
    async def _refused(request: Request, error: LoadcheckError) -> Response:
        problems = desk.problems(error)
        if request.url.path.startswith("/api/"):
            return JSONResponse({"problems": problems}, status_code=422)
        return page(
            request, "message.html", 422, title="Cannot be used", message="; ".join(p["message"] for p in problems)
        )

    @app.exception_handler(Exception)
    async def _bug(request: Request, error: Exception) -> Response:
        message = "Internal error: no result was produced and nothing was recorded. Please report it."
        if request.url.path.startswith("/api/"):
            return JSONResponse({"detail": message}, status_code=500)
        return HTMLResponse(f"<!doctype html><title>Internal error</title><p>{message}</p>", status_code=500)

    # -- signing in and out ----------------------------------------------------------------------

    @app.get("/signin", response_class=HTMLResponse)
    def signin_page(request: Request) -> Response:
        return page(request, "signin.html", title="Sign in")

    @app.post("/signin", response_class=HTMLResponse)
    async def signin(request: Request) -> Response:
        form = await _form(request, "name", "password")
        name, password = _text(form, "name"), _text(form, "password")
        client = request.client.host if request.client else "unknown"
        keys = [f"name:{name}", f"client:{client}"]
        wait = desk.throttle.wait(keys)
        if wait > 0:
            return page(
                request,
                "signin.html",
                429,
                title="Sign in",
                name=name,
                error=f"Too many failed sign-ins: wait {int(wait) + 1} seconds and try again.",
            )
        account = desk.users.verify(name, password)
        if account is None:
            desk.throttle.failed(keys)
            return page(
                request, "signin.html", 401, title="Sign in", name=name, error="That name and password do not match."
            )
        desk.throttle.succeeded(keys[0])
        request.session.clear()
        request.session["user"] = account.name
        request.session["csrf"] = secrets.token_urlsafe(32)
        return RedirectResponse("/fleet", status_code=303)

    @app.post("/signout")
    async def signout(request: Request) -> Response:
        await _form(request, *FORM_FIELDS)
        request.session.clear()
        return RedirectResponse("/signin", status_code=303)

    @app.get("/")
    def home(request: Request) -> Response:
        _account(request)
        return RedirectResponse("/fleet", status_code=303)

    # -- the fleet -------------------------------------------------------------------------------

    @app.get("/fleet", response_class=HTMLResponse)
    def fleet_page(request: Request, max_age: int | None = None) -> Response:
        _account(request)
        refuse_query(request.query_params.multi_items(), ("max_age",))
        from ..fleet import RECORD_AGE_DAYS, fleet_listing

        lines = fleet_listing(desk.fleet(), max_age)
        shown = RECORD_AGE_DAYS if max_age is None else max_age
        return page(request, "fleet.html", title="Fleet", lines=lines, max_age=shown, public=desk.public)

    # -- the pilot: check a loading (one leg or a trip), plan, record, the load sheet ------------

    def _form_page(
        request: Request, aircraft: Aircraft, typed: dict[str, str], problems: list[ProblemView], status: int = 200
    ) -> Response:
        bad = {p["field"] for p in problems} | {form_key(p["field"]) for p in problems}
        legs = int(typed.get("legs", "1"))
        return page(
            request,
            "check.html",
            status,
            title=f"Check a loading: {aircraft.registration}",
            aircraft=aircraft,
            typed=typed,
            problems=problems,
            bad=bad,
            legs=legs,
            max_legs=MAX_LEGS,
        )

    @app.get("/aircraft/{registration}", response_class=HTMLResponse)
    def check_form(request: Request, registration: str) -> Response:
        _need(request, "pilot")
        aircraft, _ = desk.aircraft_path(registration)
        return _form_page(request, aircraft, {}, [])

    async def _checked(
        request: Request, registration: str, *, fuel_to_plan: bool = False, also: tuple[str, ...] = ()
    ) -> tuple[Account, Aircraft, dict[str, str], CheckInputs | None, list[ProblemView]]:
        """The form read and checked: (account, aircraft, typed values, inputs or None, the library's problems);
        ``fuel_to_plan`` for the most fuel (:func:`_inputs`); ``also``, the route's own fields."""
        account = _need(request, "pilot")
        form = await _form(request)
        aircraft, _ = desk.aircraft_path(registration)
        typed, overrides = _overrides(form, aircraft, also=also)
        stop = typed.get("stop", "") if _text(form, "action") == "stop" else ""
        try:
            inputs = _inputs(
                desk,
                registration,
                overrides,
                fuel_to_plan=fuel_to_plan,
                stop_to_plan=int(stop) if stop.isdigit() else None,
            )
        except (LoadcheckError, ValidationError) as error:
            return account, aircraft, typed, None, desk.problems(error)
        return account, aircraft, typed, inputs, []

    def _form_again(
        request: Request, aircraft: Aircraft, typed: dict[str, str], problems: list[ProblemView]
    ) -> Response:
        return _form_page(request, aircraft, typed, problems, 422)

    @app.post("/aircraft/{registration}/edit", response_class=HTMLResponse)
    async def edit(request: Request, registration: str) -> Response:
        _need(request, "pilot")
        form = await _form(request)
        aircraft, _ = desk.aircraft_path(registration)
        typed, _ = _overrides(form, aircraft)
        return _form_page(request, aircraft, typed, [])

    def _legs_changed(request: Request, aircraft: Aircraft, form: FormData, action: str) -> Response:
        """The form again with a leg added or one taken out, everything typed kept (nothing is checked)."""
        count = leg_count(form)
        if action == "add_leg":
            typed, _ = _overrides(form, aircraft, min(MAX_LEGS, count + 1))
            return _form_page(request, aircraft, typed, [])
        typed, _ = _overrides(form, aircraft, count)
        number = action.removeprefix("remove_leg:")
        if not number.isdigit() or not 2 <= int(number) <= count:
            raise HTTPException(422, f"action: there is no leg {number[:20]!r} to take out")
        return _form_page(request, aircraft, _without_leg(typed, int(number)), [])

    @app.post("/aircraft/{registration}/check", response_class=HTMLResponse)
    async def check(request: Request, registration: str) -> Response:
        _need(request, "pilot")
        action = _text(await _form(request), "action")  # after the session and its form token are checked
        if action not in ("check", "fuel", "payload", "stop", "add_leg") and not re.fullmatch(
            r"remove_leg:[0-9]+", action
        ):  # a button this form does not have: never taken for another
            raise HTTPException(
                422, f"action: the form has no button {action[:40]!r}" if action else "action: no button was pressed"
            )
        if action == "add_leg" or action.startswith("remove_leg:"):
            _need(request, "pilot")
            form = await _form(request)
            aircraft, _ = desk.aircraft_path(registration)
            return _legs_changed(request, aircraft, form, action)
        _, aircraft, typed, inputs, problems = await _checked(request, registration, fuel_to_plan=action == "fuel")
        if inputs is None:
            return _form_again(request, aircraft, typed, problems)
        try:
            if action in ("fuel", "payload", "stop"):
                return _plan_page(request, aircraft, typed, inputs, action)
            result = _checked_result(inputs)
        except (LoadcheckError, ValidationError) as error:
            return _form_again(request, aircraft, typed, desk.problems(error))
        names = (
            [leg.names for leg in inputs.trip.legs]
            if inputs.is_trip and inputs.trip is not None
            else [inputs.loading.names]
        )
        return page(
            request,
            "result.html",
            title=f"Result: {aircraft.registration}",
            aircraft=aircraft,
            result=result,
            typed=typed,
            trip=inputs.is_trip,
            chart=_svg_body(_chart_svg(inputs, result)),
            names_by_leg=names,
        )

    def _plan_page(
        request: Request, aircraft: Aircraft, typed: dict[str, str], inputs: CheckInputs, action: str
    ) -> Response:
        """A planning answer from the form: most fuel (for a trip: at the first engine start), most payload
        (a single loading), or the fuel to put in at a stop of a trip."""
        from ..planning import most_fuel, most_payload
        from ..trip import fuel_to_add, trip_most_fuel

        plan: PlanResult
        if action == "fuel":
            plan = (
                trip_most_fuel(inputs.aircraft, inputs.trip)
                if inputs.is_trip and inputs.trip is not None
                else most_fuel(inputs.aircraft, inputs.loading)
            )
        elif action == "stop":
            leg = typed["stop"]
            if not leg.isdigit():
                raise InputError(Problem("stop", "choose the leg the stop comes before", value=leg or None))
            plan = fuel_to_add(inputs.aircraft, _trip_or_given(inputs), int(leg))
        else:
            if inputs.is_trip:
                raise InputError(
                    Problem(
                        "station",
                        "the most payload at a station is worked out for a loading of one "
                        "leg; for a trip, check each leg's payload by changing it",
                    )
                )
            plan = most_payload(inputs.aircraft, inputs.loading, typed["station"])
        return page(
            request, "plan.html", title=f"Planning: {aircraft.registration}", aircraft=aircraft, plan=plan, typed=typed
        )

    @app.post("/aircraft/{registration}/record")
    async def record(request: Request, registration: str) -> Response:
        from ..checklog import CheckLog, log_check

        account, aircraft, typed, inputs, problems = await _checked(request, registration, also=("data",))
        if inputs is None:
            return _form_again(request, aircraft, typed, problems)
        shown = (await request.form()).get("data")
        if shown != inputs.aircraft.fingerprint:  # the record must be of the check the pilot read
            why = (
                "the form does not say which aircraft data the check shown was made with"
                if not shown
                else f"the aircraft data changed since the check shown (it was made with data {shown}, the "
                f"aircraft file now holds {inputs.aircraft.fingerprint})"
            )
            problem = Problem(
                "data", f"nothing was recorded: {why}; check the loading again and read it before recording"
            )
            return _form_again(request, aircraft, typed, desk.problems(InputError(problem)))
        result = _checked_result(inputs)
        with CheckLog(desk.db) as log:
            record_id = log_check(log, inputs, result, source="web desk", version=__version__, pilot=account.name)
        return RedirectResponse(f"/records/{record_id}", status_code=303)

    @app.post("/aircraft/{registration}/sheet", response_class=HTMLResponse)
    async def sheet(request: Request, registration: str) -> Response:
        _, aircraft, typed, inputs, problems = await _checked(request, registration)
        if inputs is None:
            return _form_again(request, aircraft, typed, problems)
        return HTMLResponse(_sheet(inputs, _checked_result(inputs)))

    # -- the check log --------------------------------------------------------------------

    def _visible(account: Account, records: Iterable[LoggedCheck]) -> Iterable[LoggedCheck]:
        """Every record for a dispatcher; a pilot's own otherwise."""
        return records if account.has("dispatcher") else (r for r in records if r.pilot == account.name)

    _FILTERS = ("registration", "verdict", "date")

    def _found(
        account: Account, registration: str | None, verdict: str | None, day: dt.date | None
    ) -> list[LoggedCheck]:
        """The records the filters select, by the check log's own query (the command line's ``log list``):
        the registration compared as the fleet compares it, the verdict ``within`` or ``out``; ``None`` is
        no filter, and any other value, an empty one included, is refused in the library's words
        (:func:`loadcheck.checklog.filters_ok`), as ``log list --verdict ""`` is.

        Raises
        ------
        LoadcheckError
            The library's refusal of a filter (422).
        """
        from ..checklog import CheckLog, filters_ok

        filters_ok(registration, verdict)  # refused before the log is looked for: on an empty log too
        if not desk.db.exists():
            return []
        with CheckLog(desk.db) as log:
            found = log.find(since=day, until=day, registration=registration, verdict=verdict)
            return list(_visible(account, found))

    def _filled(value: str | None) -> str | None:
        """A field of the records page's own filter form: ``None`` (not filled in) where it was sent blank.

        Only for that form, whose selects send ``""`` for "every aircraft" and "any"; every other value
        goes to the library as sent (``" "`` is refused there). The API and the export take a filter
        as the command line does: an empty one is refused (:func:`loadcheck.checklog.filters_ok`).
        """
        return None if value == "" else value

    def _day(date: str | None) -> dt.date | None:
        if date is None:
            return dt.datetime.now(dt.UTC).date()
        if not date.strip():
            return None
        try:
            return dt.date.fromisoformat(date.strip())
        except ValueError:
            raise HTTPException(422, f"date: not a date: {date!r}; expected YYYY-MM-DD") from None

    @app.get("/records", response_class=HTMLResponse)
    def records_page(
        request: Request, registration: str | None = None, verdict: str | None = None, date: str | None = None
    ) -> Response:
        account = _account(request)
        refuse_query(request.query_params.multi_items(), _FILTERS)
        day = _day(date)
        # this page's own filter form posts a field left at "every aircraft" or "any" blank: not filled in
        registration, verdict = _filled(registration), _filled(verdict)
        records = _found(account, registration, verdict, day)
        registrations = sorted(e.registration for e in desk.fleet().entries if e.registration)
        if (
            registration and registration not in registrations
        ):  # shown chosen as given (``demo4t``), not as "every aircraft"
            registrations.append(registration)
        return page(
            request,
            "records.html",
            title="Check log",
            records=records,
            registrations=registrations,
            chosen={
                "registration": registration or "",
                "verdict": verdict or "",
                "date": "" if day is None else day.isoformat(),
            },
        )

    def _record(account: Account, record_id: int) -> LoggedCheck:
        from ..checklog import CheckLog

        if not desk.db.exists():
            raise HTTPException(404)
        with CheckLog(desk.db) as log:
            try:
                found = log.get(record_id)
            except LoadcheckError:
                raise HTTPException(404) from None
        if not account.has("dispatcher") and found.pilot != account.name:
            raise HTTPException(404)  # a pilot does not learn whether another's record exists
        return found

    @app.get("/records/export")
    def export(
        request: Request,
        format: str = "csv",
        registration: str | None = None,
        verdict: str | None = None,
        date: str | None = None,
    ) -> Response:
        from ..checklog import export_text

        account = _account(request)
        refuse_query(request.query_params.multi_items(), ("format", *_FILTERS))
        if format not in ("csv", "jsonl"):
            raise HTTPException(422, f"format: {format!r} is not an export format; expected csv or jsonl")
        text = export_text(_found(account, registration, verdict, _day(date)), format)
        kind = "text/csv" if format == "csv" else "application/x-ndjson"
        return PlainTextResponse(
            text, media_type=kind, headers={"content-disposition": f'attachment; filename="checks.{format}"'}
        )

    @app.get("/records/{record_id}", response_class=HTMLResponse)
    def record_page(request: Request, record_id: int) -> Response:
        import json

        account = _account(request)
        found = _record(account, record_id)
        return page(
            request,
            "record.html",
            title=f"Check {record_id}",
            record=found,
            verification=None,
            inputs_json=json.dumps(found.inputs, indent=2),
        )

    @app.post("/records/{record_id}/verify", response_class=HTMLResponse)
    async def verify_page(request: Request, record_id: int) -> Response:
        import json

        from ..checklog import CheckLog, verify

        account = _need(request, "dispatcher")
        await _form(request, *FORM_FIELDS)
        found = _record(account, record_id)
        with CheckLog(desk.db) as log:
            verification = verify(log, record_id)
        return page(
            request,
            "record.html",
            title=f"Check {record_id}",
            record=found,
            verification=verification,
            inputs_json=json.dumps(found.inputs, indent=2),
        )

    # -- the mechanic: a new empty-weight record -------------------------------------------------

    @app.get("/mechanic/{registration}", response_class=HTMLResponse)
    def mechanic_page(request: Request, registration: str) -> Response:
        from ..empty_record import history

        _need(request, "mechanic")
        aircraft, _ = desk.aircraft_path(registration)
        return page(
            request,
            "mechanic.html",
            title=f"Empty-weight record: {aircraft.registration}",
            aircraft=aircraft,
            history=history(aircraft),
            problems=[],
            typed={},
        )

    @app.post("/mechanic/{registration}/propose", response_class=HTMLResponse)
    async def propose_page(
        request: Request,
        registration: str,
        kind: str = Form(""),
        text: str = Form(""),
        upload: UploadFile | None = None,
    ) -> Response:
        from ..empty_record import history, propose

        account = _need(request, "mechanic")
        await _form(request, "kind", "text", "upload")
        if kind not in (
            "weighing",
            "alteration",
        ):  # never taken for one of them: the file would be read as the wrong kind
            raise HTTPException(
                422,
                (f"kind: the form has no choice {kind[:40]!r}" if kind else "kind: no choice was made")
                + ": nothing was worked out or written; choose scale readings (weighing) or equipment changes "
                "(alteration)",
            )
        aircraft, path = desk.aircraft_path(registration)

        def refused(error: LoadcheckError | ValidationError, typed: str) -> Response:
            """The page again with the problems and what was typed (or uploaded) in the box."""
            return page(
                request,
                "mechanic.html",
                422,
                title=f"Empty-weight record: {aircraft.registration}",
                aircraft=aircraft,
                history=history(aircraft),
                problems=desk.problems(error),
                typed={"kind": kind, "text": typed},
            )

        uploaded = upload is not None and bool(upload.filename)
        try:
            one_source(uploaded, text)  # both given: refused, neither read (never the upload over the typed text)
        except InputError as error:
            return refused(error, text)
        content = (await upload.read()) if upload is not None and uploaded else text.encode("utf-8")
        token = secrets.token_urlsafe(16)
        # the history names the file the record was made from: the upload's own name where it is a plain one
        given = Path(upload.filename or "").name if upload is not None and uploaded else ""
        name = (
            given
            if re.fullmatch(r"[A-Za-z0-9][A-Za-z0-9._-]{0,80}\.toml", given)
            else ("uploaded.toml" if uploaded else "typed-in.toml")
        )
        (desk.workdir / token).mkdir()
        source = desk.workdir / token / name
        source.write_bytes(content)
        try:
            # the file's aircraft key is read as beside the aircraft file it is entered for
            proposal = propose(
                path, source, "alteration" if kind == "alteration" else "weighing", relative_to=path.parent
            )
        except (LoadcheckError, ValidationError) as error:
            shutil.rmtree(source.parent, ignore_errors=True)
            return refused(error, content.decode("utf-8", "replace"))
        with desk.lock:
            desk.pending[token] = _Pending(account.name, registration, proposal, source, time.monotonic())
            while len(desk.pending) > _MAX_PENDING:
                _, old = desk.pending.popitem(last=False)
                shutil.rmtree(old.source.parent, ignore_errors=True)
        return page(
            request,
            "proposal.html",
            title=f"New empty-weight record: {aircraft.registration}",
            aircraft=aircraft,
            proposal=proposal,
            token=token,
            problems=[],
            extremes=proposal.extremes,
        )

    @app.post("/mechanic/{registration}/confirm", response_class=HTMLResponse)
    async def confirm_page(request: Request, registration: str) -> Response:
        from ..empty_record import history, make_current

        account = _need(request, "mechanic")
        form = await _form(request, "token", "confirm", "override", "note")
        token = _text(form, "token")
        with desk.lock:
            pending = desk.pending.get(token)
        if (
            pending is None
            or pending.user != account.name
            or registration_key(pending.registration) != registration_key(registration)
        ):  # compared as the fleet compares registrations: /mechanic/demo4t/confirm is DEMO-4T's
            raise HTTPException(404, "this proposed record is no longer waiting: enter the weighing or changes again")
        note = _text(form, "note").strip() or None
        try:
            make_current(
                pending.proposal,
                confirmed=form.get("confirm") == "yes",
                override=form.get("override") == "yes",
                by=account.name,
                note=note,
            )
        except LoadcheckError as error:
            aircraft, _ = desk.aircraft_path(registration)
            return page(
                request,
                "proposal.html",
                409,
                title=f"New empty-weight record: {aircraft.registration}",
                aircraft=aircraft,
                proposal=pending.proposal,
                token=token,
                problems=desk.problems(error),
                extremes=pending.proposal.extremes,
            )
        with desk.lock:
            desk.pending.pop(token, None)
        shutil.rmtree(pending.source.parent, ignore_errors=True)
        aircraft, _ = desk.aircraft_path(registration)
        return page(
            request,
            "mechanic.html",
            title=f"Empty-weight record: {aircraft.registration}",
            aircraft=aircraft,
            history=history(aircraft),
            problems=[],
            typed={},
            written=True,
        )

    # -- the JSON API: the command line's JSON shapes --------------------------------------------

    api = APIRouter(route_class=_ApiRoute)  # each body read by api_json: no key given twice

    @app.exception_handler(_BodyRefused)
    async def _body_refused(request: Request, error: _BodyRefused) -> Response:
        return JSONResponse({"problems": desk.problems(InputError(error.problems))}, status_code=422)

    def _api_inputs(body: CheckRequest, *, fuel_to_plan: bool = False, stop_to_plan: int | None = None) -> CheckInputs:
        legs = dict(enumerate(body.leg, start=2))
        return _inputs(
            desk,
            body.registration,
            Overrides(
                load=body.load, names=body.names, fuel=body.fuel, burn=body.burn, category=body.category, legs=legs
            ),
            fuel_to_plan=fuel_to_plan,
            stop_to_plan=stop_to_plan,
        )

    def _api_error(error: Exception) -> JSONResponse:
        return JSONResponse({"problems": desk.problems(error)}, status_code=422)

    @api.get("/api/openapi.json", include_in_schema=False)
    def openapi(request: Request) -> JSONResponse:
        _account(request)
        return JSONResponse(app.openapi())

    @api.get("/api/fleet", response_model=None)
    def api_fleet(request: Request, max_age: int | None = None) -> list[JsonObject]:
        """The fleet listing (as ``fleet list --json``), with no path of this machine in it.

        Each aircraft's file (named relative to the desk's fleet folder), record date, useful
        load, fingerprint and problems (their paths as the fleet page shows them).
        """
        from ..fleet import fleet_listing

        _account(request)
        refuse_query(request.query_params.multi_items(), ("max_age",))

        def named(path: str) -> str:  # as its user knows it: trainer4/aircraft.toml, not the server's path
            try:
                return Path(path).relative_to(desk.fleet_dir).as_posix()
            except ValueError:  # not under the folder as given (load_fleet searches only it): its name alone
                return Path(path).name

        return [
            line.to_dict() | {"file": named(line.file), "problems": [desk.public(p) for p in line.problems]}
            for line in fleet_listing(desk.fleet(), max_age)
        ]

    @api.post("/api/check", response_model=None)
    def api_check(request: Request, body: CheckRequest) -> JsonObject | JSONResponse:
        """Check a loading or a trip of several legs (the JSON of ``check --json``); with ``record``, record it
        and give its ``record_id``."""
        from ..checklog import CheckLog, log_check

        account = _need(request, "pilot")
        try:
            inputs = _api_inputs(body)
        except (LoadcheckError, ValidationError) as error:
            return _api_error(error)
        result = _checked_result(inputs)
        answer = result.to_dict()
        if body.record:
            with CheckLog(desk.db) as log:
                answer["record_id"] = log_check(
                    log, inputs, result, source="web desk", version=__version__, pilot=account.name
                )
        return answer

    @api.post("/api/plan/fuel", response_model=None)
    def api_plan_fuel(request: Request, body: CheckRequest) -> JsonObject | JSONResponse:
        """The most fuel at engine start for this load, at the first engine start of a trip (the JSON of
        ``plan fuel --json``)."""
        from ..planning import most_fuel
        from ..trip import trip_most_fuel

        _need(request, "pilot")
        try:
            inputs = _api_inputs(body, fuel_to_plan=True)  # as plan fuel: the answer chooses the fuel
            if inputs.is_trip and inputs.trip is not None:
                return trip_most_fuel(inputs.aircraft, inputs.trip).to_dict()
            return most_fuel(inputs.aircraft, inputs.loading).to_dict()
        except (LoadcheckError, ValidationError) as error:
            return _api_error(error)

    @api.post("/api/plan/stop", response_model=None)
    def api_plan_stop(request: Request, body: StopRequest) -> JsonObject | JSONResponse:
        """The fuel to put in at the stop before leg ``stop`` of a trip (the JSON of ``plan stop --json``)."""
        from ..trip import fuel_to_add

        _need(request, "pilot")
        try:
            inputs = _api_inputs(body, stop_to_plan=body.stop)  # the answer chooses that stop's fuel
            return fuel_to_add(inputs.aircraft, _trip_or_given(inputs), body.stop).to_dict()
        except (LoadcheckError, ValidationError) as error:
            return _api_error(error)

    @api.post("/api/plan/payload", response_model=None)
    def api_plan_payload(request: Request, body: PayloadRequest) -> JsonObject | JSONResponse:
        """The most payload at a station (the JSON of ``plan payload --json``)."""
        from ..planning import most_payload

        _need(request, "pilot")
        try:
            inputs = _api_inputs(body)
            if inputs.is_trip:
                raise InputError(Problem("leg", "the most payload at a station is worked out for a loading of one leg"))
            return most_payload(inputs.aircraft, inputs.loading, body.station).to_dict()
        except (LoadcheckError, ValidationError) as error:
            return _api_error(error)

    @api.get("/api/records", response_model=None)
    def api_records(
        request: Request, registration: str | None = None, verdict: str | None = None, date: str | None = None
    ) -> list[JsonObject]:
        """Records of checks (a pilot's own; every pilot's for a dispatcher), without their inputs and results."""
        account = _account(request)
        refuse_query(request.query_params.multi_items(), _FILTERS)
        return [r.summary() for r in _found(account, registration, verdict, _day(date if date is not None else ""))]

    @api.get("/api/records/{record_id}", response_model=None)
    def api_record(request: Request, record_id: int) -> JsonObject:
        """One record with its inputs and result (as ``log export --format jsonl`` gives it)."""
        found = _record(_account(request), record_id)
        return {**found.summary(), "inputs": found.inputs, "result": found.result}

    app.include_router(api)
    return app
