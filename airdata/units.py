"""Units for the edges of a program; the core is SI throughout.

Every factor is an exact definition, except the inch of mercury:

* foot: 0.3048 m (international foot, 1959);
* knot: 1852 m per hour = 1852/3600 m/s (international nautical mile);
* inch of mercury, conventional: 3386.389 Pa, the value used for altimeter settings
  (from memory).  It is not exact: it is the 7-significant-figure rounding of
  13595.1 kg/m3 x 9.80665 m/s2 x 0.0254 m = 3386.38864... Pa (a conventional mercury
  density, standard gravity, the inch); the conversion uses 3386.389 Pa as given;
* hectopascal 100 Pa, millibar 100 Pa, kilopascal 1000 Pa;
* degree Celsius: K - 273.15; degree Fahrenheit: (F - 32) 5/9 + 273.15 K;
* foot per minute: 0.3048/60 m/s; kilometre per hour: 1000/3600 m/s;
* statute mile per hour: 1609.344/3600 m/s (international mile, 1959);
* pound-force per square inch: 0.45359237 kg x 9.80665 m/s2 / (0.0254 m)^2
  (international pound, standard gravity);
* flight level: 100 ft of pressure altitude (ICAO Annex 2 usage).

:func:`normalize_unit` maps the spellings found in recorded files and on command lines
(``mb``, ``hpa``, ``C``, ``deg F``, ``kts``, ``°C``, ``[ft]`` ...) to these names; the
conversion functions themselves take the canonical names only.

``to_si(x, "kt")`` converts into SI, ``from_si(x, "kt")`` out of it; ``dimension("kt")``
gives ``"speed"``.  Unknown units raise ``ValueError`` listing the known ones.
"""

from __future__ import annotations

from fractions import Fraction

import numpy as np
from numpy.typing import ArrayLike

__all__ = [
    "FT", "KT", "INHG", "HPA", "FT_PER_MIN", "UNITS",
    "to_si", "from_si", "dimension", "units_of", "normalize_unit", "ALIASES",
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
    "psi": ("pressure", Fraction("0.45359237") * Fraction("9.80665") / Fraction("0.0254") ** 2,
            Fraction(0)),
    "m": ("length", Fraction(1), Fraction(0)),
    "ft": ("length", Fraction("0.3048"), Fraction(0)),
    "km": ("length", Fraction(1000), Fraction(0)),
    "FL": ("length", Fraction("30.48"), Fraction(0)),
    "m/s": ("speed", Fraction(1), Fraction(0)),
    "kt": ("speed", Fraction(1852, 3600), Fraction(0)),
    "km/h": ("speed", Fraction(1000, 3600), Fraction(0)),
    "mph": ("speed", Fraction("1609.344") / 3600, Fraction(0)),
    "ft/min": ("speed", Fraction("0.3048") / 60, Fraction(0)),
    "K": ("temperature", Fraction(1), Fraction(0)),
    "degC": ("temperature", Fraction(1), Fraction("273.15")),
    "degF": ("temperature", Fraction(5, 9), Fraction("273.15") - Fraction(160, 9)),
    "1": ("dimensionless", Fraction(1), Fraction(0)),
    "kg/m3": ("density", Fraction(1), Fraction(0)),
}

#: Other spellings (compared in lower case, spaces removed) -> canonical unit.
ALIASES: dict[str, str] = {
    "mb": "mbar", "millibar": "mbar", "hectopascal": "hPa", "pascal": "Pa",
    "inhg": "inHg", "in.hg": "inHg", "\"hg": "inHg", "lbf/in2": "psi", "psia": "psi",
    "c": "degC", "degc": "degC", "°c": "degC", "deg.c": "degC", "celsius": "degC",
    "f": "degF", "degf": "degF", "°f": "degF", "deg.f": "degF", "fahrenheit": "degF",
    "k": "K", "kelvin": "K",
    "kt": "kt", "kts": "kt", "knot": "kt", "knots": "kt", "kn": "kt",
    "m/s": "m/s", "mps": "m/s", "kmh": "km/h", "kph": "km/h", "km/hr": "km/h",
    "mi/h": "mph", "fpm": "ft/min", "ft/mn": "ft/min",
    "feet": "ft", "foot": "ft", "metre": "m", "meter": "m", "metres": "m", "meters": "m",
    "fl": "FL", "-": "1", "": "1", "kg/m^3": "kg/m3", "kg/m³": "kg/m3",
}
_FOLDED = {name.lower(): name for name in UNITS}


def normalize_unit(spelling: str) -> str:
    """The canonical name (a key of :data:`UNITS`) of a unit as written in a file.

    Exact canonical names pass; otherwise the spelling is compared without case and
    spaces with the canonical names and :data:`ALIASES` (``"mb"`` -> ``"mbar"``,
    ``"deg C"`` -> ``"degC"``, ``"KTS"`` -> ``"kt"``).

    Raises
    ------
    ValueError
        The spelling is none of these; the message lists the known units.
    """
    if spelling in UNITS:
        return spelling
    key = "".join(spelling.split()).lower()
    if key in ALIASES:
        return ALIASES[key]
    if key in _FOLDED:
        return _FOLDED[key]
    raise ValueError(f"unknown unit {spelling!r}: known units are {', '.join(UNITS)} "
                     "(and spellings such as mb, C, F, kts)")


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
