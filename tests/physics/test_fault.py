import math

import pytest

from machinecheck.errors import DomainError
from machinecheck.physics import fault as ft
from machinecheck.physics import source as so


@pytest.mark.parametrize("voltage,maximum,tolerance,edition,c", [
    # [IEC 60909-0:2016 Table 1]
    (400.0, True, 0.06, "2016", 1.05), (400.0, True, 0.10, "2016", 1.10),
    (480.0, False, 0.10, "2016", 0.95), (11e3, True, 0.10, "2016", 1.10),
    (11e3, False, 0.10, "2016", 1.00),
    # [IEC 60909:1988 Table I] (from memory): 230/400 V c_max 1.00, other LV 1.05
    (400.0, True, 0.10, "1988", 1.00), (480.0, True, 0.10, "1988", 1.05),
])
def test_voltage_factor(voltage, maximum, tolerance, edition, c):
    assert ft.voltage_factor(voltage, maximum=maximum, voltage_tolerance=tolerance,
                             edition=edition) == c


def test_iec60909_transformer_1mva():
    # 1 MVA, 11/0.48 kV, u_k 5.75 %, u_kr 0.95 %, stiff 11 kV grid, c_max 1.05:
    # Z_T = 0.0575 * 0.48^2 / 1 = 13.248 mohm [IEC 60909-0:2016 eq. (7)];
    # K_T = 0.95 * 1.05 / (1 + 0.6 * 0.05671) = 0.9647 [eq. (12a)];
    # I_k'' = 1.05 * 480 / (sqrt(3) * K_T * Z_T) = 22.77 kA [eq. (29)] -- hand-computed; the
    # same figure is quoted for the general-purpose library's IEC 60909 run in the project's
    # fact sheet. Four figures: 5e-4.
    x_t = math.sqrt(0.0575 ** 2 - 0.0095 ** 2)
    k_t = ft.transformer_correction(x_t, 1.05)
    assert k_t == pytest.approx(0.9647, abs=1e-4)
    z_t = so.transformer_impedance(1e6, 0.0575, 480.0, x_t / 0.0095)
    assert ft.fault_current(480.0, k_t * z_t, 1.05) == pytest.approx(22.77e3, rel=5e-4)
    # the plain infinite-bus figure, c = 1 and no K_T: 1203 A / 0.0575 = 20.9 kA
    # [IEEE Std 141-1993 ch. 4, arithmetic]
    assert ft.fault_current(480.0, z_t) == pytest.approx(20.92e3, rel=5e-4)


def test_feeder_lowers_fault_current_at_motor():
    z_t = so.transformer_impedance(1e6, 0.0575, 480.0, 6.0)
    z_f = complex(0.052, 0.041) / 304.8 * 0.1  # 100 ft of 250 kcmil Cu in PVC [NEC Ch. 9 Table 9]
    at_bus = ft.fault_current(480.0, z_t)
    at_motor = ft.fault_current_at_motor(480.0, z_t, z_f)
    assert at_motor < at_bus
    assert at_motor == pytest.approx(480.0 / (math.sqrt(3) * abs(z_t + z_f)))


def test_fault_domain():
    with pytest.raises(DomainError):
        ft.fault_current(480.0, 0j)
    with pytest.raises(DomainError):
        ft.voltage_factor(400.0, voltage_tolerance=0.2)
    with pytest.raises(DomainError):
        ft.voltage_factor(400.0, edition="2009")
