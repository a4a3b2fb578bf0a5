import datetime as dt
import math

import pytest
from helpers import machine, site

from machinecheck.cli.sources import demo_path
from machinecheck.engine import remedies
from machinecheck.engine.pipeline import assess
from machinecheck.engine.remedies import load_side
from machinecheck.inputs.catalog import load_catalog, load_sites

NEMA_50HP = {"frequency": "60 Hz", "voltage": "460 V", "power": "50 hp", "speed": "1775 rpm",
             "efficiency": 0.93, "power_factor": 0.85, "current": "58 A"}
MOTOR_230V = {"frequency": "60 Hz", "voltage": "230 V", "power": "10 hp", "speed": "1750 rpm",
              "current": "24.5 A", "efficiency": 0.9, "power_factor": 0.85}


def _one(a, kind):
    found = [r for r in a.remedies if r.kind == kind]
    assert len(found) == 1, [r.kind for r in a.remedies]
    return found[0]


def test_every_demo_pair_that_does_not_fit_has_a_complete_remedy_or_says_why_not():
    # Done-when of the remedies: each incompatible or conditional pair of the demo shows a
    # remedy re-checked as compatible, or a note naming what is left after each remedy.
    machines = load_catalog(demo_path("fleet.toml")).machines
    sites = load_sites(demo_path("sites.toml"))
    seen = 0
    for m in machines:
        for s in sites:
            a = assess(m, s)
            if a.verdict == "compatible":
                assert a.remedies == ()
                continue
            seen += 1
            kinds = [r.kind for r in a.remedies]
            assert kinds[-1] == "pre-energising-checklist"
            fixed = [r for r in a.remedies if r.verdict == "compatible"]
            if not fixed:
                note = _one(a, "no-complete-fix")
                assert "left after each" in note.action
            for r in a.remedies:
                assert r.kind in remedies.KINDS
    assert seen >= 30


def test_re_checks_build_no_remedies_of_their_own():
    a = assess(machine(NEMA_50HP), site(frequency="60 Hz", voltage="208 V", standard="NEMA"),
               remedies=False)
    assert a.verdict == "incompatible" and a.remedies == ()


def test_transformer_for_a_60hz_motor_on_50hz_holds_v_over_f_and_warns_of_overflux():
    # V = V_rated x f_site / f_rated = 460 x 50/60 = 383.3 V [NEMA MG 1-2016 §12.44.2];
    # zone A is +-5 % of it [IEC 60034-1:2022 §7.3]; a 60 Hz transformer on 50 Hz at rated
    # voltage runs at 60/50 = 1.20 x flux [Chapman 5th ed. §2.10].
    a = assess(machine(NEMA_50HP), site(frequency="50 Hz", voltage="400 V", standard="IEC"))
    t = _one(a, "transformer")
    assert t.figure("terminal_voltage_v") == pytest.approx(383.33, abs=0.01)
    assert t.figure("ratio") == pytest.approx(400 / 383.33, abs=1e-3)
    assert any("1.20 x its rated flux" in c for c in t.cautions)
    # kVA on the running input, next size of the R10 series [IEC 60076-1:2011] (from memory)
    need = t.figure("required_va")
    assert need == pytest.approx(math.sqrt(3) * 383.33 * t.figure("current_a"), rel=1e-3)
    assert t.figure("rating_va") >= need
    assert t.figure("rating_va") / 1000 in (25, 31.5, 40, 50, 63, 80)
    # the re-check keeps the nominal-frequency warning: a transformer does not restore speed
    assert t.verdict == "conditional"
    assert "frequency-change" in {f.code for f in t.remaining}


def test_transformer_makes_a_460v_motor_fit_a_208v_site():
    # 208 V on a 460 V rating is -54.8 %, outside +-10 % [NEMA MG 1-2016 §12.44]; a 208:460 V
    # transformer puts the rated voltage on the terminals.
    a = assess(machine(NEMA_50HP), site(frequency="60 Hz", voltage="208 V", standard="NEMA"))
    assert a.verdict == "incompatible"
    t = _one(a, "transformer")
    assert t.figure("secondary_voltage_v") == pytest.approx(460)
    assert t.verdict == "compatible"
    # preferred three-phase ratings [IEEE C57.12.00] (from memory): 45 kVA above ~44 kVA
    assert t.figure("rating_va") / 1000 in (45, 75)


def test_buck_boost_208_to_230_volts_three_units_in_wye():
    # 120 V primaries across 120 V phases, 12 V series windings: 208 x 1.1 = 228.8 V,
    # inside zone A of 230 V [Chapman 5th ed. §2.9] [IEC 60034-1:2022 §7.3]. Each unit
    # carries the line current at its series voltage: S = 12 V x I [Chapman 5th ed. §2.9].
    m = machine(MOTOR_230V)
    a = assess(m, site(frequency="60 Hz", voltage="208 V", standard="NEMA", system="wye",
                       wires=4))
    assert a.verdict == "conditional"
    b = _one(a, "buck-boost")
    assert b.figure("units") == 3
    assert b.figure("output_voltage_v") == pytest.approx(228.8)
    assert b.figure("unit_required_va") == pytest.approx(12 * b.figure("current_a"))
    assert b.figure("unit_rating_va") >= b.figure("unit_required_va")
    assert any("neutral" in c for c in b.cautions)
    assert any("210.9" in c and "215.11" in c and "450.4" in c for c in b.cautions)
    assert b.verdict == "compatible"


def test_buck_boost_open_delta_on_a_three_wire_supply():
    # Two units in open delta on a three-wire supply; 240 V primary, 24 V series winding:
    # 208 x 1.1 = 228.8 V [Chapman 5th ed. §2.9].
    a = assess(machine(MOTOR_230V), site(frequency="60 Hz", voltage="208 V", standard="NEMA",
                                         system="delta", wires=3))
    b = _one(a, "buck-boost")
    assert b.figure("units") == 2
    assert b.figure("output_voltage_v") == pytest.approx(228.8)
    assert not any("neutral" in c for c in b.cautions)


def test_drive_field_weakens_a_460v_motor_fed_at_400v():
    # The drive cannot exceed its input: 460 V 60 Hz motor on a 400 V drive weakens above
    # 60 x 400/460 = 52.17 Hz [Chapman 5th ed. §6.9]; base V/f 460/60 = 7.67 V/Hz.
    a = assess(machine(NEMA_50HP), site(frequency="50 Hz", voltage="400 V", standard="IEC"))
    d = _one(a, "drive")
    assert d.figure("field_weakening_frequency_hz") == pytest.approx(52.17, abs=0.01)
    assert d.figure("volts_per_hertz") == pytest.approx(7.667, abs=1e-3)
    assert d.figure("power_kept") == pytest.approx(400 / 460, abs=1e-3)
    assert any("NEMA MG 1 Parts 30 and 31" in c and "IEC TS 60034-25" in c
               and "IEC 60034-18-41" in c for c in d.cautions)


def test_drive_on_single_phase_input_is_sized_sqrt3_to_2_times_the_motor_current():
    # Common practice, no published source (drive makers' application guides): a three-phase
    # drive on single-phase input is rated sqrt(3) to 2 x the motor current; derates about
    # 1 %/degC above 40 degC and 1 %/100 m above 1000 m.
    m = machine(MOTOR_230V)
    a = assess(m, site(frequency="60 Hz", voltage="230 V", phases=1, standard="NEMA",
                       ambient="45 degC", altitude="1500 m"))
    assert a.verdict == "incompatible"
    d = _one(a, "drive")
    derate = (1 - 0.05) * (1 - 0.05)
    assert d.figure("drive_current_a") == pytest.approx(24.5 * math.sqrt(3) / derate, rel=1e-6)
    assert d.figure("drive_current_high_a") == pytest.approx(24.5 * 2 / derate, rel=1e-6)
    assert any("single-phase supply" in c for c in d.cautions)


def test_pulley_restores_the_load_speed_and_is_rechecked_against_the_output_kept():
    # Belt kinematics [Shigley ch. 17]: 60 -> 50 Hz needs the motor pulley x about 1.2; the
    # restored load then asks its former power of a motor keeping about 5/6 of its output
    # [NEMA MG 1 12.44.2].
    m = machine(NEMA_50HP, load={"type": "centrifugal", "power": "30 kW"})
    a = assess(m, site(frequency="50 Hz", voltage="400 V", standard="IEC"))
    p = _one(a, "pulley")
    assert p.figure("motor_pulley_factor") == pytest.approx(1775 / a.expected_speed_rpm)
    assert 1.18 < p.figure("motor_pulley_factor") < 1.21
    assert p.figure("restored_loading") == pytest.approx(30e3 / a.available_power_w, rel=1e-3)
    assert p.figure("restored_loading") > 1.0
    assert p.verdict == "incompatible"
    assert "load-overload" in {f.code for f in p.remaining}


def test_impeller_trim_keeps_a_faster_pump_within_the_motor():
    # 50 -> 60 Hz: a pump takes 1.2^3 = 1.728 x the power [Karassik Pump Handbook 4th ed.
    # ch. 2]; the trim holding it to the motor is D/D0 = (P_limit/P0)^(1/3) / 1.2.
    m = machine({"frequency": "50 Hz", "voltage": "400 V", "power": "7.5 kW", "speed": "2900 rpm",
                 "efficiency": 0.9, "power_factor": 0.88, "current": "14 A"},
                load={"type": "centrifugal", "power": "6.6 kW"})
    a = assess(m, site(frequency="60 Hz", voltage="480 V", standard="NEMA"))
    assert "load-overload" in {f.code for f in a.findings}
    t = _one(a, "impeller-trim")
    load = a.running.load
    ratio = load.demand_speed_rpm / load.reference_speed_rpm
    p0 = load.demand_w / ratio ** 3
    expected = (a.available_power_w / p0) ** (1 / 3) / ratio
    assert t.figure("diameter_ratio") == pytest.approx(expected, rel=1e-6)
    assert t.figure("power_ratio") == pytest.approx(a.available_power_w / p0, rel=1e-6)
    assert any("NPSH" in c for c in t.cautions)
    assert t.verdict in ("compatible", "conditional")


@pytest.mark.parametrize("load_kw, flow_met", [(7.4, True), (7.8, False)])
def test_no_trim_works_is_flagged(load_kw, flow_met):
    # Q ~ n D and P ~ n^3 D^3 [Karassik Pump Handbook 4th ed. ch. 2]: a trim holding the power
    # to the motor keeps the flow only if the motor gives the pump's former power; a 7.4 kW
    # pump needs D/D0 = 0.84, beyond the 0.85 the diameter laws are trusted for (common
    # practice, no published source); a 7.8 kW pump on a 7.5 kW motor loses flow.
    m = machine({"frequency": "50 Hz", "voltage": "400 V", "power": "7.5 kW", "speed": "2900 rpm",
                 "efficiency": 0.9, "power_factor": 0.88, "current": "14 A"},
                load={"type": "centrifugal", "power": f"{load_kw} kW"})
    a = assess(m, site(frequency="60 Hz", voltage="480 V", standard="NEMA"))
    t = _one(a, "impeller-trim")
    assert t.figure("acceptable") == 0.0
    assert any("beyond 0.85" in c for c in t.cautions)
    assert any("no trim keeps both" in c for c in t.cautions) is not flow_met


def test_replacement_takes_the_region_class_and_carries_the_plate_over():
    # EU: IE3 for 0.75-1000 kW three-phase from 1 July 2021 [EU 2019/1781 Annex I].
    m = machine(NEMA_50HP, service_factor=1.15, cooling="IC411")
    s = site(frequency="50 Hz", voltage="400 V", standard="IEC", region="EU")
    a = assess(m, s)
    r = _one(a, "replacement")
    assert "IE3" in r.action and "EU" in r.action
    assert r.figure("power_w") == pytest.approx(50 * 745.7, rel=1e-3)
    assert r.figure("power_hp") == pytest.approx(50.0, abs=0.01)
    assert r.figure("poles") == 4 and r.figure("frequency_hz") == 50
    assert "IC411" in r.action and "service factor 1.15" in r.action
    assert any("less slip" in c and "instantaneous-trip" in c for c in r.cautions)
    assert r.verdict == "compatible"
    assert r.energy is None and "running hours" in r.energy_missing


def test_replacement_energy_reproduces_the_guide_example():
    # [WMU-HEM] 20 hp, 80 % loaded, 8760 h/yr, 5.5 cents/kWh, 0.88 -> 0.92: saving 284 $/yr
    # (the guide uses 0.746 kW/hp); simple payback = price / saving.
    m = machine({"frequency": "60 Hz", "voltage": "460 V", "power": "14.92 kW",
                 "speed": "1760 rpm", "efficiency": 0.88, "power_factor": 0.85},
                use={"hours": "8760 h", "load_factor": "80 %", "replacement_price": 1420})
    s = site(frequency="60 Hz", voltage="460 V", standard="NEMA",
             tariff={"energy": "0.055 /kWh", "currency": "USD"})
    a = assess(m, s)
    e, missing = load_side.energy(a, 0.92)
    assert missing is None
    assert e.annual_cost == pytest.approx(284, abs=1)
    assert e.payback_years == pytest.approx(1420 / e.annual_cost)
    assert e.currency == "USD"


def test_energy_without_tariff_says_which_input_is_missing():
    m = machine({"frequency": "60 Hz", "voltage": "460 V", "power": "14.92 kW",
                 "speed": "1760 rpm", "efficiency": 0.88, "power_factor": 0.85},
                use={"hours": "8760 h", "load_factor": "80 %"})
    a = assess(m, site(frequency="60 Hz", voltage="460 V", standard="NEMA"))
    e, _ = load_side.energy(a, 0.92)
    assert e.annual_cost is None and e.payback_years is None
    assert "tariff" in e.missing


def test_regulation_of_an_ie2_motor_in_the_eu():
    # IE2 below the IE3 asked of 0.75-1000 kW from 1 July 2021 [EU 2019/1781 Annex I].
    m = machine({"frequency": "50 Hz", "voltage": "400 V", "power": "4 kW", "speed": "1440 rpm",
                 "efficiency": 0.87}, efficiency_class="IE2")
    s = site(frequency="50 Hz", voltage="400 V", standard="IEC", region="EU")
    g = remedies.regulation_of(m, s, 4000.0, 4, today=dt.date(2026, 1, 1))
    assert g.status == "does-not-comply" and g.required_class == "IE3"
    assert g.applies_from == dt.date(2021, 7, 1)
    assert "moved within the market" in g.message
    assert assess(m, s).regulation.status == "does-not-comply"
    assert assess(m, site(frequency="50 Hz", voltage="400 V", standard="IEC")).regulation is None


def test_ranking_by_changes_and_by_running_cost():
    a = assess(machine(MOTOR_230V), site(frequency="60 Hz", voltage="208 V", standard="NEMA",
                                         system="wye", wires=4))
    by_changes = remedies.rank(a.remedies, "changes")
    by_cost = remedies.rank(a.remedies, "running-cost")
    assert by_changes[-1].kind == "pre-energising-checklist"
    compatible = [r.kind for r in by_cost if r.verdict == "compatible"]
    # buck-boost passes only the correction's share through a core, a transformer all of it
    assert compatible.index("buck-boost") < compatible.index("transformer")
    assert [r.changes for r in by_changes if r.verdict == "compatible"] == sorted(
        r.changes for r in by_changes if r.verdict == "compatible")
    with pytest.raises(ValueError):
        remedies.rank(a.remedies, "price")


def test_working_shows_the_remedies_and_their_recheck():
    a = assess(machine(NEMA_50HP), site(frequency="60 Hz", voltage="208 V", standard="NEMA"),
               explain=True)
    lines = [w for w in a.working if w.startswith("remedy ")]
    assert any(w.startswith("remedy transformer:") and w.endswith("compatible") for w in lines)
    assert all("re-checked through the same pipeline" in w for w in lines)


def test_reconnection_names_the_connection_that_fits():
    # A dual-voltage 230/460 V plate on 208 V: the low (230 V) connection, -9.6 %, inside
    # +-10 % [NEMA MG 1-2016 §12.44].
    m = machine({"frequency": "60 Hz", "voltage": ["230 V", "460 V"], "current": ["24.5 A", "12.3 A"],
                 "connection": ["low", "high"], "power": "10 hp", "speed": "1750 rpm",
                 "efficiency": 0.9, "power_factor": 0.85})
    a = assess(m, site(frequency="60 Hz", voltage="208 V", standard="NEMA"))
    r = _one(a, "reconnection")
    assert "low for 230 V" in r.action
    assert r.verdict == a.verdict
    assert not any("1.20 x its rated flux" in c for c in _one(a, "transformer").cautions)


def test_pulley_keeps_the_flow_so_the_duty_shortfall_goes():
    # The load keeps its former speed through the belt [Shigley ch. 17], so its flow is kept;
    # a small pump stays within the 5/6 of output the motor keeps [NEMA MG 1 12.44.2].
    m = machine(NEMA_50HP, load={"type": "centrifugal", "power": "20 kW"})
    a = assess(m, site(frequency="50 Hz", voltage="400 V", standard="IEC"))
    assert "duty-shortfall" in {f.code for f in a.findings}
    p = _one(a, "pulley")
    assert "duty-shortfall" not in {f.code for f in p.remaining}
    assert p.figure("restored_loading") < 1.0
    assert p.verdict == "conditional"  # the nominal-frequency change itself stays a warning


def test_referred_load_scales_by_the_speed_ratio():
    # Seen through a belt of ratio r (load speed over motor speed), a fan's torque at a motor
    # speed n is T(r n) r = T0 r^3 (n/n0)^2, so power and torque at the reference scale by r^3;
    # a constant-torque load's by r [Karassik Pump Handbook 4th ed. ch. 2] (affinity laws).
    from machinecheck.model import Load

    fan = load_side.referred_load(Load("centrifugal", power_w=1000.0, max_speed_rpm=1200.0), 1.2)
    assert fan.power_w == pytest.approx(1728.0)
    assert fan.max_speed_rpm == pytest.approx(1000.0)
    belt = load_side.referred_load(Load("constant-torque", torque_nm=100.0, inertia_kgm2=1.0), 1.2)
    assert belt.torque_nm == pytest.approx(120.0)
    assert belt.inertia_kgm2 == pytest.approx(1.44)


def test_no_large_single_phase_replacement_for_a_three_phase_motor():
    # Single-phase motors above about 7.5 kW (10 hp) are not offered (common practice, no
    # published source); the 37 kW motor on a single-phase site keeps only the drive.
    a = assess(machine(NEMA_50HP), site(frequency="60 Hz", voltage="230 V", phases=1,
                                        standard="NEMA"))
    kinds = [r.kind for r in a.remedies]
    assert "replacement" not in kinds and "drive" in kinds
    small = assess(machine(MOTOR_230V), site(frequency="60 Hz", voltage="230 V", phases=1,
                                             standard="NEMA"))
    assert _one(small, "replacement").verdict == "compatible"
