"""Tests of loadcheck/caution.py: the cautions every output carries.

What each caution must defer to is the project's contract (../shared/DESIGN.md, "Cautions"):
a pilot's output to the approved flight manual, the current weight-and-balance record and the
pilot in command; a mechanic's output to local rules and licensed practice. That the cautions
end each output is tested with the outputs (tests/test_cli_pilot.py, test_cli_mechanic.py,
test_terminal_width.py).
"""

from __future__ import annotations

from loadcheck.caution import MECHANIC_CAUTION, PILOT_CAUTION


def test_the_pilots_caution_defers_to_the_manual_the_record_and_the_pilot_in_command():
    for words in ("approved flight manual", "current weight-and-balance record", "pilot in command"):
        assert words in PILOT_CAUTION


def test_the_mechanics_caution_defers_to_local_rules_and_licensed_persons():
    for words in ("approved flight manual", "local aviation authority", "licensed"):
        assert words in MECHANIC_CAUTION
    assert "pilot in command" not in MECHANIC_CAUTION
