"""The ``airdata`` command line.

An engineering and verification aid, not certified flight software.
"""

from __future__ import annotations

import argparse
import json
import sys
from collections.abc import Sequence

import numpy as np

from . import __version__
from .chain import air_data
from .commands.quantities import quiet_broken_pipe
from .notice import CAUTION
from .profiles import PROFILES, get_profile
from .status import DomainError, Status
from .units import from_si


def _cmd_demo(args: argparse.Namespace) -> int:
    from .demo import demo_readings

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


def build_parser() -> argparse.ArgumentParser:
    """The argument parser of the ``airdata`` command."""
    parser = argparse.ArgumentParser(
        prog="airdata",
        description="Reference air-data equations, golden test vectors and port checks.",
        epilog=CAUTION,
    )
    parser.add_argument("--version", action="version", version=f"airdata {__version__}")
    sub = parser.add_subparsers(dest="command", metavar="COMMAND")
    demo = sub.add_parser("demo", help="run the reference over the bundled demo sortie",
                          description="Run the air-data chain over an invented demo sortie.",
                          epilog=CAUTION)
    demo.add_argument("--profile", choices=sorted(PROFILES), default="icao",
                      help="constants profile (default: icao)")
    demo.add_argument("--setting", type=float, default=None, metavar="PA",
                      help="altimeter setting in Pa for the baro-corrected altitude")
    demo.add_argument("--json", action="store_true", help="machine-readable output")
    demo.set_defaults(func=_cmd_demo)
    from . import bench, commands, limits_commands
    from .portcheck import commands as port_commands
    from .vectors import commands as vector_commands

    # The modules that add sub-commands, in the order of the help text: each has
    # register(subparsers), which adds its parsers and sets func (taking the parsed
    # namespace, returning the exit code).
    for module in (commands, limits_commands, vector_commands, bench, port_commands):
        module.register(sub)
    return parser


def main(argv: Sequence[str] | None = None) -> int:
    """Entry point of the ``airdata`` command; returns the exit code."""
    parser = build_parser()
    args = parser.parse_args(argv)
    if not hasattr(args, "func"):
        parser.print_help(sys.stderr)
        return 2
    try:
        return int(args.func(args))
    except BrokenPipeError:
        return quiet_broken_pipe()
    except (DomainError, ValueError, OSError) as exc:
        print(f"airdata: error: {exc}", file=sys.stderr)
        return 1


if __name__ == "__main__":  # pragma: no cover
    sys.exit(main())
