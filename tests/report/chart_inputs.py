"""Crowded, hostile and far-out chart inputs shared by the SVG tests (invented machine names)."""

from __future__ import annotations

from machinecheck.physics import tolerance
from machinecheck.report.charts import (
    PointMarker,
    Series,
    WaterfallStep,
    ZonePoint,
    ZonePolygon,
)

HOSTILE = ["<script>alert(1)</script>", "A & B \"quoted\" 'single'", "]]><!--", "tab\there\x07bell"]

VERDICTS = ("compatible", "conditional", "incompatible")


def iec_polygons() -> list[ZonePolygon]:
    """IEC 60034-1 zones B then A, from the project's own zone table."""
    return [ZonePolygon("zone B", tolerance.iec_zone_outline("B")),
            ZonePolygon("zone A", tolerance.iec_zone_outline("A"))]


def crowded_points() -> list[ZonePoint]:
    """12 machines with long names within 0.6 % of one spot, plus points far off the chart."""
    points = [ZonePoint(f"CIRCULATION-PUMP-{i:02d}-NORTH-WING", 0.012 + 0.0005 * (i % 4),
                        -0.031 + 0.0005 * (i // 4), VERDICTS[i % 3], hollow=i % 5 == 0)
              for i in range(12)]
    points += [ZonePoint("FAR-HIGH", 0.0, 0.35, "incompatible"),
               ZonePoint("FAR-LOW-LEFT", -0.25, -0.40, "incompatible"),
               ZonePoint("FAR-RIGHT", 0.20, 0.01, "conditional"),
               ZonePoint("AT-RATED", 0.0, 0.0, "compatible")]
    points += [ZonePoint(name, 0.012, -0.03, "conditional") for name in HOSTILE]
    return points


def waterfall_steps() -> list[WaterfallStep]:
    return [WaterfallStep("rated output", 37.0),
            WaterfallStep("altitude 2500 m", 35.15, 0.95),
            WaterfallStep("ambient 50 °C", 31.635, 0.9),
            WaterfallStep("voltage unbalance 2 % <b>&amp;</b>", 30.05, 0.95),
            WaterfallStep("cold-ambient allowance", 31.0, 1.0316),
            WaterfallStep("available output", 31.0)]


def torque_series() -> list[Series]:
    """Made-up torque-speed shapes (drawing test data, not physics)."""
    speeds = [15.0 * k for k in range(101)]

    def shape(n: float, scale: float) -> float:
        s = 1 - n / 1500
        return scale * 200 * 0.2 * s / (s * s + 0.04)

    return [Series("motor at rated supply", [(n, shape(n, 1.0)) for n in speeds]),
            Series("motor at site supply", [(n, shape(n, 0.81)) for n in speeds]),
            Series("load <pump> & \"fan\"", [(n, 80 * (n / 1470) ** 2) for n in speeds]),
            Series("gap", [(0.0, 10.0), (500.0, 20.0), (float("nan"), 0.0), (900.0, 30.0),
                           (1200.0, 35.0)])]


def torque_markers() -> list[PointMarker]:
    return [PointMarker("operating point", 1470.0, 80.0), PointMarker("breakdown", 1200.0, 100.0),
            PointMarker("breakdown at site supply", 1200.0, 81.0),
            PointMarker("operating point at site supply", 1462.0, 79.0)]
