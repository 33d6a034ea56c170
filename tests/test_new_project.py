"""The new-project template is hard to break (a defect: its aftercooler outlet was a fixed
30 °C, so a 35 °C site could not solve, and one stage to 7 bar(g) ran at 313 °C with no
warning)."""
import copy

import pytest

import stagewright.core
from stagewright.gui.document.model import TEMPLATE_DISCHARGE_LIMIT_K, new_document
from stagewright.core.project.validation import problems


@pytest.mark.parametrize("ambient_K", [253.15, 293.15, 308.15, 318.15])
def test_the_template_solves_at_any_usual_site_ambient(ambient_K):
    doc = new_document()
    doc["site"]["ambient_temperature_K"] = ambient_K
    assert problems(doc) == []
    res = stagewright.core.solve(doc)
    assert res.stages[-1].outlet.T < TEMPLATE_DISCHARGE_LIMIT_K
    assert not [w for w in res.warnings if "max_discharge_temperature_K" in w.field]


def test_one_hot_stage_from_the_template_is_reported():
    doc = copy.deepcopy(new_document())
    del doc["stages"][1]  # one stage to 8 bar(a): about 310 °C at 80 % (ideal-gas estimate)
    res = stagewright.core.solve(doc)
    hot = [w for w in res.warnings if w.field == "stages[0].max_discharge_temperature_K"]
    assert hot, [str(w) for w in res.warnings]
