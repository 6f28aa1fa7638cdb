"""The function-specific case seeds of the golden vectors (``FunctionSpec.extra`` of the
function table, :mod:`airdata.vectors.catalogue`): derived sweeps, derived seams and
limits, tiny and subnormal values, status paths.  Each seed says why it exists by its
tags (:data:`airdata.vectors.cases.TAGS`).
"""

from __future__ import annotations

import math
from collections.abc import Callable

import numpy as np
from numpy.typing import NDArray

import airdata

from .. import _domains as dom
from ..pitot import RATIO_MAX, RATIO_SONIC
from ..profiles import Profile
from .cases import RANGE_WINDOW, CaseSeed, around, window

F64 = NDArray[np.float64]

def _mach_grid(n: int) -> F64:
    return np.concatenate([np.linspace(0.0, 1.0, n // 2 + 1)[1:],
                           np.linspace(1.0, 10.0, n - n // 2 + 1)[1:]])


def _alt_grid(p: Profile, n: int) -> F64:
    return np.linspace(p.h_min, p.h_max, n)


def _f(v: object) -> float:
    return float(np.asarray(v, dtype=np.float64).reshape(-1)[0])


def _derived_limit(x_at_limit: float) -> list[tuple[float, str]]:
    """A derived limit: values inside and outside at relative offsets 1e-13 .. 1e-3.

    The smallest offset, 1e-13, is about 450 binary64 ulp: far beyond the 8-ulp slack
    of the derived checks and the last-bit differences of a binary64 port, so the
    expected status is that of exact arithmetic, while a limit widened by 1e-13 or more
    is caught.
    """
    out = []
    for r in (1e-13, 1e-11, 1e-9, 1e-7, 1e-5, 1e-3):
        out += [(x_at_limit * (1.0 - r), "inside"), (x_at_limit * (1.0 + r), "outside")]
    return out


def extra_mach_from_qc(p: Profile) -> list[CaseSeed]:
    seeds = []
    ps_list = np.geomspace(p.p_min, p.p_max, 24)
    for ps in ps_list:
        for m in _mach_grid(24):
            qc = _f(airdata.impact_pressure_from_mach(m, ps, profile=p))
            seeds.append(CaseSeed({"qc": qc, "ps": float(ps)}, ("sweep",)
                                  + (("supersonic",) if m > 1 else ())))
    for ps in [p.p0, 22632.04, 500.0, p.p_min, p.p_max]:
        q0 = RATIO_SONIC * ps
        for v, moved in around(q0):
            seeds.append(CaseSeed({"qc": v, "ps": float(ps)},
                                  ("sonic",) + (("ulp-offset",) if moved else ())))
        for v in window(q0):
            seeds.append(CaseSeed({"qc": v, "ps": float(ps)}, ("sonic", "seam-window")))
        for v, _ in _derived_limit(RATIO_MAX * ps):
            seeds.append(CaseSeed({"qc": v, "ps": float(ps)}, ("derived-limit", "extreme")))
    for ps in [p.p0, 1000.0]:
        seeds.append(CaseSeed({"qc": 1e-6, "ps": ps}, ("tiny",)))
    # qc/ps at 2^-60, where PIT-2 switches to its linear form, in a window either side.
    for v in window(2.0**-60 * p.p0):
        seeds.append(CaseSeed({"qc": v, "ps": p.p0}, ("tiny", "seam-window")))
    for v in (1e-305, 1e-310, 5e-324):  # near and below underflow
        seeds.append(CaseSeed({"qc": v, "ps": 54019.9}, ("tiny", "extreme")))
    return seeds


def extra_cas_from_qc(p: Profile) -> list[CaseSeed]:
    seeds = []
    for v, _ in _derived_limit(RATIO_MAX * p.p0):
        seeds.append(CaseSeed({"qc": v}, ("derived-limit", "extreme")))
    seeds.append(CaseSeed({"qc": 1e-6}, ("tiny",)))
    for v in (1e-300, 1e-307, 1e-310, 1e-320, 5e-324):  # near and below underflow
        seeds.append(CaseSeed({"qc": v}, ("tiny", "extreme")))
    for cas in np.linspace(0.0, 10.0 * p.a0, 200)[1:]:
        seeds.append(CaseSeed({"qc": _f(airdata.impact_pressure_from_cas(cas, profile=p))},
                              ("sweep",) + (("supersonic",) if cas > p.a0 else ())))
    return seeds


def extra_qc_from_cas(p: Profile) -> list[CaseSeed]:
    seeds = [CaseSeed({"cas": v}, ("derived-limit", "extreme"))
             for v, _ in _derived_limit(10.0 * p.a0)]
    seeds.append(CaseSeed({"cas": 1e-6}, ("tiny",)))
    return seeds


def extra_cas_from_mach(p: Profile) -> list[CaseSeed]:
    seeds = []
    # Supersonic CAS at sea-level-like pressure; the CAS = a0 seam reached from Mach.
    for ps in [p.p0, 54019.9, 4000.0]:
        m1 = _f(airdata.mach_from_cas(p.a0, ps, profile=p))
        for v, moved in around(m1):
            seeds.append(CaseSeed({"mach": v, "ps": ps},
                                  ("sonic",) + (("ulp-offset",) if moved else ())))
    # CAS limit 10 a0 reached at high pressure: M where qc/p0 = RATIO_MAX.
    for ps in [p.p_max, 150000.0]:
        m_lim = _f(airdata.mach_from_impact_pressure(RATIO_MAX * p.p0, ps, profile=p))
        for v, _ in _derived_limit(m_lim):
            seeds.append(CaseSeed({"mach": v, "ps": ps}, ("derived-limit", "extreme")))
    seeds.append(CaseSeed({"mach": 1e-8, "ps": p.p0}, ("tiny",)))
    for v in (1e-310, 5e-324):  # the tiny-Mach branch with a subnormal Mach number
        seeds.append(CaseSeed({"mach": v, "ps": 54019.9}, ("tiny", "extreme")))
    return seeds


def extra_mach_from_cas(p: Profile) -> list[CaseSeed]:
    seeds = []
    for ps in np.geomspace(p.p_min, p.p_max, 24):
        for m in _mach_grid(24):
            cas = _f(airdata.cas_from_mach(m, ps, profile=p, strict=False))
            if math.isfinite(cas):
                seeds.append(CaseSeed({"cas": cas, "ps": float(ps)}, ("sweep",)
                                      + (("supersonic",) if m > 1 else ())))
    for ps in [p.p0, 20000.0, 500.0]:
        c10 = _f(airdata.cas_from_mach(10.0, ps, profile=p))
        for v, _ in _derived_limit(c10):
            seeds.append(CaseSeed({"cas": v, "ps": ps}, ("derived-limit", "extreme")))
    for v, _ in _derived_limit(10.0 * p.a0):
        seeds.append(CaseSeed({"cas": v, "ps": p.p_max}, ("derived-limit", "extreme")))
    seeds.append(CaseSeed({"cas": 1e-6, "ps": p.p0}, ("tiny",)))
    # The linear branch below cas/a0 = 2^-40, at its switch and well inside it.
    for ps in (p.p0, 1000.0):
        seeds.append(CaseSeed({"cas": 1e-12, "ps": ps}, ("tiny",)))
        for v in window(2.0**-40 * p.a0):
            seeds.append(CaseSeed({"cas": v, "ps": ps}, ("tiny", "seam-window")))
    seeds.append(CaseSeed({"cas": 1e-310, "ps": 54019.9}, ("tiny", "extreme")))
    return seeds


def extra_mach_from_eas(p: Profile) -> list[CaseSeed]:
    seeds = []
    for ps in np.geomspace(p.p_min, p.p_max, 24):
        for m in _mach_grid(24):
            seeds.append(CaseSeed({"eas": _f(airdata.eas_from_mach(m, ps, profile=p)),
                                   "ps": float(ps)}, ("sweep",)))
    for ps in [p.p0, 20000.0, 500.0]:
        e10 = _f(airdata.eas_from_mach(10.0, ps, profile=p))
        for v, _ in _derived_limit(e10):
            seeds.append(CaseSeed({"eas": v, "ps": ps}, ("derived-limit", "extreme")))
    seeds.append(CaseSeed({"eas": 1e-6, "ps": p.p0}, ("tiny",)))
    return seeds


def extra_mach_from_tas(p: Profile) -> list[CaseSeed]:
    seeds = []
    for sat in np.linspace(150.0, 400.0, 24):
        for m in _mach_grid(24):
            seeds.append(CaseSeed({"tas": _f(airdata.tas_from_mach(m, sat, profile=p)),
                                   "sat": float(sat)}, ("sweep",)))
    for sat in [50.0, 216.65, 288.15]:
        t10 = _f(airdata.tas_from_mach(10.0, sat, profile=p))
        for v, _ in _derived_limit(t10):
            seeds.append(CaseSeed({"tas": v, "sat": sat}, ("derived-limit", "extreme")))
    seeds.append(CaseSeed({"tas": 1e-6, "sat": 288.15}, ("tiny",)))
    return seeds


def extra_density_altitude(p: Profile) -> list[CaseSeed]:
    seeds = []
    for h in _alt_grid(p, 40):
        for dT in (-60.0, -20.0, 0.0, 15.0, 40.0):
            a = airdata.atmosphere(h, dT, profile=p, strict=False)
            seeds.append(CaseSeed({"ps": a.pressure, "sat": a.temperature}, ("sweep",)))
    # Density seams: standard day at each layer base (ps = pb, sat = Tb).
    for pb, tb in zip(p.base_pressure, p.base_temperature, strict=True):
        for v, moved in around(tb):
            seeds.append(CaseSeed({"ps": pb, "sat": v},
                                  ("layer-base",) + (("ulp-offset",) if moved else ())))
        for v in window(tb):
            seeds.append(CaseSeed({"ps": pb, "sat": v}, ("layer-base", "seam-window")))
        for v in window(pb):
            seeds.append(CaseSeed({"ps": v, "sat": tb}, ("layer-base", "seam-window")))
    # Density limits: the standard top and bottom of the model with a warmer/colder day.
    top = airdata.atmosphere(p.h_max, profile=p)
    bot = airdata.atmosphere(p.h_min, profile=p)
    for ps, t in ((top.pressure, top.temperature), (bot.pressure, bot.temperature)):
        for v, _ in _derived_limit(t):
            seeds.append(CaseSeed({"ps": ps, "sat": v}, ("derived-limit", "extreme")))
    return seeds


def extra_altimeter_setting(p: Profile) -> list[CaseSeed]:
    seeds = []
    for e in np.linspace(-5000.0, 11000.0, 21):
        for hs in np.linspace(-5000.0, 11000.0, 21):
            hp = e + hs
            if p.h_min <= hp <= 11000.0:
                ps = _f(airdata.pressure_at_altitude(hp, profile=p))
                seeds.append(CaseSeed({"ps": ps, "elevation": float(e)}, ("sweep",)))
    # Derived limit: H(ps) - elevation at -5000 and 11000 m.  Every limit must get
    # cases: a pressure whose candidates all fall outside the elevation range fails.
    p8000 = _f(airdata.pressure_at_altitude(8000.0, profile=p))
    for lim in (p.h_min, 11000.0):
        kept = 0
        for ps in [p.p0, 80000.0, p8000]:
            hp = _f(airdata.pressure_altitude(ps, profile=p))
            e = hp - lim
            for v, _ in _derived_limit(e) if e != 0 else [(1e-6, ""), (-1e-6, "")]:
                if -5000.0 <= v <= 11000.0:
                    kept += 1
                    seeds.append(CaseSeed({"ps": ps, "elevation": v}, ("derived-limit",)))
        if kept == 0:
            raise RuntimeError(f"altimeter_setting: no derived-limit case for {lim} m "
                               "(every candidate elevation is outside its range)")
    # The elevation's own range ends, at the pressure of that elevation (setting altitude
    # 0): with a nominal pressure the derived check would refuse them first and hide a
    # widened end (the generic range-end cases use nominal pressures).
    for end in (dom.ELEVATION.lo, dom.ELEVATION.hi):
        ps = _f(airdata.pressure_at_altitude(end, profile=p))
        for v in [v for v, _ in around(end)] + window(end, RANGE_WINDOW):
            seeds.append(CaseSeed({"ps": ps, "elevation": v}, ("range-end", "seam-window")))
    return seeds


def extra_chain(p: Profile) -> list[CaseSeed]:
    seeds: list[CaseSeed] = []

    def add(ps: float, pt: float, tat: float, rec: float, setting: float | None,
            tags: tuple[str, ...], nb: float = dom.NOISE_BAND) -> None:
        x = {"ps": ps, "pt": pt, "tat": tat, "recovery": rec,
             "setting": math.nan if setting is None else setting,
             "use_setting": 0.0 if setting is None else 1.0, "noise_band": nb}
        extra = ("no-setting",) if setting is None else ("with-setting",)
        seeds.append(CaseSeed(x, tags + extra + (("noise-band",) if nb != dom.NOISE_BAND else ())))

    def flight(h: float, m: float, dT: float) -> tuple[float, float, float]:
        a = airdata.atmosphere(h, dT, profile=p)
        ps = a.pressure
        pt = ps + _f(airdata.impact_pressure_from_mach(m, ps, profile=p))
        tat = _f(airdata.tat_from_sat(a.temperature, m))
        return ps, pt, tat

    hs = np.linspace(-1000.0, 30000.0, 16)
    ms = np.concatenate([np.linspace(0.0, 0.95, 8), np.linspace(1.05, 4.0, 6)])
    k = 0
    for h in hs:
        for m in ms:
            for dT in (-20.0, 10.0):
                ps, pt, tat = flight(float(h), float(m), dT)
                setting = None if k % 2 == 0 else (101325.0, 99000.0, 103200.0)[k % 3]
                rec = (1.0, 0.98, 0.8)[k % 3]
                add(ps, pt, tat, rec, setting, ("sweep",) + (("supersonic",) if m > 1 else ()))
                k += 1
    # High altitude and Mach to 10.
    for h in np.linspace(30000.0, 84000.0, 10):
        for m in (0.5, 2.0, 5.0, 9.9):
            ps, pt, tat = flight(float(h), m, 0.0)
            add(ps, pt, tat, 1.0, None, ("sweep", "extreme"))
    # M = 1 and CAS = a0 seams.
    for h in (0.0, 11000.0, -2000.0):
        a = airdata.atmosphere(h, profile=p)
        ps = a.pressure
        for q0, tag in ((RATIO_SONIC * ps, "sonic"),):
            for v, moved in around(ps + q0):
                add(ps, v, 288.15, 1.0, None, (tag,) + (("ulp-offset",) if moved else ()))
    for v, moved in around(p.p0 + RATIO_SONIC * p.p0):
        add(p.p0, v, 300.0, 1.0, 101325.0, ("sonic",) + (("ulp-offset",) if moved else ()))
    # Layer bases for ps and setting.
    for pb in p.base_pressure:
        for v, moved in around(pb):
            add(v, v + 1000.0, 250.0, 1.0, None,
                ("layer-base",) + (("ulp-offset",) if moved else ()))
    for v, moved in around(p.base_pressure[1]):
        add(p.p0, p.p0 + 500.0, 288.15, 1.0, v,
            ("layer-base", "range-end") + (("ulp-offset",) if moved else ()))
    # At rest, zeroed impact pressure, noise band.
    add(p.p0, p.p0, 288.15, 1.0, None, ("zero",))
    add(p.p0, p.p0 + 1e-6, 288.15, 1.0, None, ("tiny",))
    for d in (-1e-6, -50.0, -100.0, -99.99):
        add(p.p0, p.p0 + d, 288.15, 1.0, 101325.0, ("zeroed",))
    add(p.p0, p.p0 - 100.5, 288.15, 1.0, None, ("invalid", "negative"))
    # Within the noise band of qc but with a zero total pressure: invalid, not zeroed.
    add(50.0, 0.0, 288.15, 1.0, None, ("invalid", "zero"))
    # qc/ps below the Mach 10 limit but qc/p0 beyond the CAS 10 a0 limit.
    add(150000.0, 13650000.0, 4500.0, 1.0, None, ("derived-limit", "out-of-range"))
    for nb in (0.0, 10000.0, 250.0):
        add(p.p0, p.p0 - 200.0, 288.15, 1.0, None, ("zeroed",), nb)
        add(p.p0, p.p0 - 1e-3, 288.15, 1.0, None, ("zeroed",), nb)
    for nb in (math.nan, -1.0, math.inf, 10000.5):
        add(p.p0, p.p0 + 3000.0, 288.15, 1.0, None, ("invalid",), nb)
    # Derived limits: Mach 10 (qc/ps), CAS 10 a0 (qc/p0), density.
    for ps in (1000.0, p.p_min):
        for v, _ in _derived_limit(RATIO_MAX * ps):
            add(ps, ps + v, 3000.0, 1.0, None, ("derived-limit", "extreme"))
    for v, _ in _derived_limit(RATIO_MAX * p.p0):
        add(p.p_max, p.p_max + v, 3000.0, 1.0, None, ("derived-limit", "extreme"))
    # Density out of the model: very cold dense air at the bottom; hot air at the top.
    add(p.p_max, p.p_max + 100.0, 60.0, 1.0, None, ("derived-limit", "out-of-range"))
    add(p.p_min, p.p_min + 0.01, 5000.0, 1.0, None, ("derived-limit", "out-of-range"))
    # Invalid total pressure and argument order.
    add(p.p0, 0.0, 288.15, 1.0, None, ("invalid", "zero"))
    add(p.p0, 2.0e8, 288.15, 1.0, None, ("invalid", "out-of-range"))
    add(p.p0, p.p0 + 1000.0, 288.15, 1.0, 20000.0, ("invalid", "out-of-range"))
    add(p.p0, p.p0 + 1000.0, 288.15, 1.0, math.inf, ("invalid", "infinite"))
    add(math.nan, math.nan, math.nan, math.nan, math.nan, ("invalid", "nan", "argument-order"))
    add(1.0e6, -1.0, 288.15, 2.0, None, ("invalid", "argument-order"))
    add(p.p0, p.p0 - 1000.0, 10.0, 1.0, 0.0, ("invalid", "argument-order"))
    return seeds


def chain_nominals(p: Profile) -> list[dict[str, float]]:
    return [
        {"ps": p.p0, "pt": p.p0 + 3000.0, "tat": 290.0, "recovery": 1.0, "setting": 101325.0,
         "use_setting": 1.0, "noise_band": dom.NOISE_BAND},
        {"ps": 23842.3, "pt": 36000.0, "tat": 240.0, "recovery": 0.98, "setting": math.nan,
         "use_setting": 0.0, "noise_band": dom.NOISE_BAND},
    ]


def extra_tiny_mach(p: Profile) -> list[CaseSeed]:
    return [CaseSeed({"mach": 1e-8, "ps": p.p0}, ("tiny",)),
            CaseSeed({"mach": 1e-8, "ps": p.p_min}, ("tiny", "extreme"))]


def extra_tiny_mach_sat(p: Profile) -> list[CaseSeed]:
    return [CaseSeed({"mach": 1e-8, "sat": 288.15}, ("tiny",))]


def extra_temperature(first: str) -> Callable[[Profile], list[CaseSeed]]:
    def extra(p: Profile) -> list[CaseSeed]:
        return [CaseSeed({first: 288.15, "mach": 1e-8, "recovery": 1.0}, ("tiny",)),
                CaseSeed({first: 288.15, "mach": 0.5, "recovery": 1e-8}, ("tiny",))]
    return extra


def stall_extra(name: str) -> Callable[[Profile], list[CaseSeed]]:
    """Stall cases: the 4000 m/s EAS limit, the Mach 10 limit at low pressure, the
    10 a0 CAS limit, tiny stall speeds, M = 1, and a sweep over static pressure."""

    def extra(p: Profile) -> list[CaseSeed]:
        seeds: list[CaseSeed] = []
        base = {"weight": 6.0e5, "wing_area": 120.0, "cl_max": 2.4, "load_factor": 1.0,
                "ps": p.p0, "sat": 288.15}
        keys = ["weight", "wing_area", "cl_max"] + (["ps"] if name != "stall_eas" else []) \
            + (["sat"] if name == "stall_tas" else []) + ["load_factor"]

        def add(tags: tuple[str, ...], **kw: float) -> None:
            x = dict(base)
            x.update(kw)
            seeds.append(CaseSeed({k: x[k] for k in keys}, tags))

        # EAS = 4000 m/s (LIM-1 derived limit): weight at which the stall EAS is 4000.
        w_top = 0.5 * p.rho0 * 4000.0**2 * 0.5 * 1.0
        for v, _ in _derived_limit(w_top):
            add(("derived-limit", "extreme"), weight=v, wing_area=0.5, cl_max=1.0)
        # Tiny stall speeds (the second below Mach 2^-40 at sea level: linear SPD-1).
        add(("tiny",), weight=1.0e-6, wing_area=2000.0, cl_max=10.0, load_factor=1e-3)
        add(("tiny", "extreme"), weight=1.0e-300, wing_area=1.0, cl_max=1.0, ps=p.p0)
        # 2 n W and rho0 S CLmax normal but their quotient subnormal (the factored LIM-1).
        add(("tiny", "extreme"), weight=1.0e-305, wing_area=2000.0, cl_max=10.0)
        # 2 n W subnormal alone (quotient normal); rho0 S CL subnormal alone.
        add(("tiny", "extreme"), weight=1.0e-310, wing_area=1.0e-300, cl_max=1.0)
        add(("tiny", "extreme"), weight=1.0e-304, wing_area=1.0e-310, cl_max=1.0)
        # The same three in binary32's range: 2 n W, rho0 S CL or their quotient below
        # 2^-126 = 1.18e-38 (binary32 subnormal), the others normal in both precisions.
        add(("tiny",), weight=1.0e-40, wing_area=120.0, cl_max=2.4)
        add(("tiny",), weight=1.0e3, wing_area=1.0e-40, cl_max=1.0)
        add(("tiny",), weight=1.0e-36, wing_area=1000.0, cl_max=10.0)
        # 2 n W, rho0 S CL and their quotient each in a window around the smallest normal
        # number of binary64 and of binary32 (the switch to the factored LIM-1).
        for lim in (2.0**-1022, 2.0**-126):
            for v in window(lim, RANGE_WINDOW):
                add(("tiny", "seam-window"), weight=0.5 * v, wing_area=1e-10, cl_max=1.0)
                add(("tiny", "seam-window"), weight=1e-305 if lim < 1e-300 else 1e-36,
                    wing_area=v / p.rho0, cl_max=1.0)
                add(("tiny", "seam-window"), weight=0.5 * v * p.rho0, wing_area=1.0,
                    cl_max=1.0)
        # The positive arguments far below 1 with an ordinary stall speed (a few m/s),
        # normal in both precisions: a lower range end raised above 0 refuses them.
        for tiny in (1e-3, 1e-7, 1e-30):
            add(("tiny", "range-end"), weight=tiny, wing_area=tiny, cl_max=1.0)
            add(("tiny", "range-end"), weight=tiny, wing_area=1.0, cl_max=tiny)
            add(("tiny", "range-end"), weight=1.0, wing_area=1.0, cl_max=1.0, load_factor=tiny)
        if name == "stall_eas":
            return seeds
        # Stall speeds swept over pressure (the altitude column of an envelope).
        for ps in np.geomspace(p.p_min, p.p_max, 24):
            for w in (2.0e4, 6.0e5, 3.0e6):
                add(("sweep",), weight=w, ps=float(ps))
        # Mach 10 reached at low pressure: the pressure where the stall Mach is 10.
        eas = _f(airdata.stall_eas(6.0e5, 120.0, 2.4, profile=p))
        ps10 = p.p0 * (eas / (10.0 * p.a0)) ** 2
        for v, _ in _derived_limit(ps10):
            add(("derived-limit",), ps=v)
        # M = 1 and CAS = a0 at sea level: the weight where the stall Mach is 1.
        w1 = 0.5 * p.rho0 * (p.a0 * math.sqrt(0.5)) ** 2 * 120.0 * 2.4
        for v, moved in around(w1):
            add(("sonic",) + (("ulp-offset",) if moved else ()), weight=v, ps=0.5 * p.p0)
        if name == "stall_cas":
            # CAS = 10 a0 reached at high pressure with a high stall Mach.
            m_lim = _f(airdata.mach_from_impact_pressure(RATIO_MAX * p.p0, p.p_max,
                                                         profile=p))
            w_lim = 0.5 * p.rho0 * (m_lim * p.a0) ** 2 * (p.p_max / p.p0) * 0.5
            for v, _ in _derived_limit(w_lim):
                add(("derived-limit", "extreme"), weight=v, wing_area=0.5, cl_max=1.0,
                    ps=p.p_max)
        return seeds

    return extra


def extra_crossover(p: Profile) -> list[CaseSeed]:
    seeds: list[CaseSeed] = []
    for cas in np.linspace(60.0, 500.0, 23):
        for m in np.linspace(0.3, 0.98, 18):
            seeds.append(CaseSeed({"cas_limit": float(cas), "mach_limit": float(m)},
                                  ("sweep",)))
    # Crossover at the ends of the pressure range: the CAS limit whose crossover
    # pressure is p_min or p_max at Mach 0.8.
    f08 = _f(airdata.impact_pressure_from_mach(0.8, 1.0, profile=p))
    for pe in (p.p_min, p.p_max):
        cas = _f(airdata.cas_from_impact_pressure(pe * f08, profile=p))
        for v, _ in _derived_limit(cas):
            seeds.append(CaseSeed({"cas_limit": v, "mach_limit": 0.8},
                                  ("derived-limit", "extreme")))
    # Crossover at the layer bases.
    for pb in p.base_pressure[1:]:
        cas = _f(airdata.cas_from_impact_pressure(pb * f08, profile=p))
        seeds.append(CaseSeed({"cas_limit": cas, "mach_limit": 0.8}, ("layer-base",)))
    # CAS limit at 10 a0, just inside and outside.
    for v, _ in _derived_limit(10.0 * p.a0):
        seeds.append(CaseSeed({"cas_limit": v, "mach_limit": 0.999}, ("derived-limit",)))
    # Both limits below Mach 2^-40 (linear pitot relation): a crossover near 2000 m.
    seeds.append(CaseSeed({"cas_limit": 3.0e-158, "mach_limit": 1.0e-160}, ("tiny", "extreme")))
    seeds.append(CaseSeed({"cas_limit": 1.0e-15, "mach_limit": 3.0e-18}, ("tiny",)))
    for v in (1e-310, 5e-324):  # subnormal limits: crossover 0.875 Pa, 80 073.65 m
        seeds.append(CaseSeed({"cas_limit": v, "mach_limit": v}, ("tiny", "extreme")))
    return seeds


def extra_max_operating(p: Profile) -> list[CaseSeed]:
    seeds: list[CaseSeed] = []
    for ps in np.geomspace(p.p_min, p.p_max, 30):
        for cas, m in ((175.0, 0.82), (130.0, 0.6), (250.0, 2.0), (400.0, 0.9),
                       (60.0, 9.5)):
            seeds.append(CaseSeed({"ps": float(ps), "cas_limit": cas, "mach_limit": m},
                                  ("sweep",)))
    # At (and ulps either side of) the crossover pressure: the branch switch.
    for cas, m in ((175.0, 0.82), (130.0, 0.6), (250.0, 0.9)):
        hx = _f(airdata.crossover_altitude(cas, m, profile=p))
        px = _f(airdata.pressure_at_altitude(hx, profile=p))
        for v, moved in around(px):
            seeds.append(CaseSeed({"ps": v, "cas_limit": cas, "mach_limit": m},
                                  ("crossover",) + (("ulp-offset",) if moved else ())))
    for v, _ in _derived_limit(10.0 * p.a0):
        seeds.append(CaseSeed({"ps": p.p0, "cas_limit": v, "mach_limit": 0.8},
                              ("derived-limit", "extreme")))
    seeds.append(CaseSeed({"ps": p.p0, "cas_limit": 1e-6, "mach_limit": 1e-8}, ("tiny",)))
    # Each limit in a window around Mach 2^-40 (the switch to the linear forms) with the
    # other one tiny: the switch of "both tiny" moves by the window's offsets.
    for v in window(2.0**-40):
        seeds.append(CaseSeed({"ps": 0.25 * p.p0, "cas_limit": 2.0**-42 * p.a0,
                               "mach_limit": v}, ("tiny", "seam-window")))
        seeds.append(CaseSeed({"ps": 0.25 * p.p0, "cas_limit": v * p.a0,
                               "mach_limit": 2.0**-42}, ("tiny", "seam-window")))
    # Below Mach 2^-40: either limit governing, the other one not tiny or tiny too.
    # (1e-16, 1e-15): CAS governs with both tiny and normal in binary32 too.
    for cas, m in ((1.0e-150, 1.0e-155), (1.0e-160, 1.0e-150), (1.0e-13, 5.0e-16),
                   (1.0e-16, 1.0e-15), (150.0, 1.0e-20), (1.0e-20, 0.8)):
        seeds.append(CaseSeed({"ps": 0.25 * p.p0, "cas_limit": cas, "mach_limit": m},
                              ("tiny",) + (("extreme",) if min(cas, m) < 1e-100 else ())))
    # Both limits tiny near their tie cas = a0 M sqrt(ps/p0) (= 0.5 a0 M here), on a
    # window either side; and subnormal limits.
    for m in (1.0e-300, 1.0e-20):
        tie = 0.5 * p.a0 * m
        for v in [tie] + window(tie)[:14]:
            seeds.append(CaseSeed({"ps": 0.25 * p.p0, "cas_limit": v, "mach_limit": m},
                                  ("tiny", "crossover", "seam-window")))
    for cas, m in ((1.0, 5e-324), (5e-324, 5e-324), (1e-310, 1e-310), (1e-310, 1e-12)):
        seeds.append(CaseSeed({"ps": 54019.9, "cas_limit": cas, "mach_limit": m},
                              ("tiny", "extreme")))
    return seeds
