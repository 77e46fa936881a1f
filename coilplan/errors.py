"""Errors and warnings of coilplan.

Every concrete error also derives from the built-in exception a caller would
expect (``ValueError`` for bad or impossible input, ``RuntimeError`` for a
solver that failed), so plain ``except ValueError`` still works. Errors keep
structured fields; the message is built in ``__str__`` in one shape: *what*,
*rule*, *value*. The library never prints and never exits: the command line
maps :class:`InvalidInputError` to exit status 2 and :class:`InfeasibleError`
to exit status 1.
"""

from __future__ import annotations

__all__ = [
    "CoilplanError",
    "DataFileError",
    "InfeasibleError",
    "CoilplanWarning",
    "InvalidInputError",
    "MeasurementWarning",
    "OutsideValidityWarning",
    "SolverError",
]


class CoilplanError(Exception):
    """Base class of every error coilplan raises on purpose."""


class InvalidInputError(CoilplanError, ValueError):
    """An input that cannot be used: wrong unit, out of range, unknown name.

    Parameters
    ----------
    option : str
        The field or parameter the value belongs to, e.g. ``"target"``, ``"inner_diameter"``
        (the command line shows the option that set it; the kit, the plan-file key).
    expected : str
        What would have been accepted, e.g. ``"an inductance such as 10uH"``.
    got : object, optional
        What the user gave, shown as typed.
    """

    def __init__(self, option: str, expected: str, got: object = None):
        super().__init__(option, expected, got)
        self.option = option
        self.expected = expected
        self.got = got

    def __str__(self) -> str:
        text = f"{self.option}: expected {self.expected}"
        if self.got is not None:
            shown = self.got if isinstance(self.got, str) else str(self.got)
            if len(shown) > 40:
                shown = shown[:37] + "..."
            text += f"; got {shown!r}" if isinstance(self.got, str) else f"; got {shown}"
        return text


class InfeasibleError(CoilplanError, ValueError):
    """A valid request that no winding can meet, e.g. a target above what fits.

    Parameters
    ----------
    message : str
        The whole sentence, in the user's terms.
    option : str, optional
        The field whose value made the request infeasible, e.g. ``"target"``.
    achievable : tuple of float, optional
        The (lowest, highest) value that can be reached, in SI units.
    """

    def __init__(self, message: str, option: str | None = None,
                 achievable: tuple[float, float] | None = None):
        super().__init__(message)
        self.message = message
        self.option = option
        self.achievable = achievable

    def __str__(self) -> str:
        return self.message


class DataFileError(CoilplanError, ValueError):
    """A row of a core_data/ file that does not validate.

    Parameters
    ----------
    file : str
        File name inside core_data/.
    line : int
        1-based line number in the file.
    column : str
        Column (field) name.
    problem : str
        What is wrong with the value.
    """

    def __init__(self, file: str, line: int, column: str, problem: str):
        super().__init__(file, line, column, problem)
        self.file = file
        self.line = line
        self.column = column
        self.problem = problem

    def __str__(self) -> str:
        return f"{self.file}, line {self.line}, column {self.column}: {self.problem}"


class SolverError(CoilplanError, RuntimeError):
    """The inverse solver did not converge (a defect, not a user error)."""


class CoilplanWarning(UserWarning):
    """Base class of the warnings coilplan gives about an answer (the command line lists them)."""


class OutsideValidityWarning(CoilplanWarning):
    """A formula was used outside the range its source states it is valid for."""


class MeasurementWarning(CoilplanWarning):
    """Readings that do not follow the model, a frequency near self-resonance, an assumed tolerance."""
