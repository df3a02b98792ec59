"""Fuzzing the file readers and the command line with hypothesis (bounded time in CI).

Random TOML documents built from the real field names and wild values, mutations of the
sample files, and random CSV shapes: whatever comes in, the command line answers with exit
0, 1 or 2 and never a traceback or an "internal error"; the library raises only
LoadcheckError (a ValueError) or pydantic's ValidationError for bad data. `pytest --full`
runs ten times as many examples.
"""

from __future__ import annotations

import copy
import json
import math
import os

import tomlkit
from hypothesis import HealthCheck, given, settings
from hypothesis import strategies as st
from typer.testing import CliRunner

from loadcheck.cli import app

from .helpers import SAMPLES, sample_data

runner = CliRunner()
EXAMPLES = int(os.environ.get("FUZZ_EXAMPLES", "120"))
FIELDS = ["format", "name", "registration", "units", "mass", "arm", "fuel_volume", "empty", "weight", "lateral_arm",
          "limits", "max_takeoff_weight", "max_ramp_weight", "station", "id", "kind", "max_weight", "min_weight", "tank",
          "usable", "fuel", "density", "levels", "arm_table", "envelope", "category", "axes", "points", "moment_scale",
          "mac", "length", "leading_edge_arm", "load", "burn", "taxi", "trip", "order", "reserve", "front", "mains",
          "station_group", "stations", "history", "equipment", "zero_fuel_cg", "trip_time", "rate", "aircraft", "point",
          "reading", "tare", "change", "action", "item", "new_arm"]
WORDS = ["lb", "kg", "in", "mm", "usgal", "l", "avgas", "jet", "normal", "arm", "weight", "moment", "mac",
         "lateral_arm", "together", "full", "tabs", "20 kg", "3 usgal", "-1", "1e999", "nan", "2:15", "x" * 300, ""]

scalars = st.one_of(
    st.integers(-10**12, 10**12),
    st.floats(allow_nan=True, allow_infinity=True),
    st.sampled_from(WORDS),
    st.text(max_size=12),
    st.booleans(),
)
values = st.recursive(
    scalars,
    lambda children: st.one_of(
        st.lists(children, max_size=6),
        st.dictionaries(st.sampled_from(FIELDS), children, max_size=6),
    ),
    max_leaves=25,
)
documents = st.dictionaries(st.sampled_from(FIELDS), values, max_size=10)


FUZZ = settings(max_examples=EXAMPLES, deadline=None,
                suppress_health_check=[HealthCheck.too_slow, HealthCheck.data_too_large])


def _toml(data: dict) -> str | None:
    try:
        return tomlkit.dumps(data)
    except Exception:
        return None


def _assert_clean(result) -> None:
    assert result.exit_code in (0, 1, 2), (result.exit_code, result.output)
    assert "Traceback" not in result.output and "internal error" not in result.output, result.output


@FUZZ
@given(documents)
def test_random_aircraft_documents(tmp_path_factory, data):
    text = _toml(data)
    if text is None:
        return
    path = tmp_path_factory.mktemp("fuzz") / "aircraft.toml"
    path.write_text(text)
    for args in (["check", str(path), "--load", "front=100"], ["validate", str(path)], ["show", str(path)]):
        _assert_clean(runner.invoke(app, args))


@FUZZ
@given(documents)
def test_random_loading_documents(tmp_path_factory, data):
    text = _toml(data)
    if text is None:
        return
    path = tmp_path_factory.mktemp("fuzz") / "loading.toml"
    path.write_text(text)
    result = runner.invoke(app, ["check", str(SAMPLES / "twin6" / "aircraft.toml"), str(path), "--json"])
    _assert_clean(result)
    if result.exit_code in (0, 1):
        assert json.loads(result.stdout)["caution"]


def _paths(data, prefix=()):
    if isinstance(data, dict):
        for key, value in data.items():
            yield (*prefix, key)
            yield from _paths(value, (*prefix, key))
    elif isinstance(data, list):
        for index, value in enumerate(data):
            yield (*prefix, index)
            yield from _paths(value, (*prefix, index))


@FUZZ
@given(st.sampled_from(["trainer4", "tandem2", "twin6", "heli2"]), st.data())
def test_mutated_sample_aircraft(tmp_path_factory, name, draw):
    data = copy.deepcopy(sample_data(f"{name}/aircraft.toml"))
    paths = list(_paths(data))
    for _ in range(draw.draw(st.integers(1, 3))):
        where = draw.draw(st.sampled_from(paths))
        parent = data
        try:
            for key in where[:-1]:
                parent = parent[key]
            if draw.draw(st.booleans()):
                del parent[where[-1]]
            else:
                parent[where[-1]] = draw.draw(values)
        except (KeyError, IndexError, TypeError):
            continue
    text = _toml(data)
    if text is None:
        return
    folder = tmp_path_factory.mktemp("fuzz")
    path = folder / "aircraft.toml"
    path.write_text(text)
    loading = sample_data({"trainer4": "trainer4/within.toml", "tandem2": "tandem2/solo.toml",
                           "twin6": "twin6/within.toml", "heli2": "heli2/dual.toml"}[name])
    loading.pop("aircraft", None)
    (folder / "loading.toml").write_text(tomlkit.dumps(loading))
    for args in (["check", str(path), str(folder / "loading.toml"), "--json"], ["extremes", str(path)],
                 ["plan", "fuel", str(path), str(folder / "loading.toml")]):
        result = runner.invoke(app, args)
        _assert_clean(result)
        if args[-1] == "--json" and result.exit_code in (0, 1):
            data_out = json.loads(result.stdout)
            assert all(math.isfinite(c["weight"]) for c in data_out["conditions"])


cells = st.one_of(st.sampled_from(["", "170", "-5", "nan", "full", "tabs", "20 kg", "DEMO-4T", "DEMO-6P", "x", "1e309",
                                   "aux;mains", "together", "0"]), st.text(max_size=8))
headers = st.lists(st.sampled_from(["registration", "reference", "pilot", "front", "rear", "bag1", "bag2 [kg]",
                                    "mains", "aux", "wing", "row1", "nose", "taxi", "trip", "order", "trip_time", "rate",
                                    "category", "ballast", "nowhere", "front [parsec]"]), min_size=1, max_size=8, unique=True)


@FUZZ
@given(headers, st.lists(st.lists(cells, min_size=0, max_size=9), max_size=6))
def test_random_csv_shapes(tmp_path_factory, header, rows):
    import csv
    import io

    buffer = io.StringIO()
    writer = csv.writer(buffer)
    writer.writerow(header)
    writer.writerows(rows)
    folder = tmp_path_factory.mktemp("fuzz")
    path = folder / "day.csv"
    path.write_text(buffer.getvalue())
    result = runner.invoke(app, ["fleet", "check", str(SAMPLES), str(path), "--no-record", "--json"])
    _assert_clean(result)
