"""Put known defects into a copy of the repository and show that the tests catch each one.

Each defect is a small, realistic slip -- the kind a port or a refactoring makes -- with
the test files that must fail because of it.  For every defect the script copies the
tracked files of this checkout (plus its built cffi extensions) into a temporary
directory, applies the defect there (never here), runs pytest on the named tests in the
copy and records whether they failed.  A defect whose tests still pass has *survived*:
the suite does not prove what it claims.

The defects (``--list`` prints them):

* ``refuse-mach-3.9-5.5``: the reference refuses 20 < qc/ps < 40 (Mach 3.9 to 5.5) in
  ``mach_from_impact_pressure``; the round-trip properties must see the refusal.
* ``port-ok-not-zeroed``: the C port answers OK where impact pressure in the noise band
  was zeroed (``AD_IMPACT_PRESSURE_ZEROED``); the vector runner must see it.
* ``port-dynamic-pressure-1e-12``: the C port's dynamic pressure off by 1e-12 relative
  (about 4500 binary64 ulp); the vector runner must see it.
* ``compare-no-op``: the differential harness's ``compare()`` compares nothing; its own
  counts must fail it.
* ``earth-radius-in-both``: r0 = 6356767 m instead of 6356766 m in the library *and* in
  the test oracle; fluids' independent U.S. Standard Atmosphere 1976 must see it.
* ``gas-constant-in-both``: R = 287.05373 instead of 287.05287 J/(kg K) (3e-6
  relative) in the ICAO profile and the oracle alike; the ICAO table must see it.
* ``equations-doc-moved``: docs/equations.md renamed; the equation-id check must fail
  instead of skipping.
* ``missing-cross-compiler``: arm-none-eabi-gcc hidden from PATH with
  AIRDATA_REQUIRE_TOOLCHAINS=1; the bare-metal tests must fail, not skip.

Usage::

    python tools/inject_defects.py                 # every defect, its named tests
    python tools/inject_defects.py --only compare-no-op --baseline
    python tools/inject_defects.py --full          # the whole suite per defect (slow)

``--baseline`` first runs the same tests on an unmodified copy, which must pass (so a
failure is the defect's doing).  Exit status: 0 when every defect was caught, 1 when one
survived (or a baseline failed), 2 on a bad argument or a defect that no longer applies
to the code (its text was not found: update the defect with the code).
"""

from __future__ import annotations

import argparse
import os
import shutil
import subprocess
import sys
import tempfile
import time
from collections.abc import Sequence
from dataclasses import dataclass, field
from pathlib import Path

ROOT = Path(__file__).resolve().parents[1]


@dataclass(frozen=True)
class Edit:
    """Replace the one occurrence of ``old`` by ``new`` in ``path`` (repository-relative)."""

    path: str
    old: str
    new: str


@dataclass(frozen=True)
class Defect:
    """One injected defect and the tests that must catch it."""

    name: str
    what: str
    tests: tuple[str, ...]
    edits: tuple[Edit, ...] = ()
    moves: tuple[tuple[str, str], ...] = ()
    hide_tools: tuple[str, ...] = ()
    env: dict[str, str] = field(default_factory=dict)


_MACH_RETURN = ('    return args.finish(mach_from_pressures(np.where(over, 0.0, args["qc"]), '
                'args["ps"]))\n')

DEFECTS: tuple[Defect, ...] = (
    Defect(
        "refuse-mach-3.9-5.5",
        "reference refuses 20 < qc/ps < 40 in mach_from_impact_pressure",
        ("tests/test_properties.py",),
        edits=(Edit("airdata/pitot.py", _MACH_RETURN,
                    '    band = (x > 20.0) & (x < 40.0)\n'
                    '    args.flag(band, Status.OUT_OF_RANGE, "qc/ps", x, "defect")\n'
                    + _MACH_RETURN.replace("np.where(over,", "np.where(over | band,")),),
        env={"HYPOTHESIS_PROFILE": "ci"},
    ),
    Defect(
        "port-ok-not-zeroed",
        "C port gives OK instead of AD_IMPACT_PRESSURE_ZEROED in the noise band",
        ("tests/test_vectors_runner.py",),
        edits=(Edit("bindings/c/src/chain.c", "            st = AD_IMPACT_PRESSURE_ZEROED;\n",
                    "            st = AD_OK;\n"),),
    ),
    Defect(
        "port-dynamic-pressure-1e-12",
        "C port's dynamic pressure off by 1e-12 relative",
        ("tests/test_vectors_runner.py",),
        edits=(Edit("bindings/c/src/speeds.c",
                    "(AD_K_0P7 * ps * (mach * mach))",
                    "(AD_K_0P7 * ps * (mach * mach) * (ad_real)(1.0 + 1e-12))"),),
    ),
    Defect(
        "compare-no-op",
        "differential harness compare() returns before comparing anything",
        ("tests/test_cport_diff.py",),
        edits=(Edit("tests/test_cport_diff.py",
                    "    res = Comparison()\n    y_ref = reference(spec, args)\n",
                    "    res = Comparison()\n    return res\n"),),
    ),
    Defect(
        "earth-radius-in-both",
        "r0 = 6356767 m in the library and the oracle",
        ("tests/test_fluids.py",),
        edits=(Edit("airdata/profiles.py", '"r0": "6356766"', '"r0": "6356767"'),
               Edit("tests/oracle.py", 'Constant("6356766"', 'Constant("6356767"')),
    ),
    Defect(
        "gas-constant-in-both",
        "ICAO R = 287.05373 J/(kg K) (3e-6 relative) in the library and the oracle",
        ("tests/test_published.py",),
        edits=(Edit("airdata/profiles.py",
                    'definitions={"g0": "9.80665", "R": "287.05287", **_COMMON}',
                    'definitions={"g0": "9.80665", "R": "287.05373", **_COMMON}'),
               Edit("tests/oracle.py", 'Constant("287.05287"', 'Constant("287.05373"')),
    ),
    Defect(
        "equations-doc-moved",
        "docs/equations.md renamed to docs/equations-old.md",
        ("tests/test_vectors.py::test_equation_ids_exist_in_the_equations_document",),
        moves=(("docs/equations.md", "docs/equations-old.md"),),
    ),
    Defect(
        "missing-cross-compiler",
        "arm-none-eabi-gcc missing while AIRDATA_REQUIRE_TOOLCHAINS=1",
        ("tests/test_baremetal.py",),
        hide_tools=("arm-none-eabi-gcc",),
        env={"AIRDATA_REQUIRE_TOOLCHAINS": "1"},
    ),
)
BY_NAME = {d.name: d for d in DEFECTS}


class DefectError(Exception):
    """A defect that no longer applies to the code (its text is gone)."""


def copy_checkout(dest: Path) -> None:
    """Tracked files and the built extensions of this checkout, copied into ``dest``."""
    files = subprocess.run(["git", "ls-files", "-z"], cwd=ROOT, capture_output=True,
                           check=True).stdout.decode().split("\0")
    built = [str(p.relative_to(ROOT)) for p in (ROOT / "airdata").glob("_cport*.so")]
    for rel in [f for f in files if f] + built:
        src, dst = ROOT / rel, dest / rel
        if not src.is_file():
            continue  # deleted in the work tree but still tracked
        dst.parent.mkdir(parents=True, exist_ok=True)
        shutil.copy2(src, dst)  # a copy, not a link: a test that rewrites a file in
        # place must not reach the checkout (about 40 MB, well under a second)


def apply(defect: Defect, copy: Path) -> None:
    """Apply ``defect`` to the copy; :class:`DefectError` when its text is not found."""
    for e in defect.edits:
        path = copy / e.path
        text = path.read_text(encoding="utf-8")
        if text.count(e.old) != 1:
            raise DefectError(f"{defect.name}: {e.path}: expected text found "
                              f"{text.count(e.old)} times, not once: {e.old.strip()[:60]!r}")
        path.write_text(text.replace(e.old, e.new), encoding="utf-8")
    for src, dst in defect.moves:
        if not (copy / src).is_file():
            raise DefectError(f"{defect.name}: {src} does not exist")
        (copy / src).rename(copy / dst)


def path_without(names: Sequence[str], scratch: Path) -> str:
    """PATH with every directory that holds one of ``names`` replaced by a copy of
    links to everything else in it."""
    out = []
    for i, d in enumerate(os.environ.get("PATH", "").split(os.pathsep)):
        p = Path(d)
        if not any((p / n).exists() for n in names):
            out.append(d)
            continue
        shadow = scratch / f"path{i}"
        shadow.mkdir(parents=True, exist_ok=True)
        for entry in p.iterdir():
            if entry.name not in names:
                (shadow / entry.name).symlink_to(entry)
        out.append(str(shadow))
    return os.pathsep.join(out)


@dataclass
class Outcome:
    """What one run gave."""

    defect: str
    returncode: int
    seconds: float
    tail: str

    @property
    def caught(self) -> bool:
        # 1: tests failed; 2: collection or usage error caused by the defect (reported)
        return self.returncode in (1, 2)


def run(defect: Defect | None, tests: Sequence[str], full: bool, keep: bool) -> Outcome:
    """Copy, apply ``defect`` (None: the unmodified baseline), run the tests."""
    name = defect.name if defect else "baseline"
    work = Path(tempfile.mkdtemp(prefix=f"airdata-defect-{name}-"))
    try:
        copy = work / "repo"
        copy_checkout(copy)
        env = {**os.environ, "PYTHONPATH": str(copy)}
        if defect is not None:
            apply(defect, copy)
            env.update(defect.env)
            if defect.hide_tools:
                env["PATH"] = path_without(defect.hide_tools, work)
        cmd = [sys.executable, "-m", "pytest", "-q", "-x", "-p", "no:cacheprovider",
               *([] if full else tests)]
        t0 = time.monotonic()
        r = subprocess.run(cmd, cwd=copy, env=env, capture_output=True, text=True,
                           timeout=3600, check=False)
        lines = (r.stdout + r.stderr).strip().splitlines()
        tail = "\n".join([ln for ln in lines if ln.startswith(("FAILED", "ERROR"))][:3]
                         + lines[-1:])
        return Outcome(name, r.returncode, time.monotonic() - t0, tail)
    finally:
        if keep:
            print(f"   kept {work}", file=sys.stderr)
        else:
            shutil.rmtree(work, ignore_errors=True)


def main(argv: Sequence[str] | None = None) -> int:
    parser = argparse.ArgumentParser(
        prog="inject_defects.py",
        description="Inject known defects into a copy of the repository and check that "
                    "the tests catch each (exit 0: all caught, 1: one survived, 2: a "
                    "defect no longer applies or a bad argument).")
    parser.add_argument("--list", action="store_true", help="list the defects and exit")
    parser.add_argument("--only", nargs="+", metavar="NAME", choices=list(BY_NAME),
                        help="run only these defects")
    parser.add_argument("--baseline", action="store_true",
                        help="first run each defect's tests on an unmodified copy")
    parser.add_argument("--full", action="store_true",
                        help="run the whole suite for each defect, not its named tests")
    parser.add_argument("--keep", action="store_true", help="keep the copies")
    args = parser.parse_args(argv)
    if args.list:
        for d in DEFECTS:
            print(f"{d.name:28s} {d.what}  [{' '.join(d.tests)}]")
        return 0
    chosen = [BY_NAME[n] for n in args.only] if args.only else list(DEFECTS)
    failed = 0
    for d in chosen:
        try:
            if args.baseline:
                base = run(None, d.tests, args.full, args.keep)
                if base.returncode != 0:
                    print(f"BASELINE FAILS for {d.name} (exit {base.returncode}):\n"
                          f"{base.tail}")
                    failed += 1
                    continue
            out = run(d, d.tests, args.full, args.keep)
        except DefectError as exc:
            print(f"error: {exc}", file=sys.stderr)
            return 2
        verdict = "caught" if out.caught else "SURVIVED"
        print(f"{d.name:28s} {verdict:8s} exit {out.returncode} in {out.seconds:5.1f} s")
        for line in out.tail.splitlines():
            print(f"    {line[:150]}")
        failed += 0 if out.caught else 1
    print(f"{len(chosen) - failed} of {len(chosen)} defects caught")
    return 1 if failed else 0


if __name__ == "__main__":
    sys.exit(main())
