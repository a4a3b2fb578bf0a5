"""rules.operating: the equivalent-circuit operating point and the limits of the estimate."""

from machinecheck.rules import operating
from rules.pairs import by_code, records

NEMA_50HP = {"frequency": "60 Hz", "voltage": "460 V", "power": "50 hp", "speed": "1775 rpm",
             "efficiency": 0.93, "power_factor": 0.85}


def test_deep_undervoltage_stalls_a_fully_loaded_motor():
    # Breakdown torque ~ V^2 [Chapman 2005 §7.5]: 2.5 x (208 / 460)^2 = 0.51 of rated torque,
    # below the full-load torque.
    found = by_code(operating.check(*records(NEMA_50HP, dict(frequency="60 Hz", voltage="208 V",
                                                            standard="NEMA"))))
    assert found["motor-stall"].severity == "problem"


def test_rated_supply_keeps_the_typical_breakdown_margin():
    # Design B breakdown torque about 2.5 x rated at rated supply [NEMA MG 1-2016 §12.39]
    # (from memory): above the 1.5 warning threshold (common practice, no published source).
    assert operating.check(*records(NEMA_50HP, dict(frequency="60 Hz", voltage="460 V",
                                                    standard="NEMA"))) == ()


def test_low_margin_is_warned():
    # 370 V on a 460 V plate: 2.5 x (370 / 460)^2 = 1.62 before the extra slip; the solved
    # circuit gives less than 1.5 with a design C plate [Chapman 2005 §7.5].
    found = by_code(operating.check(*records(NEMA_50HP, dict(frequency="60 Hz", voltage="370 V",
                                                            standard="NEMA"),
                                             design_letter="C")))
    assert found["breakdown-margin"].severity == "warning"


def test_plate_without_efficiency_and_power_factor_has_no_circuit():
    # Two of current, efficiency and power factor are needed to fit the circuit (the estimate's
    # own method, docs/methods.md; common practice, no published source).
    plate = {"frequency": "60 Hz", "voltage": "460 V", "power": "50 hp", "speed": "1775 rpm"}
    found = by_code(operating.check(*records(plate, dict(frequency="60 Hz", voltage="460 V",
                                                        standard="NEMA"))))
    assert found["circuit-unavailable"].severity == "info"
