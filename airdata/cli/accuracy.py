"""Sensor accuracies as data sheets write them, for ``airdata budget``.

A value of ``--ps-bias``, ``--ps-noise``, ``--pitot-bias`` or ``--pitot-noise`` is one term
or a sum of terms, each with its sign:

- a pressure with its unit: ``0.5hPa``, ``50Pa``, ``0.015inHg``, ``0.007psi``, ``0.5mb``
  (any pressure unit of :mod:`airdata.units`); a bare number is hPa, as before units
  were accepted;
- a percentage of the reading: ``0.02%`` or ``0.02%rdg``;
- a percentage of full scale: ``0.05%FS``, which needs the sensor's range
  (``--ps-full-scale 1300hPa``, ``--pitot-full-scale 400hPa``) and is then a fixed amount.

For example ``--ps-noise 0.1hPa+0.01%`` is "0.1 hPa plus 0.01 % of reading".  The TAT
probe's accuracy is a temperature difference: ``0.5`` (K), ``0.5K``, ``0.5degC`` or
``0.9degF`` (5/9 K per degF, no offset).
"""

from __future__ import annotations

import re
from dataclasses import dataclass

from .. import units as u

__all__ = ["SensorTerm", "parse_accuracy", "PRESSURE_DEFAULT"]

#: Unit of a pressure accuracy written as a bare number.
PRESSURE_DEFAULT = "hPa"

_NUMBER = r"[-+]?(?:\d+(?:\.\d*)?|\.\d+)(?:[eE][-+]?\d+)?"
_TERM = re.compile(rf"^\s*(?P<num>{_NUMBER})\s*(?P<unit>[^\s\d.+-][^\s]*)?\s*$")
# a sign that starts a new term: not the first character, not an exponent's sign
_SPLIT = re.compile(r"(?<=[^eE\s+-])\s*(?=[+-])")
_TEMPERATURE_STEP = {"K": 1.0, "degC": 1.0, "degF": 5.0 / 9.0}


@dataclass(frozen=True)
class SensorTerm:
    """One sensor accuracy read from the command line.

    Attributes
    ----------
    absolute : float
        The fixed part, Pa (pressure sensors) or K (TAT).
    of_reading : float
        The part proportional to the reading, as a fraction of it (0.0002 = 0.02 %).
    text : str
        The value as written.
    unit : str
        The pressure unit written (the first one), for reports; ``hPa`` when none was.
    """

    absolute: float
    of_reading: float
    text: str
    unit: str


def parse_accuracy(text: str, option: str, kind: str, full_scale: float | None = None,
                   full_scale_option: str = "", noise: bool = False) -> SensorTerm:
    """Read a sensor accuracy (see the module docstring for the forms).

    Parameters
    ----------
    text : str
        The value as typed.
    option : str
        The option's name, for messages (e.g. ``"--ps-noise"``).
    kind : {"pressure", "temperature"}
        Which sensor.
    full_scale : float, optional
        The sensor's full scale, Pa, when given.
    full_scale_option : str
        The option that gives it, for the message when it is missing.
    noise : bool
        A noise standard deviation: every term must be >= 0.

    Returns
    -------
    SensorTerm
        The absolute part in SI units and the fraction of reading.

    Raises
    ------
    ValueError
        Naming the option and the term that cannot be read, and the forms that work.
    """
    terms = [t for t in _SPLIT.split(text.strip()) if t.strip()]
    if not terms:
        raise ValueError(f"{option}: empty value")
    absolute = 0.0
    rel = 0.0
    first_unit = ""
    for term in terms:
        m = _TERM.match(term)
        if m is None:
            raise ValueError(f"{option} {text!r}: cannot read {term.strip()!r}; "
                             + _forms(kind))
        value = float(m.group("num"))
        unit = (m.group("unit") or "").strip()
        if noise and value < 0.0:
            raise ValueError(f"{option} {text!r}: a noise standard deviation has no "
                             f"negative part ({term.strip()!r})")
        if kind == "temperature":
            absolute += value * _temperature_step(unit, option, text)
            continue
        low = unit.lower().replace(" ", "")
        if low in ("%", "%rdg", "%reading", "%ofreading"):
            rel += value / 100.0
        elif low in ("%fs", "%offullscale", "%f.s."):
            if full_scale is None:
                raise ValueError(f"{option} {text!r}: a percentage of full scale needs the "
                                 f"sensor's range: give {full_scale_option} (e.g. 1300hPa)")
            absolute += value / 100.0 * full_scale
        else:
            name = unit or PRESSURE_DEFAULT
            try:
                canon = u.normalize_unit(name)
            except ValueError:
                raise ValueError(f"{option} {text!r}: unknown unit {unit!r}; "
                                 + _forms(kind)) from None
            if u.dimension(canon) != "pressure":
                raise ValueError(f"{option} {text!r}: {unit!r} is not a pressure unit; "
                                 + _forms(kind))
            first_unit = first_unit or canon
            absolute += float(u.to_si(value, canon))
    return SensorTerm(absolute, rel, text, first_unit or PRESSURE_DEFAULT)


def _temperature_step(unit: str, option: str, text: str) -> float:
    if "%" in unit:
        raise ValueError(f"{option} {text!r}: percentages are for the pressure sensors; give "
                         "the TAT accuracy as a temperature difference (0.5K, 0.5degC, 0.9degF)")
    if not unit:
        return 1.0
    try:
        canon = u.normalize_unit(unit)
    except ValueError:
        canon = ""
    if canon not in _TEMPERATURE_STEP:
        raise ValueError(f"{option} {text!r}: unknown unit {unit!r}; " + _forms("temperature"))
    return _TEMPERATURE_STEP[canon]


def _forms(kind: str) -> str:
    if kind == "temperature":
        return "write a temperature difference such as 0.5 (K), 0.5K, 0.5degC or 0.9degF"
    return ("write a pressure (0.5hPa, 50Pa, 0.015inHg, 0.007psi; a bare number is hPa), a "
            "percentage of reading (0.02%) or of full scale (0.05%FS), or a sum such as "
            "0.1hPa+0.01% (pressure units: " + ", ".join(u.units_of("pressure")) + ")")
