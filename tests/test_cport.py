"""airdata.cport: the reference's Python API over the C port's batch entry points."""

from __future__ import annotations

import inspect
import math
from types import SimpleNamespace
from typing import Any

import numpy as np
import pytest

import airdata
from airdata import DomainError, Status, cport

NAMES = [n for n in cport.__all__ if n != "PRECISIONS"]
PRECISIONS = ["double", "single"]


def test_every_reference_function_has_a_port() -> None:
    public = {n for n in airdata.__all__ if callable(getattr(airdata, n))
              and n[0].islower() and n not in ("get_profile",)}
    assert public == set(NAMES)


@pytest.mark.parametrize("name", NAMES)
def test_same_parameters_as_the_reference_plus_precision(name: str) -> None:
    ref = inspect.signature(getattr(airdata, name)).parameters
    port = inspect.signature(getattr(cport, name)).parameters
    assert list(port) == [*ref, "precision"]
    for p in ref:
        assert port[p].kind == ref[p].kind
        assert port[p].default == ref[p].default
    assert port["precision"].default == "double"


@pytest.mark.parametrize("precision", PRECISIONS)
def test_scalars_give_floats_and_arrays_broadcast(precision: str) -> None:
    x = cport.mach_from_cas(150.0, 30000.0, precision=precision)
    assert type(x) is float
    y = cport.mach_from_cas(np.array([[100.0], [200.0]]), np.array([30000.0, 50000.0, 70000.0]),
                            precision=precision)
    assert y.shape == (2, 3)
    assert y.dtype == cport.PRECISIONS[precision][1]
    assert float(y[1, 0]) == pytest.approx(cport.mach_from_cas(200.0, 30000.0,
                                                               precision=precision))
    assert cport.pressure_altitude(np.array([]), precision=precision).shape == (0,)


@pytest.mark.parametrize("precision", PRECISIONS)
def test_sea_level_facts(precision: str) -> None:
    # Sea level of the standard atmosphere: 101325 Pa at 0 m (ICAO Doc 7488, from memory);
    # CAS = EAS = TAS at sea level on a standard day (common practice, no source).
    assert cport.pressure_altitude(101325.0, precision=precision) == 0.0
    cas = cport.cas_from_mach(0.4, 101325.0, precision=precision)
    eas = cport.eas_from_mach(0.4, 101325.0, precision=precision)
    tas = cport.tas_from_mach(0.4, 288.15, precision=precision)
    assert cas == pytest.approx(eas, rel=1e-6) and eas == pytest.approx(tas, rel=1e-6)


BAD_CALLS: list[tuple[str, tuple[Any, ...], dict[str, Any]]] = [
    ("pressure_altitude", ([1e5, -1.0, math.nan],), {}),
    ("pressure_altitude", (1e6,), {}),
    ("atmosphere", ([0.0, 1e5], [math.nan, 0.0]), {}),
    ("impact_pressure_from_mach", ([0.5, 11.0], [1.0, -5.0]), {}),
    ("mach_from_impact_pressure", ([1.0, 1e7], [1e5, 1e3]), {}),
    ("mach_from_cas", (3000.0, 200.0), {}),
    ("mach_from_cas", (3500.0, 200.0), {}),
    ("impact_pressure_from_cas", (5000.0,), {}),
    ("cas_from_impact_pressure", (5e7,), {}),
    ("cas_from_mach", (10.0, 177000.0), {}),
    ("mach_from_eas", (3000.0, 10.0), {}),
    ("mach_from_tas", (4000.0, 50.0), {}),
    ("altimeter_setting", (95000.0, 6000.0), {}),
    ("density_altitude", (0.5, 4000.0), {}),
    ("baro_corrected_altitude", (5e4, [1e5, 1e3]), {}),
    ("sat_from_tat", (250.0, 0.8, 1.5), {}),
    ("tat_from_sat", ([250.0, 250.0], [0.8, -1.0]), {}),
    ("geometric_altitude", (math.inf,), {}),
    ("geopotential_altitude", (-1e6,), {}),
    ("air_data", (1e5, 1e5 - 200.0, 300.0), {}),
    ("air_data", ([1e5, 1e5], [1.1e5, 1e5], [300.0, 20.0]), {}),
    ("air_data", (1e3, 9e6, 288.0), {}),
    ("air_data", (150000.0, 150000.0, 60.0), {}),
    ("air_data", (5e4, 6e4, 260.0, 1.0, 1000.0), {}),
    ("stall_eas", (-1.0, 50.0, 1.5), {}),
    ("stall_eas", (1e5, 50.0, [1.5, 0.0]), {}),
    ("stall_eas", (1e7, 1e-6, 1e-6), {}),
    ("stall_mach", (1e5, 50.0, 1.5, [1e5, 0.5]), {}),
    ("stall_cas", (1e5, 50.0, 1.5, 1e5, -2.0), {}),
    ("stall_cas", (7.9e6, 1.0, 1.0, 177000.0), {}),
    ("stall_tas", (1e5, 50.0, 1.5, 1e5, 20.0), {}),
    ("crossover_altitude", (160.0, 1.0), {}),
    ("crossover_altitude", (3500.0, 0.8), {}),
    ("crossover_altitude", ([150.0, 400.0], 0.3), {}),
    ("max_operating_cas", (5e4, 3500.0, 0.8), {}),
    ("max_operating_mach", (5e4, 150.0, 0.0), {}),
    ("ceiling_margin", (5e4, 1e5), {}),
]


@pytest.mark.parametrize("precision", PRECISIONS)
@pytest.mark.parametrize(("name", "args", "kwargs"), BAD_CALLS)
def test_domain_errors_match_the_reference(name: str, args: tuple[Any, ...],
                                           kwargs: dict[str, Any], precision: str) -> None:
    with pytest.raises(DomainError) as ref:
        getattr(airdata, name)(*args, **kwargs)
    with pytest.raises(DomainError) as got:
        getattr(cport, name)(*args, precision=precision, **kwargs)
    assert str(got.value) == str(ref.value)
    assert got.value.status == ref.value.status
    assert (got.value.argument, got.value.index) == (ref.value.argument, ref.value.index)


@pytest.mark.parametrize("precision", PRECISIONS)
def test_non_strict_gives_nan_for_just_the_bad_elements(precision: str) -> None:
    y = cport.mach_from_impact_pressure([1000.0, 1e7, -1.0, 2000.0], [5e4, 1e3, 5e4, math.nan],
                                        strict=False, precision=precision)
    assert np.isfinite(y[0]) and np.isnan(y[1:]).all()
    atm = cport.atmosphere([0.0, 1e6], strict=False, precision=precision)
    assert np.isfinite(atm.pressure[0]) and np.isnan(atm.kinematic_viscosity[1])


@pytest.mark.parametrize("precision", PRECISIONS)
def test_air_data_record_and_statuses(precision: str) -> None:
    out = cport.air_data([101325.0, 101325.0, 101325.0], [101300.0, 104000.0, 100000.0], 288.15,
                         strict=False, precision=precision)
    ref = airdata.air_data([101325.0, 101325.0, 101325.0], [101300.0, 104000.0, 100000.0],
                           288.15, strict=False)
    assert out.baro_altitude is None
    assert list(out.status) == list(ref.status) == [Status.IMPACT_PRESSURE_ZEROED, Status.OK,
                                                    Status.INVALID_INPUT]
    assert out.profile == "icao"
    assert out.mach[0] == 0.0 and np.isnan(out.cas[2])
    one = cport.air_data(5e4, 6e4, 260.0, setting=101325.0, precision=precision)
    assert type(one.status) is int and type(one.baro_altitude) is float
    with pytest.raises(ValueError, match="noise_band"):
        cport.air_data(5e4, 6e4, 260.0, noise_band=-1.0, precision=precision)


@pytest.mark.parametrize("precision", PRECISIONS)
def test_us1976_build_follows_the_us1976_reference(precision: str) -> None:
    # The us1976 build has its own constants: binary64 equals the us1976 reference bit for
    # bit here, and differs from the icao build (R = 8314.32/28.9644 against 287.05287,
    # U.S. Standard Atmosphere 1976 and ICAO Doc 7488, from memory).
    ps = np.array([95_000.0, 50_000.0, 20_000.0, 1_000.0])
    got = cport.pressure_altitude(ps, profile="us1976", precision=precision)
    ref = airdata.pressure_altitude(ps, profile="us1976")
    tol = 0.0 if precision == "double" else 4 * 2.0 ** -23
    np.testing.assert_allclose(got, ref, rtol=tol, atol=0.0)
    icao = cport.pressure_altitude(ps, precision=precision)
    assert np.all(got != icao)
    atm = cport.atmosphere(30_000.0, profile="us1976", precision=precision)
    assert atm.profile == "us1976"
    with pytest.raises(airdata.DomainError, match=r"ps = 1000000000.0 is out of range"):
        cport.pressure_altitude(1e9, profile="us1976", precision=precision)


def test_unknown_profiles_and_precisions_are_refused() -> None:
    with pytest.raises(ValueError, match="profile"):
        cport.pressure_altitude(5e4, profile="mars")
    with pytest.raises(ValueError, match="precision"):
        cport.pressure_altitude(5e4, precision="quad")


class _CountingLib:
    """Wraps a cffi lib and counts the calls of each entry point."""

    def __init__(self, lib: Any) -> None:
        self._lib = lib
        self.calls: dict[str, int] = {}

    def __getattr__(self, name: str) -> Any:
        target = getattr(self._lib, name)
        if not callable(target):
            return target

        def call(*args: Any) -> Any:
            self.calls[name] = self.calls.get(name, 0) + 1
            return target(*args)

        return call


@pytest.mark.parametrize("precision", PRECISIONS)
def test_an_array_costs_one_batch_call(precision: str, monkeypatch: pytest.MonkeyPatch) -> None:
    real = cport._module(precision)
    counting = _CountingLib(real.lib)
    monkeypatch.setattr(cport, "_module", lambda p, *_: SimpleNamespace(ffi=real.ffi, lib=counting))
    ps = np.linspace(1000.0, 100000.0, 1000)
    y = cport.pressure_altitude(ps, precision=precision)
    assert counting.calls == {"ad_pressure_altitude_n": 1}
    out = cport.air_data(ps, ps + 500.0, 250.0, precision=precision)
    assert counting.calls["ad_air_data_n"] == 1
    assert y.shape == (1000,) and out.mach.shape == (1000,)


@pytest.mark.parametrize("precision", PRECISIONS)
def test_results_are_those_of_the_scalar_c_functions(precision: str) -> None:
    mod = cport._module(precision)
    ps = [50.0, 2000.0, 30000.0, 101325.0, 170000.0]
    y = cport.pressure_altitude(ps, precision=precision)
    h = mod.ffi.new("ad_real *")
    for p, yi in zip(ps, y, strict=True):
        assert mod.lib.ad_pressure_altitude(p, h) == Status.OK
        assert h[0] == yi
