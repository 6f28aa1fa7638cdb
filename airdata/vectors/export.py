"""Case export: every case of a suite as a flat text stream for any implementation.

The format (``airdata-cases 1``) is specified in docs/exchange.md.  A line file::

    airdata-cases 1
    suite 2.0.0 profile icao precision binary64 numbers hex cases 35003
    function atmosphere inputs 2 h dT outputs 6 temperature pressure ...
    case 931c7eb9eda7 atmosphere -0x1.388p+12 -0x1.9p+6
    ...
    end 35003

Inputs are C99 hex floats (``float.hex``) of the chosen precision: under binary32 each
input is first rounded to the nearest binary32 value, as the C port's ``(ad_real)``
conversion does, and written exactly.  Non-finite inputs are ``inf``, ``-inf`` and
``nan``; flags are ``0`` or ``1``.  ``numbers="decimal"`` writes the shortest decimal
that reads back to the same value in that precision (for readers without hex floats).
The CSV variant has one row per case with both forms.  The export is deterministic:
manifest order, case order of each file, no time stamps.

An engineering and verification aid, not certified flight software.
"""

from __future__ import annotations

import csv
import io
import math
import re
from collections.abc import Sequence
from pathlib import Path

import numpy as np

from ..portcheck.suite import FunctionCases, LoadedSuite, load_cases

__all__ = ["FORMAT_VERSION", "PRECISION_LABEL", "export_cases", "format_number"]

#: Version of the ``airdata-cases`` format (docs/exchange.md).
FORMAT_VERSION = 1
PRECISION_LABEL = {"double": "binary64", "single": "binary32"}
_HEX_ZEROS = re.compile(r"\.?0*p")  # trailing zeros of a hex mantissa (0x1.8000p+1 -> 0x1.8p+1)


def format_number(v: float, precision: str, numbers: str = "hex") -> str:
    """One real input as text.

    Parameters
    ----------
    v : float
        The binary64 value of the suite.
    precision : {"double", "single"}
        Under ``"single"`` ``v`` is rounded to the nearest binary32 value first.
    numbers : {"hex", "decimal"}
        C99 hex float, or the shortest decimal that reads back to the same value.

    Returns
    -------
    str
        ``inf``, ``-inf``, ``nan`` for non-finite values.
    """
    if math.isnan(v):
        return "nan"
    if math.isinf(v):
        return "inf" if v > 0 else "-inf"
    if precision == "single":
        with np.errstate(over="ignore"):
            f: np.floating = np.float32(v)
        if not np.isfinite(f):  # rounds to infinity in binary32
            return "inf" if v > 0 else "-inf"
    else:
        f = np.float64(v)
    if numbers == "hex":
        return _HEX_ZEROS.sub("p", float(f).hex())
    return np.format_float_scientific(f, unique=True, trim="0").replace("e", "E")


def _value(fc: FunctionCases, i: int, j: int, precision: str, numbers: str) -> str:
    if fc.inputs[j][1] == "flag":
        return str(int(fc.x[i, j]))
    return format_number(float(fc.x[i, j]), precision, numbers)


def _check_ids(suite: LoadedSuite) -> None:
    seen: dict[str, str] = {}
    for fc in suite.functions.values():
        for cid in fc.ids:
            if cid in seen:
                raise ValueError(f"case id {cid} appears in {seen[cid]} and {fc.name}: ids "
                                 "must be unique across the suite to be exported")
            seen[cid] = fc.name


def _lines(suite: LoadedSuite, precision: str, numbers: str) -> str:
    total = sum(fc.count for fc in suite.functions.values())
    out = [f"airdata-cases {FORMAT_VERSION}",
           f"suite {suite.suite_version} profile {suite.profile} precision "
           f"{PRECISION_LABEL[precision]} numbers {numbers} cases {total}"]
    for fc in suite.functions.values():
        out.append(f"function {fc.name} inputs {len(fc.inputs)} "
                   f"{' '.join(n for n, _ in fc.inputs)} outputs {len(fc.outputs)} "
                   f"{' '.join(fc.outputs)}")
        for i, cid in enumerate(fc.ids):
            vals = " ".join(_value(fc, i, j, precision, numbers) for j in range(len(fc.inputs)))
            out.append(f"case {cid} {fc.name} {vals}")
    out.append(f"end {total}")
    return "\n".join(out) + "\n"


def _csv(suite: LoadedSuite, precision: str) -> str:
    total = sum(fc.count for fc in suite.functions.values())
    width = max((len(fc.inputs) for fc in suite.functions.values()), default=0)
    buf = io.StringIO()
    w = csv.writer(buf, lineterminator="\n")
    w.writerow([f"airdata-cases-csv {FORMAT_VERSION}", "suite", suite.suite_version,
                "profile", suite.profile, "precision", PRECISION_LABEL[precision],
                "cases", total])
    head = ["id", "function", "n_inputs"]
    for j in range(1, width + 1):
        head += [f"name_{j}", f"x_{j}", f"x_{j}_hex"]
    w.writerow(head)
    for fc in suite.functions.values():
        for i, cid in enumerate(fc.ids):
            row: list[str | int] = [cid, fc.name, len(fc.inputs)]
            for j, (name, _) in enumerate(fc.inputs):
                row += [name, _value(fc, i, j, precision, "decimal"),
                        _value(fc, i, j, precision, "hex")]
            row += [""] * (3 + 3 * width - len(row))
            w.writerow(row)
    return buf.getvalue()


def export_cases(suite_dir: str | Path = "vectors", precision: str = "double",
                 only: Sequence[str] | None = None, fmt: str = "lines",
                 numbers: str = "hex") -> tuple[str, int]:
    """Every valid and invalid case of a suite as an ``airdata-cases`` text.

    Parameters
    ----------
    suite_dir : str or Path
        Suite directory (its manifest and checksums are checked on reading).
    precision : {"double", "single"}
        Precision of the implementation the cases are for.
    only : sequence of str, optional
        Function names to export (default: all, in manifest order).
    fmt : {"lines", "csv"}
        Line format or CSV.
    numbers : {"hex", "decimal"}
        Number form of the line format (CSV carries both).

    Returns
    -------
    (str, int)
        The text and the number of cases in it.

    Raises
    ------
    airdata.portcheck.suite.SuiteError
        The suite cannot be read.
    ValueError
        Unknown precision, format or number form; a case id used twice.
    """
    if precision not in PRECISION_LABEL:
        raise ValueError(f"precision {precision!r}: choose 'double' or 'single'")
    if fmt not in ("lines", "csv"):
        raise ValueError(f"format {fmt!r}: choose 'lines' or 'csv'")
    if numbers not in ("hex", "decimal"):
        raise ValueError(f"numbers {numbers!r}: choose 'hex' or 'decimal'")
    suite = load_cases(suite_dir, only or None)
    _check_ids(suite)
    total = sum(fc.count for fc in suite.functions.values())
    text = _lines(suite, precision, numbers) if fmt == "lines" else _csv(suite, precision)
    return text, total
