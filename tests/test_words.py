"""Sentences from results (loadcheck/words.py): the burn-path summary and the stretches, with
rounding that never reverses a stretch."""

from __future__ import annotations

import pytest
from hypothesis import given
from hypothesis import strategies as st

from loadcheck import check_loading, load_check_inputs

from .helpers import sample, sample_data


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


@pytest.mark.parametrize(
    "overall, verdict",
    [
        (True, "the change is negligible"),
        (False, "the change is not negligible"),
        (None, "whether the change is negligible cannot be judged"),
    ],
)
def test_regression_the_negligible_verdict_is_grammatical_in_every_branch(overall, verdict):
    # a change whose CG rule cannot be applied read "the change is cannot be judged"
    # AC 43.13-1B 10-2 c: the verdict is negligible, not negligible, or (no MAC) not judged
    from loadcheck.words import negligible_text

    text = negligible_text(overall, "the weight changes by +0.4 lb", "the CG moves +0.01 in")
    assert text == f"AC 43.13-1B 10-2 c: {verdict}: the weight changes by +0.4 lb, and the CG moves +0.01 in."
    assert "is cannot" not in text


@pytest.mark.parametrize(
    "weight, overall, verdict",
    [
        (0.4, None, "whether the change is negligible cannot be judged"),
        (4.0, False, "the change is not negligible"),
    ],
)
def test_regression_an_alteration_without_a_mac_says_its_verdict_plainly(weight, overall, verdict):
    # AC 43.13-1B 10-2 c: 1 lb or less at an empty weight under 5,000 lb; the CG rule (0.05 % MAC)
    # needs the MAC, so without one a small change cannot be judged and a large one is not negligible
    from loadcheck.alterations import Changes, alter
    from loadcheck.files import parse_aircraft

    data = sample_data("trainer4/aircraft.toml")
    del data["mac"]
    change = {"action": "install", "item": "placard", "weight": weight, "arm": 40.0}
    result = alter(parse_aircraft(data), Changes.model_validate({"change": [change]}))
    assert result.negligible.overall is overall
    assert result.negligible.text.startswith(f"AC 43.13-1B 10-2 c: {verdict}: the weight changes by +")
    assert result.negligible.text.endswith(
        "and the CG rule (0.05 % MAC) cannot be applied: the aircraft file gives no MAC."
    )
    assert "is cannot" not in result.negligible.text
