"""A moist intake whose water a float cannot hold: the train solves, its water balance closes."""
from __future__ import annotations

from stagewright.core.solve import solve


def test_a_vanishing_intake_humidity_solves_instead_of_dividing_by_zero():
    """A humidity ratio of 1e-320 (inside the schema's range) times a 1e-6 kg/s flow underflows to no
    intake water at all: the water balance closure divided by it (found by the slow seeded fuzz run)."""
    doc = {"site": {"ambient_temperature_K": 293.15, "barometric_pressure_Pa": 1e5, "humidity_ratio": 1e-320},
           "flow": {"kind": "mass", "value": 1e-6}, "discharge_pressure_Pa": 4e5,
           "stages": [{"efficiency": {"kind": "isentropic", "value": 0.8}, "cooler": {"outlet_temperature_K": 300.0}}]}
    res = solve(doc)
    assert res.water.water_balance_residual == 0.0 and res.water.condensate_kg_s == 0.0
