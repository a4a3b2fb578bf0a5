"""The engine's records: frozen, built once, supply and terminal voltage kept apart."""

import dataclasses

import pytest
from helpers import machine, site

from machinecheck.engine import rating, supply
from machinecheck.engine.assessment import Finding, verdict_of
from machinecheck.engine.pipeline import assess, assess_all

SINGLE = {"frequency": "50 Hz", "voltage": "230 V", "power": "1.5 kW", "speed": "1430 rpm"}
NEMA_50HP = {"frequency": "60 Hz", "voltage": "460 V", "power": "50 hp", "speed": "1775 rpm",
             "efficiency": 0.93, "power_factor": 0.85}


def test_records_cannot_be_changed():
    a = assess(machine(NEMA_50HP), site(frequency="60 Hz", voltage="460 V", standard="NEMA"))
    for record, name in ((a, "verdict"), (a.supply, "terminal_voltage_v"),
                         (a.choice, "flux_ratio"), (a.running, "expected_speed_rpm"),
                         (a.running.currents, "full_load_a"), (a.findings[0], "message")):
        with pytest.raises(dataclasses.FrozenInstanceError):
            setattr(record, name, None)
    assert isinstance(a.findings, tuple)


def test_supply_voltage_and_terminal_voltage_are_kept_apart():
    # A 230 V single-phase winding on a 400 V wye system is connected line-to-neutral:
    # 400 / sqrt(3) = 230.9 V [IEC 60038:2009 Table 1].
    m = machine(SINGLE, phases=1)
    a = assess(m, site(frequency="50 Hz", voltage="400 V", system="wye", wires=4, standard="IEC"))
    assert a.supply.supply_voltage_v == 400.0
    assert a.supply.terminal_voltage_v == pytest.approx(230.94, abs=0.01)
    assert a.supply.terminal_note == "line-to-neutral"
    assert a.choice.flux_ratio == pytest.approx(230.94 / 230, abs=1e-4)


def test_offers_of_a_four_wire_wye_system_to_a_single_phase_machine():
    offered = supply.offers(machine(SINGLE, phases=1),
                            site(frequency="50 Hz", voltage="400 V", system="wye", wires=4,
                                 standard="IEC"))
    assert [o.note for o in offered] == ["line-to-line", "line-to-neutral"]


def test_a_site_that_does_not_state_a_neutral_offers_line_to_line_only():
    # Nominal system voltages are line-to-line [IEC 60038:2009 Table 1]; a neutral is offered
    # only where the site has four wires.
    for fields in (dict(system="wye"), dict(system="wye", wires=3), dict()):
        offered = supply.offers(machine(SINGLE, phases=1),
                                site(frequency="50 Hz", voltage="400 V", standard="IEC",
                                     **fields))
        assert [o.note for o in offered] == ["line-to-line"], fields


def test_the_rating_set_for_the_site_frequency_is_chosen():
    # A dual-frequency plate is judged on its own 60 Hz set at a 60 Hz site, not re-rated
    # (re-rating applies outside the standard's frequency band, [NEMA MG 1-2016 §12.44]).
    m = machine([{"frequency": "50 Hz", "voltage": "400 V", "power": "11 kW",
                  "speed": "1460 rpm"},
                 {"frequency": "60 Hz", "voltage": "460 V", "power": "12.6 kW",
                  "speed": "1760 rpm"}])
    choice, _ = rating.choose(m, site(frequency="60 Hz", voltage="460 V", standard="NEMA"))
    assert choice.rating.frequency_hz == 60.0
    assert choice.flux_ratio == pytest.approx(1.0)


@pytest.mark.parametrize(("severities", "verdict"), [
    ((), "compatible"), (("info",), "compatible"), (("info", "warning"), "conditional"),
    (("warning", "problem", "info"), "incompatible"),
])
def test_the_worst_finding_gives_the_verdict(severities, verdict):
    # The verdict rule of docs/json.md: problem -> incompatible, warning -> conditional.
    assert verdict_of(Finding("x", s, "") for s in severities) == verdict


def test_working_is_written_only_when_asked_and_from_the_same_records():
    m, s = machine(NEMA_50HP), site(frequency="50 Hz", voltage="400 V", standard="IEC")
    plain, explained = assess(m, s), assess(m, s, explain=True)
    assert plain.working == ()
    assert plain.findings == explained.findings and plain.running == explained.running
    assert explained.working[0].startswith("rating set: 60 Hz (of 1)")
    n_s = explained.running.synchronous_speed_rpm
    assert explained.working[1].endswith(f"= {n_s:.0f} rpm")


def test_assess_all_keeps_machine_then_site_order_and_reports_progress():
    machines = [machine(NEMA_50HP, id="A"), machine(NEMA_50HP, id="B")]
    sites = [site(frequency="60 Hz", voltage="460 V", standard="NEMA", id="S1"),
             site(frequency="50 Hz", voltage="400 V", standard="IEC", id="S2")]
    ticks = []
    results = assess_all(machines, iter(sites), progress=lambda: ticks.append(1))
    assert [(a.machine.id, a.site.id) for a in results] == [
        ("A", "S1"), ("A", "S2"), ("B", "S1"), ("B", "S2")]
    assert len(ticks) == 2
