"""rules.protection: the settings finding carries the caution."""

import dataclasses

from helpers import machine, site

from machinecheck.engine.pipeline import assess
from machinecheck.physics.protection import CAUTION
from machinecheck.rules import protection as rule

PLATE = {"frequency": "60 Hz", "voltage": "460 V", "current": "58 A", "power": "50 hp",
         "speed": "1775 rpm", "power_factor": 0.86, "efficiency": "94.5 %"}


def test_nec_finding_gives_dial_maximum_and_caution():
    a = assess(machine(PLATE, service_factor=1.15, start={"method": "direct-on-line"}),
               site(frequency="60 Hz", voltage="480 V", standard="NEMA"))
    (f,) = rule.check(a.protection)
    assert f.code == "protection-settings" and f.severity == "info"
    # 430.32(A)(1): 125 % of 58 A = 72.5 A [NFPA 70-2023]
    assert "overload dial 58.0 A" in f.message and "maximum trip 72.5 A" in f.message
    assert f.message.endswith(CAUTION)
    assert f in a.findings


def test_iec_finding_and_none():
    a = assess(machine(PLATE, start={"method": "direct-on-line"}),
               site(frequency="60 Hz", voltage="460 V", standard="IEC"))
    (f,) = rule.check(a.protection)
    assert "IEC practice" in f.message and CAUTION in f.message
    assert rule.check(None) == ()
    changed = dataclasses.replace(a.protection, caution="x")
    assert rule.check(changed)[0].message.endswith("x")
