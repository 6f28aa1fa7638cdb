"""docs/exchange.md runs as written: every ``console`` block is executed from the
repository root (``airdata`` is this checkout's ``python3 -m airdata``), and every output
line it shows must appear in what the commands print (``...`` stands for lines left out).
The C program of section 3 is written from its block first.  Blocks that use the ARM
cross tools skip when those are missing (AIRDATA_REQUIRE_TOOLCHAINS=1 fails instead)."""

from __future__ import annotations

import os
import re
import shutil
import subprocess
import sys
from pathlib import Path

import pytest
import toolchains

ROOT = Path(__file__).resolve().parents[1]
DOC = ROOT / "docs" / "exchange.md"
CROSS = ("arm-none-eabi-gcc", "qemu-system-arm")


def _blocks(kind: str) -> list[str]:
    return re.findall(rf"^```{kind}\n(.*?)^```$", DOC.read_text(), re.S | re.M)


def _commands(block: str) -> list[tuple[str, list[str]]]:
    """(command, output lines shown) of each ``$ `` line of a block."""
    out: list[tuple[str, list[str]]] = []
    for line in block.splitlines():
        if line.startswith("$ "):
            out.append((line[2:], []))
        elif out and line.strip() != "...":
            out[-1][1].append(line)
    return out


def _tools_missing(block: str) -> list[str]:
    return [t for t in CROSS if ("m4" in block or t in block) and shutil.which(t) is None]


@pytest.fixture(scope="module")
def shim(tmp_path_factory: pytest.TempPathFactory) -> dict[str, str]:
    """Environment whose ``airdata`` (and ``python3``) is this checkout."""
    bindir = tmp_path_factory.mktemp("bin")
    (bindir / "airdata").write_text(f'#!/bin/sh\nexec "{sys.executable}" -m airdata "$@"\n')
    (bindir / "python3").write_text(f'#!/bin/sh\nexec "{sys.executable}" "$@"\n')
    for f in bindir.iterdir():
        f.chmod(0o755)
    (ROOT / "build" / "exchange").mkdir(parents=True, exist_ok=True)
    c_src = next(b for b in _blocks("c") if "read_cases.c" in b)
    (ROOT / "build" / "exchange" / "read_cases.c").write_text(c_src)
    return {**os.environ, "PATH": f"{bindir}{os.pathsep}{os.environ['PATH']}",
            "PYTHONPATH": str(ROOT)}


BLOCKS = _blocks("console")


def test_python_reader_of_the_doc(tmp_path: Path) -> None:
    from airdata.vectors.export import export_cases

    text, n = export_cases(ROOT / "vectors", "double", only=["air_data", "pressure_altitude"])
    path = tmp_path / "cases.txt"
    path.write_text(text)
    ns: dict[str, object] = {}
    exec(next(b for b in _blocks("python") if "def read_cases" in b), ns)  # noqa: S102
    functions, cases = ns["read_cases"](path)  # type: ignore[operator]
    assert len(cases) == n
    assert functions["air_data"][0] == ["ps", "pt", "tat", "recovery", "setting",
                                        "use_setting", "noise_band"]
    assert functions["pressure_altitude"] == (["ps"], ["h"])
    x = next(x for _, name, x in cases if name == "air_data")
    assert len(x) == 7 and x[5] in (0.0, 1.0)  # use_setting, a flag


def test_the_doc_has_its_command_blocks() -> None:
    assert len(BLOCKS) >= 15
    assert sum(len(_commands(b)) for b in BLOCKS) >= 50


@pytest.mark.parametrize("index", range(len(BLOCKS)))
def test_console_block_runs_as_shown(index: int, shim: dict[str, str]) -> None:
    block = BLOCKS[index]
    missing = _tools_missing(block)
    if missing:
        toolchains.missing(f"{', '.join(missing)} not found")
    for cmd, shown in _commands(block):
        r = subprocess.run(["bash", "-c", cmd], cwd=ROOT, env=shim, capture_output=True,
                           text=True, timeout=600)
        got = (r.stdout + r.stderr).splitlines()
        if not any(s.startswith("exit ") for s in shown):
            assert r.returncode == 0, (cmd, r.stderr[-2000:])
        missing_lines = [s for s in shown if s not in got]
        assert not missing_lines, (cmd, missing_lines[:3], got[:20])
