"""Sentences from results (loadcheck/words.py): the burn-path summary and the stretches, with
rounding that never reverses a stretch."""

from __future__ import annotations

from hypothesis import given
from hypothesis import strategies as st

from loadcheck import check_loading, load_check_inputs

from .helpers import sample


def test_plan_words_for_a_path_outside_from_takeoff():
    # regression: a loading already outside at takeoff was said to leave the envelope
    # "after 0.0 kg burned"
    from loadcheck.words import burn_path_summary

    inputs = load_check_inputs(sample("tandem2/aft_heavy.toml"))
    result = check_loading(inputs.aircraft, inputs.loading)
    assert not result.condition("takeoff").ok
    text = burn_path_summary(result)
    assert "from takeoff" in text and "after 0.0" not in text


@given(st.floats(0, 5000), st.floats(0, 20), st.sampled_from(["lb", "kg", "in", "mm", "usgal", "l"]))
def test_a_stretch_is_never_shown_with_its_low_end_above_its_high_end(low, width, unit):
    # regression: plan shift showed "46.9 to 46.8"
    from loadcheck.words import stretch_text

    text = stretch_text(low, low + width, unit)
    numbers = [float(x.replace(",", "")) for x in text.replace("only", "").replace(unit, "").split("to")]
    assert numbers == sorted(numbers)
    if len(numbers) == 2:  # rounded inward: both ends shown are within the stretch (display rounding noise aside)
        noise = 1e-9 * max(1.0, low + width) * 10 ** (len(text.split()[0].split(".")[-1]))
        assert low - noise <= numbers[0] < numbers[1] <= low + width + noise
