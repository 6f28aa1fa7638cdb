"""The help text of every sub-command, in one place, in the order of the help.

Each entry: the command's words after ``airdata`` -> (its line in the parent's help, its
description).  The desk commands (compute, convert, table, reduce) keep their description,
which is shown as written and holds examples, in their own module.

An engineering and verification aid, not certified flight software.
"""

from __future__ import annotations

__all__ = ["COMMAND_TEXT"]

COMMAND_TEXT: dict[str, tuple[str, str]] = {
    "demo": ("run the reference over the bundled demo sortie",
             "Run the air-data chain over an invented demo sortie."),
    "compute": ("air data from one set of readings (ps, pt, TAT)", ""),
    "convert": ("convert between CAS, EAS, TAS and Mach", ""),
    "table": ("standard-atmosphere table over an altitude range", ""),
    "reduce": ("run the air-data chain over a recorded CSV series", ""),
    "limits": ("speed envelope of an aircraft file (stall, max operating, ceiling)",
               "Tabulate the stall speeds at the lightest and heaviest weight, the maximum "
               "operating speed (lower of the CAS and Mach limits) and the maximum altitude of "
               "an aircraft described in an airdata-aircraft/1 TOML file, in CAS, EAS, TAS and "
               "Mach against pressure altitude."),
    "budget": ("sensor error budget over an altitude x CAS grid",
               "Propagate static-pressure, pitot-pressure and TAT sensor errors (bias and 1-sd "
               "noise) to pressure altitude, CAS, Mach, TAS, SAT and EAS over a grid of pressure "
               "altitude and CAS on a standard day, linearly or by Monte Carlo."),
    "vectors": ("build, verify, compare, locate and copy golden test vector suites",
                "Golden test vectors of every catalogue function: build a suite from the "
                "reference, verify one, compare two, show where the checked-in suites are, or "
                "copy a suite's C headers."),
    "vectors build": ("write a complete suite from the reference",
                      "Write manifest, JSON files, schemas, C headers and changelog. "
                      "Deterministic: byte-identical every time."),
    "vectors verify": ("check a suite: checksums, schema, C headers, values",
                       "Check checksums, schemas and C headers, and re-compute every expected "
                       "value with the installed reference. Values that differ in the last bits, "
                       "within half the acceptance bound (a different numpy or libm build), are "
                       "counted and accepted unless --exact is given. Exit status 1 on any "
                       "problem."),
    "vectors diff": ("compare two suites and check the version bump",
                     "Per function: cases added, removed, changed beyond tolerance; the bump the "
                     "change needs (major/minor/patch) and whether NEW's version makes it (exit "
                     "status 1 if not)."),
    "vectors path": ("print where the checked-in suites and C files are",
                     "Print the directory of each checked-in suite (icao, us1976) and of the C "
                     "interface, port and runner in this installation; with --profile, just that "
                     "suite's directory."),
    "vectors copy": ("copy a suite's C headers into DIR",
                     "Copy the C99 headers of the checked-in suite of --profile (or of --suite "
                     "SUITE) into DIR, for the vector runner of a firmware tree ('airdata port "
                     "copy'). Refuses to overwrite existing files (each is named) unless --force."),
    "vectors export": ("write every case as a flat text stream for any port",
                       "Write every valid and invalid case (id, function, inputs as C99 hex "
                       "floats of the chosen precision) as an airdata-cases text file or CSV "
                       "(docs/exchange.md). Deterministic. Exit status 2 when the suite cannot "
                       "be read."),
    "bench": ("measure speed and memory of the reference and the C port",
              "Time the reference against its floors and peers and the C port against the "
              "reference, as ratios measured side by side in one run on the same seeded inputs; "
              "count the port's instructions with callgrind; measure vector-suite build time and "
              "peak memory."),
    "port": ("check a C port against a golden vector suite",
             "Check a C port of airdata (the bundled one, or your own sources or library "
             "implementing airdata.h) against a golden vector suite."),
    "port check": ("run every vector through a C port and judge it function by function",
                   "Compile a C port on the fly (cffi), run every case of the suite through it "
                   "and print, per function: cases, passed, worst error in units of the bound k "
                   "* eps * scale, the worst case with its inputs, and status mismatches. "
                   "Without --source/--library the bundled port is checked. Exit status 0: all "
                   "pass; 1: some case failed; 2: the check could not run."),
    "port verify": ("judge a results file written by a port anywhere, as check does",
                    "Read an airdata-results file (docs/exchange.md) written by an "
                    "implementation under test from the cases of 'airdata vectors export', and "
                    "judge it exactly as 'port check' judges a port, with the same table. "
                    "Missing, duplicate, unknown or malformed lines and a truncated file are "
                    "listed with line numbers and fail the verdict. Exit status 0: all pass; 1: "
                    "some case failed or the file has problems; 2: the verification could not "
                    "run."),
    "port copy": ("copy the bundled C port (sources, headers, Makefile, runner) into DIR",
                  "Copy the bundled C99 port into DIR: Makefile, include/ (airdata.h, "
                  "airdata_batch.h), src/ (the port), runner/ (the vector runner) and "
                  "tests/driver.c, in that layout. 'make -C DIR' builds it; 'make -C DIR runner "
                  "VECTORS=HEADERS' builds and runs the vector runner against the headers "
                  "'airdata vectors copy HEADERS' wrote. Refuses to overwrite existing files "
                  "(each is named) unless --force."),
    "port coverage": ("MC/DC, branch, line and region coverage of a C port by the vectors",
                      "Compile a C port with clang 19 source-based coverage and MC/DC "
                      "(-fprofile-instr-generate -fcoverage-mapping -fcoverage-mcdc), run every "
                      "case of the suite through it with the vector runner in each precision "
                      "(scalar functions, NULL rules, and the batch entry points when the "
                      "sources define them), and report the covered regions, lines, branches and "
                      "MC/DC conditions, listing by file:line what no vector exercises. Needs "
                      "clang-19, llvm-profdata-19 and llvm-cov-19 (Debian: clang-19 llvm-19 "
                      "libclang-rt-19-dev). Without --source the bundled port is measured. Exit "
                      "status 0: measured; 1: MC/DC below --fail-under; 2: could not run, or the "
                      "run stopped early. An engineering and verification aid, not certified "
                      "flight software."),
}
