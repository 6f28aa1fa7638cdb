"""Reading an ``airdata-results`` file written by an implementation under test.

The format is specified in docs/exchange.md::

    airdata-results 1 precision binary64
    931c7eb9eda7 0 0x1.b94cccccccccdp+7 0x1.5b0b85d9f9676p+17 ...
    ...
    end 35003

one line per case: case id, status code, every output (C99 hex float, decimal, ``nan``,
``inf``, ``-inf``; ``-nan`` as printf writes it).  Blank lines and lines starting with
``#`` are ignored (a target may print its own banner as comments).  Every problem is
kept with its line number: a malformed line, a duplicate id, an id the suite does not
have, a case with no line, a missing or wrong ``end`` line (a truncated file).  None of
them is ever counted as a pass.

:func:`arrays` turns the lines into the per-function output and status arrays that
``port check`` gets from a compiled port; ``port verify`` hands them to
:func:`airdata.portcheck.verdict.judge` unchanged.  A case without a good line (missing,
duplicate, malformed) gets NaN outputs and status -1, so it fails there (a binary32
case that is skipped or lenient may not, but its missing line is a problem of the file,
and ``port verify`` fails on any problem).

An engineering and verification aid, not certified flight software.
"""

from __future__ import annotations

import re
from dataclasses import dataclass, field
from pathlib import Path

import numpy as np

from .suite import FunctionCases, LoadedSuite
from .verdict import Report

__all__ = ["RESULTS_VERSION", "ResultsError", "Problem", "ParsedResults", "parse_results",
           "read_results", "arrays", "add_line_numbers"]

#: Version of the ``airdata-results`` format.
RESULTS_VERSION = 1
_PRECISIONS = {"binary64": "double", "binary32": "single"}
_NUMBER = re.compile(r"[+-]?(0[xX](?:[0-9a-fA-F]+\.?[0-9a-fA-F]*|\.[0-9a-fA-F]+)[pP][+-]?\d+"
                     r"|(?:\d+\.?\d*|\.\d+)(?:[eE][+-]?\d+)?|inf|infinity|nan)", re.I)
_STATUS = re.compile(r"[+-]?\d{1,6}")
_ID = re.compile(r"[0-9A-Za-z_.:-]{1,64}")
_SHOWN = 80  # characters of a bad line quoted in a message


class ResultsError(ValueError):
    """A results file that cannot be read at all (missing, not text, wrong version)."""


@dataclass(frozen=True)
class Problem:
    """One problem of a results file: line number (0: the file as a whole), case, text."""

    line: int
    case_id: str | None
    what: str

    def __str__(self) -> str:
        where = f"line {self.line}" if self.line else "file"
        case = f" case {self.case_id}" if self.case_id else ""
        return f"{where}{case}: {self.what}"


@dataclass
class ParsedResults:
    """Lines of a results file by case id: (line number, status, outputs)."""

    precision: str | None
    rows: dict[str, tuple[int, int, list[float]]] = field(default_factory=dict)
    bad_ids: dict[str, int] = field(default_factory=dict)  # id -> line (malformed/duplicate)
    problems: list[Problem] = field(default_factory=list)
    lines: int = 0


def _show(text: str) -> str:
    text = text if len(text) <= _SHOWN else text[:_SHOWN] + "..."
    return repr(text)


def _number(tok: str) -> float:
    if not _NUMBER.fullmatch(tok):
        raise ValueError(tok)
    low = tok.lower().lstrip("+-")
    if low.startswith("0x"):
        return float.fromhex(tok)
    if low.startswith("nan"):
        return float("nan")
    return float(tok)


def parse_results(text: str, suite: LoadedSuite,
                  ignored_ids: frozenset[str] = frozenset()) -> ParsedResults:
    """Parse the text of a results file against the cases of ``suite``.

    Parameters
    ----------
    text : str
        The whole file.
    suite : LoadedSuite
        The suite (only its selected functions).
    ignored_ids : frozenset of str
        Ids of the suite's other functions (``--only``): their lines are skipped, not
        reported as unknown.

    Returns
    -------
    ParsedResults
        Rows by id and every problem, each with its line number.

    Raises
    ------
    ResultsError
        No version line, or a version this airdata does not read.
    """
    nout = {cid: (fc.name, len(fc.outputs)) for fc in suite.functions.values()
            for cid in fc.ids}
    lines = text.split("\n")
    if lines and lines[-1] == "":
        lines.pop()
    elif lines:
        pass  # a last line without newline: checked below
    first = next(((n, s) for n, s in enumerate(lines, 1) if s.strip()
                  and not s.startswith("#")), None)
    if first is None:
        raise ResultsError("the file is empty (no 'airdata-results 1' line)")
    head = first[1].split()
    if len(head) < 2 or head[0] != "airdata-results":
        raise ResultsError(f"line {first[0]}: expected 'airdata-results {RESULTS_VERSION} "
                           f"precision binary64|binary32', got {_show(first[1])}")
    if head[1] != str(RESULTS_VERSION):
        raise ResultsError(f"line {first[0]}: results format version {_show(head[1])} is "
                           f"not supported (this airdata reads {RESULTS_VERSION})")
    precision = None
    if len(head) >= 4 and head[2] == "precision":
        if head[3] not in _PRECISIONS:
            raise ResultsError(f"line {first[0]}: precision {_show(head[3])}: expected "
                               "binary64 or binary32")
        precision = _PRECISIONS[head[3]]
    res = ParsedResults(precision)
    res.lines = len(lines)
    end_seen: int | None = None
    count = 0
    for n, raw in enumerate(lines, 1):
        if n <= first[0]:
            continue
        line = raw.rstrip("\r")
        if not line.strip() or line.startswith("#"):
            continue
        toks = line.split()
        if end_seen is not None:
            res.problems.append(Problem(n, None, f"text after the end line {end_seen}: "
                                        f"{_show(line)}"))
            continue
        if toks[0] == "end":
            end_seen = n
            if len(toks) != 2 or not toks[1].isdigit():
                res.problems.append(Problem(n, None, f"malformed end line {_show(line)}: "
                                            "expected 'end N'"))
            elif int(toks[1]) != count:
                res.problems.append(Problem(n, None, f"the end line says {toks[1]} result "
                                            f"lines, the file has {count}"))
            continue
        count += 1
        cid = toks[0]
        if not _ID.fullmatch(cid):
            res.problems.append(Problem(n, None, f"malformed line {_show(line)}: no case id"))
            continue
        if cid in ignored_ids and cid not in nout:
            continue
        if cid not in nout:
            res.problems.append(Problem(n, cid, "unknown case id (not in the suite, or not "
                                        "among the functions selected)"))
            continue
        fname, k = nout[cid]
        if cid in res.rows or cid in res.bad_ids:
            first_line = res.rows[cid][0] if cid in res.rows else res.bad_ids[cid]
            res.problems.append(Problem(n, cid, f"duplicate result line (first on line "
                                        f"{first_line}); the case is failed"))
            res.rows.pop(cid, None)
            res.bad_ids[cid] = first_line
            continue
        why = None
        if len(toks) < 2:
            why = "no status and no outputs (the line is cut short)"
        elif len(toks) != 2 + k:
            why = f"{len(toks) - 2} output(s), {fname} has {k}"
        elif not _STATUS.fullmatch(toks[1]):
            why = f"status {_show(toks[1])} is not an integer"
        else:
            try:
                outs = [_number(t) for t in toks[2:]]
            except ValueError as exc:
                why = f"output {_show(str(exc))} is not a number"
        if why is not None:
            res.problems.append(Problem(n, cid, f"malformed line: {why}"))
            res.bad_ids[cid] = n
            continue
        res.rows[cid] = (n, int(toks[1]), outs)
    if end_seen is None:
        res.problems.append(Problem(len(lines), None, "no 'end N' line: the file is "
                                    "truncated (or the run stopped early)"))
    elif text and not text.endswith("\n"):
        res.problems.append(Problem(len(lines), None, "the last line has no newline"))
    for fc in suite.functions.values():
        before: tuple[str, int] | None = None  # the last case of fc that has a line
        for cid in fc.ids:
            line = res.rows[cid][0] if cid in res.rows else res.bad_ids.get(cid)
            if line is not None:
                before = (cid, line)
                continue
            where = (f"; its place is after line {before[1]} (case {before[0]})"
                     if before is not None else "")
            res.problems.append(Problem(0, cid, f"no result line ({fc.name}){where}"))
    return res


def read_results(path: str | Path, suite: LoadedSuite,
                 ignored_ids: frozenset[str] = frozenset()) -> ParsedResults:
    """:func:`parse_results` of a file; :class:`ResultsError` when it cannot be read."""
    p = Path(path)
    try:
        data = p.read_bytes()
    except OSError as exc:
        raise ResultsError(f"{p}: cannot read: {exc.strerror}") from None
    try:
        text = data.decode("ascii")
    except UnicodeDecodeError as exc:
        raise ResultsError(f"{p}: byte {exc.start} is not ASCII; a results file is ASCII "
                           "text") from None
    try:
        return parse_results(text, suite, ignored_ids)
    except ResultsError as exc:
        raise ResultsError(f"{p}: {exc}") from None


def arrays(fc: FunctionCases, parsed: ParsedResults
           ) -> tuple[np.ndarray, np.ndarray, np.ndarray]:
    """Outputs (n, n_outputs), statuses (n,) and a 'has a good line' mask of ``fc``."""
    y = np.full((fc.count, len(fc.outputs)), np.nan)
    st = np.full(fc.count, -1, dtype=np.int64)
    have = np.zeros(fc.count, dtype=bool)
    for i, cid in enumerate(fc.ids):
        row = parsed.rows.get(cid)
        if row is not None:
            st[i] = row[1]
            y[i, :] = row[2]
            have[i] = True
    return y, st, have



def add_line_numbers(report: Report, parsed: ParsedResults) -> int:
    """Name, in every failing case of ``report``, the results line it was judged from.

    Appends ``results line N`` to the reasons of a case judged from line N, ``results
    line N: malformed or duplicated`` or ``no result line`` to those of a case without a
    good line.  The reasons go into every output of the report (text, JSON, JUnit, CSV,
    HTML).

    Parameters
    ----------
    report : Report
        :func:`airdata.portcheck.verdict.judge` of :func:`arrays` of ``parsed``.
    parsed : ParsedResults
        The results file the report judged.

    Returns
    -------
    int
        The number of failing cases annotated.
    """
    n = 0
    for fv in report.functions:
        for f in fv.failures:
            row = parsed.rows.get(f.case_id)
            bad = parsed.bad_ids.get(f.case_id)
            if row is not None:
                f.reasons.append(f"results line {row[0]}")
            elif bad is not None:
                f.reasons.append(f"results line {bad}: malformed or duplicated")
            else:
                f.reasons.append("no result line")
            n += 1
    return n
