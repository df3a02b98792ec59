"""Weight and balance extreme conditions (AC 43.13-1B chapter 10, paragraph 10-17).

The most forward loading puts at their maximum the items of useful load that lie ahead of
the forward CG limit and leaves out (or at their minimum) those behind it, with the pilot
in the farthest-forward seat that has flight controls; the most rearward loading puts at
their maximum the items behind the rearward limit and leaves out those ahead of it, with
the pilot in the most rearward seat with controls. Fuel: full where the tank lies on the
side of the limit that makes the case worse, else the minimum fuel for balance, 1/12 US
gallon per maximum-except-takeoff horsepower (METO), AC 43.13-1B 10-2 p (figures 10-10 and
10-11 show both checks).

The limits used to sort the items are the envelope's most forward and most rearward arm
(common practice where the limits vary with weight); the loading found is then checked
against the whole envelope at its own weight, like any other loading.
"""

from __future__ import annotations

from dataclasses import dataclass
from typing import Literal

from .aircraft import Aircraft
from .caution import MECHANIC_CAUTION
from .check import check_loading
from .errors import InputError, Problem
from .loading import BurnPlan, ResolvedLoading
from .results import CheckResult, Result
from .units import convert

__all__ = ["ExtremeCase", "ExtremesResult", "extremes", "minimum_fuel", "standard_occupant", "STANDARD_OCCUPANT_LB"]

STANDARD_OCCUPANT_LB = 170.0
"""Standard occupant weight used by AC 43.13-1B figures 10-10 and 10-11 [lb]."""


@dataclass(frozen=True, kw_only=True, slots=True)
class ExtremeCase(Result):
    """One extreme loading: which side, how it was built, and its check."""

    side: Literal["forward", "rearward"]
    limit_arm: float
    notes: list[str]
    check: CheckResult

    @property
    def ok(self) -> bool:
        """Within the weight limits and the envelope at ramp and takeoff."""
        return all(c.ok for c in self.check.conditions if c.condition in ("ramp", "takeoff"))


@dataclass(frozen=True, kw_only=True, slots=True)
class ExtremesResult(Result):
    """Both extreme checks."""

    aircraft: str
    category: str
    occupant_weight: float
    minimum_fuel: float | None
    forward: ExtremeCase
    rearward: ExtremeCase
    caution: str = MECHANIC_CAUTION

    @property
    def ok(self) -> bool:
        """Both extremes within limits."""
        return self.forward.ok and self.rearward.ok


def standard_occupant(aircraft: Aircraft, given: float | None = None) -> float:
    """The occupant weight to use [mass unit]: given, else the aircraft file's, else 170 lb
    (the standard occupant of AC 43.13-1B figures 10-10 to 10-14)."""
    return given or aircraft.standard_occupant_weight or convert(STANDARD_OCCUPANT_LB, "lb", aircraft.units.mass)


def minimum_fuel(aircraft: Aircraft, meto_hp: float) -> float:
    """Minimum fuel for balance: METO hp / 12 US gallons, in the aircraft's fuel volume unit.

    AC 43.13-1B paragraph 10-2 p.

    Examples
    --------
    >>> # 165 hp -> 13.75 US gal (AC 43.13-1B figure 10-10)
    """
    return convert(meto_hp / 12.0, "usgal", aircraft.units.fuel_volume)


def _limits(aircraft: Aircraft, category: str) -> tuple[float, float]:
    arms = []
    for envelope in aircraft.envelopes_for(category):
        if envelope.is_lateral:
            continue
        lo, hi = envelope.shape.arm_range()
        arms += [lo, hi]
    if not arms:
        raise InputError(Problem("envelope", f"no longitudinal envelope in category {category!r}"))
    return min(arms), max(arms)


def _case(aircraft: Aircraft, category: str, side: Literal["forward", "rearward"], limit: float,
          occupant: float, min_fuel: float | None) -> ExtremeCase:
    notes: list[str] = []
    worse = (lambda arm: arm < limit) if side == "forward" else (lambda arm: arm > limit)
    units = aircraft.units
    seats = [s for s in aircraft.station if s.kind == "seat"]
    pilots = [s for s in seats if s.controls] or seats[:1]
    if not pilots:
        raise InputError(Problem("station", "the aircraft has no seat station for the pilot"))
    pilot = min(pilots, key=lambda s: s.arm) if side == "forward" else max(pilots, key=lambda s: s.arm)
    stations: dict[str, float] = {}
    for station in aircraft.station:
        count = station.seats or 1
        if station.kind == "seat":
            full = count * occupant if station.max_weight is None else min(count * occupant, station.max_weight)
        else:
            full = station.max_weight or 0.0
        least = station.min_weight or 0.0
        beyond = "ahead of the forward" if side == "forward" else "behind the rearward"
        if worse(station.arm):
            stations[station.id] = max(full, least)
            if full:
                notes.append(f"{station.name}: at its maximum ({full:g} {units.mass}), {beyond} limit")
        elif station.id == pilot.id:
            stations[station.id] = max(min(occupant, full) if full else occupant, least)
            notes.append(f"{station.name}: the pilot alone ({stations[station.id]:g} {units.mass}), in the "
                         f"{'farthest-forward' if side == 'forward' else 'most rearward'} seat with controls")
        else:
            stations[station.id] = least
            if least:
                notes.append(f"{station.name}: at its minimum ({least:g} {units.mass})")
    fuel: dict[str, float] = {}
    partial = [t for t in aircraft.tank if not worse(t.arm_at(t.usable))]
    for tank in aircraft.tank:
        if worse(tank.arm_at(tank.usable)):
            fuel[tank.id] = tank.usable
            notes.append(f"{tank.name}: full ({tank.usable:g} {units.fuel_volume}), the tank lies "
                         f"{'ahead of the forward' if side == 'forward' else 'behind the rearward'} limit")
    if partial:
        if min_fuel is None:
            raise InputError(Problem("max_continuous_power_hp", "the minimum fuel for balance needs the engine's "
                                     "maximum-except-takeoff power: give max_continuous_power_hp in the aircraft file or --meto"))
        capacity = sum(t.usable for t in partial)
        for tank in partial:
            fuel[tank.id] = min(tank.usable, min_fuel * tank.usable / capacity)
        notes.append(f"minimum fuel for balance, {min_fuel:.2f} {units.fuel_volume} (METO/12 US gal), in "
                     f"{', '.join(t.name for t in partial)}")
    density = {t.id: aircraft.density(t) for t in aircraft.tank}
    loading = ResolvedLoading(category, stations, fuel, density, 0.0, 0.0, None, BurnPlan(fuel, None))
    return ExtremeCase(side=side, limit_arm=limit, notes=notes, check=check_loading(aircraft, loading))


def extremes(aircraft: Aircraft, *, category: str | None = None, occupant_weight: float | None = None,
             meto_hp: float | None = None) -> ExtremesResult:
    """The most forward and most rearward loadings the stations permit, each checked.

    Parameters
    ----------
    category : envelope category (default the aircraft's first)
    occupant_weight : standard occupant [mass unit]; default the aircraft file's, else
        170 lb (AC 43.13-1B figures 10-10 and 10-11)
    meto_hp : maximum-except-takeoff power [hp]; default the aircraft file's

    References
    ----------
    AC 43.13-1B chapter 10, paragraph 10-17 and figures 10-10, 10-11; 10-2 p (minimum fuel).
    """
    chosen = aircraft.category(category)
    occupant = standard_occupant(aircraft, occupant_weight)
    hp = meto_hp if meto_hp is not None else aircraft.max_continuous_power_hp
    min_fuel = minimum_fuel(aircraft, hp) if hp is not None else None
    forward_limit, rear_limit = _limits(aircraft, chosen)
    return ExtremesResult(
        aircraft=aircraft.name, category=chosen, occupant_weight=occupant, minimum_fuel=min_fuel,
        forward=_case(aircraft, chosen, "forward", forward_limit, occupant, min_fuel),
        rearward=_case(aircraft, chosen, "rearward", rear_limit, occupant, min_fuel),
    )
