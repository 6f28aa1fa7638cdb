"""The C99 vector runner: strict compilation, and runs against the bundled port,
a port with a subtle defect and a stub port that computes nothing."""

from __future__ import annotations

import re
import subprocess
from pathlib import Path

import pytest
from toolchains import host_cc, host_compiler  # noqa: F401 - host_compiler: a fixture

from airdata.vectors.catalogue import CATALOGUE

ROOT = Path(__file__).resolve().parents[1]
RUNNER = ROOT / "bindings" / "c" / "runner" / "ad_vector_runner.c"
INCLUDE = ROOT / "bindings" / "c" / "include"
VECTORS_C = ROOT / "vectors" / "c"
PORT = sorted((ROOT / "bindings" / "c" / "src").glob("*.c"))
STRICT = ["-std=c99", "-Wall", "-Wextra", "-Wpedantic", "-Werror", "-Wconversion",
          "-Wdouble-promotion", "-Wshadow"]
needs_cc = pytest.mark.usefixtures("host_compiler")


def _compile(out: Path, sources: list[Path], *flags: str) -> None:
    cmd = [host_cc(), *STRICT, "-O1", "-ffp-contract=off", *flags, f"-I{INCLUDE}", f"-I{VECTORS_C}",
           *[str(s) for s in sources], "-lm", "-o", str(out)]
    r = subprocess.run(cmd, capture_output=True, text=True, timeout=600)
    assert r.returncode == 0, r.stderr[-3000:]


def _run(exe: Path) -> subprocess.CompletedProcess[str]:
    return subprocess.run([str(exe)], capture_output=True, text=True, timeout=300)


def _summary(out: str) -> dict[str, tuple[int, int]]:
    """Per function: (cases, failed) from the runner's summary lines."""
    rows = {}
    for m in re.finditer(r"^(\w+)\s+(\d+) cases\s+\d+ passed\s+(\d+) failed", out, re.M):
        rows[m.group(1)] = (int(m.group(2)), int(m.group(3)))
    return rows


def test_runner_calls_every_catalogue_function() -> None:
    # The hand-written core and its generated per-function part (generate.py).
    text = RUNNER.read_text() + (RUNNER.parent / "ad_runner_functions.h").read_text()
    assert '#include "ad_runner_functions.h"' in RUNNER.read_text()
    for spec in CATALOGUE:
        assert text.count(f"static void run_{spec.name}(tally_t *t)\n{{") == 1
        assert f"    run_{spec.name}(t);" in text
        assert f"st = {spec.c_name}(" in text
    assert "malloc" not in text and "fopen" not in text


@needs_cc
@pytest.mark.parametrize("precision", [[], ["-DAIRDATA_SINGLE"]], ids=["binary64", "binary32"])
def test_runner_compiles_as_strict_c99(precision: list[str]) -> None:
    cmd = [host_cc(), *STRICT, "-fsyntax-only", *precision, f"-I{INCLUDE}", f"-I{VECTORS_C}",
           str(RUNNER)]
    r = subprocess.run(cmd, capture_output=True, text=True, timeout=600)
    assert r.returncode == 0, r.stderr[-3000:]


@needs_cc
def test_runner_refuses_vectors_of_another_profile() -> None:
    cmd = [host_cc(), *STRICT, "-fsyntax-only", "-DAIRDATA_PROFILE_US1976", f"-I{INCLUDE}",
           f"-I{VECTORS_C}", str(RUNNER)]
    r = subprocess.run(cmd, capture_output=True, text=True, timeout=600)
    assert r.returncode != 0 and "profile us1976" in r.stderr


@needs_cc
def test_bundled_port_passes_every_vector_in_binary64(tmp_path: Path) -> None:
    exe = tmp_path / "runner64"
    _compile(exe, [RUNNER, *PORT])
    r = _run(exe)
    rows = _summary(r.stdout)
    assert set(rows) == {s.name for s in CATALOGUE}
    assert r.returncode == 0, r.stdout[-3000:]
    assert all(failed == 0 and cases >= 500 for cases, failed in rows.values())
    assert "30 functions: all passed" in r.stdout


@pytest.fixture(scope="module")
def run32(tmp_path_factory: pytest.TempPathFactory) -> subprocess.CompletedProcess[str]:
    """The runner built with the bundled port in binary32, run once."""
    assert PORT, "bindings/c/src holds no port sources"
    exe = tmp_path_factory.mktemp("r32") / "runner32"
    _compile(exe, [RUNNER, *PORT], "-DAIRDATA_SINGLE")
    return _run(exe)


def test_bundled_port_binary32_reports_every_function(
        run32: subprocess.CompletedProcess[str]) -> None:
    rows = _summary(run32.stdout)
    assert set(rows) == {s.name for s in CATALOGUE}


def test_bundled_port_passes_every_vector_in_binary32(
        run32: subprocess.CompletedProcess[str]) -> None:
    assert run32.returncode == 0, run32.stdout[-3000:]


@needs_cc
def test_runner_catches_a_subtle_defect_in_one_function(tmp_path: Path) -> None:
    """The port with dynamic_pressure off by a relative 1e-13 (about 450 ulp)."""
    shim = tmp_path / "shim.c"
    shim.write_text(
        '#include "airdata.h"\n'
        "ad_status ad_dynamic_pressure_real(ad_real mach, ad_real ps, ad_real *q);\n"
        "ad_status ad_dynamic_pressure(ad_real mach, ad_real ps, ad_real *q)\n{\n"
        "    ad_status st = ad_dynamic_pressure_real(mach, ps, q);\n"
        "    *q = *q * (ad_real)(1.0 + 1e-13);\n    return st;\n}\n")
    objs = []
    for src in PORT:
        obj = tmp_path / (src.stem + ".o")
        r = subprocess.run([host_cc(), "-std=c99", "-O1", "-c", f"-I{INCLUDE}",
                            "-Dad_dynamic_pressure=ad_dynamic_pressure_real", str(src), "-o",
                            str(obj)], capture_output=True, text=True, timeout=600)
        assert r.returncode == 0, r.stderr[-2000:]
        objs.append(obj)
    exe = tmp_path / "runner_defect"
    _compile(exe, [RUNNER, shim, *objs])
    r = _run(exe)
    rows = _summary(r.stdout)
    assert r.returncode == 1
    assert rows["dynamic_pressure"][1] > 900
    assert all(failed == 0 for name, (_, failed) in rows.items() if name != "dynamic_pressure")
    assert "FAIL dynamic_pressure case " in r.stdout


@needs_cc
def test_runner_fails_a_port_that_computes_nothing(tmp_path: Path) -> None:
    """A stub generated from airdata.h: every function returns AD_OK and zeros."""
    header = (INCLUDE / "airdata.h").read_text()
    body = ['#include <string.h>', '#include "airdata.h"']
    for m in re.finditer(r"ad_status (ad_\w+)\(([^)]*)\);", header):
        params = [p.strip() for p in m.group(2).replace("\n", " ").split(",")]
        lines = []
        for p in params:
            name = p.split()[-1].lstrip("*")
            if "*" in p:
                lines.append(f"    (void)memset({name}, 0, sizeof *{name});")
            else:
                lines.append(f"    (void){name};")
        body.append(f"ad_status {m.group(1)}({', '.join(params)})\n{{\n" + "\n".join(lines)
                    + "\n    return AD_OK;\n}")
    stub = tmp_path / "stub.c"
    stub.write_text("\n".join(body) + "\n")
    exe = tmp_path / "runner_stub"
    _compile(exe, [RUNNER, stub], "-DRUNNER_SCALAR_ONLY")  # the stub has no batch entry points
    r = _run(exe)
    rows = _summary(r.stdout)
    assert r.returncode == 1
    assert len(rows) == len(CATALOGUE)
    assert all(failed > 0 for _, failed in rows.values())
    assert "30 functions: FAILED" in r.stdout
