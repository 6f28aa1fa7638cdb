"""Write ``demo_flight.csv``: an invented sortie recorded by an invented air-data system.

The scenario is made up for demonstration only (no real aircraft, operator or flight):
a fictional test article taxis out, climbs, cruises, makes a supersonic dash, descends
and lands.  The flight path is a smooth blend between round waypoints; the sensor
readings are synthesised from the standard atmosphere with a warm day at low level,
then given seeded noise (transducer noise, a little turbulence), rounded to the
resolution a recorder would store, and spoiled in a few places on purpose:

* dropouts: empty fields, a whole empty sample, ``NaN`` text;
* glitches: a ``-999.00`` temperature sentinel, an ``#ERR`` field, a static-pressure
  spike, a total pressure far below the static pressure (a blocked pitot).

With ``--recorded`` the file also carries what an invented onboard air-data system
recorded (``hp_rec[ft]``, ``cas_rec[kt]``, ``mach_rec``, ``tas_rec[kt]``,
``sat_rec[degC]``), computed by the library from its own readings with an invented
instrument error (:func:`recorded_columns`): a static-source error growing with Mach,
a 0.5 kt CAS bias, recorder rounding, no airspeed below 40 kt and a few dropouts.  These
columns come from a second random stream, so the other columns are the same as
without ``--recorded``.

The output is deterministic (fixed seed).  Run ``python examples/make_demo_flight.py``
to rewrite ``examples/demo_flight.csv`` and
``python examples/make_demo_flight.py --recorded`` for
``examples/demo_flight_recorded.csv``; ``--out`` writes elsewhere.  These numbers are
never used to check results: the tests compare ``airdata reduce`` on this file with the
library called directly on the same readings.
"""

from __future__ import annotations

import argparse
import csv
from pathlib import Path

import numpy as np
from numpy.typing import NDArray

from airdata import (
    air_data,
    atmosphere,
    impact_pressure_from_mach,
    pressure_at_altitude,
    tat_from_sat,
)
from airdata.units import FT, KT

#: Invented static-source error of the onboard system: Delta ps / ps = SSE_K * Mach**2.
SSE_K = 0.0035
#: Invented CAS bias of the onboard system, kt.
CAS_BIAS_KT = 0.5
#: The invented onboard system records no airspeed, Mach or TAS below this CAS, kt.
CAS_FLOOR_KT = 40.0

SEED = 20261201
RATE_HZ = 1.0

#: (time s, pressure altitude ft, Mach, phase that starts here): invented waypoints.
WAYPOINTS: tuple[tuple[float, float, float, str], ...] = (
    (0.0, 420.0, 0.0, "taxi"),
    (180.0, 420.0, 0.0, "take-off roll"),
    (215.0, 420.0, 0.24, "initial climb"),
    (260.0, 1500.0, 0.30, "climb"),
    (1300.0, 36000.0, 0.80, "cruise"),
    (1900.0, 36000.0, 0.82, "climb to dash"),
    (2150.0, 44000.0, 1.10, "supersonic dash"),
    (2400.0, 44000.0, 1.65, "dash hold"),
    (2600.0, 44000.0, 1.65, "deceleration"),
    (2800.0, 40000.0, 0.85, "descent"),
    (3600.0, 3000.0, 0.45, "approach"),
    (3900.0, 420.0, 0.22, "landing roll"),
    (3935.0, 420.0, 0.03, "taxi in"),
    (4020.0, 420.0, 0.0, "taxi in"),
)


def _blend(t: NDArray[np.float64], col: int) -> NDArray[np.float64]:
    """Cosine blend between waypoint values: smooth, level at every waypoint."""
    tw = np.array([w[0] for w in WAYPOINTS])
    vw = np.array([w[col] for w in WAYPOINTS], dtype=np.float64)
    i = np.clip(np.searchsorted(tw, t, side="right") - 1, 0, len(tw) - 2)
    s = (t - tw[i]) / (tw[i + 1] - tw[i])
    s = 0.5 - 0.5 * np.cos(np.pi * np.clip(s, 0.0, 1.0))
    return vw[i] + (vw[i + 1] - vw[i]) * s


def _ar1(rng: np.random.Generator, n: int, sigma: float, tau: float) -> NDArray[np.float64]:
    """Red noise with standard deviation ``sigma`` and correlation time ``tau`` samples."""
    a = np.exp(-1.0 / tau)
    e = rng.normal(0.0, sigma * np.sqrt(1.0 - a * a), n)
    x = np.empty(n)
    x[0] = rng.normal(0.0, sigma)
    for k in range(1, n):
        x[k] = a * x[k - 1] + e[k]
    return x


def recorded_columns(ps: NDArray[np.float64], pt: NDArray[np.float64],
                     tat: NDArray[np.float64], mach: NDArray[np.float64],
                     rng: np.random.Generator) -> tuple[list[str], list[list[str]]]:
    """What the invented onboard system records, from the true readings (SI units).

    Its static port reads ``ps (1 + SSE_K M**2)`` (an invented static-source error
    growing with Mach), its pitot and TAT probe read true (TAT with 0.05 K noise); the
    library turns these into outputs, CAS gets a +0.5 kt bias, values are rounded as a
    recorder would store them (1 ft, 0.1 kt, 0.001 Mach, 0.1 degC), airspeeds are blank
    below 40 kt CAS, and a few fields and one 5 s stretch are lost.
    """
    n = len(ps)
    ps_ob = ps * (1.0 + SSE_K * mach * mach)
    tat_ob = tat + rng.normal(0.0, 0.05, n)
    out = air_data(ps_ob, pt, tat_ob, strict=False)
    hp = np.round(np.asarray(out.pressure_altitude) / FT, 0)
    cas = np.round(np.asarray(out.cas) / KT + CAS_BIAS_KT, 1)
    m = np.round(np.asarray(out.mach), 3)
    tas = np.round(np.asarray(out.tas) / KT, 1)
    sat = np.round(np.asarray(out.sat) - 273.15, 1)
    slow = ~(np.asarray(out.cas) / KT >= CAS_FLOOR_KT)
    cols = [[f"{v:.0f}" for v in hp],
            ["" if s else f"{v:.1f}" for v, s in zip(cas, slow, strict=True)],
            ["" if s else f"{v:.3f}" for v, s in zip(m, slow, strict=True)],
            ["" if s else f"{v:.1f}" for v, s in zip(tas, slow, strict=True)],
            [f"{v:.1f}" for v in sat]]
    for k in rng.choice(np.arange(300, n - 100), size=8, replace=False):
        cols[int(k) % len(cols)][int(k)] = ""           # single dropouts
    start = int(rng.integers(1000, n - 200))
    for c in cols:                                      # a 5 s outage of the recorder
        c[start:start + 5] = [""] * 5
    header = ["hp_rec[ft]", "cas_rec[kt]", "mach_rec", "tas_rec[kt]", "sat_rec[degC]"]
    return header, [list(r) for r in zip(*cols, strict=True)]


def make_rows(seed: int = SEED, recorded: bool = False) -> list[list[str]]:
    """The header and rows of the demo sortie, as CSV fields.

    ``recorded`` appends the onboard system's recorded outputs (:func:`recorded_columns`,
    from a second random stream: the other columns are unchanged).
    """
    rng = np.random.default_rng(seed)
    t = np.arange(0.0, WAYPOINTS[-1][0] + 1.0, 1.0 / RATE_HZ)
    n = len(t)
    hp_ft = _blend(t, 1)
    mach = _blend(t, 2)
    airborne = mach > 0.25
    hp_ft = hp_ft + np.where(airborne, _ar1(rng, n, 12.0, 20.0), 0.0)   # light turbulence
    mach = np.maximum(mach + np.where(airborne, _ar1(rng, n, 0.002, 15.0), 0.0), 0.0)
    h = hp_ft * FT
    # An invented warm day: +7 K at the field, -2 K above the tropopause, slow wander.
    dev = 7.0 - 9.0 * np.clip(h / 11000.0, 0.0, 1.0) + _ar1(rng, n, 0.3, 120.0)
    sat = np.asarray(atmosphere(h, dev).temperature)
    ps = np.asarray(pressure_at_altitude(h))
    pt = ps + np.asarray(impact_pressure_from_mach(mach, ps))
    tat = np.asarray(tat_from_sat(sat, mach))
    # Transducer noise (invented magnitudes of a plausible recorder), then storage rounding.
    ps_hpa = np.round((ps + rng.normal(0.0, 3.0, n)) / 100.0, 2)
    pt_hpa = np.round((pt + rng.normal(0.0, 5.0, n)) / 100.0, 2)
    tat_c = np.round(tat - 273.15 + rng.normal(0.0, 0.12, n), 2)
    phase_idx = np.clip(np.searchsorted([w[0] for w in WAYPOINTS], t, side="right") - 1,
                        0, len(WAYPOINTS) - 1)

    rows = [["time[s]", "ps[hPa]", "pt[hPa]", "tat[degC]", "phase"]]
    for k in range(n):
        rows.append([f"{t[k]:.1f}", f"{ps_hpa[k]:.2f}", f"{pt_hpa[k]:.2f}", f"{tat_c[k]:.2f}",
                     WAYPOINTS[phase_idx[k]][3]])

    # Spoil a few samples on purpose (rows are 1-based below the header).
    picks = rng.choice(np.arange(300, n - 100), size=14, replace=False)
    spoil = [
        (1, ""), (2, ""), (3, ""),                 # single empty fields
        (2, ""), (1, "NaN"), (3, "NaN"),           # more dropouts
        (0, "all-empty"),                          # a whole sample lost
        (3, "-999.00"), (3, "-999.00"),            # temperature sentinel
        (2, "#ERR"),                               # corrupted field
        (1, "spike"), (1, "spike"),                # static pressure spike (in the model)
        (2, "blocked"),                            # pitot far below static
        (3, "spike"),                              # a TAT spike of +25 K
    ]
    for row_i, (col, what) in zip(picks, spoil, strict=True):
        r = rows[int(row_i) + 1]
        if what == "all-empty":
            r[1] = r[2] = r[3] = ""
        elif what == "spike" and col == 1:
            r[1] = f"{float(r[1]) * 0.93:.2f}"
        elif what == "spike" and col == 3:
            r[3] = f"{float(r[3]) + 25.0:.2f}"
        elif what == "blocked":
            r[2] = f"{float(r[1]) - 40.0:.2f}"
        else:
            r[col] = what
    if recorded:
        head, rec = recorded_columns(ps, pt, tat, mach, np.random.default_rng(seed + 1))
        rows[0].extend(head)
        for r, extra in zip(rows[1:], rec, strict=True):
            r.extend(extra)
    return rows


def main() -> None:
    """Write the demo file."""
    ap = argparse.ArgumentParser(description="Write the invented demo sortie as CSV.")
    ap.add_argument("--out", type=Path, default=None,
                    help="file written (default: demo_flight.csv, or "
                         "demo_flight_recorded.csv with --recorded, beside this script)")
    ap.add_argument("--seed", type=int, default=SEED)
    ap.add_argument("--recorded", action="store_true",
                    help="add the invented onboard system's recorded outputs (*_rec)")
    args = ap.parse_args()
    if args.out is None:
        name = "demo_flight_recorded.csv" if args.recorded else "demo_flight.csv"
        args.out = Path(__file__).with_name(name)
    rows = make_rows(args.seed, args.recorded)
    with open(args.out, "w", newline="", encoding="utf-8") as f:
        csv.writer(f, lineterminator="\n").writerows(rows)
    print(f"wrote {len(rows) - 1} samples to {args.out}")


if __name__ == "__main__":
    main()
