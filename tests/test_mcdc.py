"""MC/DC, branch, line and region coverage of the bundled C port under clang 19.

Beside tests/test_coverage.py (gcov, lines and branches), this measures modified
condition/decision coverage, which GCC 12 cannot: the vector runner
(bindings/c/runner/ad_vector_runner.c) and the port (bindings/c/src/*.c) are built with
``clang-19 -std=c99 -O0 -ffp-contract=off -fprofile-instr-generate -fcoverage-mapping
-fcoverage-mcdc``, once in binary64 and once in binary32, each build runs the whole suite,
the profiles are merged with ``llvm-profdata-19 merge`` and read with ``llvm-cov-19 export``
(JSON; the text report of ``llvm-cov-19 report --show-mcdc-summary`` is checked to agree).
The vectors alone (with the runner's NULL-pointer, batch and ad_check_n checks) must give
100 % of regions, lines, branches and MC/DC conditions with both builds together.  Per
precision the figures are printed and what is missed is listed by file:line.

MC/DC as defined for DO-178C (RTCA DO-178C, glossary; clang's -fcoverage-mcdc measures
the unique-cause/masking form of the condition pairs, clang documentation "Source-based
code coverage").  The same measurement for a user's own port: ``airdata port coverage``
(it links the same runner with the port; checked below to give this module's figures on
the bundled port).

A missing clang 19 skips with the packages to install; with AIRDATA_REQUIRE_TOOLCHAINS=1
(set by .ci/run) it fails instead.
"""

from __future__ import annotations

import json
import os
import re
import shutil
import subprocess
from pathlib import Path

import pytest
import toolchains

import airdata.resources
from airdata.portcheck.coverage import (
    MCDC_FLAGS,
    CoverageError,
    Figures,
    Toolchain,
    coverage_of_sources,
    find_toolchain,
    measure,
    merge_profiles,
)

ROOT = Path(__file__).resolve().parents[1]
C_DIR = ROOT / "bindings" / "c"
PORT = sorted((C_DIR / "src").glob("*.c"))
RUNNER = C_DIR / "runner" / "ad_vector_runner.c"
VECTORS_C = ROOT / "vectors" / "c"
PRECISIONS = {"binary64": [], "binary32": ["-DAIRDATA_SINGLE"]}


def toolchain() -> Toolchain:
    """clang-19, llvm-profdata-19, llvm-cov-19; skip, or fail under
    AIRDATA_REQUIRE_TOOLCHAINS=1, when one is missing."""
    try:
        return find_toolchain(19)
    except CoverageError as exc:
        toolchains.missing(str(exc))


@pytest.fixture(scope="module")
def runs(tmp_path_factory: pytest.TempPathFactory) -> dict[str, object]:
    """Instrumented runner per precision: its binary, raw profile and Figures, and the
    merged 'both' Figures."""
    tools = toolchain()
    tmp = tmp_path_factory.mktemp("mcdc")
    out: dict[str, object] = {"tools": tools}
    exes, raws = [], []
    for name, extra in PRECISIONS.items():
        exe = tmp / f"runner_{name}"
        r = subprocess.run([tools.clang, *MCDC_FLAGS, *extra, f"-I{C_DIR / 'include'}",
                            f"-I{VECTORS_C}", str(RUNNER), *map(str, PORT), "-lm", "-o",
                            str(exe)], capture_output=True, text=True, timeout=600)
        assert r.returncode == 0, r.stderr[-3000:]
        raw = tmp / f"{name}.profraw"
        run = subprocess.run([str(exe)], cwd=tmp, capture_output=True, text=True,
                             timeout=600, env=dict(os.environ, LLVM_PROFILE_FILE=str(raw)))
        assert run.returncode == 0, run.stdout[-3000:]
        assert run.stdout.rstrip().endswith("30 functions: all passed")
        prof = merge_profiles(tools, [raw], tmp / f"{name}.profdata")
        out[name] = measure(tools, [exe], prof, PORT)
        exes.append(exe)
        raws.append(raw)
    prof = merge_profiles(tools, raws, tmp / "both.profdata")
    out["both"] = measure(tools, exes, prof, PORT)
    out["both_profdata"] = prof
    out["exes"] = exes
    for key in (*PRECISIONS, "both"):
        fig = out[key]
        assert isinstance(fig, Figures)
        print(f"\nMC/DC run, vectors alone, {key}: {fig.summary()}")
        for m in fig.missed:
            print(f"  missed ({key}): {m}")
    return out


def test_every_port_source_is_measured(runs: dict) -> None:
    fig = runs["both"]
    assert set(fig.per_file) == {p.name for p in PORT}
    assert fig.totals["mcdc"][1] >= 100  # 163 conditions measured on suite 1.0.0


def test_json_figures_agree_with_the_text_report(runs: dict) -> None:
    # Two readings of one merged profile: export JSON (parsed) and the TOTAL row of
    # `llvm-cov report --show-mcdc-summary` (regions, functions, lines, branches, MC/DC).
    tools, exes = runs["tools"], runs["exes"]
    r = subprocess.run([tools.cov, "report", "--show-mcdc-summary", str(exes[0]), "-object",
                        str(exes[1]), f"-instr-profile={runs['both_profdata']}",
                        *map(str, PORT)], capture_output=True, text=True, timeout=300)
    assert r.returncode == 0, r.stderr
    total = next(ln for ln in r.stdout.splitlines() if ln.startswith("TOTAL")).split()
    nums = [int(x) for x in total[1:] if re.fullmatch(r"\d+", x)]
    fig = runs["both"]
    regions, _, lines, _, branches, _, mcdc, _ = (nums[0], nums[1], nums[4], nums[5],
                                                  nums[6], nums[7], nums[8], nums[9])
    assert regions == fig.totals["regions"][1]
    assert lines == fig.totals["lines"][1]
    assert branches == fig.totals["branches"][1]
    assert mcdc == fig.totals["mcdc"][1]


@pytest.mark.parametrize("kind", ["regions", "lines", "branches", "mcdc"])
def test_vectors_alone_cover_everything_with_both_precisions(runs: dict, kind: str) -> None:
    fig = runs["both"]
    assert fig.percent(kind) == 100.0, fig.missed[:40]


#: Measured on 2026-12-02 (suite 1.0.0, clang 19.1): binary64 alone 100 % of the 163
#: MC/DC conditions, 679/680 branches; binary32 alone 159/163 conditions (97.55 %),
#: 674/680 branches.  Floors a little below, so a lost condition fails.
FLOOR = {"binary64": {"mcdc": 100.0, "branches": 99.8, "lines": 100.0, "regions": 99.9},
         "binary32": {"mcdc": 100.0, "branches": 100.0, "lines": 100.0, "regions": 100.0}}

#: What one precision alone does not reach, and why (checked against the C at that line
#: and the suite's cases; binary32 = the vector inputs rounded to float, as the runner
#: converts them).  binary32 reaches everything: the suite has stall and
#: maximum-operating-speed cases whose inputs are subnormal in binary32 only.  The
#: binary64 miss is not reached by a sweep of 4e6 inputs that reaches it in binary32
#: (test_binary64_never_clamps_in_the_supersonic_solver_sweep; the clamp counts per
#: precision were taken with an instrumented copy of the solver).
NOT_REACHED = {
    "binary64": {
        "pitot.c:54": "ad_at_least's clamp (x < lo) fires only when a Newton step of the "
                      "supersonic solver lands below lo = 1: in binary32 for the 4 "
                      "representable qc/ps within 4 ulp (2.4e-7) above AD_RATIO_SONIC "
                      "(root u = M^2 a few ulp above 1), in binary64 for none of 4e6 "
                      "inputs swept (the 2e6 consecutive doubles above AD_RATIO_SONIC, "
                      "i.e. up to +2.2e-10, and 2e6 spread geometrically up to "
                      "AD_RATIO_MAX); the start value is never below 1 in either",
    },
    # binary32 alone reaches every condition (the suite samples the stall and
    # maximum-operating-speed branches with inputs subnormal in binary32 only).
    "binary32": {},
}


#: Sweep of the supersonic solver through ad_i_mach_from_ratio: the 2e6 representable
#: qc/ps just above AD_RATIO_SONIC, then 2e6 spread geometrically to AD_RATIO_MAX.
_SWEEP = r"""
#include <math.h>
#include "ad_internal.h"
int main(void)
{
    volatile ad_real sink = 0;
    ad_real x = AD_RATIO_SONIC;
    long i;
    for (i = 0; i < 2000000L; ++i) {
#ifdef AIRDATA_SINGLE
        x = nextafterf(x, 1e9f);
#else
        x = nextafter(x, 1e9);
#endif
        sink += ad_i_mach_from_ratio(x);
    }
    for (i = 1; i <= 2000000L; ++i) {
        double t = (double)i / 2000000.0;
        sink += ad_i_mach_from_ratio((ad_real)(AD_RATIO_SONIC
                                               * pow(AD_RATIO_MAX / AD_RATIO_SONIC, t)));
    }
    return sink > 0 ? 0 : 1;
}
"""


def _harness(runs: dict, tmp: Path, name: str, text: str, extra: list[str]) -> Figures:
    tools = runs["tools"]
    src = tmp / f"{name}.c"
    src.write_text(text)
    exe = tmp / name
    r = subprocess.run([tools.clang, *MCDC_FLAGS, *extra, f"-I{C_DIR / 'include'}",
                        f"-I{C_DIR / 'src'}", str(src), *map(str, PORT), "-lm", "-o",
                        str(exe)], capture_output=True, text=True, timeout=600)
    assert r.returncode == 0, r.stderr[-3000:]
    raw = tmp / f"{name}.profraw"
    run = subprocess.run([str(exe)], capture_output=True, text=True, timeout=600,
                         env=dict(os.environ, LLVM_PROFILE_FILE=str(raw)))
    assert run.returncode == 0, run.returncode
    return measure(tools, [exe], merge_profiles(tools, [raw], tmp / f"{name}.profdata"), PORT)


def test_binary64_never_clamps_in_the_supersonic_solver_sweep(runs: dict,
                                                              tmp_path: Path) -> None:
    # NOT_REACHED["binary64"]["pitot.c:54"]: the clamp is taken in binary32, not in
    # binary64, over the same sweep
    clamp = "pitot.c:54:12: branch: condition never true"
    f64 = _harness(runs, tmp_path, "sweep64", _SWEEP, [])
    f32 = _harness(runs, tmp_path, "sweep32", _SWEEP, ["-DAIRDATA_SINGLE"])
    assert any(m.startswith(clamp) for m in f64.missed)
    assert not any(m.startswith(clamp) for m in f32.missed)


@pytest.mark.parametrize("precision", list(PRECISIONS))
def test_per_precision_floors(runs: dict, precision: str) -> None:
    fig = runs[precision]
    print(f"\n{precision}: {fig.summary()}")
    for kind, floor in FLOOR[precision].items():
        assert fig.percent(kind) >= floor, (kind, fig.missed[:40])


@pytest.mark.parametrize("precision", list(PRECISIONS))
def test_every_miss_of_one_precision_is_known(runs: dict, precision: str) -> None:
    # What one precision misses must be one of the listed places (file:line), and each
    # listed place must still be missed (a vector that reaches it retires its reason)
    fig = runs[precision]
    places = {":".join(m.split(":")[:2]) for m in fig.missed}
    assert places == set(NOT_REACHED[precision]), sorted(places ^ set(NOT_REACHED[precision]))


@pytest.mark.parametrize("precision", list(PRECISIONS))
def test_one_precision_alone_covers_every_mcdc_condition(runs: dict, precision: str) -> None:
    fig = runs[precision]
    assert fig.percent("mcdc") == 100.0, [m for m in fig.missed if "MC/DC" in m]


@pytest.mark.parametrize("precision", [
    pytest.param("binary64", marks=pytest.mark.xfail(
        strict=True, reason="binary64 alone: " + NOT_REACHED["binary64"]["pitot.c:54"])),
    "binary32",
])
def test_one_precision_alone_covers_every_branch(runs: dict, precision: str) -> None:
    fig = runs[precision]
    assert fig.percent("branches") == 100.0, [m for m in fig.missed if "branch" in m]


# --- the user command on a port of its own ------------------------------------------

_USER_PORT = r"""
#include <math.h>
#include <stddef.h>
#include "airdata.h"

/* A user's own TAS from Mach: T in K, a = sqrt(gamma R T).  The last decision has a
 * condition pair (sat > 1e6 && mach > 50) that no vector makes independent. */
ad_status ad_tas_from_mach(ad_real mach, ad_real sat, ad_real *tas)
{
    if (tas == NULL) {
        return AD_INVALID_INPUT;
    }
    if (!(mach >= 0) || !(sat > 0) || (sat > 1e6 && mach > 50)) {
        *tas = NAN;
        return AD_INVALID_INPUT;
    }
    *tas = mach * sqrt((ad_real)1.4 * (ad_real)287.05287 * sat);
    return AD_OK;
}
"""


def test_port_coverage_lists_a_users_unexercised_condition(tmp_path: Path) -> None:
    tools = toolchain()
    src = tmp_path / "my_tas.c"
    src.write_text(_USER_PORT)
    figs = coverage_of_sources([src], ROOT / "vectors", ("double",), only=["tas_from_mach"],
                               workdir=tmp_path / "work", tools=tools)
    fig = figs["double"]
    print("\n" + fig.summary() + "\n" + "\n".join(fig.missed))
    assert set(fig.per_file) == {"my_tas.c"}
    assert fig.percent("mcdc") < 100.0
    line = next(i for i, t in enumerate(_USER_PORT.splitlines(), 1) if "if (!(mach" in t)
    mcdc = [m for m in fig.missed if "MC/DC" in m]
    assert mcdc and all(m.startswith(f"my_tas.c:{line}:") for m in mcdc), fig.missed
    # some of its cases fail (the sat/mach rule is not the reference's), and the runner
    # hands a NULL output pointer only to a function whose cases all pass: the guard is
    # listed as a branch never taken, and the notes say why
    assert any("tas == NULL" in m and "never true" in m for m in fig.missed)
    assert any("NULL rule is applied only" in n for n in fig.notes), fig.notes


def test_port_coverage_of_the_bundled_port_is_the_mcdc_measurement(runs: dict,
                                                                     tmp_path: Path) -> None:
    # `airdata port coverage` on the bundled port must report what this module measured
    # with the runner: the same totals and the same missed items, per precision and
    # together (read from the `runs` measurement, not typed here)
    report = tmp_path / "cov.json"
    env = dict(os.environ, PYTHONPATH=str(ROOT))
    r = subprocess.run(["python3", "-m", "airdata", "port", "coverage", "--suite",
                        str(ROOT / "vectors"), "--report", str(report)], capture_output=True,
                       text=True, timeout=900, env=env, cwd=tmp_path)
    print(r.stdout)
    assert r.returncode == 0, r.stderr
    doc = json.loads(report.read_text())["measurements"]
    for ours, theirs in (("binary64", "double"), ("binary32", "single"), ("both", "both")):
        fig = runs[ours]
        got = doc[theirs]
        assert {k: (v["covered"], v["count"]) for k, v in got["totals"].items()} == fig.totals
        assert got["missed"] == fig.missed
        assert {f: {k: (v["covered"], v["count"]) for k, v in kinds.items()}
                for f, kinds in got["files"].items()} == fig.per_file
    assert "scalar and batch entry points" in " ".join(doc["both"]["notes"])
    both = runs["both"]
    assert f"MC/DC conditions 100.00% ({both.totals['mcdc'][0]}/{both.totals['mcdc'][1]})" \
        in r.stdout
    assert "batch.c" in r.stdout and "not certified flight software" in r.stdout


def test_port_coverage_command_on_the_bundled_port(tmp_path: Path) -> None:
    toolchain()
    report = tmp_path / "cov.json"
    env = dict(os.environ, PYTHONPATH=str(ROOT))
    r = subprocess.run(["python3", "-m", "airdata", "port", "coverage", "--suite",
                        str(ROOT / "vectors"), "--only", "pressure_altitude",
                        "--precision", "double", "--report", str(report),
                        "--fail-under", "100"], capture_output=True, text=True, timeout=600,
                       env=env, cwd=tmp_path)
    # one function's cases leave most of the port unexercised: exit status 1
    assert r.returncode == 1, r.stderr
    assert "MC/DC conditions" in r.stdout and "altimetry.c:" in r.stdout
    assert "not certified flight software" in r.stdout
    assert report.is_file() and '"mcdc"' in report.read_text()


def test_port_coverage_defaults_to_the_installed_suite(tmp_path: Path) -> None:
    # run where there is no ./vectors: the suite this installation carries is measured
    toolchain()
    report = tmp_path / "cov.json"
    env = dict(os.environ, PYTHONPATH=str(ROOT))
    r = subprocess.run(["python3", "-m", "airdata", "port", "coverage", "--only",
                        "tas_from_mach", "--precision", "single", "--report", str(report)],
                       capture_output=True, text=True, timeout=600, env=env, cwd=tmp_path)
    assert r.returncode == 0, r.stderr
    assert "speeds.c" in r.stdout
    assert json.loads(report.read_text())["suite"] == str(airdata.resources.suite_dir("icao"))


def test_port_coverage_refuses_a_missing_source(tmp_path: Path) -> None:
    toolchain()
    env = dict(os.environ, PYTHONPATH=str(ROOT))
    r = subprocess.run(["python3", "-m", "airdata", "port", "coverage", "--source",
                        str(tmp_path / "absent.c")], capture_output=True, text=True,
                       timeout=120, env=env, cwd=tmp_path)
    assert r.returncode == 2
    assert "absent.c not found" in r.stderr


def test_missing_clang_skips_or_fails_as_configured(monkeypatch: pytest.MonkeyPatch) -> None:
    monkeypatch.setattr(shutil, "which", lambda name: None)
    monkeypatch.delenv("AIRDATA_REQUIRE_TOOLCHAINS", raising=False)
    with pytest.raises(pytest.skip.Exception, match="libclang-rt-19-dev"):
        toolchain()
    monkeypatch.setenv("AIRDATA_REQUIRE_TOOLCHAINS", "1")
    with pytest.raises(pytest.fail.Exception, match="AIRDATA_REQUIRE_TOOLCHAINS=1"):
        toolchain()
