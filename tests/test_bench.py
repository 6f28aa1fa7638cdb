"""``airdata bench``: the report's structure, not its timings (no timed assertions).

The quick benchmark is run once through the real command line (a subprocess, as a user
runs it) and its JSON report is checked: every line is present with the goal
the issue states, measured values are positive finite numbers, verdicts agree with the
values, and the solver histogram accounts for every sampled point.
"""

from __future__ import annotations

import json
import math
import subprocess
import sys
from importlib.util import find_spec
from pathlib import Path
from typing import Any

import numpy as np
import pytest

import airdata.pitot as pitot
from airdata import bench
from airdata.bench import common, lines_numpy, lines_scalar

#: Lines of the report and the goal set for each (None: for information).
EXPECTED_GOALS: dict[str, tuple[str, float] | None] = {
    "1": ("<=", 2.0),      # pressure_altitude within 2x the exp(log(p)) floor
    "2": ("<=", 6.0),      # supersonic Mach within 6x the floor
    "3": (">=", 50.0),     # atmosphere 50x faster than fluids point by point
    "4": (">=", 250.0),    # inversion 250x faster than brentq per point
    "5a": None,            # port pressure_altitude: no goal stated
    "5b": (">=", 3.0),     # port 3x faster than the reference on the chain
    "6a": ("<", 1500.0),   # under 1500 instructions per chain call
    "6b": None,            # solver instructions: state it
    "7a": ("<", 30.0),     # vector suite in under 30 s
    "7b": ("<", 500.0),    # and under 500 MB
    "8": ("<=", common.FLAT_LIMIT),  # flat memory over chunks
    "9a": ("<=", 2.0),     # reduce CSV -> CSV within 2x pyarrow's read + write
    "9b": ("<=", 2.0),     # reduce CSV -> Parquet within 2x pyarrow's read + write
    "10a": ("<=", 3.0),    # scalar pressure_altitude within 3x a careful pure-Python one
    "10b": (">=", 1.0),    # scalar atmosphere faster than fluids per point
}


@pytest.fixture(scope="module")
def quick_run(tmp_path_factory: pytest.TempPathFactory) -> tuple[dict[str, Any], str]:
    """The JSON report and the printed table of one ``airdata bench --quick`` run."""
    out = tmp_path_factory.mktemp("bench") / "report.json"
    proc = subprocess.run(
        [sys.executable, "-m", "airdata", "bench", "--quick", "--silent", "--json", str(out)],
        capture_output=True, text=True, timeout=120)
    assert proc.returncode == 0, proc.stderr[-2000:]
    return json.loads(Path(out).read_text(encoding="utf-8")), proc.stdout


def test_pure_python_peer_computes_pressure_altitude() -> None:
    # Line 10a compares against a peer; a wrong peer would make the ratio meaningless.
    from airdata import pressure_altitude
    from airdata.profiles import get_profile

    prof = get_profile("icao")
    bases = list(zip(prof.layer_base, prof.base_pressure, prof.base_temperature,
                     prof.lapse_rate, strict=True))[::-1]
    for ps in np.geomspace(1.0, 170000.0, 400):
        got = lines_scalar._python_pressure_altitude(float(ps), bases, prof.R, prof.g0)
        assert got == pytest.approx(pressure_altitude(float(ps)), rel=1e-12, abs=1e-9)


def test_every_line_present_once_with_its_goal(quick_run: tuple[dict[str, Any], str]) -> None:
    report, _ = quick_run
    keys = [ln["key"] for ln in report["lines"]]
    assert keys == list(EXPECTED_GOALS)
    for ln in report["lines"]:
        want = EXPECTED_GOALS[ln["key"]]
        if want is None:
            assert ln["goal"] is None, ln
        else:
            assert (ln["goal"]["op"], ln["goal"]["limit"]) == want, ln
        assert ln["title"] and ln["unit"]


def test_measured_values_are_positive_finite(quick_run: tuple[dict[str, Any], str]) -> None:
    report, _ = quick_run
    for ln in report["lines"]:
        if ln["measured"]:
            v = ln["value"]
            assert isinstance(v, float) and math.isfinite(v) and v > 0.0, ln
        else:
            assert ln["value"] is None and ln["met"] is None, ln
            assert ln["note"].startswith("not measured: "), ln


def test_verdicts_follow_values_and_goals(quick_run: tuple[dict[str, Any], str]) -> None:
    report, _ = quick_run
    ops = {"<=": lambda a, b: a <= b, "<": lambda a, b: a < b, ">=": lambda a, b: a >= b}
    for ln in report["lines"]:
        if ln["measured"] and ln["goal"] is not None:
            assert ln["met"] is ops[ln["goal"]["op"]](ln["value"], ln["goal"]["limit"]), ln
        else:
            assert ln["met"] is None, ln


def test_lines_with_installed_peers_are_measured(quick_run: tuple[dict[str, Any], str]
                                                 ) -> None:
    """Only a missing optional peer or tool may leave a line unmeasured."""
    report, _ = quick_run
    by_key = {ln["key"]: ln for ln in report["lines"]}
    must = ["1", "2", "7a", "7b", "8", "10a"]
    if find_spec("fluids") is not None:
        must += ["3", "10b"]
    if find_spec("scipy") is not None:
        must.append("4")
    for key in must:
        assert by_key[key]["measured"], by_key[key]


def test_histogram_sums_to_the_sample_count(quick_run: tuple[dict[str, Any], str]) -> None:
    report, _ = quick_run
    h = report["histogram"]
    assert h["samples"] == bench.SIZES["quick"]["hist"]
    assert sum(h["counts"].values()) == h["samples"]
    assert set(h["counts"]) == {str(k) for k in range(1, common.HIST_STEPS + 1)}
    assert h["shipped_steps"] == pitot.NEWTON_STEPS


def test_chunked_runs_processed_every_sample(quick_run: tuple[dict[str, Any], str]) -> None:
    report, _ = quick_run
    line8 = next(ln for ln in report["lines"] if ln["key"] == "8")
    d = line8["details"]
    assert d["large_samples"] == 10 * d["small_samples"] == bench.SIZES["quick"]["chain_large"]
    assert d["small_peak_kib"] > 0 and d["large_peak_kib"] > 0
    assert line8["value"] == pytest.approx(d["large_peak_kib"] / d["small_peak_kib"])


def test_table_prints_every_line_and_the_histogram(quick_run: tuple[dict[str, Any], str]
                                                   ) -> None:
    report, table = quick_run
    rows = table.splitlines()
    for ln in report["lines"]:
        assert any(r.startswith(f"{ln['key']} ") and ln["title"] in r for r in rows), ln["key"]
    assert "Newton steps needed" in table
    assert "goals met:" in table


def test_histogram_restores_the_shipped_step_count() -> None:
    """Solver steps over Mach 1..10 (NACA Report 1135 eq. 100 through the shipped kernel).

    The pitot module documents that the binary64 iteration settles within 5 steps; the
    histogram must see that too, and leave the module constant as it found it.
    """
    shipped = pitot.NEWTON_STEPS
    m = np.linspace(1.0 + 1e-9, 10.0, 2001)
    r = 1.0 + pitot.ratio_from_mach(m)
    h = lines_numpy._histogram(r, pitot)
    assert pitot.NEWTON_STEPS == shipped
    assert sum(h["counts"].values()) == r.size
    assert h["counts"][str(common.HIST_STEPS)] == 0


def test_line_verdicts_and_skipped_lines_in_the_table() -> None:
    ok = common._line("1", "a", 1.5, "x floor", "<=", 2.0)
    bad = common._line("2", "b", 7.0, "x floor", "<=", 6.0)
    info = common._line("5a", "c", 1.7, "x faster", None, None)
    gone = common._missing("3", "d", "x faster", ">=", 50.0, "fluids not installed")
    assert (ok["met"], bad["met"], info["met"], gone["met"]) == (True, False, None, None)
    report = {"version": "0", "quick": True, "seed": 1, "sizes": {"n": 10, "repeats": 1},
              "machine": {"cpu": "x", "cores": 1, "python": "3", "numpy": "2",
                          "loadavg_start": [0.0], "loadavg_end": [0.0]},
              "lines": [ok, bad, info, gone], "histogram": {}, "seconds": 1.0}
    table = bench.format_table(report)
    assert "NOT MET" in table and "skipped" in table
    assert "not measured: fluids not installed" in table
    assert "goals met: 1 of 3" in table


def test_help_names_the_options() -> None:
    proc = subprocess.run([sys.executable, "-m", "airdata", "bench", "--help"],
                          capture_output=True, text=True, timeout=60)
    assert proc.returncode == 0
    assert "--quick" in proc.stdout and "--json" in proc.stdout
    assert "not certified flight software" in " ".join(proc.stdout.split())


def test_a_failing_measurement_keeps_every_line_it_gives(monkeypatch: pytest.MonkeyPatch
                                                         ) -> None:
    # Every measurement raising: the report still has each line of EXPECTED_GOALS, with
    # its goal, marked not measured and naming the error (a crash or a missing line
    # would hide a whole group from the table).
    def fail(*_args: Any) -> Any:
        raise RuntimeError("probe failure")

    for name in ("_floor_and_reference", "_fluids_line", "_brentq_line", "_port_lines",
                 "_callgrind_lines", "_suite_lines", "_chunk_line", "_reduce_lines",
                 "_scalar_lines"):
        monkeypatch.setattr(bench, name, fail)
    report = bench.run_bench(quick=True)
    assert [ln["key"] for ln in report["lines"]] == list(EXPECTED_GOALS)
    for ln in report["lines"]:
        want = EXPECTED_GOALS[ln["key"]]
        got = None if ln["goal"] is None else (ln["goal"]["op"], ln["goal"]["limit"])
        assert got == want, ln
        assert not ln["measured"] and ln["value"] is None, ln
        assert ln["note"] == "not measured: RuntimeError: probe failure", ln
