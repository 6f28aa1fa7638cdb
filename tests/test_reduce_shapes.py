"""``airdata reduce`` on recorded files in the shapes data systems write.

Each shape has a fixture under ``tests/data/`` (invented readings).  The reduced outputs
(``--exact``) must equal :func:`airdata.air_data` called directly on the same readings,
converted with :func:`airdata.units.to_si`; each refusal is checked with its message.
"""

from __future__ import annotations

import csv
import gzip
import io
import subprocess
import sys
from pathlib import Path

import numpy as np
import pytest

import airdata
from airdata import units as u

DATA = Path(__file__).resolve().parent / "data"

#: The readings of the hPa / degC fixtures (ps, pt, tat), as written in them.
READINGS = [(1002.31, 1002.40, 18.52), (1001.87, 1009.95, 18.61), (968.04, 1011.12, 16.20),
            (842.66, 901.53, 9.85)]


def cmd(*args: str, stdin: str | None = None) -> subprocess.CompletedProcess[str]:
    return subprocess.run([sys.executable, "-m", "airdata", "reduce", *args],
                          capture_output=True, text=True, timeout=120, input=stdin)


def reduce_rows(src: Path, *extra: str, delimiter: str = ",") -> tuple[list[str],
                                                                        list[list[str]], str]:
    r = cmd(str(src), "-o", "-", "--exact", "--only", "hp,cas,mach,sat", *extra)
    assert r.returncode == 0, r.stderr
    rows = list(csv.reader(io.StringIO(r.stdout), delimiter=delimiter))
    return rows[0], rows[1:], r.stderr


def expected(readings: list[tuple[float, float, float]],
             units: tuple[str, str, str]) -> airdata.AirData:
    ps, pt, tat = (np.array([r[i] for r in readings]) for i in range(3))
    return airdata.air_data(np.asarray(u.to_si(ps, units[0])),
                            np.asarray(u.to_si(pt, units[1])),
                            np.asarray(u.to_si(tat, units[2])), strict=False)


def check(header: list[str], rows: list[list[str]], ref: airdata.AirData,
          comma: bool = False) -> None:
    def col(name: str) -> np.ndarray:
        j = header.index(name)
        return np.array([float(r[j].replace(",", ".") if comma else r[j]) for r in rows])
    assert [r[header.index("status")] for r in rows] == ["OK"] * len(rows)
    np.testing.assert_array_equal(col("hp[ft]"), u.from_si(ref.pressure_altitude, "ft"))
    np.testing.assert_array_equal(col("cas[kt]"), u.from_si(ref.cas, "kt"))
    np.testing.assert_array_equal(col("mach[1]"), ref.mach)
    np.testing.assert_array_equal(col("sat[degC]"), u.from_si(ref.sat, "degC"))


def test_semicolons_and_decimal_comma_are_detected_and_kept() -> None:
    header, rows, _ = reduce_rows(DATA / "shape_semicolon_decimal_comma.csv", delimiter=";")
    assert header[:5] == ["time[s]", "ps[hPa]", "pt[hPa]", "tat[degC]", "phase"]
    assert rows[0][:5] == ["0,0", "1002,31", "1002,40", "18,52", "taxi"]  # unchanged
    check(header, rows, expected(READINGS, ("hPa", "hPa", "degC")), comma=True)


def test_tabs_with_a_units_row_under_the_names() -> None:
    header, rows, _ = reduce_rows(DATA / "shape_tab_units_row.tsv", delimiter="\t")
    assert header[:5] == ["time", "ps", "pt", "tat", "phase"]
    units_row, rows = rows[0], rows[1:]
    assert units_row[:9] == ["s", "hPa", "hPa", "degC", "", "ft", "kt", "1", "degC"]
    check(header, rows, expected(READINGS, ("hPa", "hPa", "degC")))


@pytest.mark.parametrize("delimiter", ["tab", "\\t", "\t"])
def test_delimiter_option_names_the_tab(delimiter: str) -> None:
    header, rows, _ = reduce_rows(DATA / "shape_tab_units_row.tsv", "--delimiter", delimiter,
                                  delimiter="\t")
    check(header, rows[1:], expected(READINGS, ("hPa", "hPa", "degC")))


def test_preamble_comments_case_and_unit_spellings() -> None:
    header, rows, err = reduce_rows(DATA / "shape_preamble_spellings.csv")
    assert header[:5] == ["Time (s)", "PS (mb)", "Pt [mbar]", "TAT[C]", "Phase"]
    assert len(rows) == 4                      # the comment line inside is not a row
    assert "1 comment line(s) starting with # skipped" in err
    check(header, rows, expected(READINGS, ("mbar", "mbar", "degC")))


def test_latin1_file_is_read_with_a_note_and_utf8_is_refused_when_asked() -> None:
    src = DATA / "shape_latin1_degree.csv"
    header, rows, err = reduce_rows(src)
    assert header[3] == "tat[°C]" and rows[0][4] == "température ok"
    assert "not UTF-8: read as Latin-1" in err
    check(header, rows, expected(READINGS[:3] + READINGS[3:], ("hPa", "hPa", "degC")))
    r = cmd(str(src), "-o", "-", "--encoding", "utf-8")
    assert r.returncode == 1
    assert "bytes that are not utf-8" in r.stderr and "--encoding latin-1" in r.stderr


def test_utf8_bom_psi_kpa_degf() -> None:
    header, rows, _ = reduce_rows(DATA / "shape_bom_psi_degf.csv")
    assert header[0] == "ps[psi]"               # the byte-order mark is not in the name
    readings = [(14.537, 100.240, 65.34), (14.53061, 100.995, 65.50),
                (14.04, 101.112, 61.16)]
    ps, pt, tat = (np.array([r[i] for r in readings]) for i in range(3))
    ref = airdata.air_data(np.asarray(u.to_si(ps, "psi")), np.asarray(u.to_si(pt, "kPa")),
                           np.asarray(u.to_si(tat, "degF")), strict=False)
    check(header, rows, ref)
    # psi from its definition: 0.45359237 kg * 9.80665 m/s2 / (0.0254 m)^2 (NIST SP 811)
    assert u.to_si(1.0, "psi") == pytest.approx(0.45359237 * 9.80665 / 0.0254 ** 2,
                                                rel=1e-15)


def test_gzip_in_and_out_by_extension(tmp_path: Path) -> None:
    src = DATA / "shape_inhg_kelvin.csv.gz"
    header, rows, _ = reduce_rows(src)
    ref = expected([(29.598, 29.601, 291.67), (29.585, 29.825, 291.76),
                    (28.587, 29.860, 289.35)], ("inHg", "inHg", "K"))
    check(header, rows, ref)
    out = tmp_path / "out.csv.gz"
    r = cmd(str(src), "-o", str(out), "--exact", "--only", "hp,cas,mach,sat", "-q")
    assert r.returncode == 0, r.stderr
    with gzip.open(out, "rt", encoding="utf-8", newline="") as f:
        zrows = list(csv.reader(f))
    assert zrows[0] == header and zrows[1:] == rows


def test_default_format_rounds_each_quantity_to_its_resolution() -> None:
    r = cmd(str(DATA / "shape_preamble_spellings.csv"), "-o", "-", "-q")
    assert r.returncode == 0, r.stderr
    rows = list(csv.reader(io.StringIO(r.stdout)))
    h = rows[0]
    ref = expected(READINGS, ("mbar", "mbar", "degC"))
    for name, values, unit, decimals in (
            ("hp[ft]", ref.pressure_altitude, "ft", 3), ("cas[kt]", ref.cas, "kt", 3),
            ("mach[1]", ref.mach, "1", 5), ("sat[degC]", ref.sat, "degC", 3),
            ("qc[hPa]", ref.impact_pressure, "hPa", 4)):
        j = h.index(name)
        want = np.round(np.asarray(u.from_si(values, unit)), decimals) + 0.0
        got = [r[j] for r in rows[1:]]
        assert got == [repr(float(v)) for v in want], name


# ----------------------------------------------------------------------------- refusals

def write(path: Path, text: str) -> Path:
    path.write_text(text, encoding="utf-8")
    return path


def test_every_row_rejected_exits_1_with_the_reason(tmp_path: Path) -> None:
    # a decimal-comma file with comma delimiters cannot be told apart: every ps is text
    src = write(tmp_path / "in.csv", 'ps[hPa],pt[hPa],tat[degC]\n"1002,31","1002,40",18\n'
                '"1001,87","1009,95",18\n')
    r = cmd(str(src), "-o", str(tmp_path / "out.csv"))
    assert r.returncode == 1
    assert "every one of the 2 rows was rejected" in r.stderr
    assert "ps[hPa]: not a number ('1002,31')" in r.stderr


@pytest.mark.parametrize("name", ["out.xlsx", "out.json", "out.parquet.gz"])
def test_output_extension_refused_before_any_work(tmp_path: Path, name: str) -> None:
    r = cmd(str(tmp_path / "missing.csv"), "-o", str(tmp_path / name))
    assert r.returncode == 1                    # refused before the input is even opened
    assert "no such file" not in r.stderr
    assert name.split(".", 1)[0] and ("cannot be read or written" in r.stderr
                                      or "compressed parquet" in r.stderr)
    assert not (tmp_path / name).exists()


def test_plot_extension_refused_before_any_work(tmp_path: Path) -> None:
    r = cmd(str(tmp_path / "missing.csv"), "-o", "-", "--plot", str(tmp_path / "p.jpg"))
    assert r.returncode == 1 and "extension '.jpg' cannot be drawn" in r.stderr


@pytest.mark.parametrize("text, message", [
    ("ps[hPa],pt[hPa],tat[degC]\n1000,1001,15\n", "a decimal comma needs another field"),
])
def test_decimal_comma_with_comma_delimiter_refused(tmp_path: Path, text: str,
                                                    message: str) -> None:
    r = cmd(str(write(tmp_path / "in.csv", text)), "-o", "-", "--decimal", ",")
    assert r.returncode == 1 and message in r.stderr


@pytest.mark.parametrize("text, message", [
    ("# only a comment\n", "holds only comment lines"),
    ("ps[furlong],pt[hPa],tat[degC]\n1,2,3\n", "unknown unit 'furlong'"),
    ("ps[hPa],pt[hPa],tat[degC]\nft,hPa,degC\n1000,1001,15\n",
     "the header says unit 'hPa', the units row below it 'ft'"),
    ("ps;pt;tat\n1000;1001;15\n", "carries no unit"),
    ("pressure;pt[hPa];tat[C]\n1000;1001;15\n", "fields read as separated by semicolons"),
])
def test_header_refusals_say_how_to_fix(tmp_path: Path, text: str, message: str) -> None:
    r = cmd(str(write(tmp_path / "in.csv", text)), "-o", "-")
    assert r.returncode == 1, r.stderr
    assert message in r.stderr


@pytest.mark.parametrize("args, message", [
    (["--delimiter", "ab"], "give one character"),
    (["--delimiter", "1"], "give one character"),
    (["--digits", "4", "--exact"], "choose one"),
])
def test_usage_refusals(tmp_path: Path, args: list[str], message: str) -> None:
    src = write(tmp_path / "in.csv", "ps[hPa],pt[hPa],tat[degC]\n1000,1001,15\n")
    r = cmd(str(src), "-o", "-", *args)
    assert r.returncode == 2 and message in r.stderr


def test_unit_spellings_map_to_the_canonical_units() -> None:
    # spellings in common use (common practice, no source) and their canonical units
    for spelling, unit in (("mb", "mbar"), ("MBAR", "mbar"), ("hpa", "hPa"), ("C", "degC"),
                           ("deg C", "degC"), ("°F", "degF"), ("kts", "kt"), ("KT", "kt"),
                           ("m/s", "m/s"), ("km/h", "km/h"), ("mph", "mph"), ("FT", "ft"),
                           ("fl", "FL"), ("in Hg", "inHg"), ("PSI", "psi"), ("pa", "Pa")):
        assert u.normalize_unit(spelling) == unit
    with pytest.raises(ValueError, match="unknown unit 'furlong'"):
        u.normalize_unit("furlong")
    # 1 mph = 0.44704 m/s exactly (international mile, 1959), 1 FL = 100 ft
    assert u.to_si(1.0, "mph") == 0.44704 and u.to_si(350.0, "FL") == 350 * 30.48
