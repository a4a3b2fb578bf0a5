"""Drawing primitives shared by the charts: escaping, number format, text boxes, scales, ticks.

Every text element is recorded with a conservative estimate of its box, so the layout can keep
labels apart and inside the drawing without a font engine, and tests can check it.
"""

from __future__ import annotations

import html
import math
import unicodedata
from dataclasses import dataclass, field

#: Fonts asked for; widths below are estimated to cover the widest of them.
FONT_FAMILY = "DejaVu Sans, Liberation Sans, Arial, Helvetica, sans-serif"
#: Box of a line of text, in em above and below the baseline (covers common sans ascents/descents).
ASCENT_EM = 1.1
DESCENT_EM = 0.3
_BIDI_CONTROLS = set("\u202a\u202b\u202c\u202d\u202e\u2066\u2067\u2068\u2069\u200e\u200f")
_WIDE = set("MWmw@%")
_NARROW = set("iljI.,:;!|'`()[]{} frt")


def _clean(ch: str) -> str:
    if ch in _BIDI_CONTROLS or ch in "\ufffe\uffff":
        return " "
    category = unicodedata.category(ch)
    if category in ("Cc", "Cs"):
        return " "
    return ch


def esc(text: str) -> str:
    """Text safe for XML content and attribute values: control characters made spaces, markup
    characters and both quotes escaped."""
    return html.escape("".join(_clean(ch) for ch in str(text)), quote=True)


def fmt(value: float) -> str:
    """A coordinate with one decimal, without a minus sign on zero (stable output)."""
    text = f"{value:.1f}"
    return "0.0" if text == "-0.0" else text


def char_em(ch: str) -> float:
    """Conservative advance width of one character [em] (at least the widest common sans font)."""
    if ch in _WIDE:
        return 1.0
    if ch in _NARROW:
        return 0.45
    if ch.isascii():
        if ch.isupper():
            return 0.8
        return 0.68
    if unicodedata.east_asian_width(ch) in ("W", "F"):
        return 1.1
    return 0.9


def text_width(text: str, font_size: float) -> float:
    """Conservative width of ``text`` set at ``font_size`` [px]."""
    return font_size * sum(char_em(ch) for ch in text)


@dataclass(frozen=True)
class Box:
    """An axis-aligned rectangle in drawing units; y grows downwards."""

    x0: float
    y0: float
    x1: float
    y1: float

    def overlaps(self, other: Box, gap: float = 0.0) -> bool:
        """True when the boxes come closer than ``gap``."""
        return not (self.x1 + gap <= other.x0 or other.x1 + gap <= self.x0
                    or self.y1 + gap <= other.y0 or other.y1 + gap <= self.y0)

    def inside(self, other: Box) -> bool:
        return (other.x0 <= self.x0 and self.x1 <= other.x1
                and other.y0 <= self.y0 and self.y1 <= other.y1)

    def contains_point(self, x: float, y: float) -> bool:
        return self.x0 <= x <= self.x1 and self.y0 <= y <= self.y1

    def nearest_point(self, x: float, y: float) -> tuple[float, float]:
        return min(max(x, self.x0), self.x1), min(max(y, self.y0), self.y1)

    def crossed_by(self, x0: float, y0: float, x1: float, y1: float) -> bool:
        """True when the segment (x0, y0)-(x1, y1) passes through the box (sampled finely)."""
        steps = max(2, int(math.hypot(x1 - x0, y1 - y0) / 2.0))
        return any(self.contains_point(x0 + (x1 - x0) * i / steps, y0 + (y1 - y0) * i / steps)
                   for i in range(steps + 1))


def text_box(x: float, y: float, text: str, font_size: float, anchor: str = "start") -> Box:
    """Estimated box of a text element at (x, baseline y)."""
    width = text_width(text, font_size)
    left = {"start": x, "middle": x - width / 2, "end": x - width}[anchor]
    return Box(left, y - ASCENT_EM * font_size, left + width, y + DESCENT_EM * font_size)


@dataclass(frozen=True)
class TextItem:
    """One text element as laid out: its content and estimated box."""

    text: str
    box: Box


@dataclass
class Canvas:
    """An SVG drawing being built: elements in order, and every text's estimated box."""

    title: str
    elements: list[str] = field(default_factory=list)
    texts: list[TextItem] = field(default_factory=list)
    width: float = 0.0
    height: float = 0.0

    def add(self, element: str) -> None:
        self.elements.append(element)

    def text(self, x: float, y: float, content: str, *, size: float, anchor: str = "start",
             fill: str = "#111") -> Box:
        """Add a text element at (x, baseline y)."""
        box = text_box(x, y, content, size, anchor)
        attrs = (f'x="{fmt(x)}" y="{fmt(y)}" font-size="{size:g}" fill="{fill}"'
                 + (f' text-anchor="{anchor}"' if anchor != "start" else ""))
        self.elements.append(f"<text {attrs}>{esc(content)}</text>")
        self.texts.append(TextItem(content, box))
        return box

    def fit(self, min_width: float, min_height: float, margin: float = 8.0) -> None:
        """Size the drawing to hold every text with a margin, in whole units, never smaller than
        the minimum given; a text reaching past the left or top edge shifts the whole drawing."""
        dx = max([0.0] + [margin - t.box.x0 for t in self.texts])
        dy = max([0.0] + [margin - t.box.y0 for t in self.texts])
        dx, dy = float(math.ceil(dx)), float(math.ceil(dy))
        if dx or dy:
            self.elements = [f'<g transform="translate({fmt(dx)} {fmt(dy)})">', *self.elements,
                             "</g>"]
            self.texts = [TextItem(t.text, Box(t.box.x0 + dx, t.box.y0 + dy, t.box.x1 + dx,
                                               t.box.y1 + dy)) for t in self.texts]
        self.width = float(math.ceil(max([min_width + dx] + [t.box.x1 + margin for t in self.texts])))
        self.height = float(math.ceil(max([min_height + dy] + [t.box.y1 + margin for t in self.texts])))

    def svg(self) -> str:
        """The finished inline SVG element."""
        w, h = fmt(self.width), fmt(self.height)
        head = (f'<svg xmlns="http://www.w3.org/2000/svg" viewBox="0 0 {w} {h}" width="{w}" '
                f'height="{h}" role="img" aria-label="{esc(self.title)}" '
                f'font-family="{FONT_FAMILY}">'
                f"<title>{esc(self.title)}</title>"
                f'<rect x="0" y="0" width="{w}" height="{h}" fill="#fff"/>')
        return head + "".join(self.elements) + "</svg>"


@dataclass(frozen=True)
class Scale:
    """Linear map from data values to drawing coordinates."""

    lo: float
    hi: float
    start: float
    end: float

    def __call__(self, value: float) -> float:
        return self.start + (value - self.lo) / (self.hi - self.lo) * (self.end - self.start)


def nice_ticks(lo: float, hi: float, target: int = 6) -> list[float]:
    """Round tick values (1, 2, 2.5 or 5 times a power of ten) covering [lo, hi]."""
    if not (math.isfinite(lo) and math.isfinite(hi)):
        raise ValueError(f"axis range must be finite, got {lo!r} to {hi!r}")
    if hi - lo <= 1e-6 * max(1.0, abs(lo), abs(hi)):  # one value, or a spread below display
        hi = lo + max(1.0, 0.1 * abs(lo))
    raw = (hi - lo) / max(1, target)
    power = 10.0 ** math.floor(math.log10(raw))
    step = next(m * power for m in (1.0, 2.0, 2.5, 5.0, 10.0) if m * power >= raw)
    first = math.floor(lo / step + 1e-9)
    last = math.ceil(hi / step - 1e-9)
    return [round(i * step, 12) + 0.0 for i in range(first, last + 1)]


def fitting_ticks(lo: float, hi: float, length: float, font_size: float,
                  target: int = 6) -> list[float]:
    """Nice ticks over [lo, hi], as many as up to ``target`` whose values fit side by side
    along an axis ``length`` long [px]."""
    for count in range(target, 0, -1):
        ticks = nice_ticks(lo, hi, count)
        widest = max(text_width(tick_text(t, ticks[1] - ticks[0]), font_size) for t in ticks)
        if widest + 6 <= length / (len(ticks) - 1):
            break
    return ticks


def tick_text(value: float, step: float) -> str:
    """A tick value with as many decimals as the step needs."""
    decimals = max(0, -math.floor(math.log10(step) + 1e-9)) if step < 1 else 0
    if step < 1 and abs(round(step * 10 ** decimals) - step * 10 ** decimals) > 1e-6:
        decimals += 1
    text = f"{value:.{decimals}f}"
    return text[1:] if text.startswith("-") and float(text) == 0 else text
