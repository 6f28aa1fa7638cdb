"""The library's constants against the oracle's own, typed from the standards.

tests/oracle.py types every defining constant from ICAO Doc 7488/3 / ISO 2533 and U.S.
Standard Atmosphere 1976 (its :data:`oracle.DEFINING`, each with its source, most
``from memory``) and derives the layer base temperatures, pressures and densities at 50
digits.  Nothing there is read from ``airdata``.  This module checks that the library
holds the same numbers:

* every field of ``airdata.get_profile("icao")`` and ``get_profile("us1976")`` is the
  binary64 number nearest the oracle's value: within half an ulp (defining and derived
  constants alike; the library rounds each once from a 40-digit evaluation);
* every binary64 constant of the C header bindings/c/src/ad_constants.h (both profiles):
  the scalars and the seven layer rows (base altitude, gradient, base temperature and
  pressure) within half an ulp; the quantities the reference computes in binary64 from
  its rounded constants (gamma R; the per-layer quotients m, k, c, n, sh, rho_b, kd)
  within 4 ulps; the double-double pairs (R, Sutherland's beta, tb, lapse, pb) within
  2**-104 relative.

So a slip typed into both the library and its generated header (r0, R, g0, a layer base)
fails here, where the accuracy and vector tests, whose oracle has its own constants,
would also see it only through the functions.  The negative controls at the end show
that the comparison reports a profile whose R is off by 1e-6 relative and a header with
one altered hex digit.
"""

from __future__ import annotations

import copy
import dataclasses
import math
import re
from fractions import Fraction
from pathlib import Path

import pytest

import airdata
from airdata.profiles import Profile

try:  # tests/ as a package
    from . import oracle
except ImportError:  # tests/ on sys.path
    import oracle

HEADER = Path(__file__).resolve().parents[1] / "bindings" / "c" / "src" / "ad_constants.h"
mp = oracle.mp

#: Allowed distance from the exact value, in ulps of the stored binary64 number: half an
#: ulp (correct rounding), with room for the 40-digit evaluation the library rounds from.
HALF_ULP = 0.5 + 1e-6
#: Allowed distance of a quantity the library computes in binary64 from its rounded
#: constants (gamma R, and the per-layer quotients m, k, c, n, sh, rho_b, kd of
#: airdata._layers.layer_table, which the C header copies): a few roundings, 4 ulps
#: (measured at most 1.6).  A slip of 1e-12 relative is still some 4500 ulps.
COMPUTED_ULPS = 4.0
#: Header constants computed in binary64 rather than rounded once.
COMPUTED = frozenset({"AD_GAMMA_R", "m", "k", "c", "n", "sh", "rho_b", "kd"})
#: Allowed relative error of a double-double (hi + lo) pair: 2**-104.
DD_REL = 2.0**-104


def _exact(x: object) -> Fraction:
    """An mpf (or float) as an exact fraction."""
    if isinstance(x, float):
        return Fraction(x)
    sign, man, exp, _ = mp.mpf(x)._mpf_
    mag = Fraction(int(man)) * Fraction(2) ** int(exp)
    return -mag if sign else mag


def ulps_off(stored: float, exact: object) -> float:
    """|stored - exact| in ulps of ``stored`` (0 when both are 0)."""
    e = _exact(exact)
    if stored == 0:
        return 0.0 if e == 0 else math.inf
    return float(abs(Fraction(stored) - e) / Fraction(math.ulp(stored)))


def _ref_fields(ref: oracle.RefProfile) -> dict[str, object]:
    """The oracle's value of every constant the library's Profile stores."""
    return {
        "g0": ref.g0, "R": ref.R, "T0": ref.T0, "p0": ref.p0, "r0": ref.r0,
        "rho0": ref.rho0, "a0": ref.a0, "h_min": ref.h_min, "h_max": ref.h_max,
        "sutherland_beta": ref.beta, "sutherland_s": ref.S,
        "layer_base": ref.hb, "lapse_rate": ref.lapse, "base_temperature": ref.tb,
        "base_pressure": ref.pb,
        "p_max": oracle.standard_pressure(ref.h_min, ref),
        "p_min": oracle.standard_pressure(ref.h_max, ref),
    }


def compare_profile(prof: Profile, ref: oracle.RefProfile) -> list[str]:
    """Every stored constant of ``prof`` more than half an ulp from the oracle's.

    Returns
    -------
    list of str
        One message per differing constant (empty when all agree); a missing field or
        a per-layer tuple of the wrong length is reported too.
    """
    bad: list[str] = []
    for key, want in _ref_fields(ref).items():
        got = getattr(prof, key, None)
        if got is None:
            bad.append(f"{prof.name}.{key}: missing")
            continue
        pairs = (list(zip(got, want, strict=False)) if isinstance(want, tuple)
                 else [(got, want)])
        if isinstance(want, tuple) and len(got) != len(want):
            bad.append(f"{prof.name}.{key}: {len(got)} layers, the standards have {len(want)}")
        for i, (g, w) in enumerate(pairs):
            off = ulps_off(float(g), w)
            if not off <= HALF_ULP:
                where = f"[{i}]" if isinstance(want, tuple) else ""
                bad.append(f"{prof.name}.{key}{where} = {float(g)!r}, standard "
                           f"{mp.nstr(mp.mpf(w), 20)} ({off:.3g} ulp)")
    return bad


# ---------------------------------------------------------------------- the C header

_BLOCK = re.compile(r"#if defined\(AIRDATA_SINGLE\)\n.*?\n#else\n(?P<b64>.*?)\n#endif",
                    re.S)
_DEFINE = re.compile(r"^#define (AD_\w+) (.+?)\s*(?:/\*.*)?$", re.M)
#: Columns of a layer row (the header's own comment).
LAYER_COLUMNS = ("hb", "lapse", "tb", "pb", "m", "k", "c", "n", "sh", "rho_b", "kd",
                 "tb_lo", "lapse_lo", "pb_lo", "gradient")


def _hex(token: str) -> float:
    return float.fromhex(token.strip().strip("()"))


def parse_header(text: str) -> dict[str, dict[str, object]]:
    """The binary64 defines of both profiles: {"us1976": {...}, "icao": {...}}.

    The header holds ``#if AIRDATA_PROFILE_US1976`` (binary32, then binary64) and the
    ICAO default in its ``#else`` in the same layout; the binary64 block of each is the
    ``#else`` of its ``AIRDATA_SINGLE`` switch.  Scalars become floats, layer rows tuples.
    """
    blocks = [m.group("b64") for m in _BLOCK.finditer(text)]
    if len(blocks) != 2:
        raise ValueError(f"expected 2 binary64 blocks in the header, found {len(blocks)}")
    out: dict[str, dict[str, object]] = {}
    for name, block in zip(("us1976", "icao"), blocks, strict=True):
        values: dict[str, object] = {}
        for key, val in _DEFINE.findall(block):
            if val.startswith("{"):
                values[key] = tuple(_hex(t) for t in val.strip("{} ").split(","))
            elif val.startswith(("0x", "(-0x")):
                values[key] = _hex(val)
        out[name] = values
    return out


def _header_expectations(ref: oracle.RefProfile) -> dict[str, object]:
    gamma = oracle.GAMMA
    return {
        "AD_G0": ref.g0, "AD_R": ref.R, "AD_T0": ref.T0, "AD_P0": ref.p0,
        "AD_RHO0": ref.rho0, "AD_A0": ref.a0, "AD_GAMMA_R": gamma * ref.R,
        "AD_R0": ref.r0, "AD_SUTH_BETA": ref.beta, "AD_SUTH_S": ref.S,
        "AD_LAYER1_BASE": ref.hb[1],
    }


def _layer_expectations(ref: oracle.RefProfile, i: int) -> dict[str, object]:
    """Exact value of each column of layer row i (unused entries are exact zeros)."""
    hb, lapse, tb, pb, g0, r = ref.hb[i], ref.lapse[i], ref.tb[i], ref.pb[i], ref.g0, ref.R
    grad = lapse != 0
    return {
        "hb": hb, "lapse": lapse, "tb": tb, "pb": pb,
        "m": lapse / tb if grad else 0, "k": g0 / (r * lapse) if grad else 0,
        "c": 0 if grad else g0 / (r * tb), "n": -r * lapse / g0 if grad else 0,
        "sh": -r * tb / g0, "rho_b": pb / (r * tb),
        "kd": -r * lapse / (g0 + r * lapse) if grad else 0,
        "gradient": 1 if grad else 0,
    }


def _dd_off(hi: float, lo: float, exact: object) -> float:
    """Relative error of the double-double hi + lo."""
    e = _exact(exact)
    if e == 0:
        return 0.0 if hi == lo == 0 else math.inf
    return float(abs(Fraction(hi) + Fraction(lo) - e) / abs(e))


def compare_header(values: dict[str, object], ref: oracle.RefProfile) -> list[str]:
    """Every binary64 header constant of one profile that differs from the oracle's."""
    bad: list[str] = []
    for key, want in _header_expectations(ref).items():
        got = values.get(key)
        if not isinstance(got, float):
            bad.append(f"{ref.name} {key}: missing")
        elif not ulps_off(got, want) <= (COMPUTED_ULPS if key in COMPUTED else HALF_ULP):
            bad.append(f"{ref.name} {key} = {got.hex()}, standard {mp.nstr(mp.mpf(want), 20)}"
                       f" ({ulps_off(got, want):.3g} ulp)")
    for key, want, hi_key in (("AD_R_LO", ref.R, "AD_R"),
                              ("AD_SUTH_BETA_LO", ref.beta, "AD_SUTH_BETA")):
        hi, lo = values.get(hi_key), values.get(key)
        if not (isinstance(hi, float) and isinstance(lo, float)) or not _dd_off(
                hi, lo, want) <= DD_REL:
            bad.append(f"{ref.name} {hi_key} + {key}: not within 2**-104 of the standard")
    for i in range(len(ref.hb)):
        row = values.get(f"AD_LAYER_{i}")
        if not isinstance(row, tuple) or len(row) != len(LAYER_COLUMNS):
            bad.append(f"{ref.name} AD_LAYER_{i}: missing or not {len(LAYER_COLUMNS)} columns")
            continue
        col = dict(zip(LAYER_COLUMNS, row, strict=True))
        for key, want in _layer_expectations(ref, i).items():
            off = ulps_off(col[key], want)
            if not off <= (COMPUTED_ULPS if key in COMPUTED else HALF_ULP):
                bad.append(f"{ref.name} AD_LAYER_{i}.{key} = {col[key].hex()}, standard "
                           f"{mp.nstr(mp.mpf(want), 20)} ({off:.3g} ulp)")
        for key, exact in (("tb", ref.tb[i]), ("lapse", ref.lapse[i]), ("pb", ref.pb[i])):
            if not _dd_off(col[key], col[f"{key}_lo"], exact) <= DD_REL:
                bad.append(f"{ref.name} AD_LAYER_{i}.{key} + {key}_lo: not within 2**-104")
    return bad


# --------------------------------------------------------------------------- the tests


@pytest.mark.parametrize("name", ["icao", "us1976"])
def test_profile_constants_match_the_standards(name: str) -> None:
    """airdata.get_profile(name): every constant the nearest binary64 of the standard's."""
    prof = airdata.get_profile(name)
    bad = compare_profile(prof, oracle.PROFILES[name])
    assert not bad, "\n".join(bad)
    # The count guards against a comparison that silently skipped the fields.
    assert len(_ref_fields(oracle.PROFILES[name])) == 17


@pytest.mark.parametrize("name", ["icao", "us1976"])
def test_profile_definitions_are_the_standards_strings(name: str) -> None:
    """The decimal strings the library derives from equal the oracle's, value for value."""
    prof = airdata.get_profile(name)
    ours = {k: c.value for k, c in oracle.DEFINING[name].items() if k != "gamma"}
    assert {k: mp.mpf(v) for k, v in prof.definitions.items()} == {
        k: mp.mpf(v) for k, v in ours.items()}
    assert airdata.profiles.GAMMA == float(mp.mpf(oracle.DEFINING[name]["gamma"].value))


@pytest.mark.parametrize("name", ["icao", "us1976"])
def test_c_header_constants_match_the_standards(name: str) -> None:
    """bindings/c/src/ad_constants.h, binary64 block of the profile."""
    values = parse_header(HEADER.read_text())[name]
    bad = compare_header(values, oracle.PROFILES[name])
    assert not bad, "\n".join(bad)
    assert len(values) > 50  # the block was found and parsed


def test_oracle_constants_carry_a_source() -> None:
    """Every defining constant of the oracle names where it comes from."""
    for name, table in oracle.DEFINING.items():
        for key, c in table.items():
            assert c.source and c.unit, (name, key)
            mp.mpf(c.value)  # an exact decimal string
    assert oracle.LAYER_SOURCE


# ------------------------------------------------------------------ negative controls


def test_comparison_reports_r_off_by_1e_6() -> None:
    """A copy of the ICAO profile with R stored 1e-6 relative high is reported; so is a
    profile rebuilt from definitions with that R (R and every quantity derived from it)."""
    ref = oracle.PROFILES["icao"]
    bad_copy = copy.copy(airdata.get_profile("icao"))
    object.__setattr__(bad_copy, "R", bad_copy.R * (1 + 1e-6))
    msgs = compare_profile(bad_copy, ref)
    assert [m.split(" =")[0] for m in msgs] == ["icao.R"]

    defs = dict(airdata.get_profile("icao").definitions)
    defs["R"] = str(mp.mpf(defs["R"]) * (1 + mp.mpf("1e-6")))
    rebuilt = dataclasses.replace(airdata.get_profile("icao"), definitions=defs)
    msgs = compare_profile(rebuilt, ref)
    named = {m.split(" =")[0].split("[")[0] for m in msgs}
    assert {"icao.R", "icao.rho0", "icao.a0", "icao.base_pressure", "icao.p_min"} <= named


@pytest.mark.parametrize(("key", "value"), [("r0", "6356767"), ("g0", "9.80666"),
                                            ("T0", "288.16")])
def test_comparison_reports_a_slip_in_a_defining_constant(key: str, value: str) -> None:
    """A profile rebuilt with one defining constant mistyped is reported."""
    defs = dict(airdata.get_profile("us1976").definitions)
    defs[key] = value
    rebuilt = dataclasses.replace(airdata.get_profile("us1976"), definitions=defs)
    msgs = compare_profile(rebuilt, oracle.PROFILES["us1976"])
    field_name = {"r0": "r0", "g0": "g0", "T0": "T0"}[key]
    assert any(m.startswith(f"us1976.{field_name} =") for m in msgs), msgs


def test_comparison_reports_a_moved_layer_base() -> None:
    """The oracle with the 20 km base moved by 1 m disagrees with the library there."""
    hb = ("0", "11000", "20001", "32000", "47000", "51000", "71000")
    moved = oracle.make_profile("icao", hb=hb)
    msgs = compare_profile(airdata.get_profile("icao"), moved)
    assert any(m.startswith("icao.layer_base[2]") for m in msgs), msgs
    assert any(m.startswith("icao.base_pressure[3]") for m in msgs), msgs


def test_header_comparison_reports_one_altered_digit() -> None:
    """The header text with the last hex digit of AD_R (ICAO binary64) changed."""
    text = HEADER.read_text()
    good = parse_header(text)["icao"]["AD_R"]
    assert isinstance(good, float)
    hexr = good.hex()  # e.g. 0x1.1f0d88e368f08p+8
    mant, exp = hexr.split("p")
    altered = mant[:-1] + ("0" if mant[-1] != "0" else "1") + "p" + exp
    assert text.count(f"#define AD_R {hexr}\n") == 1
    bad_text = text.replace(f"#define AD_R {hexr}\n", f"#define AD_R {altered}\n")
    msgs = compare_header(parse_header(bad_text)["icao"], oracle.PROFILES["icao"])
    assert any(m.startswith("icao AD_R =") for m in msgs), msgs
    assert any("AD_R + AD_R_LO" in m for m in msgs), msgs
    # The untouched profile still passes: the alteration is what was reported.
    assert not compare_header(parse_header(bad_text)["us1976"], oracle.PROFILES["us1976"])
