"""rules.frequency: re-rating on another nominal frequency: flux, output, speed."""

from machinecheck.rules import frequency
from rules.pairs import by_code, records

NEMA_50HP = {"frequency": "60 Hz", "voltage": "460 V", "power": "50 hp", "speed": "1775 rpm"}
IEC_11KW = {"frequency": "50 Hz", "voltage": "400 V", "power": "11 kW", "speed": "1460 rpm"}


def test_60hz_motor_on_400v_50hz_is_rerated_near_rated_flux():
    # k = (400 / 460) / (50 / 60) = 1.043; rated V/f at 50 Hz is 460 x 50/60 = 383 V
    # [Chapman 2005 ch. 7] (V/f proportional to flux).
    found = by_code(frequency.check(*records(NEMA_50HP, dict(frequency="50 Hz", voltage="400 V",
                                                            standard="IEC"))))
    change = found["frequency-change"]
    assert change.severity == "warning"
    assert "Flux k = 1.043 (400 V against the 383 V" in change.message
    assert "overflux" not in found and "underflux" not in found  # within +-5 %
    assert "60 Hz transformers" in found["other-equipment"].message


def test_50hz_motor_on_60hz_same_voltage_is_underfluxed_and_faster():
    # k = 1 / 1.2 = 0.833, torque ~ k^2 = 0.69 [NEMA MG 1-2016 §12.44.2]; 4 poles at 60 Hz
    # run up to 120 x 60 / 4 = 1800 rpm, 20 % faster [Chapman 2005 ch. 3] (n = 120 f / p).
    found = by_code(frequency.check(*records(IEC_11KW, dict(frequency="60 Hz", voltage="400 V",
                                                           standard="IEC"))))
    assert found["underflux"].severity == "warning"
    assert "k = 0.833" in found["underflux"].message and "about 0.69" in found["underflux"].message
    assert found["speed-increase"].severity == "warning"
    assert "20 % faster (up to 1800 rpm)" in found["speed-increase"].message
    assert "uprating-possible" not in found  # k < 1: no output to gain


def test_overflux_above_ten_percent_is_a_problem():
    # 460 V 60 Hz plate on 460 V 50 Hz: k = 1.2 (common practice limit +10 %, no published
    # source).
    found = by_code(frequency.check(*records(NEMA_50HP, dict(frequency="50 Hz", voltage="460 V",
                                                            standard="IEC"))))
    assert found["overflux"].severity == "problem"
    assert "overfluxed +20.0 %" in found["overflux"].message


def test_too_far_a_frequency_is_out_of_range():
    # 60 -> 25 Hz is 0.42 x: beyond a re-rating from the plate (common practice, no published
    # source).
    found = frequency.check(*records(NEMA_50HP, dict(frequency="25 Hz", voltage="200 V",
                                                     standard="IEC")))
    assert [(f.code, f.severity) for f in found] == [("frequency-out-of-range", "problem")]


def test_speed_limit_of_the_machine():
    # 6 poles at 60 Hz: 1200 rpm synchronous [Chapman 2005 ch. 3] against a 1100 rpm limit.
    plate = {"frequency": "50 Hz", "voltage": "400 V", "power": "30 kW", "speed": "980 rpm"}
    found = by_code(frequency.check(*records(plate, dict(frequency="60 Hz", voltage="480 V",
                                                        standard="NEMA"),
                                             max_speed="1100 rpm")))
    assert found["max-speed-exceeded"].severity == "problem"
    assert "1200 rpm exceeds the 1100 rpm limit of the machine" in found["max-speed-exceeded"].message


def test_rated_frequency_finds_nothing():
    assert frequency.check(*records(IEC_11KW, dict(frequency="50 Hz", voltage="400 V",
                                                   standard="IEC"))) == ()
