"""Train panel: the ordered stages and their coolers, tools to edit the list, and a form
for the selected stage or cooler."""
from __future__ import annotations

__all__ = ["TrainPanel"]

import copy

from PySide6.QtCore import QItemSelectionModel, QSize, Qt, Signal
from PySide6.QtWidgets import (QFrame, QListWidget, QListWidgetItem, QScrollArea, QStackedWidget,
                               QToolButton, QHBoxLayout, QVBoxLayout, QWidget, QSizePolicy)

from stagewright.core.project.schema import PROJECT

from stagewright.gui.presentation import units
from stagewright.gui.document.paths import ABSENT, stage_index, stage_path
from stagewright.gui.widgets.icons import icon
from stagewright.gui.panels.cooler_form import CoolerForm, default_cooler
from stagewright.gui.panels.stage_form import StageForm

_STAGES = PROJECT.fields["stages"]  # min_length / max_length come from the schema
ROLE = Qt.UserRole


class TrainPanel(QWidget):
    """List of ``Stage n`` rows, each followed by its cooler row when it has one."""

    selection_changed = Signal()
    title = "Train"

    def __init__(self, editor, parent=None):
        super().__init__(parent)
        self.editor = editor
        self.action_map: dict = {}
        lay = QVBoxLayout(self)
        lay.setContentsMargins(8, 6, 8, 6)
        lay.setSpacing(6)
        self.list = QListWidget()
        self.list.setObjectName("trainList")
        self.list.setIconSize(QSize(18, 18))
        self.list.setMinimumHeight(110)
        self.list.setSizePolicy(QSizePolicy.Preferred, QSizePolicy.Preferred)
        self.list.currentRowChanged.connect(self._on_row)
        lay.addWidget(self.list, 0)
        self.tools = QHBoxLayout()
        self.tools.setSpacing(2)
        lay.addLayout(self.tools)
        line = QFrame()
        line.setFrameShape(QFrame.HLine)
        line.setObjectName("rule")
        lay.addWidget(line)
        self.stage_form = StageForm(editor)
        self.cooler_form = CoolerForm(editor)
        self.forms = QStackedWidget()
        self.forms.addWidget(self.stage_form)
        self.forms.addWidget(self.cooler_form)
        scroll = QScrollArea()
        scroll.setWidgetResizable(True)
        scroll.setFrameShape(QFrame.NoFrame)
        scroll.setWidget(self.forms)
        # a narrow panel scrolls sideways rather than cutting a field off
        self.scroll = scroll
        lay.addWidget(scroll, 1)
        editor.model.changed.connect(self._on_model_changed)
        editor.model.structure_changed.connect(self._on_structure)
        editor.prefs.changed.connect(self._rebuild)
        self._selected = ("stage", 0)
        self._rebuild()

    # ---- toolbar -------------------------------------------------------------------------
    def set_actions(self, actions: dict) -> None:
        """Put the window's stage actions (declared in app/window/actions.py) on the panel toolbar."""
        self.action_map = actions
        for key in ("train.add_stage", "train.insert_stage", "train.duplicate_stage", "train.remove_stage",
                    "train.move_up", "train.move_down", "train.toggle_cooler"):
            if key in actions:
                b = QToolButton()
                b.setDefaultAction(actions[key])
                b.setAutoRaise(True)
                b.setIconSize(QSize(20, 20))
                self.tools.addWidget(b)
        self.tools.addStretch(1)
        self._update_actions()

    def _update_actions(self) -> None:
        n = self.editor.model.stage_count
        i = self.selected_stage()
        can = {"train.add_stage": n < _STAGES.max_length, "train.insert_stage": n < _STAGES.max_length,
               "train.duplicate_stage": n < _STAGES.max_length, "train.remove_stage": n > _STAGES.min_length,
               "train.move_up": i > 0, "train.move_down": i < n - 1, "train.toggle_cooler": n > 0}
        for key, ok in can.items():
            if key in self.action_map:
                self.action_map[key].setEnabled(ok)
        if "train.toggle_cooler" in self.action_map and n:
            has = bool(self.editor.model.get(stage_path(i, "cooler"), None))
            self.action_map["train.toggle_cooler"].setText("Remove cooler" if has else "Add cooler")

    # ---- list ----------------------------------------------------------------------------
    def _row_text(self, i: int, st: dict) -> tuple[str, str]:
        name = st.get("name") or ""
        stage = f"Stage {i + 1}" + (f" · {name}" if name else "")
        cooler = st.get("cooler")
        if not cooler:
            return stage, ""
        kind = "Aftercooler" if i == self.editor.model.stage_count - 1 else f"Intercooler {i + 1}"
        system = self.editor.prefs.system
        if cooler.get("approach_K") is not None:
            spec = f"approach {units.format_value(cooler['approach_K'], 'temperature_difference', system, True)}"
        elif isinstance(cooler.get("outlet_temperature_K"), (int, float)):
            spec = f"to {units.format_value(cooler['outlet_temperature_K'], 'temperature', system, True)}"
        else:
            spec = ""
        return stage, f"{kind}" + (f" · {spec}" if spec else "")

    def _rebuild(self) -> None:
        stages = self.editor.model.get("stages", []) or []
        rows = []
        for i, st in enumerate(stages):
            st = st if isinstance(st, dict) else {}
            stage_text, cooler_text = self._row_text(i, st)
            rows.append(("stage", i, stage_text))
            if cooler_text:
                rows.append(("cooler", i, "    " + cooler_text))
        shown = [(*self.list.item(r).data(ROLE), self.list.item(r).text()) for r in range(self.list.count())]
        if rows == shown:  # an edit that leaves every row as it was (most site edits): nothing to redo
            if self.list.currentRow() != self._row_of(*self._selected):
                self.select(*self._selected)
            return
        self.list.blockSignals(True)
        self.list.clear()
        for kind, i, text in rows:
            item = QListWidgetItem(icon(kind), text)
            item.setData(ROLE, (kind, i))
            self.list.addItem(item)
        self.list.blockSignals(False)
        self._fit_list()
        self.select(*self._selected)

    def minimumSizeHint(self):
        """Room for the widest form without its scroll bars (the default layout uses this)."""
        hint = super().minimumSizeHint()
        widest = max(self.stage_form.minimumSizeHint().width(), self.cooler_form.minimumSizeHint().width())
        hint.setWidth(max(hint.width(), widest + self.scroll.verticalScrollBar().sizeHint().width() + 20))
        return hint

    def _fit_list(self) -> None:
        """As tall as its rows, but never more than 40 % of the panel (it scrolls beyond)."""
        rows = max(self.list.count(), 3)
        want = rows * max(self.list.sizeHintForRow(0), 16) + 2 * self.list.frameWidth() + 4
        cap = max(110, int(self.height() * 0.4)) if self.height() > 200 else want
        self.list.setFixedHeight(min(want, cap))

    def resizeEvent(self, event) -> None:
        super().resizeEvent(event)
        self._fit_list()

    def select(self, kind: str, index: int) -> None:
        """Select the stage or cooler row of stage ``index`` (falls back to the stage row)."""
        n = self.editor.model.stage_count
        index = max(0, min(index, n - 1))
        row = self._row_of(kind, index)
        if row < 0:
            kind, row = "stage", self._row_of("stage", index)
        self._selected = (kind, index)
        self.list.setCurrentRow(row, QItemSelectionModel.ClearAndSelect)
        self._show_form()

    def _row_of(self, kind: str, index: int) -> int:
        for r in range(self.list.count()):
            if self.list.item(r).data(ROLE) == (kind, index):
                return r
        return -1

    def _on_row(self, row: int) -> None:
        if row < 0:
            return
        self._selected = tuple(self.list.item(row).data(ROLE))
        self._show_form()

    def _show_form(self) -> None:
        kind, i = self._selected
        if kind == "cooler":
            self.cooler_form.set_stage(i)
            self.forms.setCurrentWidget(self.cooler_form)
        else:
            self.stage_form.set_stage(i)
            self.forms.setCurrentWidget(self.stage_form)
        self._update_actions()
        self.selection_changed.emit()

    def selected_stage(self) -> int:
        return self._selected[1]

    def selected_kind(self) -> str:
        return self._selected[0]

    # ---- model notifications --------------------------------------------------------------
    def _on_model_changed(self, path: str) -> None:
        if path == "" or path.startswith("stages") or path.startswith("site"):
            self._rebuild()

    def _on_structure(self, kind: str, index: int, new_index: int) -> None:
        if kind == "reset":
            self._selected = ("stage", 0)
        elif kind in ("insert", "move"):
            self._selected = ("stage", new_index)
        else:
            self._selected = ("stage", max(0, new_index))

    # ---- actions (bound in app/window/actions.py) -------------------------------------------------
    def _new_stage_from(self, i: int, name: str) -> dict:
        st = copy.deepcopy(self.editor.model.get(stage_path(i), {}) or {})
        st["name"] = name
        st.pop("pressure_ratio", None)
        return st

    def add_stage(self) -> None:
        n = self.editor.model.stage_count
        self.editor.insert_stage(n, self._new_stage_from(n - 1, f"Stage {n + 1}"), f"Add stage {n + 1}")

    def insert_stage(self) -> None:
        i = self.selected_stage()
        self.editor.insert_stage(i, self._new_stage_from(i, f"Stage {i + 1}"),
                                 f"Insert stage before stage {i + 1}")

    def duplicate_stage(self) -> None:
        i = self.selected_stage()
        st = copy.deepcopy(self.editor.model.get(stage_path(i), {}) or {})
        if st.get("name"):
            st["name"] = f"{st['name']} (copy)"
        self.editor.insert_stage(i + 1, st, f"Duplicate stage {i + 1}")

    def remove_stage(self) -> None:
        if self.editor.model.stage_count > _STAGES.min_length:
            self.editor.remove_stage(self.selected_stage())

    def move_up(self) -> None:
        i = self.selected_stage()
        if i > 0:
            self.editor.move_stage(i, i - 1)

    def move_down(self) -> None:
        i = self.selected_stage()
        if i < self.editor.model.stage_count - 1:
            self.editor.move_stage(i, i + 1)

    def toggle_cooler(self) -> None:
        i = self.selected_stage()
        path = stage_path(i, "cooler")
        last = i == self.editor.model.stage_count - 1
        name = "aftercooler" if last else f"intercooler {i + 1}"
        if self.editor.model.get(path, None):
            self._selected = ("stage", i)
            self.editor.set_value(path, ABSENT, f"Remove {name}")
        else:
            ambient = self.editor.model.get("site.ambient_temperature_K", 293.15)
            self._selected = ("cooler", i)
            self.editor.set_value(path, default_cooler(ambient), f"Add {name}")

    # ---- messages area: show a field -----------------------------------------------------
    def focus_field(self, path: str) -> bool:
        i = stage_index(path)
        if i is None:
            if path == "stages":
                self.list.setFocus()
                return True
            return False
        kind = "cooler" if ".cooler" in path else "stage"
        self.select(kind, i)
        form = self.cooler_form if kind == "cooler" else self.stage_form
        if not form.focus_field(path):
            self.list.setFocus()
        return True
