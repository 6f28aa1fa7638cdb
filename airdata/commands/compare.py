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

__all__ = ["Disagreement", "Comparison", "port_air_data", "compare_chunk", "available"]

F64 = NDArray[np.float64]

#: Outputs of the chain, in the order of the catalogue.
_OUTPUTS = ("pressure_altitude", "baro_altitude", "impact_pressure", "mach", "cas", "eas",
            "tas", "sat", "density", "density_altitude", "dynamic_pressure")


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

    def as_dict(self) -> dict[str, Any]:
        """A JSON-ready summary."""
        from ..vectors.scale import EPS_BINARY32, EPS_BINARY64, K

        eps = EPS_BINARY64 if self.precision == "double" else EPS_BINARY32
        return {"precision": self.precision, "k": K, "eps": eps,
                "samples": self.samples, "disagreeing_samples": self.disagreeing_samples,
                "disagreements": self.disagreements,
                "worst_ratio_to_bound": self.worst,
                "first": [d.as_dict() for d in self.kept]}


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
