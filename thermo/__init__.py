"""Stagewright calculation core: compression trains with first- and second-law balances.

Pure Python on numpy, scipy and CoolProp; it never imports Qt.
"""
from stagewright.core.errors import InputError, PropertyRangeError, SecondLawViolation, StagewrightError
from stagewright.core.solve import solve

__all__ = ["solve", "StagewrightError", "InputError", "SecondLawViolation", "PropertyRangeError"]
__version__ = "0.1.0"
