"""Rules: small functions from an Assessment's figures to findings, one family a module.

Adding a check means adding a rule here, not growing the engine.
"""

from ..rules import (
    connection,
    current,
    efficiency,
    frequency,
    generator,
    load,
    operating,
    phases,
    site,
    supply,
)

RULES = (
    phases.check,
    supply.check,
    frequency.check,
    connection.check,
    site.check,
    load.check,
    operating.check,
    generator.check,
    current.check,
    efficiency.check,
)
