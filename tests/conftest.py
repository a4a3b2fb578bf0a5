import atexit
import os
import shutil
import tempfile

import pytest

os.environ.setdefault("NO_COLOR", "1")
os.environ["COLUMNS"] = "120"
# the unit-scale cache of the runs under test stays out of the user's own cache folder
_CACHE = tempfile.mkdtemp(prefix="machinecheck-test-cache-")
os.environ["MACHINECHECK_CACHE"] = _CACHE
atexit.register(shutil.rmtree, _CACHE, True)

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
