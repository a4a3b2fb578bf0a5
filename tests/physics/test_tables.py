import pytest

from machinecheck.errors import DomainError
from machinecheck.physics import loads, nec, starting


@pytest.mark.parametrize("hp,volts,amps", [
    # [NFPA 70:2008 Table 430.250]
    (10, 460, 14), (10, 230, 28), (10, 200, 32.2), (10, 208, 30.8), (50, 460, 65),
    (100, 460, 124), (1, 115, 8.4), (0.5, 575, 0.9), (200, 2300, 49), (500, 460, 590),
])
def test_nec_three_phase_table(hp, volts, amps):
    assert nec.table_current(hp, volts)[0] == pytest.approx(amps)


def test_nec_system_ranges_use_motor_columns():
    # Table 430.250 heading: currents may be used for 440-480 V systems (confirmed).
    assert nec.table_current(10, 480)[0] == pytest.approx(14)


@pytest.mark.parametrize("hp,volts,amps", [
    # [NFPA 70:2008 Table 430.248], single-phase
    (1, 115, 16), (1, 230, 8.0), (5, 230, 28), (10, 208, 55.0), (0.5, 115, 9.8),
])
def test_nec_single_phase_table(hp, volts, amps):
    assert nec.table_current(hp, volts, phases=1)[0] == pytest.approx(amps)


@pytest.mark.parametrize("pf,amps", [(1.0, 52), (0.9, 57.2), (0.8, 65)])
def test_nec_synchronous_multipliers(pf, amps):
    # Table 430.250 synchronous, 50 hp 460 V unity PF 52 A; x1.1 at 0.9, x1.25 at 0.8.
    assert nec.table_current(50, 460, synchronous=True, power_factor=pf)[0] == pytest.approx(amps)


@pytest.mark.parametrize("kw,hp", [
    # kW to hp rounded up to the next table size, [NFPA 70:2008 §430.6(A)(1)] read with field
    # practice: 5 kW -> 6.7 hp -> 7.5 hp. 7.5 kW = 10.06 hp is taken as
    # 10 hp (its metric twin; common practice, no published source).
    (5, 7.5), (11, 15), (18.5, 25), (7.5, 10), (4, 7.5), (22, 30),
])
def test_kw_plates_round_up_to_standard_hp(kw, hp):
    assert nec.standard_hp(kw / 0.7457) == hp


def test_nec_no_column_for_400v():
    assert nec.table_current(10, 400) is None


@pytest.mark.parametrize("value,letter", [
    # [NEMA MG 1-2016 §10.37.2] code letter bands: lower figure inclusive.
    (3.14, "A"), (3.15, "B"), (6.29, "G"), (6.3, "H"), (7.09, "H"), (7.1, "J"), (22.4, "V"),
])
def test_code_letter_bands(value, letter):
    assert starting.code_letter_for(value) == letter


def test_code_letter_current_worked_value():
    # Code G is 5.6-6.29 kVA/hp [NEMA MG 1-2016 §10.37.2]: 10 hp, 460 V -> 70.3 A to 79.1 A
    # (I = kVA / (sqrt3 V), worked by hand).
    low, high = starting.locked_rotor_current_from_code("G", 10, 460)
    assert low == pytest.approx(70.3, abs=0.1)
    assert high == pytest.approx(79.1, abs=0.1)


def test_locked_rotor_current_60hz_motor_on_50hz():
    # Locked-rotor current ~ V/f at the same impedance in per unit of frequency: a 60 Hz motor on
    # 50 Hz at full voltage draws about 120 % (common practice, first order).
    assert starting.locked_rotor_current_at_site(100, 1.2) == pytest.approx(120)


@pytest.mark.parametrize("ratio,flow,head,power", [
    # affinity laws [Karassik 2008 ch. 2]: 50 -> 60 Hz and 60 -> 50 Hz
    (1.2, 1.2, 1.44, 1.728), (5 / 6, 0.833, 0.694, 0.579), (1.1, 1.1, 1.21, 1.331),
])
def test_affinity_ratios(ratio, flow, head, power):
    q, h, p = loads.affinity(ratio)
    assert (q, h, p) == pytest.approx((flow, head, power), abs=1e-3)


def test_affinity_worked_example():
    # Affinity laws [Karassik 2008 ch. 2]: 100 gpm, 50 ft, 10 hp at 1750 rpm -> 1450 rpm:
    # 82.86 gpm, 34.33 ft, 5.69 hp.
    q, h, p = loads.affinity(1450 / 1750)
    assert (100 * q, 50 * h, 10 * p) == pytest.approx((82.86, 34.33, 5.69), abs=0.01)


def test_constant_torque_power_follows_speed():
    # constant-torque loads: power = torque x speed, so power ~ speed (definition of power).
    assert loads.power_ratio("constant-torque", 1.2) == pytest.approx(1.2)
    assert loads.power_ratio("constant-power", 0.8) == pytest.approx(1.0)


@pytest.mark.parametrize("load_type", loads.LOAD_TYPES)
def test_torque_curve_follows_the_torque_ratio(load_type):
    # the solvers' curve is the same law as torque_ratio (affinity laws, [Karassik 2008 ch. 2])
    curve = loads.torque_curve(load_type, 200.0, 1480.0)
    for n in (100.0, 740.0, 1480.0, 1600.0, 1800.0):
        assert curve(n) == pytest.approx(200.0 * loads.torque_ratio(load_type, n / 1480.0))


def test_torque_curve_at_standstill():
    assert loads.torque_curve("centrifugal", 200.0, 1480.0)(0.0) == 0.0
    assert loads.torque_curve("constant-torque", 200.0, 1480.0)(0.0) == 200.0
    assert loads.torque_curve("constant-power", 200.0, 1480.0)(0.0) == float("inf")
    with pytest.raises(DomainError):
        loads.torque_curve("pulsating", 200.0, 1480.0)
