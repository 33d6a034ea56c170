"""Presentation tables of the package (``TrainResult.to_dict()["package"]``) and its data sheet.

* :data:`PACKAGE_POINT` — the figures of the package at one demand (paths into a point dict of
  :class:`stagewright.core.part_load.package.PackagePoint`): delivered air, driver input, the auxiliaries
  split, package input and specific power, loaded share, cycles and starts per hour.
* :data:`PACKAGE_ANNUAL` — the load profile's year (paths into :func:`annual_view`).
* :data:`SHEET_POINT` and :data:`SHEET_CONDITIONS` — the data sheet
  (:func:`stagewright.core.part_load.data_sheet.data_sheet`): per load, free air delivery, package input and
  package specific power at the ISO 1217 reference conditions and at the site.

The window's package panel (:mod:`stagewright.gui.package.panel`), ``stagewright solve``'s text
(:mod:`stagewright.gui.cli.solve_table`), the PDF report (:mod:`stagewright.gui.report.package_section`) and the CSV
(:mod:`stagewright.gui.report.csv_export`) read these rows. The core keeps specific power in J/m³ (W per
m³/s); those figures carry ``to_si`` into the display basis of ``specific_power``
(kW/(m³/min): 1 kW/(m³/min) = 60 000 J/m³), and energies in kWh carry ``to_si=3.6e6``. A figure
the project has nothing to show for (a drive loss without a variable-speed drive, a pump
without a ``pump``, starts without start/stop) is left out (:func:`point_figures`). No Qt.
"""
from __future__ import annotations

__all__ = ["PACKAGE_POINT", "PACKAGE_ANNUAL", "SHEET_POINT", "SHEET_CONDITIONS", "J_M3", "point_figures",
           "point_columns", "point_rows", "annual_view", "annual_rows", "control_line", "sheet_headers",
           "sheet_rows", "sheet_condition_rows", "sheet_condition_lines", "load_name"]

from stagewright.gui.presentation.figures import Figure, Look

#: stored J/m³ → the display basis of ``specific_power`` [kW/(m³/min)]: 1 kW/(m³/min) = 1000 W / (1/60 m³/s)
J_M3 = 1.0 / 60_000.0
_KWH = 3.6e6
_NOT_CSV = {"window", "text", "pdf"}

#: the package at one demand (paths into a PackagePoint dict); the CSV names each column in snake case
PACKAGE_POINT: tuple[Figure, ...] = (
    Figure("demand_fraction", "Demand", "fraction", where={"csv"}),
    Figure("delivered_fad_m3_s", "Free air delivered", "volume_flow",
           note="Demand times the full-load free air delivery at the conditions solved"),
    Figure("shaft_power_W", "Shaft power (mean)", "power", note="Time mean over the control's cycle"),
    Figure("driver_power_W", "Driver input", "power",
           note="Motor input at its part-load efficiency (and the drive's, with variable speed)"),
    Figure("drive_loss_W", "of which drive loss", "power", note="Losses of the variable-speed drive"),
    Figure("fan_power_W", "Cooler fans", "power", note="Fan input while the package runs"),
    Figure("pump_power_W", "Coolant pump", "power", note="ρ g H V̇ / η at the full-load coolant flow, while running"),
    Figure("other_power_W", "Other loads", "power", note="The fixed loads the project names, while running"),
    Figure("package_power_W", "Package input", "power", note="Driver input plus the auxiliaries"),
    Figure("package_specific_power_J_m3", "Package specific power", "specific_power", to_si=J_M3,
           note="Package input per unit of free air delivered"),
    Figure("loaded_fraction", "Loaded share of time", "fraction", decimals=1,
           looks={"text": Look(quantity="ratio", decimals=3)}),
    Figure("running_fraction", "Running share of time", "fraction", decimals=1,
           note="The motor stops for the rest (start/stop, variable speed below its minimum)",
           looks={"text": Look(quantity="ratio", decimals=3)}),
    Figure("cycles_per_hour", "Load cycles per hour", decimals=1,
           note="Load/unload (or start/stop) cycles of the receiver's pressure band"),
    Figure("starts_per_hour", "Motor starts per hour", decimals=1, note="Within the stated starts limit"),
)

#: figure id → whether a package dict has anything to show for it (figures not named always show)
_ONLY_WITH = {
    "drive_loss_W": lambda pkg: pkg["control"] == "variable_speed",
    "fan_power_W": lambda pkg: any(p["fan_power_W"] for p in _points(pkg)),
    "pump_power_W": lambda pkg: any(p["pump_power_W"] for p in _points(pkg)),
    "other_power_W": lambda pkg: any(p["other_power_W"] for p in _points(pkg)),
    "running_fraction": lambda pkg: any(p["running_fraction"] < 1.0 for p in _points(pkg)),
    "cycles_per_hour": lambda pkg: any(p["cycles_per_hour"] is not None for p in _points(pkg)),
    "starts_per_hour": lambda pkg: any(p["starts_per_hour"] is not None for p in _points(pkg)),
}

#: the load profile's year (paths into :func:`annual_view`)
PACKAGE_ANNUAL: tuple[Figure, ...] = (
    Figure("hours", "Hours in the load profile", "hours"),
    Figure("energy_kWh", "Package energy", "energy", to_si=_KWH, looks={"text": Look(unit="MWh")}),
    Figure("delivered_m3", "Free air delivered", "air_volume", looks={"csv": Look(label="profile_free_air_delivered")}),
    Figure("mean_power_W", "Mean package input", "power", looks={"csv": Look(label="profile_mean_package_input")}),
    Figure("specific_power_J_m3", "Specific power over the profile", "specific_power", to_si=J_M3),
    Figure("ideal_energy_kWh", "Energy in proportion to flow", "energy", to_si=_KWH,
           note="The same hours at the full-load specific power (an ideal control)",
           looks={"text": Look(unit="MWh")}),
    Figure("part_load_extra_kWh", "Part-load extra", "energy", to_si=_KWH,
           note="What the control costs over the ideal, at the site as stated", looks={"text": Look(unit="MWh")}),
    Figure("part_load_extra_share", "Part-load extra share", "fraction", decimals=1,
           looks={"text": Look(quantity="ratio", decimals=4)}),
)

#: one load of the data sheet, at one condition (paths into a PackagePoint dict)
SHEET_POINT: tuple[Figure, ...] = (
    Figure("delivered_fad_m3_s", "Free air delivery", "volume_flow", id="sheet_fad",
           looks={"window": Look(label="FAD")}),
    Figure("package_power_W", "Package input", "power", id="sheet_power"),
    Figure("package_specific_power_J_m3", "Specific power", "specific_power", to_si=J_M3, id="sheet_specific"),
)

#: the conditions of a data-sheet column (paths into a SheetColumn dict)
SHEET_CONDITIONS: tuple[Figure, ...] = (
    Figure("inlet_pressure_Pa", "Inlet pressure", "pressure", decimals=3),
    Figure("inlet_temperature_K", "Inlet temperature", "temperature", decimals=1),
    Figure("relative_humidity", "Relative humidity", "fraction", decimals=0),
    Figure("discharge_pressure_Pa", "Discharge pressure", "pressure", decimals=3),
)


def _points(pkg: dict) -> list[dict]:
    return [pkg["full_load"], pkg["at_load"], *pkg["part_loads"]]


def point_figures(pkg: dict, output: str) -> list[Figure]:
    """The figures of :data:`PACKAGE_POINT` ``output`` shows for ``pkg`` (those it has something for).

    Examples
    --------
    >>> pt = {"fan_power_W": 0.0, "pump_power_W": 0.0, "other_power_W": 0.0, "running_fraction": 1.0,
    ...       "cycles_per_hour": None, "starts_per_hour": None}
    >>> pkg = {"control": "modulation", "full_load": pt, "at_load": pt, "part_loads": []}
    >>> [f.id for f in point_figures(pkg, "window")][:3]
    ['delivered_fad_m3_s', 'shaft_power_W', 'driver_power_W']
    >>> "pump_power_W" in [f.id for f in point_figures(pkg, "window")]
    False
    """
    return [f for f in PACKAGE_POINT if f.shown_in(output) and (f.id not in _ONLY_WITH or _ONLY_WITH[f.id](pkg))]


def load_name(fraction: float) -> str:
    """``0.75`` → ``"75 %"`` (a load as people say it).

    Examples
    --------
    >>> load_name(0.75), load_name(1.0), load_name(0.333)
    ('75 %', '100 %', '33.3 %')
    """
    return f"{100.0 * fraction:.1f}".rstrip("0").rstrip(".") + " %"


def point_columns(pkg: dict, part_loads: bool = False) -> list[tuple[str, dict]]:
    """``(heading, point dict)`` of the package's columns: full load, the stated load, and with
    ``part_loads`` each data-sheet load at the site."""
    cols = [("Full load", pkg["full_load"]), (f"Stated load {load_name(pkg['at_load']['demand_fraction'])}",
                                              pkg["at_load"])]
    if part_loads:
        cols += [(f"Part load {load_name(p['demand_fraction'])}", p) for p in pkg["part_loads"]]
    return cols


def point_rows(pkg: dict, output: str, system: str = "SI", part_loads: bool = False) -> list[list[str]]:
    """One row per figure: label, unit, then the value in each of :func:`point_columns`."""
    cols = point_columns(pkg, part_loads)
    missing = "" if output == "csv" else "—"
    return [[f.label_in(output), f.symbol_in(output, system)]
            + [f.text(point, output, system, missing=missing, grouping=output != "text") for _, point in cols]
            for f in point_figures(pkg, output)]


def annual_view(annual: dict) -> dict:
    """The year of the load profile with what it costs over an ideal control
    (``part_load_extra_kWh``, ``part_load_extra_share`` of the energy).

    Examples
    --------
    >>> v = annual_view({"energy_kWh": 120.0, "ideal_energy_kWh": 100.0})
    >>> v["part_load_extra_kWh"], round(v["part_load_extra_share"], 6)
    (20.0, 0.166667)
    """
    extra = annual["energy_kWh"] - annual["ideal_energy_kWh"]
    share = extra / annual["energy_kWh"] if annual["energy_kWh"] > 0.0 else None
    return dict(annual, part_load_extra_kWh=extra, part_load_extra_share=share)


def annual_rows(pkg: dict, output: str, system: str = "SI") -> list[list[str]]:
    """``[label, value with unit]`` of the load profile's year (empty when the project has no profile)."""
    if not pkg.get("annual"):
        return []
    view = annual_view(pkg["annual"])
    return [[f.label_in(output), f.text(view, output, system, with_unit=True, grouping=output != "text")]
            for f in PACKAGE_ANNUAL if f.shown_in(output)]


def control_line(pkg: dict) -> str:
    """One sentence naming the control (and the demand the stated-load column is at).

    Examples
    --------
    >>> control_line({"control_label": "load/unload", "at_load": {"demand_fraction": 0.7}})
    'Capacity control: load/unload; stated load 70 % of full capacity.'
    """
    return (f"Capacity control: {pkg['control_label']}; stated load "
            f"{load_name(pkg['at_load']['demand_fraction'])} of full capacity.")


def sheet_headers(output: str, system: str = "SI") -> list[tuple[str, str]]:
    """``(header, unit)`` of the data-sheet table: the load, the condition, then each
    :data:`SHEET_POINT` figure."""
    return [("Load", ""), ("Condition", "")] + [(f.label_in(output), f.symbol_in(output, system)) for f in SHEET_POINT]


def sheet_rows(sheet: dict, output: str, system: str = "SI") -> list[list[str]]:
    """Two rows per load of the data sheet (``DataSheet.to_dict()``): the load at the reference
    conditions, then at the site (the load is named on the first of the two)."""
    ref, site = sheet["columns"]
    rows = []
    for a, b in zip(ref["points"], site["points"]):
        for first, (where, point) in enumerate((("ISO 1217 reference", a), ("Site", b))):
            rows.append([load_name(a["demand_fraction"]) if first == 0 else "", where]
                        + [f.text(point, output, system, grouping=output != "text") for f in SHEET_POINT])
    return rows


def sheet_condition_lines(sheet: dict, output: str, system: str = "SI") -> list[str]:
    """One line per column of the sheet: ``"ISO 1217 reference: inlet pressure 1.000 bar(a), …"``."""
    return [f"{name}: " + ", ".join(f"{f.label_in(output).lower()} {f.text(col, output, system, with_unit=True)}"
                                    for f in SHEET_CONDITIONS)
            for name, col in zip(("ISO 1217 reference", "Site"), sheet["columns"])]


def sheet_condition_rows(sheet: dict, output: str, system: str = "SI") -> list[list[str]]:
    """``[label, reference, site]`` of the conditions each data-sheet column stands for."""
    ref, site = sheet["columns"]
    return [[f.label_in(output), f.text(ref, output, system, with_unit=True),
             f.text(site, output, system, with_unit=True)] for f in SHEET_CONDITIONS]
