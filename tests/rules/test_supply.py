"""rules.supply: the terminal voltage and frequency against the standard's tolerance."""

import pytest

from machinecheck.rules import supply
from rules.pairs import by_code, records

IEC_11KW = {"frequency": "50 Hz", "voltage": "400 V", "power": "11 kW", "speed": "1460 rpm"}
NEMA_50HP = {"frequency": "60 Hz", "voltage": "460 V", "power": "50 hp", "speed": "1775 rpm"}
NEMA_5HP = {"frequency": "60 Hz", "voltage": "230 V", "power": "5 hp", "speed": "1745 rpm"}


def _iec(volts):
    return by_code(supply.check(*records(IEC_11KW, dict(frequency="50 Hz", voltage=volts,
                                                        standard="IEC"))))


def test_rated_voltage_finds_nothing():
    # IEC 60034-1 zone A holds the rated point itself [IEC 60034-1:2022 §7.3].
    assert _iec("400 V") == {}


@pytest.mark.parametrize(("volts", "code", "severity"), [
    ("418 V", "tolerance-zone-a", "info"),       # +4.5 %: zone A is +-5 % [IEC 60034-1:2022 §7.3]
    ("425 V", "tolerance-zone-b", "warning"),    # +6.25 %: zone B is +-10 % [IEC 60034-1:2022 §7.3]
    ("445 V", "outside-tolerance", "problem"),   # +11.3 %: outside zone B [IEC 60034-1:2022 §7.3]
])
def test_iec_zones(volts, code, severity):
    found = _iec(volts)
    assert list(found) == [code]
    assert found[code].severity == severity


def test_460v_motor_on_480v_is_a_normal_pairing_within_nema_limits():
    # ANSI C84.1: 480 V systems feed 460 V utilization equipment [ANSI C84.1-2020 Table 1];
    # +4.3 % is within +-10 % [NEMA MG 1-2016 §12.44].
    found = by_code(supply.check(*records(NEMA_50HP, dict(frequency="60 Hz", voltage="480 V",
                                                          standard="NEMA"))))
    assert found["normal-pairing"].severity == "info"
    assert found["within-tolerance"].severity == "info"
    assert "4.3 % of 10 %" in found["within-tolerance"].message


def test_230v_motor_on_208v_is_near_the_nema_limit():
    # -9.6 % is inside +-10 % but near it [NEMA MG 1-2016 §12.44]; torque ~ V^2: 0.904^2 = 0.82
    # [NEMA MG 1-2016 §12.44.2].
    found = by_code(supply.check(*records(NEMA_5HP, dict(frequency="60 Hz", voltage="208 V",
                                                         standard="NEMA"))))
    warning = found["near-tolerance-limit"]
    assert warning.severity == "warning"
    assert "Torque about 0.82 of rated" in warning.message
    assert "current about 1.11 x" in warning.message


def test_nema_outside_ten_percent_is_a_problem():
    # +13 % is outside +-10 % [NEMA MG 1-2016 §12.44].
    found = by_code(supply.check(*records(NEMA_50HP, dict(frequency="60 Hz", voltage="520 V",
                                                          standard="NEMA"))))
    assert found["outside-tolerance"].severity == "problem"


def test_the_worst_end_of_a_measured_range_is_judged():
    # 390-425 V around 400 V: the top end is 425 / 400 - 1 = +6.25 %, zone B
    # [IEC 60034-1:2022 §7.3]; shown to one decimal.
    found = by_code(supply.check(*records(IEC_11KW, dict(
        frequency="50 Hz", voltage="400 V", voltage_range="390-425 V", standard="IEC"))))
    assert found["tolerance-zone-b"].severity == "warning"
    assert "worst end of the site's voltage range dV +6.2 %" in found["tolerance-zone-b"].message


def test_a_rerated_machine_is_judged_by_the_frequency_rule_instead():
    assert supply.check(*records(NEMA_50HP, dict(frequency="50 Hz", voltage="400 V",
                                                 standard="IEC"))) == ()
