"""Recorded series: the library behind ``airdata reduce``, driven by a plain options
object (:class:`~airdata.series.options.ReduceOptions`), no argparse.

``csvio``
    Streaming CSV (and Parquet / Arrow) input: header, units, dialect, chunks.
``plan``
    Which columns hold the inputs, which outputs are written, recorded columns.
``chunk``
    One chunk reduced: parsed inputs, the air-data chain, statuses and notes.
``sinks``
    The reduced rows written as CSV, Parquet or Arrow.
``run``
    A whole reduction and its summary (:func:`~airdata.series.run.reduce_series`).
``compare``
    The reference against a C port, and recorded outputs against the reference.
``timebase``, ``plotting``, ``progress``
    Time columns, the plot of a run, the progress bar.

An engineering and verification aid, not certified flight software.
"""
