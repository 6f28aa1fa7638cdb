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
The driver is the project's vector runner, ``bindings/c/runner/ad_vector_runner.c``, linked
with the port: every case through the scalar functions of ``airdata.h`` and their
NULL-output rule and, when the port's sources define the batch API of ``airdata_batch.h``
(the bundled port does; a port of ``airdata.h`` alone need not), every case again through
the batch entry points, their NULL-array rule and ``ad_check_n``.  On the bundled port the
figures are therefore those of ``tests/test_mcdc.py``.  The report gives the figures per
source file as well, and the tool versions used.

An engineering and verification aid, not certified flight software; MC/DC figures from
this tool are evidence for a review, not a coverage analysis under a certification basis.
"""

from __future__ import annotations

import json
import os
import shutil
import subprocess
import tempfile
from collections.abc import Sequence
from dataclasses import dataclass, field
from pathlib import Path
from typing import Any

from ..notice import CAUTION_LINE
from .build import BUNDLED_C, PRECISIONS, PortBuildError
from .suite import FunctionCases, load_cases

__all__ = ["MCDC_FLAGS", "KINDS", "CoverageError", "Figures", "Toolchain", "find_toolchain",
           "measure", "merge_profiles", "coverage_of_sources", "runner_path",
           "defined_symbols", "batch_symbols", "tool_versions", "render"]

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
    """Paths of clang, llvm-profdata, llvm-cov and llvm-nm (one LLVM release)."""

    clang: str
    profdata: str
    cov: str
    nm: str = "llvm-nm"


def find_toolchain(version: int = 19) -> Toolchain:
    """Locate ``clang-<v>``, ``llvm-profdata-<v>``, ``llvm-cov-<v>`` and ``llvm-nm-<v>``
    on PATH.

    Raises
    ------
    CoverageError
        Naming each missing tool and the Debian packages that provide it.
    """
    names = (f"clang-{version}", f"llvm-profdata-{version}", f"llvm-cov-{version}",
             f"llvm-nm-{version}")
    paths = [shutil.which(n) for n in names]
    missing = [n for n, p in zip(names, paths, strict=True) if p is None]
    if missing:
        raise CoverageError(f"{', '.join(missing)} not found on PATH (Debian packages: "
                            f"clang-{version} llvm-{version} libclang-rt-{version}-dev)")
    clang, profdata, cov, nm = (str(p) for p in paths)
    return Toolchain(clang, profdata, cov, nm)


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
    notes : list of str
        How the measurement was driven and how the run ended (an incomplete run says so).
    """

    totals: dict[str, tuple[int, int]] = field(default_factory=dict)
    per_file: dict[str, dict[str, tuple[int, int]]] = field(default_factory=dict)
    missed: list[str] = field(default_factory=list)
    notes: list[str] = field(default_factory=list)

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
                "missed": list(self.missed), "notes": list(self.notes)}


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


# --- a port under the vector runner ------------------------------------------------------
#
# Design (why the runner, not a loop of our own): a port is measured by driving it with
# bindings/c/runner/ad_vector_runner.c itself, the program tests/test_mcdc.py measures
# the bundled port with.  Coverage then counts exactly what the vector suite exercises
# through the interface it defines: every case through the scalar function of airdata.h,
# the scalar NULL-output rule, and, when the port defines the batch API of
# airdata_batch.h, every case again through ad_<name>_n, its NULL-array rule and
# ad_check_n.  A port without the batch API (the common case: airdata.h only) builds the
# runner with -DRUNNER_SCALAR_ONLY, so no batch code is expected of it and none is
# charged to it.  The alternative, excluding files the scalar loops cannot reach, would
# hide the bundled port's batch.c and its NULL guards instead of measuring them; the
# per-file table of the report shows which of the user's files a run did not drive.


#: Batch symbols the runner calls besides ``ad_<name>_n`` (airdata_batch.h).
_BATCH_COMMON = ("ad_check_n",)

#: C helper linked into the runner (host-side tooling, not port code, so a signal
#: handler is fine here): stdout unbuffered (the runner's per-function lines
#: survive a crash) and, on a fatal signal (a port writing through a NULL pointer, say),
#: the coverage profile written before the process ends, so what ran is still measured.
_GUARD_C = r"""
#define _POSIX_C_SOURCE 200809L
#include <signal.h>
#include <stdio.h>
#include <unistd.h>

int __llvm_profile_write_file(void);

static void adcov_on_signal(int sig)
{
    (void)__llvm_profile_write_file();
    _exit(128 + sig);
}

__attribute__((constructor)) static void adcov_guard(void)
{
    (void)setvbuf(stdout, NULL, _IONBF, 0);
    (void)signal(SIGSEGV, adcov_on_signal);
    (void)signal(SIGBUS, adcov_on_signal);
    (void)signal(SIGFPE, adcov_on_signal);
    (void)signal(SIGILL, adcov_on_signal);
    (void)signal(SIGABRT, adcov_on_signal);
}
"""


def runner_path() -> Path:
    """``runner/ad_vector_runner.c`` of the bundled C port."""
    return BUNDLED_C / "runner" / "ad_vector_runner.c"


def defined_symbols(tools: Toolchain, objects: Sequence[Path]) -> set[str]:
    """External symbols defined by ``objects`` (``llvm-nm --defined-only``)."""
    out = _run([tools.nm, "--defined-only", "--extern-only", "--format=just-symbols",
                *map(str, objects)], "llvm-nm")
    return {ln.strip() for ln in out.splitlines() if ln.strip() and not ln.endswith(":")}


def batch_symbols(functions: Sequence[FunctionCases]) -> list[str]:
    """Batch entry points the runner calls for ``functions`` (airdata_batch.h)."""
    return [*_BATCH_COMMON, *(f"{fc.c_function}_n" for fc in functions)]


def _runner_outcome(returncode: int, stdout: str, names: Sequence[str]) -> list[str]:
    """Notes on how the runner's run ended (its verdicts are not this tool's job).

    ``names``: the functions run, in the runner's order (the suite's), which prints a
    function's line after its cases and its NULL rule: a crash lies in the first
    function without a line."""
    lines = [ln for ln in stdout.splitlines() if ln.strip()]
    notes = []
    fails = sum(1 for ln in lines if ln.lstrip().startswith("FAIL "))
    if returncode > 128:
        done = {ln.split()[0] for ln in lines if not ln.startswith(" ") and " cases " in ln}
        where = next((n for n in names if n not in done), "")
        at = f" in function {where} (its cases or its NULL rule)" if where else ""
        notes.append(f"INCOMPLETE: the runner stopped with signal {returncode - 128}{at}; "
                     "the functions after it were not run and are not measured (a port "
                     "writing through a NULL output pointer does this; use --only to "
                     "leave a function out)")
    elif returncode != 0:
        notes.append(f"the runner reported failures ({fails} FAIL line(s)); the NULL rule "
                     "is applied only to a function whose cases all passed, so a failing "
                     "function's NULL guards count as not exercised; see 'airdata port "
                     "check'")
    return notes


def coverage_of_sources(sources: Sequence[Path], suite_dir: str | Path = "vectors",
                        precisions: Sequence[str] = ("double", "single"),
                        include_dirs: Sequence[Path] = (),
                        defines: Sequence[tuple[str, str | None]] = (),
                        only: Sequence[str] | None = None,
                        workdir: Path | None = None,
                        tools: Toolchain | None = None,
                        batch: bool | None = None) -> dict[str, Figures]:
    """Instrument ``sources``, run the vector runner over them per precision, measure.

    The port's sources are compiled with ``MCDC_FLAGS``; the runner
    (``runner_path()``, with the suite's C headers ``<suite_dir>/c/ad_vectors.h``) is
    linked with them uninstrumented, so only the port is measured.  ``only`` builds a
    subset runner (``-DRUNNER_SUBSET -DRUNNER_WITH_<NAME>``).  ``batch``: drive the batch
    entry points (True), do not (False, ``-DRUNNER_SCALAR_ONLY``), or (None) drive them
    exactly when the sources define every one the runner calls (``llvm-nm``).

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
    headers = Path(suite_dir) / "c"
    if not (headers / "ad_vectors.h").is_file():
        raise CoverageError(f"{headers / 'ad_vectors.h'} not found: the runner needs the "
                            "suite's C headers (written by 'airdata vectors build')")
    runner = runner_path()
    if not runner.is_file():
        raise CoverageError(f"the vector runner {runner} is not in this installation")
    tmp = workdir or Path(tempfile.mkdtemp(prefix="adportcov-"))
    tmp.mkdir(parents=True, exist_ok=True)
    guard = tmp / "adcov_guard.c"
    guard.write_text(_GUARD_C)
    inc = [f"-I{Path(p).resolve()}" for p in include_dirs] + [f"-I{BUNDLED_C / 'include'}"]
    dfs = [f"-D{k}" if v is None else f"-D{k}={v}" for k, v in defines]
    subset = ([] if only is None else
              ["-DRUNNER_SUBSET", *(f"-DRUNNER_WITH_{fc.name.upper()}" for fc in functions)])
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
            objs.append(obj)
        wanted = batch_symbols(functions)
        missing = sorted(set(wanted) - defined_symbols(tools, objs))
        drive_batch = not missing if batch is None else batch
        notes = ["driver: the vector runner (" + runner.name + "), " +
                 ("scalar and batch entry points, the NULL rules and ad_check_n"
                  if drive_batch else "scalar entry points and the scalar NULL rule "
                  "(-DRUNNER_SCALAR_ONLY)")]
        if not drive_batch and len(missing) < len(wanted):
            notes.append("batch API only partly defined, not driven (missing: "
                         + ", ".join(missing[:8]) + (" ..." if len(missing) > 8 else "") + ")")
        mode = [] if drive_batch else ["-DRUNNER_SCALAR_ONLY"]
        robj = pdir / "runner.o"
        _run([tools.clang, "-std=c99", "-O0", "-ffp-contract=off", *inc, f"-I{headers}", *dfs,
              *single, *subset, *mode, "-c", str(runner), "-o", str(robj)],
             f"compiling the vector runner ({precision})")
        gobj = pdir / "guard.o"
        _run([tools.clang, "-O0", "-c", str(guard), "-o", str(gobj)], "compiling the guard")
        exe = pdir / "adcov_runner"
        _run([tools.clang, "-fprofile-instr-generate", str(robj), str(gobj), *map(str, objs),
              "-lm", "-o", str(exe)], f"linking the runner with the port ({precision})")
        raw = pdir / "run.profraw"
        env = dict(os.environ, LLVM_PROFILE_FILE=str(raw))
        try:
            r = subprocess.run([str(exe)], capture_output=True, text=True, timeout=1800,
                               env=env, cwd=pdir)
        except subprocess.TimeoutExpired:
            raise CoverageError(f"the runner ({precision}) did not finish in 1800 s") from None
        if not raw.is_file():
            raise CoverageError(f"the runner ({precision}) wrote no profile (exit status "
                                f"{r.returncode}):\n{(r.stdout + r.stderr)[-2000:]}")
        notes += _runner_outcome(r.returncode if r.returncode >= 0 else 128 - r.returncode,
                                 r.stdout, [fc.name for fc in functions])
        prof = merge_profiles(tools, [raw], pdir / "run.profdata")
        fig = measure(tools, [exe], prof, sources)
        fig.notes = notes
        out[precision] = fig
        binaries.append(exe)
        raws.append(raw)
    if len(binaries) > 1:
        prof = merge_profiles(tools, raws, tmp / "both.profdata")
        out["both"] = measure(tools, binaries, prof, sources)
        out["both"].notes = sorted({n for p in precisions for n in out[p].notes})
    if workdir is None:
        shutil.rmtree(tmp, ignore_errors=True)
    return out


def tool_versions(tools: Toolchain) -> dict[str, str]:
    """First line of ``--version`` of clang and llvm-cov (e.g. "Debian clang version
    19.1.7"); "unknown" when a tool does not answer."""
    got = {}
    for name, exe in (("clang", tools.clang), ("llvm-cov", tools.cov)):
        try:
            text = _run([exe, "--version"], f"{name} --version", timeout=60)
        except (CoverageError, OSError, subprocess.SubprocessError):
            text = ""
        first = next((ln.strip() for ln in text.splitlines() if "version" in ln), "unknown")
        got[name] = first
    return got


def _file_table(fig: Figures) -> list[str]:
    w = max([24, *(len(n) for n in fig.per_file)])
    rows = [f"  {'file':<{w}} " + " ".join(f"{KINDS[k]:>18}" for k in KINDS)]
    for name, kinds in sorted(fig.per_file.items()):
        cells = []
        for k in KINDS:
            c, n = kinds[k]
            cells.append(f"{(100.0 * c / n if n else 100.0):6.2f}% {f'{c}/{n}':>10}")
        rows.append(f"  {name:<{w}} " + " ".join(f"{x:>18}" for x in cells))
    return rows


def render(label: str, figures: dict[str, Figures], max_missed: int = 200,
           versions: dict[str, str] | None = None) -> str:
    """Text report: tools, figures per measurement, per-file figures, then what the
    combined run missed."""
    rows = [f"airdata port coverage: {label}",
            f"tools: {'; '.join(f'{k}: {v}' for k, v in (versions or {}).items()) or 'clang 19'}"
            f"; flags: {' '.join(MCDC_FLAGS)}"]
    for key, fig in figures.items():
        rows.append(f"  {key:<7} {fig.summary()}")
    final = figures.get("both") or next(iter(figures.values()))
    rows += [f"  note: {n}" for n in final.notes]
    rows.append(f"per file ({'both' if 'both' in figures else next(iter(figures))}):")
    rows += _file_table(final)
    for key, fig in figures.items():
        if fig.missed and (key == "both" or "both" not in figures):
            rows.append(f"not exercised by any vector ({key}): {len(fig.missed)} items")
            rows += ["  " + m for m in fig.missed[:max_missed]]
            if len(fig.missed) > max_missed:
                rows.append(f"  ... {len(fig.missed) - max_missed} more (see --report)")
    if not final.missed:
        rows.append("every region, line, branch and MC/DC condition is exercised")
    rows.append(f"Coverage only: run 'airdata port check' to judge the outputs. {CAUTION_LINE}")
    return "\n".join(rows)
