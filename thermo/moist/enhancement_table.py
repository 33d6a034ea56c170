"""The RP-1485 enhancement factor by interpolation in a lazily filled table (fast trial solves) [1]_ [2]_.

Each exact evaluation of the enhancement factor (CoolProp's ``HAProps_Aux("f")``, an iterative
solution of the RP-1485 equilibrium condition) costs 20–50 µs, and a study or sweep asks for it
at new (T, p) on every trial. :class:`EnhancementTable` interpolates ln f instead, by tensor-product
cubic Lagrange interpolation on a grid in T and ln p whose nodes are computed exactly the
first time they are needed and then kept for the life of the process.

Only the fast property path of trial solves uses it (:func:`stagewright.core.solve.solve_normalised` with
``fast=True``); every reported state of a full solve uses the exact factor.
"""
from __future__ import annotations

__all__ = ["EnhancementTable", "T_STEP", "LN_P_STEP", "T_FIRST", "T_LAST", "ICE_FIRST", "ICE_LAST"]

import math

from stagewright.core import coolprop_adapter as cpa
from stagewright.core.moist.saturation import saturation_pressure

T_STEP = 2.0  #: grid step in temperature, [K]
LN_P_STEP = 0.025  #: grid step in ln p, [-]
T_FIRST = 273.2  #: first grid temperature, [K]: CoolProp's f jumps at the triple point, 273.16 K
T_LAST = 473.2  #: last grid temperature, [K] (dew points to 200 °C)
_LN_P_FIRST = math.log(1.0e3)  #: first grid pressure, [ln Pa]
_P_MAX = 10.0e6  #: upper pressure of the RP-1485 formulation, [Pa]
_SATURATION_MARGIN = 2.0  #: nodes need p ≥ 2 p_ws(T): f bends sharply as p approaches p_ws
_I_LAST = int(round((T_LAST - T_FIRST) / T_STEP))
ICE_LAST = 273.12  #: last node of the grid over ice, [K]: below the triple point, where f is over ice
ICE_FIRST = ICE_LAST - 30 * T_STEP  #: first node of the grid over ice, [K] (213.12 K: frost points of sites to −50 °C)
_ICE_I_LAST = 30


def _weights(t: float) -> tuple:
    """Cubic Lagrange weights of the nodes −1, 0, 1, 2 at fractional position t in [0, 1)."""
    tm1, tm2, tp1 = t - 1.0, t - 2.0, t + 1.0
    return (-t * tm1 * tm2 / 6.0, tp1 * tm1 * tm2 / 2.0, -tp1 * t * tm2 / 2.0, tp1 * t * tm1 / 6.0)


class EnhancementTable:
    r"""ln f(T, p) of ASHRAE RP-1485 interpolated on a lazily filled (T, ln p) grid [1]_ [2]_.

    .. math::

        \ln f(T, p) \approx \sum_{a=-1}^{2}\sum_{b=-1}^{2} \ell_a(t)\,\ell_b(u)\,
        \ln f(T_{i+a}, p_{j+b}),
        \qquad t = \frac{T - T_i}{\Delta T},\; u = \frac{\ln p - \ln p_j}{\Delta\ln p}

    with :math:`\ell` the cubic Lagrange basis on four equally spaced nodes [3]_.

    Parameters
    ----------
    exact : callable, optional
        ``(T [K], p [Pa]) -> f [-]``, the exact factor used for nodes and outside the grid;
        default CoolProp's RP-1485 implementation.

    Notes
    -----
    Below the triple point a second grid over ice (ΔT = 2 K from 213.12 K to 273.12 K, the same
    pressures) takes the factor over ice; its stencils are kept inside it (the cells at its ends
    take the four nearest nodes), so that no stencil mixes the two phases. The grid (ΔT = 2 K, Δln p = 0.025, from 273.2 K to 473.2 K and 1 kPa to 10 MPa) is used only
    where all sixteen nodes of the stencil lie at pressures of at least twice the saturation
    pressure of water (where f bends sharply towards 1 as the air becomes nearly pure steam)
    and above the triple point (where CoolProp's factor switches from ice to liquid water and
    jumps by 2e-4); elsewhere the exact factor is returned. Measured against the exact factor
    at random points of the grid's domain: largest error in ln f 8e-9 (tests/test_moist_enhancement_table.py
    checks 1e-7), far below the factor's own uncertainty.

    Examples
    --------
    >>> table = EnhancementTable()
    >>> f = table(300.0, 8.0e5)
    >>> abs(f / table.exact(300.0, 8.0e5) - 1.0) < 1e-7
    True

    References
    ----------
    .. [1] L. Herrmann, W. Kretzschmar, S. Zhang, "Determination of Thermodynamic and
       Transport Properties of Humid Air for Power-Cycle Calculations", ASHRAE RP-1485, 2009.
    .. [2] I. H. Bell, J. Wronski, S. Quoilin, V. Lemort, "Pure and Pseudo-pure Fluid
       Thermophysical Property Evaluation and the Open-Source Thermophysical Property Library
       CoolProp", Ind. Eng. Chem. Res. 53 (2014) 2498–2508.
    .. [3] M. Abramowitz, I. A. Stegun, *Handbook of Mathematical Functions*, Dover, 1965,
       §25.2.13 (four-point Lagrange interpolation).
    """

    def __init__(self, exact=None):
        self.exact = exact or (lambda T, p: cpa.humid_air_coefficient("f", T, p))
        self._nodes: dict[tuple[int, int], float] = {}
        self._cells: dict[tuple[int, int], tuple | None] = {}  # stencil values, None outside the grid

    @property
    def nodes_computed(self) -> int:
        """How many grid nodes have been evaluated exactly so far."""
        return len(self._nodes)

    def _node(self, i: int, j: int) -> float:
        key = (i, j)
        v = self._nodes.get(key)
        if v is None:
            v = self._nodes[key] = math.log(self.exact(T_FIRST + i * T_STEP, math.exp(_LN_P_FIRST + j * LN_P_STEP)))
        return v

    def _cell(self, i: int, j: int) -> tuple | None:
        """ln f at the 4 × 4 stencil of cell (i, j), rows in T; None if the cell is outside the grid."""
        if i < 1 or i + 2 > _I_LAST or j < 1 or _LN_P_FIRST + (j + 2) * LN_P_STEP > math.log(_P_MAX):
            cell = None
        elif math.exp(_LN_P_FIRST + (j - 1) * LN_P_STEP) < _SATURATION_MARGIN * saturation_pressure(
                T_FIRST + (i + 2) * T_STEP):
            cell = None
        else:
            cell = tuple(tuple(self._node(i + a, j + b) for b in (-1, 0, 1, 2)) for a in (-1, 0, 1, 2))
        self._cells[(i, j)] = cell
        return cell

    def _ice_cell(self, i: int, j: int) -> tuple | None:
        """ln f at the 4 × 4 stencil over ice whose first T node is i (0 … _ICE_I_LAST − 3)."""
        key = ("ice", i, j)
        cell = self._cells.get(key, False)
        if cell is False:
            if j < 1 or _LN_P_FIRST + (j + 2) * LN_P_STEP > math.log(_P_MAX):
                cell = None
            else:
                cell = tuple(tuple(self._node_at(ICE_FIRST + (i + a) * T_STEP, j + b) for b in (-1, 0, 1, 2))
                             for a in range(4))
            self._cells[key] = cell
        return cell

    def _node_at(self, T: float, j: int) -> float:
        key = (T, j)
        v = self._nodes.get(key)
        if v is None:
            v = self._nodes[key] = math.log(self.exact(T, math.exp(_LN_P_FIRST + j * LN_P_STEP)))
        return v

    def _over_ice(self, T: float, P: float) -> float:
        """f over ice (ICE_FIRST ≤ T ≤ ICE_LAST), the stencil kept inside the ice grid."""
        x = (T - ICE_FIRST) / T_STEP
        y = (math.log(P) - _LN_P_FIRST) / LN_P_STEP
        j = math.floor(y)
        first = min(max(math.floor(x) - 1, 0), _ICE_I_LAST - 3)
        cell = self._ice_cell(first, j)
        if cell is None:
            return self.exact(T, P)
        u0, u1, u2, u3 = _weights(y - j)
        ln_f = 0.0
        for w, (r0, r1, r2, r3) in zip(_weights(x - first - 1.0), cell):
            ln_f += w * (u0 * r0 + u1 * r1 + u2 * r2 + u3 * r3)
        return math.exp(ln_f)

    def __call__(self, T: float, P: float) -> float:
        """Enhancement factor f [-] at T [K], P [Pa] (interpolated where the grid allows)."""
        if ICE_FIRST <= T <= ICE_LAST:
            return self._over_ice(T, P)
        x = (T - T_FIRST) / T_STEP
        y = (math.log(P) - _LN_P_FIRST) / LN_P_STEP
        i, j = math.floor(x), math.floor(y)
        cell = self._cells.get((i, j), False)
        if cell is False:
            cell = self._cell(i, j)
        if cell is None:
            return self.exact(T, P)
        u0, u1, u2, u3 = _weights(y - j)
        ln_f = 0.0
        for w, (r0, r1, r2, r3) in zip(_weights(x - i), cell):
            ln_f += w * (u0 * r0 + u1 * r1 + u2 * r2 + u3 * r3)
        return math.exp(ln_f)
