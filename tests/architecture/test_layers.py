"""The layer order of core/ (written once here and once in DEVELOPERS.md), no import
circles between modules of core/ or app/, and core/ free of Qt and matplotlib.

Facts of the project's own design (no outside source).
"""

from __future__ import annotations

import ast
from pathlib import Path

import pytest

ROOT = Path(__file__).resolve().parents[2]

#: Lowest first; a module may import only from its own layer or the layers below it.
LAYERS = ("model", "codes", "section", "actions", "design", "pipeline", "study", "io",
          "fabrication", "report", "cli")


def _module_name(path: Path, package_root: Path, package: str) -> str:
    rel = path.relative_to(package_root).with_suffix("")
    parts = [p for p in rel.parts if p != "__init__"]
    return ".".join([package, *parts])


def _imports(path: Path, module: str) -> set[str]:
    """Modules of the project that ``path`` imports (absolute names, plystack.*)."""
    tree = ast.parse(path.read_text(encoding="utf-8"))
    is_package = path.name == "__init__.py"
    out: set[str] = set()
    for node in ast.walk(tree):
        if isinstance(node, ast.ImportFrom):
            if node.level:
                base = module.split(".")
                base = base[: len(base) - node.level + (1 if is_package else 0)]
                target = ".".join(base + ([node.module] if node.module else []))
            else:
                target = node.module or ""
            if target.startswith("plystack"):
                out.add(target)
                for alias in node.names:
                    out.add(f"{target}.{alias.name}")
        elif isinstance(node, ast.Import):
            out.update(a.name for a in node.names if a.name.startswith("plystack"))
    return out


def _graph(folder: str) -> dict[str, set[str]]:
    package_root = ROOT / folder
    package = f"plystack.{folder}"
    files = {_module_name(p, package_root, package): p for p in package_root.rglob("*.py")}
    graph = {}
    for name, path in files.items():
        graph[name] = {t for t in _imports(path, name) if t in files and t != name}
    return graph


def _layer(module: str) -> int:
    parts = module.split(".")
    if len(parts) < 3:
        return -1  # the package itself (plystack.core: version only)
    return LAYERS.index(parts[2])


@pytest.mark.parametrize("folder", ["core", "app"])
def test_no_import_circles(folder):
    graph = _graph(folder)
    state: dict[str, int] = {}
    stack: list[str] = []

    def visit(node: str) -> None:
        state[node] = 1
        stack.append(node)
        for nxt in sorted(graph[node]):
            if state.get(nxt) == 1:
                cycle = stack[stack.index(nxt):] + [nxt]
                raise AssertionError("import circle: " + " -> ".join(cycle))
            if nxt not in state:
                visit(nxt)
        stack.pop()
        state[node] = 2

    for node in sorted(graph):
        if node not in state:
            visit(node)


def test_every_core_module_belongs_to_a_layer():
    for name in _graph("core"):
        parts = name.split(".")
        if len(parts) >= 3:
            assert parts[2] in LAYERS, f"{name} is in no layer of {LAYERS}"


def test_core_imports_only_lower_layers():
    bad = []
    for name, targets in _graph("core").items():
        for t in targets:
            if _layer(t) > _layer(name):
                bad.append(f"{name} imports {t} (a higher layer)")
    assert not bad, "\n".join(sorted(bad))


def test_core_never_imports_the_gui_stack():
    for path in (ROOT / "core").rglob("*.py"):
        tree = ast.parse(path.read_text(encoding="utf-8"))
        for node in ast.walk(tree):
            names = []
            if isinstance(node, ast.Import):
                names = [a.name for a in node.names]
            elif isinstance(node, ast.ImportFrom) and not node.level:
                names = [node.module or ""]
            for n in names:
                assert not n.startswith(("PySide6", "matplotlib", "plystack.app")), (
                    f"{path.relative_to(ROOT)} imports {n}")


def test_no_hidden_mutation_or_identity_caches():
    """No object.__setattr__, no writes into __dict__, no caches keyed by id()."""
    for folder in ("core", "app"):
        for path in (ROOT / folder).rglob("*.py"):
            text = path.read_text(encoding="utf-8")
            rel = path.relative_to(ROOT)
            assert "object.__setattr__" not in text, rel
            assert "__dict__[" not in text and "__dict__.setdefault" not in text, rel
            tree = ast.parse(text)
            for node in ast.walk(tree):
                if isinstance(node, ast.Subscript) and isinstance(node.slice, ast.Call):
                    f = node.slice.func
                    assert not (isinstance(f, ast.Name) and f.id == "id"), (
                        f"{rel}:{node.lineno} keys a cache by id()")
