"""airdata: reference air-data equations, golden vectors and port verification.

A verification and engineering aid, not certified flight software.

Every function works in SI units, broadcasts like a numpy ufunc and returns a Python
float for scalar input.  Bad input raises :class:`DomainError` (``strict=True``, the
default) or gives NaN for just the bad elements (``strict=False``).
"""

from __future__ import annotations

from .altimetry import (
    altimeter_setting,
    baro_corrected_altitude,
    density_altitude,
    pressure_altitude,
    pressure_at_altitude,
)
from .atmosphere import Atmosphere, atmosphere, geometric_altitude, geopotential_altitude
from .chain import AirData, air_data
from .limits import (
    ceiling_margin,
    crossover_altitude,
    max_operating_cas,
    max_operating_mach,
    stall_cas,
    stall_eas,
    stall_mach,
    stall_tas,
)
from .pitot import (
    cas_from_impact_pressure,
    impact_pressure_from_cas,
    impact_pressure_from_mach,
    mach_from_impact_pressure,
)
from .profiles import GAMMA, ICAO, PROFILES, US1976, Profile, get_profile
from .speeds import (
    cas_from_mach,
    dynamic_pressure,
    eas_from_mach,
    mach_from_cas,
    mach_from_eas,
    mach_from_tas,
    tas_from_mach,
)
from .status import DomainError, Status
from .temperature import sat_from_tat, tat_from_sat

__version__ = "0.1.0"

__all__ = [
    "AirData", "Atmosphere", "DomainError", "GAMMA", "ICAO", "PROFILES", "Profile",
    "Status", "US1976", "air_data", "altimeter_setting", "atmosphere",
    "baro_corrected_altitude", "cas_from_impact_pressure", "cas_from_mach",
    "density_altitude", "dynamic_pressure", "eas_from_mach", "geometric_altitude",
    "geopotential_altitude", "get_profile", "impact_pressure_from_cas",
    "impact_pressure_from_mach", "mach_from_cas", "mach_from_eas",
    "mach_from_impact_pressure", "mach_from_tas", "pressure_altitude",
    "pressure_at_altitude", "sat_from_tat", "tas_from_mach", "tat_from_sat",
    "stall_eas", "stall_mach", "stall_cas", "stall_tas", "crossover_altitude",
    "max_operating_cas", "max_operating_mach", "ceiling_margin",
    "__version__",
]
