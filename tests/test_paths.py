"""Path handling of the commands that take a suite, a results file or a destination.

Every form a user types -- relative, absolute, with a trailing slash, missing, a file where
a folder is expected -- either works or is refused with the path named exactly once (an
earlier defect joined a missing absolute path to itself: ``vectors/vectors``).
"""

from __future__ import annotations

import os
import subprocess
import sys
from pathlib import Path

import pytest

ROOT = Path(__file__).resolve().parents[1]
SUITE = ROOT / "vectors"


def _cli(cwd: Path, *args: str) -> subprocess.CompletedProcess[str]:
    env = dict(os.environ, PYTHONPATH=str(ROOT))
    return subprocess.run([sys.executable, "-m", "airdata", *args], cwd=cwd, env=env,
                          capture_output=True, text=True, timeout=300)


def _forms(tmp_path: Path) -> dict[str, str]:
    """The same suite named four ways, seen from ``tmp_path``."""
    return {"absolute": str(SUITE), "trailing slash": str(SUITE) + "/",
            "relative": os.path.relpath(SUITE, tmp_path),
            "relative, trailing slash": os.path.relpath(SUITE, tmp_path) + os.sep}


@pytest.mark.parametrize("form", ["absolute", "trailing slash", "relative",
                                  "relative, trailing slash"])
def test_vectors_verify_accepts_every_spelling_of_a_suite(tmp_path: Path, form: str) -> None:
    path = _forms(tmp_path)[form]
    r = _cli(tmp_path, "vectors", "verify", "--no-recompute", path)
    assert r.returncode == 0, r.stderr
    assert "OK - suite" in r.stdout


@pytest.mark.parametrize("form", ["absolute", "relative, trailing slash"])
def test_port_check_accepts_a_suite_by_any_path(tmp_path: Path, form: str) -> None:
    path = _forms(tmp_path)[form]
    r = _cli(tmp_path, "port", "check", "--suite", path, "--only", "pressure_altitude",
             "--precision", "double")
    assert r.returncode == 0, r.stdout[-2000:] + r.stderr[-2000:]
    assert "PASS" in r.stdout


@pytest.mark.parametrize("relative", [False, True])
def test_missing_suite_is_named_once(tmp_path: Path, relative: bool) -> None:
    missing = "no_suite_here" if relative else str(tmp_path / "no_suite_here")
    r = _cli(tmp_path, "vectors", "verify", missing)
    assert r.returncode == 1
    assert f"{missing}: no such directory" in r.stderr
    assert all(line.count("no_suite_here") <= 1 for line in r.stderr.splitlines())
    assert "no_suite_here/no_suite_here" not in r.stderr + r.stdout
    r = _cli(tmp_path, "port", "check", "--suite", missing, "--only", "pressure_altitude")
    assert r.returncode == 2
    assert f"{missing}: no vector suite here" in r.stderr
    assert "no_suite_here/no_suite_here" not in r.stderr


def test_a_file_where_a_suite_folder_is_expected(tmp_path: Path) -> None:
    f = tmp_path / "suite.txt"
    f.write_text("not a suite\n")
    r = _cli(tmp_path, "vectors", "verify", "suite.txt")
    assert r.returncode == 1 and "suite.txt: not a directory" in r.stderr


def test_copy_destination_forms(tmp_path: Path) -> None:
    # Relative destination, made if missing, with a trailing slash.
    r = _cli(tmp_path, "vectors", "copy", "fw/vec/")
    assert r.returncode == 0, r.stderr
    assert (tmp_path / "fw" / "vec" / "ad_vectors.h").is_file()
    # A file as destination is refused and named.
    (tmp_path / "plain").write_text("x")
    r = _cli(tmp_path, "port", "copy", "plain")
    assert r.returncode == 1 and "plain: exists and is not a directory" in r.stderr
    # An absolute destination inside which a needed folder is a file.
    (tmp_path / "fw2").mkdir()
    (tmp_path / "fw2" / "src").write_text("a file where src/ must go")
    r = _cli(tmp_path, "port", "copy", str(tmp_path / "fw2"))
    assert r.returncode == 1 and f"{tmp_path / 'fw2' / 'src'}: exists and is not a directory" \
        in r.stderr
    assert not (tmp_path / "fw2" / "Makefile").exists()


def test_missing_results_file_is_named(tmp_path: Path) -> None:
    r = _cli(tmp_path, "port", "verify", "out/results.txt")
    assert r.returncode == 2
    assert "out/results.txt: cannot read: No such file or directory" in r.stderr
