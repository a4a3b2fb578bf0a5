import pytest

from machinecheck.errors import DomainError
from machinecheck.physics import speed as sp

# Synchronous speed n_s = 120 f / p [Chapman 2005 ch. 3]; each value worked from it.
SYNC_TABLE = [
    (2, 3000, 3600), (4, 1500, 1800), (6, 1000, 1200), (8, 750, 900), (10, 600, 720),
    (12, 500, 600), (16, 375, 450), (20, 300, 360),
]


@pytest.mark.parametrize("poles,at50,at60", SYNC_TABLE)
def test_synchronous_speed_table(poles, at50, at60):
    assert sp.synchronous_speed(50.0, poles) == pytest.approx(at50)
    assert sp.synchronous_speed(60.0, poles) == pytest.approx(at60)


@pytest.mark.parametrize("poles", [14, 18])
def test_synchronous_speed_other_even_counts(poles):
    # 120 f / p for the rows the table skips (arithmetic of the definition).
    assert sp.synchronous_speed(50.0, poles) == pytest.approx(6000.0 / poles)


@pytest.mark.parametrize("poles", [0, 3, -4, 5])
def test_synchronous_speed_rejects_bad_poles(poles):
    with pytest.raises(DomainError):
        sp.synchronous_speed(50.0, poles)


# Typical full-load speeds -> poles: the next synchronous speed above the rated speed (common
# practice, no published source).
@pytest.mark.parametrize("speed,frequency,poles", [
    (3500, 60, 2), (1770, 60, 4), (1170, 60, 6), (870, 60, 8), (690, 60, 10),
    (2900, 50, 2), (1450, 50, 4), (960, 50, 6), (720, 50, 8), (575, 50, 10),
    (2950, 50, 2), (1460, 50, 4), (1775, 60, 4),
])
def test_poles_from_typical_full_load_speed(speed, frequency, poles):
    assert sp.poles_from_speed(speed, frequency) == poles


@pytest.mark.parametrize("speed,frequency", [(1500, 50), (1800, 60), (1600, 50), (1200, 50)])
def test_poles_rejects_no_slip_or_excess_slip(speed, frequency):
    # 1500 rpm at 50 Hz: no slip (a 4-pole synchronous speed). 1200 rpm at 50 Hz: 20 % slip
    # below 1500 rpm. Rule: reject implied slip <= 0 or > 10 % (common practice, no published
    # source).
    with pytest.raises(DomainError):
        sp.poles_from_speed(speed, frequency)


def test_poles_of_synchronous_machine():
    assert sp.poles_from_speed(1800, 60, synchronous=True) == 4
    with pytest.raises(DomainError):
        sp.poles_from_speed(1750, 60, synchronous=True)


def test_slip_worked_examples():
    # s = (n_s - n) / n_s [Chapman 2005 ch. 7]: 4-pole 60 Hz at 1746 rpm -> s = 3.0 %;
    # 1500/1450 -> 3.33 %; 1800/1750 -> 2.78 %.
    assert sp.slip(1800, 1746) == pytest.approx(0.030)
    assert sp.slip(1500, 1450) == pytest.approx(0.0333, abs=1e-4)
    assert sp.slip(1800, 1750) == pytest.approx(0.0278, abs=1e-4)
    # 1460 rpm at 50 Hz is 40 / 1500 = 2.7 % slip (same definition)
    assert sp.slip(1500, 1460) == pytest.approx(0.0267, abs=1e-4)


def test_slip_rpm_kept_at_constant_flux():
    # At rated flux and torque the slip in rpm is kept [Chapman 2005 ch. 7] (from memory): a
    # 1460 rpm 50 Hz motor on correct-V/f 60 Hz runs about 1800 - 40 = 1760 rpm, not 1752.
    assert sp.running_speed(1800, 40, torque_ratio=1.0, flux_ratio=1.0) == pytest.approx(1760)


def test_slip_scales_with_inverse_square_of_flux():
    # slip_rpm ~ T / (V/f)^2, from torque ~ V^2/f^2 [NEMA MG 1-2016 §12.44.2]: a 230 V motor on
    # 208 V (k = 0.904) slips 1 / 0.904^2 = 1.22 x, about 22 % more.
    k = 208 / 230
    n = sp.running_speed(1800, 50, flux_ratio=k)
    assert (1800 - n) / 50 == pytest.approx(1.22, abs=0.01)


def test_slip_proportional_to_torque():
    # linear low-slip region (Chapman, Electric Machinery Fundamentals, sec. 6.5).
    assert sp.running_speed(1500, 40, torque_ratio=0.5) == pytest.approx(1480)
    assert sp.running_speed(1500, 40, torque_ratio=0.0) == pytest.approx(1500)


@pytest.mark.parametrize("exponent", [2, 0, -1])
@pytest.mark.parametrize("load_nm,k", [(50.0, 1.0), (71.6, 0.9), (20.0, 1.1), (120.0, 0.95)])
def test_slip_rule_speed_is_where_the_rule_meets_the_load(exponent, load_nm, k):
    # The slip rule n = n_s - slip_rated (T/T_rated) / k^2 (NEMA MG 1 12.44.2 torque ~ V^2/f^2,
    # Chapman sec. 6.5) met by a load T0 (n / n0)^e: the closed form must satisfy the rule.
    n_s, slip_rated, t_rated, n0 = 1800.0, 40.0, 71.6, 1760.0
    n = sp.slip_rule_speed(n_s, slip_rated, t_rated, k, load_nm, exponent, n0)
    load = load_nm * (n / n0) ** exponent
    assert n == pytest.approx(sp.running_speed(n_s, slip_rated, torque_ratio=load / t_rated,
                                               flux_ratio=k), abs=1e-9)
    assert 0.5 * n_s < n <= n_s


def test_slip_rule_speed_at_rated_load_is_rated_speed():
    # At rated torque, rated flux and the rated frequency the rule returns the plate speed
    # (a 4-pole 60 Hz motor stamped 1760 rpm; by construction of the rule).
    t_rated = sp.shaft_torque(11000, 1760)
    for exponent in (2, 0, -1):
        assert sp.slip_rule_speed(1800, 40, t_rated, 1.0, t_rated, exponent, 1760) == (
            pytest.approx(1760))


def test_slip_rule_speed_stalls_far_from_the_low_slip_region():
    # A constant-power load the rule cannot meet (no real root), and a constant-torque load
    # that would pull the speed under half of n_s: both read as a stall (common practice).
    assert sp.slip_rule_speed(1800, 40, 10.0, 0.5, 30.0, -1, 1760) is None
    assert sp.slip_rule_speed(1800, 40, 10.0, 1.0, 300.0, 0, 1760) is None
    with pytest.raises(DomainError):
        sp.slip_rule_speed(1800, 40, 10.0, 1.0, 10.0, 3, 1760)
    with pytest.raises(DomainError):
        sp.slip_rule_speed(1800, 40, 10.0, 0.0, 10.0, 0, 1760)


def test_shaft_torque_identity():
    # T [N m] = 9550 P [kW] / n [rpm] (unit identity, from memory).
    assert sp.shaft_torque(11000, 1460) == pytest.approx(9549.3 * 11 / 1460, rel=1e-4)


def test_a_design_d_slip_up_to_13_percent_gives_the_poles():
    # NEMA Design D: 5-13 % full-load slip [NEMA MG 1-2016 §1.19.1.4] (from memory);
    # 1575 rpm at 60 Hz is 12.5 % below 1800 rpm: 4 poles.
    assert sp.poles_from_speed(1575, 60, design_letter="D") == 4
    with pytest.raises(DomainError):
        sp.poles_from_speed(1575, 60)  # 12.5 % is not a general-purpose motor's slip
    with pytest.raises(DomainError):
        sp.poles_from_speed(1550, 60, design_letter="D")  # 13.9 %
