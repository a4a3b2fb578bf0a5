"""machinecheck: does a motor or generator nameplate fit a site supply, and what follows."""

__version__ = "0.2.0.dev0"
