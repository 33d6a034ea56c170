"""Time a 4-stage solve, dry against moist intake air (RH 0.6), for each property model.

    python bench/moist_solve.py
"""
import statistics
import sys
import time
from pathlib import Path

sys.path.insert(0, str(Path(__file__).resolve().parent.parent))
import stagewright.core  # noqa: E402


def doc(model, kind, rh):
    return {"site": {"ambient_temperature_K": 298.15, "barometric_pressure_Pa": 101325.0, "relative_humidity": rh},
            "fluid": {"model": model}, "flow": {"kind": "mass", "value": 1.0}, "discharge_pressure_Pa": 40e5,
            "stages": [{"efficiency": {"kind": kind, "value": 0.8 if kind == "isentropic" else 0.85},
                        "cooler": {"outlet_temperature_K": 303.15}} for _ in range(4)]}


def median_ms(d, n=15):
    stagewright.core.solve(d)
    times = []
    for _ in range(n):
        t = time.perf_counter()
        stagewright.core.solve(d)
        times.append(time.perf_counter() - t)
    return 1e3 * statistics.median(times)


if __name__ == "__main__":
    for model in ("real_gas", "ideal_gas", "constant_cp"):
        for kind in ("isentropic", "polytropic"):
            dry, wet = median_ms(doc(model, kind, 0.0)), median_ms(doc(model, kind, 0.6))
            print(f"{model:12s} {kind:11s} dry {dry:7.2f} ms  moist {wet:7.2f} ms  ratio {wet / dry:5.2f}")
