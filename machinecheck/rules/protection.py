"""Protection settings: one finding carrying the caution, so that no report shows settings
without it."""

from __future__ import annotations

from ..engine.assessment import Finding
from ..engine.protection import Protection


def check(p: Protection | None) -> tuple[Finding, ...]:
    """An info finding naming the overload's setting and its maximum, with the caution."""
    if p is None:
        return ()
    if p.overload_maximum is None:
        text = (f"overload relay set to {p.overload_dial.current_a:.1f} A "
                f"({p.overload_dial.note}, IEC practice)")
    else:
        text = (f"overload dial {p.overload_dial.current_a:.1f} A (common practice); maximum "
                f"trip {p.overload_maximum.current_a:.1f} A ({p.overload_maximum.clause})")
    return (Finding("protection-settings", "info", f"{text}. {p.caution}"),)
