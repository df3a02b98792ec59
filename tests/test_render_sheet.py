"""The printable load sheet (loadcheck/render/sheet.py): its content, self-contained, the fuel plan,
the occupants' names."""

from __future__ import annotations

import re
from html import unescape
from html.parser import HTMLParser
from pathlib import Path

import pytest

from loadcheck import load_check_inputs
from loadcheck.caution import PILOT_CAUTION
from loadcheck.cli import app
from loadcheck.display import fmt

from .helpers import checked_sample as _inputs
from .helpers import sample


class _Collect(HTMLParser):
    def __init__(self) -> None:
        super().__init__()
        self.text: list[str] = []
        self.refs: list[str] = []
        self.rows: dict[str, list[str]] = {}
        self._row: str | None = None

    def handle_starttag(self, tag, attrs):
        attrs = dict(attrs)
        for key in ("src", "href"):
            if key in attrs:
                self.refs.append(attrs[key])
        if tag == "tr" and (attrs.get("id") or "").startswith("condition-"):
            self._row = attrs["id"].removeprefix("condition-")
            self.rows[self._row] = []
        if tag == "link":
            self.refs.append(attrs.get("href", ""))

    def handle_endtag(self, tag):
        if tag == "tr":
            self._row = None

    def handle_data(self, data):
        self.text.append(data)
        if self._row is not None and data.strip():
            self.rows[self._row].append(data.strip())


def test_load_sheet_content(runner, tmp_path):
    path = tmp_path / "sheet.html"
    result = runner.invoke(app, ["check", str(sample("twin6/leaves_path.toml")), "--sheet", str(path)])
    assert result.exit_code == 1
    html = path.read_text()
    parser = _Collect()
    parser.feed(html)
    _, check = _inputs("twin6/leaves_path.toml")
    units = check.units
    for condition in check.conditions:
        row = parser.rows[condition.condition]
        assert fmt(condition.weight, units.mass, with_unit=False) in row
        assert fmt(condition.arm, units.arm, with_unit=False) in row
    text = " ".join(parser.text)
    assert PILOT_CAUTION in text
    assert check.aircraft.fingerprint in text and "DEMO-6P" in text
    assert "Signature" in text and "Pilot in command" in text
    # self-contained: no external resources of any kind
    assert all(not re.match(r"^(https?:)?//", ref) for ref in parser.refs)
    assert not re.search(r"url\(\s*['\"]?(https?:)?//", html)
    assert "@import" not in html and "<script" not in html
    assert "<svg" in html and "@media print" in html


def test_sheet_must_be_html(runner, tmp_path):
    result = runner.invoke(app, ["check", str(sample("trainer4/within.toml")), "--sheet", str(tmp_path / "s.pdf")])
    assert result.exit_code == 2


def test_load_sheet_has_the_total_the_occupants_and_the_fuel_plan(runner, tmp_path):
    # regression (issue 15, item 3): no total row; taxi, trip, burn order and reserve left out
    path = tmp_path / "sheet.html"
    result = runner.invoke(app, ["check", str(sample("twin6/within.toml")), "--sheet", str(path)])
    assert result.exit_code == 0
    html = path.read_text()
    inputs, check = _inputs("twin6/within.toml")
    units, loading = check.units, inputs.loading

    def section(tag_id: str) -> str:
        start = html.index(">", html.index(f"id='{tag_id}'")) + 1
        return " ".join(re.sub(r"<[^>]+>", " ", html[start : html.index("</table>", start)]).split())

    ramp = check.condition("ramp")
    total = section("total")
    assert total.startswith("Total at ramp")
    for value, unit in ((ramp.weight, units.mass), (ramp.arm, units.arm), (ramp.moment, units.moment)):
        assert fmt(value, unit, with_unit=False) in total
    plan = section("fuel-plan")
    assert f"Taxi and run-up {fmt(loading.taxi, units.fuel_volume)}" in plan
    assert f"Trip {fmt(loading.trip, units.fuel_volume)}" in plan
    assert f"Reserve {fmt(loading.reserve, units.fuel_volume)}" in plan
    assert "Burn order Auxiliary tanks, then Main tanks" in plan
    on_board = section("fuel-on-board")
    for c in check.conditions:
        assert fmt(c.fuel, units.fuel_volume, with_unit=False) in on_board
    seats = section("occupants")
    for item in check.items:
        if item.kind == "seat":
            assert f"{item.name} {fmt(item.weight, units.mass, with_unit=False)}" in seats
    assert "lb·in" in html and "lb*in" not in html


# -- occupants' names in the loading (issue 15, item 3: "names optional in the loading") -----------


def _named_trip(tmp_path: Path, names: str, leg_names: str = "") -> Path:
    """A loading of the desk's invented trip test aircraft (tests/web_helpers.py), with [names]."""
    from .web_helpers import TRIP_AIRCRAFT

    (tmp_path / "aircraft.toml").write_text(TRIP_AIRCRAFT)
    path = tmp_path / "named.toml"
    text = (
        'format = 1\naircraft = "aircraft.toml"\n[load]\nfront = 340\nrear = 150\nbags = 40\n[fuel]\nmain = "local"\n'
        f"[burn]\ntaxi = 1\ntrip = 10\n[names]\n{names}\n"
    )
    if leg_names:
        text += f"[[leg]]\nload = {{ front = 170 }}\nburn = {{ trip = 5 }}\nnames = {{ {leg_names} }}\n"
    path.write_text(text)
    return path


def test_names_show_beside_each_seat_on_the_load_sheet_as_text(runner, tmp_path):
    loading = _named_trip(tmp_path, 'front = "Alex <b>Rivera</b>"\nrear = "Sam Okafor"')
    sheet = tmp_path / "sheet.html"
    assert runner.invoke(app, ["check", str(loading), "--sheet", str(sheet)]).exit_code == 0
    html = sheet.read_text()
    assert "<b>Rivera" not in html and "Alex &lt;b&gt;Rivera&lt;/b&gt;" in html  # markup in a name is shown as text
    moments = html[html.index("id='moments'") : html.index("</table>", html.index("id='moments'"))]
    cells = dict(re.findall(r"<tr><td>([^<·]+?)\s*(?:<span class='who'>· (.*?)</span>)?</td>", moments))
    assert cells["Front seats"] == "Alex &lt;b&gt;Rivera&lt;/b&gt;" and cells["Rear seats"] == "Sam Okafor"
    assert cells["Baggage"] == "" and cells["Basic empty weight"] == ""  # no one is named there
    occupants = html[html.index("id='occupants'") : html.index("</table>", html.index("id='occupants'"))]
    assert "<th>Name</th>" in occupants and "Sam Okafor" in occupants
    inputs = load_check_inputs(loading)
    assert inputs.loading.names == {"front": "Alex <b>Rivera</b>", "rear": "Sam Okafor"}


def test_a_leg_changes_the_name_of_a_seat_whose_weight_changes(tmp_path):
    from loadcheck.render.sheet import trip_sheet_html
    from loadcheck.trip import check_trip

    inputs = load_check_inputs(_named_trip(tmp_path, 'front = "Alex"\nrear = "Sam"', 'front = "Kim"'), allow_trip=True)
    assert [leg.names for leg in inputs.trip.legs] == [
        {"front": "Alex", "rear": "Sam"},
        {"front": "Kim", "rear": "Sam"},
    ]
    dropped = load_check_inputs(_named_trip(tmp_path, 'front = "Alex"', 'rear = "Sam"'), allow_trip=True)
    assert [leg.names for leg in dropped.trip.legs] == [
        {"front": "Alex"},
        {"rear": "Sam"},
    ]  # front's weight changed: not Alex
    html = trip_sheet_html(check_trip(inputs.aircraft, inputs.trip), trip_loading=inputs.trip)
    leg_2 = html[html.index("id='leg-2'") :]
    assert "Kim" in leg_2 and "Alex" not in leg_2 and "Alex" in html[: html.index("id='leg-2'")]


@pytest.mark.parametrize(
    "names, field, words",
    [
        ('nose = "Pat"', "names.nose", "unknown station 'nose'"),
        ('front = "' + "A" * 61 + '"', "names.front", "at most 60"),
        ('front = ""', "names.front", "an empty name"),
        ("front = 12", "names.front", "a name is text"),
        ('front = "Al\\nex"', "names.front", "control characters"),
    ],
)
def test_a_bad_name_is_refused_with_its_field(runner, tmp_path, names, field, words):
    result = runner.invoke(app, ["check", str(_named_trip(tmp_path, names))])
    assert result.exit_code == 2 and field in result.stderr and words in result.stderr, result.output


def test_a_name_at_a_station_without_weight_is_refused(runner, tmp_path):
    loading = _named_trip(tmp_path, 'front = "Alex"')
    result = runner.invoke(app, ["check", str(loading), "--load", "front=0"])
    assert result.exit_code == 2 and "names.front" in result.stderr and "carries no weight" in result.stderr
    leg = runner.invoke(
        app, ["check", str(_named_trip(tmp_path, 'front = "Alex"', 'front = "Kim"')), "--leg-load", "2:front=0"]
    )
    assert leg.exit_code == 2 and "leg 2, names.front" in leg.stderr
    # an outside trial: the refusal blamed the file alone; the value typed that emptied the seat is named too
    assert "expected a weight at load.front (--load front=0)" in " ".join(result.stderr.split())


def test_a_failing_trips_leg_1_page_carried_a_bare_within_banner(runner, tmp_path):
    # check --sheet on a trip whose leg 2 is out of limits: the leg 1 page said "WITHIN LIMITS" alone
    sheet = tmp_path / "trip.html"
    trip = str(sample("heli2/trip_drop_off.toml"))
    result = runner.invoke(app, ["check", trip, "--leg-load", "2:right=300", "--sheet", str(sheet)])
    assert result.exit_code == 1, result.output
    html = sheet.read_text()
    verdicts = re.findall(r"class=.verdict. id=.(?:trip-)?verdict.>([^<]*)<", html)
    assert verdicts == [
        "OUT OF LIMITS on leg 2 (back to base, solo): 1 limit exceeded.",  # the terminal's words (render.trip)
        "Leg 1 — WITHIN LIMITS; the trip is OUT OF LIMITS on Leg 2 (back to base, solo)",
        "Leg 2 (back to base, solo) — OUT OF LIMITS: 1 limit exceeded",
    ]
    within = tmp_path / "within.html"
    assert runner.invoke(app, ["check", trip, "--sheet", str(within)]).exit_code == 0
    assert "Leg 1 — WITHIN LIMITS, as is every leg of the trip" in within.read_text()


def test_regression_sheet_condition_rows_read_within_beside_a_burn_path_limit(runner, tmp_path):
    # outside review item 2: the sheet of twin6/leaves_path (out of limits: the CG leaves the envelope
    # during the burn) read "within" in every condition row's Result column. The row gives the
    # condition's own state, "inside", under the same heading as the terminal; the sheet's verdict
    # is the loading's.
    from loadcheck.render.terminal import CONDITION_STATE_HEADING

    path = tmp_path / "sheet.html"
    result = runner.invoke(app, ["check", str(sample("twin6/leaves_path.toml")), "--sheet", str(path)])
    assert result.exit_code == 1
    parser = _Collect()
    parser.feed(path.read_text())
    assert set(parser.rows) == {"ramp", "takeoff", "landing", "zero_fuel"}
    for condition, cells in parser.rows.items():
        assert "inside" in cells and not any("within" in cell for cell in cells), (condition, cells)
    text = " ".join(parser.text)
    assert CONDITION_STATE_HEADING in text and "OUT OF LIMITS" in text.upper()


def _moment_rows(html: str) -> dict[str, list[str]]:
    """The moment table's rows by item name: the head row under "Item", each cell's text."""
    table = html[html.index("id='moments'") : html.index("</table>", html.index("id='moments'"))]
    rows = {}
    for row in re.findall(r"<tr[^>]*>(.*?)</tr>", table, re.S):
        cells = [" ".join(re.sub(r"<[^>]+>", " ", c).split()) for c in re.findall(r"<t[hd][^>]*>(.*?)</t[hd]>", row)]
        rows[cells[0]] = cells[1:]
    return rows


def test_regression_sheet_dropped_the_lateral_arm_and_moment_columns(runner, tmp_path):
    # trial 10, finding 5: the terminal's moment table had the lateral arm and moment, the sheet not.
    # A signed sheet shows its working: the lateral moments are worked item by item, as fore and aft
    # (FAA-H-8083-1B, chapter 8, lateral balance: moment = weight x lateral arm).
    path = tmp_path / "sheet.html"
    result = runner.invoke(app, ["check", str(sample("heli2/dual.toml")), "--sheet", str(path)])
    assert result.exit_code == 0
    rows = _moment_rows(path.read_text())
    assert rows["Item"] == ["Weight (lb)", "Arm (in)", "Moment (lb·in)", "Lateral arm (in)", "Lateral moment (lb·in)"]
    # hand-worked from sample_aircraft/heli2/aircraft.toml and dual.toml
    assert rows["Left seat"] == ["170.0", "74.00", "12,580", "-13.00", "-2,210"]  # 170 x -13
    assert rows["Left side locker"][3:] == ["-19.00", "-190"]  # 10 x -19
    assert rows["Basic empty weight"][3:] == ["0.40", "385"]  # 962 x 0.4 = 384.8
    # 32 usgal x 6.0 lb/usgal = 192 lb at -11.5 in: -2,208
    assert next(v for k, v in rows.items() if k.startswith("Saddle tank"))[3:] == ["-11.50", "-2,208"]
    # total: 384.8 - 2210 + 2470 - 190 - 2208 = -1753.2 lb·in over 1,524 lb = -1.15 in
    assert rows["Total at ramp"] == ["1,524.0", "93.41", "142,352", "-1.15", "-1,753"]
    # and the figures are the check's, as the terminal shows them
    _, check = _inputs("heli2/dual.toml")
    ramp = check.condition("ramp")
    assert rows["Total at ramp"][3] == fmt(ramp.lateral_arm, "in", with_unit=False)
    assert rows["Total at ramp"][4] == fmt(ramp.lateral_moment, "lb*in", with_unit=False)


def test_sheet_of_an_aircraft_without_lateral_arms_has_no_lateral_columns(runner, tmp_path):
    path = tmp_path / "sheet.html"
    runner.invoke(app, ["check", str(sample("twin6/within.toml")), "--sheet", str(path)])
    assert not any("Lateral" in h for h in _moment_rows(path.read_text())["Item"])


def test_regression_the_record_sheets_changes_table_showed_a_light_placard_as_nothing(tmp_path):
    """A placard of 0.021 kg installed at 1,500 mm on tandem2 (invented; kg, mm): the record sheet's
    Changes table showed its weight as ``0.0`` (a non-zero weight shown as none), and the Moment change
    heading read ``kg*mm`` where every figure of the sheet writes ``kg·mm`` (SI Brochure, 9th edition,
    5.4.6: a product of units with a middle dot). Moment change = 0.021 kg x 1,500 mm = +31.5 kg·mm
    (FAA-H-8083-1B chapter 2: moment = weight x arm)."""
    import shutil

    from .helpers import record_sheet

    shutil.copy(sample("tandem2/aircraft.toml"), tmp_path / "aircraft.toml")
    changes = tmp_path / "changes.toml"
    changes.write_text(
        "format = 1\ndate = 2026-11-01\n[[change]]\naction = 'install'\nitem = 'placard'\nlabel = 'Placard'\n"
        "weight = 0.021\narm = 1500.0\n"
    )
    html = record_sheet(tmp_path, "alter", tmp_path / "aircraft.toml", changes)
    row = re.search(r"<tr><td>install</td><td>Placard</td>(.*?)</tr>", html)
    assert row is not None, html
    cells = re.findall(r"<td[^>]*>(.*?)</td>", row.group(1))
    assert cells[0] == "0.02", cells  # the weight, with the digits it needs (0.0 before)
    assert cells[-1] == "+32", cells  # 31.500000000000004 kg·mm to whole kg·mm
    assert "Moment change (kg·mm)" in html
    assert "kg*mm" not in html
    # the weighing record's points and corrections write the moment unit the same way
    weighing = record_sheet(tmp_path, "weigh", sample("trainer4/aircraft.toml"), sample("trainer4/weighing.toml"))
    assert "Moment (lb·in)" in weighing and "lb*in" not in weighing


def test_regression_a_trips_load_sheet_said_within_limits_over_a_legs_warning():
    # trial 13 D3, left by fix-trip13 on the load sheet: a trip's sheet said "WITHIN LIMITS on every leg"
    # and "within limits" on a leg landing below its reserve; it says the warning as the terminal does
    from loadcheck.render.sheet import trip_sheet_html
    from loadcheck.render.trip import trip_verdict
    from loadcheck.trip import check_trip

    inputs = load_check_inputs(sample("heli2/trip_drop_off.toml"), allow_trip=True, burn={"reserve": "60"})
    trip = check_trip(inputs.aircraft, inputs.trip)
    assert trip.ok and any(f.code == "reserve" for f in trip.legs[0].check.findings)
    html = trip_sheet_html(trip, trip_loading=inputs.trip)
    verdict = html[html.index('id="trip-verdict">') : html.index("</p>", html.index('id="trip-verdict">'))]
    assert trip_verdict(trip) in unescape(verdict) and "1 warning (see the findings)" in verdict
    row = html[html.index("<td>Leg 1</td>") : html.index("</tr>", html.index("<td>Leg 1</td>"))]
    assert "within limits: every limit holds" in row and "1 warning" in row
