"""Ideal-gas air with temperature-dependent specific heat, tabulated once [1]_ [2]_."""
from __future__ import annotations

__all__ = ["IdealGasAir"]

import math
from bisect import bisect_right

from stagewright.core import coolprop_adapter as cpa
from stagewright.core.models.base import T_MAX, T_MIN, Point, check_range
from stagewright.core.models.newton import invert_temperature

_P_REF = 101_325.0  # reference pressure of s°(T), [Pa]
_STEP_K = 2.0


class IdealGasAir:
    r"""Air as an ideal gas whose cp depends on temperature only [1]_ [2]_.

    .. math::

        h = h(T), \qquad s = s^\circ(T) - R \ln (p / p_\mathrm{ref}), \qquad
        s_2 - s_1 = s^\circ(T_2) - s^\circ(T_1) - R \ln(p_2 / p_1)

    Notes
    -----
    h(T) and s°(T) are those of the ideal-gas part of the Lemmon et al. (2000) air
    equation of state, evaluated through CoolProp at nodes every 2 K from 200 K to 1300 K
    together with their exact derivatives (cp and cp/T), and interpolated between nodes by
    cubic Hermite polynomials: interpolation error below 1e-9 relative. The gas constant
    is CoolProp's for its air mixture (M = 28.96546 g/mol). Against Keenan & Kaye's gas
    tables the enthalpy differences agree within about 0.1 %.

    Examples
    --------
    >>> m = IdealGasAir()
    >>> round(m.at_tp(500.0, 1e5).h - m.at_tp(300.0, 1e5).h)
    202920

    References
    ----------
    .. [1] E. W. Lemmon et al., J. Phys. Chem. Ref. Data 29 (2000) 331–385, ideal-gas
       Helmholtz energy of air.
    .. [2] Y. A. Çengel, M. A. Boles, *Thermodynamics: An Engineering Approach*, 8th ed.,
       McGraw-Hill, 2015, §7-9 (entropy change of ideal gases with variable specific heats).
    """

    name = "ideal_gas"
    _table = None

    def __init__(self) -> None:
        if IdealGasAir._table is None:
            IdealGasAir._table = _build_table()
        self._T, self._h, self._cp, self._s0, self._cp_T = IdealGasAir._table
        st = cpa.new_air_state()
        self.gas_constant = st.gas_constant() / st.molar_mass()
        self.molar_mass = st.molar_mass()

    def _hermite(self, T: float, values, slopes):
        i = min(max(bisect_right(self._T, T) - 1, 0), len(self._T) - 2)
        T0, dT = self._T[i], self._T[i + 1] - self._T[i]
        t = (T - T0) / dT
        t2, t3 = t * t, t * t * t
        y0, y1, m0, m1 = values[i], values[i + 1], slopes[i] * dT, slopes[i + 1] * dT
        val = (2 * t3 - 3 * t2 + 1) * y0 + (t3 - 2 * t2 + t) * m0 + (-2 * t3 + 3 * t2) * y1 + (t3 - t2) * m1
        der = ((6 * t2 - 6 * t) * y0 + (3 * t2 - 4 * t + 1) * m0 + (-6 * t2 + 6 * t) * y1
               + (3 * t2 - 2 * t) * m1) / dT
        return val, der

    def enthalpy(self, T: float) -> float:
        """h(T), [J/kg]."""
        return self._hermite(T, self._h, self._cp)[0]

    def cp(self, T: float) -> float:
        """Isobaric specific heat cp(T), [J/(kg K)]."""
        return self._hermite(T, self._h, self._cp)[1]

    def s_standard(self, T: float) -> float:
        """s°(T) at the reference pressure 101 325 Pa, [J/(kg K)]."""
        return self._s_and_slope(T)[0]

    def _s_and_slope(self, T: float):
        return self._hermite(T, self._s0, self._cp_T)

    def at_tp(self, T: float, P: float, where: str = "") -> Point:
        check_range(T, P, where)
        s = self._s_and_slope(T)[0] - self.gas_constant * math.log(P / _P_REF)
        return Point(T, P, self.enthalpy(T), s, P / (self.gas_constant * T))

    def at_hp(self, h: float, P: float, where: str = "", T_guess: float = 300.0) -> Point:
        T = invert_temperature(lambda t: self._hermite(t, self._h, self._cp), h, T_guess, where, "enthalpy")
        return self.at_tp(T, P, where)

    def at_sp(self, s: float, P: float, where: str = "", T_guess: float = 300.0) -> Point:
        target = s + self.gas_constant * math.log(P / _P_REF)
        T = invert_temperature(self._s_and_slope, target, T_guess, where, "entropy")
        return self.at_tp(T, P, where)

    def terms(self, T: float, P: float, slope: bool = True) -> tuple:
        """h, s, v, cp and (∂h/∂p)_T (zero for an ideal gas) at T [K], P [Pa]."""
        h, cp = self._hermite(T, self._h, self._cp)
        s = self._s_and_slope(T)[0] - self.gas_constant * math.log(P / _P_REF)
        return h, s, self.gas_constant * T / P, cp, 0.0

    def polytropic_slope(self, T: float, P: float, efficiency: float) -> float:
        check_range(T, P, "polytropic path")
        return self.gas_constant * T / (self.cp(T) * efficiency)


def _build_table():
    st = cpa.new_air_state()
    R = st.gas_constant() / st.molar_mass()
    n = int(round((T_MAX - T_MIN) / _STEP_K)) + 1
    Ts, hs, cps, s0s = [], [], [], []
    for k in range(n):
        T = T_MIN + k * _STEP_K
        rho = _P_REF / (R * T)  # ideal-gas density at p_ref, so s_idealgas is s°(T)
        st.update(cpa.DmassT_INPUTS, rho, T)
        Ts.append(T)
        hs.append(st.hmass_idealgas())
        cps.append(st.cp0mass())
        s0s.append(st.smass_idealgas())
    return Ts, hs, cps, s0s, [c / t for c, t in zip(cps, Ts)]
