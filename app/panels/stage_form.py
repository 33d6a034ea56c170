"""The form for one stage of the train (shown in the train panel when a stage is selected)."""
from __future__ import annotations

__all__ = ["StageForm", "EFFICIENCY_CHOICES"]


from stagewright.gui.document.paths import stage_path
from stagewright.gui.widgets.choice_field import ChoiceField
from stagewright.gui.widgets.quantity_field import QuantityField
from stagewright.gui.widgets.text_field import TextField
from stagewright.gui.panels.base import FieldPanel, section_title

EFFICIENCY_CHOICES = [
    ("isentropic", "Isentropic"),
    ("polytropic", "Polytropic"),
    ("discharge_temperature", "Measured discharge T"),
]
#: efficiency kind -> (value key in the document, key of the stage result with the same meaning)
_EFF_KEYS = {"isentropic": ("value", "isentropic_efficiency"),
             "polytropic": ("value", "polytropic_efficiency"),
             "discharge_temperature": ("value_K", None)}
_EFF_DEFAULT = {"isentropic": 0.8, "polytropic": 0.82, "discharge_temperature": 450.0}  # invented


class StageForm(FieldPanel):
    """Every input of stage ``index``; :meth:`set_stage` rebinds the fields to another stage."""

    def __init__(self, editor, parent=None):
        super().__init__(editor, parent)
        self.index = 0
        lay, form = self.form_layout((0, 0, 0, 0))
        lay.addStretch(1)
        self.heading = section_title("Stage")
        form.addRow(self.heading)
        self.name = self.add_row(form, "Name", TextField(editor, "", "e.g. LP stage"))
        self.ratio = self.add_row(form, "Pressure ratio", QuantityField(editor, "", nullable=True,
                                                                       placeholder="shared split"),
                                  "Leave empty to let the stage share the split that meets the "
                                  "discharge pressure (cooler pressure drops included).")
        self.kind = self.add_row(form, "Efficiency given as", ChoiceField(editor, "", EFFICIENCY_CHOICES,
                                                                          self._choose_kind),
                                 "Isentropic or polytropic efficiency of the stage, or a measured "
                                 "discharge temperature (checking a running machine).")
        self.value = self.add_row(form, "Efficiency", QuantityField(editor, ""))
        self.value_label = form.labelForField(self.value)
        self.limit = self.add_row(form, "Discharge T limit", QuantityField(editor, "", nullable=True,
                                                                          placeholder="none"),
                                  "Highest discharge temperature allowed for this stage "
                                  "(see Help ▸ Safety cautions).")
        form.addRow(section_title("Losses"))
        self.add_row(form, "Mechanical efficiency", QuantityField(editor, ""),
                     "Gas power / shaft power (bearings, seals, gears).")
        self.add_row(form, "Casing heat loss", QuantityField(editor, ""),
                     "Heat lost through the casing during compression.")
        self.add_row(form, "Casing surface T", QuantityField(editor, "", nullable=True,
                                                            placeholder="ambient"),
                     "Temperature at which the casing heat leaves (for its exergy).")
        self.add_row(form, "Exit velocity", QuantityField(editor, ""),
                     "Gas velocity at the stage discharge flange.")
        form.addRow(section_title("Ratio bounds for staging studies"))
        self.add_row(form, "Lowest ratio", QuantityField(editor, "", nullable=True, placeholder="none"))
        self.add_row(form, "Highest ratio", QuantityField(editor, "", nullable=True, placeholder="none"))
        self._keys = ["name", "pressure_ratio", "efficiency.kind", "efficiency.value",
                      "max_discharge_temperature_K", "mechanical_efficiency", "heat_loss_W",
                      "heat_loss_boundary_temperature_K", "exit_velocity_m_s", "min_pressure_ratio",
                      "max_pressure_ratio"]

    def set_stage(self, index: int) -> None:
        self.index = index
        self.refresh_all()

    def before_refresh(self) -> None:
        kind = self.editor.model.get(stage_path(self.index, "efficiency.kind"))
        keys = list(self._keys)
        keys[3] = "efficiency.value_K" if kind == "discharge_temperature" else "efficiency.value"
        for field, key in zip(self.fields, keys):
            field.path = stage_path(self.index, key)
        self.heading.setText(f"Stage {self.index + 1}")
        if self.value_label is not None:
            self.value_label.setText("Discharge temperature" if kind == "discharge_temperature" else "Efficiency")

    def _on_model_changed(self, path: str) -> None:
        if self.index < self.editor.model.stage_count:
            super()._on_model_changed(path)

    def depends_on(self, path: str) -> bool:
        return path == "stages" or super().depends_on(path)

    def _choose_kind(self, kind: str) -> None:
        i = self.index
        eff = self.editor.model.get(stage_path(i, "efficiency"), {}) or {}
        if eff.get("kind") == kind:
            return
        key, result_key = _EFF_KEYS[kind]
        value = _EFF_DEFAULT[kind]
        result = self.editor.result
        if result is not None and not self.editor.stale and i < len(result["stages"]):
            st = result["stages"][i]
            carried = st["outlet"]["temperature_K"] if result_key is None else st.get(result_key)
            if carried:
                value = round(carried, 2) if result_key is None else round(carried, 4)
        self.editor.set_value(stage_path(i, "efficiency"), {"kind": kind, key: value},
                              f"Change stage {i + 1} efficiency basis")
