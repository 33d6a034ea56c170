"""The balance sheet as CSV for spreadsheets: one row per state point and per component.

Layout: a header row of column names, a units row, then data rows. The first column says
what the row is (``state``, ``component`` or ``train``). Numbers are written in the chosen
display units to 12 significant digits, so converting back with :func:`app.presentation.units.to_si`
returns the solver's SI values to 1e-12 relative; a missing value is an empty cell.
Written with the standard library's :mod:`csv` (RFC 4180 quoting, UTF-8).
"""
from __future__ import annotations

__all__ = ["COLUMNS", "csv_rows", "write_csv"]

import csv
import io

from app.presentation import units
from app.report.atomic import atomic_path
from app.report.sections import state_points

#: (column name, quantity of app.presentation.units or None for text, result key for state points)
COLUMNS = [
    ("kind", None), ("name", None),
    ("temperature", "temperature"), ("pressure", "pressure"), ("enthalpy", "specific_enthalpy"),
    ("entropy", "specific_entropy"), ("density", "density"), ("humidity_ratio", "ratio"),
    ("relative_humidity", "fraction"), ("dew_point", "temperature"),
    ("pressure_ratio", "ratio"), ("shaft_power", "power"), ("heat_rejected", "heat_flow"),
    ("condensate", "water_flow"), ("isentropic_efficiency", "ratio"), ("polytropic_efficiency", "ratio"),
    ("entropy_generation", "entropy_rate"), ("exergy_destroyed", "power"),
]

_POINT_KEYS = {"temperature": "temperature_K", "pressure": "pressure_Pa", "enthalpy": "enthalpy_J_kg",
               "entropy": "entropy_J_kgK", "density": "density_kg_m3", "humidity_ratio": "humidity_ratio",
               "relative_humidity": "relative_humidity", "dew_point": "dew_point_K"}


def _cell(value, quantity: str | None, system: str) -> str:
    if value is None:
        return ""
    if quantity is None:
        return str(value)
    return format(units.to_display(float(value), quantity, system), ".12g")


def csv_rows(result: dict, system: str = "SI") -> list[list[str]]:
    """Header row, units row and data rows of the CSV (strings, display units)."""
    header = [name for name, _ in COLUMNS]
    unit_row = ["", ""] + [units.unit(q, system).symbol or "-" for _, q in COLUMNS[2:]]
    records: list[dict] = []
    for name, pt in state_points(result):
        rec = {"kind": "state", "name": name}
        rec.update({col: pt.get(key) for col, key in _POINT_KEYS.items()})
        records.append(rec)
    f = result["inlet_filter"]
    records.append({"kind": "component", "name": "Intake filter",
                    "entropy_generation": f["entropy_generation_W_K"], "exergy_destroyed": f["exergy_destroyed_W"]})
    condensate_total = None
    for i, st in enumerate(result["stages"], 1):
        records.append({"kind": "component", "name": f"Stage {i}", "pressure_ratio": st["pressure_ratio"],
                        "shaft_power": st["shaft_power_W"],
                        "heat_rejected": st["heat_loss_W"] + st["mechanical_loss_W"],
                        "isentropic_efficiency": st["isentropic_efficiency"],
                        "polytropic_efficiency": st["polytropic_efficiency"],
                        "entropy_generation": st["entropy_generation_W_K"],
                        "exergy_destroyed": st["exergy_destroyed_W"]})
        c = st.get("cooler")
        if c:
            # condensate [kg/s] written as a water volume flow at 1 kg/L (L/s in SI)
            cond = c.get("condensate_kg_s")
            if cond is not None:
                condensate_total = (condensate_total or 0.0) + cond
            records.append({"kind": "component", "name": f"Cooler {i}", "heat_rejected": c["duty_W"],
                            "condensate": cond, "entropy_generation": c["entropy_generation_W_K"],
                            "exergy_destroyed": c["exergy_destroyed_W"]})
    records.append({"kind": "train", "name": "Train", "shaft_power": result["shaft_power_W"],
                    "heat_rejected": result["heat_rejected_W"], "condensate": condensate_total,
                    "entropy_generation": result["entropy_generation_W_K"],
                    "exergy_destroyed": result["exergy_destroyed_W"]})
    body = [[_cell(rec.get(name), q, system) for name, q in COLUMNS] for rec in records]
    return [header, unit_row] + body


def write_csv(result: dict, path, system: str = "SI") -> None:
    """Write the CSV to ``path`` atomically (a half-written file never replaces a good one)."""
    buf = io.StringIO()
    csv.writer(buf, lineterminator="\r\n").writerows(csv_rows(result, system))
    with atomic_path(path) as tmp:
        with open(tmp, "w", encoding="utf-8", newline="") as fh:
            fh.write(buf.getvalue())
