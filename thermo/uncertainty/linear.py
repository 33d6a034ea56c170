r"""First-order propagation of the measurement uncertainties through the solve (the GUM).

For uncorrelated inputs the combined standard uncertainty of a result :math:`y = f(x)` is

.. math:: u_c^2(y) = \sum_i c_i^2\,u^2(x_i), \qquad c_i = \partial f / \partial x_i

(JCGM 100:2008 §5.1.2, eq. 10), and the expanded uncertainty :math:`U = k\,u_c(y)` with the
coverage factor :math:`k = 2` (§6.2.1, §6.3.3). The sensitivity coefficients are central
differences of the solve with the step :math:`\pm u(x_i)`,

.. math:: c_i \approx \frac{f(x + u_i e_i) - f(x - u_i e_i)}{2\,u_i}

which is the numerical evaluation the GUM describes for a model given only as an algorithm
(JCGM 100:2008 §5.1.3, note 2; note number from memory). Where one side of the step leaves the
input's valid range the one-sided difference on the other side is used. The share of the
variance of :math:`y` due to input :math:`i` is :math:`(c_i u_i)^2 / u_c^2(y)`.
"""
from __future__ import annotations

__all__ = ["LinearPropagation", "propagate_linear", "COVERAGE_FACTOR"]

from dataclasses import dataclass

import numpy as np

COVERAGE_FACTOR = 2.0  #: k of the expanded uncertainty (JCGM 100:2008 §6.3.3)


@dataclass
class LinearPropagation:
    """Result of the first-order propagation (arrays over figures, and figures × inputs)."""

    value: np.ndarray  #: y at the nominal inputs
    sensitivity: np.ndarray  #: c[j, i] = ∂y_j/∂x_i
    standard_uncertainty: np.ndarray  #: u_c(y_j)
    expanded_uncertainty: np.ndarray  #: U = k u_c
    variance_share: np.ndarray  #: (c_ji u_i)² / u_c²(y_j); rows sum to 1 (0 where u_c = 0)
    solves: int  #: solves used


def propagate_linear(model, u: np.ndarray, cancel=None) -> LinearPropagation:
    """First-order (GUM) propagation of standard uncertainties ``u`` through ``model``.

    Parameters
    ----------
    model : MeasurementModel
        :math:`y = f(x)`, with ``nominal``, ``lo``, ``hi`` arrays over the inputs.
    u : numpy.ndarray
        Standard uncertainty of each input, in its SI unit.
    cancel : callable, optional
        Checked before each input's pair of solves; raises whatever it raises.

    Returns
    -------
    LinearPropagation

    Raises
    ------
    StagewrightError
        If the solve fails at the nominal inputs, or on both sides of an input's step.

    Examples
    --------
    >>> import numpy as np
    >>> class Product:  # y = x0 * x1, at (2, 3)
    ...     nominal, lo, hi = np.array([2.0, 3.0]), np.array([-9.0, -9.0]), np.array([9.0, 9.0])
    ...     def __call__(self, x):
    ...         return np.array([x[0] * x[1]])
    >>> r = propagate_linear(Product(), np.array([0.1, 0.2]))
    >>> round(float(r.standard_uncertainty[0]), 6)  # sqrt((3*0.1)^2 + (2*0.2)^2)
    0.5
    """
    x0 = np.asarray(model.nominal, dtype=float)
    y0 = np.asarray(model(x0), dtype=float)
    c = np.zeros((y0.size, x0.size))
    solves = 1
    for i, ui in enumerate(np.asarray(u, dtype=float)):
        if cancel is not None:
            cancel()
        up, down = x0.copy(), x0.copy()
        up[i] += ui
        down[i] -= ui
        y_up = model(up) if up[i] <= model.hi[i] else None
        y_down = model(down) if down[i] >= model.lo[i] else None
        solves += (y_up is not None) + (y_down is not None)
        if y_up is not None and y_down is not None:
            c[:, i] = (y_up - y_down) / (2.0 * ui)
        elif y_up is not None:
            c[:, i] = (y_up - y0) / ui
        elif y_down is not None:
            c[:, i] = (y0 - y_down) / ui
    contrib = (c * np.asarray(u, dtype=float)) ** 2
    uc2 = contrib.sum(axis=1)
    share = np.divide(contrib, uc2[:, None], out=np.zeros_like(contrib), where=uc2[:, None] > 0)
    uc = np.sqrt(uc2)
    return LinearPropagation(y0, c, uc, COVERAGE_FACTOR * uc, share, solves)
