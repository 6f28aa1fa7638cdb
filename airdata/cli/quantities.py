"""Quantities with units on the command line, and the output-unit options.

A value on the command line carries its unit, written right after the number, with or
without a space: ``250hPa``, ``29.92inHg``, ``-20degC``, ``"1013.25 hPa"``, ``35000ft``,
``250kt``.  The units are those of :mod:`airdata.units`.  A missing, unknown or wrong
kind of unit is a usage error (exit status 2) whose message lists the units that fit.

Negative values can be written directly (``--tat -20degC``) or with ``=``
(``--tat=-20degC``); see :func:`allow_negative_values`.
"""

from __future__ import annotations

import argparse
import math
import re
import sys
from collections.abc import Callable
from dataclasses import dataclass
from typing import Any, NoReturn

from .. import units as u
from ..profiles import PROFILES
from ..status import DomainError
from .messages import fail

__all__ = [
    "Quantity", "parse_quantity", "quantity_type", "difference_type", "add_output_units",
    "output_units", "add_profile", "allow_negative_values", "domain_failure",
    "DIMENSION_WORDS", "DECIMALS", "format_value", "render", "si_units", "caution",
    "domain_message", "quiet_broken_pipe",
]

#: Human words for the dimensions of :mod:`airdata.units`.
DIMENSION_WORDS = {
    "pressure": "a pressure", "length": "a length", "speed": "a speed",
    "temperature": "a temperature", "dimensionless": "a pure number", "density": "a density",
}

_NUMBER = r"[-+]?(?:\d+(?:\.\d*)?|\.\d+)(?:[eE][-+]?\d+)?"
_QUANTITY = re.compile(rf"^\s*(?P<num>{_NUMBER})\s*(?P<unit>[^\s\d.+-][^\s]*)?\s*$")
#: A flight level written the way it is spoken, ``FL350`` (also ``FL 350``, ``fl350``).
_FLIGHT_LEVEL = re.compile(r"^\s*[Ff][Ll]\s*(?P<num>\d+(?:\.\d*)?)\s*$")


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
    fl = _FLIGHT_LEVEL.match(text) if dim == "length" else None
    if fl is not None:  # FL350: the flight level first, in hundreds of feet
        value = float(fl.group("num"))
        return Quantity(float(u.to_si(value, "FL")), value, "FL")
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


def add_profile(parser: argparse.ArgumentParser,
                help: str = "constants profile of the standard atmosphere (default: icao)"
                ) -> None:
    """Add ``--profile`` (icao by default), with the help text ``help``."""
    parser.add_argument("--profile", choices=sorted(PROFILES), default="icao", help=help)


#: A value that starts like a negative number (``-20degC``, ``-.5``, ``-1e3ft``): no option
#: of these commands starts with ``-`` and a digit, so such a word is always a value.
_NEGATIVE_VALUE = re.compile(r"^-\.?\d")


def allow_negative_values(parser: argparse.ArgumentParser) -> None:
    """Let option values such as ``-20degC`` follow their option without ``=``.

    argparse reads a word that starts with ``-`` as an option unless it is a plain
    negative number, so ``--tat -20degC`` would leave ``--tat`` without its value.  This
    function wraps the parser's public methods only: ``add_argument`` (and those of its
    argument groups) record the options that take one value, and ``parse_known_args``
    (which ``parse_args`` and a parent's sub-command action call) rewrites
    ``--tat -20degC`` as ``--tat=-20degC`` (``-x -5`` as ``-x-5``) before argparse sees
    it, for every word starting with ``-`` and a digit (or ``-.`` and a digit) that follows
    such an option.  ``--tat=-20degC`` always works.  If a value is still taken as an
    option (e.g. ``--tat -°C``), the "expected one argument" error says to write
    ``--OPTION=VALUE``.  Call it right after creating the parser, before adding options.
    """
    value_options: set[str] = set()
    _record_value_options(parser, value_options)
    original_parse = parser.parse_known_args
    original_error = parser.error

    def parse_known_args(args: list[str] | None = None,
                         namespace: argparse.Namespace | None = None,
                         ) -> tuple[argparse.Namespace, list[str]]:
        words = list(sys.argv[1:] if args is None else args)
        return original_parse(_join_negative_values(words, value_options,
                                                    parser.allow_abbrev), namespace)

    def error(message: str) -> NoReturn:
        m = re.match(r"argument (\S+?)(?:/\S+)?: expected one argument", message)
        if m is not None:
            opt = next((o for o in m.group(1).split("/") if o.startswith("--")),
                       m.group(1))
            message += (f" (a value that starts with '-' is written {opt}=VALUE, "
                        f"e.g. {opt}=-20degC)")
        original_error(message)
        raise SystemExit(2)  # pragma: no cover - error() exits

    parser.parse_known_args = parse_known_args  # type: ignore[method-assign]
    parser.error = error  # type: ignore[method-assign]


def _record_value_options(container: Any, value_options: set[str]) -> None:
    """Wrap ``add_argument`` and the group makers of ``container`` (see above)."""
    add = container.add_argument

    def add_argument(*names: Any, **kwargs: Any) -> argparse.Action:
        action = add(*names, **kwargs)
        if action.option_strings and action.nargs in (None, 1):
            value_options.update(action.option_strings)
        return action

    container.add_argument = add_argument
    for maker in ("add_argument_group", "add_mutually_exclusive_group"):
        make = getattr(container, maker, None)
        if make is None:
            continue

        def wrapped(*a: Any, _make: Any = make, **kw: Any) -> Any:
            group = _make(*a, **kw)
            _record_value_options(group, value_options)
            return group

        setattr(container, maker, wrapped)


def _join_negative_values(words: list[str], value_options: set[str],
                          allow_abbrev: bool) -> list[str]:
    """``[..., "--tat", "-20degC", ...]`` -> ``[..., "--tat=-20degC", ...]`` (see above)."""
    out: list[str] = []
    i = 0
    while i < len(words):
        word = words[i]
        if word == "--":
            out.extend(words[i:])
            break
        nxt = words[i + 1] if i + 1 < len(words) else None
        if nxt is not None and _NEGATIVE_VALUE.match(nxt) and \
                _takes_value(word, value_options, allow_abbrev):
            out.append(f"{word}={nxt}" if word.startswith("--") else word + nxt)
            i += 2
            continue
        out.append(word)
        i += 1
    return out


def _takes_value(word: str, value_options: set[str], allow_abbrev: bool) -> bool:
    if word in value_options:
        return True
    if not allow_abbrev or not word.startswith("--") or "=" in word or len(word) < 3:
        return False
    matches = [o for o in value_options if o.startswith(word)]
    return len(matches) == 1


def quiet_broken_pipe() -> int:
    """The reader of stdout went away (``airdata table | head``): end without a message.

    stdout is pointed at the null device so that the interpreter's final flush does not
    raise again; the exit status is 141 (128 + SIGPIPE), what a shell reports for a
    program ended by a closed pipe.
    """
    import os

    try:
        devnull = os.open(os.devnull, os.O_WRONLY)
        os.dup2(devnull, sys.stdout.fileno())
    except (OSError, ValueError):  # pragma: no cover - stdout without a descriptor
        pass
    return 141


def domain_failure(command: str, exc: DomainError,
                   given: dict[str, Quantity] | None = None) -> int:
    """Report a :class:`DomainError` and return exit status 1.

    When the offending argument is one the user gave (``given`` maps the library's
    argument names to the quantities as written), the value and the valid range are
    shown in the user's unit, rounded to 6 significant digits; otherwise (a derived
    quantity such as qc/ps) in SI units, rounded the same way.
    """
    return fail(command, domain_message(exc, given), 1)


#: "[lo, hi] unit rest" as DomainError.valid writes a range.
_RANGE = re.compile(rf"^(?P<open>[\[(])\s*(?P<lo>{_NUMBER}|-?inf)\s*,\s*"
                    rf"(?P<hi>{_NUMBER}|inf)\s*(?P<close>[\])])\s*(?P<unit>[^\s(]*)\s*"
                    rf"(?P<rest>.*)$")


def _g6(x: float) -> str:
    text = f"{x:.6g}"
    return "0" if text in ("-0", "0") else text


def _range_text(m: re.Match[str], lo: float, hi: float, unit: str) -> str:
    """``[lo, hi] unit rest`` with the brackets and the remark of the matched range."""
    text = f"{m.group('open')}{_g6(lo)}, {_g6(hi)}{m.group('close')} {unit}".rstrip()
    return text + (f" {m.group('rest')}" if m.group("rest") else "")


def domain_message(exc: DomainError, given: dict[str, Quantity] | None = None) -> str:
    """The text of :func:`domain_failure` (see there)."""
    kind = "invalid" if exc.status.name == "INVALID_INPUT" else "out of range"
    where = "" if exc.index is None else (
        f" at index {exc.index[0] if len(exc.index) == 1 else exc.index}")
    q = (given or {}).get(exc.argument)
    if q is not None:  # one value as written: an index into a broadcast says nothing
        where = ""
    m = _RANGE.match(exc.valid)
    si_unit = m.group("unit") if m else ""
    if m is not None and si_unit == "":  # a pure number: no unit to convert or name
        value = _g6(q.value) if q is not None else _g6(float(exc.value))
        valid = _range_text(m, float(m.group("lo")), float(m.group("hi")), "")
        return f"{exc.argument} = {value}{where} is {kind}: valid range is {valid}"
    if q is not None and m is not None and si_unit in u.UNITS and q.unit in u.UNITS \
            and u.dimension(si_unit) == u.dimension(q.unit):
        lo, hi = (float(u.from_si(float(u.to_si(float(m.group(k)), si_unit)), q.unit))
                  for k in ("lo", "hi"))
        return f"{exc.argument} = {_g6(q.value)} {q.unit}{where} is {kind}: valid range is " \
               f"{_range_text(m, lo, hi, q.unit)}"
    valid = exc.valid if m is None else _range_text(
        m, float(m.group("lo")), float(m.group("hi")), si_unit)
    value = _g6(exc.value) if isinstance(exc.value, float) else str(exc.value)
    return f"{exc.argument} = {value}{where} is {kind}: valid range is {valid} " \
           f"(SI units: Pa, K, m, m/s)"


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
    text = f"{value:.5g}" if d is None else f"{value:.{d}f}"
    if text.startswith("-") and float(text) == 0.0:  # -0.00 K: a rounded-away sign
        text = text[1:]
    return text


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

    from ..notice import CAUTION

    return textwrap.fill(CAUTION, 79)
