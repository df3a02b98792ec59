"""Reading and writing files (loadcheck/files.py): the atomic write's own rules.

What every command that writes keeps whole through a crash, a full disk, a symlink or a FIFO
is the cross-cutting suite tests/test_writes.py; here ``write_atomic`` alone (common practice:
the replace-by-rename write, a new file created with the process umask, an existing file's
permissions kept).
"""

from __future__ import annotations

from pathlib import Path

import pytest

import loadcheck.files as files_module
from loadcheck.errors import FileFormatError

from .helpers import assert_input_error, invoke, sample


def test_write_atomic_refuses_a_folder(tmp_path):
    with pytest.raises(FileFormatError, match="is a folder"):
        files_module.write_atomic(tmp_path, "x")


@pytest.mark.parametrize("umask, mode", [(0o022, 0o644), (0o077, 0o600), (0o002, 0o664)])
def test_new_files_follow_the_umask(tmp_path, umask, mode):
    import os

    old = os.umask(umask)
    try:
        files_module.write_atomic(tmp_path / "new.html", "x")
    finally:
        os.umask(old)
    assert (tmp_path / "new.html").stat().st_mode & 0o777 == mode


def test_an_existing_file_keeps_its_permissions(tmp_path):
    import os

    path = tmp_path / "kept.csv"
    path.write_text("old")
    os.chmod(path, 0o640)
    files_module.write_atomic(path, "new")
    assert path.stat().st_mode & 0o777 == 0o640 and path.read_text() == "new"


# A value given on the command line is named by the option as typed, which shows the value
# (docs/file-format.md, "Values given on the command line"); a library caller without
# command_line (the desk's forms) keeps the loading's own field paths.
TRAINER_WITHIN = str(sample("trainer4/within.toml"))
HELI_TRIP = str(sample("heli2/trip_drop_off.toml"))


def _command_line_problem(path: str, **overrides) -> list[str]:
    from loadcheck.errors import LoadcheckError

    with pytest.raises(LoadcheckError) as caught:
        files_module.load_check_inputs(path, None, allow_trip=True, command_line=True, **overrides)
    return caught.value.lines()


@pytest.mark.parametrize(
    "path, overrides, line",
    [
        (TRAINER_WITHIN, {"load": {"middle": "80"}}, "--load middle=80: unknown station 'middle'"),
        (TRAINER_WITHIN, {"load": {"hold": "20 kgx"}}, "--load 'hold=20 kgx': unknown unit"),
        (TRAINER_WITHIN, {"fuel": {"mains": "99"}}, "--fuel mains=99: 99 usgal is above the tank's usable capacity"),
        (TRAINER_WITHIN, {"burn": {"taxi": "-1"}}, "--taxi -1: must not be negative"),
        (TRAINER_WITHIN, {"burn": {"trip": "99"}}, "--trip 99: taxi and trip fuel (100.2 usgal) exceed"),
        (TRAINER_WITHIN, {"burn": {"trip_time": "2:00"}}, "--trip-time 2:00: a trip time needs a fuel rate"),
        (TRAINER_WITHIN, {"burn": {"trip_time": "1:00", "rate": "9 gal/h"}}, "--rate '9 gal/h': cannot read"),
        (TRAINER_WITHIN, {"burn": {"reserve": "x"}}, "--reserve x: cannot read 'x'"),
        (TRAINER_WITHIN, {"burn": {"order": ["aux", "mains"]}}, "--order aux,mains: unknown tank(s) 'aux'"),
        (TRAINER_WITHIN, {"category": "aerobatic"}, "--category aerobatic: unknown category 'aerobatic'"),
        (HELI_TRIP, {"legs": {2: {"load": {"nope": "3"}}}}, "--leg-load 2:nope=3: unknown station 'nope'"),
        (HELI_TRIP, {"legs": {2: {"add_fuel": {"main": "99"}}}}, "--leg-fuel 2:main=99: 20.5 usgal on board"),
        (HELI_TRIP, {"legs": {2: {"burn": {"trip": "99"}}}}, "--leg-burn 2:trip=99: taxi and trip fuel (99.5 usgal)"),
    ],
)
def test_a_command_line_value_is_named_by_the_option_as_typed(path, overrides, line):
    lines = _command_line_problem(path, **overrides)
    assert lines[0].startswith(line), lines
    assert not any(path in text or "load.middle" in text for text in lines), lines  # not the file's field


def test_without_command_line_a_value_keeps_its_field_path():
    from loadcheck.errors import UnknownNameError

    with pytest.raises(UnknownNameError) as caught:
        files_module.load_check_inputs(TRAINER_WITHIN, None, load={"middle": "80"})
    assert caught.value.problems[0].field == "load.middle" and caught.value.problems[0].value is None
    assert caught.value.lines()[0].startswith(f"{TRAINER_WITHIN}: load.middle: unknown station 'middle'")


def test_a_files_own_value_stays_the_files_beside_a_command_line_one(tmp_path):
    loading = tmp_path / "loading.toml"
    loading.write_text(
        f'format = 1\naircraft = "{Path(TRAINER_WITHIN).resolve().parent}/aircraft.toml"\n[load]\nfrnt = 3\n'
    )
    lines = _command_line_problem(str(loading), load={"middle": "80"})
    assert f"{loading}: load.frnt: unknown station 'frnt' (did you mean 'front'?)" in lines[0] + lines[1]
    assert any(line.startswith("--load middle=80: unknown station") for line in lines), lines


def test_unknown_keys_name_the_closest_allowed_key():
    from loadcheck.errors import InputError
    from loadcheck.loading import Loading

    assert files_module.allowed_keys(Loading, ("burn", "taxy")) == "taxi trip trip_time rate order reserve".split()
    assert "add_fuel" in files_module.allowed_keys(Loading, ("leg", 0, "add_feul"))
    with pytest.raises(InputError) as caught:
        files_module.parse_loading({"lod": {}, "burn": {"taxy": 1}, "leg": [{"burn": {"trp": 3}}]}, "x.toml")
    described = [p.describe() for p in caught.value.problems]
    assert "burn.taxy: unknown field (did you mean 'taxi'?); got 1" in described
    assert "leg 2, burn.trp: unknown field (did you mean 'trip'?); got 3" in described
    assert "lod: unknown field (did you mean 'load'?)" in described


def test_a_command_line_trip_over_a_files_trip_time_is_said(tmp_path):
    # the file gives 1:30 at 8 US gal/h (12 US gal); --trip 10 replaces it: said, with the fuel used
    loading = tmp_path / "timed.toml"
    aircraft = Path(TRAINER_WITHIN).parent / "aircraft.toml"
    loading.write_text(
        f'format = 1\naircraft = "{aircraft}"\n[load]\nfront = 340\n[fuel]\nmains = "school"\n'
        '[burn]\ntaxi = 1.2\ntrip_time = "1:30"\nrate = 8\n'
    )
    inputs = files_module.load_check_inputs(str(loading), None, command_line=True, burn={"trip": "10"})
    assert inputs.loading.trip == pytest.approx(10.0)
    assert inputs.notes == [
        "the trip fuel is --trip 10 from the command line, 10 usgal; it replaces the loading file's "
        "trip_time = '1:30' x rate = 8 (command-line values are laid over the file's)"
    ]
    timed = files_module.load_check_inputs(str(loading), None, command_line=True, burn={"trip_time": "2:00"})
    assert timed.loading.trip == pytest.approx(16.0) and timed.notes == []  # the same form: laid over, no note


def test_regression_a_bare_toml_float_below_the_smallest_double_was_read_as_zero():
    """The final review: ``rear = 1e-400`` written unquoted was 0.0 to the TOML reader before loadcheck saw
    it, so the seat's weight vanished (the quoted ``"1e-400"`` was refused). The TOML reader now takes
    its floats through the same rule (loadcheck.units.float_as_written; IEEE 754 binary64's smallest
    normal double, about 2.2e-308, from memory): refused, naming the figure as written."""
    from loadcheck.errors import FileFormatError
    from loadcheck.files import parse_toml

    with pytest.raises(FileFormatError, match="'1e-400' is too small to be read as written"):
        parse_toml("[load]\nrear = 1e-400\n", "day.toml")
    assert parse_toml("[load]\nrear = 0.0\nfront = 1e-300\n", "day.toml")["load"] == {"rear": 0.0, "front": 1e-300}


def test_regression_a_bare_float_below_the_smallest_double_was_refused_without_its_field(tmp_path):
    """Trial 9, item 12: ``reading = 1e-400`` was refused as ``wb.toml: '1e-400' is too small ...``, while
    every other refusal of a readings value names its field (``point[2].reading``). The field is
    named for every kind of file, a later leg as the user counts legs, an array's item by its index."""
    from loadcheck.errors import FileFormatError
    from loadcheck.files import parse_toml

    with pytest.raises(FileFormatError) as error:
        parse_toml("[[point]]\nreading = 1.0\n[[point]]\nreading = 2.0\n[[point]]\nreading = 1e-400\n", "wb.toml")
    assert error.value.lines() == [
        "wb.toml: point[2].reading: '1e-400' is too small to be read as written: write 0, or the figure "
        "without the exponent"
    ]
    text = "[load]\nrear = 1e-400\n[[leg]]\nburn = { taxi = 1e-999 }\n[[envelope]]\npoints = [[1.0, 2e-400]]\n"
    with pytest.raises(FileFormatError) as error:
        parse_toml(text, "x.toml")
    assert [p.field for p in error.value.problems] == ["load.rear", "leg 2, burn.taxi", "envelope[0].points[0][1]"]
    readings = tmp_path / "w.toml"
    readings.write_text(sample("trainer4/weighing.toml").read_text().replace("reading = 541.0", "reading = 5e-324"))
    result = invoke("weigh", str(sample("trainer4/aircraft.toml")), str(readings))
    assert_input_error(result, "w.toml: point[0].reading: '5e-324' is too small")


@pytest.mark.parametrize(
    ("sample_file", "command"),
    [("trainer4/within.toml", "check"), ("trainer4/weighing.toml", "weigh"), ("trainer4/changes.toml", "alter")],
)
def test_regression_a_blank_aircraft_key_was_passed_over(tmp_path, sample_file, command):
    """A review: ``aircraft = ""`` in a readings or changes file got past the rule that refuses a file
    naming another aircraft (weigh ran against any aircraft file without a word), and in a loading given
    beside its aircraft file it was passed over. A blank key names nothing: it is refused, naming the
    key (fail closed: a value given is used as given or refused)."""
    from loadcheck.cli import app

    from .helpers import app_runner

    text = sample(sample_file).read_text()
    assert 'aircraft = "aircraft.toml"' in text
    blank = tmp_path / Path(sample_file).name
    blank.write_text(text.replace('aircraft = "aircraft.toml"', 'aircraft = "  "'))
    said = app_runner().invoke(app, [command, str(sample("trainer4/aircraft.toml")), str(blank)])
    assert said.exit_code == 2, said.output
    assert "aircraft: names no file" in said.output


def test_a_loading_naming_another_aircraft_than_the_one_given_is_refused(tmp_path):
    # an outside trial's find: `check OTHER.toml LOADING` used OTHER (25 kg lighter) with a note on
    # stderr only, while the loading names its own aircraft file: a pilot with an old copy got a
    # verdict for the wrong empty weight. Two aircraft of different data for one check: refused.
    from loadcheck.errors import InputError
    from loadcheck.files import load_check_inputs

    loading = sample("trainer4/within.toml")
    lighter = tmp_path / "aircraft.toml"
    text = sample("trainer4/aircraft.toml").read_text()
    lighter.write_text(text)
    same = load_check_inputs(lighter, loading)  # a copy of the same data: the same answer, with a note
    assert any("was given and is used" in note for note in same.notes)
    lighter.write_text(text.replace("weight = 1718", "weight = 1693", 1))
    assert "weight = 1693" in lighter.read_text()
    with pytest.raises(InputError, match="two aircraft for one check"):
        load_check_inputs(lighter, loading)


def test_a_bare_toml_float_beyond_the_largest_double_is_named_as_written():
    # an outside trial's find: `weight = 1e400` in an aircraft file was refused as "Input should be a
    # finite number; got inf", a figure never written; file-format.md promises the value as typed, as
    # the CSV and the command line say it (IEEE 754 binary64's largest double is about 1.8e308, from memory)
    from loadcheck.errors import FileFormatError
    from loadcheck.files import parse_toml

    with pytest.raises(FileFormatError) as error:
        parse_toml("[empty]\nweight = 1e400\narm = -2.5E+999\n", "aircraft.toml")
    assert sorted(error.value.lines()) == [
        "aircraft.toml: empty.arm: '-2.5E+999' is not a finite number",
        "aircraft.toml: empty.weight: '1e400' is not a finite number",
    ]
    assert parse_toml("[empty]\nweight = 1e300\n", "aircraft.toml")["empty"] == {"weight": 1e300}
