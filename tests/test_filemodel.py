"""The rules every model read from a file shares (loadcheck/filemodel.py): an unknown key is an
error, never dropped. A TOML true/false where a number belongs is refused: the regression test
is tests/test_regressions.py::test_true_where_a_number_belongs_is_refused."""

from __future__ import annotations

import pytest

from .helpers import sample_data
from .test_aircraft import _problems


def test_misspelt_field_is_an_error_not_ignored():
    data = sample_data("trainer4/aircraft.toml")
    data["station"][0]["max_wieght"] = 400
    assert "station[0].max_wieght" in _problems(data)


def _loading_problems(data: dict) -> list[tuple[str, str]]:
    import pytest

    from loadcheck.errors import InputError
    from loadcheck.files import parse_loading

    with pytest.raises(InputError) as refused:
        parse_loading(data)
    return [(p.field, p.message) for p in refused.value.problems]


def test_regression_a_boolean_for_a_number_was_named_by_its_table_alone_and_format_true_was_taken():
    """`[load] front = true` said "load: expected a number" (which station?), `[burn] taxi = true` said
    "burn: taxi: ...", and `format = true` was taken as format 1 (pydantic reads true as 1). TOML v1.0.0
    ("Boolean") makes true/false a type of its own: each place is now named as the user reads it, one
    problem per place, format included (fail closed, common practice)."""
    base = {"load": {"front": 170.0}, "fuel": {"mains": 20.0}}
    expected = "expected a number, got true or false"
    assert _loading_problems({**base, "format": True}) == [("format", expected)]
    assert _loading_problems({**base, "load": {"front": True, "rear": False}}) == [
        ("load.front", expected),
        ("load.rear", expected),
    ]
    assert _loading_problems({**base, "fuel": {"mains": True}}) == [("fuel.mains", expected)]
    assert _loading_problems({**base, "burn": {"taxi": True, "trip": False}}) == [
        ("burn.taxi", expected),
        ("burn.trip", expected),
    ]
    assert _loading_problems({**base, "leg": [{"load": {"front": False}}]}) == [
        ("leg 2, load.front", expected),
        ("leg 2, burn", "this field is required"),  # said beside it (below: no stages)
    ]
    aircraft = sample_data("trainer4/aircraft.toml")
    assert "format" in _problems({**aircraft, "format": True})
    aircraft["station"][0]["arm"] = True
    assert "station[0].arm" in _problems(aircraft)


def test_regression_a_boolean_for_a_number_hid_every_other_problem_of_the_file() -> None:
    """``format = true`` beside ``[burn] reserve = true`` and ``taxi = "abc"`` said only "format:
    ...": the true/false rule refused the file before its fields were read, so the user fixed one
    problem to be shown the next. Every problem of the file is now said at once, each once."""
    expected = "expected a number, got true or false"
    said = _loading_problems(
        {"format": True, "load": {"front": True}, "fuel": {"mains": 20.0}, "burn": {"reserve": True, "taxi": "abc"}}
    )
    assert said[:3] == [("format", expected), ("load.front", expected), ("burn.reserve", expected)]
    assert [field for field, _ in said] == ["format", "load.front", "burn.reserve", "burn.taxi"]
    assert "cannot read 'abc' as a number" in said[3][1]


@pytest.mark.parametrize("value", [1, 0, "yes", "true", "on", 1.0])
def test_regression_a_yes_no_field_took_1_or_yes_for_true(value: object) -> None:
    """``controls = 1`` and ``controls = "yes"`` were read as true (pydantic's lax mode reads 1,
    "yes", "on" and "true" as a boolean): a guess at what the user meant. TOML v1.0.0 ("Boolean")
    has true and false of their own; anything else in a yes/no field is refused, naming the field
    and the value as given (fail closed, common practice)."""
    aircraft = sample_data("tandem2/aircraft.toml")
    aircraft["station"][0]["controls"] = value
    said = _problems(aircraft)
    assert f"station[0].controls: a yes/no field; got {value!r}" in said and "true or false" in said
    aircraft = sample_data("heli2/aircraft.toml")
    aircraft["rotorcraft"] = value
    assert f"rotorcraft: a yes/no field; got {value!r}" in _problems(aircraft)


def test_a_yes_no_field_takes_true_and_false() -> None:
    from loadcheck.files import parse_aircraft

    aircraft = sample_data("tandem2/aircraft.toml")
    for value in (True, False):
        aircraft["station"][0]["controls"] = value
        assert parse_aircraft(aircraft).station[0].controls is value
