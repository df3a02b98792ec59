"""The base of every model read from a file: the boundary rules every field shares.

- Unknown keys are errors (a misspelt limit must not vanish).
- Models are frozen; infinities and NaN are refused.
- A TOML ``true``/``false`` where a number is expected is refused: pydantic would read
  ``true`` as 1.0, so ``arm = true`` would become an arm of 1 (fail closed: a value is used
  as given or refused, never guessed).
- A yes/no field takes only a TOML ``true`` or ``false`` (:data:`Flag`): pydantic would read
  ``1``, ``"yes"`` or ``"on"`` as true, a guess at what the user meant.
"""

from __future__ import annotations

import types
from typing import Annotated, Any, Literal, Self, Union, get_args, get_origin

from pydantic import (
    AfterValidator,
    BaseModel,
    ConfigDict,
    ModelWrapValidatorHandler,
    Strict,
    ValidationError,
    model_validator,
)
from pydantic_core import InitErrorDetails, PydanticCustomError

from .registration import registration_key

__all__ = ["AircraftKey", "FileModel", "Flag", "Registration"]

Flag = Annotated[bool, Strict()]
"""A yes/no field: ``true`` or ``false`` only, never a number or a text read as one."""


def _names_a_file(value: str) -> str:
    if not value.strip():
        raise ValueError("names no file: give the aircraft file (relative to this file), or leave the key out")
    return value


def _names_an_aircraft(value: str) -> str:
    if not registration_key(value):
        raise ValueError(
            f"{value!r} is not a registration: it has no letter or digit; give the registration, or leave the key out"
        )
    return value


Registration = Annotated[str, AfterValidator(_names_an_aircraft)]
"""A registration written in a file: with a letter or digit (``registration_key``). A blank one names
no aircraft, and was passed over as if none were given."""

AircraftKey = Annotated[str, AfterValidator(_names_a_file)]
"""The ``aircraft`` key of a loading, readings or changes file: a file's path, never blank (a blank
key names nothing, and would be passed over where an aircraft file is also given)."""


def _takes_number(annotation: Any) -> bool:
    """True where a field's type accepts a number but not a boolean (a ``Literal[1]`` included:
    pydantic would take ``true`` for 1 there too)."""
    if annotation is bool:
        return False
    if annotation in (int, float):
        return True
    origin = get_origin(annotation)
    if origin is Annotated:
        return _takes_number(get_args(annotation)[0])
    if origin is Literal:
        return any(type(a) in (int, float) for a in get_args(annotation))
    if origin in (Union, types.UnionType):
        options = get_args(annotation)
        return any(_takes_number(a) for a in options) and bool not in options
    return False


def _boolean_places(annotation: Any, value: Any, place: tuple[str | int, ...]) -> list[tuple[str | int, ...]]:
    """Where ``value`` (at ``place``) holds a boolean at a place ``annotation`` wants a number, as
    pydantic locates errors: ``("load", "front")``, ``("points", 0, 1)``. A table of another file
    model is left to that model's own check, which pydantic places (``burn``, ``station[2]``)."""
    if isinstance(value, bool):
        return [place] if _takes_number(annotation) else []
    origin = get_origin(annotation)
    if origin is Annotated:
        return _boolean_places(get_args(annotation)[0], value, place)
    if origin in (Union, types.UnionType):
        for option in get_args(annotation):
            if option is not type(None) and (found := _boolean_places(option, value, place)):
                return found
        return []
    if isinstance(value, (list, tuple)) and origin in (list, tuple):
        args = [a for a in get_args(annotation) if a is not Ellipsis]
        if not args:
            return []
        return [
            found
            for i, v in enumerate(value)
            for found in _boolean_places(args[i] if i < len(args) else args[-1], v, (*place, i))
        ]
    if isinstance(value, dict) and origin is dict:
        inner = get_args(annotation)[1] if len(get_args(annotation)) == 2 else Any
        return [found for k, v in value.items() for found in _boolean_places(inner, v, (*place, k))]
    return []


def _holds_boolean(value: Any) -> bool:
    """True where ``value`` holds a boolean anywhere (in a table or a list, at any depth): a
    quick look, with no field types, that lets most data skip :meth:`FileModel.boolean_places`.

    A plain table, list or tuple (what a TOML or CSV reader gives) is told by its exact type at
    once, a subclass of one by ``isinstance``; a value of any other type holds nothing to look into.
    """
    pending = [value]
    while pending:
        item = pending.pop()
        kind = type(item)
        if kind is dict:
            values: Any = item.values()
        elif kind is list or kind is tuple:
            values = item
        elif kind is bool:  # bool has no subclasses: its type is bool
            return True
        elif isinstance(item, dict):
            values = item.values()
        elif isinstance(item, (list, tuple)):
            values = item
        else:
            continue
        kinds = set(map(type, values))
        if bool in kinds:
            return True
        if not kinds <= _LEAVES:  # a table or a list inside (or any other value: looked into where it is one)
            pending += [inner for inner in values if type(inner) not in _LEAVES]
    return False


_LEAVES = frozenset({str, float, int, type(None)})
"""The usual values of a table, passed over at once by :func:`_holds_boolean`."""


class FileModel(BaseModel):
    """Common configuration of the models of aircraft, loading, readings and changes files."""

    model_config = ConfigDict(extra="forbid", frozen=True, allow_inf_nan=False)

    @model_validator(mode="wrap")
    @classmethod
    def _no_booleans_for_numbers(cls, data: Any, handler: ModelWrapValidatorHandler[Self]) -> Self:
        """Refuse a boolean where a number goes, beside every other problem of the table (one
        pass: the user sees them all at once, not one stage after another)."""
        if not (isinstance(data, dict) and _holds_boolean(data)):  # no true/false anywhere: none where a number goes
            return handler(data)
        bad = cls.boolean_places(data)
        if not bad:
            return handler(data)
        errors: list[InitErrorDetails] = [
            {"type": _BOOLEAN_FOR_NUMBER, "loc": place, "input": _at(data, place)} for place in bad
        ]
        try:
            handler(data)
        except ValidationError as refused:  # the table's other problems, as pydantic found them
            errors += [
                {
                    "type": PydanticCustomError(e["type"], e["msg"].replace("{", "{{").replace("}", "}}")),
                    "loc": e["loc"],
                    "input": e["input"],
                }
                for e in refused.errors(include_url=False)
                if e["loc"] not in bad  # a boolean's place: said once, in the words above
            ]
        raise ValidationError.from_exception_data(cls.__name__, errors)

    @classmethod
    def boolean_places(cls, data: dict[str, Any]) -> list[tuple[str | int, ...]]:
        """Every place of ``data`` (a table of this model) where a boolean stands for a number
        (``("format",)``, ``("load", "front")``)."""
        return [
            found
            for name, field in cls.model_fields.items()
            if (key := field.alias or name) in data
            for found in _boolean_places(field.annotation, data[key], (key,))
        ]


_BOOLEAN_FOR_NUMBER = PydanticCustomError("boolean_for_number", "expected a number, got true or false")


def _at(data: Any, place: tuple[str | int, ...]) -> Any:
    """The value of ``data`` at ``place`` (a path of keys and indexes)."""
    for key in place:
        data = data[key]
    return data
