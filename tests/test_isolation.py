"""No test module changes process-wide state at import: mpmath's global precision and
numpy's floating-point error handling stay at their defaults after every test module of
this directory has been imported (in a fresh interpreter, so that this run's own state
does not matter).  A module that needs 50 digits makes its own ``mpmath.MPContext``.
"""

from __future__ import annotations

import subprocess
import sys
from pathlib import Path

TESTS = Path(__file__).resolve().parent

PROBE = """
import importlib, pathlib, sys
import mpmath, numpy as np
before = (mpmath.mp.dps, mpmath.mp.prec, np.geterr())
for p in sorted(pathlib.Path(sys.argv[1]).glob("test_*.py")):
    importlib.import_module(p.stem)
    now = (mpmath.mp.dps, mpmath.mp.prec, np.geterr())
    if now != before:
        print("LEAK", p.name, now)
        sys.exit(1)
print("OK", len(list(pathlib.Path(sys.argv[1]).glob("test_*.py"))))
"""


def _probe(tests: Path) -> subprocess.CompletedProcess[str]:
    return subprocess.run([sys.executable, "-c", PROBE, str(tests)], cwd=tests,
                          env={"PYTHONPATH": f"{tests}:{TESTS.parent}", "PATH": "/usr/bin:/bin"},
                          capture_output=True, text=True, timeout=300, check=False)


def test_importing_every_test_module_leaves_global_state_alone() -> None:
    r = _probe(TESTS)
    assert r.returncode == 0 and r.stdout.startswith("OK"), r.stdout + r.stderr[-2000:]
    assert int(r.stdout.split()[1]) >= 40


def test_the_probe_sees_a_leak(tmp_path: Path) -> None:
    (tmp_path / "test_leaky.py").write_text("import mpmath\nmpmath.mp.dps = 50\n")
    r = _probe(tmp_path)
    assert r.returncode == 1 and "LEAK test_leaky.py" in r.stdout, r.stdout + r.stderr
