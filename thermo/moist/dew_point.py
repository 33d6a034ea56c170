r"""The dew (or frost) point of moist air: the one routine every caller uses.

A stream of vapour content W (kg water per kg dry air) saturates where its vapour
partial pressure equals the enhanced saturation pressure, at a fixed pressure or along a
line p(T) such as a cooler's:

.. math:: x_w\,p(T_d) = f\big(T_d, p(T_d)\big)\,p_{ws}(T_d), \qquad x_w = \frac{W}{\varepsilon + W}

Callers: the mixture's psychrometric dew point (delivered pressure and atmospheric dew
points), a cooler's dry/wet zone split, and the point where a cooling line starts to
condense.
"""
from __future__ import annotations

__all__ = ["dew_point"]

from collections.abc import Callable

from stagewright.core.moist.saturation import dew_point_from_vapour_pressure
from stagewright.core.roots import bracketed_root

_MAX_STEPS = 40


def dew_point(mixture, water: float, pressure: float | Callable[[float], float],
              t_low: float | None = None, t_high: float | None = None, tol: float = 1e-11) -> float | None:
    r"""Temperature at which vapour content ``water`` saturates, [K] [1]_ [2]_ [3]_.

    Solves :math:`T = g(T) = T_{ws}\!\left(x_w\,p(T) / f(T, p(T))\right)`, with
    :math:`T_{ws}` the IAPWS-IF97 backward saturation-temperature equation (the IAPWS
    2011 sublimation line below 273.16 K) and f the mixture's enhancement factor (1 for the
    ideal mixtures), by one fixed-point step and then secant steps on :math:`g(T) - T`
    [4]_. g contracts by about :math:`|d\ln(p/f)/dT| / (d\ln p_{ws}/dT)`, of order 1e-2, so
    three or four evaluations of f suffice; for an ideal mixture at a fixed pressure the
    first step is exact. Should the steps not settle, a bracketing search on
    :math:`W - w_s(T, p(T))` between the bounds finds the root.

    Parameters
    ----------
    mixture : MoistMixture
        The mixture law (ε, enhancement factor, saturation ratio).
    water : float
        Vapour content that saturates, [kg/kg dry air].
    pressure : float or callable
        Total pressure, [Pa], or the pressure along a line as a function of T [K] → [Pa].
    t_low, t_high : float, optional
        Bounds, [K]: a dew point outside [t_low, t_high] gives None. A pressure line needs
        ``t_low`` (the search starts there).
    tol : float
        Convergence tolerance on T, [K].

    Returns
    -------
    float or None
        The dew point (frost point below the triple point), [K]; None for dry air or when it
        lies outside the bounds.

    Examples
    --------
    >>> from stagewright.core.models.ideal_gas import IdealGasAir
    >>> from stagewright.core.solve_context import mixture_for
    >>> mix = mixture_for(IdealGasAir())
    >>> round(dew_point(mix, 0.01, 5e5), 2)
    314.45
    >>> round(dew_point(mix, 0.01, lambda T: 5e5, 300.0, 400.0), 2)
    314.45
    >>> dew_point(mix, 0.01, 5e5, 320.0, 400.0) is None
    True

    References
    ----------
    .. [1] IAPWS, *Revised Release on the IAPWS Industrial Formulation 1997 for the
       Thermodynamic Properties of Water and Steam*, 2007, eq. (31).
    .. [2] IAPWS R14-08(2011), *Revised Release on the Pressure along the Melting and
       Sublimation Curves of Ordinary Water Substance*, eq. (6).
    .. [3] S. Herrmann, H.-J. Kretzschmar and D. P. Gatley, "Thermodynamic properties of
       real moist air, dry air, steam, water, and ice (RP-1485)", *HVAC&R Research* 15(5),
       2009, pp. 961–986 (the enhancement factor in the saturation condition).
    .. [4] K. E. Atkinson, *An Introduction to Numerical Analysis*, 2nd ed., Wiley, 1989, §2.3.
    """
    if water <= 0.0:
        return None
    line = callable(pressure)
    p_at = pressure if line else (lambda T, P=float(pressure): P)
    x_w = water / (mixture.epsilon + water)

    def g(T: float) -> float:
        p = p_at(T)
        return dew_point_from_vapour_pressure(x_w * p / mixture.enhancement(T, p))

    if line:
        if t_low is None:
            raise ValueError("a dew point along a pressure line needs t_low, where the search starts")
        T_prev = t_low
    else:
        T_prev = dew_point_from_vapour_pressure(x_w * pressure)
    T = _secant(g, T_prev, tol)
    if T is None and t_low is not None and t_high is not None:
        T = _bracketed(mixture, water, p_at, t_low, t_high)
    if T is None or (t_low is not None and T < t_low) or (t_high is not None and T > t_high):
        return None
    return T


def _secant(g: Callable[[float], float], T_prev: float, tol: float = 1e-11) -> float | None:
    """Fixed point of g from T_prev: one plain step, then secant steps on g(T) − T; None if unsettled."""
    h_prev = g(T_prev) - T_prev
    T = T_prev + h_prev
    if abs(h_prev) < tol:
        return T
    for _ in range(_MAX_STEPS):
        h = g(T) - T
        if abs(h) < tol:
            return T + h
        if h == h_prev:
            return None
        T, T_prev, h_prev = T - h * (T - T_prev) / (h - h_prev), T, h
    return None


def _bracketed(mixture, water: float, p_at, t_low: float, t_high: float) -> float | None:
    """Root of W − w_s(T, p(T)) in [t_low, t_high] by bracketing, or None without a sign change."""
    def excess(T: float) -> float:
        return water - mixture.saturation_ratio(T, p_at(T))
    if not (excess(t_low) > 0.0 > excess(t_high)):
        return None
    return bracketed_root(excess, t_low, t_high, xtol=1e-12)
