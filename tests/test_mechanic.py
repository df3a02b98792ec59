"""The mechanic's side: weighing, equipment changes, history, extreme loadings, schedule.

Sources named beside each check:
- FAA-H-8083-1B, chapter "Use of Computer for Weight and Balance Computations" (electronic
  calculator example): nose-wheel net weight F = 340 lb, main wheels to nose wheel
  L = -78 in, total W = 2,006 lb: CG = F x L / W = -13.2 in from the main-wheel weighing points.
- FAA-H-8083-1 chapter 3, the four empty-weight CG formulas (from memory).
- AC 43.13-1B chapter 10, figure 10-10 (most forward extreme: 1,439 lb, 16,104 in-lb,
  CG +11.2 in) and figure 10-11 (most rearward extreme: 2,036 lb, 43,428 in-lb, CG 21.3 in
  against the 21.9 in limit); paragraph 10-2 c (negligible change) and 10-2 p (minimum fuel).
"""

from __future__ import annotations

import errno
import os
import shutil
from pathlib import Path

import pytest
from hypothesis import given, settings
from hypothesis import strategies as st
from typer.testing import CliRunner

import loadcheck.files as files_module
from loadcheck import load_aircraft
from loadcheck.alterations import Changes, alter, negligible_weight_lb
from loadcheck.cli import app
from loadcheck.errors import UnknownNameError
from loadcheck.files import parse_aircraft
from loadcheck.weighing import Readings, weigh

from .helpers import sample, sample_data

runner = CliRunner()


def box(**changes):
    data = {
        "name": "Weighing box", "units": {"mass": "lb", "arm": "in", "fuel_volume": "usgal"},
        "empty": {"weight": 2000.0, "arm": 0.0}, "limits": {"max_takeoff_weight": 3000},
        "envelope": [{"category": "normal", "axes": ["arm", "weight"], "points": [[-50, 500], [-50, 3000], [90, 3000], [90, 500]]}],
    }
    data.update(changes)
    return parse_aircraft(data)


def test_faa_h_8083_1b_electronic_calculator_example():
    # FAA-H-8083-1B: F = 340 lb, L = -78 in (nose ahead of mains), W = 2,006 lb -> -13.2 in
    readings = Readings.model_validate({
        "geometry": {"gear": "nosewheel", "datum": "forward", "main_distance": 0.0, "wheelbase": 78.0},
        "point": [{"label": "nose", "wheel": "nose", "reading": 340.0},
                  {"label": "left", "wheel": "main", "reading": 833.0}, {"label": "right", "wheel": "main", "reading": 833.0}],
    })
    result = weigh(box(), readings)
    assert result.as_weighed.weight == pytest.approx(2006.0)
    assert result.as_weighed.arm == pytest.approx(340.0 * -78.0 / 2006.0)
    assert round(result.as_weighed.arm, 1) == -13.2
    assert result.formula_cg == pytest.approx(result.as_weighed.arm)


@settings(max_examples=200, deadline=None)
@given(st.sampled_from(["nosewheel", "tailwheel"]), st.sampled_from(["forward", "aft"]),
       st.floats(0, 200), st.floats(20, 300), st.floats(10, 2000), st.floats(100, 5000), st.floats(100, 5000))
def test_four_formulas_agree_with_the_sum_of_moments(gear, datum, d, length, other, left, right):
    # FAA-H-8083-1 ch. 3 (from memory): D - F L/W; -(D + F L/W); D + R L/W; -D + R L/W
    wheel = "nose" if gear == "nosewheel" else "tail"
    readings = Readings.model_validate({
        "geometry": {"gear": gear, "datum": datum, "main_distance": d, "wheelbase": length},
        "point": [{"label": wheel, "wheel": wheel, "reading": other}, {"label": "l", "wheel": "main", "reading": left},
                  {"label": "r", "wheel": "main", "reading": right}],
    })
    result = weigh(box(), readings)
    w = other + left + right
    expected = {
        ("nosewheel", "forward"): d - other * length / w,
        ("nosewheel", "aft"): -(d + other * length / w),
        ("tailwheel", "forward"): d + other * length / w,
        ("tailwheel", "aft"): -d + other * length / w,
    }[(gear, datum)]
    assert result.as_weighed.arm == pytest.approx(expected, rel=1e-9, abs=1e-9)
    assert result.formula_cg == pytest.approx(expected, rel=1e-9, abs=1e-9)


def test_corrections_and_lateral_readings():
    readings = Readings.model_validate({
        "point": [{"label": "nose", "arm": -10.0, "reading": 300.0, "tare": 5.0},
                  {"label": "left", "arm": 60.0, "lateral_arm": -50.0, "reading": 800.0, "tare": 4.0},
                  {"label": "right", "arm": 60.0, "lateral_arm": 50.0, "reading": 820.0, "tare": 4.0}],
        "on_board": [{"label": "fuel", "weight": 30.0, "arm": 48.0}],
        "missing": [{"label": "battery", "weight": 25.0, "arm": -20.0}],
    })
    result = weigh(box(), readings)
    w = 295 + 796 + 816
    m = 295 * -10 + (796 + 816) * 60
    assert result.as_weighed.weight == pytest.approx(w)
    assert result.new.weight == pytest.approx(w - 30 + 25)
    assert result.new.moment == pytest.approx(m - 30 * 48 + 25 * -20)
    assert result.as_weighed.lateral_arm == pytest.approx((816 - 796) * 50 / w)


def test_empty_weight_cg_range_warning():
    aircraft = box(empty={"weight": 2000.0, "arm": 0.0, "cg_range": [10.0, 20.0]})
    readings = Readings.model_validate({"point": [{"label": "p", "arm": 0.0, "reading": 2000.0}]})
    assert any("empty-weight CG range" in w for w in weigh(aircraft, readings).warnings)


@pytest.mark.parametrize("empty, limit", [(1500, 1.0), (4999, 1.0), (5001, 2.0), (50_000, 2.0), (60_000, 5.0)])
def test_negligible_weight_thresholds(empty, limit):
    # AC 43.13-1B 10-2 c
    assert negligible_weight_lb(empty) == limit


def test_alteration_arithmetic_and_negligible():
    aircraft = load_aircraft(sample("trainer4/aircraft.toml"))
    changes = Changes.model_validate({"change": [
        {"action": "install", "item": "com3", "weight": 4.2, "arm": 14.8},
        {"action": "remove", "item": "fairings"},
        {"action": "relocate", "item": "elt", "new_arm": 118.0},
    ]})
    result = alter(aircraft, changes)
    assert result.change_weight == pytest.approx(4.2 - 18.0)
    assert result.new.moment == pytest.approx(aircraft.empty.moment + 4.2 * 14.8 - 18.0 * 48.0 + 2.4 * (118.0 - 140.0))
    assert result.change_useful_load == pytest.approx(18.0 - 4.2)
    assert result.negligible.overall is False
    tiny = alter(aircraft, Changes.model_validate({"change": [{"action": "install", "item": "placard", "weight": 0.05, "arm": 40.0}]}))
    assert tiny.negligible.weight and tiny.negligible.cg and tiny.negligible.overall
    with pytest.raises(UnknownNameError, match="unknown item 'ghost'"):
        alter(aircraft, Changes.model_validate({"change": [{"action": "remove", "item": "ghost"}]}))


def _copy_trainer(tmp_path: Path) -> Path:
    for name in ("aircraft.toml", "changes.toml", "weighing.toml"):
        shutil.copy(sample(f"trainer4/{name}"), tmp_path / name)
    return tmp_path / "aircraft.toml"


def test_history_keeps_every_record_and_the_comments(tmp_path):
    path = _copy_trainer(tmp_path)
    original = load_aircraft(path)
    assert runner.invoke(app, ["alter", str(path), str(tmp_path / "changes.toml"), "--write", "--yes"]).exit_code == 0
    altered = load_aircraft(path)
    assert runner.invoke(app, ["weigh", str(path), str(tmp_path / "weighing.toml"), "--write", "--yes"]).exit_code == 0
    final = load_aircraft(path)
    assert [h.reason for h in final.history] == ["alteration", "weighing"]
    assert final.history[0].previous == original.empty
    assert final.history[1].previous == altered.empty
    assert "fairings" not in {e.id for e in final.equipment} and "com3" in {e.id for e in final.equipment}
    text = path.read_text()
    assert "# Four-seat nosewheel trainer: an aircraft of our own invention" in text
    assert "meto_power_hp = 160   # maximum except takeoff" in text
    listing = runner.invoke(app, ["history", str(path)])
    assert listing.exit_code == 0 and "alteration" in listing.output and "weighing" in listing.output


def test_without_write_nothing_changes(tmp_path):
    path = _copy_trainer(tmp_path)
    before = path.read_bytes()
    assert runner.invoke(app, ["weigh", str(path), str(tmp_path / "weighing.toml")]).exit_code == 0
    assert path.read_bytes() == before


@pytest.mark.parametrize("failure", ["replace", "disk_full"])
def test_a_crash_during_the_write_leaves_the_file_whole(tmp_path, monkeypatch, failure):
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


def test_file_changed_between_read_and_write_is_refused(tmp_path, monkeypatch):
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


@pytest.mark.parametrize(
    "command, text, words",
    [
        ("weigh", "[[point]]\nlabel = 'nose'\narm = -6.8\nreading = 10.0\ntare = 12.0\n", "tare (12) is above the reading (10)"),
        ("alter", "[[change]]\naction = 'remove'\nitem = 'ghost'\n", "unknown item 'ghost'"),
        ("alter", "[[change]]\naction = 'relocate'\nitem = 'elt'\n", "needs its new_arm"),
        ("weigh", "[[point]]\nlabel = 'nose'\nwheel = 'nose'\nreading = 10.0\n", "[geometry]"),
        ("alter", "[[change]]\naction = 'install'\nitem = 'elt'\nweight = 1.0\narm = 2.0\n", "already installed"),
    ],
)
def test_bad_mechanic_inputs_write_nothing(tmp_path, command, text, words):
    path = _copy_trainer(tmp_path)
    before = path.read_bytes()
    bad = tmp_path / "bad.toml"
    bad.write_text("format = 1\n" + text)
    result = runner.invoke(app, [command, str(path), str(bad), "--write", "--yes"])
    assert result.exit_code == 2, result.output
    assert words in result.output and "Traceback" not in result.output
    assert path.read_bytes() == before


def test_mechanic_sheet(tmp_path):
    sheet = tmp_path / "record.html"
    result = runner.invoke(app, ["weigh", str(sample("trainer4/aircraft.toml")), str(sample("trainer4/weighing.toml")),
                                 "--sheet", str(sheet)])
    assert result.exit_code == 0
    html = sheet.read_text()
    for words in ("Certificate number", "Signature", "local aviation authority", "Most forward", "1,685.8"):
        assert words in html
    assert "http" not in html.replace("http-equiv", "")


def test_readings_with_units_and_fuel_item():
    aircraft = load_aircraft(sample("tandem2/aircraft.toml"))
    data = sample_data("trainer4/weighing.toml")
    del data["geometry"]
    data["point"] = [{"label": "tail", "arm": "4.2 m", "reading": "30 kg"}, {"label": "mains", "arm": 0.0, "reading": "400 kg"}]
    data["on_board"] = [{"label": "fuel", "tank": "wing", "fuel": "2 usgal"}]
    data["missing"] = []
    result = weigh(aircraft, Readings.model_validate(data, context={"units": aircraft.units}))
    assert result.as_weighed.weight == pytest.approx(430.0)
    assert result.as_weighed.arm == pytest.approx(30 * 4200 / 430)
    assert result.corrections[0].weight == pytest.approx(2 * 3.785411784 * aircraft.density(aircraft.tank_by_id["wing"]))
