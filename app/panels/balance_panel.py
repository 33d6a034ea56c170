"""Balance sheet: every state point and component of the solved train, totals and closure.

Shows the last result in the display unit system; when the document has changed in a way
that cannot be solved (or the solve failed) the numbers stay visible but greyed, under a
banner that says they are out of date.
"""
from __future__ import annotations

__all__ = ["BalancePanel", "POINT_COLUMNS", "COMPONENT_COLUMNS", "TOTALS", "MOIST_TOTALS", "TOTAL_TIPS",
           "NEGATIVE_TIPS"]

from PySide6.QtCore import Qt
from PySide6.QtGui import QBrush, QColor
from PySide6.QtWidgets import (QAbstractItemView, QHeaderView, QLabel, QSplitter, QTableWidget,
                               QTableWidgetItem, QVBoxLayout, QWidget)

from app.presentation import units
from app.presentation.result_notes import NEGATIVE_TIPS, TOTAL_TIPS
from app.document.paths import stage_index

WARNING_BG = "#fde7c4"  # a value a warning in Messages is about
#: (key, header, quantity, getter of the SI value from a point dict)
POINT_COLUMNS = [
    ("T", "T", "temperature", lambda p: p["temperature_K"]),
    ("p", "p", "pressure", lambda p: p["pressure_Pa"]),
    ("h", "h", "specific_enthalpy", lambda p: p["enthalpy_J_kg"]),
    ("s", "s", "specific_entropy", lambda p: p["entropy_J_kgK"]),
    ("rho", "ρ", "density", lambda p: p["density_kg_m3"]),
    ("V", "V", "velocity", lambda p: p["velocity_m_s"]),
    ("w", "w", "humidity_ratio", lambda p: p.get("humidity_ratio")),
    ("rh", "RH", "fraction", lambda p: p.get("relative_humidity")),
    ("dew", "Dew pt", "temperature", lambda p: p.get("dew_point_K")),
]
#: point columns shown only for moist intake air
MOIST_POINT_COLUMNS = ("w", "rh", "dew")
#: (key, header, quantity)
COMPONENT_COLUMNS = [
    ("ratio", "Ratio", "ratio"),
    ("power", "Shaft power", "power"),
    ("heat", "Heat out", "heat_flow"),
    ("eta_s", "ηs", "fraction"),
    ("eta_p", "ηp", "fraction"),
    ("sgen", "S_gen", "entropy_rate"),
    ("xdest", "X_dest", "power"),
    ("latent", "Latent", "heat_flow"),
    ("condensate", "Condensate", "water_flow"),
    ("ua", "UA", "conductance"),
    ("lmtd", "LMTD", "temperature_difference"),
    ("coolant", "Coolant flow", "mass_flow"),
    ("coolant_out", "Coolant out", "temperature"),
]
MOIST_COMPONENT_COLUMNS = ("latent", "condensate")
#: exchanger figures, shown when some cooler has a coolant side
EXCHANGER_COLUMNS = ("ua", "lmtd", "coolant", "coolant_out")
#: (result key, label, quantity; None = plain number in scientific notation, "text" = as is)
TOTALS = [
    ("mass_flow_kg_s", "Mass flow", "mass_flow"),
    ("free_air_delivery_m3_s", "Free air delivery", "volume_flow"),
    ("normal_volume_flow_m3_s", "Normal volume flow", "normal_volume_flow"),
    ("shaft_power_W", "Shaft power", "power"),
    ("driver_power_W", "Driver input power", "power"),
    ("specific_power_kW_per_m3_min", "Specific power", "specific_power"),
    ("heat_rejected_W", "Heat rejected", "heat_flow"),
    ("isothermal_power_W", "Isothermal power", "power"),
    ("isothermal_efficiency", "Isothermal efficiency", "fraction"),
    ("second_law_efficiency", "Second-law efficiency", "fraction"),
    ("exergy_gained_W", "Exergy gained by air", "power"),
    ("exergy_destroyed_W", "Exergy destroyed", "power"),
    ("heat_exergy_W", "Exergy out with heat", "power"),
    ("entropy_generation_W_K", "Entropy generation", "entropy_rate"),
    ("condensate_kg_s", "Condensate", "water_flow"),
    ("delivered_pressure_dew_point_K", "Pressure dew point", "temperature"),
    ("delivered_atmospheric_dew_point_K", "Atm. dew point", "temperature"),
    ("iso8573_humidity_class", "ISO 8573-1 class", "text"),
    ("energy_residual", "Energy closure residual", None),
    ("exergy_residual", "Exergy closure residual", None),
]
#: totals shown only for moist intake air
MOIST_TOTALS = ("condensate_kg_s", "delivered_pressure_dew_point_K", "delivered_atmospheric_dew_point_K",
                "iso8573_humidity_class")
def is_moist(r: dict) -> bool:
    """True when the result carries water (a humid intake)."""
    return bool(r.get("intake_humidity_ratio") or r["intake"].get("humidity_ratio"))


class FitTable(QTableWidget):
    """Columns as wide as their contents; spare width shared out evenly (never clipped)."""

    def fit_columns(self) -> None:
        header = self.horizontalHeader()
        self.resizeColumnsToContents()
        widths = [header.sectionSize(i) for i in range(self.columnCount())]
        spare = self.viewport().width() - sum(widths)
        if spare > 0 and len(widths) > 1:
            extra = spare // (len(widths) - 1)
            for i in range(1, len(widths)):
                header.resizeSection(i, widths[i] + extra)

    def resizeEvent(self, event) -> None:
        super().resizeEvent(event)
        self.fit_columns()


def _table(columns: list[str]) -> QTableWidget:
    t = FitTable(0, len(columns))
    t.setEditTriggers(QAbstractItemView.NoEditTriggers)
    t.setSelectionBehavior(QAbstractItemView.SelectRows)
    t.setAlternatingRowColors(True)
    t.verticalHeader().setVisible(False)
    t.verticalHeader().setDefaultSectionSize(20)
    t.setHorizontalHeaderLabels(columns)
    h = t.horizontalHeader()
    h.setSectionResizeMode(QHeaderView.Interactive)
    h.setStretchLastSection(False)
    t.setWordWrap(False)
    return t


class BalancePanel(QWidget):
    """Three tables: state points, components, totals."""

    title = "Balance sheet"

    def __init__(self, editor, parent=None):
        super().__init__(parent)
        self.editor = editor
        lay = QVBoxLayout(self)
        lay.setContentsMargins(6, 4, 6, 4)
        lay.setSpacing(4)
        self.banner = QLabel()
        self.banner.setObjectName("staleBanner")
        self.banner.setWordWrap(True)
        self.banner.hide()
        lay.addWidget(self.banner)
        split = QSplitter(Qt.Horizontal)
        left = QSplitter(Qt.Vertical)
        self.points = _table(["Point"] + [c[1] for c in POINT_COLUMNS])
        self.components = _table(["Component"] + [c[1] for c in COMPONENT_COLUMNS])
        self.totals = _table(["Total", "Value"])
        self.totals.setMinimumWidth(330)
        left.addWidget(self.points)
        left.addWidget(self.components)
        split.addWidget(left)
        split.addWidget(self.totals)
        split.setStretchFactor(0, 3)
        split.setStretchFactor(1, 1)
        self.splitter = split
        lay.addWidget(split, 1)
        self._row_keys: dict[str, list[str]] = {"points": [], "components": [], "totals": []}
        editor.result_changed.connect(self.refresh)
        editor.prefs.changed.connect(self.refresh)
        self.refresh()

    # ---- reading (tests and reports) -------------------------------------------------------
    def value_text(self, table: str, row_key: str, column: str) -> str:
        """Shown text of a cell: ``value_text("components", "stage-2", "power")``."""
        return self._item(table, row_key, column).text()

    def tool_tip(self, table: str, row_key: str, column: str) -> str:
        """Tooltip of a cell; ``column`` ``"label"`` is a row's label (``tool_tip("totals", key, "label")``)."""
        return self._item(table, row_key, column).toolTip()

    def _item(self, table: str, row_key: str, column: str) -> QTableWidgetItem:
        t = getattr(self, table)
        row = self._row_keys[table].index(row_key)
        if column == "label":
            col = 0
        elif table == "totals":
            col = 1
        else:
            cols = POINT_COLUMNS if table == "points" else COMPONENT_COLUMNS
            col = 1 + [c[0] for c in cols].index(column)
        return t.item(row, col)

    def row_keys(self, table: str) -> list[str]:
        return list(self._row_keys[table])

    @property
    def is_stale(self) -> bool:
        return self.banner.isVisibleTo(self)

    # ---- filling -------------------------------------------------------------------------
    def refresh(self) -> None:
        ed = self.editor
        r = ed.result
        system = ed.prefs.system
        stale = ed.stale and not ed.solver.busy
        if stale and r is not None:
            why = "the inputs marked in Messages need fixing" if (ed.problems or ed.entry_errors) else \
                "the last solve failed (see Messages)"
            self.banner.setText(f"Out of date — {why}. These numbers belong to an earlier input.")
        elif stale:
            self.banner.setText("No results yet — the inputs marked in Messages need fixing.")
        self.banner.setVisible(stale)
        for t in (self.points, self.components, self.totals):
            t.setProperty("stale", stale)
            t.style().unpolish(t)
            t.style().polish(t)
        self._headers(system)
        if r is None:
            for t in (self.points, self.components, self.totals):
                t.setRowCount(0)
            return
        self._fill_points(r, system)
        self._fill_components(r, system)
        self._fill_totals(r, system)
        self._show_moist(is_moist(r))
        exchangers = any((st["cooler"] or {}).get("ua_W_K") for st in r["stages"])
        for col, (key, *_rest) in enumerate(COMPONENT_COLUMNS, 1):
            if key in EXCHANGER_COLUMNS:
                self.components.setColumnHidden(col, not exchangers)
        for t in (self.points, self.components, self.totals):
            t.fit_columns()

    def _show_moist(self, moist: bool) -> None:
        """Humidity columns and water totals only where there is water to speak of."""
        for col, (key, *_rest) in enumerate(POINT_COLUMNS, 1):
            self.points.setColumnHidden(col, key in MOIST_POINT_COLUMNS and not moist)
        for col, (key, *_rest) in enumerate(COMPONENT_COLUMNS, 1):
            self.components.setColumnHidden(col, key in MOIST_COMPONENT_COLUMNS and not moist)
        for row, (key, *_rest) in enumerate(TOTALS):
            self.totals.setRowHidden(row, key in MOIST_TOTALS and not moist)

    def _pressure_kw(self) -> dict:
        return {"gauge": self.editor.prefs.gauge, "barometric_Pa": self.editor.barometric_Pa()}

    def _headers(self, system: str) -> None:
        def head(name: str, q: str, **kw) -> str:  # name over unit keeps the columns narrow
            sym = units.unit(q, system, **kw).symbol
            return f"{name}\n[{sym}]" if sym else f"{name}\n"
        heads = ["Point\n"]
        for key, name, q, _ in POINT_COLUMNS:
            heads.append(head(name, q, **(self._pressure_kw() if q == "pressure" else {})))
        self.points.setHorizontalHeaderLabels(heads)
        self.components.setHorizontalHeaderLabels(
            ["Component\n"] + [head(name, q) for _, name, q in COMPONENT_COLUMNS])

    def _points_of(self, r: dict) -> list[tuple[str, str, dict]]:
        rows = [("intake", "Site intake", r["intake"]), ("filter", "After intake filter", r["inlet_filter"]["outlet"])]
        n = len(r["stages"])
        for i, st in enumerate(r["stages"], 1):
            rows.append((f"stage-{i}", f"Stage {i} discharge", st["outlet"]))
            if st["cooler"]:
                name = "Aftercooler outlet" if i == n else f"Intercooler {i} outlet"
                rows.append((f"cooler-{i}", name, st["cooler"]["outlet"]))
        return rows

    def _fill_points(self, r: dict, system: str) -> None:
        rows = self._points_of(r)
        self.points.setRowCount(len(rows))
        self._row_keys["points"] = [k for k, _, _ in rows]
        hot = {f"stage-{i + 1}" for i in self._over_limit(r)}
        for row, (key, label, p) in enumerate(rows):
            self._set(self.points, row, 0, label, left=True)
            for col, (ck, _, q, get) in enumerate(POINT_COLUMNS, 1):
                kw = self._pressure_kw() if q == "pressure" else {}
                item = self._set(self.points, row, col, units.format_value(get(p), q, system, **kw))
                flagged = key in hot and ck == "T"
                item.setBackground(QColor(WARNING_BG) if flagged else QBrush())
                item.setToolTip("Above this stage's discharge temperature limit (see Messages)" if flagged else "")

    @staticmethod
    def _over_limit(r: dict) -> set[int]:
        """Stages whose discharge-temperature warning the result carries (0-based)."""
        out = set()
        for w in r.get("warnings", []):
            i = stage_index(w.get("field", ""))
            if i is not None and w["field"].endswith("max_discharge_temperature_K"):
                out.add(i)
        return out

    def _fill_components(self, r: dict, system: str) -> None:
        f = r["inlet_filter"]
        rows = [("filter", "Intake filter", {"sgen": f["entropy_generation_W_K"], "xdest": f["exergy_destroyed_W"]})]
        n = len(r["stages"])
        for i, st in enumerate(r["stages"], 1):
            rows.append((f"stage-{i}", f"Stage {i}", {
                "ratio": st["pressure_ratio"], "power": st["shaft_power_W"],
                "heat": st["heat_loss_W"] + st["mechanical_loss_W"],
                "eta_s": st["isentropic_efficiency"], "eta_p": st["polytropic_efficiency"],
                "sgen": st["entropy_generation_W_K"], "xdest": st["exergy_destroyed_W"]}))
            c = st["cooler"]
            if c:
                rows.append((f"cooler-{i}", "Aftercooler" if i == n else f"Intercooler {i}", {
                    "heat": c["duty_W"], "sgen": c["entropy_generation_W_K"], "xdest": c["exergy_destroyed_W"],
                    "latent": c.get("latent_duty_W"), "condensate": c.get("condensate_kg_s"),
                    "ua": c.get("ua_W_K"), "lmtd": c.get("lmtd_K"), "coolant": c.get("coolant_flow_kg_s"),
                    "coolant_out": c.get("coolant_outlet_temperature_K")}))
        rows.append(("total", "Whole train", {"power": r["shaft_power_W"], "heat": r["heat_rejected_W"],
                                              "sgen": r["entropy_generation_W_K"], "xdest": r["exergy_destroyed_W"],
                                              "condensate": r.get("condensate_kg_s")}))
        self.components.setRowCount(len(rows))
        self._row_keys["components"] = [k for k, _, _ in rows]
        for row, (key, label, vals) in enumerate(rows):
            bold = key == "total"
            self._set(self.components, row, 0, label, left=True, bold=bold)
            for col, (ck, _, q) in enumerate(COMPONENT_COLUMNS, 1):
                v = vals.get(ck)
                self._set(self.components, row, col, "" if v is None else units.format_value(v, q, system), bold=bold)

    def _fill_totals(self, r: dict, system: str) -> None:
        self.totals.setRowCount(len(TOTALS))
        self._row_keys["totals"] = [k for k, _, _ in TOTALS]
        for row, (key, label, q) in enumerate(TOTALS):
            v = r.get(key)
            if q is None:
                text = "—" if v is None else f"{v:.2e}"
            elif q == "text":
                text = "—" if v is None else str(v)
            else:
                text = units.format_value(v, q, system, with_unit=True)
            self._set(self.totals, row, 0, label, left=True).setToolTip(TOTAL_TIPS.get(key, ""))
            negative = isinstance(v, (int, float)) and v < 0.0
            self._set(self.totals, row, 1, text).setToolTip(NEGATIVE_TIPS.get(key, "") if negative else "")

    @staticmethod
    def _set(table: QTableWidget, row: int, col: int, text: str, left: bool = False,
             bold: bool = False) -> QTableWidgetItem:
        item = table.item(row, col)
        if item is None:
            item = QTableWidgetItem()
            table.setItem(row, col, item)
        item.setText(text)
        item.setTextAlignment((Qt.AlignLeft if left else Qt.AlignRight) | Qt.AlignVCenter)
        if bold != item.font().bold():
            font = item.font()
            font.setBold(bold)
            item.setFont(font)
        return item
