"""Valid ranges of the arguments, in one place (see docs/equations.md, "Domains").

Ranges that depend on the constants profile are built from it; the others are fixed.
"""

from __future__ import annotations

from functools import cache

import numpy as np

from ._inputs import Domain
from .profiles import Profile

__all__ = [
    "DERIVED_SLACK", "derived_limit", "MACH_MAX", "MACH", "SPEED", "TEMPERATURE", "DELTA_T",
    "RECOVERY", "IMPACT_PRESSURE",
    "ELEVATION", "altitude", "pressure", "geometric", "setting", "setting_altitude",
]

#: Highest Mach number of every airspeed function (input or derived).
MACH_MAX = 10.0

#: Relative slack of the checks on *derived* quantities (a Mach number or pressure
#: ratio computed from the inputs): 8 units of binary64 roundoff, so that the exact end
#: of a range reached through a rounded conversion (for example
#: mach_from_tas(tas_from_mach(10, sat), sat)) is not refused.  Inputs themselves are
#: checked against their ranges exactly.
DERIVED_SLACK = 8.0 * 2.0**-52


def derived_limit(hi: float) -> float:
    """The upper limit ``hi`` of a derived quantity widened by ``DERIVED_SLACK``."""
    return hi * (1.0 + DERIVED_SLACK)

MACH = Domain(0.0, MACH_MAX, "", "nonnegative", 0.5)
#: Calibrated, equivalent and true airspeed.
SPEED = Domain(0.0, 4000.0, "m/s", "nonnegative", 100.0)
#: Static and total air temperature.
TEMPERATURE = Domain(50.0, 5000.0, "K", "positive", 288.15)
#: Off-standard temperature deviation.
DELTA_T = Domain(-100.0, 100.0, "K", "any", 0.0)
#: Temperature recovery factor of a total-air-temperature probe.
RECOVERY = Domain(0.0, 1.0, "", "nonnegative", 1.0)
#: Impact pressure pt - ps (the derived Mach number is checked separately).
IMPACT_PRESSURE = Domain(0.0, 1.0e8, "Pa", "nonnegative", 1000.0)
#: Station elevation (geopotential) for an altimeter setting: the troposphere.
ELEVATION = Domain(-5000.0, 11000.0, "m", "any", 0.0)


@cache
def altitude(profile: Profile) -> Domain:
    """Geopotential altitude, the whole layer model."""
    return Domain(profile.h_min, profile.h_max, "m", "any", 0.0)


@cache
def geometric(profile: Profile) -> Domain:
    """Geometric altitude matching the geopotential range."""
    r0 = profile.r0
    return Domain(r0 * profile.h_min / (r0 - profile.h_min),
                  r0 * profile.h_max / (r0 - profile.h_max), "m", "any", 0.0)


@cache
def pressure(profile: Profile) -> Domain:
    """Static pressure between the top and the bottom of the layer model.

    The ends are the correctly rounded pressures at h_max and h_min, widened where the
    binary64 kernel of ATM-3 rounds them outward, so that every valid altitude maps to
    a valid pressure.
    """
    from ._layers import layer_of_altitude, layer_table, standard_pressure

    t = layer_table(profile)
    h = np.array([profile.h_max, profile.h_min])
    p = standard_pressure(h, layer_of_altitude(h, t), t)
    return Domain(min(profile.p_min, float(p[0])), max(profile.p_max, float(p[1])), "Pa",
                  "positive", profile.p0)


@cache
def setting_altitude(profile: Profile) -> Domain:
    """Pressure altitude of an altimeter setting, H(ps) - elevation: [-5000, 11000] m
    widened by DERIVED_SLACK (8 eps relative) at both ends.

    H(ps) rounds: a station whose exact setting altitude lies a fraction of an ulp beyond
    an end computed inside it, and one exactly inside computed beyond; without the slack
    such statuses were decided by the last bit of binary64 (13 of 59 cases near an end
    disagreed with exact arithmetic, measured in tests/test_vectors_oracle.py, and an x87
    build decided two of them the other way).
    """
    return Domain(profile.h_min * (1.0 + DERIVED_SLACK),
                  profile.layer_base[1] * (1.0 + DERIVED_SLACK), "m", "any", 0.0)


@cache
def setting(profile: Profile) -> Domain:
    """Altimeter setting: a pressure altitude within the troposphere layer.

    The ends, the pressures at 11 000 m and -5 000 m, are widened by DERIVED_SLACK (8 eps
    relative, as the other derived limits): ALT-4 evaluates the setting in closed form, and
    a setting computed for pressure_altitude(ps) - elevation exactly at an end lies up to
    4.4 eps beyond it (measured over 3.6e6 station pressures and elevations, both
    profiles); without the slack baro_corrected_altitude refused such a setting.
    """
    return Domain(profile.base_pressure[1] * (1.0 - DERIVED_SLACK),
                  profile.p_max * (1.0 + DERIVED_SLACK),
                  "Pa", "positive", profile.p0)
