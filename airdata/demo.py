"""A small invented demo scenario: sensor readings of a fictional test article.

The readings are made up for demonstration: they are synthesised from the standard
atmosphere with round flight conditions, then rounded as a sensor would report them.
They are not data of any real aircraft and are never used to check results.
"""

from __future__ import annotations

import numpy as np

from .altimetry import pressure_at_altitude
from .atmosphere import atmosphere
from .pitot import impact_pressure_from_mach
from .temperature import tat_from_sat

__all__ = ["SCENARIO", "demo_readings"]

#: (phase, pressure altitude m, Mach, ISA deviation K): an invented sortie.
SCENARIO: tuple[tuple[str, float, float, float], ...] = (
    ("parked", 120.0, 0.0, 8.0),
    ("take-off roll", 120.0, 0.20, 8.0),
    ("initial climb", 900.0, 0.32, 7.0),
    ("climb", 6000.0, 0.60, 4.0),
    ("cruise", 11500.0, 0.82, -3.0),
    ("supersonic dash", 15000.0, 1.60, -5.0),
    ("high dash", 19000.0, 2.20, -5.0),
    ("descent", 4000.0, 0.55, 5.0),
    ("approach", 400.0, 0.21, 8.0),
)


def demo_readings() -> dict[str, np.ndarray]:
    """Sensor readings (ps, pt in Pa; tat in K) and the phase names of the scenario."""
    h = np.array([s[1] for s in SCENARIO])
    mach = np.array([s[2] for s in SCENARIO])
    dt = np.array([s[3] for s in SCENARIO])
    ps = np.asarray(pressure_at_altitude(h))
    qc = np.asarray(impact_pressure_from_mach(mach, ps))
    sat = np.asarray(atmosphere(h, dt).temperature)
    tat = np.asarray(tat_from_sat(sat, mach))
    # Round as a sensor reports: 0.1 Pa and 0.01 K.
    return {
        "phase": np.array([s[0] for s in SCENARIO]),
        "ps": np.round(ps, 1),
        "pt": np.round(ps + qc, 1),
        "tat": np.round(tat, 2),
    }
