"""``coilplan tank``: L, C and f of a tuned circuit; band coverage; L and C0 of a coil from resonances."""

from __future__ import annotations

import math
import re

import click

from coilplan.cli._common import captured_warnings, emit, json_option
from coilplan.cli._types import PercentType, QuantityType
from coilplan.errors import InfeasibleError, InvalidInputError
from coilplan.report.tank_text import tank_lines
from coilplan.tank import solve_tank
from coilplan.tank_band import DEFAULT_STRAY_F, plan_band
from coilplan.tank_drive import MAX_TANK_Q, TANK_POWER_RANGE, drive_fields, tank_cautions
from coilplan.tank_fit import DEFAULT_FREQUENCY_TOLERANCE, fit_resonances
from coilplan.tank_values import parse_range, parse_resonance

__all__ = ["PowerType", "tank"]

_POWER = re.compile(r"^([+-]?(?:\d+(?:\.\d*)?|\.\d+)(?:[eE][+-]?\d+)?)\s*([mkK]?)\s*(?:W|w|watts?)$")
_POWER_SCALE = {"": 1.0, "m": 1e-3, "k": 1e3, "K": 1e3}


class PowerType(click.ParamType):
    """A power with its unit: ``5W``, ``500mW``, ``0.1 kW``; returns watts."""

    name = "power"

    def convert(self, value, param, ctx):
        if isinstance(value, float):
            return value
        match = _POWER.match(str(value).strip())
        watts = float(match.group(1)) * _POWER_SCALE[match.group(2)] if match else math.nan
        low, high = TANK_POWER_RANGE
        if not (math.isfinite(watts) and watts > 0):
            self.fail(f"expected a power above zero such as 5W or 500mW; got {value!r}", param, ctx)
        if not low <= watts <= high:
            self.fail(f"expected a power such as 5W or 500mW (from 1 µW to 100 kW); got {value!r}", param, ctx)
        return watts


_NEEDS_TEXT = ("nothing to do: give two of --inductance, --capacitance, --frequency (the third is computed); "
               "or --band LOW:HIGH with --capacitor MIN:MAX (band coverage); or --inductance with --capacitor "
               "(the band covered); or two or more --resonance C@f (L and C0 of a coil)")


def _first_given(options: dict[str, object]) -> str | None:
    return next((name for name, value in options.items() if value is not None), None)


def _check_modes(*, resonances, band_text, capacitor_text, tolerance, others: dict[str, object]) -> str:
    """Which job the options ask for: ``"fit"``, ``"band"`` or ``"lc"``; a one-line error for a mix."""
    if resonances:
        clash = _first_given({**others, "--band": band_text, "--capacitor": capacitor_text})
        if clash is not None:
            raise InvalidInputError(clash, "no other tank options with --resonance (the readings alone give L and C0)")
        return "fit"
    if tolerance is not None:
        raise InvalidInputError("--tolerance", "--resonance readings with it (it is their accuracy)")
    if band_text is not None or capacitor_text is not None:
        if capacitor_text is None:
            raise InvalidInputError("--band", "--capacitor MIN:MAX with it (the variable capacitor's travel)")
        clash = _first_given({"--capacitance": others["--capacitance"], "--frequency": others["--frequency"]})
        if clash is not None:
            raise InvalidInputError(clash, "not with --capacitor (the capacitor's travel sets the capacitance)")
        return "band"
    clash = _first_given({"--stray": others["--stray"], "--padder": others["--padder"]})
    if clash is not None:
        raise InvalidInputError(clash, "--capacitor MIN:MAX with it (it belongs to a variable capacitor)")
    if all(others[name] is None for name in ("--inductance", "--capacitance", "--frequency")):
        raise click.UsageError(_NEEDS_TEXT)
    return "lc"


@click.command()
@click.option("--inductance", type=QuantityType("H"), help="Inductance of the coil, e.g. 100uH.")
@click.option("--capacitance", type=QuantityType("F"), help="Capacitance across it, e.g. 100pF.")
@click.option("--frequency", type=QuantityType("Hz"), help="Resonant frequency, e.g. 1.6MHz.")
@click.option("--band", "band_text", metavar="LOW:HIGH", help="Band to tune, e.g. 530kHz:1700kHz.")
@click.option("--capacitor", "capacitor_text", metavar="MIN:MAX",
              help="Travel of the variable capacitor, e.g. 10pF:365pF.")
@click.option("--stray", type=QuantityType("F", allow_zero=True),
              help=f"Stray across the coil: wiring, device input, the coil's self-capacitance (assumed "
                   f"{DEFAULT_STRAY_F * 1e12:g} pF if not given).")
@click.option("--padder", type=QuantityType("F"), help="Fixed capacitor in series with the variable capacitor.")
@click.option("--resonance", "resonance_texts", multiple=True, metavar="C@F",
              help="A known capacitor and the frequency the coil resonated at with it, e.g. 100pF@1.2MHz; "
                   "two or more.")
@click.option("--tolerance", type=PercentType(),
              help=f"Accuracy of each resonance reading (assumed {DEFAULT_FREQUENCY_TOLERANCE:.1%} "
                   "if not given).")
@click.option("--power", type=PowerType(), help="Power the tank is driven at, e.g. 5W (a transmitter's tank).")
@click.option("--q", "q", type=click.FloatRange(min=0, min_open=True, max=MAX_TANK_Q),
              help="Q of the loaded tank, e.g. 100.")
@json_option
def tank(inductance, capacitance, frequency, band_text, capacitor_text, stray, padder, resonance_texts, tolerance,
         power, q, as_json):
    """Tuned circuits: L, C and f; band coverage with a variable capacitor; L and C0 from resonances.

    \b
    Three jobs:
      any two of --inductance, --capacitance, --frequency give the third
      --band LOW:HIGH --capacitor MIN:MAX: the ratio the band needs, the largest stray, the coil,
        the band covered (--inductance instead of --band: the band a coil covers)
      --resonance C@f, two or more: the coil's L and the stray plus self-capacitance C0

    With --power (and --q) the voltage across the tank is estimated, V = √(P·Q·X).
    Exit status 1 when the capacitor cannot cover the band; the report still shows what it covers.
    """
    others = {"--inductance": inductance, "--capacitance": capacitance, "--frequency": frequency, "--stray": stray,
              "--padder": padder, "--power": power, "--q": q}
    mode = _check_modes(resonances=resonance_texts, band_text=band_text, capacitor_text=capacitor_text,
                        tolerance=tolerance, others=others)
    inputs: dict = {"inductance_H": inductance, "capacitance_F": capacitance, "frequency_Hz": frequency,
                    "stray_F": stray, "padder_F": padder, "power_W": power, "q": q}
    shortfall = None
    library_warnings: tuple[str, ...] = ()
    with captured_warnings() as range_warnings:
        if mode == "fit":
            points = [parse_resonance(text, "--resonance") for text in resonance_texts]
            inputs["resonances"] = [{"capacitance_F": c, "frequency_Hz": f} for c, f in points]
            inputs["tolerance"] = tolerance
            fit = fit_resonances(points, tolerance=tolerance)
            result, library_warnings = fit.as_dict(), fit.warnings
        elif mode == "band":
            capacitor = parse_range(capacitor_text, "F", "--capacitor")
            band = parse_range(band_text, "Hz", "--band") if band_text is not None else None
            inputs["capacitor"] = {"min_F": capacitor[0], "max_F": capacitor[1]}
            if band is not None:
                inputs["band"] = {"low_Hz": band[0], "high_Hz": band[1]}
            plan = plan_band(capacitor=capacitor, band=band, inductance=inductance, stray=stray, padder=padder)
            result, shortfall = plan.as_dict(), plan.shortfall()
            # the reactance is largest at the top of the band covered: the highest voltage for a given P and Q
            top_reactance = 2.0 * math.pi * plan.covered[1] * plan.inductance
            result.update(drive_fields(reactance=top_reactance, power=power, q=q))
        else:
            solution = solve_tank(inductance=inductance, capacitance=capacitance, frequency=frequency)
            result = solution.as_dict()
            result.update(drive_fields(reactance=solution.reactance, power=power, q=q))
    cautions = tank_cautions(power=power, voltage_rms=result.get("tank_voltage_rms_V"))
    emit(command="tank", as_json=as_json, inputs={key: value for key, value in inputs.items() if value is not None},
         result=result, warnings_=[*library_warnings, *range_warnings], cautions=cautions, render=tank_lines)
    if shortfall is not None:
        raise InfeasibleError(shortfall, option="--band")
