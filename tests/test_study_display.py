"""What the study panel shows, Qt-free: cells and headers in SI and US units, limit messages
in display units naming the project's field, values typed for a site variable.

Unit factors are exact by definition (NIST SP 811, 2008, App. B: 1 hp = 745.69987158 W,
T[°F] = T[K]·9/5 − 459.67, 1 K difference = 1.8 °F). The comparison rows are the plain data
of ``stagewright.core.study``; a few are written out here so every kind of limit is covered.
"""
from __future__ import annotations

import pytest

from stagewright.gui.study.display import (COLUMNS, case_label, cells, format_values, header, limit_messages,
                               limit_summary, parse_values, tooltip)

HP_W = 745.69987158


def row(**kw) -> dict:
    base = {"stages": 2, "pressure_ratios": [3.0, 3.0], "discharge_temperatures_K": [428.15, 433.15],
            "max_discharge_temperature_K": 433.15, "driver_power_W": 250_000.0,
            "specific_power_kW_per_m3_min": 5.5, "heat_rejected_W": 240_000.0, "intercooler_duty_W": [120_000.0],
            "aftercooler_duty_W": 118_000.0, "condensate_kg_s": 0.0, "exergy_destroyed_W": 70_000.0,
            "second_law_efficiency": 0.72, "saving_W": 12_000.0, "saving_kWh_per_year": 96_000.0,
            "saving_cost_per_year": 14_400.0, "operating_hours_per_year": 8000.0, "energy_price_per_kWh": 0.15,
            "feasible": True, "binding_limits": [], "note": "n"}
    base.update(kw)
    return base


def test_cells_in_si_and_us():
    si, us = cells(row(), "SI"), cells(row(), "US")
    assert si["ratios"] == "3.000 × 3.000" and si["stages"] == "2"
    assert si["temperatures"] == "155.0 · 160.0"
    assert us["temperatures"] == "311.0 · 320.0"  # 428.15 K = 311 °F exactly
    assert si["power"] == "250.00" and float(us["power"]) == pytest.approx(250_000.0 / HP_W, abs=0.005)
    assert si["eta2"] == "72.00" and si["saving_year"] == "14 400" and si["feasible"] == "yes"
    assert header(COLUMNS[[c.key for c in COLUMNS].index("power")], "US") == "Driver power\n[hp]"
    assert header(COLUMNS[[c.key for c in COLUMNS].index("condensate")], "SI") == "Condensate\n[kg/h]"
    assert "96 000 kWh per year" in tooltip(row(), "saving_year", "SI")
    assert tooltip(row(), "heat", "SI") == "Cooler duties — intercooler 1: 120.00 kW, aftercooler: 118.00 kW"


def test_a_row_without_a_split_shows_dashes():
    empty = row(pressure_ratios=None, discharge_temperatures_K=None, driver_power_W=None, saving_W=None,
                saving_cost_per_year=None, feasible=False,
                binding_limits=[{"field": "discharge_pressure_Pa", "limit": 9e6, "value": 4e6,
                                 "closest_feasible": 4e6, "status": "violated", "message": "m"}])
    c = cells(empty, "SI")
    assert c["ratios"] == c["temperatures"] == c["power"] == c["saving_year"] == "—"
    assert c["feasible"] == "no" and c["limits"] == "discharge pressure not met"


LIMITS = [
    ({"field": "stages[1].max_discharge_temperature_K", "limit": 450.0, "value": 450.0,
      "closest_feasible": None, "status": "active"},
     "note", "stages[0].max_discharge_temperature_K",
     "2-stage option: stage 2 is held at its discharge-temperature limit of 350.3 °F."),
    ({"field": "stages[0].max_discharge_temperature_K", "limit": 450.0, "value": 613.15,
      "closest_feasible": 613.15, "status": "violated"},
     "warning", "stages[0].max_discharge_temperature_K",
     "2-stage option exceeds the discharge-temperature limit of 350.3 °F: its best split still discharges "
     "644.0 °F from stage 1. Add stages."),
    ({"field": "stages[1].cooler.approach_K", "limit": 10.0, "value": 300.0, "closest_feasible": 5.0,
      "status": "violated"},
     "warning", "stages[2].cooler.approach_K",
     "2-stage option is not possible: stage 2 discharges at most 80.3 °F, below its aftercooler's outlet "
     "at an approach of 18.0 °F (a cooler cannot heat the air). Use fewer stages or an approach of at most 9.0 °F."),
    ({"field": "stages[0].cooler.outlet_temperature_K", "limit": 303.15, "value": 303.15,
      "closest_feasible": None, "status": "active"},
     "note", "stages[0].cooler.outlet_temperature_K",
     "2-stage option: stage 1 discharges just at its intercooler 1's outlet temperature, 86.0 °F."),
    ({"field": "stages[1].max_pressure_ratio", "limit": 2.5, "value": None, "closest_feasible": 3.0,
      "status": "violated"},
     "warning", "stages[0].max_pressure_ratio",
     "2-stage option: a highest pressure ratio of 2.5 cannot reach the discharge pressure; at least 3.0000 "
     "is needed (or add stages)."),
]


@pytest.mark.parametrize("limit, severity, field, text", LIMITS)
def test_limit_messages_in_display_units_name_the_project_field(limit, severity, field, text):
    # the project has three stages; the 2-stage option's stages are copies of its first one
    out = limit_messages([row(binding_limits=[limit], feasible=severity == "note")], 3, "US")
    assert out[0] == (severity, text, field)


def test_cautions_follow_temperature_limits_and_condensate():
    lim = LIMITS[0][0]
    out = limit_messages([row(binding_limits=[lim]), row(stages=3, condensate_kg_s=0.01)], 2, "SI")
    cautions = [t for s, t, _ in out if s == "caution"]
    assert len(cautions) == 2
    assert cautions[0].startswith("Caution — discharge temperature:")
    assert cautions[1].startswith("Caution — condensate disposal:")
    assert limit_summary(row(binding_limits=[lim, lim])) == "discharge-temperature limit active"


def test_an_infeasible_option_without_a_violated_limit_still_warns():
    out = limit_messages([row(feasible=False)], 2, "SI", prefix="Ambient temperature 35.00 °C, ")
    assert out == [("warning", "Ambient temperature 35.00 °C, 2-stage option does not meet its limits.", "")]


def test_site_variable_values_round_trip_through_display_units():
    si = parse_values("41; 59 95", "ambient_temperature_K", "US")
    assert si == pytest.approx([278.15, 288.15, 308.15], abs=1e-9)  # °F → K, NIST SP 811
    assert format_values(si, "ambient_temperature_K", "SI") == "5, 15, 35"
    assert parse_values("30, 60", "relative_humidity", "SI") == pytest.approx([0.3, 0.6])
    with pytest.raises(ValueError, match="'warm' is not a number"):
        parse_values("20, warm", "ambient_temperature_K", "SI")
    with pytest.raises(ValueError, match="one or more values"):
        parse_values("  ", "ambient_temperature_K", "SI")
    assert case_label("ambient_temperature_K", 308.15, "SI") == "Ambient temperature 35.00 °C"
    assert case_label(None, None, "SI") == "Project site"
