"""Results as flat rows (stagewright.core.frames) and as DataFrames with the optional pandas.

The rows are compared with the results they come from (``to_dict()``), not with outside values:
no physical value is checked here."""
from __future__ import annotations

import sys

import pytest

from stagewright.core import solve
from stagewright.core.frames import FRAMES_EXTRA, rows, stage_rows, sweep_rows, to_frame, year_rows
from stagewright.core.sweep import sweep
from stagewright.core.year import run_year
from tests.conftest import make_doc


def _year_doc():
    doc = make_doc(model="ideal_gas", cool_to=310.0)
    doc["year"] = {"profile": {"kind": "bins", "bins": [
        {"temperature_K": 275.0, "relative_humidity": 0.7, "hours": 3000.0, "label": "cool"},
        {"temperature_K": 300.0, "relative_humidity": 0.5, "hours": 2000.0, "label": "warm"}]}}
    return doc


def test_stage_rows_follow_the_result():
    result = solve(make_doc())
    d = result.to_dict()
    got = stage_rows(result)
    assert [r["stage"] for r in got] == [1, 2] and rows(result) == got == stage_rows(d)
    for r, st in zip(got, d["stages"]):
        assert r["shaft_power_W"] == st["shaft_power_W"] and r["outlet_pressure_Pa"] == st["outlet"]["pressure_Pa"]
        assert r["cooler_duty_W"] == st["cooler"]["duty_W"]


def test_sweep_rows_put_axis_values_beside_outputs_and_errors():
    grid = sweep(make_doc(), {"discharge_pressure_Pa": [5e5, 8e5], "stages[0].efficiency.value": [0.7, 2.0]})
    got = sweep_rows(grid)
    assert len(got) == 4 and got == rows(grid)
    assert got[0]["discharge_pressure_Pa"] == 5e5 and got[0]["stages[0].efficiency.value"] == 0.7
    assert got[0]["error"] is None and got[0]["shaft_power_W"] == grid.values["shaft_power_W"][0]
    assert "stages[0].efficiency.value" in got[1]["error"] and got[1]["shaft_power_W"] is None


def test_year_rows_spread_per_stage_lists_into_columns():
    year = run_year(_year_doc())
    got = year_rows(year)
    assert [r["label"] for r in got] == ["cool", "warm"] and got == rows(year)
    assert got[0]["cooler_duties_W[1]"] == year.bins[0].cooler_duties_W[1]
    assert all(not isinstance(v, list) for r in got for v in r.values())


def test_without_pandas_a_frame_names_the_extra(monkeypatch):
    monkeypatch.setitem(sys.modules, "pandas", None)  # import pandas → ImportError
    with pytest.raises(ImportError, match=rf'pip install "stagewright\[{FRAMES_EXTRA}\]"'):
        to_frame(solve(make_doc()))


def test_with_pandas_a_frame_holds_the_rows():
    pandas = pytest.importorskip("pandas")
    grid = sweep(make_doc(), {"discharge_pressure_Pa": [5e5, 8e5]})
    frame = to_frame(grid)
    assert isinstance(frame, pandas.DataFrame) and frame.to_dict("records") == sweep_rows(grid)


def test_the_python_api_document_quotes_the_message_without_pandas(monkeypatch):
    from tests.conftest import ROOT
    monkeypatch.setitem(sys.modules, "pandas", None)
    with pytest.raises(ImportError) as err:
        to_frame([{"a_W": 1.0}])
    doc = " ".join((ROOT / "docs" / "python-api.md").read_text(encoding="utf-8").split())
    assert f"`{err.value}`" in doc
