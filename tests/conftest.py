"""Shared fixtures: the sample aircraft."""

from __future__ import annotations

import pytest

from loadcheck import Aircraft, load_aircraft

from .helpers import sample


@pytest.fixture(scope="session")
def trainer() -> Aircraft:
    return load_aircraft(sample("trainer4/aircraft.toml"))


@pytest.fixture(scope="session")
def tandem() -> Aircraft:
    return load_aircraft(sample("tandem2/aircraft.toml"))


@pytest.fixture(scope="session")
def twin() -> Aircraft:
    return load_aircraft(sample("twin6/aircraft.toml"))


def pytest_addoption(parser: pytest.Parser) -> None:
    parser.addoption("--full", action="store_true", help="run the long property and oracle runs in full")


@pytest.fixture(scope="session")
def oracle_cases(request: pytest.FixtureRequest) -> int:
    """Random cases for the oracle comparison: 1,500 by default, 100,000 with --full."""
    import os

    if request.config.getoption("--full"):
        return 100_000
    return int(os.environ.get("ORACLE_CASES", "1500"))
