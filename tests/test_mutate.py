"""Tests of tools/mutate.py, the mutation adequacy tool of the vectors.

Unit tests of the tokenizer and the mutation operators on small C snippets, then a small
deterministic run against the real port: a known-killable mutant is killed and the
summary counts add up.  The runs need a C compiler; without one they are skipped unless
AIRDATA_REQUIRE_TOOLCHAINS=1 (then they fail).
"""

from __future__ import annotations

import importlib.util
import json
import sys
from pathlib import Path

import pytest
import toolchains

ROOT = Path(__file__).resolve().parents[1]
_spec = importlib.util.spec_from_file_location("ad_mutate", ROOT / "tools" / "mutate.py")
assert _spec is not None and _spec.loader is not None
mutate = importlib.util.module_from_spec(_spec)
sys.modules["ad_mutate"] = mutate
_spec.loader.exec_module(mutate)

SNIPPET = """\
/* a comment with a < b and 287.05287 inside */
#include "x.h"
#define AD_GAS 287.05287
#define AD_STEPS 4
#define AD_MACRO(a) ((a) < 1.5)
#if defined(AIRDATA_SINGLE)
#define AD_ONLY32 0x1.8p+0f
#else
#define AD_ONLY64 0x1.8p+0
#endif
static const char *s = "x < y && 2.5";
int f(double a, double b, int *p)
{
    int i;
    // line comment: a > b
    for (i = 0; i < AD_STEPS; i++) {
        if ((a < b) && (a >= 0.190263)) {
            return AD_OUT_OF_RANGE;
        }
    }
    *p = (int)(a * b - 1.0);
    return AD_OK;
}
"""
TYPES = {"double", "int", "char", "const"}


def _mutants(src: str = SNIPPET) -> list:
    return mutate.mutants_of_source(src, "snippet.c", TYPES, {"AD_STEPS"})


def _need_cc() -> None:
    if mutate.compiler() is None:
        toolchains.missing("no C compiler for the mutants (airdata.tools.mutate.compiler)")
    toolchains.need("gcc")


def test_perturb_digit_6th_digit_of_gas_constant() -> None:
    # 287.05287 J/(kg K), ICAO Doc 7488/3 (from memory); one unit in the 6th significant
    # digit is 1e-3.
    assert mutate.perturb_digit(287.05287, 6) == pytest.approx(287.05387, abs=1e-9)
    assert mutate.perturb_digit(287.05287, 4) == pytest.approx(287.15287, abs=1e-9)
    assert mutate.perturb_digit(287.05287, 9) == pytest.approx(287.052871, abs=1e-10)
    assert mutate.perturb_digit(-0.0065, 4) == pytest.approx(-0.006501, abs=1e-12)


def test_firmware_rounding() -> None:
    assert mutate.firmware_round(287.05287, "binary64") == 287.05
    assert mutate.firmware_round(0.190263, "binary64") == 0.19026
    # exact short decimals (defining values of the standard) are left alone
    assert mutate.firmware_round(101325.0, "binary64") is None
    assert mutate.firmware_round(288.15, "binary64") is None


def test_hex_literals_keep_their_style_and_precision() -> None:
    v, prec, suf = mutate.parse_float_literal("0x1.1f0d88p+8f")
    assert prec == "binary32" and suf == "f"
    out = mutate.format_like("0x1.1f0d88p+8f", mutate.perturb_digit(v, 4), prec, suf)
    assert out.startswith("0x1.") and out.endswith("f")
    assert mutate.parse_float_literal(out)[0] != v
    assert mutate.format_like("287.05287", 287.05387, "binary64", "") == "287.05387"


def test_tokenizer_marks_comments_strings_and_preprocessor() -> None:
    toks = mutate.tokenize(SNIPPET)
    kinds = {t.text: t.kind for t in toks if t.kind in ("comment", "string")}
    assert any(k.startswith("/* a comment") for k in kinds)
    assert '"x < y && 2.5"' in kinds
    inc = [t for t in toks if t.line == 2]
    assert all(t.kind == "pp" for t in inc)
    # the body of an object-like #define keeps its kind and the macro name
    gas = [t for t in toks if t.text == "287.05287" and t.kind == "number"]
    assert len(gas) == 1 and gas[0].define == "AD_GAS"


def test_conditional_compilation_per_configuration() -> None:
    toks = mutate.tokenize(SNIPPET)
    only32 = next(t for t in toks if t.text == "0x1.8p+0f")
    only64 = next(t for t in toks if t.text == "0x1.8p+0")
    assert only32.configs == {"icao-binary32", "us1976-binary32"}
    assert only64.configs == {"icao-binary64", "us1976-binary64"}


def test_comments_strings_and_preprocessor_untouched() -> None:
    lines = SNIPPET.splitlines()
    for m in _mutants():
        text = lines[m.line - 1]
        # never inside a comment or a string
        assert m.line not in (1, 11, 15), m.id
        # the only preprocessor lines mutated are numeric #define bodies
        if text.startswith("#"):
            assert text.startswith("#define AD_") and m.operator in ("const", "loop"), m.id
            assert "(" not in text.split()[1], m.id  # no function-like macro
    assert not [m for m in _mutants() if m.line in (2, 5, 6, 8, 10)]


def test_relational_and_boolean_and_arith_operators() -> None:
    ms = _mutants()
    rel = {(m.original, m.replacement, m.detail) for m in ms if m.operator == "rel"}
    assert ("<", "<=", "boundary") in rel
    assert ("<", ">", "reverse") in rel
    assert (">=", ">", "boundary") in rel
    assert any(m.operator == "bool" and m.original == "&&" and m.replacement == "||"
               for m in ms)
    arith = [(m.original, m.replacement) for m in ms if m.operator == "arith"]
    assert ("*", "/") in arith and ("-", "+") in arith
    # the pointer declarator `int *p` and the dereference `*p =` are not multiplications
    assert len([a for a in arith if a[0] == "*"]) == 1


def test_a_less_b_becomes_a_less_equal_b() -> None:
    m = next(m for m in _mutants() if m.operator == "rel" and m.detail == "boundary"
             and "(a < b)" in m.context)
    assert "(a <= b)" in m.apply(SNIPPET)
    assert m.apply(SNIPPET).count("<=") == SNIPPET.count("<=") + 1


def test_constant_loop_status_and_range_operators() -> None:
    ms = _mutants()
    gas = [m for m in ms if m.operator == "const" and m.original == "287.05287"]
    assert {m.detail for m in gas} == {"d4", "d6", "d9", "firmware"}
    d6 = next(m for m in gas if m.detail == "d6")
    assert float(d6.replacement) == pytest.approx(287.05387, abs=1e-9)
    assert next(m for m in gas if m.detail == "firmware").replacement == "287.05"
    loops = {(m.original, m.replacement) for m in ms if m.operator == "loop"}
    assert ("4", "3") in loops and ("0", "1") in loops  # AD_STEPS and the loop's start
    st = {(m.original, m.replacement) for m in ms if m.operator == "status"}
    assert st == {("AD_OK", "AD_OUT_OF_RANGE"), ("AD_OUT_OF_RANGE", "AD_OK")}
    rng = [m for m in ms if m.operator == "range"]
    assert len(rng) == 1 and "if (0 && (a < b) && (a >= 0.190263))" in rng[0].apply(SNIPPET)


def test_one_token_changed_per_mutant() -> None:
    for m in _mutants():
        out = m.apply(SNIPPET)
        assert out[:m.start] == SNIPPET[:m.start]
        assert out[m.start + len(m.replacement):] == SNIPPET[m.end:]


def test_sample_is_deterministic_and_stratified() -> None:
    ms = mutate.all_mutants(ROOT)
    a = mutate.sample_mutants(ms, 40, 7)
    b = mutate.sample_mutants(ms, 40, 7)
    assert [m.id for m in a] == [m.id for m in b] and len(a) == 40
    assert {m.operator for m in a} == set(mutate.OPERATORS)
    assert [m.id for m in mutate.sample_mutants(ms, 40, 8)] != [m.id for m in a]


def _pick(ms: list, **kw: object):  # noqa: ANN202 - a Mutant
    return next(m for m in ms if all(getattr(m, k) == v for k, v in kw.items()))


def test_small_run_kills_known_mutants_and_counts_add_up(tmp_path: Path) -> None:
    _need_cc()
    ms = mutate.all_mutants(ROOT)
    # gas constant R of the default profile (binary64) mistyped in the 6th digit, and the
    # status of an out-of-range argument turned into AD_OK: both must be killed
    gas = next(m for m in ms if m.macro == "AD_R" and m.detail == "d6"
               and m.configs == ["icao-binary64"])
    status = next(m for m in ms if m.operator == "status" and m.original == "AD_OUT_OF_RANGE"
                  and m.file.endswith("domains.c"))
    picked = [gas, status] + [m for m in mutate.sample_mutants(ms, 10, 5)
                              if m.id not in (gas.id, status.id)][:10]
    report = mutate.run(ROOT, picked, len(ms), jobs=2, seed=5, sample=12, timeout=60.0,
                        configs=list(mutate.CONFIGS), work=tmp_path)
    by_id = {m["id"]: m for m in report["mutants"]}
    assert by_id[gas.id]["outcome"] == "killed"
    assert by_id[gas.id]["killed_by"] == "icao-binary64"
    assert by_id[status.id]["outcome"] == "killed"
    o = report["summary"]["overall"]
    assert o["total"] == 12
    assert (o["killed"] + o["killed_timeout"] + o["stillborn"] + o["survived"]
            + o["not_built"]) == o["total"]
    assert o["equivalent"] + o["gap"] + o["unclassified"] == o["survived"]
    assert sum(c["total"] for c in report["summary"]["per_operator"].values()) == 12
    for m in report["survivors"]:
        assert m["classification"] in ("equivalent", "gap", "unclassified") and m["reason"]
    text = mutate.text_summary(report)
    assert "not certified flight software" in text
    json.dumps(report, default=str)


def test_cli_list_and_report(tmp_path: Path, capsys: pytest.CaptureFixture[str]) -> None:
    assert mutate.main(["--list", "--only", "temperature.c", "--sample", "5"]) == 0
    out = capsys.readouterr().out
    assert "5 mutants of" in out and "temperature.c" in out
    _need_cc()
    rep = tmp_path / "r.json"
    assert mutate.main(["--only", "inputs.c", "--ops", "status", "--sample", "2",
                        "--quiet", "--report", str(rep), "--workdir", str(tmp_path)]) == 0
    data = json.loads(rep.read_text())
    assert data["summary"]["overall"]["total"] == 2
    assert data["note"].endswith("not certified flight software.")


def test_a_selection_without_mutants_is_refused(capsys: pytest.CaptureFixture[str]) -> None:
    # temperature.c returns no status of its own (inputs.c does): nothing to mutate
    with pytest.raises(SystemExit) as exc:
        mutate.main(["--only", "temperature.c", "--ops", "status", "--list"])
    assert exc.value.code == 2
    assert "no mutants of operators status in temperature.c" in capsys.readouterr().err


def test_a_raised_range_end_behind_a_derived_check_is_equivalent_and_a_lowered_one_not() -> None:
    ms = mutate.all_mutants(ROOT)
    cas_hi = [m for m in ms if m.macro == "AD_CAS_LIMIT_HI" and m.operator == "const"]
    assert cas_hi
    for m in cas_hi:
        reason = mutate._shadowed(m)
        old = mutate.parse_float_literal(m.original)[0]
        new = mutate.parse_float_literal(m.replacement)[0]
        # 4000 m/s raised: still above 10 a0 = 3402.9 m/s, every value beyond is refused
        assert (reason is not None) == (new > old), m.id
    # A made-up mutant lowering the end below 10 a0 would change results: not shadowed.
    low = mutate.Mutant(**{**cas_hi[0].__dict__, "replacement": "0x1.9p+11"})  # 3200
    assert mutate._shadowed(low) is None
    # An end that no derived check shadows is never classified this way.
    elev = next(m for m in ms if m.macro == "AD_ELEVATION_HI" and m.operator == "const")
    assert mutate._shadowed(elev) is None


def test_the_switch_probe_sees_cases_inside_a_moved_interval_and_none_outside(
        tmp_path: Path) -> None:
    _need_cc()
    ms = mutate.all_mutants(ROOT)
    # AD_TINY_MACH (2^-40) lowered by 5e-6 relative by the firmware rounding: the seam
    # window puts cases at 1e-6 relative below 2^-40, inside the moved interval.
    tiny = next(m for m in ms if m.macro == "AD_TINY_MACH" and m.detail == "firmware")
    # The same switch moved by a made-up 1e-30 relative: no case lies that close.
    near = mutate.Mutant(**{**tiny.__dict__,
                            "replacement": float.hex(2.0**-40 * (1 - 2.0**-52))})
    b = mutate.Builder(ROOT, tmp_path, mutate.compiler(), ["icao-binary64"], 60.0)
    b.prepare(1)
    assert mutate.probe_switch(b, tiny) == ["icao-binary64"]
    assert mutate.probe_switch(b, near) == []


def test_sh_of_a_gradient_layer_is_dead_data_and_of_an_isothermal_layer_not() -> None:
    # sh = -R Tb/g0 (row entry 8) is read only in isothermal layers (altimetry.c); a
    # row's last entry is its gradient flag: layer 0 is a gradient layer, layer 1 not.
    ms = mutate.all_mutants(ROOT)
    source = (ROOT / "bindings/c/src/ad_constants.h").read_text()
    for macro, want in (("AD_LAYER_0", "equivalent"), ("AD_LAYER_1", "unclassified")):
        m = next(m for m in ms if m.macro == macro and m.layer_index == 8 and m.detail == "d4"
                 and m.configs == ["icao-binary64"])
        mutate.classify(None, m, source)
        assert m.classification == want, (macro, m.reason)
