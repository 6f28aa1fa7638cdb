"""The ``airdata demo`` sub-command: the air-data chain over the invented demo sortie.

An engineering and verification aid, not certified flight software.
"""

from __future__ import annotations

import argparse
import json
import sys

import numpy as np

from .. import __version__
from ..chain import air_data
from ..notice import CAUTION
from ..profiles import PROFILES, get_profile
from ..status import Status
from ..units import from_si
from .parsers import add_command

__all__ = ["register"]

def _cmd_demo(args: argparse.Namespace) -> int:
    from ..demo import demo_readings

    rd = demo_readings()
    out = air_data(rd["ps"], rd["pt"], rd["tat"], setting=args.setting,
                   profile=args.profile)
    if args.json:
        rows = []
        for i, phase in enumerate(rd["phase"]):
            row = {"phase": str(phase), "ps_Pa": float(rd["ps"][i]), "pt_Pa": float(rd["pt"][i]),
                   "tat_K": float(rd["tat"][i])}
            for key in ("pressure_altitude", "baro_altitude", "impact_pressure", "mach", "cas",
                        "eas", "tas", "sat", "density", "density_altitude", "dynamic_pressure"):
                val = getattr(out, key)
                if val is not None:
                    row[key] = float(np.asarray(val)[i])
            row["status"] = Status(int(np.asarray(out.status)[i])).name
            rows.append(row)
        json.dump({"profile": get_profile(args.profile).as_dict(), "samples": rows},
                  sys.stdout, indent=2)
        sys.stdout.write("\n")
        return 0
    cols = [
        ("phase", "", lambda i: str(rd["phase"][i]), 16),
        ("Hp", "ft", lambda i: f"{from_si(out.pressure_altitude[i], 'ft'):9.0f}", 9),
        ("Mach", "", lambda i: f"{out.mach[i]:6.3f}", 6),
        ("CAS", "kt", lambda i: f"{from_si(out.cas[i], 'kt'):7.1f}", 7),
        ("EAS", "kt", lambda i: f"{from_si(out.eas[i], 'kt'):7.1f}", 7),
        ("TAS", "kt", lambda i: f"{from_si(out.tas[i], 'kt'):7.1f}", 7),
        ("SAT", "degC", lambda i: f"{from_si(out.sat[i], 'degC'):6.1f}", 6),
        ("Hd", "ft", lambda i: f"{from_si(out.density_altitude[i], 'ft'):9.0f}", 9),
        ("status", "", lambda i: Status(int(out.status[i])).name.lower(), 22),
    ]
    print(f"airdata {__version__} demo sortie, constants profile '{out.profile}'"
          + (f", altimeter setting {args.setting:.0f} Pa" if args.setting else ""))
    print("  ".join(f"{c[0]:>{c[3]}}" if c[0] != "phase" else f"{c[0]:<{c[3]}}" for c in cols))
    print("  ".join(f"{c[1]:>{c[3]}}" if c[0] != "phase" else f"{c[1]:<{c[3]}}" for c in cols))
    for i in range(len(rd["phase"])):
        print("  ".join(c[2](i).ljust(c[3]) if c[0] in ("phase", "status") else c[2](i)
                        for c in cols))
    print(f"\n{CAUTION}")
    return 0


def register(subparsers: argparse._SubParsersAction) -> None:
    """Add the ``demo`` sub-command to the ``airdata`` parser."""
    p = add_command(subparsers, "demo")
    p.add_argument("--profile", choices=sorted(PROFILES), default="icao",
                   help="constants profile (default: icao)")
    p.add_argument("--setting", type=float, default=None, metavar="PA",
                   help="altimeter setting in Pa for the baro-corrected altitude")
    p.add_argument("--json", action="store_true", help="machine-readable output")
    p.set_defaults(func=_cmd_demo)
