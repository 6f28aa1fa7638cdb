"""The standard atmosphere: seven-layer temperature profile, hydrostatic pressure,
density, speed of sound and viscosity; geopotential and geometric altitude.

Equations ATM-1 .. ATM-8 of docs/equations.md.  Sources: ICAO Doc 7488/3 (1993);
U.S. Standard Atmosphere 1976 (NOAA-S/T 76-1562), sections 1.2-1.3.
"""

from __future__ import annotations

from dataclasses import dataclass
from decimal import Decimal
from functools import cache
from typing import NamedTuple

import numpy as np
from numpy.typing import NDArray

from . import _dd as dd
from . import _domains as dom
from ._blocks import elementwise
from ._inputs import ArrayLike, FloatOrArray, Inputs
from .profiles import GAMMA, Profile, get_profile

__all__ = ["Atmosphere", "atmosphere", "geopotential_altitude", "geometric_altitude"]

F64 = NDArray[np.float64]


class LayerTable(NamedTuple):
    """Per-layer constants of one profile as arrays indexed by layer number (0..6).

    ``m = L/Tb`` and ``k = g0/(R L)`` for gradient layers (``k = 0`` in isothermal
    layers); ``c = g0/(R Tb)`` for isothermal layers (``c = 0`` in gradient layers);
    ``n = -R L/g0`` (exponent of the inverse); ``sh = -R Tb/g0`` (inverse isothermal
    scale); ``rho_b`` base densities; ``kd = -R L/(g0 + R L)`` (density inverse);
    ``pb_lo`` the low parts of the base pressures as double-doubles (pb + pb_lo is the
    base pressure to about 1e-32 relative); ``m_div`` is m in gradient layers and 1 in
    isothermal ones, ``sh_iso`` is sh in isothermal layers and 0 in gradient ones, so the
    inverse kernels need no branch: hb + (expm1(n lr)/m_div + sh_iso lr), where the term
    of the other layer kind is an exact zero.
    """

    hb: F64
    lapse: F64
    tb: F64
    pb: F64
    gradient: NDArray[np.bool_]
    m: F64
    k: F64
    c: F64
    n: F64
    sh: F64
    rho_b: F64
    kd: F64
    pb_lo: F64
    m_div: F64
    sh_iso: F64


@cache
def layer_table(profile: Profile) -> LayerTable:
    """Per-layer constants of ``profile``, derived once."""
    g0, r = profile.g0, profile.R
    hb = np.array(profile.layer_base)
    lapse = np.array(profile.lapse_rate)
    tb = np.array(profile.base_temperature)
    pb = np.array(profile.base_pressure)
    grad = lapse != 0.0
    safe_l = np.where(grad, lapse, 1.0)
    m = np.where(grad, lapse / tb, 0.0)
    k = np.where(grad, g0 / (r * safe_l), 0.0)
    c = np.where(grad, 0.0, g0 / (r * tb))
    n = np.where(grad, -(r * lapse) / g0, 0.0)
    sh = -(r * tb) / g0
    rho_b = pb / (r * tb)
    kd = np.where(grad, -(r * lapse) / (g0 + r * lapse), 0.0)
    pb_lo = np.array([float(p - Decimal(float(p))) for p in profile.exact("base_pressure")])
    m_div = np.where(grad, m, 1.0)
    sh_iso = np.where(grad, 0.0, sh)
    tables = (hb, lapse, tb, pb, grad, m, k, c, n, sh, rho_b, kd, pb_lo, m_div, sh_iso)
    for a in tables:
        a.setflags(write=False)
    return LayerTable(*tables)


def count_bases(mask_of_base: list[NDArray[np.bool_]]) -> NDArray[np.intp]:
    """Layer index as the number of layer bases (above the first) an element has passed.

    Six comparisons and byte-wide additions: ten times cheaper than a binary search
    (``np.searchsorted``) over seven bases, and the same index.
    """
    i = mask_of_base[0].view(np.uint8).copy()
    for m in mask_of_base[1:]:
        i += m.view(np.uint8)
    return i.astype(np.intp)


def layer_of_altitude(h: F64, t: LayerTable) -> NDArray[np.intp]:
    """ATM-1: layer i holds hb[i] <= h < hb[i+1]; layer 0 extends below sea level."""
    return count_bases([h >= b for b in t.hb[1:]])


def standard_temperature(h: F64, i: NDArray[np.intp], t: LayerTable) -> F64:
    """ATM-2: T = Tb + L (h - hb)."""
    return t.tb[i] + t.lapse[i] * (h - t.hb[i])


@elementwise(2)
def pressure_dd(h: F64, i: NDArray[np.intp], t: LayerTable) -> tuple[F64, F64]:
    """ATM-3 kernel as a double-double: p = (pb + pb_lo) exp(e).

    e = -(k log1p(m dh) + c dh) covers both branches: in a gradient layer ``c = 0`` and
    in an isothermal one ``k = m = 0``, so the unused term adds an exact zero.  The
    product with the double-double base pressure leaves one rounding (of exp) besides
    the final one.
    """
    dh = h - t.hb[i]
    e = np.exp(-(t.k[i] * np.log1p(t.m[i] * dh) + t.c[i] * dh))
    return dd.mul((t.pb[i], t.pb_lo[i]), (e, np.zeros_like(e)))


def standard_pressure(h: F64, i: NDArray[np.intp], t: LayerTable) -> F64:
    """ATM-3: the standard pressure at geopotential altitude h in layer i, Pa."""
    return pressure_dd(h, i, t)[0]


class DDTables(NamedTuple):
    """Double-double per-layer constants (hi, lo pairs) and scalar constants."""

    tb: tuple[F64, F64]
    lapse: tuple[F64, F64]
    beta: tuple[float, float]
    r_gas: tuple[float, float]


@cache
def dd_tables(prof: Profile) -> DDTables:
    """The double-double constants of ``prof``; every hi part equals the binary64 value."""
    def pairs(values: tuple[Decimal, ...]) -> tuple[F64, F64]:
        both = [dd.const(v) for v in values]
        return np.array([h for h, _ in both]), np.array([lo for _, lo in both])

    return DDTables(pairs(prof.exact("base_temperature")), pairs(prof.exact("lapse_rate")),
                    dd.const(prof.exact("beta")), dd.const(prof.exact("R")))


@elementwise(3)
def state_dd(h: F64, dT: F64, i: NDArray[np.intp], t: LayerTable,
             prof: Profile) -> tuple[F64, F64, F64, F64, F64]:
    """ATM-2..ATM-6 kernel in double-double: T, p, rho, mu, nu.

    T = Tb + L (h - hb) + dT and rho = p/(R T), mu = beta T sqrt(T)/(T + S),
    nu = mu R T/p are evaluated in double-double arithmetic (:mod:`airdata._dd`) from
    double-double constants, and p from :func:`pressure_dd`, so each output is rounded
    about once.  In plain binary64 the
    rounded T, amplified 1.8 times in nu, and five to seven roundings would reach a
    condition-scaled error near 3 where the condition scale is smallest (near sea
    level).  h - hb is exact (Sterbenz: every layer spans less than a factor 2 in h).
    """
    c = dd_tables(prof)
    zero = np.zeros_like(h)
    dh = h - t.hb[i]
    temp = dd.add(dd.add((c.tb[0][i], c.tb[1][i]),
                         dd.mul((c.lapse[0][i], c.lapse[1][i]), (dh, zero))), (dT, zero))
    p = pressure_dd(h, i, t)
    r_gas = (np.full_like(h, c.r_gas[0]), np.full_like(h, c.r_gas[1]))
    rho = dd.div(p, dd.mul(r_gas, temp))
    beta = (np.full_like(h, c.beta[0]), np.full_like(h, c.beta[1]))
    mu = dd.div(dd.mul(dd.mul(beta, temp), dd.sqrt_dd(temp)),
                dd.add(temp, (np.full_like(h, prof.sutherland_s), zero)))
    nu = dd.div(dd.mul(dd.mul(mu, r_gas), temp), p)
    return temp[0], p[0], rho[0], mu[0], nu[0]


@dataclass(frozen=True)
class Atmosphere:
    """State of the atmosphere at one or more altitudes (SI units).

    Attributes
    ----------
    temperature : float or ndarray
        Static air temperature, K.
    pressure : float or ndarray
        Static pressure, Pa.
    density : float or ndarray
        Density, kg/m3.
    speed_of_sound : float or ndarray
        m/s.
    dynamic_viscosity : float or ndarray
        Pa s (Sutherland's law).
    kinematic_viscosity : float or ndarray
        m2/s.
    profile : str
        Name of the constants profile used.
    """

    temperature: FloatOrArray
    pressure: FloatOrArray
    density: FloatOrArray
    speed_of_sound: FloatOrArray
    dynamic_viscosity: FloatOrArray
    kinematic_viscosity: FloatOrArray
    profile: str


def atmosphere(
    h: ArrayLike,
    dT: ArrayLike = 0.0,
    *,
    profile: Profile | str | None = None,
    strict: bool = True,
) -> Atmosphere:
    """Standard atmosphere at geopotential altitude ``h``, optionally off-standard.

    Parameters
    ----------
    h : float or array_like
        Geopotential altitude, m, in [-5000, 84852].
    dT : float or array_like, optional
        Temperature deviation of an off-standard day, K, in [-100, 100].  The
        pressure is that of the standard day at ``h``; temperature and everything
        derived from it (density, speed of sound, viscosities) are shifted.
    profile : Profile or str, optional
        Constants profile, ``"icao"`` (default) or ``"us1976"``.
    strict : bool, optional
        If true (default) raise :class:`DomainError` on the first bad element; if
        false give NaN outputs for just the bad elements.

    Inputs broadcast against each other like a numpy ufunc; scalar inputs give Python
    floats.

    Returns
    -------
    Atmosphere
        Temperature, pressure, density, speed of sound, dynamic and kinematic
        viscosity, and the profile name.

    Raises
    ------
    DomainError
        ``h`` or ``dT`` NaN, infinite or out of range (``strict=True``).

    Notes
    -----
    Equations ATM-2 to ATM-6: T = Tb + L (h - hb) + dT; p from the hydrostatic
    equation in closed form per layer; rho = p/(R T); a = sqrt(gamma R T);
    mu = beta T^1.5/(T + S); nu = mu/rho.  T is the molecular-scale temperature of
    the layer model; above 80 km the U.S. Standard Atmosphere 1976 tables print the
    kinetic temperature, which is lower by the molecular-weight ratio (186.87 K
    against 186.946 K at the top), and its viscosity column uses the kinetic value.

    References
    ----------
    ICAO Doc 7488/3 (1993); U.S. Standard Atmosphere 1976, NOAA-S/T 76-1562.

    Examples
    --------
    >>> round(atmosphere(11000.0).temperature, 2)
    216.65
    """
    prof = get_profile(profile)
    args = Inputs(strict, h=(h, dom.altitude(prof)), dT=(dT, dom.DELTA_T))
    t = layer_table(prof)
    hh = args["h"]
    i = layer_of_altitude(hh, t)
    temp, p, rho, mu, nu = state_dd(hh, args["dT"], i, t, prof)
    a = np.sqrt((GAMMA * prof.R) * temp)
    return Atmosphere(
        temperature=args.finish(temp),
        pressure=args.finish(p),
        density=args.finish(rho),
        speed_of_sound=args.finish(a),
        dynamic_viscosity=args.finish(mu),
        kinematic_viscosity=args.finish(nu),
        profile=prof.name,
    )


def geopotential_altitude(
    z: ArrayLike, *, profile: Profile | str | None = None, strict: bool = True
) -> FloatOrArray:
    """Geopotential altitude from geometric altitude, ATM-7: h = r0 z/(r0 + z).

    Parameters
    ----------
    z : float or array_like
        Geometric altitude, m, in [-4996.07, 86000.00] (the image of the model's
        geopotential range).
    profile : Profile or str, optional
        Constants profile (supplies r0 = 6 356 766 m).
    strict : bool, optional
        Raise on bad input (default) or give NaN for just those elements.

    Inputs broadcast against each other like a numpy ufunc; scalar inputs give Python
    floats.

    Returns
    -------
    float or ndarray
        Geopotential altitude, m.

    Raises
    ------
    DomainError
        ``z`` NaN, infinite or out of range.

    References
    ----------
    U.S. Standard Atmosphere 1976, eq. 18.
    """
    prof = get_profile(profile)
    args = Inputs(strict, z=(z, dom.geometric(prof)))
    zz = args["z"]
    return args.finish(prof.r0 * zz / (prof.r0 + zz))


def geometric_altitude(
    h: ArrayLike, *, profile: Profile | str | None = None, strict: bool = True
) -> FloatOrArray:
    """Geometric altitude from geopotential altitude, ATM-8: z = r0 h/(r0 - h).

    Parameters
    ----------
    h : float or array_like
        Geopotential altitude, m, in [-5000, 84852].
    profile : Profile or str, optional
        Constants profile (supplies r0 = 6 356 766 m).
    strict : bool, optional
        Raise on bad input (default) or give NaN for just those elements.

    Inputs broadcast against each other like a numpy ufunc; scalar inputs give Python
    floats.

    Returns
    -------
    float or ndarray
        Geometric altitude, m.

    Raises
    ------
    DomainError
        ``h`` NaN, infinite or out of range.

    References
    ----------
    U.S. Standard Atmosphere 1976, eq. 18 solved for z.
    """
    prof = get_profile(profile)
    args = Inputs(strict, h=(h, dom.altitude(prof)))
    hh = args["h"]
    return args.finish(prof.r0 * hh / (prof.r0 - hh))
