"""Golden test vectors: build, verify and diff versioned suites.

An engineering and verification aid, not certified flight software.

Python API (the ``airdata vectors`` command calls the same functions):

- :func:`airdata.vectors.build.build_suite` writes a suite (``suite_files`` returns it
  in memory);
- :func:`airdata.vectors.verify.verify_suite` checks one and returns a report of every
  problem (file, case id, what is wrong);
- :func:`airdata.vectors.diff.diff_suites` compares two and states the version bump the
  change needs.

:mod:`airdata.vectors.catalogue` lists the functions and generates the cases,
:mod:`airdata.vectors.scale` holds the tolerance rule (condition scale, k, binary32
check levels), :mod:`airdata.vectors.schema` the JSON Schemas and a small validator,
:mod:`airdata.vectors.cheader` the C99 headers, and ``vectors/CHANGELOG.md`` (from
:mod:`airdata.vectors.history`) the versioning policy.
"""

from __future__ import annotations
