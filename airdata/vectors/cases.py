"""Which cases the golden vectors hold: the case seeds of every function.

Case generation is deterministic: fixed sweeps (``numpy.linspace``/``geomspace``), the
seams of the model (layer bases, M = 1, CAS = a0, qc/ps at M = 1) at 0, +-1 and +-4 ulp
(``math.nextafter``) and in windows of relative offsets, the ends of every range, tiny
values, derived limits and invalid inputs.  The generic kinds are applied by
:func:`airdata.vectors.build.generate_seeds` to every argument of the function table
(:mod:`airdata.vectors.catalogue`); this module holds the tags, the offsets, the
per-argument seams and nominal values; :mod:`airdata.vectors.seeds` the
function-specific seeds that the table names (``FunctionSpec.extra``).
"""

from __future__ import annotations

import math
from dataclasses import dataclass

import numpy as np
from numpy.typing import NDArray

from ..profiles import Profile

F64 = NDArray[np.float64]

#: Tags a case may carry, with their meaning (also listed in the schema).
TAGS: dict[str, str] = {
    "sweep": "point of the dense sweep of the valid range",
    "layer-base": "an input at (or a few ulp from) a layer base of the atmosphere model",
    "sonic": "at (or a few ulp from) the M = 1 switch of the pitot relation",
    "ulp-offset": "an input moved by 1 or 4 ulp from a seam or a range end",
    "range-end": "an input at (or a few ulp from) an end of its valid range",
    "derived-limit": "a quantity derived from the inputs near the end of its valid range",
    "supersonic": "the supersonic (Rayleigh pitot) branch",
    "tiny": "a tiny but valid input (Mach 1e-8, qc 1e-6 Pa, ...)",
    "extreme": "an extreme input or output of the valid range",
    "invalid": "the expected status is an error",
    "nan": "an input is NaN",
    "infinite": "an input is infinite",
    "zero": "an input is zero or negative zero",
    "negative": "an input is negative",
    "out-of-range": "an input or derived quantity outside its valid range",
    "argument-order": "two bad inputs: the first in argument order decides the status",
    "with-setting": "air_data with an altimeter setting",
    "no-setting": "air_data without an altimeter setting (setting is NaN and ignored)",
    "zeroed": "air_data: a small negative impact pressure read as zero",
    "noise-band": "air_data: a non-default noise band",
    "subnormal": "an input or expected output is nonzero and below the normal binary64 range "
                 "(2**-1022): a target that flushes subnormals to zero skips it",
    "seam-window": "an input or derived quantity moved from a switch, layer base or limit by a "
                   "relative offset between 1e-15 and 1e-3",
    "crossover": "at (or a few ulp from) the pressure where a CAS limit and a Mach limit "
                 "coincide: the maximum operating speed switches from one to the other",
}

#: Tags added after suite 1.0.0: optional in a file's tag table (format version 1 stays
#: readable both ways).
LATER_TAGS = frozenset({"subnormal", "seam-window"})

_ULPS = (-4, -1, 1, 4)


def ulp_step(x: float, n: int) -> float:
    """``x`` moved by ``n`` ulps (``math.nextafter`` applied ``|n|`` times)."""
    target = math.inf if n > 0 else -math.inf
    for _ in range(abs(n)):
        x = math.nextafter(x, target)
    return x


def around(x: float) -> list[tuple[float, bool]]:
    """``x`` and its neighbours at -4, -1, +1, +4 ulp; flag says 'moved'."""
    return [(x, False)] + [(ulp_step(x, n), True) for n in _ULPS]


#: Relative offsets of a seam window, log-spaced from 1e-15 to 1e-3 (both sides are
#: taken): a constant typed with 4 or 6 significant digits, or off by 1e-6 relative,
#: or a binary32 value in a binary64 build, moves a switch by one of these.
WINDOW = (1e-15, 1e-14, 1e-13, 1e-12, 1e-11, 1e-10, 1e-9, 1e-8, 1e-7, 1e-6, 1e-5, 1e-4,
          1e-3)


#: Relative offsets of the window around a range end (suite 2.1.0): fewer than a seam's,
#: since every argument of every function has two ends; 1e-7 and 1e-5 are the binary32
#: spacing and a constant typed with 6 digits, 1e-3 one typed with 4.
RANGE_WINDOW = (1e-15, 1e-12, 1e-9, 1e-7, 1e-5, 1e-3)


def window(x: float, offsets: tuple[float, ...] = WINDOW) -> list[float]:
    """``x`` moved by every relative offset of ``offsets`` (default :data:`WINDOW`), below
    and above (an offset that rounds back onto ``x`` is dropped; for ``x = 0`` the
    offsets are absolute)."""
    out = []
    for r in offsets:
        for sign in (-1.0, 1.0):
            v = x * (1.0 + sign * r) if x != 0.0 else sign * r
            if v != x:
                out.append(v)
    return out



@dataclass(frozen=True)
class CaseSeed:
    """Inputs of one case (by argument name) and the tags saying why it exists."""

    inputs: dict[str, float]
    tags: tuple[str, ...]



def alt_seams(p: Profile) -> list[tuple[float, str]]:
    return [(b, "layer-base") for b in p.layer_base]


def p_seams(p: Profile) -> list[tuple[float, str]]:
    return [(b, "layer-base") for b in p.base_pressure]


def z_seams(p: Profile) -> list[tuple[float, str]]:
    return [(p.r0 * b / (p.r0 - b), "layer-base") for b in p.layer_base]


def mach_seams(p: Profile) -> list[tuple[float, str]]:
    return [(1.0, "sonic")]


def cas_seams(p: Profile) -> list[tuple[float, str]]:
    return [(p.a0, "sonic")]


def nominal_p(p: Profile) -> list[float]:
    return [p.p0, 54019.9, 4000.0, 12.0]
