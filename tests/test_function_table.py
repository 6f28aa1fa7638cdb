"""Every function of the table has each of the places a function needs, and no more.

DEVELOPERS.md says what adding a function means: the table entry
(``airdata/vectors/catalogue.py``), the kernel in Python (its topic module, exported by
``airdata``) and in C (prototype in ``airdata.h``, implementation in its topic file), the
oracle (``tests/oracle.py``), its equation ids in ``docs/equations.md`` (a row of its own
names it) and the tests (the accuracy sweep, the C driver); everything else is generated
from the table or follows from it.  This test holds that list against the tree for every
function, and a control shows that a function with none of them is reported place by place.
"""

from __future__ import annotations

import dataclasses
import re
from pathlib import Path

import oracle
import test_accuracy

import airdata
from airdata import cport
from airdata.vectors.catalogue import CATALOGUE, FunctionSpec

ROOT = Path(__file__).resolve().parents[1]
EQUATIONS = (ROOT / "docs" / "equations.md").read_text(encoding="utf-8")
HEADER = (ROOT / "bindings" / "c" / "include" / "airdata.h").read_text(encoding="utf-8")
DRIVER = (ROOT / "bindings" / "c" / "tests" / "driver.c").read_text(encoding="utf-8")
SWEPT = {case.function for case in test_accuracy.CASES.values()}


def _equation_rows() -> dict[str, str]:
    """Equation id -> its table row in docs/equations.md."""
    rows = {}
    for line in EQUATIONS.splitlines():
        m = re.match(r"^\| ([A-Z]{3}-\d+[a-z]?) \|", line)
        if m:
            rows[m.group(1)] = line
    return rows


ROWS = _equation_rows()


def missing_places(spec: FunctionSpec) -> list[str]:
    """The places of the developer's list that ``spec`` lacks, each named."""
    missing = []
    if spec.name not in airdata.__all__ or not callable(getattr(airdata, spec.name, None)):
        missing.append("Python: exported by airdata")
    if not callable(getattr(cport, spec.name, None)):
        missing.append("airdata.cport wrapper")
    if not callable(getattr(oracle, spec.name, None)):
        missing.append("tests/oracle.py")
    if spec.name not in SWEPT:
        missing.append("tests/test_accuracy.py sweep")
    if not re.search(rf"\bad_status {spec.c_name}\(", HEADER):
        missing.append("bindings/c/include/airdata.h prototype")
    if not re.search(rf"\b{spec.c_name}\(", DRIVER):
        missing.append("bindings/c/tests/driver.c")
    if not spec.equations:
        missing.append("equation ids in the table")
    rows = [ROWS.get(eq) for eq in spec.equations]
    missing += [f"docs/equations.md row {eq}"
                for eq, row in zip(spec.equations, rows, strict=True) if row is None]
    # the table lists every equation a function uses; its own (at least one) names it
    if rows and not any(row and re.search(rf"`({spec.name}|{spec.c_name})`", row)
                        for row in rows):
        missing.append(f"docs/equations.md row naming {spec.name} or {spec.c_name}")
    return missing


def test_every_table_function_has_every_place() -> None:
    assert len(CATALOGUE) >= 30
    gaps = {spec.name: missing_places(spec) for spec in CATALOGUE}
    assert {k: v for k, v in gaps.items() if v} == {}


def test_a_function_with_no_places_is_reported_place_by_place() -> None:
    # negative control: a made-up entry of the table, with an equation id nobody wrote
    spec = dataclasses.replace(CATALOGUE[0], name="made_up_speed", equations=("SPD-99",))
    assert missing_places(spec) == [
        "Python: exported by airdata", "airdata.cport wrapper", "tests/oracle.py",
        "tests/test_accuracy.py sweep", "bindings/c/include/airdata.h prototype",
        "bindings/c/tests/driver.c", "docs/equations.md row SPD-99",
        "docs/equations.md row naming made_up_speed or ad_made_up_speed"]
    # ids that exist, but whose rows name other functions
    other = dataclasses.replace(CATALOGUE[0], equations=("SPD-2", "TMP-1"))
    assert missing_places(other) == [
        f"docs/equations.md row naming {other.name} or {other.c_name}"]
