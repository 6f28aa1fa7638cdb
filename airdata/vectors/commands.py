"""The ``airdata vectors`` sub-commands: build, verify, diff."""

from __future__ import annotations

import argparse
import sys
import time
from typing import Any

from ..profiles import PROFILES

__all__ = ["register", "cmd_build", "cmd_verify", "cmd_diff", "cmd_export"]

_CAUTION = ("An engineering and verification aid, not certified flight software; "
            "flight software follows its own certification basis.")

#: Problems printed before the rest are only counted.
MAX_PRINTED = 50


def cmd_build(args: argparse.Namespace) -> int:
    """``airdata vectors build``: write a suite; prints a one-line summary."""
    from .build import SUITE_VERSION, build_suite

    t0 = time.perf_counter()
    totals = build_suite(args.out, args.profile)
    dt = time.perf_counter() - t0
    print(f"wrote vector suite {SUITE_VERSION} (profile {args.profile}) to {args.out}: "
          f"{totals['functions']} functions, {totals['cases']} cases ({totals['valid']} valid, "
          f"{totals['invalid']} invalid), {totals['bytes'] / 1e6:.1f} MB in {dt:.1f} s")
    return 0


def cmd_verify(args: argparse.Namespace) -> int:
    """``airdata vectors verify``: 0 when the suite is sound, 1 otherwise."""
    from .verify import verify_suite

    report = verify_suite(args.dir, recompute=not args.no_recompute, exact=args.exact)
    for p in report.problems[:MAX_PRINTED]:
        print(f"error: {args.dir}/{p}", file=sys.stderr)
    if len(report.problems) > MAX_PRINTED:
        print(f"error: ... and {len(report.problems) - MAX_PRINTED} more problem(s)",
              file=sys.stderr)
    print(report.summary(), file=sys.stdout if report.ok else sys.stderr)
    return 0 if report.ok else 1


def cmd_diff(args: argparse.Namespace) -> int:
    """``airdata vectors diff``: 0 when NEW's version makes the bump its changes need."""
    from .diff import diff_suites

    d = diff_suites(args.old, args.new)
    if d.problems:
        for p in d.problems[:MAX_PRINTED]:
            print(f"error: {p}", file=sys.stderr)
        return 1
    print(d.render())
    return 0 if d.sufficient else 1


def cmd_export(args: argparse.Namespace) -> int:
    """``airdata vectors export``: 0 when written, 2 when the suite cannot be read."""
    from pathlib import Path

    from ..portcheck.suite import SuiteError
    from .export import export_cases

    try:
        text, n = export_cases(args.suite, args.precision, args.only, args.format,
                               args.numbers)
    except (SuiteError, ValueError) as exc:
        print(f"airdata vectors export: error: {exc}", file=sys.stderr)
        return 2
    Path(args.out).write_text(text, encoding="ascii", newline="\n")
    print(f"exported {n} cases ({args.precision}, {args.format}) to {args.out}")
    return 0


def register(subparsers: Any) -> None:
    """Add the ``vectors`` parser and its sub-commands."""
    vec = subparsers.add_parser(
        "vectors", help="build, verify and compare golden test vector suites",
        description="Golden test vectors of every catalogue function: build a suite from "
                    "the reference, verify one, or compare two.", epilog=_CAUTION)
    sub = vec.add_subparsers(dest="vectors_command", metavar="ACTION")
    sub.required = True
    b = sub.add_parser("build", help="write a complete suite from the reference",
                       description="Write manifest, JSON files, schemas, C headers and "
                                   "changelog. Deterministic: byte-identical every time.",
                       epilog=_CAUTION)
    b.add_argument("--out", default="vectors", metavar="DIR",
                   help="output directory (default: ./vectors)")
    b.add_argument("--profile", choices=sorted(PROFILES), default="icao",
                   help="constants profile (default: icao)")
    b.set_defaults(func=cmd_build)
    v = sub.add_parser("verify", help="check a suite: checksums, schema, C headers, values",
                       description="Check checksums, schemas and C headers, and re-compute "
                                   "every expected value with the installed reference. "
                                   "Values that differ in the last bits, within half the "
                                   "acceptance bound (a different numpy or libm build), are "
                                   "counted and accepted unless --exact is given. Exit "
                                   "status 1 on any problem.",
                       epilog=_CAUTION)
    v.add_argument("dir", nargs="?", default="vectors", metavar="DIR",
                   help="suite directory (default: ./vectors)")
    v.add_argument("--no-recompute", action="store_true",
                   help="skip re-computing the expected values")
    v.add_argument("--exact", action="store_true",
                   help="require every re-computed value to equal the expected one bit for "
                        "bit (the staleness check of the suite's own repository)")
    v.set_defaults(func=cmd_verify)
    d = sub.add_parser("diff", help="compare two suites and check the version bump",
                       description="Per function: cases added, removed, changed beyond "
                                   "tolerance; the bump the change needs (major/minor/patch) "
                                   "and whether NEW's version makes it (exit status 1 if not).",
                       epilog=_CAUTION)
    d.add_argument("old", metavar="OLD")
    d.add_argument("new", metavar="NEW")
    d.set_defaults(func=cmd_diff)
    e = sub.add_parser("export", help="write every case as a flat text stream for any port",
                       description="Write every valid and invalid case (id, function, "
                                   "inputs as C99 hex floats of the chosen precision) as "
                                   "an airdata-cases text file or CSV (docs/exchange.md). "
                                   "Deterministic. Exit status 2 when the suite cannot be "
                                   "read.", epilog=_CAUTION)
    e.add_argument("--suite", default="vectors", metavar="DIR",
                   help="vector suite directory (default: ./vectors)")
    e.add_argument("--precision", choices=["double", "single"], default="double",
                   help="binary64 (double, default) or binary32 (single) inputs")
    e.add_argument("--only", nargs="+", metavar="FUNC", help="export only these functions")
    e.add_argument("--format", choices=["lines", "csv"], default="lines",
                   help="line format (default) or CSV")
    e.add_argument("--numbers", choices=["hex", "decimal"], default="hex",
                   help="number form of the line format (default hex; CSV has both)")
    e.add_argument("-o", "--out", required=True, metavar="FILE", help="output file")
    e.set_defaults(func=cmd_export)
