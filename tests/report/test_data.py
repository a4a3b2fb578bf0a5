"""The result dict: a mapping of the engine's records to output units, rounded, computing nothing."""

import math

import pytest
from helpers import machine, site

from machinecheck.engine.pipeline import assess
from machinecheck.report.data import output_text, result_dict, site_row

NEMA_50HP = {"frequency": "60 Hz", "voltage": "460 V", "power": "50 hp", "speed": "1775 rpm",
             "efficiency": 0.93, "power_factor": 0.85, "current": "59 A"}


def _pair():
    return assess(machine(NEMA_50HP), site(frequency="60 Hz", voltage="480 V", standard="NEMA"))


def test_figures_are_the_records_in_output_units_and_rounded():
    a = _pair()
    data = result_dict(a)
    running, currents = a.running, a.running.currents
    assert data["synchronous_speed_rpm"] == round(running.synchronous_speed_rpm, 1)
    assert data["expected_speed_rpm"] == round(running.expected_speed_rpm, 1)
    assert data["available_power_kw"] == round(running.available_power_w / 1000.0, 2)
    assert data["rated_power_kw"] == round(running.rated_power_w / 1000.0, 2)
    assert data["full_load_current_a"] == round(currents.full_load_a, 1)
    assert data["flux_ratio"] == round(a.choice.flux_ratio, 4)
    assert data["supply_voltage_v"] == round(a.supply.terminal_voltage_v, 1)
    assert data["derating"] == {name: round(v, 4) for name, v in running.derates.factors}
    assert data["tolerance"]["standard"] == "NEMA"
    assert data["tolerance"]["voltage_deviation"] == round(a.supply.tolerance.voltage_deviation, 4)
    assert [f["code"] for f in data["findings"]] == [f.code for f in a.findings]
    assert "working" not in data


def test_conductor_current_is_the_engines_125_percent():
    # NFPA 70 430.22: conductors at 125 % of the Table 430.250 current; 50 hp at 460 V is 65 A
    # in [NFPA 70:2008 Table 430.250], so 81.25 A [NFPA 70:2008 §430.22].
    data = result_dict(_pair())
    assert data["code_current_a"] == pytest.approx(65.0)
    assert data["code_current_hp"] == 50
    assert data["conductor_current_a"] == pytest.approx(81.25)


def test_unknown_figures_stay_unknown():
    # a three-phase machine on a single-phase supply has no running figures
    a = assess(machine(NEMA_50HP), site(frequency="60 Hz", voltage="480 V", standard="NEMA",
                                        phases=1))
    data = result_dict(a)
    assert data["available_power_kw"] is None
    assert data["full_load_current_a"] is None
    assert data["load_power_kw"] is None
    assert output_text(a) == "-"
    assert site_row(a)[4:7] == ["-", "-", "-"]


def test_working_is_copied_when_asked():
    m, s = machine(NEMA_50HP), site(frequency="60 Hz", voltage="480 V", standard="NEMA")
    data = result_dict(assess(m, s, explain=True), explain=True)
    assert data["working"][0].startswith("rating set: 60 Hz")
    assert all(isinstance(line, str) for line in data["working"])


def test_rounding_keeps_floats_and_signs():
    a = _pair()
    data = result_dict(a)
    assert type(data["rating"]["frequency_hz"]) is float
    assert type(data["combined_derating"]) is float
    assert math.copysign(1.0, data["tolerance"]["frequency_deviation"]) == 1.0
