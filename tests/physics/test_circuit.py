"""Equivalent circuit: the textbook forward solve, the nameplate estimate and part load."""

import math

import pytest

from machinecheck.cli.main import _demo_path
from machinecheck.errors import DomainError
from machinecheck.inputs.catalog import load_catalog
from machinecheck.physics import circuit

# S. J. Chapman, Electric Machinery Fundamentals, 4th ed., Example 7-5 (given data and the
# printed answers from memory): 460 V, 25 hp, 60 Hz, four-pole, Y-connected; per phase
# R1 0.641, R2' 0.332, X1 1.106, X2' 0.464, XM 26.3 ohm; rotational losses 1100 W, constant.
CHAPMAN_7_5 = circuit.Circuit(r1_ohm=0.641, x1_ohm=1.106, r2_ohm=0.332, x2_ohm=0.464,
                              xm_ohm=26.3, frequency_hz=60.0, poles=4,
                              rotational_loss_w=1100.0, rated_speed_rpm=1760.4)


def test_chapman_example_7_5_at_2_2_percent_slip():
    op = circuit.operating_point(CHAPMAN_7_5, 460.0, 60.0, 0.022, rotational_loss_w=1100.0)
    # book answers, rounded as printed (3 significant figures)
    assert op.speed_rpm == pytest.approx(1760, abs=0.5)
    assert op.current_a == pytest.approx(18.9, abs=0.05)
    assert math.degrees(math.acos(op.power_factor)) == pytest.approx(33.7, abs=0.05)
    assert op.power_factor == pytest.approx(0.833, abs=0.0015)  # book prints cos 33.7 deg
    assert op.input_power_w == pytest.approx(12_530, rel=0.003)
    assert op.air_gap_power_w == pytest.approx(11_840, rel=0.001)
    assert op.converted_power_w == pytest.approx(11_580, rel=0.001)
    assert op.output_power_w == pytest.approx(10_480, rel=0.001)
    assert op.induced_torque_nm == pytest.approx(62.8, abs=0.05)
    assert op.shaft_torque_nm == pytest.approx(56.8, abs=0.06)
    assert op.efficiency == pytest.approx(0.837, abs=0.001)


def test_solver_finds_the_example_slip_from_its_load_torque():
    # Same example run backwards: the load torque of the book's answer gives back s = 2.2 %.
    # Rotational loss scales with speed squared from 1760.4 rpm, so it is 1100 W there.
    op = circuit.solve(CHAPMAN_7_5, 460.0, 60.0, lambda n: 56.84)
    assert op.slip == pytest.approx(0.022, abs=2e-5)


def test_breakdown_torque_is_the_peak_of_the_torque_curve():
    # Thevenin maximum-torque formula (Chapman 4th ed. sec. 7.6) against a fine slip sweep.
    t_max, s_max = circuit.breakdown(CHAPMAN_7_5, 460.0, 60.0)
    sweep = [(circuit.operating_point(CHAPMAN_7_5, 460.0, 60.0, s / 2000).induced_torque_nm, s)
             for s in range(1, 2001)]
    peak, at = max(sweep)
    assert t_max == pytest.approx(peak, rel=1e-5)
    assert s_max == pytest.approx(at / 2000, abs=1e-3)


def test_breakdown_torque_scales_with_voltage_squared():
    # Analytic: T_max ~ V_th^2 at a fixed frequency.
    low, _ = circuit.breakdown(CHAPMAN_7_5, 414.0, 60.0)
    high, _ = circuit.breakdown(CHAPMAN_7_5, 460.0, 60.0)
    assert low / high == pytest.approx(0.81, rel=1e-9)


def test_stall_when_the_load_exceeds_breakdown():
    t_max, _ = circuit.breakdown(CHAPMAN_7_5, 460.0, 60.0)
    assert circuit.solve(CHAPMAN_7_5, 460.0, 60.0, lambda n: 1.05 * t_max) is None
    assert circuit.solve(CHAPMAN_7_5, 460.0, 60.0, lambda n: 0.9 * t_max) is not None


def _balance_slip(c, load_torque):
    """The stable running slip by plain bisection of shaft torque minus load torque."""
    def balance(s):
        op = circuit.operating_point(c, 460.0, 60.0, s)
        return op.shaft_torque_nm - load_torque(op.speed_rpm)
    lo, hi = 1e-6, circuit.breakdown(c, 460.0, 60.0)[1]
    for _ in range(200):
        mid = 0.5 * (lo + hi)
        lo, hi = (lo, mid) if balance(mid) > 0 else (mid, hi)
    return lo


@pytest.mark.parametrize("load_torque", [
    lambda n: 40.0,                         # constant torque
    lambda n: 56.84 * (n / 1760.0) ** 2,    # centrifugal
    lambda n: 56.84 * 1760.0 / n,           # constant power
    lambda n: 30.0 * (1800.0 / n) ** 6,     # steep: torque climbs fast as speed falls
    lambda n: 60.0 if n > 1763.0 else 45.0,  # a step the slip iteration cannot settle
])
def test_solver_meets_the_load_as_a_bisection_does(load_torque):
    # the shaft torque balance itself (Chapman 4th ed. sec. 7.4-7.5), solved the slow way
    op = circuit.solve(CHAPMAN_7_5, 460.0, 60.0, load_torque)
    expected = _balance_slip(CHAPMAN_7_5, load_torque)
    assert op.slip == pytest.approx(expected, rel=1e-6, abs=1e-9)


def _three_phase_plates():
    for m in load_catalog(_demo_path("fleet.toml")).machines:
        if m.kind != "induction-motor" or m.phases != 3:
            continue
        for rating in m.ratings:
            for c in rating.connections:
                if rating.speed_rpm is None or rating.power_w is None:
                    continue
                yield pytest.param(m, rating, c, id=f"{m.id}-{rating.frequency_hz:g}Hz-{c.name}")


@pytest.mark.parametrize(("m", "rating", "c"), list(_three_phase_plates()))
def test_estimate_gives_back_the_nameplate_point(m, rating, c):
    # Issue requirement: on the rated supply at rated torque the estimate returns the plate's
    # speed, current, power factor and efficiency within a few percent (demo fleet, invented).
    est = circuit.estimate(rating.power_w, c.voltage_v, rating.frequency_hz, m.poles,
                           rating.speed_rpm, current_a=c.current_a,
                           power_factor=rating.power_factor, efficiency=rating.efficiency,
                           design=m.design_letter)
    torque = rating.power_w / (rating.speed_rpm * math.pi / 30.0)
    op = circuit.solve(est, c.voltage_v, rating.frequency_hz, lambda n: torque)
    assert op.speed_rpm == pytest.approx(rating.speed_rpm, abs=0.05)
    assert op.output_power_w == pytest.approx(rating.power_w, rel=1e-4)
    if rating.efficiency is not None:
        assert op.efficiency == pytest.approx(rating.efficiency, rel=0.01)
    if rating.power_factor is not None:
        assert op.power_factor == pytest.approx(rating.power_factor, rel=0.05)
    if c.current_a is not None:
        assert op.current_a == pytest.approx(c.current_a, rel=0.12)
        if est.current_fitted:
            assert op.current_a == pytest.approx(c.current_a, rel=0.01)


def test_demo_fleet_has_plates_to_estimate():
    assert len(list(_three_phase_plates())) >= 10


# A typical IE3 four-pole plate: 11 kW 400 V 50 Hz 1460 rpm 20.7 A PF 0.84 eta 91.4 %
# (reference fact sheet, section 8 worked values; derived).
PLATE = dict(power_w=11_000.0, voltage_v=400.0, frequency_hz=50.0, poles=4, speed_rpm=1460.0)
PLATE_DATA = dict(current_a=20.7, power_factor=0.84, efficiency=0.914)


def _estimate(**extra):
    return circuit.estimate(*PLATE.values(), **{**PLATE_DATA, **extra})


def test_part_load_speed_rises_and_current_falls_to_magnetising():
    est = _estimate()
    rated_torque = 11_000.0 / (1460.0 * math.pi / 30.0)
    points = [circuit.solve(est, 400.0, 50.0, lambda n, f=f: f * rated_torque)
              for f in (1.0, 0.75, 0.5, 0.25, 0.0)]
    speeds = [p.speed_rpm for p in points]
    currents = [p.current_a for p in points]
    factors = [p.power_factor for p in points]
    assert speeds == sorted(speeds)
    assert currents == sorted(currents, reverse=True)
    assert factors == sorted(factors, reverse=True)
    # no load: the current is nearly the magnetising current V_ph / (X1 + Xm)
    magnetising = 400.0 / math.sqrt(3.0) / abs(complex(est.r1_ohm, est.x1_ohm + est.xm_ohm))
    assert currents[-1] == pytest.approx(magnetising, rel=0.05)
    # and it is a plausible share of the rated current for a four-pole LV motor (25-45 %,
    # reference fact sheet 6.5 step 5, from memory)
    assert 0.25 <= currents[-1] / 20.7 <= 0.45
    assert speeds[-1] < 1500.0


@pytest.mark.parametrize(("design", "share"), [("A", 0.5), ("B", 0.4), ("C", 0.3), ("D", 0.5),
                                               ("N", 0.4), ("H", 0.3), (None, 0.4)])
def test_leakage_split_by_design_letter(design, share):
    # IEEE Std 112 empirical X1 / (X1 + X2) by design (from memory); IEC N and H as NEMA B, C.
    est = _estimate(design=design)
    assert est.x1_ohm / (est.x1_ohm + est.x2_ohm) == pytest.approx(share)


def test_breakdown_is_fitted_to_the_design_figure():
    est = _estimate(design="B")
    rated_torque = 11_000.0 / (1460.0 * math.pi / 30.0)
    t_max, s_max = circuit.breakdown(est, 400.0, 50.0)
    assert t_max / rated_torque == pytest.approx(circuit.BREAKDOWN_RATIO["B"], rel=1e-6)
    assert 0.0267 < s_max < 0.5


def test_constant_v_per_hz_keeps_slip_rpm_near_rated():
    # Reference fact sheet, practice 2 (derived from the equivalent circuit): at constant V/f
    # and rated torque the slip in rpm stays nearly constant (stator resistance moves it a
    # little).
    est = _estimate()
    torque = 11_000.0 / (1460.0 * math.pi / 30.0)
    op = circuit.solve(est, 400.0 * 60 / 50, 60.0, lambda n: torque)
    assert 1800.0 - op.speed_rpm == pytest.approx(40.0, rel=0.05)


@pytest.mark.parametrize(("extra", "words"), [
    ({"current_a": None, "power_factor": None}, "two of"),
    ({"efficiency": None, "power_factor": None}, "two of"),
    ({"efficiency": 0.99}, "not possible"),
])
def test_incomplete_or_impossible_plates_are_refused(extra, words):
    with pytest.raises(DomainError, match=words):
        _estimate(**extra)


def test_slip_outside_the_motoring_range_is_refused():
    with pytest.raises(DomainError, match="slip"):
        circuit.estimate(11_000.0, 400.0, 50.0, 4, 1500.0, **PLATE_DATA)


def test_inconsistent_current_is_left_out_of_the_fit():
    # sqrt(3) V I PF eta differs from the output by 20 %: the plate current is not matched,
    # efficiency and power factor are (the reference recipe rejects plates off by > ~5 %).
    est = _estimate(current_a=20.7 * 1.2)
    assert not est.current_fitted
    torque = 11_000.0 / (1460.0 * math.pi / 30.0)
    op = circuit.solve(est, 400.0, 50.0, lambda n: torque)
    assert op.power_factor == pytest.approx(0.84, rel=1e-6)
    assert op.efficiency == pytest.approx(0.914, rel=1e-6)
