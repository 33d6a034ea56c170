"""Site & intake panel: project title, ambient state, site pressure, intake filter, air model."""
from __future__ import annotations

__all__ = ["SitePanel", "elevation_for_pressure"]

from PySide6.QtWidgets import QHBoxLayout, QWidget

from stagewright.core.atmosphere import standard_elevation, standard_pressure
from stagewright.core.project.schema import PROJECT

from stagewright.gui.document.paths import ABSENT
from stagewright.gui.widgets.choice_field import ChoiceField
from stagewright.gui.widgets.quantity_field import QuantityField
from stagewright.gui.widgets.text_field import TextField
from stagewright.gui.panels.base import FieldPanel, section_title

MODEL_CHOICES = [
    ("real_gas", "Real gas (Lemmon 2000)"),
    ("ideal_gas", "Ideal gas, cp(T)"),
    ("constant_cp", "Constant cp"),
]
PRESSURE_MODES = [("pressure", "Barometric pressure"), ("elevation", "Elevation")]


def elevation_for_pressure(p_Pa: float) -> float:
    """Elevation [m] whose ISO 2533 standard pressure is ``p_Pa``
    (:func:`stagewright.core.atmosphere.standard_elevation`), limited to the schema's elevation range
    and rounded to the millimetre.

    >>> round(elevation_for_pressure(standard_pressure(1234.0)), 3)
    1234.0
    """
    node = PROJECT.fields["site"].fields["elevation_m"]
    lo, hi = node.lo, node.hi
    if p_Pa >= standard_pressure(lo):
        return lo
    if p_Pa <= standard_pressure(hi):
        return hi
    return round(standard_elevation(p_Pa), 3)


class SitePanel(FieldPanel):
    """Where the machine stands and what it breathes."""

    title = "Site & intake"

    def __init__(self, editor, parent=None):
        super().__init__(editor, parent)
        lay, form = self.form_layout((10, 8, 10, 8))
        lay.addStretch(1)

        self.add_row(form, "Project title", TextField(editor, "title", "untitled project"))
        self.add_row(form, "Ambient temperature", QuantityField(editor, "site.ambient_temperature_K"),
                     "Air temperature at the intake; also the dead-state temperature for exergy.")
        self.mode = ChoiceField(editor, "", PRESSURE_MODES, self._choose_mode, current=self._pressure_mode)
        self.mode.setToolTip("Give the site pressure directly, or as an elevation above sea level "
                             "(pressure of the ISO 2533 standard atmosphere).")
        form.addRow("Site pressure from", self.mode)
        self.pressure = QuantityField(editor, "site.barometric_pressure_Pa", nullable=True,
                                      placeholder="101.325 kPa if empty")
        self.elevation = QuantityField(editor, "site.elevation_m", nullable=True, placeholder="sea level")
        row = QWidget()
        rl = QHBoxLayout(row)
        rl.setContentsMargins(0, 0, 0, 0)
        rl.addWidget(self.pressure)
        rl.addWidget(self.elevation)
        self.bind(self.pressure)
        self.bind(self.elevation)
        self.pressure_label = "Barometric pressure"
        form.addRow("", row)
        self.add_row(form, "Relative humidity", QuantityField(editor, "site.relative_humidity"),
                     "Relative humidity of the intake air.")
        self.add_row(form, "Intake filter drop", QuantityField(editor, "inlet_pressure_drop_Pa"),
                     "Pressure lost in the intake filter and silencer before stage 1.")
        form.addRow(section_title("Air property model"))
        self.model_choice = self.add_row(form, "Model", ChoiceField(editor, "fluid.model", MODEL_CHOICES),
                                         "Real gas: the reference equation of state for air (Lemmon et al. "
                                         "2000) via CoolProp. Ideal gas: its ideal-gas part, cp varying with "
                                         "temperature. Constant cp: a perfect gas with the cp and k below.")
        self.cp = self.add_row(form, "cp", QuantityField(editor, "fluid.cp_J_kgK"))
        self.k = self.add_row(form, "k = cp/cv", QuantityField(editor, "fluid.k"))
        self.refresh_all()

    def _pressure_mode(self) -> str:
        z = self.editor.model.get("site.elevation_m")
        return "elevation" if z is not ABSENT and z is not None else "pressure"

    def after_refresh(self) -> None:
        mode = self._pressure_mode()
        self.mode.refresh(mode)
        self.pressure.setVisible(mode == "pressure")
        self.elevation.setVisible(mode == "elevation")
        perfect = self.model_choice.current_value() == "constant_cp"
        self.form.setRowVisible(self.cp, perfect)
        self.form.setRowVisible(self.k, perfect)

    def _choose_mode(self, mode: str) -> None:
        if mode == self._pressure_mode():
            return
        p = self.editor.barometric_Pa()
        if mode == "elevation":
            pairs = [("site.barometric_pressure_Pa", ABSENT), ("site.elevation_m", elevation_for_pressure(p))]
            text = "Give site pressure as elevation"
        else:
            pairs = [("site.elevation_m", ABSENT), ("site.barometric_pressure_Pa", round(p, 3))]
            text = "Give site pressure as barometric pressure"
        self.editor.set_values(pairs, text)
