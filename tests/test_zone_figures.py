"""Issue 17 item 2: a condensing cooler's figures. F is at most 1 wherever it is reported; a wet
zone is driven by its log-mean enthalpy difference instead; a counter-flow cooler that condenses
still has its F (1), ε and NTU.

Sources: the wet-zone model and its enthalpy potential are those of J. E. Braun, S. A. Klein,
J. W. Mitchell, ASHRAE Transactions 95(2) (1989) 164–174 and J. L. Threlkeld, Thermal
Environmental Engineering, 2nd ed., 1970, ch. 13; F ≤ 1 and F = 1 for counter-flow by the
definition of the LMTD method (R. K. Shah, D. P. Sekulić, Fundamentals of Heat Exchanger Design,
Wiley, 2003, §3.7; F. P. Incropera et al., Fundamentals of Heat and Mass Transfer, 6th ed., 2007,
§11.3). Moist-air enthalpies of the reference integration come from CoolProp's HAPropsSI (ASHRAE
RP-1485), another implementation from the core's.
"""
from __future__ import annotations

import pytest
from hypothesis import HealthCheck, assume, given, settings
from hypothesis import strategies as st

from stagewright.gui.presentation import balance_tables
from stagewright.gui.report import sections
from stagewright.gui.report.layout import Pager
from conftest import SAMPLES
from test_wet_zone import CP_M, M, T_DEW, WATER, h_eq, hot_at
from stagewright.core import StagewrightError, solve
from stagewright.core.exchanger import size_exchanger
from stagewright.core.exchanger.effectiveness import ARRANGEMENTS
from stagewright.core.project import load

SAMPLE_FILES = sorted(SAMPLES.glob("*.json"))
F_LIMIT = 1.0 + 1e-9  # F ≤ 1, with room for rounding in Q/(UA·LMTD) of a counter-flow zone


class RecordingPager(Pager):
    """A pager that keeps the tables printed on it (what the PDF shows, as display strings)."""

    def __init__(self):
        super().__init__("A4")
        self.tables = []

    def table(self, table):
        self.tables.append(table)


def _printed_factors(result: dict, system: str = "SI") -> tuple[list[str], dict]:
    """Every F cell the PDF's exchanger and zone tables print, and those tables by title."""
    p = RecordingPager()
    sections.exchangers_table(p, result, system)
    printed, tables = [], {}
    for t in p.tables:
        tables[t.title] = t
        headers = [c.header for c in t.columns]
        if "F" in headers:
            printed += [row[headers.index("F")] for row in t.rows]
    return printed, tables


def _factors_in(result: dict) -> list[float]:
    """Every LMTD correction factor a result reports, coolers and zones (None left out)."""
    values = []
    for st_ in result["stages"]:
        c = st_["cooler"] or {}
        values.append(c.get("lmtd_correction_factor"))
        values += [z["lmtd_correction_factor"] for z in c.get("zones") or []]
    return [v for v in values if v is not None]


def _check_result(result: dict) -> None:
    assert all(f <= F_LIMIT for f in _factors_in(result)), _factors_in(result)
    for st_ in result["stages"]:
        c = st_["cooler"] or {}
        for z in c.get("zones") or []:
            if z["kind"] == "wet":
                assert z["lmtd_correction_factor"] is None and z["log_mean_enthalpy_difference_J_kg"] > 0.0
            else:
                assert z["log_mean_enthalpy_difference_J_kg"] is None
        if c.get("coolant_kind"):
            assert 0.0 < c["effectiveness"] < 1.0 and c["ntu"] > 0.0
            if c["arrangement"] == "counter_flow":
                assert c["lmtd_correction_factor"] == pytest.approx(1.0, abs=1e-9)
    printed, _ = _printed_factors(result)
    assert all(float(text) <= 1.0 for text in printed if text not in ("", "—")), printed


# ---- the wet zone's driving force --------------------------------------------------------------

def test_counterflow_wet_zone_duty_is_enthalpy_conductance_times_lmed():
    # the enthalpy form of q = UA·ΔT_lm for counter-flow (Incropera eq. 11.14; Braun et al. 1989):
    # q_wet = UA*·Δh_lm, with UA* = UA_wet / c_p,m the zone's enthalpy conductance
    ex = size_exchanger("counter_flow", hot_at(306.15), WATER, 293.15, flow=2.0)
    wet = ex.zones[1]
    assert wet.kind == "wet" and wet.correction_factor is None
    assert wet.duty_W == pytest.approx(wet.ua_W_K / CP_M * wet.log_mean_enthalpy_difference_J_kg, rel=1e-9)


def test_lmed_matches_direct_integration_of_the_enthalpy_potential():
    # mean enthalpy potential of the wet zone by direct integration of dUA* = dQ / (h_a − h_s(T_c)) along
    # the counter-flow zone (Threlkeld 1970, ch. 13) with HAPropsSI enthalpies: q_wet / ∫dUA*. The zone
    # model linearises h_s over the coolant range (Braun et al. 1989); agreement to 0.5 % as for the
    # zone's UA in test_wet_zone (tolerance common practice, no source)
    from scipy.integrate import quad
    from scipy.optimize import brentq

    t_out, flow = 306.15, 2.0
    ex = size_exchanger("counter_flow", hot_at(t_out), WATER, 293.15, flow=flow)
    wet = ex.zones[1]
    h_w0 = WATER.h(293.15)

    def t_coolant(q):
        return brentq(lambda t: WATER.h(t) - (h_w0 + q / flow), 293.15, 373.0, xtol=1e-10)

    h_out = h_eq(t_out)
    q_wet = M * (h_eq(T_DEW) - h_out)
    ua_star = quad(lambda q: 1.0 / (h_out + q / M - h_eq(t_coolant(q))), 0.0, q_wet, limit=200)[0]
    assert wet.log_mean_enthalpy_difference_J_kg == pytest.approx(q_wet / ua_star, rel=5e-3)


@pytest.mark.parametrize("arrangement", sorted(ARRANGEMENTS))
def test_every_arrangement_reports_f_at_most_one_and_lmed_for_its_wet_zone(arrangement):
    ex = size_exchanger(arrangement, hot_at(308.15), WATER, 293.15, flow=3.0)
    dry, wet = ex.zones
    assert 0.0 < dry.correction_factor <= F_LIMIT
    assert wet.correction_factor is None and wet.log_mean_enthalpy_difference_J_kg > 0.0
    assert 0.0 < ex.effectiveness < 1.0 and ex.ntu > 0.0
    if arrangement == "counter_flow":
        assert ex.correction_factor == 1.0
    else:
        assert ex.correction_factor is None  # no single F spans a dry and a wet zone


# ---- every report of every sample ---------------------------------------------------------------

@pytest.mark.parametrize("path", SAMPLE_FILES, ids=lambda p: p.stem)
def test_every_f_of_every_sample_is_at_most_one(path):
    _check_result(solve(load(path)).to_dict())


def test_foundry_aftercooler_prints_its_zones():
    result = solve(load(SAMPLES / "three_stage_site_year.json")).to_dict()
    _, tables = _printed_factors(result)
    zones = tables["Condensing coolers, zone by zone"]
    headers = [c.header for c in zones.columns]
    assert [row[headers.index("Zone")] for row in zones.rows] == ["dry", "wet"]
    wet = result["stages"][2]["cooler"]["zones"][1]
    dry_row, wet_row = zones.rows
    assert wet_row[headers.index("F")] == "" and dry_row[headers.index("Δh_lm")] == ""
    assert float(wet_row[headers.index("Δh_lm")]) == pytest.approx(wet["log_mean_enthalpy_difference_J_kg"] / 1e3,
                                                                   abs=0.005)
    assert zones.columns[headers.index("Δh_lm")].unit == "kJ/kg"


# ---- a plain counter-flow water cooler ----------------------------------------------------------

def _humid_counterflow_doc(model="real_gas", rh=0.7, t0=303.15, p_out=8e5, approach=8.0, dt_coolant=5.0,
                           arrangement="counter_flow", coolant=None) -> dict:
    """Invented: one stage and a water-cooled aftercooler in humid air (it condenses)."""
    return {"site": {"ambient_temperature_K": t0, "barometric_pressure_Pa": 101_325.0, "relative_humidity": rh},
            "fluid": {"model": model}, "flow": {"kind": "mass", "value": 0.5}, "discharge_pressure_Pa": p_out,
            "stages": [{"efficiency": {"kind": "isentropic", "value": 0.8},
                        "cooler": {"approach_K": approach, "coolant_inlet_temperature_K": t0 - dt_coolant,
                                   "arrangement": arrangement, "pressure_drop_Pa": 0.0,
                                   "coolant": coolant or {"kind": "water", "temperature_rise_K": 8.0}}}]}


def test_condensing_counterflow_water_cooler_prints_f_epsilon_and_ntu():
    result = solve(_humid_counterflow_doc()).to_dict()
    c = result["stages"][0]["cooler"]
    assert [z["kind"] for z in c["zones"]] == ["dry", "wet"]
    _, tables = _printed_factors(result)
    t = tables["Cooler exchangers"]
    headers = [col.header for col in t.columns]
    row = t.rows[0]
    assert row[headers.index("F")] == "1.000"
    assert float(row[headers.index("ε")]) == pytest.approx(c["effectiveness"], abs=5e-4)
    assert float(row[headers.index("NTU")]) == pytest.approx(c["ntu"], abs=5e-4)
    # ε of the whole cooler from its definition, q / (C_min ΔT_max), with the mean capacity rates of the
    # terminal changes (Shah & Sekulić 2003, §3.3), written out here from the result's own temperatures
    q = c["duty_W"]
    t_hi, t_ho = c["inlet"]["temperature_K"], c["outlet"]["temperature_K"]
    t_ci, t_co = c["coolant_inlet_temperature_K"], c["coolant_outlet_temperature_K"]
    c_min = min(q / (t_hi - t_ho), q / (t_co - t_ci))
    assert c["effectiveness"] == pytest.approx(q / (c_min * (t_hi - t_ci)), rel=1e-6)
    assert c["ntu"] == pytest.approx(c["ua_W_K"] / c_min, rel=1e-6)


# ---- random condensing coolers -----------------------------------------------------------------

_COOLANTS = st.one_of(
    st.builds(lambda rise: {"kind": "water", "temperature_rise_K": rise}, st.floats(2.0, 15.0)),
    st.builds(lambda rise, x: {"kind": "glycol", "glycol_fraction": x, "temperature_rise_K": rise},
              st.floats(2.0, 12.0), st.floats(0.1, 0.5)),
    st.builds(lambda flow: {"kind": "air", "flow_kg_s": flow}, st.floats(2.0, 12.0)),
)


@settings(max_examples=40, deadline=None, suppress_health_check=[HealthCheck.too_slow])
@given(model=st.sampled_from(["ideal_gas", "constant_cp", "real_gas"]), rh=st.floats(0.4, 1.0),
       t0=st.floats(283.15, 318.15), p_out=st.floats(4e5, 1.5e6), approach=st.floats(3.0, 20.0),
       dt_coolant=st.floats(0.0, 10.0), arrangement=st.sampled_from(sorted(ARRANGEMENTS)), coolant=_COOLANTS)
def test_random_condensing_coolers_report_f_at_most_one(model, rh, t0, p_out, approach, dt_coolant, arrangement,
                                                        coolant):
    if coolant["kind"] == "air":
        dt_coolant = 0.0  # fan air enters at the site temperature
    doc = _humid_counterflow_doc(model, rh, t0, p_out, approach, dt_coolant, arrangement, coolant)
    try:
        result = solve(doc).to_dict()
    except StagewrightError:
        assume(False)  # a temperature cross or a state beyond a model's range: not a cooler to report
    c = result["stages"][0]["cooler"]
    assume(len(c["zones"]) == 2)
    _check_result(result)


def test_the_zone_table_reads_every_zone_key():
    # the zone table prints what a zone dict holds (the sample check in test_presentation_tables
    # covers the paths; here: F and Δh_lm are the two figures that differ between the kinds)
    ids = [f.id for f in balance_tables.ZONES]
    assert "lmtd_correction_factor" in ids and "lmed" in ids
