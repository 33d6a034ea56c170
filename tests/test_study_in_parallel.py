"""The staging comparison with its options in worker processes: the same answers as in one process.

No outside reference is needed here: the check is that splitting the work changes nothing (the
physics of each option is checked in test_study_*.py against published cases).
"""
import threading

import pytest

from stagewright.core.study import StudyCancelled, compare_stagings
from stagewright.core.warm_pool import is_warm, warm_up_pool


def _doc():
    """An invented three-stage moist real-gas train (a 12 bar(a) plant-air duty)."""
    return {"site": {"ambient_temperature_K": 300.15, "barometric_pressure_Pa": 99_000.0, "relative_humidity": 0.55},
            "fluid": {"model": "real_gas"}, "flow": {"kind": "free_air_delivery", "value": 0.3},
            "discharge_pressure_Pa": 12e5,
            "stages": [{"efficiency": {"kind": "isentropic", "value": 0.79},
                        "max_discharge_temperature_K": 470.0,
                        "cooler": {"approach_K": 9.0, "coolant_inlet_temperature_K": 295.15,
                                   "pressure_drop_Pa": 12_000.0}}]}


def test_options_side_by_side_equal_the_options_one_after_another():
    one = compare_stagings(_doc(), max_stages=4)
    two = compare_stagings(_doc(), max_stages=4, processes=2)
    assert [o.stages for o in two.options] == [1, 2, 3, 4]
    assert two.rows() == one.rows()
    assert [o.split.to_dict() for o in two.options] == [o.split.to_dict() for o in one.options]


def test_warming_the_pool_starts_its_workers():
    assert warm_up_pool(2) >= 1
    assert is_warm()


def test_cancel_while_options_run_side_by_side_keeps_the_finished_ones():
    stop = threading.Event()
    seen = []

    def progress(fraction, message):
        seen.append(message)
        if "optimised" in message:
            stop.set()  # cancel once the first option is back
    with pytest.raises(StudyCancelled) as caught:
        compare_stagings(_doc(), max_stages=6, processes=2, progress=progress, cancel=stop)
    partial = caught.value.partial
    assert 1 <= len(partial) < 6
    assert [o.stages for o in partial] == sorted(o.stages for o in partial)
    assert "of 6 options" in str(caught.value)
