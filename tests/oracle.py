"""Independent 50-digit reference ("oracle") for every public function of ``airdata``.

Written from the published equations, not from the package's code, and evaluated in
mpmath at 50 significant digits:

* layer model and hydrostatic equation: U.S. Standard Atmosphere 1976 (NOAA-S/T 76-1562)
  eq. 23 (T = Tb + Lb (H - Hb)), eq. 33a (gradient layer) and eq. 33b (isothermal
  layer), eq. 18 (geopotential altitude), eq. 42 (gas law), eq. 50 (speed of sound),
  eq. 51 (Sutherland's law) and eq. 52 (kinematic viscosity); ICAO Doc 7488/3 for the
  ``icao`` constants (equation numbers from memory);
* isentropic pitot relation pt/ps = (1 + (gamma-1)/2 M^2)^(gamma/(gamma-1)) (NACA
  Report 1135, eq. 44) and the Rayleigh pitot formula
  pt/ps = ((gamma+1)/2 M^2)^(gamma/(gamma-1)) ((gamma+1)/(2 gamma M^2 - (gamma-1)))^(1/(gamma-1))
  (NACA Report 1135, eq. 100), gamma = 1.4;
* lift equation n W = q S CLmax with q = rho0 EAS^2 / 2 (the definition of EAS) for
  the stall speeds; the maximum operating speed as the lower of a CAS and a Mach limit;
* EAS = M a0 sqrt(ps/p0), TAS = M sqrt(gamma R SAT), q = gamma/2 ps M^2,
  TAT = SAT (1 + r (gamma-1)/2 M^2) (NACA Report 1135, eq. 43 and 46, from memory);
* altimeter setting in the U.S. National Weather Service form
  setting = (ps^n + p0^n L e / T0)^(1/n), n = R L/g0, L = 0.0065 K/m, with the
  profile's constants.

The defining constants are the exact decimal strings of the standards, typed here with
their source (:data:`DEFINING`, :data:`LAYER_SOURCE`) and never read from ``airdata``;
layer base temperatures, pressures and densities are derived here at 50 digits
(:func:`make_profile`).  tests/test_constants_independent.py checks that the library's
constants (Python profiles and the C header) agree with these.  Inverses with a
closed form use it; the supersonic pitot inversion (no closed form) uses
``findroot`` with a bracketing solver at 60 digits.

The module also holds the condition-scaled error of docs/conventions.md section 3
(:func:`reference_and_scale`, :func:`condition_scaled_error`).

The oracle uses its own mpmath context ``mp`` so it never changes, or depends on, the
global ``mpmath.mp`` precision.  Every function takes numbers of that context (or
binary64 floats, converted exactly) and works on the pure mathematics: it does not
check domains, so finite differences may step just outside a valid range.
"""

from __future__ import annotations

from collections.abc import Callable, Mapping, Sequence
from dataclasses import dataclass
from typing import Any

import mpmath

__all__ = [
    "mp", "Real", "GAMMA", "Constant", "DEFINING", "LAYER_SOURCE", "RefProfile",
    "PROFILES", "make_profile", "EPS64", "EPS32", "REL_STEP",
    "standard_temperature", "standard_pressure", "standard_density", "atmosphere",
    "geopotential_altitude", "geometric_altitude", "pressure_altitude",
    "pressure_at_altitude", "baro_corrected_altitude", "altimeter_setting",
    "density_altitude", "pitot_ratio", "mach_of_pitot_ratio", "impact_pressure_from_mach",
    "mach_from_impact_pressure", "impact_pressure_from_cas", "cas_from_impact_pressure",
    "cas_from_mach", "mach_from_cas", "eas_from_mach", "mach_from_eas", "tas_from_mach",
    "mach_from_tas", "dynamic_pressure", "tat_from_sat", "sat_from_tat", "air_data",
    "stall_eas", "stall_mach", "stall_cas", "stall_tas", "crossover_altitude",
    "max_operating_cas", "max_operating_mach", "ceiling_margin",
    "reference_and_scale", "condition_scaled_error",
]

#: The oracle's own context, 50 significant digits.
mp = mpmath.MPContext()
mp.dps = 50

#: A number of ``mp`` (mpmath ships no type information).
Real = Any

#: Ratio of specific heats of air, 1.4 exactly (NACA Report 1135; ICAO Doc 7488/3, from
#: memory).  Also in :data:`DEFINING` (``gamma``).
GAMMA = mp.mpf(14) / 10

#: Unit roundoff scale of the conventions: 2**-52 (binary64) and 2**-23 (binary32).
EPS64 = mp.mpf(2) ** -52
EPS32 = mp.mpf(2) ** -23

#: Relative step of the finite differences (conventions section 3).
REL_STEP = mp.mpf("1e-22")

@dataclass(frozen=True)
class Constant:
    """One defining constant as typed from its standard.

    Attributes
    ----------
    value : str
        The exact decimal string of the standard.
    unit : str
        SI unit.
    source : str
        Where the value is defined; ``from memory`` where typed from memory.
    """

    value: str
    unit: str
    source: str


_ICAO = "ICAO Doc 7488/3 (1993) Table 1 / ISO 2533:1975 (from memory)"
_USSA = "U.S. Standard Atmosphere 1976, NOAA-S/T 76-1562, Table 2 (from memory)"
_BOTH = f"{_ICAO}; {_USSA}"

#: Constants both standards define with the same value.  Typed here from the standards,
#: never read from ``airdata``: tests/test_constants_independent.py compares the two.
_COMMON: Mapping[str, Constant] = {
    "g0": Constant("9.80665", "m/s2", f"standard gravity, {_BOTH}"),
    "T0": Constant("288.15", "K", f"sea-level temperature, {_BOTH}"),
    "p0": Constant("101325", "Pa", f"sea-level pressure, {_BOTH}"),
    "r0": Constant("6356766", "m", "Earth radius of the geopotential altitude, "
                   "U.S. Standard Atmosphere 1976 eq. 18; ICAO Doc 7488/3 (from memory)"),
    "beta": Constant("1.458e-6", "kg/(m s K^0.5)",
                     "Sutherland's beta, U.S. Standard Atmosphere 1976 eq. 51; ICAO Doc 7488/3 "
                     "(from memory)"),
    "S": Constant("110.4", "K", "Sutherland's constant, U.S. Standard Atmosphere 1976 eq. 51; "
                  "ICAO Doc 7488/3 (from memory)"),
    "gamma": Constant("1.4", "1", f"ratio of specific heats of air, {_ICAO}; NACA Report 1135"),
}

#: The defining constants of each profile.  ``icao`` states R itself; ``us1976``
#: defines R = R*/M0.
DEFINING: Mapping[str, Mapping[str, Constant]] = {
    "icao": {**_COMMON,
             "R": Constant("287.05287", "J/(kg K)", f"specific gas constant of air, {_ICAO}")},
    "us1976": {**_COMMON,
               "R_star": Constant("8314.32", "J/(kmol K)", f"universal gas constant, {_USSA}"),
               "M0": Constant("28.9644", "kg/kmol", f"sea-level molecular weight, {_USSA}")},
}

#: Layer model shared by both standards: base geopotential altitude (m) and
#: molecular-scale temperature gradient (K/m) of each of the seven layers.
LAYER_SOURCE = ("U.S. Standard Atmosphere 1976 Table 4; ICAO Doc 7488/3 Table D "
                "(from memory)")
_LAYER_BASES = ("0", "11000", "20000", "32000", "47000", "51000", "71000")
_LAPSE_RATES = ("-0.0065", "0", "0.001", "0.0028", "0", "-0.0028", "-0.002")
#: Top of the 1976 layer model, geopotential m (U.S. Standard Atmosphere 1976, from memory).
_TOP = "84852"
#: Lowest tabulated altitude of both standards, m (from memory).
_BOTTOM = "-5000"


@dataclass(frozen=True)
class RefProfile:
    """Constants of one profile at 50 digits, derived quantities included.

    Attributes
    ----------
    name : str
        ``"icao"`` or ``"us1976"``.
    g0, R, T0, p0, r0, beta, S : Real
        Defining constants (m/s2, J/(kg K), K, Pa, m, kg/(m s K^0.5), K).
    hb, lapse, tb, pb, rho_b : tuple of Real
        Base altitude, gradient, base temperature, base pressure and base density of
        each of the seven layers.
    h_min, h_max : Real
        Bottom and top of the layer model, m.
    a0, rho0 : Real
        Sea-level speed of sound and density.
    """

    name: str
    g0: Real
    R: Real
    T0: Real
    p0: Real
    r0: Real
    beta: Real
    S: Real
    hb: tuple[Real, ...]
    lapse: tuple[Real, ...]
    tb: tuple[Real, ...]
    pb: tuple[Real, ...]
    rho_b: tuple[Real, ...]
    h_min: Real
    h_max: Real
    a0: Real
    rho0: Real


def _layer_pressure(pb: Real, tb: Real, lapse: Real, dh: Real, g0: Real, r: Real) -> Real:
    """Eq. 33a (lapse != 0) or 33b (lapse == 0) of U.S. Standard Atmosphere 1976."""
    if lapse != 0:
        return pb * (tb / (tb + lapse * dh)) ** (g0 / (r * lapse))
    return pb * mp.exp(-g0 * dh / (r * tb))


def make_profile(
    name: str,
    overrides: Mapping[str, str] | None = None,
    hb: Sequence[str] = _LAYER_BASES,
    lapse: Sequence[str] = _LAPSE_RATES,
) -> RefProfile:
    """The 50-digit profile of the standard ``name`` (a key of :data:`DEFINING`).

    Parameters
    ----------
    name : str
        ``"icao"`` or ``"us1976"``.
    overrides : mapping of str to str, optional
        Defining constants to replace, as decimal strings (a test's deliberate slip).
    hb, lapse : sequence of str
        Layer base altitudes (m) and gradients (K/m); default the standards'.

    Returns
    -------
    RefProfile
        Defining constants and the layer base temperatures, pressures and densities
        derived from them here (eqs. 23, 33a/33b, 42 of U.S. Standard Atmosphere 1976).
    """
    d = {k: mp.mpf(c.value) for k, c in DEFINING[name].items()}
    d.update({k: mp.mpf(v) for k, v in (overrides or {}).items()})
    r = d["R"] if "R" in d else d["R_star"] / d["M0"]
    g0, t0, p0 = d["g0"], d["T0"], d["p0"]
    hbs = tuple(mp.mpf(h) for h in hb)
    lapses = tuple(mp.mpf(x) for x in lapse)
    tb = [t0]
    pb = [p0]
    for i in range(len(hbs) - 1):
        dh = hbs[i + 1] - hbs[i]
        tb.append(tb[i] + lapses[i] * dh)
        pb.append(_layer_pressure(pb[i], tb[i], lapses[i], dh, g0, r))
    rho_b = tuple(p / (r * t) for p, t in zip(pb, tb, strict=True))
    gamma = d["gamma"]
    return RefProfile(
        name=name, g0=g0, R=r, T0=t0, p0=p0, r0=d["r0"], beta=d["beta"], S=d["S"],
        hb=hbs, lapse=lapses, tb=tuple(tb), pb=tuple(pb), rho_b=rho_b,
        h_min=mp.mpf(_BOTTOM), h_max=mp.mpf(_TOP),
        a0=mp.sqrt(gamma * r * t0), rho0=p0 / (r * t0),
    )


#: ``icao``: R = 287.05287 J/(kg K) as stated by ICAO Doc 7488/3 (from memory);
#: ``us1976``: R = R*/M0 = 8314.32/28.9644 (U.S. Standard Atmosphere 1976, from memory).
PROFILES: Mapping[str, RefProfile] = {name: make_profile(name) for name in DEFINING}


def _prof(profile: RefProfile | str) -> RefProfile:
    return PROFILES[profile] if isinstance(profile, str) else profile


def _layer_of_altitude(h: Real, p: RefProfile) -> int:
    """Layer holding geopotential altitude h (layer 0 extends down, layer 6 up)."""
    i = 0
    for j in range(1, len(p.hb)):
        if h >= p.hb[j]:
            i = j
    return i


def _layer_of_decreasing(x: Real, base: Sequence[Real]) -> int:
    """Layer i with base[i+1] < x <= base[i] for a quantity decreasing with altitude."""
    i = 0
    for j in range(1, len(base)):
        if x <= base[j]:
            i = j
    return i


# --------------------------------------------------------------------------- atmosphere


def standard_temperature(h: Real, profile: RefProfile | str = "icao") -> Real:
    """Eq. 23: T = Tb + Lb (H - Hb), K."""
    p = _prof(profile)
    h = mp.mpf(h)
    i = _layer_of_altitude(h, p)
    return p.tb[i] + p.lapse[i] * (h - p.hb[i])


def standard_pressure(h: Real, profile: RefProfile | str = "icao") -> Real:
    """Eq. 33a / 33b from the layer base below h, Pa."""
    p = _prof(profile)
    h = mp.mpf(h)
    i = _layer_of_altitude(h, p)
    return _layer_pressure(p.pb[i], p.tb[i], p.lapse[i], h - p.hb[i], p.g0, p.R)


def standard_density(h: Real, profile: RefProfile | str = "icao") -> Real:
    """Eq. 42 on the standard day: rho = p/(R T), kg/m3."""
    p = _prof(profile)
    return standard_pressure(h, p) / (p.R * standard_temperature(h, p))


def atmosphere(h: Real, dT: Real, profile: RefProfile | str = "icao") -> dict[str, Real]:
    """Every output of ``airdata.atmosphere``: standard pressure, temperature shifted by dT.

    Eqs. 23, 33a/33b, 42, 50, 51, 52 of U.S. Standard Atmosphere 1976.
    """
    p = _prof(profile)
    t = standard_temperature(h, p) + mp.mpf(dT)
    pres = standard_pressure(h, p)
    rho = pres / (p.R * t)
    mu = p.beta * t * mp.sqrt(t) / (t + p.S)
    return {
        "temperature": t,
        "pressure": pres,
        "density": rho,
        "speed_of_sound": mp.sqrt(GAMMA * p.R * t),
        "dynamic_viscosity": mu,
        "kinematic_viscosity": mu / rho,
    }


def geopotential_altitude(z: Real, profile: RefProfile | str = "icao") -> Real:
    """Eq. 18: H = r0 Z/(r0 + Z), m."""
    r0 = _prof(profile).r0
    z = mp.mpf(z)
    return r0 * z / (r0 + z)


def geometric_altitude(h: Real, profile: RefProfile | str = "icao") -> Real:
    """Eq. 18 solved for Z: Z = r0 H/(r0 - H), m."""
    r0 = _prof(profile).r0
    h = mp.mpf(h)
    return r0 * h / (r0 - h)


# ---------------------------------------------------------------------------- altimetry


def pressure_at_altitude(h: Real, profile: RefProfile | str = "icao") -> Real:
    """Standard pressure at pressure altitude h (eq. 33a / 33b), Pa."""
    return standard_pressure(h, profile)


def pressure_altitude(ps: Real, profile: RefProfile | str = "icao") -> Real:
    """Eq. 33a / 33b solved for H in the layer holding ps, m."""
    p = _prof(profile)
    ps = mp.mpf(ps)
    i = _layer_of_decreasing(ps, p.pb)
    lr = mp.log(ps / p.pb[i])
    if p.lapse[i] != 0:
        # (ps/pb) = (Tb/T)^(g0/(R L))  =>  T/Tb = exp(-(R L/g0) ln(ps/pb))
        return p.hb[i] + p.tb[i] / p.lapse[i] * mp.expm1(-(p.R * p.lapse[i] / p.g0) * lr)
    return p.hb[i] - p.R * p.tb[i] / p.g0 * lr


def baro_corrected_altitude(
    ps: Real, setting: Real, profile: RefProfile | str = "icao"
) -> Real:
    """H(ps) - H(setting), m."""
    return pressure_altitude(ps, profile) - pressure_altitude(setting, profile)


def altimeter_setting(ps: Real, elevation: Real, profile: RefProfile | str = "icao") -> Real:
    """NWS form (ps^n + p0^n L e/T0)^(1/n), n = R L/g0, L = 0.0065 K/m, Pa."""
    p = _prof(profile)
    lapse = -p.lapse[0]
    n = p.R * lapse / p.g0
    total = mp.mpf(ps) ** n + p.p0**n * lapse * mp.mpf(elevation) / p.T0
    return total ** (1 / n)


def density_altitude(ps: Real, sat: Real, profile: RefProfile | str = "icao") -> Real:
    """Standard altitude whose density is ps/(R sat), m.

    Gradient layer: rho/rho_b = (T/Tb)^-(1 + g0/(R L)) (eqs. 23, 33a, 42), so
    H = Hb + (Tb/L) ((rho/rho_b)^(-R L/(g0 + R L)) - 1); isothermal layer (eq. 33b):
    H = Hb - (R Tb/g0) ln(rho/rho_b).
    """
    p = _prof(profile)
    rho = mp.mpf(ps) / (p.R * mp.mpf(sat))
    i = _layer_of_decreasing(rho, p.rho_b)
    lr = mp.log(rho / p.rho_b[i])
    lapse = p.lapse[i]
    if lapse != 0:
        expo = -p.R * lapse / (p.g0 + p.R * lapse)
        return p.hb[i] + p.tb[i] / lapse * mp.expm1(expo * lr)
    return p.hb[i] - p.R * p.tb[i] / p.g0 * lr


# -------------------------------------------------------------------------------- pitot

_KAPPA = GAMMA / (GAMMA - 1)  # gamma/(gamma-1) = 3.5
_HALF_GM1 = (GAMMA - 1) / 2  # (gamma-1)/2 = 0.2


def _ln_rayleigh(m: Real) -> Real:
    """ln(pt/ps) of the Rayleigh pitot formula, NACA Report 1135 eq. 100 (M >= 1)."""
    u = m * m
    return (_KAPPA * mp.log((GAMMA + 1) / 2 * u)
            + mp.log((GAMMA + 1) / (2 * GAMMA * u - (GAMMA - 1))) / (GAMMA - 1))


#: qc/ps at M = 1, where the two relations meet: ((gamma+1)/2)^(gamma/(gamma-1)) - 1.
SONIC_RATIO = ((GAMMA + 1) / 2) ** _KAPPA - 1


def pitot_ratio(mach: Real) -> Real:
    """qc/ps at Mach M: NACA Report 1135 eq. 44 for M <= 1, eq. 100 above.

    The subsonic branch is (1 + 0.2 M^2)^3.5 - 1 evaluated as expm1(3.5 log1p(0.2 M^2))
    so that tiny Mach numbers keep all 50 digits.
    """
    m = mp.mpf(mach)
    if m <= 1:
        return mp.expm1(_KAPPA * mp.log1p(_HALF_GM1 * m * m))
    return mp.expm1(_ln_rayleigh(m))


def mach_of_pitot_ratio(x: Real) -> Real:
    """Mach number with qc/ps = x: eq. 44 inverted in closed form, or eq. 100 by findroot."""
    x = mp.mpf(x)
    if x <= SONIC_RATIO:
        return mp.sqrt(mp.expm1(mp.log1p(x) / _KAPPA) / _HALF_GM1)
    target = mp.log1p(x)
    # pt/ps > M^2 for M >= 1 (eq. 100 tends to 1.287 M^2), so the root lies in [1, sqrt(1+x)].
    lo, hi = mp.mpf(1), mp.sqrt(1 + x) + 1
    with mp.workdps(60):
        root = mp.findroot(lambda m: _ln_rayleigh(m) - target, (lo, hi), solver="anderson")
    return +root


def impact_pressure_from_mach(mach: Real, ps: Real) -> Real:
    """qc = ps f(M), Pa."""
    return mp.mpf(ps) * pitot_ratio(mach)


def mach_from_impact_pressure(qc: Real, ps: Real) -> Real:
    """M = f^-1(qc/ps)."""
    return mach_of_pitot_ratio(mp.mpf(qc) / mp.mpf(ps))


def impact_pressure_from_cas(cas: Real, profile: RefProfile | str = "icao") -> Real:
    """qc = p0 f(cas/a0): the pitot relations at sea level, Pa."""
    p = _prof(profile)
    return p.p0 * pitot_ratio(mp.mpf(cas) / p.a0)


def cas_from_impact_pressure(qc: Real, profile: RefProfile | str = "icao") -> Real:
    """cas = a0 f^-1(qc/p0), m/s."""
    p = _prof(profile)
    return p.a0 * mach_of_pitot_ratio(mp.mpf(qc) / p.p0)


# ------------------------------------------------------------------------------- speeds


def cas_from_mach(mach: Real, ps: Real, profile: RefProfile | str = "icao") -> Real:
    """cas = a0 f^-1(ps f(M)/p0), m/s."""
    p = _prof(profile)
    return p.a0 * mach_of_pitot_ratio(mp.mpf(ps) * pitot_ratio(mach) / p.p0)


def mach_from_cas(cas: Real, ps: Real, profile: RefProfile | str = "icao") -> Real:
    """M = f^-1(p0 f(cas/a0)/ps)."""
    p = _prof(profile)
    return mach_of_pitot_ratio(p.p0 * pitot_ratio(mp.mpf(cas) / p.a0) / mp.mpf(ps))


def eas_from_mach(mach: Real, ps: Real, profile: RefProfile | str = "icao") -> Real:
    """eas = M a0 sqrt(ps/p0), m/s."""
    p = _prof(profile)
    return mp.mpf(mach) * p.a0 * mp.sqrt(mp.mpf(ps) / p.p0)


def mach_from_eas(eas: Real, ps: Real, profile: RefProfile | str = "icao") -> Real:
    """M = eas/(a0 sqrt(ps/p0))."""
    p = _prof(profile)
    return mp.mpf(eas) / (p.a0 * mp.sqrt(mp.mpf(ps) / p.p0))


def tas_from_mach(mach: Real, sat: Real, profile: RefProfile | str = "icao") -> Real:
    """tas = M sqrt(gamma R sat), m/s."""
    p = _prof(profile)
    return mp.mpf(mach) * mp.sqrt(GAMMA * p.R * mp.mpf(sat))


def mach_from_tas(tas: Real, sat: Real, profile: RefProfile | str = "icao") -> Real:
    """M = tas/sqrt(gamma R sat)."""
    p = _prof(profile)
    return mp.mpf(tas) / mp.sqrt(GAMMA * p.R * mp.mpf(sat))


def dynamic_pressure(mach: Real, ps: Real) -> Real:
    """q = gamma/2 ps M^2, Pa."""
    m = mp.mpf(mach)
    return GAMMA / 2 * mp.mpf(ps) * m * m


# -------------------------------------------------------------------------- temperature


def tat_from_sat(sat: Real, mach: Real, recovery: Real = 1) -> Real:
    """TAT = SAT (1 + r (gamma-1)/2 M^2), K."""
    m = mp.mpf(mach)
    return mp.mpf(sat) * (1 + mp.mpf(recovery) * _HALF_GM1 * m * m)


def sat_from_tat(tat: Real, mach: Real, recovery: Real = 1) -> Real:
    """SAT = TAT / (1 + r (gamma-1)/2 M^2), K."""
    m = mp.mpf(mach)
    return mp.mpf(tat) / (1 + mp.mpf(recovery) * _HALF_GM1 * m * m)


# ------------------------------------------------------------------------------- limits
# Lift equation L = n W = q S CLmax with the dynamic pressure of equivalent airspeed
# q = rho0 eas^2 / 2 (definition of EAS); the speeds of that EAS by the relations
# above (NACA Report 1135 eqs. 44 and 100); altitudes by the standard atmosphere
# (U.S. Standard Atmosphere 1976 eqs. 33a/33b; ICAO Doc 7488/3).


def stall_eas(weight: Real, wing_area: Real, cl_max: Real, load_factor: Real = 1,
              profile: RefProfile | str = "icao") -> Real:
    """eas = sqrt(2 n W / (rho0 S CLmax)), m/s."""
    p = _prof(profile)
    return mp.sqrt(2 * mp.mpf(load_factor) * mp.mpf(weight)
                   / (p.rho0 * mp.mpf(wing_area) * mp.mpf(cl_max)))


def stall_mach(weight: Real, wing_area: Real, cl_max: Real, ps: Real, load_factor: Real = 1,
               profile: RefProfile | str = "icao") -> Real:
    """Mach number of the stall EAS at ps."""
    return mach_from_eas(stall_eas(weight, wing_area, cl_max, load_factor, profile), ps,
                         profile)


def stall_cas(weight: Real, wing_area: Real, cl_max: Real, ps: Real, load_factor: Real = 1,
              profile: RefProfile | str = "icao") -> Real:
    """CAS of the stall Mach number at ps, m/s."""
    m = stall_mach(weight, wing_area, cl_max, ps, load_factor, profile)
    return cas_from_mach(m, ps, profile)


def stall_tas(weight: Real, wing_area: Real, cl_max: Real, ps: Real, sat: Real,
              load_factor: Real = 1, profile: RefProfile | str = "icao") -> Real:
    """TAS of the stall Mach number at the temperature sat, m/s."""
    m = stall_mach(weight, wing_area, cl_max, ps, load_factor, profile)
    return tas_from_mach(m, sat, profile)


def crossover_altitude(cas_limit: Real, mach_limit: Real,
                       profile: RefProfile | str = "icao") -> Real:
    """Pressure altitude where the impact pressures of both limits agree:
    p0 f(cas/a0) = ps f(M), h = H(ps), m."""
    p = _prof(profile)
    ps = impact_pressure_from_cas(cas_limit, p) / pitot_ratio(mach_limit)
    return pressure_altitude(ps, p)


def max_operating_cas(ps: Real, cas_limit: Real, mach_limit: Real,
                      profile: RefProfile | str = "icao") -> Real:
    """The lower of the CAS limit and the CAS of the Mach limit at ps, m/s."""
    return min(mp.mpf(cas_limit), cas_from_mach(mach_limit, ps, profile))


def max_operating_mach(ps: Real, cas_limit: Real, mach_limit: Real,
                       profile: RefProfile | str = "icao") -> Real:
    """The lower of the Mach limit and the Mach number of the CAS limit at ps."""
    return min(mp.mpf(mach_limit), mach_from_cas(cas_limit, ps, profile))


def ceiling_margin(ps: Real, ceiling: Real, profile: RefProfile | str = "icao") -> Real:
    """ceiling - H(ps), m."""
    return mp.mpf(ceiling) - pressure_altitude(ps, profile)


# -------------------------------------------------------------------------------- chain


def air_data(
    ps: Real, pt: Real, tat: Real, recovery: Real = 1, setting: Real | None = None,
    profile: RefProfile | str = "icao",
) -> dict[str, Real]:
    """Every numeric output of ``airdata.air_data`` from the three sensor readings.

    A negative impact pressure is read as zero (the documented behaviour within the
    noise band: an aircraft at rest).
    """
    p = _prof(profile)
    ps, pt, tat = mp.mpf(ps), mp.mpf(pt), mp.mpf(tat)
    qc = max(pt - ps, mp.zero)
    mach = mach_of_pitot_ratio(qc / ps)
    sat = sat_from_tat(tat, mach, recovery)
    h = pressure_altitude(ps, p)
    out = {
        "pressure_altitude": h,
        "impact_pressure": qc,
        "mach": mach,
        "cas": p.a0 * mach_of_pitot_ratio(qc / p.p0),
        "eas": eas_from_mach(mach, ps, p),
        "tas": tas_from_mach(mach, sat, p),
        "sat": sat,
        "density": ps / (p.R * sat),
        "density_altitude": density_altitude(ps, sat, p),
        "dynamic_pressure": dynamic_pressure(mach, ps),
    }
    if setting is not None:
        out["baro_altitude"] = h - pressure_altitude(setting, p)
    return out


# ------------------------------------------------------------- condition-scaled error


def reference_and_scale(
    func: Callable[..., Mapping[str, Real]], x: Sequence[float]
) -> tuple[dict[str, Real], dict[str, Real]]:
    """Reference outputs y* and the scale |y*| + sum_i |dy*/dx_i x_i| of each output.

    Parameters
    ----------
    func : callable
        Oracle taking one number per input and returning every output by name.
    x : sequence of float
        The binary64 inputs, converted exactly.

    Returns
    -------
    tuple of dict
        ``y*`` and the scale, each by output name.

    Notes
    -----
    Derivatives by finite differences with a relative step of 1e-22 (far below one
    ulp, so a step never crosses a layer base or M = 1 unless the point lies exactly
    on it).  The central difference and both one-sided differences are taken and the
    largest magnitude kept: at a kink (a layer base, qc = 0) that is the steeper side,
    elsewhere the three agree to ~1e-22.  An input equal to 0 contributes 0.
    """
    xs = [mp.mpf(v) for v in x]
    y0 = dict(func(*xs))
    scale = {k: abs(v) for k, v in y0.items()}
    for i, xi in enumerate(xs):
        if xi == 0:
            continue
        up, down = list(xs), list(xs)
        up[i] = xi + abs(xi) * REL_STEP
        down[i] = xi - abs(xi) * REL_STEP
        yu, yd = func(*up), func(*down)
        hu, hd = up[i] - xi, xi - down[i]
        for k, v in y0.items():
            slope = max(abs(yu[k] - v) / hu, abs(v - yd[k]) / hd,
                        abs(yu[k] - yd[k]) / (hu + hd))
            scale[k] += slope * abs(xi)
    return y0, scale


def condition_scaled_error(y: float, ystar: Real, scale: Real, eps: Real = EPS64) -> float:
    """cse = |y - y*| / (eps (|y*| + sum_i |df/dx_i x_i|)), conventions section 3.

    A zero scale (y* = 0 with no sensitivity to any input) gives 0 for an exact zero
    and infinity for anything else.
    """
    err = abs(mp.mpf(y) - ystar)
    if scale == 0:
        return 0.0 if err == 0 else float("inf")
    return float(err / (eps * scale))
