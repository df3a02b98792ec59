"""The desk's accounts: a name, one or more roles (pilot, dispatcher, mechanic) and an argon2 hash.

Accounts live in one JSON file (``$LOADCHECK_USERS``, else ``users.json`` in the user data
folder), written atomically and readable by its owner only. Passwords are never stored,
only their argon2id hashes (RFC 9106, through argon2-cffi's defaults); checking a password
against an unknown name still spends the time of one hash, so a name cannot be guessed
from how fast a refusal comes.
"""

from __future__ import annotations

import json
import os
import re
import threading
from dataclasses import dataclass
from pathlib import Path
from typing import TYPE_CHECKING, Any, Literal, get_args

from ..errors import FileFormatError, InputError, Problem
from ..userdata import default_users_path  # the accounts file's default place, beside the check log's

if TYPE_CHECKING:
    from argon2 import PasswordHasher

__all__ = ["MIN_PASSWORD", "ROLES", "Account", "Role", "UserStore", "default_users_path"]

Role = Literal["pilot", "dispatcher", "mechanic"]
ROLES: tuple[str, ...] = get_args(Role)
MIN_PASSWORD = 10
"""Shortest password accepted [characters]."""

_NAME = re.compile(r"^[A-Za-z0-9][A-Za-z0-9._-]{0,39}$")
_LOCK = threading.Lock()


@dataclass(frozen=True)
class Account:
    """One person at the desk."""

    name: str
    roles: tuple[str, ...]

    def has(self, role: str) -> bool:
        """Whether the account holds ``role``."""
        return role in self.roles


def _hasher() -> PasswordHasher:
    from argon2 import PasswordHasher

    return PasswordHasher()


class UserStore:
    """The accounts file.

    Parameters
    ----------
    path : the JSON file (created on the first account added)
    hasher : an ``argon2.PasswordHasher`` making new hashes (default: argon2-cffi's, RFC 9106's
        second recommendation: argon2id, 64 MiB, 3 passes); a hash is always checked with the
        parameters it was made with
    """

    def __init__(self, path: str | Path, hasher: PasswordHasher | None = None):
        self.path = Path(path)
        self._dummy: str | None = None
        self._made_with = hasher

    def _read(self) -> dict[str, Any]:
        if not self.path.exists():
            return {}
        try:
            data = json.loads(self.path.read_text(encoding="utf-8"))
        except (OSError, ValueError) as error:
            raise FileFormatError(f"the accounts file cannot be read: {error}", file=self.path) from None
        users = data.get("users") if isinstance(data, dict) else None
        if not isinstance(users, dict):
            raise FileFormatError("the accounts file has no 'users' table", file=self.path)
        return users

    def _write(self, users: dict[str, Any]) -> None:
        from ..files import write_atomic

        self.path.parent.mkdir(parents=True, exist_ok=True)
        write_atomic(self.path, json.dumps({"format": 1, "users": users}, indent=2, sort_keys=True) + "\n")
        os.chmod(self.path, 0o600)

    @staticmethod
    def _roles(roles: list[str] | tuple[str, ...]) -> list[str]:
        unknown = [r for r in roles if r not in ROLES]
        if unknown or not roles:
            raise InputError(
                Problem(
                    "--role",
                    "unknown role" if unknown else "give at least one role",
                    value=", ".join(unknown) or None,
                    expected="one or more of " + ", ".join(ROLES),
                )
            )
        return sorted(set(roles), key=ROLES.index)

    @staticmethod
    def _password(password: str) -> None:
        if len(password) < MIN_PASSWORD:
            raise InputError(
                Problem(
                    "password",
                    f"too short ({len(password)} characters)",
                    expected=f"at least {MIN_PASSWORD} characters",
                )
            )

    def accounts(self) -> list[Account]:
        """Every account, by name."""
        return [Account(name, tuple(entry.get("roles", []))) for name, entry in sorted(self._read().items())]

    def get(self, name: str) -> Account | None:
        """The account of ``name``, or None."""
        entry = self._read().get(name)
        return None if entry is None else Account(name, tuple(entry.get("roles", [])))

    def add(self, name: str, password: str, roles: list[str] | tuple[str, ...]) -> Account:
        """Add an account (refused where the name is taken or not a plain name)."""
        if not _NAME.match(name):
            raise InputError(
                Problem(
                    "NAME",
                    "not a plain account name",
                    value=name,
                    expected="1 to 40 letters, digits, '.', '_' or '-', starting with a letter or digit",
                )
            )
        chosen = self._roles(roles)
        self._password(password)
        with _LOCK:
            users = self._read()
            if name in users:
                raise InputError(Problem("NAME", f"an account {name!r} exists already (passwd changes its password)"))
            users[name] = {"roles": chosen, "hash": (self._made_with or _hasher()).hash(password)}
            self._write(users)
        return Account(name, tuple(chosen))

    def remove(self, name: str) -> None:
        """Remove an account."""
        with _LOCK:
            users = self._read()
            if name not in users:
                raise InputError(Problem("NAME", f"no account {name!r}"))
            del users[name]
            self._write(users)

    def set_password(self, name: str, password: str) -> None:
        """Give an account a new password."""
        self._password(password)
        with _LOCK:
            users = self._read()
            if name not in users:
                raise InputError(Problem("NAME", f"no account {name!r}"))
            users[name]["hash"] = (self._made_with or _hasher()).hash(password)
            self._write(users)

    def verify(self, name: str, password: str) -> Account | None:
        """The account when ``password`` is its password, else None (same cost either way)."""
        from argon2.exceptions import InvalidHashError, VerificationError

        hasher = _hasher()
        entry = self._read().get(name)
        if entry is None:
            if self._dummy is None:
                self._dummy = hasher.hash("not a password of anyone")
            try:
                hasher.verify(self._dummy, password)
            except VerificationError:
                pass
            return None
        try:
            hasher.verify(entry["hash"], password)
        except (VerificationError, InvalidHashError):
            return None
        return Account(name, tuple(entry.get("roles", [])))
