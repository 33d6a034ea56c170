"""Heat-exchanger side of the coolers: coolant stream, ε-NTU, LMTD, sizing and rating (air_table.py: the
air coolant's RP-1485 properties tabulated for the fast property path)."""
from stagewright.core.exchanger.coolant import COOLANTS, CoolantSide, coolant_side, make_coolant
from stagewright.core.exchanger.effectiveness import ARRANGEMENTS, effectiveness, max_effectiveness, ntu_from_effectiveness
from stagewright.core.exchanger.lmtd import correction_factor, counterflow_lmtd, log_mean
from stagewright.core.exchanger.rating import RatingStart, rate_exchanger
from stagewright.core.exchanger.sizing import Exchanger, HotSide, Infeasible, Zone, size_exchanger

__all__ = ["COOLANTS", "CoolantSide", "coolant_side", "make_coolant", "ARRANGEMENTS", "effectiveness",
           "max_effectiveness", "ntu_from_effectiveness", "correction_factor", "counterflow_lmtd",
           "log_mean", "rate_exchanger", "RatingStart", "Exchanger", "HotSide", "Infeasible", "Zone", "size_exchanger"]
