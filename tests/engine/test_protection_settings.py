"""Protection settings of whole pairs: NEC Article 430 on NEMA sites, IEC practice elsewhere."""

import math

import pytest
from helpers import machine, site

from machinecheck.engine.pipeline import assess

PLATE = {"frequency": "60 Hz", "voltage": "460 V", "current": "58 A", "power": "50 hp",
         "speed": "1775 rpm", "power_factor": 0.86, "efficiency": "94.5 %"}


def nema():
    return site(frequency="60 Hz", voltage="480 V", standard="NEMA",
                source={"kind": "transformer", "rating": "1000 kVA", "impedance": "5.75 %"})


def test_nec_settings_of_a_50hp_motor():
    a = assess(machine(PLATE, service_factor=1.15, start={"method": "direct-on-line"}), nema())
    p = a.protection
    assert p.code == "NEC" and p.edition == "2023" and "no edition given" in p.edition_note
    # Table 430.250 50 hp 460 V: 65 A [NFPA 70-2023]; 430.22: 125 %; 430.110(A): 115 %
    assert p.table_current_a == pytest.approx(65.0)
    assert p.conductor_ampacity.current_a == pytest.approx(81.25)
    assert p.disconnect.current_a == pytest.approx(74.75)
    # 430.32(A)(1): SF 1.15 -> 125 %; 430.32(C): 140 % [NFPA 70-2023]; the dial apart
    assert p.overload_maximum.current_a == pytest.approx(72.5)
    assert p.overload_maximum_will_not_start.current_a == pytest.approx(81.2)
    assert p.overload_dial.current_a == pytest.approx(58.0)
    assert p.overload_dial.clause == "common practice"
    devices = dict(p.devices)
    # Table 430.52(C)(1) [NFPA 70-2023]: 300/175/800/250 % for squirrel cage (not Design B
    # energy-efficient), next standard sizes per 240.6(A)
    assert devices["non-time-delay-fuse"].permitted_a == 200.0
    assert devices["dual-element-fuse"].permitted_a == 125.0
    assert devices["instantaneous-trip-breaker"].computed_a == pytest.approx(520.0)
    assert devices["inverse-time-breaker"].permitted_a == 175.0
    assert p.caution.startswith("Verify with the manufacturer")


def test_design_b_ie3_reads_the_energy_efficient_row():
    # Table 430.52(C)(1): instantaneous trip 1100 % for Design B energy-efficient [NFPA 70-2023]
    a = assess(machine(PLATE, design_letter="B", efficiency_class="IE3",
                       start={"method": "direct-on-line"}), nema())
    devices = dict(a.protection.devices)
    assert devices["instantaneous-trip-breaker"].percent == 1100.0
    # no service factor marked: 115 % [NFPA 70-2023 430.32(A)(1)]
    assert a.protection.overload_maximum.current_a == pytest.approx(1.15 * 58)


def test_iec_practice_sets_the_relay_to_rated_current():
    plate = dict(PLATE, frequency="50 Hz", voltage="400 V", current="98 A", power="55 kW",
                 speed="1480 rpm")
    a = assess(machine(plate, start={"method": "star-delta", "trip_class": "10"}),
               site(frequency="50 Hz", voltage="400 V", standard="IEC"))
    p = a.protection
    assert p.code == "IEC" and p.edition is None and p.devices == ()
    # star-delta relay in the phase windings: 1/sqrt(3) of the line current (common practice)
    assert p.overload_dial.current_a == pytest.approx(98 / math.sqrt(3))
    assert p.overload_maximum is None and p.conductor_ampacity is None
    assert p.trip_class == "10"


def test_no_protection_for_generators_or_without_a_supply_path():
    gen = machine({"frequency": "60 Hz", "voltage": "480 V", "power": "100 kVA",
                   "speed": "1800 rpm"}, kind="synchronous-generator")
    assert assess(gen, nema()).protection is None
    assert assess(gen, nema()).starting is None
    bare = assess(machine(PLATE), site(frequency="60 Hz", voltage="480 V", standard="NEMA"))
    assert bare.protection is None
