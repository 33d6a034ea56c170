"""Presentation table of a staging comparison: the columns of its rows (one row per number of stages).

Rows are those of :meth:`stagewright.core.study.StagingComparison.rows` (SI floats, unit in each key).
The study panel in the window (:mod:`stagewright.gui.study.display`), ``stagewright study``'s text table
(:mod:`stagewright.gui.cli.study_table`) and the PDF report's staging comparison (:mod:`stagewright.gui.report.sections`)
read :data:`STAGING`; each shows the columns its ``where`` names, in table order. A column placed
twice is the same figure at the place one output lists it. The PDF leaves out a column no row
has a value in. No Qt.
"""
from __future__ import annotations

__all__ = ["STAGING"]

from dataclasses import replace

from stagewright.gui.presentation.figures import Figure, Look


def _placed(figure: Figure, *outputs: str) -> Figure:
    """``figure`` shown only in ``outputs`` (at this place of the table)."""
    return replace(figure, where=frozenset(outputs))


_RATIOS = Figure("pressure_ratios", "Pressure ratios", id="ratios", decimals=3, joiner=" × ",
                 note="Stage pressure ratios at the option's least-power split, first stage first",
                 looks={"text": Look(label="pressure ratios", width=34), "pdf": Look(missing="", when="any")})
_HOTTEST = Figure("max_discharge_temperature_K", "Max. discharge T", "temperature", id="max_temperature",
                  looks={"text": Look(label="max T2", width=9)})
_SAVING = Figure("saving_W", "Saving", "power", id="saving",
                 note="Driver power saved against the fewest-stage option that meets every limit",
                 looks={"text": Look(label="saving", width=8), "pdf": Look(when="any")})
_SAVING_YEAR = Figure("saving_cost_per_year", "Saving per year", "money", id="saving_year",
                      note="Energy cost saved per year, in the currency of the energy price",
                      looks={"text": Look(label="per year", width=11)})
_FEASIBLE = Figure("feasible", "Meets limits", style="yes_no", id="feasible",
                   note="Whether the option meets every limit of its stages", looks={"pdf": Look(label="Feasible")})

#: columns of a staging comparison (paths into a comparison row)
STAGING: tuple[Figure, ...] = (
    Figure("stages", "Stages", decimals=0, align="left", note="Number of stages of the option",
           looks={"text": Look(label="stages", width=7)}),
    _placed(_RATIOS, "text", "pdf"),
    _placed(_HOTTEST, "text"),
    Figure("driver_power_W", "Driver power", "power", id="power", note="Driver input power",
           looks={"text": Look(label="driver", width=9)}),
    Figure("specific_power_kW_per_m3_min", "Specific power", "specific_power", id="specific",
           note="Driver input power per unit of free air delivery",
           looks={"text": Look(label="specific", width=14), "pdf": Look(when="any")}),
    _placed(_HOTTEST, "pdf"),
    _placed(_SAVING, "window", "pdf"),
    _placed(_SAVING_YEAR, "window"),
    _placed(_FEASIBLE, "window", "pdf"),
    _placed(_RATIOS, "window"),
    Figure("discharge_temperatures_K", "Discharge temperatures", "temperature", id="temperatures", decimals=1,
           joiner=" · ", note="Discharge temperature of each stage", where={"window"}),
    Figure("heat_rejected_W", "Heat rejected", "heat_flow", id="heat",
           note="Coolers, casings and mechanical losses together", where={"window"}),
    Figure("cooler_duty_W", "Cooler duty", "heat_flow", id="coolers", where={"text"},
           looks={"text": Look(label="coolers", width=9)}),
    Figure("condensate_kg_s", "Condensate", "water_flow", id="condensate", note="Water condensed in the coolers",
           where={"window", "text"}, looks={"text": Look(label="condensate", width=11)}),
    Figure("exergy_destroyed_W", "Exergy destroyed", "power", id="xdest",
           note="Exergy destroyed in the train (T0 · S_gen)", where={"window", "text"},
           looks={"text": Look(label="X_dest", width=8)}),
    Figure("second_law_efficiency", "Second-law efficiency", "fraction", id="eta2",
           note="Exergy gained by the air over driver input", where={"window", "text"},
           looks={"text": Look(label="η_II", width=7)}),
    _placed(_SAVING, "text"),
    _placed(_SAVING_YEAR, "text"),
    Figure("binding_limits", "Binding limits", style="text", id="limits",
           note="Limits that decide the split (hover for details)", where={"window"}),
)
