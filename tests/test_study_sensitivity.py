"""The comparison across a site variable."""
import pytest

from stagewright.core.errors import InputError
from stagewright.core.study import StudyCancelled, compare_stagings, sensitivity

from conftest import make_doc


def perfect_gas_doc():
    # mass flow fixed, coolers back to a fixed 300 K, constant cp
    doc = make_doc(model="constant_cp", stages=1, p_out=8e5, cool_to=300.0, T0=290.0)
    doc["stages"][0]["cooler"]["coolant_inlet_temperature_K"] = 285.0
    return doc


def test_single_stage_power_scales_with_intake_temperature():
    # Perfect gas, one stage at a fixed ratio: w = cp T1 (r^((k-1)/k) - 1)/ηs
    # (Çengel & Boles, Thermodynamics, 8th ed., 2015, eq. 7-57 with 7-64), so at fixed
    # mass flow the power is proportional to the intake temperature.
    study = sensitivity(perfect_gas_doc(), "ambient_temperature_K", [270.0, 290.0, 310.0], max_stages=1)
    p = [pt.comparison.options[0].split.result.driver_power_W for pt in study.points]
    assert p[0] / p[1] == pytest.approx(270.0 / 290.0, rel=1e-9)
    assert p[2] / p[1] == pytest.approx(310.0 / 290.0, rel=1e-9)


def test_each_point_equals_a_direct_comparison_at_that_value():
    doc = make_doc(model="real_gas", stages=1, p_out=9e5, cool_to=305.0, drop=5000.0)
    doc["stages"][0]["cooler"]["coolant_inlet_temperature_K"] = 295.0
    study = sensitivity(doc, "ambient_temperature_K", [283.15, 303.15], max_stages=2)
    for pt in study.points:
        direct = dict(doc, site=dict(doc["site"], ambient_temperature_K=pt.value))
        ref = compare_stagings(direct, 2)
        got = [o.split.result.driver_power_W for o in pt.comparison.options]
        want = [o.split.result.driver_power_W for o in ref.options]
        assert got == pytest.approx(want, rel=1e-12)
    rows = study.rows()
    assert rows[0]["variable"] == "ambient_temperature_K" and len(rows[0]["options"]) == 2


def test_a_value_the_train_cannot_run_at_leaves_its_options_infeasible_with_the_reason():
    doc = make_doc(model="constant_cp", stages=1, p_out=8e5, cool_to=300.0, T0=290.0)
    # no coolant: the heat sink is the ambient, so a 305 K day cannot cool to 300 K
    study = sensitivity(doc, "ambient_temperature_K", [290.0, 305.0], max_stages=2)
    assert all(o.feasible for o in study.points[0].comparison.options)
    hot = study.points[1].comparison.options
    assert not any(o.feasible for o in hot)
    assert all("below the heat-sink temperature" in o.split.binding_limits[0].message for o in hot)
    assert hot[0].split.binding_limits[0].field == "stages[0].cooler.outlet_temperature_K"


def test_bad_variable_and_values():
    doc = perfect_gas_doc()
    with pytest.raises(InputError, match="variable: 'wind' — expected one of ambient_temperature_K"):
        sensitivity(doc, "wind", [1.0])
    with pytest.raises(InputError, match=r"site.ambient_temperature_K: 400.0 — expected a number in \[223.15, 333.15\]"):
        sensitivity(doc, "ambient_temperature_K", [290.0, 400.0])
    with pytest.raises(InputError, match="site.relative_humidity"):
        sensitivity(doc, "relative_humidity", [1.5])
    with pytest.raises(InputError, match="values: 0"):
        sensitivity(doc, "ambient_temperature_K", [])


def test_progress_and_cancel():
    seen = []
    sensitivity(perfect_gas_doc(), "relative_humidity", [0.2, 0.8], max_stages=2,
                progress=lambda f, m: seen.append(f))
    assert seen[0] == 0.0 and seen[-1] == 1.0 and seen == sorted(seen)
    calls = {"n": 0}

    def cancel():
        calls["n"] += 1
        return calls["n"] > 6
    with pytest.raises(StudyCancelled) as info:
        sensitivity(perfect_gas_doc(), "ambient_temperature_K", [270.0, 280.0, 290.0, 300.0], max_stages=2,
                    cancel=cancel)
    assert len(info.value.partial) < 4
