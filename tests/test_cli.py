"""The stagewright command line: tables, JSON, one-line errors, exit codes."""
import json
import subprocess
import sys

import pytest

from stagewright.gui.cli.main import main
from tests.conftest import ROOT, SAMPLES, make_doc


def test_solve_json_has_contract_keys(capsys):
    assert main(["solve", str(SAMPLES / "two_stage_plant_air.json"), "--json"]) == 0
    out = json.loads(capsys.readouterr().out)
    for key in ["mass_flow_kg_s", "free_air_delivery_m3_s", "shaft_power_W", "driver_power_W",
                "specific_power_kW_per_m3_min", "heat_rejected_W", "entropy_generation_W_K",
                "exergy_destroyed_W", "isothermal_power_W", "isothermal_efficiency",
                "second_law_efficiency", "energy_residual", "exergy_residual", "stages"]:
        assert key in out
    st = out["stages"][0]
    for key in ["inlet", "outlet", "shaft_power_W", "isentropic_efficiency", "polytropic_efficiency",
                "entropy_generation_W_K", "exergy_destroyed_W", "cooler"]:
        assert key in st
    assert set(st["outlet"]) >= {"temperature_K", "pressure_Pa", "enthalpy_J_kg", "entropy_J_kgK"}
    assert set(st["cooler"]) >= {"duty_W", "outlet", "entropy_generation_W_K"}


def test_solve_table_is_readable(capsys):
    assert main(["solve", str(SAMPLES / "two_stage_plant_air.json")]) == 0
    out = capsys.readouterr().out
    assert "stage 2 discharge" in out and "second-law efficiency" in out


def test_bad_file_is_one_line_and_exit_2(tmp_path):
    bad = make_doc()
    bad["stages"][0]["efficiency"]["value"] = 1.5
    p = tmp_path / "bad.json"
    p.write_text(json.dumps(bad))
    proc = subprocess.run([sys.executable, "-m", "stagewright.gui.entry", "solve", str(p)], cwd=ROOT,
                          capture_output=True, text=True)
    assert proc.returncode == 2
    assert "Traceback" not in proc.stderr
    assert len(proc.stderr.strip().splitlines()) == 1
    assert "stages[0].efficiency.value" in proc.stderr


def test_broken_json_reports_line_and_column(tmp_path, capsys):
    p = tmp_path / "broken.json"
    p.write_text('{"site": {\n  "ambient_temperature_K": 293.15,,\n}')
    assert main(["check", str(p)]) == 2
    assert "line 2, column" in capsys.readouterr().out


def test_batch_keeps_going_past_a_bad_file(tmp_path, capsys):
    good = SAMPLES / "two_stage_plant_air.json"
    bad = tmp_path / "missing.json"
    assert main(["solve", str(bad), str(good)]) == 2
    captured = capsys.readouterr()
    assert "cannot read" in captured.err
    assert "stage 1 discharge" in captured.out


def test_json_output_never_contains_nan(capsys):
    main(["solve", str(SAMPLES / "two_stage_plant_air.json"), "--json"])
    assert "NaN" not in capsys.readouterr().out


def test_year_command_table_and_json(capsys):
    path = str(SAMPLES / "three_stage_site_year.json")
    assert main(["year", path]) == 0
    out = capsys.readouterr().out
    assert "January" in out and "December" in out and "worst discharge temperature" in out
    assert main(["year", path, "--json"]) == 0
    y = json.loads(capsys.readouterr().out)
    assert len(y["bins"]) == 12
    assert y["totals"]["hours"] == pytest.approx(6000.0)
    assert y["totals"]["energy_kWh"] == pytest.approx(sum(b["energy_kWh"] for b in y["bins"]), rel=1e-12)


def test_year_without_section_is_one_line_and_exit_2(capsys):
    assert main(["year", str(SAMPLES / "two_stage_plant_air.json")]) == 2
    err = capsys.readouterr().err.strip().splitlines()
    assert len(err) == 1 and "year" in err[0]


def test_solve_json_has_cooler_sizing_keys(capsys):
    assert main(["solve", str(SAMPLES / "three_stage_site_year.json"), "--json"]) == 0
    out = json.loads(capsys.readouterr().out)
    for st in out["stages"]:
        c = st["cooler"]
        for key in ("arrangement", "coolant_flow_kg_s", "coolant_inlet_temperature_K",
                    "coolant_outlet_temperature_K", "lmtd_K", "ua_W_K"):
            assert c[key] is not None
        assert c["effectiveness"] is not None and c["ntu"] is not None
        if c["condensate_kg_s"] > 0.0:  # condensing: each zone has its own ε and NTU too; a wet zone no F
            assert [z["kind"] for z in c["zones"]] == ["dry", "wet"]
            assert all(z["effectiveness"] is not None and z["ntu"] is not None for z in c["zones"])
            assert c["zones"][1]["lmtd_correction_factor"] is None
            assert c["zones"][1]["log_mean_enthalpy_difference_J_kg"] > 0.0
    assert out["recoverable_heat_W"] > 0.0
