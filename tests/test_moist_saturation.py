"""Saturation of water against the IAPWS verification tables."""
import pytest

from stagewright.core.moist.saturation import (dew_point_from_vapour_pressure, saturation_pressure, saturation_temperature,
                               sublimation_pressure, vapour_pressure)


@pytest.mark.parametrize("T, p_MPa", [(300.0, 0.353658941e-2), (500.0, 0.263889776e1), (600.0, 0.123443146e2)])
def test_saturation_pressure_matches_iapws_if97_table_35(T, p_MPa):
    # IAPWS R7-97(2012), Table 35: verification values of eq. (30), given to 9 significant digits
    assert saturation_pressure(T) / 1e6 == pytest.approx(p_MPa, rel=2e-9)


@pytest.mark.parametrize("p_MPa, T", [(0.1, 0.372755919e3), (1.0, 0.453035632e3), (10.0, 0.584149488e3)])
def test_saturation_temperature_matches_iapws_if97_table_36(p_MPa, T):
    # IAPWS R7-97(2012), Table 36: verification values of the backward eq. (31)
    assert saturation_temperature(p_MPa * 1e6) == pytest.approx(T, abs=1e-6)


def test_sublimation_pressure_matches_iapws_r14_table_3():
    # IAPWS R14-08(2011), Table 3: p_subl(230 K) = 8.947352740e-6 MPa
    assert sublimation_pressure(230.0) / 1e6 == pytest.approx(8.947352740e-6, rel=1e-9)


def test_saturation_agrees_with_coolprop_iapws95_within_the_if97_tolerance():
    # IF97 reproduces IAPWS-95 saturation pressure within about 0.025 % (IAPWS R7-97, §8);
    # CoolProp's IAPWS-95 (PropsSI, a different formulation) as the independent reference
    import CoolProp.CoolProp as CP
    for T in (275.0, 300.0, 350.0, 450.0):
        assert saturation_pressure(T) == pytest.approx(CP.PropsSI("P", "T", T, "Q", 0, "Water"), rel=2.5e-4)


@pytest.mark.parametrize("T", [240.0, 268.15, 280.0, 320.0, 400.0])
def test_dew_point_inverts_vapour_pressure(T):
    assert dew_point_from_vapour_pressure(vapour_pressure(T)) == pytest.approx(T, abs=1e-7)
