"""Text report of ``coilplan tank`` (from the ``as_dict()`` of the results in ``coilplan.tank*``)."""

from __future__ import annotations

import math

from coilplan.quantities import format_quantity
from coilplan.report.text import aligned_rows

__all__ = ["tank_lines"]

_SOLVED_BY = {
    "frequency": "f = 1/(2π√(LC))",
    "capacitance": "C = 1/((2πf)²L)",
    "inductance": "L = 1/((2πf)²C)",
}


def _q(value, unit: str, digits: int = 4) -> str:
    return "n/a" if value is None else format_quantity(float(value), unit, digits)


def _drive_rows(result: dict) -> list[tuple[str, ...]]:
    where = " (top of the band)" if result["mode"] == "band" else ""
    rows: list[tuple[str, ...]] = []
    if "parallel_resistance_ohm" in result:
        rows.append((f"parallel resistance{where}", _q(result["parallel_resistance_ohm"], "ohm"),
                     f"(R = Q·X, Q = {result['q']:g})"))
    if "tank_voltage_rms_V" in result:
        rows.append((f"voltage across the tank{where}",
                     f"{_q(result['tank_voltage_rms_V'], 'V')} RMS, {_q(result['tank_voltage_peak_V'], 'V')} peak",
                     f"(V = √(P·Q·X), from P = V²/R, P = {result['power_W']:g} W)"))
    return rows


def _notes(title: str, items) -> list[str]:
    return ["", f"{title}:", *[f"  - {item}" for item in items]] if items else []


def _lc_lines(result: dict) -> list[str]:
    solved = result["solved_for"]
    lines = [f"tank: {_q(result['inductance_H'], 'H')} with {_q(result['capacitance_F'], 'F')} resonates at "
             f"{_q(result['frequency_Hz'], 'Hz')}"]
    rows = [
        ("inductance", _q(result["inductance_H"], "H")),
        ("capacitance", _q(result["capacitance_F"], "F")),
        ("frequency", _q(result["frequency_Hz"], "Hz")),
        ("reactance at f", _q(result["reactance_ohm"], "ohm"), "(X_L = ωL = X_C = 1/(ωC))"),
        ("characteristic impedance", _q(result["characteristic_impedance_ohm"], "ohm"), "(√(L/C))"),
    ]
    index = {"inductance": 0, "capacitance": 1, "frequency": 2}[solved]
    rows[index] = (*rows[index], f"(computed: {_SOLVED_BY[solved]})")
    rows += _drive_rows(result)
    return lines + aligned_rows(rows)


def _band_lines(result: dict) -> list[str]:
    capacitor = f"{_q(result['capacitor_min_F'], 'F')} to {_q(result['capacitor_max_F'], 'F')}"
    covered = f"{_q(result['covered_low_Hz'], 'Hz')} to {_q(result['covered_high_Hz'], 'Hz')}"
    padder = f" and a {_q(result['padder_F'], 'F')} padder" if result["padder_F"] is not None else ""
    stray = f"stray {_q(result['stray_F'], 'F')}" + (" (assumed)" if result["stray_assumed"] else "")
    if result["band_low_Hz"] is None:
        lines = [f"band covered by {_q(result['inductance_H'], 'H')} with a {capacitor} capacitor{padder}: {covered}"]
    else:
        band = f"{_q(result['band_low_Hz'], 'Hz')} to {_q(result['band_high_Hz'], 'Hz')}"
        verdict = "covered" if result["covers_band"] else "NOT covered"
        lines = [f"band {band} with a {capacitor} capacitor{padder}: {verdict}"]
    rows: list[tuple[str, ...]] = []
    if result["required_ratio"] is not None:
        rows.append(("ratio needed", f"{result['required_ratio']:#.4g} : 1", "((f_max/f_min)²)"))
    formula = "(C'max + Cs)/(C'min + Cs), C' with the padder in series" if result["padder_F"] is not None \
        else "(Cmax + Cs)/(Cmin + Cs)"
    rows.append(("ratio available", f"{result['available_ratio']:#.4g} : 1", f"({formula}, {stray})"))
    if result["max_stray_F"] is not None:
        limit = result["max_stray_F"]
        shown = _q(limit, "F") if limit >= 0 else f"none ({_q(limit, 'F')})"
        primed = "'" if result["padder_F"] is not None else ""
        rows.append(("largest stray", shown, f"((C{primed}max − R·C{primed}min)/(R − 1))"))
    if result["inductance_given"]:
        rows.append(("inductance", _q(result["inductance_H"], "H"), "(given)"))
        if result["inductance_for_band_H"] is not None:
            rows.append(("inductance for the band", _q(result["inductance_for_band_H"], "H"),
                         "(puts the low edge at the bottom of the travel)"))
    else:
        rows.append(("inductance", _q(result["inductance_H"], "H"),
                     f"(puts {_q(result['band_low_Hz'], 'Hz')} at the bottom of the travel)"))
    rows.append(("band covered", covered))
    rows.append(("total capacitance", f"{_q(result['total_min_F'], 'F')} to {_q(result['total_max_F'], 'F')}",
                 "(across the coil)"))
    rows += _drive_rows(result)
    return lines + aligned_rows(rows) + _notes("trade-off", result["advice"]) + _notes("assumed",
                                                                                         result["assumptions"])


def _signed(value, unit: str) -> str:
    if value is None or not math.isfinite(value):
        return "n/a"
    return ("+" if value >= 0 else "") + format_quantity(value, unit, 3)


def _fit_lines(result: dict) -> list[str]:
    count = len(result["points"])
    lines = [f"from {count} resonances: L = {_q(result['inductance_H'], 'H')} ± "
             f"{_q(result['inductance_uncertainty_H'], 'H', 2)}, C0 = {_q(result['stray_capacitance_F'], 'F')} ± "
             f"{_q(result['stray_capacitance_uncertainty_F'], 'F', 2)} (stray plus self-capacitance)"]
    rows = [("capacitor", "resonance", "on the line", "residual")]
    for point in result["points"]:
        relative = point["residual_relative"]
        shown = "n/a" if relative is None else f"{relative * 100:+.3f} %"
        rows.append((_q(point["capacitance_F"], "F"), _q(point["frequency_Hz"], "Hz", 6),
                     _q(point["fitted_frequency_Hz"], "Hz", 6), f"{_signed(point['residual_Hz'], 'Hz')} ({shown})"))
    lines += aligned_rows(rows)
    lines += ["", "fit: 1/ω² = L·C + L·C0, a straight line in C, weighted least squares"]
    return lines + _notes("assumed", result["assumptions"])


def tank_lines(result: dict) -> list[str]:
    """The answer of ``coilplan tank`` as aligned text lines, for any of its three jobs.

    Examples
    --------
    >>> from coilplan.tank import solve_tank
    >>> print(tank_lines(solve_tank(inductance=100e-6, capacitance=100e-12).as_dict())[0])
    tank: 100.0 μH with 100.0 pF resonates at 1.592 MHz
    """
    mode = result["mode"]
    if mode == "lc":
        return _lc_lines(result)
    if mode == "band":
        return _band_lines(result)
    return _fit_lines(result)
