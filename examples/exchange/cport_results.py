"""Second-path round trip: read an ``airdata-cases`` export, run every case through the
bundled C port (its cffi module, scalar entry points), write an ``airdata-results`` file.

Nothing here reads the vector suite, and ``airdata port verify`` knows nothing of how the
results were made: any implementation in any language that reads the export and writes
these lines is verified the same way (docs/exchange.md).

    python3 -m airdata vectors export -o cases.txt
    python3 examples/exchange/cport_results.py cases.txt results.txt
    python3 -m airdata port verify results.txt

Options: ``--tamper NAME=FACTOR`` multiplies every output of function NAME by FACTOR
(a port wrong in one constant; used by the tests to prove verify catches it).

An engineering and verification aid, not certified flight software.
"""

from __future__ import annotations

import argparse
import math
import sys
from typing import Any


def _fmt(v: float) -> str:
    if math.isnan(v):
        return "nan"
    if math.isinf(v):
        return "inf" if v > 0 else "-inf"
    return float(v).hex()


def _read_number(tok: str) -> float:
    return float.fromhex(tok)  # hex floats, integers (flags), inf, -inf, nan


def run(cases_text: str, tamper: dict[str, float]) -> str:
    """Results text of every case line of ``cases_text``."""
    lines = cases_text.splitlines()
    if not lines or lines[0].split()[:2] != ["airdata-cases", "1"]:
        raise SystemExit("not an airdata-cases 1 file")
    head = lines[1].split()
    precision = head[head.index("precision") + 1]
    if precision == "binary32":
        from airdata import _cport32 as mod
    else:
        from airdata import _cport64 as mod
    ffi, lib = mod.ffi, mod.lib
    outputs: dict[str, list[str]] = {}
    out = [f"airdata-results 1 precision {precision}",
           "# written by examples/exchange/cport_results.py (bundled C port through cffi)"]
    n = 0
    for line in lines[2:]:
        toks = line.split()
        if toks[0] == "function":
            k = toks.index("outputs")
            outputs[toks[1]] = toks[k + 2:]
            continue
        if toks[0] != "case":
            continue
        cid, name, args = toks[1], toks[2], [_read_number(t) for t in toks[3:]]
        names = outputs[name]
        if len(names) > 1:
            res: Any = ffi.new(f"ad_{name}_t *")
            call = [int(a) if name == "air_data" and j == 5 else a for j, a in enumerate(args)]
            st = getattr(lib, f"ad_{name}")(*call, res)
            vals = [float(getattr(res, o)) for o in names]
        else:
            res = ffi.new("ad_real *")
            st = getattr(lib, f"ad_{name}")(*args, res)
            vals = [float(res[0])]
        f = tamper.get(name)
        if f is not None:
            vals = [v * f for v in vals]
        out.append(" ".join([cid, str(int(st)), *(_fmt(v) for v in vals)]))
        n += 1
    out.append(f"end {n}")
    return "\n".join(out) + "\n"


def main(argv: list[str] | None = None) -> int:
    ap = argparse.ArgumentParser(description=__doc__.split("\n\n")[0])
    ap.add_argument("cases")
    ap.add_argument("results")
    ap.add_argument("--tamper", action="append", default=[], metavar="NAME=FACTOR")
    a = ap.parse_args(argv)
    tamper = {t.split("=")[0]: float(t.split("=")[1]) for t in a.tamper}
    with open(a.cases, encoding="ascii") as fh:
        text = run(fh.read(), tamper)
    with open(a.results, "w", encoding="ascii", newline="\n") as fh:
        fh.write(text)
    return 0


if __name__ == "__main__":
    sys.exit(main())
