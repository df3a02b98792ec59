"""Registrations as compared: letters and digits alone, in capitals (common practice: the hyphen
after the nationality mark is written or left out, as painted on the aircraft)."""

import pytest

from loadcheck.errors import InputError
from loadcheck.registration import registration_key, required_key


@pytest.mark.parametrize("text", ["G-ABCD", "g-abcd", "GABCD", " G ABCD ", "g.abcd"])
def test_spellings_of_one_registration_share_one_key(text):
    assert registration_key(text) == "GABCD"


def test_other_registrations_have_other_keys():
    assert registration_key("N12345") != registration_key("N1234")
    assert registration_key("D-EFGH") != registration_key("G-ABCD")


@pytest.mark.parametrize("text", ["", "-", "  ", "...", "-/-"])
def test_a_text_with_no_letter_or_digit_is_refused_not_matched(text):
    assert registration_key(text) == ""  # the empty key would match every other such text
    with pytest.raises(InputError) as refused:
        required_key(text)
    [problem] = refused.value.problems
    assert problem.field == "registration"
    assert "no letter or digit" in problem.describe()


def test_required_key_names_the_field_it_came_from():
    with pytest.raises(InputError) as refused:
        required_key("-", field="--registration")
    assert refused.value.problems[0].field == "--registration"
    assert required_key("demo-4t") == "DEMO4T"
