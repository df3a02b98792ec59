"""Charts (loadcheck/render/chart.py): each format, markers at the computed coordinates, text read
back from the SVG (never overlapping, never clipped)."""

from __future__ import annotations

import functools
import re
import xml.etree.ElementTree as ET
from pathlib import Path
from typing import Any

import pytest

from loadcheck import load_check_inputs
from loadcheck.cli import app
from loadcheck.display import fmt
from loadcheck.render.chart import check_figure, envelope_figure, save_figure
from loadcheck.words import burn_path_sentence

from .helpers import checked_sample as _inputs
from .helpers import sample

SVG = "{http://www.w3.org/2000/svg}"
XLINK = "{http://www.w3.org/1999/xlink}"


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
        if gid.startswith(("point-", "leaves-at", "returns-at")):
            use = next(group.iter(f"{SVG}use"))
            found[gid] = (float(use.get("x")), float(use.get("y")))
    return found


@functools.cache
def _drawn(name: str) -> tuple[Any, Any, Any, str]:
    """A sample loading's inputs, check result, chart and the chart's SVG: drawn once for every
    test that reads it (the SVG is made before any test touches the figure)."""
    from loadcheck.render.chart import figure_svg

    inputs, result = _inputs(name)
    figure = check_figure(inputs.aircraft, result, inputs.label)
    return inputs, result, figure, figure_svg(figure)


@pytest.mark.parametrize("name", ["twin6/leaves_path.toml", "trainer4/within.toml", "heli2/solo_heavy_right.toml"])
def test_svg_points_sit_at_the_computed_coordinates(name):
    inputs, result, figure, svg = _drawn(name)
    positions = _marker_positions(svg)
    figure.set_dpi(72)  # the SVG backend draws at 72 dpi
    ax = figure.axes[0]
    envelope = inputs.aircraft.envelopes_for(result.category)[0]
    for condition in result.conditions:
        x, y = envelope.shape.coords(condition.weight, condition.moment, condition.lateral_moment or 0.0)
        px, py = ax.transData.transform((float(x), float(y)))
        sx, sy = positions[f"point-{condition.condition}"]
        assert sx == pytest.approx(px, abs=0.01)
        assert sy == pytest.approx(figure.bbox.height - py, abs=0.01)
    leaving = any(e.leaves is not None for e in result.burn_path.excursions)
    assert any(k.startswith("leaves-at") for k in positions) == leaving


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
    return (
        a * a2 + c * b2,
        b * a2 + d * b2,
        a * c2 + c * d2,
        b * c2 + d * d2,
        a * e2 + c * f2 + e,
        b * e2 + d * f2 + f,
    )


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
            if gid.startswith(("point-", "leaves-at", "returns-at")):
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
    return (
        inner[0] >= outer[0] - pad
        and inner[1] >= outer[1] - pad
        and inner[2] <= outer[2] + pad
        and inner[3] <= outer[3] + pad
    )


# one loading of each sample aircraft in the default run (the heli's with its lateral chart); the others with --long
CHART_SAMPLES = [
    "twin6/leaves_path.toml",
    "trainer4/within.toml",
    "tandem2/aft_heavy.toml",
    "heli2/solo_heavy_right.toml",
    *(
        pytest.param(name, marks=pytest.mark.slow)
        for name in (
            "twin6/within.toml",
            "twin6/zero_fuel_heavy.toml",
            "twin6/two_stretches.toml",
            "trainer4/over_weight.toml",
            "trainer4/utility_aft.toml",
            "trainer4/baggage_group.toml",
            "tandem2/solo.toml",
            "tandem2/light_solo.toml",
            "tandem2/aft_ballast.toml",
            "heli2/dual.toml",
            "heli2/heavy_left.toml",
            "heli2/solo.toml",
        )
    ),
]


@pytest.mark.parametrize("name", CHART_SAMPLES)
def test_chart_text_never_overlaps_or_is_clipped_and_every_marker_shows(name):
    inputs, result, _, svg = _drawn(name)
    texts, markers, (width, height), frames = _svg_layout(svg)
    assert len(frames) == len({e.axes for e in inputs.aircraft.envelopes_for(result.category)})
    page = (0.0, 0.0, width, height)
    for gid, box in texts.items():
        assert _within(box, page), f"{gid} is clipped by the edge of the picture"
    names = sorted(texts)
    for i, a in enumerate(names):
        for b in names[i + 1 :]:
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
    filled = [(gid, box) for gid, box in markers if not gid.startswith(("leaves-at", "returns-at"))]
    for i, (gid, box) in enumerate(filled):
        for later, cover in filled[i + 1 :]:
            assert not _within(box, cover, pad=0.0), f"{gid} is hidden under {later}"
    excursions = result.burn_path.excursions
    assert any(g.startswith("leaves-at") for g in drawn) == any(e.leaves is not None for e in excursions)
    assert any(g.startswith("returns-at") for g in drawn) == any(e.returns is not None for e in excursions)


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
    title = _drawn("twin6/leaves_path.toml")[2].get_suptitle()
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
            for b in names[i + 1 :]:
                assert _shared(texts[a], texts[b]) < 0.5, f"{a} and {b} overlap"


# -- a path that starts outside, comes back in, or stays out to landing (trial 10, finding 9) ------
# The trial's invented aircraft, rebuilt here: a cargo twin in kg/m/l whose envelope is on moment /
# 1000, and a six-seat single in lb/in/usgal with a forward limit that moves aft with weight.

_CARGO = """format = 1
name = "Invented cargo twin"
[units]
mass = "kg"
arm = "m"
fuel_volume = "l"
[empty]
weight = 3000.0
arm = 5.00
[limits]
max_takeoff_weight = 5200
max_ramp_weight = 5230
max_landing_weight = 5000
[[station]]
id = "crew"
kind = "seat"
arm = 2.50
controls = true
[[station]]
id = "hold_b"
kind = "cargo"
arm = 5.20
[[station]]
id = "hold_c"
kind = "cargo"
arm = 7.40
[[tank]]
id = "wing"
arm = 5.60
usable = 800
fuel = "jet"
[[tank]]
id = "ferry"
arm = 6.50
usable = 300
fuel = "jet"
[[envelope]]
category = "normal"
axes = ["moment", "weight"]
moment_scale = 1000
points = [[14.40, 3000], [23.0, 5230], [27.8, 5230], [16.2, 3000]]
"""

_CARGO_AFT = """format = 1
aircraft = "cargo.toml"
[load]
crew = 70
hold_b = 600
hold_c = 400
[fuel]
wing = 800
ferry = 300
[burn]
taxi = 20
trip = 450
order = ["ferry", "wing"]
"""

_SIX = """format = 1
name = "Invented six-seat single"
[units]
mass = "lb"
arm = "in"
fuel_volume = "usgal"
[empty]
weight = 2100.0
arm = 84.0
[limits]
max_takeoff_weight = 3400
[[station]]
id = "row1"
kind = "seat"
arm = 80.0
controls = true
[[station]]
id = "nose"
kind = "baggage"
arm = 20.0
[[tank]]
id = "mains"
arm = 93.0
usable = 60
fuel = "avgas"
[[envelope]]
category = "normal"
axes = ["arm", "weight"]
points = [[82.0, 2100], [82.0, 2600], [88.0, 3400], [97.0, 3400], [97.0, 2100]]
"""

_SIX_FWD = """format = 1
aircraft = "six.toml"
[load]
row1 = 400
nose = 100
[fuel]
mains = 60
[burn]
taxi = 1.5
trip = 30
"""


def _trial_case(tmp_path: Path, aircraft: tuple[str, str], loading: str):
    (tmp_path / aircraft[0]).write_text(aircraft[1])
    (tmp_path / "loading.toml").write_text(loading)
    inputs = load_check_inputs(tmp_path / "loading.toml")
    from loadcheck import check_loading
    from loadcheck.render.chart import figure_svg

    result = check_loading(inputs.aircraft, inputs.loading)
    figure = check_figure(inputs.aircraft, result, inputs.label)
    return inputs, result, figure, figure_svg(figure)


def _label_texts(svg: str) -> dict[str, str]:
    """The words of each label of the chart, by its element id (matplotlib's SVG writes each
    text's words as a comment before its glyphs)."""
    return {
        gid: re.search(r"<!-- (.*?) -->", svg[svg.index(f'id="{gid}"') :], re.S).group(1)
        for gid in re.findall(r'id="(label-[^"]+)"', svg)
    }


def test_a_path_that_starts_outside_and_comes_back_in_is_outside_from_takeoff_and_marked_where_it_returns(tmp_path):
    inputs, result, figure, svg = _trial_case(tmp_path, ("cargo.toml", _CARGO), _CARGO_AFT)
    # Worked by hand: jet fuel 6.7 lb/usgal (common practice) = 6.7 x 0.45359237 / 3.785411784 kg/l
    # (NIST SP 811 exact factors). Takeoff: 20 l of taxi out of the ferry tank first.
    rho = 6.7 * 0.45359237 / 3.785411784
    weight = 3000 + 70 + 600 + 400 + (1100 - 20) * rho
    moment = 3000 * 5.0 + 70 * 2.5 + 600 * 5.2 + 400 * 7.4 + (280 * 6.5 + 800 * 5.6) * rho
    # the aft edge, (16.2, 3000) to (27.8, 5230) in moment/1000 and weight; burning b kg from the
    # ferry tank (6.5 m) moves the point to (moment - 6.5 b, weight - b): it crosses the edge at
    slope = (27.8 - 16.2) / (5230 - 3000)
    burned = (moment / 1000 - 16.2 - (weight - 3000) * slope) / (6.5 / 1000 - slope)
    assert 0 < burned < 280 * rho  # back inside while the ferry tank still feeds
    (excursion,) = result.burn_path.excursions
    assert excursion.from_takeoff and not excursion.to_landing and excursion.leaves is None
    assert excursion.to_burned == pytest.approx(burned, abs=1e-3)
    assert excursion.returns is not None and excursion.returns.weight == pytest.approx(weight - burned, abs=1e-3)
    # the words: outside from takeoff, back inside at the figure rounded up; never "leaves" at takeoff
    sentence = burn_path_sentence(result)
    assert sentence == (
        f"the CG is outside the envelope from takeoff until {fmt(burned, 'kg', 'up')} is burned, "
        "where it comes back inside."
    )
    # the drawing: no "path leaves" ring at takeoff; a mark where it comes back in, at that point
    positions = _marker_positions(svg)
    assert not any(k.startswith("leaves-at") for k in positions)
    figure.set_dpi(72)
    ax = figure.axes[0]
    x, y = inputs.aircraft.envelopes_for(result.category)[0].shape.coords(weight - burned, moment - 6.5 * burned, 0.0)
    px, py = ax.transData.transform((float(x), float(y)))
    sx, sy = positions["returns-at"]
    assert sx == pytest.approx(px, abs=0.05) and sy == pytest.approx(figure.bbox.height - py, abs=0.05)
    labels = _label_texts(svg)
    assert "path back inside" in labels["label-returns-at"]
    assert "outside from takeoff" in labels["label-takeoff"]


def test_a_path_outside_from_takeoff_to_landing_is_said_so_not_until_the_whole_trip_is_burned(tmp_path):
    _, result, _, svg = _trial_case(tmp_path, ("six.toml", _SIX), _SIX_FWD)
    # by hand: takeoff 2100 + 400 + 100 + 58.5 x 6 = 2951 lb, moment 176,400 + 32,000 + 2,000 +
    # 351 x 93 = 243,043 lb-in, CG 82.36 in; the forward limit at 2951 lb is 82 + 6 x 351 / 800 =
    # 84.63 in: outside; landing 2771 lb, CG (243,043 - 180 x 93) / 2771 = 81.67 in, limit 83.29 in:
    # outside; the limit moves aft 0.0075 in/lb while burning fuel at 93 in moves the CG forward.
    (excursion,) = result.burn_path.excursions
    assert excursion.from_takeoff and excursion.to_landing
    assert excursion.leaves is None and excursion.returns is None
    sentence = burn_path_sentence(result)
    assert sentence == "the CG is outside the envelope the whole way, from takeoff to landing."
    assert "until" not in sentence and "180.0" not in sentence
    positions = _marker_positions(svg)
    assert not any(k.startswith(("leaves-at", "returns-at")) for k in positions)
    assert "outside from takeoff" in _label_texts(svg)["label-takeoff"]


def test_a_path_that_leaves_and_comes_back_has_both_marked():
    _, result, _, svg = _drawn("twin6/leaves_path.toml")
    positions = _marker_positions(svg)
    first = result.burn_path.excursions[0]
    assert first.leaves is not None and first.returns is not None
    assert "leaves-at" in positions and "returns-at" in positions
    assert first.leaves.fuel_burned == pytest.approx(result.burn_path.leaves_at.fuel_burned)
    assert "where it comes back inside" in burn_path_sentence(result)
