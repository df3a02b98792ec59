"""The desk's posted forms: which fields a form may carry, and the refusal of any other.

A form the desk did not make (a crafted POST with field names of its own) is refused, never
read in part: a field the desk ignored would be a value the user gave and the check left out
(DESIGN.md, "Fail closed"). Every form may carry its security token and the button pressed.
"""

from __future__ import annotations

from collections.abc import Iterable, Mapping

from fastapi import HTTPException

__all__ = ["FORM_FIELDS", "refuse_unknown"]

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
    if not unknown:
        return
    names = ", ".join(repr(name[:_CUT]) for name in unknown[:_SHOWN])
    if len(unknown) > _SHOWN:
        names += f" and {len(unknown) - _SHOWN} more"
    raise HTTPException(
        422,
        f"this form has no field {names}: nothing was checked, recorded or changed; "
        "reload the page and use the desk's own form",
    )
