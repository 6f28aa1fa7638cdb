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

__all__ = ["register", "cmd_check"]

_CAUTION = ("airdata is an engineering and verification aid, not certified flight software. "
            "Flight software follows its own certification basis (for example DO-178C) and "
            "the authority's rules; local regulations and licensed practice take precedence.")


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
        suite = load_cases(args.suite, args.only or None)
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


def register(subparsers: Any) -> None:
    """Add the ``port`` parser and its ``check`` sub-command."""
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
    c.add_argument("--suite", default="vectors", metavar="DIR",
                   help="vector suite directory (default: ./vectors)")
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
    from .coverage import add_parser as _add_coverage

    _add_coverage(sub, _define, _CAUTION)
