"""A progress bar on standard error, shown only when standard error is a terminal."""

from __future__ import annotations

import sys
import time
from typing import TextIO

__all__ = ["Progress"]


def _size(n: float) -> str:
    for unit in ("B", "kB", "MB", "GB"):
        if n < 1000.0:
            return f"{n:5.1f} {unit}"
        n /= 1000.0
    return f"{n:5.1f} TB"


class Progress:
    """Bytes done out of a total, redrawn at most every ``interval`` seconds.

    Parameters
    ----------
    total : int or None
        Total bytes; ``None`` when unknown (standard input): rows and rate only.
    stream : TextIO, optional
        Where to draw; default standard error.
    enabled : bool or None, optional
        Force on or off; by default on exactly when ``stream`` is a terminal.
    interval : float, optional
        Seconds between redraws.
    """

    def __init__(self, total: int | None, stream: TextIO | None = None,
                 enabled: bool | None = None, interval: float = 0.2) -> None:
        self.stream = stream if stream is not None else sys.stderr
        if enabled is None:
            try:
                enabled = self.stream.isatty()
            except (AttributeError, ValueError):
                enabled = False
        self.enabled = enabled
        self.total = total if total else None
        self.interval = interval
        self.start = time.monotonic()
        self._last = 0.0
        self._width = 0

    def update(self, done: int, rows: int, force: bool = False) -> None:
        """Redraw with ``done`` bytes and ``rows`` rows processed."""
        if not self.enabled:
            return
        now = time.monotonic()
        if not force and now - self._last < self.interval:
            return
        self._last = now
        rate = rows / max(now - self.start, 1e-9)
        if self.total:
            frac = min(done / self.total, 1.0)
            bar = "#" * int(frac * 30)
            text = (f"reduce {frac * 100:5.1f}% [{bar:<30}] {_size(done)} of {_size(self.total)}"
                    f"  {rows:,} rows  {rate:,.0f} rows/s")
        else:
            text = f"reduce {rows:,} rows  {rate:,.0f} rows/s"
        self._width = max(self._width, len(text))
        self.stream.write("\r" + text.ljust(self._width))
        self.stream.flush()

    def close(self) -> None:
        """Erase the bar."""
        if self.enabled and self._width:
            self.stream.write("\r" + " " * self._width + "\r")
            self.stream.flush()
