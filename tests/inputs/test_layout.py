"""The input package's shape: no import cycles, no module over about 400 lines."""

import ast
from pathlib import Path

import pytest

from machinecheck.inputs.load import load_file

PACKAGE = Path(__file__).resolve().parents[2] / "machinecheck" / "inputs"


def _imports(path):
    tree = ast.parse(path.read_text(encoding="utf-8"))
    out = set()
    for node in tree.body:  # module level only: what runs at import time
        if isinstance(node, ast.ImportFrom) and node.level == 1:
            names = [node.module] if node.module else [a.name for a in node.names]
            out.update(n.split(".")[0] for n in names)
    return out


def test_no_import_cycles_inside_inputs():
    graph = {p.stem: _imports(p) & {q.stem for q in PACKAGE.glob("*.py")}
             for p in PACKAGE.glob("*.py")}

    def visit(node, trail):
        assert node not in trail, " -> ".join([*trail, node])
        for child in graph.get(node, ()):
            visit(child, [*trail, node])

    for module in graph:
        visit(module, [])


@pytest.mark.parametrize("path", sorted(PACKAGE.glob("*.py")), ids=lambda p: p.name)
def test_modules_stay_small(path):
    assert len(path.read_text(encoding="utf-8").splitlines()) <= 430


def test_load_file_tells_sites_from_catalogs(write):
    sites = load_file(write("s.toml", '[[site]]\nid = "S"\nfrequency = "50 Hz"\n'
                                      'voltage = "400 V"\n'))
    assert sites[0].id == "S"
    catalog = load_file(write("c.csv", "id,frequency,voltage,power,speed\n"
                                       "M,50 Hz,400 V,4 kW,1440 rpm\n"))
    assert catalog.machines[0].id == "M"
