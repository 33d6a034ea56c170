"""Write the moist real-gas regression baseline of issue 19: full solves of random trains.

Run on main at 9e23dcd (from a `git archive` export of that commit, before the full solve's
speed work of issue 19 in this branch):

    cd /tmp/base && PYTHONPATH=$PWD python /path/to/tests/data/make_moist_baseline.py OUT.json

The trains are drawn from a fixed seed (:func:`cases`), so the test rebuilds the same documents
from this file's function and compares the reported figures (``to_dict()``, chart points
included) with the stored ones at 1e-8 relative (the issue's tolerance)."""
import copy
import json
import random
import sys


def _stage(rng, k, n, T0):
    kind = rng.choice(["isentropic", "isentropic", "polytropic", "discharge_temperature"])
    eff = ({"kind": kind, "value": rng.uniform(0.7, 0.92)} if kind != "discharge_temperature"
           else {"kind": kind, "value_K": 0.0})  # set from a first solve
    stage = {"efficiency": eff, "mechanical_efficiency": rng.uniform(0.95, 1.0)}
    if rng.random() < 0.5:
        stage["heat_loss_W"] = rng.uniform(0.0, 3000.0)
    if rng.random() < 0.25:
        stage["exit_velocity_m_s"] = rng.uniform(0.0, 40.0)
    if k < n - 1 or rng.random() < 0.8:
        if rng.random() < 0.5:
            cooler = {"outlet_temperature_K": T0 + rng.uniform(0.0, 20.0)}
        else:
            cooler = {"approach_K": rng.uniform(4.0, 12.0), "coolant_inlet_temperature_K": T0 + rng.uniform(-8.0, 5.0)}
        cooler["pressure_drop_Pa"] = rng.uniform(0.0, 15_000.0)
        cooler["separator_efficiency"] = 1.0 if rng.random() < 0.8 else rng.uniform(0.9, 1.0)
        stage["cooler"] = cooler
    return stage


def _bench_train():
    """The 4-stage train of ``bench/run.py`` (case four): water-cooled, 40 bar(a), RH 0.6."""
    return {"site": {"ambient_temperature_K": 303.15, "barometric_pressure_Pa": 100_000.0, "relative_humidity": 0.6},
            "fluid": {"model": "real_gas"}, "flow": {"kind": "free_air_delivery", "value": 0.5},
            "inlet_pressure_drop_Pa": 1500.0, "discharge_pressure_Pa": 40e5, "driver": {"efficiency": 0.96},
            "stages": [{"efficiency": {"kind": "isentropic", "value": 0.8}, "mechanical_efficiency": 0.985,
                        "heat_loss_W": 1000.0, "cooler": {"approach_K": 8.0, "coolant_inlet_temperature_K": 298.15,
                                                          "pressure_drop_Pa": 15_000.0}} for _ in range(4)]}


def cases(count=24, seed=19):
    """``count`` random moist real-gas trains (1 to 4 stages) from ``seed``."""
    rng = random.Random(seed)
    out = [_bench_train()]
    for _ in range(count):
        n = rng.randint(1, 4)
        T0 = rng.uniform(275.0, 315.0)
        P0 = rng.uniform(90_000.0, 102_000.0)
        site = {"ambient_temperature_K": T0, "barometric_pressure_Pa": P0}
        humidity = rng.choice(["relative_humidity", "relative_humidity", "dew_point_K", "humidity_ratio"])
        site[humidity] = {"relative_humidity": rng.uniform(0.05, 1.0), "dew_point_K": rng.uniform(273.15, T0 - 0.5),
                          "humidity_ratio": rng.uniform(1e-4, 0.004)}[humidity]
        r = rng.uniform(1.8, 4.0)
        flow = rng.choice([{"kind": "mass", "value": rng.uniform(0.1, 3.0)},
                           {"kind": "free_air_delivery", "value": rng.uniform(0.05, 1.0)}])
        doc = {"site": site, "fluid": {"model": "real_gas"}, "flow": flow,
               "inlet_pressure_drop_Pa": rng.uniform(0.0, 3000.0),
               "discharge_pressure_Pa": min(P0 * r ** n * 0.9, 9.0e6),
               "stages": [_stage(rng, k, n, T0) for k in range(n)]}
        out.append(doc)
    return out


def with_measured_temperatures(doc, solve):
    """The discharge-temperature stages measured 4 K above an η_s = 0.8 solve's discharge."""
    doc = copy.deepcopy(doc)
    probe = copy.deepcopy(doc)
    for s in probe["stages"]:
        if s["efficiency"]["kind"] == "discharge_temperature":
            s["efficiency"] = {"kind": "isentropic", "value": 0.8}
    res = solve(probe)
    for s, r in zip(doc["stages"], res.stages):
        if s["efficiency"]["kind"] == "discharge_temperature":
            s["efficiency"]["value_K"] = r.outlet.T + 4.0
    return doc


if __name__ == "__main__":  # never on import (pytest collects doctests from every module)
    import stagewright.core
    data = []
    for doc in cases():
        doc = with_measured_temperatures(doc, stagewright.core.solve)
        try:
            result = stagewright.core.solve(copy.deepcopy(doc)).to_dict()
        except stagewright.core.StagewrightError as exc:
            result = {"refused": str(exc)}
        data.append({"doc": doc, "result": result})
    with open(sys.argv[1], "w") as out:
        json.dump(data, out, indent=0, sort_keys=True, allow_nan=True)
    print(len(data), sum("refused" in d["result"] for d in data))
