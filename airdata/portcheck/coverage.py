"""MC/DC, branch, line and region coverage of a C port by the vector suite (clang 19).

``airdata port coverage`` compiles a C port (the bundled one, or your own sources that
implement ``airdata.h``) with clang 19's source-based coverage and modified
condition/decision coverage (``-fprofile-instr-generate -fcoverage-mapping
-fcoverage-mcdc``), runs every case of the suite through it in each precision, merges the
profiles with ``llvm-profdata-19 merge`` and reads ``llvm-cov-19 export`` (JSON for the
figures, branches and MC/DC records; lcov for the per-line counts).  It prints, per
precision and for both together, the covered fraction of regions, lines, branches and
MC/DC conditions, and lists by ``file:line`` what no vector exercises: MC/DC conditions
not shown to affect their decision independently, branch directions never taken, lines
and regions never executed.

It measures coverage only; whether the outputs are right is ``airdata port check``'s job.
The driver calls each function once per case, through the same per-function loops as
``port check``; it does not call the batch entry points or the NULL-pointer rules (the
project's own vector runner, ``bindings/c/runner/ad_vector_runner.c``, does).

An engineering and verification aid, not certified flight software; MC/DC figures from
this tool are evidence for a review, not a coverage analysis under a certification basis.
"""

from __future__ import annotations

import argparse
import json
import os
import shutil
import subprocess
import sys
import tempfile
from collections.abc import Sequence
from dataclasses import dataclass, field
from pathlib import Path
from typing import Any

from .build import BUNDLED_C, PRECISIONS, PortBuildError, shim_source
from .suite import FunctionCases, SuiteError, load_cases

__all__ = ["MCDC_FLAGS", "KINDS", "CoverageError", "Figures", "Toolchain", "find_toolchain",
           "measure", "merge_profiles", "driver_source", "coverage_of_sources",
           "add_parser", "cmd_coverage"]

#: Compile flags of an instrumented build (clang 19: MC/DC needs -fcoverage-mcdc).
MCDC_FLAGS = ("-std=c99", "-O0", "-ffp-contract=off", "-fprofile-instr-generate",
              "-fcoverage-mapping", "-fcoverage-mcdc")

#: Coverage kinds, in report order: llvm-cov export summary key -> label.
KINDS = {"regions": "regions", "lines": "lines", "branches": "branches",
         "mcdc": "MC/DC conditions"}

#: Longest source excerpt quoted in a "missed" item (source text is untrusted).
_EXCERPT = 72


class CoverageError(RuntimeError):
    """A tool is missing, or a build, run or llvm-cov step failed (message says which)."""


@dataclass(frozen=True)
class Toolchain:
    """Paths of clang, llvm-profdata and llvm-cov (one LLVM release)."""

    clang: str
    profdata: str
    cov: str


def find_toolchain(version: int = 19) -> Toolchain:
    """Locate ``clang-<v>``, ``llvm-profdata-<v>`` and ``llvm-cov-<v>`` on PATH.

    Raises
    ------
    CoverageError
        Naming each missing tool and the Debian packages that provide it.
    """
    names = (f"clang-{version}", f"llvm-profdata-{version}", f"llvm-cov-{version}")
    paths = [shutil.which(n) for n in names]
    missing = [n for n, p in zip(names, paths, strict=True) if p is None]
    if missing:
        raise CoverageError(f"{', '.join(missing)} not found on PATH (Debian packages: "
                            f"clang-{version} llvm-{version} libclang-rt-{version}-dev)")
    clang, profdata, cov = (str(p) for p in paths)
    return Toolchain(clang, profdata, cov)


@dataclass
class Figures:
    """Coverage of one measurement (one precision, or several merged).

    Attributes
    ----------
    totals : dict
        Kind (a key of ``KINDS``) -> (covered, count).
    per_file : dict
        File name -> kind -> (covered, count).
    missed : list of str
        What was not exercised, one ``file:line[:col]: ...`` item each, sorted by file
        and line.
    """

    totals: dict[str, tuple[int, int]] = field(default_factory=dict)
    per_file: dict[str, dict[str, tuple[int, int]]] = field(default_factory=dict)
    missed: list[str] = field(default_factory=list)

    def percent(self, kind: str) -> float:
        """Covered percentage of ``kind`` (100 when there is nothing to cover)."""
        done, count = self.totals[kind]
        return 100.0 * done / count if count else 100.0

    def summary(self) -> str:
        """One line: each kind's percentage and counts."""
        return ", ".join(f"{KINDS[k]} {self.percent(k):.2f}% ({c}/{n})"
                         for k, (c, n) in self.totals.items())

    def as_dict(self) -> dict[str, Any]:
        """JSON-ready form."""
        return {"totals": {k: {"covered": c, "count": n, "percent": self.percent(k)}
                           for k, (c, n) in self.totals.items()},
                "files": {f: {k: {"covered": c, "count": n} for k, (c, n) in v.items()}
                          for f, v in self.per_file.items()},
                "missed": list(self.missed)}


def _run(cmd: Sequence[str], what: str, timeout: float = 600,
         env: dict[str, str] | None = None, cwd: Path | None = None) -> str:
    r = subprocess.run(list(cmd), capture_output=True, text=True, timeout=timeout, env=env,
                       cwd=cwd)
    if r.returncode != 0:
        tail = (r.stderr or r.stdout)[-3000:]
        raise CoverageError(f"{what} failed (exit status {r.returncode}):\n{tail}")
    return r.stdout


def merge_profiles(tools: Toolchain, raws: Sequence[Path], out: Path) -> Path:
    """``llvm-profdata merge`` of raw profiles into ``out``."""
    _run([tools.profdata, "merge", "-o", str(out), *map(str, raws)], "llvm-profdata merge")
    return out


def _excerpt(lines: dict[str, list[str]], fname: str, line: int, col: int, end_line: int,
             end_col: int) -> str:
    text = lines.get(fname, [])
    if not 1 <= line <= len(text):
        return ""
    src = text[line - 1]
    piece = src[col - 1:end_col - 1] if end_line == line else src[col - 1:].rstrip() + " ..."
    piece = " ".join(piece.split())
    return piece if len(piece) <= _EXCERPT else piece[:_EXCERPT - 3] + "..."


def measure(tools: Toolchain, binaries: Sequence[Path], profdata: Path,
            sources: Sequence[Path]) -> Figures:
    """Coverage of ``sources`` in ``binaries`` under ``profdata`` (llvm-cov export).

    Several binaries (the binary64 and binary32 builds) are read together; llvm-cov
    then counts a line, branch or condition as covered when any build covered it.
    """
    if not binaries:
        raise CoverageError("no instrumented binary to measure")
    objs = [str(binaries[0])] + [a for b in binaries[1:] for a in ("-object", str(b))]
    srcs = [str(Path(s).resolve()) for s in sources]
    base = [tools.cov, "export", *objs, f"-instr-profile={profdata}"]
    doc = json.loads(_run([*base, "-format=text", *srcs], "llvm-cov export (JSON)"))
    lcov = _run([*base, "-format=lcov", *srcs], "llvm-cov export (lcov)")
    data = doc["data"][0]
    text = {}
    for s in sources:
        try:
            text[Path(s).name] = Path(s).read_text(errors="replace").splitlines()
        except OSError:
            text[Path(s).name] = []
    fig = Figures()
    fig.totals = {k: (int(data["totals"][k]["covered"]), int(data["totals"][k]["count"]))
                  for k in KINDS}
    items: list[tuple[str, int, int, str]] = []
    for f in data["files"]:
        name = Path(f["filename"]).name
        fig.per_file[name] = {k: (int(f["summary"][k]["covered"]), int(f["summary"][k]["count"]))
                              for k in KINDS}
        # MC/DC record: [line, col, end line, end col, file id, kind, [condition covered..]]
        for rec in f.get("mcdc_records", []):
            conds = rec[6]
            missed = [i + 1 for i, ok in enumerate(conds) if not ok]
            if missed:
                ex = _excerpt(text, name, rec[0], rec[1], rec[2], rec[3])
                items.append((name, rec[0], rec[1],
                              f"MC/DC: condition{'s' if len(missed) > 1 else ''} "
                              f"{', '.join(map(str, missed))} of {len(conds)} not shown to "
                              f"affect the decision independently: {ex}"))
        # branch: [line, col, end line, end col, true count, false count, file id, ...]
        for b in f.get("branches", []):
            dirs = [d for d, n in (("true", b[4]), ("false", b[5])) if n == 0]
            if dirs:
                ex = _excerpt(text, name, b[0], b[1], b[2], b[3])
                items.append((name, b[0], b[1],
                              f"branch: condition never {' nor '.join(dirs)}: {ex}"))
        # segment: [line, col, count, has count, region entry, gap region]
        for seg in f.get("segments", []):
            if seg[3] and seg[4] and not seg[5] and seg[2] == 0:
                items.append((name, seg[0], seg[1], "region never executed"))
    current = ""
    for row in lcov.splitlines():
        if row.startswith("SF:"):
            current = Path(row[3:]).name
        elif row.startswith("DA:"):
            line, count = row[3:].split(",")[:2]
            if int(count) == 0:
                ln = int(line)
                src = text.get(current, [])
                ex = " ".join(src[ln - 1].split())[:_EXCERPT] if 1 <= ln <= len(src) else ""
                items.append((current, ln, 0, f"line never executed: {ex}"))
    fig.missed = [f"{n}:{ln}:{c}: {msg}" if c else f"{n}:{ln}: {msg}"
                  for n, ln, c, msg in sorted(items)]
    return fig


# --- a user's port ---------------------------------------------------------------------

def driver_source(functions: Sequence[FunctionCases]) -> str:
    """C driver: for each function, read its cases' inputs (raw binary64, native byte
    order) from ``<dir>/<name>.bin`` and run them through the ``adpc_<name>`` loop."""
    loops, _ = shim_source(functions)
    body = [loops, "#include <stdio.h>", "#include <stdlib.h>", "",
            "static double *adcov_read(const char *dir, const char *name, size_t count)",
            "{", "    char path[4096];", "    FILE *fp;", "    double *x;",
            "    if (snprintf(path, sizeof path, \"%s/%s.bin\", dir, name) >= (int)sizeof path)"
            " { return NULL; }",
            "    fp = fopen(path, \"rb\");", "    if (fp == NULL) { return NULL; }",
            "    x = (double *)malloc(count * sizeof(double) + 1u);",
            "    if (x != NULL && fread(x, sizeof(double), count, fp) != count) {",
            "        free(x);", "        x = NULL;", "    }", "    fclose(fp);",
            "    return x;", "}", "", "int main(int argc, char **argv)", "{",
            "    int bad = 0;", "    if (argc != 2) { return 2; }"]
    for fc in functions:
        nin, nout, n = len(fc.inputs), len(fc.outputs), fc.count
        body += ["    {",
                 f"        double *x = adcov_read(argv[1], \"{fc.name}\", {n * nin}u);",
                 f"        double *y = (double *)malloc({n * nout}u * sizeof(double) + 1u);",
                 f"        int *st = (int *)malloc({n}u * sizeof(int) + 1u);",
                 "        if (x == NULL || y == NULL || st == NULL) {",
                 f"            fprintf(stderr, \"{fc.name}: cannot read its cases\\n\");",
                 "            bad = 1;", "        } else {",
                 f"            adpc_{fc.name}(x, y, st, {n}u);", "        }",
                 "        free(x);", "        free(y);", "        free(st);", "    }"]
    body += ["    return bad;", "}", ""]
    return "\n".join(body)


def coverage_of_sources(sources: Sequence[Path], suite_dir: str | Path = "vectors",
                        precisions: Sequence[str] = ("double", "single"),
                        include_dirs: Sequence[Path] = (),
                        defines: Sequence[tuple[str, str | None]] = (),
                        only: Sequence[str] | None = None,
                        workdir: Path | None = None,
                        tools: Toolchain | None = None) -> dict[str, Figures]:
    """Instrument ``sources``, run the suite's cases through them per precision, measure.

    Returns
    -------
    dict
        Precision name (``"double"``, ``"single"``) -> Figures, and ``"both"`` for the
        builds together (when more than one precision was run).

    Raises
    ------
    CoverageError, SuiteError, PortBuildError
    """
    tools = tools or find_toolchain()
    for s in sources:
        if not Path(s).is_file():
            raise PortBuildError(f"C source {s} not found", "")
    suite = load_cases(suite_dir, only)
    functions = list(suite.functions.values())
    tmp = workdir or Path(tempfile.mkdtemp(prefix="adportcov-"))
    tmp.mkdir(parents=True, exist_ok=True)
    cases = tmp / "cases"
    cases.mkdir(exist_ok=True)
    import numpy as np

    for fc in functions:
        np.ascontiguousarray(fc.x, dtype=np.float64).tofile(cases / f"{fc.name}.bin")
    drv = tmp / "adcov_driver.c"
    drv.write_text(driver_source(functions))
    inc = [f"-I{Path(p).resolve()}" for p in include_dirs] + [f"-I{BUNDLED_C / 'include'}"]
    dfs = [f"-D{k}" if v is None else f"-D{k}={v}" for k, v in defines]
    out: dict[str, Figures] = {}
    binaries, raws = [], []
    for precision in precisions:
        if precision not in PRECISIONS:
            raise ValueError(f"precision {precision!r}: choose 'double' or 'single'")
        single = ["-DAIRDATA_SINGLE=1"] if PRECISIONS[precision] else []
        pdir = tmp / precision
        pdir.mkdir(exist_ok=True)
        objs = []
        for i, s in enumerate(sources):
            obj = pdir / f"{i:03d}_{Path(s).stem}.o"
            _run([tools.clang, *MCDC_FLAGS, *inc, *dfs, *single, "-c",
                  str(Path(s).resolve()), "-o", str(obj)], f"compiling {s} ({precision})")
            objs.append(str(obj))
        exe = pdir / "adcov_driver"
        _run([tools.clang, "-std=c99", "-O0", "-fprofile-instr-generate", *inc, *dfs, *single,
              str(drv), *objs, "-lm", "-o", str(exe)], f"linking the driver ({precision})")
        raw = pdir / "run.profraw"
        env = dict(os.environ, LLVM_PROFILE_FILE=str(raw))
        _run([str(exe), str(cases)], f"running the cases ({precision})", env=env)
        prof = merge_profiles(tools, [raw], pdir / "run.profdata")
        out[precision] = measure(tools, [exe], prof, sources)
        binaries.append(exe)
        raws.append(raw)
    if len(binaries) > 1:
        prof = merge_profiles(tools, raws, tmp / "both.profdata")
        out["both"] = measure(tools, binaries, prof, sources)
    if workdir is None:
        shutil.rmtree(tmp, ignore_errors=True)
    return out


def render(label: str, figures: dict[str, Figures], max_missed: int = 200) -> str:
    """Text report: figures per measurement, then what the combined run missed."""
    rows = [f"airdata port coverage: {label} (clang 19, {' '.join(MCDC_FLAGS)})"]
    for key, fig in figures.items():
        rows.append(f"  {key:<7} {fig.summary()}")
    final = figures.get("both") or next(iter(figures.values()))
    for key, fig in figures.items():
        if fig.missed and (key == "both" or "both" not in figures):
            rows.append(f"not exercised by any vector ({key}): {len(fig.missed)} items")
            rows += ["  " + m for m in fig.missed[:max_missed]]
            if len(fig.missed) > max_missed:
                rows.append(f"  ... {len(fig.missed) - max_missed} more (see --report)")
    if not final.missed:
        rows.append("every region, line, branch and MC/DC condition is exercised")
    rows.append("Coverage only: run 'airdata port check' to judge the outputs. "
                "An engineering and verification aid, not certified flight software.")
    return "\n".join(rows)


def cmd_coverage(args: argparse.Namespace) -> int:
    """Run ``airdata port coverage``; exit 0, 1 (below --fail-under) or 2 (cannot run)."""
    if args.source:
        sources = [Path(s) for s in args.source]
        label = " ".join(args.source)
        includes = [Path(p) for p in args.include]
    else:
        sources = sorted((BUNDLED_C / "src").glob("*.c"))
        label = "bundled"
        includes = [Path(p) for p in args.include] + [BUNDLED_C / "src"]
    precisions = ["double", "single"] if args.precision == "both" else [args.precision]
    try:
        figures = coverage_of_sources(sources, args.suite, precisions, includes,
                                      list(args.define), args.only or None)
    except (CoverageError, SuiteError, PortBuildError, ValueError) as exc:
        print(f"airdata port coverage: error: {exc}", file=sys.stderr)
        return 2
    print(render(label, figures))
    final = figures.get("both") or figures[precisions[0]]
    if args.report:
        doc = {"tool": "airdata port coverage", "label": label,
               "sources": [str(s) for s in sources], "flags": list(MCDC_FLAGS),
               "suite": str(args.suite),
               "measurements": {k: f.as_dict() for k, f in figures.items()}}
        Path(args.report).write_text(json.dumps(doc, indent=1) + "\n")
        print(f"report written to {args.report}")
    if args.fail_under is not None and final.percent("mcdc") < args.fail_under:
        print(f"MC/DC {final.percent('mcdc'):.2f}% is below --fail-under {args.fail_under}",
              file=sys.stderr)
        return 1
    return 0


def add_parser(sub: Any, define_type: Any, epilog: str) -> None:
    """Add the ``coverage`` action to the ``port`` sub-parsers."""
    c = sub.add_parser(
        "coverage", help="MC/DC, branch, line and region coverage of a C port by the vectors",
        description="Compile a C port with clang 19 source-based coverage and MC/DC "
                    "(-fprofile-instr-generate -fcoverage-mapping -fcoverage-mcdc), run every "
                    "case of the suite through it in each precision, and report the covered "
                    "regions, lines, branches and MC/DC conditions, listing by file:line what "
                    "no vector exercises. Needs clang-19, llvm-profdata-19 and llvm-cov-19 "
                    "(Debian: clang-19 llvm-19 libclang-rt-19-dev). Without --source the "
                    "bundled port is measured. Exit status 0: measured; 1: MC/DC below "
                    "--fail-under; 2: could not run.",
        epilog=epilog)
    c.add_argument("--suite", default="vectors", metavar="DIR",
                   help="vector suite directory (default: ./vectors)")
    c.add_argument("--precision", choices=["double", "single", "both"], default="both",
                   help="binary64 (double), binary32 (single) or both (default)")
    c.add_argument("--source", nargs="+", metavar="FILE.c",
                   help="your port's C sources (they implement airdata.h); only these are "
                        "measured")
    c.add_argument("--include", action="append", default=[], metavar="DIR",
                   help="extra include directory (repeatable); the bundled airdata.h is "
                        "searched last")
    c.add_argument("--define", action="append", default=[], type=define_type,
                   metavar="NAME[=V]", help="preprocessor definition (repeatable)")
    c.add_argument("--only", nargs="+", metavar="FUNC",
                   help="run only these functions' cases (reference names)")
    c.add_argument("--report", metavar="FILE.json", help="write the figures and the list "
                                                         "of what is missed as JSON")
    c.add_argument("--fail-under", type=float, default=None, metavar="PCT",
                   help="exit 1 when the MC/DC percentage (both precisions together) is "
                        "below PCT")
    c.set_defaults(func=cmd_coverage)
