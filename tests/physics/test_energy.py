import math

import pytest

from machinecheck.errors import DomainError
from machinecheck.physics import energy

HP_W = 745.7


def test_university_facilities_guide_example():
    # [WMU-HEM] 20 hp, 80 % loaded, 8760 h/yr, 5.5 cents/kWh, efficiencies 0.88 and 0.92:
    # 6535 $/yr vs 6251 $/yr, saving 284 $/yr. The guide uses 0.746 kW/hp; so do we here.
    out_w = 20 * 746.0
    t = 8760 * energy.S_PER_H
    old = energy.energy_cost(energy.annual_energy_j(out_w * 0.8 / 0.88, t), 0.055)
    new = energy.energy_cost(energy.annual_energy_j(out_w * 0.8 / 0.92, t), 0.055)
    assert old == pytest.approx(6535, abs=1)
    assert new == pytest.approx(6251, abs=1)
    saving = energy.energy_cost(energy.annual_energy_j(
        energy.power_saving_w(out_w, 0.8, 0.88, 0.92), t), 0.055)
    assert saving == pytest.approx(284, abs=1)


def test_payback():
    # Standard energy-audit arithmetic: price / annual saving.
    assert energy.simple_payback_years(1850, 284) == pytest.approx(6.514, abs=1e-3)
    assert math.isinf(energy.simple_payback_years(1850, 0))


def test_saving_sign_and_units():
    # 75 kW at 75 % load, IE2 93.0 % -> IE3 94.0 %: 56.25 kW x (1/0.93 - 1/0.94) = 643 W.
    dp = energy.power_saving_w(75e3, 0.75, 0.93, 0.94)
    assert dp == pytest.approx(643.4, abs=0.1)
    assert energy.power_saving_w(75e3, 0.75, 0.94, 0.93) < 0
    assert energy.annual_energy_j(dp, 6000 * 3600) / energy.J_PER_KWH == pytest.approx(3860.6, abs=0.1)


def test_bad_inputs():
    with pytest.raises(DomainError):
        energy.power_saving_w(75e3, 0.75, 93, 0.94)
    with pytest.raises(DomainError):
        energy.annual_energy_j(100, 9000 * 3600)
    with pytest.raises(DomainError):
        energy.energy_cost(1e6, -0.1)
