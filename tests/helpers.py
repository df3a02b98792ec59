"""Helpers for the tests: sample paths, raw sample data, a small aircraft built in code, the
command-line runner (its command tree built once), random loadings for the engine."""

from __future__ import annotations

import copy
import functools
import sqlite3
from collections.abc import Sequence
from pathlib import Path
from typing import Any
from unittest import mock

import numpy as np
from typer.testing import CliRunner, Result

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
            {
                "category": "normal",
                "axes": ["arm", "weight"],
                "points": [[35.0, 900], [35.0, 2000], [48.0, 2000], [48.0, 900]],
            }
        ],
    }
    data.update(changes)
    return parse_aircraft(data)


def ac_example_aircraft() -> Aircraft:
    """The aircraft of AC 43.13-1B (1998) chapter 10, figures 10-10 to 10-14: basic empty
    weight 1,169 lb at +10.6 in, oil 17 lb at -49 in (here in the empty weight), seats at
    +16 in (two, with controls) and +48 in (two), baggage 100 lb at +75.5 in, fuel 40 US gal
    at +22 in, CG range +8.5 to +21.9 in, maximum weight 2,100 lb, 165 hp METO."""
    return parse_aircraft(
        {
            "name": "AC 43.13-1B chapter 10 example",
            "units": {"mass": "lb", "arm": "in", "fuel_volume": "usgal"},
            "empty": {"weight": 1169 + 17, "arm": (1169 * 10.6 - 17 * 49) / (1169 + 17)},
            "limits": {"max_takeoff_weight": 2100},
            "meto_power_hp": 165,
            "station": [
                {"id": "front", "arm": 16, "kind": "seat", "seats": 2, "controls": True},
                {"id": "rear", "arm": 48, "kind": "seat", "seats": 2},
                {"id": "bag", "arm": 75.5, "kind": "baggage", "max_weight": 100},
            ],
            "tank": [{"id": "main", "arm": 22, "usable": 40, "fuel": "avgas"}],
            "envelope": [
                {
                    "category": "normal",
                    "axes": ["arm", "weight"],
                    "points": [[8.5, 1000], [8.5, 2100], [21.9, 2100], [21.9, 1000]],
                }
            ],
        }
    )


class AppRunner(CliRunner):
    """typer's ``CliRunner`` over loadcheck's command tree built once.

    ``typer.testing.CliRunner.invoke`` rebuilds the click command tree from the typer app
    on every call (about 13 ms on an idle machine, far more on a busy one: most of the
    suite's command-line time); this runner builds it once and hands the same tree to every
    invocation. Use it as the ``runner`` fixture (tests/conftest.py) or, outside a test,
    through :func:`app_runner`; ``runner.invoke(app, args)`` reads as before.
    """

    def __init__(self) -> None:
        import typer.main

        from loadcheck.cli import app

        super().__init__()
        self.app = app
        self.command = typer.main.get_command(app)

    def invoke(self, app: Any, args: str | Sequence[str] | None = None, **kwargs: Any) -> Result:  # type: ignore[override]
        assert app is self.app, "AppRunner runs loadcheck.cli.app only"
        with mock.patch("typer.testing._get_command", lambda _app: self.command):
            return super().invoke(app, args, **kwargs)


@functools.cache
def app_runner() -> AppRunner:
    """The one :class:`AppRunner` of the test session."""
    return AppRunner()


def invoke(*args: str, **kwargs: Any) -> Result:
    """``loadcheck ARGS...`` through the session's :class:`AppRunner`."""
    from loadcheck.cli import app

    return app_runner().invoke(app, list(args), **kwargs)


def write_file(folder: Path, text: str | bytes, name: str = "aircraft.toml") -> str:
    """Write ``text`` (or bytes) as ``folder/name``; return the path as a command-line argument."""
    path = folder / name
    if isinstance(text, bytes):
        path.write_bytes(text)
    else:
        path.write_text(text)
    return str(path)


def assert_input_error(result: Result, *words: str) -> None:
    """The command refused its input (exit 2) without a traceback, its message holding each of ``words``."""
    assert result.exit_code == 2, result.output
    assert "Traceback" not in result.output
    for word in words:
        assert word in result.output, result.output


def logged_checks(db: Path) -> int:
    """How many checks the check log ``db`` holds."""
    from loadcheck.checklog import CheckLog

    with CheckLog(db) as log:
        return len(list(log.listing()))


def checked_sample(name: str) -> tuple[Any, Any]:
    """A sample loading file's inputs (``load_check_inputs``) and its ``check_loading`` result."""
    from loadcheck import check_loading, load_check_inputs

    inputs = load_check_inputs(sample(name))
    return inputs, check_loading(inputs.aircraft, inputs.loading)


def record_sheet(tmp_path: Path, command: str, aircraft: Path, source: Path) -> str:
    """The HTML record that ``weigh`` or ``alter`` writes with ``--sheet`` (the command must exit 0)."""
    from loadcheck.cli import app

    sheet = tmp_path / f"{command}.html"
    result = app_runner().invoke(app, [command, str(aircraft), str(source), "--sheet", str(sheet)])
    assert result.exit_code == 0, result.output
    return sheet.read_text()


def cell(html: str, cell_id: str) -> str:
    """The text of the HTML element with that id."""
    start = html.index(f"id='{cell_id}'>") + len(f"id='{cell_id}'>")
    return html[start : html.index("</", start)]


def examples(short: int) -> int:
    """``max_examples`` for a hypothesis test: ``short`` in the default run, scaled by the
    loaded profile (``--long``: ten times; tests/conftest.py registers the profiles)."""
    from hypothesis import settings

    current = settings.default
    assert current is not None
    return max(1, short * current.max_examples // 100)


def random_loadings(
    aircraft: Aircraft,
    n: int,
    order: Sequence[str] | None = None,
    seed: int = 1,
    *,
    over: float = 1.05,
    default_max: float = 200.0,
    taxi_max: float = 2.0,
    zero_trip: float = 0.0,
) -> tuple[np.ndarray, np.ndarray, np.ndarray, np.ndarray]:
    """``n`` random loadings of an aircraft as the engine's arrays (``engine.evaluate``'s inputs).

    Each station's weight is uniform between 0 and ``over`` times its maximum
    (``default_max`` where it has none), so some loadings exceed a limit on purpose; each
    tank's fuel uniform between 0 and its usable capacity; taxi fuel uniform up to
    ``taxi_max`` but no more than the fuel the burn order uses; trip fuel a uniform share
    of the rest, none in a share ``zero_trip`` of the rows. The one random-loading
    generator of the tests and the benchmarks (benchmarks/batch.py).

    Returns
    -------
    stations : (n, stations) [mass unit]; fuel : (n, tanks) [fuel volume unit];
    taxi, trip : (n,) [fuel volume unit]
    """
    rng = np.random.default_rng(seed)
    stations = np.stack([rng.uniform(0, (s.max_weight or default_max) * over, n) for s in aircraft.station], axis=1)
    fuel = np.stack([rng.uniform(0, t.usable, n) for t in aircraft.tank], axis=1) if aircraft.tank else np.zeros((n, 0))
    ids = [t.id for t in aircraft.tank]
    burnable = fuel.sum(1) if order is None else fuel[:, [ids.index(x) for x in order]].sum(1)
    taxi = np.minimum(rng.uniform(0, taxi_max, n), burnable)
    trip = (burnable - taxi) * rng.uniform(0, 1, n)
    if zero_trip:
        trip[rng.uniform(size=n) < zero_trip] = 0.0
    return stations, fuel, taxi, trip


def random_resolved_loadings(
    aircraft: Aircraft, count: int, seed: int, order: Sequence[str] | None = None, reserve: float | None = None
) -> list[Any]:
    """Random loadings of an aircraft as loading files give them, resolved; those it refuses left out.

    Each station is loaded in four of five loadings, uniform up to 1.1 times its maximum (200
    where it has none), so some exceed a limit on purpose (a seat with flight controls is left
    empty now and then); each tank uniform up to its usable fuel; taxi fuel up to 2, trip fuel a
    uniform share of the rest of the fuel the burn order uses; ``reserve`` as given.
    """
    from loadcheck.errors import LoadcheckError
    from loadcheck.loading import Loading, resolve_loading

    rng = np.random.default_rng(seed)
    out = []
    for _ in range(count):
        load = {
            s.id: float(rng.uniform(0, (s.max_weight or 200) * 1.1)) for s in aircraft.station if rng.random() < 0.8
        }
        fuel = {t.id: float(rng.uniform(0, t.usable)) for t in aircraft.tank}
        burnable = sum(fuel.values()) if order is None else sum(fuel[t] for t in order)
        taxi = min(float(rng.uniform(0, 2)), burnable)
        trip = float((burnable - taxi) * rng.uniform(0, 1))
        burn: dict[str, Any] = {"taxi": taxi, "trip": trip, "order": list(order) if order else "together"}
        if reserve is not None:
            burn["reserve"] = reserve
        try:
            out.append(resolve_loading(Loading(load=load, fuel=fuel, burn=burn), aircraft))
        except LoadcheckError:
            continue
    return out


def tamper_check_log(db: Path, statement: str, *args: object) -> None:
    """Edit a record behind the triggers' back, as someone with the database file could."""
    connection = sqlite3.connect(db)
    connection.execute("DROP TRIGGER checks_never_rewritten")
    connection.execute(statement, args)
    connection.commit()
    connection.close()


# -- the trip test aircraft -------------------------------------------------------------------
#
# TEST-T, the one test aircraft of the trip tests (tests/test_trip.py, the fleet's and the
# check log's trips) and of the desk's (tests/web_helpers.py: its fleet holds it as
# trip_test.toml). Invented (not a sample, not a real type), in lb, in and US gal, so that
# its figures can be worked by hand with the moment method of FAA-H-8083-1B (2016) ch. 2
# (moment = weight x arm; CG = total moment / total weight). Its limits are INVENTED:
# empty 1,000 lb at 80 in; front seats 70 in, rear seats 110 in (each at most 400 lb);
# baggage far aft at 180 in (at most 100 lb); one tank at 90 in, 40 US gal of avgas at
# 6.0 lb/US gal (common practice, ASTM D910 grade density as the trade uses it), its fill
# level `local` 25 US gal; maximum takeoff weight 1,800 lb; CG 74 to 86 in from 1,000 to
# 1,800 lb.
#
# Trip "A" (TRIP_DAY, TRIP_LOADING): leg 1, the pilot (180 lb front), 30 gal, taxi 1, trip
# 10: ramp 1,360 lb, 108,800 lb-in, CG 80.00 in (within); it lands with 19 gal. Leg 2: two
# passengers board the rear seats (400 lb), no fuel put in, taxi 1, trip 10: ramp 1,000 +
# 180 + 400 + 114 = 1,694 lb, 80,000 + 12,600 + 44,000 + 10,260 = 146,860 lb-in, CG 86.69 in
# (aft of 86); takeoff 1,688 lb, 146,320 lb-in, 86.68 in; landing (8 gal, 48 lb) 1,628 lb,
# 140,920 lb-in, 86.56 in: leg 2 alone is out of limits, aft, at every condition.

TRIP_AIRCRAFT = """format = 1
name = "Trip test aircraft (invented for the tests)"
registration = "TEST-T"
[units]
mass = "lb"
arm = "in"
fuel_volume = "usgal"
[empty]
weight = 1000.0
arm = 80.0
date = 2026-11-01
[limits]
max_takeoff_weight = 1800
[[station]]
id = "front"
label = "Front seats"
kind = "seat"
arm = 70.0
max_weight = 400
[[station]]
id = "rear"
label = "Rear seats"
kind = "seat"
arm = 110.0
max_weight = 400
[[station]]
id = "bags"
label = "Baggage"
kind = "baggage"
arm = 180.0
max_weight = 100
[[tank]]
id = "main"
label = "Main tank"
arm = 90.0
usable = 40.0
fuel = "avgas"
levels = { local = 25.0 }
[[envelope]]
category = "normal"
axes = ["arm", "weight"]
points = [[74.0, 1000], [74.0, 1800], [86.0, 1800], [86.0, 1000]]
"""

TRIP_DAY = """registration,reference,trip_id,leg,front,rear,main,taxi,trip
TEST-T,F1,A,1,180,0,30,1,10
TEST-T,,A,2,,400,,1,10
TEST-T,F2,,,180,0,20,1,5
"""

TRIP_LOADING = """format = 1
aircraft = "aircraft.toml"
[load]
front = 180
rear = 0
[fuel]
main = 30
[burn]
taxi = 1
trip = 10
[[leg]]
load = { rear = 400 }
burn = { taxi = 1, trip = 10 }
"""


def trip_fleet(folder: Path) -> Path:
    """Write TEST-T (``TRIP_AIRCRAFT``), the day (trip "A", whose leg 2 fails, then a single
    flight) and trip "A" as a loading file into ``folder``; return the folder."""
    folder.mkdir(parents=True, exist_ok=True)
    (folder / "aircraft.toml").write_text(TRIP_AIRCRAFT)
    (folder / "day.csv").write_text(TRIP_DAY)
    (folder / "trip.toml").write_text(TRIP_LOADING)
    return folder


# -- trial 11's invented tandem ---------------------------------------------------------------
#
# An outside trial's invention (not a sample, not a real type), in kg, cm and imperial gallons: a
# tandem two-seater whose aft limit slopes from 48 cm at 500 kg to 40 cm at 720 kg, the forward limit
# fixed at 20 cm; the extremes' and the planning's trial-11 tests work their figures by hand on it.
TRIAL_GULL = """format = 1
name = "Invented tandem (trial 11)"
registration = "TR-GUL"
meto_power_hp = 60
standard_occupant_weight = 80
[units]
mass = "kg"
arm = "cm"
fuel_volume = "impgal"
[empty]
weight = 455.0
arm = 42.0
[limits]
max_takeoff_weight = 720
max_landing_weight = 700
min_flight_weight = 500
[[station]]
id = "p1"
kind = "seat"
arm = -20.0
min_weight = 60
max_weight = 115
controls = true
[[station]]
id = "p2"
kind = "seat"
arm = 75.0
max_weight = 115
[[station]]
id = "locker"
kind = "baggage"
arm = 140.0
max_weight = 15
[[tank]]
id = "fus"
arm = 60.0
usable = 12.0
density = 3.27
[[envelope]]
category = "normal"
axes = ["arm", "weight"]
points = [[20, 500], [20, 720], [40, 720], [48, 500]]
"""
