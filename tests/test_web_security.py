"""The desk's security rules (loadcheck/web/security.py, issue 19): the sign-in throttle, CSRF
tokens on every form, the body and upload limit, the loopback-only bind address."""

from __future__ import annotations

from typing import Any

import pytest

pytest.importorskip("fastapi")
pytest.importorskip("argon2")


from .web_helpers import PASSWORD, WITHIN, _client, _records, csrf_of, sign_in


def test_repeated_failed_sign_ins_are_slowed(desk: dict[str, Any]) -> None:
    client = _client(desk)
    for _ in range(5):
        assert sign_in(client, "pia", "not the password").status_code == 401
    refused = sign_in(client, "pia")  # the right password, too soon after five failures
    assert refused.status_code == 429 and "Too many failed sign-ins" in refused.text
    assert client.get("/fleet", follow_redirects=False).status_code == 303


def test_sign_in_form_needs_its_csrf_token(desk: dict[str, Any]) -> None:
    client = _client(desk)
    client.get("/signin")
    response = client.post("/signin", data={"name": "pia", "password": PASSWORD})
    assert response.status_code == 403


def test_every_form_is_csrf_protected(desk: dict[str, Any]) -> None:
    client = _client(desk, "pia")
    for path in (
        "/aircraft/DEMO-4T/check",
        "/aircraft/DEMO-4T/record",
        "/aircraft/DEMO-4T/sheet",
        "/aircraft/DEMO-4T/edit",
        "/signout",
    ):
        assert client.post(path, data=WITHIN).status_code == 403, path
        assert client.post(path, data={**WITHIN, "csrf": "forged"}).status_code == 403, path
    mechanic = _client(desk, "mo")
    assert mechanic.post("/mechanic/DEMO-4T/propose", data={"kind": "weighing", "text": ""}).status_code == 403
    assert mechanic.post("/mechanic/DEMO-4T/confirm", data={"token": "x", "confirm": "yes"}).status_code == 403
    dispatcher = _client(desk, "dan")
    assert dispatcher.post("/records/1/verify", data={}).status_code == 403
    assert _records(desk) == []


def test_request_bodies_and_uploads_are_size_limited(desk: dict[str, Any]) -> None:
    from loadcheck.web.security import MAX_BODY_BYTES

    mo = _client(desk, "mo")
    page = mo.get("/mechanic/DEMO-4T").text
    big = b"# " + b"x" * MAX_BODY_BYTES
    response = mo.post(
        "/mechanic/DEMO-4T/propose",
        data={"kind": "weighing", "csrf": csrf_of(page)},
        files={"upload": ("big.toml", big, "application/toml")},
    )
    assert response.status_code == 413
    pia = _client(desk, "pia")
    assert (
        pia.post(
            "/api/check", content=b"{" + b" " * MAX_BODY_BYTES + b"}", headers={"content-type": "application/json"}
        ).status_code
        == 413
    )
    assert _records(desk) == []


def test_server_refuses_a_non_loopback_address_without_the_option() -> None:
    from loadcheck.errors import InputError
    from loadcheck.web.security import REMOTE_CAUTION, bind_caution

    for host in ("127.0.0.1", "::1", "localhost", "127.0.0.2"):
        assert bind_caution(host, False) is None
    for host in ("0.0.0.0", "192.168.1.20", "::", "desk.example"):
        with pytest.raises(InputError, match="--allow-remote"):
            bind_caution(host, False)
        assert bind_caution(host, True) == REMOTE_CAUTION
    assert "TLS" in REMOTE_CAUTION and "trusted network" in REMOTE_CAUTION
