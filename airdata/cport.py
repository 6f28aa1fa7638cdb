"""The bundled C port, callable from Python with the reference's API.

Every function here has the name, arguments, defaults and error behaviour of the
reference function of the same name in :mod:`airdata` (``strict``, :class:`DomainError`
naming the argument, value, index and valid range; records for :func:`atmosphere` and
:func:`air_data`), plus ``precision``: ``"double"`` runs the binary64 build
(``airdata._cport64``), ``"single"`` the binary32 build (``airdata._cport32``, inputs
rounded to binary32 first).

Inputs broadcast against each other like a numpy ufunc; scalar inputs give Python
floats.  Array results have the dtype of the precision (float64 or float32).  The
whole array is evaluated by one call of the port's batch entry point
(``bindings/c/include/airdata_batch.h``), not one call per element.

``profile`` selects the build as well as the reference used for error messages: the
port is compiled once per constants profile (``"icao"``, the default: ``airdata._cport64``
and ``_cport32``; ``"us1976"``: ``airdata._cport64_us1976`` and ``_cport32_us1976``, the
same sources with ``-DAIRDATA_PROFILE_US1976``).  :data:`MODULES` lists them.

Error messages: the argument checks are done by the port (its ``ad_check_n``); for a
failing derived quantity (for example the Mach number a CAS reaches at a given
pressure) the port decides the status and the reference supplies the wording of the
message, evaluated on the offending element.

An engineering and verification aid, not certified flight software.
"""

from __future__ import annotations

import importlib
from collections.abc import Callable
from functools import cache
from types import ModuleType
from typing import Any

import numpy as np
from numpy.typing import NDArray

from . import _domains as dom
from . import altimetry as _alt
from . import chain as _chain
from . import limits as _lim
from . import pitot as _pit
from . import speeds as _spd
from . import temperature as _tmp
from ._inputs import ArrayLike, Domain, FloatOrArray
from .atmosphere import Atmosphere
from .atmosphere import atmosphere as _ref_atmosphere
from .atmosphere import geometric_altitude as _ref_geometric
from .atmosphere import geopotential_altitude as _ref_geopotential
from .chain import AirData
from .profiles import ICAO, Profile, get_profile
from .status import DomainError, Status

__all__ = [
    "PRECISIONS", "atmosphere", "geopotential_altitude", "geometric_altitude",
    "pressure_altitude", "pressure_at_altitude", "baro_corrected_altitude",
    "altimeter_setting", "density_altitude", "impact_pressure_from_mach",
    "mach_from_impact_pressure", "impact_pressure_from_cas", "cas_from_impact_pressure",
    "cas_from_mach", "mach_from_cas", "eas_from_mach", "mach_from_eas", "tas_from_mach",
    "mach_from_tas", "dynamic_pressure", "sat_from_tat", "tat_from_sat", "air_data",
    "stall_eas", "stall_mach", "stall_cas", "stall_tas", "crossover_altitude",
    "max_operating_cas", "max_operating_mach", "ceiling_margin",
]

#: Precision name -> (extension module of the ICAO build, numpy dtype of ``ad_real``).
PRECISIONS: dict[str, tuple[str, type[np.floating[Any]]]] = {
    "double": ("airdata._cport64", np.float64),
    "single": ("airdata._cport32", np.float32),
}

#: (profile name, precision name) -> extension module.
MODULES: dict[tuple[str, str], str] = {
    **{("icao", prec): mod for prec, (mod, _) in PRECISIONS.items()},
    **{("us1976", prec): mod + "_us1976" for prec, (mod, _) in PRECISIONS.items()},
}

# Argument domain name -> (port's ad_domain_id, the reference's Domain of a profile),
# from the one table of the port's domains.
_DOMAINS: dict[str, tuple[int, Callable[[Profile], Domain]]] = {
    name: (i, of) for i, (name, of) in enumerate(dom.C_DOMAINS)}

_ERRORS = (int(Status.INVALID_INPUT), int(Status.OUT_OF_RANGE), int(Status.NO_CONVERGENCE))


@cache
def _module(precision: str, profile: str = "icao") -> ModuleType:
    """The compiled extension module of ``precision`` and constants ``profile``."""
    if precision not in PRECISIONS:
        raise ValueError(f"precision = {precision!r}: choose 'double' or 'single'")
    if (profile, precision) not in MODULES:
        raise ValueError(f"profile {profile!r}: the bundled C port is compiled for "
                         f"{', '.join(sorted({p for p, _ in MODULES}))}")
    return importlib.import_module(MODULES[profile, precision])


def _check_profile(profile: Profile | str | None) -> Profile:
    """The profile object; ValueError when the port has no build of it."""
    prof = get_profile(profile)
    if (prof.name, "double") not in MODULES:
        raise ValueError(f"profile {prof.name!r}: the bundled C port is compiled for "
                         f"{', '.join(sorted({p for p, _ in MODULES}))}")
    return prof


class _Batch:
    """Broadcast inputs of one call, converted to contiguous arrays of ``ad_real``."""

    def __init__(self, precision: str, named: dict[str, tuple[ArrayLike, str]],
                 prof: Profile = ICAO) -> None:
        self.mod = _module(precision, prof.name)
        self.prof = prof
        self.dtype = PRECISIONS[precision][1]
        self.names = list(named)
        self.domains = [d for _, d in named.values()]
        raw = [np.asarray(v, dtype=np.float64) for v, _ in named.values()]
        self.scalar = all(r.ndim == 0 for r in raw)
        self.wide = np.broadcast_arrays(*[np.atleast_1d(r) for r in raw])
        self.shape = self.wide[0].shape
        with np.errstate(over="ignore"):
            self.flat = [np.ascontiguousarray(a, dtype=self.dtype).reshape(-1)
                         for a in self.wide]
        self.n = self.flat[0].size
        self.status = np.zeros(self.n, dtype=np.uint8)

    def ptr(self, a: NDArray[Any] | None, ctype: str = "ad_real[]") -> Any:
        """A cffi pointer to the data of ``a`` (NULL for None)."""
        if a is None:
            return self.mod.ffi.NULL
        return self.mod.ffi.from_buffer(ctype, a)

    def inputs(self) -> list[Any]:
        """Pointers to every input array, in argument order."""
        return [self.ptr(a) for a in self.flat]

    def done(self, bad: int) -> int:
        """Check the batch call's return value."""
        if bad == int(self.mod.lib.AD_BATCH_NULL):
            raise RuntimeError("C port batch call refused a NULL pointer")
        return bad

    def index(self, i: int) -> tuple[int, ...] | None:
        """Index of flat element ``i`` in the broadcast shape (None for scalars)."""
        if self.scalar:
            return None
        return tuple(int(j) for j in np.unravel_index(i, self.shape))

    def raise_first(self, reference: Callable[..., Any]) -> None:
        """Raise the DomainError the reference raises: arguments in order, then derived."""
        for k, (name, dname) in enumerate(zip(self.names, self.domains, strict=True)):
            did, domain = _DOMAINS[dname]
            st = np.zeros(self.n, dtype=np.uint8)
            self.done(self.mod.lib.ad_check_n(did, self.ptr(self.flat[k]),
                                              self.ptr(st, "unsigned char[]"),
                                              self.n))
            bad = np.flatnonzero(st)
            if bad.size:
                i = int(bad[0])
                raise DomainError(name, float(self.wide[k].flat[i]), self.index(i),
                                  domain(self.prof).describe(), Status(int(st[i])))
        i = int(np.flatnonzero(np.isin(self.status, _ERRORS))[0])
        status = Status(int(self.status[i]))
        try:
            reference(*[float(a.flat[i]) for a in self.wide])
        except DomainError as e:
            raise DomainError(e.argument, e.value, self.index(i), e.valid, status) from None
        raise DomainError("derived quantity", float("nan"), self.index(i),
                          "that of the reference function (binary32 rounding crossed a "
                          "range end)", status)

    def finish(self, y: NDArray[Any]) -> FloatOrArray:
        """A Python float for scalar input, else an array of the broadcast shape."""
        if self.scalar:
            return float(y.reshape(-1)[0])
        return y.reshape(self.shape)


def _simple(cname: str, reference: Callable[..., Any], strict: bool, precision: str,
            named: dict[str, tuple[ArrayLike, str]], prof: Profile = ICAO) -> FloatOrArray:
    """Evaluate a one-output function through its batch entry point (build of ``prof``)."""
    b = _Batch(precision, named, prof)
    out = np.empty(b.n, dtype=b.dtype)
    if b.n:
        fn = getattr(b.mod.lib, f"ad_{cname}_n")
        bad = b.done(fn(*b.inputs(), b.ptr(out), b.ptr(b.status, "unsigned char[]"), b.n))
        if bad and strict:
            b.raise_first(reference)
    return b.finish(out)


def atmosphere(h: ArrayLike, dT: ArrayLike = 0.0, *, profile: Profile | str | None = None,
               strict: bool = True, precision: str = "double") -> Atmosphere:
    """Port of :func:`airdata.atmosphere` (ATM-2 .. ATM-6).

    Parameters
    ----------
    h : float or array_like
        Geopotential altitude, m, in [-5000, 84852].
    dT : float or array_like, optional
        Temperature deviation, K, in [-100, 100].
    profile : Profile or str, optional
        Constants profile, ``"icao"`` (default) or ``"us1976"``: selects the build.
    strict : bool, optional
        Raise on the first bad element (default) or give NaN for just the bad elements.
    precision : {"double", "single"}, optional
        Which build of the port to run.

    Inputs broadcast against each other like a numpy ufunc; scalar inputs give Python
    floats.

    Returns
    -------
    Atmosphere
        The same record as the reference.

    Raises
    ------
    DomainError
        As the reference.
    """
    prof = _check_profile(profile)
    b = _Batch(precision, {"h": (h, "altitude"), "dT": (dT, "delta_t")}, prof)
    out = np.empty((b.n, 6), dtype=b.dtype)
    if b.n:
        bad = b.done(b.mod.lib.ad_atmosphere_n(*b.inputs(), b.ptr(out, "ad_atmosphere_t[]"),
                                               b.ptr(b.status, "unsigned char[]"), b.n))
        if bad and strict:
            b.raise_first(lambda *a: _ref_atmosphere(*a, profile=prof))
    cols = [b.finish(np.ascontiguousarray(out[:, j])) for j in range(6)]
    return Atmosphere(*cols, profile=prof.name)


def geopotential_altitude(z: ArrayLike, *, profile: Profile | str | None = None,
                          strict: bool = True, precision: str = "double") -> FloatOrArray:
    """Port of :func:`airdata.geopotential_altitude` (ATM-7); ``precision`` as above."""
    prof = _check_profile(profile)
    return _simple("geopotential_altitude", lambda *a: _ref_geopotential(*a, profile=prof),
                   strict, precision, {"z": (z, "geometric")}, prof=prof)


def geometric_altitude(h: ArrayLike, *, profile: Profile | str | None = None,
                       strict: bool = True, precision: str = "double") -> FloatOrArray:
    """Port of :func:`airdata.geometric_altitude` (ATM-8); ``precision`` as above."""
    prof = _check_profile(profile)
    return _simple("geometric_altitude", lambda *a: _ref_geometric(*a, profile=prof),
                   strict, precision, {"h": (h, "altitude")}, prof=prof)


def pressure_altitude(ps: ArrayLike, *, profile: Profile | str | None = None,
                      strict: bool = True, precision: str = "double") -> FloatOrArray:
    """Port of :func:`airdata.pressure_altitude` (ALT-1); ``precision`` as above."""
    prof = _check_profile(profile)
    return _simple("pressure_altitude", lambda *a: _alt.pressure_altitude(*a, profile=prof),
                   strict, precision, {"ps": (ps, "pressure")}, prof=prof)


def pressure_at_altitude(h: ArrayLike, *, profile: Profile | str | None = None,
                         strict: bool = True, precision: str = "double") -> FloatOrArray:
    """Port of :func:`airdata.pressure_at_altitude` (ATM-3); ``precision`` as above."""
    prof = _check_profile(profile)
    return _simple("pressure_at_altitude",
                   lambda *a: _alt.pressure_at_altitude(*a, profile=prof),
                   strict, precision, {"h": (h, "altitude")}, prof=prof)


def baro_corrected_altitude(ps: ArrayLike, setting: ArrayLike, *,
                            profile: Profile | str | None = None, strict: bool = True,
                            precision: str = "double") -> FloatOrArray:
    """Port of :func:`airdata.baro_corrected_altitude` (ALT-2); ``precision`` as above."""
    prof = _check_profile(profile)
    return _simple("baro_corrected_altitude",
                   lambda *a: _alt.baro_corrected_altitude(*a, profile=prof),
                   strict, precision, {"ps": (ps, "pressure"), "setting": (setting, "setting")},
                   prof=prof)


def altimeter_setting(ps: ArrayLike, elevation: ArrayLike, *,
                      profile: Profile | str | None = None, strict: bool = True,
                      precision: str = "double") -> FloatOrArray:
    """Port of :func:`airdata.altimeter_setting` (ALT-3); ``precision`` as above."""
    prof = _check_profile(profile)
    return _simple("altimeter_setting", lambda *a: _alt.altimeter_setting(*a, profile=prof),
                   strict, precision,
                   {"ps": (ps, "setting"), "elevation": (elevation, "elevation")}, prof=prof)


def density_altitude(ps: ArrayLike, sat: ArrayLike, *, profile: Profile | str | None = None,
                     strict: bool = True, precision: str = "double") -> FloatOrArray:
    """Port of :func:`airdata.density_altitude` (ALT-4); ``precision`` as above."""
    prof = _check_profile(profile)
    return _simple("density_altitude", lambda *a: _alt.density_altitude(*a, profile=prof),
                   strict, precision, {"ps": (ps, "pressure"), "sat": (sat, "temperature")},
                   prof=prof)


def impact_pressure_from_mach(mach: ArrayLike, ps: ArrayLike, *,
                              profile: Profile | str | None = None, strict: bool = True,
                              precision: str = "double") -> FloatOrArray:
    """Port of :func:`airdata.impact_pressure_from_mach` (PIT-1); ``precision`` as above."""
    prof = _check_profile(profile)
    return _simple("impact_pressure_from_mach",
                   lambda *a: _pit.impact_pressure_from_mach(*a, profile=prof),
                   strict, precision, {"mach": (mach, "mach"), "ps": (ps, "pressure")}, prof=prof)


def mach_from_impact_pressure(qc: ArrayLike, ps: ArrayLike, *,
                              profile: Profile | str | None = None, strict: bool = True,
                              precision: str = "double") -> FloatOrArray:
    """Port of :func:`airdata.mach_from_impact_pressure` (PIT-2); ``precision`` as above."""
    prof = _check_profile(profile)
    return _simple("mach_from_impact_pressure",
                   lambda *a: _pit.mach_from_impact_pressure(*a, profile=prof),
                   strict, precision, {"qc": (qc, "impact_pressure"), "ps": (ps, "pressure")},
                   prof=prof)


def impact_pressure_from_cas(cas: ArrayLike, *, profile: Profile | str | None = None,
                             strict: bool = True, precision: str = "double") -> FloatOrArray:
    """Port of :func:`airdata.impact_pressure_from_cas` (PIT-3); ``precision`` as above."""
    prof = _check_profile(profile)
    return _simple("impact_pressure_from_cas",
                   lambda *a: _pit.impact_pressure_from_cas(*a, profile=prof),
                   strict, precision, {"cas": (cas, "speed")}, prof=prof)


def cas_from_impact_pressure(qc: ArrayLike, *, profile: Profile | str | None = None,
                             strict: bool = True, precision: str = "double") -> FloatOrArray:
    """Port of :func:`airdata.cas_from_impact_pressure` (PIT-4); ``precision`` as above."""
    prof = _check_profile(profile)
    return _simple("cas_from_impact_pressure",
                   lambda *a: _pit.cas_from_impact_pressure(*a, profile=prof),
                   strict, precision, {"qc": (qc, "impact_pressure")}, prof=prof)


def _speed2(cname: str, first: str, dfirst: str, second: str, dsecond: str,
            a: ArrayLike, b: ArrayLike, profile: Profile | str | None, strict: bool,
            precision: str) -> FloatOrArray:
    prof = _check_profile(profile)
    ref = getattr(_spd, cname)
    return _simple(cname, lambda *x: ref(*x, profile=prof), strict, precision,
                   {first: (a, dfirst), second: (b, dsecond)}, prof=prof)


def cas_from_mach(mach: ArrayLike, ps: ArrayLike, *, profile: Profile | str | None = None,
                  strict: bool = True, precision: str = "double") -> FloatOrArray:
    """Port of :func:`airdata.cas_from_mach` (SPD-1); ``precision`` as above."""
    return _speed2("cas_from_mach", "mach", "mach", "ps", "pressure", mach, ps, profile,
                   strict, precision)


def mach_from_cas(cas: ArrayLike, ps: ArrayLike, *, profile: Profile | str | None = None,
                  strict: bool = True, precision: str = "double") -> FloatOrArray:
    """Port of :func:`airdata.mach_from_cas` (SPD-1 inverted); ``precision`` as above."""
    return _speed2("mach_from_cas", "cas", "speed", "ps", "pressure", cas, ps, profile,
                   strict, precision)


def eas_from_mach(mach: ArrayLike, ps: ArrayLike, *, profile: Profile | str | None = None,
                  strict: bool = True, precision: str = "double") -> FloatOrArray:
    """Port of :func:`airdata.eas_from_mach` (SPD-2); ``precision`` as above."""
    return _speed2("eas_from_mach", "mach", "mach", "ps", "pressure", mach, ps, profile,
                   strict, precision)


def mach_from_eas(eas: ArrayLike, ps: ArrayLike, *, profile: Profile | str | None = None,
                  strict: bool = True, precision: str = "double") -> FloatOrArray:
    """Port of :func:`airdata.mach_from_eas` (SPD-2 inverted); ``precision`` as above."""
    return _speed2("mach_from_eas", "eas", "speed", "ps", "pressure", eas, ps, profile,
                   strict, precision)


def tas_from_mach(mach: ArrayLike, sat: ArrayLike, *, profile: Profile | str | None = None,
                  strict: bool = True, precision: str = "double") -> FloatOrArray:
    """Port of :func:`airdata.tas_from_mach` (SPD-3); ``precision`` as above."""
    return _speed2("tas_from_mach", "mach", "mach", "sat", "temperature", mach, sat, profile,
                   strict, precision)


def mach_from_tas(tas: ArrayLike, sat: ArrayLike, *, profile: Profile | str | None = None,
                  strict: bool = True, precision: str = "double") -> FloatOrArray:
    """Port of :func:`airdata.mach_from_tas` (SPD-3 inverted); ``precision`` as above."""
    return _speed2("mach_from_tas", "tas", "speed", "sat", "temperature", tas, sat, profile,
                   strict, precision)


def dynamic_pressure(mach: ArrayLike, ps: ArrayLike, *, profile: Profile | str | None = None,
                     strict: bool = True, precision: str = "double") -> FloatOrArray:
    """Port of :func:`airdata.dynamic_pressure` (SPD-4); ``precision`` as above."""
    return _speed2("dynamic_pressure", "mach", "mach", "ps", "pressure", mach, ps, profile,
                   strict, precision)


def sat_from_tat(tat: ArrayLike, mach: ArrayLike, recovery: ArrayLike = 1.0, *,
                 strict: bool = True, precision: str = "double") -> FloatOrArray:
    """Port of :func:`airdata.sat_from_tat` (TMP-1); ``precision`` as above."""
    return _simple("sat_from_tat", _tmp.sat_from_tat, strict, precision,
                   {"tat": (tat, "temperature"), "mach": (mach, "mach"),
                    "recovery": (recovery, "recovery")})


def tat_from_sat(sat: ArrayLike, mach: ArrayLike, recovery: ArrayLike = 1.0, *,
                 strict: bool = True, precision: str = "double") -> FloatOrArray:
    """Port of :func:`airdata.tat_from_sat` (TMP-1); ``precision`` as above."""
    return _simple("tat_from_sat", _tmp.tat_from_sat, strict, precision,
                   {"sat": (sat, "temperature"), "mach": (mach, "mach"),
                    "recovery": (recovery, "recovery")})


_AIR_FIELDS = ("pressure_altitude", "baro_altitude", "impact_pressure", "mach", "cas", "eas",
               "tas", "sat", "density", "density_altitude", "dynamic_pressure")


def air_data(ps: ArrayLike, pt: ArrayLike, tat: ArrayLike, recovery: ArrayLike = 1.0,
             setting: ArrayLike | None = None, *, noise_band: float = _chain.NOISE_BAND,
             profile: Profile | str | None = None, strict: bool = True,
             precision: str = "double") -> AirData:
    """Port of :func:`airdata.air_data` (CHN-1).

    Parameters
    ----------
    ps, pt, tat, recovery, setting, noise_band, profile, strict
        As :func:`airdata.air_data` (``profile`` selects the build).
    precision : {"double", "single"}, optional
        Which build of the port to run.

    Inputs broadcast against each other like a numpy ufunc; scalar inputs give Python
    floats.

    Returns
    -------
    AirData
        The same record as the reference, ``status`` included.

    Raises
    ------
    DomainError
        As the reference, ``noise_band`` outside [0, 10000] Pa included.
    """
    prof = _check_profile(profile)
    _chain.check_noise_band(noise_band)
    named: dict[str, tuple[ArrayLike, str]] = {
        "ps": (ps, "pressure"), "pt": (pt, "total_pressure"), "tat": (tat, "temperature"),
        "recovery": (recovery, "recovery")}
    if setting is not None:
        named["setting"] = (setting, "setting")
    b = _Batch(precision, named, prof)
    out = np.empty((b.n, len(_AIR_FIELDS)), dtype=b.dtype)
    if b.n:
        ins = b.inputs()
        use = 1 if setting is not None else 0
        bad = b.done(b.mod.lib.ad_air_data_n(
            ins[0], ins[1], ins[2], ins[3], ins[4] if use else b.mod.ffi.NULL, use,
            float(noise_band), b.ptr(out, "ad_air_data_t[]"),
            b.ptr(b.status, "unsigned char[]"), b.n))
        if bad and strict:
            b.raise_first(lambda *a: _chain.air_data(*a, noise_band=noise_band, profile=prof))
    cols = {f: b.finish(np.ascontiguousarray(out[:, j])) for j, f in enumerate(_AIR_FIELDS)}
    if setting is None:
        cols["baro_altitude"] = None
    status = b.status.astype(np.int8)
    return AirData(**cols, status=int(status[0]) if b.scalar else status.reshape(b.shape),
                   profile=prof.name)


# ------------------------------------------------------------------ limits (LIM-1 .. LIM-5)


def _wing(weight: ArrayLike, wing_area: ArrayLike, cl_max: ArrayLike
          ) -> dict[str, tuple[ArrayLike, str]]:
    return {"weight": (weight, "weight"), "wing_area": (wing_area, "wing_area"),
            "cl_max": (cl_max, "cl_max")}


def stall_eas(weight: ArrayLike, wing_area: ArrayLike, cl_max: ArrayLike,
              load_factor: ArrayLike = 1.0, *, profile: Profile | str | None = None,
              strict: bool = True, precision: str = "double") -> FloatOrArray:
    """Port of :func:`airdata.stall_eas` (LIM-1); ``precision`` as above."""
    prof = _check_profile(profile)
    return _simple("stall_eas", lambda *a: _lim.stall_eas(*a, profile=prof), strict,
                   precision, {**_wing(weight, wing_area, cl_max),
                               "load_factor": (load_factor, "load_factor")}, prof=prof)


def stall_mach(weight: ArrayLike, wing_area: ArrayLike, cl_max: ArrayLike, ps: ArrayLike,
               load_factor: ArrayLike = 1.0, *, profile: Profile | str | None = None,
               strict: bool = True, precision: str = "double") -> FloatOrArray:
    """Port of :func:`airdata.stall_mach` (LIM-2); ``precision`` as above."""
    prof = _check_profile(profile)
    return _simple("stall_mach", lambda *a: _lim.stall_mach(*a, profile=prof), strict,
                   precision, {**_wing(weight, wing_area, cl_max), "ps": (ps, "pressure"),
                               "load_factor": (load_factor, "load_factor")}, prof=prof)


def stall_cas(weight: ArrayLike, wing_area: ArrayLike, cl_max: ArrayLike, ps: ArrayLike,
              load_factor: ArrayLike = 1.0, *, profile: Profile | str | None = None,
              strict: bool = True, precision: str = "double") -> FloatOrArray:
    """Port of :func:`airdata.stall_cas` (LIM-2); ``precision`` as above."""
    prof = _check_profile(profile)
    return _simple("stall_cas", lambda *a: _lim.stall_cas(*a, profile=prof), strict,
                   precision, {**_wing(weight, wing_area, cl_max), "ps": (ps, "pressure"),
                               "load_factor": (load_factor, "load_factor")}, prof=prof)


def stall_tas(weight: ArrayLike, wing_area: ArrayLike, cl_max: ArrayLike, ps: ArrayLike,
              sat: ArrayLike, load_factor: ArrayLike = 1.0, *,
              profile: Profile | str | None = None, strict: bool = True,
              precision: str = "double") -> FloatOrArray:
    """Port of :func:`airdata.stall_tas` (LIM-2); ``precision`` as above."""
    prof = _check_profile(profile)
    return _simple("stall_tas", lambda *a: _lim.stall_tas(*a, profile=prof), strict,
                   precision, {**_wing(weight, wing_area, cl_max), "ps": (ps, "pressure"),
                               "sat": (sat, "temperature"),
                               "load_factor": (load_factor, "load_factor")}, prof=prof)


def crossover_altitude(cas_limit: ArrayLike, mach_limit: ArrayLike, *,
                       profile: Profile | str | None = None, strict: bool = True,
                       precision: str = "double") -> FloatOrArray:
    """Port of :func:`airdata.crossover_altitude` (LIM-3); ``precision`` as above."""
    prof = _check_profile(profile)
    return _simple("crossover_altitude",
                   lambda *a: _lim.crossover_altitude(*a, profile=prof), strict, precision,
                   {"cas_limit": (cas_limit, "cas_limit"),
                    "mach_limit": (mach_limit, "subsonic_mach_limit")}, prof=prof)


def _max_operating(cname: str, ps: ArrayLike, cas_limit: ArrayLike, mach_limit: ArrayLike,
                   profile: Profile | str | None, strict: bool,
                   precision: str) -> FloatOrArray:
    prof = _check_profile(profile)
    ref = getattr(_lim, cname)
    return _simple(cname, lambda *a: ref(*a, profile=prof), strict, precision,
                   {"ps": (ps, "pressure"), "cas_limit": (cas_limit, "cas_limit"),
                    "mach_limit": (mach_limit, "mach_limit")}, prof=prof)


def max_operating_cas(ps: ArrayLike, cas_limit: ArrayLike, mach_limit: ArrayLike, *,
                      profile: Profile | str | None = None, strict: bool = True,
                      precision: str = "double") -> FloatOrArray:
    """Port of :func:`airdata.max_operating_cas` (LIM-4); ``precision`` as above."""
    return _max_operating("max_operating_cas", ps, cas_limit, mach_limit, profile, strict,
                          precision)


def max_operating_mach(ps: ArrayLike, cas_limit: ArrayLike, mach_limit: ArrayLike, *,
                       profile: Profile | str | None = None, strict: bool = True,
                       precision: str = "double") -> FloatOrArray:
    """Port of :func:`airdata.max_operating_mach` (LIM-4); ``precision`` as above."""
    return _max_operating("max_operating_mach", ps, cas_limit, mach_limit, profile, strict,
                          precision)


def ceiling_margin(ps: ArrayLike, ceiling: ArrayLike, *, profile: Profile | str | None = None,
                   strict: bool = True, precision: str = "double") -> FloatOrArray:
    """Port of :func:`airdata.ceiling_margin` (LIM-5); ``precision`` as above."""
    prof = _check_profile(profile)
    return _simple("ceiling_margin", lambda *a: _lim.ceiling_margin(*a, profile=prof),
                   strict, precision, {"ps": (ps, "pressure"), "ceiling": (ceiling, "altitude")},
                   prof=prof)
