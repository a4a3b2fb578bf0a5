"""The supply path of whole pairs against hand calculations.

The hand calculations below use plain complex arithmetic and the textbook torque formula, not
the engine's physics functions, so that they can disagree with the engine.
"""

import cmath
import math

import pytest
from helpers import codes, machine, site

from machinecheck.engine.pipeline import assess
from machinecheck.engine.starting import NO_SOURCE

SQ3 = math.sqrt(3.0)
# [Chapman 2005 Ex. 7-5] 460 V, 25 hp, 60 Hz, four-pole, Y: R1 0.641, R2' 0.332, X1 1.106,
# X2' 0.464, XM 26.3 ohm (from memory; the circuit the physics tests reproduce)
R1, R2, X1, X2, XM = 0.641, 0.332, 1.106, 0.464, 26.3
CIRCUIT = {"r1": R1, "r2": R2, "x1": X1, "x2": X2, "xm": XM}


def z_input(slip):
    """Input impedance per phase of the T-circuit at a slip [Chapman 2005 sec. 7.3]."""
    rotor = complex(R2 / slip, X2)
    return complex(R1, X1) + (1j * XM * rotor) / (1j * XM + rotor)


Z_LR = z_input(1.0)
I_LR = 460.0 / SQ3 / abs(Z_LR)  # locked-rotor current at 460 V from the circuit


def torque(v_line, slip, f=60.0, poles=4):
    """Induced torque by the Thevenin form [Chapman 2005 sec. 7.5, eq. for tau_ind]."""
    w_sync = 4.0 * math.pi * f / poles
    v_th = v_line / SQ3 * XM / abs(complex(R1, X1 + XM))
    z_th = (1j * XM * complex(R1, X1)) / complex(R1, X1 + XM)
    return 3 * v_th ** 2 * R2 / slip / (w_sync * ((z_th.real + R2 / slip) ** 2
                                                  + (z_th.imag + X2) ** 2))


def motor(start=None, feeder=None, load=None, lr_torque=None, **extra):
    rating = {"frequency": "60 Hz", "voltage": "460 V", "current": "32 A", "power": "25 hp",
              "speed": "1760 rpm", "power_factor": 0.85, "efficiency": 0.90,
              "locked_rotor_current": f"{I_LR:.3f} A", "inertia": "0.2 kg m2"}
    if lr_torque is not None:
        rating["locked_rotor_torque"] = lr_torque
    fields = {"id": "M25", "phases": 3, "circuit": CIRCUIT, "service_factor": 1.15,
              "load": load or {"type": "centrifugal", "power": "18 hp", "inertia": "1.0 kg m2",
                               "breakaway_torque": "10 %"}, **extra}
    if start is not None:
        fields["start"] = start
    if feeder is not None:
        fields["feeder"] = feeder
    return machine(rating, **fields)


def nema_site(source=None, **extra):
    fields = {"frequency": "60 Hz", "voltage": "460 V", "standard": "NEMA", **extra}
    if source is not None:
        fields["source"] = source
    return site(**fields)


TRANSFORMER = {"kind": "transformer", "rating": "1000 kVA", "impedance": "5.75 %",
               "x_over_r": 6.0}
CABLE = {"length": "60 m", "size": "4 AWG", "material": "copper"}


def z_transformer(rating_va, z_pu, x_over_r, v=460.0):
    mag = z_pu * v * v / rating_va
    r = mag / math.sqrt(1 + x_over_r ** 2)
    return complex(r, r * x_over_r)


# NFPA 70 Chapter 9 Table 9, 4 AWG copper in PVC conduit: R 0.31, XL 0.048 ohm per 1000 ft at
# 75 degC, 60 Hz [NFPA 70-2023] (the table's own temperature and frequency: no correction)
Z_CABLE = complex(0.31, 0.048) * 60.0 / 304.8


def accel_time_by_hand(v_line, j, load_t, end_rpm, steps=20000, torque_factor=1.0):
    """Trapezoid rule on t = integral J dw / (T_m - T_L) [IEEE Std 3002.7-2018]."""
    w_sync = 2 * math.pi * 1800 / 60
    w_end = end_rpm * math.pi / 30
    total, prev = 0.0, None
    for i in range(steps + 1):
        w = w_end * i / steps
        net = torque_factor * torque(v_line, 1 - w / w_sync) - load_t(w)
        value = j / net
        if prev is not None:
            total += 0.5 * (prev + value) * w_end / steps
        prev = value
    return total


def test_whole_pair_1000kva_transformer_direct_on_line_through_4awg():
    a = assess(motor(start={"method": "direct-on-line", "trip_class": "10"}, feeder=CABLE),
               nema_site(TRANSFORMER))
    s = a.starting
    assert s is not None
    # S_sc = 1000 kVA / 0.0575 = 17 391 kVA [IEEE Std 141-1993 ch. 4] (arithmetic, the physics
    # tests' published case), to 0.1 %
    assert s.source.short_circuit_power_va == pytest.approx(17.391e6, rel=1e-3)
    z_s = z_transformer(1000e3, 0.0575, 6.0)
    assert s.source.impedance_ohm == pytest.approx(z_s, rel=1e-9)
    assert s.feeder.impedance_ohm == pytest.approx(Z_CABLE, rel=1e-9)
    # the divider [IEEE Std 399-1997 ch. 9] by hand
    total = z_s + Z_CABLE + Z_LR
    assert s.dip_terminals == pytest.approx(1 - abs(Z_LR / total), rel=1e-4)
    assert s.dip_bus == pytest.approx(1 - abs((Z_CABLE + Z_LR) / total), rel=1e-4)
    assert 0.0 < s.dip_bus < s.dip_terminals < 0.15
    v_start = 460 * (1 - s.dip_terminals)
    assert s.starting_voltage_v == pytest.approx(v_start, rel=1e-9)
    # the running terminal voltage: exact phasor form at the nameplate current and power
    # factor [Glover 2012 sec. 5.1]
    i_run = 32.0 * cmath.exp(-1j * math.acos(0.85))
    v_r = abs(460 / SQ3 - i_run * Z_CABLE)  # first-order magnitude, within 0.05 %
    assert a.supply.terminal_voltage_v == pytest.approx(SQ3 * v_r, rel=5e-4)
    assert s.running_drop.drop == pytest.approx(1 - SQ3 * v_r / 460, abs=5e-4)
    # acceleration by the trapezoid rule against the engine's adaptive Simpson, 0.5 %
    t_load = 18 * 745.7 / (1760 * math.pi / 30)
    t0 = 0.10 * 25 * 745.7 / (1760 * math.pi / 30)
    w_ref = 1760 * math.pi / 30

    def load(w):
        return t0 + (t_load - t0) * (w / w_ref) ** 2

    end = 0.95 * a.running.expected_speed_rpm
    t_hand = accel_time_by_hand(v_start, 1.2, load, end)
    assert s.acceleration_time_s == pytest.approx(t_hand, rel=5e-3)
    # trip: IEC 60947-4-1 class 10 lower limit 4 s at 7.2 x setting [IEC 60947-4-1], moved
    # by I^2 t to the starting multiple
    multiple = v_start / (SQ3 * abs(Z_LR)) / 32.0
    assert s.trip_multiple == pytest.approx(multiple, rel=1e-4)
    assert s.trip_time_cold_s == pytest.approx(4.0 * (7.2 / multiple) ** 2, rel=1e-4)
    assert s.trip_time_cold_s > s.acceleration_time_s  # a margin: no trip finding
    assert "overload-trips-before-acceleration-ends" not in codes(a)
    # available fault current: c = 1.10 (IEC 60909-0:2016 Table 1, LV +10 %), the cable's
    # resistance moved from 75 to 20 degC for the largest current (IEC 60909-0:2016, from
    # memory) by a20 = 0.00393 /K [IEC 60287-1-1]
    cold = complex(Z_CABLE.real / (1 + 0.00393 * 55), Z_CABLE.imag)
    assert s.fault_current_a == pytest.approx(1.10 * 460 / (SQ3 * abs(z_s + cold)), rel=1e-9)
    # the smallest transformer: S_sc >= S (1 - d) / d, S_T = z / (1 / S_sc) (arithmetic)
    s_start = 460 ** 2 / abs(Z_LR)
    assert s.minimum_source_va == pytest.approx(0.0575 * s_start * 0.85 / 0.15, rel=1e-4)
    assert a.protection is not None and a.protection.caution.startswith("Verify")


def test_star_delta_third_of_current_and_torque():
    dol = assess(motor(lr_torque="200 %", start={"method": "direct-on-line"}),
                 nema_site(TRANSFORMER)).starting
    yd = assess(motor(lr_torque="200 %", start={"method": "star-delta", "trip_class": "10"}),
                nema_site(TRANSFORMER))
    s = yd.starting
    # star-delta: 1/3 of the line current and torque [IEEE Std 3002.7-2018] (ideal)
    assert s.current_factor == pytest.approx(1 / 3)
    z_s = z_transformer(1000e3, 0.0575, 6.0)
    assert s.dip_terminals == pytest.approx(1 - abs(3 * Z_LR / (z_s + 3 * Z_LR)), rel=1e-4)
    assert s.dip_terminals < dol.dip_terminals / 2.5
    t_rated = 25 * 745.7 / (1760 * math.pi / 30)
    k = 460 * (1 - s.dip_terminals) / 460
    assert s.starting_torque_nm == pytest.approx(2.0 * t_rated / 3 * k * k, rel=1e-4)
    assert s.changeover_speed_rpm is not None and s.changeover_speed_rpm > 0.75 * 1800
    assert s.acceleration_time_s > dol.acceleration_time_s
    # relay in the phase windings at I / sqrt(3) (common practice); the motor leads on 58 %
    # of the table current x 125 % [NFPA 70-2023 430.22(C)]; NEC Table 430.250 25 hp 460 V:
    # 34 A [NFPA 70-2023]
    p = yd.protection
    assert p.overload_dial.current_a == pytest.approx(32 / SQ3)
    assert p.table_current_a == pytest.approx(34.0)
    assert p.motor_lead_ampacity.current_a == pytest.approx(34 * 0.58 * 1.25)
    assert p.conductor_ampacity.current_a == pytest.approx(34 * 1.25)
    # 430.32(A)(1): SF 1.15 -> 125 % of the nameplate current, / sqrt(3) in the windings
    assert p.overload_maximum.current_a == pytest.approx(1.25 * 32 / SQ3)
    assert s.trip_multiple == pytest.approx(s.starting_current_a / (32 / SQ3))


def test_generator_dip_and_smallest_set():
    gen = {"kind": "generator", "rating": "150 kVA", "subtransient_reactance": "15 %",
           "prime_mover_power": "20 kW"}
    a = assess(motor(lr_torque="200 %", start={"method": "direct-on-line"}), nema_site(gen))
    s = a.starting
    # S_sc = S_G / x''d = 1 MVA [IEEE Std 399-1997 ch. 9]
    assert s.source.short_circuit_power_va == pytest.approx(1.0e6, rel=1e-9)
    z_g = 1j * 0.15 * 460 ** 2 / 150e3
    assert s.dip_bus == pytest.approx(1 - abs(Z_LR / (z_g + Z_LR)), rel=1e-4)
    s_start = 460 ** 2 / abs(Z_LR)
    # x''d S_start (1 - d) / d at the 15 % default (common practice, no published source)
    assert s.minimum_source_va == pytest.approx(0.15 * s_start * 0.85 / 0.15, rel=1e-4)
    assert s.minimum_source_kind == "generator"
    # the prime mover: P = S cos phi_LR, with the circuit's locked-rotor power factor
    pf = math.cos(cmath.phase(Z_LR))
    assert s.starting_active_power_w == pytest.approx(s_start * pf, rel=1e-4)
    assert "prime-mover-starting-power" in codes(a, "warning")


def test_too_small_source_will_not_start_and_dip_exceeds_limit():
    small = {"kind": "transformer", "rating": "30 kVA", "impedance": "5.75 %"}
    load = {"type": "constant-torque", "power": "20 hp", "inertia": "1.0 kg m2",
            "breakaway_torque": "150 %"}
    a = assess(motor(lr_torque="150 %", load=load, start={"method": "direct-on-line"}),
               nema_site(small, limits={"starting_dip": "15 %"}))
    s = a.starting
    # S_sc = 30 / 0.0575 = 522 kVA; the dip well over 15 %; torque x (1 - dip)^2 < 150 %
    assert s.dip_terminals > 0.15
    assert s.starting_torque_nm < s.breakaway_torque_nm
    assert {"will-not-start"} <= codes(a, "problem")
    assert {"dip-exceeds-limit"} <= codes(a, "warning")
    assert a.verdict == "incompatible"


def test_no_source_is_stiff_and_says_so():
    a = assess(motor(start={"method": "direct-on-line"}), nema_site())
    s = a.starting
    assert s.source is None and s.source_note == NO_SOURCE
    assert s.dip_bus is None and s.dip_terminals is None
    assert s.fault_current_a is None and s.minimum_source_va is None
    # nothing of a supply path given: no starting record at all
    bare = assess(machine({"frequency": "60 Hz", "voltage": "460 V", "power": "25 hp",
                           "speed": "1760 rpm", "current": "32 A"}), nema_site())
    assert bare.starting is None and bare.protection is None


def test_feeder_drop_judged_at_the_terminals():
    # 4 AWG over 1000 m: about 11.5 % drop at 32 A PF 0.85 (hand: sqrt(3) I (R cos + X sin))
    long_cable = dict(CABLE, length="1000 m")
    a = assess(motor(feeder=long_cable), nema_site())
    z = Z_CABLE * 1000 / 60
    approx = SQ3 * 32 * (z.real * 0.85 + z.imag * math.sqrt(1 - 0.85 ** 2)) / 460
    assert a.starting.running_drop.drop == pytest.approx(approx, rel=0.02)
    assert not a.supply.tolerance.within
    assert {"terminal-voltage-out-of-zone", "voltage-drop-exceeds-limit"} <= codes(a)
    # the same motor on the bus: within the tolerance
    assert assess(motor(), nema_site()).supply.tolerance.within


def test_flux_ratio_follows_the_terminal_voltage():
    a = assess(motor(feeder=CABLE), nema_site())
    v = a.supply.terminal_voltage_v
    assert v < 460.0
    assert a.choice.flux_ratio == pytest.approx(v / 460.0, rel=1e-9)
    assert a.supply.supply_voltage_v == 460.0


@pytest.mark.parametrize("start,current_factor", [
    # autotransformer at tap k: current and torque x k^2; soft starter: I_lim / I_LR
    # [IEEE Std 3002.7-2018] (ideal, common practice)
    ({"method": "autotransformer", "tap": "65 %"}, 0.65 ** 2),
    ({"method": "soft-starter", "current_limit": "300 %"}, 3 * 32 / I_LR),
])
def test_reduced_voltage_starts(start, current_factor):
    a = assess(motor(lr_torque="200 %", start=start), nema_site(TRANSFORMER))
    s = a.starting
    assert s.current_factor == pytest.approx(current_factor, rel=1e-3)
    z_s = z_transformer(1000e3, 0.0575, 6.0)
    z_m = Z_LR / current_factor
    assert s.dip_terminals == pytest.approx(1 - abs(z_m / (z_s + z_m)), rel=1e-3)
    assert s.acceleration_time_s is not None
    assert any("common practice" in n for n in s.notes)


def test_utility_source_by_fault_current():
    # S_sc = sqrt(3) U I_k [IEC 60909-0:2016]: 460 V, 20 kA -> 15.93 MVA; no X/R given: a
    # pure reactance, said in the notes
    a = assess(motor(start={"method": "direct-on-line"}),
               nema_site({"kind": "utility", "fault_current": "20 kA"}))
    s = a.starting
    assert s.source.short_circuit_power_va == pytest.approx(SQ3 * 460 * 20e3, rel=1e-9)
    assert s.source.impedance_ohm.real == 0.0
    assert any("pure reactance" in n for n in s.notes)
    assert s.minimum_source_va is None  # a utility: no size to choose
