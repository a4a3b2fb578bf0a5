"""The command line: click commands that parse options, run the check and hand results to a renderer."""

from .main import main

__all__ = ["main"]
