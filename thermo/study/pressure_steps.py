r"""Finite-difference derivatives of a train taken in its intermediate pressures.

The optimiser's variables are the logarithms of stage ratios, :math:`x_j = \ln r_{s_j}`. A
forward difference in one ratio moves the discharge pressure of that stage and of every stage
after it, so each of its trial solves re-solves the rest of the train. Here each difference
moves one intermediate pressure instead, the discharge pressure :math:`p_i` of stage *i*, and
keeps every other one bit for bit: only stages *i* and *i* + 1 and their coolers see a new
input (in humid air also stage *i* + 2, which the water a separator lets through reaches), and
the train's own reuse of unchanged stages (``reuse`` of
:func:`stagewright.core.solve.solve_normalised`) takes the others from earlier trials. The
derivatives in the ratios then follow from the chain rule through the pressure recurrence of
:func:`stagewright.core.split.delivered_pressure`.
"""
from __future__ import annotations

__all__ = ["stage_pressures", "ratio_meeting", "pressure_step", "pressure_sensitivities"]

import math

#: Relative step of an intermediate pressure: the same size as the old step of 1e-6 in ln r.
PRESSURE_STEP = 1e-6


def stage_pressures(p_in: float, ratios: list[float], drops: list[float]) -> list[float]:
    """Discharge pressure of every stage, [Pa], in the train's own floating-point arithmetic.

    Stage *i* discharges at ``a_i * r_i`` and the next stage takes in ``a_i * r_i - drop_i``
    (:func:`stagewright.core.train.solve_train`: the cooler subtracts its pressure drop, and
    the next stage multiplies by its ratio), so the values are bit for bit the pressures of
    a train solve at ``ratios``.

    Examples
    --------
    >>> stage_pressures(1e5, [3.0, 3.0], [0.0, 0.0])
    [300000.0, 900000.0]
    """
    out, a = [], p_in
    for r, d in zip(ratios, drops):
        p = a * r
        out.append(p)
        a = p - d
    return out


def ratio_meeting(a: float, p: float) -> float | None:
    """A ratio ``r`` with ``a * r == p`` exactly in floating point, or None if none is near ``p / a``.

    ``p / a`` rounds once and the product rounds again, so the quotient misses by an ulp now
    and then; its neighbours a few ulps away are tried in turn.

    Examples
    --------
    >>> r = ratio_meeting(0.1 + 0.2, 0.9)
    >>> (0.1 + 0.2) * r == 0.9
    True
    """
    r0 = p / a
    r = r0
    if a * r == p:
        return r
    for toward in (math.inf, -math.inf):
        r = r0
        for _ in range(4):
            r = math.nextafter(r, toward)
            if a * r == p:
                return r
    return None


def pressure_step(p_in: float, ratios: list[float], drops: list[float], i: int,
                  rel: float = PRESSURE_STEP) -> tuple[list[float], float]:
    """Ratios that move stage ``i``'s discharge pressure by about ``rel`` of it and keep every other.

    Returns
    -------
    (ratios, step)
        The new ratios (stages ``i`` and ``i + 1`` changed) and the exact change of
        :math:`p_i` they give, [Pa] (negative for a negative ``rel``). When no ratio of stage
        ``i + 1`` keeps its discharge pressure exactly (about one step in a few thousand: the
        products of the new inlet pressure and the floats near the ratio step over it, for
        every inlet pressure a few ulps away), it is the plain quotient: :math:`p_{i+1}` then
        moves by an ulp, and the stages after it are solved again.

    Examples
    --------
    >>> ratios, step = pressure_step(1e5, [3.0, 3.0], [0.0, 0.0], 0)
    >>> stage_pressures(1e5, ratios, [0.0, 0.0])[1] == 9e5, round(step, 6)
    (True, 0.3)
    """
    p = stage_pressures(p_in, ratios, drops)
    a_i = p_in if i == 0 else p[i - 1] - drops[i - 1]
    toward = math.inf if rel > 0 else -math.inf
    r_i = ratios[i] * (1.0 + rel)
    for _ in range(16):  # each try moves p_i on by an ulp: the products a r reach other floats
        p_new = a_i * r_i
        r_next = ratio_meeting(p_new - drops[i], p[i + 1])
        if r_next is not None:
            break
        while a_i * r_i == p_new:
            r_i = math.nextafter(r_i, toward)
    else:
        p_new = a_i * r_i
        r_next = p[i + 1] / (p_new - drops[i])
    out = list(ratios)
    out[i], out[i + 1] = r_i, r_next
    return out, p_new - p[i]


def pressure_sensitivities(ratios: list[float], pressures: list[float], var: list[int],
                           implied: int) -> list[dict[int, float]]:
    r"""The derivatives :math:`\partial p_i / \partial x_j` of the intermediate pressures.

    With :math:`p_i = (p_{i-1} - \Delta p_{i-1})\, r_i`, a change of :math:`x_j = \ln r_{s_j}`
    gives :math:`\partial p_{s_j}/\partial x_j = p_{s_j}` and
    :math:`\partial p_i/\partial x_j = r_i\, \partial p_{i-1}/\partial x_j` for the stages after
    it, up to the implied stage *k*, whose ratio keeps the discharge pressure and so every
    pressure from :math:`p_k` on. The derivative of any figure *F* of the train is then
    :math:`\partial F/\partial x_j = \sum_i (\partial F/\partial p_i)\, \partial p_i/\partial x_j`
    (chain rule; the differences in the pressures approximate :math:`\partial F/\partial p_i`,
    Nocedal & Wright [1]_).

    Parameters
    ----------
    ratios, pressures : list of float
        Stage ratios and discharge pressures [Pa] at the point.
    var : list of int
        The stage of each variable, in order.
    implied : int
        The stage whose ratio follows from the discharge pressure.

    Returns
    -------
    list of dict
        One per variable: {stage i: :math:`\partial p_i/\partial x_j`, [Pa]}, for
        ``s_j <= i < implied``.

    References
    ----------
    .. [1] J. Nocedal, S. J. Wright, *Numerical Optimization*, 2nd ed., Springer, 2006, §8.1
       (finite-difference derivative approximations; the chain rule, §A.2).

    Examples
    --------
    >>> pressure_sensitivities([2.0, 3.0, 1.5], [2e5, 6e5, 9e5], [0, 1], 2)
    [{0: 200000.0, 1: 600000.0}, {1: 600000.0}]
    """
    out = []
    for s in var:
        d = {s: pressures[s]}
        for i in range(s + 1, implied):
            d[i] = ratios[i] * d[i - 1]
        out.append(d)
    return out
