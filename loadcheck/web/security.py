"""The desk's guards: sign-in throttling, CSRF tokens, the request-size limit, the bind address.

Nothing here touches weight and balance; these are the rules of issue 19's "Security"
list, each tested in tests/test_web.py.
"""

from __future__ import annotations

import hmac
import ipaddress
import secrets
import threading
import time
from collections.abc import MutableMapping

from starlette.types import ASGIApp, Message, Receive, Scope, Send

from ..errors import InputError, Problem

__all__ = ["MAX_BODY_BYTES", "REMOTE_CAUTION", "BodyLimit", "SignInThrottle", "bind_caution", "csrf_token", "csrf_ok"]

MAX_BODY_BYTES = 512 * 1024
"""Largest request body (form, upload or JSON) the desk reads [bytes]."""

REMOTE_CAUTION = (
    "caution: the desk listens beyond this machine. Put it behind TLS (a reverse proxy with a certificate) "
    "and on a trusted network only: passwords and records travel in the clear otherwise."
)


def bind_caution(host: str, allow_remote: bool) -> str | None:
    """Whether the desk may listen on ``host``: None for a loopback address, the caution to print
    for another one with ``allow_remote``.

    Raises
    ------
    InputError
        For a non-loopback address without ``allow_remote``.
    """
    loopback = host == "localhost"
    try:
        loopback = loopback or ipaddress.ip_address(host).is_loopback
    except ValueError:
        pass
    if loopback:
        return None
    if not allow_remote:
        raise InputError(
            Problem(
                "--host",
                "the desk listens on this machine only unless --allow-remote is given",
                value=host,
                expected="127.0.0.1, ::1 or localhost",
            )
        )
    return REMOTE_CAUTION


def csrf_token(session: MutableMapping[str, object]) -> str:
    """The session's CSRF token (made on first use)."""
    token = session.get("csrf")
    if not isinstance(token, str):
        token = secrets.token_urlsafe(32)
        session["csrf"] = token
    return token


def csrf_ok(session: MutableMapping[str, object], sent: object) -> bool:
    """Whether a form carried the session's CSRF token (compared in constant time)."""
    token = session.get("csrf")
    return isinstance(token, str) and isinstance(sent, str) and hmac.compare_digest(token.encode(), sent.encode())


class SignInThrottle:
    """Slows repeated failed sign-ins: after ``free`` failures of a name or from an address within
    ``window`` seconds, each further try waits ``base * 2**(n - free)`` seconds (at most ``ceiling``)
    after the last failure.
    """

    def __init__(self, free: int = 5, base: float = 2.0, ceiling: float = 300.0, window: float = 900.0):
        self.free, self.base, self.ceiling, self.window = free, base, ceiling, window
        self._failures: dict[str, list[float]] = {}
        self._lock = threading.Lock()

    def _recent(self, key: str, now: float) -> list[float]:
        times = [t for t in self._failures.get(key, []) if now - t < self.window]
        self._failures[key] = times
        return times

    def wait(self, keys: list[str], now: float | None = None) -> float:
        """Seconds to wait before a sign-in with these keys (name, address) is tried; 0 when none."""
        now = time.monotonic() if now is None else now
        longest = 0.0
        with self._lock:
            for key in keys:
                times = self._recent(key, now)
                if len(times) >= self.free:
                    delay = min(self.base * 2 ** (len(times) - self.free), self.ceiling)
                    longest = max(longest, times[-1] + delay - now)
        return max(longest, 0.0)

    def failed(self, keys: list[str], now: float | None = None) -> None:
        """Count a failed sign-in against each key."""
        now = time.monotonic() if now is None else now
        with self._lock:
            for key in keys:
                self._recent(key, now).append(now)

    def succeeded(self, name_key: str) -> None:
        """Forget a name's failures once it signed in."""
        with self._lock:
            self._failures.pop(name_key, None)


class BodyLimit:
    """ASGI middleware: a request body above ``limit`` bytes is answered 413 and never reaches a route."""

    def __init__(self, app: ASGIApp, limit: int = MAX_BODY_BYTES):
        self.app, self.limit = app, limit

    async def __call__(self, scope: Scope, receive: Receive, send: Send) -> None:
        if scope["type"] != "http":
            await self.app(scope, receive, send)
            return
        declared = dict(scope.get("headers") or []).get(b"content-length")
        if declared is not None and (not declared.isdigit() or int(declared) > self.limit):
            await self._refuse(send)
            return
        chunks, size, more = [], 0, True
        while more:
            message = await receive()
            if message["type"] != "http.request":
                break
            body = message.get("body", b"")
            size += len(body)
            if size > self.limit:
                await self._refuse(send)
                return
            chunks.append(body)
            more = message.get("more_body", False)
        whole = b"".join(chunks)
        sent = False

        async def replay() -> Message:
            nonlocal sent
            if not sent:
                sent = True
                return {"type": "http.request", "body": whole, "more_body": False}
            return await receive()

        await self.app(scope, replay, send)

    async def _refuse(self, send: Send) -> None:
        text = f"The request is too large: the desk reads at most {self.limit // 1024} KiB.".encode()
        await send(
            {
                "type": "http.response.start",
                "status": 413,
                "headers": [
                    (b"content-type", b"text/plain; charset=utf-8"),
                    (b"content-length", str(len(text)).encode()),
                ],
            }
        )
        await send({"type": "http.response.body", "body": text})
