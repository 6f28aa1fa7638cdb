"""The package's import graph has no cycle, counting imports inside functions too.

A function-level import hides a cycle from the interpreter (it runs late) but not from the
design: the two modules still depend on each other.  This test reads every module of
``airdata/`` with :mod:`ast`, resolves absolute and relative imports to modules of the
package and fails naming the modules of any cycle.  A negative control shows the search finds
a planted cycle.
"""

from __future__ import annotations

import ast
from pathlib import Path

import airdata

PKG = Path(airdata.__file__).resolve().parent


def _module_name(path: Path, root: Path) -> str:
    rel = path.relative_to(root.parent).with_suffix("")
    parts = list(rel.parts)
    if parts[-1] == "__init__":
        parts.pop()
    return ".".join(parts)


def import_graph(root: Path = PKG) -> dict[str, set[str]]:
    """Map each module of the package to the package modules it imports (anywhere in it)."""
    files = {_module_name(p, root): p for p in root.rglob("*.py")}
    graph: dict[str, set[str]] = {m: set() for m in files}
    for mod, path in files.items():
        is_pkg = path.name == "__init__.py"
        here = mod.split(".") if is_pkg else mod.split(".")[:-1]
        for node in ast.walk(ast.parse(path.read_text(encoding="utf-8"))):
            targets: list[str] = []
            if isinstance(node, ast.Import):
                targets = [a.name for a in node.names]
            elif isinstance(node, ast.ImportFrom):
                if node.level:
                    base = here[:len(here) - (node.level - 1)]
                    stem = ".".join(base + ([node.module] if node.module else []))
                else:
                    stem = node.module or ""
                # "from . import x" names a submodule x; "from .m import f" names module m
                targets = [stem + "." + a.name for a in node.names] + [stem]
            for t in targets:
                while t and t not in graph:
                    t = t.rpartition(".")[0]
                if t and t != mod and not mod.startswith(t + "."):
                    # a package importing its own parent __init__ is not an edge worth a cycle
                    graph[mod].add(t)
    return graph


def find_cycles(graph: dict[str, set[str]]) -> list[list[str]]:
    """Strongly connected components of more than one module (Tarjan), each sorted."""
    index: dict[str, int] = {}
    low: dict[str, int] = {}
    stack: list[str] = []
    on: set[str] = set()
    out: list[list[str]] = []
    counter = [0]

    def visit(v: str) -> None:
        index[v] = low[v] = counter[0]
        counter[0] += 1
        stack.append(v)
        on.add(v)
        for w in sorted(graph.get(v, ())):
            if w not in index:
                visit(w)
                low[v] = min(low[v], low[w])
            elif w in on:
                low[v] = min(low[v], index[w])
        if low[v] == index[v]:
            comp = []
            while True:
                w = stack.pop()
                on.discard(w)
                comp.append(w)
                if w == v:
                    break
            if len(comp) > 1:
                out.append(sorted(comp))

    for v in sorted(graph):
        if v not in index:
            visit(v)
    return out


def test_no_import_cycle_in_airdata() -> None:
    graph = import_graph()
    assert len(graph) > 40, f"only {len(graph)} modules found under {PKG}"
    assert sum(len(v) for v in graph.values()) > 100  # the walk saw the imports
    assert find_cycles(graph) == []


def test_cycle_search_finds_a_planted_cycle() -> None:
    graph = import_graph()
    # negative control: the layer kernels importing the valid ranges back closes a cycle
    graph["airdata._layers"] = graph["airdata._layers"] | {"airdata._domains"}
    cycles = find_cycles(graph)
    assert any({"airdata._layers", "airdata._domains"} <= set(c) for c in cycles), cycles


def test_relative_import_resolution(tmp_path: Path) -> None:
    pkg = tmp_path / "pkg"
    (pkg / "sub").mkdir(parents=True)
    (pkg / "__init__.py").write_text("")
    (pkg / "a.py").write_text("def f():\n    from .sub import b\n")
    (pkg / "sub" / "__init__.py").write_text("")
    (pkg / "sub" / "b.py").write_text("from .. import a\n")
    g = import_graph(pkg)
    assert "pkg.sub.b" in g["pkg.a"] or "pkg.sub" in g["pkg.a"]
    assert "pkg.a" in g["pkg.sub.b"]
    assert find_cycles(g)


def _imports_argparse(path: Path) -> bool:
    for node in ast.walk(ast.parse(path.read_text(encoding="utf-8"))):
        if isinstance(node, ast.Import) and any(a.name == "argparse" for a in node.names):
            return True
        if isinstance(node, ast.ImportFrom) and node.module == "argparse":
            return True
    return False


def test_command_line_is_one_layer_on_top() -> None:
    # The layers are the folders: airdata/cli holds every command; nothing below it
    # imports the command line (but ``python -m airdata``, airdata/__main__.py, which
    # starts it), and only it parses arguments (argparse).
    graph = import_graph()
    cli = {m for m in graph if m == "airdata.cli" or m.startswith("airdata.cli.")}
    cli.add("airdata.__main__")
    assert {"airdata.cli.port", "airdata.cli.reduce", "airdata.cli.vectors"} <= cli
    upward = sorted(f"{m} -> {t}" for m, ts in graph.items() if m not in cli
                    for t in ts if t in cli)
    assert upward == []
    parsers = sorted(str(p.relative_to(PKG)) for p in PKG.rglob("*.py")
                     if _imports_argparse(p) and "cli" not in p.relative_to(PKG).parts)
    assert parsers == []


def test_layer_check_sees_an_upward_import(tmp_path: Path) -> None:
    # negative control of the test above: a library module importing the command line
    pkg = tmp_path / "airdata"
    (pkg / "cli").mkdir(parents=True)
    (pkg / "__init__.py").write_text("")
    (pkg / "cli" / "__init__.py").write_text("import argparse\n")
    (pkg / "physics.py").write_text("from .cli import main\n")
    g = import_graph(pkg)
    assert "airdata.cli" in g["airdata.physics"]
    assert _imports_argparse(pkg / "cli" / "__init__.py")
