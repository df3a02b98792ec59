"""Charts, the load sheet, the text plot and the aircraft overview."""

from __future__ import annotations

import re
import subprocess
import sys
import xml.etree.ElementTree as ET
from html.parser import HTMLParser
from pathlib import Path

import pytest
from typer.testing import CliRunner

from loadcheck import check_loading, load_check_inputs
from loadcheck.caution import PILOT_CAUTION
from loadcheck.cli import app
from loadcheck.display import fmt
from loadcheck.render.chart import check_figure, envelope_figure, save_figure
from loadcheck.render.textplot import text_plot

from .helpers import sample

runner = CliRunner()
SVG = "{http://www.w3.org/2000/svg}"
XLINK = "{http://www.w3.org/1999/xlink}"


def _inputs(name: str):
    inputs = load_check_inputs(sample(name))
    return inputs, check_loading(inputs.aircraft, inputs.loading)


@pytest.mark.parametrize("suffix, magic", [("png", b"\x89PNG"), ("svg", b"<?xml"), ("pdf", b"%PDF")])
def test_chart_in_each_format(tmp_path, suffix, magic):
    path = tmp_path / f"chart.{suffix}"
    result = runner.invoke(app, ["check", str(sample("twin6/leaves_path.toml")), "--chart", str(path)])
    assert result.exit_code == 1
    data = path.read_bytes()
    assert len(data) > 2000 and data.startswith(magic)


def test_unknown_chart_format(tmp_path):
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


def test_load_sheet_content(tmp_path):
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


def test_sheet_must_be_html(tmp_path):
    result = runner.invoke(app, ["check", str(sample("trainer4/within.toml")), "--sheet", str(tmp_path / "s.pdf")])
    assert result.exit_code == 2


def test_text_plot_marks_every_condition():
    inputs, result = _inputs("twin6/leaves_path.toml")
    lines = text_plot(inputs.aircraft, result)
    body = "\n".join(lines)
    for mark in "TLZX":
        assert mark in body
    assert "#" in body and "." in body
    out = runner.invoke(app, ["check", str(sample("trainer4/within.toml")), "--plot"])
    assert "R ramp" in out.output
    assert out.output.index("R ramp") < out.output.index("CAUTION")  # the caution stays last


def test_show_lists_everything(tmp_path):
    result = runner.invoke(app, ["show", str(sample("twin6/aircraft.toml")), "--chart", str(tmp_path / "e.png")],
                           env={"COLUMNS": "200"})  # every table side by side
    assert result.exit_code == 0, result.output
    for words in ["3,680.0 lb", "Main tanks", "600.0", "Middle seats", "(295.2, 3600)", "5,000.0 lb", "CAUTION"]:
        assert words in result.output
    assert (tmp_path / "e.png").stat().st_size > 2000
    assert runner.invoke(app, ["show", str(sample("twin6/aircraft.toml")), "--category", "nope"]).exit_code == 2


def test_plain_check_does_not_import_matplotlib():
    code = (
        "import sys\nimport loadcheck.cli as c\nsys.argv=['loadcheck','check',%r]\n"
        "try:\n    c.main()\nexcept SystemExit:\n    pass\nprint('matplotlib' in sys.modules)" % str(sample("trainer4/within.toml"))
    )
    out = subprocess.run([sys.executable, "-c", code], capture_output=True, text=True, check=False)
    assert out.stdout.strip().endswith("False"), out.stdout + out.stderr


def test_readme_chart_is_committed():
    assert Path(sample("")).parent.joinpath("docs/images/twin-leaves-path.png").stat().st_size > 10_000
