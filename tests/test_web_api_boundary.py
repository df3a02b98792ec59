"""The desk's JSON API boundary, its plan-fuel job and the words of its conditions and mechanic pages.

The rules checked here are the library's own, reached the one way the command line reaches
them (loadcheck/files.load_check_inputs over a loading's raw values): each test compares the
desk's answer with the library's or the command line's for the same values, never with words
or numbers of its own. The outside sources the rules come from are named beside each check:
RFC 8259 (The JavaScript Object Notation (JSON) Data Interchange Format, December 2017),
TOML v1.0.0 (toml.io, "Keys" and "Table"), and the project's rule "fail closed at the boundary"
(common practice: a value is used as given or refused, never converted or guessed).
"""

from __future__ import annotations

import json
import math
from html import escape
from pathlib import Path
from typing import Any

import pytest

pytest.importorskip("fastapi")
pytest.importorskip("argon2")

from loadcheck.errors import LoadcheckError
from loadcheck.files import load_check_inputs

from .helpers import assert_input_error, invoke
from .web_helpers import SAMPLES, _client, _post_check, _records, csrf_of

TRAINER = SAMPLES / "trainer4" / "aircraft.toml"
BODY: dict[str, Any] = {
    "registration": "DEMO-4T",
    "load": {"front": 340, "rear": 160, "hold": "15 kg"},
    "fuel": {"mains": "school", "centre": 0},
    "burn": {"taxi": 1.2, "trip": 18, "reserve": 8},
}
ROUTES = {"check": {}, "plan/fuel": {}, "plan/payload": {"station": "hold"}, "plan/stop": {"stop": 2}}


def _library_words(**overrides: Any) -> list[str]:
    """The library's problems (as the desk shows them: no file) for a loading of these raw values."""
    with pytest.raises(LoadcheckError) as refused:
        load_check_inputs(TRAINER, None, allow_trip=True, **{**_tables(BODY), **overrides})
    return [p.describe() for p in refused.value.problems]


def _tables(body: dict[str, Any]) -> dict[str, Any]:
    return {key: body[key] for key in ("load", "fuel", "burn")}


def _with(table: str, key: str, value: object) -> dict[str, Any]:
    return {**BODY, table: {**BODY[table], key: value}}


# -- booleans, JSON strings, NaN and infinities --------------------------------------------------


@pytest.mark.parametrize(
    ("table", "key", "value"),
    [("load", "front", True), ("load", "rear", False), ("fuel", "mains", True), ("burn", "taxi", True)],
)
def test_regression_api_refuses_a_boolean_weight_or_fuel_in_the_librarys_words(
    desk: dict[str, Any], tmp_path: Path, table: str, key: str, value: bool
) -> None:
    """A ``true`` where a weight or fuel goes was read as 1 (pydantic's lax mode) and checked "ok":
    every API route now refuses it as a loading file and the command line do (fail closed;
    loadcheck/filemodel.py's rule), with the same words, and records nothing."""
    client = _client(desk, "pia")
    body = _with(table, key, value)
    expected = _library_words(**{table: body[table]})
    assert expected and all("true or false" in words for words in expected)
    for route, extra in ROUTES.items():
        response = client.post(f"/api/{route}", json={**body, **extra, "record": route == "check"})
        assert response.status_code == 422, (route, response.text)
        assert [p["message"] for p in response.json()["problems"]] == expected, route
    assert _records(desk) == []
    # the same value in a loading file is refused by the command line in the same words
    loading = tmp_path / "loading.toml"
    text = json.dumps(value)  # true / false, as TOML writes them too
    tables = {**_tables(BODY), table: {**BODY[table], key: text}}
    loading.write_text(
        'format = 1\naircraft = "'
        + str(TRAINER)
        + '"\n'
        + "".join(f"[{name}]\n" + "".join(f"{k} = {_toml(v)}\n" for k, v in t.items()) for name, t in tables.items()),
        encoding="utf-8",
    )
    assert_input_error(invoke(*["check", str(loading)]), *expected)


def _toml(value: object) -> str:
    return value if value in ("true", "false") else json.dumps(value)  # type: ignore[return-value]


@pytest.mark.parametrize("constant", ["NaN", "Infinity", "-Infinity"])
@pytest.mark.parametrize(("table", "key"), [("load", "front"), ("fuel", "mains"), ("burn", "trip")])
def test_regression_api_refuses_nan_and_infinity_in_the_librarys_words(
    reading_desk: dict[str, Any], constant: str, table: str, key: str
) -> None:
    """RFC 8259 section 6 has no NaN or infinity, but Python's ``json`` reads them: the desk hands
    them to the library, which refuses a number that is not finite, naming the field."""
    client = _client(reading_desk, "pia")
    number = {"NaN": math.nan, "Infinity": math.inf, "-Infinity": -math.inf}[constant]
    expected = _library_words(**{table: {**BODY[table], key: number}})
    assert any(f"{table}.{key}" in words and "finite" in words for words in expected)
    text = json.dumps(_with(table, key, "HERE")).replace('"HERE"', constant)
    for route, extra in ROUTES.items():
        body = text[:-1] + "".join(f", {json.dumps(k)}: {json.dumps(v)}" for k, v in extra.items()) + "}"
        response = client.post(f"/api/{route}", content=body, headers={"content-type": "application/json"})
        assert response.status_code == 422, (route, response.text)
        assert [p["message"] for p in response.json()["problems"]] == expected, route


@pytest.mark.parametrize("number", ["1e-400", "-2.5e-330", "1e400", "-1.0E+999"])
@pytest.mark.parametrize(("table", "key"), [("load", "front"), ("fuel", "mains"), ("burn", "trip")])
def test_regression_api_read_a_number_no_float_holds_as_zero_or_infinite(
    reading_desk: dict[str, Any], number: str, table: str, key: str
) -> None:
    """A final review: Python's ``json`` reads ``1e-400`` as 0.0 and ``1e400`` as infinity, so a JSON
    weight of ``1e-400`` was checked as nothing and ``1e400`` was refused as "got inf", a figure the
    user never sent. RFC 8259 section 6 leaves the range of numbers to the reader; the desk now hands
    such a number to the library as written, which refuses it as it refuses ``--load front=1e-400``
    (IEEE 754 binary64 holds no normal number below about 2.2e-308 or above 1.8e308, from memory)."""
    client = _client(reading_desk, "pia")
    expected = _library_words(**{table: {**BODY[table], key: number}})
    assert any(f"{table}.{key}" in words and number in words for words in expected), expected
    text = json.dumps(_with(table, key, "HERE")).replace('"HERE"', number)
    assert float(number) in (0.0, math.inf, -math.inf) and json.loads(text)  # the reader's own reading
    for route, extra in ROUTES.items():
        body = text[:-1] + "".join(f", {json.dumps(k)}: {json.dumps(v)}" for k, v in extra.items()) + "}"
        response = client.post(f"/api/{route}", content=body, headers={"content-type": "application/json"})
        assert response.status_code == 422, (route, response.text)
        assert [p["message"] for p in response.json()["problems"]] == expected, route


@pytest.mark.parametrize(
    ("where", "number", "path"),
    [
        ('"label": HERE', "1e400", "label"),  # a text field: never read as the text "1e400"
        ('"burn": {"order": ["mains", HERE]}', "1E400", "burn.order[1]"),
        ('"load": {"front": HERE}', "1" + "0" * 400, "load.front"),  # an integer beyond any float
    ],
)
def test_regression_a_number_no_float_holds_became_text_in_a_text_field(
    reading_desk: dict[str, Any], where: str, number: str, path: str
) -> None:
    """A review: the number hook handed ``1e400`` on as the text "1e400", so ``"label": 1e400`` was taken
    as a label where ``1.5`` is refused, and in ``burn.order`` it was named an unknown tank. It is refused
    where it stands, naming its path, in the library's words (RFC 8259 section 6 leaves the range to the
    reader; IEEE 754 binary64 holds no number above about 1.8e308, from memory)."""
    client = _client(reading_desk, "pia")
    body = '{"registration": "DEMO-4T", ' + where.replace("HERE", number) + "}"
    response = client.post("/api/check", content=body, headers={"content-type": "application/json"})
    assert response.status_code == 422, response.text
    [problem] = response.json()["problems"]
    assert problem["field"] == path and "is not a finite number" in problem["message"]


def test_regression_api_reads_a_weight_as_text_as_the_command_line_does(reading_desk: dict[str, Any]) -> None:
    """A weight given as a JSON string is the library's to read, as ``--load front=340`` is (a
    string with or without a unit): the same check as the command line's, never a guess of the desk's."""
    client = _client(reading_desk, "pia")
    body = {**BODY, "load": {"front": "340", "rear": "160", "hold": "15 kg"}}
    answer = client.post("/api/check", json=body).json()
    cli = invoke(
        *[
            "check",
            str(TRAINER),
            "--load",
            "front=340",
            "--load",
            "rear=160",
            "--load",
            "hold=15 kg",
            "--fuel",
            "mains=school",
            "--fuel",
            "centre=0",
            "--taxi",
            "1.2",
            "--trip",
            "18",
            "--reserve",
            "8",
            "--json",
        ],
    )
    assert json.loads(cli.stdout) == answer


@pytest.mark.parametrize(
    ("field", "value", "route"),
    [
        ("record", "yes", "check"),
        ("record", 1, "check"),
        ("record", "true", "check"),
        ("stop", "2", "plan/stop"),
        ("stop", True, "plan/stop"),
        ("stop", 2.0, "plan/stop"),
    ],
)
def test_regression_api_desk_fields_take_only_their_json_type(
    desk: dict[str, Any], field: str, value: object, route: str
) -> None:
    """The desk's own fields were read in pydantic's lax mode (``"record": "yes"`` recorded,
    ``"stop": true`` was leg 1): a value of another JSON type is refused, naming the field and
    the value as sent, and nothing is recorded (fail closed, common practice)."""
    client = _client(desk, "pia")
    response = client.post(f"/api/{route}", json={**BODY, field: value})
    assert response.status_code == 422
    [problem] = response.json()["problems"]
    assert problem["field"] == field and problem["value"] == str(value) and repr(value) in problem["message"]
    assert _records(desk) == []
    assert client.post("/api/check", json={**BODY, "record": True}).json()["record_id"] >= 1  # the JSON type is taken


def test_regression_api_names_an_unknown_field_as_a_loading_file_does(reading_desk: dict[str, Any]) -> None:
    """A misspelt field of the body is refused in the library's words for an unknown key of a
    loading file (loadcheck/files.problems_from_validation: the key it is closest to), not the
    framework's; a query value is named by its parameter and value (fail closed, common practice)."""
    from loadcheck.files import parse_loading

    client = _client(reading_desk, "pia")
    with pytest.raises(LoadcheckError) as refused:
        parse_loading({"lod": {"front": 340}})
    [expected] = refused.value.problems
    response = client.post("/api/check", json={"registration": "DEMO-4T", "lod": {"front": 340}})
    assert response.status_code == 422
    [problem] = response.json()["problems"]
    assert problem["field"] == "lod" and problem["message"] == expected.describe() and "'load'" in expected.message
    query = client.get("/api/fleet?max_age=soon")
    assert query.status_code == 422 and query.json()["problems"][0]["field"] == "max_age"
    assert "'soon'" in query.json()["problems"][0]["message"]


# -- a key given twice ----------------------------------------------------------------------------


@pytest.mark.parametrize(
    ("text", "field", "first", "second"),
    [
        ('"load": {"front": 170, "rear": 160, "front": 10}', "load.front", "170", "10"),
        ('"load": {"front": 340}, "registration": "DEMO-6P"', "registration", '"DEMO-4T"', '"DEMO-6P"'),
        ('"load": {"front": 340}, "burn": {"trip": 18, "trip": 1}', "burn.trip", "18", "1"),
        (
            '"load": {"front": 340}, "leg": [{"burn": {"trip": 5}, "load": {"rear": 0, "rear": 90}}]',
            "leg[0].load.rear",
            "0",
            "90",
        ),
        ('"load": {"front": 340}, "fuel": {"mains": "school"}, "fuel": {"mains": "full"}', "fuel", "{...}", "{...}"),
    ],
)
def test_regression_api_refuses_a_key_given_twice(
    desk: dict[str, Any], tmp_path: Path, text: str, field: str, first: str, second: str
) -> None:
    """Python's ``json`` keeps the last of a key given twice (``"front": 170, "front": 10`` was
    checked with 10, "ok"); RFC 8259 section 4 leaves duplicate names to the reader and TOML
    v1.0.0 ("Keys": defining a key multiple times is invalid) refuses them: the desk refuses
    them at any depth, naming the key by its path and both values, and records nothing."""
    client = _client(desk, "pia")
    body = '{"registration": "DEMO-4T", ' + text + ', "record": true}'
    for route in ("check", "plan/fuel"):
        response = client.post(f"/api/{route}", content=body, headers={"content-type": "application/json"})
        assert response.status_code == 422, response.text
        [problem] = response.json()["problems"]
        assert problem["field"] == field and f"({first}, then {second})" in problem["message"], problem
    assert _records(desk) == []
    # the same in a loading file: the library refuses it too (the TOML reader's rule)
    loading = tmp_path / "twice.toml"
    loading.write_text(f'format = 1\naircraft = "{TRAINER}"\n[load]\nfront = 170\nfront = 10\n', encoding="utf-8")
    assert_input_error(invoke(*["check", str(loading)]), "TOML")


def test_regression_api_body_that_is_not_json_is_refused_with_where(reading_desk: dict[str, Any]) -> None:
    """A body that is not JSON (RFC 8259 section 2) is refused with the reader's words and where."""
    client = _client(reading_desk, "pia")
    response = client.post(
        "/api/check",
        content='{"registration": "DEMO-4T", "load": {"front": 1',
        headers={"content-type": "application/json"},
    )
    assert response.status_code == 422
    [problem] = response.json()["problems"]
    assert "not JSON" in problem["message"] and "line 1, column" in problem["message"]
    deep = "[" * 100_000 + "]" * 100_000  # more nesting than a reader can follow: refused, never a traceback
    assert client.post("/api/check", content=deep, headers={"content-type": "application/json"}).status_code == 422


# -- the most fuel without fuel given ----------------------------------------------------------------


def test_regression_plan_fuel_without_fuel_is_the_command_lines_answer(reading_desk: dict[str, Any]) -> None:
    """docs/planning.md: ``plan fuel`` needs no fuel given (the answer chooses it). The desk
    refused a loading with no fuel ("taxi and trip fuel exceed the fuel the burn order can
    use"); the API and the form now give the command line's answer for the same values."""
    client = _client(reading_desk, "pia")
    body = {"registration": "DEMO-4T", "load": {"front": 340, "rear": 160}, "burn": {"taxi": 1.2, "trip": 18}}
    cli = invoke(
        *[
            "plan",
            "fuel",
            str(TRAINER),
            "--load",
            "front=340",
            "--load",
            "rear=160",
            "--taxi",
            "1.2",
            "--trip",
            "18",
            "--json",
        ]
    )
    expected = json.loads(cli.stdout)
    assert expected["feasible"] and expected["answer"] > 0
    assert client.post("/api/plan/fuel", json=body).json() == expected
    form = _post_check(
        client, {"load.front": "340", "load.rear": "160", "burn.taxi": "1.2", "burn.trip": "18"}, action="fuel"
    )
    assert form.status_code == 200 and escape(expected["answer_display"]) in form.text
    # a check of the same loading still needs its fuel: only the planning answer chooses it
    check = _post_check(client, {"load.front": "340", "load.rear": "160", "burn.taxi": "1.2", "burn.trip": "18"})
    assert check.status_code == 422 and "burn" in check.text


# -- the mechanic's page without an empty-weight CG range ---------------------------------------------


def test_regression_proposal_says_no_cg_range_when_the_aircraft_file_gives_none(reading_desk: dict[str, Any]) -> None:
    """The sample trainer's file gives no ``cg_range``: the proposal page said the new record was
    "inside the empty-weight CG range". It now says the file gives none (as the record sheet
    does, render/sheet.py), and names the range where the file gives one (sample tandem2)."""
    from loadcheck.empty_record import propose

    trainer = propose(TRAINER, SAMPLES / "trainer4" / "weighing.toml", "weighing").result
    assert trainer.cg_range is None and not trainer.warnings and not trainer.refusals
    mo = _client(reading_desk, "mo")
    page = mo.get("/mechanic/DEMO-4T").text
    weighing = (SAMPLES / "trainer4" / "weighing.toml").read_text(encoding="utf-8")
    shown = mo.post("/mechanic/DEMO-4T/propose", data={"kind": "weighing", "text": weighing, "csrf": csrf_of(page)})
    assert shown.status_code == 200
    assert "CG range" in shown.text and "inside the empty-weight CG range" not in shown.text
    assert "gives no empty-weight CG range" in shown.text
    tandem = SAMPLES / "tandem2" / "aircraft.toml"
    changes = 'format = 1\naircraft = "aircraft.toml"\ndate = 2026-11-29\ndescription = "a placard"\n'
    changes += '[[change]]\naction = "install"\nitem = "placard"\nweight = 0.1\narm = 312.0\n'
    page = mo.get("/mechanic/DEMO-2T").text
    shown = mo.post("/mechanic/DEMO-2T/propose", data={"kind": "alteration", "text": changes, "csrf": csrf_of(page)})
    from loadcheck.files import load_aircraft

    low, high = load_aircraft(tandem).empty.cg_range or (math.nan, math.nan)
    from loadcheck.display import fmt

    assert f"inside the empty-weight CG range ({fmt(low, 'mm')} to {fmt(high, 'mm')})" in shown.text, shown.text


def test_regression_an_empty_category_was_replaced_by_the_aircrafts_first(desk: dict[str, Any], tmp_path: Path) -> None:
    """`check utility_aft.toml --category ""` checked the utility loading under the normal category and said
    WITHIN LIMITS, exit 0 (an empty text was taken as "not given"). A category given, even empty, is now
    used as given and refused as an unknown category (fail closed, common practice) on the command line,
    in a loading file, through every API route and the form; nothing is recorded."""
    utility = SAMPLES / "trainer4" / "utility_aft.toml"
    assert invoke("check", str(utility)).exit_code == 1  # out of limits in its own (utility) category
    for args in (["check", str(utility)], ["plan", "fuel", str(utility)], ["schedule", str(TRAINER)]):
        assert_input_error(invoke(*args, "--category", ""), "--category ''", "unknown category ''", "normal, utility")
    loading = tmp_path / "empty_category.toml"
    loading.write_text(utility.read_text(encoding="utf-8").replace('category = "utility"', 'category = ""'))
    assert 'category = ""' in loading.read_text()
    loading.write_text(loading.read_text().replace('aircraft = "aircraft.toml"', f'aircraft = "{TRAINER}"'))
    assert_input_error(invoke("check", str(loading)), "category: unknown category ''")
    client = _client(desk, "pia")
    for route, extra in ROUTES.items():
        response = client.post(f"/api/{route}", json={**BODY, **extra, "category": "", "record": route == "check"})
        assert response.status_code == 422, (route, response.text)
        assert any("unknown category ''" in p["message"] for p in response.json()["problems"]), route
    form = {"load.front": "340", "fuel.mains": "school", "category": ""}
    response = _post_check(client, form)
    assert response.status_code == 422 and "unknown category" in response.text and "WITHIN LIMITS" not in response.text
    assert _records(desk) == []


# -- registrations as the fleet compares them ----------------------------------------------------


@pytest.mark.parametrize("spelt", ["demo 4t", "DEMO4T", "demo-4t", " DEMO-4T"])
def test_regression_api_check_of_a_registration_spelt_otherwise_was_an_internal_error(
    reading_desk: dict[str, Any], spelt: str
) -> None:
    """``demo 4t`` is DEMO-4T, as the command line and the fleet find it (loadcheck.aircraft.registration_key;
    common practice: a registration is written with or without its hyphen, in either case): the same
    answer as the file's own spelling, where the desk gave 500 "Internal error"."""
    client = _client(reading_desk, "pia")
    exact = client.post("/api/check", json=BODY)
    other = client.post("/api/check", json={**BODY, "registration": spelt})
    assert other.status_code == exact.status_code == 200, other.text
    assert other.json() == exact.json()


def test_api_check_of_an_unknown_registration_names_it(reading_desk: dict[str, Any]) -> None:
    """An unknown registration is refused in the fleet's words (422, the registration named), never a 500."""
    response = _client(reading_desk, "pia").post("/api/check", json={**BODY, "registration": "NOPE-1"})
    assert response.status_code == 422, response.text
    [problem] = response.json()["problems"]
    assert problem["field"] == "registration" and "unknown registration 'NOPE-1'" in problem["message"]


@pytest.mark.parametrize(
    ("body", "path"),
    [
        (_with("burn", "taxi", None), "burn.taxi"),
        ({**BODY, "category": None}, "category"),
        (_with("load", "rear", None), "load.rear"),
        (_with("fuel", "centre", None), "fuel.centre"),
    ],
)
def test_regression_api_a_null_is_refused_at_its_place(
    reading_desk: dict[str, Any], body: dict[str, Any], path: str
) -> None:
    """An outside trial's find: ``"burn": {"taxi": null}`` and ``"category": null`` were taken as not
    given (within limits, 200) while ``"load": {"rear": null}`` was refused: one rule now, a null is
    refused naming its place (a field left out is not given)."""
    client = _client(reading_desk, "pia")
    for route, extra in ROUTES.items():
        response = client.post(f"/api/{route}", json={**body, **extra})
        assert response.status_code == 422, (route, response.text)
        problems = response.json()["problems"]
        assert [p["field"] for p in problems] == [path] and "null is not a value" in problems[0]["message"], problems


def test_the_published_schema_declares_no_null_the_api_refuses(reading_desk: dict[str, Any]) -> None:
    """A review: since a null is refused, ``/api/openapi.json`` still said ``category`` (and every load,
    fuel and burn value) could be null, so a client made from the schema would send what is refused."""
    client = _client(reading_desk, "pia")
    schema = client.get("/api/openapi.json").json()
    request = schema["components"]["schemas"]["CheckRequest"]["properties"]
    assert request["category"]["type"] == "string" and "anyOf" not in request["category"]
    for table in ("load", "fuel", "burn", "names"):
        assert request[table]["additionalProperties"] == {"not": {"type": "null"}}, table
