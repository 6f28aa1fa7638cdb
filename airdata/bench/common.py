"""Inputs, timing and report lines shared by the benchmark's lines."""

from __future__ import annotations

import math
import time
from collections.abc import Callable
from typing import Any

import numpy as np
from numpy.typing import NDArray

F64 = NDArray[np.float64]

#: Seed of every input set of the benchmark.
SEED = 20_261_201

#: Problem sizes: full run and ``--quick``.
SIZES: dict[str, dict[str, int]] = {
    "full": {"n": 1_000_000, "repeats": 5, "hist": 100_000, "fluids": 3_000,
             "brentq": 2_000, "chain_small": 1_000_000, "chain_large": 10_000_000,
             "chunk": 100_000, "callgrind": 2_000, "reduce_rows": 500_000, "scalar": 2_000},
    "quick": {"n": 100_000, "repeats": 5, "hist": 20_000, "fluids": 300, "brentq": 300,
              "chain_small": 100_000, "chain_large": 1_000_000, "chunk": 50_000,
              "callgrind": 500, "reduce_rows": 20_000, "scalar": 500},
}

#: Step counts tried for the solver histogram (the last one is taken as settled).
HIST_STEPS = 6

#: Growth of the chunked chain's peak resident set allowed for "flat" (line 8).
FLAT_LIMIT = 1.05

#: Rounds of every alternating timing; a ratio is the median of the rounds' best times.
ROUNDS = 3



# --------------------------------------------------------------------------- inputs

def _pressures(rng: np.random.Generator, n: int) -> F64:
    """Static pressures of altitudes uniform over the whole model, -5000 .. 84852 m."""
    from ..altimetry import pressure_at_altitude

    h = rng.uniform(-5000.0, 84852.0, n)
    return np.asarray(pressure_at_altitude(h), dtype=np.float64)


def _supersonic(rng: np.random.Generator, n: int) -> tuple[F64, F64]:
    """(qc, ps) of Mach uniform in (1, 10] at pressure altitudes 0 .. 30 km."""
    from ..altimetry import pressure_at_altitude
    from ..pitot import impact_pressure_from_mach

    m = 1.0 + rng.uniform(0.0, 9.0, n)
    m = np.where(m > 1.0, m, 1.5)
    ps = np.asarray(pressure_at_altitude(rng.uniform(0.0, 30000.0, n)), dtype=np.float64)
    qc = np.asarray(impact_pressure_from_mach(m, ps), dtype=np.float64)
    return qc, ps


def chain_inputs(rng: np.random.Generator, n: int) -> tuple[F64, F64, F64]:
    """(ps, pt, tat) of an invented flight envelope for the chain (demo data).

    Pressure altitude uniform in -1000 .. 30000 m, Mach uniform in 0 .. 3 (two thirds
    supersonic), day temperature the standard one shifted by -30 .. +30 K, probe
    recovery 1.
    """
    from ..altimetry import pressure_at_altitude
    from ..atmosphere import atmosphere
    from ..pitot import impact_pressure_from_mach

    h = rng.uniform(-1000.0, 30000.0, n)
    m = rng.uniform(0.0, 3.0, n)
    dT = rng.uniform(-30.0, 30.0, n)
    ps = np.asarray(pressure_at_altitude(h), dtype=np.float64)
    pt = ps + np.asarray(impact_pressure_from_mach(m, ps), dtype=np.float64)
    sat = np.asarray(atmosphere(h, dT).temperature, dtype=np.float64)
    tat = sat * (1.0 + 0.2 * m * m)
    return ps, pt, tat


# --------------------------------------------------------------------------- timing

def _alternate(fns: dict[str, Callable[[], object]], repeats: int,
               rounds: int = ROUNDS) -> dict[str, float]:
    """Median over ``rounds`` of each callable's best time in ``repeats`` tries, the
    callables taking turns.

    One untimed warm-up call each comes first (imports, caches, page faults).
    """
    for f in fns.values():
        f()
    per_round: dict[str, list[float]] = {k: [] for k in fns}
    for _ in range(rounds):
        best = dict.fromkeys(fns, math.inf)
        for _ in range(repeats):
            for key, f in fns.items():
                t0 = time.perf_counter()
                f()
                best[key] = min(best[key], time.perf_counter() - t0)
        for key, t in best.items():
            per_round[key].append(t)
    return {k: float(np.median(v)) for k, v in per_round.items()}


def _line(key: str, title: str, value: float | None, unit: str, op: str | None,
          goal: float | None, note: str = "", **details: Any) -> dict[str, Any]:
    """One report line; ``met`` is None when there is no goal or nothing was measured."""
    met: bool | None = None
    if value is not None and op is not None and goal is not None:
        met = bool({"<=": value <= goal, "<": value < goal, ">=": value >= goal}[op])
    return {"key": key, "title": title, "value": value, "unit": unit,
            "goal": None if op is None else {"op": op, "limit": goal},
            "met": met, "measured": value is not None, "note": note, "details": details}


def _missing(key: str, title: str, unit: str, op: str | None, goal: float | None,
             why: str) -> dict[str, Any]:
    return _line(key, title, None, unit, op, goal, note=f"not measured: {why}")
