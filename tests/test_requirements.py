"""Requirements files: the allowed-error grammar and every refusal, with its message."""

from __future__ import annotations

import pytest

from airdata.portcheck.requirements import RequirementsError, parse_requirements, parse_tolerance

HEAD = 'format = "airdata-requirements-1"\ntitle = "t"\n'


def test_tolerance_forms_in_si() -> None:
    # 1 ft = 0.3048 m, 1 kt = 1852/3600 m/s: exact definitions (from memory).
    assert parse_tolerance("1 ft", "m").absolute == pytest.approx(0.3048, rel=1e-15)
    t = parse_tolerance("0.05 % of reading + 0.5 ft", "m")
    assert t.relative == pytest.approx(5e-4) and t.absolute == pytest.approx(0.1524)
    assert parse_tolerance("0.2 kt", "m/s").absolute == pytest.approx(0.2 * 1852 / 3600)
    assert parse_tolerance("0.05 hPa", "Pa").absolute == pytest.approx(5.0)
    # an error of 0.1 degC is 0.1 K: differences carry no offset (common practice, no source)
    assert parse_tolerance("0.1 degC", "K").absolute == pytest.approx(0.1)
    assert parse_tolerance("0.001", "1").absolute == 0.001


@pytest.mark.parametrize("text, unit, si", [
    # the spellings airdata.units accepts elsewhere (kts, mb, C, feet) mean the same here
    ("1 kts", "m/s", 1852 / 3600), ("1 knots", "m/s", 1852 / 3600), ("2 feet", "m", 0.6096),
    ("0.5 mb", "Pa", 50.0), ("0.5 C", "K", 0.5), ("0.9 degF", "K", 0.5),
    ("0.01 psia", "Pa", 0.01 * 0.45359237 * 9.80665 / 0.0254 ** 2),
])
def test_tolerance_unit_spellings(text: str, unit: str, si: float) -> None:
    assert parse_tolerance(text, unit).absolute == pytest.approx(si, rel=1e-15)


def test_envelope_limits_in_unit_spellings() -> None:
    r = parse_requirements(HEAD + '[function.pressure_altitude]\nenvelope.ps = ["116 mb", '
                           '"1100 millibar"]\nerror.h = "2 feet"\n')
    fn = r.functions["pressure_altitude"]
    assert fn.envelope["ps"] == (11600.0, 110000.0)
    assert fn.envelope_text["ps"] == ("116 mb", "1100 millibar")  # reported as written
    assert fn.errors["h"].absolute == pytest.approx(0.6096, rel=1e-15)
    assert fn.errors["h"].unit == "ft"


@pytest.mark.parametrize("text, unit, message", [
    ("1 kt", "m", "unit 'kt' is a speed unit; the output is in m"),
    ("1 furlong", "m", "unit 'furlong' is an unknown unit"),
    ("1", "m", "has no unit"),
    ("-1 ft", "m", "must be a finite number >= 0"),
    ("0 ft", "m", "allows no error at all"),
    ("1 % + 2 %", "m", "two relative terms"),
    ("", "m", "expected a text"),
])
def test_tolerance_refusals(text: str, unit: str, message: str) -> None:
    with pytest.raises(RequirementsError, match="x") as exc:
        parse_tolerance(text, unit, "x")
    assert message in str(exc.value)


@pytest.mark.parametrize("body, message", [
    ('colour = "red"\n', "key 'colour' (line 3): unknown key"),
    ('[function.pressure_altitud]\nerror.h = "1 ft"\n',
     "key 'function.pressure_altitud' (line 3): unknown function"),
    ('[function.pressure_altitude]\nerror.height = "1 ft"\n',
     "key 'function.pressure_altitude.error.height' (line 4): pressure_altitude has no "
     "output 'height'"),
    ('[function.pressure_altitude]\nenvelope.p = ["1 hPa", "2 hPa"]\nerror.h = "1 ft"\n',
     "key 'function.pressure_altitude.envelope.p' (line 4): pressure_altitude has no input"),
    ('[function.pressure_altitude]\nenvelope.ps = ["1100 hPa", "116 hPa"]\nerror.h = "1 ft"\n',
     "(line 4): empty envelope: low 1100 hPa is above high 116 hPa"),
    ('[function.pressure_altitude]\nenvelope.ps = ["1 ft", "2 ft"]\nerror.h = "1 ft"\n',
     "(line 4): unit 'ft' is a length unit; the input is in Pa"),
    ('[function.pressure_altitude]\n\n\nerror.h = "1 kt"\n',
     "key 'function.pressure_altitude.error.h' (line 6): unit 'kt' is a speed unit"),
    ('[function.pressure_altitude]\nlimit = 3\nerror.h = "1 ft"\n',
     "key 'function.pressure_altitude.limit' (line 4): unknown key 'limit'"),
    ('[function.pressure_altitude]\nenvelope.ps = ["116 hPa", "1100 hPa"]\n',
     "key 'function.pressure_altitude.error'"),
])
def test_file_refusals_name_key_and_line(body: str, message: str) -> None:
    with pytest.raises(RequirementsError) as exc:
        parse_requirements(HEAD + body, "req.toml")
    assert message in str(exc.value) and str(exc.value).startswith("req.toml")


def test_format_and_toml_errors() -> None:
    with pytest.raises(RequirementsError, match="format must be 'airdata-requirements-1'"):
        parse_requirements('format = "v0"\n[function.pressure_altitude]\nerror.h = "1 ft"\n')
    with pytest.raises(RequirementsError, match="not valid TOML"):
        parse_requirements(HEAD + "[function.\n")
    with pytest.raises(RequirementsError, match="no \\[function.NAME\\] table"):
        parse_requirements(HEAD)


def test_envelope_in_si_and_single_value() -> None:
    r = parse_requirements(HEAD + '[function.sat_from_tat]\nenvelope.tat = ["0 degC", "40 degC"]\n'
                           'envelope.recovery = 1\nerror.sat = "0.1 K"\n')
    f = r.functions["sat_from_tat"]
    assert f.envelope["tat"] == pytest.approx((273.15, 313.15))  # 0 degC = 273.15 K
    assert f.envelope["recovery"] == (1.0, 1.0)
