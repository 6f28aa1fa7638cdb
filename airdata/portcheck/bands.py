"""Bands and engineering units of a port check: the altitude, Mach and speed bands a
function's errors are broken down into, and the engineering units (ft, kt, hPa) reports
show SI values in.
"""

from __future__ import annotations

import math
from dataclasses import dataclass
from typing import Any

import numpy as np
from numpy.typing import NDArray

from .. import units as _units
from ..vectors.catalogue import CATALOGUE
from .suite import FunctionCases

__all__ = ["Band", "DISPLAY_UNIT", "ALT_EDGES_FT", "MACH_EDGES", "SPEED_EDGES_KT", "display",
           "to_unit", "eng_inputs", "json_float", "axes", "bands", "SPECS"]

#: SI unit -> engineering unit used in reports.
DISPLAY_UNIT = {"m": "ft", "m/s": "kt", "Pa": "hPa", "K": "K", "1": "1", "kg/m3": "kg/m3"}

SPECS = {s.name: s for s in CATALOGUE}

#: Pressure-altitude band edges in ft: the ICAO layer bases (36 089, 65 617, 104 987 ft)
#: and round figures between them.
ALT_EDGES_FT = (-math.inf, 0.0, 10000.0, 20000.0, 30000.0, 36089.0, 50000.0, 65617.0,
                104987.0, math.inf)
MACH_EDGES = (0.0, 0.3, 0.6, 0.8, 1.0, 1.5, math.inf)
#: Speed band edges in kt; 661.5 kt is a0 (340.294 m/s), the subsonic/supersonic switch
#: of CAS.
SPEED_EDGES_KT = (0.0, 100.0, 200.0, 300.0, 450.0, 661.5, math.inf)


def display(si_unit: str) -> str:
    """Engineering unit of an SI unit (the SI unit itself when no other is used)."""
    return DISPLAY_UNIT.get(si_unit, si_unit)


def to_unit(v: float, si_unit: str, unit: str, difference: bool = False) -> float:
    """``v`` (SI) in ``unit``; ``difference`` ignores offsets (an error of 1 K is 1 degC)."""
    if unit == si_unit or si_unit not in _units.UNITS or unit not in _units.UNITS:
        return float(v)
    if difference:
        return float(v) / float(_units.UNITS[unit][1])
    return float(_units.from_si(v, unit))


def eng_inputs(fc: FunctionCases, i: int) -> dict[str, str]:
    """Inputs of case ``i`` in engineering units, as text."""
    spec = SPECS.get(fc.name)
    units = {a.name: a.unit for a in spec.args} if spec else {}
    out = {}
    for j, (name, kind) in enumerate(fc.inputs):
        v = float(fc.x[i, j])
        if kind == "flag":
            out[name] = str(int(v)) if math.isfinite(v) else repr(v)
            continue
        si = units.get(name, "")
        u = display(si)
        unit = "" if u in ("1", "") else f" {u}"
        out[name] = f"{to_unit(v, si, u):.6g}{unit}" if math.isfinite(v) else repr(v)
    return out


@dataclass
class Band:
    """One band of one output: how many cases were judged in it and how they did."""

    axis: str
    label: str
    judged: int = 0
    failed: int = 0
    worst_error: float = 0.0
    margin: float = 0.0

    def as_dict(self) -> dict[str, Any]:
        """JSON-ready form."""
        return {"axis": self.axis, "band": self.label, "judged": self.judged,
                "failed": self.failed, "worst_error": json_float(self.worst_error),
                "margin": json_float(self.margin)}


def json_float(v: float) -> float | str:
    if math.isnan(v):
        return "nan"
    if math.isinf(v):
        return "inf" if v > 0 else "-inf"
    return float(v)


def axes(fc: FunctionCases) -> list[tuple[str, NDArray[np.float64], tuple[float, ...],
                                           str]]:
    """Band axes of a function: (name, value per case, edges, unit)."""
    import airdata

    axes = []
    names = [n for n, _ in fc.inputs]
    col = {n: fc.x[:, j] for j, n in enumerate(names)}
    outs = {n: fc.expected[:, j] for j, n in enumerate(fc.outputs)}
    alt = None
    if "ps" in col:
        with np.errstate(all="ignore"):
            alt = np.asarray(airdata.pressure_altitude(np.where(col["ps"] > 0, col["ps"],
                                                                np.nan), strict=False))
        axes_name = "pressure altitude (of ps)"
    else:
        for n in ("h", "z", "elevation", "ceiling"):
            if n in col:
                alt, axes_name = col[n], f"altitude ({n})"
                break
    if alt is not None:
        axes.append((axes_name, np.asarray(alt) / _units.FT, ALT_EDGES_FT, "ft"))
    if "mach" in col:
        axes.append(("Mach (input)", col["mach"], MACH_EDGES, ""))
    elif "mach" in outs:
        axes.append(("Mach (reference output)", outs["mach"], MACH_EDGES, ""))
    speed = next((n for n in ("cas", "eas", "tas", "cas_limit") if n in col), None)
    if speed is not None:
        axes.append((f"{speed} (input)", col[speed] / _units.KT, SPEED_EDGES_KT, "kt"))
    else:
        so = next((n for n in ("cas", "eas", "tas") if n in outs), None)
        if so is not None:
            axes.append((f"{so} (reference output)", outs[so] / _units.KT, SPEED_EDGES_KT,
                         "kt"))
    return axes


def _edge(v: float, unit: str) -> str:
    if math.isinf(v):
        return "inf" if v > 0 else "-inf"
    return f"{v:g}"


def bands(fc: FunctionCases, judged: NDArray[np.bool_], bad: NDArray[np.bool_],
           err: NDArray[np.float64], ratio: NDArray[np.float64]) -> list[Band]:
    out: list[Band] = []
    for name, values, edges, unit in axes(fc):
        for lo, hi in zip(edges[:-1], edges[1:], strict=True):
            with np.errstate(invalid="ignore"):
                m = judged & (values >= lo) & (values < hi)
            if not m.any():
                continue
            label = f"{_edge(lo, unit)} .. {_edge(hi, unit)} {unit}".rstrip()
            out.append(Band(name, label, int(m.sum()), int((bad & m).sum()),
                            float(err[m].max()), float(ratio[m].max())))
    tags = sorted({t for ts in fc.tags for t in ts})
    for t in tags:
        m = judged & np.array([t in ts for ts in fc.tags], dtype=bool)
        if m.any():
            out.append(Band("tag", t, int(m.sum()), int((bad & m).sum()),
                            float(err[m].max()), float(ratio[m].max())))
    return out
