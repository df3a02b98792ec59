"""Aircraft registrations as loadcheck compares them.

One rule for every place a registration typed by a user is matched with an aircraft's or a
record's: the fleet, the loading file's ``aircraft`` key and the check log's filter.
"""

from __future__ import annotations

from .errors import InputError, Problem

__all__ = ["registration_key", "required_key"]


def registration_key(registration: str) -> str:
    """A registration as it is compared: its letters and digits alone, in capitals (``g-abcd`` and
    ``G ABCD`` are ``GABCD``; common practice: the hyphen after a nationality mark is written or left
    out, as on the aircraft). A text with no letter or digit has an empty key and matches nothing
    (:func:`required_key` refuses it).

    Examples
    --------
    >>> registration_key("g-abcd") == registration_key("GABCD") == registration_key("G ABCD")
    True
    """
    return "".join(ch for ch in registration.upper() if ch.isalnum())


def required_key(registration: str, field: str = "registration") -> str:
    """The :func:`registration_key` of a registration a user typed to find an aircraft or its records.

    Raises
    ------
    InputError
        A text with no letter or digit (``-``, ``...``, blanks): it names no aircraft, and its
        empty key must never be matched with another text's.
    """
    key = registration_key(registration)
    if not key:
        raise InputError(Problem(field, f"{registration!r} is not a registration: it has no letter or digit"))
    return key
