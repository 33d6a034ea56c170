"""Common plumbing of the input panels: bound fields, refresh on change, focus by path."""
from __future__ import annotations

__all__ = ["FieldPanel", "section_title"]

from PySide6.QtCore import QTimer
from PySide6.QtWidgets import QFormLayout, QLabel, QWidget

from stagewright.gui.document.paths import is_related


def section_title(text: str) -> QLabel:
    label = QLabel(text)
    label.setObjectName("sectionTitle")
    return label


class FieldPanel(QWidget):
    """A panel whose fields are views of document paths.

    Subclasses add fields with :meth:`bind`; the panel refreshes a field when a related
    path changes, re-marks all fields when problems change, refreshes everything when the
    unit system changes, and can bring a field into view for the messages area.
    """

    def form_layout(self, margins: tuple[int, int, int, int]) -> tuple:
        """The panel's vertical layout with one growing form in it: ``(layout, form)``."""
        from PySide6.QtWidgets import QFormLayout, QVBoxLayout
        lay = QVBoxLayout(self)
        lay.setContentsMargins(*margins)
        form = QFormLayout()
        form.setFieldGrowthPolicy(QFormLayout.AllNonFixedFieldsGrow)
        self.form = form
        lay.addLayout(form)
        return lay, form

    def __init__(self, editor, parent=None):
        super().__init__(parent)
        self.editor = editor
        self.fields: list = []
        editor.model.changed.connect(self._on_model_changed)
        editor.prefs.changed.connect(self.refresh_all)
        editor.problems_changed.connect(self.update_marks)
        self.destroyed.connect(lambda *_: self._disconnect())

    def _disconnect(self) -> None:
        try:
            self.editor.model.changed.disconnect(self._on_model_changed)
            self.editor.prefs.changed.disconnect(self.refresh_all)
        except RuntimeError:
            pass

    def bind(self, field):
        self.fields.append(field)
        return field

    def add_row(self, form: QFormLayout, label: str, field, tip: str = ""):
        """Add ``field`` to ``form`` with a label and a tooltip, and bind it."""
        lab = QLabel(label)
        if tip:
            lab.setToolTip(tip)
            field.setToolTip(tip) if not hasattr(field, "edit") else field.edit.setToolTip(tip)
        form.addRow(lab, field)
        return self.bind(field)

    # ---- updates -------------------------------------------------------------------------
    def _on_model_changed(self, path: str) -> None:
        if path == "" or any(is_related(path, f.path) for f in self.fields) or self.depends_on(path):
            self.refresh_all()

    def depends_on(self, path: str) -> bool:
        """Extra paths whose change should refresh this panel (e.g. site pressure for gauge)."""
        return is_related(path, "site")

    def refresh_all(self) -> None:
        self.before_refresh()
        for f in self.fields:
            f.refresh()
        self.after_refresh()

    def before_refresh(self) -> None:
        """Hook: adjust paths or visibility before fields refresh."""

    def after_refresh(self) -> None:
        """Hook: e.g. show or hide rows that depend on a choice."""

    def update_marks(self) -> None:
        for f in self.fields:
            f.update_mark()

    def focus_field(self, path: str) -> bool:
        """Give keyboard focus to the field bound to ``path``; False if this panel has none."""
        field = self.field_for(path)
        if field is None:
            return False
        field.setFocus()
        QTimer.singleShot(0, field.setFocus)  # again once a raised dock is shown
        return True

    def field_for(self, path: str):
        """The visible-if-possible field bound to ``path`` (or the first one inside it)."""
        exact = [f for f in self.fields if f.path == path]
        inside = [f for f in self.fields if f.path.startswith(path) and is_related(path, f.path)]
        for group in (exact, inside):
            shown = [f for f in group if not f.isHidden()]
            if shown or group:
                return (shown or group)[0]
        return None
