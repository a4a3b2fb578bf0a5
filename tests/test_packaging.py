"""The wheel carries every package folder and data file of the source tree (pyproject.toml lists
them one by one, because the demo catalogs come from the top-level catalogs/ folder)."""

import fnmatch
import sys
from pathlib import Path

if sys.version_info >= (3, 11):
    import tomllib
else:  # pragma: no cover
    import tomli as tomllib

ROOT = Path(__file__).resolve().parent.parent
CONFIG = tomllib.loads((ROOT / "pyproject.toml").read_text(encoding="utf-8"))["tool"]["setuptools"]


def _folder(package: str) -> Path:
    mapped = CONFIG.get("package-dir", {}).get(package)
    return ROOT / mapped if mapped else ROOT / Path(*package.split("."))


def test_every_source_folder_is_a_listed_package():
    listed = set(CONFIG["packages"])
    folders = {".".join(p.relative_to(ROOT).parts) for p in (ROOT / "machinecheck").rglob("*")
               if p.is_dir() and p.name != "__pycache__" and any(c.is_file() for c in p.iterdir())}
    folders.add("machinecheck")
    assert folders - listed == set()


def test_every_data_file_is_shipped():
    data = CONFIG["package-data"]
    for package in CONFIG["packages"]:
        folder = _folder(package)
        assert folder.is_dir(), package
        patterns = data.get(package, [])
        for path in folder.iterdir():
            if path.is_file() and path.suffix not in (".py", ".pyc"):
                assert any(fnmatch.fnmatch(path.name, p) for p in patterns), f"{package}: {path.name}"
