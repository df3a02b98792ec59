"""loadcheck: aircraft weight and balance.

Check a loading against every limit of an aircraft at ramp, takeoff, landing and zero
fuel and along the whole fuel burn. Advisory only: the aircraft's approved flight manual
and its current weight-and-balance record govern, and the pilot in command decides.
"""

from __future__ import annotations

__version__ = "0.1.0"

from typing import TYPE_CHECKING

if TYPE_CHECKING:
    from .aircraft import Aircraft, EmptyWeight, Envelope, Limits, Mac, Station, StationGroup, Tank, Units
    from .caution import MECHANIC_CAUTION, PILOT_CAUTION
    from .check import check_loading
    from .errors import FileFormatError, InputError, LoadcheckError, UnitError, UnknownNameError
    from .files import load_aircraft, load_check_inputs, load_loading
    from .loading import Burn, Loading, ResolvedLoading, resolve_loading
    from .results import CheckResult, Condition, Finding

# Every entry point loads on first use (PEP 562): importing the package costs nothing, so
# that the command line can set up the process (one BLAS thread, loadcheck.cli) before
# numpy loads, and a plain check does not pay for building the models it does not use.
_LAZY = {
    **dict.fromkeys(
        ("Aircraft", "EmptyWeight", "Envelope", "Limits", "Mac", "Station", "StationGroup", "Tank", "Units"), "aircraft"
    ),
    **dict.fromkeys(("MECHANIC_CAUTION", "PILOT_CAUTION"), "caution"),
    "check_loading": "check",
    **dict.fromkeys(("FileFormatError", "InputError", "LoadcheckError", "UnitError", "UnknownNameError"), "errors"),
    **dict.fromkeys(("load_aircraft", "load_check_inputs", "load_loading"), "files"),
    **dict.fromkeys(("Burn", "Loading", "ResolvedLoading", "resolve_loading"), "loading"),
    **dict.fromkeys(("CheckResult", "Condition", "Finding"), "results"),
    "alter": "alterations",
    "evaluate": "engine",
    "extremes": "extremes",
    "fuel_payload_table": "planning",
    "fuel_to_leave": "planning",
    "least_ballast": "planning",
    "loading_schedule": "schedule",
    "longest_trip": "planning",
    "most_fuel": "planning",
    "most_payload": "planning",
    "weigh": "weighing",
    "weight_shift": "planning",
}


def __getattr__(name: str) -> object:
    if name in _LAZY:
        import importlib

        return getattr(importlib.import_module(f".{_LAZY[name]}", __name__), name)
    raise AttributeError(f"module {__name__!r} has no attribute {name!r}")


__all__ = [
    "MECHANIC_CAUTION",
    "PILOT_CAUTION",
    "Aircraft",
    "Burn",
    "CheckResult",
    "Condition",
    "EmptyWeight",
    "Envelope",
    "FileFormatError",
    "Finding",
    "InputError",
    "Limits",
    "LoadcheckError",
    "Loading",
    "Mac",
    "ResolvedLoading",
    "Station",
    "StationGroup",
    "Tank",
    "UnitError",
    "Units",
    "UnknownNameError",
    "__version__",
    "check_loading",
    "load_aircraft",
    "load_check_inputs",
    "load_loading",
    "resolve_loading",
]
