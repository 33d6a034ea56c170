"""Window settings: a crafted settings file runs nothing at start-up (issue 22 item 16)."""
from __future__ import annotations

import subprocess
import sys
import textwrap

import pytest

from tests.gui_support import SAMPLE

_CRAFT = textwrap.dedent("""
    import sys
    from PySide6.QtCore import QSettings

    class Payload:  # unpickling it creates the marker file: "code ran"
        def __reduce__(self):
            return (open, (sys.argv[2], "w"))

    s = QSettings(sys.argv[1], QSettings.IniFormat)
    s.setValue("window/state", Payload())
    s.setValue("window/geometry", Payload())
    s.setValue("files/recent", ["/plain/project.json"])
    s.setValue("display/system", "US")
    s.setValue("other/quoted", "x")
    s.sync()
""")


def _crafted(tmp_path):
    ini, marker = tmp_path / "settings.ini", tmp_path / "code-ran"
    subprocess.run([sys.executable, "-c", _CRAFT, str(ini), str(marker)], check=True,
                   env={"QT_QPA_PLATFORM": "offscreen", "PATH": "/usr/bin:/bin"})
    text = ini.read_text(encoding="utf-8")
    assert "@Variant(" in text and "PyObjectWrapper" in text  # the file holds pickled objects
    # and the same payload hidden behind quotes and escapes Qt would decode
    text = text.replace("other/quoted=x", "").replace("[other]", "[other]\nquoted=\"\"@Variant(x)\nhex=\\x40Variant(y)")
    ini.write_text(text, encoding="utf-8")
    return ini, marker


@pytest.mark.gui
def test_a_pickled_value_in_the_settings_file_is_never_loaded(qtbot, tmp_path):
    import json

    from PySide6.QtCore import QSettings

    from stagewright.gui.window.main_window import MainWindow

    ini, marker = _crafted(tmp_path)
    settings = QSettings(str(ini), QSettings.IniFormat)
    win = MainWindow(json.loads(SAMPLE.read_text(encoding="utf-8")), settings=settings, debounce_ms=10,
                     restore_layout=True, autosave_ms=None)
    qtbot.addWidget(win)
    assert not marker.exists(), "a pickled object in the settings file was loaded (its code ran)"
    assert win.prefs.system == "US"                             # plain values are kept
    assert win.files.recent_files() == ["/plain/project.json"]
    assert "@Variant" not in ini.read_text(encoding="utf-8")
    win.editor.shutdown()


def test_remove_unsafe_entries_keeps_plain_values(tmp_path):
    from stagewright.gui.window.safe_settings import remove_unsafe_entries

    ini = tmp_path / "s.ini"
    plain = ("[window]\ngeometry=@ByteArray(\\0\\x1@Variant(x))\n[files]\n"
             "recent=/a \u00e9/b.json, \"C:\\\\x\\\\y, z.json\", @@home/x.json\nempty=@Invalid()\n"
             "[display]\ngauge=true\nsystem=SI")
    ini.write_text(plain, encoding="utf-8")
    assert remove_unsafe_entries(ini) == []
    assert ini.read_text(encoding="utf-8") == plain
    ini.write_text(plain + "\nbad=@DateTime(x)\nworse=a, @Variant(y)\ncont=a\\\n@Variant(z)\noct=\\100x", encoding="utf-8")
    assert len(remove_unsafe_entries(ini)) == 5
    assert ini.read_text(encoding="utf-8") == plain


def test_quoted_and_continued_byte_arrays_are_kept_and_a_list_after_one_is_dropped(tmp_path):
    # Qt quotes a byte array holding a separator and continues a long one on the next line with a
    # trailing backslash (the window's dock state does both once the window has enough panels)
    from stagewright.gui.window.safe_settings import remove_unsafe_entries
    ini = tmp_path / "s.ini"
    state = '"@ByteArray(\\0\\0\\0\\xff;\\0\\x14\\0p\\0\\x61\\\n\\0n\\0\\x65)"'
    ini.write_text("[window]\nstate=" + state + '\nevil="@ByteArray(a)",@Variant(\\0)\n', encoding="utf-8")
    dropped = remove_unsafe_entries(ini)
    assert dropped == ['evil="@ByteArray(a)",@Variant(\\0)']
    assert "state=" + state in ini.read_text(encoding="utf-8")
