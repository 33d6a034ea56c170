"""The report's "Package and data sheet" section: the package at full and at the stated load, the
load profile's year, the part-load chart, and the data sheet on a page of its own.

Printed when the project has a ``package`` section. The rows are those of
:mod:`stagewright.gui.presentation.package_table` for the ``"pdf"`` output (the window and the command line
read the same rows); the data sheet (``DataSheet.to_dict()`` of
:func:`stagewright.core.part_load.data_sheet.data_sheet`, two extra solves) is computed by
:func:`stagewright.gui.report.export_report`, and a sheet that could not be computed is reported in words.
The sheet's page is laid out to be held beside a supplier's sheet: conditions first, then two rows
per load (the reference and the site), the part-load curve, what the package input includes and
the cautions that matter for the control (the report's Cautions section, next, defers to local codes). The layout is Stagewright's own. No Qt.
"""
from __future__ import annotations

__all__ = ["package_section"]

from stagewright.gui.charts.part_load_chart import draw_part_load_chart
from stagewright.gui.presentation import package_table as pt
from stagewright.gui.presentation.cautions import package_cautions
from stagewright.gui.report.layout import Column, Pager, Table

_PDF = "pdf"
_CHART_MIN_IN, _CHART_MAX_IN = 1.8, 2.7  #: the data sheet's part-load curve, [in]
_CHART_HEADING_IN = 10.5 * 1.6 / 72.0 + 0.13  #: a level-1 heading above a chart block (Pager.charts), [in]


def _points_table(pkg: dict, system: str) -> Table:
    heads = [h for h, _ in pt.point_columns(pkg)]
    cols = [Column("", align="left"), Column("Unit", align="left")] + [Column(h) for h in heads]
    return Table("The package at full load and at the stated load", cols, pt.point_rows(pkg, _PDF, system),
                 note="At the site as stated. Powers and shares are time means over the control's cycle; the "
                      "auxiliaries draw their power while the package runs.")


def package_section(p: Pager, result: dict, system: str = "SI", sheet: dict | None = None,
                    sheet_problem: str = "", title: str = "") -> None:
    """Lay out the package section (nothing when ``result`` has no package).

    Parameters
    ----------
    p : Pager
        The report being laid out.
    result : dict
        ``TrainResult.to_dict()``, with its ``package`` figures.
    system : str
        ``"SI"`` or ``"US"``.
    sheet : dict, optional
        ``DataSheet.to_dict()`` of the project.
    sheet_problem : str
        Why the data sheet could not be computed (printed instead of it).
    title : str
        The project's title, at the head of the data sheet.
    """
    pkg = result.get("package")
    if not pkg:
        return
    points = _points_table(pkg, system)
    p.heading("Package and data sheet", keep_with=p.table_height(points) + 0.3)
    p.paragraph(pt.control_line(pkg) + " The package input is the driver's input (motor at its part-load "
                "efficiency, and the drive's with variable speed) plus the auxiliaries while the package runs.")
    p.table(points)
    annual = pt.annual_rows(pkg, _PDF, system)
    if annual:
        p.table(Table("The load profile's year, at the site as stated",
                      [Column("", align="left"), Column("", align="left")], annual, header=False,
                      note="Energy in proportion to flow: the same hours at the full-load specific power, "
                           "what an ideal control would use; the part-load extra is what this control costs "
                           "over it."))
    _sheet_page(p, pkg, sheet, sheet_problem, title, system)


def _sheet_page(p: Pager, pkg: dict, sheet: dict | None, problem: str, title: str, system: str) -> None:
    """The data sheet on a page of its own, with the cautions for the control."""
    p.new_page()
    p.heading("Data sheet", keep_with=1.0)
    if title:
        p.paragraph(title, size=10.0)
    if sheet is None:
        p.paragraph("The data sheet could not be computed" + (f": {problem}" if problem else "."))
        return
    p.paragraph(f"Capacity control: {sheet['control']}. Figures at the ISO 1217 standard reference conditions "
                "beside the same package at the site as stated, at full load and at each stated part load.")
    conditions = Table("Conditions", [Column("", align="left"), Column("ISO 1217 reference"), Column("Site")],
                       pt.sheet_condition_rows(sheet, _PDF, system))
    p.table(conditions)
    heads = pt.sheet_headers(_PDF, system)
    cols = [Column(h, u, align="left" if j < 2 else "right") for j, (h, u) in enumerate(heads)]
    p.table(Table("Free air delivery and package input by load", cols, pt.sheet_rows(sheet, _PDF, system),
                  note="Free air delivery at the inlet conditions of its column (ISO 1217). Package input: "
                       "driver input plus the auxiliaries listed below; specific power: package input per "
                       "unit of free air delivery."))
    scope = "Included in the package input at full load, site: " + "; ".join(
        f"{label[:1].lower() + label[1:]} {value}" for label, value in _scope_rows(pkg, system)) + "."
    notes = " ".join(n[:1].upper() + n[1:] + "." for n in sheet["notes"])
    cautions = package_cautions(pkg["control"])
    rest = (p.paragraph_height(scope) + p.paragraph_height(notes, size=7.0)
            + sum(p.paragraph_height(text, size=7.5, bold_lead=f"{head}.") for head, text in cautions))
    # the curve takes what the rest of the sheet leaves on its page (the sheet stays one page)
    chart_h = min(_CHART_MAX_IN, max(_CHART_MIN_IN, p.space_left() - _CHART_HEADING_IN - rest - 0.2))
    p.charts("Part-load curve at the site", [(lambda f: draw_part_load_chart(f, pkg, system, side_by_side=True),
                                              chart_h)], shrink=0.8)
    p.paragraph(scope)
    p.paragraph(notes, size=7.0)
    for head, text in cautions:
        p.paragraph(text, bold_lead=f"{head}.", keep_together=True, size=7.5)


def _scope_rows(pkg: dict, system: str) -> list[list[str]]:
    """The auxiliaries counted in the package input at full load (label, value with unit)."""
    full = pkg["full_load"]
    ids = ("driver_power_W", "drive_loss_W", "fan_power_W", "pump_power_W", "other_power_W", "package_power_W")
    return [[f.label_in(_PDF), f.text(full, _PDF, system, with_unit=True)]
            for f in pt.point_figures(pkg, _PDF) if f.id in ids]
