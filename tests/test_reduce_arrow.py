"""``airdata reduce`` with Parquet and Arrow IPC files (through pyarrow), and its memory.

The Parquet path must carry the same data as the CSV path: CSV -> Parquet -> CSV gives
the identical text, and the Parquet outputs are the very binary64 values of ``--exact``.
"""

from __future__ import annotations

import csv
import os
import subprocess
import sys
from pathlib import Path

import numpy as np
import pyarrow as pa
import pyarrow.ipc  # noqa: E402
import pyarrow.parquet as pq
import pytest

ROOT = Path(__file__).resolve().parents[1]
DEMO = ROOT / "examples" / "demo_flight.csv"


def cmd(*args: str) -> subprocess.CompletedProcess[str]:
    return subprocess.run([sys.executable, "-m", "airdata", "reduce", *args],
                          capture_output=True, text=True, timeout=300)


def csv_to_parquet(src: Path, dst: Path) -> None:
    """Every field as text, as the CSV holds it."""
    with open(src, newline="", encoding="utf-8") as f:
        header, *rows = list(csv.reader(f))
    cols = [pa.array([r[j] for r in rows], pa.string()) for j in range(len(header))]
    pq.write_table(pa.table(cols, names=header), dst)


def test_csv_parquet_csv_round_trip_is_identical(tmp_path: Path) -> None:
    direct = tmp_path / "direct.csv"
    assert cmd(str(DEMO), "-o", str(direct), "-q").returncode == 0
    src_pq = tmp_path / "in.parquet"
    csv_to_parquet(DEMO, src_pq)
    via = tmp_path / "via.csv"
    r = cmd(str(src_pq), "-o", str(via), "-q")
    assert r.returncode == 0, r.stderr
    assert via.read_bytes() == direct.read_bytes()


@pytest.mark.parametrize("ext", [".parquet", ".arrow"])
def test_parquet_and_arrow_outputs_hold_the_exact_values(tmp_path: Path, ext: str) -> None:
    text = tmp_path / "exact.csv"
    assert cmd(str(DEMO), "-o", str(text), "--exact", "-q").returncode == 0
    out = tmp_path / f"out{ext}"
    r = cmd(str(DEMO), "-o", str(out), "--exact", "-q")
    assert r.returncode == 0, r.stderr
    table = pq.read_table(out) if ext == ".parquet" else \
        pyarrow.ipc.open_file(pa.memory_map(str(out))).read_all()
    with open(text, newline="", encoding="utf-8") as f:
        header, *rows = list(csv.reader(f))
    assert table.column_names == header
    for j, name in enumerate(header):
        col = table.column(name)
        if pa.types.is_floating(col.type):
            got = np.array(col.to_numpy(zero_copy_only=False), dtype=float)
            want = np.array([float(r[j]) if r[j] else np.nan for r in rows])
            np.testing.assert_array_equal(got, want)   # bit for bit (NaN where empty)
        else:
            assert col.to_pylist() == [r[j] for r in rows], name
    # and the Arrow file reads back through reduce
    again = tmp_path / "again.csv"
    r = cmd(str(out), "-o", str(again), "--prefix", "re_", "--only", "hp", "-q", "--exact")
    assert r.returncode == 0, r.stderr


def test_unreadable_parquet_is_a_clear_error(tmp_path: Path) -> None:
    bad = tmp_path / "bad.parquet"
    bad.write_bytes(b"not parquet at all")
    r = cmd(str(bad), "-o", "-")
    assert r.returncode == 1 and "not a readable parquet file" in r.stderr


def make_big(path: Path, rows: int) -> None:
    header, *body = DEMO.read_text(encoding="utf-8").splitlines()
    block = ("\n".join(body) + "\n").encode()
    with open(path, "wb") as f:
        f.write((header + "\n").encode())
        full, rest = divmod(rows, len(body))
        for _ in range(full):
            f.write(block)
        f.write(("\n".join(body[:rest]) + "\n").encode() if rest else b"")


def peak_rss_kib(*args: str) -> int:
    proc = subprocess.Popen([sys.executable, "-m", "airdata", "reduce", *args, "-q"],
                            stdout=subprocess.DEVNULL, stderr=subprocess.PIPE)
    _, status, usage = os.wait4(proc.pid, 0)
    assert os.waitstatus_to_exitcode(status) == 0, proc.stderr.read() if proc.stderr else ""
    return usage.ru_maxrss


@pytest.mark.skipif(sys.platform != "linux",
                    reason="os.wait4 rusage with ru_maxrss in KiB: Linux only")
def test_memory_flat_on_two_million_rows(tmp_path: Path) -> None:
    small, big = tmp_path / "small.csv", tmp_path / "big.csv"
    make_big(small, 20_000)
    make_big(big, 2_000_000)
    for ext in (".csv", ".parquet"):
        rss_small = peak_rss_kib(str(small), "-o", str(tmp_path / f"s{ext}"))
        rss_big = peak_rss_kib(str(big), "-o", str(tmp_path / f"b{ext}"))
        # holding 2e6 rows would cost several hundred MB; allow 16 MiB of growth
        assert rss_big - rss_small < 16 * 1024, (ext, rss_small, rss_big)
    assert pq.ParquetFile(tmp_path / "b.parquet").metadata.num_rows == 2_000_000
