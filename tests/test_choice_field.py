"""Drop-downs show the choice just made (a defect: boxes whose value no single key stores —
site pressure basis, cooler outlet basis, coolant — went blank after a choice)."""
import pytest

from tests.gui_support import wait_solved, window  # noqa: F401  (fixture)

pytestmark = pytest.mark.gui


def _choose(qtbot, combo, text: str) -> None:
    """Pick ``text`` as a user would: the box's list sets the index and emits ``activated``."""
    index = combo.findText(text)
    assert index >= 0, f"{text!r} is not offered"
    combo.setCurrentIndex(index)
    combo.activated.emit(index)
    qtbot.wait(20)


def test_site_pressure_basis_shows_the_choice(qtbot, window):  # noqa: F811
    site = window.panels["site"]
    _choose(qtbot, site.mode, "Elevation")
    assert window.editor.model.get("site.elevation_m") is not None
    assert site.mode.currentText() == "Elevation"
    _choose(qtbot, site.mode, "Barometric pressure")
    assert site.mode.currentText() == "Barometric pressure"


@pytest.mark.parametrize("combo, text", [("mode", "Approach to coolant"), ("coolant", "Water")])
def test_cooler_choices_show_the_choice(qtbot, window, combo, text):  # noqa: F811
    train = window.panels["train"]
    train.select("cooler", 0)
    box = getattr(train.cooler_form, combo)
    _choose(qtbot, box, text)
    assert box.currentText() == text
    before = window.editor.solved_jobs
    wait_solved(qtbot, window, before - 1)
    assert box.currentText() == text
