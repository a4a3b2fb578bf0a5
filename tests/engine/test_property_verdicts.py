"""Property tests of the verdicts: a motor on the supply it is rated for is compatible, a
frequency deviation inside the tolerance is never a re-rating, and the marked IE class is
never replaced."""

import math

from helpers import machine
from helpers import site as _site
from hypothesis import HealthCheck, given, settings
from hypothesis import strategies as st

from machinecheck.engine.pipeline import assess
from machinecheck.report.data import result_dict

SETTINGS = settings(max_examples=60, deadline=None,
                    suppress_health_check=[HealthCheck.too_slow])

def site(**fields):
    """A three-wire site: the nominal voltage is line-to-line."""
    return _site(wires=3, **fields)


PLATE_VOLTAGES = {"IEC": (230.0, 400.0, 690.0), "NEMA": (230.0, 460.0, 575.0)}


@st.composite
def plates(draw):
    """A consistent three-phase induction-motor plate: its current is P / (sqrt(3) V eta PF)."""
    standard = draw(st.sampled_from(["IEC", "NEMA"]))
    f = 50.0 if standard == "IEC" else 60.0
    volts = draw(st.sampled_from(PLATE_VOLTAGES[standard]))
    power_kw = draw(st.sampled_from([1.1, 4.0, 11.0, 37.0, 90.0]))
    poles = draw(st.sampled_from([2, 4, 6]))
    slip = draw(st.floats(0.01, 0.05))
    eta = draw(st.floats(0.86, 0.95))
    pf = draw(st.floats(0.78, 0.9))
    current = power_kw * 1000 / (math.sqrt(3) * volts * eta * pf)
    plate = {"frequency": f"{f:g} Hz", "voltage": f"{volts:g} V", "power": f"{power_kw} kW",
             "speed": f"{120 * f / poles * (1 - slip):.1f} rpm", "efficiency": round(eta, 3),
             "power_factor": round(pf, 3), "current": f"{current:.2f} A"}
    return standard, f, volts, power_kw, plate


@SETTINGS
@given(plates(), st.sampled_from(["centrifugal", "constant-torque", "constant-power"]))
def test_a_motor_at_its_own_rating_on_a_matching_site_is_compatible(drawn, load_type):
    # At rated voltage, frequency and load, in zone A / inside NEMA MG 1 12.44
    # [IEC 60034-1:2022 §7.3; NEMA MG 1-2016 §12.44], under usual service conditions (1000 m,
    # 40 degC): the motor's rated duty.
    standard, f, volts, power_kw, plate = drawn
    m = machine(plate, load={"type": load_type, "power": f"{power_kw} kW"})
    a = assess(m, site(frequency=f"{f:g} Hz", voltage=f"{volts:g} V", standard=standard))
    assert a.verdict == "compatible", [x for x in a.findings if x.severity != "info"]


@SETTINGS
@given(plates(), st.floats(-0.05, 0.03))
def test_a_frequency_deviation_inside_the_tolerance_never_re_rates(drawn, deviation):
    # Zone B spans -5 % to +3 % of the rated frequency [IEC 60034-1:2022 §7.3]; NEMA +-5 %
    # [NEMA MG 1-2016 §12.44]: a deviation is judged in the zone, never re-rated.
    standard, f, volts, _, plate = drawn
    a = assess(machine(plate), site(frequency=f"{f * (1 + deviation):.3f} Hz",
                                    voltage=f"{volts:g} V", standard=standard))
    assert a.supply.rerated is False
    assert a.running.derates.factor("frequency") is None
    assert "frequency-change" not in {x.code for x in a.findings}


@SETTINGS
@given(plates(), st.sampled_from(["IE1", "IE2", "IE3", "IE4"]),
       st.sampled_from([None, "IE1", "IE2", "IE3", "IE4"]))
def test_the_marked_class_is_never_replaced(drawn, marked, required):
    # The class marked on the plate is the motor's class [IEC 60034-30-1:2014 §6]; the class
    # computed from the plate efficiency is reported beside it.
    standard, f, volts, _, plate = drawn
    fields = {} if required is None else {"min_efficiency_class": required}
    a = assess(machine(plate, efficiency_class=marked),
               site(frequency=f"{f:g} Hz", voltage=f"{volts:g} V", standard=standard, **fields))
    assert a.running.efficiency_class == marked
    assert result_dict(a)["efficiency_class"] == marked
    assert all("as marked" not in x.message for x in a.findings)
