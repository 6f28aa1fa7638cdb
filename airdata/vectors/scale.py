"""Tolerance basis of the vectors: the condition scale, and the binary32 check level.

Condition scale (docs/conventions.md, section 3), per case and output::

    scale = |y| + sum_i |df/dx_i * x_i|

The derivatives are one-sided differences in binary64 on the reference, taken on both
sides of x_i with relative steps 2**-20 and 2**-34, keeping the largest magnitude
among the sides whose point is valid.  At a range end this is the inward side only;
at a seam (a layer base, M = 1, a zeroed impact pressure), and within a step of one,
it is the larger of the two sides' slopes (conservative: a binary32 input may round
onto the other side); the small step catches slopes that change fast (square roots near
zero).  The rounding noise of a difference is at most about 2**-16 of the scale, and
the truncation error of the large step about 2**-20 relative, so 3 significant
digits, which is all that is stored, are right.  Inputs that are zero contribute
nothing (x_i = 0); integer flags have no derivative.  Where a derivative is infinite
(the Mach number of air_data at qc = 0, a square root at zero) the scale is the finite
slope of the small step: large, but not a principled bound.

Subnormal inputs: a relative step cannot move a number below 2**-1022 finely enough,
so its term comes from doubling it (exact): |log2(f(2x)/f(x)) f(x)|, exact for the power
laws that every tiny-input branch of the model is.  A nonzero expected output below the
normal binary64 range has a scale of at least 2**-1024 (``SUBNORMAL_SCALE_FLOOR``), so
that the binary64 bound is at least two units of the subnormal grid.

Acceptance bound of a port: ``|got - expected| <= K * eps * scale`` with eps = 2**-52
for a binary64 port and 2**-23 for a binary32 port; NaN is expected exactly where the
expected value is NaN (then the scale is NaN too).

Binary32 check level (``binary32_check``): a binary32 port receives the inputs rounded
to binary32 and compares them with its range ends rounded to binary32.  Each case says
how a binary32 check treats it:

``"skip"``
    An input or expected output is finite, nonzero and outside the normal binary32
    range (magnitude below 2**-126 or above the largest binary32): no binary32 result
    can be judged against a relative bound.  The case is skipped.
``"lenient"``
    The status may legitimately differ in binary32: the binary32-rounded input lands on
    the other side of a binary32-rounded range end of its own, or the reference status
    at the binary32-rounded inputs differs, or it differs when one of them is moved
    alone by a relative 2**-19 (16 ulp of binary32) up or down without crossing its own
    range end (a derived limit nearby); a zero input whose range straddles zero moves by
    2**-19 of the larger magnitude of its range ends.  Inputs that the binary32 range
    accepts but the binary64 range does not (rounded past an end) are evaluated on that
    end, as a binary32 port sees them.  The status is not compared, and NaN on either
    side is accepted; two numbers must still agree within the bound.
``"full"``
    Everything else: status and outputs are compared as for binary64.

A binary64 check ignores this field and compares every case fully.
"""

from __future__ import annotations

import numpy as np
from numpy.typing import NDArray

from .._inputs import Domain
from ..profiles import Profile
from ..status import Status
from .catalogue import FunctionSpec, evaluate

__all__ = ["K", "EPS_BINARY64", "EPS_BINARY32", "STEPS", "condition_scale",
           "round_scale", "binary32_check", "binary32_skip_status", "TOLERANCE_RULE",
           "BINARY32_RULE"]

F64 = NDArray[np.float64]

#: The one documented multiplier of the acceptance bound.
K = 8
EPS_BINARY64 = 2.0 ** -52
EPS_BINARY32 = 2.0 ** -23
#: Relative steps of the one-sided differences.
STEPS = (2.0 ** -20, 2.0 ** -34)
#: Relative move of each binary32-rounded input for the binary32 status rule.
BINARY32_MOVE = 2.0 ** -19
#: Smallest normal binary64 number: inputs below it get their derivative term by
#: doubling (``_subnormal_terms``).
NORMAL_MIN = 2.0 ** -1022
#: Least scale of a nonzero subnormal expected output: k * eps_binary64 * 2**-1024 is
#: two units of the subnormal grid (2**-1074), so a port that rounds the exact value
#: either way passes (a relative bound alone would be below one unit there).
SUBNORMAL_SCALE_FLOOR = 2.0 ** -1024
#: Normal binary32 range.
FLT_MIN = 2.0 ** -126
FLT_MAX = float(np.finfo(np.float32).max)

TOLERANCE_RULE = (
    "|got - expected| <= k * eps * scale, eps = eps_binary64 or eps_binary32 by the port's "
    "precision; scale = |y| + sum_i |df/dx_i * x_i| (3 significant digits); NaN expected "
    "exactly where expected is NaN; a nonzero subnormal expected value has scale >= 2**-1024"
)
BINARY32_RULE = (
    "binary32_check: 'skip' when an input or expected output is finite, nonzero and outside "
    "the normal binary32 range; 'lenient' (status not compared, NaN on either side accepted, "
    "numbers within the bound) when a binary32-rounded input crosses its own binary32-rounded "
    "range end, or the reference status changes at the binary32-rounded inputs (put back on "
    "a range end they were rounded past) or when one of them moves by a relative 2**-19 "
    "(2**-19 of its range for a zero in a range around zero) without crossing its own range "
    "end; else 'full'"
)


def _valid(status: NDArray[np.int8]) -> NDArray[np.bool_]:
    return (status == Status.OK) | (status == Status.IMPACT_PRESSURE_ZEROED)


def _outputs(spec: FunctionSpec, x: dict[str, F64], profile: Profile) -> dict[str, F64]:
    if spec.status_of is not None:
        return spec.status_of(x, profile)[0]
    return spec.call(x, profile, False)


def condition_scale(spec: FunctionSpec, x: dict[str, F64], y: dict[str, F64],
                    status: NDArray[np.int8], profile: Profile) -> dict[str, F64]:
    """Unrounded condition scale of every output of every case (NaN where y is NaN)."""
    scale = {o: np.abs(y[o]) for o, _ in spec.outputs}
    valid = _valid(status)
    for arg in spec.real_args:
        xv = x[arg.name]
        with np.errstate(invalid="ignore"):
            sel = np.flatnonzero(valid & np.isfinite(xv) & (xv != 0.0))
        if sel.size == 0:
            continue
        sub = {k: v[sel] for k, v in x.items()}
        x0 = sub[arg.name]
        best = {o: np.zeros(sel.size) for o, _ in spec.outputs}
        for step in STEPS:
            for sign in (1.0, -1.0):
                xs = x0 * (1.0 + sign * step)
                dx = xs - x0
                moved = dict(sub)
                moved[arg.name] = xs
                yp = _outputs(spec, moved, profile)
                for o, _ in spec.outputs:
                    with np.errstate(invalid="ignore", over="ignore", divide="ignore"):
                        term = np.abs((yp[o] - y[o][sel]) / dx * x0)
                    best[o] = np.fmax(best[o], np.where(np.isfinite(term), term, 0.0))
        tiny = np.abs(x0) < NORMAL_MIN
        if tiny.any():
            _subnormal_terms(spec, sub, y, sel, tiny, arg.name, best, profile)
        for o, _ in spec.outputs:
            scale[o][sel] = scale[o][sel] + best[o]
    for o, _ in spec.outputs:
        v = scale[o]
        with np.errstate(invalid="ignore"):
            low = valid & (np.abs(y[o]) > 0.0) & (np.abs(y[o]) < NORMAL_MIN)
        scale[o] = np.where(low, np.fmax(v, SUBNORMAL_SCALE_FLOOR), v)
    return scale


def _subnormal_terms(spec: FunctionSpec, sub: dict[str, F64], y: dict[str, F64],
                     sel: NDArray[np.intp], tiny: NDArray[np.bool_], name: str,
                     best: dict[str, F64], profile: Profile) -> None:
    """The derivative term |df/dx x| of a subnormal input x, in place in ``best``.

    A relative step cannot move a subnormal number by less than one unit of 2**-1074,
    so the term comes from doubling it (exact): with r = f(2x)/f(x) > 0 the term is
    |log2(r) f(x)|, exact where f is a power law of x (every tiny-input branch of the
    model is: linear or square-root relations) and first-order right elsewhere; where
    f(x) is zero or f changes sign, |f(2x) - f(x)|/ln 2.
    """
    moved = {k: v[tiny] for k, v in sub.items()}
    moved[name] = moved[name] * 2.0
    yp = _outputs(spec, moved, profile)
    rows = sel[tiny]
    for o, _ in spec.outputs:
        f0 = y[o][rows]
        f1 = yp[o]
        with np.errstate(invalid="ignore", divide="ignore", over="ignore"):
            same = (f0 != 0.0) & (f1 != 0.0) & (np.sign(f0) == np.sign(f1))
            ratio_term = np.abs(np.log2(np.where(same, f1 / np.where(same, f0, 1.0), 1.0)) * f0)
            diff_term = np.abs(f1 - f0) / np.log(2.0)
            term = np.where(same, ratio_term, diff_term)
        term = np.where(np.isfinite(term), term, 0.0)
        best[o][tiny] = term


def round_scale(s: F64) -> F64:
    """Scale rounded to 3 significant decimal digits (NaN and 0 kept)."""
    return np.array([float(f"{v:.2e}") if np.isfinite(v) else v for v in s.tolist()],
                    dtype=np.float64)


def _domain32(d: Domain) -> Domain:
    """``d`` with its ends rounded to binary32, as a binary32 port holds them."""
    with np.errstate(over="ignore"):
        return Domain(float(np.float32(d.lo)), float(np.float32(d.hi)), d.unit, d.sign, d.safe)


def binary32_check(spec: FunctionSpec, x: dict[str, F64], y: dict[str, F64],
                   status: NDArray[np.int8], profile: Profile) -> list[str]:
    """The ``binary32_check`` level of every case (see the module docstring).

    The reference is evaluated at the binary32-rounded inputs as a binary32 port sees
    them: an input that its binary32 range accepts but the binary64 range does not (it
    was rounded past an end) is put back on that end.
    """
    real = [a for a in spec.real_args if a.domain is not None]
    n = status.shape[0]
    abnormal = np.zeros(n, dtype=bool)
    with np.errstate(over="ignore", invalid="ignore"):
        for v in [x[a.name] for a in real] + [y[o] for o, _ in spec.outputs]:
            mag = np.abs(v)
            abnormal |= np.isfinite(v) & (v != 0.0) & ((mag < FLT_MIN) | (mag > FLT_MAX))
        x32 = dict(x)
        for a in real:
            x32[a.name] = x[a.name].astype(np.float32).astype(np.float64)
    doms = {a.name: (a.domain(profile), _domain32(a.domain(profile))) for a in real}

    def as_seen(v: F64, name: str) -> F64:
        d, d32 = doms[name]
        back = (d32.classify(v) == Status.OK) & (d.classify(v) != Status.OK)
        return np.where(back, np.clip(v, d.lo, d.hi), v)

    seen = dict(x32)
    for a in real:
        seen[a.name] = as_seen(x32[a.name], a.name)
    lenient = evaluate(spec, seen, profile)[1] != status
    for a in real:
        d, d32 = doms[a.name]
        lenient |= d32.classify(x32[a.name]) != d.classify(x[a.name])
        own32 = d32.classify(x32[a.name])
        for sign in (1.0, -1.0):
            moved = dict(seen)
            v = x32[a.name] * (1.0 + sign * BINARY32_MOVE)
            if d.sign == "any":  # zero is no boundary here: move it by a part of the range
                v = np.where(v == 0.0, sign * BINARY32_MOVE * max(abs(d.lo), abs(d.hi)), v)
            keep = d32.classify(v) == own32
            moved[a.name] = np.where(keep, as_seen(v, a.name), seen[a.name])
            lenient |= evaluate(spec, moved, profile)[1] != status
    return ["skip" if p else ("lenient" if q else "full")
            for p, q in zip(abnormal.tolist(), lenient.tolist(), strict=True)]


def binary32_skip_status(spec: FunctionSpec, x: dict[str, F64], status: NDArray[np.int8],
                         profile: Profile) -> NDArray[np.bool_]:
    """True where a binary32 check does not compare the status (check level not "full")."""
    y = _outputs(spec, x, profile)
    return np.array([c != "full" for c in binary32_check(spec, x, y, status, profile)],
                    dtype=bool)
