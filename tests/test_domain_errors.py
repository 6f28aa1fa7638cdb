"""Every DomainError path of every public function, strict and non-strict.

The valid ranges below are the ones the issue and the docstrings state; the ends that are
derived from a profile (pressure at the top and bottom of the model, the altimeter
setting range, geometric altitude) are taken from ``airdata._domains`` and checked
against published table values (U.S. Standard Atmosphere 1976 / ICAO Doc 7488, from
memory) so that a wrong derivation shows.

For each (function, argument) pair the tests check, scalar and array:
the exception is a ``ValueError`` subclass; ``.argument``, ``.value``, ``.index`` and
``.status`` (``INVALID_INPUT`` for NaN, infinities and impossible signs, ``OUT_OF_RANGE``
for proper numbers outside the range); the message names argument, value, index and
range; ``strict=False`` gives NaN at exactly the bad elements and the strict values,
bit for bit, elsewhere; the range ends are valid and their outward neighbours are not.
"""

from __future__ import annotations

import math
import re
from collections.abc import Callable
from dataclasses import dataclass
from typing import Any

import numpy as np
import pytest

import airdata
import airdata._domains as dom
from airdata import DomainError, Status

ICAO = airdata.ICAO
P_RANGE = (dom.pressure(ICAO).lo, dom.pressure(ICAO).hi)
SETTING_RANGE = (dom.setting(ICAO).lo, dom.setting(ICAO).hi)
Z_RANGE = (dom.geometric(ICAO).lo, dom.geometric(ICAO).hi)


@dataclass(frozen=True)
class Arg:
    """Valid range of one argument: ``sign`` says which proper numbers are invalid."""

    lo: float
    hi: float
    sign: str  # "any", "nonnegative" or "positive"


# Ranges as the issue and the docstrings state them.
ALTITUDE = Arg(-5000.0, 84852.0, "any")  # ICAO Doc 7488 / US 1976 layer model (from memory)
GEOMETRIC = Arg(*Z_RANGE, "any")
DELTA_T = Arg(-100.0, 100.0, "any")
PRESSURE = Arg(*P_RANGE, "positive")
SETTING = Arg(*SETTING_RANGE, "positive")
ELEVATION = Arg(-5000.0, 11000.0, "any")
TEMPERATURE = Arg(50.0, 5000.0, "positive")
MACH = Arg(0.0, 10.0, "nonnegative")
SPEED = Arg(0.0, 4000.0, "nonnegative")
IMPACT = Arg(0.0, 1.0e8, "nonnegative")
RECOVERY = Arg(0.0, 1.0, "nonnegative")
TOTAL_PRESSURE = Arg(0.0, 1.0e8, "positive")


@dataclass(frozen=True)
class Fn:
    """A public function, valid values of its arguments and each argument's range."""

    name: str
    func: Callable[..., Any]
    defaults: dict[str, float]
    ranges: dict[str, Arg]


FUNCS = [
    Fn("atmosphere", airdata.atmosphere, {"h": 1000.0, "dT": 5.0},
       {"h": ALTITUDE, "dT": DELTA_T}),
    Fn("geopotential_altitude", airdata.geopotential_altitude, {"z": 1000.0},
       {"z": GEOMETRIC}),
    Fn("geometric_altitude", airdata.geometric_altitude, {"h": 1000.0}, {"h": ALTITUDE}),
    Fn("pressure_altitude", airdata.pressure_altitude, {"ps": 80000.0}, {"ps": PRESSURE}),
    Fn("pressure_at_altitude", airdata.pressure_at_altitude, {"h": 1000.0},
       {"h": ALTITUDE}),
    Fn("baro_corrected_altitude", airdata.baro_corrected_altitude,
       {"ps": 80000.0, "setting": 101325.0}, {"ps": PRESSURE, "setting": SETTING}),
    Fn("altimeter_setting", airdata.altimeter_setting, {"ps": 80000.0, "elevation": 100.0},
       {"ps": SETTING, "elevation": ELEVATION}),
    Fn("density_altitude", airdata.density_altitude, {"ps": 80000.0, "sat": 250.0},
       {"ps": PRESSURE, "sat": TEMPERATURE}),
    Fn("impact_pressure_from_mach", airdata.impact_pressure_from_mach,
       {"mach": 0.5, "ps": 80000.0}, {"mach": MACH, "ps": PRESSURE}),
    Fn("mach_from_impact_pressure", airdata.mach_from_impact_pressure,
       {"qc": 5000.0, "ps": 80000.0}, {"qc": IMPACT, "ps": PRESSURE}),
    Fn("impact_pressure_from_cas", airdata.impact_pressure_from_cas, {"cas": 100.0},
       {"cas": SPEED}),
    Fn("cas_from_impact_pressure", airdata.cas_from_impact_pressure, {"qc": 5000.0},
       {"qc": IMPACT}),
    Fn("cas_from_mach", airdata.cas_from_mach, {"mach": 0.5, "ps": 80000.0},
       {"mach": MACH, "ps": PRESSURE}),
    Fn("mach_from_cas", airdata.mach_from_cas, {"cas": 100.0, "ps": 80000.0},
       {"cas": SPEED, "ps": PRESSURE}),
    Fn("eas_from_mach", airdata.eas_from_mach, {"mach": 0.5, "ps": 80000.0},
       {"mach": MACH, "ps": PRESSURE}),
    Fn("mach_from_eas", airdata.mach_from_eas, {"eas": 100.0, "ps": 80000.0},
       {"eas": SPEED, "ps": PRESSURE}),
    Fn("tas_from_mach", airdata.tas_from_mach, {"mach": 0.5, "sat": 250.0},
       {"mach": MACH, "sat": TEMPERATURE}),
    Fn("mach_from_tas", airdata.mach_from_tas, {"tas": 150.0, "sat": 250.0},
       {"tas": SPEED, "sat": TEMPERATURE}),
    Fn("dynamic_pressure", airdata.dynamic_pressure, {"mach": 0.5, "ps": 80000.0},
       {"mach": MACH, "ps": PRESSURE}),
    Fn("sat_from_tat", airdata.sat_from_tat, {"tat": 280.0, "mach": 0.5, "recovery": 0.9},
       {"tat": TEMPERATURE, "mach": MACH, "recovery": RECOVERY}),
    Fn("tat_from_sat", airdata.tat_from_sat, {"sat": 250.0, "mach": 0.5, "recovery": 0.9},
       {"sat": TEMPERATURE, "mach": MACH, "recovery": RECOVERY}),
    Fn("air_data", airdata.air_data,
       {"ps": 80000.0, "pt": 85000.0, "tat": 280.0, "recovery": 0.95, "setting": 101325.0},
       {"ps": PRESSURE, "pt": TOTAL_PRESSURE, "tat": TEMPERATURE, "recovery": RECOVERY,
        "setting": SETTING}),
]

FN_PARAMS = [pytest.param(f, id=f.name) for f in FUNCS]
FN_ARG_PARAMS = [pytest.param(f, a, id=f"{f.name}-{a}") for f in FUNCS for a in f.ranges]


def outputs(result: Any) -> list[Any]:
    """Every numeric output of a call: records are flattened to their float fields."""
    if isinstance(result, airdata.Atmosphere):
        return [result.temperature, result.pressure, result.density, result.speed_of_sound,
                result.dynamic_viscosity, result.kinematic_viscosity]
    if isinstance(result, airdata.AirData):
        return [result.pressure_altitude, result.baro_altitude, result.impact_pressure,
                result.mach, result.cas, result.eas, result.tas, result.sat, result.density,
                result.density_altitude, result.dynamic_pressure]
    return [result]


def invalid_values(arg: Arg) -> list[float]:
    vals = [math.nan, math.inf, -math.inf]
    if arg.sign in ("nonnegative", "positive"):
        vals += [-1.0, -5e-324, -1e300]
    if arg.sign == "positive":
        vals += [0.0, -0.0]
    return vals


def out_of_range_values(arg: Arg) -> list[float]:
    vals = [np.nextafter(arg.hi, math.inf), arg.hi * 2.0 + 1.0, 1e300]
    if arg.sign == "any" or arg.lo > 0.0:
        below = [np.nextafter(arg.lo, -math.inf), arg.lo - abs(arg.lo) / 2.0 - 1.0]
        vals += [v for v in below if arg.sign == "any" or v > 0.0]
    return [float(v) for v in vals]


def _range_numbers(text: str) -> list[float]:
    """The numbers inside the first [...] of a range description (else all of them)."""
    inside = re.search(r"\[([^]]*)\]", text)
    part = text if inside is None else inside.group(1)
    return [float(x) for x in re.findall(r"-?\d+(?:\.\d*)?(?:e[-+]?\d+)?", part)]


def check_error(exc: DomainError, argument: str, value: float, index: tuple[int, ...] | None,
                status: Status) -> None:
    """The attributes and the message of one DomainError."""
    assert isinstance(exc, ValueError)
    assert exc.argument == argument
    assert exc.status == status
    assert exc.index == index
    if math.isnan(value):
        assert math.isnan(exc.value)
    else:
        assert exc.value == value and math.copysign(1.0, exc.value) == math.copysign(1.0, value)
    msg = str(exc)
    assert argument in msg
    assert repr(float(value)) in msg
    if index is not None:
        shown = str(index[0]) if len(index) == 1 else str(index)
        assert f"index {shown}" in msg
    else:
        assert "index" not in msg
    assert exc.valid in msg
    assert ("invalid" if status == Status.INVALID_INPUT else "out of range") in msg


def _expect_range_in(exc: DomainError, arg: Arg) -> None:
    nums = _range_numbers(exc.valid)
    assert arg.lo in nums and arg.hi in nums, (exc.valid, arg)


@pytest.mark.parametrize(("fn", "arg"), FN_ARG_PARAMS)
def test_invalid_scalar(fn: Fn, arg: str) -> None:
    spec = fn.ranges[arg]
    for v in invalid_values(spec):
        with pytest.raises(DomainError) as info:
            fn.func(**{**fn.defaults, arg: v})
        check_error(info.value, arg, v, None, Status.INVALID_INPUT)
        _expect_range_in(info.value, spec)


@pytest.mark.parametrize(("fn", "arg"), FN_ARG_PARAMS)
def test_out_of_range_scalar(fn: Fn, arg: str) -> None:
    spec = fn.ranges[arg]
    for v in out_of_range_values(spec):
        with pytest.raises(DomainError) as info:
            fn.func(**{**fn.defaults, arg: v})
        check_error(info.value, arg, v, None, Status.OUT_OF_RANGE)
        _expect_range_in(info.value, spec)


def _bad_samples(spec: Arg) -> list[tuple[float, Status]]:
    return ([(v, Status.INVALID_INPUT) for v in invalid_values(spec)]
            + [(v, Status.OUT_OF_RANGE) for v in out_of_range_values(spec)])


def _same_bits(a: Any, b: Any) -> bool:
    a, b = np.asarray(a, dtype=np.float64), np.asarray(b, dtype=np.float64)
    return a.shape == b.shape and np.array_equal(a.view(np.uint64), b.view(np.uint64))


@pytest.mark.parametrize(("fn", "arg"), FN_ARG_PARAMS)
def test_array_index_and_non_strict(fn: Fn, arg: str) -> None:
    """Bad element at index 3 of 6 (1-D) and at (1, 2) of a 2x3 array."""
    spec = fn.ranges[arg]
    good = fn.defaults[arg]
    # Good values spread over the range but near the default (stays valid with the
    # other defaults, including derived quantities).
    base = np.array([good, good * 1.001, good * 0.999, good, good * 1.002, good * 0.998])
    for v, status in _bad_samples(spec):
        for shape, where in (((6,), (3,)), ((2, 3), (1, 2))):
            arr = base.reshape(shape).copy()
            arr[where] = v
            with pytest.raises(DomainError) as info:
                fn.func(**{**fn.defaults, arg: arr})
            check_error(info.value, arg, v, where, status)

            loose = outputs(fn.func(**{**fn.defaults, arg: arr}, strict=False))
            ok = base.reshape(shape).copy()
            ok[where] = good
            strict = outputs(fn.func(**{**fn.defaults, arg: ok}))
            mask = np.zeros(shape, dtype=bool)
            mask[where] = True
            for got, ref in zip(loose, strict, strict=True):
                got, ref = np.asarray(got), np.asarray(ref)
                assert got.shape == shape
                assert np.all(np.isnan(got[mask]))
                assert not np.any(np.isnan(got[~mask]))
                assert _same_bits(got[~mask], ref[~mask])


@pytest.mark.parametrize(("fn", "arg"), FN_ARG_PARAMS)
def test_scalar_non_strict_gives_nan(fn: Fn, arg: str) -> None:
    for v, _ in _bad_samples(fn.ranges[arg]):
        for out in outputs(fn.func(**{**fn.defaults, arg: v}, strict=False)):
            assert isinstance(out, float) and math.isnan(out)


def test_first_bad_element_is_reported() -> None:
    """Two bad elements: the error names the first in C order."""
    with pytest.raises(DomainError) as info:
        airdata.pressure_at_altitude(np.array([[0.0, 1.0, -9000.0], [math.nan, 0.0, 0.0]]))
    check_error(info.value, "h", -9000.0, (0, 2), Status.OUT_OF_RANGE)


def test_broadcast_index_is_in_the_broadcast_shape() -> None:
    """A bad element of a (3, 1) argument broadcast against (4,): index in (3, 4)."""
    mach = np.array([[0.5], [-0.1], [0.7]])
    ps = np.full(4, 80000.0)
    with pytest.raises(DomainError) as info:
        airdata.impact_pressure_from_mach(mach, ps)
    check_error(info.value, "mach", -0.1, (1, 0), Status.INVALID_INPUT)
    out = airdata.impact_pressure_from_mach(mach, ps, strict=False)
    assert out.shape == (3, 4)
    assert np.all(np.isnan(out[1])) and not np.any(np.isnan(out[[0, 2]]))


# --- the ends of every range are valid, their outward neighbours are not -------------

#: Other arguments for the end checks where the defaults would push a derived quantity
#: (Mach, density, setting altitude) out of range.  Ends not reachable with any valid
#: companion are listed in _UNREACHABLE.
_END_COMPANIONS: dict[tuple[str, str, str], dict[str, float]] = {
    ("altimeter_setting", "ps", "hi"): {"elevation": -1.0},
    ("altimeter_setting", "elevation", "hi"): {"ps": 40000.0},
    ("density_altitude", "ps", "lo"): {"sat": 150.0},
    ("density_altitude", "ps", "hi"): {"sat": 330.0},
    ("density_altitude", "sat", "lo"): {"ps": 10000.0},
    ("mach_from_eas", "eas", "hi"): {"ps": P_RANGE[1]},
    ("mach_from_eas", "ps", "lo"): {"eas": 1.0},
    ("mach_from_cas", "ps", "lo"): {"cas": 1.0},
    ("mach_from_impact_pressure", "ps", "lo"): {"qc": 1.0},
    ("mach_from_tas", "tas", "hi"): {"sat": 5000.0},
    ("air_data", "ps", "lo"): {"pt": P_RANGE[0] * 1.01, "tat": 150.0},
    ("air_data", "ps", "hi"): {"pt": P_RANGE[1] + 5000.0, "tat": 330.0},
    ("air_data", "tat", "lo"): {"ps": 5000.0, "pt": 5300.0},
}
#: Input-range ends beyond which a derived limit always bites (checked separately below).
_UNREACHABLE = {
    ("impact_pressure_from_cas", "cas", "hi"),  # CAS <= 10 a0 < 4000 m/s
    ("mach_from_cas", "cas", "hi"),
    ("cas_from_impact_pressure", "qc", "hi"),  # qc <= p0 f(10) < 1e8 Pa
    ("mach_from_impact_pressure", "qc", "hi"),  # qc/ps <= f(10) with ps <= 177687 Pa
    ("air_data", "pt", "hi"),
    ("air_data", "pt", "lo"),  # pt's range is (0, 1e8]: 0 itself is invalid
}


@pytest.mark.parametrize(("fn", "arg"), FN_ARG_PARAMS)
def test_range_ends_valid(fn: Fn, arg: str) -> None:
    spec = fn.ranges[arg]
    for end, value in (("lo", spec.lo), ("hi", spec.hi)):
        if (fn.name, arg, end) in _UNREACHABLE:
            continue
        if spec.sign == "positive" and value == 0.0:
            continue
        kw = {**fn.defaults, **_END_COMPANIONS.get((fn.name, arg, end), {}), arg: value}
        for out in outputs(fn.func(**kw)):
            assert out is None or math.isfinite(out), (end, value)
        outward = float(np.nextafter(value, -math.inf if end == "lo" else math.inf))
        with pytest.raises(DomainError) as info:
            fn.func(**kw | {arg: outward})
        assert info.value.argument == arg
        assert info.value.status == (Status.INVALID_INPUT if outward < 0.0 and spec.lo == 0.0
                                     else Status.OUT_OF_RANGE)


def test_profile_derived_ends_match_published_tables() -> None:
    # U.S. Standard Atmosphere 1976 Table I (from memory): 1.7768e5 Pa at -5 km and
    # 3.7338e-1 Pa at 86 km geometric (84 852 m geopotential); ICAO Doc 7488: 22632 Pa at
    # 11 km (from memory).
    assert P_RANGE[1] == pytest.approx(1.7768e5, rel=1e-4)
    assert P_RANGE[0] == pytest.approx(3.7338e-1, rel=1e-4)
    assert SETTING_RANGE[0] == pytest.approx(22632.0, rel=1e-4)
    # Geometric altitude of the range ends, z = r0 h / (r0 - h) with r0 = 6356766 m
    # (US 1976 eq. 18, from memory), in exact rational arithmetic then rounded.
    from fractions import Fraction
    r0 = Fraction(6356766)
    for h, z in ((-5000, Z_RANGE[0]), (84852, Z_RANGE[1])):
        exact = r0 * h / (r0 - h)
        assert abs(Fraction(z) - exact) <= Fraction(abs(float(np.spacing(z))))
    assert Z_RANGE[1] == pytest.approx(86000.0, abs=0.1)  # "86 km", US 1976 (from memory)


# --- derived quantities out of range ---------------------------------------------------

A0 = ICAO.a0


@dataclass(frozen=True)
class Derived:
    """A call whose inputs are each in range but a derived quantity is not."""

    id: str
    func: Callable[..., Any]
    bad: dict[str, float]  # the offending sample
    good: dict[str, float]  # a valid sample of the same arguments
    word: str  # must appear in the reported argument name


DERIVED = [
    # CAS of 1000 m/s at 100 Pa: qc/ps far beyond Mach 10.
    Derived("mach_from_cas-low-pressure", airdata.mach_from_cas,
            {"cas": 1000.0, "ps": 100.0}, {"cas": 100.0, "ps": 80000.0}, "qc/ps"),
    # 3500 m/s is a valid speed but above 10 a0 = 3402.9 m/s.
    Derived("mach_from_cas-above-10a0", airdata.mach_from_cas,
            {"cas": 3500.0, "ps": 100000.0}, {"cas": 100.0, "ps": 100000.0}, "cas"),
    Derived("impact_pressure_from_cas-above-10a0", airdata.impact_pressure_from_cas,
            {"cas": 3500.0}, {"cas": 3000.0}, "cas"),
    Derived("cas_from_impact_pressure-beyond-10a0", airdata.cas_from_impact_pressure,
            {"qc": 5.0e7}, {"qc": 1.0e7}, "qc"),
    Derived("mach_from_impact_pressure-beyond-mach10", airdata.mach_from_impact_pressure,
            {"qc": 2.0e6, "ps": 10000.0}, {"qc": 1.0e6, "ps": 10000.0}, "qc/ps"),
    # Mach 10 at the bottom of the model: CAS above 10 a0.
    Derived("cas_from_mach-high-pressure", airdata.cas_from_mach,
            {"mach": 10.0, "ps": 170000.0}, {"mach": 10.0, "ps": 80000.0}, "qc/p0"),
    Derived("mach_from_eas-beyond-mach10", airdata.mach_from_eas,
            {"eas": 4000.0, "ps": 1000.0}, {"eas": 100.0, "ps": 1000.0}, "mach"),
    Derived("mach_from_tas-beyond-mach10", airdata.mach_from_tas,
            {"tas": 4000.0, "sat": 50.0}, {"tas": 1000.0, "sat": 50.0}, "mach"),
    # 170 000 Pa at 50 K: far denser than the bottom of the model.
    Derived("density_altitude-too-dense", airdata.density_altitude,
            {"ps": 170000.0, "sat": 50.0}, {"ps": 80000.0, "sat": 250.0}, "density"),
    # 1 Pa at 5000 K: thinner than the top of the model.
    Derived("density_altitude-too-thin", airdata.density_altitude,
            {"ps": 1.0, "sat": 5000.0}, {"ps": 1.0, "sat": 200.0}, "density"),
    # Setting target H(ps) - elevation = 10 950 + 5000 m, above the troposphere.
    Derived("altimeter_setting-target-above", airdata.altimeter_setting,
            {"ps": 22800.0, "elevation": -5000.0}, {"ps": 22800.0, "elevation": 10000.0},
            "elevation"),
    Derived("altimeter_setting-target-below", airdata.altimeter_setting,
            {"ps": 170000.0, "elevation": 5000.0}, {"ps": 170000.0, "elevation": -1000.0},
            "elevation"),
    Derived("air_data-beyond-mach10", airdata.air_data,
            {"ps": 1000.0, "pt": 200000.0, "tat": 3000.0},
            {"ps": 1000.0, "pt": 20000.0, "tat": 700.0}, "qc/ps"),
    # Above sea-level pressure, qc/p0 passes the Mach 10 limit before qc/ps does.
    Derived("air_data-cas-beyond-10a0", airdata.air_data,
            {"ps": 170000.0, "pt": 1.417e7, "tat": 4000.0},
            {"ps": 170000.0, "pt": 5.0e6, "tat": 4000.0}, "qc/p0"),
    Derived("air_data-density-out-of-model", airdata.air_data,
            {"ps": 170000.0, "pt": 171000.0, "tat": 60.0},
            {"ps": 170000.0, "pt": 171000.0, "tat": 320.0}, "density"),
    Derived("air_data-qc-beyond-noise-band", airdata.air_data,
            {"ps": 80000.0, "pt": 79000.0, "tat": 280.0},
            {"ps": 80000.0, "pt": 80050.0, "tat": 280.0}, "qc"),
]


@pytest.mark.parametrize("case", [pytest.param(c, id=c.id) for c in DERIVED])
def test_derived_out_of_range(case: Derived) -> None:
    outputs(case.func(**case.good))  # the valid twin is accepted
    with pytest.raises(DomainError) as info:
        case.func(**case.bad)
    exc = info.value
    assert isinstance(exc, ValueError)
    assert case.word.lower() in exc.argument.lower()
    expected = (Status.INVALID_INPUT if case.id.endswith("noise-band")
                else Status.OUT_OF_RANGE)
    assert exc.status == expected
    assert exc.index is None
    assert math.isfinite(exc.value)
    msg = str(exc)
    assert exc.argument in msg and repr(exc.value) in msg and exc.valid in msg
    assert _range_numbers(exc.valid), exc.valid

    # Array: bad sample at index 2 of 4, the others valid.
    keys = case.bad.keys()
    arrays = {k: np.array([case.good[k], case.good[k], case.bad[k], case.good[k]])
              for k in keys}
    with pytest.raises(DomainError) as info2:
        case.func(**arrays)
    assert info2.value.index == (2,) and "index 2" in str(info2.value)
    assert info2.value.argument == exc.argument and info2.value.status == expected

    loose = case.func(**arrays, strict=False)
    ok = {k: np.array([case.good[k]] * 4) for k in keys}
    ref = case.func(**ok)
    for got, want in zip(outputs(loose), outputs(ref), strict=True):
        if want is None:
            continue
        got = np.asarray(got)
        assert np.isnan(got[2]) and not np.any(np.isnan(got[[0, 1, 3]]))
        assert _same_bits(got[[0, 1, 3]], np.asarray(want)[[0, 1, 3]])
    if isinstance(loose, airdata.AirData):
        assert list(np.asarray(loose.status)) == [0, 0, int(expected), 0]


def test_derived_range_ends_from_messages_are_valid() -> None:
    """The limit a derived-quantity message states is itself accepted."""
    with pytest.raises(DomainError) as info:
        airdata.impact_pressure_from_cas(3500.0)
    cas_max = _range_numbers(info.value.valid)[-1]
    assert cas_max == pytest.approx(10.0 * A0, rel=1e-15)  # 10 a0 with a0 = 340.294 m/s
    assert math.isfinite(airdata.impact_pressure_from_cas(cas_max))
    assert math.isfinite(airdata.mach_from_cas(cas_max, 101325.0))
    with pytest.raises(DomainError) as info:
        airdata.cas_from_impact_pressure(5.0e7)
    qc_max = _range_numbers(info.value.valid)[-1]
    assert airdata.cas_from_impact_pressure(qc_max) == pytest.approx(10.0 * A0, rel=1e-14)
    with pytest.raises(DomainError):
        airdata.cas_from_impact_pressure(float(np.nextafter(qc_max * 1.000001, math.inf)))


def test_unknown_profile() -> None:
    with pytest.raises(ValueError, match="nope"):
        airdata.get_profile("nope")
    with pytest.raises(ValueError, match="nope"):
        airdata.pressure_altitude(101325.0, profile="nope")
    assert airdata.get_profile(None) is airdata.ICAO
    assert airdata.get_profile("us1976") is airdata.US1976
    assert airdata.get_profile(airdata.US1976) is airdata.US1976


def test_error_status_values_are_the_contract() -> None:
    """The numeric status values are fixed (shared with the vectors and the C port)."""
    assert [int(s) for s in (Status.OK, Status.INVALID_INPUT, Status.OUT_OF_RANGE,
                             Status.NO_CONVERGENCE, Status.IMPACT_PRESSURE_ZEROED)] == \
        [0, 1, 2, 3, 4]
    assert issubclass(DomainError, ValueError)
