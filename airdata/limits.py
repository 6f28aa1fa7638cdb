"""Flight-envelope limits: stall speed, the maximum operating CAS/Mach pair and its
crossover altitude, the maximum altitude, and the envelope table of an aircraft.

Equations LIM-1 .. LIM-5 (gamma = 1.4; f(M) = qc/ps of PIT-1; F^-1 its inverse, PIT-2):

LIM-1  stall EAS from lift = weight: eas = sqrt(2 n W / (rho0 S CLmax)).
LIM-2  stall Mach, CAS and TAS at static pressure ps: M = eas / (a0 sqrt(ps/p0))
       (SPD-2 inverted), cas = a0 F^-1(ps f(M)/p0) (SPD-1), tas = M sqrt(gamma R sat)
       (SPD-3).  EAS does not change with altitude; CAS does, through compressibility.
LIM-3  crossover altitude of a (CAS limit, Mach limit) pair: qc = p0 f(cas/a0) (PIT-3),
       ps = qc / f(M), h = H(ps) (ALT-1).
LIM-4  maximum operating CAS and Mach at ps: the lower of the two limits, compared
       through impact pressure: qc_cas = p0 f(cas/a0), qc_mach = ps f(M).  Where the
       CAS limit governs (qc_cas <= qc_mach) the maximum CAS *is* the CAS limit and the
       maximum Mach is F^-1(qc_cas/ps); where the Mach limit governs the maximum Mach
       *is* the Mach limit and the maximum CAS is a0 F^-1(qc_mach/p0).
LIM-5  maximum altitude as a fixed pressure altitude: the margin to it is
       ceiling - H(ps), whatever the temperature or the altimeter setting.

Tiny speeds: below Mach 2^-40 (``pitot.TINY_MACH``) a Mach <-> CAS conversion takes
its linear limit (``pitot.tiny_linear``, ``pitot.tiny_mach_of_cas``, as SPD-1 does,
with no subnormal intermediate), and where both limits of LIM-3 or LIM-4 are that
small, where their impact pressures may underflow, the comparison and the crossover
pressure take the linear limit qc = 0.7 p M^2 too: M sqrt(ps/p0) against cas/a0 (both
scaled by ``pitot.TINY_SCALE``), ps = p0 ((cas/M)/a0)^2.

The kernels follow the pattern of :mod:`airdata.speeds` (argument order, statuses,
``strict``) so that they port one to one to C.

References
----------
NACA Report 1135 (1953), eqs. 44 and 100 (pitot relations); ICAO Doc 7488/3 (1993)
(standard atmosphere); lift equation L = q S CL with q = rho0 eas^2 / 2 (definition of
equivalent airspeed).
"""

from __future__ import annotations

import math
from dataclasses import dataclass
from pathlib import Path
from typing import Any

import numpy as np
from numpy.typing import NDArray

from . import _domains as dom
from ._docs import fill_doc
from ._inputs import ArrayLike, Domain, FloatOrArray, Inputs
from ._layers import layer_table
from .aircraft import Aircraft
from .altimetry import altitude_of_pressure
from .atmosphere import atmosphere
from .pitot import (
    RATIO_MAX,
    TINY_MACH,
    TINY_SCALE,
    impact_from_mach,
    mach_from_ratio,
    ratio_from_mach,
    tiny_linear,
    tiny_mach_of_cas,
)
from .profiles import GAMMA, Profile, get_profile
from .status import DomainError, Status

__all__ = [
    "WEIGHT", "WING_AREA", "CL_MAX", "LOAD_FACTOR", "CAS_LIMIT", "MACH_LIMIT",
    "SUBSONIC_MACH_LIMIT",
    "stall_eas", "stall_mach", "stall_cas", "stall_tas",
    "crossover_altitude", "max_operating_cas", "max_operating_mach", "ceiling_margin",
    "SpeedSet", "Envelope", "envelope", "plot_envelope",
]

F64 = NDArray[np.float64]

# Valid ranges of the limit functions' arguments (defined in airdata._domains).
WEIGHT = dom.WEIGHT
WING_AREA = dom.WING_AREA
CL_MAX = dom.CL_MAX
LOAD_FACTOR = dom.LOAD_FACTOR
CAS_LIMIT = dom.CAS_LIMIT
MACH_LIMIT = dom.MACH_LIMIT
SUBSONIC_MACH_LIMIT = dom.SUBSONIC_MACH_LIMIT


#: Smallest normal binary64 number: below it a product loses relative precision.
_NORMAL_MIN = float(np.finfo(np.float64).tiny)


def _stall_eas_kernel(w: F64, s: F64, cl: F64, n: F64, rho0: float) -> F64:
    """LIM-1: sqrt(2 n W / (rho0 S CL)).

    Where 2 n W, rho0 S CL or their quotient falls below the smallest normal number
    (tiny but valid inputs), the same from the square roots of the factors,
    (sqrt(2 n) / (sqrt(rho0) sqrt(S))) (sqrt(W) / sqrt(CL)), which has no subnormal
    intermediate while the result itself is normal.
    """
    with np.errstate(divide="ignore", over="ignore", invalid="ignore"):
        num = (2.0 * n) * w
        den = (rho0 * s) * cl
        q = num / den
        small = (num < _NORMAL_MIN) | (den < _NORMAL_MIN) | (q < _NORMAL_MIN)
        if not small.any():
            return np.sqrt(q)
        root = (np.sqrt(2.0 * n) / (np.sqrt(rho0) * np.sqrt(s))) * (np.sqrt(w) / np.sqrt(cl))
        return np.where(small, root, np.sqrt(q))


def _stall_args(strict: bool, weight: ArrayLike, wing_area: ArrayLike, cl_max: ArrayLike,
                load_factor: ArrayLike, **more: tuple[ArrayLike, Domain]) -> Inputs:
    return Inputs(strict, weight=(weight, WEIGHT), wing_area=(wing_area, WING_AREA),
                  cl_max=(cl_max, CL_MAX), **more, load_factor=(load_factor, LOAD_FACTOR))


def _checked_stall_eas(args: Inputs, rho0: float) -> F64:
    eas = _stall_eas_kernel(args["weight"], args["wing_area"], args["cl_max"],
                            args["load_factor"], rho0)
    over = eas > dom.SPEED.hi
    args.flag(over, Status.OUT_OF_RANGE, "stall EAS", eas, dom.SPEED.describe())
    return np.where(over, 0.0, eas)


def _checked_stall_mach(args: Inputs, prof: Profile) -> F64:
    eas = _checked_stall_eas(args, prof.rho0)
    m = eas / (prof.a0 * np.sqrt(args["ps"] / prof.p0))
    over = m > dom.MACH_MAX
    args.flag(over, Status.OUT_OF_RANGE, "stall Mach", m, f"[0, {dom.MACH_MAX!r}]")
    return np.where(over, 0.0, m)


@fill_doc
def stall_eas(
    weight: ArrayLike, wing_area: ArrayLike, cl_max: ArrayLike, load_factor: ArrayLike = 1.0,
    *, profile: Profile | str | None = None, strict: bool = True,
) -> FloatOrArray:
    """Stall speed as an equivalent airspeed, from lift = load factor x weight.

    Parameters
    ----------
    {weight}
    {wing_area}
    {cl_max}
    load_factor : float or array_like, optional
        Load factor n = lift/weight, in (0, 10]; default 1 (level flight).
    profile : Profile or str, optional
        Constants profile (supplies the sea-level density rho0).
    {strict}

    {broadcast}

    Returns
    -------
    float or ndarray
        Stall equivalent airspeed, m/s.  The same at every altitude.

    Raises
    ------
    DomainError
        Bad or out-of-range input (weight or wing area or CLmax or load factor zero,
        negative, NaN or too large), or a stall EAS above 4000 m/s.

    Notes
    -----
    LIM-1: eas = sqrt(2 n W / (rho0 S CLmax)).

    References
    ----------
    Lift equation with the dynamic pressure of equivalent airspeed, rho0 eas^2 / 2.

    Examples
    --------
    >>> round(stall_eas(1.225 * 50.0, 1.0, 1.0), 12)   # q = 50 Pa at unit CL S
    10.0
    """
    prof = get_profile(profile)
    args = _stall_args(strict, weight, wing_area, cl_max, load_factor)
    return args.finish(_checked_stall_eas(args, prof.rho0))


@fill_doc
def stall_mach(
    weight: ArrayLike, wing_area: ArrayLike, cl_max: ArrayLike, ps: ArrayLike,
    load_factor: ArrayLike = 1.0, *, profile: Profile | str | None = None,
    strict: bool = True,
) -> FloatOrArray:
    """Stall Mach number at static pressure ``ps``.

    Parameters
    ----------
    {weight}
    {wing_area}
    {cl_max}
    {ps}
    {load_factor}
    {profile_rho0_p0_a0_range}
    {strict}

    {broadcast}

    Returns
    -------
    float or ndarray
        Stall Mach number.

    Raises
    ------
    DomainError
        Bad or out-of-range input, stall EAS above 4000 m/s or stall Mach above 10.

    Notes
    -----
    LIM-2: M = eas / (a0 sqrt(ps/p0)) with eas from LIM-1 (SPD-2 inverted).

    References
    ----------
    Definition of equivalent airspeed.
    """
    prof = get_profile(profile)
    args = _stall_args(strict, weight, wing_area, cl_max, load_factor,
                       ps=(ps, dom.pressure(prof)))
    return args.finish(_checked_stall_mach(args, prof))


@fill_doc
def stall_cas(
    weight: ArrayLike, wing_area: ArrayLike, cl_max: ArrayLike, ps: ArrayLike,
    load_factor: ArrayLike = 1.0, *, profile: Profile | str | None = None,
    strict: bool = True,
) -> FloatOrArray:
    """Stall speed as a calibrated airspeed at static pressure ``ps``.

    Parameters
    ----------
    {weight}
    {wing_area}
    {cl_max}
    {ps}
    {load_factor}
    {profile_rho0_p0_a0_range}
    {strict}

    {broadcast}

    Returns
    -------
    float or ndarray
        Stall calibrated airspeed, m/s.  Equal to the stall EAS at p0 and above it at
        lower pressure (compressibility of the air at the pitot probe).

    Raises
    ------
    DomainError
        Bad or out-of-range input, stall EAS above 4000 m/s, stall Mach above 10 or a
        stall CAS above 10 a0.

    Notes
    -----
    LIM-2: cas = a0 F^-1(ps f(M)/p0) with M from :func:`stall_mach` (SPD-1; the linear
    limit below M = 2^-40).

    References
    ----------
    NACA Report 1135 (1953), eqs. 44 and 100.
    """
    prof = get_profile(profile)
    args = _stall_args(strict, weight, wing_area, cl_max, load_factor,
                       ps=(ps, dom.pressure(prof)))
    m = _checked_stall_mach(args, prof)
    x = args["ps"] * ratio_from_mach(m) / prof.p0
    over = x > RATIO_MAX
    args.flag(over, Status.OUT_OF_RANGE, "qc/p0", x, f"[0, {RATIO_MAX!r}] (CAS <= 10 a0)")
    return args.finish(np.where(m < TINY_MACH, tiny_linear(m, args["ps"] / prof.p0, prof.a0),
                                prof.a0 * mach_from_ratio(np.where(over, 0.0, x))))


@fill_doc
def stall_tas(
    weight: ArrayLike, wing_area: ArrayLike, cl_max: ArrayLike, ps: ArrayLike,
    sat: ArrayLike, load_factor: ArrayLike = 1.0, *, profile: Profile | str | None = None,
    strict: bool = True,
) -> FloatOrArray:
    """Stall speed as a true airspeed at static pressure ``ps`` and temperature ``sat``.

    Parameters
    ----------
    {weight}
    {wing_area}
    {cl_max}
    {ps}
    {sat}
    {load_factor}
    profile : Profile or str, optional
        Constants profile (supplies rho0, p0, a0, R and the pressure range).
    {strict}

    {broadcast}

    Returns
    -------
    float or ndarray
        Stall true airspeed, m/s (= stall EAS x sqrt(rho0/rho)).

    Raises
    ------
    DomainError
        Bad or out-of-range input, stall EAS above 4000 m/s or stall Mach above 10.

    Notes
    -----
    LIM-2: tas = M sqrt(gamma R sat) with M from :func:`stall_mach` (SPD-3).

    References
    ----------
    NACA Report 1135 (1953), speed of sound a = sqrt(gamma R T).
    """
    prof = get_profile(profile)
    args = _stall_args(strict, weight, wing_area, cl_max, load_factor,
                       ps=(ps, dom.pressure(prof)), sat=(sat, dom.TEMPERATURE))
    m = _checked_stall_mach(args, prof)
    return args.finish(m * np.sqrt((GAMMA * prof.R) * args["sat"]))


def _cas_limit_qc(args: Inputs, prof: Profile) -> F64:
    """PIT-3 on the CAS limit, with the CAS <= 10 a0 check."""
    m0 = args["cas_limit"] / prof.a0
    over = m0 > dom.MACH_MAX
    args.flag(over, Status.OUT_OF_RANGE, "cas_limit", args["cas_limit"],
              f"(0, {dom.MACH_MAX * prof.a0!r}] m/s")
    return impact_from_mach(np.where(over, 0.0, m0), prof.p0)


@fill_doc
def crossover_altitude(
    cas_limit: ArrayLike, mach_limit: ArrayLike, *, profile: Profile | str | None = None,
    strict: bool = True,
) -> FloatOrArray:
    """Pressure altitude at which a CAS limit and a subsonic Mach limit coincide.

    Below it the CAS limit is the lower speed, above it the Mach limit.

    Parameters
    ----------
    {cas_limit}
    mach_limit : float or array_like
        Mach limit, in (0, 1): a subsonic limit (Mach 1 and above are out of range).
    profile : Profile or str, optional
        Constants profile (supplies p0, a0 and the atmosphere).
    {strict}

    {broadcast}

    Returns
    -------
    float or ndarray
        Geopotential pressure altitude of the crossover, m.

    Raises
    ------
    DomainError
        Bad or out-of-range ``cas_limit`` or ``mach_limit``, or a crossover pressure
        outside the standard atmosphere [-5000, 84852] m (for example a CAS limit above
        the speed of sound at sea level with a low Mach limit).

    Notes
    -----
    LIM-3: qc = p0 f(cas/a0) (PIT-3, supersonic branch above a0), ps = qc / f(M),
    h = H(ps) (ALT-1).  Closed form, no iteration.

    References
    ----------
    NACA Report 1135 (1953), eqs. 44 and 100; ICAO Doc 7488/3 (1993).
    """
    prof = get_profile(profile)
    args = Inputs(strict, cas_limit=(cas_limit, CAS_LIMIT),
                  mach_limit=(mach_limit, SUBSONIC_MACH_LIMIT))
    sonic = args["mach_limit"] >= 1.0
    args.flag(sonic, Status.OUT_OF_RANGE, "mach_limit", args["mach_limit"],
              "(0, 1) (subsonic crossover)")
    return args.finish(_crossover(args, np.where(sonic, 0.5, args["mach_limit"]), prof))


def _crossover(args: Inputs, m: F64, prof: Profile) -> F64:
    """LIM-3 on checked inputs for any Mach limit ``m`` in (0, 10] (PIT-3 is supersonic
    above Mach 1, NACA 1135 eq. 100); flags a crossover pressure outside the model."""
    qc = _cas_limit_qc(args, prof)
    m0 = np.where(args["cas_limit"] / prof.a0 > dom.MACH_MAX, 0.0, args["cas_limit"] / prof.a0)
    tiny = (m0 < TINY_MACH) & (m < TINY_MACH)
    with np.errstate(divide="ignore", over="ignore"):  # ps = inf (tiny M): refused below
        ps = np.where(tiny, prof.p0 * ((args["cas_limit"] / m) / prof.a0) ** 2,
                      qc / ratio_from_mach(np.where(tiny, 0.5, m)))
    prange = dom.pressure(prof)
    out = (ps < prange.lo) | (ps > prange.hi)
    args.flag(out, Status.OUT_OF_RANGE, "crossover pressure", ps, prange.describe())
    ps = np.where(out, prof.p0, ps)
    return altitude_of_pressure(ps, layer_table(prof))


def _envelope_crossover(cas_limit: float, mach_limit: float, prof: Profile) -> float:
    """Crossover altitude of an aircraft's limits, m; NaN where none lies in the model.

    Unlike :func:`crossover_altitude` (a firmware function whose valid range, like the
    vectors', is a subsonic Mach limit), the envelope of a supersonic aircraft needs the
    crossover of a Mach limit up to 10: the same equation LIM-3 with the supersonic
    pitot relation.  Limits that do not cross within [-5000, 84852] m give NaN (one
    limit governs at every altitude of the model).

    Parameters
    ----------
    cas_limit : float
        Calibrated airspeed limit, m/s, in (0, 10 a0].
    mach_limit : float
        Mach limit, in (0, 10].
    prof : Profile
        Constants profile.

    Returns
    -------
    float
        Geopotential pressure altitude, m, or NaN.

    Raises
    ------
    DomainError
        ``cas_limit`` or ``mach_limit`` bad or out of range.
    """
    Inputs(True, cas_limit=(cas_limit, CAS_LIMIT), mach_limit=(mach_limit, MACH_LIMIT))
    lenient = Inputs(False, cas_limit=(float(cas_limit), CAS_LIMIT),
                     mach_limit=(float(mach_limit), MACH_LIMIT))  # checked just above
    return float(lenient.finish(_crossover(lenient, lenient["mach_limit"], prof)))


def _limit_args(strict: bool, ps: ArrayLike, cas_limit: ArrayLike, mach_limit: ArrayLike,
                prof: Profile) -> tuple[Inputs, F64, F64]:
    args = Inputs(strict, ps=(ps, dom.pressure(prof)), cas_limit=(cas_limit, CAS_LIMIT),
                  mach_limit=(mach_limit, MACH_LIMIT))
    qc_cas = _cas_limit_qc(args, prof)
    qc_mach = impact_from_mach(args["mach_limit"], args["ps"])
    return args, qc_cas, qc_mach


def _tiny_limits(args: Inputs, prof: Profile) -> tuple[NDArray[np.bool_], F64, F64]:
    """Where both limits are below Mach 2^-40: the mask, and cas/a0 and M sqrt(ps/p0)
    both times ``pitot.TINY_SCALE`` (normal even for subnormal limits, so that the
    comparison is decided at full precision; bit-identical decisions elsewhere)."""
    m0 = args["cas_limit"] / prof.a0
    m = args["mach_limit"]
    return ((m0 < TINY_MACH) & (m < TINY_MACH), (args["cas_limit"] * TINY_SCALE) / prof.a0,
            (m * TINY_SCALE) * np.sqrt(args["ps"] / prof.p0))


@fill_doc
def max_operating_cas(
    ps: ArrayLike, cas_limit: ArrayLike, mach_limit: ArrayLike, *,
    profile: Profile | str | None = None, strict: bool = True,
) -> FloatOrArray:
    """Maximum operating calibrated airspeed at static pressure ``ps``.

    The lower of the CAS limit and the CAS of the Mach limit at that pressure.

    Parameters
    ----------
    {ps}
    {cas_limit}
    {mach_limit}
    {profile_p0_a0_range}
    {strict}

    {broadcast}

    Returns
    -------
    float or ndarray
        Maximum operating CAS, m/s: exactly ``cas_limit`` where the CAS limit governs
        (below the crossover altitude), a0 F^-1(ps f(M)/p0) above it.

    Raises
    ------
    DomainError
        Bad or out-of-range ``ps``, ``cas_limit`` or ``mach_limit``.

    Notes
    -----
    LIM-4, compared through impact pressure (see the module docstring).

    References
    ----------
    NACA Report 1135 (1953), eqs. 44 and 100.
    """
    prof = get_profile(profile)
    args, qc_cas, qc_mach = _limit_args(strict, ps, cas_limit, mach_limit, prof)
    tiny, m0, m_eq = _tiny_limits(args, prof)
    by_cas = np.where(tiny, m0 <= m_eq, qc_cas <= qc_mach)
    x = np.where(by_cas, 0.0, qc_mach / prof.p0)  # < qc_cas/p0 <= RATIO_MAX
    m = args["mach_limit"]
    cas = np.where(m < TINY_MACH, tiny_linear(m, args["ps"] / prof.p0, prof.a0),
                   prof.a0 * mach_from_ratio(x))
    return args.finish(np.where(by_cas, args["cas_limit"], cas))


@fill_doc
def max_operating_mach(
    ps: ArrayLike, cas_limit: ArrayLike, mach_limit: ArrayLike, *,
    profile: Profile | str | None = None, strict: bool = True,
) -> FloatOrArray:
    """Maximum operating Mach number at static pressure ``ps``.

    The lower of the Mach limit and the Mach number of the CAS limit at that pressure.

    Parameters
    ----------
    {ps}
    {cas_limit}
    {mach_limit}
    {profile_p0_a0_range}
    {strict}

    {broadcast}

    Returns
    -------
    float or ndarray
        Maximum operating Mach number: exactly ``mach_limit`` where the Mach limit
        governs (above the crossover altitude), F^-1(p0 f(cas/a0)/ps) below it.

    Raises
    ------
    DomainError
        Bad or out-of-range ``ps``, ``cas_limit`` or ``mach_limit``.

    Notes
    -----
    LIM-4, compared through impact pressure (see the module docstring).

    References
    ----------
    NACA Report 1135 (1953), eqs. 44 and 100.
    """
    prof = get_profile(profile)
    args, qc_cas, qc_mach = _limit_args(strict, ps, cas_limit, mach_limit, prof)
    tiny, m0, m_eq = _tiny_limits(args, prof)
    by_mach = np.where(tiny, m_eq <= m0, qc_mach <= qc_cas)
    x = np.where(by_mach, 0.0, qc_cas / args["ps"])  # < qc_mach/ps <= RATIO_MAX
    m = np.where(args["cas_limit"] / prof.a0 < TINY_MACH,
                 tiny_mach_of_cas(args["cas_limit"], prof.p0 / args["ps"], prof.a0),
                 mach_from_ratio(x))
    return args.finish(np.where(by_mach, args["mach_limit"], m))


@fill_doc
def ceiling_margin(
    ps: ArrayLike, ceiling: ArrayLike, *, profile: Profile | str | None = None,
    strict: bool = True,
) -> FloatOrArray:
    """Margin to a maximum altitude given as a fixed pressure altitude.

    Parameters
    ----------
    {ps}
    ceiling : float or array_like
        Maximum altitude, geopotential pressure altitude, m, in [-5000, 84852].
    {profile}
    {strict}

    {broadcast}

    Returns
    -------
    float or ndarray
        ceiling - H(ps), m: positive below the maximum altitude, negative above it.
        Independent of temperature and of the altimeter setting.

    Raises
    ------
    DomainError
        Bad or out-of-range ``ps`` or ``ceiling``.

    Notes
    -----
    LIM-5 with ALT-1.

    References
    ----------
    ICAO Doc 7488/3 (1993).
    """
    prof = get_profile(profile)
    args = Inputs(strict, ps=(ps, dom.pressure(prof)), ceiling=(ceiling, dom.altitude(prof)))
    return args.finish(args["ceiling"] - altitude_of_pressure(args["ps"], layer_table(prof)))


# --------------------------------------------------------------------------------------
# The envelope table


@dataclass(frozen=True)
class SpeedSet:
    """One speed limit expressed four ways, one value per table row.

    Attributes
    ----------
    cas, eas, tas : ndarray
        Calibrated, equivalent and true airspeed, m/s.
    mach : ndarray
        Mach number.
    """

    cas: F64
    eas: F64
    tas: F64
    mach: F64

    def as_lists(self) -> dict[str, list[float]]:
        """JSON-ready lists, m/s and Mach."""
        return {"cas_m_s": self.cas.tolist(), "eas_m_s": self.eas.tolist(),
                "tas_m_s": self.tas.tolist(), "mach": self.mach.tolist()}


@dataclass(frozen=True)
class Envelope:
    """Every limit of one aircraft over a column of pressure altitudes (SI units).

    Attributes
    ----------
    aircraft : Aircraft
        The aircraft.
    altitude : ndarray
        Geopotential pressure altitude of each row, m.
    pressure : ndarray
        Static pressure, Pa.
    sat : ndarray
        Static air temperature of the day (standard plus ``dT``), K.
    dT : float
        Temperature deviation from the standard day, K.
    load_factor : float
        Load factor of the stall speeds.
    stall_light, stall_heavy : SpeedSet
        Stall speed at the lightest and at the heaviest weight.
    max_operating : SpeedSet
        Maximum operating speed (lower of the CAS and Mach limits).
    mach_governs : ndarray of bool
        True where the Mach limit is the lower one.
    above_ceiling : ndarray of bool
        True where the row lies above the maximum altitude.
    crossover_altitude : float
        Pressure altitude where the CAS and Mach limits coincide, m (the supersonic
        pitot relation for a Mach limit above 1); NaN when they do not meet within the
        standard atmosphere [-5000, 84852] m.
    ceiling : float
        Maximum altitude (pressure altitude), m.
    profile : str
        Name of the constants profile.
    """

    aircraft: Aircraft
    altitude: F64
    pressure: F64
    sat: F64
    dT: float
    load_factor: float
    stall_light: SpeedSet
    stall_heavy: SpeedSet
    max_operating: SpeedSet
    mach_governs: NDArray[np.bool_]
    above_ceiling: NDArray[np.bool_]
    crossover_altitude: float
    ceiling: float
    profile: str

    def as_dict(self) -> dict[str, object]:
        """JSON-ready form, SI units (a crossover outside the model is null)."""
        return {
            "aircraft": self.aircraft.as_dict(), "profile": self.profile,
            "dT_K": self.dT, "load_factor": self.load_factor,
            "crossover_altitude_m": (self.crossover_altitude
                                     if math.isfinite(self.crossover_altitude) else None),
            "ceiling_m": self.ceiling,
            "altitude_m": self.altitude.tolist(), "pressure_Pa": self.pressure.tolist(),
            "sat_K": self.sat.tolist(),
            "stall_light": self.stall_light.as_lists(),
            "stall_heavy": self.stall_heavy.as_lists(),
            "max_operating": self.max_operating.as_lists(),
            "mach_governs": self.mach_governs.tolist(),
            "above_ceiling": self.above_ceiling.tolist(),
        }


def _default_altitudes(ceiling: float) -> F64:
    step = 2000.0 * 0.3048
    h = np.arange(0.0, ceiling, step)
    return np.append(h, ceiling)


@fill_doc
def envelope(
    aircraft: Aircraft | str | Path, altitudes: ArrayLike | None = None, *, dT: float = 0.0,
    load_factor: float = 1.0, profile: Profile | str | None = None,
) -> Envelope:
    """Table of every limit of an aircraft in CAS, EAS, TAS and Mach against altitude.

    Parameters
    ----------
    aircraft : Aircraft or str or Path
        The aircraft, or the path of its ``airdata-aircraft/1`` file.
    altitudes : array_like, optional
        Geopotential pressure altitudes of the rows, m, in [-5000, 84852]; default
        every 2000 ft from 0 to the ceiling, the ceiling included.
    dT : float, optional
        Temperature deviation from the standard day, K, in [-100, 100]; changes only
        the true airspeeds.
    load_factor : float, optional
        Load factor of the stall speeds, in (0, 10]; default 1.
    {profile}

    Returns
    -------
    Envelope
        The table.

    Raises
    ------
    DomainError
        Bad altitudes, ``dT`` or ``load_factor``; an aircraft whose limits are out of
        range; a stall speed beyond the model at some altitude.
    AircraftFileError, OSError
        An unreadable aircraft file.

    Notes
    -----
    Stall speeds LIM-1 and LIM-2 at the lightest and heaviest weight (mass x g0);
    maximum operating speeds LIM-4; crossover LIM-3; the maximum operating EAS and TAS
    follow from its Mach number through SPD-2 and SPD-3.
    """
    if not isinstance(aircraft, Aircraft):
        from .aircraft import load_aircraft

        aircraft = load_aircraft(aircraft)
    prof = get_profile(profile)
    h = np.atleast_1d(np.asarray(
        _default_altitudes(aircraft.ceiling) if altitudes is None else altitudes,
        dtype=np.float64))
    if h.ndim != 1:
        raise ValueError("altitudes must be a one-dimensional sequence")
    if not (np.isfinite(load_factor) and LOAD_FACTOR.lo < load_factor <= LOAD_FACTOR.hi):
        raise DomainError("load_factor", float(load_factor), None, LOAD_FACTOR.describe(),
                          Status.OUT_OF_RANGE if np.isfinite(load_factor) and load_factor > 0
                          else Status.INVALID_INPUT)
    atm = atmosphere(h, dT, profile=prof)
    ps = np.asarray(atm.pressure)
    sat = np.asarray(atm.temperature)
    a = np.sqrt((GAMMA * prof.R) * sat)
    root = np.sqrt(ps / prof.p0)

    def stall(weight: float) -> SpeedSet:
        eas = np.full_like(h, stall_eas(weight, aircraft.wing_area, aircraft.cl_max,
                                        load_factor, profile=prof))
        cas = np.asarray(stall_cas(weight, aircraft.wing_area, aircraft.cl_max, ps,
                                   load_factor, profile=prof))
        mach = np.asarray(stall_mach(weight, aircraft.wing_area, aircraft.cl_max, ps,
                                     load_factor, profile=prof))
        return SpeedSet(cas=cas, eas=eas, tas=mach * a, mach=mach)

    w_light, w_heavy = aircraft.weights(prof.g0)
    vmo = np.asarray(max_operating_cas(ps, aircraft.cas_limit, aircraft.mach_limit,
                                       profile=prof))
    mmo = np.asarray(max_operating_mach(ps, aircraft.cas_limit, aircraft.mach_limit,
                                        profile=prof))
    qc_cas = prof.p0 * ratio_from_mach(np.array([aircraft.cas_limit / prof.a0]))[0]
    qc_mach = ps * ratio_from_mach(np.full_like(ps, aircraft.mach_limit))
    hx = _envelope_crossover(aircraft.cas_limit, aircraft.mach_limit, prof)
    mo = SpeedSet(cas=vmo, eas=prof.a0 * mmo * root, tas=mmo * a, mach=mmo)
    return Envelope(
        aircraft=aircraft, altitude=h, pressure=ps, sat=sat, dT=float(dT),
        load_factor=float(load_factor), stall_light=stall(w_light),
        stall_heavy=stall(w_heavy), max_operating=mo,
        mach_governs=qc_mach < qc_cas,
        above_ceiling=h > aircraft.ceiling, crossover_altitude=hx,
        ceiling=aircraft.ceiling, profile=prof.name,
    )


def plot_envelope(env: Envelope, path: str | Path | None = None) -> Any:
    """Chart of the envelope: CAS and TAS against pressure altitude, with limit lines.

    Parameters
    ----------
    env : Envelope
        The table from :func:`envelope`; the chart is drawn on a fine column of
        altitudes over the same range (the crossover included), not on its rows.
    path : str or Path, optional
        Write the chart there (format from the suffix: .png, .svg, .pdf).

    Returns
    -------
    matplotlib.figure.Figure
        The figure, not attached to pyplot (no backend is selected or changed).

    Raises
    ------
    ImportError
        matplotlib is not installed (it is an optional extra).
    """
    from matplotlib.figure import Figure

    kt = 1852.0 / 3600.0
    ft = 0.3048
    # Draw on a fine column with the crossover in it, so that the corner is exact.
    lo, hi = float(env.altitude.min()), float(env.altitude.max())
    fine = np.union1d(np.linspace(lo, hi, 400),
                      [env.crossover_altitude] if lo < env.crossover_altitude < hi else [])
    env = envelope(env.aircraft, fine, dT=env.dT, load_factor=env.load_factor,
                   profile=env.profile)
    fig = Figure(figsize=(11.0, 6.0), layout="constrained")
    axes = fig.subplots(1, 2, sharey=True)
    hft = env.altitude / ft
    for ax, key, title in ((axes[0], "cas", "calibrated airspeed"),
                           (axes[1], "tas", "true airspeed")):
        heavy = getattr(env.stall_heavy, key) / kt
        light = getattr(env.stall_light, key) / kt
        top = getattr(env.max_operating, key) / kt
        ax.fill_betweenx(hft, heavy, top, where=top >= heavy, color="0.92", lw=0)
        ax.plot(light, hft, "k--", lw=1.2, label="stall, lightest weight")
        ax.plot(heavy, hft, "k-", lw=1.6, label="stall, heaviest weight")
        ax.plot(top, hft, color="tab:blue", lw=1.8, label="maximum operating speed")
        ax.axhline(env.ceiling / ft, color="tab:red", lw=1.0, ls="-.",
                   label="maximum altitude")
        if np.isfinite(env.crossover_altitude):
            ax.axhline(env.crossover_altitude / ft, color="tab:blue", lw=0.8, ls=":",
                       label="CAS/Mach crossover")
        ax.set_xlabel(f"{title}, kt")
        ax.set_title(f"{key.upper()} limits")
        ax.grid(True, lw=0.4, color="0.8")
    axes[0].set_ylabel("pressure altitude, ft")
    axes[0].legend(loc="center", fontsize=8, frameon=False)
    fig.suptitle(f"Speed envelope: {env.aircraft.name} (profile {env.profile}, "
                 f"ISA {env.dT:+.0f} K, n = {env.load_factor:g})")
    if path is not None:
        fig.savefig(path, dpi=120)
    return fig
