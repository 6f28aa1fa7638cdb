"""Generate bindings/c/src/ad_constants.h, the constants of the C port.

Usage::

    python bindings/c/tools/gen_constants.py            # rewrite the header
    python bindings/c/tools/gen_constants.py --check    # exit 1 if it is stale

Two value sets per profile (ICAO Doc 7488/3 and U.S. Standard Atmosphere 1976):

binary64
    The very binary64 values the Python reference computes with (``airdata.profiles``,
    ``airdata._layers.layer_table``, ``airdata._domains``, ``airdata.pitot``), so the
    double build mirrors the reference bit for bit up to libm rounding.
binary32
    Every constant correctly rounded to binary32 from its exact definition, evaluated
    in 40-digit decimal arithmetic from the defining constants (the approach of
    ``airdata.profiles``), never by rounding the binary64 value a second time.

Double-double (binary32: float-float) low parts
    ``AD_R_LO``, ``AD_SUTH_BETA_LO`` and the per-layer ``tb_lo``, ``lapse_lo``,
    ``pb_lo``: lo = nearest(x - hi) in the same precision, computed exactly (rational
    arithmetic) from the 40-digit decimal x of ``Profile.exact`` and the hi part
    written beside it, so hi + lo is x to about 2^-106 (binary64) or 2^-48
    (binary32) relative (``airdata._dd.const``).
Derived-quantity limits
    ``AD_RATIO_LIMIT`` and ``AD_MACH_LIMIT``: RATIO_MAX and MACH_MAX widened by
    ``airdata._domains.DERIVED_SLACK`` (8 units of binary64 roundoff).  binary64: the
    reference's ``pitot.RATIO_LIMIT``/``MACH_LIMIT``; binary32: the same exactly
    widened value rounded to binary32 (the slack is below half a binary32 ulp, so
    these equal the binary32 RATIO_MAX and MACH_MAX: the check is exact there).
    ``AD_SETTING_ALT_LO``/``AD_SETTING_ALT_HI``: the altimeter setting's pressure
    altitude range [-5000, 11000] m widened the same way
    (``airdata._domains.setting_altitude``).

All values are written as C99 hex-float literals.
"""

from __future__ import annotations

import argparse
import decimal
import importlib
import math
import sys
from decimal import Decimal
from fractions import Fraction
from pathlib import Path

HEADER = Path(__file__).resolve().parents[1] / "src" / "ad_constants.h"
CTX = decimal.Context(prec=40)

#: Literals used inside the kernels (exact decimal definitions).
KERNEL_LITERALS = {
    "AD_K_0P2": ("0.2", "(gamma - 1)/2"),
    "AD_K_0P7": ("0.7", "gamma/2"),
    "AD_K_1P2": ("1.2", "(gamma + 1)/2"),
    "AD_K_7P2": ("7.2", "Rayleigh pitot constant 2 gamma/(gamma - 1) + 0.2"),
    "AD_K_S1": ("-0.11", "start-value coefficient of the supersonic solver (x^1)"),
    "AD_K_S2": ("0.0752", "start-value coefficient of the supersonic solver (x^2)"),
    "AD_K_S3": ("-0.2316", "start-value coefficient of the supersonic solver (x^3)"),
    "AD_K_5_14": ("5/14", "2.5/7, start-value offset of the supersonic solver"),
    "AD_K_1": ("1", "one"),
    "AD_K_2": ("2", "factor 2 of the lift equation, q = rho0 eas^2 / 2"),
    "AD_K_2P5": ("2.5", "exponent 1/(gamma - 1)"),
    "AD_K_3P5": ("3.5", "exponent gamma/(gamma - 1)"),
    "AD_K_5": ("5", "2/(gamma - 1)"),
    "AD_K_7": ("7", "2 gamma/(gamma - 1)"),
}


def _mod(name: str):  # noqa: ANN202 - module objects
    return importlib.import_module(name)


def round_binary(x: Fraction, bits: int) -> float:
    """``x`` correctly rounded (to nearest, ties to even) to ``bits`` significand bits.

    Normal numbers only (every constant here is one); zero maps to 0.0.
    """
    if x == 0:
        return 0.0
    sign = -1 if x < 0 else 1
    a = abs(x)
    e = math.floor(math.log2(a.numerator) - math.log2(a.denominator))
    while Fraction(2) ** e > a:
        e -= 1
    while Fraction(2) ** (e + 1) <= a:
        e += 1
    scaled = a / Fraction(2) ** (e - bits + 1)  # in [2^(bits-1), 2^bits)
    q, r = divmod(scaled.numerator, scaled.denominator)
    twice = 2 * r
    if twice > scaled.denominator or (twice == scaled.denominator and q % 2 == 1):
        q += 1
    return sign * math.ldexp(float(q), e - bits + 1)


def f32(d: Decimal | str) -> float:
    """Binary32 value correctly rounded from a decimal."""
    return round_binary(Fraction(Decimal(d)), 24)


def low_part(x: Decimal, hi: float, single: bool) -> float:
    """lo = nearest(x - hi) in the precision of ``hi`` (exact rational difference)."""
    return round_binary(Fraction(x) - Fraction(hi), 24 if single else 53)


def low_parts(profile, single: bool, src: dict[str, object]) -> dict[str, object]:  # noqa: ANN001
    """Double-double low parts of R, beta and the per-layer tb, lapse, pb."""
    lay = src["layers"]
    sca = src["scalars"]

    def hi_of(v: object) -> float:
        return f32(v) if single else float(v)  # type: ignore[arg-type]

    rows = []
    for i in range(7):
        rows.append({key: low_part(profile.exact(name)[i], hi_of(lay[i][key]), single)
                     for key, name in (("tb", "base_temperature"), ("lapse", "lapse_rate"),
                                       ("pb", "base_pressure"))})
    return {"AD_R_LO": low_part(profile.exact("R"), hi_of(sca["AD_R"]), single),
            "AD_SUTH_BETA_LO": low_part(profile.exact("beta"), hi_of(sca["AD_SUTH_BETA"]),
                                        single),
            "layers": rows}


def limits(profile, single: bool, ex: dict[str, object]) -> dict[str, float]:  # noqa: ANN001
    """RATIO_MAX, MACH_MAX and the setting altitude's ends widened by DERIVED_SLACK (see
    the module docstring)."""
    dom = _mod("airdata._domains")
    pit = _mod("airdata.pitot")
    ends = dom.setting_altitude(profile)
    if not single:
        return {"AD_RATIO_LIMIT": pit.RATIO_LIMIT, "AD_MACH_LIMIT": pit.MACH_LIMIT,
                "AD_SETTING_ALT_LO": ends.lo, "AD_SETTING_ALT_HI": ends.hi}
    widen = 1 + Fraction(dom.DERIVED_SLACK)
    ratio = Fraction(ex["scalars"]["AD_RATIO_MAX"]) * widen  # type: ignore[index]
    return {"AD_RATIO_LIMIT": round_binary(ratio, 24),
            "AD_MACH_LIMIT": round_binary(Fraction(dom.MACH_MAX) * widen, 24),
            "AD_SETTING_ALT_LO": round_binary(Fraction(profile.h_min) * widen, 24),
            "AD_SETTING_ALT_HI": round_binary(Fraction(profile.layer_base[1]) * widen, 24)}


def exact(profile) -> dict[str, object]:  # noqa: ANN001
    """Exact (40-digit) decimal definition of every constant of ``profile``."""
    prof_mod = _mod("airdata.profiles")
    d = {k: Decimal(v) for k, v in profile.definitions.items()}
    r = d["R"] if "R" in d else CTX.divide(d["R_star"], d["M0"])
    g0, t0, p0, r0 = d["g0"], d["T0"], d["p0"], d["r0"]
    temps, press = prof_mod._derive_bases(g0, r, t0, p0)
    hb = [Decimal(h) for h in prof_mod._LAYER_BASES]
    lapse = [Decimal(x) for x in prof_mod._LAPSE_RATES]
    h_min, h_max = Decimal(prof_mod._BOTTOM), Decimal(prof_mod._TOP)
    zero = Decimal(0)

    def p_at(i: int, h: Decimal) -> tuple[Decimal, Decimal]:
        t = CTX.add(temps[i], CTX.multiply(lapse[i], h - hb[i]))
        expo = CTX.multiply(CTX.divide(-g0, CTX.multiply(r, lapse[i])),
                            CTX.ln(CTX.divide(t, temps[i])))
        return t, CTX.multiply(press[i], CTX.exp(expo))

    t_bot, p_bot = p_at(0, h_min)
    t_top, p_top = p_at(6, h_max)
    layers = []
    for i in range(7):
        lp, tb = lapse[i], temps[i]
        rl = CTX.multiply(r, lp)
        layers.append({
            "hb": hb[i], "lapse": lp, "tb": tb, "pb": press[i],
            "m": CTX.divide(lp, tb) if lp else zero,
            "k": CTX.divide(g0, rl) if lp else zero,
            "c": zero if lp else CTX.divide(g0, CTX.multiply(r, tb)),
            "n": CTX.divide(-rl, g0) if lp else zero,
            "sh": CTX.divide(-CTX.multiply(r, tb), g0),
            "rho_b": CTX.divide(press[i], CTX.multiply(r, tb)),
            "kd": CTX.divide(-rl, CTX.add(g0, rl)) if lp else zero,
            "gradient": 1 if lp else 0,
        })
    gamma = Decimal("1.4")
    ratio_sonic = CTX.subtract(CTX.power(Decimal("1.2"), Decimal("3.5")), 1)
    ratio_max = CTX.subtract(
        CTX.multiply(Decimal(120), CTX.power(CTX.divide(Decimal(720), Decimal(699)),
                                             Decimal("2.5"))), 1)
    scalars = {
        "AD_G0": g0, "AD_R": r, "AD_T0": t0, "AD_P0": p0,
        "AD_RHO0": CTX.divide(p0, CTX.multiply(r, t0)),
        "AD_A0": CTX.sqrt(CTX.multiply(CTX.multiply(gamma, r), t0)),
        "AD_GAMMA_R": CTX.multiply(gamma, r),
        "AD_R0": r0,
        "AD_SUTH_BETA": d["beta"], "AD_SUTH_S": d["S"],
        "AD_RATIO_SONIC": ratio_sonic, "AD_RATIO_MAX": ratio_max,
        "AD_PHI_INF": CTX.power(CTX.divide(Decimal(7), Decimal("7.2")), Decimal("2.5")),
        "AD_RHO_MIN": CTX.divide(p_top, CTX.multiply(r, t_top)),
        "AD_RHO_MAX": CTX.divide(p_bot, CTX.multiply(r, t_bot)),
    }
    return {"layers": layers, "scalars": scalars, "p_min": p_top, "p_max": p_bot,
            "g_lo": CTX.divide(CTX.multiply(r0, h_min), CTX.subtract(r0, h_min)),
            "g_hi": CTX.divide(CTX.multiply(r0, h_max), CTX.subtract(r0, h_max))}


def binary64(profile) -> dict[str, object]:  # noqa: ANN001
    """The binary64 values the Python reference uses."""
    atm = _mod("airdata._layers")
    pit = _mod("airdata.pitot")
    alt = _mod("airdata.altimetry")
    gamma = _mod("airdata.profiles").GAMMA
    t = atm.layer_table(profile)
    layers = []
    for i in range(7):
        row = {key: float(getattr(t, key)[i])
               for key in ("hb", "lapse", "tb", "pb", "m", "k", "c", "n", "sh", "rho_b", "kd")}
        row["gradient"] = int(bool(t.gradient[i]))
        layers.append(row)
    rho_lo, rho_hi = alt.density_range(profile)
    scalars = {
        "AD_G0": profile.g0, "AD_R": profile.R, "AD_T0": profile.T0, "AD_P0": profile.p0,
        "AD_RHO0": profile.rho0, "AD_A0": profile.a0, "AD_GAMMA_R": gamma * profile.R,
        "AD_R0": profile.r0, "AD_SUTH_BETA": profile.sutherland_beta,
        "AD_SUTH_S": profile.sutherland_s,
        "AD_RATIO_SONIC": pit.RATIO_SONIC, "AD_RATIO_MAX": pit.RATIO_MAX,
        "AD_PHI_INF": pit._PHI_INF, "AD_RHO_MIN": rho_lo, "AD_RHO_MAX": rho_hi,
    }
    return {"layers": layers, "scalars": scalars}


def domains(profile, single: bool, ex: dict[str, object]) -> list[tuple[str, float, float]]:  # noqa: ANN001
    """Range ends of every domain of airdata._domains.C_DOMAINS: the fixed ones first, then
    those of the profile (binary32: from the exact decimal values), each in id order."""
    dom = _mod("airdata._domains")
    special = {"altitude", "geometric", "pressure", "setting"}
    out = []
    for name, of in dom.C_DOMAINS:
        if name not in special:
            dm = of(profile)
            lo, hi = (f32(repr(dm.lo)), f32(repr(dm.hi))) if single else (dm.lo, dm.hi)
            out.append((name.upper(), lo, hi))
    alt, geo = dom.altitude(profile), dom.geometric(profile)
    prs, sett = dom.pressure(profile), dom.setting(profile)
    if single:
        lay = ex["layers"]
        out += [("ALTITUDE", f32(repr(alt.lo)), f32(repr(alt.hi))),
                ("GEOMETRIC", f32(ex["g_lo"]), f32(ex["g_hi"])),
                ("PRESSURE", f32(ex["p_min"]), f32(ex["p_max"])),
                ("SETTING", f32(lay[1]["pb"]), f32(ex["p_max"]))]
    else:
        out += [("ALTITUDE", alt.lo, alt.hi), ("GEOMETRIC", geo.lo, geo.hi),
                ("PRESSURE", prs.lo, prs.hi), ("SETTING", sett.lo, sett.hi)]
    return out


def lit(x: float, single: bool) -> str:
    """C99 hex-float literal of ``x``."""
    mant, expo = float.hex(float(x)).split("p")
    mant = mant.rstrip("0").rstrip(".")
    text = f"{mant}p{expo}" + ("f" if single else "")
    return f"({text})" if x < 0 else text


def block(profile, single: bool) -> list[str]:  # noqa: ANN001
    """The #define lines of one profile and precision."""
    ex = exact(profile)
    vals = binary64(profile)
    lines = []

    def conv(key_val: object) -> float:
        return f32(key_val) if single else float(key_val)  # type: ignore[arg-type]

    src = ex if single else vals
    for name, value in src["scalars"].items():  # type: ignore[union-attr]
        lines.append(f"#define {name} {lit(conv(value), single)}")
    lows = low_parts(profile, single, src)
    for name in ("AD_R_LO", "AD_SUTH_BETA_LO"):
        lines.append(f"#define {name} {lit(lows[name], single)}")
    for name, value in limits(profile, single, ex).items():
        lines.append(f"#define {name} {lit(value, single)}")
    for name, (text, what) in KERNEL_LITERALS.items():
        q = Fraction(text) if "/" in text else Fraction(Decimal(text))
        v = round_binary(q, 24) if single else round_binary(q, 53)
        lines.append(f"#define {name} {lit(v, single)} /* {text}: {what} */")
    for name, lo, hi in domains(profile, single, ex):
        lines.append(f"#define AD_{name}_LO {lit(conv(lo), single)}")
        lines.append(f"#define AD_{name}_HI {lit(conv(hi), single)}")
    lines.append(f"#define AD_LAYER1_BASE {lit(conv(src['layers'][1]['hb']), single)}")
    for i, row in enumerate(src["layers"]):  # type: ignore[arg-type]
        fields = ", ".join(lit(conv(row[key]), single) for key in
                           ("hb", "lapse", "tb", "pb", "m", "k", "c", "n", "sh", "rho_b", "kd"))
        fields += ", " + ", ".join(lit(lows["layers"][i][key], single)  # type: ignore[index]
                                   for key in ("tb", "lapse", "pb"))
        lines.append(f"#define AD_LAYER_{i} {{ {fields}, {row['gradient']} }}")
    return lines


def render() -> str:
    """The whole header text."""
    profiles = _mod("airdata.profiles")
    out = [
        "/*",
        " * ad_constants.h - constants of the airdata C port, one set per profile and",
        " * precision.  GENERATED by bindings/c/tools/gen_constants.py from",
        " * airdata.profiles; do not edit (tests/test_cport_build.py checks it is current).",
        " *",
        " * binary64: the binary64 values the Python reference computes with.",
        " * binary32: each constant correctly rounded to binary32 from its exact",
        " * definition (40-digit decimal evaluation of the defining constants).",
        " *",
        " * Layer rows: { hb, lapse, tb, pb, m = L/Tb, k = g0/(R L), c = g0/(R Tb),",
        " *   n = -R L/g0, sh = -R Tb/g0, rho_b = pb/(R Tb), kd = -R L/(g0 + R L),",
        " *   tb_lo, lapse_lo, pb_lo, gradient }; unused entries of a layer are exact",
        " *   zeros.  *_LO: double-double (binary32: float-float) low parts,",
        " *   lo = nearest(x - hi) from the 40-digit decimal x.",
        " * AD_RATIO_LIMIT, AD_MACH_LIMIT: limits of derived qc/ps, qc/p0 and Mach",
        " *   numbers, widened by 8 binary64 ulp (airdata._domains.DERIVED_SLACK);",
        " *   binary32: that binary64-based value rounded to binary32.",
        " */",
        "#ifndef AD_CONSTANTS_H",
        "#define AD_CONSTANTS_H",
        "",
    ]
    first = True
    for prof, guard in ((profiles.US1976, "defined(AIRDATA_PROFILE_US1976)"),
                        (profiles.ICAO, None)):
        if first:
            out.append(f"#if {guard}")
        else:
            out.append("#else /* ICAO Doc 7488/3, the default */")
        first = False
        out.append(f'#define AD_PROFILE_NAME "{prof.name}"')
        out.append("#if defined(AIRDATA_SINGLE)")
        out += block(prof, True)
        out.append("#else")
        out += block(prof, False)
        out.append("#endif /* AIRDATA_SINGLE */")
    out += ["#endif /* profile */", "", "#endif /* AD_CONSTANTS_H */", ""]
    return "\n".join(out)


def main(argv: list[str] | None = None) -> int:
    """Write the header, or with --check report whether it is current."""
    parser = argparse.ArgumentParser(description=__doc__.splitlines()[0])
    parser.add_argument("--check", action="store_true", help="exit 1 if the header is stale")
    args = parser.parse_args(argv)
    text = render()
    if args.check:
        current = HEADER.read_text() if HEADER.exists() else ""
        if current != text:
            print(f"{HEADER} is stale: run {Path(__file__).name}", file=sys.stderr)
            return 1
        return 0
    HEADER.write_text(text)
    return 0


if __name__ == "__main__":
    sys.exit(main())
