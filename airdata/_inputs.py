"""Input handling shared by every public function: broadcasting, domain checks, strict mode.

Every public function follows one recipe:

1. ``args = Inputs(strict, ps=(ps, PRESSURE), mach=(mach, MACH))`` converts the inputs to
   broadcast binary64 arrays of at least one dimension (so scalar and array calls take
   the very same numpy code path and give bit-identical results), classifies every
   element against its :class:`Domain`, and raises :class:`~airdata.DomainError` for
   the first bad element when ``strict`` is true.
2. The kernel computes on ``args["ps"]`` etc., where bad elements have been replaced by
   a harmless in-range value.
3. ``args.flag(mask, status, what, value, valid)`` reports a derived quantity out of
   range (same strict/non-strict rules); ``args.flag_above(value, limit, what, valid)``
   is the common case, a derived quantity above its upper limit.
4. ``args.finish(y)`` puts NaN where any input was bad and returns a Python float for
   scalar input.
"""

from __future__ import annotations

import threading
from dataclasses import dataclass
from types import TracebackType
from typing import Union

import numpy as np
from numpy.typing import ArrayLike, NDArray

from .status import DomainError, Status

__all__ = ["Domain", "Inputs", "ArrayLike", "FloatOrArray", "capture_statuses"]

FloatOrArray = Union[float, NDArray[np.float64]]

_CAPTURE = threading.local()


class capture_statuses:  # noqa: N801 - used like a function: ``with capture_statuses()``
    """Record the element statuses of every call finished inside the ``with`` block.

    ``with capture_statuses() as log:`` yields a list that receives, for each
    :meth:`Inputs.finish` in this thread, the status array of that call (the first
    failing check of each element, in the order strict mode raises it).  The vector
    builder reads every case's status from one non-strict batch call this way instead
    of re-evaluating each bad case alone in strict mode.
    """

    def __enter__(self) -> list[NDArray[np.int8]]:
        self._prev = getattr(_CAPTURE, "log", None)
        _CAPTURE.log = []
        return _CAPTURE.log  # type: ignore[no-any-return]

    def __exit__(self, kind: type[BaseException] | None, exc: BaseException | None,
                 tb: TracebackType | None) -> None:
        _CAPTURE.log = self._prev


@dataclass(frozen=True)
class Domain:
    """Valid range of one argument.

    ``sign`` says which proper numbers are *invalid* rather than merely out of range:
    ``"any"`` (only NaN and infinities are invalid), ``"nonnegative"`` (negative values
    are invalid too) or ``"positive"`` (zero and negative values are invalid too).
    Finite values of the right sign outside ``[lo, hi]`` are out of range.
    ``safe`` is an in-range stand-in used to compute past bad elements.
    """

    lo: float
    hi: float
    unit: str
    sign: str
    safe: float

    def describe(self) -> str:
        """The valid range in words, for error messages."""
        return f"[{self.lo!r}, {self.hi!r}] {self.unit}".rstrip()

    def all_valid(self, x: NDArray[np.float64]) -> bool:
        """True when every element lies in the range (and has the right sign).

        Two comparisons and a reduction: the fast path of :class:`Inputs` for the
        usual all-valid call.  NaN compares false, infinities fall outside.
        """
        with np.errstate(invalid="ignore"):
            ok = (x >= self.lo) & (x <= self.hi)
            if self.sign == "positive" and self.lo <= 0.0:
                ok &= x > 0.0
            elif self.sign == "nonnegative" and self.lo < 0.0:
                ok &= x >= 0.0
        return bool(ok.all())

    def classify(self, x: NDArray[np.float64]) -> NDArray[np.int8]:
        """Status of every element: OK, INVALID_INPUT or OUT_OF_RANGE."""
        with np.errstate(invalid="ignore"):
            invalid = ~np.isfinite(x)
            if self.sign == "positive":
                invalid |= x <= 0.0
            elif self.sign == "nonnegative":
                invalid |= x < 0.0
            out = (x < self.lo) | (x > self.hi)
        status = np.where(invalid, np.int8(Status.INVALID_INPUT),
                          np.where(out, np.int8(Status.OUT_OF_RANGE), np.int8(Status.OK)))
        return status.astype(np.int8)


class Inputs:
    """Broadcast, checked inputs of one call (see the module docstring)."""

    def __init__(self, strict: bool, **named: tuple[ArrayLike, Domain]) -> None:
        self.strict = strict
        raw = [np.asarray(v, dtype=np.float64) for v, _ in named.values()]
        self.scalar = all(r.ndim == 0 for r in raw)
        arrays = np.broadcast_arrays(*[np.atleast_1d(r) for r in raw])
        self.shape = arrays[0].shape
        self.status = np.zeros(self.shape, dtype=np.int8)
        self._values: dict[str, NDArray[np.float64]] = {}
        self._any_bad = False
        for (name, (_, dom)), arr in zip(named.items(), arrays, strict=True):
            if dom.all_valid(arr):
                arr = np.ascontiguousarray(arr)  # kernels never write to their inputs
            else:
                st = dom.classify(arr)
                bad = st != Status.OK
                self._report(name, arr, st, dom.describe())
                arr = np.where(bad, dom.safe, arr)
            self._values[name] = arr

    def __getitem__(self, name: str) -> NDArray[np.float64]:
        return self._values[name]

    def _report(self, name: str, arr: NDArray[np.float64], st: NDArray[np.int8],
                valid: str) -> None:
        first = int(np.flatnonzero(st != Status.OK)[0])
        if self.strict:
            idx = (None if self.scalar
                   else tuple(int(i) for i in np.unravel_index(first, self.shape)))
            raise DomainError(name, float(arr.flat[first]), idx, valid,
                              Status(int(st.flat[first])))
        # Keep the first bad status of each element.
        self.status = np.where(self.status == Status.OK, st, self.status).astype(np.int8)
        self._any_bad = True

    def flag(self, mask: NDArray[np.bool_], status: Status, name: str,
             value: NDArray[np.float64], valid: str) -> None:
        """Report a derived quantity ``name`` (values ``value``) bad where ``mask``."""
        mask = mask & (self.status == Status.OK)
        if mask.any():
            st = np.where(mask, np.int8(status), np.int8(Status.OK)).astype(np.int8)
            self._report(name, np.broadcast_to(value, self.shape), st, valid)

    def flag_above(self, value: NDArray[np.float64], limit: float, name: str, valid: str,
                   shown: NDArray[np.float64] | None = None) -> NDArray[np.bool_]:
        """Report a derived quantity ``name`` OUT_OF_RANGE where ``value > limit``, the
        values shown being ``shown`` (default ``value``); the mask, so that the caller can
        keep those elements out of its kernel."""
        over = value > limit
        self.flag(over, Status.OUT_OF_RANGE, name, value if shown is None else shown, valid)
        return over

    @property
    def any_bad(self) -> bool:
        """Whether any element has a bad input or derived quantity (cheap)."""
        return self._any_bad

    @property
    def bad(self) -> NDArray[np.bool_]:
        """Elements with any bad input or derived quantity."""
        return self.status != Status.OK

    def finish(self, y: NDArray[np.float64]) -> FloatOrArray:
        """NaN where bad; a Python float for scalar input."""
        log = getattr(_CAPTURE, "log", None)
        if log is not None:
            log.append(self.status)
        if self._any_bad:
            y = np.where(self.bad, np.nan, y)
        if self.scalar:
            return float(y.reshape(-1)[0])
        return y
