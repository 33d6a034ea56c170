"""What each document field is called, which display quantity it has, and its schema range.

Entry fields, undo descriptions and the messages area all take their words from here,
and every range comes from :mod:`stagewright.core.project.schema` (the one schema), converted to the
display unit only when shown. Qt-free.
"""
from __future__ import annotations

__all__ = ["FieldSpec", "spec_for", "quantity_for", "describe", "edit_text", "schema_node",
           "problem_message", "range_text", "FLOW_QUANTITY", "FLOW_LABEL"]

import re
from dataclasses import dataclass

from stagewright.core.errors import InputError, Problem, shown_value
from stagewright.core.project.schema import PROJECT
from stagewright.core.project.schema_types import Items, Num, Obj, Variant
from stagewright.core.year_profile import MONTH_NAMES

from stagewright.gui.presentation import units
from stagewright.gui.document.paths import format_path, get_in, parse_path


@dataclass(frozen=True)
class FieldSpec:
    """Label (lower case, used inside sentences) and display quantity of a field."""

    label: str
    quantity: str | None = None  #: key of :data:`stagewright.gui.presentation.units.QUANTITIES`; None for text/choices
    gauge_aware: bool = False  #: pressure shown gauge or absolute as the user prefers


#: flow kind -> display quantity of ``flow.value``
FLOW_QUANTITY = {"mass": "mass_flow", "free_air_delivery": "volume_flow",
                 "normal_volume": "normal_volume_flow", "shaft_power": "power"}
#: flow kind -> label of ``flow.value`` (a shaft power is not a flow)
FLOW_LABEL = {"mass": "mass flow", "free_air_delivery": "free air delivery",
              "normal_volume": "normal volume flow", "shaft_power": "shaft power"}

_SPECS = {
    "title": FieldSpec("project title"),
    "note": FieldSpec("project note"),
    "site.ambient_temperature_K": FieldSpec("ambient temperature", "temperature"),
    "site.barometric_pressure_Pa": FieldSpec("barometric pressure", "pressure"),
    "site.elevation_m": FieldSpec("site elevation", "length"),
    "site.relative_humidity": FieldSpec("relative humidity", "fraction"),
    "inlet_pressure_drop_Pa": FieldSpec("intake filter pressure drop", "pressure_difference"),
    "fluid.model": FieldSpec("property model"),
    "fluid.cp_J_kgK": FieldSpec("specific heat cp", "specific_heat"),
    "fluid.k": FieldSpec("heat capacity ratio k", "ratio"),
    "flow.kind": FieldSpec("flow basis"),
    "flow.value": FieldSpec("flow"),
    "discharge_pressure_Pa": FieldSpec("discharge pressure", "pressure", gauge_aware=True),
    "discharge_gauge_pressure_Pa": FieldSpec("discharge pressure", "gauge_pressure"),  # stated gauge
    "driver.efficiency": FieldSpec("driver efficiency", "fraction"),
    "stages[*].name": FieldSpec("name"),
    "stages[*].pressure_ratio": FieldSpec("pressure ratio", "ratio"),
    "stages[*].efficiency.kind": FieldSpec("efficiency basis"),
    "stages[*].efficiency.value": FieldSpec("efficiency", "fraction"),
    "stages[*].efficiency.value_K": FieldSpec("measured discharge temperature", "temperature"),
    "stages[*].mechanical_efficiency": FieldSpec("mechanical efficiency", "fraction"),
    "stages[*].heat_loss_W": FieldSpec("casing heat loss", "heat_flow"),
    "stages[*].heat_loss_boundary_temperature_K": FieldSpec("casing surface temperature", "temperature"),
    "stages[*].exit_velocity_m_s": FieldSpec("exit velocity", "velocity"),
    "stages[*].max_discharge_temperature_K": FieldSpec("discharge temperature limit", "temperature"),
    "stages[*].min_pressure_ratio": FieldSpec("lowest pressure ratio", "ratio"),
    "stages[*].max_pressure_ratio": FieldSpec("highest pressure ratio", "ratio"),
    "stages[*].cooler": FieldSpec("cooler"),
    "stages[*].cooler.outlet_temperature_K": FieldSpec("cooler outlet temperature", "temperature"),
    "stages[*].cooler.approach_K": FieldSpec("cooler approach", "temperature_difference"),
    "stages[*].cooler.coolant_inlet_temperature_K": FieldSpec("coolant inlet temperature", "temperature"),
    "stages[*].cooler.pressure_drop_Pa": FieldSpec("cooler pressure drop", "pressure_difference"),
    "stages[*].cooler.separator_efficiency": FieldSpec("separator efficiency", "fraction"),
    "stages[*].cooler.ua_W_K": FieldSpec("cooler UA", "conductance"),
    "stages[*].cooler.arrangement": FieldSpec("cooler flow arrangement"),
    "stages[*].cooler.coolant": FieldSpec("cooler coolant side"),
    "stages[*].cooler.coolant.kind": FieldSpec("coolant"),
    "stages[*].cooler.coolant.glycol": FieldSpec("glycol type"),
    "stages[*].cooler.coolant.glycol_fraction": FieldSpec("glycol mass fraction", "fraction"),
    "stages[*].cooler.coolant.flow_kg_s": FieldSpec("coolant flow", "mass_flow"),
    "stages[*].cooler.coolant.temperature_rise_K": FieldSpec("coolant temperature rise", "temperature_difference"),
    "heat_recovery.delivery_temperature_K": FieldSpec("heat recovery delivery temperature", "temperature"),
    "heat_recovery.approach_K": FieldSpec("heat recovery approach", "temperature_difference"),
    "heat_recovery.casing_share": FieldSpec("recovered share of casing heat", "fraction"),
    "heat_recovery.boiler_efficiency": FieldSpec("boiler efficiency", "fraction"),
    "year.operating_hours_per_year": FieldSpec("operating hours per year", "hours"),
    "year.load": FieldSpec("year load", "fraction"),
    "year.energy_price_per_kWh": FieldSpec("energy price per kWh", "ratio"),
    "year.water_price_per_m3": FieldSpec("water price per m³", "ratio"),
    # issue 16: the package (capacity control, motor, auxiliaries, loads)
    "package": FieldSpec("package section"),
    "package.control": FieldSpec("capacity control"),
    "package.control.kind": FieldSpec("capacity control"),
    "package.control.receiver_volume_m3": FieldSpec("receiver volume", "liquid_volume"),
    "package.control.pressure_band_Pa": FieldSpec("control pressure band", "pressure_difference"),
    "package.control.unloaded_power_fraction": FieldSpec("unloaded power", "fraction"),
    "package.control.blowdown_time_s": FieldSpec("blowdown time", "time"),
    "package.control.zero_flow_power_fraction": FieldSpec("power at zero flow", "fraction"),
    "package.control.min_speed_fraction": FieldSpec("minimum speed", "fraction"),
    "package.control.specific_power_rise_at_min_speed": FieldSpec("specific power rise at minimum speed",
                                                                  "fraction"),
    "package.control.drive_efficiency": FieldSpec("drive efficiency", "fraction"),
    "package.control.drive_fixed_loss_share": FieldSpec("drive fixed-loss share", "fraction"),
    "package.control.max_starts_per_hour": FieldSpec("starts limit", "per_hour"),
    "package.control.points": FieldSpec("measured part-load curve"),
    "package.control.points[*].flow_fraction": FieldSpec("flow", "fraction"),
    "package.control.points[*].power_fraction": FieldSpec("power", "fraction"),
    "package.motor.rated_output_W": FieldSpec("motor rated output", "power"),
    "package.motor.fixed_loss_share": FieldSpec("motor fixed-loss share", "fraction"),
    "package.motor.efficiency_points[*].load_fraction": FieldSpec("load", "fraction"),
    "package.motor.efficiency_points[*].efficiency": FieldSpec("efficiency", "fraction"),
    "package.fan_power_W": FieldSpec("cooler fan power", "power"),
    "package.pump": FieldSpec("coolant pump"),
    "package.pump.head_m": FieldSpec("pump head", "length"),
    "package.pump.efficiency": FieldSpec("pump efficiency", "fraction"),
    "package.other_loads": FieldSpec("other loads"),
    "package.other_loads[*].name": FieldSpec("name"),
    "package.other_loads[*].power_W": FieldSpec("power", "power"),
    "package.load": FieldSpec("stated load", "fraction"),
    "package.part_loads": FieldSpec("data-sheet loads"),
    "package.part_loads[*]": FieldSpec("data-sheet load", "fraction"),
    "package.load_profile": FieldSpec("load profile"),
    "package.load_profile[*].load": FieldSpec("load", "fraction"),
    "package.load_profile[*].hours": FieldSpec("hours", "hours"),
    **{f"year.profile.{entries}[*].{key}": FieldSpec(label, quantity)
       for entries in ("months", "bins")
       for key, label, quantity in (("temperature_K", "temperature", "temperature"),
                                    ("relative_humidity", "relative humidity", "fraction"),
                                    ("hours", "hours", "hours"), ("load", "load", "fraction"),
                                    ("coolant_inlet_temperature_K", "coolant inlet temperature", "temperature"),
                                    ("label", "name", None))},
}

_INDEX = re.compile(r"\[\d+\]")


def _pattern(path: str) -> str:
    return _INDEX.sub("[*]", path)


def spec_for(path: str) -> FieldSpec | None:
    """The :class:`FieldSpec` of a path, or None for paths that are not entry fields."""
    return _SPECS.get(_pattern(path))


def quantity_for(path: str, doc: dict) -> str | None:
    """Display quantity of the field at ``path`` (``flow.value`` depends on the flow kind)."""
    if path == "flow.value":
        return FLOW_QUANTITY.get(get_in(doc, "flow.kind"), "mass_flow")
    spec = spec_for(path)
    return spec.quantity if spec else None


def _where(path: str, doc: dict) -> str:
    tokens = parse_path(path)
    if len(tokens) >= 2 and tokens[0] == "stages" and isinstance(tokens[1], int):
        n = tokens[1] + 1
        if len(tokens) >= 3 and tokens[2] == "cooler":
            count = len(doc.get("stages", []) if isinstance(doc, dict) else [])
            return "aftercooler" if tokens[1] == count - 1 else f"intercooler {n}"
        return f"stage {n}"
    if tokens and tokens[0] == "site":
        return "site"
    if len(tokens) >= 4 and tokens[:2] == ["year", "profile"] and isinstance(tokens[3], int):
        if tokens[2] == "months" and tokens[3] < 12:
            return MONTH_NAMES[tokens[3]]
        name = get_in(doc, format_path(tokens[:4]) + ".label", "")
        return f"bin {tokens[3] + 1}" + (f" ({name})" if isinstance(name, str) and name else "")
    if tokens and tokens[0] == "package" and any(isinstance(t, int) for t in tokens) and tokens[1] != "part_loads":
        i = next(t for t in tokens if isinstance(t, int))
        return {"load_profile": "load-profile row", "other_loads": "other load", "points": "curve point",
                "efficiency_points": "motor point"}.get(tokens[-2] if isinstance(
                    tokens[-1], int) else tokens[-3], "row") + f" {i + 1}"
    return ""


def describe(path: str, doc: dict) -> str:
    """Human name of a field: ``"Stage 2 efficiency"``, ``"Ambient temperature"``."""
    if path in ("", "(document)"):
        return "Project"
    if path == "stages":
        return "Stage list"
    try:
        parse_path(path)
    except InputError:  # an unknown key that is no plain name ("a.b", cut at length): shown as the file has it
        return path
    spec = spec_for(path)
    where = _where(path, doc)
    if spec is None:
        tokens = parse_path(path)
        last = next((t for t in reversed(tokens) if isinstance(t, str)), path)
        label = last.replace("_", " ")
        if len(tokens) == 2 and isinstance(tokens[1], int):
            label = ""
    elif path == "flow.value":
        label = FLOW_LABEL.get(get_in(doc, "flow.kind"), spec.label)
    else:
        label = spec.label
    if (path.startswith("year.profile.") or path.startswith("package.")) and where:
        text = f"{where} {label}"
    elif where.startswith("stage") or where.endswith("cooler") or where.startswith("intercooler"):
        label = label.replace("cooler ", "") if "cooler" in where else label
        text = f"{where} {label}".strip()
    else:
        text = label
    return text[:1].upper() + text[1:]


def edit_text(path: str, doc: dict) -> str:
    """Undo-stack description of an edit of ``path``: ``"Change stage 2 efficiency"``."""
    name = describe(path, doc)
    return f"Change {name[:1].lower() + name[1:]}"


def schema_node(path: str, doc: dict):
    """The schema node (``Num``, ``Choice`` …) that governs ``path``, or None."""
    node = PROJECT
    value = doc
    for t in parse_path(path):
        if isinstance(node, Items):
            if not isinstance(t, int):
                return None
            node = node.item
        elif isinstance(node, Obj):
            node = node.fields.get(t)
        elif isinstance(node, Variant):
            kind = value.get(node.tag) if isinstance(value, dict) else None
            if t == node.tag:
                return None
            node = node.variants.get(kind, {}).get(t)
        else:
            return None
        if node is None:
            return None
        value = value[t] if isinstance(value, (dict, list)) and _has(value, t) else None
    return node


def _has(container, t) -> bool:
    if isinstance(container, list):
        return isinstance(t, int) and 0 <= t < len(container)
    return t in container


def range_text(path: str, doc: dict, system: str = "SI", barometric_Pa: float = 101_325.0,
               gauge: bool = False) -> str:
    """The allowed range of a numeric field in display units, from the schema."""
    node = schema_node(path, doc)
    quantity = quantity_for(path, doc)
    if not isinstance(node, Num):
        return ""
    if quantity is None:
        quantity = "ratio"
    kw = {"gauge": gauge, "barometric_Pa": barometric_Pa} if quantity == "pressure" else {}
    u = units.unit(quantity, system, **kw)
    if quantity in ("pressure",) and not gauge:
        u = units.unit(quantity, system, barometric_Pa=barometric_Pa)

    def show(v: float) -> str:
        if v in (float("inf"), float("-inf")):
            return "∞"
        shown = u.to_display(v)
        return f"{shown:.6g}"

    sym = f" {u.symbol}" if u.symbol else ""
    if node.lo_open:
        return f"above {show(node.lo)}{sym}, up to {show(node.hi)}{sym}"
    if node.hi_open:
        return f"from {show(node.lo)}{sym}, below {show(node.hi)}{sym}"
    return f"{show(node.lo)} to {show(node.hi)}{sym}"


def problem_message(problem: Problem, doc: dict, system: str = "SI",
                    barometric_Pa: float = 101_325.0, gauge: bool = False) -> str:
    """One line for the messages area, in display units where the field is a quantity."""
    found = "" if problem.value is None else f" (found {shown_value(problem.value)})"
    try:
        parse_path(problem.field)
    except InputError:  # an unknown key that is no plain name: no schema node, no quantity
        return f"{problem.field}: {problem.expected}{found}"
    name = describe(problem.field, doc)
    node = schema_node(problem.field, doc)
    quantity = quantity_for(problem.field, doc)
    value = problem.value
    expected = problem.expected
    if isinstance(node, Num) and quantity and isinstance(value, (int, float)) and not isinstance(value, bool) \
            and expected.startswith("expected a"):
        spec = spec_for(problem.field)
        g = gauge and bool(spec and spec.gauge_aware)
        shown = units.format_value(float(value), quantity, system, with_unit=True,
                                   **({"gauge": g, "barometric_Pa": barometric_Pa}
                                      if quantity == "pressure" else {}))
        rng = range_text(problem.field, doc, system, barometric_Pa, g)
        return f"{name}: {shown} is out of range (allowed: {rng})."
    if value is None and expected == "required key is missing":
        return f"{name}: a value is required."
    return f"{name}: {expected}{found}"
