"""Case export and result import: export -> an implementation writes results ->
``airdata port verify`` judges them as ``port check`` does (verdict.judge).  Every
damaged results file (a malformed token, a changed digit, a deleted, duplicated or
unknown line, a changed status, a cut last line) and a port wrong in one constant fails
with exit status 1 and the case id; the line number is named by the file's problems, or
for a case judged wrong from a well-formed line by results.add_line_numbers.  The export
is deterministic and has the manifest's case count (vectors/manifest.json)."""

from __future__ import annotations

import contextlib
import importlib.util
import io
import json
import os
import subprocess
import sys
from pathlib import Path
from types import ModuleType

import pytest

from airdata.cli import main
from airdata.portcheck import verdict
from airdata.portcheck.results import ResultsError, add_line_numbers, arrays, parse_results
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
    """What ``port verify`` judges: the file's problems, then verdict.judge of its arrays,
    each failing case naming its results line (results.add_line_numbers)."""
    parsed = parse_results(text, suite)
    raw = {fc.name: arrays(fc, parsed)[:2] for fc in suite.functions.values()}
    report = verdict.judge(suite, raw, "double")
    add_line_numbers(report, parsed)
    msgs = [str(p) for p in parsed.problems]
    msgs += [f"{f.case_id}: {'; '.join(f.reasons)}" for r in report.functions
             for f in r.failures]
    return msgs, (not parsed.problems) and report.ok


def _cli(*argv: str) -> tuple[int, str]:
    """``airdata`` in this process: exit status and standard output."""
    out = io.StringIO()
    with contextlib.redirect_stdout(out):
        rc = main(list(argv))
    return rc, out.getvalue()


def test_export_is_deterministic_and_counts_the_manifest(cases: tuple[str, int],
                                                         tmp_path: Path) -> None:
    manifest = json.loads((VECTORS / "manifest.json").read_text())
    total = sum(e["valid"] + e["invalid"] for e in manifest["functions"])
    text, n = cases
    assert n == total
    lines = text.splitlines()
    assert lines[0] == "airdata-cases 1"
    assert sum(1 for s in lines if s.startswith("case ")) == total
    assert lines[-1] == f"end {total}"
    # the command, twice: byte-identical files, LF line ends, the text of export_cases
    a, b = tmp_path / "a.txt", tmp_path / "b.txt"
    for out in (a, b):
        rc, said = _cli("vectors", "export", "--suite", str(VECTORS), "-o", str(out))
        assert rc == 0 and f"exported {total} cases" in said
    assert a.read_bytes() == b.read_bytes() == text.encode("ascii")
    assert b"\r" not in a.read_bytes()
    csv_text, n_csv = export_cases(VECTORS, "single", fmt="csv")
    assert n_csv == total and len(csv_text.splitlines()) == total + 2
    assert csv_text == export_cases(VECTORS, "single", fmt="csv")[0]


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


#: Damage done to a good results file: a token no longer a number, one hex digit of an
#: output changed (a corrupted serial byte), a line deleted, a line sent twice, a status
#: changed, and the file cut in the middle of a line.
DAMAGES = ["corrupt", "digit", "delete", "duplicate", "status", "truncate"]


def _damage(results: str, suite, damage: str) -> tuple[str, str, int]:  # type: ignore[no-untyped-def]
    """The damaged text, the case id touched and the line number to be named."""
    lines = results.split("\n")
    cid = suite.functions["pressure_altitude"].ids[7]
    n = _line_of(results, cid)
    row = lines[n - 1].split()
    if damage == "corrupt":
        lines[n - 1] = f"{row[0]} {row[1]} 0x1.zzp+3"
    elif damage == "digit":
        mant = row[2]
        k = mant.index(".") + 1  # first hex digit of the mantissa: an error of ~1/16
        lines[n - 1] = " ".join([row[0], row[1], mant[:k] + ("1" if mant[k] != "1" else "2")
                                 + mant[k + 1:]])
    elif damage == "delete":
        del lines[n - 1]
        n -= 1  # named as the line after which the missing case belongs
    elif damage == "duplicate":
        lines.insert(n, lines[n - 1])
        n += 1  # the second copy is the one reported
    elif damage == "status":
        lines[n - 1] = " ".join([row[0], "2", *row[2:]])
    else:  # the last line cut in the middle: the run (or the capture) stopped early
        keep = lines[:n]
        keep[-1] = keep[-1][: len(keep[-1]) // 2]
        return "\n".join(keep), cid, n
    return "\n".join(lines), cid, n


@pytest.mark.parametrize("damage", DAMAGES)
def test_damaged_results_are_reported_with_id_and_line(results: str, suite,  # type: ignore[no-untyped-def]
                                                       damage: str) -> None:
    text_in, cid, n = _damage(results, suite, damage)
    msgs, ok = _verdict(text_in, suite)
    assert not ok
    text = "\n".join(msgs)
    if damage == "truncate":
        assert f"line {n} case {cid}: malformed line" in text
        assert f"line {n}: no 'end N' line: the file is truncated" in text
    elif damage == "delete":
        assert f"file case {cid}: no result line (pressure_altitude); its place is after " \
               f"line {n} (case " in text
        assert f"{cid}: status -1, expected OK; h: got nan" in text  # judged as failed
    elif damage == "duplicate":
        assert f"line {n} case {cid}: duplicate result line (first on line {n - 1})" in text
        assert f"results line {n - 1}: malformed or duplicated" in text
    elif damage == "status":
        assert f"{cid}: status OUT_OF_RANGE, expected OK; results line {n}" in text
    elif damage == "digit":
        assert f"{cid}: h: got " in text and f"of the bound); results line {n}" in text
    else:
        assert f"line {n} case {cid}: malformed line" in text


@pytest.fixture(scope="module")
def verify_runs(results: str, suite, cases: tuple[str, int],  # type: ignore[no-untyped-def]
                tmp_path_factory: pytest.TempPathFactory) -> dict[str, tuple[int, str, str, int]]:
    """``airdata port verify`` of each damaged file and of a port wrong in one constant:
    damage -> (exit status, standard output, case id, line number to be named)."""
    tmp = tmp_path_factory.mktemp("verify")
    out = {}
    for damage in DAMAGES:
        text, cid, n = _damage(results, suite, damage)
        path = tmp / f"{damage}.txt"
        path.write_text(text)
        rc, said = _cli("port", "verify", str(path), "--suite", str(VECTORS))
        out[damage] = (rc, said, cid, n)
    # a relative error of 1e-6 in one function (a mistyped constant) is far beyond
    # k * eps * scale (k = 8, eps = 2^-52); the first failing case is listed first
    bad = _example().run(cases[0], {"cas_from_mach": 1.000001})
    parsed = parse_results(bad, suite)
    raw = {fc.name: arrays(fc, parsed)[:2] for fc in suite.functions.values()}
    (fv,) = [f for f in verdict.judge(suite, raw, "double").functions if not f.ok]
    assert fv.function == "cas_from_mach"
    first = fv.failures[0].case_id
    path = tmp / "constant.txt"
    path.write_text(bad)
    rc, said = _cli("port", "verify", str(path), "--suite", str(VECTORS))
    out["constant"] = (rc, said, first, parsed.rows[first][0])
    return out


@pytest.mark.parametrize("damage", [*DAMAGES, "constant"])
def test_verify_command_fails_and_names_the_case(verify_runs: dict, damage: str) -> None:
    rc, said, cid, _ = verify_runs[damage]
    assert rc == 1
    assert cid in said and "FAIL" in said
    if damage == "constant":
        assert "FAIL: 1 function check(s) failed: cas_from_mach (binary64)" in said
        assert f"  case {cid}: cas: got " in said


@pytest.mark.parametrize("damage", [*DAMAGES, "constant"])
def test_verify_command_names_the_line(verify_runs: dict, damage: str) -> None:
    rc, said, cid, n = verify_runs[damage]
    if damage in ("digit", "status", "constant"):
        assert f"  case {cid}: " in said and f"results line {n}" in said
    elif damage == "delete":
        assert f"file case {cid}: no result line (pressure_altitude); its place is after " \
               f"line {n}" in said
    else:
        assert f"line {n} case {cid}: " in said


def test_a_line_cut_after_its_id_is_named(results: str, suite) -> None:  # type: ignore[no-untyped-def]
    lines = results.split("\n")
    cid = suite.functions["atmosphere"].ids[0]
    n = _line_of(results, cid)
    msgs, ok = _verdict("\n".join([*lines[: n - 1], cid]), suite)
    assert not ok
    assert f"line {n} case {cid}: malformed line: no status and no outputs (the line is " \
           "cut short)" in msgs
    assert f"line {n}: no 'end N' line: the file is truncated (or the run stopped early)" in msgs


def test_unknown_id_and_bad_version_are_refused(results: str, suite) -> None:  # type: ignore[no-untyped-def]
    lines = results.split("\n")
    lines.insert(3, "ffffffffffff 0 0x1p+0")
    msgs, ok = _verdict("\n".join(lines), suite)
    assert not ok and any("line 4 case ffffffffffff: unknown case id" in m for m in msgs)
    with pytest.raises(ResultsError, match="version"):
        parse_results("airdata-results 9\nend 0\n", suite)


def test_a_port_wrong_in_one_constant_fails_verify(cases: tuple[str, int],
                                                   tmp_path: Path) -> None:
    # the command as a separate process, with a JSON report
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


def test_round_trip_through_the_commands(tmp_path: Path) -> None:
    # export -> the bundled port (second path, examples/exchange) -> port verify: PASS
    cases_file, res = tmp_path / "cases.txt", tmp_path / "results.txt"
    assert _cli("vectors", "export", "--suite", str(VECTORS), "--precision", "single",
                "-o", str(cases_file))[0] == 0
    assert _example().main([str(cases_file), str(res)]) == 0
    rc, said = _cli("port", "verify", str(res), "--suite", str(VECTORS))
    assert rc == 0, said[-3000:]
    assert "[binary32]" in said  # the file's precision line decides
    assert "PASS: all 30 implemented function check(s) pass" in said
