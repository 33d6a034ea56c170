"""``stagewright datasheet``: the package's figures at the ISO 1217 reference and at the site."""
from __future__ import annotations

import json
from pathlib import Path

import pytest

from stagewright.gui.cli.main import main
from stagewright.core.part_load.data_sheet import data_sheet

SAMPLES = Path(__file__).resolve().parents[1] / "sample_projects"


@pytest.fixture
def project(tmp_path):
    doc = json.loads((SAMPLES / "two_stage_plant_air.json").read_text())
    doc["package"] = {"control": {"kind": "variable_speed", "receiver_volume_m3": 4.0}, "fan_power_W": 2500.0,
                      "part_loads": [1.0, 0.6]}
    path = tmp_path / "p.json"
    path.write_text(json.dumps(doc))
    return path, doc


def test_json_matches_the_core(project, capsys):
    path, doc = project
    assert main(["datasheet", str(path), "--json"]) == 0
    out = json.loads(capsys.readouterr().out)[0]["data_sheet"]
    want = data_sheet(doc).to_dict()
    assert [c["condition"] for c in out["columns"]] == ["iso1217_reference", "site"]
    for got_col, want_col in zip(out["columns"], want["columns"]):
        for g, w in zip(got_col["points"], want_col["points"]):
            assert g["package_power_W"] == pytest.approx(w["package_power_W"], rel=1e-12)
    ref = out["columns"][0]
    assert ref["inlet_pressure_Pa"] == 100_000.0 and ref["inlet_temperature_K"] == 293.15


def test_text_in_display_units(project, capsys):
    path, doc = project
    assert main(["datasheet", str(path)]) == 0
    text = capsys.readouterr().out
    site = data_sheet(doc).columns[1].points[1]
    assert f"{site.package_power_W / 1000:.2f}" in text  # kW, two decimals
    assert "ISO 1217 reference conditions" in text and "variable speed" in text
    assert "start without warning" in text


def test_project_without_package_is_refused_naming_the_section(tmp_path, capsys):
    doc = json.loads((SAMPLES / "two_stage_plant_air.json").read_text())
    doc.pop("package", None)
    path = tmp_path / "plain.json"
    path.write_text(json.dumps(doc))
    assert main(["datasheet", str(path)]) != 0
    assert "package" in capsys.readouterr().err
