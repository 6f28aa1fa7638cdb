"""``reduce --plot``: the main outputs against time, as plain engineering charts.

matplotlib is an optional extra, imported only when a plot is asked for.  The samples
kept for the chart are bounded (:class:`Collector`): on a long file every k-th row is
kept, k doubling whenever the bound is reached, so memory stays flat.
"""

from __future__ import annotations

from typing import Any

import numpy as np
from numpy.typing import NDArray

from .. import units as u
from ..status import Status
from .timebase import TimeAxis

__all__ = ["PlotUnavailableError", "check_available", "check_extension", "Collector", "draw",
           "rejected", "PLOT_EXTENSIONS"]

#: File extensions ``--plot`` can write.
PLOT_EXTENSIONS = (".png", ".pdf", ".svg")

_FIELDS = ("x", "hp", "hbaro", "cas", "eas", "tas", "mach", "sat", "tat", "status")


class PlotUnavailableError(RuntimeError):
    """matplotlib is not installed."""


def check_available() -> None:
    """Raise :class:`PlotUnavailableError` with advice when matplotlib cannot be imported."""
    try:
        import matplotlib  # noqa: F401
    except ImportError:
        raise PlotUnavailableError(
            "--plot needs matplotlib, which is not installed: pip install matplotlib "
            "(or run without --plot)") from None


def check_extension(path: str) -> None:
    """Raise ``ValueError`` naming the extensions that work when ``path`` has another one."""
    import os
    ext = os.path.splitext(path)[1].lower()
    if ext not in PLOT_EXTENSIONS:
        raise ValueError(f"--plot {path}: extension {ext or '(none)'!r} cannot be drawn; use "
                         f"one of {', '.join(PLOT_EXTENSIONS)}")
    folder = os.path.dirname(os.path.abspath(path))
    if not os.path.isdir(folder):
        raise ValueError(f"--plot {path}: folder {folder} does not exist")


class Collector:
    """Samples kept for the chart: at most ``limit``, every ``stride``-th row.

    Rejected rows are counted over the whole file and their abscissas kept apart (with
    their own bound), so the chart marks them even where the curves are thinned out.

    Parameters
    ----------
    limit : int
        Most samples kept (and most rejected rows marked).
    plan : object
        The reduce plan (tells whether a time column exists and its unit).
    units : dict of str to str
        Output unit per dimension.
    timeaxis : TimeAxis or None
        Reader of the time column (None when the file has none: the row number is used).
    """

    def __init__(self, limit: int, plan: Any, units: dict[str, str],
                 timeaxis: TimeAxis | None = None) -> None:
        self.limit = limit
        self.stride = 1
        self.next_row = 0
        self.units = units
        self.timeaxis = timeaxis
        time_col = plan.roles.get("time")
        self.time_name = time_col.name if time_col is not None else None
        self.time_unit = plan.role_units.get("time", "") if time_col is not None else ""
        self.data: dict[str, list[NDArray[np.float64]]] = {k: [] for k in _FIELDS}
        self.kept = 0
        self.rows = 0
        self.rejected = 0
        self.marks: list[NDArray[np.float64]] = []
        self.mark_stride = 1
        self.marked = 0

    @property
    def x_label(self) -> str:
        """Label of the abscissa."""
        if self.time_name is None:
            return "row"
        if self.timeaxis is not None:
            return self.timeaxis.label(self.time_name, self.time_unit or "")
        return f"{self.time_name} [{self.time_unit}]".replace(" []", "")

    def add(self, chunk: Any) -> None:
        """Keep every ``stride``-th row of a reduced chunk; count and mark rejected rows."""
        n = len(chunk.status)
        rows = self.next_row + np.arange(n)
        self.next_row += n
        self.rows += n
        sel = rows % self.stride == 0
        out = chunk.out
        x = chunk.time if chunk.time is not None else (rows + 1).astype(np.float64)
        bad = rejected(chunk.status)
        self.rejected += int(bad.sum())
        if bad.any():
            xb = np.asarray(x, dtype=np.float64)[bad]
            self.marks.append(xb[(np.arange(xb.size) + self.marked) % self.mark_stride == 0])
            self.marked += xb.size
            if sum(m.size for m in self.marks) > self.limit:
                self.marks = [np.concatenate(self.marks)[::2]]
                self.mark_stride *= 2
        lu, su, tu = self.units["length"], self.units["speed"], self.units["temperature"]
        cols = {
            "x": x, "hp": u.from_si(out.pressure_altitude, lu),
            "hbaro": (u.from_si(out.baro_altitude, lu) if out.baro_altitude is not None
                      else np.full(n, np.nan)),
            "cas": u.from_si(out.cas, su), "eas": u.from_si(out.eas, su),
            "tas": u.from_si(out.tas, su), "mach": out.mach,
            "sat": u.from_si(out.sat, tu), "tat": u.from_si(chunk.tat, tu),
            "status": chunk.status.astype(np.float64),
        }
        for k in _FIELDS:
            self.data[k].append(np.asarray(cols[k], dtype=np.float64)[sel])
        self.kept += int(sel.sum())
        if self.kept > self.limit:
            for k in _FIELDS:
                self.data[k] = [np.concatenate(self.data[k])[::2]]
            self.kept = len(self.data["x"][0])
            self.stride *= 2

    def arrays(self) -> dict[str, NDArray[np.float64]]:
        """The kept samples, one array per field."""
        return {k: (np.concatenate(v) if v else np.empty(0)) for k, v in self.data.items()}

    def rejected_marks(self) -> NDArray[np.float64]:
        """Abscissas of the rejected rows marked on the chart (finite ones)."""
        xb = np.concatenate(self.marks) if self.marks else np.empty(0)
        return xb[np.isfinite(xb)]


def rejected(status: NDArray[Any]) -> NDArray[np.bool_]:
    """Rows whose outputs are not drawn: any status but OK and IMPACT_PRESSURE_ZEROED."""
    s = np.asarray(status)
    return (s != Status.OK) & (s != Status.IMPACT_PRESSURE_ZEROED)


def draw(collector: Collector, path: str, title: str, profile: str) -> dict[str, Any]:
    """Draw altitude, airspeeds, Mach and temperatures against time into ``path``.

    Returns
    -------
    dict
        What was drawn: ``rows`` read, ``rows_shown`` (samples with a finite abscissa),
        ``every`` (the stride), ``rejected`` (rows over the whole file),
        ``rejected_marked``, ``time`` (the time column's shape, or ``"row"``) and the
        ``note`` printed on the chart.
    """
    import matplotlib

    matplotlib.use("Agg")
    import matplotlib.pyplot as plt
    from matplotlib.ticker import FuncFormatter

    d = collector.arrays()
    x = d["x"]
    shown = int(np.isfinite(x).sum())
    lu, su, tu = (collector.units[k] for k in ("length", "speed", "temperature"))
    fig, axes = plt.subplots(4, 1, sharex=True, figsize=(10.5, 9.5))
    style = {"linewidth": 0.9}
    ax = axes[0]
    ax.plot(x, d["hp"], color="black", label="pressure altitude", **style)
    if np.isfinite(d["hbaro"]).any():
        ax.plot(x, d["hbaro"], color="tab:blue", linestyle="--", label="baro-corrected altitude",
                **style)
    ax.set_ylabel(f"altitude [{lu}]")
    ax = axes[1]
    ax.plot(x, d["cas"], color="black", label="CAS", **style)
    ax.plot(x, d["eas"], color="tab:green", label="EAS", **style)
    ax.plot(x, d["tas"], color="tab:red", label="TAS", **style)
    ax.set_ylabel(f"airspeed [{su}]")
    ax = axes[2]
    ax.plot(x, d["mach"], color="black", label="Mach", **style)
    ax.axhline(1.0, color="grey", linestyle=":", linewidth=0.8)
    ax.set_ylabel("Mach number")
    ax = axes[3]
    bad = rejected(d["status"])
    ax.plot(x, np.where(bad, np.nan, d["tat"]), color="tab:red", label="TAT (measured)",
            **style)
    ax.plot(x, d["sat"], color="black", label="SAT", **style)
    ax.set_ylabel(f"temperature [{tu}]")
    ax.set_xlabel(collector.x_label)
    ta = collector.timeaxis
    if ta is not None and ta.kind in ("clock", "iso"):
        axes[3].xaxis.set_major_formatter(FuncFormatter(lambda v, _pos: ta.tick_text(v)))
    marks = collector.rejected_marks()
    if collector.rejected:
        for a in axes:
            a.vlines(marks, 0.0, 1.0, transform=a.get_xaxis_transform(),
                     color="tab:orange", linewidth=0.6, alpha=0.6)
        label = f"rejected rows ({collector.rejected:,}"
        label += ")" if marks.size == collector.rejected else f"; {marks.size:,} marked)"
        axes[0].plot([], [], color="tab:orange", label=label.replace(",", " "))
    for a in axes:
        a.grid(True, linewidth=0.4, color="0.8")
        a.legend(loc="upper left", bbox_to_anchor=(1.005, 1.0), fontsize=8, frameon=False)
    note = f"profile {profile}"
    if shown != collector.rows:
        note += f"; {shown:,} of {collector.rows:,} rows shown".replace(",", " ")
        if collector.stride > 1:
            note += f" (every {collector.stride}th)"
        missing = int(np.isnan(x).sum())
        if missing:
            note += f", {missing} sampled row(s) without a readable time"
    axes[0].set_title(f"{title}  ({note})", fontsize=10, loc="left")
    fig.text(0.01, 0.005, "airdata: an engineering aid, not certified flight software",
             fontsize=7, color="0.4")
    fig.tight_layout(rect=(0, 0.015, 1, 1))
    fig.savefig(path, dpi=110)
    plt.close(fig)
    return {"rows": collector.rows, "rows_shown": shown, "every": collector.stride,
            "rejected": collector.rejected, "rejected_marked": int(marks.size),
            "time": ta.kind if ta is not None and ta.kind else "row", "note": note}
