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


def ac_example_aircraft() -> Aircraft:
    """The aircraft of AC 43.13-1B (1998) chapter 10, figures 10-10 to 10-14: basic empty
    weight 1,169 lb at +10.6 in, oil 17 lb at -49 in (here in the empty weight), seats at
    +16 in (two, with controls) and +48 in (two), baggage 100 lb at +75.5 in, fuel 40 US gal
    at +22 in, CG range +8.5 to +21.9 in, maximum weight 2,100 lb, 165 hp METO."""
    return parse_aircraft({
        "name": "AC 43.13-1B chapter 10 example", "units": {"mass": "lb", "arm": "in", "fuel_volume": "usgal"},
        "empty": {"weight": 1169 + 17, "arm": (1169 * 10.6 - 17 * 49) / (1169 + 17)},
        "limits": {"max_takeoff_weight": 2100}, "max_continuous_power_hp": 165,
        "station": [{"id": "front", "arm": 16, "kind": "seat", "seats": 2, "controls": True},
                    {"id": "rear", "arm": 48, "kind": "seat", "seats": 2},
                    {"id": "bag", "arm": 75.5, "kind": "baggage", "max_weight": 100}],
        "tank": [{"id": "main", "arm": 22, "usable": 40, "fuel": "avgas"}],
        "envelope": [{"category": "normal", "axes": ["arm", "weight"],
                      "points": [[8.5, 1000], [8.5, 2100], [21.9, 2100], [21.9, 1000]]}],
    })


def record_sheet(tmp_path: Path, command: str, aircraft: Path, source: Path) -> str:
    """The HTML record that ``weigh`` or ``alter`` writes with ``--sheet`` (the command must exit 0)."""
    from typer.testing import CliRunner

    from loadcheck.cli import app

    sheet = tmp_path / f"{command}.html"
    result = CliRunner().invoke(app, [command, str(aircraft), str(source), "--sheet", str(sheet)])
    assert result.exit_code == 0, result.output
    return sheet.read_text()


def cell(html: str, cell_id: str) -> str:
    """The text of the HTML element with that id."""
    start = html.index(f"id='{cell_id}'>") + len(f"id='{cell_id}'>")
    return html[start: html.index("</", start)]
