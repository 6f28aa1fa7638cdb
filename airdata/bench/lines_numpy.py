"""Lines 1 to 4: the numpy reference against its floor, fluids and brentq."""

from __future__ import annotations

from typing import Any

import numpy as np

from .common import (
    F64,
    HIST_STEPS,
    SEED,
    _alternate,
    _line,
    _missing,
    _pressures,
    _supersonic,
)

# --------------------------------------------------------------------------- lines 1, 2, 4

def _floor_and_reference(sz: dict[str, int]) -> tuple[list[dict[str, Any]], dict[str, Any]]:
    """Lines 1 and 2 (one alternating timing loop) and the solver histogram."""
    from .. import pitot
    from ..altimetry import pressure_altitude
    from ..pitot import mach_from_impact_pressure

    rng = np.random.default_rng([SEED, 1])
    n = sz["n"]
    p = _pressures(rng, n)
    qc, ps = _supersonic(rng, n)
    buf = np.empty_like(p)  # the floor writes into it: no allocation, no page faults
    best = _alternate({
        "floor": lambda: np.exp(np.log(p, out=buf), out=buf),
        "pressure_altitude": lambda: pressure_altitude(p),
        "mach_supersonic": lambda: mach_from_impact_pressure(qc, ps),
    }, sz["repeats"])
    fl = best["floor"]
    lines = [
        _line("1", "pressure_altitude / exp(log(p)) floor", best["pressure_altitude"] / fl,
              "x floor", "<=", 2.0, n=n, floor_s=fl, reference_s=best["pressure_altitude"]),
        _line("2", "supersonic mach_from_impact_pressure / floor",
              best["mach_supersonic"] / fl, "x floor", "<=", 6.0, n=n, floor_s=fl,
              reference_s=best["mach_supersonic"]),
    ]
    return lines, _histogram(1.0 + qc[: sz["hist"]] / ps[: sz["hist"]], pitot)


def _histogram(r: F64, pitot: Any) -> dict[str, Any]:
    """Steps each ratio needs: the smallest k with k .. HIST_STEPS steps bitwise equal.

    The solver is run with ``pitot.NEWTON_STEPS`` set to 1 .. HIST_STEPS in turn (as
    tests/test_pitot_solver.py does); a point whose result still differs between
    HIST_STEPS - 1 and HIST_STEPS steps is counted under HIST_STEPS.
    """
    shipped = pitot.NEWTON_STEPS
    runs: dict[int, F64] = {}
    try:
        for k in range(1, HIST_STEPS + 1):
            pitot.NEWTON_STEPS = k
            runs[k] = pitot.supersonic_mach_squared(r)
    finally:
        pitot.NEWTON_STEPS = shipped
    needed = np.full(r.shape, HIST_STEPS)
    for k in range(HIST_STEPS - 1, 0, -1):
        needed = np.where((needed == k + 1) & (runs[k] == runs[HIST_STEPS]), k, needed)
    counts = {str(k): int(np.count_nonzero(needed == k)) for k in range(1, HIST_STEPS + 1)}
    return {"samples": int(r.size), "counts": counts, "shipped_steps": shipped,
            "beyond_shipped": int(np.count_nonzero(needed > shipped)),
            "note": f"steps to the bitwise fixed point ({HIST_STEPS} steps taken as settled; "
                    "'1' means 1 or fewer)"}


def _brentq_line(sz: dict[str, int]) -> dict[str, Any]:
    """Line 4: vectorised supersonic inversion against brentq per point."""
    title = "supersonic inversion: brentq per point / vectorised"
    try:
        from scipy.optimize import brentq
    except ImportError:
        return _missing("4", title, "x faster", ">=", 250.0, "scipy not installed")
    from ..pitot import mach_from_impact_pressure

    rng = np.random.default_rng([SEED, 1])
    _pressures(rng, sz["n"])  # same stream as lines 1-2: the same supersonic points
    qc, ps = _supersonic(rng, sz["n"])
    k = sz["brentq"]
    rk = (1.0 + qc[:k] / ps[:k]).tolist()
    eps = float(np.finfo(np.float64).eps)

    def pitot_ratio(m: float, r: float) -> float:
        # Rayleigh pitot formula, NACA Report 1135 eq. 100: pt/ps at Mach m, minus r.
        u = m * m
        return 1.2 * u * (7.2 * u / (7.0 * u - 1.0)) ** 2.5 - r

    def per_point() -> list[float]:
        # xtol must be > 0 for scipy: the smallest normal number stands for 0.
        return [brentq(pitot_ratio, 1.0, 10.5, args=(r,), xtol=np.finfo(np.float64).tiny,
                       rtol=4.0 * eps) for r in rk]

    best = _alternate({"vectorised": lambda: mach_from_impact_pressure(qc, ps),
                       "brentq": per_point}, max(2, sz["repeats"] - 2))
    ours = np.asarray(mach_from_impact_pressure(qc[:k], ps[:k]))
    theirs = np.array(per_point())
    ulps = np.abs(ours - theirs) / np.spacing(theirs)
    per_vec = best["vectorised"] / sz["n"]
    per_brent = best["brentq"] / k
    return _line("4", title, per_brent / per_vec, "x faster", ">=", 250.0,
                 n_vectorised=sz["n"], n_brentq=k, vectorised_s_per_point=per_vec,
                 brentq_s_per_point=per_brent, max_ulps_apart=float(ulps.max()))


# --------------------------------------------------------------------------- line 3

def _fluids_line(sz: dict[str, int]) -> dict[str, Any]:
    """Line 3: vectorised atmosphere (us1976 profile) against fluids point by point."""
    title = "atmosphere: fluids.ATMOSPHERE_1976 per point / vectorised"
    try:
        from fluids import ATMOSPHERE_1976
    except ImportError:
        return _missing("3", title, "x faster", ">=", 50.0, "fluids not installed")
    from ..atmosphere import atmosphere, geopotential_altitude

    rng = np.random.default_rng([SEED, 3])
    z = rng.uniform(0.0, 84000.0, sz["n"])  # geometric altitude, m (fluids' input)
    k = sz["fluids"]
    zk = z[:k].tolist()

    def vectorised() -> object:
        return atmosphere(geopotential_altitude(z, profile="us1976"), profile="us1976")

    def per_point() -> list[object]:
        return [ATMOSPHERE_1976(zi) for zi in zk]

    best = _alternate({"vectorised": vectorised, "fluids": per_point},
                      max(2, sz["repeats"] - 2))
    per_vec = best["vectorised"] / sz["n"]
    per_fl = best["fluids"] / k
    return _line("3", title, per_fl / per_vec, "x faster", ">=", 50.0,
                 n_vectorised=sz["n"], n_fluids=k, vectorised_s_per_point=per_vec,
                 fluids_s_per_point=per_fl,
                 note_inputs="geometric altitude uniform 0-84 km; ours converts to "
                             "geopotential first")
