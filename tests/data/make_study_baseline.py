"""Write the staging-study baseline: what the study reported before issue 19 made its trials cheaper.

    python tests/data/make_study_baseline.py            # prints the JSON
    python tests/data/make_study_baseline.py --write    # writes tests/data/study_baseline_2ad76eb.json

It was run on an export of main at 2ad76eb (``git archive 2ad76eb | tar -x -C DIR``, this file copied
in, ``PYTHONPATH=DIR python DIR/tests/data/make_study_baseline.py --write``), so the baseline comes from
the study as it was before its gradients were taken in intermediate pressures.
``tests/test_study_unchanged.py`` compares today's study with it. Re-running it on newer code would
defeat its purpose. The cases are invented trains (no published source: a regression baseline).
"""
import copy
import json
import sys
from pathlib import Path

HERE = Path(__file__).resolve().parent
ROOT = HERE.parent.parent
OUT = HERE / "study_baseline_2ad76eb.json"

#: Row keys left out of the comparison: how the optimiser got there, not what it reports.
PATH_KEYS = ("iterations", "solves", "note")


def _doc(model="real_gas", stages=2, eta=0.8, p_out=9e5, cool_to=293.15, drop=0.0, flow=("mass", 1.0)):
    return {"site": {"ambient_temperature_K": 293.15, "barometric_pressure_Pa": 1e5},
            "fluid": {"model": model}, "flow": {"kind": flow[0], "value": flow[1]},
            "discharge_pressure_Pa": p_out,
            "stages": [{"efficiency": {"kind": "isentropic", "value": eta},
                        "cooler": {"outlet_temperature_K": cool_to, "pressure_drop_Pa": drop}}
                       for _ in range(stages)]}


def four_stage_moist() -> dict:
    """bench/run.py's four-stage real-gas train to 40 bar(a), water-cooled, humid intake."""
    return {"site": {"ambient_temperature_K": 303.15, "barometric_pressure_Pa": 100_000.0,
                     "relative_humidity": 0.6},
            "fluid": {"model": "real_gas"}, "flow": {"kind": "free_air_delivery", "value": 0.5},
            "inlet_pressure_drop_Pa": 1500.0, "discharge_pressure_Pa": 40e5, "driver": {"efficiency": 0.96},
            "stages": [{"efficiency": {"kind": "isentropic", "value": 0.8},
                        "mechanical_efficiency": 0.985, "heat_loss_W": 1000.0,
                        "cooler": {"approach_K": 8.0, "coolant_inlet_temperature_K": 298.15,
                                   "pressure_drop_Pa": 15_000.0}} for _ in range(4)]}


def comparisons() -> dict:
    """{case name: (project, most stages)} for :func:`stagewright.core.study.compare_stagings`."""
    plant = json.loads((ROOT / "sample_projects" / "two_stage_plant_air.json").read_text(encoding="utf-8"))
    out = {"bench_four_stage_moist": (four_stage_moist(), 8)}
    for model in ("real_gas", "ideal_gas", "constant_cp"):
        out[f"plant_air_{model}"] = (dict(copy.deepcopy(plant), fluid={"model": model}), 6)
    tight = copy.deepcopy(plant)
    for st in tight["stages"]:
        st["max_discharge_temperature_K"] = 440.0  # binding in the 2- and 3-stage options
    out["plant_air_440K_limit"] = (tight, 6)
    polytropic = _doc(model="ideal_gas", stages=1, p_out=12e5, cool_to=305.0, drop=8000.0,
                      flow=("free_air_delivery", 0.2))
    polytropic["stages"][0]["efficiency"] = {"kind": "polytropic", "value": 0.84}
    polytropic["stages"][0]["exit_velocity_m_s"] = 30.0
    out["ideal_gas_polytropic_drops"] = (polytropic, 5)
    return out


def splits() -> dict:
    """{case name: project} for :func:`stagewright.core.study.optimal_split` (not strict)."""
    held = _doc(model="constant_cp", stages=3, p_out=12e5)
    held["stages"][0]["max_pressure_ratio"] = 2.0
    held["stages"][2].update({"min_pressure_ratio": 2.5, "max_pressure_ratio": 2.5})
    limited = _doc(stages=2, p_out=12e5, drop=10000.0, cool_to=310.0)
    for st in limited["stages"]:
        st["max_discharge_temperature_K"] = 476.0
    limited["stages"][0]["efficiency"]["value"] = 0.72
    rated = _doc(stages=2, flow=("free_air_delivery", 0.3))
    for st in rated["stages"]:
        st["cooler"] = {"ua_W_K": 2500.0, "coolant": {"kind": "water", "flow_kg_s": 1.0},
                        "coolant_inlet_temperature_K": 293.15, "pressure_drop_Pa": 5000.0}
    uncooled = _doc(stages=3, p_out=6e5, drop=5000.0)
    uncooled["stages"][1]["cooler"] = None
    impossible = _doc(stages=3, p_out=12e5, drop=10000.0, cool_to=310.0)
    for st in impossible["stages"]:
        st["max_discharge_temperature_K"] = 380.0  # no split meets it: the minimax answer
    return {"held_and_bounded_constant_cp": held, "first_stage_limited_real_gas": limited,
            "rated_coolers_real_gas": rated, "middle_stage_uncooled_real_gas": uncooled,
            "limit_out_of_reach_real_gas": impossible}


def random_trains(count: int = 16, seed: int = 19) -> dict:
    """{case name: project} of ``count`` invented trains drawn with a fixed seed: 2 … 5 unlike
    stages on each property model, humid intake on some, coolers with pressure drops, and on
    some a discharge-temperature limit (binding or not)."""
    import random
    rng = random.Random(seed)
    out = {}
    for k in range(count):
        model = ("real_gas", "ideal_gas", "constant_cp")[k % 3]
        n = rng.randint(2, 5)
        doc = _doc(model=model, stages=n, p_out=rng.uniform(4e5, 20e5), flow=("free_air_delivery", 0.25))
        doc["site"]["ambient_temperature_K"] = rng.uniform(278.15, 313.15)
        if model == "real_gas" and rng.random() < 0.6:
            doc["site"]["relative_humidity"] = rng.uniform(0.2, 0.9)
        limit = rng.uniform(430.0, 490.0) if rng.random() < 0.5 else None
        for st in doc["stages"]:
            kind = "polytropic" if rng.random() < 0.3 else "isentropic"
            st["efficiency"] = {"kind": kind, "value": rng.uniform(0.7, 0.88)}
            st["heat_loss_W"] = rng.uniform(0.0, 2000.0)
            st["cooler"] = {"outlet_temperature_K": doc["site"]["ambient_temperature_K"] + rng.uniform(3.0, 15.0),
                            "pressure_drop_Pa": rng.uniform(0.0, 20000.0)}
            if limit is not None:
                st["max_discharge_temperature_K"] = limit
        out[f"random_{k:02d}_{model}_{n}"] = doc
    return out


def split_figures(split) -> dict:
    """What a split reports: ratios, feasibility, binding limits and the full solve's main figures."""
    r = split.result
    out = {"pressure_ratios": split.pressure_ratios, "feasible": split.feasible,
           "binding_limits": [b.to_dict() for b in split.binding_limits]}
    if r is not None:
        out.update({"driver_power_W": r.driver_power_W, "shaft_power_W": r.shaft_power_W,
                    "discharge_temperatures_K": [s.outlet.T for s in r.stages],
                    "heat_rejected_W": r.heat_rejected_W, "exergy_destroyed_W": r.exergy_destroyed_W})
    return out


def baseline() -> dict:
    from stagewright.core.study import compare_stagings, optimal_split
    out = {"comparisons": {}, "splits": {}}
    for name, (doc, most) in comparisons().items():
        rows = compare_stagings(doc, most).rows()
        out["comparisons"][name] = [{k: v for k, v in row.items() if k not in PATH_KEYS} for row in rows]
    for name, doc in {**splits(), **random_trains()}.items():
        out["splits"][name] = split_figures(optimal_split(doc, strict=False))
    return out


if __name__ == "__main__":  # never on import
    text = json.dumps(baseline(), indent=1, sort_keys=True) + "\n"
    if "--write" in sys.argv:
        OUT.write_text(text, encoding="utf-8")
    else:
        sys.stdout.write(text)
