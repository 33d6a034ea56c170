"""Errors raised by the calculation core.

Every error a user can cause is a :class:`StagewrightError`; its message names the
field, the offending value and the valid range so that the command line and the
window can show it as one line without a traceback.

That message is SI, for the command line and JSON. An error (and a result warning) may
also carry the same sentence as a *template* with named *values*, each SI and tagged with
the quantity it measures (:func:`quantity`); the window and the reports render it in the
display units (``app/document/messages.py``). ``{label}`` in a template stands for the
name of the field the error is about, which only the front end knows.
"""
from __future__ import annotations

__all__ = ["StagewrightError", "InputError", "SecondLawViolation", "PropertyRangeError",
           "Problem", "ProjectFileError", "SaveError", "quantity", "message_detail"]

from dataclasses import dataclass, field
from typing import Any


def quantity(value: float, kind: str | None) -> dict:
    """A value of a message template: SI ``value`` and the quantity it measures
    (``"temperature"``, ``"pressure"``, ``"water_flow"`` … as in the front end's units table;
    None for a plain number)."""
    return {"value": value, "quantity": kind}


def message_detail(template: str, values: dict | None = None) -> dict:
    """Plain data of a message for people: ``{"template": …, "values": {name: quantity(…)}}``.

    Plain values (numbers, words) may be given bare; they are shown as they are.
    """
    vals = {}
    for name, v in (values or {}).items():
        vals[name] = v if isinstance(v, dict) else {"value": v, "quantity": None}
    return {"template": template, "values": vals}


@dataclass(frozen=True)
class Problem:
    """One thing wrong with an input: where, what was found, what is allowed (SI), and
    optionally the same as a template with values for display units (:func:`message_detail`)."""

    field: str
    value: Any
    expected: str
    detail: dict | None = field(default=None, compare=False, hash=False)

    def __str__(self) -> str:
        return f"{self.field}: {self.value!r} — {self.expected}"


class StagewrightError(ValueError):
    """Base class of every error the core raises on purpose.

    Attributes
    ----------
    field : str
        Path of the offending input (``stages[1].efficiency.value``), or ``""``.
    detail : dict or None
        The message for people as :func:`message_detail` (template and values), or None
        when only the SI message exists.
    """

    def __init__(self, message: str, field: str = "", detail: dict | None = None):
        super().__init__(message)
        self.field = field
        self.detail = detail


class InputError(StagewrightError):
    """An input value is missing, of the wrong type or outside its valid range."""

    def __init__(self, field: str, value: Any, expected: str, detail: dict | None = None):
        self.problem = Problem(field, value, expected, detail)
        super().__init__(str(self.problem), field, detail)

    @classmethod
    def from_problems(cls, problems: list[Problem]) -> "InputError":
        first = problems[0]
        err = cls(first.field, first.value, first.expected, first.detail)
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
