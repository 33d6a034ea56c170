"""A study option back into the project: the stage list reproduces the option, field paths
map to the project's own fields, and the study key tells when a study still fits.

A project with applied ratios is solved by ``stagewright.core.solve`` and must give the option's
numbers; where a number is checked against a source it is the closed form of staged
perfect-gas compression (``fluids.compressible.isentropic_work_compression``, C. Bell,
fluids / ChEDL on PyPI; Çengel & Boles, *Thermodynamics*, 8th ed., 2015, §7-11).
"""
from __future__ import annotations

import copy
import json

import pytest
from fluids.compressible import isentropic_work_compression

from stagewright.gui.study.apply import apply_text, option_stages, project_field, study_key
from stagewright.gui.study.job import StudyRequest, run_request
from conftest import SAMPLES, make_doc
from stagewright.core import solve
from stagewright.core.project.validation import problems

R_MOLAR, M_AIR = 8.314462618, 0.02896546  # J/(mol K) CODATA 2018; kg/mol (CoolProp's air)


def with_stages(doc, stages):
    out = copy.deepcopy(doc)
    out["stages"] = stages
    return out


def test_applied_option_solves_to_the_option_numbers_on_the_sample_project():
    doc = json.loads((SAMPLES / "two_stage_plant_air.json").read_text(encoding="utf-8"))
    answer = run_request(StudyRequest(doc, 3, 8000.0, 0.15))
    for row in answer["cases"][0]["rows"]:
        if not row["feasible"]:
            continue
        stages = option_stages(doc, row["pressure_ratios"], answer["first_efficiency"])
        applied = with_stages(doc, stages)
        assert problems(applied) == []
        r = solve(applied)
        assert r.driver_power_W == pytest.approx(row["driver_power_W"], rel=1e-9)
        assert r.heat_rejected_W == pytest.approx(row["heat_rejected_W"], rel=1e-9)
        assert [s.outlet.T for s in r.stages] == pytest.approx(row["discharge_temperatures_K"], rel=1e-9)
        assert not [w for w in r.warnings if w.field == "discharge_pressure_Pa"]  # ratios meet it
        # the first stage repeated, the project's last-stage cooler as aftercooler
        assert all(s["efficiency"] == doc["stages"][0]["efficiency"] for s in stages)
        assert [s["cooler"] for s in stages[:-1]] == [doc["stages"][0]["cooler"]] * (len(stages) - 1)
        assert stages[-1]["cooler"] == doc["stages"][-1]["cooler"]


def test_classical_equal_split_goes_into_the_project():
    doc = make_doc(model="constant_cp", stages=1, p_out=9e5, eta=0.8)
    doc["fluid"].update({"cp_J_kgK": R_MOLAR / M_AIR * 3.5, "k": 1.4})
    row = run_request(StudyRequest(doc, 2, 8000.0, 0.15))["cases"][0]["rows"][1]
    stages = option_stages(doc, row["pressure_ratios"])
    assert [s["pressure_ratio"] for s in stages] == pytest.approx([3.0, 3.0], rel=1e-4)  # P_mid = √(P1·P2)
    w = isentropic_work_compression(T1=293.15, k=1.4, Z=1.0, P1=1e5, P2=3e5, eta=0.8) / M_AIR
    assert solve(with_stages(doc, stages)).driver_power_W == pytest.approx(2 * w, rel=1e-6)


def test_measured_first_stage_is_applied_with_the_efficiency_the_study_used():
    # a measured discharge temperature is held as the isentropic efficiency it implies
    doc = make_doc(model="ideal_gas", stages=2, p_out=8e5, kind="discharge_temperature", eta=440.0)
    answer = run_request(StudyRequest(doc, 3, 8000.0, 0.15))
    eff = answer["first_efficiency"]
    assert eff["kind"] == "isentropic" and 0.5 < eff["value"] < 1.0
    row = answer["cases"][0]["rows"][2]
    r = solve(with_stages(doc, option_stages(doc, row["pressure_ratios"], eff)))
    assert r.driver_power_W == pytest.approx(row["driver_power_W"], rel=1e-9)


def test_a_project_without_aftercooler_keeps_none():
    doc = make_doc(stages=2)
    del doc["stages"][1]["cooler"]
    stages = option_stages(doc, [2.0, 2.0, 2.25])
    assert "cooler" not in stages[-1] and all("cooler" in s for s in stages[:-1])
    assert apply_text(3) == "Apply 3-stage option"


def test_project_field_maps_option_stages_to_the_project():
    assert project_field("stages[4].max_pressure_ratio", 5, 3) == "stages[0].max_pressure_ratio"
    assert project_field("stages[3].cooler.outlet_temperature_K", 5, 3) == "stages[0].cooler.outlet_temperature_K"
    assert project_field("stages[4].cooler.outlet_temperature_K", 5, 3) == "stages[2].cooler.outlet_temperature_K"
    assert project_field("site.ambient_temperature_K", 5, 3) == "site.ambient_temperature_K"
    assert project_field("", 2, 2) == ""


def test_study_key_follows_what_the_study_depends_on():
    doc = make_doc(stages=3)
    key = study_key(doc)
    renamed = copy.deepcopy(doc)
    renamed["stages"][0].update({"name": "LP", "pressure_ratio": 2.0})
    renamed["stages"][1]["efficiency"]["value"] = 0.6  # a middle stage is never repeated
    renamed["title"] = "another title"
    assert study_key(renamed) == key
    for change in (lambda d: d["stages"][0]["efficiency"].update(value=0.7),
                   lambda d: d["stages"][-1]["cooler"].update(pressure_drop_Pa=5000.0),
                   lambda d: d["site"].update(ambient_temperature_K=300.0),
                   lambda d: d.update(discharge_pressure_Pa=8e5)):
        changed = copy.deepcopy(doc)
        change(changed)
        assert study_key(changed) != key
    shaft = make_doc(stages=2, flow=("shaft_power", 2e5))
    other = copy.deepcopy(shaft)
    other["stages"][1]["efficiency"]["value"] = 0.7  # the held flow comes from the whole train
    assert study_key(other) != study_key(shaft)
