"""Parametric sweeps: grid order, per-point results equal single solves, failures, cancel."""
import threading

import pytest

import stagewright.core
from tests.conftest import make_doc
from stagewright.core.sweep import SweepCancelled, sweep


def test_grid_order_and_values_match_single_solves():
    doc = make_doc(model="ideal_gas", cool_to=310.0)
    axes = {"site.ambient_temperature_K": [283.15, 303.15], "discharge_pressure_Pa": [6e5, 8e5, 10e5]}
    res = sweep(doc, axes, processes=1)
    assert res.points[1] == [283.15, 8e5]  # last axis fastest
    for i, (T0, p) in enumerate(res.points):
        d = make_doc(model="ideal_gas", p_out=p, cool_to=310.0)
        d["site"]["ambient_temperature_K"] = T0
        assert res.values["shaft_power_W"][i] == pytest.approx(stagewright.core.solve(d).shaft_power_W, rel=1e-12)


def test_humid_sweep_reports_the_condensate_of_each_point():
    # every output of a humid real-gas sweep (fast path) against the exact full solve at the same
    # point, to the fast path's 1e-4 (tests/test_fast_path.py); the condensate was once always 0
    doc = make_doc(model="real_gas", cool_to=305.0)
    doc["site"]["relative_humidity"] = 0.7
    res = sweep(doc, {"discharge_pressure_Pa": [6e5, 9e5]}, processes=1)
    for i, (p,) in enumerate(res.points):
        d = make_doc(model="real_gas", p_out=p, cool_to=305.0)
        d["site"]["relative_humidity"] = 0.7
        exact = stagewright.core.solve(d)
        assert exact.water.condensate_kg_s > 0.0
        assert res.values["condensate_kg_s"][i] == pytest.approx(exact.water.condensate_kg_s, rel=1e-4)
        assert res.values["max_discharge_temperature_K"][i] == pytest.approx(
            max(s.outlet.T for s in exact.stages), rel=1e-4)
        assert res.values["second_law_efficiency"][i] == pytest.approx(exact.second_law_efficiency, rel=1e-4)


def test_failed_points_are_recorded_not_nan():
    doc = make_doc()
    res = sweep(doc, {"stages[0].efficiency.value": [0.8, 1.5]}, processes=1)
    assert res.values["shaft_power_W"][1] is None
    assert "stages[0].efficiency.value" in res.errors[1]
    assert "NaN" not in str(res.to_dict())


def test_progress_and_cancel():
    seen = []
    stop = threading.Event()

    def progress(frac, msg):
        seen.append(frac)
        stop.set()  # cancel after the first chunk
    axes = {"site.ambient_temperature_K": [280.0 + 0.01 * i for i in range(600)]}
    with pytest.raises(SweepCancelled) as info:
        sweep(make_doc(), axes, processes=1, progress=progress, cancel=stop)
    assert seen and seen[0] < 1.0
    assert len(info.value.partial.points) == 250


@pytest.mark.slow
def test_process_pool_gives_the_same_numbers():
    axes = {"site.ambient_temperature_K": [270.0 + i for i in range(40)], "discharge_pressure_Pa": [7e5, 9e5]}
    doc = make_doc(model="real_gas")
    a = sweep(doc, axes, processes=1)
    b = sweep(doc, axes, processes=2)
    assert a.values == b.values


def test_axis_path_outside_the_project_is_an_input_error_not_a_crash():
    # an index past the last stage once raised IndexError out of the sweep; it is a problem of
    # every value, recorded like any other input error (no point solves)
    res = sweep(make_doc(), {"stages[5].efficiency.value": [0.8, 0.9]}, processes=1)
    assert all(v is None for v in res.values["shaft_power_W"])
    assert all("expected a field path of the project file" in m for m in res.errors.values())
    assert len(res.errors) == 2
