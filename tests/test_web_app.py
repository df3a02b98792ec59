"""The desk's pages and API through the framework's test client (issue 19).

The figures a check shows come from the engine (tests/test_check.py holds their sources);
these tests check that the desk calls the same jobs as the command line and gives their
answers unchanged (loadcheck/web/app.py). The security rules (sign-in throttle, CSRF, body
limit, bind address) are in tests/test_web_security.py, the accounts in tests/test_web_users.py.
"""

from __future__ import annotations

import json
import re
from html import escape, unescape
from pathlib import Path
from typing import Any

import pytest

pytest.importorskip("fastapi")
pytest.importorskip("argon2")

from fastapi.testclient import TestClient

from loadcheck.check import check_loading
from loadcheck.checklog import CheckLog
from loadcheck.files import load_check_inputs

from .helpers import AppRunner
from .web_helpers import PASSWORD, SAMPLES, TRIP_LEG_2_AFT, WITHIN, _client, _post_check, _records, csrf_of, sign_in

# -- signing in ----------------------------------------------------------------------------------


def test_every_page_but_sign_in_needs_signing_in(reading_desk: dict[str, Any]) -> None:
    client = _client(reading_desk)
    assert client.get("/signin").status_code == 200
    for path in ("/", "/fleet", "/aircraft/DEMO-4T", "/records", "/records/1", "/records/export", "/mechanic/DEMO-4T"):
        response = client.get(path, follow_redirects=False)
        assert response.status_code == 303 and response.headers["location"] == "/signin", path
    for path in ("/api/fleet", "/api/records", "/api/records/1", "/api/openapi.json"):
        assert client.get(path).status_code == 401, path
    assert client.post("/api/check", json={"registration": "DEMO-4T"}).status_code == 401
    assert (
        client.get("/docs").status_code == 404 and client.get("/openapi.json").status_code == 404
    )  # no pages fetching outside scripts


def test_sign_in_and_out(desk: dict[str, Any]) -> None:
    client = _client(desk)
    assert sign_in(client, "pia", "wrong password").status_code == 401
    assert sign_in(client, "pia").status_code == 303
    fleet = client.get("/fleet")
    assert fleet.status_code == 200 and "pia (pilot)" in fleet.text
    signout = client.post("/signout", data={"csrf": csrf_of(fleet.text)}, follow_redirects=False)
    assert signout.status_code == 303
    assert client.get("/fleet", follow_redirects=False).status_code == 303


def test_session_cookie_is_httponly_and_samesite(reading_desk: dict[str, Any]) -> None:
    response = sign_in(_client(reading_desk), "pia")
    cookie = response.headers["set-cookie"].lower()
    assert "httponly" in cookie and "samesite=strict" in cookie


def test_api_takes_only_json_bodies(reading_desk: dict[str, Any]) -> None:
    """A cross-site form cannot post JSON: a form-encoded or text body is refused, nothing is recorded."""
    client = _client(reading_desk, "pia")
    body = json.dumps({"registration": "DEMO-4T", "load": {"front": 340}, "record": True})
    for kind in ("text/plain", "application/x-www-form-urlencoded"):
        response = client.post("/api/check", content=body, headers={"content-type": kind})
        assert response.status_code == 422, kind
    assert _records(reading_desk) == []


# -- the fleet -----------------------------------------------------------------------------------


def test_fleet_lists_every_aircraft_with_its_figures(reading_desk: dict[str, Any]) -> None:
    from loadcheck.files import load_aircraft

    page = _client(reading_desk, "pia").get("/fleet").text
    trainer = load_aircraft(SAMPLES / "trainer4" / "aircraft.toml")
    for reg in ("DEMO-4T", "DEMO-6P"):
        assert reg in page
    assert trainer.fingerprint in page and "2026-02-09" in page
    from loadcheck.display import fmt

    assert fmt(trainer.empty.weight, "lb") in page and fmt(trainer.useful_load, "lb", "down") in page


def test_fleet_flags_an_invalid_file_and_an_undated_record(desk: dict[str, Any]) -> None:
    bad = desk["fleet"] / "broken.toml"
    bad.write_text(
        'format = 1\nname = "x"\nregistration = "BROKEN-1"\n[units]\nmass = "lb"\narm = "in"\nfuel_volume = "usgal"\n'
    )
    trainer = desk["fleet"] / "trainer4" / "aircraft.toml"
    undated = desk["fleet"] / "undated.toml"
    undated.write_text(
        trainer.read_text()
        .replace('registration = "DEMO-4T"', 'registration = "UNDATED-1"')
        .replace("date = 2026-02-09\n", "")
    )
    page = _client(desk, "pia").get("/fleet").text
    row = page[page.index("BROKEN-1") :]
    assert "cannot be used" in row[:2000]
    assert "not dated" in page[page.index("UNDATED-1") :][:3000]
    assert str(desk["fleet"]) not in page  # no path of this machine


def test_fleet_api_is_the_fleet_listing(reading_desk: dict[str, Any]) -> None:
    # the library's listing, each file named relative to the desk's fleet folder (docs/web.md)
    from loadcheck.fleet import fleet_listing, load_fleet

    answer = _client(reading_desk, "dan").get("/api/fleet").json()
    fleet = reading_desk["fleet"]
    expected = [
        line.to_dict() | {"file": Path(line.file).relative_to(fleet).as_posix()}
        for line in fleet_listing(load_fleet(fleet))
    ]
    assert answer == expected


def test_regression_the_fleet_api_gave_the_servers_paths(desk: dict[str, Any]) -> None:
    # /api/fleet returned each file as the server's absolute path, and so did the problems of a
    # file that does not validate and of a registration in two files
    fleet = desk["fleet"]
    (fleet / "broken.toml").write_text(
        'format = 1\nname = "x"\nregistration = "BROKEN-1"\n[units]\nmass = "lb"\narm = "in"\nfuel_volume = "usgal"\n'
    )
    (fleet / "copy").mkdir()
    (fleet / "copy" / "again.toml").write_text((fleet / "trainer4" / "aircraft.toml").read_text())
    answer = _client(desk, "dan").get("/api/fleet").json()
    text = json.dumps(answer)
    assert str(fleet) not in text and str(fleet.resolve()) not in text
    files = {line["file"] for line in answer}
    assert {"trainer4/aircraft.toml", "broken.toml", "copy/again.toml"} <= files
    broken = next(line for line in answer if line["registration"] == "BROKEN-1")
    assert broken["problems"] and not broken["usable"]
    twice = [line for line in answer if line["registration"] == "DEMO-4T"]
    assert len(twice) == 2 and all(
        any("copy/again.toml" in p or "trainer4/aircraft.toml" in p for p in line["problems"]) for line in twice
    )


# -- the pilot: check, record, sheet, plan -------------------------------------------------------


def test_check_form_lists_stations_tanks_and_burn(reading_desk: dict[str, Any]) -> None:
    page = _client(reading_desk, "pia").get("/aircraft/DEMO-4T").text
    for words in (
        "Pilot and front passenger",
        "max 420.0 lb",
        "Baggage hold",
        "Main tanks (wings)",
        "usable 44.0",
        '"school"',
        '"full"',
        "burn.taxi",
        "burn.trip_time",
        "burn.rate",
        "burn.reserve",
        "utility",
    ):
        assert words in page, words


def test_check_within_limits_leads_with_the_verdict_in_words(reading_desk: dict[str, Any]) -> None:
    response = _post_check(_client(reading_desk, "pia"), WITHIN)
    assert response.status_code == 200
    page = response.text
    main = page[page.index("<main>") :]
    assert (
        main.index("Within limits:")
        < main.index("Moment table")
        < main.index("Conditions and margins")
        < main.index("Fuel burn")
        < main.index("Findings")
        < main.index("<svg")
        < page.index("Caution:")
    )
    inputs = load_check_inputs(SAMPLES / "trainer4" / "aircraft.toml", SAMPLES / "trainer4" / "within.toml")
    result = check_loading(inputs.aircraft, inputs.loading)
    assert result.ok
    from loadcheck.display import fmt

    assert fmt(result.condition("takeoff").weight, "lb", with_unit=False) in page
    assert _records(reading_desk) == []  # checking records nothing


def test_check_whose_burn_path_leaves_the_envelope_says_so(reading_desk: dict[str, Any]) -> None:
    """sample twin6/leaves_path.toml: all four conditions inside, the burn path outside (the CLI's test of it)."""
    values = {
        "load.row1": "380",
        "load.row2": "340",
        "load.nose": "200",
        "fuel.mains": "100",
        "fuel.aux": "40",
        "burn.taxi": "2",
        "burn.trip": "90",
        "burn.order": "aux,mains",
    }
    inputs = load_check_inputs(SAMPLES / "twin6" / "leaves_path.toml")
    expected = check_loading(inputs.aircraft, inputs.loading)
    page = _post_check(_client(reading_desk, "pia"), values, "DEMO-6P").text
    assert "Not within limits:" in page and "Within limits:" not in page
    assert expected.ok is False and expected.burn_path.ok is False
    from html import escape

    from loadcheck.words import burn_path_summary

    assert escape(burn_path_summary(expected)) in page


def test_a_bad_value_brings_the_form_back_with_the_field_named_and_nothing_recorded(
    reading_desk: dict[str, Any],
) -> None:
    values = {**WITHIN, "load.rear": "160 stone", "burn.taxi": "1.2"}
    response = _post_check(_client(reading_desk, "pia"), values, route="record")
    assert response.status_code == 422
    page = response.text
    assert "load.rear" in page and "stone" in page
    assert 'value="160 stone"' in page and 'value="15 kg"' in page and 'value="1.2"' in page  # everything typed kept
    assert re.search(r'class="field bad">\s*<label for="load.rear"', page)
    assert _records(reading_desk) == []


def test_an_unknown_level_is_refused_by_the_library(reading_desk: dict[str, Any]) -> None:
    page = _post_check(_client(reading_desk, "pia"), {**WITHIN, "fuel.mains": "brimming"}).text
    assert "brimming" in page and "nothing was recorded" in page


def test_record_a_check_once_with_the_pilot_and_the_same_result(desk: dict[str, Any]) -> None:
    client = _client(desk, "pia")
    response = _post_check(client, WITHIN, route="record")
    assert response.status_code == 303
    records = _records(desk)
    assert len(records) == 1
    record = records[0]
    assert record.pilot == "pia" and record.source == "web desk" and record.registration == "DEMO-4T" and record.ok
    inputs = load_check_inputs(
        SAMPLES / "trainer4" / "aircraft.toml",
        None,
        load={"front": "340", "rear": "160", "hold": "15 kg"},
        fuel={"mains": "school", "centre": "0"},
        burn={"taxi": "1.2", "trip": "18", "reserve": "8"},
    )
    assert record.result == json.loads(json.dumps(check_loading(inputs.aircraft, inputs.loading).to_dict()))
    assert record.fingerprint == inputs.aircraft.fingerprint
    detail = client.get(response.headers["location"])
    assert detail.status_code == 200 and "Within limits" in detail.text and record.fingerprint in detail.text


def test_load_sheet_is_the_command_lines_sheet(reading_desk: dict[str, Any]) -> None:
    page = _post_check(_client(reading_desk, "pia"), WITHIN, route="sheet").text
    assert "<svg" in page and "DEMO-4T" in page
    from html import escape

    from loadcheck.caution import PILOT_CAUTION

    assert escape(PILOT_CAUTION) in page


def test_load_sheet_has_the_fuel_plan_and_names_as_check_sheet_gives_them(
    runner: AppRunner, reading_desk: dict[str, Any], tmp_path: Path
) -> None:
    # regression: the desk's sheet of a single check left out the fuel plan (taxi, trip,
    # reserve, order) that check --sheet shows

    from loadcheck.cli import app

    values = {k: v for k, v in TRIP_LEG_2_AFT.items() if not k.startswith("leg")} | {"legs": "1", "names.front": "Alex"}
    sheet = _post_check(_client(reading_desk, "pia"), values, "TEST-T", route="sheet").text
    loading = tmp_path / "one.toml"
    loading.write_text(
        'format = 1\n[load]\nfront = "340"\nbags = "100"\n[names]\nfront = "Alex"\n[fuel]\nmain = "full"\n'
        '[burn]\ntaxi = "1"\ntrip = "20"\n'
    )
    cli_file = tmp_path / "one.html"
    assert (
        runner.invoke(
            app, ["check", str(reading_desk["fleet"] / "trip_test.toml"), str(loading), "--sheet", str(cli_file)]
        ).exit_code
        == 0
    )

    def text(
        html: str,
    ) -> list[str]:  # words and figures, without the time of the check, the loading's name and the chart
        html = re.sub(r"<svg.*</svg>", "", html, flags=re.S)
        return re.sub(r"Checked:</span> [^<]*|Loading:</span> [^<]*|<[^>]+>|\s+", " ", html).split()

    assert text(sheet) == text(cli_file.read_text())
    assert "id='fuel-plan'" in sheet and "Alex" in sheet


def test_plan_most_fuel_is_the_library_answer(reading_desk: dict[str, Any]) -> None:
    from loadcheck.planning import most_fuel

    client = _client(reading_desk, "pia")
    no_fuel = {name: value for name, value in WITHIN.items() if not name.startswith("fuel.")}
    page = _post_check(client, no_fuel, action="fuel").text
    inputs = load_check_inputs(
        SAMPLES / "trainer4" / "aircraft.toml",
        None,
        load={"front": "340", "rear": "160", "hold": "15 kg"},
        burn={"taxi": "1.2", "trip": "18", "reserve": "8"},
        fuel_to_plan=True,
    )
    answer = most_fuel(inputs.aircraft, inputs.loading)
    assert answer.answer_display in page and "The loading at this answer" in page
    # trial 13: fuel typed in the form was set aside without a word by "Most fuel", which chooses the
    # fuel; it is refused, each field named, as plan fuel refuses --fuel (fail closed)
    typed = _post_check(client, WITHIN, action="fuel")
    assert typed.status_code == 422
    for name in ("fuel.mains", "fuel.centre"):
        assert f"{name}: fuel given here would not be used: this answer chooses the fuel at engine start" in (
            " ".join(typed.text.split())
        )


def test_plan_most_payload_at_a_station(reading_desk: dict[str, Any]) -> None:
    from loadcheck.planning import most_payload

    page = _post_check(_client(reading_desk, "pia"), {**WITHIN, "station": "hold"}, action="payload").text
    inputs = load_check_inputs(
        SAMPLES / "trainer4" / "aircraft.toml",
        None,
        load={"front": "340", "rear": "160", "hold": "15 kg"},
        fuel={"mains": "school", "centre": "0"},
        burn={"taxi": "1.2", "trip": "18", "reserve": "8"},
    )
    assert most_payload(inputs.aircraft, inputs.loading, "hold").answer_display in page


def test_plan_payload_at_an_unknown_station_is_refused(reading_desk: dict[str, Any]) -> None:
    response = _post_check(_client(reading_desk, "pia"), {**WITHIN, "station": "roof"}, action="payload")
    assert response.status_code == 422 and "roof" in response.text


def test_change_the_loading_keeps_the_values(reading_desk: dict[str, Any]) -> None:
    page = _post_check(_client(reading_desk, "pia"), WITHIN, route="edit").text
    assert 'value="15 kg"' in page and 'value="school"' in page


def test_unknown_registration_is_a_plain_page(reading_desk: dict[str, Any]) -> None:
    response = _client(reading_desk, "pia").get("/aircraft/NOPE-1")
    assert response.status_code in (404, 422) or "unknown registration" in response.text
    assert "Traceback" not in response.text and str(reading_desk["fleet"]) not in response.text


# -- roles ---------------------------------------------------------------------------------------


def test_a_pilot_sees_only_their_own_records(desk: dict[str, Any]) -> None:
    pia, pat = _client(desk, "pia"), _client(desk, "pat")
    _post_check(pia, WITHIN, route="record")
    _post_check(pat, {**WITHIN, "load.rear": "150"}, route="record")
    ids = {r.pilot: r.id for r in _records(desk)}
    listing = pia.get("/records?date=").text
    assert f'/records/{ids["pia"]}"' in listing and f'/records/{ids["pat"]}"' not in listing
    assert pia.get(f"/records/{ids['pat']}").status_code == 404
    assert pia.get(f"/api/records/{ids['pat']}").status_code == 404
    assert [r["pilot"] for r in pia.get("/api/records").json()] == ["pia"]
    assert "pat" not in pia.get("/records/export?format=csv&date=").text.split("\n", 1)[1]


def test_only_a_dispatcher_sees_all_and_verifies(desk: dict[str, Any]) -> None:
    _post_check(_client(desk, "pia"), WITHIN, route="record")
    _post_check(_client(desk, "pat"), WITHIN, route="record")
    dan = _client(desk, "dan")
    listing = dan.get("/records").text  # today's, by default
    assert len(re.findall(r'href="/records/\d+"', listing)) == 2 and "pia" in listing and "pat" in listing
    assert {r["pilot"] for r in dan.get("/api/records").json()} == {"pia", "pat"}
    detail = dan.get("/records/1").text
    verified = dan.post("/records/1/verify", data={"csrf": csrf_of(detail)})
    assert verified.status_code == 200 and "Verified:" in verified.text
    pia = _client(desk, "pia")
    page = pia.get("/records/1").text
    assert "Verify this record" not in page
    assert pia.post("/records/1/verify", data={"csrf": csrf_of(page)}).status_code == 403


def test_dispatcher_filters_by_aircraft_verdict_and_date(desk: dict[str, Any]) -> None:
    pia = _client(desk, "pia")
    _post_check(pia, WITHIN, route="record")
    _post_check(pia, {**WITHIN, "load.rear": "150"}, route="record")
    _post_check(pia, {**WITHIN, "load.front": "700"}, route="record")  # over the front seats' 420 lb
    dan = _client(desk, "dan")
    out = dan.get("/api/records?verdict=out").json()
    assert [r["ok"] for r in out] == [False] and len(out) == 1
    assert len(dan.get("/api/records?verdict=within").json()) == 2
    assert dan.get("/api/records?registration=DEMO-6P").json() == []
    assert dan.get("/api/records?date=2001-01-01").json() == []
    assert len(re.findall(r'href="/records/\d+"', dan.get("/records?verdict=out").text)) == 1
    assert dan.get("/records?date=yesterday").status_code == 422


def test_dispatcher_sees_checks_recorded_by_the_command_line(runner: AppRunner, desk: dict[str, Any]) -> None:

    from loadcheck.cli import app

    result = runner.invoke(
        app, ["check", str(desk["fleet"] / "trainer4" / "within.toml"), "--log", "--db", str(desk["db"])]
    )
    assert result.exit_code == 0, result.output
    rows = _client(desk, "dan").get("/api/records").json()
    assert len(rows) == 1 and rows[0]["source"].endswith("within.toml")


def test_export_csv_and_jsonl(desk: dict[str, Any]) -> None:
    from loadcheck.checklog import export_text

    _post_check(_client(desk, "pia"), WITHIN, route="record")
    dan = _client(desk, "dan")
    csv_text = dan.get("/records/export?format=csv")
    jsonl = dan.get("/records/export?format=jsonl")
    with CheckLog(desk["db"]) as log:
        assert csv_text.text == export_text(log.find(), "csv")
        assert jsonl.text == export_text(log.find(), "jsonl")
    assert csv_text.headers["content-type"].startswith("text/csv")
    assert dan.get("/records/export?format=xls").status_code == 422


def test_only_a_pilot_checks_and_only_a_mechanic_changes_aircraft_data(reading_desk: dict[str, Any]) -> None:
    dan, pia = _client(reading_desk, "dan"), _client(reading_desk, "pia")
    assert dan.get("/aircraft/DEMO-4T").status_code == 403
    assert dan.post("/api/check", json={"registration": "DEMO-4T"}).status_code == 403
    assert pia.get("/mechanic/DEMO-4T").status_code == 403
    token = csrf_of(pia.get("/fleet").text)
    before = (reading_desk["fleet"] / "trainer4" / "aircraft.toml").read_bytes()
    weighing = (SAMPLES / "trainer4" / "weighing.toml").read_text()
    assert (
        pia.post("/mechanic/DEMO-4T/propose", data={"kind": "weighing", "text": weighing, "csrf": token}).status_code
        == 403
    )
    assert (
        pia.post("/mechanic/DEMO-4T/confirm", data={"token": "x", "confirm": "yes", "csrf": token}).status_code == 403
    )
    assert (reading_desk["fleet"] / "trainer4" / "aircraft.toml").read_bytes() == before


# -- the mechanic --------------------------------------------------------------------------------


def _propose(
    client: TestClient, text: str, kind: str = "weighing", upload: bool = False, registration: str = "DEMO-4T"
) -> Any:
    page = client.get(f"/mechanic/{registration}").text
    if upload:
        return client.post(
            f"/mechanic/{registration}/propose",
            data={"kind": kind, "csrf": csrf_of(page)},
            files={"upload": ("readings.toml", text.encode(), "application/toml")},
        )
    return client.post(f"/mechanic/{registration}/propose", data={"kind": kind, "text": text, "csrf": csrf_of(page)})


def _extremes_items(page: str) -> dict[str, list[str]]:
    """The proposal page's extreme loadings: each category's list items, as text."""
    found = {}
    for category, items in re.findall(r'<ul class="extremes" data-category="([^"]+)">(.*?)</ul>', page, re.S):
        found[category] = [re.sub(r"<[^>]+>", "", item).strip() for item in re.findall(r"<li>(.*?)</li>", items, re.S)]
    return found


def test_regression_the_mechanic_page_showed_the_first_categorys_extremes_only(desk: dict[str, Any]) -> None:
    # trial 12, finding 3: the proposal page said "Most forward loading ...: within limits" for the
    # normal category alone, unnamed; the trial's aircraft has its utility forward extreme out of
    # limits (720.0 kg at 28.52 cm against 29.0 cm, hand-worked in tests/test_empty_record.py)
    from .test_empty_record import HERON_U, HERON_U_CHANGES

    (desk["fleet"] / "heron_u.toml").write_text(HERON_U)
    shown = _propose(_client(desk, "mo"), HERON_U_CHANGES, kind="alteration", registration="TX-HR4")
    assert shown.status_code == 200, shown.text
    page = shown.text
    verdict = re.sub(r"<[^>]+>", "", page[page.index('id="extremes-verdict">') :].split("</p>")[0])
    assert "Not all within limits (or not established) in the utility category" in verdict
    assert "checked: normal, utility" in verdict
    items = _extremes_items(page)
    assert list(items) == ["normal", "utility"]
    forward = items["utility"][0]
    assert forward.startswith("Utility category, most forward loading: 720.0 kg at CG 28.5 cm:")
    assert "not within limits" in forward and "Limit: ramp CG 28.5 cm is forward" in forward
    assert all(item.startswith("Normal category, most ") for item in items["normal"])


def test_the_mechanic_page_with_every_category_within_limits_says_so_for_each(
    desk: dict[str, Any], tmp_path: Path
) -> None:
    from .test_empty_record import tandem_all_within

    aircraft, changes = tandem_all_within(tmp_path)
    target = desk["fleet"] / "tandem2" / "aircraft.toml"  # DEMO-2T, as the variant
    target.write_text(aircraft.read_text())
    shown = _propose(_client(desk, "mo"), changes.read_text(), kind="alteration", registration="DEMO-2T")
    assert shown.status_code == 200, shown.text
    page = shown.text
    assert "Within limits in every category of the aircraft</strong>; checked: normal, aerobatic." in page
    items = _extremes_items(page)
    assert list(items) == ["normal", "aerobatic"]
    for category, lines in items.items():
        assert len(lines) == 2
        for line, side in zip(lines, ("forward", "rearward"), strict=True):
            assert line.startswith(f"{category.capitalize()} category, most {side} loading:")
            assert "within limits" in line and "not within" not in line and "Limit:" not in line


def test_mechanic_weighing_needs_confirmation_then_writes_with_history(desk: dict[str, Any]) -> None:
    from loadcheck.empty_record import propose
    from loadcheck.files import load_aircraft

    aircraft_file = desk["fleet"] / "trainer4" / "aircraft.toml"
    # the sample's aircraft key read as beside the desk's copy, as the desk reads an upload's
    weighing = SAMPLES / "trainer4" / "weighing.toml"
    expected = propose(aircraft_file, weighing, "weighing", relative_to=aircraft_file.parent).result.new
    mo = _client(desk, "mo")
    shown = _propose(mo, (SAMPLES / "trainer4" / "weighing.toml").read_text(), upload=True)
    assert shown.status_code == 200
    page = shown.text
    assert "Current and new empty-weight record" in page and "Extreme loadings" in page
    from loadcheck.display import fmt

    assert fmt(expected.weight, "lb") in page and "1,718" in page
    token = re.search(r'name="token" value="([^"]+)"', page).group(1)  # type: ignore[union-attr]
    unconfirmed = mo.post("/mechanic/DEMO-4T/confirm", data={"token": token, "csrf": csrf_of(page)})
    assert unconfirmed.status_code == 409 and "confirmed" in unconfirmed.text
    assert load_aircraft(aircraft_file).empty.weight == 1718.0
    written = mo.post("/mechanic/DEMO-4T/confirm", data={"token": token, "confirm": "yes", "csrf": csrf_of(page)})
    assert written.status_code == 200 and "Written:" in written.text
    now = load_aircraft(aircraft_file)
    assert now.empty.weight == pytest.approx(expected.weight) and now.empty.arm == pytest.approx(expected.arm)
    assert now.history[-1].by == "mo" and now.history[-1].previous.weight == 1718.0
    assert now.history[-1].inputs["file"].endswith("/readings.toml")  # the upload's own name
    assert "# Four-seat nosewheel trainer" in aircraft_file.read_text()  # the comment-keeping write
    # the next check uses the new empty weight
    result = _post_check(_client(desk, "pia"), WITHIN).text
    assert fmt(expected.weight, "lb", with_unit=False) in result
    assert (
        mo.post("/mechanic/DEMO-4T/confirm", data={"token": token, "confirm": "yes", "csrf": csrf_of(page)}).status_code
        == 404
    )


def test_mechanic_alteration_typed_in(desk: dict[str, Any]) -> None:
    page = _propose(_client(desk, "mo"), (SAMPLES / "trainer4" / "changes.toml").read_text(), kind="alteration").text
    assert "AC 43.13-1B 10-2 c" in page and "Current and new empty-weight record" in page


def test_regression_the_desks_new_record_showed_a_light_change_as_none(desk: dict[str, Any]) -> None:
    """A placard of 0.021 kg installed at 1,500 mm on tandem2 (invented): current and new record both
    show 418.0 kg, and the page gave no change, so the mechanic confirmed a record that looked the same.
    Each line shows its change, never as zero unless it is (FAA-H-8083-1B chapter 2, added weight:
    new moment = old moment + 0.021 x 1,500 kg-mm); the date has none."""
    changes = (
        "format = 1\ndate = 2026-11-01\n[[change]]\naction = 'install'\nitem = 'placard'\nlabel = 'Placard'\n"
        "weight = 0.021\narm = 1500.0\n"
    )
    page = _propose(_client(desk, "mo"), changes, kind="alteration", registration="DEMO-2T").text
    table = page[page.index('<table class="compare">') : page.index("</table>", page.index('<table class="compare">'))]
    rows = {
        cells[0]: cells[1:]
        for cells in (re.findall(r"<td>(.*?)</td>", row, re.S) for row in re.findall(r"<tr>(.*?)</tr>", table, re.S))
        if cells
    }
    assert rows["empty weight"] == ["418.0 kg", "418.0 kg", "+0.02 kg"], rows
    assert rows["empty-weight moment"][2] == "+32 kg·mm" and rows["useful load"][2] == "-0.02 kg"
    assert rows["empty-weight CG"][2] == "+0.1 mm" and rows["record date"][2] == ""


def test_mechanic_bad_readings_come_back_with_the_field_and_nothing_written(desk: dict[str, Any]) -> None:
    before = (desk["fleet"] / "trainer4" / "aircraft.toml").read_bytes()
    text = (SAMPLES / "trainer4" / "weighing.toml").read_text().replace("reading = 541.0", "reading = -541.0")
    response = _propose(_client(desk, "mo"), text)
    assert response.status_code == 422 and "reading" in response.text and "nothing was written" in response.text
    assert "-541.0" in response.text  # what was typed is kept
    assert "typed-in.toml" in response.text  # the source named as the mechanic knows it
    assert "/tmp" not in response.text and str(desk["fleet"]) not in response.text
    assert (desk["fleet"] / "trainer4" / "aircraft.toml").read_bytes() == before


def test_regression_a_kind_the_mechanics_form_has_not_was_read_as_a_weighing(desk: dict[str, Any]) -> None:
    """``kind=alterations`` (or none) was worked out as scale readings: a choice the form does not have
    is refused (422), never taken for one it has; nothing waits to be confirmed, nothing is written."""
    before = (desk["fleet"] / "trainer4" / "aircraft.toml").read_bytes()
    changes = (SAMPLES / "trainer4" / "changes.toml").read_text()
    mo = _client(desk, "mo")
    for kind in ("alterations", "Alteration", "", None):
        data = {"text": changes, "csrf": csrf_of(mo.get("/mechanic/DEMO-4T").text)}
        response = mo.post("/mechanic/DEMO-4T/propose", data=data if kind is None else {**data, "kind": kind})
        assert response.status_code == 422, kind
        from markupsafe import escape as shown  # as the templates escape

        assert ("no choice was made" if not kind else shown(f"the form has no choice {kind!r}")) in response.text, kind
        assert "Current and new empty-weight record" not in response.text
    assert not desk["app"].state.desk.pending
    assert (desk["fleet"] / "trainer4" / "aircraft.toml").read_bytes() == before
    assert _propose(mo, changes, kind="alteration").status_code == 200  # the form's own choices go through


def test_mechanic_upload_and_typed_text_together_are_refused_and_neither_is_read(desk: dict[str, Any]) -> None:
    # trial 9, finding 1: the upload was used and the typed-in readings dropped without a word
    before = (desk["fleet"] / "trainer4" / "aircraft.toml").read_bytes()
    weighing = (SAMPLES / "trainer4" / "weighing.toml").read_text()
    typed = weighing.replace("reading = 541.0", "reading = 551.0")  # other readings than the file's
    mo = _client(desk, "mo")
    response = mo.post(
        "/mechanic/DEMO-4T/propose",
        data={"kind": "weighing", "text": typed, "csrf": csrf_of(mo.get("/mechanic/DEMO-4T").text)},
        files={"upload": ("readings.toml", weighing.encode(), "application/toml")},
    )
    assert response.status_code == 422
    assert "upload, text: the form gives an uploaded file and typed text: give one" in response.text
    assert "nothing was written" in response.text and "Current and new empty-weight record" not in response.text
    assert 'name="token"' not in response.text  # no proposal waits to be confirmed
    assert "reading = 551.0" in response.text  # what was typed is kept in the box
    assert not desk["app"].state.desk.pending
    assert (desk["fleet"] / "trainer4" / "aircraft.toml").read_bytes() == before
    # either one alone is still read (a box of blanks beside the upload is not typed text)
    assert _propose(mo, weighing, upload=True).status_code == 200
    alone = mo.post(
        "/mechanic/DEMO-4T/propose",
        data={"kind": "weighing", "text": " \r\n", "csrf": csrf_of(mo.get("/mechanic/DEMO-4T").text)},
        files={"upload": ("readings.toml", weighing.encode(), "application/toml")},
    )
    assert alone.status_code == 200 and "Current and new empty-weight record" in alone.text
    assert _propose(mo, typed).status_code == 200


def test_regression_the_desk_took_readings_naming_another_aircraft(desk: dict[str, Any]) -> None:
    """The mechanic's page calls the library's job, which refuses a file naming another aircraft file
    (trial 9, item 2; FAA-H-8083-1B chapter 3, from memory: the record of the aircraft weighed); its
    name is read as beside the aircraft file the page is for."""
    aircraft_file = desk["fleet"] / "trainer4" / "aircraft.toml"
    before = aircraft_file.read_bytes()
    named = 'aircraft = "../tandem2/aircraft.toml"'
    for kind, name in (("weighing", "weighing.toml"), ("alteration", "changes.toml")):
        text = (SAMPLES / "trainer4" / name).read_text().replace('aircraft = "aircraft.toml"', named)
        response = _propose(_client(desk, "mo"), text, kind=kind)
        assert response.status_code == 422 and "are for the aircraft file" in response.text
        assert "tandem2" in response.text and str(desk["fleet"]) not in response.text
    assert aircraft_file.read_bytes() == before


def test_a_proposal_is_confirmed_only_by_the_mechanic_who_made_it(desk: dict[str, Any], tmp_path: Path) -> None:
    from argon2 import PasswordHasher

    from loadcheck.web.users import UserStore

    UserStore(desk["users"], hasher=PasswordHasher(time_cost=1, memory_cost=1024, parallelism=1)).add(
        "max", PASSWORD, ["mechanic"]
    )
    page = _propose(_client(desk, "mo"), (SAMPLES / "trainer4" / "weighing.toml").read_text()).text
    token = re.search(r'name="token" value="([^"]+)"', page).group(1)  # type: ignore[union-attr]
    other = _client(desk, "max")
    mine = other.get("/mechanic/DEMO-4T").text
    assert (
        other.post(
            "/mechanic/DEMO-4T/confirm", data={"token": token, "confirm": "yes", "csrf": csrf_of(mine)}
        ).status_code
        == 404
    )


# -- escaping, sizes, errors ---------------------------------------------------------------------

MARKUP = '<script>alert("x")</script><b>bold</b>'


def test_markup_from_files_and_forms_is_shown_as_text(desk: dict[str, Any]) -> None:
    trainer = desk["fleet"] / "trainer4" / "aircraft.toml"
    text = trainer.read_text().replace('label = "Rear passengers"', f"label = '{MARKUP}'")
    text = text.replace('name = "Four-seat trainer (invented demo)"', f"name = '{MARKUP}'")
    trainer.write_text(text)
    client = _client(desk, "pia")
    for page in (
        client.get("/fleet").text,
        client.get("/aircraft/DEMO-4T").text,
        _post_check(client, WITHIN).text,
        _post_check(client, {**WITHIN, "load.front": MARKUP}).text,
    ):
        assert "<script>" not in page and "<b>bold</b>" not in page
        assert "&lt;script&gt;" in page or "&lt;b&gt;" in page
    sheet = _post_check(client, WITHIN, route="sheet").text  # the load sheet: the library's renderer escapes too
    assert "<script>" not in sheet and "&lt;script&gt;" in sheet
    registration = desk["fleet"] / "tandem2" / "aircraft.toml"
    registration.write_text(registration.read_text().replace('registration = "DEMO-2T"', "registration = '<i>REG</i>'"))
    assert "<i>REG</i>" not in client.get("/fleet").text


def test_a_note_with_markup_is_kept_as_text(desk: dict[str, Any]) -> None:
    mo = _client(desk, "mo")
    page = _propose(mo, (SAMPLES / "trainer4" / "weighing.toml").read_text()).text
    token = re.search(r'name="token" value="([^"]+)"', page).group(1)  # type: ignore[union-attr]
    written = mo.post(
        "/mechanic/DEMO-4T/confirm", data={"token": token, "confirm": "yes", "note": MARKUP, "csrf": csrf_of(page)}
    )
    assert written.status_code == 200
    assert "<script>" not in written.text and "&lt;script&gt;" in written.text  # the history shows the note as text


def test_no_traceback_or_internal_path_reaches_a_page(
    reading_desk: dict[str, Any], monkeypatch: pytest.MonkeyPatch
) -> None:
    import loadcheck.check

    def broken(*args: Any, **kwargs: Any) -> Any:
        raise RuntimeError(f"bug in {reading_desk['fleet']}/secret.py")

    monkeypatch.setattr(loadcheck.check, "check_loading", broken)
    client = TestClient(reading_desk["app"], raise_server_exceptions=False)
    assert sign_in(client, "pia").status_code == 303
    for response in (
        _post_check(client, WITHIN),
        client.post("/api/check", json={"registration": "DEMO-4T", "load": {"front": 340}}),
    ):
        assert response.status_code == 500
        assert (
            "Traceback" not in response.text
            and "secret.py" not in response.text
            and str(reading_desk["fleet"]) not in response.text
        )
        assert "nothing was recorded" in response.text
    bad = client.get("/aircraft/NOPE-9")
    assert "Traceback" not in bad.text and str(reading_desk["fleet"]) not in bad.text


# -- trips of several legs (issue 19 with issue 16) ----------------------------------------------


def _form_overrides(values: dict[str, str]) -> tuple[dict[str, dict[str, str]], dict[int, dict[str, Any]]]:
    """The check form's fields read by the test, as ``load_check_inputs`` overrides: ``TABLE.KEY`` of
    the first leg and ``leg.N.TABLE.KEY`` (``leg.N.fuel`` is fuel put in at the stop, ``add_fuel``) or
    ``leg.N.label`` of leg N, the loading file's tables by the form's field names; empty fields left
    out. The desk's own reading of the form (``loadcheck.web.app._overrides``) is what is under test."""
    first: dict[str, dict[str, str]] = {"load": {}, "names": {}, "fuel": {}, "burn": {}}
    legs: dict[int, dict[str, Any]] = {}
    for key, value in values.items():
        parts = key.split(".")
        if not value:
            continue
        if parts[0] == "leg" and len(parts) == 3:
            legs.setdefault(int(parts[1]), {})[parts[2]] = value
        elif parts[0] == "leg":
            table = "add_fuel" if parts[2] == "fuel" else parts[2]
            legs.setdefault(int(parts[1]), {}).setdefault(table, {})[parts[3]] = value
        elif parts[0] in first:
            first[parts[0]][parts[1]] = value
    return {table: fields for table, fields in first.items() if fields}, legs


def _trip_inputs(desk: dict[str, Any], values: dict[str, str]) -> Any:
    """The library's reading of the check form's trip fields (the same overrides the command line's --leg-* give)."""
    first, legs = _form_overrides(values)
    return load_check_inputs(desk["fleet"] / "trip_test.toml", None, allow_trip=True, legs=legs, **first)


def _trip_result(desk: dict[str, Any], values: dict[str, str]) -> Any:
    from loadcheck.trip import check_trip

    inputs = _trip_inputs(desk, values)
    return check_trip(inputs.aircraft, inputs.trip)


def test_add_a_leg_keeps_everything_typed_and_checks_nothing(reading_desk: dict[str, Any]) -> None:
    client = _client(reading_desk, "pia")
    first = {k: v for k, v in TRIP_LEG_2_AFT.items() if not k.startswith("leg") and k != "legs"}
    page = _post_check(client, first, "TEST-T", action="add_leg")
    assert page.status_code == 200 and "Leg 2" in page.text and 'name="legs" value="2"' in page.text
    for key, value in first.items():
        assert f'name="{key}" value="{value}"' in page.text, key
    for key in (
        "leg.2.label",
        "leg.2.load.front",
        "leg.2.load.bags",
        "leg.2.fuel.main",
        "leg.2.burn.taxi",
        "leg.2.burn.trip_time",
        "leg.2.burn.rate",
        "leg.2.burn.reserve",
        "leg.2.burn.order",
    ):
        assert f'name="{key}"' in page.text, key
    assert "Within limits" not in page.text and "Not within limits" not in page.text and _records(reading_desk) == []
    # a third leg, then leg 2 taken out: leg 3's values become leg 2's, the rest stays as typed
    three = _post_check(
        client,
        {**TRIP_LEG_2_AFT, "legs": "3", "leg.3.load.bags": "0", "leg.3.burn.trip": "7"},
        "TEST-T",
        action="remove_leg:2",
    ).text
    assert 'name="legs" value="2"' in three and 'name="leg.2.load.bags" value="0"' in three
    assert 'name="leg.2.burn.trip" value="7"' in three and 'name="leg.3.' not in three
    assert 'name="load.front" value="340"' in three


def test_a_trip_whose_leg_2_fails_says_so_first_and_shows_every_leg(reading_desk: dict[str, Any]) -> None:
    from html import escape

    from loadcheck.display import fmt

    expected = _trip_result(reading_desk, TRIP_LEG_2_AFT)
    assert expected.legs[0].check.ok and not expected.legs[1].check.ok and not expected.ok  # the scenario
    takeoff = [leg.check.condition("takeoff") for leg in expected.legs]  # worked by hand in tests/web_helpers.py
    assert [(c.weight, c.moment) for c in takeoff] == [
        (pytest.approx(1674), pytest.approx(142860)),
        (pytest.approx(1408), pytest.approx(122320)),
    ]
    response = _post_check(_client(reading_desk, "pia"), TRIP_LEG_2_AFT, "TEST-T")
    assert response.status_code == 200
    page = response.text
    main = page[page.index("<main>") :]
    verdict = re.search(r'<p class="verdict out" role="status">(.*?)</p>', main, re.S)
    assert verdict and main.index(verdict.group(0)) < main.index('id="leg-1"')
    words = " ".join(re.sub(r"<[^>]+>", " ", verdict.group(1)).split())
    assert "Not within limits on leg 2 (back solo)" in words and "leg 1" not in words
    assert "Within limits" not in main  # never beside a limit finding
    assert (
        main.index('<section class="leg" id="leg-1">')
        < main.index('<section class="leg" id="leg-2">')
        < main.index("<svg")
        < page.index("Caution:")
    )
    leg_2 = main[main.index('<section class="leg" id="leg-2">') : main.index("<svg")]
    for heading in ("Moment table", "Conditions and margins", "Fuel burn", "Findings"):
        assert heading in leg_2, heading
    for finding in expected.findings:  # each names its leg and condition
        assert finding.leg == 2 and escape(finding.message) in leg_2
        assert (
            "leg 2" in finding.message
            and finding.condition is not None
            and finding.condition.replace("_", " ") in finding.message
        )
    for leg in expected.legs:
        section = main[main.index(f'id="leg-{leg.leg}"') :]
        assert fmt(leg.check.condition("takeoff").weight, "lb", with_unit=False) in section
    assert (
        'id="leg-1-burn-path"' in page and 'id="leg-2-burn-path"' in page
    )  # the chart: one path per leg (trip_figure)
    assert _records(reading_desk) == []


# The rule of the loading file for a leg (docs/file-format.md, "Trips of several legs": every
# [[leg]] table has its own burn, and a leg is added on the command line only with its burn): a
# [[leg]] with nothing in it is refused ("leg 2, burn: this field is required"), never checked as a
# leg that burns nothing. The desk's form and API follow it.
LEG_1_ONLY = {k: v for k, v in TRIP_LEG_2_AFT.items() if not k.startswith("leg")}


def test_library_refuses_a_leg_table_with_nothing_in_it(tmp_path: Path) -> None:
    """The rule the desk follows: the loading file's [[leg]] with nothing in it (no burn) is refused."""
    from loadcheck.errors import LoadcheckError

    trip = tmp_path / "trip.toml"
    trip.write_text(
        f'format = 1\naircraft = "{(SAMPLES / "heli2" / "aircraft.toml").as_posix()}"\n'
        '[load]\nright = 185\n[fuel]\nmain = "full"\n[burn]\ntaxi = 0.5\ntrip = 11\n\n[[leg]]\n',
        encoding="utf-8",
    )
    with pytest.raises(LoadcheckError, match=r"leg 2, burn: this field is required"):
        load_check_inputs(trip, None, allow_trip=True)


def test_form_leg_asked_for_with_nothing_given_is_refused_not_checked_as_an_empty_leg(desk: dict[str, Any]) -> None:
    """Regression: ``legs=2`` with no leg-2 field was checked as a trip whose leg 2 burns nothing
    (a warning only); now refused (422), the form again with the leg named, everything typed kept."""
    client = _client(desk, "pia")
    for values, route, action in (
        ({**LEG_1_ONLY, "legs": "2"}, "check", "check"),
        ({**LEG_1_ONLY, "legs": "2"}, "check", "fuel"),
        ({**LEG_1_ONLY, "legs": "2"}, "check", "stop"),
        ({**LEG_1_ONLY, "legs": "2"}, "sheet", "check"),
        ({**LEG_1_ONLY, "legs": "2"}, "record", "check"),
        ({**LEG_1_ONLY, "legs": "3", "leg.2.burn.trip": "10"}, "check", "check"),  # leg 3 empty
        ({**LEG_1_ONLY, "legs": "2", "leg.2.load.front": "170"}, "check", "check"),  # a change, no burn
    ):
        response = _post_check(client, values, "TEST-T", action=action, route=route)
        assert response.status_code == 422, (values, route, action)
        page = response.text
        number = values["legs"]
        shown = page[page.index('class="problem"') : page.index("</ul>", page.index('class="problem"'))]
        assert f"leg {number}, burn: no fuel used is given for leg {number}" in shown, shown
        assert "trip fuel" in shown and "0 for a leg that burns none" in shown
        assert "Within limits" not in page and "Not within limits" not in page
        assert f'name="legs" value="{number}"' in page and 'name="load.front" value="340"' in page
        if "leg.2.load.front" in values:
            assert 'name="leg.2.load.front" value="170"' in page  # what was typed is kept
    assert _records(desk) == []
    # a leg that burns nothing, said so, is checked: the refusal is of a leg with no burn given
    said = _post_check(client, {**LEG_1_ONLY, "legs": "2", "leg.2.burn.trip": "0", "leg.2.burn.taxi": "0"}, "TEST-T")
    assert said.status_code == 200 and "Leg 2" in said.text


def test_api_leg_with_nothing_given_is_refused_not_dropped(desk: dict[str, Any]) -> None:
    """Regression: ``leg: [{}]`` in POST /api/check was checked as a loading of one leg (the leg given
    dropped) and a leg without its burn refused in the command line's words; both are refused (422)
    naming the leg's burn, as the loading file's [[leg]] without its burn is. An explicit empty burn
    (the file's ``burn = {}``) is a burn given, taken as the library takes it."""
    client = _client(desk, "pia")
    body = {"registration": "TEST-T", "load": {"front": 340}, "fuel": {"main": "full"}, "burn": {"taxi": 1, "trip": 10}}
    for route in ("/api/check", "/api/plan/fuel", "/api/plan/stop"):
        for leg in ({}, {"label": "back solo"}, {"load": {"front": 170}}):
            extra = {"stop": 2} if route.endswith("stop") else {}
            answer = client.post(route, json={**body, **extra, "leg": [{"burn": {"trip": 5}}, leg], "record": True})
            assert answer.status_code == 422, (route, leg)
            problems = answer.json()["problems"]
            assert [p["field"] for p in problems] == ["leg 3, burn"], problems
            assert problems[0]["message"].startswith("leg 3, burn: no fuel used is given for leg 3")
    assert _records(desk) == []
    given = client.post("/api/check", json={**body, "leg": [{"burn": {}}]})
    assert given.status_code == 200 and len(given.json()["legs"]) == 2


def test_a_bad_value_in_a_leg_names_the_leg_and_field_keeps_everything_and_records_nothing(
    desk: dict[str, Any],
) -> None:
    client = _client(desk, "pia")
    for key, bad in (("leg.2.burn.taxi", "1 furlong"), ("leg.2.fuel.main", "brimming"), ("leg.2.load.front", "-5")):
        response = _post_check(client, {**TRIP_LEG_2_AFT, key: bad}, "TEST-T", route="record")
        assert response.status_code == 422, key
        page = response.text
        problem = page[page.index('class="problem"') : page.index("</ul>", page.index('class="problem"'))]
        assert escape_value(bad) in problem, key  # named as the library names it: the tests after the last one
        assert re.search(rf'class="field bad">\s*<label for="{re.escape(key)}"', page), key
        assert (
            f'value="{escape_value(bad)}"' in page and 'value="back solo"' in page and 'name="legs" value="2"' in page
        )
    assert _records(desk) == []


def escape_value(text: str) -> str:
    from html import escape

    return escape(text)


def test_markup_in_a_leg_is_shown_as_text(reading_desk: dict[str, Any]) -> None:
    markup = "<script>alert('leg')</script>"
    client = _client(reading_desk, "pia")
    for route in ("check", "sheet"):
        page = _post_check(client, {**TRIP_LEG_2_AFT, "leg.2.label": markup}, "TEST-T", route=route).text
        assert "<script>alert" not in page, route
        assert "&lt;script&gt;alert(" in page, route
    form = _post_check(client, {**TRIP_LEG_2_AFT, "leg.2.label": markup, "leg.2.burn.taxi": "x"}, "TEST-T").text
    assert "<script>alert" not in form and "&lt;script&gt;" in form


def test_record_a_trip_through_the_recording_job(desk: dict[str, Any]) -> None:
    client = _client(desk, "pia")
    response = _post_check(client, TRIP_LEG_2_AFT, "TEST-T", route="record")
    assert response.status_code == 303
    records = _records(desk)
    assert len(records) == 1
    record = records[0]
    expected = _trip_result(desk, TRIP_LEG_2_AFT)
    assert record.result == json.loads(json.dumps(expected.to_dict())) and record.ok is False
    assert record.pilot == "pia" and record.source == "web desk" and record.registration == "TEST-T"
    assert [leg["label"] for leg in record.inputs["leg"]] == ["back solo"]
    assert record.inputs["leg"][0]["load"] == {"front": "170"} and record.inputs["leg"][0]["add_fuel"] == {"main": "5"}
    detail = client.get(response.headers["location"]).text
    assert (
        "Conditions of leg 1: within limits" in detail
        and "Conditions of leg 2 (back solo): not within limits" in detail
    )


def test_a_recorded_trip_is_verified_by_the_dispatcher(desk: dict[str, Any]) -> None:
    assert _post_check(_client(desk, "pia"), TRIP_LEG_2_AFT, "TEST-T", route="record").status_code == 303
    dan = _client(desk, "dan")
    record_id = _records(desk)[0].id
    page = dan.get(f"/records/{record_id}").text
    verified = dan.post(f"/records/{record_id}/verify", data={"csrf": csrf_of(page)})
    assert verified.status_code == 200 and "Verified:" in verified.text


def test_trip_load_sheet_is_the_command_lines_trip_sheet(
    runner: AppRunner, reading_desk: dict[str, Any], tmp_path: Path
) -> None:

    from loadcheck.cli import app

    sheet = _post_check(_client(reading_desk, "pia"), TRIP_LEG_2_AFT, "TEST-T", route="sheet").text
    cli_file = tmp_path / "trip.html"
    args = [
        "check",
        str(reading_desk["fleet"] / "trip_test.toml"),
        "--load",
        "front=340",
        "--load",
        "bags=100",
        "--fuel",
        "main=full",
        "--taxi",
        "1",
        "--trip",
        "20",
        "--leg-load",
        "2:front=170",
        "--leg-fuel",
        "2:main=5",
        "--leg-burn",
        "2:taxi=1",
        "--leg-burn",
        "2:trip=10",
        "--sheet",
        str(cli_file),
    ]
    assert runner.invoke(app, args).exit_code == 1

    def text(html: str) -> str:  # the sheet's words and figures, without the time of the check and the chart
        html = re.sub(r"<svg.*</svg>", "", html, flags=re.S)
        return re.sub(r"Checked:</span> [^<]*|, leg 2 \(back solo\)|, leg 2|<[^>]+>|\s+", " ", html)

    cli_text = text(cli_file.read_text())
    assert "OUT OF LIMITS on Leg 2" in cli_text and "OUT OF LIMITS on Leg 2" in text(sheet)
    assert text(sheet).replace(" (back solo)", "").split() == cli_text.split()  # the command line's legs carry no label
    assert sheet.count("<svg") == 1 and 'id="leg-2-burn-path"' in sheet


def test_plan_a_trip_from_the_form_is_the_library_answer(reading_desk: dict[str, Any]) -> None:
    from html import escape

    from loadcheck.trip import fuel_to_add, trip_most_fuel

    within = {**TRIP_LEG_2_AFT, "leg.2.load.front": "340", "leg.2.load.bags": "0"}  # no one gets off; the bags do
    inputs = _trip_inputs(reading_desk, within)
    most = trip_most_fuel(inputs.aircraft, inputs.trip)
    stop = fuel_to_add(inputs.aircraft, inputs.trip, 2)
    assert most.feasible and stop.feasible
    client = _client(reading_desk, "pia")
    # the most fuel chooses the fuel at the first engine start: none is given for it (leg 2's uplift is)
    page = _post_check(client, {k: v for k, v in within.items() if k != "fuel.main"}, "TEST-T", action="fuel").text
    assert escape(most.answer_display) in page and "every leg" in page and 'id="leg-2"' in page
    unplanned = {k: v for k, v in within.items() if k != "leg.2.fuel.main"}  # the answer chooses the stop's fuel
    page = _post_check(client, {**unplanned, "stop": "2"}, "TEST-T", action="stop").text
    assert (
        escape(stop.question[1:]) in page and escape(stop.answer_display) in page
    )  # the page capitalises its first letter
    typed = _post_check(client, {**within, "stop": "2"}, "TEST-T", action="stop")
    assert typed.status_code == 422 and "would not be used: this answer chooses the fuel put in at the stop" in (
        " ".join(typed.text.split())
    )
    refused = _post_check(client, within, "TEST-T", action="payload")
    assert refused.status_code == 422 and "loading of one leg" in refused.text
    assert _records(reading_desk) == []


def test_api_check_takes_legs_as_the_command_line_does(runner: AppRunner, desk: dict[str, Any]) -> None:

    from loadcheck.cli import app

    args = [
        "check",
        str(desk["fleet"] / "trip_test.toml"),
        "--load",
        "front=340",
        "--load",
        "bags=100",
        "--fuel",
        "main=full",
        "--taxi",
        "1",
        "--trip",
        "20",
        "--leg-load",
        "2:front=170",
        "--leg-fuel",
        "2:main=5",
        "--leg-burn",
        "2:taxi=1",
        "--leg-burn",
        "2:trip=10",
        "--json",
    ]
    cli = runner.invoke(app, args)
    assert cli.exit_code == 1
    body = {
        "registration": "TEST-T",
        "load": {"front": 340, "bags": 100},
        "fuel": {"main": "full"},
        "burn": {"taxi": 1, "trip": 20},
        "leg": [{"load": {"front": 170}, "add_fuel": {"main": 5}, "burn": {"taxi": 1, "trip": 10}}],
    }
    client = _client(desk, "pia")
    answer = client.post("/api/check", json=body)
    assert answer.status_code == 200 and answer.json() == json.loads(cli.stdout)
    assert _records(desk) == []
    recorded = client.post("/api/check", json={**body, "record": True}).json()
    assert [r.id for r in _records(desk)] == [recorded["record_id"]] and len(recorded["legs"]) == 2
    # the fuel put in at the stop planned is the answer's: none is given for it (the typed is refused)
    refused = client.post("/api/plan/stop", json={**body, "stop": 2})
    assert refused.status_code == 422 and [p["field"] for p in refused.json()["problems"]] == ["leg 2, add_fuel.main"]
    unplanned = [{"load": {"front": 170}, "burn": {"taxi": 1, "trip": 10}}]
    stop = client.post("/api/plan/stop", json={**body, "leg": unplanned, "stop": 2})
    at = args.index("--leg-fuel")
    cli_stop = runner.invoke(app, ["plan", "stop", *args[1:at], *args[at + 2 : -1], "--leg", "2", "--json"])
    assert stop.status_code == 200 and stop.json() == json.loads(cli_stop.stdout)


def test_api_names_go_into_the_record_and_a_bad_one_is_refused(desk: dict[str, Any]) -> None:
    client = _client(desk, "pia")
    body = {
        "registration": "TEST-T",
        "load": {"front": 340, "bags": 100},
        "fuel": {"main": "full"},
        "burn": {"taxi": 1, "trip": 20},
        "names": {"front": "Alex"},
        "record": True,
        "leg": [{"load": {"front": 170}, "names": {"front": "Kim"}, "burn": {"trip": 10}}],
    }
    made = client.post("/api/check", json=body)
    assert made.status_code == 200
    inputs = client.get(f"/api/records/{made.json()['record_id']}").json()["inputs"]
    assert inputs["names"] == {"front": "Alex"} and inputs["leg"][0]["names"] == {"front": "Kim"}
    bad = client.post("/api/check", json={**body, "names": {"nose": "Pat"}})
    assert bad.status_code == 422 and [p["field"] for p in bad.json()["problems"]] == ["names.nose"]
    number = client.post("/api/check", json={**body, "names": {"front": 7}})
    assert number.status_code == 422 and number.json()["problems"][0]["field"] == "names.front"
    assert len(_records(desk)) == 1


def test_api_bad_leg_names_the_leg_and_records_nothing(desk: dict[str, Any]) -> None:
    from loadcheck.web.app import form_key

    client = _client(desk, "pia")
    body = {
        "registration": "TEST-T",
        "load": {"front": 340},
        "fuel": {"main": "full"},
        "record": True,
        "leg": [{"load": {"front": -1}, "burn": {}}],
    }
    response = client.post("/api/check", json=body)
    assert response.status_code == 422
    problems = response.json()["problems"]
    assert [p["field"] for p in problems] == ["leg 2, load.front"] and problems[0]["message"].startswith(
        "leg 2, load.front:"
    )
    unknown = client.post("/api/check", json={**body, "leg": [{"fuel": {"main": 5}, "burn": {}}]})
    assert unknown.status_code == 422 and any(p["field"] == "leg 2, fuel" for p in unknown.json()["problems"])
    assert [form_key(p["field"]) for p in problems] == ["leg.2.load.front"]
    assert (
        client.post("/api/plan/stop", json={**body, "leg": [], "stop": 2}).status_code == 422
    )  # no stop without a leg
    assert _records(desk) == []


def test_names_typed_on_the_form_show_beside_the_seat_and_go_into_the_record(desk: dict[str, Any]) -> None:
    client = _client(desk, "pia")
    form = client.get("/aircraft/TEST-T").text
    assert (
        'name="names.front"' in form and 'name="names.rear"' in form and 'name="names.bags"' not in form
    )  # seats only
    values = {**TRIP_LEG_2_AFT, "names.front": "Alex <i>R</i>", "leg.2.names.front": "Kim"}
    page = _post_check(client, values, "TEST-T").text
    leg_1 = page[page.index('id="leg-1"') : page.index('id="leg-2"', page.index('id="leg-1"') + 1)]
    leg_2 = page[page.rindex('<section class="leg" id="leg-2">') : page.index('<figure class="chart">')]
    assert '<span class="who">· Alex &lt;i&gt;R&lt;/i&gt;</span>' in leg_1 and "<i>R</i>" not in page
    assert '<span class="who">· Kim</span>' in leg_2 and "Alex" not in leg_2
    sheet = _post_check(client, values, "TEST-T", route="sheet").text
    assert "Alex &lt;i&gt;R&lt;/i&gt;" in sheet and "Kim" in sheet and "<i>R</i>" not in sheet
    assert _post_check(client, values, "TEST-T", route="record").status_code == 303
    inputs = _records(desk)[0].inputs
    assert inputs["names"] == {"front": "Alex <i>R</i>"} and inputs["leg"][0]["names"] == {"front": "Kim"}


def test_a_bad_name_brings_the_form_back_with_the_field_named(desk: dict[str, Any]) -> None:
    client = _client(desk, "pia")
    for key in ("names.rear", "leg.2.names.rear"):  # a leg's field in words: the tests at the end
        response = _post_check(
            client, {**TRIP_LEG_2_AFT, key: "Sam"}, "TEST-T", route="record"
        )  # no one weighs in the rear
        assert response.status_code == 422 and "carries no weight" in response.text, key
        assert key != "names.rear" or "names.rear:" in response.text
        assert re.search(rf'class="field name bad">\s*<label for="{re.escape(key)}"', response.text), key
        assert f'name="{key}" value="Sam"' in response.text
    assert _records(desk) == []


# -- the JSON API --------------------------------------------------------------------------------


def test_api_check_is_the_command_lines_json(runner: AppRunner, reading_desk: dict[str, Any]) -> None:

    from loadcheck.cli import app

    cli = runner.invoke(app, ["check", str(SAMPLES / "twin6" / "leaves_path.toml"), "--json"])
    body = {
        "registration": "DEMO-6P",
        "load": {"row1": 380, "row2": 340, "nose": 200},
        "fuel": {"mains": 100, "aux": 40},
        "burn": {"taxi": 2, "trip": 90, "order": ["aux", "mains"]},
    }
    answer = _client(reading_desk, "pia").post("/api/check", json=body)
    assert answer.status_code == 200
    assert answer.json() == json.loads(cli.stdout)
    assert _records(reading_desk) == []


def test_api_check_records_once_when_asked(desk: dict[str, Any]) -> None:
    answer = (
        _client(desk, "pia")
        .post(
            "/api/check",
            json={"registration": "DEMO-4T", "load": {"front": "340"}, "fuel": {"mains": "school"}, "record": True},
        )
        .json()
    )
    records = _records(desk)
    assert [r.id for r in records] == [answer["record_id"]] and records[0].pilot == "pia"


def test_api_bad_value_names_the_field(reading_desk: dict[str, Any]) -> None:
    client = _client(reading_desk, "pia")
    response = client.post(
        "/api/check", json={"registration": "DEMO-4T", "load": {"front": "12 parsecs"}, "record": True}
    )
    assert response.status_code == 422
    assert any(p["field"].startswith("load.front") for p in response.json()["problems"])
    unknown = client.post("/api/check", json={"registration": "DEMO-4T", "weather": "fine"})
    assert unknown.status_code == 422 and "weather" in unknown.text
    assert client.post("/api/check", json={"registration": "NOPE"}).status_code == 422
    assert _records(reading_desk) == []


def test_api_plans_are_the_command_lines_json(runner: AppRunner, reading_desk: dict[str, Any]) -> None:

    from loadcheck.cli import app

    within = str(SAMPLES / "trainer4" / "within.toml")
    body = {
        "registration": "DEMO-4T",
        "load": {"front": 340, "rear": 160, "hold": "15 kg"},
        "fuel": {"mains": "school", "centre": 0},
        "burn": {"taxi": 1.2, "trip": 18, "reserve": 8},
    }
    client = _client(reading_desk, "pia")
    no_fuel = {key: value for key, value in body.items() if key != "fuel"}  # the answer chooses the fuel
    fuel = client.post("/api/plan/fuel", json=no_fuel).json()
    aircraft = str(SAMPLES / "trainer4" / "aircraft.toml")
    options = ["--load", "front=340", "--load", "rear=160", "--load", "hold=15 kg"]
    options += ["--taxi", "1.2", "--trip", "18", "--reserve", "8", "--json"]
    assert fuel == json.loads(runner.invoke(app, ["plan", "fuel", aircraft, *options]).stdout)
    refused = client.post("/api/plan/fuel", json=body)  # fuel given, that the answer would not use
    assert refused.status_code == 422 and {p["field"] for p in refused.json()["problems"]} == {
        "fuel.mains",
        "fuel.centre",
    }
    payload = client.post("/api/plan/payload", json={**body, "station": "hold"}).json()
    assert payload == json.loads(runner.invoke(app, ["plan", "payload", within, "--station", "hold", "--json"]).stdout)
    assert client.post("/api/plan/payload", json=body).status_code == 422  # no station


def test_api_records_and_one_record(desk: dict[str, Any]) -> None:
    client = _client(desk, "pia")
    made = client.post("/api/check", json={"registration": "DEMO-4T", "load": {"front": 340}, "record": True}).json()
    one = client.get(f"/api/records/{made['record_id']}").json()
    assert one["result"]["ok"] == made["ok"] and one["pilot"] == "pia" and "inputs" in one
    assert client.get("/api/records/999").status_code == 404


def test_openapi_schema_documents_the_api(reading_desk: dict[str, Any]) -> None:
    schema = _client(reading_desk, "pia").get("/api/openapi.json").json()
    for path in (
        "/api/check",
        "/api/plan/fuel",
        "/api/plan/payload",
        "/api/records",
        "/api/records/{record_id}",
        "/api/fleet",
    ):
        assert path in schema["paths"], path
    assert "CheckRequest" in schema["components"]["schemas"]


def test_pages_link_no_outside_url(reading_desk: dict[str, Any]) -> None:
    client = _client(reading_desk, "pia")
    for page in (client.get("/signin").text, client.get("/fleet").text, _post_check(client, WITHIN).text):
        assert not re.search(r'(src|href)="(https?:)?//', page)


# -- starting it ---------------------------------------------------------------------------------


def test_fleet_is_read_again_when_an_aircraft_file_changes(desk: dict[str, Any]) -> None:
    client = _client(desk, "pia")
    assert "DEMO-4T" in client.get("/fleet").text
    trainer = desk["fleet"] / "trainer4" / "aircraft.toml"
    trainer.write_text(trainer.read_text().replace('registration = "DEMO-4T"', 'registration = "DEMO-4X"'))
    page = client.get("/fleet").text
    assert "DEMO-4X" in page and "DEMO-4T" not in page
    assert client.get("/aircraft/DEMO-4T").status_code == 422


# -- the desk renders the library's refusals and rules (desk round, 2026-12) ---------------------


def test_desk_refused_a_stop_of_a_one_leg_loading_in_its_own_words(desk: dict[str, Any]) -> None:
    """The desk refused a stop of a loading of one leg with its own check and words (the form and
    the API each differently); it now asks the library job, ``fuel_to_add``, and shows its refusal."""
    from html import escape

    from loadcheck.errors import InputError
    from loadcheck.trip import fuel_to_add

    one_leg = {k: v for k, v in TRIP_LEG_2_AFT.items() if not k.startswith("leg")}
    inputs = _trip_inputs(desk, one_leg)
    assert inputs.trip is None and inputs.given is not None  # one leg: no trip resolved
    with pytest.raises(InputError) as refused:
        fuel_to_add(inputs.aircraft, inputs.given, 2)
    (expected,) = refused.value.problems
    client = _client(desk, "pia")
    page = _post_check(client, {**one_leg, "stop": "2"}, "TEST-T", action="stop")
    assert page.status_code == 422 and escape(expected.message) in page.text, page.text
    body = {"registration": "TEST-T", "load": {"front": 340, "bags": 100}, "fuel": {"main": "full"}, "stop": 2}
    api = client.post("/api/plan/stop", json={**body, "burn": {"taxi": 1, "trip": 20}})
    assert api.status_code == 422
    assert [(p["field"], p["message"]) for p in api.json()["problems"]] == [(expected.field, expected.describe())]
    assert _records(desk) == []


def test_a_trip_longer_than_the_form_is_checked_through_the_api_as_the_library_checks_it(
    desk: dict[str, Any],
) -> None:
    """The form's MAX_LEGS guards the page's size; it is no rule of trips: the library takes a trip
    of any number of legs, and so does POST /api/check (the form says where a longer trip goes)."""
    from loadcheck.trip import check_trip
    from loadcheck.web.app import MAX_LEGS

    legs = MAX_LEGS + 3  # one circuit after another, 0.5 gal taxi and 1 gal each: 40 gal is plenty
    body = {
        "registration": "TEST-T",
        "load": {"front": 340},
        "fuel": {"main": "full"},
        "burn": {"taxi": 0.5, "trip": 1},
        "leg": [{"label": f"circuit {n}", "burn": {"taxi": 0.5, "trip": 1}} for n in range(2, legs + 1)],
    }
    inputs = load_check_inputs(
        desk["fleet"] / "trip_test.toml",
        None,
        allow_trip=True,
        load=body["load"],
        fuel=body["fuel"],
        burn=body["burn"],
        legs=dict(enumerate(body["leg"], start=2)),
    )
    expected = check_trip(inputs.aircraft, inputs.trip)
    assert len(expected.legs) == legs and expected.ok  # the library takes the trip
    client = _client(desk, "pia")
    answer = client.post("/api/check", json=body)
    assert answer.status_code == 200 and answer.json() == expected.to_dict()
    # the form stops at MAX_LEGS and says where a longer trip is checked
    full = _post_check(client, {"legs": str(MAX_LEGS)}, "TEST-T", action="add_leg")
    assert full.status_code == 200 and 'value="add_leg"' not in full.text and "POST /api/check" in full.text
    crafted = _post_check(client, {"legs": str(legs)}, "TEST-T", action="check")
    assert crafted.status_code == 422 and "POST /api/check" in crafted.text


def _library_problems(desk: dict[str, Any], **overrides: Any) -> list[Any]:
    """The problems the library finds in a loading of TEST-T given as ``load_check_inputs`` overrides."""
    from loadcheck.errors import LoadcheckError

    with pytest.raises(LoadcheckError) as refused:
        load_check_inputs(desk["fleet"] / "trip_test.toml", None, allow_trip=True, **overrides)
    return refused.value.problems


def _form_problems(desk: dict[str, Any], values: dict[str, str]) -> list[Any]:
    """The problems the library finds in the check form's values (read by the test, ``_form_overrides``)."""
    first, legs = _form_overrides(values)
    return _library_problems(desk, legs=legs, **first)


def _problems_shown(page: str) -> str:
    """The list of problems a page shows."""
    start = page.index('class="problem"')
    return page[start : page.index("</ul>", start)]


# The check form's values of a bad leg 2 (TRIP_LEG_2_AFT with one field bad), refused by the
# loading's model (a unit, a negative weight), by the aircraft (a level, a seat that carries no weight).
BAD_LEG_2 = (
    ("leg.2.burn.taxi", "1 furlong"),
    ("leg.2.load.front", "-5"),
    ("leg.2.fuel.main", "brimming"),
    ("leg.2.names.rear", "Sam"),
)
# An API body whose leg 2 has a negative weight.
API_BAD_LEG_2: dict[str, Any] = {
    "registration": "TEST-T",
    "load": {"front": 340},
    "fuel": {"main": "full"},
    "leg": [{"load": {"front": -1}, "burn": {}}],
}


def test_desk_rewrote_a_legs_problem_instead_of_showing_the_librarys(desk: dict[str, Any]) -> None:
    """The desk renamed a leg's problems itself (``_leg_words``: ``leg[0].burn.taxi`` shown as
    ``leg 2, burn.taxi``); the library names them, and the desk shows each problem as it comes,
    on the form and in the API, with the form's field marked."""
    from markupsafe import escape  # as the templates escape

    client = _client(desk, "pia")
    for key, bad in BAD_LEG_2:
        values = {**TRIP_LEG_2_AFT, key: bad}
        expected = _form_problems(desk, values)
        response = _post_check(client, values, "TEST-T", route="record")
        assert response.status_code == 422, key
        for problem in expected:
            assert str(escape(problem.describe())) in _problems_shown(response.text), (key, problem)
        assert re.search(rf'class="field( name)? bad">\s*<label for="{re.escape(key)}"', response.text), key
    body = API_BAD_LEG_2
    expected = _library_problems(
        desk, load=body["load"], fuel=body["fuel"], legs=dict(enumerate(body["leg"], start=2))
    )  # the API's body, as the library reads it
    answer = client.post("/api/check", json={**body, "record": True})
    assert answer.status_code == 422
    assert [(p["field"], p["message"]) for p in answer.json()["problems"]] == [
        (p.field, p.describe()) for p in expected
    ]
    assert _records(desk) == []


def _library_names_legs_as_counted() -> bool:
    """Whether the library names a leg's problem as the user counts legs, field ``leg 2, load.left``
    (a value the loading's model refuses, and a name the aircraft does not know). The "bound"
    engineer's change to loading.py, made in the same round, does; the test after this one is
    for the merged code, an expected failure (strict) until the library names legs so."""
    from loadcheck.errors import LoadcheckError

    fields: list[str] = []
    for legs in ({2: {"load": {"left": "-5"}}}, {2: {"load": {"nose": "1"}}}):
        try:
            load_check_inputs(SAMPLES / "heli2" / "trip_drop_off.toml", None, allow_trip=True, legs=legs)
        except LoadcheckError as error:
            fields += [p.field for p in error.problems]
    return len(fields) >= 2 and all(f.startswith("leg 2, ") for f in fields)


@pytest.mark.xfail(
    not _library_names_legs_as_counted(),
    reason="needs the library (loading.py, 'bound' branch) to name a leg's problem 'leg 2, <path>'",
    strict=True,
)
def test_a_legs_problem_reads_leg_2_on_the_form_and_in_the_api(desk: dict[str, Any]) -> None:
    """A bad value in the second leg reads "leg 2, burn.taxi: ..." (the leg as the user counts
    them, then the path within it), with no "leg 2:" said twice, on the form and in the API."""
    from markupsafe import escape  # as the templates escape

    client = _client(desk, "pia")
    for key, bad in BAD_LEG_2:
        problems = _problems_shown(_post_check(client, {**TRIP_LEG_2_AFT, key: bad}, "TEST-T", route="record").text)
        path = key.split(".", 2)[2].replace("fuel.", "add_fuel.")
        assert f"leg 2, {path}: " in problems and str(escape(bad)) in problems, key
        assert "leg 2: " not in problems and "leg[" not in problems, key
    (problem,) = client.post("/api/check", json=API_BAD_LEG_2).json()["problems"]
    assert problem["field"] == "leg 2, load.front" and problem["message"].startswith("leg 2, load.front: ")
    assert "leg 2: " not in problem["message"]


def test_a_file_sent_in_a_text_field_was_read_as_its_description(desk: dict[str, Any]) -> None:
    """The form's values were read as ``str(value)``: a file sent in place of a text field (a form
    the desk did not make) became "UploadFile(filename=...)" and went on as the value typed. The
    form is now read as starlette's FormData (texts and files) and a file there is refused."""
    client = _client(desk, "pia")
    csrf = csrf_of(client.get("/aircraft/DEMO-4T").text)
    fields = {**WITHIN, "action": "check", "csrf": csrf}
    del fields["load.front"]
    response = client.post(
        "/aircraft/DEMO-4T/record", data=fields, files={"load.front": ("front.txt", b"340", "text/plain")}
    )
    assert (
        response.status_code == 422 and "load.front: a file was sent where the form has a text field" in response.text
    )
    assert "UploadFile" not in response.text and _records(desk) == []


def test_the_desk_types_its_forms_and_answers_without_any() -> None:
    """Issue 21: the desk's forms, overrides, problems and answers had some 30 ``Any``s; each now
    has its type (FormData, Mapping, TypedDicts, the library's results, JSON values)."""
    import ast

    import loadcheck.web.app as desk_app

    tree = ast.parse(Path(desk_app.__file__).read_text(encoding="utf-8"))
    used = {n.id for n in ast.walk(tree) if isinstance(n, ast.Name)} | {
        n.attr for n in ast.walk(tree) if isinstance(n, ast.Attribute)
    }
    assert "Any" not in used


# -- registrations as the fleet compares them ----------------------------------------------------


@pytest.mark.parametrize("spelt", ["demo-4t", "DEMO4T", "demo 4t"])
def test_regression_pages_of_a_registration_spelt_otherwise_were_an_internal_error(
    reading_desk: dict[str, Any], spelt: str
) -> None:
    """The check form, a check and the mechanic's page of ``demo-4t`` are DEMO-4T's, as the command line
    finds it (loadcheck.aircraft.registration_key; common practice: a registration is written with or
    without its hyphen, in either case), where each gave 500 "Internal error"."""
    pia = _client(reading_desk, "pia")
    form = pia.get(f"/aircraft/{spelt}")
    assert form.status_code == 200 and "Check a loading: DEMO-4T" in form.text
    checked = _post_check(pia, WITHIN, registration=spelt)
    exact = _post_check(pia, WITHIN)
    assert checked.status_code == exact.status_code == 200
    assert _without_chart(checked.text) == _without_chart(exact.text)
    mechanic = _client(reading_desk, "mo").get(f"/mechanic/{spelt}")
    assert mechanic.status_code == 200 and "Empty-weight record: DEMO-4T" in mechanic.text


def _without_chart(page: str) -> str:
    """A result page without its chart (whose SVG ids differ each drawing) and its security token."""
    return re.sub(r"<svg.*?</svg>", "", page, flags=re.S).replace(csrf_of(page), "")


def test_a_pages_unknown_registration_is_refused_naming_it(reading_desk: dict[str, Any]) -> None:
    """An unknown registration is the fleet's refusal (422, named), on the pilot's and the mechanic's pages."""
    for client, path in (
        (_client(reading_desk, "pia"), "/aircraft/NOPE-1"),
        (_client(reading_desk, "mo"), "/mechanic/NOPE-1"),
    ):
        response = client.get(path)
        assert response.status_code == 422 and "unknown registration &#39;NOPE-1&#39;" in response.text, path


def test_regression_a_proposal_made_under_another_spelling_is_confirmed(desk: dict[str, Any]) -> None:
    """A proposal made at /mechanic/demo4t is confirmed through its page's form (posted to the
    aircraft's own spelling, DEMO-4T): one aircraft, compared as the fleet compares registrations."""
    from loadcheck.files import load_aircraft

    mo = _client(desk, "mo")
    page = mo.get("/mechanic/demo4t").text
    shown = mo.post(
        "/mechanic/demo4t/propose",
        data={"kind": "weighing", "text": (SAMPLES / "trainer4" / "weighing.toml").read_text(), "csrf": csrf_of(page)},
    )
    assert shown.status_code == 200, shown.text
    action = re.search(r'<form method="post" action="([^"]+/confirm)"', shown.text).group(1)  # type: ignore[union-attr]
    token = re.search(r'name="token" value="([^"]+)"', shown.text).group(1)  # type: ignore[union-attr]
    written = mo.post(action, data={"token": token, "confirm": "yes", "csrf": csrf_of(shown.text)})
    assert written.status_code == 200 and "Written:" in written.text
    assert load_aircraft(desk["fleet"] / "trainer4" / "aircraft.toml").empty.weight != 1718.0


# -- the check log's filters: fail closed ------------------------------------------------------


def _three_records(desk: dict[str, Any]) -> TestClient:
    """Two checks within limits and one out (over the front seats' 420 lb), all DEMO-4T's; the dispatcher's client."""
    pia = _client(desk, "pia")
    _post_check(pia, WITHIN, route="record")
    _post_check(pia, {**WITHIN, "load.rear": "150"}, route="record")
    _post_check(pia, {**WITHIN, "load.front": "700"}, route="record")
    return _client(desk, "dan")


@pytest.mark.parametrize("path", ["/api/records", "/records", "/records/export"])
def test_regression_an_unknown_verdict_listed_every_record(desk: dict[str, Any], path: str) -> None:
    """``?verdict=WITHIN`` and ``?verdict=bogus`` listed every record, those out of limits included:
    refused (422) in the library's words naming the verdicts (fail closed, DESIGN.md)."""
    dan = _three_records(desk)
    for word in ("WITHIN", "bogus"):
        response = dan.get(f"{path}?verdict={word}&date=")
        assert response.status_code == 422, (path, word, response.text)
        words = f"verdict: unknown verdict {word!r}; expected within or out"
        if path.startswith("/api/"):
            assert [p["message"] for p in response.json()["problems"]] == [words]
        else:
            assert escape(words, quote=True).replace("&#x27;", "&#39;") in response.text
    # the records page's own form sends "any" blank: not filled in there; the API and the export refuse it
    # as log list does (test_regression_an_empty_filter_listed_every_record)
    assert dan.get(f"{path}?verdict=&date=").status_code == (200 if path == "/records" else 422)


@pytest.mark.parametrize("path", ["/api/records", "/records/export"])
@pytest.mark.parametrize("option", ["registration", "verdict"])
def test_regression_an_empty_filter_listed_every_record(
    runner: AppRunner, desk: dict[str, Any], path: str, option: str
) -> None:
    """``/api/records?registration=`` and ``?verdict=`` listed every record, where ``log list --registration ""``
    and ``--verdict ""`` are refused (exit 2): one rule (docs/fleet.md, "Filters"), the library's
    (checklog.filters_ok), refused with 422 in the command line's own words, nothing listed (trial 9, finding 6)."""
    from loadcheck.cli import app

    dan = _three_records(desk)
    command = runner.invoke(app, ["log", "list", "--db", str(desk["db"]), f"--{option}", ""])
    assert command.exit_code == 2
    words = {"registration": "'' is not a registration: it has no letter or digit", "verdict": "unknown verdict ''"}
    assert words[option] in command.output
    response = dan.get(f"{path}?{option}=&date=")
    assert response.status_code == 422, response.text
    if path.startswith("/api/"):
        [problem] = response.json()["problems"]
        assert problem["field"] == option and words[option] in problem["message"]
    else:
        assert escape(words[option], quote=True).replace("&#x27;", "&#39;") in response.text
        assert "DEMO-4T" not in response.text  # nothing exported
    # refused on an empty log too: the rule does not wait for a record to be read
    desk["db"].unlink()
    assert dan.get(f"{path}?{option}=").status_code == 422


def test_the_records_pages_own_form_sends_blank_filters_and_they_mean_not_filled_in(desk: dict[str, Any]) -> None:
    """The Checks page's form posts "every aircraft" and "any" as blank fields: there (and only there) a
    blank is no filter; its export links leave them out, so they go through the export's one rule."""
    dan = _three_records(desk)
    form = dan.get("/records").text
    assert '<option value="">every aircraft</option>' in form and '<option value="" selected>any</option>' in form
    page = dan.get("/records?registration=&verdict=&date=").text
    assert len(re.findall(r'href="/records/\d+"', page)) == 3
    links = re.findall(r'href="(/records/export\?[^"]+)"', page)
    assert len(links) == 2 and all("registration=" not in link and "verdict=" not in link for link in links)
    csv_text = dan.get(links[0].replace("&amp;", "&"))
    assert csv_text.status_code == 200 and len(csv_text.text.strip().splitlines()) == 1 + 3
    chosen = dan.get("/records?registration=DEMO-4T&verdict=out&date=").text
    assert "registration=DEMO-4T&amp;verdict=out&amp;date=" in chosen  # a filter chosen is exported with it
    assert dan.get("/records?registration=%20&date=").status_code == 422  # a blank of spaces is not the form's


@pytest.mark.parametrize("path", ["/api/records", "/records", "/records/export"])
def test_regression_a_repeated_or_unknown_filter_was_read_in_part(desk: dict[str, Any], path: str) -> None:
    """``verdict=within&verdict=out`` was read as ``out`` (the last) and ``colour=red`` ignored: both
    refused (422), naming the parameter, nothing listed (common practice: a filter the user gave is
    applied or refused, never left out)."""
    dan = _three_records(desk)
    repeated = dan.get(f"{path}?verdict=within&verdict=out")
    assert repeated.status_code == 422
    assert "gives the parameter &#39;verdict&#39; more than once" in repeated.text.replace("'", "&#39;")
    unknown = dan.get(f"{path}?colour=red")
    assert unknown.status_code == 422
    assert "takes no parameter &#39;colour&#39;: nothing was listed" in unknown.text.replace("'", "&#39;")


def test_regression_the_registration_filter_was_exact(desk: dict[str, Any]) -> None:
    """``?registration=demo4t`` gave [] where DEMO-4T has records: the check log's query compares
    registrations as the fleet does (loadcheck.aircraft.registration_key), for the desk and ``log list`` alike."""
    dan = _three_records(desk)
    every = dan.get("/api/records?date=").json()
    assert len(every) == 3
    for spelt in ("demo4t", "demo 4t", "DEMO-4T"):
        assert dan.get("/api/records", params={"registration": spelt, "date": ""}).json() == every, spelt
    out = dan.get("/api/records?registration=demo4t&verdict=out&date=").json()
    assert [r["ok"] for r in out] == [False]
    page = dan.get("/records?registration=demo4t&date=").text
    assert len(re.findall(r'href="/records/\d+"', page)) == 3
    assert '<option value="demo4t" selected>demo4t</option>' in page  # the filter shown as given


@pytest.mark.parametrize("path", ["/fleet", "/api/fleet"])
def test_regression_the_fleet_listing_read_a_repeated_or_unknown_parameter_in_part(
    reading_desk: dict[str, Any], path: str
) -> None:
    """``?max_age=30&max_age=5000`` was read as 5000 (the last) and ``?max_ag=30`` ignored (every record
    then judged by 36 months): both refused (422, named; common practice: a filter given is applied or refused)."""
    client = _client(reading_desk, "pia")
    assert client.get(f"{path}?max_age=30").status_code == 200
    repeated = client.get(f"{path}?max_age=30&max_age=5000")
    assert repeated.status_code == 422 and "more than once" in repeated.text
    unknown = client.get(f"{path}?max_ag=30")
    assert unknown.status_code == 422 and "takes no parameter" in unknown.text and "max_age" in unknown.text


def test_the_desks_moment_table_has_the_terminals_columns(reading_desk: dict[str, Any]) -> None:
    # an outside trial's find: the desk's result page had no moment / 1000 column for an aircraft
    # whose envelope reads the moment scaled (docs/cli.md: the moment table shows that column), nor
    # the lateral columns; the terminal, the load sheet and the desk now share one list of columns
    from html import escape

    from loadcheck.render.terminal import moment_table_columns

    cases = [
        (
            "twin6/within.toml",
            "DEMO-6P",
            {"load.row1": "380", "fuel.mains": "full", "burn.taxi": "2", "burn.trip": "30"},
        ),
        ("heli2/solo_heavy_right.toml", "DEMO-H2", {"load.right": "245", "load.bag_right": "35", "fuel.main": "full"}),
    ]
    client = _client(reading_desk, "pia")
    for loading, registration, values in cases:
        inputs = load_check_inputs(SAMPLES / loading)
        heads, scaled, lateral = moment_table_columns(check_loading(inputs.aircraft, inputs.loading), inputs.aircraft)
        assert (scaled is not None) if registration == "DEMO-6P" else lateral, heads
        page = _post_check(client, values, registration).text
        assert "Moment table" in page, page[-2000:]
        for head in heads:
            assert f"<th>{escape(head)}</th>" in page, (registration, head)


def test_record_this_check_refuses_where_the_aircraft_data_changed_since_the_check_shown(desk: dict[str, Any]) -> None:
    # trial 12, finding 6: "Record this check" checked the loading again with the aircraft file as it was
    # then and recorded that, without a word, though the file had changed since the check the pilot read
    # (other figures recorded than shown); the result page's button now names the data of the check shown
    import re

    client = _client(desk, "pia")
    form = client.get("/aircraft/DEMO-4T")
    shown = client.post("/aircraft/DEMO-4T/check", data={**WITHIN, "action": "check", "csrf": csrf_of(form.text)})
    data = re.search(r'name="data" value="([0-9a-f]+)"', shown.text)
    assert data is not None
    aircraft = next(p for p in desk["fleet"].rglob("*.toml") if 'registration = "DEMO-4T"' in p.read_text())
    aircraft.write_text(aircraft.read_text().replace("arm = 37.2", "arm = 37.4", 1))  # a mechanic's write
    posted = {**WITHIN, "data": data.group(1), "action": "check", "csrf": csrf_of(form.text)}
    refused = client.post("/aircraft/DEMO-4T/record", data=posted, follow_redirects=False)
    assert refused.status_code == 422 and "the aircraft data changed since the check shown" in refused.text
    assert _records(desk) == []
    unnamed = client.post("/aircraft/DEMO-4T/record", data={k: v for k, v in posted.items() if k != "data"})
    assert unnamed.status_code == 422 and "does not say which aircraft data" in unnamed.text and _records(desk) == []


# -- trial 13 D3 and D4: a trip's warnings, and what changes at each stop, on the desk ------------
#
# The trip of tests/test_trip.WARNED_TRIP on the check form of TEST-T (worked by hand there with
# the moment method of FAA-H-8083-1B (2016) ch. 2): within limits on both legs, each landing with
# 19 gal below its reserve of 20 gal (a warning each); at the stop a passenger boards the front
# seats (180 -> 340 lb) and the tank is filled "full": 21 gal (126 lb) put in, 40 gal on board.
TRIP_WARNED = {
    "load.front": "180",
    "fuel.main": "30",
    "burn.taxi": "1",
    "burn.trip": "10",
    "burn.reserve": "20",
    "legs": "2",
    "leg.2.label": "two up",
    "leg.2.load.front": "340",
    "leg.2.fuel.main": "full",
    "leg.2.burn.taxi": "1",
    "leg.2.burn.trip": "20",
    "leg.2.burn.reserve": "20",
}


def _words(html: str) -> str:
    """A page's words: inline tags dropped, other tags and runs of white space each made one space."""
    inline = re.sub(r"</?(?:a|strong|span|code|b|em)\b[^>]*>", "", html)
    return " ".join(unescape(re.sub(r"<[^>]+>", " ", inline)).split())


def _leg_section(page: str, leg: int) -> str:
    start = page.index(f'<section class="leg" id="leg-{leg}">')
    return page[start : page.index("</section>", start)]


def test_regression_the_desks_trip_verdict_dropped_the_warnings_of_its_legs(reading_desk: dict[str, Any]) -> None:
    """Trial 13 D3: "Within limits on every leg (2 legs): every condition, burn path and weight limit
    of each leg holds." over two legs landing below their reserves. The trip's verdict now says the
    warnings in all, and each leg's verdict its own, in the single check's words."""
    from loadcheck.words import within_limits_text

    expected = _trip_result(reading_desk, TRIP_WARNED)
    assert expected.ok and [[f.code for f in leg.check.findings] for leg in expected.legs] == [["reserve"], ["reserve"]]
    response = _post_check(_client(reading_desk, "pia"), TRIP_WARNED, "TEST-T")
    assert response.status_code == 200
    main = response.text[response.text.index("<main>") :]
    verdict = re.search(r'<p class="verdict ok" role="status">(.*?)</p>', main, re.S)
    assert verdict and main.index(verdict.group(0)) < main.index('id="leg-1"')
    assert _words(verdict.group(1)) == f"Within limits on every leg (2 legs): {within_limits_text(2)}"
    for leg in (1, 2):
        section = _words(_leg_section(main, leg))
        assert f"Leg {leg}: within limits: {within_limits_text(1)}" in section
        assert "landing fuel 19.0 usgal is below the reserve of 20.0 usgal by 1.0 usgal" in section
    listed = _words(main[main.index('<ul class="small">') : main.index('<section class="leg"')])
    assert f"Leg 1: within limits: {within_limits_text(1)}" in listed
    assert f"Leg 2 (two up): within limits: {within_limits_text(1)}" in listed
    assert within_limits_text(0) not in _words(main)  # never "every condition ... holds" over a warning


def test_regression_the_desks_trip_did_not_show_the_fuel_put_in_nor_the_load_changed_at_a_stop(
    reading_desk: dict[str, Any],
) -> None:
    """Trial 13 D4: the desk's trip result showed neither the fuel put in at a stop (a pilot who typed
    "full" was never told how much fuel that is) nor the load changed there. Leg 2 now shows both, from
    the result's own stop (the figures the command line's "fuel put in at the stop" line gives)."""
    from loadcheck.display import fmt

    expected = _trip_result(reading_desk, TRIP_WARNED)
    stop = expected.legs[1].stop
    assert stop is not None and expected.legs[0].stop is None
    [uplift] = stop.fuel
    assert (uplift.volume, uplift.weight, uplift.on_board, uplift.given) == (
        pytest.approx(21.0),
        pytest.approx(126.0),
        pytest.approx(40.0),
        "full",
    )  # by hand: 40 - 19 gal at 6.0 lb/gal
    page = _post_check(_client(reading_desk, "pia"), TRIP_WARNED, "TEST-T").text
    assert "At the stop before this leg" not in _leg_section(page, 1)
    leg_2 = _leg_section(page, 2)
    assert leg_2.index("At the stop before this leg") < leg_2.index("Moment table")
    fuel = re.search(r'<table class="figures" id="stop-2-fuel">(.*?)</table>', leg_2, re.S)
    load = re.search(r'<table class="figures" id="stop-2-load">(.*?)</table>', leg_2, re.S)
    assert fuel and load
    assert 'Main tank "full" 21.0 126.0 40.0' in _words(fuel.group(1))
    assert [fmt(uplift.volume, "usgal"), fmt(uplift.weight, "lb")] == ["21.0 usgal", "126.0 lb"]
    assert "Front seats 180.0 340.0" in _words(load.group(1))
    assert [(c.name, c.from_weight, c.to_weight) for c in stop.stations] == [("Front seats", 180.0, 340.0)]


def test_a_stop_with_no_fuel_put_in_says_so_on_the_desk(reading_desk: dict[str, Any]) -> None:
    """A stop that puts no fuel in and changes no load says "none" for each (as the command line's
    "fuel put in at the stop: none")."""
    values = {k: v for k, v in TRIP_WARNED.items() if k not in ("leg.2.load.front", "leg.2.fuel.main")}
    values["leg.2.burn.trip"] = "5"
    page = _post_check(_client(reading_desk, "pia"), values, "TEST-T").text
    leg_2 = _words(_leg_section(page, 2))
    assert "Fuel put in at the stop None put in." in leg_2 and "Load changed at the stop None changed." in leg_2


def test_the_desk_and_the_command_line_agree_on_a_trip(
    runner: AppRunner, reading_desk: dict[str, Any], tmp_path: Path
) -> None:
    """The desk's trip and the command line's check of the same loading file: the same result (JSON),
    and every leg's figures on the desk page are the command line's, its stop's too."""
    from loadcheck.cli import app
    from loadcheck.display import fmt

    from .test_trip import WARNED_TRIP

    loading = tmp_path / "warned.toml"
    loading.write_text(
        WARNED_TRIP.replace('"aircraft.toml"', json.dumps((reading_desk["fleet"] / "trip_test.toml").as_posix()))
    )
    shown = runner.invoke(app, ["check", str(loading), "--json"])
    assert shown.exit_code == 0, shown.output
    cli = json.loads(shown.output)
    assert _trip_result(reading_desk, TRIP_WARNED).to_dict() == cli  # the desk reads the form as this file
    terminal = " ".join(runner.invoke(app, ["check", str(loading)]).output.replace("│", " ").split())
    page = _post_check(_client(reading_desk, "pia"), TRIP_WARNED, "TEST-T").text
    units = cli["units"]
    for leg in cli["legs"]:
        section = _words(_leg_section(page, leg["leg"]))
        for c in leg["conditions"]:
            figures = [
                fmt(c["fuel"], units["fuel_volume"]),
                fmt(c["weight"], units["mass"]),
                fmt(c["arm"], units["arm"]),
            ]
            row = " ".join(f.rsplit(" ", 1)[0] for f in figures)
            assert row in section, (leg["leg"], c["condition"], row)
            assert row in terminal, (leg["leg"], c["condition"], row)
        for f in leg["findings"]:
            assert f["message"] in section and f["message"] in terminal
    for line in (
        'fuel put in at the stop: Main tank: 21.0 usgal put in (126.0 lb), as given "full", 40.0 usgal on board after',
        "load changed at the stop: Front seats: from 180.0 lb to 340.0 lb",
    ):
        assert line in terminal, line


def test_a_planned_stop_on_the_desk_shows_the_fuel_the_answer_puts_in(reading_desk: dict[str, Any]) -> None:
    """The fuel-to-put-in answer for a stop shows, on leg 2 of the trip checked at the answer, the fuel
    that answer puts in (the plan's figure, no amount given for it) with its mass, from the answer's
    own check (loadcheck.trip.fuel_to_add)."""
    from loadcheck.display import fmt
    from loadcheck.trip import fuel_to_add

    within = {**TRIP_LEG_2_AFT, "leg.2.load.front": "340", "leg.2.load.bags": "0"}  # as the plan test above
    inputs = _trip_inputs(reading_desk, within)
    answer = fuel_to_add(inputs.aircraft, inputs.trip, 2)
    assert answer.feasible and answer.trip is not None
    stop = answer.trip.legs[1].stop
    assert stop is not None and [u.given for u in stop.fuel] == [None]
    unplanned = {k: v for k, v in within.items() if k != "leg.2.fuel.main"}  # the answer chooses the stop's fuel
    page = _post_check(_client(reading_desk, "pia"), {**unplanned, "stop": "2"}, "TEST-T", action="stop").text
    fuel = re.search(r'<table class="figures" id="stop-2-fuel">(.*?)</table>', _leg_section(page, 2), re.S)
    assert fuel
    [uplift] = stop.fuel
    row = " ".join(
        [
            "Main tank the plan's figure",
            fmt(uplift.volume, "usgal", with_unit=False),
            fmt(uplift.weight, "lb", with_unit=False),
            fmt(uplift.on_board, "usgal", with_unit=False),
        ]
    )
    assert row in _words(fuel.group(1))
