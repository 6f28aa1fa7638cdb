"""Verification evidence of a port check as pictures: a self-contained HTML page and
error-over-envelope plots (PNG, through the optional matplotlib).

Everything taken from outside is escaped and length-bounded (:func:`.evidence.esc`).

An engineering and verification aid, not certified flight software.
"""

from __future__ import annotations

import base64
import io
from collections.abc import Sequence
from pathlib import Path
from typing import Any

from ..notice import CAUTION
from .evidence import CHECKS_NOT_RUN, equation_table, esc, fmt, manifest_sha, where
from .verdict import PRECISION_LABEL, Report

__all__ = ["write_html", "write_plots"]


def _plot_pngs(r: Report) -> list[tuple[str, str, bytes]]:
    """(function, output, PNG bytes) per judged output: error over the first band axis."""
    try:
        import matplotlib
        matplotlib.use("Agg")
        import matplotlib.pyplot as plt
    except ImportError:
        return []
    out = []
    for f in r.functions:
        for o in f.outputs:
            s = o.series
            if not o.judged or not s.get("axes"):
                continue
            name, xs, xunit = s["axes"][0]
            fig, ax = plt.subplots(figsize=(6.4, 3.2), dpi=80)
            ax.plot(xs, s["error"], ".", ms=3, label=f"|error| ({o.unit})")
            if s["allowed"] is not None:
                order = sorted(range(len(xs)), key=lambda i: xs[i])
                ax.plot([xs[i] for i in order], [s["allowed"][i] for i in order], "-",
                        color="red", label=f"allowed ({o.requirement})")
            ax.set_xlabel(f"{name} {xunit}".strip())
            ax.set_ylabel(f"{o.output} error ({o.unit})")
            ax.set_title(f"{f.function}.{o.output} [{PRECISION_LABEL[r.precision]}] "
                         f"{f.verdict}", fontsize=9)
            ax.legend(fontsize=7)
            ax.grid(alpha=0.3)
            fig.tight_layout()
            buf = io.BytesIO()
            fig.savefig(buf, format="png")
            plt.close(fig)
            out.append((f.function, o.output, buf.getvalue()))
    return out


def write_plots(reports: Sequence[Report], directory: str | Path) -> list[Path]:
    """Error-over-envelope PNGs per function and output; raises ImportError without
    matplotlib."""
    import matplotlib  # noqa: F401  (the plot extra)

    d = Path(directory)
    d.mkdir(parents=True, exist_ok=True)
    paths = []
    for r in reports:
        for fn, out, png in _plot_pngs(r):
            p = d / f"{fn}-{out}-{PRECISION_LABEL[r.precision]}.png"
            p.write_bytes(png)
            paths.append(p)
    return paths


_CSS = ("body{font-family:sans-serif;margin:1.5em;max-width:72em}table{border-collapse:"
        "collapse;margin:.5em 0}td,th{border:1px solid #999;padding:2px 6px;font-size:90%}"
        ".pass{background:#d8f0d8}.fail{background:#f6d0d0}.na{background:#eee}"
        ".caution{border:2px solid #a60;padding:.6em;background:#fff4e0}")


def _cls(v: str) -> str:
    return {"pass": "pass", "fail": "fail"}.get(v, "na")


def write_html(reports: Sequence[Report], env: dict[str, Any], path: str | Path) -> None:
    """One self-contained HTML page: caution, summary, verdicts and margins, bands,
    environment, traceability; plots embedded as data: URIs (when matplotlib is there)."""
    first = reports[0]
    req = first.requirements
    eqs = equation_table()
    h: list[str] = ["<!DOCTYPE html>", "<html lang=\"en\"><head><meta charset=\"utf-8\">",
                    "<title>airdata port check evidence</title>", f"<style>{_CSS}</style>",
                    "</head><body>", "<h1>airdata port check: verification evidence</h1>",
                    f"<p class=\"caution\"><b>{esc(CAUTION, 1000)}</b></p>"]
    verdict = "PASS" if all(r.ok for r in reports) else "FAIL"
    h.append("<h2>Summary</h2><table>")
    rows = [("verdict", verdict), ("level applied", first.level),
            ("reference-equivalent level",
             f"|got - expected| <= {first.suite.k:g} * eps * scale, status exact"),
            ("requirements level", f"{req.path} (SHA-256 {req.sha256})" if req
             else "not applied (no requirements file)"),
            ("requirements title", req.title if req else "-"),
            ("port", env["port"]["label"]),
            ("suite", f"{first.suite.suite_version} ({first.suite.profile}), manifest "
                      f"SHA-256 {manifest_sha(first)}"),
            ("date (UTC)", env["date_utc"]), ("airdata", env["airdata_version"]),
            ("not checked here", "; ".join(CHECKS_NOT_RUN) + " (the vector runner checks "
                                 "them)")]
    for k, v in rows:
        c = f" class=\"{_cls(v.lower())}\"" if k == "verdict" else ""
        h.append(f"<tr><th>{esc(k)}</th><td{c}>{esc(v)}</td></tr>")
    h.append("</table>")
    for r in reports:
        pl = PRECISION_LABEL[r.precision]
        h.append(f"<h2>Verdicts and margins ({pl})</h2><table><tr><th>function</th>"
                 "<th>output</th><th>verdict</th><th>reference-equivalent</th>"
                 "<th>in / outside envelope</th><th>failed</th><th>allowed</th>"
                 "<th>worst error</th><th>margin</th><th>bound ratio</th><th>where</th></tr>")
        for f in r.functions:
            if not f.implemented:
                h.append(f"<tr><td>{esc(f.function)}</td><td>-</td><td class=\"na\">not "
                         "implemented</td><td colspan=\"8\"></td></tr>")
                continue
            for o in f.outputs:
                h.append(
                    f"<tr><td>{esc(f.function)}</td><td>{esc(o.output)}</td>"
                    f"<td class=\"{_cls(f.verdict)}\">{esc(f.verdict)}</td>"
                    f"<td class=\"{_cls(f.reference_verdict)}\">"
                    f"{esc(f.reference_verdict)}</td>"
                    f"<td>{f.in_envelope} / {f.outside_envelope}</td><td>{o.failed}</td>"
                    f"<td>{esc(o.requirement or 'bound')}</td>"
                    f"<td>{esc(fmt(o.worst_error, 4))} {esc(o.unit)}</td>"
                    f"<td>{esc(fmt(o.margin))}</td><td>{esc(fmt(o.bound_ratio))}</td>"
                    f"<td>{esc(where(o.margin_where if o.requirement else o.worst_where))}"
                    "</td></tr>")
        h.append("</table>")
        h.append(f"<h2>Breakdown by band ({pl})</h2><table><tr><th>function.output</th>"
                 "<th>axis</th><th>band</th><th>judged</th><th>failed</th><th>worst error</th>"
                 "<th>margin</th></tr>")
        for f in r.functions:
            for o in f.outputs:
                for b in o.bands:
                    cls = "fail" if b.failed else "pass"
                    h.append(f"<tr><td>{esc(f.function)}.{esc(o.output)}</td>"
                             f"<td>{esc(b.axis)}</td><td>{esc(b.label)}</td>"
                             f"<td>{b.judged}</td><td class=\"{cls}\">{b.failed}</td>"
                             f"<td>{esc(fmt(b.worst_error, 4))} {esc(o.unit)}</td>"
                             f"<td>{esc(fmt(b.margin))}</td></tr>")
        h.append("</table>")
        pngs = _plot_pngs(r)
        if pngs:
            h.append(f"<h2>Error over the envelope ({pl})</h2>")
            for fn, out, png in pngs:
                uri = "data:image/png;base64," + base64.b64encode(png).decode("ascii")
                h.append(f"<p><img alt=\"{esc(fn)}.{esc(out)} error\" src=\"{uri}\"></p>")
        else:
            h.append("<p>Plots: not drawn (matplotlib is not installed; pip install "
                     "airdata[plot]).</p>")
        fails = [(f, c) for f in r.functions for c in f.failures]
        h.append(f"<h2>Failing cases ({pl}): {len(fails)}</h2>")
        if fails:
            h.append("<table><tr><th>function</th><th>case</th><th>inputs</th>"
                     "<th>reasons (decimal and hex)</th></tr>")
            for f, c in fails[:200]:
                h.append(f"<tr><td>{esc(f.function)}</td><td>{esc(c.case_id, 40)}</td>"
                         f"<td>{esc(where(c.where))}</td>"
                         f"<td>{esc('; '.join(c.reasons), 600)}</td></tr>")
            h.append("</table>")
            if len(fails) > 200:
                h.append(f"<p>{len(fails) - 200} more in the JSON report and --failures "
                         "CSV.</p>")
    h.append("<h2>Traceability</h2><table><tr><th>equation</th><th>published source</th>"
             "<th>Python function</th><th>C function</th><th>vector file</th>"
             "<th>verdict</th></tr>")
    for r in reports:
        for f in r.functions:
            for e in f.equations:
                row = eqs.get(e, {})
                h.append(f"<tr><td>{esc(e)}</td><td>{esc(row.get('source', '-'))}</td>"
                         f"<td>airdata.{esc(f.function)}</td><td>{esc(f.c_function)}</td>"
                         f"<td>functions/{esc(f.function)}.json</td>"
                         f"<td class=\"{_cls(f.verdict)}\">{esc(f.verdict)} "
                         f"({PRECISION_LABEL[r.precision]})</td></tr>")
    h.append("</table><h2>Environment</h2><table>")
    comp = env["compiler"]
    for k, v in (("host", env["host"]), ("python", env["python"]),
                 ("compiler", comp["command"]), ("compiler version", comp["version"]),
                 ("flags", " ".join(comp["flags"]))):
        h.append(f"<tr><th>{esc(k)}</th><td>{esc(v, 600)}</td></tr>")
    for fobj in env["port"]["files"]:
        h.append(f"<tr><th>{esc(fobj['kind'])}</th><td>{esc(fobj['path'])}<br>SHA-256 "
                 f"{esc(fobj['sha256'])}</td></tr>")
    h.append("</table>")
    h.append(f"<p>{esc(CAUTION, 1000)}</p></body></html>")
    Path(path).write_text("\n".join(h) + "\n", encoding="utf-8")
