"""The base of every model read from a file: the boundary rules every field shares.

- Unknown keys are errors (a misspelt limit must not vanish).
- Models are frozen; infinities and NaN are refused.
- A TOML ``true``/``false`` where a number is expected is refused: pydantic would read
  ``true`` as 1.0, so ``arm = true`` would become an arm of 1 (fail closed: a value is used
  as given or refused, never guessed).
"""

from __future__ import annotations

import types
from typing import Annotated, Any, Union, get_args, get_origin

from pydantic import BaseModel, ConfigDict, model_validator

__all__ = ["FileModel"]


def _takes_number(annotation: Any) -> bool:
    """True where a field's type accepts a number but not a boolean."""
    if annotation is bool:
        return False
    if annotation in (int, float):
        return True
    origin = get_origin(annotation)
    if origin is Annotated:
        return _takes_number(get_args(annotation)[0])
    if origin in (Union, types.UnionType):
        options = get_args(annotation)
        return any(_takes_number(a) for a in options) and bool not in options
    return False


def _booleans_in_numbers(annotation: Any, value: Any) -> bool:
    """True where ``value`` holds a boolean at a place ``annotation`` wants a number."""
    if isinstance(value, bool):
        return _takes_number(annotation)
    origin = get_origin(annotation)
    if origin is Annotated:
        return _booleans_in_numbers(get_args(annotation)[0], value)
    if origin in (Union, types.UnionType):
        return any(_booleans_in_numbers(a, value) for a in get_args(annotation) if a is not type(None))
    if isinstance(value, (list, tuple)) and origin in (list, tuple):
        args = [a for a in get_args(annotation) if a is not Ellipsis]
        if not args:
            return False
        return any(_booleans_in_numbers(args[i] if i < len(args) else args[-1], v) for i, v in enumerate(value))
    if isinstance(value, dict) and origin is dict:
        inner = get_args(annotation)[1] if len(get_args(annotation)) == 2 else Any
        return any(_booleans_in_numbers(inner, v) for v in value.values())
    return False


def _holds_boolean(value: Any) -> bool:
    """True where ``value`` holds a boolean anywhere (in a table or a list, at any depth): a
    quick look, with no field types, that lets most data skip :func:`_booleans_in_numbers`."""
    if value is True or value is False:
        return True
    pending = [value]
    while pending:
        item = pending.pop()
        values = item.values() if isinstance(item, dict) else item if isinstance(item, (list, tuple)) else ()
        kinds = set(map(type, values))  # bool has no subclasses: its type is bool
        if bool in kinds:
            return True
        if kinds - _LEAVES:  # a table or a list inside (or any other value: looked into where it is one)
            pending.extend(inner for inner in values if isinstance(inner, (dict, list, tuple)))
    return False


_LEAVES = frozenset({str, float, int, type(None)})
"""The usual values of a table, passed over at once by :func:`_holds_boolean`."""


class FileModel(BaseModel):
    """Common configuration of the models of aircraft, loading, readings and changes files."""

    model_config = ConfigDict(extra="forbid", frozen=True, allow_inf_nan=False)

    @model_validator(mode="before")
    @classmethod
    def _no_booleans_for_numbers(cls, data: Any) -> Any:
        if isinstance(data, dict) and _holds_boolean(data):  # no true/false anywhere: none where a number goes
            bad = [
                key
                for name, field in cls.model_fields.items()
                if (key := field.alias or name) in data and _booleans_in_numbers(field.annotation, data[key])
            ]
            if bad:
                raise ValueError(f"{', '.join(bad)}: expected a number, got true or false")
        return data
