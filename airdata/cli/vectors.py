"""The ``airdata vectors`` sub-commands: build, verify, diff, path, copy.

``verify`` and ``copy`` use the checked-in suite this installation carries (the installed
package's copy, or the repository's folder beside the package: :mod:`airdata.resources`)
unless a directory is named; the working directory is never searched.
"""

from __future__ import annotations

import argparse
import sys
import time
from pathlib import Path
from typing import Any

from .. import resources
from ..notice import CAUTION_SUITE
from ..profiles import PROFILES
from .messages import fail
from .parsers import add_command

__all__ = ["register", "cmd_build", "cmd_verify", "cmd_diff", "cmd_path", "cmd_copy",
           "cmd_export", "located"]

#: Problems printed before the rest are only counted.
MAX_PRINTED = 50


def cmd_build(args: argparse.Namespace) -> int:
    """``airdata vectors build``: write a suite; prints a one-line summary."""
    from ..vectors.build import SUITE_VERSION, build_suite

    if args.out is None:
        args.out = resources.SUITE_FOLDERS[args.profile]
    t0 = time.perf_counter()
    totals = build_suite(args.out, args.profile)
    dt = time.perf_counter() - t0
    print(f"wrote vector suite {SUITE_VERSION} (profile {args.profile}) to {args.out}: "
          f"{totals['functions']} functions, {totals['cases']} cases ({totals['valid']} valid, "
          f"{totals['invalid']} invalid), {totals['bytes'] / 1e6:.1f} MB in {dt:.1f} s")
    return 0


def cmd_verify(args: argparse.Namespace) -> int:
    """``airdata vectors verify``: 0 when the suite is sound, 1 otherwise."""
    from ..vectors.verify import Problem, verify_suite

    try:
        root = _suite(args.dir, args.profile)
    except (resources.ResourceError, ValueError) as exc:
        return fail("vectors verify", str(exc), 2)
    report = verify_suite(root, recompute=not args.no_recompute, exact=args.exact)
    if args.profile is not None and report.profile not in ("?", args.profile):
        report.problems.append(Problem(".", None, f"the suite has profile {report.profile!r}, "
                                                  f"not {args.profile!r}"))
    for p in report.problems[:MAX_PRINTED]:
        print(f"error: {located(root, p)}", file=sys.stderr)
    if len(report.problems) > MAX_PRINTED:
        print(f"error: ... and {len(report.problems) - MAX_PRINTED} more problem(s)",
              file=sys.stderr)
    print(report.summary(), file=sys.stdout if report.ok else sys.stderr)
    return 0 if report.ok else 1


def _suite(named: str | None, profile: str | None) -> Path:
    """The directory the user named, else the checked-in suite of ``profile``."""
    if named is not None:
        return Path(named)
    return resources.suite_dir(profile or "icao")


def located(root: str | Path, problem: Any) -> str:
    """``problem`` (a :class:`~airdata.vectors.verify.Problem`, whose file is relative to
    the suite root, ``"."`` for the root itself) with the file joined to ``root`` once."""
    from ..vectors.verify import Problem

    rel = str(problem.file)
    where = Path(root) if rel in ("", ".") else Path(root) / rel
    return str(Problem(str(where), problem.case, problem.message))


def cmd_path(args: argparse.Namespace) -> int:
    """``airdata vectors path``: where the checked-in suites are."""
    try:
        if args.profile is not None:
            print(resources.suite_dir(args.profile))
            return 0
        rows = [(name, resources.suite_dir(name)) for name in sorted(resources.SUITE_FOLDERS)]
        rows += [("headers", resources.include_dir()), ("port", resources.src_dir()),
                 ("runner", resources.runner_dir())]
    except (resources.ResourceError, ValueError) as exc:
        return fail("vectors path", str(exc), 2)
    print(f"# {resources.origin()}: {resources.data_root()}")
    for name, path in rows:
        print(f"{name:<8} {path}")
    return 0


def cmd_copy(args: argparse.Namespace) -> int:
    """``airdata vectors copy DIR``: the suite's C headers into a firmware tree."""
    from .copy import report_copy

    try:
        root = _suite(args.suite, args.profile)
        c = root / "c"
        if not c.is_dir():
            raise resources.ResourceError(f"{c}: no C headers here (not a directory)")
        files = [(p, p.name) for p in sorted(c.glob("*.h"))]
        if not files:
            raise resources.ResourceError(f"{c}: no C headers (*.h) in it")
    except (resources.ResourceError, ValueError) as exc:
        return fail("vectors copy", str(exc), 2)
    return report_copy("vectors copy", files, args.dir, args.force,
                       f"the C headers of the vector suite {root}")


def cmd_diff(args: argparse.Namespace) -> int:
    """``airdata vectors diff``: 0 when NEW's version makes the bump its changes need."""
    from ..vectors.diff import diff_suites

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
    from ..vectors.export import export_cases

    try:
        text, n = export_cases(args.suite, args.precision, args.only, args.format,
                               args.numbers)
    except (SuiteError, ValueError) as exc:
        return fail("vectors export", str(exc), 2)
    Path(args.out).write_text(text, encoding="ascii", newline="\n")
    print(f"exported {n} cases ({args.precision}, {args.format}) to {args.out}")
    return 0


def register(subparsers: Any) -> None:
    """Add the ``vectors`` parser and its sub-commands."""
    vec = add_command(subparsers, "vectors", epilog=CAUTION_SUITE)
    sub = vec.add_subparsers(dest="vectors_command", metavar="ACTION")
    sub.required = True
    b = add_command(sub, "vectors build", epilog=CAUTION_SUITE)
    b.add_argument("--out", default=None, metavar="DIR",
                   help="output directory (default: ./vectors for icao, ./vectors-us1976 "
                        "for us1976: the checked-in suites, when run in the repository root)")
    b.add_argument("--profile", choices=sorted(PROFILES), default="icao",
                   help="constants profile (default: icao)")
    b.set_defaults(func=cmd_build)
    v = add_command(sub, "vectors verify", epilog=CAUTION_SUITE)
    v.add_argument("dir", nargs="?", default=None, metavar="DIR",
                   help="suite directory (default: the checked-in suite of --profile that "
                        "this installation carries; see 'airdata vectors path')")
    v.add_argument("--profile", choices=sorted(resources.SUITE_FOLDERS), default=None,
                   help="which checked-in suite to verify (default: icao); with DIR, the "
                        "profile the suite must have")
    v.add_argument("--no-recompute", action="store_true",
                   help="skip re-computing the expected values")
    v.add_argument("--exact", action="store_true",
                   help="require every re-computed value to equal the expected one bit for "
                        "bit (the staleness check of the suite's own repository)")
    v.set_defaults(func=cmd_verify)
    d = add_command(sub, "vectors diff", epilog=CAUTION_SUITE)
    d.add_argument("old", metavar="OLD")
    d.add_argument("new", metavar="NEW")
    d.set_defaults(func=cmd_diff)
    pa = add_command(sub, "vectors path", epilog=CAUTION_SUITE)
    pa.add_argument("--profile", choices=sorted(resources.SUITE_FOLDERS), default=None,
                    help="print only this profile's suite directory")
    pa.set_defaults(func=cmd_path)
    cp = add_command(sub, "vectors copy", epilog=CAUTION_SUITE)
    cp.add_argument("dir", metavar="DIR", help="destination directory (made if missing)")
    cp.add_argument("--profile", choices=sorted(resources.SUITE_FOLDERS), default=None,
                    help="which checked-in suite (default: icao)")
    cp.add_argument("--suite", default=None, metavar="SUITE",
                    help="copy the headers of this suite directory instead")
    cp.add_argument("--force", action="store_true", help="overwrite existing files")
    cp.set_defaults(func=cmd_copy)
    e = add_command(sub, "vectors export", epilog=CAUTION_SUITE)
    e.add_argument("--suite", default=None, metavar="DIR",
                   help="vector suite directory (default: the installed icao suite)")
    e.add_argument("--precision", choices=["double", "single"], default="double",
                   help="binary64 (double, default) or binary32 (single) inputs")
    e.add_argument("--only", nargs="+", metavar="FUNC", help="export only these functions")
    e.add_argument("--format", choices=["lines", "csv"], default="lines",
                   help="line format (default) or CSV")
    e.add_argument("--numbers", choices=["hex", "decimal"], default="hex",
                   help="number form of the line format (default hex; CSV has both)")
    e.add_argument("-o", "--out", required=True, metavar="FILE", help="output file")
    e.set_defaults(func=cmd_export)
