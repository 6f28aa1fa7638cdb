"""Flight-envelope limits: stall speeds, crossover altitude, maximum operating CAS/Mach,
ceiling margin and the envelope table.

The references are computed independently here, in mpmath at 50 digits, from the
published equations: NACA Report 1135 (1953) eq. 44 (subsonic pitot relation) and
eq. 100 (Rayleigh pitot formula), and the ICAO standard atmosphere (ICAO Doc 7488/3)
with its defining constants typed in from memory.  The U.S. Standard Atmosphere 1976
as implemented by the ``fluids`` package is a second, independent reference.
"""

from __future__ import annotations

import dataclasses
import math
from pathlib import Path

import fluids
import mpmath
import numpy as np
import pytest

from airdata import DomainError, Status, eas_from_mach, pressure_at_altitude
from airdata.aircraft import load_aircraft
from airdata.limits import (
    ceiling_margin,
    crossover_altitude,
    envelope,
    max_operating_cas,
    max_operating_mach,
    stall_cas,
    stall_eas,
    stall_mach,
    stall_tas,
)

#: This module's own 50-digit context (mpmath's global one is left alone).
mp = mpmath.MPContext()
mp.dps = 50

DEMO = Path(__file__).resolve().parent.parent / "examples" / "demo_aircraft.toml"

# ICAO Doc 7488/3 defining constants (from memory).
G0 = mp.mpf("9.80665")
R = mp.mpf("287.05287")
T0 = mp.mpf("288.15")
P0 = mp.mpf("101325")
L0 = mp.mpf("0.0065")  # troposphere lapse rate, K/m (temperature falls)
L2 = mp.mpf("0.001")  # 20-32 km, K/m (temperature rises)
T11 = T0 - L0 * 11000
P11 = P0 * (T11 / T0) ** (G0 / (R * L0))
P20 = P11 * mp.exp(-G0 * 9000 / (R * T11))
A0 = mp.sqrt(mp.mpf("1.4") * R * T0)
RHO0 = P0 / (R * T0)
KT = mp.mpf(1852) / 3600  # international knot, exact
FT = mp.mpf("0.3048")  # international foot, exact


def mp_pressure_altitude(ps: mp.mpf) -> mp.mpf:
    """ICAO atmosphere inverted per layer, 0..32 km (ICAO Doc 7488/3)."""
    if ps >= P11:
        return (T0 / L0) * (1 - (ps / P0) ** (R * L0 / G0))
    if ps >= P20:
        return 11000 - R * T11 / G0 * mp.log(ps / P11)
    return 20000 + (T11 / L2) * ((ps / P20) ** (-R * L2 / G0) - 1)


def mp_pressure(h: mp.mpf) -> mp.mpf:
    """ICAO standard pressure, 0..20 km (ICAO Doc 7488/3)."""
    if h <= 11000:
        return P0 * ((T0 - L0 * h) / T0) ** (G0 / (R * L0))
    return P11 * mp.exp(-G0 * (h - 11000) / (R * T11))


def mp_f(m: mp.mpf) -> mp.mpf:
    """qc/ps: NACA Report 1135 eq. 44 (M <= 1) and eq. 100 (M > 1)."""
    if m <= 1:
        return (1 + m * m / 5) ** mp.mpf("3.5") - 1
    u = m * m
    return mp.mpf("1.2") * u * (mp.mpf("7.2") * u / (7 * u - 1)) ** mp.mpf("2.5") - 1


def mp_finv(x: mp.mpf) -> mp.mpf:
    """Inverse of mp_f by root finding (independent of the library's solver)."""
    sub = mp.sqrt(5 * ((1 + x) ** (1 / mp.mpf("3.5")) - 1))
    if sub <= 1:
        return sub
    return mp.findroot(lambda m: mp_f(m) - x, sub)


def mp_crossover(cas: mp.mpf, mach: mp.mpf) -> mp.mpf:
    return mp_pressure_altitude(P0 * mp_f(cas / A0) / mp_f(mach))


def mp_stall_eas(w: float, s: float, cl: float, n: float = 1.0) -> mp.mpf:
    return mp.sqrt(2 * mp.mpf(n) * mp.mpf(w) / (RHO0 * mp.mpf(s) * mp.mpf(cl)))


# ------------------------------------------------------------------ crossover altitude

PAIRS = [  # (CAS limit kt, Mach limit): round illustrative pairs, not any aircraft's
    (310.0, 0.78),
    (300.0, 0.78),
    (350.0, 0.82),
    (250.0, 0.60),
    (340.0, 0.90),
    (200.0, 0.80),  # crossover in the isothermal layer (11-20 km)
    (150.0, 0.80),  # crossover above 20 km
    (400.0, 0.95),
]


@pytest.mark.parametrize(("cas_kt", "mach"), PAIRS)
def test_crossover_matches_mpmath_naca1135_eq44_icao(cas_kt: float, mach: float) -> None:
    # Reference: NACA Report 1135 eq. 44 + ICAO Doc 7488/3, mpmath at 50 digits.
    cas = cas_kt * (1852.0 / 3600.0)
    got = crossover_altitude(cas, mach)
    ref = mp_crossover(mp.mpf(cas), mp.mpf(mach))
    # Condition: dh/dcas * cas and dh/dM * M, a few thousand metres each; allow
    # 4 eps times that scale (the accuracy goal of the project is 2).
    scale = abs(ref) + 2 * 40000
    assert abs(got - float(ref)) <= 4 * 2.0**-52 * scale, (got, float(ref))


def test_crossover_310kt_m078_value() -> None:
    # Reference: NACA Report 1135 eq. 44 + ICAO Doc 7488/3 in mpmath: 27 779 ft (8467 m).
    # The pair is a round illustrative one, not any aircraft's.
    ref_ft = float(mp_crossover(310 * KT, mp.mpf("0.78")) / FT)
    assert 27_700.0 < ref_ft < 27_850.0  # guards the mpmath reference itself
    got_ft = crossover_altitude(310.0 * 1852.0 / 3600.0, 0.78) / 0.3048
    assert got_ft == pytest.approx(ref_ft, abs=1e-6)


def test_crossover_us1976_matches_fluids_atmosphere() -> None:
    # Reference: fluids.ATMOSPHERE_1976 (U.S. Standard Atmosphere 1976), solved for the
    # altitude of the crossover pressure with scipy's brentq; the pressure from
    # NACA Report 1135 eq. 44 in mpmath.  fluids works in geometric altitude.
    from scipy.optimize import brentq

    r_us = mp.mpf("8314.32") / mp.mpf("28.9644")  # USSA 1976 R*/M0 (from memory)
    a0_us = mp.sqrt(mp.mpf("1.4") * r_us * T0)
    for cas_kt, mach in PAIRS[:5]:
        cas = cas_kt * 1852.0 / 3600.0
        ps = float(P0 * mp_f(mp.mpf(cas) / a0_us) / mp_f(mp.mpf(mach)))
        z = brentq(lambda z, ps=ps: fluids.ATMOSPHERE_1976(z).P - ps, -1000.0, 30000.0,
                   xtol=1e-9)
        r0 = 6356766.0  # USSA 1976 effective earth radius (from memory)
        h_ref = r0 * z / (r0 + z)
        got = crossover_altitude(cas, mach, profile="us1976")
        # fluids' pressures agree with the model to 4e-15 relative and brentq stops at
        # 1e-9 m: measured differences <= 7.3e-12 m, so 1e-9 m (not the 2 mm it was)
        assert got == pytest.approx(h_ref, abs=1e-9), (cas_kt, mach)


# ------------------------------------------------------------------ stall speeds

STALL_CASES = [  # (weight N, area m2, CLmax, load factor): invented round numbers
    (451_106.0, 105.0, 1.45, 1.0),
    (5_000.0, 12.0, 1.6, 1.0),
    (200_000.0, 60.0, 2.4, 1.3),
    (1.0e6, 300.0, 0.9, 2.5),
]


@pytest.mark.parametrize(("w", "s", "cl", "n"), STALL_CASES)
def test_stall_eas_lift_equation_mpmath(w: float, s: float, cl: float, n: float) -> None:
    # Reference: lift = n W = rho0 eas^2 S CL / 2, rho0 = p0/(R T0) (ICAO Doc 7488/3),
    # mpmath at 50 digits.
    ref = float(mp_stall_eas(w, s, cl, n))
    assert stall_eas(w, s, cl, n) == pytest.approx(ref, rel=4 * 2.0**-52)


def test_stall_eas_sea_level_density_common_practice() -> None:
    # Sea-level density 1.225 kg/m3 (common practice, no source): a wing of 1 m2 at
    # CL 1 carrying 1.225 * 50 N stalls at 10 m/s EAS.
    assert stall_eas(1.225 * 50.0, 1.0, 1.0) == pytest.approx(10.0, rel=1e-4)


@pytest.mark.parametrize("h", [0.0, 1000.0, 5000.0, 9000.0, 11000.0, 15000.0, 19000.0])
def test_stall_eas_unchanged_with_altitude(h: float) -> None:
    # EAS is defined by the dynamic pressure rho V^2/2 = rho0 EAS^2/2 (common practice,
    # no source): the stall EAS does not depend on altitude.  Checked two ways: through
    # the library's SPD-2 and through the density of the standard day (mpmath ICAO).
    w, s, cl = 451_106.0, 105.0, 1.45
    ps = pressure_at_altitude(h)
    eas = stall_eas(w, s, cl)
    assert eas_from_mach(stall_mach(w, s, cl, ps), ps) == pytest.approx(eas, rel=1e-15)
    hm = mp.mpf(h)
    temp = T0 - L0 * hm if hm <= 11000 else T11
    rho = mp_pressure(hm) / (R * temp)
    tas = stall_tas(w, s, cl, ps, float(temp))
    assert float(mp.mpf(tas) * mp.sqrt(rho / RHO0)) == pytest.approx(float(eas), rel=1e-14)


@pytest.mark.parametrize("h", [0.0, 3000.0, 8000.0, 11000.0, 16000.0])
def test_stall_cas_mach_tas_mpmath_naca1135(h: float) -> None:
    # Reference: M = eas / (a0 sqrt(ps/p0)); cas = a0 f^-1(ps f(M)/p0) with f from
    # NACA Report 1135 eq. 44; tas = M sqrt(1.4 R T); ICAO Doc 7488/3; mpmath.
    w, s, cl = 451_106.0, 105.0, 1.45
    hm = mp.mpf(h)
    ps_mp = mp_pressure(hm)
    ps = float(ps_mp)
    ps_mp = mp.mpf(ps)
    eas = mp_stall_eas(w, s, cl)
    m = eas / (A0 * mp.sqrt(ps_mp / P0))
    cas = A0 * mp_finv(ps_mp * mp_f(m) / P0)
    tas = m * mp.sqrt(mp.mpf("1.4") * R * 250)
    assert stall_mach(w, s, cl, ps) == pytest.approx(float(m), rel=8 * 2.0**-52)
    assert stall_cas(w, s, cl, ps) == pytest.approx(float(cas), rel=16 * 2.0**-52)
    assert stall_tas(w, s, cl, ps, 250.0) == pytest.approx(float(tas), rel=8 * 2.0**-52)


def test_stall_cas_equals_eas_at_sea_level_and_exceeds_it_aloft() -> None:
    # CAS = EAS at sea level on a standard day; CAS > EAS at altitude, by a few knots
    # at jet altitudes (common practice, no source).
    w, s, cl = 451_106.0, 105.0, 1.45
    eas = stall_eas(w, s, cl)
    assert stall_cas(w, s, cl, 101325.0) == pytest.approx(eas, rel=1e-14)
    hs = np.array([3000.0, 6000.0, 9000.0, 12000.0])
    cas = stall_cas(w, s, cl, pressure_at_altitude(hs))
    assert np.all(np.diff(cas) > 0.0) and np.all(cas > eas)
    assert 0.5 < (cas[-1] - eas) / (1852.0 / 3600.0) < 10.0


def test_stall_load_factor_scales_with_sqrt_n() -> None:
    # Lift equation: V_stall proportional to sqrt(n) (common practice, no source).
    assert stall_eas(1e5, 50.0, 1.5, 2.0) == pytest.approx(
        math.sqrt(2.0) * stall_eas(1e5, 50.0, 1.5), rel=1e-15)


# ------------------------------------------------------------------ maximum operating speed


@pytest.mark.parametrize(("cas_kt", "mach"), PAIRS)
def test_max_operating_is_cas_limit_below_and_mach_limit_above(cas_kt: float,
                                                               mach: float) -> None:
    # Definition of the (CAS limit, Mach limit) pair (common practice, no source):
    # the lower speed governs; below the crossover that is the CAS limit exactly,
    # above it the Mach limit exactly.  The other value against mpmath (NACA 1135 eq. 44).
    cas = cas_kt * 1852.0 / 3600.0
    hx = crossover_altitude(cas, mach)
    for h in (hx - 3000.0, hx - 200.0, hx - 1.0):
        if h < -4000.0:
            continue
        ps = pressure_at_altitude(h)
        assert max_operating_cas(ps, cas, mach) == cas
        mmo = max_operating_mach(ps, cas, mach)
        ref = mp_finv(P0 * mp_f(mp.mpf(cas) / A0) / mp.mpf(ps))
        assert mmo < mach
        assert mmo == pytest.approx(float(ref), rel=8 * 2.0**-52)
    for h in (hx + 1.0, hx + 200.0, hx + 3000.0):
        ps = pressure_at_altitude(h)
        assert max_operating_mach(ps, cas, mach) == mach
        vmo = max_operating_cas(ps, cas, mach)
        ref = A0 * mp_finv(mp.mpf(ps) * mp_f(mp.mpf(mach)) / P0)
        assert vmo < cas
        assert vmo == pytest.approx(float(ref), rel=8 * 2.0**-52)


def test_max_operating_continuous_at_crossover() -> None:
    # At the crossover both limits coincide (definition; NACA 1135 eq. 44).
    cas, mach = 310.0 * 1852.0 / 3600.0, 0.78
    ps = pressure_at_altitude(crossover_altitude(cas, mach))
    assert max_operating_cas(ps, cas, mach) == pytest.approx(cas, rel=1e-12)
    assert max_operating_mach(ps, cas, mach) == pytest.approx(mach, rel=1e-12)


def test_max_operating_supersonic_mach_limit_uses_rayleigh_branch() -> None:
    # A Mach 2 limit at 15 km: CAS from NACA Report 1135 eq. 100 (mpmath).
    ps = pressure_at_altitude(15000.0)
    vmo = max_operating_cas(ps, 400.0, 2.0)
    ref = A0 * mp_finv(mp.mpf(ps) * mp_f(mp.mpf(2)) / P0)
    assert vmo == pytest.approx(float(ref), rel=8 * 2.0**-52)


def test_ceiling_margin_fixed_pressure_altitude() -> None:
    # Maximum altitude as a fixed pressure altitude: margin = ceiling - H(ps), with H
    # from the ICAO atmosphere in mpmath (ICAO Doc 7488/3).
    ceiling = 39000.0 * 0.3048
    for h in (0.0, 5000.0, 11887.2, 14000.0):
        ps = pressure_at_altitude(h)
        ref = mp.mpf(ceiling) - mp_pressure_altitude(mp.mpf(ps))
        assert ceiling_margin(ps, ceiling) == pytest.approx(float(ref), abs=1e-9)
    assert ceiling_margin(pressure_at_altitude(12000.0), ceiling) < 0.0


# ------------------------------------------------------------------ envelope table


def test_envelope_demo_aircraft_consistent_with_kernels() -> None:
    # The table's columns against the kernels and the mpmath crossover (NACA 1135,
    # ICAO); the demo aircraft itself is invented and is not a reference.
    env = envelope(DEMO)
    ac = env.aircraft
    assert env.altitude[0] == 0.0 and env.altitude[-1] == pytest.approx(ac.ceiling)
    ref = mp_crossover(mp.mpf(ac.cas_limit), mp.mpf(ac.mach_limit))
    assert env.crossover_altitude == pytest.approx(float(ref), abs=1e-8)
    below = env.altitude < env.crossover_altitude
    assert np.all(env.max_operating.cas[below] == ac.cas_limit)
    assert np.all(env.max_operating.mach[~below] == ac.mach_limit)
    assert np.array_equal(env.mach_governs, ~below)
    # Stall EAS constant down the table; stall CAS at sea level equals it.
    assert np.all(env.stall_heavy.eas == env.stall_heavy.eas[0])
    assert env.stall_heavy.cas[0] == pytest.approx(env.stall_heavy.eas[0], rel=1e-14)
    assert np.all(env.stall_light.cas < env.stall_heavy.cas)
    # TAS = EAS sqrt(rho0/rho) and EAS = M a0 sqrt(ps/p0) (definitions).
    rho = env.pressure / (287.05287 * env.sat)
    rho0 = 101325.0 / (287.05287 * 288.15)
    for s in (env.stall_heavy, env.max_operating):
        np.testing.assert_allclose(s.tas, s.eas * np.sqrt(rho0 / rho), rtol=1e-13)
    assert not env.above_ceiling.any()


SUPERSONIC = DEMO.with_name("demo_aircraft_supersonic.toml")


def test_envelope_of_a_supersonic_mach_limit() -> None:
    # A Mach limit of 1.8: the crossover by NACA 1135 eq. 100 (the supersonic branch of
    # mp_f) in mpmath; below it the CAS limit governs exactly, above it the Mach limit;
    # EAS = M a0 sqrt(ps/p0) and the supersonic pitot relation give the CAS of Mach 1.8.
    env = envelope(SUPERSONIC)
    ac = env.aircraft
    assert ac.mach_limit == 1.8
    ref = mp_crossover(mp.mpf(ac.cas_limit), mp.mpf(ac.mach_limit))
    assert env.crossover_altitude == pytest.approx(float(ref), abs=1e-8)
    below = env.altitude < env.crossover_altitude
    assert below.any() and (~below).any()
    assert np.all(env.max_operating.cas[below] == ac.cas_limit)
    assert np.all(env.max_operating.mach[~below] == ac.mach_limit)
    assert np.array_equal(env.mach_governs, ~below)
    for h, cas in zip(env.altitude[~below], env.max_operating.cas[~below], strict=True):
        ps = mp_pressure(mp.mpf(float(h)))  # CAS of M 1.8: qc = ps f(1.8) = p0 f(cas/a0)
        want = A0 * mp_finv(ps * mp_f(mp.mpf("1.8")) / P0)
        assert float(cas) == pytest.approx(float(want), rel=1e-12)


def test_envelope_limits_that_never_cross_in_the_model() -> None:
    # CAS limit 900 kt (Mach 1.36 at sea level) and a Mach limit of 1.05: the crossover
    # pressure lies below -5000 m, so the Mach limit governs at every altitude.
    ac = load_aircraft(SUPERSONIC)
    fast = dataclasses.replace(ac, cas_limit=900.0 * float(KT), mach_limit=1.05)
    ps_cross = P0 * mp_f(mp.mpf(fast.cas_limit) / A0) / mp_f(mp.mpf("1.05"))
    assert ps_cross > 177687  # beyond the pressure range of the model (-5000 m)
    env = envelope(fast)
    assert math.isnan(env.crossover_altitude)
    assert env.mach_governs.all() and np.all(env.max_operating.mach == 1.05)
    # the public firmware function keeps its subsonic valid range (like the vectors)
    _raises(crossover_altitude, fast.cas_limit, 1.05, status=Status.OUT_OF_RANGE,
            arg="mach_limit")


def test_envelope_off_standard_day_changes_only_tas() -> None:
    # Off-standard temperature leaves pressure-based speeds alone (definition of CAS,
    # EAS and Mach in terms of pressures; common practice, no source).
    a = envelope(DEMO)
    b = envelope(DEMO, dT=15.0)
    assert np.array_equal(a.max_operating.cas, b.max_operating.cas)
    assert np.array_equal(a.stall_heavy.mach, b.stall_heavy.mach)
    assert np.all(b.max_operating.tas > a.max_operating.tas)


def test_envelope_marks_rows_above_ceiling() -> None:
    env = envelope(DEMO, [0.0, 12000.0, 13000.0])
    assert env.above_ceiling.tolist() == [False, True, True]


# ------------------------------------------------------------------ domain errors


def _raises(fn: object, *a: object, status: Status, arg: str, **k: object) -> None:
    with pytest.raises(DomainError) as info:
        fn(*a, **k)  # type: ignore[operator]
    assert info.value.status == status
    assert info.value.argument == arg


W, S, CL = 451_106.0, 105.0, 1.45


@pytest.mark.parametrize(("args", "status", "arg"), [
    ((-1.0, S, CL), Status.INVALID_INPUT, "weight"),
    ((0.0, S, CL), Status.INVALID_INPUT, "weight"),
    ((math.nan, S, CL), Status.INVALID_INPUT, "weight"),
    ((2e7, S, CL), Status.OUT_OF_RANGE, "weight"),
    ((W, 0.0, CL), Status.INVALID_INPUT, "wing_area"),
    ((W, -5.0, CL), Status.INVALID_INPUT, "wing_area"),
    ((W, math.inf, CL), Status.INVALID_INPUT, "wing_area"),
    ((W, S, 0.0), Status.INVALID_INPUT, "cl_max"),
    ((W, S, -1.2), Status.INVALID_INPUT, "cl_max"),
    ((W, S, 14.0), Status.OUT_OF_RANGE, "cl_max"),
    ((W, S, CL, 0.0), Status.INVALID_INPUT, "load_factor"),
    ((W, S, CL, -1.0), Status.INVALID_INPUT, "load_factor"),
    ((W, S, CL, 12.0), Status.OUT_OF_RANGE, "load_factor"),
    ((1e7, 1e-6, 1e-6), Status.OUT_OF_RANGE, "stall EAS"),
])
def test_stall_eas_domain_errors(args: tuple[float, ...], status: Status, arg: str) -> None:
    _raises(stall_eas, *args, status=status, arg=arg)


def test_stall_altitude_domain_errors() -> None:
    _raises(stall_mach, W, S, CL, -3.0, status=Status.INVALID_INPUT, arg="ps")
    _raises(stall_cas, W, S, CL, 1e6, status=Status.OUT_OF_RANGE, arg="ps")
    _raises(stall_tas, W, S, CL, 50000.0, 0.0, status=Status.INVALID_INPUT, arg="sat")
    _raises(stall_tas, W, S, CL, 50000.0, 20.0, status=Status.OUT_OF_RANGE, arg="sat")
    # Stall Mach above 10: a heavy, small wing at the top of the model.
    _raises(stall_mach, 1e6, 10.0, 0.5, 1.0, status=Status.OUT_OF_RANGE, arg="stall Mach")
    # CAS beyond 10 a0: Mach 9 below sea level (ps = 170 kPa) exceeds qc at CAS = 10 a0.
    ps = 170000.0
    eas = 9.0 * 340.294 * math.sqrt(ps / 101325.0)
    w = 0.5 * (101325.0 / (287.05287 * 288.15)) * eas**2 * 1.0 * 1.0
    _raises(stall_cas, w, 1.0, 1.0, ps, status=Status.OUT_OF_RANGE, arg="qc/p0")


def test_crossover_domain_errors() -> None:
    _raises(crossover_altitude, 0.0, 0.8, status=Status.INVALID_INPUT, arg="cas_limit")
    _raises(crossover_altitude, -150.0, 0.8, status=Status.INVALID_INPUT, arg="cas_limit")
    _raises(crossover_altitude, math.nan, 0.8, status=Status.INVALID_INPUT, arg="cas_limit")
    _raises(crossover_altitude, 4000.0, 0.8, status=Status.OUT_OF_RANGE, arg="cas_limit")
    _raises(crossover_altitude, 160.0, 0.0, status=Status.INVALID_INPUT, arg="mach_limit")
    _raises(crossover_altitude, 160.0, -0.5, status=Status.INVALID_INPUT, arg="mach_limit")
    # A Mach limit of 1 or above: no subsonic crossover (out of range).
    _raises(crossover_altitude, 160.0, 1.0, status=Status.OUT_OF_RANGE, arg="mach_limit")
    _raises(crossover_altitude, 160.0, 1.6, status=Status.OUT_OF_RANGE, arg="mach_limit")
    # Crossover outside the atmosphere: above its top, below -5000 m.
    _raises(crossover_altitude, 0.5, 0.99, status=Status.OUT_OF_RANGE,
            arg="crossover pressure")
    _raises(crossover_altitude, 400.0, 0.5, status=Status.OUT_OF_RANGE,
            arg="crossover pressure")


def test_max_operating_and_ceiling_domain_errors() -> None:
    for fn in (max_operating_cas, max_operating_mach):
        _raises(fn, 0.0, 160.0, 0.8, status=Status.INVALID_INPUT, arg="ps")
        _raises(fn, 30000.0, -1.0, 0.8, status=Status.INVALID_INPUT, arg="cas_limit")
        _raises(fn, 30000.0, 3500.0, 0.8, status=Status.OUT_OF_RANGE, arg="cas_limit")
        _raises(fn, 30000.0, 160.0, 0.0, status=Status.INVALID_INPUT, arg="mach_limit")
        _raises(fn, 30000.0, 160.0, 11.0, status=Status.OUT_OF_RANGE, arg="mach_limit")
    _raises(ceiling_margin, 30000.0, 90000.0, status=Status.OUT_OF_RANGE, arg="ceiling")
    _raises(ceiling_margin, math.inf, 9000.0, status=Status.INVALID_INPUT, arg="ps")


def test_non_strict_gives_nan_only_for_bad_elements_and_strict_names_index() -> None:
    w = np.array([W, -1.0, W, W])
    cl = np.array([CL, CL, 0.0, CL])
    out = stall_cas(w, S, cl, 30000.0, strict=False)
    assert np.isnan(out[1]) and np.isnan(out[2])
    assert out[0] == out[3] == stall_cas(W, S, CL, 30000.0)
    with pytest.raises(DomainError) as info:
        stall_cas(w, S, cl, 30000.0)
    assert info.value.index == (1,) and info.value.argument == "weight"
    x = crossover_altitude([160.0, 160.0], [0.8, 1.0], strict=False)
    assert np.isfinite(x[0]) and np.isnan(x[1])
    m = max_operating_mach([30000.0, -1.0], 160.0, 0.8, strict=False)
    assert np.isfinite(m[0]) and np.isnan(m[1])


def test_envelope_argument_errors() -> None:
    with pytest.raises(DomainError):
        envelope(DEMO, load_factor=0.0)
    with pytest.raises(DomainError):
        envelope(DEMO, [0.0, 90000.0])
    with pytest.raises(ValueError, match="one-dimensional"):
        envelope(DEMO, [[0.0, 1000.0]])


# ------------------------------------------------------------------ accuracy sweeps

EPS = 2.0**-52


def _cse(got: float, ref: mp.mpf, fn: object, x: list[mp.mpf]) -> float:
    """Condition-scaled error of the project's accuracy metric; derivatives by mpmath."""
    scale = abs(ref)
    for j in range(len(x)):
        def g(t: mp.mpf, j: int = j) -> mp.mpf:
            y = list(x)
            y[j] = t
            return fn(*y)  # type: ignore[operator]
        scale += abs(mp.diff(g, x[j]) * x[j])
    return float(abs(mp.mpf(got) - ref) / (EPS * scale))


def test_crossover_and_stall_cas_accuracy_sweep() -> None:
    # cse <= 2 against NACA Report 1135 eq. 44 + ICAO atmosphere in mpmath (50 digits),
    # over random CAS 60..350 m/s, Mach 0.3..0.99, weights, areas, CLmax, altitudes.
    rng = np.random.default_rng(5)
    worst = 0.0
    for _ in range(30):
        cas, mach = rng.uniform(60.0, 350.0), rng.uniform(0.3, 0.99)
        ref = mp_crossover(mp.mpf(cas), mp.mpf(mach))
        if not -4900 < ref < 32000:
            continue
        got = crossover_altitude(cas, mach)
        worst = max(worst, _cse(got, ref, mp_crossover, [mp.mpf(cas), mp.mpf(mach)]))

    def sc(p: mp.mpf, w: mp.mpf, s: mp.mpf, cl: mp.mpf) -> mp.mpf:
        m = mp_stall_eas(w, s, cl) / (A0 * mp.sqrt(p / P0))
        return A0 * mp_finv(p * mp_f(m) / P0)

    for _ in range(30):
        ps = float(pressure_at_altitude(rng.uniform(-4000.0, 30000.0)))
        w, s, cl = rng.uniform(1e3, 1e6), rng.uniform(5.0, 300.0), rng.uniform(0.5, 3.0)
        x = [mp.mpf(v) for v in (ps, w, s, cl)]
        worst = max(worst, _cse(stall_cas(w, s, cl, ps), sc(*x), sc, x))
    assert worst <= 2.0, worst
