"""Text from project files on the terminal (issue 22 items 15 and 10): escape sequences, carriage
returns and unpaired surrogates are printed as visible escapes, never acted on or crashed over."""
from __future__ import annotations

import json

import pytest

from stagewright.gui.cli.main import main
from stagewright.gui.cli.terminal import escape_controls
from conftest import SAMPLES

DEMO = SAMPLES / "two_stage_plant_air.json"
CLEAR_AND_LIE = "\x1b[2J\x1b[H\rAll checks passed\u202e"


def _project(tmp_path, name="p.json", **changes) -> str:
    doc = json.loads(DEMO.read_text(encoding="utf-8"))
    doc.update(changes)
    path = tmp_path / name
    path.write_text(json.dumps(doc), encoding="utf-8")  # ensure_ascii: the file itself holds escapes
    return str(path)


def _no_controls(text: str) -> None:
    assert "\x1b" not in text and "\u202e" not in text and not any(0xD800 <= ord(c) <= 0xDFFF for c in text)
    assert "\r" not in text.replace("\r\n", "")


def test_check_escapes_a_file_and_key_name_with_terminal_commands(tmp_path, capsys):
    path = _project(tmp_path, name="\x1b[2J\rAll checks passed.json", **{CLEAR_AND_LIE: 1})
    assert main(["check", path]) == 2
    out = capsys.readouterr().out
    _no_controls(out)
    assert "\\x1b[2J\\x0dAll checks passed.json" in out and "unknown key" in out


@pytest.mark.parametrize("command", [["solve"], ["study", "--max-stages", "2"]])
def test_a_title_with_terminal_commands_and_a_lone_surrogate_prints_escaped(tmp_path, capsys, command):
    path = _project(tmp_path, title="\ud800 " + CLEAR_AND_LIE)
    argv = [command[0], path, *command[1:]]
    assert main(argv) == 0  # before: UnicodeEncodeError traceback on the surrogate
    out = capsys.readouterr().out
    _no_controls(out)
    assert "\\ud800 \\x1b[2J" in out


def test_escape_controls_keeps_ordinary_text():
    text = "Stage 1 — 8.5 bar(g)\tok\r\nnext line\n"
    assert escape_controls(text) == text
    assert escape_controls("\x9b31m") == "\\x9b31m"  # a C1 control sequence introducer
