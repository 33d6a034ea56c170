"""Heat-exchanger side of the coolers: coolant stream, ε-NTU, LMTD, sizing and rating."""
from .coolant import COOLANTS, CoolantSide, coolant_side, make_coolant
from .effectiveness import ARRANGEMENTS, effectiveness, max_effectiveness, ntu_from_effectiveness
from .lmtd import correction_factor, counterflow_lmtd, log_mean
from .rating import rate_exchanger
from .sizing import Exchanger, HotSide, Infeasible, Zone, size_exchanger

__all__ = ["COOLANTS", "CoolantSide", "coolant_side", "make_coolant", "ARRANGEMENTS", "effectiveness",
           "max_effectiveness", "ntu_from_effectiveness", "correction_factor", "counterflow_lmtd",
           "log_mean", "rate_exchanger", "Exchanger", "HotSide", "Infeasible", "Zone", "size_exchanger"]
