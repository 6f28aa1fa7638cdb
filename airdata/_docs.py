"""The parameter text that many docstrings share, in one place.

A docstring names a shared entry as ``{name}`` on a line of its own (indented like the
other parameters); :func:`fill_doc` puts the text in when the module is imported, so
``help()`` and the documentation show it in full.
"""

from __future__ import annotations

from typing import TypeVar

__all__ = ["PARAMETERS", "fill_doc"]

T = TypeVar("T")

#: Shared entry -> its text, as it appears under "Parameters" (or "Attributes") with the
#: first line unindented.
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

_FILLED = {key: text.replace("\n", "\n    ") for key, text in PARAMETERS.items()}


def fill_doc(obj: T) -> T:
    """Put the shared parameter text into the ``{name}`` fields of ``obj``'s docstring."""
    doc = getattr(obj, "__doc__", None)
    if doc:
        obj.__doc__ = doc.format_map(_FILLED)  # type: ignore[attr-defined]
    return obj
