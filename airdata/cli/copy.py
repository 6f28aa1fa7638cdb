"""``airdata port copy DIR``: the bundled C port, copied into a firmware tree.

Copies the port's sources and private headers (``src/``), the interface (``include/``),
the vector runner (``runner/``), the test driver (``tests/driver.c``) and the Makefile
from this installation (:mod:`airdata.resources`) into ``DIR``, keeping that layout, so
``make -C DIR`` builds the libraries and ``make -C DIR runner VECTORS=...`` the runner.
Existing files are not overwritten unless ``--force`` is given; each one is named.

An engineering and verification aid, not certified flight software.
"""

from __future__ import annotations

import argparse
from typing import Any

from .. import resources
from .messages import fail
from .parsers import add_command

__all__ = ["register_copy", "cmd_copy", "report_copy"]

def report_copy(command: str, files: list[tuple[Any, str]], dest: str, force: bool,
                what: str) -> int:
    """Copy ``files`` into ``dest`` and print the outcome; the exit status.

    0: copied; 1: refused (files exist, no ``--force``) or the destination is unusable;
    2: the files are missing from this installation.
    """
    try:
        written = resources.copy_files(files, dest, force)
    except resources.OverwriteError as exc:
        for p in exc.existing:
            fail(command, f"{p} exists (pass --force to overwrite)")
        return fail(command, f"nothing copied: {len(exc.existing)} file(s) would be "
                    "overwritten", 1)
    except OSError as exc:
        return fail(command, str(exc), 1)
    print(f"copied {what} ({len(written)} files, from the {resources.origin()} at "
          f"{resources.data_root()}) to {dest}")
    return 0


def cmd_copy(args: argparse.Namespace) -> int:
    """Copy the bundled port into ``args.dir``."""
    try:
        files = resources.port_files()
    except resources.ResourceError as exc:
        return fail("port copy", str(exc), 2)
    return report_copy("port copy", files, args.dir, args.force,
                       "the C port: Makefile, include/, src/, runner/, tests/")


def register_copy(sub: Any) -> None:
    """Add ``port copy`` to the ``port`` sub-parsers."""
    c = add_command(sub, "port copy")
    c.add_argument("dir", metavar="DIR", help="destination directory (made if missing)")
    c.add_argument("--force", action="store_true", help="overwrite existing files")
    c.set_defaults(func=cmd_copy)
