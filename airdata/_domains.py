"""Valid ranges of the arguments, in one place (see docs/equations.md, "Domains").

Ranges that depend on the constants profile are built from it; the others are fixed.
"""

from __future__ import annotations

from collections.abc import Callable
from functools import cache

import numpy as np

from ._inputs import Domain
from .profiles import Profile

__all__ = [
    "DERIVED_SLACK", "derived_limit", "MACH_MAX", "MACH", "SPEED", "TEMPERATURE", "DELTA_T",
    "RECOVERY", "IMPACT_PRESSURE",
    "ELEVATION", "altitude", "pressure", "geometric", "setting", "setting_altitude",
    "NOISE_BAND", "TOTAL_PRESSURE", "NOISE", "WEIGHT", "WING_AREA", "CL_MAX", "LOAD_FACTOR",
    "CAS_LIMIT", "MACH_LIMIT", "SUBSONIC_MACH_LIMIT", "C_DOMAINS", "c_domain_id",
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

# The chain's own inputs (airdata.chain).
#: Default half-width of the band of negative impact pressure read as zero, Pa.
#: A choice of this project (about the resolution of a good pitot-static transducer;
#: common practice, no source): wider readings are a fault, not noise.
NOISE_BAND = 100.0
#: Total pressure: positive; its range follows from ps and the Mach 10 limit.
TOTAL_PRESSURE = Domain(0.0, 1.0e8, "Pa", "positive", 101325.0)
#: The noise band itself.
NOISE = Domain(0.0, 10000.0, "Pa", "nonnegative", NOISE_BAND)

# The limit functions' arguments (airdata.limits).  Upper bounds are generous choices of
# this project that catch unit slips (N vs kg, ft2 vs m2), not physical limits.
#: Aircraft weight, N (zero and negative weights are invalid).
WEIGHT = Domain(0.0, 1.0e7, "N", "positive", 1.0e5)
#: Reference wing area, m2.
WING_AREA = Domain(0.0, 2000.0, "m2", "positive", 50.0)
#: Maximum lift coefficient (CLmax <= 0 is invalid).
CL_MAX = Domain(0.0, 10.0, "", "positive", 1.5)
#: Load factor n = lift/weight (n <= 0 is invalid: no stall speed).
LOAD_FACTOR = Domain(0.0, 10.0, "", "positive", 1.0)
#: CAS limit, m/s; CAS <= 10 a0 is checked separately.
CAS_LIMIT = Domain(0.0, 4000.0, "m/s", "positive", 150.0)
#: Mach limit of the maximum operating speed functions.
MACH_LIMIT = Domain(0.0, MACH_MAX, "", "positive", 0.8)
#: Mach limit of a subsonic crossover: (0, 1); Mach 1 itself is refused separately.
SUBSONIC_MACH_LIMIT = Domain(0.0, 1.0, "", "positive", 0.8)


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


#: Every argument domain of the C port, in the order of its ``ad_domain_id`` (the id is
#: the position): name, and its Domain, or the function giving the Domain of a profile.
_C_ORDER: dict[str, Domain | Callable[[Profile], Domain]] = {
    "mach": MACH, "speed": SPEED, "temperature": TEMPERATURE, "delta_t": DELTA_T,
    "recovery": RECOVERY, "impact_pressure": IMPACT_PRESSURE, "elevation": ELEVATION,
    "altitude": altitude, "geometric": geometric, "pressure": pressure, "setting": setting,
    "total_pressure": TOTAL_PRESSURE, "noise_band": NOISE, "weight": WEIGHT,
    "wing_area": WING_AREA, "cl_max": CL_MAX, "load_factor": LOAD_FACTOR,
    "cas_limit": CAS_LIMIT, "mach_limit": MACH_LIMIT, "subsonic_mach_limit": SUBSONIC_MACH_LIMIT,
}


def _of_profile(d: Domain | Callable[[Profile], Domain]) -> Callable[[Profile], Domain]:
    """``d`` as a function of the profile (a fixed Domain ignores it)."""
    return d if callable(d) else (lambda p: d)


#: The table above as (name, Domain of a profile) pairs: the one table from which the enum
#: of airdata_batch.h, the table of domains.c, the AD_<NAME>_LO/HI constants and the ids
#: of airdata.cport are generated or read (bindings/c/tools/generate.py).
C_DOMAINS: tuple[tuple[str, Callable[[Profile], Domain]], ...] = tuple(
    (name, _of_profile(d)) for name, d in _C_ORDER.items())


def c_domain_id(name: str) -> int:
    """The C port's ``ad_domain_id`` of the domain ``name`` (an entry of C_DOMAINS)."""
    return next(i for i, (n, _) in enumerate(C_DOMAINS) if n == name)
