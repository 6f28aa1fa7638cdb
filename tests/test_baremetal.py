"""The vector runner on a bare-metal Cortex-M4F, under qemu-system-arm (mps2-an386) with
semihosting: judged on the target (exit status back to the host) and in result-stream
mode judged on the host by ``airdata port verify``, binary64 and binary32.

Start-up and memory map: bindings/c/cross/m4/ (vector table at 0, FPU enabled through
CPACR before C start-up, ARMv7-M Architecture Reference Manual B3.2.20).  A missing tool
skips with the package to install; with AIRDATA_REQUIRE_TOOLCHAINS=1 it fails instead.
"""

from __future__ import annotations

import json
import os
import subprocess
import sys
from pathlib import Path

import pytest
from toolchains import need

ROOT = Path(__file__).resolve().parents[1]
C_DIR = ROOT / "bindings" / "c"
M4_DIR = C_DIR / "cross" / "m4"
RUNNER = C_DIR / "runner" / "ad_vector_runner.c"
PORT = sorted((C_DIR / "src").glob("*.c"))
VECTORS = ROOT / "vectors"
CFLAGS = ["-std=c99", "-mcpu=cortex-m4", "-mthumb", "-mfpu=fpv4-sp-d16", "-mfloat-abi=hard",
          "-O2", "-ffp-contract=off", "-ffunction-sections", "-fdata-sections", "-Wall",
          "-Wextra", "-Werror"]
LINK = ["--specs=rdimon.specs", "-nostartfiles", "-T", str(M4_DIR / "m4.ld"),
        "-Wl,--gc-sections", "-lm"]
QEMU = ["-M", "mps2-an386", "-cpu", "cortex-m4", "-nographic", "-monitor", "none",
        "-serial", "none", "-semihosting-config", "enable=on,target=native", "-kernel"]
PRECISIONS = {"binary64": [], "binary32": ["-DAIRDATA_SINGLE"]}


def _build(out: Path, sources: list[Path], *flags: str) -> Path:
    cc = need("arm-none-eabi-gcc")
    r = subprocess.run([cc, *CFLAGS, *flags, f"-I{C_DIR / 'include'}", f"-I{VECTORS / 'c'}",
                        str(M4_DIR / "startup.c"), *map(str, sources), *LINK, "-o", str(out)],
                       capture_output=True, text=True, timeout=600)
    assert r.returncode == 0, r.stderr[-3000:]
    return out


def _qemu(elf: Path) -> subprocess.CompletedProcess[str]:
    return subprocess.run([need("qemu-system-arm"), *QEMU, str(elf)], capture_output=True,
                          text=True, timeout=300)


def _total_cases() -> int:
    manifest = json.loads((VECTORS / "manifest.json").read_text())
    return sum(e["valid"] + e["invalid"] for e in manifest["functions"])


@pytest.mark.parametrize("precision", PRECISIONS)
def test_m4_judges_every_vector_on_target(precision: str, tmp_path: Path) -> None:
    elf = _build(tmp_path / "runner.elf", [RUNNER, *PORT], *PRECISIONS[precision])
    r = _qemu(elf)
    assert r.returncode == 0, r.stdout[-3000:] + r.stderr[-2000:]
    assert f"{precision} port" in r.stdout
    assert f"{_total_cases()} cases of 30 of the suite's 30 functions" in r.stdout
    assert r.stdout.rstrip().endswith("30 functions: all passed")


@pytest.mark.parametrize("precision", PRECISIONS)
def test_m4_streams_results_that_verify_on_host(precision: str, tmp_path: Path) -> None:
    elf = _build(tmp_path / "results.elf", [RUNNER, *PORT], "-DRUNNER_RESULTS",
                 *PRECISIONS[precision])
    r = _qemu(elf)
    assert r.returncode == 0, r.stderr[-2000:]
    lines = r.stdout.splitlines()
    assert lines[0] == f"airdata-results 1 precision {precision}"
    assert lines[-1] == f"end {_total_cases()}"
    res = tmp_path / "results.txt"
    res.write_text(r.stdout)
    v = subprocess.run([sys.executable, "-m", "airdata", "port", "verify", str(res),
                        "--suite", str(VECTORS)], capture_output=True, text=True,
                       cwd=ROOT, timeout=300, env={**os.environ, "PYTHONPATH": str(ROOT)})
    assert v.returncode == 0, v.stdout[-3000:]
    assert ("PASS: all 30 implemented function check(s) pass [level: reference-equivalent]"
            in v.stdout)


def test_m4_exit_status_reaches_the_host(tmp_path: Path) -> None:
    """A failing verdict on the target is a non-zero exit status of qemu (semihosting
    SYS_EXIT); here a program whose main returns 1 through the same start-up."""
    src = tmp_path / "fail.c"
    src.write_text("int main(void);\nint main(void) { return 1; }\n")
    elf = _build(tmp_path / "fail.elf", [src])
    assert _qemu(elf).returncode != 0


def test_m4_subset_build_streams_only_its_functions(tmp_path: Path) -> None:
    elf = _build(tmp_path / "subset.elf", [RUNNER, *PORT], "-DRUNNER_RESULTS",
                 "-DRUNNER_SUBSET", "-DRUNNER_WITH_PRESSURE_ALTITUDE")
    r = _qemu(elf)
    manifest = json.loads((VECTORS / "manifest.json").read_text())
    n = next(e["valid"] + e["invalid"] for e in manifest["functions"]
             if e["function"] == "pressure_altitude")
    assert r.returncode == 0
    assert r.stdout.splitlines()[-1] == f"end {n}"
