"""BUD-2: sensor accuracies propagated over an altitude by speed grid, to first order or
by Monte Carlo through the whole chain."""

from __future__ import annotations

from dataclasses import dataclass
from typing import Any

import numpy as np
from numpy.typing import NDArray

from .. import _domains as dom
from .._inputs import ArrayLike, Domain, Inputs
from .._layers import layer_of_altitude, layer_table, standard_pressure, standard_temperature
from ..chain import air_data
from ..pitot import RATIO_MAX, mach_from_ratio, ratio_from_mach
from ..profiles import Profile, get_profile
from ..status import Status
from .accuracy import SensorAccuracy
from .sensitivity import OUTPUTS, Sensitivities, _check_pitot, sensitivities

__all__ = ["ErrorBudget", "error_budget"]

F64 = NDArray[np.float64]

_SPEED = Domain(0.0, 4000.0, "m/s", "positive", 100.0)


@dataclass(frozen=True)
class ErrorBudget:
    """Output errors caused by sensor errors over an altitude by CAS grid (SI units).

    Attributes
    ----------
    altitude : ndarray
        Pressure altitudes of the grid rows, m.
    cas : ndarray
        Calibrated airspeeds of the grid columns, m/s.
    accuracy : SensorAccuracy
        The sensor accuracies propagated.
    pitot : str
        ``"qc"`` or ``"pt"``: the kind of the second pressure sensor.
    method : str
        ``"linear"`` or ``"monte_carlo"``.
    shift, sd, rms : dict of str to ndarray
        Per output of :data:`OUTPUTS`, arrays of shape (altitudes, speeds): mean error,
        its standard deviation and the root-mean-square error, SI units.
    shift_se, sd_se : dict of str to ndarray or None
        Monte Carlo only: standard errors of ``shift`` and ``sd`` (sampling error).
    altitude_per_ps : ndarray
        dH/dps at each grid altitude, m/Pa (negative: more pressure, lower altitude).
    cas_per_qc : ndarray
        dCAS/dqc at each grid speed, m/s per Pa.
    sensitivities : Sensitivities
        The Jacobian at every grid point.
    truth : dict of str to ndarray
        Error-free outputs at every grid point.
    samples : int
        Monte Carlo samples (0 for the linear method).
    seed : int or None
        Seed of the Monte Carlo generator.
    dT : float
        Temperature deviation from the standard day, K.
    recovery : float
        Recovery factor of the TAT probe.
    profile : str
        Name of the constants profile.
    """

    altitude: F64
    cas: F64
    accuracy: SensorAccuracy
    pitot: str
    method: str
    shift: dict[str, F64]
    sd: dict[str, F64]
    rms: dict[str, F64]
    shift_se: dict[str, F64] | None
    sd_se: dict[str, F64] | None
    altitude_per_ps: F64
    cas_per_qc: F64
    sensitivities: Sensitivities
    truth: dict[str, F64]
    samples: int
    seed: int | None
    dT: float
    recovery: float
    profile: str

    def as_dict(self) -> dict[str, object]:
        """JSON-ready form, SI units; matrices as nested lists [altitude][speed]."""
        def mats(d: dict[str, F64] | None) -> dict[str, Any] | None:
            return None if d is None else {k: v.tolist() for k, v in d.items()}

        return {
            "profile": self.profile, "method": self.method, "pitot": self.pitot,
            "samples": self.samples, "seed": self.seed, "dT_K": self.dT,
            "recovery": self.recovery, "accuracy": self.accuracy.as_dict(),
            "altitude_m": self.altitude.tolist(), "cas_m_s": self.cas.tolist(),
            "altitude_per_ps_m_per_Pa": self.altitude_per_ps.tolist(),
            "cas_per_qc_m_s_per_Pa": self.cas_per_qc.tolist(),
            "shift": mats(self.shift), "sd": mats(self.sd), "rms": mats(self.rms),
            "shift_se": mats(self.shift_se), "sd_se": mats(self.sd_se),
        }


def _grid_1d(name: str, values: ArrayLike, domain: Domain) -> F64:
    arr = np.atleast_1d(np.asarray(values, dtype=np.float64))
    if arr.ndim != 1 or arr.size == 0:
        raise ValueError(f"{name} must be a non-empty one-dimensional sequence")
    Inputs(True, **{name: (arr, domain)})  # raises DomainError on a bad element
    return arr


def _truth_outputs(out: Any) -> dict[str, F64]:
    return {k: np.asarray(getattr(out, k), dtype=np.float64) for k in OUTPUTS}


def error_budget(
    altitudes: ArrayLike, cas: ArrayLike, accuracy: SensorAccuracy, *, pitot: str = "qc",
    recovery: float = 1.0, dT: float = 0.0, method: str = "linear", samples: int = 20000,
    seed: int | None = 0, profile: Profile | str | None = None,
) -> ErrorBudget:
    """Uncertainty of every air-data output caused by sensor errors, over a grid.

    Parameters
    ----------
    altitudes : array_like
        Pressure altitudes of the grid, m, 1-D, in [-5000, 84852].
    cas : array_like
        Calibrated airspeeds of the grid, m/s, 1-D, in (0, 10 a0]; the Mach number at
        every grid point must not exceed 10.
    accuracy : SensorAccuracy
        Bias and noise of the static, pitot and TAT sensors (Pa, Pa, K).
    pitot : {"qc", "pt"}, optional
        Second pressure sensor: differential impact pressure (default) or absolute
        total pressure.  With ``"pt"`` the static error also enters qc = pt - ps.
    recovery : float, optional
        Recovery factor of the TAT probe, in [0, 1]; default 1.
    dT : float, optional
        Temperature deviation from the standard day, K, in [-100, 100]; default 0.
    method : {"linear", "monte_carlo"}, optional
        First-order propagation through the analytic Jacobian (default), or sampling
        of the full non-linear chain :func:`airdata.air_data`.
    samples : int, optional
        Monte Carlo samples per grid point, >= 2; default 20000.
    seed : int or None, optional
        Seed of the ``numpy.random.Generator`` (PCG64) of the Monte Carlo run;
        default 0, so that runs repeat exactly.
    profile : Profile or str, optional
        Constants profile, ``"icao"`` (default) or ``"us1976"``.

    Returns
    -------
    ErrorBudget
        Shift, standard deviation and rms error of each output at each grid point,
        plus the headline sensitivities dH/dps per altitude and dCAS/dqc per speed.

    Raises
    ------
    DomainError
        A bad grid value, a grid point beyond Mach 10, bad ``dT`` or ``recovery``.
    ValueError
        An unknown ``pitot`` or ``method``, a grid that is not 1-D, ``samples`` < 2.

    Notes
    -----
    BUD-2 (see the module docstring).  The grid is a standard day shifted by ``dT``:
    ps = p(H), qc = p0 f(cas/a0), SAT = T(H) + dT, TAT from TMP-1.  In the Monte Carlo
    run a sample whose perturbed inputs leave the domain of :func:`air_data` (for
    example a pitot reading that makes qc negative) gives NaN and is left out of the
    statistics; ``samples`` counts the requested samples.

    References
    ----------
    JCGM 100:2008 (GUM), first-order propagation (from memory); NACA Report 1135.
    """
    _check_pitot(pitot)
    if method not in ("linear", "monte_carlo"):
        raise ValueError(f"method = {method!r}: choose 'linear' or 'monte_carlo'")
    prof = get_profile(profile)
    h = _grid_1d("altitudes", altitudes, dom.altitude(prof))
    v = _grid_1d("cas", cas, _SPEED)
    for name, val, d in (("dT", dT, dom.DELTA_T), ("recovery", recovery, dom.RECOVERY)):
        Inputs(True, **{name: (val, d)})
    t = layer_table(prof)
    hh = h[:, None] + np.zeros_like(v)[None, :]
    vv = np.zeros_like(h)[:, None] + v[None, :]
    i = layer_of_altitude(hh, t)
    ps = standard_pressure(hh, i, t)
    m0 = vv / prof.a0
    args = Inputs(True, cas=(vv, _SPEED))
    args.flag_above(m0, dom.MACH_MAX, "cas", f"(0, {dom.MACH_MAX * prof.a0!r}] m/s", shown=vv)
    qc = prof.p0 * ratio_from_mach(m0)
    args.flag_above(qc / ps, RATIO_MAX, "Mach at grid point",
                    f"qc/ps in [0, {RATIO_MAX!r}] (Mach <= 10)")
    mach = mach_from_ratio(qc / ps)
    sat = standard_temperature(hh, i, t) + dT
    tat = sat * (1.0 + 0.2 * recovery * mach * mach)

    sens = sensitivities(ps, qc, tat, recovery, pitot=pitot, profile=prof)
    jac = sens.jacobian
    if accuracy.relative:  # a different bias and noise at each grid point
        b, s = accuracy.at(ps, qc if pitot == "qc" else ps + qc)
        lin_shift = np.einsum("...oj,...j->...o", jac, b)
        lin_sd = np.sqrt(np.einsum("...oj,...j->...o", jac * jac, s * s))
    else:
        lin_shift = jac @ accuracy.bias
        lin_sd = np.sqrt((jac * jac) @ (accuracy.noise ** 2))
    truth = _truth_outputs(air_data(ps, ps + qc, tat, recovery, profile=prof))

    if method == "linear":
        shift = {k: lin_shift[..., j] for j, k in enumerate(OUTPUTS)}
        sd = {k: lin_sd[..., j] for j, k in enumerate(OUTPUTS)}
        shift_se = sd_se = None
        n_used = 0
        used_seed = None
    else:
        if samples < 2:
            raise ValueError(f"samples = {samples!r}: need at least 2")
        shift, sd, shift_se, sd_se = _monte_carlo(ps, qc, tat, recovery, pitot, accuracy,
                                                  truth, samples, seed, prof)
        n_used = samples
        used_seed = seed
    rms = {k: np.sqrt(shift[k] ** 2 + sd[k] ** 2) for k in OUTPUTS}
    return ErrorBudget(
        altitude=h, cas=v, accuracy=accuracy, pitot=pitot, method=method, shift=shift,
        sd=sd, rms=rms, shift_se=shift_se, sd_se=sd_se,
        altitude_per_ps=sens.d("pressure_altitude", "ps")[:, 0],
        cas_per_qc=sens.d("cas", sens.inputs[1])[0, :],
        sensitivities=sens, truth=truth, samples=n_used, seed=used_seed, dT=float(dT),
        recovery=float(recovery), profile=prof.name,
    )


def _monte_carlo(
    ps: F64, qc: F64, tat: F64, recovery: float, pitot: str, acc: SensorAccuracy,
    truth: dict[str, F64], samples: int, seed: int | None, prof: Profile,
) -> tuple[dict[str, F64], dict[str, F64], dict[str, F64], dict[str, F64]]:
    """Sample the full chain; statistics merged chunk by chunk (Chan et al. 1979)."""
    rng = np.random.default_rng(seed)
    b, s = acc.at(ps, qc if pitot == "qc" else ps + qc)
    cells = ps.size
    chunk = max(1, min(samples, 400_000 // cells))
    n = np.zeros(ps.shape)
    mean = {k: np.zeros(ps.shape) for k in OUTPUTS}
    m2 = {k: np.zeros(ps.shape) for k in OUTPUTS}
    done = 0
    while done < samples:
        c = min(chunk, samples - done)
        z = rng.standard_normal((c, 3) + ps.shape)
        e_ps = b[..., 0] + s[..., 0] * z[:, 0]
        e_pi = b[..., 1] + s[..., 1] * z[:, 1]
        e_t = b[..., 2] + s[..., 2] * z[:, 2]
        ps_m = ps + e_ps
        pt_m = ps_m + (qc + e_pi) if pitot == "qc" else (ps + qc) + e_pi
        out = air_data(ps_m, pt_m, tat + e_t, recovery, noise_band=0.0, profile=prof,
                       strict=False)
        ok = np.asarray(out.status) == Status.OK
        cn = ok.sum(axis=0)
        for k in OUTPUTS:
            err = np.where(ok, np.asarray(getattr(out, k)) - truth[k], 0.0)
            with np.errstate(invalid="ignore", divide="ignore"):
                cmean = np.where(cn > 0, err.sum(axis=0) / np.maximum(cn, 1), 0.0)
            cm2 = np.where(ok, (err - cmean) ** 2, 0.0).sum(axis=0)
            tot = n + cn
            delta = cmean - mean[k]
            safe = np.maximum(tot, 1)
            mean[k] = mean[k] + delta * cn / safe
            m2[k] = m2[k] + cm2 + delta * delta * n * cn / safe
        n = n + cn
        done += c
    shift = {k: np.where(n > 0, mean[k], np.nan) for k in OUTPUTS}
    sd = {k: np.where(n > 1, np.sqrt(m2[k] / np.maximum(n - 1, 1)), np.nan) for k in OUTPUTS}
    shift_se = {k: sd[k] / np.sqrt(np.maximum(n, 1)) for k in OUTPUTS}
    sd_se = {k: sd[k] / np.sqrt(2.0 * np.maximum(n - 1, 1)) for k in OUTPUTS}
    return shift, sd, shift_se, sd_se
