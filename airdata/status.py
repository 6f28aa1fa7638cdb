"""Status codes shared by the Python reference, the golden vectors and the C port.

The numeric values are part of the public contract: the vectors store them and the C
port returns them.  Never renumber a member; only append new ones.
"""

from __future__ import annotations

from enum import IntEnum

__all__ = ["Status", "DomainError"]


class Status(IntEnum):
    """Outcome of one evaluation of a catalogue function.

    Members
    -------
    OK
        Inputs valid, outputs computed.
    INVALID_INPUT
        An input is NaN, infinite, or has a sign the quantity cannot have (zero or
        negative pressure or temperature, negative Mach number or speed).
    OUT_OF_RANGE
        Every input is a proper number but one of them, or a quantity derived from
        them (for example the Mach number reached by a calibrated airspeed at a given
        static pressure), lies outside the function's valid range.
    NO_CONVERGENCE
        An iterative solver did not meet its stopping rule within its fixed iteration
        bound.  The bound is proven sufficient over the valid range, so this status is
        reserved for ports that get the solver wrong; the reference never returns it.
    IMPACT_PRESSURE_ZEROED
        ``air_data`` only: the measured impact pressure was negative but within the
        sensor noise band, and was treated as zero (aircraft at rest).  All outputs are
        valid.  This is a flag, not an error.
    """

    OK = 0
    INVALID_INPUT = 1
    OUT_OF_RANGE = 2
    NO_CONVERGENCE = 3
    IMPACT_PRESSURE_ZEROED = 4


class DomainError(ValueError):
    """An input lies outside a function's domain.

    Attributes
    ----------
    argument : str
        Name of the offending argument (or of the derived quantity).
    value : float
        The first offending value.
    index : tuple of int or None
        Its index in the broadcast input, ``None`` for scalar input.
    valid : str
        The valid range, in words, with units.
    status : Status
        ``INVALID_INPUT`` or ``OUT_OF_RANGE``.
    """

    def __init__(
        self,
        argument: str,
        value: float,
        index: tuple[int, ...] | None,
        valid: str,
        status: Status,
    ) -> None:
        self.argument = argument
        self.value = value
        self.index = index
        self.valid = valid
        self.status = status
        where = "" if index is None else f" at index {index[0] if len(index) == 1 else index}"
        kind = "invalid" if status == Status.INVALID_INPUT else "out of range"
        super().__init__(f"{argument} = {value!r}{where} is {kind}: valid range is {valid}")
