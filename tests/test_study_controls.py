"""The study panel's controls on their own: the request they describe (site values typed in
display units, stored in SI), a value that does not read, the unit switch and the default
number of stages. Temperatures: T[K] = T[°C] + 273.15, T[°F] = T[°C]·9/5 + 32 (exact,
NIST SP 811, 2008, App. B)."""
from __future__ import annotations

import pytest

pytest.importorskip("pytestqt")

from conftest import make_doc  # noqa: E402

from stagewright.gui.document.display_prefs import DisplayPrefs  # noqa: E402
from stagewright.gui.document.model import ProjectModel  # noqa: E402
from stagewright.gui.study.controls import StudyControls, study_stage_count  # noqa: E402

pytestmark = pytest.mark.gui


@pytest.fixture
def prefs():
    return DisplayPrefs("SI", True)


@pytest.fixture
def controls(qtbot, prefs):
    c = StudyControls(ProjectModel(make_doc(stages=3, T0=298.15)), prefs)
    qtbot.addWidget(c)
    return c


def test_stage_count_default():
    assert [study_stage_count(n) for n in (1, 2, 3, 6, 8)] == [4, 4, 5, 8, 8]


def test_the_request_carries_the_inputs_in_si(controls):
    assert controls.max_stages.value() == 5  # 3 stages in the project, two more
    controls.hours.setValue(6000.0)
    controls.variable.setCurrentIndex(controls.variable.findData("ambient_temperature_K"))
    assert controls.values.text() == "10, 25, 40"  # the project's 25 °C and 15 K either side
    req = controls.request({"doc": 1})
    assert req.doc == {"doc": 1} and req.max_stages == 5 and req.operating_hours_per_year == 6000.0
    assert req.variable == "ambient_temperature_K"
    assert req.values == pytest.approx((283.15, 298.15, 313.15), abs=1e-9)


def test_values_that_do_not_read_are_marked(controls):
    controls.variable.setCurrentIndex(controls.variable.findData("ambient_temperature_K"))
    controls.values.setText("5, warm")
    with pytest.raises(ValueError, match="'warm' is not a number"):
        controls.request({})
    assert controls.values.property("invalid") is True
    controls.values.textEdited.emit("5, 6")  # the user types again: the mark goes
    assert controls.values.property("invalid") is False


def test_the_values_follow_the_unit_switch_and_inputs_lock(controls, prefs):
    controls.variable.setCurrentIndex(controls.variable.findData("ambient_temperature_K"))
    controls.values.setText("5, 15")
    prefs.system = "US"
    controls.show_units("US")
    assert controls.values.text() == "41, 59" and controls.values_unit.text() == "°F"
    controls.set_inputs_enabled(False)
    assert not controls.max_stages.isEnabled() and not controls.values.isEnabled()
