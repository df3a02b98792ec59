"""The files loadcheck keeps for its user, and where each is by default.

Each file is where an environment variable says, else under a name of its own in the
user data folder (``platformdirs``' ``user_data_path``, e.g. ``~/.local/share/loadcheck``
on Linux). Light on purpose: a check that records nothing asks :func:`log_path` without
loading the check log's module (SQLite, the record types), so as not to pay for them at
start-up (benchmarks/startup.py).
"""

from __future__ import annotations

import os
from pathlib import Path

from .errors import InputError, Problem

__all__ = ["default_log_path", "default_users_path", "log_path", "user_file"]

_LOG_VARIABLE = "LOADCHECK_LOG"
_OLD_LOG_VARIABLE = "LOADCHECK_RECORDS"  # rename.py: keep (the variable's name before issue 21)


def user_file(variable: str, name: str, *, old_variable: str | None = None) -> Path:
    """The file ``$variable`` names, else ``name`` in the user data folder.

    Parameters
    ----------
    variable : the environment variable that names the file (an empty value counts as unset)
    name : the file's name in the user data folder
    old_variable : the variable's name in an earlier release, if it had another

    Raises
    ------
    InputError
        If ``old_variable`` is set, to another path than ``variable``: a path the user set
        is never silently passed over for another (fail closed).
    """
    explicit = os.environ.get(variable)
    old = os.environ.get(old_variable) if old_variable else None
    if old and old != explicit:
        raise InputError(
            Problem(
                f"${old_variable}",
                f"this variable is now named {variable}: rename it"
                + (" (both are set, to different files)" if explicit else ""),
                value=old,
                expected=f"{variable}=FILE",
            )
        )
    if explicit:
        return Path(explicit)
    from platformdirs import user_data_path

    return user_data_path("loadcheck", appauthor=False) / name


def default_log_path() -> Path:
    """Where the check log is by default: ``$LOADCHECK_LOG``, else ``records.sqlite3`` in the user data folder.

    Raises
    ------
    InputError
        If the variable's old name (``LOADCHECK_RECORDS``) is set, to another path.
    """
    return user_file(_LOG_VARIABLE, "records.sqlite3", old_variable=_OLD_LOG_VARIABLE)


def default_users_path() -> Path:
    """Where the desk's accounts are by default: ``$LOADCHECK_USERS``, else ``users.json`` in the user data folder."""
    return user_file("LOADCHECK_USERS", "users.json")


def log_path(to_log: bool, db: Path | None) -> Path | None:
    """The check log a command records in: None when it does not record (``to_log`` false).

    A ``db`` given while nothing is recorded is refused: a file the user named is never
    silently passed over (the command line's --db with --no-log, or without --log on check).

    Raises
    ------
    InputError
        ``db`` without logging; or the old variable, from :func:`default_log_path`.
    """
    if not to_log:
        if db is not None:
            raise InputError(
                Problem(
                    "--db",
                    "names the check log to record in, but nothing is recorded without "
                    "--log (it was --no-log, or check without --log)",
                    value=str(db),
                    expected="--log --db FILE, or no --db",
                )
            )
        return None
    return db or default_log_path()
