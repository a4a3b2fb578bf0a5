"""Renderers of Assessments. They only format what the engine returns."""

from types import ModuleType

CAUTION = ("Caution: figures are estimates from nameplate data. Verify with the manufacturer "
           "before ordering or connecting; de-energise, lock out and prove dead before any "
           "reconnection; follow local electrical codes and licensed practice.")

FORMATS = ("table", "json", "markdown", "html", "csv")


def renderer(fmt: str) -> ModuleType:
    """The renderer module of a format (imported on first use: rich only for the table)."""
    import importlib

    return importlib.import_module(f".{ {'json': 'json_', 'csv': 'csv_'}.get(fmt, fmt) }",
                                   __name__)
