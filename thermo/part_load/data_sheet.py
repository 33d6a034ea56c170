"""Data-sheet figures: flow and specific power at the ISO 1217 reference conditions and at the site.

A supplier states a compressor package's free air delivery and specific power at the standard
reference conditions of ISO 1217 — inlet 100 kPa and 20 °C, dry air, cooling water at 20 °C
(ISO 1217:2009, the reference conditions of its acceptance-test annexes; from memory, check
the edition you compare against) — at full load and, for controls that regulate, at stated
part loads. This module solves the project at those conditions and at the site as stated
and runs each through the package's control (:mod:`.package`), so the two columns can be
laid beside a supplier's sheet. The flow is held as the project states it (a free air
delivery stays a volume, a mass flow a mass); the discharge pressure too (a gauge pressure
stays gauge, on the reference's 100 kPa).
"""
from __future__ import annotations

__all__ = ["ISO1217_REFERENCE", "SheetColumn", "DataSheet", "data_sheet", "reference_document"]

import copy
from dataclasses import dataclass, field

from stagewright.core.errors import InputError
from stagewright.core.part_load.controls import CONTROL_LABELS
from stagewright.core.part_load.full_load import full_load_of
from stagewright.core.part_load.package import package_point
from stagewright.core.project.validation import normalise

#: ISO 1217 standard reference conditions (from memory): inlet pressure [Pa], inlet temperature [K],
#: relative humidity [-], cooling-water inlet temperature [K]
ISO1217_REFERENCE = {"inlet_pressure_Pa": 100_000.0, "inlet_temperature_K": 293.15, "relative_humidity": 0.0,
                     "coolant_inlet_temperature_K": 293.15}


@dataclass
class SheetColumn:
    """One condition of the sheet: the intake, the discharge pressure and the package at each load (SI)."""

    condition: str  #: "iso1217_reference" or "site"
    label: str
    inlet_pressure_Pa: float
    inlet_temperature_K: float
    relative_humidity: float
    discharge_pressure_Pa: float
    points: list  #: PackagePoint at each of ``package.part_loads``

    def to_dict(self) -> dict:
        d = {k: getattr(self, k) for k in ("condition", "label", "inlet_pressure_Pa", "inlet_temperature_K",
                                           "relative_humidity", "discharge_pressure_Pa")}
        d["points"] = [p.to_dict() for p in self.points]
        return d


@dataclass
class DataSheet:
    """The package's data-sheet figures: a reference column and a site column."""

    title: str
    control_label: str
    columns: list
    notes: list = field(default_factory=list)

    def to_dict(self) -> dict:
        return {"title": self.title, "control": self.control_label,
                "columns": [c.to_dict() for c in self.columns], "notes": list(self.notes)}


def reference_document(norm: dict) -> dict:
    """The normalised project at the ISO 1217 reference conditions: site, humidity and the
    water and glycol coolers' coolant inlet (air-cooled coolers follow the reference ambient)."""
    ref = copy.deepcopy(norm)
    ref["site"].update({"ambient_temperature_K": ISO1217_REFERENCE["inlet_temperature_K"],
                        "barometric_pressure_Pa": ISO1217_REFERENCE["inlet_pressure_Pa"], "elevation_m": None,
                        "relative_humidity": ISO1217_REFERENCE["relative_humidity"], "dew_point_K": None,
                        "humidity_ratio": None})
    ref["year"] = None
    ref["heat_recovery"] = None
    for stage in ref["stages"]:
        cooler = stage.get("cooler")
        if cooler and cooler.get("coolant") and cooler["coolant"]["kind"] in ("water", "glycol"):
            cooler["coolant_inlet_temperature_K"] = ISO1217_REFERENCE["coolant_inlet_temperature_K"]
    return normalise(ref)


def _column(norm: dict, condition: str, label: str, solve_fn) -> SheetColumn:
    res = solve_fn(norm)
    full = full_load_of(res, norm["driver"]["efficiency"])
    pkg = norm["package"]
    # the solve's dead state is the site it resolved: its barometric pressure and ambient temperature
    return SheetColumn(condition=condition, label=label, inlet_pressure_Pa=res.dead.P0,
                       inlet_temperature_K=res.dead.T0,
                       relative_humidity=norm["site"].get("relative_humidity") or 0.0,
                       discharge_pressure_Pa=res.delivery.P,
                       points=[package_point(pkg, full, x) for x in pkg["part_loads"]])


def data_sheet(doc: dict, solve_fn=None) -> DataSheet:
    """The package's figures at the ISO 1217 reference conditions and at the site.

    Parameters
    ----------
    doc : dict
        Project document with a ``package`` section.
    solve_fn : callable, optional
        ``solve_fn(norm) -> TrainResult``; default a lean exact solve
        (:func:`stagewright.core.solve.solve_normalised` with ``detail=False``).

    Returns
    -------
    DataSheet

    Raises
    ------
    InputError
        If the project has no ``package`` section (naming it) or is invalid; a condition that
        cannot be solved raises its own error.

    Examples
    --------
    >>> doc = {"site": {"ambient_temperature_K": 303.15, "barometric_pressure_Pa": 98_000.0},
    ...        "fluid": {"model": "constant_cp"}, "flow": {"kind": "mass", "value": 0.5},
    ...        "discharge_pressure_Pa": 8e5, "stages": [{"efficiency": {"kind": "isentropic", "value": 0.8}}],
    ...        "package": {"control": {"kind": "modulation"}, "part_loads": [1.0, 0.5]}}
    >>> sheet = data_sheet(doc)
    >>> [c.condition for c in sheet.columns]
    ['iso1217_reference', 'site']
    >>> ref, site = sheet.columns  # the same mass flow from a cooler, denser intake: less power
    >>> ref.points[0].shaft_power_W < site.points[0].shaft_power_W
    True
    """
    norm = normalise(doc)
    if not norm.get("package"):
        raise InputError("package", None, "add a 'package' section (capacity control, motor, auxiliaries) "
                         "for data-sheet figures")
    if solve_fn is None:
        from stagewright.core.solve import solve_normalised

        def solve_fn(n):
            return solve_normalised(n, detail=False)
    ref = _column(reference_document(norm), "iso1217_reference", "ISO 1217 reference conditions", solve_fn)
    site = _column(norm, "site", "site as stated", solve_fn)
    flow = norm["flow"]
    notes = [f"flow held as the project states it ({flow['kind'].replace('_', ' ')}) at both conditions",
             "reference conditions: inlet 100 kPa, 20 °C, dry air, cooling water 20 °C "
             "(ISO 1217 standard reference conditions, from memory)"]
    return DataSheet(title=norm.get("title") or "", control_label=CONTROL_LABELS[norm["package"]["control"]["kind"]],
                     columns=[ref, site], notes=notes)
