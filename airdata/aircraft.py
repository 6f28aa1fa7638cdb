"""Aircraft data files: the few numbers the envelope needs, in a small TOML format of
our own.

Format ``airdata-aircraft/1``
-----------------------------
A TOML document (read with the standard library's ``tomllib``, Python 3.11 or later)::

    format = "airdata-aircraft/1"
    name = "Any invented name"          # free text
    notes = "optional free text"

    [mass]
    min_kg = 28000.0                    # lightest operating mass, kg
    max_kg = 46000.0                    # heaviest mass, kg

    [wing]
    area_m2 = 105.0                     # reference wing area, m2
    cl_max = 1.45                       # maximum lift coefficient of the configuration

    [limits]
    cas_kt = 320.0                      # maximum operating calibrated airspeed, kt
    mach = 0.80                         # maximum operating Mach number
    ceiling_ft = 39000.0                # maximum altitude, as a pressure altitude, ft

Units are part of the key names and are fixed; every number is converted to SI on
reading (kt and ft with their exact definitions, see :mod:`airdata.units`).  Weight is
mass times the standard acceleration of gravity g0 of the constants profile.  Unknown
keys and tables are refused rather than ignored, so a misspelt key cannot go unnoticed.

Valid values (chosen by this project to catch unit slips, not physical limits):
masses in (0, 1e6] kg with min_kg <= max_kg; wing area in (0, 2000] m2; cl_max in (0, 10];
cas_kt in (0, 1000] kt; mach in (0, 10] (a limit above Mach 1 uses the supersonic pitot
relation, NACA Report 1135 eq. 100); ceiling_ft in [0, 100000] ft, within the standard
atmosphere.
"""

from __future__ import annotations

import math
from dataclasses import dataclass
from pathlib import Path
from typing import Any

from .status import DomainError, Status
from .units import FT, KT

__all__ = ["Aircraft", "AircraftFileError", "FORMAT", "load_aircraft", "parse_aircraft"]

#: Identifier of the file format this module reads.
FORMAT = "airdata-aircraft/1"

# key -> (lower bound, lower bound included, upper bound, description of the range)
_TABLES: dict[str, dict[str, tuple[float, bool, float, str]]] = {
    "mass": {
        "min_kg": (0.0, False, 1.0e6, "(0, 1e6] kg"),
        "max_kg": (0.0, False, 1.0e6, "(0, 1e6] kg"),
    },
    "wing": {
        "area_m2": (0.0, False, 2000.0, "(0, 2000] m2"),
        "cl_max": (0.0, False, 10.0, "(0, 10]"),
    },
    "limits": {
        "cas_kt": (0.0, False, 1000.0, "(0, 1000] kt"),
        "mach": (0.0, False, 10.0, "(0, 10]"),
        "ceiling_ft": (0.0, True, 100000.0, "[0, 100000] ft"),
    },
}
_TOP_KEYS = {"format", "name", "notes", *_TABLES}


class AircraftFileError(ValueError):
    """An aircraft file that is not valid TOML or does not follow the format."""


@dataclass(frozen=True)
class Aircraft:
    """The numbers of one aircraft that the envelope needs, in SI units.

    Attributes
    ----------
    name : str
        Free-text name.
    mass_min, mass_max : float
        Lightest and heaviest mass, kg.
    wing_area : float
        Reference wing area, m2.
    cl_max : float
        Maximum lift coefficient.
    cas_limit : float
        Maximum operating calibrated airspeed, m/s.
    mach_limit : float
        Maximum operating Mach number, in (0, 10].
    ceiling : float
        Maximum altitude as a (geopotential) pressure altitude, m.
    notes : str
        Free text, may be empty.
    """

    name: str
    mass_min: float
    mass_max: float
    wing_area: float
    cl_max: float
    cas_limit: float
    mach_limit: float
    ceiling: float
    notes: str = ""

    def weights(self, g0: float = 9.80665) -> tuple[float, float]:
        """Lightest and heaviest weight, N: mass times ``g0`` (standard gravity)."""
        return self.mass_min * g0, self.mass_max * g0

    def as_dict(self) -> dict[str, object]:
        """Every field, SI units, JSON-ready."""
        return {
            "name": self.name, "mass_min_kg": self.mass_min, "mass_max_kg": self.mass_max,
            "wing_area_m2": self.wing_area, "cl_max": self.cl_max,
            "cas_limit_m_s": self.cas_limit, "mach_limit": self.mach_limit,
            "ceiling_m": self.ceiling, "notes": self.notes,
        }


def _number(where: str, value: Any) -> float:
    if isinstance(value, bool) or not isinstance(value, (int, float)):
        raise AircraftFileError(f"{where} must be a number, not {value!r}")
    return float(value)


def _checked(where: str, value: float, spec: tuple[float, bool, float, str]) -> float:
    lo, lo_in, hi, valid = spec
    if not math.isfinite(value):
        raise DomainError(where, value, None, valid, Status.INVALID_INPUT)
    if value < lo or (value == lo and not lo_in):
        status = Status.INVALID_INPUT if lo == 0.0 else Status.OUT_OF_RANGE
        raise DomainError(where, value, None, valid, status)
    if value > hi:
        raise DomainError(where, value, None, valid, Status.OUT_OF_RANGE)
    return value


def parse_aircraft(text: str, source: str = "<string>") -> Aircraft:
    """Read an aircraft from the text of an ``airdata-aircraft/1`` file.

    Parameters
    ----------
    text : str
        TOML text in the format described in the module docstring.
    source : str, optional
        Where the text came from, for error messages.

    Returns
    -------
    Aircraft
        The aircraft, SI units.

    Raises
    ------
    AircraftFileError
        Not TOML, wrong or missing ``format``, missing, unknown or non-numeric keys.
    DomainError
        A number outside its valid range (the argument is named ``table.key``), or
        ``mass.min_kg`` above ``mass.max_kg``.
    """
    try:
        import tomllib
    except ModuleNotFoundError:  # Python 3.10
        raise AircraftFileError("reading aircraft files needs Python 3.11 (tomllib)") from None
    try:
        doc = tomllib.loads(text)
    except tomllib.TOMLDecodeError as exc:
        raise AircraftFileError(f"{source}: not valid TOML: {exc}") from None
    unknown = sorted(set(doc) - _TOP_KEYS)
    if unknown:
        raise AircraftFileError(f"{source}: unknown top-level key(s) {unknown}")
    if doc.get("format") != FORMAT:
        raise AircraftFileError(
            f"{source}: format = {doc.get('format')!r}; this reader understands {FORMAT!r}")
    name = doc.get("name")
    if not isinstance(name, str) or not name.strip():
        raise AircraftFileError(f"{source}: name must be a non-empty string")
    notes = doc.get("notes", "")
    if not isinstance(notes, str):
        raise AircraftFileError(f"{source}: notes must be a string")
    values: dict[str, float] = {}
    for table, keys in _TABLES.items():
        sub = doc.get(table)
        if not isinstance(sub, dict):
            raise AircraftFileError(f"{source}: missing table [{table}]")
        extra = sorted(set(sub) - set(keys))
        if extra:
            raise AircraftFileError(f"{source}: unknown key(s) {extra} in [{table}]")
        for key, spec in keys.items():
            where = f"{table}.{key}"
            if key not in sub:
                raise AircraftFileError(f"{source}: missing key {where}")
            values[where] = _checked(where, _number(where, sub[key]), spec)
    if values["mass.min_kg"] > values["mass.max_kg"]:
        raise DomainError("mass.min_kg", values["mass.min_kg"], None,
                          f"(0, mass.max_kg = {values['mass.max_kg']!r}] kg",
                          Status.OUT_OF_RANGE)
    return Aircraft(
        name=name.strip(),
        mass_min=values["mass.min_kg"],
        mass_max=values["mass.max_kg"],
        wing_area=values["wing.area_m2"],
        cl_max=values["wing.cl_max"],
        cas_limit=values["limits.cas_kt"] * KT,
        mach_limit=values["limits.mach"],
        ceiling=values["limits.ceiling_ft"] * FT,
        notes=notes,
    )


def load_aircraft(path: str | Path) -> Aircraft:
    """Read an aircraft file (see :func:`parse_aircraft`).

    Raises
    ------
    OSError
        The file cannot be read.
    AircraftFileError, DomainError
        As :func:`parse_aircraft`.
    """
    p = Path(path)
    return parse_aircraft(p.read_text(encoding="utf-8"), source=str(p))
