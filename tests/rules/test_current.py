"""rules.current: the nameplate cross-check and the code current for conductors."""

from machinecheck.rules import current
from rules.pairs import by_code, records

NEMA_50HP = {"frequency": "60 Hz", "voltage": "460 V", "power": "50 hp", "speed": "1775 rpm",
             "efficiency": 0.93, "power_factor": 0.85}
NEMA_SITE = dict(frequency="60 Hz", voltage="480 V", standard="NEMA")


def test_code_current_and_conductors_at_125_percent():
    # 50 hp 460 V three-phase: 65 A [NFPA 70:2008 Table 430.250]; conductors 1.25 x 65 =
    # 81.25 A [NFPA 70:2008 §430.22].
    found = by_code(current.check(*records(NEMA_50HP, NEMA_SITE)))
    message = found["code-current"].message
    assert "current 65 A (50 hp; table current: Table 430.250" in message
    assert "NFPA 70-2023] 430.6(A)(1)" in message
    assert "conductors at least 81.2 A (430.22)" in message


def test_plate_current_far_from_the_formula_is_warned():
    # P / (sqrt(3) V eta PF) = 37.3 kW / (sqrt(3) x 460 x 0.93 x 0.85) = 59.2 A; 80 A is 1.35 x
    # [Chapman 2005 §7.4] (input power of an induction motor).
    found = by_code(current.check(*records({**NEMA_50HP, "current": "80 A"}, NEMA_SITE)))
    assert found["current-mismatch"].severity == "warning"
    assert "80.0 A is 1.35 x" in found["current-mismatch"].message


def test_no_current_and_nothing_to_compute_it_from():
    plate = {"frequency": "60 Hz", "voltage": "460 V", "power": "50 hp", "speed": "1775 rpm"}
    found = by_code(current.check(*records(plate, dict(frequency="50 Hz", voltage="400 V",
                                                      standard="IEC"))))
    assert list(found) == ["current-unknown"]
