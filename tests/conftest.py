"""Shared fixtures: small valid project documents built in code (invented data)."""
from __future__ import annotations

import copy
import os
import tempfile
from pathlib import Path

import pytest

os.environ.setdefault("QT_QPA_PLATFORM", "offscreen")
# windows made by tests autosave: never into the user's real recovery folder
os.environ.setdefault("STAGEWRIGHT_DATA_DIR", tempfile.mkdtemp(prefix="stagewright-test-data-"))

ROOT = Path(__file__).resolve().parent.parent
SAMPLES = ROOT / "sample_projects"
PREPARED_BY = "Stagewright test suite"  #: who "prepared" the reports the tests write


def make_doc(model="constant_cp", stages=2, eta=0.8, kind="isentropic", p_out=9e5, cool_to=None,
             drop=0.0, T0=293.15, P0=1e5, flow=("mass", 1.0), **extra):
    """A simple train: ``stages`` identical stages, each with a cooler back to ``cool_to``."""
    cool_to = T0 if cool_to is None else cool_to
    eff = {"kind": kind, "value": eta} if kind != "discharge_temperature" else {"kind": kind, "value_K": eta}
    doc = {
        "site": {"ambient_temperature_K": T0, "barometric_pressure_Pa": P0},
        "fluid": {"model": model},
        "flow": {"kind": flow[0], "value": flow[1]},
        "discharge_pressure_Pa": p_out,
        "stages": [{"efficiency": dict(eff),
                    "cooler": {"outlet_temperature_K": cool_to, "pressure_drop_Pa": drop}}
                   for _ in range(stages)],
    }
    doc.update(extra)
    return copy.deepcopy(doc)


@pytest.fixture
def doc_factory():
    return make_doc



@pytest.fixture(scope="session")
def sample_reports(tmp_path_factory):
    """PDF and CSV report of every sample project in SI units, written once per test session by
    ``stagewright report`` (a report takes seconds: the test files that read them share them).

    Returns ``{sample path: (pdf path, csv path)}``.
    """
    from stagewright.gui.cli.main import main

    out = {}
    for path in sorted(SAMPLES.glob("*.json")):
        folder = tmp_path_factory.mktemp(path.stem)
        pdf, csv_path = folder / "r.pdf", folder / "r.csv"
        assert main(["report", str(path), "-o", str(pdf), "--csv", str(csv_path), "--prepared-by", PREPARED_BY]) == 0
        out[path] = (pdf, csv_path)
    return out
