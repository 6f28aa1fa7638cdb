"""Reading a vector suite into arrays for a port check.

Only what a check needs is read: the manifest, and the function files selected.  The
manifest is checked against its schema, every selected file against its SHA-256 and
size in the manifest and against its function schema, and every number's two forms
(decimal and C99 hex float) must name the same binary64 value.  Any problem raises
:class:`SuiteError` naming the file (and the case where there is one).

An engineering and verification aid, not certified flight software.
"""

from __future__ import annotations

from collections.abc import Sequence
from dataclasses import dataclass, field
from pathlib import Path
from typing import Any

import numpy as np
from numpy.typing import NDArray

from ..vectors.catalogue import CATALOGUE
from ..vectors.jsonio import VectorFileError, decode_number, load_json
from ..vectors.schema import function_schema, manifest_schema, validate
from ..vectors.suitefiles import read_listed, read_manifest, suite_root

__all__ = ["SuiteError", "FunctionCases", "LoadedSuite", "load_cases", "B32_CODES"]

#: ``binary32_check`` level -> small integer code used in the arrays.
B32_CODES: dict[str, int] = {"full": 0, "lenient": 1, "skip": 2}

_SPECS = {s.name: s for s in CATALOGUE}


class SuiteError(ValueError):
    """A vector suite is missing, malformed, or does not match its manifest."""


@dataclass
class FunctionCases:
    """The cases of one function as arrays (one row per case).

    Attributes
    ----------
    name : str
        Function name of the reference (the C function is ``c_function``).
    c_function : str
        Name of the C function in ``airdata.h``.
    inputs : list of (name, kind)
        Argument names in C order and their kind (``"real"`` or ``"flag"``).
    outputs : list of str
        Output names in order (fields of the C output struct when there are several).
    ids : list of str
        Stable case ids.
    x : ndarray, shape (n, n_inputs)
        Inputs (flags as 0.0/1.0).
    expected, scale : ndarray, shape (n, n_outputs)
        Expected outputs and their condition scales (NaN where expected is NaN).
    status : ndarray of int, shape (n,)
        Expected status.
    b32 : ndarray of int, shape (n,)
        ``binary32_check`` as a code of :data:`B32_CODES`.
    tags : list of tuple of str
        Each case's tags (why it exists); empty when not known.
    """

    name: str
    c_function: str
    inputs: list[tuple[str, str]]
    outputs: list[str]
    ids: list[str]
    x: NDArray[np.float64]
    expected: NDArray[np.float64]
    scale: NDArray[np.float64]
    status: NDArray[np.int64]
    b32: NDArray[np.int64]
    tags: list[tuple[str, ...]] = field(default_factory=list)

    @property
    def count(self) -> int:
        """Number of cases."""
        return len(self.ids)


@dataclass
class LoadedSuite:
    """A suite read for a check: its tolerance and the selected functions' cases."""

    root: Path
    suite_version: str
    profile: str
    k: float
    eps_binary64: float
    eps_binary32: float
    functions: dict[str, FunctionCases] = field(default_factory=dict)
    #: Cases left out at loading by tag (``skip_tags`` of :func:`load_cases`), per function.
    skipped: dict[str, int] = field(default_factory=dict)


def _num(pair: Any, where: str) -> float:
    try:
        return decode_number(pair, where)
    except ValueError as exc:
        raise SuiteError(str(exc)) from None


def _function_cases(rel: str, doc: dict[str, Any],
                    skip_tags: Sequence[str] = ()) -> FunctionCases:
    inputs = [(str(a["name"]), str(a["kind"])) for a in doc["inputs"]]
    outputs = [str(o["name"]) for o in doc["outputs"]]
    cases = [c for c in doc["cases"] if not set(skip_tags) & set(c.get("tags", ()))]
    n = len(cases)
    x = np.empty((n, len(inputs)))
    expected = np.empty((n, len(outputs)))
    scale = np.empty((n, len(outputs)))
    status = np.empty(n, dtype=np.int64)
    b32 = np.empty(n, dtype=np.int64)
    ids = []
    tags: list[tuple[str, ...]] = []
    for i, case in enumerate(cases):
        cid = str(case["id"])
        ids.append(cid)
        tags.append(tuple(str(t) for t in case.get("tags", ())))
        where = f"{rel}: case {cid}"
        for j, (name, kind) in enumerate(inputs):
            v = case["inputs"][name]
            x[i, j] = float(v) if kind == "flag" else _num(v, f"{where}: input {name}")
        for j, name in enumerate(outputs):
            expected[i, j] = _num(case["expected"][name], f"{where}: expected {name}")
            scale[i, j] = _num(case["scale"][name], f"{where}: scale {name}")
        status[i] = int(case["status"])
        b32[i] = B32_CODES[case["binary32_check"]]
    return FunctionCases(str(doc["function"]), str(doc["c_function"]), inputs, outputs, ids,
                         x, expected, scale, status, b32, tags)


def load_cases(root: str | Path | None = None, only: Sequence[str] | None = None,
               profile: str | None = None, skip_tags: Sequence[str] = ()) -> LoadedSuite:
    """Read a suite (all functions, or those named in ``only``) for a port check.

    Parameters
    ----------
    root : str or Path, optional
        Suite directory holding ``manifest.json``; default: the checked-in suite of
        ``profile`` that this installation carries (:func:`airdata.resources.suite_dir`).
    only : sequence of str, optional
        Function names to read; every name must be in the manifest.
    profile : {"icao", "us1976"}, optional
        Constants profile the suite must have (default: icao when ``root`` is not
        given, else whatever the suite's manifest says).
    skip_tags : sequence of str, optional
        Leave out every case carrying one of these tags (``subnormal`` for a target that
        flushes subnormal numbers to zero); the count per function is in ``skipped``.

    Returns
    -------
    LoadedSuite
        Tolerance constants and the cases of the selected functions, in manifest order.

    Raises
    ------
    SuiteError
        Missing directory or manifest, schema violation, checksum mismatch, unknown
        function, a profile other than ``profile``, or an unreadable number; the
        message names the file.
    """
    if root is None:
        from .. import resources

        try:
            root = resources.suite_dir(profile or "icao")
        except (resources.ResourceError, ValueError) as exc:
            raise SuiteError(str(exc)) from None
    try:
        rootp = suite_root(root)
    except VectorFileError:
        raise SuiteError(f"{Path(root)}: no vector suite here (not a directory); build one with "
                         "'airdata vectors build' or pass --suite DIR") from None
    try:
        manifest = read_manifest(rootp)
    except VectorFileError as exc:
        raise SuiteError(str(exc)) from None
    errors = validate(manifest, manifest_schema())
    if errors:
        raise SuiteError(f"{rootp / 'manifest.json'}: schema violation: {errors[0]}")
    entries = {e["function"]: e for e in manifest["functions"]}
    names = list(entries) if not only else list(dict.fromkeys(only))
    unknown = [n for n in names if n not in entries]
    if unknown:
        raise SuiteError(f"function(s) {', '.join(unknown)} not in the suite; it has: "
                         f"{', '.join(entries)}")
    if profile is not None and manifest["profile"]["name"] != profile:
        raise SuiteError(f"{rootp}: the suite has profile {manifest['profile']['name']!r}, "
                         f"not {profile!r}")
    tol = manifest["tolerance"]
    suite = LoadedSuite(rootp, str(manifest["suite_version"]), str(manifest["profile"]["name"]),
                        float(tol["k"]), _num(tol["eps_binary64"], "manifest eps_binary64"),
                        _num(tol["eps_binary32"], "manifest eps_binary32"))
    for name in names:
        entry = entries[name]
        rel = entry["path"]
        path = rootp / rel
        try:
            read_listed(rootp, entry)
        except VectorFileError as exc:
            raise SuiteError(str(exc)) from None
        spec = _SPECS.get(name)
        if spec is None:
            raise SuiteError(f"{path}: function {name!r} is not known to this airdata")
        try:
            doc = load_json(path)
        except VectorFileError as exc:
            raise SuiteError(str(exc)) from None
        errors = validate(doc, function_schema(spec), limit=1)
        if errors:
            raise SuiteError(f"{path}: schema violation: {errors[0]}")
        suite.functions[name] = _function_cases(rel, doc, skip_tags)
        if skip_tags:
            suite.skipped[name] = len(doc["cases"]) - suite.functions[name].count
    return suite
