"""Judging a port's per-case results at both levels, whatever ran them.

:func:`judge` takes the suite, per function the port's outputs and statuses (from the
cffi runner of ``airdata port check``, or parsed from results a target streamed back),
the precision and optionally a :class:`~airdata.portcheck.requirements.Requirements`,
and returns a :class:`Report` holding, per function:

- the reference-equivalent verdict (``|got - expected| <= k eps scale``, status exact,
  :func:`airdata.portcheck.compare.judge`);
- the requirements verdict: inside the function's envelope every output with a
  requirement must satisfy ``|got - expected| <= rel |expected| + abs`` and the status
  must equal the expected status (binary32: the ``binary32_check`` skip/lenient rules
  apply to statuses and NaN as at the reference level); cases outside the envelope are
  counted as *outside the envelope*, not judged;
- per output the worst error in engineering units, the margin (error / allowed), the
  worst ratio to the roundoff bound, where it occurs, and a breakdown by band
  (pressure altitude, Mach, speed, tag).

An engineering and verification aid, not certified flight software.
"""

from __future__ import annotations

from collections.abc import Mapping
from dataclasses import dataclass, field
from typing import Any

import numpy as np
from numpy.typing import NDArray

from .. import units as _units
from .bands import DISPLAY_UNIT, SPECS, Band, axes, bands, display, eng_inputs, json_float, to_unit
from .compare import CheckResult, status_name
from .compare import judge as judge_reference
from .requirements import FunctionRequirement, Requirements
from .suite import B32_CODES, FunctionCases, LoadedSuite

__all__ = ["Band", "OutputVerdict", "CaseRecord", "FunctionVerdict", "Report", "judge",
           "DISPLAY_UNIT", "LEVEL_REFERENCE", "LEVEL_REQUIREMENTS", "PRECISION_LABEL"]

LEVEL_REFERENCE = "reference-equivalent"
LEVEL_REQUIREMENTS = "requirements"
PRECISION_LABEL = {"double": "binary64", "single": "binary32"}

@dataclass
class OutputVerdict:
    """One output of one function at the level applied.

    ``worst_error`` and ``allowed`` are in ``unit`` (the engineering unit);
    ``worst_error_req`` in the requirement's unit.  ``margin`` is the largest
    error / allowed over the judged cases (at the reference level: the bound ratio).
    """

    output: str
    si_unit: str
    unit: str
    requirement: str | None
    req_unit: str | None
    judged: int = 0
    failed: int = 0
    worst_error: float = 0.0
    worst_error_req: float | None = None
    worst_case: str | None = None
    worst_where: dict[str, str] = field(default_factory=dict)
    margin: float = 0.0
    margin_case: str | None = None
    margin_where: dict[str, str] = field(default_factory=dict)
    allowed_at_margin: float | None = None
    bound_ratio: float = 0.0
    bands: list[Band] = field(default_factory=list)
    #: per judged case (for plots): position index, error (unit), allowed (unit)
    series: dict[str, Any] = field(default_factory=dict, repr=False)

    @property
    def ok(self) -> bool:
        """No judged case failed."""
        return self.failed == 0

    def as_dict(self) -> dict[str, Any]:
        """JSON-ready form."""
        return {"output": self.output, "si_unit": self.si_unit, "unit": self.unit,
                "requirement": self.requirement, "requirement_unit": self.req_unit,
                "judged": self.judged, "failed": self.failed,
                "worst_error": json_float(self.worst_error),
                "worst_error_in_requirement_unit": None if self.worst_error_req is None
                else json_float(self.worst_error_req),
                "worst_case": self.worst_case, "worst_where": self.worst_where,
                "margin": json_float(self.margin), "margin_case": self.margin_case,
                "margin_where": self.margin_where,
                "allowed_at_margin_case": None if self.allowed_at_margin is None
                else json_float(self.allowed_at_margin),
                "bound_ratio": json_float(self.bound_ratio),
                "bands": [b.as_dict() for b in self.bands]}


@dataclass
class CaseRecord:
    """A failing case at the level applied, with every value (decimal and hex)."""

    case_id: str
    inputs: dict[str, float]
    where: dict[str, str]
    reasons: list[str]
    outputs: list[dict[str, Any]]
    status: int
    expected_status: int

    def as_dict(self) -> dict[str, Any]:
        """JSON-ready form."""
        return {"id": self.case_id,
                "inputs": {k: _num(v) for k, v in self.inputs.items()},
                "where": self.where, "reasons": self.reasons,
                "status": status_name(self.status),
                "expected_status": status_name(self.expected_status),
                "outputs": self.outputs}


@dataclass
class FunctionVerdict:
    """Both levels' verdicts of one function in one precision."""

    function: str
    c_function: str
    equations: list[str]
    implemented: bool
    cases: int
    reference: CheckResult | None
    requirement: FunctionRequirement | None
    level: str
    verdict: str = "pass"
    reference_verdict: str = "pass"
    requirements_verdict: str = "not applied"
    in_envelope: int = 0
    outside_envelope: int = 0
    skipped: int = 0
    failed: int = 0
    status_mismatches: int = 0
    nan_mismatches: int = 0
    outputs: list[OutputVerdict] = field(default_factory=list)
    failures: list[CaseRecord] = field(default_factory=list)

    @property
    def ok(self) -> bool:
        """The level applied passed (or the function is not implemented)."""
        return self.verdict != "fail"

    def as_dict(self) -> dict[str, Any]:
        """JSON-ready form (every failing case)."""
        req = self.requirement
        return {
            "function": self.function, "c_function": self.c_function,
            "equations": self.equations, "implemented": self.implemented,
            "cases": self.cases, "level": self.level, "verdict": self.verdict,
            "reference_verdict": self.reference_verdict,
            "requirements_verdict": self.requirements_verdict,
            "envelope": None if req is None else {
                k: {"low": lo, "high": hi, "text": list(req.envelope_text[k])}
                for k, (lo, hi) in req.envelope.items()},
            "in_envelope": self.in_envelope, "outside_envelope": self.outside_envelope,
            "skipped": self.skipped, "failed": self.failed,
            "status_mismatches": self.status_mismatches,
            "nan_mismatches": self.nan_mismatches,
            "reference": None if self.reference is None else {
                "passed": self.reference.passed, "failed": self.reference.failed,
                "worst_bound_ratio": json_float(self.reference.worst),
                "worst_case": self.reference.worst_id},
            "outputs": [o.as_dict() for o in self.outputs],
            "failures": [f.as_dict() for f in self.failures],
        }


@dataclass
class Report:
    """The outcome of a check in one precision, at the level applied and the other."""

    suite: LoadedSuite
    precision: str
    requirements: Requirements | None
    functions: list[FunctionVerdict]

    @property
    def level(self) -> str:
        """The level that decides the verdict."""
        return LEVEL_REQUIREMENTS if self.requirements is not None else LEVEL_REFERENCE

    @property
    def ok(self) -> bool:
        """Every implemented function passed at the level applied."""
        return all(f.ok for f in self.functions)


def _num(v: float) -> dict[str, Any]:
    """A value in decimal and C99 hex (both exact for binary64)."""
    return {"decimal": repr(float(v)), "hex": float(v).hex()}


def _judge_function(suite: LoadedSuite, fc: FunctionCases, precision: str,
                    y: NDArray[np.float64], st: NDArray[np.int64],
                    req: Requirements | None) -> FunctionVerdict:
    spec = SPECS.get(fc.name)
    si_units = dict(spec.outputs) if spec else {o: "" for o in fc.outputs}
    single = precision == "single"
    eps = suite.eps_binary32 if single else suite.eps_binary64
    ref = judge_reference(fc, precision, y, st, suite.k, eps, keep_failures=fc.count)
    freq = req.functions.get(fc.name) if req is not None else None
    level = LEVEL_REQUIREMENTS if req is not None else LEVEL_REFERENCE
    fv = FunctionVerdict(fc.name, fc.c_function, list(spec.equations) if spec else [], True,
                         fc.count, ref, freq, level)
    fv.reference_verdict = "pass" if ref.ok else "fail"
    n = fc.count
    skip = (fc.b32 == B32_CODES["skip"]) if single else np.zeros(n, bool)
    lenient = ((fc.b32 == B32_CODES["lenient"]) & ~skip) if single else np.zeros(n, bool)
    fv.skipped = int(skip.sum())
    want = fc.expected
    nan_w, nan_g = np.isnan(want), np.isnan(y)
    both = ~nan_w & ~nan_g
    with np.errstate(invalid="ignore"):
        err_si = np.where(both, np.abs(y - want), 0.0)
        bound = suite.k * eps * np.where(both, fc.scale, 0.0)
        bratio = np.where(err_si == 0.0, 0.0,
                          np.divide(err_si, bound, out=np.full_like(err_si, np.inf),
                                    where=bound > 0))
    bratio = np.where(np.isnan(bratio), np.inf, bratio)
    if req is not None and freq is None:
        fv.requirements_verdict = "no requirement"
        fv.verdict = "no requirement"
        inside = np.zeros(n, bool)
    else:
        inside = ~skip
        if freq is not None:
            names = [nm for nm, _ in fc.inputs]
            for arg, (lo, hi) in freq.envelope.items():
                v = fc.x[:, names.index(arg)]
                with np.errstate(invalid="ignore"):
                    inside &= (v >= lo) & (v <= hi)
        fv.in_envelope = int(inside.sum())
        fv.outside_envelope = int((~skip & ~inside).sum())
    status_bad = inside & (st != fc.status) & ~lenient
    nan_bad = (nan_w != nan_g) & ~lenient[:, None] & inside[:, None]
    value_bad = np.zeros_like(both)
    ratio = np.zeros_like(err_si)
    judged_out = np.zeros_like(both)
    tols = []
    for j, out in enumerate(fc.outputs):
        si = si_units.get(out, "")
        tol = freq.errors.get(out) if freq is not None else None
        tols.append(tol)
        if req is None:
            judged_out[:, j] = both[:, j] & ~skip
            ratio[:, j] = bratio[:, j]
            value_bad[:, j] = judged_out[:, j] & (bratio[:, j] > 1.0)
        elif tol is not None:
            judged_out[:, j] = both[:, j] & inside
            allowed = tol.allowed(want[:, j])
            with np.errstate(invalid="ignore", divide="ignore"):
                r = np.where(err_si[:, j] == 0.0, 0.0, err_si[:, j] / allowed)
            ratio[:, j] = np.where(judged_out[:, j], r, 0.0)
            value_bad[:, j] = judged_out[:, j] & (r > 1.0)
        else:
            nan_bad[:, j] = False
        del si
    if req is None:
        status_bad = ~skip & (st != fc.status) & ~lenient
        nan_bad = (nan_w != nan_g) & ~lenient[:, None] & ~skip[:, None]
        fv.in_envelope = int((~skip).sum())
        inside = ~skip
    case_bad = status_bad | nan_bad.any(axis=1) | value_bad.any(axis=1)
    if fv.verdict != "no requirement":
        fv.failed = int(case_bad.sum())
        fv.status_mismatches = int(status_bad.sum())
        fv.nan_mismatches = int(nan_bad.any(axis=1).sum())
        fv.verdict = "pass" if fv.failed == 0 else "fail"
        if req is not None:
            fv.requirements_verdict = fv.verdict
    for j, out in enumerate(fc.outputs):
        si = si_units.get(out, "")
        u = display(si)
        tol = tols[j]
        ov = OutputVerdict(out, si, u, tol.text if tol else None, tol.unit if tol else None)
        jm = judged_out[:, j]
        ov.judged = int(jm.sum())
        ov.failed = int((jm & (value_bad[:, j] | nan_bad[:, j])).sum()) + \
            int((nan_bad[:, j] & ~jm).sum())
        e_u = np.array([to_unit(v, si, u, difference=True) for v in err_si[:, j]]) \
            if si in _units.UNITS and u != si else err_si[:, j]
        rb = np.where(both[:, j] & inside, bratio[:, j], 0.0)
        ov.bound_ratio = float(rb.max()) if rb.size else 0.0
        if ov.judged:
            em = np.where(jm, err_si[:, j], -1.0)
            i = int(np.argmax(em))
            ov.worst_error = float(e_u[i])
            ov.worst_case = fc.ids[i]
            ov.worst_where = eng_inputs(fc, i)
            if tol is not None:
                ov.worst_error_req = to_unit(err_si[i, j], si, tol.unit, difference=True)
            rm = np.where(jm, ratio[:, j], -1.0)
            k = int(np.argmax(rm))
            ov.margin = float(ratio[k, j])
            ov.margin_case = fc.ids[k]
            ov.margin_where = eng_inputs(fc, k)
            if tol is not None:
                ov.allowed_at_margin = to_unit(float(tol.allowed(want[k:k + 1, j])[0]), si,
                                               tol.unit, difference=True)
            ov.bands = bands(fc, jm, jm & value_bad[:, j], e_u, ratio[:, j])
            idx = np.flatnonzero(jm)
            allowed_u = None
            if tol is not None:
                allowed_si = tol.allowed(want[idx, j])
                allowed_u = [to_unit(a, si, u, difference=True) for a in allowed_si]
            ov.series = {"index": idx, "error": e_u[idx], "allowed": allowed_u,
                         "axes": [(nm, vals[idx], unit) for nm, vals, _, unit in axes(fc)]}
        fv.outputs.append(ov)
    for i in np.flatnonzero(case_bad):
        reasons = []
        if status_bad[i]:
            reasons.append(f"status {status_name(st[i])}, expected {status_name(fc.status[i])}")
        outs = []
        for j, out in enumerate(fc.outputs):
            si = si_units.get(out, "")
            u = display(si)
            rec = {"output": out, "got": _num(y[i, j]), "expected": _num(want[i, j]),
                   "error": json_float(to_unit(err_si[i, j], si, u, difference=True)),
                   "unit": u, "ratio": json_float(float(ratio[i, j])),
                   "bound_ratio": json_float(float(bratio[i, j]))}
            outs.append(rec)
            if nan_bad[i, j]:
                reasons.append(f"{out}: got {float(y[i, j])!r} ({float(y[i, j]).hex()}), "
                               f"expected {float(want[i, j])!r} ({float(want[i, j]).hex()})")
            elif value_bad[i, j]:
                what = (f"{ratio[i, j]:.3g} of the allowed {tols[j].text}" if tols[j]
                        else f"{ratio[i, j]:.3g} of the bound")
                reasons.append(
                    f"{out}: got {float(y[i, j])!r} ({float(y[i, j]).hex()}), expected "
                    f"{float(want[i, j])!r} ({float(want[i, j]).hex()}), error "
                    f"{rec['error']:.4g} {u} ({what})")
        fv.failures.append(CaseRecord(fc.ids[i], {nm: float(fc.x[i, jj]) for jj, (nm, _)
                                                  in enumerate(fc.inputs)},
                                      eng_inputs(fc, int(i)), reasons, outs, int(st[i]),
                                      int(fc.status[i])))
    return fv


def judge(suite: LoadedSuite,
          results: Mapping[str, tuple[NDArray[np.float64], NDArray[np.int64]] | None],
          precision: str, requirements: Requirements | None = None) -> Report:
    """Judge a port's per-case results at the reference-equivalent and requirements levels.

    Parameters
    ----------
    suite : LoadedSuite
        The suite the results belong to (:func:`airdata.portcheck.suite.load_cases`).
    results : mapping
        Function name -> ``(y, status)`` with ``y`` of shape (n_cases, n_outputs) in SI
        units in the suite's case order and ``status`` of shape (n_cases,); ``None``
        (or a function of the suite absent from the mapping) means *not implemented*.
    precision : str
        ``"double"`` (binary64) or ``"single"`` (binary32: ``binary32_check`` applies).
    requirements : Requirements, optional
        The accuracy requirements; without them the reference-equivalent level decides.

    Returns
    -------
    Report
        Per function both verdicts, engineering-unit errors, margins and bands.

    Raises
    ------
    ValueError
        Unknown precision, a result of the wrong shape, or a requirement for a function
        the suite does not hold.
    """
    if precision not in PRECISION_LABEL:
        raise ValueError(f"precision {precision!r}: choose 'double' or 'single'")
    unknown = [n for n in results if n not in suite.functions]
    if unknown:
        raise ValueError(f"results for function(s) not in the suite: {', '.join(unknown)}")
    out = []
    for name, fc in suite.functions.items():
        r = results.get(name)
        if r is None:
            spec = SPECS.get(name)
            fv = FunctionVerdict(name, fc.c_function, list(spec.equations) if spec else [],
                                 False, fc.count, None,
                                 requirements.functions.get(name) if requirements else None,
                                 LEVEL_REQUIREMENTS if requirements else LEVEL_REFERENCE,
                                 "not implemented", "not implemented",
                                 "not implemented" if requirements else "not applied")
            out.append(fv)
            continue
        y = np.asarray(r[0], dtype=np.float64)
        st = np.asarray(r[1], dtype=np.int64)
        if y.shape != (fc.count, len(fc.outputs)) or st.shape != (fc.count,):
            raise ValueError(f"{name}: results of shape {y.shape} and {st.shape}; the suite "
                             f"has {fc.count} cases of {len(fc.outputs)} output(s)")
        out.append(_judge_function(suite, fc, precision, y, st, requirements))
    return Report(suite, precision, requirements, out)
