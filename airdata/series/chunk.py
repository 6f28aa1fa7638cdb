"""Reducing one chunk of a recorded series: the fields parsed and converted to SI, the
air-data chain run (the reference, the C port or both), every bad row's status and
note, the outputs in their units and the recorded outputs' differences.

An engineering and verification aid, not certified flight software.
"""

from __future__ import annotations

from dataclasses import dataclass
from operator import itemgetter

import numpy as np
from numpy.typing import NDArray

from .. import units as u
from ..chain import AirData, air_data
from ..status import DomainError, Status
from .compare import Comparison
from .csvio import parse_numbers
from .options import ReduceOptions
from .plan import Plan
from .recorded import RecordedComparison
from .timebase import TimeAxis

__all__ = ["Chunk", "ZEROED_NOTE", "decimal_points", "reduce_chunk"]

#: The note of an IMPACT_PRESSURE_ZEROED row.
ZEROED_NOTE = "negative qc within the noise band read as zero"


@dataclass
class Chunk:
    """One chunk reduced: outputs in output units, status, notes, and the inputs."""

    values: NDArray[np.float64]  # (n, k) in output units
    status: NDArray[np.int8]
    notes: list[str]
    time: NDArray[np.float64] | None
    tat: NDArray[np.float64]  # SI
    out: AirData
    ragged: list[int]


def _column(rows: list[list[str]], index: int, ragged: bool) -> list[str]:
    if not ragged:
        return list(map(itemgetter(index), rows))
    return [r[index] if index < len(r) else "" for r in rows]


def reduce_chunk(rows: list[list[str]], plan: Plan, opts: ReduceOptions,
                 comparison: Comparison | None = None, first_row: int = 1,
                 recorded: RecordedComparison | None = None,
                 timeaxis: TimeAxis | None = None) -> Chunk:
    """Reduce one chunk of rows (lists of field strings).

    ``comparison`` (with ``opts.compare``) collects the disagreements of the reference and
    the C port; ``first_row`` is the data row number (from 1) of the chunk's first row;
    ``recorded`` collects the differences of the recorded outputs (its difference
    columns follow the outputs in the chunk's values); ``timeaxis`` reads the time
    column (numbers, clock times or ISO date-times) and counts the unreadable ones.
    """
    n = len(rows)
    width = plan.width
    lengths = np.fromiter(map(len, rows), dtype=np.int64, count=n)
    ragged_mask = lengths != width
    ragged = bool(ragged_mask.any())
    notes = [""] * n
    si: dict[str, NDArray[np.float64]] = {}
    unreadable = np.zeros(n, dtype=bool)
    time_values = None
    for role, col in plan.roles.items():
        fields = _column(rows, col.index, ragged)
        if role == "time":
            time_values = (timeaxis.parse(fields, first_row) if timeaxis is not None
                           else parse_numbers(fields)[0])
            continue
        values, bad = parse_numbers(fields)
        unreadable |= bad
        for i in np.flatnonzero(bad):
            text = fields[i]
            what = "empty" if not text.strip() else f"not a number ({text!r})"
            notes[i] = _join(notes[i], f"{col.header}: {what}")
        si[role] = np.asarray(u.to_si(values, plan.role_units[role]), dtype=np.float64)
    for i in np.flatnonzero(ragged_mask):
        r = rows[i]
        msg = f"row has {len(r)} fields, the header {width}"
        if len(r) > width:
            msg += "; extra fields: " + ", ".join(repr(x) for x in r[width:])
        notes[i] = _join(notes[i], msg)
    setting = si.get("setting")
    if setting is None and opts.setting is not None:
        setting = np.full(n, opts.setting)
    noise = opts.noise_band
    ps, pt, tat = si["ps"], si["pt"], si["tat"]
    if ragged:  # a malformed row is not trusted: NaN inputs make it INVALID_INPUT
        ps = np.where(ragged_mask, np.nan, ps)
    out = ref = port = None
    if opts.engine == "reference" or opts.compare:
        out = ref = air_data(ps, pt, tat, opts.recovery, setting, noise_band=noise,
                             profile=opts.profile, strict=False)
    if opts.engine == "cport" or opts.compare:
        from .compare import port_air_data
        user = opts.user_port
        port = (user.air_data(ps, pt, tat, opts.recovery, setting, noise, opts.profile)
                if user is not None else
                port_air_data(ps, pt, tat, opts.recovery, setting, noise, opts.profile,
                              opts.precision))
        if opts.engine == "cport":
            out = port
    assert out is not None
    if comparison is not None and ref is not None and port is not None:
        from .compare import compare_chunk
        compare_chunk(comparison, first_row, ps, pt, tat, opts.recovery, setting, noise,
                      opts.profile, ref, port)
    status = np.asarray(out.status, dtype=np.int8)
    for i in np.flatnonzero(status != Status.OK):
        if notes[i]:
            continue
        if status[i] == Status.IMPACT_PRESSURE_ZEROED:
            notes[i] = ZEROED_NOTE
        else:
            notes[i] = _domain_note(ps[i], pt[i], tat[i], opts.recovery,
                                    None if setting is None else setting[i], noise, opts.profile)
    cols = []
    for key, _, unit in plan.outputs:
        cols.append(np.asarray(u.from_si(np.asarray(getattr(out, key)), unit)))
    if recorded is not None and plan.recorded:
        rec = np.empty((n, len(plan.recorded)))
        unread = np.zeros((n, len(plan.recorded)), dtype=bool)
        for j, rc in enumerate(plan.recorded):
            rec[:, j], unread[:, j] = parse_numbers(_column(rows, rc.index, ragged))
        times = _column(rows, plan.roles["time"].index, ragged) if "time" in plan.roles \
            else None
        phases = _column(rows, plan.phase.index, ragged) if plan.phase is not None else None
        diffs = recorded.add(first_row, rec, unread, out, times, phases)
        cols.extend(diffs.T)
    values = np.column_stack(cols) if cols else np.empty((n, 0))
    return Chunk(values, status, notes, time_values, tat, out,
                  np.flatnonzero(ragged_mask).tolist())


def _join(a: str, b: str) -> str:
    return f"{a}; {b}" if a else b


def _domain_note(ps: float, pt: float, tat: float, recovery: float, setting: float | None,
                 noise: float, profile: str) -> str:
    """The library's own message for one bad row (values in SI units)."""
    try:
        air_data(float(ps), float(pt), float(tat), recovery, setting, noise_band=noise,
                 profile=profile, strict=True)
    except DomainError as exc:
        return f"{exc} (SI units)"
    return "rejected by the air-data chain"  # pragma: no cover - status and strict agree


def decimal_points(rows: list[list[str]], plan: Plan) -> list[list[str]]:
    """Rows whose quantity fields have the decimal comma replaced by a point (a copy)."""
    idx = [c.index for c in plan.roles.values()] + [r.index for r in plan.recorded]
    out = []
    for row in rows:
        r = list(row)
        for i in idx:
            if i < len(r):
                r[i] = r[i].replace(",", ".")
        out.append(r)
    return out
