"""HTML renderer: one self-contained printable page (inline CSS and SVG, no scripts, no links).

Summary counts, the fleet matrix, then per site a voltage-frequency diagram of the standard's
zones with each machine's operating point, a table, and each pair's findings and figures.
"""

from __future__ import annotations

from collections.abc import Callable, Iterable, Sequence
from html import escape
from typing import Any

from .. import __version__
from ..physics import tolerance
from ..report import CAUTION
from ..report.data import SITE_COLUMNS, by_site, site_row, summary_counts, worst_first
from ..report.matrix import verdict_matrix

_CSS = """
body{font-family:system-ui,Segoe UI,Helvetica,Arial,sans-serif;margin:2em;color:#111;
max-width:70em}
h1{font-size:1.5em}h2{font-size:1.25em;margin-top:2em;border-bottom:1px solid #999}
h3{font-size:1.05em;margin:1.2em 0 .3em}
table{border-collapse:collapse;margin:.5em 0}th,td{border:1px solid #bbb;padding:.2em .5em;
text-align:left;vertical-align:top}td.n{text-align:right}
.compatible{background:#e3f4e1}.conditional{background:#fff4cc}.incompatible{background:#fbd9d6}
.caution{border:2px solid #b00;padding:.6em;background:#fff5f5}
.problem{color:#a00;font-weight:bold}.warning{color:#850}.info{color:#444}
dl{display:grid;grid-template-columns:max-content auto;gap:0 1em;margin:.3em 0}dt{color:#555}
dd{margin:0}pre{background:#f4f4f4;padding:.5em;white-space:pre-wrap}
svg{max-width:100%;height:auto}section{page-break-inside:avoid}
@media print{body{margin:1cm}h2{page-break-before:auto}}
"""

#: Plotted window of the diagram, per unit: frequency deviation x, voltage deviation y.
_X_RANGE = (-0.08, 0.08)
_Y_RANGE = (-0.16, 0.16)
_W, _H, _PAD = 520, 360, 48
_POINT_COLOUR = {"compatible": "#2a7d2a", "conditional": "#b07800", "incompatible": "#c0271b"}


def _e(text: object) -> str:
    return escape("".join(ch if ch.isprintable() or ch == "\n" else " " for ch in str(text)))


def _xy(df: float, dv: float) -> tuple[float, float]:
    (x0, x1), (y0, y1) = _X_RANGE, _Y_RANGE
    x = _PAD + (df - x0) / (x1 - x0) * (_W - 2 * _PAD)
    y = _H - _PAD - (dv - y0) / (y1 - y0) * (_H - 2 * _PAD)
    return x, y


def operating_points(group: Iterable[Any]) -> list[tuple[str, float, float, bool, str]]:
    """(machine id, df, dV, re-rated, verdict) per pair, as the tolerance rule judged them."""
    points = []
    for a in group:
        t = a.tolerance
        if not t:
            continue
        df = 0.0 if t.get("basis") == "re-rated" else t.get("frequency_deviation", 0.0)
        points.append((a.machine.id, df, t.get("voltage_deviation", 0.0), a.rerated, a.verdict))
    return points


def zone_diagram(site: Any, group: Iterable[Any]) -> str:
    """Inline SVG: the standard's V/f zones with each machine's operating point."""
    parts = [f'<svg viewBox="0 0 {_W} {_H}" role="img" '
             f'aria-label="voltage and frequency zones for {_e(site.id)}">',
             f'<rect x="0" y="0" width="{_W}" height="{_H}" fill="#fff"/>']
    if site.standard == "NEMA":
        shapes = [("NEMA MG 1 12.44", tolerance.nema_outline(), "#dbe9f7")]
    else:
        shapes = [("zone B", tolerance.iec_zone_outline("B"), "#fdf0c8"),
                  ("zone A", tolerance.iec_zone_outline("A"), "#d8efd4")]
    for label, outline, fill in shapes:
        corners = " ".join(f"{x:.1f},{y:.1f}" for x, y in (_xy(*p) for p in outline))
        parts.append(f'<polygon points="{corners}" fill="{fill}" stroke="#666" '
                     f'stroke-width="1"><title>{_e(label)}</title></polygon>')
        corner = max(outline, key=lambda p: (-p[0], p[1]))  # upper left, clear of the points
        x, y = _xy(*corner)
        parts.append(f'<text x="{x + 2:.1f}" y="{y - 4:.1f}" font-size="11" fill="#333">'
                     f'{_e(label)}</text>')
    # axes through the rated point, ticks every 2 % (f) and 5 % (V)
    x_left, y_mid = _xy(_X_RANGE[0], 0.0)
    x_right, _ = _xy(_X_RANGE[1], 0.0)
    x_mid, y_top = _xy(0.0, _Y_RANGE[1])
    _, y_bottom = _xy(0.0, _Y_RANGE[0])
    parts.append(f'<line x1="{x_left:.1f}" y1="{y_mid:.1f}" x2="{x_right:.1f}" y2="{y_mid:.1f}" '
                 'stroke="#222" stroke-width="0.8"/>')
    parts.append(f'<line x1="{x_mid:.1f}" y1="{y_top:.1f}" x2="{x_mid:.1f}" y2="{y_bottom:.1f}" '
                 'stroke="#222" stroke-width="0.8"/>')
    for step in range(-8, 9, 2):
        x, _ = _xy(step / 100, 0.0)
        parts.append(f'<text x="{x:.1f}" y="{_H - _PAD + 16:.1f}" font-size="10" '
                     f'text-anchor="middle">{step:+d}</text>')
    for step in range(-15, 16, 5):
        _, y = _xy(0.0, step / 100)
        parts.append(f'<text x="{_PAD - 6:.1f}" y="{y + 3:.1f}" font-size="10" '
                     f'text-anchor="end">{step:+d}</text>')
    parts.append(f'<text x="{_W / 2:.0f}" y="{_H - 8}" font-size="11" text-anchor="middle">'
                 'frequency deviation, % of rated</text>')
    parts.append(f'<text x="12" y="{_H / 2:.0f}" font-size="11" text-anchor="middle" '
                 f'transform="rotate(-90 12 {_H / 2:.0f})">voltage deviation (re-rated: '
                 'flux k - 1), %</text>')
    (x0, x1), (y0, y1) = _X_RANGE, _Y_RANGE
    groups: dict[tuple[int, int, bool, bool], list[tuple[float, float, Any]]] = {}
    for point in operating_points(group):
        _, df, dv, rerated, _ = point
        clipped = not (x0 <= df <= x1 and y0 <= dv <= y1)
        x, y = _xy(min(max(df, x0), x1), min(max(dv, y0), y1))
        groups.setdefault((round(x / 3), round(y / 3), rerated, clipped), []).append(
            (x, y, point))
    order = ("compatible", "conditional", "incompatible")
    for (_, _, rerated, clipped), members in groups.items():
        x, y, _ = members[0]
        verdict = max((p[4] for _, _, p in members), key=order.index)
        colour = _POINT_COLOUR[verdict]
        note = "; ".join(f"{p[0]}: dV {100 * p[2]:+.1f} %, df {100 * p[1]:+.1f} %, {p[4]}"
                         for _, _, p in members)
        note += (" (re-rated)" if rerated else "") + (" (off the chart)" if clipped else "")
        if clipped:
            parts.append(f'<path d="M{x - 5:.1f},{y - 5:.1f}L{x + 5:.1f},{y + 5:.1f}M{x - 5:.1f},'
                         f'{y + 5:.1f}L{x + 5:.1f},{y - 5:.1f}" stroke="{colour}" '
                         f'stroke-width="2"><title>{_e(note)}</title></path>')
        else:
            fill = "#fff" if rerated else colour
            parts.append(f'<circle cx="{x:.1f}" cy="{y:.1f}" r="4.5" fill="{fill}" '
                         f'stroke="{colour}" stroke-width="2"><title>{_e(note)}</title></circle>')
        ids = [p[0] for _, _, p in members]
        label = ", ".join(ids[:3]) + (f" +{len(ids) - 3}" if len(ids) > 3 else "")
        below = 12 if rerated else -5  # re-rated and rated groups at one spot don't collide
        parts.append(f'<text x="{x + 7:.1f}" y="{y + below:.1f}" font-size="9" fill="#222">'
                     f'{_e(label)}</text>')
    parts.append("</svg>")
    return "".join(parts)


def _figures(a: Any) -> list[tuple[str, str]]:
    rows = [("rating set", f"{a.rating.frequency_hz:g} Hz, "
                           f"{a.connection.name or 'as stamped'} {a.rated_voltage_v:.0f} V"),
            ("supply to winding", f"{a.supply_voltage_v:.0f} V {a.supply_voltage_note}".strip()),
            ("flux ratio k", f"{a.flux_ratio:.3f}"),
            ("synchronous speed", f"{a.synchronous_speed_rpm:.0f} rpm")]
    basis = f" ({a.operating_point_basis})" if a.operating_point_basis else ""
    optional: tuple[tuple[str, Any, Callable[[Any], str]], ...] = (
        ("expected speed", a.expected_speed_rpm, lambda v: f"{v:.0f} rpm{basis}"),
        ("available output", a.available_power_w,
         lambda v: f"{v / 1000:.2f} of {a.rated_power_w / 1000:.2f} kW (x {a.combined_factor:.3f})"),
        ("available apparent power", a.available_apparent_power_va, lambda v: f"{v / 1000:.1f} kVA"),
        ("load power", a.load_power_w, lambda v: f"{v / 1000:.2f} kW"),
        ("full-load current", a.full_load_current_a, lambda v: f"{v:.1f} A ({a.current_basis})"),
        ("load current", a.operating_current_a, lambda v: f"{v:.1f} A"),
        ("breakdown torque / load", a.breakdown_margin, lambda v: f"{v:.2f}"),
        ("NFPA 70 table current", a.code_current_a, lambda v: f"{v:g} A"),
    )
    rows += [(label, shown(value)) for label, value, shown in optional if value is not None]
    return rows


#: Title of the report, and of the demo's.
TITLE = "machinecheck report"
DEMO_TITLE = "machinecheck demo report: an invented fleet against invented sites"


def render(assessments: Sequence[Any], *, explain: bool = False, demo: bool = False,
           **_: Any) -> str:
    title = _e(DEMO_TITLE if demo else TITLE)
    out = ['<!DOCTYPE html>', '<html lang="en"><head><meta charset="utf-8">',
           '<meta name="viewport" content="width=device-width, initial-scale=1">',
           f'<title>{title}</title>', f'<style>{_CSS}</style></head><body>',
           f'<h1>{title}</h1>',
           f'<p class="caution">{_e(CAUTION)}</p>']
    counts = summary_counts(assessments)
    out += ['<h2>Summary</h2>', '<table><thead><tr><th>site</th><th>compatible</th>'
            '<th>conditional</th><th>incompatible</th></tr></thead><tbody>']
    out += [f'<tr><td>{_e(s)}</td><td class="n">{c["compatible"]}</td>'
            f'<td class="n">{c["conditional"]}</td><td class="n">{c["incompatible"]}</td></tr>'
            for s, c in counts.items()]
    out.append('</tbody></table>')
    machines, sites, cells = verdict_matrix(assessments)
    out += ['<h2>Fleet matrix</h2>', '<table><thead><tr><th>machine</th>'
            + "".join(f'<th>{_e(s)}</th>' for s in sites) + '</tr></thead><tbody>']
    for m in machines:
        row = "".join(f'<td class="{cells.get((m, s), "")}">{_e(cells.get((m, s), ""))}</td>'
                      for s in sites)
        out.append(f'<tr><th>{_e(m)}</th>{row}</tr>')
    out.append('</tbody></table>')

    for site_id, group in by_site(assessments).items():
        s = group[0].site
        title = f"{site_id}" + (f": {s.name}" if s.name else "")
        out.append(f'<section><h2>{_e(title)}</h2>')
        out.append(f'<p>{s.voltage_v:g} V {s.frequency_hz:g} Hz, {s.phases} phase'
                   f'{"s" if s.phases > 1 else ""}, tolerance rules {_e(s.standard)}; altitude '
                   f'{s.altitude_m:g} m, ambient {s.ambient_degc:g} °C.</p>')
        out.append(zone_diagram(s, group))
        out.append('<p>Filled dots: rated-frequency points; hollow: re-rated from another '
                   'frequency, plotted at the flux deviation; crosses: off the chart.</p>')
        out.append('<table><thead><tr>' + "".join(f'<th>{_e(c)}</th>' for c in SITE_COLUMNS)
                   + '</tr></thead><tbody>')
        ordered = worst_first(group)
        for a in ordered:
            first, *rest = site_row(a)
            out.append(f'<tr class="{a.verdict}"><td>{_e(first)}</td><td>{rest[0]}</td>'
                       + "".join(f'<td class="n">{_e(x)}</td>' for x in rest[1:]) + '</tr>')
        out.append('</tbody></table>')
        for a in ordered:
            out.append(f'<h3>{_e(a.machine.id)} at {_e(site_id)}: '
                       f'<span class="{a.verdict}">{a.verdict}</span></h3>')
            out.append('<dl>' + "".join(f'<dt>{_e(k)}</dt><dd>{_e(v)}</dd>'
                                        for k, v in _figures(a)) + '</dl>')
            out.append('<ul>' + "".join(
                f'<li><span class="{f.severity}">{f.severity}</span> <code>{_e(f.code)}</code>: '
                f'{_e(f.message)}</li>' for f in a.findings) + '</ul>')
            if explain and a.working:
                out.append('<pre>' + _e("\n".join(a.working)) + '</pre>')
        out.append('</section>')
    out += [f'<p class="caution">{_e(CAUTION)}</p>',
            f'<p><small>machinecheck {_e(__version__)}</small></p>', '</body></html>', '']
    return "\n".join(out)
