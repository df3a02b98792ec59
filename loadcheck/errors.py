"""Exceptions raised by loadcheck.

Every error a user can cause is a :class:`LoadcheckError` (also a ``ValueError``).
Errors carry structured fields (file, dotted field path, value, what was expected) and
build their message from them, so the command line can print them without a traceback.
"""

from __future__ import annotations

from collections.abc import Iterable
from dataclasses import dataclass
from pathlib import Path
from typing import Any

__all__ = [
    "FileFormatError",
    "spelling_hint",
    "InputError",
    "LoadcheckError",
    "Problem",
    "UnitError",
    "UnknownNameError",
]


@dataclass(frozen=True)
class Problem:
    """One thing wrong with an input.

    Attributes
    ----------
    field : dotted path of the field, e.g. ``station[2].max_weight`` ("" for the whole file); a
        field of a trip's later leg is ``leg 2, burn.taxi`` (loadcheck.loading.leg_field), a
        value given on the command line is the option as typed, ``--load front=80``
    message : what is wrong, in plain words
    value : the offending value, if there is one
    expected : what would have been accepted, if that can be said briefly
    """

    field: str
    message: str
    value: Any = None
    expected: str | None = None

    def describe(self) -> str:
        """Return ``field: message (got value; expected ...)`` for display."""
        parts = [self.message]
        if self.value is not None:
            parts.append(f"got {self.value!r}")
        if self.expected:
            parts.append(f"expected {self.expected}")
        text = "; ".join(parts)
        return f"{self.field}: {text}" if self.field else text


class LoadcheckError(ValueError):
    """Base class of every error loadcheck raises for bad input."""

    def __init__(self, problems: list[Problem] | Problem | str, file: str | Path | None = None):
        if isinstance(problems, str):
            problems = [Problem("", problems)]
        elif isinstance(problems, Problem):
            problems = [problems]
        self.problems: list[Problem] = list(problems)
        self.file: str | None = str(file) if file is not None else None
        super().__init__(self._text())

    def with_file(self, file: str | Path) -> LoadcheckError:
        """Return the same error, attributed to ``file`` (keeps an existing attribution)."""
        if self.file is None:
            self.file = str(file)
            self.args = (self._text(),)
        return self

    def lines(self) -> list[str]:
        """One line per problem, each prefixed with the file name where known; a problem with
        a command-line value (its field is the option as typed, ``--load front=80``) is the
        command line's, never the file's."""
        prefix = f"{self.file}: " if self.file else ""
        return [("" if p.field.startswith("--") else prefix) + p.describe() for p in self.problems]

    def _text(self) -> str:
        return "\n".join(self.lines())


class InputError(LoadcheckError):
    """A value in an aircraft, loading or other input file cannot be used."""


class FileFormatError(LoadcheckError):
    """A file is missing, unreadable, too large, not UTF-8 or not valid TOML/CSV."""


class UnitError(LoadcheckError):
    """A unit is unknown or a quantity cannot be read or converted."""


class UnknownNameError(LoadcheckError):
    """A station, tank, category, fill level or registration that does not exist."""


def spelling_hint(word: str, choices: Iterable[str]) -> str:
    """`` (did you mean 'front'?)`` for a word close to one of ``choices``, else "".

    The closest of ``choices`` by :func:`difflib.get_close_matches` (similarity ratio at least 0.6).

    Examples
    --------
    >>> spelling_hint("max_takeof_weight", ["max_takeoff_weight", "max_landing_weight"])
    " (did you mean 'max_takeoff_weight'?)"
    >>> spelling_hint("zzz", ["front", "rear"])
    ''
    """
    import difflib

    close = difflib.get_close_matches(word, list(choices), n=1)
    return f" (did you mean {close[0]!r}?)" if close else ""
