import math

import pytest

from machinecheck.errors import DomainError
from machinecheck.physics import nec
from machinecheck.physics import protection as pr

# Full-load current of a 25 hp, 460 V three-phase induction motor: 34 A [NEC Table 430.250].
FLC_25HP_460V = 34.0


def test_table_current_used():
    assert nec.table_current(25, 460)[0] == FLC_25HP_460V


@pytest.mark.parametrize("device,motor_type,percent,computed,permitted", [
    # [NEC 2011 Table 430.52] percentages (checked against a published transcription of the
    # table); standard sizes [NEC 240.6(A)]; 430.52 Exception No. 1 allows the next size up.
    ("non-time-delay-fuse", "squirrel-cage", 300, 102.0, 110.0),
    ("dual-element-fuse", "squirrel-cage", 175, 59.5, 60.0),
    ("instantaneous-trip-breaker", "squirrel-cage", 800, 272.0, 272.0),
    ("instantaneous-trip-breaker", "design-b-energy-efficient", 1100, 374.0, 374.0),
    ("inverse-time-breaker", "squirrel-cage", 250, 85.0, 90.0),
    ("inverse-time-breaker", "wound-rotor", 150, 51.0, 60.0),
    ("dual-element-fuse", "wound-rotor", 150, 51.0, 60.0),
])
def test_table_430_52_25hp_460v(device, motor_type, percent, computed, permitted):
    r = pr.short_circuit_device_maximum(FLC_25HP_460V, device, motor_type, edition="2011")
    assert r.percent == percent
    assert r.computed_a == pytest.approx(computed)
    assert r.permitted_a == pytest.approx(permitted)
    assert r.clause == "NEC 2011 Table 430.52"


def test_table_renumbered_in_2023():
    # [NFPA 70-2023 430.52(C)(1)]: the table keeps its percentages under a new number
    assert pr.table_430_52_name("2020") == "Table 430.52"
    assert pr.table_430_52_name(2023) == "Table 430.52(C)(1)"
    old = pr.short_circuit_device_maximum(28.0, "dual-element-fuse", edition="2020")
    new = pr.short_circuit_device_maximum(28.0, "dual-element-fuse", edition="2023")
    assert old.permitted_a == new.permitted_a == 50.0  # 10 hp 230 V: 28 A x 175 % = 49 A
    assert new.clause.endswith("Table 430.52(C)(1)")


def test_premium_efficiency_row_from_2023():
    # [NFPA 70-2023 Table 430.52(C)(1)] adds Design B premium-efficiency motors to the 1100 %
    # instantaneous-trip row (published 2023 code-change summary); earlier tables lack the row
    r = pr.short_circuit_device_maximum(34.0, "instantaneous-trip-breaker",
                                        "design-b-premium-efficiency", edition="2023")
    assert r.percent == 1100 and r.computed_a == pytest.approx(374.0)
    with pytest.raises(DomainError):
        pr.short_circuit_device_maximum(34.0, "instantaneous-trip-breaker",
                                        "design-b-premium-efficiency", edition="2020")


@pytest.mark.parametrize("current,fuse,expected", [
    # [NEC 240.6(A)] standard ratings; fuses also 1, 3, 6, 10 and 601 A
    (102.0, False, 110.0), (59.5, False, 60.0), (60.0, False, 60.0), (3.3, False, 15.0),
    (3.3, True, 6.0), (9.0, True, 10.0), (600.5, True, 601.0), (600.5, False, 700.0),
    (4500.0, False, 5000.0),
])
def test_next_standard_rating(current, fuse, expected):
    assert pr.next_standard_rating(current, fuse=fuse) == expected


def test_above_largest_standard_rating():
    with pytest.raises(DomainError):
        pr.next_standard_rating(6500.0, fuse=False)


def test_conductors_125_percent_and_star_delta():
    # [NEC 430.22]: 125 % of 34 A = 42.5 A; [NEC 430.22(C)] star-delta motor leads on 58 %:
    # 1.25 * 0.58 * 34 = 24.65 A
    assert pr.conductor_ampacity(FLC_25HP_460V).current_a == pytest.approx(42.5)
    sd = pr.conductor_ampacity(FLC_25HP_460V, star_delta_motor_leads=True, edition=2017)
    assert sd.current_a == pytest.approx(24.65)
    assert sd.clause == "NEC 2017 430.22(C)"


@pytest.mark.parametrize("sf,rise,will_not_start,expected,clause", [
    # [NEC 430.32(A)(1)] 125 % for SF >= 1.15 or rise <= 40 degC, else 115 %;
    # [NEC 430.32(C)] 140 % / 130 % where the motor will not start. Nameplate 26 A.
    (1.15, None, False, 32.5, "430.32(A)(1)"),
    (1.0, None, False, 29.9, "430.32(A)(1)"),
    (None, 40.0, False, 32.5, "430.32(A)(1)"),
    (1.0, 80.0, False, 29.9, "430.32(A)(1)"),
    (1.15, None, True, 36.4, "430.32(C)"),
    (1.0, None, True, 33.8, "430.32(C)"),
])
def test_overload_maximum_trip(sf, rise, will_not_start, expected, clause):
    s = pr.overload_maximum_trip(26.0, service_factor=sf, temperature_rise_degc=rise,
                                 will_not_start=will_not_start)
    assert s.current_a == pytest.approx(expected)
    assert s.clause.endswith(clause)
    assert "not a dial setting" in s.note


def test_dial_setting_is_common_practice():
    # common practice, no published code figure: nameplate current; star-delta relay in the
    # phase windings at 1/sqrt(3)
    assert pr.overload_dial_setting(26.0).current_a == 26.0
    sd = pr.overload_dial_setting(26.0, star_delta=True)
    assert sd.current_a == pytest.approx(26.0 / math.sqrt(3))
    assert sd.clause == "common practice"


def test_disconnect_115_percent():
    # [NEC 430.110(A)]: 115 % of 34 A = 39.1 A
    assert pr.disconnect_minimum_rating(FLC_25HP_460V).current_a == pytest.approx(39.1)


@pytest.mark.parametrize("kw", [{"device": "breaker"}, {"motor_type": "shaded-pole"},
                                {"edition": "2008"}])
def test_unknown_keys(kw):
    args = {"table_current_a": 34.0, "device": "dual-element-fuse"} | kw
    with pytest.raises(DomainError):
        pr.short_circuit_device_maximum(**args)
