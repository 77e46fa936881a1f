"""The kit plan file's records: the coils wanted, the stock on the shelf and the settings (pydantic models).

Every value with a unit is written as text in the user's units (``"4.7uH"``, ``"12 mm"``) and read by the
field types of :mod:`coilplan.kit.plan_values`; after validation the records hold SI floats. The file is
read and its problems placed (file, line, entry, field) by :mod:`coilplan.kit.plan_file`.

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

import math
import re
from typing import Annotated, Literal

from pydantic import BaseModel, ConfigDict, Field, PrivateAttr, model_validator

from coilplan.errors import InvalidInputError
from coilplan.kit.plan_values import (
    AlValue,
    Area,
    Capacitance,
    Count,
    Current,
    Fraction,
    Frequency,
    Grade,
    Inductance,
    Length,
    LengthOrZero,
    MaterialName,
    Permeability,
    Readings,
    ReelLength,
    Relative,
    Temperature,
    WireText,
)

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

# --- where a key is in the file ----------------------------------------------------------------------

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
