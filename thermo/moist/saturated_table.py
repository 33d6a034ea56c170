r"""Saturated moist air at one pressure, interpolated in temperature (a year's cooler ratings) [1]_ [2]_ [3]_.

A cooler rated at a fixed UA in every bin of a year (:mod:`stagewright.core.year_design`) sizes
its exchanger two or three times a bin, and a condensing sizing asks for the equilibrium
enthalpy of the air below its dew point at two new temperatures each time (the air outlet
and the coolant's temperature at the dew-point boundary). Below the dew point the vapour is
held at saturation, so at the cooler's fixed outlet pressure the equilibrium enthalpy per
kilogram of dry air of a stream of total water W is

.. math::

    h_{eq}(T) = H_s(T) + \left[W - w_s(T)\right] h_l(T), \qquad W > w_s(T)

with :math:`w_s(T)` the saturation humidity ratio, :math:`H_s(T) = h_g(T, p, w_s(T))` the
enthalpy of the saturated gas phase and :math:`h_l(T)` that of the condensed water — three
functions of temperature alone, the same for every bin at that pressure, whatever its W.
:class:`SaturatedTable` interpolates them by cubic Lagrange interpolation [3]_ on a 0.5 K grid
whose nodes are computed with the stream's own mixture the first time they are needed and
then kept. Above the dew point (:math:`W \le w_s`) the caller takes the gas phase directly.

The grid does not straddle the triple point (273.16 K), where the condensed phase changes
from ice to liquid and :math:`w_s` has a kink: a branch of nodes runs upward from just above
it and one downward from just below it, and a stencil never takes nodes of both. Within
``_GAP`` of the triple point the exact functions are used.

Measured against the stream's own equilibrium enthalpy (tests/test_year_tables.py), at 1.5–12 bar
and W up to three times saturation: within 1.2e-3 J/kg from 223 K to 273 K, 8e-3 J/kg to 313 K
and 0.3 J/kg to 353 K (2.5e-7 relative at worst), far inside the fast property path's 1e-4.
Only a year's rated coolers on the fast property path use it; exact solves never do.

References
----------
.. [1] ASHRAE, *Handbook—Fundamentals*, 2017, ch. 1 (the enthalpy of saturated moist air with
   condensed water, per kilogram of dry air).
.. [2] S. Herrmann, H.-J. Kretzschmar, D. P. Gatley, ASHRAE RP-1485, HVAC&R Research 15 (2009)
   961–986 (saturation of real moist air: the enhancement factor and the virial mixture).
.. [3] M. Abramowitz, I. A. Stegun, *Handbook of Mathematical Functions*, Dover, 1965,
   eq. 25.2.13 (four-point Lagrange interpolation).
"""
from __future__ import annotations

__all__ = ["SaturatedTable", "saturated_table", "STEP_K"]

import math
import threading

from stagewright.core.lagrange import cubic_weights
from stagewright.core.moist.saturation import T_TRIPLE

STEP_K = 0.5  #: grid step in temperature, [K]
_GAP = 0.25  #: the branches' first nodes lie this far from the triple point, [K]
_T_LOW, _T_HIGH = 200.0, 420.0  #: where the table answers, [K] (outside: the exact functions)



class SaturatedTable:
    r""":math:`(w_s, H_s, h_l)` of saturated moist air at one pressure, interpolated in T (see the module).

    Parameters
    ----------
    mixture : MoistMixture
        The stream's moist-air formulation (:class:`stagewright.core.moist.mixture.MoistMixture`).
    pressure : float
        Total pressure, [Pa].

    Examples
    --------
    >>> from stagewright.core.models import ConstantCpAir
    >>> from stagewright.core.moist.mixture import make_mixture
    >>> mix = make_mixture(ConstantCpAir())
    >>> table = SaturatedTable(mix, 8e5)
    >>> ws, hs, hl = table.parts(300.3)
    >>> abs(ws / mix.saturation_ratio(300.3, 8e5) - 1.0) < 1e-7
    True
    """

    def __init__(self, mixture, pressure: float):
        self.mixture = mixture
        self.P = pressure
        self._nodes: dict = {}
        self._lock = threading.Lock()

    def exact(self, T: float) -> tuple[float, float, float]:
        """:math:`(w_s, H_s, h_l)` at T from the mixture itself, [kg/kg], [J/kg dry air], [J/kg water]."""
        mix, P = self.mixture, self.P
        ws = mix.saturation_ratio(T, P)
        return ws, mix.gas(T, P, ws, False)[0], mix.liquid(T, P)[0]

    def _node(self, key: tuple) -> tuple:
        v = self._nodes.get(key)
        if v is None:
            side, k = key
            v = self.exact(T_TRIPLE + side * (_GAP + k * STEP_K))
            with self._lock:
                self._nodes[key] = v
        return v

    def parts(self, T: float) -> tuple[float, float, float]:
        """:math:`(w_s, H_s, h_l)` at T [K], interpolated (exact near the triple point and outside 200–420 K)."""
        d = T - T_TRIPLE
        side = 1 if d > 0.0 else -1
        x = (abs(d) - _GAP) / STEP_K
        if x < 0.0 or not _T_LOW < T < _T_HIGH:
            return self.exact(T)
        first = max(int(x) - 1, 0)
        w = cubic_weights(x - first)
        nodes = [self._node((side, first + a)) for a in range(4)]
        if math.isinf(nodes[3][0]) or math.isinf(nodes[0][0]):  # water cannot condense at some node
            return self.exact(T)
        return tuple(w[0] * nodes[0][c] + w[1] * nodes[1][c] + w[2] * nodes[2][c] + w[3] * nodes[3][c]
                     for c in range(3))

    def enthalpy(self, T: float, water: float) -> float | None:
        r"""Equilibrium enthalpy [J/kg dry air] of total water ``water`` at T where it is saturated
        (:math:`W > w_s(T)`), else None (the caller takes the gas phase at W)."""
        ws, hs, hl = self.parts(T)
        if not water > ws:  # unsaturated (also where water cannot condense: w_s = inf)
            return None
        return hs + (water - ws) * hl


_TABLES: dict = {}
_TABLES_LOCK = threading.Lock()


def saturated_table(mixture, pressure: float) -> SaturatedTable:
    """The process's table of ``mixture`` at ``pressure`` (kept: a year's coolers keep their pressures)."""
    key = (id(mixture), pressure)
    table = _TABLES.get(key)
    if table is None or table.mixture is not mixture:
        with _TABLES_LOCK:
            if len(_TABLES) > 32:
                _TABLES.clear()
            table = _TABLES[key] = SaturatedTable(mixture, pressure)
    return table
