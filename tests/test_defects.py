"""Meta-test: every known defect of tools/inject_defects.py, injected into a copy of
this checkout, makes the tests named for it fail (the injection never touches the
checkout itself).  The script's own machinery is tested too: a harmless edit survives
and is reported as such, a defect whose text has gone is an error, and a hidden tool is
really gone from the PATH it builds.
"""

from __future__ import annotations

import shutil
import subprocess
import sys
from pathlib import Path

import pytest
from toolchains import load_script

ROOT = Path(__file__).resolve().parents[1]


inj = load_script(ROOT / "tools" / "inject_defects.py", "inject_defects")


@pytest.mark.parametrize("name", [d.name for d in inj.DEFECTS])
def test_each_defect_is_caught_by_its_tests(name: str) -> None:
    d = inj.BY_NAME[name]
    out = inj.run(d, d.tests, full=False, keep=False)
    assert out.returncode == 1, (name, out.returncode, out.tail)
    assert "FAILED" in out.tail, out.tail


def test_the_checkout_is_untouched() -> None:
    # after all the injections above, every defect's original text is still here once
    for d in inj.DEFECTS:
        for e in d.edits:
            assert (ROOT / e.path).read_text(encoding="utf-8").count(e.old) == 1, e.path
        for src, _ in d.moves:
            assert (ROOT / src).is_file(), src


def test_a_harmless_edit_survives() -> None:
    harmless = inj.Defect("harmless", "a comment changed", (
        "tests/test_toolchains.py::test_present_tool_gives_its_path",),
        edits=(inj.Edit("tests/toolchains.py", "#: Debian packages", "#: The Debian packages"),))
    out = inj.run(harmless, harmless.tests, full=False, keep=False)
    assert out.returncode == 0 and not out.caught, out.tail


def test_a_defect_whose_text_is_gone_is_an_error(tmp_path: Path) -> None:
    stale = inj.Defect("stale", "text no longer in the code", ("tests",),
                       edits=(inj.Edit("airdata/pitot.py", "no such text", "x"),))
    (tmp_path / "airdata").mkdir()
    (tmp_path / "airdata" / "pitot.py").write_text("print('hello')\n")
    with pytest.raises(inj.DefectError, match="pitot.py: expected text found 0 times"):
        inj.apply(stale, tmp_path)
    r = subprocess.run([sys.executable, str(ROOT / "tools" / "inject_defects.py"), "--only",
                        "no-such-defect"], capture_output=True, text=True, check=False)
    assert r.returncode == 2 and "invalid choice" in r.stderr


def test_a_hidden_tool_is_gone_from_the_path(tmp_path: Path,
                                             monkeypatch: pytest.MonkeyPatch) -> None:
    bindir = tmp_path / "bin"
    bindir.mkdir()
    for name in ("hidden-tool", "other-tool"):
        (bindir / name).write_text("#!/bin/sh\n")
        (bindir / name).chmod(0o755)
    monkeypatch.setenv("PATH", str(bindir))
    path = inj.path_without(["hidden-tool"], tmp_path / "scratch")
    assert shutil.which("hidden-tool", path=path) is None
    assert shutil.which("other-tool", path=path) is not None
