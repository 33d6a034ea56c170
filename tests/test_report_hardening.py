"""The report with hostile text (issue 22 items 9 and 10): a long unbroken name wraps in linear
time, "$" is a dollar sign (never mathtext), an unpaired surrogate never crashes."""
from __future__ import annotations

import json

import pypdf

from stagewright.gui.cli.main import main
from stagewright.gui.report import export_report
from stagewright.gui.report.layout import text_width, wrap
from conftest import SAMPLES
from tests.time_limit import finishes_within
from stagewright.core import solve
from stagewright.core.project import load

DEMO = SAMPLES / "two_stage_plant_air.json"


def test_an_unbroken_name_of_the_documented_length_wraps_in_linear_time():
    # 2 000 characters took 39 s and 20 000 more than five minutes: every shorter prefix was measured
    word = "Ab" * 10_000  # the longest text a stage name may hold (schema: 20 000 characters)
    with finishes_within(30.0, "wrapping 20 000 characters"):
        lines = wrap(word, 2.0, 7.5)
    assert "".join(lines) == word
    assert all(text_width(line, 7.5) <= 2.0 for line in lines)
    # each line is as long as fits: one more character would not
    assert all(text_width(line + nxt[0], 7.5) > 2.0 for line, nxt in zip(lines, lines[1:]))


def test_dollar_signs_and_a_lone_surrogate_print_as_text(tmp_path):
    doc = load(DEMO)
    doc["title"] = "Plant \ud800 $\\foo$ upgrade"
    doc["note"] = "Budget $5 and $6 per hour"
    doc["stages"][0]["name"] = "$x_1$ low stage"
    pdf = tmp_path / "r.pdf"
    export_report(doc, solve(doc), pdf, tmp_path / "r.csv")  # raised on "$\foo$" and on the surrogate
    text = "\n".join(page.extract_text() for page in pypdf.PdfReader(str(pdf)).pages)
    flat = " ".join(text.split())
    assert "$5 and $6" in flat and "$\\foo$" in flat and "$x_1$ low stage" in flat
    assert "\ufffd" in text or "Plant" in text


def test_report_command_on_a_title_with_a_lone_surrogate(tmp_path, capsys):
    data = json.loads(DEMO.read_text(encoding="utf-8"))
    data["title"] = "\ud800 plant"
    path = tmp_path / "p.json"
    path.write_text(json.dumps(data), encoding="utf-8")  # ensure_ascii: the file holds the \ud800 escape
    assert main(["report", str(path), "--csv"]) == 0, capsys.readouterr().err
    assert path.with_suffix(".pdf").stat().st_size > 1000 and path.with_suffix(".csv").exists()
