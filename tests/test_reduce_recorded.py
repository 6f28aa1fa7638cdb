"""``airdata reduce`` on files that also hold recorded outputs (``<output>_rec[unit]``).

The summary the command prints is checked against an independent computation on the
same file: the reference is :func:`airdata.air_data` called directly, the unit factors
are typed here from their definitions (international foot 0.3048 m, knot 1852 m/h,
hPa 100 Pa, degC = K - 273.15; exact by definition), and the statistics are plain numpy.
Also: ``--compare`` in engineering units, and negative option values without ``=``.
"""

from __future__ import annotations

import csv
import inspect
import json
import subprocess
import sys
from pathlib import Path

import numpy as np
import pyarrow as pa
import pyarrow.parquet as pq
import pytest

import airdata

ROOT = Path(__file__).resolve().parents[1]
DEMO_REC = ROOT / "examples" / "demo_flight_recorded.csv"
DEMO = ROOT / "examples" / "demo_flight.csv"

FT = 0.3048            # m, international foot (exact by definition)
KT = 1852.0 / 3600.0   # m/s, international knot (exact by definition)
KMH = 1000.0 / 3600.0  # m/s (exact by definition)

#: Band edges as documented (reduce module docstring), typed here, not imported.
ALT_EDGES_FT = [0.0, 10000.0, 20000.0, 30000.0, 40000.0, 50000.0]
ALT_LABELS = ["< 0 ft", "0-10000 ft", "10000-20000 ft", "20000-30000 ft", "30000-40000 ft",
              "40000-50000 ft", ">= 50000 ft"]
MACH_EDGES = [0.4, 0.7, 0.9, 1.1, 1.5]
MACH_LABELS = ["< 0.4", "0.4-0.7", "0.7-0.9", "0.9-1.1", "1.1-1.5", ">= 1.5"]


def airdata_cmd(*args: str) -> subprocess.CompletedProcess[str]:
    """Run the real command line."""
    return subprocess.run([sys.executable, "-m", "airdata", *args], capture_output=True,
                          text=True, timeout=120)


def read_csv(path: Path) -> tuple[list[str], list[list[str]]]:
    with open(path, newline="", encoding="utf-8") as f:
        rows = list(csv.reader(f))
    return rows[0], rows[1:]


def write_csv(path: Path, header: list[str], rows: list[list[str]],
              delimiter: str = ",") -> None:
    with open(path, "w", newline="", encoding="utf-8") as f:
        csv.writer(f, delimiter=delimiter, lineterminator="\n").writerows([header, *rows])


def num(text: str) -> float:
    try:
        return float(text)
    except ValueError:
        return float("nan")


def column(rows: list[list[str]], j: int) -> np.ndarray:
    return np.array([num(r[j]) for r in rows])


def reference_of(header: list[str], rows: list[list[str]]) -> airdata.AirData:
    """The library on the file's readings (ps, pt in hPa, tat in degC)."""
    ps = column(rows, header.index("ps[hPa]")) * 100.0
    pt = column(rows, header.index("pt[hPa]")) * 100.0
    tat = column(rows, header.index("tat[degC]")) + 273.15
    return airdata.air_data(ps, pt, tat, strict=False)


def by_column(doc: dict, header: str) -> dict:
    return next(o for o in doc["recorded"]["outputs"] if o["column"] == header)


@pytest.fixture(scope="module")
def demo_run(tmp_path_factory: pytest.TempPathFactory) -> tuple[dict, Path]:
    out = tmp_path_factory.mktemp("rec") / "out.csv"
    r = airdata_cmd("reduce", str(DEMO_REC), "-o", str(out), "--exact", "--json")
    assert r.returncode == 0, r.stderr
    return json.loads(r.stdout), out


# ------------------------------------------------------------------ the demo summary

def test_summary_equals_an_independent_numpy_computation(demo_run: tuple[dict, Path]) -> None:
    doc, _ = demo_run
    header, rows = read_csv(DEMO_REC)
    ref = reference_of(header, rows)
    hp_ft = np.asarray(ref.pressure_altitude) / FT
    mach = np.asarray(ref.mach)
    times = [r[0] for r in rows]
    cases = {  # recorded column -> (reference in its unit, band value, band edges, labels)
        "hp_rec[ft]": (hp_ft, hp_ft, ALT_EDGES_FT, ALT_LABELS),
        "mach_rec": (mach, mach, MACH_EDGES, MACH_LABELS),
        "tas_rec[kt]": (np.asarray(ref.tas) / KT, mach, MACH_EDGES, MACH_LABELS),
        "sat_rec[degC]": (np.asarray(ref.sat) - 273.15, mach, MACH_EDGES, MACH_LABELS),
    }
    for head, (want, band_x, edges, labels) in cases.items():
        o = by_column(doc, head)
        rec = column(rows, header.index(head))
        d = rec - want
        ok = np.isfinite(d)
        assert o["compared"] == int(ok.sum()) > 3000
        assert o["recorded_missing"] == int((~np.isfinite(rec)).sum())
        assert o["reference_missing"] == int((np.isfinite(rec) & ~np.isfinite(want)).sum())
        assert o["compared"] + o["not_compared"] == len(rows)
        i = int(np.nanargmax(np.abs(d)))
        assert o["row"] == i + 1 and o["time"] == times[i]
        np.testing.assert_allclose(o["max_abs_diff"], abs(d[i]), rtol=1e-12)
        np.testing.assert_allclose(o["max_diff"], d[i], rtol=1e-12)
        np.testing.assert_allclose(o["mean"], d[ok].mean(), rtol=1e-9, atol=1e-12)
        np.testing.assert_allclose(o["rms"], np.sqrt(np.mean(d[ok] ** 2)), rtol=1e-12)
        which = np.searchsorted(edges, band_x, side="right")
        got = {b["band"]: b for b in o["bands"]}
        rms_by_band = {}
        for k, label in enumerate(labels):
            sel = ok & (which == k)
            if not sel.any():
                assert label not in got
                continue
            b = got[label]
            assert b["compared"] == int(sel.sum())
            np.testing.assert_allclose(b["max_abs_diff"], np.abs(d[sel]).max(), rtol=1e-12)
            rms_by_band[label] = float(np.sqrt(np.mean(d[sel] ** 2)))
            np.testing.assert_allclose(b["rms"], rms_by_band[label], rtol=1e-12)
        assert sum(b["compared"] for b in o["bands"]) == o["compared"]
        assert o["largest_band"] == max(rms_by_band, key=lambda k: rms_by_band[k])
        phase = [r[header.index("phase")] for r in rows]
        got_ph = {p["phase"]: p for p in o["phases"]}
        for name in set(phase):
            sel = ok & (np.array(phase) == name)
            if sel.any():
                np.testing.assert_allclose(got_ph[name]["rms"],
                                           np.sqrt(np.mean(d[sel] ** 2)), rtol=1e-12)


def test_diff_columns_are_recorded_minus_reference(demo_run: tuple[dict, Path]) -> None:
    _, out = demo_run
    oh, orows = read_csv(out)
    ref = reference_of(oh, orows)
    assert oh[-7:] == ["hp_diff[ft]", "cas_diff[kt]", "mach_diff[1]", "tas_diff[kt]",
                       "sat_diff[degC]", "status", "note"]
    got = column(orows, oh.index("cas_diff[kt]"))
    want = column(orows, oh.index("cas_rec[kt]")) - np.asarray(ref.cas) / KT
    np.testing.assert_array_equal(np.isnan(got), np.isnan(want))
    np.testing.assert_allclose(got, want, rtol=1e-12, atol=1e-12)


def test_largest_band_of_the_static_source_error(demo_run: tuple[dict, Path]) -> None:
    doc, _ = demo_run
    # The invented error grows with Mach; the highest Mach is flown at the top altitude.
    assert by_column(doc, "hp_rec[ft]")["largest_band"] == "40000-50000 ft"
    assert by_column(doc, "mach_rec")["largest_band"] == ">= 1.5"
    assert by_column(doc, "hp_rec[ft]")["largest_phase"] == "dash hold"


@pytest.mark.parametrize(("options", "unit", "edges", "to_unit"), [
    (("--alt-unit", "m"), "m", (0.0, 3000.0, 6000.0, 9000.0, 12000.0, 15000.0), 1.0),
    (("--alt-unit", "FL"), "FL", (0.0, 100.0, 200.0, 300.0, 400.0, 500.0), 1.0 / 30.48),
    (("--si",), "m", (0.0, 3000.0, 6000.0, 9000.0, 12000.0, 15000.0), 1.0),
])
def test_altitude_bands_follow_the_output_unit(tmp_path: Path, options: tuple[str, ...],
                                               unit: str, edges: tuple[float, ...],
                                               to_unit: float) -> None:
    # Band edges in the unit the engineer reads (1 FL = 100 ft = 30.48 m, exact), each
    # band's count from the library's pressure altitudes of the same readings.
    r = airdata_cmd("reduce", str(DEMO_REC), "-o", str(tmp_path / "o.csv"), "--json",
                    *options)
    assert r.returncode == 0, r.stderr
    o = by_column(json.loads(r.stdout), "hp_rec[ft]")
    assert o["band_unit"] == unit
    header, rows = read_csv(DEMO_REC)
    ref = reference_of(header, rows)
    rec = column(rows, header.index("hp_rec[ft]"))
    h = np.asarray(ref.pressure_altitude) * to_unit
    ok = np.isfinite(rec) & np.isfinite(h)
    which = np.searchsorted(edges, h[ok], side="right")
    labels = ([f"< {edges[0]:g} {unit}"]
              + [f"{a:g}-{b:g} {unit}" for a, b in zip(edges[:-1], edges[1:], strict=True)]
              + [f">= {edges[-1]:g} {unit}"])
    want = {labels[k]: int((which == k).sum()) for k in range(len(labels))
            if (which == k).any()}
    assert {b["band"]: b["compared"] for b in o["bands"]} == want


def test_static_source_error_band_on_a_clean_file(tmp_path: Path) -> None:
    # One condition per altitude band; the recorded altitude is the pressure altitude of
    # ps (1 + k M^2).  First order (hydrostatic equation dp/dh = -rho g, from memory):
    # dh = -(R T / g) k M^2, so the error and its band follow M^2 T.
    k = 0.0035
    hp_ft = np.array([5000.0, 15000.0, 25000.0, 35000.0, 45000.0])
    mach = np.array([0.30, 0.50, 0.70, 0.85, 1.60])
    ps = np.asarray(airdata.pressure_at_altitude(hp_ft * FT))
    sat = np.asarray(airdata.atmosphere(hp_ft * FT).temperature)
    pt = ps + np.asarray(airdata.impact_pressure_from_mach(mach, ps))
    tat = np.asarray(airdata.tat_from_sat(sat, mach))
    rec = np.asarray(airdata.pressure_altitude(ps * (1.0 + k * mach * mach))) / FT
    rows = [[repr(float(a) / 100.0), repr(float(b) / 100.0), repr(float(c) - 273.15),
             repr(float(h))] for a, b, c, h in zip(ps, pt, tat, rec, strict=True)]
    src = tmp_path / "clean.csv"
    write_csv(src, ["ps[hPa]", "pt[hPa]", "tat[degC]", "hp_rec[ft]"], rows)
    r = airdata_cmd("reduce", str(src), "-o", str(tmp_path / "o.csv"), "--json", "--exact")
    assert r.returncode == 0, r.stderr
    o = by_column(json.loads(r.stdout), "hp_rec[ft]")
    assert o["largest_band"] == "40000-50000 ft"
    assert o["row"] == 5
    # R = 287.05287 J/(kg K), g = 9.80665 m/s2 (ICAO standard atmosphere, from memory)
    first_order = -(287.05287 * sat / 9.80665) * k * mach ** 2 / FT
    bands = {b["band"]: b for b in o["bands"]}
    for label, want in zip(ALT_LABELS[1:6], first_order, strict=True):
        np.testing.assert_allclose(bands[label]["max_diff"], want, rtol=0.02)


# ------------------------------------------------------------------ units and gaps

def test_speed_units_give_the_same_diff_in_their_units(tmp_path: Path,
                                                       demo_run: tuple[dict, Path]) -> None:
    doc, _ = demo_run
    header, rows = read_csv(DEMO_REC)
    j = header.index("cas_rec[kt]")
    kt_summary = by_column(doc, "cas_rec[kt]")
    for head, factor in (("cas_rec[m/s]", KT), ("CAS_REC (km/h)", KT / KMH)):
        h2 = list(header)
        h2[j] = head
        r2 = [list(r) for r in rows]
        for r in r2:
            if r[j]:
                r[j] = repr(float(r[j]) * factor)
        src = tmp_path / "in.csv"
        write_csv(src, h2, r2)
        out = tmp_path / "out.csv"
        r = airdata_cmd("reduce", str(src), "-o", str(out), "--json", "--exact")
        assert r.returncode == 0, r.stderr
        o = by_column(json.loads(r.stdout), head)
        unit = "m/s" if factor == KT else "km/h"
        assert o["unit"] == unit and o["diff_column"] == f"cas_diff[{unit}]"
        assert o["compared"] == kt_summary["compared"]
        assert o["row"] == kt_summary["row"]
        for key in ("max_abs_diff", "max_diff", "rms"):
            np.testing.assert_allclose(o[key], kt_summary[key] * factor, rtol=1e-9)
        np.testing.assert_allclose(o["mean"], kt_summary["mean"] * factor, rtol=1e-6)
        assert [b["band"] for b in o["bands"]] == [b["band"] for b in kt_summary["bands"]]


def test_missing_recorded_values_and_rejected_rows_are_counted(tmp_path: Path) -> None:
    src = tmp_path / "gaps.csv"
    write_csv(src, ["time[s]", "ps[hPa]", "pt[hPa]", "tat[degC]", "cas_rec[kt]"], [
        ["0", "1000", "1020", "15", "110"],
        ["1", "1000", "1020", "15", ""],        # recorded value missing
        ["2", "1000", "1020", "15", "#ERR"],    # recorded value not a number
        ["3", "", "1020", "15", "110"],         # reference rejected (ps empty)
        ["4", "900", "930", "10", "130"],
    ])
    out = tmp_path / "o.csv"
    r = airdata_cmd("reduce", str(src), "-o", str(out), "--json")
    assert r.returncode == 0, r.stderr
    o = by_column(json.loads(r.stdout), "cas_rec[kt]")
    assert (o["compared"], o["recorded_missing"], o["reference_missing"]) == (2, 2, 1)
    assert o["not_compared"] == 3
    oh, orows = read_csv(out)
    diff = [row[oh.index("cas_diff[kt]")] for row in orows]
    assert diff[1] == diff[2] == diff[3] == "" and diff[0] and diff[4]
    # a bad recorded field does not change the row's status
    assert [row[oh.index("status")] for row in orows] == ["OK", "OK", "OK", "INVALID_INPUT",
                                                         "OK"]
    r = airdata_cmd("reduce", str(src), "-o", str(out))
    assert "2 compared, 3 not compared (2 recorded value missing, 1 row(s) rejected)" \
        in r.stderr


def test_decimal_comma_file_with_recorded_column(tmp_path: Path) -> None:
    src = tmp_path / "dc.csv"
    write_csv(src, ["ps[hPa]", "pt[hPa]", "tat[degC]", "hp_rec[ft]"],
              [["1000,5", "1020,25", "15,5", "350,5"], ["900,25", "930,5", "10,5", "3250,5"]],
              delimiter=";")
    r = airdata_cmd("reduce", str(src), "-o", str(tmp_path / "o.csv"), "--json", "--exact")
    assert r.returncode == 0, r.stderr
    o = by_column(json.loads(r.stdout), "hp_rec[ft]")
    ref = airdata.air_data(np.array([100050.0, 90025.0]), np.array([102025.0, 93050.0]),
                           np.array([288.65, 283.65]))
    d = np.array([350.5, 3250.5]) - np.asarray(ref.pressure_altitude) / FT
    assert o["compared"] == 2
    np.testing.assert_allclose(o["rms"], np.sqrt(np.mean(d ** 2)), rtol=1e-12)


def test_unknown_recorded_output_is_refused_with_the_accepted_names(tmp_path: Path) -> None:
    src = tmp_path / "bad.csv"
    write_csv(src, ["ps[hPa]", "pt[hPa]", "tat[degC]", "vsi_rec[ft/min]"],
              [["1000", "1020", "15", "0"]])
    out = tmp_path / "o.csv"
    r = airdata_cmd("reduce", str(src), "-o", str(out))
    assert r.returncode == 1
    assert "'vsi_rec[ft/min]'" in r.stderr
    for name in ("hp (pressure altitude)", "cas (calibrated airspeed)", "mach", "sat",
                 "tas", "hbaro"):
        assert name in r.stderr
    assert not out.exists()
    r = airdata_cmd("reduce", str(src), "-o", str(out), "--ignore-recorded")
    assert r.returncode == 0, r.stderr
    assert read_csv(out)[0][3] == "vsi_rec[ft/min]" and "_diff" not in ",".join(read_csv(out)[0])


@pytest.mark.parametrize("header, words", [
    ("cas_rec", "carries no unit"),
    ("cas_rec[ft]", "is not a speed unit"),
    ("hbaro_rec[ft]", "needs an altimeter setting"),
])
def test_recorded_column_header_errors(tmp_path: Path, header: str, words: str) -> None:
    src = tmp_path / "bad.csv"
    write_csv(src, ["ps[hPa]", "pt[hPa]", "tat[degC]", header], [["1000", "1020", "15", "1"]])
    r = airdata_cmd("reduce", str(src), "-o", str(tmp_path / "o.csv"))
    assert r.returncode == 1
    assert words in r.stderr and repr(header) in r.stderr


def test_recorded_comparison_through_parquet(tmp_path: Path) -> None:
    header, rows = read_csv(DEMO_REC)
    table = pa.table({h: [r[j] for r in rows] for j, h in enumerate(header)})
    src = tmp_path / "in.parquet"
    pq.write_table(table, src)
    out = tmp_path / "out.parquet"
    r = airdata_cmd("reduce", str(src), "-o", str(out), "--json", "--exact")
    assert r.returncode == 0, r.stderr
    o = by_column(json.loads(r.stdout), "hp_rec[ft]")
    ref = reference_of(header, rows)
    d = column(rows, header.index("hp_rec[ft]")) - np.asarray(ref.pressure_altitude) / FT
    np.testing.assert_allclose(o["rms"], np.sqrt(np.nanmean(d ** 2)), rtol=1e-12)
    got = pq.read_table(out).column("hp_diff[ft]").to_numpy(zero_copy_only=False)
    np.testing.assert_allclose(got, d, rtol=1e-12, atol=1e-9)


# ------------------------------------------------------------------ --compare units

def test_compare_reports_differences_in_output_units() -> None:
    from airdata.series.compare import Comparison, compare_chunk

    ps = np.array([30000.0, 50000.0])
    pt = ps + np.array([20000.0, 8000.0])
    tat = np.array([250.0, 270.0])
    ref = airdata.air_data(ps, pt, tat, strict=False)
    fields = {k: getattr(ref, k) for k in ("pressure_altitude", "baro_altitude",
                                           "impact_pressure", "mach", "eas", "tas", "sat",
                                           "density", "density_altitude",
                                           "dynamic_pressure")}
    cas = np.array(ref.cas, copy=True)
    cas[1] = cas[1] * (1.0 + 1e-6)
    port = airdata.AirData(**fields, cas=cas, status=ref.status, profile="icao")
    cmp = Comparison("double", units={"cas": "kt", "pressure_altitude": "ft", "sat": "degC"})
    compare_chunk(cmp, 1, ps, pt, tat, 1.0, None, 100.0, "icao", ref, port)
    doc = cmp.as_dict()
    (dis,) = doc["first"]
    assert dis["output"] == "cas" and dis["row"] == 2 and dis["unit"] == "kt"
    np.testing.assert_allclose(dis["difference_in_unit"], ref.cas[1] * 1e-6 / KT, rtol=1e-6)
    np.testing.assert_allclose(dis["reference_in_unit"], ref.cas[1] / KT, rtol=1e-15)
    big = doc["max_abs_difference"]["cas"]
    assert big["unit"] == "kt" and big["row"] == 2
    np.testing.assert_allclose(big["value"], ref.cas[1] * 1e-6 / KT, rtol=1e-6)
    assert doc["max_abs_difference"]["sat"]["unit"] == "K"  # a difference of degC is K


def test_compare_cli_lists_units() -> None:
    r = airdata_cmd("reduce", str(DEMO), "-o", "-", "--compare", "--only", "hp")
    assert r.returncode == 0, r.stderr
    line = next(ln for ln in r.stderr.splitlines() if "largest |port - reference|:" in ln)
    assert " ft" in line and " kt" in line and " K" in line


# ------------------------------------------------------------------ negative values

def test_negative_quantity_without_equals_sign() -> None:
    a = airdata_cmd("compute", "--ps", "250hPa", "--pt", "300hPa", "--tat", "-20degC",
                    "--json")
    b = airdata_cmd("compute", "--ps", "250hPa", "--pt", "300hPa", "--tat=-20degC", "--json")
    assert a.returncode == b.returncode == 0, a.stderr
    assert json.loads(a.stdout) == json.loads(b.stdout)
    tat = json.loads(a.stdout)["inputs"]["tat"]
    assert tat["value"] == -20.0 and tat["si"] == pytest.approx(253.15, abs=1e-12)
    c = airdata_cmd("convert", "--cas", "250kt", "--hp", "-1000ft", "--isa-dev", "-5degC",
                    "--json")
    assert c.returncode == 0, c.stderr


def test_negative_value_taken_as_option_says_how_to_write_it() -> None:
    r = airdata_cmd("compute", "--ps", "250hPa", "--pt", "300hPa", "--tat", "-°C")
    assert r.returncode == 2
    assert "--tat=VALUE" in r.stderr and "--tat=-20degC" in r.stderr


def test_negative_values_need_no_argparse_internals() -> None:
    from airdata.cli import quantities
    from airdata.cli.quantities import _join_negative_values

    assert "_negative_number_matcher" not in inspect.getsource(quantities)
    opts = {"--tat", "--ps", "-o"}
    assert _join_negative_values(["--tat", "-20degC", "--json", "-5"], opts, True) == \
        ["--tat=-20degC", "--json", "-5"]                # a flag takes no value
    assert _join_negative_values(["--ta", "-1.5e1 K"], opts, True) == ["--ta=-1.5e1 K"]
    assert _join_negative_values(["--ta", "-1"], opts, False) == ["--ta", "-1"]
    assert _join_negative_values(["-o", "-5.csv", "--", "--tat", "-1K"], opts, True) == \
        ["-o-5.csv", "--", "--tat", "-1K"]


def test_band_edges_belong_to_the_band_above() -> None:
    # Documented rule: a band holds lo <= x < hi (here on Mach edges 0.4 and 1.5).
    from airdata.series.compare import RecordedColumn, RecordedComparison

    mach = np.array([0.3999999, 0.4, 1.5, 1.4999999])
    n = len(mach)
    nan = np.full(n, np.nan)
    ref = airdata.AirData(pressure_altitude=nan, baro_altitude=None, impact_pressure=nan,
                          mach=mach, cas=nan, eas=nan, tas=nan, sat=nan, density=nan,
                          density_altitude=nan, dynamic_pressure=nan,
                          status=np.zeros(n, dtype=np.int8), profile="icao")
    col = RecordedColumn(0, "mach_rec", "mach", "mach", "1", "mach_diff[1]", "mach")
    rc = RecordedComparison([col])
    d = rc.add(1, (mach + np.array([0.01, 0.02, 0.03, 0.04]))[:, None],
               np.zeros((n, 1), dtype=bool), ref, None, None)
    np.testing.assert_allclose(d[:, 0], [0.01, 0.02, 0.03, 0.04], rtol=1e-9)
    bands = {b["band"]: b for b in rc.as_dict()["outputs"][0]["bands"]}
    assert bands["< 0.4"]["row"] == 1 and bands["0.4-0.7"]["row"] == 2
    assert bands[">= 1.5"]["row"] == 3 and bands["1.1-1.5"]["row"] == 4
