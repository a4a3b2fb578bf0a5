"""Rules: typed functions from the engine's records to findings, one family a module.

Every rule takes the same records, (machine, choice, supply, running), and returns a tuple of
:class:`~machinecheck.engine.assessment.Finding`; the order of :data:`RULES` is the order of
the findings in every report. Adding a check means adding a rule, not growing the engine.
"""

from __future__ import annotations

from collections.abc import Callable

from ..engine.assessment import Finding, RatingChoice, Running, Supply
from ..model import Machine
from . import (
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

Rule = Callable[[Machine, RatingChoice, Supply, Running], tuple[Finding, ...]]

RULES: tuple[Rule, ...] = (
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
