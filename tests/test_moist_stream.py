"""Moist-air stream model and site humidity input."""
import CoolProp.CoolProp as CP
import pytest

from stagewright.core.errors import InputError
from stagewright.core.moist.stream import MoistAir, humidity_of, intake_humidity_ratio
from stagewright.core.models import ConstantCpAir, IdealGasAir, RealGasAir
from stagewright.core.moist.mixture import make_mixture

MIXES = [make_mixture(RealGasAir()), make_mixture(IdealGasAir()), make_mixture(ConstantCpAir())]


@pytest.mark.parametrize("mix", MIXES, ids=lambda m: m.name)
@pytest.mark.parametrize("T", [290.0, 330.0, 450.0])  # two-phase, near the dew point, dry
def test_inverse_flashes_round_trip_through_the_dew_point(mix, T):
    air = MoistAir(mix, 0.012)
    pt = air.at_tp(T, 5e5)
    assert pt.w + pt.wl == pytest.approx(0.012, rel=1e-14)
    assert air.at_hp(pt.h, pt.P, T_guess=350.0).T == pytest.approx(T, abs=1e-7)
    assert air.at_sp(pt.s, pt.P, T_guess=350.0).T == pytest.approx(T, abs=1e-7)


def test_saturated_point_holds_exactly_the_saturation_humidity_ratio():
    mix = MIXES[0]
    pt = MoistAir(mix, 0.02).at_tp(300.0, 8e5)
    # HAPropsSI at R = 1 (RP-1485 at its own level)
    assert pt.w == pytest.approx(CP.HAPropsSI("W", "T", 300.0, "P", 8e5, "R", 1.0), rel=1e-12)
    info = humidity_of(mix, pt)
    assert info["relative_humidity"] == 1.0 and info["dew_point_K"] == pytest.approx(300.0, abs=1e-6)


def test_site_relative_humidity_matches_hapropssi():
    # HAPropsSI W from T, p, RH: the same mole-fraction definition of RH (RP-1485)
    site = {"relative_humidity": 0.6}
    W = intake_humidity_ratio(site, MIXES[0], 298.15, 95_000.0)
    assert W == pytest.approx(CP.HAPropsSI("W", "T", 298.15, "P", 95_000.0, "R", 0.6), rel=1e-12)


@pytest.mark.parametrize("mix", MIXES, ids=lambda m: m.name)
def test_humidity_inputs_agree_with_each_other(mix):
    T0, P0 = 301.0, 100_000.0
    W = intake_humidity_ratio({"relative_humidity": 0.55}, mix, T0, P0)
    td = mix.dew_point(P0, W)
    assert intake_humidity_ratio({"dew_point_K": td}, mix, T0, P0) == pytest.approx(W, rel=1e-9)
    assert intake_humidity_ratio({"humidity_ratio": W}, mix, T0, P0) == W
    assert mix.relative_humidity(T0, P0, W) == pytest.approx(0.55, rel=1e-12)


def test_humidity_ratio_above_saturation_names_field_and_limit():
    with pytest.raises(InputError, match=r"site\.humidity_ratio: 0\.05 — expected at most 0\.02"):
        intake_humidity_ratio({"humidity_ratio": 0.05}, MIXES[1], 298.15, 101_325.0)
