"""The desk sub-commands (compute, convert, table) through their real entry point.

Every command runs as ``python -m airdata ...`` in a subprocess.  Expected numbers come
from published values (named beside each check) or from the published equations
written out here, never from this project's output.
"""

from __future__ import annotations

import json
import math
import subprocess
import sys

import fluids
import pytest

from airdata.cli.quantities import parse_quantity

# ICAO Doc 7488/3 sea-level and tropopause values (from memory).
P0 = 101325.0          # Pa
T0 = 288.15            # K
A0 = 340.294           # m/s, sea-level speed of sound (rounded as tabulated)
R_ICAO = 287.05287     # J/(kg K)
P11 = 22632.06         # Pa at 11 000 m geopotential (rounded as tabulated)
T11 = 216.65           # K
KT = 1852.0 / 3600.0   # m/s per knot (international nautical mile, exact)
FT = 0.3048            # m per foot (international foot, exact)


def airdata(*args: str, stdin: str | None = None) -> subprocess.CompletedProcess[str]:
    """Run the real command line."""
    return subprocess.run([sys.executable, "-m", "airdata", *args], capture_output=True,
                          text=True, input=stdin, timeout=60)


def qc_subsonic(mach: float, ps: float) -> float:
    """Impact pressure, isentropic (NACA Report 1135, eq. 44 with gamma = 1.4)."""
    return ps * ((1.0 + 0.2 * mach * mach) ** 3.5 - 1.0)


def pt_supersonic(mach: float, ps: float) -> float:
    """Pitot pressure behind a normal shock (Rayleigh pitot formula, NACA Report 1135,
    eq. 100 with gamma = 1.4)."""
    m2 = mach * mach
    return ps * (1.2 * m2) ** 3.5 * (6.0 / (7.0 * m2 - 1.0)) ** 2.5


# ----------------------------------------------------------------------------- units

@pytest.mark.parametrize(("text", "dim", "si"), [
    ("250hPa", "pressure", 25000.0),
    ("250 hPa", "pressure", 25000.0),
    ("29.92inHg", "pressure", 29.92 * 3386.389),   # conventional inHg (from memory)
    ("1.5e3Pa", "pressure", 1500.0),
    ("-20degC", "temperature", 253.15),
    ("32degF", "temperature", 273.15),            # water freezes (common practice)
    ("35000ft", "length", 35000 * FT),
    ("250kt", "speed", 250 * KT),
    ("3600km/h", "speed", 1000.0),
    (".5", "dimensionless", 0.5),
])
def test_parse_quantity_definitions_of_the_units(text: str, dim: str, si: float) -> None:
    # Exact unit definitions: international foot and nautical mile (1959), hPa = 100 Pa.
    assert parse_quantity(text, dim, "1" if dim == "dimensionless" else None).si == \
        pytest.approx(si, rel=1e-15)


@pytest.mark.parametrize(("text", "dim", "words"), [
    ("250", "pressure", "has no unit"),
    ("250hpa", "pressure", "unknown unit 'hpa'"),
    ("250kt", "pressure", "is a speed, expected a pressure"),
    ("fast", "speed", "is not a number"),
    ("1.2.3hPa", "pressure", "is not a number"),
])
def test_parse_quantity_rejects_with_the_units_that_fit(text: str, dim: str,
                                                        words: str) -> None:
    with pytest.raises(ValueError, match="hPa|kt") as info:
        parse_quantity(text, dim)
    assert words in str(info.value)


def test_bad_unit_on_the_command_line_is_a_usage_error() -> None:
    r = airdata("compute", "--ps", "250hpa", "--pt", "300hPa", "--tat", "-20degC")
    assert r.returncode == 2
    assert r.stdout == ""
    assert "unknown unit 'hpa'" in r.stderr and "inHg" in r.stderr


def test_every_subcommand_has_help_and_the_caution() -> None:
    for cmd in ("compute", "convert", "table", "reduce"):
        r = airdata(cmd, "--help")
        assert r.returncode == 0, cmd
        assert "not certified flight software" in r.stdout, cmd
    r = airdata("reduce", "--help")
    assert "ps[hPa]" in r.stdout and "tat[degC]" in r.stdout


# ----------------------------------------------------------------------------- compute

def test_compute_supersonic_at_the_tropopause_against_the_rayleigh_pitot_formula() -> None:
    # Mach 2 at 11 000 m on a standard day: pt from the Rayleigh pitot formula
    # (NACA Report 1135, eq. 100) and TAT = SAT (1 + 0.2 M^2) (eq. 43); ICAO values above.
    pt = pt_supersonic(2.0, P11)
    tat = T11 * (1.0 + 0.2 * 4.0)
    r = airdata("compute", "--ps", f"{P11!r}Pa", "--pt", f"{pt!r}Pa", "--tat", f"{tat!r}K",
                "--json")
    assert r.returncode == 0, r.stderr
    doc = json.loads(r.stdout)
    out = doc["outputs"]
    assert doc["status"] == "OK"
    assert out["mach"]["value"] == pytest.approx(2.0, rel=1e-12)
    assert out["sat"]["unit"] == "degC"
    assert out["sat"]["value"] == pytest.approx(T11 - 273.15, abs=1e-9)
    # 11 000 m = 36 089.24 ft; the tabulated p is rounded to 0.01 Pa (about 0.05 ft).
    assert out["pressure_altitude"]["value"] == pytest.approx(11000 / FT, abs=0.2)
    tas = 2.0 * math.sqrt(1.4 * R_ICAO * T11)      # a = sqrt(gamma R T)
    assert out["tas"]["si"] == pytest.approx(tas, rel=1e-12)
    # EAS = M a0 sqrt(ps/p0) (definition of EAS)
    assert out["eas"]["si"] == pytest.approx(2.0 * math.sqrt(1.4 * R_ICAO * T0)
                                             * math.sqrt(P11 / P0), rel=1e-12)


def test_compute_sea_level_standard_day_gives_cas_eas_tas_equal() -> None:
    # CAS = EAS = TAS at sea level on a standard day (common practice, no source);
    # 200 kt CAS: qc by NACA Report 1135 eq. 44 with a0 = 340.294 m/s (ICAO, from memory).
    qc = qc_subsonic(200 * KT / A0, P0)
    r = airdata("compute", "--ps", "1013.25hPa", "--pt", f"{(P0 + qc) / 100!r}hPa",
                "--tat", f"{(T0 * (1 + 0.2 * (200 * KT / A0) ** 2) - 273.15)!r}degC",
                "--speed-unit", "kt", "--json")
    assert r.returncode == 0, r.stderr
    out = json.loads(r.stdout)["outputs"]
    for key in ("cas", "eas", "tas"):
        assert out[key]["unit"] == "kt"
        # a0 is tabulated to 6 digits: 2e-6 relative
        assert out[key]["value"] == pytest.approx(200.0, rel=2e-6), key
    assert out["pressure_altitude"]["si"] == pytest.approx(0.0, abs=1e-9)


def test_compute_readable_table_and_altimeter_setting_in_inhg() -> None:
    # 29.92 inHg vs 30.12 inHg: about 1000 ft per inHg near sea level
    # (common practice, no source) -> roughly 180-190 ft.
    r = airdata("compute", "--ps", "29.92inHg", "--pt", "30.1inHg", "--tat", "15degC",
                "--setting", "30.12inHg", "--alt-unit", "ft")
    assert r.returncode == 0, r.stderr
    line = next(ln for ln in r.stdout.splitlines() if "baro-corrected altitude" in ln)
    assert 170.0 < float(line.split()[-2]) < 200.0
    assert "status: OK" in r.stdout


def test_compute_negative_temperature_without_equals_sign() -> None:
    r = airdata("compute", "--ps", "250hPa", "--pt", "300hPa", "--tat", "-20degC", "--json")
    assert r.returncode == 0, r.stderr
    tat = json.loads(r.stdout)["inputs"]["tat"]
    assert (tat["value"], tat["unit"]) == (-20.0, "degC")
    assert tat["si"] == pytest.approx(253.15, abs=1e-12)   # 0 degC = 273.15 K (definition)


def test_compute_reading_outside_the_model_is_a_data_error() -> None:
    r = airdata("compute", "--ps", "250hPa", "--pt", "200hPa", "--tat", "-20degC")
    assert r.returncode == 1
    assert r.stdout == ""
    assert "qc = pt - ps" in r.stderr and "noise band" in r.stderr


# ----------------------------------------------------------------------------- convert

def test_convert_mach_one_at_sea_level_is_a0() -> None:
    # CAS = a0 at Mach 1 at sea level; a0 = 340.294 m/s (ICAO Doc 7488, from memory).
    r = airdata("convert", "--mach", "1", "--hp", "0ft", "--json", "--si")
    assert r.returncode == 0, r.stderr
    out = json.loads(r.stdout)["outputs"]
    assert out["cas"]["value"] == pytest.approx(A0, abs=5e-4)
    assert out["tas"]["value"] == pytest.approx(A0, abs=5e-4)
    assert out["eas"]["value"] == pytest.approx(A0, abs=5e-4)


def test_convert_cas_to_mach_against_naca_1135_subsonic_relations() -> None:
    # 300 kt CAS at 11 000 m: qc = p0 f(CAS/a0), M = f^-1(qc/ps) (NACA Report 1135,
    # eq. 44), ICAO a0, p0 and p(11 km) (from memory).
    qc = qc_subsonic(300 * KT / A0, P0)
    mach = math.sqrt(5.0 * ((qc / P11 + 1.0) ** (2.0 / 7.0) - 1.0))
    r = airdata("convert", "--cas", "300kt", "--hp", "11km", "--isa-dev", "+10K", "--json")
    assert r.returncode == 0, r.stderr
    out = json.loads(r.stdout)["outputs"]
    assert json.loads(r.stdout)["given"] == "cas"
    assert out["mach"]["value"] == pytest.approx(mach, rel=2e-6)
    assert out["sat"]["si"] == pytest.approx(T11 + 10.0, abs=1e-9)
    assert out["isa_deviation"]["si"] == pytest.approx(10.0, abs=1e-9)
    assert out["tas"]["si"] == pytest.approx(mach * math.sqrt(1.4 * R_ICAO * (T11 + 10.0)),
                                             rel=2e-6)


def test_convert_tas_with_static_pressure_and_sat_readable() -> None:
    # TAS = M sqrt(gamma R SAT): 600 kt at -50 degC gives M = 600 kt / a(223.15 K).
    a = math.sqrt(1.4 * R_ICAO * 223.15)
    r = airdata("convert", "--tas", "600kt", "--ps", "250hPa", "--sat", "-50degC")
    assert r.returncode == 0, r.stderr
    line = next(ln for ln in r.stdout.splitlines() if ln.strip().startswith("Mach number"))
    assert float(line.split()[2]) == pytest.approx(600 * KT / a, abs=6e-5)
    assert "(given)" in next(ln for ln in r.stdout.splitlines() if "true airspeed" in ln)


def test_convert_usage_errors() -> None:
    r = airdata("convert", "--cas", "300kt")                  # no pressure
    assert r.returncode == 2 and "--hp" in r.stderr
    r = airdata("convert", "--cas", "300kt", "--tas", "300kt", "--hp", "0ft")
    assert r.returncode == 2 and "not allowed with" in r.stderr
    r = airdata("convert", "--cas", "300ft", "--hp", "0ft")
    assert r.returncode == 2 and "expected a speed" in r.stderr


# ----------------------------------------------------------------------------- table

def test_table_against_fluids_us1976_atmosphere() -> None:
    # fluids.ATMOSPHERE_1976 (U.S. Standard Atmosphere 1976, geometric altitude input).
    r = airdata("table", "--from", "0km", "--to", "80km", "--step", "5km", "--geometric",
                "--profile", "us1976", "--si", "--csv")
    assert r.returncode == 0, r.stderr
    lines = r.stdout.strip().splitlines()
    head = lines[0].split(",")
    assert head[:6] == ["z[m]", "h[m]", "T[K]", "p[Pa]", "rho[kg/m3]", "a[m/s]"]
    assert len(lines) == 1 + 17
    for ln in lines[1:]:
        z, _, t, p, rho, a = (float(v) for v in ln.split(",")[:6])
        ref = fluids.ATMOSPHERE_1976(z)
        assert t == pytest.approx(ref.T, rel=1e-9)
        assert p == pytest.approx(ref.P, rel=1e-6)
        assert rho == pytest.approx(ref.rho, rel=1e-6)
        assert a == pytest.approx(ref.v_sonic, rel=1e-6)


def test_table_icao_tropopause_in_feet_and_json() -> None:
    # ICAO Doc 7488: 216.65 K and 226.32 hPa at 11 000 m (from memory).
    r = airdata("table", "--from", "0m", "--to", "11000m", "--step", "5500m", "--json",
                "--alt-unit", "m")
    assert r.returncode == 0, r.stderr
    doc = json.loads(r.stdout)
    assert doc["units"]["p"] == "hPa" and doc["units"]["T"] == "degC"
    assert [row["h"] for row in doc["rows"]] == [0.0, 5500.0, 11000.0]
    assert doc["rows"][2]["T"] == pytest.approx(T11 - 273.15, abs=1e-9)
    assert doc["rows"][2]["p"] == pytest.approx(226.32, abs=0.005)  # tabulated to 0.01 hPa
    assert doc["rows"][0]["sigma"] == pytest.approx(1.0, abs=1e-15)


def test_table_readable_default_and_errors() -> None:
    r = airdata("table")
    assert r.returncode == 0, r.stderr
    lines = r.stdout.splitlines()
    assert len(lines) == 3 + 11                  # title, names, units, 0..50000 ft by 5000
    assert lines[3].split()[0] == "0" and lines[-1].split()[0] == "50000"
    r = airdata("table", "--step", "0ft")
    assert r.returncode == 2 and "positive" in r.stderr
    # past the model's end (84 852 m geopotential, USSA 1976 / ICAO Doc 7488): the rows
    # inside are printed, the rest named in a note; a range wholly outside is an error
    r = airdata("table", "--to", "100km", "--step", "10km", "--si")
    assert r.returncode == 0, r.stderr
    rows = [ln.split()[0] for ln in r.stdout.splitlines()[3:] if ln[:1] in " -0123456789"]
    assert rows[-1] == "80000.0" and len(rows) == 9, r.stdout
    assert "2 row(s) outside the model omitted; it covers [-5000, 84852] m" in r.stdout
    r = airdata("table", "--from", "100km", "--to", "120km", "--step", "10km")
    assert r.returncode == 1 and "lies outside the model" in r.stderr
    r = airdata("table", "--to", "100km", "--step", "10km", "--csv")
    assert r.returncode == 0 and "2 row(s) outside the model omitted" in r.stderr
    assert r.stdout.count("\n") == 1 + 9
    r = airdata("table", "--to", "100km", "--step", "10km", "--json")
    assert json.loads(r.stdout)["note"].startswith("note: 2 row(s) outside the model")


def test_messages_in_the_units_the_user_wrote() -> None:
    # -300 degC is below the model's 50 K (= -223.15 degC); 9000 kt above 10 a0 (ICAO
    # a0 = 340.294 m/s, so 7775.38 kt): both said in the user's units, 6 digits
    r = airdata("compute", "--ps", "250hPa", "--pt", "400hPa", "--tat", "-300degC")
    assert r.returncode == 1
    assert ("tat = -300 degC is invalid: valid range is [-223.15, 4726.85] degC"
            in r.stderr), r.stderr
    r = airdata("convert", "--cas", "9000kt", "--hp", "FL350")
    assert r.returncode == 1
    assert "cas = 9000 kt is out of range: valid range is [0, 7775.38] kt" in r.stderr
    r = airdata("compute", "--ps", "250hPa", "--pt", "400hPa", "--tat", "20degC",
                "--recovery", "1.5")
    assert "recovery = 1.5 is out of range: valid range is [0, 1]" in r.stderr
    assert "SI units" not in r.stderr and "000000" not in r.stderr


def test_flight_levels_are_altitudes() -> None:
    # FL350 = 35 000 ft pressure altitude (common practice, no source)
    a = airdata("convert", "--cas", "280kt", "--hp", "FL350", "--json")
    b = airdata("convert", "--cas", "280kt", "--hp", "35000ft", "--json")
    assert a.returncode == 0 and json.loads(a.stdout) == json.loads(b.stdout)
    r = airdata("convert", "--cas", "280kt", "--hp", "FLX")
    assert r.returncode == 2 and "FL" in r.stderr


def test_no_negative_zero_and_a_quiet_broken_pipe() -> None:
    from airdata.cli.quantities import format_value

    assert format_value(-0.001, "K") == "0.00" and format_value(-0.2, "ft") == "0"
    assert format_value(-0.01, "K") == "-0.01"
    # a reader that stops after one line: no traceback, no message, exit 141
    proc = subprocess.run(f"{sys.executable} -m airdata table --to 80km --step 10m "
                          "| head -n 1; exit ${PIPESTATUS[0]}", shell=True,
                          executable="/bin/bash", capture_output=True, text=True, timeout=60)
    assert proc.stdout.startswith("airdata table") and proc.stderr == ""
    assert proc.returncode == 141
