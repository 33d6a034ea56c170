"""Trial solves: the lean core solve gives the same powers and states as the full one."""
import pytest

import stagewright.core
from stagewright.core.study.progress import StudyCancelled
from stagewright.core.study.trials import TrialSolver, soft_limits

from conftest import make_doc


@pytest.mark.parametrize("model", ["real_gas", "ideal_gas", "constant_cp"])
@pytest.mark.parametrize("kind", ["isentropic", "polytropic"])
def test_lean_solve_equals_full_solve(model, kind):
    # The trial solves skip only reporting (polytropic efficiency of isentropic stages);
    # compare with the full solve on CoolProp-backed and perfect-gas models.
    doc = make_doc(model=model, stages=3, kind=kind, eta=0.81, p_out=15e5, drop=9000.0,
                   flow=("free_air_delivery", 0.3))
    doc["stages"][1].update({"heat_loss_W": 900.0, "exit_velocity_m_s": 30.0, "mechanical_efficiency": 0.97})
    full, lean = stagewright.core.solve(doc), stagewright.core.solve(doc, detail=False)
    assert lean.driver_power_W == pytest.approx(full.driver_power_W, rel=1e-12)
    assert lean.exergy_destroyed_W == pytest.approx(full.exergy_destroyed_W, rel=1e-10)
    for a, b in zip(lean.stages, full.stages):
        assert a.outlet.T == pytest.approx(b.outlet.T, rel=1e-12)
        assert a.polytropic_exponent == pytest.approx(b.polytropic_exponent, rel=1e-8)
    assert abs(lean.energy_residual) < 1e-9 and abs(lean.exergy_residual) < 1e-9


def test_trials_are_cached_and_cancellable():
    doc = stagewright.core.project.validation.normalise(make_doc(model="constant_cp", stages=2))
    doc["stages"] = [dict(s, max_discharge_temperature_K=400.0) for s in doc["stages"]]
    stop = {"now": False}
    ts = TrialSolver(doc, soft_limits(doc["stages"], 293.15), lambda: stop["now"])
    t = ts([3.0, 3.0])
    assert ts([3.0, 3.0]) is t and ts.solves == 1
    assert len(t.margins) == 4  # two temperature limits, two coolers
    assert t.feasible == all(m >= 0 for m in t.margins)
    stop["now"] = True
    with pytest.raises(StudyCancelled):
        ts([2.0, 4.5])
