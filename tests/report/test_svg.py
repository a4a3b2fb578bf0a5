"""SVG charts: structure, escaping, off-chart markers, determinism and the label layout.

Drawing tests: no outside truth is checked here (the zone outlines come from physics/tolerance.py).
"""

from __future__ import annotations

import math
import xml.etree.ElementTree as ET

import pytest
from chart_inputs import (
    HOSTILE,
    crowded_points,
    iec_polygons,
    torque_markers,
    torque_series,
    waterfall_steps,
)
from hypothesis import given, settings
from hypothesis import strategies as st

from machinecheck.physics import tolerance
from machinecheck.report.charts import (
    PointMarker,
    Series,
    WaterfallStep,
    ZonePoint,
    ZonePolygon,
    curves_chart,
    curves_chart_canvas,
    derating_waterfall,
    derating_waterfall_canvas,
    zone_diagram,
    zone_diagram_canvas,
)
from machinecheck.report.charts._svg import Box, Canvas, esc, text_width

NS = "{http://www.w3.org/2000/svg}"


def parse(svg: str) -> ET.Element:
    root = ET.fromstring(svg)
    assert root.tag == f"{NS}svg"
    return root


def title_of(el: ET.Element) -> str:
    """The text of an element's <title> child ("" when it has none)."""
    title = el.find(f"{NS}title")
    return "" if title is None or title.text is None else title.text


def num(el: ET.Element, name: str) -> float:
    return float(el.get(name, "nan"))


def texts(root: ET.Element) -> list[str]:
    return ["".join(t.itertext()) for t in root.iter(f"{NS}text")]


def cleaned(name: str) -> str:
    """A name as drawn: control characters become spaces."""
    return "".join(" " if ord(ch) < 32 else ch for ch in name)


def assert_layout_clean(canvas: Canvas) -> None:
    """No two estimated text boxes overlap; every box lies inside the viewBox."""
    frame = Box(0.0, 0.0, canvas.width, canvas.height)
    boxes = [t.box for t in canvas.texts]
    for i, a in enumerate(boxes):
        assert a.inside(frame), (canvas.texts[i].text, a, frame)
        for j in range(i + 1, len(boxes)):
            assert not a.overlaps(boxes[j]), (canvas.texts[i].text, canvas.texts[j].text)


def assert_self_contained(root: ET.Element) -> None:
    tags = {el.tag.removeprefix(NS) for el in root.iter()}
    assert "script" not in tags and "foreignObject" not in tags and "image" not in tags
    for el in root.iter():
        for name, value in el.attrib.items():
            assert "href" not in name and not name.startswith("on"), (el.tag, name)
            assert "url(" not in value, (el.tag, name, value)
    assert root.get("viewBox", "").startswith("0 0 ")


# --- waterfall ---------------------------------------------------------------------------------

def test_waterfall_has_a_bar_name_and_value_per_step() -> None:
    steps = waterfall_steps()
    root = parse(derating_waterfall(steps, unit="kW"))
    assert_self_contained(root)
    bars = [r for r in root.iter(f"{NS}rect") if title_of(r)]
    assert [title_of(r) for r in bars] == [s.label for s in steps]
    shown = texts(root)
    for s in steps:
        assert s.label in shown
    assert "37.0 kW" in shown and "31.0 kW" in shown
    assert "× 0.950 → 35.1 kW" in shown and "× 1.032 → 31.0 kW" in shown


def test_waterfall_bars_are_to_scale_and_floating_between_steps() -> None:
    steps = [WaterfallStep("rated output", 40.0), WaterfallStep("altitude", 30.0, 0.75),
             WaterfallStep("available output", 30.0)]
    root = parse(derating_waterfall(steps))
    rated, drop, available = [r for r in root.iter(f"{NS}rect") if title_of(r)]
    width = {name: num(r, "width") for name, r in
             (("rated", rated), ("drop", drop), ("available", available))}
    assert width["available"] / width["rated"] == pytest.approx(0.75, abs=0.01)
    assert width["drop"] / width["rated"] == pytest.approx(0.25, abs=0.01)
    # the drop hangs from the end of the available bar to the end of the rated bar
    assert num(drop, "x") == pytest.approx(
        num(available, "x") + width["available"], abs=0.2)


@pytest.mark.parametrize("steps", [[WaterfallStep("rated output", 37.0)],
                                   [WaterfallStep("rated", 37.0), WaterfallStep("x", math.nan)]])
def test_waterfall_refuses_what_it_cannot_draw(steps: list[WaterfallStep]) -> None:
    with pytest.raises(ValueError):
        derating_waterfall(steps)


def test_waterfall_layout_with_long_names() -> None:
    steps = waterfall_steps() + [WaterfallStep("W" * 80, 30.0, 0.97)]
    assert_layout_clean(derating_waterfall_canvas(steps))


# --- curves ------------------------------------------------------------------------------------

def test_curves_have_one_line_per_series_a_legend_and_every_marker_label() -> None:
    series, markers = torque_series(), torque_markers()
    root = parse(curves_chart(series, x_label="speed", x_unit="rpm", y_label="torque",
                              y_unit="% of rated", markers=markers))
    assert_self_contained(root)
    lines = list(root.iter(f"{NS}polyline"))
    # the "gap" series is broken at its non-finite point: two runs
    assert [title_of(ln) for ln in lines] == [s.name for s in series[:3]] + ["gap"] * 2
    shown = texts(root)
    for s in series:
        assert shown.count(s.name) == 1  # once, in the legend
    for m in markers:
        assert shown.count(m.label) == 1
    assert "speed, rpm" in shown and "torque, % of rated" in shown
    assert len(list(root.iter(f"{NS}circle"))) == len(markers)


def test_curves_stay_inside_the_plot_and_axes_cover_the_data() -> None:
    canvas = curves_chart_canvas(torque_series(), x_label="speed", x_unit="rpm", y_label="torque",
                                 y_unit="% of rated", markers=torque_markers())
    root = parse(canvas.svg())
    frame = next(r for r in root.iter(f"{NS}rect") if r.get("stroke") == "#444")
    x0, y0 = num(frame, "x"), num(frame, "y")
    x1, y1 = x0 + num(frame, "width"), y0 + num(frame, "height")
    for line in root.iter(f"{NS}polyline"):
        for pair in line.get("points", "").split():
            x, y = map(float, pair.split(","))
            assert x0 - 0.05 <= x <= x1 + 0.05 and y0 - 0.05 <= y <= y1 + 0.05
    assert_layout_clean(canvas)


def test_curves_name_an_empty_series_instead_of_dropping_it() -> None:
    root = parse(curves_chart([Series("site supply", [(math.nan, 1.0)])], x_label="speed",
                              x_unit="rpm", y_label="current", y_unit="A"))
    assert "site supply (no values)" in texts(root)
    assert list(root.iter(f"{NS}polyline")) == []


# --- zone diagram ------------------------------------------------------------------------------

def test_zone_diagram_names_every_machine_once_and_never_summarises() -> None:
    points = crowded_points()
    root = parse(zone_diagram(points, iec_polygons()))
    assert_self_contained(root)
    shown = texts(root)
    for p in points:
        name = cleaned(p.label)
        assert sum(1 for t in shown if t == name or t.startswith(name + " (f ")) == 1, p.label
    assert not any(t.startswith("+") and t[1:].isdigit() for t in shown)
    assert "zone A" in shown and "zone B" in shown
    # one marker per point, each titled with its machine
    titled = [title_of(el) for el in root.iter()
              if el.tag in (f"{NS}circle", f"{NS}rect", f"{NS}polygon")
              and title_of(el)]
    for p in points:
        assert sum(1 for t in titled if t.startswith(cleaned(p.label) + ": frequency")) == 1, p.label


def test_zone_polygons_are_drawn_from_the_outlines_given() -> None:
    polygons = iec_polygons()
    root = parse(zone_diagram([ZonePoint("AT-RATED", 0.0, 0.0, "compatible")], polygons))
    drawn = [el for el in root.iter(f"{NS}polygon") if title_of(el)
             and title_of(el) in ("zone A", "zone B")]
    assert [title_of(el) for el in drawn] == ["zone B", "zone A"]
    for el, polygon in zip(drawn, polygons):
        assert len(el.get("points", "").split()) == len(polygon.vertices)
    # the rated point sits at the middle of the default window (+-8 % f, +-16 % V)
    dot = next(c for c in root.iter(f"{NS}circle") if title_of(c))
    frame = next(r for r in root.iter(f"{NS}rect") if r.get("stroke") == "#444")
    mid_x = num(frame, "x") + num(frame, "width") / 2
    mid_y = num(frame, "y") + num(frame, "height") / 2
    assert num(dot, "cx") == pytest.approx(mid_x, abs=0.1)
    assert num(dot, "cy") == pytest.approx(mid_y, abs=0.1)


def test_points_off_the_chart_get_an_edge_arrow_and_their_values() -> None:
    points = [ZonePoint("FAR-HIGH", 0.0, 0.35, "incompatible"),
              ZonePoint("FAR-LEFT", -0.25, 0.0, "conditional")]
    root = parse(zone_diagram(points, iec_polygons()))
    shown = texts(root)
    assert "FAR-HIGH (f +0.0 %, V +35.0 %)" in shown
    assert "FAR-LEFT (f -25.0 %, V +0.0 %)" in shown
    frame = next(r for r in root.iter(f"{NS}rect") if r.get("stroke") == "#444")
    top, left = num(frame, "y"), num(frame, "x")
    arrows = {title_of(el).split(":")[0]: el for el in root.iter(f"{NS}polygon")
              if title_of(el) and "off the chart" in title_of(el)}
    assert set(arrows) == {"FAR-HIGH", "FAR-LEFT"}
    tip_high = tuple(map(float, arrows["FAR-HIGH"].get("points", "").split()[0].split(",")))
    tip_left = tuple(map(float, arrows["FAR-LEFT"].get("points", "").split()[0].split(",")))
    assert tip_high[1] == pytest.approx(top)  # on the top edge, pointing up
    assert tip_left[0] == pytest.approx(left)
    assert "arrow: off the chart, values given" in shown


def test_crowded_zone_diagram_layout_is_clean() -> None:
    assert_layout_clean(zone_diagram_canvas(crowded_points(), iec_polygons()))


def test_many_points_at_one_spot_all_get_labels_inside_the_drawing() -> None:
    points = [ZonePoint(f"SAME-SPOT-MACHINE-{i:03d}", 0.01, -0.02, "conditional") for i in range(60)]
    canvas = zone_diagram_canvas(points, iec_polygons())
    assert_layout_clean(canvas)
    shown = [t.text for t in canvas.texts]
    assert all(p.label in shown for p in points)


def test_non_finite_points_are_refused_not_dropped() -> None:
    with pytest.raises(ValueError, match="PUMP-1"):
        zone_diagram([ZonePoint("PUMP-1", math.nan, 0.0)], iec_polygons())


# --- escaping, determinism, estimates ----------------------------------------------------------

@pytest.mark.parametrize("name", HOSTILE)
def test_hostile_names_are_escaped_in_every_chart(name: str) -> None:
    charts = [
        zone_diagram([ZonePoint(name, 0.01, 0.01, "compatible")], iec_polygons(), title=name),
        curves_chart([Series(name, [(0.0, 1.0), (1.0, 2.0)])], x_label=name, x_unit="rpm",
                     y_label="torque", y_unit="N m", title=name),
        derating_waterfall([WaterfallStep(name, 10.0), WaterfallStep("available", 9.0)],
                           title=name),
    ]
    for svg in charts:
        root = parse(svg)  # would raise on broken markup
        assert_self_contained(root)
        assert root.get("aria-label") == cleaned(name)
        assert any(cleaned(name) in t for t in texts(root))


def test_escape_turns_controls_and_bidi_overrides_into_spaces() -> None:
    assert esc("a\x00b\u202ec<&>\"'") == "a b c&lt;&amp;&gt;&quot;&#x27;"


def test_same_input_same_svg_whatever_the_order_of_points() -> None:
    points = crowded_points()
    first = zone_diagram(points, iec_polygons())
    assert zone_diagram(points, iec_polygons()) == first
    assert zone_diagram(list(reversed(points)), iec_polygons()) == first
    args = dict(x_label="speed", x_unit="rpm", y_label="torque", y_unit="% of rated")
    assert (curves_chart(torque_series(), markers=torque_markers(), **args)
            == curves_chart(torque_series(), markers=torque_markers(), **args))
    assert derating_waterfall(waterfall_steps()) == derating_waterfall(waterfall_steps())


def test_every_text_element_has_its_estimated_box() -> None:
    canvas = zone_diagram_canvas(crowded_points(), iec_polygons())
    assert len(texts(parse(canvas.svg()))) == len(canvas.texts)


def test_width_estimate_grows_with_characters_and_size() -> None:
    assert text_width("MMMM", 10) > text_width("iiii", 10) > 0
    assert text_width("PUMP-1", 20) == pytest.approx(2 * text_width("PUMP-1", 10))


names = st.text(alphabet=st.characters(min_codepoint=32, max_codepoint=0x24F), min_size=1,
                max_size=28)


@settings(max_examples=40, deadline=None, derandomize=True)
@given(st.lists(st.tuples(names, st.floats(-0.3, 0.3), st.floats(-0.4, 0.4),
                          st.sampled_from(["compatible", "conditional", "incompatible", ""]),
                          st.booleans()), max_size=25))
def test_any_zone_layout_is_clean(rows: list[tuple[str, float, float, str, bool]]) -> None:
    points = [ZonePoint(*row) for row in rows]
    canvas = zone_diagram_canvas(points, iec_polygons())
    assert_layout_clean(canvas)
    assert len(canvas.texts) >= len(points)


values = st.floats(-1e12, 1e12, allow_nan=False)


@settings(max_examples=30, deadline=None, derandomize=True)
@given(st.lists(st.tuples(names, st.lists(st.tuples(values, values), max_size=30)), max_size=6),
       st.lists(st.tuples(names, values, values), max_size=8))
def test_any_curves_layout_is_clean(rows: list[tuple[str, list[tuple[float, float]]]],
                                    marks: list[tuple[str, float, float]]) -> None:
    series = [Series(name, points) for name, points in rows]
    markers = [PointMarker(*m) for m in marks]
    canvas = curves_chart_canvas(series, x_label="speed", x_unit="rpm", y_label="current",
                                 y_unit="A", markers=markers)
    assert_layout_clean(canvas)
    assert len(canvas.texts) >= len(series) + len(markers) + 2


@settings(max_examples=30, deadline=None, derandomize=True)
@given(st.lists(st.tuples(names, st.floats(0, 1e12), st.none() | st.floats(0.5, 1.2)), min_size=2,
                max_size=10))
def test_any_waterfall_layout_is_clean(rows: list[tuple[str, float, float | None]]) -> None:
    canvas = derating_waterfall_canvas([WaterfallStep(*row) for row in rows])
    assert_layout_clean(canvas)


def test_titles_longer_than_the_plot_shift_the_drawing_instead_of_leaving_it() -> None:
    canvas = curves_chart_canvas([Series("motor", [(0.0, 1.0), (1500.0, 2.0)])],
                                 x_label="shaft speed " * 12, x_unit="rpm",
                                 y_label="torque at the coupling " * 6, y_unit="N m")
    assert_layout_clean(canvas)
    assert canvas.svg().count('<g transform="translate(') == 1


def test_points_sharing_a_spot_are_listed_in_one_block_in_name_order() -> None:
    names = ["PUMP-C", "PUMP-A", "FAN-B"]
    points = [ZonePoint(n, 0.01 + 0.0002 * i, -0.02, "conditional") for i, n in enumerate(names)]
    canvas = zone_diagram_canvas(points, iec_polygons())
    block = [t for t in canvas.texts if t.text in names]
    assert [t.text for t in block] == sorted(names)
    # one column, flush left or flush right
    assert len({round(t.box.x0, 6) for t in block}) == 1 or len({round(t.box.x1, 6) for t in block}) == 1
    tops = [t.box.y0 for t in block]
    assert all(b > a for a, b in zip(tops, tops[1:]))
    assert_layout_clean(canvas)


def test_points_apart_get_labels_of_their_own_beside_them() -> None:
    points = [ZonePoint("LEFT-ONE", -0.04, 0.0, "compatible"),
              ZonePoint("RIGHT-ONE", 0.04, 0.0, "compatible")]
    canvas = zone_diagram_canvas(points, iec_polygons())
    root = parse(canvas.svg())
    dots = {title_of(c).split(":")[0]: num(c, "cx")
            for c in root.iter(f"{NS}circle") if title_of(c)}
    for t in canvas.texts:
        if t.text in dots:  # right of its own dot, within a few pixels
            assert 0 < t.box.x0 - dots[t.text] < 12, t.text


def test_any_outline_from_the_zone_table_is_drawn_whole() -> None:
    nema = ZonePolygon("NEMA MG 1 12.44", tolerance.nema_outline())
    root = parse(zone_diagram([ZonePoint("PUMP-1", 0.02, 0.03, "compatible")], [nema]))
    drawn = [el for el in root.iter(f"{NS}polygon") if title_of(el) == "NEMA MG 1 12.44"]
    assert len(drawn) == 1
    assert len(num_pairs(drawn[0])) == len(nema.vertices)
    assert "NEMA MG 1 12.44" in texts(root)


def num_pairs(el: ET.Element) -> list[tuple[float, float]]:
    pairs = [p.split(",") for p in el.get("points", "").split()]
    return [(float(x), float(y)) for x, y in pairs]
