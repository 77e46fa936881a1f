"""``coilplan gapped``: a gapped core (E, pot, drum and bobbin): turns, gap, or both for a choke."""

from __future__ import annotations

import click

from coilplan.apparent import GivenCapacitance
from coilplan.choke import design_choke
from coilplan.cli._common import captured_warnings, json_option, plot_option
from coilplan.cli._cored import LENGTH, core_at_frequency, core_options, drive_arguments, finish_cored, resolve_core
from coilplan.cli._measured import (
    calibrate_form,
    conditions_from,
    measurement_options,
    resolve_target,
    tuning_options,
)
from coilplan.cli._types import QuantityType
from coilplan.errors import InvalidInputError
from coilplan.forms import GappedCore
from coilplan.report.cored_text import gapped_lines
from coilplan.results.cored import gapped_result
from coilplan.saturation import NEAR_SATURATION
from coilplan.wire import parse_wire

__all__ = ["gapped"]


@click.command()
@click.option("--ae", type=QuantityType("m2"), required=True, help="Effective area of the core, e.g. 50mm2.")
@click.option("--le", type=LENGTH, required=True, help="Effective magnetic path length, e.g. 45mm.")
@click.option("--gap", type=QuantityType("m", allow_zero=True),
              help="Total air gap in the path; leave out to have it computed.")
@click.option("--window-width", type=LENGTH, help="Winding width along the leg (bobbin length).")
@click.option("--window-depth", type=LENGTH, help="Radial depth of the winding space.")
@click.option("--no-fringing", is_flag=True, help="Leave out McLyman's fringing correction.")
@click.option("--max-flux", type=QuantityType("T"),
              help=f"Design limit for the peak flux density; default {NEAR_SATURATION:.0%} of B_sat.")
@core_options
@measurement_options
@tuning_options
@plot_option
@json_option
def gapped(ae, le, gap, window_width, window_depth, no_fringing, max_flux, turns, target, wire_text, grade,
           overall, mu, material, al, measured, loss_factor, measured_q, bsat, current, ac_current, ac_voltage,
           frequency,
           temperature, lead, meter_freq, tolerance, self_capacitance, turns_uncertainty,
           target_frequency, tuning_capacitance,
           plot_path,
           as_json):
    """Gapped core: AL = µ0·Ae/(gap + le/µr), with the fringing correction shown apart.

    With --gap: --turns gives L, --target gives the turns. Without --gap: --turns and
    --target give the gap; --target and --current give the turns and the gap of a choke
    that carries the current without saturating (and fits the window if given).
    """
    target, frequency = resolve_target(target, target_frequency, tuning_capacitance, frequency)
    core = resolve_core(mu=mu, material=material, al=al, measured=measured, bsat=bsat, temperature=temperature,
                        allow_gap=True)
    wire = parse_wire(wire_text, grade=grade, overall=overall, option="--wire")
    drive = drive_arguments(current, ac_current, ac_voltage, frequency)
    conditions = conditions_from(tolerance=tolerance, meter_freq=meter_freq, at=frequency,
                                 self_capacitance=self_capacitance, turns_uncertainty=turns_uncertainty)
    known_al = core.al_given if core.al_given is not None else (1.0 if measured else None)  # set by the fit
    if known_al is not None and gap is not None:
        raise InvalidInputError("--gap", "either --gap (with --mu or --material) or a known AL, not both", None)
    if known_al is None and core.mu_r is None:
        raise InvalidInputError("--mu", "the core's permeability (--mu or --material), or --al / --measured", None)
    mode = "given"

    def at_operating_frequency(form):
        if self_capacitance is not None and not getattr(form, "capacitance_given", False):
            form = GivenCapacitance(form, self_capacitance)
        return core_at_frequency(form, core, mu=core.mu_r, loss_factor=loss_factor, frequency=frequency,
                                 reference_frequency=meter_freq if measured else None,
                                 measured_q=measured_q, readings=measured, temperature_C=temperature)

    with captured_warnings() as warnings_:
        template = GappedCore(ae=ae, le=le, wire=wire, gap=0.0 if known_al is None else None, mu_r=core.mu_r,
                              al=known_al, window_width=window_width, window_depth=window_depth,
                              fringing=not no_fringing, saturation_flux_density=core.saturation_flux_density,
                              lead=lead)
        if gap is not None or known_al is not None:
            if turns is None and target is None:
                raise InvalidInputError("--turns", "--turns or --target", None)
            if turns is not None and target is not None:
                raise InvalidInputError("--turns", "either --turns or --target with a known gap, not both", None)
            base = template if gap is None else GappedCore(**{**template.__dict__, "gap": gap})

            def build(fitted_al):
                return base if fitted_al is None else GappedCore(**{**base.__dict__, "al": fitted_al})

            form, readings = calibrate_form(build, measured, conditions, "al")
            form = at_operating_frequency(form)
            result = gapped_result(form, turns=turns, target=target, temperature_C=temperature,
                                   measured=readings, **drive)
        elif turns is not None and target is not None:
            mode = "gap for turns"
            form = GappedCore(**{**template.__dict__, "gap": template.gap_for_al(target / turns**2)})
            form = at_operating_frequency(form)
            result = gapped_result(form, turns=turns, temperature_C=temperature, **drive)
            result["asked_H"] = target
        elif target is not None and (current or ac_current):
            mode = "choke design"
            if core.saturation_flux_density is None and max_flux is None:
                raise InvalidInputError("--max-flux", "a flux-density limit: --max-flux, --bsat or --material", None)
            limit = max_flux if max_flux is not None else NEAR_SATURATION * core.saturation_flux_density
            form, chosen = design_choke(template, target, current + ac_current, limit)
            form = at_operating_frequency(form)
            result = gapped_result(form, turns=chosen, temperature_C=temperature, **drive)
            result["asked_H"] = target
            result["max_flux_density_T"] = limit
        else:
            raise InvalidInputError("--gap", "a gap, or --turns with --target (gives the gap), or --target with "
                                    "--current (gives turns and gap)", None)
    result["mode"] = mode
    finish_cored("gapped", form=form, result=result, core=core, plot_path=plot_path, frequency=frequency,
                 temperature=temperature, title="gapped core",
                 unknown_core=core.material_name is None and bool(measured), tuned=target_frequency is not None,
                 warnings_=warnings_, as_json=as_json, render=gapped_lines)
