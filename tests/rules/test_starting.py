"""rules.starting: the start's findings from the Starting record."""

import dataclasses

import pytest
from helpers import machine, site

from machinecheck.engine.pipeline import assess
from machinecheck.rules import starting as rule

PLATE = {"frequency": "60 Hz", "voltage": "460 V", "current": "58 A", "power": "50 hp",
         "speed": "1775 rpm", "power_factor": 0.86, "efficiency": "94.5 %",
         "locked_rotor_torque": "220 %", "breakdown_torque": "260 %", "inertia": "0.4 kg m2"}
LOAD = {"type": "centrifugal", "power": "38 hp", "inertia": "1.2 kg m2",
        "breakaway_torque": "10 %"}


@pytest.fixture(scope="module")
def pair():
    m = machine(PLATE, code_letter="G", load=LOAD, start={"method": "direct-on-line",
                                                          "trip_class": "10"},
                feeder={"length": "40 m", "size": "2 AWG", "material": "copper"})
    s = site(frequency="60 Hz", voltage="480 V", standard="NEMA",
             source={"kind": "transformer", "rating": "1000 kVA", "impedance": "5.75 %"})
    return assess(m, s)


def found(a, **changes):
    return {f.code: f for f in rule.check(a.supply, dataclasses.replace(a.starting, **changes))}


def test_a_good_start_has_no_findings(pair):
    s = pair.starting
    assert s.will_start is True and s.acceleration_time_s > 0
    assert s.trip_time_cold_s > s.acceleration_time_s
    assert found(pair) == {}
    assert rule.check(pair.supply, None) == ()


def test_will_not_start(pair):
    f = found(pair, will_start=False, breakaway_margin=-0.2, starting_torque_nm=100.0,
              breakaway_torque_nm=125.0)
    assert f["will-not-start"].severity == "problem"
    assert "below the load's breakaway torque 125 N m" in f["will-not-start"].message
    stall = found(pair, will_start=False, stall_speed_rpm=900.0, breakaway_margin=0.5)
    assert "900 rpm" in stall["will-not-start"].message


def test_small_torque_margin_warns(pair):
    # the 10 % margin over breakaway is common practice, no published source
    assert found(pair, breakaway_margin=0.05)["start-torque-margin"].severity == "warning"
    assert "start-torque-margin" not in found(pair, breakaway_margin=0.15)


def test_estimated_torque_is_only_information(pair):
    f = found(pair, starting_torque_basis="estimate from the equivalent circuit",
              breakaway_margin=-0.1, will_start=None)
    assert f["start-torque-estimate"].severity == "info"


def test_dip_exceeds_limit_names_the_smallest_source(pair):
    f = found(pair, dip_terminals=0.2, dip_limit=0.15, minimum_source_va=1.5e6,
              minimum_source_kind="transformer")
    d = f["dip-exceeds-limit"]
    assert d.severity == "warning"
    assert "20.0 %" in d.message and "1500 kVA" in d.message
    assert "dip-exceeds-limit" not in found(pair, dip_terminals=0.15, dip_limit=0.15)


def test_overload_trips_before_acceleration_ends(pair):
    f = found(pair, acceleration_time_s=5.0, trip_time_cold_s=4.0, trip_time_hot_s=1.0)
    assert f["overload-trips-before-acceleration-ends"].severity == "problem"
    hot = found(pair, acceleration_time_s=2.0, trip_time_cold_s=4.0, trip_time_hot_s=1.5)
    assert hot["overload-trips-hot-start"].severity == "warning"
    assert "overload-trips-hot-start" not in found(pair, acceleration_time_s=1.0,
                                                   trip_time_cold_s=4.0, trip_time_hot_s=1.5)


def test_running_drop_and_terminal_voltage(pair):
    d = pair.starting.running_drop
    over = dataclasses.replace(d, drop=0.06, limit=0.05)
    assert found(pair, running_drop=over)["voltage-drop-exceeds-limit"].severity == "warning"
    outside = dataclasses.replace(pair.supply, tolerance=dataclasses.replace(
        pair.supply.tolerance, within=False))
    f = {x.code: x for x in rule.check(outside, pair.starting)}
    assert f["terminal-voltage-out-of-zone"].severity == "problem"
    none = dataclasses.replace(d, terminal_voltage_v=0.0)
    assert found(pair, running_drop=none)["terminal-voltage-out-of-zone"].severity == "problem"


def test_prime_mover_power(pair):
    gen = dataclasses.replace(pair.starting.source, kind="generator")
    f = found(pair, source=gen, starting_active_power_w=120e3, prime_mover_power_w=100e3)
    assert f["prime-mover-starting-power"].severity == "warning"
    assert "prime-mover-starting-power" not in found(
        pair, source=gen, starting_active_power_w=80e3, prime_mover_power_w=100e3)
