"""Starting splits for the optimiser: the equal split, and the ideal-gas optimum as a hint."""
from __future__ import annotations

__all__ = ["equal_split", "ideal_gas_split"]

import math
from typing import Callable


from stagewright.core.cooler import cooler_outlet_temperature
from stagewright.core.project.delivery import delivery_pressure
from stagewright.core.project.validation import ResolvedSite, resolve_site
from stagewright.core.errors import InputError
from stagewright.core.flow import mass_flow_from
from stagewright.core.models.base import PropertyModel
from stagewright.core.split import delivered_pressure, stage_pressure_ratios
from stagewright.core.study.limits import RATIO_CAP, RatioBounds


def brentq(*args, **kwargs):
    """scipy.optimize.brentq, imported on first use (keeps the window's start-up light)."""
    from scipy.optimize import brentq as _brentq
    return _brentq(*args, **kwargs)


def _meeting(p_in: float, p_delivery: float, drops: list[float], lo: list[float], hi: list[float],
             ratios_at: Callable[[float], list[float]], u_lo: float, u_hi: float) -> list[float] | None:
    """Clipped ratios ``ratios_at(u)`` with the scalar u chosen to meet the delivery pressure."""

    def clipped(u: float) -> list[float]:
        return [min(h, max(l, r)) for r, l, h in zip(ratios_at(u), lo, hi)]

    def miss(u: float) -> float:
        return delivered_pressure(p_in, clipped(u), drops) - p_delivery

    a, b = miss(u_lo), miss(u_hi)
    if a > 0.0 or b < 0.0:
        return None
    if a == 0.0 or b == 0.0:
        return clipped(u_lo if a == 0.0 else u_hi)
    return clipped(brentq(miss, u_lo, u_hi, xtol=1e-14, rtol=1e-14))


def equal_split(p_in: float, p_delivery: float, drops: list[float], bounds: RatioBounds) -> list[float] | None:
    """The equal split of :func:`stagewright.core.split.stage_pressure_ratios`, clipped to the bounds.

    Stages whose bound the equal ratio crosses sit at that bound and the others share
    one ratio that still meets the delivery pressure; None when the bounds cannot.

    Examples
    --------
    >>> from stagewright.core.study.limits import RatioBounds
    >>> b = RatioBounds((1.001, 1.001), (2.0, 40.0), (False, False), (True, False))
    >>> [round(r, 9) for r in equal_split(1e5, 9e5, [0.0, 0.0], b)]
    [2.0, 4.5]
    """
    n = len(drops)
    lo, hi = list(bounds.lo), list(bounds.hi)
    try:
        plain = stage_pressure_ratios(p_in, p_delivery, [None] * n, drops)
    except InputError:  # out of the plain split's range: the clipped search below decides
        plain = None
    if plain is not None and all(l <= r <= h for r, l, h in zip(plain, lo, hi)):
        return plain
    return _meeting(p_in, p_delivery, drops, lo, hi, lambda u: [math.exp(u)] * n, 0.0, math.log(RATIO_CAP))


def _drop_weights(p_in: float, ratios: list[float], drops: list[float], p_delivery: float) -> list[float]:
    """Q_i / p_d with Q_i = p_out,i · Π_{j>i} r_j: the delivery pressure if the cooler drops
    downstream of stage i were absent (equal to 1 for every stage without drops)."""
    out, p = [], p_in
    for i, r in enumerate(ratios):
        p = p * r
        tail = 1.0
        for rj in ratios[i + 1:]:
            tail *= rj
        out.append(p * tail / p_delivery)
        p -= drops[i]
    return out


def ideal_gas_split(doc: dict, model: PropertyModel, p_in: float, bounds: RatioBounds,
                    temperature_caps: bool = True, site: ResolvedSite | None = None) -> list[float] | None:
    r"""Least-work split of ideal-gas stages with the project's coolers, as a start [1]_.

    With stage inlet temperature :math:`T_i` fixed by the cooler before it, stage work
    :math:`w_i = c_p T_i (r_i^{e_i} - 1)/c_i` (isentropic: :math:`e_i = R/c_p`,
    :math:`c_i = \eta_{s,i}\eta_{m,i}`; polytropic: :math:`e_i = R/(c_p\eta_{p,i})`,
    :math:`c_i = \eta_{m,i}`). Setting the derivative of the total work along the
    constraint :math:`p_d(r) = p_\mathrm{discharge}` to zero gives one Lagrange multiplier
    μ for all stages:

    .. math:: \frac{T_i e_i}{c_i} r_i^{e_i} = \mu \frac{Q_i}{p_\mathrm{discharge}},
       \qquad Q_i = r_i \frac{\partial p_d}{\partial r_i} = p_{\mathrm{out},i} \prod_{j>i} r_j,

    solved by fixed-point iteration on :math:`Q_i` (equal to p_discharge for every stage
    without cooler pressure drops). Without drops this is the equal split for identical
    stages with intercooling to the inlet temperature. μ is found so that the ratios,
    clipped to their bounds and, with ``temperature_caps``, to the ratio at which each
    stage reaches its discharge-temperature limit (:math:`T_2 = T_1 (1 + (r^{e} - 1)/\eta_s)`),
    meet the discharge pressure. The ratios are also kept above the ratio at which a stage
    would discharge below its own cooler's outlet temperature (a cooler can only cool).
    Casing heat loss and exit kinetic energy lower the discharge temperature in these
    estimates; the stages' power does not depend on them.

    Parameters
    ----------
    doc : dict
        Normalised design document.
    model : PropertyModel
        Property model (for R and cp at the site).
    p_in : float
        Stage-1 inlet pressure, [Pa].
    bounds : RatioBounds
        Stage-ratio bounds.
    temperature_caps : bool
        Also keep each stage below its discharge-temperature limit where that is possible.
    site : ResolvedSite, optional
        The document's resolved site (ambient temperature [K], barometric pressure [Pa]);
        by default :func:`stagewright.core.project.validation.resolve_site` of ``doc``.

    Returns
    -------
    list of float or None
        Ratios; None when a stage follows another without a cooler, or with one rated from
        its UA (its inlet temperature then depends on the split), or the bounds cannot meet
        the discharge pressure.

    References
    ----------
    .. [1] Y. A. Çengel, M. A. Boles, *Thermodynamics: An Engineering Approach*, 8th ed.,
       McGraw-Hill, 2015, §7-11 (multistage compression with intercooling).
    """
    site = resolve_site(doc) if site is None else site
    stages = doc["stages"]
    T0 = site.ambient_temperature_K
    T_in = [T0]
    for st in stages[:-1]:
        t_out = cooler_outlet_temperature(st["cooler"], T0) if st["cooler"] is not None else None
        if t_out is None:  # no intercooler, or one rated from its UA: inlet depends on the split
            return None
        T_in.append(t_out)
    cp = model.at_tp(T0 + 0.5, p_in).h - model.at_tp(T0 - 0.5, p_in).h
    a = model.gas_constant / cp
    flow = doc["flow"]
    m = mass_flow_from(flow["kind"], flow["value"], model, T0, site.pressure_Pa)
    e, c, lo, hi = [], [], list(bounds.lo), list(bounds.hi)
    for i, st in enumerate(stages):
        eff, eta_m = st["efficiency"], st["mechanical_efficiency"]
        polytropic = eff["kind"] == "polytropic"
        e.append(a / eff["value"] if polytropic else a)
        c.append(eta_m if polytropic else eff["value"] * eta_m)
        # discharge below the adiabatic one by the casing loss and exit kinetic energy, [K]
        shed = (st["heat_loss_W"] / m + 0.5 * st["exit_velocity_m_s"] ** 2) / cp

        def reaching(T_target: float, i=i, eff=eff, polytropic=polytropic, shed=shed) -> float:
            """Ratio at which stage i discharges at T_target (ideal gas)."""
            rise = (T_target + shed) / T_in[i]
            if polytropic:
                return max(1.0, rise) ** (1.0 / e[i])
            return (1.0 + eff["value"] * max(0.0, rise - 1.0)) ** (1.0 / a)
        t_cool = cooler_outlet_temperature(st["cooler"], T0) if st["cooler"] is not None else None
        if t_cool is not None:  # the cooler can only cool: start a little above its outlet
            lo[i] = min(hi[i], max(lo[i], reaching(t_cool + 0.5)))
        t_cap = st.get("max_discharge_temperature_K")
        if temperature_caps and t_cap is not None:
            hi[i] = max(lo[i], min(hi[i], reaching(t_cap)))
    n = len(stages)
    k = [T_in[i] * e[i] / c[i] for i in range(n)]
    drops = [(s["cooler"] or {}).get("pressure_drop_Pa", 0.0) for s in stages]
    p_d = delivery_pressure(doc, site.pressure_Pa)  # stated absolute or gauge
    q = [1.0] * n  # Q_i / p_d: the drops' weight on each stage, updated below

    def ratios_at(u: float) -> list[float]:
        return [(math.exp(u) * q[i] / k[i]) ** (1.0 / e[i]) for i in range(n)]

    u_lo = math.log(min(k[i] / q[i] for i in range(n)))
    u_hi = math.log(max(k[i] * RATIO_CAP ** e[i] for i in range(n)))
    found = None
    for _ in range(30):
        found = _meeting(p_in, p_d, drops, lo, hi, ratios_at, u_lo, u_hi)
        if found is None:
            break
        q_new = _drop_weights(p_in, found, drops, p_d)
        if max(abs(x - y) for x, y in zip(q, q_new)) < 1e-12:
            break
        q = q_new
        u_lo = math.log(min(k[i] / q[i] for i in range(n)))
    if found is None and temperature_caps:
        return ideal_gas_split(doc, model, p_in, bounds, temperature_caps=False, site=site)
    return found
