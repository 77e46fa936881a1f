"""``coilplan materials``: the generic core material classes, and which ones a measured μ fits.

Thin: it parses, asks :mod:`coilplan.materials` and renders. With no argument it
lists the classes; with a MATERIAL it shows that one; with ``--mu`` it lists the
classes consistent with a measured relative permeability (sorting unmarked cores).
"""

from __future__ import annotations

import math

import click

from coilplan.cautions import MAINS_EQUIPMENT_CLASSES, salvaged_mains_caution
from coilplan.cli._common import captured_warnings, emit, json_option
from coilplan.errors import InvalidInputError
from coilplan.materials import (
    Material,
    PermeabilityMatch,
    all_materials,
    material,
    material_dispersion,
    materials_for_permeability,
)
from coilplan.quantities import format_quantity
from coilplan.report import aligned_rows, bullet_lines

__all__ = ["materials"]

_DEFAULT_SPREAD = 0.25
_TYPICAL_NOTE = ("values are typical of each class, with its usual spread; a real core may differ, "
                 "so calibrate with a measurement")
_OVERLAP_NOTE = ("permeability alone cannot tell apart classes whose ranges overlap: check a second "
                 "clue, such as how Q and inductance hold up with frequency, a meter on the bare core "
                 "(MnZn reads a resistance; NiZn and powder cores read open), or how the inductance "
                 "falls with DC current")
class _FractionType(click.ParamType):
    """A fraction such as ``0.25`` or a percentage such as ``25%``."""

    name = "fraction"

    def convert(self, value, param, ctx):
        if isinstance(value, float):
            return value
        text = str(value).strip()
        scale = 1.0
        if text.endswith("%"):
            text, scale = text[:-1].strip(), 0.01
        try:
            number = float(text) * scale
        except ValueError:
            number = math.nan
        if not (math.isfinite(number) and 0 <= number <= 10):
            self.fail(f"expected a fraction from 0 to 10 such as 0.25, or a percentage such as 25%; "
                      f"got {value!r}", param, ctx)
        return number


class _PermeabilityType(click.ParamType):
    """A relative permeability: a plain number above zero (``130``)."""

    name = "mu_r"

    def convert(self, value, param, ctx):
        if isinstance(value, float):
            return value
        try:
            number = float(str(value).strip())
        except ValueError:
            number = math.nan
        if not (math.isfinite(number) and number > 0):
            self.fail(f"expected a relative permeability above zero, such as 125; got {value!r}",
                      param, ctx)
        return number


def _compact(value: float, unit: str) -> str:
    """``format_quantity`` without trailing zeros: 1000 Hz -> '1 kHz', 0.39 T -> '390 mT'."""
    number, _, symbol = format_quantity(value, unit, 3).partition(" ")
    if "." in number:
        number = number.rstrip("0").rstrip(".")
    return f"{number} {symbol}"


def _count(value: float) -> str:
    return f"{value:g}"


def _material_result(core: Material) -> dict:
    low, high = core.frequency_range if core.frequency_range is not None else (None, None)
    return {
        "name": core.name,
        "family": core.family,
        "description": core.description,
        "mu_initial": core.mu_initial,
        "mu_low": core.mu_range[0],
        "mu_high": core.mu_range[1],
        "saturation_flux_density_T": core.saturation_flux_density_25C,
        "saturation_flux_density_100C_T": core.saturation_flux_density_100C,
        "curie_C": core.curie_temperature,
        "frequency_low_Hz": low,
        "frequency_high_Hz": high,
        "resistivity_ohm_m": core.resistivity,
        "resistivity_class": core.resistivity_class,
        "loss_note": core.loss_note,
        **_dispersion_result(core),
        "source": core.source,
    }


def _dispersion_result(core: Material) -> dict:
    if core.family == "air":
        return {"relaxation_frequency_Hz": None, "loss_factor": []}
    spread = material_dispersion(core.name)
    return {"relaxation_frequency_Hz": spread.relaxation_frequency,
            "loss_factor": [{"loss_factor": spread.loss_factor, "frequency_Hz": spread.loss_factor_frequency},
                            {"loss_factor": spread.loss_factor_high,
                             "frequency_Hz": spread.loss_factor_high_frequency}]}


def _match_result(match: PermeabilityMatch) -> dict:
    return {**_material_result(match.material), "inside_range": match.inside,
            "ratio_to_typical": match.ratio_to_typical}


def _saturation(core: Material) -> str:
    if core.saturation_flux_density_25C is None or core.saturation_flux_density_100C is None:
        return "none"
    return f"{core.saturation_flux_density_25C:.2f} / {core.saturation_flux_density_100C:.2f} T"


def _frequencies(core: Material) -> str:
    if core.frequency_range is None:
        return "no limit from the material"
    low, high = core.frequency_range
    return f"{_compact(low, 'Hz')} to {_compact(high, 'Hz')}"


def _resistivity(core: Material) -> str:
    if core.resistivity is None:
        return core.resistivity_class
    return f"about {core.resistivity:.0e} Ω·m ({core.resistivity_class})".replace("e+0", "e").replace(
        "e-0", "e-")


def _curie(core: Material) -> str:
    return "n/a" if core.curie_temperature is None else f"{core.curie_temperature:g} °C"


def _mu_range(core: Material) -> str:
    low, high = core.mu_range
    return _count(low) if low == high else f"{_count(low)} to {_count(high)}"


def _table_lines(cores: list[Material], extra: list[str] | None = None) -> list[str]:
    header = ["class", "family", "μi typical", "μi spread", "Bsat 25/100 °C", "Curie",
              "used from / to"]
    if extra is not None:
        header.append("fit")
    rows = [header]
    for index, core in enumerate(cores):
        row = [core.name, core.family, _count(core.mu_initial), _mu_range(core), _saturation(core),
               _curie(core), _frequencies(core)]
        if extra is not None:
            row.append(extra[index])
        rows.append(row)
    return aligned_rows(rows)


def _one_material_lines(core: Material) -> list[str]:
    rows = [
        ("family", core.family),
        ("initial permeability", f"{_count(core.mu_initial)} typical ({_mu_range(core)})"),
        ("saturation", "does not saturate" if core.saturation_flux_density_25C is None else
         f"{_compact(core.saturation_flux_density_25C, 'T')} at 25 °C, "
         f"{_compact(core.saturation_flux_density_100C, 'T')} at 100 °C"),
        ("Curie temperature", _curie(core)),
        ("resistivity", _resistivity(core)),
        ("used as an inductor", _frequencies(core)),
        ("losses", core.loss_note),
        *_dispersion_rows(core),
        ("source", core.source),
    ]
    return [f"{core.name}: {core.description}", *aligned_rows(rows)]


def _dispersion_rows(core: Material) -> list[tuple[str, str]]:
    """The class's frequency dispersion (dispersion.csv), as the answers at --at use it."""
    if core.family == "air":
        return []
    spread = material_dispersion(core.name)
    basis = "Snoek's law" if spread.basis == "snoek" else "typical"
    return [
        ("loss factor tanδ/μi", f"{spread.loss_factor:.2g} at {_compact(spread.loss_factor_frequency, 'Hz')}, "
                                f"{spread.loss_factor_high:.2g} at {_compact(spread.loss_factor_high_frequency, 'Hz')}"
                                f" (typical, from memory: a factor of two or more either way)"),
        ("relaxation", f"{_compact(spread.relaxation_frequency, 'Hz')} ({basis}): where μ' has fallen to half"),
    ]


@click.command("materials")
@click.argument("name", metavar="[MATERIAL]", required=False)
@click.option("--mu", type=_PermeabilityType(), default=None, metavar="MU_R",
              help="A measured relative permeability: list the classes it fits, e.g. --mu 130.")
@click.option("--spread", type=_FractionType(), default=_DEFAULT_SPREAD, show_default="25%",
              help="How far beyond a class's range --mu may lie (meter error, core spread).")
@json_option
def materials(name, mu, spread, as_json):
    """Generic core material classes: permeability, saturation, resistivity, frequency range.

    With no MATERIAL, list the classes. With a MATERIAL (e.g. nizn-125), show that
    one. With --mu, list the classes consistent with a relative permeability you
    measured on an unmarked core (from a test winding's inductance and the core's
    size), best fit first.
    """
    if name is not None and mu is not None:
        raise InvalidInputError("--mu", "either MATERIAL or --mu, not both", None)
    inputs = {"material": name, "mu": mu, "spread": spread if mu is not None else None}
    notes = [_TYPICAL_NOTE]
    cautions: list[str] = []
    with captured_warnings() as warnings_:
        if mu is not None:
            matches = materials_for_permeability(mu, spread)
            result = {"mu_measured": mu, "spread": spread,
                      "materials": [_match_result(match) for match in matches]}
            notes.append(_OVERLAP_NOTE)
            cautions.append(salvaged_mains_caution())
        elif name is not None:
            core = material(name, option="MATERIAL")
            result = {"materials": [_material_result(core)]}
            if core.name in MAINS_EQUIPMENT_CLASSES:
                cautions.append(salvaged_mains_caution())
        else:
            result = {"materials": [_material_result(core) for core in all_materials()]}

    def render(_: dict) -> list[str]:
        if mu is not None:
            title = (f"Classes consistent with a relative permeability of {mu:g} "
                     f"(each range widened by {spread * 100:g} %), best fit first:")
            if not matches:
                lines = [title, "  none: check the measurement (turns, core size, meter frequency)"]
            else:
                fits = [f"{'inside' if match.inside else 'near'}, {match.ratio_to_typical:.3g} × typical"
                        for match in matches]
                lines = [title, *_table_lines([match.material for match in matches], fits)]
        elif name is not None:
            lines = _one_material_lines(core)
        else:
            lines = ["Generic core material classes (typical values):",
                     *_table_lines(all_materials())]
        return [*lines, *bullet_lines("notes", notes)]

    emit(command="materials", as_json=as_json, inputs=inputs, result=result, warnings_=warnings_,
         cautions=cautions, render=render)
