"""Result models of a loading check (the JSON fields of DESIGN.md, "Results")."""

from __future__ import annotations

from typing import Literal

from pydantic import BaseModel, ConfigDict, Field

__all__ = [
    "ConditionName",
    "Severity",
    "Item",
    "Margins",
    "Condition",
    "LeavePoint",
    "Excursion",
    "BurnPath",
    "Finding",
    "AircraftInfo",
    "UnitsInfo",
    "CheckResult",
]

ConditionName = Literal["ramp", "takeoff", "landing", "zero_fuel"]
Severity = Literal["limit", "warning"]


class _Result(BaseModel):
    model_config = ConfigDict(frozen=True)


class Item(_Result):
    """One line of the moment table."""

    id: str
    name: str
    kind: str = Field(description="empty, seat, baggage, cargo, ballast, other or fuel")
    weight: float = Field(description="[mass unit]")
    arm: float = Field(description="[arm unit]")
    moment: float = Field(description="[mass unit * arm unit]")
    lateral_arm: float | None = Field(None, description="[arm unit], + right")
    lateral_moment: float | None = Field(None, description="[mass unit * arm unit]")
    fuel_volume: float | None = Field(None, description="fuel only [fuel volume unit]")


class Margins(_Result):
    """Room left to each limit at a condition; negative where the limit is exceeded.

    forward/aft: CG to the forward/aft limit at this weight [arm unit]; left/right: lateral
    CG to the lateral limits [arm unit]; weight: to the lower of the weight limit and the
    envelope's top at this CG [mass unit]. None where no envelope gives that limit.
    """

    forward: float | None = None
    aft: float | None = None
    left: float | None = None
    right: float | None = None
    weight: float | None = None


class Condition(_Result):
    """One of ramp, takeoff, landing, zero fuel."""

    condition: ConditionName
    weight: float = Field(description="[mass unit]")
    arm: float = Field(description="CG [arm unit]")
    moment: float = Field(description="[mass unit * arm unit]")
    lateral_arm: float | None = Field(None, description="lateral CG [arm unit], + right")
    lateral_moment: float | None = None
    mac_percent: float | None = Field(None, description="CG in percent of MAC")
    fuel: float = Field(description="fuel on board [fuel volume unit]")
    fuel_weight: float = Field(description="fuel on board [mass unit]")
    max_weight: float | None = Field(None, description="the weight limit that applies [mass unit]")
    ok: bool = Field(description="inside the envelope and the weight limits")
    margins: Margins


class LeavePoint(_Result):
    """Where the fuel-burn path first leaves the envelope."""

    fuel_burned: float = Field(description="fuel burned since takeoff [mass unit]")
    fuel_remaining: float = Field(description="fuel on board [mass unit]")
    weight: float = Field(description="[mass unit]")
    arm: float = Field(description="[arm unit]")
    lateral_arm: float | None = None
    fuel_burned_volume: float = Field(description="[fuel volume unit]")
    fuel_remaining_volume: float = Field(description="[fuel volume unit]")


class Excursion(_Result):
    """A stretch of the burn path outside the envelope."""

    from_burned: float = Field(description="fuel burned since takeoff where it leaves [mass unit]")
    to_burned: float = Field(description="fuel burned since takeoff where it returns [mass unit]")


class BurnPath(_Result):
    """The fuel-burn path from takeoff to landing."""

    ok: bool
    leaves_at: LeavePoint | None = None
    excursions: list[Excursion] = Field(default_factory=list)


class Finding(_Result):
    """A limit exceeded (severity ``limit``) or something to note (``warning``)."""

    code: str
    severity: Severity
    condition: ConditionName | None = None
    message: str
    excess: float | None = Field(None, description="by how much, in ``unit``")
    unit: str | None = None
    limit: float | None = Field(None, description="the limit's value, in ``unit`` where it is a mass")
    side: str | None = Field(None, description="forward, aft, left, right, above, below or outside")
    subject: str | None = Field(None, description="the station, group or envelope concerned")


class AircraftInfo(_Result):
    """Which aircraft data was used."""

    name: str
    registration: str | None = None
    fingerprint: str
    empty_weight_date: str | None = None


class UnitsInfo(_Result):
    """Units of every number in the result."""

    mass: str
    arm: str
    fuel_volume: str
    moment: str


class CheckResult(_Result):
    """The answer to "is this loading within limits?" (DESIGN.md, "Results")."""

    ok: bool = Field(description="true only when no finding has severity 'limit'")
    category: str
    aircraft: AircraftInfo
    items: list[Item]
    conditions: list[Condition]
    burn_path: BurnPath
    findings: list[Finding]
    units: UnitsInfo
    caution: str

    def condition(self, name: ConditionName) -> Condition:
        """The condition of that name."""
        return next(c for c in self.conditions if c.condition == name)

    @property
    def limits_exceeded(self) -> list[Finding]:
        """Findings of severity ``limit``."""
        return [f for f in self.findings if f.severity == "limit"]
