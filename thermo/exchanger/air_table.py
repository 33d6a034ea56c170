r"""Ambient air as a coolant, its RP-1485 properties interpolated in a lazily filled table (fast path) [1]_ [2]_.

An air-cooled cooler's fan air is humid air at the site pressure and humidity ratio
(:class:`stagewright.core.exchanger.coolant._AmbientAir`, CoolProp ``HAPropsSI``, 60–100 µs a call).
Rating such a cooler at fixed UA sizes it several times, and each sizing finds the coolant
outlet from its enthalpy: a year of 8760 hours asked ``HAPropsSI`` about half a million times.
On the fast property path of trial solves (year bins) the coolant's properties come instead
from a table per site pressure, on a grid in temperature and humidity ratio whose nodes are
computed exactly (``HAPropsSI``) the first time they are needed and then kept for the life of
the process. Interpolated are the smooth per-kg-dry-air quantities

.. math::

    H(T, W) = (1 + W)\,h_{ha}, \qquad V(T, W) = (1 + W)\,v_{ha}, \qquad
    \Delta S(T, W) = (1 + W)\,[s_{ha}(T, W) - s_{ha}(T_\mathrm{ref}, W)]

(nearly straight in W; the entropy of mixing, which goes like :math:`W \ln W`, cancels in
:math:`\Delta S`), by tensor-product cubic Lagrange interpolation [3]_ on four equally spaced
nodes in each direction; :math:`s_{ha}(T_\mathrm{ref}, W)` is one exact call per humidity ratio.

Measured against ``HAPropsSI`` (tests/test_coolant.py) at 98.5 kPa, an ambient of 223.15 K to
318.15 K at 0–100 % RH giving W, the coolant from that ambient up to 80 K warmer and near 573 K:
enthalpy within 2e-5 J/kg, entropy within 1e-6 J/(kg K), density within 3e-11 relative (a
coolant outlet within about 1e-8 K of the exact one). States far below their own dew point
(W = 0.05 at 225 K, never an ambient's) interpolate less well (5e-3 J/kg). Only the fast property path uses the table;
every exact solve calls ``HAPropsSI``.

References
----------
.. [1] ASHRAE, *RP-1485: Thermodynamic properties of real moist air, dry air, steam, water,
   and ice*, S. Herrmann, H.-J. Kretzschmar, D. P. Gatley, 2009.
.. [2] I. H. Bell, J. Wronski, S. Quoilin, V. Lemort, Ind. Eng. Chem. Res. 53 (2014)
   2498–2508 (CoolProp, its humid-air routines ``HAPropsSI``).
.. [3] M. Abramowitz, I. A. Stegun, *Handbook of Mathematical Functions*, Dover, 1965,
   eq. 25.2.13 (four-point Lagrange interpolation).
"""
from __future__ import annotations

__all__ = ["HumidAirTable", "TabulatedAmbientAir", "table_for", "T_STEP", "W_STEP", "T_FIRST", "T_LAST"]

import math
import threading

from stagewright.core import coolprop_adapter as cpa

T_STEP = 2.0  #: grid step in temperature, [K]
W_STEP = 0.0025  #: grid step in humidity ratio, [kg/kg dry air]
T_FIRST = 223.15  #: first grid temperature, [K] (the site range's lowest ambient)
T_LAST = 573.15  #: last grid temperature, [K] (the air coolant's upper limit)
W_LAST = 0.1  #: last grid humidity ratio, [kg/kg]; above it the exact properties are returned
T_REF = 293.15  #: reference temperature of the tabulated entropy difference, [K]
_I_LAST = int(round((T_LAST - T_FIRST) / T_STEP))
_J_LAST = int(round(W_LAST / W_STEP))


def _weights(t: float) -> tuple:
    """Cubic Lagrange weights of the nodes −1, 0, 1, 2 at position t (in node steps from node 0)."""
    tm1, tm2, tp1 = t - 1.0, t - 2.0, t + 1.0
    return (-t * tm1 * tm2 / 6.0, tp1 * tm1 * tm2 / 2.0, -tp1 * t * tm2 / 2.0, tp1 * t * tm1 / 6.0)


def _stencil(x: float, step: float, last: int) -> tuple:
    """First node of the four-node stencil around ``x`` (kept inside 0 … last) and the position t."""
    k = int(math.floor(x / step))
    first = min(max(k - 1, 0), last - 3)
    return first, x / step - (first + 1)


class HumidAirTable:
    """H, V and ΔS of humid air at one pressure on a lazily filled (T, W) grid (see the module).

    Parameters
    ----------
    pressure : float
        Total pressure, [Pa].
    exact : callable, optional
        ``(output, T, P, W) -> value``, the exact property (default CoolProp's ``HAPropsSI``).
    """

    def __init__(self, pressure: float, exact=None):
        self.P = pressure
        self._exact = exact or (lambda name, T, P, W: cpa.humid_air_property(name, "T", T, "P", P, "W", W))
        self._nodes: dict = {}
        self._s_ref: dict = {}
        self._lock = threading.Lock()

    def covers(self, T: float, W: float) -> bool:
        """Whether (T, W) lies inside the grid (else the caller takes the exact property)."""
        return T_FIRST <= T <= T_LAST and 0.0 <= W <= W_LAST

    def s_ref(self, W: float) -> float:
        """Exact s_ha at T_REF and W, [J/(kg humid air K)] (kept per W)."""
        v = self._s_ref.get(W)
        if v is None:
            if len(self._s_ref) > 4096:
                self._s_ref.clear()
            v = self._s_ref[W] = self._exact("Sha", T_REF, self.P, W)
        return v

    def _node(self, i: int, j: int) -> tuple:
        key = (i, j)
        v = self._nodes.get(key)
        if v is None:
            T, W = T_FIRST + i * T_STEP, j * W_STEP
            f = 1.0 + W
            v = (f * self._exact("Hha", T, self.P, W), f * self._exact("Vha", T, self.P, W),
                 f * (self._exact("Sha", T, self.P, W) - self.s_ref(W)))
            with self._lock:
                self._nodes[key] = v
        return v

    def column(self, i: int, W: float, stencil: tuple | None = None) -> tuple:
        """(H, V, ΔS) per kg dry air at grid temperature i, interpolated in W (inside :meth:`covers`);
        ``stencil``: ``(j0, weights)`` of W from :meth:`w_stencil` when the caller keeps it."""
        j0, (u0, u1, u2, u3) = stencil or self.w_stencil(W)
        node = self._node
        a, b, c, d = node(i, j0), node(i, j0 + 1), node(i, j0 + 2), node(i, j0 + 3)
        return (u0 * a[0] + u1 * b[0] + u2 * c[0] + u3 * d[0], u0 * a[1] + u1 * b[1] + u2 * c[1] + u3 * d[1],
                u0 * a[2] + u1 * b[2] + u2 * c[2] + u3 * d[2])

    @staticmethod
    def w_stencil(W: float) -> tuple:
        """First W node of the four around ``W`` and their weights (the same for every grid temperature)."""
        j0, u = _stencil(W, W_STEP, _J_LAST)
        return j0, _weights(u)

    def per_dry_kg(self, T: float, W: float, which: int) -> float:
        """Interpolated H (which=0), V (1) or ΔS (2) per kg dry air at (T, W); inside :meth:`covers`."""
        i0, t = _stencil(T - T_FIRST, T_STEP, _I_LAST)
        wt = _weights(t)
        return sum(wt[a] * self.column(i0 + a, W)[which] for a in range(4))


_TABLES: dict = {}


def table_for(pressure: float) -> HumidAirTable:
    """The process's table at ``pressure`` (one per site pressure; nodes kept for the process's life)."""
    table = _TABLES.get(pressure)
    if table is None:
        if len(_TABLES) > 16:
            _TABLES.clear()
        table = _TABLES[pressure] = HumidAirTable(pressure)
    return table


class TabulatedAmbientAir:
    """Ambient air at the site pressure and humidity ratio (per kg of humid air), from :class:`HumidAirTable`.

    The same coolant as :class:`stagewright.core.exchanger.coolant._AmbientAir` (kind, label, range),
    its enthalpy, entropy and density interpolated; outside the grid the exact ``HAPropsSI`` value.
    """

    kind = "air"

    def __init__(self, pressure: float, humidity_ratio: float, table: HumidAirTable | None = None):
        self.label = "ambient air"
        self.P, self.W = pressure, humidity_ratio
        self.t_min, self.t_max = 223.15, 573.15
        self._table = table or table_for(pressure)
        self._f = 1.0 + humidity_ratio
        self._w_stencil = HumidAirTable.w_stencil(humidity_ratio) if 0.0 <= humidity_ratio <= W_LAST else None
        self._columns: dict = {}
        self._memo: dict = {}

    def _exact(self, name: str, T: float) -> float:
        return cpa.humid_air_property(name, "T", T, "P", self.P, "W", self.W)

    def _interpolated(self, T: float, which: int) -> float:
        # W is fixed for this coolant: each grid temperature's W-interpolation is done once
        i0, t = _stencil(T - T_FIRST, T_STEP, _I_LAST)
        wt = _weights(t)
        cols = self._columns
        total = 0.0
        for a in range(4):
            col = cols.get(i0 + a)
            if col is None:
                col = cols[i0 + a] = self._table.column(i0 + a, self.W, self._w_stencil)
            total += wt[a] * col[which]
        return total

    def _prop(self, which: int, T: float) -> float:
        # a rating sizes the exchanger several times at the same coolant inlet (and limit): keep the answers
        key = (which, T)
        value = self._memo.get(key)
        if value is None:
            if len(self._memo) > 256:
                self._memo.clear()
            if not self._table.covers(T, self.W):
                value = self._exact(("Hha", "Vha", "Sha")[which], T)
                value = 1.0 / value if which == 1 else value
            elif which == 0:
                value = self._interpolated(T, 0) / self._f
            elif which == 1:
                value = self._f / self._interpolated(T, 1)
            else:
                value = self._interpolated(T, 2) / self._f + self._table.s_ref(self.W)
            self._memo[key] = value
        return value

    def h(self, T: float) -> float:
        return self._prop(0, T)

    def s(self, T: float) -> float:
        return self._prop(2, T)

    def rho(self, T: float) -> float:
        return self._prop(1, T)

    def entropy_change(self, t_from: float, t_to: float) -> float:
        """s(t_to) − s(t_from) [J/(kg K)] without the exact reference entropy s_ref(W), which cancels
        (one ``HAPropsSI`` call fewer per coolant; outside the grid, the exact difference)."""
        table, W = self._table, self.W
        if not (table.covers(t_from, W) and table.covers(t_to, W)):
            return self.s(t_to) - self.s(t_from)
        return (self._interpolated(t_to, 2) - self._interpolated(t_from, 2)) / self._f
