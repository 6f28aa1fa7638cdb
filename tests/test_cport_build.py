"""The C port as C: generated constants, warnings, static analysis, memory safety.

Tools that may be missing (cppcheck, valgrind, a compiler with sanitizers) skip with a
message, unless AIRDATA_REQUIRE_TOOLCHAINS=1, which turns the skip into a failure.
"""

from __future__ import annotations

import math
import subprocess
from fractions import Fraction
from pathlib import Path

import mpmath
import pytest
from toolchains import load_script, need

ROOT = Path(__file__).resolve().parents[1]
C_DIR = ROOT / "bindings" / "c"
SRC = sorted((C_DIR / "src").glob("*.c"))
DRIVER = C_DIR / "tests" / "driver.c"
WARN = ["-std=c99", "-Wall", "-Wextra", "-Wpedantic", "-Wconversion", "-Wdouble-promotion",
        "-Wshadow", "-Werror", "-O2", "-ffp-contract=off"]  # dd.c needs no contraction
INC = [f"-I{C_DIR / 'include'}", f"-I{C_DIR / 'src'}"]
PRECISIONS = {"double": [], "single": ["-DAIRDATA_SINGLE"]}
PROFILES = {"icao": [], "us1976": ["-DAIRDATA_PROFILE_US1976"]}


def _gen():  # noqa: ANN202 - module object
    return load_script(C_DIR / "tools" / "gen_constants.py", "gen_constants")


def run(cmd: list[str], cwd: Path | None = None) -> subprocess.CompletedProcess[str]:
    return subprocess.run(cmd, cwd=cwd, capture_output=True, text=True, timeout=120,
                          check=False)


def _generate():  # noqa: ANN202 - module object
    return load_script(C_DIR / "tools" / "generate.py", "generate")


def test_generated_constants_header_is_current() -> None:
    text = _gen().render()
    current = (C_DIR / "src" / "ad_constants.h").read_text()
    assert current == text, "run python bindings/c/tools/generate.py"


def test_every_generated_file_is_current_and_says_so() -> None:
    # One staleness test over every file generated from the function and domain tables.
    gen = _generate()
    files = gen.outputs()
    assert {p.name for p in files} == {"ad_constants.h", "airdata_batch.h", "batch.c",
                                       "domains.c", "ad_runner_functions.h"}
    for path, text in files.items():
        assert path.read_text() == text, f"{path.name} is stale: run generate.py"
        assert "GENERATED" in "".join(text.splitlines(True)[:5]), path.name
    assert gen.main(["--check"]) == 0


def test_the_generated_tables_follow_the_python_tables() -> None:
    # The enum ids are the positions in airdata._domains.C_DOMAINS, which airdata.cport
    # reads too; every catalogue function has one batch prototype, arguments in C order.
    import re

    from airdata import _domains, cport
    from airdata.vectors.catalogue import CATALOGUE

    header = (C_DIR / "include" / "airdata_batch.h").read_text()
    ids = {m[1].lower(): int(m[2]) for m in re.finditer(r"AD_DOM_(\w+) = (\d+)", header)}
    assert ids == {name: i for i, (name, _) in enumerate(_domains.C_DOMAINS)}
    assert {k: v[0] for k, v in cport._DOMAINS.items()} == ids
    for spec in CATALOGUE:
        m = re.search(rf"size_t ad_{spec.name}_n\((.*?)\);", header, re.S)
        assert m, spec.name
        names = re.findall(r"(\w+)(?:,|$)", " ".join(m[1].split()))
        assert names[:len(spec.args)] == [a.name for a in spec.args], spec.name


def test_a_changed_table_changes_the_generated_files(monkeypatch: pytest.MonkeyPatch) -> None:
    # Control: the generator reads the tables (swapping two domains renumbers the enum
    # and reorders the rows of domains.c).
    from airdata import _domains

    gen = _generate()
    table = list(_domains.C_DOMAINS)
    table[0], table[1] = table[1], table[0]
    monkeypatch.setattr(_domains, "C_DOMAINS", tuple(table))
    files = {p.name: t for p, t in gen.outputs().items()}
    assert "AD_DOM_SPEED = 0" in files["airdata_batch.h"]
    assert files["domains.c"] != (C_DIR / "src" / "domains.c").read_text()


@pytest.mark.parametrize("text", ["0.2", "1.2", "7.2", "0.15", "287.05287", "1.458e-6",
                                  "110.4", "6356766", "-0.0065", "0.0028", "9.80665"])
def test_binary32_rounding_matches_mpmath(text: str) -> None:
    # mpmath at 24-bit precision rounds to nearest: an independent oracle.
    gen = _gen()
    with mpmath.workprec(24):
        want = float(+mpmath.mpf(text))
    assert gen.round_binary(Fraction(text), 24) == want
    assert gen.round_binary(Fraction(text), 53) == float(text)  # Python's float() rounds correctly


def _literal(name: str, single: bool) -> float:
    """Value of a #define of the ICAO block of the generated header."""
    text = (C_DIR / "src" / "ad_constants.h").read_text()
    icao = text.split("#else /* ICAO")[1]
    block = icao.split("#else")[0] if single else icao.split("#else")[1]
    for line in block.splitlines():
        parts = line.split()
        if len(parts) >= 3 and parts[0] == "#define" and parts[1] == name:
            return float.fromhex(parts[2].strip("()").rstrip("f"))
    raise KeyError(name)


@pytest.mark.parametrize(("name", "expr"), [
    # exact definitions evaluated by mpmath at 60 digits (NACA Report 1135 eq. 44/100
    # with gamma = 1.4; ICAO Doc 7488 R = 287.05287, T0 = 288.15 K, from memory)
    ("AD_RATIO_SONIC", lambda: mpmath.mpf("1.2") ** mpmath.mpf("3.5") - 1),
    ("AD_RATIO_MAX", lambda: 120 * (mpmath.mpf(720) / 699) ** mpmath.mpf("2.5") - 1),
    ("AD_PHI_INF", lambda: (7 / mpmath.mpf("7.2")) ** mpmath.mpf("2.5")),
    ("AD_A0", lambda: mpmath.sqrt(mpmath.mpf("1.4") * mpmath.mpf("287.05287")
                                  * mpmath.mpf("288.15"))),
])
def test_binary32_constants_correctly_rounded(name: str, expr) -> None:  # noqa: ANN001
    with mpmath.workdps(60):
        exact = expr()
    with mpmath.workprec(24):
        want = float(+exact)
    assert _literal(name, single=True) == want


def test_binary64_constants_are_the_references() -> None:
    import airdata.pitot as pit  # noqa: PLC0415

    assert _literal("AD_RATIO_MAX", single=False) == pit.RATIO_MAX
    assert _literal("AD_RATIO_SONIC", single=False) == pit.RATIO_SONIC


def _layer_rows(single: bool) -> list[list[float]]:
    """The AD_LAYER_i initialisers of the ICAO block, as numbers (gradient dropped)."""
    text = (C_DIR / "src" / "ad_constants.h").read_text()
    icao = text.split("#else /* ICAO")[1]
    block = icao.split("#else")[0] if single else icao.split("#else")[1]
    rows = []
    for line in block.splitlines():
        if line.startswith("#define AD_LAYER_") and "{" in line:
            fields = line.split("{")[1].split("}")[0].split(",")
            rows.append([float.fromhex(f.strip().strip("()").rstrip("f")) for f in fields[:-1]])
    assert len(rows) == 7
    return rows


def _icao_base_pressures() -> list[mpmath.mpf]:
    """Layer base pressures from the ICAO defining constants, by mpmath at 50 digits.

    ICAO Doc 7488/3: p0 = 101325 Pa, T0 = 288.15 K, g0 = 9.80665 m/s2,
    R = 287.05287 J/(kg K), layer bases and lapse rates of the 1993 table (from
    memory); barometric equation per layer (gradient: power law, isothermal: exp).
    """
    g0, r = mpmath.mpf("9.80665"), mpmath.mpf("287.05287")
    hb = [0, 11000, 20000, 32000, 47000, 51000, 71000]
    lapse = ["-0.0065", "0", "0.001", "0.0028", "0", "-0.0028", "-0.002"]
    t, p = mpmath.mpf("288.15"), mpmath.mpf(101325)
    out = [p]
    for i in range(6):
        lap, dh = mpmath.mpf(lapse[i]), hb[i + 1] - hb[i]
        t1 = t + lap * dh
        p = p * (t1 / t) ** (-g0 / (r * lap)) if lap else p * mpmath.exp(-g0 * dh / (r * t))
        out.append(p)
        t = t1
    return out


@pytest.mark.parametrize("single", [False, True], ids=["binary64", "binary32"])
def test_double_double_low_parts_from_the_exact_constants(single: bool) -> None:
    # hi + lo must be the exact constant to within half an ulp of lo (lo = nearest(x -
    # hi)); exact values: ICAO Doc 7488/3 R = 287.05287 and Sutherland beta = 1.458e-6
    # (from memory), T_b and L_b of the layer table, base pressures by mpmath.
    bits = 24 if single else 53
    rows = _layer_rows(single)
    temps = ["288.15", "216.65", "216.65", "228.65", "270.65", "270.65", "214.65"]
    lapse = ["-0.0065", "0", "0.001", "0.0028", "0", "-0.0028", "-0.002"]
    with mpmath.workdps(50):
        cases = [(_literal("AD_R", single), _literal("AD_R_LO", single),
                  mpmath.mpf("287.05287")),
                 (_literal("AD_SUTH_BETA", single), _literal("AD_SUTH_BETA_LO", single),
                  mpmath.mpf("1.458e-6"))]
        for i, pb in enumerate(_icao_base_pressures()):
            row = rows[i]  # hb, lapse, tb, pb, m, k, c, n, sh, rho_b, kd, tb_lo, lapse_lo, pb_lo
            cases += [(row[2], row[11], mpmath.mpf(temps[i])),
                      (row[1], row[12], mpmath.mpf(lapse[i])), (row[3], row[13], pb)]
        for hi, lo, x in cases:
            rest = x - mpmath.mpf(hi)
            ulp = math.ldexp(1.0, math.frexp(hi)[1] - bits) if hi else 0.0
            assert abs(lo) <= ulp / 2
            if rest == 0:
                assert lo == 0
                continue
            # lo is rest rounded to the precision: within half an ulp of lo
            assert abs(mpmath.mpf(lo) - rest) <= abs(rest) * 2.0**-bits, (hi, lo, x)


def test_binary64_low_parts_are_the_references() -> None:
    from airdata._layers import dd_tables, layer_table  # noqa: PLC0415
    from airdata.profiles import ICAO  # noqa: PLC0415

    t, d = layer_table(ICAO), dd_tables(ICAO)
    rows = _layer_rows(False)
    assert [r[13] for r in rows] == list(t.pb_lo)
    assert [r[11] for r in rows] == list(d.tb[1])
    assert [r[12] for r in rows] == list(d.lapse[1])
    assert _literal("AD_R_LO", False) == d.r_gas[1]
    assert _literal("AD_SUTH_BETA_LO", False) == d.beta[1]


def test_derived_limits() -> None:
    # binary64: the reference's widened limits; binary32: RATIO_MAX (NACA Report 1135
    # eq. 100 at M = 10, by mpmath) times 1 + 8 2^-52, rounded to binary32, and 10.
    import airdata.pitot as pit  # noqa: PLC0415

    assert _literal("AD_RATIO_LIMIT", False) == pit.RATIO_LIMIT
    assert _literal("AD_MACH_LIMIT", False) == pit.MACH_LIMIT
    assert _literal("AD_MACH_LIMIT", False) > 10.0
    with mpmath.workdps(60):
        ratio = 120 * (mpmath.mpf(720) / 699) ** mpmath.mpf("2.5") - 1
        ratio *= 1 + 8 * mpmath.mpf(2) ** -52
    with mpmath.workprec(24):
        assert _literal("AD_RATIO_LIMIT", True) == float(+ratio)
    assert _literal("AD_MACH_LIMIT", True) == 10.0


@pytest.mark.parametrize("profile", list(PROFILES))
@pytest.mark.parametrize("precision", list(PRECISIONS))
def test_port_compiles_without_warnings(precision: str, profile: str, tmp_path: Path) -> None:
    gcc = need("gcc")
    flags = WARN + INC + PRECISIONS[precision] + PROFILES[profile]
    res = run([gcc, *flags, "-c", *map(str, SRC), str(DRIVER)], cwd=tmp_path)
    assert res.returncode == 0, res.stderr
    assert res.stderr == ""


def test_single_build_calls_only_float_libm(tmp_path: Path) -> None:
    # No double libm function may appear in the binary32 objects.
    gcc = need("gcc")
    nm = need("nm")
    res = run([gcc, *WARN, *INC, "-DAIRDATA_SINGLE", "-c", *map(str, SRC)], cwd=tmp_path)
    assert res.returncode == 0, res.stderr
    undefined = run([nm, "-u", *[p.name for p in tmp_path.glob("*.o")]], cwd=tmp_path).stdout
    symbols = {line.split()[-1] for line in undefined.splitlines() if line.strip()
               and not line.endswith(":")}
    for fn in ("exp", "log", "log1p", "expm1", "sqrt"):
        assert fn not in symbols
    assert symbols & {"expf", "logf", "log1pf", "expm1f"}


@pytest.mark.parametrize("precision", list(PRECISIONS))
def test_cppcheck_clean(precision: str) -> None:
    cppcheck = need("cppcheck")
    res = run([cppcheck, "--enable=warning,style,performance,portability",
               "--error-exitcode=1", "--std=c99", "-q", "--inline-suppr", *INC,
               *PRECISIONS[precision], str(C_DIR / "src"), str(DRIVER)])
    assert res.returncode == 0, res.stderr + res.stdout
    assert res.stderr.strip() == ""


def _build_driver(tmp_path: Path, precision: str, extra: list[str]) -> Path:
    gcc = need("gcc")
    exe = tmp_path / f"driver_{precision}"
    res = run([gcc, *WARN[:-1], "-g", *extra, *INC, *PRECISIONS[precision],
               *map(str, SRC), str(DRIVER), "-lm", "-o", str(exe)])
    assert res.returncode == 0, res.stderr
    return exe


@pytest.mark.parametrize("precision", list(PRECISIONS))
def test_driver_under_address_and_undefined_sanitizers(precision: str, tmp_path: Path) -> None:
    san = ["-O1", "-fsanitize=address,undefined", "-fno-sanitize-recover=all",
           "-fno-omit-frame-pointer", "-DAIRDATA_DEBUG_ASSERT"]  # the port's assertions on
    exe = _build_driver(tmp_path, precision, san)
    res = run([str(exe)])
    assert res.returncode == 0, res.stdout + res.stderr
    assert "PASS: 0 failure(s)" in res.stdout
    assert "runtime error" not in res.stderr


@pytest.mark.parametrize("precision", list(PRECISIONS))
def test_driver_under_valgrind_memcheck(precision: str, tmp_path: Path) -> None:
    valgrind = need("valgrind")
    exe = _build_driver(tmp_path, precision, ["-O0"])
    res = run([valgrind, "-q", "--error-exitcode=9", "--leak-check=full", str(exe)])
    assert res.returncode == 0, res.stdout + res.stderr
    assert "PASS: 0 failure(s)" in res.stdout


# ---------------------------------------------------------------- debug-only assertions

def test_ad_assert_checks_only_in_a_debug_build(tmp_path: Path) -> None:
    # AD_ASSERT (ad_internal.h): with -DAIRDATA_DEBUG_ASSERT a false invariant stops the
    # program (assert: SIGABRT); in a release build it compiles to nothing.
    gcc = need("gcc")
    src = tmp_path / "a.c"
    src.write_text('#include "ad_internal.h"\nint main(void)\n{\n    AD_ASSERT(1 == 2);\n'
                   "    return 0;\n}\n")
    for define, ok in (([], True), (["-DAIRDATA_DEBUG_ASSERT"], False)):
        exe = tmp_path / f"a{len(define)}"
        res = run([gcc, *WARN, *define, *INC, str(src), "-o", str(exe)])
        assert res.returncode == 0, res.stderr
        r = run([str(exe)])
        assert (r.returncode == 0) == ok, (define, r.returncode, r.stderr)
        if not ok:
            assert "1 == 2" in r.stderr and r.returncode != 0


@pytest.mark.parametrize("precision", list(PRECISIONS))
def test_every_vector_passes_with_the_assertions_on(precision: str, tmp_path: Path) -> None:
    # The invariants the port states (the solver's iterates within [1, u_max], the layer
    # step |m dh| < 0.25) hold on every case of the suite: the
    # vector runner built with -DAIRDATA_DEBUG_ASSERT passes, in both precisions.
    gcc = need("gcc")
    exe = tmp_path / "runner"
    res = run([gcc, *WARN, "-DAIRDATA_DEBUG_ASSERT", *PRECISIONS[precision], *INC,
               f"-I{C_DIR.parents[1] / 'vectors' / 'c'}", str(C_DIR / "runner" /
                                                           "ad_vector_runner.c"),
               *map(str, SRC), "-lm", "-o", str(exe)])
    assert res.returncode == 0, res.stderr
    r = run([str(exe)])
    assert r.returncode == 0 and r.stdout.rstrip().endswith("30 functions: all passed"), \
        r.stdout[-2000:] + r.stderr[-2000:]
