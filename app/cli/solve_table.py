"""Readable plain-text table of a solved train for the command line (SI units)."""
from __future__ import annotations

__all__ = ["format_result"]


def _c(T: float) -> str:
    return f"{T - 273.15:8.2f}"


def format_result(title: str, r: dict) -> str:
    """Format the ``to_dict()`` of a train result as an aligned text table."""
    lines = [title or "(untitled project)", f"property model: {r['model']} — {r['eos_reference']}", ""]
    lines.append(f"{'point':<22}{'T [°C]':>9}{'p [kPa]':>11}{'h [kJ/kg]':>11}{'s [kJ/kgK]':>12}")
    rows = [("intake", r["intake"]), ("after filter", r["inlet_filter"]["outlet"])]
    for i, st in enumerate(r["stages"], 1):
        rows.append((f"stage {i} discharge", st["outlet"]))
        if st["cooler"]:
            rows.append((f"cooler {i} outlet", st["cooler"]["outlet"]))
    for name, p in rows:
        lines.append(f"{name:<22}{_c(p['temperature_K']):>9}{p['pressure_Pa'] / 1e3:11.2f}"
                     f"{p['enthalpy_J_kg'] / 1e3:11.3f}{p['entropy_J_kgK'] / 1e3:12.5f}")
    lines.append("")
    lines.append(f"{'component':<22}{'power [kW]':>11}{'duty [kW]':>11}{'ηs':>8}{'ηp':>8}"
                 f"{'S_gen [W/K]':>13}{'X_dest [kW]':>13}")
    f = r["inlet_filter"]
    lines.append(f"{'intake filter':<22}{'':>11}{'':>11}{'':>8}{'':>8}{f['entropy_generation_W_K']:13.3f}"
                 f"{f['exergy_destroyed_W'] / 1e3:13.3f}")
    for i, st in enumerate(r["stages"], 1):
        label = f"stage {i} (r={st['pressure_ratio']:.3f})"
        lines.append(f"{label:<22}{st['shaft_power_W'] / 1e3:11.3f}"
                     f"{(st['heat_loss_W'] + st['mechanical_loss_W']) / 1e3:11.3f}"
                     f"{st['isentropic_efficiency']:8.4f}{st['polytropic_efficiency']:8.4f}"
                     f"{st['entropy_generation_W_K']:13.3f}{st['exergy_destroyed_W'] / 1e3:13.3f}")
        c = st["cooler"]
        if c:
            lines.append(f"{f'cooler {i}':<22}{'':>11}{c['duty_W'] / 1e3:11.3f}{'':>8}{'':>8}"
                         f"{c['entropy_generation_W_K']:13.3f}{c['exergy_destroyed_W'] / 1e3:13.3f}")
    lines.append("")
    totals = [
        ("mass flow", r["mass_flow_kg_s"], "kg/s"),
        ("free air delivery", r["free_air_delivery_m3_s"] * 60.0, "m³/min"),
        ("shaft power", r["shaft_power_W"] / 1e3, "kW"),
        ("driver input power", r["driver_power_W"] / 1e3, "kW"),
        ("specific power", r["specific_power_kW_per_m3_min"], "kW/(m³/min)"),
        ("heat rejected", r["heat_rejected_W"] / 1e3, "kW"),
        ("isothermal power", r["isothermal_power_W"] / 1e3, "kW"),
        ("isothermal efficiency", r["isothermal_efficiency"], ""),
        ("second-law efficiency", r["second_law_efficiency"], ""),
        ("entropy generation", r["entropy_generation_W_K"], "W/K"),
        ("exergy destroyed", r["exergy_destroyed_W"] / 1e3, "kW"),
    ]
    for name, value, unit in totals:
        lines.append(f"{name:<24}{value:14.4f} {unit}")
    lines.append(f"{'energy balance residual':<24}{r['energy_residual']:14.2e}")
    lines.append(f"{'exergy balance residual':<24}{r['exergy_residual']:14.2e}")
    for w in r["warnings"]:
        lines.append(f"warning: {w['message']} ({w['field']})")
    return "\n".join(lines)
