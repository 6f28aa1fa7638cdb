"""``reduce --plot``: time columns in the shapes data systems write, and counts that are true.

Clock times and ISO 8601 date-times are checked against :mod:`datetime` arithmetic (the
standard library, independent of the reader); the rejected-row and shown-row counts of a
thinned-out chart are checked against the statuses of :func:`airdata.air_data` over the
whole series.
"""

from __future__ import annotations

import csv
import dataclasses
import datetime as dt
import json
import subprocess
import sys
from pathlib import Path
from types import SimpleNamespace

import numpy as np
import pytest

import airdata
from airdata.series.plotting import Collector, draw, rejected
from airdata.series.timebase import TimeAxis, clock_text

ROOT = Path(__file__).resolve().parents[1]
DEMO = ROOT / "examples" / "demo_flight.csv"


def run(*args: str) -> subprocess.CompletedProcess[str]:
    return subprocess.run([sys.executable, "-m", "airdata", *args], capture_output=True,
                          text=True, timeout=120)


# ----------------------------------------------------------------------------- the reader

def test_clock_times_are_seconds_since_midnight_and_cross_it() -> None:
    ta = TimeAxis()
    first = ta.parse(["23:59:58.250", "23:59:59", "00:00:00.5"], 1)
    then = ta.parse(["00:00:01", "7:05"], 4)  # the next chunk keeps the day
    assert ta.kind == "clock"
    assert first.tolist() == [86398.25, 86399.0, 86400.5]
    assert then.tolist() == [86401.0, 86400.0 + 7 * 3600 + 5 * 60]
    assert ta.unreadable == 0
    assert ta.label("t", "") == "t (time of day, hh:mm:ss; the record passes midnight)"


def test_impossible_clock_times_are_counted_not_drawn() -> None:
    ta = TimeAxis()
    v = ta.parse(["10:00:00", "25:00:00", "10:61:00", "10:00:60", "", "10:00:01"], 1)
    assert np.isnan(v[1:5]).all() and v[0] == 36000.0 and v[5] == 36001.0
    assert ta.unreadable == 4 and ta.first_unreadable == (2, "25:00:00")


def test_iso_date_times_are_seconds_after_the_first() -> None:
    base = dt.datetime(2026, 12, 4, 23, 59, 59, 750000, tzinfo=dt.UTC)
    later = [base + dt.timedelta(seconds=s) for s in (0.0, 0.5, 3600.25)]
    fields = [t.isoformat().replace("+00:00", "Z") for t in later]
    fields.append((base + dt.timedelta(seconds=10)).astimezone(
        dt.timezone(dt.timedelta(hours=2))).isoformat())  # the same instant, another offset
    ta = TimeAxis()
    v = ta.parse(fields, 1)
    assert ta.kind == "iso"
    assert v.tolist() == [0.0, 0.5, 3600.25, 10.0]
    assert ta.tick_text(0.25) == "00:00:00" and ta.tick_text(3600.0) == "01:00:00"
    # a naive date-time cannot be placed against an offset one; a date is not a time
    w = ta.parse(["2026-12-04 12:00:00", "tomorrow"], 5)
    assert np.isnan(w).all() and ta.unreadable == 2 and ta.first_unreadable == (
        5, "2026-12-04 12:00:00")


def test_numbers_are_taken_as_written() -> None:
    ta = TimeAxis()
    v = ta.parse(["0.5", "1e3", "x"], 1)
    assert ta.kind == "number" and v[:2].tolist() == [0.5, 1000.0] and np.isnan(v[2])
    assert ta.label("time", "ms") == "time [ms]"


def test_clock_text() -> None:
    assert clock_text(0.0) == "00:00:00"
    assert clock_text(86399.4) == "23:59:59"
    assert clock_text(86400.0 + 61.0) == "00:01:01 +1d"
    assert clock_text(86400.0 + 61.0, days=False) == "00:01:01"
    assert clock_text(-61.0) == "-00:01:01"
    assert clock_text(float("nan")) == ""


# ----------------------------------------------------------------------------- the counts

def _chunks(n: int, size: int) -> tuple[list[SimpleNamespace], int]:
    """A series with rejected rows scattered over it; returns the chunks and the count."""
    rng = np.random.default_rng(7)
    ps = np.full(n, 50000.0)
    pt = ps + rng.uniform(1000.0, 9000.0, n)
    tat = np.full(n, 260.0)
    bad = rng.random(n) < 0.05
    tat[bad] = -1.0  # below absolute zero: INVALID_INPUT
    out = airdata.air_data(ps, pt, tat, strict=False)
    status = np.asarray(out.status, dtype=np.int8)
    chunks = []
    for s in range(0, n, size):
        sl = slice(s, s + size)
        part = dataclasses.replace(out, **{
            f.name: np.asarray(getattr(out, f.name))[sl] for f in dataclasses.fields(out)
            if np.ndim(getattr(out, f.name)) == 1})
        chunks.append(SimpleNamespace(status=status[sl], out=part,
                                      time=np.arange(n, dtype=np.float64)[sl] * 0.1,
                                      tat=tat[sl]))
    return chunks, int(rejected(status).sum())


def _plan() -> SimpleNamespace:
    return SimpleNamespace(roles={"time": SimpleNamespace(name="time")},
                           role_units={"time": "s"})


UNITS = {"length": "ft", "speed": "kt", "temperature": "degC"}


def test_a_thinned_chart_counts_every_rejected_row(tmp_path: Path) -> None:
    chunks, n_bad = _chunks(20000, 3000)
    assert n_bad > 500
    col = Collector(1000, _plan(), UNITS)
    for ch in chunks:
        col.add(ch)
    assert col.rows == 20000 and col.rejected == n_bad
    assert col.stride > 1 and col.kept <= 1000
    marks = col.rejected_marks()
    assert 0 < marks.size <= 1000
    drawn = draw(col, str(tmp_path / "p.png"), "t", "icao")
    assert drawn["rejected"] == n_bad and drawn["rows"] == 20000
    assert drawn["rows_shown"] == col.kept and drawn["every"] == col.stride
    assert f"{col.kept:,} of 20,000 rows shown".replace(",", " ") in drawn["note"]
    assert (tmp_path / "p.png").read_bytes()[:4] == b"\x89PNG"


def test_an_unthinned_chart_marks_all_rejected_rows(tmp_path: Path) -> None:
    chunks, n_bad = _chunks(3000, 700)
    col = Collector(50000, _plan(), UNITS)
    for ch in chunks:
        col.add(ch)
    drawn = draw(col, str(tmp_path / "p.svg"), "t", "icao")
    assert drawn["rejected"] == drawn["rejected_marked"] == n_bad
    assert drawn["rows_shown"] == 3000 and drawn["note"] == "profile icao"


# ----------------------------------------------------------------------------- the command

def _demo_with_time(path: Path, shape: str) -> None:
    rows = list(csv.reader(DEMO.open(newline="")))
    start = dt.datetime(2026, 12, 4, 23, 50, 0, tzinfo=dt.UTC)
    with path.open("w", newline="") as f:
        w = csv.writer(f)
        w.writerow(["time", "ps[hPa]", "pt[hPa]", "tat[degC]"])
        for i, r in enumerate(rows[1:]):
            t = start + dt.timedelta(seconds=float(r[0]))
            text = t.strftime("%H:%M:%S.%f")[:-3] if shape == "clock" else t.isoformat()
            w.writerow(["n/a" if i == 5 else text, *r[1:4]])


@pytest.mark.parametrize("shape", ["clock", "iso"])
def test_reduce_plots_clock_and_iso_time(tmp_path: Path, shape: str) -> None:
    src = tmp_path / f"{shape}.csv"
    _demo_with_time(src, shape)
    r = run("reduce", str(src), "-o", str(tmp_path / "o.csv"), "--plot",
            str(tmp_path / "o.png"), "--json")
    assert r.returncode == 0, r.stderr
    doc = json.loads(r.stdout)
    plot = doc["plot_content"]
    assert plot["time"] == shape and plot["rows"] == 4021
    assert plot["rows_shown"] == 4020  # the one unreadable time
    assert plot["rejected"] == doc["rows"] - doc["status_counts"]["OK"] \
        - doc["status_counts"]["IMPACT_PRESSURE_ZEROED"]
    assert (f"time column 'time': 1 row(s) without a readable {shape} value (first: data "
            "row 6, 'n/a'); they are not in the plot") in r.stderr
    # the time shape changes nothing in the reduction itself
    ref = run("reduce", str(DEMO), "-o", str(tmp_path / "ref.csv"), "-q")
    assert ref.returncode == 0, ref.stderr
    got = [row[4:] for row in csv.reader((tmp_path / "o.csv").open())]
    want = [row[5:] for row in csv.reader((tmp_path / "ref.csv").open())]
    assert got == want
