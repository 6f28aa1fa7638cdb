"""Sensor error budgets: analytic sensitivities of every air-data output to the
sensors, and the propagation of sensor accuracies over an altitude by speed grid.

Sensitivities (BUD-1), with x = qc/ps, f(M) = qc/ps of PIT-1 and its derivative

    f'(M) = 1.4 M (1 + 0.2 M^2)^2.5                          M <= 1 (NACA 1135 eq. 44)
    f'(M) = (1 + f(M)) (7/M - 35 M/(7 M^2 - 1))               M > 1  (NACA 1135 eq. 100)

(both 7/6 (1 + f(1)) at M = 1: the relation is C1 there), and with T(H) the standard
temperature at the pressure altitude H:

    dH/dps      = -R T(H) / (g0 ps)                    (hydrostatic equation, ALT-1)
    dCAS/dqc    = a0 / (p0 f'(CAS/a0))                 (PIT-4)
    dM/dqc      = 1 / (ps f'(M));  dM/dps = -x / (ps f'(M))          (PIT-2)
    D = 1 + 0.2 r M^2:  dSAT/dTAT = 1/D;  dSAT/dM = -SAT 0.4 r M / D   (TMP-1)
    dTAS/dM     = a + (TAS / (2 SAT)) dSAT/dM;  dTAS/dTAT = (TAS/(2 SAT)) dSAT/dTAT (SPD-3)
    dEAS/dps    = a0 sqrt(ps/p0) dM/dps + EAS/(2 ps);  dEAS/dqc = a0 sqrt(ps/p0) dM/dqc

CAS depends on qc alone and pressure altitude on ps alone; SAT, TAS depend on all three.
With an absolute total-pressure sensor (``pitot="pt"``) instead of a differential one,
qc = pt - ps, so d/dpt = d/dqc and d/dps (pt fixed) = d/dps (qc fixed) - d/dqc.

Propagation (BUD-2): each sensor reads truth + bias + noise, the noise normal with the
given standard deviation, the three sensors independent.  To first order each output
error has mean J b (the *shift*) and standard deviation sqrt(sum_j (J_j sigma_j)^2) (the
*sd*); their root-sum-square is the *rms* error.  ``method="monte_carlo"`` instead runs
the full non-linear chain :func:`airdata.air_data` on seeded random sensor errors, which
checks the linear figures and shows where linearisation stops being good enough.

References
----------
NACA Report 1135 (1953), eqs. 44 and 100; ICAO Doc 7488/3 (1993); first-order error
propagation (JCGM 100:2008, "GUM", eq. 10, from memory).
"""

from __future__ import annotations

from dataclasses import dataclass, fields
from pathlib import Path
from typing import Any

import numpy as np
from numpy.typing import NDArray

from . import _domains as dom
from ._inputs import ArrayLike, Domain, Inputs
from ._layers import layer_of_altitude, layer_table, standard_pressure, standard_temperature
from .altimetry import altitude_of_pressure
from .chain import air_data
from .pitot import RATIO_MAX, mach_from_ratio, ratio_from_mach
from .profiles import GAMMA, Profile, get_profile
from .status import DomainError, Status

__all__ = [
    "OUTPUTS", "DISPLAY_UNITS", "ACCURACY_LIMITS", "Sensitivities", "sensitivities",
    "SensorAccuracy", "ErrorBudget", "error_budget", "plot_budget",
]

F64 = NDArray[np.float64]

#: Outputs of the budget, in the order of the Jacobian's rows.
OUTPUTS: tuple[str, ...] = ("pressure_altitude", "cas", "mach", "tas", "sat", "eas")
#: Unit each output is shown in by the command line and the plots.
DISPLAY_UNITS: dict[str, str] = {"pressure_altitude": "ft", "cas": "kt", "mach": "1",
                                 "tas": "kt", "sat": "K", "eas": "kt"}

_TITLES = {"pressure_altitude": "pressure altitude", "cas": "CAS", "mach": "Mach",
           "tas": "TAS", "sat": "SAT", "eas": "EAS"}

#: Impact pressure of the sensitivities: zero is refused (d/dqc is infinite there).
_QC = Domain(0.0, 1.0e8, "Pa", "positive", 1000.0)
_SPEED = Domain(0.0, 4000.0, "m/s", "positive", 100.0)
#: Sensor bias (either sign) and noise standard deviation; Pa or K.
#: Valid ranges of the sensor accuracies: fixed parts in Pa or K; parts proportional to
#: the reading as fractions (0.0002 is 0.02 % of reading; a tenth of the reading is far
#: beyond any air-data sensor and catches a percent slip).
ACCURACY_LIMITS = {"bias": (-1.0e4, 1.0e4), "noise": (0.0, 1.0e4),
                   "bias_rel": (-0.1, 0.1), "noise_rel": (0.0, 0.1)}
_BIAS = Domain(*ACCURACY_LIMITS["bias"], "Pa or K", "any", 0.0)
_NOISE = Domain(*ACCURACY_LIMITS["noise"], "Pa or K", "nonnegative", 0.0)
_BIAS_REL = Domain(*ACCURACY_LIMITS["bias_rel"], "of reading", "any", 0.0)
_NOISE_REL = Domain(*ACCURACY_LIMITS["noise_rel"], "of reading", "nonnegative", 0.0)


def ratio_slope(m: F64) -> F64:
    """f'(M) = d(qc/ps)/dM of PIT-1, both branches (see the module docstring)."""
    u = m * m
    sub = 1.4 * m * np.exp(2.5 * np.log1p(0.2 * u))
    ms = np.maximum(m, 1.0)
    us = ms * ms
    sup = (1.0 + ratio_from_mach(ms)) * (7.0 / ms - 35.0 * ms / (7.0 * us - 1.0))
    return np.where(m <= 1.0, sub, sup)


@dataclass(frozen=True)
class Sensitivities:
    """Air-data outputs and their partial derivatives with respect to the sensors.

    Attributes
    ----------
    values : dict of str to ndarray
        Each output of :data:`OUTPUTS`, SI units (m, m/s, Mach, K); 0-d arrays for
        scalar input.
    jacobian : ndarray
        Shape ``input_shape + (6, 3)`` (``(6, 3)`` for scalar input): d output /
        d input, rows in the order of :data:`OUTPUTS`, columns in the order of
        ``inputs``; SI units (m/Pa, m/s/Pa, 1/Pa, K/Pa, m/s/K, K/K ...).
    inputs : tuple of str
        ``("ps", "qc", "tat")`` or ``("ps", "pt", "tat")``.
    """

    values: dict[str, F64]
    jacobian: F64
    inputs: tuple[str, str, str]

    def d(self, output: str, wrt: str) -> F64:
        """The partial derivative d ``output`` / d ``wrt``, SI units."""
        return self.jacobian[..., OUTPUTS.index(output), self.inputs.index(wrt)]


def _check_pitot(pitot: str) -> None:
    if pitot not in ("qc", "pt"):
        raise ValueError(f"pitot = {pitot!r}: choose 'qc' (differential impact-pressure "
                         "sensor) or 'pt' (absolute total-pressure sensor)")


def sensitivities(
    ps: ArrayLike, qc: ArrayLike, tat: ArrayLike, recovery: ArrayLike = 1.0, *,
    pitot: str = "qc", profile: Profile | str | None = None, strict: bool = True,
) -> Sensitivities:
    """Analytic partial derivatives of every air-data output with respect to the sensors.

    Parameters
    ----------
    ps : float or array_like
        Static pressure, Pa, in [0.3734, 177687] Pa (icao).
    qc : float or array_like
        Impact pressure pt - ps, Pa, > 0 (the derivatives are infinite at zero); qc/ps
        and qc/p0 must not exceed their values at Mach 10.
    tat : float or array_like
        Total air temperature, K, in [50, 5000].
    recovery : float or array_like, optional
        Recovery factor of the TAT probe, in [0, 1]; default 1.
    pitot : {"qc", "pt"}, optional
        The second pressure sensor: differential (impact pressure, default) or
        absolute (total pressure).  Chooses the second column of the Jacobian and
        whether its first column holds qc or pt fixed.
    profile : Profile or str, optional
        Constants profile, ``"icao"`` (default) or ``"us1976"``.
    strict : bool, optional
        Raise on bad input (default) or give NaN for just those elements.

    Inputs broadcast against each other like a numpy ufunc.

    Returns
    -------
    Sensitivities
        The outputs and the Jacobian.

    Raises
    ------
    DomainError
        Bad or out-of-range input, or a Mach number or CAS above 10 (a0).
    ValueError
        An unknown ``pitot``.

    Notes
    -----
    BUD-1, derived in the module docstring.

    References
    ----------
    NACA Report 1135 (1953), eqs. 44 and 100; ICAO Doc 7488/3 (1993).
    """
    _check_pitot(pitot)
    prof = get_profile(profile)
    args = Inputs(strict, ps=(ps, dom.pressure(prof)), qc=(qc, _QC),
                  tat=(tat, dom.TEMPERATURE), recovery=(recovery, dom.RECOVERY))
    p, q, tt, r = args["ps"], args["qc"], args["tat"], args["recovery"]
    x = q / p
    args.flag(x > RATIO_MAX, Status.OUT_OF_RANGE, "qc/ps", x, f"[0, {RATIO_MAX!r}] (Mach <= 10)")
    x0 = q / prof.p0
    args.flag(x0 > RATIO_MAX, Status.OUT_OF_RANGE, "qc/p0", x0,
              f"[0, {RATIO_MAX!r}] (CAS <= 10 a0)")
    x = np.where(args.bad, 0.1, x)
    x0 = np.where(args.bad, 0.1, x0)
    t = layer_table(prof)

    h = altitude_of_pressure(p, t)
    temp_std = standard_temperature(h, layer_of_altitude(h, t), t)
    mach = mach_from_ratio(x)
    m0 = mach_from_ratio(x0)
    cas = prof.a0 * m0
    den = 1.0 + 0.2 * r * mach * mach
    sat = tt / den
    a = np.sqrt((GAMMA * prof.R) * sat)
    tas = mach * a
    root = np.sqrt(p / prof.p0)
    eas = prof.a0 * mach * root

    zero = np.zeros_like(p)
    dh_dp = -(prof.R * temp_std) / (prof.g0 * p)
    dcas_dq = prof.a0 / (prof.p0 * ratio_slope(m0))
    slope = p * ratio_slope(mach)
    dm_dq = 1.0 / slope
    dm_dp = -x / slope
    dsat_dm = -sat * (0.4 * r * mach) / den
    dsat_dtat = 1.0 / den
    k_tas = tas / (2.0 * sat)
    dtas_dm = a + k_tas * dsat_dm
    deas_dm = prof.a0 * root
    rows = [
        [dh_dp, zero, zero],
        [zero, dcas_dq, zero],
        [dm_dp, dm_dq, zero],
        [dtas_dm * dm_dp, dtas_dm * dm_dq, k_tas * dsat_dtat],
        [dsat_dm * dm_dp, dsat_dm * dm_dq, dsat_dtat],
        [deas_dm * dm_dp + eas / (2.0 * p), deas_dm * dm_dq, zero],
    ]
    jac = np.stack([np.stack(row, axis=-1) for row in rows], axis=-2)
    if pitot == "pt":
        jac[..., 0] = jac[..., 0] - jac[..., 1]
    if args.bad.any():
        jac = np.where(args.bad[..., None, None], np.nan, jac)
    values = {"pressure_altitude": h, "cas": cas, "mach": mach, "tas": tas, "sat": sat,
              "eas": eas}
    values = {k: np.where(args.bad, np.nan, v) for k, v in values.items()}
    if args.scalar:
        values = {k: v.reshape(()) for k, v in values.items()}
        jac = jac.reshape(jac.shape[-2:])
    return Sensitivities(values=values, jacobian=jac,
                         inputs=("ps", "qc" if pitot == "qc" else "pt", "tat"))


@dataclass(frozen=True)
class SensorAccuracy:
    """Accuracy of the three air-data sensors: a fixed bias and a random noise each.

    Each pressure sensor's bias and noise may also have a part proportional to its
    reading (the static pressure, and the impact or total pressure of ``pitot``), as
    data sheets give "0.01 % of reading"; the error at a grid point is the absolute
    part plus the fraction times the true reading there.  A percentage of full scale is
    a fixed amount: give it as the absolute part.

    Attributes
    ----------
    ps_bias, ps_noise : float
        Static pressure sensor: bias (either sign) and noise standard deviation, Pa.
    pitot_bias, pitot_noise : float
        Second pressure sensor (impact pressure or total pressure, see ``pitot`` of
        :func:`error_budget`): bias and noise standard deviation, Pa.
    tat_bias, tat_noise : float
        Total-air-temperature probe: bias and noise standard deviation, K.
    ps_bias_rel, ps_noise_rel, pitot_bias_rel, pitot_noise_rel : float
        Parts proportional to the reading, as fractions of it (0.0002 = 0.02 %).

    Biases lie in [-1e4, 1e4], noises in [0, 1e4] (Pa or K); the fractions of reading
    in [-0.1, 0.1] (biases) and [0, 0.1] (noises).
    """

    ps_bias: float = 0.0
    ps_noise: float = 0.0
    pitot_bias: float = 0.0
    pitot_noise: float = 0.0
    tat_bias: float = 0.0
    tat_noise: float = 0.0
    ps_bias_rel: float = 0.0
    ps_noise_rel: float = 0.0
    pitot_bias_rel: float = 0.0
    pitot_noise_rel: float = 0.0

    def __post_init__(self) -> None:
        for f in fields(self):
            v = getattr(self, f.name)
            rel = f.name.endswith("_rel")
            noise = f.name.removesuffix("_rel").endswith("noise")
            d = (_NOISE_REL if noise else _BIAS_REL) if rel else (_NOISE if noise else _BIAS)
            st = d.classify(np.atleast_1d(np.float64(v)))[0]
            if st != Status.OK:
                raise DomainError(f.name, float(v), None, d.describe(), Status(int(st)))

    @property
    def bias(self) -> F64:
        """(ps, pitot, tat) absolute biases."""
        return np.array([self.ps_bias, self.pitot_bias, self.tat_bias])

    @property
    def noise(self) -> F64:
        """(ps, pitot, tat) absolute noise standard deviations."""
        return np.array([self.ps_noise, self.pitot_noise, self.tat_noise])

    @property
    def relative(self) -> bool:
        """True when some part is proportional to the reading."""
        return any((self.ps_bias_rel, self.ps_noise_rel, self.pitot_bias_rel,
                    self.pitot_noise_rel))

    def at(self, ps: F64, pitot_reading: F64) -> tuple[F64, F64]:
        """Bias and noise of (ps, pitot, tat) at each point, shape ``ps.shape + (3,)``.

        Parameters
        ----------
        ps : ndarray
            True static pressure, Pa.
        pitot_reading : ndarray
            True reading of the second pressure sensor (impact or total pressure), Pa.
        """
        b = np.stack(np.broadcast_arrays(self.ps_bias + self.ps_bias_rel * ps,
                                         self.pitot_bias + self.pitot_bias_rel * pitot_reading,
                                         np.full(np.shape(ps), self.tat_bias)), axis=-1)
        s = np.stack(np.broadcast_arrays(self.ps_noise + self.ps_noise_rel * ps,
                                         self.pitot_noise + self.pitot_noise_rel * pitot_reading,
                                         np.full(np.shape(ps), self.tat_noise)), axis=-1)
        return b, s

    def as_dict(self) -> dict[str, float]:
        """Every field, JSON-ready."""
        return {f.name: float(getattr(self, f.name)) for f in fields(self)}

    def describe(self, pressure_unit: str = "Pa") -> str:
        """The accuracies in words, pressures in ``pressure_unit`` (e.g. for a chart).

        Parameters
        ----------
        pressure_unit : str
            Unit of the absolute pressure parts (a pressure unit of :mod:`airdata.units`).

        Returns
        -------
        str
            E.g. ``"static 0 / 0.5 hPa + 0.01 % rdg, pitot 0 / 0.3 hPa, TAT 0 / 0.5 K"``
            (bias / sd for each sensor).
        """
        from .units import from_si

        def part(absolute: float, rel: float, unit: str, convert: bool = True) -> str:
            v = float(from_si(absolute, unit)) if convert else absolute
            text = f"{v:.6g} {unit}"
            if rel:
                text += f" {'+' if rel > 0 else '-'} {abs(rel) * 100.0:.6g} % rdg"
            return text

        pu = pressure_unit
        return (f"static {part(self.ps_bias, self.ps_bias_rel, pu)} / "
                f"{part(self.ps_noise, self.ps_noise_rel, pu)}, "
                f"pitot {part(self.pitot_bias, self.pitot_bias_rel, pu)} / "
                f"{part(self.pitot_noise, self.pitot_noise_rel, pu)}, "
                f"TAT {part(self.tat_bias, 0.0, 'K', False)} / "
                f"{part(self.tat_noise, 0.0, 'K', False)}")


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
    args.flag(m0 > dom.MACH_MAX, Status.OUT_OF_RANGE, "cas", vv,
              f"(0, {dom.MACH_MAX * prof.a0!r}] m/s")
    qc = prof.p0 * ratio_from_mach(m0)
    args.flag(qc / ps > RATIO_MAX, Status.OUT_OF_RANGE, "Mach at grid point", qc / ps,
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


def plot_budget(
    budget: ErrorBudget, outputs: tuple[str, ...] | None = None, *, quantity: str = "rms",
    path: str | Path | None = None, pressure_unit: str = "Pa",
) -> Any:
    """Maps of an error budget: one panel per output, pressure altitude against CAS.

    Parameters
    ----------
    budget : ErrorBudget
        From :func:`error_budget`.
    outputs : tuple of str, optional
        Outputs to map (default all of :data:`OUTPUTS`).
    quantity : {"rms", "sd", "shift"}, optional
        What to map; default the rms error.
    path : str or Path, optional
        Write the chart there (format from the suffix).
    pressure_unit : str, optional
        Unit in which the title states the pressure sensors' accuracies (default Pa;
        ``airdata budget`` passes the unit they were given in).

    Returns
    -------
    matplotlib.figure.Figure
        The figure, not attached to pyplot (no backend is selected or changed).

    Raises
    ------
    ImportError
        matplotlib is not installed (it is an optional extra).
    ValueError
        An unknown output or quantity.
    """
    from .units import from_si

    outputs = OUTPUTS if outputs is None else tuple(outputs)
    for o in outputs:
        if o not in OUTPUTS:
            raise ValueError(f"unknown output {o!r}: choose from {OUTPUTS}")
    if quantity not in ("rms", "sd", "shift"):
        raise ValueError(f"quantity = {quantity!r}: choose 'rms', 'sd' or 'shift'")
    from matplotlib.figure import Figure

    ncol = min(3, len(outputs))
    nrow = -(-len(outputs) // ncol)
    fig = Figure(figsize=(4.2 * ncol, 3.6 * nrow), layout="constrained")
    axes = fig.subplots(nrow, ncol, squeeze=False)
    x = np.asarray(from_si(budget.cas, "kt"))
    y = np.asarray(from_si(budget.altitude, "ft"))
    data = getattr(budget, quantity)
    for ax, o in zip(axes.flat, outputs, strict=False):
        unit = DISPLAY_UNITS[o]
        z = data[o] if unit in ("1", "K") else np.asarray(from_si(data[o], unit))
        mesh = ax.pcolormesh(x, y, z, shading="nearest",
                             cmap="RdBu_r" if quantity == "shift" else "viridis")
        if len(x) > 1 and len(y) > 1:
            cs = ax.contour(x, y, z, colors="k", linewidths=0.5)
            ax.clabel(cs, fontsize=7)
        fig.colorbar(mesh, ax=ax, label=f"{quantity} error, {'Mach' if unit == '1' else unit}")
        ax.set_title(_TITLES[o])
        ax.set_xlabel("CAS, kt")
        ax.set_ylabel("pressure altitude, ft")
    for ax in list(axes.flat)[len(outputs):]:
        ax.set_visible(False)
    how = "linear" if budget.method == "linear" else f"Monte Carlo, {budget.samples} samples"
    sensors = budget.accuracy.describe(pressure_unit).replace("pitot", budget.pitot, 1)
    fig.suptitle(f"Error budget ({how}); sensor bias / sd: {sensors}", fontsize=10)
    if path is not None:
        fig.savefig(path, dpi=120)
    return fig
