"""A tiny positive load in the package section solves (or is refused by name), never crashes.

A load of 5e-324 (the smallest positive float) is inside every load range of the schema
(``package.load``, ``part_loads``: > 0; ``load_profile[].load``: ≥ 0); ``receiver_cycle`` divided
by ``capacity_m3_s * x``, which underflows to 0.0, and raised ZeroDivisionError. Found by
``tests/test_project_fuzz.py::test_mutated_files_never_crash_load_or_solve`` (seed 20240501,
case 236) once a sample had a ``package`` section.
"""
from __future__ import annotations

import json
from pathlib import Path

import pytest

from stagewright.core import StagewrightError, solve

SAMPLE = Path(__file__).resolve().parents[1] / "sample_projects" / "two_stage_plant_air.json"


@pytest.mark.parametrize("where", ["load_profile", "load", "part_loads"])
def test_a_tiny_positive_load_solves_or_is_refused_by_name(where):
    doc = json.loads(SAMPLE.read_text(encoding="utf-8"))
    doc["fluid"]["model"] = "constant_cp"  # the defect is in the package, not the property model
    tiny = 5e-324
    if where == "load_profile":
        doc["package"]["load_profile"][0]["load"] = tiny
    elif where == "load":
        doc["package"]["load"] = tiny
    else:
        doc["package"]["part_loads"] = [1.0, tiny]
    try:
        result = solve(doc).to_dict()
    except StagewrightError as exc:  # a refusal naming the field would do
        assert exc.field.startswith("package")
        return
    assert result["package"]["full_load"]["package_power_W"] > 0.0
