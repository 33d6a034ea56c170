"""Messages area: input problems, unreadable entries, a failed solve, result warnings and the
safety cautions they touch. Clicking a message shows the field it is about."""
from __future__ import annotations

__all__ = ["MessagesPanel", "Message"]

from dataclasses import dataclass

from PySide6.QtCore import QSize, Qt, Signal
from PySide6.QtGui import QColor, QIcon, QPainter, QPixmap
from PySide6.QtWidgets import QLabel, QListWidget, QListWidgetItem, QVBoxLayout, QWidget

from stagewright.gui.widgets.plain_text import plain_tip
from stagewright.gui.presentation.cautions import CAUTIONS
from stagewright.gui.document.messages import error_text, problem_text, warning_text
from stagewright.gui.document.field_specs import describe

_CAUTION = dict(CAUTIONS)
_SEVERITY_COLOUR = {"problem": "#c0392b", "warning": "#d98e04", "caution": "#7b5ea7", "ok": "#2e8b57",
                    "note": "#5b6b7a"}


@dataclass(frozen=True)
class Message:
    severity: str  #: problem | warning | caution | ok | note
    text: str
    field: str = ""


def _dot(colour: str) -> QIcon:
    pm = QPixmap(14, 14)
    pm.fill(Qt.transparent)
    p = QPainter(pm)
    p.setRenderHint(QPainter.Antialiasing)
    p.setBrush(QColor(colour))
    p.setPen(Qt.NoPen)
    p.drawEllipse(2, 2, 10, 10)
    p.end()
    return QIcon(pm)


class MessagesPanel(QWidget):
    """A list of :class:`Message`; ``count_changed(n)`` reports problems + warnings."""

    title = "Messages"
    count_changed = Signal(int)

    def __init__(self, editor, parent=None):
        super().__init__(parent)
        self.editor = editor
        lay = QVBoxLayout(self)
        lay.setContentsMargins(6, 4, 6, 4)
        self.list = QListWidget()
        self.list.setWordWrap(True)
        self.list.setIconSize(QSize(14, 14))
        self.list.setObjectName("messagesList")
        self.list.itemClicked.connect(self._clicked)
        self.list.itemActivated.connect(self._clicked)
        lay.addWidget(self.list, 1)
        foot = QLabel("Results are a calculation aid; designs must follow local codes. "
                      "See Help ▸ Safety cautions.")
        foot.setObjectName("footNote")
        foot.setWordWrap(True)
        lay.addWidget(foot)
        self._icons = {k: _dot(c) for k, c in _SEVERITY_COLOUR.items()}
        self.messages: list[Message] = []
        self.sources: dict[str, list[Message]] = {}  # messages other panels publish (e.g. the study)
        editor.problems_changed.connect(self.refresh)
        editor.result_changed.connect(self.refresh)
        editor.prefs.changed.connect(self.refresh)
        self.refresh()

    # ---- building the list ---------------------------------------------------------------
    def collect(self) -> list[Message]:
        ed = self.editor
        doc = ed.model.doc
        system, gauge, p0 = ed.prefs.system, ed.prefs.gauge, ed.barometric_Pa()
        out = [Message("problem", f"{describe(path, doc)}: {text}", path) for path, text in ed.entry_errors.items()]
        out += [Message("problem", problem_text(p, doc, system, gauge=gauge, barometric_Pa=p0), p.field)
                for p in ed.problems]
        if ed.failure is not None and not (ed.problems or ed.entry_errors):
            message, field = ed.failure
            text = error_text(message, field, getattr(ed, "failure_detail", None), doc, system, gauge=gauge,
                              barometric_Pa=p0)
            out.append(Message("problem", f"The train could not be solved: {text}", field))
        if ed.result is not None and not ed.stale:
            cautions = []
            for w in ed.result.get("warnings", []):
                out.append(Message("warning", self._warning_text(w), w.get("field", "")))
                if w.get("field", "").endswith("max_discharge_temperature_K"):
                    cautions.append("Discharge temperature")
                if "condensate" in w.get("message", "").lower() or "dew" in w.get("message", "").lower():
                    cautions.append("Condensate disposal")
            for title in dict.fromkeys(cautions):
                out.append(Message("caution", f"Caution — {title.lower()}: {_CAUTION[title]}", ""))
            if not ed.result.get("warnings"):
                out.append(Message("ok", "Solved: no warnings.", ""))
        elif not out and ed.solver.busy:
            out.append(Message("note", "Solving…", ""))
        for extra in self.sources.values():
            out += [m for m in extra if m not in out]
        return out

    def set_source_messages(self, source: str, messages: list) -> None:
        """Show ``messages`` (a list of :class:`Message`) from another panel, replacing that
        source's earlier ones (an empty list removes them)."""
        self.sources[source] = list(messages)
        self.refresh()

    def _warning_text(self, w: dict) -> str:
        """A result warning in display units, with the field's name (stagewright.gui.document.messages)."""
        ed = self.editor
        return warning_text(w, ed.model.doc, ed.prefs.system, gauge=ed.prefs.gauge, barometric_Pa=ed.barometric_Pa())

    def refresh(self) -> None:
        self.messages = self.collect()
        self.list.clear()
        for m in self.messages:
            item = QListWidgetItem(self._icons[m.severity], m.text)
            item.setData(Qt.UserRole, m.field)
            tip = m.text + (f"\n\nClick to show: {describe(m.field, self.editor.model.doc)}" if m.field else "")
            item.setToolTip(plain_tip(tip))
            self.list.addItem(item)
        self.count_changed.emit(sum(m.severity in ("problem", "warning") for m in self.messages))

    def texts(self, severity: str | None = None) -> list[str]:
        return [m.text for m in self.messages if severity is None or m.severity == severity]

    def _clicked(self, item: QListWidgetItem) -> None:
        field = item.data(Qt.UserRole)
        if field:
            self.editor.request_focus(field)
