"""Perfect gas with constant specific heats (the "cold-air-standard" model) [1]_."""
from __future__ import annotations

__all__ = ["ConstantCpAir"]

import math

from stagewright.core.models.base import Point, check_range

_T_REF, _P_REF = 298.15, 101_325.0


class ConstantCpAir:
    r"""Air as a perfect gas with constant cp and ratio of specific heats k [1]_.

    .. math::

        R = c_p \frac{k - 1}{k}, \quad h = c_p (T - T_\mathrm{ref}), \quad
        s = c_p \ln\frac{T}{T_\mathrm{ref}} - R \ln\frac{p}{p_\mathrm{ref}}

    Parameters
    ----------
    cp : float
        Isobaric specific heat, [J/(kg K)] (default 1005).
    k : float
        Ratio of specific heats cp/cv, [-] (default 1.4).

    Notes
    -----
    Reference state of h and s: 298.15 K, 101 325 Pa. All inversions are closed form.

    Examples
    --------
    >>> m = ConstantCpAir()
    >>> round(m.at_sp(m.at_tp(300.0, 1e5).s, 4e5).T, 3)
    445.798

    References
    ----------
    .. [1] Y. A. Çengel, M. A. Boles, *Thermodynamics: An Engineering Approach*, 8th ed.,
       McGraw-Hill, 2015, §7-9 and §7-12 (isentropic relations of ideal gases).
    """

    name = "constant_cp"

    def __init__(self, cp: float = 1005.0, k: float = 1.4) -> None:
        self.cp = cp
        self.k = k
        self.gas_constant = cp * (k - 1.0) / k

    def at_tp(self, T: float, P: float, where: str = "") -> Point:
        check_range(T, P, where)
        s = self.cp * math.log(T / _T_REF) - self.gas_constant * math.log(P / _P_REF)
        return Point(T, P, self.cp * (T - _T_REF), s, P / (self.gas_constant * T))

    def at_hp(self, h: float, P: float, where: str = "", T_guess: float = 300.0) -> Point:
        return self.at_tp(_T_REF + h / self.cp, P, where)

    def at_sp(self, s: float, P: float, where: str = "", T_guess: float = 300.0) -> Point:
        T = _T_REF * math.exp((s + self.gas_constant * math.log(P / _P_REF)) / self.cp)
        return self.at_tp(T, P, where)

    def terms(self, T: float, P: float, slope: bool = True) -> tuple:
        """h, s, v, cp and (∂h/∂p)_T (zero for a perfect gas) at T [K], P [Pa]."""
        s = self.cp * math.log(T / _T_REF) - self.gas_constant * math.log(P / _P_REF)
        return self.cp * (T - _T_REF), s, self.gas_constant * T / P, self.cp, 0.0

    def polytropic_slope(self, T: float, P: float, efficiency: float) -> float:
        return self.gas_constant * T / (self.cp * efficiency)
