"""Build hooks (metadata lives in pyproject.toml).

- ``cffi_modules``: the C port compiled into the package, binary64 and binary32, for the
  ``icao`` and the ``us1976`` constants profiles (see airdata/_cport_build.py).
- ``build_py``: copies the checked-in vector suites, the C interface, the port sources,
  its Makefile and the vector runner into the built package under ``airdata/_share/``
  (the list is ``airdata.resources.SHARED_FILES``), so an installed wheel carries them.
  The repository layout is not changed; an editable install reads the repository's
  folders instead (``airdata/resources.py``).
"""

from __future__ import annotations

import ast
import shutil
from pathlib import Path

from setuptools import setup
from setuptools.command.build_py import build_py

ROOT = Path(__file__).resolve().parent


def _shared_files() -> tuple[tuple[str, tuple[str, ...]], ...]:
    """``SHARED_FILES`` of airdata/resources.py, read without importing the package."""
    tree = ast.parse((ROOT / "airdata" / "resources.py").read_text())
    for node in tree.body:
        if isinstance(node, ast.AnnAssign) and getattr(node.target, "id", "") == "SHARED_FILES":
            return tuple(ast.literal_eval(node.value))  # type: ignore[arg-type]
    raise RuntimeError("airdata/resources.py defines no SHARED_FILES")


def copy_share(dest: Path) -> list[Path]:
    """Copy the shared files into ``dest`` (replacing it); the files written."""
    if dest.exists():
        shutil.rmtree(dest)
    written = []
    for folder, patterns in _shared_files():
        for pattern in patterns:
            found = sorted((ROOT / folder).glob(pattern))
            if not found:
                raise RuntimeError(f"package data: {folder}/{pattern} matches no file")
            for src in found:
                target = dest / folder / src.relative_to(ROOT / folder)
                target.parent.mkdir(parents=True, exist_ok=True)
                shutil.copyfile(src, target)
                written.append(target)
    return written


class BuildPyWithShare(build_py):
    """``build_py`` that also writes ``airdata/_share/`` into the build directory."""

    def run(self) -> None:
        super().run()
        if not getattr(self, "editable_mode", False):
            copy_share(Path(self.build_lib) / "airdata" / "_share")


setup(
    cmdclass={"build_py": BuildPyWithShare},
    cffi_modules=[
        "airdata/_cport_build.py:ffibuilder64",
        "airdata/_cport_build.py:ffibuilder32",
        "airdata/_cport_build.py:ffibuilder64_us1976",
        "airdata/_cport_build.py:ffibuilder32_us1976",
    ],
)
