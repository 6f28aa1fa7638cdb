"""Total and static air temperature, TMP-1 of docs/equations.md.

A total-air-temperature probe brings the flow partly to rest; its reading is
TAT = SAT (1 + recovery (gamma - 1)/2 M^2), with recovery = 1 for an ideal probe.
"""

from __future__ import annotations

from . import _domains as dom
from ._docs import fill_doc
from ._inputs import ArrayLike, FloatOrArray, Inputs

__all__ = ["sat_from_tat", "tat_from_sat"]


@fill_doc
def sat_from_tat(tat: ArrayLike, mach: ArrayLike, recovery: ArrayLike = 1.0, *,
                 strict: bool = True) -> FloatOrArray:
    """Static air temperature from the total-air-temperature probe reading.

    {Parameters: tat, mach, recovery, strict; broadcast}

    Returns
    -------
    float or ndarray
        Static air temperature, K.

    Raises
    ------
    DomainError
        Bad or out-of-range ``tat``, ``mach`` or ``recovery``.

    Notes
    -----
    TMP-1 solved for SAT: sat = tat / (1 + 0.2 recovery M^2).

    References
    ----------
    NACA Report 1135 (1953), eq. 43 (stagnation temperature, from memory).
    """
    args = Inputs(strict, tat=(tat, dom.TEMPERATURE), mach=(mach, dom.MACH),
                  recovery=(recovery, dom.RECOVERY))
    m = args["mach"]
    return args.finish(args["tat"] / (1.0 + 0.2 * args["recovery"] * (m * m)))


@fill_doc
def tat_from_sat(sat: ArrayLike, mach: ArrayLike, recovery: ArrayLike = 1.0, *,
                 strict: bool = True) -> FloatOrArray:
    """Total-air-temperature probe reading from static air temperature.

    {Parameters: sat, mach, recovery, strict; broadcast}

    Returns
    -------
    float or ndarray
        Total air temperature, K.

    Raises
    ------
    DomainError
        Bad or out-of-range ``sat``, ``mach`` or ``recovery``.

    Notes
    -----
    TMP-1: tat = sat (1 + 0.2 recovery M^2).

    References
    ----------
    NACA Report 1135 (1953), eq. 43 (stagnation temperature, from memory).
    """
    args = Inputs(strict, sat=(sat, dom.TEMPERATURE), mach=(mach, dom.MACH),
                  recovery=(recovery, dom.RECOVERY))
    m = args["mach"]
    return args.finish(args["sat"] * (1.0 + 0.2 * args["recovery"] * (m * m)))
