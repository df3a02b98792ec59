"""Shared set-up of the desk's tests: a copy of the sample fleet, a record log, four accounts."""

from __future__ import annotations

import re
import shutil
from pathlib import Path
from typing import Any

ROOT = Path(__file__).resolve().parent.parent
SAMPLES = ROOT / "sample_aircraft"
PASSWORD = "a long test pass phrase"
ACCOUNTS = {"pia": ["pilot"], "pat": ["pilot"], "dan": ["dispatcher"], "mo": ["mechanic"]}

__all__ = ["ACCOUNTS", "PASSWORD", "SAMPLES", "csrf_of", "make_desk", "sign_in"]


def make_desk(tmp: Path) -> tuple[Path, Path, Path]:
    """A fleet folder (copy of the samples), a record log path and an accounts file with ACCOUNTS."""
    from argon2 import PasswordHasher

    from loadcheck.web.users import UserStore

    fleet = tmp / "fleet"
    shutil.copytree(SAMPLES, fleet)
    users = tmp / "users.json"
    store = UserStore(users, hasher=PasswordHasher(time_cost=1, memory_cost=1024, parallelism=1))  # quick to check in tests
    for name, roles in ACCOUNTS.items():
        store.add(name, PASSWORD, roles)
    return fleet, tmp / "records.sqlite3", users


def csrf_of(html: str) -> str:
    """The CSRF token of the first form of a page."""
    found = re.search(r'name="csrf" value="([^"]+)"', html)
    assert found, "the page has no CSRF field"
    return found.group(1)


def sign_in(client: Any, name: str, password: str = PASSWORD) -> Any:
    """Sign in through the sign-in form; return the response."""
    page = client.get("/signin")
    return client.post("/signin", data={"name": name, "password": password, "csrf": csrf_of(page.text)}, follow_redirects=False)
