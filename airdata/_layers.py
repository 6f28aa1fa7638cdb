"""Layer kernels of the standard atmosphere: the per-layer constant table, the layer of an
altitude, the hydrostatic temperature and pressure (ATM-1, ATM-2, ATM-3) and the
double-double state (ATM-4 .. ATM-6) on clean binary64 arrays.

Private: the public functions of :mod:`airdata.atmosphere`, :mod:`airdata.altimetry`,
:mod:`airdata.budget` and the valid ranges of :mod:`airdata._domains` all build on these
kernels, which depend on nothing but the profiles, so no import cycle forms.  Sources and
equation ids: docs/equations.md.
"""

from __future__ import annotations

from decimal import Decimal
from functools import cache
from typing import NamedTuple

import numpy as np
from numpy.typing import NDArray

from . import _dd as dd
from ._blocks import elementwise
from .profiles import Profile

F64 = NDArray[np.float64]

class LayerTable(NamedTuple):
    """Per-layer constants of one profile as arrays indexed by layer number (0..6).

    ``m = L/Tb`` and ``k = g0/(R L)`` for gradient layers (``k = 0`` in isothermal
    layers); ``c = g0/(R Tb)`` for isothermal layers (``c = 0`` in gradient layers);
    ``n = -R L/g0`` (exponent of the inverse); ``sh = -R Tb/g0`` (inverse isothermal
    scale); ``rho_b`` base densities; ``kd = -R L/(g0 + R L)`` (density inverse);
    ``pb_lo`` the low parts of the base pressures as double-doubles (pb + pb_lo is the
    base pressure to about 1e-32 relative); ``m_div`` is m in gradient layers and 1 in
    isothermal ones, ``sh_iso`` is sh in isothermal layers and 0 in gradient ones, so the
    inverse kernels need no branch: hb + (expm1(n lr)/m_div + sh_iso lr), where the term
    of the other layer kind is an exact zero.
    """

    hb: F64
    lapse: F64
    tb: F64
    pb: F64
    gradient: NDArray[np.bool_]
    m: F64
    k: F64
    c: F64
    n: F64
    sh: F64
    rho_b: F64
    kd: F64
    pb_lo: F64
    m_div: F64
    sh_iso: F64


@cache
def layer_table(profile: Profile) -> LayerTable:
    """Per-layer constants of ``profile``, derived once."""
    g0, r = profile.g0, profile.R
    hb = np.array(profile.layer_base)
    lapse = np.array(profile.lapse_rate)
    tb = np.array(profile.base_temperature)
    pb = np.array(profile.base_pressure)
    grad = lapse != 0.0
    safe_l = np.where(grad, lapse, 1.0)
    m = np.where(grad, lapse / tb, 0.0)
    k = np.where(grad, g0 / (r * safe_l), 0.0)
    c = np.where(grad, 0.0, g0 / (r * tb))
    n = np.where(grad, -(r * lapse) / g0, 0.0)
    sh = -(r * tb) / g0
    rho_b = pb / (r * tb)
    kd = np.where(grad, -(r * lapse) / (g0 + r * lapse), 0.0)
    pb_lo = np.array([float(p - Decimal(float(p))) for p in profile.exact("base_pressure")])
    m_div = np.where(grad, m, 1.0)
    sh_iso = np.where(grad, 0.0, sh)
    tables = (hb, lapse, tb, pb, grad, m, k, c, n, sh, rho_b, kd, pb_lo, m_div, sh_iso)
    for a in tables:
        a.setflags(write=False)
    return LayerTable(*tables)


def count_bases(mask_of_base: list[NDArray[np.bool_]]) -> NDArray[np.intp]:
    """Layer index as the number of layer bases (above the first) an element has passed.

    Six comparisons and byte-wide additions: ten times cheaper than a binary search
    (``np.searchsorted``) over seven bases, and the same index.
    """
    i = mask_of_base[0].view(np.uint8).copy()
    for m in mask_of_base[1:]:
        i += m.view(np.uint8)
    return i.astype(np.intp)


def layer_of_altitude(h: F64, t: LayerTable) -> NDArray[np.intp]:
    """ATM-1: layer i holds hb[i] <= h < hb[i+1]; layer 0 extends below sea level."""
    return count_bases([h >= b for b in t.hb[1:]])


def standard_temperature(h: F64, i: NDArray[np.intp], t: LayerTable) -> F64:
    """ATM-2: T = Tb + L (h - hb)."""
    return t.tb[i] + t.lapse[i] * (h - t.hb[i])


@elementwise(2)
def pressure_dd(h: F64, i: NDArray[np.intp], t: LayerTable) -> tuple[F64, F64]:
    """ATM-3 kernel as a double-double: p = (pb + pb_lo) exp(e).

    e = -(k log1p(m dh) + c dh) covers both branches: in a gradient layer ``c = 0`` and
    in an isothermal one ``k = m = 0``, so the unused term adds an exact zero.  The
    product with the double-double base pressure leaves one rounding (of exp) besides
    the final one.
    """
    dh = h - t.hb[i]
    e = np.exp(-(t.k[i] * np.log1p(t.m[i] * dh) + t.c[i] * dh))
    return dd.mul((t.pb[i], t.pb_lo[i]), (e, np.zeros_like(e)))


def standard_pressure(h: F64, i: NDArray[np.intp], t: LayerTable) -> F64:
    """ATM-3: the standard pressure at geopotential altitude h in layer i, Pa."""
    return pressure_dd(h, i, t)[0]


class DDTables(NamedTuple):
    """Double-double per-layer constants (hi, lo pairs) and scalar constants."""

    tb: tuple[F64, F64]
    lapse: tuple[F64, F64]
    beta: tuple[float, float]
    r_gas: tuple[float, float]


@cache
def dd_tables(prof: Profile) -> DDTables:
    """The double-double constants of ``prof``; every hi part equals the binary64 value."""
    def pairs(values: tuple[Decimal, ...]) -> tuple[F64, F64]:
        both = [dd.const(v) for v in values]
        return np.array([h for h, _ in both]), np.array([lo for _, lo in both])

    return DDTables(pairs(prof.exact("base_temperature")), pairs(prof.exact("lapse_rate")),
                    dd.const(prof.exact("beta")), dd.const(prof.exact("R")))


@elementwise(3)
def state_dd(h: F64, dT: F64, i: NDArray[np.intp], t: LayerTable,
             prof: Profile) -> tuple[F64, F64, F64, F64, F64]:
    """ATM-2..ATM-6 kernel in double-double: T, p, rho, mu, nu.

    T = Tb + L (h - hb) + dT and rho = p/(R T), mu = beta T sqrt(T)/(T + S),
    nu = mu R T/p are evaluated in double-double arithmetic (:mod:`airdata._dd`) from
    double-double constants, and p from :func:`pressure_dd`, so each output is rounded
    about once.  In plain binary64 the
    rounded T, amplified 1.8 times in nu, and five to seven roundings would reach a
    condition-scaled error near 3 where the condition scale is smallest (near sea
    level).  h - hb is exact (Sterbenz: every layer spans less than a factor 2 in h).
    """
    c = dd_tables(prof)
    zero = np.zeros_like(h)
    dh = h - t.hb[i]
    temp = dd.add(dd.add((c.tb[0][i], c.tb[1][i]),
                         dd.mul((c.lapse[0][i], c.lapse[1][i]), (dh, zero))), (dT, zero))
    p = pressure_dd(h, i, t)
    r_gas = (np.full_like(h, c.r_gas[0]), np.full_like(h, c.r_gas[1]))
    rho = dd.div(p, dd.mul(r_gas, temp))
    beta = (np.full_like(h, c.beta[0]), np.full_like(h, c.beta[1]))
    mu = dd.div(dd.mul(dd.mul(beta, temp), dd.sqrt_dd(temp)),
                dd.add(temp, (np.full_like(h, prof.sutherland_s), zero)))
    nu = dd.div(dd.mul(dd.mul(mu, r_gas), temp), p)
    return temp[0], p[0], rho[0], mu[0], nu[0]
