"""Lines 7 to 9: whole processes (the suite build, chunked memory, ``airdata reduce``
against pyarrow)."""

from __future__ import annotations

import json
import subprocess
import sys
import tempfile
import time
from pathlib import Path
from typing import Any

from .common import FLAT_LIMIT, _alternate, _line

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

    from .. import resources

    demo = resources.REPOSITORY / "examples" / "demo_flight.csv"
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
