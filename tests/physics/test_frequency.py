import pytest

from machinecheck.physics import frequency as fq


def test_flux_400_50_equals_480_60():
    # 400/50 = 480/60 = 8.0 V/Hz: identical flux (flux ~ V/f, [Chapman 2005 ch. 7]).
    assert fq.flux_ratio(480, 400, 60, 50) == pytest.approx(1.0)


def test_flux_460_60_on_400_50():
    # 460 V 60 Hz winding on 400 V 50 Hz: 8.0 / 7.67 V/Hz = +4.3 % flux [Chapman 2005 ch. 7].
    assert fq.flux_ratio(400, 460, 50, 60) == pytest.approx(1.0435, abs=1e-4)


def test_flux_460_60_on_415_50():
    # 8.3 vs 7.67 V/Hz -> +8 % (flux ~ V/f, [Chapman 2005 ch. 7]).
    assert fq.flux_ratio(415, 460, 50, 60) == pytest.approx(1.083, abs=1e-3)


def test_380_50_motor_on_460_60_not_underfluxed():
    # 7.67 vs 7.6 V/Hz, essentially rated flux (flux ~ V/f, [Chapman 2005 ch. 7]).
    assert fq.flux_ratio(460, 380, 60, 50) == pytest.approx(1.0088, abs=1e-3)


def test_torque_capability_50hz_motor_on_60hz_same_voltage():
    # (0.833)^2 = 0.69: torque ~ V^2/f^2 [NEMA MG 1-2016 §12.44.2].
    k = fq.flux_ratio(400, 400, 60, 50)
    assert fq.torque_capability(k) == pytest.approx(0.694, abs=1e-3)


def test_output_60_to_50_at_constant_flux_is_five_sixths():
    # At constant V/f the torque is kept and the speed falls to 5/6: output 5/6 of nameplate
    # [Chapman 2005 ch. 7].
    assert fq.frequency_output_factor(50 / 60, 1.0) == pytest.approx(5 / 6)


def test_output_50_to_60_same_voltage_keeps_rated_kw():
    # 400 V at 60 Hz: torque x 0.833, speed x 1.2, so about the 50 Hz nameplate power
    # (common practice, no published source).
    assert fq.frequency_output_factor(1.2, 400 / 480) == pytest.approx(1.0)


def test_output_never_above_rated_on_frequency_rise():
    assert fq.frequency_output_factor(1.2, 1.0) == 1.0


@pytest.mark.parametrize("supply_v,tefc", [(380, 0.80), (400, 0.75), (415, 0.70)])
def test_rerating_reproduces_maker_table(supply_v, tefc):
    # Common practice: a motor maker's table for 460 V 60 Hz TEFC motors on 50 Hz (practice
    # notes Q3): 0.80 / 0.75 / 0.70. Our factors are fitted to it; the table was read from a
    # published note, so +-0.015.
    k = fq.flux_ratio(supply_v, 460, 50, 60)
    factor = (fq.frequency_output_factor(50 / 60, k) * fq.overflux_derating(k)
              * fq.cooling_derating(50 / 60, "IC411"))
    assert factor == pytest.approx(tefc, abs=0.015)


def test_cooling_not_derated_for_separate_fan_or_speed_rise():
    assert fq.cooling_derating(5 / 6, "IC416") == 1.0
    assert fq.cooling_derating(1.2, "IC411") == 1.0
