"""The text table and the JSON report of a port check.

An engineering and verification aid, not certified flight software.
"""

from __future__ import annotations

import math
from collections.abc import Sequence
from typing import Any

from .. import __version__
from .compare import CheckResult
from .suite import LoadedSuite

__all__ = ["render_text", "report_dict", "PRECISION_LABEL"]

PRECISION_LABEL = {"double": "binary64", "single": "binary32"}


def _g(v: float) -> str:
    return f"{v:.3g}"


def _inputs_text(x: dict[str, float]) -> str:
    return " ".join(f"{k}={v!r}" for k, v in x.items())


def render_text(suite: LoadedSuite, label: str, results: dict[str, list[CheckResult]],
                max_listed: int = 5) -> str:
    """The per-function table of every precision, failing cases, and a verdict line."""
    lines = [f"airdata port check - suite {suite.suite_version} (profile {suite.profile}), "
             f"port: {label}",
             f"accept |got - expected| <= {suite.k:g} * eps * scale; errors below are in "
             "units of that bound", ""]
    head = (f"{'function':<26} {'cases':>6} {'run':>6} {'pass':>6} {'fail':>5} "
            f"{'status':>6} {'nan':>4} {'worst':>8}  worst case (output) inputs")
    failing: list[str] = []
    for precision, rows in results.items():
        eps = suite.eps_binary32 if precision == "single" else suite.eps_binary64
        lines.append(f"[{PRECISION_LABEL[precision]}]  eps = 2^{math.frexp(eps)[1] - 1}")
        lines.append(head)
        lines.append("-" * len(head))
        tot = [0, 0, 0, 0, 0, 0]
        for r in rows:
            run = r.cases - r.skipped
            worst = (f"{r.worst_id} ({r.worst_output}) {_inputs_text(r.worst_inputs)}"
                     if r.worst_id else "-")
            flag = "" if r.ok else "  <- FAIL"
            lines.append(f"{r.function:<26} {r.cases:>6} {run:>6} {r.passed:>6} {r.failed:>5} "
                         f"{r.status_mismatches:>6} {r.nan_mismatches:>4} {_g(r.worst):>8}  "
                         f"{worst}{flag}")
            for i, v in enumerate((r.cases, run, r.passed, r.failed, r.status_mismatches,
                                   r.nan_mismatches)):
                tot[i] += v
            if not r.ok:
                failing.append(f"{r.function} ({PRECISION_LABEL[precision]})")
        lines.append(f"{'total':<26} {tot[0]:>6} {tot[1]:>6} {tot[2]:>6} {tot[3]:>5} "
                     f"{tot[4]:>6} {tot[5]:>4}")
        lenient = sum(r.lenient for r in rows)
        if precision == "single":
            lines.append(f"(binary32: {tot[0] - tot[1]} cases skipped, {lenient} lenient, as "
                         "each case's binary32_check says)")
        lines.append("")
        for r in rows:
            if r.ok:
                continue
            lines.append(f"{r.function} [{PRECISION_LABEL[precision]}]: {r.failed} failing "
                         f"case(s), first {min(max_listed, len(r.failures))}:")
            for f in r.failures[:max_listed]:
                lines.append(f"  case {f.case_id}: {'; '.join(f.reasons)}")
                lines.append(f"    inputs: {_inputs_text(f.inputs)}")
            lines.append("")
    if failing:
        lines.append(f"FAIL: {len(failing)} function check(s) failed: {', '.join(failing)}")
    else:
        n = sum(len(rows) for rows in results.values())
        lines.append(f"PASS: all {n} function check(s) within the bound "
                     f"({', '.join(PRECISION_LABEL[p] for p in results)})")
    lines.append("An engineering and verification aid, not certified flight software.")
    return "\n".join(lines)


def report_dict(suite: LoadedSuite, label: str, sources: Sequence[str],
                results: dict[str, list[CheckResult]]) -> dict[str, Any]:
    """JSON-ready report of a check."""
    return {
        "tool": f"airdata {__version__} port check",
        "suite": {"path": str(suite.root), "suite_version": suite.suite_version,
                  "profile": suite.profile, "k": suite.k,
                  "eps_binary64": suite.eps_binary64.hex(),
                  "eps_binary32": suite.eps_binary32.hex()},
        "port": {"label": label, "sources": list(sources)},
        "passed": all(r.ok for rows in results.values() for r in rows),
        "precisions": {PRECISION_LABEL[p]: [r.as_dict() for r in rows]
                       for p, rows in results.items()},
        "caution": "An engineering and verification aid, not certified flight software.",
    }
