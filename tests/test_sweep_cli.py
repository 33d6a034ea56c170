"""``stagewright sweep``: one CSV row per grid point, each equal to a single solve of that point."""
import csv
import json
import subprocess
import sys

import pytest

import stagewright.core
from stagewright.gui.cli.main import main
from stagewright.gui.cli.sweep import parse_axis
from conftest import SAMPLES

DEMO = SAMPLES / "two_stage_plant_air.json"


def _rows(path):
    with open(path, newline="", encoding="utf-8") as f:
        return list(csv.DictReader(f))


def test_each_row_equals_the_solve_of_its_point(tmp_path):
    # reference: a full exact solve of each point; rows come from the fast property path, which
    # promises 1e-4 relative (thermo/sweep.py, tests/test_fast_path.py)
    out = tmp_path / "grid.csv"
    assert main(["sweep", str(DEMO), "--axis", "site.ambient_temperature_K=283.15:303.15:3",
                 "--axis", "discharge_pressure_Pa=7e5,9e5", "-o", str(out)]) == 0
    rows = _rows(out)
    assert [(float(r["site.ambient_temperature_K"]), float(r["discharge_pressure_Pa"])) for r in rows] == [
        (283.15, 7e5), (283.15, 9e5), (293.15, 7e5), (293.15, 9e5), (303.15, 7e5), (303.15, 9e5)]
    for r in rows:
        doc = json.loads(DEMO.read_text())
        doc["site"]["ambient_temperature_K"] = float(r["site.ambient_temperature_K"])
        doc["discharge_pressure_Pa"] = float(r["discharge_pressure_Pa"])
        res = stagewright.core.solve(doc)
        assert float(r["shaft_power_W"]) == pytest.approx(res.shaft_power_W, rel=1e-4)
        assert float(r["condensate_kg_s"]) == pytest.approx(res.water.condensate_kg_s, rel=1e-4, abs=1e-12)
        assert r["error"] == ""


def test_points_that_fail_are_rows_with_their_message(tmp_path, capsys):
    # an efficiency so low that the discharge leaves the property range: that point's row says
    # why, the others solve
    out = tmp_path / "grid.csv"
    assert main(["sweep", str(DEMO), "--axis", "stages[0].efficiency.value=0.05,0.8", "-o", str(out)]) == 0
    bad, good = _rows(out)
    assert "property range" in bad["error"] and bad["shaft_power_W"] == ""
    assert good["error"] == "" and float(good["shaft_power_W"]) > 0.0
    assert "1 of 2 points could not be solved" in capsys.readouterr().err


def test_a_humid_intake_below_zero_is_a_point_like_any_other(tmp_path):
    # issue 15: a moist intake below 0 °C used to be a failed row ("out of scope")
    out = tmp_path / "grid.csv"
    assert main(["sweep", str(DEMO), "--axis", "site.ambient_temperature_K=263.15,293.15", "-o", str(out)]) == 0
    cold, warm = _rows(out)
    assert cold["error"] == "" and float(cold["shaft_power_W"]) > 0.0 and float(warm["shaft_power_W"]) > 0.0


@pytest.mark.parametrize("axis, words", [
    ("discharge_pressure_Pa", "--axis"),                      # no values
    ("discharge_pressure_Pa=7e5:9e5:0", "--axis"),            # zero values
    ("discharge_pressure_Pa=seven", "--axis"),                # not a number
    ("discharge_presure_Pa=7e5,9e5", "discharge_presure_Pa"),  # misspelt field: the schema names it
    ("discharge_pressure_Pa=1,2", "discharge_pressure_Pa"),    # every value outside the schema's range
])
def test_rejected_axis_is_one_line_and_exit_2(axis, words, capsys):
    assert main(["sweep", str(DEMO), "--axis", axis]) == 2
    err = capsys.readouterr().err.strip().splitlines()
    assert len(err) == 1 and words in err[0] and "Traceback" not in err[0]


def test_axis_forms():
    assert parse_axis("a.b_K=1:3:3") == ("a.b_K", [1.0, 2.0, 3.0])
    assert parse_axis("stages[0].efficiency.value=0.7,0.8") == ("stages[0].efficiency.value", [0.7, 0.8])
    assert parse_axis("x=5:9:1") == ("x", [5.0])


def test_sweep_never_imports_qt(tmp_path):
    code = ("import sys; from stagewright.gui.cli.main import main; "
            f"main(['sweep', {str(DEMO)!r}, '--axis', 'discharge_pressure_Pa=7e5,8e5', '-o', {str(tmp_path / 'o.csv')!r}]); "
            "assert not any(m.startswith('PySide6') for m in sys.modules), 'Qt imported'")
    subprocess.run([sys.executable, "-c", code], check=True)


def test_a_gauge_axis_on_an_absolute_project_replaces_its_statement(tmp_path, capsys):
    out = tmp_path / "grid.csv"
    assert main(["sweep", str(DEMO), "--axis", "discharge_gauge_pressure_Pa=7e5", "-o", str(out)]) == 0
    (row,) = _rows(out)
    doc = json.loads(DEMO.read_text())
    del doc["discharge_pressure_Pa"]
    doc["discharge_gauge_pressure_Pa"] = 7e5
    assert row["error"] == ""
    assert float(row["shaft_power_W"]) == pytest.approx(stagewright.core.solve(doc).shaft_power_W, rel=1e-4)  # fast path
    assert main(["sweep", str(DEMO), "--axis", "discharge_gauge_pressure_Pa=7e5",
                 "--axis", "discharge_pressure_Pa=8e5", "-o", str(tmp_path / "both.csv")]) == 2
    assert "not both" in capsys.readouterr().err
