"""Airspeed conversions: calibrated, equivalent and true airspeed, Mach number and
dynamic pressure.

Equations SPD-1 .. SPD-4 of docs/equations.md; gamma = 1.4.
"""

from __future__ import annotations

import numpy as np

from . import _domains as dom
from ._docs import fill_doc
from ._inputs import ArrayLike, FloatOrArray, Inputs
from .pitot import (
    MACH_LIMIT,
    RATIO_LIMIT,
    RATIO_MAX,
    TINY_MACH,
    mach_from_ratio,
    ratio_from_mach,
    tiny_linear,
    tiny_mach_of_cas,
)
from .profiles import GAMMA, Profile, get_profile

__all__ = [
    "cas_from_mach",
    "mach_from_cas",
    "eas_from_mach",
    "mach_from_eas",
    "tas_from_mach",
    "mach_from_tas",
    "dynamic_pressure",
]



@fill_doc
def cas_from_mach(mach: ArrayLike, ps: ArrayLike, *, profile: Profile | str | None = None,
                  strict: bool = True) -> FloatOrArray:
    """Calibrated airspeed at Mach ``mach`` and static pressure ``ps``.

    Parameters
    ----------
    {mach}
    ps : float or array_like
        Static pressure, Pa, in [0.3734, 177687] Pa (icao).  The impact pressure
        must not exceed that of CAS = 10 a0.
    {profile_p0_a0_range, strict}

    {broadcast}

    {Returns: out_cas}

    Raises
    ------
    DomainError
        Bad ``mach`` or ``ps``, or a CAS above 10 a0 (out of range).

    Notes
    -----
    SPD-1: qc = ps f(M) (PIT-1), then cas = a0 f^-1(qc/p0) (PIT-2); below
    M = 2^-40 the linear limit cas = a0 M sqrt(ps/p0) (``pitot.TINY_MACH``).

    References
    ----------
    NACA Report 1135 (1953), eqs. 44 and 100.
    """
    prof = get_profile(profile)
    args = Inputs(strict, mach=(mach, dom.MACH), ps=(ps, dom.pressure(prof)))
    x = args["ps"] * ratio_from_mach(args["mach"]) / prof.p0
    over = args.flag_above(x, RATIO_LIMIT, "qc/p0", f"[0, {RATIO_MAX!r}] (CAS <= 10 a0)")
    m = args["mach"]
    k = args["ps"] / prof.p0
    return args.finish(np.where(m < TINY_MACH, tiny_linear(m, k, prof.a0),
                                prof.a0 * mach_from_ratio(np.where(over, 0.0, x))))


@fill_doc
def mach_from_cas(cas: ArrayLike, ps: ArrayLike, *, profile: Profile | str | None = None,
                  strict: bool = True) -> FloatOrArray:
    """Mach number at calibrated airspeed ``cas`` and static pressure ``ps``.

    Parameters
    ----------
    cas : float or array_like
        Calibrated airspeed, m/s, in [0, 10 a0].
    ps : float or array_like
        Static pressure, Pa, in [0.3734, 177687] Pa (icao).  The resulting Mach
        number must not exceed 10.
    {profile_p0_a0_range, strict}

    {broadcast}

    {Returns: out_mach}

    Raises
    ------
    DomainError
        Bad ``cas`` or ``ps``, CAS above 10 a0 or Mach above 10 (out of range).

    Notes
    -----
    SPD-1 inverted: qc = p0 f(cas/a0) (PIT-1), then M = f^-1(qc/ps) (PIT-2); below
    cas/a0 = 2^-40 the linear limit M = (cas/a0) sqrt(p0/ps) (``pitot.TINY_MACH``).

    References
    ----------
    NACA Report 1135 (1953), eqs. 44 and 100.
    """
    prof = get_profile(profile)
    args = Inputs(strict, cas=(cas, dom.SPEED), ps=(ps, dom.pressure(prof)))
    m0 = args["cas"] / prof.a0
    over0 = args.flag_above(m0, MACH_LIMIT, "cas",
                            f"[0, {dom.MACH_MAX * prof.a0!r}] m/s", shown=args["cas"])
    x = prof.p0 * ratio_from_mach(np.where(over0, 0.0, m0)) / args["ps"]
    over = args.flag_above(x, RATIO_LIMIT, "qc/ps", f"[0, {RATIO_MAX!r}] (Mach <= 10)")
    return args.finish(np.where(m0 < TINY_MACH,
                                tiny_mach_of_cas(args["cas"], prof.p0 / args["ps"], prof.a0),
                                mach_from_ratio(np.where(over, 0.0, x))))


@fill_doc
def eas_from_mach(mach: ArrayLike, ps: ArrayLike, *, profile: Profile | str | None = None,
                  strict: bool = True) -> FloatOrArray:
    """Equivalent airspeed at Mach ``mach`` and static pressure ``ps``.

    {Parameters: mach, ps, profile_p0_a0, strict; broadcast}

    Returns
    -------
    float or ndarray
        Equivalent airspeed, m/s.

    {Raises: bad_mach_ps}

    Notes
    -----
    SPD-2: eas = tas sqrt(rho/rho0) = M a0 sqrt(ps/p0), independent of temperature.

    References
    ----------
    Definition of equivalent airspeed; NACA Report 1135 (1953) for a = sqrt(gamma p/rho).
    """
    prof = get_profile(profile)
    args = Inputs(strict, mach=(mach, dom.MACH), ps=(ps, dom.pressure(prof)))
    return args.finish(prof.a0 * args["mach"] * np.sqrt(args["ps"] / prof.p0))


@fill_doc
def mach_from_eas(eas: ArrayLike, ps: ArrayLike, *, profile: Profile | str | None = None,
                  strict: bool = True) -> FloatOrArray:
    """Mach number at equivalent airspeed ``eas`` and static pressure ``ps``.

    Parameters
    ----------
    eas : float or array_like
        Equivalent airspeed, m/s, in [0, 4000].  The Mach number must not exceed 10.
    {ps, profile_p0_a0, strict}

    {broadcast}

    {Returns: out_mach}

    Raises
    ------
    DomainError
        Bad ``eas`` or ``ps``, or a Mach number above 10 (out of range).

    Notes
    -----
    SPD-2 inverted: M = eas / (a0 sqrt(ps/p0)).

    References
    ----------
    Definition of equivalent airspeed.
    """
    prof = get_profile(profile)
    args = Inputs(strict, eas=(eas, dom.SPEED), ps=(ps, dom.pressure(prof)))
    m = args["eas"] / (prof.a0 * np.sqrt(args["ps"] / prof.p0))
    args.flag_above(m, MACH_LIMIT, "Mach", "[0, 10.0]")
    return args.finish(m)


@fill_doc
def tas_from_mach(mach: ArrayLike, sat: ArrayLike, *, profile: Profile | str | None = None,
                  strict: bool = True) -> FloatOrArray:
    """True airspeed at Mach ``mach`` and static air temperature ``sat``.

    {Parameters: mach, sat, profile_R, strict; broadcast}

    Returns
    -------
    float or ndarray
        True airspeed, m/s.

    Raises
    ------
    DomainError
        Bad or out-of-range ``mach`` or ``sat``.

    Notes
    -----
    SPD-3: tas = M sqrt(gamma R sat).

    References
    ----------
    NACA Report 1135 (1953), speed of sound a = sqrt(gamma R T).
    """
    prof = get_profile(profile)
    args = Inputs(strict, mach=(mach, dom.MACH), sat=(sat, dom.TEMPERATURE))
    return args.finish(args["mach"] * np.sqrt((GAMMA * prof.R) * args["sat"]))


@fill_doc
def mach_from_tas(tas: ArrayLike, sat: ArrayLike, *, profile: Profile | str | None = None,
                  strict: bool = True) -> FloatOrArray:
    """Mach number at true airspeed ``tas`` and static air temperature ``sat``.

    Parameters
    ----------
    tas : float or array_like
        True airspeed, m/s, in [0, 4000].  The Mach number must not exceed 10.
    {sat}
    {profile_R}
    {strict}

    {broadcast}

    {Returns: out_mach}

    Raises
    ------
    DomainError
        Bad ``tas`` or ``sat``, or a Mach number above 10 (out of range).

    Notes
    -----
    SPD-3 inverted: M = tas / sqrt(gamma R sat).

    References
    ----------
    NACA Report 1135 (1953), speed of sound a = sqrt(gamma R T).
    """
    prof = get_profile(profile)
    args = Inputs(strict, tas=(tas, dom.SPEED), sat=(sat, dom.TEMPERATURE))
    m = args["tas"] / np.sqrt((GAMMA * prof.R) * args["sat"])
    args.flag_above(m, MACH_LIMIT, "Mach", "[0, 10.0]")
    return args.finish(m)


@fill_doc
def dynamic_pressure(mach: ArrayLike, ps: ArrayLike, *, profile: Profile | str | None = None,
                     strict: bool = True) -> FloatOrArray:
    """Dynamic pressure q = rho V^2 / 2 = (gamma/2) ps M^2.

    {Parameters: mach, ps, profile_range, strict; broadcast}

    Returns
    -------
    float or ndarray
        Dynamic pressure, Pa.  Not the impact pressure: the two differ by the
        compressibility of the air.

    {Raises: bad_mach_ps}

    Notes
    -----
    SPD-4: q = 0.7 ps M^2.

    References
    ----------
    NACA Report 1135 (1953), eq. 46 (from memory).
    """
    prof = get_profile(profile)
    args = Inputs(strict, mach=(mach, dom.MACH), ps=(ps, dom.pressure(prof)))
    m = args["mach"]
    return args.finish((0.5 * GAMMA) * args["ps"] * (m * m))
