"""The PDF report: lay out every section on paper-sized figures and write them with PdfPages.

Why matplotlib's PDF back end rather than Qt's PDF writer: it needs no display and no Qt
(``stagewright report`` runs on a headless server and in the test suite), the charts are
the very figure functions the window uses, and the output is vector graphics with embedded,
searchable TrueType text.
"""
from __future__ import annotations

__all__ = ["write_pdf", "build_pages", "lay_out", "program_version"]

import datetime as _dt
from importlib import metadata

import matplotlib
from matplotlib.backends.backend_pdf import PdfPages

from stagewright.gui.report import sections
from stagewright.gui.report.atomic import atomic_path
from stagewright.gui.report.cases_section import cases_section
from stagewright.gui.report.field_uncertainty_section import field_uncertainty_section
from stagewright.gui.report.layout import Pager
from stagewright.gui.report.package_section import package_section
from stagewright.gui.report.recovery_section import heat_recovery
from stagewright.gui.report.summary import summary_page
from stagewright.gui.report.year_section import year_at_site


def program_version() -> str:
    """Installed Stagewright version (the core's version when not installed)."""
    try:
        return metadata.version("stagewright")
    except metadata.PackageNotFoundError:
        from stagewright.core import __version__
        return __version__


def build_pages(doc: dict, result: dict, info: sections.ReportInfo, study_rows=None, paper: str | None = None,
                year: dict | None = None, year_problem: str = "", cases: list | None = None, shown_case: str = "",
                uncertainty: dict | None = None, sheet: dict | None = None, sheet_problem: str = ""):
    """Lay the report out; returns the page figures (nothing written yet)."""
    return lay_out(doc, result, info, study_rows, paper, year, year_problem, cases, shown_case, uncertainty,
                   sheet, sheet_problem).finish()


def lay_out(doc: dict, result: dict, info: sections.ReportInfo, study_rows=None, paper: str | None = None,
            year: dict | None = None, year_problem: str = "", cases: list | None = None,
            shown_case: str = "", uncertainty: dict | None = None, sheet: dict | None = None,
            sheet_problem: str = "") -> Pager:
    """Print every section onto a :class:`Pager` (its pages not finished: no footers yet).

    ``year`` is the project's year at the site (``YearResult.to_dict()``) when it has one, and
    ``year_problem`` why it could not be computed; ``study_rows`` a staging study's rows;
    ``cases`` the project's cases compared (:class:`stagewright.core.cases.CaseOutcome`, the first the
    reference) and ``shown_case`` the case the rest of the report describes; ``uncertainty`` a
    field check's ``FieldCheckUncertainty.to_dict()``; ``sheet`` the package's data sheet
    (``DataSheet.to_dict()``) and ``sheet_problem`` why it could not be computed.
    """
    system = info.system
    paper = paper or ("Letter" if system == "US" else "A4")
    title = doc.get("title") or "Untitled project"
    footer = "  ·  ".join(x for x in (info.source_name, info.date) if x)
    p = Pager(paper, running_title=title, footer_left=footer)
    summary_page(p, doc, result, info)  # the answer and the warnings first, where a reader cannot miss them
    sections.inputs(p, doc, result, system)
    states = sections.state_points_table(p, result, system)
    p.heading("Balance sheet", keep_with=p.table_height(states))
    p.table(states)
    sections.components_table(p, result, system)
    sections.exchangers_table(p, result, system)
    sections.totals_table(p, result, system)
    if uncertainty is not None:  # a field check: its results with their uncertainty and verdicts
        field_uncertainty_section(p, uncertainty, system)
    heat_recovery(p, result, system)
    sections.charts(p, doc, result, system)
    limits = [st.get("max_discharge_temperature_K") for st in doc.get("stages", [])]
    limits = [v for v in limits if v is not None]
    limit = min(limits) if limits else None
    year_at_site(p, year, system, limit_K=limit, problem=year_problem)
    package_section(p, result, system, sheet=sheet, sheet_problem=sheet_problem, title=doc.get("title") or "")
    sections.staging(p, study_rows, system, limit_K=limit)
    if cases:
        cases_section(p, cases, cases[0].name, shown_case or cases[0].name, system)
    sections.cautions(p, doc, result.get("warnings") or (), year)
    return p


def write_pdf(doc: dict, result: dict, path, info: sections.ReportInfo, study_rows=None, paper: str | None = None,
              year: dict | None = None, year_problem: str = "", cases: list | None = None,
              shown_case: str = "", uncertainty: dict | None = None, sheet: dict | None = None,
              sheet_problem: str = "") -> int:
    """Write the PDF report to ``path`` atomically; returns the number of pages (see :func:`lay_out`)."""
    pages = build_pages(doc, result, info, study_rows, paper, year, year_problem, cases, shown_case, uncertainty,
                        sheet, sheet_problem)
    meta = {"Title": doc.get("title") or "Stagewright report", "Creator": f"Stagewright {info.version}",
            "Subject": "Compression-train sizing report"}
    try:
        meta["CreationDate"] = _dt.datetime.fromisoformat(info.date).replace(tzinfo=_dt.timezone.utc)
    except ValueError:
        pass
    with atomic_path(path) as tmp:
        # TrueType (Type 42) fonts keep the text searchable and extractable
        with matplotlib.rc_context({"pdf.fonttype": 42}):
            with PdfPages(tmp, metadata=meta) as pdf:
                for fig in pages:
                    pdf.savefig(fig)
    return len(pages)
