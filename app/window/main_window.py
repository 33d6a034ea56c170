"""The workbench window: the key figures across the top, charts in the middle, input panels,
balance sheet and messages in docks, one undo stack, a live solve, the File/Edit/Train/View/Help
menus, and a project file dropped on the window opened as File ▸ Open would."""
from __future__ import annotations

__all__ = ["MainWindow", "STATE_VERSION", "dropped_project"]

import threading
from pathlib import Path

from PySide6.QtCore import QEvent, QSettings, Qt, QTimer, Signal
from PySide6.QtGui import QAction, QKeySequence
from PySide6.QtWidgets import (QDockWidget, QFrame, QLabel, QMainWindow, QMessageBox, QScrollArea, QStyle,
                               QWidget)

import stagewright.core
from stagewright.core.coolprop_adapter import eos_reference
from stagewright.core.exchanger.coolant import warm_up as warm_up_coolants

from stagewright.gui.presentation import units
from stagewright.gui.window.safe_settings import byte_array, open_safely, text_value
from stagewright.gui.window.actions import ACTIONS, MENUS, TOOLBAR
from stagewright.gui.document.display_prefs import DisplayPrefs
from stagewright.gui.document.model import ProjectModel
from stagewright.gui.window.editor import Editor
from stagewright.gui.window.export_ops import ExportController
from stagewright.gui.window.file_ops import FileController
from stagewright.gui.window.prompts import Prompts
from stagewright.gui.window.recovery_ops import AUTOSAVE_MS, RecoveryController
from stagewright.gui.cases.panel import CasesPanel
from stagewright.gui.study.ops import StudyLink
from stagewright.gui.window.help_dialogs import CautionsDialog, about_text
from stagewright.gui.widgets.icons import icon
from stagewright.gui.panels.balance_panel import BalancePanel
from stagewright.gui.window.charts_area import ChartsPanel
from stagewright.gui.panels.duty_panel import DutyPanel
from stagewright.gui.panels.key_figures_panel import WARNINGS_KEY, KeyFiguresPanel
from stagewright.gui.panels.messages_panel import MessagesPanel
from stagewright.gui.panels.site_panel import SitePanel
from stagewright.gui.study.panel import StudyPanel
from stagewright.gui.year.panel import YearPanel
from stagewright.gui.field_check.panel import FieldCheckPanel
from stagewright.gui.package.panel import PackagePanel
from stagewright.gui.panels.train_panel import TrainPanel

STATE_VERSION = 4  #: bump when panels are added or renamed, so old saved layouts are ignored


class MainWindow(QMainWindow):
    """One project per window.

    The window lays out the panels, menus and status bar; what the commands do lives in the
    objects it owns: :attr:`files` (:class:`~stagewright.gui.window.file_ops.FileController`), :attr:`exports`
    (:class:`~stagewright.gui.window.export_ops.ExportController`), :attr:`recovery`
    (:class:`~stagewright.gui.window.recovery_ops.RecoveryController`) and :attr:`study`
    (:class:`~stagewright.gui.study.ops.StudyLink`), each given what it needs; every modal question goes
    through :attr:`prompts` (:class:`~stagewright.gui.window.prompts.Prompts`, which tests replace).

    Parameters
    ----------
    doc : dict, optional
        Project document to show (a new project when None).
    path : path-like, optional
        File the document came from.
    settings : QSettings, optional
        Where layout, unit system and recent files live (tests pass a temporary file).
    debounce_ms : int
        Delay between the last edit and the solve.
    autosave_ms : int or None
        Delay from a change to the recovery-file write (None: no autosave).

    Signals
    -------
    first_painted()
        The window has painted for the first time (its first solve starts next).
    """

    first_painted = Signal()

    def __init__(self, doc: dict | None = None, path=None, settings: QSettings | None = None,
                 debounce_ms: int = 150, restore_layout: bool = True, autosave_ms: int | None = AUTOSAVE_MS):
        super().__init__()
        self.setAcceptDrops(True)
        self.settings = open_safely(settings)  # plain values only (app/window/safe_settings.py)
        system = text_value(self.settings, "display/system", "SI")
        gauge = self.settings.value("display/gauge", True, type=bool)
        self.prefs = DisplayPrefs(system if system in units.SYSTEMS else "SI", gauge)
        self.model = ProjectModel(doc)
        self.editor = Editor(self.model, self.prefs, self, debounce_ms=debounce_ms)
        self.prompts = Prompts(self)
        self.files = FileController(self.editor, self.settings, self.prompts, self.statusBar(), path, self)
        self.files.state_changed.connect(self.update_title)
        self.model.cases_changed.connect(self.update_title)
        self.exports = ExportController(self.editor, self.files, self.prompts, self.statusBar(), self,
                                        study_rows=lambda: self.study.current_rows())
        self.setWindowIcon(icon("app"))
        self.setDockOptions(QMainWindow.AnimatedDocks | QMainWindow.AllowTabbedDocks
                            | QMainWindow.AllowNestedDocks)

        self.panels: dict[str, QWidget] = {}
        self.docks: dict[str, QDockWidget] = {}
        self.charts = ChartsPanel(self.editor)
        self.setCentralWidget(self.charts)
        self.panels["charts"] = self.charts
        self._build_actions()
        # the answer first: key figures across the whole width, above inputs and charts
        self.add_panel("figures", KeyFiguresPanel(self.editor), Qt.TopDockWidgetArea, title_bar=False)
        self.add_panel("site", SitePanel(self.editor), Qt.LeftDockWidgetArea, scroll=True)
        self.add_panel("duty", DutyPanel(self.editor), Qt.LeftDockWidgetArea, scroll=True)
        self.add_panel("train", TrainPanel(self.editor), Qt.RightDockWidgetArea)
        self.add_panel("messages", MessagesPanel(self.editor), Qt.LeftDockWidgetArea)
        self.add_panel("balance", BalancePanel(self.editor), Qt.BottomDockWidgetArea)
        self.add_panel("study", StudyPanel(self.editor), Qt.BottomDockWidgetArea, tabify_with="balance")
        self.add_panel("year", YearPanel(self.editor), Qt.BottomDockWidgetArea, tabify_with="balance")
        self.add_panel("field_check", FieldCheckPanel(self.editor), Qt.BottomDockWidgetArea, tabify_with="balance")
        self.add_panel("package", PackagePanel(self.editor), Qt.BottomDockWidgetArea, tabify_with="balance")
        self.add_panel("cases", CasesPanel(self.editor), Qt.BottomDockWidgetArea, tabify_with="balance")
        self.docks["balance"].raise_()
        # below the key figures, inputs and messages run the full height on the left; the
        # balance sheet spans the charts and the train panel, where its columns have the width
        self.setCorner(Qt.BottomLeftCorner, Qt.LeftDockWidgetArea)
        self.setCorner(Qt.BottomRightCorner, Qt.BottomDockWidgetArea)
        self.panels["train"].set_actions(self.action_map)
        self.panels["study"].set_actions(self.action_map)
        self.panels["study"].messages_changed.connect(self.panels["messages"].set_source_messages)
        self.study = StudyLink(self.panels["study"], self.statusBar(), self)
        self.panels["messages"].count_changed.connect(self._on_message_count)
        self.panels["messages"].refresh()  # its count, now that the key figures listen too
        self.panels["figures"].detail_requested.connect(self.show_key_figure)
        self._build_menus()
        self._build_status()

        # bound methods, not lambdas: Qt drops these connections when the window is deleted
        # (the undo stack still announces its last index change while it is destroyed)
        self.editor.undo_stack.cleanChanged.connect(self._on_undo_changed)
        self.editor.undo_stack.indexChanged.connect(self._on_undo_changed)
        self.editor.focus_requested.connect(self.focus_field)
        self.editor.result_changed.connect(self._update_status)
        self.editor.solve_started.connect(self._update_status)
        self.prefs.changed.connect(self._on_prefs)
        self.resize(1280, 800)
        self._default_state = None
        self._restore_layout = restore_layout
        self.update_title()
        self._on_prefs()
        self.recovery = RecoveryController(self.editor, self.files, self.prompts, self.statusBar(),
                                           autosave_ms, self)
        self.files.keep_results_changed.connect(self.action_map["file.keep_results"].setChecked)
        self.files.show_kept_results(self.model.project_snapshot())
        self.editor.snapshot_checked.connect(lambda text: self.statusBar().showMessage(text, 12000))
        # the first solve loads the property library (most of a second, holding the interpreter):
        # start it once the window has painted, so the window shows first; a window never shown
        # solves anyway after a while
        self._first_solve_started = False
        self._painted = False
        QTimer.singleShot(FIRST_SOLVE_UNSHOWN_MS, self, self._first_solve)

    def _first_solve(self) -> None:
        if not self._first_solve_started:
            self._first_solve_started = True
            if not self.editor.solved_jobs and not self.editor.solver.busy:
                self.editor.solve_now(immediate=True)

    def _on_undo_changed(self, *_args) -> None:
        self.update_title()

    def update_title(self) -> None:
        """File name and unsaved-changes mark in the title; Revert only for a modified saved file."""
        files = self.files
        names = self.model.case_names()
        case = f" — case “{self.model.active_case}”" if len(names) > 1 else ""  # which option is on screen
        self.setWindowTitle(f"{files.document_name()}[*]{case} — Stagewright")
        self.setWindowModified(files.is_modified())
        self.action_map["file.revert"].setEnabled(files.path is not None and files.is_modified())

    # ---- panels --------------------------------------------------------------------------
    def add_panel(self, pid: str, widget: QWidget, area, split_from: str | None = None,
                  orientation=Qt.Vertical, tabify_with: str | None = None,
                  scroll: bool = False, title_bar: bool = True) -> QDockWidget:
        """Put ``widget`` in a dock (object name ``panel-<id>`` for saveState) with a View toggle.

        With ``scroll`` the panel sits in a scroll area: a narrow dock scrolls instead of
        cutting fields off or forcing the window wider. Without ``title_bar`` the dock has none
        (a strip that stays where it is; View shows or hides it).
        """
        dock = QDockWidget(widget.title.replace("&", "&&"), self)
        dock.setObjectName(f"panel-{pid}")
        if scroll:
            area_widget = QScrollArea()
            area_widget.setWidgetResizable(True)
            area_widget.setFrameShape(QFrame.NoFrame)
            area_widget.setWidget(widget)
            dock.setWidget(area_widget)
        else:
            dock.setWidget(widget)
        dock.setFeatures(QDockWidget.DockWidgetMovable | QDockWidget.DockWidgetFloatable
                         | QDockWidget.DockWidgetClosable)
        if not title_bar:
            dock.setTitleBarWidget(QWidget(dock))
            dock.setFeatures(QDockWidget.DockWidgetClosable)
        if split_from:
            self.addDockWidget(area, dock)
            self.splitDockWidget(self.docks[split_from], dock, orientation)
        elif tabify_with:
            self.tabifyDockWidget(self.docks[tabify_with], dock)
        else:
            self.addDockWidget(area, dock)
        toggle = dock.toggleViewAction()
        toggle.setText(widget.title.replace("&", "&&"))
        toggle.setStatusTip(f"Show or hide the {widget.title.lower()} panel")
        self.panels[pid] = widget
        self.docks[pid] = dock
        return dock

    def focus_field(self, path: str) -> None:
        """Bring the panel that owns ``path`` to the front and focus its field."""
        order = ["train", "site", "duty"]
        for pid in order:
            panel = self.panels[pid]
            owns = panel.focus_field(path) if pid == "train" else panel.field_for(path) is not None
            if owns:
                dock = self.docks[pid]
                dock.show()
                dock.raise_()
                if pid != "train":
                    panel.focus_field(path)
                return
        self.statusBar().showMessage(f"{path}: no entry field for this item", 4000)

    # ---- actions and menus ---------------------------------------------------------------
    def _build_actions(self) -> None:
        self.action_map: dict[str, QAction] = {}
        for spec in ACTIONS:
            act = QAction(spec.text, self)
            act.setObjectName(spec.id)
            if spec.icon.startswith("std:"):
                act.setIcon(self.style().standardIcon(getattr(QStyle.StandardPixmap, spec.icon[4:])))
            elif spec.icon:
                act.setIcon(icon(spec.icon))
            if spec.shortcut:
                std = getattr(QKeySequence.StandardKey, spec.shortcut, None)
                act.setShortcut(QKeySequence(std) if std is not None else QKeySequence(spec.shortcut))
            if spec.tip:
                act.setToolTip(spec.tip)
                act.setStatusTip(spec.tip)
            act.setCheckable(spec.checkable)
            if spec.short:
                act.setIconText(spec.short)
            if spec.checkable:
                act.toggled.connect(lambda on, h=spec.handler: self._call(h, on))
            else:
                act.triggered.connect(lambda _=False, h=spec.handler: self._call(h))
            self.addAction(act)
            self.action_map[spec.id] = act
        self.undo_action = self.editor.undo_stack.createUndoAction(self, "&Undo")
        self.undo_action.setShortcut(QKeySequence.Undo)
        self.undo_action.setIcon(self.style().standardIcon(QStyle.StandardPixmap.SP_ArrowBack))
        self.redo_action = self.editor.undo_stack.createRedoAction(self, "&Redo")
        self.redo_action.setShortcut(QKeySequence.Redo)
        self.redo_action.setIcon(self.style().standardIcon(QStyle.StandardPixmap.SP_ArrowForward))

    def handler(self, name: str):
        """The method an action's ``handler`` names (``"files.save"``): on the window, one of its
        controllers (``files``, ``exports``) or a panel."""
        target, method = name.split(".", 1)
        owners = {"window": self, "files": self.files, "exports": self.exports}
        return getattr(owners[target] if target in owners else self.panels[target], method)

    def _call(self, name: str, *args) -> None:
        self.handler(name)(*args)  # looked up when triggered: panels are added after the actions

    def _special(self, key: str):
        return {"@undo": self.undo_action, "@redo": self.redo_action}.get(key)

    def _build_menus(self) -> None:
        bar = self.menuBar()
        for title, items in MENUS.items():
            menu = bar.addMenu(title)
            for key in items:
                if key == "-":
                    menu.addSeparator()
                elif key == "@recent":
                    self.files.set_recent_menu(menu.addMenu("Open &Recent"))
                elif key == "@panels":
                    for dock in self.docks.values():
                        menu.addAction(dock.toggleViewAction())
                elif self._special(key) is not None:
                    menu.addAction(self._special(key))
                else:
                    menu.addAction(self.action_map[key])
        tb = self.addToolBar("Main")
        tb.setObjectName("toolbar-main")
        tb.setMovable(False)
        for key in TOOLBAR:
            if key == "-":
                tb.addSeparator()
            else:
                tb.addAction(self._special(key) or self.action_map[key])

    def _build_status(self) -> None:
        sb = self.statusBar()
        self.status_solve = QLabel()
        self.status_residual = QLabel()
        self.status_units = QLabel()
        sb.addPermanentWidget(self.status_solve)
        sb.addPermanentWidget(self.status_residual)
        sb.addPermanentWidget(self.status_units)

    def _update_status(self) -> None:
        ed = self.editor
        if ed.solver.busy:
            self.status_solve.setText("Solving…")
        elif ed.problems or ed.entry_errors:
            n = len(ed.problems) + len(ed.entry_errors)
            self.status_solve.setText(f"Not solved: {n} input problem(s)")
        elif ed.failure is not None:
            self.status_solve.setText("Solve failed (see Messages)")
        elif ed.solve_seconds is not None:
            text = f"Solved in {ed.solve_seconds * 1000:.0f} ms"
            if ed.library_load_seconds:
                text += f" ({ed.library_load_seconds * 1000:.0f} ms of it loading the property library, once)"
            self.status_solve.setText(text)
        r = ed.result
        if ed.solver.busy and r is not None:
            return  # keep the last closure figures until the new answer arrives
        if r is not None and not ed.stale:
            self.status_residual.setText(f"Closure: energy {r['energy_residual']:.1e} · "
                                         f"exergy {r['exergy_residual']:.1e}")
        elif r is not None:
            self.status_residual.setText("Results out of date")
        else:
            self.status_residual.setText("")

    def _on_message_count(self, n: int) -> None:
        self.docks["messages"].setWindowTitle(f"Messages ({n})" if n else "Messages")
        self.docks["messages"].toggleViewAction().setText("Messages")
        messages = self.panels["messages"]
        self.panels["figures"].set_messages(messages.texts("problem"), messages.texts("warning"))

    def show_key_figure(self, key: str) -> None:
        """The detail of a key figure: its balance-sheet row, or the messages for the warnings."""
        pid = "messages" if key == WARNINGS_KEY else "balance"
        self.docks[pid].show()
        self.docks[pid].raise_()
        if pid == "messages":
            self.panels["messages"].list.setFocus()
            return
        detail = self.panels["figures"].detail(key)
        if detail is None or not self.panels["balance"].show_row(*detail):
            self.statusBar().showMessage("The balance sheet has no row for this figure", 4000)

    # ---- a project file dropped on the window -------------------------------------------
    def dragEnterEvent(self, event) -> None:
        if dropped_project(event.mimeData()) is not None:
            event.acceptProposedAction()
        else:
            super().dragEnterEvent(event)

    def dragMoveEvent(self, event) -> None:
        if dropped_project(event.mimeData()) is not None:
            event.acceptProposedAction()
        else:
            super().dragMoveEvent(event)

    def dropEvent(self, event) -> None:
        name = dropped_project(event.mimeData())
        if name is None:
            super().dropEvent(event)
            return
        event.acceptProposedAction()
        # after the drop returns: the unsaved-changes question must not block the drag source
        QTimer.singleShot(0, lambda: self.files.open_path(name))

    # ---- view ----------------------------------------------------------------------------
    def _on_prefs(self) -> None:
        p = self.prefs
        for key, on in (("view.us_units", p.system == "US"), ("view.gauge", p.gauge)):
            act = self.action_map[key]
            if act.isChecked() != on:
                act.blockSignals(True)
                act.setChecked(on)
                act.blockSignals(False)
        self.status_units.setText(f"{'US customary' if p.system == 'US' else 'SI'} · "
                                  f"{'gauge' if p.gauge else 'absolute'} pressure")

    def set_us_units(self, on: bool) -> None:
        self.prefs.system = "US" if on else "SI"

    def set_gauge(self, on: bool) -> None:
        self.prefs.gauge = on

    def solve_now(self) -> None:
        self.editor.solve_now(immediate=True)

    def default_layout(self) -> None:
        """Initial dock sizes for the window size (also used by Reset panel layout)."""
        w, h = self.width(), self.height()
        bar = self.style().pixelMetric(QStyle.PM_ScrollBarExtent) + 6
        # wide enough that no form needs its horizontal scroll bar, when the window allows
        need_left = max(self.panels[p].minimumSizeHint().width() for p in ("site", "duty")) + bar
        need_right = self.panels["train"].minimumSizeHint().width() + 4
        left = max(need_left, min(360, int(w * 0.22)))
        right = max(need_right, min(400, int(w * 0.235)))
        if w - left - right < 480:  # a small window: share the shortfall, the forms scroll
            short = 480 - (w - left - right)
            left, right = max(220, left - short // 2), max(240, right - short // 2)
        self.resizeDocks([self.docks["site"], self.docks["train"]], [left, right], Qt.Horizontal)
        self.resizeDocks([self.docks["balance"]], [max(260, min(420, int(h * 0.42)))], Qt.Vertical)
        # the input forms as tall as their fields (no scroll bar when the height allows), the
        # messages below them take what is left
        column = sum(self.docks[p].height() for p in ("site", "duty", "messages")) or int(h * 0.8)
        title = self.docks["site"].height() - self.docks["site"].widget().height() if column else 26
        site, duty = (self.panels[p].sizeHint().height() + title + 4 for p in ("site", "duty"))
        messages = max(int(column * 0.22), column - site - duty)
        self.resizeDocks([self.docks["site"], self.docks["duty"], self.docks["messages"]],
                         [site, duty, messages], Qt.Vertical)

    def reset_layout(self) -> None:
        if self._default_state is not None:
            self.restoreState(self._default_state, STATE_VERSION)
        for dock in self.docks.values():
            dock.show()
        self.default_layout()

    def event(self, event) -> bool:  # noqa: N802 (Qt's name)
        """After the window's first paint: say so (``first_painted``) and start the first solve."""
        handled = super().event(event)
        if not getattr(self, "_painted", True) and event.type() == QEvent.Type.UpdateRequest:
            self._painted = True
            self.first_painted.emit()
            QTimer.singleShot(0, self, self._first_solve)
        return handled

    def showEvent(self, event) -> None:
        super().showEvent(event)
        if not self._first_solve_started:  # in case no paint comes (the paint below starts it first)
            QTimer.singleShot(FIRST_SOLVE_AFTER_SHOW_MS, self, self._first_solve)
        if self._default_state is None:
            self.default_layout()
            self._default_state = self.saveState(STATE_VERSION)
            if self._restore_layout:
                QTimer.singleShot(0, self._restore_saved_layout)
            # matplotlib (slow to import) only after the first paint and the first answer, so
            # the balance sheet is filled first (and on another thread); a timer in case that
            # answer takes long
            self.editor.result_changed.connect(self._load_charts_soon)
            QTimer.singleShot(1500, self.charts.ensure_canvases)

    def _load_charts_soon(self) -> None:
        if self.editor.solved_jobs or self.editor.failure or not self.editor.solver.busy:
            self.editor.result_changed.disconnect(self._load_charts_soon)
            QTimer.singleShot(10, self.charts.ensure_canvases)  # matplotlib loads on another thread
            # the first solve with a coolant would wait for scipy and the coolant tables: load them
            # on another thread once the charts are up (not competing with their import for the GIL)
            QTimer.singleShot(WARM_UP_DELAY_MS, self, self._start_warm_up)

    def _start_warm_up(self) -> None:
        threading.Thread(target=warm_up_coolants, name="stagewright-warm-up", daemon=True).start()

    def _restore_saved_layout(self) -> None:
        geometry = byte_array(self.settings, "window/geometry")
        state = byte_array(self.settings, "window/state")
        if geometry is not None:
            self.restoreGeometry(geometry)
        if state is not None:
            self.restoreState(state, STATE_VERSION)

    # ---- help ----------------------------------------------------------------------------
    def show_cautions(self) -> None:
        CautionsDialog(self).exec()

    def show_about(self) -> None:
        QMessageBox.about(self, "About Stagewright", about_text(stagewright.core.__version__, eos_reference("real_gas")))

    # ---- closing -------------------------------------------------------------------------
    def closeEvent(self, event) -> None:
        if not self.files.maybe_save():
            event.ignore()
            return
        self.exports.wait()
        self.panels["study"].shutdown()
        self.panels["year"].runner.shutdown()
        self.panels["field_check"].shutdown()
        self.panels["package"].shutdown()
        self.panels["cases"].shutdown()
        self.recovery.shutdown()  # a clean exit: the work is saved or was let go
        self.editor.shutdown()
        self.settings.setValue("window/geometry", self.saveGeometry())
        self.settings.setValue("window/state", self.saveState(STATE_VERSION))
        self.settings.setValue("display/system", self.prefs.system)
        self.settings.setValue("display/gauge", self.prefs.gauge)
        self.settings.sync()
        event.accept()


FIRST_SOLVE_AFTER_SHOW_MS = 250  #: the first solve starts after the window's first paint, at the latest this long after it shows
FIRST_SOLVE_UNSHOWN_MS = 400  #: … or this long after the window was made, if it is not shown
WARM_UP_DELAY_MS = 2000  #: after the first answer: the coolant back ends load on a background thread


def dropped_project(mime) -> str | None:
    """The project file a drag carries: exactly one local file named ``*.json`` (else None)."""
    if mime is None or not mime.hasUrls():
        return None
    urls = mime.urls()
    if len(urls) != 1 or not urls[0].isLocalFile():
        return None
    name = urls[0].toLocalFile()
    return name if Path(name).suffix.lower() == ".json" and Path(name).is_file() else None
