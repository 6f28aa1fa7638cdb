"""``airdata table``: the standard atmosphere over an altitude range.

Rows from ``--from`` to ``--to`` (both included when on the grid) every ``--step``,
geopotential altitudes unless ``--geometric``; an off-standard day with ``--isa-dev``.
Output as a readable table, ``--csv`` (every column named with its unit) or ``--json``.
"""

from __future__ import annotations

import argparse
import csv
import json
import math
import sys

import numpy as np

from .. import units as u
from ..atmosphere import atmosphere, geometric_altitude, geopotential_altitude
from ..profiles import Profile, get_profile
from ..status import DomainError
from . import quantities as qty
from .messages import fail
from .parsers import add_command

__all__ = ["register", "run", "MAX_ROWS"]

COMMAND = "table"

#: Most rows of one table.
MAX_ROWS = 100000

DESCRIPTION = """\
Print the standard atmosphere over an altitude range.

  airdata table --from 0ft --to 50000ft --step 5000ft
  airdata table --from 0m --to 80km --step 5km --si --profile us1976 --csv
  airdata table --to 20000m --step 1000m --geometric --isa-dev +15K --json

Columns: h (geopotential altitude), z (geometric altitude), T, p, rho (density),
a (speed of sound), theta = T/T0, delta = p/p0, sigma = rho/rho0, mu (dynamic
viscosity, Pa s), nu (kinematic viscosity, m2/s).  Altitude units: m, ft, km.
Rows beyond the ends of the model are left out, with a note that says so.
Exit status: 0 done, 1 a range wholly outside the model, 2 usage error.
"""


def register(subparsers: argparse._SubParsersAction) -> None:
    """Add the ``table`` sub-command."""
    p = add_command(subparsers, COMMAND, description=DESCRIPTION, desk=True)
    p.add_argument("--from", dest="start", type=qty.quantity_type("length"), metavar="H",
                   default=qty.Quantity(0.0, 0.0, "ft"), help="first altitude (default 0ft)")
    p.add_argument("--to", dest="stop", type=qty.quantity_type("length"), metavar="H",
                   default=qty.Quantity(50000 * u.FT, 50000.0, "ft"),
                   help="last altitude (default 50000ft)")
    p.add_argument("--step", type=qty.quantity_type("length"), metavar="H",
                   default=qty.Quantity(5000 * u.FT, 5000.0, "ft"), help="step (default 5000ft)")
    p.add_argument("--geometric", action="store_true",
                   help="the range is in geometric altitude (default: geopotential)")
    p.add_argument("--isa-dev", type=qty.difference_type, metavar="DT",
                   default=qty.Quantity(0.0, 0.0, "K"),
                   help="temperature deviation of an off-standard day, e.g. +15K")
    qty.add_profile(p)
    fmt = p.add_mutually_exclusive_group()
    fmt.add_argument("--csv", action="store_true", help="CSV, every column named with its unit")
    fmt.add_argument("--json", action="store_true", help="machine-readable output")
    qty.add_output_units(p)
    p.set_defaults(func=run, _parser=p)


def run(args: argparse.Namespace) -> int:
    """Run ``airdata table``; returns the exit status."""
    parser: argparse.ArgumentParser = args._parser
    start, stop, step = args.start.si, args.stop.si, args.step.si
    if step <= 0.0:
        parser.error(f"--step {args.step} must be positive")
    if stop < start:
        parser.error(f"--to {args.stop} is below --from {args.start}")
    count = math.floor((stop - start) / step * (1.0 + 1e-12) + 1e-9) + 1
    if count > MAX_ROWS:
        parser.error(f"{count} rows: at most {MAX_ROWS}; give a larger --step")
    prof = get_profile(args.profile)
    grid = start + step * np.arange(count, dtype=np.float64)
    ou = qty.output_units(args)
    with np.errstate(invalid="ignore"):
        if args.geometric:
            z = grid
            h = np.asarray(geopotential_altitude(z, profile=prof, strict=False))
        else:
            h = grid
            z = np.asarray(geometric_altitude(h, profile=prof, strict=False))
    inside = np.isfinite(h) & np.isfinite(z)
    lo, hi = _model_range(prof, args.geometric)
    shown = ou["length"]
    model = f"[{_alt(lo, shown)}, {_alt(hi, shown)}] {shown}"
    if not inside.any():
        return fail(COMMAND, f"--from {args.start} to --to {args.stop} lies outside the "
                             f"model, which covers {model} "
                             f"({'geometric' if args.geometric else 'geopotential'})")
    note = None
    if not inside.all():
        gone = int((~inside).sum())
        note = (f"note: {gone} row(s) outside the model omitted; it covers {model} "
                f"({'geometric' if args.geometric else 'geopotential'} altitude)")
        h, z = h[inside], z[inside]
    try:
        atm = atmosphere(h, args.isa_dev.si, profile=prof)
    except DomainError as exc:
        return qty.domain_failure(COMMAND, exc, {"dT": args.isa_dev})
    temp = np.asarray(atm.temperature)
    pres = np.asarray(atm.pressure)
    rho = np.asarray(atm.density)
    cols = [
        ("h", ou["length"], u.from_si(h, ou["length"])),
        ("z", ou["length"], u.from_si(z, ou["length"])),
        ("T", ou["temperature"], u.from_si(temp, ou["temperature"])),
        ("p", ou["pressure"], u.from_si(pres, ou["pressure"])),
        ("rho", "kg/m3", rho),
        ("a", ou["speed"], u.from_si(np.asarray(atm.speed_of_sound), ou["speed"])),
        ("theta", "1", temp / prof.T0),
        ("delta", "1", pres / prof.p0),
        ("sigma", "1", rho / prof.rho0),
        ("mu", "Pa s", np.asarray(atm.dynamic_viscosity)),
        ("nu", "m2/s", np.asarray(atm.kinematic_viscosity)),
    ]
    if args.geometric:  # the given altitude first
        cols[0], cols[1] = cols[1], cols[0]
    data = np.column_stack([np.atleast_1d(np.asarray(c[2], dtype=np.float64)) for c in cols])
    if args.json:
        doc = {
            "command": COMMAND, "profile": prof.name, "isa_deviation_K": args.isa_dev.si,
            "note": note,
            "altitude": "geometric" if args.geometric else "geopotential",
            "units": {name: unit for name, unit, _ in cols},
            "rows": [dict(zip([c[0] for c in cols], row, strict=True))
                     for row in data.tolist()],
        }
        json.dump(doc, sys.stdout, indent=2)
        sys.stdout.write("\n")
        return 0
    if args.csv:
        w = csv.writer(sys.stdout, lineterminator="\n")
        w.writerow([f"{name}[{unit}]" for name, unit, _ in cols])
        w.writerows(data.tolist())
        if note:
            print(note, file=sys.stderr)
        return 0
    cells = [[_cell(v, unit) for v, (_, unit, _) in zip(row, cols, strict=True)]
             for row in data.tolist()]
    heads = [name for name, _, _ in cols]
    unit_row = ["" if unit == "1" else unit for _, unit, _ in cols]
    widths = [max(len(heads[j]), len(unit_row[j]), *(len(r[j]) for r in cells))
              for j in range(len(cols))]
    kind = "geometric" if args.geometric else "geopotential"
    dev = f", ISA {args.isa_dev.si:+g} K" if args.isa_dev.si else ""
    print(f"airdata table (constants profile {prof.name}, {kind} range{dev})")
    print("  ".join(h.rjust(w) for h, w in zip(heads, widths, strict=True)))
    print("  ".join(s.rjust(w) for s, w in zip(unit_row, widths, strict=True)))
    for r in cells:
        print("  ".join(s.rjust(w) for s, w in zip(r, widths, strict=True)))
    if note:
        print(note)
    return 0


def _model_range(prof: Profile, geometric: bool) -> tuple[float, float]:
    """Ends of the layer model, m, in the altitude the range is given in."""
    lo, hi = prof.h_min, prof.h_max
    if geometric:
        lo, hi = (float(geometric_altitude(v, profile=prof)) for v in (lo, hi))
    return lo, hi


def _alt(value_m: float, unit: str) -> str:
    return f"{float(u.from_si(value_m, unit)):.6g}"


def _cell(value: float, unit: str) -> str:
    if unit in ("Pa s", "m2/s"):
        return f"{value:.4e}"
    if unit == "kg/m3":
        return f"{value:.5g}"
    if unit == "Pa" or unit == "1":
        return f"{value:.5g}" if unit == "1" else f"{value:.1f}"
    return qty.format_value(value, unit).replace(",", "")
