"""The report's field-check uncertainty section: results with U, verdicts, measured inputs.

Self-contained: one function, :func:`field_uncertainty_section`, lays the section out on a
:class:`~stagewright.gui.report.layout.Pager` from ``FieldCheckUncertainty.to_dict()``
(:mod:`stagewright.core.uncertainty.field_check`), reading the same rows as the window and the command
line (:mod:`stagewright.gui.presentation.uncertainty_table`). To put it in the report, call it in
``stagewright.gui.report.pdf.build_pages`` after the totals, with the uncertainty computed by the caller
(it costs a few dozen solves to first order, and the Monte Carlo draws if wanted)::

    if uncertainty is not None:
        field_uncertainty_section(p, uncertainty, system)
"""
from __future__ import annotations

__all__ = ["field_uncertainty_section"]

from stagewright.gui.presentation import uncertainty_table as ut
from stagewright.gui.report.layout import Column, Pager, Table


def _columns(headers: tuple, left: tuple, wrapped: tuple = ()) -> list[Column]:
    return [Column(h, align="left" if j in left else "right", wrap=j in wrapped) for j, h in enumerate(headers)]


def field_uncertainty_section(p: Pager, uncertainty: dict, system: str = "SI") -> None:
    """Lay out the field-check uncertainty: verdicts first, then results ± U, inputs and notes.

    Parameters
    ----------
    p : Pager
        The report being laid out.
    uncertainty : dict
        ``FieldCheckUncertainty.to_dict()`` of the project.
    system : str
        ``"SI"`` or ``"US"`` display units.
    """
    figures = Table("Results with their expanded uncertainty (k = 2)",
                    _columns(ut.FIGURE_COLUMNS, left=(0, 5), wrapped=(5,)), ut.figure_rows(uncertainty, system),
                    note="U: expanded uncertainty, coverage factor 2. Monte Carlo interval: coverage "
                         "probability 95.45 %, the probability of ±2 standard deviations of a Gaussian.")
    p.heading("Field check: uncertainty and verdicts", keep_with=p.table_height(figures))
    if uncertainty["verdicts"]:
        p.table(Table("Guaranteed figures", _columns(ut.VERDICT_COLUMNS, left=(0, 4, 5), wrapped=(0, 2, 3, 5)),
                      ut.verdict_rows(uncertainty, system)))
    p.table(figures)
    p.table(Table("Measured inputs and their uncertainty", _columns(ut.INPUT_COLUMNS, left=(0, 3), wrapped=(3,)),
                  ut.input_rows(uncertainty, system)))
    for line in ut.notes(uncertainty):
        p.paragraph(line)
