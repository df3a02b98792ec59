"""The rules every model read from a file shares (loadcheck/filemodel.py): an unknown key is an
error, never dropped. A TOML true/false where a number belongs is refused: the regression test
is tests/test_regressions.py::test_true_where_a_number_belongs_is_refused."""

from __future__ import annotations

from .helpers import sample_data
from .test_aircraft import _problems


def test_misspelt_field_is_an_error_not_ignored():
    data = sample_data("trainer4/aircraft.toml")
    data["station"][0]["max_wieght"] = 400
    assert "station[0].max_wieght" in _problems(data)
