import math

import pytest

from machinecheck.errors import DomainError
from machinecheck.physics import drive


def test_460v_60hz_motor_on_400v_drive_weakens_above_52hz():
    # Common practice (drive makers' application guides): the output voltage is capped at the
    # input, so field weakening starts at 60 x 400/460 =
    # 52.17 Hz [Chapman 5th ed. §6.9].
    assert drive.field_weakening_frequency_hz(460, 60, 400) == pytest.approx(52.17, abs=0.01)
    torque, power = drive.kept_output(60, 460, 60, 400)
    assert torque == pytest.approx(0.8696, abs=1e-4)
    assert power == pytest.approx(0.8696, abs=1e-4)
    # Below the knee the motor keeps rated torque and power ~ f.
    torque, power = drive.kept_output(50, 460, 60, 400)
    assert torque == 1.0
    assert power == pytest.approx(50 / 60)


def test_full_voltage_drive_keeps_rated_output():
    assert drive.field_weakening_frequency_hz(400, 50, 400) == pytest.approx(50)
    assert drive.kept_output(50, 400, 50, 400) == (1.0, 1.0)
    # Field weakening above base: constant power, torque ~ 1/f [Chapman 5th ed. §6.9].
    torque, power = drive.kept_output(100, 400, 50, 400)
    assert torque == pytest.approx(0.5)
    assert power == pytest.approx(1.0)


def test_base_setting_is_the_motors_vf():
    # Arithmetic: 400/50 = 480/60 = 8.0 V/Hz [Chapman 5th ed. §6.9].
    assert drive.volts_per_hertz(400, 50) == pytest.approx(8.0)
    assert drive.volts_per_hertz(480, 60) == pytest.approx(8.0)


def test_derates_common_practice():
    # Common practice, no published source: 1 %/K above 40 deg C, 1 %/100 m above 1000 m.
    assert drive.ambient_derating(40) == 1.0
    assert drive.ambient_derating(50) == pytest.approx(0.90)
    assert drive.altitude_derating(1000) == 1.0
    assert drive.altitude_derating(2000) == pytest.approx(0.90)
    with pytest.raises(DomainError):
        drive.ambient_derating(200)


def test_single_phase_input_doubles_at_most():
    # Common practice (drive makers' application guides): single-phase input to a three-phase
    # drive, rate it sqrt(3) to 2 x the motor current.
    low, high = drive.required_drive_current_a(10.0, ambient_degc=30, altitude_m=0,
                                               single_phase_input=True)
    assert low == pytest.approx(10 * math.sqrt(3))
    assert high == pytest.approx(20.0)
    low, high = drive.required_drive_current_a(10.0, ambient_degc=45, altitude_m=1500,
                                               single_phase_input=False)
    assert low == high == pytest.approx(10 / (0.95 * 0.95))
