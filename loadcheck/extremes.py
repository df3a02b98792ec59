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
(common practice where the limits vary with weight). The pilot is always aboard and is
seated first, at the standard occupant weight (never below the seat's minimum weight);
where the pilot's seat itself lies on the worse side of the limit that weight is the
heaviest the method puts there ("items ahead of the forward limit at their maximum", with
occupants at the standard weight as in figures 10-10 and 10-11), capped at the seat's
maximum weight. The other items on the worse side are then put at their maximum
farthest-first (seats: as many standard occupants as fit), each within the room its
station groups leave; every other station carries its minimum weight. Each extreme is a
placard-type answer: it is checked in full (:func:`~loadcheck.check.check_loading`) as a
flight that burns from the fuel it states down to the minimum fuel for balance (or to zero
usable fuel where none is named), every tank burning in proportion to its fuel, and its
verdict is that check's verdict.
"""

from __future__ import annotations

import math
from dataclasses import dataclass, replace
from typing import Literal

from .aircraft import Aircraft
from .caution import MECHANIC_CAUTION
from .check import check_loading
from .display import fmt
from .engine import load_room
from .errors import InputError, Problem, UnitError
from .loading import BurnPlan, ResolvedLoading
from .results import CheckResult, Result
from .units import convert, parse_quantity

__all__ = [
    "STANDARD_OCCUPANT_LB",
    "ExtremeCase",
    "ExtremesResult",
    "extremes",
    "minimum_fuel",
    "seat_order",
    "standard_occupant",
]

STANDARD_OCCUPANT_LB = 170.0
"""Standard occupant weight used by AC 43.13-1B figures 10-10 and 10-11 [lb]."""


@dataclass(frozen=True, kw_only=True, slots=True)
class ExtremeCase(Result):
    """One extreme loading: which side, how it was built, the fuel range covered, and its check.

    ``ok`` is the full check's verdict over the fuel range in ``fuel_states``.
    """

    side: Literal["forward", "rearward"]
    ok: bool
    limit_arm: float
    notes: list[str]
    fuel_states: str
    check: CheckResult


@dataclass(frozen=True, kw_only=True, slots=True)
class ExtremesResult(Result):
    """Both extreme checks; ``ok`` when both are within limits."""

    aircraft: str
    category: str
    occupant_weight: float
    minimum_fuel: float | None
    ok: bool
    forward: ExtremeCase
    rearward: ExtremeCase
    caution: str = MECHANIC_CAUTION


def standard_occupant(aircraft: Aircraft, given: float | None = None) -> float:
    """The occupant weight to use [mass unit]: given, else the aircraft file's, else 170 lb
    (the standard occupant of AC 43.13-1B figures 10-10 to 10-14).

    Raises
    ------
    InputError
        For a given weight that is not a finite number above zero.
    """
    if given is not None:
        if not (math.isfinite(given) and given > 0):
            raise InputError(Problem("occupant_weight", "must be a weight above zero", value=given))
        return given
    return aircraft.standard_occupant_weight or convert(STANDARD_OCCUPANT_LB, "lb", aircraft.units.mass)


def seat_order(aircraft: Aircraft) -> list[str]:
    """Seat stations, the pilot's (with flight controls) first, then the others in file order."""
    seats = [s for s in aircraft.station if s.kind == "seat"]
    pilots = [s for s in seats if s.controls] or seats[:1]
    return [s.id for s in pilots] + [s.id for s in seats if s not in pilots]


def minimum_fuel(aircraft: Aircraft, meto_hp: float | str) -> float:
    """Minimum fuel for balance: METO hp / 12 US gallons, in the aircraft's fuel volume unit.

    AC 43.13-1B paragraph 10-2 p. ``meto_hp`` [hp] is a number or a text of one, as typed.

    Raises
    ------
    InputError
        For a power that is not a finite number above zero, or a text with a unit.

    Examples
    --------
    >>> # 165 hp -> 13.75 US gal (AC 43.13-1B figure 10-10)
    """
    typed = meto_hp
    try:
        quantity = parse_quantity(typed)
    except UnitError:
        quantity = None
    if quantity is None or quantity.unit is not None or not quantity.value > 0:
        raise InputError(
            Problem(
                "meto_hp",
                "the maximum-except-takeoff power must be a number above zero, in horsepower",
                value=typed,
                expected="horsepower as a bare number, e.g. 165",
            )
        )
    meto_hp = quantity.value
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


def _seat_note(name: str, people: int, aboard: int, occupant: float, total: float, mass: str, beyond: str) -> str:
    """How a seat station on the worse side of the limit was loaded, in words."""
    others = people - aboard
    plural = "s" if others > 1 else ""
    if aboard and not others:
        heaviest = "at the station's maximum " if total < occupant - 1e-9 else ""
        return f"{name}: the pilot {heaviest}({fmt(total, mass)}), {beyond} limit"
    what = f"{others} occupant{plural} at {fmt(occupant, mass)}"
    if aboard:
        what = f"the pilot and {what}"
    if people > 1 or not math.isclose(total, people * occupant):
        what += f" ({fmt(total, mass)})"
    return f"{name}: {what}, {beyond} limit"


def _case(
    aircraft: Aircraft,
    category: str,
    side: Literal["forward", "rearward"],
    limit: float,
    occupant: float,
    min_fuel: float | None,
) -> ExtremeCase:
    notes: list[str] = []
    units = aircraft.units
    mass = units.mass

    def worse(arm: float) -> bool:
        return arm < limit if side == "forward" else arm > limit

    seats = [s for s in aircraft.station if s.kind == "seat"]
    pilots = [s for s in seats if s.controls] or seats[:1]
    if not pilots:
        raise InputError(Problem("station", "the aircraft has no seat station for the pilot"))
    pilot = min(pilots, key=lambda s: s.arm) if side == "forward" else max(pilots, key=lambda s: s.arm)
    stations: dict[str, float] = {s.id: s.min_weight for s in aircraft.station if s.min_weight}
    beyond = "ahead of the forward" if side == "forward" else "behind the rearward"
    # the pilot is always aboard (AC 43.13-1B figures 10-10, 10-11): seated first, so that
    # items farther beyond the limit cannot take the room a required pilot needs
    pilot_room = load_room(aircraft, stations, pilot.id)
    have = stations.get(pilot.id, 0.0)
    stations[pilot.id] = max(have, min(occupant, have + pilot_room) if worse(pilot.arm) else occupant)
    # the items that make the case worse, farthest beyond the limit first
    for station in sorted((s for s in aircraft.station if worse(s.arm)), key=lambda s: -abs(s.arm - limit)):
        room = load_room(aircraft, stations, station.id)
        have = stations.get(station.id, 0.0)
        if station.kind == "seat":
            count = station.seats or 1
            if station.id == pilot.id:  # the pilot's weight is already in; the others fill the room left
                aboard = 1
                others = min(count - 1, int(room // occupant)) if math.isfinite(room) else count - 1
                people, total = 1 + others, have + others * occupant
            else:
                aboard = 0
                people = min(count, int((have + room) // occupant)) if math.isfinite(room) else count
                total = max(have, people * occupant)
            if people:
                stations[station.id] = total
                notes.append(_seat_note(station.name, people, aboard, occupant, stations[station.id], mass, beyond))
        else:
            if not math.isfinite(room) or room <= 0:
                if not math.isfinite(room):
                    notes.append(f"{station.name}: no maximum weight given, left at its minimum")
                continue
            stations[station.id] = have + room
            capped = station.max_weight is None or stations[station.id] < station.max_weight - 1e-9
            what = "as much as its station group allows" if capped else "at its maximum"
            notes.append(f"{station.name}: {what} ({fmt(stations[station.id], mass)}), {beyond} limit")
    if not worse(pilot.arm):
        others = any(stations.get(s.id, 0.0) > 0 for s in seats if s.id != pilot.id)
        notes.append(
            f"{pilot.name}: the pilot{'' if others else ' alone'} ({fmt(stations[pilot.id], mass)}), in the "
            f"{'farthest-forward' if side == 'forward' else 'most rearward'} seat with controls"
        )
    for station in aircraft.station:
        least = station.min_weight or 0.0
        if (
            least
            and stations.get(station.id, 0.0) <= least + 1e-9
            and not worse(station.arm)
            and station.id != pilot.id
        ):
            notes.append(f"{station.name}: at its minimum ({fmt(least, mass)})")

    fuel: dict[str, float] = {}
    partial = [t for t in aircraft.tank if not worse(float(t.arm_at(t.usable)))]
    for tank in aircraft.tank:
        if worse(float(tank.arm_at(tank.usable))):
            fuel[tank.id] = tank.usable
            notes.append(f"{tank.name}: full ({fmt(tank.usable, units.fuel_volume)}), the tank lies {beyond} limit")
    if partial:
        if min_fuel is None:
            raise InputError(
                Problem(
                    "meto_power_hp",
                    "the minimum fuel for balance needs the engine's "
                    "maximum-except-takeoff power: give meto_power_hp in the aircraft file",
                )
            )
        capacity = sum(t.usable for t in partial)
        for tank in partial:
            fuel[tank.id] = min(tank.usable, min_fuel * tank.usable / capacity)
        notes.append(
            f"minimum fuel for balance, {fmt(min_fuel, units.fuel_volume, 'up')} (METO/12 US gal), in "
            f"{', '.join(t.name for t in partial)}"
        )
    density = {t.id: aircraft.density(t) for t in aircraft.tank}
    full = {t.id: fuel.get(t.id, 0.0) for t in aircraft.tank}
    plan = BurnPlan(full, None)
    down_to = min(min_fuel if min_fuel is not None else 0.0, plan.burnable)
    loading = ResolvedLoading(category, stations, full, density, 0.0, plan.burnable - down_to, None, plan)
    check = replace(check_loading(aircraft, loading), caution=MECHANIC_CAUTION)
    start = plan.burnable
    volume = units.fuel_volume
    # the range stated lies within the range checked (its top rounded down, its foot up), and the
    # minimum fuel reads as in the note above (rounded up): one figure for one amount
    if start <= down_to + 1e-9:
        states = f"at {fmt(start, volume, 'up')} of fuel" if start > 0 else "with no usable fuel"
    else:
        end = "the minimum fuel for balance" if min_fuel is not None else "zero usable fuel"
        states = (
            f"from {fmt(start, volume, 'down')} at engine start down to {end} ({fmt(down_to, volume, 'up')}), "
            "every tank burning in proportion to its fuel"
        )
    return ExtremeCase(side=side, ok=check.ok, limit_arm=limit, notes=notes, fuel_states=states, check=check)


def extremes(
    aircraft: Aircraft,
    *,
    category: str | None = None,
    occupant_weight: float | None = None,
    meto_hp: float | str | None = None,
) -> ExtremesResult:
    """The most forward and most rearward loadings the stations permit, each checked in full.

    Parameters
    ----------
    category : envelope category (default the aircraft's first)
    occupant_weight : standard occupant [mass unit]; default the aircraft file's, else
        170 lb (AC 43.13-1B figures 10-10 and 10-11)
    meto_hp : maximum-except-takeoff power [hp]; default the aircraft file's

    Returns
    -------
    ExtremesResult
        ``ok`` where both extremes pass the full check over the fuel range each covers.

    References
    ----------
    AC 43.13-1B chapter 10, paragraph 10-17 and figures 10-10, 10-11; 10-2 p (minimum fuel).
    """
    chosen = aircraft.category(category)
    occupant = standard_occupant(aircraft, occupant_weight)
    hp = meto_hp if meto_hp is not None else aircraft.meto_power_hp
    min_fuel = minimum_fuel(aircraft, hp) if hp is not None else None
    forward_limit, rear_limit = _limits(aircraft, chosen)
    forward = _case(aircraft, chosen, "forward", forward_limit, occupant, min_fuel)
    rearward = _case(aircraft, chosen, "rearward", rear_limit, occupant, min_fuel)
    return ExtremesResult(
        aircraft=aircraft.name,
        category=chosen,
        occupant_weight=occupant,
        minimum_fuel=min_fuel,
        ok=forward.ok and rearward.ok,
        forward=forward,
        rearward=rearward,
    )
