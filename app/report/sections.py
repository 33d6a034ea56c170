"""What the printed report says: each section as tables and text, in display units.

Every number goes through :mod:`stagewright.gui.presentation.units` (the one table of display units). The
balance sheet, exchanger, totals and staging tables print the figures of
:mod:`stagewright.gui.presentation.balance_tables` and :mod:`stagewright.gui.presentation.staging_table` that show in the
``"pdf"`` output, in their order. Section functions take the project document, its solved result
(``TrainResult.to_dict()``) and a :class:`~stagewright.gui.report.layout.Pager`, and print themselves onto
the pager.
"""
from __future__ import annotations

__all__ = ["ReportInfo", "inputs", "state_points_table", "components_table", "totals_table",
           "exchangers_table", "zones_table", "charts", "warnings", "staging", "cautions", "state_points", "Q"]

from dataclasses import dataclass

from stagewright.core.project.delivery import GAUGE_KEY, delivery_pressure, stated_delivery
from stagewright.core.project.validation import normalise

from stagewright.gui.presentation import balance_tables, staging_table, units
from stagewright.gui.presentation.cautions import CAUTIONS, DEFERRAL
from stagewright.gui.presentation.figures import Figure, condition_holds, shown
from stagewright.gui.document.messages import limit_sentence, warning_text
from stagewright.gui.document.field_specs import describe
from stagewright.gui.presentation.result_notes import negative_notes
from stagewright.gui.charts import draw_power_split, draw_staging_chart, draw_ts_chart
from stagewright.gui.report.layout import Column, Pager, Table

_DASH = "—"
_PDF = "pdf"


@dataclass
class ReportInfo:
    """Where a report comes from and how it is printed."""

    source_name: str
    date: str
    version: str
    system: str = "SI"
    prepared_by: str = ""  #: who made the report
    coolprop: str = ""  #: CoolProp version the properties came from


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
        return f"{gauge} stated as gauge (= {absolute} at this site)"
    return f"{absolute} stated as absolute (= {gauge} at this site)"


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
    if result.get("eos_reference"):
        model += f": {result['eos_reference']}"
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
    figures = _pdf_columns(balance_tables.EXCHANGERS, result, [("cooler", c) for _, c in items])
    cols = [Column("Cooler", align="left")] + [_column(f, system) for f in figures]
    rows = [[f"Cooler {i}"] + [f.text(c, _PDF, system) for f in figures] for i, c in items]
    condensing = [(i, c) for i, c in items if len(c.get("zones") or []) > 1]
    p.table(Table("Cooler exchangers", cols, rows,
                  note="LMTD: log-mean temperature difference; F its correction factor for the arrangement; "
                       "ε the exchanger effectiveness and NTU its number of transfer units; UA the "
                       "overall conductance the duty needs."
                       + (" A condensing cooler's ε and NTU are on the mean heat-capacity rates of its "
                          "terminal changes (latent heat included); its F is 1 for counter-flow and is given "
                          "zone by zone otherwise." if condensing else "")))
    zones_table(p, condensing, system)


def zones_table(p: Pager, coolers: list[tuple[int, dict]], system: str) -> None:
    """The dry and wet zones of the condensing coolers ``(stage number, cooler)`` (nothing when none)."""
    zones = [(i, z) for i, c in coolers for z in c["zones"]]
    if not zones:
        return
    figures = _pdf_columns(balance_tables.ZONES, None, [(None, z) for _, z in zones])
    cols = [Column("Cooler", align="left")] + [_column(f, system) for f in figures]
    rows = [[f"Cooler {i}"] + [f.text(z, _PDF, system) for f in figures] for i, z in zones]
    p.table(Table("Condensing coolers, zone by zone", cols, rows,
                  note="Each condensing cooler is a dry zone down to the dew point and a wet zone below it. "
                       "A wet zone moves heat and water together, driven by the difference between the "
                       "air's enthalpy and that of saturated air at the coolant temperature: Δh_lm is its "
                       "log-mean value per kg of dry air (Braun, Klein & Mitchell, ASHRAE Transactions 95(2), "
                       "1989), and its ε and NTU are on that enthalpy basis. The LMTD correction factor F "
                       "applies to dry zones only."))


# ----------------------------------------------------------------------------- balance sheet

def state_points(result: dict) -> list[tuple[str, dict]]:
    """(name, point) of every state of the train in flow order."""
    names = {"intake": "Intake (ambient)", "filter": "After intake filter"}
    return [(names.get(key) or (f"Stage {i} discharge" if key.startswith("stage") else f"Cooler {i} outlet"), pt)
            for key, i, pt in balance_tables.train_points(result)]


def _pdf_columns(table, result: dict | None, rows) -> list[Figure]:
    """The figures of ``table`` the PDF prints for these rows (``(kind, row)`` pairs)."""
    rows = list(rows)
    return [f for f in shown(table, _PDF) if condition_holds(f, _PDF, result, rows)]


def _column(fig: Figure, system: str) -> Column:
    """A table column for ``fig``: its label over its unit; a list of values may wrap."""
    return Column(fig.label_in(_PDF), fig.symbol_in(_PDF, system), align="left" if fig.is_left_aligned() else "right",
                  wrap=bool(fig.joiner))


def state_points_table(p: Pager, result: dict, system: str) -> Table:
    pressure = {"barometric_Pa": result["barometric_pressure_Pa"]}
    points = state_points(result)
    figures = _pdf_columns(balance_tables.POINTS, result, [(None, pt) for _, pt in points])
    cols = [Column("State point", align="left")] + [_column(f, system) for f in figures]
    rows = [[name] + [f.text(pt, _PDF, system, **pressure) for f in figures] for name, pt in points]
    return Table("State points", cols, rows,
                 note="Enthalpy h and entropy s are relative to the property model's own reference state: "
                      "differences between points are meaningful, absolute values are not comparable "
                      "between models.")


def _component_name(kind: str, i: int | None, component: dict) -> str:
    if kind in ("filter", "train"):
        return "Intake filter" if kind == "filter" else "Train"
    return f"Stage {i}  (r = {component['pressure_ratio']:.4f})" if kind == "stage" else f"Cooler {i}"


def components_table(p: Pager, result: dict, system: str) -> None:
    components = balance_tables.component_rows(result)
    figures = _pdf_columns(balance_tables.COMPONENTS, result, [(kind, c) for _, kind, _, c in components])
    cols = [Column("Component", align="left")] + [_column(f, system) for f in figures]
    rows = [[_component_name(kind, i, c)] + [f.text(c, _PDF, system, kind=kind, missing="") for f in figures]
            for _, kind, i, c in components]
    p.table(Table("Components", cols, rows,
                  note="A stage's heat rejected is its casing heat loss plus its mechanical losses. "
                       "S_gen is the entropy generated, X_dest = T0·S_gen the exergy destroyed "
                       "(T0 the ambient temperature)."))


def totals_table(p: Pager, result: dict, system: str) -> None:
    rows = [[f.label_in(_PDF), f.text(result, _PDF, system, with_unit=True)]
            for f in _pdf_columns(balance_tables.TOTALS, result, [])]
    p.table(Table("Totals", [Column("", align="left"), Column("", align="right")], rows, header=False,
                  note=" ".join(["Closure figures are the balance residuals relative to the shaft power "
                                 "(energy: shaft power − enthalpy gained − heat rejected; exergy: shaft power − "
                                 "exergy gained − destroyed − carried out with heat)."]
                                + [f"Exergy carried out with heat: {n[0].lower()}{n[1:]}"
                                   for n in negative_notes(result)])))


# ------------------------------------------------------------------------------ charts etc.

def charts(p: Pager, doc: dict, result: dict, system: str) -> None:
    """The T–s chart and the power split, each where it fits (a page's remainder or a new page)."""
    limits = [st["max_discharge_temperature_K"] for st in normalise(doc)["stages"]]
    tall = len(result["stages"]) > 4
    p.charts("Compression and cooling", [(lambda f: draw_ts_chart(f, result, system, limits_K=limits), 4.7)])
    p.charts("Where the power goes", [(lambda f: draw_power_split(f, result, system), 4.6 if tall else 3.9)])


def warnings(p: Pager, result: dict, system: str = "SI", doc: dict | None = None) -> None:
    p.heading("Warnings", keep_with=0.5)
    items = result.get("warnings") or []
    if not items:
        p.paragraph("The solve raised no warnings.")
        return
    p.table(Table("", [Column("Message", align="left", wrap=True), Column("Input", align="left")],
                  [[warning_text(w, doc, system), describe(w["field"], doc or {}) if w.get("field") else ""]
                   for w in items]))


def _remark(row: dict, system: str = "SI") -> str:
    """Why an arrangement is limited: its binding limits in display units, or a given reason."""
    msgs = [limit_sentence(b, None, system) for b in row.get("binding_limits") or [] if b.get("message")]
    if row.get("reason"):
        msgs.insert(0, str(row["reason"]))
    return "; ".join(msgs)


def staging(p: Pager, study_rows: list[dict] | None, system: str, limit_K=None) -> None:
    """The staging comparison (rows of ``stagewright.core.study.compare_stagings(...).rows()``), if one was run."""
    if not study_rows:
        return
    p.charts("Staging comparison", [(lambda f: draw_staging_chart(f, study_rows, system, limit_K=limit_K), 3.6)])
    ordered = sorted(study_rows, key=lambda r: r["stages"])
    figures = _pdf_columns(staging_table.STAGING, None, [(None, r) for r in ordered])
    cols = [_column(f, system) for f in figures]
    rows = [[f.text(r, _PDF, system) for f in figures] for r in ordered]
    remarks = [_remark(r, system) for r in ordered]
    notes = {r.get("note") for r in study_rows if r.get("note")}
    p.table(Table("Arrangements compared", cols, rows, note=" ".join(sorted(notes)), row_notes=remarks))


def cautions(p: Pager) -> None:
    """The safety cautions and the deferral to local codes, kept together on one page."""
    height = sum(p.paragraph_height(text, bold_lead=f"{title}.") for title, text in CAUTIONS)
    p.heading("Cautions", keep_with=height + 0.05 + p.paragraph_height(DEFERRAL))
    for title, text in CAUTIONS:
        p.paragraph(text, bold_lead=f"{title}.", keep_together=True)
    p.gap(0.05)
    p.paragraph(DEFERRAL, italic=True, keep_together=True)
