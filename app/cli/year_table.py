"""Plain-text table of a year at the site for ``stagewright year`` (SI units, °C for reading)."""
from __future__ import annotations

__all__ = ["format_year"]


def format_year(title: str, y: dict) -> str:
    """Format ``YearResult.to_dict()`` as an aligned month-by-month (bin-by-bin) table."""
    lines = [title or "(untitled project)", "a year at the site", ""]
    lines.append(f"{'bin':<12}{'T [°C]':>8}{'RH':>6}{'hours':>8}{'power [kW]':>12}{'energy [MWh]':>14}"
                 f"{'duty [kW]':>11}{'t_max [°C]':>12}{'condens. [m³]':>15}{'water [m³]':>12}{'recov. [MWh]':>14}")
    for b in y["bins"]:
        lines.append(f"{b['label']:<12}{b['temperature_K'] - 273.15:8.1f}{b['relative_humidity']:6.2f}"
                     f"{b['hours']:8.0f}{b['driver_power_W'] / 1e3:12.2f}{b['energy_kWh'] / 1e3:14.3f}"
                     f"{b['cooler_duty_W'] / 1e3:11.2f}{b['max_discharge_temperature_K'] - 273.15:12.1f}"
                     f"{b['condensate_m3']:15.3f}{b['cooling_water_m3']:12.1f}{b['recoverable_heat_kWh'] / 1e3:14.3f}")
    t = y["totals"]
    lines += ["", f"operating hours          {t['hours']:14.0f} h",
              f"energy                   {t['energy_kWh']:14.0f} kWh",
              f"energy cost              {t['energy_cost']:14.2f}",
              f"condensate               {t['condensate_m3']:14.3f} m³",
              f"cooling water            {t['cooling_water_m3']:14.1f} m³ (once-through volume)",
              f"glycol circulated        {t['glycol_circulated_m3']:14.1f} m³",
              f"cooling-water cost       {t['water_cost']:14.2f}",
              f"recoverable heat         {t['recoverable_heat_kWh']:14.0f} kWh",
              f"value of recovered heat  {t['recovered_value']:14.2f}",
              f"net cost                 {t['cost']:14.2f}",
              f"worst discharge temperature: {y['worst_discharge_temperature']['bin']} "
              f"({y['worst_discharge_temperature']['temperature_K'] - 273.15:.1f} °C)",
              f"largest cooler duty: {y['worst_cooler_duty']['bin']} "
              f"({y['worst_cooler_duty']['duty_W'] / 1e3:.2f} kW)"]
    return "\n".join(lines)
