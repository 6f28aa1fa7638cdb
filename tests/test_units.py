"""``airdata.units``: exact definitions, round trips, unknown units.

Definitions (all exact by definition; values from memory):
* international foot 0.3048 m (international yard and pound agreement, 1959);
* knot = 1852 m per hour (international nautical mile of 1852 m);
* conventional inch of mercury 3386.389 Pa (the value altimeter settings use);
* hPa = mbar = 100 Pa, kPa = 1000 Pa, km = 1000 m, km/h = 1000/3600 m/s;
* degC = K - 273.15; degF = (F - 32) 5/9 + 273.15 K; ft/min = 0.3048/60 m/s.

Every conversion is checked against the exact rational value (``fractions``), allowing
the roundings a binary64 evaluation cannot avoid, stated per check.
"""

from __future__ import annotations

import math
from fractions import Fraction

import numpy as np
import pytest
from hypothesis import given
from hypothesis import strategies as st

from airdata import ICAO, units

# unit -> (scale, offset) with SI = x * scale + offset, exact, typed from the definitions
EXACT = {
    "Pa": (Fraction(1), Fraction(0)),
    "hPa": (Fraction(100), Fraction(0)),
    "mbar": (Fraction(100), Fraction(0)),
    "kPa": (Fraction(1000), Fraction(0)),
    "inHg": (Fraction(3386389, 1000), Fraction(0)),
    "m": (Fraction(1), Fraction(0)),
    "ft": (Fraction(3048, 10000), Fraction(0)),
    "km": (Fraction(1000), Fraction(0)),
    "m/s": (Fraction(1), Fraction(0)),
    "kt": (Fraction(1852, 3600), Fraction(0)),
    "km/h": (Fraction(1000, 3600), Fraction(0)),
    "ft/min": (Fraction(3048, 10000 * 60), Fraction(0)),
    "K": (Fraction(1), Fraction(0)),
    "degC": (Fraction(1), Fraction(27315, 100)),
    "degF": (Fraction(5, 9), Fraction(27315, 100) - Fraction(32 * 5, 9)),
}
DIMENSIONS = {"Pa": "pressure", "hPa": "pressure", "mbar": "pressure", "kPa": "pressure",
              "inHg": "pressure", "m": "length", "ft": "length", "km": "length",
              "m/s": "speed", "kt": "speed", "km/h": "speed", "ft/min": "speed",
              "K": "temperature", "degC": "temperature", "degF": "temperature"}

values = st.floats(-1e6, 1e6, allow_nan=False, allow_subnormal=False)


def test_constants_are_the_definitions() -> None:
    assert units.FT == 0.3048
    assert units.INHG == 3386.389
    assert units.HPA == 100.0
    # correctly rounded quotients of the exact definitions
    assert units.KT == float(Fraction(1852, 3600))
    assert units.FT_PER_MIN == float(Fraction(3048, 600000))


def test_table_matches_the_definitions() -> None:
    for unit, (scale, offset) in EXACT.items():
        dim, s, o = units.UNITS[unit]
        assert (s, o) == (scale, offset), unit
        assert dim == DIMENSIONS[unit] == units.dimension(unit)


def test_simple_values() -> None:
    assert units.to_si(1.0, "ft") == 0.3048
    assert units.to_si(1000.0, "ft") == 304.8
    assert units.from_si(0.3048, "ft") == 1.0
    assert units.to_si(1.0, "inHg") == 3386.389
    assert units.to_si(1013.25, "hPa") == 101325.0
    assert units.from_si(101325.0, "hPa") == 1013.25
    # one nautical mile per hour, for an hour; the factor 1852/3600 is rounded once, so
    # 1 ulp is allowed
    assert abs(units.to_si(3600.0, "kt") - 1852.0) <= np.spacing(1852.0)
    assert units.to_si(0.0, "degC") == 273.15
    assert units.to_si(-273.15, "degC") == 0.0
    assert units.from_si(373.15, "degC") == pytest.approx(100.0, abs=1e-13)
    assert units.to_si(-40.0, "degF") == pytest.approx(233.15, abs=1e-13)  # -40 F = -40 C
    assert units.to_si(32.0, "degF") == pytest.approx(273.15, abs=1e-13)
    assert units.to_si(212.0, "degF") == pytest.approx(373.15, abs=1e-13)
    assert units.to_si(100.0, "ft/min") == pytest.approx(0.508, rel=2**-52)


def test_trade_facts() -> None:
    # a0 about 661.48 kt (common practice, no source); 29.92 inHg = 1013.2 hPa, the
    # standard setting in the two units (common practice, no source)
    assert units.from_si(ICAO.a0, "kt") == pytest.approx(661.48, abs=0.005)
    assert units.from_si(101325.0, "inHg") == pytest.approx(29.92, abs=0.005)


def _scaled_error(got: float, exact: Fraction, x: float, scale: Fraction) -> float:
    """|got - exact| in units of eps (|exact| + |x scale|) + 2^-1074 (the input's own
    conditioning; the last term is the spacing of binary64's subnormals, the absolute
    rounding error a result below 2^-1022 carries whatever its relative size)."""
    denom = Fraction(2**-52) * (abs(exact) + abs(Fraction(x) * scale)) + Fraction(2**-1074)
    if denom == 0:
        return 0.0 if got == 0.0 else math.inf
    return float(abs(Fraction(got) - exact) / denom)


@pytest.mark.parametrize("unit", list(EXACT))
@given(x=values)
def test_to_si_against_exact(unit: str, x: float) -> None:
    scale, offset = EXACT[unit]
    exact = Fraction(x) * scale + offset
    got = units.to_si(x, unit)
    assert type(got) is float
    # rounded factor, product and offset sum: at most 1.5 eps of the scale
    assert _scaled_error(got, exact, x, scale) <= 1.5, (unit, x, got)


@pytest.mark.parametrize("unit", list(EXACT))
@given(x=values)
def test_from_si_against_exact(unit: str, x: float) -> None:
    scale, offset = EXACT[unit]
    exact = (Fraction(x) - offset) / scale
    got = units.from_si(x, unit)
    assert type(got) is float
    assert _scaled_error(got, exact, x, 1 / scale) <= 1.5, (unit, x, got)


@pytest.mark.parametrize("unit", list(EXACT))
@given(x=values)
def test_round_trip(unit: str, x: float) -> None:
    """from_si(to_si(x)) = x within 3 eps (|x| + |offset/scale|): the two conversions;
    plus the subnormal spacing 2^-1074 of an SI value below 2^-1022, carried back by
    1/scale, and of the result itself."""
    scale, offset = EXACT[unit]
    back = units.from_si(units.to_si(x, unit), unit)
    tol = 3 * 2**-52 * (abs(x) + float(abs(offset / scale))) \
        + 2**-1074 * (1.0 + float(1 / abs(scale)))
    assert abs(back - x) <= tol, (unit, x, back)
    if offset == 0 and scale == 1:
        assert back == x


def test_arrays_broadcast_and_match_scalars() -> None:
    x = np.array([[0.0, 1.5, -40.0], [1e5, 29.92, 3.0]])
    for unit in EXACT:
        arr = units.to_si(x, unit)
        assert isinstance(arr, np.ndarray) and arr.shape == x.shape
        for idx in np.ndindex(*x.shape):
            assert arr[idx] == units.to_si(float(x[idx]), unit)
        back = units.from_si(arr, unit)
        assert isinstance(back, np.ndarray) and back.shape == x.shape
    assert type(units.to_si(np.float64(2.0), "ft")) is float
    assert type(units.from_si(np.array(2.0), "kt")) is float
    assert type(units.to_si(3, "hPa")) is float


def test_unknown_unit() -> None:
    for bad in ("furlong", "", "FT", "degR", "knots"):
        for fn in (units.to_si, units.from_si):
            with pytest.raises(ValueError, match="unknown unit") as info:
                fn(1.0, bad)
            assert repr(bad) in str(info.value)
            assert "kt" in str(info.value) and "inHg" in str(info.value)  # lists known ones
        with pytest.raises(ValueError):
            units.dimension(bad)


def test_units_of_dimension() -> None:
    assert set(units.units_of("pressure")) >= {"Pa", "hPa", "mbar", "kPa", "inHg"}
    assert set(units.units_of("speed")) >= {"m/s", "kt", "km/h", "ft/min"}
    assert set(units.units_of("temperature")) == {"K", "degC", "degF"}
    assert units.units_of("colour") == []
