"""rules.load: the driven load at the site."""

from machinecheck.rules import load
from rules.pairs import by_code, records

NEMA_50HP = {"frequency": "60 Hz", "voltage": "460 V", "power": "50 hp", "speed": "1775 rpm",
             "efficiency": 0.93, "power_factor": 0.85}
IEC_11KW = {"frequency": "50 Hz", "voltage": "400 V", "power": "11 kW", "speed": "1460 rpm"}


def test_pump_moved_60_to_50hz_loses_head():
    # Affinity laws: flow ~ n, head ~ n^2 [Karassik 2008 ch. 2]: at 0.837 x speed the head is
    # 0.837^2 = 0.701 x.
    found = by_code(load.check(*records(NEMA_50HP, dict(frequency="50 Hz", voltage="380 V",
                                                       standard="IEC"),
                                        load={"type": "centrifugal", "power": "40 hp"})))
    assert found["load-fraction"].severity == "info"
    shortfall = found["duty-shortfall"]
    assert shortfall.severity == "warning"
    assert "0.837 x flow and 0.701 x head" in shortfall.message


def test_pump_moved_50_to_60hz_overloads_the_motor():
    # Power ~ n^3: 1.2^3 = 1.73 x the 10 kW drawn at 50 Hz is more than the 11 kW motor gives
    # [Karassik 2008 ch. 2].
    found = by_code(load.check(*records(IEC_11KW, dict(frequency="60 Hz", voltage="480 V",
                                                      standard="NEMA"),
                                        load={"type": "centrifugal", "power": "10 kW"})))
    assert found["load-overload"].severity == "problem"
    assert "trim the impeller" in found["load-overload"].message
    assert "power x1.7" in found["load-increase"].message


def test_light_load_is_an_info():
    # Half the rated output at the rated frequency: the load is judged at its own rated speed
    # (1460 rpm: the site frequency is the rated one), 5.5 / 11 = 50 %, 50 % left (common
    # practice, no published source: the load's duty point against the motor's output).
    found = by_code(load.check(*records(IEC_11KW, dict(frequency="50 Hz", voltage="400 V",
                                                      standard="IEC"),
                                        load={"type": "constant-torque", "power": "5.5 kW"})))
    assert list(found) == ["load-fraction"]
    assert ("needs 5.50 kW at 1460 rpm, 50 % of the 11.00 kW available at this site: 50 % "
            "margin left") in found["load-fraction"].message


def test_no_load_given_finds_nothing():
    assert load.check(*records(IEC_11KW, dict(frequency="50 Hz", voltage="400 V",
                                              standard="IEC"))) == ()
