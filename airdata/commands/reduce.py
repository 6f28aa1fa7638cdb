"""``airdata reduce``: run the air-data chain over a recorded series in a CSV file.

Input
-----
A CSV file whose first line is the header.  Columns holding quantities carry their unit
in square brackets after the name::

    time[s],ps[hPa],pt[hPa],tat[degC],phase
    0.0,1000.52,1000.49,19.83,ground

Required columns: ``ps`` (static pressure), ``pt`` (total pressure), ``tat`` (total air
temperature).  Optional: ``setting`` (altimeter setting, per row) and ``time`` (the
abscissa of ``--plot``: numbers in any unit, not converted; clock times ``hh:mm:ss.fff``;
or ISO 8601 date-times; see :mod:`airdata.commands.timebase`).  ``--col ROLE=HEADER`` picks a
differently named column, ``--unit ROLE=UNIT`` gives the unit of a column whose header
has none.  Units: pressure Pa, hPa, mbar, kPa, inHg; temperature K, degC, degF.

Output
------
Every input column unchanged and in place, then the outputs, each named with its unit
(``hp[ft]``, ``qc[hPa]``, ``mach[1]``, ``cas[kt]``, ``eas[kt]``, ``tas[kt]``,
``sat[degC]``, ``rho[kg/m3]``, ``hd[ft]``, ``q[hPa]``, and ``hbaro[ft]`` with an
altimeter setting), then ``status`` (a name of :class:`airdata.Status`) and ``note``
(why a row is not ``OK``).  Numbers are written in full binary64 precision unless
``--digits`` says otherwise.

Bad rows
--------
A row with an empty field, text in a number field, a value outside the model or a
different number of fields than the header stays in its place: its outputs are empty
(NaN), its status says why (``INVALID_INPUT``, ``OUT_OF_RANGE``) and its note names the
field.  Nothing is dropped, nothing is clamped.  ``IMPACT_PRESSURE_ZEROED`` rows (a
negative impact pressure within the noise band, read as zero) have valid outputs.

Memory and progress
-------------------
Input and output are streamed in chunks of ``--chunk`` rows (csv module + numpy per
chunk), so memory stays flat whatever the file size.  A progress bar is drawn on
standard error when it is a terminal.  ``--plot`` keeps at most ``PLOT_POINTS`` samples
(every k-th row of a long file).

Recorded outputs
----------------
A column named ``<output>_rec`` with a unit (``cas_rec[kt]``, ``hp_rec[ft]``,
``mach_rec``, ``sat_rec[degC]``, ``tas_rec[m/s]``) holds the value an onboard system
recorded for an output.  ``<output>`` is a short output name -- ``hp`` (pressure
altitude), ``hbaro`` (with a setting), ``qc``, ``mach``, ``cas``, ``eas``, ``tas``,
``sat``, ``rho``, ``hd``, ``q`` -- or the field name of :class:`airdata.AirData`
(``pressure_altitude_rec[ft]``); names are compared without case; ``mach_rec`` needs no
unit, the others do (any unit of their kind).  Per row ``<output>_diff[unit]`` =
recorded - reference is written after the outputs, in the recorded column's unit, and
a summary per recorded column is printed (``--json``: key ``recorded``): rows compared,
largest |diff| with its row and time, mean and rms, then the same per band of the
reference's pressure altitude (altitudes, density: 10 000 ft bands), CAS (qc, cas, eas:
100 kt bands) or Mach (mach, tas, sat, q: 0.4, 0.7, 0.9, 1.1, 1.5), and per ``phase``
when the file has a phase column; the band and phase of largest rms are named.  A row
whose recorded field is empty or not a number (``recorded_missing``) or whose reference
is rejected (``reference_missing``) is counted and not compared.  Any other ``*_rec``
column is refused with the accepted names; ``--ignore-recorded`` passes such columns
through unchanged.  The recorded columns never change a row's status.

Exit status: 0 done (also when some rows are bad, unless ``--fail-on-bad``), 1 a data
problem (unreadable file, missing column, wrong unit in the header), 2 a usage error.
"""

from __future__ import annotations

import argparse
import bz2
import csv
import gzip
import json
import lzma
import os
import sys
import time
from collections.abc import Callable
from dataclasses import dataclass, field
from operator import itemgetter
from typing import IO, Any

import numpy as np
from numpy.typing import NDArray

from .. import units as u
from ..chain import NOISE_BAND, AirData, air_data
from ..status import DomainError, Status
from .compare import (
    RECORDED,
    RECORDED_SUFFIX,
    Comparison,
    RecordedColumn,
    RecordedComparison,
    recorded_names,
)
from .csvio import (
    ChunkReader,
    Column,
    HeaderError,
    delimiter_option,
    file_format,
    parse_numbers,
    pyarrow_available,
)
from .progress import Progress
from .quantities import (
    DECIMALS,
    add_output_units,
    add_profile,
    allow_negative_values,
    caution,
    fail,
    output_units,
    quantity_type,
    quiet_broken_pipe,
)
from .timebase import TimeAxis

__all__ = ["register", "run", "OUTPUTS", "PLOT_POINTS", "Summary"]

COMMAND = "reduce"

#: (key of AirData, column name, dimension) of every output, in output order.
OUTPUTS: tuple[tuple[str, str, str], ...] = (
    ("pressure_altitude", "hp", "length"),
    ("baro_altitude", "hbaro", "length"),
    ("impact_pressure", "qc", "pressure"),
    ("mach", "mach", "dimensionless"),
    ("cas", "cas", "speed"),
    ("eas", "eas", "speed"),
    ("tas", "tas", "speed"),
    ("sat", "sat", "temperature"),
    ("density", "rho", "density"),
    ("density_altitude", "hd", "length"),
    ("dynamic_pressure", "q", "pressure"),
)

#: Input roles: (role, dimension or None for any unit, required).
ROLES: tuple[tuple[str, str | None, bool], ...] = (
    ("ps", "pressure", True),
    ("pt", "pressure", True),
    ("tat", "temperature", True),
    ("setting", "pressure", False),
    ("time", None, False),
)

#: Most samples kept for ``--plot``.
PLOT_POINTS = 50000

_STATUS_NAMES = {int(s): s.name for s in Status}
_ZEROED_NOTE = "negative qc within the noise band read as zero"

DESCRIPTION = """\
Run the air-data chain over a recorded series (CSV) and write every input column
unchanged plus the outputs, each column named with its unit.

Header convention: a quantity's column names its unit in brackets, e.g.
  time[s],ps[hPa],pt[hPa],tat[degC],phase
Needed: ps (static pressure), pt (total pressure), tat (total air temperature).
Optional: setting (altimeter setting per row), time (x axis of --plot: numbers,
hh:mm:ss.fff clock times or ISO 8601 date-times).
Pressure units: Pa, hPa, mbar, kPa, inHg.  Temperature units: K, degC, degF.
Other columns pass through unchanged.

Outputs: hp (pressure altitude), hbaro (baro-corrected altitude, with a setting),
qc (impact pressure), mach, cas, eas, tas, sat, rho (density), hd (density altitude),
q (dynamic pressure), then status (OK, INVALID_INPUT, OUT_OF_RANGE,
IMPACT_PRESSURE_ZEROED) and note.  A bad row keeps its place with empty outputs and
a status saying why; nothing is dropped or clamped.

Recorded outputs: columns named <output>_rec[unit] (hp_rec[ft], cas_rec[kt],
mach_rec, sat_rec[degC], tas_rec[kt]; outputs hp hbaro qc mach cas eas tas sat rho hd
q) are compared with the computed outputs: <output>_diff[unit] = recorded - reference
per row, in the recorded unit, and a summary (max |diff| with row and time, mean, rms,
by pressure-altitude, CAS or Mach band and by phase).  Rows with a missing recorded
value or a rejected reference are counted, not compared.

The file is streamed in chunks: memory stays flat for any size.  A progress bar shows
on standard error when it is a terminal.  Use "-" for standard input or output.

Exit status: 0 done (also with bad rows unless --fail-on-bad), 1 data error
(unreadable file, missing column, bad unit in the header), 2 usage error.
"""


@dataclass
class Summary:
    """What a run did.

    Attributes
    ----------
    rows : int
        Data rows written (equal to the data rows read).
    counts : dict of str to int
        Rows per status name.
    seconds : float
        Wall time of the run.
    columns : list of str
        The output header.
    plot : dict or None
        What ``--plot`` drew (rows shown, rows read, stride, rejected rows, time shape).
    """

    rows: int = 0
    counts: dict[str, int] = field(default_factory=lambda: {s.name: 0 for s in Status})
    seconds: float = 0.0
    columns: list[str] = field(default_factory=list)
    comparison: Comparison | None = None
    recorded: RecordedComparison | None = None
    notes: list[str] = field(default_factory=list)
    first_note: str = ""
    plot: dict[str, Any] | None = None

    @property
    def bad(self) -> int:
        """Rows whose outputs are NaN."""
        return sum(n for name, n in self.counts.items()
                   if name not in ("OK", "IMPACT_PRESSURE_ZEROED"))


# --------------------------------------------------------------------------- options

def _assignment(text: str) -> tuple[str, str]:
    role, sep, value = text.partition("=")
    roles = [r for r, _, _ in ROLES]
    if not sep or role.strip() not in roles or not value.strip():
        raise argparse.ArgumentTypeError(
            f"{text!r}: write ROLE=VALUE with ROLE one of {', '.join(roles)}")
    return role.strip(), value.strip()


def register(subparsers: argparse._SubParsersAction) -> None:
    """Add the ``reduce`` sub-command."""
    p = subparsers.add_parser(
        COMMAND, help="run the air-data chain over a recorded CSV series",
        description=DESCRIPTION, epilog=caution(),
        formatter_class=argparse.RawDescriptionHelpFormatter)
    allow_negative_values(p)
    p.add_argument("input", metavar="IN.csv", help='recorded series ("-": standard input)')
    p.add_argument("-o", "--output", metavar="OUT.csv", required=True,
                   help='reduced series ("-": standard output)')
    add_profile(p)
    p.add_argument("--setting", type=quantity_type("pressure"), metavar="P",
                   help="altimeter setting for every row, e.g. 1013.2hPa or 29.92inHg "
                        "(adds hbaro; not with a setting column)")
    p.add_argument("--recovery", type=float, default=1.0, metavar="R",
                   help="recovery factor of the TAT probe, in [0, 1] (default 1)")
    p.add_argument("--noise-band", type=quantity_type("pressure"), metavar="P",
                   default=None,
                   help=f"negative impact pressure read as zero (default {NOISE_BAND:g}Pa)")
    p.add_argument("--col", type=_assignment, action="append", default=[],
                   metavar="ROLE=HEADER",
                   help="take ROLE (ps, pt, tat, setting, time) from the column named HEADER")
    p.add_argument("--unit", type=_assignment, action="append", default=[],
                   metavar="ROLE=UNIT", help="unit of a ROLE column whose header has none")
    p.add_argument("--only", metavar="LIST",
                   help="comma-separated outputs to write, e.g. hp,cas,mach (default: all)")
    p.add_argument("--prefix", default="", metavar="TEXT",
                   help="prefix of the output column names (to avoid clashes)")
    p.add_argument("--digits", type=int, default=None, metavar="N",
                   help="significant digits of the outputs (default: each quantity at its "
                        "stated resolution, see Output format)")
    p.add_argument("--exact", action="store_true",
                   help="write the outputs in full binary64 precision (shortest form that "
                        "reads back bit for bit)")
    p.add_argument("--chunk", type=int, default=20000, metavar="ROWS",
                   help="rows per chunk (default 20000)")
    p.add_argument("--delimiter", default=None, metavar="CHAR",
                   help="field separator: one character, or tab (also \\t); default: "
                        "detected from the header line (, ; or tab)")
    p.add_argument("--decimal", choices=("auto", ".", ","), default="auto",
                   help="decimal sign of the number fields (default: detected; a decimal "
                        "comma needs ; or tab as delimiter)")
    p.add_argument("--encoding", default="auto", metavar="NAME",
                   help="text encoding of a CSV input (default: UTF-8, read as Latin-1 when "
                        "the start of the file is not UTF-8)")
    p.add_argument("--engine", choices=("reference", "cport"), default="reference",
                   help="what computes the outputs: the Python reference (default) or the "
                        "bundled C port, compiled for the --profile given")
    p.add_argument("--precision", choices=("double", "single"), default="double",
                   help="build of the C port for --engine cport and --compare: binary64 "
                        "(default) or binary32")
    p.add_argument("--compare", action="store_true",
                   help="run the reference and the C port on every row and report the "
                        "samples where they disagree beyond the vectors' bound "
                        "K eps scale (exit status 1 if any)")
    from ..portcheck.commands import add_port_options

    add_port_options(p.add_argument_group(
        "your own port", "with --compare or --engine cport: replay the series through your "
        "port's ad_air_data (airdata.h), compiled as 'airdata port check' compiles it, in "
        "the --precision given"))
    p.add_argument("--ignore-recorded", action="store_true",
                   help="pass <output>_rec columns through without comparing them")
    p.add_argument("--plot", metavar="FILE",
                   help="draw the main outputs against time into FILE (.png, .pdf, .svg); "
                        "needs matplotlib")
    p.add_argument("--fail-on-bad", action="store_true",
                   help="exit with status 1 if any row is INVALID_INPUT or OUT_OF_RANGE")
    p.add_argument("--json", action="store_true",
                   help="print a summary as JSON on standard output")
    p.add_argument("-q", "--quiet", action="store_true", help="no summary on standard error")
    add_output_units(p)
    p.set_defaults(func=run, _parser=p)


# --------------------------------------------------------------------------- planning

@dataclass
class _Plan:
    roles: dict[str, Column]
    role_units: dict[str, str]
    outputs: list[tuple[str, str, str]]  # (key, header, unit)
    width: int
    recorded: list[RecordedColumn] = field(default_factory=list)
    phase: Column | None = None


def _plan(reader: ChunkReader, args: argparse.Namespace) -> _Plan:
    wanted = dict(args.col)
    given_units = dict(args.unit)
    by_name: dict[str, list[Column]] = {}
    for c in reader.columns:
        by_name.setdefault(c.key, []).append(c)
    found = ", ".join(c.header for c in reader.columns)
    roles: dict[str, Column] = {}
    role_units: dict[str, str] = {}
    for role, dim, required in ROLES:
        name = wanted.get(role, role)
        matches = by_name.get(name.casefold(), [])
        if not matches and role in wanted:
            # --col may name the full header cell, unit included
            matches = [c for c in reader.columns
                       if c.header.strip().casefold() == name.casefold()]
        if not matches:
            if required:
                raise HeaderError(f"no column {name!r} ({_role_words(role)}) in the header; "
                                  f"columns found: {found} (fields read as separated by "
                                  f"{_delimiter_words(reader.dialect.delimiter)}; give "
                                  "--delimiter or --col ROLE=HEADER if that is wrong)")
            continue
        if len(matches) > 1:
            raise HeaderError(f"{len(matches)} columns named {name!r}: "
                              + ", ".join(c.header for c in matches))
        col = matches[0]
        unit = given_units.get(role) or col.unit
        if unit is not None and dim is not None:
            try:
                unit = u.normalize_unit(unit)
            except ValueError:
                raise HeaderError(
                    f"column {col.header!r}: unknown unit {unit!r}; units of {dim}: "
                    f"{', '.join(u.units_of(dim))} (also spellings such as mb, C, F, kts)"
                ) from None
        if col.unit and role in given_units and not _same(given_units[role], col.unit):
            raise HeaderError(f"column {col.header!r} says unit {col.unit!r} but --unit gives "
                              f"{given_units[role]!r}")
        if dim is not None:
            if unit is None:
                raise HeaderError(
                    f"column {col.header!r} carries no unit: name it like {name}[hPa] "
                    f"or give --unit {role}=UNIT; units of {dim}: "
                    f"{', '.join(u.units_of(dim))}")
            if unit not in u.UNITS or u.dimension(unit) != dim:
                raise HeaderError(
                    f"column {col.header!r}: unit {unit!r} is not a {dim} unit; units of "
                    f"{dim}: {', '.join(u.units_of(dim))}")
        roles[role] = col
        role_units[role] = unit or ""
    if "setting" in roles and args.setting is not None:
        raise HeaderError(f"both a setting column ({roles['setting'].header!r}) and --setting "
                          "given: use one")
    with_setting = "setting" in roles or args.setting is not None
    ou = output_units(args)
    selected = [o for o in OUTPUTS if o[0] != "baro_altitude" or with_setting]
    if args.only:
        names = [s.strip() for s in args.only.split(",") if s.strip()]
        known = {o[1]: o for o in selected}
        unknown = [n for n in names if n not in known]
        if unknown:
            raise _UsageError(f"--only: unknown output(s) {', '.join(unknown)}; outputs: "
                         f"{', '.join(known)}")
        selected = [known[n] for n in names]
    outputs = [(key, f"{args.prefix}{name}[{ou[dim]}]", ou[dim]) for key, name, dim in selected]
    recorded = [] if args.ignore_recorded else _recorded_columns(
        reader.columns, roles, with_setting, args.prefix)
    clash = {h for _, h, _ in outputs} & {c.header for c in reader.columns}
    clash |= {r.diff_header for r in recorded} & {c.header for c in reader.columns}
    for extra in ("status", "note"):
        if f"{args.prefix}{extra}" in {c.header for c in reader.columns}:
            clash.add(f"{args.prefix}{extra}")
    if clash:
        raise HeaderError(f"output column(s) {', '.join(sorted(clash))} already in the input; "
                          "give --prefix, e.g. --prefix ref_")
    phase = next((c for c in reader.columns if c.key == "phase" and c not in roles.values()),
                 None)
    return _Plan(roles, role_units, outputs, len(reader.header), recorded, phase)


def _recorded_columns(columns: list[Column], roles: dict[str, Column], with_setting: bool,
                      prefix: str) -> list[RecordedColumn]:
    """The ``<output>_rec`` columns of the header (see the module docstring)."""
    names = recorded_names()
    info = {key: (short, dim, band) for key, short, dim, band, _ in RECORDED}
    accepted = ", ".join(f"{short} ({words})" for _, short, _, _, words in RECORDED)
    found: list[RecordedColumn] = []
    seen: dict[str, str] = {}
    for c in columns:
        if not c.key.endswith(RECORDED_SUFFIX) or c in roles.values():
            continue
        base = c.key[:-len(RECORDED_SUFFIX)]
        if base not in names:
            raise HeaderError(
                f"column {c.header!r}: {base!r} is not a recorded output; a recorded "
                f"output column is named <output>_rec[unit] with <output> one of: "
                f"{accepted} (or the full name, e.g. pressure_altitude_rec); rename the "
                "column or give --ignore-recorded")
        key = names[base]
        short, dim, band = info[key]
        if key in seen:
            raise HeaderError(f"columns {seen[key]!r} and {c.header!r} both record {short}: "
                              "keep one")
        seen[key] = c.header
        if key == "baro_altitude" and not with_setting:
            raise HeaderError(f"column {c.header!r}: comparing hbaro needs an altimeter "
                              "setting (a setting column or --setting)")
        unit = c.unit
        if unit is None and dim == "dimensionless":
            unit = "1"
        if unit is None:
            raise HeaderError(f"column {c.header!r} carries no unit: name it like "
                              f"{c.name}[{u.units_of(dim)[0]}]; units of {dim}: "
                              f"{', '.join(u.units_of(dim))}")
        try:
            unit = u.normalize_unit(unit)
        except ValueError:
            unit = ""
        if unit not in u.UNITS or u.dimension(unit) != dim:
            raise HeaderError(f"column {c.header!r}: unit {c.unit!r} is not a {dim} unit; "
                              f"units of {dim}: {', '.join(u.units_of(dim))}")
        found.append(RecordedColumn(c.index, c.header, key, short, unit,
                                    f"{prefix}{short}_diff[{unit}]", band))
    return found


def _delimiter_words(d: str) -> str:
    return {",": "commas", ";": "semicolons", "\t": "tabs"}.get(d, repr(d))


def _same(a: str, b: str) -> bool:
    try:
        return u.normalize_unit(a) == u.normalize_unit(b)
    except ValueError:
        return a == b


def _role_words(role: str) -> str:
    return {"ps": "static pressure", "pt": "total pressure", "tat": "total air temperature",
            "setting": "altimeter setting", "time": "time"}[role]


class _UsageError(Exception):
    """A usage error found after parsing (exit status 2)."""


# --------------------------------------------------------------------------- chunks

@dataclass
class _Chunk:
    """One chunk reduced: outputs in output units, status, notes, and the inputs."""

    values: NDArray[np.float64]  # (n, k) in output units
    status: NDArray[np.int8]
    notes: list[str]
    time: NDArray[np.float64] | None
    tat: NDArray[np.float64]  # SI
    out: AirData
    ragged: list[int]


def _column(rows: list[list[str]], index: int, ragged: bool) -> list[str]:
    if not ragged:
        return list(map(itemgetter(index), rows))
    return [r[index] if index < len(r) else "" for r in rows]


def reduce_chunk(rows: list[list[str]], plan: _Plan, args: argparse.Namespace,
                 comparison: Comparison | None = None, first_row: int = 1,
                 recorded: RecordedComparison | None = None,
                 timeaxis: TimeAxis | None = None) -> _Chunk:
    """Reduce one chunk of rows (lists of field strings).

    ``comparison`` (with ``--compare``) collects the disagreements of the reference and
    the C port; ``first_row`` is the data row number (from 1) of the chunk's first row;
    ``recorded`` collects the differences of the recorded outputs (its difference
    columns follow the outputs in the chunk's values); ``timeaxis`` reads the time
    column (numbers, clock times or ISO date-times) and counts the unreadable ones.
    """
    n = len(rows)
    width = plan.width
    lengths = np.fromiter(map(len, rows), dtype=np.int64, count=n)
    ragged_mask = lengths != width
    ragged = bool(ragged_mask.any())
    notes = [""] * n
    si: dict[str, NDArray[np.float64]] = {}
    unreadable = np.zeros(n, dtype=bool)
    time_values = None
    for role, col in plan.roles.items():
        fields = _column(rows, col.index, ragged)
        if role == "time":
            time_values = (timeaxis.parse(fields, first_row) if timeaxis is not None
                           else parse_numbers(fields)[0])
            continue
        values, bad = parse_numbers(fields)
        unreadable |= bad
        for i in np.flatnonzero(bad):
            text = fields[i]
            what = "empty" if not text.strip() else f"not a number ({text!r})"
            notes[i] = _join(notes[i], f"{col.header}: {what}")
        si[role] = np.asarray(u.to_si(values, plan.role_units[role]), dtype=np.float64)
    for i in np.flatnonzero(ragged_mask):
        r = rows[i]
        msg = f"row has {len(r)} fields, the header {width}"
        if len(r) > width:
            msg += "; extra fields: " + ", ".join(repr(x) for x in r[width:])
        notes[i] = _join(notes[i], msg)
    setting = si.get("setting")
    if setting is None and args.setting is not None:
        setting = np.full(n, args.setting.si)
    noise = NOISE_BAND if args.noise_band is None else args.noise_band.si
    ps, pt, tat = si["ps"], si["pt"], si["tat"]
    if ragged:  # a malformed row is not trusted: NaN inputs make it INVALID_INPUT
        ps = np.where(ragged_mask, np.nan, ps)
    out = ref = port = None
    if args.engine == "reference" or args.compare:
        out = ref = air_data(ps, pt, tat, args.recovery, setting, noise_band=noise,
                             profile=args.profile, strict=False)
    if args.engine == "cport" or args.compare:
        from .compare import port_air_data
        user = getattr(args, "user_port", None)
        port = (user.air_data(ps, pt, tat, args.recovery, setting, noise, args.profile)
                if user is not None else
                port_air_data(ps, pt, tat, args.recovery, setting, noise, args.profile,
                              args.precision))
        if args.engine == "cport":
            out = port
    assert out is not None
    if comparison is not None and ref is not None and port is not None:
        from .compare import compare_chunk
        compare_chunk(comparison, first_row, ps, pt, tat, args.recovery, setting, noise,
                      args.profile, ref, port)
    status = np.asarray(out.status, dtype=np.int8)
    for i in np.flatnonzero(status != Status.OK):
        if notes[i]:
            continue
        if status[i] == Status.IMPACT_PRESSURE_ZEROED:
            notes[i] = _ZEROED_NOTE
        else:
            notes[i] = _domain_note(ps[i], pt[i], tat[i], args.recovery,
                                    None if setting is None else setting[i], noise, args.profile)
    cols = []
    for key, _, unit in plan.outputs:
        cols.append(np.asarray(u.from_si(np.asarray(getattr(out, key)), unit)))
    if recorded is not None and plan.recorded:
        rec = np.empty((n, len(plan.recorded)))
        unread = np.zeros((n, len(plan.recorded)), dtype=bool)
        for j, rc in enumerate(plan.recorded):
            rec[:, j], unread[:, j] = parse_numbers(_column(rows, rc.index, ragged))
        times = _column(rows, plan.roles["time"].index, ragged) if "time" in plan.roles \
            else None
        phases = _column(rows, plan.phase.index, ragged) if plan.phase is not None else None
        diffs = recorded.add(first_row, rec, unread, out, times, phases)
        cols.extend(diffs.T)
    values = np.column_stack(cols) if cols else np.empty((n, 0))
    return _Chunk(values, status, notes, time_values, tat, out,
                  np.flatnonzero(ragged_mask).tolist())


def _join(a: str, b: str) -> str:
    return f"{a}; {b}" if a else b


def _domain_note(ps: float, pt: float, tat: float, recovery: float, setting: float | None,
                 noise: float, profile: str) -> str:
    """The library's own message for one bad row (values in SI units)."""
    try:
        air_data(float(ps), float(pt), float(tat), recovery, setting, noise_band=noise,
                 profile=profile, strict=True)
    except DomainError as exc:
        return f"{exc} (SI units)"
    return "rejected by the air-data chain"  # pragma: no cover - status and strict agree


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


class _CsvSink:
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


class _ArrowSink:
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


# --------------------------------------------------------------------------- the run

def run(args: argparse.Namespace) -> int:
    """Run ``airdata reduce``; returns the exit status."""
    parser: argparse.ArgumentParser = args._parser
    if args.chunk < 1:
        parser.error("--chunk must be at least 1")
    if args.digits is not None and not 1 <= args.digits <= 17:
        parser.error("--digits must be in [1, 17]")
    if args.digits is not None and args.exact:
        parser.error("--digits and --exact: choose one")
    if args.delimiter is not None:
        try:
            args.delimiter = delimiter_option(args.delimiter)
        except ValueError as exc:
            parser.error(str(exc))
    try:  # refuse what cannot be honoured before any work
        out_format = file_format(args.output)[0]
        in_format = file_format(args.input)[0]
    except HeaderError as exc:
        return fail(COMMAND, str(exc), 1)
    if "arrow" in (out_format, in_format) or "parquet" in (out_format, in_format):
        if not pyarrow_available():
            return fail(COMMAND, "Parquet and Arrow files need pyarrow, which is not "
                        "installed: pip install 'airdata[arrow]' (or use CSV)", 1)
    if args.plot:
        from .plotting import check_extension
        try:
            check_extension(args.plot)
        except ValueError as exc:
            return fail(COMMAND, str(exc), 1)
    if args.json and args.output == "-":
        parser.error("--json and -o - both write to standard output: choose one")
    if not 0.0 <= args.recovery <= 1.0:
        parser.error(f"--recovery {args.recovery!r} is outside [0, 1]")
    if args.output != "-" and args.input != "-" and os.path.exists(args.output) \
            and os.path.samefile(args.input, args.output):
        parser.error("the output would overwrite the input")
    if args.plot:
        from .plotting import PlotUnavailableError, check_available
        try:
            check_available()
        except PlotUnavailableError as exc:
            return fail(COMMAND, str(exc), 1)
    user_port = args.source or args.library
    if user_port and not (args.engine == "cport" or args.compare):
        parser.error("--source and --library name the port that --compare or --engine "
                     "cport runs: add one of them")
    if (args.engine == "cport" or args.compare) and not user_port:
        from .compare import available
        if not available():
            return fail(COMMAND, "the C port (airdata._cport64/_cport32) is not built: "
                        "reinstall the package with a C compiler, or run without "
                        "--engine cport/--compare", 1)
    if user_port:
        failed = _build_user_port(args)
        if failed is not None:
            return failed
    try:
        summary = _run(args)
    except _UsageError as exc:
        parser.error(str(exc))
    except KeyboardInterrupt:
        return fail(COMMAND, "interrupted (an output file is not left behind)", 130)
    except BrokenPipeError:  # the reader of standard output went away (e.g. "| head")
        return quiet_broken_pipe()
    except (HeaderError, csv.Error, UnicodeDecodeError) as exc:
        return fail(COMMAND, str(exc), 1)
    except FileNotFoundError as exc:
        return fail(COMMAND, f"{exc.filename}: no such file", 1)
    except DomainError as exc:
        return fail(COMMAND, str(exc), 1)
    finally:
        if getattr(args, "user_port", None) is not None:
            args.user_port.close()
    cmp = summary.comparison
    if args.json:
        doc = {"input": args.input, "output": args.output, "rows": summary.rows,
               "status_counts": summary.counts, "columns": summary.columns,
               "seconds": round(summary.seconds, 3), "profile": args.profile,
               "engine": args.engine, "plot": args.plot}
        if args.engine == "cport":
            doc["precision"] = args.precision
        if cmp is not None:
            doc["compare"] = cmp.as_dict()
        if summary.recorded is not None:
            doc["recorded"] = summary.recorded.as_dict()
        if summary.plot is not None:
            doc["plot_content"] = summary.plot
        json.dump(doc, sys.stdout, indent=2)
        sys.stdout.write("\n")
    if not args.quiet:
        rate = summary.rows / summary.seconds if summary.seconds > 0 else float("inf")
        counts = ", ".join(f"{n} {name}" for name, n in summary.counts.items() if n)
        print(f"airdata reduce: {summary.rows} rows ({counts or 'none'}) in "
              f"{summary.seconds:.2f} s, {rate:,.0f} rows/s -> {args.output}", file=sys.stderr)
        for note in summary.notes:
            print(f"airdata reduce: note: {note}", file=sys.stderr)
        if summary.recorded is not None:
            print(recorded_report(summary.recorded), file=sys.stderr)
    if cmp is not None:
        if not args.quiet:
            _report_comparison(cmp)
        if cmp.disagreements:
            return fail(COMMAND, f"reference and C port ({args.precision}) disagree on "
                        f"{cmp.disagreeing_samples} of {cmp.samples} samples", 1)
    if summary.rows and summary.bad == summary.rows:
        return fail(COMMAND, f"every one of the {summary.rows} rows was rejected; first "
                    f"reason: {summary.first_note} (the output is written with each row's "
                    "status; check the delimiter, decimal sign and units of the file)", 1)
    if args.fail_on_bad and summary.bad:
        return fail(COMMAND, f"{summary.bad} row(s) could not be reduced", 1)
    return 0


def _fmt(value: float | None, unit: str, signed: bool = False) -> str:
    if value is None:
        return "-"
    d = DECIMALS.get(unit, 3) + 1
    return f"{value:+.{d}f}" if signed else f"{value:.{d}f}"


def recorded_report(rec: RecordedComparison) -> str:
    """The readable summary of the recorded-output comparison (lines of text)."""
    doc = rec.as_dict()
    lines = [f"airdata reduce: recorded outputs vs {rec.engine} "
             "(diff = recorded - reference, in the recorded column's unit)"]
    for o in doc["outputs"]:
        unit = o["unit"]
        uw = "" if unit == "1" else f" {unit}"
        miss = (f"{o['not_compared']} not compared ({o['recorded_missing']} recorded value "
                f"missing, {o['reference_missing']} row(s) rejected)")
        if o["compared"]:
            where = f"row {o['row']}" + (f", time {o['time']}" if o["time"] is not None else "")
            lines.append(f"  {o['column']} -> {o['diff_column']}: {o['compared']} compared, "
                         f"{miss}; max |diff| {_fmt(o['max_abs_diff'], unit)}{uw} "
                         f"({_fmt(o['max_diff'], unit, True)} at {where}), mean "
                         f"{_fmt(o['mean'], unit, True)}, rms {_fmt(o['rms'], unit)}{uw}")
        else:
            lines.append(f"  {o['column']}: nothing compared, {miss}")
        groups = [(f"by {o['band_by']} band", "band", o["bands"], o["largest_band"])]
        if "phases" in o:
            groups.append(("by phase", "phase", o["phases"], o["largest_phase"]))
        for title, name, items, largest in groups:
            if not items:
                continue
            lines.append(f"    {title} (largest rms: {largest}):")
            w = max(len(str(it[name])) for it in items)
            for it in items:
                lines.append(f"      {str(it[name]):<{w}}  {it['compared']:>6}  max |diff| "
                             f"{_fmt(it['max_abs_diff'], unit):>10} (row {it['row']})  mean "
                             f"{_fmt(it['mean'], unit, True):>10}  rms "
                             f"{_fmt(it['rms'], unit):>10}")
    return "\n".join(lines)


def _report_comparison(cmp: Comparison) -> None:
    d = cmp.as_dict()
    print(f"airdata reduce: compare reference vs C port ({cmp.precision}): "
          f"{cmp.disagreeing_samples} of {cmp.samples} samples disagree beyond "
          f"K eps scale (K = {d['k']}, eps = {d['eps']:.3g})", file=sys.stderr)
    if cmp.worst:
        worst = max(cmp.worst.items(), key=lambda kv: kv[1])
        print(f"  largest |port - reference| / bound (upper estimate): {worst[1]:.3g} "
              f"({worst[0]})",
              file=sys.stderr)
    short = {key: name for key, name, _ in OUTPUTS}
    if cmp.worst_abs:
        parts = []
        for key, (v, row) in cmp.worst_abs.items():
            unit = cmp.difference_unit(key)
            where = f" (row {row})" if v > 0 else ""
            parts.append(f"{short.get(key, key)} {cmp.in_units(key, v, difference=True):.3g}"
                         f"{'' if unit == '1' else ' ' + unit}{where}")
        print("  largest |port - reference|: " + ", ".join(parts), file=sys.stderr)
    for dis in cmp.kept[:20]:
        if dis.output == "status":
            print(f"  row {dis.row}: status: reference {dis.reference}, port {dis.port}",
                  file=sys.stderr)
            continue
        unit, dunit = cmp.unit(dis.output), cmp.difference_unit(dis.output)
        ref_v = cmp.in_units(dis.output, float(dis.reference))
        port_v = cmp.in_units(dis.output, float(dis.port))
        diff = cmp.in_units(dis.output, float(dis.port) - float(dis.reference), True)
        bound = cmp.in_units(dis.output, dis.bound, True)
        print(f"  row {dis.row}: {short.get(dis.output, dis.output)}: reference {ref_v!r} "
              f"{unit}, port {port_v!r} {unit}, port - reference {diff:.3g} {dunit}, bound "
              f"{bound:.3g} {dunit}", file=sys.stderr)
    if cmp.disagreements > 20:
        print(f"  ... {cmp.disagreements - 20} more (--json lists the first {cmp.limit})",
              file=sys.stderr)


def _run(args: argparse.Namespace) -> Summary:
    start = time.monotonic()
    reader = ChunkReader(args.input, args.chunk, args.delimiter, args.decimal, args.encoding)
    try:
        plan = _plan(reader, args)
        header = list(reader.header) + [h for _, h, _ in plan.outputs] \
            + [r.diff_header for r in plan.recorded] \
            + [f"{args.prefix}status", f"{args.prefix}note"]
        summary = Summary(columns=header)
        dialect = reader.dialect
        summary.notes.extend(dialect.notes)
        if args.compare:
            ou = output_units(args)
            user = getattr(args, "user_port", None)
            summary.comparison = Comparison(
                args.precision, units={key: ou[dim] for key, _, dim in OUTPUTS},
                port="bundled" if user is None else user.label)
        if plan.recorded:
            summary.recorded = RecordedComparison(plan.recorded, args.engine,
                                                  "time" in plan.roles, plan.phase is not None,
                                                  output_units(args))
        collector = None
        timeaxis = TimeAxis() if "time" in plan.roles else None
        if args.plot:
            from .plotting import Collector
            collector = Collector(PLOT_POINTS, plan, output_units(args), timeaxis)
        progress = Progress(reader.size)
        out_format = file_format(args.output)[0]
        sink: _CsvSink | _ArrowSink
        if out_format == "csv":
            sink = _CsvSink(args.output, dialect.delimiter, dialect.decimal, args.digits)
        else:
            sink = _ArrowSink(args.output, out_format, plan.width)
        units = [unit for _, _, unit in plan.outputs] + [r.unit for r in plan.recorded]
        try:
            sink.header(header)
            width = plan.width
            if reader.unit_row is not None and isinstance(sink, _CsvSink):
                # keep the file's shape: a units row under the names row
                sink.header((reader.unit_row + [""] * width)[:width] + units + ["", ""])
            for rows in reader.chunks():
                if dialect.decimal == ",":
                    ch = reduce_chunk(_decimal_points(rows, plan), plan, args,
                                      summary.comparison, summary.rows + 1, summary.recorded,
                                      timeaxis)
                else:
                    ch = reduce_chunk(rows, plan, args, summary.comparison, summary.rows + 1,
                                      summary.recorded, timeaxis)
                values = ch.values if out_format == "csv" and args.digits is not None \
                    else round_outputs(ch.values, units, args.digits, args.exact)
                names = [_STATUS_NAMES[s] for s in ch.status.tolist()]
                for i in ch.ragged:  # keep the columns aligned; extra fields are in the note
                    rows[i] = (rows[i] + [""] * width)[:width]
                sink.write(rows, values, names, ch.notes)
                for s, n in zip(*np.unique(ch.status, return_counts=True), strict=True):
                    summary.counts[_STATUS_NAMES[int(s)]] += int(n)
                if not summary.first_note:
                    summary.first_note = next((nt for nt in ch.notes if nt), "")
                summary.rows += len(rows)
                if collector is not None:
                    collector.add(ch)
                progress.update(reader.position(), summary.rows)
            progress.update(reader.position(), summary.rows, force=True)
        except BaseException:
            progress.close()
            sink.abort()
            raise
        progress.close()
        sink.finish()
        if reader.comments:
            summary.notes.append(f"{reader.comments} comment line(s) starting with # skipped")
        if timeaxis is not None and timeaxis.unreadable:
            row, text = timeaxis.first_unreadable or (0, "")
            summary.notes.append(
                f"time column {plan.roles['time'].header!r}: {timeaxis.unreadable} row(s) "
                f"without a readable {timeaxis.kind or 'time'} value (first: data row {row}, "
                f"{text!r})" + ("; they are not in the plot" if collector is not None else ""))
        if collector is not None:
            from .plotting import draw
            summary.plot = draw(collector, args.plot,
                                title=f"airdata reduce {os.path.basename(args.input)}",
                                profile=args.profile)
    finally:
        reader.close()
    summary.seconds = time.monotonic() - start
    return summary


def _build_user_port(args: argparse.Namespace) -> int | None:
    """Compile the port of --source/--library before any work; the exit status on error."""
    from ..portcheck.build import PortBuildError
    from ..portcheck.commands import port_spec
    from .compare import UserPort

    if args.profile == "us1976" and all(n != "AIRDATA_PROFILE_US1976" for n, _ in args.define):
        args.define.append(("AIRDATA_PROFILE_US1976", None))
    spec = port_spec(args)
    try:
        args.user_port = UserPort(spec, args.precision)
    except PortBuildError as exc:
        if "undefined symbol" in exc.output or "does not define" in exc.what:
            return fail(COMMAND, f"the port ({spec.label}, {args.precision}) does not define "
                        "ad_air_data: reduce replays a series through the port's air-data "
                        "chain (airdata.h); 'airdata port check' judges the functions a port "
                        "has", 1)
        return fail(COMMAND, str(exc), 1)
    return None


def _decimal_points(rows: list[list[str]], plan: _Plan) -> list[list[str]]:
    """Rows whose quantity fields have the decimal comma replaced by a point (a copy)."""
    idx = [c.index for c in plan.roles.values()] + [r.index for r in plan.recorded]
    out = []
    for row in rows:
        r = list(row)
        for i in idx:
            if i < len(r):
                r[i] = r[i].replace(",", ".")
        out.append(r)
    return out
