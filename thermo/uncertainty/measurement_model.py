"""The solve as a measurement model: measured input values in, result figures out.

JCGM 100:2008 §4.1 writes a measurement as :math:`Y = f(X_1, \\dots, X_N)`; here :math:`f` is
the train solve itself (:func:`stagewright.core.solve.solve_normalised`), lean (``detail=False``: the
same powers, states and totals without the reporting-only work) and on the fast property path,
so that the same function serves the finite differences of the first-order propagation and
every Monte Carlo draw.

The Monte Carlo draws go through :meth:`MeasurementModel.draw`: the same figures from only the
states they need (:mod:`stagewright.core.uncertainty.lean_figures`), with the full solve wherever that
evaluation does not cover the train or the draw. :meth:`MeasurementModel.enable_lean` first
checks the two against each other at given points and keeps the full solve if they differ by
more than :data:`LEAN_AGREEMENT` relative.
"""
from __future__ import annotations

__all__ = ["MeasurementModel", "LEAN_AGREEMENT"]

import copy

import numpy as np

from stagewright.core.errors import InputError, StagewrightError
from stagewright.core.project.paths import parse_path
from stagewright.core.solve import model_for, solve_normalised
from stagewright.core.uncertainty.figures import ResultFigure, figure_values
from stagewright.core.uncertainty.inputs import MeasuredInput
from stagewright.core.uncertainty.lean_figures import LeanFigures

#: largest relative difference between the lean evaluation and the full solve that
#: :meth:`MeasurementModel.enable_lean` accepts (both solve their states to 1e-9 K; the
#: full solve's shaft-power flow to 1e-12)
LEAN_AGREEMENT = 1e-7


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
    fast : bool
        Solve on the fast property path (the default; :func:`stagewright.core.solve.solve_normalised`).
    allow_lean : bool
        Let :meth:`enable_lean` turn on the lean evaluation of draws (False: every draw is a
        full solve, the reference the tests and the bench compare with).
    """

    def __init__(self, norm: dict, inputs: list[MeasuredInput], figures: list[ResultFigure],
                 fast: bool = True, allow_lean: bool = True) -> None:
        self._doc = copy.deepcopy(norm)
        self.fast, self.allow_lean = fast, allow_lean
        self.lean = False  #: draws use the lean evaluation (set by :meth:`enable_lean`)
        self._lean_figures = LeanFigures([f.name for f in figures])
        self.inputs = list(inputs)
        self.figures = list(figures)
        self.nominal = np.array([i.value for i in inputs], dtype=float)
        self.lo = np.array([i.lo for i in inputs], dtype=float)
        self.hi = np.array([i.hi for i in inputs], dtype=float)
        self._lo, self._hi = self.lo.tolist(), self.hi.tolist()
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
        self._set(x)
        result = solve_normalised(self._doc, detail=False, fast=self.fast)
        return np.array(figure_values(result, self.figures), dtype=float)

    def _set(self, x) -> None:
        """Put the input values ``x`` into the working copy (InputError if one is out of range)."""
        x = np.asarray(x, dtype=float)
        if not self.in_range(x):
            j = int(np.argmax((x < self.lo) | (x > self.hi)))
            raise InputError(self.inputs[j].path, float(x[j]),
                             f"expected a value in [{self.lo[j]:g}, {self.hi[j]:g}]")
        for (node, key), v in zip(self._slots, x):
            node[key] = float(v)

    def _lean(self, x) -> np.ndarray | None:
        """The lean evaluation at ``x``, or None where the full solve must answer (or ``x`` is
        out of range)."""
        values = [float(v) for v in x]
        for v, lo, hi in zip(values, self._lo, self._hi):
            if not lo <= v <= hi:
                return None
        for (node, key), v in zip(self._slots, values):
            node[key] = v
        y = self._lean_figures(self._doc, model_for(self._doc["fluid"], self.fast))
        return None if y is None else np.array(y, dtype=float)

    def draw(self, x) -> np.ndarray:
        """:meth:`__call__` for one Monte Carlo draw: the lean evaluation where it is enabled and
        covers the draw, else the full solve (the same figures, the same refusals)."""
        if self.lean:
            y = self._lean(x)
            if y is not None:
                return y
        return self(x)

    def enable_lean(self, points) -> bool:
        """Use the lean evaluation for draws if it covers the train and agrees with the full solve.

        Parameters
        ----------
        points : sequence of numpy.ndarray
            Input values to compare the two at (the nominal values first). The lean evaluation
            must answer at the first; at every point where both answer, every figure must agree
            to :data:`LEAN_AGREEMENT` relative, and where the full solve refuses a point the lean
            evaluation must not answer it.

        Returns
        -------
        bool
            Whether draws now use the lean evaluation.
        """
        self.lean = False
        if not self.allow_lean:
            return False
        for k, x in enumerate(points):
            lean = self._lean(x)
            if lean is None:
                if k == 0:
                    return False
                continue
            try:
                full = self(x)
            except StagewrightError:
                return False
            if not np.all(np.abs(lean - full) <= LEAN_AGREEMENT * np.maximum(np.abs(full), 1e-300)):
                return False
        self.lean = True
        return True
