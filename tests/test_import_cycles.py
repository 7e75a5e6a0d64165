"""No module of core or app imports itself round a loop (imports under TYPE_CHECKING aside).

A cycle means two modules are one concept split in two, or that a lower layer reaches
up; import-linter's layers contracts catch the second between packages, this test
catches both between single modules.
"""

from __future__ import annotations

import ast
from pathlib import Path

ROOT = Path(__file__).resolve().parent.parent
PACKAGES = ("core", "app")


def _module_name(path: Path) -> str:
    parts = path.relative_to(ROOT).with_suffix("").parts
    return ".".join(parts[:-1] if parts[-1] == "__init__" else parts)


def _is_type_checking(node: ast.If) -> bool:
    t = node.test
    return (isinstance(t, ast.Name) and t.id == "TYPE_CHECKING") or (
        isinstance(t, ast.Attribute) and t.attr == "TYPE_CHECKING"
    )


def _imports(tree: ast.AST, package: str) -> set[str]:
    """Modules imported at run time (at any depth), TYPE_CHECKING blocks left out."""
    found: set[str] = set()

    def visit(node: ast.AST) -> None:
        if isinstance(node, ast.If) and _is_type_checking(node):
            for child in node.orelse:
                visit(child)
            return
        if isinstance(node, ast.Import):
            found.update(a.name for a in node.names)
        elif isinstance(node, ast.ImportFrom) and node.module:
            if node.level:
                base = package.split(".")[: len(package.split(".")) - node.level + 1]
                found.add(".".join([*base, node.module]))
            else:
                found.add(node.module)
                found.update(f"{node.module}.{a.name}" for a in node.names)
        for child in ast.iter_child_nodes(node):
            visit(child)

    visit(tree)
    return found


def import_graph() -> dict[str, set[str]]:
    files = [p for pkg in PACKAGES for p in (ROOT / pkg).rglob("*.py")]
    modules = {_module_name(p): p for p in files}
    graph: dict[str, set[str]] = {}
    for name, path in modules.items():
        package = name if path.name == "__init__.py" else name.rpartition(".")[0]
        wanted = _imports(ast.parse(path.read_text()), package)
        graph[name] = {m for m in wanted if m in modules and m != name}
    return graph


def cycles(graph: dict[str, set[str]]) -> list[list[str]]:
    """Strongly connected components of more than one module (Tarjan)."""
    index: dict[str, int] = {}
    low: dict[str, int] = {}
    stack: list[str] = []
    on: set[str] = set()
    out: list[list[str]] = []
    counter = [0]

    def strong(v: str) -> None:
        index[v] = low[v] = counter[0]
        counter[0] += 1
        stack.append(v)
        on.add(v)
        for w in graph[v]:
            if w not in index:
                strong(w)
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
            strong(v)
    return out


def test_finder_sees_a_cycle() -> None:
    assert cycles({"a": {"b"}, "b": {"c"}, "c": {"a"}, "d": {"a"}}) == [["a", "b", "c"]]
    assert cycles({"a": {"b"}, "b": set()}) == []


def test_graph_reads_real_imports() -> None:
    graph = import_graph()
    assert "core.mechanics.balance" in graph["core.mechanics.loads"]
    assert "app.controller" in graph["app.window.main_window"]


def test_no_import_cycles() -> None:
    found = cycles(import_graph())
    assert not found, "import cycles: " + "; ".join(" <-> ".join(c) for c in found)
