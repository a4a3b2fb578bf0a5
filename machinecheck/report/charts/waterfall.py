"""Derating waterfall: from rated output through each factor to the available output."""

from __future__ import annotations

import math
from collections.abc import Sequence
from dataclasses import dataclass

from ._svg import Canvas, Scale, esc, fitting_ticks, fmt, text_width, tick_text

_ROW_H, _BAR_H, _BARS_W, _TOP = 26.0, 15.0, 360.0, 10.0
_NAME_SIZE, _VALUE_SIZE, _TICK_SIZE = 10.0, 10.0, 10.0
_TOTAL, _DROP, _RISE = "#4a6fa5", "#c0504d", "#4f9a4f"


@dataclass(frozen=True)
class WaterfallStep:
    """One bar: its name, the output after it [the chart's unit], and the factor applied there.

    The first and last steps are totals drawn from zero (rated and available output); every
    step between is drawn from the previous step's value to its own.
    """

    label: str
    value: float
    factor: float | None = None


def _decimals(values: Sequence[float]) -> int:
    top = max(abs(v) for v in values)
    return 2 if top < 10 else 1 if top < 1000 else 0


def derating_waterfall_canvas(steps: Sequence[WaterfallStep], *, unit: str = "kW",
                              title: str = "derating from rated to available output") -> Canvas:
    """The laid-out chart (see :func:`derating_waterfall`), with every text's estimated box."""
    if len(steps) < 2:
        raise ValueError(f"a derating waterfall needs at least the rated and the available "
                         f"output, got {len(steps)} step(s)")
    for s in steps:
        if not math.isfinite(s.value) or (s.factor is not None and not math.isfinite(s.factor)):
            raise ValueError(f"waterfall step {s.label!r} has no finite value")
    values = [s.value for s in steps]
    decimals = _decimals(values)
    name_w = max(text_width(s.label, _NAME_SIZE) for s in steps)
    bars_x0 = 8 + name_w + 10
    ticks = fitting_ticks(min([0.0] + values), max(values), _BARS_W, _TICK_SIZE, 5)
    sx = Scale(ticks[0], ticks[-1], bars_x0, bars_x0 + _BARS_W)
    canvas = Canvas(title)
    last = len(steps) - 1
    for i, s in enumerate(steps):
        top = _TOP + i * _ROW_H
        mid = top + _ROW_H / 2
        canvas.text(bars_x0 - 10, mid + 3.5, s.label, size=_NAME_SIZE, anchor="end")
        total = i in (0, last)
        start = 0.0 if total else steps[i - 1].value
        lo, hi = sorted((sx(start), sx(s.value)))
        colour = _TOTAL if total else _DROP if s.value < start else _RISE
        canvas.add(f'<rect x="{fmt(lo)}" y="{fmt(mid - _BAR_H / 2)}" width="{fmt(max(hi - lo, 1.0))}" '
                   f'height="{fmt(_BAR_H)}" fill="{colour}" stroke="#222" stroke-width="0.6">'
                   f"<title>{esc(s.label)}</title></rect>")
        if i < last:  # connector to the next bar
            x = sx(s.value)
            canvas.add(f'<line x1="{fmt(x)}" y1="{fmt(mid + _BAR_H / 2)}" x2="{fmt(x)}" '
                       f'y2="{fmt(mid + _ROW_H - _BAR_H / 2)}" stroke="#555" stroke-width="0.8" '
                       'stroke-dasharray="2 2"/>')
        shown = f"{s.value:.{decimals}f} {unit}"
        if s.factor is not None:
            shown = f"× {s.factor:.3f} → {shown}"
        canvas.text(max(sx(start), sx(s.value)) + 6, mid + 3.5, shown, size=_VALUE_SIZE)
    axis_y = _TOP + len(steps) * _ROW_H + 4
    canvas.add(f'<line x1="{fmt(sx(ticks[0]))}" y1="{fmt(axis_y)}" x2="{fmt(sx(ticks[-1]))}" '
               f'y2="{fmt(axis_y)}" stroke="#222" stroke-width="0.8"/>')
    step = ticks[1] - ticks[0]
    for t in ticks:
        x = sx(t)
        canvas.add(f'<line x1="{fmt(x)}" y1="{fmt(axis_y)}" x2="{fmt(x)}" y2="{fmt(axis_y + 4)}" '
                   'stroke="#222" stroke-width="0.8"/>')
        canvas.text(x, axis_y + 16, tick_text(t, step), size=_TICK_SIZE, anchor="middle")
    canvas.text(sx(ticks[-1]), axis_y + 32, f"output, {unit}", size=_TICK_SIZE, anchor="end")
    canvas.fit(bars_x0 + _BARS_W + 16, 0.0)
    return canvas


def derating_waterfall(steps: Sequence[WaterfallStep], *, unit: str = "kW",
                       title: str = "derating from rated to available output") -> str:
    """Inline SVG: horizontal bars from rated output through each derating factor to available.

    Parameters
    ----------
    steps : rated output first, then one step per factor (its name, the output after it and the
        factor), then the available output; values in ``unit``
    unit : unit of the values as shown (e.g. "kW", "kVA", "hp")
    title : accessible title

    Each bar carries its name on the left and its value (with the factor) on the right.
    """
    return derating_waterfall_canvas(steps, unit=unit, title=title).svg()
