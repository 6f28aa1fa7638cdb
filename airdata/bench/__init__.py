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

import os
import platform
import time
from collections.abc import Callable
from typing import Any

import numpy as np

from .common import FLAT_LIMIT, ROUNDS, SEED, SIZES, _missing, chain_inputs
from .lines_numpy import _brentq_line, _floor_and_reference, _fluids_line
from .lines_port import _callgrind_lines, _port_lines
from .lines_process import _chunk_line, _reduce_lines, _suite_lines
from .lines_scalar import _scalar_lines

__all__ = ["SEED", "SIZES", "chain_inputs", "run_bench", "format_table"]


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


#: One line of the report as it is announced: key, title, unit, goal operator, goal.
_Spec = tuple[str, str, str, str | None, float | None]


def _guard(specs: tuple[_Spec, ...], fn: Callable[[], Any]) -> list[dict[str, Any]]:
    """Run one measurement, which gives the lines ``specs``; a failure makes each of them
    a "not measured" line, not a crash."""
    try:
        got = fn()
    except Exception as exc:  # noqa: BLE001 - report every failure in the table
        why = f"{type(exc).__name__}: {exc}"[:160]
        return [_missing(*spec, why) for spec in specs]
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

    # Each measurement: its progress message, the lines it gives, and the function.
    groups: tuple[tuple[str, tuple[_Spec, ...], Callable[[], Any]], ...] = (
        ("lines 1-2: reference against the exp(log(p)) floor; solver histogram",
         (("1", "pressure_altitude / floor", "x floor", "<=", 2.0),
          ("2", "supersonic mach / floor", "x floor", "<=", 6.0)), lines_1_2),
        ("line 3: atmosphere against fluids",
         (("3", "atmosphere / fluids", "x faster", ">=", 50.0),), lambda: _fluids_line(sz)),
        ("line 4: supersonic inversion against brentq",
         (("4", "inversion / brentq", "x faster", ">=", 250.0),), lambda: _brentq_line(sz)),
        ("line 5: C port against the reference",
         (("5a", "C port pressure_altitude / reference", "x faster", None, None),
          ("5b", "C port chain / reference", "x faster", ">=", 3.0)), lambda: _port_lines(sz)),
        ("line 6: callgrind instruction counts",
         (("6a", "C port chain instructions", "instr/call", "<", 1500.0),
          ("6b", "C port supersonic Mach instructions", "instr/call", None, None)),
         lambda: _callgrind_lines(sz)),
        ("line 7: vector suite build",
         (("7a", "vector suite build: seconds", "s", "<", 30.0),
          ("7b", "vector suite build: peak memory", "MB", "<", 500.0)), _suite_lines),
        ("line 8: chunked chain memory",
         (("8", "chunked chain memory", "x", "<=", FLAT_LIMIT),), lambda: _chunk_line(sz)),
        ("line 9: reduce against pyarrow read + write",
         (("9a", "reduce / pyarrow read + write", "x floor", "<=", 2.0),
          ("9b", "reduce to Parquet / pyarrow read + write", "x floor", "<=", 2.0)),
         lambda: _reduce_lines(sz)),
        ("line 10: scalar calls",
         (("10a", "scalar pressure_altitude / pure Python", "x", "<=", 3.0),
          ("10b", "scalar atmosphere / fluids", "x faster", ">=", 1.0)),
         lambda: _scalar_lines(sz)),
    )
    for message, specs, fn in groups:
        say(message)
        lines += _guard(specs, fn)
    machine["loadavg_end"] = list(os.getloadavg())
    return {"tool": "airdata bench", "version": _version(), "quick": quick, "seed": SEED,
            "sizes": dict(sz), "machine": machine, "lines": lines, "histogram": hist,
            "seconds": time.perf_counter() - t0}


def _version() -> str:
    from .. import __version__

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
