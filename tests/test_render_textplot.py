"""The character plot under `check --plot` (loadcheck/render/textplot.py)."""

from __future__ import annotations

from loadcheck.cli import app
from loadcheck.render.textplot import text_plot

from .helpers import checked_sample as _inputs
from .helpers import sample


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
