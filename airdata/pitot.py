"""Pitot-static relations: impact pressure from Mach number or calibrated airspeed and
their inverses, subsonic (isentropic) and supersonic (Rayleigh pitot formula).

Equations PIT-1 .. PIT-4 of docs/equations.md; gamma = 1.4 throughout.

Subsonic, M <= 1 (NACA Report 1135, eq. 44)::

    qc/ps = (1 + 0.2 M^2)^3.5 - 1

Supersonic, M > 1: a normal shock stands ahead of the probe (NACA Report 1135,
eq. 100, the Rayleigh pitot formula)::

    pt/ps = (1.2 M^2)^3.5 * (6 / (7 M^2 - 1))^2.5 ... = 1.2 u (7.2 u / (7 u - 1))^2.5,  u = M^2

Both branches meet at M = 1 with equal value (1.2^3.5) and equal slope
(d ln(pt/ps)/dM = 7/6), so the relation is C1 across the switch.

Inversion of the supersonic branch (``supersonic_mach_squared``) solves the fixed-point
form  u = phi(u) = (r/1.2) ((7 - 1/u)/7.2)^2.5  for u = M^2 >= 1, r = pt/ps:

* phi is increasing and concave for u > 1/4 (phi'' has the sign of 1/(2u) - 2), so
  h(u) = u - phi(u) is increasing and convex on u >= 1;
* u_max = (r/1.2)(7/7.2)^2.5 = phi(infinity) bounds the root above and u = 1 bounds it
  below: the bracket [1, u_max] always holds the root, and its lower end rises to
  every iterate found below the root;
* Newton's method on a convex increasing function converges monotonically from the
  right of the root, and a step from the left lands on the right (below u_max); a
  step is clamped at the bracket's lower end, which only matters for rounding when
  the root lies there;
* the start u0 = u_max - 2.5/7 + x (-0.11 + x (0.0752 - 0.2316 x)), x = 1/u_max, is
  the large-u expansion of the root (u* = u_max - 2.5/7 - O(1/u_max)) with the
  O(1/u_max) terms fitted by least squares over 1 <= M <= 10; its relative error is at
  most 5.5e-4 (at M = 1), so quadratic convergence needs few steps;
* with that start, 3 steps give the Mach number sqrt(u) within 2 ulp of the exact root
  everywhere in 1 <= M <= 10 (about 1 % of results are beyond 1 ulp), and 2 steps do
  not (tests/test_pitot_solver.py, against mpmath over a dense sweep of about 220 000
  ratios); the implementation takes NEWTON_STEPS = 4, one in reserve.  The binary64
  iteration itself settles on a bitwise fixed point within 5 steps (2 of the 220 000
  ratios need 5, 719 need 4): the last steps only move the last bit of u;
* the result is returned as phi(u_N), which damps the remaining error in u_N by
  phi'(u) <= 2.5/(7u - 1) <= 0.42.
"""

from __future__ import annotations

import numpy as np
from numpy.typing import NDArray

from . import _domains as dom
from ._blocks import elementwise
from ._docs import fill_doc
from ._inputs import ArrayLike, FloatOrArray, Inputs
from .profiles import Profile, get_profile

__all__ = [
    "impact_pressure_from_mach",
    "mach_from_impact_pressure",
    "impact_pressure_from_cas",
    "cas_from_impact_pressure",
    "NEWTON_STEPS", "TINY_RATIO", "TINY_SCALE",
]

F64 = NDArray[np.float64]

#: Newton steps taken by the supersonic inversion (3 are enough; one in reserve).
NEWTON_STEPS = 4

# (7/7.2)^2.5: phi(u)/(r/1.2) as u -> infinity.
_PHI_INF = float(np.exp(2.5 * np.log1p(-0.2 / 7.2)))


@elementwise(1)
def ratio_from_mach(m: F64) -> F64:
    """PIT-1 kernel: qc/ps as a function of Mach number (both branches).

    Each branch is evaluated only on its own elements.
    """
    sup = m > 1.0
    if not sup.any():
        return _ratio_subsonic(m)
    out = np.empty_like(m)
    sub = ~sup
    out[sub] = _ratio_subsonic(m[sub])
    u = m[sup] * m[sup]
    out[sup] = (1.2 * u) * np.exp(2.5 * np.log1p((0.2 * u + 1.0) / (7.0 * u - 1.0))) - 1.0
    return out


def _ratio_subsonic(m: F64) -> F64:
    """PIT-1, M <= 1: (1 + 0.2 M^2)^3.5 - 1 as expm1(3.5 log1p(0.2 M^2))."""
    return np.expm1(3.5 * np.log1p(0.2 * (m * m)))


#: qc/ps at M = 1 as computed by the subsonic kernel: the switch between branches.
RATIO_SONIC = float(ratio_from_mach(np.array([1.0]))[0])
#: qc/ps at the highest Mach number of the model.
RATIO_MAX = float(ratio_from_mach(np.array([dom.MACH_MAX]))[0])
#: RATIO_MAX as the limit of a derived qc/ps (see ``_domains.DERIVED_SLACK``).
RATIO_LIMIT = dom.derived_limit(RATIO_MAX)
#: MACH_MAX as the limit of a derived Mach number.
MACH_LIMIT = dom.derived_limit(dom.MACH_MAX)


def supersonic_mach_squared(r: F64) -> F64:
    """PIT-2 solver: u = M^2 >= 1 with Rayleigh pitot ratio pt/ps = ``r`` >= 1.2^3.5.

    See the module docstring for the convergence argument.  Works on every element
    with a fixed number of steps.  The root lies in the bracket [lo, u_max]:
    u_max = (r/1.2)(7/7.2)^2.5 is an analytic upper bound that no iterate exceeds (the
    start is below it, since its polynomial correction is negative for every x > 0;
    Newton on the convex increasing h decreases from the right of the root and lands
    between the root and u_max from the left, which tests/test_pitot_solver.py checks
    over its whole sweep), and lo starts at 1 and rises to every iterate found left of
    the root.  Each step is clamped at lo: in exact arithmetic it never goes below, in
    rounded arithmetic it can, by a few ulp, when the root lies at lo (M just above 1),
    and the clamp keeps the step's progress there.
    """
    out = np.empty_like(r)
    for start in range(0, r.size, _BLOCK):
        out[start:start + _BLOCK] = _solve_block(r[start:start + _BLOCK])
    return out


#: Elements per block of the solver: its temporaries then stay in the cache (about 40 %
#: faster than whole-array passes at 1e6 elements, measured; results bit-identical).
_BLOCK = 65536


def _solve_block(r: F64) -> F64:
    """The solver on one block (see :func:`supersonic_mach_squared`)."""
    a = r / 1.2
    return _phi(a, newton_iterate(a, NEWTON_STEPS))


def _phi(a: F64, u: F64) -> F64:
    """The fixed-point map phi(u) = a ((7 - 1/u)/7.2)^2.5, a = r/1.2."""
    return a * np.exp(2.5 * np.log1p(-(0.2 + 1.0 / u) / 7.2))


def newton_iterate(a: F64, steps: int) -> F64:
    """The Newton iterate u_steps of the supersonic solver for a = r/1.2 (exposed so
    that tests can check every iterate against the bracket)."""
    u_max = a * _PHI_INF
    x = 1.0 / u_max
    lo = np.ones_like(u_max)
    u = np.maximum(u_max - 2.5 / 7.0 + x * (-0.11 + x * (0.0752 + x * -0.2316)), lo)
    for _ in range(steps):
        phi = _phi(a, u)
        g = u - phi
        np.copyto(lo, u, where=g < 0.0)
        dphi = phi * 2.5 / (u * (7.0 * u - 1.0))
        u = np.maximum(u - g / (1.0 - dphi), lo)
    return u


@elementwise(1)
def mach_from_ratio(x: F64) -> F64:
    """PIT-2 kernel: Mach number from qc/ps = ``x`` (in [0, RATIO_MAX]).

    The closed form up to RATIO_SONIC, the solver above it; each only on its own
    elements.
    """
    sup = x > RATIO_SONIC
    if not sup.any():
        return _mach_subsonic(x)
    out = np.empty_like(x)
    sub = ~sup
    out[sub] = _mach_subsonic(x[sub])
    out[sup] = np.sqrt(supersonic_mach_squared(1.0 + x[sup]))
    return out


def _mach_subsonic(x: F64) -> F64:
    """PIT-2, qc/ps <= RATIO_SONIC: sqrt(5 ((1 + x)^(1/3.5) - 1)) with log1p/expm1."""
    return np.sqrt(5.0 * np.expm1(np.log1p(x) / 3.5))


#: Below this Mach number a conversion between the Mach numbers of one impact pressure
#: at two static pressures (ratio k) is linear, M2 = M1 sqrt(k), to within roundoff:
#: the first neglected term is 0.125 M1^2 |1 - k| relative, below 2^-60 for every k of
#: the model (< 3e5), in binary64 and binary32 alike, while M1^2 = 2^-80 is far from
#: underflow in both.  Without it M1^2 underflows below M1 = 1e-154 and the conversion
#: returns 0 for a tiny nonzero speed.
TINY_MACH = 2.0**-40


#: Power of two that lifts the tiny branches' intermediates out of the subnormal range:
#: an input as small as the smallest subnormal (2^-1074) times 2^128 and divided by a
#: pressure ratio of the model stays normal, and the one rounding into the subnormal
#: range happens on the final product.  Scaling by a power of two is exact, so where
#: the unscaled intermediates were normal the result is bit-identical to theirs.  (The
#: binary32 C port uses 2^64, its own analogue.)
TINY_SCALE = 2.0**128
_TINY_UNSCALE = 2.0**-128

#: Below this qc/p the closed form of PIT-2 is linear to within roundoff:
#: M = sqrt(5 x/3.5) (1 - (5/28) x + ...), the neglected term below 2^-62 relative.
TINY_RATIO = 2.0**-60


def tiny_linear(v: F64, k: F64, a: float) -> F64:
    """The linear tiny-speed conversion a v sqrt(k) with no subnormal intermediate.

    ``a`` is a0 for a CAS from a Mach number, 1 for a Mach number from a Mach number;
    one rounding into the subnormal range on the last product.
    """
    return (a * ((v * TINY_SCALE) * np.sqrt(k))) * _TINY_UNSCALE


def tiny_mach_of_cas(cas: F64, k: F64, a0: float) -> F64:
    """The linear tiny-speed conversion (cas/a0) sqrt(k) with no subnormal intermediate."""
    return (((cas * TINY_SCALE) / a0) * np.sqrt(k)) * _TINY_UNSCALE


def impact_from_mach(m: F64, p: F64) -> F64:
    """PIT-1 times a pressure: qc = p f(M), f = qc/ps of ``ratio_from_mach``.

    Below M = TINY_MACH f(M) is 0.7 M^2 to within roundoff (the next term is 0.25 M^2
    relative, below 2^-82), and it is evaluated as ((0.7 p) M) M: M^2 alone would be
    subnormal below M = 1.5e-154 and carry a relative error up to 1e-11 into an impact
    pressure that is itself normal.  Four roundings, within 2 ulp.
    """
    return np.where(m < TINY_MACH, ((0.7 * p) * m) * m,
                    p * ratio_from_mach(np.where(m < TINY_MACH, 0.0, m)))


def mach_from_pressures(qc: F64, p: F64) -> F64:
    """PIT-2 kernel on qc and p (qc/p in [0, RATIO_MAX]): :func:`mach_from_ratio` of
    qc/p, except below qc/p = TINY_RATIO, where the linear form sqrt(5 (x/3.5)) is
    evaluated on qc 2^128 / p and scaled back by 2^-64, so that an impact pressure down
    to the smallest subnormal gives its Mach number to full precision (qc/p itself
    would underflow)."""
    x = qc / p
    tiny = x < TINY_RATIO
    if not tiny.any():
        return mach_from_ratio(x)
    xs = (qc * TINY_SCALE) / p
    lin = np.sqrt(5.0 * (xs / 3.5)) * 2.0**-64
    return np.where(tiny, lin, mach_from_ratio(np.where(tiny, 0.0, x)))


@fill_doc
def impact_pressure_from_mach(mach: ArrayLike, ps: ArrayLike, *,
                              profile: Profile | str | None = None,
                              strict: bool = True) -> FloatOrArray:
    """Impact pressure qc = pt - ps sensed by a pitot probe at Mach ``mach``.

    {Parameters: mach, ps, profile_range, strict; broadcast}

    {Returns: out_impact_pressure}

    {Raises: bad_mach_ps}

    Notes
    -----
    PIT-1: isentropic relation for M <= 1, Rayleigh pitot formula for M > 1.

    References
    ----------
    NACA Report 1135 (1953), eqs. 44 and 100.
    """
    prof = get_profile(profile)
    args = Inputs(strict, mach=(mach, dom.MACH), ps=(ps, dom.pressure(prof)))
    return args.finish(impact_from_mach(args["mach"], args["ps"]))


@fill_doc
def mach_from_impact_pressure(qc: ArrayLike, ps: ArrayLike, *, profile: Profile | str | None = None,
                              strict: bool = True) -> FloatOrArray:
    """Mach number from impact pressure and static pressure.

    Parameters
    ----------
    qc : float or array_like
        Impact pressure pt - ps, Pa, >= 0; qc/ps must not exceed its value at Mach 10.
    {ps, profile_range, strict}

    {broadcast}

    {Returns: out_mach}

    Raises
    ------
    DomainError
        Bad ``qc`` or ``ps``, or qc/ps beyond Mach 10 (out of range).

    Notes
    -----
    PIT-2: closed form below qc/ps = 1.2^3.5 - 1, the bracketed Newton solver of the
    module docstring above it.

    References
    ----------
    NACA Report 1135 (1953), eqs. 44 and 100.
    """
    prof = get_profile(profile)
    args = Inputs(strict, qc=(qc, dom.IMPACT_PRESSURE), ps=(ps, dom.pressure(prof)))
    x = args["qc"] / args["ps"]
    over = args.flag_above(x, RATIO_LIMIT, "qc/ps", f"[0, {RATIO_MAX!r}] (Mach <= 10)")
    return args.finish(mach_from_pressures(np.where(over, 0.0, args["qc"]), args["ps"]))


@fill_doc
def impact_pressure_from_cas(cas: ArrayLike, *, profile: Profile | str | None = None,
                             strict: bool = True) -> FloatOrArray:
    """Impact pressure corresponding to calibrated airspeed ``cas``.

    Parameters
    ----------
    cas : float or array_like
        Calibrated airspeed, m/s, in [0, 10 a0] (a0 = 340.294 m/s, icao).
    {profile_p0_a0, strict}

    {broadcast}

    {Returns: out_impact_pressure}

    Raises
    ------
    DomainError
        ``cas`` NaN, infinite, negative, or above 10 a0.

    Notes
    -----
    PIT-3: PIT-1 at sea level, qc = p0 f(cas/a0); supersonic above cas = a0.

    References
    ----------
    NACA Report 1135 (1953), eqs. 44 and 100, with ps = p0 and a = a0.
    """
    prof = get_profile(profile)
    args = Inputs(strict, cas=(cas, dom.SPEED))
    m = args["cas"] / prof.a0
    over = args.flag_above(m, MACH_LIMIT, "cas",
                           f"[0, {dom.MACH_MAX * prof.a0!r}] m/s", shown=args["cas"])
    return args.finish(impact_from_mach(np.where(over, 0.0, m), prof.p0))


@fill_doc
def cas_from_impact_pressure(qc: ArrayLike, *, profile: Profile | str | None = None,
                             strict: bool = True) -> FloatOrArray:
    """Calibrated airspeed from impact pressure.

    Parameters
    ----------
    qc : float or array_like
        Impact pressure, Pa, in [0, p0 f(10)] (about 1.30e7 Pa).
    {profile_p0_a0, strict}

    {broadcast}

    {Returns: out_cas}

    Raises
    ------
    DomainError
        ``qc`` NaN, infinite, negative or beyond CAS = 10 a0.

    Notes
    -----
    PIT-4: the inverse of PIT-3, through the PIT-2 solver above cas = a0.

    References
    ----------
    NACA Report 1135 (1953), eqs. 44 and 100, with ps = p0 and a = a0.
    """
    prof = get_profile(profile)
    args = Inputs(strict, qc=(qc, dom.IMPACT_PRESSURE))
    x = args["qc"] / prof.p0
    over = args.flag_above(x, RATIO_LIMIT, "qc",
                           f"[0, {RATIO_MAX * prof.p0!r}] Pa (CAS <= 10 a0)", shown=args["qc"])
    return args.finish(prof.a0 * mach_from_pressures(np.where(over, 0.0, args["qc"]),
                                                     np.full_like(x, prof.p0)))
