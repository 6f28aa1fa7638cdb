"""The envelope table of an aircraft: every limit (stall speeds, maximum operating
speed, crossover, ceiling) in CAS, EAS, TAS and Mach over a column of pressure
altitudes, and its chart.

An engineering and verification aid, not certified flight software.
"""

from __future__ import annotations

import math
from dataclasses import dataclass
from pathlib import Path
from typing import Any

import numpy as np
from numpy.typing import NDArray

from .. import _domains as dom
from .._docs import fill_doc
from .._inputs import ArrayLike
from ..aircraft import Aircraft
from ..atmosphere import atmosphere
from ..pitot import ratio_from_mach
from ..profiles import GAMMA, Profile, get_profile
from ..status import DomainError, Status
from .equations import (
    _envelope_crossover,
    max_operating_cas,
    max_operating_mach,
    stall_cas,
    stall_eas,
    stall_mach,
)

__all__ = ["SpeedSet", "Envelope", "envelope", "plot_envelope"]

F64 = NDArray[np.float64]


@dataclass(frozen=True)
class SpeedSet:
    """One speed limit expressed four ways, one value per table row.

    Attributes
    ----------
    cas, eas, tas : ndarray
        Calibrated, equivalent and true airspeed, m/s.
    mach : ndarray
        Mach number.
    """

    cas: F64
    eas: F64
    tas: F64
    mach: F64

    def as_lists(self) -> dict[str, list[float]]:
        """JSON-ready lists, m/s and Mach."""
        return {"cas_m_s": self.cas.tolist(), "eas_m_s": self.eas.tolist(),
                "tas_m_s": self.tas.tolist(), "mach": self.mach.tolist()}


@dataclass(frozen=True)
class Envelope:
    """Every limit of one aircraft over a column of pressure altitudes (SI units).

    Attributes
    ----------
    aircraft : Aircraft
        The aircraft.
    altitude : ndarray
        Geopotential pressure altitude of each row, m.
    pressure : ndarray
        Static pressure, Pa.
    sat : ndarray
        Static air temperature of the day (standard plus ``dT``), K.
    dT : float
        Temperature deviation from the standard day, K.
    load_factor : float
        Load factor of the stall speeds.
    stall_light, stall_heavy : SpeedSet
        Stall speed at the lightest and at the heaviest weight.
    max_operating : SpeedSet
        Maximum operating speed (lower of the CAS and Mach limits).
    mach_governs : ndarray of bool
        True where the Mach limit is the lower one.
    above_ceiling : ndarray of bool
        True where the row lies above the maximum altitude.
    crossover_altitude : float
        Pressure altitude where the CAS and Mach limits coincide, m (the supersonic
        pitot relation for a Mach limit above 1); NaN when they do not meet within the
        standard atmosphere [-5000, 84852] m.
    ceiling : float
        Maximum altitude (pressure altitude), m.
    profile : str
        Name of the constants profile.
    """

    aircraft: Aircraft
    altitude: F64
    pressure: F64
    sat: F64
    dT: float
    load_factor: float
    stall_light: SpeedSet
    stall_heavy: SpeedSet
    max_operating: SpeedSet
    mach_governs: NDArray[np.bool_]
    above_ceiling: NDArray[np.bool_]
    crossover_altitude: float
    ceiling: float
    profile: str

    def as_dict(self) -> dict[str, object]:
        """JSON-ready form, SI units (a crossover outside the model is null)."""
        return {
            "aircraft": self.aircraft.as_dict(), "profile": self.profile,
            "dT_K": self.dT, "load_factor": self.load_factor,
            "crossover_altitude_m": (self.crossover_altitude
                                     if math.isfinite(self.crossover_altitude) else None),
            "ceiling_m": self.ceiling,
            "altitude_m": self.altitude.tolist(), "pressure_Pa": self.pressure.tolist(),
            "sat_K": self.sat.tolist(),
            "stall_light": self.stall_light.as_lists(),
            "stall_heavy": self.stall_heavy.as_lists(),
            "max_operating": self.max_operating.as_lists(),
            "mach_governs": self.mach_governs.tolist(),
            "above_ceiling": self.above_ceiling.tolist(),
        }


def _default_altitudes(ceiling: float) -> F64:
    step = 2000.0 * 0.3048
    h = np.arange(0.0, ceiling, step)
    return np.append(h, ceiling)


@fill_doc
def envelope(
    aircraft: Aircraft | str | Path, altitudes: ArrayLike | None = None, *, dT: float = 0.0,
    load_factor: float = 1.0, profile: Profile | str | None = None,
) -> Envelope:
    """Table of every limit of an aircraft in CAS, EAS, TAS and Mach against altitude.

    Parameters
    ----------
    aircraft : Aircraft or str or Path
        The aircraft, or the path of its ``airdata-aircraft/1`` file.
    altitudes : array_like, optional
        Geopotential pressure altitudes of the rows, m, in [-5000, 84852]; default
        every 2000 ft from 0 to the ceiling, the ceiling included.
    dT : float, optional
        Temperature deviation from the standard day, K, in [-100, 100]; changes only
        the true airspeeds.
    load_factor : float, optional
        Load factor of the stall speeds, in (0, 10]; default 1.
    {profile}

    Returns
    -------
    Envelope
        The table.

    Raises
    ------
    DomainError
        Bad altitudes, ``dT`` or ``load_factor``; an aircraft whose limits are out of
        range; a stall speed beyond the model at some altitude.
    AircraftFileError, OSError
        An unreadable aircraft file.

    Notes
    -----
    Stall speeds LIM-1 and LIM-2 at the lightest and heaviest weight (mass x g0);
    maximum operating speeds LIM-4; crossover LIM-3; the maximum operating EAS and TAS
    follow from its Mach number through SPD-2 and SPD-3.
    """
    if not isinstance(aircraft, Aircraft):
        from ..aircraft import load_aircraft

        aircraft = load_aircraft(aircraft)
    prof = get_profile(profile)
    h = np.atleast_1d(np.asarray(
        _default_altitudes(aircraft.ceiling) if altitudes is None else altitudes,
        dtype=np.float64))
    if h.ndim != 1:
        raise ValueError("altitudes must be a one-dimensional sequence")
    if not (np.isfinite(load_factor) and dom.LOAD_FACTOR.lo < load_factor <= dom.LOAD_FACTOR.hi):
        raise DomainError("load_factor", float(load_factor), None, dom.LOAD_FACTOR.describe(),
                          Status.OUT_OF_RANGE if np.isfinite(load_factor) and load_factor > 0
                          else Status.INVALID_INPUT)
    atm = atmosphere(h, dT, profile=prof)
    ps = np.asarray(atm.pressure)
    sat = np.asarray(atm.temperature)
    a = np.sqrt((GAMMA * prof.R) * sat)
    root = np.sqrt(ps / prof.p0)

    def stall(weight: float) -> SpeedSet:
        eas = np.full_like(h, stall_eas(weight, aircraft.wing_area, aircraft.cl_max,
                                        load_factor, profile=prof))
        cas = np.asarray(stall_cas(weight, aircraft.wing_area, aircraft.cl_max, ps,
                                   load_factor, profile=prof))
        mach = np.asarray(stall_mach(weight, aircraft.wing_area, aircraft.cl_max, ps,
                                     load_factor, profile=prof))
        return SpeedSet(cas=cas, eas=eas, tas=mach * a, mach=mach)

    w_light, w_heavy = aircraft.weights(prof.g0)
    vmo = np.asarray(max_operating_cas(ps, aircraft.cas_limit, aircraft.mach_limit,
                                       profile=prof))
    mmo = np.asarray(max_operating_mach(ps, aircraft.cas_limit, aircraft.mach_limit,
                                        profile=prof))
    qc_cas = prof.p0 * ratio_from_mach(np.array([aircraft.cas_limit / prof.a0]))[0]
    qc_mach = ps * ratio_from_mach(np.full_like(ps, aircraft.mach_limit))
    hx = _envelope_crossover(aircraft.cas_limit, aircraft.mach_limit, prof)
    mo = SpeedSet(cas=vmo, eas=prof.a0 * mmo * root, tas=mmo * a, mach=mmo)
    return Envelope(
        aircraft=aircraft, altitude=h, pressure=ps, sat=sat, dT=float(dT),
        load_factor=float(load_factor), stall_light=stall(w_light),
        stall_heavy=stall(w_heavy), max_operating=mo,
        mach_governs=qc_mach < qc_cas,
        above_ceiling=h > aircraft.ceiling, crossover_altitude=hx,
        ceiling=aircraft.ceiling, profile=prof.name,
    )


@fill_doc
def plot_envelope(env: Envelope, path: str | Path | None = None) -> Any:
    """Chart of the envelope: CAS and TAS against pressure altitude, with limit lines.

    Parameters
    ----------
    env : Envelope
        The table from :func:`envelope`; the chart is drawn on a fine column of
        altitudes over the same range (the crossover included), not on its rows.
    path : str or Path, optional
        Write the chart there (format from the suffix: .png, .svg, .pdf).

    {Returns: out_figure}

    {Raises: no_matplotlib}
    """
    from matplotlib.figure import Figure

    kt = 1852.0 / 3600.0
    ft = 0.3048
    # Draw on a fine column with the crossover in it, so that the corner is exact.
    lo, hi = float(env.altitude.min()), float(env.altitude.max())
    fine = np.union1d(np.linspace(lo, hi, 400),
                      [env.crossover_altitude] if lo < env.crossover_altitude < hi else [])
    env = envelope(env.aircraft, fine, dT=env.dT, load_factor=env.load_factor,
                   profile=env.profile)
    fig = Figure(figsize=(11.0, 6.0), layout="constrained")
    axes = fig.subplots(1, 2, sharey=True)
    hft = env.altitude / ft
    for ax, key, title in ((axes[0], "cas", "calibrated airspeed"),
                           (axes[1], "tas", "true airspeed")):
        heavy = getattr(env.stall_heavy, key) / kt
        light = getattr(env.stall_light, key) / kt
        top = getattr(env.max_operating, key) / kt
        ax.fill_betweenx(hft, heavy, top, where=top >= heavy, color="0.92", lw=0)
        ax.plot(light, hft, "k--", lw=1.2, label="stall, lightest weight")
        ax.plot(heavy, hft, "k-", lw=1.6, label="stall, heaviest weight")
        ax.plot(top, hft, color="tab:blue", lw=1.8, label="maximum operating speed")
        ax.axhline(env.ceiling / ft, color="tab:red", lw=1.0, ls="-.",
                   label="maximum altitude")
        if np.isfinite(env.crossover_altitude):
            ax.axhline(env.crossover_altitude / ft, color="tab:blue", lw=0.8, ls=":",
                       label="CAS/Mach crossover")
        ax.set_xlabel(f"{title}, kt")
        ax.set_title(f"{key.upper()} limits")
        ax.grid(True, lw=0.4, color="0.8")
    axes[0].set_ylabel("pressure altitude, ft")
    axes[0].legend(loc="center", fontsize=8, frameon=False)
    fig.suptitle(f"Speed envelope: {env.aircraft.name} (profile {env.profile}, "
                 f"ISA {env.dT:+.0f} K, n = {env.load_factor:g})")
    if path is not None:
        fig.savefig(path, dpi=120)
    return fig
