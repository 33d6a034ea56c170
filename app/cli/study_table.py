"""Plain-text table of a staging comparison for the command line (display units from stagewright.gui.presentation.units).

Its columns are those of :data:`stagewright.gui.presentation.staging_table.STAGING` that show in the ``"text"``
output, each as wide as its text :class:`~stagewright.gui.presentation.figures.Look` says (else two characters
wider than its header); text and lists are left-aligned and cut to that width.
"""
from __future__ import annotations

__all__ = ["format_comparison", "format_sensitivity"]

from stagewright.gui.presentation import staging_table
from stagewright.gui.presentation.cautions import CAUTIONS
from stagewright.gui.presentation.figures import Figure, shown
from stagewright.gui.presentation.units import format_value, unit

_OUT = "text"


def _width(fig: Figure) -> int:
    width = fig.look(_OUT).width
    return width if width is not None else len(fig.label_in(_OUT)) + 2


def _line(columns: list[Figure], cells: list[str]) -> str:
    out = []
    for fig, text in zip(columns, cells):
        width = _width(fig)
        if fig.is_left_aligned():
            out.append(f"{text if len(text) <= width else text[:width - 3] + '…':<{width}}")
        else:
            out.append(f"{text:>{width}}")
    return " ".join(out).rstrip()


def _units_line(columns: list[Figure], system: str) -> list[str]:
    return [f"[{sym}]" if (sym := fig.symbol_in(_OUT, system)) else "" for fig in columns]


def _stages(n: int) -> str:
    return f"{n} stage" if n == 1 else f"{n} stages"


def format_comparison(title: str, rows: list[dict], system: str = "SI") -> str:
    """Format the rows of a :class:`stagewright.core.study.StagingComparison` as an aligned table."""
    lines = [title or "(untitled project)",
             f"Staging study: 1 to {len(rows)} stages, each at its least-power pressure split", ""]
    note = rows[0]["note"] if rows else ""
    if note:
        lines += [note, ""]
    columns = shown(staging_table.STAGING, _OUT)
    lines.append(_line(columns, [fig.label_in(_OUT) for fig in columns]))
    lines.append(_line(columns, _units_line(columns, system)))
    for r in rows:
        mark = "" if r["feasible"] else "  ✗ limits not met"
        lines.append(_line(columns, [fig.text(r, _OUT, system) for fig in columns]) + mark)
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
    """Format the rows of a :class:`stagewright.core.study.SensitivityStudy`: one table per value."""
    blocks = []
    for p in points:
        head = f"{title or '(untitled project)'} — {p['variable']} = {p['value']:g}"
        if p["options"] is None:
            blocks.append(f"{head}\n  not solved: {p['error']}")
        else:
            blocks.append(format_comparison(head, p["options"], system))
    return "\n\n".join(blocks)
