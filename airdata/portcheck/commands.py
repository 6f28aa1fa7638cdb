"""The ``airdata port check`` command.

Exit status: 0 when every checked function passes in every precision, 1 when any case
fails, 2 when the check cannot run (bad suite, port that does not compile or load).

An engineering and verification aid, not certified flight software.
"""

from __future__ import annotations

import argparse
import json
import sys
from pathlib import Path
from typing import Any

from .build import PortBuildError, PortSpec, build_port, bundled_port
from .compare import CheckResult, check_port
from .report import render_text, report_dict
from .suite import SuiteError, load_cases

__all__ = ["register", "cmd_check", "cmd_verify"]

_CAUTION = ("airdata is an engineering and verification aid, not certified flight software. "
            "Flight software follows its own certification basis (for example DO-178C) and "
            "the authority's rules; local regulations and licensed practice take precedence.")


#: The preprocessor switch of the us1976 constants (airdata.h).
_US1976 = "AIRDATA_PROFILE_US1976"


def _define(text: str) -> tuple[str, str | None]:
    name, sep, value = text.partition("=")
    if not name.isidentifier():
        raise argparse.ArgumentTypeError(f"--define {text!r}: expected NAME or NAME=VALUE")
    return name, (value if sep else None)


def _spec(args: argparse.Namespace) -> PortSpec:
    includes = tuple(Path(p) for p in args.include)
    defines = tuple(args.define)
    if args.library:
        return PortSpec(str(args.library), tuple(Path(s) for s in args.source or ()),
                        Path(args.library), includes, defines)
    if args.source:
        srcs = tuple(Path(s) for s in args.source)
        return PortSpec(" ".join(str(s) for s in srcs), srcs, None, includes, defines)
    base = bundled_port()
    return PortSpec(base.label, base.sources, None, includes + base.include_dirs,
                    defines, base.extra_compile_args)


def _precisions(args: argparse.Namespace) -> list[str]:
    if args.precision is None:
        return ["double"] if args.library else ["double", "single"]
    if args.precision == "both":
        if args.library:
            raise ValueError("--library: a prebuilt library has one precision; choose "
                             "--precision double or --precision single")
        return ["double", "single"]
    return [args.precision]


def cmd_check(args: argparse.Namespace) -> int:
    """Run the check; print the table; write the report; return the exit status."""
    try:
        precisions = _precisions(args)
        suite = load_cases(args.suite, args.only or None, args.profile)
        if suite.profile == "us1976" and all(n != _US1976 for n, _ in args.define):
            args.define.append((_US1976, None))
        spec = _spec(args)
    except (SuiteError, PortBuildError, ValueError) as exc:
        print(f"airdata port check: error: {exc}", file=sys.stderr)
        return 2
    functions = list(suite.functions.values())
    results: dict[str, list[CheckResult]] = {}
    for precision in precisions:
        try:
            port = build_port(spec, functions, precision)
        except PortBuildError as exc:
            print(f"airdata port check: error: {exc.what}", file=sys.stderr)
            if exc.output.strip():
                print("compiler or loader output:\n" + exc.output.rstrip(), file=sys.stderr)
            return 2
        try:
            results[precision] = check_port(port, suite)
        finally:
            port.close()
    print(render_text(suite, spec.label, results))
    if args.report:
        doc: dict[str, Any] = report_dict(suite, spec.label, [str(s) for s in spec.sources],
                                          results)
        Path(args.report).write_text(json.dumps(doc, indent=1) + "\n")
        print(f"report written to {args.report}")
    return 0 if all(r.ok for rows in results.values() for r in rows) else 1


def cmd_verify(args: argparse.Namespace) -> int:
    """``port verify``: judge a results file as ``port check`` judges a port."""
    from .results import ResultsError, judge_results, read_results

    try:
        suite = load_cases(args.suite, args.only or None)
        ignored: frozenset[str] = frozenset()
        if args.only:
            full = load_cases(args.suite)
            ignored = frozenset(c for n, fc in full.functions.items()
                                if n not in suite.functions for c in fc.ids)
        parsed = read_results(args.results, suite, ignored)
    except (SuiteError, ResultsError) as exc:
        print(f"airdata port verify: error: {exc}", file=sys.stderr)
        return 2
    precision = args.precision or parsed.precision or "double"
    if args.precision and parsed.precision and args.precision != parsed.precision:
        print(f"airdata port verify: error: {args.results}: the file says precision "
              f"{parsed.precision}, --precision says {args.precision}", file=sys.stderr)
        return 2
    for p in parsed.problems[:50]:
        print(f"{args.results}: {p}")
    if len(parsed.problems) > 50:
        print(f"{args.results}: ... and {len(parsed.problems) - 50} more problem(s)")
    results = {precision: judge_results(suite, parsed, precision)}
    label = f"results file {args.results}"
    print(render_text(suite, label, results))
    if parsed.problems:
        print(f"FAIL: {len(parsed.problems)} problem(s) in the results file (listed above)")
    if args.report:
        doc: dict[str, Any] = report_dict(suite, label, [str(args.results)], results)
        doc["results_file"] = {"path": str(args.results),
                               "problems": [str(p) for p in parsed.problems[:1000]],
                               "problem_count": len(parsed.problems)}
        doc["passed"] = bool(doc["passed"]) and not parsed.problems
        Path(args.report).write_text(json.dumps(doc, indent=1) + "\n")
        print(f"report written to {args.report}")
    ok = all(r.ok for rows in results.values() for r in rows) and not parsed.problems
    return 0 if ok else 1


def register(subparsers: Any) -> None:
    """Add the ``port`` parser and its ``check`` and ``copy`` sub-commands."""
    port = subparsers.add_parser(
        "port", help="check a C port against a golden vector suite",
        description="Check a C port of airdata (the bundled one, or your own sources or "
                    "library implementing airdata.h) against a golden vector suite.",
        epilog=_CAUTION)
    sub = port.add_subparsers(dest="port_command", metavar="ACTION")
    sub.required = True
    c = sub.add_parser(
        "check", help="run every vector through a C port and judge it function by function",
        description="Compile a C port on the fly (cffi), run every case of the suite "
                    "through it and print, per function: cases, passed, worst error in "
                    "units of the bound k * eps * scale, the worst case with its inputs, and "
                    "status mismatches. Without --source/--library the bundled port is "
                    "checked. Exit status 0: all pass; 1: some case failed; 2: the check "
                    "could not run.",
        epilog=_CAUTION)
    c.add_argument("--suite", default=None, metavar="DIR",
                   help="vector suite directory (default: the checked-in suite of --profile "
                        "that this installation carries; see 'airdata vectors path')")
    c.add_argument("--profile", choices=["icao", "us1976"], default=None,
                   help="constants profile: selects the default suite, and the port is "
                        "compiled with -DAIRDATA_PROFILE_US1976 for us1976 (default: the "
                        "suite's profile; icao without --suite)")
    c.add_argument("--precision", choices=["double", "single", "both"], default=None,
                   help="binary64 (double), binary32 (single) or both; default both, or "
                        "double with --library")
    c.add_argument("--source", nargs="+", metavar="FILE.c",
                   help="your port's C sources (they implement airdata.h)")
    c.add_argument("--library", metavar="LIB",
                   help="a prebuilt static (.a) or shared (.so) library implementing "
                        "airdata.h, built for the --precision given")
    c.add_argument("--include", action="append", default=[], metavar="DIR",
                   help="extra include directory (repeatable); the bundled airdata.h is "
                        "searched last")
    c.add_argument("--define", action="append", default=[], type=_define,
                   metavar="NAME[=V]", help="preprocessor definition (repeatable)")
    c.add_argument("--report", metavar="FILE.json", help="write a JSON report")
    c.add_argument("--only", nargs="+", metavar="FUNC",
                   help="check only these functions (reference names, e.g. pressure_altitude)")
    c.set_defaults(func=cmd_check)
    from .copy import register_copy

    register_copy(sub)
    v = sub.add_parser(
        "verify", help="judge a results file written by a port anywhere, as check does",
        description="Read an airdata-results file (docs/exchange.md) written by an "
                    "implementation under test from the cases of 'airdata vectors export', "
                    "and judge it exactly as 'port check' judges a port, with the same "
                    "table. Missing, duplicate, unknown or malformed lines and a truncated "
                    "file are listed with line numbers and fail the verdict. Exit status 0: "
                    "all pass; 1: some case failed or the file has problems; 2: the "
                    "verification could not run.",
        epilog=_CAUTION)
    v.add_argument("results", metavar="RESULTS", help="the results file")
    v.add_argument("--suite", default=None, metavar="DIR",
                   help="vector suite directory (default: the installed icao suite)")
    v.add_argument("--precision", choices=["double", "single"], default=None,
                   help="precision of the port (default: the file's precision line, else "
                        "double)")
    v.add_argument("--only", nargs="+", metavar="FUNC",
                   help="judge only these functions (the results of others are ignored)")
    v.add_argument("--report", metavar="FILE.json", help="write a JSON report")
    v.set_defaults(func=cmd_verify)
