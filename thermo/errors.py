"""Errors raised by the calculation core.

Every error a user can cause is a :class:`StagewrightError`; its message names the
field, the offending value and the valid range so that the command line and the
window can show it as one line without a traceback.
"""
from __future__ import annotations

__all__ = ["StagewrightError", "InputError", "SecondLawViolation", "PropertyRangeError",
           "Problem", "ProjectFileError", "SaveError"]

from dataclasses import dataclass
from typing import Any


@dataclass(frozen=True)
class Problem:
    """One thing wrong with an input: where, what was found, what is allowed."""

    field: str
    value: Any
    expected: str

    def __str__(self) -> str:
        return f"{self.field}: {self.value!r} — {self.expected}"


class StagewrightError(ValueError):
    """Base class of every error the core raises on purpose.

    Attributes
    ----------
    field : str
        Path of the offending input (``stages[1].efficiency.value``), or ``""``.
    """

    def __init__(self, message: str, field: str = ""):
        super().__init__(message)
        self.field = field


class InputError(StagewrightError):
    """An input value is missing, of the wrong type or outside its valid range."""

    def __init__(self, field: str, value: Any, expected: str):
        self.problem = Problem(field, value, expected)
        super().__init__(str(self.problem), field)

    @classmethod
    def from_problems(cls, problems: list[Problem]) -> "InputError":
        first = problems[0]
        err = cls(first.field, first.value, first.expected)
        err.problems = list(problems)
        if len(problems) > 1:
            err.args = (f"{first} (and {len(problems) - 1} more problem(s))",)
        return err


class SecondLawViolation(StagewrightError):
    """Given or measured data would need negative entropy generation."""


class PropertyRangeError(StagewrightError):
    """A state lies outside the range of the chosen property model."""


class ProjectFileError(StagewrightError):
    """A file cannot be read as a project: unreadable, too large or too deeply nested, not
    UTF-8, broken JSON, not a project, or a format version this release does not know.

    Attributes
    ----------
    field : str
        The key concerned (``"version"``, ``"format"``), or ``""`` for a position error.
    line, column : int or None
        1-based position in the file, when the problem has one.
    """

    def __init__(self, message: str, field: str = "", line: int | None = None, column: int | None = None):
        super().__init__(message, field)
        self.line = line
        self.column = column


class SaveError(StagewrightError):
    """A project or recovery file could not be written; the previous file is unchanged."""
