"""``airdata port check``: the judging rule, the bundled port in both precisions, user
sources and libraries, reports, and clear errors for bad suites and broken ports."""

from __future__ import annotations

import json
import shutil
import subprocess
from pathlib import Path

import numpy as np
import pytest
from toolchains import host_cc, host_compiler  # noqa: F401 - host_compiler: a fixture

from airdata.cli import main
from airdata.portcheck import verdict
from airdata.portcheck.build import build_port, bundled_port
from airdata.portcheck.compare import judge
from airdata.portcheck.suite import FunctionCases, LoadedSuite, SuiteError, load_cases

ROOT = Path(__file__).resolve().parents[1]
VECTORS = ROOT / "vectors"
needs_cc = pytest.mark.usefixtures("host_compiler")


@pytest.fixture(scope="session")
def suite() -> LoadedSuite:
    return load_cases(VECTORS)


# --- the rule, on hand-made cases -------------------------------------------------

def _cases(expected: list[float], scale: list[float], status: list[int],
           b32: list[int]) -> FunctionCases:
    n = len(expected)
    return FunctionCases("f", "ad_f", [("x", "real")], ["y"], [f"c{i}" for i in range(n)],
                         np.arange(n, dtype=float)[:, None], np.array(expected)[:, None],
                         np.array(scale)[:, None], np.array(status), np.array(b32))


def test_judge_accepts_within_the_bound_and_refuses_beyond_it() -> None:
    # Bound k * eps * scale with k = 8, eps = 2**-52, scale = 2: 2**-48 (the suite's rule).
    fc = _cases([1.0, 1.0, 1.0], [2.0, 2.0, 2.0], [0, 0, 0], [0, 0, 0])
    y = np.array([[1.0 + 2.0 ** -48], [1.0 + 2.0 ** -47], [1.0 - 2.0 ** -49]])
    r = judge(fc, "double", y, np.array([0, 0, 0]), 8.0, 2.0 ** -52)
    assert (r.passed, r.failed, r.value_failures) == (2, 1, 1)
    assert r.worst == pytest.approx(2.0) and r.worst_id == "c1"
    assert r.failures[0].case_id == "c1" and "of the bound" in r.failures[0].reasons[0]


def test_judge_nan_and_status_rules() -> None:
    nan = float("nan")
    fc = _cases([nan, 1.0, nan, 1.0], [nan, 1.0, nan, 1.0], [1, 0, 2, 0], [0, 0, 0, 0])
    y = np.array([[nan], [nan], [nan], [1.0]])
    st = np.array([1, 0, 1, 0])
    r = judge(fc, "double", y, st, 8.0, 2.0 ** -52)
    # c0 passes (NaN expected, NaN got, same status); c1 NaN where a number is expected;
    # c2 wrong status; c3 passes.
    assert (r.passed, r.failed, r.nan_mismatches, r.status_mismatches) == (2, 2, 1, 1)
    assert [f.case_id for f in r.failures] == ["c1", "c2"]
    assert "OUT_OF_RANGE" in r.failures[1].reasons[0]


def test_judge_binary32_levels() -> None:
    nan = float("nan")
    # full / lenient / skip, as the vectors' binary32_check says (airdata/vectors/scale.py)
    fc = _cases([1.0, 1.0, 1.0, 1.0], [1.0, 1.0, 1.0, 1.0], [0, 0, 0, 0], [0, 1, 2, 1])
    y = np.array([[nan], [nan], [5.0], [2.0]])
    st = np.array([2, 2, 2, 0])
    single = judge(fc, "single", y, st, 8.0, 2.0 ** -23)
    # c0 full: fails; c1 lenient: status and NaN ignored; c2 skipped; c3 lenient but a
    # number far outside the bound: fails.
    assert (single.skipped, single.lenient, single.passed, single.failed) == (1, 2, 1, 2)
    assert [f.case_id for f in single.failures] == ["c0", "c3"]
    double = judge(fc, "double", y, st, 8.0, 2.0 ** -52)
    assert (double.skipped, double.failed) == (0, 4)


# --- the bundled port ---------------------------------------------------------------

@pytest.fixture(scope="session")
def bundled_results(suite: LoadedSuite) -> dict[str, verdict.Report]:
    out = {}
    for precision in ("double", "single"):
        port = build_port(bundled_port(), list(suite.functions.values()), precision)
        try:
            raw = {fc.name: port.run(fc) for fc in suite.functions.values()}
        finally:
            port.close()
        out[precision] = verdict.judge(suite, raw, precision)
    return out


@needs_cc
@pytest.mark.parametrize("precision", ["double", "single"])
def test_bundled_port_passes_every_vector(suite: LoadedSuite, bundled_results: dict,
                                          precision: str) -> None:
    manifest = json.loads((VECTORS / "manifest.json").read_text())
    counts = {e["function"]: e["valid"] + e["invalid"] for e in manifest["functions"]}
    rows = bundled_results[precision].functions
    assert [r.function for r in rows] == list(counts)
    for r in rows:
        assert r.cases == counts[r.function]
        assert r.implemented and r.verdict == "pass"
        assert r.ok, (r.function, precision, [f.reasons for f in r.failures[:3]])
        assert r.reference is not None and r.reference.worst <= 1.0
    if precision == "single":
        assert sum(r.skipped for r in rows) < sum(counts.values()) // 20


# --- the command --------------------------------------------------------------------

def _tas_port(tmp: Path, gas_constant: str) -> Path:
    """A one-function port: TAS = M sqrt(gamma R T) with its own domain checks."""
    src = tmp / "tas_port.c"
    src.write_text(f"""
#include <math.h>
#include "airdata.h"
ad_status ad_tas_from_mach(ad_real mach, ad_real sat, ad_real *tas)
{{
    if (tas == 0) {{ return AD_INVALID_INPUT; }}
    if (!isfinite(mach) || mach < 0) {{ *tas = (ad_real)NAN; return AD_INVALID_INPUT; }}
    if (mach > 10) {{ *tas = (ad_real)NAN; return AD_OUT_OF_RANGE; }}
    if (!isfinite(sat) || sat <= 0) {{ *tas = (ad_real)NAN; return AD_INVALID_INPUT; }}
    if (sat < 50 || sat > 5000) {{ *tas = (ad_real)NAN; return AD_OUT_OF_RANGE; }}
    *tas = mach * (ad_real)sqrt(1.4 * {gas_constant} * (double)sat);
    return AD_OK;
}}
""")
    return src


@needs_cc
def test_user_source_passes_and_a_wrong_gas_constant_fails(tmp_path: Path,
                                                            capsys: pytest.CaptureFixture[str]
                                                            ) -> None:
    # R = 287.05287 J/(kg K): ICAO Doc 7488 (from memory); the defect changes its 6th digit.
    good = _tas_port(tmp_path, "287.05287")
    report = tmp_path / "good.json"
    rc = main(["port", "check", "--suite", str(VECTORS), "--precision", "double",
               "--only", "tas_from_mach", "--source", str(good), "--report", str(report)])
    out = capsys.readouterr().out
    assert rc == 0, out
    doc = json.loads(report.read_text())
    assert doc["passed"] is True
    row = doc["precisions"]["binary64"][0]
    assert row["function"] == "tas_from_mach" and row["failed"] == 0
    assert row["passed"] == row["cases"] > 900
    bad = _tas_port(tmp_path, "287.05387")
    report = tmp_path / "bad.json"
    rc = main(["port", "check", "--suite", str(VECTORS), "--precision", "double",
               "--only", "tas_from_mach", "--source", str(bad), "--report", str(report)])
    out = capsys.readouterr().out
    assert rc == 1
    assert "FAIL: 1 function check(s) failed: tas_from_mach (binary64)" in out
    doc = json.loads(report.read_text())
    row = doc["precisions"]["binary64"][0]
    assert doc["passed"] is False and row["value_failures"] > 800
    assert row["worst_in_bounds"] > 1000  # 3.5e-6 relative against ~1e-15
    assert row["failures"][0]["inputs"].keys() == {"mach", "sat"}


@needs_cc
def test_library_of_the_bundled_port(tmp_path: Path, capsys: pytest.CaptureFixture[str]
                                     ) -> None:
    port = bundled_port()
    objs = []
    for s in port.sources:
        o = tmp_path / (s.stem + ".o")
        r = subprocess.run([host_cc(), "-std=c99", "-O2", "-fPIC", "-ffp-contract=off",
                            f"-I{ROOT / 'bindings/c/include'}", f"-I{s.parent}", "-c", str(s),
                            "-o", str(o)], capture_output=True, text=True, timeout=120)
        assert r.returncode == 0, r.stderr
        objs.append(str(o))
    lib = tmp_path / "libadport.a"
    subprocess.run(["ar", "rcs", str(lib), *objs], check=True, timeout=60)
    rc = main(["port", "check", "--suite", str(VECTORS), "--library", str(lib),
               "--only", "pressure_altitude", "air_data"])
    out = capsys.readouterr().out
    assert rc == 0 and "PASS" in out and "[binary64]" in out and "[binary32]" not in out
    rc = main(["port", "check", "--suite", str(VECTORS), "--library", str(lib),
               "--precision", "both"])
    assert rc == 2 and "one precision" in capsys.readouterr().err


@needs_cc
def test_compile_error_shows_the_compiler_message(tmp_path: Path,
                                                  capsys: pytest.CaptureFixture[str]) -> None:
    src = tmp_path / "broken.c"
    src.write_text('#include "airdata.h"\n'
                   "ad_status ad_pressure_altitude(ad_real ps, ad_real *h)\n"
                   "{ *h = ps; return no_such_status; }\n")
    rc = main(["port", "check", "--suite", str(VECTORS), "--source", str(src),
               "--only", "pressure_altitude", "--precision", "double"])
    err = capsys.readouterr().err
    assert rc == 2
    assert "failed to compile" in err and "no_such_status" in err and "broken.c:3" in err


@needs_cc
def test_missing_function_is_named(tmp_path: Path, capsys: pytest.CaptureFixture[str]) -> None:
    src = tmp_path / "partial.c"
    src.write_text('#include "airdata.h"\n'
                   "ad_status ad_pressure_altitude(ad_real ps, ad_real *h)\n"
                   "{ *h = ps; return AD_OK; }\n")
    rc = main(["port", "check", "--suite", str(VECTORS), "--source", str(src),
               "--only", "pressure_altitude", "geometric_altitude", "--precision", "double"])
    err = capsys.readouterr().err
    assert rc == 2 and "does not define ad_geometric_altitude" in err


def test_missing_suite(tmp_path: Path, capsys: pytest.CaptureFixture[str]) -> None:
    rc = main(["port", "check", "--suite", str(tmp_path / "nowhere")])
    assert rc == 2 and "no vector suite here" in capsys.readouterr().err


def test_tampered_suite_is_refused(tmp_path: Path, capsys: pytest.CaptureFixture[str]) -> None:
    copy = tmp_path / "vectors"
    copy.mkdir()
    shutil.copy(VECTORS / "manifest.json", copy / "manifest.json")
    (copy / "functions").mkdir()
    text = (VECTORS / "functions" / "tas_from_mach.json").read_text()
    (copy / "functions" / "tas_from_mach.json").write_text(text.replace('"status":0',
                                                                        '"status":1', 1))
    with pytest.raises(SuiteError, match="checksum mismatch"):
        load_cases(copy, ["tas_from_mach"])
    rc = main(["port", "check", "--suite", str(copy), "--only", "tas_from_mach"])
    assert rc == 2 and "checksum mismatch" in capsys.readouterr().err
    rc = main(["port", "check", "--suite", str(copy), "--only", "no_such_function"])
    assert rc == 2 and "not in the suite" in capsys.readouterr().err


def test_unknown_precision_is_a_usage_error() -> None:
    with pytest.raises(SystemExit):
        main(["port", "check", "--precision", "quad"])
