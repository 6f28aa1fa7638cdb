"""Altimetry: pressure altitude, its inverse, baro-corrected altitude, altimeter
setting and density altitude.

Equations ALT-1 .. ALT-5 of docs/equations.md.
"""

from __future__ import annotations

from functools import cache

import numpy as np
from numpy.typing import NDArray

from . import _domains as dom
from ._blocks import elementwise
from ._docs import fill_doc
from ._inputs import ArrayLike, FloatOrArray, Inputs
from ._layers import (
    LayerTable,
    count_bases,
    layer_of_altitude,
    layer_table,
    standard_pressure,
    standard_temperature,
)
from .profiles import Profile, get_profile
from .status import Status

__all__ = [
    "pressure_altitude",
    "pressure_at_altitude",
    "baro_corrected_altitude",
    "altimeter_setting",
    "density_altitude",
]

F64 = NDArray[np.float64]


def layer_of_ratio(x: F64, base: F64) -> NDArray[np.intp]:
    """Layer index for a quantity decreasing with altitude (pressure or density).

    ``base`` holds the quantity at each layer base, decreasing.  Layer i holds
    ``base[i+1] < x <= base[i]``; layer 0 extends below sea level, the top layer up.
    """
    return count_bases([x <= b for b in base[1:]])


@elementwise(1)
def altitude_of_pressure(p: F64, t: LayerTable) -> F64:
    """ALT-1 kernel: geopotential altitude of pressure ``p`` (already in range).

    Gradient layer: h = hb + expm1(n ln(p/pb)) / m, with n = -R L/g0, m = L/Tb.
    Isothermal layer: h = hb + sh ln(p/pb), with sh = -R Tb/g0.
    """
    i = layer_of_ratio(p, t.pb)
    lr = np.log(p / t.pb[i])
    return t.hb[i] + (np.expm1(t.n[i] * lr) / t.m_div[i] + t.sh_iso[i] * lr)


@fill_doc
def pressure_altitude(ps: ArrayLike, *, profile: Profile | str | None = None,
                      strict: bool = True) -> FloatOrArray:
    """Pressure altitude: the standard-atmosphere altitude at which the pressure is ``ps``.

    Parameters
    ----------
    ps : float or array_like
        Static pressure, Pa, in [p(84852 m), p(-5000 m)] = [0.3734, 177687] Pa (icao).
    {profile, strict}

    {broadcast}

    Returns
    -------
    float or ndarray
        Geopotential pressure altitude, m.

    Raises
    ------
    DomainError
        ``ps`` NaN, infinite, not positive (invalid) or outside the model (out of range).

    Notes
    -----
    ALT-1, the closed-form inverse of ATM-3 in every layer; exact inverse of
    :func:`pressure_at_altitude` up to rounding.

    References
    ----------
    ICAO Doc 7488/3 (1993); U.S. Standard Atmosphere 1976, eq. 33a/33b.

    Examples
    --------
    >>> pressure_altitude(101325.0)
    0.0
    """
    prof = get_profile(profile)
    args = Inputs(strict, ps=(ps, dom.pressure(prof)))
    return args.finish(altitude_of_pressure(args["ps"], layer_table(prof)))


@fill_doc
def pressure_at_altitude(h: ArrayLike, *, profile: Profile | str | None = None,
                         strict: bool = True) -> FloatOrArray:
    """Standard static pressure at pressure altitude ``h``.

    Parameters
    ----------
    h : float or array_like
        Geopotential pressure altitude, m, in [-5000, 84852].
    {profile, strict}

    {broadcast}

    Returns
    -------
    float or ndarray
        Static pressure, Pa.

    Raises
    ------
    DomainError
        ``h`` NaN, infinite or outside [-5000, 84852] m.

    Notes
    -----
    ATM-3; the same values as ``atmosphere(h).pressure``.

    References
    ----------
    ICAO Doc 7488/3 (1993); U.S. Standard Atmosphere 1976, eq. 33a/33b.
    """
    prof = get_profile(profile)
    args = Inputs(strict, h=(h, dom.altitude(prof)))
    t = layer_table(prof)
    hh = args["h"]
    return args.finish(standard_pressure(hh, layer_of_altitude(hh, t), t))


@fill_doc
def baro_corrected_altitude(ps: ArrayLike, setting: ArrayLike, *,
                            profile: Profile | str | None = None,
                            strict: bool = True) -> FloatOrArray:
    """Altitude shown by an altimeter set to ``setting``: H(ps) - H(setting).

    Parameters
    ----------
    {ps}
    setting : float or array_like
        Altimeter setting (QNH), Pa, in [p(11000 m), p(-5000 m)] = [22632, 177687] Pa.
    {profile, strict}

    {broadcast}

    Returns
    -------
    float or ndarray
        Baro-corrected altitude, m (geopotential).

    Raises
    ------
    DomainError
        ``ps`` or ``setting`` NaN, infinite, not positive or out of range.

    Notes
    -----
    ALT-2.  With ``setting`` = 101325 Pa this is the pressure altitude.

    References
    ----------
    ICAO Doc 8168 (PANS-OPS), altimeter setting procedures (from memory).
    """
    prof = get_profile(profile)
    args = Inputs(strict, ps=(ps, dom.pressure(prof)), setting=(setting, dom.setting(prof)))
    t = layer_table(prof)
    return args.finish(altitude_of_pressure(args["ps"], t)
                       - altitude_of_pressure(args["setting"], t))


@fill_doc
def altimeter_setting(ps: ArrayLike, elevation: ArrayLike, *, profile: Profile | str | None = None,
                      strict: bool = True) -> FloatOrArray:
    """Altimeter setting that makes an altimeter read ``elevation`` at static pressure ``ps``.

    The inverse of :func:`baro_corrected_altitude` in ``setting``.

    Parameters
    ----------
    ps : float or array_like
        Station static pressure, Pa, in [22632, 177687] Pa (troposphere layer).
    elevation : float or array_like
        Station elevation (geopotential), m, in [-5000, 11000].  The pressure altitude
        of the resulting setting, H(ps) - elevation, must lie in [-5000, 11000] m.
    {profile, strict}

    {broadcast}

    Returns
    -------
    float or ndarray
        Altimeter setting (QNH), Pa.

    Raises
    ------
    DomainError
        ``ps`` or ``elevation`` bad or out of range, or H(ps) - elevation outside
        [-5000, 11000] m (out of range).

    Notes
    -----
    ALT-3: setting = ps (1 + (p0/ps)^n (L e / T0))^(1/n) with n = R L/g0 and
    L = 0.0065 K/m, the form of the U.S. National Weather Service altimeter-setting
    formula with this profile's constants, evaluated with log1p/exp.  The NWS
    publishes the formula with rounded constants (n = 0.190284, T0 = 288 K) and
    subtracts 0.3 hPa from the station pressure for the barometer's height; this
    function does neither, so it differs from an NWS-computed setting by up to about
    0.2 hPa at a high station.

    References
    ----------
    U.S. National Weather Service, "Altimeter setting" formula (from memory).
    """
    prof = get_profile(profile)
    args = Inputs(strict, ps=(ps, dom.setting(prof)), elevation=(elevation, dom.ELEVATION))
    t = layer_table(prof)
    p, e = args["ps"], args["elevation"]
    h_setting = altitude_of_pressure(p, t) - e
    ends = dom.setting_altitude(prof)
    out = (h_setting < ends.lo) | (h_setting > ends.hi)
    args.flag(out, Status.OUT_OF_RANGE, "pressure_altitude(ps) - elevation", h_setting,
              ends.describe())
    n = t.n[0]  # R L/g0 with the troposphere lapse rate taken positive, 0.0065 K/m
    x = np.exp(n * np.log(prof.p0 / p)) * (-t.m[0] * e)
    return args.finish(p * np.exp(np.log1p(x) / n))


@fill_doc
def density_altitude(ps: ArrayLike, sat: ArrayLike, *, profile: Profile | str | None = None,
                     strict: bool = True) -> FloatOrArray:
    """Density altitude: the standard-atmosphere altitude whose density is ps/(R sat).

    Parameters
    ----------
    {ps}
    sat : float or array_like
        Static air temperature, K, in [50, 5000].  The density ps/(R sat) must lie
        within the model, [rho(84852 m), rho(-5000 m)] widened by 8 eps relative
        (:func:`density_range`).
    {profile, strict}

    {broadcast}

    Returns
    -------
    float or ndarray
        Geopotential density altitude, m.

    Raises
    ------
    DomainError
        Bad ``ps`` or ``sat``, or a density outside the model (out of range).

    Notes
    -----
    ALT-4.  rho/rho_b = (ps/pb)(Tb/sat).  Gradient layer:
    h = hb + expm1(kd ln(rho/rho_b)) / m with kd = -R L/(g0 + R L); isothermal layer:
    h = hb + sh ln(rho/rho_b).

    References
    ----------
    Derived from ATM-2, ATM-3 and the gas law; U.S. Standard Atmosphere 1976.
    """
    prof = get_profile(profile)
    args = Inputs(strict, ps=(ps, dom.pressure(prof)), sat=(sat, dom.TEMPERATURE))
    t = layer_table(prof)
    p, temp = args["ps"], args["sat"]
    rho = p / (prof.R * temp)
    rho_lo, rho_hi = density_range(prof)
    args.flag((rho < rho_lo) | (rho > rho_hi), Status.OUT_OF_RANGE, "density ps/(R sat)",
              rho, f"[{rho_lo!r}, {rho_hi!r}] kg/m3")
    return args.finish(altitude_of_density(p, temp, rho, t))


@elementwise(3)
def altitude_of_density(p: F64, temp: F64, rho: F64, t: LayerTable) -> F64:
    """ALT-4 kernel: density altitude of (p, temp), whose density is ``rho``."""
    i = layer_of_ratio(rho, t.rho_b)
    lr = np.log((p / t.pb[i]) * (t.tb[i] / temp))
    return t.hb[i] + (np.expm1(t.kd[i] * lr) / t.m_div[i] + t.sh_iso[i] * lr)


@cache
def density_range(prof: Profile) -> tuple[float, float]:
    """Valid range of a derived density ps/(R sat), kg/m3 (derived once): the standard
    densities at the top and the bottom of the model, widened by DERIVED_SLACK (8 eps
    relative) as the other derived limits are.

    Without the slack the last bit of binary64 decided a case whose exact density lies a
    fraction of an ulp beyond an end (measured against the 50-digit oracle in
    tests/test_vectors_oracle.py; the C port's AD_RHO_MIN/AD_RHO_MAX are these values).
    """
    t = layer_table(prof)
    h = np.array([prof.h_max, prof.h_min])
    i = layer_of_altitude(h, t)
    rho = standard_pressure(h, i, t) / (prof.R * standard_temperature(h, i, t))
    return (float(rho[0]) * (1.0 - dom.DERIVED_SLACK),
            float(rho[1]) * (1.0 + dom.DERIVED_SLACK))
