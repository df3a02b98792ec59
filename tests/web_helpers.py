"""Shared set-up of the desk's tests: a copy of the sample fleet, a check log, four accounts."""

from __future__ import annotations

import re
import shutil
from pathlib import Path
from typing import TYPE_CHECKING, Any

from .helpers import TRIP_AIRCRAFT

if TYPE_CHECKING:
    from fastapi.testclient import TestClient

ROOT = Path(__file__).resolve().parent.parent
SAMPLES = ROOT / "sample_aircraft"
PASSWORD = "a long test pass phrase"
ACCOUNTS = {"pia": ["pilot"], "pat": ["pilot"], "dan": ["dispatcher"], "mo": ["mechanic"]}

__all__ = [
    "ACCOUNTS",
    "PASSWORD",
    "SAMPLES",
    "TRIP_AIRCRAFT",
    "TRIP_LEG_2_AFT",
    "copy_desk",
    "csrf_of",
    "make_desk",
    "sign_in",
]


# The desk's fleet holds the trip test aircraft TEST-T (tests/helpers.TRIP_AIRCRAFT, invented,
# its figures worked by hand there) as trip_test.toml.
#
# The check form's fields of a two-leg trip of TEST-T whose second leg alone is aft of the
# envelope (74 to 86 in), worked by hand with the moment method of FAA-H-8083-1B (2016) ch. 2
# (moment = weight x arm; CG = moment / weight; avgas 6.0 lb/US gal, common practice):
#   leg 1: two up front 340 lb at 70 in, bags 100 lb at 180 in, full fuel 40 gal (240 lb) at 90 in:
#     ramp     1,000 + 340 + 100 + 240 = 1,680 lb; 80,000 + 23,800 + 18,000 + 21,600 = 143,400 lb-in; CG 85.36 in
#     takeoff  (39 gal) 1,674 lb, 142,860 lb-in, CG 85.34 in; landing (19 gal) 1,554 lb, 132,060 lb-in, CG 84.98 in
#     within at every condition;
#   leg 2: one front occupant gets off (170 lb), 5 gal put in (19 + 5 = 24 gal, 144 lb):
#     ramp     1,000 + 170 + 100 + 144 = 1,414 lb; 80,000 + 11,900 + 18,000 + 12,960 = 122,860 lb-in; CG 86.89 in
#     takeoff  (23 gal) 1,408 lb, 122,320 lb-in, CG 86.88 in; landing (13 gal) 1,348 lb, 116,920 lb-in, CG 86.74 in
#     aft of 86 in at every condition.
# tests/test_trip.py checks these figures through check_trip; the desk's tests compare its pages with the library.
TRIP_LEG_2_AFT = {
    "load.front": "340",
    "load.bags": "100",
    "fuel.main": "full",
    "burn.taxi": "1",
    "burn.trip": "20",
    "legs": "2",
    "leg.2.label": "back solo",
    "leg.2.load.front": "170",
    "leg.2.fuel.main": "5",
    "leg.2.burn.taxi": "1",
    "leg.2.burn.trip": "10",
}


def make_desk(tmp: Path) -> tuple[Path, Path, Path]:
    """A fleet folder (copy of the samples and the trip test aircraft TRIP_AIRCRAFT as trip_test.toml), a
    check log path and an accounts file with ACCOUNTS."""
    from argon2 import PasswordHasher

    from loadcheck.web.users import UserStore

    fleet = tmp / "fleet"
    shutil.copytree(SAMPLES, fleet)
    (fleet / "trip_test.toml").write_text(TRIP_AIRCRAFT, encoding="utf-8")
    users = tmp / "users.json"
    store = UserStore(
        users, hasher=PasswordHasher(time_cost=1, memory_cost=1024, parallelism=1)
    )  # quick to check in tests
    for name, roles in ACCOUNTS.items():
        store.add(name, PASSWORD, roles)
    return fleet, tmp / "records.sqlite3", users


def copy_desk(files: tuple[Path, Path, Path], root: Path) -> tuple[Path, Path, Path]:
    """A copy under ``root`` of the desk's files that :func:`make_desk` made (the accounts'
    hashes made once, not per test): the fleet folder, a check log path and the accounts file."""
    fleet, db, users = files
    shutil.copytree(fleet, root / "fleet")
    shutil.copy2(users, root / users.name)
    return root / "fleet", root / db.name, root / users.name


def csrf_of(html: str) -> str:
    """The CSRF token of the first form of a page."""
    found = re.search(r'name="csrf" value="([^"]+)"', html)
    assert found, "the page has no CSRF field"
    return found.group(1)


def sign_in(client: Any, name: str, password: str = PASSWORD) -> Any:
    """Sign in through the sign-in form; return the response."""
    page = client.get("/signin")
    return client.post(
        "/signin", data={"name": name, "password": password, "csrf": csrf_of(page.text)}, follow_redirects=False
    )


# -- the desk through the framework's test client (tests/test_web_*.py) --------------------------

WITHIN = {
    "load.front": "340",
    "load.rear": "160",
    "load.hold": "15 kg",
    "fuel.mains": "school",
    "fuel.centre": "0",
    "burn.taxi": "1.2",
    "burn.trip": "18",
    "burn.reserve": "8",
}


def _client(desk: dict[str, Any], name: str | None = None) -> TestClient:
    from fastapi.testclient import TestClient

    client = TestClient(desk["app"], client=("127.0.0.1", 50000))
    if name is not None:
        assert sign_in(client, name).status_code == 303
    return client


def _post_check(
    client: TestClient,
    values: dict[str, str],
    registration: str = "DEMO-4T",
    action: str = "check",
    route: str = "check",
) -> Any:
    form = client.get(f"/aircraft/{registration}")
    extra: dict[str, str] = {}
    if route == "record" and "data" not in values:  # as the result page's button: the data of the check shown
        shown = client.post(
            f"/aircraft/{registration}/check",
            data={**values, "action": "check", "csrf": csrf_of(form.text)},
            follow_redirects=False,
        )
        found = re.search(r'name="data" value="([0-9a-f]+)"', shown.text)
        extra = {"data": found.group(1)} if found else {}
    return client.post(
        f"/aircraft/{registration}/{route}",
        data={**values, **extra, "action": action, "csrf": csrf_of(form.text)},
        follow_redirects=False,
    )


def _records(desk: dict[str, Any]) -> list[Any]:
    from loadcheck.checklog import CheckLog

    if not desk["db"].exists():
        return []
    with CheckLog(desk["db"]) as log:
        return list(log.find())
