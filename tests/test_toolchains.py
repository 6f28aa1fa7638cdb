"""The shared tool guard (tests/toolchains.py): a missing tool skips, or fails the run
under AIRDATA_REQUIRE_TOOLCHAINS=1, and the host compiler checked is the one cffi uses.

Also a whole-suite check that every test module which runs an external tool goes through
the guard (no module-level ``shutil.which`` skip of its own).
"""

from __future__ import annotations

import os
import re
import shutil
import sys
from pathlib import Path

import pytest
import toolchains

from airdata.portcheck.evidence import cffi_compiler

TESTS = Path(__file__).resolve().parent


def test_missing_tool_skips_without_the_switch(monkeypatch: pytest.MonkeyPatch) -> None:
    monkeypatch.setattr(shutil, "which", lambda name: None)
    monkeypatch.delenv("AIRDATA_REQUIRE_TOOLCHAINS", raising=False)
    with pytest.raises(pytest.skip.Exception, match="Debian package: qemu-user"):
        toolchains.need("qemu-arm")


def test_missing_tool_fails_with_the_switch(monkeypatch: pytest.MonkeyPatch) -> None:
    monkeypatch.setattr(shutil, "which", lambda name: None)
    monkeypatch.setenv("AIRDATA_REQUIRE_TOOLCHAINS", "1")
    with pytest.raises(pytest.fail.Exception, match="AIRDATA_REQUIRE_TOOLCHAINS=1"):
        toolchains.need("arm-none-eabi-gcc")
    with pytest.raises(pytest.fail.Exception, match="clang-19 llvm-19"):
        toolchains.need("clang-19")


def test_present_tool_gives_its_path() -> None:
    assert toolchains.need(Path(sys.executable).name) == shutil.which(
        Path(sys.executable).name)


def test_host_cc_is_the_compiler_cffi_would_use(monkeypatch: pytest.MonkeyPatch,
                                                tmp_path: Path) -> None:
    fake = tmp_path / "my-cc"
    fake.write_text("#!/bin/sh\nexit 0\n")
    fake.chmod(0o755)
    monkeypatch.setenv("PATH", f"{tmp_path}{os.pathsep}{os.environ['PATH']}")
    monkeypatch.setenv("CC", "my-cc -pthread")
    assert cffi_compiler() == "my-cc -pthread"
    assert toolchains.host_cc() == str(fake)
    # a $CC that is not on PATH: the guard refuses it even if gcc and cc are present
    monkeypatch.setenv("CC", "no-such-compiler-here")
    monkeypatch.setenv("AIRDATA_REQUIRE_TOOLCHAINS", "1")
    with pytest.raises(pytest.fail.Exception, match="no-such-compiler-here not found"):
        toolchains.host_cc()


def test_no_test_module_has_a_guard_of_its_own() -> None:
    # A module-level skip on shutil.which or an inline AIRDATA_REQUIRE_TOOLCHAINS test is
    # what let a missing tool skip quietly: every such check belongs in toolchains.py.
    own = re.compile(r"skipif\([^)]*which|AIRDATA_REQUIRE_TOOLCHAINS\"\)|"
                     r"pytest\.skip\([^)]*not found")
    offenders = [p.name for p in sorted(TESTS.glob("test_*.py"))
                 if p.name != Path(__file__).name and own.search(p.read_text())]
    assert offenders == []
    # and the scan can see one
    assert own.search('x = pytest.mark.skipif(shutil.which("gcc") is None, reason="")')
