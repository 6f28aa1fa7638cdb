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

from ..chain import AIR_DATA_OUTPUTS as _OUTPUTS
from ..chain import OUTPUT_INFO, AirData
from ..profiles import get_profile
from ..status import Status
from .recorded import RecordedColumn, RecordedComparison  # kept importable from here

__all__ = ["Disagreement", "Comparison", "port_air_data", "compare_chunk", "available",
           "UserPort", "RecordedColumn", "RecordedComparison"]

F64 = NDArray[np.float64]

_SI_UNITS = {o.key: o.si_unit for o in OUTPUT_INFO}


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
