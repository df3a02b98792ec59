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


def test_regression_no_mark_hides_another_unsaid():
    """heli2's dual loading puts ramp and takeoff in one character: R was hidden under T. Every condition
    mark is now drawn or listed under the one drawn in its place."""
    inputs, result = _inputs("heli2/dual.toml")
    lines = text_plot(inputs.aircraft, result, width=100)
    said = [line.strip() for line in lines if "under" in line and "(the same character)" in line]
    assert "R is under T (the same character)" in said
    grids = [line for line in lines if line.startswith(" " * 11 + "|")]
    drawn = "".join(grids)
    under = " ".join(said)
    for mark in "RTLZ":
        assert mark in drawn or f"{mark} is under" in under or f"{mark} and" in under, mark


def test_regression_text_plot_marks_no_leave_at_a_takeoff_already_outside_and_marks_the_return(tmp_path):
    # trial 10, finding 9 (the chart's twin here): the path of this loading starts outside at takeoff
    # and comes back in, so no X (it does not leave) and one O where it returns
    from .test_render_chart import _CARGO, _CARGO_AFT, _trial_case

    inputs, result, _, _ = _trial_case(tmp_path, ("cargo.toml", _CARGO), _CARGO_AFT)
    (excursion,) = result.burn_path.excursions
    assert excursion.from_takeoff and excursion.returns is not None
    rows = text_plot(inputs.aircraft, result, 60)
    picture = "\n".join(r for r in rows if r.strip().startswith("|"))
    said = "\n".join(rows)
    assert "X" not in picture and "X is under" not in said and "under X" not in said
    assert "O" in picture or "O is under" in said  # the return lies one character from takeoff here
