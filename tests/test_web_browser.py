"""The desk in a real browser: headless Chromium (the system's package) driven by Playwright (issue 19).

Skipped where Playwright's Python package or a system Chromium is missing (no browser is
downloaded). Set DESK_SCREENSHOTS=docs/images to write the screenshots that docs/web.md shows.
"""

from __future__ import annotations

import os
import shutil
import socket
import threading
import time
from collections.abc import Iterator
from pathlib import Path
from typing import Any

import pytest

pytest.importorskip("fastapi")
pytest.importorskip("argon2")
sync_api = pytest.importorskip("playwright.sync_api")

from .web_helpers import PASSWORD, SAMPLES, TRIP_LEG_2_AFT, make_desk  # noqa: E402

CHROMIUM = os.environ.get("CHROMIUM") or shutil.which("chromium") or shutil.which("chromium-browser")
pytestmark = pytest.mark.skipif(CHROMIUM is None, reason="no system Chromium (Debian package 'chromium')")
SHOTS = os.environ.get("DESK_SCREENSHOTS")


def _free_port() -> int:
    with socket.socket() as s:
        s.bind(("127.0.0.1", 0))
        return int(s.getsockname()[1])


@pytest.fixture(scope="module")
def server(tmp_path_factory: pytest.TempPathFactory) -> Iterator[dict[str, Any]]:
    import uvicorn

    from loadcheck.web import create_app

    fleet, db, users = make_desk(tmp_path_factory.mktemp("desk"))
    port = _free_port()
    config = uvicorn.Config(create_app(fleet, db=db, users=users), host="127.0.0.1", port=port, log_level="warning")
    running = uvicorn.Server(config)
    thread = threading.Thread(target=running.run, daemon=True)
    thread.start()
    deadline = time.monotonic() + 15
    while not running.started and time.monotonic() < deadline:
        time.sleep(0.05)
    assert running.started, "the desk did not start"
    yield {"url": f"http://127.0.0.1:{port}", "fleet": fleet, "db": db}
    running.should_exit = True
    thread.join(10)


@pytest.fixture(scope="module")
def browser() -> Iterator[Any]:
    with sync_api.sync_playwright() as playwright:
        launched = playwright.chromium.launch(executable_path=CHROMIUM, args=["--no-sandbox"])
        yield launched
        launched.close()


def _page(browser: Any, server: dict[str, Any], name: str, width: int = 1000) -> Any:
    context = browser.new_context(viewport={"width": width, "height": 900})
    page = context.new_page()
    page.goto(server["url"] + "/signin")
    page.fill("#name", name)
    page.fill("#password", PASSWORD)
    page.click("button:has-text('Sign in')")
    page.wait_for_url("**/fleet")
    return page


def _shot(page: Any, name: str) -> None:
    if SHOTS:
        Path(SHOTS).mkdir(parents=True, exist_ok=True)
        page.screenshot(path=str(Path(SHOTS) / f"web-{name}.png"), full_page=True)


def _no_sideways_scroll(page: Any) -> None:
    # after a click that follows a link the new page may be committed but not yet parsed (no
    # documentElement: seen once on a busy machine); measure it once it has loaded
    page.wait_for_load_state("load")
    overflow = page.evaluate("document.documentElement.scrollWidth - document.documentElement.clientWidth")
    assert overflow <= 0, f"{page.url} scrolls sideways by {overflow} px at 360 px"


TRAINER = {
    "load.front": "340",
    "load.rear": "160",
    "load.hold": "15 kg",
    "fuel.mains": "school",
    "fuel.centre": "0",
    "burn.taxi": "1.2",
    "burn.trip": "18",
    "burn.reserve": "8",
}
TWIN_LEAVES = {
    "load.row1": "380",
    "load.row2": "340",
    "load.nose": "200",
    "fuel.mains": "100",
    "fuel.aux": "40",
    "burn.taxi": "2",
    "burn.trip": "90",
    "burn.order": "aux,mains",
}  # sample twin6/leaves_path.toml


def _fill(page: Any, values: dict[str, str]) -> None:
    for field, value in values.items():
        page.fill(f"[id='{field}']", value)


@pytest.mark.slow  # the default run still drives a check in the browser (bad value, trip)
def test_pilot_checks_records_and_the_dispatcher_sees_it(browser: Any, server: dict[str, Any]) -> None:
    pilot = _page(browser, server, "pia", width=360)
    _no_sideways_scroll(pilot)
    _shot(pilot, "fleet")
    pilot.click("a[href='/aircraft/DEMO-4T']")
    _fill(pilot, TRAINER)
    _no_sideways_scroll(pilot)
    _shot(pilot, "check-form")
    pilot.click("button[value='check']")
    assert pilot.locator(".verdict").inner_text().startswith("Within limits:")
    assert pilot.locator("figure.chart svg").count() == 1
    _no_sideways_scroll(pilot)
    _shot(pilot, "check-within")
    pilot.click("button:has-text('Record this check')")
    pilot.wait_for_url("**/records/*")
    record_id = pilot.url.rsplit("/", 1)[1]
    assert "Within limits" in pilot.locator(".verdict").inner_text()
    _no_sideways_scroll(pilot)

    pilot.goto(server["url"] + "/aircraft/DEMO-6P")
    _fill(pilot, TWIN_LEAVES)
    pilot.click("button[value='check']")
    verdict = pilot.locator(".verdict").inner_text()
    assert verdict.startswith("Not within limits:")
    assert "the CG leaves" in pilot.locator("p.out").last.inner_text()  # the burn path, in words
    _no_sideways_scroll(pilot)
    _shot(pilot, "check-leaves-path")

    dispatcher = _page(browser, server, "dan")
    dispatcher.click("a[href='/records']")
    row = dispatcher.locator(f"a[href='/records/{record_id}']")
    assert row.is_visible()
    _shot(dispatcher, "dispatcher")
    row.click()
    dispatcher.click("button:has-text('Verify this record')")
    assert dispatcher.locator(".verdict").nth(1).inner_text().startswith("Verified:")
    narrow = _page(browser, server, "dan", width=360)
    narrow.goto(server["url"] + "/records")
    _no_sideways_scroll(narrow)


def test_a_bad_value_is_named_and_kept(browser: Any, server: dict[str, Any]) -> None:
    pilot = _page(browser, server, "pat", width=360)
    pilot.goto(server["url"] + "/aircraft/DEMO-4T")
    _fill(pilot, {**TRAINER, "load.rear": "160 stone"})
    pilot.click("button[value='check']")
    assert "nothing was recorded" in pilot.locator(".problem").inner_text()
    assert pilot.input_value("[id='load.rear']") == "160 stone" and pilot.input_value("[id='load.hold']") == "15 kg"
    _no_sideways_scroll(pilot)
    _shot(pilot, "bad-value")


@pytest.mark.slow  # the default run still drives a check in the browser (bad value, trip)
def test_mechanic_records_a_weighing_and_the_next_check_uses_it(browser: Any, server: dict[str, Any]) -> None:
    from loadcheck.display import fmt
    from loadcheck.empty_record import propose

    aircraft_file = server["fleet"] / "trainer4" / "aircraft.toml"
    expected = propose(  # the readings' aircraft key read beside the desk's copy, as the desk reads an upload
        aircraft_file, SAMPLES / "trainer4" / "weighing.toml", "weighing", relative_to=aircraft_file.parent
    ).result.new
    mechanic = _page(browser, server, "mo", width=360)
    mechanic.click("a[href='/mechanic/DEMO-4T']")
    _no_sideways_scroll(mechanic)
    mechanic.set_input_files("#upload", str(SAMPLES / "trainer4" / "weighing.toml"))
    mechanic.click("button:has-text('Work out the new record')")
    assert mechanic.get_by_text("Current and new empty-weight record").is_visible()
    _no_sideways_scroll(mechanic)
    new_column = mechanic.locator("table.compare th").nth(2).bounding_box()
    assert new_column["x"] + new_column["width"] <= 360, (
        "the new record's column must show on a phone without scrolling"
    )
    _shot(mechanic, "mechanic-proposal")
    mechanic.check("input[name='confirm']")
    mechanic.click("button:has-text('Write the new record')")
    assert mechanic.locator(".verdict").inner_text().startswith("Written:")

    pilot = _page(browser, server, "pia")
    pilot.goto(server["url"] + "/aircraft/DEMO-4T")
    _fill(pilot, TRAINER)
    pilot.click("button[value='check']")
    first_row = pilot.locator("table.figures tbody tr").first.inner_text()
    assert fmt(expected.weight, "lb", with_unit=False) in first_row


def test_a_trip_of_two_legs_whose_second_leg_fails(browser: Any, server: dict[str, Any]) -> None:
    """TEST-T (tests/helpers.TRIP_AIRCRAFT, invented; TRIP_LEG_2_AFT worked by hand in tests/web_helpers.py): leg 1
    within limits, leg 2 aft after a front occupant gets off."""
    first = {k: v for k, v in TRIP_LEG_2_AFT.items() if not k.startswith("leg")}
    second = {k: v for k, v in TRIP_LEG_2_AFT.items() if k.startswith("leg.")}
    pilot = _page(browser, server, "pia", width=360)
    pilot.goto(server["url"] + "/aircraft/TEST-T")
    _fill(pilot, first)
    pilot.click("button[value='add_leg']")  # no script: the form comes back with a leg more
    assert pilot.input_value("[id='load.front']") == "340" and pilot.input_value("[id='fuel.main']") == "full"
    _fill(pilot, second)
    _no_sideways_scroll(pilot)
    _shot(pilot, "check-trip-form")
    pilot.press("[id='leg.2.burn.trip']", "Enter")  # Enter checks the trip (it never takes a leg out)
    pilot.wait_for_selector(".verdict[role='status']")
    verdict = pilot.locator(".verdict[role='status']").inner_text()
    assert verdict.startswith("Not within limits on leg 2 (back solo)"), verdict
    assert pilot.locator("section.leg").count() == 2
    assert pilot.locator("#leg-1 .verdict").inner_text().startswith("Leg 1: within limits")
    assert pilot.locator("#leg-2 .verdict").inner_text().startswith("Leg 2: not within limits")
    assert (
        pilot.locator("#leg-2 li.limit").count() >= 1 and "leg 2" in pilot.locator("#leg-2 li.limit").first.inner_text()
    )
    assert (
        pilot.locator("figure.chart svg").count() == 1
        and pilot.locator("figure.chart [id='leg-2-burn-path']").count() == 1
    )
    _no_sideways_scroll(pilot)
    _shot(pilot, "check-trip")
    pilot.click("button:has-text('Record this trip')")
    pilot.wait_for_url("**/records/*")
    assert "Not within limits" in pilot.locator(".verdict").first.inner_text()
    assert pilot.get_by_text("Conditions of leg 2 (back solo): not within limits").is_visible()
    _no_sideways_scroll(pilot)
