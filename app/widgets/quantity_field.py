"""An entry field bound to one document path, typed in the display unit of its quantity.

The field shows the SI value of the document converted with :mod:`stagewright.gui.presentation.units`, writes back
only when the user changed the text, and never clamps: text that is not a number is kept,
marked and reported through :meth:`Editor.set_entry_error`; a number out of range goes into
the document, where :func:`stagewright.core.project.validation.problems` reports it with the schema's range.
"""
from __future__ import annotations

__all__ = ["QuantityField", "parse_number", "format_entry", "format_shown", "SHOWN_DIGITS"]

import math

from PySide6.QtCore import QEvent, QLocale, Qt, Signal
from PySide6.QtWidgets import QHBoxLayout, QLabel, QLineEdit, QWidget

from stagewright.gui.widgets.plain_text import plain_tip
from stagewright.gui.presentation import units
from stagewright.gui.document.paths import ABSENT
from stagewright.gui.document.field_specs import quantity_for, spec_for
from stagewright.gui.widgets.signals_blocked import signals_blocked
from stagewright.gui.widgets.undo_keys import route_undo_keys

ENTRY_DIGITS = 12  # significant digits kept from what was typed (far beyond any entry)
SHOWN_DIGITS = 4  # significant digits shown while a field is not being edited (common practice, no source)


def parse_number(text: str, decimal_point: str = ".") -> float | None:
    """Read a typed number; spaces as thousands separators are allowed. None if unreadable.

    Where the system locale writes a decimal comma (``decimal_point=","``), a comma is read
    as the decimal mark and points as thousands separators; a number with a point and no
    comma is read as typed (a decimal point), since engineers type both.

    >>> parse_number(" 1 234.5 "), parse_number("8,5"), parse_number("abc"), parse_number("1e3")
    (1234.5, None, None, 1000.0)
    >>> parse_number("8,5", ","), parse_number("1.234,5", ","), parse_number("8.5", ",")
    (8.5, 1234.5, 8.5)
    """
    cleaned = text.strip().replace(" ", "").replace("\u202f", "").replace("\u00a0", "")
    if decimal_point == "," and "," in cleaned:
        cleaned = cleaned.replace(".", "").replace(",", ".")
    try:
        value = float(cleaned)
    except ValueError:
        return None
    return value if math.isfinite(value) else None


def format_entry(shown: float, decimals: int) -> str:
    """Text for an entry field: the unit's decimals plus two, trailing zeros removed.

    >>> format_entry(25.0, 2), format_entry(8.490091, 4), format_entry(-0.5, 1)
    ('25', '8.490091', '-0.5')
    """
    text = f"{shown:.{decimals + 2}f}"
    if "." in text:
        text = text.rstrip("0").rstrip(".")
    return "0" if text in ("-0", "") else text


def format_shown(shown: float, digits: int = SHOWN_DIGITS) -> str:
    """Rounded text for a field not being edited: ``digits`` significant digits (the integer
    part is never rounded), trailing zeros removed. Full precision is shown on focus and in
    the tooltip; the document keeps it whatever is shown.

    >>> format_shown(10.015251), format_shown(8.500083), format_shown(123.2833), format_shown(5118.21)
    ('10.02', '8.5', '123.3', '5118')
    >>> format_shown(0.0123456), format_shown(-0.5), format_shown(0.0), format_shown(123456.7)
    ('0.01235', '-0.5', '0', '123457')
    """
    if shown == 0.0:
        return "0"
    integer_digits = math.floor(math.log10(abs(shown))) + 1
    text = f"{shown:.{max(0, digits - integer_digits)}f}"
    if "." in text:
        text = text.rstrip("0").rstrip(".")
    return "0" if text in ("-0", "") else text


class QuantityField(QWidget):
    """``[ 82        ] %`` — a line edit and its unit, bound to ``path`` in the editor's document.

    Parameters
    ----------
    editor : Editor
    path : str
        Document path; change it with :meth:`set_path` (stage forms rebind on selection).
    nullable : bool
        An empty field clears the value (the placeholder says what that means).
    """

    committed = Signal(str)  #: path, after an accepted edit

    def __init__(self, editor, path: str = "", nullable: bool = False, placeholder: str = "",
                 parent=None):
        super().__init__(parent)
        self.editor = editor
        self.path = path
        self.nullable = nullable
        self._shown_text = None  # what _show put in the field last (None: nothing yet)
        self.edit = QLineEdit(self)
        self.edit.setAlignment(Qt.AlignRight | Qt.AlignVCenter)
        self.edit.setPlaceholderText(placeholder)
        self.edit.setMinimumWidth(72)
        self.unit_label = QLabel(self)
        self.unit_label.setMinimumWidth(40)
        self.unit_label.setObjectName("unitLabel")
        lay = QHBoxLayout(self)
        lay.setContentsMargins(0, 0, 0, 0)
        lay.setSpacing(6)
        lay.addWidget(self.edit, 1)
        lay.addWidget(self.unit_label, 0)
        self.edit.editingFinished.connect(self.commit)
        self.edit.installEventFilter(self)  # full precision while focused, rounded otherwise
        route_undo_keys(self.edit)
        self._full_text = self._rounded_text = ""
        self.setFocusProxy(self.edit)

    # ---- display -------------------------------------------------------------------------
    def _unit(self) -> units.Unit:
        doc = self.editor.model.doc
        quantity = quantity_for(self.path, doc) or "ratio"
        prefs = self.editor.prefs
        if quantity == "pressure":
            spec = spec_for(self.path)
            gauge = prefs.gauge and bool(spec and spec.gauge_aware)
            return units.unit(quantity, prefs.system, gauge=gauge, barometric_Pa=self.editor.barometric_Pa())
        return units.unit(quantity, prefs.system)

    def set_path(self, path: str) -> None:
        self.path = path
        self.refresh()

    def refresh(self) -> None:
        """Show the document's value in the current unit; drop any unread text."""
        if self.path in self.editor.entry_errors:
            self.editor.set_entry_error(self.path, None)
        u = self._unit()
        self.unit_label.setText(u.symbol)
        value = self.shown_si()
        if value is ABSENT or value is None:
            full = rounded = ""
        elif isinstance(value, (int, float)) and not isinstance(value, bool):
            full = format_entry(u.to_display(float(value)), u.decimals)
            rounded = format_shown(u.to_display(float(value)))
        else:
            full = rounded = str(value)
        want = full if self.edit.hasFocus() else rounded
        if (full, rounded, want) != (self._full_text, self._rounded_text, self._shown_text) \
                or self.edit.isModified() or self.edit.text() != want:
            self._full_text, self._rounded_text = full, rounded
            self._show(want)
            self._fit(full)
        self.update_mark()

    def _show(self, text: str) -> None:
        with signals_blocked(self.edit):
            self.edit.setText(text)
            self.edit.setModified(False)
            self.edit.setCursorPosition(0)
        self._shown_text = text

    def eventFilter(self, obj, event) -> bool:  # noqa: N802 (Qt's name)
        """Swap the rounded text for the full one while the field has focus (unless typed in)."""
        if obj is self.edit and not self.edit.isModified() and self.path not in self.editor.entry_errors:
            if event.type() == QEvent.Type.FocusIn and self._shown_text == self._rounded_text:
                self._show(self._full_text)
            elif event.type() == QEvent.Type.FocusOut and self._shown_text == self._full_text:
                self._show(self._rounded_text)
        return False

    def shown_si(self):
        """The value shown, in SI in the basis of :meth:`_unit`: the document's, else the schema default."""
        value = self.editor.model.get(self.path)
        if value is ABSENT or value is None:
            value = _normalised_default(self.editor, self.path)
        return value

    def write_si(self, si: float) -> bool:
        """Put a typed value (SI, basis of :meth:`_unit`) into the document as one undo step."""
        return self.editor.set_value(self.path, si)

    def _fit(self, text: str) -> None:
        """Widen the field so that a shown value is never cut off (leading digits matter)."""
        needed = self.edit.fontMetrics().horizontalAdvance(text + "00") + 12
        self.edit.setMinimumWidth(max(72, needed))

    def update_mark(self) -> None:
        """Mark the field red with the reason as tooltip when the editor knows a problem with it."""
        message = self.problem_message()
        invalid = message is not None
        if self.edit.property("invalid") != invalid:
            self.edit.setProperty("invalid", invalid)
            self.edit.style().unpolish(self.edit)
            self.edit.style().polish(self.edit)
        exact = f"{self._full_text} {self.unit_label.text()}".strip() if self._full_text else ""
        tip = plain_tip(message or exact)
        if tip != self.edit.toolTip():
            self.edit.setToolTip(tip)

    def problem_message(self) -> str | None:
        """The editor's problem with this field's value, or None."""
        return self.editor.problem_for(self.path)

    # ---- editing -------------------------------------------------------------------------
    def commit(self) -> None:
        """Turn the typed text into an SI value and push it as one undo step."""
        text = self.edit.text().strip()
        if not self.edit.isModified() and self.path not in self.editor.entry_errors:
            return
        self.edit.setModified(False)
        if text == self._full_text and self.path not in self.editor.entry_errors:
            return  # typed back what is stored (typing the rounded figure is a change: it says so)
        if text == "":
            if self.nullable:
                self.editor.set_entry_error(self.path, None)
                self.editor.set_value(self.path, ABSENT)
                self.refresh()
                self.committed.emit(self.path)
                return
            self.editor.set_entry_error(self.path, "a value is required here")
            self.update_mark()
            return
        shown = parse_number(text, QLocale().decimalPoint())
        if shown is None:
            self.editor.set_entry_error(
                self.path, f"'{text}' is not a number (use digits and a decimal mark, e.g. 12.5)")
            self.update_mark()
            return
        si = float(f"{self._unit().to_si(shown):.{ENTRY_DIGITS}g}")
        self.editor.set_entry_error(self.path, None)
        changed = self.write_si(si)
        if not changed:
            self.refresh()
        self.committed.emit(self.path)

    def text(self) -> str:
        return self.edit.text()


def _normalised_default(editor, path: str):
    """Schema default for a key the document leaves out (shown, not written)."""
    from stagewright.gui.document.paths import get_in
    return get_in(editor.model.normalised(), path, ABSENT)
