r"""A load profile's year: hours at each load through the package's control.

.. math::  E = \sum_j P_{pkg}(x_j)\, t_j / 1000 \ \mathrm{[kWh]}, \qquad
           V = \sum_j x_j\, Q_c\, 3600\, t_j \ \mathrm{[m^3]}

at the conditions solved (the site as stated); the year at the site
(:mod:`stagewright.core.year`) does the same bin by bin at each bin's ambient.
"""
from __future__ import annotations

__all__ = ["AnnualFigures", "annual_figures"]

from dataclasses import asdict, dataclass

from stagewright.core.part_load.full_load import FullLoad
from stagewright.core.part_load.package import package_point


@dataclass(frozen=True)
class AnnualFigures:
    """Totals over a load profile (SI; energy in kWh)."""

    hours: float
    energy_kWh: float
    delivered_m3: float
    mean_power_W: float
    specific_power_J_m3: float | None  #: energy over delivered free air; None when nothing is delivered
    ideal_energy_kWh: float  #: the same hours with power in proportion to flow (the full-load specific power)

    def to_dict(self) -> dict:
        return asdict(self)


def annual_figures(package: dict, full: FullLoad, profile: list) -> AnnualFigures | None:
    """Energy and delivered air over ``profile`` (``[{"load": x, "hours": t}, …]``); None when empty.

    Parameters
    ----------
    package : dict
        The normalised ``package`` section.
    full : FullLoad
        Full-capacity figures at the site.
    profile : list of dict
        Load fraction [-] and hours [h] of each row.

    Returns
    -------
    AnnualFigures or None

    Examples
    --------
    >>> pkg = {"control": {"kind": "modulation", "zero_flow_power_fraction": 0.7},
    ...        "motor": {"rated_output_W": None, "fixed_loss_share": 0.0, "efficiency_points": []},
    ...        "fan_power_W": 0.0, "pump": None, "other_loads": []}
    >>> full = FullLoad(shaft_power_W=100_000.0, fad_m3_s=0.25, intake_pressure_Pa=1e5, driver_efficiency=1.0)
    >>> a = annual_figures(pkg, full, [{"load": 1.0, "hours": 1000.0}, {"load": 0.5, "hours": 1000.0}])
    >>> round(a.energy_kWh, 6), round(a.ideal_energy_kWh, 6)  # 100 kW · 1000 h + 85 kW · 1000 h
    (185000.0, 150000.0)
    """
    if not profile:
        return None
    hours = energy = volume = 0.0
    full_point = package_point(package, full, 1.0)
    ideal = 0.0
    for row in profile:
        p = package_point(package, full, row["load"])
        hours += row["hours"]
        energy += p.package_power_W * row["hours"] / 1000.0
        volume += p.delivered_fad_m3_s * 3600.0 * row["hours"]
        ideal += full_point.package_power_W * row["load"] * row["hours"] / 1000.0
    return AnnualFigures(hours=hours, energy_kWh=energy, delivered_m3=volume,
                         mean_power_W=energy * 1000.0 / hours if hours > 0.0 else 0.0,
                         specific_power_J_m3=energy * 3.6e6 / volume if volume > 0.0 else None,
                         ideal_energy_kWh=ideal)
