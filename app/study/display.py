"""What the staging-study panel shows: table columns and cells, limit messages, case names.

Qt-free. Rows are those of :meth:`stagewright.core.study.StagingComparison.rows` (SI floats, unit in
each key); the columns are the figures of :data:`stagewright.gui.presentation.staging_table.STAGING` that
show in the window, and every number is shown through :mod:`stagewright.gui.presentation.units`, so the
table follows the window's SI / US switch. Limit messages name the project's own field (every
stage of an option is a copy of the project's first stage), so clicking one shows that field.
"""
from __future__ import annotations

__all__ = ["Column", "COLUMNS", "columns", "header", "cells", "tooltip", "limit_summary", "limit_messages",
           "case_label", "VARIABLES", "parse_values", "format_values"]

import re
from dataclasses import dataclass

from stagewright.gui.presentation import staging_table, units
from stagewright.gui.presentation.cautions import CAUTIONS
from stagewright.gui.presentation.figures import Figure, shown
from stagewright.gui.document.messages import limit_sentence, limit_short
from stagewright.gui.study.apply import project_field

_CAUTION = dict(CAUTIONS)
_OUT = "window"


@dataclass(frozen=True)
class Column:
    """A column of the study table: the window's view of a figure of the staging table."""

    key: str
    name: str
    quantity: str | None = None  #: display quantity of the unit in the header; None: no unit
    tip: str = ""
    figure: Figure | None = None


def columns() -> list[Column]:
    """The study table's columns: the staging table's figures that the window shows, in order."""
    return [Column(f.id, f.label_in(_OUT), None if f.style in ("text", "yes_no") else f.quantity, f.note, f)
            for f in shown(staging_table.STAGING, _OUT)]


#: the study table's columns as the staging table stood at import (the deciding numbers first:
#: a narrow panel shows them without scrolling)
COLUMNS = columns()

#: sensitivity variable -> (label, display quantity)
VARIABLES = {"ambient_temperature_K": ("Ambient temperature", "temperature"),
             "relative_humidity": ("Relative humidity", "fraction")}


def header(col: Column, system: str) -> str:
    """Column header: name over unit (``"Driver power\\n[kW]"``)."""
    if col.quantity is None:
        return f"{col.name}\n"
    sym = units.unit(col.quantity, system).symbol
    return f"{col.name}\n[{sym}]" if sym else f"{col.name}\n"


def cells(row: dict, system: str) -> dict[str, str]:
    """Text of every column of one comparison row, in display units (binding limits summed up
    by :func:`limit_summary`)."""
    return {col.key: limit_summary(row, system) if col.key == "limits" else col.figure.text(row, _OUT, system)
            for col in columns()}


def tooltip(row: dict, key: str, system: str) -> str:
    """Extra detail for a cell (duty split, yearly energy, limit messages)."""
    f = units.format_value
    if key == "heat" and row.get("intercooler_duty_W") is not None:
        inter = [f(q, "heat_flow", system, True) for q in row["intercooler_duty_W"]]
        parts = [f"intercooler {i + 1}: {q}" for i, q in enumerate(inter) if q != "—"]
        parts.append(f"aftercooler: {f(row.get('aftercooler_duty_W'), 'heat_flow', system, True)}")
        return "Cooler duties — " + ", ".join(parts)
    if key in ("saving", "saving_year") and row.get("saving_kWh_per_year") is not None:
        return (f"{row['saving_kWh_per_year']:,.0f} kWh per year at {row['operating_hours_per_year']:g} h per year "
                f"and {row['energy_price_per_kWh']:g} per kWh").replace(",", " ")
    if key in ("limits", "feasible") and row.get("binding_limits"):
        return "\n".join(_message(b, row["stages"], system, {}) for b in row["binding_limits"])
    if key == "temperatures" and row.get("max_discharge_temperature_K") is not None:
        return f"Highest: {f(row['max_discharge_temperature_K'], 'temperature', system, True)}"
    return ""


def _kind(field: str) -> str:
    for suffix, kind in (("max_discharge_temperature_K", "temperature"), ("min_pressure_ratio", "min_ratio"),
                         ("max_pressure_ratio", "max_ratio"), ("cooler.approach_K", "approach")):
        if field.endswith(suffix):
            return kind
    if ".cooler." in field:
        return "cooler"
    return "pressure" if field == "discharge_pressure_Pa" else "other"


_SHORT = {"temperature": "discharge-temperature limit", "min_ratio": "lowest pressure ratio",
          "max_ratio": "highest pressure ratio", "approach": "cooler approach", "cooler": "cooler outlet",
          "pressure": "discharge pressure", "other": "solve"}


def limit_summary(row: dict, system: str = "SI") -> str:
    """Short text of a row's binding limits: ``"discharge-temperature limit active"``; a limit
    not met names the value and the limit in display units (``"Stage 1 discharge 346 °C >
    200 °C limit"``)."""
    out = []
    for b in row.get("binding_limits") or []:
        violated = b.get("status") == "violated"
        if violated and _kind(b.get("field", "")) == "temperature" and isinstance(b.get("value"), (int, float)):
            text = limit_short(b, None, system)
        else:
            text = f"{_SHORT[_kind(b.get('field', ''))]} {'not met' if violated else 'active'}"
        if text not in out:
            out.append(text)
    return "; ".join(out) if out else "—"


def _message(b: dict, n: int, system: str, pkw: dict) -> str:
    """One binding limit of the ``n``-stage option as a sentence in display units."""
    kind, field = _kind(b.get("field", "")), b.get("field", "")
    m = re.match(r"^stages\[(\d+)\]", field)
    i = int(m.group(1)) if m else 0
    lim, val, need = b.get("limit"), b.get("value"), b.get("closest_feasible")
    active = b.get("status") != "violated"
    opt = f"{n}-stage option"

    def t(x, q="temperature"):
        return units.format_value(x, q, system, True)

    cooler = "aftercooler" if i == n - 1 else f"intercooler {i + 1}"
    if kind == "temperature" and isinstance(lim, (int, float)):
        if active:
            return f"{opt}: stage {i + 1} is held at its discharge-temperature limit of {t(lim)}."
        return (f"{opt} exceeds the discharge-temperature limit of {t(lim)}: its best split still "
                f"discharges {t(val)} from stage {i + 1}. Add stages.")
    if kind in ("cooler", "approach") and isinstance(val, (int, float)):
        if active:
            return f"{opt}: stage {i + 1} discharges just at its {cooler}'s outlet temperature, {t(val)}."
        if kind == "approach":
            what = f"outlet at an approach of {t(lim, 'temperature_difference')}"
            fix = f"an approach of at most {t(need, 'temperature_difference')}"
        else:
            what = f"outlet temperature of {t(lim)}"
            fix = f"a cooler outlet of at most {t(need)}"
        return (f"{opt} is not possible: stage {i + 1} discharges at most {t(val)}, below its {cooler}'s {what} "
                f"(a cooler cannot heat the air). Use fewer stages or {fix}.")
    if kind in ("min_ratio", "max_ratio") and isinstance(lim, (int, float)):
        which = "lowest" if kind == "min_ratio" else "highest"
        if active:
            return f"{opt}: stage {i + 1} is held at its {which} pressure ratio of {lim:.4g}."
        if kind == "max_ratio" and isinstance(need, (int, float)):
            return (f"{opt}: a highest pressure ratio of {lim:.4g} cannot reach the discharge pressure; "
                    f"at least {need:.4f} is needed (or add stages).")
        if isinstance(need, (int, float)):
            return (f"{opt}: a lowest pressure ratio of {lim:.4g} overshoots the discharge pressure; "
                    f"at most {need:.4f} is needed (or use fewer stages).")
    if kind == "pressure" and isinstance(lim, (int, float)) and isinstance(need, (int, float)):
        p = lambda x: units.format_value(x, "pressure", system, True, **pkw)  # noqa: E731
        if need < lim:
            return (f"{opt} cannot reach the discharge pressure of {p(lim)}: within its stage-ratio range it "
                    f"delivers at most {p(need)}; add stages.")
        return (f"{opt} overshoots the discharge pressure of {p(lim)}: even at its smallest stage ratios it "
                f"delivers at least {p(need)}; use fewer stages.")
    if b.get("detail") or b.get("message"):
        text = limit_sentence(b, None, system, **pkw)
        return f"{opt}: {text[:1].upper() + text[1:]}"
    return f"{opt}: limits not met."


def limit_messages(rows: list[dict], project_stages: int, system: str = "SI", *, gauge: bool = False,
                   barometric_Pa: float = 101_325.0, prefix: str = "") -> list[tuple[str, str, str]]:
    """Binding and violated limits of a comparison as ``(severity, text, project field)``.

    Violated limits (and options that miss their limits for another reason) are warnings;
    active limits are notes. A caution follows when a discharge-temperature limit decides a
    split or condensate forms.
    """
    pkw = {"gauge": gauge, "barometric_Pa": barometric_Pa}
    out: list[tuple[str, str, str]] = []
    cautions = []
    for row in rows:
        n = row["stages"]
        violated = False
        for b in row.get("binding_limits") or []:
            sev = "warning" if b.get("status") == "violated" else "note"
            violated |= sev == "warning"
            item = (sev, prefix + _message(b, n, system, pkw), project_field(b.get("field", ""), n, project_stages))
            if item not in out:
                out.append(item)
            if _kind(b.get("field", "")) == "temperature":
                cautions.append("Discharge temperature")
        if not row.get("feasible") and not violated:
            out.append(("warning", f"{prefix}{n}-stage option does not meet its limits.", ""))
        if (row.get("condensate_kg_s") or 0.0) > 0.0:
            cautions.append("Condensate disposal")
    for title in dict.fromkeys(cautions):
        out.append(("caution", f"Caution — {title.lower()}: {_CAUTION[title]}", ""))
    return out


def case_label(variable: str | None, value: float | None, system: str) -> str:
    """Name of one case of a sensitivity run: ``"Ambient temperature 35.00 °C"``."""
    if not variable:
        return "Project site"
    name, q = VARIABLES.get(variable, (variable, None))
    shown = units.format_value(value, q, system, True) if q else f"{value:g}"
    return f"{name} {shown}"


def parse_values(text: str, variable: str, system: str) -> list[float]:
    """Values typed in display units (separated by commas, semicolons or spaces) → SI.

    Raises
    ------
    ValueError
        Naming the piece that is not a number, or when there is none.

    Examples
    --------
    >>> parse_values("0, 20; 40", "ambient_temperature_K", "SI")
    [273.15, 293.15, 313.15]
    """
    q = VARIABLES[variable][1]
    pieces = [p for p in re.split(r"[,;\s]+", text.strip()) if p]
    if not pieces:
        raise ValueError("type one or more values, separated by commas")
    out = []
    for p in pieces:
        try:
            out.append(round(units.to_si(float(p), q, system), 12))
        except ValueError:
            raise ValueError(f"'{p}' is not a number") from None
    return out


def format_values(values: list[float], variable: str, system: str) -> str:
    """SI values as display text for the values field (``"5, 20, 35"``)."""
    u = units.unit(VARIABLES[variable][1], system)
    return ", ".join(f"{round(u.to_display(v), 6):g}" for v in values)
