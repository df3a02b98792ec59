"""The desk's commands (loadcheck/cli/desk.py): serve (the bind address and its caution). The
accounts' commands (users) are in tests/test_web_users.py, the desk itself in tests/test_web_*.py."""

from __future__ import annotations

from pathlib import Path
from typing import Any

import pytest

pytest.importorskip("fastapi")

from loadcheck.cli import app

from .helpers import AppRunner
from .web_helpers import SAMPLES


def test_serve_command_refuses_remote_and_prints_the_caution(
    runner: AppRunner, tmp_path: Path, monkeypatch: pytest.MonkeyPatch
) -> None:
    import uvicorn

    refused = runner.invoke(app, ["serve", str(SAMPLES), "--host", "0.0.0.0", "--users", str(tmp_path / "u.json")])
    assert refused.exit_code == 2 and "--allow-remote" in refused.output
    started: dict[str, Any] = {}
    monkeypatch.setattr(uvicorn, "run", lambda app, **kw: started.update(kw))
    allowed = runner.invoke(
        app,
        [
            "serve",
            str(SAMPLES),
            "--host",
            "0.0.0.0",
            "--allow-remote",
            "--users",
            str(tmp_path / "u.json"),
            "--db",
            str(tmp_path / "r.sqlite3"),
        ],
    )
    assert allowed.exit_code == 0 and "TLS" in allowed.output and started["host"] == "0.0.0.0"
    monkeypatch.setattr(uvicorn, "run", lambda app, **kw: started.update(kw))
    runner.invoke(app, ["serve", str(SAMPLES), "--users", str(tmp_path / "u.json")])
    assert started["host"] == "127.0.0.1"


def test_regression_a_missing_web_extra_stopped_with_an_internal_error(runner, tmp_path, monkeypatch):
    """A trial of the install: with ``pip install .`` alone, ``users add`` and ``serve`` stopped with
    "internal error (ModuleNotFoundError ...) Please report it". They now say what to install (exit 2)."""
    import importlib.metadata

    found = importlib.metadata.version

    def version(name: str) -> str:
        if name == "argon2-cffi":
            raise importlib.metadata.PackageNotFoundError(name)
        return found(name)

    monkeypatch.setattr(importlib.metadata, "version", version)
    for command in (
        ["users", "add", "robin", "--role", "pilot", "--password-stdin", "--users", str(tmp_path / "u")],
        ["serve", str(tmp_path), "--users", str(tmp_path / "u")],
    ):
        said = runner.invoke(app, command, input="a long pass phrase\n")
        assert said.exit_code == 2, said.output
        assert "the desk needs the web extra, and argon2-cffi is not installed" in said.output
        assert "internal error" not in said.output
    assert not (tmp_path / "u").exists()
