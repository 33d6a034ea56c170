"""The package at part load (stagewright.core.part_load): controls, motor, drive, auxiliaries, solve figures.

External references: the generic motor part-load ratios of the Washington State Energy Office
*Energy-Efficient Electric Motor Selection Handbook* (1993) and the PWM drive table both as the
``fluids`` library carries them (``fluids.pump.motor_efficiency_underloaded``,
``fluids.pump.VFD_efficiency``); the load/unload year against a hand calculation of the
receiver's cycle (ideal gas, isothermal receiver: common practice, no source); the ordering of
the controls at part load as U.S. Department of Energy (2003), *Improving Compressed Air
System Performance: A Sourcebook for Industry*, states it.
"""
from __future__ import annotations

import copy
import json
import math
from pathlib import Path

import pytest
from fluids.pump import VFD_efficiency, motor_efficiency_underloaded

from stagewright.core.project.validation import normalise
from stagewright.core.part_load.annual import annual_figures
from stagewright.core.part_load.drive import drive_input
from stagewright.core.part_load.full_load import FullLoad
from stagewright.core.part_load.motor import motor_input
from stagewright.core.part_load.package import package_point
from stagewright.core.solve import solve

SAMPLES = Path(__file__).resolve().parents[1] / "sample_projects"

STORAGE = {"receiver_volume_m3": 3.0, "pressure_band_Pa": 60_000.0, "unloaded_power_fraction": 0.3,
           "blowdown_time_s": 35.0}
CONTROLS = {
    "load_unload": {"kind": "load_unload", **STORAGE},
    "modulation": {"kind": "modulation"},
    "variable_speed": {"kind": "variable_speed", **STORAGE},
    "start_stop": {"kind": "start_stop", **STORAGE},
    "measured_curve": {"kind": "measured_curve", "points": [{"flow_fraction": 0.0, "power_fraction": 0.35},
                                                            {"flow_fraction": 1.0, "power_fraction": 1.0}]},
}


def _package(control: dict, **extra) -> dict:
    doc = {"site": {"ambient_temperature_K": 293.15}, "flow": {"kind": "mass", "value": 1.0},
           "discharge_pressure_Pa": 8e5, "stages": [{"efficiency": {"kind": "isentropic", "value": 0.8}}],
           "package": {"control": control, **extra}}
    return normalise(doc)["package"]


FULL = FullLoad(shaft_power_W=160_000.0, fad_m3_s=0.42, intake_pressure_Pa=100_500.0, driver_efficiency=0.955)


@pytest.mark.parametrize("kind", sorted(CONTROLS))
def test_full_load_gives_todays_driver_power(kind):
    """At full load every control gives the train's driver power (shaft / η) exactly; variable
    speed adds its drive's stated full-load loss."""
    pkg = _package(CONTROLS[kind])
    p = package_point(pkg, FULL, 1.0)
    expected = FULL.shaft_power_W / FULL.driver_efficiency
    if kind == "variable_speed":
        expected /= pkg["control"]["drive_efficiency"]
    assert p.package_power_W == pytest.approx(expected, rel=1e-12)
    assert p.shaft_power_W == pytest.approx(FULL.shaft_power_W, rel=1e-12)


@pytest.mark.parametrize("x", [0.1, 0.35, 0.5, 0.65, 0.8])
def test_variable_speed_uses_less_than_modulation(x):
    """DOE sourcebook (2003): variable speed is the most efficient continuous control at part load,
    inlet modulation the least. (Near full load the drive's own loss makes variable speed the
    dearer one, as the sourcebook also says; the next test.)"""
    vsd = package_point(_package(CONTROLS["variable_speed"]), FULL, x).package_power_W
    mod = package_point(_package(CONTROLS["modulation"]), FULL, x).package_power_W
    assert vsd < mod


def test_variable_speed_dearer_near_full_load():
    vsd = package_point(_package(CONTROLS["variable_speed"]), FULL, 0.98).package_power_W
    mod = package_point(_package(CONTROLS["modulation"]), FULL, 0.98).package_power_W
    assert vsd > mod


@pytest.mark.parametrize("x", [0.1, 0.3, 0.5, 0.7, 0.9])
def test_larger_receiver_saves_energy_on_load_unload(x):
    """DOE sourcebook (2003): load/unload with more storage uses less at the same demand."""
    small = _package({**CONTROLS["load_unload"], "receiver_volume_m3": 0.5})
    large = _package({**CONTROLS["load_unload"], "receiver_volume_m3": 10.0})
    assert package_point(large, FULL, x).package_power_W < package_point(small, FULL, x).package_power_W


def test_modulation_half_flow_point():
    """Inlet modulation at half flow draws 85 % of full-load shaft power with the default zero-flow
    share 0.70 (DOE sourcebook 2003, read off its modulation curve: from memory)."""
    p = package_point(_package(CONTROLS["modulation"]), FULL, 0.5)
    assert p.shaft_power_W / FULL.shaft_power_W == pytest.approx(0.85, abs=1e-12)


def test_load_unload_year_against_hand_calculation():
    """Energy of a load/unload year from the loaded and unloaded hours, the receiver's cycle and the
    blowdown written out by hand (ideal gas, isothermal receiver: common practice, no source)."""
    pkg = _package(CONTROLS["load_unload"], motor={"fixed_loss_share": 0.4})
    profile = [{"load": 0.4, "hours": 3000.0}, {"load": 0.75, "hours": 2000.0}, {"load": 1.0, "hours": 1000.0}]
    V, dp, pa, Q, P = 3.0, 60_000.0, 100_500.0, 0.42, 160_000.0
    fu, tau, eta, k = 0.3, 35.0, 0.955, 0.4
    L_r = P * (1 / eta - 1)

    def motor_in(shaft):
        return shaft + L_r * (k + (1 - k) * (shaft / P) ** 2)

    energy = 0.0
    for row in profile:
        x, h = row["load"], row["hours"]
        loaded_h, unloaded_h = x * h, (1 - x) * h
        if x < 1:
            t_u = V * dp / (pa * Q * x)  # seconds the demand takes to draw the band down
            unl = fu * P + (P - fu * P) * tau / t_u * (1 - math.exp(-t_u / tau))
        else:
            unl = 0.0
        energy += (loaded_h * motor_in(P) + unloaded_h * motor_in(unl)) / 1000.0
    got = annual_figures(pkg, FULL, profile)
    assert got.energy_kWh == pytest.approx(energy, rel=1e-12)
    assert got.hours == 6000.0
    # cycles per hour at 40 % demand: 3600 x (1 − x) / τr, τr = V Δp / (pa Q)
    p = package_point(pkg, FULL, 0.4)
    assert p.cycles_per_hour == pytest.approx(3600 * 0.4 * 0.6 / (V * dp / (pa * Q)), rel=1e-12)


def test_start_stop_keeps_to_its_starts_limit():
    pkg = _package({**CONTROLS["start_stop"], "receiver_volume_m3": 0.3, "max_starts_per_hour": 4.0})
    for x in (0.1, 0.3, 0.5, 0.7, 0.9):
        p = package_point(pkg, FULL, x)
        assert p.starts_per_hour <= 4.0 + 1e-12
        assert p.loaded_fraction == pytest.approx(x)
    roomy = _package({**CONTROLS["start_stop"], "receiver_volume_m3": 200.0, "max_starts_per_hour": 10.0})
    p = package_point(roomy, FULL, 0.5)  # few natural cycles: every one stops the motor
    assert p.running_fraction == pytest.approx(0.5) and not p.notes


@pytest.mark.parametrize("rated_kW", [30.0, 75.0, 150.0])
@pytest.mark.parametrize("load", [0.25, 0.5, 0.75, 1.0])
def test_motor_part_load_near_handbook_ratios(rated_kW, load):
    """The default loss split (k = 0.35) against the generic part-load efficiency ratios of the
    Washington State Energy Office motor handbook (1993), via fluids: within 0.025."""
    P = rated_kW * 1000.0
    m = {"fixed_loss_share": 0.35, "efficiency_points": []}
    ratio = load * P / motor_input(m, P, 0.95, load * P) / 0.95
    assert ratio == pytest.approx(motor_efficiency_underloaded(P, load), abs=0.025)


@pytest.mark.parametrize("rated_kW", [30.0, 75.0, 150.0])
@pytest.mark.parametrize("load", [0.25, 0.5, 0.75, 1.0])
def test_drive_part_load_near_generic_pwm_table(rated_kW, load):
    """The default drive loss split (k_d = 0.5) against the generic PWM drive table of fluids
    (GoHz), with the table's own full-load efficiency: within 0.03."""
    P = rated_kW * 1000.0
    c = {"drive_efficiency": VFD_efficiency(P, 1.0), "drive_fixed_loss_share": 0.5}
    eff = load * P / drive_input(c, P, load * P)
    assert eff == pytest.approx(VFD_efficiency(P, load), abs=0.03)


def test_motor_points_replace_the_loss_split():
    m = {"fixed_loss_share": 0.35, "efficiency_points": [{"load_fraction": 0.5, "efficiency": 0.9},
                                                        {"load_fraction": 1.0, "efficiency": 0.95}]}
    assert motor_input(m, 100.0, 0.95, 50.0) == pytest.approx(50.0 / 0.9)
    assert motor_input(m, 100.0, 0.95, 100.0) == pytest.approx(100.0 / 0.95)


def test_auxiliaries_follow_the_running_time():
    pkg = _package({**CONTROLS["start_stop"], "receiver_volume_m3": 200.0}, fan_power_W=2000.0,
                   other_loads=[{"name": "dryer", "power_W": 1500.0}])
    p = package_point(pkg, FULL, 0.25)
    assert p.fan_power_W == pytest.approx(0.25 * 2000.0)
    assert p.other_power_W == pytest.approx(0.25 * 1500.0)
    assert p.package_power_W == pytest.approx(p.driver_power_W + 0.25 * 3500.0)


def test_solve_reports_package_figures_and_keeps_train_figures():
    doc = json.loads((SAMPLES / "two_stage_plant_air.json").read_text())
    plain = solve(doc)
    doc["package"] = {"control": CONTROLS["load_unload"], "load": 0.6,
                      "pump": {"head_m": 25.0}, "load_profile": [{"load": 0.6, "hours": 4000.0}]}
    res = solve(doc)
    assert res.driver_power_W == plain.driver_power_W and res.shaft_power_W == plain.shaft_power_W
    fig = res.package
    assert fig.full_load.driver_power_W == pytest.approx(plain.driver_power_W, rel=1e-12)
    assert fig.at_load.demand_fraction == 0.6
    assert fig.at_load.package_specific_power_J_m3 > fig.full_load.package_specific_power_J_m3
    assert [p.demand_fraction for p in fig.part_loads] == [1.0, 0.75, 0.5, 0.25]
    d = res.to_dict()["package"]
    assert d["control"] == "load_unload" and len(d["curve"]) == 21
    assert d["annual"]["energy_kWh"] == pytest.approx(fig.at_load.package_power_W * 4000.0 / 1000.0)


def test_case_may_change_the_control():
    doc = json.loads((SAMPLES / "two_stage_plant_air.json").read_text())
    doc["package"] = {"control": CONTROLS["load_unload"]}
    doc["cases"] = [{"name": "VSD", "changes": {"package.control": CONTROLS["variable_speed"]}}]
    norm = normalise(copy.deepcopy(doc))
    assert norm["package"]["control"]["kind"] == "load_unload"


def _plain_sample() -> dict:
    """The plant-air sample without its package section."""
    doc = json.loads((SAMPLES / "two_stage_plant_air.json").read_text())
    doc.pop("package", None)
    return doc


def _year_doc(package: dict | None) -> dict:
    doc = _plain_sample()
    doc["year"] = {"profile": {"kind": "bins", "bins": [
        {"temperature_K": 278.15, "relative_humidity": 0.7, "hours": 2000.0, "load": 0.5},
        {"temperature_K": 298.15, "relative_humidity": 0.5, "hours": 3000.0, "load": 0.8},
        {"temperature_K": 303.15, "relative_humidity": 0.4, "hours": 1000.0, "load": 1.0}]}}
    if package is not None:
        doc["package"] = package
    return doc


def test_year_bins_go_through_the_control():
    """Each bin's power is the package point of that bin's own solve; at full load the bin keeps
    today's driver power exactly; part-load bins cost more than the proportional year."""
    from stagewright.core.year import run_year
    plain = run_year(_year_doc(None), exact=True)
    pkg = {"control": CONTROLS["modulation"], "fan_power_W": 1500.0}
    year = run_year(_year_doc(pkg), exact=True)
    assert plain.power_basis == "proportional" and year.power_basis == "modulation"
    by_load = {b.load: (p, b) for p, b in zip(plain.bins, year.bins)}
    p, b = by_load[1.0]
    assert b.driver_power_W == pytest.approx(p.driver_power_W, rel=1e-12)
    assert b.package_power_W == pytest.approx(p.driver_power_W + 1500.0, rel=1e-12)
    p, b = by_load[0.5]
    # modulation at half load: shaft 0.85 of the bin's full-load shaft power (solve at 0.5 × flow, / 0.5)
    full_shaft = p.driver_power_W * 0.955 / 0.5
    assert b.driver_power_W > p.driver_power_W
    assert year.totals["energy_kWh"] > plain.totals["energy_kWh"]
    assert year.totals["auxiliary_kWh"] == pytest.approx(1.5 * 6000.0)
    assert 0.85 * full_shaft < b.driver_power_W < 0.85 * full_shaft / 0.9


def test_study_options_carry_the_package_year():
    """Each staging option's package energy is its own solve through the control over the profile."""
    from stagewright.core.part_load.annual import annual_figures
    from stagewright.core.part_load.full_load import full_load_of
    from stagewright.core.study.compare import compare_stagings
    doc = json.loads((SAMPLES / "two_stage_plant_air.json").read_text())
    doc["package"] = {"control": CONTROLS["load_unload"], "load": 0.6,
                      "load_profile": [{"load": 0.6, "hours": 4000.0}, {"load": 1.0, "hours": 2000.0}]}
    comp = compare_stagings(doc, 2, energy_price_per_kWh=0.2)
    pkg = normalise(doc)["package"]
    for opt, row in zip(comp.options, comp.rows()):
        want = annual_figures(pkg, full_load_of(opt.split.result, 0.955), pkg["load_profile"]).energy_kWh
        assert row["package_annual_energy_kWh"] == pytest.approx(want, rel=1e-12)
        assert row["package_annual_cost"] == pytest.approx(0.2 * want, rel=1e-12)
        # 2000 h of the profile at full load draw the option's own driver power
        assert want > row["driver_power_W"] * 2000.0 / 1000.0
    plain = compare_stagings(_plain_sample(), 1).rows()[0]
    assert plain["package_annual_energy_kWh"] is None


def test_compare_table_reads_package_figures():
    from stagewright.gui.presentation.compare_table import CASE_FIGURES, case_row
    doc = json.loads((SAMPLES / "two_stage_plant_air.json").read_text())
    doc["package"] = {"control": CONTROLS["modulation"], "load": 0.5,
                      "load_profile": [{"load": 0.5, "hours": 1000.0}]}
    row = case_row(solve(doc).to_dict())
    by_key = {f.key: f for f in CASE_FIGURES}
    pkg = row["package"]
    assert by_key["package.at_load.package_power_W"].value(row) == pkg["at_load"]["package_power_W"]
    text = by_key["package.at_load.package_specific_power_J_m3"].text(row, "text", "SI")
    assert float(text.split()[0]) == pytest.approx(pkg["at_load"]["package_specific_power_J_m3"] / 60_000.0, abs=1e-3)


def test_short_cycling_is_a_warning_at_the_stated_load():
    """More than 60 cycles an hour at the stated load (common practice, no source) is a result
    warning on the receiver; a receiver large enough is not."""
    doc = _plain_sample()
    doc["package"] = {"control": {**CONTROLS["load_unload"], "receiver_volume_m3": 0.5}, "load": 0.5}
    fields = [w.field for w in solve(doc).warnings]
    assert "package.control.receiver_volume_m3" in fields
    doc["package"]["control"]["receiver_volume_m3"] = 20.0
    assert "package.control.receiver_volume_m3" not in [w.field for w in solve(doc).warnings]
