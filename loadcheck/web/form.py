"""The desk's posted forms: which fields a form may carry, and the refusal of any other.

A form the desk did not make (a crafted POST with field names of its own) is refused, never
read in part: a field the desk ignored would be a value the user gave and the check left out
(DESIGN.md, "Fail closed"). Every form may carry its security token and the button pressed.
"""

from __future__ import annotations

from collections import Counter
from collections.abc import Iterable, Mapping, Sequence

from fastapi import HTTPException

from ..errors import InputError, Problem

__all__ = ["FORM_FIELDS", "one_source", "refuse_query", "refuse_repeated", "refuse_unknown"]

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


def one_source(uploaded: bool, text: str, upload_field: str = "upload", text_field: str = "text") -> None:
    """Refuse a form that gives a file both as an upload and as typed text.

    A form that says "upload the file, or type it here" reads one of them; given both, reading
    either would drop the other (the readings a mechanic typed in, or the file chosen), so the
    form is refused and neither is read (DESIGN.md, "Fail closed"). Typed text that is only
    blanks is not a value given (a browser posts the empty box with every form).

    Parameters
    ----------
    uploaded : whether the form carries a chosen file in ``upload_field``
    text : the form's ``text_field`` as posted
    upload_field, text_field : the two fields' names, as the form posts them

    Raises
    ------
    InputError
        naming both fields, for a form that gives both; the page shows it as it shows a problem of
        the file, with what was typed kept.

    Examples
    --------
    >>> one_source(True, "")
    >>> one_source(False, "format = 1")
    >>> one_source(True, "format = 1")  # doctest: +ELLIPSIS
    Traceback (most recent call last):
    ...
    loadcheck.errors.InputError: upload, text: the form gives an uploaded file and typed text: give one; ...
    """
    if uploaded and text.strip():
        raise InputError(
            Problem(
                f"{upload_field}, {text_field}",
                "the form gives an uploaded file and typed text: give one; neither was read, nothing was written",
            )
        )


_FORM_TAIL = ": nothing was checked, recorded or changed; reload the page and use the desk's own form"


def _refuse(what: str, names: list[str], tail: str = _FORM_TAIL) -> None:
    """422 naming ``names`` in ``what`` (each cut to 40 characters, five at the most), then ``tail``."""
    named = ", ".join(repr(name[:_CUT]) for name in names[:_SHOWN])
    if len(names) > _SHOWN:
        named += f" and {len(names) - _SHOWN} more"
    raise HTTPException(422, what.format(named) + tail)
