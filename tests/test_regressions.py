"""Regression tests, each named after what broke (most found by tests/test_fuzz.py)."""

from __future__ import annotations

import json

import pytest

from loadcheck.cli import app

from .helpers import app_runner, sample


def test_load_table_given_as_a_list_with_command_line_loads(runner, tmp_path):
    # fuzz: `load = []` in a loading file plus --load crashed while merging (AttributeError)
    path = tmp_path / "loading.toml"
    path.write_text("load = []\n")
    result = runner.invoke(app, ["check", str(sample("trainer4/aircraft.toml")), str(path), "--load", "front=100"])
    assert result.exit_code == 2 and "load" in result.output and "internal error" not in result.output


def test_trip_time_on_the_command_line_replaces_the_files_trip(runner):
    # a --trip-time/--rate laid over a loading file with `trip` was refused as "both given"
    result = runner.invoke(
        app, ["check", str(sample("trainer4/within.toml")), "--trip-time", "1:00", "--rate", "9", "--json"]
    )
    assert result.exit_code == 0, result.output
    landing = json.loads(result.stdout)["conditions"][2]
    assert landing["fuel"] == pytest.approx(30 - 1.2 - 9)  # the school fill, less taxi, less one hour at 9 gal/h
    back = runner.invoke(app, ["check", str(sample("tandem2/solo.toml")), "--trip", "10", "--json"])
    assert back.exit_code == 0, back.output


def test_a_new_empty_weight_carries_no_cached_fingerprint():
    # the mechanic's record built the weighed aircraft with model_copy, which copied the
    # cached fingerprint (and envelope shapes) of the old empty-weight record
    from loadcheck.extremes import extremes
    from loadcheck.files import load_aircraft

    before = load_aircraft(sample("trainer4/aircraft.toml"))
    old = before.fingerprint
    after = before.with_empty(before.empty.weight + 25.0, before.empty.arm + 0.5)
    assert after.fingerprint != old
    assert after.empty.weight == before.empty.weight + 25.0 and after.empty.date == before.empty.date
    assert before.with_empty(before.empty.weight, before.empty.arm).fingerprint == old
    assert extremes(after).to_dict() != extremes(before).to_dict()


# -- issue 13: fail closed at every input ------------------------------------------------------
# Each test checks the exit status, the file and field named, that no file was written or
# changed, and that no traceback shows.

import hashlib  # noqa: E402
import os  # noqa: E402
import shutil  # noqa: E402
import subprocess  # noqa: E402
import sys  # noqa: E402
from pathlib import Path  # noqa: E402

from .helpers import SAMPLES, sample_data  # noqa: E402

BAD = Path(__file__).parent / "bad_inputs"


def _digest(folder: Path) -> dict[str, str]:
    return {str(p): hashlib.sha256(p.read_bytes()).hexdigest() for p in sorted(folder.rglob("*")) if p.is_file()}


def _refused(args: list[str], *words: str, folder: Path | None = None) -> str:
    before = _digest(folder) if folder is not None else None
    samples = _digest(SAMPLES)
    result = app_runner().invoke(app, args)
    assert result.exit_code == 2, result.output
    assert "Traceback" not in result.output and "internal error" not in result.output, result.output
    for word in words:
        assert word in result.output, (word, result.output)
    if folder is not None:
        assert _digest(folder) == before
    assert _digest(SAMPLES) == samples
    return result.output


def test_station_and_tank_ids_that_are_csv_columns_lose_their_weights(tmp_path):
    # a station `pilot` and `date` and a tank `reserve` were read by fleet check as the row's
    # pilot, date and reserve: their weights vanished and an over-weight loading passed (exit 0)
    fleet = tmp_path / "fleet"
    fleet.mkdir()
    shutil.copy(BAD / "aircraft_reserved_ids.toml", fleet / "colliding.toml")
    day = tmp_path / "day.csv"
    day.write_text("registration,pilot,date,hold,reserve\nDEMO-4T,400,300,100,full\n")
    db = tmp_path / "records.sqlite3"
    _refused(["fleet", "check", str(fleet), str(day), "--log", "--db", str(db)], "DEMO-4T", "day.csv:2", folder=fleet)
    from loadcheck.checklog import CheckLog

    with CheckLog(db) as log:
        assert list(log.find()) == []  # nothing recorded
    listing = json.loads(_refused(["fleet", "list", str(fleet), "--json"], folder=fleet))
    (entry,) = listing["aircraft"]
    assert entry["file"].endswith("colliding.toml") and not entry["usable"]
    problems = " ".join(entry["problems"])
    assert "station[0].id: 'pilot' is a reserved name" in problems and "tank[0].id: 'reserve'" in problems
    _refused(
        ["check", str(fleet / "colliding.toml"), "--load", "pilot=170"], "colliding.toml", "station[1].id", folder=fleet
    )


def test_a_repeated_load_kept_only_the_last_value(tmp_path):
    # --load front=170 --load front=190 checked 190 lb: two people in one seat row lost one
    trainer = str(SAMPLES / "trainer4" / "aircraft.toml")
    db = tmp_path / "records.sqlite3"
    out = _refused(
        ["check", trainer, "--load", "front=170", "--load", "front=190", "--log", "--db", str(db)],
        "--load front",
        "'170'",
        "'190'",
        "given twice",
        folder=tmp_path,
    )
    assert "add the weights up" in out and not db.exists()
    _refused(
        ["check", trainer, "--load", "front=170", "--fuel", "mains=10", "-f", "mains=20"], "--fuel mains", "given twice"
    )
    _refused(["check", trainer, "--load", "front=170", "--taxi", "1", "--taxi=2"], "--taxi", "'1'", "'2'", "twice")
    _refused(
        ["plan", "fuel", trainer, "--load", "front=170", "--category", "normal", "-c", "utility"],
        "-c",
        "'normal'",
        "'utility'",
        "twice",
    )
    _refused(
        [
            "fleet",
            "check",
            str(SAMPLES),
            str(SAMPLES / "fleet_day.csv"),
            "--log",
            "--db",
            str(tmp_path / "a.db"),
            "--log",
            "--db",
            str(db),
        ],
        "--db",
        "twice",
        folder=tmp_path,
    )
    assert not db.exists() and not (tmp_path / "a.db").exists()


def test_a_category_with_only_lateral_envelopes_never_checked_the_fore_and_aft_cg(tmp_path):
    # utility had only a lateral envelope: a CG 1 in ahead of the normal forward limit passed
    from loadcheck.errors import InputError
    from loadcheck.files import parse_aircraft

    data = sample_data("heli2/aircraft.toml")
    data["envelope"] = [e for e in data["envelope"] if "lateral_arm" in e["axes"]]
    with pytest.raises(InputError, match=r"envelope\[0\].category: category .* has only lateral envelopes"):
        parse_aircraft(data, "heli.toml")


def _twin_two_densities(order: list[str] | str) -> tuple:
    from loadcheck.files import parse_aircraft

    data = sample_data("twin6/aircraft.toml")
    aux = next(t for t in data["tank"] if t["id"] == "aux")
    aux.pop("fuel")
    aux["density"] = 6.7  # jet-fuel density in the aux tank, avgas 6.0 lb/US gal in the mains
    return parse_aircraft(data, "twin.toml"), {"mains": "full", "aux": 40}, order


@pytest.mark.parametrize("order", [["aux", "mains"], ["mains", "aux"], "together"])
def test_a_trip_given_as_a_mass_burned_another_mass(order):
    # --trip "300 lb" over tanks of different densities was turned into a volume at the
    # average density on board: the aircraft burned 350 lb. A mass given is the mass burned.
    from loadcheck.check import check_loading
    from loadcheck.loading import Loading, resolve_loading

    aircraft, fuel, order = _twin_two_densities(order)
    loading = Loading(load={"row1": 380}, fuel=fuel, burn={"taxi": "20 lb", "trip": "300 lb", "order": order})
    resolved = resolve_loading(loading, aircraft)
    # hand arithmetic: mains 100 US gal at 6.0 (600 lb), aux 40 US gal at 6.7 (268 lb)
    expected_taxi = {"aux": 20 / 6.7, "mains": 20 / 6.0}.get(
        order[0] if isinstance(order, list) else "", 20 * 140 / 868
    )
    assert resolved.taxi == pytest.approx(expected_taxi, rel=1e-12)
    if order == ["aux", "mains"]:
        assert resolved.trip == pytest.approx((268 - 20) / 6.7 + (300 - 248) / 6.0, rel=1e-12)
    conditions = {c["condition"]: c for c in check_loading(aircraft, resolved).to_dict()["conditions"]}
    assert conditions["ramp"]["weight"] - conditions["takeoff"]["weight"] == pytest.approx(20.0, rel=1e-12)
    assert conditions["takeoff"]["weight"] - conditions["landing"]["weight"] == pytest.approx(300.0, rel=1e-12)


def test_a_rate_and_a_reserve_given_as_a_mass_are_the_mass_burned_and_left():
    from loadcheck.check import check_loading
    from loadcheck.loading import Loading, resolve_loading

    aircraft, fuel, order = _twin_two_densities(["aux", "mains"])
    for reserve, warned in (("568 lb", False), ("570 lb", True)):  # 868 lb on board less 300 lb burned = 568 lb left
        loading = Loading(
            load={"row1": 380},
            fuel=fuel,
            burn={"trip_time": "2:00", "rate": "150 lb/h", "order": order, "reserve": reserve},
        )
        result = check_loading(aircraft, resolve_loading(loading, aircraft)).to_dict()
        conditions = {c["condition"]: c for c in result["conditions"]}
        assert conditions["takeoff"]["weight"] - conditions["landing"]["weight"] == pytest.approx(300.0, rel=1e-12)
        assert any(f["code"] == "reserve" for f in result["findings"]) is warned, reserve


@pytest.mark.parametrize(
    "rate, per_hour",
    [
        ("36 l/h", 36 / 3.785411784),
        ("9.5 gph", 9.5),
        ("9.5 usgal/hr", 9.5),
        ("34.2 l per hour", 34.2 / 3.785411784),
        ("9", 9.0),
    ],
)
def test_rates_with_units_were_refused_with_an_example_that_is_a_mass(runner, rate, per_hour):
    # 1 US gal = 3.785411784 L exactly (NIST SP 811, 2008, appendix B.8); "gph" is US gallons
    # per hour (common practice in US usage)
    trainer = str(SAMPLES / "trainer4" / "aircraft.toml")
    result = runner.invoke(
        app,
        [
            "check",
            trainer,
            "--load",
            "front=170",
            "--fuel",
            "mains=full",
            "--trip-time",
            "1:00",
            "--rate",
            rate,
            "--json",
        ],
    )
    assert result.exit_code in (0, 1), result.output
    landing = json.loads(result.stdout)["conditions"][2]
    assert landing["fuel"] == pytest.approx(44 - per_hour, rel=1e-12)
    plan = runner.invoke(app, ["plan", "trip", str(SAMPLES / "trainer4" / "within.toml"), "--rate", rate, "--json"])
    assert plan.exit_code in (0, 1), plan.output


def test_a_rate_with_an_unknown_unit_names_the_rate_and_gives_rate_examples():
    trainer = str(SAMPLES / "trainer4" / "aircraft.toml")
    out = _refused(
        ["check", trainer, "--load", "front=170", "--trip-time", "1:00", "--rate", "9.5 gal/h"],
        "--rate '9.5 gal/h':",
        "unknown unit 'gal'",
        "'36 l/h'",
    )
    assert "'20 kg'" not in out


_RUN_EACH = """
import json, sys
from typer.testing import CliRunner
from loadcheck.cli import app
runner = CliRunner()
for args in json.loads(sys.argv[1]):
    result = runner.invoke(app, args)
    print(json.dumps([result.exit_code, result.output]), flush=True)
"""


def _run_each(argsets: list[list[str]], timeout: float = 60) -> list[tuple[int, str]]:
    """Exit code and output of each command, run one after the other in one child process
    that is killed after ``timeout`` seconds (a command that reads for ever fails the test)."""
    env = {**os.environ, "PYTHONPATH": str(Path(__file__).resolve().parent.parent)}
    done = subprocess.run(
        [sys.executable, "-c", _RUN_EACH, json.dumps(argsets)],
        capture_output=True,
        text=True,
        timeout=timeout,
        env=env,
        check=False,
    )
    assert done.returncode == 0, done.stderr
    return [tuple(json.loads(line)) for line in done.stdout.splitlines()]


@pytest.mark.skipif(not hasattr(os, "mkfifo") or not Path("/dev/zero").exists(), reason="needs POSIX special files")
def test_special_files_were_read_for_ever(tmp_path):
    # `check /dev/zero`, a loading naming /dev/zero and a FIFO read until MemoryError or for ever
    fifo = tmp_path / "pipe.toml"
    os.mkfifo(fifo)
    names = tmp_path / "names_zero.toml"
    names.write_text('format = 1\naircraft = "/dev/zero"\n[load]\nfront = 170\n')
    trainer = str(SAMPLES / "trainer4" / "aircraft.toml")
    before = _digest(tmp_path)
    cases = [
        (["check", "/dev/zero"], ["/dev/zero", "character device", "ordinary file"]),
        (["check", str(fifo)], ["pipe.toml", "FIFO"]),
        (["check", trainer, str(fifo)], ["pipe.toml", "FIFO"]),
        (["check", str(names)], ["names_zero.toml", "aircraft", "/dev/zero", "character device"]),
        (["fleet", "check", str(SAMPLES), str(fifo), "--no-log"], ["pipe.toml", "FIFO"]),
        (["fleet", "check", str(SAMPLES), "/dev/zero", "--no-log"], ["/dev/zero", "character device"]),
        (["validate", str(fifo), trainer], ["pipe.toml", "FIFO", "ok: "]),
    ]
    results = _run_each([args for args, _ in cases])
    assert len(results) == len(cases)
    for (_, words), (code, output) in zip(cases, results, strict=True):
        assert code == 2, output
        assert "Traceback" not in output and "internal error" not in output, output
        for word in words:
            assert word in output, (word, output)
    assert _digest(tmp_path) == before


def test_deeply_nested_toml_was_an_internal_error_and_stopped_validate(tmp_path):
    # 50,000 nested arrays: "internal error (RecursionError)" with no file name, and
    # `validate` did not go on to the next file
    deep = tmp_path / "deep.toml"
    deep.write_text("x = " + "[" * 50_000 + "]" * 50_000 + "\n")
    good = str(SAMPLES / "trainer4" / "aircraft.toml")
    out = _refused(["validate", str(deep), good], "deep.toml", "nested too deeply", "ok: ", folder=tmp_path)
    assert good in out
    _refused(["check", str(deep)], "deep.toml", "nested", folder=tmp_path)
    tables = tmp_path / "tables.toml"
    tables.write_text("x = " + "{a = " * 3000 + "1" + "}" * 3000 + "\n")
    _refused(["check", good, str(tables)], "tables.toml", "nested", folder=tmp_path)


def test_a_loading_for_another_registration_gave_no_findings(runner, tmp_path):
    # a loading for DEMO-6P checked against DEMO-4T's data: "No findings", exit 0
    loading = tmp_path / "for_the_twin.toml"
    loading.write_text('format = 1\nregistration = "DEMO-6P"\n[load]\nfront = 170\n')
    _refused(
        ["check", str(SAMPLES / "trainer4" / "aircraft.toml"), str(loading)],
        "for_the_twin.toml",
        "registration",
        "'DEMO-6P'",
        "'DEMO-4T'",
        folder=tmp_path,
    )
    same = tmp_path / "same.toml"
    same.write_text('format = 1\nregistration = "demo 4t"\n[load]\nfront = 170\n')  # the same, written loosely
    assert runner.invoke(app, ["check", str(SAMPLES / "trainer4" / "aircraft.toml"), str(same)]).exit_code == 0


def test_validate_reported_a_loadings_misspelt_keys_but_not_its_unknown_station_or_tank_over_capacity(tmp_path):
    folder = tmp_path / "trainer4"
    shutil.copytree(SAMPLES / "trainer4", folder)
    bad = folder / "bad.toml"
    bad.write_text(
        'format = 1\naircraft = "aircraft.toml"\nlabl = "x"\n[load]\nfrnt = 170\n[fuel]\nmains = 60\n[burn]\ntaxy = 1\n'
    )
    _refused(
        ["validate", str(bad), str(folder / "within.toml")],
        "bad.toml",
        "labl",
        "burn.taxy",
        "load.frnt: unknown station 'frnt'",
        "fuel.mains",
        "above the tank's usable capacity",
        "ok: ",
        folder=tmp_path,
    )
    (folder / "broken.toml").write_text(
        (folder / "aircraft.toml").read_text().replace("weight = 1718.0", "weight = -1")
    )
    bad.write_text('format = 1\naircraft = "broken.toml"\nlabl = "x"\n[load]\nfront = 170\n')
    _refused(
        ["validate", str(bad)], "bad.toml", "labl", "aircraft: names", "broken.toml", "empty.weight", folder=tmp_path
    )


def test_swapped_arguments_gave_ten_unrelated_errors(tmp_path):
    folder = SAMPLES / "trainer4"
    out = _refused(
        ["check", str(folder / "within.toml"), str(folder / "aircraft.toml")],
        "within.toml",
        "the aircraft file comes first",
        "swapped",
    )
    assert out.count("error:") == 1
    _refused(
        ["fleet", "check", str(SAMPLES / "fleet_day.csv"), str(SAMPLES), "--no-log"],
        "fleet_day.csv",
        "the fleet folder comes first",
    )


def test_fuel_level_starting_with_an_underscore_had_no_field_path():
    out = _refused(
        ["check", str(SAMPLES / "trainer4" / "aircraft.toml"), "--fuel", "mains=_school"],
        "--fuel mains=_school:",
        "unknown fill level '_school'",
        "full, school",
    )
    assert "command line:" not in out  # the option as typed, not a file named "command line"


def test_a_header_only_csv_said_zero_flights_and_exit_0(tmp_path):
    day = tmp_path / "day.csv"
    day.write_text("registration,reference,front,mains\n")
    db = tmp_path / "records.sqlite3"
    _refused(["fleet", "check", str(SAMPLES), str(day), "--log", "--db", str(db)], "day.csv", "nothing to check")
    empty = tmp_path / "day"
    empty.mkdir()
    _refused(["fleet", "check", str(SAMPLES), str(empty), "--no-log"], "holds no loading file", "nothing to check")


def test_a_semicolon_csv_said_it_had_no_registration_column(tmp_path):
    day = tmp_path / "day.csv"
    day.write_text("registration;front;mains\nDEMO-4T;170,5;30\n")
    _refused(
        ["fleet", "check", str(SAMPLES), str(day), "--no-log"],
        "day.csv",
        "separated by semicolons",
        "comma-separated",
        folder=tmp_path,
    )


def test_a_utf16_file_was_called_binary(tmp_path):
    path = tmp_path / "aircraft.toml"
    path.write_text((SAMPLES / "trainer4" / "aircraft.toml").read_text(), encoding="utf-16")
    out = _refused(["check", str(path), "--load", "front=170"], "aircraft.toml", "UTF-16", "UTF-8", folder=tmp_path)
    assert "binary" not in out
    path.write_bytes((SAMPLES / "trainer4" / "aircraft.toml").read_text().encode("utf-16-le"))  # no byte-order mark
    _refused(["validate", str(path)], "aircraft.toml", "UTF-16", folder=tmp_path)


def test_validate_shows_the_empty_weight_cg_range_and_flags_a_record_outside_it(runner, tmp_path):
    # issue 14 item 1: show and validate must show the range and flag a current record outside it
    import tomlkit

    from .helpers import sample_data

    data = sample_data("tandem2/aircraft.toml")
    lo, hi = data["empty"]["cg_range"]
    out = runner.invoke(app, ["validate", str(sample("tandem2/aircraft.toml"))])
    text = " ".join(out.output.split())
    assert out.exit_code == 0 and f"empty-weight CG range {lo:g} to {hi:g}" in text and "WARNING" not in text
    data["empty"]["arm"] = hi + 50.0
    path = tmp_path / "outside.toml"
    path.write_text(tomlkit.dumps(data))
    out = runner.invoke(app, ["validate", str(path)])
    text = " ".join(out.output.split())
    assert "WARNING" in text and "CG range" in text
    assert "1 tank," in text and "1 tanks" not in text
    shown = " ".join(runner.invoke(app, ["show", str(path)]).output.split())
    assert "Empty-weight CG range" in shown and "WARNING" in shown and "CG range" in shown


def test_planning_on_an_envelope_of_thousands_of_corners_stays_bounded_in_memory():
    # issue 13 item 11: plan fuel on an envelope of 10,000 corners took 5.7 GB (100,000
    # corners: MemoryError); the engine now works on chunks sized to the number of edges
    import math
    import tracemalloc

    from loadcheck import planning as P
    from loadcheck.loading import Loading, resolve_loading

    from .helpers import simple_aircraft

    n = 5000
    points = [
        [41.5 + 6.5 * math.cos(2 * math.pi * k / n), 1450 + 550 * math.sin(2 * math.pi * k / n)] for k in range(n)
    ]
    aircraft = simple_aircraft(envelope=[{"category": "normal", "axes": ["arm", "weight"], "points": points}])
    loading = resolve_loading(
        Loading(load={"front": 170, "rear": 150}, fuel={"main": 20}, burn={"taxi": 1, "trip": 10}), aircraft
    )
    tracemalloc.start()
    try:
        answer = P.most_fuel(aircraft, loading)
        peak = tracemalloc.get_traced_memory()[1]
    finally:
        tracemalloc.stop()
    assert answer.feasible and answer.check.ok
    assert peak < 200 * 2**20, f"peak {peak / 2**20:.0f} MiB"


def test_a_trip_time_of_the_wrong_type_is_a_field_error(runner, tmp_path):
    # found by the fuzz test of random loading documents: [burn] trip_time = [] ended in
    # "internal error (TypeError ...)" instead of an error naming the field
    path = tmp_path / "loading.toml"
    path.write_text("format = 1\n[load]\nfront = 170\n[burn]\ntrip_time = []\nrate = 9\n")
    result = runner.invoke(app, ["check", str(sample("trainer4/aircraft.toml")), str(path)])
    assert result.exit_code == 2 and "burn.trip_time" in result.output and "internal error" not in result.output


def test_plan_fuel_on_an_aircraft_with_no_tanks_says_so_without_a_numpy_warning(tmp_path):
    # issue 13 item 12: plan fuel on an aircraft with no tanks printed a numpy RuntimeWarning
    import warnings

    from loadcheck import planning as P
    from loadcheck.loading import Loading, resolve_loading

    from .helpers import simple_aircraft

    aircraft = simple_aircraft(tank=[])
    loading = resolve_loading(Loading(load={"front": 170}), aircraft)
    with warnings.catch_warnings():
        warnings.simplefilter("error")
        answer = P.most_fuel(aircraft, loading)
    assert not answer.feasible and "no fuel tanks" in (answer.governing or "")


@pytest.mark.parametrize("where", ["station_arm", "max_takeoff_weight", "envelope_point", "load"])
def test_true_where_a_number_belongs_is_refused(runner, tmp_path, where):
    # a TOML `true` was read as 1.0: `arm = true` gave a station at 1 in, and the file validated
    import tomlkit

    from .helpers import sample_data

    aircraft = sample_data("trainer4/aircraft.toml")
    loading = {"format": 1, "aircraft": "aircraft.toml", "load": {"front": 170}, "fuel": {"mains": 20}}
    if where == "station_arm":
        aircraft["station"][0]["arm"] = True
    elif where == "max_takeoff_weight":
        aircraft["limits"]["max_takeoff_weight"] = True
    elif where == "envelope_point":
        aircraft["envelope"][0]["points"][1][0] = True
    else:
        loading["load"]["front"] = True
    (tmp_path / "aircraft.toml").write_text(tomlkit.dumps(aircraft))
    (tmp_path / "loading.toml").write_text(tomlkit.dumps(loading))
    result = runner.invoke(app, ["check", str(tmp_path / "loading.toml")])
    assert result.exit_code == 2 and "expected a number" in result.output and "Traceback" not in result.output


def test_a_command_line_value_was_blamed_on_the_loading_files_field(runner):
    # `check within.toml --load middle=80` said "within.toml: load.middle: unknown station" and not the value
    within = str(sample("trainer4/within.toml"))
    result = runner.invoke(app, ["check", within, "--load", "middle=80"])
    assert result.exit_code == 2 and "Traceback" not in result.output
    assert "error: --load middle=80: unknown station 'middle'" in result.output
    assert "within.toml" not in result.output and "load.middle" not in result.output
    assert "error: --taxi -1: must not be negative" in runner.invoke(app, ["check", within, "--taxi", "-1"]).output
    timed = runner.invoke(app, ["check", within, "--trip-time", "1:00", "--rate", "9 gal/h"])
    assert timed.exit_code == 2 and "error: --rate '9 gal/h': cannot read '9 gal/h' as a fuel rate" in timed.output


def test_a_legs_problem_read_leg_0_beside_leg_2(runner, tmp_path):
    trip = tmp_path / "trip.toml"
    text = sample("heli2/trip_drop_off.toml").read_text().replace("trip = 12", "trip = 99")
    trip.write_text(text.replace('aircraft = "aircraft.toml"', f'aircraft = "{sample("heli2/aircraft.toml")}"'))
    result = runner.invoke(app, ["check", str(trip)])
    assert result.exit_code == 2 and f"{trip}: leg 2, burn: taxi and trip fuel (99.5 usgal) exceed" in result.output
    assert "leg[" not in result.output and "leg 2: " not in result.output
    option = runner.invoke(app, ["check", str(trip), "--leg-burn", "2:trip=98"])
    assert "error: --leg-burn 2:trip=98: taxi and trip fuel (98.5 usgal) exceed" in option.output


def test_leg_load_past_the_last_leg_silently_made_a_leg(runner):
    trip = str(sample("heli2/trip_drop_off.toml"))  # two legs
    result = runner.invoke(app, ["check", trip, "--leg-load", "3:left=0"])
    assert result.exit_code == 2 and "Traceback" not in result.output
    assert "error: --leg-load 3:left=0: the trip has 2 legs, so it has no leg 3" in result.output
    assert "--leg-burn 3:trip=AMOUNT" in result.output and "[[leg]] table" in result.output
    added = runner.invoke(app, ["check", trip, "--leg-load", "3:left=0", "--leg-burn", "3:trip=3", "--json"])
    assert added.exit_code in (0, 1) and len(json.loads(added.output)["legs"]) == 3  # with its burn, a leg 3


def test_trip_time_and_rate_replaced_the_files_trip_without_saying_so(runner):
    # within.toml gives trip = 18 (US gal); --trip-time 1:30 --rate 8 is 1.5 h x 8 US gal/h = 12 US gal
    # (trip fuel = flight time x burn rate, common practice), laid over the file's trip and said so
    within = str(sample("trainer4/within.toml"))
    result = runner.invoke(app, ["check", within, "--trip-time", "1:30", "--rate", "8", "--json"])
    conditions = {c["condition"]: c for c in json.loads(result.stdout)["conditions"]}
    assert conditions["takeoff"]["fuel"] - conditions["landing"]["fuel"] == pytest.approx(12.0)
    note = " ".join(result.stderr.split())
    assert "note: the trip fuel is --trip-time 1:30 x --rate 8 from the command line, 12 usgal" in note
    assert "it replaces the loading file's trip = 18" in note
    same = runner.invoke(app, ["check", within, "--trip", "12"])  # the same field given again: no note
    assert "trip fuel is" not in same.stderr
    trip = str(sample("heli2/trip_drop_off.toml"))
    leg = runner.invoke(app, ["check", trip, "--leg-burn", "2:trip_time=1:00", "--leg-burn", "2:rate=9"])
    assert "note: leg 2: the trip fuel is --leg-burn 2:trip_time=1:00 x --leg-burn 2:rate=9" in " ".join(
        leg.stderr.split()
    )


def test_plan_fuel_on_a_trip_refused_the_fuel_it_asks_for(runner):
    # `plan fuel trip.toml --fuel main=5` was refused: "taxi and trip fuel exceed the fuel the burn order
    # can use", although the fuel at the first engine start is what it asks for. It was then answered
    # with the typed fuel set aside without a word (trial 13); now the typed fuel is refused, naming
    # the option, for it would not be used (fail closed), and the loading file's own fuel is said to be
    # replaced by the answer's
    trip = str(sample("heli2/trip_drop_off.toml"))
    given = runner.invoke(app, ["plan", "fuel", trip, "--fuel", "main=5", "--json"])
    assert given.exit_code == 2, given.output
    assert "--fuel main=5: fuel given here would not be used: this answer chooses the fuel" in given.output
    as_file = runner.invoke(app, ["plan", "fuel", trip, "--json"])
    assert as_file.exit_code == 0 and json.loads(as_file.stdout)["answer"] > 0
    # a check of that fuel is refused, saying what to change
    refused = runner.invoke(app, ["check", trip, "--fuel", "main=5"])
    assert (
        refused.exit_code == 2 and "exceed the fuel the burn order can use; expected at most 5 usgal" in refused.output
    )
    assert "less taxi or trip fuel, more fuel in the tanks the burn order uses, or a burn order with more tanks" in (
        refused.output
    )


@pytest.mark.parametrize("command", [["plan", "fuel"], ["plan", "trip", "--rate", "10"]])
def test_regression_plan_fuel_and_plan_trip_set_typed_fuel_aside_without_a_word(runner, command):
    # trial 13: `plan trip ... --fuel main=tabs --fuel aux=20` answered the longest trip with 69.3 usgal
    # (the most fuel), the 60 usgal typed thrown away with no word; a pilot asking how long the fuel
    # on board lasts got 55 minutes too many. A value typed is used as given or refused (fail closed)
    aircraft = str(sample("trainer4/aircraft.toml"))
    typed = runner.invoke(app, [*command, aircraft, "--load", "front=170", "--fuel", "mains=20", "--fuel", "centre=3"])
    assert typed.exit_code == 2
    for option in ("--fuel mains=20", "--fuel centre=3"):
        assert f"{option}: fuel given here would not be used: this answer chooses the fuel at engine start" in (
            typed.output
        )
    # the loading file's fuel is replaced by the answer's, and the answer says so
    from_file = runner.invoke(app, [*command, aircraft, str(sample("trainer4/within.toml"))])
    assert from_file.exit_code in (0, 1), from_file.output
    assert "the loading file's fuel at engine start (mains school, centre 0.0) is not used" in " ".join(
        from_file.output.split()
    )


def test_a_fleet_trips_leg_problem_named_the_trips_first_row(runner, tmp_path):
    # with a leg's problem named "leg 2, burn" (not leg[0].burn) the fleet check blamed line 2 (leg 1's row)
    from .test_trip import trip_fleet

    folder = trip_fleet(tmp_path / "fleet")
    day = folder / "day.csv"
    day.write_text(
        "registration,reference,trip_id,leg,front,rear,main,taxi,trip\n"
        "TEST-T,F1,A,1,180,0,30,1,10\nTEST-T,F1,A,2,180,0,,1,99\n"
    )
    result = runner.invoke(app, ["fleet", "check", str(folder), str(day), "--no-log"])
    assert result.exit_code == 2 and f"{day}:3: leg 2, burn: taxi and trip fuel (100 usgal) exceed" in result.stderr


def test_regression_a_named_level_in_another_letter_case_was_refused_where_full_was_read(runner, tmp_path, desk):
    # trial 13 D5: `--fuel main=FULL` was read as full, `--fuel main=TABS` refused for the tank's level
    # 'tabs' (the fleet CSV too). One rule, the library's (loadcheck.units.level_key): a level name is
    # matched without regard to letter case, the built-in and the tank's own alike, on the command line,
    # in a CSV and at the desk. trainer4 (invented): mains usable 44 usgal, level school = 30 usgal
    from .web_helpers import _client

    aircraft = str(sample("trainer4/aircraft.toml"))
    fuel = {}
    for typed in ("school", "SCHOOL", "School", "full", "FULL"):
        result = runner.invoke(app, ["check", aircraft, "--load", "front=170", "--fuel", f"mains={typed}", "--json"])
        assert result.exit_code == 0, result.output
        fuel[typed] = json.loads(result.stdout)["conditions"][0]["fuel"]
    assert fuel["school"] == fuel["SCHOOL"] == fuel["School"] == 30.0 and fuel["full"] == fuel["FULL"] == 44.0
    refused = runner.invoke(app, ["check", aircraft, "--fuel", "mains=SCHOL"])
    assert refused.exit_code == 2 and "--fuel mains=SCHOL: unknown fill level 'SCHOL' for tank 'mains'" in (
        refused.output
    )
    day = tmp_path / "day.csv"
    day.write_text("registration,reference,front,mains\nDEMO-4T,R1,170,SCHOOL\nDEMO-4T,R2,170,school\n")
    checked = runner.invoke(app, ["fleet", "check", str(sample(".")), str(day), "--json", "--no-log"])
    lines = [json.loads(line) for line in checked.stdout.splitlines() if line.startswith("{")]
    assert checked.exit_code == 0, checked.output
    assert [line["conditions"][0]["fuel"] for line in lines] == [30.0, 30.0]
    client = _client(desk, "pia")
    answer = client.post(
        "/api/check", json={"registration": "DEMO-4T", "load": {"front": 170}, "fuel": {"mains": "SCHOOL"}}
    )
    assert answer.status_code == 200, answer.text
    assert answer.json()["conditions"][0]["fuel"] == 30.0


def test_regression_a_loadings_label_or_file_name_was_recorded_as_its_reference(runner, tmp_path):
    # trial 13 D6: `check --log` stored a loading's label as the record's reference where none was given,
    # and a fleet folder's loading file without a reference was recorded under its file name: guessed
    # values in a record a dispatcher searches by reference. The reference is what was given, or none
    # (the label is in the stored inputs; the file in the record's source)
    import sqlite3

    db = tmp_path / "records.sqlite3"
    loading = tmp_path / "evening.toml"
    loading.write_text(
        'label = "evening circuit"\n[load]\nfront = 170\n[fuel]\nmains = "school"\n[burn]\ntaxi = 1\ntrip = 10\n'
    )
    aircraft = str(sample("trainer4/aircraft.toml"))
    logged = runner.invoke(app, ["check", aircraft, str(loading), "--log", "--db", str(db)])
    assert logged.exit_code == 0, logged.output
    day = tmp_path / "day"
    day.mkdir()
    (day / "flight_b.toml").write_text('registration = "DEMO-4T"\n[load]\nfront = 170\n[fuel]\nmains = "school"\n')
    fleet = runner.invoke(app, ["fleet", "check", str(sample("trainer4")), str(day), "--db", str(db)])
    assert fleet.exit_code == 0, fleet.output
    with sqlite3.connect(db) as connection:
        rows = connection.execute("SELECT reference, source, inputs FROM checks ORDER BY id").fetchall()
    assert [reference for reference, _, _ in rows] == [None, None]
    assert "evening circuit" in rows[0][2] and rows[1][1].startswith(str(day / "flight_b.toml"))


def test_regression_plan_stop_set_the_typed_fuel_of_its_own_stop_aside(runner, tmp_path):
    # review 13: `plan stop --leg 2 --leg-fuel 2:main=3` gave the same answer as without the option, the
    # typed fuel for the stop asked about replaced without a word (the file's add_fuel too). The typed
    # fuel is refused, naming the option; the file's is said to be replaced; another stop's is used
    trip = str(sample("heli2/trip_drop_off.toml"))
    typed = runner.invoke(app, ["plan", "stop", trip, "--leg", "2", "--leg-fuel", "2:main=3"])
    assert typed.exit_code == 2
    assert "--leg-fuel 2:main=3: fuel given here would not be used: this answer chooses the fuel put in at" in (
        " ".join(typed.output.split())
    )
    from_file = runner.invoke(app, ["plan", "stop", trip, "--leg", "2"])
    assert from_file.exit_code in (0, 1), from_file.output
    assert "the loading file's fuel put in at the stop before leg 2 (main 5.0) is not used" in " ".join(
        from_file.output.split()
    )


def test_regression_plan_leave_set_a_typed_weight_at_its_station_aside(runner):
    # review 13: `plan leave --station hold --payload 30 --load hold=100` carried 30 lb at the hold, the
    # typed 100 lb dropped without a word (and on top or instead was not said). The typed weight is
    # refused, naming the option; the loading file's weight there is said to be replaced (fix-plan13)
    within = str(sample("trainer4/within.toml"))
    typed = runner.invoke(app, ["plan", "leave", within, "--station", "hold", "--payload", "30", "--load", "hold=100"])
    assert typed.exit_code == 2
    assert "--load hold=100: weight given here would not be used" in " ".join(typed.output.split())
    from_file = runner.invoke(app, ["plan", "leave", within, "--station", "hold", "--payload", "30"])
    assert from_file.exit_code in (0, 1) and "in place of the 33.1 lb in the loading there" in " ".join(
        from_file.output.split()
    )
