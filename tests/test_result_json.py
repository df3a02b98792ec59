"""The JSON text a fleet check writes from a chunk's columns is the result's own JSON form, byte for byte.

``loadcheck.result_json.result_texts`` writes each result's text from the columns of numbers
(:class:`~loadcheck.results.ResultColumns`) instead of building the result's objects; the text
it gives must be ``orjson.dumps(result.to_dict())`` of the result the same columns hold, byte for
byte, and that result the one :func:`~loadcheck.check_loading` gives for the loading (numbers
within the records' relative tolerance, ``checklog.results_match``: margins cut for many rows
at once may differ in the last bits). No published source: this is the program agreeing with
itself, the single check being the one verified against the oracle (tests/test_oracle.py).
"""

from __future__ import annotations

import orjson
import pytest

from loadcheck import check_loading, load_aircraft
from loadcheck.check import check_columns
from loadcheck.checklog import results_match
from loadcheck.files import parse_aircraft
from loadcheck.result_json import result_texts

from .helpers import TRIAL_GULL, random_resolved_loadings, sample, simple_aircraft


def _aircraft(name: str):
    if name == "trial_gull":
        import tomllib

        return parse_aircraft(tomllib.loads(TRIAL_GULL), "trial_gull.toml")
    if name == "simple":
        return simple_aircraft()
    return load_aircraft(sample(f"{name}/aircraft.toml"))


def _texts(aircraft, loadings) -> list[bytes]:
    placed = check_columns(aircraft, loadings)
    written = {id(columns): result_texts(columns) for columns, _ in placed}
    texts = [written[id(columns)][k] for columns, k in placed]
    for (columns, k), text in zip(placed, texts, strict=True):
        assert text == orjson.dumps(columns.result(k).to_dict())
    return texts


@pytest.mark.parametrize(
    "name, order, reserve",
    [
        ("trainer4", None, None),
        ("trainer4", None, 15.0),  # landing below the reserve: a warning in some rows
        ("twin6", ("aux", "mains"), None),  # a burn order: paths that leave the envelope
        ("twin6", None, 40.0),
        ("tandem2", None, None),  # metric units, a seat with flight controls left empty in some rows
        ("heli2", None, None),  # lateral limits and a tank with an arm table
        ("trial_gull", None, None),  # a sloping aft limit and a minimum flight weight
        ("simple", None, None),
    ],
)
@pytest.mark.parametrize("count", [1, 2, 3, 160])  # up to two a call, the margins are cut one loading at a time
def test_texts_are_the_results_json_byte_for_byte(name, order, reserve, count):
    aircraft = _aircraft(name)
    loadings = random_resolved_loadings(aircraft, count * 3, seed=count, order=order, reserve=reserve)[:count]
    assert len(loadings) == count
    for resolved, text in zip(loadings, _texts(aircraft, loadings), strict=True):
        single = check_loading(aircraft, resolved, samples=False)
        assert results_match(orjson.loads(text), single.to_dict()), resolved


def test_the_texts_cover_every_kind_of_row():
    # the random rows above do reach findings, excursions of the burn path, warnings and both verdicts
    kinds: set[str] = set()
    for name, order in [("trainer4", None), ("twin6", ("aux", "mains")), ("heli2", None), ("tandem2", None)]:
        aircraft = _aircraft(name)
        for resolved in random_resolved_loadings(aircraft, 160, seed=160, order=order, reserve=15.0):
            result = check_loading(aircraft, resolved, samples=False)
            kinds.update(f.code for f in result.findings)
            kinds.add("ok" if result.ok else "not ok")
            if result.burn_path.excursions:
                kinds.add("excursion")
    assert {"ok", "not ok", "excursion", "envelope", "reserve", "no_pilot", "station_max"} <= kinds


def test_a_loading_with_nothing_at_a_station_leaves_its_line_out():
    # the moment table lists a station only where it holds a weight other than zero (and a tank
    # only where it holds fuel), in the text as in the result
    aircraft = _aircraft("trainer4")
    loadings = random_resolved_loadings(aircraft, 40, seed=3)
    texts = _texts(aircraft, loadings)
    for resolved, text in zip(loadings, texts, strict=True):
        ids = [item["id"] for item in orjson.loads(text)["items"]]
        loaded = [s.id for s in aircraft.station if resolved.stations.get(s.id, 0.0) != 0.0]
        assert ids[: 1 + len(loaded)] == ["empty", *loaded]
