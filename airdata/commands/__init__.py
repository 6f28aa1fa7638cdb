"""Desk and batch sub-commands of the ``airdata`` command.

``compute``
    Every air-data output from one set of readings (ps, pt, TAT) with units.
``convert``
    CAS, EAS, TAS and Mach from one of them at a pressure altitude or static pressure.
``table``
    The standard atmosphere over an altitude range.
``reduce``
    The air-data chain over a recorded CSV series, streamed in chunks.

Each module has ``register(subparsers)``; :func:`register` adds them all.
An engineering and verification aid, not certified flight software.
"""

from __future__ import annotations

import argparse

from . import compute, convert, reduce, table

__all__ = ["register"]


def register(subparsers: argparse._SubParsersAction) -> None:
    """Add the ``compute``, ``convert``, ``table`` and ``reduce`` sub-commands."""
    for module in (compute, convert, table, reduce):
        module.register(subparsers)
