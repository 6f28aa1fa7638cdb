"""The ``airdata bench`` sub-command: runs :func:`airdata.bench.run_bench` and prints its table.

An engineering and verification aid, not certified flight software.
"""

from __future__ import annotations

import argparse
import json
import sys
from pathlib import Path
from typing import Any

from ..bench import format_table, run_bench
from .parsers import add_command

__all__ = ["register"]

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

    p = add_command(subparsers, "bench")
    p.add_argument("--quick", action="store_true",
                   help="smaller sizes (about 1e5 points): a run of well under 30 s")
    p.add_argument("--json", metavar="FILE", default=None,
                   help="also write the report as JSON to FILE ('-' for stdout)")
    p.add_argument("--silent", action="store_true", help="no progress messages on stderr")
    p.set_defaults(func=_cmd_bench)
