"""Result models of a loading check (the JSON fields of DESIGN.md, "Results").

Results are frozen dataclasses rather than pydantic models: they are built by our own
code from validated inputs, so they need no validation, and plain dataclasses keep the
start-up of a command-line check within its budget (benchmarks/startup.py).
:meth:`Result.to_dict` gives the JSON form, leaving out fields that are None.
"""

from __future__ import annotations

import json
from dataclasses import MISSING, dataclass, field, fields, is_dataclass
from typing import Any, Literal, TypeVar

__all__ = [
    "AircraftInfo",
    "BurnPath",
    "PathSample",
    "ResultColumns",
    "CheckResult",
    "Condition",
    "ConditionColumns",
    "ConditionName",
    "Excursion",
    "Finding",
    "Item",
    "ItemColumns",
    "LeavePoint",
    "Margins",
    "Severity",
    "StationChange",
    "Stop",
    "TripFinding",
    "TripLeg",
    "TripResult",
    "UnitsInfo",
    "Uplift",
]

ConditionName = Literal["ramp", "takeoff", "landing", "zero_fuel"]
Severity = Literal["limit", "warning"]


class Result:
    """Base of the result dataclasses: JSON conversion."""

    def to_dict(self) -> dict[str, Any]:
        """The result as JSON-ready data; fields that are None, and drawing data, are left out.

        Each class's conversion is written out once, as plain code, the first time one of its
        results is converted (:func:`_converter`), and then called directly: a check's result
        holds about fifty results, and the fleet check converts one per flight.
        """
        cls = type(self)
        convert = _converter(cls)
        if "to_dict" not in cls.__dict__:  # a class with its own to_dict keeps it (it may call this one)
            type.__setattr__(cls, "to_dict", convert)  # the class's method from now on
        return convert(self)

    def to_json(self, indent: int | None = 2) -> str:
        """The result as a JSON document."""
        return json.dumps(self.to_dict(), indent=indent)


def _plain(value: Any) -> Any:
    if isinstance(value, Result):
        return value.to_dict()
    if isinstance(value, list):
        return [_plain(v) for v in value]
    return value


_SCALARS = {"bool", "int", "float", "str", "ConditionName", "Severity"}
"""Field annotations (as written in this module) whose values are taken as they are."""

_CONVERTERS: dict[type, Any] = {}


def _converter(cls: type) -> Any:
    """The JSON conversion of one result class, as one function of plain code.

    Every field not marked as drawing data, in order: left out where None; a result converted
    (its own ``to_dict``); a list converted item by item; any other value taken as it is. A
    field whose annotation names a plain type of this module (``float``, ``str | None``,
    ``list[Finding]``) skips the type tests its values cannot need; any other annotation gets
    the general rule (:func:`_plain`). A field holding a result of this module's class it names
    (or a list of them) has that class's conversion written in place (:func:`_convert_lines`),
    where the value is of exactly that class; a value of any other class is converted by its
    own ``to_dict``, as before.
    """
    convert = _CONVERTERS.get(cls)
    if convert is not None:
        return convert
    lines = [
        "def to_dict(self):",
        "    if self.__class__ is not cls:",  # a subclass gets its own conversion (its own fields)
        "        return Result.to_dict(self)",
    ]
    scope: dict[str, Any] = {"cls": cls, "Result": Result, "_plain": _plain}
    _convert_lines(cls, "self", "out", 1, lines, scope, (cls,))
    lines.append("    return out")
    exec("\n".join(lines), scope)  # code written here from the classes' own field names
    convert = scope["to_dict"]
    convert.__doc__ = Result.to_dict.__doc__
    _CONVERTERS[cls] = convert
    return convert


def _written_in_place(name: str, within: tuple[type, ...]) -> type | None:
    """The result class of this module an annotation names, where its conversion can be written
    in place: the generated one (the class has no ``to_dict`` of its own), not one already
    being written (no class holds itself)."""
    found = globals().get(name)
    if not (isinstance(found, type) and issubclass(found, Result)):
        return None
    if "to_dict" in found.__dict__ and found.__dict__["to_dict"] is not _CONVERTERS.get(found):
        return None
    return None if found in within else found


def _convert_lines(
    cls: type, source: str, target: str, depth: int, lines: list[str], scope: dict[str, Any], within: tuple[type, ...]
) -> None:
    """The statements that convert ``source`` (a variable holding a ``cls`` exactly) into a new
    dictionary ``target``, at ``depth`` (indentation and variable names); see :func:`_converter`."""
    assert is_dataclass(cls)
    results = {name for name, value in globals().items() if isinstance(value, type) and issubclass(value, Result)}
    pad = "    " * depth
    v = f"v{depth}"
    kept = [f for f in fields(cls) if not f.metadata.get("drawing")]
    # the leading fields of plain types that are never None by their annotation: one dictionary
    # display for all of them where none is None (it is made at its size at once), else each
    # one tested as the other fields are
    leading = 0
    for f in kept:
        kind = f.type if isinstance(f.type, str) else ""
        if kind.strip() not in _SCALARS:
            break
        leading += 1
    if leading >= 2:
        early = [f"r{depth}_{k}" for k in range(leading)]
        lines.extend(f"{pad}{name} = {source}.{f.name}" for name, f in zip(early, kept, strict=False))
        lines.append(f"{pad}if {' and '.join(f'{name} is not None' for name in early)}:")
        pairs = ", ".join(f"{f.name!r}: {name}" for name, f in zip(early, kept, strict=False))
        lines.append(f"{pad}    {target} = {{{pairs}}}")
        lines.append(f"{pad}else:")
        lines.append(f"{pad}    {target} = {{}}")
        for name, f in zip(early, kept, strict=False):
            lines.append(f"{pad}    if {name} is not None:")
            lines.append(f"{pad}        {target}[{f.name!r}] = {name}")
    else:
        leading = 0
        lines.append(f"{pad}{target} = {{}}")
    for f in kept[leading:]:
        kind = f.type if isinstance(f.type, str) else ""
        options = [part.strip() for part in kind.split("|")]
        options = [o for o in options if o != "None"]
        one = options[0] if len(options) == 1 else ""
        item = one[5:-1] if one.startswith("list[") and one.endswith("]") else ""
        lines.append(f"{pad}{v} = {source}.{f.name}")
        lines.append(f"{pad}if {v} is not None:")
        inner = pad + "    "
        key = f"{target}[{f.name!r}]"
        if one in _SCALARS:
            lines.append(f"{inner}{key} = {v}")
        elif one in results:
            held = _written_in_place(one, within)
            if held is None:
                lines.append(f"{inner}{key} = {v}.to_dict()")
                continue
            scope[held.__name__] = held
            made = f"o{depth + 1}"
            lines.append(f"{inner}if {v}.__class__ is {held.__name__}:")
            _convert_lines(held, v, made, depth + 2, lines, scope, (*within, held))
            lines.append(f"{inner}    {key} = {made}")
            lines.append(f"{inner}else:")
            lines.append(f"{inner}    {key} = {v}.to_dict()")
        elif item in results:
            held = _written_in_place(item, within)
            if held is None:
                lines.append(f"{inner}{key} = [x.to_dict() for x in {v}]")
                continue
            scope[held.__name__] = held
            x, made, many = f"x{depth}", f"o{depth + 2}", f"l{depth}"
            lines.append(f"{inner}{many} = []")
            lines.append(f"{inner}for {x} in {v}:")
            lines.append(f"{inner}    if {x}.__class__ is {held.__name__}:")
            _convert_lines(held, x, made, depth + 3, lines, scope, (*within, held))
            lines.append(f"{inner}        {many}.append({made})")
            lines.append(f"{inner}    else:")
            lines.append(f"{inner}        {many}.append({x}.to_dict())")
            lines.append(f"{inner}{key} = {many}")
        elif item in _SCALARS:
            lines.append(f"{inner}{key} = list({v})")
        else:
            lines.append(f"{inner}{key} = _plain({v})")


_R = TypeVar("_R", bound=type)


def _quick_init(cls: _R) -> _R:
    """The class's ``__init__`` written again to set each field's slot directly, as one function.

    The ``__init__`` a frozen dataclass gets sets each field through ``object.__setattr__``,
    looked up by name on every call; this one calls each slot's own setter, found once, which
    takes well under half the time (a fleet check builds about fifty results a flight). The
    arguments, their defaults and default factories and the order the fields are set in are the
    dataclass's own, and the instance stays frozen (assigning to a field afterwards is refused
    as before). For the slotted, keyword-only dataclasses of this module, without
    ``__post_init__``.
    """
    assert "__post_init__" not in cls.__dict__ and "__slots__" in cls.__dict__
    scope: dict[str, Any] = {"_FACTORY": object()}
    params, lines = [], []
    for f in fields(cls):
        name = f.name
        slot = next(k.__dict__[name] for k in cls.__mro__ if name in k.__dict__)  # a member descriptor
        scope[f"_set_{name}"] = slot.__set__  # the slot's own setter
        if f.default is not MISSING:
            scope[f"_default_{name}"] = f.default
            params.append(f"{name}=_default_{name}")
        elif f.default_factory is not MISSING:
            scope[f"_factory_{name}"] = f.default_factory
            params.append(f"{name}=_FACTORY")
            lines.append(f"    if {name} is _FACTORY: {name} = _factory_{name}()")
        else:
            params.append(name)
        lines.append(f"    _set_{name}(self, {name})")
    code = f"def __init__(self, *, {', '.join(params)}):\n" + "\n".join(lines or ["    pass"])
    exec(code, scope)  # code written here from the class's own field names
    init = scope["__init__"]
    init.__qualname__ = f"{cls.__qualname__}.__init__"
    type.__setattr__(cls, "__init__", init)
    return cls


@_quick_init
@dataclass(frozen=True, kw_only=True, slots=True)
class Item(Result):
    """One line of the moment table.

    Attributes: weight [mass unit]; arm [arm unit, aft of datum]; moment [mass unit *
    arm unit]; lateral_arm [arm unit, + right] and lateral_moment where the aircraft
    limits the lateral CG; fuel_volume [fuel volume unit] for fuel lines; kind is one of
    empty, seat, baggage, cargo, ballast, other, fuel.
    """

    id: str
    name: str
    kind: str
    weight: float
    arm: float
    moment: float
    lateral_arm: float | None = None
    lateral_moment: float | None = None
    fuel_volume: float | None = None


@_quick_init
@dataclass(frozen=True, kw_only=True, slots=True)
class Margins(Result):
    """Room left to each limit at a condition; negative where the limit is exceeded.

    forward/aft: CG to the forward/aft limit at this weight [arm unit]; left/right: lateral
    CG to the lateral limits [arm unit]; weight: to the lower of the weight limit and each
    envelope's top at this CG (a lateral envelope drawn against weight: at this lateral CG)
    [mass unit], never above zero where the point is
    outside an envelope's weight range at this CG (below its bottom there: minus the weight
    short of it; no weight inside at this CG: zero, or minus the excess over the envelope's
    top; below the minimum flight weight at takeoff or landing: minus the weight short of
    it). None where no envelope gives that limit.
    """

    forward: float | None = None
    aft: float | None = None
    left: float | None = None
    right: float | None = None
    weight: float | None = None


@_quick_init
@dataclass(frozen=True, kw_only=True, slots=True)
class Condition(Result):
    """One of ramp, takeoff, landing, zero fuel.

    Attributes: weight [mass unit]; arm = CG [arm unit]; moment [mass unit * arm unit];
    lateral_arm [arm unit, + right]; mac_percent [% MAC]; fuel [fuel volume unit] and
    fuel_weight [mass unit] on board; max_weight, the weight limit in force [mass unit];
    ok, inside the envelope and the weight limits.
    """

    condition: ConditionName
    weight: float
    arm: float
    moment: float
    lateral_arm: float | None = None
    lateral_moment: float | None = None
    mac_percent: float | None = None
    fuel: float
    fuel_weight: float
    max_weight: float | None = None
    ok: bool
    margins: Margins


@_quick_init
@dataclass(frozen=True, kw_only=True, slots=True)
class LeavePoint(Result):
    """Where the fuel-burn path first leaves the envelope.

    Attributes: fuel_burned since takeoff and fuel_remaining on board [mass unit];
    weight [mass unit]; arm [arm unit]; the same fuel amounts as volumes
    [fuel volume unit]; envelope, the index in the aircraft file of the envelope it leaves,
    and subject, that envelope in words.
    """

    fuel_burned: float
    fuel_remaining: float
    weight: float
    arm: float
    lateral_arm: float | None = None
    fuel_burned_volume: float
    fuel_remaining_volume: float
    envelope: int | None = None
    subject: str | None = None


@_quick_init
@dataclass(frozen=True, kw_only=True, slots=True)
class Excursion(Result):
    """A stretch of the burn path outside the envelope: fuel burned since takeoff where it
    leaves and where it returns [mass unit].

    ``from_takeoff``: the path is already outside at takeoff (it does not leave: it starts
    out); ``to_landing``: it is still outside at landing (it does not come back in).
    ``leaves`` and ``returns`` are the points where it leaves and where it comes back inside
    (fuel burned and weight [mass unit], CG and lateral CG [arm unit]), None where it starts or
    ends outside; ``envelope`` is the index in the aircraft file of the envelope it leaves.
    """

    from_burned: float
    to_burned: float
    from_takeoff: bool = False
    to_landing: bool = False
    leaves: PathSample | None = None
    returns: PathSample | None = None
    envelope: int | None = None


@_quick_init
@dataclass(frozen=True, kw_only=True, slots=True)
class PathSample(Result):
    """A point of the fuel-burn path, for drawing it: fuel burned since takeoff and
    weight [mass unit]; CG and lateral CG [arm unit]."""

    fuel_burned: float
    weight: float
    arm: float
    lateral_arm: float | None = None


@_quick_init
@dataclass(frozen=True, kw_only=True, slots=True)
class BurnPath(Result):
    """The fuel-burn path from takeoff to landing.

    ``samples`` are points along the path (evenly spaced in fuel burned, plus every
    point where it leaves or re-enters an envelope) for charts; the verdict does not
    rest on them, and they are left out of the JSON form.
    """

    ok: bool
    leaves_at: LeavePoint | None = None
    excursions: list[Excursion] = field(default_factory=list)
    samples: list[PathSample] = field(default_factory=list, metadata={"drawing": True})


@_quick_init
@dataclass(frozen=True, kw_only=True, slots=True)
class Finding(Result):
    """A limit exceeded (severity ``limit``) or something to note (``warning``).

    Attributes: code (max_takeoff_weight, envelope, burn_path, station_max, group_min,
    reserve, assumption, ...); condition where it applies; message in plain words;
    excess, by how much, in ``unit``; limit, the limit's value in ``unit``; side
    (forward, aft, left, right, above, below, outside); subject, the station, group or
    envelope concerned.
    """

    code: str
    severity: Severity
    condition: ConditionName | None = None
    message: str
    excess: float | None = None
    unit: str | None = None
    limit: float | None = None
    side: str | None = None
    subject: str | None = None


@_quick_init
@dataclass(frozen=True, kw_only=True, slots=True)
class AircraftInfo(Result):
    """Which aircraft data was used."""

    name: str
    registration: str | None = None
    fingerprint: str
    empty_weight_date: str | None = None


@_quick_init
@dataclass(frozen=True, kw_only=True, slots=True)
class UnitsInfo(Result):
    """Units of every number in the result."""

    mass: str
    arm: str
    fuel_volume: str
    moment: str


@_quick_init
@dataclass(frozen=True, kw_only=True, slots=True)
class CheckResult(Result):
    """The answer to "is this loading within limits?" (DESIGN.md, "Results")."""

    ok: bool
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


# -- many results by column (a fleet check's chunk) ------------------------------------------


@dataclass(frozen=True, slots=True)
class ItemColumns:
    """The moment tables of N loadings by column (:func:`loadcheck.balance.moment_tables`).

    ``empty`` is the first line of every table. ``stations`` are the fixed parts of each
    station's line in ``aircraft.station`` order (id, name, kind, arm [arm unit], lateral arm
    [arm unit] or None); ``weights``, ``moments`` and ``lateral_moments`` are (N, S) lists
    [mass unit; mass unit * arm unit] (lateral moments None where the aircraft has no lateral
    limits). ``tanks`` are each tank's id, name and lateral arm or None; ``volumes`` [fuel volume
    unit], ``fuel_weights`` [mass unit] and ``arms`` [arm unit, at that volume] are (N, T) lists.
    A table lists the empty weight, each station with a weight other than zero and each tank
    holding fuel (volume above zero); its moment is weight * arm (FAA-H-8083-1B chapter 2).
    """

    empty: Item
    stations: list[tuple[str, str, str, float, float | None]]
    weights: list[list[float]]
    moments: list[list[float]]
    lateral_moments: list[list[float | None]]
    tanks: list[tuple[str, str, float | None]]
    volumes: list[list[float]]
    fuel_weights: list[list[float]]
    arms: list[list[float]]
    fuel_moments: list[list[float]]
    fuel_lateral_moments: list[list[float | None]]

    def table(self, i: int) -> list[Item]:
        """The moment table of loading ``i``."""
        items = [self.empty]
        for (id_, name, kind, arm, lateral_arm), weight, moment, lateral_moment in zip(
            self.stations, self.weights[i], self.moments[i], self.lateral_moments[i], strict=True
        ):
            if weight != 0.0:
                items.append(
                    Item(
                        id=id_,
                        name=name,
                        kind=kind,
                        weight=weight,
                        arm=arm,
                        moment=moment,
                        lateral_arm=lateral_arm,
                        lateral_moment=lateral_moment,
                    )
                )
        for (id_, name, lateral_arm), volume, weight, arm, moment, lateral_moment in zip(
            self.tanks,
            self.volumes[i],
            self.fuel_weights[i],
            self.arms[i],
            self.fuel_moments[i],
            self.fuel_lateral_moments[i],
            strict=True,
        ):
            if volume > 0:
                items.append(
                    Item(
                        id=id_,
                        name=name,
                        kind="fuel",
                        weight=weight,
                        arm=arm,
                        moment=moment,
                        lateral_arm=lateral_arm,
                        lateral_moment=lateral_moment,
                        fuel_volume=volume,
                    )
                )
        return items


@dataclass(frozen=True, slots=True)
class ConditionColumns:
    """One condition of N loadings by column (each list one value a loading; see :class:`Condition`).

    ``lateral_arm``, ``lateral_moment`` and ``mac_percent`` are None where the aircraft has no
    lateral limits or no MAC; ``margins`` holds a column for each of :class:`Margins`' fields,
    None in a column where no envelope gives that limit.
    """

    condition: ConditionName
    weight: list[float]
    arm: list[float]
    moment: list[float]
    lateral_arm: list[float] | None
    lateral_moment: list[float] | None
    mac_percent: list[float] | None
    fuel: list[float]
    fuel_weight: list[float]
    max_weight: float | None
    ok: list[bool]
    margins: dict[str, list[float | None]]

    def at(self, i: int) -> Condition:
        """The condition of loading ``i``."""
        return Condition(
            condition=self.condition,
            weight=self.weight[i],
            arm=self.arm[i],
            moment=self.moment[i],
            lateral_arm=None if self.lateral_arm is None else self.lateral_arm[i],
            lateral_moment=None if self.lateral_moment is None else self.lateral_moment[i],
            mac_percent=None if self.mac_percent is None else self.mac_percent[i],
            fuel=self.fuel[i],
            fuel_weight=self.fuel_weight[i],
            max_weight=self.max_weight,
            ok=self.ok[i],
            margins=Margins(**{key: column[i] for key, column in self.margins.items()}),
        )


@dataclass(frozen=True, slots=True)
class ResultColumns:
    """The results of N checks of one aircraft by column: what :class:`CheckResult` holds,
    the numbers as columns and each loading's verdict, burn path and findings as its own.

    Made by :func:`loadcheck.check.check_columns`; :meth:`result` is loading ``i``'s
    :class:`CheckResult`, and :func:`loadcheck.result_json.result_texts` writes every
    loading's JSON form straight from the columns (the same text as ``result(i).to_dict()``).
    """

    aircraft: AircraftInfo
    units: UnitsInfo
    caution: str
    category: list[str]
    ok: list[bool]
    items: ItemColumns
    conditions: list[ConditionColumns]  # in CONDITIONS order
    burn_path: list[BurnPath]
    findings: list[list[Finding]]

    def __len__(self) -> int:
        return len(self.ok)

    def result(self, i: int) -> CheckResult:
        """The result of loading ``i``."""
        return CheckResult(
            ok=self.ok[i],
            category=self.category[i],
            aircraft=self.aircraft,
            items=self.items.table(i),
            conditions=[condition.at(i) for condition in self.conditions],
            burn_path=self.burn_path[i],
            findings=self.findings[i],
            units=self.units,
            caution=self.caution,
        )


# -- trips of several legs (docs/file-format.md, "Trips of several legs") ---------------------


@_quick_init
@dataclass(frozen=True, kw_only=True, slots=True)
class Uplift(Result):
    """Fuel put into one tank at a stop: the refueller's instruction.

    ``given`` is the amount as the loading gives it (a number in the fuel volume unit, a
    quantity such as ``"30 lb"``, ``"full"`` or a level name), None where a planning answer
    chose it; ``volume`` is the fuel that goes in, resolved against what the tank held at the
    previous landing [fuel volume unit]; ``weight`` is its mass [mass unit]; ``on_board`` is
    what the tank holds after it, at the leg's engine start [fuel volume unit].
    """

    tank: str
    name: str
    volume: float
    weight: float
    on_board: float
    given: float | str | None = None


@_quick_init
@dataclass(frozen=True, kw_only=True, slots=True)
class StationChange(Result):
    """A station whose load changes at a stop: its weight on the previous leg and on this one
    [mass unit] (0 where nothing is there)."""

    station: str
    name: str
    from_weight: float
    to_weight: float


@_quick_init
@dataclass(frozen=True, kw_only=True, slots=True)
class Stop(Result):
    """What changes at the stop before a leg: the fuel put in, tank by tank (``fuel``, empty
    where none), and the stations whose load changes (``stations``, empty where none)."""

    fuel: list[Uplift]
    stations: list[StationChange]


@_quick_init
@dataclass(frozen=True, kw_only=True, slots=True)
class TripLeg(Result):
    """One leg of a trip: its number (from 1), its label, what changed at the stop before it
    (``stop``: None for the first leg), and its full single check.

    Its JSON form is the check's own fields (those of :class:`CheckResult`) with ``leg``,
    ``label`` and ``stop`` added.
    """

    leg: int
    label: str | None = None
    stop: Stop | None = None
    check: CheckResult

    def to_dict(self) -> dict[str, Any]:
        """The check's JSON fields, with the leg's number, label and stop."""
        head: dict[str, Any] = {"leg": self.leg}
        if self.label is not None:
            head["label"] = self.label
        if self.stop is not None:
            head["stop"] = self.stop.to_dict()
        return head | self.check.to_dict()


@_quick_init
@dataclass(frozen=True, kw_only=True, slots=True)
class TripFinding(Finding):
    """A finding of one leg: the leg's :class:`Finding`, naming the leg (number and label)."""

    leg: int
    label: str | None = None


@_quick_init
@dataclass(frozen=True, kw_only=True, slots=True)
class TripResult(Result):
    """The answer to "is every leg of this trip within limits?".

    ``ok`` is true exactly when every leg's check is; ``findings`` are every leg's findings,
    each naming its leg; ``legs`` each carry the full single check.
    """

    ok: bool
    category: str
    aircraft: AircraftInfo
    legs: list[TripLeg]
    findings: list[TripFinding]
    units: UnitsInfo
    caution: str

    @property
    def failed_legs(self) -> list[TripLeg]:
        """The legs with a limit exceeded."""
        return [leg for leg in self.legs if not leg.check.ok]

    @property
    def limits_exceeded(self) -> list[TripFinding]:
        """Findings of severity ``limit``, of every leg."""
        return [f for f in self.findings if f.severity == "limit"]
