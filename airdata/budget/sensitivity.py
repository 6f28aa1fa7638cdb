"""BUD-1: the analytic sensitivities of every air-data output to the sensors (the
equations are in the docstring of :mod:`airdata.budget`)."""

from __future__ import annotations

from dataclasses import dataclass

import numpy as np
from numpy.typing import NDArray

from .. import _domains as dom
from .._inputs import ArrayLike, Domain, Inputs
from .._layers import layer_of_altitude, layer_table, standard_temperature
from ..altimetry import altitude_of_pressure
from ..pitot import RATIO_MAX, mach_from_ratio, ratio_from_mach
from ..profiles import GAMMA, Profile, get_profile

__all__ = ["OUTPUTS", "DISPLAY_UNITS", "ratio_slope", "Sensitivities", "sensitivities"]

F64 = NDArray[np.float64]

#: Outputs of the budget, in the order of the Jacobian's rows.
OUTPUTS: tuple[str, ...] = ("pressure_altitude", "cas", "mach", "tas", "sat", "eas")


#: Unit each output is shown in by the command line and the plots.
DISPLAY_UNITS: dict[str, str] = {"pressure_altitude": "ft", "cas": "kt", "mach": "1",
                                 "tas": "kt", "sat": "K", "eas": "kt"}


#: Impact pressure of the sensitivities: zero is refused (d/dqc is infinite there).
_QC = Domain(0.0, 1.0e8, "Pa", "positive", 1000.0)


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
    args.flag_above(x, RATIO_MAX, "qc/ps", f"[0, {RATIO_MAX!r}] (Mach <= 10)")
    x0 = q / prof.p0
    args.flag_above(x0, RATIO_MAX, "qc/p0", f"[0, {RATIO_MAX!r}] (CAS <= 10 a0)")
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
