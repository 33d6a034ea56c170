"""Staging options side by side: structure, savings, progress, cancellation, bad input."""
import json

import pytest
from fluids.compressible import isentropic_work_compression

from stagewright.core.errors import InputError
from stagewright.core.results import TrainResult
from stagewright.core.study import StudyCancelled, compare_stagings

from conftest import make_doc

R_MOLAR = 8.314462618  # CODATA 2018, J/(mol K)
M_AIR = 0.02896546  # kg/mol, CoolProp's air
KEYS = ("stages", "pressure_ratios", "driver_power_W", "specific_power_kW_per_m3_min",
        "max_discharge_temperature_K", "heat_rejected_W", "condensate_kg_s", "second_law_efficiency",
        "feasible", "binding_limits")


def plant_doc(limit=450.0):
    """Two different stages; the comparison must repeat the first and keep the last cooler."""
    doc = make_doc(model="real_gas", stages=2, p_out=9e5, drop=8000.0, flow=("free_air_delivery", 0.2))
    doc["stages"][0].update({"max_discharge_temperature_K": limit, "heat_loss_W": 500.0})
    doc["stages"][0]["cooler"]["outlet_temperature_K"] = 303.15
    doc["stages"][1]["efficiency"]["value"] = 0.6  # must not appear in any option
    doc["stages"][1]["cooler"] = {"outlet_temperature_K": 308.15, "pressure_drop_Pa": 3000.0}
    return doc


def test_options_repeat_first_stage_and_keep_last_cooler_as_aftercooler():
    comp = compare_stagings(plant_doc(), max_stages=4)
    assert [o.stages for o in comp.options] == [1, 2, 3, 4]
    assert "repeats the project's first stage" in comp.note and "aftercooler" in comp.note
    for o in comp.options:
        r = o.split.result
        assert all(st.isentropic_efficiency == pytest.approx(0.8, rel=1e-12) for st in r.stages)
        assert r.coolers[-1].outlet.T == pytest.approx(308.15, rel=1e-12)
        assert all(c.outlet.T == pytest.approx(303.15, rel=1e-12) for c in r.coolers[:-1])
        assert r.delivery.P == pytest.approx(9e5, rel=1e-12)


def test_rows_carry_the_documented_keys_and_are_strict_json():
    rows = compare_stagings(plant_doc(), max_stages=3).rows()
    text = json.dumps(rows, allow_nan=False)
    back = json.loads(text)
    assert len(back) == 3
    for row in back:
        for key in KEYS:
            assert key in row
        assert row["note"] and row["operating_hours_per_year"] == 8000.0
        assert row["condensate_kg_s"] == 0.0  # dry air


def test_savings_against_fewest_stage_feasible_option():
    comp = compare_stagings(plant_doc(450.0), max_stages=4, operating_hours_per_year=6000.0,
                            energy_price_per_kWh=0.2)
    rows = comp.rows()
    assert rows[0]["feasible"] is False and rows[0]["saving_W"] is None
    base = comp.baseline
    assert base.stages == 2
    for row in rows[1:]:
        assert row["feasible"]
        assert row["saving_W"] == pytest.approx(rows[1]["driver_power_W"] - row["driver_power_W"], rel=1e-12)
        # kWh per year = kW × h; cost = kWh × price (definitions)
        assert row["saving_cost_per_year"] == pytest.approx(row["saving_W"] / 1000 * 6000 * 0.2, rel=1e-12)
    assert rows[1]["saving_W"] == 0.0
    assert rows[2]["saving_W"] > 0.0  # a third stage does save power here
    assert comp.lowest_power.stages >= 3


def test_constant_cp_options_match_fluids_closed_form():
    # Perfect intercooling to inlet temperature, no drops: the N-stage optimum is N equal
    # stages of ratio 10^(1/N); per-stage work from fluids.compressible (Bell, ChEDL).
    doc = make_doc(model="constant_cp", stages=1, p_out=10e5, eta=0.8)
    doc["fluid"].update({"cp_J_kgK": R_MOLAR / M_AIR * 3.5, "k": 1.4})
    comp = compare_stagings(doc, max_stages=4)
    for o in comp.options:
        n = o.stages
        w = isentropic_work_compression(T1=293.15, k=1.4, Z=1.0, P1=1e5, P2=1e5 * 10 ** (1 / n), eta=0.8)
        assert o.split.result.driver_power_W == pytest.approx(n * w / M_AIR, rel=1e-6)
    powers = [o.split.result.driver_power_W for o in comp.options]
    assert powers == sorted(powers, reverse=True)  # with ideal intercooling, more stages always help


def test_condensate_is_read_from_the_result_when_present(monkeypatch):
    original = TrainResult.to_dict

    def with_condensate(self):
        d = original(self)
        d["condensate_kg_s"] = 0.0123
        return d
    monkeypatch.setattr(TrainResult, "to_dict", with_condensate)
    rows = compare_stagings(plant_doc(), max_stages=2).rows()
    assert [r["condensate_kg_s"] for r in rows] == [0.0123, 0.0123]


@pytest.mark.parametrize("bad", [0, 9, -1, 2.5, True, "3"])
def test_max_stages_out_of_range(bad):
    with pytest.raises(InputError, match=r"max_stages: .* expected a whole number of stages from 1 to 8"):
        compare_stagings(plant_doc(), max_stages=bad)


def test_bad_hours_and_price():
    with pytest.raises(InputError, match=r"operating_hours_per_year: 9000.0 — expected 0 … 8784"):
        compare_stagings(plant_doc(), 2, operating_hours_per_year=9000.0)
    with pytest.raises(InputError, match=r"energy_price_per_kWh: -0.1"):
        compare_stagings(plant_doc(), 2, energy_price_per_kWh=-0.1)


def test_progress_runs_from_zero_to_one():
    seen = []
    compare_stagings(plant_doc(), max_stages=3, progress=lambda f, m: seen.append((f, m)))
    fractions = [f for f, _ in seen]
    assert fractions[0] == 0.0 and fractions[-1] == 1.0
    assert fractions == sorted(fractions)
    assert any("3-stage" in m for _, m in seen)


def test_cancel_returns_finished_options_in_the_error():
    calls = {"n": 0}

    def cancel():
        calls["n"] += 1
        return calls["n"] > 12  # somewhere in the second or third option
    with pytest.raises(StudyCancelled) as info:
        compare_stagings(plant_doc(), max_stages=4, cancel=cancel)
    partial = info.value.partial
    assert 1 <= len(partial) < 4
    assert [o.stages for o in partial] == list(range(1, len(partial) + 1))
