"""``stagewright study``: JSON rows, text table, exit status and one-line errors."""
import json
import subprocess
import sys

from stagewright.gui.cli.main import main

from conftest import SAMPLES, make_doc

SAMPLE = SAMPLES / "two_stage_plant_air.json"


def run(capsys, *argv):
    code = main(["study", *map(str, argv)])
    out, err = capsys.readouterr()
    return code, out, err


def _dry_sample(tmp_path):
    """The demo with a dry intake: its one-stage option then reaches the 473.15 K limit inside the
    property range (humid, the real-gas moist-air range of 623.15 K refuses it first)."""
    doc = json.loads(SAMPLE.read_text(encoding="utf-8"))
    doc["site"]["relative_humidity"] = 0.0
    path = tmp_path / "dry_plant_air.json"
    path.write_text(json.dumps(doc), encoding="utf-8")
    return path


def test_json_is_one_row_per_stage_count(capsys, tmp_path):
    code, out, err = run(capsys, _dry_sample(tmp_path), "--max-stages", 3, "--json", "--hours", 5000, "--price", 0.12)
    rows = json.loads(out)
    assert code == 0 and err == ""
    assert [r["stages"] for r in rows] == [1, 2, 3]
    for r in rows:
        for key in ("pressure_ratios", "driver_power_W", "specific_power_kW_per_m3_min",
                    "max_discharge_temperature_K", "heat_rejected_W", "condensate_kg_s",
                    "second_law_efficiency", "feasible", "binding_limits", "note"):
            assert key in r
        assert r["operating_hours_per_year"] == 5000.0 and r["energy_price_per_kWh"] == 0.12
    # the sample's 473.15 K limit rules out one stage at 8.5 bar(g): its row says so
    assert rows[0]["feasible"] is False
    assert rows[0]["binding_limits"][0]["field"] == "stages[0].max_discharge_temperature_K"


def test_text_table_says_how_options_are_built_and_shows_the_caution(capsys, tmp_path):
    code, out, _ = run(capsys, _dry_sample(tmp_path), "--max-stages", 2)
    assert code == 0
    assert "repeats the project's first stage" in out and "aftercooler" in out
    assert "limits not met" in out and "NOT MET: stages[0].max_discharge_temperature_K" in out
    assert "8000 operating hours per year and 0.15 per kWh" in out
    assert "Caution — Discharge temperature" in out
    code, out, _ = run(capsys, SAMPLE, "--max-stages", 2)  # the humid demo: condensate in the table
    assert code == 0 and "NOT MET: stages[0]" in out and "condensate" in out


def test_bad_max_stages_is_one_line_and_exit_2(capsys):
    code, out, err = run(capsys, SAMPLE, "--max-stages", 9)
    assert code == 2 and out == ""
    assert err.strip().endswith("max_stages: 9 — expected a whole number of stages from 1 to 8")
    assert len(err.strip().splitlines()) == 1


def test_no_feasible_option_names_the_limit_on_stderr(tmp_path, capsys):
    doc = make_doc(model="constant_cp", stages=1, p_out=20e5)
    doc["stages"][0]["max_discharge_temperature_K"] = 330.0
    path = tmp_path / "tight.json"
    path.write_text(json.dumps(doc))
    code, out, err = run(capsys, path, "--max-stages", 2, "--json")
    assert code == 2
    assert len(json.loads(out)) == 2
    assert "no option up to 2 stage(s) meets every limit: stages[0].max_discharge_temperature_K" in err
    assert "closest feasible value" in err


def test_vary_gives_one_block_per_value(capsys):
    code, out, _ = run(capsys, SAMPLE, "--max-stages", 2, "--json", "--vary", "ambient_temperature_K=283.15,303.15")
    points = json.loads(out)
    assert [p["value"] for p in points] == [283.15, 303.15]
    assert all(len(p["options"]) == 2 for p in points)
    code, _, err = run(capsys, SAMPLE, "--vary", "ambient_temperature_K")
    assert code == 2 and "--vary" in err


def test_study_never_imports_qt():
    code = ("import sys; from stagewright.gui.cli.main import main; main(['study', %r, '--max-stages', '1', '--json']); "
            "print(any(m.startswith('PySide6') for m in sys.modules))" % str(SAMPLE))
    out = subprocess.run([sys.executable, "-c", code], capture_output=True, text=True, check=False).stdout
    assert out.strip().splitlines()[-1] == "False"
