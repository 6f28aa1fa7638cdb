"""Quantities with units on the command line, and the output-unit options.

A value on the command line carries its unit, written right after the number, with or
without a space: ``250hPa``, ``29.92inHg``, ``-20degC``, ``"1013.25 hPa"``, ``35000ft``,
``250kt``.  The units are those of :mod:`airdata.units`.  A missing, unknown or wrong
kind of unit is a usage error (exit status 2) whose message lists the units that fit.

Negative values can be written directly (``--tat -20degC``) or with ``=``
(``--tat=-20degC``).
"""

from __future__ import annotations

import argparse
import math
import re
import sys
from collections.abc import Callable
from dataclasses import dataclass

from .. import units as u
from ..profiles import PROFILES
from ..status import DomainError

__all__ = [
    "Quantity", "parse_quantity", "quantity_type", "difference_type", "add_output_units",
    "output_units", "add_profile", "allow_negative_values", "fail", "domain_failure",
    "DIMENSION_WORDS", "DECIMALS", "format_value", "render", "si_units", "caution",
]

#: Human words for the dimensions of :mod:`airdata.units`.
DIMENSION_WORDS = {
    "pressure": "a pressure", "length": "a length", "speed": "a speed",
    "temperature": "a temperature", "dimensionless": "a pure number", "density": "a density",
}

_NUMBER = r"[-+]?(?:\d+(?:\.\d*)?|\.\d+)(?:[eE][-+]?\d+)?"
_QUANTITY = re.compile(rf"^\s*(?P<num>{_NUMBER})\s*(?P<unit>[^\s\d.+-][^\s]*)?\s*$")


@dataclass(frozen=True)
class Quantity:
    """A value read from the command line.

    Attributes
    ----------
    si : float
        The value in SI units (Pa, m, m/s, K; 1 for pure numbers).
    value : float
        The number as written.
    unit : str
        The unit as written.
    """

    si: float
    value: float
    unit: str

    def __str__(self) -> str:
        return f"{self.value:g} {self.unit}"


def _units_list(dim: str) -> str:
    return ", ".join(u.units_of(dim))


def parse_quantity(text: str, dim: str, default_unit: str | None = None) -> Quantity:
    """Read ``text`` as a number with a unit of dimension ``dim``.

    Parameters
    ----------
    text : str
        For example ``"250hPa"`` or ``"-20 degC"``.
    dim : str
        Expected dimension: ``"pressure"``, ``"length"``, ``"speed"``,
        ``"temperature"`` or ``"dimensionless"``.
    default_unit : str, optional
        Unit taken when ``text`` carries none (only for pure numbers).

    Returns
    -------
    Quantity
        The value in SI units and as written.

    Raises
    ------
    ValueError
        Not a number, a missing or unknown unit, or a unit of another dimension; the
        message lists the units of dimension ``dim``.
    """
    m = _QUANTITY.match(text)
    if m is None:
        raise ValueError(f"{text!r} is not a number with a unit (e.g. "
                         f"{_example(dim)}); units of {DIMENSION_WORDS[dim]}: {_units_list(dim)}")
    value = float(m.group("num"))
    unit = m.group("unit") or default_unit
    if unit is None:
        raise ValueError(f"{text!r} has no unit: write it like {_example(dim)}; units of "
                         f"{DIMENSION_WORDS[dim]}: {_units_list(dim)}")
    if unit not in u.UNITS:
        raise ValueError(f"unknown unit {unit!r} in {text!r}; units of {DIMENSION_WORDS[dim]}: "
                         f"{_units_list(dim)}")
    got = u.dimension(unit)
    if got != dim:
        raise ValueError(f"{text!r} is {DIMENSION_WORDS[got]}, expected {DIMENSION_WORDS[dim]}: "
                         f"units {_units_list(dim)}")
    if not math.isfinite(value):  # pragma: no cover - the pattern admits finite numbers only
        raise ValueError(f"{text!r} is not a finite number")
    return Quantity(float(u.to_si(value, unit)), value, unit)


def _example(dim: str) -> str:
    return {"pressure": "250hPa", "length": "35000ft", "speed": "250kt",
            "temperature": "-20degC", "dimensionless": "0.98"}.get(dim, "1")


def quantity_type(dim: str, default_unit: str | None = None) -> Callable[[str], Quantity]:
    """An argparse ``type=`` that reads a quantity of dimension ``dim``."""

    def convert(text: str) -> Quantity:
        try:
            return parse_quantity(text, dim, default_unit)
        except ValueError as exc:
            raise argparse.ArgumentTypeError(str(exc)) from None

    convert.__name__ = dim  # argparse names the type in some messages
    return convert


def difference_type(text: str) -> Quantity:
    """An argparse ``type=`` for a temperature *difference* (ISA deviation).

    ``K`` and ``degC`` are the same size; ``degF`` is 5/9 of them.  No offset applies:
    ``+10degC`` is 10 K.
    """
    m = _QUANTITY.match(text)
    unit = m.group("unit") if m else None
    scale = {"K": 1.0, "degC": 1.0, "degF": 5.0 / 9.0}
    if m is None or unit not in scale:
        raise argparse.ArgumentTypeError(
            f"{text!r} is not a temperature difference with a unit: write it like +10K, "
            f"-5degC or 9degF (units K, degC, degF)")
    value = float(m.group("num"))
    return Quantity(value * scale[unit], value, unit)


# ----------------------------------------------------------------------------- outputs

_OUTPUT_DEFAULTS = {"length": "ft", "speed": "kt", "pressure": "hPa", "temperature": "degC"}
_SI = {"length": "m", "speed": "m/s", "pressure": "Pa", "temperature": "K"}


def add_output_units(parser: argparse.ArgumentParser) -> None:
    """Add ``--alt-unit``, ``--speed-unit``, ``--pressure-unit``, ``--temp-unit``, ``--si``."""
    g = parser.add_argument_group("output units")
    g.add_argument("--alt-unit", choices=u.units_of("length"), default=None,
                   help="altitudes (default: ft)")
    g.add_argument("--speed-unit", choices=u.units_of("speed"), default=None,
                   help="airspeeds (default: kt)")
    g.add_argument("--pressure-unit", choices=u.units_of("pressure"), default=None,
                   help="pressures (default: hPa)")
    g.add_argument("--temp-unit", choices=u.units_of("temperature"), default=None,
                   help="temperatures (default: degC)")
    g.add_argument("--si", action="store_true",
                   help="SI units (m, m/s, Pa, K) wherever no unit option says otherwise")


def output_units(args: argparse.Namespace) -> dict[str, str]:
    """Output unit per dimension from the parsed options."""
    base = dict(_SI if args.si else _OUTPUT_DEFAULTS)
    for dim, opt in (("length", "alt_unit"), ("speed", "speed_unit"),
                     ("pressure", "pressure_unit"), ("temperature", "temp_unit")):
        if getattr(args, opt) is not None:
            base[dim] = getattr(args, opt)
    base["dimensionless"] = "1"
    base["density"] = "kg/m3"
    return base


def add_profile(parser: argparse.ArgumentParser) -> None:
    """Add ``--profile``."""
    parser.add_argument("--profile", choices=sorted(PROFILES), default="icao",
                        help="constants profile of the standard atmosphere (default: icao)")


def allow_negative_values(parser: argparse.ArgumentParser) -> None:
    """Let option values such as ``-20degC`` follow their option without ``=``.

    argparse takes any word starting with ``-`` for an option unless it is a plain
    negative number; this widens "plain negative number" to a number with a unit.
    The parser has no option that looks like a negative number, so nothing is lost.
    """
    if hasattr(parser, "_negative_number_matcher"):
        parser._negative_number_matcher = re.compile(  # private; documented above
            r"^-(?:\d+(?:\.\d*)?|\.\d+)(?:[eE][-+]?\d+)?\s*[A-Za-z/]*$")


def fail(command: str, message: str, code: int = 1) -> int:
    """Print ``airdata COMMAND: error: MESSAGE`` on stderr and return ``code``."""
    print(f"airdata {command}: error: {message}", file=sys.stderr)
    return code


def domain_failure(command: str, exc: DomainError) -> int:
    """Report a :class:`DomainError` (values in SI units) and return exit status 1."""
    return fail(command, f"{exc} (values in SI units: Pa, K, m, m/s)", 1)


# ----------------------------------------------------------------------------- display

#: Decimals shown per unit in readable tables (JSON always carries full precision).
DECIMALS = {
    "ft": 0, "m": 1, "km": 4, "kt": 2, "m/s": 2, "km/h": 2, "ft/min": 0,
    "Pa": 1, "hPa": 2, "mbar": 2, "kPa": 3, "inHg": 3, "K": 2, "degC": 2, "degF": 2,
    "1": 4, "kg/m3": 5,
}


def format_value(value: float, unit: str) -> str:
    """A value for a readable table, with the decimals usual for ``unit``."""
    if value != value:  # NaN
        return "-"
    d = DECIMALS.get(unit)
    if d is None:
        return f"{value:.5g}"
    return f"{value:.{d}f}"


def render(rows: list[tuple[str, str, str]], title: str | None = None) -> str:
    """Lines of a three-column table: label, value (right-aligned), unit."""
    wl = max(len(r[0]) for r in rows)
    wv = max(len(r[1]) for r in rows)
    lines = [title] if title else []
    for label, value, unit in rows:
        lines.append(f"  {label:<{wl}}  {value:>{wv}}  {unit}".rstrip())
    return "\n".join(lines)


def si_units(dim: str) -> str:
    """The SI unit of dimension ``dim``."""
    return {"length": "m", "speed": "m/s", "pressure": "Pa", "temperature": "K",
            "dimensionless": "1", "density": "kg/m3"}[dim]


def caution() -> str:
    """``airdata.cli.CAUTION`` wrapped for a --help epilog shown as written."""
    import textwrap

    from ..cli import CAUTION

    return textwrap.fill(CAUTION, 79)
