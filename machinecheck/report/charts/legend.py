"""Point markers (shape and colour by verdict, so they read in grey print too) and legend rows."""

from __future__ import annotations

import math
from collections.abc import Callable, Sequence

from ._svg import Canvas, esc, fmt, text_width

VERDICT_COLOUR = {"compatible": "#2a7d2a", "conditional": "#b07800", "incompatible": "#c0271b"}
_OTHER_COLOUR = "#555"
_LEGEND_SIZE = 10.0

#: Draws a legend symbol centred at (x, y).
Symbol = Callable[[float, float], str]


def marker(x: float, y: float, verdict: str, hollow: bool, out: tuple[float, float],
           note: str) -> str:
    """A point marker at (x, y); ``out`` (dx, dy) != (0, 0) draws an arrow pointing off the chart.

    compatible: circle, conditional: square, incompatible: triangle, anything else: diamond.
    """
    colour = VERDICT_COLOUR.get(verdict, _OTHER_COLOUR)
    fill = "#fff" if hollow else colour
    title = f"<title>{esc(note)}</title>" if note else ""
    style = f'fill="{fill}" stroke="{colour}" stroke-width="1.8"'
    if out != (0.0, 0.0):
        norm = math.hypot(*out)
        ux, uy = out[0] / norm, out[1] / norm
        bx, by = x - 10 * ux, y - 10 * uy
        corners = [(x, y), (bx - 5 * uy, by + 5 * ux), (bx + 5 * uy, by - 5 * ux)]
        points = " ".join(f"{fmt(px)},{fmt(py)}" for px, py in corners)
        return (f'<polygon points="{points}" fill="{colour}" stroke="{colour}" stroke-width="1">'
                f"{title}</polygon>")
    if verdict == "compatible":
        return f'<circle cx="{fmt(x)}" cy="{fmt(y)}" r="4.5" {style}>{title}</circle>'
    if verdict == "conditional":
        return (f'<rect x="{fmt(x - 4)}" y="{fmt(y - 4)}" width="8" height="8" {style}>'
                f"{title}</rect>")
    if verdict == "incompatible":
        corners = [(x, y - 5.5), (x + 5, y + 4), (x - 5, y + 4)]
    else:
        corners = [(x, y - 5.5), (x + 5, y), (x, y + 5.5), (x - 5, y)]
    points = " ".join(f"{fmt(px)},{fmt(py)}" for px, py in corners)
    return f'<polygon points="{points}" {style}>{title}</polygon>'


def line_sample(colour: str, dash: str) -> Symbol:
    """A short stretch of a curve's line, for the legend."""
    def draw(x: float, y: float) -> str:
        dash_attr = f' stroke-dasharray="{dash}"' if dash else ""
        return (f'<line x1="{fmt(x - 10)}" y1="{fmt(y)}" x2="{fmt(x + 10)}" y2="{fmt(y)}" '
                f'stroke="{colour}" stroke-width="2"{dash_attr}/>')
    return draw


def legend_row(canvas: Canvas, entries: Sequence[tuple[str, Symbol]], *, left: float, top: float,
               right: float) -> float:
    """Lay out legend entries left to right, wrapping at ``right``; returns the bottom edge."""
    line_h = _LEGEND_SIZE * 1.6
    x, y = left, top + _LEGEND_SIZE
    for text, symbol in entries:
        width = 26 + text_width(text, _LEGEND_SIZE)
        if x > left and x + width > right:
            x, y = left, y + line_h
        canvas.add(symbol(x + 10, y - _LEGEND_SIZE * 0.35))
        canvas.text(x + 24, y, text, size=_LEGEND_SIZE)
        x += width + 14
    return y + _LEGEND_SIZE * 0.4
