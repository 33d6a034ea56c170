"""The field-check panel's Measured inputs tab: each input's uncertainty, and a row to state one.

The row names a measured input of the project, how its uncertainty is stated (a standard
uncertainty, limits, or an accuracy class of the reading or of the full scale) and the amount
in display units; *Set* writes the entry into the project's ``field_check`` section as one
undo step (replacing the input's earlier entry), *Remove* takes that input's entry out.
"""
from __future__ import annotations

__all__ = ["InputsEditor"]

from PySide6.QtWidgets import (QComboBox, QHBoxLayout, QLabel, QLineEdit, QPushButton, QTableWidget, QVBoxLayout,
                               QWidget)

from stagewright.gui.field_check.edits import KINDS, uncertainty_entry, with_uncertainty, without_uncertainty
from stagewright.gui.presentation.uncertainty_table import difference_quantity
from stagewright.gui.presentation.units import to_si, unit


class InputsEditor(QWidget):
    """``table`` (the inputs with their u, filled by the panel) above the row that edits them."""

    def __init__(self, editor, table: QTableWidget, parent=None):
        super().__init__(parent)
        self.editor = editor
        self.table = table
        lay = QVBoxLayout(self)
        lay.setContentsMargins(0, 0, 0, 0)
        lay.addWidget(table, 1)
        row = QHBoxLayout()
        self.input_box = QComboBox()
        self.kind_box = QComboBox()
        self.kind_box.addItems(list(KINDS))
        self.amount = QLineEdit()
        self.amount.setPlaceholderText("amount")
        self.unit_label = QLabel()
        self.scale = QLineEdit()
        self.scale.setPlaceholderText("full scale")
        self.set_button = QPushButton("Set")
        self.remove_button = QPushButton("Remove")
        self.message = QLabel()
        for w in (self.input_box, self.kind_box, self.amount, self.unit_label, self.scale, self.set_button,
                  self.remove_button):
            row.addWidget(w)
        row.addWidget(self.message, 1)
        lay.addLayout(row)
        self.paths: list[str] = []
        self.input_box.currentIndexChanged.connect(self._update_units)
        self.kind_box.currentIndexChanged.connect(self._update_units)
        editor.prefs.changed.connect(self._update_units)
        self.set_button.clicked.connect(self.apply)
        self.remove_button.clicked.connect(self.remove)
        self.refresh()

    def _norm(self) -> dict:
        return self.editor.model.normalised()  # defaults filled in (mechanical efficiency …), even with problems

    def refresh(self) -> None:
        """The measurable inputs of the project as it is now."""
        from stagewright.core.uncertainty.inputs import describe_input, measurable_paths
        norm = self._norm()
        current = self.input_box.currentData()
        self.paths = measurable_paths(norm)
        self.input_box.blockSignals(True)
        self.input_box.clear()
        for p in self.paths:
            label = describe_input(norm, p)[0]
            self.input_box.addItem(label[:1].upper() + label[1:], p)
        if current in self.paths:
            self.input_box.setCurrentIndex(self.paths.index(current))
        self.input_box.blockSignals(False)
        self._update_units()

    def _quantity(self) -> str | None:
        from stagewright.core.uncertainty.inputs import describe_input
        path = self.input_box.currentData()
        found = describe_input(self.editor.model.snapshot(), path) if path else None
        return found[1] if found else None

    def _update_units(self, *_args) -> None:
        q = self._quantity()
        offered = self.kind_box.currentText()
        of_class = KINDS[offered][0] == "accuracy_class"
        symbol = unit(difference_quantity(q), self.editor.prefs.system).symbol if q else ""
        self.unit_label.setText("%" if of_class else symbol)
        self.scale.setVisible(KINDS[offered][1])
        self.scale.setToolTip(f"Full scale (span) of the instrument [{symbol}]")

    def apply(self) -> bool:
        """Write the row's uncertainty into the project (one undo step); False if the row is not a number."""
        path, q = self.input_box.currentData(), self._quantity()
        offered = self.kind_box.currentText()
        kind, of_scale = KINDS[offered]
        system = self.editor.prefs.system
        try:
            amount = float(self.amount.text().replace(",", "."))
            scale = to_si(float(self.scale.text().replace(",", ".")), difference_quantity(q), system) \
                if of_scale else None
        except ValueError:
            self.message.setText("Type the amount (and the full scale) as numbers.")
            return False
        if kind != "accuracy_class":
            amount = to_si(amount, difference_quantity(q), system)
        section = with_uncertainty(self.editor.model.get("field_check", None), uncertainty_entry(path, offered, amount, scale))
        self.message.setText("")
        return self.editor.set_value("field_check", section, f"Uncertainty of {self.input_box.currentText().lower()}")

    def remove(self) -> bool:
        """Take the uncertainty of the input named in the row out of the project (one undo step)."""
        path = self.input_box.currentData()
        section = self.editor.model.get("field_check", None)
        entries = section.get("uncertainties", []) if isinstance(section, dict) else []
        if not any(e.get("input") == path for e in entries):
            self.message.setText("This input has no uncertainty to remove.")
            return False
        self.message.setText("")
        return self.editor.set_value("field_check", without_uncertainty(section, path),
                                     f"Remove the uncertainty of {self.input_box.currentText().lower()}")
