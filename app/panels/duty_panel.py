"""Duty panel: how much air, at what pressure, and the driver that supplies the power."""
from __future__ import annotations

__all__ = ["DutyPanel", "FLOW_CHOICES"]

from PySide6.QtWidgets import QComboBox

from stagewright.gui.widgets.choice_field import ChoiceField
from stagewright.gui.widgets.delivery_pressure_field import DeliveryPressureField
from stagewright.gui.widgets.quantity_field import QuantityField
from stagewright.gui.widgets.signals_blocked import signals_blocked
from stagewright.gui.panels.base import FieldPanel
from stagewright.gui.presentation.result_notes import TOTAL_TIPS
from stagewright.core.project.delivery import DELIVERY_KEYS

FLOW_CHOICES = [
    ("free_air_delivery", "Free air delivery"),
    ("normal_volume", "Normal volume flow"),
    ("mass", "Mass flow"),
    ("shaft_power", "Shaft power"),
]
#: flow kind -> key of the result carrying the same duty, to carry the value across a change
_RESULT_KEY = {"mass": "mass_flow_kg_s", "free_air_delivery": "free_air_delivery_m3_s",
               "normal_volume": "normal_volume_flow_m3_s", "shaft_power": "shaft_power_W"}


#: flow kind -> what the value is, with its reference state (tooltip of the row)
_FLOW_TIPS = {
    "free_air_delivery": TOTAL_TIPS["free_air_delivery_m3_s"],
    "normal_volume": TOTAL_TIPS["normal_volume_flow_m3_s"],
    "mass": "Mass flow of the (dry) air through the train.",
    "shaft_power": "Shaft power: the total power the stages take at their shafts; the flow they move "
                   "is found from it.",
}


class DutyPanel(FieldPanel):
    """Flow, discharge pressure, driver efficiency."""

    title = "Duty"

    def __init__(self, editor, parent=None):
        super().__init__(editor, parent)
        lay, form = self.form_layout((10, 8, 10, 8))
        lay.addStretch(1)
        self.kind = self.add_row(form, "Flow given as", ChoiceField(editor, "flow.kind", FLOW_CHOICES,
                                                                    self._choose_kind),
                                 "Free air delivery: volume flow at the intake state. Normal volume: at "
                                 "0 °C and 1.01325 bar. Shaft power: finds the flow a running machine "
                                 "moves with the power it draws.")
        self.flow = self.add_row(form, "Flow", QuantityField(editor, "flow.value"))
        self.flow_label = form.labelForField(self.flow)  # named after the flow basis (after_refresh)
        self.pressure = self.bind(DeliveryPressureField(editor))
        self.gauge = QComboBox()
        self.gauge.addItems(["Gauge", "Absolute"])
        self.gauge.setToolTip("Gauge pressure is relative to the site barometric pressure. The project "
                              "keeps the discharge pressure as typed: gauge when typed as gauge (held when "
                              "the site changes), absolute when typed as absolute.")
        self.gauge.activated.connect(lambda i: setattr(editor.prefs, "gauge", i == 0))
        form.addRow("Discharge pressure", self.pressure)
        form.addRow("Pressures shown", self.gauge)
        self.add_row(form, "Driver efficiency", QuantityField(editor, "driver.efficiency"),
                     "Motor (and drive) efficiency: driver input power = shaft power / efficiency.")
        self.refresh_all()

    def depends_on(self, path: str) -> bool:
        """The site (gauge display) and either statement of the delivery pressure."""
        return super().depends_on(path) or path in DELIVERY_KEYS

    def field_for(self, path: str):
        """Either delivery key leads to the one delivery-pressure field."""
        return self.pressure if path in DELIVERY_KEYS else super().field_for(path)

    def after_refresh(self) -> None:
        with signals_blocked(self.gauge):
            self.gauge.setCurrentIndex(0 if self.editor.prefs.gauge else 1)
        kind = self.editor.model.get("flow.kind")
        self.flow_label.setText(dict(FLOW_CHOICES).get(kind, "Flow"))
        tip = _FLOW_TIPS.get(kind, "")
        self.flow_label.setToolTip(tip)
        self.flow.unit_label.setToolTip(tip)

    def _choose_kind(self, kind: str) -> None:
        flow = dict(self.editor.model.get("flow", {}) or {})
        if flow.get("kind") == kind:
            return
        value = flow.get("value")
        result = self.editor.result
        if result is not None and not self.editor.stale and result.get(_RESULT_KEY[kind]):
            value = float(f"{result[_RESULT_KEY[kind]]:.12g}")  # the same duty, expressed anew
        self.editor.set_value("flow", {"kind": kind, "value": value}, "Change flow basis")
