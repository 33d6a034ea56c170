"""Helpers for the tests that drive the real window offscreen (pytest-qt)."""
from __future__ import annotations

import copy
import json
from pathlib import Path

import pytest

ROOT = Path(__file__).resolve().parent.parent
SAMPLE = ROOT / "sample_projects" / "two_stage_plant_air.json"
SOLVE_TIMEOUT_MS = 60_000


def simple_real_gas_doc(stages: int = 2, eta: float = 0.8) -> dict:
    """Invented train: real-gas air, 1 kg/s, 1 bar(a) and 20 °C, to 9 bar(a); every cooler
    brings the air back to 20 °C with no pressure drop, so the equal split is exactly 3."""
    return copy.deepcopy({
        "site": {"ambient_temperature_K": 293.15, "barometric_pressure_Pa": 100_000.0},
        "fluid": {"model": "real_gas"},
        "flow": {"kind": "mass", "value": 1.0},
        "discharge_pressure_Pa": 900_000.0,
        "stages": [{"name": f"S{i + 1}", "efficiency": {"kind": "isentropic", "value": eta},
                    "cooler": {"outlet_temperature_K": 293.15, "pressure_drop_Pa": 0.0}}
                   for i in range(stages)],
    })


def make_window(qtbot, tmp_path, doc=None, autosave_ms=None):
    from PySide6.QtCore import QSettings

    from stagewright.gui.window.main_window import MainWindow
    settings = QSettings(str(tmp_path / "settings.ini"), QSettings.IniFormat)
    win = MainWindow(doc if doc is not None else json.loads(SAMPLE.read_text(encoding="utf-8")),
                     settings=settings, debounce_ms=10, restore_layout=False, autosave_ms=autosave_ms)
    win.prompts.ask_save_changes = lambda _name: "discard"  # never a modal question in a test
    qtbot.addWidget(win)
    win.show()
    wait_solved(qtbot, win, 0)
    return win


def wait_solved(qtbot, win, after: int) -> None:
    """Wait until a solve newer than ``after`` answered and the result is current."""
    ed = win.editor
    qtbot.waitUntil(lambda: ed.solved_jobs > after and not ed.stale and not ed.solver.busy,
                    timeout=SOLVE_TIMEOUT_MS)


def type_into(qtbot, field, text: str) -> None:
    """Replace a QuantityField's text as a user would and press Return."""
    from PySide6.QtCore import Qt
    field.edit.clear()
    qtbot.keyClicks(field.edit, text)
    qtbot.keyClick(field.edit, Qt.Key_Return)


@pytest.fixture
def window(qtbot, tmp_path):
    win = make_window(qtbot, tmp_path)
    yield win
    win.close()


def write_hourly_csv(path: Path, hours: int = 8760) -> Path:
    """An invented hourly year (no real station): a continental site, about −9 °C in January and
    +21 °C in July with a daily swing, a dew point 1–6 K under the dry bulb and a cooling-water
    supply that follows the season with a 12 °C floor. Deterministic; written to ``path``."""
    import math
    from datetime import datetime, timedelta
    start = datetime(2025, 1, 1)
    lines = ["timestamp,dry bulb [°C],dew point [°C],coolant supply [°C]"]
    for h in range(hours):
        day, hour = divmod(h, 24)
        t = 6.0 - 15.0 * math.cos(2 * math.pi * (day - 15) / 365.0) + 4.0 * math.sin(2 * math.pi * (hour - 9) / 24.0)
        dew = t - 1.0 - 5.0 * (0.5 + 0.5 * math.sin(2 * math.pi * (hour - 9) / 24.0))
        stamp = start + timedelta(hours=h)
        lines.append(f"{stamp:%Y-%m-%d %H:%M},{t:.1f},{dew:.1f},{max(12.0, 0.55 * t + 11.0):.1f}")
    Path(path).write_text("\n".join(lines) + "\n", encoding="utf-8")
    return Path(path)


def type_table_cell(table, row: int, column: int, text: str) -> bool:
    """What a table view does when the user finishes typing in a cell: its model's data is set."""
    from PySide6.QtCore import Qt
    model = table.model()
    return model.setData(model.index(row, column), text, Qt.EditRole)


def table_cell_text(table, row: int, column: int) -> str:
    """A cell's text as a table view shows it."""
    from PySide6.QtCore import Qt
    model = table.model()
    return model.data(model.index(row, column), Qt.DisplayRole)
