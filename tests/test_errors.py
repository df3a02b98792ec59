"""Tests of loadcheck/errors.py: what a refusal says, and to whom it attributes the value.

The rules are the project's own (../shared/DESIGN.md, "errors"): every problem names its field,
the value and what was expected; a value typed on the command line is the command line's,
never the loading file's. The spelling hint uses difflib's similarity ratio (Python standard
library documentation, difflib.get_close_matches: cutoff 0.6).
"""

from __future__ import annotations

import pytest

from loadcheck.errors import InputError, LoadcheckError, Problem, UnknownNameError, spelling_hint


def test_a_problem_says_its_field_value_and_what_was_expected():
    problem = Problem("station[2].max_weight", "must not be negative", -5.0, "a mass of 0 or more")
    assert problem.describe() == "station[2].max_weight: must not be negative; got -5.0; expected a mass of 0 or more"
    assert Problem("", "the file is empty").describe() == "the file is empty"


def test_an_error_names_its_file_once_but_never_for_a_command_line_value():
    error = InputError(
        [Problem("load.front", "must not be negative", -5.0), Problem("--load rear=-1", "must not be negative")]
    )
    error.with_file("within.toml").with_file("other.toml")  # the first attribution holds
    assert error.lines() == [
        "within.toml: load.front: must not be negative; got -5.0",
        "--load rear=-1: must not be negative",
    ]
    assert str(error) == "\n".join(error.lines())


def test_every_error_is_one_kind_of_bad_input():
    # the front ends turn LoadcheckError (and only it) into exit status 2 with the problems
    assert issubclass(UnknownNameError, LoadcheckError) and issubclass(InputError, LoadcheckError)
    with pytest.raises(LoadcheckError, match="no such tank"):
        raise UnknownNameError("no such tank")


@pytest.mark.parametrize(
    "word, choices, hint",
    [
        ("frnt", ["front", "rear", "hold"], " (did you mean 'front'?)"),
        ("max_ramp_wieght", ["max_ramp_weight", "max_landing_weight"], " (did you mean 'max_ramp_weight'?)"),
        ("nose", ["front", "rear"], ""),  # nothing close: no guess
        ("front", [], ""),
    ],
)
def test_the_spelling_hint_names_the_closest_key_or_nothing(word, choices, hint):
    assert spelling_hint(word, choices) == hint
