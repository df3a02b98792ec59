"""Fuzzing the file readers and the command line with hypothesis (bounded time in CI).

Random TOML documents built from the real field names and wild values, mutations of the
sample files, and random CSV shapes: whatever comes in, the command line answers with exit
0, 1 or 2 and never a traceback or an "internal error"; the library raises only
LoadcheckError (a ValueError) or pydantic's ValidationError for bad data. `pytest --long`
runs ten times as many examples (the hypothesis profile ``long``, tests/conftest.py); a
failure prints the example and a ``@reproduce_failure`` blob, and the example is kept in the
example database outside the repository, tried first by the next run.
"""

from __future__ import annotations

import copy
import json
import math

import tomlkit
from hypothesis import given, settings
from hypothesis import strategies as st

from loadcheck.cli import app

from .helpers import SAMPLES, examples, sample_data

FIELDS = [
    "format",
    "name",
    "registration",
    "units",
    "mass",
    "arm",
    "fuel_volume",
    "empty",
    "weight",
    "lateral_arm",
    "limits",
    "max_takeoff_weight",
    "max_ramp_weight",
    "station",
    "id",
    "kind",
    "max_weight",
    "min_weight",
    "tank",
    "usable",
    "fuel",
    "density",
    "levels",
    "arm_table",
    "envelope",
    "category",
    "axes",
    "points",
    "moment_scale",
    "mac",
    "length",
    "leading_edge_arm",
    "load",
    "burn",
    "taxi",
    "trip",
    "order",
    "reserve",
    "front",
    "mains",
    "station_group",
    "stations",
    "history",
    "equipment",
    "zero_fuel_cg",
    "trip_time",
    "rate",
    "aircraft",
    "point",
    "reading",
    "tare",
    "change",
    "action",
    "item",
    "new_arm",
]
WORDS = [
    "lb",
    "kg",
    "in",
    "mm",
    "usgal",
    "l",
    "avgas",
    "jet",
    "normal",
    "arm",
    "weight",
    "moment",
    "mac",
    "lateral_arm",
    "together",
    "full",
    "school",
    "20 kg",
    "3 usgal",
    "-1",
    "1e999",
    "nan",
    "2:15",
    "x" * 300,
    "",
]

scalars = st.one_of(
    st.integers(-(10**12), 10**12),
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


FUZZ = settings(max_examples=examples(40))


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
def test_random_aircraft_documents(runner, tmp_path_factory, data):
    text = _toml(data)
    if text is None:
        return
    path = tmp_path_factory.mktemp("fuzz") / "aircraft.toml"
    path.write_text(text)
    for args in (["check", str(path), "--load", "front=100"], ["validate", str(path)], ["show", str(path)]):
        _assert_clean(runner.invoke(app, args))


@FUZZ
@given(documents)
def test_random_loading_documents(runner, tmp_path_factory, data):
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
def test_mutated_sample_aircraft(runner, tmp_path_factory, name, draw):
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
    loading = sample_data(
        {
            "trainer4": "trainer4/within.toml",
            "tandem2": "tandem2/solo.toml",
            "twin6": "twin6/within.toml",
            "heli2": "heli2/dual.toml",
        }[name]
    )
    loading.pop("aircraft", None)
    (folder / "loading.toml").write_text(tomlkit.dumps(loading))
    for args in (
        ["check", str(path), str(folder / "loading.toml"), "--json"],
        ["extremes", str(path)],
        ["plan", "fuel", str(path), str(folder / "loading.toml")],
    ):
        result = runner.invoke(app, args)
        _assert_clean(result)
        if args[-1] == "--json" and result.exit_code in (0, 1):
            data_out = json.loads(result.stdout)
            assert all(math.isfinite(c["weight"]) for c in data_out["conditions"])


cells = st.one_of(
    st.sampled_from(
        [
            "",
            "170",
            "-5",
            "nan",
            "full",
            "school",
            "20 kg",
            "DEMO-4T",
            "DEMO-6P",
            "x",
            "1e309",
            "aux;mains",
            "together",
            "0",
        ]
    ),
    st.text(max_size=8),
)
headers = st.lists(
    st.sampled_from(
        [
            "registration",
            "reference",
            "pilot",
            "front",
            "rear",
            "hold",
            "hold [kg]",
            "mains",
            "aux",
            "wing",
            "row1",
            "nose",
            "taxi",
            "trip",
            "order",
            "trip_time",
            "rate",
            "category",
            "ballast",
            "nowhere",
            "front [parsec]",
        ]
    ),
    min_size=1,
    max_size=8,
    unique=True,
)


@FUZZ
@given(headers, st.lists(st.lists(cells, min_size=0, max_size=9), max_size=6))
def test_random_csv_shapes(runner, tmp_path_factory, header, rows):
    import csv
    import io

    buffer = io.StringIO()
    writer = csv.writer(buffer)
    writer.writerow(header)
    writer.writerows(rows)
    folder = tmp_path_factory.mktemp("fuzz")
    path = folder / "day.csv"
    path.write_text(buffer.getvalue())
    result = runner.invoke(app, ["fleet", "check", str(SAMPLES), str(path), "--no-log", "--json"])
    _assert_clean(result)


# -- issue 13: repeated command-line options; CSV headers built from the aircraft's own ids ------

OPTION_VALUES = [
    ("--load", "front=170"),
    ("--load", "front=190"),
    ("-l", "front=100"),
    ("--load", "rear=80"),
    ("--load", "hold=20 kg"),
    ("--fuel", "mains=10"),
    ("-f", "mains=full"),
    ("--taxi", "1"),
    ("--taxi", "2 lb"),
    ("--trip", "10"),
    ("--trip", "20 lb"),
    ("--reserve", "5"),
    ("--category", "normal"),
    ("-c", "utility"),
    ("--order", "together"),
    ("--trip-time", "1:00"),
    ("--rate", "9 gph"),
    ("--rate", "36 l/h"),
]
ALIASES = {"-l": "--load", "-f": "--fuel", "-c": "--category"}


@FUZZ
@given(st.lists(st.sampled_from(OPTION_VALUES), min_size=1, max_size=8))
def test_repeated_command_line_options(runner, options):
    args = ["check", str(SAMPLES / "trainer4" / "aircraft.toml"), "--json"]
    for option, value in options:
        args += [option, value]
    result = runner.invoke(app, args)
    _assert_clean(result)
    singles = [ALIASES.get(o, o) for o, _ in options if ALIASES.get(o, o) not in ("--load", "--fuel")]
    named = [(ALIASES.get(o, o), v.partition("=")[0]) for o, v in options if ALIASES.get(o, o) in ("--load", "--fuel")]
    if len(singles) != len(set(singles)) or len(named) != len(set(named)):
        assert result.exit_code == 2 and "twice" in result.output, result.output  # refused, never the last one kept
        return
    if result.exit_code in (0, 1):  # every value given is used as given
        weights = {item["id"]: item["weight"] for item in json.loads(result.stdout)["items"]}
        for option, value in options:
            if ALIASES.get(option, option) == "--load":
                station, _, amount = value.partition("=")
                expected = float(amount.split()[0]) / (0.45359237 if amount.endswith("kg") else 1.0)
                assert math.isclose(weights[station], expected, rel_tol=1e-12), (station, weights)


_FLEET_IDS = {
    reg: data
    for reg, data in (
        (d["registration"], d)
        for d in (sample_data(f"{n}/aircraft.toml") for n in ("trainer4", "tandem2", "twin6", "heli2"))
    )
}
RESERVED_HEADERS = ["reference", "pilot", "date", "taxi", "trip", "reserve", "label"]


@st.composite
def days_of_one_aircraft(draw):
    registration = draw(st.sampled_from(sorted(_FLEET_IDS)))
    data = _FLEET_IDS[registration]
    ids = [s["id"] for s in data["station"]] + [t["id"] for t in data.get("tank", [])]
    columns = draw(st.lists(st.sampled_from(ids + RESERVED_HEADERS), min_size=1, max_size=len(ids) + 3, unique=True))
    header = ["registration", *columns]
    draw(st.permutations(header))
    usable = {t["id"]: float(t["usable"]) for t in data.get("tank", [])}
    rows = []
    for _ in range(draw(st.integers(1, 4))):
        row = [registration]
        for column in columns:
            if column in usable:
                row.append(draw(st.sampled_from(["", "full", f"{usable[column] / 2:g}", "0"])))
            elif column in ("taxi", "trip", "reserve"):
                row.append(draw(st.sampled_from(["", "0", "1", "2 lb"])))
            elif column == "date":  # a calendar date, YYYY-MM-DD (another text is the row's own error)
                row.append(draw(st.sampled_from(["", "2026-12-01", "2024-02-29"])))
            elif column in ("reference", "pilot", "label"):
                row.append(draw(st.sampled_from(["", "R1", "A. Pilot", "2026-12-01"])))
            else:
                row.append(draw(st.sampled_from(["", "0", "55", "80.5", "20 kg"])))
        rows.append(row)
    return registration, header, rows


@FUZZ
@given(days_of_one_aircraft())
def test_csv_headers_built_from_the_aircrafts_own_ids(tmp_path_factory, day):
    # every station and tank column of a row reaches the check as given: the row's result is
    # the single check of the same values, and each station's weight is the cell's
    import csv
    import io

    from loadcheck import check_loading
    from loadcheck.checklog import results_match
    from loadcheck.fleet import check_flights, read_loadings
    from loadcheck.loading import Loading
    from loadcheck.units import read_amount

    registration, header, rows = day
    buffer = io.StringIO()
    writer = csv.writer(buffer)
    writer.writerow(header)
    writer.writerows(rows)
    path = tmp_path_factory.mktemp("fuzz") / "day.csv"
    path.write_text(buffer.getvalue())
    fleet = _fleet()
    aircraft = fleet.aircraft(registration)
    flights = list(check_flights(fleet, read_loadings(path, fleet)[0]))
    assert len(flights) == len(rows)
    for flight, row in zip(flights, rows, strict=True):
        cells = {name: value for name, value in zip(header, row, strict=True) if value}
        load = {k: v for k, v in cells.items() if k in aircraft.station_by_id}
        fuel = {k: v for k, v in cells.items() if k in aircraft.tank_by_id}
        burn = {k: v for k, v in cells.items() if k in ("taxi", "trip", "reserve")}
        extra = {"label": cells["label"]} if "label" in cells else {}
        try:
            single = check_loading(aircraft, Loading(load=load, fuel=fuel, burn=burn, **extra)).to_dict()
        except ValueError:
            assert flight.result is None, flight
            continue
        assert flight.result is not None, flight.problems
        assert results_match(flight.result, single)
        weights = {item["id"]: item["weight"] for item in flight.result["items"]}
        for station, text in load.items():
            value = read_amount(text, aircraft.units.mass)
            assert math.isclose(weights.get(station, 0.0), value, rel_tol=1e-9, abs_tol=1e-12), (station, weights)


_LOADED: list = []


def _fleet():
    from loadcheck.fleet import load_fleet

    if not _LOADED:
        _LOADED.append(load_fleet(SAMPLES))
    return _LOADED[0]
