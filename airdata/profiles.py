"""Constants profiles of the standard atmosphere.

A profile is the complete set of constants every equation uses.  Two are provided:

``icao``
    ICAO Doc 7488/3 (1993) and ISO 2533:1975: g0 = 9.80665 m/s2 and the specific gas
    constant of air R = 287.05287 J/(kg K) *as stated by the standard* (not recomputed
    from R*/M).  This is the default.
``us1976``
    U.S. Standard Atmosphere 1976 (NOAA-S/T 76-1562): R = R*/M0 with
    R* = 8314.32 J/(kmol K) and M0 = 28.9644 kg/kmol.

Both use the same seven-layer temperature profile (geopotential altitude, lapse rate
per layer) up to 84 852 m and the same sea-level values T0 = 288.15 K and
p0 = 101 325 Pa.  ICAO Doc 7488 tabulates only to 80 km; the layer from 71 km is
continued here to 84 852 m, its end in the 1976 model.

Layer base temperatures and pressures are *derived* from the defining constants when
this module is imported, evaluated in 40-digit decimal arithmetic and rounded once to
binary64, so each stored base value is correctly rounded with respect to the defining
constants.  Nothing derived is typed in.
"""

from __future__ import annotations

import decimal
from collections.abc import Mapping
from dataclasses import dataclass, field
from decimal import Decimal
from types import MappingProxyType

__all__ = ["Profile", "ICAO", "US1976", "PROFILES", "get_profile", "GAMMA"]

#: Ratio of specific heats of air, exactly 1.4 in every profile (ICAO Doc 7488, from memory).
GAMMA = 1.4

# Layer model shared by both profiles (ICAO Doc 7488 Table A; U.S. Standard Atmosphere
# 1976 Table 4, from memory): base geopotential altitude in m, lapse rate in K/m.
_LAYER_BASES = ("0", "11000", "20000", "32000", "47000", "51000", "71000")
_LAPSE_RATES = ("-0.0065", "0", "0.001", "0.0028", "0", "-0.0028", "-0.002")
_TOP = "84852"
_BOTTOM = "-5000"


def _derive_bases(
    g0: Decimal, r: Decimal, t0: Decimal, p0: Decimal
) -> tuple[tuple[Decimal, ...], tuple[Decimal, ...]]:
    """Base temperature and pressure of each layer, in 40-digit decimal arithmetic."""
    ctx = decimal.Context(prec=40)
    temps = [t0]
    press = [p0]
    for i in range(len(_LAYER_BASES) - 1):
        hb = Decimal(_LAYER_BASES[i])
        ht = Decimal(_LAYER_BASES[i + 1])
        lapse = Decimal(_LAPSE_RATES[i])
        tb, pb = temps[-1], press[-1]
        tt = ctx.add(tb, ctx.multiply(lapse, ctx.subtract(ht, hb)))
        if lapse == 0:
            expo = ctx.divide(ctx.multiply(-g0, ctx.subtract(ht, hb)), ctx.multiply(r, tb))
        else:
            expo = ctx.multiply(
                ctx.divide(-g0, ctx.multiply(r, lapse)), ctx.ln(ctx.divide(tt, tb))
            )
        temps.append(tt)
        press.append(ctx.multiply(pb, ctx.exp(expo)))
    return tuple(temps), tuple(press)


@dataclass(frozen=True, eq=False)
class Profile:
    """The constants every equation uses.  Immutable; one object per profile.

    Attributes
    ----------
    name : str
        ``"icao"`` or ``"us1976"``; recorded wherever values are emitted.
    source : str
        The published document defining the constants.
    definitions : Mapping[str, str]
        The defining constants as exact decimal strings, as published.
    g0 : float
        Standard acceleration of gravity, m/s2.
    R : float
        Specific gas constant of air, J/(kg K).
    T0, p0 : float
        Sea-level temperature (K) and pressure (Pa).
    rho0 : float
        Sea-level density p0/(R T0), kg/m3.
    a0 : float
        Sea-level speed of sound sqrt(gamma R T0), m/s.
    r0 : float
        Earth radius used for geopotential altitude, m.
    h_min, h_max : float
        Valid geopotential altitude range, m.
    layer_base : tuple of float
        Base geopotential altitude of each of the seven layers, m.
    lapse_rate : tuple of float
        Temperature gradient of each layer, K/m.
    base_temperature, base_pressure : tuple of float
        Derived temperature (K) and pressure (Pa) at each layer base.
    p_min, p_max : float
        Pressure at ``h_max`` and at ``h_min``, Pa: the valid pressure range.
    sutherland_beta, sutherland_s : float
        Sutherland's law constants, kg/(m s K^0.5) and K.
    """

    name: str
    source: str
    definitions: Mapping[str, str]
    g0: float = field(init=False)
    R: float = field(init=False)
    T0: float = field(init=False)
    p0: float = field(init=False)
    rho0: float = field(init=False)
    a0: float = field(init=False)
    r0: float = field(init=False)
    h_min: float = field(init=False)
    h_max: float = field(init=False)
    layer_base: tuple[float, ...] = field(init=False)
    lapse_rate: tuple[float, ...] = field(init=False)
    base_temperature: tuple[float, ...] = field(init=False)
    base_pressure: tuple[float, ...] = field(init=False)
    p_min: float = field(init=False)
    p_max: float = field(init=False)
    sutherland_beta: float = field(init=False)
    sutherland_s: float = field(init=False)

    def __post_init__(self) -> None:
        ctx = decimal.Context(prec=40)
        d = {k: Decimal(v) for k, v in self.definitions.items()}
        r = d["R"] if "R" in d else ctx.divide(d["R_star"], d["M0"])
        temps, press = _derive_bases(d["g0"], r, d["T0"], d["p0"])
        # Extremes of the valid range, derived the same way.
        lapse0 = Decimal(_LAPSE_RATES[0])
        t_bottom = ctx.add(d["T0"], ctx.multiply(lapse0, Decimal(_BOTTOM)))
        p_bottom = ctx.multiply(
            d["p0"],
            ctx.exp(
                ctx.multiply(ctx.divide(-d["g0"], ctx.multiply(r, lapse0)),
                             ctx.ln(ctx.divide(t_bottom, d["T0"])))
            ),
        )
        lapse6 = Decimal(_LAPSE_RATES[6])
        t_top = ctx.add(temps[6], ctx.multiply(lapse6, Decimal(_TOP) - Decimal(_LAYER_BASES[6])))
        p_top = ctx.multiply(
            press[6],
            ctx.exp(
                ctx.multiply(ctx.divide(-d["g0"], ctx.multiply(r, lapse6)),
                             ctx.ln(ctx.divide(t_top, temps[6])))
            ),
        )
        gamma = Decimal("1.4")
        rho0 = ctx.divide(d["p0"], ctx.multiply(r, d["T0"]))
        a0 = ctx.sqrt(ctx.multiply(ctx.multiply(gamma, r), d["T0"]))
        values = {
            "g0": float(d["g0"]),
            "R": float(r),
            "T0": float(d["T0"]),
            "p0": float(d["p0"]),
            "rho0": float(rho0),
            "a0": float(a0),
            "r0": float(d["r0"]),
            "h_min": float(Decimal(_BOTTOM)),
            "h_max": float(Decimal(_TOP)),
            "layer_base": tuple(float(Decimal(h)) for h in _LAYER_BASES),
            "lapse_rate": tuple(float(Decimal(lr)) for lr in _LAPSE_RATES),
            "base_temperature": tuple(float(t) for t in temps),
            "base_pressure": tuple(float(p) for p in press),
            "p_min": float(p_top),
            "p_max": float(p_bottom),
            "sutherland_beta": float(d["beta"]),
            "sutherland_s": float(d["S"]),
        }
        for key, value in values.items():
            object.__setattr__(self, key, value)
        # 40-digit values kept for the double-double kernels (airdata._dd).
        object.__setattr__(self, "_exact", MappingProxyType({
            "R": r, "beta": d["beta"], "base_pressure": press, "base_temperature": temps,
            "lapse_rate": tuple(Decimal(lr) for lr in _LAPSE_RATES),
        }))
        object.__setattr__(self, "definitions", MappingProxyType(dict(self.definitions)))

    def exact(self, key: str) -> Decimal | tuple[Decimal, ...]:
        """A constant in 40-digit decimal: ``"R"``, ``"beta"``, ``"base_pressure"``,
        ``"base_temperature"`` or ``"lapse_rate"`` (the last three per layer)."""
        return self._exact[key]  # type: ignore[attr-defined, no-any-return]

    def as_dict(self) -> dict[str, object]:
        """Every constant, defining and derived, as plain JSON-ready values."""
        out: dict[str, object] = {
            "name": self.name,
            "source": self.source,
            "definitions": dict(self.definitions),
        }
        for key in ("g0", "R", "T0", "p0", "rho0", "a0", "r0", "h_min", "h_max",
                    "p_min", "p_max", "sutherland_beta", "sutherland_s"):
            out[key] = getattr(self, key)
        for key in ("layer_base", "lapse_rate", "base_temperature", "base_pressure"):
            out[key] = list(getattr(self, key))
        out["gamma"] = GAMMA
        return out


_COMMON = {"T0": "288.15", "p0": "101325", "r0": "6356766", "beta": "1.458e-6", "S": "110.4"}

#: ICAO Doc 7488/3 / ISO 2533 constants (R as stated by the standard).  The default.
ICAO = Profile(
    name="icao",
    source="ICAO Doc 7488/3 (1993), ISO 2533:1975",
    definitions={"g0": "9.80665", "R": "287.05287", **_COMMON},
)

#: U.S. Standard Atmosphere 1976 constants (R = R*/M0).
US1976 = Profile(
    name="us1976",
    source="U.S. Standard Atmosphere 1976, NOAA-S/T 76-1562",
    definitions={"g0": "9.80665", "R_star": "8314.32", "M0": "28.9644", **_COMMON},
)

#: Every profile by name.
PROFILES: Mapping[str, Profile] = MappingProxyType({"icao": ICAO, "us1976": US1976})


def get_profile(profile: Profile | str | None) -> Profile:
    """Resolve a profile given by object or by name; ``None`` gives the default ``ICAO``.

    Raises
    ------
    ValueError
        For an unknown name.
    """
    if profile is None:
        return ICAO
    if isinstance(profile, Profile):
        return profile
    try:
        return PROFILES[profile]
    except KeyError:
        raise ValueError(
            f"unknown constants profile {profile!r}: choose one of {sorted(PROFILES)}"
        ) from None
