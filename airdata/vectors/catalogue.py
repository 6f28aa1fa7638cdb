"""The catalogue of functions covered by the golden vectors.

For every public function of :mod:`airdata` this module states its arguments (in the
order of the C interface, bindings/c/include/airdata.h), their units and valid ranges,
its outputs, its equation ids (docs/equations.md), how to evaluate the Python reference
on a batch of cases, and which cases to generate.

Case generation is deterministic: fixed sweeps (``numpy.linspace``/``geomspace``),
the seams of the model (layer bases, M = 1, CAS = a0, qc/ps at M = 1) at 0, +-1 and
+-4 ulp (``math.nextafter``), the ends of every range, tiny values, and invalid inputs.
"""

from __future__ import annotations

import math
from collections.abc import Callable, Sequence
from dataclasses import dataclass, field

import numpy as np
from numpy.typing import NDArray

import airdata

from .. import _domains as dom
from .._inputs import Domain, capture_statuses
from ..chain import NOISE_BAND
from ..pitot import RATIO_MAX, RATIO_SONIC
from ..profiles import Profile
from ..status import DomainError, Status

__all__ = ["Arg", "FunctionSpec", "CaseSeed", "CATALOGUE", "catalogue", "evaluate"]

F64 = NDArray[np.float64]

#: Tags a case may carry, with their meaning (also listed in the schema).
TAGS: dict[str, str] = {
    "sweep": "point of the dense sweep of the valid range",
    "layer-base": "an input at (or a few ulp from) a layer base of the atmosphere model",
    "sonic": "at (or a few ulp from) the M = 1 switch of the pitot relation",
    "ulp-offset": "an input moved by 1 or 4 ulp from a seam or a range end",
    "range-end": "an input at (or a few ulp from) an end of its valid range",
    "derived-limit": "a quantity derived from the inputs near the end of its valid range",
    "supersonic": "the supersonic (Rayleigh pitot) branch",
    "tiny": "a tiny but valid input (Mach 1e-8, qc 1e-6 Pa, ...)",
    "extreme": "an extreme input or output of the valid range",
    "invalid": "the expected status is an error",
    "nan": "an input is NaN",
    "infinite": "an input is infinite",
    "zero": "an input is zero or negative zero",
    "negative": "an input is negative",
    "out-of-range": "an input or derived quantity outside its valid range",
    "argument-order": "two bad inputs: the first in argument order decides the status",
    "with-setting": "air_data with an altimeter setting",
    "no-setting": "air_data without an altimeter setting (setting is NaN and ignored)",
    "zeroed": "air_data: a small negative impact pressure read as zero",
    "noise-band": "air_data: a non-default noise band",
    "subnormal": "an input or expected output is nonzero and below the normal binary64 range "
                 "(2**-1022): a target that flushes subnormals to zero skips it",
    "seam-window": "an input or derived quantity moved from a switch, layer base or limit by a "
                   "relative offset between 1e-15 and 1e-3",
    "crossover": "at (or a few ulp from) the pressure where a CAS limit and a Mach limit "
                 "coincide: the maximum operating speed switches from one to the other",
}

#: Tags added after suite 1.0.0: optional in a file's tag table (format version 1 stays
#: readable both ways).
LATER_TAGS = frozenset({"subnormal", "seam-window"})

_ULPS = (-4, -1, 1, 4)


def ulp_step(x: float, n: int) -> float:
    """``x`` moved by ``n`` ulps (``math.nextafter`` applied ``|n|`` times)."""
    target = math.inf if n > 0 else -math.inf
    for _ in range(abs(n)):
        x = math.nextafter(x, target)
    return x


def around(x: float) -> list[tuple[float, bool]]:
    """``x`` and its neighbours at -4, -1, +1, +4 ulp; flag says 'moved'."""
    return [(x, False)] + [(ulp_step(x, n), True) for n in _ULPS]


#: Relative offsets of a seam window, log-spaced from 1e-15 to 1e-3 (both sides are
#: taken): a constant typed with 4 or 6 significant digits, or off by 1e-6 relative,
#: or a binary32 value in a binary64 build, moves a switch by one of these.
WINDOW = (1e-15, 1e-14, 1e-13, 1e-12, 1e-11, 1e-10, 1e-9, 1e-8, 1e-7, 1e-6, 1e-5, 1e-4,
          1e-3)


#: Relative offsets of the window around a range end (suite 2.1.0): fewer than a seam's,
#: since every argument of every function has two ends; 1e-7 and 1e-5 are the binary32
#: spacing and a constant typed with 6 digits, 1e-3 one typed with 4.
RANGE_WINDOW = (1e-15, 1e-12, 1e-9, 1e-7, 1e-5, 1e-3)


def window(x: float, offsets: tuple[float, ...] = WINDOW) -> list[float]:
    """``x`` moved by every relative offset of ``offsets`` (default :data:`WINDOW`), below
    and above (an offset that rounds back onto ``x`` is dropped; for ``x = 0`` the
    offsets are absolute)."""
    out = []
    for r in offsets:
        for sign in (-1.0, 1.0):
            v = x * (1.0 + sign * r) if x != 0.0 else sign * r
            if v != x:
                out.append(v)
    return out


@dataclass(frozen=True)
class Arg:
    """One argument of a catalogue function.

    Attributes
    ----------
    name : str
        Parameter name (Python and C).
    unit : str
        SI unit, ``"1"`` for dimensionless, ``""`` for a flag.
    domain_name : str or None
        The argument's domain: a name of ``airdata._domains.C_DOMAINS``, which also gives
        the C port's ``ad_domain_id`` (``None`` for an integer flag).  :attr:`domain`
        is its Profile -> :class:`Domain`.
    sweep : tuple
        ``(kind, lo, hi)`` of the dense sweep; ``kind`` is ``"lin"``, ``"log"`` or
        ``"mach"`` (denser below 1); ``lo``/``hi`` ``None`` means the domain end.
    nominal : callable
        Profile -> typical valid values used while other arguments vary.
    seams : callable
        Profile -> ``[(value, tag)]`` switch points of the kernels.
    kind : str
        ``"real"`` or ``"flag"`` (an integer 0/1).
    """

    name: str
    unit: str
    domain_name: str | None
    sweep: tuple[str, float | None, float | None] = ("lin", None, None)
    nominal: Callable[[Profile], list[float]] = lambda p: []
    seams: Callable[[Profile], list[tuple[float, str]]] = lambda p: []
    kind: str = "real"

    @property
    def domain(self) -> Callable[[Profile], Domain] | None:
        """Profile -> :class:`Domain` of the argument (``None`` for a flag)."""
        if self.domain_name is None:
            return None
        return dict(dom.C_DOMAINS)[self.domain_name]


@dataclass(frozen=True)
class CaseSeed:
    """Inputs of one case (by argument name) and the tags saying why it exists."""

    inputs: dict[str, float]
    tags: tuple[str, ...]


@dataclass(frozen=True)
class FunctionSpec:
    """One catalogue function: arguments, outputs, equations, evaluation, cases."""

    name: str
    equations: tuple[str, ...]
    summary: str
    args: tuple[Arg, ...]
    outputs: tuple[tuple[str, str], ...]
    call: Callable[..., dict[str, F64]]
    grid: tuple[int, ...]
    extra: Callable[[Profile], list[CaseSeed]] = lambda p: []
    nominal_sets: Callable[[Profile], list[dict[str, float]]] | None = None
    status_of: Callable[[dict[str, F64], Profile], tuple[dict[str, F64], NDArray[np.int8]]] | None \
        = field(default=None)
    #: Arguments that the batch entry point ``ad_<name>_n`` takes once per call (flags
    #: and settings of the whole batch) instead of one value per element.
    batch_per_call: tuple[str, ...] = ()
    #: (array argument, flag argument): the array may be NULL while the flag is 0.
    batch_optional: tuple[tuple[str, str], ...] = ()

    @property
    def c_name(self) -> str:
        """Name of the C function."""
        return "ad_" + self.name

    @property
    def real_args(self) -> tuple[Arg, ...]:
        """Arguments of kind real."""
        return tuple(a for a in self.args if a.kind == "real")


# ---------------------------------------------------------------------------------
# Arguments
# ---------------------------------------------------------------------------------

def _alt_seams(p: Profile) -> list[tuple[float, str]]:
    return [(b, "layer-base") for b in p.layer_base]


def _p_seams(p: Profile) -> list[tuple[float, str]]:
    return [(b, "layer-base") for b in p.base_pressure]


def _z_seams(p: Profile) -> list[tuple[float, str]]:
    return [(p.r0 * b / (p.r0 - b), "layer-base") for b in p.layer_base]


def _mach_seams(p: Profile) -> list[tuple[float, str]]:
    return [(1.0, "sonic")]


def _cas_seams(p: Profile) -> list[tuple[float, str]]:
    return [(p.a0, "sonic")]


def _nominal_p(p: Profile) -> list[float]:
    return [p.p0, 54019.9, 4000.0, 12.0]


def _mk_args() -> dict[str, Arg]:
    a: dict[str, Arg] = {}
    a["h"] = Arg("h", "m", "altitude", ("lin", None, None),
                 lambda p: [0.0, 3000.0, 15000.0, 60000.0], _alt_seams)
    a["dT"] = Arg("dT", "K", "delta_t", ("lin", None, None),
                  lambda p: [0.0, -30.0, 25.0])
    a["z"] = Arg("z", "m", "geometric", ("lin", None, None), lambda p: [0.0], _z_seams)
    a["ps"] = Arg("ps", "Pa", "pressure", ("log", None, None), _nominal_p, _p_seams)
    a["ps_trop"] = Arg("ps", "Pa", "setting", ("log", None, None),
                       lambda p: [p.p0, 84307.0, 60000.0], _p_seams)
    a["setting"] = Arg("setting", "Pa", "setting", ("lin", None, None),
                       lambda p: [p.p0, 98000.0, 104000.0], _p_seams)
    a["elevation"] = Arg("elevation", "m", "elevation", ("lin", None, None),
                         lambda p: [0.0, 1500.0, -300.0],
                         lambda p: [(0.0, "layer-base"), (11000.0, "layer-base")])
    a["sat"] = Arg("sat", "K", "temperature", ("lin", 150.0, 400.0),
                   lambda p: [288.15, 216.65, 250.0])
    a["tat"] = Arg("tat", "K", "temperature", ("lin", 150.0, 600.0),
                   lambda p: [288.15, 250.0, 320.0])
    a["mach"] = Arg("mach", "1", "mach", ("mach", None, None),
                    lambda p: [0.3, 0.85, 2.0], _mach_seams)
    a["recovery"] = Arg("recovery", "1", "recovery", ("lin", None, None),
                        lambda p: [1.0, 0.98, 0.75])
    a["cas"] = Arg("cas", "m/s", "speed", ("lin", 0.0, 3400.0),
                   lambda p: [60.0, 150.0, 250.0], _cas_seams)
    a["eas"] = Arg("eas", "m/s", "speed", ("lin", 0.0, 1200.0),
                   lambda p: [60.0, 150.0, 250.0])
    a["tas"] = Arg("tas", "m/s", "speed", ("lin", 0.0, 4000.0),
                   lambda p: [60.0, 230.0, 600.0])
    a["qc"] = Arg("qc", "Pa", "impact_pressure", ("log", 1.0e-3, 1.0e7),
                  lambda p: [3000.0, 20000.0, 150.0])
    a["qc_cas"] = Arg("qc", "Pa", "impact_pressure", ("log", 1.0e-3, 1.2e7),
                      lambda p: [3000.0, 20000.0, 150.0],
                      lambda p: [(RATIO_SONIC * p.p0, "sonic")])
    a["pt"] = Arg("pt", "Pa", "total_pressure", ("log", None, None),
                  lambda p: [p.p0 + 3000.0])
    a["noise_band"] = Arg("noise_band", "Pa", "noise_band", ("lin", None, None),
                          lambda p: [NOISE_BAND])
    a["use_setting"] = Arg("use_setting", "", None, kind="flag")
    # The limit functions (airdata/limits.py).
    a["weight"] = Arg("weight", "N", "weight", ("log", 1.0e3, 1.0e7),
                      lambda p: [6.0e5, 2.0e4, 3.0e6])
    a["wing_area"] = Arg("wing_area", "m2", "wing_area", ("log", 5.0, 2000.0),
                         lambda p: [120.0, 15.0, 400.0])
    a["cl_max"] = Arg("cl_max", "1", "cl_max", ("lin", 0.5, 10.0),
                      lambda p: [2.4, 1.4, 3.0])
    a["load_factor"] = Arg("load_factor", "1", "load_factor", ("lin", 0.5, 10.0),
                           lambda p: [1.0, 1.5, 2.5])
    a["cas_limit"] = Arg("cas_limit", "m/s", "cas_limit", ("lin", 40.0, 700.0),
                         lambda p: [175.0, 130.0, 250.0], _cas_seams)
    a["mach_limit"] = Arg("mach_limit", "1", "mach_limit", ("lin", 0.2, 4.0),
                          lambda p: [0.82, 0.6, 2.0], _mach_seams)
    a["subsonic_mach_limit"] = Arg("mach_limit", "1", "subsonic_mach_limit",
                                   ("lin", 0.3, 0.99), lambda p: [0.82, 0.6, 0.9],
                                   lambda p: [(1.0, "sonic")])
    a["ceiling"] = Arg("ceiling", "m", "altitude", ("lin", None, None),
                       lambda p: [12500.0, 4000.0, 20000.0], _alt_seams)
    return a


ARGS = _mk_args()


# ---------------------------------------------------------------------------------
# Reference evaluation
# ---------------------------------------------------------------------------------

def _single(fn: Callable[..., object], out: str, names: Sequence[str]
            ) -> Callable[..., dict[str, F64]]:
    def call(x: dict[str, F64], profile: Profile, strict: bool) -> dict[str, F64]:
        kw = {} if fn in (airdata.sat_from_tat, airdata.tat_from_sat) else {"profile": profile}
        y = fn(*[x[n] for n in names], strict=strict, **kw)
        return {out: np.asarray(y, dtype=np.float64)}
    return call


_ATM_OUT = ("temperature", "pressure", "density", "speed_of_sound", "dynamic_viscosity",
            "kinematic_viscosity")
_CHAIN_OUT = ("pressure_altitude", "baro_altitude", "impact_pressure", "mach", "cas", "eas",
              "tas", "sat", "density", "density_altitude", "dynamic_pressure")


def _call_atmosphere(x: dict[str, F64], profile: Profile, strict: bool) -> dict[str, F64]:
    r = airdata.atmosphere(x["h"], x["dT"], profile=profile, strict=strict)
    return {k: np.asarray(getattr(r, k), dtype=np.float64) for k in _ATM_OUT}


def _chain_status(x: dict[str, F64], profile: Profile) -> tuple[dict[str, F64], NDArray[np.int8]]:
    """Outputs and status of air_data for a batch (strict=False), per the C contract.

    ``use_setting`` selects a call with or without a setting; ``noise_band`` (a scalar
    keyword in Python) is grouped.  A noise band outside [0, 10000] Pa, which Python
    refuses with ValueError before looking at any other argument, gets the status of the
    noise-band domain (NaN and infinities invalid, negative invalid, above 10000 Pa out
    of range) whatever the other arguments; all outputs are then NaN.
    """
    n = x["ps"].shape[0]
    outs = {k: np.full(n, np.nan) for k in _CHAIN_OUT}
    status = np.zeros(n, dtype=np.int8)
    use = x["use_setting"] != 0
    nb = x["noise_band"]
    nb_status = dom.NOISE.classify(nb)
    keys = sorted({(bool(u), float(b).hex()) for u, b in zip(use, nb, strict=True)})
    for u, bhex in keys:
        b = float.fromhex(bhex)
        sel = (use == u) & np.array([float(v).hex() == bhex for v in nb])
        named = {"ps": (x["ps"][sel], dom.pressure(profile)),
                 "pt": (x["pt"][sel], dom.TOTAL_PRESSURE),
                 "tat": (x["tat"][sel], dom.TEMPERATURE),
                 "recovery": (x["recovery"][sel], dom.RECOVERY)}
        if u:
            named["setting"] = (x["setting"][sel], dom.setting(profile))
        if nb_status[sel][0] != Status.OK:
            status[sel] = nb_status[sel]
            continue
        r = airdata.air_data(x["ps"][sel], x["pt"][sel], x["tat"][sel], x["recovery"][sel],
                             x["setting"][sel] if u else None, noise_band=b,
                             profile=profile, strict=False)
        for k in _CHAIN_OUT:
            v = getattr(r, k)
            if v is not None:
                outs[k][sel] = v
        status[sel] = np.asarray(r.status, dtype=np.int8)
    return outs, status


def evaluate(spec: FunctionSpec, x: dict[str, F64], profile: Profile
             ) -> tuple[dict[str, F64], NDArray[np.int8]]:
    """Outputs (NaN on error) and status of the reference for a batch of cases.

    The outputs come from one ``strict=False`` call, and so do the statuses: the
    function's :class:`~airdata._inputs.Inputs` keeps the first failing check of each
    element, in argument order, derived checks after, which is what a ``strict=True``
    call on that case alone raises (``tests/test_vectors.py`` compares the two on every
    case).  Where the call leaves no status array of the batch's shape whose errors are
    exactly the NaN outputs, each bad case is re-evaluated alone in strict mode.
    """
    if spec.status_of is not None:
        return spec.status_of(x, profile)
    names = [a.name for a in spec.args]
    with capture_statuses() as log:
        outs = spec.call(x, profile, False)
    n = x[names[0]].shape[0]
    bad = np.zeros(n, dtype=bool)
    for v in outs.values():
        bad |= np.isnan(v)
    for st in reversed(log):  # the outermost call finishes last
        if st.shape == (n,) and np.array_equal(st != Status.OK, bad):
            return outs, st.astype(np.int8)
    return outs, _strict_statuses(spec, x, profile, bad)


def _strict_statuses(spec: FunctionSpec, x: dict[str, F64], profile: Profile,
                     bad: NDArray[np.bool_]) -> NDArray[np.int8]:
    """The status of every ``bad`` case from a ``strict=True`` call on it alone."""
    names = [a.name for a in spec.args]
    status = np.zeros(bad.shape[0], dtype=np.int8)
    for i in np.flatnonzero(bad):
        try:
            spec.call({k: x[k][i] for k in names}, profile, True)
        except DomainError as exc:
            status[i] = int(exc.status)
        else:  # pragma: no cover - a NaN output without an error would be a library bug
            raise RuntimeError(f"{spec.name}: NaN output without an error at case {i}")
    return status


# ---------------------------------------------------------------------------------
# Function-specific cases (derived sweeps, derived seams and limits)
# ---------------------------------------------------------------------------------

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


def _extra_mach_from_qc(p: Profile) -> list[CaseSeed]:
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
    for v in (1e-305, 1e-310, 5e-324):  # near and below underflow
        seeds.append(CaseSeed({"qc": v, "ps": 54019.9}, ("tiny", "extreme")))
    return seeds


def _extra_cas_from_qc(p: Profile) -> list[CaseSeed]:
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


def _extra_qc_from_cas(p: Profile) -> list[CaseSeed]:
    seeds = [CaseSeed({"cas": v}, ("derived-limit", "extreme"))
             for v, _ in _derived_limit(10.0 * p.a0)]
    seeds.append(CaseSeed({"cas": 1e-6}, ("tiny",)))
    return seeds


def _extra_cas_from_mach(p: Profile) -> list[CaseSeed]:
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


def _extra_mach_from_cas(p: Profile) -> list[CaseSeed]:
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


def _extra_mach_from_eas(p: Profile) -> list[CaseSeed]:
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


def _extra_mach_from_tas(p: Profile) -> list[CaseSeed]:
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


def _extra_density_altitude(p: Profile) -> list[CaseSeed]:
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


def _extra_altimeter_setting(p: Profile) -> list[CaseSeed]:
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


def _extra_chain(p: Profile) -> list[CaseSeed]:
    seeds: list[CaseSeed] = []

    def add(ps: float, pt: float, tat: float, rec: float, setting: float | None,
            tags: tuple[str, ...], nb: float = NOISE_BAND) -> None:
        x = {"ps": ps, "pt": pt, "tat": tat, "recovery": rec,
             "setting": math.nan if setting is None else setting,
             "use_setting": 0.0 if setting is None else 1.0, "noise_band": nb}
        extra = ("no-setting",) if setting is None else ("with-setting",)
        seeds.append(CaseSeed(x, tags + extra + (("noise-band",) if nb != NOISE_BAND else ())))

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


def _chain_nominals(p: Profile) -> list[dict[str, float]]:
    return [
        {"ps": p.p0, "pt": p.p0 + 3000.0, "tat": 290.0, "recovery": 1.0, "setting": 101325.0,
         "use_setting": 1.0, "noise_band": NOISE_BAND},
        {"ps": 23842.3, "pt": 36000.0, "tat": 240.0, "recovery": 0.98, "setting": math.nan,
         "use_setting": 0.0, "noise_band": NOISE_BAND},
    ]


def _extra_tiny_mach(p: Profile) -> list[CaseSeed]:
    return [CaseSeed({"mach": 1e-8, "ps": p.p0}, ("tiny",)),
            CaseSeed({"mach": 1e-8, "ps": p.p_min}, ("tiny", "extreme"))]


def _extra_tiny_mach_sat(p: Profile) -> list[CaseSeed]:
    return [CaseSeed({"mach": 1e-8, "sat": 288.15}, ("tiny",))]


def _extra_temperature(first: str) -> Callable[[Profile], list[CaseSeed]]:
    def extra(p: Profile) -> list[CaseSeed]:
        return [CaseSeed({first: 288.15, "mach": 1e-8, "recovery": 1.0}, ("tiny",)),
                CaseSeed({first: 288.15, "mach": 0.5, "recovery": 1e-8}, ("tiny",))]
    return extra


def _stall_extra(name: str) -> Callable[[Profile], list[CaseSeed]]:
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


def _extra_crossover(p: Profile) -> list[CaseSeed]:
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


def _extra_max_operating(p: Profile) -> list[CaseSeed]:
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


def _mk_catalogue() -> tuple[FunctionSpec, ...]:
    A = ARGS
    s = _single
    return (
        FunctionSpec("atmosphere", ("ATM-1", "ATM-2", "ATM-3", "ATM-4", "ATM-5", "ATM-6"),
                     "Standard atmosphere state at geopotential altitude h, "
                     "optionally off-standard by dT",
                     (A["h"], A["dT"]),
                     (("temperature", "K"), ("pressure", "Pa"), ("density", "kg/m3"),
                      ("speed_of_sound", "m/s"), ("dynamic_viscosity", "Pa s"),
                      ("kinematic_viscosity", "m2/s")),
                     _call_atmosphere, (200, 5)),
        FunctionSpec("geopotential_altitude", ("ATM-7",),
                     "Geopotential altitude from geometric altitude", (A["z"],), (("h", "m"),),
                     s(airdata.geopotential_altitude, "h", ["z"]), (800,)),
        FunctionSpec("geometric_altitude", ("ATM-8",),
                     "Geometric altitude from geopotential altitude", (A["h"],), (("z", "m"),),
                     s(airdata.geometric_altitude, "z", ["h"]), (800,)),
        FunctionSpec("pressure_altitude", ("ALT-1",),
                     "Pressure altitude of static pressure ps", (A["ps"],), (("h", "m"),),
                     s(airdata.pressure_altitude, "h", ["ps"]), (1000,)),
        FunctionSpec("pressure_at_altitude", ("ATM-1", "ATM-3"),
                     "Standard static pressure at pressure altitude h", (A["h"],),
                     (("ps", "Pa"),), s(airdata.pressure_at_altitude, "ps", ["h"]), (1000,)),
        FunctionSpec("baro_corrected_altitude", ("ALT-2",),
                     "Altitude shown by an altimeter set to setting", (A["ps"], A["setting"]),
                     (("h", "m"),), s(airdata.baro_corrected_altitude, "h", ["ps", "setting"]),
                     (40, 20)),
        FunctionSpec("altimeter_setting", ("ALT-3",),
                     "Altimeter setting that makes an altimeter read elevation at ps",
                     (A["ps_trop"], A["elevation"]), (("setting", "Pa"),),
                     s(airdata.altimeter_setting, "setting", ["ps", "elevation"]), (16, 16),
                     _extra_altimeter_setting),
        FunctionSpec("density_altitude", ("ALT-4",),
                     "Density altitude of static pressure ps and static air temperature sat",
                     (A["ps"], A["sat"]), (("h", "m"),),
                     s(airdata.density_altitude, "h", ["ps", "sat"]), (24, 16),
                     _extra_density_altitude),
        FunctionSpec("impact_pressure_from_mach", ("PIT-1",),
                     "Impact pressure qc = pt - ps at Mach mach", (A["mach"], A["ps"]),
                     (("qc", "Pa"),),
                     s(airdata.impact_pressure_from_mach, "qc", ["mach", "ps"]), (32, 30),
                     _extra_tiny_mach),
        FunctionSpec("mach_from_impact_pressure", ("PIT-2",),
                     "Mach number from impact pressure and static pressure",
                     (A["qc"], A["ps"]), (("mach", "1"),),
                     s(airdata.mach_from_impact_pressure, "mach", ["qc", "ps"]), (16, 16),
                     _extra_mach_from_qc),
        FunctionSpec("impact_pressure_from_cas", ("PIT-3",),
                     "Impact pressure of calibrated airspeed cas", (A["cas"],), (("qc", "Pa"),),
                     s(airdata.impact_pressure_from_cas, "qc", ["cas"]), (900,),
                     _extra_qc_from_cas),
        FunctionSpec("cas_from_impact_pressure", ("PIT-4",),
                     "Calibrated airspeed from impact pressure", (A["qc_cas"],),
                     (("cas", "m/s"),), s(airdata.cas_from_impact_pressure, "cas", ["qc"]),
                     (700,), _extra_cas_from_qc),
        FunctionSpec("cas_from_mach", ("SPD-1",),
                     "Calibrated airspeed at Mach mach and static pressure ps",
                     (A["mach"], A["ps"]), (("cas", "m/s"),),
                     s(airdata.cas_from_mach, "cas", ["mach", "ps"]), (32, 30),
                     _extra_cas_from_mach),
        FunctionSpec("mach_from_cas", ("SPD-1",),
                     "Mach number at calibrated airspeed cas and static pressure ps",
                     (A["cas"], A["ps"]), (("mach", "1"),),
                     s(airdata.mach_from_cas, "mach", ["cas", "ps"]), (16, 16),
                     _extra_mach_from_cas),
        FunctionSpec("eas_from_mach", ("SPD-2",),
                     "Equivalent airspeed at Mach mach and static pressure ps",
                     (A["mach"], A["ps"]), (("eas", "m/s"),),
                     s(airdata.eas_from_mach, "eas", ["mach", "ps"]), (32, 30),
                     _extra_tiny_mach),
        FunctionSpec("mach_from_eas", ("SPD-2",),
                     "Mach number at equivalent airspeed eas and static pressure ps",
                     (A["eas"], A["ps"]), (("mach", "1"),),
                     s(airdata.mach_from_eas, "mach", ["eas", "ps"]), (16, 16),
                     _extra_mach_from_eas),
        FunctionSpec("tas_from_mach", ("SPD-3",),
                     "True airspeed at Mach mach and static air temperature sat",
                     (A["mach"], A["sat"]), (("tas", "m/s"),),
                     s(airdata.tas_from_mach, "tas", ["mach", "sat"]), (32, 28),
                     _extra_tiny_mach_sat),
        FunctionSpec("mach_from_tas", ("SPD-3",),
                     "Mach number at true airspeed tas and static air temperature sat",
                     (A["tas"], A["sat"]), (("mach", "1"),),
                     s(airdata.mach_from_tas, "mach", ["tas", "sat"]), (16, 16),
                     _extra_mach_from_tas),
        FunctionSpec("dynamic_pressure", ("SPD-4",),
                     "Dynamic pressure (gamma/2) ps M^2", (A["mach"], A["ps"]), (("q", "Pa"),),
                     s(airdata.dynamic_pressure, "q", ["mach", "ps"]), (32, 30),
                     _extra_tiny_mach),
        FunctionSpec("sat_from_tat", ("TMP-1",),
                     "Static air temperature from total air temperature",
                     (A["tat"], A["mach"], A["recovery"]), (("sat", "K"),),
                     s(airdata.sat_from_tat, "sat", ["tat", "mach", "recovery"]), (14, 14, 5),
                     _extra_temperature("tat")),
        FunctionSpec("tat_from_sat", ("TMP-1",),
                     "Total air temperature from static air temperature",
                     (A["sat"], A["mach"], A["recovery"]), (("tat", "K"),),
                     s(airdata.tat_from_sat, "tat", ["sat", "mach", "recovery"]), (14, 14, 5),
                     _extra_temperature("sat")),
        FunctionSpec("air_data", ("CHN-1",),
                     "The air-data chain: static pressure, total pressure and TAT in, "
                     "every air-data output out",
                     (A["ps"], A["pt"], A["tat"], A["recovery"], A["setting"], A["use_setting"],
                      A["noise_band"]),
                     tuple((k, u) for k, u in zip(_CHAIN_OUT, (
                         "m", "m", "Pa", "1", "m/s", "m/s", "m/s", "K", "kg/m3", "m", "Pa"),
                         strict=True)),
                     lambda x, p, s_: {}, (), _extra_chain, _chain_nominals, _chain_status,
                     batch_per_call=("use_setting", "noise_band"),
                     batch_optional=(("setting", "use_setting"),)),
        FunctionSpec("stall_eas", ("LIM-1",),
                     "Stall equivalent airspeed from lift = load_factor x weight",
                     (A["weight"], A["wing_area"], A["cl_max"], A["load_factor"]),
                     (("eas", "m/s"),),
                     s(airdata.stall_eas, "eas", ["weight", "wing_area", "cl_max",
                                                  "load_factor"]),
                     (7, 5, 4, 4), _stall_extra("stall_eas")),
        FunctionSpec("stall_mach", ("LIM-1", "LIM-2"), "Stall Mach number at static pressure ps",
                     (A["weight"], A["wing_area"], A["cl_max"], A["ps"], A["load_factor"]),
                     (("mach", "1"),),
                     s(airdata.stall_mach, "mach", ["weight", "wing_area", "cl_max", "ps",
                                                    "load_factor"]),
                     (5, 3, 3, 8, 2), _stall_extra("stall_mach")),
        FunctionSpec("stall_cas", ("LIM-1", "LIM-2"),
                     "Stall calibrated airspeed at static pressure ps",
                     (A["weight"], A["wing_area"], A["cl_max"], A["ps"], A["load_factor"]),
                     (("cas", "m/s"),),
                     s(airdata.stall_cas, "cas", ["weight", "wing_area", "cl_max", "ps",
                                                  "load_factor"]),
                     (5, 3, 3, 8, 2), _stall_extra("stall_cas")),
        FunctionSpec("stall_tas", ("LIM-1", "LIM-2"),
                     "Stall true airspeed at static pressure ps and static air temperature sat",
                     (A["weight"], A["wing_area"], A["cl_max"], A["ps"], A["sat"],
                      A["load_factor"]),
                     (("tas", "m/s"),),
                     s(airdata.stall_tas, "tas", ["weight", "wing_area", "cl_max", "ps", "sat",
                                                  "load_factor"]),
                     (4, 2, 3, 6, 2, 2), _stall_extra("stall_tas")),
        FunctionSpec("crossover_altitude", ("LIM-3",),
                     "Pressure altitude where a CAS limit and a subsonic Mach limit coincide",
                     (A["cas_limit"], A["subsonic_mach_limit"]), (("h", "m"),),
                     s(airdata.crossover_altitude, "h", ["cas_limit", "mach_limit"]),
                     (24, 16), _extra_crossover),
        FunctionSpec("max_operating_cas", ("LIM-4",),
                     "Maximum operating CAS at ps: the lower of a CAS and a Mach limit",
                     (A["ps"], A["cas_limit"], A["mach_limit"]), (("cas", "m/s"),),
                     s(airdata.max_operating_cas, "cas", ["ps", "cas_limit", "mach_limit"]),
                     (16, 6, 6), _extra_max_operating),
        FunctionSpec("max_operating_mach", ("LIM-4",),
                     "Maximum operating Mach number at ps: the lower of a CAS and a Mach limit",
                     (A["ps"], A["cas_limit"], A["mach_limit"]), (("mach", "1"),),
                     s(airdata.max_operating_mach, "mach", ["ps", "cas_limit", "mach_limit"]),
                     (16, 6, 6), _extra_max_operating),
        FunctionSpec("ceiling_margin", ("LIM-5", "ALT-1"),
                     "Margin to a maximum altitude given as a pressure altitude",
                     (A["ps"], A["ceiling"]), (("margin", "m"),),
                     s(airdata.ceiling_margin, "margin", ["ps", "ceiling"]), (30, 15)),
    )


CATALOGUE: tuple[FunctionSpec, ...] = _mk_catalogue()


def catalogue() -> tuple[FunctionSpec, ...]:
    """Every catalogue function, in the order of the C header."""
    return CATALOGUE


def get_spec(name: str) -> FunctionSpec:
    """The catalogue entry of function ``name``."""
    for spec in CATALOGUE:
        if spec.name == name:
            return spec
    raise KeyError(f"no catalogue function named {name!r}")
