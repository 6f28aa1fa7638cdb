"""``airdata reduce`` through its real entry point (``python -m airdata reduce ...``).

The reduced demo series is checked against :func:`airdata.air_data` called directly on
the same readings (the library is the reference of the command); malformed files must
give a clear error or status rows without losing the good rows.
"""

from __future__ import annotations

import csv
import io
import json
import os
import pty
import subprocess
import sys
from pathlib import Path

import numpy as np
import pytest

import airdata
from airdata import units as u
from airdata.cli.reduce import RESOLUTION_DECIMALS

ROOT = Path(__file__).resolve().parents[1]
DEMO = ROOT / "examples" / "demo_flight.csv"

OUT_KEYS = {  # output column base name -> AirData field
    "hp": "pressure_altitude", "hbaro": "baro_altitude", "qc": "impact_pressure",
    "mach": "mach", "cas": "cas", "eas": "eas", "tas": "tas", "sat": "sat", "rho": "density",
    "hd": "density_altitude", "q": "dynamic_pressure",
}


def airdata_cmd(*args: str, stdin: str | None = None,
                env: dict[str, str] | None = None) -> subprocess.CompletedProcess[str]:
    """Run the real command line."""
    return subprocess.run([sys.executable, "-m", "airdata", *args], capture_output=True,
                          text=True, input=stdin, timeout=120, env=env)


def read_csv(path: Path | str) -> tuple[list[str], list[list[str]]]:
    with open(path, newline="", encoding="utf-8") as f:
        rows = list(csv.reader(f))
    return rows[0], rows[1:]


def split(header: str) -> tuple[str, str | None]:
    name, _, rest = header.partition("[")
    return name, (rest[:-1] if rest else None)


def to_float(text: str) -> float:
    return float(text) if text != "" else float("nan")


def reference(ps: list[str], pt: list[str], tat: list[str], units: tuple[str, str, str],
              **kw: object) -> airdata.AirData:
    """The library on the same readings; unreadable fields are NaN (invalid input)."""
    def col(v: list[str], unit: str) -> np.ndarray:
        vals = []
        for t in v:
            try:
                vals.append(float(t))
            except ValueError:
                vals.append(float("nan"))
        return np.asarray(u.to_si(np.array(vals), unit))
    return airdata.air_data(col(ps, units[0]), col(pt, units[1]), col(tat, units[2]),
                            strict=False, **kw)


# ----------------------------------------------------------------------------- demo

@pytest.fixture(scope="module")
def demo_reduced(tmp_path_factory: pytest.TempPathFactory) -> Path:
    out = tmp_path_factory.mktemp("demo") / "reduced.csv"
    r = airdata_cmd("reduce", str(DEMO), "-o", str(out), "--si", "--setting", "1018hPa",
                    "--exact")
    assert r.returncode == 0, r.stderr
    assert "rows" in r.stderr and str(out) in r.stderr
    return out


def test_demo_series_agrees_with_the_library_called_directly(demo_reduced: Path) -> None:
    ih, irows = read_csv(DEMO)
    oh, orows = read_csv(demo_reduced)
    assert len(orows) == len(irows) > 3000               # nothing dropped
    assert oh[:len(ih)] == ih
    assert [r[:len(ih)] for r in orows] == irows          # inputs carried through unchanged
    ref = reference([r[1] for r in irows], [r[2] for r in irows], [r[3] for r in irows],
                    ("hPa", "hPa", "degC"), setting=101800.0)
    status = [airdata.Status(int(s)).name for s in ref.status]
    assert [r[oh.index("status")] for r in orows] == status
    assert {"OK", "INVALID_INPUT", "IMPACT_PRESSURE_ZEROED"} <= set(status)
    checked = 0
    for j, head in enumerate(oh):
        name, unit = split(head)
        if name not in OUT_KEYS:
            continue
        assert unit == {"hp": "m", "hbaro": "m", "hd": "m", "qc": "Pa", "q": "Pa",
                        "mach": "1", "rho": "kg/m3", "sat": "K"}.get(name, "m/s")
        got = np.array([to_float(r[j]) for r in orows])
        want = np.asarray(getattr(ref, OUT_KEYS[name]))
        np.testing.assert_array_equal(np.isnan(got), np.isnan(want))
        np.testing.assert_allclose(got, want, rtol=1e-14, atol=0.0)
        checked += 1
    assert checked == len(OUT_KEYS)


def test_demo_bad_rows_keep_their_place_with_empty_outputs(demo_reduced: Path) -> None:
    oh, orows = read_csv(demo_reduced)
    js, jn, jh = oh.index("status"), oh.index("note"), oh.index("hp[m]")
    bad = [r for r in orows if r[js] in ("INVALID_INPUT", "OUT_OF_RANGE")]
    assert 5 <= len(bad) <= 30
    for r in bad:
        assert r[jh:js] == [""] * (js - jh)
        assert r[jn]
    times = [float(r[0]) for r in orows]
    assert times == sorted(times) and len(set(times)) == len(times)
    notes = " | ".join(r[jn] for r in bad)
    assert "not a number ('#ERR')" in notes and "empty" in notes


def test_demo_in_aviation_units_matches_si_run(demo_reduced: Path, tmp_path: Path) -> None:
    out = tmp_path / "ft.csv"
    r = airdata_cmd("reduce", str(DEMO), "-o", str(out), "--only", "hp,cas,sat,mach", "-q")
    assert r.returncode == 0, r.stderr
    assert r.stderr == ""
    oh, orows = read_csv(out)
    sh, srows = read_csv(demo_reduced)
    assert oh[5:] == ["hp[ft]", "cas[kt]", "sat[degC]", "mach[1]", "status", "note"]
    for name, unit, si_head in (("hp[ft]", "ft", "hp[m]"), ("cas[kt]", "kt", "cas[m/s]"),
                                ("sat[degC]", "degC", "sat[K]")):
        got = np.array([to_float(r[oh.index(name)]) for r in orows])
        want = np.asarray(u.from_si(np.array([to_float(r[sh.index(si_head)])
                                              for r in srows]), unit))
        # default format: each value rounded to its unit's stated resolution
        half = 0.5 * 10.0 ** -RESOLUTION_DECIMALS[unit]
        np.testing.assert_allclose(got, want, rtol=1e-13, atol=half * (1 + 1e-9))
        assert all(len(r[oh.index(name)].partition(".")[2]) <= RESOLUTION_DECIMALS[unit]
                   for r in orows)


def test_demo_generator_is_deterministic_and_matches_the_committed_file(
        tmp_path: Path) -> None:
    out = tmp_path / "again.csv"
    r = subprocess.run([sys.executable, str(ROOT / "examples" / "make_demo_flight.py"),
                        "--out", str(out)], capture_output=True, text=True, timeout=60)
    assert r.returncode == 0, r.stderr
    assert out.read_bytes() == DEMO.read_bytes()
    assert DEMO.stat().st_size < 1_000_000


# ----------------------------------------------------------------------------- malformed

GOOD = [("0.0", "1000.00", "1010.00", "20.00"), ("1.0", "900.00", "950.00", "10.00"),
        ("2.0", "500.00", "700.00", "-10.00")]


def write(path: Path, text: str) -> Path:
    path.write_text(text, encoding="utf-8")
    return path


def test_missing_column_is_a_clear_data_error(tmp_path: Path) -> None:
    src = write(tmp_path / "in.csv", "time[s],ps[hPa],tat[degC]\n0,1000,15\n")
    r = airdata_cmd("reduce", str(src), "-o", str(tmp_path / "out.csv"))
    assert r.returncode == 1
    assert "no column 'pt' (total pressure)" in r.stderr
    assert "ps[hPa]" in r.stderr                      # lists what it found
    assert not (tmp_path / "out.csv").exists() and not (tmp_path / "out.csv.partial").exists()


@pytest.mark.parametrize("text", ["", "\n"])
def test_empty_file_is_a_clear_data_error(tmp_path: Path, text: str) -> None:
    src = write(tmp_path / "in.csv", text)
    r = airdata_cmd("reduce", str(src), "-o", str(tmp_path / "out.csv"))
    assert r.returncode == 1
    assert "a header line is needed" in r.stderr


def test_header_only_gives_header_only(tmp_path: Path) -> None:
    src = write(tmp_path / "in.csv", "ps[Pa],pt[Pa],tat[K]\n")
    r = airdata_cmd("reduce", str(src), "-o", "-", "--only", "mach")
    assert r.returncode == 0, r.stderr
    assert r.stdout == "ps[Pa],pt[Pa],tat[K],mach[1],status,note\n"


@pytest.mark.parametrize(("header", "words"), [
    ("ps[kt],pt[hPa],tat[degC]", "unit 'kt' is not a pressure unit"),
    ("ps,pt[hPa],tat[degC]", "carries no unit"),
    ("ps[hPa],pt[hPa],tat[degC],ps[Pa]", "2 columns named 'ps'"),
])
def test_bad_header_units_are_clear_data_errors(tmp_path: Path, header: str,
                                                words: str) -> None:
    src = write(tmp_path / "in.csv", header + "\n1000,1010,15\n")
    r = airdata_cmd("reduce", str(src), "-o", str(tmp_path / "out.csv"))
    assert r.returncode == 1
    assert words in r.stderr


def test_text_empty_and_ragged_rows_become_status_rows_and_good_rows_survive(
        tmp_path: Path) -> None:
    lines = ["time[s],ps[hPa],pt[hPa],tat[degC],remark"]
    lines += [",".join(g) + ",fine" for g in GOOD[:2]]
    lines += ["2.5,abc,1010.00,20.00,text in ps",
              "3.0,1000.00,,20.00,empty pt",
              "3.5,1000.00,1010.00,20.00",                       # a field short
              "4.0,1000.00,1010.00,20.00,two,extra",             # fields over
              "4.5,0,1010.00,20.00,zero ps",
              "5.0,1000.00,1010.00,-999.00,sentinel",
              '"5.5",1000.00,1010.00,20.00,"quoted, with comma"']
    lines += [",".join(g) + ",fine" for g in GOOD[2:]]
    src = write(tmp_path / "in.csv", "\n".join(lines) + "\n")
    out = tmp_path / "out.csv"
    r = airdata_cmd("reduce", str(src), "-o", str(out), "--si", "--json", "--exact")
    assert r.returncode == 0, r.stderr
    summary = json.loads(r.stdout)
    assert summary["rows"] == 10
    assert summary["status_counts"]["INVALID_INPUT"] == 6
    oh, orows = read_csv(out)
    js, jn = oh.index("status"), oh.index("note")
    assert [r[0] for r in orows] == ["0.0", "1.0", "2.5", "3.0", "3.5", "4.0", "4.5", "5.0",
                                     "5.5", "2.0"]
    status = [r[js] for r in orows]
    assert status == ["OK", "OK", "INVALID_INPUT", "INVALID_INPUT", "INVALID_INPUT",
                      "INVALID_INPUT", "INVALID_INPUT", "INVALID_INPUT", "OK", "OK"]
    notes = [r[jn] for r in orows]
    assert notes[2] == "ps[hPa]: not a number ('abc')"
    assert notes[3] == "pt[hPa]: empty"
    assert "row has 4 fields, the header 5" in notes[4]
    assert notes[5].endswith("extra fields: 'extra'")
    assert notes[6].startswith("ps = 0.0 is invalid")
    assert notes[7].startswith("tat = -725.85 is invalid")
    assert orows[8][4] == "quoted, with comma"
    assert all(len(r) == len(oh) for r in orows)
    # the good rows agree with the library called directly
    good = [0, 1, 8, 9]
    ref = reference([orows[i][1] for i in good], [orows[i][2] for i in good],
                    [orows[i][3] for i in good], ("hPa", "hPa", "degC"))
    got = np.array([float(orows[i][oh.index("mach[1]")]) for i in good])
    np.testing.assert_allclose(got, np.asarray(ref.mach), rtol=1e-14)


def test_fail_on_bad_and_out_of_range_rows(tmp_path: Path) -> None:
    # 0.1 Pa is below the top of the model (0.3734 Pa): OUT_OF_RANGE, not INVALID.
    src = write(tmp_path / "in.csv", "ps[Pa],pt[Pa],tat[K]\n0.1,0.2,200\n101325,101400,288\n")
    r = airdata_cmd("reduce", str(src), "-o", "-", "--fail-on-bad", "--only", "hp")
    assert r.returncode == 1
    rows = list(csv.reader(io.StringIO(r.stdout)))
    assert [row[4] for row in rows[1:]] == ["OUT_OF_RANGE", "OK"]
    assert "1 row(s) could not be reduced" in r.stderr


def test_column_mapping_units_prefix_and_stdin(tmp_path: Path) -> None:
    text = "static,pitot,temp,hp[ft]\n1013.25,1020,15,0\n"
    r = airdata_cmd("reduce", "-", "-o", "-", "--col", "ps=static", "--col", "pt=pitot",
                    "--col", "tat=temp", "--unit", "ps=hPa", "--unit", "pt=hPa",
                    "--unit", "tat=degC", "--only", "hp,mach", "--prefix", "ad_", "-q",
                    stdin=text)
    assert r.returncode == 0, r.stderr
    rows = list(csv.reader(io.StringIO(r.stdout)))
    assert rows[0] == ["static", "pitot", "temp", "hp[ft]", "ad_hp[ft]", "ad_mach[1]",
                       "ad_status", "ad_note"]
    assert float(rows[1][4]) == pytest.approx(0.0, abs=1e-9)  # p0 is 0 ft (ICAO)
    # without --prefix the clash with the input's hp[ft] is refused
    r = airdata_cmd("reduce", "-", "-o", "-", "--col", "ps=static", "--col", "pt=pitot",
                    "--col", "tat=temp", "--unit", "ps=hPa", "--unit", "pt=hPa",
                    "--unit", "tat=degC", stdin=text)
    assert r.returncode == 1 and "--prefix" in r.stderr


def test_digits_rounds_the_outputs_only(tmp_path: Path) -> None:
    src = write(tmp_path / "in.csv",
                "ps[Pa],pt[Pa],tat[K],tag\n101325.123456,103000.5,290.123456789,x\n"
                ",103000,290,y\n")
    r = airdata_cmd("reduce", str(src), "-o", "-", "--digits", "4", "--only", "mach,hp",
                    "--si", "-q")
    assert r.returncode == 0, r.stderr
    rows = list(csv.reader(io.StringIO(r.stdout)))
    assert rows[1][:4] == ["101325.123456", "103000.5", "290.123456789", "x"]
    ref = airdata.air_data(101325.123456, 103000.5, 290.123456789)
    assert rows[1][4] == f"{ref.mach:.4g}" and rows[1][5] == f"{ref.pressure_altitude:.4g}"
    assert rows[2][4:] == ["", "", "INVALID_INPUT", "ps[Pa]: empty"]


def test_usage_errors_exit_2(tmp_path: Path) -> None:
    src = write(tmp_path / "in.csv", "ps[Pa],pt[Pa],tat[K]\n101325,101400,288\n")
    r = airdata_cmd("reduce", str(src))
    assert r.returncode == 2 and "-o" in r.stderr
    r = airdata_cmd("reduce", str(src), "-o", "-", "--only", "hp,speed")
    assert r.returncode == 2 and "unknown output(s) speed" in r.stderr
    r = airdata_cmd("reduce", str(src), "-o", "-", "--setting", "1013")
    assert r.returncode == 2 and "has no unit" in r.stderr
    r = airdata_cmd("reduce", str(tmp_path / "nope.csv"), "-o", "-")
    assert r.returncode == 1 and "no such file" in r.stderr


# ----------------------------------------------------------------------------- progress

@pytest.mark.skipif(sys.platform == "win32", reason="pty: POSIX terminals only")
def test_progress_bar_only_on_a_terminal(tmp_path: Path) -> None:
    out = tmp_path / "out.csv"
    args = [sys.executable, "-m", "airdata", "reduce", str(DEMO), "-o", str(out), "-q"]
    piped = subprocess.run(args, capture_output=True, text=True, timeout=60)
    assert piped.returncode == 0 and piped.stderr == ""
    master, slave = pty.openpty()
    try:
        proc = subprocess.Popen(args, stdout=subprocess.DEVNULL, stderr=slave)
        os.close(slave)
        chunks = []
        while True:
            try:
                data = os.read(master, 4096)
            except OSError:
                break
            if not data:
                break
            chunks.append(data)
        assert proc.wait(timeout=60) == 0
    finally:
        os.close(master)
    shown = b"".join(chunks).decode()
    assert "reduce 100.0% [" in shown and "rows/s" in shown


# ----------------------------------------------------------------------------- plot, port

def test_plot_draws_a_png(tmp_path: Path) -> None:
    png = tmp_path / "flight.png"
    r = airdata_cmd("reduce", str(DEMO), "-o", str(tmp_path / "o.csv"), "--plot", str(png),
                    "-q")
    assert r.returncode == 0, r.stderr
    assert png.read_bytes()[:8] == b"\x89PNG\r\n\x1a\n" and png.stat().st_size > 20000


def test_plot_without_matplotlib_is_a_clear_error(tmp_path: Path) -> None:
    blocker = tmp_path / "block"
    blocker.mkdir()
    (blocker / "matplotlib.py").write_text("raise ImportError('blocked for the test')\n")
    env = dict(os.environ, PYTHONPATH=str(blocker))
    r = airdata_cmd("reduce", str(DEMO), "-o", str(tmp_path / "o.csv"), "--plot",
                    str(tmp_path / "p.png"), env=env)
    assert r.returncode == 1
    assert "--plot needs matplotlib" in r.stderr
    assert not (tmp_path / "o.csv").exists()


def test_engine_cport_and_compare_on_the_demo(tmp_path: Path) -> None:
    out = tmp_path / "port.csv"
    r = airdata_cmd("reduce", str(DEMO), "-o", str(out), "--engine", "cport", "--compare",
                    "--json", "--si")
    assert r.returncode == 0, r.stderr
    cmp = json.loads(r.stdout)["compare"]
    assert cmp["samples"] == 4021 and cmp["disagreements"] == 0
    assert cmp["eps"] == 2.0 ** -52
    r = airdata_cmd("reduce", str(DEMO), "-o", str(tmp_path / "s.csv"), "--compare",
                    "--precision", "single", "-q")
    assert r.returncode == 0, r.stderr
    # The bundled port is compiled for both profiles: us1976 through the port agrees with
    # the us1976 reference within the bound on every sample.
    r = airdata_cmd("reduce", str(DEMO), "-o", str(tmp_path / "u.csv"), "--engine", "cport",
                    "--compare", "--profile", "us1976", "--json", "--si")
    assert r.returncode == 0, r.stderr
    cmp = json.loads(r.stdout)["compare"]
    assert cmp["samples"] == 4021 and cmp["disagreements"] == 0


def test_compare_catches_a_port_that_is_off_by_more_than_the_bound() -> None:
    # A port result off by 1e-9 relative in Mach in one sample (the bound there is a few
    # hundred ulp: Mach is ill-conditioned in pt and ps at small qc), a wrong status in
    # another, must both be reported (in-process: the command's comparison step).
    from airdata.series.compare import Comparison, compare_chunk

    ps = np.array([30000.0, 50000.0, 70000.0])
    pt = ps + np.array([20000.0, 1000.0, 5000.0])
    tat = np.array([250.0, 270.0, 280.0])
    ref = airdata.air_data(ps, pt, tat, strict=False)
    mach = np.array(ref.mach, copy=True)
    mach[1] = mach[1] * (1.0 + 1e-9)
    status = np.array(ref.status, copy=True)
    status[2] = airdata.Status.OUT_OF_RANGE
    fields = {k: getattr(ref, k) for k in ("pressure_altitude", "baro_altitude",
                                           "impact_pressure", "cas", "eas", "tas", "sat",
                                           "density", "density_altitude",
                                           "dynamic_pressure")}
    port = airdata.AirData(**fields, mach=mach, status=status, profile="icao")
    cmp = Comparison("double")
    compare_chunk(cmp, 10, ps, pt, tat, 1.0, None, 100.0, "icao", ref, port)
    found = {(d.row, d.output) for d in cmp.kept}
    assert found == {(11, "mach"), (12, "status")}
    assert cmp.disagreeing_samples == 2
