"""The caution every command's help and every report carries: one home for its text.

:data:`CAUTION` is the full text (help epilogs, reports, summaries); the shorter forms are
for places where a line or a field carries it (suite files, figures, coverage output).
"""

from __future__ import annotations

__all__ = ["CAUTION", "CAUTION_LINE", "CAUTION_SUITE"]

CAUTION = (
    "airdata is an engineering and verification aid, not certified flight software. "
    "Flight software follows its own certification basis (for example DO-178C) and the "
    "authority's rules; local regulations and licensed practice take precedence."
)

#: One sentence, for a line of output or a field of a file.
CAUTION_LINE = "An engineering and verification aid, not certified flight software."

#: The ``airdata vectors`` help epilogs.
CAUTION_SUITE = ("An engineering and verification aid, not certified flight software; "
                 "flight software follows its own certification basis.")
