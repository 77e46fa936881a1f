r"""The trim plot: inductance against turns, with the calibrated model's curve and the target band.

Drawn with matplotlib's object API (a :class:`matplotlib.figure.Figure` on the Agg
canvas, no pyplot), imported only inside :func:`trim_plot`, so that commands which do
not plot never pay for the import. The file's bytes do not depend on the day: the SVG
hash salt is fixed and the date metadata left out.
"""

from __future__ import annotations

import io
import math
from collections.abc import Sequence
from pathlib import Path

import numpy as np

from coilplan.errors import InvalidInputError
from coilplan.report.text import turns_word

__all__ = ["PLOT_FORMATS", "impedance_plot", "plot_format", "trim_plot"]

#: File name endings the plot can be written as, and the matplotlib format for each.
PLOT_FORMATS = {".png": "png", ".svg": "svg", ".pdf": "pdf"}
#: Date-like metadata each format would otherwise stamp into the file.
_NO_DATES = {"png": {"Software": None}, "svg": {"Date": None}, "pdf": {"CreationDate": None, "ModDate": None}}
_SALT = "coilplan-plot"


def plot_format(path, option: str = "plot") -> str:
    """The format for a plot file from its name's ending (``.png``, ``.svg`` or ``.pdf``).

    Examples
    --------
    >>> plot_format("coil.SVG")
    'svg'
    """
    ending = Path(path).suffix.lower()
    if ending not in PLOT_FORMATS:
        raise InvalidInputError(option, "a file name ending in .png, .svg or .pdf", str(path))
    return PLOT_FORMATS[ending]


def _finite(values) -> np.ndarray:
    """The values with anything not finite (the peak at resonance) as NaN, which matplotlib leaves out."""
    values = np.asarray(values, dtype=float)
    return np.where(np.isfinite(values), values, np.nan)


def _matplotlib():
    try:
        from matplotlib import rc_context
        from matplotlib.backends.backend_agg import FigureCanvasAgg
        from matplotlib.figure import Figure
    except ImportError:
        raise InvalidInputError("plot", 'matplotlib, which is not installed: pip install "coilplan[plot]"',
                                None) from None
    return rc_context, FigureCanvasAgg, Figure


def _picture(figure, fmt: str, rc_context) -> bytes:
    """The figure as the bytes of a reproducible file: fixed SVG hash salt, no dates in the metadata."""
    buffer = io.BytesIO()
    with rc_context({"svg.hashsalt": _SALT, "svg.fonttype": "path"}):
        figure.savefig(buffer, format=fmt, metadata=_NO_DATES[fmt])
    return buffer.getvalue()


def impedance_plot(*, sweep: dict, operating_frequency: float | None, fmt: str, title: str | None = None) -> bytes:
    """Draw |Z| and Q against frequency (log axes), marking the SRF and the operating point; the file's bytes.

    Parameters
    ----------
    sweep : dict
        From :func:`coilplan.apparent.impedance_sweep`.
    operating_frequency : float, optional
        Hz; marked when given.
    fmt : {"png", "svg", "pdf"}

    Raises
    ------
    InvalidInputError
        The sweep has no finite self-resonance to draw around (a winding with no
        self-capacitance estimate), or matplotlib is not installed.
    """
    srf = float(sweep["srf_Hz"]) if sweep.get("srf_Hz") is not None else math.nan
    frequency = np.asarray(sweep["frequency_Hz"], dtype=float) / 1e6
    if not (math.isfinite(srf) and srf > 0 and frequency.size and np.all(np.isfinite(frequency))):
        raise InvalidInputError("plot", "a coil whose self-resonance is known, to draw |Z| and Q around it "
                                "(no self-capacitance is estimated for this winding: give the coil's "
                                "self-capacitance)", None)
    rc_context, FigureCanvasAgg, Figure = _matplotlib()
    if fmt not in _NO_DATES:
        raise InvalidInputError("plot", "a format png, svg or pdf", fmt)
    figure = Figure(figsize=(6.4, 5.6), layout="constrained")
    FigureCanvasAgg(figure)
    top, bottom = figure.subplots(2, 1, sharex=True)
    top.loglog(frequency, _finite(sweep["impedance_ohm"]), color="tab:blue")
    top.set_ylabel("|Z| (Ω)")
    quality = _finite(np.where(np.asarray(sweep["q"], dtype=float) > 0, sweep["q"], np.nan))
    bottom.semilogx(frequency, quality, color="tab:purple")
    bottom.set_ylabel("Q (|X|/R at the terminals)")
    bottom.set_xlabel("frequency (MHz)")
    for axes in (top, bottom):
        axes.axvline(srf / 1e6, color="tab:red", linestyle="--", linewidth=1,
                     label=f"self-resonance {srf / 1e6:.4g} MHz")
        if operating_frequency is not None and math.isfinite(operating_frequency) and operating_frequency > 0:
            axes.axvline(operating_frequency / 1e6, color="tab:green", linewidth=1.2,
                         label=f"operating {operating_frequency / 1e6:.4g} MHz")
        axes.grid(True, which="both", alpha=0.3)
    top.legend(loc="upper left", fontsize="small")
    if title:
        top.set_title(title)
    return _picture(figure, fmt, rc_context)


def trim_plot(*, readings: Sequence[tuple[float, int]], curve, curve_label: str, target: float, tolerance: float,
              turns: int, inductance: float, fmt: str, title: str | None = None, low_frequency: bool = False,
              lowest: float = 0.0) -> bytes:
    r"""Draw L against N for a coil being trimmed, and return the file's bytes.

    The calibrated model (for a closed core :math:`L = A_L N^2 + L_0`) spans the readings
    and the answer; each reading carries an error bar of ± ``tolerance``; the band is
    ``target`` ± ``tolerance``; a marker shows the recommended stop.

    Parameters
    ----------
    readings : sequence of (float, int)
        (H, turns), on the same footing as the curve (low-frequency when corrected).
    curve : callable
        The calibrated model's inductance, H, at an array of (float) turns.
    curve_label : str
        The curve's legend, e.g. ``"fitted: L = AL·N²"``.
    target : float
        The inductance wanted, H (on the curve's footing).
    tolerance : float
        Meter accuracy, relative.
    turns : int
        The recommended number of turns; ``inductance`` is the curve's value there, H.
    fmt : {"png", "svg", "pdf"}
    title : str, optional
    low_frequency : bool
        True when the readings and target were corrected for self-capacitance: the axis says so.
    lowest : float
        The fewest turns the curve is drawn from (the model's own lower end).

    Raises
    ------
    InvalidInputError
        matplotlib is not installed (the hint names the ``plot`` extra).
    """
    rc_context, FigureCanvasAgg, Figure = _matplotlib()
    if fmt not in _NO_DATES:
        raise InvalidInputError("plot", "a format png, svg or pdf", fmt)
    counts = [count for _, count in readings] + [turns]
    low, high = min(counts), max(counts)
    margin = max(1.0, 0.08 * (high - low))
    curve_turns = np.linspace(max(lowest, low - margin), high + margin, 200)
    micro = 1e6

    figure = Figure(figsize=(6.4, 4.2), layout="constrained")
    FigureCanvasAgg(figure)
    axes = figure.add_subplot()
    axes.axhspan((target * (1 - tolerance)) * micro, (target * (1 + tolerance)) * micro, color="tab:green",
                 alpha=0.18, label=f"target ± {tolerance:.1%}")
    axes.axhline(target * micro, color="tab:green", linewidth=0.8)
    axes.plot(curve_turns, np.asarray(curve(curve_turns), dtype=float) * micro, color="tab:blue", label=curve_label)
    values = np.array([value for value, _ in readings], dtype=float)
    axes.errorbar([count for _, count in readings], values * micro, yerr=values * tolerance * micro, fmt="o",
                  color="black", capsize=3, label="readings ± meter tolerance")
    axes.plot([turns], [inductance * micro], marker="*", markersize=14, linestyle="none", color="tab:red",
              label=f"stop at {turns_word(turns)}")
    axes.set_xlabel("turns")
    axes.set_ylabel("inductance at low frequency (µH)" if low_frequency else "inductance (µH)")
    axes.grid(True, alpha=0.3)
    axes.legend(loc="upper left", fontsize="small")
    if title:
        axes.set_title(title)
    return _picture(figure, fmt, rc_context)
