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
