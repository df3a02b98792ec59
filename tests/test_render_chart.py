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
from loadcheck.render.chart import check_figure, envelope_figure, save_figure

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
        if gid.startswith(("point-", "leaves-at")):
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
    filled = [(gid, box) for gid, box in markers if not gid.startswith("leaves-at")]
    for i, (gid, box) in enumerate(filled):
        for later, cover in filled[i + 1 :]:
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
