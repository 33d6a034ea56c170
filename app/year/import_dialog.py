"""The questions of a CSV profile import: which file, the units of unlabelled columns, binning.

Modal dialogs, asked only by the Import button (:meth:`stagewright.gui.year.editor.YearEditor._ask_import`);
tests call :meth:`~stagewright.gui.year.editor.YearEditor.import_csv` with the answers instead.
"""
from __future__ import annotations

__all__ = ["ask_import", "BINNING_NOTE"]

from PySide6.QtWidgets import (QCheckBox, QComboBox, QDialog, QDialogButtonBox, QDoubleSpinBox, QFileDialog,
                               QFormLayout, QLabel, QVBoxLayout)

from stagewright.core.year_profile import BIN_RH_STEP, BIN_T_STEP_K

#: what binning changes (stagewright.core.year_profile.bin_profile), shown beside the choice
BINNING_NOTE = ("Binning groups rows of similar temperature and humidity and solves each group once at its "
                "hours-weighted mean: total hours are kept and energy and cooling water barely move, but "
                "condensate can shift a little and the hottest hour is smoothed into its bin's mean. "
                "An 8760-hour year becomes a few hundred solves.")
_T_UNITS = [("°C", "°C"), ("°F", "°F"), ("K", "K")]
_H_UNITS = [("%", "%"), ("fraction (0–1)", "")]


def ask_import(parent) -> tuple | None:  # pragma: no cover - modal dialogs
    """``(path, units, bin_steps or None)`` from the user, or None when cancelled."""
    path, _ = QFileDialog.getOpenFileName(parent, "Import an hourly or logged profile", "",
                                          "CSV files (*.csv *.txt);;All files (*)")
    if not path:
        return None
    dlg = QDialog(parent)
    dlg.setWindowTitle("Import profile")
    lay = QVBoxLayout(dlg)
    intro = QLabel("Columns whose header names no unit are read in these units:")
    intro.setWordWrap(True)
    lay.addWidget(intro)
    form = QFormLayout()
    t_box, h_box = QComboBox(), QComboBox()
    for text, _ in _T_UNITS:
        t_box.addItem(text)
    for text, _ in _H_UNITS:
        h_box.addItem(text)
    form.addRow("Temperatures", t_box)
    form.addRow("Humidity and load", h_box)
    bin_check = QCheckBox("Bin the rows by temperature and humidity")
    t_step, rh_step = QDoubleSpinBox(), QDoubleSpinBox()
    t_step.setRange(0.1, 10.0)
    t_step.setValue(BIN_T_STEP_K)
    t_step.setSuffix(" K")
    rh_step.setRange(1.0, 50.0)
    rh_step.setValue(100.0 * BIN_RH_STEP)
    rh_step.setSuffix(" %")
    form.addRow(bin_check)
    form.addRow("Temperature bin width", t_step)
    form.addRow("Humidity bin width", rh_step)
    lay.addLayout(form)
    note = QLabel(BINNING_NOTE)
    note.setWordWrap(True)
    note.setObjectName("footNote")
    lay.addWidget(note)
    buttons = QDialogButtonBox(QDialogButtonBox.Ok | QDialogButtonBox.Cancel)
    buttons.accepted.connect(dlg.accept)
    buttons.rejected.connect(dlg.reject)
    lay.addWidget(buttons)
    if dlg.exec() != QDialog.Accepted:
        return None
    units = {"temperature": _T_UNITS[t_box.currentIndex()][1], "fraction": _H_UNITS[h_box.currentIndex()][1]}
    steps = (t_step.value(), rh_step.value() / 100.0) if bin_check.isChecked() else None
    return path, units, steps
