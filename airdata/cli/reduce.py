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
or ISO 8601 date-times; see :mod:`airdata.series.timebase`).  ``--col ROLE=HEADER`` picks a
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
import csv
import json
import os
import sys
from typing import Any

from ..chain import NOISE_BAND
from ..series.compare import Comparison
from ..series.csvio import HeaderError, delimiter_option, file_format, pyarrow_available
from ..series.options import ReduceOptions
from ..series.plan import OUTPUTS, ROLES, UsageError
from ..series.recorded import RecordedComparison
from ..series.run import PLOT_POINTS, Summary, reduce_series
from ..series.sinks import RESOLUTION_DECIMALS
from ..status import DomainError
from .messages import fail
from .parsers import add_command
from .quantities import (
    DECIMALS,
    add_output_units,
    add_profile,
    output_units,
    quantity_type,
    quiet_broken_pipe,
)

__all__ = ["register", "run", "OUTPUTS", "PLOT_POINTS", "RESOLUTION_DECIMALS", "Summary"]

COMMAND = "reduce"

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
    p = add_command(subparsers, COMMAND, description=DESCRIPTION, desk=True)
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
    from .port import add_port_options

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


def _options(args: argparse.Namespace, user_port: Any) -> ReduceOptions:
    """The reduction the parsed command line asks for (quantities in SI units)."""
    return ReduceOptions(
        input=args.input, output=args.output, profile=args.profile,
        setting=None if args.setting is None else args.setting.si,
        recovery=args.recovery,
        noise_band=NOISE_BAND if args.noise_band is None else args.noise_band.si,
        columns=dict(args.col), column_units=dict(args.unit),
        only=[s.strip() for s in args.only.split(",") if s.strip()] if args.only else None,
        prefix=args.prefix, digits=args.digits, exact=args.exact, chunk=args.chunk,
        delimiter=args.delimiter, decimal=args.decimal, encoding=args.encoding,
        engine=args.engine, precision=args.precision, compare=args.compare,
        ignore_recorded=args.ignore_recorded, plot=args.plot,
        output_units=output_units(args), user_port=user_port)


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
        from ..series.plotting import check_extension
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
        from ..series.plotting import PlotUnavailableError, check_available
        try:
            check_available()
        except PlotUnavailableError as exc:
            return fail(COMMAND, str(exc), 1)
    wants_user_port = args.source or args.library
    if wants_user_port and not (args.engine == "cport" or args.compare):
        parser.error("--source and --library name the port that --compare or --engine "
                     "cport runs: add one of them")
    if (args.engine == "cport" or args.compare) and not wants_user_port:
        from ..series.compare import available
        if not available():
            return fail(COMMAND, "the C port (airdata._cport64/_cport32) is not built: "
                        "reinstall the package with a C compiler, or run without "
                        "--engine cport/--compare", 1)
    user_port = None
    if wants_user_port:
        user_port, failed = _build_user_port(args)
        if failed is not None:
            return failed
    try:
        summary = reduce_series(_options(args, user_port))
    except UsageError as exc:
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
        if user_port is not None:
            user_port.close()
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


def _build_user_port(args: argparse.Namespace) -> tuple[Any, int | None]:
    """Compile the port of --source/--library before any work: (the port, None), or
    (None, the exit status) on error."""
    from ..portcheck.build import PortBuildError
    from ..series.compare import UserPort
    from .port import port_spec

    if args.profile == "us1976" and all(n != "AIRDATA_PROFILE_US1976" for n, _ in args.define):
        args.define.append(("AIRDATA_PROFILE_US1976", None))
    spec = port_spec(args)
    try:
        return UserPort(spec, args.precision), None
    except PortBuildError as exc:
        if "undefined symbol" in exc.output or "does not define" in exc.what:
            return None, fail(COMMAND, f"the port ({spec.label}, {args.precision}) does not define "
                        "ad_air_data: reduce replays a series through the port's air-data "
                        "chain (airdata.h); 'airdata port check' judges the functions a port "
                        "has", 1)
        return None, fail(COMMAND, str(exc), 1)
