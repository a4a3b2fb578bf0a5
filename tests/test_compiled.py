"""The compiled engine (setup.py, mypyc) reports exactly what its Python sources report.

mypyc enforces the annotations it compiles (a float-typed value becomes a C double, so an int
there turns into a float, and a wrong annotation is a TypeError): the compiled modules must
pass mypy, and each report is made twice, by the installed package and by the sources beside
these tests, and compared byte for byte (skipped where the installed package is not compiled:
an editable or MACHINECHECK_PURE install).
"""

from __future__ import annotations

import ast
import os
import subprocess
import sys

import pytest

from machinecheck import build_kind

ROOT = os.path.dirname(os.path.dirname(os.path.abspath(__file__)))
sys.path.insert(0, os.path.join(ROOT, "benchmarks"))
from generate import SITES, catalog  # noqa: E402

compiled_only = pytest.mark.skipif(build_kind() != "compiled engine",
                                   reason="the installed engine is not compiled")


def _compiled_modules() -> list[str]:
    """setup.py's COMPILED list, read without running setup.py."""
    with open(os.path.join(ROOT, "setup.py"), encoding="utf-8") as handle:
        tree = ast.parse(handle.read())
    for node in tree.body:
        if isinstance(node, ast.Assign) and getattr(node.targets[0], "id", None) == "COMPILED":
            return ast.literal_eval(node.value)
    raise AssertionError("setup.py has no COMPILED list")


def test_compiled_modules_type_check(tmp_path):
    """mypyc compiles only what mypy accepts; otherwise the install falls back to pure Python."""
    pytest.importorskip("mypy")
    modules = _compiled_modules()
    assert "machinecheck/check.py" in modules and len(modules) >= 20
    done = subprocess.run([sys.executable, "-m", "mypy", "--cache-dir", str(tmp_path), *modules],
                          cwd=ROOT, capture_output=True, text=True, timeout=300)
    assert done.returncode == 0, done.stdout + done.stderr


def _run(args, folder, *, pure: bool):
    env = {**os.environ, "NO_COLOR": "1", "COLUMNS": "120"}
    env.pop("PYTHONPATH", None)
    if pure:
        env["PYTHONPATH"] = ROOT  # the sources, ahead of the installed package
    done = subprocess.run([sys.executable, "-m", "machinecheck", *args], cwd=folder, env=env,
                          capture_output=True, timeout=300)
    return done.returncode, done.stdout, done.stderr


@compiled_only
def test_sources_are_the_pure_build(tmp_path):
    code, out, _ = _run(["--version"], tmp_path, pure=True)
    assert code == 0 and b"(pure Python)" in out
    code, out, _ = _run(["--version"], tmp_path, pure=False)
    assert code == 0 and b"(compiled engine)" in out


@pytest.fixture(scope="module")
def fleet(tmp_path_factory):
    """A generated fleet of 2,100 machines (6,300 pairs: the worker path) and its sites."""
    folder = tmp_path_factory.mktemp("fleet")
    (folder / "fleet.toml").write_text(catalog(2100, seed=11), encoding="utf-8")
    (folder / "sites.toml").write_text(SITES, encoding="utf-8")
    return folder


CASES = {
    "demo table": ["check"],
    "demo json explained": ["check", "--format", "json", "--explain"],
    "demo markdown matrix": ["check", "--format", "markdown", "--matrix"],
    "demo html": ["check", "--format", "html"],
    "one-off plate": ["check", "--power", "50 hp", "--voltage", "460 V", "--frequency", "60 Hz",
                      "--speed", "1775 rpm", "--efficiency", "0.93", "--power-factor", "0.85",
                      "--supply-voltage", "400 V", "--supply-frequency", "50 Hz",
                      "--standard", "IEC", "--explain"],
    "fleet csv": ["check", "fleet.toml", "--sites", "sites.toml", "--format", "csv"],
    "bad input": ["check", os.path.join(ROOT, "tests", "corpus", "absurd-voltage.toml")],
}


@compiled_only
@pytest.mark.parametrize("case", CASES)
def test_same_report(case, fleet):
    assert _run(CASES[case], fleet, pure=False) == _run(CASES[case], fleet, pure=True)


@compiled_only
def test_same_fleet_file_from_workers(fleet):
    """The JSON report to a file: workers parse and check pieces of the catalog text."""
    reports = []
    for pure in (False, True):
        name = f"out-{pure}.json"
        code, _, _ = _run(["check", "fleet.toml", "--sites", "sites.toml", "--format", "json",
                           "--output", name], fleet, pure=pure)
        reports.append((code, (fleet / name).read_bytes()))
    assert reports[0] == reports[1]
    assert reports[0][1].count(b'"machine":') == 6300
