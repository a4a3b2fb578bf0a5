"""rules.phases: a three-phase machine needs three phases; single-phase machines elsewhere."""

from machinecheck.rules import phases
from rules.pairs import by_code, records

NEMA_50HP = {"frequency": "60 Hz", "voltage": "460 V", "power": "50 hp", "speed": "1775 rpm"}
SINGLE = {"frequency": "50 Hz", "voltage": "230 V", "power": "1.5 kW", "speed": "1430 rpm"}


def test_three_phase_machine_on_single_phase_supply_is_a_problem():
    # A three-phase winding cannot be fed from one phase without a converter
    # (common practice, no published source).
    found = by_code(phases.check(*records(NEMA_50HP, dict(frequency="60 Hz", voltage="240 V",
                                                          phases=1, standard="NEMA"))))
    assert found["phase-mismatch"].severity == "problem"
    assert "single-phase supply" in found["phase-mismatch"].message


def test_three_phase_machine_on_two_phase_supply_names_the_scott_t():
    # Two-phase (quadrature) to three-phase needs a Scott-T transformer
    # [Chapman 2005 App. A] (from memory).
    found = by_code(phases.check(*records(NEMA_50HP, dict(
        frequency="60 Hz", voltage="240 V", phases=2, system="quadrature", standard="NEMA"))))
    assert found["phase-mismatch"].severity == "problem"
    assert "Scott-T" in found["phase-mismatch"].message


def test_single_phase_machine_on_wye_is_connected_line_to_neutral():
    # 400 V wye gives 400 / sqrt(3) = 231 V line-to-neutral [IEC 60038:2009 Table 1]: the 230 V
    # single-phase winding goes line-to-neutral.
    found = by_code(phases.check(*records(SINGLE, dict(frequency="50 Hz", voltage="400 V",
                                                       system="wye", wires=4,
                                                       standard="IEC"),
                                          phases=1)))
    assert found["single-phase-connection"].severity == "info"
    assert found["single-phase-connection"].message.endswith("line-to-neutral at 231 V")


def test_single_phase_motor_on_another_frequency_is_warned():
    # A capacitor motor's capacitor and switch suit one frequency (common practice, no
    # published source).
    found = by_code(phases.check(*records(SINGLE, dict(frequency="60 Hz", voltage="230 V",
                                                       phases=1, standard="NEMA"),
                                          phases=1)))
    assert found["single-phase-frequency"].severity == "warning"


def test_three_phase_on_three_phase_finds_nothing():
    assert phases.check(*records(NEMA_50HP, dict(frequency="60 Hz", voltage="460 V",
                                                 standard="NEMA"))) == ()
