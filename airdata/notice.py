"""The caution every command's help and every report carries: one home for its text."""

from __future__ import annotations

__all__ = ["CAUTION"]

CAUTION = (
    "airdata is an engineering and verification aid, not certified flight software. "
    "Flight software follows its own certification basis (for example DO-178C) and the "
    "authority's rules; local regulations and licensed practice take precedence."
)
