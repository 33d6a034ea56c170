"""The winter caution (issue 15): freezing condensate and drains where the site or its year goes below 0 °C.

0 °C = 273.15 K by the definition of the Celsius scale (BIPM, SI Brochure, 9th ed., 2019, §2.3.1).
"""
from stagewright.gui.presentation.cautions import ALL_CAUTIONS, CAUTIONS, WINTER, below_freezing, cautions_for


def _doc(t_site, months=None, bins=None):
    doc = {"site": {"ambient_temperature_K": t_site}}
    if months is not None:
        doc["year"] = {"profile": {"kind": "monthly", "months": [{"temperature_K": t} for t in months]}}
    if bins is not None:
        doc["year"] = {"profile": {"kind": "bins", "bins": [{"temperature_K": t, "hours": 1.0} for t in bins]}}
    return doc


def test_a_warm_site_without_a_year_gets_the_usual_cautions():
    assert cautions_for(_doc(288.15)) == CAUTIONS and WINTER not in CAUTIONS


def test_a_site_below_zero_gets_the_winter_caution():
    assert WINTER in cautions_for(_doc(272.15))
    assert not below_freezing(_doc(273.15))  # 0 °C itself: water need not freeze


def test_a_year_month_or_bin_below_zero_gets_the_winter_caution():
    assert WINTER in cautions_for(_doc(290.0, months=[275.0] * 11 + [268.0]))
    assert WINTER in cautions_for(_doc(290.0, bins=[280.0, 262.5]))
    assert WINTER not in cautions_for(_doc(290.0, bins=[280.0, 274.0]))


def test_a_freezing_warning_or_freezing_bin_gets_it_even_on_a_warm_site():
    # a glycol coolant below 0 °C freezes the condensate whatever the ambient (thermo/moist/freezing.py)
    warning = {"field": "stages[0].cooler", "message": "intercooler 1 air outlet 272.00 K: condensate "
                                                         "forms as ice: the exchanger, separator and drain would freeze"}
    assert WINTER in cautions_for(_doc(290.0), [warning])
    assert WINTER in cautions_for(_doc(290.0), year={"freezing_bins": ["January"]})


def test_the_winter_caution_says_what_freezes_and_what_to_do():
    title, text = WINTER
    assert title == "Freezing condensate"
    for words in ("drain", "separator", "0 °C", "Heat-trace", "minimum air outlet temperature"):
        assert words in text
    assert ALL_CAUTIONS[-1] == WINTER and ALL_CAUTIONS[:-1] == CAUTIONS


def test_odd_documents_do_not_break_the_check():
    assert not below_freezing({"site": None, "year": {"profile": {"bins": [None, {"temperature_K": "x"}]}}})
    assert not below_freezing({"site": {"ambient_temperature_K": True}})
