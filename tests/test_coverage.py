"""Line and branch coverage of the bundled C port (bindings/c/src/*.c) under gcov.

The port's objects are compiled with ``gcc --coverage -O0``, once in binary64 and once
in binary32, and linked with the vector runner (bindings/c/runner/ad_vector_runner.c):
the vector suite alone.  The runner checks every case through the scalar function and
through its batch entry point (airdata_batch.h: bit-identical results, equal statuses),
each function's NULL rule once (airdata.h: a NULL output pointer returns
AD_INVALID_INPUT; airdata_batch.h: AD_BATCH_NULL for each NULL array) and ad_check_n's
contract, so nothing outside the vectors is needed to reach batch.c and the guards.

Figures are read from gcov's JSON output (``gcov --json-format -b``, GCC's documented
intermediate format: per file, per line, its count and its branches' counts; no gcovr
needed) and printed.  The goal: 100 % of lines and branches with both precisions
together; a branch the public interface cannot reach is removed from the port rather
than excused here.
"""

from __future__ import annotations

import gzip
import json
import re
import shutil
import subprocess
from dataclasses import dataclass, field
from pathlib import Path

import pytest
from toolchains import need

ROOT = Path(__file__).resolve().parents[1]
C_DIR = ROOT / "bindings" / "c"
SRC = C_DIR / "src"
PORT = sorted(SRC.glob("*.c"))
RUNNER = C_DIR / "runner" / "ad_vector_runner.c"
VECTORS_C = ROOT / "vectors" / "c"

# --- gcov ----------------------------------------------------------------------------

@dataclass
class Coverage:
    """Per file: each executable line and each branch, and whether it ran / was taken."""

    lines: dict[tuple[str, int], bool] = field(default_factory=dict)
    branches: dict[tuple[str, int, int], bool] = field(default_factory=dict)
    text: dict[tuple[str, int], str] = field(default_factory=dict)

    def total(self, kind: str, fname: str | None = None) -> tuple[int, int]:
        """(covered, total) lines or branches, of one file or all."""
        rows = self.lines if kind == "lines" else self.branches
        vals = [v for k, v in rows.items() if fname is None or k[0] == fname]
        return sum(vals), len(vals)

    def percent(self, kind: str) -> float:
        done, total = self.total(kind)
        return 100.0 * done / total if total else 100.0

    @property
    def missed(self) -> list[str]:
        """Lines not executed and branches never taken, as file:line items."""
        out = [f"{f}:{n}: line not executed: {self.text.get((f, n), '')}"
               for (f, n), ok in self.lines.items() if not ok]
        out += [f"{f}:{n}: branch {b} never taken ({self.text.get((f, n), '')})"
                for (f, n, b), ok in self.branches.items() if not ok]
        return sorted(out)

    def union(self, other: Coverage) -> Coverage:
        """Covered in either run (the same source compiled twice)."""
        u = Coverage(dict(self.lines), dict(self.branches), {**other.text, **self.text})
        for k, v in other.lines.items():
            u.lines[k] = u.lines.get(k, False) or v
        for kb, v in other.branches.items():
            u.branches[kb] = u.branches.get(kb, False) or v
        return u


def parse_gcov_json(path: Path, sources: dict[str, Path]) -> Coverage:
    """Lines and branches of one ``gcov --json-format`` file (``*.gcov.json.gz``): a line
    ran when its count is positive, a branch was taken when its count is; the source
    text of each line (for the report) is read from ``sources`` (file name -> path)."""
    doc = json.loads(gzip.decompress(path.read_bytes()))
    cov = Coverage()
    for f in doc["files"]:
        name = Path(f["file"]).name
        if name not in sources:
            continue  # headers inlined into the object (none of the port's have code)
        text = sources[name].read_text().splitlines()
        for ln in f["lines"]:
            n = int(ln["line_number"])
            cov.text[(name, n)] = text[n - 1].strip() if n <= len(text) else ""
            cov.lines[(name, n)] = cov.lines.get((name, n), False) or ln["count"] > 0
            for k, br in enumerate(ln["branches"]):
                cov.branches[(name, n, k)] = (cov.branches.get((name, n, k), False)
                                              or br["count"] > 0)
    return cov


def measure(objdir: Path) -> Coverage:
    """Run gcov --json-format -b on every port source and read its JSON files."""
    gcov = need("gcov")
    outdir = objdir / "gcov"
    shutil.rmtree(outdir, ignore_errors=True)
    outdir.mkdir()
    r = subprocess.run([gcov, "--json-format", "-b", "-o", str(objdir), *map(str, PORT)],
                       cwd=outdir, capture_output=True, text=True, timeout=120)
    assert r.returncode == 0, r.stderr
    # gcov's own summary must agree with the JSON (two readings of one run)
    summary = dict(re.findall(r"File '.*?([^/]+\.c)'\nLines executed:[\d.]+% of (\d+)",
                              r.stdout))
    sources = {src.name: src for src in PORT}
    cov = Coverage()
    for src in PORT:
        g = outdir / f"{src.stem}.gcov.json.gz"
        assert g.is_file(), r.stdout
        one = parse_gcov_json(g, sources)
        assert int(summary[src.name]) == one.total("lines", src.name)[1]
        cov.lines.update({k: v for k, v in one.lines.items() if k[0] == src.name})
        cov.branches.update({k: v for k, v in one.branches.items() if k[0] == src.name})
        cov.text.update(one.text)
    return cov


def _report(title: str, cov: Coverage) -> str:
    rows = [f"{title}: lines {cov.percent('lines'):.2f}% "
            f"({cov.total('lines')[0]}/{cov.total('lines')[1]}), branches "
            f"{cov.percent('branches'):.2f}% "
            f"({cov.total('branches')[0]}/{cov.total('branches')[1]})"]
    for src in PORT:
        ln, br = cov.total("lines", src.name), cov.total("branches", src.name)
        rows.append(f"  {src.name:<16} lines {ln[0]:>4}/{ln[1]:<4} branches {br[0]:>4}/{br[1]}")
    return "\n".join(rows)


@pytest.fixture(scope="module")
def coverage(tmp_path_factory: pytest.TempPathFactory) -> dict[str, Coverage]:
    """Coverage of the vector runner alone: 'binary64', 'binary32' and 'both'."""
    gcc = need("gcc")
    out: dict[str, Coverage] = {}
    for precision, extra in (("binary64", []), ("binary32", ["-DAIRDATA_SINGLE"])):
        tmp = tmp_path_factory.mktemp(f"cov{precision}")
        flags = ["-std=c99", "-O0", "--coverage", "-ffp-contract=off", *extra,
                 f"-I{C_DIR / 'include'}", f"-I{VECTORS_C}"]
        objs = []
        for src in PORT:
            obj = tmp / f"{src.stem}.o"
            r = subprocess.run([gcc, *flags, "-c", str(src), "-o", str(obj)],
                               capture_output=True, text=True, timeout=300)
            assert r.returncode == 0, r.stderr
            objs.append(str(obj))
        exe = tmp / "runner"
        r = subprocess.run([gcc, *flags, "-Wall", "-Wextra", "-Werror", str(RUNNER), *objs,
                            "-lm", "-o", str(exe)], capture_output=True, text=True,
                           timeout=300)
        assert r.returncode == 0, r.stderr[-3000:]
        run = subprocess.run([str(exe)], cwd=tmp, capture_output=True, text=True,
                             timeout=300)
        assert run.returncode == 0, run.stdout[-3000:]
        assert run.stdout.rstrip().endswith("30 functions: all passed")
        out[precision] = measure(tmp)
    out["both"] = out["binary64"].union(out["binary32"])
    for key, cov in out.items():
        print("\n" + _report(f"vectors alone, {key}", cov))
    return out


def test_gcov_parser_on_a_known_file(tmp_path: Path) -> None:
    # A hand-written file in gcov's documented JSON intermediate format (GCC manual,
    # "gcov", --json-format): counts per line, counts per branch.
    src = tmp_path / "x.c"
    src.write_text("int f(int a) {\n    if (a) {\n        return 0;\n    }\n    return a;\n")

    def br(*counts: int) -> list[dict[str, object]]:
        return [{"count": c, "fallthrough": k == 0, "throw": False}
                for k, c in enumerate(counts)]

    doc = {"format_version": "1", "gcc_version": "12.2.0", "files": [{
        "file": "/a/x.c", "lines": [
            {"line_number": 1, "count": 5, "unexecuted_block": False, "branches": []},
            {"line_number": 2, "count": 5, "unexecuted_block": False, "branches": br(5, 0)},
            {"line_number": 3, "count": 0, "unexecuted_block": True, "branches": []},
            {"line_number": 5, "count": 5, "unexecuted_block": False, "branches": br(0)}]},
        {"file": "/usr/include/other.h", "lines": [
            {"line_number": 9, "count": 0, "unexecuted_block": True, "branches": []}]}]}
    g = tmp_path / "x.gcov.json.gz"
    g.write_bytes(gzip.compress(json.dumps(doc).encode()))
    cov = parse_gcov_json(g, {"x.c": src})
    assert cov.total("lines") == (3, 4) and cov.total("branches") == (1, 3)
    assert cov.missed == ["x.c:2: branch 1 never taken (if (a) {)",
                          "x.c:3: line not executed: return 0;",
                          "x.c:5: branch 0 never taken (return a;)"]
    other = Coverage({("x.c", 3): True}, {("x.c", 2, 1): True})
    assert cov.union(other).total("branches") == (2, 3)


def test_every_port_source_is_measured(coverage: dict[str, Coverage]) -> None:
    # batch.c and domains.c included: a file gcov never saw would not count as missed
    cov = coverage["both"]
    assert {f for f, _ in cov.lines} == {p.name for p in PORT}
    # every file that makes a decision has branches measured: all but dd.c (straight-line
    # double-double arithmetic) and temperature.c (its argument checks are in inputs.c)
    assert all(cov.total("branches", p.name)[1] > 0 for p in PORT
               if p.name not in ("dd.c", "temperature.c"))


#: Per precision, measured on 2026-12-01 (suite 1.0.0): binary64 reaches every line,
#: binary32 all but the subnormal-safe branch of the stall EAS (limits.c), which its
#: range of valid inputs never needs; each misses a few branches the other takes.
PER_PRECISION_FLOOR = {"binary64": (100.0, 99.7), "binary32": (99.7, 99.4)}


def test_vectors_alone_reach_every_line_and_branch(coverage: dict[str, Coverage]) -> None:
    cov = coverage["both"]
    assert cov.percent("lines") == 100.0, cov.missed[:30]
    assert cov.percent("branches") == 100.0, cov.missed[:30]


@pytest.mark.parametrize("precision", ["binary64", "binary32"])
def test_vectors_alone_per_precision(coverage: dict[str, Coverage], precision: str) -> None:
    cov = coverage[precision]
    print(f"\n{precision} misses: {cov.missed or 'none'}")
    lines, branches = PER_PRECISION_FLOOR[precision]
    assert cov.percent("lines") >= lines, cov.missed[:30]
    assert cov.percent("branches") >= branches, cov.missed[:30]


# --- the runner's interface checks can fail ------------------------------------------

def _runner_with(tmp: Path, rename: str, shim: str) -> subprocess.CompletedProcess[str]:
    """The runner linked with the port, one function renamed in some sources and
    replaced by a shim calling the renamed original."""
    gcc = need("gcc")
    fn, where = rename.split("@")
    objs = []
    for src in PORT:
        obj = tmp / f"{src.stem}.o"
        extra = [f"-D{fn}={fn}_real"] if src.name in where.split(",") else []
        r = subprocess.run([gcc, "-std=c99", "-O1", "-ffp-contract=off", *extra,
                            f"-I{C_DIR / 'include'}", "-c", str(src), "-o", str(obj)],
                           capture_output=True, text=True, timeout=300)
        assert r.returncode == 0, r.stderr[-2000:]
        objs.append(str(obj))
    shim_c = tmp / "shim.c"
    shim_c.write_text('#include "airdata.h"\n' + shim)
    exe = tmp / "runner"
    r = subprocess.run([gcc, "-std=c99", "-O1", "-ffp-contract=off", f"-I{C_DIR / 'include'}",
                        f"-I{VECTORS_C}", str(RUNNER), str(shim_c), *objs, "-lm", "-o",
                        str(exe)], capture_output=True, text=True, timeout=300)
    assert r.returncode == 0, r.stderr[-2000:]
    return subprocess.run([str(exe)], capture_output=True, text=True, timeout=300)


def _failed(out: str) -> dict[str, int]:
    return {m.group(1): int(m.group(2)) for m in
            re.finditer(r"^(\w+)\s+\d+ cases\s+\d+ passed\s+(\d+) failed", out, re.M)}


def test_runner_catches_a_batch_entry_point_off_by_one_ulp(tmp_path: Path) -> None:
    # batch.c calls a tas_from_mach that is one ulp off; the scalar call is the port's
    r = _runner_with(tmp_path, "ad_tas_from_mach@batch.c",
                     "#include <math.h>\n"
                     "ad_status ad_tas_from_mach(ad_real m, ad_real t, ad_real *v);\n"
                     "ad_status ad_tas_from_mach_real(ad_real m, ad_real t, ad_real *v)\n"
                     "{\n    ad_status st = ad_tas_from_mach(m, t, v);\n"
                     "    *v = nextafter(*v, (ad_real)INFINITY);\n    return st;\n}\n")
    failed = _failed(r.stdout)
    assert r.returncode == 1 and len(failed) == 30
    assert failed["tas_from_mach"] > 500
    assert all(n == 0 for f, n in failed.items() if f != "tas_from_mach")
    assert "FAIL tas_from_mach case " in r.stdout
    assert "batch entry point differs from the scalar call" in r.stdout


def test_runner_catches_a_broken_null_rule(tmp_path: Path) -> None:
    # ceiling_margin answers AD_OK to a NULL output pointer (airdata.h: AD_INVALID_INPUT)
    r = _runner_with(tmp_path, "ad_ceiling_margin@limits.c,batch.c",
                     "#include <stddef.h>\n"
                     "ad_status ad_ceiling_margin_real(ad_real p, ad_real c, ad_real *m);\n"
                     "ad_status ad_ceiling_margin(ad_real p, ad_real c, ad_real *m)\n"
                     "{\n    return (m == NULL) ? AD_OK : ad_ceiling_margin_real(p, c, m);\n"
                     "}\n")
    failed = _failed(r.stdout)
    assert r.returncode == 1 and len(failed) == 30 and not any(failed.values())
    assert "FAIL ceiling_margin contract: a NULL pointer is refused" in r.stdout
    assert r.stdout.rstrip().endswith("30 functions: FAILED")
