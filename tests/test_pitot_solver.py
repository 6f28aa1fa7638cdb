"""Exhaustive demonstration of the iteration bound of the supersonic pitot solver.

``airdata.pitot.supersonic_mach_squared`` solves the Rayleigh pitot formula (NACA Report
1135, eq. 100) for u = M^2 with a fixed number of bracketed Newton steps,
``airdata.pitot.NEWTON_STEPS``.  Its module docstring claims that 3 steps reach the
converged binary64 value everywhere in 1 <= M <= 10 and that the shipped count keeps one
in reserve.  These tests re-implement nothing: they call the shipped solver with the
module constant monkeypatched and compare the results bit for bit over a dense sweep of
about 220 000 pitot ratios:

* Mach 1..10 on a uniform grid, turned into ratios by the shipped forward kernel;
* Mach 1 + logspace(-16, 0), the neighbourhood of the switch;
* qc/ps from ``RATIO_SONIC`` upward: the first 20 000 binary64 neighbours above it and
  a geometric grid up to ``RATIO_MAX`` (Mach 10).

The exact forward check uses mpmath (the project's high-precision oracle) on the
Rayleigh pitot formula as published, pt/ps = 1.2 u (7.2 u / (7 u - 1))^2.5.
"""

from __future__ import annotations

from collections import Counter

import mpmath
import numpy as np
import pytest
from numpy.typing import NDArray

import airdata.pitot as pitot

F64 = NDArray[np.float64]

#: Step counts compared; the largest is taken as "converged" for the histogram.
_MAX_STEPS = 10


def _sweep() -> F64:
    """Pitot ratios r = pt/ps = 1 + qc/ps over the whole supersonic range."""
    m_lin = np.linspace(1.0, 10.0, 120_001)
    m_log = 1.0 + np.logspace(-16.0, 0.0, 40_001)
    m = np.concatenate([m_lin, m_log[m_log <= 10.0]])
    x_from_mach = pitot.ratio_from_mach(m)
    s = pitot.RATIO_SONIC
    x_next = s + np.arange(1, 20_001) * np.spacing(s)  # exact: same binade
    x_geo = np.geomspace(s, pitot.RATIO_MAX, 40_001)
    x = np.concatenate([x_from_mach, x_next, x_geo, [pitot.RATIO_MAX]])
    x = x[(x > s) & (x <= pitot.RATIO_MAX)]  # the solver's branch, as mach_from_ratio
    return 1.0 + x


@pytest.fixture(scope="module")
def ratios() -> F64:
    r = _sweep()
    assert r.size >= 200_000
    return r


@pytest.fixture(scope="module")
def by_steps(ratios: F64) -> dict[int, F64]:
    """Solver result for every step count 0.._MAX_STEPS, plus the shipped one (key -1)."""
    shipped = pitot.NEWTON_STEPS
    out: dict[int, F64] = {-1: pitot.supersonic_mach_squared(ratios)}
    mp = pytest.MonkeyPatch()
    try:
        for n in range(_MAX_STEPS + 1):
            mp.setattr(pitot, "NEWTON_STEPS", n)
            out[n] = pitot.supersonic_mach_squared(ratios)
    finally:
        mp.undo()
    assert pitot.NEWTON_STEPS == shipped
    return out


def _ulps(a: F64, b: F64) -> F64:
    return np.abs(a - b) / np.spacing(np.abs(b))


def steps_needed(by_steps: dict[int, F64]) -> F64:
    """Smallest n such that n, n+1, ..., _MAX_STEPS steps all give the same bits."""
    ref = by_steps[_MAX_STEPS]
    needed = np.full(ref.shape, _MAX_STEPS)
    for n in range(_MAX_STEPS - 1, -1, -1):
        needed = np.where((needed == n + 1) & (by_steps[n] == ref), n, needed)
    return needed


def test_histogram_of_steps_needed(by_steps: dict[int, F64], capsys: pytest.CaptureFixture[str]
                                   ) -> None:
    needed = steps_needed(by_steps)
    hist = dict(sorted(Counter(needed.tolist()).items()))
    with capsys.disabled():
        print(f"\nsupersonic solver, steps to the bitwise fixed point over {needed.size} "
              f"ratios: {hist}; shipped NEWTON_STEPS = {pitot.NEWTON_STEPS}")
    # Measured: {2: 124529, 3: 83025, 4: 12331, 5: 2}.  Nothing may need more than the
    # largest count tried, else the "fixed point" below is not one.
    assert needed.max() < _MAX_STEPS
    assert needed.min() >= 1  # the starting value alone is never converged


def test_fixed_point_reached_within_five_steps(by_steps: dict[int, F64]) -> None:
    """5 steps already give the very bits of 6, 8 and 10 steps over the whole sweep."""
    for n in (6, 8, _MAX_STEPS):
        assert np.array_equal(by_steps[5], by_steps[n]), n


@pytest.mark.xfail(strict=True, reason=(
    "library: 3 Newton steps do not reach the converged value everywhere (about 12 000 "
    "of 220 000 ratios differ from 10 steps, by up to 3 ulp, for r in [1.89, 7.23]); "
    "the pitot module docstring claims they do"))
def test_three_steps_identical_to_shipped(by_steps: dict[int, F64]) -> None:
    assert np.array_equal(by_steps[3], by_steps[-1])


@pytest.mark.xfail(strict=True, reason=(
    "library: the shipped NEWTON_STEPS = 4 is one short of the bitwise fixed point at 2 "
    "ratios (r = 0x1.1d8e702162e67p+1, 0x1.e8e778c6205fdp+0: 1 ulp off the 5..10-step "
    "value), so it has no reserve"))
@pytest.mark.parametrize("n", [6, 8])
def test_more_steps_identical_to_shipped(by_steps: dict[int, F64], n: int) -> None:
    assert np.array_equal(by_steps[n], by_steps[-1])


def test_shipped_and_three_steps_close_to_fixed_point(by_steps: dict[int, F64]) -> None:
    """What does hold: 4 steps are within 1 ulp and 3 steps within 3 ulp of converged."""
    ref = by_steps[_MAX_STEPS]
    assert _ulps(by_steps[-1], ref).max() <= 1.0
    assert _ulps(by_steps[3], ref).max() <= 3.0
    # ... and 2 steps are far from it: the third step is really needed.
    assert _ulps(by_steps[2], ref).max() > 1e3


def test_shipped_count_is_the_module_constant(by_steps: dict[int, F64]) -> None:
    assert by_steps[-1] is not by_steps[pitot.NEWTON_STEPS]
    assert np.array_equal(by_steps[-1], by_steps[pitot.NEWTON_STEPS])


def test_bracket_invariant(ratios: F64, by_steps: dict[int, F64]) -> None:
    """1 <= u <= (r/1.2)(7/7.2)^2.5, the bracket of the module docstring."""
    u = by_steps[-1]
    hi = (ratios / 1.2) * (7.0 / 7.2) ** 2.5
    assert np.all(u >= 1.0)
    # hi is rounded here; allow its own rounding (2 ulp) above it.
    assert np.all(u <= hi + 2.0 * np.spacing(hi))
    assert np.all(np.isfinite(u))


def test_monotone_in_ratio(ratios: F64, by_steps: dict[int, F64]) -> None:
    """Larger pitot ratio, larger Mach: never decreasing beyond the solver's jitter."""
    order = np.argsort(ratios, kind="stable")
    r, u = ratios[order], by_steps[-1][order]
    drop = np.maximum(u[:-1] - u[1:], 0.0) / np.spacing(u[1:])
    assert np.all(r[1:] >= r[:-1])
    assert drop.max() <= 4.0


def _rayleigh(u: float) -> mpmath.mpf:
    """NACA Report 1135 eq. 100 in terms of u = M^2, at the working precision."""
    uu = mpmath.mpf(u)
    return mpmath.mpf("1.2") * uu * (mpmath.mpf("7.2") * uu / (7 * uu - 1)) ** mpmath.mpf("2.5")


@pytest.fixture(scope="module")
def forward_ulps(ratios: F64, by_steps: dict[int, F64]) -> F64:
    """|F(u) - r| in ulps of r, F evaluated exactly (mpmath) at the returned binary64 u."""
    # The hardest region is just above M = 1 (the worst of the full sweep, 3.0 ulp, is
    # at r = 0x1.e49701614fea2p+0): take the 3000 ratios nearest to sonic, 2000 drawn
    # at random and the top end.
    rng = np.random.default_rng(20261201)
    pick = np.concatenate([np.argsort(ratios)[:3000],
                           rng.choice(ratios.size, 2000, replace=False), [ratios.size - 1]])
    u = by_steps[-1]
    with mpmath.workdps(30):
        err = [abs(float((_rayleigh(float(u[i])) - mpmath.mpf(float(ratios[i])))
                         / mpmath.mpf(float(np.spacing(ratios[i])))))
               for i in pick]
    return np.array(err)


def test_forward_reproduces_ratio_measured_bound(forward_ulps: F64) -> None:
    # Measured maximum over the whole sweep (all 220 000 points, checked once offline):
    # 2.99 ulp; a wrong solver is off by far more.
    assert forward_ulps.max() <= 3.0


@pytest.mark.xfail(strict=True, reason=(
    "library: the solver's final phi(u) evaluation leaves up to about 2.7 ulp in u = M^2 "
    "just above M = 1, so the exact Rayleigh ratio at the returned u is up to 3.0 ulp "
    "from r (882 of 220 000 ratios over 2 ulp; module "
    "docstring: 'within about 1 ulp')"))
def test_forward_reproduces_ratio_within_2_ulp(forward_ulps: F64) -> None:
    assert forward_ulps.max() <= 2.0
