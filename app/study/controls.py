"""The study panel's controls: what to compare (most stages, hours, energy price, an optional site
variable and its values), the Run and Cancel buttons, progress and status, and Apply.

A narrow column that scrolls rather than cutting fields off. It reads the inputs as a
:class:`~stagewright.gui.study.job.StudyRequest`; the panel (:mod:`stagewright.gui.study.panel`) runs it.
"""
from __future__ import annotations

__all__ = ["StudyControls", "study_stage_count", "RUNNING_MAX"]

from PySide6.QtCore import QSize, Qt
from PySide6.QtWidgets import (QComboBox, QDoubleSpinBox, QFormLayout, QFrame, QHBoxLayout, QLabel, QLineEdit,
                               QProgressBar, QScrollArea, QSizePolicy, QSpinBox, QToolButton, QVBoxLayout, QWidget)

from stagewright.core.study import DEFAULT_ENERGY_PRICE, DEFAULT_OPERATING_HOURS, MAX_STAGES

from stagewright.gui.widgets.plain_text import plain_label
from stagewright.gui.presentation import units
from stagewright.gui.study.display import VARIABLES, format_values, parse_values
from stagewright.gui.study.job import StudyRequest


#: the most a running study's bar shows: 100 % only once the answer is in
RUNNING_MAX = 0.99


def study_stage_count(n_stages: int) -> int:
    """Most stages to compare: two more than the project has, at least 4, at most the study's limit."""
    return max(1, min(MAX_STAGES, max(4, n_stages + 2)))


def repolish(w: QWidget) -> None:
    """Apply the style sheet again after a dynamic property (``invalid``, ``stale``) changed."""
    w.style().unpolish(w)
    w.style().polish(w)


class StudyControls(QScrollArea):
    """The left column of the study panel.

    Parameters
    ----------
    model : ProjectModel
        The open project (its stage count for the default of "Up to stages", its site for
        suggested values of the site variable).
    prefs : DisplayPrefs
        Display units of the values field.
    """

    def __init__(self, model, prefs, parent=None):
        super().__init__(parent)
        self._model = model
        self._prefs = prefs
        self._values_system = prefs.system
        box = QWidget()
        col = QVBoxLayout(box)
        col.setContentsMargins(0, 0, 4, 0)
        col.setSpacing(3)
        col.addLayout(self._inputs())
        self.buttons = QHBoxLayout()  # Run and Cancel (the window's actions, see add_action_buttons)
        self.buttons.setSpacing(4)
        col.addLayout(self.buttons)
        self.progress = QProgressBar()
        self.progress.setRange(0, 1000)
        self.progress.setValue(0)
        self.progress.setTextVisible(True)
        self.progress.setFormat("%p%")
        self.progress.setMaximumHeight(16)
        self.fraction = 0.0  # the share of the study done, as last shown
        col.addWidget(self.progress)
        self.status = plain_label(QLabel("Not run yet."))
        self.status.setWordWrap(True)
        self.status.setObjectName("footNote")
        self.status.setSizePolicy(QSizePolicy.Ignored, QSizePolicy.Preferred)
        col.addWidget(self.status)
        col.addStretch(1)
        self.apply_row = QHBoxLayout()
        col.addLayout(self.apply_row)
        self._show_values_row(False)
        self.setWidget(box)
        self.setWidgetResizable(True)
        self.setFrameShape(QFrame.NoFrame)
        self.setHorizontalScrollBarPolicy(Qt.ScrollBarAlwaysOff)
        self._fit_width()
        self.setSizePolicy(QSizePolicy.Fixed, QSizePolicy.Expanding)

    def _inputs(self) -> QFormLayout:
        form = QFormLayout()
        form.setFieldGrowthPolicy(QFormLayout.AllNonFixedFieldsGrow)
        form.setVerticalSpacing(3)
        form.setHorizontalSpacing(6)
        self.max_stages = QSpinBox()
        self.max_stages.setRange(1, MAX_STAGES)
        self.max_stages.setValue(study_stage_count(self._model.stage_count))
        self.max_stages.setToolTip(f"Compare 1 to this many stages (1 … {MAX_STAGES})")
        form.addRow("Up to stages", self.max_stages)
        self.hours = QDoubleSpinBox()
        self.hours.setRange(0.0, 8784.0)
        self.hours.setDecimals(0)
        self.hours.setSingleStep(100.0)
        self.hours.setValue(DEFAULT_OPERATING_HOURS)
        self.hours.setSuffix(" h/yr")
        self.hours.setToolTip("Operating hours per year, for the yearly saving")
        form.addRow("Operation", self.hours)
        self.price = QDoubleSpinBox()
        self.price.setRange(0.0, 1000.0)
        self.price.setDecimals(3)
        self.price.setSingleStep(0.01)
        self.price.setValue(DEFAULT_ENERGY_PRICE)
        self.price.setSuffix(" /kWh")
        self.price.setToolTip("Price of the driver's input energy per kWh, in your currency "
                              "(the default is a round figure: enter your own tariff)")
        form.addRow("Energy price", self.price)
        self.variable = QComboBox()
        self.variable.addItem("nothing", None)
        for key, (name, _) in VARIABLES.items():
            self.variable.addItem(name, key)
        self.variable.setToolTip("Repeat the study over several values of one site variable "
                                 "(summer and winter operation)")
        self.variable.currentIndexChanged.connect(self._on_variable)
        form.addRow("Vary site", self.variable)
        vals = QHBoxLayout()
        vals.setSpacing(4)
        self.values = QLineEdit()
        self.values.setPlaceholderText("e.g. 5, 20, 35")
        self.values.setToolTip("Values of the site variable, separated by commas, in the unit shown")
        self.values.textEdited.connect(self._on_values_edited)
        self.values_unit = QLabel()
        self.values_unit.setObjectName("unitLabel")
        vals.addWidget(self.values, 1)
        vals.addWidget(self.values_unit)
        self.values_label = QLabel("Values")
        form.addRow(self.values_label, vals)
        for w in (self.max_stages, self.hours, self.price, self.variable):
            w.setMaximumWidth(170)
        return form

    def _fit_width(self) -> None:
        self.setFixedWidth(self.widget().sizeHint().width() + 24)

    def add_action_buttons(self, actions: dict) -> None:
        """Run and Cancel under the inputs, Apply at the foot: buttons of the window's actions."""
        for key, row in (("train.study", self.buttons), ("train.study_cancel", self.buttons),
                         ("train.study_apply", self.apply_row), ("train.study_keep_case", self.apply_row)):
            if key in actions:
                b = QToolButton()
                b.setDefaultAction(actions[key])
                b.setToolButtonStyle(Qt.ToolButtonTextBesideIcon)
                b.setIconSize(QSize(18, 18))
                b.setSizePolicy(QSizePolicy.Expanding, QSizePolicy.Fixed)
                row.addWidget(b)
        self._fit_width()

    # ---- reading -------------------------------------------------------------------------
    def request(self, doc: dict) -> StudyRequest:
        """The study the inputs ask for, of ``doc`` (a private copy of the project).

        Raises
        ------
        ValueError
            The values of the site variable do not read (the field is marked and focused).
        """
        variable = self.variable.currentData()
        values: tuple = ()
        if variable:
            try:
                values = tuple(parse_values(self.values.text(), variable, self._prefs.system))
            except ValueError:
                self.values.setProperty("invalid", True)
                repolish(self.values)
                self.values.setFocus()
                raise
        return StudyRequest(doc, self.max_stages.value(), float(self.hours.value()), float(self.price.value()),
                            variable, values)

    # ---- showing -------------------------------------------------------------------------
    def set_status(self, text: str) -> None:
        self.status.setText(text)

    def set_progress(self, fraction: float | None, *, finished: bool = False) -> None:
        """Show how much of the study is done.

        ``None``: a study started and has measured nothing yet (a busy bar). A running study's
        ``fraction`` (the share of its options optimised) stops at :data:`RUNNING_MAX`: its
        answer is still to be gathered and shown; ``finished`` (the answer is in) shows it in full.
        """
        if fraction is None:
            self.progress.setRange(0, 0)
            return
        self.fraction = fraction if finished else min(fraction, RUNNING_MAX)
        self.progress.setRange(0, 1000)
        self.progress.setValue(int(round(1000 * self.fraction)))

    def set_inputs_enabled(self, on: bool) -> None:
        """Inputs are locked while a study runs."""
        for w in (self.max_stages, self.hours, self.price, self.variable, self.values):
            w.setEnabled(on)

    def suggest_stage_count(self) -> None:
        """"Up to stages" for the open project (another document was opened)."""
        self.max_stages.setValue(study_stage_count(self._model.stage_count))

    def show_units(self, system: str) -> None:
        """The same values of the site variable in the unit ``system`` shows."""
        variable = self.variable.currentData()
        if variable and system != self._values_system:
            try:
                si = parse_values(self.values.text(), variable, self._values_system)
                self.values.setText(format_values(si, variable, system))
            except ValueError:
                pass
            self.values_unit.setText(units.unit(VARIABLES[variable][1], system).symbol)
        self._values_system = system

    def _show_values_row(self, on: bool) -> None:
        for w in (self.values, self.values_unit, self.values_label):
            w.setVisible(on)

    # ---- user input ----------------------------------------------------------------------
    def _on_variable(self, _index: int) -> None:
        variable = self.variable.currentData()
        self._show_values_row(bool(variable))
        if variable:
            system = self._prefs.system
            self.values_unit.setText(units.unit(VARIABLES[variable][1], system).symbol)
            if not self.values.text().strip():
                self.values.setText(format_values(self._suggested_values(variable), variable, system))
            self._values_system = system

    def _suggested_values(self, variable: str) -> list[float]:
        """A start for the values: the project's own value and a cooler and a warmer one."""
        site = self._model.normalised().get("site", {}) or {}
        if variable == "ambient_temperature_K":
            t = float(site.get("ambient_temperature_K", 293.15))
            return [max(223.15, t - 15.0), t, min(333.15, t + 15.0)]
        rh = float(site.get("relative_humidity", 0.0) or 0.0)
        return sorted({0.3, round(rh, 4), 0.9})

    def _on_values_edited(self, _text: str) -> None:
        if self.values.property("invalid"):
            self.values.setProperty("invalid", False)
            repolish(self.values)
