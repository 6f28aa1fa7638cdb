"""Where the checked-in suites, the C interface and the C port are.

Two places can hold them, and only these two are ever looked at (never the current
working directory: a suite or port there is used only when the user names its path):

installed package
    A wheel (``pip install``) carries a copy under ``airdata/_share/``, laid out as in the
    repository (``vectors/``, ``vectors-us1976/``, ``bindings/c/...``); setup.py's
    ``build_py`` writes it.
repository
    A clone, an editable install or an unpacked sdist: the folders beside the ``airdata``
    package (``<root>/vectors``, ``<root>/bindings/c``).

The installed copy is used when present, else the repository's folders.  A file that is in
neither raises :class:`ResourceError` naming both places.

An engineering and verification aid, not certified flight software.
"""

from __future__ import annotations

from pathlib import Path

__all__ = ["ResourceError", "OverwriteError", "SUITE_FOLDERS", "SHARE", "REPOSITORY",
           "SHARED_FILES", "data_root", "origin", "suite_dir", "c_dir", "include_dir",
           "src_dir", "runner_dir", "makefile", "port_files", "suite_header_files",
           "copy_files", "equations_doc"]

_PACKAGE = Path(__file__).resolve().parent

#: The installed copy (present in a wheel only).
SHARE = _PACKAGE / "_share"

#: The repository root beside the package (a clone or an unpacked sdist).
REPOSITORY = _PACKAGE.parent

#: Constants profile -> folder of its checked-in suite, relative to the data root.
SUITE_FOLDERS: dict[str, str] = {"icao": "vectors", "us1976": "vectors-us1976"}

#: What the installed copy carries: (folder relative to the data root, file patterns).
#: A plain literal: setup.py reads it without importing the package and copies exactly
#: these; tests/test_install.py checks the wheel holds them.
SHARED_FILES: tuple[tuple[str, tuple[str, ...]], ...] = (
    ("vectors", ("manifest.json", "CHANGELOG.md", "README.md", "functions/*.json",
                 "schema/*.json", "c/*.h")),
    ("vectors-us1976", ("manifest.json", "CHANGELOG.md", "README.md", "functions/*.json",
                        "schema/*.json", "c/*.h")),
    ("bindings/c", ("Makefile",)),
    ("bindings/c/include", ("*.h",)),
    ("bindings/c/src", ("*.c", "*.h")),
    ("bindings/c/runner", ("*.c", "*.h")),
    ("bindings/c/tests", ("driver.c", "bench_driver.c")),
    ("docs", ("equations.md",)),
)

# A file every complete data root holds.
_MARKER = Path("bindings") / "c" / "include" / "airdata.h"


class ResourceError(FileNotFoundError):
    """A suite, header or port source is in neither the installed copy nor a repository."""


def data_root() -> Path:
    """The folder that holds ``vectors/`` and ``bindings/c/`` for this installation.

    Returns
    -------
    Path
        :data:`SHARE` when it is present (a wheel), else :data:`REPOSITORY`.

    Raises
    ------
    ResourceError
        Neither holds ``bindings/c/include/airdata.h``.
    """
    for root in (SHARE, REPOSITORY):
        if (root / _MARKER).is_file():
            return root
    raise ResourceError(f"airdata's data files are missing: neither {SHARE} (an installed "
                        f"wheel) nor {REPOSITORY} (a clone of the repository) holds {_MARKER}; "
                        "reinstall the package")


def origin() -> str:
    """``"installed package"`` or ``"repository"``: where :func:`data_root` points."""
    return "installed package" if data_root() == SHARE else "repository"


def _existing(path: Path, what: str) -> Path:
    if not path.exists():
        raise ResourceError(f"{what} not found: {path} is missing from this installation "
                            f"({origin()}); reinstall the package")
    return path


def suite_dir(profile: str = "icao") -> Path:
    """Directory of the checked-in vector suite of ``profile``.

    Parameters
    ----------
    profile : {"icao", "us1976"}
        Constants profile of the suite.

    Returns
    -------
    Path
        The suite's directory (it holds ``manifest.json``).

    Raises
    ------
    ValueError
        Unknown profile.
    ResourceError
        The suite is missing from this installation.
    """
    if profile not in SUITE_FOLDERS:
        raise ValueError(f"profile {profile!r}: the checked-in suites are "
                         f"{', '.join(sorted(SUITE_FOLDERS))}")
    return _existing(data_root() / SUITE_FOLDERS[profile], f"the {profile} vector suite")


def c_dir() -> Path:
    """``bindings/c``: the port's Makefile and the folders below."""
    return _existing(data_root() / "bindings" / "c", "the C port")


def include_dir() -> Path:
    """``bindings/c/include``: ``airdata.h`` and ``airdata_batch.h``."""
    return _existing(c_dir() / "include", "the C interface headers")


def src_dir() -> Path:
    """``bindings/c/src``: the reference C99 port."""
    return _existing(c_dir() / "src", "the C port sources")


def runner_dir() -> Path:
    """``bindings/c/runner``: the C99 vector runner."""
    return _existing(c_dir() / "runner", "the vector runner")


def makefile() -> Path:
    """``bindings/c/Makefile`` of the port."""
    return _existing(c_dir() / "Makefile", "the port's Makefile")


def port_files() -> list[tuple[Path, str]]:
    """Every file of the C port: (source path, path relative to ``bindings/c``).

    Sources and private headers (``src/``), the interface (``include/``), the runner
    (``runner/``), the test driver (``tests/driver.c``) and the Makefile, sorted.
    """
    base = c_dir()
    out = [(makefile(), "Makefile")]
    for folder, patterns in SHARED_FILES:
        if not folder.startswith("bindings/c/"):
            continue
        sub = folder[len("bindings/c/"):]
        for pattern in patterns:
            out += [(p, f"{sub}/{p.name}") for p in sorted((base / sub).glob(pattern))]
    return sorted(set(out), key=lambda t: t[1])


def equations_doc() -> Path:
    """``docs/equations.md``: the equation ids with their published sources."""
    return _existing(data_root() / "docs" / "equations.md", "the equation table")


def suite_header_files(profile: str = "icao") -> list[tuple[Path, str]]:
    """The C headers of a checked-in suite: (source path, file name), sorted."""
    c = _existing(suite_dir(profile) / "c", f"the {profile} suite's C headers")
    return [(p, p.name) for p in sorted(c.glob("*.h"))]


class OverwriteError(FileExistsError):
    """Files a copy would overwrite (nothing was written).

    Attributes
    ----------
    existing : list of Path
        Every destination file that already exists.
    """

    def __init__(self, existing: list[Path]) -> None:
        self.existing = existing
        super().__init__(f"{len(existing)} file(s) exist and would be overwritten: "
                         + ", ".join(str(p) for p in existing))


def copy_files(files: list[tuple[Path, str]], dest: str | Path, force: bool = False
               ) -> list[Path]:
    """Copy ``(source, relative name)`` pairs into ``dest``, keeping the relative names.

    Parameters
    ----------
    files : list of (Path, str)
        What to copy, as :func:`port_files` and :func:`suite_header_files` give it.
    dest : str or Path
        Destination directory, made if missing.
    force : bool, optional
        Overwrite files that exist (default: refuse, writing nothing).

    Returns
    -------
    list of Path
        The files written, in order.

    Raises
    ------
    OverwriteError
        Some destination files exist and ``force`` is false; nothing was written.
    NotADirectoryError
        ``dest`` (or a folder inside it the copy needs) exists and is not a directory.
    """
    import shutil

    root = Path(dest)
    if root.exists() and not root.is_dir():
        raise NotADirectoryError(f"{root}: exists and is not a directory")
    targets = [(src, root / rel) for src, rel in files]
    for _, target in targets:
        for parent in target.relative_to(root).parents:
            folder = root / parent
            if folder.exists() and not folder.is_dir():
                raise NotADirectoryError(f"{folder}: exists and is not a directory")
        if target.is_dir():
            raise NotADirectoryError(f"{target}: is a directory, a file is to be copied there")
    existing = [t for _, t in targets if t.exists()]
    if existing and not force:
        raise OverwriteError(existing)
    for src, target in targets:
        target.parent.mkdir(parents=True, exist_ok=True)
        shutil.copyfile(src, target)
    return [t for _, t in targets]
