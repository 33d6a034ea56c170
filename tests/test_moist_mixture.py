"""Moist-air mixture against the ASHRAE psychrometric table, CoolProp's HAPropsSI and IAPWS-95."""
import CoolProp.CoolProp as CP
import pytest

from stagewright.core.models import ConstantCpAir, IdealGasAir, RealGasAir
from stagewright.core.moist.mixture import make_mixture

REAL = make_mixture(RealGasAir())
IDEAL = make_mixture(IdealGasAir())
CONST = make_mixture(ConstantCpAir())

# ASHRAE Handbook — Fundamentals 2017, ch. 1, Table 2: saturation humidity ratio W_s at
# 101.325 kPa, [kg/kg]
ASHRAE_WS = [(5.0, 0.005425), (25.0, 0.020173), (50.0, 0.086863)]


@pytest.mark.parametrize("t_C, ws", ASHRAE_WS)
def test_real_gas_saturation_humidity_ratio_matches_ashrae_table_2(t_C, ws):
    # the table is printed to 6 decimals and computed with the RP-1485 formulation
    assert REAL.saturation_ratio(273.15 + t_C, 101_325.0) == pytest.approx(ws, abs=6e-7)


@pytest.mark.parametrize("mix", [IDEAL, CONST], ids=["ideal_gas", "constant_cp"])
@pytest.mark.parametrize("t_C, ws", ASHRAE_WS)
def test_ideal_mixture_saturation_is_below_ashrae_by_the_enhancement_factor(mix, t_C, ws):
    # Dalton's law without the enhancement factor (f ≈ 1.004 at 1 atm, ASHRAE 2017 ch. 1 eq. 23)
    # gives 0.4–0.6 % less water at saturation than the table
    got = mix.saturation_ratio(273.15 + t_C, 101_325.0)
    assert -0.007 < got / ws - 1.0 < -0.003


@pytest.mark.parametrize("T, P", [(300.0, 101_325.0), (300.0, 1e6), (320.0, 4e6), (283.15, 8e5)])
def test_real_gas_saturation_rh_and_dew_point_match_hapropssi(T, P):
    # CoolProp's HAPropsSI (RP-1485 at its own level: W from R = 1, RH, Tdp)
    ws = CP.HAPropsSI("W", "T", T, "P", P, "R", 1.0)
    assert REAL.saturation_ratio(T, P) == pytest.approx(ws, rel=1e-12)
    w = 0.4 * ws
    assert REAL.relative_humidity(T, P, w) == pytest.approx(CP.HAPropsSI("RH", "T", T, "P", P, "W", w), rel=1e-10)
    assert REAL.dew_point(P, w) == pytest.approx(CP.HAPropsSI("Tdp", "T", T, "P", P, "W", w), abs=1e-6)


@pytest.mark.parametrize("T1, P1, T2, P2, W", [(303.0, 1e5, 450.0, 4e5, 0.02), (303.0, 4e5, 450.0, 16e5, 0.005),
                                               (310.0, 16e5, 450.0, 40e5, 0.001)])
def test_real_gas_enthalpy_and_volume_agree_with_hapropssi(T1, P1, T2, P2, W):
    # HAPropsSI (RP-1485: virial mixture to the third coefficient). Ours: Lemmon dry air at the
    # total pressure + RP-1485 second-virial interaction of the water; measured agreement
    # better than 1e-4 relative in Δh and v up to 40 bar (HAPropsSI's dry air is itself a
    # truncated virial expansion of the Lemmon EOS, which accounts for most of it).
    dh = REAL.gas(T2, P2, W)[0] - REAL.gas(T1, P1, W)[0]
    dh_ha = CP.HAPropsSI("Hda", "T", T2, "P", P2, "W", W) - CP.HAPropsSI("Hda", "T", T1, "P", P1, "W", W)
    assert dh == pytest.approx(dh_ha, rel=1.5e-4)
    assert REAL.gas(T2, P2, W)[2] == pytest.approx(CP.HAPropsSI("Vda", "T", T2, "P", P2, "W", W), rel=1.5e-4)


@pytest.mark.parametrize("mix", [REAL, IDEAL, CONST], ids=lambda m: m.name)
def test_gas_phase_is_thermodynamically_consistent(mix):
    # Gibbs relations (Çengel & Boles 2015, §12-3): cp = T (∂s/∂T)_p, (∂h/∂p)_T = v − T (∂v/∂T)_p
    T, P, w, d, dp = 340.0, 6e5, 0.01, 1e-3, 10.0
    g = mix.gas
    h, s, v, cp, hp = g(T, P, w)
    assert cp == pytest.approx(T * (g(T + d, P, w)[1] - g(T - d, P, w)[1]) / (2 * d), rel=1e-7)
    assert cp == pytest.approx((g(T + d, P, w)[0] - g(T - d, P, w)[0]) / (2 * d), rel=1e-7)
    dv_dT = (g(T + d, P, w)[2] - g(T - d, P, w)[2]) / (2 * d)
    assert hp == pytest.approx(v - T * dv_dT, rel=1e-6, abs=1e-9)
    assert hp == pytest.approx((g(T, P + dp, w)[0] - g(T, P - dp, w)[0]) / (2 * dp), rel=1e-5, abs=1e-9)


@pytest.mark.parametrize("mix, tol", [(REAL, 0.006), (IDEAL, 0.01)], ids=["real_gas", "ideal_gas"])
@pytest.mark.parametrize("T", [285.0, 300.0, 330.0])
def test_latent_heat_close_to_iapws95(mix, tol, T):
    # IAPWS-95 (CoolProp PropsSI) latent heat of pure water at T; the model's latent heat is
    # that of condensing vapour out of air at 1 atm: real gas within 0.6 % (measured; vapour
    # in air at 1 atm vs pure saturated vapour), ideal mixture within 1 % (Clausius–Clapeyron
    # with ideal-gas vapour, Çengel & Boles 2015 eq. 12-24)
    P = 101_325.0
    ws = mix.saturation_ratio(T, P)
    dw = ws * 1e-6
    h_vap = (mix.gas(T, P, ws)[0] - mix.gas(T, P, ws - dw)[0]) / dw
    h_fg = h_vap - mix.liquid(T, P)[0]
    ref = CP.PropsSI("H", "T", T, "Q", 1, "Water") - CP.PropsSI("H", "T", T, "Q", 0, "Water")
    assert h_fg == pytest.approx(ref, rel=tol)


def test_condensed_water_is_in_phase_equilibrium_with_the_vapour():
    # at saturation the chemical potential of water is the same in both phases (Gibbs), and
    # slightly below saturation the vapour is the stable phase
    for mix in (REAL, IDEAL):
        T, P = 305.0, 7e5
        x_s = mix.saturation_fraction(T, P)
        g_l = mix.liquid(T, P)[0] - T * mix.liquid(T, P)[1]
        assert mix.mu_water(T, P, x_s) == pytest.approx(g_l, abs=1e-6 * abs(g_l) + 1e-3)
        assert mix.mu_water(T, P, 0.9 * x_s) < g_l < mix.mu_water(T, P, 1.1 * x_s)
