"""Golden files of the sample projects' reports: their PDF text and CSV, normalised.

``tests/golden/<sample>.pdf.txt`` is the text pypdf reads from the sample's PDF report and
``tests/golden/<sample>.csv`` its CSV, both as ``stagewright report <sample> --csv
--prepared-by "Stagewright test suite"`` writes them in SI units. Dates, the Stagewright and
CoolProp version numbers and balance-closure residuals below 1e-9 (numerical noise) are replaced
by placeholders, so the files change only when what a report says changes. A change shows in
review as a diff of these files; ``tests/test_golden.py`` fails until they are regenerated:

    python -m tests.regenerate_golden

(from the repository root; it writes every sample's files afresh, then review ``git diff tests/golden``).
"""
from __future__ import annotations

import re
import sys
from pathlib import Path

import pypdf

HERE = Path(__file__).resolve().parent
GOLDEN = HERE / "golden"
SAMPLES = HERE.parent / "sample_projects"
PREPARED_BY = "Stagewright test suite"
REGENERATE = "python -m tests.regenerate_golden"

_DATE = re.compile(r"\b\d{4}-\d{2}-\d{2}\b")
_PROGRAM = re.compile(r"\b(Stagewright|CoolProp) \d+(?:\.\d+)+(?:[.+-]?[A-Za-z0-9]+)*")
_TINY = re.compile(r"-?\d\.\d+e[-+]\d+")


def _tiny(match: re.Match) -> str:
    return "<|x| < 1e-9>" if abs(float(match.group())) < 1e-9 else match.group()


def normalise(text: str) -> str:
    """``text`` with dates, version numbers and noise-level residuals replaced by placeholders."""
    text = _DATE.sub("<date>", text)
    text = _PROGRAM.sub(lambda m: f"{m.group(1)} <version>", text)
    text = _TINY.sub(_tiny, text)
    return "\n".join(line.rstrip() for line in text.splitlines()) + "\n"


def pdf_text(path) -> str:
    """The text of every page of a PDF as pypdf extracts it, a ``---- page n ----`` line before each page."""
    return "\n".join(f"---- page {i} ----\n{page.extract_text()}"
                     for i, page in enumerate(pypdf.PdfReader(str(path)).pages, 1))


def golden_texts(pdf, csv_path) -> dict[str, str]:
    """``{"pdf.txt": …, "csv": …}``: the normalised golden texts of one report."""
    return {"pdf.txt": normalise(pdf_text(pdf)),
            "csv": normalise(Path(csv_path).read_text(encoding="utf-8").replace("\r\n", "\n"))}


def golden_path(sample: Path, kind: str) -> Path:
    return GOLDEN / f"{sample.stem}.{kind}"


def sample_files() -> list[Path]:
    return sorted(SAMPLES.glob("*.json"))


def write_report(sample: Path, folder: Path) -> tuple[Path, Path]:
    """Write the sample's PDF and CSV report into ``folder`` as the golden files are made."""
    if str(HERE.parent) not in sys.path:
        sys.path.insert(0, str(HERE.parent))
    from stagewright.gui.cli.main import main

    pdf, csv_path = folder / f"{sample.stem}.pdf", folder / f"{sample.stem}.csv"
    status = main(["report", str(sample), "-o", str(pdf), "--csv", str(csv_path), "--prepared-by", PREPARED_BY])
    if status != 0:
        raise RuntimeError(f"stagewright report {sample.name} exited with {status}")
    return pdf, csv_path
