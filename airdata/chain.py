"""The air-data computer chain: static pressure, total pressure and total air
temperature in; every air-data output out.  CHN-1 of docs/equations.md.
"""

from __future__ import annotations

from dataclasses import dataclass, fields

import numpy as np
from numpy.typing import NDArray

from . import _domains as dom
from ._docs import fill_doc
from ._inputs import ArrayLike, FloatOrArray, Inputs
from ._layers import layer_table
from .altimetry import altitude_of_density, altitude_of_pressure, density_range
from .pitot import RATIO_LIMIT, RATIO_MAX, mach_from_ratio
from .profiles import GAMMA, Profile, get_profile
from .status import DomainError, Status

__all__ = ["AirData", "air_data", "NOISE_BAND", "AIR_DATA_OUTPUTS", "OutputInfo", "OUTPUT_INFO"]

#: Default half-width of the band of negative impact pressure read as zero, Pa
#: (airdata._domains.NOISE_BAND).
NOISE_BAND = dom.NOISE_BAND

_TOTAL_PRESSURE = dom.TOTAL_PRESSURE
_NOISE = dom.NOISE


@fill_doc
@dataclass(frozen=True)
class AirData:
    """Every output of one air-data computation (SI units).

    Attributes
    ----------
    pressure_altitude : float or ndarray
        Geopotential pressure altitude, m.
    baro_altitude : float or ndarray or None
        Baro-corrected altitude, m; ``None`` when no setting was given.
    impact_pressure : float or ndarray
        qc = pt - ps, Pa (zero where a small negative reading was zeroed).
    mach, cas, eas, tas : float or ndarray
        Mach number; calibrated, equivalent and true airspeed, m/s.
    sat : float or ndarray
        Static air temperature, K.
    density : float or ndarray
        Air density ps/(R sat), kg/m3.
    density_altitude : float or ndarray
        Geopotential density altitude, m.
    dynamic_pressure : float or ndarray
        0.7 ps M^2, Pa.
    status : int or ndarray of int8
        :class:`Status` of each sample: ``OK``, ``IMPACT_PRESSURE_ZEROED`` or, with
        ``strict=False``, the error that made that sample's outputs NaN.
    {profile_name}
    """

    pressure_altitude: FloatOrArray
    baro_altitude: FloatOrArray | None
    impact_pressure: FloatOrArray
    mach: FloatOrArray
    cas: FloatOrArray
    eas: FloatOrArray
    tas: FloatOrArray
    sat: FloatOrArray
    density: FloatOrArray
    density_altitude: FloatOrArray
    dynamic_pressure: FloatOrArray
    status: int | NDArray[np.int8]
    profile: str


#: The outputs of :func:`air_data`, in the order of the fields of :class:`AirData` (and of
#: the C record ``ad_air_data_t``): every field but ``status`` and ``profile``.
AIR_DATA_OUTPUTS: tuple[str, ...] = tuple(f.name for f in fields(AirData)
                                          if f.name not in ("status", "profile"))


@dataclass(frozen=True)
class OutputInfo:
    """How the package names and measures one output of :func:`air_data`.

    Attributes
    ----------
    key : str
        The :class:`AirData` field.
    short : str
        Its short name: the column of ``airdata reduce`` (``hp``, ``qc``, ...).
    dimension : str
        Its dimension in :mod:`airdata.units` (``length``, ``pressure``, ...).
    si_unit : str
        The SI unit of the value.
    words : str
        The output in words; ``symbol`` is its usual abbreviation, if any.
    symbol : str
    """

    key: str
    short: str
    dimension: str
    si_unit: str
    words: str
    symbol: str = ""


#: Every output of :func:`air_data`, in the order of :data:`AIR_DATA_OUTPUTS`.
OUTPUT_INFO: tuple[OutputInfo, ...] = (
    OutputInfo("pressure_altitude", "hp", "length", "m", "pressure altitude"),
    OutputInfo("baro_altitude", "hbaro", "length", "m", "baro-corrected altitude"),
    OutputInfo("impact_pressure", "qc", "pressure", "Pa", "impact pressure", "qc"),
    OutputInfo("mach", "mach", "dimensionless", "1", "Mach number"),
    OutputInfo("cas", "cas", "speed", "m/s", "calibrated airspeed", "CAS"),
    OutputInfo("eas", "eas", "speed", "m/s", "equivalent airspeed", "EAS"),
    OutputInfo("tas", "tas", "speed", "m/s", "true airspeed", "TAS"),
    OutputInfo("sat", "sat", "temperature", "K", "static air temperature", "SAT"),
    OutputInfo("density", "rho", "density", "kg/m3", "air density"),
    OutputInfo("density_altitude", "hd", "length", "m", "density altitude"),
    OutputInfo("dynamic_pressure", "q", "pressure", "Pa", "dynamic pressure", "q"),
)


def check_noise_band(noise_band: float) -> None:
    """Refuse a noise band outside [0, 10000] Pa: a DomainError with the status the C port
    and the vectors give (NaN, infinite or negative: INVALID_INPUT; above: OUT_OF_RANGE).

    It is one setting for every element, so it is refused even with ``strict=False``.
    """
    st = Status(int(_NOISE.classify(np.atleast_1d(np.float64(noise_band)))[0]))
    if st != Status.OK:
        raise DomainError("noise_band", float(noise_band), None, _NOISE.describe(), st)


@fill_doc
def air_data(ps: ArrayLike, pt: ArrayLike, tat: ArrayLike, recovery: ArrayLike = 1.0,
             setting: ArrayLike | None = None, *, noise_band: float = NOISE_BAND,
             profile: Profile | str | None = None, strict: bool = True) -> AirData:
    """Run the whole air-data chain on static pressure, total pressure and TAT.

    Parameters
    ----------
    {ps}
    pt : float or array_like
        Total (pitot) pressure, Pa, > 0.  The impact pressure pt - ps must be
        >= -noise_band and must not exceed its value at Mach 10.
    {tat}
    recovery : float or array_like, optional
        Recovery factor of the TAT probe, in [0, 1]; default 1.
    setting : float or array_like, optional
        Altimeter setting, Pa, in [22632, 177687]; gives ``baro_altitude``.
    noise_band : float, optional
        Pa, in [0, 10000]; default 100.  A negative impact pressure no deeper than this
        is sensor noise of an aircraft at rest: it is read as zero (zero airspeed,
        Mach 0, SAT = TAT) and the sample's status is ``IMPACT_PRESSURE_ZEROED``.  A
        deeper one is refused as ``INVALID_INPUT``.
    {profile}
    strict : bool, optional
        Raise on the first bad sample (default) or give NaN outputs and an error status
        for just the bad samples.

    {broadcast}

    Returns
    -------
    AirData
        Every output and the status of each sample.

    Raises
    ------
    DomainError
        A bad or out-of-range input, a negative impact pressure beyond the noise band,
        a Mach number or CAS beyond 10 (a0), or a density outside the model; a
        ``noise_band`` outside [0, 10000] Pa (NaN or negative: INVALID_INPUT, above:
        OUT_OF_RANGE), also with ``strict=False``, since it is one setting for every
        element.

    Notes
    -----
    CHN-1, the order an air-data computer runs: qc = pt - ps; H = ALT-1(ps);
    M = PIT-2(qc/ps); CAS = a0 PIT-2(qc/p0); SAT = TMP-1(TAT, M); TAS = SPD-3;
    EAS = SPD-2; rho = ps/(R SAT); density altitude ALT-4; q = SPD-4.

    References
    ----------
    NACA Report 1135 (1953); ICAO Doc 7488/3 (1993).

    Examples
    --------
    >>> out = air_data(101325.0, 101325.0 + 3000.0, 288.15)
    >>> round(out.cas, 3) == round(out.eas, 3)
    True
    """
    prof = get_profile(profile)
    check_noise_band(noise_band)
    named = {
        "ps": (ps, dom.pressure(prof)),
        "pt": (pt, _TOTAL_PRESSURE),
        "tat": (tat, dom.TEMPERATURE),
        "recovery": (recovery, dom.RECOVERY),
    }
    if setting is not None:
        named["setting"] = (setting, dom.setting(prof))
    args = Inputs(strict, **named)
    t = layer_table(prof)
    p = args["ps"]

    qc = args["pt"] - p
    args.flag(qc < -noise_band, Status.INVALID_INPUT, "qc = pt - ps", qc,
              f">= -{noise_band!r} Pa (noise band)")
    zeroed = (qc < 0.0) & ~args.bad if args.any_bad else qc < 0.0
    qc = np.maximum(qc, 0.0)
    x = qc / p
    args.flag_above(x, RATIO_LIMIT, "qc/ps", f"[0, {RATIO_MAX!r}] (Mach <= 10)")
    x0 = qc / prof.p0
    args.flag_above(x0, RATIO_LIMIT, "qc/p0", f"[0, {RATIO_MAX!r}] (CAS <= 10 a0)")
    if args.any_bad:
        x = np.where(args.bad, 0.0, x)
        x0 = np.where(args.bad, 0.0, x0)

    mach = mach_from_ratio(x)
    cas = prof.a0 * mach_from_ratio(x0)
    m2 = mach * mach
    sat = args["tat"] / (1.0 + 0.2 * args["recovery"] * m2)
    tas = mach * np.sqrt((GAMMA * prof.R) * sat)
    eas = prof.a0 * mach * np.sqrt(p / prof.p0)
    rho = p / (prof.R * sat)
    rho_lo, rho_hi = density_range(prof)
    args.flag((rho < rho_lo) | (rho > rho_hi), Status.OUT_OF_RANGE, "density ps/(R sat)", rho,
              f"[{rho_lo!r}, {rho_hi!r}] kg/m3")
    if args.any_bad:
        bad = args.bad
        dens_alt = altitude_of_density(np.where(bad, prof.p0, p), np.where(bad, prof.T0, sat),
                                       np.where(bad, prof.rho0, rho), t)
    else:
        dens_alt = altitude_of_density(p, sat, rho, t)
    h = altitude_of_pressure(p, t)
    baro = None
    if setting is not None:
        baro = args.finish(h - altitude_of_pressure(args["setting"], t))

    status = np.where(zeroed, np.int8(Status.IMPACT_PRESSURE_ZEROED),
                      np.int8(Status.OK)).astype(np.int8)
    if args.any_bad:
        status = np.where(args.bad, args.status, status).astype(np.int8)
    return AirData(
        pressure_altitude=args.finish(h),
        baro_altitude=baro,
        impact_pressure=args.finish(qc),
        mach=args.finish(mach),
        cas=args.finish(cas),
        eas=args.finish(eas),
        tas=args.finish(tas),
        sat=args.finish(sat),
        density=args.finish(rho),
        density_altitude=args.finish(dens_alt),
        dynamic_pressure=args.finish((0.5 * GAMMA) * p * m2),
        status=int(status[0]) if args.scalar else status,
        profile=prof.name,
    )
