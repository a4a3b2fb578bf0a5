"""Deterministic label placement: labels never overlap one another and stay inside the drawing.

Points closer together than their markers are wide form one group, labelled by one block that
lists every name, one a line. Each label (or block) is tried, in order, at candidate spots
around its point (right, left, the diagonals, above, below). When all of them are taken it
moves out on rings of growing radius with a leader line back to its point. When the rings are
full too it joins a stack column beside the plot (the drawing grows to hold it), again with a
leader. Nothing is hidden or merged into a count.
"""

from __future__ import annotations

import math
from collections.abc import Sequence
from dataclasses import dataclass

from ._svg import ASCENT_EM, DESCENT_EM, Box, text_width

#: Order of the candidate spots next to a point.
NEAR_ORDER = ("right", "left", "above-right", "below-right", "above-left", "below-left", "above",
              "below")
_RINGS = 12
_ANGLE_STEP_DEG = 11.25
#: Extra space between the lines of one block [em].
_LINE_GAP_EM = 0.1


@dataclass(frozen=True)
class Anchor:
    """A point (drawing units) whose label lines must be placed together."""

    x: float
    y: float
    lines: tuple[str, ...]
    clearance: float = 7.0
    order: tuple[str, ...] = NEAR_ORDER


@dataclass(frozen=True)
class Placement:
    """Where a label went: the baseline of each line, its box, an optional leader line.

    A label left of its point is set flush right (text-anchor end at ``box.x1``) so that it
    hugs the point whatever the font; any other flush left at ``box.x0``.
    """

    anchor: Anchor
    baselines: tuple[float, ...]
    box: Box
    leader: tuple[float, float, float, float] | None

    @property
    def flush_right(self) -> bool:
        return self.box.x1 <= self.anchor.x

    @property
    def x(self) -> float:
        """The x of the text elements (with :attr:`text_anchor`)."""
        return self.box.x1 if self.flush_right else self.box.x0

    @property
    def text_anchor(self) -> str:
        return "end" if self.flush_right else "start"


def group_points(points: Sequence[tuple[float, float, str, float]], reach: float) -> list[Anchor]:
    """Anchors for labelled points (x, y, text, clearance): points within ``reach`` of another
    point of a group join it (single linkage); a group is anchored at its mean position and
    lists its texts in order of text. Groups come in order of position; the result does not
    depend on the order of ``points``."""
    ordered = sorted(points, key=lambda p: (p[1], p[0], p[2]))
    groups: list[list[tuple[float, float, str, float]]] = []
    for p in ordered:
        joined = [g for g in groups if any(math.hypot(p[0] - q[0], p[1] - q[1]) <= reach for q in g)]
        merged = [p] + [q for g in joined for q in g]
        groups = [g for g in groups if g not in joined] + [merged]
    anchors = []
    for g in groups:
        x = sum(p[0] for p in g) / len(g)
        y = sum(p[1] for p in g) / len(g)
        texts = tuple(sorted(p[2] for p in g))
        anchors.append(Anchor(x, y, texts, clearance=max(p[3] for p in g) + (reach if len(g) > 1
                                                                              else 0.0)))
    return sorted(anchors, key=lambda a: (a.y, a.x, a.lines))


def _near_box(name: str, a: Anchor, w: float, h: float) -> Box:
    c, half = a.clearance, a.clearance * 0.5
    left, top = {
        "right": (a.x + c, a.y - h / 2),
        "left": (a.x - c - w, a.y - h / 2),
        "above-right": (a.x + half, a.y - c - h),
        "below-right": (a.x + half, a.y + c),
        "above-left": (a.x - half - w, a.y - c - h),
        "below-left": (a.x - half - w, a.y + c),
        "above": (a.x - w / 2, a.y - c - h),
        "below": (a.x - w / 2, a.y + c),
    }[name]
    return Box(left, top, left + w, top + h)


def _ring_boxes(a: Anchor, w: float, h: float, ring: int, line_h: float) -> list[Box]:
    radius = a.clearance + ring * (line_h + 3.0)
    boxes = []
    for k in range(int(180 / _ANGLE_STEP_DEG) * 2):
        step = (k + 1) // 2 * (1 if k % 2 else -1)  # 0, +1, -1, +2, -2 ... (right side first)
        angle = math.radians(step * _ANGLE_STEP_DEG)
        cos, sin = math.cos(angle), math.sin(angle)
        px, py = a.x + radius * cos, a.y - radius * sin
        left = px if cos > 0.38 else px - w if cos < -0.38 else px - w / 2
        top = py - h if sin > 0.38 else py if sin < -0.38 else py - h / 2
        boxes.append(Box(left, top, left + w, top + h))
    return boxes


def place_labels(anchors: Sequence[Anchor], *, font_size: float, area: Box,
                 obstacles: Sequence[Box] = (), soft: Sequence[tuple[float, float]] = (),
                 stack_x: float, stack_top: float, gap: float = 2.0) -> list[Placement]:
    """Place every anchor's label; results in the order of ``anchors``.

    Parameters
    ----------
    anchors : points with their label lines, placed in this order
    font_size : font size of the labels [px]
    area : labels next to their points stay inside this box
    obstacles : boxes no label may cover (point markers, fixed text); leaders may cross them
    soft : points a label should rather not cover (curve samples, outlines)
    stack_x, stack_top : left edge and top of the stack column for labels that find no room;
        that column may run past ``area``: the caller sizes the drawing from the boxes
    gap : least clearance between two labels [px]
    """
    line_h = (ASCENT_EM + DESCENT_EM) * font_size
    step_h = line_h + _LINE_GAP_EM * font_size
    taken: list[Box] = []
    placements: list[Placement] = []
    stack_next = stack_top

    def free(box: Box) -> bool:
        return (box.inside(area) and not any(box.overlaps(t, gap) for t in taken)
                and not any(box.overlaps(o, 1.0) for o in obstacles))

    def hits(box: Box) -> int:
        return sum(1 for x, y in soft if box.contains_point(x, y))

    def leader_clear(a: Anchor, box: Box) -> bool:
        x1, y1 = box.nearest_point(a.x, a.y)
        return not any(t.crossed_by(a.x, a.y, x1, y1) for t in taken)

    for a in anchors:
        w = max(text_width(line, font_size) for line in a.lines)
        h = line_h + (len(a.lines) - 1) * step_h
        chosen: Box | None = None
        leader = False
        near = [b for b in (_near_box(n, a, w, h) for n in a.order) if free(b)]
        if near:
            chosen = min(near, key=hits)  # min keeps the first of equals: deterministic
        else:
            for ring in range(1, _RINGS + 1):
                ring_ok = [b for b in _ring_boxes(a, w, h, ring, line_h)
                           if free(b) and leader_clear(a, b)]
                if ring_ok:
                    chosen, leader = min(ring_ok, key=hits), True
                    break
        if chosen is None:  # the stack column, below anything already there
            chosen, leader = Box(stack_x, stack_next, stack_x + w, stack_next + h), True
            while any(chosen.overlaps(o, gap) for o in obstacles):
                stack_next += 1.0
                chosen = Box(stack_x, stack_next, stack_x + w, stack_next + h)
            stack_next += h + gap
        line = None
        if leader:
            x1, y1 = chosen.nearest_point(a.x, a.y)
            line = (a.x, a.y, x1, y1)
        taken.append(chosen)
        first = chosen.y0 + ASCENT_EM * font_size
        baselines = tuple(first + i * step_h for i in range(len(a.lines)))
        placements.append(Placement(a, baselines, chosen, line))
    return placements
