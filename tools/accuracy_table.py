#!/usr/bin/env python3
"""Print the accuracy table of airdata as markdown, for the README.

For every public function, constants profile and output: the number of sample points,
the largest condition-scaled error (docs/conventions.md section 3) against the
50-digit mpmath oracle of tests/oracle.py, and the input where it occurs.  The samples
are those of tests/test_accuracy.py (deterministic, seeded), so the figures printed
with ``--points N`` are what ``AIRDATA_ACCURACY_POINTS=N pytest tests/test_accuracy.py``
asserts.

Usage::

    python tools/accuracy_table.py --points 3000
    python tools/accuracy_table.py --points 500 --only atmosphere air_data
"""

from __future__ import annotations

import argparse
import math
import sys
import time
from pathlib import Path

sys.path.insert(0, str(Path(__file__).resolve().parent.parent / "tests"))

import test_accuracy as acc  # noqa: E402  (needs the tests directory on sys.path)


def _fmt(x: float) -> str:
    return f"{x:.6g}" if math.isfinite(x) else str(x)


def main(argv: list[str] | None = None) -> int:
    """Measure every case (or those named with ``--only``) and print the table."""
    ap = argparse.ArgumentParser(description=__doc__.splitlines()[0])
    ap.add_argument("--points", type=int, default=acc.POINTS,
                    help=f"sample points per function and profile (default {acc.POINTS})")
    ap.add_argument("--only", nargs="*", default=None, metavar="FUNCTION",
                    help="measure only these functions (names as in airdata.__all__)")
    ap.add_argument("--progress", action="store_true", help="timings on stderr")
    args = ap.parse_args(argv)

    print(f"Condition-scaled error against the 50-digit mpmath oracle, "
          f"{args.points} points per function and profile (bound {acc.CSE_BOUND:g}).")
    print()
    print("| function | profile | output | points | max cse | worst input |")
    print("|---|---|---|---:|---:|---|")
    worst_all = 0.0
    for cid, case in acc.CASES.items():
        if args.only and case.function not in args.only:
            continue
        t0 = time.perf_counter()
        results = acc.measure(cid, args.points)
        if args.progress:
            print(f"{cid}: {time.perf_counter() - t0:.1f} s", file=sys.stderr)
        for output in case.outputs:
            r = results[output]
            worst_all = max(worst_all, r.max_cse)
            where = ", ".join(f"{k}={v!r}" for k, v in r.inputs.items())
            name = output if output != "value" else "(value)"
            flag = " **over**" if r.max_cse > acc.CSE_BOUND else ""
            print(f"| `{case.function}` | {case.profile or '-'} | {name} | {r.points} "
                  f"| {r.max_cse:.2f}{flag} | {where} |")
    print()
    print(f"Largest: {_fmt(worst_all)}")
    return 0 if worst_all <= acc.CSE_BOUND else 1


if __name__ == "__main__":
    raise SystemExit(main())
