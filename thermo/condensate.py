"""Water that condenses in a cooler: latent and sensible duty, the separator, condensate volume [1]_ [2]_."""
from __future__ import annotations

__all__ = ["Condensation", "condensation", "condensate_volume_L_h", "cooling_line", "line_dew_point"]

import math
from dataclasses import dataclass

from thermo import coolprop_adapter as cpa
from thermo.roots import bracketed_root
from thermo.models.base import Point
from thermo.saturation import dew_point_from_vapour_pressure


@dataclass(frozen=True)
class Condensation:
    """Water balance of one cooler and its separator (SI units; mass flows in kg/s)."""

    condensate_kg_s: float  #: water vapour condensed in the cooler
    latent_duty_W: float  #: part of the duty released by that condensation
    sensible_duty_W: float  #: part of the duty that cools the stream without phase change
    liquid_kg_s: float  #: liquid water at the cooler outlet (condensed plus any carried in)
    drained_kg_s: float  #: liquid removed by the separator
    carry_over_kg_s: float  #: liquid that the separator lets through to the next stage
    condensate_L_h: float  #: volume flow of the drained condensate at outlet T and p, [L/h]
    liquid_enthalpy_J_kg: float  #: specific enthalpy of the condensate, [J/kg]
    liquid_entropy_J_kgK: float  #: specific entropy of the condensate, [J/(kg K)]
    after: Point  #: the stream leaving the separator
    water_after: float  #: total water per dry air after the separator, [kg/kg]


def condensation(model, inlet: Point, outlet: Point, duty_W: float, mass_flow: float,
                 separator_efficiency: float) -> Condensation:
    r"""Split a cooler's duty into sensible and latent parts and pass the outlet through the separator [1]_ [2]_.

    The sensible part cools the inlet mixture, its phases frozen, to the outlet temperature
    and pressure; the latent part is the condensation at the outlet:

    .. math::

        \dot Q_\mathrm{lat} = \dot m_a\,[h(T_2, p_2; w_{v1}, w_{l1}) - h_2], \qquad
        \dot Q_\mathrm{sens} = \dot Q - \dot Q_\mathrm{lat}, \qquad
        \dot m_\mathrm{cond} = \dot m_a (w_{v1} - w_{v2})

    The separator removes the fraction :math:`\eta_\mathrm{sep}` of the liquid at the
    outlet; the rest is carried over. Separation of phases that are in equilibrium at one
    temperature and pressure generates no entropy.

    Parameters
    ----------
    model : MoistAir
        Stream model of the cooler (its total water).
    inlet, outlet : Point
        Cooler inlet and outlet (equilibrium) states.
    duty_W : float
        Heat rejected by the cooler, [W].
    mass_flow : float
        Dry-air mass flow, [kg/s].
    separator_efficiency : float
        Fraction of the liquid removed, [-].

    Returns
    -------
    Condensation

    References
    ----------
    .. [1] ASHRAE Handbook — Fundamentals, 2017, ch. 1, §"Psychrometric processes"
       (cooling with dehumidification: sensible and latent heat).
    .. [2] Y. A. Çengel, M. A. Boles, *Thermodynamics: An Engineering Approach*, 8th ed.,
       McGraw-Hill, 2015, §14-7 (dehumidification by cooling).
    """
    h_frozen, _ = model.gas_only(outlet.T, outlet.P, inlet.w, inlet.wl)
    latent = mass_flow * (h_frozen - outlet.h)
    condensed = mass_flow * (inlet.w - outlet.w)
    liquid = mass_flow * outlet.wl
    if outlet.wl > 0.0:
        h_l, s_l = model.mixture.liquid(outlet.T, outlet.P)
    else:
        h_l = s_l = 0.0
    removed = separator_efficiency * outlet.wl
    after = Point(outlet.T, outlet.P, outlet.h - removed * h_l, outlet.s - removed * s_l, outlet.rho,
                  outlet.w, outlet.wl - removed)
    drained = mass_flow * removed
    return Condensation(
        condensate_kg_s=condensed, latent_duty_W=latent, sensible_duty_W=duty_W - latent, liquid_kg_s=liquid,
        drained_kg_s=drained, carry_over_kg_s=liquid - drained,
        condensate_L_h=condensate_volume_L_h(drained, outlet.T, outlet.P),
        liquid_enthalpy_J_kg=h_l, liquid_entropy_J_kgK=s_l, after=after, water_after=model.water - removed)


def condensate_volume_L_h(mass_kg_s: float, T: float, P: float) -> float:
    """Volume flow [L/h] of liquid water flowing at ``mass_kg_s`` [kg/s], density of IAPWS-95 at T [K], P [Pa]."""
    if mass_kg_s == 0.0:
        return 0.0
    return mass_kg_s / cpa.liquid_water_density(T, P) * 1000.0 * 3600.0


def line_dew_point(model, t_in: float, t_out: float, p_at, tol: float = 1e-11):
    r"""Temperature at which a cooling line p(T) reaches the dew point of the stream, [K], or None.

    Solves :math:`T = g(T) = T_{ws}\!\left(x_w\,p(T) / f(T, p(T))\right)`, with
    :math:`T_{ws}` the IAPWS-IF97 backward saturation-temperature equation [1]_ and f the
    enhancement factor of the mixture (1 for the ideal mixtures), by one fixed-point step
    and then secant steps on :math:`g(T) - T` [2]_. g contracts by about
    :math:`|d\ln(p/f)/dT| / (d\ln p_{ws}/dT)`, of order 1e-2 for a cooler's pressure drop,
    so the secant steps converge in three or four evaluations of f; a bracketing search
    would take ten or more.

    Parameters
    ----------
    model : MoistAir
        Stream model (its total water is the vapour content that saturates).
    t_in, t_out : float
        Cooler inlet and outlet temperatures, [K]; the dew point lies between them.
    p_at : callable
        Pressure [Pa] along the line as a function of temperature [K].
    tol : float
        Convergence tolerance on T, [K].

    Returns
    -------
    float or None
        The dew point on the line, or None if the iteration does not settle inside
        [t_out, t_in] within 40 steps (the caller then brackets the root).

    Examples
    --------
    >>> from thermo.models.ideal_gas import IdealGasAir
    >>> from thermo.humid import MoistAir
    >>> from thermo.train import mixture_for
    >>> m = MoistAir(mixture_for(IdealGasAir()), 0.01)
    >>> round(line_dew_point(m, 400.0, 300.0, lambda T: 5e5), 2)
    314.45

    References
    ----------
    .. [1] IAPWS, *Revised Release on the IAPWS Industrial Formulation 1997 for the
       Thermodynamic Properties of Water and Steam*, 2007, eq. (31).
    .. [2] K. E. Atkinson, *An Introduction to Numerical Analysis*, 2nd ed., Wiley, 1989, §2.3.
    """
    mixture = model.mixture
    x_w = model.water / (mixture.epsilon + model.water)

    def g(T: float) -> float:
        p = p_at(T)
        return dew_point_from_vapour_pressure(x_w * p / mixture.enhancement(T, p))
    T_prev, h_prev = t_out, g(t_out) - t_out
    T = T_prev + h_prev
    for _ in range(40):
        h = g(T) - T
        if abs(h) < tol:
            T += h
            return T if t_out <= T <= t_in else None
        if h == h_prev:
            return None
        T, T_prev, h_prev = T - h * (T - T_prev) / (h - h_prev), T, h  # secant on g(T) − T = 0
    return None


def cooling_line(model, inlet: Point, t_out: float, p_out: float, where: str, points: int = 8) -> list[Point]:
    """States along a cooler's line (p linear in T), with the point where condensation starts.

    Parameters
    ----------
    model : MoistAir
        Stream model of the cooler.
    inlet : Point
        Cooler inlet.
    t_out, p_out : float
        Outlet temperature [K] and pressure [Pa].
    where : str
        Context for error messages.
    points : int
        Number of segments of the line.

    Returns
    -------
    list of Point
        From the inlet to the outlet; when the line crosses the dew point, that point is
        included and the condensing part gets at least half the segments, so the chart shows
        where the cooling line bends (entropy falls faster once latent heat is removed).
    """
    t_in, p_in = inlet.T, inlet.P

    def p_at(T: float) -> float:
        return p_in if t_in == t_out else p_out + (T - t_out) / (t_in - t_out) * (p_in - p_out)

    def excess(T: float) -> float:
        return model.water - model.mixture.saturation_ratio(T, p_at(T))

    temps = [t_in + k / points * (t_out - t_in) for k in range(1, points)]
    if inlet.wl == 0.0 and t_in > t_out and excess(t_out) > 0.0 and excess(t_in) < 0.0:
        t_dew = line_dew_point(model, t_in, t_out, p_at)
        if t_dew is None:
            t_dew = bracketed_root(excess, t_out, t_in, xtol=1e-12)
        n_cond = max(points // 2, math.ceil(points * (t_dew - t_out) / (t_in - t_out)))
        n_sens = max(1, points - n_cond)
        temps = ([t_in + k / n_sens * (t_dew - t_in) for k in range(1, n_sens + 1)]
                 + [t_dew + k / n_cond * (t_out - t_dew) for k in range(1, n_cond)])
    return [inlet] + [model.at_tp(T, p_at(T), f"{where} cooling line") for T in temps]
