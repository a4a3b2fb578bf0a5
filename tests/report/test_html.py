"""HTML report: parsed back by html.parser; self-contained; one zone diagram per site."""

from html.parser import HTMLParser

from click.testing import CliRunner
from helpers import machine, site

from machinecheck.cli.main import main
from machinecheck.engine.pipeline import assess
from machinecheck.physics import tolerance
from machinecheck.report import html

ENV = {"NO_COLOR": "1", "COLUMNS": "120"}


class Collector(HTMLParser):
    """Counts tags, gathers text and every attribute that could reach the network."""

    def __init__(self):
        super().__init__()
        self.tags: dict[str, int] = {}
        self.text: list[str] = []
        self.links: list[str] = []
        self.open: list[str] = []

    def handle_starttag(self, tag, attrs):
        self.tags[tag] = self.tags.get(tag, 0) + 1
        self.links += [value for name, value in attrs if name in ("src", "href", "xlink:href")]
        if tag not in ("meta", "br", "hr", "img", "input", "link"):
            self.open.append(tag)

    def handle_startendtag(self, tag, attrs):
        self.tags[tag] = self.tags.get(tag, 0) + 1

    def handle_endtag(self, tag):
        assert self.open and self.open[-1] == tag, (tag, self.open[-5:])
        self.open.pop()

    def handle_data(self, data):
        self.text.append(data)


def parse(text):
    collector = Collector()
    collector.feed(text)
    collector.close()
    assert collector.open == [], collector.open  # every element closed, properly nested
    return collector


def test_demo_html_is_self_contained_and_complete(tmp_path):
    out = tmp_path / "report.html"
    result = CliRunner().invoke(main, ["check", "--format", "html", "--explain", "-o", str(out)],
                                env=ENV)
    assert result.exit_code == 1
    page = parse(out.read_text(encoding="utf-8"))
    assert page.tags.get("script", 0) == 0 and page.tags.get("link", 0) == 0
    assert page.links == []
    assert page.tags["svg"] == 4  # one diagram per demo site
    assert page.tags["section"] == 4
    assert page.tags["table"] == 2 + 4  # summary, matrix, one per site
    text = " ".join(page.text)
    assert text.count("Caution") == 2  # at the top and at the end
    for word in ("Fleet matrix", "harrowgate", "zone A", "NEMA MG 1 12.44", "P-101",
                 "synchronous speed n_s"):
        assert word in text


def test_user_text_is_escaped():
    a = assess(machine({"frequency": "50 Hz", "voltage": "400 V", "power": "11 kW",
                        "speed": "1460 rpm"}, id="<b>M&1</b>"),
               site(frequency="50 Hz", voltage="400 V"))
    page = html.render([a])
    assert "<b>M&1</b>" not in page
    assert "&lt;b&gt;M&amp;1&lt;/b&gt;" in page
    parsed = parse(page)
    assert parsed.tags.get("b", 0) == 0


def test_operating_points_follow_the_tolerance_judgement():
    # A 460 V 60 Hz motor on 480 V 60 Hz: +4.3 % voltage, 0 % frequency (rated basis); a
    # 50 Hz motor on 60 Hz is plotted at its flux deviation (re-rated).
    m60 = machine({"frequency": "60 Hz", "voltage": "460 V", "power": "10 hp",
                   "speed": "1760 rpm"}, id="A")
    m50 = machine({"frequency": "50 Hz", "voltage": "400 V", "power": "7.5 kW",
                   "speed": "1460 rpm"}, id="B")
    s = site(frequency="60 Hz", voltage="480 V", standard="NEMA")
    points = html.operating_points([assess(m60, s), assess(m50, s)])
    (a_id, a_df, a_dv, a_rerated, _), (b_id, b_df, b_dv, b_rerated, _) = points
    assert (a_id, a_rerated, a_df) == ("A", False, 0.0)
    assert abs(a_dv - (480 / 460 - 1)) < 1e-9
    assert (b_id, b_rerated, b_df) == ("B", True, 0.0)
    assert abs(b_dv - (480 / 400 / 1.2 - 1)) < 1e-9


def test_zone_outlines_are_the_zones_the_checker_uses():
    # Every corner of the drawn outline is on the boundary of the zone the rule tests
    # (IEC 60034-1 7.3, NEMA MG 1 12.44.1), and just outside it the point is not in the zone.
    order = {"A": 0, "B": 1, None: 2}
    for name in ("A", "B"):
        outline = tolerance.iec_zone_outline(name)
        cx = sum(p[0] for p in outline) / len(outline)
        cy = sum(p[1] for p in outline) / len(outline)
        for df, dv in outline:
            assert order[tolerance.iec_zone(dv, df)] <= order[name]
            out_df, out_dv = df + 0.05 * (df - cx), dv + 0.05 * (dv - cy)
            assert order[tolerance.iec_zone(out_dv, out_df)] > order[name]
    assert sorted(tolerance.iec_zone_outline("A")) == sorted(
        [(-0.02, -0.05), (0.0, -0.05), (0.02, -0.03), (0.02, 0.05), (0.0, 0.05), (-0.02, 0.03)])
    assert sorted(tolerance.nema_outline()) == sorted(
        [(-0.05, -0.05), (0.0, -0.1), (0.05, -0.05), (0.05, 0.05), (0.0, 0.1), (-0.05, 0.05)])
    for df, dv in tolerance.nema_outline():
        assert tolerance.nema_variation(dv, df)[0]
        assert not tolerance.nema_variation(dv * 1.02 + 0.001 * (1 if dv >= 0 else -1), df)[0]


def test_generator_on_a_nema_site_renders_its_figures():
    g = machine({"frequency": "50 Hz", "voltage": "400 V", "power": "500 kVA"},
                id="G-1", kind="synchronous-generator", poles=4)
    page = html.render([assess(g, site(frequency="60 Hz", voltage="480 V", standard="NEMA"))])
    parsed = parse(page)
    text = " ".join(parsed.text)
    assert "NEMA MG 1 12.44" in text and "available apparent power" in text
    assert parsed.tags["svg"] == 1
