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
import inspect
from collections.abc import Callable
from functools import cache
from types import ModuleType
from typing import Any

import numpy as np
from numpy.typing import NDArray

from . import _domains as dom
from . import chain as _chain
from ._docs import fill_doc
from ._inputs import ArrayLike, Domain, FloatOrArray
from .atmosphere import Atmosphere
from .atmosphere import atmosphere as _ref_atmosphere
from .chain import AirData
from .profiles import ICAO, Profile, get_profile
from .status import DomainError, Status

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


@fill_doc
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
    {precision}

    {broadcast}

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


# Every one-output function: the reference's own signature plus ``precision``, built from
# the function table (argument names in C order and their domains).


def _port_function(name: str) -> Callable[..., FloatOrArray]:
    """The port of the reference function ``name`` of one output, with that function's
    signature plus the keyword ``precision``, through its batch entry point.

    The function is compiled from a few lines of source so that it has the reference's
    parameters, defaults and speed (no argument binding at run time).
    """
    import airdata

    from .vectors.catalogue import get_spec

    ref = getattr(airdata, name)
    spec = get_spec(name)
    sig = inspect.signature(ref)
    params = []
    star = False
    for p in sig.parameters.values():
        if p.kind is inspect.Parameter.KEYWORD_ONLY and not star:
            params.append("*")
            star = True
        params.append(p.name if p.default is inspect.Parameter.empty
                      else f"{p.name}={p.default!r}")
    if not star:
        params.append("*")
    named = ", ".join(f"{a.name!r}: ({a.name}, {a.domain_name!r})" for a in spec.args)
    with_profile = "profile" in sig.parameters
    body = (f"    prof = _check_profile(profile)\n"
            f"    return _simple({name!r}, lambda *a: _ref(*a, profile=prof), strict, "
            f"precision, {{{named}}}, prof=prof)\n" if with_profile else
            f"    return _simple({name!r}, _ref, strict, precision, {{{named}}})\n")
    source = f"def {name}({', '.join(params)}, precision='double'):\n{body}"
    scope: dict[str, Any] = {"_check_profile": _check_profile, "_simple": _simple,
                             "_ref": ref}
    exec(compile(source, f"<airdata.cport.{name}>", "exec"), scope)  # noqa: S102
    fn: Callable[..., FloatOrArray] = scope[name]
    fn.__module__ = __name__
    fn.__doc__ = (f"Port of :func:`airdata.{name}` ({', '.join(spec.equations)}); "
                  "``precision``: ``\"double\"`` or ``\"single\"``, the build to run.")
    fn.__signature__ = sig.replace(parameters=[  # type: ignore[attr-defined]
        *sig.parameters.values(),
        inspect.Parameter("precision", inspect.Parameter.KEYWORD_ONLY, default="double",
                          annotation="str")])
    return fn


def _install_port_functions() -> list[str]:
    """Make the port of every one-output function of the table a name of this module
    (the two record functions, :func:`atmosphere` and :func:`air_data`, are written out
    here); their names, in the table's order."""
    from .vectors.catalogue import CATALOGUE

    names = [spec.name for spec in CATALOGUE if len(spec.outputs) == 1]
    for name in names:
        globals()[name] = _port_function(name)
    return names


_ONE_OUTPUT = _install_port_functions()




@fill_doc
def air_data(ps: ArrayLike, pt: ArrayLike, tat: ArrayLike, recovery: ArrayLike = 1.0,
             setting: ArrayLike | None = None, *, noise_band: float = _chain.NOISE_BAND,
             profile: Profile | str | None = None, strict: bool = True,
             precision: str = "double") -> AirData:
    """Port of :func:`airdata.air_data` (CHN-1).

    Parameters
    ----------
    ps, pt, tat, recovery, setting, noise_band, profile, strict
        As :func:`airdata.air_data` (``profile`` selects the build).
    {precision}

    {broadcast}

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
    out = np.empty((b.n, len(_chain.AIR_DATA_OUTPUTS)), dtype=b.dtype)
    if b.n:
        ins = b.inputs()
        use = 1 if setting is not None else 0
        bad = b.done(b.mod.lib.ad_air_data_n(
            ins[0], ins[1], ins[2], ins[3], ins[4] if use else b.mod.ffi.NULL, use,
            float(noise_band), b.ptr(out, "ad_air_data_t[]"),
            b.ptr(b.status, "unsigned char[]"), b.n))
        if bad and strict:
            b.raise_first(lambda *a: _chain.air_data(*a, noise_band=noise_band, profile=prof))
    cols = {f: b.finish(np.ascontiguousarray(out[:, j]))
            for j, f in enumerate(_chain.AIR_DATA_OUTPUTS)}
    if setting is None:
        cols["baro_altitude"] = None
    status = b.status.astype(np.int8)
    return AirData(**cols, status=int(status[0]) if b.scalar else status.reshape(b.shape),
                   profile=prof.name)


#: The two record functions and every one-output function of the table.
__all__ = ["PRECISIONS", "atmosphere", "air_data", *_ONE_OUTPUT]
