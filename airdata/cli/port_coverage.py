"""The ``airdata port coverage`` action: MC/DC, branch, line and region coverage of a port.

The measurement is :mod:`airdata.portcheck.coverage`; this module is its command line.
An engineering and verification aid, not certified flight software.
"""

from __future__ import annotations

import argparse
import json
import sys
from pathlib import Path
from typing import Any

from .. import resources
from ..portcheck.build import BUNDLED_C, PortBuildError
from ..portcheck.coverage import (
    MCDC_FLAGS,
    CoverageError,
    coverage_of_sources,
    find_toolchain,
    render,
    tool_versions,
)
from ..portcheck.suite import SuiteError
from .messages import fail
from .parsers import add_command, add_compile_options

__all__ = ["add_parser", "cmd_coverage"]

def cmd_coverage(args: argparse.Namespace) -> int:
    """Run ``airdata port coverage``; exit 0, 1 (below --fail-under) or 2 (cannot run, or
    the run stopped before its end)."""
    if args.source:
        sources = [Path(s) for s in args.source]
        label = " ".join(args.source)
        includes = [Path(p) for p in args.include]
    else:
        sources = sorted((BUNDLED_C / "src").glob("*.c"))
        label = "bundled"
        includes = [Path(p) for p in args.include] + [BUNDLED_C / "src"]
    precisions = ["double", "single"] if args.precision == "both" else [args.precision]
    batch = {"auto": None, "yes": True, "no": False}[args.batch]
    try:
        suite = args.suite if args.suite is not None else resources.suite_dir("icao")
        tools = find_toolchain()
        figures = coverage_of_sources(sources, suite, precisions, includes,
                                      list(args.define), args.only or None, tools=tools,
                                      batch=batch)
    except (CoverageError, SuiteError, PortBuildError, resources.ResourceError,
            ValueError) as exc:
        return fail("port coverage", str(exc), 2)
    versions = tool_versions(tools)
    print(render(label, figures, versions=versions))
    final = figures.get("both") or figures[precisions[0]]
    if args.report:
        doc = {"tool": "airdata port coverage", "label": label,
               "disclaimer": "An engineering and verification aid, not certified flight "
                             "software; coverage figures are evidence for a review.",
               "tool_versions": versions, "sources": [str(s) for s in sources],
               "flags": list(MCDC_FLAGS), "suite": str(suite),
               "measurements": {k: f.as_dict() for k, f in figures.items()}}
        Path(args.report).write_text(json.dumps(doc, indent=1) + "\n")
        print(f"report written to {args.report}")
    if any(n.startswith("INCOMPLETE") for f in figures.values() for n in f.notes):
        print("airdata port coverage: the run stopped before its end (see the notes)",
              file=sys.stderr)
        return 2
    if args.fail_under is not None and final.percent("mcdc") < args.fail_under:
        print(f"MC/DC {final.percent('mcdc'):.2f}% is below --fail-under {args.fail_under}",
              file=sys.stderr)
        return 1
    return 0


def add_parser(sub: Any, epilog: str) -> None:
    """Add the ``coverage`` action to the ``port`` sub-parsers."""
    c = add_command(sub, "port coverage", epilog=epilog)
    c.add_argument("--suite", default=None, metavar="DIR",
                   help="vector suite directory (default: the checked-in icao suite that this "
                        "installation carries; see 'airdata vectors path')")
    c.add_argument("--precision", choices=["double", "single", "both"], default="both",
                   help="binary64 (double), binary32 (single) or both (default)")
    c.add_argument("--source", nargs="+", metavar="FILE.c",
                   help="your port's C sources (they implement airdata.h); only these are "
                        "measured")
    add_compile_options(c)
    c.add_argument("--batch", choices=["auto", "yes", "no"], default="auto",
                   help="drive the batch entry points of airdata_batch.h: when the sources "
                        "define all of them (auto, default), always, or never")
    c.add_argument("--only", nargs="+", metavar="FUNC",
                   help="run only these functions' cases (reference names)")
    c.add_argument("--report", metavar="FILE.json", help="write the figures and the list "
                                                         "of what is missed as JSON")
    c.add_argument("--fail-under", type=float, default=None, metavar="PCT",
                   help="exit 1 when the MC/DC percentage (both precisions together) is "
                        "below PCT")
    c.set_defaults(func=cmd_coverage)
