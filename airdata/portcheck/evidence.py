"""Verification evidence of a port check: text, JSON (with a schema), JUnit XML, CSV,
(the HTML page and the plots: :mod:`airdata.portcheck.page`).

Everything taken from outside (file names, case ids, compiler output, requirement
texts) is escaped in HTML and XML and length-bounded.  The JSON report follows
``report.schema.json`` (shipped in this package, :func:`report_schema`).

An engineering and verification aid, not certified flight software.
"""

from __future__ import annotations

import csv
import datetime as _dt
import hashlib
import html
import json
import math
import os
import platform
import re
import shutil
import subprocess
import sysconfig
import xml.etree.ElementTree as ET
from collections.abc import Sequence
from importlib import resources
from pathlib import Path
from typing import Any

from .. import __version__
from ..notice import CAUTION
from .verdict import LEVEL_REFERENCE, LEVEL_REQUIREMENTS, PRECISION_LABEL, FunctionVerdict, Report

__all__ = ["CAUTION", "environment", "report_json", "report_schema",
           "render_summary", "write_junit", "write_failures",
           "sha256_file", "equation_table", "REPORT_FORMAT"]

REPORT_FORMAT = "airdata-port-report-1"
_MAX = 300


def bounded(text: object, n: int = _MAX) -> str:
    s = str(text)
    return s if len(s) <= n else s[:n - 3] + "..."


def esc(text: object, n: int = _MAX) -> str:
    return html.escape(bounded(text, n), quote=True)


#: What a check of outputs and statuses does not cover: the rest of the interface contract
#: of airdata.h / airdata_batch.h, which the C vector runner checks (on the host with
#: ``make -C DIR runner``, on a target in judge-on-target mode; docs/exchange.md).
CHECKS_NOT_RUN: tuple[str, ...] = (
    "the NULL rule: every output pointer passed as NULL returns AD_INVALID_INPUT",
    "the batch entry points ad_<name>_n of airdata_batch.h and ad_check_n",
)
CHECKS_NOT_RUN_NOTE = ("not checked here (the vector runner checks them: make -C DIR runner, "
                       "or on the target, docs/exchange.md): " + "; ".join(CHECKS_NOT_RUN))


def sha256_file(path: str | Path) -> str:
    """SHA-256 of a file's bytes (hex)."""
    h = hashlib.sha256()
    with open(path, "rb") as f:
        for block in iter(lambda: f.read(1 << 16), b""):
            h.update(block)
    return h.hexdigest()


def _compiler_version(cc: str) -> str:
    exe = shutil.which(cc.split()[0]) if cc else None
    if exe is None:
        return "unknown"
    try:
        out = subprocess.run([exe, "--version"], capture_output=True, text=True, timeout=20,
                             check=False).stdout
    except (OSError, subprocess.SubprocessError):
        return "unknown"
    return bounded(out.splitlines()[0] if out else "unknown", 200)


def cffi_compiler() -> str:
    """The C compiler command cffi compiles with: ``$CC`` if set, else the interpreter's
    build compiler (``sysconfig`` ``CC``), else ``cc`` -- the order setuptools uses."""
    return os.environ.get("CC") or str(sysconfig.get_config_var("CC") or "cc")


def environment(spec: Any = None, precision: str | None = None) -> dict[str, Any]:
    """The environment of a check: tool, host, compiler (cffi's) and port files.

    Parameters
    ----------
    spec : PortSpec, optional
        The port compiled (sources and library are hashed).
    precision : str, optional
        ``"double"`` or ``"single"`` (adds ``-DAIRDATA_SINGLE=1`` to the flags).
    """
    cc = cffi_compiler()
    env: dict[str, Any] = {
        "date_utc": _dt.datetime.now(_dt.UTC).strftime("%Y-%m-%dT%H:%M:%SZ"),
        "airdata_version": __version__,
        "python": platform.python_version(),
        "host": f"{platform.system()} {platform.machine()}",
        "compiler": {"command": bounded(cc, 200), "version": _compiler_version(cc),
                     "flags": []},
        "port": {"label": "", "files": []},
    }
    if spec is not None:
        flags = [str(sysconfig.get_config_var("CFLAGS") or ""),
                 *spec.extra_compile_args]
        flags += [f"-D{n}" + (f"={v}" if v is not None else "") for n, v in spec.defines]
        if precision == "single":
            flags.append("-DAIRDATA_SINGLE=1")
        env["compiler"]["flags"] = [f for f in flags if f]
        files = [("source", p) for p in spec.sources]
        if spec.library is not None:
            files.append(("library", spec.library))
        env["port"] = {"label": bounded(spec.label, 500),
                       "files": [{"kind": k, "path": str(p), "sha256": sha256_file(p)}
                                 for k, p in files if Path(p).is_file()]}
    return env


_EQ_ROW = re.compile(r"^\|\s*([A-Z]{3}-\d+)\s*\|(.*)\|\s*$")


def equation_table() -> dict[str, dict[str, str]]:
    """Equation id -> published source, Python and C function (docs/equations.md).

    Read from this installation (:func:`airdata.resources.equations_doc`), never from the
    working directory.
    """
    from .. import resources as located

    out = {}
    text = located.equations_doc().read_text(encoding="utf-8")
    for line in text.splitlines():
        m = _EQ_ROW.match(line)
        if m:
            cells = [c.strip() for c in m.group(2).split("|")]
            if len(cells) >= 4:
                out[m.group(1)] = {"source": cells[1], "python": cells[2].strip("`"),
                                   "c": cells[3].strip("`")}
    return out


def report_schema() -> dict[str, Any]:
    """The JSON Schema of the JSON report (``report.schema.json`` in this package)."""
    text = resources.files("airdata.portcheck").joinpath("report.schema.json").read_text(
        encoding="utf-8")
    return json.loads(text)


def manifest_sha(report: Report) -> str:
    p = Path(report.suite.root) / "manifest.json"
    return sha256_file(p) if p.is_file() else ""


def report_json(reports: Sequence[Report], env: dict[str, Any],
                not_implemented_note: str = "") -> dict[str, Any]:
    """The JSON evidence report of one or more precisions (see ``report.schema.json``)."""
    first = reports[0]
    req = first.requirements
    eqs = equation_table()
    level = first.level
    return {
        "format": REPORT_FORMAT,
        "tool": f"airdata {__version__} port check",
        "caution": CAUTION,
        "checks_not_run": list(CHECKS_NOT_RUN),
        "level": level,
        "levels": {
            LEVEL_REFERENCE: f"|got - expected| <= {first.suite.k:g} * eps * scale, status "
                             "exact (the suite's roundoff bound)",
            LEVEL_REQUIREMENTS: "allowed error in engineering units over the requirement's "
                                "envelope, status exact inside it"
                                + ("" if req is not None else " (not applied: no "
                                   "requirements file given)")},
        "passed": all(r.ok for r in reports),
        "environment": env,
        "suite": {"path": str(first.suite.root), "suite_version": first.suite.suite_version,
                  "profile": first.suite.profile, "k": first.suite.k,
                  "manifest_sha256": manifest_sha(first)},
        "requirements": None if req is None else {
            "path": req.path, "sha256": req.sha256, "title": req.title},
        "equations": {e: eqs.get(e, {}) for r in reports for f in r.functions
                      for e in f.equations},
        "results": [{"precision": PRECISION_LABEL[r.precision], "level": r.level,
                     "passed": r.ok, "functions": [f.as_dict() for f in r.functions]}
                    for r in reports],
        # the reference-equivalent rows of earlier reports, kept for their readers
        "precisions": {PRECISION_LABEL[r.precision]: [
            f.reference.as_dict() for f in r.functions if f.reference is not None]
            for r in reports},
    }


def fmt(v: float, digits: int = 3) -> str:
    if isinstance(v, str):
        return v
    if math.isinf(v):
        return "inf"
    if math.isnan(v):
        return "nan"
    return f"{v:.{digits}g}"


def where(w: dict[str, str]) -> str:
    return ", ".join(f"{k} = {v}" for k, v in w.items())


def _function_lines(f: FunctionVerdict, level: str) -> list[str]:
    if not f.implemented:
        return [f"{f.function:<26} not implemented (declared by the port; not judged)"]
    ref = f.reference
    ref_txt = f"reference-equivalent {f.reference_verdict.upper()}" + (
        f" (worst {fmt(ref.worst)} of the bound)" if ref else "")
    if level == LEVEL_REQUIREMENTS:
        head = (f"{f.function:<26} requirements {f.verdict.upper():<14} in envelope "
                f"{f.in_envelope}, outside {f.outside_envelope}, failed {f.failed} "
                f"(status {f.status_mismatches}, nan {f.nan_mismatches}); {ref_txt}")
    else:
        head = (f"{f.function:<26} {ref_txt}: {f.failed} of {f.in_envelope} failed "
                f"(status {f.status_mismatches}, nan {f.nan_mismatches}); requirements "
                "level not applied")
    lines = [head]
    for o in f.outputs:
        if not o.judged:
            if level == LEVEL_REQUIREMENTS and f.requirement is not None:
                lines.append(f"    {o.output:<20} no requirement")
            continue
        unit = o.unit if o.unit != "1" else ""
        txt = f"    {o.output:<20} worst {fmt(o.worst_error, 4)} {unit}".rstrip()
        if o.requirement is not None and o.req_unit not in (None, o.unit):
            txt += f" ({fmt(o.worst_error_req or 0.0, 4)} {o.req_unit})"
        txt += f" at {where(o.worst_where)}"
        if o.requirement is not None:
            txt += (f"; allowed {o.requirement}; margin {fmt(o.margin)} at "
                    f"{where(o.margin_where)}")
        txt += f"; bound ratio {fmt(o.bound_ratio)}"
        if o.failed:
            txt += f"  <- {o.failed} FAIL"
        lines.append(txt)
        for b in o.bands:
            if b.failed and b.axis != "tag":
                lines.append(f"        band {b.axis} {b.label}: {b.failed} of {b.judged} "
                             f"fail, worst {fmt(b.worst_error, 4)} {unit}, margin "
                             f"{fmt(b.margin)}")
    return lines


def render_summary(reports: Sequence[Report], label: str, max_listed: int = 5) -> str:
    """The text report: level, per function both verdicts, errors in engineering units,
    margins, where, failing bands, first failing cases (decimal and hex), verdict."""
    first = reports[0]
    req = first.requirements
    lines = [f"airdata port check - suite {first.suite.suite_version} (profile "
             f"{first.suite.profile}), port: {bounded(label, 200)}",
             f"level applied: {first.level}"
             + (f" ({bounded(req.path, 200)}, SHA-256 {req.sha256[:16]}...)" if req else
                f" (|got - expected| <= {first.suite.k:g} * eps * scale); requirements "
                "level not applied (no --requirements)"), ""]
    failing = []
    for r in reports:
        lines.append(f"[{PRECISION_LABEL[r.precision]}]")
        for f in r.functions:
            if f.implemented:
                lines += _function_lines(f, r.level)
        absent = [f.function for f in r.functions if not f.implemented]
        if absent:
            lines.append(f"not implemented (declared by the port; not judged, not failures): "
                         f"{', '.join(absent)}")
        for f in r.functions:
            if f.verdict == "fail":
                failing.append(f"{f.function} ({PRECISION_LABEL[r.precision]})")
        lines.append("")
        for f in r.functions:
            if f.verdict != "fail":
                continue
            lines.append(f"{f.function} [{PRECISION_LABEL[r.precision]}]: {f.failed} failing "
                         f"case(s), first {min(max_listed, len(f.failures))}:")
            for c in f.failures[:max_listed]:
                lines.append(f"  case {c.case_id}: {'; '.join(c.reasons)}")
                lines.append(f"    inputs: {where(c.where)}")
            lines.append("")
    n_impl = sum(f.implemented for r in reports for f in r.functions)
    n_ni = sum(not f.implemented for r in reports for f in r.functions)
    tail = f" ({n_ni} not implemented)" if n_ni else ""
    if failing:
        lines.append(f"FAIL: {len(failing)} function check(s) failed: "
                     f"{', '.join(failing)}{tail} [level: {first.level}]")
    else:
        lines.append(f"PASS: all {n_impl} implemented function check(s) pass{tail} "
                     f"[level: {first.level}]")
    lines.append(CHECKS_NOT_RUN_NOTE)
    lines.append(CAUTION)
    return "\n".join(lines)


def write_junit(reports: Sequence[Report], path: str | Path) -> None:
    """JUnit XML: a suite per precision, a test case per implemented function and output
    (plus one per function for statuses); not-implemented functions are skipped cases."""
    root = ET.Element("testsuites", name="airdata port check")
    for r in reports:
        ts = ET.SubElement(root, "testsuite", name=f"airdata port check "
                           f"{PRECISION_LABEL[r.precision]} ({r.level})")
        counts = {"tests": 0, "failures": 0, "skipped": 0}
        for f in r.functions:
            cls = f"airdata.port.{PRECISION_LABEL[r.precision]}.{f.function}"
            names = [o.output for o in f.outputs] if f.implemented else \
                [o for o in (r.suite.functions[f.function].outputs)]
            for out in [*names, "status"]:
                tc = ET.SubElement(ts, "testcase", classname=cls, name=out)
                counts["tests"] += 1
                if not f.implemented or f.verdict == "no requirement":
                    ET.SubElement(tc, "skipped", message=f.verdict)
                    counts["skipped"] += 1
                    continue
                if out == "status":
                    bad = f.status_mismatches
                    msg = f"{bad} status mismatch(es)"
                else:
                    o = next(x for x in f.outputs if x.output == out)
                    if not o.judged and f.requirement is not None:
                        ET.SubElement(tc, "skipped", message="no requirement")
                        counts["skipped"] += 1
                        continue
                    bad = o.failed
                    msg = (f"{bad} of {o.judged} fail; worst {fmt(o.worst_error, 4)} {o.unit}"
                           f" at {where(o.worst_where)}; margin {fmt(o.margin)}"
                           + (f" of {o.requirement}" if o.requirement else " of the bound"))
                if bad:
                    fl = ET.SubElement(tc, "failure", message=bounded(msg, 500),
                                       type=r.level)
                    fl.text = "\n".join("; ".join(c.reasons) for c in f.failures[:20])
                    counts["failures"] += 1
        for k, v in counts.items():
            ts.set(k, str(v))
        ts.set("errors", "0")
    ET.ElementTree(root).write(path, encoding="utf-8", xml_declaration=True)


def write_failures(reports: Sequence[Report], path: str | Path) -> int:
    """Every failing case as CSV (one row per case and output); returns the row count."""
    rows = 0
    with open(path, "w", newline="", encoding="utf-8") as fh:
        w = csv.writer(fh)
        w.writerow(["precision", "level", "function", "case", "inputs", "status",
                    "expected_status", "output", "got", "got_hex", "expected", "expected_hex",
                    "error", "unit", "ratio", "reasons"])
        for r in reports:
            for f in r.functions:
                for c in f.failures:
                    for o in c.outputs:
                        w.writerow([PRECISION_LABEL[r.precision], r.level, f.function,
                                    c.case_id, where(c.where), c.status, c.expected_status,
                                    o["output"], o["got"]["decimal"], o["got"]["hex"],
                                    o["expected"]["decimal"], o["expected"]["hex"], o["error"],
                                    o["unit"], o["ratio"], "; ".join(c.reasons)])
                        rows += 1
    return rows
