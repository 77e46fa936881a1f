"""The stock on the shelf as coil forms: each item of a plan, wound by hand with each reel's wire.

============  ===============================================  ==============================
table         form built                                       wound
============  ===============================================  ==============================
``former``    :class:`~coilplan.forms.Solenoid`                one layer along the former
``toroid``    :class:`~coilplan.forms.Toroid`                  one layer round the inside
``rod``       :class:`~coilplan.forms.RodCoil`                 one layer, centred on the rod
``gapped``    :class:`~coilplan.forms.GappedCore`              layers across the bobbin window
``bobbin``    :class:`~coilplan.forms.MultilayerCoil`          layers between the cheeks
============  ===============================================  ==============================

Hand winding: the turns sit at the wire's overall diameter divided by the plan's packing factor
(``settings.packing``), along the winding and, for layered windings, from layer to layer.

A rod's model is costly (a linear solve per turn count, :func:`coilplan.physics.rod.rod_coil_inductance`),
so the kit evaluates it at whole turns only, once each (:class:`WholeTurns`); the solver sees the
values joined by straight lines, which keeps every whole-turn figure the model's own. Readings of a
test winding (``measured``) scale the model as ``coilplan rod --measured`` does
(:func:`coilplan.calibrate.calibrate`, the meter's frequency taken out with the winding's estimated
self-capacitance).
"""

from __future__ import annotations

import dataclasses
import math
from dataclasses import dataclass, field

import numpy as np

from coilplan.calibrate import ScaledForm
from coilplan.errors import InvalidInputError
from coilplan.forms import GappedCore, MultilayerCoil, RodCoil, Solenoid, Toroid
from coilplan.kit.keys import in_plan_words
from coilplan.kit.plan import STOCK_FORMS
from coilplan.quantities import format_length, format_quantity
from coilplan.wire import Wire, parse_wire

__all__ = ["StockItem", "WholeTurns", "build_form", "describe", "plan_wires", "rod_scale", "stock_items",
           "winding_limit"]


@dataclass(frozen=True)
class StockItem:
    """One line of stock: a former, ring core, rod, gapped core or bobbin, how many, and its label."""

    kind: str  # a key of STOCK_FORMS
    index: int  # 0-based within its table
    label: str
    count: int
    spec: object
    scale: float | None = None  # a rod's calibration factor from its readings (None: uncalibrated)

    @property
    def form_name(self) -> str:
        """The coil form this item carries (``solenoid``, ``toroid``, ``rod``, ``gapped``, ``multilayer``)."""
        return STOCK_FORMS[self.kind]


@dataclass(frozen=True)
class WholeTurns:
    """``form`` with its inductance evaluated at whole turns only (each once), straight between them.

    For a model too costly to call at every step of the root finder; whole-turn values are the
    model's own, so the whole numbers the solver settles on are those the model itself gives.
    Everything but ``inductance`` is the form's.
    """

    form: object
    _values: dict = field(default_factory=dict, init=False, repr=False, compare=False)

    def _at(self, whole: np.ndarray) -> np.ndarray:
        needed = [n for n in np.unique(whole).tolist() if n not in self._values]
        if needed:
            values = np.atleast_1d(np.asarray(self.form.inductance(np.array(needed, dtype=float)), dtype=float))
            self._values.update(zip(needed, values.tolist(), strict=True))
        return np.array([self._values[n] for n in whole.ravel().tolist()]).reshape(whole.shape)

    def inductance(self, turns):
        turns = np.asarray(turns, dtype=float)
        flat = np.atleast_1d(turns)
        low = np.maximum(np.floor(flat), 1.0)
        below, above = self._at(low), self._at(low + 1.0)
        values = below + (np.maximum(flat, 1.0) - low) * (above - below)
        return values[0] if turns.ndim == 0 else values.reshape(turns.shape)

    def __getattr__(self, name):
        return getattr(self.form, name)


def _label(kind: str, index: int, spec) -> str:
    return f"{kind} {spec.name!r}" if spec.name else f"{kind}[{index + 1}]"


def _hand(wire: Wire, packing: float) -> Wire:
    """The wire as it sits when wound by hand: its overall diameter stretched by 1/packing."""
    return dataclasses.replace(wire, overall_diameter=wire.overall_diameter / packing, grade="measured",
                               max_overall_diameter=None)


def _material(name: str | None, temperature_C: float) -> tuple[float | None, float | None]:
    """(initial permeability, saturation flux density at the temperature) of a material class, or Nones."""
    if name is None:
        return None, None
    from coilplan.materials import material

    chosen = material(name)
    limit = chosen.saturation_flux_density(temperature_C)
    return chosen.mu_initial, None if limit is None else float(limit)


def _rod(spec, wire: Wire, settings, scale: float | None = None):
    mu, bsat = _material(spec.material, settings.temperature_C)
    form = RodCoil(rod_length=spec.length, rod_diameter=spec.diameter, mu_initial=spec.mu if mu is None else mu,
                   wire=wire, former_diameter=spec.former, pitch=wire.overall_diameter / settings.packing,
                   saturation_flux_density=bsat, lead=settings.lead)
    return form if scale is None else ScaledForm(form, scale)


def rod_scale(spec, settings) -> float | None:
    """The factor that scales the rod model to the readings of the test winding (None without readings).

    The test winding is taken as close wound (at the plan's packing) and centred, of ``measured_wire``;
    the calibration is the commands' own (:func:`coilplan.calibrate.calibrate`).
    """
    if spec.measured is None:
        return None
    from coilplan.calibrate import calibrate
    from coilplan.request import Reading, Request

    wire = parse_wire(spec.measured_wire, grade=spec.measured_grade)
    request = Request(readings=tuple(Reading(value, turns) for value, turns in spec.measured),
                      meter_frequency=settings.meter_frequency)
    form, _ = calibrate(_rod(spec, wire, settings), request)
    return form.factor


def stock_items(plan) -> list[StockItem]:
    """Every stock line of the plan, table by table in :data:`~coilplan.kit.plan.STOCK_FORMS` order.

    Raises
    ------
    PlanFileError
        A rod's readings that cannot calibrate it, naming the plan's file, line, entry and key.
    """
    items = []
    for kind in STOCK_FORMS:
        for index, spec in enumerate(getattr(plan, kind)):
            try:
                scale = rod_scale(spec, plan.settings) if kind == "rod" else None
            except InvalidInputError as error:  # the library's field as the plan's key
                raise in_plan_words(error, plan, kind, index) from None
            items.append(StockItem(kind, index, _label(kind, index, spec), spec.count, spec, scale))
    return items


def plan_wires(plan) -> list[tuple[str, str, Wire]]:
    """(text, grade, wire) of each distinct wire on the reels, in plan order."""
    seen: dict[tuple[str, str], Wire] = {}
    for reel in plan.reel:
        key = (reel.wire, reel.grade)
        if key not in seen:
            seen[key] = parse_wire(reel.wire, grade=reel.grade)
    return [(text, grade, wire) for (text, grade), wire in seen.items()]


def build_form(item: StockItem, wire: Wire, settings):
    """The coil form of ``item`` wound with ``wire`` by hand (pitch = overall diameter / packing).

    Raises
    ------
    InvalidInputError
        The wire does not suit the item (too thick for the hole, the former or the window).
    """
    hand = _hand(wire, settings.packing)
    spec = item.spec
    if item.kind == "former":
        return Solenoid(diameter=spec.diameter + wire.overall_diameter, wire=hand, max_length=spec.length,
                        lead=settings.lead)
    if item.kind == "rod":
        return WholeTurns(_rod(spec, wire, settings, item.scale))
    if item.kind == "bobbin":
        return MultilayerCoil(former_diameter=spec.diameter, width=spec.width, wire=wire, style=spec.style,
                              packing=settings.packing, max_depth=spec.depth, lead=settings.lead)
    mu_r, bsat = _material(spec.material, settings.temperature_C)
    if item.kind == "gapped":
        return GappedCore(ae=spec.ae, le=spec.le, wire=hand, gap=spec.gap, mu_r=spec.mu if mu_r is None else mu_r,
                          al=spec.al, window_width=spec.window_width, window_depth=spec.window_depth,
                          fringing=spec.fringing, saturation_flux_density=bsat, lead=settings.lead)
    return Toroid(inner_diameter=spec.id, outer_diameter=spec.od, height=spec.height, wire=hand, al=spec.al,
                  al_basis="given AL value" if spec.al is not None else f"material {spec.material}",
                  mu_r=None if spec.al is not None else mu_r, saturation_flux_density=bsat, lead=settings.lead)


def core_spectrum(item: StockItem, form):
    """The frequency behaviour of the item's core when its material class is named, else None (see core_frequency)."""
    name = getattr(item.spec, "material", None)
    if name is None or item.kind not in ("toroid", "gapped", "rod"):
        return None
    from coilplan.core_frequency import class_spectrum

    mu = {"toroid": lambda: form.permeability(), "gapped": lambda: form.mu_r,
          "rod": lambda: form.mu_initial}[item.kind]()
    return class_spectrum(form, name, mu)


def _core(spec) -> str:
    if getattr(spec, "al", None) is not None:
        return f"AL {format_quantity(spec.al, 'H')} per turn²" + (f", {spec.material}" if spec.material else "")
    if spec.material is not None:
        return spec.material
    return f"permeability {spec.mu:g}"


def describe(item: StockItem) -> str:
    """The item in words, for the bill of materials."""
    spec = item.spec
    if item.kind == "former":
        return f"former, {format_length(spec.diameter)} diameter, {format_length(spec.length)} long"
    if item.kind == "toroid":
        return (f"ring core, OD {format_length(spec.od)}, ID {format_length(spec.id)}, "
                f"height {format_length(spec.height)}, {_core(spec)}")
    if item.kind == "rod":
        former = f", on a {format_length(spec.former)} former" if spec.former is not None else ""
        measured = ", calibrated by a test winding" if item.scale is not None else ""
        return (f"ferrite rod, {format_length(spec.diameter)} diameter, {format_length(spec.length)} long, "
                f"{_core(spec)}{former}{measured}")
    if item.kind == "gapped":
        gap = f", gap {format_length(spec.gap)}" if spec.gap is not None else ""
        return (f"gapped core, Ae {spec.ae * 1e6:.4g} mm², le {format_length(spec.le)}{gap}, {_core(spec)}, "
                f"window {format_length(spec.window_width)} × {format_length(spec.window_depth)}")
    return (f"bobbin, {format_length(spec.diameter)} core, {format_length(spec.width)} between the cheeks, "
            f"{format_length(spec.depth)} deep ({spec.style})")


def winding_limit(form) -> int:
    """Whole turns the form holds (0 when not one fits)."""
    top = float(form.max_turns())
    return math.floor(top + 1e-9) if math.isfinite(top) else 10**7
