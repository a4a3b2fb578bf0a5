"""Build hook: the check engine compiled to C with mypyc where a C compiler is at hand.

The engine's modules (the model, the physics, the check engine, its rules and the result dict)
are plain typed Python. mypyc turns them into C extension modules that a fleet check runs about
a third faster (docs/performance.md); the Python sources stay the reference and behave the same
(tests/test_compiled.py compares the reports of both).

The package is installed pure Python instead, with a warning, where compiling is not possible or
not wanted: no mypyc or no C compiler, ``MACHINECHECK_PURE=1``, or an editable install (compiled
modules would shadow the sources being edited). ``machinecheck --version`` says which it is.
"""

from __future__ import annotations

import os
import sys

from setuptools import setup
from setuptools.command.build_ext import build_ext

#: The modules a fleet check spends its time in; the input and output edges stay Python.
#: (A plain list: tests/test_compiled.py type-checks these with mypy.)
COMPILED = [
    "machinecheck/model.py",
    "machinecheck/memo.py",
    "machinecheck/check.py",
    "machinecheck/report/data.py",
    "machinecheck/physics/circuit.py",
    "machinecheck/physics/current.py",
    "machinecheck/physics/efficiency.py",
    "machinecheck/physics/environment.py",
    "machinecheck/physics/frequency.py",
    "machinecheck/physics/loads.py",
    "machinecheck/physics/nec.py",
    "machinecheck/physics/speed.py",
    "machinecheck/physics/starting.py",
    "machinecheck/physics/tolerance.py",
    "machinecheck/physics/unbalance.py",
    "machinecheck/rules/connection.py",
    "machinecheck/rules/current.py",
    "machinecheck/rules/efficiency.py",
    "machinecheck/rules/frequency.py",
    "machinecheck/rules/generator.py",
    "machinecheck/rules/load.py",
    "machinecheck/rules/operating.py",
    "machinecheck/rules/phases.py",
    "machinecheck/rules/site.py",
    "machinecheck/rules/supply.py",
]


def _warn(message: str) -> None:
    sys.stderr.write(f"machinecheck build: {message}; installing pure Python\n")


class _OptionalBuildExt(build_ext):
    """build_ext that leaves the package pure Python when the C build fails."""

    def run(self) -> None:
        try:
            super().run()
        except Exception as exc:  # compiler missing or failing: the sources still work
            _warn(f"compiling the engine failed ({exc})")
            for ext in self.extensions:  # no half-built set: all compiled or none
                built = self.get_ext_fullpath(ext.name)
                if os.path.exists(built):
                    os.remove(built)
            self.extensions = []


def _extensions() -> list:
    if os.environ.get("MACHINECHECK_PURE", "") not in ("", "0"):
        return []
    if any(command in sys.argv for command in ("editable_wheel", "develop")):
        return []
    try:
        from mypyc.build import mypycify
    except ImportError:
        _warn("mypyc is not available")
        return []
    try:
        return mypycify(COMPILED, opt_level="3", group_name="machinecheck")
    except (Exception, SystemExit) as exc:
        _warn(f"mypyc could not translate the engine ({exc})")
        return []


setup(ext_modules=_extensions(), cmdclass={"build_ext": _OptionalBuildExt})
