"""Line 10: scalar calls against a careful pure-Python version and fluids."""

from __future__ import annotations

import math
from typing import Any

import numpy as np

from .common import SEED, _alternate, _line, _missing, _pressures

# --------------------------------------------------------------------------- line 10

def _python_pressure_altitude(ps: float, bases: list[tuple[float, float, float, float]],
                              r: float, g0: float) -> float:
    """Pressure altitude in plain Python floats (a peer for line 10a, not a reference):
    the layer by a walk down from the highest base (``bases`` highest first: base
    altitude, pressure, temperature, lapse rate), then ICAO Doc 7488 per layer."""
    layer = bases[-1]  # above the sea-level pressure: the lowest layer continues
    for b in bases:
        if ps <= b[1]:
            layer = b
            break
    hb, pb, tb, lapse = layer
    if lapse == 0.0:
        return hb - (r * tb / g0) * math.log(ps / pb)
    return hb + (tb / lapse) * math.expm1(-(r * lapse / g0) * math.log(ps / pb))


def _scalar_lines(sz: dict[str, int]) -> list[dict[str, Any]]:
    """Lines 10a and 10b: scalar calls per call."""
    from ..altimetry import pressure_altitude
    from ..atmosphere import atmosphere
    from ..profiles import get_profile

    prof = get_profile("icao")
    bases = [(hb, pb, tb, lapse) for hb, pb, tb, lapse in zip(
        prof.layer_base, prof.base_pressure, prof.base_temperature, prof.lapse_rate,
        strict=True)][::-1]  # highest base first: the first base pressure ps reaches
    k = sz["scalar"]
    rng = np.random.default_rng([SEED, 10])
    p = _pressures(rng, k).tolist()
    h = rng.uniform(0.0, 80000.0, k).tolist()
    r, g0 = prof.R, prof.g0
    best = _alternate({
        "airdata": lambda: [pressure_altitude(x) for x in p],
        "python": lambda: [_python_pressure_altitude(x, bases, r, g0) for x in p],
    }, sz["repeats"])
    lines = [_line("10a", "scalar pressure_altitude per call / careful pure Python",
                   best["airdata"] / best["python"], "x", "<=", 3.0,
                   note=f"{best['airdata'] / k * 1e6:.2f} us vs {best['python'] / k * 1e6:.2f} "
                        "us per call", calls=k, airdata_s_per_call=best["airdata"] / k,
                   python_s_per_call=best["python"] / k)]
    title = "scalar atmosphere: fluids per point / airdata per call"
    try:
        from fluids import ATMOSPHERE_1976
    except ImportError:
        lines.append(_missing("10b", title, "x faster", ">=", 1.0, "fluids not installed"))
        return lines
    m = max(50, k // 10)
    hm = h[:m]
    best = _alternate({
        "airdata": lambda: [atmosphere(x, profile="us1976") for x in hm],
        "fluids": lambda: [ATMOSPHERE_1976(x) for x in hm],
    }, max(2, sz["repeats"] - 2))
    lines.append(_line("10b", title, best["fluids"] / best["airdata"], "x faster", ">=", 1.0,
                       note=f"{best['airdata'] / m * 1e6:.1f} us vs "
                            f"{best['fluids'] / m * 1e6:.1f} us per call", calls=m,
                       airdata_s_per_call=best["airdata"] / m,
                       fluids_s_per_call=best["fluids"] / m))
    return lines
