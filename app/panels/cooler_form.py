"""The form for the cooler after a stage (intercooler, or aftercooler after the last stage)."""
from __future__ import annotations

__all__ = ["CoolerForm", "OUTLET_CHOICES", "default_cooler"]

from PySide6.QtWidgets import QFormLayout, QVBoxLayout

from ..doc_paths import ABSENT, stage_path
from ..widgets.choice_field import ChoiceField
from ..widgets.quantity_field import QuantityField
from .base import FieldPanel, section_title

OUTLET_CHOICES = [("outlet", "Air outlet temperature"), ("approach", "Approach to coolant inlet")]


def default_cooler(ambient_K: float) -> dict:
    """A new cooler: air out 10 K above ambient, 10 kPa drop (common practice, no source)."""
    return {"outlet_temperature_K": round(ambient_K + 10.0, 2), "pressure_drop_Pa": 10_000.0}


class CoolerForm(FieldPanel):
    """Every input of the cooler after stage ``index``."""

    def __init__(self, editor, parent=None):
        super().__init__(editor, parent)
        self.index = 0
        lay = QVBoxLayout(self)
        lay.setContentsMargins(0, 0, 0, 0)
        form = QFormLayout()
        form.setFieldGrowthPolicy(QFormLayout.AllNonFixedFieldsGrow)
        lay.addLayout(form)
        lay.addStretch(1)
        self.heading = section_title("Cooler")
        form.addRow(self.heading)
        self.mode = ChoiceField(editor, "", OUTLET_CHOICES, self._choose_mode)
        form.addRow("Outlet given as", self.mode)
        self.value = self.add_row(form, "Outlet temperature", QuantityField(editor, ""))
        self.value_label = form.labelForField(self.value)
        self.add_row(form, "Coolant inlet T", QuantityField(editor, "", nullable=True, placeholder="not given"),
                     "Cooling water or air inlet temperature; needed for an approach, and used as the "
                     "temperature at which the heat leaves.")
        self.add_row(form, "Pressure drop", QuantityField(editor, ""),
                     "Air-side pressure drop through the cooler and its separator.")
        self.add_row(form, "Separator efficiency", QuantityField(editor, ""),
                     "Share of the condensed water removed by the separator after the cooler.")

    def _mode(self) -> str:
        v = self.editor.model.get(stage_path(self.index, "cooler.approach_K"))
        return "approach" if v is not ABSENT and v is not None else "outlet"

    def set_stage(self, index: int) -> None:
        self.index = index
        self.refresh_all()

    def before_refresh(self) -> None:
        mode = self._mode()
        keys = ["cooler.approach_K" if mode == "approach" else "cooler.outlet_temperature_K",
                "cooler.coolant_inlet_temperature_K", "cooler.pressure_drop_Pa",
                "cooler.separator_efficiency"]
        for field, key in zip(self.fields, keys):
            field.path = stage_path(self.index, key)
        last = self.index == self.editor.model.stage_count - 1
        self.heading.setText("Aftercooler" if last else f"Intercooler {self.index + 1}")
        self.mode.refresh(mode)
        if self.value_label is not None:
            self.value_label.setText("Approach" if mode == "approach" else "Outlet temperature")

    def _on_model_changed(self, path: str) -> None:
        if self.index < self.editor.model.stage_count:
            super()._on_model_changed(path)

    def depends_on(self, path: str) -> bool:
        return path == "stages" or super().depends_on(path)

    def _choose_mode(self, mode: str) -> None:
        if mode == self._mode():
            return
        base = stage_path(self.index, "cooler")
        cooler = self.editor.model.get(base, {}) or {}
        coolant = cooler.get("coolant_inlet_temperature_K")
        ambient = self.editor.model.get("site.ambient_temperature_K", 293.15)
        name = self.heading.text().lower()
        if mode == "approach":
            out = cooler.get("outlet_temperature_K") or ambient + 10.0
            coolant_new = coolant if coolant is not None else round(min(out, ambient), 2)
            pairs = [(f"{base}.outlet_temperature_K", ABSENT),
                     (f"{base}.approach_K", round(max(out - coolant_new, 0.0), 4)),
                     (f"{base}.coolant_inlet_temperature_K", coolant_new)]
        else:
            approach = cooler.get("approach_K") or 0.0
            out = (coolant if coolant is not None else ambient) + approach
            pairs = [(f"{base}.approach_K", ABSENT), (f"{base}.outlet_temperature_K", round(out, 4))]
        self.editor.set_values(pairs, f"Give {name} outlet as {'an approach' if mode == 'approach' else 'a temperature'}")
