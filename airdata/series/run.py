"""A whole reduction: the series read in chunks, each reduced and written, the status
counts, notes, comparisons and plot collected into a :class:`Summary`.

An engineering and verification aid, not certified flight software.
"""

from __future__ import annotations

import os
import time
from dataclasses import dataclass, field
from typing import Any

import numpy as np

from ..status import Status
from .chunk import decimal_points, reduce_chunk
from .compare import Comparison
from .csvio import ChunkReader, file_format
from .options import ReduceOptions
from .plan import OUTPUTS
from .plan import plan as make_plan
from .progress import Progress
from .recorded import RecordedComparison
from .sinks import ArrowSink, CsvSink, round_outputs
from .timebase import TimeAxis

__all__ = ["PLOT_POINTS", "STATUS_NAMES", "Summary", "reduce_series"]

#: Most samples kept for ``--plot``.
PLOT_POINTS = 50000

#: Status value -> name, as written in the status column.
STATUS_NAMES = {int(s): s.name for s in Status}


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


def reduce_series(opts: ReduceOptions) -> Summary:
    """Reduce the series ``opts.input`` into ``opts.output``, chunk by chunk; the summary.

    Raises HeaderError, UsageError, csv.Error, UnicodeDecodeError, OSError or
    DomainError naming what is wrong; the output file is then not left behind.
    """
    start = time.monotonic()
    reader = ChunkReader(opts.input, opts.chunk, opts.delimiter, opts.decimal, opts.encoding)
    try:
        plan = make_plan(reader, opts)
        header = list(reader.header) + [h for _, h, _ in plan.outputs] \
            + [r.diff_header for r in plan.recorded] \
            + [f"{opts.prefix}status", f"{opts.prefix}note"]
        summary = Summary(columns=header)
        dialect = reader.dialect
        summary.notes.extend(dialect.notes)
        if opts.compare:
            ou = opts.output_units
            user = opts.user_port
            summary.comparison = Comparison(
                opts.precision, units={key: ou[dim] for key, _, dim in OUTPUTS},
                port="bundled" if user is None else user.label)
        if plan.recorded:
            summary.recorded = RecordedComparison(plan.recorded, opts.engine,
                                                  "time" in plan.roles, plan.phase is not None,
                                                  opts.output_units)
        collector = None
        timeaxis = TimeAxis() if "time" in plan.roles else None
        if opts.plot:
            from .plotting import Collector
            collector = Collector(PLOT_POINTS, plan, opts.output_units, timeaxis)
        progress = Progress(reader.size)
        out_format = file_format(opts.output)[0]
        sink: CsvSink | ArrowSink
        if out_format == "csv":
            sink = CsvSink(opts.output, dialect.delimiter, dialect.decimal, opts.digits)
        else:
            sink = ArrowSink(opts.output, out_format, plan.width)
        units = [unit for _, _, unit in plan.outputs] + [r.unit for r in plan.recorded]
        try:
            sink.header(header)
            width = plan.width
            if reader.unit_row is not None and isinstance(sink, CsvSink):
                # keep the file's shape: a units row under the names row
                sink.header((reader.unit_row + [""] * width)[:width] + units + ["", ""])
            for rows in reader.chunks():
                if dialect.decimal == ",":
                    ch = reduce_chunk(decimal_points(rows, plan), plan, opts,
                                      summary.comparison, summary.rows + 1, summary.recorded,
                                      timeaxis)
                else:
                    ch = reduce_chunk(rows, plan, opts, summary.comparison, summary.rows + 1,
                                      summary.recorded, timeaxis)
                values = ch.values if out_format == "csv" and opts.digits is not None \
                    else round_outputs(ch.values, units, opts.digits, opts.exact)
                names = [STATUS_NAMES[s] for s in ch.status.tolist()]
                for i in ch.ragged:  # keep the columns aligned; extra fields are in the note
                    rows[i] = (rows[i] + [""] * width)[:width]
                sink.write(rows, values, names, ch.notes)
                for s, n in zip(*np.unique(ch.status, return_counts=True), strict=True):
                    summary.counts[STATUS_NAMES[int(s)]] += int(n)
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
            summary.plot = draw(collector, opts.plot,
                                title=f"airdata reduce {os.path.basename(opts.input)}",
                                profile=opts.profile)
    finally:
        reader.close()
    summary.seconds = time.monotonic() - start
    return summary
