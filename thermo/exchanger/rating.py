r"""Rating a cooler: given UA, find the air outlet temperature and the duty [1]_.

Rating is the inverse of sizing (:mod:`stagewright.core.exchanger.sizing`): the air outlet
temperature :math:`T_{h,o}` is the root of

.. math:: g(T_{h,o}) = \ln\frac{UA_\mathrm{req}(T_{h,o})}{UA} = 0

on :math:`(T_{c,i}, T_{h,i})`, where :math:`UA_\mathrm{req}` is the UA that sizing finds for
that outlet. :math:`UA_\mathrm{req}` falls monotonically from infinity (at the pinch or a
temperature cross) to zero (no duty), so the root is unique; it is found by Brent's
method to 1e-12 K. Outlets that no finite exchanger reaches count as
:math:`g = +\infty`.

The search starts from an ε–NTU estimate (capacity rates from one sizing, the arrangement's
ε(NTU, C_r) at the given UA) and takes secant steps on g from there, which usually settle in
four or five sizings; should they not, Brent's method on the whole interval decides.

A :class:`RatingStart` carries where the last rating of the same cooler settled (the outlet as
a fraction of the span :math:`(T_{h,o} - T_{c,i})/(T_{h,i} - T_{c,i})` and the slope of g
there): a year rating its bins in order (hourly data is smooth) starts each rating from the
previous one, one Newton step with the remembered slope and then secant steps, which settles in
two or three sizings. The root is the same (the same g, the same tolerance); only the path to it
is shorter. Should the warm steps leave the interval or not settle, the cold search above runs.
"""
from __future__ import annotations

__all__ = ["rate_exchanger", "RatingStart"]

import math
from typing import Callable


from stagewright.core.errors import InputError, PropertyRangeError
from stagewright.core.exchanger.effectiveness import effectiveness
from stagewright.core.exchanger.coolant import coolant_side
from stagewright.core.exchanger.sizing import Exchanger, HotSide, size_exchanger

_INFEASIBLE = 60.0


class RatingStart:
    """Where the last rating of one cooler settled, to start the next from (see the module).

    ``fraction``: the air outlet as a fraction of the span, (T_out − T_ci)/(T_hi − T_ci);
    ``slope``: dg/d(fraction) there. Both None until a rating has settled. One per cooler and
    thread (a year's bins in one worker, in order); it changes only how fast a rating settles.
    ``rtol``: the relative tolerance its owner asks for on the fast property path (None: the
    cooler's default, :func:`stagewright.core.cooler.solve_cooler`). ``ntu_starts``: each zone's
    NTU at the last sizing, where the next numerical NTU inversion starts.
    """

    __slots__ = ("fraction", "slope", "rtol", "ntu_starts")

    def __init__(self, rtol: float | None = None):
        self.fraction: float | None = None
        self.slope: float | None = None
        self.rtol = rtol
        self.ntu_starts: dict = {}  #: each zone's NTU at the last sizing (:func:`size_exchanger`)


def brentq(*args, **kwargs):
    """scipy.optimize.brentq, imported on first use (keeps start-up light)."""
    from scipy.optimize import brentq as _brentq
    return _brentq(*args, **kwargs)


def rate_exchanger(arrangement: str, ua: float, t_hi: float, hot_at: Callable[[float], HotSide],
                   fluid, t_ci: float, flow: float | None = None, rise: float | None = None,
                   where: str = "cooler", rtol: float = 1e-12,
                   start: RatingStart | None = None) -> tuple[float, Exchanger]:
    r"""Air outlet temperature and exchanger state of a cooler of known UA [1]_.

    Parameters
    ----------
    arrangement : str
        A key of :data:`stagewright.core.exchanger.effectiveness.ARRANGEMENTS`.
    ua : float
        Overall conductance, [W/K].
    t_hi : float
        Compressed-air inlet temperature, [K].
    hot_at : callable
        ``hot_at(T_out)`` → :class:`HotSide` of the air cooled to ``T_out`` [K].
    fluid : object
        Coolant from :func:`stagewright.core.exchanger.coolant.make_coolant`.
    t_ci : float
        Coolant inlet temperature, [K].
    flow, rise : float, optional
        Coolant mass flow [kg/s] or temperature rise [K]; exactly one.
    where : str
        Input path of the cooler entry, for messages.
    rtol : float
        Relative tolerance of the air outlet temperature (1e-12; trial solves on the fast
        property path ask for less, :func:`stagewright.core.cooler.solve_cooler`).
    start : RatingStart, optional
        Where the last rating of this cooler settled: the search starts there and the start is
        updated (a year's bins); None searches from the ε–NTU estimate.

    Returns
    -------
    (float, Exchanger)
        Air outlet temperature [K] and the exchanger sized at it (its UA equals ``ua``).

    Raises
    ------
    InputError
        If the coolant is warmer than the air, or no outlet temperature gives this UA.

    Examples
    --------
    >>> from stagewright.core.exchanger.coolant import make_coolant
    >>> from stagewright.core.exchanger.sizing import HotSide
    >>> w = make_coolant({"kind": "water"}, (293.15, 101325.0, 0.0))
    >>> hot = lambda t: HotSide(420.0, t, 1000.0 * (420.0 - t))
    >>> t_out, ex = rate_exchanger("counter_flow", 2500.0, 420.0, hot, w, 293.15, flow=0.5)
    >>> round(ex.ua_W_K, 6)
    2500.0

    References
    ----------
    .. [1] F. P. Incropera, D. P. DeWitt, T. L. Bergman, A. S. Lavine, *Fundamentals of Heat
       and Mass Transfer*, 6th ed., Wiley, 2007, §11.5 (rating with the ε-NTU method).
    """
    if t_hi <= t_ci:
        raise InputError(f"{where}.coolant_inlet_temperature_K", t_ci,
                         f"expected below the cooler air inlet {t_hi:.2f} K: the coolant cannot cool "
                         "air colder than itself")

    sized: dict = {}
    ntu_starts = {} if start is None else start.ntu_starts  # each zone's NTU: the next inversion's start

    def g(t_out: float) -> float:
        try:
            ex = size_exchanger(arrangement, hot_at(t_out), fluid, t_ci, flow, rise, where, explain=False,
                                ntu_starts=ntu_starts)
        except (InputError, PropertyRangeError):
            return _INFEASIBLE
        sized[t_out] = ex
        return math.log(ex.ua_W_K / ua) if ex.ua_W_K > 0.0 else -_INFEASIBLE

    span = t_hi - t_ci
    lo, hi = t_ci + 1e-9 * span, t_hi - 1e-9 * span
    settled = None
    if start is not None and start.fraction is not None:
        settled = _secant_from_start(g, start, t_ci, span, lo, hi, rtol)
    if settled is None:
        settled = _secant_from_estimate(g, arrangement, ua, t_hi, t_ci, hot_at, fluid, flow, rise, where, lo, hi,
                                        rtol)
    if settled is not None:
        t_out, slope = settled
        if start is not None:
            start.fraction, start.slope = (t_out - t_ci) / span, slope * span
        return t_out, sized[t_out]
    if start is not None:
        start.fraction = start.slope = None
    if g(lo) <= 0.0:
        lo = t_ci + 1e-12 * span
    if g(lo) <= 0.0 or g(hi) >= 0.0:  # the root would lie within rounding of an end: no usable outlet
        big = g(lo) <= 0.0
        raise InputError(f"{where}.ua_W_K", ua,
                         f"expected a {'smaller' if big else 'larger'} UA: with {ua:.6g} W/K the air would leave "
                         f"{'at the coolant inlet' if big else 'at its inlet'} temperature to within rounding "
                         f"({t_ci:.2f} K coolant, {t_hi:.2f} K air)")
    t_out = brentq(g, lo, hi, xtol=1e-12, rtol=1e-15, maxiter=500)
    if t_out not in sized:
        # a root on a pinch (UA_req jumps there: the wet zone's coolant reaches the dew point), where
        # rounding decides whether a sizing exists: the nearest outlet Brent's method sized, within 1e-9
        near = [t for t in sized if abs(t - t_out) <= 1e-9 * max(1.0, abs(t_out))]
        if near:
            t_out = min(near, key=lambda t: abs(t - t_out))
    if t_out in sized:
        return t_out, sized[t_out]
    return t_out, size_exchanger(arrangement, hot_at(t_out), fluid, t_ci, flow, rise, where)


def _estimate(arrangement: str, ua: float, t_hi: float, t_ci: float, hot_at, fluid, flow, rise, where: str):
    r"""ε–NTU estimate of the air outlet [K] with the capacity rates of one sizing at mid-span [1]_.

    .. math:: T_{h,o} \approx T_{h,i} - \varepsilon(UA/C_\min, C_r)\,C_\min (T_{h,i} - T_{c,i}) / C_h

    None when the mid-span sizing is not possible.

    References
    ----------
    .. [1] F. P. Incropera et al., *Fundamentals of Heat and Mass Transfer*, 6th ed., 2007, §11.5.
    """
    t_mid = 0.5 * (t_hi + t_ci)
    try:  # the capacity rates need only the coolant side, not the zones' sizing
        side = coolant_side(fluid, t_ci, hot_at(t_mid).duty_W, flow=flow, rise=rise, where=where)
    except (InputError, PropertyRangeError):
        return None
    if side.duty_W <= 0.0 or side.outlet_temperature_K <= t_ci:
        return None
    c_h = side.duty_W / (t_hi - t_mid)
    c_c = side.duty_W / (side.outlet_temperature_K - t_ci)
    c_min, c_max = min(c_h, c_c), max(c_h, c_c)
    eps = effectiveness(arrangement, ua / c_min, c_min / c_max, c_h <= c_c)
    return t_hi - eps * c_min * (t_hi - t_ci) / c_h


def _secant_from_estimate(g, arrangement, ua, t_hi, t_ci, hot_at, fluid, flow, rise, where, lo, hi,
                          rtol: float = 1e-12):
    """Root of g by secant steps from :func:`_estimate`: ``(T_out, dg/dT)`` or None (see :func:`_secant`)."""
    t0 = _estimate(arrangement, ua, t_hi, t_ci, hot_at, fluid, flow, rise, where)
    if t0 is None or not lo < t0 < hi:
        return None
    t1 = min(t0 + 1e-3 * (t_hi - t_ci), 0.5 * (t0 + hi))
    return _secant(g, t0, g(t0), t1, lo, hi, rtol)


def _secant_from_start(g, start: RatingStart, t_ci: float, span: float, lo: float, hi: float, rtol: float):
    """Root of g from the last rating's outlet fraction: one Newton step with its slope, then secant steps;
    ``(T_out, dg/dT)`` or None."""
    t0 = t_ci + start.fraction * span
    if not lo < t0 < hi:
        return None
    g0 = g(t0)
    if g0 == 0.0:
        return t0, start.slope / span
    if abs(g0) >= _INFEASIBLE or not start.slope or start.slope >= 0.0:  # g falls as the outlet rises
        return None
    t1 = t0 - g0 * span / start.slope
    if not lo < t1 < hi or t1 == t0:
        return None
    return _secant(g, t0, g0, t1, lo, hi, rtol)


def _secant(g, t0: float, g0: float, t1: float, lo: float, hi: float, rtol: float, max_steps: int = 12):
    """Root of g by secant steps from t0 (where g is g0) and t1, to ``rtol`` relative: ``(T_out, slope)``
    with the secant slope of g there; None when the steps leave (lo, hi) or do not settle (the caller
    then brackets the whole interval).

    Returns the last outlet g was evaluated at once the next secant step is within the tolerance of
    it (so that its sizing is the answer's, with no sizing more)."""
    g1 = g(t1)
    for _ in range(max_steps):
        if abs(g0) >= _INFEASIBLE or abs(g1) >= _INFEASIBLE or g1 == g0:
            return None
        slope = (g1 - g0) / (t1 - t0)
        t2 = t1 - g1 / slope
        if not lo < t2 < hi:
            return None
        if abs(t2 - t1) <= rtol * max(1.0, abs(t2)) or g1 == 0.0:
            return t1, slope
        t0, g0, t1, g1 = t1, g1, t2, g(t2)
    return None
