"""Reading and writing recorded series: CSV (plain or compressed), Parquet, Arrow IPC.

Input shapes read
-----------------
* **Preamble**: lines starting with ``#`` (and blank lines) before the header are skipped;
  a data line starting with ``#`` is a comment line, skipped and counted.
* **Header**: the first other line.  A column that holds a physical quantity names its
  unit after its name as ``ps[hPa]``, ``ps [hPa]`` or ``ps (hPa)``; names are compared
  without case (``PS[hPa]`` is ``ps``).  Unit spellings are those of
  :func:`airdata.units.normalize_unit` (``mb``, ``C``, ``kts``, ``psi``, ...).
* **Units row**: a line right under the header whose every non-empty cell is a unit
  (``s;hPa;hPa;degC;``) gives the units of the columns; a header unit and a units-row unit
  that disagree are refused.
* **Delimiter**: ``,`` ``;`` or tab, detected from the header line (the one of the three it
  holds most, ``,`` when it holds none) unless ``--delimiter`` gives one (``tab`` and
  ``\\t`` name the tab).
* **Decimal sign**: with ``;`` or tab as delimiter, number fields written ``1013,25``
  (and none written ``1013.25``) in the first lines make the decimal comma the decimal
  sign; ``--decimal`` says it explicitly.  The outputs are then written with a decimal
  comma too, so the file stays in one convention.
* **Encoding**: UTF-8 with or without a byte-order mark.  With ``encoding="auto"`` a file
  whose first 256 KiB are not UTF-8 is read as Latin-1 (ISO 8859-1, every byte a
  character; a degree sign written by a Western-European system reads right) and the
  reader says so in :attr:`ChunkReader.notes`; a file that turns out not to be UTF-8
  later is refused with the advice to give the encoding.
* **Compression**: ``.gz``, ``.bz2``, ``.xz`` by extension (gzip also by its magic bytes).
* **Parquet / Arrow IPC** (``.parquet``, ``.pq``, ``.arrow``, ``.feather``, ``.ipc``):
  through pyarrow (the optional ``arrow`` extra); column names follow the header
  convention; every value is handed to the reduction as text (numbers in their shortest
  round-trip form, nulls empty).

A number field holds a decimal number (``1013.25``, ``-4.5e-1``); an empty field,
``nan``, or text is a bad value of that row.  The reader never holds more than one chunk
of rows in memory.
"""

from __future__ import annotations

import bz2
import csv
import gzip
import io
import lzma
import os
import re
import sys
from collections.abc import Iterator
from dataclasses import dataclass, field
from typing import IO, Any

import numpy as np
from numpy.typing import NDArray

from .header import Column, HeaderError, is_units_row, split_header

__all__ = ["Column", "split_header", "ChunkReader", "parse_numbers", "HeaderError",
           "file_format", "FORMATS", "delimiter_option", "pyarrow_available"]

#: Fields converted at once by :func:`parse_numbers` before it falls back to one by one.
_BLOCK = 256
#: Bytes looked at to detect the encoding, the delimiter and the decimal sign.
SNIFF_BYTES = 256 * 1024

_COMMA_NUMBER = re.compile(r"^\s*[-+]?\d+,\d+(?:[eE][-+]?\d+)?\s*$")
_DOT_NUMBER = re.compile(r"^\s*[-+]?\d*\.\d+(?:[eE][-+]?\d+)?\s*$")

#: File formats by extension (after a compression extension is taken off).
FORMATS = {".csv": "csv", ".txt": "csv", ".tsv": "csv", ".dat": "csv",
           ".parquet": "parquet", ".pq": "parquet",
           ".arrow": "arrow", ".feather": "arrow", ".ipc": "arrow"}
_COMPRESSION = {".gz": "gzip", ".bz2": "bz2", ".xz": "xz"}


def pyarrow_available() -> bool:
    """True when pyarrow (the optional ``arrow`` extra) can be imported."""
    try:
        import pyarrow  # noqa: F401
        import pyarrow.parquet  # noqa: F401
    except ImportError:
        return False
    return True


def file_format(path: str) -> tuple[str, str | None]:
    """``(format, compression)`` of a file name: format ``csv``, ``parquet`` or ``arrow``.

    ``"-"`` and a name without an extension are CSV.

    Raises
    ------
    HeaderError
        An extension that cannot be honoured (``.xlsx``, ``.json``, a compressed Parquet
        file, ...); the message lists the ones that can.
    """
    if path == "-":
        return "csv", None
    base = os.path.basename(path).lower()
    root, ext = os.path.splitext(base)
    compression = _COMPRESSION.get(ext)
    if compression is not None:
        root, ext = os.path.splitext(root)
    if ext == "" or ext in FORMATS:
        fmt = FORMATS.get(ext, "csv")
        if compression is not None and fmt != "csv":
            raise HeaderError(f"{path}: a compressed {fmt} file is not supported (Parquet and "
                              "Arrow compress inside the file): drop the "
                              f"{os.path.splitext(base)[1]} extension")
        return fmt, compression
    raise HeaderError(
        f"{path}: extension {ext!r} cannot be read or written; use one of "
        f"{', '.join(FORMATS)} (CSV ones optionally with {', '.join(_COMPRESSION)})")


def delimiter_option(text: str) -> str:
    """The field separator named by ``--delimiter``: one character, ``tab`` or ``\\t``."""
    named = {"tab": "\t", "\\t": "\t", "\t": "\t", "comma": ",", "semicolon": ";",
             "space": " ", "pipe": "|"}
    value = named.get(text.lower(), text)
    if len(value) != 1 or value in "\"\r\n" or value.isalnum() or value in ".-+":
        raise ValueError(f"--delimiter {text!r}: give one character such as , ; | or the "
                         "word tab (or \\t)")
    return value


# ----------------------------------------------------------------------------- sources

def _open_binary(path: str) -> tuple[IO[bytes], int | None, IO[bytes] | None]:
    """The (decompressed) bytes of ``path``, its size on disk and the file to close."""
    if path == "-":
        raw: IO[bytes] = sys.stdin.buffer
        size = None
        own = None
    else:
        raw = open(path, "rb")
        own = raw
        try:
            size = os.fstat(raw.fileno()).st_size
        except OSError:  # pragma: no cover
            size = None
    _, compression = file_format(path) if path != "-" else ("csv", None)
    buffered = raw if isinstance(raw, io.BufferedReader) else io.BufferedReader(raw)  # type: ignore[arg-type]
    if compression is None and buffered.peek(2)[:2] == b"\x1f\x8b":
        compression = "gzip"
    if compression == "gzip":
        return io.BufferedReader(gzip.GzipFile(fileobj=buffered), SNIFF_BYTES), size, own  # type: ignore[arg-type]
    if compression == "bz2":
        return io.BufferedReader(bz2.BZ2File(buffered), SNIFF_BYTES), size, own  # type: ignore[arg-type]
    if compression == "xz":
        return io.BufferedReader(lzma.LZMAFile(buffered), SNIFF_BYTES), size, own  # type: ignore[arg-type]
    return io.BufferedReader(buffered, SNIFF_BYTES), size, own  # type: ignore[arg-type]


def _sniff_encoding(sample: bytes, complete: bool) -> str | None:
    """``"utf-8-sig"`` when the sample is UTF-8 (a cut character at its end allowed)."""
    dec = __import__("codecs").getincrementaldecoder("utf-8")()
    try:
        dec.decode(sample, final=complete)
    except UnicodeDecodeError:
        return None
    return "utf-8-sig"


class _Text:
    """Text lines of a CSV source, with the byte position for progress reports."""

    def __init__(self, path: str, encoding: str) -> None:
        self.path = path
        self.binary, self.size, self._own = _open_binary(path)
        self.notes: list[str] = []
        sample = self.binary.peek(SNIFF_BYTES)[:SNIFF_BYTES]  # type: ignore[attr-defined]
        if encoding == "auto":
            enc = _sniff_encoding(sample, len(sample) < SNIFF_BYTES)
            if enc is None:
                enc = "latin-1"
                self.notes.append("the file is not UTF-8: read as Latin-1 (ISO 8859-1); give "
                                  "--encoding if it is another one")
        else:
            enc = "utf-8-sig" if encoding.lower().replace("_", "-") in ("utf-8", "utf8") \
                else encoding
        self.encoding = enc
        self.sample = sample.decode(enc, errors="replace")
        self.text = io.TextIOWrapper(self.binary, encoding=enc, newline="")  # type: ignore[arg-type]

    def position(self) -> int:
        try:
            raw = self._own
            return raw.tell() if raw is not None else 0
        except (OSError, ValueError):
            return 0

    def close(self) -> None:
        if self._own is not None:
            self.text.close()


@dataclass
class Dialect:
    """What the reader found out about the file's shape."""

    delimiter: str = ","
    decimal: str = "."
    preamble: int = 0
    units_row: bool = False
    encoding: str = "utf-8-sig"
    notes: list[str] = field(default_factory=list)


def _sniff(sample: str, delimiter: str | None, decimal: str) -> Dialect:
    lines = sample.splitlines()
    if lines and not sample.endswith(("\n", "\r")) and len(lines) > 1:
        lines = lines[:-1]  # possibly cut in the middle
    i = 0
    while i < len(lines) and (not lines[i].strip() or lines[i].lstrip().startswith("#")):
        i += 1
    d = Dialect(preamble=i)
    header = lines[i] if i < len(lines) else ""
    if delimiter is None:
        counts = {c: header.count(c) for c in (",", ";", "\t")}
        best = max(counts, key=lambda c: counts[c])
        d.delimiter = best if counts[best] > 0 else ","
    else:
        d.delimiter = delimiter
    data = [ln for ln in lines[i + 1:i + 201] if ln.strip() and not ln.lstrip().startswith("#")]
    if decimal == "auto":
        d.decimal = "."
        if d.delimiter != ",":
            fields = [f for ln in data for f in next(csv.reader([ln], delimiter=d.delimiter))]
            comma = sum(1 for f in fields if _COMMA_NUMBER.match(f))
            dot = sum(1 for f in fields if _DOT_NUMBER.match(f))
            if comma and not dot:
                d.decimal = ","
    else:
        d.decimal = decimal
    if d.decimal == "," and d.delimiter == ",":
        raise HeaderError("a decimal comma needs another field delimiter than the comma "
                          "(--delimiter ';' or tab)")
    return d


class ChunkReader:
    """Rows of a recorded series in chunks of at most ``chunk`` rows.

    Parameters
    ----------
    path : str
        File name, or ``"-"`` for standard input (CSV).
    chunk : int
        Rows per chunk.
    delimiter : str or None
        Field separator; ``None`` detects it (see the module docstring).
    decimal : str
        ``"auto"``, ``"."`` or ``","``.
    encoding : str
        ``"auto"`` (UTF-8, Latin-1 fallback) or a Python codec name.

    Attributes
    ----------
    header : list of str
        The header cells.
    columns : list of Column
        The header split into names and units.
    rows_read : int
        Data rows delivered so far.
    comments : int
        Comment lines skipped among the data.
    dialect : Dialect
        Delimiter, decimal sign, preamble and units-row found.

    Raises
    ------
    HeaderError
        The file is empty, has only comments, or its header line is blank.
    """

    def __init__(self, path: str, chunk: int = 20000, delimiter: str | None = ",",
                 decimal: str = "auto", encoding: str = "auto") -> None:
        self.path = path
        self.chunk = chunk
        self.rows_read = 0
        self.comments = 0
        self.unit_row: list[str] | None = None
        self.format = file_format(path)[0]
        self._arrow: Any = None
        self._src: _Text | None = None
        if self.format != "csv":
            self._open_arrow(path)
            return
        try:
            self._src = _Text(path, encoding)
        except LookupError:
            raise HeaderError(f"--encoding {encoding!r}: unknown encoding") from None
        except FileNotFoundError:
            raise
        except (OSError, EOFError) as exc:
            raise HeaderError(f"{path}: cannot read the file ({exc})") from None
        try:
            self._open_csv(path, delimiter, decimal)
        except BaseException:
            self._src.close()
            raise

    def _open_csv(self, path: str, delimiter: str | None, decimal: str) -> None:
        src = self._src
        assert src is not None
        self.dialect = _sniff(src.sample, delimiter, decimal)
        self.dialect.encoding = src.encoding
        self.dialect.notes = src.notes
        self.size = src.size
        self._reader = csv.reader(src.text, delimiter=self.dialect.delimiter, strict=False)
        header: list[str] | None = None
        try:
            for row in self._reader:
                if not row or not "".join(row).strip():
                    if header is None and self._reader.line_num == 1 and not row:
                        raise HeaderError(f"{path}: the first line is blank (a header line "
                                          "is needed)")
                    continue
                if row[0].lstrip().startswith("#"):
                    continue
                header = row
                break
        except UnicodeDecodeError as exc:
            raise HeaderError(_decode_message(path, exc)) from None
        except csv.Error as exc:
            raise HeaderError(f"{path}: unreadable header: {exc}") from None
        if header is None:
            raise HeaderError(f"{path}: the file is empty or holds only comment lines "
                              "(a header line is needed)")
        self.header = header
        self._pending: list[list[str]] = []
        units: list[str] | None = None
        try:
            for row in self._reader:
                if not row or row[0].lstrip().startswith("#"):
                    continue
                if is_units_row(row):
                    units = row
                    self.unit_row = row
                    self.dialect.units_row = True
                else:
                    self._pending.append(row)
                break
        except UnicodeDecodeError as exc:
            raise HeaderError(_decode_message(path, exc)) from None
        self.columns = split_header(header, units)

    def _open_arrow(self, path: str) -> None:
        if not pyarrow_available():
            raise HeaderError(f"{path}: reading {self.format} needs pyarrow, which is not "
                              "installed: pip install 'airdata[arrow]' (or give a CSV file)")
        import pyarrow as pa
        import pyarrow.ipc
        import pyarrow.parquet as pq
        try:
            if self.format == "parquet":
                f = pq.ParquetFile(path)
                names = f.schema_arrow.names
                self._arrow = f.iter_batches(batch_size=self.chunk)
                self._arrow_file: Any = f
            else:
                f = pa.memory_map(path, "r")
                try:
                    rd = pyarrow.ipc.open_file(f)
                    batches: Any = (rd.get_batch(i) for i in range(rd.num_record_batches))
                except pa.ArrowInvalid:
                    f.seek(0)
                    rd = pyarrow.ipc.open_stream(f)
                    batches = iter(rd)
                names = rd.schema.names
                self._arrow = batches
                self._arrow_file = f
        except FileNotFoundError:
            raise
        except (OSError, pa.ArrowException) as exc:
            raise HeaderError(f"{path}: not a readable {self.format} file ({exc})") from None
        self.header = list(names)
        self.columns = split_header(self.header)
        self.dialect = Dialect()
        self._pending = []
        try:
            self.size = os.path.getsize(path)
        except OSError:  # pragma: no cover
            self.size = None

    def position(self) -> int:
        """Bytes of the input read so far (0 when unknown)."""
        return self._src.position() if self._src is not None else 0

    def chunks(self) -> Iterator[list[list[str]]]:
        """Lists of rows (each a list of field strings); blank and comment lines skipped."""
        if self._arrow is not None:
            yield from self._arrow_chunks()
            return
        rows: list[list[str]] = list(self._pending)
        self._pending = []
        append = rows.append
        try:
            for row in self._reader:
                if not row:
                    continue
                if row[0][:1] == "#" or row[0].lstrip()[:1] == "#":
                    self.comments += 1
                    continue
                append(row)
                if len(rows) >= self.chunk:
                    self.rows_read += len(rows)
                    yield rows
                    rows = []
                    append = rows.append
        except UnicodeDecodeError as exc:
            raise HeaderError(_decode_message(self.path, exc, self.rows_read + len(rows))) \
                from None
        except (EOFError, OSError, lzma.LZMAError) as exc:
            raise HeaderError(f"{self.path}: the file ends or breaks after "
                              f"{self.rows_read + len(rows)} data rows ({exc})") from None
        if rows:
            self.rows_read += len(rows)
            yield rows

    def _arrow_chunks(self) -> Iterator[list[list[str]]]:
        import pyarrow as pa
        import pyarrow.compute as pc
        for batch in self._arrow:
            cols = []
            for arr in batch.columns:
                if not pa.types.is_string(arr.type) and not pa.types.is_large_string(arr.type):
                    arr = pc.cast(arr, pa.string())
                cols.append(pc.fill_null(arr, "").to_pylist())
            rows = [list(r) for r in zip(*cols, strict=True)]
            if rows:
                self.rows_read += len(rows)
                yield rows

    def close(self) -> None:
        """Close the input (standard input stays open)."""
        if self._src is not None:
            self._src.close()
        f = getattr(self, "_arrow_file", None)
        if f is not None and hasattr(f, "close"):
            f.close()


def _decode_message(path: str, exc: UnicodeDecodeError, rows: int | None = None) -> str:
    where = f" after {rows} data rows" if rows is not None else ""
    return (f"{path}: bytes that are not {exc.encoding}{where} "
            f"({exc.reason}): give the file's encoding, e.g. --encoding latin-1 or "
            "--encoding cp1252")


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
