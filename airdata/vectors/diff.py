"""Comparing two vector suites and deciding the version bump a change needs.

Cases are matched by id (derived from the exact inputs, so an id names the same
inputs in both suites).  Per function: cases added, removed, changed beyond tolerance
(status changed, NaN-ness changed, or an expected value moved by more than
k * eps_binary64 * scale, with the old scale), changed within tolerance, and metadata
changes (tags, scales, binary32 check level).  The policy of vectors/CHANGELOG.md
turns these into the bump required: major, minor, patch or none.
"""

from __future__ import annotations

import math
from dataclasses import dataclass, field
from pathlib import Path
from typing import Any

from .jsonio import decode_number
from .scale import EPS_BINARY64
from .verify import Problem, load_suite

__all__ = ["FunctionDiff", "SuiteDiff", "diff_suites", "BUMPS", "bump_between"]

#: Bumps from smallest to largest.
BUMPS = ("none", "patch", "minor", "major")


def _parse(version: str) -> tuple[int, int, int]:
    a, b, c = version.split(".")
    return int(a), int(b), int(c)


def bump_between(old: str, new: str) -> str:
    """The bump from version ``old`` to ``new``: none/patch/minor/major or downgrade."""
    o, n = _parse(old), _parse(new)
    if n < o:
        return "downgrade"
    if n[0] > o[0]:
        return "major"
    if n[1] > o[1]:
        return "minor"
    if n[2] > o[2]:
        return "patch"
    return "none"


@dataclass
class FunctionDiff:
    """Differences of one function between two suites."""

    function: str
    added: list[str] = field(default_factory=list)
    removed: list[str] = field(default_factory=list)
    beyond: list[tuple[str, str]] = field(default_factory=list)
    within: list[str] = field(default_factory=list)
    metadata: list[str] = field(default_factory=list)
    note: str = ""

    @property
    def required(self) -> str:
        """Bump this function's changes need."""
        if self.removed or self.beyond or self.note in ("removed",):
            return "major"
        if self.added or self.note == "added":
            return "minor"
        if self.within or self.metadata:
            return "patch"
        return "none"


@dataclass
class SuiteDiff:
    """Outcome of :func:`diff_suites`."""

    old_version: str
    new_version: str
    functions: list[FunctionDiff] = field(default_factory=list)
    suite_notes: list[tuple[str, str]] = field(default_factory=list)  # (bump, why)
    problems: list[Problem] = field(default_factory=list)

    @property
    def required(self) -> str:
        """Bump the whole change needs."""
        levels = [f.required for f in self.functions] + [b for b, _ in self.suite_notes]
        return max(levels, key=BUMPS.index, default="none")

    @property
    def made(self) -> str:
        """Bump the new suite's version makes."""
        return bump_between(self.old_version, self.new_version)

    @property
    def sufficient(self) -> bool:
        """Whether the new version makes at least the required bump."""
        if self.made == "downgrade":
            return False
        return BUMPS.index(self.made) >= BUMPS.index(self.required)

    def render(self, details: int = 5) -> str:
        """Human-readable report."""
        lines = [f"suite {self.old_version} -> {self.new_version}"]
        lines.append(f"{'function':<27} {'added':>6} {'removed':>8} {'beyond':>7} "
                     f"{'within':>7} {'meta':>6}  bump")
        for f in self.functions:
            lines.append(f"{f.function:<27} {len(f.added):>6} {len(f.removed):>8} "
                         f"{len(f.beyond):>7} {len(f.within):>7} {len(f.metadata):>6}  "
                         f"{f.required}{' (' + f.note + ')' if f.note else ''}")
            for cid, why in f.beyond[:details]:
                lines.append(f"    changed beyond tolerance: case {cid}: {why}")
            for cid in f.removed[:details]:
                lines.append(f"    removed: case {cid}")
        for bump, why in self.suite_notes:
            lines.append(f"suite: {why} ({bump})")
        verdict = "sufficient" if self.sufficient else "NOT sufficient"
        lines.append(f"required bump: {self.required}; the new version makes a {self.made} "
                     f"bump: {verdict}")
        return "\n".join(lines)


def _num(pair: Any) -> float:
    return decode_number(pair, "number")


def _diff_function(name: str, old: dict[str, Any], new: dict[str, Any], k: float
                   ) -> FunctionDiff:
    fd = FunctionDiff(name)
    oc = {c["id"]: c for c in old["cases"]}
    nc = {c["id"]: c for c in new["cases"]}
    fd.added = [i for i in nc if i not in oc]
    fd.removed = [i for i in oc if i not in nc]
    for cid, a in oc.items():
        b = nc.get(cid)
        if b is None:
            continue
        if a["status"] != b["status"]:
            fd.beyond.append((cid, f"status {a['status']} -> {b['status']}"))
            continue
        if set(a["expected"]) != set(b["expected"]):
            fd.beyond.append((cid, "outputs differ"))
            continue
        moved = False
        for o, pa in a["expected"].items():
            va, vb = _num(pa), _num(b["expected"][o])
            if math.isnan(va) or math.isnan(vb):
                if math.isnan(va) != math.isnan(vb):
                    fd.beyond.append((cid, f"{o}: {pa[0]} -> {b['expected'][o][0]}"))
                    moved = True
                    break
                continue
            bound = k * EPS_BINARY64 * _num(a["scale"][o])
            if abs(vb - va) > bound:
                fd.beyond.append((cid, f"{o}: {pa[0]} -> {b['expected'][o][0]} "
                                       f"(bound {bound:.3g})"))
                moved = True
                break
            if pa != b["expected"][o]:
                moved = True
        if fd.beyond and fd.beyond[-1][0] == cid:
            continue
        if moved:
            fd.within.append(cid)
        elif (a["tags"], a["scale"], a["binary32_check"]) != \
                (b["tags"], b["scale"], b["binary32_check"]):
            fd.metadata.append(cid)
    head_a = {k_: v for k_, v in old.items() if k_ not in ("cases", "counts", "suite_version")}
    head_b = {k_: v for k_, v in new.items() if k_ not in ("cases", "counts", "suite_version")}
    if head_a != head_b:
        fd.metadata.append("(file header)")
    return fd


def diff_suites(old_dir: str | Path, new_dir: str | Path) -> SuiteDiff:
    """Compare two suites (both are loaded and checked for structure and schema)."""
    probs: list[Problem] = []
    old = load_suite(old_dir, probs)
    new = load_suite(new_dir, probs)
    d = SuiteDiff(str(old.manifest.get("suite_version", "0.0.0")),
                  str(new.manifest.get("suite_version", "0.0.0")), problems=probs)
    if probs:
        return d
    om, nm = old.manifest, new.manifest
    if om["schema_version"] != nm["schema_version"]:
        d.suite_notes.append(("major", f"schema version {om['schema_version']} -> "
                                       f"{nm['schema_version']}"))
    if om["profile"] != nm["profile"]:
        d.suite_notes.append(("major", f"constants profile {om['profile']['name']} changed"))
    if om["tolerance"] != nm["tolerance"]:
        d.suite_notes.append(("major", "tolerance rule changed"))
    k = float(om["tolerance"]["k"])
    for name in sorted(set(old.docs) | set(new.docs)):
        if name not in new.docs:
            d.functions.append(FunctionDiff(name, removed=[c["id"] for c in
                                                           old.docs[name]["cases"]],
                                            note="removed"))
        elif name not in old.docs:
            d.functions.append(FunctionDiff(name, added=[c["id"] for c in
                                                         new.docs[name]["cases"]],
                                            note="added"))
        else:
            d.functions.append(_diff_function(name, old.docs[name], new.docs[name], k))
    return d
