"""Charts, the load sheet, the text plot and the aircraft overview."""

from __future__ import annotations

import re
import xml.etree.ElementTree as ET
from html.parser import HTMLParser
from pathlib import Path

import pytest

from loadcheck import check_loading, load_check_inputs
from loadcheck.caution import PILOT_CAUTION
from loadcheck.cli import app
from loadcheck.display import fmt
from loadcheck.render.chart import check_figure, envelope_figure, save_figure
from loadcheck.render.textplot import text_plot

from .helpers import sample

SVG = "{http://www.w3.org/2000/svg}"
XLINK = "{http://www.w3.org/1999/xlink}"


def _inputs(name: str):
    inputs = load_check_inputs(sample(name))
    return inputs, check_loading(inputs.aircraft, inputs.loading)


@pytest.mark.parametrize("suffix, magic", [("png", b"\x89PNG"), ("svg", b"<?xml"), ("pdf", b"%PDF")])
def test_chart_in_each_format(runner, tmp_path, suffix, magic):
    path = tmp_path / f"chart.{suffix}"
    result = runner.invoke(app, ["check", str(sample("twin6/leaves_path.toml")), "--chart", str(path)])
    assert result.exit_code == 1
    data = path.read_bytes()
    assert len(data) > 2000 and data.startswith(magic)


def test_unknown_chart_format(runner, tmp_path):
    result = runner.invoke(app, ["check", str(sample("trainer4/within.toml")), "--chart", str(tmp_path / "c.gif")])
    assert result.exit_code == 2 and ".png, .svg or .pdf" in result.output
    assert not (tmp_path / "c.gif").exists()


def _marker_positions(svg_text: str) -> dict[str, tuple[float, float]]:
    root = ET.fromstring(svg_text)
    found = {}
    for group in root.iter(f"{SVG}g"):
        gid = group.get("id", "")
        if gid.startswith(("point-", "leaves-at")):
            use = next(group.iter(f"{SVG}use"))
            found[gid] = (float(use.get("x")), float(use.get("y")))
    return found


@pytest.mark.parametrize("name", ["twin6/leaves_path.toml", "trainer4/within.toml", "heli2/solo_heavy_right.toml"])
def test_svg_points_sit_at_the_computed_coordinates(tmp_path, name):
    inputs, result = _inputs(name)
    figure = check_figure(inputs.aircraft, result, inputs.label)
    path = tmp_path / "chart.svg"
    save_figure(figure, path)
    positions = _marker_positions(path.read_text())
    figure.set_dpi(72)  # the SVG backend draws at 72 dpi
    ax = figure.axes[0]
    envelope = inputs.aircraft.envelopes_for(result.category)[0]
    for condition in result.conditions:
        x, y = envelope.shape.coords(condition.weight, condition.moment, condition.lateral_moment or 0.0)
        px, py = ax.transData.transform((float(x), float(y)))
        sx, sy = positions[f"point-{condition.condition}"]
        assert sx == pytest.approx(px, abs=0.01)
        assert sy == pytest.approx(figure.bbox.height - py, abs=0.01)
    assert any(k.startswith("leaves-at") for k in positions) == (not result.burn_path.ok)


def test_envelope_chart_alone_and_other_categories(tmp_path):
    inputs, _ = _inputs("trainer4/within.toml")
    figure = envelope_figure(inputs.aircraft, "utility")
    save_figure(figure, tmp_path / "e.svg")
    text = (tmp_path / "e.svg").read_text()
    assert 'id="envelope-utility-1"' in text and 'id="envelope-normal-0"' in text
    assert "point-takeoff" not in text


def test_lateral_envelope_drawn_beside_the_longitudinal(tmp_path):
    inputs, result = _inputs("heli2/solo_heavy_right.toml")
    figure = check_figure(inputs.aircraft, result)
    assert len(figure.axes) == 2
    assert "Lateral CG" in figure.axes[1].get_xlabel()


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


def test_text_plot_marks_every_condition(runner):
    inputs, result = _inputs("twin6/leaves_path.toml")
    lines = text_plot(inputs.aircraft, result)
    body = "\n".join(lines)
    for mark in "TLZX":
        assert mark in body
    assert "#" in body and "." in body
    out = runner.invoke(app, ["check", str(sample("trainer4/within.toml")), "--plot"])
    assert "R ramp" in out.output
    assert out.output.index("R ramp") < out.output.index("CAUTION")  # the caution stays last


def test_show_lists_everything(runner, tmp_path):
    result = runner.invoke(app, ["show", str(sample("twin6/aircraft.toml")), "--chart", str(tmp_path / "e.png")],
                           env={"COLUMNS": "200"})  # every table side by side
    assert result.exit_code == 0, result.output
    for words in ["3,680.0 lb", "Main tanks", "600.0", "Middle seats", "(295.2, 3600)", "5,000.0 lb", "CAUTION"]:
        assert words in result.output
    assert (tmp_path / "e.png").stat().st_size > 2000
    assert runner.invoke(app, ["show", str(sample("twin6/aircraft.toml")), "--category", "nope"]).exit_code == 2


def test_readme_chart_is_committed():
    assert Path(sample("")).parent.joinpath("docs/images/twin-leaves-path.png").stat().st_size > 10_000


# -- the chart read back from its SVG: text boxes, markers (issue 15, item 2) ----------------------

_NUMBER = re.compile(r"-?\d+(?:\.\d+)?(?:e-?\d+)?")


def _matrix(transform: str | None):
    """The affine matrix (a, b, c, d, e, f) of an SVG transform attribute."""
    import math

    m = (1.0, 0.0, 0.0, 1.0, 0.0, 0.0)
    for name, args in re.findall(r"(\w+)\(([^)]*)\)", transform or ""):
        v = [float(x) for x in _NUMBER.findall(args)]
        if name == "translate":
            t = (1.0, 0.0, 0.0, 1.0, v[0], v[1] if len(v) > 1 else 0.0)
        elif name == "scale":
            t = (v[0], 0.0, 0.0, v[1] if len(v) > 1 else v[0], 0.0, 0.0)
        elif name == "rotate":
            r = math.radians(v[0])
            t = (math.cos(r), math.sin(r), -math.sin(r), math.cos(r), 0.0, 0.0)
        elif name == "matrix":
            t = tuple(v)
        else:
            raise AssertionError(f"transform {name} not handled")
        m = _compose(m, t)
    return m


def _compose(m, t):
    a, b, c, d, e, f = m
    a2, b2, c2, d2, e2, f2 = t
    return (a * a2 + c * b2, b * a2 + d * b2, a * c2 + c * d2, b * c2 + d * d2, a * e2 + c * f2 + e, b * e2 + d * f2 + f)


def _apply(m, box):
    a, b, c, d, e, f = m
    x0, y0, x1, y1 = box
    xs, ys = [], []
    for x, y in ((x0, y0), (x0, y1), (x1, y0), (x1, y1)):
        xs.append(a * x + c * y + e)
        ys.append(b * x + d * y + f)
    return (min(xs), min(ys), max(xs), max(ys))


def _path_box(element):
    numbers = [float(n) for n in _NUMBER.findall(element.get("d", ""))]
    if not numbers:
        return None  # a space: no ink
    xs, ys = numbers[0::2], numbers[1::2]
    return _apply(_matrix(element.get("transform")), (min(xs), min(ys), max(xs), max(ys)))


def _union(a, b):
    return b if a is None else (min(a[0], b[0]), min(a[1], b[1]), max(a[2], b[2]), max(a[3], b[3]))


def _svg_layout(svg_text: str):
    """Boxes, in the SVG's own units, of every text (by its group id) and every marker (by its
    group id, in drawing order); the figure size; the plot frames."""
    root = ET.fromstring(svg_text)
    defs = {el.get("id"): _path_box(el) for el in root.iter(f"{SVG}path") if el.get("id")}
    texts: dict[str, tuple] = {}
    markers: list[tuple[str, tuple]] = []
    frames: list[tuple] = []

    def walk(element, m, text_id, point_id):
        m = _compose(m, _matrix(element.get("transform")))
        gid = element.get("id", "")
        if element.tag == f"{SVG}g":
            if gid.startswith(("text_", "label-", "limitname-")):
                text_id = gid
            if gid.startswith(("point-", "leaves-at")):
                point_id = gid
            if gid.startswith("axes_"):  # its first patch is the plot's background: the frame
                path = next(element.iter(f"{SVG}path"))
                frames.append(_apply(m, _path_box(path)))
        if element.tag == f"{SVG}use":
            ref = element.get(f"{XLINK}href", "")[1:]
            box = defs[ref]
            if box is None:
                return
            shift = (1.0, 0.0, 0.0, 1.0, float(element.get("x", 0)), float(element.get("y", 0)))
            placed = _apply(_compose(m, shift), box)
            if text_id is not None:
                texts[text_id] = _union(texts.get(text_id), placed)
            elif point_id is not None:
                markers.append((point_id, placed))
        for child in element:
            if child.tag != f"{SVG}defs":
                walk(child, m, text_id, point_id)

    walk(root, (1.0, 0.0, 0.0, 1.0, 0.0, 0.0), None, None)
    width, height = (float(root.get(k).removesuffix("pt")) for k in ("width", "height"))
    return texts, markers, (width, height), frames


def _shared(a, b) -> float:
    return max(0.0, min(a[2], b[2]) - max(a[0], b[0])) * max(0.0, min(a[3], b[3]) - max(a[1], b[1]))


def _within(inner, outer, pad=0.5) -> bool:
    return inner[0] >= outer[0] - pad and inner[1] >= outer[1] - pad and inner[2] <= outer[2] + pad and inner[3] <= outer[3] + pad


CHART_SAMPLES = ["twin6/leaves_path.toml", "twin6/within.toml", "twin6/zero_fuel_heavy.toml", "twin6/two_stretches.toml",
                 "trainer4/within.toml", "trainer4/over_weight.toml", "trainer4/utility_aft.toml", "trainer4/baggage_group.toml",
                 "tandem2/aft_heavy.toml", "tandem2/solo.toml", "tandem2/light_solo.toml", "tandem2/aft_ballast.toml",
                 "heli2/dual.toml", "heli2/solo_heavy_right.toml", "heli2/heavy_left.toml", "heli2/solo.toml"]


@pytest.mark.parametrize("name", CHART_SAMPLES)
def test_chart_text_never_overlaps_or_is_clipped_and_every_marker_shows(name):
    from loadcheck.render.chart import figure_svg

    inputs, result = _inputs(name)
    texts, markers, (width, height), frames = _svg_layout(figure_svg(check_figure(inputs.aircraft, result, inputs.label)))
    assert len(frames) == len({e.axes for e in inputs.aircraft.envelopes_for(result.category)})
    page = (0.0, 0.0, width, height)
    for gid, box in texts.items():
        assert _within(box, page), f"{gid} is clipped by the edge of the picture"
    names = sorted(texts)
    for i, a in enumerate(names):
        for b in names[i + 1:]:
            assert _shared(texts[a], texts[b]) < 0.5, f"{a} and {b} overlap"
    labels = {gid: box for gid, box in texts.items() if gid.startswith("label-")}
    panels = 2 if len(frames) == 2 else 1
    expected = {f"label-{c.condition}{'' if p == 0 else f'-{p}'}" for c in result.conditions for p in range(panels)}
    assert expected <= set(labels), "a condition has no label"
    for gid, box in labels.items():
        assert any(_within(box, frame) for frame in frames), f"{gid} lies outside the plot"
        for point, marker in markers:
            assert _shared(box, marker) < 0.5, f"{gid} covers the marker {point}"
    # every condition drawn in every panel, and none hidden: no marker lies wholly inside one drawn after it
    drawn = [gid for gid, _ in markers]
    for condition in result.conditions:
        assert f"point-{condition.condition}" in drawn
    filled = [(gid, box) for gid, box in markers if not gid.startswith("leaves-at")]
    for i, (gid, box) in enumerate(filled):
        for later, cover in filled[i + 1:]:
            assert not _within(box, cover, pad=0.0), f"{gid} is hidden under {later}"
    assert any(g.startswith("leaves-at") for g in drawn) == (result.burn_path.leaves_at is not None)


def test_svg_reader_sees_an_overlap_when_there_is_one():
    # the check above can fail: two labels written on the same spot are caught
    from matplotlib.figure import Figure

    from loadcheck.render.chart import figure_svg

    figure = Figure(figsize=(3, 2))
    ax = figure.add_subplot(1, 1, 1)
    ax.annotate("landing", (0.5, 0.5), gid="label-a")
    ax.annotate("zero fuel", (0.52, 0.5), gid="label-b")
    texts, _, _, _ = _svg_layout(figure_svg(figure))
    assert _shared(texts["label-a"], texts["label-b"]) > 0.5


def test_chart_title_names_the_registration_once_without_doubled_brackets():
    inputs, result = _inputs("twin6/leaves_path.toml")
    title = check_figure(inputs.aircraft, result, inputs.label).get_suptitle()
    assert "DEMO-6P" in title and ") (" not in title


def test_legend_is_off_the_envelope():
    inputs, result = _inputs("tandem2/aft_heavy.toml")
    figure = check_figure(inputs.aircraft, result)
    renderer = figure.canvas.get_renderer()
    legend = figure.legends[0].get_window_extent(renderer)
    for ax in figure.axes:
        frame = ax.get_window_extent(renderer)
        assert legend.y1 <= frame.y0 or not legend.overlaps(frame)


@pytest.mark.parametrize("name", ["trainer4", "tandem2", "twin6", "heli2"])
def test_envelope_and_fuel_payload_charts_have_no_overlapping_or_clipped_text(name):
    from loadcheck.planning import fuel_payload_table
    from loadcheck.render.chart import figure_svg, fuel_payload_figure

    inputs = load_check_inputs(sample(f"{name}/aircraft.toml"))
    aircraft = inputs.aircraft
    figures = [envelope_figure(aircraft, category) for category in dict.fromkeys(e.category for e in aircraft.envelope)]
    seat = next(s.id for s in aircraft.station if s.kind == "seat")
    figures.append(fuel_payload_figure(aircraft, fuel_payload_table(aircraft, inputs.loading, seat, steps=3)))
    for figure in figures:
        texts, _, (width, height), _ = _svg_layout(figure_svg(figure))
        names = sorted(texts)
        for gid in names:
            assert _within(texts[gid], (0.0, 0.0, width, height)), gid
        for i, a in enumerate(names):
            for b in names[i + 1:]:
                assert _shared(texts[a], texts[b]) < 0.5, f"{a} and {b} overlap"


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
        return " ".join(re.sub(r"<[^>]+>", " ", html[start:html.index("</table>", start)]).split())

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


def test_moment_per_1000_column_where_the_envelope_is_read_so(runner, tmp_path):
    # issue 15, item 4: the twin's envelope is drawn as moment / 1000 (moment_scale = 1000 in its
    # file); the pilot compares that column with the chart
    inputs, check = _inputs("twin6/within.toml")
    (scale,) = {e.moment_scale for e in inputs.aircraft.envelope}
    assert scale == 1000
    out = runner.invoke(app, ["check", str(sample("twin6/within.toml")), "--sheet", str(tmp_path / "s.html")],
                        env={"COLUMNS": "200"}).output
    html = (tmp_path / "s.html").read_text()
    assert "Moment / 1000 (lb·in)" in out and "Moment / 1000 (lb·in)" in html
    for c in check.conditions:
        shown = f"{c.moment / scale:,.1f}"
        assert shown in out and shown in html
    plain = runner.invoke(app, ["check", str(sample("trainer4/within.toml"))], env={"COLUMNS": "200"}).output
    assert "Moment / 1000" not in plain  # the trainer's envelope is read as arm against weight


def test_weight_margin_set_by_a_sloping_edge_is_not_read_as_overweight():
    # regression (issue 15, item 4): beside a CG failure a negative weight margin read like overweight
    from rich.console import Console

    from loadcheck.loading import Loading, resolve_loading
    from loadcheck.render.terminal import render_check

    from .helpers import simple_aircraft

    aircraft = simple_aircraft(envelope=[{"category": "normal", "axes": ["arm", "weight"],
                                          "points": [[35.0, 900], [40.0, 1800], [40.0, 2000], [48.0, 2000], [48.0, 900]]}])
    loading = resolve_loading(Loading(load={"front": 500}, fuel={"main": 10}), aircraft)
    check = check_loading(aircraft, loading)
    takeoff = check.condition("takeoff")
    assert takeoff.weight < aircraft.limits.max_takeoff_weight and takeoff.margins.weight < 0  # under the maximum, over the edge
    assert not takeoff.ok
    console = Console(width=200, record=True, color_system=None)
    render_check(check, console)
    text = console.export_text()
    row = next(line for line in text.splitlines() if line.startswith("│ Takeoff"))
    assert f"{fmt(takeoff.margins.weight, 'lb', 'down', with_unit=False)} (edge)" in row
    assert "no maximum weight is exceeded" in text


def test_validate_counts_in_words(runner):
    # regression (issue 15, item 5): "1 tanks"
    out = runner.invoke(app, ["validate", str(sample("tandem2/aircraft.toml"))], env={"COLUMNS": "200"}).output
    assert "1 tank," in out and "1 tanks" not in out and "4 stations" in out


# -- occupants' names in the loading (issue 15, item 3: "names optional in the loading") -----------

def _named_trip(tmp_path: Path, names: str, leg_names: str = "") -> Path:
    """A loading of the desk's invented trip test aircraft (tests/web_helpers.py), with [names]."""
    from .web_helpers import TRIP_AIRCRAFT

    (tmp_path / "aircraft.toml").write_text(TRIP_AIRCRAFT)
    path = tmp_path / "named.toml"
    text = ('format = 1\naircraft = "aircraft.toml"\n[load]\nfront = 340\nrear = 150\nbags = 40\n[fuel]\nmain = "local"\n'
            f'[burn]\ntaxi = 1\ntrip = 10\n[names]\n{names}\n')
    if leg_names:
        text += f'[[leg]]\nload = {{ front = 170 }}\nburn = {{ trip = 5 }}\nnames = {{ {leg_names} }}\n'
    path.write_text(text)
    return path


def test_names_show_beside_each_seat_on_the_load_sheet_as_text(runner, tmp_path):
    loading = _named_trip(tmp_path, 'front = "Alex <b>Rivera</b>"\nrear = "Sam Okafor"')
    sheet = tmp_path / "sheet.html"
    assert runner.invoke(app, ["check", str(loading), "--sheet", str(sheet)]).exit_code == 0
    html = sheet.read_text()
    assert "<b>Rivera" not in html and "Alex &lt;b&gt;Rivera&lt;/b&gt;" in html  # markup in a name is shown as text
    moments = html[html.index("id='moments'"):html.index("</table>", html.index("id='moments'"))]
    cells = dict(re.findall(r"<tr><td>([^<·]+?)\s*(?:<span class='who'>· (.*?)</span>)?</td>", moments))
    assert cells["Front seats"] == "Alex &lt;b&gt;Rivera&lt;/b&gt;" and cells["Rear seats"] == "Sam Okafor"
    assert cells["Baggage"] == "" and cells["Basic empty weight"] == ""  # no one is named there
    occupants = html[html.index("id='occupants'"):html.index("</table>", html.index("id='occupants'"))]
    assert "<th>Name</th>" in occupants and "Sam Okafor" in occupants
    inputs = load_check_inputs(loading)
    assert inputs.loading.names == {"front": "Alex <b>Rivera</b>", "rear": "Sam Okafor"}


def test_a_leg_changes_the_name_of_a_seat_whose_weight_changes(tmp_path):
    from loadcheck.render.sheet import trip_sheet_html
    from loadcheck.trip import check_trip

    inputs = load_check_inputs(_named_trip(tmp_path, 'front = "Alex"\nrear = "Sam"', 'front = "Kim"'), allow_trip=True)
    assert [leg.names for leg in inputs.trip.legs] == [{"front": "Alex", "rear": "Sam"}, {"front": "Kim", "rear": "Sam"}]
    dropped = load_check_inputs(_named_trip(tmp_path, 'front = "Alex"', 'rear = "Sam"'), allow_trip=True)
    assert [leg.names for leg in dropped.trip.legs] == [{"front": "Alex"}, {"rear": "Sam"}]  # front's weight changed: not Alex
    html = trip_sheet_html(check_trip(inputs.aircraft, inputs.trip), trip_loading=inputs.trip)
    leg_2 = html[html.index("id='leg-2'"):]
    assert "Kim" in leg_2 and "Alex" not in leg_2 and "Alex" in html[:html.index("id='leg-2'")]


@pytest.mark.parametrize("names, field, words", [
    ('nose = "Pat"', "names.nose", "unknown station 'nose'"),
    ('front = "' + "A" * 61 + '"', "names.front", "at most 60"),
    ('front = ""', "names.front", "an empty name"),
    ('front = 12', "names.front", "a name is text"),
    ('front = "Al\\nex"', "names.front", "control characters"),
])
def test_a_bad_name_is_refused_with_its_field(runner, tmp_path, names, field, words):
    result = runner.invoke(app, ["check", str(_named_trip(tmp_path, names))])
    assert result.exit_code == 2 and field in result.stderr and words in result.stderr, result.output


def test_a_name_at_a_station_without_weight_is_refused(runner, tmp_path):
    loading = _named_trip(tmp_path, 'front = "Alex"')
    result = runner.invoke(app, ["check", str(loading), "--load", "front=0"])
    assert result.exit_code == 2 and "names.front" in result.stderr and "carries no weight" in result.stderr
    leg = runner.invoke(app, ["check", str(_named_trip(tmp_path, 'front = "Alex"', 'front = "Kim"')), "--leg-load", "2:front=0"])
    assert leg.exit_code == 2 and "leg[0].names.front" in leg.stderr


# -- help that reads well (issue 15, item 5: `<list[str]>` and `{AIRCRAFT}` in the help) -----------

def _every_command(command, path=()):
    yield list(path)
    for name, sub in getattr(command, "commands", {}).items():
        yield from _every_command(sub, (*path, name))


def test_no_command_help_shows_a_python_type_or_braces(runner):
    # regression: `loadcheck validate --help` printed `FILES <list[Path]>` and `{FILES}...`
    import typer

    commands = list(_every_command(typer.main.get_command(app)))
    assert len(commands) > 20
    for path in commands:
        text = runner.invoke(app, [*path, "--help"], env={"COLUMNS": "100"}).output
        odd = re.findall(r"<[A-Za-z_]+(?:\[[^>]*\])?>|\{[A-Za-z_]+\}", text)
        assert not odd, f"loadcheck {' '.join(path)} --help shows {odd}"
    validate = runner.invoke(app, ["validate", "--help"], env={"COLUMNS": "100"}).output
    assert "Usage: loadcheck validate [OPTIONS] FILES..." in validate
    assert re.search(r"^\s+FILES\s+Aircraft and loading files to check\.", validate, re.M)
    check = runner.invoke(app, ["check", "--help"], env={"COLUMNS": "100"}).output
    assert "Usage: loadcheck check [OPTIONS] AIRCRAFT [LOADING]" in check
    assert "-r, --role ROLE" in runner.invoke(app, ["users", "add", "--help"], env={"COLUMNS": "100"}).output
