"""Reading a suite's files: the one reader behind ``airdata vectors verify`` and the
port check's suite loader (:func:`airdata.portcheck.suite.load_cases`).

Each step raises :class:`~airdata.vectors.jsonio.VectorFileError` naming the file and
what is wrong with it; ``vectors verify`` records it as a problem of that file and goes
on, the port check stops with it.
"""

from __future__ import annotations

from pathlib import Path
from typing import Any

from .. import __version__
from .jsonio import MAX_FILE_BYTES, VectorFileError, load_json, sha256_hex
from .schema import SCHEMA_VERSION

__all__ = ["suite_root", "read_manifest", "read_listed"]


def suite_root(root: str | Path) -> Path:
    """``root`` as a path, refused unless it is a directory."""
    rootp = Path(root)
    if not rootp.is_dir():
        raise VectorFileError(rootp, "not a directory" if rootp.exists() else
                              "no such directory")
    return rootp


def read_manifest(root: Path, max_bytes: int = MAX_FILE_BYTES) -> dict[str, Any]:
    """The manifest of the suite in ``root``: a JSON object of the schema version this
    airdata reads (its schema is checked by the caller)."""
    path = root / "manifest.json"
    manifest = load_json(path, max_bytes)
    if not isinstance(manifest, dict):
        raise VectorFileError(path, "the manifest is not a JSON object")
    if manifest.get("schema_version") != SCHEMA_VERSION:
        raise VectorFileError(path, f"schema_version {manifest.get('schema_version')!r} is "
                                    f"not supported by airdata {__version__} (it reads "
                                    f"{SCHEMA_VERSION})")
    return manifest


def read_listed(root: Path, entry: dict[str, Any], max_bytes: int = MAX_FILE_BYTES) -> bytes:
    """The bytes of the file a manifest ``entry`` lists, after its size and SHA-256 are
    checked against the entry."""
    path = root / entry["path"]
    if not path.is_file():
        raise VectorFileError(path, "listed in the manifest but missing")
    size = path.stat().st_size
    if size > max_bytes:
        raise VectorFileError(path, f"file is {size} bytes, more than the limit of "
                                    f"{max_bytes}")
    data = path.read_bytes()
    if len(data) != entry["bytes"] or sha256_hex(data) != entry["sha256"]:
        raise VectorFileError(path, f"checksum mismatch: SHA-256 {sha256_hex(data)} "
                                    f"({len(data)} bytes), manifest says {entry['sha256']} "
                                    f"({entry['bytes']} bytes)")
    return data
