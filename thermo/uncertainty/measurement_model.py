"""The solve as a measurement model: measured input values in, result figures out.

JCGM 100:2008 §4.1 writes a measurement as :math:`Y = f(X_1, \\dots, X_N)`; here :math:`f` is
the train solve itself (:func:`stagewright.core.solve.solve_normalised`), lean (``detail=False``: the
same powers, states and totals without the reporting-only work) and on the fast property path,
so that the same function serves the finite differences of the first-order propagation and
every Monte Carlo draw.
"""
from __future__ import annotations

__all__ = ["MeasurementModel"]

import copy

import numpy as np

from stagewright.core.errors import InputError
from stagewright.core.project.paths import parse_path
from stagewright.core.solve import solve_normalised
from stagewright.core.uncertainty.figures import ResultFigure, figure_values
from stagewright.core.uncertainty.inputs import MeasuredInput


class MeasurementModel:
    """:math:`y = f(x)`: the result figures of a normalised project at given input values.

    Parameters
    ----------
    norm : dict
        Normalised project document (copied; the caller's stays as it is).
    inputs : list of MeasuredInput
        The inputs :math:`x` (their paths, valid ranges and nominal values).
    figures : list of ResultFigure
        The outputs :math:`y`.
    """

    def __init__(self, norm: dict, inputs: list[MeasuredInput], figures: list[ResultFigure]) -> None:
        self._doc = copy.deepcopy(norm)
        self.inputs = list(inputs)
        self.figures = list(figures)
        self.nominal = np.array([i.value for i in inputs], dtype=float)
        self.lo = np.array([i.lo for i in inputs], dtype=float)
        self.hi = np.array([i.hi for i in inputs], dtype=float)
        self._slots = [self._slot(i.path) for i in inputs]

    def _slot(self, path: str) -> tuple:
        """(container, key) of ``path`` in the working copy: found once, set at every call."""
        parts = parse_path(path)
        node = self._doc
        for part in parts[:-1]:
            node = node[part]
        return node, parts[-1]

    def in_range(self, x: np.ndarray) -> bool:
        """True when every input value of ``x`` lies in its valid range."""
        return bool(np.all(x >= self.lo) and np.all(x <= self.hi))

    def __call__(self, x) -> np.ndarray:
        """Result figures at input values ``x`` (SI, in the order of ``figures``).

        Raises
        ------
        InputError
            If a value lies outside its input's valid range (naming the first such input).
        StagewrightError
            Whatever the solve raises at these values (a second-law violation, a state
            outside the property model's range).
        """
        x = np.asarray(x, dtype=float)
        if not self.in_range(x):
            j = int(np.argmax((x < self.lo) | (x > self.hi)))
            raise InputError(self.inputs[j].path, float(x[j]),
                             f"expected a value in [{self.lo[j]:g}, {self.hi[j]:g}]")
        for (node, key), v in zip(self._slots, x):
            node[key] = float(v)
        result = solve_normalised(self._doc, detail=False, fast=True)
        return np.array(figure_values(result, self.figures), dtype=float)
