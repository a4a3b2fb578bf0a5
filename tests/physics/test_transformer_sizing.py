import math

import pytest

from machinecheck.errors import DomainError
from machinecheck.physics import transformer_sizing as ts


def test_vf_target_textbook():
    # V/f law [Chapman 5th ed. §6.9]; a published textbook-style problem: a 440 V 60 Hz motor
    # run at 50 Hz with the same air-gap flux needs 366.7 V.
    assert ts.target_terminal_voltage(440, 60, 50) == pytest.approx(366.7, abs=0.05)


@pytest.mark.parametrize("rated,f_r,f_s,target", [(460, 60, 50, 383.3), (230, 60, 50, 191.7),
                                                   (575, 60, 50, 479.2), (400, 50, 60, 480.0)])
def test_vf_targets_of_the_practice_notes(rated, f_r, f_s, target):
    # V/f held [NEMA MG 1 12.44.2]: 460 -> 383, 230 -> 192, 575 -> 479, 400 -> 480 V (x 5/6, x 1.2).
    assert ts.target_terminal_voltage(rated, f_r, f_s) == pytest.approx(target, abs=0.05)


def test_zone_a_band():
    # [IEC 60034-1:2022 §7.3] zone A: +-5 % of rated voltage.
    lo, hi = ts.zone_a_band(383.3)
    assert lo == pytest.approx(364.1, abs=0.05)
    assert hi == pytest.approx(402.5, abs=0.05)


def test_ratio_and_kva_for_a_460v_60hz_motor_on_415v_50hz():
    # Derived: 415 V supply to a 383.3 V target is a 1.083:1 ratio. A 50 hp 460 V motor at
    # 62 A draws sqrt(3) x 460 x 62 = 49.4 kVA at 60 Hz; on 50 Hz at V/f held the current is
    # the same and the kVA x 5/6 = 41.2 kVA -> 45 kVA in the IEEE series [IEEE C57.12.00]
    # (from memory), 50 kVA in the R10 series [IEC 60076-1:2011] (from memory).
    target = ts.target_terminal_voltage(460, 60, 50)
    assert ts.turns_ratio(415, target) == pytest.approx(1.0826, abs=1e-4)
    need = ts.required_va(ts.input_va(62, target, 3))
    assert need == pytest.approx(41_160, rel=1e-3)
    assert ts.next_standard_va(need, "ieee-3ph") == 45_000
    assert ts.next_standard_va(need, "iec-r10") == 50_000
    assert ts.next_standard_va(need * 1.25, "ieee-3ph") == 75_000


def test_fault_example_transformer_is_in_the_series():
    # 1000 kVA is a standard size in both series [IEEE C57.12.00] [IEC 60076-1:2011] (from memory).
    assert ts.next_standard_va(1_000_000, "ieee-3ph") == 1_000_000
    assert ts.next_standard_va(1_000_000, "iec-r10") == 1_000_000
    assert math.isnan(ts.next_standard_va(20e6, "ieee-3ph"))


def test_60hz_transformer_on_50hz_is_overfluxed():
    # Flux ~ V/f [Chapman 5th ed. §2.10]: rated voltage at 50 Hz is 1.2 x rated flux, beyond
    # the 105 % V/Hz at which a transformer carries its rated kVA [IEEE C57.12.00-2010
    # §4.1.6.1]; and 50/60 = 0.83 is below the 95 % frequency floor of that clause.
    k = ts.transformer_overflux(480, 480, 50, 60)
    assert k == pytest.approx(1.2)
    assert not ts.within_rated_capability(480, 480, 50, 60)
    assert not ts.within_rated_capability(400, 480, 50, 60)  # V/f held, frequency still low
    assert ts.transformer_overflux(400, 480, 50, 60) == pytest.approx(1.0)
    assert ts.reduced_rating_va(75_000, 60, 50) == pytest.approx(62_500)
    assert ts.reduced_rating_va(75_000, 50, 60) == pytest.approx(75_000)


@pytest.mark.parametrize("v,f,ok", [(504, 60, True), (505, 60, False), (480, 57.2, True), (480, 57, False),
                                    (480, 56.9, False), (456, 57, True)])
def test_capability_limits_of_the_standard(v, f, ok):
    # [IEEE C57.12.00-2010 §4.1.6.1] 480 V 60 Hz unit: V and V/Hz <= 105 %, f >= 95 %
    # (480 V at 57 Hz is 105.3 % V/Hz).
    assert ts.within_rated_capability(v, 480, f, 60) is ok


def test_bad_inputs():
    with pytest.raises(DomainError):
        ts.next_standard_va(1000, "nema")
    with pytest.raises(DomainError):
        ts.required_va(1000, 0.8)
    with pytest.raises(DomainError):
        ts.input_va(10, 400, 2)
