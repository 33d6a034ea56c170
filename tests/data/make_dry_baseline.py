"""Write the dry-intake regression baseline: dry-air results of main before moist air landed.

It was run on main at 4ca441c (from a `git archive` export of that commit, so that no moist-air
code was involved). Re-running it on code that contains moist air would defeat its purpose;
a deliberate change to dry results later means regenerating it the same way from the commit
before that change is merged with a moist-air-free export."""
import json, sys, copy
sys.path.insert(0, "tests")
from conftest import make_doc, SAMPLES
import stagewright.core

def cases():
    out = {}
    out["sample_two_stage_plant_air"] = json.loads((SAMPLES / "two_stage_plant_air.json").read_text())
    for model in ("real_gas", "ideal_gas", "constant_cp"):
        out[f"{model}_isentropic_3"] = make_doc(model=model, stages=3, eta=0.78, p_out=12e5, cool_to=305.0, drop=8000.0)
        out[f"{model}_polytropic_2"] = make_doc(model=model, stages=2, eta=0.84, kind="polytropic", p_out=8e5,
                                                flow=("free_air_delivery", 0.2))
        d = make_doc(model=model, stages=2, eta=0.8, p_out=7e5, flow=("normal_volume", 0.15))
        d["stages"][1]["cooler"] = None
        d["stages"][0].update(heat_loss_W=800.0, exit_velocity_m_s=30.0, mechanical_efficiency=0.97)
        out[f"{model}_normal_volume_losses"] = d
        out[f"{model}_shaft_power"] = make_doc(model=model, stages=2, eta=0.8, p_out=8e5, flow=("shaft_power", 150e3))
    d = make_doc(model="real_gas", stages=1, eta=0.8, p_out=3e5)
    t2 = stagewright.core.solve(d).stages[0].outlet.T + 5.0
    out["real_gas_measured_T"] = make_doc(model="real_gas", stages=1, eta=t2, kind="discharge_temperature", p_out=3e5)
    return out

if __name__ == "__main__":  # never on import (pytest collects doctests from every module)
    docs = cases()
    data = {name: {"doc": doc, "result": stagewright.core.solve(copy.deepcopy(doc)).to_dict()} for name, doc in docs.items()}
    json.dump(data, open("tests/data/dry_baseline.json", "w"), indent=1, sort_keys=True, allow_nan=False)
    print(len(data))
