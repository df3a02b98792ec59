"""Write the field reference of docs/file-format.md from the pydantic models, so it stays true.

Every field the aircraft and loading models accept gets a row: where it goes in the TOML file,
what it takes, its default, and its meaning (the model's own description, with its unit in
brackets) and rules (below, kept beside the field names they belong to; a rule for a field
that no longer exists is an error). The reference sits between two marker lines in
docs/file-format.md; the rest of the page is written by hand.

    python docs/file_format_reference.py          # rewrite the reference in docs/file-format.md
    python docs/file_format_reference.py --check  # exit 1 if it is out of date (tests/test_docs.py)
"""

from __future__ import annotations

import datetime as dt
import sys
import types
import typing
from pathlib import Path
from typing import Any

from pydantic import BaseModel
from pydantic_core import PydanticUndefined

__all__ = ["RULES", "reference", "rows", "updated"]

PAGE = Path(__file__).resolve().parent / "file-format.md"
START = "<!-- field reference: written by docs/file_format_reference.py from the models; do not edit by hand -->"
END = "<!-- end of field reference -->"

# Rules the descriptions do not carry, by field path (dotted, lists as their table name).
RULES: dict[str, str] = {
    "format": "must be 1",
    "registration": "with a letter or digit (a blank or `-` names no aircraft: leave the key out)",
    "units": "the units of every plain number in the file",
    "empty": "the current basic empty-weight record",
    "limits": "the weight limits",
    "mac": "optional: gives the CG in percent of MAC",
    "station": "one table per station",
    "station_group": "limits on the sum of several stations",
    "tank": "one table per fuel tank",
    "envelope": "at least one; one table per envelope",
    "history.previous": "the record that was replaced",
    "burn": "how the fuel is used",
    "empty.weight": "> 0",
    "empty.arm": "negative = forward of the datum",
    "empty.cg_range": "`[forward, aft]`",
    "limits.max_takeoff_weight": "> 0",
    "limits.max_ramp_weight": "at least the max takeoff weight",
    "limits.max_zero_fuel_weight": "at most the max takeoff weight (a higher one could never limit)",
    "limits.min_flight_weight": "below the max takeoff weight; checked at takeoff and landing",
    "mac.leading_edge_arm": "with `length`, gives the CG in percent of MAC",
    "mac.length": "> 0",
    "station.id": "letters, digits, `_ . -`; unique among stations and tanks",
    "station.label": "default: the id",
    "station.max_weight": ">= 0; at least `min_weight`",
    "station.min_weight": ">= 0",
    "station.seats": "> 0; not on a baggage, cargo or ballast station",
    "station.controls": "not on a baggage, cargo or ballast station",
    "station_group.id": "optional short name, used in findings and in the JSON `subject`",
    "station_group.stations": "ids of stations of this file",
    "station_group.max_weight": "at least one of `max_weight`, `min_weight`",
    "tank.id": "as for stations; not `together` (the burn order's word for every tank burned together)",
    "tank.arm": "required unless `arm_table` is given; not both",
    "tank.usable": "> 0",
    "tank.fuel": "default densities: avgas and mogas 6.0 lb/US gal, jet 6.7 lb/US gal (loadcheck/fuel.py)",
    "tank.density": "> 0; one of `fuel` and `density` is required; `density` wins",
    "tank.levels": "each 0 to `usable`; `full` is built in; a name is a word: one that reads as an amount "
    "(`12`, `5 l`), begins with a digit, a sign or a point (a loading reads such a text as an amount), or "
    "differs from another only in letter case is refused",
    "tank.arm_table": "`[[quantity, arm], ...]`, at least 2 points, quantities strictly increasing "
    "within 0 to `usable`; "
    "the end arm is held beyond the ends",
    "envelope.category": "the first category in the file is the default; envelopes sharing one must all hold; "
    "no spaces at its start or end, and one spelling (names differing only in letter case are refused)",
    "envelope.axes": "two different ones; one must be `weight`, unless the pair is `lateral_arm` and `arm`",
    "envelope.points": "at least 3 distinct corners enclosing an area, not crossing itself; the ring closes itself",
    "envelope.label": "its name in findings (`the longitudinal envelope`); without one, `the normal-category "
    "envelope`, naming its axes where its category has another envelope without a label",
    "envelope.moment_scale": "> 0, e.g. 1000; only on an envelope with a moment axis",
    "history": "written by `weigh --write` and `alter --write`; the old record is kept, never changed",
    "equipment": "items that `alter` may remove or relocate; `alter --write` keeps it current",
    "equipment.id": "unique",
    "load": "keys: station ids; >= 0; an unknown id is an error listing the known ones",
    "names": "keys: station ids; an unknown id is an error listing the known ones",
    "fuel": "keys: tank ids; at most the usable capacity; a tank not named is empty (a warning says so)",
    "burn.taxi": "taxi and trip together at most the fuel the burn order can use",
    "burn.trip": "or `trip_time` with `rate`",
    "burn.order": "a list of tank ids: each emptied before the next feeds",
    "burn.reserve": "a warning, not a limit",
    "category": "one of the aircraft's categories",
}


def _words(annotation: Any) -> str:
    """What a field takes, in words."""
    origin = typing.get_origin(annotation)
    args = [a for a in typing.get_args(annotation) if a is not type(None)]
    if origin is typing.Annotated:
        checks = [getattr(getattr(m, "func", None), "__qualname__", "") for m in annotation.__metadata__]
        if any("quantity" in name or "amount" in name for name in checks):
            return "number, or text with a unit"
        return _words(args[0])
    if origin in (typing.Union, types.UnionType):
        numbers = {float, int}
        plain = [a for a in args if typing.get_origin(a) is not typing.Annotated] + [
            typing.get_args(a)[0] for a in args if typing.get_origin(a) is typing.Annotated
        ]
        if set(plain) <= numbers | {str} and str in plain and numbers & set(plain):
            return "number or text"
        return " or ".join(dict.fromkeys(_words(a) for a in args))
    if origin is typing.Literal:
        return ", ".join(f"`{v}`" for v in typing.get_args(annotation))
    if origin is list:
        return f"list of {_words(args[0])}"
    if origin is tuple:
        inner = typing.get_args(annotation)
        if len(inner) == 2 and inner[1] is Ellipsis:
            return f"list of {_words(inner[0])}"
        if len(inner) == 2 and _words(inner[0]) == _words(inner[1]):
            return f"[x, y], each {_words(inner[0])}"
        return "[" + ", ".join(_words(a) for a in inner) + "]"
    if origin is dict:
        return f"table of {_words(args[1])}"
    if isinstance(annotation, type) and issubclass(annotation, BaseModel):
        return "table"
    return {
        float: "number",
        int: "whole number",
        str: "text",
        bool: "true or false",
        dt.date: "date",
        dt.datetime: "date and time",
        Any: "anything",
    }.get(annotation, getattr(annotation, "__name__", str(annotation)))


def _model(annotation: Any) -> tuple[type[BaseModel] | None, bool]:
    """The model a field holds, and whether it holds a list of them."""
    origin = typing.get_origin(annotation)
    for arg in (annotation, *typing.get_args(annotation)):
        if typing.get_origin(arg) is typing.Annotated:  # a model with a validator of its place
            arg = typing.get_args(arg)[0]
        if isinstance(arg, type) and issubclass(arg, BaseModel):
            return arg, origin is list
    return None, False


def rows(model: type[BaseModel], path: str = "", table: str = "", seen: tuple[type, ...] = ()) -> list[tuple[str, ...]]:
    """(path, TOML place, takes, default, meaning) for every field of ``model``, nested tables included."""
    out: list[tuple[str, ...]] = []
    for name, info in model.model_fields.items():
        key = info.alias or name
        dotted = f"{path}.{key}" if path else key
        inner, many = _model(info.annotation)
        place = f"`{table}` {key}" if table else f"`{key}`"
        if inner is not None and inner not in seen:
            base = f"{table.strip('[]')}.{key}" if table else key
            section = f"[[{base}]]" if many else f"[{base}]"
            # every table has a row of its own, so that its name is documented too
            out.append(
                (
                    dotted,
                    f"`{section}`",
                    "list of tables" if many else "table",
                    "required" if info.is_required() else "none",
                    _meaning(info.description, dotted),
                )
            )
            out += rows(inner, dotted, section, seen + (inner,))
            continue
        default = info.default if info.default_factory is None else info.default_factory()  # type: ignore[call-arg]
        if info.is_required():
            shown = "required"
        elif default is None or default is PydanticUndefined or default in ({}, []):
            shown = "none"
        else:
            shown = f"`{str(default).lower() if isinstance(default, bool) else default}`"
        kind = typing.Annotated[info.annotation, *info.metadata] if info.metadata else info.annotation
        out.append((dotted, place, _words(kind), shown, _meaning(info.description, dotted)))
    return out


def _meaning(description: str | None, dotted: str) -> str:
    parts = [p for p in (description, RULES.get(dotted)) if p]
    return "; ".join(parts).replace("|", "\\|")


def _table(title: str, model: type[BaseModel]) -> str:
    lines = [f"### {title}", "", "| field | takes | default | meaning and rules |", "|---|---|---|---|"]
    for _, place, takes, default, meaning in rows(model):
        lines.append(f"| {place} | {takes} | {default} | {meaning} |")
    return "\n".join(lines)


def reference() -> str:
    """The field reference, as Markdown, between its marker lines."""
    from loadcheck.aircraft import Aircraft
    from loadcheck.loading import Loading

    known = {r[0] for r in rows(Aircraft)} | {r[0] for r in rows(Loading)}
    stale = sorted(set(RULES) - known)
    if stale:
        raise SystemExit(f"rules for fields that no longer exist: {', '.join(stale)}")
    return "\n\n".join(
        [START, _table("Aircraft file: every field", Aircraft), _table("Loading file: every field", Loading), END]
    )


def updated(page: str) -> str:
    """The page with its reference replaced by the current one."""
    start, end = page.index(START), page.index(END) + len(END)
    return page[:start] + reference() + page[end:]


def main(argv: list[str]) -> int:
    page = PAGE.read_text(encoding="utf-8")
    new = updated(page)
    if "--check" in argv:
        if new != page:
            print(f"{PAGE} is out of date: run python docs/file_format_reference.py", file=sys.stderr)
            return 1
        return 0
    PAGE.write_text(new, encoding="utf-8")
    return 0


if __name__ == "__main__":
    sys.exit(main(sys.argv[1:]))
