"""Planning a reduction: which columns of a recorded series hold the inputs, in which
units, which outputs are written under which headers, and which recorded outputs are
compared (see :mod:`airdata.cli.reduce` for the file conventions).

An engineering and verification aid, not certified flight software.
"""

from __future__ import annotations

from dataclasses import dataclass, field

from .. import units as u
from ..chain import OUTPUT_INFO
from .csvio import ChunkReader, Column, HeaderError
from .options import ReduceOptions
from .recorded import RECORDED, RECORDED_SUFFIX, RecordedColumn, recorded_names

__all__ = ["OUTPUTS", "ROLES", "Plan", "UsageError", "plan"]

#: (key of AirData, column name, dimension) of every output, in output order.
OUTPUTS: tuple[tuple[str, str, str], ...] = tuple((o.key, o.short, o.dimension)
                                                  for o in OUTPUT_INFO)

#: Input roles: (role, dimension or None for any unit, required).
ROLES: tuple[tuple[str, str | None, bool], ...] = (
    ("ps", "pressure", True),
    ("pt", "pressure", True),
    ("tat", "temperature", True),
    ("setting", "pressure", False),
    ("time", None, False),
)


@dataclass
class Plan:
    """The columns of one file: input roles and units, outputs, recorded columns."""

    roles: dict[str, Column]
    role_units: dict[str, str]
    outputs: list[tuple[str, str, str]]  # (key, header, unit)
    width: int
    recorded: list[RecordedColumn] = field(default_factory=list)
    phase: Column | None = None


class UsageError(Exception):
    """A usage error found after parsing (the command exits with status 2)."""


def plan(reader: ChunkReader, opts: ReduceOptions) -> Plan:
    """Which columns hold the inputs and their units, which outputs to write, the
    recorded columns to compare and the phase column; HeaderError or UsageError naming
    what is wrong."""
    wanted = dict(opts.columns)
    given_units = dict(opts.column_units)
    by_name: dict[str, list[Column]] = {}
    for c in reader.columns:
        by_name.setdefault(c.key, []).append(c)
    found = ", ".join(c.header for c in reader.columns)
    roles: dict[str, Column] = {}
    role_units: dict[str, str] = {}
    for role, dim, required in ROLES:
        name = wanted.get(role, role)
        matches = by_name.get(name.casefold(), [])
        if not matches and role in wanted:
            # --col may name the full header cell, unit included
            matches = [c for c in reader.columns
                       if c.header.strip().casefold() == name.casefold()]
        if not matches:
            if required:
                raise HeaderError(f"no column {name!r} ({_role_words(role)}) in the header; "
                                  f"columns found: {found} (fields read as separated by "
                                  f"{_delimiter_words(reader.dialect.delimiter)}; give "
                                  "--delimiter or --col ROLE=HEADER if that is wrong)")
            continue
        if len(matches) > 1:
            raise HeaderError(f"{len(matches)} columns named {name!r}: "
                              + ", ".join(c.header for c in matches))
        col = matches[0]
        unit = given_units.get(role) or col.unit
        if unit is not None and dim is not None:
            try:
                unit = u.normalize_unit(unit)
            except ValueError:
                raise HeaderError(
                    f"column {col.header!r}: unknown unit {unit!r}; units of {dim}: "
                    f"{', '.join(u.units_of(dim))} (also spellings such as mb, C, F, kts)"
                ) from None
        if col.unit and role in given_units and not _same(given_units[role], col.unit):
            raise HeaderError(f"column {col.header!r} says unit {col.unit!r} but --unit gives "
                              f"{given_units[role]!r}")
        if dim is not None:
            if unit is None:
                raise HeaderError(
                    f"column {col.header!r} carries no unit: name it like {name}[hPa] "
                    f"or give --unit {role}=UNIT; units of {dim}: "
                    f"{', '.join(u.units_of(dim))}")
            if unit not in u.UNITS or u.dimension(unit) != dim:
                raise HeaderError(
                    f"column {col.header!r}: unit {unit!r} is not a {dim} unit; units of "
                    f"{dim}: {', '.join(u.units_of(dim))}")
        roles[role] = col
        role_units[role] = unit or ""
    if "setting" in roles and opts.setting is not None:
        raise HeaderError(f"both a setting column ({roles['setting'].header!r}) and --setting "
                          "given: use one")
    with_setting = "setting" in roles or opts.setting is not None
    ou = opts.output_units
    selected = [o for o in OUTPUTS if o[0] != "baro_altitude" or with_setting]
    if opts.only is not None:
        names = opts.only
        known = {o[1]: o for o in selected}
        unknown = [n for n in names if n not in known]
        if unknown:
            raise UsageError(f"--only: unknown output(s) {', '.join(unknown)}; outputs: "
                         f"{', '.join(known)}")
        selected = [known[n] for n in names]
    outputs = [(key, f"{opts.prefix}{name}[{ou[dim]}]", ou[dim]) for key, name, dim in selected]
    recorded = [] if opts.ignore_recorded else _recorded_columns(
        reader.columns, roles, with_setting, opts.prefix)
    clash = {h for _, h, _ in outputs} & {c.header for c in reader.columns}
    clash |= {r.diff_header for r in recorded} & {c.header for c in reader.columns}
    for extra in ("status", "note"):
        if f"{opts.prefix}{extra}" in {c.header for c in reader.columns}:
            clash.add(f"{opts.prefix}{extra}")
    if clash:
        raise HeaderError(f"output column(s) {', '.join(sorted(clash))} already in the input; "
                          "give --prefix, e.g. --prefix ref_")
    phase = next((c for c in reader.columns if c.key == "phase" and c not in roles.values()),
                 None)
    return Plan(roles, role_units, outputs, len(reader.header), recorded, phase)


def _recorded_columns(columns: list[Column], roles: dict[str, Column], with_setting: bool,
                      prefix: str) -> list[RecordedColumn]:
    """The ``<output>_rec`` columns of the header (see the module docstring)."""
    names = recorded_names()
    info = {key: (short, dim, band) for key, short, dim, band, _ in RECORDED}
    accepted = ", ".join(f"{short} ({words})" for _, short, _, _, words in RECORDED)
    found: list[RecordedColumn] = []
    seen: dict[str, str] = {}
    for c in columns:
        if not c.key.endswith(RECORDED_SUFFIX) or c in roles.values():
            continue
        base = c.key[:-len(RECORDED_SUFFIX)]
        if base not in names:
            raise HeaderError(
                f"column {c.header!r}: {base!r} is not a recorded output; a recorded "
                f"output column is named <output>_rec[unit] with <output> one of: "
                f"{accepted} (or the full name, e.g. pressure_altitude_rec); rename the "
                "column or give --ignore-recorded")
        key = names[base]
        short, dim, band = info[key]
        if key in seen:
            raise HeaderError(f"columns {seen[key]!r} and {c.header!r} both record {short}: "
                              "keep one")
        seen[key] = c.header
        if key == "baro_altitude" and not with_setting:
            raise HeaderError(f"column {c.header!r}: comparing hbaro needs an altimeter "
                              "setting (a setting column or --setting)")
        unit = c.unit
        if unit is None and dim == "dimensionless":
            unit = "1"
        if unit is None:
            raise HeaderError(f"column {c.header!r} carries no unit: name it like "
                              f"{c.name}[{u.units_of(dim)[0]}]; units of {dim}: "
                              f"{', '.join(u.units_of(dim))}")
        try:
            unit = u.normalize_unit(unit)
        except ValueError:
            unit = ""
        if unit not in u.UNITS or u.dimension(unit) != dim:
            raise HeaderError(f"column {c.header!r}: unit {c.unit!r} is not a {dim} unit; "
                              f"units of {dim}: {', '.join(u.units_of(dim))}")
        found.append(RecordedColumn(c.index, c.header, key, short, unit,
                                    f"{prefix}{short}_diff[{unit}]", band))
    return found


def _delimiter_words(d: str) -> str:
    return {",": "commas", ";": "semicolons", "\t": "tabs"}.get(d, repr(d))


def _same(a: str, b: str) -> bool:
    try:
        return u.normalize_unit(a) == u.normalize_unit(b)
    except ValueError:
        return a == b


def _role_words(role: str) -> str:
    return {"ps": "static pressure", "pt": "total pressure", "tat": "total air temperature",
            "setting": "altimeter setting", "time": "time"}[role]
