"""Case export and result import: export -> an implementation writes results ->
``airdata port verify`` judges them as ``port check`` does.  Every damaged results file
is reported with case id and line number and fails; the export is deterministic and has
the manifest's case count (vectors/manifest.json)."""

from __future__ import annotations

import importlib.util
import json
import os
import subprocess
import sys
from pathlib import Path
from types import ModuleType

import pytest

from airdata.portcheck import verdict
from airdata.portcheck.results import ResultsError, arrays, parse_results
from airdata.portcheck.suite import load_cases
from airdata.vectors.export import export_cases, format_number

ROOT = Path(__file__).resolve().parents[1]
VECTORS = ROOT / "vectors"


def _example() -> ModuleType:
    path = ROOT / "examples" / "exchange" / "cport_results.py"
    spec = importlib.util.spec_from_file_location("cport_results", path)
    assert spec is not None and spec.loader is not None
    mod = importlib.util.module_from_spec(spec)
    spec.loader.exec_module(mod)
    return mod


@pytest.fixture(scope="module")
def cases() -> tuple[str, int]:
    return export_cases(VECTORS, "double")


@pytest.fixture(scope="module")
def results(cases: tuple[str, int]) -> str:
    return str(_example().run(cases[0], {}))


@pytest.fixture(scope="module")
def suite():  # type: ignore[no-untyped-def]
    return load_cases(VECTORS)


def _verdict(text: str, suite) -> tuple[list[str], bool]:  # type: ignore[no-untyped-def]
    """What ``port verify`` judges: the file's problems, then verdict.judge of its arrays;
    each failing case with the results line it came from."""
    parsed = parse_results(text, suite)
    raw = {fc.name: arrays(fc, parsed)[:2] for fc in suite.functions.values()}
    report = verdict.judge(suite, raw, "double")
    msgs = [str(p) for p in parsed.problems]
    for r in report.functions:
        for f in r.failures:
            row = parsed.rows.get(f.case_id)
            where = "no good result line" if row is None else f"results line {row[0]}"
            msgs.append(f"{f.case_id}: {'; '.join(f.reasons)}; {where}")
    return msgs, (not parsed.problems) and report.ok


def test_export_is_deterministic_and_counts_the_manifest(cases: tuple[str, int]) -> None:
    manifest = json.loads((VECTORS / "manifest.json").read_text())
    total = sum(e["valid"] + e["invalid"] for e in manifest["functions"])
    text, n = cases
    assert n == total
    assert text == export_cases(VECTORS, "double")[0]  # byte-identical twice
    lines = text.splitlines()
    assert lines[0] == "airdata-cases 1"
    assert sum(1 for s in lines if s.startswith("case ")) == total
    assert lines[-1] == f"end {total}"
    csv_text, n_csv = export_cases(VECTORS, "single", fmt="csv")
    assert n_csv == total and len(csv_text.splitlines()) == total + 2


def test_export_numbers_read_back_exactly() -> None:
    # binary32 nearest of 0.1 is 0x1.99999ap-4 (IEEE 754-2019 round to nearest, from memory)
    assert format_number(0.1, "single") == "0x1.99999ap-4"
    assert float.fromhex(format_number(0.1, "double")) == 0.1
    assert float(format_number(0.1, "double", "decimal")) == 0.1
    assert format_number(float("nan"), "double") == "nan"
    assert format_number(1e39, "single") == "inf"  # above the binary32 range


def test_round_trip_passes(results: str, suite) -> None:  # type: ignore[no-untyped-def]
    msgs, ok = _verdict(results, suite)
    assert ok, msgs[:5]


def _line_of(text: str, cid: str) -> int:
    return next(n for n, s in enumerate(text.split("\n"), 1) if s.startswith(cid + " "))


@pytest.mark.parametrize("damage", ["corrupt", "delete", "duplicate", "status", "truncate"])
def test_damaged_results_are_reported_with_id_and_line(results: str, suite,  # type: ignore[no-untyped-def]
                                                       damage: str) -> None:
    lines = results.split("\n")
    cid = suite.functions["pressure_altitude"].ids[7]
    n = _line_of(results, cid)
    row = lines[n - 1].split()
    if damage == "corrupt":
        lines[n - 1] = f"{row[0]} {row[1]} 0x1.zzp+3"
    elif damage == "delete":
        del lines[n - 1]
    elif damage == "duplicate":
        lines.insert(n, lines[n - 1])
    elif damage == "status":
        lines[n - 1] = " ".join([row[0], "2", *row[2:]])
    else:
        lines = lines[: len(lines) // 2]
    msgs, ok = _verdict("\n".join(lines), suite)
    assert not ok
    text = "\n".join(msgs)
    if damage == "truncate":
        assert "truncated" in text
    elif damage == "delete":
        assert f"file case {cid}: no result line" in text
    elif damage == "duplicate":
        assert f"line {n + 1} case {cid}: duplicate result line (first on line {n})" in text
    elif damage == "status":
        assert f"{cid}: status OUT_OF_RANGE, expected OK; results line {n}" in text
    else:
        assert f"line {n} case {cid}: malformed line" in text


def test_unknown_id_and_bad_version_are_refused(results: str, suite) -> None:  # type: ignore[no-untyped-def]
    lines = results.split("\n")
    lines.insert(3, "ffffffffffff 0 0x1p+0")
    msgs, ok = _verdict("\n".join(lines), suite)
    assert not ok and any("line 4 case ffffffffffff: unknown case id" in m for m in msgs)
    with pytest.raises(ResultsError, match="version"):
        parse_results("airdata-results 9\nend 0\n", suite)


def test_a_port_wrong_in_one_constant_fails_verify(cases: tuple[str, int],
                                                   tmp_path: Path) -> None:
    # a relative error of 1e-6 in one function (a mistyped constant) is far beyond
    # k * eps * scale (k = 8, eps = 2^-52)
    bad = _example().run(cases[0], {"cas_from_mach": 1.000001})
    res = tmp_path / "results.txt"
    res.write_text(bad)
    r = subprocess.run([sys.executable, "-m", "airdata", "port", "verify", str(res),
                        "--suite", str(VECTORS), "--report", str(tmp_path / "r.json")],
                       capture_output=True, text=True, cwd=ROOT, timeout=300,
                       env={**os.environ, "PYTHONPATH": str(ROOT)})
    assert r.returncode == 1
    assert "cas_from_mach" in r.stdout and "FAIL" in r.stdout
    assert "FAIL: 1 function check(s) failed: cas_from_mach (binary64)" in r.stdout
    assert json.loads((tmp_path / "r.json").read_text())["passed"] is False
