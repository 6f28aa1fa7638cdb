"""The air-data chain ``air_data`` against the individual functions, and its noise band.

``air_data`` runs the same kernels as the public functions (CHN-1 of docs/equations.md),
so each output must equal the public function called directly on the same inputs, bit
for bit: pressure altitude, impact pressure, Mach, CAS, SAT, TAS, EAS, density altitude,
dynamic pressure and baro-corrected altitude.  The density is checked against
ps/(R SAT) (U.S. Standard Atmosphere 1976 eq. 42, the gas law) within 1 ulp.

Noise band: a negative impact pressure no deeper than ``noise_band`` is an aircraft at
rest (a real air-data computer shows zero airspeed; common practice, no source): zero
speeds, Mach 0, SAT = TAT, status IMPACT_PRESSURE_ZEROED (4).  Deeper is refused.
"""

from __future__ import annotations

import math
from typing import Any

import numpy as np
import pytest
from hypothesis import given
from hypothesis import strategies as st

import airdata
from airdata import DomainError, Status
from airdata.chain import NOISE_BAND

ZEROED = Status.IMPACT_PRESSURE_ZEROED

FIELDS = ("pressure_altitude", "baro_altitude", "impact_pressure", "mach", "cas", "eas",
          "tas", "sat", "density", "density_altitude", "dynamic_pressure")


def same_bits(a: Any, b: Any) -> bool:
    a, b = np.asarray(a, dtype=np.float64), np.asarray(b, dtype=np.float64)
    return a.shape == b.shape and np.array_equal(a.view(np.uint64), b.view(np.uint64))


def direct(ps: Any, pt: Any, tat: Any, recovery: Any, setting: Any, profile: str
           ) -> dict[str, Any]:
    """Every chain output from the public functions, in the chain's order (CHN-1)."""
    qc = np.asarray(pt, dtype=np.float64) - np.asarray(ps, dtype=np.float64)
    qc = np.maximum(qc, 0.0)  # the zeroed noise band
    if np.ndim(qc) == 0:
        qc = float(qc)
    mach = airdata.mach_from_impact_pressure(qc, ps, profile=profile)
    sat = airdata.sat_from_tat(tat, mach, recovery)
    prof = airdata.get_profile(profile)
    return {
        "pressure_altitude": airdata.pressure_altitude(ps, profile=profile),
        "baro_altitude": (None if setting is None
                          else airdata.baro_corrected_altitude(ps, setting, profile=profile)),
        "impact_pressure": qc,
        "mach": mach,
        "cas": airdata.cas_from_impact_pressure(qc, profile=profile),
        "eas": airdata.eas_from_mach(mach, ps, profile=profile),
        "tas": airdata.tas_from_mach(mach, sat, profile=profile),
        "sat": sat,
        "density": np.asarray(ps) / (prof.R * np.asarray(sat)),
        "density_altitude": airdata.density_altitude(ps, sat, profile=profile),
        "dynamic_pressure": airdata.dynamic_pressure(mach, ps, profile=profile),
    }


def assert_matches_direct(out: airdata.AirData, ref: dict[str, Any]) -> None:
    for key in FIELDS:
        got, want = getattr(out, key), ref[key]
        if want is None:
            assert got is None, key
        elif key == "density":
            # ps/(R sat): the chain and the test may group R differently; 1 ulp.
            assert np.all(np.abs(np.asarray(got) - want) <= np.spacing(np.abs(want))), key
        else:
            assert same_bits(got, want), (key, got, want)


@st.composite
def readings(draw: st.DrawFn) -> tuple[float, float, float, float, float | None, str]:
    """Valid sensor readings: ps from an altitude, pt from a Mach number, TAT from SAT."""
    profile = draw(st.sampled_from(["icao", "us1976"]))
    h = draw(st.floats(-1000.0, 30000.0, allow_subnormal=False))
    mach = draw(st.one_of(st.floats(0.0, 1.0), st.floats(1.0, 4.0)))
    dT = draw(st.floats(-30.0, 30.0))
    recovery = draw(st.floats(0.9, 1.0))
    setting = draw(st.one_of(st.none(), st.floats(90000.0, 105000.0)))
    ps = airdata.pressure_at_altitude(h, profile=profile)
    pt = ps + airdata.impact_pressure_from_mach(mach, ps, profile=profile)
    sat = airdata.atmosphere(h, dT, profile=profile).temperature
    tat = airdata.tat_from_sat(sat, mach, recovery)
    return ps, pt, tat, recovery, setting, profile


@given(readings())
def test_chain_equals_individual_functions_scalar(r: tuple[Any, ...]) -> None:
    ps, pt, tat, recovery, setting, profile = r
    out = airdata.air_data(ps, pt, tat, recovery, setting, profile=profile, strict=False)
    if out.status != Status.OK:
        # refused (a density altitude beyond the model) only where an individual
        # function refuses too: never assumed away
        with pytest.raises(DomainError):
            direct(ps, pt, tat, recovery, setting, profile)
        return
    assert out.profile == profile
    assert isinstance(out.status, int)
    assert_matches_direct(out, direct(ps, pt, tat, recovery, setting, profile))


@given(st.lists(readings(), min_size=2, max_size=8))
def test_chain_equals_individual_functions_array(rs: list[tuple[Any, ...]]) -> None:
    profile = rs[0][5]
    rs = [r for r in rs if r[5] == profile]
    ps, pt, tat, rec = (np.array([r[i] for r in rs]) for i in range(4))
    setting = np.full(len(rs), 101325.0)
    out = airdata.air_data(ps, pt, tat, rec, setting, profile=profile, strict=False)
    ok = out.status == Status.OK
    for k in np.flatnonzero(~ok):  # each refusal also refused by an individual function
        with pytest.raises(DomainError):
            direct(ps[k], pt[k], tat[k], rec[k], setting[k], profile)
    if not ok.all():
        return
    assert out.status.dtype == np.int8
    assert_matches_direct(out, direct(ps, pt, tat, rec, setting, profile))


def test_baro_altitude_none_without_setting() -> None:
    out = airdata.air_data(80000.0, 85000.0, 280.0)
    assert out.baro_altitude is None
    out = airdata.air_data(np.array([80000.0, 70000.0]), 85000.0, 280.0)
    assert out.baro_altitude is None
    with_setting = airdata.air_data(80000.0, 85000.0, 280.0, setting=99000.0)
    assert with_setting.baro_altitude == airdata.baro_corrected_altitude(80000.0, 99000.0)
    # the standard setting gives the pressure altitude (ALT-2 with H(p0) = 0)
    std = airdata.air_data(80000.0, 85000.0, 280.0, setting=101325.0)
    assert std.baro_altitude == std.pressure_altitude


def test_at_rest_at_sea_level_standard_day() -> None:
    """Sea level, standard day, at rest: H = 0, rho = 1.225 kg/m3 (common practice, no
    source), density altitude 0, all speeds 0, status OK (qc is exactly zero)."""
    out = airdata.air_data(101325.0, 101325.0, 288.15)
    assert out.status == Status.OK
    assert out.pressure_altitude == 0.0
    assert out.density == pytest.approx(1.225, abs=5e-4)
    assert out.density_altitude == pytest.approx(0.0, abs=1e-9)
    for key in ("mach", "cas", "eas", "tas", "impact_pressure", "dynamic_pressure"):
        assert getattr(out, key) == 0.0, key
    assert out.sat == 288.15


@pytest.mark.parametrize("mach", [0.1, 0.3, 0.5, 0.8, 0.95])
def test_cas_eas_tas_equal_at_sea_level_standard_day(mach: float) -> None:
    """CAS = EAS = TAS at sea level on a standard day (common practice, no source)."""
    qc = airdata.impact_pressure_from_mach(mach, 101325.0)
    tat = airdata.tat_from_sat(288.15, mach)
    out = airdata.air_data(101325.0, 101325.0 + qc, tat)
    assert out.status == Status.OK
    assert out.cas == pytest.approx(out.eas, rel=1e-12)
    assert out.eas == pytest.approx(out.tas, rel=1e-12)
    assert out.mach == pytest.approx(mach, rel=1e-12)
    assert out.sat == pytest.approx(288.15, rel=1e-12)


# ----------------------------------------------------------------- noise band ---------

@pytest.mark.parametrize("qc", [-NOISE_BAND, -50.0, -1.0, -2.0**-20])
def test_noise_band_reads_as_rest(qc: float) -> None:
    ps, tat = 95000.0, 291.5
    out = airdata.air_data(ps, ps + qc, tat, setting=101000.0)
    assert (ps + qc) - ps == qc  # the reading really is that negative
    assert out.status == ZEROED == 4
    for key in ("impact_pressure", "mach", "cas", "eas", "tas", "dynamic_pressure"):
        value = getattr(out, key)
        assert value == 0.0 and math.copysign(1.0, value) == 1.0, key
    assert out.sat == tat
    assert out.pressure_altitude == airdata.pressure_altitude(ps)
    assert out.baro_altitude == airdata.baro_corrected_altitude(ps, 101000.0)
    assert out.density_altitude == airdata.density_altitude(ps, tat)
    # the same as a reading of exactly zero, apart from the status
    zero = airdata.air_data(ps, ps, tat, setting=101000.0)
    assert zero.status == Status.OK
    for key in FIELDS:
        assert same_bits(getattr(out, key), getattr(zero, key)), key


def test_noise_band_is_adjustable() -> None:
    assert airdata.air_data(80000.0, 79990.0, 280.0, noise_band=10.0).status == ZEROED
    with pytest.raises(DomainError):
        airdata.air_data(80000.0, 79989.0, 280.0, noise_band=10.0)
    assert airdata.air_data(80000.0, 75000.0, 280.0, noise_band=5000.0).status == ZEROED
    # noise_band = 0: no negative reading is accepted, zero still is
    assert airdata.air_data(80000.0, 80000.0, 280.0, noise_band=0.0).status == Status.OK
    with pytest.raises(DomainError):
        airdata.air_data(80000.0, float(np.nextafter(80000.0, 0.0)), 280.0, noise_band=0.0)


@pytest.mark.parametrize("qc", [-NOISE_BAND - 0.5, -1000.0, -79999.0])
def test_beyond_noise_band_strict_raises(qc: float) -> None:
    ps = 80000.0
    with pytest.raises(DomainError) as info:
        airdata.air_data(ps, ps + qc, 280.0)
    exc = info.value
    assert isinstance(exc, ValueError)
    assert exc.status == Status.INVALID_INPUT
    assert "qc" in exc.argument
    assert exc.value == qc
    assert repr(qc) in str(exc) and repr(NOISE_BAND) in str(exc)


def test_beyond_noise_band_non_strict_leaves_others_alone() -> None:
    ps = np.array([80000.0, 80000.0, 80000.0, 60000.0, 60000.0])
    pt = np.array([85000.0, 79950.0, 79000.0, 60000.0, 70000.0])  # ok, zeroed, bad, 0, ok
    tat = np.array([280.0, 281.0, 282.0, 283.0, 284.0])
    out = airdata.air_data(ps, pt, tat, setting=101000.0, strict=False)
    assert out.status.tolist() == [Status.OK, ZEROED, Status.INVALID_INPUT, Status.OK,
                                   Status.OK]
    keep = np.array([0, 1, 3, 4])
    ref = airdata.air_data(ps[keep], pt[keep], tat[keep], setting=101000.0)
    assert ref.status.tolist() == [Status.OK, ZEROED, Status.OK, Status.OK]
    for key in FIELDS:
        got = np.asarray(getattr(out, key))
        assert math.isnan(got[2]), key
        assert same_bits(got[keep], getattr(ref, key)), key
    with pytest.raises(DomainError) as info:
        airdata.air_data(ps, pt, tat)
    assert info.value.index == (2,)


def test_scalar_non_strict_bad_sample() -> None:
    out = airdata.air_data(80000.0, 79000.0, 280.0, strict=False)
    assert out.status == Status.INVALID_INPUT and isinstance(out.status, int)
    assert all(math.isnan(getattr(out, k)) for k in FIELDS if k != "baro_altitude")
    assert out.baro_altitude is None


@pytest.mark.parametrize("band", [math.nan, math.inf, -math.inf, -1.0, -1e-300,
                                  float(np.nextafter(10000.0, math.inf)), 1e6])
def test_noise_band_validation(band: float) -> None:
    # A DomainError with the status the vectors and the C port use for it: NaN, infinite
    # or negative invalid, above 10000 Pa out of range (also with strict=False).
    want = Status.OUT_OF_RANGE if band > 0 and math.isfinite(band) else Status.INVALID_INPUT
    for strict in (True, False):
        with pytest.raises(DomainError, match="noise_band") as info:
            airdata.air_data(80000.0, 85000.0, 280.0, noise_band=band, strict=strict)
        assert info.value.argument == "noise_band" and info.value.status == want


@pytest.mark.parametrize("band", [0.0, 1e-9, NOISE_BAND, 10000.0])
def test_noise_band_valid_values(band: float) -> None:
    assert airdata.air_data(80000.0, 85000.0, 280.0, noise_band=band).status == Status.OK


def test_chain_statuses_for_derived_errors_non_strict() -> None:
    """Each failing sample carries its own status; the others are untouched."""
    ps = np.array([80000.0, 1000.0, 170000.0, 80000.0])
    pt = np.array([85000.0, 200000.0, 171000.0, np.nan])
    tat = np.array([280.0, 3000.0, 60.0, 280.0])
    out = airdata.air_data(ps, pt, tat, strict=False)
    # ok, Mach beyond 10, density beyond the model, NaN reading
    assert out.status.tolist() == [Status.OK, Status.OUT_OF_RANGE, Status.OUT_OF_RANGE,
                                   Status.INVALID_INPUT]
    ref = airdata.air_data(ps[0], pt[0], tat[0])
    for key in FIELDS:
        got = getattr(out, key)
        if got is None:
            continue
        assert same_bits(got[0], getattr(ref, key)), key
        assert np.all(np.isnan(got[1:])), key


def test_output_table_names_every_output_once_in_si() -> None:
    # one table describes the chain's outputs for the whole package (reduce columns,
    # recorded comparisons, compute's rows, port comparisons): the AirData fields in
    # order, distinct short names, and each SI unit of the dimension it claims
    from airdata import units as u
    from airdata.chain import AIR_DATA_OUTPUTS, OUTPUT_INFO

    assert tuple(o.key for o in OUTPUT_INFO) == AIR_DATA_OUTPUTS
    assert len({o.short for o in OUTPUT_INFO}) == len(OUTPUT_INFO)
    for o in OUTPUT_INFO:
        dim, factor, offset = u.UNITS[o.si_unit]
        assert (dim, factor, offset) == (o.dimension, 1, 0), o.key
