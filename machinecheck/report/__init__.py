"""Renderers of Assessments. They only format what the engine returns."""

CAUTION = ("Caution: figures are estimates from nameplate data. Verify with the manufacturer "
           "before ordering or connecting; de-energise, lock out and prove dead before any "
           "reconnection; follow local electrical codes and licensed practice.")

FORMATS = ("table", "json", "markdown", "html", "csv")
