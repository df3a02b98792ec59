"""The JSON text of many check results, written straight from their columns (a fleet check's chunk).

A fleet check prints and records each flight's result as JSON. Building each result's objects
(:meth:`~loadcheck.results.ResultColumns.result`: about sixteen a flight), converting them to
dictionaries and writing those was most of a flight's cost (docs/performance.md). Here each
column of numbers is written once, by orjson, as a whole (:func:`_tokens`), and each result's
text is joined from those numbers and pieces of text fixed for the aircraft; only a flight's
findings and a burn path that leaves the envelope are written from their own objects.

The text is exactly the one ``orjson.dumps(columns.result(i).to_dict())`` gives: the same keys
in the same order, a field left out where it is None, each number as orjson writes it.
``tests/test_result_json.py`` holds the two equal, byte for byte, over the sample and invented
aircraft; the field lists below are checked against the result classes when this module is
imported, so that a field added to a result cannot be left out of its text unnoticed.
"""

from __future__ import annotations

from dataclasses import fields
from itertools import chain
from typing import Any

import orjson

from .results import BurnPath, CheckResult, Condition, ConditionColumns, Item, ItemColumns, Margins, ResultColumns

__all__ = ["result_texts"]

# the fields of each result class, in the order to_dict writes them; the writers below follow them
_FIELDS = {
    CheckResult: ["ok", "category", "aircraft", "items", "conditions", "burn_path", "findings", "units", "caution"],
    Item: ["id", "name", "kind", "weight", "arm", "moment", "lateral_arm", "lateral_moment", "fuel_volume"],
    Condition: [
        "condition",
        "weight",
        "arm",
        "moment",
        "lateral_arm",
        "lateral_moment",
        "mac_percent",
        "fuel",
        "fuel_weight",
        "max_weight",
        "ok",
        "margins",
    ],
    Margins: ["forward", "aft", "left", "right", "weight"],
}
for _cls, _names in _FIELDS.items():
    if [f.name for f in fields(_cls) if not f.metadata.get("drawing")] != _names:
        raise ImportError(f"loadcheck.result_json does not write the fields of {_cls.__name__} as they are now")

_BOOL = {True: b"true", False: b"false"}
_INSIDE = {ok: orjson.dumps(BurnPath(ok=ok).to_dict()) for ok in (True, False)}  # a path with no excursion


def _tokens(values: list[Any]) -> list[bytes]:
    """Each value of a column (numbers, None) as orjson writes it, in one call for the column."""
    return orjson.dumps(values)[1:-1].split(b",") if values else []


def _key(name: str) -> bytes:
    return orjson.dumps(name) + b":"


def result_texts(columns: ResultColumns) -> list[bytes]:
    """The JSON text of every result the columns hold, in order (see the module's notes)."""
    n = len(columns)
    dumps = orjson.dumps
    items = _item_texts(columns.items, n)
    conditions = [_condition_texts(condition, n) for condition in columns.conditions]
    by_condition = list(zip(*conditions, strict=True)) if conditions else [()] * n
    opening = b'{"ok":'
    middle = b"," + _key("category")
    aircraft = b"," + _key("aircraft") + dumps(columns.aircraft.to_dict()) + b"," + _key("items") + b"["
    after_items = b"]," + _key("conditions") + b"["
    after_conditions = b"]," + _key("burn_path")
    before_findings = b"," + _key("findings")
    closing = b"," + _key("units") + dumps(columns.units.to_dict()) + b"," + _key("caution") + dumps(columns.caution)
    closing += b"}"
    named: dict[str, bytes] = {}
    out = []
    for i in range(n):
        category = columns.category[i]
        category_text = named.get(category)
        if category_text is None:
            category_text = named[category] = dumps(category)
        path = columns.burn_path[i]
        path_text = _INSIDE[path.ok] if path.leaves_at is None and not path.excursions else dumps(path.to_dict())
        found = columns.findings[i]
        out.append(
            b"".join(
                (
                    opening,
                    _BOOL[columns.ok[i]],
                    middle,
                    category_text,
                    aircraft,
                    items[i],
                    after_items,
                    b",".join(by_condition[i]),
                    after_conditions,
                    path_text,
                    before_findings,
                    dumps([finding.to_dict() for finding in found]) if found else b"[]",
                    closing,
                )
            )
        )
    return out


def _item_texts(table: ItemColumns, n: int) -> list[bytes]:
    """Each loading's moment table as the text of its items, comma-separated (no brackets)."""
    dumps = orjson.dumps
    first = dumps(table.empty.to_dict())
    stations, tanks = len(table.stations), len(table.tanks)
    weights = _tokens(list(chain.from_iterable(table.weights)))
    moments = _tokens(list(chain.from_iterable(table.moments)))
    lateral = table.empty.lateral_arm is not None  # every line has a lateral arm where the aircraft limits it
    lateral_moments = _tokens(list(chain.from_iterable(table.lateral_moments))) if lateral else []
    # per station: the text before its weight, between weight and moment (its arm), and after the
    # moment (its lateral arm, before its lateral moment, where the aircraft has lateral limits)
    fixed = []
    for id_, name, kind, arm, lateral_arm in table.stations:
        head = dumps({"id": id_, "name": name, "kind": kind})[:-1] + b"," + _key("weight")
        between = b"," + _key("arm") + dumps(arm) + b"," + _key("moment")
        after = b"," + _key("lateral_arm") + dumps(lateral_arm) + b"," + _key("lateral_moment") if lateral else b""
        fixed.append((head, between, after))
    volumes = _tokens(list(chain.from_iterable(table.volumes)))
    fuel_weights = _tokens(list(chain.from_iterable(table.fuel_weights)))
    arms = _tokens(list(chain.from_iterable(table.arms)))
    fuel_moments = _tokens(list(chain.from_iterable(table.fuel_moments)))
    fuel_laterals = _tokens(list(chain.from_iterable(table.fuel_lateral_moments))) if lateral else []
    tank_fixed = []
    for id_, name, lateral_arm in table.tanks:
        head = dumps({"id": id_, "name": name, "kind": "fuel"})[:-1] + b"," + _key("weight")
        lateral_text = b""
        if lateral:
            lateral_text = b"," + _key("lateral_arm") + dumps(lateral_arm) + b"," + _key("lateral_moment")
        tank_fixed.append((head, lateral_text))
    arm_key, moment_key, volume_key = b"," + _key("arm"), b"," + _key("moment"), b"," + _key("fuel_volume")
    out = []
    for i in range(n):
        parts = [first]
        at = i * stations
        for j, weight in enumerate(table.weights[i]):
            if weight != 0.0:
                head, between, after = fixed[j]
                k = at + j
                if lateral:
                    parts.append(head + weights[k] + between + moments[k] + after + lateral_moments[k] + b"}")
                else:
                    parts.append(head + weights[k] + between + moments[k] + b"}")
        at = i * tanks
        for j, volume in enumerate(table.volumes[i]):
            if volume > 0:
                head, lateral_text = tank_fixed[j]
                k = at + j
                text = head + fuel_weights[k] + arm_key + arms[k] + moment_key + fuel_moments[k]
                if lateral:
                    text += lateral_text + fuel_laterals[k]
                parts.append(text + volume_key + volumes[k] + b"}")
        out.append(b",".join(parts))
    return out


def _condition_texts(condition: ConditionColumns, n: int) -> list[bytes]:
    """One condition of each loading as its JSON object's text."""
    dumps = orjson.dumps
    # the object's text with a place (%b) for each number, the verdict and the margins; a field
    # the aircraft leaves out (None: no lateral limits, no MAC, no weight limit) has no place
    head = b"{" + _key("condition") + dumps(condition.condition).replace(b"%", b"%%")
    template = [head]
    columns: list[list[bytes]] = []
    for name in ("weight", "arm", "moment", "lateral_arm", "lateral_moment", "mac_percent", "fuel", "fuel_weight"):
        values = getattr(condition, name)
        if values is not None:
            # a column is given whole or not at all (the aircraft's lateral limits, its MAC): a None in
            # one would be written null where the result leaves the field out, so it is refused here
            if None in values:
                raise ValueError(f"a {name} column of the results holds None; the text cannot leave it out")
            template.append(b"," + _key(name) + b"%b")
            columns.append(_tokens(values))
    if condition.max_weight is not None:
        template.append(b"," + _key("max_weight") + dumps(condition.max_weight))
    template.append(b"," + _key("ok") + b"%b," + _key("margins") + b"{%b}}")
    columns.append([_BOOL[ok] for ok in condition.ok])
    columns.append(_margin_texts(condition.margins, n))
    text = b"".join(template)
    return [text % numbers for numbers in zip(*columns, strict=True)]


def _margin_texts(margins: dict[str, list[float | None]], n: int) -> list[bytes]:
    """Each loading's margins as the text inside their JSON object's braces (a margin None left out)."""
    kept = [(_key(key), margins[key]) for key in _FIELDS[Margins] if any(v is not None for v in margins[key])]
    if not kept:
        return [b""] * n
    tokens = [_tokens(values) for _, values in kept]
    if all(None not in values for _, values in kept):  # every loading has every one of them
        template = b",".join(key + b"%b" for key, _ in kept)
        return [template % numbers for numbers in zip(*tokens, strict=True)]
    pairs = list(zip(kept, tokens, strict=True))
    return [b",".join([key + column[i] for (key, values), column in pairs if values[i] is not None]) for i in range(n)]
