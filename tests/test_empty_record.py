"""A new empty-weight record from a weighing: what is refused, confirmed, recorded and kept
(issue 14; docs/mechanic.md, "What is refused, and why").

Sources: the weighing arithmetic is tested against FAA-H-8083-1B in tests/test_weighing.py;
here the rules about writing the record (loadcheck/empty_record.py), and its history. The
10 % plausibility bound is common practice (no published figure); a record whose empty
weight reaches the maximum takeoff weight leaves no useful load (FAA-H-8083-1B chapter 2,
useful load = maximum weight - empty weight).
"""

from __future__ import annotations

import datetime as dt
import errno
import json
import os
import re
import shutil
import subprocess
import tomllib
from pathlib import Path

import pytest

import loadcheck.files as files_module
from loadcheck import load_aircraft
from loadcheck.cli import app
from loadcheck.empty_record import (
    HISTORY_INPUTS_BYTES,
    NOTE_CHARS,
    NotConfirmedError,
    OverrideNeededError,
    make_current,
    propose,
)
from loadcheck.errors import LoadcheckError
from loadcheck.files import MAX_FILE_BYTES, read_text

from .helpers import app_runner, assert_input_error, cell, record_sheet, sample


def _trainer(tmp_path: Path) -> Path:
    for name in ("aircraft.toml", "changes.toml", "weighing.toml"):
        shutil.copy(sample(f"trainer4/{name}"), tmp_path / name)
    return tmp_path / "aircraft.toml"


def _readings(tmp_path: Path, old: str, new: str, name: str = "readings.toml") -> Path:
    path = tmp_path / name
    path.write_text((tmp_path / "weighing.toml").read_text().replace(old, new))
    return path


def _weigh(path: Path, readings: Path, *options: str):
    return app_runner().invoke(app, ["weigh", str(path), str(readings), *options])


# -- item 2: impossible and implausible records ---------------------------------------------


def test_a_mistyped_reading_that_leaves_no_useful_load_is_never_written(tmp_path):
    path = _trainer(tmp_path)
    before = path.read_bytes()
    bad = _readings(tmp_path, "reading = 541.0", "reading = 5410.0")  # 5410 for 541
    shown = _weigh(path, bad, "--sheet", str(tmp_path / "record.html"))
    assert shown.exit_code == 0 and "NEVER WRITTEN" in shown.output
    html = (tmp_path / "record.html").read_text()
    assert "NEVER WRITTEN" in html
    # the checks of every category need a valid aircraft; each category is named
    assert "Not computed in the normal and utility categories: the new record does not make a valid aircraft" in html
    assert "NOT all within limits (or not established) in the normal and utility categories" in html
    assert "note: the extreme checks of the normal and utility categories could not be made" in shown.stderr
    for options in (["--write", "--yes"], ["--write", "--yes", "--force"]):
        result = _weigh(path, bad, *options)
        assert result.exit_code == 2, result.output
        assert "reaches the maximum takeoff weight" in result.output and "--force" not in result.output
        assert path.read_bytes() == before


def test_an_implausible_change_needs_an_override_that_the_history_keeps(runner, tmp_path):
    path = _trainer(tmp_path)
    before = path.read_bytes()
    heavy = _readings(tmp_path, "reading = 598.0", "reading = 818.0")  # +220 lb: about 11 % above the record's 1,718 lb
    refused = _weigh(path, heavy, "--write", "--yes")
    assert refused.exit_code == 2 and "more than 10%" in refused.output and "--force" in refused.output
    assert path.read_bytes() == before
    written = _weigh(
        path, heavy, "--write", "--yes", "--force", "--by", "J. Doe, A&P 1234567", "--why", "annual weighing"
    )
    assert written.exit_code == 0, written.output
    (entry,) = load_aircraft(path).history
    assert entry.by == "J. Doe, A&P 1234567" and entry.note == "annual weighing"
    assert entry.overrides and entry.overrides[0].startswith("implausible_change:")
    listing = runner.invoke(app, ["history", str(path)])
    assert "OVERRIDE" in listing.output and "implausible_change" in listing.output


def test_a_cg_outside_every_envelope_needs_an_override(tmp_path):
    path = _trainer(tmp_path)
    # the main-wheel distance mistyped, 84.7 for 57.4 in: CG near 64 in, aft of every envelope (35 to 46.8 in)
    shifted = _readings(tmp_path, "main_distance = 57.4", "main_distance = 84.7")
    proposal = propose(path, shifted, "weighing")
    assert [r.code for r in proposal.result.refusals] == ["cg_outside_envelopes"]
    with pytest.raises(OverrideNeededError, match="outside every envelope's arm span"):
        make_current(proposal, confirmed=True)
    assert make_current(proposal, confirmed=True, override=True) == path
    assert load_aircraft(path).history[0].overrides[0].startswith("cg_outside_envelopes")


@pytest.mark.parametrize(
    "old, new, words",
    [
        ("weight = 1718.0", "weight = 2450.0", "empty.weight"),  # empty weight at the maximum takeoff weight
        ("max_landing_weight = 2450", "max_landing_weight = 2500", "max_landing_weight (2500) is above"),
        ("basis = ", "cg_range = [41.0, 37.0]\nbasis = ", "cg_range is reversed"),
    ],
)
def test_validate_refuses_an_impossible_aircraft(runner, tmp_path, old, new, words):
    path = _trainer(tmp_path)
    path.write_text(path.read_text().replace(old, new, 1))
    result = runner.invoke(app, ["validate", str(path)])
    assert result.exit_code == 2 and words in result.output and "Traceback" not in result.output


# -- item 3: confirmation, and who, when and why ------------------------------------------------


def test_a_non_interactive_write_needs_yes(tmp_path):
    path = _trainer(tmp_path)
    before = path.read_bytes()
    result = _weigh(path, tmp_path / "weighing.toml", "--write")
    assert result.exit_code == 2 and "--yes" in result.output and "nothing was written" in result.output
    assert path.read_bytes() == before
    with pytest.raises(NotConfirmedError):
        make_current(propose(path, tmp_path / "weighing.toml", "weighing"), confirmed=False)
    assert path.read_bytes() == before


def test_the_history_says_who_when_and_why_and_digests_the_readings(tmp_path):
    path = _trainer(tmp_path)
    assert _weigh(path, tmp_path / "weighing.toml", "--write", "--yes").exit_code == 0
    (entry,) = load_aircraft(path).history
    assert entry.by == "demo hangar"  # the readings' weighed_by
    assert entry.reason == "weighing" and entry.recorded is not None
    import hashlib

    raw = read_text(tmp_path / "weighing.toml").encode()
    assert entry.inputs["sha256"] == hashlib.sha256(raw).hexdigest() and entry.inputs["bytes"] == len(raw)
    assert [p["reading"] for p in entry.inputs["point"]] == [541.0, 600.5, 598.0]


def test_a_long_note_does_not_make_the_aircraft_file_unreadable(runner, tmp_path):
    path = _trainer(tmp_path)
    note = "scale calibration log: " + "x" * 2_500_000
    long = tmp_path / "long.toml"
    long.write_text(
        (tmp_path / "weighing.toml")
        .read_text()
        .replace('weighed_by = "demo hangar"', f'weighed_by = "demo hangar"\nnote = "{note}"')
    )
    for _ in range(3):
        assert _weigh(path, long, "--write", "--yes").exit_code == 0
    size = path.stat().st_size
    assert size < 64 * 1024 < MAX_FILE_BYTES
    aircraft = load_aircraft(path)
    assert len(aircraft.history) == 3
    assert len(aircraft.history[0].inputs["note"]) == NOTE_CHARS and "cut" in aircraft.history[0].inputs["note_cut"]
    assert runner.invoke(app, ["validate", str(path)]).exit_code == 0


def test_a_huge_readings_file_is_kept_as_its_digest(tmp_path):
    path = _trainer(tmp_path)
    count = HISTORY_INPUTS_BYTES // 25  # points of about 100 bytes each: four times the bound the history keeps
    points = "".join(f"[[point]]\nlabel = 'scale {i} {'y' * 40}'\narm = 40.0\nreading = 0.1\n" for i in range(count))
    huge = tmp_path / "huge.toml"
    huge.write_text((tmp_path / "weighing.toml").read_text() + points)
    assert _weigh(path, huge, "--write", "--yes", "--force").exit_code == 0
    (entry,) = load_aircraft(path).history
    assert "abridged" in entry.inputs and entry.inputs["point_count"] == count + 3 and len(entry.inputs["sha256"]) == 64
    assert path.stat().st_size < 64 * 1024


# -- item 6: every layout validate accepts ----------------------------------------------------------


@pytest.mark.parametrize(
    "edit",
    [
        # history as an inline array (the crash of issue 14 item 6)
        lambda t: t.replace(
            "[units]",
            'history = [{recorded = 2020-01-01, reason = "weighing", '
            "previous = {weight = 1600.0, arm = 39.0}}]\n\n[units]",
            1,
        ),
        # [empty] as an inline table
        lambda t: t.replace(
            '[empty]\nweight = 1718.0\narm = 37.20\ndate = 2026-02-09\nbasis = "unusable fuel and full oil included"\n',
            "",
            1,
        ).replace("[units]", "empty = {weight = 1718.0, arm = 37.20, date = 2026-02-09}\n\n[units]", 1),
        # [empty] as dotted keys at the top
        lambda t: t.replace(
            '[empty]\nweight = 1718.0\narm = 37.20\ndate = 2026-02-09\nbasis = "unusable fuel and full oil included"\n',
            "",
            1,
        ).replace('registration = "DEMO-4T"', 'registration = "DEMO-4T"\nempty.weight = 1718.0\nempty.arm = 37.20', 1),
        # history as [[history]] with a [history.previous] sub-table, followed by more tables
        lambda t: t.replace(
            "[limits]",
            '[[history]]\nrecorded = 2020-01-01\nreason = "weighing"\n'
            "[history.previous]\nweight = 1600.0\narm = 39.0\n\n[limits]",
            1,
        ),
    ],
    ids=["inline-history", "inline-empty", "dotted-empty", "history-subtables"],
)
@pytest.mark.parametrize("command", ["weigh", "alter"])
def test_every_toml_layout_is_written_and_read_back(runner, tmp_path, edit, command):
    path = _trainer(tmp_path)
    path.write_text(edit(path.read_text()))
    assert runner.invoke(app, ["validate", str(path)]).exit_code == 0
    before = load_aircraft(path)
    source = tmp_path / ("weighing.toml" if command == "weigh" else "changes.toml")
    result = runner.invoke(app, [command, str(path), str(source), "--write", "--yes"])
    assert result.exit_code == 0, result.output
    after = load_aircraft(path)
    assert len(after.history) == len(before.history) + 1 and after.history[-1].previous.weight == 1718.0
    assert after.empty.weight != 1718.0


def test_an_inline_equipment_list_stays_inline(runner, tmp_path):
    path = _trainer(tmp_path)
    text = path.read_text()
    inline = (
        'equipment = [{id = "com2", weight = 3.1, arm = 17.0}, {id = "elt", weight = 2.4, arm = 140.0}, '
        '{id = "fairings", weight = 18.0, arm = 48.0}]\n\n'
    )
    path.write_text(text[: text.index("# Installed equipment")].replace("[units]", inline + "[units]", 1))
    assert runner.invoke(app, ["validate", str(path)]).exit_code == 0
    assert runner.invoke(app, ["alter", str(path), str(tmp_path / "changes.toml"), "--write", "--yes"]).exit_code == 0
    assert {e.id for e in load_aircraft(path).equipment} == {"com2", "elt", "com3"}
    assert "[[equipment]]" not in path.read_text()


def test_regression_an_appended_history_table_had_no_blank_line_before_it(runner, tmp_path):
    """After ``weigh --write`` and ``alter --write`` the aircraft file had ``[[history]]`` straight
    under the last ``[[equipment]]`` line. Each ``[[history]]`` table has one blank line before it,
    the file reads back to the same bytes (a second read and write changes nothing), and no value
    changes: the history holds what was written (common practice for a tidy TOML file; no
    published figure)."""
    import tomlkit

    path = _trainer(tmp_path)
    assert runner.invoke(app, ["weigh", str(path), str(tmp_path / "weighing.toml"), "--write", "--yes"]).exit_code == 0
    assert runner.invoke(app, ["alter", str(path), str(tmp_path / "changes.toml"), "--write", "--yes"]).exit_code == 0
    text = path.read_text(encoding="utf-8")
    lines = text.splitlines()
    headers = [i for i, line in enumerate(lines) if line == "[[history]]"]
    assert len(headers) == 2
    for i in headers:
        assert lines[i - 1] == "" and lines[i - 2] != "", lines[i - 3 : i + 1]  # one blank line, not two
    assert tomlkit.dumps(tomlkit.parse(text)) == text  # byte-stable on a second read and write
    data = tomllib.loads(text)
    assert [h["reason"] for h in data["history"]] == ["weighing", "alteration"]
    assert (
        data["history"][0]["previous"]["weight"] == 1718.0
        and data["history"][1]["new_weight"] == data["empty"]["weight"]
    )


def test_the_history_tidy_adds_a_blank_line_only_where_there_is_none():
    # review 13: the tidy re-spaced every [[history]] of the record, entries nobody touched among them;
    # it adds a blank line only before a table that has none, and never where a value would change
    from loadcheck.files import _tidy_history

    text = "a = 1\n[[history]]\nx = 1\n\n\n[[history]]\nx = 2\n[[history]]\nx = 3\n"
    assert _tidy_history(text) == "a = 1\n\n[[history]]\nx = 1\n\n\n[[history]]\nx = 2\n\n[[history]]\nx = 3\n"
    inside = 'a = """\n[[history]]\n"""\n'  # a string's line: blank line would change its value
    assert _tidy_history(inside) == inside


# -- item 7: lateral CG ------------------------------------------------------------------------------


def _heli(tmp_path: Path, lateral: str) -> tuple[Path, Path]:
    shutil.copy(sample("heli2/aircraft.toml"), tmp_path / "aircraft.toml")
    readings = tmp_path / "readings.toml"
    readings.write_text(
        'format = 1\ndate = 2026-11-30\nweighed_by = "hangar 2"\n'
        + lateral
        + "[[point]]\nlabel = 'front'\narm = 60.0\nreading = 300.0\n"
        + ("lateral_arm = 0.0\n" if not lateral else "")  # on the centreline: said, never guessed
        + "[[point]]\nlabel = 'rear left'\narm = 127.0\nreading = 295.0\n"
        + ("lateral_arm = -20.0\n" if not lateral else "")
        + "[[point]]\nlabel = 'rear right'\narm = 127.0\nreading = 290.0\n"
        + ("lateral_arm = 20.0\n" if not lateral else "")
    )
    return tmp_path / "aircraft.toml", readings


def test_a_lateral_envelope_needs_lateral_readings_or_an_explicit_statement(runner, tmp_path):
    aircraft, readings = _heli(tmp_path, "")
    measured = runner.invoke(app, ["weigh", str(aircraft), str(readings), "--json"])
    assert measured.exit_code == 0, measured.output
    import json

    new = json.loads(measured.stdout)["new"]
    assert new["lateral_arm"] == pytest.approx((290 - 295) * 20 / 885)
    for line in ("lateral_arm = 0.0\n", "lateral_arm = -20.0\n", "lateral_arm = 20.0\n"):
        readings.write_text(readings.read_text().replace(line, ""))
    before = aircraft.read_bytes()
    silent = runner.invoke(app, ["weigh", str(aircraft), str(readings), "--write", "--yes"])
    assert silent.exit_code == 2 and "lateral envelope" in silent.output and "keep_lateral_arm" in silent.output
    assert aircraft.read_bytes() == before
    stated = readings.read_text()
    readings.write_text(stated.replace("format = 1\n", 'format = 1\nkeep_lateral_arm = "yes"\n'))
    guessed = runner.invoke(app, ["weigh", str(aircraft), str(readings)])  # a text is not a TOML true
    assert guessed.exit_code == 2 and "keep_lateral_arm: a yes/no field; got 'yes'" in guessed.output
    readings.write_text(stated.replace("format = 1\n", "format = 1\nkeep_lateral_arm = true\n"))
    kept = runner.invoke(app, ["weigh", str(aircraft), str(readings)])
    assert kept.exit_code == 0 and "the lateral CG was not measured" in kept.output and "0.40 in is kept" in kept.output


# -- item 9: comments -------------------------------------------------------------------------------


def test_a_stale_trailing_comment_does_not_stay_on_the_new_value(tmp_path):
    path = _trainer(tmp_path)
    path.write_text(
        path.read_text()
        .replace("weight = 1718.0", "weight = 1718.0  # last weighing 2019")
        .replace("arm = 37.20", "arm = 37.20 # from the 2019 report")
        .replace(
            'basis = "unusable fuel and full oil included"',
            'basis = "unusable fuel and full oil included"  # per the flight manual',
        )
    )
    assert _weigh(path, tmp_path / "weighing.toml", "--write", "--yes").exit_code == 0
    text = path.read_text()
    assert "last weighing 2019" not in text and "from the 2019 report" not in text
    assert "# per the flight manual" in text and "# maximum except takeoff" in text
    assert tomllib.loads(text)["empty"]["weight"] == pytest.approx(1685.8, abs=0.05)


# -- item 10: the record to sign ----------------------------------------------------------------


def test_the_weighing_record_shows_what_a_signer_needs(tmp_path):
    # issue 14 item 10: date, who weighed, gear and datum geometry, previous and new side by side,
    # extreme loadings, empty-weight CG range, signature block
    html = record_sheet(tmp_path, "weigh", sample("trainer4/aircraft.toml"), sample("trainer4/weighing.toml"))
    assert cell(html, "meta-weighed-on") == "2026-11-28" and cell(html, "meta-weighed-by") == "demo hangar"
    geometry = html[html.index("id='geometry'") :]
    assert "nosewheel" in geometry and "datum forward" in geometry and "57.40 in" in geometry and "65.00 in" in geometry
    assert "Previous record</th><th>As weighed</th><th>New record</th>" in html
    assert "1,718.0 lb" in html and "1,685.8 lb" in html and "2026-02-09" in html  # previous and new
    assert "Empty-weight CG range: not given" in html
    assert "Most forward" in html and "Most rearward" in html and "Limit at its weight" in html
    assert "Most left" not in html  # the trainer has no lateral envelope
    for words in ("Name", "Certificate number", "Signature", "Date", "local aviation authority"):
        assert words in html[html.index("class='caution'") :]
    assert "http" not in html.replace("http-equiv", "")


def test_the_weighing_record_shows_the_lateral_cg(tmp_path):
    shutil.copy(sample("heli2/aircraft.toml"), tmp_path / "aircraft.toml")
    readings = tmp_path / "readings.toml"
    readings.write_text(
        "format = 1\ndate = 2026-11-30\nweighed_by = 'hangar 2'\n"
        "[[point]]\nlabel = 'front'\narm = 60.0\nlateral_arm = 0.0\nreading = 300.0\n"
        "[[point]]\nlabel = 'rear left'\narm = 127.0\nlateral_arm = -20.0\nreading = 295.0\n"
        "[[point]]\nlabel = 'rear right'\narm = 127.0\nlateral_arm = 20.0\nreading = 290.0\n"
    )
    html = record_sheet(tmp_path, "weigh", tmp_path / "aircraft.toml", readings)
    row = html[html.index("<td>lateral CG (+ right)</td>") :]
    row = row[: row.index("</tr>")]
    assert "0.40 in" in row and "-0.11 in" in row  # previous 0.4 in; new (290 - 295) x 20 / 885
    assert "Lateral arm (in, + right)" in html
    # the extreme loadings the record's signer sees are every one extremes checks: left and right too
    # (FAA-H-8083-1B chapter 8, lateral balance), each with its lateral CG and the lateral limit it meets
    from loadcheck import load_aircraft
    from loadcheck.extremes import extremes

    cases = extremes(load_aircraft(tmp_path / "aircraft.toml")).cases
    assert [c.side for c in cases][2:] == ["left", "right"]
    table = html[html.index("class='extremes'") :]
    table = table[: table.index("</table>")]
    for case in cases:
        assert f"Most {case.side}" in table
    assert "normal, left (lb at in)" in html and "normal, right (lb at in)" in html


# -- the extremes of every category with the new record (trial 12, finding 3) ---------------------

HERON_U = """\
format = 1
name = "Heron utility two-seater (invented for trial 12)"
registration = "TX-HR4"
meto_power_hp = 120
standard_occupant_weight = "80 kg"

[units]
mass = "kg"
arm = "cm"
fuel_volume = "l"

[empty]
weight = 520.0
arm = 30.0
lateral_arm = 0.5
date = 2026-05-01
cg_range = [20.0, 40.0]

[limits]
max_takeoff_weight = 800
max_landing_weight = 780

[[station]]
id = "p1"
label = "Left seat"
kind = "seat"
arm = 20.0
lateral_arm = -25.0
max_weight = 120
controls = true

[[station]]
id = "p2"
label = "Right seat"
kind = "seat"
arm = 20.0
lateral_arm = 25.0
max_weight = 120

[[station]]
id = "bag"
label = "Baggage shelf"
kind = "baggage"
arm = 110.0
lateral_arm = 10.0
max_weight = 40

[[station]]
id = "pod"
label = "Belly pod"
kind = "cargo"
arm = 60.0
lateral_arm = 0.0
max_weight = 60

[[station_group]]
id = "aftload"
label = "Shelf and pod"
stations = ["bag", "pod"]
max_weight = 70

[[tank]]
id = "wing"
label = "Wing tank"
usable = 90
fuel = "mogas"
lateral_arm = -5.0
arm_table = [[0, 40.0], [45, 45.0], [90, 38.0]]

[[envelope]]
category = "normal"
label = "longitudinal"
axes = ["arm", "weight"]
points = [[18.0, 550], [26.0, 700], [28.0, 800], [44.0, 800], [48.0, 650], [48.0, 550]]


[[envelope]]
category = "utility"
axes = ["arm", "weight"]
points = [[22.0, 550], [29.0, 720], [40.0, 720], [40.0, 550]]

[[equipment]]
id = "radio"
label = "Radio"
weight = 2.5
arm = 0.0
lateral_arm = 0.0
"""
"""An outside trial's invented side-by-side two-seater (kg, cm, L; trial 12's heron_u.toml): its
utility category's forward edge runs from 22 cm at 550 kg to 29 cm at its top of 720 kg."""

HERON_U_CHANGES = """\
format = 1
aircraft = "heron_u.toml"
date = 2026-11-30
description = "placard added"
[[change]]
action = "install"
item = "placard"
label = "Placard"
weight = 0.1
arm = 30.0
lateral_arm = 0.0
"""


def heron_u(folder: Path) -> tuple[Path, Path]:
    """The trial's aircraft and its changes file (a 0.1 kg placard at 30 cm), written in ``folder``."""
    (folder / "heron_u.toml").write_text(HERON_U)
    (folder / "alt_u.toml").write_text(HERON_U_CHANGES)
    return folder / "heron_u.toml", folder / "alt_u.toml"


def tandem_all_within(folder: Path) -> tuple[Path, Path]:
    """The sample tandem trainer with each seat's maximum at the standard occupant (77 kg, so that
    whole occupants are every load a seat permits) and a roomier aerobatic envelope, so that the
    extremes of both its categories are within limits; and a changes file (a 0.2 kg placard)."""
    text = sample("tandem2/aircraft.toml").read_text()
    assert text.count("max_weight = 110") == 2 and "[335, 630], [350, 450]" in text
    text = text.replace("max_weight = 110", "max_weight = 77").replace(
        "[335, 630], [350, 450]", "[440, 630], [450, 450]"
    )
    (folder / "aircraft.toml").write_text(text)
    (folder / "changes.toml").write_text(
        'format = 1\ndate = 2026-11-30\ndescription = "placard"\n'
        '[[change]]\naction = "install"\nitem = "placard"\nweight = 0.2\narm = 300.0\n'
    )
    return folder / "aircraft.toml", folder / "changes.toml"


def extremes_rows(html: str) -> list[list[str]]:
    """The cells of the record sheet's extremes summary table, a list a row (head row left out)."""
    table = html[html.index("class='extremes'") :]
    table = table[: table.index("</table>")]
    return [re.findall(r"<td[^>]*>([^<]*)</td>", row) for row in table.split("<tr>")[2:]]


def test_regression_the_record_sheet_checked_the_first_category_only(tmp_path):
    # trial 12, finding 3: the record to sign said "Most forward ... within limits" for the normal
    # category alone, unnamed, while `loadcheck extremes -c utility` found the utility forward extreme
    # out of limits. Hand-worked (FAA-H-8083-1B chapter 2): the new empty record is 520.1 kg at
    # 30.0 cm (15,603 kg cm: 15,600 + a 0.1 kg placard at 30 cm); two 80 kg occupants at 20 cm
    # (3,200) and 39.9 kg of fuel (55.5 L at 0.71892 kg/L, 6.0 lb/US gal) at its table's arm
    # 45 - 7 x 10.5 / 45 = 43.367 cm (1,730.3) make 720.0 kg at 20,533.3 / 720 = 28.52 cm, forward
    # of the utility limit there (29.0 cm at 720 kg) by 0.48 cm. The weights permit it (utility top
    # 720 kg; seats at most 120 kg).
    from loadcheck.extremes import extremes

    aircraft, changes = heron_u(tmp_path)
    proposal = propose(aircraft, changes, "alteration")
    assert [e.category for e in proposal.extremes] == ["normal", "utility"]
    utility = proposal.extremes[1]
    assert not utility.ok and utility.complete and utility.checks is not None
    forward = utility.checks.forward
    ramp = forward.check.condition("ramp")
    assert not forward.ok and ramp.weight == pytest.approx(720.0, abs=0.05)
    assert ramp.arm == pytest.approx(28.52, abs=0.01) and forward.limit_arm == pytest.approx(29.0, abs=0.01)
    # each category's checks are the one extremes job's, with the new record
    record = proposal.result.new
    assert record.weight == pytest.approx(520.1) and record.arm == pytest.approx(30.0)
    new = load_aircraft(aircraft).with_empty(record.weight, record.arm, record.lateral_arm)
    for entry in proposal.extremes:
        assert entry.checks is not None and entry.checks.to_dict() == extremes(new, category=entry.category).to_dict()
    assert proposal.extremes_not_ok == ["utility"]

    html = record_sheet(tmp_path, "alter", aircraft, changes)
    verdict = cell(html, "extremes-verdict")
    assert "NOT all within limits" in verdict and "utility category" in verdict and "normal, utility" in verdict
    rows = {(r[0], r[1]): r[-1] for r in extremes_rows(html)}
    assert rows[("utility", "Most forward")] == "NOT within limits"  # never "within limits" beside it
    expected = {
        (e.category, f"Most {c.side}"): ("within limits" if c.ok else "NOT within limits")
        for e in proposal.extremes
        for c in e.checks.cases  # type: ignore[union-attr]
    }
    assert rows == expected  # every category, each row named by its category
    assert "Utility category, most forward: LIMIT ramp CG 28.5 cm is forward" in html
    items = html[html.index("class='extreme-items'") :]
    heads = re.findall(r"<th>([^<]*)</th>", items[: items.index("</tr>")])
    assert heads == ["Item"] + [
        f"{c}, {side} (kg at cm)" for c in ("normal", "utility") for side in ("forward", "rearward")
    ]


def test_a_record_sheet_with_every_category_within_limits_says_so_for_each(tmp_path):
    # the verdict of each category is that category's extremes (loadcheck.extremes.extremes), common practice
    aircraft, changes = tandem_all_within(tmp_path)
    proposal = propose(aircraft, changes, "alteration")
    assert [e.category for e in proposal.extremes] == ["normal", "aerobatic"]
    assert all(e.ok and e.complete for e in proposal.extremes) and not proposal.extremes_not_ok
    html = record_sheet(tmp_path, "alter", aircraft, changes)
    assert cell(html, "extremes-verdict") == "Within limits in every category of the aircraft: normal, aerobatic."
    rows = extremes_rows(html)
    assert [(r[0], r[1], r[-1]) for r in rows] == [
        (category, f"Most {side}", "within limits")
        for category in ("normal", "aerobatic")
        for side in ("forward", "rearward")
    ]
    assert "NOT" not in html[html.index("Extreme loadings") : html.index("class='caution'")]


def _printer() -> str | None:
    return shutil.which("chromium") or shutil.which("chromium-browser")


@pytest.mark.skipif(
    _printer() is None or shutil.which("pdfinfo") is None or shutil.which("pdftotext") is None,
    reason="needs headless chromium and poppler-utils (pdfinfo, pdftotext)",
)
@pytest.mark.parametrize(
    "command, paper",
    [
        ("weigh", "letter"),  # the default run prints one record; the other three (a headless browser each) with --long
        pytest.param("weigh", "A4", marks=pytest.mark.slow),
        pytest.param("alter", "letter", marks=pytest.mark.slow),
        pytest.param("alter", "A4", marks=pytest.mark.slow),
    ],
)
def test_the_printed_record_fits_one_page_with_its_signature_block(tmp_path, command, paper):
    source = sample("trainer4/weighing.toml" if command == "weigh" else "trainer4/changes.toml")
    html = record_sheet(tmp_path, command, sample("trainer4/aircraft.toml"), source)
    assert "@page { size: auto;" in html
    page = tmp_path / f"{paper}.html"  # the paper size a user picks in the print dialogue
    page.write_text(html.replace("@page { size: auto;", f"@page {{ size: {paper};"))
    pdf = tmp_path / f"{paper}.pdf"
    subprocess.run(
        [
            str(_printer()),
            "--headless",
            "--no-sandbox",
            "--disable-gpu",
            "--no-pdf-header-footer",
            f"--user-data-dir={tmp_path / 'profile'}",
            f"--print-to-pdf={pdf}",
            page.as_uri(),
        ],
        check=True,
        capture_output=True,
        timeout=120,
    )
    info = subprocess.run(["pdfinfo", str(pdf)], check=True, capture_output=True, text=True).stdout
    assert "Pages:           1" in info, info
    assert ("letter" if paper == "letter" else "A4") in info
    first = subprocess.run(
        ["pdftotext", "-f", "1", "-l", "1", "-layout", str(pdf), "-"], check=True, capture_output=True, text=True
    ).stdout
    for words in ("Certificate number", "Signature", "Most rearward", "Empty-weight CG range", "CAUTION"):
        assert words in first


_copy_trainer = _trainer  # the tests moved from test_mechanic.py call it so


@pytest.mark.parametrize("failure", ["replace", "disk_full"])
def test_a_crash_during_the_write_leaves_the_file_whole(runner, tmp_path, monkeypatch, failure):
    path = _copy_trainer(tmp_path)
    before = path.read_bytes()
    if failure == "replace":

        def boom(*args, **kwargs):
            raise OSError(errno.EIO, "simulated crash")

        monkeypatch.setattr(files_module.os, "replace", boom)
    else:
        real_fdopen = os.fdopen

        class Full:
            def __init__(self, handle):
                self.stream = real_fdopen(handle, "wb")

            def __enter__(self):
                return self

            def __exit__(self, *exc):
                self.stream.close()

            def write(self, data):
                self.stream.write(data[: len(data) // 2])
                raise OSError(errno.ENOSPC, "No space left on device")

        monkeypatch.setattr(files_module.os, "fdopen", lambda handle, mode: Full(handle))
    result = runner.invoke(app, ["weigh", str(path), str(tmp_path / "weighing.toml"), "--write", "--yes"])
    assert result.exit_code == 2
    assert "unchanged" in result.output
    assert path.read_bytes() == before
    assert not [p for p in tmp_path.iterdir() if p.name.endswith(".tmp")]


def test_file_changed_between_read_and_write_is_refused(runner, tmp_path, monkeypatch):
    path = _copy_trainer(tmp_path)
    import loadcheck.weighing as weighing_module

    real = weighing_module.weigh

    def weigh_and_meddle(*args, **kwargs):
        result = real(*args, **kwargs)
        path.write_text(path.read_text() + "\n# edited by someone else\n")
        return result

    monkeypatch.setattr(weighing_module, "weigh", weigh_and_meddle)
    result = runner.invoke(app, ["weigh", str(path), str(tmp_path / "weighing.toml"), "--write", "--yes"])
    assert result.exit_code == 2 and "changed since it was read" in result.output
    assert path.read_text().endswith("# edited by someone else\n")
    assert "[[history]]" not in path.read_text()


# -- the record's date: used as given or refused --------------------------------------------------
# The weight and balance record carries the date of the weighing or of the change (14 CFR 43.9 (a)
# (2), the date the work was completed; FAA-H-8083-1B chapter 2, the current record; from memory).


def _undated(tmp_path: Path, name: str) -> Path:
    """The sample readings or changes file with its ``date =`` line left out."""
    path = tmp_path / f"undated_{name}"
    lines = (tmp_path / name).read_text().splitlines(keepends=True)
    path.write_text("".join(line for line in lines if not line.startswith("date =")))
    return path


@pytest.mark.parametrize("command, name", [("weigh", "weighing.toml"), ("alter", "changes.toml")])
def test_regression_a_record_without_its_date_kept_the_replaced_records_date(tmp_path, command, name):
    # `weigh/alter --write --yes` without `date =` wrote a new [empty] with the old date 2026-02-09
    path = _trainer(tmp_path)
    before = path.read_bytes()
    source = _undated(tmp_path, name)
    runner = app_runner()
    written = runner.invoke(app, [command, str(path), str(source), "--write", "--yes"])
    file_words = "readings file" if command == "weigh" else "changes file"
    assert written.exit_code == 2, written.output
    said = " ".join(written.output.split())
    assert f"date: not written: the {file_words} gives no date (its date field)" in said
    assert f"add date = YYYY-MM-DD to the {file_words}" in said
    assert "--force" not in said  # no override writes an undated record
    assert path.read_bytes() == before
    # without --write the proposal is shown, says the date is missing, and never gives the old one as the new
    shown = runner.invoke(app, [command, str(path), str(source), "--json"])
    assert shown.exit_code == 0, shown.output
    data = json.loads(shown.stdout)
    assert "date" not in data  # None is left out of the JSON
    assert [r["code"] for r in data["refusals"]] == ["no_date"] and data["refusals"][0]["field"] == "date"
    (row,) = [r for r in data["comparison"] if r["quantity"] == "record date"]
    assert row == {**row, "current": "2026-02-09", "new": "missing (the date field of the file)"}
    text = " ".join(runner.invoke(app, [command, str(path), str(source)]).output.split())
    assert "NEVER WRITTEN" in text and "gives no date" in text
    sheet = tmp_path / "sheet.html"
    assert runner.invoke(app, [command, str(path), str(source), "--sheet", str(sheet)]).exit_code == 0
    html = sheet.read_text()
    assert "missing (the date field of the file)" in html and "gives no date" in html
    assert html.count("2026-02-09") == 1  # the current record's date, once, in the comparison


def test_regression_the_library_write_carried_the_old_date_over(tmp_path):
    # write_new_record kept [empty] date when given none: the library refuses it too, whatever the caller
    path = _trainer(tmp_path)
    original = path.read_bytes()
    with pytest.raises(LoadcheckError, match="needs its own date"):
        files_module.write_new_record(
            path, original, weight=1700.0, arm=40.0, lateral_arm=None, date=None, reason="weighing", inputs={}
        )
    assert path.read_bytes() == original


def test_regression_a_future_date_was_written(tmp_path):
    # date = 2030-01-01 became the current record; the latest date anywhere on Earth is the check
    path = _trainer(tmp_path)
    before = path.read_bytes()
    ahead = (dt.datetime.now(dt.UTC) + dt.timedelta(days=2)).date().isoformat()
    for command, name in (("weigh", "weighing.toml"), ("alter", "changes.toml")):
        source = tmp_path / f"ahead_{name}"
        source.write_text(re.sub(r"(?m)^date = \S+", f"date = {ahead}", (tmp_path / name).read_text()))
        result = _run(command, path, source, "--write", "--yes", "--force")
        said = " ".join(result.output.split())
        assert result.exit_code == 2 and "date: not written: the date of the " in said, said
        assert f"{ahead} (the " in said and "has not come yet" in said
    assert path.read_bytes() == before


def test_a_date_is_accepted_while_it_is_today_somewhere_on_earth(tmp_path):
    # UTC+14 (Line Islands, Kiribati; from memory) is the earliest zone: 2026-12-04 is today there from
    # 2026-12-03 10:00 UTC; the day after is not today anywhere
    path = _trainer(tmp_path)
    for day, hour, codes in (
        ("2026-12-03", 0, []),
        ("2026-12-04", 9, ["future_date"]),
        ("2026-12-04", 10, []),
        ("2026-12-05", 23, ["future_date"]),
    ):
        source = tmp_path / "readings.toml"
        source.write_text(re.sub(r"(?m)^date = \S+", f"date = {day}", (tmp_path / "weighing.toml").read_text()))
        now = dt.datetime(2026, 12, 3, hour, 0, 59, tzinfo=dt.UTC)
        proposal = propose(path, source, "weighing", now=now)
        assert [r.code for r in proposal.result.refusals] == codes, (day, hour)
    # a clock given in a local zone is read as the same instant
    source.write_text(re.sub(r"(?m)^date = \S+", "date = 2026-12-04", (tmp_path / "weighing.toml").read_text()))
    later = dt.datetime(2026, 12, 3, 12, 0, tzinfo=dt.timezone(dt.timedelta(hours=2)))  # 10:00 UTC
    assert propose(path, source, "weighing", now=later).result.refusals == []


def test_regression_an_earlier_date_replaced_the_current_record_without_a_word(tmp_path):
    # date = 2020-01-01 replaced the record of 2026-02-09 silently; now it needs --force, kept in the history
    path = _trainer(tmp_path)
    before = path.read_bytes()
    source = tmp_path / "readings.toml"
    source.write_text(re.sub(r"(?m)^date = \S+", "date = 2020-01-01", (tmp_path / "weighing.toml").read_text()))
    refused = _weigh(path, source, "--write", "--yes")
    said = " ".join(refused.output.split())
    assert refused.exit_code == 2 and path.read_bytes() == before
    assert (
        "date: not written: the date of the weighing, 2020-01-01 (the readings file's date field), is before "
        "the current record's date 2026-02-09" in said
    )
    assert "give --force with --write to write it anyway" in said
    forced = _weigh(path, source, "--write", "--yes", "--force")
    assert forced.exit_code == 0, forced.output
    written = load_aircraft(path)
    assert str(written.empty.date) == "2020-01-01"
    assert any(o.startswith("date_before_current: ") for o in written.history[-1].overrides)
    assert str(written.history[-1].previous.date) == "2026-02-09"


def test_the_same_date_as_the_current_record_is_written(tmp_path):
    # a second weighing on the day of the first is ordinary (common practice: weighed again after a fix)
    path = _trainer(tmp_path)
    source = tmp_path / "readings.toml"
    source.write_text(re.sub(r"(?m)^date = \S+", "date = 2026-02-09", (tmp_path / "weighing.toml").read_text()))
    assert _weigh(path, source, "--write", "--yes").exit_code == 0
    assert str(load_aircraft(path).empty.date) == "2026-02-09"


def _run(command: str, path: Path, source: Path, *options: str):
    return app_runner().invoke(app, [command, str(path), str(source), *options])


# -- the aircraft a readings or changes file names (trial 9, item 2) -------------------------------
# A weighing or alteration record belongs to the aircraft weighed or changed (FAA-H-8083-1B
# chapter 3, from memory; common practice): a file naming another aircraft file is refused.


@pytest.mark.parametrize("kind, name", [("weighing", "weighing.toml"), ("alteration", "changes.toml")])
def test_regression_a_file_naming_another_aircraft_was_computed_for_the_one_given(tmp_path, kind, name):
    path = _trainer(tmp_path)
    other = tmp_path / "other.toml"  # a copy is another aircraft file: the file names aircraft.toml
    shutil.copy(path, other)
    with pytest.raises(LoadcheckError, match=r"aircraft: these (readings|changes) are for the aircraft file") as error:
        propose(other, tmp_path / name, kind)
    assert error.value.file == str(tmp_path / name)
    assert str(tmp_path / "aircraft.toml") in str(error.value) and str(other) in str(error.value)


@pytest.mark.parametrize("kind, name", [("weighing", "weighing.toml"), ("alteration", "changes.toml")])
def test_the_aircraft_named_is_the_one_given_by_any_path(tmp_path, monkeypatch, kind, name):
    _trainer(tmp_path)
    (tmp_path / "sub").mkdir()
    monkeypatch.chdir(tmp_path / "sub")
    assert propose(Path("../aircraft.toml"), tmp_path / name, kind).result.new.weight > 0
    source = tmp_path / "sub" / name  # named relative to its own folder
    text = (tmp_path / name).read_text()
    source.write_text(text.replace('aircraft = "aircraft.toml"', 'aircraft = "../aircraft.toml"'))
    assert propose(tmp_path / "aircraft.toml", source, kind).result.new.weight > 0
    # read against another folder (the desk's upload stands for a file beside the aircraft file)
    assert propose(tmp_path / "aircraft.toml", source, kind, relative_to=tmp_path / "sub").result.new.weight > 0
    with pytest.raises(LoadcheckError, match="these"):
        propose(tmp_path / "aircraft.toml", source, kind, relative_to=tmp_path)


@pytest.mark.parametrize("command, name", [("weigh", "weighing.toml"), ("alter", "changes.toml")])
def test_regression_weigh_and_alter_wrote_one_aircrafts_record_into_anothers(runner, tmp_path, command, name):
    path = _trainer(tmp_path)
    other = sample("tandem2/aircraft.toml")
    target = tmp_path / "tandem.toml"
    shutil.copy(other, target)
    before = target.read_bytes()
    result = runner.invoke(app, [command, str(target), str(tmp_path / name), "--write", "--yes"])
    assert_input_error(result, "aircraft:", str(path), str(target))
    assert target.read_bytes() == before


# -- the record written is the one shown (trial 9, item 9) ------------------------------------------


@pytest.mark.parametrize(
    "command, kind, name", [("weigh", "weighing", "weighing.toml"), ("alter", "alteration", "changes.toml")]
)
def test_regression_the_written_record_was_rounded_to_4_decimals(runner, tmp_path, command, kind, name):
    path = _trainer(tmp_path)
    shown = propose(path, tmp_path / name, kind).result.new
    shown_json = json.loads(runner.invoke(app, [command, str(path), str(tmp_path / name), "--json"]).stdout)["new"]
    assert runner.invoke(app, [command, str(path), str(tmp_path / name), "--write", "--yes"]).exit_code == 0
    written = tomllib.loads(path.read_text())
    # exactly: the figures shown and confirmed are the figures written (a float's repr reads back exactly)
    assert written["empty"]["weight"] == shown.weight == shown_json["weight"]
    assert written["empty"]["arm"] == shown.arm == shown_json["arm"]
    assert written["history"][-1]["new_weight"] == shown.weight and written["history"][-1]["new_arm"] == shown.arm
    assert round(shown.arm, 4) != shown.arm or round(shown.weight, 4) != shown.weight  # the rounding would show
    now = load_aircraft(path).empty
    assert (now.weight, now.arm) == (shown.weight, shown.arm)
    assert now.moment == pytest.approx(shown.moment, rel=1e-12)  # weight x arm against the sum of moments: float noise
