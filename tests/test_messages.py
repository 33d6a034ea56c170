"""Messages for people in the display units, with field names (stagewright.gui.document.messages).

Issue 14, items 7 and 8: errors and warnings spoke SI and key paths even in US units. The
conversions checked here are the exact definitions (NIST SP 811, 2008 edition, Appendix B:
t/°F = 1.8·T/K − 459.67, 1 lb = 0.45359237 kg, 1 psi = 6894.757293168 Pa). The humid-air
range (623.15 K, 10 MPa) is that of ASHRAE RP-1485 (Herrmann, Kretzschmar & Gatley, 2009).
"""
from __future__ import annotations

import json

import pytest

from conftest import SAMPLES, make_doc
from stagewright.core import InputError, SecondLawViolation, StagewrightError, solve
from stagewright.core.errors import PropertyRangeError
from stagewright.core.models.base import check_range

from stagewright.gui.document.field_specs import describe
from stagewright.gui.document.messages import error_text, format_quantity, limit_sentence, limit_short, warning_text


def _f(kelvin: float) -> float:
    return 1.8 * kelvin - 459.67  # NIST SP 811, App. B


def _demo_one_stage(**stage) -> dict:
    doc = json.loads((SAMPLES / "two_stage_plant_air.json").read_text(encoding="utf-8"))
    del doc["stages"][1]
    doc["stages"][0].update(stage)
    return doc


def _no_si_no_path(text: str) -> None:
    assert "stages[" not in text and "_K" not in text and "_Pa" not in text
    assert " K " not in text and " K)" not in text and " Pa" not in text and "real_gas" not in text


def test_humid_air_range_failure_says_which_model_its_range_and_what_to_do_in_us_units():
    doc = _demo_one_stage(heat_loss_W=0.0)  # no casing loss: the discharge itself is 623.2 K
    with pytest.raises(InputError) as info:
        solve(doc)
    e = info.value
    # the command line keeps its SI message, named by the input to change first (issue 22 item 11)
    assert str(e).startswith("stages[0].pressure_ratio: ") and "discharge at 623.2" in str(e)
    us = error_text(str(e), e.field, e.detail, doc, "US")
    t_out = e.detail["values"]["value"]["value"]
    assert us.startswith(f"Stage 1 discharge temperature {_f(t_out):.4g} °F is above the range of "
                         "the real-gas humid-air property model")
    assert "up to 662 °F" in us and "1450 psia" in us  # 623.15 K; 10 MPa = 1450.4 psi
    assert "add a stage" in us and "ideal-gas property model" in us
    _no_si_no_path(us)
    si = error_text(str(e), e.field, e.detail, doc, "SI")
    assert "up to 350 °C and 100 bar(a)" in si and "350.1 °C" in si


def test_a_hot_single_stage_warns_with_its_limit_and_value_in_us_units():
    doc = _demo_one_stage()  # 1.5 kW casing loss: the discharge is within the humid-air range
    r = solve(doc).to_dict()
    t_out = r["stages"][0]["outlet"]["temperature_K"]
    texts = [warning_text(w, doc, "US") for w in r["warnings"]]
    assert texts[0] == f"Stage 1 discharge temperature {_f(t_out):.4g} °F is above its 392 °F limit."
    drained = r["stages"][0]["cooler"]["drained_kg_s"] if "drained_kg_s" in r["stages"][0]["cooler"] else None
    condensate = next(t for t in texts if "condensate" in t)
    assert condensate.startswith("Aftercooler drains ") and " lb/h of condensate" in condensate
    if drained is not None:
        assert f"{drained * 3600.0 / 0.45359237:.4g} lb/h" in condensate
    for t in texts:
        _no_si_no_path(t)
        assert "kg/h" not in t
    assert r["warnings"][0]["message"].endswith("K")  # JSON and the command line stay SI


def test_second_law_violation_names_the_measured_temperature_field():
    doc = make_doc(stages=1, kind="discharge_temperature", eta=300.0, p_out=4e5)
    with pytest.raises(SecondLawViolation) as info:
        solve(doc)
    e = info.value
    text = error_text(str(e), e.field, e.detail, doc, "US")
    assert text.startswith(f"{describe(e.field, doc)} 80.33 °F would need an isentropic efficiency above 1")
    assert "second-law violation" in text
    _no_si_no_path(text)


def test_an_unreachable_discharge_pressure_is_shown_in_psig():
    doc = make_doc(stages=1, p_out=5e6, P0=101_325.0)
    with pytest.raises(StagewrightError) as info:
        solve(doc)
    e = info.value
    text = error_text(str(e), e.field, e.detail, doc, "US", gauge=True, barometric_Pa=101_325.0)
    psig = (5e6 - 101_325.0) / 6894.757293168
    assert text == (f"Discharge pressure {psig:.4g} psig cannot be reached with stage pressure ratios up to 40: "
                    "add stages.")


def test_a_property_range_error_names_the_place_in_words():
    with pytest.raises(PropertyRangeError) as info:
        check_range(1400.0, 5e5, "stages[1] discharge")
    e = info.value
    text = error_text(str(e), e.field, e.detail, {}, "US")
    assert text == ("Stage 2 discharge: temperature 2060.33 °F is outside the range of the property models, "
                    "-99.67 °F … 1880.33 °F.")


def test_without_a_template_the_leading_key_path_becomes_the_field_name():
    doc = make_doc(stages=2)
    text = error_text("stages[1].cooler.approach_K: 3.0 — too small", "stages[1].cooler.approach_K", None, doc)
    assert text == "Aftercooler approach: 3.0 — too small"


def test_study_limits_name_the_limit_and_the_value():
    b = {"field": "stages[0].max_discharge_temperature_K", "limit": 473.15, "value": 619.1859900091036,
         "closest_feasible": 619.1859900091036, "status": "violated", "message": "…", "detail": None}
    assert limit_short(b, {}, "SI") == "Stage 1 discharge 346 °C > 200 °C limit"
    assert limit_sentence(b, {}, "US") == "Stage 1 discharge 654.9 °F is above its 392 °F limit; add a stage."


def test_a_failed_study_option_keeps_the_solve_error_in_display_units():
    from stagewright.core.study.optimal_split import _failure_detail
    doc = _demo_one_stage(heat_loss_W=0.0)
    with pytest.raises(InputError) as info:
        solve(doc)
    b = {"field": "stages[0]", "limit": None, "value": None, "status": "violated",
         "message": f"no split of 1 stage(s) could be solved: {info.value}",
         "detail": _failure_detail(info.value, 1, "")}
    text = limit_sentence(b, doc, "US")
    assert text.startswith("No split of 1 stage(s) could be solved: Stage 1 discharge temperature 662.")
    _no_si_no_path(text)


def test_values_as_typed_keep_their_decimals_and_others_get_four_figures():
    assert format_quantity(400.0, "temperature") == "126.85 °C"
    assert format_quantity(619.1859900091036, "temperature") == "346 °C"
    assert format_quantity(12.7 / 3600.0, "water_flow") == "12.7 kg/h"
    assert format_quantity(5e6, "absolute_pressure", "US") == "725.2 psia"


def test_a_discharge_pressure_below_the_intake_names_the_rule_not_the_schema_range():
    # it used to read "-7.44 psig is out of range (allowed: -7.44406 to 7237.19 psig)"
    from stagewright.core.project.validation import problems
    from stagewright.gui.document.messages import problem_text
    doc = _demo_one_stage()
    doc["discharge_pressure_Pa"] = 5e4
    [p] = problems(doc)
    # ISO 2533 standard atmosphere at 120 m (the constants 2.25577e-5 /m and 5.25588 from memory);
    # the delivery must be above the site pressure (issue 22 item 12), so above the stage-1 inlet too
    p0 = p.detail["values"]["p0"]["value"]
    assert p0 == pytest.approx(101_325.0 * (1 - 2.25577e-5 * 120.0) ** 5.25588, rel=1e-4)
    text = problem_text(p, doc, "US", gauge=True, barometric_Pa=99_900.0)
    assert text == (f"Discharge pressure {(5e4 - 99_900.0) / 6894.757293168:.4g} psig must be above the barometric "
                    f"pressure {(p0 - 99_900.0) / 6894.757293168:.4g} psig.")
