"""Golden vectors: schema, determinism, staleness, verify, diff, and content checks.

The full suite is built once per session (``fresh`` fixture, a few seconds); tampering
and diff tests use a small suite of two functions built into a temporary directory.
"""

from __future__ import annotations

import copy
import hashlib
import json
import math
import re
import shutil
import subprocess
import sys
from pathlib import Path
from typing import Any

import jsonschema
import numpy as np
import pytest

import airdata
from airdata.vectors import build, history, jsonio, schema
from airdata.vectors.catalogue import CATALOGUE, get_spec
from airdata.vectors.diff import bump_between, diff_suites
from airdata.vectors.scale import binary32_check, binary32_skip_status
from airdata.vectors.verify import verify_suite

ROOT = Path(__file__).resolve().parents[1]
SUITE = ROOT / "vectors"
HEADER = ROOT / "bindings" / "c" / "include" / "airdata.h"


@pytest.fixture(scope="session")
def fresh() -> dict[str, bytes]:
    """A fresh in-memory build of the default suite."""
    return build.suite_files("icao")


def _mini(tmp: Path, names: tuple[str, ...] = ("pressure_altitude", "dynamic_pressure")
          ) -> Path:
    """Write a small suite of a few functions to ``tmp`` and return its directory."""
    specs = tuple(get_spec(n) for n in names)
    for rel, data in build.suite_files("icao", specs).items():
        p = tmp / rel
        p.parent.mkdir(parents=True, exist_ok=True)
        p.write_bytes(data)
    return tmp


def _reseal(root: Path) -> None:
    """Recompute the manifest's checksums after a deliberate edit."""
    m = json.loads((root / "manifest.json").read_text())
    for e in m["files"] + m["functions"]:
        data = (root / e["path"]).read_bytes()
        e["sha256"] = hashlib.sha256(data).hexdigest()
        e["bytes"] = len(data)
    (root / "manifest.json").write_text(json.dumps(m, indent=1))


def _edit_case(root: Path, name: str, index: int, fn: Any) -> str:
    """Apply ``fn`` to case ``index`` of a function file (one case per line); its id."""
    p = root / "functions" / f"{name}.json"
    doc = json.loads(p.read_text())
    fn(doc["cases"][index])
    p.write_text(build.render_function_file(doc))
    return str(doc["cases"][index]["id"])


def _cli(*args: str, cwd: Path = ROOT) -> subprocess.CompletedProcess[str]:
    return subprocess.run([sys.executable, "-m", "airdata", *args], cwd=cwd,
                          capture_output=True, text=True, timeout=300)


# ------------------------------------------------------------------------------------
# The checked-in suite
# ------------------------------------------------------------------------------------

def _suite_docs() -> list[tuple[Path, Any]]:
    out = [(SUITE / "manifest.json", json.loads((SUITE / "manifest.json").read_text()))]
    out += [(p, json.loads(p.read_text())) for p in sorted((SUITE / "functions").glob("*.json"))]
    return out


def test_checked_in_suite_is_valid_under_jsonschema_and_the_builtin_validator() -> None:
    docs = _suite_docs()
    assert len(docs) == len(CATALOGUE) + 1
    for path, doc in docs:
        sch = json.loads((SUITE / doc["schema"]).read_text())
        jsonschema.Draft202012Validator.check_schema(sch)
        errors = list(jsonschema.Draft202012Validator(sch).iter_errors(doc))
        assert not errors, f"{path}: {errors[0].message}"
        assert schema.validate(doc, sch) == [], path
        # The schemas are closed: every object schema says additionalProperties false.
        text = json.dumps(sch)
        assert text.count('"type": "object"') == text.count('"additionalProperties": false')


def _mutations(doc: dict[str, Any]) -> list[tuple[str, dict[str, Any]]]:
    """Crafted documents, most invalid, some valid edge cases."""
    out = []

    def mut(label: str, f: Any) -> None:
        d = copy.deepcopy(doc)
        f(d)
        out.append((label, d))

    c0 = "cases"
    mut("unchanged", lambda d: None)
    mut("extra top-level property", lambda d: d.update(extra=1))
    mut("missing required", lambda d: d.pop("tolerance"))
    mut("extra case property", lambda d: d[c0][0].update(note="x"))
    mut("extra input", lambda d: d[c0][0]["inputs"].update(h=["1.0", "0x1p+0"]))
    mut("missing output", lambda d: d[c0][0]["expected"].clear())
    mut("bad hex", lambda d: d[c0][0]["expected"].update(h=["1.0", "0x1.0p+0"]))
    mut("uppercase hex", lambda d: d[c0][0]["expected"].update(h=["1.0", "0X1P+0"]))
    mut("number not a pair", lambda d: d[c0][0]["expected"].update(h=["1.0"]))
    mut("number triple", lambda d: d[c0][0]["expected"].update(h=["1.0", "0x1p+0", "x"]))
    mut("number as JSON number", lambda d: d[c0][0]["expected"].update(h=1.0))
    mut("nan strings valid", lambda d: d[c0][0]["expected"].update(h=["nan", "nan"]))
    mut("status out of enum", lambda d: d[c0][0].update(status=7))
    mut("status as string", lambda d: d[c0][0].update(status="OK"))
    mut("status true", lambda d: d[c0][0].update(status=True))
    mut("status 1.0", lambda d: d[c0][0].update(status=1.0))
    mut("bad check level", lambda d: d[c0][0].update(binary32_check="some"))
    mut("bad id", lambda d: d[c0][0].update(id="XYZ"))
    mut("unknown tag", lambda d: d[c0][0].update(tags=["shiny"]))
    mut("repeated tag", lambda d: d[c0][0].update(tags=["sweep", "sweep"]))
    mut("no cases", lambda d: d.update(cases=[]))
    mut("wrong function", lambda d: d.update(function="other"))
    mut("negative count", lambda d: d["counts"].update(valid=-1))
    mut("bad equation id", lambda d: d.update(equations=["alt1"]))
    mut("bad k", lambda d: d["tolerance"].update(k=0))
    mut("statuses renumbered", lambda d: d["statuses"].update(OK=5))
    mut("inputs not array", lambda d: d.update(inputs={}))
    return out


def test_builtin_validator_agrees_with_jsonschema_on_crafted_documents() -> None:
    doc = json.loads((SUITE / "functions" / "pressure_altitude.json").read_text())
    doc["cases"] = doc["cases"][:3]
    sch = json.loads((SUITE / doc["schema"]).read_text())
    ref = jsonschema.Draft202012Validator(sch)
    invalid = 0
    for label, d in _mutations(doc):
        theirs = ref.is_valid(d)
        ours = schema.validate(d, sch) == []
        assert ours == theirs, label
        invalid += not theirs
    assert invalid >= 20
    # Manifest too.
    m = json.loads((SUITE / "manifest.json").read_text())
    msch = json.loads((SUITE / m["schema"]).read_text())
    for label, f in [("ok", lambda d: None), ("extra", lambda d: d.update(x=1)),
                     ("bad sha", lambda d: d["functions"][0].update(sha256="00")),
                     ("schema version", lambda d: d.update(schema_version=2)),
                     ("profile extra", lambda d: d["profile"].update(x=1)),
                     ("semver", lambda d: d.update(suite_version="1.0")),
                     ("escape", lambda d: d["files"][0].update(path="../../etc/passwd")),
                     ("absolute", lambda d: d["files"][0].update(path="/etc/passwd"))]:
        d = copy.deepcopy(m)
        f(d)
        theirs = jsonschema.Draft202012Validator(msch).is_valid(d)
        assert (schema.validate(d, msch) == []) == theirs, label
        assert theirs == (label == "ok"), label


def test_validator_refuses_unknown_keywords() -> None:
    with pytest.raises(schema.SchemaError):
        schema.validate({}, {"type": "object", "oneOf": []})


def test_suite_is_fresh_against_the_reference(fresh: dict[str, bytes]) -> None:
    """Staleness: the checked-in suite is byte for byte what the reference builds."""
    stale = [rel for rel, data in fresh.items()
             if not (SUITE / rel).is_file() or (SUITE / rel).read_bytes() != data]
    on_disk = {str(p.relative_to(SUITE)) for p in SUITE.rglob("*") if p.is_file()}
    extra = on_disk - set(fresh)
    assert not stale and not extra, (
        f"vectors/ is stale (run `airdata vectors build`): changed {stale[:5]}, "
        f"extra {sorted(extra)[:5]}")


def test_build_is_deterministic_through_the_cli(fresh: dict[str, bytes], tmp_path: Path
                                                ) -> None:
    r = _cli("vectors", "build", "--out", str(tmp_path / "s"))
    assert r.returncode == 0, r.stderr
    assert "30 functions" in r.stdout
    for rel, data in fresh.items():
        assert (tmp_path / "s" / rel).read_bytes() == data, rel


def test_suite_size_and_counts(fresh: dict[str, bytes]) -> None:
    total = sum(len(b) for b in fresh.values())
    assert total < 20e6
    m = json.loads(fresh["manifest.json"])
    assert m["suite_version"] == build.SUITE_VERSION
    assert m["generator"] == {"package": "airdata", "version": airdata.__version__}
    assert m["profile"]["R"] == 287.05287  # ICAO Doc 7488 (from memory)
    for e in m["functions"]:
        n = e["valid"] + e["invalid"]
        assert 500 <= n <= 2000, e["function"]
        assert e["invalid"] >= 10, e["function"]


def test_us1976_suite_is_fresh_and_verifies() -> None:
    """Staleness of the second checked-in suite (vectors-us1976/): byte for byte what the
    reference builds with the U.S. Standard Atmosphere 1976 constants."""
    suite = ROOT / "vectors-us1976"
    fresh_us = build.suite_files("us1976")
    stale = [rel for rel, data in fresh_us.items()
             if not (suite / rel).is_file() or (suite / rel).read_bytes() != data]
    on_disk = {str(p.relative_to(suite)) for p in suite.rglob("*") if p.is_file()}
    extra = on_disk - set(fresh_us)
    assert not stale and not extra, (
        f"vectors-us1976/ is stale (run `airdata vectors build --profile us1976`): changed "
        f"{stale[:5]}, extra {sorted(extra)[:5]}")
    m = json.loads(fresh_us["manifest.json"])
    assert m["profile"]["name"] == "us1976"
    # U.S. Standard Atmosphere 1976, R* = 8.31432 J/(mol K), M0 = 28.9644 g/mol (from memory)
    assert math.isclose(m["profile"]["R"], 8314.32 / 28.9644, rel_tol=1e-12)


def test_us1976_profile_builds_different_values() -> None:
    spec = get_spec("pressure_at_altitude")
    a = build.build_function(spec, airdata.ICAO)
    b = build.build_function(spec, airdata.US1976)
    assert b["profile"] == "us1976"
    differ = sum(x["expected"] != y["expected"] for x, y in zip(a["cases"], b["cases"],
                                                               strict=False))
    assert differ > 100


# ------------------------------------------------------------------------------------
# Catalogue against the package and the C header
# ------------------------------------------------------------------------------------

def test_catalogue_covers_every_public_function() -> None:
    public = {n for n in airdata.__all__ if n[0].islower() and callable(getattr(airdata, n))}
    public -= {"get_profile"}
    assert public == {s.name for s in CATALOGUE}


def test_argument_order_matches_the_c_header() -> None:
    text = HEADER.read_text()
    for spec in CATALOGUE:
        m = re.search(rf"ad_status {spec.c_name}\(([^)]*)\)", text)
        assert m, spec.c_name
        params = [p.split()[-1].lstrip("*") for p in m.group(1).replace("\n", " ").split(",")]
        assert params[:len(spec.args)] == [a.name for a in spec.args], spec.name


# ------------------------------------------------------------------------------------
# Content: published values, the condition scale, statuses
# ------------------------------------------------------------------------------------

def _cases(name: str) -> list[dict[str, Any]]:
    return json.loads((SUITE / "functions" / f"{name}.json").read_text())["cases"]


def _val(pair: list[str]) -> float:
    return jsonio.decode_number(pair, "test")


def _find(name: str, **inputs: float) -> dict[str, Any]:
    for c in _cases(name):
        if all(c["inputs"][k] == jsonio.encode_number(v) for k, v in inputs.items()):
            return c
    raise AssertionError(f"no {name} case with {inputs}")


def test_published_values_in_the_suite() -> None:
    # ICAO Doc 7488 standard atmosphere (from memory): 216.65 K and 22632.06 Pa at 11 km.
    c = _find("atmosphere", h=11000.0, dT=0.0)
    assert _val(c["expected"]["temperature"]) == pytest.approx(216.65, abs=1e-9)
    assert _val(c["expected"]["pressure"]) == pytest.approx(22632.06, rel=1e-6)
    # Sea level: pressure altitude 0 at 101325 Pa (common practice, no source).
    assert _val(_find("pressure_altitude", ps=101325.0)["expected"]["h"]) == 0.0
    # NACA Report 1135 eq. 44 at M = 1: qc/ps = 1.2**3.5 - 1.
    c = _find("impact_pressure_from_mach", mach=1.0, ps=101325.0)
    assert _val(c["expected"]["qc"]) == pytest.approx(101325.0 * (1.2 ** 3.5 - 1), rel=1e-14)


def test_scale_matches_closed_form_derivatives() -> None:
    # q = 0.7 ps M^2: |q| + |dq/dM M| + |dq/dps ps| = q + 2q + q = 4q.
    checked = 0
    for c in _cases("dynamic_pressure"):
        if c["status"] == 0 and _val(c["expected"]["q"]) > 0:
            assert _val(c["scale"]["q"]) == pytest.approx(4 * _val(c["expected"]["q"]), rel=6e-3)
            checked += 1
    assert checked > 900
    # z = r0 h / (r0 - h): |z| + |dz/dh h| = |z| (1 + r0/(r0 - h)).
    r0 = airdata.ICAO.r0
    for c in _cases("geometric_altitude")[::7]:
        if c["status"] == 0:
            h, z = _val(c["inputs"]["h"]), _val(c["expected"]["z"])
            assert _val(c["scale"]["z"]) == pytest.approx(abs(z) * (1 + r0 / (r0 - h)),
                                                          rel=6e-3, abs=1e-300)


def test_required_edge_cases_are_present() -> None:
    p = airdata.ICAO
    pa = {c["inputs"]["ps"][1] for c in _cases("pressure_altitude")}
    for pb in p.base_pressure:
        for n in (-4, -1, 0, 1, 4):
            v = pb
            for _ in range(abs(n)):
                v = math.nextafter(v, math.inf if n > 0 else -math.inf)
            assert jsonio.hex_literal(v) in pa, (pb, n)
    mach = {c["inputs"]["mach"][0] for c in _cases("impact_pressure_from_mach")}
    assert {"1.0", "1.0000000000000002", "0.9999999999999999", "1e-08"} <= mach
    tags = set()
    for c in _cases("air_data"):
        tags.update(c["tags"])
    assert {"with-setting", "no-setting", "zeroed", "sonic", "layer-base", "supersonic",
            "invalid", "argument-order", "derived-limit"} <= tags
    statuses = {c["status"] for c in _cases("air_data")}
    assert {0, 1, 2, 4} <= statuses


def test_argument_order_decides_the_status() -> None:
    # airdata.h: the first failing argument decides.  ps out of range, then qc NaN.
    hi = airdata._domains.pressure(airdata.ICAO).hi * 2
    c = _find("mach_from_impact_pressure", qc=math.nan, ps=hi)
    assert c["status"] == airdata.Status.INVALID_INPUT
    c = _find("impact_pressure_from_mach", mach=20.0, ps=math.nan)
    assert c["status"] == airdata.Status.OUT_OF_RANGE
    assert all(_val(v) != _val(v) for v in c["expected"].values())  # NaN outputs


def test_binary32_check_levels() -> None:
    spec = get_spec("tat_from_sat")
    x = {"sat": np.array([288.15, 288.15, 288.15, 5000.0, 1e-40 + 50.0]),
         "mach": np.array([0.5, 5e-324, 0.5, 0.5, 0.5]),
         "recovery": np.array([1.0, 1.0, math.nextafter(1.0, 2.0), 1.0, 1.0])}
    from airdata.vectors.catalogue import evaluate
    y, st = evaluate(spec, x, airdata.ICAO)
    levels = binary32_check(spec, x, y, st, airdata.ICAO)
    # Range end exactly representable in binary32: full; subnormal input: skip; one ulp
    # above recovery = 1 rounds to 1.0f (valid in binary32, out of range in binary64).
    assert levels == ["full", "skip", "lenient", "full", "full"]
    assert list(binary32_skip_status(spec, x, st, airdata.ICAO)) == [False, True, True, False,
                                                                      False]


def test_case_ids_are_content_derived_and_unique() -> None:
    for spec in CATALOGUE[:4]:
        cases = _cases(spec.name)
        ids = [c["id"] for c in cases]
        assert len(set(ids)) == len(ids)
        c = cases[len(cases) // 2]
        x = {a.name: (c["inputs"][a.name] if a.kind == "flag" else _val(c["inputs"][a.name]))
             for a in spec.args}
        assert build.case_id(spec, x) == c["id"]


# ------------------------------------------------------------------------------------
# Numbers and loading
# ------------------------------------------------------------------------------------

@pytest.mark.parametrize("x", [0.0, -0.0, 1.0, 101325.0, 5e-324, 1e-8, -2.5, 1.7976931348623157e308,
                               math.inf, -math.inf, math.nan])
def test_number_round_trip(x: float) -> None:
    pair = jsonio.encode_number(x)
    back = jsonio.decode_number(pair, "t")
    assert (math.isnan(x) and math.isnan(back)) or (back == x and
                                                    math.copysign(1, back) == math.copysign(1, x))
    if math.isfinite(x):
        assert float.fromhex(pair[1]) == x


def test_number_forms_must_agree() -> None:
    with pytest.raises(ValueError, match="different values"):
        jsonio.decode_number(["1.0", "0x1.8p+0"], "here")
    with pytest.raises(ValueError, match="shortest"):
        jsonio.decode_number(["1.00", "0x1p+0"], "here")


@pytest.mark.parametrize("content,problem", [
    (b'{"a": 1,}', "malformed JSON at line 1"),
    (b'{"a": NaN}', "non-standard JSON literal NaN"),
    (b'{"a": 1, "a": 2}', "duplicate key"),
    (b"\xff\xfe", "not UTF-8"),
])
def test_loader_refuses_malformed(tmp_path: Path, content: bytes, problem: str) -> None:
    p = tmp_path / "f.json"
    p.write_bytes(content)
    with pytest.raises(jsonio.VectorFileError, match=re.escape(problem)) as e:
        jsonio.load_json(p)
    assert str(p) in str(e.value)


def test_loader_refuses_oversize(tmp_path: Path) -> None:
    p = tmp_path / "big.json"
    p.write_bytes(b"[" + b"0," * 600 + b"0]")
    with pytest.raises(jsonio.VectorFileError, match="more than the limit of 1000"):
        jsonio.load_json(p, max_bytes=1000)


# ------------------------------------------------------------------------------------
# verify
# ------------------------------------------------------------------------------------

def test_verify_checked_in_suite_through_the_cli() -> None:
    r = _cli("vectors", "verify")
    assert r.returncode == 0, r.stderr[-2000:]
    assert f"OK - suite {history.CURRENT}" in r.stdout and "30 functions" in r.stdout


def test_verify_mini_suite_ok(tmp_path: Path) -> None:
    rep = verify_suite(_mini(tmp_path))
    assert rep.ok, [str(p) for p in rep.problems]
    assert rep.functions == 2 and rep.rechecked


def test_verify_reports_changed_value_with_file_and_case(tmp_path: Path) -> None:
    root = _mini(tmp_path)

    def bump(c: dict[str, Any]) -> None:
        c["expected"]["h"] = jsonio.encode_number(_val(c["expected"]["h"]) + 1.0)
    cid = _edit_case(root, "pressure_altitude", 5, bump)
    _reseal(root)
    probs = verify_suite(root).problems
    assert any(p.file == "functions/pressure_altitude.json" and p.case == cid
               and "expected h" in p.message and "beyond tolerance" in p.message
               for p in probs), [str(p) for p in probs]
    # The C header no longer matches the JSON it was generated from.
    assert any(p.file == "c/ad_vec_pressure_altitude.h" for p in probs)


def test_verify_accepts_last_bit_drift_unless_exact(tmp_path: Path) -> None:
    """One ulp off (as another numpy/libm build may give): accepted and counted by default,
    refused with ``exact`` (the staleness check of this repository)."""
    from airdata.vectors.cheader import render_function_header

    root = _mini(tmp_path)

    def nudge(c: dict[str, Any]) -> None:
        c["expected"]["h"] = jsonio.encode_number(math.nextafter(_val(c["expected"]["h"]),
                                                                 math.inf))
    cid = _edit_case(root, "pressure_altitude", 5, nudge)
    doc = json.loads((root / "functions" / "pressure_altitude.json").read_text())
    (root / "c" / "ad_vec_pressure_altitude.h").write_text(render_function_header(doc))
    _reseal(root)
    tolerant = verify_suite(root, exact=False)
    assert tolerant.ok and tolerant.drift == 1, [str(p) for p in tolerant.problems]
    assert "1 value(s) differ in the last bits" in tolerant.summary()
    probs = verify_suite(root).problems
    assert [p.case for p in probs] == [cid] and "within tolerance" in probs[0].message
    assert _cli("vectors", "verify", str(root)).returncode == 0
    r = _cli("vectors", "verify", "--exact", str(root))
    assert r.returncode == 1 and cid in r.stderr


def test_verify_reports_checksum_mismatch(tmp_path: Path) -> None:
    root = _mini(tmp_path)
    cid = _edit_case(root, "dynamic_pressure", 3, lambda c: c.update(status=2))
    probs = verify_suite(root).problems
    assert any(p.file == "functions/dynamic_pressure.json" and "checksum mismatch" in p.message
               for p in probs)
    assert any(p.case == cid and "status OUT_OF_RANGE" in p.message for p in probs)


def test_verify_reports_schema_violation_with_case_id(tmp_path: Path) -> None:
    root = _mini(tmp_path)
    cid = _edit_case(root, "dynamic_pressure", 7, lambda c: c.update(comment="x"))
    _reseal(root)
    probs = verify_suite(root).problems
    assert any(p.case == cid and "unexpected property 'comment'" in p.message for p in probs)


def test_verify_reports_malformed_and_oversize_files(tmp_path: Path) -> None:
    root = _mini(tmp_path)
    p = root / "functions" / "dynamic_pressure.json"
    p.write_bytes(p.read_bytes()[:-200])
    _reseal(root)
    probs = verify_suite(root).problems
    assert any(q.file == "functions/dynamic_pressure.json" and "malformed JSON" in q.message
               for q in probs)
    probs = verify_suite(root, max_bytes=10_000).problems
    assert any("more than the limit of 10000" in q.message for q in probs)


def test_verify_reports_a_broken_manifest(tmp_path: Path) -> None:
    root = _mini(tmp_path)
    m = json.loads((root / "manifest.json").read_text())
    del m["profile"]
    (root / "manifest.json").write_text(json.dumps(m))
    probs = [str(p) for p in verify_suite(root).problems]
    assert probs == ["manifest.json: schema violation: /: missing required property 'profile'"]
    (root / "manifest.json").write_text("{")
    probs = [str(p) for p in verify_suite(root).problems]
    assert len(probs) == 1 and "manifest.json: malformed JSON at line 1" in probs[0]


def test_verify_reports_stray_and_missing_files(tmp_path: Path) -> None:
    root = _mini(tmp_path)
    (root / "functions" / "extra.json").write_text("{}")
    (root / "c" / "ad_vec_dynamic_pressure.h").unlink()
    probs = [str(p) for p in verify_suite(root).problems]
    assert any("functions/extra.json: file not listed" in p for p in probs)
    assert any("c/ad_vec_dynamic_pressure.h: listed in the manifest but missing" in p
               for p in probs)


def test_verify_cli_fails_with_message(tmp_path: Path) -> None:
    root = _mini(tmp_path)
    cid = _edit_case(root, "pressure_altitude", 2, lambda c: c.update(status=1))
    _reseal(root)
    r = _cli("vectors", "verify", str(root))
    assert r.returncode == 1
    assert f"functions/pressure_altitude.json: case {cid}: status INVALID_INPUT" in r.stderr
    r = _cli("vectors", "verify", str(tmp_path / "nowhere"))
    assert r.returncode == 1 and "no such directory" in r.stderr


# ------------------------------------------------------------------------------------
# diff
# ------------------------------------------------------------------------------------

def _set_version(root: Path, version: str) -> None:
    m = json.loads((root / "manifest.json").read_text())
    m["suite_version"] = version
    (root / "manifest.json").write_text(json.dumps(m, indent=1))


def test_diff_identical_suites(tmp_path: Path) -> None:
    a = _mini(tmp_path / "a")
    d = diff_suites(a, a)
    assert d.required == "none" and d.sufficient


def test_diff_value_moved_beyond_tolerance_needs_major(tmp_path: Path) -> None:
    a = _mini(tmp_path / "a")
    b = _mini(tmp_path / "b")

    def bump(c: dict[str, Any]) -> None:
        c["expected"]["q"] = jsonio.encode_number(_val(c["expected"]["q"]) * (1 + 1e-12))
    cid = _edit_case(b, "dynamic_pressure", 100, bump)
    _reseal(b)
    d = diff_suites(a, b)
    f = {x.function: x for x in d.functions}["dynamic_pressure"]
    assert [c for c, _ in f.beyond] == [cid]
    assert d.required == "major" and not d.sufficient
    r = _cli("vectors", "diff", str(a), str(b))
    assert r.returncode == 1 and "required bump: major" in r.stdout and "NOT sufficient" in r.stdout
    _set_version(b, f"{int(history.CURRENT.split('.')[0]) + 1}.0.0")
    r = _cli("vectors", "diff", str(a), str(b))
    assert r.returncode == 0, r.stdout + r.stderr
    assert f"changed beyond tolerance: case {cid}" in r.stdout


def test_diff_within_tolerance_is_patch_and_added_is_minor(tmp_path: Path) -> None:
    a = _mini(tmp_path / "a")
    b = _mini(tmp_path / "b")

    def nudge(c: dict[str, Any]) -> None:
        c["expected"]["q"] = jsonio.encode_number(math.nextafter(_val(c["expected"]["q"]), 0))
    _edit_case(b, "dynamic_pressure", 100, nudge)
    _reseal(b)
    d = diff_suites(a, b)
    assert d.required == "patch" and not d.sufficient
    major, minor, patch = history.CURRENT.split(".")
    _set_version(b, f"{major}.{minor}.{int(patch) + 1}")
    assert diff_suites(a, b).sufficient
    # A suite with one more function: minor.
    c = _mini(tmp_path / "c", ("pressure_altitude", "dynamic_pressure", "geometric_altitude"))
    d = diff_suites(a, c)
    assert d.required == "minor"
    assert {f.function: f.note for f in d.functions}["geometric_altitude"] == "added"
    # Removing a case: major.
    p = b / "functions" / "pressure_altitude.json"
    doc = json.loads(p.read_text())
    removed = doc["cases"].pop(0)["id"]
    p.write_text(build.render_function_file(doc))
    _reseal(b)
    d = diff_suites(a, b)
    assert d.required == "major"
    assert removed in {x.function: x for x in d.functions}["pressure_altitude"].removed


def test_bump_between() -> None:
    assert bump_between("1.0.0", "2.0.0") == "major"
    assert bump_between("1.0.0", "1.1.0") == "minor"
    assert bump_between("1.0.0", "1.0.1") == "patch"
    assert bump_between("1.2.0", "1.2.0") == "none"
    assert bump_between("1.2.0", "1.1.9") == "downgrade"


def test_changelog_states_the_policy() -> None:
    text = (SUITE / "CHANGELOG.md").read_text()
    assert "**Major**" in text and "**Minor**" in text and "**Patch**" in text
    assert f"## {build.SUITE_VERSION}" in text


def test_build_removes_stale_files(tmp_path: Path) -> None:
    root = _mini(tmp_path)
    (root / "functions" / "old_function.json").write_text("{}")
    build.build_suite(root, "icao", (get_spec("pressure_altitude"),))
    assert not (root / "functions" / "dynamic_pressure.json").exists()
    assert (root / "functions" / "pressure_altitude.json").exists()
    assert not (root / "functions" / "old_function.json").exists()
    shutil.rmtree(root)


def test_equation_ids_exist_in_the_equations_document() -> None:
    doc = ROOT / "docs" / "equations.md"
    assert doc.is_file(), "docs/equations.md, the equation ids' document, is missing"
    ids = set(re.findall(r"\b[A-Z]{3}-[0-9]+\b", doc.read_text()))
    for spec in CATALOGUE:
        assert set(spec.equations) <= ids, spec.name


def test_tags_agree_with_statuses() -> None:
    for spec in CATALOGUE:
        for c in _cases(spec.name):
            bad = c["status"] not in (0, 4)
            assert ("invalid" in c["tags"]) == bad, (spec.name, c["id"])
            assert ("zeroed" in c["tags"]) == (c["status"] == 4), (spec.name, c["id"])
            assert ("out-of-range" in c["tags"]) == (c["status"] == 2), (spec.name, c["id"])
            nan_out = [_val(v) != _val(v) for v in c["expected"].values()]
            if bad:
                assert all(nan_out) and all(_val(v) != _val(v) for v in c["scale"].values())
            elif spec.name != "air_data":
                assert not any(nan_out)


def _oracle() -> Any:
    try:
        from . import oracle  # type: ignore[attr-defined]
    except ImportError:
        import oracle  # type: ignore[no-redef]
    return oracle


#: Cases whose stored scale lacks a derivative term: mach_from_impact_pressure at Mach 10
#: and ps = p_max, the corner of two limits, where every step of ps is refused on both
#: sides (above p_max the pressure range, below it qc/ps beyond Mach 10), so its term is
#: taken as 0 (scale 15 against the oracle's 19.96: the bound is 25 % tighter than the
#: principled one, never looser).  To be fixed with the next major suite version.
SCALE_CORNER_CASES = frozenset({"c5e837950944", "3b2b12074c34", "ff23fafd9de1"})


@pytest.mark.parametrize("name", [s.name for s in CATALOGUE])
def test_expected_and_scale_agree_with_the_mpmath_oracle(name: str) -> None:
    """The stored scale against |y*| + sum |dy*/dx x| from the 50-digit mpmath oracle
    (tests/oracle.py, written from the published equations), on spread valid cases and
    seam cases; and the expected values against y* of the same oracle."""
    orc = _oracle()
    spec = get_spec(name)
    fn = getattr(orc, name)
    cases = [c for c in _cases(name) if c["status"] == 0]
    if name == "air_data":
        # Not at qc = 0, where dM/dqc is infinite and any finite-difference scale is an
        # artefact of its step.
        cases = [c for c in cases if c["inputs"]["use_setting"] == 1
                 and c["inputs"]["pt"] != c["inputs"]["ps"]]
    picks = cases[:: max(1, len(cases) // 25)]
    seams = {"layer-base", "sonic", "crossover"}
    picks += [c for c in cases if seams & set(c["tags"])][::3]
    assert len(picks) >= 20
    out = spec.outputs[0][0]

    def f(*v: Any) -> Any:
        r = fn(*v)
        return r if isinstance(r, dict) else {out: r}

    reals = [a.name for a in spec.args if a.kind == "real" and a.name != "noise_band"]
    for c in picks:
        args = [_val(c["inputs"][k]) for k in reals]
        ystar, scale = orc.reference_and_scale(f, args)
        for o, _u in spec.outputs:
            if o not in scale:
                continue
            # The expected value itself is within half the acceptance bound of the
            # 50-digit value, so a port that is exact still passes with room to spare.
            cse = orc.condition_scaled_error(_val(c["expected"][o]), ystar[o], scale[o])
            assert cse <= 4.0, (name, c["id"], o, cse)
            want = float(scale[o])
            got = _val(c["scale"][o])
            if c["id"] in SCALE_CORNER_CASES:
                # Known defect (strict): the scale lacks a term, so the bound is tighter
                # than the principled one; fails here once the corner is fixed.
                assert got < 0.99 * want, (name, c["id"], o, "corner fixed: update the set")
                continue
            if seams & set(c["tags"]):
                # Within the step of a seam both sides' slopes count: never smaller.
                assert 0.99 * want - 1e-300 <= got <= 3 * want + 1e-300, (name, c["id"], o)
            else:
                assert got == pytest.approx(want, rel=1e-2, abs=1e-300), (name, c["id"], o)


def _subnormal_case(c: dict[str, Any]) -> bool:
    """A nonzero real input or expected output below the smallest normal binary64 number
    (sys.float_info.min = 2**-1022, IEEE 754-2019 section 3.4: below it a number is
    subnormal)."""
    vals = [_val(v) for n, v in c["inputs"].items() if n != "use_setting"]
    vals += [_val(v) for v in c["expected"].values()]
    return any(0.0 < abs(v) < sys.float_info.min for v in vals)


def test_subnormal_tag_marks_exactly_the_subnormal_cases() -> None:
    """Tag ``subnormal`` on a case iff an input or expected output is subnormal, and the
    suite has such cases in the functions whose tiny branches reach them."""
    tagged: dict[str, int] = {}
    for spec in CATALOGUE:
        doc = json.loads((SUITE / "functions" / f"{spec.name}.json").read_text())
        for c in doc["cases"]:
            assert ("subnormal" in c["tags"]) == _subnormal_case(c), (spec.name, c["id"])
        tagged[spec.name] = sum("subnormal" in c["tags"] for c in doc["cases"])
    for name in ("cas_from_impact_pressure", "mach_from_impact_pressure", "cas_from_mach",
                 "crossover_altitude", "max_operating_cas"):
        assert tagged[name] > 0, name


def test_port_check_skip_subnormal_leaves_out_the_tagged_cases() -> None:
    """``port check --skip-subnormal`` judges every case but the tagged ones and prints
    their count (read from the suite file, not typed)."""
    name = "cas_from_impact_pressure"
    doc = json.loads((SUITE / "functions" / f"{name}.json").read_text())
    n_sub = sum("subnormal" in c["tags"] for c in doc["cases"])
    n = len(doc["cases"])
    assert n_sub > 0
    r = _cli("port", "check", "--suite", str(SUITE), "--only", name, "--precision", "double",
             "--skip-subnormal")
    assert r.returncode == 0, r.stdout[-2000:] + r.stderr[-2000:]
    assert f"0 of {n - n_sub} failed" in r.stdout, r.stdout
    assert f"--skip-subnormal: {n_sub} cases tagged 'subnormal'" in r.stdout, r.stdout
    r = _cli("port", "check", "--suite", str(SUITE), "--only", name, "--precision", "double")
    assert r.returncode == 0 and f"0 of {n} failed" in r.stdout, r.stdout[-2000:]
    assert "--skip-subnormal" not in r.stdout


def test_port_verify_skip_subnormal_ignores_their_lines(tmp_path: Path) -> None:
    """``port verify --skip-subnormal``: a results file without the subnormal cases
    passes, one with them passes too (their lines are ignored); without the option the
    missing lines are problems."""
    name = "cas_from_impact_pressure"
    doc = json.loads((SUITE / "functions" / f"{name}.json").read_text())
    rows = []
    for c in doc["cases"]:
        y = airdata.cas_from_impact_pressure(_val(c["inputs"]["qc"]), strict=False)
        rows.append((c, f"{c['id']} {c['status']} {float(y).hex()}"))
    full = [line for _, line in rows]
    kept = [line for c, line in rows if "subnormal" not in c["tags"]]
    assert len(kept) < len(full)
    files = {}
    for key, lines in (("full", full), ("kept", kept)):
        p = tmp_path / f"{key}.txt"
        p.write_text("airdata-results 1 precision binary64\n" + "\n".join(lines)
                     + f"\nend {len(lines)}\n")
        files[key] = str(p)
    base = ("port", "verify", "--suite", str(SUITE), "--only", name)
    for key in ("full", "kept"):
        r = _cli(*base[:2], files[key], *base[2:], "--skip-subnormal")
        assert r.returncode == 0, (key, r.stdout[-2000:] + r.stderr[-2000:])
        assert f"0 of {len(kept)} failed" in r.stdout, r.stdout
    r = _cli(*base[:2], files["kept"], *base[2:])
    assert r.returncode == 1, r.stdout[-2000:]
    assert f"{len(full) - len(kept)} problem(s) in the results file" in r.stdout, r.stdout


@pytest.mark.parametrize("spec", [s for s in CATALOGUE if s.status_of is None],
                         ids=lambda s: s.name)
def test_batch_statuses_equal_one_strict_call_per_case(spec: Any) -> None:
    # The builder reads every case's status from one non-strict batch call
    # (catalogue.evaluate); a strict call on each bad case alone, which raises the first
    # failing check, must give the same status for every case of the suite, in both
    # profiles (and on the binary32-rounded inputs that binary32_check evaluates).
    from airdata.profiles import get_profile
    from airdata.vectors import catalogue

    for name in ("icao", "us1976"):
        prof = get_profile(name)
        _, seeds = build._dedupe(spec, build.generate_seeds(spec, prof))
        x = {a.name: np.array([s.inputs[a.name] for s in seeds]) for a in spec.args}
        with np.errstate(over="ignore"):
            x32 = {k: v.astype(np.float32).astype(np.float64) for k, v in x.items()}
        for inputs in (x, x32):
            outs, status = catalogue.evaluate(spec, inputs, prof)
            bad = np.zeros(status.shape, dtype=bool)
            for v in outs.values():
                bad |= np.isnan(v)
            assert bad.any() and (status[bad] != 0).all() and (status[~bad] == 0).all()
            one_by_one = catalogue._strict_statuses(spec, inputs, prof, bad)
            assert np.array_equal(status, one_by_one), spec.name
