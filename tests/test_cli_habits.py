"""Command-line habits (issue 18 items 4–6): --version, --help listing every sub-command, an
example in each sub-command's help, usage errors (64) told apart from rejected inputs (2), one
JSON shape for one file and several, `check` and `--help` without CoolProp, table outputs."""
import csv
import json
import subprocess
import sys
import types

import pytest

import stagewright.gui.entry as entry
import stagewright.core
from stagewright.gui.cli import tables
from stagewright.gui.cli.main import SUBCOMMANDS, main, summary
from stagewright.gui.cli.paths import EXIT_INPUT, EXIT_USAGE
from conftest import ROOT, SAMPLES, make_doc

PLANT = SAMPLES / "two_stage_plant_air.json"
YEAR = SAMPLES / "three_stage_site_year.json"


def test_version_names_the_release(capsys):
    assert entry.main(["--version"]) == 0
    out = capsys.readouterr().out
    assert out.startswith(f"stagewright {stagewright.core.__version__} (") and "Python" in out


def test_help_lists_every_sub_command_with_its_line_and_the_exit_statuses(capsys):
    assert entry.main(["--help"]) == 0
    out = capsys.readouterr().out
    for name in SUBCOMMANDS:
        line = next(line for line in out.splitlines() if line.split()[:1] == [name])
        assert summary(name) in line and "``" not in line
    assert "--version" in out and "PROJECT.json" in out
    assert f"{EXIT_INPUT}   an input was rejected" in out and f"{EXIT_USAGE}  usage error" in out


@pytest.mark.parametrize("name", list(SUBCOMMANDS))
def test_each_sub_command_help_has_an_example(name, capsys):
    assert main([name, "--help"]) == 0
    out = capsys.readouterr().out
    example = out[out.index("example"):]
    assert f"stagewright {name} " in example and "exit status:" in example


@pytest.mark.parametrize("argv", [["solve", "--no-such-option", str(PLANT)], ["solve"], ["check"],
                                  ["sweep", str(PLANT)], ["study", str(PLANT), "--max-stages", "many"],
                                  ["slove", str(PLANT)], ["--no-such-option"], ["report", str(PLANT), "--units", "X"]])
def test_a_usage_error_is_64_and_names_the_problem(argv, capsys):
    assert entry.main(argv) == EXIT_USAGE
    err = capsys.readouterr().err
    assert "usage: stagewright" in err and "error:" in err


def test_a_rejected_input_is_2_not_a_usage_error(tmp_path, capsys):
    bad = tmp_path / "bad.json"
    bad.write_text(json.dumps(make_doc(eta=1.5)))
    assert entry.main(["check", str(bad)]) == EXIT_INPUT
    assert entry.main(["sweep", str(PLANT), "--axis", "site.ambient_temperature_K=1:2:0"]) == EXIT_INPUT
    assert "usage:" not in capsys.readouterr().err


def test_a_mistyped_sub_command_suggests_the_right_one(capsys):
    assert entry.main(["chek", str(PLANT)]) == EXIT_USAGE
    assert "did you mean 'check'" in capsys.readouterr().err


def test_without_a_sub_command_the_window_opens_on_the_project(monkeypatch):
    calls = []
    fake = types.ModuleType("launch")
    fake.run_gui = lambda project, screenshot, size=None: calls.append((project, screenshot, size)) or 0
    launch_name = entry.__name__.rpartition(".")[0] + ".window.launch"
    monkeypatch.setitem(sys.modules, launch_name, fake)
    assert entry.main([str(PLANT)]) == 0
    assert entry.main([]) == 0
    assert entry.main(["--screenshot", "out.png", "--size", "800x600"]) == 0
    assert calls == [(str(PLANT), None, None), (None, None, None), (None, "out.png", "800x600")]


@pytest.mark.parametrize("command", ["solve", "year"])
def test_json_has_one_shape_for_one_file_and_for_several(command, tmp_path, capsys):
    path = str(YEAR)
    bad = tmp_path / "bad.json"
    bad.write_text("{")
    assert main([command, path, "--json"]) == 0
    one = json.loads(capsys.readouterr().out)
    assert main([command, path, str(bad), "--json"]) == EXIT_INPUT
    several = json.loads(capsys.readouterr().out)
    key = "result" if command == "solve" else command
    assert isinstance(one, list) and [set(e) for e in one] == [{"file", "title", key}]
    assert several[0] == one[0]
    assert set(several[1]) == {"file", "error"} and "line 1" in several[1]["error"]
    assert main([command, str(bad), "--json"]) == EXIT_INPUT  # one rejected file: still the list
    assert json.loads(capsys.readouterr().out) == several[1:]


def _modules_after(argv: list[str]) -> set[str]:
    """The top-level packages imported by ``stagewright ARGV`` in a fresh interpreter."""
    code = (f"import io, contextlib, sys\nfrom {entry.__name__} import main\n"
            "with contextlib.redirect_stdout(io.StringIO()):\n"
            "    try:\n        main(sys.argv[1:])\n    except SystemExit:\n        pass\n"
            "print(' '.join(sorted({m.split('.')[0] for m in sys.modules})))")
    proc = subprocess.run([sys.executable, "-c", code, *argv], cwd=ROOT, capture_output=True, text=True,
                          check=True)
    return set(proc.stdout.split())


@pytest.mark.parametrize("argv", [["check", str(SAMPLES)], ["--help"], ["--version"], ["solve", "--help"]])
def test_check_and_help_never_import_coolprop(argv):
    # what makes `check` take 2 s is importing CoolProp (python -X importtime); the bench times it
    loaded = _modules_after(argv)
    assert "CoolProp" not in loaded and "PySide6" not in loaded and "scipy" not in loaded


def test_solve_still_imports_coolprop():  # the test above can fail: this is how it would look
    assert "CoolProp" in _modules_after(["solve", str(PLANT)])


def test_the_package_solve_is_the_function_even_after_its_module_is_imported():
    import importlib
    module = importlib.import_module(stagewright.core.__name__ + ".solve")
    assert stagewright.core.solve is module.solve and callable(stagewright.core.solve)


# --- tables: one header row; Parquet and Excel only with their optional libraries -----------------

def _sweep(tmp_path, name: str) -> tuple[int, object]:
    out = tmp_path / name
    code = main(["sweep", str(PLANT), "--axis", "site.ambient_temperature_K=283.15:293.15:2", "-o", str(out)])
    return code, out


def test_sweep_csv_has_one_header_row_with_units(tmp_path):
    code, out = _sweep(tmp_path, "grid.csv")
    assert code == 0
    rows = list(csv.reader(out.open(newline="", encoding="utf-8")))
    assert len(rows) == 3 and rows[0][:3] == ["site.ambient_temperature_K", "mass_flow_kg_s", "shaft_power_W"]
    assert all(float(v) > 0 for v in rows[1][:3])  # the first row below the header is data


def test_sweep_parquet(tmp_path):
    pq = pytest.importorskip("pyarrow.parquet")
    code, out = _sweep(tmp_path, "grid.parquet")
    assert code == 0
    table = pq.read_table(out)
    csv_code, csv_out = _sweep(tmp_path, "grid.csv")
    rows = list(csv.DictReader(csv_out.open(newline="", encoding="utf-8")))
    assert table.column_names == list(rows[0]) and table.num_rows == 2
    assert table.column("shaft_power_W").to_pylist() == [float(r["shaft_power_W"]) for r in rows]
    assert table.column("error").to_pylist() == ["", ""]


def test_year_excel_keeps_numbers_and_text(tmp_path, capsys):
    openpyxl = pytest.importorskip("openpyxl")
    out = tmp_path / "bins.xlsx"
    assert main(["year", str(YEAR), "--csv", str(out), "--json"]) == 0
    y = json.loads(capsys.readouterr().out)[0]["year"]
    sheet = openpyxl.load_workbook(out).active
    header = [c.value for c in sheet[1]]
    first = dict(zip(header, [c.value for c in sheet[2]]))
    assert sheet.max_row == 1 + len(y["bins"])
    assert first["label"] == y["bins"][0]["label"] and first["energy_kWh"] == y["bins"][0]["energy_kWh"]
    assert first["meets_limits"] is y["bins"][0]["meets_limits"]


def test_spreadsheet_text_is_never_a_formula(tmp_path):
    openpyxl = pytest.importorskip("openpyxl")
    out = tmp_path / "t.xlsx"
    tables.write_table(out, ["label", "x"], [["=1+1", 1.0], ["\x1b[2J", None]])
    sheet = openpyxl.load_workbook(out).active
    assert sheet["A2"].value == "=1+1" and sheet["A2"].data_type == "s"
    assert sheet["A3"].value == "\\x1b[2J" and sheet["B3"].value is None


def test_a_missing_optional_library_is_refused_before_any_work(tmp_path, monkeypatch, capsys):
    real = tables.importlib.util.find_spec
    monkeypatch.setattr(tables.importlib.util, "find_spec", lambda name: None if name == "pyarrow" else real(name))
    code, out = _sweep(tmp_path, "grid.parquet")
    assert code == EXIT_INPUT and not out.exists()
    assert "pip install 'stagewright[tables]'" in capsys.readouterr().err


def test_year_table_never_replaces_a_file_without_force(tmp_path, capsys):
    out = tmp_path / "bins.csv"
    out.write_text("keep me")
    assert main(["year", str(YEAR), "--csv", str(out)]) == EXIT_INPUT
    assert out.read_text() == "keep me" and "--force" in capsys.readouterr().err
    assert main(["year", str(YEAR), "--csv", str(YEAR), "--force"]) == EXIT_INPUT  # never the input
    assert main(["year", str(YEAR), "--csv", str(out), "--force"]) == 0
    rows = list(csv.reader(out.open(newline="", encoding="utf-8")))
    assert rows[0][:3] == ["label", "temperature_K", "relative_humidity"] and len(rows) == 13
