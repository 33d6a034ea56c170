"""The presentation tables of each result kind: their paths lead into real results of the sample
projects, they stay Qt-free, and one line added to a table shows in every output that reads it.

Check kinds: behaviour checks on the sample projects (invented scenarios). Where a test compares
a shown number with the solver's SI value, the unit factors are written out from their exact
definitions (NIST SP 811, 2008 edition, Appendix B: 1 bar = 1e5 Pa, 1 kW = 1e3 W), not taken from
stagewright.gui.presentation.units.
"""
from __future__ import annotations

import ast
import csv
import io
import json
import re

import pypdf
import pytest

from stagewright.gui.presentation import balance_tables, staging_table, year_tables
from stagewright.gui.presentation.figures import OUTPUTS, Figure, has_path, read_path, shown
from conftest import ROOT, SAMPLES
from stagewright.core import solve
from stagewright.core.project import load

SAMPLE_FILES = sorted(SAMPLES.glob("*.json"))
TABLES = {"POINTS": balance_tables.POINTS, "COMPONENTS": balance_tables.COMPONENTS,
          "EXCHANGERS": balance_tables.EXCHANGERS, "ZONES": balance_tables.ZONES, "TOTALS": balance_tables.TOTALS,
          "STAGING": staging_table.STAGING, "YEAR_BINS": year_tables.YEAR_BINS,
          "YEAR_TOTALS": year_tables.YEAR_TOTALS}


@pytest.fixture(scope="module")
def sample_results() -> dict[str, dict]:
    return {path.stem: solve(load(path)).to_dict() for path in SAMPLE_FILES}


def _check_paths(figures, containers, seen: set) -> list[str]:
    """Paths of ``figures`` missing from any of ``containers`` (``(kind, dict)`` pairs); ``seen``
    collects the ids of figures some container gives a value."""
    missing = []
    for fig in figures:
        for kind, data in containers:
            path = fig.path_for(kind)
            if path is None:
                continue
            if not has_path(data, path):
                missing.append(f"{fig.id}: {path} ({kind or 'row'})")
            elif fig.value(data, kind) is not None:
                seen.add(fig.id)
    return missing


def test_every_train_table_path_is_in_the_results_of_the_sample_projects(sample_results):
    missing, seen = [], {name: set() for name in ("POINTS", "COMPONENTS", "EXCHANGERS", "ZONES", "TOTALS")}
    kinds_met = set()
    for r in sample_results.values():
        rows = balance_tables.component_rows(r)
        kinds_met |= {kind for _, kind, _, _ in rows}
        coolers = [(None, c) for _, kind, _, c in rows if kind == "cooler"]
        missing += _check_paths(balance_tables.POINTS, [(None, p) for _, _, p in balance_tables.train_points(r)],
                                seen["POINTS"])
        missing += _check_paths(balance_tables.COMPONENTS, [(kind, c) for _, kind, _, c in rows], seen["COMPONENTS"])
        missing += _check_paths(balance_tables.EXCHANGERS, coolers, seen["EXCHANGERS"])
        missing += _check_paths(balance_tables.ZONES, [(None, z) for _, c in coolers for z in c["zones"]],
                                seen["ZONES"])
        missing += _check_paths(balance_tables.TOTALS, [(None, r)], seen["TOTALS"])
    assert missing == []
    for name in seen:  # every figure has a value in some sample: the samples exercise each row
        assert seen[name] == {f.id for f in TABLES[name]}, name
    named_kinds = {kind for f in balance_tables.COMPONENTS for kind in f.key}
    assert named_kinds <= kinds_met == {"filter", "stage", "cooler", "train"}


def _pdf_key_figures():
    from stagewright.gui.presentation.figures import shown
    return shown(balance_tables.KEY_FIGURES, "pdf")


def test_every_summary_and_recovery_path_is_in_the_results_of_the_sample_projects(sample_results):
    from stagewright.gui.presentation import recovery_table, summary_table

    missing, seen = [], {"summary": set(), "train": set(), "recovery": set(), "by_stage": set()}
    for r in sample_results.values():
        missing += _check_paths(_pdf_key_figures(), [(None, r)], seen["summary"])
        rows = [(kind, c) for _, kind, _, c in balance_tables.component_rows(r) if kind in ("stage", "cooler")]
        missing += _check_paths(summary_table.SUMMARY_TRAIN, rows, seen["train"])
        if r["heat_recovery"]:
            missing += _check_paths(recovery_table.RECOVERY, [(None, r["heat_recovery"])], seen["recovery"])
            missing += _check_paths(recovery_table.RECOVERY_BY_STAGE,
                                    [(None, row) for _, row in recovery_table.recovery_rows(r["heat_recovery"])],
                                    seen["by_stage"])
    assert missing == []
    assert seen["summary"] == {f.id for f in _pdf_key_figures()}
    assert seen["train"] == {f.id for f in summary_table.SUMMARY_TRAIN}
    assert seen["recovery"] == {f.id for f in recovery_table.RECOVERY}
    assert seen["by_stage"] == {f.id for f in recovery_table.RECOVERY_BY_STAGE}


def test_every_staging_column_path_is_in_a_study_of_a_sample_project():
    from stagewright.core.study import compare_stagings
    rows = compare_stagings(load(SAMPLES / "single_stage_workshop.json"), 2).rows()
    seen: set = set()
    assert _check_paths(staging_table.STAGING, [(None, row) for row in rows], seen) == []
    assert seen == {f.id for f in staging_table.STAGING}


def test_every_year_path_is_in_the_year_of_the_sample_project():
    from stagewright.core.year import run_year
    year = run_year(load(SAMPLES / "three_stage_site_year.json")).to_dict()
    seen: set = set()
    assert _check_paths(year_tables.YEAR_BINS, [(None, b) for b in year["bins"]], seen) == []
    assert _check_paths(year_tables.YEAR_TOTALS, [(None, year)], seen) == []
    assert seen == {f.id for f in year_tables.YEAR_BINS + year_tables.YEAR_TOTALS}
    for fig in year_tables.YEAR_TOTALS:
        if fig.bin_key:
            assert read_path(year, fig.bin_key) in {b["label"] for b in year["bins"]}


@pytest.mark.parametrize("name", sorted(TABLES))
def test_each_output_sees_a_figure_id_once(name):
    # the window finds cells by id; a figure placed twice in a table is so for different outputs
    for output in OUTPUTS:
        ids = [f.id for f in shown(TABLES[name], output)]
        assert len(ids) == len(set(ids)), (name, output)


def test_presentation_never_imports_qt_or_a_matplotlib_back_end():
    forbidden = ("PySide6", "PyQt5", "PyQt6", "shiboken6", "matplotlib")
    offenders = []
    for path in (ROOT / "app" / "presentation").glob("*.py"):
        for node in ast.walk(ast.parse(path.read_text(encoding="utf-8"))):
            names = [a.name for a in node.names] if isinstance(node, ast.Import) else (
                [node.module] if isinstance(node, ast.ImportFrom) and node.module else [])
            offenders += [f"{path.name}: {n}" for n in names if n.split(".")[0] in forbidden]
    assert offenders == []


# ---- one line added to one table shows everywhere ----------------------------------------------

SAMPLE = SAMPLES / "two_stage_plant_air.json"
#: (table, the one line added, where to find its value in the result, SI per displayed unit, label per output)
ONE_LINE = {
    "a train total": ("TOTALS", Figure("barometric_pressure_Pa", "Site barometric pressure", "pressure"),
                      lambda r: r["barometric_pressure_Pa"], 1e5,
                      {"window": "Site barometric pressure", "text": "site barometric pressure",
                       "pdf": "Site barometric pressure", "csv": "site_barometric_pressure"}),
    "a stage column": ("COMPONENTS", Figure({"stage": "gas_power_W"}, "Gas power", "power"),
                       lambda r: r["stages"][0]["gas_power_W"], 1e3,
                       {"window": "Gas power\n[kW]", "text": "Gas power [kW]", "pdf": "Gas power", "csv": "gas_power"}),
}


def _number(text: str) -> float:
    return float(text.replace(" ", ""))


def _printed_near(expected: float, text: str) -> None:
    """``text`` is ``expected`` at the precision it is printed with."""
    decimals = len(text.split(".")[1]) if "." in text else 0
    assert abs(_number(text) - expected) <= 0.5 * 10.0 ** -decimals * (1 + 1e-9), (text, expected)


@pytest.mark.gui
@pytest.mark.parametrize("case", sorted(ONE_LINE))
def test_one_line_in_one_table_shows_in_the_window_text_pdf_and_csv(case, monkeypatch, qtbot, tmp_path):
    pytest.importorskip("PySide6")
    from stagewright.gui.cli.solve_table import format_result
    from stagewright.gui.report import csv_rows, export_report
    from gui_support import make_window

    table, line, si_of, scale, labels = ONE_LINE[case]
    monkeypatch.setattr(balance_tables, table, getattr(balance_tables, table) + (line,))
    doc = load(SAMPLE)
    r = solve(doc).to_dict()
    expected = si_of(r) / scale

    # the window's balance sheet
    win = make_window(qtbot, tmp_path, json.loads(SAMPLE.read_text(encoding="utf-8")))
    bal = win.panels["balance"]
    if table == "TOTALS":
        assert bal.value_text("totals", line.id, "label") == labels["window"]
        shown_text = bal.value_text("totals", line.id, "")
        assert shown_text.endswith(" bar(a)")
        _printed_near(expected, shown_text.removesuffix(" bar(a)"))
    else:
        col = 1 + bal.column_keys("components").index(line.id)
        assert bal.components.horizontalHeaderItem(col).text() == labels["window"]
        _printed_near(expected, bal.value_text("components", "stage-1", line.id))
    win.close()

    # the solve command's text table
    text = format_result(doc.get("title", ""), r)
    if table == "TOTALS":
        m = re.search(rf"^{labels['text']} +([\d.]+) bar\(a\)$", text, re.M)
    else:
        assert re.search(rf"^component .*{re.escape(labels['text'])}$", text, re.M)  # the last column's header
        m = re.search(r"^stage 1 \(r=[\d.]+\) .* ([\d.]+)$", text, re.M)
    assert m, text
    _printed_near(expected, m.group(1))

    # the PDF report
    pdf = tmp_path / "r.pdf"
    export_report(doc, r, pdf)
    printed = "\n".join(page.extract_text() for page in pypdf.PdfReader(str(pdf)).pages)
    if table == "TOTALS":
        m = re.search(rf"^{labels['pdf']} ([\d.]+) bar\(a\)$", printed, re.M)
    else:
        assert labels["pdf"] in printed
        m = re.search(r"^Stage 1  \(r = [\d.]+\) .* ([\d.]+)$", printed, re.M)
    assert m, printed
    _printed_near(expected, m.group(1))

    # the CSV
    rows = list(csv.reader(io.StringIO("\r\n".join(",".join(row) for row in csv_rows(r)))))
    header, unit_row = rows[0], rows[1]
    col = header.index(labels["csv"])
    assert unit_row[col] == ("bar(a)" if table == "TOTALS" else "kW")
    which = ["train", "Train"] if table == "TOTALS" else ["component", "Stage 1"]
    row = next(row for row in rows if row[:2] == which)
    assert float(row[col]) == pytest.approx(expected, rel=1e-11)
