import math

import pytest
from helpers import codes, machine, site

from machinecheck.engine.pipeline import assess

NEMA_50HP = {"frequency": "60 Hz", "voltage": "460 V", "power": "50 hp", "speed": "1775 rpm",
             "efficiency": 0.93, "power_factor": 0.85}


def test_issue_example_60hz_motor_on_400v_50hz():
    # 50 hp 460 V 60 Hz 1775 rpm on 400 V 50 Hz -> 1500 rpm synchronous (n_s = 120 f / p,
    # [Chapman 2005 ch. 3]), about 1475-1490 rpm running, output at most 5/6 of rated at
    # constant V/f (torque kept, speed x 5/6: [Chapman 2005 ch. 7]), conditional.
    a = assess(machine(NEMA_50HP), site(frequency="50 Hz", voltage="400 V", standard="IEC"))
    assert a.synchronous_speed_rpm == pytest.approx(1500)
    assert 1475 <= a.expected_speed_rpm <= 1490
    assert a.available_power_w <= 5 / 6 * a.rated_power_w + 1e-6
    assert a.verdict == "conditional"
    assert "frequency-change" in codes(a)


def test_same_machine_on_480v_60hz_nema_is_normal_pairing():
    # 480 V systems feed 460 V motors [ANSI C84.1-2020 Table 1]; +4.3 % is within
    # [NEMA MG 1-2016 §12.44].
    a = assess(machine(NEMA_50HP), site(frequency="60 Hz", voltage="480 V", standard="NEMA"))
    assert a.verdict == "compatible"
    assert "normal-pairing" in codes(a)
    assert a.expected_speed_rpm == pytest.approx(1800 - 25 / (480 / 460) ** 2, abs=0.5)


def test_230v_motor_on_208v_is_warned():
    # -9.6 % is inside +-10 % [NEMA MG 1-2016 §12.44], warned; torque ~ V^2: 0.904^2 = 0.82
    # [NEMA MG 1-2016 §12.44.2].
    m = machine({"frequency": "60 Hz", "voltage": "230 V", "power": "5 hp", "speed": "1745 rpm",
                 "current": "13.2 A"})
    a = assess(m, site(frequency="60 Hz", voltage="208 V", standard="NEMA"))
    assert a.verdict == "conditional"
    assert "near-tolerance-limit" in codes(a, "warning")
    assert "0.82" in next(f.message for f in a.findings if f.code == "near-tolerance-limit")
    assert a.full_load_current_a == pytest.approx(13.2 * 230 / 208, rel=1e-6)


def test_voltage_far_from_rating_is_incompatible():
    # IEC 60034-1 7.3: outside zone B (-10 %).
    m = machine({"frequency": "50 Hz", "voltage": "400 V", "power": "11 kW", "speed": "1460 rpm"})
    a = assess(m, site(frequency="50 Hz", voltage="230 V", wires=3, standard="IEC"))
    assert a.verdict == "incompatible"
    assert "outside-tolerance" in codes(a, "problem")


@pytest.mark.parametrize("volts,zone,verdict", [
    (400, "A", "compatible"), (418, "A", "compatible"), (425, "B", "conditional"),
    (445, None, "incompatible"),
])
def test_iec_zone_verdicts(volts, zone, verdict):
    # IEC 60034-1 7.3 zones A/B at rated frequency.
    m = machine({"frequency": "50 Hz", "voltage": "400 V", "power": "11 kW", "speed": "1460 rpm"})
    a = assess(m, site(frequency="50 Hz", voltage=f"{volts} V", standard="IEC"))
    assert a.supply.tolerance.zone == zone
    assert a.verdict == verdict


def test_overflux_above_ten_percent_is_incompatible():
    # 460 V 60 Hz motor left on 460 V 50 Hz: k = 1 / (50 / 60) = 1.2, +20 % flux
    # [Chapman 2005 ch. 7] (flux ~ V/f); above +10 % is common practice, no published source.
    a = assess(machine(NEMA_50HP), site(frequency="50 Hz", voltage="460 V", standard="IEC"))
    assert a.flux_ratio == pytest.approx(1.2)
    assert "overflux" in codes(a, "problem")
    assert a.verdict == "incompatible"


def test_50hz_motor_on_60hz_same_voltage_underflux_warned():
    # k = 1 / 1.2 = 0.833, torque capability k^2 = 0.69 [NEMA MG 1-2016 §12.44.2]; rated kW
    # kept (common practice, no published source).
    m = machine({"frequency": "50 Hz", "voltage": "400 V", "power": "11 kW", "speed": "1460 rpm"})
    a = assess(m, site(frequency="60 Hz", voltage="400 V", standard="IEC"))
    assert a.flux_ratio == pytest.approx(5 / 6)
    assert a.running.torque_capability == pytest.approx(0.694, abs=1e-3)
    assert "underflux" in codes(a, "warning")
    assert a.available_power_w == pytest.approx(11000)
    assert "speed-increase" in codes(a)


def test_pump_moved_50_to_60hz_overloads_motor():
    # A 50 Hz pump on 60 Hz wants 1.2^3 = 1.73 x the power at rated slip [Karassik 2008 ch. 2]
    # (affinity laws); solved with the load, the overloaded motor slips more, so a little less.
    m = machine({"frequency": "50 Hz", "voltage": "400 V", "power": "11 kW", "speed": "1460 rpm"},
                load={"type": "centrifugal", "power": "10 kW"})
    a = assess(m, site(frequency="60 Hz", voltage="480 V", standard="NEMA"))
    ratio = a.expected_speed_rpm / 1460
    assert a.load_power_w / 10000 == pytest.approx(ratio ** 3)  # affinity laws, P ~ n^3
    assert 1.65 < a.load_power_w / 10000 < 1.76
    assert "load-overload" in codes(a, "problem")


def test_pump_moved_60_to_50hz_loses_head():
    # At 5/6 speed: flow x0.833, head x0.694, power x0.579 [Karassik 2008 ch. 2] (affinity laws).
    m = machine(NEMA_50HP, load={"type": "centrifugal", "power": "40 hp"})
    a = assess(m, site(frequency="50 Hz", voltage="380 V", standard="IEC"))
    assert a.running.load.head_ratio == pytest.approx(0.70, abs=0.01)
    assert "duty-shortfall" in codes(a, "warning")


def test_dual_frequency_plate_uses_its_own_set():
    m = machine([
        {"frequency": "50 Hz", "voltage": "400 V", "power": "15 kW", "speed": "1465 rpm"},
        {"frequency": "60 Hz", "voltage": "460 V", "power": "17.3 kW", "speed": "1765 rpm"},
    ])
    a = assess(m, site(frequency="60 Hz", voltage="460 V", standard="NEMA"))
    assert a.rating.frequency_hz == 60
    assert not a.rerated
    assert a.available_power_w == pytest.approx(17300)
    assert a.verdict == "compatible"


def test_dual_voltage_picks_connection():
    # 230/460 V plate: low voltage = windings in parallel, high = series [NEMA MG 1-2016 Part 2]
    # (from memory).
    m = machine({"frequency": "60 Hz", "voltage": ["230 V", "460 V"],
                 "connection": ["low", "high"], "current": ["24 A", "12 A"], "power": "10 hp",
                 "speed": "1760 rpm"})
    a = assess(m, site(frequency="60 Hz", voltage="230 V", wires=3, standard="NEMA"))
    assert a.connection.name == "low"
    assert a.full_load_current_a == pytest.approx(24)


@pytest.mark.parametrize("plate,power,speed_,supply,frequency,standard,connection,star_delta", [
    # 400 delta / 690 star on 400 V -> delta, star-delta possible (690 / 400 = sqrt(3), common
    # practice, no published source)
    (["400 V", "690 V"], "55 kW", "1480 rpm", "400 V", "50 Hz", "IEC", "delta", True),
    (["400 V", "690 V"], "55 kW", "1480 rpm", "690 V", "50 Hz", "IEC", "star", False),
    # 230 delta / 400 star on 400 V -> star only, no star-delta starter
    (["230 V", "400 V"], "3 kW", "2880 rpm", "400 V", "50 Hz", "IEC", "star", False),
    # cross-frequency: 400 delta / 690 star 50 Hz on 480 V 60 Hz -> delta (8.0 = 8.0 V/Hz)
    (["400 V", "690 V"], "55 kW", "1480 rpm", "480 V", "60 Hz", "NEMA", "delta", True),
])
def test_delta_star_connection(plate, power, speed_, supply, frequency, standard, connection,
                               star_delta):
    m = machine({"frequency": "50 Hz", "voltage": plate, "connection": ["delta", "star"],
                 "power": power, "speed": speed_})
    a = assess(m, site(frequency=frequency, voltage=supply, standard=standard))
    assert a.connection.name == connection
    assert a.running.star_delta_possible is star_delta
    assert a.flux_ratio == pytest.approx(1.0)


def test_three_phase_on_single_phase_incompatible():
    a = assess(machine(NEMA_50HP), site(frequency="60 Hz", voltage="240 V", phases=1,
                                        standard="NEMA"))
    assert a.verdict == "incompatible"
    assert "phase-mismatch" in codes(a, "problem")
    assert a.available_power_w is None


def test_single_phase_motor_on_wye_uses_line_to_neutral():
    m = machine({"frequency": "50 Hz", "voltage": "230 V", "power": "1.5 kW",
                 "speed": "2850 rpm"}, phases=1)
    a = assess(m, site(frequency="50 Hz", voltage="400 V", system="wye", wires=4, standard="IEC"))
    assert a.supply_voltage_v == pytest.approx(400 / 3 ** 0.5)
    assert a.verdict == "compatible"


def test_synchronous_motor_runs_at_synchronous_speed():
    # A synchronous motor runs at exactly n_s = 120 f / p [Chapman 2005 ch. 5].
    m = machine({"frequency": "60 Hz", "voltage": "460 V", "power": "200 hp", "speed": "1800 rpm"},
                kind="synchronous-motor")
    a = assess(m, site(frequency="50 Hz", voltage="400 V", standard="IEC"))
    assert a.expected_speed_rpm == pytest.approx(1500)


def test_generator_60_to_50hz_five_sixths():
    # 4-pole needs 120 x 50 / 4 = 1500 rpm for 50 Hz [Chapman 2005 ch. 4]; kVA about 5/6 with
    # the voltage dropped in proportion (480 -> 400 V) at rated current (common practice, from
    # memory), and the shaft fan's cooling factor (5/6)^0.25 = 0.955 in the figures (common
    # practice, no published formula): 500 x 5/6 x 0.955 = 398.1 kVA, 574.6 A.
    m = machine({"frequency": "60 Hz", "voltage": "480 V", "power": "500 kVA", "speed": "1800 rpm"},
                kind="synchronous-generator", poles=4)
    a = assess(m, site(frequency="50 Hz", voltage="400 V", standard="IEC"))
    assert a.synchronous_speed_rpm == pytest.approx(1500)
    assert a.available_apparent_power_va == pytest.approx(500e3 * 5 / 6 * (5 / 6) ** 0.25)
    assert a.full_load_current_a == pytest.approx(574.6, abs=0.1)
    assert "generator-conversion" in codes(a)


def test_generator_kept_at_480v_on_50hz_overexcited():
    # Keeping 480 V at 50 Hz is V/f x 1.2: overexcited [Chapman 2005 ch. 4] (flux ~ V/f).
    m = machine({"frequency": "60 Hz", "voltage": "480 V", "power": "500 kVA", "speed": "1800 rpm"},
                kind="synchronous-generator")
    a = assess(m, site(frequency="50 Hz", voltage="480 V", standard="IEC"))
    assert "overflux" in codes(a, "problem")


def test_unbalance_from_line_voltages():
    # NEMA MG 1 Part 14: 460/467/450 V -> 1.96 %, derate about 0.95.
    a = assess(machine(NEMA_50HP), site(frequency="60 Hz", voltage="460 V", standard="NEMA",
                                        line_voltages=["460 V", "467 V", "450 V"]))
    assert a.running.derates.unbalance == pytest.approx(0.0196, abs=1e-4)
    assert a.running.derates.factor("unbalance") == pytest.approx(0.95, abs=0.01)
    assert "voltage-unbalance" in codes(a, "warning")


def test_unbalance_above_five_percent_incompatible():
    a = assess(machine(NEMA_50HP), site(frequency="60 Hz", voltage="460 V", standard="NEMA",
                                        unbalance="6 %"))
    assert a.verdict == "incompatible"


def test_altitude_and_ambient_derating_multiply():
    # 2000 m, 50 degC -> 0.86 (common practice: a motor maker's altitude x ambient table, no
    # published standard source)
    a = assess(machine(NEMA_50HP), site(frequency="60 Hz", voltage="460 V", standard="NEMA",
                                        altitude="2000 m", ambient="50 degC",
                                        unbalance="2 %"))
    assert a.running.derates.factor("site") == pytest.approx(0.86)
    assert a.combined_factor == pytest.approx(0.86 * 0.95, abs=0.005)


def test_max_speed_exceeded_on_50_to_60():
    m = machine({"frequency": "50 Hz", "voltage": "400 V", "power": "30 kW", "speed": "980 rpm"},
                max_speed="1100 rpm")
    a = assess(m, site(frequency="60 Hz", voltage="480 V", standard="NEMA"))
    assert "max-speed-exceeded" in codes(a, "problem")


def test_nameplate_current_cross_check():
    # A nameplate current more than ~10 % off P / (sqrt3 V eta PF) is flagged (common practice,
    # no published source).
    m = machine({**NEMA_50HP, "current": "80 A"})
    a = assess(m, site(frequency="60 Hz", voltage="460 V", standard="NEMA"))
    assert "current-mismatch" in codes(a, "warning")


def test_nec_code_current_for_nema_site():
    # 50 hp 460 V -> 65 A [NFPA 70:2008 Table 430.250]; conductors 125 % [NFPA 70:2008 §430.22].
    a = assess(machine(NEMA_50HP), site(frequency="60 Hz", voltage="480 V", standard="NEMA"))
    assert a.code_current_a == 65
    assert "code-current" in codes(a)


def test_service_factor_reset_off_rated_supply():
    # SF applies only at rated voltage and frequency [NEMA MG 1-2016 §14.37] (from memory).
    m = machine(NEMA_50HP, service_factor=1.15)
    on = assess(m, site(frequency="60 Hz", voltage="460 V", standard="NEMA"))
    off = assess(m, site(frequency="50 Hz", voltage="380 V", standard="IEC"))
    assert on.running.service_factor_at_site == 1.15
    assert off.running.service_factor_at_site == 1.0


def test_efficiency_class_required_by_site():
    # 4 kW 4-pole 50 Hz at 85.9 % is below IE2 (86.6 %) [IEC 60034-30-1:2014 §6, 50 Hz table].
    m = machine({"frequency": "50 Hz", "voltage": "400 V", "power": "4 kW", "speed": "1440 rpm",
                 "efficiency": "85.9 %"}, efficiency_class="IE2")
    a = assess(m, site(frequency="50 Hz", voltage="400 V", standard="IEC",
                       min_efficiency_class="IE3"))
    assert "efficiency-below-class" in codes(a, "warning")
    assert "efficiency-class-required" in codes(a, "problem")


def test_demo_shows_all_three_verdicts():
    from machinecheck.cli.main import _demo_path
    from machinecheck.engine.pipeline import assess_all
    from machinecheck.inputs.catalog import load_catalog, load_sites

    results = assess_all(load_catalog(_demo_path("fleet.toml")).machines,
                         load_sites(_demo_path("sites.toml")))
    assert {a.verdict for a in results} == {"compatible", "conditional", "incompatible"}
    assert len(load_catalog(_demo_path("fleet.toml")).machines) >= 10


def test_rated_supply_gives_back_the_plate_through_the_circuit():
    # The circuit estimate reproduces its own plate (by construction); the current is
    # P / (sqrt(3) V eta PF) = 37.28 kW / (sqrt(3) 460 V 0.93 0.85) = 59.2 A (derived).
    a = assess(machine(NEMA_50HP), site(frequency="60 Hz", voltage="460 V", standard="NEMA"))
    assert a.operating_point_basis == "equivalent circuit"
    assert a.expected_speed_rpm == pytest.approx(1775, abs=0.1)
    assert a.running.operating.rule_speed_rpm == pytest.approx(1775, abs=0.1)
    assert a.operating_current_a == pytest.approx(59.2, abs=0.1)
    assert a.running.operating.power_factor == pytest.approx(0.85, abs=1e-3)
    assert a.running.operating.efficiency == pytest.approx(0.93, abs=1e-3)
    assert a.breakdown_margin == pytest.approx(2.5, rel=1e-3)  # the design B figure fitted


def test_incomplete_plate_falls_back_to_the_rules_with_a_finding():
    m = machine({"frequency": "60 Hz", "voltage": "460 V", "power": "50 hp", "speed": "1775 rpm"})
    a = assess(m, site(frequency="60 Hz", voltage="460 V", standard="NEMA"))
    assert a.operating_point_basis == "slip rule"
    assert "circuit-unavailable" in codes(a, "info")
    assert a.expected_speed_rpm == pytest.approx(1775)


def test_deep_undervoltage_stalls_at_full_load():
    # 460 V motor on 208 V: T_max falls as V^2 to 0.20 x its rated-voltage value, 2.5 x 0.20 =
    # 0.51 x rated torque, so the motor cannot carry its rating (analytic from the circuit).
    a = assess(machine(NEMA_50HP), site(frequency="60 Hz", voltage="208 V", standard="NEMA"))
    assert a.running.operating.stalled
    assert "motor-stall" in codes(a, "problem")
    rated_torque = 50 * 745.6999 / (1775 * math.pi / 30)
    op = a.running.operating
    assert op.breakdown_torque_nm / rated_torque == pytest.approx(2.5 * (208 / 460) ** 2, rel=1e-3)
    assert op.stall_torque_nm > op.breakdown_torque_nm


def test_low_breakdown_margin_is_warned():
    # Design C (breakdown 2.2 x rated fitted) at 370 V: 2.2 x (370/460)^2 = 1.42 x rated torque,
    # below the 1.5 margin (threshold: common practice, no published source).
    m = machine({**NEMA_50HP}, design_letter="C",
                load={"type": "constant-torque", "power": "50 hp"})
    a = assess(m, site(frequency="60 Hz", voltage="370 V", standard="NEMA"))
    assert a.breakdown_margin == pytest.approx(2.2 * (370 / 460) ** 2, rel=0.03)
    assert "breakdown-margin" in codes(a, "warning")


def test_overflux_notes_that_the_circuit_ignores_saturation():
    m = machine({"frequency": "60 Hz", "voltage": "400 V", "power": "15 kW", "speed": "1760 rpm",
                 "efficiency": 0.92, "power_factor": 0.84})
    a = assess(m, site(frequency="60 Hz", voltage="440 V", standard="IEC"))
    assert a.flux_ratio == pytest.approx(1.1)
    assert "circuit-saturation" in codes(a, "info")
