"""Generic core material classes: typical permeability, saturation, resistivity and frequency range.

The classes come from ``core_data/materials.csv``: MnZn ferrites (high
permeability and power), NiZn ferrites of initial permeability about 800, 250,
125 and 40, carbonyl-type and reduced-iron powder cores, an Fe-Si-Al alloy
powder, and air. Each is described by its physics, never by a maker's grade.
The values are *typical of the class*, with their spread: a real core may lie
anywhere in the spread, so a model built on one is rough until a measurement
calibrates it.

=====================  ================================  =====================================
symbol                 attribute                         meaning
=====================  ================================  =====================================
:math:`\\mu_i`          ``mu_initial``                    typical initial relative permeability
:math:`B_s(T)`         ``saturation_flux_density(T)``    saturation flux density at T °C, T
:math:`T_c`            ``curie_temperature``             Curie temperature, °C
:math:`\\rho`           ``resistivity``                   bulk resistivity (order of magnitude), Ω·m
=====================  ================================  =====================================

Look a class up with :func:`material`, search with :func:`find_materials`, list
them with :func:`all_materials`, and ask which classes a measured permeability
fits with :func:`materials_for_permeability` (sorting a bin of unmarked cores).
A class's frequency dispersion (``core_data/dispersion.csv``: relaxation
frequency and relative loss factor) comes from :func:`material_dispersion`.
"""

from __future__ import annotations

import dataclasses
import difflib
import functools
import math
import warnings
from typing import Literal, NamedTuple

import numpy as np
from pydantic import BaseModel, ConfigDict, Field, ValidationInfo, field_validator

from coilplan._data import load_table, rule
from coilplan.errors import DataFileError, InvalidInputError, OutsideValidityWarning

__all__ = [
    "Dispersion",
    "Material",
    "PermeabilityMatch",
    "all_materials",
    "find_materials",
    "material",
    "material_dispersion",
    "materials_for_permeability",
]

_FILE = "materials.csv"
_DISPERSION_FILE = "dispersion.csv"
# The temperatures between which the two tabulated saturation values are trusted, with a
# margin: coilplan's own choice (no source), as the table gives values at 25 °C and 100 °C only.
_VALID_TEMPERATURE_C = (0.0, 120.0)
_LOW_RESISTIVITY_LIMIT = 1e2  # Ω·m: "low" (MnZn) lies below, "high" (NiZn) at or above

Family = Literal["MnZn ferrite", "NiZn ferrite", "powdered iron", "alloy powder", "air"]
ResistivityClass = Literal["low", "high", "insulated-particles", "insulator"]


class _MaterialRow(BaseModel):
    """One row of core_data/materials.csv, in the file's units (mT, °C, Ω·m, Hz)."""

    model_config = ConfigDict(extra="forbid", frozen=True)

    # Column names keep the case of their unit symbols (mT, °C, Hz), as style.md asks for
    # units in column names; hence the N815 (mixedCase) exemptions below.
    name: str = Field(pattern=r"^[a-z][a-z0-9]*(?:-[a-z0-9]+)*$")
    family: Family
    description: str = Field(min_length=1)
    mu_initial_typical: float = Field(ge=1, allow_inf_nan=False)
    mu_initial_low: float = Field(ge=1, allow_inf_nan=False)
    mu_initial_high: float = Field(ge=1, allow_inf_nan=False)
    bsat_25C_mT: float | None = Field(default=None, gt=0, lt=3000, allow_inf_nan=False)  # noqa: N815
    bsat_100C_mT: float | None = Field(default=None, gt=0, lt=3000, allow_inf_nan=False)  # noqa: N815
    curie_C: float | None = Field(default=None, gt=0, lt=1200, allow_inf_nan=False)  # noqa: N815
    resistivity_ohm_m_typical: float | None = Field(default=None, gt=0, allow_inf_nan=False)
    resistivity_class: ResistivityClass
    frequency_low_Hz: float | None = Field(default=None, gt=0, allow_inf_nan=False)  # noqa: N815
    frequency_high_Hz: float | None = Field(default=None, gt=0, allow_inf_nan=False)  # noqa: N815
    loss_note: str = Field(min_length=1)
    source: str = Field(min_length=1)

    # Each check sits on the later column so that a bad row names the column to fix.
    @field_validator("mu_initial_high")
    @classmethod
    def _mu_in_order(cls, high: float, info: ValidationInfo) -> float:
        low, typical = info.data.get("mu_initial_low"), info.data.get("mu_initial_typical")
        if low is not None and typical is not None and not low <= typical <= high:
            raise ValueError(f"need mu_initial_low <= mu_initial_typical <= mu_initial_high, "
                             f"got {low:g}, {typical:g}, {high:g}")
        return high

    @field_validator("bsat_100C_mT")
    @classmethod
    def _bsat_falls_with_temperature(cls, hot: float | None, info: ValidationInfo) -> float | None:
        cold = info.data.get("bsat_25C_mT")
        if (hot is None) != (cold is None):
            raise ValueError("give both bsat_25C_mT and bsat_100C_mT, or neither")
        if hot is not None and cold is not None and hot > cold:
            raise ValueError(f"saturation at 100 °C ({hot:g} mT) above that at 25 °C ({cold:g} mT)")
        return hot

    @field_validator("curie_C")
    @classmethod
    def _curie_above_100C(cls, curie: float | None, info: ValidationInfo) -> float | None:
        if info.data.get("bsat_100C_mT") is not None:
            if curie is None:
                raise ValueError("a material that saturates needs its Curie temperature")
            if curie <= 100:
                raise ValueError(f"a saturation value at 100 °C needs a Curie point above 100 °C, "
                                 f"got {curie:g} °C")
        return curie

    @field_validator("resistivity_class")
    @classmethod
    def _class_matches_value(cls, word: str, info: ValidationInfo) -> str:
        value = info.data.get("resistivity_ohm_m_typical")
        if word in ("low", "high") and value is None:
            raise ValueError(f"resistivity class '{word}' needs resistivity_ohm_m_typical")
        if word == "low" and value is not None and value >= _LOW_RESISTIVITY_LIMIT:
            raise ValueError(f"'low' means below {_LOW_RESISTIVITY_LIMIT:g} ohm*m, got {value:g}")
        if word == "high" and value is not None and value < _LOW_RESISTIVITY_LIMIT:
            raise ValueError(f"'high' means {_LOW_RESISTIVITY_LIMIT:g} ohm*m or more, got {value:g}")
        return word

    @field_validator("frequency_high_Hz")
    @classmethod
    def _frequencies_in_order(cls, high: float | None, info: ValidationInfo) -> float | None:
        low = info.data.get("frequency_low_Hz")
        if (high is None) != (low is None):
            raise ValueError("give both frequency_low_Hz and frequency_high_Hz, or neither")
        if high is not None and low is not None and not low < high:
            raise ValueError(f"frequency_low_Hz ({low:g}) must be below frequency_high_Hz ({high:g})")
        return high


class Material(BaseModel):
    """One generic core material class, in SI units (T, Ω·m, Hz; temperatures in °C).

    Get one with :func:`material`; do not build one by hand unless for a test.

    Attributes
    ----------
    name : str
        coilplan's short identifier, e.g. ``"nizn-125"``.
    family : str
        ``"MnZn ferrite"``, ``"NiZn ferrite"``, ``"powdered iron"``, ``"alloy powder"`` or ``"air"``.
    description : str
        The class in words, by its physics.
    mu_initial : float
        Typical initial relative permeability of the class.
    mu_range : tuple of float
        (low, high): the spread of initial permeability within the class.
    saturation_flux_density_25C, saturation_flux_density_100C : float or None
        Typical saturation flux density at 25 °C and 100 °C, T; None for air.
    curie_temperature : float or None
        Curie temperature, °C; None for air.
    resistivity : float or None
        Bulk resistivity, order of magnitude only, Ω·m; None where the table gives no number.
    resistivity_class : str
        ``"low"`` (MnZn: a meter on the bare core reads a resistance), ``"high"`` (NiZn: it
        reads open), ``"insulated-particles"`` (powder cores: reads open), ``"insulator"``.
    frequency_range : tuple of float or None
        (low, high), Hz: where the class is commonly used as an inductor core; None for air
        (the material sets no limit).
    loss_note : str
        Loss and temperature behaviour in words.
    source : str
        Where the row's values come from (addresses read, or "from memory").
    """

    model_config = ConfigDict(extra="forbid", frozen=True)

    name: str = Field(min_length=1)
    family: str = Field(min_length=1)
    description: str
    mu_initial: float = Field(ge=1, allow_inf_nan=False)
    mu_range: tuple[float, float]
    # the temperature suffix keeps the case of °C (N815 exemption, as for the CSV columns)
    saturation_flux_density_25C: float | None = Field(default=None, gt=0)  # noqa: N815
    saturation_flux_density_100C: float | None = Field(default=None, gt=0)  # noqa: N815
    curie_temperature: float | None = None
    resistivity: float | None = Field(default=None, gt=0)
    resistivity_class: str
    frequency_range: tuple[float, float] | None = None
    loss_note: str = ""
    source: str = Field(min_length=1)

    def saturation_flux_density(self, temperature_C=25.0):
        """Typical saturation flux density of the class at ``temperature_C``.

        .. math::

            B_s(T) = \\begin{cases}
              B_{25} & T \\le 25\\,°C \\\\
              B_{25} + (B_{100} - B_{25})\\,\\dfrac{T - 25}{75} & 25 < T \\le 100\\,°C \\\\
              \\min\\!\\left(B_{25} + (B_{100} - B_{25})\\,\\dfrac{T - 25}{75},\\;
                    B_{100}\\,\\dfrac{T_c - T}{T_c - 100}\\right) & 100\\,°C < T < T_c \\\\
              0 & T \\ge T_c
            \\end{cases}

        Parameters
        ----------
        temperature_C : float or array_like, shape (n,)
            Core temperature, °C.

        Returns
        -------
        numpy.ndarray or numpy.float64
            Saturation flux density, T, shaped like ``temperature_C`` (never negative;
            NaN in, NaN out). Air: infinity, as it does not saturate.

        Warns
        -----
        OutsideValidityWarning
            A temperature outside 0 °C to 120 °C, beyond the two tabulated points
            (25 °C and 100 °C) by more than coilplan trusts them.

        Notes
        -----
        Linear between the two typical values of the class. Below 25 °C the 25 °C
        value is kept: saturation rises as a ferrite cools, so this errs low (safe).
        Above 100 °C the value falls on the lower of the extended line and the line
        from the 100 °C value to zero at the Curie point (where magnetic order is
        lost), so it also errs low; at and above the Curie point it is zero. The
        interpolation is coilplan's choice: the data give two points only.

        Examples
        --------
        >>> core = material("mnzn-power")
        >>> print(f"{core.saturation_flux_density(25):.3f} T, {core.saturation_flux_density(62.5):.3f} T")
        0.490 T, 0.440 T
        >>> print(f"{core.saturation_flux_density(120):.3f} T")
        0.325 T
        """
        temperature = np.asarray(temperature_C, dtype=float)
        cold, hot, curie = (self.saturation_flux_density_25C, self.saturation_flux_density_100C,
                            self.curie_temperature)
        if cold is None or hot is None or curie is None:
            return np.full_like(temperature, math.inf)[()]
        low, high = _VALID_TEMPERATURE_C
        if np.any((temperature < low) | (temperature > high)):
            warnings.warn(f"saturation flux density of {self.name}: {low:g} °C to {high:g} °C is "
                          "the range its two typical values (25 °C, 100 °C) are trusted for",
                          OutsideValidityWarning, stacklevel=2)
        line = cold + (hot - cold) * (temperature - 25.0) / 75.0
        flux = np.where(temperature <= 25.0, cold, line)
        toward_curie = hot * (curie - temperature) / (curie - 100.0)
        flux = np.where(temperature > 100.0, np.minimum(line, toward_curie), flux)
        flux = np.where(temperature >= curie, 0.0, flux)
        return np.maximum(flux, 0.0)[()]


class PermeabilityMatch(NamedTuple):
    """One material class that fits a measured relative permeability."""

    material: Material
    """The class."""
    inside: bool
    """True when the measured value lies within the class's permeability range."""
    ratio_to_typical: float
    """Measured permeability over the class's typical value."""
    log_distance: float
    """|ln(measured / typical)|: the ranking key after ``inside``."""


def _to_material(row: _MaterialRow) -> Material:
    frequency = (None if row.frequency_low_Hz is None or row.frequency_high_Hz is None
                 else (row.frequency_low_Hz, row.frequency_high_Hz))
    return Material(
        name=row.name,
        family=row.family,
        description=row.description,
        mu_initial=row.mu_initial_typical,
        mu_range=(row.mu_initial_low, row.mu_initial_high),
        saturation_flux_density_25C=None if row.bsat_25C_mT is None else row.bsat_25C_mT / 1000.0,
        saturation_flux_density_100C=None if row.bsat_100C_mT is None else row.bsat_100C_mT / 1000.0,
        curie_temperature=row.curie_C,
        resistivity=row.resistivity_ohm_m_typical,
        resistivity_class=row.resistivity_class,
        frequency_range=frequency,
        loss_note=row.loss_note,
        source=row.source,
    )


@functools.cache
def _materials() -> dict[str, Material]:
    rows = load_table(_FILE, _MaterialRow)
    table: dict[str, Material] = {}
    for row in rows:
        if row.name in table:  # a duplicate would silently shadow a class
            raise DataFileError(_FILE, 0, "name", f"the name {row.name!r} appears twice")
        table[row.name] = _to_material(row)
    return table


def _key(text: str) -> str:
    return "-".join(str(text).strip().lower().replace("_", " ").replace("-", " ").split())


def all_materials() -> list[Material]:
    """Every material class, in the order of ``core_data/materials.csv``.

    Examples
    --------
    >>> [core.name for core in all_materials()][:3]
    ['mnzn-high-mu', 'mnzn-power', 'nizn-800']
    """
    return list(_materials().values())


def material(name: str, option: str = "material") -> Material:
    """The material class called ``name`` (case-blind; ``_`` and spaces read as ``-``).

    Raises
    ------
    InvalidInputError
        No such class (option ``option``); the message suggests close names.

    Examples
    --------
    >>> core = material("NiZn-125")
    >>> core.mu_initial, core.mu_range, core.family
    (125.0, (100.0, 160.0), 'NiZn ferrite')
    >>> material("nizn-152")  # doctest: +ELLIPSIS
    Traceback (most recent call last):
    ...
    coilplan.errors.InvalidInputError: material: expected a material class ... (did you mean nizn-125?)...
    """
    table = _materials()
    key = _key(name)
    if key in table:
        return table[key]
    close = difflib.get_close_matches(key, list(table), n=2, cutoff=0.8)
    hint = f" (did you mean {' or '.join(close)}?)" if close else f" (one of {', '.join(table)})"
    raise InvalidInputError(option, f"a material class such as nizn-125{hint}; see 'coilplan materials'",
                            name)


def find_materials(text: str) -> list[Material]:
    """The classes whose name, family or description contains ``text`` (case-blind).

    Examples
    --------
    >>> [core.name for core in find_materials("NiZn")]
    ['nizn-800', 'nizn-250', 'nizn-125', 'nizn-40']
    >>> [core.name for core in find_materials("carbonyl")]
    ['iron-powder-rf']
    """
    needle = str(text).strip().lower()
    return [core for core in _materials().values()
            if needle in core.name or needle in core.family.lower()
            or needle in core.description.lower()]


def materials_for_permeability(mu_r: float, spread: float = 0.25,
                               option: str = "mu_r") -> list[PermeabilityMatch]:
    """The material classes consistent with a measured relative permeability, best first.

    A class fits when ``mu_r`` lies within its permeability range widened by the
    factor ``1 + spread`` at each end:

    .. math::

        \\frac{\\mu_{low}}{1 + t} \\le \\mu_r \\le \\mu_{high}\\,(1 + t)

    Classes that contain ``mu_r`` come first, then those that only nearly contain
    it; within each group they are ranked by closeness in log permeability,
    :math:`|\\ln(\\mu_r / \\mu_{typical})|`.

    This is the helper for identifying an unknown core: wind a test winding on an
    unmarked toroid, measure its inductance, compute AL and the relative
    permeability from the core's dimensions, and ask which classes fit.
    **Permeability alone cannot tell apart two classes whose ranges overlap**
    (a reduced-iron powder core and an Fe-Si-Al powder core can both measure 60):
    a second clue is needed, such as the frequency behaviour (how Q and the
    inductance hold up with frequency), the resistivity class read with a meter on
    the bare core (MnZn reads a resistance, NiZn and powder cores read open), or
    how the inductance falls with DC current (soft saturation of powder cores).

    Parameters
    ----------
    mu_r : float
        Measured relative permeability, above zero.
    spread : float
        How far beyond a class's range a measurement may lie, as a fraction
        (0.25: a factor 1.25), for meter error and the spread of the core.
    option : str
        The field named in an error (the caller's name for ``mu_r``).

    Returns
    -------
    list of PermeabilityMatch
        Possibly empty: no class fits.

    Raises
    ------
    InvalidInputError
        ``mu_r`` not a finite number above zero (``option``), or ``spread`` not a
        finite number of at least zero (``spread``).

    Examples
    --------
    >>> [(m.material.name, m.inside) for m in materials_for_permeability(130)]
    [('nizn-125', True), ('fesial-powder', False)]
    >>> [m.material.name for m in materials_for_permeability(60)]
    ['fesial-powder', 'iron-powder-power', 'nizn-40']
    """
    try:
        measured = float(mu_r)
    except (TypeError, ValueError):
        raise InvalidInputError(option, "a relative permeability above zero, such as 125",
                                mu_r) from None
    if not (math.isfinite(measured) and measured > 0):
        raise InvalidInputError(option, "a relative permeability above zero, such as 125", mu_r)
    try:
        fraction = float(spread)
    except (TypeError, ValueError):
        fraction = math.nan
    if not (math.isfinite(fraction) and fraction >= 0):
        raise InvalidInputError("spread", "a fraction of at least 0, such as 0.25", spread)
    widen = 1.0 + fraction
    matches = []
    for core in _materials().values():
        low, high = core.mu_range
        if not low / widen <= measured <= high * widen:
            continue
        ratio = measured / core.mu_initial
        matches.append(PermeabilityMatch(core, bool(low <= measured <= high), ratio,
                                         abs(math.log(ratio))))
    matches.sort(key=lambda match: (not match.inside, match.log_distance))
    return matches


# --------------------------------------------------------------------------- dispersion


@dataclasses.dataclass(frozen=True)
class _DispersionRow:
    """One row of core_data/dispersion.csv, in the file's units (Hz).

    A frozen dataclass row (coilplan._data.rule metadata), so that reading this table needs
    no pydantic validation.
    """

    name: str = rule(pattern=r"^[a-z][a-z0-9]*(?:-[a-z0-9]+)*$")
    relaxation_frequency_Hz: float = rule(gt=0)  # noqa: N815 (unit symbol keeps its case)
    basis: str = rule(choices=("snoek", "typical"))
    loss_factor: float = rule(ge=0, lt=1)
    loss_factor_frequency_Hz: float = rule(ge=0)  # noqa: N815
    loss_factor_high: float = rule(ge=0, lt=1)
    loss_factor_high_frequency_Hz: float = rule(gt=0)  # noqa: N815
    source: str = rule(min_length=1)


@dataclasses.dataclass(frozen=True)
class Dispersion:
    """The frequency dispersion of one material class, in SI units (Hz).

    Get one with :func:`material_dispersion`.

    Attributes
    ----------
    name : str
        The material class, as in :func:`material`.
    mu_initial : float
        The class's typical initial permeability (from ``materials.csv``).
    relaxation_frequency : float
        f_r, Hz: where the relaxation's µ'' peaks.
    basis : str
        ``"snoek"`` (f_r from Snoek's law and the class's µi and saturation) or
        ``"typical"`` (a typical value of the class).
    loss_factor : float
        Relative loss factor tanδ/µi (small-signal) at ``loss_factor_frequency``.
    loss_factor_frequency : float
        Hz.
    loss_factor_high : float
        tanδ/µi at ``loss_factor_high_frequency``, the top of the class's usual range.
    loss_factor_high_frequency : float
        Hz.
    source : str
        Where the row's values come from.
    """

    name: str
    mu_initial: float
    relaxation_frequency: float
    basis: str
    loss_factor: float
    loss_factor_frequency: float
    loss_factor_high: float
    loss_factor_high_frequency: float
    source: str

    def loss_tangent(self, frequency):
        """tanδ = µ''/µ' of the class at ``frequency`` (Hz): the catalogue curve through its two loss factors.

        See :func:`coilplan.physics.dispersion.catalogue_loss_tangent`.

        Examples
        --------
        >>> print(f"{float(material_dispersion('nizn-125').loss_tangent(3e7)):.3f}")
        0.020
        """
        from coilplan.physics.dispersion import catalogue_loss_tangent

        return catalogue_loss_tangent(frequency, self.mu_initial, self.relaxation_frequency, self.loss_factor,
                                      self.loss_factor_frequency, self.loss_factor_high,
                                      self.loss_factor_high_frequency)

    def permeability(self, frequency):
        """The relaxation model's complex relative permeability µ' − jµ'' of the class at ``frequency`` (Hz).

        See :func:`coilplan.physics.dispersion.complex_permeability`. Its µ' is the one an answer
        uses; its loss is only the cap on :meth:`loss_tangent`, which gives the loss in an answer.

        Examples
        --------
        >>> mu = material_dispersion("nizn-125").permeability(1e5)
        >>> print(f"{mu.real:.2f}, tanδ/µi = {-mu.imag / mu.real / 125:.1e}")
        125.00, tanδ/µi = 3.0e-05
        """
        from coilplan.physics.dispersion import complex_permeability

        return complex_permeability(frequency, self.mu_initial, self.relaxation_frequency,
                                    self.loss_factor, self.loss_factor_frequency)


@functools.cache
def _dispersions() -> dict[str, Dispersion]:
    classes = _materials()
    table: dict[str, Dispersion] = {}
    for row in load_table(_DISPERSION_FILE, _DispersionRow):
        if row.name not in classes:
            raise DataFileError(_DISPERSION_FILE, 0, "name",
                                f"{row.name!r} is not a class of {_FILE}")
        if classes[row.name].family == "air":
            raise DataFileError(_DISPERSION_FILE, 0, "name", f"{row.name!r} is not magnetic: no dispersion row")
        if row.name in table:
            raise DataFileError(_DISPERSION_FILE, 0, "name", f"the name {row.name!r} appears twice")
        if not (row.loss_factor_high_frequency_Hz > row.loss_factor_frequency_Hz
                and row.loss_factor_high >= row.loss_factor):
            raise DataFileError(_DISPERSION_FILE, 0, "loss_factor_high",
                                f"{row.name!r}: the high point must lie above the first in frequency and loss")
        table[row.name] = Dispersion(row.name, classes[row.name].mu_initial, row.relaxation_frequency_Hz,
                                     row.basis, row.loss_factor, row.loss_factor_frequency_Hz, row.loss_factor_high,
                                     row.loss_factor_high_frequency_Hz, row.source)
    return table


def material_dispersion(name: str, option: str = "material") -> Dispersion | None:
    """The frequency dispersion of the material class ``name``; None for air (no core, no core loss).

    Raises
    ------
    InvalidInputError
        No such class (as :func:`material`).
    DataFileError
        A magnetic class has no row in ``core_data/dispersion.csv``.

    Examples
    --------
    >>> d = material_dispersion("NiZn-125")
    >>> d.relaxation_frequency, d.basis, d.loss_factor
    (54000000.0, 'snoek', 3e-05)
    >>> material_dispersion("air") is None
    True
    """
    core = material(name, option)
    if core.family == "air":
        return None
    table = _dispersions()
    if core.name not in table:
        raise DataFileError(_DISPERSION_FILE, 0, "name", f"no row for the class {core.name!r}")
    return table[core.name]
