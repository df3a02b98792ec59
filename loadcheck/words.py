"""Sentences from results: the one place where findings and answers become words.

Results hold numbers; this module turns them into the sentences that the terminal, the
sheets, the charts and the JSON ``message`` fields carry: condition names, limit names,
units, and rounding in the safe direction (:mod:`loadcheck.display`). A figure beyond a
limit is shown rounded away from the limit, the limit rounded towards it, and the excess
is the difference of the two numbers shown, so the sentence adds up and never shows less
excess than there is; where the excess is smaller than the display precision, more digits
are shown until it is visible. No message names a command-line option: the library has
several front ends.
"""

from __future__ import annotations

from collections.abc import Sequence

from .display import Direction, decimals, fmt, round_safe
from .results import CheckResult, StationChange, Stop, UnitsInfo, Uplift

__all__ = [
    "negligible_cg_words",
    "negligible_text",
    "negligible_weight_words",
    "sheet_verdict",
    "trip_leg_verdict",
    "CONDITION_WORDS",
    "LIMIT_NAMES",
    "beyond",
    "burn_path_message",
    "burn_path_sentence",
    "burn_path_summary",
    "excursion_end_words",
    "within_limits_text",
    "condition_words",
    "count",
    "envelope_gap_message",
    "envelope_moment_message",
    "envelope_point_message",
    "ZERO_FUEL_WARNING",
    "envelope_side_message",
    "envelope_weight_message",
    "load_limit_message",
    "reserve_message",
    "given_fuel_words",
    "station_change_words",
    "stop_lines",
    "stretch_text",
    "uplift_words",
    "weight_limit_message",
]

CONDITION_WORDS = {"ramp": "ramp", "takeoff": "takeoff", "landing": "landing", "zero_fuel": "zero fuel"}
"""Each condition in words."""

LIMIT_NAMES = {
    "max_ramp_weight": "maximum ramp weight",
    "max_takeoff_weight": "maximum takeoff weight",
    "max_landing_weight": "maximum landing weight",
    "max_zero_fuel_weight": "maximum zero-fuel weight",
    "min_flight_weight": "minimum flight weight",
    "burn_path": "the CG along the fuel burn",
    "capacity": "the tanks' usable capacity",
}
"""Each weight limit (by finding code) in words."""

_EXTRA_DIGITS = 3  # at most this many digits beyond the unit's precision to make an excess visible


def count(number: int, thing: str) -> str:
    """ "1 tank", "2 tanks" (a plain English plural).

    Examples
    --------
    >>> count(1, "tank"), count(3, "station")
    ('1 tank', '3 stations')
    """
    return f"{number} {thing}" if number == 1 else f"{number} {thing}s"


def within_limits_text(warnings: int) -> str:
    """What a loading within limits holds, and the warnings beside it, so that "every
    condition holds" never stands beside a condition shown outside as a warning.

    Examples
    --------
    >>> within_limits_text(0)
    'every condition, the burn path and every weight limit hold.'
    >>> within_limits_text(1)
    'every limit holds at every condition and along the burn path; 1 warning (see the findings).'
    """
    if warnings == 0:
        return "every condition, the burn path and every weight limit hold."
    return (
        "every limit holds at every condition and along the burn path; "
        f"{count(warnings, 'warning')} (see the findings)."
    )


def sheet_verdict(limits: int) -> str:
    """The verdict at the top of a load sheet: ``WITHIN LIMITS`` or how many limits are exceeded.

    Examples
    --------
    >>> sheet_verdict(0), sheet_verdict(2)
    ('WITHIN LIMITS', 'OUT OF LIMITS: 2 limits exceeded')
    """
    return "WITHIN LIMITS" if limits == 0 else f"OUT OF LIMITS: {count(limits, 'limit')} exceeded"


def trip_leg_verdict(leg: str, limits: int, failed: list[str]) -> str:
    """The verdict on a trip's leg page: the leg's own and, where the trip is out of limits, the
    trip's, so that a leg within limits never reads as a bare "within limits" on a trip that
    is not.

    Parameters
    ----------
    leg : the leg's name ("Leg 1", "Leg 2 (solo)")
    limits : limits the leg exceeds
    failed : the names of the trip's legs out of limits

    Examples
    --------
    >>> trip_leg_verdict("Leg 1", 0, ["Leg 2 (solo)"])
    'Leg 1 — WITHIN LIMITS; the trip is OUT OF LIMITS on Leg 2 (solo)'
    >>> trip_leg_verdict("Leg 2", 1, ["Leg 2"])
    'Leg 2 — OUT OF LIMITS: 1 limit exceeded'
    >>> trip_leg_verdict("Leg 1", 0, [])
    'Leg 1 — WITHIN LIMITS, as is every leg of the trip'
    """
    if limits:
        return f"{leg} — {sheet_verdict(limits)}"
    if not failed:
        return f"{leg} — WITHIN LIMITS, as is every leg of the trip"
    return f"{leg} — WITHIN LIMITS; the trip is OUT OF LIMITS on {', '.join(failed)}"


def condition_words(name: str | None) -> str:
    """A condition's name in words ("zero fuel"); empty for None."""
    return CONDITION_WORDS.get(name or "", name or "")


def beyond(value: float, limit: float, unit: str) -> tuple[str, str, str]:
    """A value beyond a limit, the limit and the excess, as three numbers that add up.

    The value is rounded away from the limit and the limit towards the value, at the
    unit's precision or with up to three more digits where the excess would not show;
    the excess is the difference of the two numbers shown, so it is never less than the
    true excess.

    Examples
    --------
    >>> beyond(1003.31, 1000.0, "kg")
    ('1,003.4 kg', '1,000.0 kg', '3.4 kg')
    >>> beyond(15.5001, 15.5, "in")
    ('15.5001 in', '15.5000 in', '0.0001 in')
    >>> beyond(80.0, 82.5, "in")
    ('80.00 in', '82.50 in', '2.50 in')
    """
    above = value > limit
    away: Direction = "up" if above else "down"
    towards: Direction = "down" if above else "up"
    places = most = decimals(unit)
    most += _EXTRA_DIGITS
    excess = abs(value - limit)
    while excess < 10.0**-places * (1 - 1e-6) and places < most and excess > 0:
        places += 1
    shown_value = round_safe(value, places, away)
    shown_limit = round_safe(limit, places, towards)
    shown_excess = round_safe(abs(shown_value - shown_limit), places, "nearest")
    spec = f",.{places}f"
    return _shown(shown_value, spec, unit), _shown(shown_limit, spec, unit), _shown(shown_excess, spec, unit)


def _shown(number: float, spec: str, unit: str) -> str:
    """A number of :func:`beyond` written with ``spec`` (thousands separators, its places) and its
    unit; a negative figure that shows as zero loses its sign."""
    out = format(number, spec)
    if out[0] == "-" and float(out.replace(",", "")) == 0.0:
        out = out[1:]
    return f"{out} {unit}"


def weight_limit_message(condition: str, weight: float, code: str, limit: float, unit: str) -> str:
    """ "takeoff weight 2,612.0 lb exceeds the maximum takeoff weight 2,600.0 lb by 12.0 lb"; a minimum likewise."""
    value, bound, excess = beyond(weight, limit, unit)
    if code == "min_flight_weight":
        return f"{condition_words(condition)} weight {value} is below the {LIMIT_NAMES[code]} {bound} by {excess}"
    return f"{condition_words(condition)} weight {value} exceeds the {LIMIT_NAMES[code]} {bound} by {excess}"


def envelope_weight_message(
    condition: str,
    label: str,
    weight: float,
    edge: float,
    mass_unit: str,
    cg_beyond: tuple[str, float, float, str] | None,
    *,
    ramp_allowance: float = 0.0,
) -> str:
    """A point above or below an envelope's weight range, and its CG against the limit there.

    ``cg_beyond`` is (side, CG, limit, arm unit) where the CG is also outside at that edge;
    ``ramp_allowance`` [mass unit], at ramp above the top: the excess is over the top plus it.
    """
    side = "above" if weight > edge else "below"
    value, bound, excess = beyond(weight, edge + ramp_allowance, mass_unit)
    if ramp_allowance > 0:
        bound = f"{fmt(edge, mass_unit)} ({bound} at ramp with the {fmt(ramp_allowance, mass_unit)} ramp allowance)"
    text = (
        f"{condition_words(condition)} weight {value} is {side} {label}, whose "
        f"{'highest' if side == 'above' else 'lowest'} weight is {bound}, by {excess}"
    )
    if cg_beyond is not None:
        where, cg, limit, arm_unit = cg_beyond
        cg_text, limit_text, cg_excess = beyond(cg, limit, arm_unit)
        text += f"; its CG {cg_text} is also {where} of the limit there ({limit_text}) by {cg_excess}"
    return text


def envelope_side_message(
    condition: str,
    label: str,
    lateral: bool,
    side: str,
    value: float,
    limit: float,
    weight: float,
    arm_unit: str,
    mass_unit: str,
) -> str:
    """The words of a CG outside an envelope.

    "takeoff CG 93.40 in is aft of the aft limit of the normal-category envelope (93.00 in at 2,400.0 lb)
    by 0.40 in".
    """
    cg = "lateral CG" if lateral else "CG"
    value_text, limit_text, excess = beyond(value, limit, arm_unit)
    return (
        f"{condition_words(condition)} {cg} {value_text} is {side} of the {side} limit of {label} "
        f"({limit_text} at {fmt(weight, mass_unit)}) by {excess}"
    )


def envelope_moment_message(
    condition: str, label: str, side: str, moment: float, limit: float, weight: float, moment_unit: str, mass_unit: str
) -> str:
    """ "landing lateral moment -2,940 lb*in is left of the lateral limit of the lateral envelope
    (-2,700 lb*in at 1,915.0 lb) by 240 lb*in": an envelope drawn as lateral moment against weight."""
    value_text, limit_text, excess = beyond(moment, limit, moment_unit)
    return (
        f"{condition_words(condition)} lateral moment {value_text} is {side} of the lateral limit of {label} "
        f"({limit_text} at {fmt(weight, mass_unit)}) by {excess}"
    )


def envelope_gap_message(
    condition: str,
    label: str,
    lateral: bool,
    value: float,
    nearest: float,
    weight: float,
    arm_unit: str,
    mass_unit: str,
) -> str:
    """A CG that falls in a gap of a non-convex envelope, with the nearest limit."""
    cg = "lateral CG" if lateral else "CG"
    value_text, limit_text, excess = beyond(value, nearest, arm_unit)
    return (
        f"{condition_words(condition)} {cg} {value_text} falls in a gap of {label} at {fmt(weight, mass_unit)}, "
        f"{excess} from the nearest limit ({limit_text})"
    )


def envelope_point_message(
    condition: str, label: str, lateral: bool, weight: float, value: float, arm_unit: str, mass_unit: str
) -> str:
    """A point outside an envelope that no slice describes better."""
    cg = "lateral CG" if lateral else "CG"
    return (
        f"{condition_words(condition)} point ({fmt(weight, mass_unit)}, {cg} {fmt(value, arm_unit)}) is outside {label}"
    )


ZERO_FUEL_WARNING = " (a warning: the zero-fuel CG is not a limit for this aircraft)"
"""Added to a zero-fuel envelope finding where the zero-fuel CG is not a limit."""


def excursion_end_words(to_burned: float, to_landing: bool, mass_unit: str) -> str:
    """Until when the burn path stays outside: to landing where it is still outside there, else
    until the fuel burned where it comes back inside, rounded up (the stretch outside is never
    shown shorter than it is). The one place this is said (:func:`burn_path_message`,
    :func:`burn_path_sentence`).

    Examples
    --------
    >>> excursion_end_words(28.24, False, "kg"), excursion_end_words(180.0, True, "lb")
    ('until 28.3 kg is burned, where it comes back inside', 'to landing')
    """
    if to_landing:
        return "to landing"
    return f"until {fmt(to_burned, mass_unit, 'up')} is burned, where it comes back inside"


def burn_path_message(
    from_burned: float,
    to_burned: float,
    weight: float,
    arm: float,
    on_board: float,
    mass_unit: str,
    arm_unit: str,
    volume_unit: str,
    *,
    lateral_arm: float | None = None,
    envelope: str | None = None,
    to_landing: bool = False,
) -> str:
    """Where the CG leaves an envelope during the burn and until when it stays out.

    ``lateral_arm`` [arm unit], given for an aircraft with lateral limits, is said beside the CG;
    ``envelope`` names the envelope left ("the utility-category envelope"), else "the envelope";
    ``to_landing``: the path is still outside at landing (:func:`excursion_end_words`).

    Examples
    --------
    >>> burn_path_message(10.0, 25.0, 2000.0, 40.0, 30.0, "lb", "in", "usgal", lateral_arm=-1.5,
    ...                   envelope="the lateral envelope")  # doctest: +NORMALIZE_WHITESPACE
    'the CG leaves the lateral envelope during the fuel burn after 10.0 lb of fuel is burned
    (at 2,000.0 lb, CG 40.00 in, lateral CG -1.50 in, 30.0 usgal on board) and stays out until 25.0 lb is burned,
    where it comes back inside'
    """
    lateral = "" if lateral_arm is None else f", lateral CG {fmt(lateral_arm, arm_unit)}"
    return (
        f"the CG leaves {envelope or 'the envelope'} during the fuel burn after {fmt(from_burned, mass_unit, 'down')} "
        "of fuel is burned "
        f"(at {fmt(weight, mass_unit)}, CG {fmt(arm, arm_unit)}{lateral}, {fmt(on_board, volume_unit)} on board) "
        f"and stays out {excursion_end_words(to_burned, to_landing, mass_unit)}"
    )


def load_limit_message(label: str, loaded: float, limit: float, is_max: bool, unit: str) -> str:
    """ "Rear seats: 255.0 kg exceeds the maximum 250.0 kg by 5.0 kg"; a minimum likewise."""
    value, bound, excess = beyond(loaded, limit, unit)
    if is_max:
        return f"{label}: {value} exceeds the maximum {bound} by {excess}"
    return f"{label}: {value} is below the minimum {bound} by {excess}"


def reserve_message(landing_fuel: float, reserve: float, unit: str) -> str:
    """Landing fuel below the reserve, by how much."""
    value, bound, short = beyond(landing_fuel, reserve, unit)
    return f"landing fuel {value} is below the reserve of {bound} by {short}"


def no_pilot_message(seats: Sequence[str]) -> str:
    """No weight at any seat with flight controls, named as in the moment table, in file order (a
    flight carries its pilot at one of them; common practice).

    Examples
    --------
    >>> no_pilot_message(["Pilot and front passenger"])
    "no weight at the seat with flight controls (Pilot and front passenger): a flight needs its pilot's weight there"
    >>> no_pilot_message(["Left seat", "Right seat"])
    "no weight at any seat with flight controls (Left seat, Right seat): a flight needs its pilot's weight at one"
    """
    if len(seats) == 1:
        return f"no weight at the seat with flight controls ({seats[0]}): a flight needs its pilot's weight there"
    return f"no weight at any seat with flight controls ({', '.join(seats)}): a flight needs its pilot's weight at one"


def stretch_text(low: float, high: float, unit: str) -> str:
    """A stretch of allowed values, rounded inward ("12.4 to 30.0 l").

    Where the stretch is narrower than the display precision, rounding inward would show a
    low end above the high end: more digits are shown instead, and a single value where
    the stretch is a point.

    Examples
    --------
    >>> stretch_text(46.86, 46.88, "lb")
    '46.86 to 46.88 lb'
    >>> stretch_text(12.0, 12.0, "l")
    'only 12.0 l'
    """
    places = decimals(unit)
    while round_safe(low, places, "up") > round_safe(high, places, "down") and places < decimals(unit) + _EXTRA_DIGITS:
        places += 1
    lo, hi = round_safe(low, places, "up"), round_safe(high, places, "down")
    if lo >= hi or hi - low <= 0:
        return f"only {round_safe(low, places, 'nearest'):,.{places}f} {unit}"
    return f"{lo:,.{places}f} to {hi:,.{places}f} {unit}"


def burn_path_summary(result: CheckResult) -> str:
    """The fuel burn from takeoff to landing in one sentence, with its heading."""
    return "Fuel burn, takeoff to landing: " + burn_path_sentence(result)


def burn_path_sentence(result: CheckResult) -> str:
    """The fuel burn from takeoff to landing in one sentence ("the CG stays inside ...").

    A path that starts outside (takeoff already out of the envelope) is said to be outside
    from takeoff, not to "leave after 0 burned"; one still outside at landing is said to be
    outside to landing, not "until" the whole trip's fuel is burned; where it comes back
    inside, that is said (:func:`excursion_end_words`). Where the path leaves, the envelope it
    leaves is named and, for an aircraft with lateral limits, the lateral CG given; each later
    stretch outside is said after it.
    """
    path, units = result.burn_path, result.units
    if path.ok:
        return "the CG stays inside the envelope all the way."
    leave = path.leaves_at
    if leave is None or not path.excursions:
        return "the takeoff point is already outside the envelope."
    first, *later = path.excursions
    if first.from_takeoff:
        span = (
            "the whole way, from takeoff to landing"
            if first.to_landing
            else f"from takeoff {excursion_end_words(first.to_burned, False, units.mass)}"
        )
        text = f"the CG is outside the envelope {span}"
    else:
        lateral = "" if leave.lateral_arm is None else f", lateral CG {fmt(leave.lateral_arm, units.arm)}"
        text = (
            f"the CG leaves {leave.subject or 'the envelope'} "
            f"after {fmt(leave.fuel_burned, units.mass, 'down')} burned "
            f"({fmt(leave.fuel_remaining_volume, units.fuel_volume)} remaining; "
            f"{fmt(leave.weight, units.mass)} at CG {fmt(leave.arm, units.arm)}{lateral}) and is outside from there "
            + excursion_end_words(first.to_burned, first.to_landing, units.mass)
        )
    for excursion in later:
        text += (
            f"; it is outside again from {fmt(excursion.from_burned, units.mass, 'down')} burned "
            + excursion_end_words(excursion.to_burned, excursion.to_landing, units.mass)
        )
    return text + "."


def negligible_weight_words(change: float, unit: str, change_lb: float, limit_lb: float, empty_lb: float) -> str:
    """The weight half of the negligible-change rule (AC 43.13-1B 10-2 c) as a plain clause:
    the change [``unit``, and lb where the aircraft is in another unit] against the negligible
    change for the empty weight [lb].

    Examples
    --------
    >>> negligible_weight_words(-13.8, "lb", -13.8, 1.0, 1718.0)
    'the weight changes by -13.8 lb, more than the 1 lb that is negligible at an empty weight of 1,718 lb'
    >>> negligible_weight_words(0.3, "kg", 0.661, 1.0, 1300.0)
    'the weight changes by +0.3 kg (+0.66 lb), no more than the 1 lb that is negligible at an empty weight of 1,300 lb'
    """
    within = abs(change_lb) <= limit_lb + 1e-12
    near = abs(abs(change_lb) - limit_lb) < 0.1  # two decimals, so that the figure shows which side it is on
    shown = fmt(change, unit, places=2 if near and unit == "lb" else None, signed=True)
    if unit != "lb":
        shown += f" ({fmt(change_lb, 'lb', places=2, signed=True)})"
    how = "no more than" if within else "more than"
    return (
        f"the weight changes by {shown}, {how} the {limit_lb:g} lb that is negligible "
        f"at an empty weight of {empty_lb:,.0f} lb"
    )


def negligible_cg_words(change: float, unit: str, rule: str, threshold: float | None, why_not: str = "") -> str:
    """The CG half of the negligible-change rule (AC 43.13-1B 10-2 c) as a plain clause: the CG
    change [arm unit] against ``rule`` ("0.05 % MAC") whose value is ``threshold`` [arm unit]; with
    no threshold, why the rule cannot be applied.

    Examples
    --------
    >>> negligible_cg_words(-0.2, "in", "0.05 % MAC", 0.03025)
    'the CG moves -0.20 in, not less than 0.05 % MAC (0.0302 in)'
    """
    if threshold is None:
        return f"the CG rule ({rule}) cannot be applied: {why_not}"
    how = "less than" if abs(change) < threshold else "not less than"
    moved = fmt(
        change, unit, places=max(decimals(unit), 4) if abs(change) < 10.0 ** -decimals(unit) else None, signed=True
    )
    return f"the CG moves {moved}, {how} {rule} ({fmt(threshold, unit, 'down', places=4)})"


def negligible_text(overall: bool | None, weight: str, cg: str) -> str:
    """The negligible-change verdict (AC 43.13-1B 10-2 c) as one plain sentence: ``overall`` True
    (negligible), False (not negligible) or None (the CG rule cannot be applied, so whether the
    change is negligible cannot be judged).

    Examples
    --------
    >>> negligible_text(False, "the weight changes by -13.8 lb", "the CG moves -0.20 in")
    'AC 43.13-1B 10-2 c: the change is not negligible: the weight changes by -13.8 lb, and the CG moves -0.20 in.'
    >>> negligible_text(None, "the weight changes by +0.4 lb", "the CG rule cannot be applied")  # doctest: +ELLIPSIS
    'AC 43.13-1B 10-2 c: whether the change is negligible cannot be judged: the weight ... cannot be applied.'
    """
    verdict = {
        True: "the change is negligible",
        False: "the change is not negligible",
        None: "whether the change is negligible cannot be judged",
    }[overall]
    return f"AC 43.13-1B 10-2 c: {verdict}: {weight}, and {cg}."


def uplift_words(uplift: Uplift, units: UnitsInfo) -> str:
    """The fuel put into one tank at a stop, as the refueller works to it: the volume that goes
    in and its mass, the amount as the loading gives it where that is other words, and what the
    tank then holds.

    Examples
    --------
    >>> units = UnitsInfo(mass="lb", arm="in", fuel_volume="usgal", moment="lb*in")
    >>> uplift_words(Uplift(tank="main", name="Main", volume=5.0, weight=30.0, on_board=25.5, given=5.0), units)
    'Main: 5.0 usgal put in (30.0 lb), 25.5 usgal on board after'
    >>> uplift_words(Uplift(tank="main", name="Main", volume=11.5, weight=69.0, on_board=32.0, given="full"), units)
    'Main: 11.5 usgal put in (69.0 lb), as given "full", 32.0 usgal on board after'
    """
    given = uplift.given
    said = "" if given is None or given == uplift.volume else f", as given {given_fuel_words(uplift, units)}"
    return (
        f"{uplift.name}: {fmt(uplift.volume, units.fuel_volume)} put in ({fmt(uplift.weight, units.mass)}){said}, "
        f"{fmt(uplift.on_board, units.fuel_volume)} on board after"
    )


def given_fuel_words(uplift: Uplift, units: UnitsInfo) -> str:
    """The fuel put in at a stop as the loading gives it: a number with the fuel volume unit it is
    in, other amounts quoted as written; empty where a planning answer chose the fuel.

    Examples
    --------
    >>> units = UnitsInfo(mass="lb", arm="in", fuel_volume="usgal", moment="lb*in")
    >>> given_fuel_words(Uplift(tank="t", name="T", volume=5.0, weight=30.0, on_board=9.0, given=5.0), units)
    '5 usgal'
    >>> given_fuel_words(Uplift(tank="t", name="T", volume=5.0, weight=30.0, on_board=9.0, given="30 lb"), units)
    '"30 lb"'
    """
    given = uplift.given
    if given is None:
        return ""
    return f'"{given}"' if isinstance(given, str) else f"{given:g} {units.fuel_volume}"


def station_change_words(change: StationChange, unit: str) -> str:
    """A station whose load changes at a stop, from and to.

    Examples
    --------
    >>> station_change_words(StationChange(station="left", name="Left seat", from_weight=170.0, to_weight=0.0), "lb")
    'Left seat: from 170.0 lb to 0.0 lb'
    """
    return f"{change.name}: from {fmt(change.from_weight, unit)} to {fmt(change.to_weight, unit)}"


def stop_lines(stop: Stop, units: UnitsInfo) -> tuple[str, str]:
    """What changes at the stop before a leg, in two lines: the fuel put in, tank by tank, and the
    stations whose load changes; each says "none" where nothing does.

    Examples
    --------
    >>> units = UnitsInfo(mass="lb", arm="in", fuel_volume="usgal", moment="lb*in")
    >>> stop_lines(Stop(fuel=[], stations=[]), units)
    ('fuel put in at the stop: none', 'load changed at the stop: none')
    """
    fuel = "; ".join(uplift_words(u, units) for u in stop.fuel) or "none"
    stations = "; ".join(station_change_words(c, units.mass) for c in stop.stations) or "none"
    return f"fuel put in at the stop: {fuel}", f"load changed at the stop: {stations}"
