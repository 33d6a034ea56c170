"""File → Export report… in the window writes the same report as ``stagewright report``.

The PDF is read back with pypdf and its totals compared with the window's own current
result at the printed precision; the CSV is parsed with the standard library.
"""
from __future__ import annotations

import csv
import re

import pypdf
import pytest

pytest.importorskip("pytestqt")

from gui_support import make_window, type_into, wait_solved  # noqa: E402

from stagewright.gui.window.export_ops import PDF_AND_CSV, PDF_ONLY  # noqa: E402

pytestmark = pytest.mark.gui
EXPORT_TIMEOUT_MS = 60_000


def _export(qtbot, win, target, chosen):
    win.prompts.export_target = lambda _start: (str(target), chosen)
    win.action_map["file.export"].trigger()
    qtbot.waitUntil(lambda: win.exports.job is not None and not win.exports.job.thread.is_alive(),
                    timeout=EXPORT_TIMEOUT_MS)
    qtbot.wait(50)  # let the queued done signal arrive


def test_export_writes_pdf_and_csv_matching_the_window(qtbot, tmp_path):
    win = make_window(qtbot, tmp_path)
    errors = []
    win.prompts.show_error = lambda title, text: errors.append(text)
    assert win.action_map["file.export"] in win.menuBar().actions()[0].menu().actions()
    _export(qtbot, win, tmp_path / "out", PDF_AND_CSV)  # no suffix typed: .pdf is added
    assert errors == []
    pdf, csv_path = tmp_path / "out.pdf", tmp_path / "out.csv"
    text = "\n".join(p.extract_text() for p in pypdf.PdfReader(str(pdf)).pages)
    r = win.editor.result
    m = re.search(r"^Shaft power ([\d .]+) kW$", text, re.M)
    assert m and abs(float(m.group(1).replace(" ", "")) - r["shaft_power_W"] / 1e3) <= 0.005
    with open(csv_path, newline="", encoding="utf-8") as fh:
        rows = list(csv.reader(fh))
    train = [row for row in rows if row[0] == "train"][0]
    assert float(train[rows[0].index("shaft_power")]) * 1e3 == pytest.approx(r["shaft_power_W"], rel=1e-11)
    assert "Exported out.pdf" in win.statusBar().currentMessage()
    win.close()


def test_export_in_us_units_and_pdf_only(qtbot, tmp_path):
    win = make_window(qtbot, tmp_path)
    win.action_map["view.us_units"].setChecked(True)
    _export(qtbot, win, tmp_path / "us.pdf", PDF_ONLY)
    assert not (tmp_path / "us.csv").exists()
    text = pypdf.PdfReader(str(tmp_path / "us.pdf")).pages[0].extract_text()
    assert "Display units US customary" in text
    win.close()


def test_export_refuses_stale_results(qtbot, tmp_path):
    win = make_window(qtbot, tmp_path)
    errors = []
    win.prompts.show_error = lambda title, text: errors.append(title)
    type_into(qtbot, win.panels["train"].stage_form.value, "abc")  # results go stale
    win.prompts.export_target = lambda _start: pytest.fail("no file dialog for stale results")
    win.action_map["file.export"].trigger()
    assert errors == ["Nothing to export yet"] and win.exports.job is None
    win.close()


def test_export_failure_is_a_message_not_a_crash(qtbot, tmp_path):
    win = make_window(qtbot, tmp_path)
    errors = []
    win.prompts.show_error = lambda title, text: errors.append((title, text))
    _export(qtbot, win, tmp_path / "missing_folder" / "x.pdf", PDF_ONLY)
    assert errors and errors[0][0] == "Cannot export the report" and "x.pdf" in errors[0][1]
    win.close()


def test_export_prints_the_staging_study_run_in_the_window(qtbot, tmp_path):
    # issue 17 item 4: a study run in the window goes into the report (not only `report --stagings`);
    # a study that no longer fits the project (stale) does not
    from test_study_panel import perfect_gas_doc, run

    win = make_window(qtbot, tmp_path, perfect_gas_doc())
    panel = run(qtbot, win, 3)
    assert not panel.is_stale and len(panel.rows) == 3
    _export(qtbot, win, tmp_path / "study.pdf", PDF_ONLY)
    text = "\n".join(p.extract_text() for p in pypdf.PdfReader(str(tmp_path / "study.pdf")).pages)
    assert "Staging comparison" in text and "Arrangements compared" in text
    for row in panel.rows:  # each option's driver power at the printed precision (kW, 2 decimals)
        m = re.search(rf"^{row['stages']} [\d. ×]+? ([\d ]+\.\d\d) ", text, re.M)
        assert m and abs(float(m.group(1).replace(" ", "")) - row["driver_power_W"] / 1e3) <= 0.005
    after = win.editor.solved_jobs
    win.editor.set_value("stages[0].efficiency.value", 0.7)  # the study no longer describes the project
    wait_solved(qtbot, win, after)
    assert panel.is_stale
    _export(qtbot, win, tmp_path / "stale.pdf", PDF_ONLY)
    text = "\n".join(p.extract_text() for p in pypdf.PdfReader(str(tmp_path / "stale.pdf")).pages)
    assert "Staging comparison" not in text
    win.close()


def test_export_starts_in_documents_with_a_name_from_the_title_then_in_the_last_folder(qtbot, tmp_path, monkeypatch):
    from PySide6.QtCore import QStandardPaths
    docs = tmp_path / "Documents"
    docs.mkdir()
    monkeypatch.setattr(QStandardPaths, "writableLocation", staticmethod(lambda kind: str(docs)))
    win = make_window(qtbot, tmp_path)
    win.editor.set_value("title", "Plant air: 2027")
    wait_solved(qtbot, win, win.editor.solved_jobs)
    starts = []
    win.prompts.export_target = lambda start: starts.append(start) or ("", PDF_ONLY)
    win.action_map["file.export"].trigger()
    assert starts == [str(docs / "Plant air 2027.pdf")]  # not ./report.pdf in the checkout
    reports = tmp_path / "reports"
    reports.mkdir()
    _export(qtbot, win, reports / "first.pdf", PDF_ONLY)
    win.prompts.export_target = lambda start: starts.append(start) or ("", PDF_ONLY)
    win.action_map["file.export"].trigger()
    assert starts[-1] == str(reports / "Plant air 2027.pdf")
    win.close()


def test_export_asks_before_replacing_a_csv_the_dialog_did_not_ask_about(qtbot, tmp_path):
    win = make_window(qtbot, tmp_path)
    errors, asked = [], []
    win.prompts.show_error = lambda title, text: errors.append(text)
    old_csv = tmp_path / "out.csv"
    old_csv.write_text("an older balance sheet", encoding="utf-8")
    win.prompts.confirm_overwrite = lambda paths: asked.append(list(paths)) or False
    win.prompts.export_target = lambda _start: (str(tmp_path / "out.pdf"), PDF_AND_CSV)
    win.action_map["file.export"].trigger()
    assert asked == [[old_csv]] and win.exports.job is None  # the dialog asked about out.pdf only
    assert old_csv.read_text(encoding="utf-8") == "an older balance sheet" and not (tmp_path / "out.pdf").exists()
    assert "nothing was written" in win.statusBar().currentMessage()
    win.prompts.confirm_overwrite = lambda paths: asked.append(list(paths)) or True
    _export(qtbot, win, tmp_path / "out.pdf", PDF_AND_CSV)
    assert errors == [] and old_csv.read_text(encoding="utf-8").startswith("kind,name,")
    asked.clear()
    _export(qtbot, win, tmp_path / "out", PDF_ONLY)  # ".pdf" added here: the dialog asked about "out"
    assert asked == [[tmp_path / "out.pdf"]]
    win.close()
