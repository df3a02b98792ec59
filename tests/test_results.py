"""Tests of loadcheck/results.py: the result classes and their JSON form.

The JSON form is DESIGN.md's (../shared/DESIGN.md, "JSON output"): every field of a result but
its drawing data, in order, fields that are None left out. The rule is applied here by
reading the dataclass fields, independently of the per-class code in results.py.
"""

from __future__ import annotations

import pytest

from loadcheck import check_loading, load_check_inputs

from .helpers import sample


def _json_form(value):
    """DESIGN.md's JSON form of a result, by its rule: every field but drawing data, in order,
    those that are None left out, results and lists of them converted in turn."""
    import dataclasses

    from loadcheck.results import Result

    if isinstance(value, list):
        return [_json_form(v) for v in value]
    if not isinstance(value, Result):
        return value
    out = {}
    for f in dataclasses.fields(value):
        if not f.metadata.get("drawing") and getattr(value, f.name) is not None:
            out[f.name] = _json_form(getattr(value, f.name))
    return out


@pytest.mark.parametrize(
    "name",
    ["twin6/leaves_path.toml", "twin6/two_stretches.toml", "heli2/solo_heavy_right.toml", "trainer4/within.toml"],
)
def test_the_json_form_holds_every_field_by_its_rule(name):
    # to_dict is written out once per class from its fields (results.py): it must give what the
    # rule gives, field for field, key order included, and leave out the drawing samples
    inputs = load_check_inputs(sample(name))
    result = check_loading(inputs.aircraft, inputs.loading)
    assert result.burn_path.samples  # drawing data present, to be left out
    data = result.to_dict()
    assert data == _json_form(result) and list(data) == list(_json_form(result))
    assert "samples" not in data["burn_path"] and "caution" in data


def test_the_json_form_of_a_trip_names_each_leg(tmp_path):
    # a subclass with fields of its own (TripFinding) converts them; a class with its own
    # to_dict (TripLeg: the leg's number, label and stop, then its check's fields) keeps it
    from loadcheck.trip import check_trip

    from .test_trip import trip_fleet

    inputs = load_check_inputs(trip_fleet(tmp_path) / "trip.toml", allow_trip=True)
    result = check_trip(inputs.aircraft, inputs.trip)
    data = result.to_dict()
    assert all(f["leg"] == finding.leg for f, finding in zip(data["findings"], result.findings, strict=True))
    assert data["findings"] == _json_form(result.findings)
    for leg, shown in zip(result.legs, data["legs"], strict=True):
        stop = {} if leg.stop is None else {"stop": _json_form(leg.stop)}
        assert list(shown)[:1] == ["leg"] and shown == {"leg": leg.leg, **stop, **_json_form(leg.check)}
    assert "stop" not in data["legs"][0] and all("stop" in leg for leg in data["legs"][1:])
