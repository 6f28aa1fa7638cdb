"""Sub-commands ``airdata limits`` (envelope table of an aircraft file) and
``airdata budget`` (sensor error budget over an altitude by CAS grid).

Registered by :func:`airdata.cli.build_parser`.
"""

from __future__ import annotations

import argparse
import json
import math
import sys
from typing import Any

import numpy as np

from ..notice import CAUTION
from ..status import DomainError
from ..units import from_si, to_si
from .accuracy import SensorTerm, parse_accuracy
from .parsers import add_command
from .quantities import add_profile, quantity_type

__all__ = ["register"]

_KT = 1852.0 / 3600.0
_FT = 0.3048


def _float_list(text: str) -> list[float]:
    """A comma-separated list of numbers, or START:STOP:STEP (STOP included)."""
    try:
        if ":" in text:
            start, stop, step = (float(p) for p in text.split(":"))
            if step <= 0 or stop < start:
                raise ValueError
            n = int(np.floor((stop - start) / step + 1e-9)) + 1
            return [start + k * step for k in range(n)]
        return [float(p) for p in text.split(",") if p.strip()]
    except ValueError:
        raise argparse.ArgumentTypeError(
            f"{text!r}: expected a comma-separated list or START:STOP:STEP") from None


def _dump(obj: dict[str, Any]) -> None:
    json.dump(obj, sys.stdout, indent=2, allow_nan=True)
    sys.stdout.write("\n")


# ------------------------------------------------------------------------------ limits


def _cmd_limits(args: argparse.Namespace) -> int:
    from ..limits import envelope, plot_envelope

    alts = None if args.alt_ft is None else to_si(np.asarray(args.alt_ft), "ft")
    env = envelope(args.aircraft_file, alts, dT=args.dT, load_factor=args.load_factor,
                   profile=args.profile)
    if args.plot:
        plot_envelope(env, args.plot)
    if args.json:
        _dump(env.as_dict())
        return 0
    ac = env.aircraft
    wl, wh = ac.weights()
    print(f"Speed envelope of '{ac.name}'")
    print(f"  constants profile {env.profile}, standard day {env.dT:+g} K, "
          f"load factor {env.load_factor:g}")
    print(f"  mass {ac.mass_min:,.0f} .. {ac.mass_max:,.0f} kg (weight {wl:,.0f} .. "
          f"{wh:,.0f} N), wing area {ac.wing_area:g} m2, CLmax {ac.cl_max:g}")
    hx = env.crossover_altitude
    cross = (f"crossover at {from_si(hx, 'ft'):,.0f} ft" if math.isfinite(hx) else
             "no crossover inside the standard atmosphere (the "
             + ("Mach" if env.mach_governs[0] else "CAS") + " limit governs throughout)")
    print(f"  CAS limit {from_si(ac.cas_limit, 'kt'):.1f} kt, Mach limit {ac.mach_limit:.3f}, "
          f"{cross}, "
          f"maximum altitude {from_si(env.ceiling, 'ft'):,.0f} ft (pressure altitude)")
    print()
    groups = (("stall, heaviest", env.stall_heavy), ("stall, lightest", env.stall_light),
              ("maximum operating", env.max_operating))
    head1 = f"{'Hp':>7} {'ps':>7} {'SAT':>6} "
    head2 = f"{'ft':>7} {'hPa':>7} {'degC':>6} "
    # speeds take 5 characters, 6 when a supersonic aircraft's TAS passes 999.9 kt
    w = max(5, *(len(f"{float(np.nanmax(s.tas)) / _KT:.1f}") for _, s in groups
                 if np.isfinite(s.tas).any()))
    for title, _ in groups:
        head1 += f"| {title:<{3 * w + 10}}"
        head2 += f"| {'CAS':>{w}} {'EAS':>{w}} {'TAS':>{w}} {'Mach':>6} "
    head1 += "| by"
    head2 += "|"
    print(head1)
    print(head2 + "   (speeds in kt)")
    for i in range(env.altitude.size):
        row = (f"{from_si(env.altitude[i], 'ft'):7.0f} {env.pressure[i] / 100.0:7.1f} "
               f"{from_si(env.sat[i], 'degC'):6.1f} ")
        for _, s in groups:
            row += (f"| {s.cas[i] / _KT:{w}.1f} {s.eas[i] / _KT:{w}.1f} "
                    f"{s.tas[i] / _KT:{w}.1f} {s.mach[i]:6.3f} ")
        row += "| " + ("Mach" if env.mach_governs[i] else "CAS")
        if env.above_ceiling[i]:
            row += " (above maximum altitude)"
        print(row)
    if args.plot:
        print(f"\nchart written to {args.plot}")
    print(f"\n{CAUTION}")
    return 0


# ------------------------------------------------------------------------------ budget

def _sensor_terms(args: argparse.Namespace) -> dict[str, SensorTerm]:
    """Every sensor accuracy option read (pressures in any unit, % of reading or FS)."""
    out = {}
    for key in ("ps", "pitot", "tat"):
        fs = getattr(args, f"{key}_full_scale", None)
        for what in ("bias", "noise"):
            text = getattr(args, f"{key}_{what}")
            out[f"{key}_{what}"] = parse_accuracy(
                text, f"--{key}-{what}", "temperature" if key == "tat" else "pressure",
                None if fs is None else fs.si, f"--{key}-full-scale", noise=what == "noise")
    return out


def _cmd_budget(args: argparse.Namespace) -> int:
    from ..budget import (
        ACCURACY_LIMITS,
        DISPLAY_UNITS,
        OUTPUTS,
        SensorAccuracy,
        error_budget,
        plot_budget,
    )

    outputs = OUTPUTS if args.outputs is None else tuple(args.outputs.split(","))
    for o in outputs:
        if o not in OUTPUTS:
            raise ValueError(f"unknown output {o!r}: choose from {', '.join(OUTPUTS)}")
    terms = _sensor_terms(args)
    try:
        acc = SensorAccuracy(
            **{k: t.absolute for k, t in terms.items()},
            **{f"{k}_rel": t.of_reading for k, t in terms.items() if not k.startswith("tat")})
    except DomainError as exc:  # name the option and the value as the user wrote them
        key = exc.argument.removesuffix("_rel")
        kind = key.split("_")[1] + ("_rel" if exc.argument.endswith("_rel") else "")
        lo, hi = ACCURACY_LIMITS[kind]
        if kind.endswith("_rel"):
            limit = f"the part in % of reading must lie in [{lo * 100:g}, {hi * 100:g}] %"
        elif key.startswith("tat"):
            limit = f"the temperature must lie in [{lo:g}, {hi:g}] K"
        else:
            limit = (f"the fixed part must lie in [{lo / 100:g}, {hi / 100:g}] hPa (it is "
                     f"{terms[key].absolute / 100.0:g} hPa)")
        raise ValueError(f"--{key.replace('_', '-')} {terms[key].text!r}: {limit}") from None
    # the pressure unit the user wrote (the first one given), for the chart and the text
    given = [terms[k] for k in ("ps_bias", "ps_noise", "pitot_bias", "pitot_noise")
             if terms[k].text.strip() not in ("0", "")]
    punit = given[0].unit if given else "hPa"
    method = "monte_carlo" if args.monte_carlo else "linear"
    bud = error_budget(to_si(np.asarray(args.alt_ft), "ft"),
                       to_si(np.asarray(args.cas_kt), "kt"), acc, pitot=args.pitot_sensor,
                       recovery=args.recovery, dT=args.dT, method=method,
                       samples=args.monte_carlo or 2, seed=args.seed, profile=args.profile)
    if args.plot:
        plot_budget(bud, outputs, quantity=args.quantity, path=args.plot, pressure_unit=punit)
    if args.json:
        _dump(bud.as_dict())
        return 0
    alt_ft = np.asarray(from_si(bud.altitude, "ft"))
    cas_kt = np.asarray(from_si(bud.cas, "kt"))
    print(f"Air-data error budget, constants profile {bud.profile}, standard day "
          f"{bud.dT:+g} K, TAT recovery {bud.recovery:g}, pitot sensor: "
          + ("impact pressure (differential)" if bud.pitot == "qc"
             else "total pressure (absolute)"))
    print("\nPressure altitude per hPa of static-pressure error:")
    for h, s in zip(alt_ft, bud.altitude_per_ps, strict=True):
        print(f"  {h:8.0f} ft   {-s * 100.0 / _FT:8.2f} ft/hPa")
    name = "impact" if bud.pitot == "qc" else "total"
    print(f"\nCAS per hPa of {name}-pressure error:")
    for v, s in zip(cas_kt, bud.cas_per_qc, strict=True):
        print(f"  {v:6.0f} kt   {s * 100.0 / _KT:8.3f} kt/hPa")
    if not (acc.bias.any() or acc.noise.any()):
        print("\nNo sensor accuracies given (--ps-noise, --pitot-bias, ...): "
              "sensitivities only.")
        print(f"\n{CAUTION}")
        return 0
    print(f"\nSensors (bias / noise, 1 sd): "
          f"{acc.describe(punit).replace('pitot', bud.pitot, 1)}")
    how = ("linear propagation" if method == "linear"
           else f"Monte Carlo, {bud.samples} samples, seed {bud.seed}")
    data = getattr(bud, args.quantity)
    for o in outputs:
        unit = DISPLAY_UNITS[o]
        z = data[o] if unit in ("1", "K") else np.asarray(from_si(data[o], unit))
        fmt = "{:9.4f}" if unit == "1" else "{:9.2f}"
        print(f"\n{o.replace('_', ' ')}: {args.quantity} error, "
              f"{'Mach' if unit == '1' else unit} ({how}); rows Hp ft, columns CAS kt")
        print(f"{'':>8} " + " ".join(f"{v:9.0f}" for v in cas_kt))
        for i, h in enumerate(alt_ft):
            print(f"{h:8.0f} " + " ".join(fmt.format(x) for x in z[i]))
    if args.plot:
        print(f"\nchart written to {args.plot}")
    print(f"\n{CAUTION}")
    return 0


def _add_outputs(parser: argparse.ArgumentParser, plot: str) -> None:
    """``--profile``, ``--plot`` (which draws ``plot``) and ``--json``, for both commands."""
    add_profile(parser, "constants profile (default: icao)")
    parser.add_argument("--plot", metavar="FILE", default=None,
                        help=f"write {plot} (.png, .svg, .pdf; needs matplotlib)")
    parser.add_argument("--json", action="store_true",
                        help="machine-readable output (SI units)")


def _add_dT(parser: argparse.ArgumentParser) -> None:
    """``--dT``: the day's temperature deviation, for both commands."""
    parser.add_argument("--dT", type=float, default=0.0, metavar="K",
                        help="temperature deviation from the standard day, K (default 0)")


def register(subparsers: Any) -> None:
    """Add the ``limits`` and ``budget`` sub-commands to the ``airdata`` parser."""

    lim = add_command(subparsers, "limits")
    lim.add_argument("aircraft_file", metavar="AIRCRAFT_FILE",
                     help="aircraft data file (see examples/demo_aircraft.toml)")
    lim.add_argument("--alt-ft", type=_float_list, default=None, metavar="LIST",
                     help="pressure altitudes in ft, 'a,b,c' or START:STOP:STEP "
                          "(default: every 2000 ft up to the maximum altitude)")
    _add_dT(lim)
    lim.add_argument("--load-factor", type=float, default=1.0, metavar="N",
                     help="load factor of the stall speeds (default 1)")
    _add_outputs(lim, "a chart of the envelope")
    lim.set_defaults(func=_cmd_limits)

    bud = add_command(subparsers, "budget")
    bud.add_argument("--alt-ft", type=_float_list, default=_float_list("0:40000:5000"),
                     metavar="LIST", help="pressure altitudes, ft (default 0:40000:5000)")
    bud.add_argument("--cas-kt", type=_float_list, default=_float_list("100:350:50"),
                     metavar="LIST", help="calibrated airspeeds, kt (default 100:350:50)")
    bud.add_argument("--pitot-sensor", choices=("qc", "pt"), default="qc",
                     help="second pressure sensor: differential impact pressure (qc, default) "
                          "or absolute total pressure (pt)")
    for key, what in (("ps", "static pressure"), ("pitot", "pitot sensor")):
        bud.add_argument(f"--{key}-bias", default="0", metavar="P",
                         help=f"{what} bias: a pressure (0.5hPa, 50Pa, 0.015inHg, 0.007psi; a "
                              "bare number is hPa), a percentage of reading (0.02%%) or of "
                              "full scale (0.05%%FS), or a sum (0.1hPa+0.01%%); default 0")
        bud.add_argument(f"--{key}-noise", default="0", metavar="P",
                         help=f"{what} noise standard deviation, same forms (default 0)")
        bud.add_argument(f"--{key}-full-scale", type=quantity_type("pressure", "hPa"),
                         default=None, metavar="P",
                         help=f"{what} full scale, for percentages of full scale (e.g. "
                              "1300hPa)")
    bud.add_argument("--tat-bias", default="0", metavar="DT",
                     help="total air temperature bias: 0.5 (K), 0.5K, 0.5degC, 0.9degF "
                          "(default 0)")
    bud.add_argument("--tat-noise", default="0", metavar="DT",
                     help="total air temperature noise standard deviation, same forms "
                          "(default 0)")
    bud.add_argument("--recovery", type=float, default=1.0, metavar="R",
                     help="TAT probe recovery factor (default 1)")
    _add_dT(bud)
    bud.add_argument("--monte-carlo", type=int, default=0, metavar="N",
                     help="sample the full chain N times per grid point instead of "
                          "linear propagation")
    bud.add_argument("--seed", type=int, default=0, help="Monte Carlo seed (default 0)")
    bud.add_argument("--quantity", choices=("rms", "sd", "shift"), default="rms",
                     help="what the tables and plot show (default rms)")
    bud.add_argument("--outputs", default=None, metavar="LIST",
                     help="comma-separated outputs (default: pressure_altitude,cas,mach,"
                          "tas,sat,eas)")
    _add_outputs(bud, "error-budget maps")
    bud.set_defaults(func=_cmd_budget)
