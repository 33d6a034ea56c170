"""Uncertainty of a field check: measured inputs with their uncertainty, results with theirs.

A field check finds a running machine's flow and stage efficiencies from measured pressures,
temperatures and power. This package states how uncertain those results are and whether
they meet guaranteed figures:

- :mod:`~stagewright.core.uncertainty.inputs`: which inputs can carry an uncertainty, and the rules
  that turn an accuracy class or limits into a standard uncertainty (JCGM 100:2008 §4.3.7);
- :mod:`~stagewright.core.uncertainty.measurement_model`: the solve as a measurement model, inputs to
  result figures (lean solve on the fast property path);
- :mod:`~stagewright.core.uncertainty.linear`: first-order propagation, sensitivity coefficients by
  central differences of the solve (JCGM 100:2008 §5.1);
- :mod:`~stagewright.core.uncertainty.monte_carlo`: propagation of distributions (JCGM 101:2008);
- :mod:`~stagewright.core.uncertainty.verdict`: guaranteed figures, tolerances and the decision rule;
- :mod:`~stagewright.core.uncertainty.field_check`: all of it for one project document
  (:func:`~stagewright.core.uncertainty.field_check.field_check_uncertainty`).
"""
# Nothing is imported here: stagewright.core.project.validation imports .inputs (field_check_problems),
# and .field_check imports validation, so importing the package must not import both.
__all__: list = []
