"""The report's first page: what a client reads first.

The project and who prepared the report with which versions of Stagewright and CoolProp; the
site and the duty in one line each; the answer (:data:`stagewright.gui.presentation.balance_tables.KEY_FIGURES` shown in the PDF:
power, specific power, heat, cooling water, condensate, dew point); each stage and cooler in one
row (:data:`~stagewright.gui.presentation.summary_table.SUMMARY_TRAIN`); and the warnings. The full inputs
and balance sheet start on the next page. No Qt.
"""
from __future__ import annotations

__all__ = ["summary_page", "site_text", "duty_text"]

from stagewright.core.project.delivery import delivery_pressure
from stagewright.core.project.validation import normalise

from stagewright.gui.presentation import balance_tables, summary_table, units
from stagewright.gui.presentation.figures import condition_holds, shown
from stagewright.gui.report.layout import Column, Pager, Table
from stagewright.gui.report.sections import ReportInfo, warnings

_PDF = "pdf"
_DASH = "—"
_FLOW_WORDS = {"mass": ("mass flow", "mass_flow"), "free_air_delivery": ("free air delivery", "volume_flow"),
               "normal_volume": ("normal volume flow (0 °C, 101.325 kPa)", "volume_flow"),
               "shaft_power": ("shaft power", "power")}


def _with(si, quantity: str, system: str, **kw) -> str:
    return units.format_value(si, quantity, system, with_unit=True, **kw) if si is not None else _DASH


def site_text(doc: dict, result: dict, system: str) -> str:
    """``15.00 °C, 60.00 % relative humidity (dew point 7.31 °C), 0.9847 bar(a) (240 m above sea level)``."""
    site = normalise(doc)["site"]
    intake = result["intake"]
    if result.get("intake_humidity_ratio"):
        humidity = (f"{units.format_value(intake['relative_humidity'], 'fraction', system)} % relative humidity "
                    f"(dew point {_with(intake['dew_point_K'], 'temperature', system)})")
    else:
        humidity = "dry air (no humidity given)"
    parts = [_with(site["ambient_temperature_K"], "temperature", system), humidity,
             _with(result["barometric_pressure_Pa"], "pressure", system)]
    if site.get("barometric_pressure_Pa") is None and site.get("elevation_m") is not None:
        parts[-1] += f" ({_with(site['elevation_m'], 'length', system)} above sea level)"
    return ", ".join(parts)


def duty_text(doc: dict, result: dict, system: str) -> str:
    """``30.000 m³/min free air delivery to 10.0163 bar(g) in 3 stages``."""
    norm = normalise(doc)
    kind = norm["flow"]["kind"]
    words, quantity = _FLOW_WORDS[kind]
    value = _with(norm["flow"]["value"], quantity, system)
    if kind == "shaft_power":
        found = _with(result["free_air_delivery_m3_s"], "volume_flow", system)
        flow = f"the flow that a shaft power of {value} moves ({found} free air delivery)"
    else:
        flow = f"{value} {words}"
    p0 = result["barometric_pressure_Pa"]
    p_out = _with(delivery_pressure(norm, p0), "pressure", system, gauge=True, barometric_Pa=p0)
    n = len(norm["stages"])
    return f"{flow}, delivered at {p_out}, in {n} stage{'s' if n != 1 else ''}"


def _key_values(rows: list[list[str]], title: str = "") -> Table:
    return Table(title, [Column("", align="left"), Column("", align="left", wrap=True)], rows, header=False)


def _two_pairs(items: list[list[str]], title: str = "") -> Table:
    """``(label, value)`` items as a key–value list in two column pairs, the left one read first."""
    half = (len(items) + 1) // 2
    left, right = items[:half], items[half:] + [["", ""]] * (2 * half - len(items))
    cols = [Column("", align="left"), Column("", align="left", wrap=True)] * 2
    return Table(title, cols, [a + b for a, b in zip(left, right)], header=False, pairs=2)


def _prepared(info: ReportInfo, result: dict) -> list[list[str]]:
    program = f"Stagewright {info.version}" + (f", CoolProp {info.coolprop}" if info.coolprop else "")
    return [["Prepared by", info.prepared_by or _DASH],
            ["Program", program],
            ["Project file", info.source_name or _DASH],
            ["Date", info.date],
            ["Property model", result["model"].replace("_", " ")],
            ["Display units", "SI" if info.system == "SI" else "US customary"]]


def _train_rows(result: dict) -> list[tuple[str, str, dict]]:
    rows = []
    for i, st in enumerate(result["stages"], 1):
        rows.append((f"Stage {i}", "stage", st))
        if st.get("cooler"):
            rows.append((f"Cooler {i}", "cooler", st["cooler"]))
    return rows


def _train_table(result: dict, system: str) -> Table:
    rows = _train_rows(result)
    figures = [f for f in summary_table.SUMMARY_TRAIN
               if condition_holds(f, _PDF, result, [(kind, row) for _, kind, row in rows])]
    pressure = {"barometric_Pa": result["barometric_pressure_Pa"]}
    cols = [Column("", align="left")] + [Column(f.label_in(_PDF), f.symbol_in(_PDF, system, **pressure))
                                         for f in figures]
    body = [[name] + [f.text(row, _PDF, system, kind=kind, missing="", **pressure) for f in figures]
            for name, kind, row in rows]
    return Table("Stages and coolers", cols, body)


def summary_page(p: Pager, doc: dict, result: dict, info: ReportInfo) -> None:
    """Print the first page and start the next one."""
    system = info.system
    p.title(doc.get("title") or "Untitled project", doc.get("note", ""))
    p.table(_two_pairs(_prepared(info, result)))
    p.table(_key_values([["Site", site_text(doc, result, system)], ["Duty", duty_text(doc, result, system)]],
                        "Site and duty"))
    figures = [f for f in shown(balance_tables.KEY_FIGURES, _PDF) if condition_holds(f, _PDF, result)]
    table = _two_pairs([[f.label_in(_PDF), f.text(result, _PDF, system, with_unit=True)] for f in figures], "Result")
    table.note = " ".join(f"{f.label_in(_PDF)}: {f.note}." for f in figures if f.note)
    p.table(table)
    p.table(_train_table(result, system))
    warnings(p, result, system, doc)
    p.new_page()
