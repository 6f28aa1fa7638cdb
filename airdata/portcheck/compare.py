"""Judging a port's outputs against the vectors, function by function.

Rule (the suite's tolerance block; :mod:`airdata.vectors.scale`): an output is
accepted when ``|got - expected| <= k * eps * scale`` with eps = eps_binary64 or
eps_binary32 by the port's precision, and NaN is expected exactly where the expected
value is NaN; the status must equal the expected status.  Binary32 only: a case whose
``binary32_check`` is ``"skip"`` is not run, ``"lenient"`` does not compare the
status and accepts NaN on either side (two numbers must still agree within the bound).

The error of an output in units of its bound is ``|got - expected| / (k eps scale)``
(0 when both are equal, infinite when the bound is 0 and they differ); a NaN where a
number is expected (or the reverse) is a failure of its own kind, counted apart.

An engineering and verification aid, not certified flight software.
"""

from __future__ import annotations

from dataclasses import dataclass, field
from typing import Any

import numpy as np
from numpy.typing import NDArray

from .suite import B32_CODES, FunctionCases

__all__ = ["CaseFailure", "CheckResult", "judge", "status_name"]

STATUS_NAMES = {0: "OK", 1: "INVALID_INPUT", 2: "OUT_OF_RANGE", 3: "NO_CONVERGENCE",
                4: "IMPACT_PRESSURE_ZEROED"}


def status_name(code: int) -> str:
    """Name of a status code; the number itself when it is not one of ours (-1: a case
    with no good results line, :func:`airdata.portcheck.results.arrays`)."""
    return STATUS_NAMES.get(int(code), str(int(code)))


@dataclass
class CaseFailure:
    """One failing case: what went wrong, with the values."""

    case_id: str
    inputs: dict[str, float]
    reasons: list[str]

    def as_dict(self) -> dict[str, Any]:
        """JSON-ready form."""
        return {"id": self.case_id, "inputs": _json_inputs(self.inputs),
                "reasons": self.reasons}


@dataclass
class CheckResult:
    """Outcome of one function in one precision."""

    function: str
    precision: str
    cases: int
    skipped: int = 0
    lenient: int = 0
    passed: int = 0
    failed: int = 0
    status_mismatches: int = 0
    nan_mismatches: int = 0
    value_failures: int = 0
    worst: float = 0.0
    worst_id: str | None = None
    worst_output: str | None = None
    worst_inputs: dict[str, float] = field(default_factory=dict)
    failures: list[CaseFailure] = field(default_factory=list)

    @property
    def ok(self) -> bool:
        """True when no case failed."""
        return self.failed == 0

    def as_dict(self, max_failures: int = 50) -> dict[str, Any]:
        """JSON-ready form (at most ``max_failures`` failing cases listed)."""
        return {
            "function": self.function, "precision": self.precision, "cases": self.cases,
            "checked": self.cases - self.skipped, "passed": self.passed,
            "failed": self.failed, "skipped": self.skipped, "lenient": self.lenient,
            "status_mismatches": self.status_mismatches,
            "nan_mismatches": self.nan_mismatches, "value_failures": self.value_failures,
            "worst_in_bounds": _json_float(self.worst),
            "worst_case": None if self.worst_id is None else {
                "id": self.worst_id, "output": self.worst_output,
                "inputs": _json_inputs(self.worst_inputs)},
            "failures": [f.as_dict() for f in self.failures[:max_failures]],
            "failures_listed": min(len(self.failures), max_failures),
        }


def _json_float(v: float) -> float | str:
    if np.isnan(v):
        return "nan"
    if np.isinf(v):
        return "inf" if v > 0 else "-inf"
    return float(v)


def _json_inputs(x: dict[str, float]) -> dict[str, float | str]:
    return {k: _json_float(v) for k, v in x.items()}


def _inputs(fc: FunctionCases, i: int) -> dict[str, float]:
    return {name: float(fc.x[i, j]) for j, (name, _) in enumerate(fc.inputs)}


def judge(fc: FunctionCases, precision: str, y: NDArray[np.float64], st: NDArray[np.int64],
          k: float, eps: float, keep_failures: int = 200) -> CheckResult:
    """Compare a port's outputs ``y`` and statuses ``st`` with the cases of ``fc``.

    Parameters
    ----------
    fc : FunctionCases
        The cases.
    precision : str
        ``"double"`` (every case compared fully) or ``"single"`` (``binary32_check``
        applies).
    y, st : ndarray
        The port's outputs, shape (n, n_outputs), and statuses, shape (n,).
    k, eps : float
        Multiplier and machine epsilon of the bound ``k * eps * scale``.
    keep_failures : int
        At most this many failing cases are kept with their details.

    Returns
    -------
    CheckResult
    """
    single = precision == "single"
    res = CheckResult(fc.name, precision, fc.count)
    skip = (fc.b32 == B32_CODES["skip"]) if single else np.zeros(fc.count, bool)
    lenient = (fc.b32 == B32_CODES["lenient"]) & ~skip if single else np.zeros(fc.count, bool)
    res.skipped = int(skip.sum())
    res.lenient = int(lenient.sum())
    want, scale = fc.expected, fc.scale
    nan_w, nan_g = np.isnan(want), np.isnan(y)
    both = ~nan_w & ~nan_g
    bound = k * eps * np.where(both, scale, 0.0)
    with np.errstate(invalid="ignore"):
        err = np.where(both, np.abs(y - want), 0.0)
        ratio = np.where(err == 0.0, 0.0,
                         np.divide(err, bound, out=np.full_like(err, np.inf), where=bound > 0))
    ratio = np.where(np.isnan(ratio), np.inf, ratio)  # scale NaN with numbers: unjudgeable
    value_bad = both & (ratio > 1.0)
    nan_bad = (nan_w != nan_g) & ~lenient[:, None]
    status_bad = (st != fc.status) & ~lenient
    case_value_bad = value_bad.any(axis=1) & ~skip
    case_nan_bad = nan_bad.any(axis=1) & ~skip
    case_status_bad = status_bad & ~skip
    bad = case_value_bad | case_nan_bad | case_status_bad
    res.status_mismatches = int(case_status_bad.sum())
    res.nan_mismatches = int(case_nan_bad.sum())
    res.value_failures = int(case_value_bad.sum())
    res.failed = int(bad.sum())
    res.passed = fc.count - res.skipped - res.failed
    judged = np.where(skip[:, None], -1.0, ratio)
    if judged.size and np.nanmax(judged) > 0.0:
        i, j = np.unravel_index(int(np.argmax(judged)), judged.shape)
        res.worst = float(judged[i, j])
        res.worst_id = fc.ids[i]
        res.worst_output = fc.outputs[j]
        res.worst_inputs = _inputs(fc, int(i))
    for i in np.flatnonzero(bad)[:keep_failures]:
        reasons = []
        if case_status_bad[i]:
            reasons.append(f"status {status_name(st[i])}, expected {status_name(fc.status[i])}")
        for j, out in enumerate(fc.outputs):
            if nan_bad[i, j]:
                reasons.append(f"{out}: got {float(y[i, j])!r}, expected {float(want[i, j])!r}")
            elif value_bad[i, j]:
                reasons.append(f"{out}: got {float(y[i, j])!r}, expected {float(want[i, j])!r} "
                               f"({ratio[i, j]:.3g} of the bound)")
        res.failures.append(CaseFailure(fc.ids[i], _inputs(fc, int(i)), reasons))
    return res

