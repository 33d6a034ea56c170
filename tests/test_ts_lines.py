"""The T–s chart's lines as plain SI data (stagewright.core.ts_lines), without drawing.

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
from stagewright.core import solve
from stagewright.core.models.base import T_MAX, T_MIN
from stagewright.core.ts_lines import isobar_model, isobar_pressures, isobars, path_segments


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


def test_a_stage_with_casing_heat_loss_is_drawn_from_intake_to_its_real_discharge():
    # issue 14 item 5: the path was the uncooled compression (hotter than the discharge) and a
    # constant-pressure step down to it. Now it joins the actual end states, and on a perfect
    # gas the polytropic path between them is T = T1 (p/p1)^m, m = ln(T2/T1)/ln(p2/p1)
    # (Çengel & Boles, *Thermodynamics*, 8th ed., 2015, §7-12, polytropic process pv^n = C).
    doc = make_doc(model="constant_cp", stages=1, p_out=4e5)
    doc["stages"][0]["heat_loss_W"] = 5000.0
    r = solve(doc).to_dict()
    st = r["stages"][0]
    pts = path_segments(r)[0].points
    t_in, t_out = st["inlet"]["temperature_K"], st["outlet"]["temperature_K"]
    assert max(t for t, _, _ in pts) <= max(t_in, t_out) + 1e-6
    assert pts[-1] == (t_out, 4e5, st["outlet"]["entropy_J_kgK"])
    assert len(pts) == len(st["path"]) > 2
    m = math.log(t_out / t_in) / math.log(4e5 / st["inlet"]["pressure_Pa"])
    for t, p, _ in pts:
        assert t == pytest.approx(t_in * (p / st["inlet"]["pressure_Pa"]) ** m, rel=1e-6)


def test_the_demo_with_one_stage_is_drawn_no_hotter_than_its_discharge():
    # moist real gas, casing loss 1.5 kW: the path ends at the discharge, nowhere hotter
    import json
    from tests.conftest import SAMPLES
    doc = json.loads((SAMPLES / "two_stage_plant_air.json").read_text(encoding="utf-8"))
    del doc["stages"][1]
    r = solve(doc).to_dict()
    st = r["stages"][0]
    pts = path_segments(r)[0].points
    assert max(t for t, _, _ in pts) <= max(st["inlet"]["temperature_K"], st["outlet"]["temperature_K"]) + 1e-6
    assert pts[-1][0] == st["outlet"]["temperature_K"] and pts[-1][1] == st["outlet"]["pressure_Pa"]


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
