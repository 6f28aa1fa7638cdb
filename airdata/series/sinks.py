"""Writing a reduced series: each output rounded to its unit's resolution, as CSV text
(optionally compressed) or as Parquet / Arrow IPC, into a ``.partial`` file that
replaces the output only when the run completes.

An engineering and verification aid, not certified flight software.
"""

from __future__ import annotations

import bz2
import csv
import gzip
import lzma
import os
import sys
from collections.abc import Callable
from typing import IO, Any

import numpy as np
from numpy.typing import NDArray

from .csvio import file_format

__all__ = ["RESOLUTION_DECIMALS", "round_outputs", "CsvSink", "ArrowSink"]

#: Decimals written per output unit by default: the stated resolution of each quantity
#: (about 1 mm of altitude, 0.001 kt, 0.01 Pa, 1 mK, 1e-5 of Mach, 1e-6 kg/m3), far
#: below any sensor's resolution and far above the reference's rounding.
RESOLUTION_DECIMALS = {
    "ft": 3, "m": 4, "km": 7, "FL": 5,
    "kt": 3, "m/s": 4, "km/h": 3, "mph": 3, "ft/min": 1,
    "Pa": 2, "hPa": 4, "mbar": 4, "kPa": 5, "inHg": 6, "psi": 7,
    "K": 3, "degC": 3, "degF": 3, "1": 5, "kg/m3": 6,
}


def round_outputs(values: NDArray[np.float64], units: list[str], digits: int | None,
                  exact: bool) -> NDArray[np.float64]:
    """The outputs as written: each column rounded to its unit's resolution.

    ``exact`` keeps every bit; ``digits`` rounds to that many significant digits.  The
    result is then written in its shortest round-trip decimal form (``21.18``, never
    ``21.180000000000007``); ``-0.0`` is written ``0.0``.
    """
    if exact or values.size == 0:
        return values
    out = np.empty_like(values)
    for j, unit in enumerate(units):
        col = values[:, j]
        if digits is None:
            out[:, j] = np.round(col, RESOLUTION_DECIMALS.get(unit, 6)) + 0.0
        else:
            with np.errstate(divide="ignore", invalid="ignore"):
                mag = np.floor(np.log10(np.abs(col)))
            mag = np.where(np.isfinite(mag), mag, 0.0)
            scale = 10.0 ** (digits - 1 - mag)
            out[:, j] = np.round(col * scale) / scale + 0.0
    return out


class CsvSink:
    """Writes the reduced rows as CSV text (optionally compressed)."""

    def __init__(self, path: str, delimiter: str, decimal: str,
                 digits: int | None = None) -> None:
        self.path = path
        self.digits = digits
        self.tmp: str | None = None
        if path == "-":
            self.stream: IO[str] = sys.stdout
        else:
            self.tmp = f"{path}.partial"
            compression = file_format(path)[1]
            opener: Callable[..., IO[str]] = {
                None: open, "gzip": gzip.open, "bz2": bz2.open, "xz": lzma.open,
            }[compression]
            self.stream = opener(self.tmp, "wt", encoding="utf-8", newline="")
        self.writer = csv.writer(self.stream, lineterminator="\n", delimiter=delimiter)
        self.comma = decimal == ","

    def header(self, header: list[str]) -> None:
        self.writer.writerow(header)

    def write(self, rows: list[list[str]], values: NDArray[np.float64], names: list[str],
              notes: list[str]) -> None:
        vals: list[list[Any]] = values.tolist()
        nan_rows = np.flatnonzero(np.isnan(values).any(axis=1)) if values.size else []
        for i in nan_rows:
            vals[i] = ["" if v != v else v for v in vals[i]]
        if self.digits is not None:
            fmt = f"{{:.{self.digits}g}}"
            vals = [[fmt.format(v) if isinstance(v, float) else v for v in r] for r in vals]
        if self.comma:
            vals = [[(repr(v) if isinstance(v, float) else v).replace(".", ",") for v in r]
                    for r in vals]
        self.writer.writerows([row + v + [st, note] for row, v, st, note
                               in zip(rows, vals, names, notes, strict=True)])

    def finish(self) -> None:
        if self.tmp is not None:
            self.stream.close()
            os.replace(self.tmp, self.path)
        else:
            self.stream.flush()

    def abort(self) -> None:
        if self.tmp is not None:
            self.stream.close()
            os.unlink(self.tmp)


class ArrowSink:
    """Writes the reduced rows as Parquet or Arrow IPC (input columns as their text)."""

    def __init__(self, path: str, fmt: str, width: int) -> None:
        import pyarrow as pa
        self.pa = pa
        self.path = path
        self.fmt = fmt
        self.tmp = f"{path}.partial"
        self.width = width
        self.writer: Any = None
        self.schema: Any = None

    def header(self, header: list[str]) -> None:
        pa = self.pa
        w = self.width
        fields = [pa.field(h, pa.string()) for h in header[:w]]
        fields += [pa.field(h, pa.float64()) for h in header[w:-2]]
        fields += [pa.field(h, pa.string()) for h in header[-2:]]
        self.schema = pa.schema(fields)
        if self.fmt == "parquet":
            import pyarrow.parquet as pq
            self.writer = pq.ParquetWriter(self.tmp, self.schema)
        else:
            import pyarrow.ipc
            self.writer = pyarrow.ipc.new_file(self.tmp, self.schema)

    def write(self, rows: list[list[str]], values: NDArray[np.float64], names: list[str],
              notes: list[str]) -> None:
        pa = self.pa
        w = self.width
        cols: list[Any] = [pa.array(list(c), pa.string()) for c in zip(*rows, strict=True)] \
            if rows else [pa.array([], pa.string()) for _ in range(w)]
        for j in range(values.shape[1]):
            col = values[:, j]
            cols.append(pa.array(col, pa.float64(), mask=np.isnan(col)))
        cols.append(pa.array(names, pa.string()))
        cols.append(pa.array(notes, pa.string()))
        self.writer.write_batch(pa.RecordBatch.from_arrays(cols, schema=self.schema))

    def finish(self) -> None:
        self.writer.close()
        os.replace(self.tmp, self.path)

    def abort(self) -> None:
        if self.writer is not None:
            self.writer.close()
        if os.path.exists(self.tmp):
            os.unlink(self.tmp)
