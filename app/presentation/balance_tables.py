"""Presentation tables of a solved train (``TrainResult.to_dict()``): one per result kind.

* :data:`POINTS` — the columns of the state-point table (paths into a point dict).
* :data:`COMPONENTS` — the columns of the component table, whose rows are the intake filter,
  each stage, each cooler and the whole train (a path per row kind; :func:`component_rows`).
* :data:`EXCHANGERS` — the PDF report's table of the coolers' exchangers (paths into a cooler).
* :data:`ZONES` — the PDF report's table of the dry and wet zones of condensing coolers.
* :data:`TOTALS` — the train's totals (paths into the result).
* :data:`KEY_FIGURES` — the few figures an engineer looks for first (the window's key-figures
  strip); :func:`key_figures` lays them out for one result, a cooler figure once per cooler.

The balance sheet in the window (:mod:`stagewright.gui.panels.balance_panel`), ``stagewright solve``'s text
table (:mod:`stagewright.gui.cli.solve_table`), the PDF report (:mod:`stagewright.gui.report.sections`) and the CSV
(:mod:`stagewright.gui.report.csv_export`) all read these tables: a row added here shows in each output
its ``where`` names (every output by default). Rows placed twice are the same figure at the
place one output lists it (each output keeps the order it has always had). No Qt.
"""
from __future__ import annotations

__all__ = ["POINTS", "COMPONENTS", "EXCHANGERS", "ZONES", "TOTALS", "KEY_FIGURES", "KeyFigure", "LIQUID_COOLANTS",
           "train_points", "component_rows", "cooler_name", "cooling_water_kg_s", "key_figures"]

from dataclasses import dataclass

from stagewright.gui.presentation.figures import Figure, Look, condition_holds, shown
from stagewright.gui.presentation.result_notes import NEGATIVE_TIPS, TOTAL_TIPS

_WINDOW, _PDF = {"window"}, {"pdf"}
_WINDOW_PDF = {"window", "pdf"}
_NOT_CSV = {"window", "text", "pdf"}
_NOT_TEXT = {"window", "pdf", "csv"}
_NOT_WINDOW = {"text", "pdf", "csv"}
_L_H = 1e-3 / 3600.0  # m³/s per L/h
_TEXT_2 = {"text": Look(decimals=2)}


def _every_component(key: str) -> dict[str, str]:
    """The same path in every row kind of the component table."""
    return {"filter": key, "stage": key, "cooler": key, "train": key}


#: columns of the state-point table (paths into a point dict: intake, filter outlet, stage and cooler outlets)
POINTS: tuple[Figure, ...] = (
    Figure("temperature_K", "T", "temperature", id="T",
           looks={"text": Look(width=9), "csv": Look(label="temperature")}),
    Figure("pressure_Pa", "p", "pressure", id="p",
           looks={"text": Look(unit="kPa", width=11), "csv": Look(label="pressure")}),
    Figure("pressure_Pa", "p", "pressure", id="p_gauge", gauge=True, where=_PDF),
    Figure("enthalpy_J_kg", "h", "specific_enthalpy", id="h",
           looks={"text": Look(decimals=3, width=11), "csv": Look(label="enthalpy")}),
    Figure("entropy_J_kgK", "s", "specific_entropy", id="s",
           looks={"text": Look(symbol="kJ/kgK", decimals=5, width=12), "csv": Look(label="entropy")}),
    Figure("density_kg_m3", "ρ", "density", id="rho", where=_NOT_TEXT, looks={"csv": Look(label="density")}),
    Figure("velocity_m_s", "V", "velocity", id="V", where=_WINDOW),
    Figure("humidity_ratio", "w", "humidity_ratio", id="w", when="moist", where=_NOT_TEXT,
           looks={"pdf": Look(label="Humidity ratio", unit="kg/kg", missing="0.00000"),
                  "csv": Look(label="humidity_ratio", quantity="ratio")}),
    Figure("relative_humidity", "RH", "fraction", id="rh", when="moist", where=_NOT_TEXT,
           looks={"csv": Look(label="relative_humidity")}),
    Figure("dew_point_K", "Dew pt", "temperature", id="dew", when="moist", where=_NOT_TEXT,
           looks={"pdf": Look(label="Dew point"), "csv": Look(label="dew_point")}),
)

#: columns of the component table; each column has a path per row kind ("filter", "stage", "cooler", "train")
COMPONENTS: tuple[Figure, ...] = (
    Figure({"stage": "pressure_ratio"}, "Ratio", "ratio", id="ratio", where={"window", "csv"},
           looks={"csv": Look(label="pressure_ratio")}),
    Figure({"stage": "shaft_power_W", "train": "shaft_power_W"}, "Shaft power", "power", id="power",
           looks={"text": Look(label="power", decimals=3, width=11)}),
    Figure({"stage": "heat_loss_W+mechanical_loss_W", "cooler": "duty_W", "train": "heat_rejected_W"},
           "Heat out", "heat_flow", id="heat",
           looks={"text": Look(label="duty", decimals=3, width=11), "pdf": Look(label="Heat rejected"),
                  "csv": Look(label="heat_rejected")}),
    # condensed in the coolers; the train's is their sum (the window shows the drained total below)
    Figure({"cooler": "condensate_kg_s", "train": "stages[*].cooler.condensate_kg_s"}, "Condensate", "water_flow",
           id="condensate", when="any", where={"pdf", "csv"}),
    Figure({"stage": "isentropic_efficiency"}, "ηs", "fraction", id="eta_s",
           looks={"text": Look(quantity="ratio", width=8),
                  "csv": Look(label="isentropic_efficiency", quantity="ratio")}),
    Figure({"stage": "polytropic_efficiency"}, "ηp", "fraction", id="eta_p",
           looks={"text": Look(quantity="ratio", width=8),
                  "csv": Look(label="polytropic_efficiency", quantity="ratio")}),
    Figure(_every_component("entropy_generation_W_K"), "S_gen", "entropy_rate", id="sgen",
           looks={"text": Look(decimals=3, width=13), "csv": Look(label="entropy_generation")}),
    Figure(_every_component("exergy_destroyed_W"), "X_dest", "power", id="xdest",
           looks={"text": Look(decimals=3, width=13), "csv": Look(label="exergy_destroyed")}),
    Figure({"cooler": "latent_duty_W"}, "Latent", "heat_flow", id="latent", when="moist", where=_WINDOW),
    Figure({"cooler": "condensate_kg_s", "train": "condensate_kg_s"}, "Condensate", "water_flow", id="condensate",
           when="moist", where=_WINDOW),
    Figure({"cooler": "ua_W_K"}, "UA", "conductance", id="ua", when="exchanger", where=_WINDOW),
    Figure({"cooler": "lmtd_K"}, "LMTD", "temperature_difference", id="lmtd", when="exchanger", where=_WINDOW),
    Figure({"cooler": "coolant_flow_kg_s"}, "Coolant flow", "mass_flow", id="coolant", when="exchanger",
           where=_WINDOW),
    Figure({"cooler": "coolant_outlet_temperature_K"}, "Coolant out", "temperature", id="coolant_out",
           when="exchanger", where=_WINDOW),
    # issue 17: cooling water per cooler and for the train; the text table also lists each cooler's condensate
    Figure({"cooler": "cooling_water_m3_s", "train": "cooling_water_m3_s"}, "Cooling water", "water_volume_flow",
           id="cooling_water", when="any", note="Water (or water–glycol) flow through the cooler, at its inlet",
           looks={"text": Look(label="water", width=14)}),
    Figure({"cooler": "condensate_kg_s", "train": "condensate_kg_s"}, "Condensate", "water_flow", id="condensate",
           when="moist", where={"text"}, looks={"text": Look(label="condensate", width=18)}),
)

#: the PDF report's table of cooler exchangers (paths into a cooler dict; coolers with a coolant side); the
#: window shows some of these figures among the component columns
EXCHANGERS: tuple[Figure, ...] = (
    Figure("coolant_kind", "Coolant", style="text"),
    Figure("coolant_flow_kg_s", "Coolant flow", "mass_flow"),
    Figure("coolant_inlet_temperature_K", "Coolant in", "temperature"),
    Figure("coolant_outlet_temperature_K", "Coolant out", "temperature"),
    Figure("lmtd_K", "LMTD", "temperature_difference"),
    Figure("lmtd_correction_factor", "F", decimals=3),
    Figure("effectiveness", "ε", decimals=3),
    Figure("ntu", "NTU", decimals=3),
    Figure("ua_W_K", "UA", "conductance"),
    # issue 17: the volume of cooling water (blank for fan air)
    Figure("cooling_water_m3_s", "Cooling water", "water_volume_flow", when="any"),
)

#: the PDF report's table of the zones of condensing coolers (paths into an entry of a cooler's ``zones``): a dry
#: zone has its LMTD correction factor F, a wet zone is driven by its log-mean enthalpy difference instead
ZONES: tuple[Figure, ...] = (
    Figure("kind", "Zone", style="text"),
    Figure("duty_W", "Duty", "heat_flow"),
    Figure("hot_inlet_temperature_K", "Air in", "temperature"),
    Figure("hot_outlet_temperature_K", "Air out", "temperature"),
    Figure("coolant_inlet_temperature_K", "Coolant in", "temperature"),
    Figure("coolant_outlet_temperature_K", "Coolant out", "temperature"),
    Figure("lmtd_K", "LMTD", "temperature_difference"),
    Figure("lmtd_correction_factor", "F", decimals=3, looks={"pdf": Look(missing="")}),
    Figure("log_mean_enthalpy_difference_J_kg", "Δh_lm", "specific_enthalpy", id="lmed",
           looks={"pdf": Look(missing="")}),
    Figure("effectiveness", "ε", decimals=3),
    Figure("ntu", "NTU", decimals=3),
    Figure("ua_W_K", "UA", "conductance"),
)

_RESIDUAL = {"style": "scientific", "decimals": 2, "where": _NOT_CSV}

#: the train's totals (paths into the result); the text table lower-cases a label's first letter
TOTALS: tuple[Figure, ...] = (
    Figure("mass_flow_kg_s", "Mass flow", "mass_flow", where=_NOT_CSV),
    Figure("free_air_delivery_m3_s", "Free air delivery", "volume_flow", where=_NOT_CSV,
           note=TOTAL_TIPS["free_air_delivery_m3_s"]),
    Figure("normal_volume_flow_m3_s", "Normal volume flow", "normal_volume_flow", where=_WINDOW_PDF,
           note=TOTAL_TIPS["normal_volume_flow_m3_s"], looks={"pdf": Look(label="Normal volume flow (0 °C, 101.325 kPa)")}),
    Figure("shaft_power_W", "Shaft power", "power", where=_NOT_CSV),
    Figure("driver_power_W", "Driver input power", "power", where=_NOT_CSV),
    Figure("specific_power_kW_per_m3_min", "Specific power", "specific_power", where=_NOT_CSV),
    Figure("heat_rejected_W", "Heat rejected", "heat_flow", where=_NOT_CSV),
    Figure("isothermal_power_W", "Isothermal power", "power", where=_NOT_CSV,
           looks={"pdf": Look(label="Reversible isothermal power")}),
    Figure("isothermal_efficiency", "Isothermal efficiency", "fraction", where=_NOT_CSV,
           looks={"text": Look(quantity="ratio")}),
    Figure("second_law_efficiency", "Second-law efficiency", "fraction", where=_NOT_CSV,
           looks={"text": Look(quantity="ratio")}),
    # the text table lists the entropy generation before the exergy destroyed
    Figure("entropy_generation_W_K", "Entropy generation", "entropy_rate", where={"text"}),
    Figure("exergy_gained_W", "Exergy gained by air", "power", where=_WINDOW_PDF,
           looks={"pdf": Look(label="Exergy gained by the air")}),
    Figure("exergy_destroyed_W", "Exergy destroyed", "power", where=_NOT_CSV),
    Figure("heat_exergy_W", "Exergy out with heat", "power", where=_WINDOW_PDF, note=TOTAL_TIPS["heat_exergy_W"],
           negative_note=NEGATIVE_TIPS["heat_exergy_W"], looks={"pdf": Look(label="Exergy carried out with heat")}),
    Figure("entropy_generation_W_K", "Entropy generation", "entropy_rate", where=_WINDOW_PDF),
    Figure("condensate_kg_s", "Condensate", "water_flow", when="moist", where=_WINDOW),
    Figure("delivered_pressure_dew_point_K", "Pressure dew point", "temperature", when="moist", where=_WINDOW),
    Figure("delivered_atmospheric_dew_point_K", "Atm. dew point", "temperature", when="moist", where=_WINDOW),
    Figure("iso8573_humidity_class", "ISO 8573-1 class", style="text", when="moist", where=_WINDOW),
    # issue 17: water, cooling water and heat recovery in every output (the window lists the first four above;
    # the CSV has the train's cooling water in the component columns' train row)
    Figure("condensate_kg_s", "Condensate", "water_flow", when="moist", where=_NOT_WINDOW,
           looks={**_TEXT_2, "csv": Look(label="condensate_drained")}),
    Figure("condensate_L_h", "Condensate volume", "condensate_volume_flow", to_si=_L_H, when="moist", looks=_TEXT_2,
           note="Condensate drained by all separators as a volume flow"),
    Figure("delivered_pressure_dew_point_K", "Pressure dew point", "temperature", when="moist", where=_NOT_WINDOW,
           looks=_TEXT_2, note="Dew point of the delivered air at the delivery pressure"),
    Figure("delivered_atmospheric_dew_point_K", "Atmospheric dew point", "temperature", when="moist",
           where=_NOT_WINDOW, looks=_TEXT_2, note="Dew point of the delivered air expanded to the site pressure"),
    Figure("iso8573_humidity_class", "ISO 8573-1 humidity class", style="text", when="moist", where=_NOT_WINDOW,
           looks={"csv": Look(label="iso8573_humidity_class")}),
    Figure("cooling_water_m3_s", "Cooling water", "water_volume_flow", when="any", looks=_TEXT_2, where=_NOT_CSV,
           note="Water (or water–glycol) flow through all coolers with a liquid coolant, at their inlets"),
    Figure("recoverable_heat_W", "Recoverable heat", "heat_flow", when="any",
           note="Heat the project's heat recovery can deliver at its delivery temperature"),
    # the closure residuals last: a check on the balance, not a figure of the design
    Figure("energy_residual", "Energy closure residual", **_RESIDUAL,
           looks={"text": Look(label="energy balance residual"), "pdf": Look(label="Energy balance closure")}),
    Figure("exergy_residual", "Exergy closure residual", **_RESIDUAL,
           looks={"text": Look(label="exergy balance residual"), "pdf": Look(label="Exergy balance closure")}),
)


def train_points(result: dict) -> list[tuple[str, int | None, dict]]:
    """Every state point of the train in flow order as ``(row key, stage number or None, point)``.

    Row keys: ``"intake"``, ``"filter"`` (after the intake filter), ``"stage-i"`` (stage i's
    discharge) and ``"cooler-i"`` (its cooler's outlet), stages counted from 1.
    """
    rows = [("intake", None, result["intake"]), ("filter", None, result["inlet_filter"]["outlet"])]
    for i, st in enumerate(result["stages"], 1):
        rows.append((f"stage-{i}", i, st["outlet"]))
        if st.get("cooler"):
            rows.append((f"cooler-{i}", i, st["cooler"]["outlet"]))
    return rows


def component_rows(result: dict) -> list[tuple[str, str, int | None, dict]]:
    """Rows of the component table as ``(row key, kind, stage number or None, the component's dict)``.

    Kinds (and row keys): ``"filter"`` (``"filter"``), ``"stage"`` (``"stage-i"``), ``"cooler"``
    (``"cooler-i"``), ``"train"`` (``"total"``: the result itself).
    """
    rows = [("filter", "filter", None, result["inlet_filter"])]
    for i, st in enumerate(result["stages"], 1):
        rows.append((f"stage-{i}", "stage", i, st))
        if st.get("cooler"):
            rows.append((f"cooler-{i}", "cooler", i, st["cooler"]))
    rows.append(("total", "train", None, result))
    return rows


#: coolant kinds counted as cooling water (a water–glycol mix is still the plant's cooling-water circuit)
LIQUID_COOLANTS = ("water", "glycol")

#: the answer first: what an engineer looks for before the detail of the balance sheet (the
#: window's key-figures strip and the report's first page, each its own ``where``). A figure
#: whose key names the ``"cooler"`` row kind is shown once per cooler (:func:`key_figures`); the
#: others read the result, plus ``cooling_water_kg_s`` (:func:`cooling_water_kg_s`).
KEY_FIGURES: tuple[Figure, ...] = (
    Figure("shaft_power_W", "Shaft power", "power", where=_WINDOW,
           note="Power at the compressor shafts: the stages' power plus mechanical losses."),
    Figure("driver_power_W", "Driver input power", "power", where=_WINDOW,
           note="Electrical (or fuel) power into the driver: shaft power over the driver efficiency."),
    Figure("specific_power_kW_per_m3_min", "Specific power", "specific_power", where=_WINDOW,
           note="Driver input power per unit of free air delivery."),
    Figure({"cooler": "duty_W"}, "duty", "heat_flow", id="cooler_duty", where=_WINDOW,
           note="Heat the cooler takes out of the air (sensible and latent)."),
    Figure("cooling_water_kg_s", "Cooling water", "water_flow", decimals=0, where=_WINDOW,
           note="Water or water–glycol through the coolers that have a liquid coolant side."),
    Figure("condensate_kg_s", "Condensate", "water_flow", when="moist", where=_WINDOW,
           note="Water drained from the coolers' separators: it needs working drains and lawful disposal."),
    Figure("delivered_pressure_dew_point_K", "Pressure dew point", "temperature", when="moist", where=_WINDOW,
           note="Dew point of the delivered air at its own pressure (frost point below 0 °C)."),
    # the report's first page: the answer as a client reads it (its own order and a few more figures)
    Figure("driver_power_W", "Driver input power", "power", where=_PDF),
    Figure("shaft_power_W", "Shaft power", "power", where=_PDF),
    Figure("specific_power_kW_per_m3_min", "Specific power", "specific_power", where=_PDF,
           note="driver input power per unit of free air delivery"),
    Figure("package.at_load.package_power_W", "Package input at the stated load", "power", when="any", where=_PDF,
           note="control, motor, drive and auxiliaries (package section)"),
    Figure("package.at_load.package_specific_power_J_m3", "Package specific power at the stated load",
           "specific_power", to_si=1.0 / 60_000.0, when="any", where=_PDF,
           note="package input per unit of free air delivered at that load"),
    Figure("free_air_delivery_m3_s", "Free air delivery", "volume_flow", where=_PDF),
    Figure("mass_flow_kg_s", "Mass flow", "mass_flow", where=_PDF, note="of dry air"),
    Figure("heat_rejected_W", "Heat rejected", "heat_flow", where=_PDF,
           note="by the coolers, the stage casings and the mechanical losses"),
    Figure("cooling_water_m3_s", "Cooling water", "water_volume_flow", when="any", where=_PDF,
           note="through all coolers with a water or glycol side, at their inlets"),
    Figure("condensate_kg_s", "Condensate drained", "water_flow", when="moist", where=_PDF),
    Figure("condensate_L_h", "Condensate volume", "condensate_volume_flow", to_si=_L_H, when="moist", where=_PDF),
    Figure("delivered_pressure_dew_point_K", "Pressure dew point", "temperature", when="moist", where=_PDF,
           note="of the delivered air, at the delivery pressure"),
    Figure("delivered_atmospheric_dew_point_K", "Atmospheric dew point", "temperature", when="moist", where=_PDF,
           note="of the delivered air expanded to the site pressure"),
    Figure("iso8573_humidity_class", "ISO 8573-1 humidity class", style="text", when="moist", where=_PDF),
    Figure("recoverable_heat_W", "Recoverable heat", "heat_flow", when="any", where=_PDF,
           note="at the heat recovery's delivery temperature"),
)


@dataclass(frozen=True)
class KeyFigure:
    """One key figure of one result: ``key`` (``"shaft_power_W"``, ``"cooler_duty-2"`` …), its
    label, the :class:`Figure`, the dict to read it from and that row's kind, whether it applies
    (False: e.g. the dew point of dry intake air, shown as missing) and where the balance sheet
    details it: ``("totals", figure id)`` or ``("components", row key)`` (None: nowhere)."""

    key: str
    label: str
    figure: Figure
    container: dict
    kind: str | None = None
    applies: bool = True
    detail: tuple[str, str] | None = None

    def text(self, system: str = "SI", missing: str = "—") -> str:
        """The value with its unit as the window shows it (``missing`` when absent or not applying)."""
        if not self.applies:
            return missing
        return self.figure.text(self.container, "window", system, kind=self.kind, missing=missing, with_unit=True)


def cooler_name(stage: int, stages: int) -> str:
    """``"Intercooler 1"`` … or ``"Aftercooler"`` (the cooler after the last stage)."""
    return "Aftercooler" if stage == stages else f"Intercooler {stage}"


def cooling_water_kg_s(result: dict) -> float | None:
    """Liquid coolant flow summed over the coolers with a water or water–glycol side (None: none has one)."""
    flows = [c["coolant_flow_kg_s"] for c in (st.get("cooler") for st in result["stages"])
             if c and c.get("coolant_kind") in LIQUID_COOLANTS and c.get("coolant_flow_kg_s") is not None]
    return sum(flows) if flows else None


def key_figures(result: dict) -> list[KeyFigure]:
    """:data:`KEY_FIGURES` laid out for ``result`` (``TrainResult.to_dict()``), in table order.

    A cooler figure becomes one entry per cooler (key ``"<id>-<stage>"``, label ``"Intercooler 1
    duty"``); a figure whose condition does not hold (:attr:`Figure.when`) is kept with
    ``applies=False``, so the strip keeps its shape.
    """
    source = dict(result, cooling_water_kg_s=cooling_water_kg_s(result))
    coolers = [(row, i, c) for row, kind, i, c in component_rows(result) if kind == "cooler"]
    liquid = [row for row, _i, c in coolers if c.get("coolant_kind") in LIQUID_COOLANTS]
    totals = {f.id for f in TOTALS}
    n = len(result["stages"])
    out: list[KeyFigure] = []
    for fig in shown(KEY_FIGURES, "window"):
        if not isinstance(fig.key, str):  # a cooler figure: one per cooler
            out += [KeyFigure(f"{fig.id}-{i}", f"{cooler_name(i, n)} {fig.label}", fig, cooler, "cooler",
                              detail=("components", row)) for row, i, cooler in coolers]
            continue
        if fig.id in totals:
            detail = ("totals", fig.id)
        else:  # cooling water: the first cooler with a liquid coolant side (its coolant columns)
            detail = ("components", (liquid + [row for row, _i, _c in coolers] + ["total"])[0])
        out.append(KeyFigure(fig.id, fig.label, fig, source, applies=condition_holds(fig, "window", result),
                             detail=detail))
    return out
