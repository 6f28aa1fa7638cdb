"""Recorded outputs in a series: values a file carries as ``<name>_rec[unit]`` set
against the reference's, with the differences gathered per band (pressure altitude, CAS
or Mach) for ``reduce --compare-recorded``.
"""

from __future__ import annotations

from dataclasses import dataclass, field
from typing import Any

import numpy as np
from numpy.typing import NDArray

from ..chain import OUTPUT_INFO, AirData

__all__ = ["RECORDED", "RECORDED_SUFFIX", "BANDS", "BAND_EDGES_BY_UNIT", "band_scheme",
           "recorded_names", "band_labels", "RecordedColumn", "RecordedComparison"]

F64 = NDArray[np.float64]


#: Outputs a file may carry as recorded values, ``<name>_rec[unit]``:
#: (AirData key, short name, dimension, band kind, words).
RECORDED: tuple[tuple[str, str, str, str, str], ...] = tuple(
    (o.key, o.short, o.dimension, kind, o.words) for o, kind in zip(OUTPUT_INFO, (
        "altitude", "altitude", "cas", "mach", "cas", "cas", "mach", "mach", "altitude",
        "altitude", "mach"), strict=True))

#: Suffix that marks a recorded output column.
RECORDED_SUFFIX = "_rec"

#: Band kinds: (words, unit of the edges, edges).  A band holds ``lo <= x < hi``; the
#: first band is everything below the first edge, the last everything from the last edge.
#: The band of a row is taken from the reference's pressure altitude, CAS or Mach.
BANDS: dict[str, tuple[str, str, tuple[float, ...]]] = {
    "altitude": ("pressure altitude", "ft", (0.0, 10000.0, 20000.0, 30000.0, 40000.0,
                                             50000.0)),
    "cas": ("CAS", "kt", (100.0, 200.0, 300.0, 400.0)),
    "mach": ("Mach", "1", (0.4, 0.7, 0.9, 1.1, 1.5)),
}

#: Round edges in the other output units a run may use (``--alt-unit``,
#: ``--speed-unit``): the bands follow the units the engineer reads, not only ft and kt.
#: A unit not listed here (ft/min for speeds) keeps the edges of :data:`BANDS`.
BAND_EDGES_BY_UNIT: dict[str, dict[str, tuple[float, ...]]] = {
    "altitude": {"m": (0.0, 3000.0, 6000.0, 9000.0, 12000.0, 15000.0),
                 "km": (0.0, 3.0, 6.0, 9.0, 12.0, 15.0),
                 "FL": (0.0, 100.0, 200.0, 300.0, 400.0, 500.0)},
    "cas": {"m/s": (50.0, 100.0, 150.0, 200.0), "km/h": (200.0, 400.0, 600.0, 800.0),
            "mph": (100.0, 200.0, 300.0, 400.0)},
}


def band_scheme(kind: str, units: dict[str, str] | None = None
                ) -> tuple[str, str, tuple[float, ...]]:
    """(words, unit, edges) of the bands of ``kind`` in the run's output units.

    Parameters
    ----------
    kind : {"altitude", "cas", "mach"}
        What the band is taken from.
    units : dict of str to str, optional
        Output unit per dimension (``length``, ``speed``); default ft and kt.
    """
    words, unit, edges = BANDS[kind]
    dim = {"altitude": "length", "cas": "speed"}.get(kind)
    want = (units or {}).get(dim, unit) if dim else unit
    table = BAND_EDGES_BY_UNIT.get(kind, {})
    if want in table:
        return words, want, table[want]
    return words, unit, edges


def recorded_names() -> dict[str, str]:
    """Accepted names of recorded outputs (without ``_rec``, compared without case) -> key.

    Both the short output names (``hp``, ``cas``, ...) and the :class:`~airdata.AirData`
    field names (``pressure_altitude``, ``cas``, ...) are accepted.
    """
    names: dict[str, str] = {}
    for key, short, _, _, _ in RECORDED:
        names[short] = key
        names[key] = key
    return names


def band_labels(kind: str, units: dict[str, str] | None = None) -> list[str]:
    """Labels of the bands of ``kind`` (``altitude``, ``cas``, ``mach``), in order, in the
    run's output ``units`` (see :func:`band_scheme`)."""
    _, unit, edges = band_scheme(kind, units)
    suffix = "" if unit == "1" else f" {unit}"
    labels = [f"< {edges[0]:g}{suffix}"]
    labels += [f"{lo:g}-{hi:g}{suffix}" for lo, hi in zip(edges[:-1], edges[1:], strict=True)]
    labels.append(f">= {edges[-1]:g}{suffix}")
    return labels


@dataclass
class _Stats:
    """Running count, sum, sum of squares and largest |diff| (first row on a tie)."""

    count: int = 0
    total: float = 0.0
    squares: float = 0.0
    max_abs: float = float("nan")
    max_diff: float = float("nan")
    row: int | None = None
    time: str | None = None

    def add(self, diff: F64, rows: NDArray[np.int64], times: list[str] | None) -> None:
        if diff.size == 0:
            return
        self.count += int(diff.size)
        self.total += float(np.sum(diff))
        self.squares += float(np.sum(diff * diff))
        a = np.abs(diff)
        i = int(np.argmax(a))
        if not self.max_abs >= a[i]:  # NaN (nothing yet) or strictly larger
            self.max_abs = float(a[i])
            self.max_diff = float(diff[i])
            self.row = int(rows[i])
            self.time = None if times is None else times[i]

    def as_dict(self) -> dict[str, Any]:
        n = self.count
        return {"compared": n,
                "max_abs_diff": self.max_abs if n else None,
                "max_diff": self.max_diff if n else None,
                "row": self.row, "time": self.time,
                "mean": self.total / n if n else None,
                "rms": float(np.sqrt(self.squares / n)) if n else None}


@dataclass
class RecordedColumn:
    """A recorded output column of the input and what it is compared with.

    Attributes
    ----------
    index : int
        Position of the column in the row.
    header : str
        The header cell as written.
    key : str
        The :class:`~airdata.AirData` field compared.
    short : str
        Short output name (``hp``, ``cas``, ...).
    unit : str
        Canonical unit of the recorded values (the unit of the differences).
    diff_header : str
        Header of the difference column written.
    band : str
        Band kind of the breakdown (``altitude``, ``cas`` or ``mach``).
    """

    index: int
    header: str
    key: str
    short: str
    unit: str
    diff_header: str
    band: str


@dataclass
class _ColumnTotals:
    rows: int = 0
    recorded_missing: int = 0
    reference_missing: int = 0
    overall: _Stats = field(default_factory=_Stats)
    bands: dict[str, _Stats] = field(default_factory=dict)
    phases: dict[str, _Stats] = field(default_factory=dict)


@dataclass
class RecordedComparison:
    """Running comparison of recorded outputs with the computed ones over a file.

    The difference is ``recorded - reference`` in the unit of the recorded column.  A row
    whose recorded field is empty or not a number counts as ``recorded_missing``; a row
    with a recorded value but no reference value (the row rejected by the chain) counts
    as ``reference_missing``; neither is compared.

    Attributes
    ----------
    columns : list of RecordedColumn
        The recorded columns, in file order.
    engine : str
        What computed the reference values (``reference`` or ``cport``).
    has_time, has_phase : bool
        Whether rows carry a time and a phase.
    units : dict of str to str
        The run's output unit per dimension: the band edges are in these (ft and kt when
        empty; see :func:`band_scheme`).
    """

    columns: list[RecordedColumn]
    engine: str = "reference"
    has_time: bool = False
    has_phase: bool = False
    units: dict[str, str] = field(default_factory=dict)
    totals: list[_ColumnTotals] = field(default_factory=list)

    def __post_init__(self) -> None:
        self.totals = [_ColumnTotals(bands={b: _Stats()
                                            for b in band_labels(c.band, self.units)})
                       for c in self.columns]

    def add(self, first_row: int, recorded: F64, unreadable: NDArray[np.bool_],
            ref: AirData, times: list[str] | None, phases: list[str] | None) -> F64:
        """Add one chunk; return the differences (rows x columns, NaN where not compared).

        Parameters
        ----------
        first_row : int
            Data row number (from 1) of the chunk's first row.
        recorded : ndarray, shape (n, m)
            Recorded values in their columns' units (NaN where missing).
        unreadable : ndarray of bool, shape (n, m)
            Fields that are empty or not a number.
        ref : AirData
            The computed outputs of the chunk (SI units).
        times, phases : list of str or None
            Time and phase fields of the rows, as written.
        """
        from .. import units as u

        n = recorded.shape[0]
        rows = first_row + np.arange(n, dtype=np.int64)
        diffs = np.full((n, len(self.columns)), np.nan)
        band_x = {"altitude": np.asarray(u.from_si(
                      np.asarray(ref.pressure_altitude, float),
                      band_scheme("altitude", self.units)[1])),
                  "cas": np.asarray(u.from_si(np.asarray(ref.cas, float),
                                              band_scheme("cas", self.units)[1])),
                  "mach": np.asarray(ref.mach, float)}
        for j, (col, tot) in enumerate(zip(self.columns, self.totals, strict=True)):
            value = getattr(ref, col.key)
            want = np.full(n, np.nan) if value is None else \
                np.asarray(u.from_si(np.asarray(value, float), col.unit), dtype=float)
            rec = recorded[:, j]
            missing = unreadable[:, j] | ~np.isfinite(rec)
            no_ref = ~missing & ~np.isfinite(want)
            ok = ~missing & ~no_ref
            tot.rows += n
            tot.recorded_missing += int(missing.sum())
            tot.reference_missing += int(no_ref.sum())
            d = rec - want
            diffs[ok, j] = d[ok]
            idx = np.flatnonzero(ok)
            sub_t = None if times is None else [times[i] for i in idx]
            tot.overall.add(d[idx], rows[idx], sub_t)
            _, _, edges = band_scheme(col.band, self.units)
            labels = band_labels(col.band, self.units)
            which = np.searchsorted(np.asarray(edges), band_x[col.band][idx], side="right")
            for b in np.unique(which):
                sel = idx[which == b]
                tot.bands[labels[int(b)]].add(
                    d[sel], rows[sel], None if times is None else [times[i] for i in sel])
            if phases is not None:
                ph = np.asarray([phases[i] for i in idx], dtype=object)
                for name in dict.fromkeys(ph.tolist()):
                    sel = idx[ph == name]
                    tot.phases.setdefault(name, _Stats()).add(
                        d[sel], rows[sel], None if times is None else [times[i] for i in sel])
        return diffs

    def as_dict(self) -> dict[str, Any]:
        """A JSON-ready summary (per recorded column)."""
        out: dict[str, Any] = {"difference": "recorded - reference", "engine": self.engine,
                               "outputs": []}
        for col, tot in zip(self.columns, self.totals, strict=True):
            words, bunit, _ = band_scheme(col.band, self.units)
            bands = [{"band": label, **st.as_dict()} for label, st in tot.bands.items()
                     if st.count]
            doc = {"column": col.header, "output": col.short, "key": col.key,
                   "unit": col.unit, "diff_column": col.diff_header, "rows": tot.rows,
                   "not_compared": tot.recorded_missing + tot.reference_missing,
                   "recorded_missing": tot.recorded_missing,
                   "reference_missing": tot.reference_missing,
                   **tot.overall.as_dict(),
                   "band_by": words, "band_unit": bunit, "bands": bands,
                   "largest_band": _largest(tot.bands)}
            if self.has_phase:
                doc["phases"] = [{"phase": name, **st.as_dict()}
                                 for name, st in tot.phases.items()]
                doc["largest_phase"] = _largest(tot.phases)
            out["outputs"].append(doc)
        return out


def _largest(groups: dict[str, _Stats]) -> str | None:
    """The group of largest rms difference (the first one on a tie)."""
    best, best_rms = None, -1.0
    for name, st in groups.items():
        if st.count:
            rms = st.squares / st.count
            if rms > best_rms:
                best, best_rms = name, rms
    return best

