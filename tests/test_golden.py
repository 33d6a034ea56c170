"""Issue 17 item 5: what each sample project's report says is kept in golden files.

The PDF text (pypdf) and the CSV of every sample's report must equal ``tests/golden/`` after
normalisation (dates, version numbers, noise-level residuals; ``tests/golden_support.py``). A
change to what a report says fails here with the diff; regenerate the files with

    python -m tests.regenerate_golden

and review ``git diff tests/golden`` with the change. These are regression checks of the report's
text, not physics checks: the figures themselves are checked against external sources elsewhere.
"""
from __future__ import annotations

import difflib

import pytest

import golden_support as golden

SAMPLE_FILES = golden.sample_files()


def _diff(expected: str, actual: str, name: str) -> str:
    lines = list(difflib.unified_diff(expected.splitlines(), actual.splitlines(), f"golden/{name}", "report",
                                      lineterm="", n=1))
    shown = "\n".join(lines[:80]) + ("\n…" if len(lines) > 80 else "")
    return f"{name} differs from the report (regenerate with `{golden.REGENERATE}`, then review):\n{shown}"


@pytest.mark.parametrize("kind", ["pdf.txt", "csv"])
@pytest.mark.parametrize("path", SAMPLE_FILES, ids=lambda p: p.stem)
def test_report_text_equals_its_golden_file(path, kind, sample_reports):
    actual = golden.golden_texts(*sample_reports[path])[kind]
    gold = golden.golden_path(path, kind)
    assert gold.exists(), f"no golden file {gold.name}: run `{golden.REGENERATE}`"
    expected = gold.read_text(encoding="utf-8")
    assert actual == expected, _diff(expected, actual, gold.name)


def test_every_golden_file_belongs_to_a_sample():
    names = {golden.golden_path(p, kind).name for p in SAMPLE_FILES for kind in ("pdf.txt", "csv")}
    assert {p.name for p in golden.GOLDEN.iterdir() if p.suffix in (".txt", ".csv")} == names


def test_normalisation_keeps_figures_and_hides_what_changes_by_itself():
    text = ("Date 2026-12-03 · Program Stagewright 0.1.0, CoolProp 7.2.0\n"
            "Energy balance closure -3.79e-13   \nShaft power 185.22 kW\nLimit 1.50e-03\n")
    assert golden.normalise(text) == ("Date <date> · Program Stagewright <version>, CoolProp <version>\n"
                                      "Energy balance closure <|x| < 1e-9>\nShaft power 185.22 kW\nLimit 1.50e-03\n")
