"""Accuracy requirements of a port: allowed errors in engineering units over an envelope.

A requirements file is TOML (format ``airdata-requirements-1``, described in
docs/requirements.md)::

    format = "airdata-requirements-1"
    title = "Air-data computer software requirements, revision 3"

    [function.pressure_altitude]
    envelope.ps = ["116 hPa", "1100 hPa"]      # inclusive, in any pressure unit
    error.h = "1 ft"                            # absolute

    [function.cas_from_impact_pressure]
    envelope.qc = ["0.5 hPa", "300 hPa"]
    error.cas = "0.05 % of reading + 0.2 kt"   # combined

An output's allowed error is ``rel * |reference| + abs``.  A case whose inputs are not
all inside the function's envelope is *outside the envelope*: counted, not judged.
Statuses stay exact inside the envelope.  Every problem raises
:class:`RequirementsError` naming the file, the key and its line.

An engineering and verification aid, not certified flight software.
"""

from __future__ import annotations

import hashlib
import math
import re
import tomllib
from dataclasses import dataclass, field
from fractions import Fraction
from pathlib import Path
from typing import Any

import numpy as np
from numpy.typing import NDArray

from .. import units as _units
from ..vectors.catalogue import CATALOGUE

__all__ = ["RequirementsError", "Tolerance", "FunctionRequirement", "Requirements",
           "FORMAT", "parse_tolerance", "load_requirements", "parse_requirements"]

FORMAT = "airdata-requirements-1"

_SPECS = {s.name: s for s in CATALOGUE}
_TOP_KEYS = {"format", "title", "function"}
_FUNC_KEYS = {"envelope", "error", "note"}
_MAX_TEXT = 200


class RequirementsError(ValueError):
    """A requirements file is unreadable or says something this airdata cannot judge."""


def _short(text: object) -> str:
    """``repr`` of an untrusted value, length-bounded for messages."""
    s = repr(text)
    return s if len(s) <= 60 else s[:57] + "...'"


@dataclass(frozen=True)
class Tolerance:
    """An allowed error ``relative * |reference| + absolute`` (SI).

    Attributes
    ----------
    text : str
        As written in the file (e.g. ``"0.05 % of reading + 0.5 ft"``).
    relative : float
        Fraction of the reading (0.1 % -> 0.001), >= 0.
    absolute : float
        Absolute part in the output's SI unit, >= 0.
    unit : str
        Unit the requirement is written in (the absolute part's unit; the output's SI
        unit when only a relative part is given).
    """

    text: str
    relative: float
    absolute: float
    unit: str

    def allowed(self, reference: NDArray[np.float64]) -> NDArray[np.float64]:
        """Allowed error (SI) at each reference value."""
        return self.relative * np.abs(reference) + self.absolute


@dataclass(frozen=True)
class FunctionRequirement:
    """The requirement of one function.

    Attributes
    ----------
    function : str
        Reference name.
    envelope : dict
        Input name -> (low, high) in SI, inclusive; inputs not named are unrestricted.
    envelope_text : dict
        Input name -> the two limits as written.
    errors : dict
        Output name -> :class:`Tolerance`; outputs not named are not judged by value.
    note : str
        Free text from the file (shown escaped in reports).
    """

    function: str
    envelope: dict[str, tuple[float, float]]
    envelope_text: dict[str, tuple[str, str]]
    errors: dict[str, Tolerance]
    note: str = ""


@dataclass
class Requirements:
    """A parsed requirements file."""

    path: str
    sha256: str
    title: str
    functions: dict[str, FunctionRequirement] = field(default_factory=dict)


_NUM = r"[+-]?(?:\d+(?:\.\d*)?|\.\d+)(?:[eE][+-]?\d+)?"
_PCT = re.compile(rf"^({_NUM})\s*%(?:\s*of\s+reading)?$")
_ABS = re.compile(rf"^({_NUM})\s*(\S.*)?$")
#: The "+" between two terms, not the sign of an exponent ("1e+2 ft").
_PLUS = re.compile(r"(?<![0-9.][eE])\+")


def _unit_dimension(unit: str) -> str | None:
    try:
        return _units.dimension(unit)
    except ValueError:
        return None


def _canonical(unit: str) -> str:
    """The unit's name in :mod:`airdata.units` (``kts`` -> ``kt``, ``mb`` -> ``mbar``,
    ``C`` -> ``degC``, ``feet`` -> ``ft``); an unknown spelling is returned unchanged."""
    try:
        return _units.normalize_unit(unit)
    except ValueError:
        return unit


def _compatible(unit: str, si_unit: str) -> bool:
    """Can a quantity of ``si_unit`` be written in ``unit``?"""
    if unit == si_unit:
        return True
    d_si, d = _unit_dimension(si_unit), _unit_dimension(unit)
    return d_si is not None and d == d_si


def _scale(unit: str, si_unit: str) -> float:
    """SI per ``unit`` for a difference (no offset: 1 degC of error is 1 K)."""
    if unit == si_unit or _unit_dimension(unit) is None:
        return 1.0
    return float(_units.UNITS[unit][1])


def parse_tolerance(text: str, si_unit: str, where: str = "error") -> Tolerance:
    """Parse ``"1 ft"``, ``"0.1 %"``, ``"0.05 % of reading + 0.5 ft"``.

    Parameters
    ----------
    text : str
        The requirement as written.
    si_unit : str
        SI unit of the output it applies to (``"m"``, ``"m/s"``, ``"Pa"``, ``"K"``, ``"1"``).
    where : str
        Prefix of error messages (file, key and line).

    Raises
    ------
    RequirementsError
        Empty, negative or non-finite numbers, unknown units, a unit of another
        dimension than the output's, two terms of the same kind.
    """
    if not isinstance(text, str) or not text.strip():
        raise RequirementsError(f"{where}: expected a text such as \"1 ft\", \"0.1 %\" or "
                                f"\"0.05 % of reading + 0.5 ft\", got {_short(text)}")
    rel: float | None = None
    ab: float | None = None
    unit = si_unit
    for term in (t.strip() for t in _PLUS.split(text)):
        m = _PCT.match(term)
        if m:
            if rel is not None:
                raise RequirementsError(f"{where}: two relative terms in {_short(text)}")
            rel = float(m.group(1)) / 100.0
            value = rel
        else:
            m = _ABS.match(term)
            if not m:
                raise RequirementsError(f"{where}: cannot read {_short(term)} in "
                                        f"{_short(text)}: expected NUMBER UNIT or NUMBER %")
            if ab is not None:
                raise RequirementsError(f"{where}: two absolute terms in {_short(text)}")
            u = (m.group(2) or "").strip()
            if not u:
                if si_unit != "1":
                    raise RequirementsError(
                        f"{where}: {_short(term)} has no unit; the output is in {si_unit}: "
                        f"write it with a unit (e.g. {', '.join(_suggest(si_unit))})")
                u = "1"
            u = _canonical(u)
            if not _compatible(u, si_unit):
                known = _unit_dimension(u)
                why = "an unknown unit" if known is None else f"a {known} unit"
                raise RequirementsError(
                    f"{where}: unit {_short(u)} is {why}; the output is in {si_unit}: use "
                    f"one of {', '.join(_suggest(si_unit))}")
            unit = u
            ab = float(m.group(1)) * _scale(u, si_unit)
            value = float(m.group(1))
        if not math.isfinite(value) or value < 0.0:
            raise RequirementsError(f"{where}: {_short(term)} must be a finite number >= 0")
    if rel is None and ab is None:  # pragma: no cover - the loop always sets one
        raise RequirementsError(f"{where}: nothing allowed in {_short(text)}")
    if (rel or 0.0) == 0.0 and (ab or 0.0) == 0.0:
        raise RequirementsError(f"{where}: {_short(text)} allows no error at all; use the "
                                "reference-equivalent level (no --requirements) for that")
    return Tolerance(text.strip(), rel or 0.0, ab or 0.0, unit)


def _suggest(si_unit: str) -> list[str]:
    d = _unit_dimension(si_unit)
    return _units.units_of(d) if d else [si_unit]


def _parse_limit(value: Any, si_unit: str, where: str) -> tuple[float, str]:
    """One envelope limit: a number (in SI) or ``"NUMBER UNIT"``."""
    if isinstance(value, bool):
        raise RequirementsError(f"{where}: expected a number or \"NUMBER UNIT\", got "
                                f"{_short(value)}")
    if isinstance(value, (int, float)):
        v = float(value)
        text = f"{value} {si_unit}".strip()
    elif isinstance(value, str):
        m = _ABS.match(value.strip())
        if not m:
            raise RequirementsError(f"{where}: cannot read {_short(value)}: expected "
                                    "NUMBER UNIT")
        u = _canonical((m.group(2) or "").strip() or si_unit)
        if si_unit == "" and u in ("", "1"):
            u = ""
        if si_unit and not _compatible(u, si_unit):
            known = _unit_dimension(u)
            why = "an unknown unit" if known is None else f"a {known} unit"
            raise RequirementsError(f"{where}: unit {_short(u)} is {why}; the input is in "
                                    f"{si_unit}: use one of {', '.join(_suggest(si_unit))}")
        num = float(m.group(1))
        if u != si_unit and _unit_dimension(u):
            # exact (Fraction) conversion, rounded once: "-56.5 degC" is 216.65 K, the
            # double nearest to the limit as written (inclusive comparisons depend on it)
            _, scale, offset = _units.UNITS[u]
            v = float(Fraction(m.group(1)) * scale + offset)
        else:
            v = num
        text = value.strip()
    else:
        raise RequirementsError(f"{where}: expected a number or \"NUMBER UNIT\", got "
                                f"{_short(value)}")
    if not math.isfinite(v):
        raise RequirementsError(f"{where}: {_short(value)} is not finite")
    return v, text


class _Lines:
    """Find the line of a key in the TOML text (tomllib gives no line numbers)."""

    _HEAD = re.compile(r"^\s*\[\s*([^\[\]]+?)\s*\]\s*(?:#.*)?$")
    _KEY = re.compile(r"^\s*([A-Za-z0-9_.\-\s\"']+?)\s*=")

    def __init__(self, text: str) -> None:
        self.keys: dict[str, int] = {}
        table = ""
        for n, line in enumerate(text.splitlines(), start=1):
            h = self._HEAD.match(line)
            if h:
                table = self._norm(h.group(1))
                self.keys.setdefault(table, n)
                continue
            k = self._KEY.match(line)
            if k:
                key = self._norm(k.group(1))
                full = f"{table}.{key}" if table else key
                self.keys.setdefault(full, n)
                parts = full.split(".")
                for i in range(1, len(parts)):
                    self.keys.setdefault(".".join(parts[:i]), n)

    @staticmethod
    def _norm(key: str) -> str:
        return ".".join(p.strip().strip("\"'") for p in key.split("."))

    def line(self, key: str) -> int | None:
        """Line of ``key`` (dotted), of its closest parent otherwise."""
        parts = key.split(".")
        while parts:
            n = self.keys.get(".".join(parts))
            if n is not None:
                return n
            parts.pop()
        return None


def parse_requirements(text: str, path: str = "<requirements>") -> Requirements:
    """Parse the text of a requirements file (see :func:`load_requirements`)."""
    lines = _Lines(text)

    def at(key: str) -> str:
        n = lines.line(key)
        return f"{path}: key {key!r}" + (f" (line {n})" if n else "")

    try:
        doc = tomllib.loads(text)
    except tomllib.TOMLDecodeError as exc:
        raise RequirementsError(f"{path}: not valid TOML: {exc}") from None
    for key in doc:
        if key not in _TOP_KEYS:
            raise RequirementsError(f"{at(key)}: unknown key; known keys are "
                                    f"{', '.join(sorted(_TOP_KEYS))}")
    if doc.get("format") != FORMAT:
        raise RequirementsError(f"{at('format')}: format must be {FORMAT!r}, got "
                                f"{_short(doc.get('format'))}")
    title = doc.get("title", "")
    if not isinstance(title, str):
        raise RequirementsError(f"{at('title')}: expected a text")
    funcs = doc.get("function")
    if not isinstance(funcs, dict) or not funcs:
        raise RequirementsError(f"{at('function')}: no [function.NAME] table; the file must "
                                "state at least one function's requirement")
    req = Requirements(path, hashlib.sha256(text.encode()).hexdigest(), title[:_MAX_TEXT])
    for name, body in funcs.items():
        key = f"function.{name}"
        spec = _SPECS.get(name)
        if spec is None:
            raise RequirementsError(f"{at(key)}: unknown function {_short(name)}; known: "
                                    f"{', '.join(_SPECS)}")
        if not isinstance(body, dict):
            raise RequirementsError(f"{at(key)}: expected a table")
        for k in body:
            if k not in _FUNC_KEYS:
                raise RequirementsError(f"{at(key + '.' + k)}: unknown key {_short(k)}; known "
                                        f"keys are {', '.join(sorted(_FUNC_KEYS))}")
        args = {a.name: a.unit for a in spec.args}
        outs = dict(spec.outputs)
        env: dict[str, tuple[float, float]] = {}
        env_text: dict[str, tuple[str, str]] = {}
        envelope = body.get("envelope", {})
        if not isinstance(envelope, dict):
            raise RequirementsError(f"{at(key + '.envelope')}: expected a table of "
                                    "INPUT = [LOW, HIGH]")
        for arg, lim in envelope.items():
            k = f"{key}.envelope.{arg}"
            if arg not in args:
                raise RequirementsError(f"{at(k)}: {name} has no input {_short(arg)}; its "
                                        f"inputs are {', '.join(args)}")
            pair = lim if isinstance(lim, list) else [lim, lim]
            if len(pair) != 2:
                raise RequirementsError(f"{at(k)}: expected [LOW, HIGH] or one value")
            lo, lo_t = _parse_limit(pair[0], args[arg], at(k))
            hi, hi_t = _parse_limit(pair[1], args[arg], at(k))
            if not lo <= hi:
                raise RequirementsError(f"{at(k)}: empty envelope: low {lo_t} is above high "
                                        f"{hi_t}")
            env[arg] = (lo, hi)
            env_text[arg] = (lo_t, hi_t)
        errors_t = body.get("error", {})
        if not isinstance(errors_t, dict) or not errors_t:
            raise RequirementsError(f"{at(key + '.error')}: expected at least one "
                                    "error.OUTPUT = \"ALLOWED\"")
        errors: dict[str, Tolerance] = {}
        for out, tol in errors_t.items():
            k = f"{key}.error.{out}"
            if out not in outs:
                raise RequirementsError(f"{at(k)}: {name} has no output {_short(out)}; its "
                                        f"outputs are {', '.join(outs)}")
            errors[out] = parse_tolerance(tol, outs[out], at(k))
        note = body.get("note", "")
        if not isinstance(note, str):
            raise RequirementsError(f"{at(key + '.note')}: expected a text")
        req.functions[name] = FunctionRequirement(name, env, env_text, errors,
                                                  note[:_MAX_TEXT])
    return req


def load_requirements(path: str | Path) -> Requirements:
    """Read and check a requirements file.

    Parameters
    ----------
    path : str or Path
        The TOML file (UTF-8).

    Returns
    -------
    Requirements
        Per function its envelope (SI) and allowed errors, and the file's SHA-256.

    Raises
    ------
    RequirementsError
        The file is missing or not UTF-8 TOML, or holds an unknown key, function,
        input or output, a bad unit or number, or an empty envelope; the message names
        the key and its line.
    """
    p = Path(path)
    try:
        data = p.read_bytes()
    except OSError as exc:
        raise RequirementsError(f"{p}: cannot read the requirements file: "
                                f"{exc.strerror}") from None
    try:
        text = data.decode("utf-8")
    except UnicodeDecodeError as exc:
        raise RequirementsError(f"{p}: not UTF-8 (byte {exc.start})") from None
    req = parse_requirements(text, str(p))
    req.sha256 = hashlib.sha256(data).hexdigest()
    return req
