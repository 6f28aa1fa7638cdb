"""``airdata reduce`` streams: peak memory does not grow with the file.

Two files, 30 000 and 300 000 rows, are reduced by the real command line; the peak
resident set size of each run (``os.wait4`` rusage of that very child) must agree within
a small margin.  Holding the big file's rows in memory would cost well over 100 MB.
"""

from __future__ import annotations

import os
import subprocess
import sys
from pathlib import Path

import pytest

ROOT = Path(__file__).resolve().parents[1]
DEMO = ROOT / "examples" / "demo_flight.csv"

#: Allowed growth of the peak resident set size from 30 000 to 300 000 rows, KiB.
MARGIN_KIB = 12 * 1024


def make_file(path: Path, rows: int) -> Path:
    """The demo rows repeated (bad rows included) up to ``rows`` data rows."""
    header, *body = DEMO.read_text(encoding="utf-8").splitlines()
    block = "\n".join(body) + "\n"
    with open(path, "w", encoding="utf-8") as f:
        f.write(header + "\n")
        full, rest = divmod(rows, len(body))
        for _ in range(full):
            f.write(block)
        if rest:
            f.write("\n".join(body[:rest]) + "\n")
    return path


def peak_rss_kib(src: Path, out: Path) -> int:
    """Run the reduce on ``src`` and return the peak RSS of that process, KiB."""
    proc = subprocess.Popen(
        [sys.executable, "-m", "airdata", "reduce", str(src), "-o", str(out), "-q",
         "--chunk", "5000"],
        stdout=subprocess.DEVNULL, stderr=subprocess.PIPE)
    _, status, usage = os.wait4(proc.pid, 0)
    proc.returncode = os.waitstatus_to_exitcode(status)
    err = proc.stderr.read().decode() if proc.stderr else ""
    assert proc.returncode == 0, err
    return usage.ru_maxrss  # KiB on Linux


def count_lines(path: Path) -> int:
    with open(path, "rb") as f:
        return sum(block.count(b"\n") for block in iter(lambda: f.read(1 << 20), b""))


@pytest.mark.skipif(sys.platform != "linux",
                    reason="os.wait4 rusage with ru_maxrss in KiB: Linux only")
def test_peak_memory_is_flat_from_30k_to_300k_rows(tmp_path: Path) -> None:
    small = make_file(tmp_path / "small.csv", 30_000)
    big = make_file(tmp_path / "big.csv", 300_000)
    rss_small = peak_rss_kib(small, tmp_path / "small_out.csv")
    rss_big = peak_rss_kib(big, tmp_path / "big_out.csv")
    assert count_lines(tmp_path / "big_out.csv") == 300_001       # nothing dropped
    assert rss_big - rss_small < MARGIN_KIB, (rss_small, rss_big)
