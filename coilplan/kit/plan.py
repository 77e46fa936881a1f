"""The kit plan file: the coils wanted, the stock on the shelf and the settings, read from TOML and validated.

Every value with a unit is written as text in the user's units (``"4.7uH"``, ``"12 mm"``) and read
with :func:`coilplan.quantities.parse_quantity`; after validation the records hold SI floats. A plan
that does not validate is refused with one line naming the file, the line where it can be found,
the entry (``coil[2] 'osc-7M'``, counted from 1 as the file reads) and the field, with the text the
user wrote.

=====================  ==================  =================================================
table                  record              fields (SI after validation)
=====================  ==================  =================================================
``[settings]``         :class:`Settings`   ``lead`` (per end), ``packing``, ``wire_margin``,
                                           ``meter_frequency``, ``temperature``
``[[coil]]``           :class:`CoilSpec`   ``name``, ``count``, ``target`` or
                                           ``target_frequency`` + ``capacitance``,
                                           ``tolerance``, ``at``, ``current``, ``forms``
``[[former]]``         :class:`FormerSpec` ``name``, ``diameter``, ``length``, ``count``
``[[toroid]]``         :class:`ToroidSpec` ``name``, ``od``, ``id``, ``height``,
                                           ``material`` or ``al``, ``count``
``[[reel]]``           :class:`ReelSpec`   ``wire``, ``grade``, ``length``
=====================  ==================  =================================================
"""

from __future__ import annotations

import math
import re
import tomllib
from pathlib import Path
from typing import Annotated, Literal

from pydantic import BaseModel, BeforeValidator, ConfigDict, Field, ValidationError, field_validator, model_validator

from coilplan._validation import first_problem
from coilplan.errors import InvalidInputError
from coilplan.quantities import parse_quantity, parse_relative, parse_temperature

__all__ = [
    "FORMS",
    "CoilSpec",
    "FormerSpec",
    "Plan",
    "PlanFileError",
    "ReelSpec",
    "Settings",
    "ToroidSpec",
    "load_plan",
    "parse_plan",
]

#: The coil forms the kit planner can place a coil on (rods, gapped cores and multilayer bobbins: not yet).
FORMS = ("solenoid", "toroid")

#: A tolerance when the plan gives none: ±5 % on the inductance (common practice, no source).
DEFAULT_TOLERANCE = 0.05


class PlanFileError(InvalidInputError):
    """A plan file that cannot be used; the message names the file, the line, the entry and the field.

    Parameters
    ----------
    file : str
        The plan's path as given.
    problem : str
        What is wrong, in one line (entry and field included).
    line : int, optional
        1-based line of the file where the problem is, when it can be found.
    """

    def __init__(self, file: str, problem: str, line: int | None = None):
        super().__init__(str(file), problem, None)
        self.file = str(file)
        self.problem = problem
        self.line = line

    def __str__(self) -> str:
        where = f"{self.file}, line {self.line}" if self.line is not None else self.file
        return f"{where}: {self.problem}"


def _text_of(value, what: str, example: str) -> str:
    if isinstance(value, bool) or not isinstance(value, str):
        raise ValueError(f"expected {what} written as text with its unit, such as \"{example}\"")
    return value


def _quantity(unit: str, what: str, example: str, *, allow_zero: bool = False):
    """A field read from the user's text in ``unit`` (SI float after validation)."""

    def parse(value):
        if isinstance(value, float) and not isinstance(value, bool):
            return value  # a default, already SI
        text = _text_of(value, what, example)
        try:
            return parse_quantity(text, unit, allow_zero=allow_zero)
        except InvalidInputError as error:
            raise ValueError(f"expected {error.expected}") from None

    return Annotated[float, BeforeValidator(parse)]


def _relative(value):
    if isinstance(value, float):
        return value
    text = _text_of(value, "a relative value", "5%")
    try:
        return parse_relative(text)
    except InvalidInputError as error:
        raise ValueError(f"expected {error.expected}") from None


def _temperature(value):
    if isinstance(value, float):
        return value
    text = _text_of(value, "a temperature", "40C")
    try:
        return parse_temperature(text)
    except InvalidInputError as error:
        raise ValueError(f"expected {error.expected}") from None


def _count(value):
    if isinstance(value, bool) or not isinstance(value, int) or value < 1:
        raise ValueError("expected a whole number of at least 1")
    return value


Length = _quantity("m", "a length", "12mm")
LengthOrZero = _quantity("m", "a length", "20mm", allow_zero=True)
Inductance = _quantity("H", "an inductance", "4.7uH")
Capacitance = _quantity("F", "a capacitance", "100pF")
Frequency = _quantity("Hz", "a frequency", "7MHz")
Current = _quantity("A", "a current", "0.5A", allow_zero=True)
AlValue = _quantity("H/t2", "an AL value", "20nH")
Relative = Annotated[float, BeforeValidator(_relative)]
Count = Annotated[int, BeforeValidator(_count)]
Temperature = Annotated[float, BeforeValidator(_temperature)]


class _Record(BaseModel):
    model_config = ConfigDict(extra="forbid", frozen=True, allow_inf_nan=False)


class Settings(_Record):
    """How the coils are wound: lead allowance per end, hand-winding packing, wire margin, meter frequency.

    ``packing`` is the hand-winding packing factor (0 < p ≤ 1): turns sit at a pitch of the
    overall wire diameter divided by p (0.9: a hand-wound coil takes a tenth more length than a
    perfect close winding; common practice, no source). ``wire_margin`` is extra wire cut on top
    of the computed length (a fraction). ``meter_frequency`` is the test frequency of the meter
    that checks each coil (None: a low-frequency reading); ``temperature`` the windings' working
    temperature (``"20C"``, ``"313K"``), for the copper's resistance and the cores' saturation.
    """

    lead: LengthOrZero = 0.02
    packing: Annotated[float, Field(gt=0, le=1)] = 0.9
    wire_margin: Relative = 0.1
    meter_frequency: Frequency | None = None
    temperature: Temperature = 20.0

    @property
    def temperature_C(self) -> float:
        """The working temperature of the windings, °C (for the copper's resistance and the core's saturation)."""
        return self.temperature


class CoilSpec(_Record):
    """One coil type wanted: how many, the inductance (or resonance with a capacitor), where it works."""

    name: str = Field(min_length=1)
    count: Count
    target: Inductance | None = None
    target_frequency: Frequency | None = None
    capacitance: Capacitance | None = None
    tolerance: Relative = DEFAULT_TOLERANCE
    at: Frequency | None = None
    current: Current = 0.0
    forms: tuple[Literal["solenoid", "toroid"], ...] = FORMS

    @model_validator(mode="after")
    def _one_target(self) -> CoilSpec:
        tuned = self.target_frequency is not None or self.capacitance is not None
        if self.target is not None and tuned:
            raise ValueError("target: give either target, or target_frequency with capacitance, not both")
        if self.target is None and not tuned:
            raise ValueError("target: expected an inductance, or target_frequency with capacitance")
        if tuned and (self.target_frequency is None or self.capacitance is None):
            missing = "capacitance" if self.capacitance is None else "target_frequency"
            other = "target_frequency" if missing == "capacitance" else "capacitance"
            raise ValueError(f"{missing}: expected it with {other}")
        if not self.forms:
            raise ValueError("forms: expected at least one of " + ", ".join(FORMS))
        return self

    @property
    def target_inductance(self) -> float:
        """The inductance wanted, H (from L = 1/((2πf)²·C) for a tuned coil)."""
        if self.target is not None:
            return self.target
        return 1.0 / ((2.0 * math.pi * self.target_frequency) ** 2 * self.capacitance)

    @property
    def operating_frequency(self) -> float | None:
        """Where the coil works: ``at``, else the resonance it is tuned to, else None (low frequency)."""
        return self.at if self.at is not None else self.target_frequency

    @property
    def tuned(self) -> bool:
        return self.target_frequency is not None


class FormerSpec(_Record):
    """Bare formers (tubes, rods of insulating stock) for single-layer solenoids."""

    name: str | None = None
    diameter: Length
    length: Length
    count: Count


class ToroidSpec(_Record):
    """Ring cores: dimensions, and the material class or a measured AL value."""

    name: str | None = None
    od: Length
    id: Length
    height: Length
    material: str | None = None
    al: AlValue | None = None
    count: Count

    @field_validator("material")
    @classmethod
    def _known_material(cls, name: str | None) -> str | None:
        if name is not None:
            from coilplan.materials import material

            try:
                return material(name).name
            except InvalidInputError as error:
                raise ValueError(f"expected {error.expected}") from None
        return name

    @model_validator(mode="after")
    def _core_known(self) -> ToroidSpec:
        if self.od <= self.id:
            raise ValueError("od: expected an outside diameter above the inside diameter id")
        if self.material is None and self.al is None:
            raise ValueError("material: expected a material class (see 'coilplan materials') or an al value")
        return self


class ReelSpec(_Record):
    """A reel of enamelled wire: gauge or bare diameter, enamel grade, length on the reel."""

    wire: str
    grade: Literal["1", "2", "3", "bare"] = "1"
    length: Length

    @field_validator("wire")
    @classmethod
    def _known_wire(cls, text: str) -> str:
        from coilplan.wire import parse_wire

        try:
            parse_wire(text, option="wire")
        except InvalidInputError as error:
            raise ValueError(f"expected {error.expected}") from None
        return text


class Plan(_Record):
    """The whole plan file, validated."""

    settings: Settings = Settings()
    coil: tuple[CoilSpec, ...] = Field(min_length=1)
    former: tuple[FormerSpec, ...] = ()
    toroid: tuple[ToroidSpec, ...] = ()
    reel: tuple[ReelSpec, ...] = Field(min_length=1)

    @model_validator(mode="after")
    def _names_unique(self) -> Plan:
        names = [coil.name for coil in self.coil]
        repeated = sorted({name for name in names if names.count(name) > 1})
        if repeated:
            raise ValueError(f"coil names must differ; repeated: {', '.join(repeated)}")
        return self


# --- reading the file --------------------------------------------------------------------------

_HEADER = re.compile(r"^\s*(\[\[?)\s*([A-Za-z_][\w-]*)\s*\]\]?")


def _line_of(text: str, table: str, index: int | None, field: str | None) -> int | None:
    """1-based line of ``field`` in the ``index``-th (0-based) ``[[table]]`` (or ``[table]``); None if not found."""
    seen = -1
    inside = False
    header_line = None
    key = re.compile(rf"^\s*[\"']?{re.escape(field)}[\"']?\s*=") if field else None
    for number, line in enumerate(text.splitlines(), start=1):
        match = _HEADER.match(line)
        if match:
            if inside:
                break
            if match.group(2) == table:
                seen += 1
                if index is None or seen == index:
                    inside, header_line = True, number
            continue
        if inside and key is not None and key.match(line):
            return number
    return header_line


def _entry(document: dict, loc: tuple) -> tuple[str, str | None, int | None, str | None]:
    """(entry label, table, index, field) of a pydantic error location."""
    if not loc:
        return "the plan", None, None, None
    table = str(loc[0])
    if len(loc) >= 2 and isinstance(loc[1], int):
        index = loc[1]
        raw = document.get(table, [])
        name = raw[index].get("name") if index < len(raw) and isinstance(raw[index], dict) else None
        label = f"{table}[{index + 1}]" + (f" {name!r}" if isinstance(name, str) else "")
        field = str(loc[2]) if len(loc) > 2 else None
        return label, table, index, field
    field = str(loc[1]) if len(loc) > 1 else None
    return table, table, None, field


def _problem(file: str, text: str, document: dict, error: ValidationError) -> PlanFileError:
    found = first_problem(error)
    label, table, index, field = _entry(document, found.location)
    message = found.message
    field_named = field is not None and not message.startswith(f"{field}:")
    if field is None and ":" in message.split(" ", 1)[0]:  # a model check names its own field
        field = message.split(":", 1)[0]
    where = f"{label}: {field}: " if field_named else f"{label}: "
    problem = where + message + found.got + found.more
    line = _line_of(text, table, index, field) if table is not None else None
    return PlanFileError(file, problem, line)


def parse_plan(text: str, file: str = "plan") -> Plan:
    """Validate a plan given as TOML text; ``file`` is the name the errors give.

    Raises
    ------
    PlanFileError
        Not TOML (with tomllib's line and column), or an entry that does not validate.

    Examples
    --------
    >>> plan = parse_plan('''
    ... [[coil]]
    ... name = "bfo"
    ... count = 2
    ... target = "10uH"
    ... [[former]]
    ... diameter = "12mm"
    ... length = "40mm"
    ... count = 3
    ... [[reel]]
    ... wire = "26awg"
    ... length = "30m"
    ... ''')
    >>> plan.coil[0].target, plan.former[0].diameter, plan.settings.packing
    (1e-05, 0.012, 0.9)
    """
    try:
        document = tomllib.loads(text)
    except tomllib.TOMLDecodeError as error:
        match = re.search(r"\(at line (\d+), column \d+\)", str(error))
        line = int(match.group(1)) if match else None
        reason = re.sub(r"\s*\(at line \d+, column \d+\)", "", str(error))
        raise PlanFileError(file, f"not a TOML plan: {reason[0].lower()}{reason[1:]}", line) from None
    try:
        return Plan.model_validate(document)
    except ValidationError as error:
        raise _problem(file, text, document, error) from None


def load_plan(path) -> Plan:
    """Read and validate the plan file at ``path`` (only read, never written).

    Raises
    ------
    PlanFileError
        No such file, not UTF-8, not TOML, or an entry that does not validate.
    """
    path = Path(path)
    try:
        text = path.read_bytes().decode("utf-8")
    except FileNotFoundError:
        raise PlanFileError(path, "no plan file there") from None
    except IsADirectoryError:
        raise PlanFileError(path, "is a folder, not a plan file") from None
    except UnicodeDecodeError:
        raise PlanFileError(path, "not a plan file (not UTF-8 text)") from None
    except OSError as error:
        raise PlanFileError(path, f"cannot read it ({error.strerror or error})") from None
    return parse_plan(text, str(path))
