"""Temperature from enthalpy or entropy at fixed pressure by Newton's method."""
from __future__ import annotations

__all__ = ["invert_temperature", "invert_to_state"]

import math
from typing import Callable

from stagewright.core.errors import PropertyRangeError, message_detail, quantity
from stagewright.core.models.base import T_MAX, T_MIN


def invert_temperature(value_and_slope: Callable[[float], tuple[float, float]], target: float,
                       T_guess: float, where: str, what: str, tol_K: float = 1e-9) -> float:
    """Solve ``f(T) = target`` for T by Newton's method with a bisection safeguard [1]_.

    Parameters
    ----------
    value_and_slope : callable
        ``T -> (f(T), df/dT)``; f must increase with T (h or s at fixed p).
    target : float
        Value of f wanted, [J/kg] or [J/(kg K)].
    T_guess : float
        Starting temperature, [K].
    where, what : str
        Context for the error message.
    tol_K : float
        Convergence tolerance on the temperature step, [K].

    Returns
    -------
    float
        Temperature, [K].

    Raises
    ------
    PropertyRangeError
        If the root lies outside the model temperature window.

    Notes
    -----
    f is monotone in T (cp > 0), so the bracket [T_MIN, T_MAX] is kept and a Newton
    step leaving it falls back to bisection; convergence is quadratic, usually 2–4 steps.

    References
    ----------
    .. [1] W. H. Press, S. A. Teukolsky, W. T. Vetterling, B. P. Flannery, *Numerical
       Recipes*, 3rd ed., Cambridge University Press, 2007, §9.4 (rtsafe).
    """
    T, _ = _newton(lambda T: (*value_and_slope(T), None), target, T_guess, tol_K, keep_last=False)
    _check_inside(T, where, what)
    return T


def invert_to_state(evaluate: Callable[[float], tuple], target: float, T_guess: float, where: str, what: str,
                    tol_K: float = 1e-9, taylor: Callable | None = None, in_log: bool = False) -> tuple:
    r"""Like :func:`invert_temperature`, but return the last evaluation itself [1]_.

    Parameters
    ----------
    evaluate : callable
        ``T -> (f(T), df/dT, state)``; ``state`` is whatever the caller needs at T.
    target, T_guess, where, what, tol_K
        As for :func:`invert_temperature`.
    taylor : callable, optional
        ``(T, state, δ) -> state at T + δ`` to first order, or None where it cannot. Given, a
        Newton step δ of at most :data:`TAYLOR_STEP_K` is taken without another evaluation:
        Newton's error after it is of order :math:`(f''/2f')\,\delta^2` ≲ 1e-12 K for h(T) or
        s(T) at fixed p [1]_, and the state's own first-order error of order δ² (h and s to
        about 1e-15 of themselves).
    in_log : bool
        Take Newton's steps in ln T, :math:`T \leftarrow T\,\exp(-r/(T\,f'))`: for s(T) at fixed p,
        nearly :math:`c_p \ln T`, a step from 1 K off lands within about 1e-5 K of the root (a
        step in T, within about 1e-3 K).

    Returns
    -------
    (float, object)
        The temperature of the last evaluation, [K], and its ``state`` (or the temperature and
        state after a final Taylor step). Newton's step from it was below ``tol_K``, so it is
        within about ``tol_K`` of the root, and the caller needs no further evaluation to build
        the answer.

    Raises
    ------
    PropertyRangeError
        If the root lies outside the model temperature window.

    References
    ----------
    .. [1] W. H. Press, S. A. Teukolsky, W. T. Vetterling, B. P. Flannery, *Numerical
       Recipes*, 3rd ed., Cambridge University Press, 2007, §9.4 (rtsafe).
    """
    T, state = _newton(evaluate, target, T_guess, tol_K, keep_last=True, taylor=taylor, in_log=in_log)
    _check_inside(T, where, what)
    return T, (state if state is not None else evaluate(T)[2])


#: largest final Newton step [K] that :func:`invert_to_state` takes by a Taylor step of the state
TAYLOR_STEP_K = 1e-4


def _newton(evaluate, target: float, T_guess: float, tol_K: float, keep_last: bool, taylor=None,
            in_log: bool = False) -> tuple:
    """The safeguarded Newton iteration of both inversions: (T, state of the last evaluation
    if ``keep_last`` and it is the answer, else None)."""
    lo, hi = T_MIN, T_MAX
    T = min(max(T_guess, lo), hi)
    for _ in range(60):
        f, dfdT, state = evaluate(T)
        r = f - target
        if r > 0:
            hi = T
        else:
            lo = T
        step = T * -math.expm1(-r / (T * dfdT)) if in_log else r / dfdT
        if taylor is not None and abs(step) <= TAYLOR_STEP_K and lo <= T - step <= hi:
            moved = taylor(T, state, -step)  # also for steps below tol_K: the root to ~1e-13 K
            if moved is not None:
                return T - step, moved
        if keep_last and abs(step) < tol_K:
            return T, state
        T_new = T - step
        if not (lo <= T_new <= hi):
            T_new = 0.5 * (lo + hi)
        if abs(T_new - T) < tol_K:
            return T_new, None
        T = T_new
        if hi - lo < tol_K:
            break
    return T, None


def _check_inside(T: float, where: str, what: str) -> None:
    """A root on (or within 1e-6 K of) a bound of the model window lies beyond it."""
    if T <= T_MIN + 1e-6 or T >= T_MAX - 1e-6:
        raise PropertyRangeError(
            f"{where}: the {what} asked for lies outside the property range "
            f"{T_MIN:g} K … {T_MAX:g} K", where,
            message_detail("{where}: the {what} asked for lies outside the range of the property models, "
                           "{lo} … {hi}", {"where": where, "what": what, "lo": quantity(T_MIN, "temperature"),
                                            "hi": quantity(T_MAX, "temperature")}))
