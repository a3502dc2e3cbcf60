"""The layout rules of DESIGN.md ("Stage two"), checked on the source tree itself.

- The engine (calc, apart from its command-line face) imports nothing outside calc and the
  standard library, so it loads under Pyodide without the build tools.
- No import cycle among the Python modules of calc and sitebuild, nor among the page's modules.
- No source file in calc/, sitebuild/ or docs/assets/js/ much over 400 lines (small topic modules).
"""

import ast
import os
import re
import sys

import pytest

ROOT = os.path.dirname(os.path.dirname(os.path.abspath(__file__)))
#: the command-line face may reach the build tools (to rebuild a stale bundle, to check data)
ENGINE_FACES = {"calc.cli", "calc.__main__"}
#: "about 400 lines": a file may run a little over while it holds one topic
LINES_MAX = 420


def _modules(package):
    """module name -> path of every .py file of a package folder."""
    out = {}
    base = os.path.join(ROOT, package)
    for dirpath, dirnames, filenames in os.walk(base):
        dirnames[:] = [d for d in dirnames if d != "__pycache__"]
        for name in filenames:
            if name.endswith(".py"):
                rel = os.path.relpath(os.path.join(dirpath, name), ROOT)[:-3].replace(os.sep, ".")
                out[rel[:-9] if rel.endswith(".__init__") else rel] = os.path.join(dirpath, name)
    return out


def _imports(name, path):
    """The absolute module names a module imports (relative imports resolved), top-level and inside functions."""
    tree = ast.parse(open(path, encoding="utf-8").read(), path)
    package = name if path.endswith("__init__.py") else name.rpartition(".")[0]
    found = set()
    for node in ast.walk(tree):
        if isinstance(node, ast.Import):
            found.update(a.name for a in node.names)
        elif isinstance(node, ast.ImportFrom):
            if node.level:
                base = package.split(".")
                base = base[:len(base) - node.level + 1]
                mod = ".".join(base + ([node.module] if node.module else []))
            else:
                mod = node.module or ""
            found.add(mod)
            found.update(f"{mod}.{a.name}" for a in node.names)
    return found


def _top_level_imports(name, path):
    """Like _imports, but only the imports run when the module loads (not inside functions)."""
    tree = ast.parse(open(path, encoding="utf-8").read(), path)
    package = name if path.endswith("__init__.py") else name.rpartition(".")[0]
    found = set()
    for node in tree.body:
        if isinstance(node, ast.Import):
            found.update(a.name for a in node.names)
        elif isinstance(node, ast.ImportFrom):
            base = package.split(".")
            mod = (".".join(base[:len(base) - node.level + 1] + ([node.module] if node.module else []))
                   if node.level else node.module or "")
            found.add(mod)
            found.update(f"{mod}.{a.name}" for a in node.names)
    return found


def _cycle(graph):
    """One import cycle of a graph {node: set of nodes}, as a list, or None."""
    state, stack = {}, []

    def visit(n):
        state[n] = 1
        stack.append(n)
        for m in sorted(graph.get(n, ())):
            if state.get(m) == 1:
                return stack[stack.index(m):] + [m]
            if m not in state:
                found = visit(m)
                if found:
                    return found
        stack.pop()
        state[n] = 2
        return None

    for n in sorted(graph):
        if n not in state:
            found = visit(n)
            if found:
                return found
    return None


def test_cycle_finder_finds_a_cycle_and_accepts_a_tree():
    assert _cycle({"a": {"b"}, "b": {"c"}, "c": {"a"}}) == ["a", "b", "c", "a"]
    assert _cycle({"a": {"b", "c"}, "b": {"c"}, "c": set()}) is None


def test_the_engine_imports_only_calc_and_the_standard_library():
    stdlib = set(sys.stdlib_module_names)
    problems = []
    for name, path in sorted(_modules("calc").items()):
        if name in ENGINE_FACES:
            continue
        for mod in _imports(name, path):
            top = mod.split(".")[0]
            if top not in stdlib and top != "calc":
                problems.append(f"{name} imports {mod}")
    assert not problems, problems


@pytest.mark.parametrize("package", ["calc", "sitebuild"])
def test_no_import_cycle_among_python_modules(package):
    mods = _modules(package)
    graph = {}
    for name, path in mods.items():
        deps = set()
        for mod in _top_level_imports(name, path):
            while mod and mod not in mods:  # "calc.joint.judge_joint" -> "calc.joint"
                mod = mod.rpartition(".")[0]
            if mod and mod != name and not name.startswith(mod + "."):  # a package's own __init__ is not a cycle
                deps.add(mod)
        graph[name] = deps
    assert _cycle(graph) is None, " -> ".join(_cycle(graph))


def test_no_import_cycle_among_the_page_modules():
    folder = os.path.join(ROOT, "docs", "assets", "js")
    graph = {}
    for name in os.listdir(folder):
        if name.endswith((".mjs", ".js")):
            text = open(os.path.join(folder, name), encoding="utf-8").read()
            # static imports only: a dynamic import() loads on demand and cannot form a load-time cycle
            graph[name] = set(re.findall(r"""^\s*(?:import|export)\s[^;]*?from\s+["']\./([\w.-]+)["']""", text, re.M))
    assert _cycle(graph) is None, " -> ".join(_cycle(graph))


def test_no_source_file_much_over_400_lines():
    long = []
    for folder, exts in (("calc", (".py",)), ("sitebuild", (".py", ".html", ".js")), ("docs/assets/js", (".mjs", ".js"))):
        for dirpath, dirnames, filenames in os.walk(os.path.join(ROOT, folder)):
            dirnames[:] = [d for d in dirnames if d != "__pycache__"]
            for name in filenames:
                if name.endswith(exts):
                    path = os.path.join(dirpath, name)
                    n = sum(1 for _ in open(path, encoding="utf-8"))
                    if n > LINES_MAX:
                        long.append(f"{os.path.relpath(path, ROOT)}: {n} lines")
    assert not long, long
