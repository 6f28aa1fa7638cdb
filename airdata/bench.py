"""``airdata bench``: speed and memory of the reference and the C port, as ratios.

Every ratio is taken in one run, on the same seeded inputs, with both sides timed
alternately (``time.perf_counter``): the median over :data:`ROUNDS` rounds of the best of
N repeats, because absolute times on a shared machine drift while ratios measured side
by side hold much better.  Instruction
counts (valgrind's callgrind) are deterministic and need no repeats.

Lines of the report (with their goals):

1. ``pressure_altitude`` against one ``np.exp(np.log(p))`` pass over the same array
   into a preallocated output (no allocation, so the floor measures arithmetic, not the
   page faults of new arrays), the floor of a vectorised formula needing one logarithm
   and one exponential (goal <= 2).
2. supersonic ``mach_from_impact_pressure`` against the same floor (goal <= 6), with
   the histogram of Newton steps the solver needs to settle.
3. vectorised ``atmosphere`` against ``fluids.ATMOSPHERE_1976`` called point by point
   (goal >= 50x).
4. the supersonic inversion against ``scipy.optimize.brentq`` per point at full
   precision on the Rayleigh pitot formula (goal >= 250x).
5. the C port's batch entry points against the numpy reference: ``pressure_altitude``
   (for information) and the full ``air_data`` chain (goal >= 3x).
6. instructions per call of the C port (callgrind): full chain (goal < 1500) and the
   supersonic ``mach_from_impact_pressure`` (for information).
7. building the whole vector suite: seconds (goal < 30) and peak memory (goal < 500 MB).
8. peak memory of ``air_data`` over many samples processed in chunks: flat (goal: the
   peak at 10x the samples within 5 % of the smaller run's).
9. ``airdata reduce`` of a recorded file, CSV and Parquet out, against pyarrow's own read
   and write of the same file (goal <= 2).
10. scalar calls (Python float in, float out), per call: ``pressure_altitude`` against a
    careful pure-Python seven-layer version written here (goal <= 3), and
    ``atmosphere`` against ``fluids.ATMOSPHERE_1976`` per point (goal: faster).

An engineering and verification aid, not certified flight software.
"""

from __future__ import annotations

import argparse
import json
import math
import os
import platform
import shutil
import subprocess
import sys
import tempfile
import time
from collections.abc import Callable
from pathlib import Path
from typing import Any

import numpy as np
from numpy.typing import NDArray

from .notice import CAUTION

F64 = NDArray[np.float64]

__all__ = ["SEED", "SIZES", "chain_inputs", "run_bench", "format_table", "register"]

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
    from .altimetry import pressure_at_altitude

    h = rng.uniform(-5000.0, 84852.0, n)
    return np.asarray(pressure_at_altitude(h), dtype=np.float64)


def _supersonic(rng: np.random.Generator, n: int) -> tuple[F64, F64]:
    """(qc, ps) of Mach uniform in (1, 10] at pressure altitudes 0 .. 30 km."""
    from .altimetry import pressure_at_altitude
    from .pitot import impact_pressure_from_mach

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
    from .altimetry import pressure_at_altitude
    from .atmosphere import atmosphere
    from .pitot import impact_pressure_from_mach

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


# --------------------------------------------------------------------------- lines 1, 2, 4

def _floor_and_reference(sz: dict[str, int]) -> tuple[list[dict[str, Any]], dict[str, Any]]:
    """Lines 1 and 2 (one alternating timing loop) and the solver histogram."""
    from . import pitot
    from .altimetry import pressure_altitude
    from .pitot import mach_from_impact_pressure

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
    from .pitot import mach_from_impact_pressure

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
    from .atmosphere import atmosphere, geopotential_altitude

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


# --------------------------------------------------------------------------- line 5

def _port_lines(sz: dict[str, int]) -> list[dict[str, Any]]:
    """Lines 5a and 5b: the C port (binary64) against the numpy reference."""
    t_pa = "C port pressure_altitude: reference / port"
    t_ch = "C port air_data chain: reference / port"
    try:
        from . import cport
        cport._module("double")
    except Exception as exc:  # noqa: BLE001 - any import or build failure of the port
        why = f"C port unavailable ({exc})"
        return [_missing("5a", t_pa, "x faster", None, None, why),
                _missing("5b", t_ch, "x faster", ">=", 3.0, why)]
    from .altimetry import pressure_altitude
    from .chain import air_data

    rng = np.random.default_rng([SEED, 1])
    p = _pressures(rng, sz["n"])
    ps, pt, tat = chain_inputs(np.random.default_rng([SEED, 5]), sz["n"])
    best = _alternate({
        "ref_pa": lambda: pressure_altitude(p),
        "port_pa": lambda: cport.pressure_altitude(p),
        "ref_chain": lambda: air_data(ps, pt, tat),
        "port_chain": lambda: cport.air_data(ps, pt, tat),
    }, sz["repeats"])
    return [
        _line("5a", t_pa, best["ref_pa"] / best["port_pa"], "x faster", None, None,
              note="for information", n=sz["n"], reference_s=best["ref_pa"],
              port_s=best["port_pa"]),
        _line("5b", t_ch, best["ref_chain"] / best["port_chain"], "x faster", ">=", 3.0,
              n=sz["n"], reference_s=best["ref_chain"], port_s=best["port_chain"]),
    ]


# --------------------------------------------------------------------------- line 6



def _callgrind_ir(exe: Path, args: list[str], work: Path) -> int:
    """Total instructions (Ir) of one run of ``exe`` under callgrind."""
    out = work / f"cg.{args[0]}.out"
    subprocess.run(["valgrind", "--tool=callgrind", f"--callgrind-out-file={out}", str(exe),
                    *args], check=True, capture_output=True, timeout=300)
    for row in out.read_text().splitlines():
        if row.startswith(("summary:", "totals:")):
            return int(row.split()[1])
    raise RuntimeError("callgrind output without a summary line")


def _callgrind_lines(sz: dict[str, int]) -> list[dict[str, Any]]:
    """Lines 6a and 6b: instructions per call, (Ir(N calls) - Ir(baseline)) / N."""
    t_ch = "C port ad_air_data: instructions per call"
    t_ma = "C port ad_mach_from_impact_pressure, supersonic: instr. per call"
    why = ""
    if shutil.which("valgrind") is None:
        why = "valgrind not installed"
    elif shutil.which("cc") is None:
        why = "no C compiler (cc)"
    if why:
        return [_missing("6a", t_ch, "instr/call", "<", 1500.0, why),
                _missing("6b", t_ma, "instr/call", None, None, why)]
    n = sz["callgrind"]
    ps, pt, tat = chain_inputs(np.random.default_rng([SEED, 5]), n)
    rng = np.random.default_rng([SEED, 1])
    _pressures(rng, sz["n"])
    qc, pss = _supersonic(rng, sz["n"])
    with tempfile.TemporaryDirectory(prefix="airdata-bench-") as tmp:
        work = Path(tmp)
        exe = work / "driver"
        from . import resources

        srcs = sorted(str(s) for s in resources.src_dir().glob("*.c"))
        # -ffp-contract=off: the port's double-double arithmetic needs it (src/ad_dd.h).
        cmd = ["cc", "-std=c99", "-O2", "-ffp-contract=off", f"-I{resources.include_dir()}",
               str(resources.c_dir() / "tests" / "bench_driver.c"),
               *srcs, "-o", str(exe), "-lm"]
        comp = subprocess.run(cmd, capture_output=True, text=True, timeout=300)
        if comp.returncode != 0:
            errs = [r for r in comp.stderr.splitlines() if "error" in r] or ["?"]
            why = "driver did not compile: " + errs[0][-140:]
            return [_missing("6a", t_ch, "instr/call", "<", 1500.0, why),
                    _missing("6b", t_ma, "instr/call", None, None, why)]
        chain_file = work / "chain.bin"
        chain_file.write_bytes(np.concatenate([ps, pt, tat]).astype("<f8").tobytes())
        mach_file = work / "mach.bin"
        mach_file.write_bytes(np.concatenate([qc[:n], pss[:n], pss[:n]]).astype("<f8")
                              .tobytes())
        base_c = _callgrind_ir(exe, ["0", str(chain_file), str(n)], work)
        chain = _callgrind_ir(exe, ["1", str(chain_file), str(n)], work)
        base_m = _callgrind_ir(exe, ["0", str(mach_file), str(n)], work)
        mach = _callgrind_ir(exe, ["2", str(mach_file), str(n)], work)
    flags = "cc -std=c99 -O2 -lm"
    return [
        _line("6a", t_ch, (chain - base_c) / n, "instr/call", "<", 1500.0,
              calls=n, compiler=flags, inputs="chain envelope of line 5 (first N samples)"),
        _line("6b", t_ma, (mach - base_m) / n, "instr/call", None, None,
              note="for information", calls=n, compiler=flags,
              inputs="supersonic points of line 2 (first N)"),
    ]


# --------------------------------------------------------------------------- lines 7, 8

#: Read by every child at its end: its own peak resident set, KiB.  VmHWM belongs to
#: the child's address space since its exec; ``ru_maxrss`` of a forked child would also
#: count the parent's resident set at the fork (Linux keeps it across exec), so it is
#: only the fallback where /proc is missing.
_PEAK = """
def _peak_kib():
    try:
        with open("/proc/self/status", encoding="ascii") as f:
            for row in f:
                if row.startswith("VmHWM:"):
                    return int(row.split()[1]), "VmHWM"
    except OSError:
        pass
    import resource
    return resource.getrusage(resource.RUSAGE_SELF).ru_maxrss, "ru_maxrss"
"""

_SUITE_CHILD = _PEAK + """
import json, sys, tempfile, time
t0 = time.perf_counter()
from airdata.vectors.build import build_suite
t1 = time.perf_counter()
with tempfile.TemporaryDirectory(prefix="airdata-bench-") as d:
    totals = build_suite(d)
t2 = time.perf_counter()
peak, how = _peak_kib()
print(json.dumps({"import_s": t1 - t0, "build_s": t2 - t1, "totals": totals,
                  "peak_kib": peak, "peak_from": how}))
"""

_CHUNK_CHILD = _PEAK + """
import json, sys
import numpy as np
from airdata.bench import SEED, chain_inputs
from airdata.chain import air_data
total, chunk = int(sys.argv[1]), int(sys.argv[2])
acc, done, k = 0.0, 0, 0
while done < total:
    m = min(chunk, total - done)
    ps, pt, tat = chain_inputs(np.random.default_rng([SEED, 8, k]), m)
    out = air_data(ps, pt, tat)
    acc += float(np.sum(out.mach))
    done += m
    k += 1
peak, how = _peak_kib()
print(json.dumps({"samples": done, "chunks": k, "mach_sum": acc, "peak_kib": peak,
                  "peak_from": how}))
"""


def _run_child(code: str, *args: str) -> tuple[dict[str, Any], float]:
    """Run a Python child; its JSON answer (with its own ``peak_kib``) and wall seconds."""
    t0 = time.perf_counter()
    proc = subprocess.run([sys.executable, "-c", code, *args], capture_output=True,
                          text=True, timeout=600)
    wall = time.perf_counter() - t0
    if proc.returncode != 0:
        raise RuntimeError(f"child failed: {proc.stderr.strip()[-300:]}")
    return json.loads(proc.stdout.strip().splitlines()[-1]), wall


def _suite_lines() -> list[dict[str, Any]]:
    """Lines 7a and 7b: the whole vector suite built into a temporary directory."""
    ans, wall = _run_child(_SUITE_CHILD)
    peak = int(ans["peak_kib"])
    mb = peak / 1024.0
    return [
        _line("7a", "vector suite build: seconds (child process, import included)", wall,
              "s", "<", 30.0, build_only_s=ans["build_s"], import_s=ans["import_s"],
              cases=ans["totals"]["cases"], bytes=ans["totals"]["bytes"]),
        _line("7b", "vector suite build: peak resident memory", mb, "MB", "<", 500.0,
              peak_kib=peak, peak_from=ans["peak_from"]),
    ]


def _chunk_line(sz: dict[str, int]) -> dict[str, Any]:
    """Line 8: peak RSS of the chunked chain at N and 10 N samples."""
    small, large, chunk = sz["chain_small"], sz["chain_large"], sz["chunk"]
    a_small, w_small = _run_child(_CHUNK_CHILD, str(small), str(chunk))
    a_large, w_large = _run_child(_CHUNK_CHILD, str(large), str(chunk))
    p_small, p_large = int(a_small["peak_kib"]), int(a_large["peak_kib"])
    if a_small["samples"] != small or a_large["samples"] != large:
        raise RuntimeError("chunked chain child processed the wrong number of samples")
    return _line("8", f"air_data in chunks: peak memory {large:.0e} / {small:.0e} samples",
                 p_large / p_small, "x", "<=", FLAT_LIMIT,
                 note=f"{p_small / 1024:.0f} MB vs {p_large / 1024:.0f} MB",
                 chunk=chunk, small_samples=small, large_samples=large,
                 small_peak_kib=p_small, large_peak_kib=p_large, small_wall_s=w_small,
                 large_wall_s=w_large, peak_from=a_large["peak_from"])


def _reduce_lines(sz: dict[str, int]) -> list[dict[str, Any]]:
    """Lines 9a/9b: ``airdata reduce`` (CSV and Parquet out) / pyarrow read + write."""
    import pyarrow.csv  # noqa: F401  (ImportError: pyarrow missing, the lines are not measured)

    demo = Path(__file__).resolve().parents[1] / "examples" / "demo_flight.csv"
    if not demo.is_file():
        raise FileNotFoundError(f"{demo} (the demo sortie) is not installed")
    header, *body = demo.read_text(encoding="utf-8").splitlines()
    n = sz["reduce_rows"]
    with tempfile.TemporaryDirectory() as tmp:
        src = Path(tmp) / "in.csv"
        with open(src, "w", encoding="utf-8") as f:
            f.write(header + "\n")
            full, rest = divmod(n, len(body))
            f.write(("\n".join(body) + "\n") * full)
            f.write("\n".join(body[:rest]) + ("\n" if rest else ""))
        # Both sides are whole processes (interpreter start and imports included),
        # timed alternately; the median of ROUNDS runs each.
        floor_cmd = [sys.executable, "-c",
                     "import sys, pyarrow.csv as c; c.write_csv(c.read_csv(sys.argv[1]), "
                     "sys.argv[2])", str(src), str(Path(tmp) / "floor.csv")]
        cmds = {"floor": floor_cmd}
        for ext in (".csv", ".parquet"):
            cmds[ext] = [sys.executable, "-m", "airdata", "reduce", str(src), "-o",
                         str(Path(tmp) / f"out{ext}"), "-q"]
        best = _alternate({k: (lambda c=c: subprocess.run(c, check=True,
                                                         capture_output=True))
                           for k, c in cmds.items()}, 1)
        floor = best["floor"]
        lines = []
        for key, ext in (("9a", ".csv"), ("9b", ".parquet")):
            wall = best[ext]
            lines.append(_line(key, f"reduce {n:.0e} rows CSV -> {ext[1:]} / pyarrow "
                                    "CSV read + write", wall / floor, "x floor", "<=", 2.0,
                               note=f"{wall:.2f} s vs {floor:.2f} s; "
                                    f"{n / wall:,.0f} rows/s", rows=n, reduce_s=wall,
                               floor_s=floor))
    return lines


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
    from .altimetry import pressure_altitude
    from .atmosphere import atmosphere
    from .profiles import get_profile

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


# --------------------------------------------------------------------------- driver

def _machine() -> dict[str, Any]:
    """What the figures were measured on."""
    cpu = platform.processor() or platform.machine()
    try:
        with open("/proc/cpuinfo", encoding="utf-8") as f:
            for row in f:
                if row.startswith("model name"):
                    cpu = row.split(":", 1)[1].strip()
                    break
    except OSError:
        pass
    return {"cpu": cpu, "cores": os.cpu_count(), "system": platform.platform(),
            "python": platform.python_version(), "numpy": np.__version__,
            "loadavg_start": list(os.getloadavg())}


def _guard(key: str, title: str, unit: str, op: str | None, goal: float | None,
           fn: Callable[[], Any]) -> list[dict[str, Any]]:
    """Run one measurement; a failure becomes a "not measured" line, not a crash."""
    try:
        got = fn()
    except Exception as exc:  # noqa: BLE001 - report every failure in the table
        return [_missing(key, title, unit, op, goal, f"{type(exc).__name__}: {exc}"[:160])]
    return got if isinstance(got, list) else [got]


def run_bench(quick: bool = False, progress: Callable[[str], None] | None = None
              ) -> dict[str, Any]:
    """Run every measurement once; the report as a JSON-ready dict.

    Parameters
    ----------
    quick : bool, optional
        Use the small sizes of ``SIZES["quick"]`` (a run of well under 30 s).
    progress : callable, optional
        Called with a short message before each group of lines.

    Returns
    -------
    dict
        ``lines`` (one dict per report line: key, title, value, unit, goal, met,
        measured, note, details), ``histogram`` (solver steps), ``machine``, ``sizes``,
        ``seed``, ``quick`` and ``seconds`` (the run's wall time).
    """
    say = progress or (lambda _msg: None)
    sz = SIZES["quick" if quick else "full"]
    t0 = time.perf_counter()
    machine = _machine()
    lines: list[dict[str, Any]] = []
    hist: dict[str, Any] = {}

    def lines_1_2() -> list[dict[str, Any]]:
        got, h = _floor_and_reference(sz)
        hist.update(h)
        return got

    say("lines 1-2: reference against the exp(log(p)) floor; solver histogram")
    got = _guard("1", "pressure_altitude / floor", "x floor", "<=", 2.0, lines_1_2)
    if len(got) == 1:  # failed: line 2 is missing too
        got.append(_missing("2", "supersonic mach / floor", "x floor", "<=", 6.0,
                            got[0]["note"][len("not measured: "):]))
    lines += got
    say("line 3: atmosphere against fluids")
    lines += _guard("3", "atmosphere / fluids", "x faster", ">=", 50.0,
                    lambda: _fluids_line(sz))
    say("line 4: supersonic inversion against brentq")
    lines += _guard("4", "inversion / brentq", "x faster", ">=", 250.0,
                    lambda: _brentq_line(sz))
    say("line 5: C port against the reference")
    lines += _guard("5", "C port / reference", "x faster", ">=", 3.0,
                    lambda: _port_lines(sz))
    say("line 6: callgrind instruction counts")
    lines += _guard("6", "C port instructions", "instr/call", "<", 1500.0,
                    lambda: _callgrind_lines(sz))
    say("line 7: vector suite build")
    lines += _guard("7", "vector suite build", "s", "<", 30.0, _suite_lines)
    say("line 8: chunked chain memory")
    lines += _guard("8", "chunked chain memory", "x", "<=", FLAT_LIMIT,
                    lambda: _chunk_line(sz))
    say("line 9: reduce against pyarrow read + write")
    got = _guard("9a", "reduce / pyarrow read + write", "x floor", "<=", 2.0,
                 lambda: _reduce_lines(sz))
    if len(got) == 1:
        got.append(_missing("9b", "reduce to Parquet / pyarrow read + write", "x floor",
                            "<=", 2.0, got[0]["note"][len("not measured: "):]))
    lines += got
    say("line 10: scalar calls")
    got = _guard("10a", "scalar pressure_altitude / pure Python", "x", "<=", 3.0,
                 lambda: _scalar_lines(sz))
    if len(got) == 1:
        got.append(_missing("10b", "scalar atmosphere / fluids", "x faster", ">=", 1.0,
                            got[0]["note"][len("not measured: "):]))
    lines += got
    machine["loadavg_end"] = list(os.getloadavg())
    return {"tool": "airdata bench", "version": _version(), "quick": quick, "seed": SEED,
            "sizes": dict(sz), "machine": machine, "lines": lines, "histogram": hist,
            "seconds": time.perf_counter() - t0}


def _version() -> str:
    from . import __version__

    return __version__


def _fmt(v: float | None, unit: str) -> str:
    if v is None:
        return "-"
    if unit in ("instr/call",):
        return f"{v:,.0f}"
    if abs(v) >= 100:
        return f"{v:,.0f}"
    return f"{v:.2f}"


def format_table(report: dict[str, Any]) -> str:
    """The report as a plain-text table (one row per line, then the histogram)."""
    rows = []
    head = ("#", "measurement", "value", "unit", "goal", "verdict")
    for ln in report["lines"]:
        goal = "-" if ln["goal"] is None else f"{ln['goal']['op']} {ln['goal']['limit']:g}"
        verdict = {True: "met", False: "NOT MET", None: "info"}[ln["met"]]
        if not ln["measured"]:
            verdict = "skipped"
        rows.append((ln["key"], ln["title"], _fmt(ln["value"], ln["unit"]), ln["unit"], goal,
                     verdict))
    widths = [max(len(str(r[i])) for r in [head, *rows]) for i in range(len(head))]
    out = []
    m = report["machine"]
    out.append(f"airdata {report['version']} bench{' --quick' if report['quick'] else ''}: "
               f"seed {report['seed']}, n = {report['sizes']['n']:,}, "
               f"median of {ROUNDS} rounds of the best of {report['sizes']['repeats']}")
    out.append(f"machine: {m['cpu']}, {m['cores']} cores, Python {m['python']}, "
               f"numpy {m['numpy']}; load average {m['loadavg_start'][0]:.2f} at start, "
               f"{m.get('loadavg_end', [float('nan')])[0]:.2f} at end")
    fmt = "  ".join(f"{{:{'>' if i in (2,) else '<'}{w}}}" for i, w in enumerate(widths))
    out.append(fmt.format(*head))
    out.append("  ".join("-" * w for w in widths))
    for r in rows:
        out.append(fmt.format(*r))
    notes = [f"  {ln['key']}: {ln['note']}" for ln in report["lines"]
             if ln["note"] and ln["note"] != "for information"]
    if notes:
        out.append("notes:")
        out += notes
    h = report["histogram"]
    if h:
        counts = ", ".join(f"{k}: {v}" for k, v in h["counts"].items())
        out.append(f"supersonic solver, Newton steps needed over {h['samples']:,} points "
                   f"(shipped {h['shipped_steps']}): {counts}")
    met = sum(1 for ln in report["lines"] if ln["met"] is True)
    goals = sum(1 for ln in report["lines"] if ln["goal"] is not None)
    out.append(f"goals met: {met} of {goals}; run took {report['seconds']:.1f} s")
    return "\n".join(out)


def _cmd_bench(args: argparse.Namespace) -> int:
    def say(msg: str) -> None:
        print(f"bench: {msg}", file=sys.stderr, flush=True)

    report = run_bench(quick=args.quick, progress=None if args.silent else say)
    print(format_table(report))
    if args.json:
        text = json.dumps(report, indent=1, allow_nan=False) + "\n"
        if args.json == "-":
            sys.stdout.write(text)
        else:
            Path(args.json).write_text(text, encoding="utf-8")
    return 0


def register(subparsers: Any) -> None:
    """Add the ``bench`` sub-command to the ``airdata`` parser."""

    p = subparsers.add_parser(
        "bench", help="measure speed and memory of the reference and the C port",
        description="Time the reference against its floors and peers and the C port "
                    "against the reference, as ratios measured side by side in one run "
                    "on the same seeded inputs; count the port's instructions with "
                    "callgrind; measure vector-suite build time and peak memory.",
        epilog=CAUTION)
    p.add_argument("--quick", action="store_true",
                   help="smaller sizes (about 1e5 points): a run of well under 30 s")
    p.add_argument("--json", metavar="FILE", default=None,
                   help="also write the report as JSON to FILE ('-' for stdout)")
    p.add_argument("--silent", action="store_true", help="no progress messages on stderr")
    p.set_defaults(func=_cmd_bench)
