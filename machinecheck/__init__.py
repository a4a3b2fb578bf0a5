"""machinecheck: does a motor or generator nameplate fit a site supply, and what follows."""

__version__ = "0.1.0"


def build_kind() -> str:
    """"compiled engine" where the engine runs as mypyc-compiled modules (see setup.py), else
    "pure Python"."""
    from importlib.util import find_spec

    spec = find_spec("machinecheck.check")
    origin = (spec.origin if spec is not None else None) or ""
    return "compiled engine" if origin.endswith((".so", ".pyd")) else "pure Python"
