"""Cross-target checks of the bundled C port.

- 32-bit ARM hard-float Linux (Debian's gcc-arm-linux-gnueabihf, run under qemu-arm
  user-mode emulation): the C vector runner with the generated headers, in binary64
  and binary32, must pass every vector.
- Cortex-M4F (arm-none-eabi-gcc -mcpu=cortex-m4 -mfpu=fpv4-sp-d16 -mfloat-abi=hard,
  freestanding, -Os): the port alone; code size reported, no mutable state (.data and
  .bss empty), and the binary32 build does no binary64 arithmetic.

A missing tool skips with the package to install; with AIRDATA_REQUIRE_TOOLCHAINS=1
(set by .ci/run) it fails instead.  bindings/c/cross/Makefile runs the same by hand.
"""

from __future__ import annotations

import os
import struct
import subprocess
from pathlib import Path

import pytest
from runner_text import runner_summary, suite_counts, suite_skips
from toolchains import need

ROOT = Path(__file__).resolve().parents[1]
C_DIR = ROOT / "bindings" / "c"
RUNNER = C_DIR / "runner" / "ad_vector_runner.c"
PORT = sorted((C_DIR / "src").glob("*.c"))
VECTORS = ROOT / "vectors"

PRECISIONS = {"binary64": [], "binary32": ["-DAIRDATA_SINGLE"]}
M4 = ["-std=c99", "-mcpu=cortex-m4", "-mthumb", "-mfpu=fpv4-sp-d16", "-mfloat-abi=hard",
      "-Os", "-ffunction-sections", "-fdata-sections", "-ffreestanding", "-ffp-contract=off",
      "-Wall", "-Wextra", "-Wpedantic", "-Wconversion", "-Wdouble-promotion", "-Werror"]


# --- 32-bit ARM hard-float Linux under qemu-arm ------------------------------------

@pytest.fixture(scope="module")
def arm_runs(tmp_path_factory: pytest.TempPathFactory) -> dict[str, tuple[Path, str, int]]:
    cc = need("arm-linux-gnueabihf-gcc")
    qemu = need("qemu-arm")
    tmp = tmp_path_factory.mktemp("arm")
    out = {}
    for name, flags in PRECISIONS.items():
        exe = tmp / f"runner_{name}"
        r = subprocess.run([cc, "-std=c99", "-O1", "-ffp-contract=off", "-static", *flags,
                            f"-I{C_DIR / 'include'}", f"-I{VECTORS / 'c'}", str(RUNNER),
                            *map(str, PORT), "-lm", "-o", str(exe)],
                           capture_output=True, text=True, timeout=300)
        assert r.returncode == 0, r.stderr[-3000:]
        env = dict(os.environ, QEMU_LD_PREFIX="/usr/arm-linux-gnueabihf")
        run = subprocess.run([qemu, str(exe)], capture_output=True, text=True, timeout=300,
                             env=env)
        out[name] = (exe, run.stdout, run.returncode)
    return out


def test_arm_runner_is_a_32bit_hard_float_arm_executable(arm_runs: dict) -> None:
    # ELF header (System V ABI): class 1 = 32-bit, e_machine 40 = ARM; ARM ELF ABI:
    # e_flags bit 0x400 = EF_ARM_ABI_FLOAT_HARD.
    for exe, _, _ in arm_runs.values():
        head = exe.read_bytes()[:52]
        assert head[:4] == b"\x7fELF" and head[4] == 1 and head[5] == 1
        machine = struct.unpack_from("<H", head, 18)[0]
        flags = struct.unpack_from("<I", head, 36)[0]
        assert machine == 40
        assert flags & 0x400, hex(flags)


@pytest.mark.parametrize("precision", list(PRECISIONS))
def test_arm_runner_passes_every_vector(arm_runs: dict, precision: str) -> None:
    _, out, rc = arm_runs[precision]
    rows = runner_summary(out)
    counts = suite_counts(VECTORS)
    skips = suite_skips(VECTORS, precision)
    print(f"\nqemu-arm {precision}: " + ", ".join(
        f"{k} {v[1]}/{v[0]}" for k, v in rows.items()))
    assert set(rows) == set(counts), out[-2000:]
    for name, (cases, passed, failed) in rows.items():
        assert cases == counts[name]
        assert failed == 0, "\n".join(ln for ln in out.splitlines() if name in ln)[:3000]
        assert passed == cases - skips[name] > 0  # every case the precision runs passes
    assert rc == 0 and out.rstrip().endswith("all passed")


# --- Cortex-M4F, freestanding --------------------------------------------------------

@pytest.fixture(scope="module")
def m4_objects(tmp_path_factory: pytest.TempPathFactory) -> dict[str, list[Path]]:
    cc = need("arm-none-eabi-gcc")
    tmp = tmp_path_factory.mktemp("m4")
    out: dict[str, list[Path]] = {}
    for name, flags in PRECISIONS.items():
        objs = []
        for src in PORT:
            obj = tmp / f"{src.stem}_{name}.o"
            r = subprocess.run([cc, *M4, *flags, f"-I{C_DIR / 'include'}", "-c", str(src),
                                "-o", str(obj)], capture_output=True, text=True, timeout=300)
            assert r.returncode == 0, r.stderr[-3000:]
            objs.append(obj)
        out[name] = objs
    return out


def _sizes(objs: list[Path]) -> dict[str, tuple[int, int, int]]:
    size = need("arm-none-eabi-size")
    r = subprocess.run([size, *map(str, objs)], capture_output=True, text=True, timeout=60,
                       check=True)
    rows = {}
    for line in r.stdout.splitlines()[1:]:
        text, data, bss, _, _, fname = line.split(None, 5)
        rows[Path(fname).name] = (int(text), int(data), int(bss))
    return rows


@pytest.mark.parametrize("precision", list(PRECISIONS))
def test_m4_port_size_and_no_mutable_state(m4_objects: dict, precision: str) -> None:
    rows = _sizes(m4_objects[precision])
    total = [sum(v[i] for v in rows.values()) for i in range(3)]
    print(f"\ncortex-m4f {precision}: text/data/bss per object: "
          + ", ".join(f"{k} {v[0]}/{v[1]}/{v[2]}" for k, v in rows.items())
          + f"; total {total[0]}/{total[1]}/{total[2]} bytes")
    assert len(rows) == len(PORT)
    for name, (text, data, bss) in rows.items():
        assert text > 0, name
        assert data == 0 and bss == 0, (name, data, bss)
    assert total[0] < 64 * 1024  # the whole port well inside a small MCU's flash


def test_m4_binary32_build_does_no_binary64_arithmetic(m4_objects: dict) -> None:
    # On a single-precision FPU any double operation becomes an EABI helper call
    # (__aeabi_d*, __aeabi_f2d; ARM run-time ABI) or a call of a double libm function.
    nm = need("arm-none-eabi-nm")
    doubles = {"exp", "log", "log1p", "expm1", "sqrt", "pow", "fabs", "floor"}
    for obj in m4_objects["binary32"]:
        r = subprocess.run([nm, "-u", str(obj)], capture_output=True, text=True, timeout=60,
                           check=True)
        undefined = {ln.split()[-1] for ln in r.stdout.splitlines() if ln.strip()}
        bad = {s for s in undefined
               if s.startswith(("__aeabi_d", "__aeabi_f2d", "__aeabi_l2d")) or s in doubles}
        assert not bad, (obj.name, sorted(bad))
    # and the binary64 build does need them on this FPU: the check can see them
    r = subprocess.run([nm, "-u", *map(str, m4_objects["binary64"])], capture_output=True,
                       text=True, timeout=60, check=True)
    assert "__aeabi_dadd" in r.stdout or "__aeabi_dmul" in r.stdout

