"""``reduce --compare --source ...``: a recorded series replayed through a user's own port.

The port is compiled the way ``airdata port check`` compiles it.  The bundled port's own
sources given as a "user" port agree with the reference everywhere (the same code as the
cffi build); a copy with a defect of known size (0.1 ft added to the pressure altitude)
disagrees in exactly that output on exactly the rows that have one, by 0.1 ft.
"""

from __future__ import annotations

import json
import shutil
import subprocess
import sys
from pathlib import Path

import pytest
from toolchains import host_compiler  # noqa: F401  (fixture)

ROOT = Path(__file__).resolve().parents[1]
DEMO = ROOT / "examples" / "demo_flight.csv"
SRC = ROOT / "bindings" / "c" / "src"

pytestmark = pytest.mark.usefixtures("host_compiler")


def run(*args: str) -> subprocess.CompletedProcess[str]:
    return subprocess.run([sys.executable, "-m", "airdata", *args], capture_output=True,
                          text=True, timeout=600)


def _copy_port(tmp: Path) -> Path:
    dst = tmp / "port"
    shutil.copytree(SRC, dst)
    return dst


def test_bundled_sources_as_a_user_port_agree(tmp_path: Path) -> None:
    port = _copy_port(tmp_path)
    r = run("reduce", str(DEMO), "-o", str(tmp_path / "o.csv"), "--compare", "--json",
            "--source", *map(str, sorted(port.glob("*.c"))), "--include", str(port))
    assert r.returncode == 0, r.stderr
    cmp = json.loads(r.stdout)["compare"]
    assert cmp["samples"] == 4021 and cmp["disagreements"] == 0
    assert "altimetry.c" in cmp["port"]  # the report names the port that ran


def test_a_port_a_tenth_of_a_foot_off_is_caught_in_feet(tmp_path: Path) -> None:
    # A defect of known size: the copy's chain adds 0.03048 m (0.1 ft, exact definition
    # of the foot) to the pressure altitude.  Every row with a pressure altitude must
    # disagree there, by 0.1 ft, and nowhere else (the demo has no altimeter setting).
    port = _copy_port(tmp_path)
    chain = port / "chain.c"
    text = chain.read_text()
    line = "out->pressure_altitude = ad_i_altitude_of_pressure(ps);"
    assert text.count(line) == 1, "chain.c changed: update this test's defect"
    chain.write_text(text.replace(line, line[:-1] + " + (ad_real)0.03048;"))
    r = run("reduce", str(DEMO), "-o", str(tmp_path / "o.csv"), "--compare", "--json",
            "--source", *map(str, sorted(port.glob("*.c"))), "--include", str(port))
    assert r.returncode == 1, r.stderr  # disagreements make exit status 1
    doc = json.loads(r.stdout)
    cmp = doc["compare"]
    with_hp = doc["status_counts"]["OK"] + doc["status_counts"]["IMPACT_PRESSURE_ZEROED"]
    assert cmp["disagreeing_samples"] == cmp["disagreements"] == with_hp
    assert {d["output"] for d in cmp["first"]} == {"pressure_altitude"}
    largest = cmp["max_abs_difference"]["pressure_altitude"]
    assert largest["unit"] == "ft" and largest["value"] == pytest.approx(0.1, rel=1e-9)
    first = cmp["first"][0]
    assert first["difference_in_unit"] == pytest.approx(0.1, rel=1e-9)
    assert first["difference_unit"] == "ft"
    assert "port - reference 0.1 ft" in r.stderr
    # the other outputs differ from the reference (numpy) only by libm's last bits
    others = {k: v["value"] for k, v in cmp["max_abs_difference"].items()
              if k != "pressure_altitude"}
    assert others and all(abs(v) < 1e-9 for v in others.values()), others


def test_a_port_that_does_not_compile_is_refused_before_any_work(tmp_path: Path) -> None:
    bad = tmp_path / "bad.c"
    bad.write_text("#include \"airdata.h\"\nthis is not C;\n")
    out = tmp_path / "o.csv"
    r = run("reduce", str(DEMO), "-o", str(out), "--compare", "--source", str(bad))
    assert r.returncode == 1
    assert "failed to compile" in r.stderr and "bad.c" in r.stderr
    assert not out.exists()


def test_a_port_without_the_chain_is_refused_with_the_reason(tmp_path: Path) -> None:
    r = run("reduce", str(DEMO), "-o", str(tmp_path / "o.csv"), "--compare", "--precision",
            "single", "--source", str(ROOT / "examples" / "firmware_port" / "adc_port.c"))
    assert r.returncode == 1
    assert "ad_air_data" in r.stderr


def test_source_needs_compare_or_engine(tmp_path: Path) -> None:
    r = run("reduce", str(DEMO), "-o", str(tmp_path / "o.csv"), "--source",
            str(SRC / "chain.c"))
    assert r.returncode == 2
    assert "--source and --library name the port that --compare or --engine cport runs" \
        in r.stderr
