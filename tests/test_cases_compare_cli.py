"""``stagewright compare`` and the results snapshot (issue: options side by side).

References: each case's figures are checked against ``stagewright solve --json`` of the same case
saved as its own file (the tool's independent path from file to result); differences are checked
against the arithmetic of those two values.
"""
from __future__ import annotations

import csv
import io
import json

import pytest

from stagewright.gui.cli.main import main
from conftest import SAMPLES
from stagewright.core.cases import compare_snapshot, take_snapshot
from stagewright.core.cases.snapshot import change_summary
from stagewright.core.project import load, save
from stagewright.core.project.cases import add_case, case_document

PLANT = SAMPLES / "two_stage_plant_air.json"


@pytest.fixture(scope="module")
def options(tmp_path_factory):
    folder = tmp_path_factory.mktemp("options")
    doc = load(PLANT)
    doc = add_case(doc, "Hot day", {"site.ambient_temperature_K": 308.15})
    doc = add_case(doc, "Worn first stage", {"stages[0].efficiency.value": 0.7})
    path = folder / "options.json"
    save(doc, path)
    singles = {}
    for name in ("Base", "Hot day", "Worn first stage"):
        singles[name] = folder / f"{name}.json"
        save(case_document(doc, name), singles[name])
    return path, singles


def _solve_json(capsys, path) -> dict:
    assert main(["solve", str(path), "--json"]) == 0
    return json.loads(capsys.readouterr().out)


def test_compare_json_equals_each_case_solved_alone(options, capsys):
    path, singles = options
    assert main(["compare", str(path), "--json", "--reference", "Hot day"]) == 0
    out = json.loads(capsys.readouterr().out)
    assert out["reference"] == "Hot day"
    assert [c["name"] for c in out["cases"]] == ["Base", "Hot day", "Worn first stage"]  # the project order
    alone = {name: _solve_json(capsys, p) for name, p in singles.items()}
    for case in out["cases"]:
        r = alone[case["name"]]
        assert case["figures"]["driver_power_W"] == r["driver_power_W"]
        assert case["figures"]["specific_power_kW_per_m3_min"] == r["specific_power_kW_per_m3_min"]
        assert case["figures"]["hottest_discharge_K"] == max(st["outlet"]["temperature_K"] for st in r["stages"])
        if case["name"] != "Hot day":
            d = case["differences_from_reference"]["driver_power_W"]
            ref = alone["Hot day"]["driver_power_W"]
            assert d["difference"] == pytest.approx(r["driver_power_W"] - ref, rel=1e-12)
            assert d["relative"] == pytest.approx((r["driver_power_W"] - ref) / ref, rel=1e-12)


def test_compare_text_shows_each_case_and_its_difference_in_display_units(options, capsys):
    path, singles = options
    assert main(["compare", str(path), "--cases", "Base,Worn first stage"]) == 0
    text = capsys.readouterr().out
    worn = _solve_json(capsys, singles["Worn first stage"])
    base = _solve_json(capsys, singles["Base"])
    assert "Cases compared with 'Base'" in text and "Hot day" not in text
    assert f"{worn['driver_power_W'] / 1e3:.2f}" in text and f"{base['driver_power_W'] / 1e3:.2f}" in text
    delta = (worn["driver_power_W"] - base["driver_power_W"]) / 1e3
    assert f"+{delta:.2f} kW" in text
    assert "Aftercooler drains" in text  # warnings in words and display units, not key paths
    assert "local codes" in text


def test_compare_csv_has_a_row_per_case_in_si(options, capsys):
    path, singles = options
    assert main(["compare", str(path), "--csv"]) == 0
    rows = list(csv.DictReader(io.StringIO(capsys.readouterr().out)))
    assert [r["case"] for r in rows] == ["Base", "Hot day", "Worn first stage"]
    hot = _solve_json(capsys, singles["Hot day"])
    assert float(rows[1]["driver_power_W"]) == hot["driver_power_W"]


def test_compare_refuses_an_unknown_case_by_name(options, capsys):
    path, _ = options
    assert main(["compare", str(path), "--cases", "Base,Winter"]) == 2
    err = capsys.readouterr().err
    assert "Winter" in err and "Hot day" in err and "Traceback" not in err


def test_snapshot_of_the_same_results_has_no_changes_and_a_changed_figure_is_named(options, capsys):
    path, singles = options
    results = {name: _solve_json(capsys, p) for name, p in singles.items()}
    snap = take_snapshot(results)
    assert compare_snapshot(snap, results) == []
    assert "within 1e-06" in change_summary(snap, [])
    moved = json.loads(json.dumps(results))
    moved["Hot day"]["driver_power_W"] *= 1 + 2e-6
    moved["Base"]["stages"][1]["outlet"]["temperature_K"] *= 1 + 5e-7  # below the tolerance
    changes = compare_snapshot(snap, moved)
    assert [(c.case, c.path) for c in changes] == [("Hot day", "driver_power_W")]
    assert changes[0].relative == pytest.approx(2e-6, rel=1e-3)
    old = dict(snap, coolprop_version="0.0.1")
    assert "CoolProp 0.0.1" in change_summary(old, changes)
    assert "same as when the file was saved" in change_summary(snap, changes)


def test_a_snapshot_saved_with_the_project_reads_back(options, tmp_path, capsys):
    path, singles = options
    doc = load(path)
    doc["snapshot"] = take_snapshot({name: _solve_json(capsys, p) for name, p in singles.items()})
    save(doc, tmp_path / "with_snapshot.json")
    assert load(tmp_path / "with_snapshot.json")["snapshot"] == doc["snapshot"]


def test_the_report_of_a_project_with_cases_compares_them(options, tmp_path, capsys):
    import pypdf

    path, singles = options
    pdf = tmp_path / "options.pdf"
    assert main(["report", str(path), "-o", str(pdf)]) == 0
    text = "\n".join(page.extract_text() for page in pypdf.PdfReader(str(pdf)).pages)
    assert "Cases compared" in text and "Figures of each case" in text
    line = next(ln for ln in text.splitlines() if ln.startswith("Driver input power [kW]"))
    for name, single in singles.items():
        power = _solve_json(capsys, single)["driver_power_W"] / 1e3
        assert f"{power:.2f}" in line, name
    assert "Hot day" in text and "Worn first stage" in text
