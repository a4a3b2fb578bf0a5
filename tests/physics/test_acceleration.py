import math

import pytest

from machinecheck.errors import DomainError
from machinecheck.physics import acceleration as ac
from machinecheck.physics import circuit


def test_constant_accelerating_torque_is_exact():
    # analytic: J dw/dt = T constant -> t = J w / T; 2 kg m2 to 150 rad/s on 100 N m net = 3 s
    r = ac.acceleration_time(2.0, ac.constant_load(140.0), ac.constant_load(40.0), 150.0)
    assert r.time_s == pytest.approx(3.0, rel=1e-12)
    assert r.stall_speed_rad_s is None


def test_linear_motor_torque_analytic():
    # analytic: T = T0 (1 - w / ws), no load -> t = (J ws / T0) ln(ws / (ws - w1))
    t0, ws, j, w1 = 300.0, 188.5, 1.5, 0.95 * 188.5
    motor = ac.curve_from_points([(0.0, t0), (ws, 0.0)])
    r = ac.acceleration_time(j, motor, ac.constant_load(0.0), w1)
    assert r.time_s == pytest.approx(j * ws / t0 * math.log(ws / (ws - w1)), rel=1e-7)


def test_constant_motor_torque_on_square_law_load_analytic():
    # analytic: J dw/dt = T - k w^2 -> t = J / sqrt(T k) artanh(w1 sqrt(k / T))
    t, k, j, w1 = 200.0, 200.0 / 160.0 ** 2, 3.0, 150.0
    load = ac.centrifugal_load(200.0, 160.0)
    r = ac.acceleration_time(j, ac.constant_load(t), load, w1)
    assert r.time_s == pytest.approx(j / math.sqrt(t * k) * math.atanh(w1 * math.sqrt(k / t)),
                                     rel=1e-7)


def test_us_trade_formula_308():
    # t = WK^2 dN / (308 T) with WK^2 in lb ft^2, N in rpm, T in lb ft [Fruge, Practical Motor
    # Starting, Eq. 2]: the US form of t = J dw / T. 1 lb ft^2 = 0.0421401 kg m2,
    # 1 lb ft = 1.355818 N m; the printed 308 is 307.2 rounded: 0.3 %.
    wk2, dn, torque_lbft = 500.0, 1780.0, 150.0
    r = ac.acceleration_time(wk2 * 0.0421401, ac.constant_load(torque_lbft * 1.355818),
                             ac.constant_load(0.0), dn * math.pi / 30.0)
    assert r.time_s == pytest.approx(wk2 * dn / (308.0 * torque_lbft), rel=0.003)


def test_stall_is_found():
    # motor 100 N m falling to 0 at 200 rad/s against a constant 50 N m: net zero at 100 rad/s
    motor = ac.curve_from_points([(0.0, 100.0), (200.0, 0.0)])
    r = ac.acceleration_time(1.0, motor, ac.constant_load(50.0), 180.0)
    assert r.time_s == math.inf
    assert r.stall_speed_rad_s == pytest.approx(100.0, abs=0.5)
    stuck = ac.acceleration_time(1.0, motor, ac.constant_load(120.0), 180.0)
    assert stuck.time_s == math.inf and stuck.stall_speed_rad_s == 0.0


def test_scaled_curve_at_dipped_voltage():
    # T ~ V^2 [Chapman, 4th ed., sec. 7.5]: at 90 % voltage a constant net torque drops to 81 %
    # and the time rises by 1 / 0.81
    full = ac.acceleration_time(2.0, ac.constant_load(100.0), ac.constant_load(0.0), 150.0)
    low = ac.acceleration_time(2.0, ac.scaled_curve(ac.constant_load(100.0), 0.81),
                               ac.constant_load(0.0), 150.0)
    assert low.time_s == pytest.approx(full.time_s / 0.81, rel=1e-12)


CHAPMAN_7_5 = circuit.Circuit(r1_ohm=0.641, x1_ohm=1.106, r2_ohm=0.332, x2_ohm=0.464,
                              xm_ohm=26.3, frequency_hz=60.0, poles=4,
                              rotational_loss_w=1100.0, rated_speed_rpm=1760.4)


def test_circuit_curve_matches_chapman_example():
    # S. J. Chapman, Electric Machinery Fundamentals, 4th ed., Example 7-5: induced torque
    # 62.8 N m at 2.2 % slip (1760 rpm) [book answer, as in test_circuit]
    curve = ac.circuit_curve(CHAPMAN_7_5, 460.0, 60.0)
    assert curve(0.978 * 1800 * math.pi / 30) == pytest.approx(62.8, abs=0.05)
    assert curve(1800 * math.pi / 30) == 0.0


def test_circuit_start_is_finite_and_slower_at_low_voltage():
    w_sync = 1800 * math.pi / 30
    load = ac.centrifugal_load(56.8, 0.978 * w_sync)
    full = ac.acceleration_time(1.0, ac.circuit_curve(CHAPMAN_7_5, 460.0, 60.0), load,
                                0.95 * w_sync)
    dipped = ac.acceleration_time(1.0, ac.circuit_curve(CHAPMAN_7_5, 0.85 * 460.0, 60.0), load,
                                  0.95 * w_sync)
    assert 0.0 < full.time_s < dipped.time_s < math.inf


def test_curve_from_points_interpolates_and_refuses_outside():
    curve = ac.curve_from_points([(0.0, 220.0), (100.0, 180.0), (170.0, 260.0), (185.0, 100.0)])
    assert curve(0.0) == 220.0 and curve(170.0) == 260.0 and curve(185.0) == 100.0
    assert curve(50.0) == pytest.approx(200.0)
    with pytest.raises(DomainError):
        curve(190.0)
    with pytest.raises(DomainError):
        ac.curve_from_points([(0.0, 1.0), (0.0, 2.0)])


@pytest.mark.parametrize("args", [(0.0, 10.0), (1.0, -1.0), (1.0, 0.0)])
def test_acceleration_domain(args):
    inertia, end = args
    with pytest.raises(DomainError):
        ac.acceleration_time(inertia, ac.constant_load(1.0), ac.constant_load(0.0), end)
