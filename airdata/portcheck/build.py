"""Compiling a C port for a check, on the fly, through cffi.

A port is any set of C sources (or a prebuilt library) that implements the functions
of ``airdata.h``.  For each function under check a small C loop is generated::

    void adpc_<name>(const double *x, double *y, int *status, size_t n);

It converts each case's inputs from binary64 to ``ad_real`` (so a binary32 port sees
them rounded to binary32, as the suite's binary32 rule assumes), calls
``ad_<name>``, and widens the outputs back to binary64.  One call per function runs
every case.  The loop and the port are compiled by cffi (``set_source`` and
``compile``) into a temporary directory, with ``-DAIRDATA_SINGLE`` for binary32, and
loaded from there.

An engineering and verification aid, not certified flight software.
"""

from __future__ import annotations

import contextlib
import importlib.util
import os
import shutil
import sys
import tempfile
import uuid
from collections.abc import Iterator, Sequence
from dataclasses import dataclass, field
from pathlib import Path
from types import ModuleType
from typing import Any

from .suite import FunctionCases

__all__ = ["missing_symbols", "PortBuildError", "PortSpec", "Port", "bundled_port",
           "build_port", "shim_source", "PRECISIONS"]

#: Precision name -> whether ``AIRDATA_SINGLE`` is defined.
PRECISIONS: dict[str, bool] = {"double": False, "single": True}

def _bundled_c_dir() -> Path:
    """``bindings/c`` of this installation: the installed package's copy, or the
    repository's folder beside the package (never the working directory;
    :mod:`airdata.resources`)."""
    from .. import resources

    try:
        return resources.c_dir()
    except resources.ResourceError:
        return resources.REPOSITORY / "bindings" / "c"   # reported by bundled_port()


#: The bundled port: its interface (include/) and sources (src/).
BUNDLED_C = _bundled_c_dir()


class PortBuildError(RuntimeError):
    """The port could not be compiled, linked or loaded; carries the compiler output."""

    def __init__(self, what: str, output: str) -> None:
        self.what = what
        self.output = output
        text = what + (":\n" + output.rstrip() if output.strip() else "")
        super().__init__(text)


@dataclass(frozen=True)
class PortSpec:
    """What to compile: C sources or a library, include directories and defines.

    Attributes
    ----------
    label : str
        Name shown in reports (``"bundled"`` or the user's files).
    sources : tuple of Path
        C files compiled with the port.
    library : Path or None
        A prebuilt static or shared library to link instead of (or with) sources.
    include_dirs : tuple of Path
        Searched in order; the directory of this checkout's ``airdata.h`` comes last.
    defines : tuple of (name, value or None)
        Preprocessor definitions for every file.
    """

    label: str
    sources: tuple[Path, ...] = ()
    library: Path | None = None
    include_dirs: tuple[Path, ...] = ()
    defines: tuple[tuple[str, str | None], ...] = ()
    extra_compile_args: tuple[str, ...] = field(default=("-ffp-contract=off",))


def bundled_port() -> PortSpec:
    """The bundled port of this checkout (``bindings/c/src``)."""
    src = BUNDLED_C / "src"
    sources = tuple(sorted(src.glob("*.c")))
    if not sources:
        raise PortBuildError("the bundled C port is not available in this installation "
                             f"({src} has no C sources): reinstall the package, or pass "
                             "--source or --library", "")
    return PortSpec("bundled", sources, None, (src,),
                    extra_compile_args=("-std=c99", "-ffp-contract=off"))


def _call(fc: FunctionCases) -> list[str]:
    """Body lines of one loop iteration."""
    args = []
    for j, (_, kind) in enumerate(fc.inputs):
        args.append(f"(int)xi[{j}]" if kind == "flag" else f"(ad_real)xi[{j}]")
    lines = []
    if len(fc.outputs) == 1:
        # A union wide enough for a binary64 value: a library built in the other
        # precision writes garbage, not past the end of the variable.
        lines.append("        union { ad_real v; double wide[2]; } o;")
        lines.append("        memset(&o, 0, sizeof o);")
        lines.append(f"        status[i] = (int){fc.c_function}({', '.join(args)}, &o.v);")
        lines.append("        yi[0] = (double)o.v;")
    else:
        wide = 2 * len(fc.outputs)
        lines.append(f"        union {{ {fc.c_function}_t v; double wide[{wide}]; }} o;")
        lines.append("        memset(&o, 0, sizeof o);")
        lines.append(f"        status[i] = (int){fc.c_function}({', '.join(args)}, &o.v);")
        for j, out in enumerate(fc.outputs):
            lines.append(f"        yi[{j}] = (double)o.v.{out};")
    return lines


def shim_source(functions: Sequence[FunctionCases]) -> tuple[str, str]:
    """C source and cdef of the per-function loops."""
    src = ["#include <stddef.h>", "#include <string.h>", '#include "airdata.h"', ""]
    cdef = []
    for fc in functions:
        nin, nout = len(fc.inputs), len(fc.outputs)
        proto = f"void adpc_{fc.name}(const double *x, double *y, int *status, size_t n)"
        cdef.append(proto + ";")
        src += [proto, "{", "    size_t i;", "    for (i = 0; i < n; ++i) {",
                f"        const double *xi = x + i * {nin}u;",
                f"        double *yi = y + i * {nout}u;", *_call(fc), "    }", "}", ""]
    return "\n".join(src), "\n".join(cdef)


@contextlib.contextmanager
def _captured_fds(path: Path) -> Iterator[None]:
    """Send the process's stdout and stderr (file descriptors 1 and 2) to ``path``."""
    sys.stdout.flush()
    sys.stderr.flush()
    saved = [os.dup(1), os.dup(2)]
    with open(path, "wb") as sink:
        os.dup2(sink.fileno(), 1)
        os.dup2(sink.fileno(), 2)
        try:
            yield
        finally:
            sys.stdout.flush()
            sys.stderr.flush()
            os.dup2(saved[0], 1)
            os.dup2(saved[1], 2)
            os.close(saved[0])
            os.close(saved[1])


def _compiler_output(text: str) -> str:
    """The compiler's own lines from the build log (setuptools chatter removed)."""
    keep = [ln for ln in text.splitlines()
            if not ln.startswith(("running ", "building ", "creating ", "generating ",
                                  "copying ", "writing ", "not modified",
                                  "setting the current directory"))]
    return "\n".join(keep[-80:])


@dataclass
class Port:
    """A compiled port of one precision, ready to run cases.

    Attributes
    ----------
    spec : PortSpec
        What was compiled.
    precision : str
        ``"double"`` or ``"single"``.
    module : module
        The loaded cffi extension (``lib`` and ``ffi``).
    functions : tuple of str
        Functions that have a loop.
    """

    spec: PortSpec
    precision: str
    module: ModuleType
    functions: tuple[str, ...]
    workdir: Path

    def run(self, fc: FunctionCases) -> tuple[Any, Any]:
        """Run every case of ``fc``: (outputs of shape (n, n_outputs), statuses)."""
        import numpy as np

        ffi, lib = self.module.ffi, self.module.lib
        x = np.ascontiguousarray(fc.x, dtype=np.float64)
        y = np.full((fc.count, len(fc.outputs)), np.nan)
        st = np.full(fc.count, -1, dtype=np.intc)
        getattr(lib, f"adpc_{fc.name}")(ffi.from_buffer("double[]", x),
                                        ffi.from_buffer("double[]", y),
                                        ffi.from_buffer("int[]", st), fc.count)
        return y, st.astype(np.int64)

    def close(self) -> None:
        """Remove the build directory (the loaded module stays usable)."""
        shutil.rmtree(self.workdir, ignore_errors=True)


def missing_symbols(library: Path) -> list[str]:
    """Every undefined ``ad_*`` symbol of a built module (``nm``), sorted; empty when
    ``nm`` is not available."""
    import subprocess

    nm = shutil.which("nm")
    if nm is None:
        return []
    try:
        out = subprocess.run([nm, "-D", "--undefined-only", str(library)], capture_output=True,
                             text=True, timeout=60, check=False).stdout
    except (OSError, subprocess.SubprocessError):
        return []
    names = {ln.split()[-1].split("@")[0] for ln in out.splitlines() if ln.strip()}
    return sorted(n for n in names if n.startswith("ad_"))


def build_port(spec: PortSpec, functions: Sequence[FunctionCases], precision: str,
               workdir: str | Path | None = None) -> Port:
    """Compile ``spec`` with loops for ``functions`` in ``precision`` and load it.

    Raises
    ------
    PortBuildError
        Missing source, compile or link failure (with the compiler's messages), or a
        function the port does not define (undefined symbol when loading).
    """
    from cffi import FFI

    if precision not in PRECISIONS:
        raise ValueError(f"precision {precision!r}: choose 'double' or 'single'")
    for s in spec.sources:
        if not s.is_file():
            raise PortBuildError(f"C source {s} not found", "")
    if spec.library is not None and not spec.library.is_file():
        raise PortBuildError(f"library {spec.library} not found", "")
    tmp = Path(workdir) if workdir is not None else Path(tempfile.mkdtemp(prefix="adportcheck-"))
    tmp.mkdir(parents=True, exist_ok=True)
    modname = f"_adportcheck_{precision}_{uuid.uuid4().hex[:12]}"
    source, cdef = shim_source(functions)
    ffi = FFI()
    ffi.cdef(cdef)
    macros: list[tuple[str, str | None]] = list(spec.defines)
    if PRECISIONS[precision]:
        macros.append(("AIRDATA_SINGLE", "1"))
    include = [*spec.include_dirs, BUNDLED_C / "include"]
    link_args: list[str] = []
    objects: list[str] = []
    if spec.library is not None:
        objects.append(str(spec.library.resolve()))
        link_args.append(f"-Wl,-rpath,{spec.library.resolve().parent}")
    ffi.set_source(modname, source, sources=[str(s.resolve()) for s in spec.sources],
                   include_dirs=[str(p.resolve()) for p in include], define_macros=macros,
                   extra_compile_args=list(spec.extra_compile_args), extra_objects=objects,
                   extra_link_args=link_args, libraries=["m"])
    log = tmp / "build.log"
    try:
        with _captured_fds(log):
            path = ffi.compile(tmpdir=str(tmp), verbose=True)
    except Exception as exc:  # cffi wraps setuptools' CompileError / LinkError
        text = log.read_text(errors="replace") if log.exists() else ""
        if workdir is None:
            shutil.rmtree(tmp, ignore_errors=True)
        raise PortBuildError(f"the port ({spec.label}, {precision}) failed to compile: {exc}",
                             _compiler_output(text)) from None
    mod_spec = importlib.util.spec_from_file_location(modname, path)
    assert mod_spec is not None and mod_spec.loader is not None
    try:
        module = importlib.util.module_from_spec(mod_spec)
        mod_spec.loader.exec_module(module)
    except ImportError as exc:
        if workdir is None:
            shutil.rmtree(tmp, ignore_errors=True)
        msg = str(exc)
        hint = ""
        if "undefined symbol" in msg:
            first = msg.rsplit('undefined symbol:', 1)[-1].strip()
            wanted = {f.c_function for f in functions}
            missing = [m for m in missing_symbols(Path(path)) if m in wanted] or [first]
            hint = (f" (the port does not define {', '.join(missing)}: {len(missing)} "
                    "missing function(s); declare what the port implements with "
                    "--implements or --declaration, or use --only to check a subset)")
        raise PortBuildError(f"the port ({spec.label}, {precision}) failed to load{hint}",
                             msg) from None
    return Port(spec, precision, module, tuple(f.name for f in functions), tmp)
