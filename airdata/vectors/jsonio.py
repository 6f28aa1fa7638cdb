"""Reading and writing the JSON files of a vector suite.

Numbers are stored as a pair of strings ``[decimal, hex]``: the shortest decimal that
reads back to the same binary64 value (Python ``repr``) and the exact C99 hexadecimal
floating constant (``float.hex`` with trailing zero hex digits removed).  JSON has no
NaN or infinity, so these are written ``"nan"``, ``"inf"`` and ``"-inf"`` in both forms.

Loading refuses files that are too large, not UTF-8, not JSON, or that use the
non-standard ``NaN``/``Infinity`` literals or repeat a key, with a :class:`VectorFileError`
naming the file and the problem.
"""

from __future__ import annotations

import hashlib
import json
import math
import os
import re
from pathlib import Path
from typing import Any

__all__ = ["VectorFileError", "MAX_FILE_BYTES", "encode_number", "decode_number", "sha256_hex",
           "hex_literal", "load_json", "dumps_compact"]

#: Largest file a suite may contain; anything bigger is refused before it is read.
MAX_FILE_BYTES = 50 * 1024 * 1024

_HEX_RE = re.compile(r"^(-?)0x([01])(?:\.([0-9a-f]+))?p([+-][0-9]+)$")


class VectorFileError(ValueError):
    """A suite file is missing, oversize or malformed.

    Attributes
    ----------
    path : str
        The file.
    problem : str
        What is wrong.
    """

    def __init__(self, path: str | os.PathLike[str], problem: str) -> None:
        self.path = str(path)
        self.problem = problem
        super().__init__(f"{self.path}: {problem}")


def hex_literal(x: float) -> str:
    """Exact C99 hexadecimal form of ``x``: ``float.hex`` without trailing zero digits.

    NaN and infinities give ``"nan"``, ``"inf"``, ``"-inf"``.
    """
    if math.isnan(x):
        return "nan"
    if math.isinf(x):
        return "inf" if x > 0 else "-inf"
    m = _HEX_RE.match(x.hex())
    assert m is not None, x.hex()
    sign, lead, frac, exp = m.groups()
    frac = (frac or "").rstrip("0")
    return f"{sign}0x{lead}{'.' + frac if frac else ''}p{exp}"


def encode_number(x: float) -> list[str]:
    """``[shortest decimal, exact hex]`` of a binary64 value."""
    x = float(x)
    return [repr(x), hex_literal(x)]


def decode_number(pair: Any, where: str) -> float:
    """The binary64 value of a ``[decimal, hex]`` pair; both forms must agree.

    Raises
    ------
    ValueError
        When the pair is malformed or its two forms name different values
        (the message starts with ``where``).
    """
    if (not isinstance(pair, list) or len(pair) != 2
            or not all(isinstance(s, str) for s in pair)):
        raise ValueError(f"{where}: expected a [decimal, hex] pair of strings, got {pair!r}")
    dec, hx = pair
    try:
        a = float(dec)
        b = float.fromhex(hx) if hx not in ("nan", "inf", "-inf") else float(hx)
    except ValueError:
        raise ValueError(f"{where}: unreadable number {pair!r}") from None
    if math.isnan(a) and math.isnan(b):
        return a
    if a != b or math.copysign(1.0, a) != math.copysign(1.0, b):
        raise ValueError(f"{where}: decimal {dec} and hex {hx} are different values")
    if repr(a) != dec:
        raise ValueError(f"{where}: decimal {dec} is not the shortest round-trip form {a!r}")
    if hex_literal(a) != hx:
        raise ValueError(f"{where}: hex {hx} is not in canonical form {hex_literal(a)}")
    return a


def _no_constants(name: str) -> Any:
    raise ValueError(f"non-standard JSON literal {name}")


def _no_duplicates(pairs: list[tuple[str, Any]]) -> dict[str, Any]:
    out: dict[str, Any] = {}
    for k, v in pairs:
        if k in out:
            raise ValueError(f"duplicate key {k!r}")
        out[k] = v
    return out


def load_json(path: str | os.PathLike[str], max_bytes: int = MAX_FILE_BYTES) -> Any:
    """Parse one suite file, refusing oversize or malformed content.

    Raises
    ------
    VectorFileError
        Missing, not a regular file, larger than ``max_bytes``, not UTF-8, or not
        standard JSON (including NaN/Infinity literals and repeated keys).
    """
    p = Path(path)
    if not p.is_file():
        raise VectorFileError(p, "file not found")
    size = p.stat().st_size
    if size > max_bytes:
        raise VectorFileError(p, f"file is {size} bytes, more than the limit of {max_bytes}")
    data = p.read_bytes()
    if len(data) > max_bytes:  # grew while we looked
        raise VectorFileError(p, f"file is more than the limit of {max_bytes} bytes")
    try:
        text = data.decode("utf-8")
    except UnicodeDecodeError as exc:
        raise VectorFileError(p, f"not UTF-8 ({exc})") from None
    try:
        return json.loads(text, parse_constant=_no_constants,
                          object_pairs_hook=_no_duplicates)
    except json.JSONDecodeError as exc:
        raise VectorFileError(p, f"malformed JSON at line {exc.lineno} column {exc.colno}: "
                                 f"{exc.msg}") from None
    except ValueError as exc:
        raise VectorFileError(p, f"malformed JSON: {exc}") from None


def dumps_compact(value: Any) -> str:
    """Compact, deterministic JSON of one value (no spaces, ASCII only)."""
    return json.dumps(value, separators=(",", ":"), ensure_ascii=True, allow_nan=False)


def sha256_hex(data: bytes) -> str:
    """SHA-256 of ``data`` as 64 hex digits: the digest of a suite file in its manifest
    (one home for the build, ``vectors verify`` and port check's suite loader)."""
    return hashlib.sha256(data).hexdigest()
