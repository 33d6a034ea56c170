r"""Figures of a condensing cooler: the wet zone's enthalpy driving force, the whole exchanger's F, ε, NTU.

:mod:`stagewright.core.exchanger.sizing` splits a condensing cooler into a dry and a wet zone. The dry
zone is an ordinary sensible exchanger with its LMTD and correction factor F ≤ 1. The wet zone
is not: its heat and water move on an enthalpy potential (Braun, Klein & Mitchell 1989), so
its driving force is a log-mean *enthalpy* difference (:func:`enthalpy_driving_force`) and an
LMTD correction factor has no meaning there. :func:`overall_figures` gives the whole
exchanger's F, ε and NTU from their definitions.
"""
from __future__ import annotations

__all__ = ["enthalpy_driving_force", "overall_figures"]

from dataclasses import replace
from typing import TYPE_CHECKING

from stagewright.core.exchanger.lmtd import log_mean

if TYPE_CHECKING:  # pragma: no cover - annotations only (sizing imports this module)
    from stagewright.core.exchanger.coolant import CoolantSide
    from stagewright.core.exchanger.sizing import HotSide, Zone


def enthalpy_driving_force(wet: Zone, hot: HotSide) -> Zone:
    r"""The wet zone with its own driving force, the log-mean enthalpy difference [1]_ [2]_ [3]_.

    In a condensing zone heat and water leave the air together, driven (Lewis number one) by
    the difference between the air's enthalpy and that of saturated air at the coolant
    temperature, not by a temperature difference. Counter-current, with the terminal differences

    .. math::

        \Delta h_1 = h_{a,dew} - h_s(T_{c,b}), \qquad \Delta h_2 = h_{a,o} - h_s(T_{c,i}), \qquad
        \Delta h_\mathrm{lm} = \frac{\Delta h_1 - \Delta h_2}{\ln(\Delta h_1/\Delta h_2)}

    (:math:`T_{c,b}` the coolant leaving the zone at the dew-point boundary) the duty of a
    counter-flow zone is :math:`\dot Q = UA^*\,\Delta h_\mathrm{lm}`, the enthalpy form of the
    LMTD relation, with :math:`UA^* = \mathrm{NTU}^* C^*_\min` the zone's enthalpy conductance
    [kg/s] and :math:`h_s` linear over the coolant's range as in
    :func:`stagewright.core.exchanger.sizing.wet_zone`; other arrangements have their own correction on
    that basis. The LMTD correction factor :math:`F = \dot Q/(UA\,\Delta T_\mathrm{lm})` has no
    meaning in such a zone (it comes out above 1, the latent heat not being driven by the
    temperature difference), so the zone's ``correction_factor`` is None.

    Parameters
    ----------
    wet : Zone
        A zone from :func:`stagewright.core.exchanger.sizing.wet_zone`.
    hot : HotSide
        The air side it was sized for (dew point, dry-air flow, equilibrium enthalpy).

    Returns
    -------
    Zone
        ``wet`` with ``log_mean_enthalpy_difference_J_kg`` set, [J/kg dry air], and no F.

    References
    ----------
    .. [1] J. E. Braun, S. A. Klein, J. W. Mitchell, "Effectiveness models for cooling towers
       and cooling coils", ASHRAE Transactions 95(2) (1989) 164–174.
    .. [2] J. L. Threlkeld, *Thermal Environmental Engineering*, 2nd ed., Prentice-Hall, 1970,
       ch. 13 (enthalpy potential, log-mean enthalpy difference of a wet coil).
    .. [3] F. P. Incropera, D. P. DeWitt, T. L. Bergman, A. S. Lavine, *Fundamentals of Heat
       and Mass Transfer*, 6th ed., Wiley, 2007, §11.3, eqs. 11.14–11.15 (the temperature form).
    """
    hs = hot.equilibrium_enthalpy
    h_in = hs(wet.hot_inlet_temperature_K)
    h_out = h_in - wet.duty_W / hot.flow_kg_s
    lmed = log_mean(h_in - hs(wet.coolant_outlet_temperature_K), h_out - hs(wet.coolant_inlet_temperature_K),
                    "enthalpy difference")
    return replace(wet, correction_factor=None, log_mean_enthalpy_difference_J_kg=lmed)


def overall_figures(arrangement: str, hot: HotSide, side: CoolantSide, ua: float) -> tuple:
    r"""F, ε and NTU of a whole condensing exchanger, from their definitions [4]_ [3]_.

    With the mean capacity rates of the terminal changes, :math:`C_h = \dot Q/(T_{h,i} - T_{h,o})`
    (the air's apparent rate, latent heat included) and :math:`C_c = \dot Q/(T_{c,o} - T_{c,i})`,

    .. math::

        \varepsilon = \frac{\dot Q}{C_\min (T_{h,i} - T_{c,i})}, \qquad \mathrm{NTU} = \frac{UA}{C_\min}

    the definitions of effectiveness and number of transfer units with mean specific heats
    (both at most what the terminal temperatures allow: ε < 1 without a temperature cross).
    The arrangement's ε–NTU relation holds zone by zone, not for these overall figures. F is 1
    for counter-flow, by definition of the LMTD method; for other arrangements no single F
    spans a dry and a wet zone, and it is None.

    Parameters
    ----------
    arrangement : str
        A key of :data:`stagewright.core.exchanger.effectiveness.ARRANGEMENTS`.
    hot : HotSide
        The air side: inlet and outlet temperatures and duty.
    side : CoolantSide
        The coolant stream.
    ua : float
        The exchanger's conductance (the zones' sum), [W/K].

    Returns
    -------
    tuple of (float or None, float, float)
        F, ε and NTU.

    References
    ----------
    .. [4] R. K. Shah, D. P. Sekulić, *Fundamentals of Heat Exchanger Design*, Wiley, 2003,
       §3.3 (definitions of ε and NTU) and §3.7 (F of the LMTD method; 1 for counter-flow).

    Examples
    --------
    >>> from types import SimpleNamespace as NS
    >>> f, eps, ntu = overall_figures("counter_flow", NS(duty_W=100.0, inlet_temperature_K=400.0,
    ...     outlet_temperature_K=300.0), NS(inlet_temperature_K=290.0, outlet_temperature_K=300.0), 5.0)
    >>> f, round(eps, 6), ntu  # C_h = 1 W/K is C_min: ε = 100 / (1 · 110)
    (1.0, 0.909091, 5.0)
    """
    q = hot.duty_W
    c_h = q / (hot.inlet_temperature_K - hot.outlet_temperature_K)
    rise = side.outlet_temperature_K - side.inlet_temperature_K
    c_min = min(c_h, q / rise) if rise > 0.0 else c_h
    eps = q / (c_min * (hot.inlet_temperature_K - side.inlet_temperature_K))
    return (1.0 if arrangement == "counter_flow" else None), eps, ua / c_min
