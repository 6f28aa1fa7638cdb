"""The time column of a recorded file, read as seconds for the abscissa of ``--plot``.

Data systems write time in three shapes, all read here:

- numbers (seconds, milliseconds, ... : any unit, used as they are);
- clock times ``hh:mm``, ``hh:mm:ss`` or ``hh:mm:ss.fff`` (seconds since midnight; when
  the clock goes back by more than twelve hours a day is added, so a sortie over
  midnight stays in order);
- ISO 8601 date-times such as ``2026-12-04T10:00:00.250Z`` or ``2026-12-04 10:00:00``
  (seconds after the first one in the file, as :meth:`datetime.datetime.fromisoformat`
  reads them, offsets included).

The shape is taken from the first non-empty field.  A field that does not have it gives
NaN and is counted (:attr:`TimeAxis.unreadable`, first row and text kept), so a time that
cannot be drawn is reported, never silently left out of the chart.  The time column is
not an input of the reduction: an unreadable time does not reject the row.
"""

from __future__ import annotations

import math
import re
from datetime import datetime

import numpy as np
from numpy.typing import NDArray

from .csvio import parse_numbers

__all__ = ["TimeAxis", "clock_text"]

_CLOCK = re.compile(r"^\s*(\d{1,2}):(\d{2})(?::(\d{2}(?:\.\d*)?))?\s*$")
_HALF_DAY = 43200.0


def clock_text(seconds: float, days: bool = True) -> str:
    """``hh:mm:ss`` of a number of seconds since midnight.

    Parameters
    ----------
    seconds : float
        Seconds since midnight of the first day.
    days : bool
        Write the days after the first as `` +Nd`` (axis ticks leave them out).

    Returns
    -------
    str
        E.g. ``"23:59:30"`` or ``"00:00:30 +1d"``; empty for NaN.
    """
    if not math.isfinite(seconds):
        return ""
    if seconds < 0.0:
        return "-" + clock_text(-seconds, days)
    total = int(math.floor(seconds + 0.5))
    n, rest = divmod(total, 86400)
    h, rest = divmod(rest, 3600)
    m, s = divmod(rest, 60)
    return f"{h:02d}:{m:02d}:{s:02d}" + (f" +{n}d" if n and days else "")


class TimeAxis:
    """Reads the fields of a time column chunk by chunk; keeps the state across chunks.

    Attributes
    ----------
    kind : {"number", "clock", "iso", None}
        The shape, from the first non-empty field (None until one is seen).
    origin : datetime or None
        The first ISO date-time (the zero of the ``"iso"`` axis).
    unreadable : int
        Fields that do not have the column's shape (empty ones included).
    first_unreadable : tuple of (int, str) or None
        Data row number (from 1) and text of the first such field.
    """

    def __init__(self) -> None:
        self.kind: str | None = None
        self.origin: datetime | None = None
        self.unreadable = 0
        self.first_unreadable: tuple[int, str] | None = None
        self._day = 0.0
        self._last = -math.inf

    def parse(self, fields: list[str], first_row: int) -> NDArray[np.float64]:
        """Seconds (or the numbers as written) per field, NaN where unreadable.

        Parameters
        ----------
        fields : list of str
            The time fields of one chunk.
        first_row : int
            Data row number (from 1) of the chunk's first field, for the report.

        Returns
        -------
        ndarray of float64
            One value per field.
        """
        if self.kind is None:
            first = next((f for f in fields if f.strip()), None)
            if first is None:
                self._count(np.ones(len(fields), dtype=bool), fields, first_row)
                return np.full(len(fields), np.nan)
            self.kind = self._shape(first)
        if self.kind == "number":
            values = parse_numbers(fields)[0]
        elif self.kind == "clock":
            values = np.array([self._clock(f) for f in fields], dtype=np.float64)
        else:
            values = np.array([self._iso(f) for f in fields], dtype=np.float64)
        self._count(~np.isfinite(values), fields, first_row)
        return values

    @staticmethod
    def _shape(text: str) -> str:
        try:
            float(text)
            return "number"
        except ValueError:
            pass
        if _CLOCK.match(text):
            return "clock"
        return "iso"

    def _count(self, bad: NDArray[np.bool_], fields: list[str], first_row: int) -> None:
        idx = np.flatnonzero(bad)
        if idx.size and self.first_unreadable is None:
            self.first_unreadable = (first_row + int(idx[0]), fields[int(idx[0])])
        self.unreadable += int(idx.size)

    def _clock(self, text: str) -> float:
        m = _CLOCK.match(text)
        if m is None:
            return math.nan
        h, mi, s = int(m.group(1)), int(m.group(2)), float(m.group(3) or 0.0)
        if h > 23 or mi > 59 or s >= 60.0:
            return math.nan
        t = h * 3600.0 + mi * 60.0 + s + self._day
        if t < self._last - _HALF_DAY:  # the clock passed midnight
            self._day += 86400.0
            t += 86400.0
        self._last = t
        return t

    def _iso(self, text: str) -> float:
        try:
            dt = datetime.fromisoformat(text.strip())
        except ValueError:
            return math.nan
        if self.origin is None:
            self.origin = dt
        try:
            return (dt - self.origin).total_seconds()
        except TypeError:  # an offset on one and not on the other: not comparable
            return math.nan

    def label(self, name: str, unit: str) -> str:
        """Axis label for the column ``name`` written in ``unit`` (may be empty)."""
        if self.kind == "clock":
            return f"{name} (time of day, hh:mm:ss" + (
                "; the record passes midnight)" if self._day else ")")
        if self.kind == "iso" and self.origin is not None:
            return f"{name} (hh:mm:ss, from {self.origin.isoformat()})"
        return f"{name} [{unit}]" if unit else name

    def tick_text(self, value: float) -> str:
        """Text of an axis tick at ``value`` (plain number for a numeric column)."""
        if self.kind == "clock":
            return clock_text(value, days=False)
        if self.kind == "iso" and self.origin is not None:
            start = self.origin.hour * 3600.0 + self.origin.minute * 60.0 \
                + self.origin.second + self.origin.microsecond * 1e-6
            return clock_text(start + value, days=False)
        return f"{value:g}"
