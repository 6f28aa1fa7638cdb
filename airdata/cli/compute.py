"""``airdata compute``: one air-data computation from the three sensor readings.

Static pressure, total pressure and total air temperature in, each with its unit
(``--ps 250hPa --pt 312.5hPa --tat -20degC``); every output of
:func:`airdata.air_data` out, as a readable table in the chosen units or as JSON.
"""

from __future__ import annotations

import argparse
import json
import sys

import numpy as np

from .. import units as u
from ..chain import NOISE_BAND, OUTPUT_INFO, air_data
from ..profiles import get_profile
from ..status import DomainError, Status
from .parsers import add_command
from .quantities import (
    Quantity,
    add_output_units,
    add_profile,
    domain_failure,
    format_value,
    output_units,
    quantity_type,
    render,
)

__all__ = ["register", "run", "OUTPUT_ROWS"]

COMMAND = "compute"

#: (key of AirData, label, dimension) in display order.
OUTPUT_ROWS: tuple[tuple[str, str, str], ...] = tuple(
    (o.key, f"{o.words} {o.symbol}".rstrip(), o.dimension)
    for key in ("pressure_altitude", "baro_altitude", "density_altitude", "impact_pressure",
                "dynamic_pressure", "mach", "cas", "eas", "tas", "sat", "density")
    for o in OUTPUT_INFO if o.key == key)

DESCRIPTION = """\
Compute every air-data output from one set of sensor readings: static pressure,
total (pitot) pressure and total air temperature, each written with its unit.

  airdata compute --ps 250hPa --pt 312.5hPa --tat -20degC
  airdata compute --ps 29.92inHg --pt 30.5inHg --tat 15degC --setting 30.12inHg --json

Pressure units: Pa, hPa, mbar, kPa, inHg.  Temperature units: K, degC, degF.
Exit status: 0 done, 1 a reading outside the model, 2 usage error (e.g. a bad unit).
"""


def register(subparsers: argparse._SubParsersAction) -> None:
    """Add the ``compute`` sub-command."""
    p = add_command(subparsers, COMMAND, description=DESCRIPTION, desk=True)
    p.add_argument("--ps", type=quantity_type("pressure"), required=True, metavar="P",
                   help="static pressure, e.g. 250hPa")
    p.add_argument("--pt", type=quantity_type("pressure"), required=True, metavar="P",
                   help="total (pitot) pressure, e.g. 312.5hPa")
    p.add_argument("--tat", type=quantity_type("temperature"), required=True, metavar="T",
                   help="total air temperature, e.g. -20degC")
    p.add_argument("--setting", type=quantity_type("pressure"), metavar="P",
                   help="altimeter setting, e.g. 1013.2hPa or 29.92inHg (adds the "
                        "baro-corrected altitude)")
    p.add_argument("--recovery", type=quantity_type("dimensionless", "1"), metavar="R",
                   default=Quantity(1.0, 1.0, "1"),
                   help="recovery factor of the TAT probe, in [0, 1] (default 1)")
    p.add_argument("--noise-band", type=quantity_type("pressure"), metavar="P",
                   help=f"negative impact pressure read as zero (default {NOISE_BAND:g}Pa)")
    add_profile(p)
    p.add_argument("--json", action="store_true", help="machine-readable output")
    add_output_units(p)
    p.set_defaults(func=run)


def run(args: argparse.Namespace) -> int:
    """Run ``airdata compute``; returns the exit status."""
    noise = NOISE_BAND if args.noise_band is None else args.noise_band.si
    try:
        out = air_data(args.ps.si, args.pt.si, args.tat.si, args.recovery.si,
                       None if args.setting is None else args.setting.si,
                       noise_band=noise, profile=args.profile)
    except DomainError as exc:
        return domain_failure(COMMAND, exc, {
            "ps": args.ps, "pt": args.pt, "tat": args.tat, "setting": args.setting,
            "recovery": args.recovery, "noise_band": args.noise_band})
    ou = output_units(args)
    status = Status(int(np.asarray(out.status)))
    rows = [(key, label, dim) for key, label, dim in OUTPUT_ROWS
            if getattr(out, key) is not None]
    inputs = [("ps", "static pressure", args.ps), ("pt", "total pressure", args.pt),
              ("tat", "total air temperature", args.tat)]
    if args.setting is not None:
        inputs.append(("setting", "altimeter setting", args.setting))
    if args.json:
        doc = {
            "command": COMMAND,
            "profile": get_profile(args.profile).name,
            "inputs": {k: {"value": q.value, "unit": q.unit, "si": q.si}
                       for k, _, q in inputs},
            "recovery": args.recovery.si,
            "noise_band_Pa": noise,
            "outputs": {key: {"value": float(u.from_si(getattr(out, key), ou[dim])),
                              "unit": ou[dim],
                              "si": float(getattr(out, key))}
                        for key, _, dim in rows},
            "status": status.name,
        }
        json.dump(doc, sys.stdout, indent=2)
        sys.stdout.write("\n")
        return 0
    table = [(f"{label} {k}", format_value(q.value, q.unit), q.unit) for k, label, q in inputs]
    table.append(("TAT probe recovery factor", f"{args.recovery.si:g}", ""))
    print(render(table, f"airdata compute (constants profile {out.profile})\ninputs"))
    out_rows = [(label, format_value(float(u.from_si(getattr(out, key), ou[dim])), ou[dim]),
                 "" if ou[dim] == "1" else ou[dim]) for key, label, dim in rows]
    print(render(out_rows, "outputs"))
    note = " (negative impact pressure within the noise band, read as zero)" \
        if status == Status.IMPACT_PRESSURE_ZEROED else ""
    print(f"status: {status.name}{note}")
    return 0
