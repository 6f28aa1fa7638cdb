"""Lines 5 and 6: the C port against the numpy reference; instructions per call."""

from __future__ import annotations

import shutil
import subprocess
import tempfile
from pathlib import Path
from typing import Any

import numpy as np

from .common import SEED, _alternate, _line, _missing, _pressures, _supersonic, chain_inputs

# --------------------------------------------------------------------------- line 5

def _port_lines(sz: dict[str, int]) -> list[dict[str, Any]]:
    """Lines 5a and 5b: the C port (binary64) against the numpy reference."""
    t_pa = "C port pressure_altitude: reference / port"
    t_ch = "C port air_data chain: reference / port"
    try:
        from .. import cport
        cport._module("double")
    except Exception as exc:  # noqa: BLE001 - any import or build failure of the port
        why = f"C port unavailable ({exc})"
        return [_missing("5a", t_pa, "x faster", None, None, why),
                _missing("5b", t_ch, "x faster", ">=", 3.0, why)]
    from ..altimetry import pressure_altitude
    from ..chain import air_data

    rng = np.random.default_rng([SEED, 1])
    p = _pressures(rng, sz["n"])
    ps, pt, tat = chain_inputs(np.random.default_rng([SEED, 5]), sz["n"])
    best = _alternate({
        "ref_pa": lambda: pressure_altitude(p),
        "port_pa": lambda: cport.pressure_altitude(p),
        "ref_chain": lambda: air_data(ps, pt, tat),
        "port_chain": lambda: cport.air_data(ps, pt, tat),
    }, sz["repeats"])
    return [
        _line("5a", t_pa, best["ref_pa"] / best["port_pa"], "x faster", None, None,
              note="for information", n=sz["n"], reference_s=best["ref_pa"],
              port_s=best["port_pa"]),
        _line("5b", t_ch, best["ref_chain"] / best["port_chain"], "x faster", ">=", 3.0,
              n=sz["n"], reference_s=best["ref_chain"], port_s=best["port_chain"]),
    ]


# --------------------------------------------------------------------------- line 6



def _callgrind_ir(exe: Path, args: list[str], work: Path) -> int:
    """Total instructions (Ir) of one run of ``exe`` under callgrind."""
    out = work / f"cg.{args[0]}.out"
    subprocess.run(["valgrind", "--tool=callgrind", f"--callgrind-out-file={out}", str(exe),
                    *args], check=True, capture_output=True, timeout=300)
    for row in out.read_text().splitlines():
        if row.startswith(("summary:", "totals:")):
            return int(row.split()[1])
    raise RuntimeError("callgrind output without a summary line")


def _callgrind_lines(sz: dict[str, int]) -> list[dict[str, Any]]:
    """Lines 6a and 6b: instructions per call, (Ir(N calls) - Ir(baseline)) / N."""
    t_ch = "C port ad_air_data: instructions per call"
    t_ma = "C port ad_mach_from_impact_pressure, supersonic: instr. per call"
    why = ""
    if shutil.which("valgrind") is None:
        why = "valgrind not installed"
    elif shutil.which("cc") is None:
        why = "no C compiler (cc)"
    if why:
        return [_missing("6a", t_ch, "instr/call", "<", 1500.0, why),
                _missing("6b", t_ma, "instr/call", None, None, why)]
    n = sz["callgrind"]
    ps, pt, tat = chain_inputs(np.random.default_rng([SEED, 5]), n)
    rng = np.random.default_rng([SEED, 1])
    _pressures(rng, sz["n"])
    qc, pss = _supersonic(rng, sz["n"])
    with tempfile.TemporaryDirectory(prefix="airdata-bench-") as tmp:
        work = Path(tmp)
        exe = work / "driver"
        from .. import resources

        srcs = sorted(str(s) for s in resources.src_dir().glob("*.c"))
        # -ffp-contract=off: the port's double-double arithmetic needs it (src/ad_dd.h).
        cmd = ["cc", "-std=c99", "-O2", "-ffp-contract=off", f"-I{resources.include_dir()}",
               str(resources.c_dir() / "tests" / "bench_driver.c"),
               *srcs, "-o", str(exe), "-lm"]
        comp = subprocess.run(cmd, capture_output=True, text=True, timeout=300)
        if comp.returncode != 0:
            errs = [r for r in comp.stderr.splitlines() if "error" in r] or ["?"]
            why = "driver did not compile: " + errs[0][-140:]
            return [_missing("6a", t_ch, "instr/call", "<", 1500.0, why),
                    _missing("6b", t_ma, "instr/call", None, None, why)]
        chain_file = work / "chain.bin"
        chain_file.write_bytes(np.concatenate([ps, pt, tat]).astype("<f8").tobytes())
        mach_file = work / "mach.bin"
        mach_file.write_bytes(np.concatenate([qc[:n], pss[:n], pss[:n]]).astype("<f8")
                              .tobytes())
        base_c = _callgrind_ir(exe, ["0", str(chain_file), str(n)], work)
        chain = _callgrind_ir(exe, ["1", str(chain_file), str(n)], work)
        base_m = _callgrind_ir(exe, ["0", str(mach_file), str(n)], work)
        mach = _callgrind_ir(exe, ["2", str(mach_file), str(n)], work)
    flags = "cc -std=c99 -O2 -lm"
    return [
        _line("6a", t_ch, (chain - base_c) / n, "instr/call", "<", 1500.0,
              calls=n, compiler=flags, inputs="chain envelope of line 5 (first N samples)"),
        _line("6b", t_ma, (mach - base_m) / n, "instr/call", None, None,
              note="for information", calls=n, compiler=flags,
              inputs="supersonic points of line 2 (first N)"),
    ]
