"""The flow found from a measured shaft power (stagewright.core.solve._solve_for_power).

Checked against the closed form of a perfect gas (constant cp, one stage with a measured
discharge temperature and a casing heat loss): shaft power = ṁ cp (T2 − T1) + Q, so the flow is
(W − Q) / (cp (T2 − T1)) — the steady-flow energy balance of an open system.
"""
from __future__ import annotations

import pytest

from stagewright.core.errors import SecondLawViolation
from stagewright.core.solve import solve

CP, T1, T2, Q = 1005.0, 293.15, 430.0, 2000.0


def _doc(power_W: float) -> dict:
    return {"site": {"ambient_temperature_K": T1, "barometric_pressure_Pa": 1e5},
            "fluid": {"model": "constant_cp", "cp_J_kgK": CP}, "flow": {"kind": "shaft_power", "value": power_W},
            "discharge_pressure_Pa": 4e5,
            "stages": [{"efficiency": {"kind": "discharge_temperature", "value_K": T2}, "heat_loss_W": Q}]}


def test_small_flow_whose_casing_loss_makes_the_measured_temperature_possible():
    """At 0.13 kg/s the casing loss (15 kJ/kg) covers the gap between the measured discharge (430 K)
    and the isentropic one (435.6 K); at the first trial flow of 1 kg/s it would not, and the old
    iteration refused the document there (a second-law violation at a flow it never needed)."""
    m = 0.13
    res = solve(_doc(m * CP * (T2 - T1) + Q))
    assert res.mass_flow_kg_s == pytest.approx(m, rel=1e-10)
    assert res.entropy_generation_W_K > 0.0


def test_a_flow_too_large_for_the_casing_loss_is_still_refused():
    """At 0.5 kg/s the loss is 4 kJ/kg, less than the 5.6 kJ/kg the measured temperature needs."""
    with pytest.raises(SecondLawViolation, match="isentropic efficiency above 1"):
        solve(_doc(0.5 * CP * (T2 - T1) + Q))

