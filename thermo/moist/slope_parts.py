"""The polytropic slope parts of an unsaturated real-gas moist stream, in one call [1]_ [2]_.

A compression path's Runge–Kutta integration asks for
:meth:`~stagewright.core.moist.stream.MoistAir.polytropic_slope_parts` some thirty times a stage, almost
always where the stream is surely unsaturated. There the answer needs one CoolProp (T, p) update
of dry air and three cubic look-ups; the general method reaches them through five calls and a
loop over the virial columns. :func:`fast_slope_parts` returns one function that does the same
arithmetic, operation for operation, so its answers are bit-for-bit those of the general method
(a test checks this on random states), and hands every other state (saturated, out of range, a
failed flash) to the general method, which also raises its errors.
"""
from __future__ import annotations

__all__ = ["fast_slope_parts", "fast_state", "fast_volume_slope"]

import math

from stagewright.core import coolprop_adapter as cpa
from stagewright.core.models.base import P_MAX, P_MIN, T_MAX, T_MIN
from stagewright.core.moist import mixture as mx  # the grid constants of the fused tables
from stagewright.core.moist.mixture import virial_cubic

_LIQUID_NEGLIGIBLE = 1e-9  # as stagewright.core.moist.stream: a liquid share (of the water) treated as none on a path


def _parts_of(stream):
    """(mixture, dry model, fused tables, dry CoolProp state, water) of ``stream`` where the one-call
    functions apply (the real-gas mixture with its fused tables, the dry model's own density flash,
    some water), else None."""
    mix = stream.mixture
    dry = stream.dry
    fused = mix._fused
    state = getattr(dry, "_state", None)
    W = stream.water
    if fused is None or state is None or not hasattr(dry, "_flash") or not W > 0.0:
        return None
    return mix, dry, fused, state, W


def _virial_weights(mix, W: float) -> tuple[float, float, float]:
    """The weights of the B_aa, B_aw and B_ww tables in the interaction volume D per kilogram of dry
    air at water content W: :math:`D = n_a[-x_w B_{aa} + 2 x_w B_{aw} + (x_w^2/x_a) B_{ww}]`
    (:class:`~stagewright.core.moist.mixture.MoistMixture`)."""
    x_w = W / (mix.epsilon + W)
    x_a = 1.0 - x_w
    n_a = mix.n_a
    return -n_a * x_w, 2.0 * n_a * x_w, n_a * x_w * x_w / x_a


def fast_slope_parts(stream):
    r"""``parts(T, P) -> (p v/c_p, p (∂h/∂p)_T/c_p, p v)`` of ``stream``, or None where it cannot help.

    ``parts(T, P, derivative=True)`` also returns the temperature derivatives at constant p of the
    first two, :math:`\partial a/\partial T` and :math:`\partial b/\partial T` (from CoolProp's
    :math:`(\partial\rho/\partial T)_p`, :math:`(\partial^2\rho/\partial T^2)_p` and
    :math:`(\partial c_p/\partial T)_p` of dry air and the cubic tables' own derivatives, so they are
    the derivatives of the function as computed); states it hands to the general method answer the
    three values alone.

    The gas phase per kilogram of dry air with vapour content :math:`w` and interaction volume
    :math:`D(T)` (second virial coefficients of RP-1485 [1]_, per kilogram of dry air):

    .. math:: v = v_a + w R_w T/p + D, \quad c_p = c_{p,a} + w\,c^\circ_{p,w} - p T D'',
       \quad (\partial h/\partial p)_T = (\partial h_a/\partial p)_T + D - T D'

    with dry air from the Lemmon et al. equation of state [2]_ (CoolProp).

    Parameters
    ----------
    stream : MoistAir
        A moist stream on the real-gas mixture (water > 0).

    Returns
    -------
    callable or None
        The function; None unless the stream's mixture is the real-gas one with its fused
        vapour/virial tables (the general method is then the only one).

    References
    ----------
    .. [1] R. Herrmann, W. Wagner, A. H. Harvey, "Thermodynamic Properties of Real Moist Air, Dry
       Air, Steam, Water, and Ice", ASHRAE RP-1485, 2009.
    .. [2] E. W. Lemmon, R. T. Jacobsen, S. G. Penoncello, D. G. Friend, J. Phys. Chem. Ref.
       Data 29 (2000) 331–385.

    Examples
    --------
    >>> from stagewright.core.models import RealGasAir
    >>> from stagewright.core.moist.mixture import make_mixture
    >>> from stagewright.core.moist.stream import MoistAir
    >>> air = MoistAir(make_mixture(RealGasAir()), 0.01)
    >>> fast = fast_slope_parts(air)
    >>> fast(400.0, 3e5) == air.polytropic_slope_parts(400.0, 3e5)
    True
    """
    parts_of = _parts_of(stream)
    if parts_of is None:
        return None
    mix, dry, fused, state, W = parts_of
    general = stream.polytropic_slope_parts
    hc, _, aa, aw, ww = fused
    last = len(hc) - 1
    t_lo, step = mx._T_LO, mx._STEP
    ss = step * step
    ca, cw, cww = _virial_weights(mix, W)
    cubics = {}  # grid interval -> the cubic of D there (virial_cubic), for this water content
    wRw = W * mix.R_w
    flash = dry._flash  # the dry-air model's (T, p) flash (stagewright.core.air_tp_flash)
    rhomass, cpmass, partial = state.rhomass, state.cpmass, state.first_partial_deriv
    iH, iP, iT = cpa.iHmass, cpa.iP, cpa.iT

    split = stream.split
    negligible = _LIQUID_NEGLIGIBLE * W
    second = state.second_partial_deriv
    iD, iCp = cpa.iDmass, cpa.iCpmass

    def parts(T: float, P: float, derivative: bool = False):
        if not (T_MIN <= T <= T_MAX and P_MIN <= P <= P_MAX):
            return general(T, P)  # raises the general method's error
        if not (T >= stream._dry_T and P < stream._dry_P_limit) and split(T, P)[1] > negligible:
            return general(T, P)  # liquid: the two-phase state (the general method's own split)
        at = (T, P)
        if dry._at != at:
            dry._at = None
            try:
                flash(P, T)
            except ValueError:
                return general(T, P)  # raises the adapter's error
            dry._at = at
        v_a, cp_a, hp_a = 1.0 / rhomass(), cpmass(), partial(iH, iP, iT)
        x = (T - t_lo) / step
        i = int(x)  # min(max(int(x), 0), last) of the general method, without the two calls
        if i > last:
            i = last
        elif i < 0:
            i = 0
        t = x - i
        _, b, c, e = hc[i]
        cpw = (b + t * (2.0 * c + 3.0 * e * t)) / step
        cubic = cubics.get(i)
        if cubic is None:
            cubic = cubics[i] = virial_cubic(aa[i], aw[i], ww[i], ca, cw, cww)
        a, b, c, e = cubic
        d = a + t * (b + t * (c + t * e))
        d_t = (b + t * (2.0 * c + 3.0 * e * t)) / step
        d_tt = (2.0 * c + 6.0 * e * t) / ss
        v = v_a + wRw * T / P + d
        cp = cp_a + W * cpw - P * T * d_tt
        hp = hp_a + d - T * d_t
        if not derivative:
            return P * v / cp, P * hp / cp, P * v
        # ∂/∂T at constant p of a = p v/c_p and b = p (∂h/∂p)_T/c_p, from the same functions
        rho_t = partial(iD, iT, iP)
        v_t = -v_a * v_a * rho_t + wRw / P + d_t
        v_a_tt = (2.0 * rho_t * rho_t * v_a - second(iD, iT, iP, iT, iP)) * v_a * v_a
        d_ttt = e * 6.0 / (ss * step)
        _, _, c, e = hc[i]
        cp_t = partial(iCp, iT, iP) + W * (2.0 * c + 6.0 * e * t) / ss - P * d_tt - P * T * d_ttt
        hp_t = -T * v_a_tt - T * d_tt
        return (P * v / cp, P * hp / cp, P * v,
                P * (v_t * cp - v * cp_t) / (cp * cp), P * (hp_t * cp - hp * cp_t) / (cp * cp))
    return parts


def fast_state(stream):
    r"""``state(T, P, need_cp=True)``: :meth:`~stagewright.core.moist.stream.MoistAir._state` without
    ``slope`` (h, s, v, cp, 0, w_v, w_l) of ``stream`` in one call, or None where it cannot help.

    Where the stream is unsaturated the gas phase of :meth:`~stagewright.core.moist.mixture.MoistMixture.gas`
    [1]_ [2]_ is computed here with its arithmetic, operation for operation (the same answers, bit for
    bit; a test checks it on random states), from one CoolProp (T, p) update of dry air and one
    look-up of the fused vapour and virial tables; the mixing entropy, constant for the stream, is
    computed once. Saturated and out-of-range states (and a failed flash) go to the general method,
    which raises its errors.

    .. math:: h = h_a + w h_w^\circ + p (D - T D'), \quad
       s = s_a + w [s_w^\circ - R_w \ln(p/p_\mathrm{ref})] + s_\mathrm{mix} - p D', \quad
       v = v_a + w R_w T/p + D, \quad c_p = c_{p,a} + w c^\circ_{p,w} - p T D''

    Parameters
    ----------
    stream : MoistAir
        A moist stream on the real-gas mixture (water > 0).

    Returns
    -------
    callable or None
        The function; None unless the stream's mixture is the real-gas one with its fused tables.

    References
    ----------
    .. [1] R. Herrmann, W. Wagner, A. H. Harvey, "Thermodynamic Properties of Real Moist Air, Dry
       Air, Steam, Water, and Ice", ASHRAE RP-1485, 2009.
    .. [2] E. W. Lemmon, R. T. Jacobsen, S. G. Penoncello, D. G. Friend, J. Phys. Chem. Ref.
       Data 29 (2000) 331–385.

    Examples
    --------
    >>> from stagewright.core.models import RealGasAir
    >>> from stagewright.core.moist.mixture import make_mixture
    >>> from stagewright.core.moist.stream import MoistAir
    >>> air = MoistAir(make_mixture(RealGasAir()), 0.01)
    >>> fast_state(air)(400.0, 3e5) == air._state(400.0, 3e5, slope=False)
    True
    """
    parts_of = _parts_of(stream)
    if parts_of is None:
        return None
    mix, dry, fused, state, W = parts_of
    eps = mix.epsilon
    x_w = W / (eps + W)
    if x_w == 0.0:
        return None
    x_a = 1.0 - x_w
    general = stream._state
    hc, sc, aa, aw, ww = fused
    last = len(hc) - 1
    t_lo, step = mx._T_LO, mx._STEP
    ss = step * step
    ca, cw, cww = _virial_weights(mix, W)
    cubics = {}  # grid interval -> the cubic of D there (virial_cubic), for this water content
    R_w = mix.R_w
    wRw = W * R_w
    s_mix = -mix.R_a * (math.log(x_a) + (W / eps) * math.log(x_w))
    log, p_ref = math.log, mx.P_REF
    split = stream.split
    flash = dry._flash  # the dry-air model's (T, p) flash (stagewright.core.air_tp_flash)
    hmass, smass, rhomass, cpmass = state.hmass, state.smass, state.rhomass, state.cpmass

    def at(T: float, P: float, need_cp: bool = True):
        if not (T_MIN <= T <= T_MAX and P_MIN <= P <= P_MAX):
            return general(T, P, False, need_cp)  # raises the general method's error
        if not (T >= stream._dry_T and P < stream._dry_P_limit):
            phases = split(T, P)
            if phases[1] != 0.0:
                return general(T, P, False, need_cp, phases)  # liquid: the two-phase state
        at = (T, P)
        if dry._at != at:
            dry._at = None
            try:
                flash(P, T)
            except ValueError:
                return general(T, P, False, need_cp)  # raises the adapter's error
            dry._at = at
        h_a, s_a, v_a, cp_a = hmass(), smass(), 1.0 / rhomass(), cpmass()
        x = (T - t_lo) / step
        i = int(x)  # min(max(int(x), 0), last) of the general method, without the two calls
        if i > last:
            i = last
        elif i < 0:
            i = 0
        t = x - i
        a, b, c, e = hc[i]
        hw = a + t * (b + t * (c + t * e))
        cpw = (b + t * (2.0 * c + 3.0 * e * t)) / step
        a, b, c, e = sc[i]
        sw = a + t * (b + t * (c + t * e))
        cubic = cubics.get(i)
        if cubic is None:
            cubic = cubics[i] = virial_cubic(aa[i], aw[i], ww[i], ca, cw, cww)
        a, b, c, e = cubic
        d = a + t * (b + t * (c + t * e))
        d_t = (b + t * (2.0 * c + 3.0 * e * t)) / step
        d_tt = (2.0 * c + 6.0 * e * t) / ss
        return (h_a + W * hw + P * (d - T * d_t), s_a + W * (sw - R_w * log(P / p_ref)) + s_mix - P * d_t,
                v_a + wRw * T / P + d, cp_a + W * cpw - P * T * d_tt, 0.0 + d - T * d_t, W, 0.0)
    return at


def fast_volume_slope(stream):
    r"""``v_T(T, P)``: :math:`(\partial v/\partial T)_p` of ``stream``'s gas phase per kilogram of dry
    air [m³/(kg K)] at the state its dry-air model was last set to, or None where it cannot help.

    .. math:: \left(\frac{\partial v}{\partial T}\right)_p = -\frac{1}{\rho_a^2}
       \left(\frac{\partial \rho_a}{\partial T}\right)_p + \frac{w R_w}{p} + D'(T)

    (the derivative of :func:`fast_slope_parts`'s :math:`v` [1]_ [2]_). The function answers None
    unless the dry-air state is at exactly (T, P) (the last evaluation of :func:`fast_state` left it
    there), so a caller never reads a derivative of another state.

    Parameters
    ----------
    stream : MoistAir
        A moist stream on the real-gas mixture (water > 0).

    Returns
    -------
    callable or None
        The function; None where :func:`fast_state` does not apply.

    References
    ----------
    .. [1] R. Herrmann, W. Wagner, A. H. Harvey, "Thermodynamic Properties of Real Moist Air, Dry
       Air, Steam, Water, and Ice", ASHRAE RP-1485, 2009.
    .. [2] E. W. Lemmon, R. T. Jacobsen, S. G. Penoncello, D. G. Friend, J. Phys. Chem. Ref.
       Data 29 (2000) 331–385.

    Examples
    --------
    >>> from stagewright.core.models import RealGasAir
    >>> from stagewright.core.moist.mixture import make_mixture
    >>> from stagewright.core.moist.stream import MoistAir
    >>> air = MoistAir(make_mixture(RealGasAir()), 0.01)
    >>> v = fast_state(air)
    >>> v_t = fast_volume_slope(air)
    >>> slope = (v(400.001, 3e5)[2] - v(399.999, 3e5)[2]) / 0.002
    >>> _ = v(400.0, 3e5)
    >>> abs(v_t(400.0, 3e5) / slope - 1.0) < 1e-7
    True
    """
    parts_of = _parts_of(stream)
    if parts_of is None:
        return None
    mix, dry, fused, state, W = parts_of
    _, _, aa, aw, ww = fused
    last = len(aa) - 1
    t_lo, step = mx._T_LO, mx._STEP
    ca, cw, cww = _virial_weights(mix, W)
    cubics = {}  # grid interval -> the cubic of D there (virial_cubic), for this water content
    wRw = W * mix.R_w
    partial, rhomass = state.first_partial_deriv, state.rhomass
    iD, iT, iP = cpa.iDmass, cpa.iT, cpa.iP

    def v_t(T: float, P: float):
        if dry._at != (T, P):
            return None
        x = (T - t_lo) / step
        i = int(x)
        if i > last:
            i = last
        elif i < 0:
            i = 0
        t = x - i
        cubic = cubics.get(i)
        if cubic is None:
            cubic = cubics[i] = virial_cubic(aa[i], aw[i], ww[i], ca, cw, cww)
        _, b, c, e = cubic
        d_t = (b + t * (2.0 * c + 3.0 * e * t)) / step
        rho = rhomass()
        return -partial(iD, iT, iP) / (rho * rho) + wRw / P + d_t
    return v_t
