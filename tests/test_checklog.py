"""The check log: verification of every stored field, exports with their units, and
recorded checks against the current aircraft data (docs/fleet.md, "The check log")."""

from __future__ import annotations

import csv
import json
import shutil
import sqlite3
from pathlib import Path

import pytest
from hypothesis import given, settings
from hypothesis import strategies as st

from loadcheck.checklog import CheckLog, verify, verify_current
from loadcheck.cli import app
from loadcheck.errors import InputError
from loadcheck.fleet import load_fleet

from .helpers import app_runner, examples, sample, tamper_check_log

SAMPLES = Path(sample("trainer4/aircraft.toml")).parent.parent


def _record(db: Path, loading: str, *extra: str) -> int:
    result = app_runner().invoke(app, ["check", str(sample(loading)), "--log", "--db", str(db), *extra])
    assert result.exit_code in (0, 1), result.output
    with CheckLog(db) as log:
        return list(log.find())[-1].id


def test_an_untouched_record_is_reproduced(runner, db):
    record_id = _record(db, "trainer4/over_weight.toml")
    with CheckLog(db) as log:
        verification = verify(log, record_id)
    assert verification.reproduced and not verification.differences and verification.ok is False
    result = runner.invoke(app, ["log", "verify", str(record_id)])
    assert result.exit_code == 0 and "every stored field matches" in result.output


@pytest.mark.parametrize(
    "column, value, words",
    [
        ("ok", 1, "stored verdict"),  # issue 13 item 9: an out-of-limits record listed as "within limits"
        ("registration", "DEMO-6P", "stored registration"),
        ("category", "utility", "stored category"),
        ("reference", "another flight", "seal"),
        ("pilot", "someone else", "seal"),
        ("source", "elsewhere.toml", "seal"),
        ("checked_at", "2020-01-01T00:00:00+00:00", "seal"),
        ("legs", 2, "stored number of legs"),  # the count log list shows, outside the seal
    ],
)
def test_verify_finds_an_edit_to_any_stored_column(runner, db, column, value, words):
    record_id = _record(db, "trainer4/over_weight.toml")
    tamper_check_log(db, f"UPDATE checks SET {column} = ? WHERE id = ?", value, record_id)
    result = runner.invoke(app, ["log", "verify", str(record_id)])
    assert result.exit_code == 1, result.output
    assert "NOT reproduced" in result.output and words in result.output


def test_verify_finds_an_edited_result(runner, db):
    record_id = _record(db, "trainer4/over_weight.toml")
    with CheckLog(db) as log:
        stored = log.get(record_id).result
    stored["ok"] = True
    stored["findings"] = []
    tamper_check_log(db, "UPDATE checks SET result = ?, ok = 1 WHERE id = ?", json.dumps(stored), record_id)
    listing = runner.invoke(app, ["log", "list"])
    assert "within limits" in listing.output  # the listing shows the stored column ...
    result = runner.invoke(app, ["log", "verify", str(record_id), "--json"])
    assert result.exit_code == 1  # ... and verify says it is not what was recorded
    assert any("stored result differs" in d for d in json.loads(result.stdout)["differences"])


def test_a_record_from_before_seals_is_verified_and_says_what_it_cannot_check(runner, tmp_path):
    path = tmp_path / "old.sqlite3"
    with CheckLog(path):
        pass
    connection = sqlite3.connect(path)  # the table as an earlier version made it: no seal column
    connection.executescript(
        "DROP TRIGGER checks_never_deleted; DROP TABLE checks; CREATE TABLE checks ("
        "id INTEGER PRIMARY KEY AUTOINCREMENT, checked_at TEXT NOT NULL, registration TEXT, "
        "reference TEXT, pilot TEXT, source TEXT, category TEXT, ok INTEGER NOT NULL, "
        "fingerprint TEXT NOT NULL, inputs TEXT NOT NULL, result TEXT NOT NULL, version TEXT NOT NULL);"
    )
    connection.close()
    record_id = _record(path, "trainer4/within.toml")
    tamper_check_log(path, "UPDATE checks SET seal = NULL WHERE id = ?", record_id)
    result = runner.invoke(app, ["log", "verify", str(record_id), "--db", str(path)])
    assert result.exit_code == 0 and "has no seal" in result.output


def test_csv_export_names_the_units_of_each_row_in_a_mixed_fleet(runner, db):
    # trainer4 is in lb and in, tandem2 in kg and mm: each row's numbers are in its own aircraft's units
    runner.invoke(app, ["fleet", "check", str(SAMPLES), str(SAMPLES / "fleet_day.csv")])
    exported = runner.invoke(app, ["log", "export", "--format", "csv"])
    rows = list(csv.DictReader(exported.stdout.splitlines()))
    units = {r["registration"]: (r["mass_unit"], r["arm_unit"]) for r in rows}
    assert units["DEMO-4T"] == ("lb", "in") and units["DEMO-2T"] == ("kg", "mm")
    with CheckLog(db) as log:
        by_id = {r.id: r for r in log.find()}
    for row in rows:
        result = by_id[int(row["id"])].result
        assert (row["mass_unit"], row["arm_unit"]) == (result["units"]["mass"], result["units"]["arm"])
        takeoff = next(c for c in result["conditions"] if c["condition"] == "takeoff")
        assert float(row["takeoff_weight"]) == pytest.approx(takeoff["weight"])


def _fleet_copy(tmp_path: Path) -> Path:
    folder = tmp_path / "fleet"
    for name in ("trainer4", "tandem2"):
        shutil.copytree(SAMPLES / name, folder / name)
    return folder


def test_current_mode_unchanged_data_exits_0(runner, db, tmp_path):
    fleet = _fleet_copy(tmp_path)
    _record(db, "trainer4/within.toml")
    result = runner.invoke(app, ["log", "verify", "--current", str(fleet)], env={"COLUMNS": "250"})  # one line a record
    assert result.exit_code == 0, result.output
    assert "0 made with aircraft data that has changed since" in result.output


def test_current_mode_finds_a_check_the_new_data_puts_out_of_limits(runner, db, tmp_path):
    fleet = _fleet_copy(tmp_path)
    within = _record(db, "trainer4/within.toml")
    aircraft = fleet / "trainer4" / "aircraft.toml"
    # a heavier empty weight (a new weighing): the recorded loading now exceeds the maximum takeoff weight
    aircraft.write_text(aircraft.read_text().replace("weight = 1718.0", "weight = 2200.0"))
    with CheckLog(db) as log:
        outcome = verify_current(log.find(), load_fleet(fleet))
    (check,) = outcome.checks
    assert check.record_id == within and check.data_changed and check.recorded_ok and check.current_ok is False
    assert outcome.status == 1 and outcome.now_out_of_limits == 1
    result = runner.invoke(app, ["log", "verify", "--current", str(fleet)], env={"COLUMNS": "250"})  # one line a record
    assert result.exit_code == 1 and "changed since" in result.output and "(was within)" in result.output
    assert "LIMIT" in result.output
    # the plain verification still reproduces the record with the data it was made with
    assert runner.invoke(app, ["log", "verify", str(within)]).exit_code == 0


def test_current_mode_a_record_whose_aircraft_is_gone_exits_2(runner, db, tmp_path):
    fleet = _fleet_copy(tmp_path)
    _record(db, "twin6/within.toml")
    result = runner.invoke(app, ["log", "verify", "--current", str(fleet), "--json"])
    assert result.exit_code == 2
    (check,) = json.loads(result.stdout)["checks"]
    assert "unknown registration 'DEMO-6P'" in check["problem"] and "current_ok" not in check


def test_regression_a_record_whose_aircraft_is_gone_was_counted_as_changed_data(runner, db, tmp_path):
    # its aircraft is not in the fleet: nothing is known of its data; the summary says it could not be
    # checked, and at 80 columns no cell or heading is cut short
    fleet = _fleet_copy(tmp_path)
    _record(db, "twin6/within.toml")
    _record(db, "trainer4/within.toml")
    result = runner.invoke(app, ["log", "verify", "--current", str(fleet)], env={"COLUMNS": "80"})
    assert result.exit_code == 2
    assert "not in the fleet" in result.output and "CANNOT BE CHECKED" in result.output
    assert "0 made with aircraft data that has changed since" in result.output
    assert "1 could not be checked with the current data" in result.output
    assert "…" not in result.output and "DEMO-6P" in result.output


def test_verify_needs_an_id_without_current(runner, db):
    _record(db, "trainer4/within.toml")
    result = runner.invoke(app, ["log", "verify"])
    assert result.exit_code == 2 and "record id" in result.output and "Traceback" not in result.output


# -- trips of several legs (issue 16): the test aircraft and figures of tests/test_trip.py --------


def test_a_trip_is_recorded_verified_listed_and_exported_as_one_record(runner, db, tmp_path):
    from loadcheck import load_check_inputs
    from loadcheck.checklog import log_check
    from loadcheck.trip import check_trip

    from .test_trip import trip_fleet

    folder = trip_fleet(tmp_path / "fleet")
    inputs = load_check_inputs(folder / "trip.toml", allow_trip=True)
    trip = check_trip(inputs.aircraft, inputs.trip)
    with CheckLog(db) as log:  # the library's one recording job, as the web desk calls it
        first = log_check(log, inputs, trip, source="trip.toml", version="test")
    checked = runner.invoke(app, ["check", str(folder / "trip.toml"), "--log", "--db", str(db)])  # the command line
    assert checked.exit_code == 1 and "recorded as 2" in checked.stderr
    flown = runner.invoke(app, ["fleet", "check", str(folder), str(folder / "day.csv"), "--log", "--db", str(db)])
    assert flown.exit_code == 1 and "2 check(s) recorded" in flown.stderr  # the trip and the single flight
    with CheckLog(db) as log:
        records = list(log.find())
        assert len(records) == 4
        for record in records[:3]:  # each trip is one record: its inputs (every leg), the trip's result
            assert record.result == trip.to_dict() and record.ok is False and len(record.inputs["leg"]) == 1
            assert record.fingerprint == inputs.aircraft.fingerprint
            verification = verify(log, record.id)
            assert verification.reproduced and verification.ok is False, verification.differences
        assert records[2].source.endswith("day.csv:2,3") and records[2].reference == "F1"
        assert [r[-1] for r in log.listing()] == [2, 2, 2, 1]
    listed = runner.invoke(app, ["log", "list"], env={"COLUMNS": "200"})
    assert listed.exit_code == 0 and listed.stdout.count("OUT OF LIMITS (2 legs)") == 3
    assert runner.invoke(app, ["log", "verify", str(first)]).exit_code == 0
    # CSV: a line per leg, the trip's verdict in ok, each leg's own figures and verdict
    rows = list(csv.DictReader(runner.invoke(app, ["log", "export", "--format", "csv"]).stdout.splitlines()))
    assert [(r["id"], r["legs"], r["leg"], r["ok"], r["leg_ok"]) for r in rows] == [
        (str(i), "2", leg, "False", ok) for i in (1, 2, 3) for leg, ok in (("1", "True"), ("2", "False"))
    ] + [("4", "1", "", "True", "")]
    # hand-worked (tests/test_trip.py): leg 2 takeoff 1,688 lb at 146,320 / 1,688 in, landing 1,628 lb
    assert float(rows[1]["takeoff_weight"]) == pytest.approx(1688.0)
    assert float(rows[1]["takeoff_arm"]) == pytest.approx(146320 / 1688)
    assert (
        float(rows[1]["landing_weight"]) == pytest.approx(1628.0)
        and rows[1]["first_finding"].startswith("aft") is False
    )
    assert "aft of the aft limit" in rows[1]["first_finding"] and rows[0]["first_finding"] == ""
    lines = [json.loads(line) for line in runner.invoke(app, ["log", "export"]).stdout.splitlines()]
    assert lines[0]["result"] == trip.to_dict() and lines[0]["inputs"]["leg"] and "legs" not in lines[3]["result"]


def test_a_trip_record_with_an_edited_leg_is_not_reproduced(runner, db, tmp_path):
    from .test_trip import trip_fleet

    folder = trip_fleet(tmp_path / "fleet")
    assert runner.invoke(app, ["check", str(folder / "trip.toml"), "--log", "--db", str(db)]).exit_code == 1
    with CheckLog(db) as log:
        stored = log.get(1).result
    stored["legs"][1]["ok"] = True
    tamper_check_log(db, "UPDATE checks SET result = ? WHERE id = 1", json.dumps(stored))
    result = runner.invoke(app, ["log", "verify", "1"])
    assert result.exit_code == 1 and "stored result differs" in result.output


def test_single_records_are_unchanged_by_trips(runner, db):
    """A single loading is recorded, listed, exported and verified as before trips were
    recorded: its result is check_loading's, one CSV line with legs 1 and no leg number."""
    from loadcheck import check_loading, load_check_inputs

    record_id = _record(db, "trainer4/within.toml")
    inputs = load_check_inputs(sample("trainer4/within.toml"))
    with CheckLog(db) as log:
        record = log.get(record_id)
        assert record.result == check_loading(inputs.aircraft, inputs.loading).to_dict() and not record.inputs.get(
            "leg"
        )
        assert next(iter(log.listing()))[-1] == 1 and verify(log, record_id).reproduced
    (row,) = csv.DictReader(runner.invoke(app, ["log", "export", "--format", "csv"]).stdout.splitlines())
    assert (row["legs"], row["leg"], row["leg_ok"]) == ("1", "", "")
    takeoff = check_loading(inputs.aircraft, inputs.loading).condition("takeoff")
    assert float(row["takeoff_weight"]) == pytest.approx(takeoff.weight)


def test_a_trip_result_is_not_recorded_against_single_inputs(db, tmp_path):
    from loadcheck import load_check_inputs
    from loadcheck.checklog import log_check
    from loadcheck.errors import InputError
    from loadcheck.trip import check_trip

    from .test_trip import trip_fleet

    folder = trip_fleet(tmp_path / "fleet")
    trip_inputs = load_check_inputs(folder / "trip.toml", allow_trip=True)
    single = load_check_inputs(sample("trainer4/within.toml"))
    with CheckLog(db) as log, pytest.raises(InputError, match="not the check of these inputs"):
        log_check(log, single, check_trip(trip_inputs.aircraft, trip_inputs.trip), source="x", version="test")


def test_a_trip_recorded_within_limits_is_checked_against_the_current_data(runner, db, tmp_path):
    from .test_trip import trip_fleet

    folder = trip_fleet(tmp_path / "fleet")
    within = folder / "within.toml"
    within.write_text((folder / "trip.toml").read_text().replace("rear = 400", "rear = 100"))
    assert runner.invoke(app, ["check", str(within), "--log", "--db", str(db)]).exit_code == 0
    aircraft = folder / "aircraft.toml"
    # a new weighing, 700 lb heavier (invented): leg 1 alone now weighs 1,700 + 180 + 180 = 2,060 lb at the ramp
    aircraft.write_text(aircraft.read_text().replace("weight = 1000.0", "weight = 1700.0"))
    result = runner.invoke(app, ["log", "verify", "--current", str(folder), "--json"])
    assert result.exit_code == 1, result.output
    (check,) = json.loads(result.stdout)["checks"]
    assert check["data_changed"] and check["recorded_ok"] and check["current_ok"] is False
    assert any(f.startswith("leg 1: ramp weight 2,060.0 lb exceeds") for f in check["current_findings"])


def test_records_list_does_not_load_the_aircraft_models(db, tmp_path):
    """Start-up of a listing: render/terminal.py imported the aircraft models (pydantic schema
    building, numpy, shapely) for type hints alone."""
    import subprocess
    import sys

    _record(db, "trainer4/within.toml")
    code = (
        "import sys; sys.argv = ['loadcheck', 'log', 'list', '--db', sys.argv[1]]\n"
        "import loadcheck.cli as cli\ntry:\n    cli.main()\nexcept SystemExit as stop:\n    code = stop.code\n"
        "print(code, [m for m in ('numpy', 'shapely', 'loadcheck.aircraft') if m in sys.modules], file=sys.stderr)"
    )
    done = subprocess.run(
        [sys.executable, "-c", code, str(db)], capture_output=True, text=True, check=True, cwd=tmp_path
    )
    assert done.stderr.strip() == "0 []", done.stderr


def test_listing_leaves_the_cycle_collector_as_it_found_it(db):
    """The listing reads its rows with the cycle collector paused (issue 18: its passes over
    100,000 row tuples freed nothing); enabled or disabled, it is left as it was."""
    import gc

    _record(db, "trainer4/within.toml")
    _record(db, "trainer4/over_weight.toml")
    with CheckLog(db) as log:
        assert gc.isenabled()
        rows = log.listing()
        assert gc.isenabled()
        gc.disable()
        try:
            assert log.listing(registration="DEMO-4T") == rows
            assert not gc.isenabled()
        finally:
            gc.enable()
    assert [(row[5], row[7]) for row in rows] == [(1, 1), (0, 1)]  # within, then over the weight limit; one leg each


# -- the filters of a listing: fail closed ------------------------------------------------------


def _logged(log: CheckLog, registration: str | None, ok: bool) -> int:
    """A record of a registration as stored (the text given), within limits or not."""
    return log.add(
        aircraft_data={"name": "test"},
        fingerprint="f" * 64,
        inputs={"load": {}},
        result={"ok": ok, "category": "normal"},
        registration=registration,
    )


def test_regression_the_registration_filter_was_exact_where_the_fleet_ignores_case_spaces_and_hyphens(db):
    """``demo4t`` lists DEMO-4T's records (and those stored as ``demo 4t`` by an older file), as the
    fleet finds the aircraft (loadcheck.aircraft.registration_key; common practice: a registration is
    written with or without its hyphen, in either case): the exact filter gave none."""
    with CheckLog(db) as log:
        ids = [_logged(log, text, True) for text in ("DEMO-4T", "DEMO-6P", "demo 4t", None, "DEMO-4TX")]
        for spelt in ("demo4t", "DEMO-4T", " Demo 4-T"):
            assert [r.id for r in log.find(registration=spelt)] == [ids[0], ids[2]], spelt
            assert [row[0] for row in log.listing(registration=spelt)] == [ids[0], ids[2]], spelt
        assert log.listing(registration="NOPE-1") == []
        with pytest.raises(InputError, match="'-' is not a registration: it has no letter or digit"):
            log.find(registration="-")


def test_regression_an_unknown_verdict_listed_every_record(db):
    """The verdict filter is ``within`` or ``out``, in the library's query; any other word (``WITHIN``,
    ``bogus``) is refused naming them (fail closed, DESIGN.md), where the desk listed every record."""
    with CheckLog(db) as log:
        within, out = _logged(log, "DEMO-4T", True), _logged(log, "DEMO-4T", False)
        assert [r.id for r in log.find(verdict="within")] == [within]
        assert [row[0] for row in log.listing(verdict="out", registration="demo4t")] == [out]
        for word in ("WITHIN", "bogus", ""):
            with pytest.raises(InputError) as refused:
                log.listing(verdict=word)
            assert [p.describe() for p in refused.value.problems] == [
                f"verdict: unknown verdict {word!r}; expected within or out"
            ]
            with pytest.raises(InputError):
                log.find(verdict=word)  # refused when called, before a record is read


def test_regression_log_list_of_another_spelling_printed_nothing(runner, db):
    """``log list --registration demo4t`` lists DEMO-4T's records (it printed none, exit 0); an unknown
    ``--verdict`` exits 2 in the library's words."""
    _record(db, "trainer4/within.toml")
    over = _record(db, "trainer4/over_weight.toml")
    listed = runner.invoke(app, ["log", "list", "--registration", "demo4t"])
    assert listed.exit_code == 0 and "DEMO-4T" in listed.output and "OUT OF LIMITS" in listed.output
    out = runner.invoke(app, ["log", "export", "--registration", "demo 4t", "--verdict", "out"])
    assert out.exit_code == 0 and [json.loads(line)["id"] for line in out.stdout.splitlines()] == [over]
    refused = runner.invoke(app, ["log", "list", "--verdict", "WITHIN"])
    assert refused.exit_code == 2 and "verdict: unknown verdict 'WITHIN'; expected within or out" in refused.output


# The seal is SHA-256 over json.dumps(fields, separators=(",", ":")) (the form records were sealed
# with from the start); the quicker writer must give those bytes exactly, or a record sealed before
# would no longer verify. The json module's output is the reference (Python standard library).
_SEAL_TEXTS = [
    "".join(chr(c) for c in range(128)),  # every ASCII character, DEL and the control characters included
    'a "quoted" \\ back\\slash / slash',
    "DEMO-4T",
    "Zürich, 42 °",  # not ASCII: written by the json module
    "\x7f",
    "",
    "\udcff",  # a lone surrogate (a command-line byte that is not UTF-8): orjson refuses it, json escapes it
    "\u2028 \U0001f6e9",  # a line separator and a character past the BMP
]


@pytest.mark.parametrize("text", _SEAL_TEXTS)
def test_the_seal_text_is_json_dumps_byte_for_byte(text):
    from loadcheck.checklog import _seal_text

    fields = ["2026-12-02T07:00:00.000000+00:00", text, None, 1, 0, '{"ok":true,"x":[1.5e-07,2]}']
    assert _seal_text(fields) == json.dumps(fields, separators=(",", ":")).encode("utf-8")


@given(st.lists(st.one_of(st.none(), st.integers(0, 1), st.text(st.characters(max_codepoint=0x7F))), max_size=11))
@settings(max_examples=examples(100))
def test_the_seal_text_of_any_ascii_fields_is_json_dumps(fields):
    from loadcheck.checklog import _seal_text

    assert _seal_text(fields) == json.dumps(fields, separators=(",", ":")).encode("utf-8")


def test_regression_a_span_ending_before_it_starts_listed_nothing_without_a_word(runner, db):
    """An outside trial: ``log list --since 2026-12-03 --until 2026-12-02`` listed nothing and exited 0, as
    if no check had been recorded. No day lies in such a span: it is refused, naming both days (common
    practice: a filter that cannot match is a typing error, not an empty answer)."""
    _record(db, "trainer4/within.toml")
    for command in ("list", "export"):
        said = runner.invoke(app, ["log", command, "--since", "2026-12-03", "--until", "2026-12-02", "--db", str(db)])
        assert said.exit_code == 2, said.output
        assert "until: 2026-12-02 is before the first day, 2026-12-03" in said.output
    same_day = runner.invoke(app, ["log", "list", "--since", "2026-12-03", "--until", "2026-12-03", "--db", str(db)])
    assert same_day.exit_code == 0


SIDE_BY_SIDE = """format = 1
name = "Invented side-by-side test aircraft"
registration = "TST-L2"
[units]
mass = "lb"
arm = "in"
fuel_volume = "usgal"
[empty]
weight = 1400.0
arm = 40.0
lateral_arm = 0.0
[limits]
max_takeoff_weight = 2300
[[station]]
id = "left"
kind = "seat"
arm = 38.0
lateral_arm = -12.0
max_weight = 250
controls = true
[[station]]
id = "right"
kind = "seat"
arm = 38.0
lateral_arm = 12.0
max_weight = 250
controls = true
[[tank]]
id = "ltank"
arm = 44.0
lateral_arm = -60.0
usable = 25
fuel = "avgas"
[[tank]]
id = "rtank"
arm = 44.0
lateral_arm = 60.0
usable = 25
fuel = "avgas"
[[envelope]]
category = "normal"
axes = ["arm", "weight"]
points = [[35.0, 1400], [35.0, 2300], [45.0, 2300], [45.0, 1400]]
[[envelope]]
category = "normal"
axes = ["lateral_arm", "weight"]
points = [[-1.5, 1400], [-1.5, 2300], [1.5, 2300], [1.5, 1400]]
"""


def test_regression_a_recorded_trip_lost_the_burn_order_its_leg_kept(runner, tmp_path):
    """An outside trial: a trip whose leg 2 keeps leg 1's burn order (docs/file-format.md, "Trips of several
    legs") was recorded with the order's default, ``together``, so ``log verify`` recomputed another trip
    and called the out-of-limits record "within limits". The record holds the fields given and only those.

    Worked by hand (FAA-H-8083-1B chapter 2, moments; avgas 6.0 lb/US gal, common practice): leg 1 burns
    6.5 US gal from ltank (24 -> 17.5); leg 2 puts in 5 (22.5) and burns 8.5 from ltank again: landing
    ltank 14, rtank 15 at 1,400 + 200 + 29 x 6 = 1,774 lb; lateral moment 200 x 12 - 84 x 60 + 90 x 60 =
    2,760 lb-in, lateral CG 1.556 in, right of the 1.5 in limit. Burned together instead, it would land
    inside (0.18 in)."""
    (tmp_path / "side.toml").write_text(SIDE_BY_SIDE)
    trip = tmp_path / "trip.toml"
    trip.write_text(
        'format = 1\naircraft = "side.toml"\n[load]\nleft = 180\nright = 200\n[fuel]\nltank = 24\nrtank = 15\n'
        '[burn]\ntaxi = 0.5\ntrip = 6\norder = ["ltank", "rtank"]\n'
        "[[leg]]\nload = { left = 0 }\nadd_fuel = { ltank = 5 }\nburn = { taxi = 0.5, trip = 8 }\n"
    )
    db = tmp_path / "log.sqlite3"
    checked = runner.invoke(app, ["check", str(trip), "--log", "--db", str(db), "--json"])
    assert checked.exit_code == 1, checked.output
    landing = json.loads(checked.stdout)["legs"][1]["conditions"][2]
    assert landing["lateral_arm"] == pytest.approx(2760 / 1774, abs=1e-9)
    day = tmp_path / "day.csv"
    day.write_text(
        "registration,trip_id,leg,left,right,ltank,rtank,taxi,trip,order\n"
        "TST-L2,T1,1,180,200,24,15,0.5,6,ltank;rtank\nTST-L2,T1,2,0,,5,,0.5,8,\n"
    )
    fleet = runner.invoke(app, ["fleet", "check", str(tmp_path), str(day), "--db", str(db)])
    assert fleet.exit_code == 1, fleet.output
    with CheckLog(db) as log:
        records = list(log.find())
    assert len(records) == 2
    for record in records:
        assert "order" not in record.inputs["leg"][0].get("burn", {})  # left out: the previous leg's
        said = runner.invoke(app, ["log", "verify", str(record.id), "--db", str(db)])
        assert said.exit_code == 0 and "reproduced; the same result (out of limits)" in said.output, said.output


def test_verify_says_where_the_stored_result_differs(runner, db):
    """A record whose stored result differs from the recomputed one said only that it differed; a
    record made by an earlier version (whose words or finding codes have changed since) could not be
    told from an edited one. Verify now names the first field that differs, with both values."""
    record_id = _record(db, "trainer4/over_weight.toml")
    with CheckLog(db) as log:
        stored = log.get(record_id).result
    stored["findings"][0]["message"] = "an older wording"
    tamper_check_log(db, "UPDATE checks SET result = ? WHERE id = ?", json.dumps(stored), record_id)
    said = json.loads(runner.invoke(app, ["log", "verify", str(record_id), "--json"]).stdout)
    [difference] = [d for d in said["differences"] if "stored result differs" in d]
    assert difference.startswith(
        'the stored result differs from the recomputed one, first at findings[0].message: "an older wording", now "'
    )


def test_a_log_made_before_flight_dates_were_recorded_is_opened_and_verified(runner, tmp_path):
    """A review: no test opened a check log made before the flight_date column. A log with a sealed
    record of that version (its seal over the fields of then) gets the column on first use, its record
    has no flight date and still verifies, and new records are dated and sealed with it."""
    import hashlib

    from loadcheck.checklog import _seal_text

    path = tmp_path / "old.sqlite3"
    first = _record(path, "trainer4/within.toml")
    connection = sqlite3.connect(path)  # the table as the earlier version made it: no flight_date column
    connection.executescript(
        "DROP TRIGGER checks_never_rewritten; DROP TRIGGER checks_never_deleted; "
        "ALTER TABLE checks DROP COLUMN flight_date;"
    )
    columns = [row[1] for row in connection.execute("PRAGMA table_info(checks)")]
    assert "flight_date" not in columns and "seal" in columns
    stored = connection.execute(
        "SELECT checked_at, registration, reference, pilot, source, category, ok, fingerprint, inputs, result, "
        "version, seal FROM checks WHERE id = ?",
        (first,),
    ).fetchone()
    connection.close()
    assert hashlib.sha256(_seal_text(list(stored[:11]))).hexdigest() == stored[11]  # sealed as it was then
    said = runner.invoke(app, ["log", "verify", str(first), "--db", str(path)])
    assert said.exit_code == 0 and "every stored field matches" in said.output, said.output
    with CheckLog(path) as log:
        assert log.get(first).flight_date is None
    day = tmp_path / "day.csv"
    day.write_text("registration,date,front,rear,hold,mains,centre\nDEMO-4T,2026-12-03,170,30,0,30,0\n")
    assert runner.invoke(app, ["fleet", "check", str(SAMPLES), str(day), "--db", str(path)]).exit_code == 0
    with CheckLog(path) as log:
        dated = list(log.find())[-1]
    assert dated.flight_date == "2026-12-03"
    assert runner.invoke(app, ["log", "verify", str(dated.id), "--db", str(path)]).exit_code == 0


def test_regression_a_record_written_before_results_gained_a_field_still_verifies():
    # results gained fields (a trip leg's "stop", an excursion's "from_takeoff"...): a record
    # written before holds none of them, and every field it does hold is still compared
    from loadcheck.checklog import results_match

    stored = {"ok": False, "legs": [{"leg": 1, "ok": True}, {"leg": 2, "ok": False}]}
    again = {"ok": False, "legs": [{"leg": 1, "ok": True}, {"leg": 2, "stop": {"fuel": []}, "ok": False}]}
    assert results_match(stored, again, newer_fields=True) and not results_match(stored, again)
    changed = {"ok": False, "legs": [{"leg": 1, "ok": True}, {"leg": 2, "stop": {"fuel": []}, "ok": True}]}
    assert not results_match(stored, changed, newer_fields=True)
    assert not results_match(again, stored, newer_fields=True)  # a stored field missing from the recompute


def _sample_day_log(runner, tmp_path) -> Path:
    """A check log of the sample day's usable rows, recorded by fleet check (several records, one batch)."""
    db = tmp_path / "log.db"
    runner.invoke(
        app, ["fleet", "check", str(sample("trainer4").parent), str(sample("fleet_day.csv")), "--db", str(db)]
    )
    with CheckLog(db) as log:
        assert len(list(log.find())) >= 5
    return db


def test_a_seal_cleared_among_sealed_records_is_found(runner, tmp_path):
    # trial 12: with its seal set to NULL, a record's pilot, reference and time could be changed and
    # `log verify` still said every stored field matches, with a note that the record was from "an earlier
    # version"; records before it (and of its batch) are sealed, so the version that wrote it sealed it
    db = _sample_day_log(runner, tmp_path)
    tamper_check_log(
        db, "UPDATE checks SET seal = NULL, pilot = 'Mallory', checked_at = '2026-11-01T08:00:00' WHERE id = 4"
    )
    with CheckLog(db) as log:
        found = verify(log, 4)
        assert any("seal was removed" in d for d in found.differences), found
        assert verify(log, 3).differences == []  # the records beside it are untouched
    said = runner.invoke(app, ["log", "verify", "4", "--db", str(db)])
    assert said.exit_code == 1 and "seal was removed" in said.output


def test_a_record_deleted_from_the_file_is_found(runner, tmp_path):
    # trial 12: a record deleted behind the triggers' back went unnoticed; ids are never given twice
    # (SQLite AUTOINCREMENT) and records are never deleted, so a missing id is a record removed
    db = _sample_day_log(runner, tmp_path)
    connection = sqlite3.connect(db)
    connection.execute("DROP TRIGGER checks_never_deleted")
    connection.execute("DELETE FROM checks WHERE id IN (2, 3)")
    last = connection.execute("SELECT max(id) FROM checks").fetchone()[0]
    connection.execute("DELETE FROM checks WHERE id = ?", (last,))  # the last one too: sqlite_sequence keeps its id
    connection.commit()
    connection.close()
    with CheckLog(db) as log:
        assert log.missing_ids() == [(2, 3), (last, last)]
        found = verify(log, 1)
        assert any("records 2 to 3 are missing" in d for d in found.differences), found
        assert any(f"record {last} is missing" in d for d in found.differences), found
