"""The header of a recorded series: each cell split into a name and a unit (``ps[hPa]``,
``ps [hPa]``, ``ps (hPa)``), and the units row some files carry under it (see
:mod:`airdata.series.csvio` for the shapes read).
"""

from __future__ import annotations

import re
from dataclasses import dataclass

from .. import units as u

__all__ = ["Column", "split_header", "HeaderError", "TIME_UNITS", "is_units_row"]

_HEADER = re.compile(
    r"^\s*(?P<name>[^\[\]()]*?)\s*(?:[\[(]\s*(?P<unit>[^\[\]()]*?)\s*[\])])?\s*$")


class HeaderError(ValueError):
    """The input has no header, or a header the command cannot use."""


@dataclass(frozen=True)
class Column:
    """One header cell split into its name and unit.

    Attributes
    ----------
    index : int
        Position in the row, from 0.
    header : str
        The cell as written.
    name : str
        The name without the unit.
    unit : str or None
        The unit as written (header brackets or units row), ``None`` without one.
    """

    index: int
    header: str
    name: str
    unit: str | None

    @property
    def key(self) -> str:
        """The name compared without case."""
        return self.name.casefold()


def split_header(cells: list[str], unit_row: list[str] | None = None) -> list[Column]:
    """Split every header cell into name and unit (see the module docstring).

    Raises
    ------
    HeaderError
        A header unit and the units row disagree for a column.
    """
    cols = []
    for i, cell in enumerate(cells):
        m = _HEADER.match(cell)
        name, unit = (cell.strip(), None) if m is None else (m.group("name"),
                                                               m.group("unit") or None)
        if unit_row is not None and i < len(unit_row):
            below = _strip_brackets(unit_row[i])
            if below and unit and _same_unit(below, unit) is False:
                raise HeaderError(f"column {cell!r}: the header says unit {unit!r}, the units "
                                  f"row below it {below!r}")
            unit = unit or below or None
        cols.append(Column(i, cell, name, unit))
    return cols


def _strip_brackets(cell: str) -> str:
    text = cell.strip()
    if len(text) >= 2 and text[0] + text[-1] in ("[]", "()"):
        text = text[1:-1].strip()
    return text


def _same_unit(a: str, b: str) -> bool | None:
    try:
        return u.normalize_unit(a) == u.normalize_unit(b)
    except ValueError:
        return None


#: Units of a time column accepted in a units row (time is not converted).
TIME_UNITS = ("s", "ms", "us", "min", "h", "hh:mm:ss", "hh:mm:ss.sss", "utc", "iso 8601")


def is_units_row(cells: list[str]) -> bool:
    """Every non-empty cell a unit, and at least one a unit other than ``1`` or ``-``."""
    seen = False
    for cell in cells:
        text = _strip_brackets(cell)
        if not text:
            continue
        if text.lower() in TIME_UNITS:
            continue
        try:
            unit = u.normalize_unit(text)
        except ValueError:
            return False
        if unit != "1":
            seen = True
    return seen
