"""The function table: every public function of :mod:`airdata` that the golden vectors
and the C port cover.

For every function this module states its arguments (in the order of the C interface,
bindings/c/include/airdata.h), their units and domains (names of
``airdata._domains.C_DOMAINS``), its outputs, its equation ids (docs/equations.md), the
shape of its C batch entry point, how to evaluate the Python reference on a batch of
cases, and which function-specific case seeds it has (:mod:`airdata.vectors.cases`).
The C files and the runner's per-function part are generated from it
(bindings/c/tools/generate.py); :mod:`airdata.cport` builds its wrappers from it.
"""

from __future__ import annotations

from collections.abc import Callable, Sequence
from dataclasses import dataclass, field

import numpy as np
from numpy.typing import NDArray

import airdata

from .. import _domains as dom
from .._inputs import Domain, capture_statuses
from ..chain import AIR_DATA_OUTPUTS as _CHAIN_OUT
from ..chain import NOISE_BAND
from ..pitot import RATIO_SONIC
from ..profiles import Profile
from ..status import DomainError, Status
from . import cases, seeds
from .cases import CaseSeed

__all__ = ["Arg", "FunctionSpec", "CaseSeed", "CATALOGUE", "catalogue", "evaluate"]

F64 = NDArray[np.float64]

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

def _mk_args() -> dict[str, Arg]:
    a: dict[str, Arg] = {}
    a["h"] = Arg("h", "m", "altitude", ("lin", None, None),
                 lambda p: [0.0, 3000.0, 15000.0, 60000.0], cases.alt_seams)
    a["dT"] = Arg("dT", "K", "delta_t", ("lin", None, None),
                  lambda p: [0.0, -30.0, 25.0])
    a["z"] = Arg("z", "m", "geometric", ("lin", None, None), lambda p: [0.0], cases.z_seams)
    a["ps"] = Arg("ps", "Pa", "pressure", ("log", None, None), cases.nominal_p, cases.p_seams)
    a["ps_trop"] = Arg("ps", "Pa", "setting", ("log", None, None),
                       lambda p: [p.p0, 84307.0, 60000.0], cases.p_seams)
    a["setting"] = Arg("setting", "Pa", "setting", ("lin", None, None),
                       lambda p: [p.p0, 98000.0, 104000.0], cases.p_seams)
    a["elevation"] = Arg("elevation", "m", "elevation", ("lin", None, None),
                         lambda p: [0.0, 1500.0, -300.0],
                         lambda p: [(0.0, "layer-base"), (11000.0, "layer-base")])
    a["sat"] = Arg("sat", "K", "temperature", ("lin", 150.0, 400.0),
                   lambda p: [288.15, 216.65, 250.0])
    a["tat"] = Arg("tat", "K", "temperature", ("lin", 150.0, 600.0),
                   lambda p: [288.15, 250.0, 320.0])
    a["mach"] = Arg("mach", "1", "mach", ("mach", None, None),
                    lambda p: [0.3, 0.85, 2.0], cases.mach_seams)
    a["recovery"] = Arg("recovery", "1", "recovery", ("lin", None, None),
                        lambda p: [1.0, 0.98, 0.75])
    a["cas"] = Arg("cas", "m/s", "speed", ("lin", 0.0, 3400.0),
                   lambda p: [60.0, 150.0, 250.0], cases.cas_seams)
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
    # The limit functions (airdata/limits/equations.py).
    a["weight"] = Arg("weight", "N", "weight", ("log", 1.0e3, 1.0e7),
                      lambda p: [6.0e5, 2.0e4, 3.0e6])
    a["wing_area"] = Arg("wing_area", "m2", "wing_area", ("log", 5.0, 2000.0),
                         lambda p: [120.0, 15.0, 400.0])
    a["cl_max"] = Arg("cl_max", "1", "cl_max", ("lin", 0.5, 10.0),
                      lambda p: [2.4, 1.4, 3.0])
    a["load_factor"] = Arg("load_factor", "1", "load_factor", ("lin", 0.5, 10.0),
                           lambda p: [1.0, 1.5, 2.5])
    a["cas_limit"] = Arg("cas_limit", "m/s", "cas_limit", ("lin", 40.0, 700.0),
                         lambda p: [175.0, 130.0, 250.0], cases.cas_seams)
    a["mach_limit"] = Arg("mach_limit", "1", "mach_limit", ("lin", 0.2, 4.0),
                          lambda p: [0.82, 0.6, 2.0], cases.mach_seams)
    a["subsonic_mach_limit"] = Arg("mach_limit", "1", "subsonic_mach_limit",
                                   ("lin", 0.3, 0.99), lambda p: [0.82, 0.6, 0.9],
                                   lambda p: [(1.0, "sonic")])
    a["ceiling"] = Arg("ceiling", "m", "altitude", ("lin", None, None),
                       lambda p: [12500.0, 4000.0, 20000.0], cases.alt_seams)
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
                     seeds.extra_altimeter_setting),
        FunctionSpec("density_altitude", ("ALT-4",),
                     "Density altitude of static pressure ps and static air temperature sat",
                     (A["ps"], A["sat"]), (("h", "m"),),
                     s(airdata.density_altitude, "h", ["ps", "sat"]), (24, 16),
                     seeds.extra_density_altitude),
        FunctionSpec("impact_pressure_from_mach", ("PIT-1",),
                     "Impact pressure qc = pt - ps at Mach mach", (A["mach"], A["ps"]),
                     (("qc", "Pa"),),
                     s(airdata.impact_pressure_from_mach, "qc", ["mach", "ps"]), (32, 30),
                     seeds.extra_tiny_mach),
        FunctionSpec("mach_from_impact_pressure", ("PIT-2",),
                     "Mach number from impact pressure and static pressure",
                     (A["qc"], A["ps"]), (("mach", "1"),),
                     s(airdata.mach_from_impact_pressure, "mach", ["qc", "ps"]), (16, 16),
                     seeds.extra_mach_from_qc),
        FunctionSpec("impact_pressure_from_cas", ("PIT-3",),
                     "Impact pressure of calibrated airspeed cas", (A["cas"],), (("qc", "Pa"),),
                     s(airdata.impact_pressure_from_cas, "qc", ["cas"]), (900,),
                     seeds.extra_qc_from_cas),
        FunctionSpec("cas_from_impact_pressure", ("PIT-4",),
                     "Calibrated airspeed from impact pressure", (A["qc_cas"],),
                     (("cas", "m/s"),), s(airdata.cas_from_impact_pressure, "cas", ["qc"]),
                     (700,), seeds.extra_cas_from_qc),
        FunctionSpec("cas_from_mach", ("SPD-1",),
                     "Calibrated airspeed at Mach mach and static pressure ps",
                     (A["mach"], A["ps"]), (("cas", "m/s"),),
                     s(airdata.cas_from_mach, "cas", ["mach", "ps"]), (32, 30),
                     seeds.extra_cas_from_mach),
        FunctionSpec("mach_from_cas", ("SPD-1",),
                     "Mach number at calibrated airspeed cas and static pressure ps",
                     (A["cas"], A["ps"]), (("mach", "1"),),
                     s(airdata.mach_from_cas, "mach", ["cas", "ps"]), (16, 16),
                     seeds.extra_mach_from_cas),
        FunctionSpec("eas_from_mach", ("SPD-2",),
                     "Equivalent airspeed at Mach mach and static pressure ps",
                     (A["mach"], A["ps"]), (("eas", "m/s"),),
                     s(airdata.eas_from_mach, "eas", ["mach", "ps"]), (32, 30),
                     seeds.extra_tiny_mach),
        FunctionSpec("mach_from_eas", ("SPD-2",),
                     "Mach number at equivalent airspeed eas and static pressure ps",
                     (A["eas"], A["ps"]), (("mach", "1"),),
                     s(airdata.mach_from_eas, "mach", ["eas", "ps"]), (16, 16),
                     seeds.extra_mach_from_eas),
        FunctionSpec("tas_from_mach", ("SPD-3",),
                     "True airspeed at Mach mach and static air temperature sat",
                     (A["mach"], A["sat"]), (("tas", "m/s"),),
                     s(airdata.tas_from_mach, "tas", ["mach", "sat"]), (32, 28),
                     seeds.extra_tiny_mach_sat),
        FunctionSpec("mach_from_tas", ("SPD-3",),
                     "Mach number at true airspeed tas and static air temperature sat",
                     (A["tas"], A["sat"]), (("mach", "1"),),
                     s(airdata.mach_from_tas, "mach", ["tas", "sat"]), (16, 16),
                     seeds.extra_mach_from_tas),
        FunctionSpec("dynamic_pressure", ("SPD-4",),
                     "Dynamic pressure (gamma/2) ps M^2", (A["mach"], A["ps"]), (("q", "Pa"),),
                     s(airdata.dynamic_pressure, "q", ["mach", "ps"]), (32, 30),
                     seeds.extra_tiny_mach),
        FunctionSpec("sat_from_tat", ("TMP-1",),
                     "Static air temperature from total air temperature",
                     (A["tat"], A["mach"], A["recovery"]), (("sat", "K"),),
                     s(airdata.sat_from_tat, "sat", ["tat", "mach", "recovery"]), (14, 14, 5),
                     seeds.extra_temperature("tat")),
        FunctionSpec("tat_from_sat", ("TMP-1",),
                     "Total air temperature from static air temperature",
                     (A["sat"], A["mach"], A["recovery"]), (("tat", "K"),),
                     s(airdata.tat_from_sat, "tat", ["sat", "mach", "recovery"]), (14, 14, 5),
                     seeds.extra_temperature("sat")),
        FunctionSpec("air_data", ("CHN-1",),
                     "The air-data chain: static pressure, total pressure and TAT in, "
                     "every air-data output out",
                     (A["ps"], A["pt"], A["tat"], A["recovery"], A["setting"], A["use_setting"],
                      A["noise_band"]),
                     tuple((k, u) for k, u in zip(_CHAIN_OUT, (
                         "m", "m", "Pa", "1", "m/s", "m/s", "m/s", "K", "kg/m3", "m", "Pa"),
                         strict=True)),
                     lambda x, p, s_: {}, (), seeds.extra_chain, seeds.chain_nominals,
                     _chain_status,
                     batch_per_call=("use_setting", "noise_band"),
                     batch_optional=(("setting", "use_setting"),)),
        FunctionSpec("stall_eas", ("LIM-1",),
                     "Stall equivalent airspeed from lift = load_factor x weight",
                     (A["weight"], A["wing_area"], A["cl_max"], A["load_factor"]),
                     (("eas", "m/s"),),
                     s(airdata.stall_eas, "eas", ["weight", "wing_area", "cl_max",
                                                  "load_factor"]),
                     (7, 5, 4, 4), seeds.stall_extra("stall_eas")),
        FunctionSpec("stall_mach", ("LIM-1", "LIM-2"), "Stall Mach number at static pressure ps",
                     (A["weight"], A["wing_area"], A["cl_max"], A["ps"], A["load_factor"]),
                     (("mach", "1"),),
                     s(airdata.stall_mach, "mach", ["weight", "wing_area", "cl_max", "ps",
                                                    "load_factor"]),
                     (5, 3, 3, 8, 2), seeds.stall_extra("stall_mach")),
        FunctionSpec("stall_cas", ("LIM-1", "LIM-2"),
                     "Stall calibrated airspeed at static pressure ps",
                     (A["weight"], A["wing_area"], A["cl_max"], A["ps"], A["load_factor"]),
                     (("cas", "m/s"),),
                     s(airdata.stall_cas, "cas", ["weight", "wing_area", "cl_max", "ps",
                                                  "load_factor"]),
                     (5, 3, 3, 8, 2), seeds.stall_extra("stall_cas")),
        FunctionSpec("stall_tas", ("LIM-1", "LIM-2"),
                     "Stall true airspeed at static pressure ps and static air temperature sat",
                     (A["weight"], A["wing_area"], A["cl_max"], A["ps"], A["sat"],
                      A["load_factor"]),
                     (("tas", "m/s"),),
                     s(airdata.stall_tas, "tas", ["weight", "wing_area", "cl_max", "ps", "sat",
                                                  "load_factor"]),
                     (4, 2, 3, 6, 2, 2), seeds.stall_extra("stall_tas")),
        FunctionSpec("crossover_altitude", ("LIM-3",),
                     "Pressure altitude where a CAS limit and a subsonic Mach limit coincide",
                     (A["cas_limit"], A["subsonic_mach_limit"]), (("h", "m"),),
                     s(airdata.crossover_altitude, "h", ["cas_limit", "mach_limit"]),
                     (24, 16), seeds.extra_crossover),
        FunctionSpec("max_operating_cas", ("LIM-4",),
                     "Maximum operating CAS at ps: the lower of a CAS and a Mach limit",
                     (A["ps"], A["cas_limit"], A["mach_limit"]), (("cas", "m/s"),),
                     s(airdata.max_operating_cas, "cas", ["ps", "cas_limit", "mach_limit"]),
                     (16, 6, 6), seeds.extra_max_operating),
        FunctionSpec("max_operating_mach", ("LIM-4",),
                     "Maximum operating Mach number at ps: the lower of a CAS and a Mach limit",
                     (A["ps"], A["cas_limit"], A["mach_limit"]), (("mach", "1"),),
                     s(airdata.max_operating_mach, "mach", ["ps", "cas_limit", "mach_limit"]),
                     (16, 6, 6), seeds.extra_max_operating),
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
