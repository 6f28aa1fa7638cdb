"""``airdata convert``: one airspeed given, CAS, EAS, TAS and Mach out.

The flight condition is a pressure altitude (``--hp``) or a static pressure (``--ps``),
and a temperature: the static air temperature (``--sat``) or a deviation from the
standard temperature at the pressure altitude (``--isa-dev``, default 0 K).  CAS, EAS
and Mach need only the pressure; TAS needs the temperature too.
"""

from __future__ import annotations

import argparse
import json
import sys

from .. import speeds as spd
from .. import units as u
from ..altimetry import pressure_altitude, pressure_at_altitude
from ..atmosphere import atmosphere
from ..pitot import impact_pressure_from_mach
from ..profiles import get_profile
from ..status import DomainError
from ..temperature import tat_from_sat
from .parsers import add_command
from .quantities import (
    Quantity,
    add_output_units,
    add_profile,
    difference_type,
    domain_failure,
    format_value,
    output_units,
    quantity_type,
    render,
)

__all__ = ["register", "run"]

COMMAND = "convert"

DESCRIPTION = """\
Convert one airspeed into the others at a flight condition.

Give one speed (--cas, --eas, --tas or --mach), the pressure (--hp pressure altitude
or --ps static pressure) and optionally the temperature (--sat, or --isa-dev, the
deviation from the standard temperature at the pressure altitude; default ISA).

  airdata convert --cas 300kt --hp 25000ft
  airdata convert --mach 0.82 --hp 37000ft --isa-dev +10K --json
  airdata convert --tas 480kt --ps 250hPa --sat -50degC

Speed units: m/s, kt, km/h, ft/min.  Altitude units: m, ft, km.
Exit status: 0 done, 1 a value outside the model, 2 usage error.
"""


def register(subparsers: argparse._SubParsersAction) -> None:
    """Add the ``convert`` sub-command."""
    p = add_command(subparsers, COMMAND, description=DESCRIPTION, desk=True)
    speed = p.add_mutually_exclusive_group(required=True)
    speed.add_argument("--cas", type=quantity_type("speed"), metavar="V",
                       help="calibrated airspeed, e.g. 300kt")
    speed.add_argument("--eas", type=quantity_type("speed"), metavar="V",
                       help="equivalent airspeed")
    speed.add_argument("--tas", type=quantity_type("speed"), metavar="V", help="true airspeed")
    speed.add_argument("--mach", type=quantity_type("dimensionless", "1"), metavar="M",
                       help="Mach number, e.g. 0.82")
    where = p.add_mutually_exclusive_group(required=True)
    where.add_argument("--hp", type=quantity_type("length"), metavar="H",
                       help="pressure altitude, e.g. 25000ft")
    where.add_argument("--ps", type=quantity_type("pressure"), metavar="P",
                       help="static pressure, e.g. 376hPa")
    temp = p.add_mutually_exclusive_group()
    temp.add_argument("--sat", type=quantity_type("temperature"), metavar="T",
                      help="static air temperature, e.g. -45degC")
    temp.add_argument("--isa-dev", type=difference_type, metavar="DT",
                      help="deviation from the standard temperature, e.g. +10K or -5degC "
                           "(default 0K)")
    p.add_argument("--recovery", type=quantity_type("dimensionless", "1"), metavar="R",
                   default=Quantity(1.0, 1.0, "1"),
                   help="recovery factor for the TAT shown, in [0, 1] (default 1)")
    add_profile(p)
    p.add_argument("--json", action="store_true", help="machine-readable output")
    add_output_units(p)
    p.set_defaults(func=run)


def run(args: argparse.Namespace) -> int:
    """Run ``airdata convert``; returns the exit status."""
    prof = get_profile(args.profile)
    try:
        if args.hp is not None:
            hp = args.hp.si
            ps = float(pressure_at_altitude(hp, profile=prof))
        else:
            ps = args.ps.si
            hp = float(pressure_altitude(ps, profile=prof))
        isa_t = float(atmosphere(hp, profile=prof).temperature)
        if args.sat is not None:
            sat = args.sat.si
        else:
            dt = 0.0 if args.isa_dev is None else args.isa_dev.si
            sat = float(atmosphere(hp, dt, profile=prof).temperature)
        if args.cas is not None:
            given, mach = "cas", float(spd.mach_from_cas(args.cas.si, ps, profile=prof))
        elif args.eas is not None:
            given, mach = "eas", float(spd.mach_from_eas(args.eas.si, ps, profile=prof))
        elif args.tas is not None:
            given, mach = "tas", float(spd.mach_from_tas(args.tas.si, sat, profile=prof))
        else:
            given, mach = "mach", args.mach.si
        res = {
            "mach": (mach, "dimensionless"),
            "cas": (float(spd.cas_from_mach(mach, ps, profile=prof)), "speed"),
            "eas": (float(spd.eas_from_mach(mach, ps, profile=prof)), "speed"),
            "tas": (float(spd.tas_from_mach(mach, sat, profile=prof)), "speed"),
            "speed_of_sound": (float(spd.tas_from_mach(1.0, sat, profile=prof)), "speed"),
            "pressure_altitude": (hp, "length"),
            "static_pressure": (ps, "pressure"),
            "sat": (sat, "temperature"),
            "isa_deviation": (sat - isa_t, "difference"),
            "tat": (float(tat_from_sat(sat, mach, args.recovery.si)), "temperature"),
            "impact_pressure": (float(impact_pressure_from_mach(mach, ps, profile=prof)),
                                "pressure"),
            "dynamic_pressure": (float(spd.dynamic_pressure(mach, ps, profile=prof)), "pressure"),
        }
    except DomainError as exc:
        given = {"cas": args.cas, "eas": args.eas, "tas": args.tas, "mach": args.mach,
                 "sat": args.sat, "ps": args.ps, "h": args.hp, "dT": args.isa_dev}
        return domain_failure(COMMAND, exc, {k: q for k, q in given.items() if q is not None})
    ou = output_units(args)
    ou["difference"] = "K"

    def shown(key: str) -> tuple[float, str]:
        val, dim = res[key]
        return float(u.from_si(val, ou[dim])) if dim != "difference" else val, ou[dim]

    if args.json:
        doc = {
            "command": COMMAND, "profile": prof.name, "given": given,
            "outputs": {k: {"value": shown(k)[0], "unit": shown(k)[1], "si": v}
                        for k, (v, _) in res.items()},
        }
        json.dump(doc, sys.stdout, indent=2)
        sys.stdout.write("\n")
        return 0
    labels = {
        "mach": "Mach number", "cas": "calibrated airspeed CAS",
        "eas": "equivalent airspeed EAS", "tas": "true airspeed TAS",
        "speed_of_sound": "speed of sound", "pressure_altitude": "pressure altitude",
        "static_pressure": "static pressure", "sat": "static air temperature SAT",
        "isa_deviation": "deviation from ISA", "tat": "total air temperature TAT",
        "impact_pressure": "impact pressure qc", "dynamic_pressure": "dynamic pressure q",
    }
    rows = []
    for key, label in labels.items():
        val, unit = shown(key)
        mark = "  (given)" if key == given else ""
        text = f"{val:+.2f}" if key == "isa_deviation" else format_value(val, unit)
        rows.append((label, text, ("" if unit == "1" else unit) + mark))
    print(render(rows, f"airdata convert (constants profile {prof.name})"))
    return 0
