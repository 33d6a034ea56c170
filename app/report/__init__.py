"""Reports a designer can hand over: a PDF and a CSV of a solved project (no Qt, no display).

``export_report`` is what both ``stagewright report`` and the window's File → Export call,
so the two always produce the same report. Modules: ``layout`` (the Pager: text, tables, chart
blocks) · ``summary`` (the first page) · ``sections`` (inputs, balance sheet, exchangers and zones,
totals, charts, staging, cautions) · ``recovery_section`` · ``year_section`` · ``package_section``
· ``pdf`` (the order of the sections, writing) · ``csv_export`` · ``atomic``.
"""
from __future__ import annotations

__all__ = ["export_report", "write_csv", "write_pdf", "csv_rows", "program_version", "account_name"]

import datetime as _dt
import getpass

from stagewright.core.coolprop_adapter import coolprop_version

from stagewright.gui.presentation.printable import printable
from stagewright.gui.report.csv_export import csv_rows, write_csv, write_year_csv, year_csv_path
from stagewright.gui.report.pdf import program_version, write_pdf
from stagewright.gui.report.sections import ReportInfo


def export_report(doc: dict, result, pdf_path, csv_path=None, system: str = "SI", source_name: str = "",
                  study_rows=None, *, date: str | None = None, paper: str | None = None,
                  prepared_by: str | None = None, year=None, project: dict | None = None,
                  shown_case: str = "") -> int:
    """Write the PDF report (and optionally the CSV) of a solved project.

    Parameters
    ----------
    doc : dict
        The project document as entered.
    result : dict or TrainResult
        Its solve (``TrainResult`` or ``TrainResult.to_dict()``).
    pdf_path : path-like
        Where to write the PDF.
    csv_path : path-like, optional
        Where to write the CSV balance sheet.
    system : str
        Display units, ``"SI"`` or ``"US"``.
    source_name : str
        Project file name printed in the title block and footers.
    study_rows : list of dict, optional
        Rows of a staging study to print as the staging comparison.
    date : str, optional
        ISO date printed on the report (default: today).
    paper : str, optional
        ``"A4"`` or ``"Letter"`` (default: A4 for SI, Letter for US units).
    prepared_by : str, optional
        Who made the report, printed on its first page (default: the user account's name).
    project : dict, optional
        The whole project when ``doc`` is one of its cases (the window's shown case); by default
        ``doc`` itself. When it has cases besides its base, they are solved and compared in a
        section of their own (:func:`stagewright.core.cases.compare_cases`).
    shown_case : str, optional
        Name of the case ``doc`` is (default: the project's base).
    year : dict or YearResult, optional
        The project's year at the site; computed here (:func:`stagewright.core.year.run_year`, about a
        second) when the project has a ``year`` section and none is given.

    Returns
    -------
    int
        Number of pages written.
    """
    if hasattr(result, "to_dict"):
        result = result.to_dict()
    # text from the project that no font draws and UTF-8 cannot encode (an unpaired surrogate)
    # is printed as U+FFFD (issue 22 item 10)
    doc, result, source_name = printable(doc), printable(result), printable(source_name)
    if system not in ("SI", "US"):
        from stagewright.core.errors import InputError
        raise InputError("units", system, "SI or US")
    info = ReportInfo(source_name=source_name, date=date or _dt.date.today().isoformat(),
                      version=program_version(), system=system,
                      prepared_by=account_name() if prepared_by is None else prepared_by,
                      coolprop=coolprop_version())
    year, year_problem = _year_of(doc, year)
    cases, shown_case = _cases_of(project if project is not None else doc, shown_case)
    n = write_pdf(doc, result, pdf_path, info, study_rows=study_rows, paper=paper, year=year,
                  year_problem=year_problem, cases=cases, shown_case=shown_case, uncertainty=_uncertainty_of(doc),
                  **_sheet_of(doc, result))
    if csv_path is not None:
        write_csv(result, csv_path, system)
        if year and year.get("bins"):
            write_year_csv(year, year_csv_path(csv_path))
    return n


def account_name() -> str:
    """The name of the user account running the program (``""`` when the system does not say)."""
    try:
        return getpass.getuser()
    except (KeyError, OSError, ImportError):  # no such entry in the password database, no USER variable
        return ""


def _uncertainty_of(doc: dict) -> dict | None:
    """A field check's results with their first-order uncertainty and verdicts (None without a
    ``field_check`` section, or when it cannot be evaluated). The Monte Carlo check is left to
    ``stagewright uncertainty`` and the window: the report stays quick to write."""
    from stagewright.core import StagewrightError
    from stagewright.core.uncertainty.field_check import field_check_uncertainty, has_field_check
    if not has_field_check(doc):
        return None
    try:
        return field_check_uncertainty(doc, monte_carlo=False).to_dict()
    except StagewrightError:
        return None


def _sheet_of(doc: dict, result: dict) -> dict:
    """The package's data sheet (two lean solves) for the report: ``sheet`` and ``sheet_problem``
    (nothing without a ``package`` section)."""
    if not result.get("package"):
        return {}
    from stagewright.core import StagewrightError
    from stagewright.core.part_load.data_sheet import data_sheet
    try:
        return {"sheet": data_sheet(doc).to_dict()}
    except StagewrightError as exc:
        return {"sheet_problem": str(exc)}


def _cases_of(project: dict, shown_case: str) -> tuple[list | None, str]:
    """The project's cases solved side by side (None when it has no case besides its base)."""
    if not project.get("cases"):
        return None, shown_case
    from stagewright.core.cases import compare_cases
    from stagewright.core.project.cases import base_name
    return compare_cases(project), shown_case or base_name(project)


def _year_of(doc: dict, year) -> tuple[dict | None, str]:
    """The year at the site to print (its dict), or why it could not be computed."""
    if year is None and doc.get("year"):
        from stagewright.core import StagewrightError
        from stagewright.core.year import run_year
        try:
            year = run_year(doc)
        except StagewrightError as exc:
            return None, str(exc)
    if hasattr(year, "to_dict"):
        year = year.to_dict()
    return year, ""
