"""rules.generator: shaft speed, prime mover, conversion and output of a generator."""

from machinecheck.rules import generator
from rules.pairs import by_code, records

SET_60HZ = {"frequency": "60 Hz", "voltage": "480 V", "power": "500 kVA", "speed": "1800 rpm"}


def _found(supply, **machine_fields):
    return by_code(generator.check(*records(SET_60HZ, supply, kind="synchronous-generator",
                                            poles=4, **machine_fields)))


def test_60hz_set_on_50hz_needs_1500_rpm_and_a_reset():
    # n = 120 f / p = 120 x 50 / 4 = 1500 rpm [Chapman 2005 ch. 3]; at 400 V the rated current
    # gives 500 x 400 / 480 = 416.7 kVA [Chapman 2005 ch. 4] (S = sqrt(3) V I), and the shaft
    # fan's cooling factor (1500 / 1800)^0.25 = 0.955 (common practice, no published formula)
    # gives 398 kVA, 318 kW at 0.8 PF, 575 A.
    found = _found(dict(frequency="50 Hz", voltage="400 V", standard="IEC"))
    assert found["generator-speed"].message.endswith("4 poles: 1500 rpm")
    assert found["generator-conversion"].severity == "warning"
    assert "output at rated flux about 400 V" in found["generator-conversion"].message
    assert found["generator-output"].message.startswith("available about 398 kVA / 318 kW at 400 V, 575 A")
    assert found["generator-cooling"].severity == "warning"
    assert "cooling factor 0.955" in found["generator-cooling"].message


def test_prime_mover_too_slow_is_a_problem():
    # A 1500 rpm engine cannot give 1800 rpm for 60 Hz without its maker (common practice, no
    # published source).
    found = _found(dict(frequency="60 Hz", voltage="480 V", standard="NEMA"),
                   prime_mover_speed="1500 rpm")
    assert found["prime-mover-speed"].severity == "problem"


def test_prime_mover_run_slower_is_warned_with_its_power():
    # An 1800 rpm engine run at 1500 rpm gives about 1500 / 1800 = 0.83 of its power
    # (common practice, no published source).
    found = _found(dict(frequency="50 Hz", voltage="400 V", standard="IEC"),
                   prime_mover_speed="1800 rpm")
    assert found["prime-mover-speed"].severity == "warning"
    assert "about 0.83 of its power" in found["prime-mover-speed"].message


def test_motors_are_not_judged_here():
    plate = {"frequency": "60 Hz", "voltage": "460 V", "power": "50 hp", "speed": "1775 rpm"}
    assert generator.check(*records(plate, dict(frequency="60 Hz", voltage="460 V",
                                                standard="NEMA"))) == ()
