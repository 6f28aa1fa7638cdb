"""The ``airdata port check`` command.

Exit status: 0 when every checked function passes in every precision, 1 when any case
fails, 2 when the check cannot run (bad suite, port that does not compile or load).

An engineering and verification aid, not certified flight software.
"""

from __future__ import annotations

import argparse
import json
import sys
from collections.abc import Sequence
from pathlib import Path
from typing import Any

from ..notice import CAUTION
from ..portcheck.build import PortBuildError, PortSpec, build_port, bundled_port
from ..portcheck.evidence import (
    environment,
    render_summary,
    report_json,
    write_failures,
    write_junit,
)
from ..portcheck.page import write_html, write_plots
from ..portcheck.requirements import RequirementsError, load_requirements
from ..portcheck.suite import FunctionCases, LoadedSuite, SuiteError, load_cases
from ..portcheck.verdict import PRECISION_LABEL, Report, judge
from ..vectors.catalogue import CATALOGUE
from .messages import fail
from .parsers import add_command, add_compile_options

_CATALOGUE_NAMES = {s.name for s in CATALOGUE}

__all__ = ["register", "cmd_check", "cmd_verify"]

#: The preprocessor switch of the us1976 constants (airdata.h).
_US1976 = "AIRDATA_PROFILE_US1976"


def add_report_options(parser: argparse.ArgumentParser) -> None:
    """Add --requirements, --report, --junit, --html, --failures and --plot to ``parser``.

    The values are read by :func:`write_outputs`; ``--requirements`` by the caller
    (:func:`airdata.portcheck.requirements.load_requirements`).
    """
    parser.add_argument("--requirements", metavar="FILE.toml",
                        help="judge against these accuracy requirements (engineering units "
                             "over an envelope, docs/requirements.md); without it the "
                             "reference-equivalent roundoff bound decides")
    parser.add_argument("--report", metavar="FILE.json",
                        help="write the JSON evidence report (schema: "
                             "airdata/portcheck/report.schema.json)")
    parser.add_argument("--junit", metavar="FILE.xml",
                        help="write JUnit XML, one test case per function and output")
    parser.add_argument("--html", metavar="FILE.html",
                        help="write one self-contained HTML evidence page")
    parser.add_argument("--failures", metavar="FILE.csv",
                        help="write every failing case as CSV (no cap)")
    parser.add_argument("--plot", metavar="DIR",
                        help="write error-over-envelope plots per function and output "
                             "(needs matplotlib: pip install airdata[plot])")


def write_outputs(args: argparse.Namespace, reports: Sequence[Report],
                  env: dict[str, Any]) -> list[str]:
    """Write every file the options of :func:`add_report_options` ask for; returns
    the lines to print (what was written)."""
    said = []
    if getattr(args, "report", None):
        doc = report_json(reports, env)
        Path(args.report).write_text(json.dumps(doc, indent=1) + "\n", encoding="utf-8")
        said.append(f"report written to {args.report}")
    if getattr(args, "junit", None):
        write_junit(reports, args.junit)
        said.append(f"JUnit XML written to {args.junit}")
    if getattr(args, "failures", None):
        n = write_failures(reports, args.failures)
        said.append(f"{n} failing case row(s) written to {args.failures}")
    if getattr(args, "html", None):
        write_html(reports, env, args.html)
        said.append(f"HTML evidence written to {args.html}")
    if getattr(args, "plot", None):
        paths = write_plots(reports, args.plot)
        said.append(f"{len(paths)} plot(s) written to {args.plot}")
    return said


def add_port_options(parser: argparse._ActionsContainer) -> None:
    """``--source``, ``--library``, ``--include``, ``--define``: the port to compile
    (shared by ``port check`` and ``reduce --compare``)."""
    parser.add_argument("--source", nargs="+", metavar="FILE.c",
                        help="your port's C sources (they implement airdata.h)")
    parser.add_argument("--library", metavar="LIB",
                        help="a prebuilt static (.a) or shared (.so) library implementing "
                             "airdata.h, built for the --precision given")
    add_compile_options(parser)


def port_spec(args: argparse.Namespace) -> PortSpec:
    """The port that ``--source``/``--library``/``--include``/``--define`` name (the
    bundled one without ``--source`` and ``--library``)."""
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


def _declared(args: argparse.Namespace, suite_names: list[str]) -> list[str] | None:
    """Functions the port declares it implements (--implements, --declaration), or None."""
    names: list[str] = list(args.implements or [])
    if args.declaration:
        names += load_declaration(args.declaration)
    if not names and not args.implements and not args.declaration:
        return None
    unknown = [n for n in names if n not in _CATALOGUE_NAMES]
    if unknown:
        raise ValueError(f"declared function(s) {', '.join(unknown)} are not airdata "
                         "functions (use reference names, e.g. pressure_altitude)")
    return [n for n in suite_names if n in names]


def load_declaration(path: str | Path) -> list[str]:
    """``implements = [...]`` of a port declaration file (TOML); errors name the key."""
    import tomllib

    p = Path(path)
    try:
        doc = tomllib.loads(p.read_text(encoding="utf-8"))
    except (OSError, UnicodeDecodeError) as exc:
        raise ValueError(f"{p}: cannot read the port declaration: {exc}") from None
    except tomllib.TOMLDecodeError as exc:
        raise ValueError(f"{p}: not valid TOML: {exc}") from None
    extra = sorted(set(doc) - {"implements", "label", "note"})
    if extra:
        raise ValueError(f"{p}: unknown key {extra[0]!r} in the port declaration (known: "
                         "implements, label, note)")
    impl = doc.get("implements")
    if not isinstance(impl, list) or not impl or not all(isinstance(n, str) for n in impl):
        raise ValueError(f"{p}: key 'implements' must be a non-empty list of function names")
    return [str(n) for n in impl]


def _run(spec: PortSpec, functions: list[FunctionCases], precision: str
         ) -> dict[str, tuple[Any, Any]]:
    port = build_port(spec, functions, precision)
    try:
        return {fc.name: port.run(fc) for fc in functions}
    finally:
        port.close()


def _failing_fraction(suite: LoadedSuite, raw: dict[str, tuple[Any, Any]],
                      precision: str) -> float:
    rep = judge(suite, raw, precision)
    total = sum(f.in_envelope for f in rep.functions if f.implemented)
    bad = sum(f.failed for f in rep.functions if f.implemented)
    return bad / total if total else 0.0


def _precision_mismatch(spec: PortSpec, suite: LoadedSuite, functions: list[FunctionCases],
                        precision: str, raw: dict[str, tuple[Any, Any]]) -> str | None:
    """A library built in the other precision: most cases fail here and pass there."""
    if spec.library is None or not functions:
        return None
    here = _failing_fraction(suite, raw, precision)
    if here < 0.5:
        return None
    other = "double" if precision == "single" else "single"
    try:
        there = _failing_fraction(suite, _run(spec, functions, other), other)
    except PortBuildError:
        return None
    if there > 0.1:
        return None
    return (f"the library {spec.library} looks built in {PRECISION_LABEL[other]} "
            f"(ad_real = {'float' if other == 'single' else 'double'}) but was checked as "
            f"--precision {precision}: {here:.0%} of the cases fail as "
            f"{PRECISION_LABEL[precision]}, {there:.0%} as {PRECISION_LABEL[other]}; "
            f"rerun with --precision {other} (or rebuild the library"
            f"{' with -DAIRDATA_SINGLE' if precision == 'single' else ' without AIRDATA_SINGLE'})")


#: The tag ``--skip-subnormal`` leaves out.
_SUBNORMAL = "subnormal"


def _skip_tags(args: argparse.Namespace) -> tuple[str, ...]:
    """Tags of the cases to leave out at loading (``--skip-subnormal``)."""
    return (_SUBNORMAL,) if getattr(args, "skip_subnormal", False) else ()


def _skip_note(suite: LoadedSuite, env: dict[str, Any]) -> str | None:
    """The line printed for ``--skip-subnormal``; records the counts in ``env``."""
    if not suite.skipped:
        return None
    total = sum(suite.skipped.values())
    env["skipped_cases"] = {"tags": [_SUBNORMAL], "count": total,
                            "per_function": {n: c for n, c in suite.skipped.items() if c}}
    return (f"--skip-subnormal: {total} cases tagged '{_SUBNORMAL}' were not judged (a "
            "target that flushes subnormal numbers to zero)")


def _write_evidence(command: str, args: argparse.Namespace, reports: list[Report],
                    env: dict[str, Any]) -> int:
    """Write the evidence files the options ask for, naming each; 2 if one cannot be
    written (said on stderr), else 0."""
    try:
        for line in write_outputs(args, reports, env):
            print(line)
    except ImportError as exc:
        return fail(command, f"--plot needs matplotlib ({exc}); pip install airdata[plot]", 2)
    except OSError as exc:
        return fail(command, f"cannot write a report: {exc}", 2)
    return 0


def cmd_check(args: argparse.Namespace) -> int:
    """Run the check; print the summary; write the evidence files; return the exit status."""
    try:
        precisions = _precisions(args)
        suite = load_cases(args.suite, args.only or None, args.profile,
                           _skip_tags(args))
        if suite.profile == "us1976" and all(n != _US1976 for n, _ in args.define):
            args.define.append((_US1976, None))
        spec = port_spec(args)
        declared = _declared(args, list(suite.functions))
        req = load_requirements(args.requirements) if args.requirements else None
    except (SuiteError, PortBuildError, RequirementsError, ValueError) as exc:
        return fail("port check", str(exc), 2)
    functions = [fc for fc in suite.functions.values()
                 if declared is None or fc.name in declared]
    reports: list[Report] = []
    env: dict[str, Any] = {}
    for precision in precisions:
        try:
            raw = _run(spec, functions, precision) if functions else {}
            mismatch = _precision_mismatch(spec, suite, functions, precision, raw)
        except PortBuildError as exc:
            print(f"airdata port check: error: {exc.what}", file=sys.stderr)
            if exc.output.strip():
                print("compiler or loader output:\n" + exc.output.rstrip(), file=sys.stderr)
            return 2
        if mismatch:
            return fail("port check", mismatch, 2)
        reports.append(judge(suite, raw, precision, req))
        env = environment(spec, precision)
    print(render_summary(reports, spec.label))
    note = _skip_note(suite, env)
    if note:
        print(note)
    failed = _write_evidence("port check", args, reports, env)
    return failed or (0 if all(r.ok for r in reports) else 1)


def cmd_verify(args: argparse.Namespace) -> int:
    """``port verify``: judge a results file as ``port check`` judges a port."""
    from ..portcheck.results import ResultsError, add_line_numbers, arrays, read_results

    try:
        suite = load_cases(args.suite, args.only or None, skip_tags=_skip_tags(args))
        ignored: frozenset[str] = frozenset()
        if args.only or suite.skipped:
            # Lines of the functions not selected, and of the cases skipped by tag, are
            # ignored rather than reported as unknown.
            full = load_cases(args.suite)
            kept = {c for fc in suite.functions.values() for c in fc.ids}
            ignored = frozenset(c for fc in full.functions.values() for c in fc.ids
                                if c not in kept)
        parsed = read_results(args.results, suite, ignored)
    except (SuiteError, ResultsError) as exc:
        return fail("port verify", str(exc), 2)
    precision = args.precision or parsed.precision or "double"
    if args.precision and parsed.precision and args.precision != parsed.precision:
        return fail("port verify", f"{args.results}: the file says precision "
                                   f"{parsed.precision}, --precision says {args.precision}", 2)
    for p in parsed.problems[:50]:
        print(f"{args.results}: {p}")
    if len(parsed.problems) > 50:
        print(f"{args.results}: ... and {len(parsed.problems) - 50} more problem(s)")
    try:
        req = load_requirements(args.requirements) if args.requirements else None
    except RequirementsError as exc:
        return fail("port verify", str(exc), 2)
    raw = {fc.name: arrays(fc, parsed)[:2] for fc in suite.functions.values()}
    report = judge(suite, raw, precision, req)
    add_line_numbers(report, parsed)
    label = f"results file {args.results}"
    print(render_summary([report], label))
    if parsed.problems:
        print(f"FAIL: {len(parsed.problems)} problem(s) in the results file (listed above)")
    env = environment()
    note = _skip_note(suite, env)
    if note:
        print(note)
    env["results_file"] = {"path": str(args.results),
                           "problems": [str(p) for p in parsed.problems[:1000]],
                           "problem_count": len(parsed.problems)}
    failed = _write_evidence("port verify", args, [report], env)
    return failed or (0 if report.ok and not parsed.problems else 1)


def _add_selection(parser: argparse.ArgumentParser, only: str, subnormal: str) -> None:
    """``--only`` (help ``only``) and ``--skip-subnormal`` (``subnormal`` says what the
    tag means to the command): which cases a command judges."""
    parser.add_argument("--only", nargs="+", metavar="FUNC", help=only)
    parser.add_argument("--skip-subnormal", action="store_true",
                        help=f"leave out the cases tagged 'subnormal' ({subnormal}), for a "
                             "target that flushes subnormal numbers to zero; the count is "
                             "printed")


def register(subparsers: Any) -> None:
    """Add the ``port`` parser and its ``check`` and ``copy`` sub-commands."""
    port = add_command(subparsers, "port")
    sub = port.add_subparsers(dest="port_command", metavar="ACTION")
    sub.required = True
    c = add_command(sub, "port check")
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
    add_port_options(c)
    _add_selection(c, "check only these functions (reference names, e.g. pressure_altitude)",
                   "an input or expected output below the normal binary64 range")
    c.add_argument("--implements", nargs="+", metavar="FUNC",
                   help="the functions the port implements; the others are reported 'not "
                        "implemented' (not failures)")
    c.add_argument("--declaration", metavar="FILE.toml",
                   help="a port declaration file: implements = [\"pressure_altitude\", ...]")
    add_report_options(c)
    c.set_defaults(func=cmd_check)
    from .copy import register_copy

    register_copy(sub)
    v = add_command(sub, "port verify")
    v.add_argument("results", metavar="RESULTS", help="the results file")
    v.add_argument("--suite", default=None, metavar="DIR",
                   help="vector suite directory (default: the installed icao suite)")
    v.add_argument("--precision", choices=["double", "single"], default=None,
                   help="precision of the port (default: the file's precision line, else "
                        "double)")
    _add_selection(v, "judge only these functions (the results of others are ignored)",
                   "their result lines, if any, are ignored")
    add_report_options(v)
    v.set_defaults(func=cmd_verify)
    from .port_coverage import add_parser as _add_coverage

    _add_coverage(sub, CAUTION)
