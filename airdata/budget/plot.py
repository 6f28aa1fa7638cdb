"""The chart of an error budget."""

from __future__ import annotations

from pathlib import Path
from typing import Any

import numpy as np
from numpy.typing import NDArray

from .._docs import fill_doc
from .propagation import ErrorBudget
from .sensitivity import DISPLAY_UNITS, OUTPUTS

__all__ = ["plot_budget"]

F64 = NDArray[np.float64]

_TITLES = {"pressure_altitude": "pressure altitude", "cas": "CAS", "mach": "Mach",
           "tas": "TAS", "sat": "SAT", "eas": "EAS"}


@fill_doc
def plot_budget(
    budget: ErrorBudget, outputs: tuple[str, ...] | None = None, *, quantity: str = "rms",
    path: str | Path | None = None, pressure_unit: str = "Pa",
) -> Any:
    """Maps of an error budget: one panel per output, pressure altitude against CAS.

    Parameters
    ----------
    budget : ErrorBudget
        From :func:`error_budget`.
    outputs : tuple of str, optional
        Outputs to map (default all of :data:`OUTPUTS`).
    quantity : {"rms", "sd", "shift"}, optional
        What to map; default the rms error.
    path : str or Path, optional
        Write the chart there (format from the suffix).
    pressure_unit : str, optional
        Unit in which the title states the pressure sensors' accuracies (default Pa;
        ``airdata budget`` passes the unit they were given in).

    {Returns: out_figure}

    Raises
    ------
    {no_matplotlib}
    ValueError
        An unknown output or quantity.
    """
    from ..units import from_si

    outputs = OUTPUTS if outputs is None else tuple(outputs)
    for o in outputs:
        if o not in OUTPUTS:
            raise ValueError(f"unknown output {o!r}: choose from {OUTPUTS}")
    if quantity not in ("rms", "sd", "shift"):
        raise ValueError(f"quantity = {quantity!r}: choose 'rms', 'sd' or 'shift'")
    from matplotlib.figure import Figure

    ncol = min(3, len(outputs))
    nrow = -(-len(outputs) // ncol)
    fig = Figure(figsize=(4.2 * ncol, 3.6 * nrow), layout="constrained")
    axes = fig.subplots(nrow, ncol, squeeze=False)
    x = np.asarray(from_si(budget.cas, "kt"))
    y = np.asarray(from_si(budget.altitude, "ft"))
    data = getattr(budget, quantity)
    for ax, o in zip(axes.flat, outputs, strict=False):
        unit = DISPLAY_UNITS[o]
        z = data[o] if unit in ("1", "K") else np.asarray(from_si(data[o], unit))
        mesh = ax.pcolormesh(x, y, z, shading="nearest",
                             cmap="RdBu_r" if quantity == "shift" else "viridis")
        if len(x) > 1 and len(y) > 1:
            cs = ax.contour(x, y, z, colors="k", linewidths=0.5)
            ax.clabel(cs, fontsize=7)
        fig.colorbar(mesh, ax=ax, label=f"{quantity} error, {'Mach' if unit == '1' else unit}")
        ax.set_title(_TITLES[o])
        ax.set_xlabel("CAS, kt")
        ax.set_ylabel("pressure altitude, ft")
    for ax in list(axes.flat)[len(outputs):]:
        ax.set_visible(False)
    how = "linear" if budget.method == "linear" else f"Monte Carlo, {budget.samples} samples"
    sensors = budget.accuracy.describe(pressure_unit).replace("pitot", budget.pitot, 1)
    fig.suptitle(f"Error budget ({how}); sensor bias / sd: {sensors}", fontsize=10)
    if path is not None:
        fig.savefig(path, dpi=120)
    return fig
