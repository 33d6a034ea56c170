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
    proc = subprocess.run([sys.executable, "-m", "stagewright.gui.entry", "--screenshot", str(out), "--size", "1024x700",
                           str(ROOT / "sample_projects" / "two_stage_plant_air.json")],
                          cwd=ROOT, env=env, capture_output=True, text=True, timeout=120)
    assert proc.returncode == 0, proc.stderr
    assert _png_size(out) == (1024, 700)
    assert out.stat().st_size > 20_000  # a drawn window, not an empty frame


def test_screenshot_of_a_broken_project_fails_with_one_line(tmp_path):
    bad = tmp_path / "bad.json"
    bad.write_text('{"site": 1}', encoding="utf-8")
    env = dict(os.environ, QT_QPA_PLATFORM="offscreen")
    proc = subprocess.run([sys.executable, "-m", "stagewright.gui.entry", "--screenshot", str(tmp_path / "x.png"), str(bad)],
                          cwd=ROOT, env=env, capture_output=True, text=True, timeout=120)
    assert proc.returncode == 2
    assert proc.stderr.startswith("stagewright: ") and "site" in proc.stderr
    assert not (tmp_path / "x.png").exists()


# ---- Qt's xcb platform plugin: missing system libraries named before Qt aborts ------------------
# Sample output of ``ldd .../PySide6/Qt/plugins/platforms/libqxcb.so`` on a fresh Debian 12 (PySide6
# 6.11) without libxcb-icccm4 and libxcb-keysyms1, shortened; addresses as ldd prints them.
LDD_MISSING = """\tlinux-vdso.so.1 (0x00007f1daf72f000)
\tlibQt6XcbQpa.so.6 => /venv/lib/python3.11/site-packages/PySide6/Qt/plugins/platforms/../../lib/libQt6XcbQpa.so.6 (0x00007f1daf000000)
\tlibxkbcommon-x11.so.0 => /lib/x86_64-linux-gnu/libxkbcommon-x11.so.0 (0x00007f1daf57e000)
\tlibxcb-cursor.so.0 => /lib/x86_64-linux-gnu/libxcb-cursor.so.0 (0x00007f1daf577000)
\tlibxcb-icccm.so.4 => not found
\tlibxcb-util.so.1 => /lib/x86_64-linux-gnu/libxcb-util.so.1 (0x00007f1daf56f000)
\tlibxcb-keysyms.so.1 => not found
\tlibc.so.6 => /lib/x86_64-linux-gnu/libc.so.6 (0x00007f1dad81e000)
\tlibxcb-icccm.so.4 => not found
\tlibxcb-keysyms.so.1 => not found
\t/lib64/ld-linux-x86-64.so.2 (0x00007f1daf731000)
"""
LDD_COMPLETE = "\n".join(line for line in LDD_MISSING.splitlines() if "not found" not in line)
X11 = {"DISPLAY": ":0"}


def test_missing_libraries_are_read_from_ldd_output():
    from stagewright.gui.window.launch import missing_libraries, packages_for
    assert missing_libraries(LDD_MISSING) == ["libxcb-icccm.so.4", "libxcb-keysyms.so.1"]
    assert missing_libraries(LDD_COMPLETE) == []
    # Debian 12 package names: `dpkg -S libxcb-icccm.so.4` → libxcb-icccm4, `dpkg -S libxcb-keysyms.so.1` → libxcb-keysyms1
    assert packages_for(["libxcb-icccm.so.4", "libxcb-keysyms.so.1"]) == (["libxcb-icccm4", "libxcb-keysyms1"], [])
    assert packages_for(["libglib-2.0.so.0", "libgthread-2.0.so.0", "libodd.so.9"]) == (["libglib2.0-0"],
                                                                                       ["libodd.so.9"])


def test_missing_xcb_libraries_give_one_install_line(tmp_path):
    from stagewright.gui.window.launch import platform_problem
    plugin = tmp_path / "libqxcb.so"
    for env in ({**X11}, {**X11, "QT_QPA_PLATFORM": "xcb"}, {}):
        text = platform_problem(env, plugin, ldd=lambda _p: LDD_MISSING, platform="linux")
        assert "libxcb-icccm.so.4, libxcb-keysyms.so.1" in text
        assert "sudo apt-get install libxcb-icccm4 libxcb-keysyms1\n" in text
        assert "cursor" not in text  # Qt's own message blames libxcb-cursor0, which is installed


def test_the_check_stays_out_of_the_way_when_qt_would_not_use_xcb(tmp_path):
    from stagewright.gui.window.launch import platform_problem
    plugin = tmp_path / "libqxcb.so"

    def check(env, platform="linux"):
        return platform_problem(env, plugin, ldd=lambda _p: LDD_MISSING, platform=platform)

    assert check({**X11, "QT_QPA_PLATFORM": "offscreen"}) is None
    assert check({**X11, "QT_QPA_PLATFORM": "wayland;xcb"}) is None
    assert check({**X11, "WAYLAND_DISPLAY": "wayland-0"}) is None  # Qt falls back on Wayland
    assert check({**X11}, platform="win32") is None
    assert platform_problem(X11, plugin, ldd=lambda _p: LDD_COMPLETE, platform="linux") is None
    assert platform_problem(X11, plugin, ldd=lambda _p: "", platform="linux") is None  # no ldd: Qt decides
    no_display = platform_problem({}, plugin, ldd=lambda _p: LDD_COMPLETE, platform="linux")
    assert "DISPLAY is not set" in no_display and "--screenshot" in no_display


def test_run_gui_prints_the_problem_and_stops_before_qt(monkeypatch, capsys):
    from stagewright.gui.window import launch
    monkeypatch.delenv("QT_QPA_PLATFORM", raising=False)
    monkeypatch.setattr(launch, "platform_problem", lambda: "libraries are missing")
    assert launch.run_gui(None) == 1
    assert capsys.readouterr().err == "stagewright: libraries are missing\n"


def test_readme_installs_every_library_package_the_check_knows():
    from stagewright.gui.window.launch import XCB_PACKAGES
    readme = (ROOT / "README.md").read_text(encoding="utf-8")
    lines = [line for line in readme.splitlines() if line.startswith("sudo apt-get install ")]
    assert len(lines) == 1
    assert set(XCB_PACKAGES.values()) <= set(lines[0].split()[3:])


def test_a_screenshot_right_after_the_first_answer_shows_the_drawn_chart(qtbot, tmp_path):
    """The chart redraws a moment after a result; a screenshot draws what is waiting first."""
    from gui_support import make_window
    from matplotlib.lines import Line2D

    from stagewright.gui.window.launch import save_screenshot
    win = make_window(qtbot, tmp_path)
    save_screenshot(win, tmp_path / "shot.png")
    charts = win.panels["charts"]
    assert charts.ts.pending is None
    assert any(ln.get_xdata().size for ln in charts.ts.figure.findobj(Line2D))
    win.close()
