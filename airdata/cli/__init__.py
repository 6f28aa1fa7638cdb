"""The ``airdata`` command line: every sub-command lives in this package.

One module per sub-command (or group), each with ``register(subparsers)``, which adds its
parsers and sets ``func`` (taking the parsed namespace, returning the exit code):
:mod:`.demo`, :mod:`.compute`, :mod:`.convert`, :mod:`.table`, :mod:`.reduce`,
:mod:`.limits` (``limits`` and ``budget``), :mod:`.vectors`, :mod:`.bench` and :mod:`.port`.
Argument helpers shared by several of them: :mod:`.quantities` (values with units) and
:mod:`.accuracy` (sensor accuracies).  The library they drive has no argparse in it.

An engineering and verification aid, not certified flight software.
"""

from __future__ import annotations

import argparse
import sys
from collections.abc import Sequence

from .. import __version__
from ..notice import CAUTION
from ..status import DomainError
from . import bench, compute, convert, demo, limits, port, reduce, table, vectors
from .quantities import quiet_broken_pipe

__all__ = ["build_parser", "main"]

#: The sub-command modules, in the order of the help text.
SUB_COMMANDS = (demo, compute, convert, table, reduce, limits, vectors, bench, port)


def build_parser() -> argparse.ArgumentParser:
    """The argument parser of the ``airdata`` command."""
    parser = argparse.ArgumentParser(
        prog="airdata",
        description="Reference air-data equations, golden test vectors and port checks.",
        epilog=CAUTION,
    )
    parser.add_argument("--version", action="version", version=f"airdata {__version__}")
    sub = parser.add_subparsers(dest="command", metavar="COMMAND")
    for module in SUB_COMMANDS:
        module.register(sub)
    return parser


def main(argv: Sequence[str] | None = None) -> int:
    """Entry point of the ``airdata`` command; returns the exit code."""
    parser = build_parser()
    args = parser.parse_args(argv)
    if not hasattr(args, "func"):
        parser.print_help(sys.stderr)
        return 2
    try:
        return int(args.func(args))
    except BrokenPipeError:
        return quiet_broken_pipe()
    except (DomainError, ValueError, OSError) as exc:
        print(f"airdata: error: {exc}", file=sys.stderr)
        return 1


if __name__ == "__main__":  # pragma: no cover
    sys.exit(main())
