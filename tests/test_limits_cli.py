"""``airdata limits`` through a subprocess, and the envelope chart."""

from __future__ import annotations

import json
import subprocess
import sys
from pathlib import Path

import pytest

from airdata.limits import crossover_altitude, envelope, plot_envelope

DEMO = Path(__file__).resolve().parent.parent / "examples" / "demo_aircraft.toml"


def run(*args: str) -> subprocess.CompletedProcess[str]:
    return subprocess.run([sys.executable, "-m", "airdata", *args], capture_output=True,
                          text=True, timeout=120, check=False)


def test_limits_table_text() -> None:
    res = run("limits", str(DEMO))
    assert res.returncode == 0, res.stderr
    out = res.stdout
    assert "crossover at" in out and "maximum altitude" in out
    assert "not certified flight software" in out
    rows = [ln for ln in out.splitlines() if ln.strip()[:1].isdigit() and "|" in ln]
    assert len(rows) == 21  # 0 to 38000 ft every 2000 ft, then the 39000 ft ceiling
    assert rows[0].rstrip().endswith("CAS") and rows[-1].rstrip().endswith("Mach")


def test_limits_table_of_a_supersonic_aircraft(tmp_path: Path) -> None:
    src = DEMO.with_name("demo_aircraft_supersonic.toml")
    env = envelope(src)
    res = run("limits", str(src))
    assert res.returncode == 0, res.stderr
    assert f"Mach limit 1.800, crossover at {env.crossover_altitude / 0.3048:,.0f} ft" \
        in res.stdout
    rows = [ln.split("|") for ln in res.stdout.splitlines()
            if ln.strip()[:1].isdigit() and "|" in ln]
    tas = [float(r[3].split()[2]) for r in rows]  # maximum operating TAS, kt
    assert max(tas) > 1000.0  # the wider column keeps every number whole
    np_tas = env.max_operating.tas / (1852.0 / 3600.0)
    assert tas == [round(float(v), 1) for v in np_tas]
    # limits that do not meet inside the model: said in words, not "nan ft"
    fast = tmp_path / "fast.toml"
    fast.write_text(src.read_text().replace("cas_kt = 750.0", "cas_kt = 900.0")
                    .replace("mach = 1.8", "mach = 1.05"))
    res = run("limits", str(fast))
    assert res.returncode == 0, res.stderr
    assert ("no crossover inside the standard atmosphere (the Mach limit governs "
            "throughout)") in res.stdout and "nan" not in res.stdout


def test_limits_json_matches_library() -> None:
    res = run("limits", str(DEMO), "--json", "--alt-ft", "0,20000,35000", "--dT", "10")
    assert res.returncode == 0, res.stderr
    doc = json.loads(res.stdout)
    ac = doc["aircraft"]
    assert doc["crossover_altitude_m"] == crossover_altitude(ac["cas_limit_m_s"],
                                                             ac["mach_limit"])
    assert doc["altitude_m"] == pytest.approx([0.0, 6096.0, 10668.0])
    env = envelope(DEMO, [0.0, 6096.0, 10668.0], dT=10.0)
    assert doc["max_operating"]["tas_m_s"] == env.max_operating.tas.tolist()
    assert doc["mach_governs"] == [False, False, True]


def test_limits_errors_exit_1() -> None:
    res = run("limits", "no/such/file.toml")
    assert res.returncode == 1 and "error" in res.stderr
    res = run("limits", str(DEMO), "--load-factor", "-2")
    assert res.returncode == 1 and "load_factor" in res.stderr


def test_limits_help_has_caution() -> None:
    res = run("limits", "--help")
    assert res.returncode == 0 and "not certified flight software" in res.stdout


def test_limits_plot_written(tmp_path: Path) -> None:
    png = tmp_path / "env.png"
    res = run("limits", str(DEMO), "--plot", str(png))
    assert res.returncode == 0, res.stderr
    assert png.read_bytes()[:8] == b"\x89PNG\r\n\x1a\n"


def test_plot_envelope_axes() -> None:
    fig = plot_envelope(envelope(DEMO))
    axes = fig.get_axes()
    assert [ax.get_xlabel() for ax in axes] == ["calibrated airspeed, kt", "true airspeed, kt"]
    assert axes[0].get_ylabel() == "pressure altitude, ft"
    assert len(axes[0].get_lines()) == 5  # two stall lines, max operating, two limits
