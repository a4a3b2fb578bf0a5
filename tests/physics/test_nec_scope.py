"""physics.nec: the scope of NEC 430.6(A)(1), the synchronous footnote, Table 430.249; and the
nominal-frequency and slip-tolerance constants."""

import pytest

from machinecheck.physics import constants, nec


@pytest.mark.parametrize(("pf", "multiplier"), [(1.0, 1.0), (0.9, 1.1), (0.8, 1.25),
                                                (0.85, None), (0.95, None), (0.7, None)])
def test_synchronous_multipliers_only_at_the_footnote_power_factors(pf, multiplier):
    # [NFPA 70-2008 Table 430.250] footnote: x1.1 at 90 %, x1.25 at 80 % power factor.
    assert nec.sync_multiplier(pf) == multiplier


def test_a_power_factor_between_footnote_values_has_no_table_current():
    # 100 hp 460 V synchronous, unity 101 A [NFPA 70-2008 Table 430.250]; 0.85 PF: none.
    assert nec.table_current(100, 460, 3, synchronous=True, power_factor=0.85) is None
    assert nec.table_current(100, 460, 3, synchronous=True, power_factor=0.9) == (
        pytest.approx(111.1), 100)


@pytest.mark.parametrize(("hp", "volts", "amps"), [(0.5, 115, 4.0), (10, 230, 24),
                                                   (10, 460, 12), (100, 2300, 23)])
def test_two_phase_table(hp, volts, amps):
    # [NFPA 70-2008 Table 430.249], two-phase four-wire motors.
    assert nec.table_current(hp, volts, 2) == (amps, hp)


@pytest.mark.parametrize(("n_s", "multispeed", "applies"), [
    (1800, False, True), (1200, False, True), (1000, False, False), (900, False, False),
    (1800, True, False)])
def test_the_scope_of_the_table_current(n_s, multispeed, applies):
    # [NFPA 70-2023] 430.6(A)(1): not for motors built for less than 1200 rpm, nor multispeed.
    assert (nec.nameplate_reason(n_s, multispeed) is None) is applies


@pytest.mark.parametrize(("site_hz", "rated_hz", "change"), [
    (47, 50, False), (52, 50, False), (58, 60, False), (62, 60, False), (60, 50, True),
    (50, 60, True), (25, 50, True), (400, 400, False)])
def test_only_a_change_of_nominal_frequency_re_rates(site_hz, rated_hz, change):
    # re-rating is for 50 <-> 60 Hz; off-nominal values are judged in the zones
    # [IEC 60034-1:2022 §7.3] (the 8 % reach is common practice, no published source).
    assert constants.is_nominal_change(site_hz, rated_hz) is change


def test_slip_tolerance_by_size():
    # [IEC 60034-1:2022] tolerance table: slip +-30 % below 1 kW, +-20 % from 1 kW.
    assert constants.slip_tolerance(750.0) == 0.30
    assert constants.slip_tolerance(1000.0) == 0.20
