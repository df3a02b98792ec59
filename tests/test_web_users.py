"""The desk's accounts (loadcheck/web/users.py, issue 19): argon2 hashes only, the `users`
commands, a removed account signed out."""

from __future__ import annotations

import json
from pathlib import Path
from typing import Any

import pytest

pytest.importorskip("fastapi")
pytest.importorskip("argon2")

from loadcheck.cli import app

from .helpers import AppRunner
from .web_helpers import PASSWORD, _client


def test_passwords_are_stored_only_as_argon2_hashes(desk: dict[str, Any]) -> None:
    text = desk["users"].read_text()
    assert PASSWORD not in text
    hashes = [entry["hash"] for entry in json.loads(text)["users"].values()]
    assert len(hashes) == 4 and all(h.startswith("$argon2id$") for h in hashes)
    assert desk["users"].stat().st_mode & 0o077 == 0  # readable by its owner only


def test_users_commands(runner: AppRunner, tmp_path: Path) -> None:

    users = str(tmp_path / "users.json")
    run = runner.invoke
    assert (
        run(
            app,
            ["users", "add", "robin", "-r", "pilot", "-r", "mechanic", "--password-stdin", "--users", users],
            input="first pass phrase\n",
        ).exit_code
        == 0
    )
    listed = run(app, ["users", "list", "--users", users])
    assert listed.stdout == "robin\tpilot, mechanic\n"
    assert (
        run(
            app, ["users", "add", "robin", "-r", "pilot", "--password-stdin", "--users", users], input="x" * 12 + "\n"
        ).exit_code
        == 2
    )
    bad_role = run(
        app, ["users", "add", "sam", "-r", "captain", "--password-stdin", "--users", users], input="x" * 12 + "\n"
    )
    assert bad_role.exit_code == 2 and "captain" in bad_role.output
    short = run(app, ["users", "add", "sam", "-r", "pilot", "--password-stdin", "--users", users], input="short\n")
    assert short.exit_code == 2 and "at least" in short.output
    assert (
        run(
            app, ["users", "passwd", "robin", "--password-stdin", "--users", users], input="second pass phrase\n"
        ).exit_code
        == 0
    )
    from loadcheck.web.users import UserStore

    store = UserStore(users)
    made = json.loads(Path(users).read_text())["users"]["robin"]["hash"]
    assert made.startswith("$argon2id$v=19$m=65536,t=3,")  # RFC 9106 section 4, second recommended option
    assert (
        store.verify("robin", "first pass phrase") is None and store.verify("robin", "second pass phrase") is not None
    )
    assert run(app, ["users", "remove", "robin", "--users", users]).exit_code == 0
    assert run(app, ["users", "list", "--users", users]).stdout == ""
    assert run(app, ["users", "remove", "robin", "--users", users]).exit_code == 2


def test_a_removed_account_is_signed_out(desk: dict[str, Any]) -> None:
    from loadcheck.web.users import UserStore

    client = _client(desk, "pia")
    UserStore(desk["users"]).remove("pia")
    assert client.get("/fleet", follow_redirects=False).status_code == 303
