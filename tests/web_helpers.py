"""Shared set-up of the desk's tests: a copy of the sample fleet, a check log, four accounts."""

from __future__ import annotations

import re
import shutil
from pathlib import Path
from typing import TYPE_CHECKING, Any

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


# A test aircraft of our own (invented; not a sample, not a real type) for the trip tests: a
# rectangular envelope from 35 to 43 in, front seats well ahead of the empty CG, baggage far
# aft. With two up front, 100 lb of bags and full fuel the first leg is inside; when one
# front occupant gets off at the stop the CG moves aft past 43 in (the figures are the
# library's: the tests compare the desk's pages with check_trip, never with numbers of their own).
TRIP_AIRCRAFT = """\
format = 1
name = "Trip test aircraft (invented for the desk's tests)"
registration = "TEST-TRIP"

[units]
mass = "lb"
arm = "in"
fuel_volume = "usgal"

[empty]
weight = 1000.0
arm = 40.0
date = 2026-11-01

[limits]
max_takeoff_weight = 1800

[[station]]
id = "front"
label = "Front seats"
kind = "seat"
arm = 30.0
max_weight = 400

[[station]]
id = "rear"
label = "Rear seats"
kind = "seat"
arm = 70.0
max_weight = 400

[[station]]
id = "bags"
label = "Baggage"
kind = "baggage"
arm = 100.0
max_weight = 100

[[tank]]
id = "main"
label = "Main tank"
arm = 45.0
usable = 40.0
fuel = "avgas"
levels = { local = 25.0 }

[[envelope]]
category = "normal"
axes = ["arm", "weight"]
points = [[35, 900], [35, 1800], [43, 1800], [43, 900]]
"""

# The check form's fields of a two-leg trip of TRIP_AIRCRAFT whose second leg alone is aft of the envelope.
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
    """A fleet folder (copy of the samples and TRIP_AIRCRAFT), a check log path and an accounts file with ACCOUNTS."""
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
    return client.post(
        f"/aircraft/{registration}/{route}",
        data={**values, "action": action, "csrf": csrf_of(form.text)},
        follow_redirects=False,
    )


def _records(desk: dict[str, Any]) -> list[Any]:
    from loadcheck.checklog import CheckLog

    if not desk["db"].exists():
        return []
    with CheckLog(desk["db"]) as log:
        return list(log.find())
