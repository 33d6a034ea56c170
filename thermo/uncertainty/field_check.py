"""The uncertainty of a field check, all of it, for one project document.

:func:`field_check_uncertainty` reads the measured inputs' uncertainties from the project's
``field_check`` section, propagates them through the solve to first order (the GUM,
:mod:`stagewright.core.uncertainty.linear`) and, when asked, by Monte Carlo (JCGM 101,
:mod:`stagewright.core.uncertainty.monte_carlo`), names the largest contributors, and judges the
guaranteed figures (:mod:`stagewright.core.uncertainty.verdict`).
"""
from __future__ import annotations

__all__ = ["FieldCheckUncertainty", "field_check_uncertainty", "has_field_check", "contributor_sentence"]

import math
from dataclasses import dataclass, field

import numpy as np

from stagewright.core.project.validation import normalise
from stagewright.core.uncertainty.presence import has_field_check
from stagewright.core.uncertainty.figures import ResultFigure, result_figures
from stagewright.core.uncertainty.inputs import MeasuredInput, measured_inputs
from stagewright.core.uncertainty.linear import COVERAGE_FACTOR, LinearPropagation, propagate_linear
from stagewright.core.uncertainty.measurement_model import MeasurementModel
from stagewright.core.uncertainty.monte_carlo import MonteCarloCancelled, MonteCarloResult, propagate_monte_carlo
from stagewright.core.uncertainty.verdict import DECISION_RULE, ISO1217_SOURCE, Verdict, judge


def contributor_sentence(share: float, figure_label: str, input_label: str) -> str:
    """The sentence naming one contributor.

    Examples
    --------
    >>> contributor_sentence(0.604, "stage 2 isentropic efficiency", "stage 2 discharge temperature")
    '60 % of the variance of stage 2 isentropic efficiency comes from stage 2 discharge temperature'
    """
    return f"{share * 100:.0f} % of the variance of {figure_label} comes from {input_label}"


@dataclass
class FieldCheckUncertainty:
    """Inputs with their uncertainty, figures with theirs, contributors and verdicts (SI)."""

    inputs: list[MeasuredInput]
    figures: list[ResultFigure]
    linear: LinearPropagation
    monte_carlo: MonteCarloResult | None
    verdicts: list[Verdict]
    monte_carlo_verdicts: list[Verdict] = field(default_factory=list)
    monte_carlo_note: str = ""  #: why there is no Monte Carlo result (cancelled …), or ""

    def contributors(self, j: int, count: int = 3, floor: float = 0.05) -> list[tuple[MeasuredInput, float]]:
        """The inputs giving the largest shares of figure ``j``'s variance (at least ``floor``)."""
        shares = self.linear.variance_share[j]
        order = np.argsort(-shares)[:count]
        return [(self.inputs[i], float(shares[i])) for i in order if shares[i] >= floor]

    def sentences(self) -> list[str]:
        """One sentence per figure naming its largest contributor."""
        out = []
        for j, fig in enumerate(self.figures):
            top = self.contributors(j, 1)
            if top:
                out.append(contributor_sentence(top[0][1], fig.label, top[0][0].label))
        return out

    def agreement(self) -> list[bool | None]:
        """Per figure: the first-order u_c within three statistical standard errors (plus 1 %
        of u_c for the model's curvature) of the Monte Carlo standard deviation; None without
        a Monte Carlo result."""
        mc = self.monte_carlo
        if mc is None or mc.solved < 2:
            return [None] * len(self.figures)
        err = mc.standard_error_of_u()
        return [bool(abs(a - b) <= 3.0 * e + 0.01 * a) for a, b, e in
                zip(self.linear.standard_uncertainty, mc.standard_uncertainty, err)]

    def to_dict(self) -> dict:
        """Plain data (JSON-ready; SI, units in the key names of the results)."""
        lin, mc = self.linear, self.monte_carlo
        agree = self.agreement()
        figs = []
        for j, f in enumerate(self.figures):
            d = {"figure": f.name, "label": f.label, "quantity": f.quantity, "value": _num(lin.value[j]),
                 "standard_uncertainty": _num(lin.standard_uncertainty[j]),
                 "expanded_uncertainty": _num(lin.expanded_uncertainty[j]),
                 "contributors": [{"input": i.path, "label": i.label, "variance_share": s}
                                  for i, s in self.contributors(j)]}
            if mc is not None:
                d["monte_carlo"] = {"mean": _num(mc.mean[j]), "standard_uncertainty": _num(mc.standard_uncertainty[j]),
                                    "interval_low": _num(mc.low[j]), "interval_high": _num(mc.high[j]),
                                    "agrees_with_first_order": agree[j]}
            figs.append(d)
        return {
            "coverage_factor": COVERAGE_FACTOR,
            "method": "first order (JCGM 100:2008 §5.1), sensitivities by central differences of the solve "
                      "with step ±u(x_i); Monte Carlo check (JCGM 101:2008)",
            "inputs": [{"input": i.path, "label": i.label, "quantity": i.quantity, "value": i.value,
                        "standard_uncertainty": i.standard_uncertainty, "distribution": i.distribution,
                        "stated_as": i.stated_as, "half_width": i.half_width, "class_percent": i.class_percent,
                        "full_scale": i.full_scale, "rule": i.rule} for i in self.inputs],
            "figures": figs,
            "sentences": self.sentences(),
            "monte_carlo": None if mc is None else {
                "draws": mc.draws, "solved": mc.solved, "failed": mc.failed, "first_failure": mc.first_failure,
                "seed": mc.seed, "coverage_probability": mc.coverage_probability},
            "monte_carlo_note": self.monte_carlo_note,
            "decision_rule": DECISION_RULE,
            "iso1217_source": ISO1217_SOURCE,
            "verdicts": [v.to_dict() for v in self.verdicts],
            "monte_carlo_verdicts": [v.to_dict() for v in self.monte_carlo_verdicts],
        }


def _num(v: float) -> float | None:
    return float(v) if math.isfinite(v) else None


def field_check_uncertainty(doc: dict, *, monte_carlo: bool = True, draws: int | None = None,
                            seed: int | None = None, processes: int = 1, progress=None,
                            cancel=None) -> FieldCheckUncertainty:
    """Uncertainty and verdicts of the field check a project document describes.

    Parameters
    ----------
    doc : dict
        Project document with a ``field_check`` section (see ``docs/project-format.md``).
    monte_carlo : bool
        Also propagate by Monte Carlo (the check of the first-order result).
    draws, seed : int, optional
        Override ``field_check.monte_carlo_draws`` and ``field_check.seed``.
    processes : int
        Worker processes for the Monte Carlo draws.
    progress : callable, optional
        ``progress(fraction, message)`` as the work goes on.
    cancel : threading.Event or callable, optional
        When set, the Monte Carlo run stops; the answer then has the first-order result and
        ``monte_carlo_note`` says so. Before that, :class:`MonteCarloCancelled` is raised.

    Returns
    -------
    FieldCheckUncertainty

    Raises
    ------
    InputError
        If the document is invalid or names no measured input with an uncertainty.
    StagewrightError
        If the solve fails at the measured values.
    """
    from stagewright.core.errors import InputError
    norm = normalise(doc)
    inputs = measured_inputs(norm)
    if not inputs:
        raise InputError("field_check.uncertainties", [], "expected at least one measured input with its uncertainty")
    figures = result_figures(norm)
    model = MeasurementModel(norm, inputs, figures)
    is_cancelled = (cancel.is_set if hasattr(cancel, "is_set") else cancel) or (lambda: False)

    def stop_if_cancelled():
        if is_cancelled():
            raise MonteCarloCancelled(0, 0)
    if progress:
        progress(0.0, "first-order propagation")
    linear = propagate_linear(model, np.array([i.standard_uncertainty for i in inputs]), stop_if_cancelled)
    section = norm["field_check"]
    result = FieldCheckUncertainty(inputs, figures, linear, None, _verdicts(section, figures, linear.value,
                                                                            linear.expanded_uncertainty))
    if not monte_carlo:
        result.monte_carlo_note = "Monte Carlo not run"
        return result
    n = int(draws or section["monte_carlo_draws"])

    def report(done, total):
        if progress:
            progress(done / total, f"Monte Carlo: {done} of {total} draws")
    try:
        mc = propagate_monte_carlo(model, n, int(section["seed"] if seed is None else seed), processes=processes,
                                   progress=report, cancel=is_cancelled)
    except MonteCarloCancelled as exc:
        result.monte_carlo_note = str(exc)
        return result
    result.monte_carlo = mc
    mid, half = (mc.low + mc.high) / 2.0, (mc.high - mc.low) / 2.0
    result.monte_carlo_verdicts = _verdicts(section, figures, mid, half)
    return result


def _verdicts(section: dict, figures: list[ResultFigure], values, halves) -> list[Verdict]:
    index = {f.name: j for j, f in enumerate(figures)}
    fad = values[index["free_air_delivery_m3_s"]]
    out = []
    for g in section.get("guarantees", []):
        j = index[g["figure"]]
        if g["kind"] == "iso1217_annex_c" and g["figure"] != "free_air_delivery_m3_s":
            g = dict(g, flow_m3_s=fad)
        if math.isfinite(values[j]) and math.isfinite(halves[j]):
            out.append(judge(g["figure"], g, float(values[j]), float(halves[j])))
    return out
