"""The desk's posted forms (loadcheck/web/form.py): a field the desk's own form does not have is
refused (422), never ignored, and the desk's own forms (every field their pages carry, buttons and
security tokens included) still go through.

The rule is the project's: fail closed at the boundary, a value the user gave is used or refused,
never dropped (DESIGN.md, "Fail closed"; RULES.md)."""

from __future__ import annotations

import re
from typing import Any

import pytest

pytest.importorskip("fastapi")
pytest.importorskip("argon2")

from .web_helpers import TRIP_LEG_2_AFT, WITHIN, _client, _post_check, _records, csrf_of

_FIELD = re.compile(r'<(?:input|select|textarea|button)\b[^>]*\bname="([^"]+)"')


def _own_fields(html: str, action: str) -> list[str]:
    """The field names of the page's form that posts to ``action`` (the page's own markup)."""
    start = html.index(f'action="{action}"')
    end = html.index("</form>", start)
    return list(dict.fromkeys(_FIELD.findall(html[start:end])))


def _selected(html: str, name: str) -> str:
    """What a browser sends for the page's ``<select name=...>``: the option marked selected, else the
    first (HTML Living Standard, "The select element": a select always has a value to send)."""
    start = html.index(f'name="{name}"')
    block = html[start : html.index("</select>", start)]
    options = re.findall(r'<option value="([^"]*)"( selected)?', block)
    return next((value for value, chosen in options if chosen), options[0][0])


def test_regression_a_crafted_field_of_the_check_form_is_refused(reading_desk: dict[str, Any]) -> None:
    """load.ghost (a station DEMO-4T lacks) was dropped and the loading checked without it."""
    client = _client(reading_desk, "pia")
    response = _post_check(client, {**WITHIN, "load.ghost": "80"})
    assert response.status_code == 422
    assert "this form has no field &#39;load.ghost&#39;" in response.text  # the page escapes the quotes
    assert "nothing was checked" in response.text and "WITHIN LIMITS" not in response.text


@pytest.mark.parametrize("route", ["sheet", "edit"])
def test_regression_the_result_pages_forms_refuse_a_crafted_field(reading_desk: dict[str, Any], route: str) -> None:
    client = _client(reading_desk, "pia")
    response = _post_check(client, {**WITHIN, "fuel.tip": "10"}, route=route)
    assert response.status_code == 422 and "fuel.tip" in response.text


def test_regression_recording_with_a_crafted_field_records_nothing(desk: dict[str, Any]) -> None:
    client = _client(desk, "pia")
    response = _post_check(client, {**WITHIN, "names.ghost": "Kim"}, route="record")
    assert response.status_code == 422 and "names.ghost" in response.text
    assert _records(desk) == []


def test_regression_many_crafted_fields_are_named_five_at_the_most(reading_desk: dict[str, Any]) -> None:
    client = _client(reading_desk, "pia")
    extra = {f"x{n}": "1" for n in range(8)}
    response = _post_check(client, {**WITHIN, **extra})
    assert response.status_code == 422 and "and 3 more" in response.text


def test_the_check_forms_own_fields_go_through(reading_desk: dict[str, Any]) -> None:
    """Every field the check page's form carries (its buttons, the security token, the leg count,
    the planning choices), posted as a browser would: a result, not a refusal."""
    client = _client(reading_desk, "pia")
    page = client.get("/aircraft/DEMO-4T").text
    fields = _own_fields(page, "/aircraft/DEMO-4T/check")
    assert {"csrf", "action", "legs", "category", "station", "load.front", "names.front"} <= set(fields)
    data = {name: WITHIN.get(name, "") for name in fields} | {"category": _selected(page, "category")}
    response = client.post(
        "/aircraft/DEMO-4T/check", data={**data, "csrf": csrf_of(page), "action": "check"}, follow_redirects=False
    )
    assert response.status_code == 200, response.text
    result = response.text
    for route in ("sheet", "edit"):
        hidden = re.findall(r'type="hidden" name="([^"]+)" value="([^"]*)"', result[result.index(f"/{route}") :])
        posted = client.post(f"/aircraft/DEMO-4T/{route}", data=dict(hidden), follow_redirects=False)
        assert posted.status_code == 200, (route, posted.text)


def test_a_trip_forms_own_fields_go_through(reading_desk: dict[str, Any]) -> None:
    client = _client(reading_desk, "pia")
    page = _post_check(client, TRIP_LEG_2_AFT, "TEST-T", route="edit").text  # the form again, with leg 2
    fields = _own_fields(page, "/aircraft/TEST-T/check")
    assert {"leg.2.label", "leg.2.load.front", "leg.2.fuel.main", "leg.2.burn.trip", "stop"} <= set(fields)
    data = {name: TRIP_LEG_2_AFT.get(name, "") for name in fields} | {"category": _selected(page, "category")}
    for action in ("check", "fuel", "add_leg", "remove_leg:2"):
        sent = {**data, "fuel.main": ""} if action == "fuel" else data  # the most fuel chooses the fuel at engine start
        response = client.post(
            "/aircraft/TEST-T/check", data={**sent, "csrf": csrf_of(page), "action": action}, follow_redirects=False
        )
        assert response.status_code == 200, (action, response.text)


def test_regression_sign_in_and_out_refuse_a_crafted_field(reading_desk: dict[str, Any]) -> None:
    from .web_helpers import PASSWORD

    client = _client(reading_desk)
    token = csrf_of(client.get("/signin").text)
    crafted = client.post(
        "/signin", data={"name": "pia", "password": PASSWORD, "csrf": token, "admin": "yes"}, follow_redirects=False
    )
    assert crafted.status_code == 422 and "admin" in crafted.text
    signed = _client(reading_desk, "pia")
    page = signed.get("/fleet").text
    assert signed.post("/signout", data={"csrf": csrf_of(page), "all": "1"}, follow_redirects=False).status_code == 422
    assert signed.post("/signout", data={"csrf": csrf_of(page)}, follow_redirects=False).status_code == 303


def test_regression_the_mechanics_form_refuses_a_crafted_field(reading_desk: dict[str, Any]) -> None:
    client = _client(reading_desk, "mo")
    page = client.get("/mechanic/DEMO-4T").text
    assert set(_own_fields(page, "/mechanic/DEMO-4T/propose")) == {"csrf", "kind", "upload", "text"}
    response = client.post(
        "/mechanic/DEMO-4T/propose",
        data={"kind": "weighing", "text": "", "csrf": csrf_of(page), "force": "yes"},
        follow_redirects=False,
    )
    assert response.status_code == 422 and "force" in response.text


@pytest.mark.parametrize("route", ["check", "record"])
def test_regression_a_field_posted_twice_was_read_with_its_last_value(desk: dict[str, Any], route: str) -> None:
    """load.front posted as 170 then 10 was checked with 10 (starlette keeps the last value), within limits."""
    client = _client(desk, "pia")
    response = _post_check(client, {**WITHIN, "load.front": ["170", "10"]}, route=route)  # type: ignore[dict-item]
    assert response.status_code == 422
    assert "gives the field &#39;load.front&#39; more than once" in response.text
    assert "WITHIN LIMITS" not in response.text and _records(desk) == []


def test_the_check_form_takes_its_category_as_sent_and_refuses_a_button_it_has_not(desk) -> None:
    # trial 12, finding 5: a crafted form's category 'utility ' was trimmed and checked as utility (the
    # command line and the API refuse it); an unknown action word, or none, was taken for "check"; and a
    # form with no category field was checked in the default category, then its "Record this check" sent
    # category="" and was refused
    from .web_helpers import WITHIN, _client, _records, csrf_of

    client = _client(desk, "pia")
    token = csrf_of(client.get("/aircraft/DEMO-4T").text)
    trimmed = client.post(
        "/aircraft/DEMO-4T/check", data={**WITHIN, "category": "utility ", "action": "check", "csrf": token}
    )
    assert trimmed.status_code == 422 and "unknown category &#39;utility &#39;" in trimmed.text  # as the library says
    for action in ("bogus", "CHECK", ""):
        refused = client.post("/aircraft/DEMO-4T/check", data={**WITHIN, "action": action, "csrf": token})
        assert refused.status_code == 422, action
    without = client.post("/aircraft/DEMO-4T/check", data={**WITHIN, "action": "check", "csrf": token})
    assert (
        without.status_code == 200 and 'name="category"' not in without.text.split("/record", 1)[1].split("</form>")[0]
    )
    assert _records(desk) == []
