"""Cooler sizing: UA from ε-NTU equals UA from LMTD·F; temperature crosses name the coolant limit."""
import ht
import pytest

from stagewright.core.errors import InputError
from stagewright.core.exchanger import ARRANGEMENTS, HotSide, make_coolant, size_exchanger

WATER = make_coolant({"kind": "water"}, (293.15, 101_325.0, 0.0))


def hot(t_out, t_in=420.0, c=1000.0):
    return HotSide(t_in, t_out, c * (t_in - t_out))


def test_counterflow_ua_is_duty_over_lmtd():
    # Incropera 2007 eq. 11.14: Q = UA ΔTlm for counter-flow; ΔTlm from ht.LMTD
    ex = size_exchanger("counter_flow", hot(303.15), WATER, 293.15, rise=12.0)
    c = ex.coolant
    lmtd = ht.LMTD(420.0, 303.15, 293.15, c.outlet_temperature_K)
    assert ex.ua_W_K == pytest.approx(c.duty_W / lmtd, rel=1e-10)
    assert ex.correction_factor == pytest.approx(1.0, rel=1e-12)


def test_shell_and_tube_ua_uses_fakheri_factor():
    # Q = UA F ΔTlm,cf with F from ht.F_LMTD_Fakheri (Fakheri 2003)
    ex = size_exchanger("shell_and_tube_1_2", hot(330.0), WATER, 293.15, flow=2.0)
    tco = ex.coolant.outlet_temperature_K
    f = ht.F_LMTD_Fakheri(420.0, 330.0, 293.15, tco, shells=1)
    assert ex.ua_W_K == pytest.approx(ex.coolant.duty_W / (f * ht.LMTD(420.0, 330.0, 293.15, tco)), rel=1e-9)


@pytest.mark.parametrize("arr", list(ARRANGEMENTS))
def test_every_arrangement_needs_at_least_the_counterflow_ua(arr):
    # counter-flow is the most effective arrangement (Incropera 2007 §11.4): F ≤ 1
    base = size_exchanger("counter_flow", hot(320.0), WATER, 293.15, flow=3.0)
    ex = size_exchanger(arr, hot(320.0), WATER, 293.15, flow=3.0)
    assert ex.ua_W_K >= base.ua_W_K * (1 - 1e-12)
    assert ex.ntu == pytest.approx(ex.ua_W_K / min(ex.zones[0].hot_capacity_rate_W_K,
                                                    ex.zones[0].coolant_capacity_rate_W_K), rel=1e-12)


def test_flow_too_small_reports_a_minimum_that_works():
    with pytest.raises(InputError, match=r"coolant\.flow_kg_s.*at least ([0-9.]+) kg/s") as info:
        size_exchanger("shell_and_tube_1_2", hot(300.0), WATER, 293.15, flow=1.0, where="stages[0].cooler")
    minimum = float(info.value.problem.expected.split("at least ")[1].split(" ")[0])
    size_exchanger("shell_and_tube_1_2", hot(300.0), WATER, 293.15, flow=minimum * 1.001)
    with pytest.raises(InputError):
        size_exchanger("shell_and_tube_1_2", hot(300.0), WATER, 293.15, flow=minimum * 0.999)


def test_coolant_leaving_above_air_inlet_is_a_cross():
    with pytest.raises(InputError, match=r"temperature_rise_K.*at most"):
        size_exchanger("counter_flow", hot(330.0, t_in=340.0), WATER, 293.15, rise=60.0)
