import math

import pytest

from machinecheck.errors import DomainError
from machinecheck.physics import buck_boost as bb
from machinecheck.physics.tolerance import voltage_deviation


def test_textbook_step_up_autotransformer_voltage_and_rating():
    # [Chapman 5th ed. §2.9] worked example: a 100 VA 120/12 V transformer connected as a
    # step-up autotransformer on 120 V gives 132 V and can carry 1100 VA (from memory).
    assert bb.output_voltage(120, 120, 12, boost=True) == pytest.approx(132.0)
    assert bb.load_va_capacity(100, 132, 12, "single-phase") == pytest.approx(1100.0)


def test_buck_and_boost_of_a_120_12_unit():
    # Common practice, a transformer maker's published answer: a 120 V / 12 V unit boosts
    # 120 V to 132 V, bucks it to 108 V with the secondary reversed, and boosts a low 105 V
    # to "approximately 116 V".
    assert bb.output_voltage(120, 120, 12, boost=False) == pytest.approx(108.0)
    assert bb.output_voltage(105, 120, 12, boost=True) == pytest.approx(115.5)
    with pytest.raises(DomainError):
        bb.output_voltage(120, 12, 120, boost=True)


def test_208_to_230_motor_open_delta():
    # The trade's usual case (common practice): a 230 V motor on a 208 V system. A 240 V
    # primary with a 24 V series winding gives 208 x 1.1 = 228.8 V [Chapman 5th ed. §2.9],
    # inside zone A of the 230 V rating [IEC 60034-1:2022 §7.3].
    out = bb.output_voltage(208, 240, 24, boost=True)
    assert out == pytest.approx(228.8)
    assert abs(voltage_deviation(out, 230)) < 0.05
    # 10 hp 230 V three-phase motor: full-load current 28 A [NFPA 70 Table 430.250].
    # Open delta: two units each carrying the line current at 24 V: 672 VA -> 750 VA units
    # (common practice: the trade sizes on the rated series voltage).
    unit = bb.unit_va(28, 24, "open-delta")
    assert unit == pytest.approx(672.0)
    assert bb.next_standard_unit_va(unit) == 750.0
    assert bb.UNITS["open-delta"] == 2
    # The bank then carries sqrt(3) x 228.8 V x 750/24 A = 12.4 kVA, more than the motor's
    # sqrt(3) x 228.8 x 28 = 11.1 kVA (the trade's "V x 1.73 x A" load kVA).
    cap = bb.load_va_capacity(750, out, 24, "open-delta")
    assert cap == pytest.approx(math.sqrt(3) * 228.8 * 31.25)
    assert cap > math.sqrt(3) * out * 28


def test_wye_bank_needs_the_line_correction_over_sqrt3_per_unit():
    # Wye: each unit adds its voltage to a line-to-neutral voltage, so 120 V LN x 1.1 lifts the
    # 208 V line voltage by the same 10 % [Chapman 5th ed. §2.9].
    ln_out = bb.output_voltage(120, 120, 12, boost=True)
    assert ln_out * math.sqrt(3) == pytest.approx(208 * 1.1 * 120 * math.sqrt(3) / 208)
    assert bb.unit_va(28, 12, "wye") == pytest.approx(336.0)
    assert bb.UNITS["wye"] == 3


def test_correction_voltage_sign():
    assert bb.correction_voltage(208, 230) == pytest.approx(22)
    assert bb.correction_voltage(250, 230) == pytest.approx(-20)


def test_bad_inputs():
    with pytest.raises(DomainError):
        bb.unit_va(28, 24, "zigzag")
    with pytest.raises(DomainError):
        bb.output_voltage(0, 240, 24, boost=True)
    assert math.isnan(bb.next_standard_unit_va(20000))


def test_choose_winding_for_the_208_to_230_case():
    # Common practice: the 208 -> 230 V boost uses a 240 V primary and a 24 V series winding
    # (208 x 1.1 = 228.8 V) [Chapman 5th ed. §2.9].
    w = bb.choose_winding(208, 230, "open-delta")
    assert (w.primary_v, w.secondary_v, w.boost) == (240, 24, True)
    assert w.output_v == pytest.approx(228.8)
    # A wye bank sits across 120 V and boosts it by 10 % with a 120 V / 12 V connection.
    w = bb.choose_winding(208, 230, "wye")
    assert (w.primary_v, w.secondary_v) == (120, 12)
    assert w.output_v == pytest.approx(228.8)


def test_choose_winding_buck_240_to_208():
    # A 240 V primary with a 32 V series winding reversed: 240 x (1 - 32/240) = 208 V.
    w = bb.choose_winding(240, 208, "single-phase")
    assert (w.primary_v, w.secondary_v, w.boost) == (240, 32, False)
    assert w.output_v == pytest.approx(208.0)


def test_choose_winding_refuses_an_underrated_primary():
    with pytest.raises(DomainError):
        bb.choose_winding(600, 575, "single-phase")
