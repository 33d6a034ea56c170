"""The T–s chart's lines as plain SI data (thermo.ts_lines), without drawing.

External checks: isobars against CoolProp's high-level ``PropsSI`` (Lemmon et al. 2000 air
EOS, a different call path from our AbstractState model) and the perfect-gas entropy relation
s2 − s1 = cp ln(T2/T1) − R ln(p2/p1) (Çengel & Boles, *Thermodynamics*, 8th ed., 2015, §7-9).
The path points are the solver's own: checked for identity with the result.
"""
from __future__ import annotations

import math

import pytest
from CoolProp.CoolProp import PropsSI

from tests.conftest import make_doc
from thermo import solve
from thermo.models.base import T_MAX, T_MIN
from thermo.ts_lines import isobar_model, isobar_pressures, isobars, path_segments


@pytest.fixture(scope="module")
def real_gas():
    return solve(make_doc(model="real_gas", stages=2, p_out=9e5)).to_dict()


def test_path_points_are_the_solvers_states(real_gas):
    segs = path_segments(real_gas)
    assert [s.name for s in segs] == ["stage-1", "cooler-1", "stage-2", "cooler-2"]
    st, seg = real_gas["stages"][0], segs[0]
    path = tuple((q["temperature_K"], q["pressure_Pa"], q["entropy_J_kgK"]) for q in st["path"])
    assert seg.points[:len(path)] == path  # then the static discharge, where it is not the path's end
    assert seg.points[-1] == (st["outlet"]["temperature_K"], st["outlet"]["pressure_Pa"], st["outlet"]["entropy_J_kgK"])
    cooler = segs[1].points
    assert cooler[0][0] == st["outlet"]["temperature_K"] and cooler[-1][0] == st["cooler"]["outlet"]["temperature_K"]


def test_static_discharge_follows_the_adiabatic_end_with_a_casing_loss():
    doc = make_doc(model="constant_cp", stages=1, p_out=4e5)
    doc["stages"][0]["heat_loss_W"] = 5000.0
    r = solve(doc).to_dict()
    pts = path_segments(r)[0].points
    assert len(pts) == len(r["stages"][0]["path"]) + 1
    assert pts[-1] == (r["stages"][0]["outlet"]["temperature_K"], 4e5, r["stages"][0]["outlet"]["entropy_J_kgK"])


def test_real_gas_isobars_match_coolprop_propssi(real_gas):
    """Entropy differences along and across isobars against PropsSI (Lemmon et al. 2000)."""
    lines = isobars(real_gas, 280.0, 480.0, points=9)
    assert [iso.pressure_Pa for iso in lines] == isobar_pressures(real_gas)
    s_ref = PropsSI("S", "T", 300.0, "P", 1e5, "Air")
    s_model_ref = isobar_model(real_gas).at_tp(300.0, 1e5).s
    for iso in lines:
        assert iso.temperature_K[0] == 280.0 and iso.temperature_K[-1] == 480.0
        for T, s in zip(iso.temperature_K, iso.entropy_J_kgK):
            assert s - s_model_ref == pytest.approx(PropsSI("S", "T", T, "P", iso.pressure_Pa, "Air") - s_ref, abs=2e-3)


def test_constant_cp_isobars_follow_the_perfect_gas_relation():
    cp, k = 1040.0, 1.36
    R = cp * (k - 1.0) / k
    r = solve(make_doc(stages=2, fluid={"model": "constant_cp", "cp_J_kgK": cp, "k": k})).to_dict()
    lines = isobars(r, 250.0, 600.0)
    base = lines[0]
    for iso in lines:
        for T, s in zip(iso.temperature_K, iso.entropy_J_kgK):
            expected = cp * math.log(T / base.temperature_K[0]) - R * math.log(iso.pressure_Pa / base.pressure_Pa)
            assert s - base.entropy_J_kgK[0] == pytest.approx(expected, abs=1e-6)


def test_range_is_limited_to_the_property_window_and_unknown_models_give_none(real_gas):
    (first, *_) = isobars(real_gas, 10.0, 5000.0, points=3)
    assert first.temperature_K == (T_MIN, 0.5 * (T_MIN + T_MAX), T_MAX)
    assert isobars(dict(real_gas, model="some_future_model"), 280.0, 480.0) == []
    assert isobar_model(dict(real_gas, model="some_future_model")) is None
