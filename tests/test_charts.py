"""Charts built on plain matplotlib figures (no Qt): T–s path, power split, staging study.

External checks: isobars against CoolProp's high-level ``PropsSI`` (Lemmon et al. 2000, a
different call path from our AbstractState model), perfect-gas entropy relations
(Çengel & Boles, *Thermodynamics*, 8th ed., 2015, §7-9), the exergy balance of a
steady-flow system (Bejan, Tsatsaronis & Moran, *Thermal Design and Optimization*, 1996,
§3.5) and the exact unit definitions of NIST SP 811 (2008), Appendix B.
"""
from __future__ import annotations

import copy
import json
import math
import subprocess
import sys

import pytest
from CoolProp.CoolProp import PropsSI
from matplotlib.backends.backend_agg import FigureCanvasAgg
from matplotlib.figure import Figure

from stagewright.gui.charts import draw_power_split, draw_staging_chart, draw_ts_chart
from stagewright.gui.charts.power_split import exergy_items, heat_items
from stagewright.gui.charts.ts_chart import isobar_pressures, stage_limits
from conftest import SAMPLES, make_doc
from stagewright.core import solve
from stagewright.core.project import load


def _fig():
    fig = Figure(figsize=(7, 4.5), dpi=72)
    FigureCanvasAgg(fig)
    return fig


def _lines(fig, prefix):
    return [ln for ax in fig.axes for ln in ax.get_lines() if (ln.get_gid() or "").startswith(prefix)]


def _patches(fig, prefix):
    return [p for ax in fig.axes for p in ax.patches if (p.get_gid() or "").startswith(prefix)]


def _result(**kw):
    return solve(make_doc(**kw)).to_dict()


@pytest.fixture(scope="module")
def sample():
    doc = load(SAMPLES / "two_stage_plant_air.json")
    return doc, solve(doc).to_dict()


# ---------------------------------------------------------------------------------- T–s chart

@pytest.mark.parametrize("n", range(1, 9))
@pytest.mark.parametrize("coolers", [True, False])
def test_one_segment_per_stage_and_cooler(n, coolers):
    doc = make_doc(stages=n, p_out=1e5 * (1.6 if coolers else 1.25) ** n)
    if not coolers:
        for st in doc["stages"]:
            st["cooler"] = None
    result = solve(doc).to_dict()
    fig = draw_ts_chart(_fig(), result)
    fig.canvas.draw()  # the full draw must not raise either
    stages = sorted(ln.get_gid() for ln in _lines(fig, "stage-"))
    cools = sorted(ln.get_gid() for ln in _lines(fig, "cooler-"))
    assert stages == sorted(f"stage-{i}" for i in range(1, n + 1))
    assert cools == (sorted(f"cooler-{i}" for i in range(1, n + 1)) if coolers else [])


def test_stage_line_follows_the_polytropic_path(sample):
    _, result = sample
    fig = draw_ts_chart(_fig(), result)
    line = _lines(fig, "stage-1")[0]
    st = result["stages"][0]
    s0 = result["intake"]["entropy_J_kgK"]
    xs, ys = line.get_xdata(), line.get_ydata()
    # every state of the compression is drawn, ending at the static discharge
    assert len(xs) == len(st["path"])
    for q, xv, yv in zip(st["path"], xs, ys):
        assert xv == pytest.approx((q["entropy_J_kgK"] - s0) / 1e3, abs=1e-12)
        assert yv == pytest.approx(q["temperature_K"] - 273.15, abs=1e-9)
    assert ys[-1] == pytest.approx(st["outlet"]["temperature_K"] - 273.15)
    # the cooler line falls from the discharge to the cooler outlet
    cool = _lines(fig, "cooler-1")[0].get_ydata()
    assert cool[0] == pytest.approx(st["outlet"]["temperature_K"] - 273.15)
    assert cool[-1] == pytest.approx(st["cooler"]["outlet"]["temperature_K"] - 273.15)
    assert all(a >= b for a, b in zip(cool, cool[1:]))


def test_real_gas_isobars_match_coolprop_propssi(sample):
    """Isobar entropies relative to the intake, against CoolProp's high-level PropsSI
    (Lemmon et al. 2000 air EOS; PropsSI is a different code path from our AbstractState)."""
    doc, _ = sample
    dry_doc = copy.deepcopy(doc)
    dry_doc["site"]["relative_humidity"] = 0.0  # dry air: the pure-air EOS
    result = solve(dry_doc).to_dict()
    fig = draw_ts_chart(_fig(), result)
    isobars = sorted(_lines(fig, "isobar-"), key=lambda ln: ln.get_gid())
    pressures = isobar_pressures(result)
    assert len(isobars) == len(pressures) == 3  # stage-1 inlet and two discharges
    T0, P0 = result["intake"]["temperature_K"], result["intake"]["pressure_Pa"]
    s0 = PropsSI("S", "T", T0, "P", P0, "Air")
    for line, p in zip(isobars, pressures):
        for xv, yv in list(zip(line.get_xdata(), line.get_ydata()))[::7]:
            T = yv + 273.15
            expected = (PropsSI("S", "T", T, "P", p, "Air") - s0) / 1e3
            assert xv == pytest.approx(expected, abs=2e-6)  # kJ/(kg K)


def test_moist_isobars_match_hapropssi_above_the_dew_point(sample):
    """Humid demo: isobars are of the intake air with its water, entropy per kg dry air relative to
    the intake, against CoolProp's HAPropsSI (ASHRAE RP-1485, Herrmann, Kretzschmar & Gatley 2009),
    where the air is unsaturated. 2e-4 kJ/(kg K) covers the two moist-air implementations
    (tolerance common practice, no source)."""
    from CoolProp.CoolProp import HAPropsSI
    _, result = sample
    W = result["intake_humidity_ratio"]
    assert W > 0.0
    fig = draw_ts_chart(_fig(), result)
    T0, P0 = result["intake"]["temperature_K"], result["intake"]["pressure_Pa"]
    s0 = HAPropsSI("S", "T", T0, "P", P0, "W", W)
    checked = 0
    for line, p in zip(sorted(_lines(fig, "isobar-"), key=lambda ln: ln.get_gid()), isobar_pressures(result)):
        t_dew = HAPropsSI("D", "T", 400.0, "P", p, "W", W)
        for xv, yv in list(zip(line.get_xdata(), line.get_ydata()))[::5]:
            T = yv + 273.15
            if T < t_dew + 1.0:
                continue
            assert xv == pytest.approx((HAPropsSI("S", "T", T, "P", p, "W", W) - s0) / 1e3, abs=2e-4)
            checked += 1
    assert checked >= 10


def test_constant_cp_isobars_use_the_projects_cp_and_k():
    """Perfect gas, s2 − s1 = cp ln(T2/T1) − R ln(p2/p1) (Çengel & Boles 2015, §7-9),
    with a non-default cp and k recovered from the result itself."""
    cp, k = 1040.0, 1.36
    R = cp * (k - 1.0) / k
    result = _result(stages=2, fluid={"model": "constant_cp", "cp_J_kgK": cp, "k": k})
    fig = draw_ts_chart(_fig(), result)
    T1, p1 = result["intake"]["temperature_K"], result["intake"]["pressure_Pa"]
    for line, p in zip(sorted(_lines(fig, "isobar-"), key=lambda ln: ln.get_gid()), isobar_pressures(result)):
        for xv, yv in zip(line.get_xdata()[::5], line.get_ydata()[::5]):
            T = yv + 273.15
            assert xv * 1e3 == pytest.approx(cp * math.log(T / T1) - R * math.log(p / p1), abs=1e-6)


def test_axis_labels_and_values_switch_with_units(sample):
    _, result = sample
    si = draw_ts_chart(_fig(), result, "SI").axes[0]
    us = draw_ts_chart(_fig(), result, "US").axes[0]
    assert "°C" in si.get_ylabel() and "kJ/(kg·K)" in si.get_xlabel()
    assert "°F" in us.get_ylabel() and "Btu/(lb·°R)" in us.get_xlabel()
    amb_si = [ln for ln in si.get_lines() if ln.get_gid() == "ambient"][0].get_ydata()[0]
    amb_us = [ln for ln in us.get_lines() if ln.get_gid() == "ambient"][0].get_ydata()[0]
    # 298.15 K = 25 °C = 77 °F exactly (NIST SP 811, 2008, Appendix B: t/°F = 1.8 t/°C + 32)
    assert amb_si == pytest.approx(25.0) and amb_us == pytest.approx(77.0)
    # 1 Btu/(lb·°R) = 4.1868 kJ/(kg·K) exactly (NIST SP 811, Appendix B.8, IT Btu)
    x_si = [ln for ln in si.get_lines() if ln.get_gid() == "stage-2"][0].get_xdata()
    x_us = [ln for ln in us.get_lines() if ln.get_gid() == "stage-2"][0].get_xdata()
    assert x_si[-1] == pytest.approx(x_us[-1] * 4.1868, rel=1e-12)
    labels_si = [t.get_text() for t in si.texts if (t.get_gid() or "").startswith("isobar-label")]
    labels_us = [t.get_text() for t in us.texts if (t.get_gid() or "").startswith("isobar-label")]
    assert labels_si and all(t.endswith("bar(a)") for t in labels_si)
    assert labels_us and all(t.endswith("psia") for t in labels_us)


def test_discharge_limits_from_argument_or_result(sample):
    doc, result = sample
    fig = draw_ts_chart(_fig(), result)
    assert _lines(fig, "limit-") == []  # results carry no limit yet: nothing invented
    lims = [st["max_discharge_temperature_K"] for st in doc["stages"]]
    fig = draw_ts_chart(_fig(), result, limits_K=lims)
    (line,) = _lines(fig, "limit-")  # both stages share 200 °C: one line
    assert line.get_ydata()[0] == pytest.approx(200.0)
    withkey = copy.deepcopy(result)
    withkey["stages"][0]["max_discharge_temperature_K"] = 453.15
    withkey["stages"][1]["max_discharge_temperature_K"] = 473.15
    assert len(_lines(draw_ts_chart(_fig(), withkey), "limit-")) == 2
    assert stage_limits(result, 450.0) == [450.0, 450.0]
    assert stage_limits(result, [450.0]) == [450.0, None]


def test_unknown_model_draws_the_path_without_isobars(sample):
    _, result = sample
    other = dict(result, model="some_future_model")
    fig = draw_ts_chart(_fig(), other)
    fig.canvas.draw()
    assert _lines(fig, "isobar-") == [] and len(_lines(fig, "stage-")) == 2


# ------------------------------------------------------------------------------- power split

def test_exergy_cascade_closes_on_shaft_power(sample):
    """Shaft power = exergy gained + Σ exergy destroyed + exergy of heat + exergy of the drained
    condensate (Bejan, Tsatsaronis & Moran 1996, §3.5: exergy balance of an open system, every
    stream leaving counted; the demo's intake is humid, so water leaves at the separators)."""
    _, result = sample
    assert result["condensate_kg_s"] > 0.0 and result["condensate_exergy_W"] > 0.0
    fig = draw_power_split(_fig(), result)
    width = {p.get_gid(): p.get_width() for p in _patches(fig, "exergy-")}
    assert width["exergy-shaft"] == pytest.approx(result["shaft_power_W"] / 1e3)
    assert width["exergy-gained"] == pytest.approx(result["exergy_gained_W"] / 1e3)
    assert width["exergy-condensate"] == pytest.approx(result["condensate_exergy_W"] / 1e3)
    signed = sum(v for _, _, v in exergy_items(result))
    assert (signed + result["exergy_gained_W"]) == pytest.approx(result["shaft_power_W"], rel=1e-9)
    # the bars themselves close: the last taken-off bar ends where the gained bar ends
    bars = {p.get_gid(): p for p in _patches(fig, "exergy-")}
    assert bars["exergy-condensate"].get_x() == pytest.approx(result["exergy_gained_W"] / 1e3, rel=1e-9)
    assert {"exergy-filter", "exergy-stage-1", "exergy-cooler-1", "exergy-stage-2", "exergy-cooler-2",
            "exergy-heat", "exergy-condensate"} <= set(width)
    # the sample's coolant (22 °C) is colder than ambient (25 °C): heat exergy is negative, hatched
    heat = [p for p in _patches(fig, "exergy-heat")][0]
    assert result["heat_exergy_W"] < 0 and heat.get_hatch()


def test_heat_panel_adds_up_to_heat_rejected(sample):
    _, result = sample
    fig = draw_power_split(_fig(), result)
    total = sum(p.get_width() for p in _patches(fig, "heat-"))
    assert total == pytest.approx(result["heat_rejected_W"] / 1e3, rel=1e-12)
    for i, st in enumerate(result["stages"], 1):  # humid demo: both coolers condense
        c = st["cooler"]
        (lat,) = _patches(fig, f"heat-cooler-{i}-latent")
        assert lat.get_width() == pytest.approx(c["latent_duty_W"] / 1e3, rel=1e-12)
        (note,) = [t for t in fig.axes[1].texts if t.get_gid() == f"note-cooler-{i}"]
        # 1 kg/h = 1/3600 kg/s (definition of the hour)
        assert f"{c['drained_kg_s'] * 3600.0:.2f} kg/h drained" in note.get_text()
    dry = draw_power_split(_fig(), _result(stages=2, p_out=8e5))
    assert not _patches(dry, "heat-cooler-1-latent") and not _patches(dry, "exergy-condensate")
    assert all("drained" not in t.get_text() for t in dry.axes[1].texts)


def test_latent_duty_is_shown_when_the_result_has_it(sample):
    _, result = sample
    moist = copy.deepcopy(result)
    c = moist["stages"][0]["cooler"]
    c["latent_duty_W"], c["sensible_duty_W"] = 4000.0, c["duty_W"] - 4000.0
    fig = draw_power_split(_fig(), moist)
    (lat,) = _patches(fig, "heat-cooler-1-latent")
    (sen,) = _patches(fig, "heat-cooler-1-sensible")
    assert lat.get_width() == pytest.approx(4.0) and sen.get_x() == 0.0
    assert lat.get_x() == pytest.approx(sen.get_width())
    # only the latent part given: the sensible part is the rest of the duty
    rows = dict((g, parts) for g, _, parts in heat_items({**moist, "stages": [
        {**moist["stages"][0], "cooler": {"duty_W": 10.0, "latent_duty_W": 3.0}}]}))
    assert rows["cooler-1"] == [("sensible", 7.0), ("latent", 3.0)]


def test_power_split_units_and_no_heat_case():
    result = _result(stages=3, p_out=6e5)
    for st in result["stages"]:
        st["cooler"] = None
    fig = draw_power_split(_fig(), result, "US")
    fig.canvas.draw()
    assert "hp" in fig.axes[0].get_xlabel()
    # 1 hp = 745.69987158 W (NIST SP 811, 2008, Appendix B.8)
    shaft = [p for p in _patches(fig, "exergy-shaft")][0].get_width()
    assert shaft == pytest.approx(result["shaft_power_W"] / 745.69987158)
    assert _patches(fig, "heat-") == []
    assert any("No heat rejected" in t.get_text() for t in fig.axes[1].texts)


@pytest.mark.parametrize("model", ["ideal_gas", "real_gas"])
def test_eight_stage_charts_render(model):
    result = _result(model=model, stages=8, p_out=4e7, drop=5000.0)
    for draw in (draw_ts_chart, draw_power_split):
        fig = draw(_fig(), result, "US")
        fig.canvas.draw()
    assert len(_patches(fig, "exergy-stage-")) == 8 and len(_patches(fig, "heat-cooler-")) == 8


# ------------------------------------------------------------------------------ staging chart

def test_staging_chart_marks_infeasible_arrangements():
    rows = [dict(stages=1, driver_power_W=131e3, max_discharge_temperature_K=620.0, feasible=False),
            dict(stages=3, driver_power_W=103e3, max_discharge_temperature_K=395.0, feasible=True),
            dict(stages=2, driver_power_W=109e3, max_discharge_temperature_K=447.0, feasible=True),
            dict(stages=4, driver_power_W=None, max_discharge_temperature_K=None, feasible=False)]
    fig = draw_staging_chart(_fig(), rows, "US", limit_K=473.15)
    fig.canvas.draw()
    (power,) = _lines(fig, "staging-power")
    assert list(power.get_xdata()) == [1, 2, 3]
    assert power.get_ydata()[1] == pytest.approx(109e3 / 745.69987158)  # hp (NIST SP 811)
    (temp,) = _lines(fig, "staging-temperature")
    assert temp.get_ydata()[0] == pytest.approx(620.0 * 1.8 - 459.67)  # °F (NIST SP 811)
    hollow = [ln for ax in fig.axes for ln in ax.get_lines() if ln.get_markerfacecolor() == "#ffffff"
              and not ln.get_gid()]
    assert len(hollow) == 2  # the one-stage arrangement, power and temperature markers
    assert "hp" in fig.axes[0].get_ylabel() and "°F" in fig.axes[1].get_ylabel()


def test_charts_import_neither_qt_nor_pyplot():
    code = ("import sys, stagewright.gui.charts; bad = [m for m in sys.modules if m.startswith(('PySide6', 'PyQt'))"
            " or m == 'matplotlib.pyplot' or 'backend_qt' in m]; print(json.dumps(bad))")
    out = subprocess.run([sys.executable, "-c", "import json; " + code], capture_output=True, text=True,
                         check=True)
    assert json.loads(out.stdout) == []
