"""Building a vector suite from the Python reference.

``build_suite(out_dir, profile)`` writes::

    manifest.json                          suite version, profile, checksums, counts
    functions/<function>.json              one file per catalogue function
    schema/manifest-v1.schema.json         JSON Schema (draft 2020-12) of the manifest
    schema/function-<function>-v1.schema.json
    c/ad_vec_common.h, c/ad_vec_<function>.h, c/ad_vectors.h   C99 headers
    CHANGELOG.md                           the suite's version history and policy
    README.md                              the layout and fields of a suite

Everything is a pure function of the installed reference and the profile: building
twice gives byte-identical files.  Case ids are the first 12 hex digits of the SHA-256
of the function name and the exact inputs, so a case keeps its id when others are
added or removed.
"""

from __future__ import annotations

import math
from collections.abc import Iterable
from dataclasses import dataclass
from pathlib import Path
from typing import Any

import numpy as np
from numpy.typing import NDArray

from .. import __version__
from .._inputs import Domain
from ..notice import CAUTION_LINE
from ..profiles import Profile, get_profile
from ..status import Status
from . import history
from .cases import RANGE_WINDOW, TAGS, CaseSeed, around, window
from .catalogue import CATALOGUE, Arg, FunctionSpec, evaluate
from .cheader import render_common_header, render_function_header, render_umbrella_header
from .jsonio import dumps_compact, encode_number, sha256_hex
from .scale import (
    BINARY32_RULE,
    EPS_BINARY32,
    EPS_BINARY64,
    TOLERANCE_RULE,
    K,
    binary32_check,
    condition_scale,
    round_scale,
)
from .schema import (
    SCHEMA_VERSION,
    function_schema,
    manifest_schema,
    schema_path_of_function,
    schema_path_of_manifest,
)

__all__ = ["SUITE_VERSION", "build_suite", "build_function", "render_function_file",
           "case_id", "tolerance_block", "statuses_block", "suite_files"]

#: Semantic version of the suite this generator writes (see CHANGELOG.md).
SUITE_VERSION = history.CURRENT

F64 = NDArray[np.float64]

#: Smallest normal binary64 number: a case with a nonzero input or output below it is
#: tagged ``subnormal``.
_NORMAL_MIN = 2.0 ** -1022


def statuses_block() -> dict[str, int]:
    """Status names and their fixed numeric values."""
    return {s.name: int(s) for s in Status}


def tolerance_block() -> dict[str, Any]:
    """The tolerance rule recorded in the manifest and in every function file."""
    return {"k": K, "eps_binary64": encode_number(EPS_BINARY64),
            "eps_binary32": encode_number(EPS_BINARY32), "rule": TOLERANCE_RULE,
            "binary32_status_rule": BINARY32_RULE}


def case_id(spec: FunctionSpec, inputs: dict[str, float]) -> str:
    """Stable id of a case: derived from the function name and the exact inputs."""
    parts = [spec.name] + [
        (str(int(inputs[a.name])) if a.kind == "flag" else float(inputs[a.name]).hex())
        for a in spec.args]
    return sha256_hex("|".join(parts).encode("ascii"))[:12]


# ---------------------------------------------------------------------------------
# Case generation
# ---------------------------------------------------------------------------------

def _sweep(arg: Arg, profile: Profile, n: int) -> F64:
    assert arg.domain is not None
    d = arg.domain(profile)
    kind, lo, hi = arg.sweep
    lo = d.lo if lo is None else lo
    hi = d.hi if hi is None else hi
    if kind == "log":
        return np.geomspace(lo, hi, n)
    if kind == "mach":
        k = n // 2
        return np.concatenate([np.linspace(0.0, 1.0, k, endpoint=False),
                               np.linspace(1.0, hi, n - k)])
    return np.linspace(lo, hi, n)


def _invalid_values(d: Domain) -> list[tuple[float, tuple[str, ...]]]:
    vals: list[tuple[float, tuple[str, ...]]] = [
        (math.nan, ("nan",)), (math.inf, ("infinite",)), (-math.inf, ("infinite",))]
    if d.sign == "positive":
        vals += [(0.0, ("zero",)), (-0.0, ("zero",)), (-1.0, ("negative",)),
                 (-d.hi, ("negative",))]
    elif d.sign == "nonnegative":
        vals += [(-1.0, ("negative",)), (-5e-324, ("negative",)), (-0.0, ("zero",))]
    if d.sign == "any":
        vals.append((d.lo - max(1.0, abs(d.lo)), ("out-of-range",)))
    elif d.lo > 0.0:
        vals.append((d.lo / 2.0, ("out-of-range",)))
    vals += [(d.hi * 2.0 if d.hi > 0 else d.hi + 1.0, ("out-of-range",)),
             (1.0e300, ("out-of-range", "extreme"))]
    return vals


def _nominal_sets(spec: FunctionSpec, profile: Profile) -> list[dict[str, float]]:
    if spec.nominal_sets is not None:
        return spec.nominal_sets(profile)
    lists = {a.name: a.nominal(profile) for a in spec.args}
    n = max(len(v) for v in lists.values())
    return [{k: v[j % len(v)] for k, v in lists.items()} for j in range(n)]


def _with(spec: FunctionSpec, base: dict[str, float], **changes: float) -> dict[str, float]:
    x = dict(base)
    x.update(changes)
    if spec.name == "air_data":
        if "ps" in changes and math.isfinite(changes["ps"]) and changes["ps"] > 0:
            x["pt"] = changes["ps"] * 1.03
        if "setting" in changes:
            x["use_setting"] = 1.0
    return x


def generate_seeds(spec: FunctionSpec, profile: Profile) -> list[CaseSeed]:
    """Every case of ``spec`` before evaluation, in a fixed order."""
    seeds: list[CaseSeed] = []
    real = [a for a in spec.real_args if a.domain is not None]
    nominals = _nominal_sets(spec, profile)
    # 1. Dense sweep: a grid over the sweep range of every argument.
    if spec.grid:
        axes = [_sweep(a, profile, n) for a, n in zip(spec.args, spec.grid, strict=True)]
        mesh = np.meshgrid(*axes, indexing="ij")
        for idx in np.ndindex(mesh[0].shape):
            seeds.append(CaseSeed({a.name: float(m[idx]) for a, m in zip(spec.args, mesh,
                                                                        strict=True)},
                                  ("sweep",)))
        # 2. Seams of every argument, against each nominal set of the others.
        for a in real:
            for seam, tag in a.seams(profile):
                for v, moved in around(seam):
                    for base in nominals:
                        seeds.append(CaseSeed(_with(spec, base, **{a.name: v}),
                                              (tag,) + (("ulp-offset",) if moved else ())))
                for v in window(seam):
                    seeds.append(CaseSeed(_with(spec, nominals[0], **{a.name: v}),
                                          (tag, "seam-window")))
    # 3. Range ends at 0, +-1, +-4 ulp and in a window of relative offsets (an end
    #    typed with fewer digits, or rounded to binary32, moves by one of them);
    # 4. invalid and out-of-range inputs.
    for a in real:
        assert a.domain is not None
        d = a.domain(profile)
        for end in (d.lo, d.hi):
            for v, moved in around(end):
                for base in nominals[:2]:
                    seeds.append(CaseSeed(_with(spec, base, **{a.name: v}),
                                          ("range-end", "extreme")
                                          + (("ulp-offset",) if moved else ())))
            for v in window(end, RANGE_WINDOW):
                seeds.append(CaseSeed(_with(spec, nominals[0], **{a.name: v}),
                                      ("range-end", "seam-window")))
        for v, tags in _invalid_values(d):
            seeds.append(CaseSeed(_with(spec, nominals[0], **{a.name: v}), tags))
    # 5. Two bad arguments: the first in argument order decides.
    for i, a in enumerate(real):
        for b in real[i + 1:]:
            assert a.domain is not None and b.domain is not None
            a_out = a.domain(profile).hi * 2.0
            b_out = b.domain(profile).hi * 2.0
            seeds.append(CaseSeed(_with(spec, nominals[0], **{a.name: a_out, b.name: math.nan}),
                                  ("argument-order", "nan")))
            seeds.append(CaseSeed(_with(spec, nominals[0], **{a.name: math.nan, b.name: b_out}),
                                  ("argument-order", "nan")))
    # 6. Function-specific cases.
    seeds.extend(spec.extra(profile))
    return seeds


@dataclass
class EvaluatedCases:
    """Evaluated cases of one function, as arrays in case order (what a suite file is
    written from; a loaded suite file is :class:`airdata.portcheck.suite.FunctionCases`)."""

    ids: list[str]
    tags: list[tuple[str, ...]]
    inputs: dict[str, F64]
    expected: dict[str, F64]
    scale: dict[str, F64]
    status: NDArray[np.int8]
    check32: list[str]


def _dedupe(spec: FunctionSpec, seeds: Iterable[CaseSeed]) -> tuple[list[str], list[CaseSeed]]:
    order: list[str] = []
    merged: dict[str, CaseSeed] = {}
    for s in seeds:
        cid = case_id(spec, s.inputs)
        if cid in merged:
            old = merged[cid]
            if any(float(old.inputs[k]).hex() != float(s.inputs[k]).hex() for k in s.inputs):
                raise RuntimeError(f"{spec.name}: case id collision {cid}")  # pragma: no cover
            merged[cid] = CaseSeed(old.inputs, tuple(sorted(set(old.tags) | set(s.tags))))
        else:
            merged[cid] = s
            order.append(cid)
    return order, [merged[c] for c in order]


def evaluate_cases(spec: FunctionSpec, inputs: dict[str, F64], profile: Profile
                   ) -> tuple[dict[str, F64], dict[str, F64], NDArray[np.int8], list[str]]:
    """Expected outputs, rounded scales, statuses and binary32 check levels of a batch."""
    y, status = evaluate(spec, inputs, profile)
    scale = condition_scale(spec, inputs, y, status, profile)
    scale = {k: round_scale(v) for k, v in scale.items()}
    check32 = binary32_check(spec, inputs, y, status, profile)
    return y, scale, status, check32


def compute_cases(spec: FunctionSpec, profile: Profile) -> EvaluatedCases:
    """Generate, deduplicate and evaluate every case of ``spec``."""
    ids, seeds = _dedupe(spec, generate_seeds(spec, profile))
    inputs = {a.name: np.array([s.inputs[a.name] for s in seeds], dtype=np.float64)
              for a in spec.args}
    y, scale, status, check32 = evaluate_cases(spec, inputs, profile)
    tags = []
    mach = inputs.get("mach")
    for i, s in enumerate(seeds):
        t = set(s.tags) - {"invalid", "out-of-range", "zeroed"}
        if status[i] not in (Status.OK, Status.IMPACT_PRESSURE_ZEROED):
            t.add("invalid")
        if status[i] == Status.IMPACT_PRESSURE_ZEROED:
            t.add("zeroed")
        if status[i] == Status.OUT_OF_RANGE:
            t.add("out-of-range")
        if mach is not None and mach[i] > 1.0 and status[i] == Status.OK:
            t.add("supersonic")
        vals = [float(inputs[a.name][i]) for a in spec.real_args] \
            + [float(y[o][i]) for o, _ in spec.outputs]
        if any(0.0 < abs(v) < _NORMAL_MIN for v in vals):
            t.add("subnormal")
        assert t <= set(TAGS), t - set(TAGS)
        tags.append(tuple(sorted(t)))
    return EvaluatedCases(ids, tags, inputs, y, scale, status, check32)


# ---------------------------------------------------------------------------------
# Documents and files
# ---------------------------------------------------------------------------------

def _arg_valid(a: Arg, profile: Profile) -> str:
    if a.domain is None:
        return "0 or 1"
    d = a.domain(profile)
    bad = {"any": "NaN and infinities are invalid",
           "nonnegative": "NaN, infinities and negative values are invalid",
           "positive": "NaN, infinities, zero and negative values are invalid"}[d.sign]
    return f"{d.describe()}; {bad}; other values outside the range are out of range"


def build_function(spec: FunctionSpec, profile: Profile) -> dict[str, Any]:
    """The JSON document of one function file."""
    fc = compute_cases(spec, profile)
    cases = []
    for i, cid in enumerate(fc.ids):
        ins: dict[str, Any] = {}
        for a in spec.args:
            v = float(fc.inputs[a.name][i])
            ins[a.name] = int(v) if a.kind == "flag" else encode_number(v)
        cases.append({
            "id": cid,
            "tags": list(fc.tags[i]),
            "inputs": ins,
            "expected": {o: encode_number(fc.expected[o][i]) for o, _ in spec.outputs},
            "scale": {o: encode_number(fc.scale[o][i]) for o, _ in spec.outputs},
            "status": int(fc.status[i]),
            "binary32_check": fc.check32[i],
        })
    valid = int(np.count_nonzero((fc.status == Status.OK)
                                 | (fc.status == Status.IMPACT_PRESSURE_ZEROED)))
    return {
        "schema": schema_path_of_function(spec.name),
        "function": spec.name,
        "c_function": spec.c_name,
        "summary": spec.summary,
        "equations": list(spec.equations),
        "profile": profile.name,
        "suite_version": SUITE_VERSION,
        "inputs": [{"name": a.name, "unit": a.unit, "kind": a.kind,
                    "valid": _arg_valid(a, profile)} for a in spec.args],
        "outputs": [{"name": o, "unit": u} for o, u in spec.outputs],
        "statuses": statuses_block(),
        "tolerance": tolerance_block(),
        "tags": dict(sorted(TAGS.items())),
        "counts": {"valid": valid, "invalid": len(cases) - valid},
        "cases": cases,
    }


def render_function_file(doc: dict[str, Any]) -> str:
    """Text of a function file: header fields one per line, then one case per line."""
    lines = ["{"]
    for key, value in doc.items():
        if key != "cases":
            lines.append(f"{dumps_compact(key)}:{dumps_compact(value)},")
    lines.append('"cases":[')
    cases = [dumps_compact(c) for c in doc["cases"]]
    lines.append(",\n".join(cases))
    lines.append("]")
    lines.append("}")
    return "\n".join(lines) + "\n"


def render_json(doc: Any) -> str:
    """Indented JSON for small files (manifest, schemas)."""
    import json

    return json.dumps(doc, indent=1, ensure_ascii=True, allow_nan=False) + "\n"


def header_path(name: str) -> str:
    """Suite-relative path of the C header of function ``name``."""
    return f"c/ad_vec_{name}.h"


def suite_files(profile: Profile | str | None = None,
                specs: tuple[FunctionSpec, ...] = CATALOGUE) -> dict[str, bytes]:
    """Every file of a suite by suite-relative path (manifest last)."""
    prof = get_profile(profile)
    files: dict[str, bytes] = {}
    entries = []
    docs = []
    for spec in specs:
        doc = build_function(spec, prof)
        docs.append(doc)
        body = render_function_file(doc).encode("ascii")
        path = f"functions/{spec.name}.json"
        files[path] = body
        entries.append({"function": spec.name, "path": path, "c_header": header_path(spec.name),
                        "sha256": sha256_hex(body), "bytes": len(body),
                        "valid": doc["counts"]["valid"], "invalid": doc["counts"]["invalid"]})
    others: dict[str, bytes] = {}
    others[schema_path_of_manifest()] = render_json(manifest_schema()).encode("ascii")
    for spec in specs:
        others[schema_path_of_function(spec.name)] = \
            render_json(function_schema(spec)).encode("ascii")
    others["c/ad_vec_common.h"] = render_common_header(SUITE_VERSION, prof.name).encode("ascii")
    for doc in docs:
        others[header_path(doc["function"])] = render_function_header(doc).encode("ascii")
    others["c/ad_vectors.h"] = render_umbrella_header(
        [d["function"] for d in docs], SUITE_VERSION).encode("ascii")
    others["CHANGELOG.md"] = history.changelog_text().encode("utf-8")
    others["README.md"] = history.readme_text(K, prof.name).encode("utf-8")
    files.update(others)
    manifest = {
        "schema": schema_path_of_manifest(),
        "suite": "airdata golden vectors",
        "suite_version": SUITE_VERSION,
        "schema_version": SCHEMA_VERSION,
        "generator": {"package": "airdata", "version": __version__},
        "caution": CAUTION_LINE,
        "profile": prof.as_dict(),
        "statuses": statuses_block(),
        "tolerance": tolerance_block(),
        "functions": entries,
        "files": [{"path": p, "sha256": sha256_hex(b), "bytes": len(b)}
                  for p, b in sorted(others.items())],
        "totals": {"functions": len(entries),
                   "cases": sum(e["valid"] + e["invalid"] for e in entries),
                   "valid": sum(e["valid"] for e in entries),
                   "invalid": sum(e["invalid"] for e in entries)},
    }
    files["manifest.json"] = render_json(manifest).encode("ascii")
    return files


def build_suite(out_dir: str | Path, profile: Profile | str | None = None,
                specs: tuple[FunctionSpec, ...] = CATALOGUE) -> dict[str, Any]:
    """Write a complete suite under ``out_dir``; returns the manifest's totals.

    Files of an earlier suite that the new one does not contain are left alone only
    outside ``functions/``, ``schema/`` and ``c/``; inside them stale ``.json``/``.h``
    files are removed so the directory holds exactly one suite.
    """
    out = Path(out_dir)
    files = suite_files(profile, specs)
    for sub, pattern in (("functions", "*.json"), ("schema", "*.json"), ("c", "*.h")):
        d = out / sub
        if d.is_dir():
            for old in d.glob(pattern):
                if f"{sub}/{old.name}" not in files:
                    old.unlink()
    for rel, data in files.items():
        target = out / rel
        target.parent.mkdir(parents=True, exist_ok=True)
        target.write_bytes(data)
    import json

    return dict(json.loads(files["manifest.json"])["totals"],
                bytes=sum(len(b) for b in files.values()))
