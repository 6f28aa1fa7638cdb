"""Sensor error budgets: analytic sensitivities against mpmath (50 digits) and binary64
finite differences, linear propagation against Monte Carlo, domain errors.

The mpmath chain below is written independently from the published equations:
NACA Report 1135 (1953) eq. 44 and eq. 100 for the pitot relations, the total-temperature
relation TAT = SAT (1 + 0.2 r M^2) (NACA Report 1135 eq. 43, from memory), and the ICAO
standard atmosphere (ICAO Doc 7488/3, defining constants typed in from memory).
"""

from __future__ import annotations

import math

import mpmath
import numpy as np
import pytest

from airdata import DomainError, Status, air_data
from airdata.budget import (
    OUTPUTS,
    SensorAccuracy,
    error_budget,
    sensitivities,
)

#: This module's own 50-digit context (mpmath's global one is left alone).
mp = mpmath.MPContext()
mp.dps = 50

G0 = mp.mpf("9.80665")
R = mp.mpf("287.05287")
T0 = mp.mpf("288.15")
P0 = mp.mpf("101325")
L0 = mp.mpf("0.0065")
L2 = mp.mpf("0.001")
T11 = T0 - L0 * 11000
P11 = P0 * (T11 / T0) ** (G0 / (R * L0))
P20 = P11 * mp.exp(-G0 * 9000 / (R * T11))
A0 = mp.sqrt(mp.mpf("1.4") * R * T0)
FT = 0.3048
KT = 1852.0 / 3600.0


def mp_h(ps: mp.mpf) -> mp.mpf:
    """Pressure altitude, ICAO Doc 7488/3, 0..32 km."""
    if ps >= P11:
        return (T0 / L0) * (1 - (ps / P0) ** (R * L0 / G0))
    if ps >= P20:
        return 11000 - R * T11 / G0 * mp.log(ps / P11)
    return 20000 + (T11 / L2) * ((ps / P20) ** (-R * L2 / G0) - 1)


def mp_pressure(h: mp.mpf) -> mp.mpf:
    """Standard pressure, ICAO Doc 7488/3, 0..20 km."""
    if h <= 11000:
        return P0 * ((T0 - L0 * h) / T0) ** (G0 / (R * L0))
    return P11 * mp.exp(-G0 * (h - 11000) / (R * T11))


def mp_f(m: mp.mpf) -> mp.mpf:
    """qc/ps, NACA Report 1135 eq. 44 (M <= 1) and eq. 100 (M > 1)."""
    if m <= 1:
        return (1 + m * m / 5) ** mp.mpf("3.5") - 1
    u = m * m
    return mp.mpf("1.2") * u * (mp.mpf("7.2") * u / (7 * u - 1)) ** mp.mpf("2.5") - 1


def mp_finv(x: mp.mpf) -> mp.mpf:
    sub = mp.sqrt(5 * ((1 + x) ** (1 / mp.mpf("3.5")) - 1))
    if sub <= 1:
        return sub
    return mp.findroot(lambda m: mp_f(m) - x, sub)


def mp_outputs(ps: mp.mpf, qc: mp.mpf, tat: mp.mpf, r: mp.mpf) -> list[mp.mpf]:
    """(H, CAS, M, TAS, SAT, EAS) in the order of OUTPUTS."""
    m = mp_finv(qc / ps)
    sat = tat / (1 + r * m * m / 5)
    return [mp_h(ps), A0 * mp_finv(qc / P0), m, m * mp.sqrt(mp.mpf("1.4") * R * sat), sat,
            A0 * m * mp.sqrt(ps / P0)]


def mp_jacobian(ps: float, qc: float, tat: float, r: float, pitot: str) -> list[list[mp.mpf]]:
    x = [mp.mpf(ps), mp.mpf(qc if pitot == "qc" else ps + qc), mp.mpf(tat)]
    rr = mp.mpf(r)

    def out(k: int, a: mp.mpf, b: mp.mpf, c: mp.mpf) -> mp.mpf:
        q = b if pitot == "qc" else b - a
        return mp_outputs(a, q, c, rr)[k]

    jac = []
    for k in range(6):
        row = []
        for j in range(3):
            def g(t: mp.mpf, k: int = k, j: int = j) -> mp.mpf:
                y = list(x)
                y[j] = t
                return out(k, *y)
            row.append(mp.diff(g, x[j]))
        jac.append(row)
    return jac


POINTS = [  # (ps Pa, qc Pa, TAT K, recovery): subsonic, transonic, supersonic, layers 0-2
    (101325.0, 1000.0, 290.0, 1.0),
    (70000.0, 15000.0, 270.0, 1.0),
    (30000.0, 20000.0, 250.0, 0.98),
    (20000.0, 30000.0, 260.0, 1.0),
    (12000.0, 60000.0, 330.0, 1.0),
    (5000.0, 1500.0, 230.0, 0.95),
]


@pytest.mark.parametrize("pitot", ["qc", "pt"])
@pytest.mark.parametrize(("ps", "qc", "tat", "r"), POINTS)
def test_sensitivities_match_mpmath_50_digits(ps: float, qc: float, tat: float, r: float,
                                              pitot: str) -> None:
    # Reference: derivatives of the NACA 1135 / ICAO chain by mpmath.diff at 50 digits.
    sens = sensitivities(ps, qc, tat, r, pitot=pitot)
    ref = mp_jacobian(ps, qc, tat, r, pitot)
    for k, name in enumerate(OUTPUTS):
        assert float(sens.values[name]) == pytest.approx(
            float(mp_outputs(mp.mpf(ps), mp.mpf(qc), mp.mpf(tat), mp.mpf(r))[k]), rel=1e-13)
        for j in range(3):
            got = float(sens.jacobian[k, j])
            want = float(ref[k][j])
            if abs(want) < 1e-30:
                assert got == 0.0, (name, j)
            else:
                assert got == pytest.approx(want, rel=2e-12), (name, sens.inputs[j])


@pytest.mark.parametrize(("ps", "qc", "tat", "r"), POINTS)
def test_sensitivities_match_finite_differences_of_air_data(ps: float, qc: float, tat: float,
                                                            r: float) -> None:
    # Reference: central differences of the library's own chain air_data in binary64
    # (an internal consistency check of the derivation, step 1e-6 relative).
    sens = sensitivities(ps, qc, tat, r)
    x = np.array([ps, qc, tat])

    def outs(v: np.ndarray) -> np.ndarray:
        o = air_data(v[0], v[0] + v[1], v[2], r)
        return np.array([getattr(o, k) for k in OUTPUTS])

    for j in range(3):
        h = x[j] * 1e-6
        e = np.zeros(3)
        e[j] = h
        fd = (outs(x + e) - outs(x - e)) / (2.0 * h)
        scale = np.abs(outs(x)) / x[j]  # output per unit relative input change
        np.testing.assert_allclose(sens.jacobian[:, j], fd, rtol=2e-6, atol=1e-7 * scale.max())


def test_altitude_per_hpa_sea_level_common_practice_and_hydrostatic() -> None:
    # About 27 ft per hPa at sea level (common practice, no source); exactly
    # R T0/(g0 p0) from the hydrostatic equation with ICAO constants (ICAO Doc 7488/3).
    b = error_budget([0.0, 5000.0, 11000.0, 15000.0], [100.0], SensorAccuracy())
    ft_per_hpa = -b.altitude_per_ps * 100.0 / FT
    assert 26.5 < ft_per_hpa[0] < 28.0
    for h, got in zip([0.0, 5000.0, 11000.0, 15000.0], b.altitude_per_ps, strict=True):
        temp = T0 - L0 * h if h <= 11000 else T11
        p = (P0 * (temp / T0) ** (G0 / (R * L0)) if h <= 11000
             else P11 * mp.exp(-G0 * (h - 11000) / (R * T11)))
        assert got == pytest.approx(float(-R * temp / (G0 * p)), rel=1e-12)


def test_cas_per_hpa_matches_incompressible_limit_at_low_speed() -> None:
    # Low speed: qc -> rho0 V^2/2, so dV/dqc -> 1/(rho0 V) (Bernoulli; common practice,
    # no source); compressibility makes it smaller at higher speeds (NACA 1135 eq. 44).
    v = np.array([10.0, 100.0, 200.0])
    b = error_budget([0.0], v, SensorAccuracy())
    rho0 = float(P0 / (R * T0))
    assert b.cas_per_qc[0] == pytest.approx(1.0 / (rho0 * v[0]), rel=1e-3)
    assert np.all(b.cas_per_qc < 1.0 / (rho0 * v))
    for vi, got in zip(v, b.cas_per_qc, strict=True):
        ref = mp.diff(lambda q: A0 * mp_finv(q / P0), P0 * mp_f(mp.mpf(vi) / A0))
        assert got == pytest.approx(float(ref), rel=1e-12)


ACC = SensorAccuracy(ps_bias=30.0, ps_noise=50.0, pitot_bias=-15.0, pitot_noise=20.0,
                     tat_bias=0.2, tat_noise=0.5)


@pytest.mark.parametrize("pitot", ["qc", "pt"])
def test_linear_and_monte_carlo_agree_within_sampling_error(pitot: str) -> None:
    # Monte Carlo on the full chain (seeded PCG64) against first-order propagation:
    # shift and sd agree within 5 standard errors at every grid point and output.
    alt = [0.0, 6000.0, 12000.0]
    cas = [100.0, 180.0, 260.0]
    lin = error_budget(alt, cas, ACC, pitot=pitot)
    mc = error_budget(alt, cas, ACC, pitot=pitot, method="monte_carlo", samples=20000,
                      seed=20261201)
    assert mc.shift_se is not None and mc.sd_se is not None
    for k in OUTPUTS:
        assert np.all(np.abs(lin.shift[k] - mc.shift[k]) <= 5.0 * mc.shift_se[k]), k
        assert np.all(np.abs(lin.sd[k] - mc.sd[k]) <= 5.0 * mc.sd_se[k]), k
        assert np.all(mc.sd[k] > 0.0)


def test_monte_carlo_sees_second_order_shift_that_linear_misses() -> None:
    # Large impact-pressure noise at low speed: CAS ~ sqrt(qc) is concave, so the mean
    # CAS error is 0.5 d2CAS/dqc2 sigma^2 < 0 (second-order propagation; the second
    # derivative by mpmath from NACA 1135 eq. 44).  The linear shift is zero.
    sigma = 300.0
    acc = SensorAccuracy(pitot_noise=sigma)
    lin = error_budget([0.0], [60.0], acc)
    mc = error_budget([0.0], [60.0], acc, method="monte_carlo", samples=50000, seed=7)
    assert mc.shift_se is not None
    assert lin.shift["cas"][0, 0] == 0.0
    qc = P0 * mp_f(mp.mpf(60) / A0)
    d2 = mp.diff(lambda q: A0 * mp_finv(q / P0), qc, 2)
    second = float(d2) * 0.5 * sigma**2
    got, se = mc.shift["cas"][0, 0], mc.shift_se["cas"][0, 0]
    assert got < -4.0 * se  # clearly not zero: the check can tell the two apart
    assert abs(got - second) <= 4.0 * se + 0.05 * abs(second)


def test_monte_carlo_repeats_with_seed() -> None:
    a = error_budget([1000.0], [120.0], ACC, method="monte_carlo", samples=500, seed=3)
    b = error_budget([1000.0], [120.0], ACC, method="monte_carlo", samples=500, seed=3)
    c = error_budget([1000.0], [120.0], ACC, method="monte_carlo", samples=500, seed=4)
    assert a.sd["cas"][0, 0] == b.sd["cas"][0, 0] != c.sd["cas"][0, 0]


def test_bias_only_and_zero_accuracy() -> None:
    # No noise: sd is zero and the shift is J b (definition of linear propagation);
    # no error at all: every figure is zero.
    b = error_budget([3000.0], [150.0], SensorAccuracy(ps_bias=100.0))
    j = b.sensitivities.jacobian[0, 0]
    for k, name in enumerate(OUTPUTS):
        assert b.sd[name][0, 0] == 0.0
        assert b.shift[name][0, 0] == pytest.approx(100.0 * j[k, 0], rel=1e-15)
    z = error_budget([3000.0], [150.0], SensorAccuracy())
    assert all(np.all(z.rms[name] == 0.0) for name in OUTPUTS)


def test_pt_sensor_static_error_enters_impact_pressure() -> None:
    # With an absolute total-pressure sensor, qc = pt - ps: a static bias changes CAS,
    # which a differential sensor's CAS does not see (definition of qc).
    acc = SensorAccuracy(ps_bias=100.0)
    assert error_budget([0.0], [150.0], acc, pitot="qc").shift["cas"][0, 0] == 0.0
    cas_shift = error_budget([0.0], [150.0], acc, pitot="pt").shift["cas"][0, 0]
    assert cas_shift < 0.0


def test_noise_in_percent_of_reading_follows_the_hydrostatic_equation() -> None:
    # A static sensor with noise k * ps: sd(H) = |dH/dps| k ps = k R T(H) / g0 at every
    # altitude (hydrostatic equation, ICAO constants from ICAO Doc 7488/3), independent
    # of the pressure itself.
    k = 2.0e-4
    alts = [0.0, 5000.0, 11000.0, 15000.0]
    b = error_budget(alts, [120.0], SensorAccuracy(ps_noise_rel=k))
    for i, h in enumerate(alts):
        temp = T0 - L0 * h if h <= 11000 else T11
        assert b.sd["pressure_altitude"][i, 0] == pytest.approx(float(k * R * temp / G0),
                                                                rel=1e-12)
        assert b.shift["pressure_altitude"][i, 0] == 0.0


def test_bias_in_percent_of_reading_of_a_pitot_sensor() -> None:
    # A qc bias of k qc shifts CAS by dCAS/dqc k qc; a pt sensor's bias k pt by
    # dCAS/dqc k (ps + qc) (qc = pt - ps): the reading each sensor actually has.
    k = 1.0e-3
    alt, cas = [0.0, 9000.0], [80.0, 200.0]
    for pitot in ("qc", "pt"):
        b = error_budget(alt, cas, SensorAccuracy(pitot_bias_rel=k), pitot=pitot)
        for i, h in enumerate(alt):
            for j, v in enumerate(cas):
                qc = float(P0 * mp_f(mp.mpf(v) / A0))
                ps = float(mp_pressure(mp.mpf(h)))
                reading = qc if pitot == "qc" else ps + qc
                dcas = b.sensitivities.d("cas", b.sensitivities.inputs[1])[i, j]
                assert b.shift["cas"][i, j] == pytest.approx(dcas * k * reading, rel=1e-12)


def test_percent_of_reading_linear_and_monte_carlo_agree() -> None:
    acc = SensorAccuracy(ps_noise=20.0, ps_noise_rel=3e-4, pitot_bias_rel=-2e-3,
                         pitot_noise_rel=5e-3, tat_noise=0.3)
    alt, cas = [0.0, 8000.0], [90.0, 240.0]
    lin = error_budget(alt, cas, acc)
    mc = error_budget(alt, cas, acc, method="monte_carlo", samples=20000, seed=11)
    assert mc.shift_se is not None and mc.sd_se is not None
    for k in OUTPUTS:
        assert np.all(np.abs(lin.shift[k] - mc.shift[k]) <= 5.0 * mc.shift_se[k]), k
        assert np.all(np.abs(lin.sd[k] - mc.sd[k]) <= 5.0 * mc.sd_se[k]), k


def test_accuracy_describe_states_the_units() -> None:
    acc = SensorAccuracy(ps_noise=50.0, pitot_bias=-20.0, pitot_bias_rel=1e-4, tat_noise=0.5)
    assert acc.describe("hPa") == ("static 0 hPa / 0.5 hPa, pitot -0.2 hPa + 0.01 % rdg / "
                                   "0 hPa, TAT 0 K / 0.5 K")
    assert acc.describe("Pa").startswith("static 0 Pa / 50 Pa, pitot -20 Pa + 0.01 % rdg")


# ------------------------------------------------------------------ domain errors


@pytest.mark.parametrize(("kw", "status"), [
    ({"ps_noise": -1.0}, Status.INVALID_INPUT),
    ({"pitot_noise": math.nan}, Status.INVALID_INPUT),
    ({"tat_bias": math.inf}, Status.INVALID_INPUT),
    ({"pitot_bias": 2.0e4}, Status.OUT_OF_RANGE),
    ({"tat_noise": 2.0e4}, Status.OUT_OF_RANGE),
    ({"ps_noise_rel": -1e-4}, Status.INVALID_INPUT),
    ({"ps_noise_rel": 0.2}, Status.OUT_OF_RANGE),
    ({"pitot_bias_rel": -0.2}, Status.OUT_OF_RANGE),
    ({"pitot_bias_rel": math.nan}, Status.INVALID_INPUT),
])
def test_sensor_accuracy_domain_errors(kw: dict[str, float], status: Status) -> None:
    with pytest.raises(DomainError) as info:
        SensorAccuracy(**kw)
    assert info.value.status == status and info.value.argument == next(iter(kw))


def test_sensitivities_domain_errors() -> None:
    cases = [
        ((101325.0, 0.0, 288.0), Status.INVALID_INPUT, "qc"),
        ((101325.0, -5.0, 288.0), Status.INVALID_INPUT, "qc"),
        ((0.0, 100.0, 288.0), Status.INVALID_INPUT, "ps"),
        ((101325.0, 100.0, 20.0), Status.OUT_OF_RANGE, "tat"),
        ((10.0, 5.0e4, 288.0), Status.OUT_OF_RANGE, "qc/ps"),
        ((170000.0, 1.5e7, 288.0), Status.OUT_OF_RANGE, "qc/p0"),
    ]
    for args, status, name in cases:
        with pytest.raises(DomainError) as info:
            sensitivities(*args)
        assert info.value.status == status and info.value.argument == name
    s = sensitivities([101325.0, 101325.0], [1000.0, 0.0], 288.0, strict=False)
    assert np.all(np.isfinite(s.jacobian[0])) and np.all(np.isnan(s.jacobian[1]))
    with pytest.raises(ValueError, match="pitot"):
        sensitivities(101325.0, 1000.0, 288.0, pitot="static")


def test_error_budget_domain_errors() -> None:
    acc = SensorAccuracy(ps_noise=10.0)
    with pytest.raises(DomainError) as info:
        error_budget([0.0, 90000.0], [100.0], acc)
    assert info.value.argument == "altitudes" and info.value.index == (1,)
    with pytest.raises(DomainError) as info:
        error_budget([0.0], [0.0], acc)
    assert info.value.argument == "cas" and info.value.status == Status.INVALID_INPUT
    with pytest.raises(DomainError) as info:
        error_budget([80000.0], [1000.0], acc)
    assert info.value.argument == "Mach at grid point"
    with pytest.raises(DomainError) as info:
        error_budget([0.0], [100.0], acc, dT=150.0)
    assert info.value.argument == "dT"
    with pytest.raises(DomainError) as info:
        error_budget([0.0], [100.0], acc, recovery=1.5)
    assert info.value.argument == "recovery"
    with pytest.raises(ValueError, match="method"):
        error_budget([0.0], [100.0], acc, method="exact")
    with pytest.raises(ValueError, match="samples"):
        error_budget([0.0], [100.0], acc, method="monte_carlo", samples=1)
    with pytest.raises(ValueError, match="one-dimensional"):
        error_budget([[0.0]], [100.0], acc)
