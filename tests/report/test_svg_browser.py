"""The charts as a real browser engine draws them: headless Chromium measures every text element.

The page holds the charts beside a measuring script that exists only in this test (the product's
SVG has no scripts). Chromium loads it, the script writes each text's rendered box to the page,
and ``--dump-dom`` hands the page back. Checked from that geometry: no two texts of a chart
overlap, every text lies inside its chart's viewBox, and every rendered box lies inside the box
the layout estimated (so the layout's own checks hold for real fonts). The page is also printed
to PDF and PNG, which must exist and not be blank.
"""

from __future__ import annotations

import html
import json
import os
import random
import re
import shutil
import subprocess
import tempfile
import zlib
from dataclasses import dataclass
from pathlib import Path

import pytest
from chart_inputs import (
    HOSTILE,
    crowded_points,
    iec_polygons,
    torque_markers,
    torque_series,
    waterfall_steps,
)

from machinecheck.report.charts import (
    PointMarker,
    Series,
    WaterfallStep,
    ZonePoint,
    curves_chart_canvas,
    derating_waterfall_canvas,
    zone_diagram_canvas,
)
from machinecheck.report.charts._svg import Canvas, esc

CHROMIUM = shutil.which("chromium") or shutil.which("chromium-browser")
if CHROMIUM is None and os.environ.get("MACHINECHECK_BROWSER_TESTS") == "required":
    raise RuntimeError("browser tests are required here but chromium is not installed (.ci/chromium)")
pytestmark = pytest.mark.skipif(
    CHROMIUM is None, reason="chromium is not installed (Debian package chromium; .ci/chromium "
                             "installs it)")

FLAGS = ["--headless", "--no-sandbox", "--disable-gpu", "--disable-quic", "--no-first-run",
         "--disable-background-networking", "--disable-component-update", "--disable-sync",
         "--hide-scrollbars"]

MEASURE = """<script>
var charts = [];
document.querySelectorAll('svg').forEach(function (svg) {
  var frame = svg.getBoundingClientRect(), view = svg.viewBox.baseVal, texts = [];
  svg.querySelectorAll('text').forEach(function (t) {
    var r = t.getBoundingClientRect();
    texts.push([t.textContent, r.left - frame.left, r.top - frame.top, r.right - frame.left,
                r.bottom - frame.top, t.getComputedTextLength()]);
  });
  charts.push({width: frame.width, height: frame.height, view: [view.width, view.height],
               texts: texts});
});
document.getElementById('measured').textContent = JSON.stringify(charts);
</script>"""

Rect = tuple[float, float, float, float]


def charts() -> list[Canvas]:
    """Crowded, long, hostile and far-out inputs for every chart."""
    rng = random.Random(20261203)
    scattered = [ZonePoint(f"M{rng.randrange(10**6):06d}-{'X' * rng.randrange(1, 12)}",
                           rng.uniform(-0.12, 0.12), rng.uniform(-0.25, 0.25),
                           rng.choice(["compatible", "conditional", "incompatible", ""]),
                           rng.random() < 0.3) for _ in range(25)]
    same_spot = [ZonePoint(f"SAME-SPOT-MACHINE-{i:03d}", 0.01, -0.02, "conditional")
                 for i in range(40)]
    hostile = [ZonePoint(name, 0.005 * i, 0.01, "incompatible") for i, name in enumerate(HOSTILE)]
    current = [Series("motor at rated supply", [(15.0 * k, 600 - 0.054 * k * k) for k in range(101)]),
               Series("motor at site supply", [(15.0 * k, 560 - 0.050 * k * k) for k in range(101)])]
    return [
        zone_diagram_canvas(crowded_points(), iec_polygons()),
        zone_diagram_canvas(scattered, iec_polygons()),
        zone_diagram_canvas(same_spot, iec_polygons()),
        zone_diagram_canvas(hostile, iec_polygons(), title=HOSTILE[0]),
        curves_chart_canvas(torque_series(), x_label="speed", x_unit="rpm", y_label="torque",
                            y_unit="% of rated", markers=torque_markers()),
        curves_chart_canvas(current, x_label="speed", x_unit="rpm", y_label="current", y_unit="A",
                            markers=[PointMarker("locked rotor", 0.0, 600.0),
                                     PointMarker("locked rotor at site supply", 0.0, 560.0),
                                     PointMarker("operating point", 1470.0, 62.0)]),
        derating_waterfall_canvas(waterfall_steps()),
        derating_waterfall_canvas([WaterfallStep("rated output " + "W" * 40, 7.5),
                                   WaterfallStep(HOSTILE[1], 7.1, 0.947),
                                   WaterfallStep("available output", 7.1)], unit="kVA"),
    ]


def run(args: list[str], cwd: Path) -> subprocess.CompletedProcess[str]:
    assert CHROMIUM is not None
    with tempfile.TemporaryDirectory(prefix="chromium-profile-") as profile:
        return subprocess.run([CHROMIUM, *FLAGS, f"--user-data-dir={profile}", *args], cwd=cwd,
                              capture_output=True, text=True, timeout=120, check=True)


def page(canvases: list[Canvas], script: str) -> str:
    body = "\n".join(f"<div>{c.svg()}</div>" for c in canvases)
    return ('<!DOCTYPE html><html lang="en"><head><meta charset="utf-8"><title>charts</title>'
            '<style>body{margin:8px}div{margin:0 0 16px}</style></head><body>'
            f'{body}<pre id="measured"></pre>{script}</body></html>')


def overlap(a: Rect, b: Rect, eps: float = 0.01) -> bool:
    return not (a[2] <= b[0] + eps or b[2] <= a[0] + eps or a[3] <= b[1] + eps or b[3] <= a[1] + eps)


@dataclass(frozen=True)
class Measured:
    """One chart as drawn: its size on the page, its viewBox size and each text's box."""

    width: float
    height: float
    view: tuple[float, float]
    texts: list[tuple[str, Rect]]

    def in_view_units(self) -> list[tuple[str, Rect]]:
        sx, sy = self.view[0] / self.width, self.view[1] / self.height
        return [(text, (x0 * sx, y0 * sy, x1 * sx, y1 * sy)) for text, (x0, y0, x1, y1) in self.texts]


Rendered = tuple[list[Canvas], list[Measured]]


@pytest.fixture(scope="module")
def rendered(tmp_path_factory: pytest.TempPathFactory) -> Rendered:
    canvases = charts()
    folder = tmp_path_factory.mktemp("browser")
    (folder / "charts.html").write_text(page(canvases, MEASURE), encoding="utf-8")
    dom = run(["--dump-dom", (folder / "charts.html").as_uri()], folder).stdout
    found = re.search(r'<pre id="measured">(.*?)</pre>', dom, re.S)
    assert found and found.group(1), "the measuring script wrote nothing"
    measured = [Measured(float(c["width"]), float(c["height"]),
                         (float(c["view"][0]), float(c["view"][1])),
                         [(str(t[0]), (float(t[1]), float(t[2]), float(t[3]), float(t[4])))
                          for t in c["texts"]])
                for c in json.loads(html.unescape(found.group(1)))]
    return canvases, measured


def test_every_chart_and_text_was_measured(rendered: Rendered) -> None:
    canvases, measured = rendered
    assert len(measured) == len(canvases)
    for canvas, chart in zip(canvases, measured):
        assert [t[0] for t in chart.texts] == [html.unescape(esc(item.text)) for item in canvas.texts]
        assert chart.view == pytest.approx((canvas.width, canvas.height), abs=1e-3)


def test_no_text_overlaps_another_or_leaves_its_chart(rendered: Rendered) -> None:
    canvases, measured = rendered
    for canvas, chart in zip(canvases, measured):
        boxes = chart.in_view_units()
        view_w, view_h = chart.view
        for name, (x0, y0, x1, y1) in boxes:
            assert x1 > x0 and y1 > y0, name  # really drawn
            assert x0 >= -0.01 and x1 <= view_w + 0.01 and y0 >= -0.01 and y1 <= view_h + 0.01, (
                canvas.title, name, (x0, y0, x1, y1), (view_w, view_h))
        for i, (name_a, a) in enumerate(boxes):
            for name_b, b in boxes[i + 1:]:
                assert not overlap(a, b), (canvas.title, name_a, a, name_b, b)


def test_rendered_text_lies_inside_the_estimated_box(rendered: Rendered) -> None:
    canvases, measured = rendered
    for canvas, chart in zip(canvases, measured):
        for item, (_, (x0, y0, x1, y1)) in zip(canvas.texts, chart.in_view_units()):
            box = item.box
            assert (box.x0 - 0.5 <= x0 and x1 <= box.x1 + 0.5
                    and box.y0 - 0.5 <= y0 and y1 <= box.y1 + 0.5), (item.text, box, (x0, y0, x1, y1))


def test_page_prints_to_pdf_and_png(tmp_path: Path) -> None:
    canvases = charts()
    (tmp_path / "charts.html").write_text(page(canvases, ""), encoding="utf-8")
    uri = (tmp_path / "charts.html").as_uri()
    run(["--print-to-pdf=" + str(tmp_path / "charts.pdf"), "--no-pdf-header-footer", uri], tmp_path)
    run(["--screenshot=" + str(tmp_path / "charts.png"), "--window-size=900,1400", uri], tmp_path)
    pdf = (tmp_path / "charts.pdf").read_bytes()
    assert pdf.startswith(b"%PDF") and len(pdf) > 5000
    png = (tmp_path / "charts.png").read_bytes()
    assert png.startswith(b"\x89PNG\r\n\x1a\n")
    pixels = zlib.decompress(b"".join(png_chunks(png, b"IDAT")))
    assert len(set(pixels)) > 16, "the screenshot is blank"


def png_chunks(data: bytes, kind: bytes) -> list[bytes]:
    """The payloads of every chunk of one kind in a PNG file."""
    chunks: list[bytes] = []
    pos = 8
    while pos < len(data):
        length = int.from_bytes(data[pos:pos + 4], "big")
        if data[pos + 4:pos + 8] == kind:
            chunks.append(data[pos + 8:pos + 8 + length])
        pos += 12 + length
    return chunks
