r"""Effectiveness–NTU relations of the exchanger arrangements Stagewright supports [1]_ [2]_ [3]_.

Arrangements (registry :data:`ARRANGEMENTS`, keyed by the project-file name):

``counter_flow``
    Pure counter-flow (double pipe, or a shell-and-tube exchanger with enough shells in
    series to approach it).
``cross_flow_unmixed``
    Single-pass cross-flow, **both** fluids unmixed (finned-tube and plate-fin coolers);
    the exact series solution, not the usual approximate fit.
``cross_flow_hot_mixed``
    Single-pass cross-flow, the compressed air (hot side) mixed and the coolant unmixed;
    whether the mixed side is :math:`C_\min` or :math:`C_\max` is decided from the
    capacity rates at run time.
``shell_and_tube_1_2``
    TEMA E shell, one shell pass and two (or any even number of) tube passes.

Cross-flow with the coolant mixed and multi-shell exchangers are not offered.
"""
from __future__ import annotations

__all__ = ["ARRANGEMENTS", "Arrangement", "effectiveness", "ntu_from_effectiveness",
           "max_effectiveness", "crossflow_unmixed_effectiveness"]

import math
from dataclasses import dataclass
from typing import Callable


from stagewright.core.errors import InputError

_CR_ZERO = 1e-12  #: below this capacity ratio the Cr = 0 limit (one fluid of infinite capacity) is used


def brentq(*args, **kwargs):
    """scipy.optimize.brentq, imported on first use (keeps start-up light)."""
    from scipy.optimize import brentq as _brentq
    return _brentq(*args, **kwargs)

def gammainc(*args, **kwargs):
    """scipy.special.gammainc, imported on first use (keeps start-up light)."""
    from scipy.special import gammainc as _gammainc
    return _gammainc(*args, **kwargs)


def _counter(ntu: float, cr: float, hot_is_cmin: bool) -> float:
    if cr < _CR_ZERO:
        return -math.expm1(-ntu)
    if cr == 1.0:
        return ntu / (1.0 + ntu)
    x = ntu * (1.0 - cr)
    num = -math.expm1(-x)
    return num / (num + (1.0 - cr) * math.exp(-x))


def _counter_inv(eps: float, cr: float, hot_is_cmin: bool) -> float:
    if cr < _CR_ZERO:
        return -math.log1p(-eps)
    if cr == 1.0:
        return eps / (1.0 - eps)
    return math.log1p(eps * (1.0 - cr) / (1.0 - eps)) / (1.0 - cr)


def _shell12(ntu: float, cr: float, hot_is_cmin: bool) -> float:
    root = math.sqrt(1.0 + cr * cr)
    e = math.exp(-ntu * root)
    return 2.0 / (1.0 + cr + root * (1.0 + e) / (1.0 - e))


def _shell12_inv(eps: float, cr: float, hot_is_cmin: bool) -> float:
    root = math.sqrt(1.0 + cr * cr)
    big_e = (2.0 / eps - (1.0 + cr)) / root
    return -math.log((big_e - 1.0) / (big_e + 1.0)) / root


def _cmax_mixed(ntu: float, cr: float) -> float:
    if cr < _CR_ZERO:
        return -math.expm1(-ntu)
    return -math.expm1(-cr * -math.expm1(-ntu)) / cr


def _cmax_mixed_inv(eps: float, cr: float) -> float:
    if cr < _CR_ZERO:
        return -math.log1p(-eps)
    return -math.log1p(math.log1p(-eps * cr) / cr)


def _cmin_mixed(ntu: float, cr: float) -> float:
    if cr < _CR_ZERO:
        return -math.expm1(-ntu)
    return -math.expm1(math.expm1(-cr * ntu) / cr)


def _cmin_mixed_inv(eps: float, cr: float) -> float:
    if cr < _CR_ZERO:
        return -math.log1p(-eps)
    return -math.log1p(cr * math.log1p(-eps)) / cr


def _hot_mixed(ntu: float, cr: float, hot_is_cmin: bool) -> float:
    return _cmin_mixed(ntu, cr) if hot_is_cmin else _cmax_mixed(ntu, cr)


def _hot_mixed_inv(eps: float, cr: float, hot_is_cmin: bool) -> float:
    return _cmin_mixed_inv(eps, cr) if hot_is_cmin else _cmax_mixed_inv(eps, cr)


def crossflow_unmixed_effectiveness(ntu: float, cr: float) -> float:
    r"""Exact effectiveness of single-pass cross-flow, both fluids unmixed [3]_ [4]_.

    .. math::

        \varepsilon = \frac{1}{C_r\,N} \sum_{n=0}^{\infty} P(n+1, N)\, P(n+1, C_r N),
        \qquad P(n+1, x) = 1 - e^{-x} \sum_{m=0}^{n} \frac{x^m}{m!}

    with :math:`P` the regularised lower incomplete gamma function.

    Parameters
    ----------
    ntu : float
        Number of transfer units :math:`UA/C_\min`, [-].
    cr : float
        Capacity-rate ratio :math:`C_\min/C_\max`, [-].

    Returns
    -------
    float
        Effectiveness, [-].

    Notes
    -----
    The series converges like a Poisson tail; terms are summed until
    :math:`n > N + 12\sqrt{N} + 40`, past which they are below 1e-17 of the sum.

    Examples
    --------
    >>> round(crossflow_unmixed_effectiveness(1.0, 1.0), 4)  # Incropera Fig. 11.18: ≈ 0.48
    0.4762

    References
    ----------
    .. [3] R. K. Shah, D. P. Sekulić, *Fundamentals of Heat Exchanger Design*, Wiley, 2003,
       Table 3.3 (single-pass cross-flow, both fluids unmixed, series solution).
    .. [4] J. L. Mason, "Heat transfer in crossflow", Proc. 2nd U.S. National Congress of
       Applied Mechanics, ASME, 1955, pp. 801–803.
    """
    if ntu <= 0.0:
        return 0.0
    if cr < 1e-10:
        return -math.expm1(-ntu)
    n_max = int(ntu + 12.0 * math.sqrt(ntu) + 40.0)
    a, b = _poisson_upper_tails(ntu, n_max), _poisson_upper_tails(cr * ntu, n_max)
    return math.fsum(x * y for x, y in zip(a, b)) / (cr * ntu)


def _poisson_upper_tails(x: float, n_max: int) -> list:
    r""":math:`P(n+1, x)` for n = 0 … n_max − 1, as upper tails of the Poisson distribution [5]_.

    .. math:: P(n+1, x) = \sum_{m=n+1}^{\infty} e^{-x}\frac{x^m}{m!}

    summed from the far tail down (positive terms only, so no cancellation where P is
    small); the terms come from :math:`p_m = p_{m-1}\,x/m`, :math:`p_0 = e^{-x}`, and the tail
    is cut at n_max, past which the terms are below 1e-17 for every x up to the NTU (see
    :func:`crossflow_unmixed_effectiveness`).
    Pure Python: the series has a few dozen terms, where a vectorised ``gammainc`` call costs
    more in overhead than the sum itself.

    References
    ----------
    .. [5] M. Abramowitz, I. A. Stegun, *Handbook of Mathematical Functions*, Dover, 1965,
       eq. 6.5.13 and 26.4.21 (incomplete gamma function and the Poisson distribution).
    """
    m_top = n_max
    if x > 600.0:  # e^{-x} would underflow: each term from its logarithm
        ln_x = math.log(x)
        pmf = [math.exp(m * ln_x - x - math.lgamma(m + 1.0)) for m in range(m_top + 1)]
    else:
        pmf = [0.0] * (m_top + 1)
        p = math.exp(-x)
        pmf[0] = p
        for m in range(1, m_top + 1):
            p *= x / m
            pmf[m] = p
    tails = [0.0] * n_max
    acc = 0.0
    for m in range(m_top, 0, -1):
        acc += pmf[m]
        if m - 1 < n_max:
            tails[m - 1] = acc
    return tails


def _cross_unmixed(ntu: float, cr: float, hot_is_cmin: bool) -> float:
    return crossflow_unmixed_effectiveness(ntu, cr)


def _poisson_pmf(x: float, m_top: int) -> list:
    """Poisson probabilities e^{-x} x^m / m! for m = 0 … m_top (from logarithms where e^{-x} underflows)."""
    if x > 600.0:
        ln_x = math.log(x)
        return [math.exp(m * ln_x - x - math.lgamma(m + 1.0)) for m in range(m_top + 1)]
    pmf = [0.0] * (m_top + 1)
    p = pmf[0] = math.exp(-x)
    for m in range(1, m_top + 1):
        p *= x / m
        pmf[m] = p
    return pmf


def _cross_unmixed_and_slope(y: float, cr: float) -> tuple:
    r"""Unmixed cross-flow ε at :math:`N = e^y` and its slope :math:`d\varepsilon/dy` [3]_ [5]_.

    With :math:`S = \sum_n P(n+1, N) P(n+1, C_r N)` and :math:`dP(n+1, x)/dx = e^{-x} x^n/n!`
    (the Poisson probability, Abramowitz & Stegun 6.5.25),

    .. math:: \frac{d\varepsilon}{dy} = N \frac{d\varepsilon}{dN}
              = \frac{1}{C_r}\sum_n \left[p_n(N)\,P(n+1, C_r N) + C_r P(n+1, N)\,p_n(C_r N)\right]
              - \varepsilon
    """
    ntu = math.exp(y)
    if ntu > 600.0:  # e^{-N} would underflow: the probabilities from their logarithms
        n_max = _series_terms(ntu)
        pa, pb = _poisson_pmf(ntu, n_max), _poisson_pmf(cr * ntu, n_max)
        a, b = _tails_from_pmf(pa, n_max), _tails_from_pmf(pb, n_max)
        eps = math.fsum(x * z for x, z in zip(a, b)) / (cr * ntu)
        slope = math.fsum(pa[n] * b[n] + cr * a[n] * pb[n] for n in range(n_max)) / cr - eps
        return eps, slope
    # one pass out (both Poisson probabilities, and where the series may stop: :func:`_series_terms`),
    # one pass back (the tails and both sums, from the far tail: positive terms, smallest first)
    x_b = cr * ntu
    n_cap = int(ntu + 12.0 * math.sqrt(ntu) + 40.0)
    floor, n_min = 1e-19 * -math.expm1(-ntu), 2.0 * ntu + 5.0
    p, q = math.exp(-ntu), math.exp(-x_b)
    pa, pb = [p], [q]
    m = 0
    while m < n_cap:
        m += 1
        p *= ntu / m
        q *= x_b / m
        pa.append(p)
        pb.append(q)
        if m > n_min and p < floor:
            break
    tail_a = tail_b = s_eps = s_slope = 0.0
    for k in range(m, 0, -1):
        tail_a += pa[k]
        tail_b += pb[k]
        s_eps += tail_a * tail_b
        s_slope += pa[k - 1] * tail_b + cr * tail_a * pb[k - 1]
    eps = s_eps / (cr * ntu)
    return eps, s_slope / cr - eps


def _series_terms(ntu: float) -> int:
    r"""Terms of the unmixed cross-flow series that matter at ``ntu``: the first n past 2N + 5 where the
    Poisson probability :math:`p_n(N)` is below :math:`10^{-19}(1 - e^{-N})`, at most
    :math:`N + 12\sqrt N + 40` (:func:`crossflow_unmixed_effectiveness`).

    Beyond 2N the probabilities fall by at least half a term, so the dropped tails sum to less than
    :math:`4 p_n`; with :math:`P(n+1, C_r N) \le P(1, C_r N)` the dropped terms are below
    :math:`10^{-18}` of the series' first term :math:`P(1, N) P(1, C_r N)`, hence of the sum (for N of
    order 1, half the terms of the fixed cut-off)."""
    n_cap = int(ntu + 12.0 * math.sqrt(ntu) + 40.0)
    if ntu > 600.0:
        return n_cap
    floor = 1e-19 * -math.expm1(-ntu)
    p, m, n_min = math.exp(-ntu), 0, 2.0 * ntu + 5.0
    while m < n_cap:
        m += 1
        p *= ntu / m
        if m > n_min and p < floor:
            return m
    return n_cap


def _tails_from_pmf(pmf: list, n_max: int) -> list:
    """:math:`P(n+1, x)` for n = 0 … n_max − 1 from the Poisson probabilities, summed from the far tail."""
    tails = [0.0] * n_max
    acc = 0.0
    for m in range(n_max, 0, -1):
        acc += pmf[m]
        tails[m - 1] = acc
    return tails


def _cross_unmixed_inv(eps: float, cr: float, start: float | None = None) -> float | None:
    r"""NTU of unmixed cross-flow for ``eps`` by safeguarded Newton steps on :math:`y = \ln N`.

    Counter-flow needs the fewest transfer units of all arrangements, so its closed-form NTU is a
    lower bound and the start (or ``start``, an NTU near the answer, when above it); each step is a
    Newton step (exact slope, :func:`_cross_unmixed_and_slope`) kept inside the bracket found so far
    (bisection otherwise). Stops when a step is below 1e-7 in y: Newton's error after a step s is
    about :math:`|\varepsilon''/2\varepsilon'|\,s^2`, below 1e-14 here; None if 60 steps do not
    settle or the NTU passes 10⁴ (the caller then brackets with Brent's method).
    """
    y = math.log(max(_counter_inv(eps, cr, True), 1e-300))
    lo, hi, y_top = y, None, math.log(1e4)
    if start is not None and start > 0.0 and math.log(start) > y:
        y = math.log(start)
    for _ in range(60):
        e, slope = _cross_unmixed_and_slope(y, cr)
        f = e - eps
        if f == 0.0:
            return math.exp(y)
        if f < 0.0:
            lo = max(lo, y)
        else:
            hi = y if hi is None else min(hi, y)
        step = -f / slope if slope > 0.0 else math.inf
        y_new = y + step
        if not (lo <= y_new and (hi is None or y_new <= hi)) or not math.isfinite(y_new):
            y_new = 0.5 * (lo + hi) if hi is not None else lo + math.log(8.0)
        elif abs(step) <= 1e-7 * max(1.0, abs(y)):
            return math.exp(y_new)
        if y_new > y_top:
            return None
        y = y_new
    return None


@dataclass(frozen=True)
class Arrangement:
    """One flow arrangement: its ε(NTU, Cr) and, where one exists, the closed-form inverse."""

    label: str
    eps: Callable[[float, float, bool], float]
    ntu: Callable[[float, float, bool], float] | None  #: None → inverted numerically


#: arrangement name -> relations (Incropera et al. 2007, Table 11.3 and 11.4)
ARRANGEMENTS = {
    "counter_flow": Arrangement("counter-flow", _counter, _counter_inv),
    "cross_flow_unmixed": Arrangement("cross-flow, both fluids unmixed", _cross_unmixed, None),
    "cross_flow_hot_mixed": Arrangement("cross-flow, compressed air mixed, coolant unmixed",
                                        _hot_mixed, _hot_mixed_inv),
    "shell_and_tube_1_2": Arrangement("shell-and-tube, 1 shell pass, 2 tube passes", _shell12, _shell12_inv),
}


def _get(arrangement: str) -> Arrangement:
    try:
        return ARRANGEMENTS[arrangement]
    except KeyError:
        raise InputError("arrangement", arrangement,
                         "expected one of " + ", ".join(repr(k) for k in ARRANGEMENTS)) from None


def effectiveness(arrangement: str, ntu: float, cr: float, hot_is_cmin: bool = True) -> float:
    r"""Effectiveness of an exchanger from its NTU and capacity-rate ratio [1]_ [2]_.

    Counter-flow, :math:`C_r < 1` (Incropera eq. 11.29a; :math:`N/(1+N)` at :math:`C_r = 1`):

    .. math:: \varepsilon = \frac{1 - e^{-N(1-C_r)}}{1 - C_r e^{-N(1-C_r)}}

    Shell-and-tube, one shell pass, 2n tube passes (eq. 11.30a):

    .. math:: \varepsilon = 2\left\{1 + C_r + \sqrt{1+C_r^2}\,
              \frac{1 + e^{-N\sqrt{1+C_r^2}}}{1 - e^{-N\sqrt{1+C_r^2}}}\right\}^{-1}

    Cross-flow, :math:`C_\max` mixed (eq. 11.33a) and :math:`C_\min` mixed (eq. 11.34a):

    .. math:: \varepsilon = \frac{1}{C_r}\left(1 - e^{-C_r (1 - e^{-N})}\right), \qquad
              \varepsilon = 1 - \exp\left(-\frac{1 - e^{-C_r N}}{C_r}\right)

    Cross-flow with both fluids unmixed: :func:`crossflow_unmixed_effectiveness`. Every
    arrangement tends to :math:`1 - e^{-N}` as :math:`C_r \to 0`.

    Parameters
    ----------
    arrangement : str
        A key of :data:`ARRANGEMENTS`.
    ntu : float
        Number of transfer units :math:`UA/C_\min`, [-].
    cr : float
        Capacity-rate ratio :math:`C_\min/C_\max` in [0, 1], [-].
    hot_is_cmin : bool
        Whether the compressed air (hot side) has the smaller capacity rate; matters only
        for ``cross_flow_hot_mixed``.

    Returns
    -------
    float
        Effectiveness :math:`\dot Q / (C_\min (T_{h,i} - T_{c,i}))`, [-].

    Raises
    ------
    InputError
        For an unknown arrangement.

    Examples
    --------
    >>> round(effectiveness("counter_flow", 5.0, 0.7), 6)  # ht.effectiveness_from_NTU: 0.920670
    0.92067

    References
    ----------
    .. [1] F. P. Incropera, D. P. DeWitt, T. L. Bergman, A. S. Lavine, *Fundamentals of Heat
       and Mass Transfer*, 6th ed., Wiley, 2007, §11.4, Tables 11.3 and 11.4.
    .. [2] W. M. Kays, A. L. London, *Compact Heat Exchangers*, 3rd ed., McGraw-Hill, 1984,
       ch. 2.
    """
    return _get(arrangement).eps(max(ntu, 0.0), min(max(cr, 0.0), 1.0), hot_is_cmin)


def max_effectiveness(arrangement: str, cr: float, hot_is_cmin: bool = True) -> float:
    r"""Largest effectiveness an arrangement reaches as :math:`N \to \infty` [1]_.

    Counter-flow and unmixed cross-flow: 1 (counter-flow: :math:`1/C_r` capped at 1).
    Shell-and-tube 1-2: :math:`2/(1 + C_r + \sqrt{1+C_r^2})`. Cross-flow, :math:`C_\max`
    mixed: :math:`(1 - e^{-C_r})/C_r`; :math:`C_\min` mixed: :math:`1 - e^{-1/C_r}`.

    Parameters
    ----------
    arrangement : str
        A key of :data:`ARRANGEMENTS`.
    cr : float
        Capacity-rate ratio, [-].
    hot_is_cmin : bool
        As for :func:`effectiveness`.

    Returns
    -------
    float
        Limiting effectiveness, [-].

    Examples
    --------
    >>> round(max_effectiveness("shell_and_tube_1_2", 1.0), 6)  # 2 / (2 + √2)
    0.585786
    """
    _get(arrangement)
    cr = min(max(cr, 0.0), 1.0)
    if arrangement in ("counter_flow", "cross_flow_unmixed") or cr < _CR_ZERO:
        return 1.0
    if arrangement == "shell_and_tube_1_2":
        return 2.0 / (1.0 + cr + math.sqrt(1.0 + cr * cr))
    if hot_is_cmin:
        return -math.expm1(-1.0 / cr)
    return -math.expm1(-cr) / cr


def ntu_from_effectiveness(arrangement: str, eps: float, cr: float, hot_is_cmin: bool = True,
                           field: str = "effectiveness", start: float | None = None) -> float:
    r"""Number of transfer units an arrangement needs for an effectiveness [1]_.

    Closed-form inverses (Incropera eqs. 11.29b, 11.30b, 11.33b, 11.34b):

    .. math::

        N_\mathrm{cf} = \frac{1}{C_r - 1}\ln\frac{\varepsilon - 1}{\varepsilon C_r - 1},\qquad
        N_{1\text{-}2} = -\frac{1}{\sqrt{1+C_r^2}}\ln\frac{E-1}{E+1},\;
        E = \frac{2/\varepsilon - (1+C_r)}{\sqrt{1+C_r^2}}

    .. math::

        N_{C_\max\,\mathrm{mixed}} = -\ln\left[1 + \frac{\ln(1 - \varepsilon C_r)}{C_r}\right],
        \qquad
        N_{C_\min\,\mathrm{mixed}} = -\frac{\ln\left[C_r \ln(1-\varepsilon) + 1\right]}{C_r}

    Cross-flow with both fluids unmixed is inverted numerically: Newton steps on :math:`\ln N`
    from the counter-flow NTU with the series' exact slope, kept in a bracket (Brent's method on
    :math:`\ln N` to 1e-14 relative should they not settle).

    Parameters
    ----------
    arrangement : str
        A key of :data:`ARRANGEMENTS`.
    eps : float
        Required effectiveness, [-].
    cr : float
        Capacity-rate ratio, [-].
    hot_is_cmin : bool
        As for :func:`effectiveness`.
    field : str
        Input path named in the error when the effectiveness cannot be reached.
    start : float, optional
        An NTU near the answer (a rating's previous sizing) for the numerical inversion to start
        from instead of the counter-flow NTU; the same root.

    Returns
    -------
    float
        Number of transfer units, [-].

    Raises
    ------
    InputError
        If ``eps`` is not below :func:`max_effectiveness` (a temperature cross: no finite
        exchanger of this arrangement reaches these temperatures).

    Examples
    --------
    >>> round(ntu_from_effectiveness("counter_flow", 0.920670368605, 0.7), 6)
    5.0
    """
    arr = _get(arrangement)
    cr = min(max(cr, 0.0), 1.0)
    limit = max_effectiveness(arrangement, cr, hot_is_cmin)
    cross = (f"the {arr.label} arrangement reaches at most an effectiveness of {limit:.6g} at this "
             f"capacity ratio ({cr:.4g}): the temperatures cross; choose another arrangement, or more coolant")
    if not 0.0 <= eps < limit:
        raise InputError(field, eps, cross)
    if eps == 0.0:
        return 0.0
    if arr.ntu is not None:
        try:
            ntu = arr.ntu(eps, cr, hot_is_cmin)
        except (ValueError, ZeroDivisionError):  # eps within rounding of the limit: log of ≤ 0
            ntu = math.inf
        if not math.isfinite(ntu):
            raise InputError(field, eps, cross)
        return ntu
    if arrangement == "cross_flow_unmixed" and cr >= 1e-10:
        ntu = _cross_unmixed_inv(eps, cr, start)
        if ntu is not None:
            return ntu

    def miss(y: float) -> float:
        return arr.eps(math.exp(y), cr, hot_is_cmin) - eps

    # the upper end of the bracket grows from 20 transfer units (each evaluation of a series
    # relation costs in proportion to the NTU) up to 10⁴, beyond which no finite exchanger counts
    y_lo, y_hi, y_top = -40.0, math.log(20.0), math.log(1e4)
    while miss(y_hi) <= 0.0:
        if y_hi >= y_top:  # within rounding of the limit: more than 10⁴ transfer units
            raise InputError(field, eps, cross)
        y_hi = min(y_hi + math.log(8.0), y_top)
    if miss(y_lo) >= 0.0:
        return math.exp(y_lo)
    x = brentq(miss, y_lo, y_hi, xtol=1e-15, rtol=1e-14, maxiter=300)
    return math.exp(x)
