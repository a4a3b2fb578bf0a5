import os

import pytest

os.environ.setdefault("NO_COLOR", "1")
os.environ["COLUMNS"] = "120"

HERE = os.path.dirname(__file__)


@pytest.fixture
def write(tmp_path):
    """Write a text file in a temporary folder and return its path."""
    def _write(name, text, mode="w"):
        path = tmp_path / name
        if mode == "wb":
            path.write_bytes(text)
        else:
            path.write_text(text, encoding="utf-8")
        return str(path)
    return _write
