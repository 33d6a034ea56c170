"""The form for the cooler after a stage (intercooler, or aftercooler after the last stage):
how its air outlet is given (temperature, approach, or rated from UA), its pressure drop and
separator, and optionally its coolant side."""
from __future__ import annotations

__all__ = ["CoolerForm", "OUTLET_CHOICES", "COOLANT_CHOICES", "default_cooler"]


from stagewright.gui.document.paths import ABSENT, stage_path
from stagewright.gui.widgets.choice_field import ChoiceField
from stagewright.gui.widgets.quantity_field import QuantityField
from stagewright.gui.panels.base import FieldPanel, section_title

OUTLET_CHOICES = [("outlet", "Outlet temperature"), ("approach", "Approach to coolant"),
                  ("ua", "UA rating")]
_OUTLET_KEYS = {"outlet": "outlet_temperature_K", "approach": "approach_K", "ua": "ua_W_K"}
COOLANT_CHOICES = [("none", "Not modelled"), ("water", "Water"), ("glycol", "Water–glycol"), ("air", "Air")]
COOLANT_BASIS = [("temperature_rise_K", "Temperature rise"), ("flow_kg_s", "Mass flow")]
ARRANGEMENTS = [("counter_flow", "Counter-flow"), ("cross_flow_unmixed", "Cross-flow, unmixed"),
                ("cross_flow_hot_mixed", "Cross-flow, air mixed"), ("shell_and_tube_1_2", "Shell & tube 1–2")]
GLYCOLS = [("ethylene", "Ethylene glycol"), ("propylene", "Propylene glycol")]


def default_cooler(ambient_K: float) -> dict:
    """A new cooler: air out 10 K above ambient, 10 kPa drop (common practice, no source)."""
    return {"outlet_temperature_K": round(ambient_K + 10.0, 2), "pressure_drop_Pa": 10_000.0}


class CoolerForm(FieldPanel):
    """Every input of the cooler after stage ``index``."""

    def __init__(self, editor, parent=None):
        super().__init__(editor, parent)
        self.index = 0
        lay, form = self.form_layout((0, 0, 0, 0))
        lay.addStretch(1)
        self.heading = section_title("Cooler")
        form.addRow(self.heading)
        self.mode = ChoiceField(editor, "", OUTLET_CHOICES, self._choose_mode, current=self._mode)
        form.addRow("Outlet given as", self.mode)
        self.value = self.add_row(form, "Outlet temperature", QuantityField(editor, ""))
        self.value_label = form.labelForField(self.value)
        self.add_row(form, "Pressure drop", QuantityField(editor, ""),
                     "Air-side pressure drop through the cooler and its separator.")
        self.add_row(form, "Separator efficiency", QuantityField(editor, ""),
                     "Share of the condensed water removed by the separator after the cooler.")
        form.addRow(section_title("Coolant side"))
        self.coolant_inlet = self.add_row(
            form, "Coolant inlet T", QuantityField(editor, "", nullable=True, placeholder="not given"),
            "Cooling water or air inlet temperature; needed for an approach, and used as the "
            "temperature at which the heat leaves.")
        self.coolant = ChoiceField(editor, "", COOLANT_CHOICES, self._choose_coolant, current=self._coolant_kind)
        form.addRow("Coolant", self.coolant)
        self.arrangement = self.add_row(form, "Arrangement", ChoiceField(editor, "", ARRANGEMENTS))
        self.basis = ChoiceField(editor, "", COOLANT_BASIS, self._choose_basis, current=self._basis)
        form.addRow("Coolant given by", self.basis)
        self.coolant_value = self.add_row(form, "Temperature rise", QuantityField(editor, ""))
        self.coolant_value_label = form.labelForField(self.coolant_value)
        self.glycol = self.add_row(form, "Glycol", ChoiceField(editor, "", GLYCOLS))
        self.glycol_fraction = self.add_row(form, "Glycol fraction", QuantityField(editor, ""),
                                            "Mass fraction of glycol in the coolant.")

    # ---- state ---------------------------------------------------------------------------
    def _cooler(self) -> dict:
        c = self.editor.model.get(stage_path(self.index, "cooler"), None)
        return c if isinstance(c, dict) else {}

    def _mode(self) -> str:
        c = self._cooler()
        for mode, key in (("ua", "ua_W_K"), ("approach", "approach_K")):
            if c.get(key) is not None:
                return mode
        return "outlet"

    def _coolant(self) -> dict | None:
        c = self._cooler().get("coolant")
        return c if isinstance(c, dict) else None

    def _coolant_kind(self) -> str:
        coolant = self._coolant()
        return coolant["kind"] if coolant else "none"

    def _basis(self) -> str:
        c = self._coolant() or {}
        return "flow_kg_s" if c.get("flow_kg_s") is not None else "temperature_rise_K"

    def set_stage(self, index: int) -> None:
        self.index = index
        self.refresh_all()

    def before_refresh(self) -> None:
        mode, base = self._mode(), "cooler."
        coolant = self._coolant()
        keys = [base + _OUTLET_KEYS[mode], "cooler.pressure_drop_Pa", "cooler.separator_efficiency",
                "cooler.coolant_inlet_temperature_K", "cooler.arrangement", f"cooler.coolant.{self._basis()}",
                "cooler.coolant.glycol", "cooler.coolant.glycol_fraction"]
        for field, key in zip(self.fields, keys):
            field.path = stage_path(self.index, key)
        last = self.index == self.editor.model.stage_count - 1
        self.heading.setText("Aftercooler" if last else f"Intercooler {self.index + 1}")
        self.mode.refresh(mode)
        self.coolant.refresh(self._coolant_kind())
        self.basis.refresh(self._basis())
        if self.value_label is not None:
            self.value_label.setText({"outlet": "Outlet temperature", "approach": "Approach",
                                      "ua": "UA"}[mode])
        if self.coolant_value_label is not None:
            self.coolant_value_label.setText("Temperature rise" if self._basis() == "temperature_rise_K"
                                             else "Coolant flow")

    def after_refresh(self) -> None:
        coolant = self._coolant()
        has = coolant is not None
        glycol = has and coolant.get("kind") == "glycol"
        for w in (self.arrangement, self.basis, self.coolant_value):
            self.form.setRowVisible(w, has)
        for w in (self.glycol, self.glycol_fraction):
            self.form.setRowVisible(w, glycol)

    def _on_model_changed(self, path: str) -> None:
        if self.index < self.editor.model.stage_count:
            super()._on_model_changed(path)

    def depends_on(self, path: str) -> bool:
        return path == "stages" or super().depends_on(path)

    # ---- choices that change several keys at once -----------------------------------------
    def _choose_mode(self, mode: str) -> None:
        old = self._mode()
        if mode == old:
            return
        base = stage_path(self.index, "cooler")
        c = self._cooler()
        ambient = self.editor.model.get("site.ambient_temperature_K", 293.15)
        coolant_T = c.get("coolant_inlet_temperature_K")
        out_T = self._current_outlet_T(c, ambient)
        pairs = [(f"{base}.{key}", ABSENT) for key in _OUTLET_KEYS.values() if c.get(key) is not None]
        if mode == "outlet":
            pairs.append((f"{base}.outlet_temperature_K", round(out_T, 4)))
        elif mode == "approach":
            if coolant_T is None:
                coolant_T = round(min(out_T, ambient), 2)
                pairs.append((f"{base}.coolant_inlet_temperature_K", coolant_T))
            pairs.append((f"{base}.approach_K", round(max(out_T - coolant_T, 0.0), 4)))
        else:
            pairs.append((f"{base}.ua_W_K", self._current_ua()))
            if self._coolant() is None:
                pairs.append((f"{base}.coolant", {"kind": "water", "temperature_rise_K": 10.0}))
            if coolant_T is None:
                pairs.append((f"{base}.coolant_inlet_temperature_K", round(ambient, 2)))
        name = self.heading.text().lower()
        text = {"outlet": "an outlet temperature", "approach": "an approach", "ua": "a UA rating"}[mode]
        self.editor.set_values(pairs, f"Give {name} outlet as {text}")

    def _result_cooler(self) -> dict | None:
        r = self.editor.result
        if r is None or self.editor.stale or self.index >= len(r["stages"]):
            return None
        return r["stages"][self.index].get("cooler")

    def _current_outlet_T(self, c: dict, ambient: float) -> float:
        rc = self._result_cooler()
        if rc is not None:
            return rc["outlet"]["temperature_K"]
        if c.get("outlet_temperature_K") is not None:
            return c["outlet_temperature_K"]
        if c.get("approach_K") is not None:
            return (c.get("coolant_inlet_temperature_K") or ambient) + c["approach_K"]
        return ambient + 10.0

    def _current_ua(self) -> float:
        rc = self._result_cooler()
        if rc is not None and rc.get("ua_W_K"):
            return float(f"{rc['ua_W_K']:.6g}")
        return 5000.0  # invented starting value; the user rates the real exchanger

    def _choose_coolant(self, kind: str) -> None:
        base = stage_path(self.index, "cooler")
        current = self._coolant()
        if (current or {}).get("kind", "none") == kind:
            return
        name = self.heading.text().lower()
        if kind == "none":
            self.editor.set_values([(f"{base}.coolant", ABSENT)], f"Remove the {name} coolant side")
            return
        new = {k: v for k, v in (current or {}).items() if k in ("flow_kg_s", "temperature_rise_K")}
        if not new:
            new = {"temperature_rise_K": 10.0}  # invented starting value
        new["kind"] = kind
        if kind == "glycol":
            new.update(glycol="ethylene", glycol_fraction=0.3)  # invented starting value
        pairs = [(f"{base}.coolant", new)]
        if kind != "air" and self._cooler().get("coolant_inlet_temperature_K") is None:
            ambient = self.editor.model.get("site.ambient_temperature_K", 293.15)
            pairs.append((f"{base}.coolant_inlet_temperature_K", round(ambient, 2)))
        self.editor.set_values(pairs, f"Change {name} coolant")

    def _choose_basis(self, basis: str) -> None:
        if basis == self._basis() or self._coolant() is None:
            return
        base = stage_path(self.index, "cooler.coolant")
        rc = self._result_cooler()
        if basis == "flow_kg_s":
            value = float(f"{rc['coolant_flow_kg_s']:.6g}") if rc and rc.get("coolant_flow_kg_s") else 1.0
        else:
            rise = None
            if rc and rc.get("coolant_outlet_temperature_K") and rc.get("coolant_inlet_temperature_K"):
                rise = rc["coolant_outlet_temperature_K"] - rc["coolant_inlet_temperature_K"]
            value = round(rise, 4) if rise and rise > 0 else 10.0
        other = "temperature_rise_K" if basis == "flow_kg_s" else "flow_kg_s"
        self.editor.set_values([(f"{base}.{other}", ABSENT), (f"{base}.{basis}", value)],
                               f"Give {self.heading.text().lower()} coolant by {'flow' if basis == 'flow_kg_s' else 'temperature rise'}")
