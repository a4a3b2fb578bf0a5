import math

import pytest

from machinecheck.errors import DomainError
from machinecheck.physics import current as cp


@pytest.mark.parametrize("power_w,volts,eta,pf,phases,amps", [
    # I = P / (sqrt3 V eta PF) [Chapman 2005 ch. 7]: 22 kW, 400 V, 0.92, 0.85 -> 40.6 A
    (22000, 400, 0.92, 0.85, 3, 40.6),
    # further values worked by hand from the same formula
    (11000, 400, 0.914, 0.84, 3, 20.7),
    (7500, 400, 0.904, 0.82, 3, 14.6),
    (7457, 460, 0.917, 0.85, 3, 12.0),
    (1500, 230, 0.80, 0.90, 1, 9.06),
    (1000, 400, 0.85, 0.85, 3, 2.00),
    (1000, 400, 0.95, 0.87, 3, 1.75),
])
def test_full_load_current_worked_values(power_w, volts, eta, pf, phases, amps):
    assert cp.full_load_current(power_w, volts, eta, pf, phases) == pytest.approx(amps, abs=0.05)


def test_leaving_out_efficiency_understates_current():
    # Same formula with eta left at 1: 7.5 kW 400 V PF 0.82 gives 13.2 A, about 10 % low.
    assert cp.full_load_current(7500, 400, 1.0, 0.82) == pytest.approx(13.2, abs=0.05)


@pytest.mark.parametrize("kva,volts,amps", [
    # I = S / (sqrt3 V) [Chapman 2005 ch. 4] (three-phase apparent power), worked by hand
    (500, 400, 721.7), (500, 480, 601.4), (100, 208, 277.6), (1000, 415, 1391),
])
def test_generator_current(kva, volts, amps):
    assert cp.apparent_power_current(kva * 1000, volts) == pytest.approx(amps, rel=1e-3)


def test_current_at_lower_voltage_rises():
    # The same output at lower voltage: I x 230 / 208 = 1.106 (common practice, first order).
    assert cp.current_at_site(10.0, 230, 208) == pytest.approx(11.06, abs=0.01)


@pytest.mark.parametrize("eta,pf", [(0, 0.8), (1.2, 0.8), (0.9, 0), (0.9, 1.01), (math.nan, 0.8)])
def test_current_domain(eta, pf):
    with pytest.raises(DomainError):
        cp.full_load_current(1000, 400, eta, pf)


def test_current_rejects_bad_phases():
    with pytest.raises(DomainError):
        cp.full_load_current(1000, 400, 0.9, 0.8, phases=4)
