"""``airdata port coverage`` on a user's own port (clang 19 MC/DC).

The bundled port's figures are compared with tests/test_mcdc.py's own measurement there
(test_port_coverage_of_the_bundled_port_is_the_mcdc_measurement).  Here a small port
written for the test, tests/data/ports/coverage_dynamic_pressure.c, implements one
function of airdata.h (dynamic pressure) with every argument rule and one decision that
no vector can reach (a negative q after q = 0.7 ps M^2 of checked arguments).  The tool
must list that line, and only it, in both precisions; the NULL-output guard must count as
exercised (the vector runner hands every function whose cases all pass a NULL output
pointer, airdata.h); the batch entry points, which the port does not define, must not be
asked of it; and a port that writes through the NULL pointer must be reported as an
incomplete run, not as a measurement.

A missing clang 19 skips, or fails with AIRDATA_REQUIRE_TOOLCHAINS=1 (test_mcdc.toolchain).
"""

from __future__ import annotations

import json
import os
import subprocess
from pathlib import Path

from test_mcdc import toolchain

from airdata.portcheck.coverage import coverage_of_sources

ROOT = Path(__file__).resolve().parents[1]
PORT = ROOT / "tests" / "data" / "ports" / "coverage_dynamic_pressure.c"
SRC = ROOT / "bindings" / "c" / "src"       # ad_constants.h, for the domain limits
DEAD = next(i for i, t in enumerate(PORT.read_text().splitlines(), 1) if "COVERAGE-DEAD" in t)


def _places(missed: list[str]) -> set[str]:
    return {":".join(m.split(":")[:2]) for m in missed}


def test_the_unreachable_condition_is_listed_and_nothing_else(tmp_path: Path) -> None:
    tools = toolchain()
    figs = coverage_of_sources([PORT], ROOT / "vectors", ("double", "single"), [SRC],
                               only=["dynamic_pressure"], workdir=tmp_path, tools=tools)
    assert set(figs) == {"double", "single", "both"}
    for key, fig in figs.items():
        print(f"\n{key}: {fig.summary()}\n" + "\n".join(fig.missed + fig.notes))
        assert set(fig.per_file) == {PORT.name}
        assert _places(fig.missed) == {f"{PORT.name}:{DEAD}"}, fig.missed
        # both conditions of the one decision, and no other MC/DC condition
        assert fig.totals["mcdc"][1] - fig.totals["mcdc"][0] == 2
        mcdc = [m for m in fig.missed if "MC/DC" in m]
        assert len(mcdc) == 1 and "conditions 1, 2 of 2" in mcdc[0]
        assert fig.percent("lines") == 100.0    # the guard's return line ran (NULL rule)
    notes = " ".join(figs["both"].notes)
    assert "-DRUNNER_SCALAR_ONLY" in notes and "failures" not in notes and \
        "INCOMPLETE" not in notes


def test_a_port_writing_through_null_is_an_incomplete_run(tmp_path: Path) -> None:
    toolchain()
    report = tmp_path / "cov.json"
    env = dict(os.environ, PYTHONPATH=str(ROOT))
    r = subprocess.run(["python3", "-m", "airdata", "port", "coverage", "--source", str(PORT),
                        "--include", str(SRC), "--define", "COVERAGE_NO_NULL_GUARD",
                        "--only", "dynamic_pressure", "--precision", "double", "--report",
                        str(report), "--suite", str(ROOT / "vectors")],
                       capture_output=True, text=True, timeout=600, env=env, cwd=tmp_path)
    print(r.stdout, r.stderr)
    assert r.returncode == 2
    assert "INCOMPLETE: the runner stopped with signal 11 in function dynamic_pressure" \
        in r.stdout
    # what ran before the crash is still measured: the cases reached the dead line
    doc = json.loads(report.read_text())
    fig = doc["measurements"]["double"]
    assert fig["totals"]["lines"]["covered"] > 0
    assert f"{PORT.name}:{DEAD}" in _places(fig["missed"])


def test_the_command_states_tools_and_caution(tmp_path: Path) -> None:
    toolchain()
    report = tmp_path / "cov.json"
    env = dict(os.environ, PYTHONPATH=str(ROOT))
    r = subprocess.run(["python3", "-m", "airdata", "port", "coverage", "--source", str(PORT),
                        "--include", str(SRC), "--only", "dynamic_pressure", "--suite",
                        str(ROOT / "vectors"), "--report", str(report), "--fail-under", "100"],
                       capture_output=True, text=True, timeout=600, env=env, cwd=tmp_path)
    print(r.stdout, r.stderr)
    assert r.returncode == 1                 # 2 of 4 MC/DC conditions: below 100
    assert "clang version 19." in r.stdout and "LLVM version 19." in r.stdout
    assert "not certified flight software" in r.stdout
    assert f"{PORT.name}:{DEAD}:" in r.stdout
    doc = json.loads(report.read_text())
    assert doc["tool_versions"]["clang"].find("19.") > 0
    assert "not certified flight software" in doc["disclaimer"]
    assert doc["measurements"]["both"]["totals"]["mcdc"] == {"covered": 2, "count": 4,
                                                             "percent": 50.0}


def test_batch_entry_points_are_required_when_asked_for(tmp_path: Path) -> None:
    # --batch yes on a port without airdata_batch.h's functions: the runner cannot link
    toolchain()
    env = dict(os.environ, PYTHONPATH=str(ROOT))
    r = subprocess.run(["python3", "-m", "airdata", "port", "coverage", "--source", str(PORT),
                        "--include", str(SRC), "--only", "dynamic_pressure", "--suite",
                        str(ROOT / "vectors"), "--batch", "yes", "--precision", "double"],
                       capture_output=True, text=True, timeout=600, env=env, cwd=tmp_path)
    assert r.returncode == 2
    assert "ad_dynamic_pressure_n" in r.stderr
