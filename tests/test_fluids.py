"""airdata's ``us1976`` profile against the ``fluids`` package's 1976 standard atmosphere.

``fluids.ATMOSPHERE_1976(Z, dT)`` (a general-purpose reference library from the package
registry) implements the U.S. Standard Atmosphere 1976 (NOAA-S/T 76-1562) below 86 km
with geometric altitude ``Z`` in m as input.  It converts ``Z`` to geopotential altitude
with H = r0 Z/(r0 + Z), r0 = 6 356 766 m, and uses the same defining constants as the
``us1976`` profile: g0 = 9.80665 m/s2, R* = 8314.32 J/(kmol K), M0 = 28.9644 kg/kmol,
the seven-layer lapse rates, Sutherland's beta = 1.458e-6 and S = 110.4 K, gamma = 1.4.

Where the two differ, and what that allows (eps = 2**-52):

* fluids types in its layer base pressures to 16-17 digits; they agree with the
  40-digit values airdata derives at import to within 1.8e-15 relative.
* fluids evaluates gradient layers as pb (Tb/T)**(g0 M0/(R* L)).  The exponent reaches
  34.16 (L = 1 K/km, 20-32 km), so the about 1.5 eps of rounding in the ratio Tb/T
  becomes about 34 x 1.5 eps = 1.1e-14 at worst, 3.9e-15 in this sweep (at
  Z = 26.66 km; there airdata is within 1e-16 of a 40-digit evaluation of the same
  equations and fluids is 3.8e-15 off, so the spread is fluids' rounding).
* Temperature, speed of sound and viscosity go through the same few operations on
  both sides: within 1-2 ulp.

Hence the relative tolerances below: 1e-14 for pressure and for everything derived
from it (density, kinematic viscosity), 4 eps for temperature, speed of sound and
dynamic viscosity.
"""

from __future__ import annotations

import numpy as np
import pytest
from fluids import ATMOSPHERE_1976
from numpy.typing import NDArray

import airdata

F64 = NDArray[np.float64]

PROFILE = "us1976"
EPS = 2.0**-52

#: fluids' pressure: its typed-in base pressures (1.8e-15) plus the Tb/T rounding
#: amplified by an exponent up to 34.2 (1.1e-14 at worst); see the module docstring.
RTOL_PRESSURE = 1.0e-14
#: Temperature, speed of sound, dynamic viscosity: the same few roundings on both sides.
RTOL_DIRECT = 4.0 * EPS

#: Specific gas constant of the 1976 standard, R*/M0 (U.S. Standard Atmosphere 1976,
#: from memory), for the local scale height R T/g0 of the inversion test.
R_1976 = 8314.32 / 28.9644
G0 = 9.80665


def _geometric_sweep() -> F64:
    """Geometric altitudes, m: 201 even steps from 0 to the model top (86 km geometric),
    every layer base, its binary64 neighbours either side, and two points below sea
    level (fluids documents its model as valid down to -610 m)."""
    prof = airdata.US1976
    z_top = float(airdata.geometric_altitude(prof.h_max, profile=PROFILE))
    bases = np.asarray(airdata.geometric_altitude(np.array(prof.layer_base), profile=PROFILE))
    z = np.concatenate([
        np.linspace(0.0, z_top, 201),
        bases,
        np.nextafter(bases, -np.inf),
        np.nextafter(bases, np.inf),
        [-600.0, -300.0],
    ])
    return np.unique(z[z <= z_top])


Z = _geometric_sweep()


def _fluids(z: F64, dT: float) -> dict[str, F64]:
    """fluids' 1976 atmosphere at each geometric altitude, as arrays."""
    states = [ATMOSPHERE_1976(float(zi), dT) for zi in z]
    out = {
        name: np.array([getattr(s, name) for s in states])
        for name in ("H", "T", "P", "rho", "v_sonic", "mu")
    }
    out["nu"] = out["mu"] / out["rho"]
    return out


def test_sweep_covers_every_layer_and_the_whole_range() -> None:
    """The sweep is what the module says: 0-86 km, all seven layers, dense."""
    h = np.asarray(airdata.geopotential_altitude(Z, profile=PROFILE))
    assert Z.size >= 220
    assert Z.min() < 0.0 and Z.max() > 85_999.0
    layers = np.searchsorted(np.array(airdata.US1976.layer_base), h, side="right") - 1
    assert set(layers[h > 0]) == set(range(7))


def test_geopotential_altitude_matches_fluids() -> None:
    """U.S. Standard Atmosphere 1976 eq. 18 on both sides (fluids' ``H`` attribute)."""
    ref = _fluids(Z, 0.0)
    h = airdata.geopotential_altitude(Z, profile=PROFILE)
    np.testing.assert_allclose(h, ref["H"], rtol=2.0 * EPS, atol=1e-300)


@pytest.mark.parametrize("dT", [0.0, -30.0, 25.0])
def test_atmosphere_matches_fluids(dT: float) -> None:
    """fluids.ATMOSPHERE_1976 (reference library): T, p, rho, a, mu, nu over 0-86 km.

    ``dT`` has the same meaning on both sides: the pressure is the standard day's and
    the temperature is shifted by ``dT``, with everything derived from it.
    """
    ref = _fluids(Z, dT)
    h = airdata.geopotential_altitude(Z, profile=PROFILE)
    got = airdata.atmosphere(h, dT, profile=PROFILE)
    assert got.profile == PROFILE
    checks = [
        ("temperature", got.temperature, ref["T"], RTOL_DIRECT),
        ("pressure", got.pressure, ref["P"], RTOL_PRESSURE),
        ("density", got.density, ref["rho"], RTOL_PRESSURE),
        ("speed_of_sound", got.speed_of_sound, ref["v_sonic"], RTOL_DIRECT),
        ("dynamic_viscosity", got.dynamic_viscosity, ref["mu"], RTOL_DIRECT),
        ("kinematic_viscosity", got.kinematic_viscosity, ref["nu"], RTOL_PRESSURE),
    ]
    for name, ours, theirs, rtol in checks:
        rel = np.abs(np.asarray(ours) - theirs) / np.abs(theirs)
        worst = int(np.argmax(rel))
        assert rel[worst] <= rtol, (
            f"{name}: relative difference {rel[worst]:.3g} > {rtol:.3g} "
            f"at Z = {Z[worst]!r} m (ours {np.asarray(ours)[worst]!r}, "
            f"fluids {theirs[worst]!r})"
        )


def test_pressure_at_altitude_matches_fluids() -> None:
    """fluids.ATMOSPHERE_1976 pressure through the altimetry entry point too."""
    ref = _fluids(Z, 0.0)
    p = airdata.pressure_at_altitude(ref["H"], profile=PROFILE)
    np.testing.assert_allclose(p, ref["P"], rtol=RTOL_PRESSURE, atol=0.0)


def test_pressure_altitude_inverts_fluids_pressure() -> None:
    """pressure_altitude(fluids' p) gives fluids' geopotential altitude.

    A relative pressure error dp/p moves the altitude by H_s dp/p, with H_s = R T/g0
    the local scale height (at most about 8.6 km here).  So the bound is
    H_s * RTOL_PRESSURE (fluids' own pressure error) plus 4 ulp of the altitude for
    the inversion's own rounding.  Measured worst: 2.5e-11 m at Z = 26.66 km.
    """
    ref = _fluids(Z, 0.0)
    h = np.asarray(airdata.pressure_altitude(ref["P"], profile=PROFILE))
    scale_height = R_1976 * ref["T"] / G0
    bound = scale_height * RTOL_PRESSURE + 4.0 * np.spacing(np.maximum(np.abs(ref["H"]), 1.0))
    err = np.abs(h - ref["H"])
    worst = int(np.argmax(err / bound))
    assert np.all(err <= bound), (
        f"altitude off by {err[worst]:.3g} m > {bound[worst]:.3g} m at Z = {Z[worst]!r} m"
    )
