"""cffi build script of the bundled C port (out-of-line API mode).

Two extension modules are built from the same C sources in ``bindings/c/src``:

``airdata._cport64``
    ``ad_real`` is binary64 (double).
``airdata._cport32``
    ``ad_real`` is binary32 (float), compiled with ``-DAIRDATA_SINGLE``.

setuptools runs this through ``cffi_modules`` in ``setup.py``; by hand::

    python airdata/_cport_build.py      # builds both modules in the current directory

The cdef is taken from the port's own headers (``airdata.h`` and ``airdata_batch.h``)
with the preprocessor lines removed, so the binding cannot drift from the interface.
"""

from __future__ import annotations

import os
import re
from pathlib import Path

from cffi import FFI

ROOT = Path(__file__).resolve().parent.parent
C_DIR = ROOT / "bindings" / "c"
INCLUDE = C_DIR / "include"
SRC = C_DIR / "src"

#: Port sources, compiled into one translation unit per module (so the two modules
#: never share object files).
SOURCES = ("domains.c", "dd.c", "atmosphere.c", "altimetry.c", "pitot.c", "speeds.c",
           "temperature.c", "chain.c", "limits.c", "batch.c")

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


def make_builder(single: bool) -> FFI:
    """The FFI builder of one precision."""
    ffi = FFI()
    ffi.cdef(cdef_text(single))
    macros = [("AIRDATA_SINGLE", "1")] if single else []
    ffi.set_source(
        "airdata._cport32" if single else "airdata._cport64",
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

if __name__ == "__main__":
    ffibuilder64.compile(verbose=True)
    ffibuilder32.compile(verbose=True)
