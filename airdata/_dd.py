"""Double-double arithmetic on binary64 arrays (error-free transformations).

Used where a handful of roundings would otherwise exceed the accuracy goal: the value of
a double-double number is hi + lo with |lo| <= ulp(hi)/2.  Only IEEE binary64 addition,
subtraction, multiplication, division and square root are used, each as a separate
numpy ufunc, so no fused multiply-add can change the results on any platform.

References
----------
T. J. Dekker, "A floating-point technique for extending the available precision",
Numerische Mathematik 18 (1971) 224-242 (two-sum, split, two-product).
"""

from __future__ import annotations

from decimal import Decimal

import numpy as np
from numpy.typing import NDArray

F64 = NDArray[np.float64]
DD = tuple[F64, F64]

_SPLITTER = 134217729.0  # 2**27 + 1


def const(value: Decimal | str) -> tuple[float, float]:
    """A decimal constant as a double-double (hi, lo), accurate to about 1e-32."""
    d = Decimal(value)
    hi = float(d)
    lo = float(d - Decimal(hi))
    return hi, lo


def two_sum(a: F64, b: F64) -> DD:
    """s + e == a + b exactly, s = fl(a + b) (Knuth)."""
    s = a + b
    bb = s - a
    e = (a - (s - bb)) + (b - bb)
    return s, e


def _fast_two_sum(a: F64, b: F64) -> DD:
    s = a + b
    return s, b - (s - a)


def _split(a: F64) -> DD:
    c = _SPLITTER * a
    hi = c - (c - a)
    return hi, a - hi


def two_prod(a: F64, b: F64) -> DD:
    """p + e == a * b exactly, p = fl(a * b) (Dekker)."""
    p = a * b
    ah, al = _split(a)
    bh, bl = _split(b)
    e = ((ah * bh - p) + ah * bl + al * bh) + al * bl
    return p, e


def mul(a: DD, b: DD) -> DD:
    """Double-double product."""
    p, e = two_prod(a[0], b[0])
    e = e + (a[0] * b[1] + a[1] * b[0])
    return _fast_two_sum(p, e)


def div(a: DD, b: DD) -> DD:
    """Double-double quotient."""
    q1 = a[0] / b[0]
    p, e = mul((q1, np.zeros_like(q1)), b)
    r = ((a[0] - p) - e + a[1])
    q2 = r / b[0]
    return _fast_two_sum(q1, q2)


def add(a: DD, b: DD) -> DD:
    """Double-double sum."""
    s, e = two_sum(a[0], b[0])
    e = e + (a[1] + b[1])
    return _fast_two_sum(s, e)


def sqrt_dd(a: DD) -> DD:
    """Double-double square root of a positive double-double (one Newton correction)."""
    s = np.sqrt(a[0])
    p, e = two_prod(s, s)
    corr = (((a[0] - p) - e) + a[1]) / (2.0 * s)
    return _fast_two_sum(s, corr)
