"""click parameter types for engineering values; they call the parsers in coilplan.quantities."""

from __future__ import annotations

import click

from coilplan.errors import InvalidInputError
from coilplan.quantities import parse_count, parse_quantity, parse_relative, parse_temperature

__all__ = ["CountType", "PercentType", "QuantityType", "TemperatureType"]


def _message(error: InvalidInputError) -> str:
    text = f"expected {error.expected}"
    if error.got is not None:
        shown = str(error.got)
        text += f"; got {shown[:37] + '...' if len(shown) > 40 else shown!r}"
    return text


class QuantityType(click.ParamType):
    """A value with its unit, e.g. ``QuantityType("H")`` reads ``10uH``, returns SI."""

    def __init__(self, unit: str, *, allow_zero: bool = False, allow_negative: bool = False):
        self.unit = unit
        self.allow_zero = allow_zero
        self.allow_negative = allow_negative
        self.name = {"H": "inductance", "F": "capacitance", "Hz": "frequency", "m": "length", "m2": "area",
                     "ohm": "resistance", "A": "current", "V": "voltage", "T": "flux density",
                     "H/t2": "AL"}.get(unit, unit)

    def convert(self, value, param, ctx):
        if isinstance(value, float):
            return value
        try:
            return parse_quantity(value, self.unit, allow_zero=self.allow_zero,
                                  allow_negative=self.allow_negative)
        except InvalidInputError as error:
            self.fail(_message(error), param, ctx)


class CountType(click.ParamType):
    """A whole number of at least ``minimum`` (turns, layers)."""

    name = "count"

    def __init__(self, minimum: int = 1):
        self.minimum = minimum

    def convert(self, value, param, ctx):
        if isinstance(value, int):
            return value
        try:
            return parse_count(value, minimum=self.minimum)
        except InvalidInputError as error:
            self.fail(_message(error), param, ctx)


class TemperatureType(click.ParamType):
    """A temperature in °C (``60C``) or kelvin (``333K``); returns °C."""

    name = "temperature"

    def convert(self, value, param, ctx):
        if isinstance(value, float):
            return value
        try:
            return parse_temperature(value)
        except InvalidInputError as error:
            self.fail(_message(error), param, ctx)


class PercentType(click.ParamType):
    """A relative tolerance: ``2%``, ``0.5 %``, ``500ppm``; returns the fraction (0.02)."""

    name = "percent"

    def convert(self, value, param, ctx):
        if isinstance(value, float):
            return value
        try:
            return parse_relative(value)
        except InvalidInputError as error:
            self.fail(_message(error), param, ctx)
