"""Units for the edges of a program; the core is SI throughout.

Every factor is an exact definition:

* foot: 0.3048 m (international foot, 1959);
* knot: 1852 m per hour = 1852/3600 m/s (international nautical mile);
* inch of mercury, conventional: 3386.389 Pa (the value used for altimeter settings;
  from memory);
* hectopascal 100 Pa, millibar 100 Pa, kilopascal 1000 Pa;
* degree Celsius: K - 273.15; degree Fahrenheit: (F - 32) 5/9 + 273.15 K;
* foot per minute: 0.3048/60 m/s; kilometre per hour: 1000/3600 m/s.

``to_si(x, "kt")`` converts into SI, ``from_si(x, "kt")`` out of it; ``dimension("kt")``
gives ``"speed"``.  Unknown units raise ``ValueError`` listing the known ones.
"""

from __future__ import annotations

from fractions import Fraction

import numpy as np
from numpy.typing import ArrayLike

__all__ = [
    "FT", "KT", "INHG", "HPA", "FT_PER_MIN", "UNITS",
    "to_si", "from_si", "dimension", "units_of",
]

FT = 0.3048
KT = 1852.0 / 3600.0
INHG = 3386.389
HPA = 100.0
FT_PER_MIN = 0.3048 / 60.0

# unit -> (dimension, exact scale to SI, exact offset to SI); SI = x*scale + offset
UNITS: dict[str, tuple[str, Fraction, Fraction]] = {
    "Pa": ("pressure", Fraction(1), Fraction(0)),
    "hPa": ("pressure", Fraction(100), Fraction(0)),
    "mbar": ("pressure", Fraction(100), Fraction(0)),
    "kPa": ("pressure", Fraction(1000), Fraction(0)),
    "inHg": ("pressure", Fraction("3386.389"), Fraction(0)),
    "m": ("length", Fraction(1), Fraction(0)),
    "ft": ("length", Fraction("0.3048"), Fraction(0)),
    "km": ("length", Fraction(1000), Fraction(0)),
    "m/s": ("speed", Fraction(1), Fraction(0)),
    "kt": ("speed", Fraction(1852, 3600), Fraction(0)),
    "km/h": ("speed", Fraction(1000, 3600), Fraction(0)),
    "ft/min": ("speed", Fraction("0.3048") / 60, Fraction(0)),
    "K": ("temperature", Fraction(1), Fraction(0)),
    "degC": ("temperature", Fraction(1), Fraction("273.15")),
    "degF": ("temperature", Fraction(5, 9), Fraction("273.15") - Fraction(160, 9)),
    "1": ("dimensionless", Fraction(1), Fraction(0)),
    "kg/m3": ("density", Fraction(1), Fraction(0)),
}


def _lookup(unit: str) -> tuple[str, Fraction, Fraction]:
    try:
        return UNITS[unit]
    except KeyError:
        raise ValueError(f"unknown unit {unit!r}: known units are {', '.join(UNITS)}") from None


def dimension(unit: str) -> str:
    """Physical dimension of ``unit`` (``"pressure"``, ``"length"``, ``"speed"``, ...)."""
    return _lookup(unit)[0]


def units_of(dim: str) -> list[str]:
    """Every known unit of dimension ``dim``."""
    return [u for u, (d, _, _) in UNITS.items() if d == dim]


def to_si(x: ArrayLike, unit: str) -> float | np.ndarray:
    """Convert ``x`` from ``unit`` into SI (Pa, m, m/s, K).

    Inputs broadcast like a numpy ufunc; scalar input gives a Python float.
    """
    _, scale, offset = _lookup(unit)
    arr = np.asarray(x, dtype=np.float64)
    y = arr * float(scale) + float(offset) if offset else arr * float(scale)
    return float(y) if arr.ndim == 0 else y


def from_si(x: ArrayLike, unit: str) -> float | np.ndarray:
    """Convert ``x`` from SI (Pa, m, m/s, K) into ``unit``.

    Inputs broadcast like a numpy ufunc; scalar input gives a Python float.
    """
    _, scale, offset = _lookup(unit)
    arr = np.asarray(x, dtype=np.float64)
    y = (arr - float(offset)) / float(scale) if offset else arr / float(scale)
    return float(y) if arr.ndim == 0 else y
