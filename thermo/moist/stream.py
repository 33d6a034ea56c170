"""A moist-air stream of fixed total water content, in phase equilibrium, as a property model [1]_ [2]_.

:class:`MoistAir` answers the same questions as a dry-air model (``at_tp``, ``at_hp``,
``at_sp``, ``polytropic_slope``), so stages and coolers use it unchanged. Its points carry
the vapour and liquid water per kilogram of dry air; h and s are per kilogram of dry air.
The helpers below turn the site's humidity input into the intake humidity ratio and give
the per-point humidity figures of the results.
"""
from __future__ import annotations

__all__ = ["MoistAir", "moist_stream", "intake_humidity_ratio", "ice_supersaturation", "humidity_of", "check_humid_range"]

import math

from stagewright.core.errors import InputError, message_detail, quantity
from stagewright.core.models.base import Point, check_range
from stagewright.core.models.newton import invert_to_state
from stagewright.core.moist.mixture import MoistMixture
from stagewright.core.moist.saturation import T_CRITICAL, liquid_vapour_pressure, vapour_pressure
from stagewright.core.moist.slope_parts import fast_slope_parts, fast_state, fast_volume_slope

_LIQUID_NEGLIGIBLE = 1e-9  # liquid share (of the stream's water) treated as none on a path
_DT = 1e-3  # central-difference step in T for two-phase derivatives, [K]
_DP = 1e-6  # relative central-difference step in p for two-phase derivatives


class MoistAir:
    r"""Dry air with a fixed total water content W (vapour + liquid) per kilogram of dry air [1]_.

    At (T, p) the water is split by phase equilibrium:

    .. math::

        w_v = \min(W, w_s(T, p)), \qquad w_l = W - w_v, \qquad
        h = h_g(T, p, w_v) + w_l\,h_l(T, p), \qquad s = s_g(T, p, w_v) + w_l\,s_l(T, p)

    with the gas phase, saturation humidity ratio :math:`w_s` and condensed water of
    :class:`~stagewright.core.moist.mixture.MoistMixture`. Liquid is therefore present only where the
    stream is saturated; compression that heats it evaporates any liquid carried in
    (a supersaturated stage inlet after a separator of efficiency below 1), cooling below
    the dew point condenses water.

    Parameters
    ----------
    mixture : MoistMixture
        Formulation of moist air for the chosen property model.
    water : float
        Total water per dry air W, [kg/kg], > 0.

    Notes
    -----
    In the single-phase (unsaturated) region every property is analytic; in the
    two-phase region cp, (∂h/∂p)_T and the polytropic slope come from central
    differences of the equilibrium enthalpy (the kink at the dew point is handled by the
    bracketed Newton iteration). The kinetic energy of the stream is carried by the
    whole moist mass, ``mass_per_dry_kg`` = 1 + W per kilogram of dry air.

    Examples
    --------
    >>> from stagewright.core.models import ConstantCpAir
    >>> from stagewright.core.moist.mixture import make_mixture
    >>> air = MoistAir(make_mixture(ConstantCpAir()), 0.01)
    >>> p = air.at_tp(290.0, 8e5)  # 8 bar, 16.85 °C: w_s = 0.622 · 1920 / (8e5 − 1920)
    >>> round(p.w, 5), round(p.wl, 5)
    (0.0015, 0.0085)

    References
    ----------
    .. [1] ASHRAE Handbook — Fundamentals, 2017, ch. 1 (psychrometrics: humidity ratio,
       saturation, moist-air enthalpy per kilogram of dry air).
    .. [2] Y. A. Çengel, M. A. Boles, *Thermodynamics: An Engineering Approach*, 8th ed.,
       McGraw-Hill, 2015, §14-1 to §14-7 (gas–vapour mixtures).
    """

    def __init__(self, mixture: MoistMixture, water: float):
        self.mixture = mixture
        self._dry_T, self._dry_P_limit = math.inf, 0.0  # see split(): the last state found surely unsaturated
        self._dry_T2, self._dry_P_limit2 = math.inf, 0.0  # and the one before it
        self.dry = mixture.dry
        self.name = mixture.name
        self.water = water
        self.mass_per_dry_kg = 1.0 + water
        self.gas_constant = (mixture.R_a + water * mixture.R_w) / (1.0 + water)
        self.molar_mass = getattr(self.dry, "molar_mass", None)

    # ---- equilibrium -------------------------------------------------------------------------
    def split(self, T: float, P: float) -> tuple[float, float]:
        """(vapour, liquid) per dry air [kg/kg] at equilibrium.

        A state at least as hot as one already found surely unsaturated, at a pressure below
        the one at which that state's vapour pressure would saturate the stream, is unsaturated
        too (p_ws grows with T): the saturation pressure need not be evaluated again. Along a
        compression path that answers almost every slope evaluation; the last two such states are
        kept (a path's evaluations alternate between the inlet, near saturation, and hotter states).
        The test itself is :meth:`~stagewright.core.moist.mixture.MoistMixture.surely_unsaturated`'s,
        with its vapour pressure evaluated once for the test and the kept limit."""
        W = self.water
        if (T >= self._dry_T and P < self._dry_P_limit) or (T >= self._dry_T2 and P < self._dry_P_limit2):
            return W, 0.0
        if T >= T_CRITICAL:
            return W, 0.0
        mix = self.mixture
        p_ws = vapour_pressure(T)
        if W / (mix.epsilon + W) * P < 0.999 * p_ws:
            if W > 0.0:
                self._dry_T2, self._dry_P_limit2 = self._dry_T, self._dry_P_limit
                self._dry_T, self._dry_P_limit = T, 0.999 * p_ws * (mix.epsilon + W) / W
            return W, 0.0
        ws = mix.saturation_ratio(T, P)
        return (W, 0.0) if W <= ws else (ws, W - ws)

    def _state(self, T: float, P: float, slope: bool, need_cp: bool = True, phases: tuple | None = None):
        """h, s, v, cp, (∂h/∂p)_T, w_v, w_l at T, P (two-phase derivatives by central differences).

        Without ``need_cp`` a two-phase cp is not computed (NaN): a state wants only h, s, v.
        ``phases``: :meth:`split` at T, P when the caller has it already."""
        w_v, w_l = self.split(T, P) if phases is None else phases
        mix = self.mixture
        h, s, v, cp, hp = mix.gas(T, P, w_v, slope)
        if w_l == 0.0:
            return h, s, v, cp, hp, w_v, 0.0
        h_l, s_l = mix.liquid(T, P)
        h += w_l * h_l
        s += w_l * s_l
        v += w_l * mix.liquid_volume(T, P)
        cp = (self._h(T + _DT, P) - self._h(T - _DT, P)) / (2.0 * _DT) if need_cp else math.nan
        if slope:
            dp = _DP * P
            hp = (self._h(T, P + dp) - self._h(T, P - dp)) / (2.0 * dp)
        return h, s, v, cp, hp, w_v, w_l

    def _h(self, T: float, P: float) -> float:
        w_v, w_l = self.split(T, P)
        h = self.mixture.gas(T, P, w_v, False)[0]
        return h + w_l * self.mixture.liquid(T, P)[0] if w_l > 0.0 else h

    # ---- the property-model interface ------------------------------------------------------
    def _state_without_slope(self):
        """``(T, P, need_cp=True) -> _state(T, P, slope=False, need_cp)``: the one-call function of
        :func:`stagewright.core.moist.slope_parts.fast_state` where it applies (the same answers, bit for
        bit), else this stream's general method."""
        at = self.__dict__.get("_fast_state", None)
        if at is None:
            at = fast_state(self) or (lambda T, P, need_cp=True: self._state(T, P, False, need_cp))
            self._fast_state = at
        return at

    def at_tp(self, T: float, P: float, where: str = "") -> Point:
        check_range(T, P, where)
        h, s, v, _, _, w_v, w_l = self._state_without_slope()(T, P, False)
        return Point(T, P, h, s, (1.0 + w_v) / v, w_v, w_l)

    def at_hp(self, h: float, P: float, where: str = "", T_guess: float = 300.0) -> Point:
        at = self._state_without_slope()
        seen = []  # (T, cp) of each evaluation, for isobaric_guess

        def f(T):
            st = at(T, P)
            seen.append((T, st[3]))
            return st[0], st[3], st
        T, st = invert_to_state(f, h, T_guess, where, "enthalpy", taylor=self._taylor_step(P))
        point = self._point(T, P, st, where)
        self._last_hp = (point, st[3], seen)
        return point

    def isobaric_guess(self, near: Point, h: float) -> float | None:
        r"""A temperature guess [K] for :meth:`at_hp` at ``h`` [J/kg] on the isobar of ``near``, to
        second order from ``near``, or None unless ``near`` is what this stream's last :meth:`at_hp`
        returned (its c_p and the secant of c_p between that inversion's evaluations are then known) [1]_.

        .. math:: h - h_0 = c_p\,\delta + \tfrac12 c_p'\,\delta^2
           \quad\Longrightarrow\quad \delta = \frac{2\,\Delta h}{c_p + \sqrt{c_p^2 + 2 c_p' \Delta h}}

        with :math:`c_p'` the secant between the first and the last evaluation of that inversion (a few
        kelvin apart; none, first order, when they are within 0.1 K or their c_p differ by more
        than 1 %, i.e. the first had liquid). For a discharge that a casing heat loss moves a couple
        of kelvin from the end of the adiabatic compression, the guess is within 5e-6 K (2e-5 K at
        worst, 3 kJ/kg away with the first evaluation 6 K off) of the root, inside the final 1e-4 K
        Taylor step: one evaluation (a first-order guess from the secant c_p between other states
        was some 1e-2 K off: two).

        References
        ----------
        .. [1] K. E. Atkinson, *An Introduction to Numerical Analysis*, 2nd ed., Wiley, 1989, §1.1
           (Taylor's theorem) and §2.2 (Newton's method).
        """
        last = self.__dict__.get("_last_hp")
        if last is None or (last[0] is not near and last[0] != near):
            return None
        point, cp, seen = last
        if point.wl != 0.0:
            return None  # with liquid h(T) has a kink at the dew point
        (t_a, cp_a), (t_b, cp_b) = seen[0], seen[-1]
        slope = 0.0
        if abs(t_b - t_a) > 0.1 and abs(cp_b - cp_a) < 0.01 * cp_b:  # else rounding, or liquid at t_a
            slope = (cp_b - cp_a) / (t_b - t_a)
        dh = h - point.h
        root = cp * cp + 2.0 * slope * dh
        if not (cp > 0.0 and root > 0.0):
            return None
        return point.T + 2.0 * dh / (cp + math.sqrt(root))

    def at_sp(self, s: float, P: float, where: str = "", T_guess: float = 300.0) -> Point:
        at = self._state_without_slope()

        def f(T):
            st = at(T, P)
            return st[1], st[3] / T, st
        taylor = self._taylor_step(P)  # with it, steps in ln T: two evaluations from 1 K off
        T, st = invert_to_state(f, s, T_guess, where, "entropy", taylor=taylor, in_log=taylor is not None)
        return self._point(T, P, st, where)

    def isenthalpic_guess(self, near: Point, P: float) -> float | None:
        r"""A temperature guess [K] for :meth:`at_hp` at ``near.h`` and pressure P [Pa] (a throttle,
        e.g. the intake filter), to first order in the pressure change by the Joule–Thomson
        coefficient at ``near`` [1]_, or None where it is not known cheaply (liquid at ``near``, no
        one-call volume slope, or the dry-air state is no longer set at ``near``).

        .. math:: T \approx T_0 + \mu_\mathrm{JT}\,(p - p_0), \qquad
           \mu_\mathrm{JT} = \left(\frac{\partial T}{\partial p}\right)_h
           = \frac{T\,(\partial v/\partial T)_p - v}{c_p}

        (v and c_p per kilogram of dry air). For a filter's pressure drop of a few kilopascal the
        guess is within about 1e-6 K of the root (second order in the drop), inside the final
        1e-4 K Taylor step: the inversion needs one evaluation (the inlet temperature as the
        guess, some 3e-3 K off: two).

        References
        ----------
        .. [1] Y. A. Çengel, M. A. Boles, *Thermodynamics: An Engineering Approach*, 8th ed.,
           McGraw-Hill, 2015, §12-5 (the Joule–Thomson coefficient).
        """
        if near.wl != 0.0 or near.w != self.water:
            return None
        v_t = self._volume_slope_fn()
        slope = v_t(near.T, near.P) if v_t is not None else None
        if slope is None:
            return None
        _, _, v, cp, _, _, _ = self._state_without_slope()(near.T, near.P)  # no flash: the state is set
        return near.T + (near.T * slope - v) / cp * (P - near.P)

    def _volume_slope_fn(self):
        """This stream's :func:`~stagewright.core.moist.slope_parts.fast_volume_slope` (made once), or None."""
        v_t = self.__dict__.get("_volume_slope", False)
        if v_t is False:
            v_t = self._volume_slope = fast_volume_slope(self)
        return v_t

    def _taylor_step(self, P: float):
        r"""``(T, state, δ) -> state at T + δ`` at pressure P to first order, for the last step of an
        inversion (:func:`stagewright.core.models.newton.invert_to_state`), or None where the stream
        has no one-call volume slope; the function itself answers None for a state with liquid
        (where h(T) has a kink at the dew point) or one it cannot read.

        .. math:: h + c_p\,\delta, \qquad s + \frac{c_p}{T}\,\delta, \qquad
           v + \left(\frac{\partial v}{\partial T}\right)_p \delta

        (:math:`(\partial s/\partial T)_p = c_p/T`; Taylor's theorem, the error of order δ²).
        """
        v_t = self._volume_slope_fn()
        if v_t is None:
            return None

        def step(T: float, st: tuple, d: float):
            h, s, v, cp, hp, w_v, w_l = st
            if w_l != 0.0 or w_v != self.water:
                return None
            slope = v_t(T, P)
            if slope is None:
                return None
            return h + cp * d, s + cp / T * d, v + slope * d, cp, hp, w_v, w_l
        return step

    @staticmethod
    def _point(T: float, P: float, st: tuple, where: str) -> Point:
        """The Point of a state tuple from :meth:`_state` (the last Newton evaluation)."""
        check_range(T, P, where)
        h, s, v, _, _, w_v, w_l = st
        return Point(T, P, h, s, (1.0 + w_v) / v, w_v, w_l)

    def polytropic_slope(self, T: float, P: float, efficiency: float) -> float:
        check_range(T, P, "polytropic path")
        if self.split(T, P)[1] <= _LIQUID_NEGLIGIBLE * self.water:
            return self._slope_vapour(T, P, efficiency)
        _, _, v, cp, hp, _, _ = self._state(T, P, slope=True)
        return P * (v / efficiency - hp) / cp

    def polytropic_slope_parts(self, T: float, P: float) -> tuple[float, float, float]:
        """(p v/c_p [K], p (∂h/∂p)_T/c_p [K], p v [J/kg]) at T, P, from the same state as
        :meth:`polytropic_slope`, which is ``a/η − b`` of the first two (one evaluation gives the
        slope at every efficiency; :func:`stagewright.core.polytropic.polytropic_efficiency_between` uses it)."""
        check_range(T, P, "polytropic path")
        if self.split(T, P)[1] <= _LIQUID_NEGLIGIBLE * self.water:
            v, cp, hp = self.mixture.gas_slope_terms(T, P, self.water)
        else:
            _, _, v, cp, hp, _, _ = self._state(T, P, slope=True)
        return P * v / cp, P * hp / cp, P * v

    def fast_slope_parts(self):
        """:meth:`polytropic_slope_parts` in one call where the stream is surely unsaturated (bit-for-bit
        the same answers; :func:`stagewright.core.moist.slope_parts.fast_slope_parts`), or None."""
        fast = self.__dict__.get("_fast_parts", False)
        if fast is False:
            fast = self._fast_parts = fast_slope_parts(self)
        return fast

    def _slope_vapour(self, T: float, P: float, efficiency: float) -> float:
        """Polytropic slope with all the water as vapour (no latent heat in cp).

        Used wherever the stream holds no liquid: at a saturated stage inlet a liquid share
        of rounding size would otherwise put the latent heat into a finite-difference cp
        and make the path jump.
        """
        v, cp, hp = self.mixture.gas_slope_terms(T, P, self.water)
        return P * (v / efficiency - hp) / cp

    def _h_saturated(self, T: float, P: float) -> float:
        """Enthalpy with the vapour held at saturation (liquid W − w_s, negative past the dew point)."""
        ws = self.mixture.saturation_ratio(T, P)
        return self.mixture.gas(T, P, ws, False)[0] + (self.water - ws) * self.mixture.liquid(T, P)[0]

    def _slope_saturated(self, T: float, P: float, efficiency: float) -> float:
        """Polytropic slope of the saturated branch, continued smoothly past the dew point."""
        mix = self.mixture
        ws = mix.saturation_ratio(T, P)
        v = mix.gas(T, P, ws, False)[2] + (self.water - ws) * mix.liquid_volume(T, P)
        cp = (self._h_saturated(T + _DT, P) - self._h_saturated(T - _DT, P)) / (2.0 * _DT)
        dp = _DP * P
        hp = (self._h_saturated(T, P + dp) - self._h_saturated(T, P - dp)) / (2.0 * dp)
        return P * (v / efficiency - hp) / cp

    def polytropic_path_start(self, inlet: Point, p_out: float, efficiency: float):
        """Two-phase start of a compression path: (states, state where the last liquid evaporates).

        Liquid carried into a stage evaporates as compression heats the stream. The slope
        of the path jumps where it does (latent heat stops), so the point is located
        (Brent's method on the remaining liquid) and the path is integrated on each side
        separately; the end state then depends smoothly on the efficiency.
        """
        from scipy.optimize import brentq  # local: only moist stages with carry-over need it
        x0, x_end = math.log(inlet.P), math.log(p_out)
        y0 = math.log(inlet.T)

        def rk4(dx_total: float, m: int = 2) -> float:
            y, h = y0, dx_total / m
            for k in range(m):
                x = x0 + k * h
                f = lambda yy, xx: self._slope_saturated(math.exp(yy), math.exp(xx), efficiency) / math.exp(yy)
                k1 = f(y, x)
                k2 = f(y + 0.5 * h * k1, x + 0.5 * h)
                k3 = f(y + 0.5 * h * k2, x + 0.5 * h)
                k4 = f(y + h * k3, x + h)
                y += h * (k1 + 2 * k2 + 2 * k3 + k4) / 6.0
            return y

        def liquid_left(dx: float) -> float:
            return self.water - self.mixture.saturation_ratio(math.exp(rk4(dx)), math.exp(x0 + dx))

        span = x_end - x0
        n = max(4, math.ceil(span / 0.2))  # fixed by inlet and outlet only, never by the efficiency
        lo, hi = 0.0, None  # bracket the first point where the liquid is gone, scanning from the inlet
        for k in range(1, 65):
            if liquid_left(span * k / 64) <= 0.0:
                hi = span * k / 64
                break
            lo = span * k / 64
        if hi is None:  # liquid all the way: one smooth branch
            pts = [inlet] + [self.at_tp(math.exp(rk4(span * k / n, 2 * k)), math.exp(x0 + span * k / n),
                                        "polytropic path") for k in range(1, n + 1)]
            return pts, pts[-1]
        dx = brentq(liquid_left, lo, hi, xtol=1e-12, rtol=1e-14)
        y = rk4(dx)
        T, P = math.exp(y), math.exp(x0 + dx)
        h, s, v, _, _ = self.mixture.gas(T, P, self.water, False)
        pts = [inlet, Point(T, P, h, s, (1.0 + self.water) / v, self.water, 0.0)]
        x, step = x0 + dx, (span - dx) / n
        f = lambda yy, xx: self._slope_vapour(math.exp(yy), math.exp(xx), efficiency) / math.exp(yy)
        for k in range(n):  # the dry remainder, classical RK4 on ln T against ln p
            k1 = f(y, x)
            k2 = f(y + 0.5 * step * k1, x + 0.5 * step)
            k3 = f(y + 0.5 * step * k2, x + 0.5 * step)
            k4 = f(y + step * k3, x + step)
            y += step * (k1 + 2 * k2 + 2 * k3 + k4) / 6.0
            x += step
            pts.append(self.at_tp(math.exp(y), p_out if k == n - 1 else math.exp(x), "polytropic path"))
        return pts, pts[-1]

    def gas_only(self, T: float, P: float, w_v: float, w_l: float) -> tuple[float, float]:
        """(h, s) at T, P with the phase split frozen at w_v, w_l (no condensation or evaporation)."""
        h, s = self.mixture.gas(T, P, w_v, False)[:2]
        if w_l > 0.0:
            h_l, s_l = self.mixture.liquid(T, P)
            h, s = h + w_l * h_l, s + w_l * s_l
        return h, s


def moist_stream(mixture: MoistMixture, water: float) -> MoistAir:
    """The :class:`MoistAir` stream of ``mixture`` with total water ``water`` [kg/kg], one object per
    water content among the last few asked for.

    A stream holds nothing that depends on a solve: its split cache (states surely unsaturated) and
    its one-call property functions are fixed by the mixture and the water. Keeping the object
    spares building them again when the next solve's stream carries the same water (after a cooler
    that condenses, the water does not depend on the ambient). Mixtures are per thread
    (:func:`stagewright.core.solve_context.mixture_for`), so are their streams.
    """
    streams = mixture.__dict__.get("_streams")
    if streams is None:
        streams = mixture._streams = {}
    stream = streams.get(water)
    if stream is None:
        if len(streams) >= 32:
            streams.clear()
        stream = streams[water] = MoistAir(mixture, water)
    return stream


# ---- site humidity ---------------------------------------------------------------------------
def intake_humidity_ratio(site: dict, mixture: MoistMixture, T0: float, P0: float) -> float:
    r"""Humidity ratio of the intake air from the site's humidity input, [kg/kg] [1]_ [2]_ [3]_.

    .. math::

        x_w = \varphi\,\frac{f(T_0, p_0)\,p_{w,\mathrm{liq}}(T_0)}{p_0} \quad\text{or}\quad
        x_w = \frac{f(T_d, p_0)\,p_{ws}(T_d)}{p_0}, \qquad W = \varepsilon\,\frac{x_w}{1 - x_w}

    Parameters
    ----------
    site : dict
        The humidity input: ``dew_point_K``, ``humidity_ratio`` or ``relative_humidity``
        (checked in that order; the document allows only one), e.g.
        :meth:`stagewright.core.project.validation.ResolvedSite.humidity_input`.
    mixture : MoistMixture
        Moist-air formulation of the project's model.
    T0, P0 : float
        Ambient temperature [K] and barometric pressure [Pa], down to 223.15 K.

    Returns
    -------
    float
        Humidity ratio W, [kg water / kg dry air]. Below 0 °C a relative humidity may give
        more water than saturation over ice holds (:func:`ice_supersaturation`).

    Raises
    ------
    InputError
        If the humidity ratio given exceeds saturation at the site.

    Notes
    -----
    Relative humidity :math:`\varphi` is on the mole-fraction basis of RP-1485 and, as
    meteorological data give it, relative to **liquid water even below 0 °C** (WMO-No. 8,
    *Guide to Instruments and Methods of Observation*, annex on humidity formulae — from
    memory): :math:`p_{w,\mathrm{liq}}` is IF97 above 0 °C and the supercooled-water
    equation of Murphy & Koop (2005) below (:func:`stagewright.core.moist.saturation.liquid_vapour_pressure`);
    the enhancement factor f is the mixture's (RP-1485; 1 for the ideal mixtures). A dew
    point below 0.01 °C is a frost point: :math:`p_{ws}` is then the IAPWS 2011 sublimation
    pressure. For the ideal mixtures (f = 1) the relative humidity is the usual
    :math:`p_v/p_{w,\mathrm{liq}}`.

    References
    ----------
    .. [1] ASHRAE Handbook — Fundamentals, 2017, ch. 1, eqs. (20), (22), (24).
    .. [2] D. M. Murphy, T. Koop, Q. J. R. Meteorol. Soc. 131 (2005) 1539–1565, eq. (10).
    .. [3] IAPWS R14-08(2011); W. Wagner, T. Riethmann, R. Feistel, A. H. Harvey,
       J. Phys. Chem. Ref. Data 40 (2011) 043103.
    """
    if site.get("dew_point_K") is not None:
        Td = site["dew_point_K"]
        x = mixture.saturation_fraction(Td, P0)
        return mixture.epsilon * x / (1.0 - x)
    if site.get("humidity_ratio") is not None:
        W = site["humidity_ratio"]
        ws = mixture.saturation_ratio(T0, P0)
        if W > ws:
            raise InputError("site.humidity_ratio", W,
                             f"expected at most {ws:.6g} kg/kg, saturation at the site ambient "
                             f"{T0:.2f} K and {P0:.0f} Pa")
        return W
    x = site["relative_humidity"] * (mixture.enhancement(T0, P0) * liquid_vapour_pressure(T0) / P0)
    return mixture.epsilon * x / (1.0 - x)


def ice_supersaturation(mixture: MoistMixture, T0: float, P0: float, W: float) -> float:
    """Water above saturation over ice in intake air below 0.01 °C, [kg/kg dry air] (0 if none).

    Relative humidity relative to liquid water can exceed saturation over ice (at −10 °C
    ice saturates at about 91 % relative to water): freezing fog or rime. Such air deposits
    the excess on the first cold surface, the intake louvres and filter, before the
    compressor; the train takes in air saturated over ice and the caller warns.

    Parameters
    ----------
    mixture : MoistMixture
        Moist-air formulation.
    T0, P0 : float
        Ambient temperature [K] and pressure [Pa].
    W : float
        Humidity ratio from the site's input, [kg/kg].

    Examples
    --------
    >>> from stagewright.core.models import ConstantCpAir
    >>> from stagewright.core.moist.mixture import make_mixture
    >>> mix = make_mixture(ConstantCpAir())
    >>> W = intake_humidity_ratio({"relative_humidity": 0.95}, mix, 263.15, 101325.0)
    >>> ice_supersaturation(mix, 263.15, 101325.0, W) > 0.0
    True
    """
    if W <= 0.0:
        return 0.0
    ws = mixture.saturation_ratio(T0, P0)
    return W - ws if W > ws * (1.0 + 1e-9) else 0.0


def humidity_of(mixture: MoistMixture | None, p: Point) -> dict:
    """Humidity ratio, liquid ratio, relative humidity and pressure dew point of a point (plain data)."""
    if mixture is None or (p.w == 0.0 and p.wl == 0.0):
        return {"humidity_ratio": 0.0, "liquid_ratio": 0.0, "relative_humidity": 0.0, "dew_point_K": None}
    rh = 1.0 if p.wl > 0.0 else mixture.relative_humidity(p.T, p.P, p.w)
    return {"humidity_ratio": p.w, "liquid_ratio": p.wl, "relative_humidity": rh,
            "dew_point_K": mixture.dew_point(p.P, p.w)}


def check_humid_range(mixture: MoistMixture, points, field: str, what: str) -> None:
    """Raise InputError when a moist state lies outside the humid-air formulation's range.

    Parameters
    ----------
    mixture : MoistMixture
        Its ``t_max`` / ``p_max`` (None: no limit).
    points : iterable of Point
        States to check.
    field : str
        Input field to name in the message (e.g. ``stages[1]``).
    what : str
        Which state, for the message.
    """
    t_max, p_max = mixture.t_max, mixture.p_max
    if t_max is None:
        return
    for p in points:
        if p.T > t_max or p.P > p_max:
            hot = p.T > t_max
            remedy = ("add a stage, lower this stage's pressure ratio, or use fluid.model 'ideal_gas'" if hot
                      else "use fluid.model 'ideal_gas' for moist air above this pressure")
            plain = ("add a stage, lower this stage's pressure ratio, or choose the ideal-gas property model"
                     if hot else "choose the ideal-gas property model for moist air at this pressure")
            detail = message_detail(
                "{what} {quantity} {value} is above the range of the real-gas humid-air property model "
                "(ASHRAE RP-1485: up to {t_max} and {p_max}): " + plain,
                {"what": what[:1].upper() + what[1:], "quantity": "temperature" if hot else "pressure",
                 "value": quantity(p.T, "temperature") if hot else quantity(p.P, "absolute_pressure"),
                 "t_max": quantity(t_max, "temperature"), "p_max": quantity(p_max, "absolute_pressure")})
            raise InputError(field, round(p.T if hot else p.P, 6),
                             f"{what} at {p.T:.2f} K and {p.P:.6g} Pa: moist air with the real_gas model "
                             f"needs states up to {t_max:.2f} K and {p_max:.6g} Pa (range of the ASHRAE "
                             f"RP-1485 humid-air formulation); {remedy}", detail)
