"""Stage pressure ratios: given per stage, or an equal split that meets the discharge pressure."""
from __future__ import annotations

__all__ = ["stage_pressure_ratios", "delivered_pressure"]

from stagewright.core.errors import InputError, message_detail, quantity
from stagewright.core.roots import bracketed_root


def delivered_pressure(p_in: float, ratios: list[float], cooler_drops: list[float]) -> float:
    """Pressure after the last cooler for given stage ratios and cooler drops, [Pa].

    Parameters
    ----------
    p_in : float
        Stage-1 inlet pressure, [Pa].
    ratios : list of float
        Stage pressure ratios p_out/p_in, [-].
    cooler_drops : list of float
        Pressure drop of the cooler after each stage (0 where there is none), [Pa].
    """
    p = p_in
    for r, dp in zip(ratios, cooler_drops):
        p = p * r - dp
    return p


def stage_pressure_ratios(p_in: float, p_delivery: float, given: list, cooler_drops: list[float]) -> list[float]:
    r"""Pressure ratio of every stage so that the delivery pressure is met [1]_.

    Stages whose ratio is given keep it; the others share one ratio r, found so that

    .. math:: p_\mathrm{delivery} = \bigl(\cdots((p_1 r_1 - \Delta p_1) r_2 - \Delta p_2)\cdots\bigr)

    holds exactly. With no cooler pressure drops and nothing given this is the equal
    geometric split :math:`r = (p_\mathrm{delivery}/p_1)^{1/N}`, the split of least work
    for ideal-gas stages with perfect intercooling [1]_.

    Parameters
    ----------
    p_in : float
        Stage-1 inlet pressure, [Pa].
    p_delivery : float
        Pressure wanted after the last cooler, [Pa].
    given : list of float or None
        Ratio given for each stage, None where it is to be found.
    cooler_drops : list of float
        Pressure drop of the cooler after each stage (0 where there is none), [Pa].

    Returns
    -------
    list of float
        Ratio of every stage; when all are given they are returned unchanged.

    Raises
    ------
    InputError
        If the ratios given already exceed the delivery pressure, or no shared ratio up
        to 40 can reach it.

    Examples
    --------
    >>> [round(r, 6) for r in stage_pressure_ratios(1e5, 9e5, [None, None], [0.0, 0.0])]
    [3.0, 3.0]

    References
    ----------
    .. [1] Y. A. Çengel, M. A. Boles, *Thermodynamics: An Engineering Approach*, 8th ed.,
       McGraw-Hill, 2015, §7-11 (multistage compression with intercooling).
    """
    free = [i for i, r in enumerate(given) if r is None]
    if not free:
        return list(given)

    def miss(r: float) -> float:
        ratios = [r if g is None else g for g in given]
        return delivered_pressure(p_in, ratios, cooler_drops) - p_delivery

    if miss(1.0) >= 0.0:
        raise InputError(f"stages[{free[0]}].pressure_ratio", None,
                         "the ratios given on the other stages already reach the discharge pressure; "
                         "lower them or give every ratio")
    if miss(40.0) < 0.0:
        raise InputError("discharge_pressure_Pa", p_delivery,
                         "cannot be reached with stage pressure ratios up to 40; add stages",
                         message_detail("{label} {value} cannot be reached with stage pressure ratios up to 40: "
                                        "add stages", {"value": quantity(p_delivery, "pressure")}))
    r = _newton_ratio(p_in, p_delivery, given, cooler_drops)
    if r is None:
        r = bracketed_root(miss, 1.0, 40.0, xtol=1e-15)
    return [r if g is None else g for g in given]


def _newton_ratio(p_in: float, p_delivery: float, given: list, cooler_drops: list[float]):
    r"""The shared ratio by Newton's method [1]_ from the geometric split, or None if it strays.

    The delivered pressure and its derivative in r follow from the same recurrence,
    :math:`p_{k+1} = p_k r_k - \Delta p_k`, :math:`p'_{k+1} = p'_k r_k + p_k [k \text{ free}]`;
    the delivered pressure is a polynomial in r with positive leading terms, so from the
    geometric-split start Newton converges in a few steps.

    References
    ----------
    .. [1] W. H. Press et al., *Numerical Recipes*, 3rd ed., 2007, §9.4.
    """
    n_free = sum(1 for g in given if g is None)
    fixed = 1.0
    for g in given:
        if g is not None:
            fixed *= g
    r = ((p_delivery + sum(cooler_drops)) / (p_in * fixed)) ** (1.0 / n_free)
    for _ in range(30):
        p, dp = p_in, 0.0
        for g, drop in zip(given, cooler_drops):
            if g is None:
                p, dp = p * r - drop, dp * r + p
            else:
                p, dp = p * g - drop, dp * g
        if not (dp > 0.0 and 1.0 < r <= 40.0):
            return None
        step = (p - p_delivery) / dp
        r -= step
        if abs(step) <= 1e-15 * r:
            return r if 1.0 < r <= 40.0 else None
    return None
