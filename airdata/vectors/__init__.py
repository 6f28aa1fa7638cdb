"""Golden test vectors: build, verify and diff versioned suites.

An engineering and verification aid, not certified flight software.

See :mod:`airdata.vectors.build` for the layout of a suite, :mod:`airdata.vectors.scale`
for the tolerance rule and ``vectors/CHANGELOG.md`` for the versioning policy.
"""

from __future__ import annotations
