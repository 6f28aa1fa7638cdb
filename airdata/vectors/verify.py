"""Verifying a vector suite: checksums, schema, C headers, and every expected value.

``verify_suite(dir)`` returns a :class:`VerifyReport` listing every problem with the
file, the case id where there is one, and what is wrong.  The re-check of expected
values recomputes each case with the installed reference and asks for bit-exact
equality of every expected value (``exact=True``, the staleness check) or, with
``exact=False``, accepts last-bit differences within half the acceptance bound, which a
different numpy or libm build of the same reference can give (they are counted as
``drift``); statuses and binary32 flags must be equal either way, and scales must agree
to 2 % (they are stored to 3 digits).
"""

from __future__ import annotations

import json
import math
from dataclasses import dataclass, field
from pathlib import Path
from typing import Any

import numpy as np

from .. import __version__
from ..profiles import PROFILES
from ..status import Status
from .build import case_id, evaluate_cases, header_path, render_json
from .catalogue import CATALOGUE, FunctionSpec
from .cheader import render_common_header, render_function_header, render_umbrella_header
from .jsonio import MAX_FILE_BYTES, VectorFileError, decode_number, load_json
from .scale import EPS_BINARY64, K
from .schema import (
    SCHEMA_VERSION,
    SchemaError,
    function_schema,
    manifest_schema,
    schema_path_of_function,
    schema_path_of_manifest,
    validate,
)
from .suitefiles import read_listed, read_manifest, suite_root

__all__ = ["Problem", "VerifyReport", "Suite", "load_suite", "verify_suite"]

_SPECS = {s.name: s for s in CATALOGUE}


@dataclass(frozen=True)
class Problem:
    """One thing wrong with a suite."""

    file: str
    case: str | None
    message: str

    def __str__(self) -> str:
        where = self.file + (f": case {self.case}" if self.case else "")
        return f"{where}: {self.message}"


@dataclass
class Suite:
    """A loaded suite: its manifest and its function documents by function name."""

    root: Path
    manifest: dict[str, Any]
    docs: dict[str, dict[str, Any]] = field(default_factory=dict)


@dataclass
class VerifyReport:
    """Outcome of :func:`verify_suite`."""

    root: str
    problems: list[Problem] = field(default_factory=list)
    suite_version: str = "?"
    profile: str = "?"
    functions: int = 0
    cases: int = 0
    valid: int = 0
    invalid: int = 0
    rechecked: bool = False
    exact: bool = True
    drift: int = 0

    @property
    def ok(self) -> bool:
        """True when no problem was found."""
        return not self.problems

    def summary(self) -> str:
        """One paragraph for the command line."""
        if not self.ok:
            return (f"vector suite {self.root}: {len(self.problems)} problem(s) found "
                    f"(suite {self.suite_version})")
        if not self.rechecked:
            what = "checksums, schema and C headers checked (values not re-computed)"
        elif self.exact or not self.drift:
            what = ("checksums, schema, C headers and every expected value re-checked against "
                    f"airdata {__version__} (bit-exact)")
        else:
            what = ("checksums, schema, C headers and every expected value re-checked against "
                    f"airdata {__version__}: {self.drift} value(s) differ in the last bits, "
                    "all within half the acceptance bound (a different numpy or libm build; "
                    "--exact refuses them)")
        return (f"vector suite {self.root}: OK - suite {self.suite_version}, profile "
                f"{self.profile}: {self.functions} functions, {self.cases} cases "
                f"({self.valid} valid, {self.invalid} invalid); {what}")


def _schema_problems(rel: str, doc: Any, schema: dict[str, Any]) -> list[Problem]:
    out = []
    try:
        errors = validate(doc, schema)
    except SchemaError as exc:
        return [Problem(rel, None, f"schema error: {exc}")]
    for err in errors:
        case = None
        if err.startswith("/cases/") and isinstance(doc, dict):
            try:
                n = int(err.split("/")[2].split(":")[0])
                cid = doc["cases"][n].get("id") if isinstance(doc["cases"][n], dict) else None
                case = cid if isinstance(cid, str) else f"#{n}"
            except (ValueError, IndexError, KeyError, TypeError):
                case = None
        out.append(Problem(rel, case, f"schema violation: {err}"))
    return out


def load_suite(root: str | Path, problems: list[Problem] | None = None,
               max_bytes: int = MAX_FILE_BYTES) -> Suite:
    """Load and structurally check a suite: sizes, JSON, checksums, schema.

    Problems are appended to ``problems`` (a list is made when ``None``); a manifest that
    cannot be read raises :class:`VectorFileError`.
    """
    probs = [] if problems is None else problems
    rootp = suite_root(root)
    manifest = read_manifest(rootp, max_bytes)
    suite = Suite(rootp, manifest)
    mschema = manifest_schema()
    bad = _schema_problems("manifest.json", manifest, mschema)
    if bad:
        probs.extend(bad)
        return suite
    listed: set[str] = {"manifest.json"}
    for entry in manifest["files"] + manifest["functions"]:
        rel = entry["path"]
        listed.add(rel)
        try:
            read_listed(rootp, entry, max_bytes)
        except VectorFileError as exc:
            probs.append(Problem(rel, None, exc.problem))
    for sub in ("functions", "schema", "c"):
        d = rootp / sub
        if d.is_dir():
            for f in sorted(d.iterdir()):
                rel = f"{sub}/{f.name}"
                if rel not in listed:
                    probs.append(Problem(rel, None, "file not listed in the manifest"))
    for entry in manifest["functions"]:
        rel = entry["path"]
        name = entry["function"]
        if not (rootp / rel).is_file():
            continue
        try:
            doc = load_json(rootp / rel, max_bytes)
        except VectorFileError as exc:
            probs.append(Problem(rel, None, exc.problem))
            continue
        spec = _SPECS.get(name)
        if spec is None:
            probs.append(Problem(rel, None, f"function {name!r} is not in the catalogue of "
                                            f"airdata {__version__}"))
            continue
        if not isinstance(doc, dict) or doc.get("schema") != schema_path_of_function(name):
            probs.append(Problem(rel, None, f"does not name its schema "
                                            f"{schema_path_of_function(name)!r}"))
            continue
        bad = _schema_problems(rel, doc, function_schema(spec))
        if bad:
            probs.extend(bad)
            continue
        suite.docs[name] = doc
    return suite


def _same(a: float, b: float) -> bool:
    if math.isnan(a) or math.isnan(b):
        return math.isnan(a) and math.isnan(b)
    return a == b and math.copysign(1.0, a) == math.copysign(1.0, b)


def _fmt(x: float) -> str:
    return f"{x!r} ({x.hex()})"


def _check_doc(spec: FunctionSpec, rel: str, doc: dict[str, Any], manifest: dict[str, Any],
               entry: dict[str, Any], recompute: bool, exact: bool = True,
               drift: list[int] | None = None) -> list[Problem]:
    probs: list[Problem] = []
    prof = PROFILES[manifest["profile"]["name"]]
    if doc["function"] != entry["function"]:
        probs.append(Problem(rel, None, f"names function {doc['function']!r}, manifest says "
                                        f"{entry['function']!r}"))
    if doc["profile"] != prof.name or doc["suite_version"] != manifest["suite_version"]:
        probs.append(Problem(rel, None, "profile or suite version differs from the manifest"))
    want_in = [a.name for a in spec.args]
    want_out = [o for o, _ in spec.outputs]
    if [a["name"] for a in doc["inputs"]] != want_in or \
            [o["name"] for o in doc["outputs"]] != want_out:
        probs.append(Problem(rel, None, f"inputs/outputs differ from the catalogue "
                                        f"({want_in} -> {want_out})"))
        return probs
    cases = doc["cases"]
    ids: set[str] = set()
    n = len(cases)
    x = {a: np.empty(n) for a in want_in}
    exp = {o: np.empty(n) for o in want_out}
    sc = {o: np.empty(n) for o in want_out}
    st = np.empty(n, dtype=np.int8)
    sk: list[str] = []
    for i, c in enumerate(cases):
        cid = c["id"]
        try:
            for a in spec.args:
                v = c["inputs"][a.name]
                x[a.name][i] = float(v) if a.kind == "flag" else \
                    decode_number(v, f"input {a.name}")
            for o in want_out:
                exp[o][i] = decode_number(c["expected"][o], f"expected {o}")
                sc[o][i] = decode_number(c["scale"][o], f"scale {o}")
        except ValueError as exc:
            probs.append(Problem(rel, cid, str(exc)))
            return probs
        if cid in ids:
            probs.append(Problem(rel, cid, "duplicate case id"))
        ids.add(cid)
        want_id = case_id(spec, {a: x[a][i] for a in want_in})
        if want_id != cid:
            probs.append(Problem(rel, cid, f"id does not match the inputs (expected {want_id})"))
        st[i] = c["status"]
        sk.append(c["binary32_check"])
    valid = int(np.count_nonzero((st == Status.OK) | (st == Status.IMPACT_PRESSURE_ZEROED)))
    if doc["counts"] != {"valid": valid, "invalid": n - valid}:
        probs.append(Problem(rel, None, f"counts {doc['counts']} do not match the cases "
                                        f"({valid} valid, {n - valid} invalid)"))
    if (entry["valid"], entry["invalid"]) != (valid, n - valid):
        probs.append(Problem("manifest.json", None, f"{rel}: counts {entry['valid']}/"
                                                    f"{entry['invalid']} do not match the "
                                                    f"file ({valid}/{n - valid})"))
    if not recompute:
        return probs
    y, scale, status, skip = evaluate_cases(spec, x, prof)
    for i, c in enumerate(cases):
        cid = c["id"]
        if status[i] != st[i]:
            probs.append(Problem(rel, cid, f"status {Status(int(st[i])).name} but the "
                                           f"reference gives {Status(int(status[i])).name}"))
        for o in want_out:
            got, want = float(y[o][i]), float(exp[o][i])
            if not _same(got, want):
                bound = K * EPS_BINARY64 * sc[o][i]
                within = (not math.isnan(got) and not math.isnan(want)
                          and abs(got - want) <= bound)
                if not exact and within and abs(got - want) <= 0.5 * bound:
                    if drift is not None:
                        drift[0] += 1
                    continue
                probs.append(Problem(rel, cid, f"expected {o} = {_fmt(want)} but the reference "
                                               f"gives {_fmt(got)} ("
                                               f"{'within' if within else 'beyond'} tolerance)"))
            s_new, s_old = float(scale[o][i]), float(sc[o][i])
            if not ((math.isnan(s_new) and math.isnan(s_old))
                    or abs(s_new - s_old) <= 0.02 * max(abs(s_new), abs(s_old))):
                probs.append(Problem(rel, cid, f"scale of {o} = {s_old!r} but the reference "
                                               f"gives {s_new!r}"))
        if skip[i] != sk[i]:
            probs.append(Problem(rel, cid, f"binary32_check {sk[i]!r} but the rule "
                                           f"gives {skip[i]!r}"))
    return probs


def verify_suite(root: str | Path = "vectors", recompute: bool = True,
                 max_bytes: int = MAX_FILE_BYTES, exact: bool = True) -> VerifyReport:
    """Check a suite completely; see the module docstring."""
    report = VerifyReport(str(Path(root)), exact=exact)
    drift = [0]
    try:
        suite = load_suite(root, report.problems, max_bytes)
    except VectorFileError as exc:
        # Problem files are relative to the suite root ("." for the root itself).
        try:
            rel = Path(exc.path).relative_to(Path(root)).as_posix()
        except ValueError:
            rel = exc.path
        report.problems.append(Problem(rel, None, exc.problem))
        return report
    m = suite.manifest
    report.suite_version = str(m.get("suite_version", "?"))
    if any(p.file == "manifest.json" for p in report.problems):
        return report
    prof = PROFILES.get(m["profile"]["name"])
    if prof is None:
        report.problems.append(Problem("manifest.json", None,
                                       f"unknown constants profile {m['profile']['name']!r}"))
        return report
    report.profile = prof.name
    if json.loads(json.dumps(prof.as_dict())) != m["profile"]:
        report.problems.append(Problem("manifest.json", None,
                                       f"constants of profile {prof.name!r} differ from "
                                       f"airdata {__version__}"))
    rootp = Path(root)
    # Generated files that must match what this airdata version writes.
    expect: dict[str, str] = {
        schema_path_of_manifest(): render_json(manifest_schema()),
        "c/ad_vec_common.h": render_common_header(m["suite_version"], prof.name),
        "c/ad_vectors.h": render_umbrella_header([e["function"] for e in m["functions"]],
                                                 m["suite_version"]),
    }
    for e in m["functions"]:
        spec = _SPECS.get(e["function"])
        if spec is not None:
            expect[schema_path_of_function(spec.name)] = render_json(function_schema(spec))
    listed = {f["path"] for f in m["files"]}
    for e in m["functions"]:
        doc = suite.docs.get(e["function"])
        if doc is not None:
            expect[e["c_header"]] = render_function_header(doc)
            if e["c_header"] != header_path(e["function"]):
                report.problems.append(Problem("manifest.json", None,
                                               f"{e['function']}: C header path "
                                               f"{e['c_header']!r} is not the expected one"))
    for rel, text in expect.items():
        p = rootp / rel
        if rel not in listed:
            report.problems.append(Problem(rel, None, "missing from the manifest's file list"))
        elif p.is_file() and p.stat().st_size <= max_bytes and \
                p.read_bytes() != text.encode("ascii"):
            what = ("does not match the JSON cases it is generated from"
                    if rel.startswith("c/") else "differs from the file this airdata "
                    f"version writes for format version {SCHEMA_VERSION}")
            report.problems.append(Problem(rel, None, what))
    for e in m["functions"]:
        doc = suite.docs.get(e["function"])
        spec = _SPECS.get(e["function"])
        if doc is None or spec is None:
            continue
        report.problems.extend(_check_doc(spec, e["path"], doc, m, e, recompute, exact, drift))
        report.functions += 1
        report.cases += len(doc["cases"])
        report.valid += doc["counts"]["valid"]
        report.invalid += doc["counts"]["invalid"]
    report.rechecked = recompute
    report.drift = drift[0]
    return report
