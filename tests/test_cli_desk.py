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
