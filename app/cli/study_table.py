"""Plain-text table of a staging comparison for the command line (display units from app.presentation.units)."""
from __future__ import annotations

__all__ = ["format_comparison", "format_sensitivity"]

from app.presentation.cautions import CAUTIONS
from app.presentation.units import format_value, unit

_COLUMNS = (  # header, width
    ("stages", 7), ("pressure ratios", 34), ("max T2", 9), ("driver", 9), ("specific", 14),
    ("coolers", 9), ("condensate", 11), ("X_dest", 8), ("η_II", 7), ("saving", 8), ("per year", 11),
)


def _units_line(system: str) -> list[str]:
    return ["", "", f"[{unit('temperature', system).symbol}]", f"[{unit('power', system).symbol}]",
            f"[{unit('specific_power', system).symbol}]", f"[{unit('heat_flow', system).symbol}]",
            f"[{unit('water_flow', system).symbol}]", f"[{unit('power', system).symbol}]",
            f"[{unit('fraction', system).symbol}]", f"[{unit('power', system).symbol}]", "[cost]"]


def _line(cells: list[str]) -> str:
    out = []
    for (name, width), text in zip(_COLUMNS, cells):
        out.append(f"{text:<{width}}" if name in ("stages", "pressure ratios") else f"{text:>{width}}")
    return " ".join(out).rstrip()


def _ratios(r: list | None) -> str:
    if not r:
        return "—"
    text = " × ".join(f"{x:.3f}" for x in r)
    return text if len(text) <= 34 else text[:31] + "…"


def _stages(n: int) -> str:
    return f"{n} stage" if n == 1 else f"{n} stages"


def _money(x: float | None) -> str:
    return "—" if x is None else f"{x:,.0f}".replace(",", " ")


def format_comparison(title: str, rows: list[dict], system: str = "SI") -> str:
    """Format the rows of a :class:`thermo.study.StagingComparison` as an aligned table."""
    lines = [title or "(untitled project)",
             f"Staging study: 1 to {len(rows)} stages, each at its least-power pressure split", ""]
    note = rows[0]["note"] if rows else ""
    if note:
        lines += [note, ""]
    lines.append(_line([c[0] for c in _COLUMNS]))
    lines.append(_line(_units_line(system)))
    for r in rows:
        mark = "" if r["feasible"] else "  ✗ limits not met"
        lines.append(_line([
            str(r["stages"]), _ratios(r["pressure_ratios"]),
            format_value(r["max_discharge_temperature_K"], "temperature", system),
            format_value(r["driver_power_W"], "power", system),
            format_value(r["specific_power_kW_per_m3_min"], "specific_power", system),
            format_value(r["cooler_duty_W"], "heat_flow", system),
            format_value(r["condensate_kg_s"], "water_flow", system),
            format_value(r["exergy_destroyed_W"], "power", system),
            format_value(r["second_law_efficiency"], "fraction", system),
            format_value(r["saving_W"], "power", system),
            _money(r["saving_cost_per_year"]),
        ]) + mark)
    lines += ["", "Limits that decide the split:"]
    any_limit = False
    for r in rows:
        for b in r["binding_limits"]:
            any_limit = True
            tag = "NOT MET" if b["status"] == "violated" else "active"
            lines.append(f"  {_stages(r['stages'])}, {tag}: {b['field']} — {b['message']}")
    if not any_limit:
        lines.append("  none (every option is at its unconstrained optimum)")
    t_unit = unit("temperature", system).symbol
    lines += ["", f"Stage ratios (discharge temperature [{t_unit}]):"]
    for r in rows:
        if r["discharge_temperatures_K"] is None:
            continue
        parts = [f"{x:.4f} ({format_value(t, 'temperature', system)})"
                 for x, t in zip(r["pressure_ratios"], r["discharge_temperatures_K"])]
        lines.append(f"  {_stages(r['stages'])}: " + ", ".join(parts))
    lines += ["", f"Cooler duty split [{unit('heat_flow', system).symbol}] (intercoolers, then aftercooler):"]
    for r in rows:
        if r["intercooler_duty_W"] is None:
            continue
        parts = [format_value(q, "heat_flow", system) for q in r["intercooler_duty_W"]]
        after = format_value(r["aftercooler_duty_W"], "heat_flow", system)
        lines.append(f"  {_stages(r['stages'])}: " + " + ".join(parts + [f"{after} (after)"]))
    base = next((r for r in rows if r["feasible"]), None)
    hours = rows[0]["operating_hours_per_year"] if rows else 0.0
    price = rows[0]["energy_price_per_kWh"] if rows else 0.0
    lines.append("")
    if base is None:
        lines.append("No option meets every limit, so no saving is given.")
    else:
        lines.append(f"Savings are against the {base['stages']}-stage option (the fewest stages that meet every "
                     f"limit), at {hours:g} operating hours per year and {price:g} per kWh "
                     "(set them with --hours and --price).")
    title_t, text_t = next(c for c in CAUTIONS if c[0] == "Discharge temperature")
    lines += ["", f"Caution — {title_t}: {text_t}"]
    return "\n".join(lines)


def format_sensitivity(title: str, points: list[dict], system: str = "SI") -> str:
    """Format the rows of a :class:`thermo.study.SensitivityStudy`: one table per value."""
    blocks = []
    for p in points:
        head = f"{title or '(untitled project)'} — {p['variable']} = {p['value']:g}"
        if p["options"] is None:
            blocks.append(f"{head}\n  not solved: {p['error']}")
        else:
            blocks.append(format_comparison(head, p["options"], system))
    return "\n\n".join(blocks)
