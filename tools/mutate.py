#!/usr/bin/env python3
"""Mutation adequacy of the golden vectors against the C port.

An engineering and verification aid, not certified flight software.

Every mutant changes one token at one place in one file of ``bindings/c/src``; the
mutated port is compiled and linked with the vector runner
(``bindings/c/runner/ad_vector_runner.c``) and run.  A mutant is *killed* when the
runner exits non-zero, *killed by timeout* when a run exceeds ``--timeout``,
*stillborn* when it does not compile (not counted).  A survivor is classified as
*equivalent* (with a reason) or left as a survivor (a gap of the vectors, or
``unclassified``).  The figure is killed / (total - stillborn - equivalent).

Operators and classification: docs/mutation.md.

Usage::

    python3 tools/mutate.py --sample 120 --seed 1 --jobs 2 --report /tmp/mutate.json
"""

from __future__ import annotations

import argparse
import concurrent.futures
import dataclasses
import json
import math
import os
import random
import re
import shutil
import struct
import subprocess
import sys
import tempfile
import threading
import time
from collections.abc import Callable, Iterable, Sequence
from pathlib import Path
from typing import Any

DISCLAIMER = "An engineering and verification aid, not certified flight software."

#: Acceptance bound of the vectors, |got - expected| <= K eps scale (vectors/c/ad_vec_common.h).
VEC_K = 8.0
EPS = {"binary64": 2.0**-52, "binary32": 2.0**-23}

#: Status identifiers and the status each is replaced by (operator ``status``).
STATUS_SWAP = {
    "AD_OK": "AD_OUT_OF_RANGE",
    "AD_OUT_OF_RANGE": "AD_OK",
    "AD_INVALID_INPUT": "AD_OUT_OF_RANGE",
    "AD_NO_CONVERGENCE": "AD_OK",
    "AD_IMPACT_PRESSURE_ZEROED": "AD_OK",
}
#: Relational replacements: the boundary variant, then the reversed direction.
REL_SWAP = {
    "<": ("<=", ">"),
    "<=": ("<", ">="),
    ">": (">=", "<"),
    ">=": (">", "<="),
    "==": ("!=",),
    "!=": ("==",),
}
ARITH_SWAP = {"+": "-", "-": "+", "*": "/", "/": "*"}
BOOL_SWAP = {"&&": "||", "||": "&&"}

OPERATORS = ("const", "rel", "arith", "loop", "status", "bool", "range")

#: Double-double low parts: macro name -> macro of the high part (ad_constants.h).
LOW_PARTS = {"AD_R_LO": "AD_R", "AD_SUTH_BETA_LO": "AD_SUTH_BETA"}
#: Layer-row entries that are low parts, index -> index of the high part (ad_internal.h).
LAYER_LOW = {11: 2, 12: 1, 13: 3}
#: Start-value coefficients of the supersonic Newton solver (pitot.c): a perturbed start
#: is corrected by the iteration.
#: AD_PHI_INF (7/7.2)^2.5 scales u_max, which only the start value uses (there is no upper
#: clamp).
SOLVER_START = {"AD_K_S1", "AD_K_S2", "AD_K_S3", "AD_K_5_14", "AD_PHI_INF"}
#: Upper range ends that a derived check shadows: every value above the shadowing limit
#: is refused by that check with the same status, OUT_OF_RANGE, so raising such an end
#: changes no result while the end stays above that limit (checked for each mutant from
#: the profiles' constants).  Macro -> (what refuses the values, the limit from a profile).
SHADOWED_HI: dict[str, tuple[str, Callable[[Any], float]]] = {
    "AD_CAS_LIMIT_HI": (
        "a CAS limit above 10 a0 is refused by the derived check of its sea-level Mach "
        "number (limits.c)", lambda p: 10.0 * p.a0),
    "AD_IMPACT_PRESSURE_HI": (
        "an impact pressure above RATIO_MAX max(p_max, p0) is refused by the derived qc/ps "
        "or qc/p0 check (pitot.c)",
        lambda p: _ratio_limit() * max(p.p_max, p.p0)),
    "AD_SUBSONIC_MACH_LIMIT_HI": (
        "a Mach limit of 1 or more is refused by crossover_altitude's subsonic check "
        "(limits.c)", lambda p: 1.0),
}


def _ratio_limit() -> float:
    from airdata.pitot import RATIO_LIMIT
    return RATIO_LIMIT


def _shadowed(m: Mutant) -> str | None:
    """The reason a raised upper range end of ``m`` changes no result, or None."""
    if m.macro not in SHADOWED_HI:
        return None
    from airdata.profiles import get_profile
    old = parse_float_literal(m.original)[0]
    new = parse_float_literal(m.replacement)[0]
    what, limit_of = SHADOWED_HI[m.macro]
    limit = max(limit_of(get_profile(name)) for name in ("icao", "us1976"))
    if not new > old >= limit:
        return None
    return (f"range end shadowed: {m.macro} raised from {old!r} to {new!r}, but {what}: "
            f"every value above {limit:.6g} has that status already")


#: Loop-bound macros that count iterations of a convergent solver.
SOLVER_STEPS = {"AD_NEWTON_STEPS"}
#: An operand naming a limit of a domain or of a derived check.
LIMIT_RE = re.compile(r"^(AD_\w*_(LO|HI|LIMIT|MIN|MAX|BASE)|lo|hi)$")

C_KEYWORDS = {
    "auto", "break", "case", "char", "const", "continue", "default", "do", "double",
    "else", "enum", "extern", "float", "for", "goto", "if", "inline", "int", "long",
    "register", "restrict", "return", "short", "signed", "sizeof", "static", "struct",
    "switch", "typedef", "union", "unsigned", "void", "volatile", "while", "_Bool",
}
BASE_TYPES = {
    "char", "double", "float", "int", "long", "short", "signed", "unsigned", "void",
    "_Bool", "size_t", "uint8_t", "uint16_t", "uint32_t", "uint64_t", "int32_t",
    "const", "struct", "enum",
}

# --------------------------------------------------------------------------- tokenizer

TOKEN_RE = re.compile(
    r"""
    (?P<ws>[ \t\r\f\v]+|\\\n)
  | (?P<nl>\n)
  | (?P<comment>/\*.*?\*/|//[^\n]*)
  | (?P<string>"(?:\\.|[^"\\\n])*"|'(?:\\.|[^'\\\n])*')
  | (?P<number>
        0[xX][0-9a-fA-F]*\.?[0-9a-fA-F]*[pP][+-]?[0-9]+[fFlL]?
      | 0[xX][0-9a-fA-F]+[uUlL]*
      | (?:[0-9]+\.[0-9]*|\.[0-9]+)(?:[eE][+-]?[0-9]+)?[fFlL]?
      | [0-9]+[eE][+-]?[0-9]+[fFlL]?
      | [0-9]+[uUlL]*)
  | (?P<ident>[A-Za-z_][A-Za-z_0-9]*)
  | (?P<op>->|\+\+|--|<<=|>>=|<=|>=|==|!=|&&|\|\||[-+*/%&|^<>!=]=|<<|>>|\.\.\.
      |[-+*/%&|^~!<>=?:;,.(){}\[\]\#])
    """,
    re.VERBOSE | re.DOTALL,
)


@dataclasses.dataclass(frozen=True)
class Token:
    """One token of a C source file.

    Parameters
    ----------
    kind : str
        ``number``, ``ident``, ``op``, ``comment``, ``string`` or ``pp`` (a token of a
        preprocessor line).
    text : str
        The token's text.
    start : int
        Offset of its first character in the file.
    line, col : int
        1-based line and column.
    configs : frozenset of str
        Build configurations in which the token is compiled (see `CONFIGS`).
    directive : str
        For ``pp`` tokens: the directive (``define``, ``if``, ...), else ``""``.
    define : str
        For the body tokens of an object-like ``#define``: the macro's name.
    """

    kind: str
    text: str
    start: int
    line: int
    col: int
    configs: frozenset = frozenset()
    directive: str = ""
    define: str = ""


#: Build configurations: name -> (macros defined, precision, vector folder).
CONFIGS = {
    "icao-binary64": ((), "binary64", "vectors/c"),
    "icao-binary32": (("AIRDATA_SINGLE",), "binary32", "vectors/c"),
    "us1976-binary64": (("AIRDATA_PROFILE_US1976",), "binary64", "vectors-us1976/c"),
    "us1976-binary32": (
        ("AIRDATA_SINGLE", "AIRDATA_PROFILE_US1976"), "binary32", "vectors-us1976/c"),
}
ALL_CONFIGS = frozenset(CONFIGS)


def _eval_condition(expr: str, defined: set[str]) -> bool:
    """Evaluate a ``#if`` condition with ``defined(...)`` and ``! && ||`` only.

    Identifiers not in `defined` count as 0 (undefined); anything else the small
    evaluator cannot read counts as true (the branch is kept as compiled).
    """
    expr = re.sub(r"/\*.*?\*/|//.*", "", expr)
    expr = re.sub(r"defined\s*\(\s*(\w+)\s*\)|defined\s+(\w+)",
                  lambda m: "1" if (m.group(1) or m.group(2)) in defined else "0", expr)
    expr = expr.replace("&&", " and ").replace("||", " or ")
    expr = re.sub(r"!(?!=)", " not ", expr)
    expr = re.sub(r"\b[A-Za-z_]\w*\b",
                  lambda m: m.group(0) if m.group(0) in ("and", "or", "not")
                  else ("1" if m.group(0) in defined else "0"), expr)
    try:
        return bool(eval(expr, {"__builtins__": {}}, {}))  # noqa: S307 - digits and and/or/not
    except Exception:  # noqa: BLE001 - an unreadable condition keeps the branch
        return True


def tokenize(source: str) -> list[Token]:
    """Split C source into tokens, marking comments, strings and preprocessor lines.

    Every token carries the set of build configurations in which it is compiled
    (conditional compilation evaluated per configuration).  Tokens of a preprocessor
    line have kind ``pp``; the body of an object-like ``#define NAME body`` keeps its
    real kinds but records the macro's name in ``define`` (only numeric constants and
    loop bounds there are ever mutated).

    Parameters
    ----------
    source : str
        The text of one C file.

    Returns
    -------
    list of Token
        Whitespace and newlines dropped.
    """
    tokens: list[Token] = []
    line, line_start = 1, 0
    # per configuration: stack of (this branch active, some branch taken, parent active)
    stacks: dict[str, list[list[bool]]] = {c: [] for c in CONFIGS}
    pos = 0
    at_line_start = True
    in_pp = False
    directive = ""
    define_name = ""
    pp_index = 0  # index of the token within the preprocessor line

    def active() -> frozenset:
        return frozenset(c for c, st in stacks.items() if all(e[0] for e in st))

    current = active()
    while pos < len(source):
        m = TOKEN_RE.match(source, pos)
        if m is None:
            raise ValueError(f"cannot tokenize at line {line}: {source[pos:pos + 20]!r}")
        kind = m.lastgroup or ""
        text = m.group(0)
        col = pos - line_start + 1
        if kind == "nl" or (kind == "ws" and text == "\\\n"):
            if kind == "nl":
                if in_pp:
                    in_pp = False
                    directive = ""
                    define_name = ""
                at_line_start = True
            line += 1
            line_start = m.end()
            pos = m.end()
            continue
        if kind == "ws":
            pos = m.end()
            continue
        if kind == "comment":
            tokens.append(Token("comment", text, pos, line, col, current))
            nls = text.count("\n")
            if nls:
                line += nls
                line_start = pos + text.rfind("\n") + 1
            pos = m.end()
            continue
        if at_line_start and text == "#":
            in_pp = True
            pp_index = 0
            end = source.find("\n", pos)
            end = len(source) if end < 0 else end
            while source[end - 1:end] == "\\":
                end = source.find("\n", end + 1)
                end = len(source) if end < 0 else end
            rest = source[m.end():end]
            dm = re.match(r"\s*(\w+)\s*(.*)", rest, re.DOTALL)
            directive = dm.group(1) if dm else ""
            arg = dm.group(2) if dm else ""
            for cfg, st in stacks.items():
                defined = set(CONFIGS[cfg][0])
                parent = all(e[0] for e in st)
                if directive in ("if", "ifdef", "ifndef"):
                    if directive == "ifdef":
                        val = arg.split()[0] in defined if arg.split() else False
                    elif directive == "ifndef":
                        val = arg.split()[0] not in defined if arg.split() else True
                    else:
                        val = _eval_condition(arg, defined)
                    st.append([parent and val, val, parent])
                elif directive == "elif" and st:
                    top = st[-1]
                    val = (not top[1]) and _eval_condition(arg, defined)
                    top[0] = top[2] and val
                    top[1] = top[1] or val
                elif directive == "else" and st:
                    top = st[-1]
                    top[0] = top[2] and not top[1]
                    top[1] = True
                elif directive == "endif" and st:
                    st.pop()
            if directive in ("if", "ifdef", "ifndef", "elif", "else", "endif"):
                # the directive line itself counts as compiled where its parent is
                current_line_cfg = current | active()
                current = active()
            else:
                current_line_cfg = current
            tokens.append(Token("pp", text, pos, line, col, current_line_cfg, directive))
            at_line_start = False
            pos = m.end()
            continue
        at_line_start = False
        if in_pp:
            pp_index += 1
            cfg_set = current
            if directive == "define" and pp_index == 2:
                define_name = text if kind == "ident" else ""
                # function-like macro: name immediately followed by "("
                if source[m.end():m.end() + 1] == "(":
                    define_name = ""
                tokens.append(Token("pp", text, pos, line, col, cfg_set, directive))
            elif directive == "define" and pp_index > 2 and define_name:
                tokens.append(Token(kind, text, pos, line, col, cfg_set, directive,
                                    define_name))
            else:
                tokens.append(Token("pp", text, pos, line, col, cfg_set, directive))
            pos = m.end()
            continue
        tokens.append(Token(kind, text, pos, line, col, current))
        pos = m.end()
    return tokens


def code_tokens(tokens: Sequence[Token]) -> list[Token]:
    """The tokens that are compiled code (no comments, strings or preprocessor lines)."""
    return [t for t in tokens if t.kind in ("number", "ident", "op") and not t.directive]


# --------------------------------------------------------------------------- numbers


def _is_float_literal(text: str) -> bool:
    t = text.lower()
    if t.startswith("0x"):
        return "p" in t
    return "." in t or "e" in t


def parse_float_literal(text: str) -> tuple[float, str, str]:
    """Value, precision and suffix of a floating literal (decimal or C99 hex float).

    Returns
    -------
    value : float
        The literal's value in binary64 (a binary32 literal rounded to binary32).
    precision : str
        ``binary32`` for an ``f`` suffix, else ``binary64``.
    suffix : str
        The suffix as written (``""``, ``"f"``, ``"F"``, ``"l"``, ``"L"``).
    """
    suffix = text[-1] if text[-1] in "fFlL" else ""
    body = text[:-1] if suffix else text
    value = float.fromhex(body) if body.lower().startswith("0x") else float(body)
    precision = "binary32" if suffix in ("f", "F") else "binary64"
    if precision == "binary32":
        value = _to_f32(value)
    return value, precision, suffix


def _to_f32(x: float) -> float:
    return float(struct.unpack("f", struct.pack("f", x))[0])


def _shortest(x: float, precision: str) -> str:
    """Shortest decimal that reads back as x in the given precision."""
    if precision == "binary64":
        return repr(x)
    for p in range(1, 10):
        s = f"{x:.{p}g}"
        if _to_f32(float(s)) == x:
            return s
    return f"{x:.9g}"


def format_like(original: str, value: float, precision: str, suffix: str) -> str:
    """Write value in the style of the original literal (hex float or decimal)."""
    if precision == "binary32":
        value = _to_f32(value)
    if original.lower().startswith("0x"):
        text = re.sub(r"\.?0+p", "p", value.hex())
    else:
        text = _shortest(value, precision)
        if not _is_float_literal(text):
            text += ".0"
    return text + suffix


def perturb_digit(value: float, digit: int) -> float:
    """value plus one unit in its `digit`-th significant decimal digit (away from zero).

    Examples
    --------
    >>> round(perturb_digit(287.05287, 6), 8)
    287.05387
    """
    if value == 0.0:
        return 10.0 ** (1 - digit)
    e = math.floor(math.log10(abs(value)))
    return value + math.copysign(10.0 ** (e - digit + 1), value)


def firmware_round(value: float, precision: str, digits: int = 5) -> float | None:
    """The value rounded to `digits` significant digits, as a firmware table writes it.

    None when the constant is an integer (like 101325, a defining value of the standard)
    or has at most `digits` significant digits (like 288.15).
    """
    short = _shortest(value, precision)
    mant = re.sub(r"[eE].*", "", short).replace("-", "").replace(".", "").lstrip("0")
    if len(mant.rstrip("0")) <= digits or float(value).is_integer():
        return None
    r = float(f"{value:.{digits}g}")
    return r


# --------------------------------------------------------------------------- mutants


@dataclasses.dataclass
class Mutant:
    """One mutant: one token replaced at one place in one file.

    Parameters
    ----------
    id : str
        Stable id, ``<file>:<line>:<col>:<operator>:<k>``.
    file : str
        Path relative to the repository root.
    line, col : int
        Position of the token (1-based).
    start, end : int
        Character offsets of the replaced token.
    operator : str
        One of `OPERATORS`; ``detail`` says which variant.
    detail : str
        The variant (``d4``, ``d6``, ``d9``, ``firmware``, ``boundary``, ``reverse``...).
    original, replacement : str
        Token text before and after.
    configs : list of str
        Build configurations that compile the token.
    context : str
        The source line, stripped.
    macro : str
        For a ``#define`` body token: the macro's name.
    rel_size : float or None
        For constant mutants: relative size of the change, |new - old| / |old| (for a
        double-double low part: relative to its high part).
    """

    id: str
    file: str
    line: int
    col: int
    start: int
    end: int
    operator: str
    detail: str
    original: str
    replacement: str
    configs: list
    context: str
    macro: str = ""
    rel_size: float | None = None
    layer_index: int = -1
    outcome: str = ""
    killed_by: str = ""
    runs: dict = dataclasses.field(default_factory=dict)
    classification: str = ""
    reason: str = ""
    seconds: float = 0.0

    def apply(self, source: str) -> str:
        """The mutated source."""
        assert source[self.start:self.end] == self.original, self.id
        return source[:self.start] + self.replacement + source[self.end:]


def _type_names(root: Path) -> set[str]:
    names = set(BASE_TYPES)
    for p in list((root / "bindings/c/include").glob("*.h")) + list(
            (root / "bindings/c/src").glob("*.h")) + list((root / "bindings/c/src").glob("*.c")):
        text = p.read_text()
        names.update(re.findall(r"}\s*(\w+)\s*;", text))
        names.update(re.findall(r"typedef\s+[\w\s]+?\s(\w+)\s*;", text))
    return names


def _prev_code(toks: Sequence[Token], i: int) -> Token | None:
    return toks[i - 1] if i > 0 else None


def _is_binary(toks: Sequence[Token], i: int, types: set[str]) -> bool:
    """Is the operator at toks[i] a binary one (not unary, not a pointer declarator)?"""
    prev = _prev_code(toks, i)
    if prev is None or prev.line != toks[i].line and prev.text in (";", "{", "}"):
        return False
    if prev.kind == "number":
        return True
    if prev.kind == "ident":
        if prev.text in C_KEYWORDS or prev.text in types:
            return False
        return True
    return prev.text in (")", "]")


def _for_headers(toks: Sequence[Token]) -> list[tuple[int, int]]:
    """Index ranges (open paren, close paren) of every ``for (...)`` header."""
    out = []
    for i, t in enumerate(toks):
        if t.text == "for" and i + 1 < len(toks) and toks[i + 1].text == "(":
            depth = 0
            for j in range(i + 1, len(toks)):
                if toks[j].text == "(":
                    depth += 1
                elif toks[j].text == ")":
                    depth -= 1
                    if depth == 0:
                        out.append((i + 1, j))
                        break
    return out


def _matching_open(toks: Sequence[Token], close: int) -> int:
    depth = 0
    for j in range(close, -1, -1):
        if toks[j].text == ")":
            depth += 1
        elif toks[j].text == "(":
            depth -= 1
            if depth == 0:
                return j
    return -1


def _matching_close(toks: Sequence[Token], open_: int) -> int:
    depth = 0
    for j in range(open_, len(toks)):
        if toks[j].text == "(":
            depth += 1
        elif toks[j].text == ")":
            depth -= 1
            if depth == 0:
                return j
    return -1


_STOP = {",", ";", "?", ":", "=", "&&", "||", "==", "!=", "return", "{", "}", "<", ">",
         "<=", ">=", "+=", "-=", "*=", "/="}


def operand_span(toks: Sequence[Token], i: int) -> tuple[int, int]:
    """Token index range [lo, hi] of the expression ``A op B`` around a relational op."""
    depth = 0
    lo = i - 1
    while lo >= 0:
        t = toks[lo].text
        if t in (")", "]"):
            depth += 1
        elif t in ("(", "["):
            if depth == 0:
                break
            depth -= 1
        elif depth == 0 and t in _STOP:
            break
        lo -= 1
    depth = 0
    hi = i + 1
    while hi < len(toks):
        t = toks[hi].text
        if t in ("(", "["):
            depth += 1
        elif t in (")", "]"):
            if depth == 0:
                break
            depth -= 1
        elif depth == 0 and t in _STOP:
            break
        hi += 1
    return lo + 1, hi - 1


def mutants_of_file(root: Path, rel: str, types: set[str] | None = None,
                    loop_macros: set[str] | None = None) -> list[Mutant]:
    """Every mutant of one source file, in source order.

    Parameters
    ----------
    root : Path
        Repository root.
    rel : str
        File path relative to `root`.
    types : set of str, optional
        Type names (to tell ``T *p`` from ``a * b``); read from the headers if None.
    loop_macros : set of str, optional
        Macros used in a ``for`` header anywhere in the port (loop bounds).
    """
    source = (root / rel).read_text()
    return mutants_of_source(source, rel, types if types is not None else _type_names(root),
                             loop_macros or set())


def mutants_of_source(source: str, rel: str, types: set[str],
                      loop_macros: set[str]) -> list[Mutant]:
    """Every mutant of one C source text (see `mutants_of_file`)."""
    all_toks = tokenize(source)
    lines = source.splitlines()
    out: list[Mutant] = []
    counter: dict[tuple[int, int, str], int] = {}

    def add(t: Token, op: str, detail: str, repl: str, **kw: object) -> None:
        if repl == t.text or not t.configs:
            return
        key = (t.line, t.col, op)
        k = counter.get(key, 0)
        counter[key] = k + 1
        out.append(Mutant(
            id=f"{rel}:{t.line}:{t.col}:{op}:{k}", file=rel, line=t.line, col=t.col,
            start=t.start, end=t.start + len(t.text), operator=op, detail=detail,
            original=t.text, replacement=repl, configs=sorted(t.configs),
            context=lines[t.line - 1].strip()[:160], macro=t.define, **kw))  # type: ignore[arg-type]

    # --- constants (code and numeric #define bodies) and loop bounds in #defines
    defines: dict[str, list[Token]] = {}
    for t in all_toks:
        if t.define:
            defines.setdefault(f"{t.line}:{t.define}", []).append(t)
    define_values: dict[str, float] = {}
    for body in defines.values():
        nums = [t for t in body if t.kind == "number" and _is_float_literal(t.text)]
        if len(nums) == 1 and all(t.kind != "ident" for t in body):
            define_values[f"{body[0].define}@{','.join(sorted(body[0].configs))}"] = (
                parse_float_literal(nums[0].text)[0])

    def const_mutants(t: Token, layer_index: int = -1, hi_value: float | None = None) -> None:
        value, precision, suffix = parse_float_literal(t.text)
        if t.define in LOW_PARTS:
            hi_value = define_values.get(
                f"{LOW_PARTS[t.define]}@{','.join(sorted(t.configs))}")
        variants: list[tuple[str, float]] = [
            (f"d{d}", perturb_digit(value, d)) for d in (4, 6, 9)]
        fw = firmware_round(value, precision)
        if fw is not None:
            variants.append(("firmware", fw))
        for detail, new in variants:
            new_text = format_like(t.text, new, precision, suffix)
            new_val = parse_float_literal(new_text)[0]
            if new_val == value:
                continue  # rounds back to the same constant: no mutant
            ref = abs(hi_value) if hi_value else abs(value)
            if ref == 0.0:
                rel_size = math.inf
            else:
                rel_size = abs(new_val - value) / ref
            add(t, "const", detail, new_text, rel_size=rel_size, layer_index=layer_index)

    for body in defines.values():
        name = body[0].define
        row: dict[int, float] = {}
        idx = 0
        depth = 0
        for t in body:
            if t.text == "{":
                depth += 1
            elif t.text == "}":
                depth -= 1
            elif t.text == "," and depth == 1:
                idx += 1
            elif depth == 1 and t.kind == "number" and _is_float_literal(t.text):
                row[idx] = parse_float_literal(t.text)[0]
        idx = 0
        depth = 0
        for t in body:
            if t.text == "{":
                depth += 1
            elif t.text == "}":
                depth -= 1
            elif t.text == "," and depth == 1:
                idx += 1
            if t.kind != "number":
                continue
            if _is_float_literal(t.text):
                li = idx if depth == 1 else -1
                const_mutants(t, li, row.get(LAYER_LOW[li]) if li in LAYER_LOW else None)
            elif name in loop_macros and len(body) == 1:
                n = int(re.sub(r"[uUlL]+$", "", t.text), 0)
                suf = re.search(r"[uUlL]*$", t.text).group(0)  # type: ignore[union-attr]
                if n > 0:
                    add(t, "loop", "bound-1", f"{n - 1}{suf}")
                add(t, "loop", "bound+1", f"{n + 1}{suf}")

    toks = code_tokens(all_toks)
    for_ranges = _for_headers(toks)

    def in_for(i: int) -> bool:
        return any(a < i < b for a, b in for_ranges)

    # Debug-only assertions (ad_internal.h: AD_ASSERT compiles to nothing in a release
    # build, the one the vectors judge): their arguments are not mutated.
    asserts = [(k + 1, _matching_close(toks, k + 1)) for k, t in enumerate(toks)
               if t.text == "AD_ASSERT" and k + 1 < len(toks) and toks[k + 1].text == "("]

    for i, t in enumerate(toks):
        if any(a < i < b for a, b in asserts):
            continue
        if t.kind == "number":
            if _is_float_literal(t.text):
                const_mutants(t)
            elif in_for(i):
                n = int(re.sub(r"[uUlL]+$", "", t.text), 0)
                suf = re.search(r"[uUlL]*$", t.text).group(0)  # type: ignore[union-attr]
                if n > 0:
                    add(t, "loop", "literal-1", f"{n - 1}{suf}")
                add(t, "loop", "literal+1", f"{n + 1}{suf}")
        elif t.kind == "ident" and t.text in STATUS_SWAP:
            add(t, "status", "swap", STATUS_SWAP[t.text])
        elif t.kind == "op":
            if t.text in REL_SWAP:
                for detail, repl in zip(("boundary", "reverse"), REL_SWAP[t.text], strict=False):
                    if t.text in ("==", "!="):
                        detail = "negate"
                    add(t, "rel", detail, repl)
            elif t.text in ARITH_SWAP and _is_binary(toks, i, types):
                add(t, "arith", "swap", ARITH_SWAP[t.text])
            elif t.text in BOOL_SWAP:
                add(t, "bool", "swap", BOOL_SWAP[t.text])

    # --- removal of a range check: the condition of an `if` or `?:` that yields a
    #     non-OK status is forced false, "(" -> "(0 && " (one token changed).
    bad = set(STATUS_SWAP) - {"AD_OK"}
    for i, t in enumerate(toks):
        if t.text == "if" and i + 1 < len(toks) and toks[i + 1].text == "(":
            close = _matching_close(toks, i + 1)
            body = toks[close + 1:close + 6]
            if any(b.text in bad for b in body):
                add(toks[i + 1], "range", "remove-if", "(0 && ")
        elif t.text == "?" and i + 1 < len(toks) and toks[i + 1].text in bad:
            if toks[i - 1].text == ")":
                op_ = _matching_open(toks, i - 1)
                if op_ >= 0:
                    add(toks[op_], "range", "remove-ternary", "(0 && ")
    out.sort(key=lambda m: (m.start, m.operator, m.detail, m.replacement))
    return out


def port_files(root: Path) -> list[str]:
    """The port's source files, relative to root, sorted."""
    src = root / "bindings/c/src"
    return sorted(str(p.relative_to(root)) for p in src.iterdir()
                  if p.suffix in (".c", ".h"))


def all_mutants(root: Path, only: Sequence[str] = ()) -> list[Mutant]:
    """Every mutant of the port (or of the files in `only`)."""
    types = _type_names(root)
    files = port_files(root)
    loop_macros: set[str] = set()
    for f in files:
        toks = code_tokens(tokenize((root / f).read_text()))
        for a, b in _for_headers(toks):
            loop_macros.update(t.text for t in toks[a:b] if t.kind == "ident")
    if only:
        wanted = {Path(o).name for o in only}
        files = [f for f in files if Path(f).name in wanted]
        if not files:
            raise SystemExit(f"--only: no port file named {sorted(wanted)}")
    out: list[Mutant] = []
    for f in files:
        out.extend(mutants_of_file(root, f, types, loop_macros))
    return out


def sample_mutants(mutants: Sequence[Mutant], n: int, seed: int) -> list[Mutant]:
    """A deterministic sample of n mutants, stratified by operator.

    Each operator gets a share proportional to its count and at least one mutant; the
    choice within an operator is ``random.Random(seed)``.  The sample is returned in
    source order.
    """
    if n >= len(mutants):
        return list(mutants)
    rng = random.Random(seed)
    groups: dict[str, list[Mutant]] = {}
    for m in mutants:
        groups.setdefault(m.operator, []).append(m)
    ops = sorted(groups)
    quota = {op: min(len(groups[op]), max(1, round(n * len(groups[op]) / len(mutants))))
             for op in ops}
    while sum(quota.values()) > n:
        op = max(ops, key=lambda o: quota[o])
        quota[op] -= 1
    while sum(quota.values()) < n:
        spare = [o for o in ops if quota[o] < len(groups[o])]
        op = max(spare, key=lambda o: len(groups[o]) - quota[o])
        quota[op] += 1
    chosen: list[Mutant] = []
    for op in ops:
        chosen.extend(rng.sample(groups[op], quota[op]))
    order = {m.id: k for k, m in enumerate(mutants)}
    return sorted(chosen, key=lambda m: order[m.id])


# --------------------------------------------------------------------------- building


def compiler() -> str | None:
    """The C compiler: $CC, else cc, else gcc (None if there is none)."""
    for c in (os.environ.get("CC", ""), "cc", "gcc"):
        if c and shutil.which(c):
            return c
    return None


CFLAGS = ["-std=c99", "-O2", "-ffp-contract=off"]


class Builder:
    """Compiles the runner and the port once per configuration, then mutants.

    Parameters
    ----------
    root : Path
        Repository root.
    work : Path
        Scratch folder (objects, mutant folders).
    cc : str
        C compiler.
    configs : sequence of str
        Configurations to use (keys of `CONFIGS`).
    timeout : float
        Seconds allowed for one runner run.
    """

    def __init__(self, root: Path, work: Path, cc: str, configs: Sequence[str],
                 timeout: float) -> None:
        self.root = root
        self.work = work
        self.cc = cc
        self.configs = list(configs)
        self.timeout = timeout
        self.src = root / "bindings/c/src"
        self.cfiles = sorted(p.name for p in self.src.glob("*.c"))
        self._n = 0
        self._lock = threading.Lock()

    def _flags(self, cfg: str) -> list[str]:
        return CFLAGS + [f"-D{d}" for d in CONFIGS[cfg][0]]

    def _compile(self, cfg: str, source: Path, obj: Path, incs: Sequence[Path]) -> bool:
        cmd = [self.cc, *self._flags(cfg), "-w", *[f"-I{p}" for p in incs], "-c",
               str(source), "-o", str(obj)]
        r = subprocess.run(cmd, capture_output=True, text=True)
        return r.returncode == 0

    def _incs(self, cfg: str, src: Path | None = None) -> list[Path]:
        return [self.root / "bindings/c/include", src or self.src,
                self.root / CONFIGS[cfg][2]]

    def prepare(self, jobs: int) -> dict[str, str]:
        """Compile runner and port objects per configuration; check the baseline passes.

        Returns
        -------
        dict
            Configuration -> baseline summary line.
        """
        tasks = []
        for cfg in self.configs:
            d = self.work / "base" / cfg
            d.mkdir(parents=True, exist_ok=True)
            tasks.append((cfg, self.root / "bindings/c/runner/ad_vector_runner.c",
                          d / "runner.o"))
            for f in self.cfiles:
                tasks.append((cfg, self.src / f, d / f.replace(".c", ".o")))
        with concurrent.futures.ThreadPoolExecutor(max(1, jobs)) as ex:
            oks = list(ex.map(lambda a: self._compile(a[0], a[1], a[2], self._incs(a[0])),
                              tasks))
        if not all(oks):
            bad = [str(t[1]) for t, ok in zip(tasks, oks, strict=True) if not ok]
            raise RuntimeError(f"the unmutated port does not compile: {bad}")
        base = {}
        for cfg in self.configs:
            d = self.work / "base" / cfg
            exe = d / "runner"
            self._link(d / "runner.o", [d / f.replace(".c", ".o") for f in self.cfiles], exe)
            rc, out, _ = self._run(exe)
            last = out.strip().splitlines()[-1] if out.strip() else ""
            if rc != 0:
                raise RuntimeError(f"the unmutated port fails the vectors in {cfg}: {last}")
            base[cfg] = last
        return base

    def _link(self, runner: Path, objs: Sequence[Path], exe: Path) -> bool:
        r = subprocess.run([self.cc, str(runner), *map(str, objs), "-lm", "-o", str(exe)],
                           capture_output=True, text=True)
        return r.returncode == 0

    def _run(self, exe: Path) -> tuple[int | str, str, str]:
        try:
            r = subprocess.run([str(exe)], capture_output=True, text=True,
                               timeout=self.timeout)
        except subprocess.TimeoutExpired:
            return "timeout", "", ""
        return r.returncode, r.stdout, r.stderr

    def build_and_run(self, rel: str, text: str, cfg: str) -> tuple[str, str, str]:
        """Build the port with `rel` replaced by `text` in `cfg`, run the runner.

        Returns
        -------
        (status, stdout tail, stderr) : tuple of str
            status is ``stillborn``, ``timeout``, ``crash``, ``fail`` or ``pass``.
        """
        with self._lock:
            self._n += 1
            n = self._n
        d = self.work / f"m{n}"
        d.mkdir(parents=True)
        try:
            base = self.work / "base" / cfg
            name = Path(rel).name
            if name.endswith(".c"):
                (d / name).write_text(text)
                objs = [base / f.replace(".c", ".o") for f in self.cfiles if f != name]
                obj = d / name.replace(".c", ".o")
                if not self._compile(cfg, d / name, obj, self._incs(cfg)):
                    return "stillborn", "", ""
                objs.append(obj)
            else:
                srcd = d / "src"
                shutil.copytree(self.src, srcd)
                (srcd / name).write_text(text)
                objs = []
                for f in self.cfiles:
                    obj = d / f.replace(".c", ".o")
                    if not self._compile(cfg, srcd / f, obj, self._incs(cfg, srcd)):
                        return "stillborn", "", ""
                    objs.append(obj)
            exe = d / "runner"
            if not self._link(base / "runner.o", objs, exe):
                return "stillborn", "", ""
            rc, out, err = self._run(exe)
            tail = "\n".join(out.strip().splitlines()[-3:])
            if rc == "timeout":
                return "timeout", tail, err[-2000:]
            if isinstance(rc, int) and rc < 0:
                return "crash", tail, err[-2000:]
            return ("fail" if rc != 0 else "pass"), tail, err[-2000:]
        finally:
            shutil.rmtree(d, ignore_errors=True)


# --------------------------------------------------------------------------- running


def run_mutant(b: Builder, m: Mutant, source: str) -> Mutant:
    """Run one mutant in every configuration that compiles it, stopping at the first kill.

    Configurations are tried in the order of `CONFIGS` (icao binary64 first).
    """
    t0 = time.monotonic()
    text = m.apply(source)
    m.outcome = "survived"
    for cfg in b.configs:
        if cfg not in m.configs:
            continue
        status, tail, _ = b.build_and_run(m.file, text, cfg)
        m.runs[cfg] = status
        if status == "stillborn":
            m.outcome = "stillborn"
            break
        if status in ("fail", "crash"):
            m.outcome = "killed"
            m.killed_by = cfg + (" (crash)" if status == "crash" else "")
            break
        if status == "timeout":
            m.outcome = "timeout"
            m.killed_by = cfg
            break
    if m.outcome == "survived" and not m.runs:
        m.outcome = "not-built"
    m.seconds = round(time.monotonic() - t0, 3)
    return m


PROBE = (
    "#ifndef AD_MUT_PROBE_DEFINED\n#define AD_MUT_PROBE_DEFINED\n#include <stdio.h>\n"
    "static int ad_mut_eq(double a, double b)\n{\n    static int seen = 0;\n"
    "    if ((a == b) && !seen) {\n        seen = 1;\n"
    "        fputs(\"AD_MUT_PROBE_EQUAL\\n\", stderr);\n    }\n    return 0;\n}\n#endif\n"
)


def probe_equality(b: Builder, m: Mutant, source: str) -> list[str] | None:
    """Configurations in which the operands of a relational mutant's site are ever equal.

    The unmutated file is instrumented at the site: ``A op B`` becomes
    ``(ad_mut_eq(A, B), (A op B))``; the runner is run and the probe reports on stderr
    whether the two operands were equal in any call.  None if the probe cannot be built.
    """
    toks = code_tokens(tokenize(source))
    idx = next((k for k, t in enumerate(toks) if t.start == m.start), None)
    if idx is None:
        return None
    lo, hi = operand_span(toks, idx)
    a = source[toks[lo].start:toks[idx].start].strip()
    bb = source[m.end:toks[hi].start + len(toks[hi].text)].strip()
    expr = f"(ad_mut_eq((double)({a}), (double)({bb})), (({a}) {m.original} ({bb})))"
    text = (PROBE + source[:toks[lo].start] + expr
            + source[toks[hi].start + len(toks[hi].text):])
    hits = []
    for cfg in b.configs:
        if cfg not in m.configs:
            continue
        status, _, err = b.build_and_run(m.file, text, cfg)
        if status == "stillborn":
            return None
        if "AD_MUT_PROBE_EQUAL" in err:
            hits.append(cfg)
    m.runs["probe"] = hits
    return hits


def _probe_inside(lo: float, hi: float) -> str:
    return (
        "#ifndef AD_MUT_PROBE_DEFINED\n#define AD_MUT_PROBE_DEFINED\n#include <stdio.h>\n"
        "static int ad_mut_in(double a)\n{\n    static int seen = 0;\n"
        f"    if ((a >= {lo.hex()}) && (a <= {hi.hex()}) && !seen) {{\n        seen = 1;\n"
        "        fputs(\"AD_MUT_PROBE_INSIDE\\n\", stderr);\n    }\n    return 0;\n}\n#endif\n"
    )


def probe_switch(b: Builder, m: Mutant) -> list[str] | None:
    """Configurations in which some case compares a value inside the interval a switch
    constant's mutant moved (between the old and the new value), at any site of the
    port's C files where the macro is one whole operand of a comparison.

    Each such file, unmutated, is instrumented at those sites: ``A op MACRO`` becomes
    ``(ad_mut_in(A), (A op MACRO))``.  None when the macro is no such operand anywhere
    or a probe cannot be built.
    """
    old = parse_float_literal(m.original)[0]
    new = parse_float_literal(m.replacement)[0]
    lo, hi = min(old, new), max(old, new)
    root = root_of(m)
    hits: set[str] = set()
    sites = 0
    for rel in port_files(root):
        if not rel.endswith(".c"):
            continue
        source = (root / rel).read_text()
        toks = code_tokens(tokenize(source))
        edits: list[tuple[int, int, str]] = []
        for k, t in enumerate(toks):
            if t.kind != "op" or t.text not in REL_SWAP:
                continue
            a0, b1 = operand_span(toks, k)
            left, right = toks[a0:k], toks[k + 1:b1 + 1]
            if len(right) == 1 and right[0].text == m.macro:
                value = left
            elif len(left) == 1 and left[0].text == m.macro:
                value = right
            else:
                continue
            start, end = toks[a0].start, toks[b1].start + len(toks[b1].text)
            a = source[value[0].start:value[-1].start + len(value[-1].text)]
            edits.append((start, end, f"(ad_mut_in((double)({a})), ({source[start:end]}))"))
        if not edits:
            continue
        sites += len(edits)
        text = source
        for start, end, repl in sorted(edits, reverse=True):
            text = text[:start] + repl + text[end:]
        text = _probe_inside(lo, hi) + text
        for cfg in b.configs:
            if cfg not in m.configs:
                continue
            status, _, err = b.build_and_run(rel, text, cfg)
            if status == "stillborn":
                return None
            if "AD_MUT_PROBE_INSIDE" in err:
                hits.add(cfg)
    if sites == 0:
        return None
    m.runs["probe"] = sorted(hits)
    return sorted(hits)


def _limit_operand(source: str, m: Mutant) -> str:
    toks = code_tokens(tokenize(source))
    idx = next((k for k, t in enumerate(toks) if t.start == m.start), None)
    if idx is None:
        return ""
    lo, hi = operand_span(toks, idx)
    for t in toks[lo:hi + 1]:
        if t.kind == "ident" and LIMIT_RE.match(t.text):
            return t.text
    return ""


#: Layer-row entries that are 0 where the layer's kind does not use them (m, k, c, n, kd,
#: lapse_lo).
UNUSED_ZERO = {4, 5, 6, 7, 10, 12}
#: Layer-row entries that are not 0 in gradient layers but read only in isothermal ones
#: (a row's last entry is its gradient flag).
GRADIENT_UNREAD = {8: "sh = -R Tb/g0"}
_ROOT = [Path(__file__).resolve().parents[1]]
_REFS: dict[str, set[str]] = {}


def root_of(m: Mutant) -> Path:
    """Repository root the mutants were generated from."""
    return _ROOT[0]


def _referenced_macros(root: Path) -> set[str]:
    """Identifiers used by compiled code of the port (outside #define bodies and tables
    of ad_constants.h), and by the bodies of macros so used (one level)."""
    key = str(root)
    if key not in _REFS:
        used: set[str] = set()
        bodies: dict[str, set[str]] = {}
        for f in port_files(root):
            for t in tokenize((root / f).read_text()):
                if t.kind == "ident" and not t.define and not t.directive:
                    used.add(t.text)
                elif t.kind == "ident" and t.define:
                    bodies.setdefault(t.define, set()).add(t.text)
        for _ in range(3):
            for name in list(used):
                used |= bodies.get(name, set())
        _REFS[key] = used
    return _REFS[key]


def classify(b: Builder | None, m: Mutant, source: str) -> None:
    """Classify a survivor: ``equivalent`` with a reason, ``gap`` or ``unclassified``."""
    precs = sorted({CONFIGS[c][1] for c in m.configs})
    if m.macro and m.macro not in _referenced_macros(root_of(m)):
        m.classification = "equivalent"
        m.reason = f"dead code: macro {m.macro} is referenced by no compiled port code"
        return
    if m.operator == "const" and m.layer_index in UNUSED_ZERO and m.original.startswith("0x0p"):
        m.classification = "equivalent"
        m.reason = ("dead data: zero entry of a layer row that this layer's kind does not "
                    "read (ad_internal.h: 'else 0')")
        return
    if (m.operator == "const" and m.layer_index in GRADIENT_UNREAD
            and re.search(r",\s*1\s*}\s*$", source.splitlines()[m.line - 1])):
        m.classification = "equivalent"
        m.reason = (f"dead data: {GRADIENT_UNREAD[m.layer_index]} of a gradient layer row, "
                    "read only in isothermal layers (altimetry.c)")
        return
    if m.operator == "const" and m.rel_size is not None:
        tol = min(VEC_K * EPS[p] for p in precs)
        finest = min(precs, key=lambda p: EPS[p])
        if m.rel_size <= tol:
            m.classification = "equivalent"
            m.reason = (f"change {m.rel_size:.2e} relative, below the {VEC_K:g} eps bound "
                        f"{tol:.2e} of {finest}" + (" (low part, relative to its high part)"
                                                     if m.macro in LOW_PARTS
                                                     or m.layer_index in LAYER_LOW else ""))
            return
        if m.macro in LOW_PARTS or m.layer_index in LAYER_LOW:
            m.classification = "unclassified"
            m.reason = (f"double-double low part changed by {m.rel_size:.2e} of its high part "
                        f"(bound {tol:.2e} of {finest}): the vectors do not see the low part")
            return
        shadow = _shadowed(m)
        if shadow is not None:
            m.classification = "equivalent"
            m.reason = shadow
            return
        if m.macro in SOLVER_START:
            m.classification = "equivalent"
            m.reason = ("start value of the supersonic Newton solver: the iteration converges "
                        f"from the perturbed start (change {m.rel_size:.2e} relative)")
            return
        inside = (probe_switch(b, m) if b is not None else m.runs.get("probe")) \
            if m.macro else None  # --reclassify (no builder) reuses the recorded probe
        if inside:
            m.classification = "equivalent"
            m.reason = (f"switch {m.macro} moved by {m.rel_size:.2e} relative: cases compare "
                        f"a value inside the moved interval ({', '.join(inside)}) and pass "
                        "with the other branch; both branches agree there within the bound")
            return
        m.classification = "gap" if inside == [] else "unclassified"
        m.reason = (f"switch {m.macro} moved by {m.rel_size:.2e} relative and no case "
                    "compares a value inside the moved interval" if inside == [] else
                    f"constant changed by {m.rel_size:.2e} relative (bound {tol:.2e} of "
                    f"{finest})")
        return
    if m.operator == "loop" and m.macro in SOLVER_STEPS:
        m.classification = "equivalent"
        m.reason = ("iteration count of a convergent solver: one step in reserve by design "
                    "(3 of 4 Newton steps suffice, pitot.c)" if m.detail == "bound-1"
                    else "extra step of a converged solver")
        return
    if m.operator == "rel" and m.detail == "boundary":
        hits = probe_equality(b, m, source) if b is not None else None
        limit = _limit_operand(source, m)
        if hits is None:
            m.classification = "unclassified"
            m.reason = "boundary swap; the equality probe could not be built"
        elif hits:
            m.classification = "equivalent"
            m.reason = ("boundary swap; the operands are equal in some case "
                        f"({', '.join(hits)}) and both branches agree there within the bound")
        elif limit:
            m.classification = "gap"
            m.reason = (f"boundary swap at the limit {limit}: no case puts the compared value "
                        "exactly on the limit (probe: never equal)")
        else:
            m.classification = "equivalent"
            m.reason = ("boundary swap at an internal switch the cases never hit exactly "
                        "(probe: operands never equal)")
        return
    if m.operator == "arith":
        ctx_after = source[m.end:m.end + 40].lstrip()
        if m.original in "*/" and re.match(r"(AD_K_1\b|\(ad_real\)1\b|1\.0\b)", ctx_after):
            m.classification = "equivalent"
            m.reason = "multiplication and division by one agree"
            return
    m.classification = "unclassified"
    m.reason = "unclassified"


# --------------------------------------------------------------------------- report


def summarize(mutants: Sequence[Mutant]) -> dict:
    """Counts overall and per operator, and the figure."""

    def count(ms: Iterable[Mutant]) -> dict:
        ms = list(ms)
        c = {
            "total": len(ms),
            "stillborn": sum(m.outcome == "stillborn" for m in ms),
            "not_built": sum(m.outcome == "not-built" for m in ms),
            "killed": sum(m.outcome == "killed" for m in ms),
            "killed_crash": sum(m.outcome == "killed" and "crash" in m.killed_by for m in ms),
            "killed_timeout": sum(m.outcome == "timeout" for m in ms),
            "survived": sum(m.outcome == "survived" for m in ms),
            "equivalent": sum(m.outcome == "survived" and m.classification == "equivalent"
                              for m in ms),
            "gap": sum(m.outcome == "survived" and m.classification == "gap" for m in ms),
            "unclassified": sum(m.outcome == "survived" and m.classification == "unclassified"
                                for m in ms),
        }
        denom = c["total"] - c["stillborn"] - c["not_built"] - c["equivalent"]
        killed = c["killed"] + c["killed_timeout"]
        c["score"] = (killed / denom) if denom else None
        return c

    per_op = {op: count(m for m in mutants if m.operator == op) for op in OPERATORS}
    return {"overall": count(mutants), "per_operator": {k: v for k, v in per_op.items()
                                                         if v["total"]}}


def text_summary(report: dict) -> str:
    """The human-readable summary."""
    o = report["summary"]["overall"]
    lines = [
        "airdata mutation analysis of the C port against the golden vectors",
        DISCLAIMER,
        f"mutants {o['total']} (of {report['population']} generated; sample "
        f"{report['sample']}, seed {report['seed']}), configurations "
        f"{', '.join(report['configs'])}",
        f"killed {o['killed']} (crash {o['killed_crash']}), killed by timeout "
        f"{o['killed_timeout']}, stillborn {o['stillborn']}, survived {o['survived']} "
        f"(equivalent {o['equivalent']}, gap {o['gap']}, unclassified {o['unclassified']})",
    ]
    if o["score"] is not None:
        lines.append(f"score: killed / (total - stillborn - equivalent) = "
                     f"{o['killed'] + o['killed_timeout']} / "
                     f"{o['total'] - o['stillborn'] - o['not_built'] - o['equivalent']} = "
                     f"{100 * o['score']:.2f} %")
    lines.append("per operator:  total killed timeout stillborn survived equivalent")
    for op, c in report["summary"]["per_operator"].items():
        lines.append(f"  {op:<10} {c['total']:6d} {c['killed']:6d} {c['killed_timeout']:7d} "
                     f"{c['stillborn']:9d} {c['survived']:8d} {c['equivalent']:10d}")
    surv = [m for m in report["mutants"] if m["outcome"] == "survived"]
    if surv:
        lines.append("survivors:")
        for m in surv:
            lines.append(f"  {m['file']}:{m['line']}:{m['col']} {m['operator']}/{m['detail']} "
                         f"{m['original']} -> {m['replacement']}: {m['classification']}: "
                         f"{m['reason']}")
    lines.append(f"wall time {report['wall_seconds']:.1f} s, jobs {report['jobs']}")
    return "\n".join(lines)


def _git_head(root: Path) -> str:
    try:
        r = subprocess.run(["git", "-C", str(root), "rev-parse", "HEAD"],
                           capture_output=True, text=True, timeout=10)
        return r.stdout.strip()
    except (OSError, subprocess.SubprocessError):
        return ""


def run(root: Path, mutants: Sequence[Mutant], population: int, *, jobs: int, seed: int,
        sample: int | None, timeout: float, configs: Sequence[str],
        progress: bool = False, work: Path | None = None) -> dict:
    """Build, run and classify the given mutants; return the report dictionary."""
    cc = compiler()
    if cc is None:
        raise RuntimeError("no C compiler (CC, cc, gcc)")
    t0 = time.monotonic()
    tmp = Path(tempfile.mkdtemp(prefix="ad-mutate-", dir=work))
    try:
        b = Builder(root, tmp, cc, configs, timeout)
        base = b.prepare(jobs)
        sources = {f: (root / f).read_text() for f in {m.file for m in mutants}}
        done = 0
        lock = threading.Lock()

        def one(m: Mutant) -> Mutant:
            nonlocal done
            run_mutant(b, m, sources[m.file])
            if m.outcome == "survived":
                classify(b, m, sources[m.file])
            with lock:
                done += 1
                if progress:
                    print(f"[{done}/{len(mutants)}] {m.id} {m.original} -> {m.replacement}: "
                          f"{m.outcome} {m.killed_by}", file=sys.stderr, flush=True)
            return m

        with concurrent.futures.ThreadPoolExecutor(max(1, jobs)) as ex:
            list(ex.map(one, mutants))
        ver = subprocess.run([cc, "--version"], capture_output=True, text=True).stdout
    finally:
        shutil.rmtree(tmp, ignore_errors=True)
    report = {
        "tool": "tools/mutate.py",
        "note": DISCLAIMER,
        "root": str(root),
        "commit": _git_head(root),
        "compiler": ver.splitlines()[0] if ver else cc,
        "cflags": CFLAGS,
        "configs": list(configs),
        "baseline": base,
        "vec_k": VEC_K,
        "population": population,
        "sample": sample,
        "seed": seed,
        "jobs": jobs,
        "timeout_seconds": timeout,
        "wall_seconds": round(time.monotonic() - t0, 2),
        "summary": summarize(mutants),
        "mutants": [dataclasses.asdict(m) for m in mutants],
    }
    report["survivors"] = [m for m in report["mutants"] if m["outcome"] == "survived"]
    return report


def main(argv: Sequence[str] | None = None) -> int:
    """Command line; see the module docstring."""
    p = argparse.ArgumentParser(
        prog="tools/mutate.py",
        description="Mutation adequacy of the golden vectors against the C port. "
        + DISCLAIMER)
    p.add_argument("--root", type=Path, default=Path(__file__).resolve().parents[1],
                   help="repository root (default: this checkout)")
    p.add_argument("--only", action="append", default=[], metavar="FILE",
                   help="mutate only this port file (repeatable), e.g. pitot.c")
    p.add_argument("--ops", default=",".join(OPERATORS),
                   help=f"operators to use, comma separated (default: {','.join(OPERATORS)})")
    p.add_argument("--sample", type=int, default=None, metavar="N",
                   help="deterministic sample of N mutants, stratified by operator")
    p.add_argument("--seed", type=int, default=1, metavar="S", help="sample seed (default 1)")
    p.add_argument("--jobs", type=int, default=2, help="parallel builds (default 2)")
    p.add_argument("--timeout", type=float, default=60.0,
                   help="seconds per runner run; longer counts as killed by timeout")
    p.add_argument("--configs", default=",".join(CONFIGS),
                   help="build configurations, comma separated (default: all four)")
    p.add_argument("--list", action="store_true", help="list the mutants, run nothing")
    p.add_argument("--report", type=Path, default=None, metavar="FILE.json",
                   help="write the JSON report here")
    p.add_argument("--workdir", type=Path, default=None, help="scratch folder parent")
    p.add_argument("--quiet", action="store_true", help="no progress lines on stderr")
    p.add_argument("--reclassify", type=Path, default=None, metavar="FILE.json",
                   help="re-classify the non-relational survivors of a report (no runs)")
    a = p.parse_args(argv)
    root = a.root.resolve()
    _ROOT[0] = root
    if a.reclassify:
        rep = json.loads(a.reclassify.read_text())
        names = {f.name for f in dataclasses.fields(Mutant)}
        ms = [Mutant(**{k: v for k, v in d.items() if k in names}) for d in rep["mutants"]]
        for m in ms:
            if m.outcome == "survived" and not (m.operator == "rel" and m.detail == "boundary"):
                classify(None, m, (root / m.file).read_text())
        rep["summary"] = summarize(ms)
        rep["mutants"] = [dataclasses.asdict(m) for m in ms]
        rep["survivors"] = [d for d in rep["mutants"] if d["outcome"] == "survived"]
        (a.report or a.reclassify).write_text(json.dumps(rep, indent=1, default=str) + "\n")
        print(text_summary(rep))
        return 0
    ops = [o for o in a.ops.split(",") if o]
    bad_ops = sorted(set(ops) - set(OPERATORS))
    if bad_ops:
        p.error(f"unknown operators {bad_ops}")
    configs = [c for c in a.configs.split(",") if c]
    if set(configs) - set(CONFIGS):
        p.error(f"unknown configurations {sorted(set(configs) - set(CONFIGS))}")
    muts = [m for m in all_mutants(root, a.only) if m.operator in ops]
    population = len(muts)
    if not muts:
        # an empty run would report a score of nothing: refuse it
        p.error(f"no mutants of operators {','.join(ops)} in "
                f"{', '.join(a.only) if a.only else 'the port'}")
    if a.sample is not None:
        muts = sample_mutants(muts, a.sample, a.seed)
    if a.list:
        for m in muts:
            print(f"{m.id} {m.detail} {m.original} -> {m.replacement}  [{m.context}]")
        print(f"{len(muts)} mutants of {population}")
        return 0
    report = run(root, muts, population, jobs=a.jobs, seed=a.seed, sample=a.sample,
                 timeout=a.timeout, configs=configs, progress=not a.quiet, work=a.workdir)
    if a.report:
        a.report.write_text(json.dumps(report, indent=1, default=str) + "\n")
    print(text_summary(report))
    return 0


if __name__ == "__main__":
    sys.exit(main())
