"""The whole package at part load: capacity control, the motor and drive, auxiliaries.

The train solve gives the compressor's full-load shaft power and free air delivery at the
conditions solved. This package turns them into the package's input power at any demand:
a capacity control (:mod:`.controls`) splits the time into running states, the motor and
the variable-speed drive (:mod:`.motor`, :mod:`.drive`) convert each state's shaft power
into electrical input, and the auxiliaries (:mod:`.auxiliaries`) add fans, the coolant
pump and named fixed loads (:mod:`.package`). :mod:`.data_sheet` lays the figures out at
the ISO 1217 reference conditions and at the site; :mod:`.annual` totals a load profile.
"""
