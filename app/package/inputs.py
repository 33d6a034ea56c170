"""The package panel's inputs: capacity control and its parameters, motor, auxiliaries and loads.

Entry fields are bound to paths of the ``package`` section (labels and display quantities from
:mod:`stagewright.gui.document.field_specs`); the control's drop-down replaces the whole ``control`` (what
the kinds share is carried over, :func:`stagewright.gui.package.edits.control_for_kind`), so a change of
control is one undo step. Only the parameters of the chosen kind are shown.
"""
from __future__ import annotations

__all__ = ["PackageInputs", "PARAMETER_TIPS", "SHORT_LABELS"]

from PySide6.QtWidgets import QCheckBox, QFormLayout, QLabel, QLineEdit, QPushButton, QVBoxLayout

from stagewright.gui.document.field_specs import spec_for
from stagewright.gui.document.paths import ABSENT
from stagewright.gui.package.edits import (CONTROL_CHOICES, CONTROL_KEYS, RECEIVER_L_PER_L_S, control_for_kind, loads_text,
                               parse_loads)
from stagewright.gui.package.rows_editor import RowColumn, RowsEditor
from stagewright.gui.panels.base import FieldPanel, section_title
from stagewright.gui.widgets.choice_field import ChoiceField
from stagewright.gui.widgets.plain_text import plain_label, plain_tip
from stagewright.gui.widgets.quantity_field import QuantityField

_C = "package.control."
#: parameter key → tooltip (defaults as the schema states them; sources as thermo/part_load names them)
PARAMETER_TIPS = {
    "receiver_volume_m3": f"Air receiver the control cycles on. Sized at about {RECEIVER_L_PER_L_S:g} L per (L/s) "
                          "of free air delivery when the control was added (common practice, no source); "
                          "more storage means fewer, longer cycles.",
    "pressure_band_Pa": "Pressure band between loading (or starting) and unloading (or stopping).",
    "unloaded_power_fraction": "Shaft power running unloaded, as a share of the full-load shaft power, once blown down.",
    "blowdown_time_s": "Time constant of the sump or casing blowdown after unloading.",
    "zero_flow_power_fraction": "Shaft power of inlet modulation at zero flow, as a share of full-load power.",
    "min_speed_fraction": "Lowest speed of the variable-speed drive; below it the package loads and unloads.",
    "specific_power_rise_at_min_speed": "How much the specific power rises from full speed to minimum speed.",
    "drive_efficiency": "Efficiency of the variable-speed drive at full load.",
    "drive_fixed_loss_share": "Share of the drive's full-load loss that does not fall with load.",
    "max_starts_per_hour": "Most motor starts per hour the motor allows; above it the package runs unloaded.",
}


#: parameter key → its short label in the form (the full one, from field_specs, is in the tooltip and messages)
SHORT_LABELS = {"receiver_volume_m3": "Receiver", "pressure_band_Pa": "Pressure band",
                "specific_power_rise_at_min_speed": "Rise at min. speed", "drive_fixed_loss_share": "Drive fixed loss",
                "zero_flow_power_fraction": "Power at zero flow", "max_starts_per_hour": "Starts limit"}


class PackageInputs(FieldPanel):
    """The form of the ``package`` section (shown only when the project has one)."""

    def __init__(self, editor, parent=None):
        super().__init__(editor, parent)
        lay = QVBoxLayout(self)
        lay.setContentsMargins(4, 2, 4, 2)
        form = QFormLayout()
        form.setFieldGrowthPolicy(QFormLayout.AllNonFixedFieldsGrow)
        lay.addLayout(form)
        form.addRow(section_title("Capacity control"))
        self.kind = ChoiceField(editor, _C + "kind", CONTROL_CHOICES, on_choose=self._choose_kind)
        self.add_row(form, "Control", self.kind, "How the package follows a demand below its capacity.")
        self.parameters: dict[str, tuple[QLabel, QuantityField]] = {}
        keys = dict.fromkeys(k for ks in CONTROL_KEYS.values() for k in ks if k != "points")
        for key in keys:
            field = QuantityField(editor, _C + key)
            self.add_row(form, SHORT_LABELS.get(key, _label(_C + key)), field,
                         f"{_label(_C + key)}: {PARAMETER_TIPS.get(key, '')}".rstrip(": "))
            self.parameters[key] = (form.labelForField(field), field)
        self.points = RowsEditor(editor, _C + "points", [RowColumn("flow_fraction", "Flow", "fraction"),
                                                         RowColumn("power_fraction", "Power", "fraction")],
                                 "curve point", min_rows=2, max_rows=50)
        self.points.setToolTip("Measured package power (share of full load) against flow (share of full flow). "
                               "The points offered are placeholders: replace them with your measurements.")
        form.addRow(self.points)
        form.addRow(section_title("Motor"))
        self.add_row(form, "Rated output", QuantityField(editor, "package.motor.rated_output_W", nullable=True,
                                                         placeholder="full-load shaft power"),
                     "Motor nameplate output. Empty: the full-load shaft power solved.")
        self.add_row(form, "Fixed-loss share", QuantityField(editor, "package.motor.fixed_loss_share"),
                     "Share of the motor's full-load loss that does not fall with load (default 0.35).")
        self.motor_points = RowsEditor(editor, "package.motor.efficiency_points",
                                       [RowColumn("load_fraction", "Load", "fraction"),
                                        RowColumn("efficiency", "Efficiency", "fraction")],
                                       "motor efficiency point", max_rows=20)
        self.motor_points.setToolTip("A supplier's motor efficiency at its stated loads (share of rated output). "
                                     "When given, they replace the fixed-loss split; leave empty to use it.")
        form.addRow(self.motor_points)
        form.addRow(section_title("Auxiliaries"))
        self.add_row(form, "Cooler fans", QuantityField(editor, "package.fan_power_W"),
                     "Electrical input of the cooler fans while the package runs.")
        self.pump = QCheckBox("Coolant pump in the package")
        self.pump.toggled.connect(self._toggle_pump)
        form.addRow(self.pump)
        self.pump_head = self.add_row(form, "Pump head", QuantityField(editor, "package.pump.head_m"))
        self.pump_eff = self.add_row(form, "Pump efficiency", QuantityField(editor, "package.pump.efficiency"))
        self.other = RowsEditor(editor, "package.other_loads", [RowColumn("name", "Other load"),
                                                                RowColumn("power_W", "Power", "power")],
                                "other load", max_rows=20)
        form.addRow(self.other)
        form.addRow(section_title("Loads"))
        self.add_row(form, "Stated load", QuantityField(editor, "package.load"),
                     "Demand the stated-load figures are at, as a share of full capacity.")
        self.part_loads = QLineEdit()
        self.part_loads.setToolTip("Loads of the data sheet in per cent, separated by commas (e.g. 100, 75, 50).")
        self.part_loads.editingFinished.connect(self._commit_part_loads)
        form.addRow(QLabel("Data-sheet loads [%]"), self.part_loads)
        self.part_loads_note = plain_label(QLabel())
        self.part_loads_note.setObjectName("footNote")
        self.part_loads_note.setWordWrap(True)
        form.addRow(self.part_loads_note)
        form.addRow(section_title("Load profile (hours at each load in a year)"))
        self.profile = RowsEditor(editor, "package.load_profile", [RowColumn("load", "Load", "fraction"),
                                                                   RowColumn("hours", "Hours", "hours")],
                                  "load-profile row")
        form.addRow(self.profile)
        self.remove_button = QPushButton("Remove the package section")
        self.remove_button.setToolTip("Back to the train alone: no control, motor or auxiliaries (undo brings it back)")
        self.remove_button.clicked.connect(
            lambda: editor.set_value("package", ABSENT, "Remove the package section"))
        lay.addWidget(self.remove_button)
        lay.addStretch(1)
        self.refresh_all()

    # ---- edits ------------------------------------------------------------------------------
    def _fad(self) -> float | None:
        result = self.editor.result or {}
        return result.get("free_air_delivery_m3_s")

    def _choose_kind(self, kind: str) -> None:
        old = self.editor.model.get("package.control")
        if isinstance(old, dict) and old.get("kind") == kind:
            return
        text = dict(CONTROL_CHOICES)[kind].lower()
        self.editor.set_value("package.control", control_for_kind(old if isinstance(old, dict) else None, kind,
                                                                  self._fad()), f"Change capacity control to {text}")

    def _toggle_pump(self, on: bool) -> None:
        has = isinstance(self.editor.model.get("package.pump"), dict)
        if on and not has:
            self.editor.set_value("package.pump", {"head_m": 20.0, "efficiency": 0.7}, "Add a coolant pump")
        elif not on and has:
            self.editor.set_value("package.pump", ABSENT, "Remove the coolant pump")

    def _commit_part_loads(self) -> None:
        if not self.part_loads.isModified():
            return
        self.part_loads.setModified(False)
        try:
            loads = parse_loads(self.part_loads.text())
        except ValueError as exc:
            self.part_loads_note.setText(f"Data-sheet loads: {exc}; kept as they were.")
            return
        self.part_loads_note.setText("")
        if not self.editor.set_value("package.part_loads", loads, "Change the data-sheet loads"):
            self._show_part_loads()

    # ---- refresh ----------------------------------------------------------------------------
    def depends_on(self, path: str) -> bool:
        return path == "" or path.startswith("package") or path.startswith("site")

    def after_refresh(self) -> None:
        kind = self.editor.model.get(_C + "kind")
        keys = CONTROL_KEYS.get(kind, ())
        for key, (label, field) in self.parameters.items():
            label.setVisible(key in keys)
            field.setVisible(key in keys)
        self.points.setVisible(kind == "measured_curve")
        has_pump = isinstance(self.editor.model.get("package.pump"), dict)
        self.pump.blockSignals(True)
        self.pump.setChecked(has_pump)
        self.pump.blockSignals(False)
        for field in (self.pump_head, self.pump_eff):
            field.setVisible(has_pump)
            self.form_label(field).setVisible(has_pump)
        for rows in (self.points, self.motor_points, self.other, self.profile):
            rows.refresh()
        self._show_part_loads()

    def form_label(self, field) -> QLabel:
        return self.layout().itemAt(0).layout().labelForField(field)

    def _show_part_loads(self) -> None:
        loads = self.editor.model.get("package.part_loads")
        if loads is ABSENT or loads is None:
            from stagewright.gui.document.paths import get_in
            loads = get_in(self.editor.model.normalised(), "package.part_loads", [])
        if not self.part_loads.hasFocus() or not self.part_loads.isModified():
            self.part_loads.setText(loads_text(loads) if isinstance(loads, list) else "")

    def update_marks(self) -> None:
        super().update_marks()
        problem = next((p.expected for p in self.editor.problems if p.field.startswith("package.part_loads")), None)
        self.part_loads.setToolTip(plain_tip(problem or "Loads of the data sheet in per cent, e.g. 100, 75, 50."))
        for rows in (self.points, self.motor_points, self.other, self.profile):
            rows.refresh()


def _label(path: str) -> str:
    spec = spec_for(path)
    text = spec.label if spec else path.rsplit(".", 1)[-1]
    return text[:1].upper() + text[1:]
