"""The one guard for every external tool the tests need (compilers, emulators, browsers).

A test that needs a tool calls :func:`need` (or :func:`host_cc` for the host C compiler).
When the tool is missing the test is skipped with the Debian package that provides it,
unless the environment sets ``AIRDATA_REQUIRE_TOOLCHAINS=1`` (CI does): then it fails,
so that a machine without a toolchain cannot pass the suite by skipping what it cannot
run.

The host C compiler is the one cffi compiles the bundled port and the ports under check
with: setuptools takes ``$CC`` when it is set and the interpreter's build compiler
(``sysconfig`` ``CC``) otherwise, and :func:`airdata.portcheck.evidence.cffi_compiler`
says which.  The tests compile their own runners with that same compiler, so a guard
can never accept ``cc`` while cffi goes on to call a ``gcc`` that is not there.
"""

from __future__ import annotations

import importlib.util
import os
import shutil
import sys
from pathlib import Path
from types import ModuleType
from typing import NoReturn

import pytest

from airdata.portcheck.evidence import cffi_compiler

#: Debian packages that provide each tool (the names .ci/run installs).
PACKAGES = {
    "gcc": "gcc libc6-dev",
    "cc": "gcc libc6-dev",
    "gcov": "gcc",
    "make": "make",
    "arm-linux-gnueabihf-gcc": "gcc-arm-linux-gnueabihf libc6-dev-armhf-cross",
    "aarch64-linux-gnu-gcc": "gcc-aarch64-linux-gnu libc6-dev-arm64-cross",
    "aarch64-linux-gnu-objdump": "binutils-aarch64-linux-gnu",
    "objdump": "binutils",
    "powerpc-linux-gnu-gcc": "gcc-powerpc-linux-gnu libc6-dev-powerpc-cross",
    "i686-linux-gnu-gcc": "gcc-i686-linux-gnu libc6-dev-i386-cross",
    "qemu-arm": "qemu-user",
    "qemu-aarch64": "qemu-user",
    "qemu-ppc": "qemu-user",
    "qemu-i386": "qemu-user",
    "arm-none-eabi-gcc": "gcc-arm-none-eabi libnewlib-arm-none-eabi",
    "arm-none-eabi-size": "binutils-arm-none-eabi",
    "arm-none-eabi-nm": "binutils-arm-none-eabi",
    "qemu-system-arm": "qemu-system-arm",
    "valgrind": "valgrind",
    "cppcheck": "cppcheck",
    "chromium": "chromium",
    "clang-19": "clang-19 llvm-19 libclang-rt-19-dev",
}


def required() -> bool:
    """True when a missing tool must fail the run (``AIRDATA_REQUIRE_TOOLCHAINS=1``)."""
    return os.environ.get("AIRDATA_REQUIRE_TOOLCHAINS") == "1"


def missing(what: str) -> NoReturn:
    """Skip the calling test because ``what`` is missing, or fail it when tools are
    required."""
    if required():
        pytest.fail(f"{what}; AIRDATA_REQUIRE_TOOLCHAINS=1 requires it", pytrace=False)
    pytest.skip(what)


def need(name: str) -> str:
    """Absolute path of the tool ``name`` on PATH; skip or fail (see :func:`missing`)."""
    path = shutil.which(name)
    if path is None:
        missing(f"{name} not found on PATH (Debian package: {PACKAGES.get(name, name)})")
    return path


def host_cc() -> str:
    """Path of the host C compiler cffi uses (first word of :func:`cffi_compiler`)."""
    words = cffi_compiler().split()
    if not words:
        missing("no host C compiler configured ($CC and sysconfig CC are empty)")
    return need(words[0])


@pytest.fixture
def host_compiler() -> str:
    """Fixture form of :func:`host_cc`, for ``pytest.mark.usefixtures("host_compiler")``
    on tests that compile through cffi (import it into the test module)."""
    return host_cc()


def load_script(path: Path, name: str) -> ModuleType:
    """Import a repository script that is not in a package (``tools/*.py``,
    ``bindings/c/tools/*.py``) as module ``name``."""
    spec = importlib.util.spec_from_file_location(name, path)
    assert spec is not None and spec.loader is not None, path
    mod = importlib.util.module_from_spec(spec)
    sys.modules[name] = mod
    spec.loader.exec_module(mod)
    return mod
