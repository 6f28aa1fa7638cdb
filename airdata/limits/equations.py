"""Flight-envelope limit equations LIM-1 .. LIM-5 (the package docstring,
:mod:`airdata.limits`, states them): stall speeds, the crossover altitude of a CAS/Mach
limit pair, the maximum operating CAS and Mach, and the margin to a maximum altitude.
Mirrors bindings/c/src/limits.c.
"""

from __future__ import annotations

from typing import NamedTuple

import numpy as np
from numpy.typing import NDArray

from .. import _domains as dom
from .._docs import fill_doc
from .._inputs import ArrayLike, Domain, FloatOrArray, Inputs
from .._layers import layer_table
from ..altimetry import altitude_of_pressure
from ..pitot import (
    RATIO_MAX,
    TINY_MACH,
    TINY_SCALE,
    impact_from_mach,
    mach_from_ratio,
    ratio_from_mach,
    tiny_linear,
    tiny_mach_of_cas,
)
from ..profiles import GAMMA, Profile, get_profile
from ..status import Status

__all__ = [
    "WEIGHT", "WING_AREA", "CL_MAX", "LOAD_FACTOR", "CAS_LIMIT", "MACH_LIMIT",
    "SUBSONIC_MACH_LIMIT",
    "stall_eas", "stall_mach", "stall_cas", "stall_tas",
    "crossover_altitude", "max_operating_cas", "max_operating_mach", "ceiling_margin",
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
    over = args.flag_above(eas, dom.SPEED.hi, "stall EAS", dom.SPEED.describe())
    return np.where(over, 0.0, eas)


def _checked_stall_mach(args: Inputs, prof: Profile) -> F64:
    eas = _checked_stall_eas(args, prof.rho0)
    m = eas / (prof.a0 * np.sqrt(args["ps"] / prof.p0))
    over = args.flag_above(m, dom.MACH_MAX, "stall Mach", f"[0, {dom.MACH_MAX!r}]")
    return np.where(over, 0.0, m)


@fill_doc
def stall_eas(weight: ArrayLike, wing_area: ArrayLike, cl_max: ArrayLike,
              load_factor: ArrayLike = 1.0, *, profile: Profile | str | None = None,
              strict: bool = True) -> FloatOrArray:
    """Stall speed as an equivalent airspeed, from lift = load factor x weight.

    Parameters
    ----------
    {weight, wing_area, cl_max}
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
def stall_mach(weight: ArrayLike, wing_area: ArrayLike, cl_max: ArrayLike, ps: ArrayLike,
               load_factor: ArrayLike = 1.0, *, profile: Profile | str | None = None,
               strict: bool = True) -> FloatOrArray:
    """Stall Mach number at static pressure ``ps``.

    The stall EAS of :func:`stall_eas` as a Mach number at that pressure.

    {Parameters: weight, wing_area, cl_max, ps, load_factor, profile_rho0_p0_a0_range,
                 strict; broadcast}

    Returns
    -------
    float or ndarray
        Stall Mach number.

    {Raises: bad_stall_mach}

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
def stall_cas(weight: ArrayLike, wing_area: ArrayLike, cl_max: ArrayLike, ps: ArrayLike,
              load_factor: ArrayLike = 1.0, *, profile: Profile | str | None = None,
              strict: bool = True) -> FloatOrArray:
    """Stall speed as a calibrated airspeed at static pressure ``ps``.

    What the airspeed indicator shows at the stall: the stall Mach number of
    :func:`stall_mach` through the pitot relation.

    {Parameters: weight, wing_area, cl_max, ps, load_factor, profile_rho0_p0_a0_range,
                 strict; broadcast}

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
    over = args.flag_above(x, RATIO_MAX, "qc/p0", f"[0, {RATIO_MAX!r}] (CAS <= 10 a0)")
    return args.finish(np.where(m < TINY_MACH, tiny_linear(m, args["ps"] / prof.p0, prof.a0),
                                prof.a0 * mach_from_ratio(np.where(over, 0.0, x))))


@fill_doc
def stall_tas(weight: ArrayLike, wing_area: ArrayLike, cl_max: ArrayLike, ps: ArrayLike,
              sat: ArrayLike, load_factor: ArrayLike = 1.0, *, profile: Profile | str | None = None,
              strict: bool = True) -> FloatOrArray:
    """Stall speed as a true airspeed at static pressure ``ps`` and temperature ``sat``.

    Parameters
    ----------
    {weight, wing_area, cl_max, ps, sat, load_factor}
    profile : Profile or str, optional
        Constants profile (supplies rho0, p0, a0, R and the pressure range).
    {strict}

    {broadcast}

    Returns
    -------
    float or ndarray
        Stall true airspeed, m/s (= stall EAS x sqrt(rho0/rho)).

    {Raises: bad_stall_mach}

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
    over = args.flag_above(m0, dom.MACH_MAX, "cas_limit",
                           f"(0, {dom.MACH_MAX * prof.a0!r}] m/s", shown=args["cas_limit"])
    return impact_from_mach(np.where(over, 0.0, m0), prof.p0)


@fill_doc
def crossover_altitude(cas_limit: ArrayLike, mach_limit: ArrayLike, *,
                       profile: Profile | str | None = None, strict: bool = True) -> FloatOrArray:
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


class _Limits(NamedTuple):
    """The checked arguments of LIM-4 and what both of its functions compare."""

    args: Inputs
    prof: Profile
    #: Impact pressure of the CAS limit (p0 f(cas/a0)) and of the Mach limit (ps f(M)), Pa.
    qc_cas: F64
    qc_mach: F64
    #: Where both limits are below Mach 2^-40; there cas/a0 and M sqrt(ps/p0), both times
    #: ``pitot.TINY_SCALE`` (normal even for subnormal limits, so that the comparison is
    #: decided at full precision; bit-identical decisions elsewhere).
    tiny: NDArray[np.bool_]
    m0: F64
    m_eq: F64


def _limits(strict: bool, ps: ArrayLike, cas_limit: ArrayLike, mach_limit: ArrayLike,
            profile: Profile | str | None) -> _Limits:
    """Check the arguments of LIM-4 and compute what both of its functions compare."""
    prof = get_profile(profile)
    args = Inputs(strict, ps=(ps, dom.pressure(prof)), cas_limit=(cas_limit, CAS_LIMIT),
                  mach_limit=(mach_limit, MACH_LIMIT))
    m = args["mach_limit"]
    return _Limits(args, prof, _cas_limit_qc(args, prof), impact_from_mach(m, args["ps"]),
                   (args["cas_limit"] / prof.a0 < TINY_MACH) & (m < TINY_MACH),
                   (args["cas_limit"] * TINY_SCALE) / prof.a0,
                   (m * TINY_SCALE) * np.sqrt(args["ps"] / prof.p0))


@fill_doc
def max_operating_cas(ps: ArrayLike, cas_limit: ArrayLike, mach_limit: ArrayLike, *,
                      profile: Profile | str | None = None, strict: bool = True) -> FloatOrArray:
    """Maximum operating calibrated airspeed at static pressure ``ps``.

    The lower of the CAS limit and the CAS of the Mach limit at that pressure.

    {Parameters: ps, cas_limit, mach_limit, profile_p0_a0_range, strict; broadcast}

    Returns
    -------
    float or ndarray
        Maximum operating CAS, m/s: exactly ``cas_limit`` where the CAS limit governs
        (below the crossover altitude), a0 F^-1(ps f(M)/p0) above it.

    {Raises: bad_ps_limits}

    Notes
    -----
    LIM-4: the two limits compared through impact pressure (see the module docstring);
    where the Mach limit governs, cas = a0 F^-1(ps f(M)/p0).

    References
    ----------
    NACA Report 1135 (1953), eqs. 44 and 100.
    """
    args, prof, qc_cas, qc_mach, tiny, m0, m_eq = _limits(strict, ps, cas_limit, mach_limit,
                                                          profile)
    by_cas = np.where(tiny, m0 <= m_eq, qc_cas <= qc_mach)
    x = np.where(by_cas, 0.0, qc_mach / prof.p0)  # < qc_cas/p0 <= RATIO_MAX
    m = args["mach_limit"]
    cas = np.where(m < TINY_MACH, tiny_linear(m, args["ps"] / prof.p0, prof.a0),
                   prof.a0 * mach_from_ratio(x))
    return args.finish(np.where(by_cas, args["cas_limit"], cas))


@fill_doc
def max_operating_mach(ps: ArrayLike, cas_limit: ArrayLike, mach_limit: ArrayLike, *,
                       profile: Profile | str | None = None, strict: bool = True) -> FloatOrArray:
    """Maximum operating Mach number at static pressure ``ps``.

    The lower of the Mach limit and the Mach number of the CAS limit at that pressure.

    {Parameters: ps, cas_limit, mach_limit, profile_p0_a0_range, strict; broadcast}

    Returns
    -------
    float or ndarray
        Maximum operating Mach number: exactly ``mach_limit`` where the Mach limit
        governs (above the crossover altitude), F^-1(p0 f(cas/a0)/ps) below it.

    {Raises: bad_ps_limits}

    Notes
    -----
    LIM-4: the two limits compared through impact pressure (see the module docstring);
    where the CAS limit governs, M = F^-1(p0 f(cas/a0)/ps).

    References
    ----------
    NACA Report 1135 (1953), eqs. 44 and 100.
    """
    args, prof, qc_cas, qc_mach, tiny, m0, m_eq = _limits(strict, ps, cas_limit, mach_limit,
                                                          profile)
    by_mach = np.where(tiny, m_eq <= m0, qc_mach <= qc_cas)
    x = np.where(by_mach, 0.0, qc_cas / args["ps"])  # < qc_mach/ps <= RATIO_MAX
    m = np.where(args["cas_limit"] / prof.a0 < TINY_MACH,
                 tiny_mach_of_cas(args["cas_limit"], prof.p0 / args["ps"], prof.a0),
                 mach_from_ratio(x))
    return args.finish(np.where(by_mach, args["mach_limit"], m))


@fill_doc
def ceiling_margin(ps: ArrayLike, ceiling: ArrayLike, *, profile: Profile | str | None = None,
                   strict: bool = True) -> FloatOrArray:
    """Margin to a maximum altitude given as a fixed pressure altitude.

    Parameters
    ----------
    {ps}
    ceiling : float or array_like
        Maximum altitude, geopotential pressure altitude, m, in [-5000, 84852].
    {profile, strict}

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
