import math

import pytest

from machinecheck.errors import DomainError
from machinecheck.physics import dip as dp
from machinecheck.physics import source as so


def test_locked_rotor_kva_matches_code_letter_definition():
    # [NEMA MG 1 10.37.2] kVA/hp = sqrt(3) U I_LR / (1000 hp): the worked value of 10 hp,
    # 460 V, code G, 70.3 A at 5.6 kVA/hp (physics.starting docstring) -> 56.0 kVA
    assert dp.locked_rotor_apparent_power(460.0, 70.3) == pytest.approx(56.0e3, rel=1e-3)
    assert dp.locked_rotor_apparent_power(230.0, 10.0, phases=1) == pytest.approx(2300.0)


@pytest.mark.parametrize("method,kw,current,torque", [
    # [IEEE Std 3002.7-2018, reduced-voltage starting] ideal factors (common practice)
    ("direct-on-line", {}, 1.0, 1.0),
    ("star-delta", {}, 1 / 3, 1 / 3),
    ("autotransformer", {"tap": 0.65}, 0.4225, 0.4225),
    ("autotransformer", {"tap": 0.8}, 0.64, 0.64),
    ("primary-reactor", {"tap": 0.65}, 0.65, 0.4225),
    ("soft-starter", {"current_limit_ratio": 3.0, "locked_rotor_current_ratio": 6.0}, 0.5, 0.25),
    ("drive", {"locked_rotor_current_ratio": 6.0, "locked_rotor_torque_ratio": 2.0}, 1 / 6, 0.5),
])
def test_start_reduction(method, kw, current, torque):
    r = dp.start_reduction(method, **kw)
    assert r.current_factor == pytest.approx(current)
    assert r.torque_factor == pytest.approx(torque)
    assert r.estimate == (method != "direct-on-line")


@pytest.mark.parametrize("method,kw", [
    ("autotransformer", {}), ("autotransformer", {"tap": 1.2}), ("soft-starter", {}),
    ("soft-starter", {"current_limit_ratio": 7.0, "locked_rotor_current_ratio": 6.0}),
    ("drive", {}), ("wye-wye", {}),
])
def test_start_reduction_needs_its_data(method, kw):
    with pytest.raises(DomainError):
        dp.start_reduction(method, **kw)


def test_transformer_dip_1000_kva():
    # 1000 kVA 5.75 % -> 17 391 kVA [IEEE Std 141-1993 ch. 4]; a 1000 kVA starting load gives
    # 1000 / (1000 + 17 391) = 5.44 % by the divider [IEEE Std 399-1997 ch. 9] (arithmetic)
    s_sc = so.transformer_short_circuit_power(1000e3, 0.0575)
    assert dp.dip_from_powers(1000e3, s_sc) == pytest.approx(0.0544, abs=5e-5)
    assert dp.dip_from_powers(1000e3, math.inf) == 0.0


def test_transformer_dip_worked_example_eep():
    # [EEP transformer-size and motor-start dip example]: 300 kW 460 V motor, code D upper
    # figure, locked-rotor current 2118 A -> 460 * 2118 * sqrt(3) = 1688 kVA; on the 1000 kVA
    # 5.75 % unit (17 391 kVA) the example's cruder form S_LR / S_sc gives 9.7 %. The divider
    # used here, S_LR / (S_LR + S_sc), gives 8.85 %, below the cruder form as it must be.
    s_lr = dp.locked_rotor_apparent_power(460.0, 2118.0)
    assert s_lr == pytest.approx(1688e3, rel=1e-3)
    s_sc = so.transformer_short_circuit_power(1000e3, 0.0575)
    assert s_lr / s_sc == pytest.approx(0.097, abs=5e-4)
    assert dp.dip_from_powers(s_lr, s_sc) == pytest.approx(0.0885, abs=5e-4)


def test_generator_dip_equals_divider_with_reactances():
    # x''_d S_LR / (S_G + x''_d S_LR) [IEEE Std 399-1997 ch. 9]: 500 kVA set, 15 %, 600 kVA
    # start: 90 / 590 = 15.25 %; the same as the complex divider with pure reactances.
    d = dp.generator_dip(500e3, 0.15, 600e3)
    assert d == pytest.approx(90 / 590, rel=1e-12)
    z_g = so.generator_impedance(500e3, 0.15, 400.0, math.inf)
    z_m = complex(0.0, 400.0 ** 2 / 600e3)
    assert dp.dip_divider(z_g, 0j, z_m).bus == pytest.approx(d, rel=1e-12)


def test_divider_terminal_dip_includes_feeder():
    z_s, z_f = complex(0.001, 0.01), complex(0.02, 0.004)
    z_m = dp.locked_rotor_impedance(400.0, 600.0, 0.35)
    d = dp.dip_divider(z_s, z_f, z_m)
    assert d.terminals > d.bus > 0.0
    # locked-rotor impedance: |Z| = U / (sqrt(3) I_LR) at PF_LR
    assert abs(z_m) == pytest.approx(400 / (math.sqrt(3) * 600))
    assert z_m.real / abs(z_m) == pytest.approx(0.35)


def test_kva_form_not_below_divider():
    # The kVA form adds magnitudes, so it is never below the complex divider (triangle
    # inequality); with equal angles the two agree.
    z_s = so.split_impedance(0.01, 8.0)
    z_m = dp.locked_rotor_impedance(400.0, 1000.0, 0.3)
    s_sc = so.short_circuit_power(z_s, 400.0)
    s_lr = dp.locked_rotor_apparent_power(400.0, 1000.0)
    assert dp.dip_from_powers(s_lr, s_sc) >= dp.dip_divider(z_s, 0j, z_m).bus
    same = z_m / abs(z_m) * abs(z_s)
    assert dp.dip_divider(same, 0j, z_m).bus == pytest.approx(
        dp.dip_from_powers(s_lr, so.short_circuit_power(same, 400.0)), rel=1e-12)


def test_torque_at_dipped_voltage():
    # T ~ V^2 [Chapman, 4th ed., sec. 7.5]: 15 % dip leaves 72.25 % of the torque
    assert dp.torque_at_voltage(100.0, 0.85) == pytest.approx(72.25)
    assert dp.breakaway_margin(72.25, 50.0) == pytest.approx(0.445)


@pytest.mark.parametrize("limit", [0.05, 0.10, 0.15, 0.20])
def test_minimum_transformer_meets_limit_exactly(limit):
    # inverting the divider (arithmetic): the dip at the minimum rating equals the limit
    s_t = dp.minimum_transformer_rating(800e3, 0.0575, limit)
    assert dp.dip_from_powers(800e3, so.transformer_short_circuit_power(s_t, 0.0575)) == \
        pytest.approx(limit, rel=1e-12)
    s_t_up = dp.minimum_transformer_rating(800e3, 0.0575, limit, 100e6)
    assert s_t_up > s_t
    assert dp.dip_from_powers(800e3, so.transformer_short_circuit_power(s_t_up, 0.0575, 100e6)) \
        == pytest.approx(limit, rel=1e-9)


def test_minimum_transformer_impossible_on_weak_upstream():
    # S_sc needed 800 kVA * 0.85 / 0.15 = 4.53 MVA > 4 MVA upstream: no transformer will do
    assert dp.minimum_transformer_rating(800e3, 0.0575, 0.15, 4e6) == math.inf


def test_minimum_generator_meets_limit():
    # x''_d S_start (1 - d) / d: 15 %, 600 kVA, 15 % dip -> 510 kVA (arithmetic)
    s_g = dp.minimum_generator_rating(600e3, 0.15, 0.15)
    assert s_g == pytest.approx(510e3)
    assert dp.generator_dip(s_g, 0.15, 600e3) == pytest.approx(0.15)


def test_starting_active_power():
    assert dp.starting_active_power(600e3, 0.35) == pytest.approx(210e3)
    with pytest.raises(DomainError):
        dp.starting_active_power(600e3, 1.5)


@pytest.mark.parametrize("limit", [0.0, 1.0, -0.1])
def test_dip_limit_domain(limit):
    with pytest.raises(DomainError):
        dp.minimum_generator_rating(600e3, 0.15, limit)
