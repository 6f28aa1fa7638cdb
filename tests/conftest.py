"""Shared pytest configuration: hypothesis profiles only.

``default``
    Deterministic (``derandomize=True``: the same examples on every run and every
    machine, so a failure is reproducible from the log alone), a modest number of
    examples so the whole suite stays fast on a two-core machine, no deadline (the
    first call of a function pays numpy's start-up costs) and no example database.
``ci``
    Same determinism, more examples.  Select it with ``HYPOTHESIS_PROFILE=ci``.
"""

from __future__ import annotations

import os

from hypothesis import HealthCheck, settings

_COMMON = {
    "derandomize": True,
    "deadline": None,
    "database": None,
    "suppress_health_check": [HealthCheck.too_slow],
    "print_blob": True,
}

settings.register_profile("default", max_examples=40, **_COMMON)
settings.register_profile("ci", max_examples=300, **_COMMON)
settings.load_profile(os.environ.get("HYPOTHESIS_PROFILE", "default"))
