"""Reading the vector runner's summary text, for the tests that run it on other targets."""

from __future__ import annotations

import json
import re
from pathlib import Path


def suite_counts(vectors: Path) -> dict[str, int]:
    """Cases per function of the suite in ``vectors`` (its manifest)."""
    manifest = json.loads((vectors / "manifest.json").read_text())
    return {e["function"]: e["valid"] + e["invalid"] for e in manifest["functions"]}


def suite_skips(vectors: Path, precision: str) -> dict[str, int]:
    """Cases per function that a ``precision`` build skips: binary32 skips those whose
    ``binary32_check`` is ``skip`` (inputs or outputs outside binary32's normal range),
    binary64 none."""
    out = {}
    for path in sorted((vectors / "functions").glob("*.json")):
        cases = json.loads(path.read_text())["cases"]
        out[path.stem] = (sum(c.get("binary32_check") == "skip" for c in cases)
                          if precision == "binary32" else 0)
    return out


def runner_summary(out: str) -> dict[str, tuple[int, int, int]]:
    """The runner's summary lines: function -> (cases, passed, failed)."""
    rows = {}
    for m in re.finditer(r"^(\w+)\s+(\d+) cases\s+(\d+) passed\s+(\d+) failed", out, re.M):
        rows[m.group(1)] = (int(m.group(2)), int(m.group(3)), int(m.group(4)))
    return rows
