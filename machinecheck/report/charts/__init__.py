"""Charts as inline SVG strings: renderers only, from numbers the engine already computed.

No scripts, no external resources, escaped text, a viewBox for scaling, white background for
print. Labels never overlap one another and stay inside their drawing. Each chart also has a
``*_canvas`` form returning the layout with every text's estimated box, for checks.
"""

from .curves import PointMarker, Series, curves_chart, curves_chart_canvas
from .waterfall import WaterfallStep, derating_waterfall, derating_waterfall_canvas
from .zones import ZonePoint, ZonePolygon, zone_diagram, zone_diagram_canvas

__all__ = ["PointMarker", "Series", "WaterfallStep", "ZonePoint", "ZonePolygon", "curves_chart",
           "curves_chart_canvas", "derating_waterfall", "derating_waterfall_canvas", "zone_diagram",
           "zone_diagram_canvas"]
