"""Property models against published values (Lemmon et al. 2000; Keenan & Kaye 1948)."""
import math

import pytest

from stagewright.core.errors import PropertyRangeError
from stagewright.core.models import ConstantCpAir, IdealGasAir, RealGasAir


# Lemmon, Jacobsen, Penoncello, Friend, J. Phys. Chem. Ref. Data 29 (2000) 331, Table A2
# (T [K], p [Pa], rho [mol/dm³], cp [J/(mol K)]).
LEMMON_A2 = [(500.0, 0.2e6, 0.048077, 29.84), (130.0, 1.0e6, 1.0295, 34.69), (2000.0, 10e6, 0.59094, 36.25)]


@pytest.mark.parametrize("T, p, rho_molar, cp_molar", LEMMON_A2[:1])
def test_real_gas_matches_lemmon_table_a2(T, p, rho_molar, cp_molar):
    # Only the 500 K point lies inside the model's validity window (200 K … 1300 K);
    # compare per mole (the paper's molar mass differs from CoolProp's by 0.024 %).
    m = RealGasAir()
    pt = m.at_tp(T, p)
    assert pt.rho / m.molar_mass / 1000.0 == pytest.approx(rho_molar, rel=2e-5)
    dT = 0.01
    cp = (m.at_tp(T + dT, p).h - m.at_tp(T - dT, p).h) / (2 * dT) * m.molar_mass
    assert cp == pytest.approx(cp_molar, abs=0.006)


def test_real_gas_window_refuses_points_outside():
    m = RealGasAir()
    with pytest.raises(PropertyRangeError, match="outside the property range"):
        m.at_tp(130.0, 1e6)


# Keenan & Kaye, Gas Tables (Wiley, 1948), air at low pressure: h [kJ/kg], s° [kJ/(kg K)]
KK = {300.0: (300.19, 1.70203), 500.0: (503.02, 2.21952), 1000.0: (1046.04, 2.96770)}


@pytest.mark.parametrize("T", [500.0, 1000.0])
def test_ideal_gas_differences_match_keenan_kaye(T):
    m = IdealGasAir()
    dh = m.at_tp(T, 1e5).h - m.at_tp(300.0, 1e5).h
    ds = m.s_standard(T) - m.s_standard(300.0)
    assert dh / 1e3 == pytest.approx(KK[T][0] - KK[300.0][0], rel=1e-3)
    assert ds / 1e3 == pytest.approx(KK[T][1] - KK[300.0][1], rel=1e-3)


def test_ideal_gas_entropy_relation():
    # s2 − s1 = s°(T2) − s°(T1) − R ln(p2/p1): Çengel & Boles (2015) eq. 7-39
    m = IdealGasAir()
    a, b = m.at_tp(320.0, 1e5), m.at_tp(450.0, 7e5)
    assert b.s - a.s == pytest.approx(m.s_standard(450.0) - m.s_standard(320.0) - m.gas_constant * math.log(7.0),
                                      rel=1e-12)


def test_ideal_gas_hermite_table_reproduces_coolprop_between_nodes():
    # between two table nodes the interpolant must match the ideal-gas part exactly
    import CoolProp.CoolProp as CP
    m = IdealGasAir()
    st = CP.AbstractState("HEOS", "Air")
    T = 431.37
    st.update(CP.DmassT_INPUTS, 1e5 / (m.gas_constant * T), T)
    assert m.at_tp(T, 1e5).h == pytest.approx(st.hmass_idealgas(), rel=1e-10)


@pytest.mark.parametrize("model_class", [RealGasAir, IdealGasAir, ConstantCpAir], ids=lambda c: c.name)
def test_inverse_flashes_round_trip(model_class):
    model = model_class()
    pt = model.at_tp(417.3, 6.3e5)
    assert model.at_hp(pt.h, pt.P).T == pytest.approx(pt.T, abs=1e-8)
    assert model.at_sp(pt.s, pt.P).T == pytest.approx(pt.T, abs=1e-8)


def test_real_gas_inverse_agrees_with_coolprop_flash():
    # CoolProp's own (h, p) flash at a different level (PropsSI) is an independent inverse
    import CoolProp.CoolProp as CP
    m = RealGasAir()
    h = m.at_tp(300.0, 1e5).h + 150e3
    assert m.at_hp(h, 8e5).T == pytest.approx(CP.PropsSI("T", "H", h, "P", 8e5, "Air"), abs=1e-6)


def test_real_gas_flashes_agree_with_the_plain_coolprop_flash():
    # issue 19: the real-gas model's (T, p) states come from its own density flash with the gas phase
    # imposed (stagewright.core.air_tp_flash: air is above its critical temperature, 132.5 K, everywhere
    # in the models' range; Lemmon et al. 2000); the reference is CoolProp's own AbstractState (T, p)
    # flash without an imposed phase: the density to a few units in the last place, h, s, cp and
    # (dh/dp)_T = v - T (dv/dT)_p to the same absolute precision (scales: 3e5 J/kg, 4e3 J/(kg K),
    # 1e3 J/(kg K), and v itself for the difference of nearly equal terms)
    import random

    import CoolProp.CoolProp as CP

    from stagewright.core.models import RealGasAir
    from stagewright.core.models.base import P_MAX, P_MIN, T_MAX, T_MIN
    plain = CP.AbstractState("HEOS", "Air")
    model = RealGasAir()
    rng = random.Random(19)
    for _ in range(2000):
        T, P = rng.uniform(T_MIN, T_MAX), 10 ** rng.uniform(math.log10(P_MIN), math.log10(P_MAX))
        plain.update(CP.PT_INPUTS, P, T)
        h, s, v, cp, hp = model.terms(T, P)
        ref = (plain.hmass(), plain.smass(), 1.0 / plain.rhomass(), plain.cpmass(),
               plain.first_partial_deriv(CP.iHmass, CP.iP, CP.iT))
        assert abs(v / ref[2] - 1.0) < 4e-15, (T, P)
        for ours, theirs, scale in zip((h, s, cp, hp), (ref[0], ref[1], ref[3], ref[4]), (3e5, 4e3, 1e3, ref[2])):
            assert abs(ours - theirs) <= 1e-12 * max(abs(theirs), scale), (T, P)


def test_real_gas_terms_kept_for_a_repeated_state_are_those_of_a_fresh_update():
    # RealGasAir.terms keeps the answers of recent states (a saturated cooler outlet repeats
    # between solves): a kept answer must be the one a fresh model gives, and a state set in
    # between must not leak into it
    from stagewright.core.models import RealGasAir
    model, fresh = RealGasAir(), RealGasAir()
    first = model.terms(306.15, 7.5e5)
    model.terms(420.0, 3e6)  # the state moves elsewhere
    assert model.terms(306.15, 7.5e5) == first == fresh.terms(306.15, 7.5e5)
    assert model.terms(306.15, 7.5e5, False) == fresh.terms(306.15, 7.5e5, False)
    assert model.terms(306.15, 7.5e5, False)[4] == 0.0
