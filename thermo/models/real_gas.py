"""Real-gas air: the Lemmon et al. (2000) reference equation of state via CoolProp [1]_."""
from __future__ import annotations

__all__ = ["RealGasAir"]

from stagewright.core import coolprop_adapter as cpa
from stagewright.core.air_tp_flash import tp_flash
from stagewright.core.models.base import Point, check_range
from stagewright.core.models.newton import invert_temperature


class RealGasAir:
    r"""Dry air as a real gas (pseudo-pure fluid, reference equation of state) [1]_ [2]_.

    States from (T, p) use CoolProp's low-level ``AbstractState`` with the density found by
    :func:`stagewright.core.air_tp_flash.tp_flash`; states from (h, p) and (s, p) are found by
    Newton iteration on T with (T, p) updates, which is several times cheaper than CoolProp's
    own two-phase-aware flashes for a gas.

    Polytropic slope (from dh = v dp / ηp):

    .. math:: \frac{dT}{d\ln p} = \frac{p\,(v/\eta_p - (\partial h/\partial p)_T)}{c_p}

    Examples
    --------
    >>> m = RealGasAir()
    >>> round(m.at_tp(300.0, 101325.0).rho, 4)
    1.177

    References
    ----------
    .. [1] E. W. Lemmon, R. T. Jacobsen, S. G. Penoncello, D. G. Friend, "Thermodynamic
       Properties of Air and Mixtures of Nitrogen, Argon, and Oxygen From 60 to 2000 K at
       Pressures to 2000 MPa", J. Phys. Chem. Ref. Data 29 (2000) 331–385.
    .. [2] I. H. Bell et al., Ind. Eng. Chem. Res. 53 (2014) 2498–2508 (CoolProp).
    """

    name = "real_gas"

    def __init__(self) -> None:
        self._state = cpa.new_gas_air_state()  # (T, p) updates only: the gas phase imposed
        self._flash = tp_flash(self._state)  # its (T, p) flash: Newton on density from a virial guess
        self.gas_constant = self._state.gas_constant() / self._state.molar_mass()
        self.molar_mass = self._state.molar_mass()
        self._at = None  # (T, P) the state was last set to; a repeat needs no new update
        self._terms_memo: dict = {}  # (T, P, slope) -> terms: a cooler's outlet repeats between solves

    def _set(self, T: float, P: float, where: str) -> None:
        check_range(T, P, where)
        if self._at == (T, P):
            return
        self._at = None  # stays None if the update fails
        cpa.update_tp(self._state, T, P, where, self._flash)
        self._at = (T, P)

    def at_tp(self, T: float, P: float, where: str = "") -> Point:
        self._set(T, P, where)
        st = self._state
        return Point(T, P, st.hmass(), st.smass(), st.rhomass())

    def _h_and_cp(self, P: float, where: str):
        st = self._state

        def f(T: float):
            self._set(T, P, where)
            return st.hmass(), st.cpmass()
        return f

    def _s_and_slope(self, P: float, where: str):
        st = self._state

        def f(T: float):
            self._set(T, P, where)
            return st.smass(), st.cpmass() / T
        return f

    def at_hp(self, h: float, P: float, where: str = "", T_guess: float = 300.0) -> Point:
        T = invert_temperature(self._h_and_cp(P, where), h, T_guess, where, "enthalpy")
        return self.at_tp(T, P, where)

    def at_sp(self, s: float, P: float, where: str = "", T_guess: float = 300.0) -> Point:
        T = invert_temperature(self._s_and_slope(P, where), s, T_guess, where, "entropy")
        return self.at_tp(T, P, where)

    def terms(self, T: float, P: float, slope: bool = True) -> tuple:
        """h, s, v, cp and (∂h/∂p)_T (0.0 unless ``slope``) at T [K], P [Pa] from one update.

        The answers of the last few states are kept (a saturated cooler outlet, which the moist
        mixture's general method reaches through here, is often where it was in the last solve)."""
        memo = self._terms_memo
        key = (T, P, slope)
        hit = memo.get(key)
        if hit is not None:
            return hit
        self._set(T, P, "moist-air state")
        st = self._state
        hp = st.first_partial_deriv(cpa.iHmass, cpa.iP, cpa.iT) if slope else 0.0
        if len(memo) >= 32:
            memo.clear()
        hit = memo[key] = (st.hmass(), st.smass(), 1.0 / st.rhomass(), st.cpmass(), hp)
        return hit

    def slope_terms(self, T: float, P: float) -> tuple:
        """v, cp and (∂h/∂p)_T at T [K], P [Pa]: the part of :meth:`terms` a path slope needs."""
        self._set(T, P, "moist-air state")
        st = self._state
        return 1.0 / st.rhomass(), st.cpmass(), st.first_partial_deriv(cpa.iHmass, cpa.iP, cpa.iT)

    def polytropic_slope(self, T: float, P: float, efficiency: float) -> float:
        self._set(T, P, "polytropic path")
        st = self._state
        dh_dp_T = st.first_partial_deriv(cpa.iHmass, cpa.iP, cpa.iT)
        return P * (1.0 / (st.rhomass() * efficiency) - dh_dp_T) / st.cpmass()
