"""The report section of a field check's uncertainty lays out on report pages (app/report/field_uncertainty_section.py)."""
import json

from matplotlib.backends.backend_agg import FigureCanvasAgg

from stagewright.gui.report.field_uncertainty_section import field_uncertainty_section
from stagewright.gui.report.layout import Pager
from tests.conftest import SAMPLES
from stagewright.core.uncertainty.field_check import field_check_uncertainty


def _texts(pages) -> str:
    return "\n".join(t.get_text() for fig in pages for t in fig.texts)


def test_section_lays_out_verdicts_results_inputs_and_notes():
    doc = json.loads((SAMPLES / "field_check_two_stage.json").read_text())
    d = field_check_uncertainty(doc, draws=100).to_dict()
    p = Pager("A4", running_title="t")
    field_uncertainty_section(p, d, "SI")
    pages = p.finish()
    text = _texts(pages)
    for expected in ("Field check: uncertainty and verdicts", "Guaranteed figures", "Stage 2 isentropic efficiency",
                     "outside", "Measured inputs and their uncertainty", "Decision rule"):
        assert expected in text, expected
    for fig in pages:  # renders without error
        FigureCanvasAgg(fig).draw()
