"""The ``airdata demo`` command, run as a user runs it: ``python -m airdata`` in a
subprocess, from a directory outside the checkout.

Checks: exit codes; the caution (a verification aid, not certified flight software) in
the text output and in the help; ``--json`` parses and carries exactly the numbers
``air_data`` gives on the demo readings; bad options fail with a message on stderr.
"""

from __future__ import annotations

import json
import math
import re
import subprocess
import sys
from pathlib import Path
from typing import Any

import numpy as np
import pytest

import airdata
from airdata import Status
from airdata.demo import SCENARIO, demo_readings

#: Phrases the caution must contain (conventions section 7: a verification aid, not
#: certified flight software; flight software follows its own certification basis).
CAUTION_PHRASES = ("not certified flight software", "certification basis")

OUTPUTS = ("pressure_altitude", "baro_altitude", "impact_pressure", "mach", "cas", "eas",
           "tas", "sat", "density", "density_altitude", "dynamic_pressure")


def run(*args: str, cwd: Path) -> subprocess.CompletedProcess[str]:
    return subprocess.run([sys.executable, "-m", "airdata", *args], cwd=cwd,
                          capture_output=True, text=True, timeout=120, check=False)


def flat(text: str) -> str:
    """Whitespace collapsed (help text is wrapped at the terminal width)."""
    return re.sub(r"\s+", " ", text)


def test_demo_text(tmp_path: Path) -> None:
    res = run("demo", cwd=tmp_path)
    assert res.returncode == 0, res.stderr
    assert res.stderr == ""
    out = flat(res.stdout)
    for phrase in CAUTION_PHRASES:
        assert phrase in out
    for phase, *_ in SCENARIO:
        assert phase in res.stdout
    assert "icao" in res.stdout  # the profile in force is recorded


@pytest.mark.parametrize("args", [("--help",), ("demo", "--help")])
def test_help_has_caution(tmp_path: Path, args: tuple[str, ...]) -> None:
    res = run(*args, cwd=tmp_path)
    assert res.returncode == 0, res.stderr
    for phrase in CAUTION_PHRASES:
        assert phrase in flat(res.stdout)
    assert "demo" in res.stdout


def _same(a: float, b: float) -> bool:
    return (math.isnan(a) and math.isnan(b)) or a == b


@pytest.mark.parametrize(("profile", "setting"), [("icao", None), ("us1976", 100500.0)])
def test_demo_json_matches_air_data(tmp_path: Path, profile: str, setting: float | None
                                    ) -> None:
    args = ["demo", "--json", "--profile", profile]
    if setting is not None:
        args += ["--setting", repr(setting)]
    res = run(*args, cwd=tmp_path)
    assert res.returncode == 0, res.stderr
    doc: dict[str, Any] = json.loads(res.stdout)
    assert doc["profile"]["name"] == profile
    assert doc["profile"]["p0"] == 101325.0 and doc["profile"]["T0"] == 288.15

    rd = demo_readings()
    ref = airdata.air_data(rd["ps"], rd["pt"], rd["tat"], setting=setting, profile=profile)
    samples = doc["samples"]
    assert len(samples) == len(SCENARIO) == len(rd["ps"])
    for i, row in enumerate(samples):
        assert row["phase"] == SCENARIO[i][0]
        assert row["ps_Pa"] == float(rd["ps"][i])
        assert row["pt_Pa"] == float(rd["pt"][i])
        assert row["tat_K"] == float(rd["tat"][i])
        for key in OUTPUTS:
            want = getattr(ref, key)
            if want is None:
                assert key not in row or row[key] is None, key
                continue
            # JSON carries the shortest repr of a binary64: the very same bits come back
            assert _same(row[key], float(np.asarray(want)[i])), (i, key)
        assert row["status"] == Status(int(ref.status[i])).name
    # The demo readings were made from round flight conditions: the chain gives them
    # back to the rounding of the readings (0.1 Pa, 0.01 K).
    for row, (_, _, mach, _) in zip(samples, SCENARIO, strict=True):
        assert row["mach"] == pytest.approx(mach, abs=2e-3)
        if mach == 0.0:
            assert row["cas"] == 0.0 and row["status"] in ("OK", "IMPACT_PRESSURE_ZEROED")


@pytest.mark.parametrize("args", [
    ("demo", "--bogus"),
    ("demo", "--profile", "nope"),
    ("demo", "--setting", "not-a-number"),
    ("no-such-command",),
    (),
])
def test_bad_usage_fails_with_message(tmp_path: Path, args: tuple[str, ...]) -> None:
    res = run(*args, cwd=tmp_path)
    assert res.returncode != 0
    assert res.stderr.strip(), "no message on stderr"
    assert "usage" in res.stderr.lower()
    assert "Traceback" not in res.stderr


def test_setting_out_of_range_fails_cleanly(tmp_path: Path) -> None:
    res = run("demo", "--setting", "1e9", cwd=tmp_path)
    assert res.returncode != 0
    assert "setting" in res.stderr and "1000000000.0" in res.stderr
    assert "Traceback" not in res.stderr
    assert res.stdout == ""


def test_version(tmp_path: Path) -> None:
    res = run("--version", cwd=tmp_path)
    assert res.returncode == 0
    assert airdata.__version__ in res.stdout
