"""Nameplates that disagree with themselves are refused, saying which values and by how much;
multispeed and two-phase plates are accepted; ambiguous supply voltages must be said."""

import pytest

from machinecheck.errors import InputErrors
from machinecheck.inputs.catalog import catalog_from_data, sites_from_data
from machinecheck.physics import plate

BASE = {"frequency": "50 Hz", "voltage": "400 V", "power": "11 kW", "speed": "1460 rpm"}


def _machine(*ratings, **fields):
    return catalog_from_data({"machine": [{"id": "M", **fields, "rating": list(ratings)}]},
                             "t").machines[0]


def _refused(call, *args, **kwargs):
    with pytest.raises(InputErrors) as caught:
        call(*args, **kwargs)
    assert isinstance(caught.value, ValueError)
    return str(caught.value)


def test_implied_product_of_a_consistent_plate():
    # 22 kW, 400 V, eta 0.92, PF 0.85 -> 40.6 A (common practice, no published source; the
    # worked value of physics.current.full_load_current) -> eta x PF = 0.782
    assert plate.implied_efficiency_power_factor(22e3, 400.0, 40.6) == pytest.approx(
        0.92 * 0.85, rel=2e-3)


def test_consistent_plate_is_accepted():
    m = _machine({**BASE, "current": "21.5 A", "efficiency": "91.4 %", "power_factor": 0.82,
                  "locked_rotor_current": "150 A"})
    assert m.poles == 4


@pytest.mark.parametrize("extra, words", [
    # current typed for another machine: 11 kW / (sqrt3 x 400 V x 2.15 A) = 7.385
    ({"current": "2.15 A"}, ("rated current 2.15 A at 400 V for 11 kW implies efficiency x "
                             "power factor 7.38", "outside the plausible 0.15 to 1")),
    # stated product 0.914 x 0.82 = 0.749; implied 0.392 -> -48 %
    ({"current": "40.5 A", "efficiency": "91.4 %", "power_factor": 0.82},
     ("implies efficiency x power factor 0.392", "= 0.749 (-48 %, more than 40 % apart)")),
    ({"current": "21.5 A", "locked_rotor_current": "500 A"},
     ("locked-rotor current 500 A is 23 times the rated current 21.5 A",)),
    ({"speed": "1,460 rpm"}, ("has a comma",)),
    ({"speed": "1.46 rpm"}, ("would mean 4108 poles (at most 200)",)),
    ({"speed": "1200 rpm"}, ("implies 20.0 % slip below 1500 rpm",)),
    ({"efficiency": 1e-300}, ("efficiency 1e-300 is outside the plausible range 10 to 99.5 %",)),
    ({"power_factor": "5 %"}, ("power factor '5 %' is outside the plausible range 10 to 100 %",)),
])
def test_implausible_plates_say_what_disagrees(extra, words):
    text = _refused(_machine, {**BASE, **extra})
    assert "t: 'M': rating[1]." in text
    for word in words:
        assert word in text


def test_generator_current_against_kva():
    gen = {"frequency": "50 Hz", "voltage": "400 V", "power": "500 kVA", "speed": "1500 rpm"}
    # 500 kVA / (sqrt3 x 400 V) = 722 A (definition of three-phase apparent power)
    assert _machine({**gen, "current": "722 A"}, kind="synchronous-generator").poles == 4
    text = _refused(_machine, {**gen, "current": "72 A"}, kind="synchronous-generator")
    assert "rated current 72 A disagrees with 500 kVA at 400 V, which means 722 A (-90 %)" in text


def test_multispeed_plate_is_accepted_with_poles_per_rating():
    # a two-speed 4/8-pole plate (invented): one rating set per speed, both at 50 Hz
    m = _machine({**BASE}, {**BASE, "power": "5.5 kW", "speed": "730 rpm"})
    assert [r.poles for r in m.ratings] == [4, 8]
    assert m.poles == 4


def test_different_poles_at_different_frequencies_are_refused():
    text = _refused(_machine, BASE, {**BASE, "frequency": "60 Hz", "speed": "1160 rpm"})
    assert "rated speed 1160 rpm at 60 Hz means 6 poles, but rating[1] means 4 poles" in text


def test_multispeed_plate_with_a_single_poles_key_is_refused():
    text = _refused(_machine, BASE, {**BASE, "speed": "730 rpm"}, poles=4)
    assert "multispeed plate" in text and "remove 'poles'" in text


def test_two_phase_machine_is_accepted():
    # two-phase: I = P / (2 V eta PF) (NEC Table 430.249 machines), 11 kW at 400 V -> 13.75 A
    # for eta x PF = 1; 18 A gives 0.76
    m = _machine({**BASE, "current": "18 A"}, phases=2)
    assert m.phases == 2
    site = sites_from_data({"site": [{"id": "Q", "frequency": "50 Hz", "voltage": "400 V",
                                      "phases": 2, "system": "quadrature"}]}, "t")[0]
    assert site.phases == 2


# ----------------------------------------------------------------------------- supply voltage

def _site(**fields):
    return sites_from_data({"site": [{"id": "S", "frequency": "50 Hz", **fields}]}, "t")[0]


@pytest.mark.parametrize("volts", ["120 V", "127 V", "220 V", "230 V", "240 V", "277 V", "347 V"])
def test_common_line_to_neutral_voltages_are_ambiguous_on_three_phase(volts):
    text = _refused(_site, voltage=volts, phases=3)
    assert "three-phase is ambiguous" in text and "wires = 3" in text and "t: 'S': voltage" in text


@pytest.mark.parametrize("fields", [
    {"voltage": "230 V", "phases": 3, "wires": 3},
    {"voltage": "240 V", "phases": 3, "system": "delta"},
    {"voltage": "230 V", "phases": 1},
    {"voltage": "400 V", "phases": 3},
    {"voltage": "208 V", "phases": 3},
])
def test_unambiguous_voltages_are_accepted(fields):
    assert _site(**fields).voltage_v == float(fields["voltage"].split()[0])


@pytest.mark.parametrize("marked, volts, wires, phases", [
    ("230/400 V", 400.0, 4, 3), ("277/480 V", 480.0, 4, 3), ("120/208 V", 208.0, 4, 3),
    ("120/240 V", 240.0, 3, 1),
])
def test_marked_line_to_neutral_pairs(marked, volts, wires, phases):
    # IEC 60038 Table 1 four-wire systems; 120/240 V split-phase (common practice)
    site = _site(voltage=marked, phases=phases)
    assert (site.voltage_v, site.wires) == (volts, wires)


def test_marking_that_is_no_system_is_refused():
    assert "is not a line-to-neutral/line-to-line pair" in _refused(_site, voltage="230/300 V")


def test_site_voltage_out_of_range_names_the_key():
    text = _refused(_site, voltage="400 kV")
    assert "t: 'S': voltage: '400 kV' is outside the plausible range 1 to 50000 V" in text
