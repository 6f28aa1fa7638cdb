"""``airdata budget`` through a subprocess, and the error-budget maps."""

from __future__ import annotations

import json
import subprocess
import sys
from pathlib import Path

import numpy as np
import pytest

from airdata.budget import OUTPUTS, SensorAccuracy, error_budget, plot_budget


def run(*args: str) -> subprocess.CompletedProcess[str]:
    return subprocess.run([sys.executable, "-m", "airdata", *args], capture_output=True,
                          text=True, timeout=120, check=False)


def test_budget_sensitivities_only() -> None:
    res = run("budget", "--alt-ft", "0", "--cas-kt", "100")
    assert res.returncode == 0, res.stderr
    # About 27 ft per hPa at sea level (common practice, no source).
    line = next(ln for ln in res.stdout.splitlines() if "ft/hPa" in ln)
    assert 26.5 < float(line.split()[2]) < 28.0
    assert "sensitivities only" in res.stdout


def test_budget_json_matches_library_and_units() -> None:
    res = run("budget", "--json", "--alt-ft", "0:10000:5000", "--cas-kt", "150,250",
              "--ps-noise", "0.5", "--pitot-bias", "-0.2", "--tat-noise", "0.3",
              "--pitot-sensor", "pt")
    assert res.returncode == 0, res.stderr
    doc = json.loads(res.stdout)
    acc = SensorAccuracy(ps_noise=50.0, pitot_bias=-20.0, tat_noise=0.3)
    b = error_budget([0.0, 1524.0, 3048.0], [150 * 1852 / 3600, 250 * 1852 / 3600], acc,
                     pitot="pt")
    assert doc["accuracy"] == acc.as_dict()
    for k in OUTPUTS:
        np.testing.assert_allclose(np.array(doc["rms"][k]), b.rms[k], rtol=1e-12)


def test_budget_monte_carlo_text() -> None:
    res = run("budget", "--alt-ft", "0,30000", "--cas-kt", "150,300", "--ps-noise", "1",
              "--monte-carlo", "2000", "--seed", "5", "--outputs", "pressure_altitude")
    assert res.returncode == 0, res.stderr
    assert "Monte Carlo, 2000 samples, seed 5" in res.stdout


def test_budget_errors_exit_1() -> None:
    res = run("budget", "--ps-noise", "-1")
    assert res.returncode == 1 and "ps_noise" in res.stderr
    res = run("budget", "--outputs", "altitude")
    assert res.returncode == 1 and "unknown output" in res.stderr
    res = run("budget", "--alt-ft", "0:x:1")
    assert res.returncode == 2


def test_budget_plot_written(tmp_path: Path) -> None:
    png = tmp_path / "budget.png"
    res = run("budget", "--ps-noise", "0.5", "--pitot-noise", "0.3", "--plot", str(png))
    assert res.returncode == 0, res.stderr
    assert png.read_bytes()[:8] == b"\x89PNG\r\n\x1a\n"


def test_plot_budget_panels() -> None:
    b = error_budget([0.0, 5000.0, 10000.0], [80.0, 150.0, 220.0],
                     SensorAccuracy(ps_noise=50.0, pitot_noise=30.0))
    fig = plot_budget(b, ("pressure_altitude", "cas"))
    titles = [ax.get_title() for ax in fig.get_axes() if ax.get_title()]
    assert titles == ["pressure altitude", "CAS"]
    with pytest.raises(ValueError, match="unknown output"):
        plot_budget(b, ("altitude",))
