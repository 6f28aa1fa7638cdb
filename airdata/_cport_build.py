"""cffi build script of the bundled C port (out-of-line API mode).

Four extension modules are built from the same C sources in ``bindings/c/src``:

``airdata._cport64``, ``airdata._cport32``
    ICAO Doc 7488/3 constants (the default profile); ``ad_real`` is binary64 (double),
    or binary32 (float, compiled with ``-DAIRDATA_SINGLE``).
``airdata._cport64_us1976``, ``airdata._cport32_us1976``
    The same with the U.S. Standard Atmosphere 1976 constants
    (``-DAIRDATA_PROFILE_US1976``, the switch of the generated ``ad_constants.h``).

setuptools runs this through ``cffi_modules`` in ``setup.py``; by hand::

    python airdata/_cport_build.py      # builds the four modules in the current directory

The cdef is taken from the port's own headers (``airdata.h`` and ``airdata_batch.h``)
with the preprocessor lines removed, so the binding cannot drift from the interface.
"""

from __future__ import annotations

import os
import re
from pathlib import Path

from cffi import FFI

ROOT = Path(__file__).resolve().parent.parent
# The repository's bindings/c when building (a clone or an sdist); in an installed wheel
# the copy under airdata/_share (this module is then only read, for cdef_text).
C_DIR = ROOT / "bindings" / "c"
if not (C_DIR / "include" / "airdata.h").is_file():
    C_DIR = Path(__file__).resolve().parent / "_share" / "bindings" / "c"
INCLUDE = C_DIR / "include"
SRC = C_DIR / "src"

#: Port sources, compiled into one translation unit per module (so the two modules
#: never share object files).
SOURCES = ("domains.c", "inputs.c", "dd.c", "atmosphere.c", "altimetry.c", "pitot.c",
           "speeds.c", "temperature.c", "chain.c", "limits.c", "batch.c")

_REAL_TYPEDEF = re.compile(r"^\s*typedef\s+(float|double)\s+ad_real\s*;\s*$")


def cdef_text(single: bool) -> str:
    """Declarations of both headers for cffi, with ``ad_real`` fixed to one type."""
    lines = [f"typedef {'float' if single else 'double'} ad_real;"]
    for header in ("airdata.h", "airdata_batch.h"):
        for line in (INCLUDE / header).read_text().splitlines():
            if line.lstrip().startswith("#") or _REAL_TYPEDEF.match(line):
                continue
            lines.append(line)
    lines.append("#define AD_BATCH_NULL ...")
    return "\n".join(lines)


def _source() -> str:
    return "\n".join(f'#include "{name}"' for name in SOURCES)


def _compile_args() -> list[str]:
    # ISO C99 without floating-point contraction, so every operation is rounded as
    # written (as in the warnings build of the tests).
    if os.name == "posix":
        return ["-std=c99", "-ffp-contract=off"]
    return []


#: Constants profile -> suffix of its module names and its preprocessor switch.
PROFILES: dict[str, tuple[str, str | None]] = {
    "icao": ("", None),
    "us1976": ("_us1976", "AIRDATA_PROFILE_US1976"),
}


def module_name(single: bool, profile: str = "icao") -> str:
    """Full name of the extension module of one precision and profile."""
    return f"airdata._cport{32 if single else 64}{PROFILES[profile][0]}"


def make_builder(single: bool, profile: str = "icao") -> FFI:
    """The FFI builder of one precision and constants profile."""
    ffi = FFI()
    ffi.cdef(cdef_text(single))
    macros: list[tuple[str, str | None]] = [("AIRDATA_SINGLE", "1")] if single else []
    switch = PROFILES[profile][1]
    if switch is not None:
        macros.append((switch, "1"))
    ffi.set_source(
        module_name(single, profile),
        _source(),
        include_dirs=[str(INCLUDE), str(SRC)],
        define_macros=macros,
        extra_compile_args=_compile_args(),
        libraries=["m"] if os.name == "posix" else [],
        depends=[str(p) for p in sorted(SRC.glob("*.[ch]")) + sorted(INCLUDE.glob("*.h"))],
    )
    return ffi


ffibuilder64 = make_builder(single=False)
ffibuilder32 = make_builder(single=True)
ffibuilder64_us1976 = make_builder(single=False, profile="us1976")
ffibuilder32_us1976 = make_builder(single=True, profile="us1976")

if __name__ == "__main__":
    for builder in (ffibuilder64, ffibuilder32, ffibuilder64_us1976, ffibuilder32_us1976):
        builder.compile(verbose=True)
