"""Version history of the vector suite; ``airdata vectors build`` writes it to CHANGELOG.md.

Add an entry here (newest first) whenever the suite changes, with the version the
policy below requires; ``airdata vectors diff OLD NEW`` says which bump a change needs.
"""

from __future__ import annotations

__all__ = ["CURRENT", "ENTRIES", "POLICY", "changelog_text", "readme_text"]

#: (suite version, schema version, what changed) - newest first.
ENTRIES: tuple[tuple[str, int, tuple[str, ...]], ...] = (
    ("3.2.0", 1, (
        "Minor: cases added, existing cases unchanged. Windows around two switches no "
        "case looked at: qc/ps at 2^-60, where PIT-2 turns linear "
        "(mach_from_impact_pressure), and each limit of max_operating_cas/mach at Mach "
        "2^-40 with the other one tiny (the switch of the linear LIM-4).",
    )),
    ("3.1.0", 1, (
        "Minor: cases added, existing cases unchanged. The elevation's range ends of "
        "altimeter_setting at the pressure of that elevation (the generic range-end cases "
        "use nominal pressures, where the setting altitude check refuses them first, so a "
        "widened 11 000 m end went unseen); the stall speeds with weight, wing area, "
        "CLmax or load factor at 1e-3, 1e-7 and 1e-30 and an ordinary stall speed, so a "
        "lower range end raised above 0 is caught.",
    )),
    ("3.0.0", 1, (
        "Major: expected statuses of altimeter_setting change where the last bit of "
        "binary64 decided them. The setting's pressure altitude H(ps) - elevation is now "
        "checked against [-5000, 11000] m widened by 8 eps relative at both ends, as the "
        "other derived limits are (airdata._domains.setting_altitude; C: "
        "AD_SETTING_ALT_LO/HI). Before, 13 of the 59 cases whose exact setting altitude "
        "(50-digit oracle) lies within 1e-9 relative of an end expected the status of binary64 "
        "rounding, not of exact arithmetic (11 accepted a station a fraction of an ulp "
        "beyond an end, 2 refused one inside); an x87 build decided two of them the "
        "other way. Every such case now agrees with exact arithmetic "
        "(tests/test_vectors_oracle.py).",
        "The same for the derived density ps/(R sat) of density_altitude and air_data: "
        "its range, the standard densities at the model's top and bottom, is widened by "
        "8 eps relative (C: AD_RHO_MIN/AD_RHO_MAX of the binary64 build); one case whose "
        "exact density lay a fraction of an ulp below the top end expected OK and now "
        "keeps it by the slack.",
    )),
    ("2.1.0", 1, (
        "Minor: cases added, existing cases unchanged. Range-end windows (tags "
        "`range-end`, `seam-window`): every end of every argument's valid range also at "
        "relative offsets 1e-15, 1e-12, 1e-9, 1e-7, 1e-5 and 1e-3 on both sides (absolute "
        "offsets at an end of 0), so that an end typed with 4 or 6 digits, or rounded to "
        "binary32, is caught; before, range ends were sampled at 0, 1 and 4 ulp only.",
    )),
    ("2.0.0", 1, (
        "Major: expected values of cases with subnormal or near-underflow inputs change "
        "beyond their tolerance (they were wrong): cas_from_impact_pressure and "
        "mach_from_impact_pressure scale qc before the square root; the tiny-Mach "
        "branches of cas_from_mach, mach_from_cas, stall_cas and max_operating_cas/mach "
        "have no subnormal intermediate; crossover_altitude of two subnormal limits is "
        "in range (0.875 Pa, 80 073.65 m).",
        "Scales: a subnormal input's derivative term comes from doubling it (a relative "
        "step cannot move it); a nonzero subnormal expected value has scale >= 2**-1024 "
        "(the binary64 bound is at least two units of 2**-1074).",
        "New tag `subnormal` (an input or expected output nonzero and below 2**-1022): a "
        "target that flushes subnormals to zero skips these (`airdata port check "
        "--skip-subnormal`).",
        "Seam windows (tag `seam-window`): every switch, layer base and derived limit also "
        "at relative offsets 1e-15 .. 1e-3 on both sides; derived-limit cases at 1e-13, "
        "1e-11, 1e-9, 1e-7, 1e-5 and 1e-3 inside and outside (1e-9 only before); "
        "altimeter_setting's 11 000 m limit gets cases.",
        "New status paths: air_data refused by qc/p0 alone (ps 150 000, pt 13 650 000, "
        "tat 4 500) and with a zero total pressure inside the noise band; mach_from_cas "
        "in its linear branch; max_operating_cas/mach with both limits tiny at their "
        "tie; stall speeds with a subnormal numerator or denominator alone; the same "
        "stall and maximum-operating-speed branches with inputs that are subnormal in "
        "binary32 only (weight or wing area 1e-40, cas 1e-16 with M 1e-15), so a "
        "binary32 build reaches them too.",
        "The altimeter-setting range (the ps input of altimeter_setting, the setting "
        "input of baro_corrected_altitude) is widened by 8 eps relative at both ends: "
        "a setting computed at pressure_altitude(ps) - elevation = 11 000 m lies up to "
        "4.4 eps below the correctly rounded pressure at 11 000 m and was refused by "
        "baro_corrected_altitude; cases near those ends change status.",
    )),
    ("1.0.0", 1, (
        "First suite: 30 catalogue functions (every public function of airdata, "
        "air_data with and without an altimeter setting), constants profile icao.",
        "Format version 1: one JSON file per function, numbers as [shortest decimal, "
        "C99 hex float], per-case condition scale, status and binary32 check level; "
        "JSON Schema (draft 2020-12) per file; C99 headers of the same cases.",
        "Acceptance bound k * eps * scale with k = 8.",
        "Limit functions (LIM-1 .. LIM-5): stall_eas, stall_mach, stall_cas, stall_tas, "
        "crossover_altitude, max_operating_cas, max_operating_mach, ceiling_margin.",
    )),
)

#: The suite's own version.
CURRENT = ENTRIES[0][0]

POLICY = """\
The suite has its own semantic version MAJOR.MINOR.PATCH, independent of the
package version that generated it (recorded in the manifest as `generator`).

- **Major**: an expected value of an existing case moves by more than its tolerance
  (k * eps_binary64 * scale), an expected status changes, a case or a function is
  removed, the constants profile or the tolerance rule changes, or the file format
  (schema version) changes incompatibly. A port that passed the old suite may fail
  the new one.
- **Minor**: cases or functions are added; existing cases are unchanged beyond
  tolerance.
- **Patch**: metadata only: summaries, tags, units text, scales, binary32 check levels, or
  expected values that move by less than their tolerance.

`airdata vectors diff OLD NEW` reports, per function, the cases added, removed and
changed beyond tolerance, the bump the change requires, and whether NEW's version
makes that bump; it exits non-zero when it does not.
"""


def changelog_text() -> str:
    """Text of vectors/CHANGELOG.md."""
    lines = ["# Changelog of the airdata golden vectors", "",
             "Generated by `airdata vectors build` from airdata/vectors/history.py; edit "
             "that file, not this one.", "", "## Versioning policy", "", POLICY.rstrip(), ""]
    for version, schema, notes in ENTRIES:
        lines += [f"## {version} (format version {schema})", ""]
        lines += [f"- {n}" for n in notes]
        lines.append("")
    return "\n".join(lines)


def readme_text(k: int, profile: str) -> str:
    """Text of vectors/README.md: the layout and the fields of a suite."""
    return f"""\
# airdata golden vectors

Generated by `airdata vectors build`; do not edit (the text comes from
airdata/vectors/history.py).  An engineering and verification aid, not certified
flight software: flight software follows its own certification basis (for example
DO-178C) and the authority's rules.

Suite {CURRENT}, constants profile `{profile}`.  Check it with `airdata vectors verify`;
compare two suites with `airdata vectors diff OLD NEW` (see CHANGELOG.md for the
versioning policy).

## Files

- `manifest.json`: suite and schema version, generator version, every constant of
  the profile, SHA-256 and size of every file, valid/invalid case counts per function.
- `functions/<function>.json`: the cases of one function, one case per line.
- `schema/*-v1.schema.json`: JSON Schema (draft 2020-12) of each file; every file
  names its schema in its `schema` field.
- `c/ad_vec_<function>.h`, `c/ad_vectors.h`, `c/ad_vec_common.h`: the same cases as
  C99 `static const` arrays of hex-float literals.
- `CHANGELOG.md`: version history and policy; `README.md`: this text.

## A function file

Header fields: `function`, `c_function`, `summary`, `equations` (ids of
docs/equations.md), `profile`, `suite_version`, `inputs` (name, unit, kind `real` or
`flag`, valid range in words, in the argument order of bindings/c/include/airdata.h),
`outputs` (name, unit), `statuses` (name -> fixed number), `tolerance`, `tags`
(every tag and its meaning), `counts`.

Each case: `id` (12 hex digits of the SHA-256 of the function name and the exact
inputs: stable when other cases change), `tags` (why the case exists), `inputs` and
`expected` by parameter name, `scale` per output, `status` (number), and
`binary32_check`.

Numbers are pairs `[decimal, hex]`: the shortest decimal that reads back to the same
binary64 value and the exact C99 hexadecimal floating constant.  NaN and infinities
are `"nan"`, `"inf"`, `"-inf"` in both forms.  Integer flags (`use_setting`) are JSON
integers.

## Acceptance

For every output: `|got - expected| <= k * eps * scale` with k = {k}, eps = 2^-52 for a
binary64 port and 2^-23 for a binary32 port, and `scale = |y| + sum_i |df/dx_i * x_i|`
(the condition scale, 3 significant digits); NaN is expected exactly where `expected`
is NaN (its `scale` is NaN too).  The returned status must equal `status`.  On any
status other than OK (0) and IMPACT_PRESSURE_ZEROED (4) every output is NaN.

A binary32 port gets the inputs rounded to binary32.  `binary32_check` says how a
binary32 check treats the case: `full` as above; `lenient` when an input or a derived
quantity sits so near a range end that binary32 may decide either way: the status is
not compared and NaN on either side is accepted, two numbers must still agree within
the bound; `skip` when an input or expected value is outside the normal binary32 range.
A binary64 check compares every case fully.

## C runner

bindings/c/runner/ad_vector_runner.c includes `c/ad_vectors.h` and checks a port
through bindings/c/include/airdata.h, with no heap, no file system and no JSON parser:

    cc -std=c99 -Wall -Wextra -Wpedantic -Werror -Ibindings/c/include -Ivectors/c \\
       bindings/c/runner/ad_vector_runner.c <your port sources> -lm -o runner
    ./runner            # add -DAIRDATA_SINGLE to the build for a binary32 port

It prints one line per function (cases, passed, failed, skipped, lenient, worst error
as a fraction of the bound and its case id) and exits non-zero on any failure.

The runner also checks the rest of the port's C interface with the same cases: every
case goes through the batch entry point of bindings/c/include/airdata_batch.h as well
(1-element arrays; status, error count and every output bit-identical to the scalar
call, or the case fails); once per function whose cases passed, the NULL rule (a NULL
output pointer returns INVALID_INPUT, a NULL array of a batch entry point returns
`AD_BATCH_NULL`, and nothing is written; reported as `FAIL <name> contract`); and once,
`ad_check_n` (NaN and infinity invalid in every domain, an unknown domain id makes every
value invalid).  A port that implements only airdata.h adds `-DRUNNER_SCALAR_ONLY`.
With both precisions, these checks alone reach every line of the bundled port under
gcov (tests/test_coverage.py).
"""
