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
                                           ``tolerance``, ``at``, ``current``, ``forms``,
                                           ``tap_fraction`` or ``tap_turns``
``[[former]]``         :class:`FormerSpec` ``name``, ``diameter``, ``length``, ``count``
``[[toroid]]``         :class:`ToroidSpec` ``name``, ``od``, ``id``, ``height``,
                                           ``material`` or ``al``, ``count``
``[[rod]]``            :class:`RodSpec`    ``name``, ``length``, ``diameter``, ``former``,
                                           ``material`` or ``mu``, ``measured`` +
                                           ``measured_wire``, ``count``
``[[gapped]]``         :class:`GappedSpec` ``name``, ``ae``, ``le``, ``gap`` with
                                           ``material`` or ``mu``, or ``al``;
                                           ``window_width``, ``window_depth``,
                                           ``fringing``, ``count``
``[[bobbin]]``         :class:`BobbinSpec` ``name``, ``diameter``, ``width``, ``depth``,
                                           ``style``, ``count``
``[[reel]]``           :class:`ReelSpec`   ``wire``, ``grade``, ``length``
=====================  ==================  =================================================

Each stock table is one coil form (:data:`STOCK_FORMS`): a former carries a single-layer solenoid,
a ring core a toroid, a ferrite rod a single-layer coil on the rod, a gapped core (E, pot or drum
core with its bobbin) layers of turns round its centre leg, and a bobbin a multilayer air-core coil.
"""

from __future__ import annotations

import functools
import math
import re
import tomllib
from pathlib import Path
from typing import Annotated, Literal

from pydantic import (
    AfterValidator,
    BaseModel,
    BeforeValidator,
    ConfigDict,
    Field,
    PrivateAttr,
    ValidationError,
    model_validator,
)

from coilplan._validation import first_problem
from coilplan.errors import InvalidInputError
from coilplan.quantities import parse_measurement, parse_quantity, parse_relative, parse_temperature

__all__ = [
    "BobbinSpec",
    "CoilSpec",
    "FORMS",
    "FormerSpec",
    "GappedSpec",
    "Plan",
    "PlanFileError",
    "ReelSpec",
    "RodSpec",
    "STOCK_FORMS",
    "Settings",
    "ToroidSpec",
    "load_plan",
    "parse_plan",
]

#: The stock tables of a plan, in the order they are tried, and the coil form each carries.
STOCK_FORMS = {"former": "solenoid", "toroid": "toroid", "rod": "rod", "gapped": "gapped", "bobbin": "multilayer"}

#: The coil forms the kit planner can place a coil on (a coil's ``forms``; all of them by default).
FORMS = tuple(STOCK_FORMS.values())

FormName = Literal["solenoid", "toroid", "rod", "gapped", "multilayer"]

#: Coil units (and, apart, stock units) a plan may hold: the share-out matches unit to unit, a matrix of
#: coil units × stock units (4000 × 4000 float64 is 128 MB and about two seconds).
MAX_UNITS = 4000

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


def _checked(parse, *args, **kwargs):
    """``parse(*args, **kwargs)``, its :class:`InvalidInputError` turned into pydantic's ``ValueError``."""
    try:
        return parse(*args, **kwargs)
    except InvalidInputError as error:
        raise ValueError(f"expected {error.expected}") from None


def _read_text(parse, what: str, example: str):
    """A validator reading the user's text with ``parse``.

    Only what the file gives is validated (pydantic leaves the defaults, already SI, alone), so a bare
    number, which would carry no unit, is refused like any other value not written as text.
    """

    def read(value):
        return _checked(parse, _text_of(value, what, example))

    return read


def _quantity(unit: str, what: str, example: str, *, allow_zero: bool = False):
    """A field read from the user's text in ``unit`` (SI float after validation)."""
    return Annotated[float, BeforeValidator(_read_text(
        functools.partial(parse_quantity, unit=unit, allow_zero=allow_zero), what, example))]


_relative = _read_text(parse_relative, "a relative value", "5%")
_temperature = _read_text(parse_temperature, "a temperature", "40C")


def _count(value):
    if isinstance(value, bool) or not isinstance(value, int) or value < 1:
        raise ValueError("expected a whole number of at least 1")
    return value


#: A reel's length may go beyond the 100 m the general length parser accepts (a reel of fine wire holds
#: hundreds of metres); the kit reads it itself, from 1 mm to 100 km.
REEL_RANGE = (1e-3, 1e5)
_REEL_NUMBER = re.compile(r"^\s*(\d+(?:\.\d*)?|\.\d+)(?:[eE]([+-]?\d+))?\s*(.*)$")


def _reel_length(value):
    """A reel's length, SI: the number times the unit, the unit read by parse_quantity from a thousandth of it."""
    text = _text_of(value, "a length", "250m")
    match = _REEL_NUMBER.match(text)
    expected = "a reel length such as 250m (from 1 mm to 100 km)"
    if match is None or not match.group(3).strip():
        raise ValueError(f"expected {expected}")
    per_unit = _checked(parse_quantity, "0.001" + match.group(3).strip(), "m") * 1000.0  # metres in one unit
    exponent = match.group(2) or "0"
    exponent = int(exponent) if len(exponent) <= 5 else 10**6  # no need to read a thousand-digit power
    # a power beyond floats' reach is out of range either way (1e400 would overflow, 1e-400 vanish)
    length = math.inf if abs(exponent) > 300 else float(match.group(1)) * 10.0**exponent * per_unit
    if not (math.isfinite(length) and REEL_RANGE[0] <= length <= REEL_RANGE[1]):
        raise ValueError(f"expected {expected}")
    return length


def _permeability(value):
    if isinstance(value, bool) or not isinstance(value, (int, float)) or not math.isfinite(value) or value < 1:
        raise ValueError("expected a relative permeability of at least 1, as a plain number such as 125")
    return float(value)


def _fraction(value):
    if isinstance(value, bool) or not isinstance(value, (int, float)) or not 0 < value < 1:
        raise ValueError("expected a fraction of the turns between 0 and 1, as a plain number such as 0.25")
    return float(value)


def _readings(value):
    """One ``"L@N"`` reading or a list of them -> ((H, turns), ...)."""
    items = [value] if isinstance(value, str) else value
    if not isinstance(items, (list, tuple)) or not items:
        raise ValueError("expected a reading inductance@turns such as \"12uH@20\", or a list of them")
    readings = []
    for item in items:
        text = _text_of(item, "a reading inductance@turns", "12uH@20")
        readings.append(_checked(parse_measurement, text, "measured"))
    if len({turns for _, turns in readings}) != len(readings):
        raise ValueError("expected one reading per turn count (average repeated readings first)")
    return tuple(readings)


def _material_name(name: str) -> str:
    from coilplan.materials import material

    return _checked(material, name).name


def _wire_text(text: str) -> str:
    from coilplan.wire import parse_wire

    _checked(parse_wire, text)
    return text


Length = _quantity("m", "a length", "12mm")
LengthOrZero = _quantity("m", "a length", "20mm", allow_zero=True)
ReelLength = Annotated[float, BeforeValidator(_reel_length)]
Inductance = _quantity("H", "an inductance", "4.7uH")
Capacitance = _quantity("F", "a capacitance", "100pF")
Frequency = _quantity("Hz", "a frequency", "7MHz")
Current = _quantity("A", "a current", "0.5A", allow_zero=True)
AlValue = _quantity("H/t2", "an AL value", "20nH")
Area = _quantity("m2", "an area", "50mm2")
Permeability = Annotated[float, BeforeValidator(_permeability)]
Fraction = Annotated[float, BeforeValidator(_fraction)]
Readings = Annotated[tuple[tuple[float, int], ...], BeforeValidator(_readings)]
MaterialName = Annotated[str, AfterValidator(_material_name)]
WireText = Annotated[str, AfterValidator(_wire_text)]
Grade = Literal["1", "2", "3", "bare"]
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
    """One coil type wanted: how many, the inductance (or resonance with a capacitor), where it works.

    ``forms`` are the coil forms it may be wound as (all by default). ``tap_fraction`` (of the
    turns, rounded to the nearest whole turn and kept at least one turn from either end) or
    ``tap_turns`` (a turn number, counted from the start of the winding) asks for a tap: the
    card, the JSON and the bill of materials give its turn, and stock whose winding cannot hold
    it is not used.
    """

    name: str = Field(min_length=1)
    count: Count
    target: Inductance | None = None
    target_frequency: Frequency | None = None
    capacitance: Capacitance | None = None
    tolerance: Relative = DEFAULT_TOLERANCE
    at: Frequency | None = None
    current: Current = 0.0
    forms: tuple[FormName, ...] = FORMS
    tap_fraction: Fraction | None = None
    tap_turns: Count | None = None

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
        if self.tap_fraction is not None and self.tap_turns is not None:
            raise ValueError("tap_turns: give either tap_fraction or tap_turns, not both")
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

    @property
    def tapped(self) -> bool:
        return self.tap_fraction is not None or self.tap_turns is not None


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
    material: MaterialName | None = None
    al: AlValue | None = None
    count: Count

    @model_validator(mode="after")
    def _core_known(self) -> ToroidSpec:
        if self.od <= self.id:
            raise ValueError("od: expected an outside diameter above the inside diameter id")
        if self.material is None and self.al is None:
            raise ValueError("material: expected a material class (see 'coilplan materials') or an al value")
        return self


class RodSpec(_Record):
    """Ferrite rods: length, diameter, the material class or a permeability, and optionally a former round them.

    ``measured`` is one or more readings ``"L@N"`` of a test winding on one of these rods,
    close wound and centred, of ``measured_wire`` (grade ``measured_grade``): they scale the
    rod model to the material in hand, as ``coilplan rod --measured`` does.
    """

    name: str | None = None
    length: Length
    diameter: Length
    former: Length | None = None
    material: MaterialName | None = None
    mu: Permeability | None = None
    measured: Readings | None = None
    measured_wire: WireText | None = None
    measured_grade: Grade = "1"
    count: Count

    @model_validator(mode="after")
    def _core_known(self) -> RodSpec:
        if self.material is not None and self.mu is not None:
            raise ValueError("mu: give either material or mu, not both")
        if self.material is None and self.mu is None:
            raise ValueError("material: expected a material class (see 'coilplan materials') or a permeability mu")
        if self.former is not None and self.former < self.diameter:
            raise ValueError("former: expected a former at least as wide as the rod's diameter")
        if self.measured is not None and self.measured_wire is None:
            raise ValueError("measured_wire: expected the wire of the test winding the readings were taken on")
        if self.measured_wire is not None and self.measured is None:
            raise ValueError("measured: expected the readings taken with measured_wire")
        return self


class GappedSpec(_Record):
    """Gapped cores (E, pot or drum cores with a bobbin): effective parameters, gap and material, or an AL value.

    ``ae`` and ``le`` are the core's effective area and path length (IEC 60205, from its data or
    measured); ``gap`` is the total air gap in the path with ``material`` or ``mu``, or ``al``
    a known or measured AL value (``material`` may go with ``al`` for the saturation check).
    ``window_width`` (along the leg) and ``window_depth`` are the winding space of the bobbin.
    """

    name: str | None = None
    ae: Area
    le: Length
    gap: LengthOrZero | None = None
    material: MaterialName | None = None
    mu: Permeability | None = None
    al: AlValue | None = None
    window_width: Length
    window_depth: Length
    fringing: bool = True
    count: Count

    @model_validator(mode="after")
    def _core_known(self) -> GappedSpec:
        if self.material is not None and self.mu is not None:
            raise ValueError("mu: give either material or mu, not both")
        if self.al is not None and self.gap is not None:
            raise ValueError("gap: give either gap (with material or mu) or al, not both")
        if self.al is None and self.gap is None:
            raise ValueError("gap: expected the core's air gap (\"0mm\" for none) with material or mu, or an al value")
        if self.al is None and self.material is None and self.mu is None:
            raise ValueError("material: expected a material class (see 'coilplan materials') or a permeability mu "
                             "to go with the gap")
        if self.gap is not None and self.gap > 0.5 * self.le:
            raise ValueError("gap: expected a gap well below the path length le")
        return self


class BobbinSpec(_Record):
    """Bobbins for multilayer air-core coils: core diameter, width between the cheeks, depth of the window."""

    name: str | None = None
    diameter: Length
    width: Length
    depth: Length
    style: Literal["layered", "staggered"] = "layered"
    count: Count


class ReelSpec(_Record):
    """A reel of enamelled wire: gauge or bare diameter, enamel grade, length on the reel."""

    wire: WireText
    grade: Grade = "1"
    length: ReelLength


class Plan(_Record):
    """The whole plan file, validated; it keeps its file name and text to place later problems (:meth:`problem_at`)."""

    settings: Settings = Settings()
    coil: tuple[CoilSpec, ...] = Field(min_length=1)
    former: tuple[FormerSpec, ...] = ()
    toroid: tuple[ToroidSpec, ...] = ()
    rod: tuple[RodSpec, ...] = ()
    gapped: tuple[GappedSpec, ...] = ()
    bobbin: tuple[BobbinSpec, ...] = ()
    reel: tuple[ReelSpec, ...] = Field(min_length=1)
    _file: str = PrivateAttr(default="plan")
    _text: str = PrivateAttr(default="")

    @model_validator(mode="after")
    def _names_unique(self) -> Plan:
        names = [coil.name for coil in self.coil]
        repeated = sorted({name for name in names if names.count(name) > 1})
        if repeated:
            raise ValueError(f"coil names must differ; repeated: {', '.join(repeated)}")
        coils = sum(coil.count for coil in self.coil)
        stock = sum(item.count for kind in STOCK_FORMS for item in getattr(self, kind))
        for what, units in (("coils", coils), ("pieces of stock", stock)):
            if units > MAX_UNITS:
                raise ValueError(f"count: expected at most {MAX_UNITS} {what} in one plan (this one has {units}); "
                                 f"split it into smaller plans")
        return self

    def problem_at(self, table: str, index: int | None, key: str, problem: str) -> PlanFileError:
        """A problem found after validation, placed as the file's own are: file, line, entry and key.

        ``key`` is a key of the ``index``-th (0-based) ``[[table]]`` entry, or ``"settings.name"`` for a setting.
        """
        where, _, name = key.rpartition(".")
        entries = getattr(self, table, ())
        label = table if index is None else f"{table}[{index + 1}]"
        if index is not None and getattr(entries[index], "name", None):
            label += f" {entries[index].name!r}"
        line = _line_of(self._text, where or table, None if where else index, name)
        return PlanFileError(self._file, f"{label}: {key}: {problem}", line)

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
        plan = Plan.model_validate(document)
    except ValidationError as error:
        raise _problem(file, text, document, error) from None
    plan._file, plan._text = str(file), text
    return plan


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
