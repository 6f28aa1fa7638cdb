"""The text that many docstrings share, in one place.

A docstring names a shared entry as ``{name}`` on a line of its own (indented like the
other entries of its section), or several as ``{a, b, c}``, which stand one below the
other.  A whole section made of shared entries is one line, ``{Parameters: a, b; c}``
(likewise ``Attributes``, ``Returns``, ``Raises``): the heading, its underline, and the
entries, a blank line where ``;`` stands.  :func:`fill_doc` puts the text in when the
module is imported, so ``help()`` and the documentation show it in full.  An entry's
text is what stands under "Parameters" (or "Attributes"), "Returns" or "Raises", with
the first line unindented.
"""

from __future__ import annotations

import re
from typing import TypeVar

__all__ = ["PARAMETERS", "RETURNS", "RAISES", "fill_doc"]

T = TypeVar("T")

#: Shared entry -> its text under "Parameters" (or "Attributes").
PARAMETERS: dict[str, str] = {
    "broadcast": (
        "Inputs broadcast against each other like a numpy ufunc; scalar inputs give Python\n"
        "floats."
    ),
    "cas_limit": (
        "cas_limit : float or array_like\n"
        "    Calibrated airspeed limit, m/s, in (0, 10 a0]."
    ),
    "cl_max": (
        "cl_max : float or array_like\n"
        "    Maximum lift coefficient, in (0, 10]."
    ),
    "h": (
        "h : float or array_like\n"
        "    Geopotential altitude, m, in [-5000, 84852]."
    ),
    "load_factor": (
        "load_factor : float or array_like, optional\n"
        "    Load factor, in (0, 10]; default 1."
    ),
    "mach": (
        "mach : float or array_like\n"
        "    Mach number, in [0, 10]."
    ),
    "mach_limit": (
        "mach_limit : float or array_like\n"
        "    Mach limit, in (0, 10]."
    ),
    "precision": (
        "precision : {\"double\", \"single\"}, optional\n"
        "    Which build of the port to run."
    ),
    "profile": (
        "profile : Profile or str, optional\n"
        "    Constants profile, ``\"icao\"`` (default) or ``\"us1976\"``."
    ),
    "profile_R": (
        "profile : Profile or str, optional\n"
        "    Constants profile (supplies R)."
    ),
    "profile_name": (
        "profile : str\n"
        "    Name of the constants profile used."
    ),
    "profile_p0_a0": (
        "profile : Profile or str, optional\n"
        "    Constants profile (supplies p0 and a0)."
    ),
    "profile_p0_a0_range": (
        "profile : Profile or str, optional\n"
        "    Constants profile (supplies p0, a0 and the pressure range)."
    ),
    "profile_r0": (
        "profile : Profile or str, optional\n"
        "    Constants profile (supplies r0 = 6 356 766 m)."
    ),
    "profile_range": (
        "profile : Profile or str, optional\n"
        "    Constants profile; used only for the static pressure range."
    ),
    "profile_rho0_p0_a0_range": (
        "profile : Profile or str, optional\n"
        "    Constants profile (supplies rho0, p0, a0 and the pressure range)."
    ),
    "ps": (
        "ps : float or array_like\n"
        "    Static pressure, Pa, in [0.3734, 177687] Pa (icao)."
    ),
    "recovery": (
        "recovery : float or array_like, optional\n"
        "    Probe recovery factor, in [0, 1]; 1 (default) for full recovery."
    ),
    "sat": (
        "sat : float or array_like\n"
        "    Static air temperature, K, in [50, 5000]."
    ),
    "strict": (
        "strict : bool, optional\n"
        "    Raise on bad input (default) or give NaN for just those elements."
    ),
    "tat": (
        "tat : float or array_like\n"
        "    Total air temperature, K, in [50, 5000]."
    ),
    "weight": (
        "weight : float or array_like\n"
        "    Aircraft weight, N, in (0, 1e7]."
    ),
    "wing_area": (
        "wing_area : float or array_like\n"
        "    Reference wing area, m2, in (0, 2000]."
    ),
}

#: Shared entry -> its text under "Returns".
RETURNS: dict[str, str] = {
    "out_cas": (
        "float or ndarray\n"
        "    Calibrated airspeed, m/s."
    ),
    "out_figure": (
        "matplotlib.figure.Figure\n"
        "    The figure, not attached to pyplot (no backend is selected or changed)."
    ),
    "out_impact_pressure": (
        "float or ndarray\n"
        "    Impact pressure, Pa."
    ),
    "out_mach": (
        "float or ndarray\n"
        "    Mach number."
    ),
}

#: Shared entry -> its text under "Raises".
RAISES: dict[str, str] = {
    "bad_mach_ps": (
        "DomainError\n"
        "    Bad or out-of-range ``mach`` or ``ps``."
    ),
    "bad_ps_limits": (
        "DomainError\n"
        "    Bad or out-of-range ``ps``, ``cas_limit`` or ``mach_limit``."
    ),
    "bad_stall_mach": (
        "DomainError\n"
        "    Bad or out-of-range input, stall EAS above 4000 m/s or stall Mach above 10."
    ),
    "no_matplotlib": (
        "ImportError\n"
        "    matplotlib is not installed (it is an optional extra)."
    ),
}


def _indent(text: str) -> str:
    """``text`` with every line after the first indented by 4 spaces (blank lines kept
    blank): an entry as it stands in a module-level docstring."""
    return "\n".join(line if i == 0 or not line else "    " + line
                     for i, line in enumerate(text.split("\n")))


_ENTRIES: dict[str, str] = {}
for _table in (PARAMETERS, RETURNS, RAISES):
    if _ENTRIES.keys() & _table.keys():
        raise ValueError(f"entries named twice: {sorted(_ENTRIES.keys() & _table.keys())}")
    _ENTRIES.update(_table)

#: Names of entries, comma-separated (a long list may go on over lines).
_NAMES = r"[a-z][A-Za-z0-9_]*(?:,\s+[a-z][A-Za-z0-9_]*)*"

#: A field: ``{name}`` or ``{a, b, c}`` (names of entries; other braces, such as a
#: numpydoc value set ``{"rms", "sd"}``, are text).
_FIELD = re.compile(r"\{(" + _NAMES + r")\}")

#: A whole section: ``{Heading: a, b; c}``.
_SECTION = re.compile(r"\{(Parameters|Attributes|Returns|Raises): (" + _NAMES + r"(?:;\s+"
                      + _NAMES + r")*)\}")


def _expand_section(field: re.Match[str]) -> str:
    """The section a field names: heading, underline, entries (a blank line between the
    groups that ``;`` separates)."""
    heading = field.group(1)
    groups = ("\n".join(_ENTRIES[name] for name in re.split(r",\s+", group))
              for group in re.split(r";\s+", field.group(2)))
    return _indent(f"{heading}\n{'-' * len(heading)}\n" + "\n\n".join(groups))


def _expand(field: re.Match[str]) -> str:
    """The text of the entries a field names, one below the other (KeyError for an
    unknown name)."""
    return _indent("\n".join(_ENTRIES[name] for name in re.split(r",\s+", field.group(1))))


def fill_doc(obj: T) -> T:
    """Put the shared text into the fields of ``obj``'s docstring (sections first)."""
    doc = getattr(obj, "__doc__", None)
    if doc:
        obj.__doc__ = _FIELD.sub(_expand, _SECTION.sub(_expand_section, doc))  # type: ignore[attr-defined]
    return obj
