"""The adapter example (examples/port_adapter): an invented team's differently named
binary64 routines behind airdata.h pass ``airdata port check``, and each deliberate
defect is caught in the function it touches and nowhere else."""

from __future__ import annotations

import subprocess
from pathlib import Path

import pytest
from toolchains import host_cc, host_compiler  # noqa: F401 - host_compiler: a fixture

from airdata.cli import main
from airdata.portcheck.build import BUNDLED_C, PortSpec, build_port
from airdata.portcheck.suite import LoadedSuite, load_cases
from airdata.portcheck.verdict import FunctionVerdict, judge

ROOT = Path(__file__).resolve().parents[1]
VECTORS = ROOT / "vectors"
EXAMPLE = ROOT / "examples" / "port_adapter"
SOURCES = [EXAMPLE / "adapter.c", EXAMPLE / "fti_airdata.c"]
pytestmark = pytest.mark.usefixtures("host_compiler")


@pytest.fixture(scope="module")
def suite() -> LoadedSuite:
    return load_cases(VECTORS)


def _run(suite: LoadedSuite, defines: tuple[tuple[str, str | None], ...],
         precision: str = "double", only: list[str] | None = None) -> list[FunctionVerdict]:
    """The implemented functions' verdicts (reference-equivalent level)."""
    spec = PortSpec("example", tuple(SOURCES), None, (BUNDLED_C / "src",), defines)
    fcs = [suite.functions[n] for n in (only or list(suite.functions))]
    port = build_port(spec, fcs, precision)
    try:
        raw = {fc.name: port.run(fc) for fc in fcs}
    finally:
        port.close()
    return [f for f in judge(suite, raw, precision).functions if f.implemented]


def test_example_compiles_cleanly_in_both_precisions() -> None:
    for flags in ([], ["-DAIRDATA_SINGLE"], ["-DDEFECT_GAS_CONSTANT", "-DDEFECT_SHORT_SOLVER"]):
        r = subprocess.run([host_cc(), "-std=c99", "-Wall", "-Wextra", "-Wpedantic", "-Wconversion",
                            "-Wdouble-promotion", "-Werror", "-fsyntax-only", *flags,
                            f"-I{BUNDLED_C / 'include'}", f"-I{BUNDLED_C / 'src'}",
                            *map(str, SOURCES)], capture_output=True, text=True, timeout=120)
        assert r.returncode == 0, r.stderr


def test_adapter_really_maps_other_names() -> None:
    # An honest adapter: airdata.h's functions are not defined by the team's code, and
    # the adapter reaches them only through the team's fti_* routines.
    team = (EXAMPLE / "fti_airdata.h").read_text()
    adapter = (EXAMPLE / "adapter.c").read_text()
    assert "ad_status" not in team and "ad_real" not in team
    assert adapter.count("fti_") > 40 and "fti_ref_" not in adapter


def test_example_passes_every_vector_in_binary64(suite: LoadedSuite) -> None:
    rows = _run(suite, ())
    assert len(rows) == 30
    bad = {r.function: [f.reasons for f in r.failures[:2]] for r in rows if not r.ok}
    assert not bad


@pytest.mark.parametrize(("defect", "functions"), [
    ("DEFECT_GAS_CONSTANT", {"tas_from_mach", "mach_from_tas"}),
    ("DEFECT_SHORT_SOLVER", {"mach_from_impact_pressure"}),
])
def test_each_defect_is_caught_in_its_function(suite: LoadedSuite, defect: str,
                                               functions: set[str]) -> None:
    rows = _run(suite, ((defect, None),))
    failing = {r.function for r in rows if not r.ok}
    assert failing == functions
    for r in rows:
        if r.function in functions:
            assert r.reference is not None
            assert r.reference.value_failures > 300 and r.reference.worst > 1e5


def test_command_exit_status_and_named_function(capsys: pytest.CaptureFixture[str]) -> None:
    base = ["port", "check", "--suite", str(VECTORS), "--precision", "double",
            "--source", *map(str, SOURCES), "--include", str(BUNDLED_C / "src"),
            "--only", "mach_from_impact_pressure", "tas_from_mach"]
    assert main(base) == 0
    assert "PASS: all 2 implemented function check(s) pass" in capsys.readouterr().out
    assert main([*base, "--define", "DEFECT_SHORT_SOLVER"]) == 1
    out = capsys.readouterr().out
    assert "FAIL: 1 function check(s) failed: mach_from_impact_pressure (binary64)" in out


def test_binary64_core_behind_a_float_interface_is_reported_at_range_ends(
        suite: LoadedSuite) -> None:
    # As examples/port_adapter/README.md says: ps = p_max rounds up in binary32, the
    # binary64 core refuses it, the vectors expect a binary32 port to accept it.
    (row,) = _run(suite, (), "single", ["pressure_altitude"])
    assert row.status_mismatches >= 1
    assert any("status OUT_OF_RANGE, expected OK" in f.reasons[0]
               and f.inputs["ps"] == 177687.04571454573 for f in row.failures)
