import pytest

from machinecheck.errors import DomainError
from machinecheck.physics import speed_fix as sf
from machinecheck.physics.frequency import frequency_output_factor


def test_pulley_60_to_50_is_six_fifths():
    # Belt kinematics [Shigley ch. 17]: same driven speed after 60 -> 50 Hz:
    # motor pulley x 1.2 (synchronous speeds 1800 -> 1500 rpm).
    assert sf.motor_pulley_factor(1800, 1500) == pytest.approx(1.2)
    # With the slip kept in rpm (derived): 1760 -> 1460 rpm -> x 1.2055.
    assert sf.motor_pulley_factor(1760, 1460) == pytest.approx(1.2055, abs=1e-4)


def test_restored_pump_overloads_a_60hz_motor_on_50hz():
    # A published application note (common practice): a 10 hp 60 Hz motor on 50 Hz (V/f held)
    # gives 8.33 hp [NEMA MG 1 12.44.2]; the load restored to its old speed asks 8.7 hp: "No".
    factor = frequency_output_factor(50 / 60, 1.0)
    loading = sf.restored_loading(8.7, 10, factor)
    assert loading == pytest.approx(8.7 / 8.333, abs=1e-3)
    assert loading > 1.0
    assert sf.restored_loading(8.0, 10, factor) < 1.0


def test_affinity_diameter_example():
    # Affinity laws in diameter [Karassik Pump Handbook 4th ed. ch. 2]: at constant speed a
    # 10 % trim gives flow x 0.9, head x 0.81, power x 0.729.
    r = sf.trimmed_duty(1.0, 0.9, min_flow_ratio=0.5)
    assert (r.flow_ratio, r.head_ratio, r.power_ratio) == pytest.approx((0.9, 0.81, 0.729))
    assert r.acceptable


def test_trim_for_a_pump_moved_50_to_60hz():
    # 50 -> 60 Hz: power x 1.728 at full diameter [Karassik Pump Handbook 4th ed. ch. 2]. A motor
    # that keeps 1.15 x the old pump power allows D = 1.15^(1/3) / 1.2 = 0.8731.
    d = sf.trim_for_power(1.2, 1.15)
    assert d == pytest.approx(0.8731, abs=1e-4)
    r = sf.trim_to_motor(1.2, 1.15, min_flow_ratio=1.0)
    assert r.power_ratio == pytest.approx(1.15)
    assert r.flow_ratio == pytest.approx(1.048, abs=1e-3)
    assert r.head_ratio == pytest.approx(1.098, abs=1e-3)
    assert r.acceptable


def test_no_trim_keeps_flow_and_loading():
    # Motor keeps only the old power: D = 1/1.2 = 0.833, beyond the 0.85 trim limit (common
    # practice), and the flow is exactly the old one.
    r = sf.trim_to_motor(1.2, 1.0, min_flow_ratio=1.0)
    assert r.diameter_ratio == pytest.approx(1 / 1.2)
    assert not r.within_trim_limit
    assert not r.acceptable
    # A duty needing more flow than the power allows fails on flow too.
    r = sf.trim_to_motor(1.2, 1.15, min_flow_ratio=1.1)
    assert not r.flow_met


def test_no_trim_needed_when_motor_is_big_enough():
    assert sf.trim_for_power(1.2, 2.0) == 1.0
    with pytest.raises(DomainError):
        sf.trimmed_duty(1.2, 1.1, min_flow_ratio=1.0)
