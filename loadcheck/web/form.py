"""The desk's posted forms: which fields a form may carry, and the refusal of any other.

A form the desk did not make (a crafted POST with field names of its own) is refused, never
read in part: a field the desk ignored would be a value the user gave and the check left out
(DESIGN.md, "Fail closed"). Every form may carry its security token and the button pressed.
"""

from __future__ import annotations

from collections import Counter
from collections.abc import Iterable, Mapping, Sequence

from fastapi import HTTPException

__all__ = ["FORM_FIELDS", "refuse_query", "refuse_repeated", "refuse_unknown"]

FORM_FIELDS = ("csrf", "action")
"""Fields every form of the desk may post: its security token and the button pressed."""

_SHOWN = 5  # unknown fields named at the most
_CUT = 40  # characters of each name shown


def refuse_unknown(form: Mapping[str, object], fields: Iterable[str]) -> None:
    """Refuse a form with a field that is neither one of ``fields`` nor one of :data:`FORM_FIELDS`.

    Parameters
    ----------
    form : the posted form (starlette's ``FormData``, or a plain mapping of field names)
    fields : the form's own fields

    Raises
    ------
    HTTPException
        422, naming the unknown fields (each cut to 40 characters, five at the most) and saying
        that nothing was done.

    Examples
    --------
    >>> refuse_unknown({"csrf": "t", "name": "pia"}, ["name", "password"])
    >>> refuse_unknown({"csrf": "t", "nmae": "pia"}, ["name", "password"])  # doctest: +ELLIPSIS
    Traceback (most recent call last):
    ...
    fastapi.exceptions.HTTPException: 422: this form has no field 'nmae': nothing was checked, recorded or changed; ...
    """
    unknown = sorted(set(form.keys()) - set(fields) - set(FORM_FIELDS))
    if unknown:
        _refuse("this form has no field {}", unknown)


def refuse_repeated(items: Sequence[tuple[str, object]]) -> None:
    """Refuse a form that posts one field more than once.

    The desk's forms post each field once; a crafted form that posts ``load.front`` twice would
    otherwise be read with one of its values and the other left out (starlette keeps the last).

    Parameters
    ----------
    items : the posted fields in order, as ``(name, value)`` pairs (starlette's ``FormData.multi_items()``)

    Raises
    ------
    HTTPException
        422, naming the repeated fields (each cut to 40 characters, five at the most) and saying
        that nothing was done.

    Examples
    --------
    >>> refuse_repeated([("csrf", "t"), ("load.front", "170")])
    >>> refuse_repeated([("load.front", "170"), ("load.front", "10")])  # doctest: +ELLIPSIS
    Traceback (most recent call last):
    ...
    fastapi.exceptions.HTTPException: 422: this form gives the field 'load.front' more than once: nothing was ...
    """
    counts = Counter(name for name, _ in items)
    repeated = sorted(name for name, count in counts.items() if count > 1)
    if repeated:
        _refuse("this form gives the field {} more than once", repeated)


def refuse_query(items: Sequence[tuple[str, str]], parameters: Iterable[str]) -> None:
    """Refuse an address whose query gives a parameter that is not one of ``parameters``, or one more than once.

    A listing's filters each take one value: ``?verdict=within&verdict=out`` would otherwise be read
    with its last value (starlette keeps the last) and ``?colour=red`` listed as if it had no filter,
    a filter the user gave and the listing left out (DESIGN.md, "Fail closed").

    Parameters
    ----------
    items : the query's parameters in order, as ``(name, value)`` pairs (starlette's ``QueryParams.multi_items()``)
    parameters : the parameters the address takes

    Raises
    ------
    HTTPException
        422, naming the unknown parameters and the ones the address takes (or else the repeated
        ones; each name cut to 40 characters, five at the most), and saying that nothing was listed.

    Examples
    --------
    >>> refuse_query([("verdict", "out")], ["registration", "verdict", "date"])
    >>> refuse_query([("colour", "red")], ["registration", "verdict", "date"])  # doctest: +ELLIPSIS
    Traceback (most recent call last):
    ...
    fastapi.exceptions.HTTPException: 422: this address takes no parameter 'colour': nothing was listed; it takes ...
    """
    taken = list(parameters)
    unknown = sorted({name for name, _ in items} - set(taken))
    tail = ": nothing was listed; it takes " + ", ".join(taken)
    if unknown:
        _refuse("this address takes no parameter {}", unknown, tail)
    counts = Counter(name for name, _ in items)
    repeated = sorted(name for name, count in counts.items() if count > 1)
    if repeated:
        _refuse("this address gives the parameter {} more than once", repeated, ": nothing was listed; give each once")


_FORM_TAIL = ": nothing was checked, recorded or changed; reload the page and use the desk's own form"


def _refuse(what: str, names: list[str], tail: str = _FORM_TAIL) -> None:
    """422 naming ``names`` in ``what`` (each cut to 40 characters, five at the most), then ``tail``."""
    named = ", ".join(repr(name[:_CUT]) for name in names[:_SHOWN])
    if len(names) > _SHOWN:
        named += f" and {len(names) - _SHOWN} more"
    raise HTTPException(422, what.format(named) + tail)
