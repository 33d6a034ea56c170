"""How a field check's uncertainty is shown everywhere: rows of display text, no Qt.

The window's field-check panel, ``stagewright uncertainty`` and the report section all read
these rows, built from ``FieldCheckUncertainty.to_dict()`` (:mod:`stagewright.core.uncertainty.field_check`)
in a unit system. An uncertainty is a difference: a temperature's is shown in K (or °F), never
with the Celsius offset.
"""
from __future__ import annotations

__all__ = ["FIGURE_COLUMNS", "INPUT_COLUMNS", "VERDICT_COLUMNS", "VERDICT_WORDS", "difference_quantity",
           "figure_rows", "input_rows", "notes", "verdict_rows"]

from stagewright.gui.presentation.units import format_value

FIGURE_COLUMNS = ("Result", "Value", "U (k = 2)", "U relative", "Monte Carlo interval", "Largest contributor")
INPUT_COLUMNS = ("Measured input", "Value", "u", "How u was found")
VERDICT_COLUMNS = ("Guaranteed figure", "Guaranteed", "Tolerance zone", "Result ± U", "Verdict", "Tolerance from")
#: verdict → short word for tables (the long form is in the decision rule note)
VERDICT_WORDS = {"within": "within", "outside": "outside", "not decidable at this uncertainty": "not decidable"}


def difference_quantity(quantity: str) -> str:
    """The display quantity of a difference of ``quantity`` (K for temperatures, no offset)."""
    return {"temperature": "temperature_difference", "gauge_pressure": "pressure_difference",
            "pressure": "pressure_difference"}.get(quantity, quantity)


def _value(si, quantity: str, system: str) -> str:
    return format_value(si, quantity, system, with_unit=True)


def _plus_minus(si, quantity: str, system: str) -> str:
    return "—" if si is None else "± " + format_value(si, difference_quantity(quantity), system, with_unit=True)


def figure_rows(d: dict, system: str = "SI") -> list[list[str]]:
    """One row per result figure: label, value, ±U, U relative, Monte Carlo interval, top contributor."""
    rows = []
    for f in d["figures"]:
        q, y, U = f["quantity"], f["value"], f["expanded_uncertainty"]
        rel = "—" if (y in (None, 0) or U is None) else f"{100.0 * U / abs(y):.2f} %"
        mc = f.get("monte_carlo")
        if mc and mc["interval_low"] is not None:
            interval = (f"{format_value(mc['interval_low'], q, system)} … "
                        f"{format_value(mc['interval_high'], q, system, with_unit=True)}")
        else:
            interval = "—"
        top = f["contributors"][0] if f["contributors"] else None
        who = f"{top['label']} ({100 * top['variance_share']:.0f} %)" if top else "—"
        rows.append([_capital(f["label"]), _value(y, q, system), _plus_minus(U, q, system), rel, interval, who])
    return rows


def input_rows(d: dict, system: str = "SI") -> list[list[str]]:
    """One row per measured input: label, value, standard uncertainty, the rule that gave it."""
    return [[_capital(i["label"]), _value(i["value"], i["quantity"], system),
             format_value(i["standard_uncertainty"], difference_quantity(i["quantity"]), system, with_unit=True),
             _rule(i, system)] for i in d["inputs"]]


def _rule(i: dict, system: str) -> str:
    """How an input's standard uncertainty was found, in display units."""
    if i["stated_as"] == "standard":
        return "standard uncertainty as stated (Gaussian)"
    a = format_value(i["half_width"], difference_quantity(i["quantity"]), system, with_unit=True)
    if i["stated_as"] == "limits":
        return f"limits ± {a}, rectangular: u = a/√3 (JCGM 100:2008 §4.3.7)"
    of = ("of full scale " + format_value(i["full_scale"], difference_quantity(i["quantity"]), system, with_unit=True)
          if i["full_scale"] is not None else "of the reading")
    return f"class {i['class_percent']:g} % {of}: limits ± {a}, u = a/√3 (JCGM 100:2008 §4.3.7)"


def verdict_rows(d: dict, system: str = "SI", monte_carlo: bool = False) -> list[list[str]]:
    """One row per guarantee (judged on y ± U, or on the Monte Carlo interval)."""
    labels = {f["figure"]: (f["label"], f["quantity"]) for f in d["figures"]}
    rows = []
    for v in d["monte_carlo_verdicts" if monte_carlo else "verdicts"]:
        label, q = labels[v["figure"]]
        lo, hi = v["lower_limit"], v["upper_limit"]
        if lo is None:
            zone = f"at most {_value(hi, q, system)}"
        elif hi is None:
            zone = f"at least {_value(lo, q, system)}"
        else:
            zone = f"{format_value(lo, q, system)} … {_value(hi, q, system)}"
        result = f"{format_value(v['value'], q, system)} {_plus_minus(v['expanded_uncertainty'], q, system)}"
        rows.append([_capital(label), _value(v["guaranteed"], q, system), zone, result,
                     VERDICT_WORDS[v["verdict"]], v["tolerance_source"]])
    return rows


def notes(d: dict) -> list[str]:
    """Sentences under the tables: method, Monte Carlo run, contributors, decision rule."""
    out = [f"Expanded uncertainty U = {d['coverage_factor']:g} u_c: {d['method']}."]
    mc = d.get("monte_carlo")
    if mc:
        agree = [f["monte_carlo"]["agrees_with_first_order"] for f in d["figures"] if f.get("monte_carlo")]
        verdict = ("agrees with the first-order result within its statistical error for every figure"
                   if all(agree) else "differs from the first-order result beyond its statistical error for "
                   f"{sum(1 for a in agree if a is False)} figure(s): the model is not linear enough there; "
                   "trust the Monte Carlo interval")
        failed = (f"; {mc['failed']} draws fell outside an input's valid range or failed to solve "
                  f"(first: {mc['first_failure']})") if mc["failed"] else ""
        out.append(f"Monte Carlo check: {mc['solved']} of {mc['draws']} draws solved (seed {mc['seed']}), "
                   f"interval of coverage probability {100 * mc['coverage_probability']:.2f} %; it {verdict}{failed}.")
    elif d.get("monte_carlo_note"):
        out.append(d["monte_carlo_note"] + ".")
    out.extend(s + "." for s in d["sentences"])
    if d["verdicts"]:
        out.append("Decision rule: " + d["decision_rule"] + ".")
    if any(v["tolerance_source"].startswith("ISO 1217") for v in d["verdicts"]):
        out.append("Tolerances marked ISO 1217: " + d["iso1217_source"] + ".")
    return out


def _capital(text: str) -> str:
    return text[:1].upper() + text[1:]

