"""Reading and writing recorded series as CSV, in chunks.

Header convention
-----------------
The first line of the file is the header.  A column that holds a physical quantity
names its unit in square brackets right after its name: ``ps[hPa]``, ``pt[inHg]``,
``tat[degC]``, ``time[s]``.  Spaces around the name and the unit are ignored
(``ps [hPa]`` is ``ps[hPa]``); names are case-sensitive.  Units are those of
:mod:`airdata.units`.  Every other column is carried through unchanged.

Fields are separated by commas (or ``--delimiter``) and may be quoted as in RFC 4180.
A UTF-8 byte-order mark is ignored.  A number field holds a decimal number
(``1013.25``, ``-4.5e-1``); an empty field, ``nan``, or text is a bad value of that row.

The reader never holds more than one chunk of rows in memory.
"""

from __future__ import annotations

import csv
import io
import os
import re
import sys
from collections.abc import Iterator
from dataclasses import dataclass
from typing import IO

import numpy as np
from numpy.typing import NDArray

__all__ = ["Column", "split_header", "ChunkReader", "parse_numbers", "HeaderError"]

#: Fields converted at once by :func:`parse_numbers` before it falls back to one by one.
_BLOCK = 256

_HEADER = re.compile(r"^\s*(?P<name>[^\[\]]*?)\s*(?:\[\s*(?P<unit>[^\[\]]*?)\s*\])?\s*$")


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
        The unit in brackets, ``None`` without one.
    """

    index: int
    header: str
    name: str
    unit: str | None


def split_header(cells: list[str]) -> list[Column]:
    """Split every header cell into name and unit (see the module docstring)."""
    cols = []
    for i, cell in enumerate(cells):
        m = _HEADER.match(cell)
        if m is None:
            cols.append(Column(i, cell, cell.strip(), None))
        else:
            cols.append(Column(i, cell, m.group("name"), m.group("unit") or None))
    return cols


class _Source:
    """An input file (or standard input) with a byte position for progress reports."""

    def __init__(self, path: str) -> None:
        if path == "-":
            self.raw: IO[bytes] = sys.stdin.buffer
            self.size: int | None = None
            self._own = False
        else:
            self.raw = open(path, "rb")
            self._own = True
            try:
                self.size = os.fstat(self.raw.fileno()).st_size
            except OSError:  # pragma: no cover
                self.size = None
        self.text = io.TextIOWrapper(self.raw, encoding="utf-8-sig", newline="")

    def position(self) -> int:
        """Bytes read so far (ahead of the rows delivered by at most one buffer)."""
        try:
            return self.raw.tell()
        except (OSError, ValueError):
            return 0

    def close(self) -> None:
        if self._own:
            self.text.close()


class ChunkReader:
    """Rows of a CSV file in chunks of at most ``chunk`` rows.

    Parameters
    ----------
    path : str
        File name, or ``"-"`` for standard input.
    chunk : int
        Rows per chunk.
    delimiter : str
        Field separator.

    Attributes
    ----------
    header : list of str
        The header cells.
    columns : list of Column
        The header split into names and units.
    rows_read : int
        Data rows delivered so far.

    Raises
    ------
    HeaderError
        The file is empty or its first line is blank.
    """

    def __init__(self, path: str, chunk: int = 20000, delimiter: str = ",") -> None:
        self._src = _Source(path)
        self.chunk = chunk
        self._reader = csv.reader(self._src.text, delimiter=delimiter, strict=False)
        self.line = 0
        try:
            header = next(self._reader)
        except StopIteration:
            self._src.close()
            raise HeaderError(f"{path}: the file is empty (a header line is needed)") from None
        except csv.Error as exc:
            self._src.close()
            raise HeaderError(f"{path}: unreadable header: {exc}") from None
        if not any(cell.strip() for cell in header):
            self._src.close()
            raise HeaderError(f"{path}: the first line is blank (a header line is needed)")
        self.header = header
        self.columns = split_header(header)
        self.rows_read = 0
        self.size = self._src.size

    def position(self) -> int:
        """Bytes of the input read so far."""
        return self._src.position()

    def chunks(self) -> Iterator[list[list[str]]]:
        """Lists of rows (each a list of field strings); blank lines are skipped."""
        rows: list[list[str]] = []
        append = rows.append
        for row in self._reader:
            if not row:
                continue
            append(row)
            if len(rows) >= self.chunk:
                self.rows_read += len(rows)
                yield rows
                rows = []
                append = rows.append
        if rows:
            self.rows_read += len(rows)
            yield rows

    def close(self) -> None:
        """Close the input (standard input stays open)."""
        self._src.close()


def parse_numbers(fields: list[str]) -> tuple[NDArray[np.float64], NDArray[np.bool_]]:
    """Read number fields; give NaN and a flag for each one that is not a number.

    Parameters
    ----------
    fields : list of str
        The fields of one column over a chunk.

    Returns
    -------
    values : ndarray of float64
        The numbers, NaN where a field is empty or not a number.
    unreadable : ndarray of bool
        True where the field is empty or not a number (``nan`` and ``inf`` are numbers:
        the domain checks reject them afterwards).
    """
    n = len(fields)
    bad = np.zeros(n, dtype=bool)
    try:
        return np.array(fields, dtype=np.float64).reshape(n), bad
    except ValueError:
        pass
    # Blocks that convert at once go fast; only a block holding a bad field goes one by one.
    values = np.empty(n, dtype=np.float64)
    for start in range(0, n, _BLOCK):
        block = fields[start:start + _BLOCK]
        try:
            values[start:start + len(block)] = np.array(block, dtype=np.float64)
            continue
        except ValueError:
            pass
        for i, text in enumerate(block, start):
            try:
                values[i] = float(text)
            except ValueError:
                values[i] = np.nan
                bad[i] = True
    return values, bad
