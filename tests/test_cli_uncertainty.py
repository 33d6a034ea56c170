"""``stagewright uncertainty``: tables, JSON, and a project without a field_check section."""
import json

from stagewright.gui.cli.main import main
from tests.conftest import SAMPLES, make_doc

SAMPLE = str(SAMPLES / "field_check_two_stage.json")


def test_json_has_figures_with_uncertainty_and_verdicts(capsys):
    assert main(["uncertainty", SAMPLE, "--json", "--draws", "200"]) == 0
    out = json.loads(capsys.readouterr().out)
    names = [f["figure"] for f in out["figures"]]
    assert names[:2] == ["mass_flow_kg_s", "free_air_delivery_m3_s"]
    assert "stages[1].isentropic_efficiency" in names and "stages[0].cooler.duty_W" in names
    for f in out["figures"]:
        assert f["expanded_uncertainty"] == 2 * f["standard_uncertainty"]
        assert f["monte_carlo"]["interval_low"] < f["value"] < f["monte_carlo"]["interval_high"]
    assert out["monte_carlo"]["draws"] == 200
    assert {v["verdict"] for v in out["verdicts"]} <= {"within", "outside", "not decidable at this uncertainty"}
    assert any("of the variance of stage 2 isentropic efficiency comes from" in s for s in out["sentences"])


def test_text_tables_name_inputs_results_and_verdicts(capsys):
    assert main(["uncertainty", SAMPLE, "--no-monte-carlo"]) == 0
    out = capsys.readouterr().out
    assert "Stage 2 discharge temperature" in out and "U (k = 2)" in out
    assert "Stage 2 isentropic efficiency" in out and "outside" in out
    assert "Decision rule" in out and "from memory" in out


def test_project_without_field_check_is_rejected(tmp_path, capsys):
    p = tmp_path / "plain.json"
    p.write_text(json.dumps(make_doc()))
    assert main(["uncertainty", str(p)]) == 2
    err = capsys.readouterr().err
    assert "field_check.uncertainties" in err
