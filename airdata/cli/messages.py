"""How a sub-command reports an error: one line on standard error, one exit status.

An engineering and verification aid, not certified flight software.
"""

from __future__ import annotations

import sys

__all__ = ["fail"]


def fail(command: str, message: str, code: int = 1) -> int:
    """Print ``airdata COMMAND: error: MESSAGE`` on stderr and return ``code``."""
    print(f"airdata {command}: error: {message}", file=sys.stderr)
    return code
