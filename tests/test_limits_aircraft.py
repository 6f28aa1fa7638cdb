"""The airdata-aircraft/1 file reader: the demo file, unit conversion and every refusal."""

from __future__ import annotations

from pathlib import Path

import pytest

from airdata import DomainError, Status
from airdata.aircraft import AircraftFileError, load_aircraft, parse_aircraft

DEMO = Path(__file__).resolve().parent.parent / "examples" / "demo_aircraft.toml"

GOOD = """\
format = "airdata-aircraft/1"
name = "Test article"

[mass]
min_kg = 1000.0
max_kg = 2000

[wing]
area_m2 = 20.0
cl_max = 1.5

[limits]
cas_kt = 200.0
mach = 0.5
ceiling_ft = 25000.0
"""


def test_demo_file_reads() -> None:
    ac = load_aircraft(DEMO)
    assert ac.name and 0.0 < ac.mass_min <= ac.mass_max
    assert 0.0 < ac.mach_limit < 1.0


def test_units_converted_with_exact_definitions() -> None:
    # 1 kt = 1852/3600 m/s, 1 ft = 0.3048 m (international definitions, from memory);
    # weight = mass x g0 with g0 = 9.80665 m/s2 (ICAO Doc 7488/3, from memory).
    ac = parse_aircraft(GOOD)
    assert ac.cas_limit == pytest.approx(200.0 * 1852.0 / 3600.0, rel=2.0**-52)
    assert ac.ceiling == 25000.0 * 0.3048
    assert ac.mass_max == 2000.0
    assert ac.weights() == (1000.0 * 9.80665, 2000.0 * 9.80665)


@pytest.mark.parametrize(("old", "new", "match"), [
    ('format = "airdata-aircraft/1"', 'format = "airdata-aircraft/9"', "format"),
    ('name = "Test article"', 'name = ""', "name"),
    ("area_m2 = 20.0", "area_m2 = 20.0\nspan_m = 12.0", "unknown key"),
    ("cl_max = 1.5", "", "missing key wing.cl_max"),
    ("cas_kt = 200.0", 'cas_kt = "fast"', "must be a number"),
    ("cas_kt = 200.0", "cas_kt = true", "must be a number"),
    ("[limits]", "[limit]", "unknown top-level"),
    ("mach = 0.5", "mach = = 0.5", "not valid TOML"),
])
def test_file_format_errors(old: str, new: str, match: str) -> None:
    with pytest.raises(AircraftFileError, match=match):
        parse_aircraft(GOOD.replace(old, new))


@pytest.mark.parametrize(("old", "new", "arg", "status"), [
    ("min_kg = 1000.0", "min_kg = -1000.0", "mass.min_kg", Status.INVALID_INPUT),
    ("min_kg = 1000.0", "min_kg = 0.0", "mass.min_kg", Status.INVALID_INPUT),
    ("min_kg = 1000.0", "min_kg = 3000.0", "mass.min_kg", Status.OUT_OF_RANGE),
    ("min_kg = 1000.0", "min_kg = nan", "mass.min_kg", Status.INVALID_INPUT),
    ("area_m2 = 20.0", "area_m2 = 0.0", "wing.area_m2", Status.INVALID_INPUT),
    ("cl_max = 1.5", "cl_max = 0.0", "wing.cl_max", Status.INVALID_INPUT),
    ("cl_max = 1.5", "cl_max = -0.3", "wing.cl_max", Status.INVALID_INPUT),
    ("mach = 0.5", "mach = 10.5", "limits.mach", Status.OUT_OF_RANGE),
    ("mach = 0.5", "mach = 0.0", "limits.mach", Status.INVALID_INPUT),
    ("cas_kt = 200.0", "cas_kt = 0", "limits.cas_kt", Status.INVALID_INPUT),
    ("ceiling_ft = 25000.0", "ceiling_ft = 250000.0", "limits.ceiling_ft",
     Status.OUT_OF_RANGE),
    ("ceiling_ft = 25000.0", "ceiling_ft = -inf", "limits.ceiling_ft",
     Status.INVALID_INPUT),
])
def test_value_domain_errors(old: str, new: str, arg: str, status: Status) -> None:
    with pytest.raises(DomainError) as info:
        parse_aircraft(GOOD.replace(old, new))
    assert info.value.argument == arg and info.value.status == status


@pytest.mark.parametrize("mach", ["1.0", "1.65", "10.0"])
def test_mach_limits_up_to_10_are_read(mach: str) -> None:
    # a supersonic aircraft's limit (the envelope uses the supersonic pitot relation)
    assert parse_aircraft(GOOD.replace("mach = 0.5", f"mach = {mach}")).mach_limit == float(mach)


def test_missing_file_is_oserror(tmp_path: Path) -> None:
    with pytest.raises(OSError):
        load_aircraft(tmp_path / "nowhere.toml")
