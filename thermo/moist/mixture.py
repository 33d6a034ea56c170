"""Moist air as a mixture: dry air and water vapour (gas phase), the saturation law, condensed water [1]_ [2]_.

One :class:`MoistMixture` per property model. It knows the gas phase at any water content
(per kilogram of dry air), when water vapour saturates, and the properties of the water
that condenses; :class:`stagewright.core.moist.stream.MoistAir` builds the stream model of a fixed total
water content on top of it.
"""
from __future__ import annotations

__all__ = ["MoistMixture", "make_mixture", "RP1485_EPSILON", "RP1485_T_MAX", "RP1485_P_MAX", "P_REF"]

import copy
import math
from functools import lru_cache

from stagewright.core import coolprop_adapter as cpa
from stagewright.core.moist.dew_point import dew_point as _dew_point
from stagewright.core.moist.saturation import T_CRITICAL, liquid_vapour_pressure, vapour_pressure, vapour_pressure_log_slope

P_REF = 101_325.0  #: reference pressure of the ideal-gas entropy of water vapour, [Pa]
R_MOLAR = 8.314462618  #: molar gas constant, CODATA 2018, [J/(mol K)]
M_WATER = 0.018015268  #: molar mass of water, IAPWS-95, [kg/mol]
RP1485_EPSILON = 0.621945  #: M_w / M_a used by ASHRAE RP-1485 (Herrmann et al. 2009)
RP1485_T_MAX = 623.15  #: upper temperature of the RP-1485 humid-air formulation, [K]
RP1485_P_MAX = 10.0e6  #: upper pressure of the RP-1485 humid-air formulation, [Pa]

_T_LO, _T_HI, _STEP = 200.0, 1300.0, 2.0
_DT_LIQUID = 1e-2  # central-difference step for the entropy of condensed water, [K]


class _Table:
    """Cubic Hermite interpolants of several columns on one uniform grid (node values, exact node slopes).

    Each interval stores the cubic's power-basis coefficients, so a look-up is one index
    computation and a Horner evaluation per column.
    """

    def __init__(self, columns):
        self.cols = []
        for values, slopes in columns:
            coef = []
            for k in range(len(values) - 1):
                y0, y1 = values[k], values[k + 1]
                m0, m1 = slopes[k] * _STEP, slopes[k + 1] * _STEP
                coef.append((y0, m0, 3.0 * (y1 - y0) - 2.0 * m0 - m1, 2.0 * (y0 - y1) + m0 + m1))
            self.cols.append(coef)
        self.last = len(self.cols[0]) - 1
        self._memo = (None, False, None)  # (T, with second derivatives, answer) of the last look-up

    def eval(self, T: float, second: bool = False):
        """Per column (y, dy/dT[, d²y/dT²]) at T (the end cubics extrapolate outside the grid).

        The last answer is kept: a path evaluates the same temperature several times in a row
        (the Runge–Kutta stage after a reported point, the enthalpy and entropy of one state)."""
        memo = self._memo
        if memo[0] == T and memo[1] >= second:
            return memo[2]
        x = (T - _T_LO) / _STEP
        i = min(max(int(x), 0), self.last)
        t = x - i
        out = []
        for col in self.cols:
            a, b, c, d = col[i]
            val = a + t * (b + t * (c + t * d))
            d1 = (b + t * (2.0 * c + 3.0 * d * t)) / _STEP
            out.append((val, d1, (2.0 * c + 6.0 * d * t) / (_STEP * _STEP)) if second else (val, d1))
        self._memo = (T, second, out)
        return out


def _grid():
    n = int(round((_T_HI - _T_LO) / _STEP)) + 1
    return [_T_LO + k * _STEP for k in range(n)]


_WATER_TABLES = None
_VIRIAL_TABLES = None


def _water_tables():
    """h°(T) and s°(T, 101 325 Pa) of water vapour, ideal-gas part of IAPWS-95, tabulated once."""
    global _WATER_TABLES
    if _WATER_TABLES is None:
        st = cpa.new_water_state()
        rows = [cpa.water_ideal_gas(st, T) for T in _grid()]
        _WATER_TABLES = _Table([([r[0] for r in rows], [r[2] for r in rows]),
                                ([r[1] for r in rows], [r[2] / T for r, T in zip(rows, _grid())])])
    return _WATER_TABLES


def _virial_tables():
    """Second virial coefficients B_aa, B_aw, B_ww of RP-1485 (via CoolProp), tabulated once."""
    global _VIRIAL_TABLES
    if _VIRIAL_TABLES is None:
        cols = []
        for pair in ("aa", "aw", "ww"):
            vals = [cpa.humid_air_coefficient("B" + pair, T, P_REF) for T in _grid()]
            ders = [cpa.humid_air_coefficient("dB" + pair, T, P_REF) for T in _grid()]
            cols.append((vals, ders))
        _VIRIAL_TABLES = _Table(cols)
    return _VIRIAL_TABLES


@lru_cache(maxsize=512)
def _rp1485_enhancement(T: float, P: float) -> float:
    return cpa.humid_air_coefficient("f", T, P)


class _IdealGasWater:
    """Water vapour as an ideal gas, ideal-gas part of IAPWS-95 [3]_."""

    def __init__(self):
        self._table = _water_tables()

    def __call__(self, T: float):
        (h, cp), (s, _) = self._table.eval(T)
        return h, s, cp


class _ConstantCpWater:
    """Water vapour as a perfect gas: cp, h and s° of the IAPWS-95 ideal-gas part at 298.15 K."""

    T_REF = 298.15

    def __init__(self):
        st = cpa.new_water_state()
        self.h_ref, self.s_ref, self.cp = cpa.water_ideal_gas(st, self.T_REF)

    def __call__(self, T: float):
        return self.h_ref + self.cp * (T - self.T_REF), self.s_ref + self.cp * math.log(T / self.T_REF), self.cp


def virial_cubic(aa: tuple, aw: tuple, ww: tuple, ca: float, cw: float, cww: float) -> tuple:
    """The cubic (in the grid fraction) of the interaction volume D per kilogram of dry air on one
    grid interval: the weighted sum of the B_aa, B_aw and B_ww columns' cubics, coefficient by
    coefficient, with the weights of :meth:`MoistMixture._fused_virial`. One function, so the
    general method and the one-call functions of :mod:`stagewright.core.moist.slope_parts` (which
    keep the cubic of each interval for their fixed water content) compute D alike, bit for bit."""
    return (ca * aa[0] + cw * aw[0] + cww * ww[0], ca * aa[1] + cw * aw[1] + cww * ww[1],
            ca * aa[2] + cw * aw[2] + cww * ww[2], ca * aa[3] + cw * aw[3] + cww * ww[3])


class MoistMixture:
    r"""Moist air: a dry-air property model, water vapour, a saturation law and condensed water [1]_ [2]_ [3]_.

    Gas phase, per kilogram of dry air with vapour content :math:`w` (mole fraction
    :math:`x_w = w/(\varepsilon + w)`), from one Gibbs function so that every property
    is consistent:

    .. math::

        g = g_a(T, p) + w\left[g_w^\circ(T) + R_w T \ln\frac{p}{p_\mathrm{ref}}\right]
            + R_a T\left[\ln x_a + \frac{w}{\varepsilon}\ln x_w\right]
            + p\,\frac{1}{M_a}\left[-x_w B_{aa} + 2 x_w B_{aw} + \frac{x_w^2}{x_a} B_{ww}\right]

    :math:`g_a` is the dry-air model at the total pressure (for ``real_gas`` the full
    Lemmon et al. (2000) equation of state), :math:`g_w^\circ` the ideal-gas water
    vapour of IAPWS-95 and the bracket the ideal (Dalton) mixing term. The last term is
    the change of the mixture's second virial coefficient caused by the water (ASHRAE
    RP-1485 coefficients :math:`B_{aw}(T)`, :math:`B_{ww}(T)`); it is present for
    ``real_gas`` only. ``ideal_gas`` and ``constant_cp`` therefore use an **ideal mixture
    of ideal gases** (Dalton's law, no interaction); ``constant_cp`` also takes water
    vapour with constant cp. :math:`R_w = R_a/\varepsilon`.

    Saturation (vapour mole fraction at saturation):

    .. math:: x_{ws} = f(T, p)\,p_{ws}(T)/p

    with :math:`p_{ws}` of IAPWS-IF97 (over ice, IAPWS 2011, below the triple point
    273.16 K, where the condensed water is then ice) and the enhancement factor :math:`f` of RP-1485
    (CoolProp's implementation) for ``real_gas``, :math:`f = 1` for the ideal mixtures.

    Condensed water has the Gibbs energy of the vapour it is in equilibrium with,
    :math:`g_l(T, p) = \mu_w(T, p, x_{ws})`, so that phase equilibrium is exact within
    the formulation and condensation never creates entropy by itself; its entropy is
    :math:`s_l = -\partial g_l/\partial T` and its enthalpy :math:`h_l = g_l + T s_l`.
    For the ideal mixtures the latent heat that follows is the Clausius–Clapeyron value
    :math:`R_w T^2\,d\ln p_{ws}/dT`.

    Parameters
    ----------
    dry : PropertyModel
        Dry-air model (with ``terms``).
    vapour : callable
        ``T -> (h°, s°(p_ref), cp°)`` of water vapour per kilogram.
    epsilon : float
        Ratio of molar masses M_w/M_a used for mole fractions, [-].
    virial : bool
        Include the RP-1485 interaction term.
    enhancement : bool
        Use the RP-1485 enhancement factor (else f = 1).

    Notes
    -----
    Against CoolProp's ``HAPropsSI`` (the RP-1485 formulation itself) the real-gas mixture
    agrees in enthalpy differences to better than about 1e-4 relative, in saturation humidity
    ratio to about 2e-5 (see the tests); the small differences come from the full dry-air
    equation of state used here and from the third virial coefficients RP-1485 adds.
    ``HAPropsSI`` itself is not used in the inner loops: it is several times slower per
    state and its enthalpy and entropy are not exactly Gibbs-consistent in the water part
    (about 1e-4 relative in cp − T(∂s/∂T)p), which would show as small negative entropy
    generation in nearly reversible stages.

    References
    ----------
    .. [1] A. Herrmann, H.-J. Kretzschmar, D. P. Gatley, "Thermodynamic Properties of Real
       Moist Air, Dry Air, Steam, Water, and Ice", ASHRAE RP-1485, HVAC&R Research 15 (2009)
       961–986.
    .. [2] ASHRAE Handbook — Fundamentals, 2017, ch. 1, eqs. (22)–(25) (humidity ratio,
       relative humidity, enhancement factor).
    .. [3] W. Wagner, A. Pruß, "The IAPWS Formulation 1995 for the Thermodynamic Properties of
       Ordinary Water Substance", J. Phys. Chem. Ref. Data 31 (2002) 387–535.
    """

    def __init__(self, dry, vapour, epsilon: float, virial: bool, enhancement: bool, table=None):
        self.dry = dry
        self.name = dry.name
        self.vapour = vapour
        self.epsilon = epsilon
        self.R_a = dry.gas_constant
        self.R_w = dry.gas_constant / epsilon
        self.virial = _virial_tables() if virial else None
        # real_gas: the vapour and virial tables share one grid, so gas() reads both at one index
        self._fused = ((vapour._table.cols[0], vapour._table.cols[1], *self.virial.cols)
                       if virial and isinstance(vapour, _IdealGasWater) else None)
        self.n_a = 1.0 / dry.molar_mass if virial else 0.0
        self.uses_enhancement = enhancement
        self._table = table  # an EnhancementTable: the fast path of trial solves (None: exact f)
        self._liquid_memo: dict = {}
        #: range of the humid-air formulation (None: no limit beyond the dry model's)
        self.t_max = RP1485_T_MAX if enhancement else None
        self.p_max = RP1485_P_MAX if enhancement else None
        self.formulation = ("ASHRAE RP-1485 saturation and virial interaction (via CoolProp) on the "
                            "Lemmon et al. (2000) dry-air equation of state" if virial else
                            "ideal mixture of dry air and ideal-gas water vapour (Dalton), IAPWS-IF97 "
                            "saturation pressure")

    # ---- gas phase ---------------------------------------------------------------------------
    def _virial_terms(self, T: float, x_w: float):
        """(D, dD/dT, d²D/dT²) of the interaction volume per kilogram of dry air, [m³/kg]."""
        if self.virial is None or x_w == 0.0:
            return 0.0, 0.0, 0.0
        x_a = 1.0 - x_w
        ca, cw, cww = -self.n_a * x_w, 2.0 * self.n_a * x_w, self.n_a * x_w * x_w / x_a
        baa, baw, bww = self.virial.eval(T, second=True)
        return (ca * baa[0] + cw * baw[0] + cww * bww[0], ca * baa[1] + cw * baw[1] + cww * bww[1],
                ca * baa[2] + cw * baw[2] + cww * bww[2])

    def _fused_terms(self, T: float, x_w: float, x_a: float):
        """h°, s°, cp° of the vapour and (D, dD/dT, d²D/dT²) from one grid index: the same
        arithmetic as ``vapour(T)`` and :meth:`_virial_terms`, without their per-column tuples."""
        hc, sc = self._fused[:2]
        x = (T - _T_LO) / _STEP
        i = min(max(int(x), 0), len(hc) - 1)
        t = x - i
        a, b, c, e = hc[i]
        hw = a + t * (b + t * (c + t * e))
        cpw = (b + t * (2.0 * c + 3.0 * e * t)) / _STEP
        a, b, c, e = sc[i]
        sw = a + t * (b + t * (c + t * e))
        return (hw, sw, cpw, *self._fused_virial(i, t, x_w, x_a))

    def _fused_virial(self, i: int, t: float, x_w: float, x_a: float):
        """(D, dD/dT, d²D/dT²) at grid interval i, fraction t (see :meth:`_fused_terms`): the cubic
        of :func:`virial_cubic` on that interval and its derivatives."""
        _, _, aa, aw, ww = self._fused
        a, b, c, e = virial_cubic(aa[i], aw[i], ww[i], -self.n_a * x_w, 2.0 * self.n_a * x_w,
                                  self.n_a * x_w * x_w / x_a)
        return (a + t * (b + t * (c + t * e)), (b + t * (2.0 * c + 3.0 * e * t)) / _STEP,
                (2.0 * c + 6.0 * e * t) / (_STEP * _STEP))

    def gas_slope_terms(self, T: float, P: float, w: float):
        """(v, cp, (∂h/∂p)_T) of the gas phase, per kg dry air: :meth:`gas` without h and s,
        the same arithmetic (a polytropic path's slope needs only these)."""
        dry_terms = getattr(self.dry, "slope_terms", None)
        if self._fused is None or w <= 0.0 or dry_terms is None:
            _, _, v, cp, hp = self.gas(T, P, w, True)
            return v, cp, hp
        v_a, cp_a, hp_a = dry_terms(T, P)
        x_w = w / (self.epsilon + w)
        hc = self._fused[0]
        x = (T - _T_LO) / _STEP
        i = min(max(int(x), 0), len(hc) - 1)
        t = x - i
        _, b, c, e = hc[i]
        cpw = (b + t * (2.0 * c + 3.0 * e * t)) / _STEP
        d, d_t, d_tt = self._fused_virial(i, t, x_w, 1.0 - x_w)
        return v_a + w * self.R_w * T / P + d, cp_a + w * cpw - P * T * d_tt, hp_a + d - T * d_t

    def gas(self, T: float, P: float, w: float, slope: bool = True):
        """Gas phase with vapour content w [kg/kg]: (h [J/kg], s [J/(kg K)], v [m³/kg], cp, (∂h/∂p)_T), per kg dry air.

        (∂h/∂p)_T is exact only when ``slope`` is True."""
        h_a, s_a, v_a, cp_a, hp_a = self.dry.terms(T, P, slope)
        if w <= 0.0:
            return h_a, s_a, v_a, cp_a, hp_a
        x_w = w / (self.epsilon + w)
        x_a = 1.0 - x_w
        if self._fused is not None and x_w != 0.0:
            hw, sw, cpw, d, d_t, d_tt = self._fused_terms(T, x_w, x_a)
        else:
            hw, sw, cpw = self.vapour(T)
            d, d_t, d_tt = self._virial_terms(T, x_w)
        s_mix = -self.R_a * (math.log(x_a) + (w / self.epsilon) * math.log(x_w))
        h = h_a + w * hw + P * (d - T * d_t)
        s = s_a + w * (sw - self.R_w * math.log(P / P_REF)) + s_mix - P * d_t
        v = v_a + w * self.R_w * T / P + d
        cp = cp_a + w * cpw - P * T * d_tt
        hp = hp_a + d - T * d_t
        return h, s, v, cp, hp

    def mu_water(self, T: float, P: float, x_w: float) -> float:
        r"""Chemical potential of water in the gas phase per kilogram of water, [J/kg].

        .. math:: \mu_w = g_w^\circ(T) + R_w T \ln\frac{x_w p}{p_\mathrm{ref}}
           + \frac{p}{\varepsilon M_a}\left[x_a^2 (2B_{aw} - B_{aa}) + x_w (1 + x_a) B_{ww}\right]
        """
        hw, sw, _ = self.vapour(T)
        return hw - T * sw + self.R_w * T * math.log(x_w * P / P_REF) + self._mu_virial(T, P, x_w)

    # ---- saturation ------------------------------------------------------------------------
    def enhancement(self, T: float, P: float) -> float:
        """Enhancement factor f(T, p) [-] (1 for the ideal mixtures)."""
        if not self.uses_enhancement:
            return 1.0
        return _rp1485_enhancement(T, P) if self._table is None else self._table(T, P)

    def saturation_fraction(self, T: float, P: float) -> float:
        """Mole fraction of water vapour at saturation, x_ws = f p_ws / p [-]; inf where water cannot condense."""
        if T >= T_CRITICAL:
            return math.inf
        x = self.enhancement(T, P) * vapour_pressure(T) / P
        return x if x < 1.0 else math.inf

    def saturation_ratio(self, T: float, P: float) -> float:
        """Humidity ratio at saturation, w_s = ε x_ws / (1 − x_ws), [kg/kg] (inf where water cannot condense)."""
        x = self.saturation_fraction(T, P)
        return math.inf if x == math.inf else self.epsilon * x / (1.0 - x)

    def surely_unsaturated(self, T: float, P: float, w: float) -> bool:
        """Cheap test without the enhancement factor: True when w is certainly below saturation."""
        if T >= T_CRITICAL:
            return True
        return w / (self.epsilon + w) * P < 0.999 * vapour_pressure(T)

    # ---- condensed water ----------------------------------------------------------------------
    def _ln_fp(self, T: float, P: float) -> float:
        """ln(f p_ws) at saturation, [ln Pa]."""
        return math.log(self.enhancement(T, P) * vapour_pressure(T))

    def _mu_virial(self, T: float, P: float, x_w: float) -> float:
        """Interaction part of the chemical potential of water, [J/kg] (0 for the ideal mixtures)."""
        if self.virial is None:
            return 0.0
        x_a = 1.0 - x_w
        baa, baw, bww = (c[0] for c in self.virial.eval(T))
        return P * self.n_a / self.epsilon * (x_a * x_a * (2.0 * baw - baa) + x_w * (1.0 + x_a) * bww)

    def _mu_virial_along_saturation(self, T: float, P: float, dln: float) -> tuple[float, float]:
        r"""Interaction part of the chemical potential of water at saturation and its temperature
        derivative along the saturation line, [J/kg], [J/(kg K)], analytically [1]_:

        .. math::

            \frac{d\mu_v}{dT} = \left(\frac{\partial\mu_v}{\partial T}\right)_{x_w}
            + \left(\frac{\partial\mu_v}{\partial x_w}\right)_T x_{ws}\,\frac{d\ln(f p_{ws})}{dT},
            \qquad
            \left(\frac{\partial\mu_v}{\partial x_w}\right)_T = \frac{p}{\varepsilon M_a}\,
            2 x_a\,(B_{ww} + B_{aa} - 2B_{aw})

        with :math:`x_{ws} = f p_{ws}/p` and the virial coefficients' temperature derivatives
        from their tables (the derivative of the interpolating cubic). ``dln`` is
        :math:`d\ln(f p_{ws})/dT` [1/K]. Replaces central differences of :meth:`_mu_virial`.

        References
        ----------
        .. [1] A. Herrmann, H.-J. Kretzschmar, D. P. Gatley, ASHRAE RP-1485, HVAC&R Research 15
           (2009) 961–986 (second virial coefficients of humid air; the interaction term of
           :meth:`mu_water`).
        """
        x_w = self.saturation_fraction(T, P)
        x_a = 1.0 - x_w
        baa, baw, bww = self.virial.eval(T)
        k = P * self.n_a / self.epsilon
        mu = k * (x_a * x_a * (2.0 * baw[0] - baa[0]) + x_w * (1.0 + x_a) * bww[0])
        dmu_dt = k * (x_a * x_a * (2.0 * baw[1] - baa[1]) + x_w * (1.0 + x_a) * bww[1])
        dmu_dx = k * 2.0 * x_a * (bww[0] + baa[0] - 2.0 * baw[0])
        return mu, dmu_dt + dmu_dx * x_w * dln

    def interpolated(self) -> MoistMixture:
        r"""This mixture with the interpolated enhancement factor of
        :mod:`stagewright.core.moist.enhancement_table` (the same object where the factor is 1 or
        already interpolated), made once and kept.

        For figures that hardly depend on f: the isothermal reference of a train delivers its
        condensate at :math:`(T_0, p)`, whose Gibbs energy moves by :math:`R_w T_0\,\delta\ln f`
        per kilogram, so the table's error (below 8e-9 in ln f, tests check 1e-7) moves the
        isothermal power by less than :math:`w R_w T_0 \cdot 10^{-7} / (R_a T_0 \ln r)`, some 1e-9
        of it (tests/test_isothermal_reference.py checks 1e-8 on random trains), and saves the
        exact factor at each drain pressure whenever the ambient changes.
        """
        if not self.uses_enhancement or self._table is not None:
            return self
        twin = self.__dict__.get("_interpolated_twin")
        if twin is None:
            twin = copy.copy(self)
            twin._table = _fast_table()
            twin._liquid_memo = {}
            twin.__dict__.pop("_streams", None)  # its own streams (stream.moist_stream), on its own factor
            self._interpolated_twin = twin
        return twin

    def liquid_gibbs(self, T: float, P: float) -> float:
        """Gibbs energy of condensed water in equilibrium with the vapour, [J/kg]."""
        return self.mu_water(T, P, self.saturation_fraction(T, P))

    def liquid(self, T: float, P: float):
        r"""(h_l [J/kg], s_l [J/(kg K)]) of condensed water at T, P (same reference as the vapour).

        The last few answers are kept: a cooler asks for its outlet's liquid several times
        (outlet state, condensation balance, drain).

        With :math:`g_l = h_w^\circ - T s_w^\circ + R_w T \ln(f p_{ws}/p_\mathrm{ref}) + \mu_v`
        (:math:`\mu_v` the interaction part), :math:`s_l = -\partial g_l/\partial T` and
        :math:`h_l = h_w^\circ - R_w T^2\,\partial\ln(f p_{ws})/\partial T + \mu_v - T\,\partial\mu_v/\partial T`;
        :math:`\mu_v` and its derivative analytically (:meth:`_mu_virial_along_saturation`);
        only :math:`\ln f` is differentiated numerically (central differences of CoolProp's
        RP-1485 factor, which has no closed form: an implicit equation in :math:`x_{ws}` with
        IAPWS-95 liquid properties and Henry's law in Herrmann et al. 2009).
        """
        return self._remembered((T, P), self._liquid, T, P)

    def _remembered(self, key: tuple, compute, *args):
        """``compute(*args)``, kept under ``key`` among the last few condensed-water answers."""
        memo = self._liquid_memo
        hit = memo.get(key)
        if hit is None:
            if len(memo) >= 64:
                memo.clear()
            hit = memo[key] = compute(*args)
        return hit

    def _liquid(self, T: float, P: float):
        d = _DT_LIQUID
        hw, sw, _ = self.vapour(T)
        ln_fp = self._ln_fp(T, P)
        dln = vapour_pressure_log_slope(T)
        if self.uses_enhancement:
            dln += (math.log(self.enhancement(T + d, P)) - math.log(self.enhancement(T - d, P))) / (2.0 * d)
        if self.virial is None:
            mu_v = dmu_v = 0.0
        else:
            mu_v, dmu_v = self._mu_virial_along_saturation(T, P, dln)
        s_l = sw - self.R_w * (ln_fp - math.log(P_REF)) - self.R_w * T * dln - dmu_v
        h_l = hw - self.R_w * T * T * dln + mu_v - T * dmu_v
        return h_l, s_l

    def liquid_volume(self, T: float, P: float) -> float:
        """Specific volume of condensed water ∂g_l/∂p, [m³/kg] (0 for the ideal mixtures)."""
        if not self.uses_enhancement and self.virial is None:
            return 0.0
        return self._remembered((T, P, "v"), self._liquid_volume, T, P)  # asked for with h_l, s_l

    def _liquid_volume(self, T: float, P: float) -> float:
        dp = 1e-4 * P
        return (self.liquid_gibbs(T, P + dp) - self.liquid_gibbs(T, P - dp)) / (2.0 * dp)

    # ---- psychrometric quantities ---------------------------------------------------------
    def relative_humidity(self, T: float, P: float, w: float):
        """Relative humidity x_w p / (f p_w,liq(T)) [-] (mole-fraction basis), relative to liquid
        water also below 0 °C (supercooled; the WMO convention of meteorological data, see
        :mod:`stagewright.core.moist.saturation`); None at or above the critical temperature.

        Defined also where p_ws(T) exceeds p (hot compressed air, where water cannot condense)."""
        if T >= T_CRITICAL:
            return None
        return (w / (self.epsilon + w)) * P / (self.enhancement(T, P) * liquid_vapour_pressure(T))

    def saturation_degree(self, T: float, P: float, w: float):
        """x_w / x_ws [-]: relative humidity over the stable phase (ice below 0.01 °C), the
        convention of ASHRAE RP-1485 and CoolProp's ``HAPropsSI`` input ``R``; None at or above
        the critical temperature."""
        if T >= T_CRITICAL:
            return None
        return (w / (self.epsilon + w)) * P / (self.enhancement(T, P) * vapour_pressure(T))

    def dew_point(self, P: float, w: float):
        """Temperature at which vapour content w saturates at pressure P, [K] (frost point below
        273.16 K); None when w is 0. See :func:`stagewright.core.moist.dew_point.dew_point`.

        Kept with the last few condensed-water answers: a train asks for the delivered air's dew
        points at pressures and water contents that an edit of the ambient often leaves as they were."""
        return self._remembered((P, w, "dew point"), _dew_point, self, w, P)


_FAST_TABLE = None


def _fast_table():
    """The process's one enhancement-factor table (its nodes are kept for later trials),
    behind the same small cache of recent (T, p) as the exact factor."""
    global _FAST_TABLE
    if _FAST_TABLE is None:
        from stagewright.core.moist.enhancement_table import EnhancementTable  # local: only fast trial solves need it
        _FAST_TABLE = lru_cache(maxsize=512)(EnhancementTable())
    return _FAST_TABLE


def make_mixture(dry) -> MoistMixture:
    """The moist mixture that belongs to a dry-air property model (by its name).

    A model flagged ``fast_properties`` (trial solves of studies and sweeps) gets the
    interpolated enhancement factor of :mod:`stagewright.core.moist.enhancement_table`; all others the exact one.
    """
    if dry.name == "real_gas":
        table = _fast_table() if getattr(dry, "fast_properties", False) else None
        return MoistMixture(dry, _IdealGasWater(), RP1485_EPSILON, virial=True, enhancement=True, table=table)
    if dry.name == "ideal_gas":
        return MoistMixture(dry, _IdealGasWater(), M_WATER / dry.molar_mass, virial=False, enhancement=False)
    m_a = R_MOLAR / dry.gas_constant
    return MoistMixture(dry, _ConstantCpWater(), M_WATER / m_a, virial=False, enhancement=False)
