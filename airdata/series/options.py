"""The options of a reduction: what ``airdata reduce`` reads from its command line,
as a plain object (no argparse), so that the series library can be driven from code.

An engineering and verification aid, not certified flight software.
"""

from __future__ import annotations

from dataclasses import dataclass, field
from typing import Any

from .. import _domains as dom

__all__ = ["ReduceOptions"]


@dataclass
class ReduceOptions:
    """Everything a reduction needs besides the data (SI units for quantities).

    Attributes
    ----------
    input, output : str
        Paths of the recorded series and of the reduced one (``"-"``: standard input or
        output); the suffix selects the format (CSV, compressed CSV, Parquet, Arrow).
    profile : str
        Constants profile.
    setting : float or None
        Altimeter setting of every row, Pa (``None``: a setting column, or none).
    recovery : float
        Recovery factor of the TAT probe, in [0, 1].
    noise_band : float
        Negative impact pressure read as zero, Pa.
    columns, column_units : dict of str to str
        Role -> header of the column that holds it; role -> unit of a column whose
        header names none.
    only : list of str or None
        Short names of the outputs to write (``None``: all).
    prefix : str
        Prefix of the output column names.
    digits : int or None
        Significant digits of the outputs (``None``: each unit's resolution).
    exact : bool
        Every bit of the outputs (shortest round-trip form).
    chunk : int
        Rows per chunk.
    delimiter : str or None
        Field separator (``None``: detected).
    decimal, encoding : str
        Decimal sign (``"auto"``, ``"."``, ``","``) and text encoding (``"auto"``).
    engine : str
        ``"reference"`` (the Python reference) or ``"cport"`` (the C port).
    precision : str
        Build of the C port: ``"double"`` or ``"single"``.
    compare : bool
        Run both and collect their disagreements.
    ignore_recorded : bool
        Pass ``<output>_rec`` columns through without comparing them.
    plot : str or None
        File to draw the main outputs into.
    output_units : dict of str to str
        Dimension -> unit of the outputs.
    user_port : object or None
        A team's own port (``airdata.series.compare.UserPort``) for ``engine="cport"``
        or ``compare``; ``None``: the bundled one.
    """

    input: str
    output: str
    profile: str = "icao"
    setting: float | None = None
    recovery: float = 1.0
    noise_band: float = dom.NOISE_BAND
    columns: dict[str, str] = field(default_factory=dict)
    column_units: dict[str, str] = field(default_factory=dict)
    only: list[str] | None = None
    prefix: str = ""
    digits: int | None = None
    exact: bool = False
    chunk: int = 20000
    delimiter: str | None = None
    decimal: str = "auto"
    encoding: str = "auto"
    engine: str = "reference"
    precision: str = "double"
    compare: bool = False
    ignore_recorded: bool = False
    plot: str | None = None
    output_units: dict[str, str] = field(default_factory=dict)
    user_port: Any = None
