"""``stagewright --screenshot``: renders the window offscreen after the first solve, writes a PNG."""
from __future__ import annotations

import os
import struct
import subprocess
import sys
from pathlib import Path

import pytest

pytestmark = pytest.mark.gui
ROOT = Path(__file__).resolve().parent.parent


def _png_size(path: Path) -> tuple[int, int]:
    data = path.read_bytes()
    # PNG signature and IHDR layout: ISO/IEC 15948:2004 (PNG), §5.2 and §11.2.2
    assert data[:8] == b"\x89PNG\r\n\x1a\n" and data[12:16] == b"IHDR"
    return struct.unpack(">II", data[16:24])


def test_screenshot_command_writes_a_png_of_the_requested_size(tmp_path):
    out = tmp_path / "shot.png"
    env = dict(os.environ, QT_QPA_PLATFORM="offscreen")
    proc = subprocess.run([sys.executable, "-m", "app.entry", "--screenshot", str(out), "--size", "1024x700",
                           str(ROOT / "sample_projects" / "two_stage_plant_air.json")],
                          cwd=ROOT, env=env, capture_output=True, text=True, timeout=120)
    assert proc.returncode == 0, proc.stderr
    assert _png_size(out) == (1024, 700)
    assert out.stat().st_size > 20_000  # a drawn window, not an empty frame


def test_screenshot_of_a_broken_project_fails_with_one_line(tmp_path):
    bad = tmp_path / "bad.json"
    bad.write_text('{"site": 1}', encoding="utf-8")
    env = dict(os.environ, QT_QPA_PLATFORM="offscreen")
    proc = subprocess.run([sys.executable, "-m", "app.entry", "--screenshot", str(tmp_path / "x.png"), str(bad)],
                          cwd=ROOT, env=env, capture_output=True, text=True, timeout=120)
    assert proc.returncode == 2
    assert proc.stderr.startswith("stagewright: ") and "site" in proc.stderr
    assert not (tmp_path / "x.png").exists()
