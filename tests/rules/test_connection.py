"""rules.connection: which connection to make, star-delta starting, locked-rotor current."""

from machinecheck.rules import connection
from rules.pairs import by_code, records

DELTA_STAR = {"frequency": "50 Hz", "voltage": ["400 V", "690 V"], "connection": ["delta", "star"],
              "current": ["100 A", "58 A"], "power": "55 kW", "speed": "1480 rpm"}


def test_delta_at_the_supply_voltage_allows_star_delta_starting():
    # Star-delta starting runs the winding in delta at the supply voltage (common practice, no
    # published source).
    found = by_code(connection.check(*records(DELTA_STAR, dict(frequency="50 Hz", voltage="400 V",
                                                              standard="IEC"))))
    assert found["connection"].message.startswith("connect delta 400 V, 100.0 A rated (not star 690 V)")
    assert found["star-delta"].message.startswith("star-delta starting possible")


def test_star_at_the_supply_voltage_rules_out_star_delta_starting():
    found = by_code(connection.check(*records(DELTA_STAR, dict(frequency="50 Hz", voltage="690 V",
                                                              standard="IEC"))))
    assert found["connection"].message.startswith("connect star 690 V")
    assert found["star-delta"].message.startswith("no star-delta starting")


def test_locked_rotor_current_from_the_starting_ratio():
    # Ia/In 7 x 100 A = 700 A at rated flux (k = 1) (common practice, no published source).
    plate = {**DELTA_STAR, "starting_current_ratio": 7}
    found = by_code(connection.check(*records(plate, dict(frequency="50 Hz", voltage="400 V",
                                                         standard="IEC"))))
    message = found["locked-rotor-current"].message
    assert message.startswith("locked-rotor current at the site about 700 A (Ia/In 7, scaled by k = 1.000)")


def test_nothing_on_a_supply_the_machine_cannot_use():
    assert connection.check(*records(DELTA_STAR, dict(frequency="50 Hz", voltage="230 V",
                                                      phases=1, standard="IEC"))) == ()
