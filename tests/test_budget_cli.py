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


def _accuracy(*args: str) -> dict[str, float]:
    res = run("budget", "--json", "--alt-ft", "0,20000", "--cas-kt", "150", *args)
    assert res.returncode == 0, res.stderr
    return json.loads(res.stdout)["accuracy"]


@pytest.mark.parametrize(("spelling", "pa"), [
    ("0.5", 50.0),            # a bare number is hPa (as before units were accepted)
    ("0.5hPa", 50.0), ("50Pa", 50.0), ("0.05kPa", 50.0), ("0.5mb", 50.0),
    ("0.5 mbar", 50.0),
    ("0.015inHg", 0.015 * 3386.389),  # inch of mercury at 0 degC (airdata.units)
    ("0.01psi", 0.01 * 0.45359237 * 9.80665 / 0.0254 ** 2),  # NIST SP 811 definitions
    ("0.1hPa+20Pa", 30.0),
])
def test_budget_pressure_accuracy_in_any_unit(spelling: str, pa: float) -> None:
    acc = _accuracy("--ps-noise", spelling)
    assert acc["ps_noise"] == pytest.approx(pa, rel=1e-15) and acc["ps_noise_rel"] == 0.0


def test_budget_percent_of_reading_and_of_full_scale() -> None:
    acc = _accuracy("--ps-noise", "0.1hPa+0.01%", "--pitot-bias=-0.05%FS",
                    "--pitot-full-scale", "400hPa", "--pitot-noise", "0.02%rdg",
                    "--tat-noise", "0.9degF", "--tat-bias", "0.2degC")
    assert acc["ps_noise"] == pytest.approx(10.0) and acc["ps_noise_rel"] == 1e-4
    assert acc["pitot_bias"] == pytest.approx(-0.0005 * 40000.0) and acc["pitot_bias_rel"] == 0
    assert acc["pitot_noise_rel"] == pytest.approx(2e-4) and acc["pitot_noise"] == 0.0
    assert acc["tat_noise"] == pytest.approx(0.5) and acc["tat_bias"] == pytest.approx(0.2)
    # the figures are the library's with the same accuracy
    res = run("budget", "--json", "--alt-ft", "0,20000", "--cas-kt", "150", "--ps-noise",
              "0.1hPa+0.01%")
    doc = json.loads(res.stdout)
    b = error_budget([0.0, 6096.0], [150 * 1852 / 3600],
                     SensorAccuracy(ps_noise=10.0, ps_noise_rel=1e-4))
    np.testing.assert_allclose(np.array(doc["sd"]["pressure_altitude"]),
                               b.sd["pressure_altitude"], rtol=1e-12)


def test_budget_text_states_accuracies_in_the_unit_given() -> None:
    res = run("budget", "--alt-ft", "0", "--cas-kt", "150", "--ps-noise", "50Pa",
              "--pitot-bias", "0.01%")
    assert res.returncode == 0, res.stderr
    assert "Sensors (bias / noise, 1 sd): static 0 Pa / 50 Pa, qc 0 Pa + 0.01 % rdg / 0 Pa, " \
        "TAT 0 K / 0 K" in res.stdout


@pytest.mark.parametrize(("args", "message"), [
    (("--ps-noise", "-1"), "--ps-noise '-1': a noise standard deviation has no negative part"),
    (("--ps-noise", "0.02%FS"), "a percentage of full scale needs the sensor's range: give "
                                "--ps-full-scale"),
    (("--tat-noise", "1%"), "--tat-noise '1%': percentages are for the pressure sensors"),
    (("--ps-noise", "1kt"), "--ps-noise '1kt': 'kt' is not a pressure unit"),
    (("--ps-bias", "abc"), "--ps-bias 'abc': cannot read 'abc'"),
    (("--ps-bias", "1furlong"), "--ps-bias '1furlong': unknown unit 'furlong'"),
    (("--tat-bias", "1Pa"), "--tat-bias '1Pa': unknown unit 'Pa'"),
    (("--ps-noise", "20%"), "--ps-noise '20%': the part in % of reading must lie in [0, 10] %"),
    (("--ps-bias=-200hPa",), "--ps-bias '-200hPa': the fixed part must lie in [-100, 100] hPa "
                             "(it is -200 hPa)"),
    (("--tat-noise", "2e4K"), "--tat-noise '2e4K': the temperature must lie in [0, 10000] K"),
])
def test_budget_accuracy_refusals(args: tuple[str, ...], message: str) -> None:
    res = run("budget", *args)
    assert res.returncode == 1 and message in res.stderr, res.stderr


def test_budget_errors_exit_1() -> None:
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
    assert "static 0 Pa / 50 Pa, qc 0 Pa / 30 Pa" in fig.get_suptitle()
    fig = plot_budget(b, ("cas",), pressure_unit="hPa")
    assert "static 0 hPa / 0.5 hPa, qc 0 hPa / 0.3 hPa, TAT 0 K / 0 K" in fig.get_suptitle()
    with pytest.raises(ValueError, match="unknown output"):
        plot_budget(b, ("altitude",))
