"""Verdicts a practitioner can trust: each check of the standards the engine applies, on the
plate and site that show it."""

import pytest
from helpers import codes, machine, site

from machinecheck.engine.pipeline import assess
from machinecheck.report.data import result_dict

IEC_11KW = {"frequency": "50 Hz", "voltage": "400 V", "power": "11 kW", "speed": "1460 rpm",
            "current": "21.5 A", "efficiency": 0.905, "power_factor": 0.82}
NEMA_20HP = {"frequency": "60 Hz", "voltage": "460 V", "power": "20 hp", "speed": "1765 rpm",
             "current": "24 A", "efficiency": 0.924, "power_factor": 0.85}


# ----------------------------------------------------------------------------- off-nominal f

@pytest.mark.parametrize("frequency", ["47 Hz", "48 Hz", "51 Hz", "52 Hz"])
def test_an_off_nominal_frequency_is_a_variation_not_a_new_nominal(frequency):
    # Re-rating is for a change of nominal (50 <-> 60 Hz); 47-52 Hz on a 50 Hz system is judged
    # in the voltage-frequency zones [IEC 60034-1:2022 §7.3].
    a = assess(machine(IEC_11KW), site(frequency=frequency, voltage="400 V", standard="IEC"))
    assert a.supply.rerated is False
    assert "frequency-change" not in codes(a)


def test_47_hz_on_a_50_hz_motor_is_outside_zone_b():
    # df = -6 % is beyond zone B's -5 % [IEC 60034-1:2022 §7.3]: said plainly, not re-rated.
    a = assess(machine(IEC_11KW), site(frequency="47 Hz", voltage="400 V", standard="IEC"))
    assert "outside-tolerance" in codes(a, "problem")
    assert a.verdict == "incompatible"


def test_51_hz_at_nominal_voltage_is_in_zone_a():
    # df = +2 % is the edge of zone A (+-2 %);
    # on the zone boundary the point belongs to the zone [IEC 60034-1:2022 §7.3].
    a = assess(machine(IEC_11KW), site(frequency="51 Hz", voltage="400 V", standard="IEC"))
    assert a.supply.tolerance.zone == "A"


def test_a_stated_frequency_variation_is_judged_with_the_voltage():
    # 50 Hz +-3 %: both ends lie in zone B (-5/+3 %), not A (+-2 %) [IEC 60034-1:2022 §7.3].
    a = assess(machine(IEC_11KW), site(frequency="50 Hz", voltage="400 V", standard="IEC",
                                       frequency_variation="3 %"))
    assert a.supply.rerated is False
    assert a.supply.tolerance.zone == "B"
    assert "tolerance-zone-b" in codes(a, "warning")
    assert "variation +-3 %: df -3.0 %" in next(f.message for f in a.findings if f.code == "tolerance-zone-b")


def test_a_variation_of_4_percent_is_outside_zone_b_and_said_plainly():
    # +4 % is beyond zone B's +3 % [IEC 60034-1:2022 §7.3].
    a = assess(machine(IEC_11KW), site(frequency="50 Hz", voltage="400 V", standard="IEC",
                                       frequency_variation="4 %"))
    assert a.supply.rerated is False
    assert "outside-tolerance" in codes(a, "problem")


def test_overvoltage_with_low_frequency_is_cut_off_by_the_zone_corner():
    # dU +4 % with df -2 %: |dU - df| = 6 % > 5 %, outside the cut corner of zone A
    # [IEC 60034-1:2022 §7.3]; at nominal frequency the same voltage is zone A.
    a = assess(machine(IEC_11KW), site(frequency="50 Hz", voltage="416 V", standard="IEC",
                                       frequency_variation="2 %"))
    assert a.supply.tolerance.zone == "B"


def test_a_nema_variation_of_3_percent_with_8_percent_voltage_is_outside_the_combined_limit():
    # |dV| + |df| = 8 % + 3 % = 11 % > 10 % [NEMA MG 1-2016 §12.44].
    a = assess(machine(NEMA_20HP), site(frequency="60 Hz", voltage="496.8 V", standard="NEMA",
                                        frequency_variation="3 %"))
    assert a.supply.tolerance.within is False
    assert "outside-tolerance" in codes(a, "problem")


# ----------------------------------------------------------------------------- NEC 430.6(A)(1)

NEMA_SITE = dict(frequency="60 Hz", voltage="480 V", standard="NEMA")


def test_a_4_pole_motor_takes_the_table_current():
    # 20 hp 460 V: 27 A [NFPA 70-2008 Table 430.250]; scope [NFPA 70-2023] 430.6(A)(1).
    a = assess(machine(NEMA_20HP), site(**NEMA_SITE))
    assert a.running.currents.code_a == 27
    assert a.running.currents.code_rule.startswith("table current: Table 430.250")


def test_an_8_pole_motor_is_low_speed_and_takes_the_nameplate_current():
    # 8 poles at 60 Hz: 900 rpm synchronous, less than 1200 rpm: nameplate current
    # [NFPA 70-2023] 430.6(A)(1).
    a = assess(machine({**NEMA_20HP, "speed": "875 rpm", "current": "28 A"}), site(**NEMA_SITE))
    currents = a.running.currents
    assert currents.code_a is None
    assert "low speed (900 rpm synchronous, less than 1200 rpm)" in currents.code_rule
    assert result_dict(a)["code_current_rule"] == currents.code_rule


def test_a_6_pole_60_hz_motor_is_not_low_speed():
    # 1200 rpm synchronous is not "less than 1200 rpm" [NFPA 70-2023] 430.6(A)(1).
    a = assess(machine({**NEMA_20HP, "speed": "1175 rpm"}), site(**NEMA_SITE))
    assert a.running.currents.code_a == 27


def test_a_multispeed_motor_takes_the_nameplate_current():
    # one rating set per speed: multispeed, nameplate current [NFPA 70-2023] 430.6(A)(1).
    m = machine([NEMA_20HP,
                 {**NEMA_20HP, "power": "5 hp", "speed": "870 rpm", "current": "9 A"}])
    a = assess(m, site(**NEMA_SITE))
    assert a.running.currents.code_a is None
    assert "multispeed" in a.running.currents.code_rule


def test_a_synchronous_motor_at_0_85_pf_is_not_rounded_to_a_footnote_multiplier():
    # Table 430.250 footnote: x1.1 at 0.9 PF, x1.25 at 0.8 PF only [NFPA 70-2008 Table 430.250].
    plate = {"frequency": "60 Hz", "voltage": "460 V", "power": "100 hp", "speed": "1800 rpm",
             "current": "110 A", "power_factor": 0.85, "efficiency": 0.95}
    a = assess(machine(plate, kind="synchronous-motor"), site(**NEMA_SITE))
    assert a.running.currents.code_a is None
    assert "0.85 has no Table 430.250 multiplier" in a.running.currents.code_rule


def test_a_synchronous_motor_at_0_8_pf_takes_the_footnote_multiplier():
    # 100 hp 460 V unity 101 A x 1.25 = 126.25 A [NFPA 70-2008 Table 430.250].
    plate = {"frequency": "60 Hz", "voltage": "460 V", "power": "100 hp", "speed": "1800 rpm",
             "current": "125 A", "power_factor": 0.8, "efficiency": 0.95}
    a = assess(machine(plate, kind="synchronous-motor"), site(**NEMA_SITE))
    assert a.running.currents.code_a == pytest.approx(126.25)


def test_a_two_phase_motor_takes_table_430_249():
    # 10 hp 460 V two-phase: 12 A [NFPA 70-2008 Table 430.249].
    plate = {"frequency": "60 Hz", "voltage": "460 V", "power": "10 hp", "speed": "1750 rpm",
             "current": "12.5 A"}
    a = assess(machine(plate, phases=2), site(frequency="60 Hz", voltage="480 V", phases=2,
                                              standard="NEMA"))
    assert a.running.currents.code_a == 12
    assert a.running.currents.code_rule.startswith("table current: Table 430.249")


# ----------------------------------------------------------------------------- efficiency class

IEC_4KW = {"frequency": "50 Hz", "voltage": "400 V", "power": "4 kW", "speed": "1440 rpm"}
IEC_SITE = dict(frequency="50 Hz", voltage="400 V", standard="IEC")


def test_the_marked_class_is_the_class_and_a_higher_computed_class_is_a_separate_finding():
    # 4 kW 4-pole 50 Hz: IE3 minimum 88.6 %, IE4 91.1 % [IEC 60034-30-1:2014 §6, 50 Hz table];
    # 89.0 % reaches IE3 on a plate marked IE2.
    a = assess(machine({**IEC_4KW, "efficiency": "89.0 %"}, efficiency_class="IE2"),
               site(**IEC_SITE))
    assert a.running.efficiency_class == "IE2"
    assert result_dict(a)["efficiency_class"] == "IE2"
    computed = next(f for f in a.findings if f.code == "efficiency-class-computed")
    assert "plate efficiency 89.0 % reaches IE3" in computed.message
    assert "as marked" not in computed.message


def test_a_marked_class_meets_the_site_requirement_on_its_marking():
    # marked IE3 on an IE3 site: no class finding against it, whatever the computed class
    # [IEC 60034-30-1:2014 §6]: 88.0 % is below the 88.6 % IE3 minimum, said separately.
    a = assess(machine({**IEC_4KW, "efficiency": "88.0 %"}, efficiency_class="IE3"),
               site(**IEC_SITE, min_efficiency_class="IE3"))
    assert "efficiency-class-required" not in codes(a)
    below = next(f for f in a.findings if f.code == "efficiency-below-class")
    assert "88.0 % is below the IE3 minimum 88.6 %" in below.message


def test_an_unmarked_plate_is_judged_with_meets_class():
    # 4 kW 4-pole 50 Hz IE3 minimum 88.6 % [IEC 60034-30-1:2014 §6]: 88.0 % unmarked is below.
    a = assess(machine({**IEC_4KW, "efficiency": "88.0 %"}),
               site(**IEC_SITE, min_efficiency_class="IE3"))
    required = next(f for f in a.findings if f.code == "efficiency-class-required")
    assert "88.0 % (no class marked) is below the IE3 minimum 88.6 %" in required.message
    a = assess(machine({**IEC_4KW, "efficiency": "88.7 %"}),
               site(**IEC_SITE, min_efficiency_class="IE3"))
    assert "efficiency-class-required" not in codes(a)


def test_the_marked_class_never_reported_as_computed():
    # marked IE2, plate 85.9 % below the 86.6 % IE2 minimum [IEC 60034-30-1:2014 §6]: the class
    # stays IE2 and the shortfall is worded against the marking.
    a = assess(machine({**IEC_4KW, "efficiency": "85.9 %"}, efficiency_class="IE2"),
               site(**IEC_SITE, min_efficiency_class="IE2"))
    assert a.running.efficiency_class == "IE2"
    assert "efficiency-class-required" not in codes(a)
    assert all("as marked" not in f.message for f in a.findings)


def test_a_class_not_carried_by_the_table_cannot_be_confirmed_and_is_not_warned():
    # IE1 has no 8-pole values in the carried IEC 60034-30-1:2014 tables: an unmarked 8-pole
    # 11 kW plate at 85.0 % (below the 86.9 % IE2 minimum) on an IE1 site cannot be confirmed
    # from the table; that is said, not warned.
    plate = {"frequency": "50 Hz", "voltage": "400 V", "power": "11 kW", "speed": "720 rpm",
             "efficiency": "85.0 %"}
    a = assess(machine(plate), site(**IEC_SITE, min_efficiency_class="IE1"))
    unconfirmed = next(f for f in a.findings if f.code == "efficiency-class-unconfirmed")
    assert unconfirmed.severity == "info"
    assert "cannot be confirmed from the table" in unconfirmed.message
    assert "efficiency-class-unknown" not in codes(a)


# ----------------------------------------------------------------------------- slip

def test_a_design_d_motor_at_12_5_percent_slip_is_accepted_and_compatible():
    # NEMA Design D full-load slip 5-13 % [NEMA MG 1-2016 §1.19.1.4] (from memory): 1575 rpm on
    # 1800 rpm synchronous is 12.5 %.
    m = machine({"frequency": "60 Hz", "voltage": "460 V", "power": "10 hp",
                 "speed": "1575 rpm", "current": "14 A", "efficiency": 0.85,
                 "power_factor": 0.8}, design_letter="D")
    assert assess(m, site(frequency="60 Hz", voltage="460 V", standard="NEMA")).verdict == \
        "compatible"


@pytest.mark.parametrize(("power", "speed", "share"), [
    ("0.75 kW", "1380 rpm", 0.30),   # below 1 kW: +-30 % of the slip
    ("1.1 kW", "1420 rpm", 0.20),    # 1 kW and above: +-20 %
])
def test_the_speed_band_is_the_slip_tolerance_of_the_size(power, speed, share):
    # [IEC 60034-1:2022] tolerance table, slip: +-30 % below 1 kW, +-20 % from 1 kW.
    m = machine({"frequency": "50 Hz", "voltage": "400 V", "power": power, "speed": speed})
    a = assess(m, site(**IEC_SITE))
    slip_rpm = a.running.synchronous_speed_rpm - a.running.expected_speed_rpm
    assert a.running.speed_band_rpm == pytest.approx(share * slip_rpm)


# ----------------------------------------------------------------------------- load

@pytest.mark.parametrize("load_type", ["centrifugal", "constant-torque"])
def test_a_460_v_motor_at_rated_load_on_480_v_is_compatible(load_type):
    # 480 V is the normal system for 460 V motors [ANSI C84.1]; +4.3 % is inside NEMA MG 1
    # 12.44 [NEMA MG 1-2016 §12.44]: at rated load the motor is compatible, no margin left.
    m = machine(NEMA_20HP, load={"type": load_type, "power": "20 hp"})
    a = assess(m, site(**NEMA_SITE))
    assert a.verdict == "compatible"
    assert a.running.load.fraction == pytest.approx(1.0)
    assert "0 % margin left" in next(f.message for f in a.findings if f.code == "load-fraction")


def test_a_400_v_motor_at_rated_load_on_415_v_zone_a_is_compatible():
    # 415 / 400 = +3.75 %, zone A [IEC 60034-1:2022 §7.3]: rated load is carried.
    m = machine(IEC_11KW, load={"type": "centrifugal", "power": "11 kW"})
    a = assess(m, site(frequency="50 Hz", voltage="415 V", standard="IEC"))
    assert a.verdict == "compatible"
    assert result_dict(a)["load_margin"] == pytest.approx(0.0)


def test_a_load_over_the_derated_output_is_an_overload_with_the_shortfall_shown():
    # 2000 m, 40 degC: 0.94 of rated (common practice, no published source); 11 kW asked of 10.34 kW.
    m = machine(IEC_11KW, load={"type": "constant-torque", "power": "11 kW"})
    a = assess(m, site(frequency="50 Hz", voltage="400 V", standard="IEC", altitude="2000 m"))
    overload = next(f for f in a.findings if f.code == "load-overload")
    assert overload.severity == "problem"
    assert "overloaded by" in overload.message


# ----------------------------------------------------------------------------- breakdown torque

def _breakdown_ratio(a):
    from machinecheck.physics.speed import shaft_torque
    op = a.running.operating
    rated = shaft_torque(a.rating.power_w, a.rating.speed_rpm)
    return op.breakdown_torque_nm / rated


def test_the_datasheet_breakdown_torque_is_used_and_named():
    # breakdown torque 300 % of rated from the datasheet: the fitted circuit gives 3.0 x at the
    # rated supply (its own definition, [Chapman 2005 ch. 7] breakdown of the circuit).
    a = assess(machine({**IEC_11KW, "breakdown_torque": "300 %"}), site(**IEC_SITE))
    assert _breakdown_ratio(a) == pytest.approx(3.0, rel=1e-3)
    assert a.running.operating.breakdown_basis == "datasheet breakdown torque 3.00 x rated"
    assert result_dict(a)["breakdown_torque_basis"].startswith("datasheet")


def test_without_datasheet_torques_the_breakdown_is_an_estimate_and_says_so():
    # typical 2.5 x for design B/N (common practice, no published source).
    a = assess(machine(IEC_11KW), site(**IEC_SITE))
    assert _breakdown_ratio(a) == pytest.approx(2.5, rel=1e-3)
    assert result_dict(a)["breakdown_torque_basis"].startswith("estimate: typical breakdown "
                                                              "torque 2.5 x rated")


def test_datasheet_circuit_parameters_are_used_as_given():
    # [Chapman 2005 Ex. 7-5] (from memory): 460 V, 25 hp, 4-pole, 60 Hz, Y; R1 0.641, R2 0.332,
    # X1 1.106, X2 0.464, XM 26.3 ohm; 2.2 % slip (1760 rpm).
    plate = {"frequency": "60 Hz", "voltage": "460 V", "power": "25 hp", "speed": "1760 rpm"}
    circuit = {"r1": "0.641 ohm", "r2": "0.332 ohm", "x1": "1.106 ohm", "x2": "0.464 ohm",
               "xm": "26.3 ohm"}
    a = assess(machine(plate, circuit=circuit), site(**NEMA_SITE))
    c = a.running.operating.circuit
    assert (c.r1_ohm, c.r2_ohm, c.x1_ohm, c.x2_ohm, c.xm_ohm) == (0.641, 0.332, 1.106, 0.464,
                                                                  26.3)
    assert a.running.operating.breakdown_basis == "datasheet equivalent circuit"


# ----------------------------------------------------------------------------- generators

GENSET_50 = {"frequency": "50 Hz", "voltage": "400 V", "power": "500 kVA", "speed": "1500 rpm"}


def test_a_50_hz_set_at_60_hz_keeps_its_rated_kva_and_asks_for_the_prime_mover():
    # 400 V 50 Hz set on 480 V 60 Hz: rated flux at 480 V, but the kVA is not raised without
    # the prime mover's power (common practice, no published source).
    m = machine(GENSET_50, kind="synchronous-generator", poles=4)
    a = assess(m, site(frequency="60 Hz", voltage="480 V", standard="NEMA"))
    assert a.running.available_apparent_power_va == pytest.approx(500e3)
    assert "generator-prime-mover-power" in codes(a, "warning")


def test_a_stated_prime_mover_power_limits_the_real_output():
    # 500 kVA x 0.8 = 400 kW electrical, prime mover 350 kW: 350 kW at most (power balance).
    m = machine(GENSET_50, kind="synchronous-generator", poles=4)
    s = site(frequency="60 Hz", voltage="480 V", standard="NEMA",
             source={"kind": "generator", "rating": "500 kVA", "prime_mover_power": "350 kW",
                     "subtransient_reactance": "15 %"})
    a = assess(m, s)
    assert a.running.available_power_w == pytest.approx(350e3)


# ----------------------------------------------------------------------------- not running

def test_a_stalled_motor_shows_no_running_figures_and_says_why():
    # a constant torque of 2.6 x rated against a breakdown of 2.5 x (typical, common practice):
    # no running point [Chapman 2005 ch. 7].
    m = machine(IEC_11KW, load={"type": "constant-torque", "power": "28.6 kW"})
    a = assess(m, site(**IEC_SITE))
    data = result_dict(a)
    assert a.verdict == "incompatible"
    assert data["not_running_reason"].startswith("the motor stalls")
    for key in ("expected_speed_rpm", "available_power_kw", "full_load_current_a",
                "operating_current_a", "load_fraction"):
        assert data[key] is None, key


def test_a_three_phase_motor_on_a_single_phase_supply_shows_no_output():
    a = assess(machine(IEC_11KW), site(frequency="50 Hz", voltage="230 V", phases=1,
                                       standard="IEC"))
    data = result_dict(a)
    assert data["available_power_kw"] is None and data["full_load_current_a"] is None
    assert "cannot be connected" in data["not_running_reason"]


def test_a_supply_outside_zone_b_shows_no_running_figures():
    # 460 V on 400 V is +15 %, outside zone B [IEC 60034-1:2022 §7.3].
    a = assess(machine(IEC_11KW), site(frequency="50 Hz", voltage="460 V", standard="IEC"))
    data = result_dict(a)
    assert data["not_running_reason"] == "the supply is outside IEC 60034-1 zone B"
    assert data["expected_speed_rpm"] is None


def test_torques_are_shown_with_the_decimals_that_tell_them_apart():
    from machinecheck.rules.operating import torque_pair
    assert torque_pair(13.8, 14.2) == ("13.8", "14.2")   # "14 N m below 14 N m" never
    assert torque_pair(12.0, 14.0) == ("12", "14")


# ----------------------------------------------------------------------------- multispeed

def test_a_multispeed_plate_is_judged_per_speed():
    # 4 and 8 poles on one 460 V 60 Hz plate: n_s = 120 f / p = 1800 and 900 rpm
    # [IEC 60034-1:2022] definitions; each speed on its own rating set.
    m = machine([NEMA_20HP,
                 {**NEMA_20HP, "power": "5 hp", "speed": "870 rpm", "current": "9 A"}],
                load={"type": "constant-torque", "power": "10 hp"})
    a = assess(m, site(**NEMA_SITE))
    summary = next(f for f in a.findings if f.code == "multispeed")
    assert "4 poles (1800 rpm) compatible" in summary.message
    assert "8 poles (900 rpm) incompatible" in summary.message
    assert a.verdict == "incompatible" and a.choice.poles == 8


# ----------------------------------------------------------------------------- the points fleet

def test_the_points_fleet_gives_the_verdicts_the_standards_give():
    # One pair for each point; sources as in the tests above: [ANSI C84.1] 480 V feeds 460 V
    # motors, [IEC 60034-1:2022 §7.3] zones A/B, [IEC 60034-30-1:2014 §6] marked class.
    from pathlib import Path

    from machinecheck.inputs.catalog import load_catalog, load_sites
    here = Path(__file__).parent
    machines = {m.id: m for m in load_catalog(here / "fleet_issue_points.toml").machines}
    sites = {s.id: s for s in load_sites(here / "sites_issue_points.toml")}
    expected = {
        ("p1-pump-460v", "nema-480"): "compatible",
        ("p1-conveyor-400v", "iec-415"): "compatible",
        ("p3-fan-marked-ie2", "iec-400-ie3"): "incompatible",
        ("p4-press-design-d", "nema-480"): "compatible",
        ("p5-single-phase-230v", "wye-4-wire"): "compatible",
        ("p5-single-phase-230v", "wye-3-wire"): "incompatible",
        ("p7-crusher-bd-160", "iec-380"): "conditional",
        ("p8-pump-50hz", "island-47"): "incompatible",
        ("p8-pump-50hz", "genset-3pct"): "conditional",
        ("p17-two-phase-pump", "two-phase-480"): "compatible",
        ("p17-two-phase-pump", "nema-480"): "incompatible",
    }
    for (m, s), verdict in expected.items():
        assert assess(machines[m], sites[s]).verdict == verdict, (m, s)


def test_a_re_rated_machine_on_a_site_with_a_frequency_variation_is_judged_in_the_zones():
    # 60 Hz 460 V plate on 50 Hz 400 V: k = (400/460)/(50/60) = 1.043 [NEMA MG 1-2016 §12.44.2]
    # judged as dU +4.3 %; with 50 Hz +-3 %: df -3 % puts the point outside zone A and, with
    # |dU - df| = 7.3 % and df +3 %, inside zone B [IEC 60034-1:2022 §7.3].
    a = assess(machine(NEMA_20HP), site(frequency="50 Hz", voltage="400 V", standard="IEC",
                                        frequency_variation="3 %"))
    assert a.supply.rerated is True
    assert "tolerance-zone-b" in codes(a, "warning")


def test_a_design_d_motor_re_rated_to_50_hz_finds_its_running_point():
    # 60 Hz Design D on 400 V 50 Hz, output derated to 0.744: the constant-power load meets the
    # motor near the slip rule's 1316 rpm [NEMA MG 1-2016 §12.44.2] (torque ~ V^2/f^2); its
    # torque at the breakdown slip is no stall when a stable point lies below it
    # [Chapman 2005 ch. 7] (stable branch 0 < s < s_max).
    m = machine({"frequency": "60 Hz", "voltage": "460 V", "power": "10 hp",
                 "speed": "1575 rpm", "current": "14 A", "efficiency": 0.85,
                 "power_factor": 0.8}, design_letter="D")
    a = assess(m, site(**IEC_SITE, wires=3))
    assert "motor-stall" not in codes(a)
    assert a.running.expected_speed_rpm == pytest.approx(1316, abs=10)
