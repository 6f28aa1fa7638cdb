"""The standard atmosphere: seven-layer temperature profile, hydrostatic pressure,
density, speed of sound and viscosity; geopotential and geometric altitude.

Equations ATM-1 .. ATM-8 of docs/equations.md.  Sources: ICAO Doc 7488/3 (1993);
U.S. Standard Atmosphere 1976 (NOAA-S/T 76-1562), sections 1.2-1.3.
"""

from __future__ import annotations

from dataclasses import dataclass

import numpy as np
from numpy.typing import NDArray

from . import _domains as dom
from ._docs import fill_doc
from ._inputs import ArrayLike, FloatOrArray, Inputs
from ._layers import layer_of_altitude, layer_table, state_dd
from .profiles import GAMMA, Profile, get_profile

__all__ = ["Atmosphere", "atmosphere", "geopotential_altitude", "geometric_altitude"]

F64 = NDArray[np.float64]


@fill_doc
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
    {profile_name}
    """

    temperature: FloatOrArray
    pressure: FloatOrArray
    density: FloatOrArray
    speed_of_sound: FloatOrArray
    dynamic_viscosity: FloatOrArray
    kinematic_viscosity: FloatOrArray
    profile: str


@fill_doc
def atmosphere(h: ArrayLike, dT: ArrayLike = 0.0, *, profile: Profile | str | None = None,
               strict: bool = True) -> Atmosphere:
    """Standard atmosphere at geopotential altitude ``h``, optionally off-standard.

    Parameters
    ----------
    {h}
    dT : float or array_like, optional
        Temperature deviation of an off-standard day, K, in [-100, 100].  The
        pressure is that of the standard day at ``h``; temperature and everything
        derived from it (density, speed of sound, viscosities) are shifted.
    {profile}
    strict : bool, optional
        If true (default) raise :class:`DomainError` on the first bad element; if
        false give NaN outputs for just the bad elements.

    {broadcast}

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


@fill_doc
def geopotential_altitude(z: ArrayLike, *, profile: Profile | str | None = None,
                          strict: bool = True) -> FloatOrArray:
    """Geopotential altitude from geometric altitude, ATM-7: h = r0 z/(r0 + z).

    Parameters
    ----------
    z : float or array_like
        Geometric altitude, m, in [-4996.07, 86000.00] (the image of the model's
        geopotential range).
    {profile_r0, strict}

    {broadcast}

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


@fill_doc
def geometric_altitude(h: ArrayLike, *, profile: Profile | str | None = None,
                       strict: bool = True) -> FloatOrArray:
    """Geometric altitude from geopotential altitude, ATM-8: z = r0 h/(r0 - h).

    {Parameters: h, profile_r0, strict; broadcast}

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
