"""Equipment changes and the empty-weight history.

Method (AC 43.13-1B chapter 10; FAA-H-8083-1B chapter 2, "added or removed weight"): each
change adds its moment to the empty-weight moment: an installed item adds weight x arm,
a removed item takes its weight x arm away, a relocated item adds weight x (new arm - old
arm). The new empty-weight CG is the new moment over the new weight.

A change is negligible by AC 43.13-1B paragraph 10-2 c when the weight changes by no more
than 1 lb (empty weight under 5,000 lb), 2 lb (5,000 to 50,000 lb) or 5 lb (over
50,000 lb), and the CG moves by less than 0.05 % of the MAC (fixed wing) or 0.2 % of the
maximum allowable CG range (rotorcraft).
"""

from __future__ import annotations

import datetime as dt
from dataclasses import dataclass, field, replace
from typing import Any, Literal

from pydantic import Field, model_validator

from .aircraft import Aircraft, Arm, Mass
from .caution import MECHANIC_CAUTION
from .errors import InputError, Problem, UnknownNameError
from .filemodel import AircraftKey, FileModel
from .results import Result
from .units import convert
from .weighing import EmptyWeightRecord, Refusal, date_checks, lateral_arm_needed, lateral_change, record_checks
from .words import negligible_cg_words, negligible_text, negligible_weight_words

__all__ = ["Change", "Changes", "ChangeLine", "AlterResult", "alter", "negligible_weight_lb", "Negligible"]


class _Model(FileModel):
    """Common configuration (loadcheck.filemodel): unknown keys, and true/false for a number, are errors."""


class Change(_Model):
    """One equipment change."""

    action: Literal["install", "remove", "relocate"]
    item: str = Field(pattern=r"^[A-Za-z0-9_][A-Za-z0-9_.-]*$", description="equipment id")
    label: str | None = None
    weight: Mass | None = Field(None, ge=0, description="install only [mass unit]")
    arm: Arm | None = Field(None, description="install only [arm unit]")
    lateral_arm: Arm | None = Field(None, description="install only [arm unit], + right")
    new_arm: Arm | None = Field(None, description="relocate only [arm unit]")
    new_lateral_arm: Arm | None = Field(None, description="relocate only [arm unit]")

    @model_validator(mode="after")
    def _complete(self) -> Change:
        if self.action == "install" and (self.weight is None or self.arm is None):
            raise ValueError("an installed item needs its weight and arm")
        if self.action == "relocate" and self.new_arm is None and self.new_lateral_arm is None:
            raise ValueError("a relocated item needs its new_arm")
        if self.action != "install" and (self.weight is not None or self.arm is not None):
            raise ValueError(f"a {self.action}d item's weight and arm come from the equipment list; leave them out")
        if self.action != "relocate" and (self.new_arm is not None or self.new_lateral_arm is not None):
            raise ValueError("new_arm is only for action = 'relocate'")
        return self


class Changes(_Model):
    """A changes file: what was installed, removed or relocated (docs/mechanic.md)."""

    format: Literal[1] = 1
    aircraft: AircraftKey | None = None
    date: dt.date | None = None
    description: str | None = None
    by: str | None = Field(None, description="who made the changes")
    change: list[Change] = Field(min_length=1)


@dataclass(frozen=True, kw_only=True, slots=True)
class ChangeLine(Result):
    """One change with its effect: weight and moment added (negative when taken away)."""

    action: str
    item: str
    label: str
    weight: float
    arm: float
    weight_change: float
    moment_change: float
    new_arm: float | None = None


@dataclass(frozen=True, kw_only=True, slots=True)
class Negligible(Result):
    """AC 43.13-1B 10-2 c: is the change negligible?"""

    weight: bool
    cg: bool | None
    weight_threshold: str
    cg_threshold: str
    text: str = ""  # the verdict as one plain sentence (loadcheck.words.negligible_text)

    @property
    def overall(self) -> bool | None:
        """True when both are negligible; None when the CG rule cannot be applied."""
        if self.cg is None:
            return None if self.weight else False
        return self.weight and self.cg


@dataclass(frozen=True, kw_only=True, slots=True)
class AlterResult(Result):
    """The outcome of equipment changes (not yet the record: writing makes it so).

    ``date``, ``description`` and ``by`` come from the changes file; ``warnings`` and
    ``refusals`` are those of :func:`~loadcheck.weighing.record_checks`; ``change_lateral_arm``
    is the new lateral CG less the current record's [arm unit], where both have one.
    """

    aircraft: str
    registration: str | None
    lines: list[ChangeLine]
    previous: EmptyWeightRecord
    new: EmptyWeightRecord
    change_weight: float
    change_arm: float
    change_useful_load: float
    useful_load: float
    negligible: Negligible
    equipment: list[dict[str, object]] = field(default_factory=list)
    warnings: list[str] = field(default_factory=list)
    refusals: list[Refusal] = field(default_factory=list)
    date: str | None = None
    description: str | None = None
    by: str | None = None
    cg_range: tuple[float, float] | None = None
    change_lateral_arm: float | None = None
    caution: str = MECHANIC_CAUTION


def negligible_weight_lb(empty_weight_lb: float) -> float:
    """The negligible weight change for an empty weight [lb] (AC 43.13-1B 10-2 c)."""
    if empty_weight_lb < 5000:
        return 1.0
    if empty_weight_lb <= 50_000:
        return 2.0
    return 5.0


def _negligible(aircraft: Aircraft, weight_change: float, arm_change: float) -> Negligible:
    """AC 43.13-1B 10-2 c for a change of the empty weight [mass unit] and of its CG [arm unit]."""
    units = aircraft.units
    empty_lb = convert(aircraft.empty.weight, units.mass, "lb")
    change_lb = convert(weight_change, units.mass, "lb")
    limit_lb = negligible_weight_lb(empty_lb)
    weight_ok = bool(abs(change_lb) <= limit_lb + 1e-12)
    weight_words = f"{limit_lb:g} lb or less (empty weight {empty_lb:,.0f} lb)"
    weight_clause = negligible_weight_words(weight_change, units.mass, change_lb, limit_lb, empty_lb)
    cg: bool | None
    if aircraft.rotorcraft:
        arms = [
            a
            for e in aircraft.envelope
            if not e.is_lateral and "arm" in e.axes
            for a in e.shape.corners[:, e.axes.index("arm")]
        ]
        if not arms:
            cg, cg_words = None, "0.2 % of the CG range: no arm-weight envelope gives the range"
            cg_clause = negligible_cg_words(
                arm_change, units.arm, "0.2 % of the CG range", None, "no arm-weight envelope gives the range"
            )
        else:
            cg_range = float(max(arms) - min(arms))
            threshold = 0.002 * cg_range
            rule = f"0.2 % of the {cg_range:g} {units.arm} CG range"
            cg = bool(abs(arm_change) < threshold)
            cg_words = f"less than {rule} ({threshold:.4f} {units.arm})"
            cg_clause = negligible_cg_words(arm_change, units.arm, rule, threshold)
    elif aircraft.mac is None:
        cg, cg_words = None, "0.05 % MAC: the aircraft file gives no MAC, so this cannot be judged"
        cg_clause = negligible_cg_words(arm_change, units.arm, "0.05 % MAC", None, "the aircraft file gives no MAC")
    else:
        threshold = 0.0005 * aircraft.mac.length
        cg = bool(abs(arm_change) < threshold)
        cg_words = f"less than 0.05 % MAC ({threshold:.4f} {units.arm})"
        cg_clause = negligible_cg_words(arm_change, units.arm, "0.05 % MAC", threshold)
    result = Negligible(weight=weight_ok, cg=cg, weight_threshold=weight_words, cg_threshold=cg_words)
    return replace(result, text=negligible_text(result.overall, weight_clause, cg_clause))


def alter(aircraft: Aircraft, changes: Changes, now: dt.datetime | None = None) -> AlterResult:
    """Apply equipment changes to the empty-weight record (in memory).

    Parameters
    ----------
    aircraft : the aircraft with its current record and equipment list
    changes : the items installed, removed or relocated
    now : the moment the changes' date is checked against (default the system clock;
        :func:`~loadcheck.weighing.date_checks`)

    Raises
    ------
    UnknownNameError
        A removed or relocated item that is not in the equipment list (the message lists
        the items there), or an installed item whose id is already there.
    InputError
        When the changes leave no empty weight, or on an aircraft that limits the lateral CG,
        when an item installed gives no lateral arm, or one removed or moved sideways has
        none in the equipment list.

    References
    ----------
    AC 43.13-1B chapter 10 (10-2 c, negligible change); FAA-H-8083-1B chapter 2.
    """
    equipment: dict[str, dict[str, Any]] = {e.id: e.model_dump() for e in aircraft.equipment}
    lines: list[ChangeLine] = []
    problems: list[Problem] = []
    lateral_problems: list[Problem] = []
    empty = aircraft.empty
    weight, moment = empty.weight, empty.moment
    lateral = empty.weight * (empty.lateral_arm or 0.0)
    for index, change in enumerate(changes.change):
        where = f"change[{index}].item"
        known = "one of " + ", ".join(equipment) if equipment else "the equipment list is empty"
        if change.action == "install":
            if change.item in equipment:
                problems.append(
                    Problem(where, f"item {change.item!r} is already installed; remove or relocate it instead")
                )
                continue
            if aircraft.has_lateral and change.lateral_arm is None:
                # never taken as the centreline: the new lateral CG would rest on a guess
                lateral_problems.append(
                    lateral_arm_needed(aircraft, f"change[{index}].lateral_arm", f"installed item {change.item!r}")
                )
                continue
            assert change.weight is not None and change.arm is not None
            item: dict[str, Any] = {
                "id": change.item,
                "label": change.label,
                "weight": change.weight,
                "arm": change.arm,
                "lateral_arm": change.lateral_arm,
            }
            equipment[change.item] = item
            dw, dm, dl = change.weight, change.weight * change.arm, change.weight * (change.lateral_arm or 0.0)
            lines.append(
                ChangeLine(
                    action="install",
                    item=change.item,
                    label=change.label or change.item,
                    weight=change.weight,
                    arm=change.arm,
                    weight_change=dw,
                    moment_change=dm,
                )
            )
        else:
            if change.item not in equipment:
                problems.append(Problem(where, f"unknown item {change.item!r} to {change.action}", expected=known))
                continue
            item = equipment[change.item]
            moves_sideways = change.action == "remove" or change.new_lateral_arm is not None
            if aircraft.has_lateral and moves_sideways and item.get("lateral_arm") is None:
                # its lateral moment would rest on a guess of the centreline
                lateral_problems.append(
                    lateral_arm_needed(
                        aircraft,
                        f"change[{index}].item",
                        f"item {change.item!r} (to {change.action}) of the aircraft file's [[equipment]] list",
                    )
                )
                continue
            w, a, la = float(item["weight"]), float(item["arm"]), float(item.get("lateral_arm") or 0.0)
            label = change.label or item.get("label") or change.item
            if change.action == "remove":
                del equipment[change.item]
                dw, dm, dl = -w, -w * a, -w * la
                lines.append(
                    ChangeLine(
                        action="remove",
                        item=change.item,
                        label=str(label),
                        weight=w,
                        arm=a,
                        weight_change=dw,
                        moment_change=dm,
                    )
                )
            else:
                new_arm = change.new_arm if change.new_arm is not None else a
                new_lat = change.new_lateral_arm if change.new_lateral_arm is not None else la
                equipment[change.item] = {
                    **item,
                    "arm": new_arm,
                    # a new lateral arm of 0 (moved onto the centreline) is kept as given
                    "lateral_arm": item.get("lateral_arm") if change.new_lateral_arm is None else new_lat,
                }
                dw, dm, dl = 0.0, w * (new_arm - a), w * (new_lat - la)
                lines.append(
                    ChangeLine(
                        action="relocate",
                        item=change.item,
                        label=str(label),
                        weight=w,
                        arm=a,
                        weight_change=0.0,
                        moment_change=dm,
                        new_arm=new_arm,
                    )
                )
        weight += dw
        moment += dm
        lateral += dl
    if problems:
        raise UnknownNameError(problems + lateral_problems)
    if lateral_problems:
        raise InputError(lateral_problems)
    if weight <= 0:
        raise InputError(Problem("change", "the changes leave no empty weight"))
    previous = EmptyWeightRecord(weight=empty.weight, arm=empty.arm, moment=empty.moment, lateral_arm=empty.lateral_arm)
    new = EmptyWeightRecord(
        weight=weight,
        arm=moment / weight,
        moment=moment,
        lateral_arm=lateral / weight if empty.lateral_arm is not None else None,
    )
    useful = aircraft.limits.max_takeoff_weight - weight
    warnings, refusals = record_checks(aircraft, new)
    refusals += date_checks(aircraft, changes.date, "changes", now)
    return AlterResult(
        aircraft=aircraft.name,
        registration=aircraft.registration,
        lines=lines,
        previous=previous,
        new=new,
        change_weight=weight - empty.weight,
        change_arm=new.arm - empty.arm,
        change_lateral_arm=lateral_change(new, previous),
        change_useful_load=useful - aircraft.useful_load,
        useful_load=useful,
        negligible=_negligible(aircraft, weight - empty.weight, new.arm - empty.arm),
        equipment=[{k: v for k, v in item.items() if v is not None} for item in equipment.values()],
        warnings=warnings,
        refusals=refusals,
        date=None if changes.date is None else changes.date.isoformat(),
        description=changes.description,
        by=changes.by,
        cg_range=empty.cg_range,
    )
