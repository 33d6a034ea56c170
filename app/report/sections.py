"""What the printed report says: each section as tables and text, in display units.

Every number goes through :mod:`app.presentation.units` (the one table of display units). Section
functions take the project document, its solved result (``TrainResult.to_dict()``) and a
:class:`~app.report.layout.Pager`, and print themselves onto the pager.
"""
from __future__ import annotations

__all__ = ["ReportInfo", "title_block", "inputs", "state_points_table", "components_table", "totals_table",
           "exchangers_table", "charts", "warnings", "staging", "cautions", "state_points", "Q"]

from dataclasses import dataclass

from thermo.project.delivery import GAUGE_KEY, delivery_pressure, stated_delivery
from thermo.project.validation import normalise

from app.presentation import units
from app.presentation.cautions import CAUTIONS, DEFERRAL
from app.presentation.result_notes import negative_notes
from app.charts import draw_power_split, draw_staging_chart, draw_ts_chart
from app.report.layout import Column, Pager, Table

_DASH = "—"


@dataclass
class ReportInfo:
    """Where a report comes from and how it is printed."""

    source_name: str
    date: str
    version: str
    system: str = "SI"


def Q(si, quantity: str, system: str, **kw) -> str:
    """Display text of an SI value (``—`` when missing)."""
    return units.format_value(si, quantity, system, **kw)


def _sym(quantity: str, system: str, **kw) -> str:
    return units.unit(quantity, system, **kw).symbol


def _with(si, quantity: str, system: str, **kw) -> str:
    return units.format_value(si, quantity, system, with_unit=True, **kw) if si is not None else _DASH


def _entered(raw: dict, keys: tuple) -> bool:
    """True when the path ``keys`` is present in the document as the user wrote it."""
    node = raw
    for k in keys:
        if not isinstance(node, dict) or k not in node:
            return False
        node = node[k]
    return True


# ----------------------------------------------------------------------------------- title

def title_block(p: Pager, doc: dict, result: dict, info: ReportInfo) -> None:
    p.title(doc.get("title") or "Untitled project", doc.get("note", ""))
    model = result["model"]
    rows = [["Project file", info.source_name or _DASH],
            ["Date", info.date],
            ["Program", f"Stagewright {info.version}"],
            ["Display units", "SI" if info.system == "SI" else "US customary"],
            ["Property model", model.replace("_", " ")],
            ["Equation of state", result.get("eos_reference") or _DASH]]
    p.table(Table("", [Column("", align="left"), Column("", align="left", wrap=True)], rows, header=False))


# ---------------------------------------------------------------------------------- inputs

_FLOW_TEXT = {"mass": ("Mass flow", "mass_flow"),
              "free_air_delivery": ("Free air delivery (at intake conditions)", "volume_flow"),
              "normal_volume": ("Normal volume flow (0 °C, 101.325 kPa)", "normal_volume_flow"),
              "shaft_power": ("Shaft power (flow found from it)", "power")}


def _efficiency_text(eff: dict, system: str) -> str:
    if eff["kind"] == "discharge_temperature":
        return f"measured discharge {_with(eff['value_K'], 'temperature', system)}"
    return f"{eff['kind']} {Q(eff['value'], 'fraction', system)} %"


def _delivery_text(norm: dict, p0: float, system: str) -> str:
    """The delivery pressure as the project states it (gauge or absolute), then in the other basis."""
    key, _value = stated_delivery(norm)
    p_abs = delivery_pressure(norm, p0)
    absolute = _with(p_abs, "pressure", system)
    gauge = _with(p_abs, "pressure", system, gauge=True, barometric_Pa=p0)
    if key == GAUGE_KEY:
        return f"{gauge} stated as gauge  (= {absolute} at this site)"
    return f"{absolute} stated as absolute  (= {gauge} at this site)"


def inputs(p: Pager, doc: dict, result: dict, system: str) -> None:
    """The inputs as entered; values the solver filled in are marked ``(default)``."""
    norm = normalise(doc)
    p0 = result["barometric_pressure_Pa"]
    p.heading("Inputs")
    site = norm["site"]
    rows = [["Ambient temperature", _with(site["ambient_temperature_K"], "temperature", system)]]
    if site.get("barometric_pressure_Pa") is not None:
        rows.append(["Barometric pressure", _with(site["barometric_pressure_Pa"], "pressure", system)])
    elif site.get("elevation_m") is not None:
        rows.append(["Elevation", f"{_with(site['elevation_m'], 'length', system)}  (barometric pressure "
                                  f"{_with(p0, 'pressure', system)}, ISO 2533 standard atmosphere)"])
    else:
        rows.append(["Barometric pressure", f"{_with(p0, 'pressure', system)} (default)"])
    rows.append(["Relative humidity", f"{Q(site['relative_humidity'], 'fraction', system)} %"
                 + ("" if _entered(doc, ("site", "relative_humidity")) else " (default)")])
    fluid = norm["fluid"]
    model = fluid["model"].replace("_", " ") + ("" if _entered(doc, ("fluid", "model")) else " (default)")
    if fluid["model"] == "constant_cp":
        model += f"; cp {_with(fluid['cp_J_kgK'], 'specific_heat', system)}, k {fluid['k']:.4g}"
    rows.append(["Property model", model])
    name, quantity = _FLOW_TEXT[norm["flow"]["kind"]]
    rows.append([name, _with(norm["flow"]["value"], quantity, system)])
    rows.append(["Discharge pressure", _delivery_text(norm, p0, system)])
    rows.append(["Intake filter pressure drop", _with(norm["inlet_pressure_drop_Pa"], "pressure_difference", system)
                 + ("" if _entered(doc, ("inlet_pressure_drop_Pa",)) else " (default)")])
    rows.append(["Driver efficiency", f"{Q(norm['driver']['efficiency'], 'fraction', system)} %"
                 + ("" if _entered(doc, ("driver", "efficiency")) else " (default)")])
    p.table(Table("Site and duty", [Column("", align="left"), Column("", align="left", wrap=True)], rows,
                  header=False))

    cols = [Column("Stage", align="left", wrap=True), Column("Efficiency", align="left"),
            Column("Pressure ratio", ""), Column("Mech. eff.", "%"),
            Column("Casing loss", _sym("power", system)), Column("Exit velocity", _sym("velocity", system)),
            Column("Discharge limit", _sym("temperature", system))]
    rows = []
    for i, st in enumerate(norm["stages"], 1):
        ratio = st["pressure_ratio"]
        rows.append([f"{i}  {st['name']}".rstrip(), _efficiency_text(st["efficiency"], system),
                     f"{ratio:.4f}" if ratio is not None else "equal split",
                     Q(st["mechanical_efficiency"], "fraction", system), Q(st["heat_loss_W"], "power", system),
                     Q(st["exit_velocity_m_s"], "velocity", system),
                     Q(st["max_discharge_temperature_K"], "temperature", system)])
    p.table(Table("Stages", cols, rows))

    coolers = [st["cooler"] for st in norm["stages"] if st["cooler"] is not None]
    with_coolant = any(c.get("coolant") for c in coolers)
    cols = [Column("After stage", align="left"), Column("Air outlet", align="left"),
            Column("Coolant inlet", _sym("temperature", system)),
            Column("Pressure drop", _sym("pressure_difference", system)), Column("Separator eff.", "%")]
    if with_coolant:
        cols += [Column("Coolant", align="left", wrap=True), Column("Arrangement", align="left", wrap=True)]
    rows = []
    for i, st in enumerate(norm["stages"], 1):
        c = st["cooler"]
        if c is None:
            rows.append([str(i), "no cooler"] + [""] * (len(cols) - 2))
            continue
        if c.get("outlet_temperature_K") is not None:
            out = _with(c["outlet_temperature_K"], "temperature", system)
        elif c.get("ua_W_K") is not None:
            out = f"rated from UA {_with(c['ua_W_K'], 'conductance', system)}"
        else:
            out = f"approach {_with(c['approach_K'], 'temperature_difference', system)}"
        row = [str(i), out,
               Q(c.get("coolant_inlet_temperature_K"), "temperature", system)
               if c.get("coolant_inlet_temperature_K") is not None else "ambient",
               Q(c["pressure_drop_Pa"], "pressure_difference", system),
               Q(c["separator_efficiency"], "fraction", system)]
        if with_coolant:
            row += [_coolant_text(c.get("coolant"), system), (c.get("arrangement") or "").replace("_", " ")]
        rows.append(row)
    p.table(Table("Coolers", cols, rows,
                  note="A cooler's approach is its air outlet temperature above the coolant inlet temperature."))


def _coolant_text(coolant: dict | None, system: str) -> str:
    if not coolant:
        return "not given"
    kind = coolant["kind"]
    if kind == "glycol":
        frac = coolant.get("glycol_fraction")
        kind = f"{coolant.get('glycol', 'ethylene')} glycol" + (f" {Q(frac, 'fraction', system)} %" if frac else "")
    if coolant.get("flow_kg_s") is not None:
        return f"{kind}, {_with(coolant['flow_kg_s'], 'mass_flow', system)}"
    if coolant.get("temperature_rise_K") is not None:
        return f"{kind}, rise {_with(coolant['temperature_rise_K'], 'temperature_difference', system)}"
    return kind


def exchangers_table(p: Pager, result: dict, system: str) -> None:
    """Exchanger figures of the coolers that have a coolant side (nothing when none has)."""
    items = [(i, st["cooler"]) for i, st in enumerate(result["stages"], 1)
             if st.get("cooler") and st["cooler"].get("coolant_kind")]
    if not items:
        return
    cols = [Column("Cooler", align="left"), Column("Coolant", align="left"),
            Column("Coolant flow", _sym("mass_flow", system)),
            Column("Coolant in", _sym("temperature", system)), Column("Coolant out", _sym("temperature", system)),
            Column("LMTD", _sym("temperature_difference", system)), Column("F", ""),
            Column("ε", ""), Column("NTU", ""), Column("UA", _sym("conductance", system))]

    def num(v, fmt="{:.3f}"):
        return fmt.format(v) if v is not None else _DASH

    rows = [[f"Cooler {i}", str(c["coolant_kind"]), Q(c.get("coolant_flow_kg_s"), "mass_flow", system),
             Q(c.get("coolant_inlet_temperature_K"), "temperature", system),
             Q(c.get("coolant_outlet_temperature_K"), "temperature", system),
             Q(c.get("lmtd_K"), "temperature_difference", system), num(c.get("lmtd_correction_factor")),
             num(c.get("effectiveness")), num(c.get("ntu")), Q(c.get("ua_W_K"), "conductance", system)]
            for i, c in items]
    p.table(Table("Cooler exchangers", cols, rows,
                  note="LMTD: log-mean temperature difference; F its correction factor for the arrangement; "
                       "ε the exchanger effectiveness and NTU its number of transfer units; UA the "
                       "overall conductance the duty needs."))


# ----------------------------------------------------------------------------- balance sheet

def state_points(result: dict) -> list[tuple[str, dict]]:
    """(name, point) of every state of the train in flow order."""
    pts = [("Intake (ambient)", result["intake"]), ("After intake filter", result["inlet_filter"]["outlet"])]
    for i, st in enumerate(result["stages"], 1):
        pts.append((f"Stage {i} discharge", st["outlet"]))
        if st.get("cooler"):
            pts.append((f"Cooler {i} outlet", st["cooler"]["outlet"]))
    return pts


def _humid(result: dict) -> bool:
    return any((pt.get("humidity_ratio") or 0.0) > 0.0 or pt.get("dew_point_K") is not None
               for _, pt in state_points(result))


def state_points_table(p: Pager, result: dict, system: str) -> Table:
    p0 = result["barometric_pressure_Pa"]
    cols = [Column("State point", align="left"), Column("T", _sym("temperature", system)),
            Column("p", _sym("pressure", system)), Column("p", _sym("pressure", system, gauge=True)),
            Column("h", _sym("specific_enthalpy", system)), Column("s", _sym("specific_entropy", system)),
            Column("ρ", _sym("density", system))]
    humid = _humid(result)
    if humid:
        cols += [Column("Humidity ratio", "kg/kg"), Column("RH", "%"), Column("Dew point", _sym("temperature", system))]
    rows = []
    for name, pt in state_points(result):
        row = [name, Q(pt["temperature_K"], "temperature", system), Q(pt["pressure_Pa"], "pressure", system),
               Q(pt["pressure_Pa"], "pressure", system, gauge=True, barometric_Pa=p0),
               Q(pt["enthalpy_J_kg"], "specific_enthalpy", system), Q(pt["entropy_J_kgK"], "specific_entropy", system),
               Q(pt["density_kg_m3"], "density", system)]
        if humid:
            row += [f"{pt.get('humidity_ratio') or 0.0:.5f}", Q(pt.get("relative_humidity"), "fraction", system),
                    Q(pt.get("dew_point_K"), "temperature", system)]
        rows.append(row)
    return Table("State points", cols, rows,
                 note="Enthalpy h and entropy s are relative to the property model's own reference state: "
                      "differences between points are meaningful, absolute values are not comparable "
                      "between models.")


def _condensate(cooler: dict | None):
    return None if not cooler else cooler.get("condensate_kg_s")


def components_table(p: Pager, result: dict, system: str) -> None:
    wet = any(_condensate(st.get("cooler")) is not None for st in result["stages"])
    cols = [Column("Component", align="left"), Column("Shaft power", _sym("power", system)),
            Column("Heat rejected", _sym("heat_flow", system))]
    if wet:
        cols.append(Column("Condensate", _sym("water_flow", system)))
    cols += [Column("ηs", "%"), Column("ηp", "%"), Column("S_gen", _sym("entropy_rate", system)),
             Column("X_dest", _sym("power", system))]

    def row(name, power, heat, cond, es, ep, sgen, xdest):
        r = [name, Q(power, "power", system) if power is not None else "",
             Q(heat, "heat_flow", system) if heat is not None else ""]
        if wet:
            # condensate mass flow shown as a water volume at 1 kg/L
            r.append(Q(cond, "water_flow", system) if cond is not None else "")
        return r + [Q(es, "fraction", system) if es is not None else "",
                    Q(ep, "fraction", system) if ep is not None else "",
                    Q(sgen, "entropy_rate", system), Q(xdest, "power", system)]

    f = result["inlet_filter"]
    rows = [row("Intake filter", None, None, None, None, None, f["entropy_generation_W_K"], f["exergy_destroyed_W"])]
    for i, st in enumerate(result["stages"], 1):
        rows.append(row(f"Stage {i}  (r = {st['pressure_ratio']:.4f})", st["shaft_power_W"],
                        st["heat_loss_W"] + st["mechanical_loss_W"], None, st["isentropic_efficiency"],
                        st["polytropic_efficiency"], st["entropy_generation_W_K"], st["exergy_destroyed_W"]))
        c = st.get("cooler")
        if c:
            rows.append(row(f"Cooler {i}", None, c["duty_W"], _condensate(c), None, None,
                            c["entropy_generation_W_K"], c["exergy_destroyed_W"]))
    total_cond = sum(_condensate(st.get("cooler")) or 0.0 for st in result["stages"]) if wet else None
    rows.append(row("Train", result["shaft_power_W"], result["heat_rejected_W"], total_cond, None, None,
                    result["entropy_generation_W_K"], result["exergy_destroyed_W"]))
    p.table(Table("Components", cols, rows,
                  note="A stage's heat rejected is its casing heat loss plus its mechanical losses. "
                       "S_gen is the entropy generated, X_dest = T0·S_gen the exergy destroyed "
                       "(T0 the ambient temperature)."))


def totals_table(p: Pager, result: dict, system: str) -> None:
    s = system
    rows = [
        ["Mass flow", _with(result["mass_flow_kg_s"], "mass_flow", s)],
        ["Free air delivery", _with(result["free_air_delivery_m3_s"], "volume_flow", s)],
        ["Normal volume flow (0 °C, 101.325 kPa)", _with(result["normal_volume_flow_m3_s"], "normal_volume_flow", s)],
        ["Shaft power", _with(result["shaft_power_W"], "power", s)],
        ["Driver input power", _with(result["driver_power_W"], "power", s)],
        ["Specific power", _with(result["specific_power_kW_per_m3_min"], "specific_power", s)],
        ["Heat rejected", _with(result["heat_rejected_W"], "heat_flow", s)],
        ["Reversible isothermal power", _with(result["isothermal_power_W"], "power", s)],
        ["Isothermal efficiency", f"{Q(result['isothermal_efficiency'], 'fraction', s)} %"],
        ["Second-law efficiency", f"{Q(result['second_law_efficiency'], 'fraction', s)} %"],
        ["Exergy gained by the air", _with(result["exergy_gained_W"], "power", s)],
        ["Exergy destroyed", _with(result["exergy_destroyed_W"], "power", s)],
        ["Exergy carried out with heat", _with(result["heat_exergy_W"], "power", s)],
        ["Entropy generation", _with(result["entropy_generation_W_K"], "entropy_rate", s)],
        ["Energy balance closure", f"{result['energy_residual']:.2e}"],
        ["Exergy balance closure", f"{result['exergy_residual']:.2e}"],
    ]
    p.table(Table("Totals", [Column("", align="left"), Column("", align="right")], rows, header=False,
                  note=" ".join(["Closure figures are the balance residuals relative to the shaft power "
                                 "(energy: shaft power − enthalpy gained − heat rejected; exergy: shaft power − "
                                 "exergy gained − destroyed − carried out with heat)."]
                                + [f"Exergy carried out with heat: {n[0].lower()}{n[1:]}" for n in negative_notes(result)])))


# ------------------------------------------------------------------------------ charts etc.

def charts(p: Pager, doc: dict, result: dict, system: str) -> None:
    limits = [st["max_discharge_temperature_K"] for st in normalise(doc)["stages"]]
    tall = len(result["stages"]) > 4
    p.charts("Charts", [(lambda f: draw_ts_chart(f, result, system, limits_K=limits), 4.7),
                        (lambda f: draw_power_split(f, result, system), 4.6 if tall else 3.9)])


def warnings(p: Pager, result: dict) -> None:
    p.heading("Warnings", keep_with=0.5)
    items = result.get("warnings") or []
    if not items:
        p.paragraph("The solve raised no warnings.")
        return
    p.table(Table("", [Column("Message", align="left", wrap=True), Column("Input", align="left")],
                  [[w["message"], w["field"]] for w in items]))


def _remark(row: dict) -> str:
    """Why an arrangement is limited: its binding limits' messages, or a given reason."""
    msgs = [b.get("message", "") for b in row.get("binding_limits") or [] if b.get("message")]
    if row.get("reason"):
        msgs.insert(0, str(row["reason"]))
    return "; ".join(msgs)


def staging(p: Pager, study_rows: list[dict] | None, system: str, limit_K=None) -> None:
    """The staging comparison (rows of ``thermo.study.compare_stagings(...).rows()``), if one was run."""
    if not study_rows:
        return
    p.charts("Staging comparison", [(lambda f: draw_staging_chart(f, study_rows, system, limit_K=limit_K), 3.6)])
    has = {k: any(r.get(k) is not None for r in study_rows)
           for k in ("pressure_ratios", "specific_power_kW_per_m3_min", "saving_W")}
    cols = [Column("Stages", align="left")]
    if has["pressure_ratios"]:
        cols.append(Column("Pressure ratios", align="left", wrap=True))
    cols.append(Column("Driver power", _sym("power", system)))
    if has["specific_power_kW_per_m3_min"]:
        cols.append(Column("Specific power", _sym("specific_power", system)))
    cols.append(Column("Max. discharge T", _sym("temperature", system)))
    if has["saving_W"]:
        cols.append(Column("Saving", _sym("power", system)))
    cols.append(Column("Feasible", align="left"))
    rows = []
    for r in sorted(study_rows, key=lambda r: r["stages"]):
        row = [str(r["stages"])]
        if has["pressure_ratios"]:
            row.append(" × ".join(f"{x:.3f}" for x in r.get("pressure_ratios") or []))
        row.append(Q(r.get("driver_power_W"), "power", system))
        if has["specific_power_kW_per_m3_min"]:
            row.append(Q(r.get("specific_power_kW_per_m3_min"), "specific_power", system))
        row.append(Q(r.get("max_discharge_temperature_K"), "temperature", system))
        if has["saving_W"]:
            row.append(Q(r.get("saving_W"), "power", system))
        row.append("yes" if r.get("feasible") else "no")
        rows.append(row)
    remarks = [_remark(r) for r in sorted(study_rows, key=lambda r: r["stages"])]
    notes = {r.get("note") for r in study_rows if r.get("note")}
    p.table(Table("Arrangements compared", cols, rows, note=" ".join(sorted(notes)), row_notes=remarks))


def cautions(p: Pager) -> None:
    p.heading("Cautions", keep_with=0.8)
    for title, text in CAUTIONS:
        p.paragraph(text, bold_lead=f"{title}.", keep_together=True)
    p.gap(0.05)
    p.paragraph(DEFERRAL, italic=True, keep_together=True)
