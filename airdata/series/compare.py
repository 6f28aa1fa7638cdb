"""``reduce --engine cport`` and ``reduce --compare``: the C port on a recorded series.

The port is reached through :mod:`airdata.cport` (same API as the reference, plus
``precision``).  A comparison checks every output of every sample against the
acceptance bound of the golden vectors (:mod:`airdata.vectors.scale`)::

    |port - reference| <= K * eps * scale,   scale = |y| + sum_i |df/dx_i * x_i|

with eps = 2**-52 for the binary64 build and 2**-23 for the binary32 build, NaN
expected exactly where the reference gives NaN, and the same status.  For the
binary32 build the vectors' check level applies (``binary32_check``): a ``skip`` sample
(a value outside the normal binary32 range) is not judged; a ``lenient`` one (the
status may legitimately change under binary32 rounding) has its status not compared
and NaN on either side accepted, while two numbers must still agree within the bound.
The level is computed only for samples where something disagrees.

The scale costs about twenty evaluations of the chain per sample, so it is computed
only for the samples whose difference exceeds K * eps * |y| (a lower bound of the
bound): a clean binary64 run costs little more than two runs of the chain.
"""

from __future__ import annotations

from dataclasses import dataclass, field
from typing import Any

import numpy as np
from numpy.typing import NDArray

from ..chain import AirData
from ..profiles import get_profile
from ..status import Status

__all__ = ["Disagreement", "Comparison", "port_air_data", "compare_chunk", "available",
           "UserPort"]

F64 = NDArray[np.float64]

#: Outputs of the chain, in the order of the catalogue.
_OUTPUTS = ("pressure_altitude", "baro_altitude", "impact_pressure", "mach", "cas", "eas",
            "tas", "sat", "density", "density_altitude", "dynamic_pressure")
_SI_UNITS = {"pressure_altitude": "m", "baro_altitude": "m", "impact_pressure": "Pa",
             "mach": "1", "cas": "m/s", "eas": "m/s", "tas": "m/s", "sat": "K",
             "density": "kg/m3", "density_altitude": "m", "dynamic_pressure": "Pa"}


def available() -> bool:
    """True when the compiled C port can be imported."""
    try:
        from .. import cport

        cport.air_data(101325.0, 101325.0, 288.15)
    except (ImportError, OSError, AttributeError):
        return False
    return True


def port_air_data(ps: F64, pt: F64, tat: F64, recovery: float, setting: F64 | None,
                  noise: float, profile: str, precision: str) -> AirData:
    """The C port's air-data chain on a chunk (``strict=False``), outputs as float64."""
    from .. import cport

    out = cport.air_data(ps, pt, tat, recovery, setting, noise_band=noise, profile=profile,
                         strict=False, precision=precision)
    fields: dict[str, Any] = {}
    for key in _OUTPUTS:
        v = getattr(out, key)
        fields[key] = None if v is None else np.asarray(v, dtype=np.float64)
    return AirData(**fields, status=np.asarray(out.status, dtype=np.int8), profile=out.profile)


class UserPort:
    """A user's port (C sources or a library implementing ``ad_air_data`` of airdata.h),
    compiled the way ``airdata port check`` compiles it, run on each chunk of a series.

    Parameters
    ----------
    spec : PortSpec
        What to compile (:func:`airdata.cli.port.port_spec`).
    precision : {"double", "single"}
        binary64 or binary32 build (``-DAIRDATA_SINGLE``).

    Raises
    ------
    PortBuildError
        The port does not compile, or does not define ``ad_air_data``.
    """

    def __init__(self, spec: Any, precision: str) -> None:
        from ..portcheck.build import build_port
        from ..vectors.catalogue import get_spec

        chain = get_spec("air_data")
        self.label = spec.label
        self._inputs = [(a.name, a.kind) for a in chain.args]
        self._outputs = [k for k, _ in chain.outputs]
        self._c_function = chain.c_name
        self.port = build_port(spec, [self._cases(np.empty((0, len(self._inputs))))],
                               precision)

    def _cases(self, x: F64) -> Any:
        """The series in the shape :class:`airdata.portcheck.build.Port` runs."""
        from types import SimpleNamespace

        return SimpleNamespace(name="air_data", c_function=self._c_function,
                               inputs=self._inputs, outputs=self._outputs, x=x,
                               count=x.shape[0])

    def air_data(self, ps: F64, pt: F64, tat: F64, recovery: float, setting: F64 | None,
                 noise: float, profile: str) -> AirData:
        """The port's chain on a chunk, as an :class:`~airdata.AirData` of float64."""
        n = len(ps)
        use = setting is not None
        cols = {"ps": ps, "pt": pt, "tat": tat, "recovery": np.full(n, float(recovery)),
                "setting": (np.asarray(setting, float) if use
                            else np.full(n, get_profile(profile).p0)),
                "use_setting": np.full(n, 1.0 if use else 0.0),
                "noise_band": np.full(n, float(noise))}
        x = np.column_stack([np.asarray(cols[name], dtype=np.float64)
                             for name, _ in self._inputs])
        y, st = self.port.run(self._cases(x))
        fields: dict[str, Any] = {k: y[:, j].copy() for j, k in enumerate(self._outputs)}
        if not use:
            fields["baro_altitude"] = None
        return AirData(**fields, status=st.astype(np.int8), profile=profile)

    def close(self) -> None:
        """Remove the build directory."""
        self.port.close()


@dataclass(frozen=True)
class Disagreement:
    """One sample and output where the port and the reference disagree.

    Attributes
    ----------
    row : int
        Data row, from 1 (the header is line 1 of the file, this row line ``row + 1``).
    output : str
        Output name (an :class:`~airdata.AirData` field), or ``"status"``.
    reference, port : float or str
        The two values (SI units) or status names.
    bound : float
        The acceptance bound K eps scale (NaN for a status or NaN mismatch).
    """

    row: int
    output: str
    reference: float | str
    port: float | str
    bound: float

    def as_dict(self) -> dict[str, Any]:
        """A JSON-ready record."""
        return {"row": self.row, "output": self.output, "reference": self.reference,
                "port": self.port, "bound": self.bound}


@dataclass
class Comparison:
    """Running totals of a comparison over a file.

    Attributes
    ----------
    samples : int
        Samples compared.
    disagreeing_samples : int
        Samples with at least one disagreement.
    disagreements : int
        Disagreements in total (sample x output).
    kept : list of Disagreement
        The first ``limit`` disagreements.
    port : str
        The port compared: ``"bundled"`` or the user's files.
    worst : dict of str to float
        Largest |port - reference| / bound per output, over every sample.  Where the
        difference was within K eps |y| the full scale was not computed and K eps |y|
        (never more than the bound) stands in, so this is an upper estimate.
    """

    precision: str
    limit: int = 100
    samples: int = 0
    disagreeing_samples: int = 0
    disagreements: int = 0
    kept: list[Disagreement] = field(default_factory=list)
    worst: dict[str, float] = field(default_factory=dict)
    units: dict[str, str] = field(default_factory=dict)
    worst_abs: dict[str, tuple[float, int]] = field(default_factory=dict)
    port: str = "bundled"

    def unit(self, key: str) -> str:
        """The unit an output is reported in (``units``, else its SI unit)."""
        return self.units.get(key, _SI_UNITS.get(key, "1"))

    def in_units(self, key: str, value: float, difference: bool = False) -> float:
        """An output value (or a difference of two) from SI into :meth:`unit`."""
        from .. import units as u

        unit = self.unit(key)
        if difference:
            return value / (float(u.to_si(1.0, unit)) - float(u.to_si(0.0, unit)))
        return float(u.from_si(value, unit))

    def difference_unit(self, key: str) -> str:
        """The unit of a difference of ``key`` (a temperature difference in degC is K)."""
        unit = self.unit(key)
        return "K" if unit == "degC" else unit

    def as_dict(self) -> dict[str, Any]:
        """A JSON-ready summary."""
        from ..vectors.scale import EPS_BINARY32, EPS_BINARY64, K

        eps = EPS_BINARY64 if self.precision == "double" else EPS_BINARY32
        first = []
        for d in self.kept:
            rec = d.as_dict()
            if d.output != "status":
                rec["unit"] = self.unit(d.output)
                rec["reference_in_unit"] = self.in_units(d.output, float(d.reference))
                rec["port_in_unit"] = self.in_units(d.output, float(d.port))
                rec["difference_in_unit"] = self.in_units(
                    d.output, float(d.port) - float(d.reference), difference=True)
                rec["bound_in_unit"] = self.in_units(d.output, d.bound, difference=True)
                rec["difference_unit"] = self.difference_unit(d.output)
            first.append(rec)
        largest = {k: {"value": self.in_units(k, v, difference=True),
                       "unit": self.difference_unit(k), "row": row, "si": v}
                   for k, (v, row) in self.worst_abs.items()}
        return {"precision": self.precision, "port": self.port, "k": K, "eps": eps,
                "samples": self.samples, "disagreeing_samples": self.disagreeing_samples,
                "disagreements": self.disagreements,
                "worst_ratio_to_bound": self.worst,
                "max_abs_difference": largest,
                "first": first}


def compare_chunk(cmp: Comparison, first_row: int, ps: F64, pt: F64, tat: F64,
                  recovery: float, setting: F64 | None, noise: float, profile: str,
                  ref: AirData, port: AirData) -> None:
    """Compare one chunk and add the findings to ``cmp``.

    Parameters
    ----------
    cmp : Comparison
        Running totals, updated in place.
    first_row : int
        Data row number (from 1) of the chunk's first sample.
    ps, pt, tat, recovery, setting, noise, profile
        The chain's inputs in SI units, as given to both engines.
    ref, port : AirData
        The reference's and the port's results (``strict=False``).
    """
    from ..vectors.catalogue import get_spec
    from ..vectors.scale import EPS_BINARY32, EPS_BINARY64, K, binary32_check, condition_scale

    n = len(ps)
    prof = get_profile(profile)
    eps = EPS_BINARY64 if cmp.precision == "double" else EPS_BINARY32
    spec = get_spec("air_data")
    x = {"ps": ps, "pt": pt, "tat": tat, "recovery": np.full(n, float(recovery)),
         "setting": np.full(n, np.nan) if setting is None else np.asarray(setting, float),
         "use_setting": np.full(n, 0.0 if setting is None else 1.0),
         "noise_band": np.full(n, float(noise))}
    y = {k: (np.full(n, np.nan) if getattr(ref, k) is None
             else np.asarray(getattr(ref, k), dtype=np.float64)) for k in _OUTPUTS}
    yp = {k: (np.full(n, np.nan) if getattr(port, k) is None
              else np.asarray(getattr(port, k), dtype=np.float64)) for k in _OUTPUTS}
    st_ref = np.asarray(ref.status, dtype=np.int8)
    st_port = np.asarray(port.status, dtype=np.int8)

    status_diff = st_ref != st_port
    # Samples needing the full scale: a finite difference above the cheap lower bound.
    with np.errstate(invalid="ignore"):
        need = np.zeros(n, dtype=bool)
        for k in _OUTPUTS:
            d = np.abs(yp[k] - y[k])
            need |= np.isfinite(d) & (d > K * eps * np.abs(y[k]))
    scale = {k: np.abs(y[k]) for k in _OUTPUTS}
    if need.any():
        idx = np.flatnonzero(need)
        sub = {k: v[idx] for k, v in x.items()}
        s = condition_scale(spec, sub, {k: v[idx] for k, v in y.items()}, st_ref[idx], prof)
        for k in _OUTPUTS:
            scale[k][idx] = s[k]
    nan_diff: dict[str, NDArray[np.bool_]] = {}
    over: dict[str, NDArray[np.bool_]] = {}
    bound: dict[str, F64] = {}
    for k in _OUTPUTS:
        r, p = y[k], yp[k]
        bound[k] = K * eps * scale[k]
        with np.errstate(invalid="ignore", divide="ignore"):
            nan_diff[k] = np.isnan(r) != np.isnan(p)
            over[k] = (np.abs(p - r) > bound[k]) & ~np.isnan(r) & ~np.isnan(p)
            ratio = np.abs(p - r) / bound[k]
            diff = np.abs(p - r)
        fin = np.flatnonzero(np.isfinite(diff))
        if fin.size:
            i = int(fin[np.argmax(diff[fin])])
            if k not in cmp.worst_abs or diff[i] > cmp.worst_abs[k][0]:
                cmp.worst_abs[k] = (float(diff[i]), first_row + i)
        finite_ratio = ratio[np.isfinite(ratio)]
        if finite_ratio.size:
            cmp.worst[k] = max(cmp.worst.get(k, 0.0), float(finite_ratio.max()))

    # The binary32 check level (vectors' rule), only where something is flagged.
    flagged = status_diff.copy()
    for k in _OUTPUTS:
        flagged |= nan_diff[k] | over[k]
    skip = np.zeros(n, dtype=bool)
    lenient = np.zeros(n, dtype=bool)
    if cmp.precision == "single" and flagged.any():
        idx = np.flatnonzero(flagged)
        levels = binary32_check(spec, {k: v[idx] for k, v in x.items()},
                                {k: v[idx] for k, v in y.items()}, st_ref[idx], prof)
        skip[idx] = [lv == "skip" for lv in levels]
        lenient[idx] = [lv == "lenient" for lv in levels]

    names = {int(st): st.name for st in Status}
    found: list[Disagreement] = []
    bad_sample = np.zeros(n, dtype=bool)
    wrong_status = status_diff & ~lenient & ~skip
    for i in np.flatnonzero(wrong_status):
        bad_sample[i] = True
        found.append(Disagreement(first_row + int(i), "status", names.get(int(st_ref[i]), "?"),
                                  names.get(int(st_port[i]), "?"), float("nan")))
    for k in _OUTPUTS:
        # NaN on either side is accepted for a lenient case; two numbers must agree.
        bad = ((nan_diff[k] & ~lenient) | over[k]) & ~skip & ~wrong_status
        for i in np.flatnonzero(bad):
            bad_sample[i] = True
            found.append(Disagreement(first_row + int(i), k, float(y[k][i]),
                                      float(yp[k][i]), float(bound[k][i])))
    cmp.samples += n
    cmp.disagreeing_samples += int(bad_sample.sum())
    cmp.disagreements += len(found)
    room = cmp.limit - len(cmp.kept)
    if room > 0:
        cmp.kept.extend(sorted(found, key=lambda d: d.row)[:room])


# --------------------------------------------------------------------------- recorded outputs

#: Outputs a file may carry as recorded values, ``<name>_rec[unit]``:
#: (AirData key, short name, dimension, band kind, words).
RECORDED: tuple[tuple[str, str, str, str, str], ...] = (
    ("pressure_altitude", "hp", "length", "altitude", "pressure altitude"),
    ("baro_altitude", "hbaro", "length", "altitude", "baro-corrected altitude"),
    ("impact_pressure", "qc", "pressure", "cas", "impact pressure"),
    ("mach", "mach", "dimensionless", "mach", "Mach number"),
    ("cas", "cas", "speed", "cas", "calibrated airspeed"),
    ("eas", "eas", "speed", "cas", "equivalent airspeed"),
    ("tas", "tas", "speed", "mach", "true airspeed"),
    ("sat", "sat", "temperature", "mach", "static air temperature"),
    ("density", "rho", "density", "altitude", "air density"),
    ("density_altitude", "hd", "length", "altitude", "density altitude"),
    ("dynamic_pressure", "q", "pressure", "mach", "dynamic pressure"),
)

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
