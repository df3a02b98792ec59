"""Equipment changes (loadcheck/alterations.py): the arithmetic, the negligible-change rule and
the new record's checks, on fixed wing and rotorcraft (issue 14 items 1 and 8).

Sources: AC 43.13-1B (1998) chapter 10, paragraph 10-2 c (negligible change).
"""

from __future__ import annotations

import datetime as dt
import json
import shutil
from pathlib import Path

import pytest

from loadcheck import load_aircraft
from loadcheck.alterations import Changes, alter, negligible_weight_lb
from loadcheck.cli import app
from loadcheck.errors import InputError, UnknownNameError
from loadcheck.files import parse_aircraft
from loadcheck.weighing import current_record_warnings

from .helpers import cell, record_sheet, sample, sample_data


def _trainer_with_range(tmp_path: Path, cg_range: str) -> Path:
    for name in ("aircraft.toml", "changes.toml"):
        shutil.copy(sample(f"trainer4/{name}"), tmp_path / name)
    path = tmp_path / "aircraft.toml"
    path.write_text(path.read_text().replace("basis = ", f"cg_range = {cg_range}\nbasis = ", 1))
    return path


def test_alter_warns_when_the_new_cg_leaves_the_empty_weight_cg_range(runner, tmp_path):
    # the sample changes move the empty-weight CG from 37.20 in forward to about 37.0 in
    path = _trainer_with_range(tmp_path, "[37.1, 38.0]")
    result = alter(load_aircraft(path), Changes.model_validate(sample_data("trainer4/changes.toml")))
    assert result.new.arm < 37.1
    assert any("outside the empty-weight CG range 37.10 in to 38.00 in (forward of it by" in w for w in result.warnings)
    shown = runner.invoke(
        app, ["alter", str(path), str(tmp_path / "changes.toml"), "--sheet", str(tmp_path / "r.html")]
    )
    assert shown.exit_code == 0 and "WARNING" in shown.output and "empty-weight CG range" in shown.output
    html = (tmp_path / "r.html").read_text()
    assert "OUTSIDE IT" in html and "37.10 in to 38.00 in" in html
    as_json = runner.invoke(app, ["alter", str(path), str(tmp_path / "changes.toml"), "--json"])
    assert any("empty-weight CG range" in w for w in json.loads(as_json.stdout)["warnings"])


def test_inside_the_range_no_warning(tmp_path):
    path = _trainer_with_range(tmp_path, "[36.0, 38.0]")
    result = alter(load_aircraft(path), Changes.model_validate(sample_data("trainer4/changes.toml")))
    assert result.warnings == [] and result.cg_range == (36.0, 38.0)


def test_a_current_record_outside_its_range_is_flagged_by_history(runner, tmp_path):
    path = _trainer_with_range(tmp_path, "[38.0, 40.0]")  # the current record's CG, 37.20 in, is forward of it
    assert current_record_warnings(load_aircraft(path))
    listing = runner.invoke(app, ["history", str(path)])
    assert "Empty-weight CG range: 38 to 40 in" in listing.output and "WARNING" in listing.output
    assert "WARNING" not in runner.invoke(app, ["history", str(sample("trainer4/aircraft.toml"))]).output


@pytest.mark.parametrize("aircraft_file", ["heli2/aircraft.toml"])
def test_alter_json_on_a_rotorcraft(runner, tmp_path, aircraft_file):
    # issue 14 item 8: "Object of type bool is not JSON serializable" (a numpy bool from the CG range)
    changes = tmp_path / "changes.toml"
    changes.write_text(
        'format = 1\ndate = 2026-11-30\ndescription = "cargo hook"\n'
        "[[change]]\naction = 'install'\nitem = 'hook'\nweight = 6.0\narm = 105.0\nlateral_arm = 0.0\n"
    )
    result = runner.invoke(app, ["alter", str(sample(aircraft_file)), str(changes), "--json"])
    assert result.exit_code == 0, result.output
    data = json.loads(result.stdout)
    assert data["negligible"]["cg"] in (True, False) and data["negligible"]["weight"] is False
    assert data["description"] == "cargo hook" and data["date"] == "2026-11-30"


def test_rotorcraft_negligible_cg_rule_gives_plain_booleans():
    # AC 43.13-1B 10-2 c: rotorcraft, less than 0.2 % of the maximum allowable CG range
    aircraft = load_aircraft(sample("heli2/aircraft.toml"))
    tiny = alter(
        aircraft,
        Changes.model_validate(
            {
                "change": [
                    {"action": "install", "item": "p", "weight": 0.2, "arm": aircraft.empty.arm, "lateral_arm": 0.0}
                ]
            }
        ),
    )
    assert type(tiny.negligible.cg) is bool and type(tiny.negligible.weight) is bool
    assert tiny.negligible.overall is True


def test_an_alteration_that_leaves_no_useful_load_is_refused():
    aircraft = parse_aircraft({**sample_data("trainer4/aircraft.toml")})
    big = alter(
        aircraft,
        Changes.model_validate(
            {"date": "2026-11-29", "change": [{"action": "install", "item": "tank", "weight": 800.0, "arm": 40.0}]}
        ),
        now=dt.datetime(2026, 12, 3, 8, 0, tzinfo=dt.UTC),
    )
    assert [r.code for r in big.refusals] == ["no_useful_load", "implausible_change"]
    assert not big.refusals[0].overridable and big.refusals[1].overridable


def test_the_alteration_record_shows_the_description_and_date(tmp_path):
    html = record_sheet(tmp_path, "alter", sample("trainer4/aircraft.toml"), sample("trainer4/changes.toml"))
    assert cell(html, "meta-changes-of") == "2026-11-29"
    assert cell(html, "meta-description") == "Radio installed, wheel fairings removed, ELT relocated"
    assert "Previous record</th><th>New record</th><th>Change</th>" in html
    assert "Most forward" in html and "Empty-weight CG range" in html and "Certificate number" in html


@pytest.mark.parametrize("empty, limit", [(1500, 1.0), (4999, 1.0), (5001, 2.0), (50_000, 2.0), (60_000, 5.0)])
def test_negligible_weight_thresholds(empty, limit):
    # AC 43.13-1B 10-2 c
    assert negligible_weight_lb(empty) == limit


def test_alteration_arithmetic_and_negligible():
    aircraft = load_aircraft(sample("trainer4/aircraft.toml"))
    changes = Changes.model_validate(
        {
            "change": [
                {"action": "install", "item": "com3", "weight": 4.2, "arm": 14.8},
                {"action": "remove", "item": "fairings"},
                {"action": "relocate", "item": "elt", "new_arm": 118.0},
            ]
        }
    )
    result = alter(aircraft, changes)
    assert result.change_weight == pytest.approx(4.2 - 18.0)
    assert result.new.moment == pytest.approx(aircraft.empty.moment + 4.2 * 14.8 - 18.0 * 48.0 + 2.4 * (118.0 - 140.0))
    assert result.change_useful_load == pytest.approx(18.0 - 4.2)
    assert result.negligible.overall is False
    tiny = alter(
        aircraft,
        Changes.model_validate({"change": [{"action": "install", "item": "placard", "weight": 0.05, "arm": 40.0}]}),
    )
    assert tiny.negligible.weight and tiny.negligible.cg and tiny.negligible.overall
    with pytest.raises(UnknownNameError, match="unknown item 'ghost'"):
        alter(aircraft, Changes.model_validate({"change": [{"action": "remove", "item": "ghost"}]}))


def test_regression_negligible_verdict_reads_as_a_plain_sentence(runner):
    """The 10-2 c line read "weight: no, 1 lb or less (empty weight 1,718 lb)"; it is now one sentence
    giving each change against its threshold. AC 43.13-1B 10-2 c: 1 lb or less at an empty weight
    under 5,000 lb, a CG change of less than 0.05 % MAC (trainer4's MAC is 55.0 in: 0.0275 in)."""
    result = runner.invoke(app, ["alter", str(sample("trainer4/aircraft.toml")), str(sample("trainer4/changes.toml"))])
    text = " ".join(result.output.split())
    # changes.toml: +4.2 lb (installed) - 18.0 lb (fairings, from the equipment list) = -13.8 lb
    assert (
        "AC 43.13-1B 10-2 c: the change is not negligible: the weight changes by -13.8 lb, more than the 1 lb "
        "that is negligible at an empty weight of 1,718 lb, and the CG moves -0.20 in, not less than 0.05 % MAC "
        "(0.0275 in)." in text
    )
    assert "weight: no" not in text


def test_regression_every_change_of_an_alteration_carries_its_sign(runner):
    """weigh and alter printed a gain without a + sign. Moments by FAA-H-8083-1B chapter 2 (weight x arm):
    the radio +4.2 lb x 14.8 in = +62 lb-in, the fairings -18.0 lb x 48.0 in = -864 lb-in, the ELT
    2.4 lb x (118.0 - 140.0) in = -53 lb-in (its weight unchanged: 0.0, no sign)."""
    result = runner.invoke(app, ["alter", str(sample("trainer4/aircraft.toml")), str(sample("trainer4/changes.toml"))])
    rows = {line.split("│")[1].strip(): line for line in result.output.splitlines() if line.count("│") > 5}
    assert "+4.2" in rows["install"] and "+62" in rows["install"]
    assert "-18.0" in rows["remove"] and "-864" in rows["remove"]
    assert "-53" in rows["relocate"] and "+0.0" not in rows["relocate"]
    text = " ".join(result.output.split())
    # the useful load grows by what the empty weight loses
    assert "Change from the current record: weight -13.8 lb, CG -0.20 in; useful load 745.8 lb (+13.8 lb)" in text


def test_an_item_installed_on_a_lateral_aircraft_needs_its_lateral_arm():
    """heli2 limits the lateral CG (empty 962.0 lb at 99.40 in, 0.40 in right). An invented cargo hook,
    6.0 lb at 105.0 in, installed without a lateral arm was taken as on the centreline; it is refused.
    Given 10.0 in right, by the moment method (FAA-H-8083-1B chapter 2, added weight): weight 968.0 lb,
    CG (962 x 99.4 + 6 x 105) / 968 = 96,252.8 / 968 = 99.435 in, lateral CG (962 x 0.4 + 6 x 10) / 968
    = 444.8 / 968 = 0.4595 in."""
    aircraft = load_aircraft(sample("heli2/aircraft.toml"))
    hook = {"action": "install", "item": "hook", "weight": 6.0, "arm": 105.0}
    with pytest.raises(InputError, match=r"change\[0\]\.lateral_arm: installed item 'hook' gives no lateral arm"):
        alter(aircraft, Changes.model_validate({"change": [hook]}))
    result = alter(aircraft, Changes.model_validate({"change": [{**hook, "lateral_arm": 10.0}]}))
    assert result.new.weight == pytest.approx(968.0)
    assert result.new.arm == pytest.approx(96252.8 / 968.0)
    assert result.new.lateral_arm == pytest.approx(444.8 / 968.0)
    assert {"id": "hook", "weight": 6.0, "arm": 105.0, "lateral_arm": 10.0} in result.equipment


def test_regression_an_item_relocated_onto_the_centreline_kept_its_old_lateral_arm_in_the_list():
    """new_lateral_arm = 0.0 was read as "not given": the moment used 0 but the equipment list written
    with --write kept the old 6.0 in. Invented: an ELT of 2.4 lb at 140.0 in, 6.0 in right, moved onto the
    centreline on an aircraft of 1,000 lb on the centreline; lateral CG (0 + 2.4 x (0 - 6.0)) / 1,000 =
    -0.0144 in (FAA-H-8083-1B chapter 2, relocated weight: weight x distance moved)."""
    from .helpers import simple_aircraft

    aircraft = simple_aircraft(
        empty={"weight": 1000.0, "arm": 40.0, "lateral_arm": 0.0},
        equipment=[{"id": "elt", "weight": 2.4, "arm": 140.0, "lateral_arm": 6.0}],
    )
    moved = Changes.model_validate({"change": [{"action": "relocate", "item": "elt", "new_lateral_arm": 0.0}]})
    result = alter(aircraft, moved)
    assert result.new.lateral_arm == pytest.approx(2.4 * (0.0 - 6.0) / 1000.0)
    assert {"id": "elt", "weight": 2.4, "arm": 140.0, "lateral_arm": 0.0} in result.equipment


@pytest.mark.parametrize(
    "change",
    [{"action": "remove", "item": "winch"}, {"action": "relocate", "item": "winch", "new_lateral_arm": 4.0}],
    ids=["remove", "relocate"],
)
def test_an_item_without_a_lateral_arm_in_the_list_is_not_moved_sideways_on_a_lateral_aircraft(change):
    """heli2 (a lateral envelope) with an invented winch of 12.0 lb at 100.0 in and no lateral arm in its
    equipment list: removing it or moving it sideways took its lateral arm as 0. A fore-and-aft move
    needs none: the lateral moment does not change (FAA-H-8083-1B chapter 2: weight x distance moved),
    12.0 x (90.0 - 100.0) = -120 lb-in."""
    data = sample_data("heli2/aircraft.toml")
    data["equipment"] = [{"id": "winch", "weight": 12.0, "arm": 100.0}]
    aircraft = parse_aircraft(data)
    with pytest.raises(InputError, match=r"change\[0\]\.item: item 'winch' .* gives no lateral arm"):
        alter(aircraft, Changes.model_validate({"change": [change]}))
    aft = alter(
        aircraft, Changes.model_validate({"change": [{"action": "relocate", "item": "winch", "new_arm": 90.0}]})
    )
    assert aft.new.moment == pytest.approx(aircraft.empty.moment - 120.0)
    assert aft.new.lateral_arm == pytest.approx(aircraft.empty.lateral_arm)


def test_regression_the_changes_date_was_not_checked():
    # changes without a date kept the replaced record's date once written; after today or before the current
    # record (2026-02-09) they were written without a word (14 CFR 43.9 (a) (2), from memory)
    aircraft = parse_aircraft({**sample_data("trainer4/aircraft.toml")})
    data = sample_data("trainer4/changes.toml")
    now = dt.datetime(2026, 12, 3, 8, 0, tzinfo=dt.UTC)
    for date, code in ((None, "no_date"), ("2030-01-01", "future_date"), ("2020-01-01", "date_before_current")):
        result = alter(aircraft, Changes.model_validate({**data, "date": date}), now=now)
        assert [(r.code, r.field) for r in result.refusals] == [(code, "date")], date
        assert "the changes file" in result.refusals[0].message
    assert alter(aircraft, Changes.model_validate(data), now=now).refusals == []
