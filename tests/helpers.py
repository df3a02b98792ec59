"""Helpers for the tests: sample paths, raw sample data, a small aircraft built in code."""

from __future__ import annotations

import copy
from pathlib import Path
from typing import Any

from loadcheck import Aircraft
from loadcheck.files import parse_aircraft, read_toml

SAMPLES = Path(__file__).resolve().parent.parent / "sample_aircraft"


def sample(name: str) -> Path:
    """Path of a file under sample_aircraft/."""
    return SAMPLES / name


def sample_data(name: str) -> dict[str, Any]:
    """A sample file's raw TOML data (a fresh copy to modify)."""
    return copy.deepcopy(read_toml(sample(name)))


def simple_aircraft(**changes: Any) -> Aircraft:
    """A small aircraft (lb, in, US gal) for unit tests; keyword arguments replace tables."""
    data: dict[str, Any] = {
        "name": "Test box",
        "units": {"mass": "lb", "arm": "in", "fuel_volume": "usgal"},
        "empty": {"weight": 1000.0, "arm": 40.0},
        "limits": {"max_takeoff_weight": 2000.0},
        "station": [
            {"id": "front", "arm": 35.0, "kind": "seat"},
            {"id": "rear", "arm": 70.0, "kind": "seat"},
            {"id": "bag", "arm": 95.0, "kind": "baggage", "max_weight": 100.0},
        ],
        "tank": [{"id": "main", "arm": 45.0, "usable": 40.0, "fuel": "avgas"}],
        "envelope": [
            {"category": "normal", "axes": ["arm", "weight"],
             "points": [[35.0, 900], [35.0, 2000], [48.0, 2000], [48.0, 900]]}
        ],
    }
    data.update(changes)
    return parse_aircraft(data)
