"""Curves against a common x axis (torque or current against speed), with named points."""

from __future__ import annotations

import math
from collections.abc import Sequence
from dataclasses import dataclass

from ._svg import Box, Canvas, Scale, esc, fitting_ticks, fmt, nice_ticks, text_width, tick_text
from .labels import group_points, place_labels
from .legend import Symbol, legend_row, line_sample

_TOP, _PLOT_W, _PLOT_H = 30.0, 440.0, 280.0  # the y axis title sits above the plot
_LABEL_SIZE, _TICK_SIZE, _TITLE_SIZE = 10.0, 10.0, 11.0
#: (colour, dash pattern) per series in order: told apart by dash in grey print too.
SERIES_STYLES = (("#1f4e9c", ""), ("#c0271b", "7 4"), ("#2a7d2a", "2 3"), ("#7a3d9c", "9 3 2 3"),
                 ("#b07800", "4 2"), ("#333333", "1 2"))


@dataclass(frozen=True)
class Series:
    """A named curve: (x, y) points in the axes' units, in drawing order.

    Non-finite points break the line (a gap, never a made-up value).
    """

    name: str
    points: Sequence[tuple[float, float]]


@dataclass(frozen=True)
class PointMarker:
    """A named point on the chart (operating point, breakdown torque ...), in the axes' units."""

    label: str
    x: float
    y: float


def _finite(x: float, y: float) -> bool:
    return math.isfinite(x) and math.isfinite(y)


def curves_chart_canvas(series: Sequence[Series], *, x_label: str, x_unit: str, y_label: str,
                        y_unit: str, markers: Sequence[PointMarker] = (),
                        title: str = "") -> Canvas:
    """The laid-out chart (see :func:`curves_chart`), with every text's estimated box."""
    for m in markers:
        if not _finite(m.x, m.y):
            raise ValueError(f"chart point {m.label!r} has no finite value")
    xs = [x for s in series for x, y in s.points if _finite(x, y)] + [m.x for m in markers]
    ys = [y for s in series for x, y in s.points if _finite(x, y)] + [m.y for m in markers]
    x_lo, x_hi = min([0.0] + xs), max(xs, default=1.0)
    xticks = fitting_ticks(x_lo, x_hi, _PLOT_W, _TICK_SIZE)
    y_lo, y_hi = min([0.0] + ys), max(ys, default=1.0)
    yticks = nice_ticks(y_lo, y_hi + 0.04 * (y_hi - y_lo))  # headroom for labels over the peak
    y_texts = [tick_text(t, yticks[1] - yticks[0]) for t in yticks]
    left = 8 + max(text_width(t, _TICK_SIZE) for t in y_texts) + 5  # room for the widest tick value
    sx = Scale(xticks[0], xticks[-1], left, left + _PLOT_W)
    sy = Scale(yticks[0], yticks[-1], _TOP + _PLOT_H, _TOP)
    plot = Box(left, _TOP, left + _PLOT_W, _TOP + _PLOT_H)
    canvas = Canvas(title or f"{y_label} against {x_label}")
    canvas.add(f'<rect x="{fmt(plot.x0)}" y="{fmt(plot.y0)}" width="{fmt(_PLOT_W)}" '
               f'height="{fmt(_PLOT_H)}" fill="#fff" stroke="#444" stroke-width="1"/>')
    for t in xticks:
        x = sx(t)
        canvas.add(f'<line x1="{fmt(x)}" y1="{fmt(plot.y0)}" x2="{fmt(x)}" y2="{fmt(plot.y1)}" '
                   f'stroke="{"#222" if t == 0 else "#ccc"}" stroke-width="0.5"/>')
        canvas.text(x, plot.y1 + 18, tick_text(t, xticks[1] - xticks[0]), size=_TICK_SIZE,
                    anchor="middle")
    for t, shown in zip(yticks, y_texts):
        y = sy(t)
        canvas.add(f'<line x1="{fmt(plot.x0)}" y1="{fmt(y)}" x2="{fmt(plot.x1)}" y2="{fmt(y)}" '
                   f'stroke="{"#222" if t == 0 else "#ccc"}" stroke-width="0.5"/>')
        canvas.text(plot.x0 - 5, y + 3.5, shown, size=_TICK_SIZE, anchor="end")
    canvas.text((plot.x0 + plot.x1) / 2, plot.y1 + 36, f"{x_label}, {x_unit}", size=_TITLE_SIZE,
                anchor="middle")
    canvas.text(8, 16, f"{y_label}, {y_unit}", size=_TITLE_SIZE)

    soft: list[tuple[float, float]] = []
    entries: list[tuple[str, Symbol]] = []
    for i, s in enumerate(series):
        colour, dash = SERIES_STYLES[i % len(SERIES_STYLES)]
        runs: list[list[tuple[float, float]]] = [[]]
        for x, y in s.points:
            if _finite(x, y):
                runs[-1].append((sx(x), sy(y)))
            elif runs[-1]:
                runs.append([])
        dash_attr = f' stroke-dasharray="{dash}"' if dash else ""
        for run in (r for r in runs if r):
            canvas.add(f'<polyline points="{" ".join(f"{fmt(x)},{fmt(y)}" for x, y in run)}" '
                       f'fill="none" stroke="{colour}" stroke-width="2"{dash_attr}>'
                       f"<title>{esc(s.name)}</title></polyline>")
            for (xa, ya), (xb, yb) in zip(run, run[1:]):
                steps = max(1, int(math.hypot(xb - xa, yb - ya) / 4))
                soft += [(xa + (xb - xa) * k / steps, ya + (yb - ya) * k / steps)
                         for k in range(steps)]
            soft.append(run[-1])
        empty = not any(runs)
        entries.append((s.name + (" (no values)" if empty else ""), line_sample(colour, dash)))

    bottom = legend_row(canvas, entries, left=plot.x0, top=plot.y1 + 48, right=plot.x1)
    ordered = sorted(markers, key=lambda m: (sy(m.y), sx(m.x), m.label))
    obstacles = [Box(sx(m.x) - 5, sy(m.y) - 5, sx(m.x) + 5, sy(m.y) + 5) for m in ordered]
    obstacles += [t.box for t in canvas.texts]  # axis texts and legend stay clear too
    for m in ordered:
        canvas.add(f'<circle cx="{fmt(sx(m.x))}" cy="{fmt(sy(m.y))}" r="4" fill="#fff" '
                   f'stroke="#111" stroke-width="1.8"><title>{esc(m.label)}: {m.x:g} '
                   f"{esc(x_unit)}, {m.y:g} {esc(y_unit)}</title></circle>")
    anchors = group_points([(sx(m.x), sy(m.y), m.label, 7.0) for m in ordered], reach=5.0)
    placed = place_labels(anchors, font_size=_LABEL_SIZE, area=plot, obstacles=obstacles, soft=soft,
                          stack_x=plot.x1 + 16, stack_top=plot.y0)
    for where in placed:
        if where.leader:
            x0, y0, x1, y1 = where.leader
            canvas.add(f'<line x1="{fmt(x0)}" y1="{fmt(y0)}" x2="{fmt(x1)}" y2="{fmt(y1)}" '
                       'stroke="#666" stroke-width="0.7"/>')
        for line, baseline in zip(where.anchor.lines, where.baselines):
            canvas.text(where.x, baseline, line, size=_LABEL_SIZE, anchor=where.text_anchor)
    canvas.fit(plot.x1 + 16, bottom + 8)
    return canvas


def curves_chart(series: Sequence[Series], *, x_label: str, x_unit: str, y_label: str, y_unit: str,
                 markers: Sequence[PointMarker] = (), title: str = "") -> str:
    """Inline SVG: named curves on common axes, a legend, and labelled points.

    Parameters
    ----------
    series : curves in legend order, e.g. motor at rated supply, motor at site supply, load;
        each told apart by colour and dash
    x_label, x_unit, y_label, y_unit : axis quantities and units (e.g. "speed", "rpm")
    markers : named points (operating point, breakdown) drawn as open circles with labels
    title : accessible title; defaults to "<y_label> against <x_label>"

    The axes run from zero (or the least value, if negative) to round values above the data,
    so no point is cut off. Labels never overlap one another and stay inside the drawing.
    """
    return curves_chart_canvas(series, x_label=x_label, x_unit=x_unit, y_label=y_label,
                               y_unit=y_unit, markers=markers, title=title).svg()
