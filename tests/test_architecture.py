"""The layer boundaries, as tests: core -> library -> services -> faces (cli, tui), imports one way only."""

import ast
import subprocess
import sys
from pathlib import Path

import pytest

PKG = Path(__file__).resolve().parents[1] / "crossrate"

# Which crossrate subpackages each layer may import (besides itself and crossrate.errors).
ALLOWED = {
    "core": set(),
    "library": {"core"},
    "services": {"core", "library"},
    "figures": {"core", "library", "services"},
    "cli": {"core", "library", "services", "figures"},
    "tui": {"core", "library", "services"},
}
THIRD_PARTY_FORBIDDEN = {
    "core": {"textual", "rich", "tomli", "tomllib", "tomli_w", "matplotlib"},
    "library": {"textual", "rich", "matplotlib"},
    "services": {"textual", "rich", "matplotlib"},
    "cli": {"textual"},
}


def _imports(path: Path, layer: str):
    """(crossrate subpackages imported, top-level third-party modules imported) by one file."""
    tree = ast.parse(path.read_text(encoding="utf-8"))
    depth = len(path.relative_to(PKG).parts) - 1  # how many folders below crossrate/
    inner, outer = set(), set()
    for node in ast.walk(tree):
        if isinstance(node, ast.Import):
            for a in node.names:
                parts = a.name.split(".")
                if parts[0] == "crossrate" and len(parts) > 1:
                    inner.add(parts[1])
                else:
                    outer.add(parts[0])
        elif isinstance(node, ast.ImportFrom):
            if node.level == 0:
                parts = (node.module or "").split(".")
                if parts[0] == "crossrate":
                    if len(parts) > 1:
                        inner.add(parts[1])
                else:
                    outer.add(parts[0])
            else:
                # relative: level 1 = own package; level depth+1 = crossrate/
                if node.level > depth:
                    mod = (node.module or "").split(".")[0]
                    if mod:
                        inner.add(mod)
                    else:
                        inner.update(a.name for a in node.names)
    inner.discard(layer)
    return inner, outer


@pytest.mark.parametrize("layer", sorted(ALLOWED))
def test_layer_imports_flow_one_way(layer):
    folder = PKG / layer
    if not folder.exists():
        pytest.skip(f"crossrate/{layer} not present")
    bad = []
    for path in folder.rglob("*.py"):
        inner, outer = _imports(path, layer)
        allowed = ALLOWED[layer] | {"errors", "__init__", "__version__"}
        if path == PKG / "cli" / "main.py":
            allowed = allowed | {"tui"}  # the entry point opens the workbench, importing it only then
        for m in inner - allowed:
            bad.append(f"{path.relative_to(PKG)} imports crossrate.{m}")
        for m in outer & THIRD_PARTY_FORBIDDEN.get(layer, set()):
            bad.append(f"{path.relative_to(PKG)} imports {m}")
    assert not bad, "\n".join(bad)


def _modules_after(code: str) -> set[str]:
    out = subprocess.run(
        [sys.executable, "-c", code + "\nimport sys\nprint('\\n'.join(sorted(sys.modules)))"],
        capture_output=True, text=True, check=True,
    )
    return set(out.stdout.split())


def test_core_library_services_load_no_ui_toolkits():
    mods = _modules_after(
        "import crossrate.core.cross_rate, crossrate.library.couple_set, crossrate.services.prediction, "
        "crossrate.services.batch_prediction"
    )
    assert "textual" not in mods
    assert "rich" not in mods


def test_cli_path_loads_no_textual():
    mods = _modules_after("from crossrate.cli.main import build_parser\nbuild_parser()")
    assert "textual" not in mods


def test_no_module_is_too_long():
    # One concept per module: nothing over ~400 lines (the project's rule; a little slack for docstrings).
    long = [
        f"{p.relative_to(PKG)}: {n} lines"
        for p in PKG.rglob("*.py")
        if (n := len(p.read_text(encoding="utf-8").splitlines())) > 450
    ]
    assert not long, long
