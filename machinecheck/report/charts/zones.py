"""Voltage deviation against frequency deviation with the standard's zones and machine points."""

from __future__ import annotations

import math
from collections.abc import Sequence
from dataclasses import dataclass

from ._svg import Box, Canvas, Scale, esc, fmt, nice_ticks, tick_text
from .labels import Anchor, group_points, place_labels
from .legend import VERDICT_COLOUR, Symbol, legend_row, marker

_LEFT, _TOP, _PLOT_W, _PLOT_H = 44.0, 30.0, 440.0, 330.0  # the y axis title sits above the plot
_LABEL_SIZE, _TICK_SIZE, _TITLE_SIZE = 10.0, 10.0, 11.0
#: Points closer than this share one label block [px] (their markers overlap).
_GROUP_REACH = 6.0
_ZONE_FILLS = ("#fdf0c8", "#d8efd4", "#dbe9f7", "#eadcf2")


@dataclass(frozen=True)
class ZonePolygon:
    """A zone outline: its name and corners (frequency deviation, voltage deviation) [-]."""

    name: str
    vertices: Sequence[tuple[float, float]]


@dataclass(frozen=True)
class ZonePoint:
    """A machine's operating point on the diagram.

    ``verdict`` (compatible, conditional, incompatible, or empty) picks the marker's shape and
    colour; ``hollow`` draws it open (a point re-rated from another frequency).
    """

    label: str
    frequency_deviation_pu: float
    voltage_deviation_pu: float
    verdict: str = ""
    hollow: bool = False


def _pct(value_pu: float) -> str:
    return f"{100 * value_pu:+.1f} %"


def _symbol(verdict: str, hollow: bool, out: tuple[float, float]) -> Symbol:
    def draw(x: float, y: float) -> str:
        return marker(x + 5 * out[0], y, verdict, hollow, out, "")
    return draw


def zone_diagram_canvas(points: Sequence[ZonePoint], polygons: Sequence[ZonePolygon], *,
                        title: str = "voltage and frequency zones",
                        frequency_range_pu: tuple[float, float] = (-0.08, 0.08),
                        voltage_range_pu: tuple[float, float] = (-0.16, 0.16),
                        voltage_axis: str = "voltage deviation, %") -> Canvas:
    """The laid-out diagram (see :func:`zone_diagram`), with every text's estimated box."""
    (f0, f1), (v0, v1) = frequency_range_pu, voltage_range_pu
    if not (f0 < f1 and v0 < v1) or not all(map(math.isfinite, (f0, f1, v0, v1))):
        raise ValueError(f"zone diagram ranges must be finite and increasing, got "
                         f"{frequency_range_pu!r} and {voltage_range_pu!r}")
    for p in points:
        if not (math.isfinite(p.frequency_deviation_pu) and math.isfinite(p.voltage_deviation_pu)):
            raise ValueError(f"zone diagram point {p.label!r} has no finite deviation")
    sx = Scale(f0, f1, _LEFT, _LEFT + _PLOT_W)
    sy = Scale(v0, v1, _TOP + _PLOT_H, _TOP)
    plot = Box(_LEFT, _TOP, _LEFT + _PLOT_W, _TOP + _PLOT_H)
    canvas = Canvas(title)
    canvas.add(f'<rect x="{fmt(plot.x0)}" y="{fmt(plot.y0)}" width="{fmt(_PLOT_W)}" '
               f'height="{fmt(_PLOT_H)}" fill="#fff" stroke="#444" stroke-width="1"/>')
    soft: list[tuple[float, float]] = []
    for i, polygon in enumerate(polygons):
        corners = [(sx(min(max(f, f0), f1)), sy(min(max(v, v0), v1))) for f, v in polygon.vertices]
        canvas.add(f'<polygon points="{" ".join(f"{fmt(x)},{fmt(y)}" for x, y in corners)}" '
                   f'fill="{_ZONE_FILLS[i % len(_ZONE_FILLS)]}" stroke="#555" stroke-width="1">'
                   f"<title>{esc(polygon.name)}</title></polygon>")
        for (xa, ya), (xb, yb) in zip(corners, corners[1:] + corners[:1]):
            steps = max(1, int(math.hypot(xb - xa, yb - ya) / 4))
            soft += [(xa + (xb - xa) * k / steps, ya + (yb - ya) * k / steps) for k in range(steps)]
    # grid and ticks, in percent
    fticks = [t for t in nice_ticks(100 * f0, 100 * f1, 8) if 100 * f0 - 1e-9 <= t <= 100 * f1 + 1e-9]
    vticks = [t for t in nice_ticks(100 * v0, 100 * v1, 8) if 100 * v0 - 1e-9 <= t <= 100 * v1 + 1e-9]
    for t in fticks:
        x = sx(t / 100)
        colour, width = ("#222", "0.9") if t == 0 else ("#ccc", "0.5")
        canvas.add(f'<line x1="{fmt(x)}" y1="{fmt(plot.y0)}" x2="{fmt(x)}" y2="{fmt(plot.y1)}" '
                   f'stroke="{colour}" stroke-width="{width}"/>')
        canvas.text(x, plot.y1 + 18, tick_text(t, fticks[1] - fticks[0]), size=_TICK_SIZE,
                    anchor="middle")
    for t in vticks:
        y = sy(t / 100)
        colour, width = ("#222", "0.9") if t == 0 else ("#ccc", "0.5")
        canvas.add(f'<line x1="{fmt(plot.x0)}" y1="{fmt(y)}" x2="{fmt(plot.x1)}" y2="{fmt(y)}" '
                   f'stroke="{colour}" stroke-width="{width}"/>')
        canvas.text(plot.x0 - 5, y + 3.5, tick_text(t, vticks[1] - vticks[0]), size=_TICK_SIZE,
                    anchor="end")
    canvas.text((plot.x0 + plot.x1) / 2, plot.y1 + 36, "frequency deviation, %", size=_TITLE_SIZE,
                anchor="middle")
    canvas.text(8, 16, voltage_axis, size=_TITLE_SIZE)

    # anchors: zone names first (under the left end of each zone's top edge), then the points
    anchors: list[Anchor] = []
    for polygon in polygons:
        inside = [(f, v) for f, v in polygon.vertices if f0 <= f <= f1 and v0 <= v <= v1]
        if inside:
            f, v = max(inside, key=lambda p: (p[1], -p[0]))
            anchors.append(Anchor(sx(f), sy(v), (polygon.name,), clearance=3.0,
                                  order=("below-right", "below-left", "right", "left")))
    n_zone_names = len(anchors)
    obstacles: list[Box] = []
    drawn: list[tuple[ZonePoint, float, float, tuple[float, float]]] = []
    for p in points:
        df, dv = p.frequency_deviation_pu, p.voltage_deviation_pu
        # direction off the chart in drawing units (y grows downwards), (0, 0) when on it
        out = (1.0 if df > f1 else -1.0 if df < f0 else 0.0,
               -1.0 if dv > v1 else 1.0 if dv < v0 else 0.0)
        x, y = sx(min(max(df, f0), f1)), sy(min(max(dv, v0), v1))
        drawn.append((p, x, y, out))
        reach = 10.0 if out != (0.0, 0.0) else 6.0
        obstacles.append(Box(x - reach, y - reach, x + reach, y + reach))
    on_chart = sorted((d for d in drawn if d[3] == (0.0, 0.0)), key=lambda d: (d[2], d[1], d[0].label))
    off_chart = sorted((d for d in drawn if d[3] != (0.0, 0.0)), key=lambda d: (d[2], d[1], d[0].label))
    ordered = on_chart + off_chart
    labelled = [(x, y, p.label, 7.0) for p, x, y, _ in on_chart]
    labelled += [(x, y, f"{p.label} (f {_pct(p.frequency_deviation_pu)}, "
                        f"V {_pct(p.voltage_deviation_pu)})", 11.0) for p, x, y, _ in off_chart]
    anchors += group_points(labelled, reach=_GROUP_REACH)
    # legend of the markers in use
    kinds = sorted({p.verdict for p in points}, key=lambda v: (v not in VERDICT_COLOUR, v))
    items = [(k or "no verdict", k, False, (0.0, 0.0)) for k in kinds]
    if any(p.hollow for p in points):
        items.append(("hollow: re-rated from another frequency", "", True, (0.0, 0.0)))
    if off_chart:
        items.append(("arrow: off the chart, values given", "", False, (1.0, 0.0)))
    entries = [(text, _symbol(verdict, hollow, out)) for text, verdict, hollow, out in items]
    bottom = legend_row(canvas, entries, left=plot.x0, top=plot.y1 + 48, right=plot.x1)
    obstacles += [t.box for t in canvas.texts]  # axis texts and legend stay clear too
    placed = place_labels(anchors, font_size=_LABEL_SIZE, area=plot, obstacles=obstacles, soft=soft,
                          stack_x=plot.x1 + 24, stack_top=plot.y0)
    for p, x, y, out in ordered:
        note = (f"{p.label}: frequency {_pct(p.frequency_deviation_pu)}, voltage "
                f"{_pct(p.voltage_deviation_pu)}" + (f", {p.verdict}" if p.verdict else "")
                + (" (off the chart)" if out != (0.0, 0.0) else ""))
        canvas.add(marker(x, y, p.verdict, p.hollow, out, note))
    for where in placed:
        if where.leader:
            x0, y0, x1, y1 = where.leader
            canvas.add(f'<line x1="{fmt(x0)}" y1="{fmt(y0)}" x2="{fmt(x1)}" y2="{fmt(y1)}" '
                       'stroke="#666" stroke-width="0.7"/>')
        zone_name = where in placed[:n_zone_names]
        for line, baseline in zip(where.anchor.lines, where.baselines):
            canvas.text(where.x, baseline, line, size=_LABEL_SIZE, anchor=where.text_anchor,
                        fill="#555" if zone_name else "#111")
    canvas.fit(plot.x1 + 16, bottom + 8)
    return canvas


def zone_diagram(points: Sequence[ZonePoint], polygons: Sequence[ZonePolygon], *,
                 title: str = "voltage and frequency zones",
                 frequency_range_pu: tuple[float, float] = (-0.08, 0.08),
                 voltage_range_pu: tuple[float, float] = (-0.16, 0.16),
                 voltage_axis: str = "voltage deviation, %") -> str:
    """Inline SVG: voltage deviation against frequency deviation, the zones, labelled points.

    Parameters
    ----------
    points : operating points (deviations per unit), each labelled with its machine
    polygons : zone outlines in drawing order (outer first), e.g. IEC 60034-1 zones B then A
        from ``physics.tolerance.iec_zone_outline``; corners outside the window are drawn at
        its edge
    title : accessible title of the drawing
    frequency_range_pu, voltage_range_pu : plotted window [-]; points outside it are drawn as
        arrows at the edge, their labels giving the values
    voltage_axis : the vertical axis title (e.g. when re-rated points show flux deviation)

    Labels never overlap one another and stay inside the drawing (see ``labels``).
    """
    return zone_diagram_canvas(points, polygons, title=title, frequency_range_pu=frequency_range_pu,
                               voltage_range_pu=voltage_range_pu, voltage_axis=voltage_axis).svg()
