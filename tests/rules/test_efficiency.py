"""rules.efficiency: the marked class against its minimum, and the site's required class."""

from machinecheck.rules import efficiency
from rules.pairs import by_code, records

IEC_4KW = {"frequency": "50 Hz", "voltage": "400 V", "power": "4 kW", "speed": "1440 rpm"}


def test_plate_below_its_marked_class_and_below_the_site_requirement():
    # 4 kW 4-pole 50 Hz: IE2 minimum 86.6 % [IEC 60034-30-1:2014 §6, 50 Hz table]; 85.9 % is below it,
    # and an IE3 site is not met.
    found = by_code(efficiency.check(*records(
        {**IEC_4KW, "efficiency": "85.9 %"},
        dict(frequency="50 Hz", voltage="400 V", standard="IEC", min_efficiency_class="IE3"),
        efficiency_class="IE2")))
    assert found["efficiency-below-class"].severity == "warning"
    assert "below the IE2 minimum 86.6 %" in found["efficiency-below-class"].message
    assert found["efficiency-class-required"].severity == "problem"


def test_unknown_class_on_a_site_that_requires_one():
    found = by_code(efficiency.check(*records(
        IEC_4KW, dict(frequency="50 Hz", voltage="400 V", standard="IEC",
                      min_efficiency_class="IE3"))))
    assert found["efficiency-class-unknown"].severity == "warning"


def test_class_that_meets_the_site_finds_nothing():
    # 4 kW 4-pole 50 Hz: IE3 minimum 88.6 % [IEC 60034-30-1:2014 §6, 50 Hz table]; 89.0 % meets it.
    assert efficiency.check(*records(
        {**IEC_4KW, "efficiency": "89.0 %"},
        dict(frequency="50 Hz", voltage="400 V", standard="IEC", min_efficiency_class="IE3"),
        efficiency_class="IE3")) == ()
