"""The package's internal imports: one direction, no cycles (read from the source with ast).

Imports under ``if TYPE_CHECKING:`` and the re-exports of a package's
``__init__`` are set aside (they load nothing at run time, or only on demand);
imports inside functions count: a cycle deferred to call time is still a cycle.
"""

from __future__ import annotations

import ast
from pathlib import Path

import networkx as nx

import plyshear

ROOT = Path(plyshear.__file__).parent
#: The layers from the bottom: a module imports its own layer and those below only.
LAYERS = {
    "plyshear.errors": 0,
    "plyshear.units": 0,
    "plyshear.model": 1,
    "plyshear.mechanics": 2,
    "plyshear.codes": 3,
    "plyshear.sweep": 4,
    "plyshear.report": 4,
    "plyshear.verify": 4,
    "plyshear.cli": 5,
}


def _module_name(path: Path) -> str:
    parts = path.relative_to(ROOT.parent).with_suffix("").parts
    return ".".join(parts[:-1] if parts[-1] == "__init__" else parts)


FILES = {_module_name(p): p for p in ROOT.rglob("*.py")}


def _is_type_checking(node: ast.If) -> bool:
    test = node.test
    return (isinstance(test, ast.Name) and test.id == "TYPE_CHECKING") or (
        isinstance(test, ast.Attribute) and test.attr == "TYPE_CHECKING"
    )


def _imports(tree: ast.AST, module: str) -> set[str]:
    """The plyshear modules ``module`` imports at run time."""
    found: set[str] = set()

    def visit(node: ast.AST) -> None:
        if isinstance(node, ast.If) and _is_type_checking(node):
            for child in node.orelse:
                visit(child)
            return
        if isinstance(node, ast.Import):
            found.update(a.name for a in node.names if a.name.startswith("plyshear"))
        elif (
            isinstance(node, ast.ImportFrom)
            and node.module
            and node.level == 0
            and node.module.startswith("plyshear")
        ):
            for a in node.names:  # "from plyshear.codes import check" imports a module
                sub = f"{node.module}.{a.name}"
                found.add(sub if sub in FILES else node.module)
        for child in ast.iter_child_nodes(node):
            visit(child)

    visit(tree)
    found.discard(module)
    return found


def _graph() -> nx.DiGraph:
    g = nx.DiGraph()
    for name, path in FILES.items():
        if path.name == "__init__.py":
            continue  # a package's re-exports
        g.add_node(name)
        for target in _imports(ast.parse(path.read_text(encoding="utf-8")), name):
            if FILES.get(target, Path()).name != "__init__.py":
                g.add_edge(name, target)
    return g


def _layer(module: str) -> int:
    for prefix, rank in LAYERS.items():
        if module == prefix or module.startswith(prefix + "."):
            return rank
    raise AssertionError(f"{module} is in no layer of LAYERS")


def test_the_import_graph_has_no_cycle() -> None:
    assert list(nx.simple_cycles(_graph())) == []


def test_every_import_goes_down_the_layers() -> None:
    upward = [(a, b) for a, b in _graph().edges if _layer(b) > _layer(a)]
    assert upward == []


def test_the_graph_sees_the_imports_it_must() -> None:
    # a parser that found nothing would pass the two tests above: known edges
    g = _graph()
    assert g.has_edge("plyshear.codes.check", "plyshear.codes.aisc360_check")
    assert g.has_edge("plyshear.codes.aisc360_check", "plyshear.codes.common")
    assert g.has_edge("plyshear.cli", "plyshear.errors")  # inside a function
    assert not g.has_edge("plyshear.codes.common", "plyshear.codes.check")
