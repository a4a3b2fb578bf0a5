import math

import pytest

from machinecheck.errors import DomainError
from machinecheck.physics import source as so


def test_transformer_infinite_bus_1000_kva():
    # 1000 kVA, 5.75 %: S_sc = 1000 / 0.0575 = 17 391 kVA, about 17.4 MVA; at 480 V the
    # secondary current 1203 A / 0.0575 = 20.9 kA [IEEE Std 141-1993 ch. 4, per-unit method;
    # the widely published infinite-bus example, arithmetic]
    s_sc = so.transformer_short_circuit_power(1000e3, 0.0575)
    assert s_sc == pytest.approx(17.391e6, rel=1e-4)
    z = so.transformer_impedance(1000e3, 0.0575, 480.0, math.inf)
    assert 480.0 / (math.sqrt(3) * abs(z)) == pytest.approx(20.9e3, abs=50)


def test_transformer_worked_example_eep():
    # Published worked example [EEP transformer-size and motor-start dip example]: 1000 kVA,
    # 11/0.48 kV, 5.75 %: full-load current 1203 A, secondary fault current 20 919 A, short-
    # circuit power 17 391 kVA (printed to the ampere and kVA: 1e-4)
    s_sc = so.transformer_short_circuit_power(1000e3, 0.0575)
    assert 1000e3 / (math.sqrt(3) * 480.0) == pytest.approx(1203, rel=1e-3)
    assert s_sc / (math.sqrt(3) * 480.0) == pytest.approx(20919, rel=1e-4)
    assert s_sc == pytest.approx(17391e3, rel=1e-4)


def test_transformer_infinite_bus_1500_kva():
    # 1500 kVA, 5.75 %, 480 V on an infinite bus: 31 374 A, from 1804 A / 0.0575
    # [IAEI 2018 short-circuit example]; the 4-digit rated current rounds, hence 2e-4.
    s_sc = so.transformer_short_circuit_power(1500e3, 0.0575)
    assert s_sc / (math.sqrt(3) * 480.0) == pytest.approx(31374, rel=2e-4)


def test_transformer_impedance_in_ohms():
    # [IEC 60909-0:2016 eq. (7)] Z_T = u_k U^2 / S_T per phase: 1000 kVA, 480 V, 5.75 %
    # -> 0.0575 * 480^2 / 1e6 = 13.25 mohm (the line-to-line form 27.6 V / 1203 A = 22.9 mohm
    # is sqrt(3) larger and is not a phase impedance)
    z = so.transformer_impedance(1000e3, 0.0575, 480.0, math.inf)
    assert abs(z) == pytest.approx(13.248e-3, rel=1e-4)


def test_finite_upstream_adds_impedance():
    # 1 / S_sc = 1 / S_up + z / S_T (series impedances on a common base; arithmetic):
    # 250 MVA upstream of the 1000 kVA 5.75 % unit: 1 / (1/250 + 0.0575) MVA = 16.26 MVA
    s_sc = so.transformer_short_circuit_power(1000e3, 0.0575, 250e6)
    assert s_sc == pytest.approx(1e6 / (1 / 250 + 0.0575), rel=1e-9)
    assert s_sc == pytest.approx(16.26e6, rel=1e-3)
    assert s_sc < so.transformer_short_circuit_power(1000e3, 0.0575)


def test_generator_short_circuit_power():
    # S_sc = S_G / x''_d [IEEE Std 399-1997 ch. 9]: 500 kVA at 15 % -> 3.333 MVA
    assert so.generator_short_circuit_power(500e3, 0.15) == pytest.approx(3.3333e6, rel=1e-4)
    z = so.generator_impedance(500e3, 0.15, 400.0, math.inf)
    assert so.short_circuit_power(z, 400.0) == pytest.approx(3.3333e6, rel=1e-4)


@pytest.mark.parametrize("x_over_r", [1.0, 6.0, 15.0, math.inf])
def test_split_keeps_magnitude_and_ratio(x_over_r):
    z = so.split_impedance(0.01, x_over_r)
    assert abs(z) == pytest.approx(0.01, rel=1e-12)
    if math.isinf(x_over_r):
        assert z.real == 0.0
    else:
        assert z.imag / z.real == pytest.approx(x_over_r, rel=1e-12)


def test_utility_impedance_with_voltage_factor():
    # IEC 60909-0:2016 eq. (5): Z_Q = c U^2 / S_k'' = 1.1 * 400^2 / 250 MVA = 0.704 mohm
    z = so.impedance_from_short_circuit_power(250e6, 400.0, 10.0, voltage_factor=1.1)
    assert abs(z) == pytest.approx(0.704e-3, rel=1e-9)


def test_fault_current_round_trip():
    # S = sqrt(3) U I [IEC 60909-0:2016 3.6]: 25 kA at 400 V -> 17.32 MVA
    s = so.short_circuit_power_from_current(25e3, 400.0)
    assert s == pytest.approx(17.32e6, rel=1e-3)
    z = so.impedance_from_short_circuit_power(s, 400.0, 8.0)
    assert 400.0 / (math.sqrt(3) * abs(z)) == pytest.approx(25e3, rel=1e-12)


@pytest.mark.parametrize("args", [(0.0, 0.05), (1e6, 0.0), (-1e6, 0.05), (math.nan, 0.05)])
def test_transformer_rejects_bad_data(args):
    with pytest.raises(DomainError):
        so.transformer_short_circuit_power(*args)


def test_split_rejects_bad_ratio():
    with pytest.raises(DomainError):
        so.split_impedance(0.01, 0.0)
