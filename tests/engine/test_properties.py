"""Property-based tests: generated inputs never raise anything but the project's errors, and the
physics keeps its monotonic relations."""

import json
import math

import pytest
from helpers import machine, site
from hypothesis import HealthCheck, given, settings
from hypothesis import strategies as st

from machinecheck.engine.assessment import VERDICTS
from machinecheck.engine.pipeline import assess
from machinecheck.errors import MachinecheckError
from machinecheck.inputs.catalog import catalog_from_data, sites_from_data
from machinecheck.physics import current, speed
from machinecheck.report.data import result_dict

SETTINGS = settings(max_examples=150, deadline=None,
                    suppress_health_check=[HealthCheck.too_slow])

junk = st.one_of(st.none(), st.booleans(), st.integers(-10**6, 10**6),
                 st.floats(allow_nan=True, allow_infinity=True), st.text(max_size=12),
                 st.lists(st.text(max_size=6), max_size=3), st.dictionaries(st.text(max_size=4),
                                                                            st.integers(), max_size=2))
volts = st.sampled_from(["230 V", "400 V", "460 V", "480 V", "690 V", "208 V", "575 V", "4.16 kV"])
freqs = st.sampled_from(["50 Hz", "60 Hz", 50, 60, "51 Hz", "59 Hz"])
powers = st.sampled_from(["0.75 kW", "4 kW", "11 kW", "55 kW", "10 hp", "100 hp", "500 kVA"])


@st.composite
def rating_dicts(draw):
    f = draw(st.sampled_from([50, 60]))
    poles = draw(st.sampled_from([2, 4, 6, 8]))
    n_s = 120 * f / poles
    rating = {"frequency": f"{f} Hz", "voltage": draw(volts), "power": draw(powers),
              "speed": f"{n_s * (1 - draw(st.floats(0.005, 0.08))):.1f} rpm"}
    if draw(st.booleans()):
        rating["efficiency"] = draw(st.floats(0.7, 0.97))
        rating["power_factor"] = draw(st.floats(0.7, 0.95))
    if draw(st.booleans()):
        rating["current"] = f"{draw(st.floats(1, 500)):.1f} A"
    return rating


@st.composite
def machine_dicts(draw):
    data = {"id": draw(st.text(min_size=1, max_size=8)), "rating": [draw(rating_dicts())],
            "phases": draw(st.sampled_from([1, 3, 3, 3])),
            "kind": draw(st.sampled_from(["induction-motor", "induction-motor", "synchronous-motor",
                                          "synchronous-generator"]))}
    if data["kind"] != "induction-motor":
        data["poles"] = round(120 * float(data["rating"][0]["frequency"].split()[0])
                              / float(data["rating"][0]["speed"].split()[0]) / 2) * 2
        data["rating"][0]["speed"] = None
        del data["rating"][0]["speed"]
    if draw(st.booleans()) and data["kind"] != "synchronous-generator":
        data["load"] = {"type": draw(st.sampled_from(["centrifugal", "constant-torque",
                                                      "constant-power"])),
                        "power": f"{draw(st.floats(0.1, 80)):.2f} kW"}
    if draw(st.booleans()):  # corrupt one field
        target = data if draw(st.booleans()) else data["rating"][0]
        key = draw(st.sampled_from(sorted(target) + ["extra_key"]))
        target[key] = draw(junk)
    return data


@st.composite
def site_dicts(draw):
    data = {"id": "S", "frequency": draw(freqs), "voltage": draw(volts),
            "phases": draw(st.sampled_from([1, 2, 3, 3])),
            "standard": draw(st.sampled_from(["IEC", "NEMA"])),
            "altitude": f"{draw(st.integers(0, 5000))} m",
            "ambient": f"{draw(st.integers(-20, 65))} degC"}
    if draw(st.booleans()):
        data["unbalance"] = f"{draw(st.floats(0, 8)):.2f} %"
    if draw(st.booleans()):
        data[draw(st.sampled_from(sorted(data)))] = draw(junk)
    return data


def _finite(value):
    if isinstance(value, float):
        assert math.isfinite(value)
    elif isinstance(value, dict):
        for item in value.values():
            _finite(item)
    elif isinstance(value, list):
        for item in value:
            _finite(item)


@SETTINGS
@given(machine_dicts(), site_dicts())
def test_generated_inputs_raise_only_project_errors(machine_data, site_data):
    try:
        machines = catalog_from_data({"machine": [machine_data]}, "gen").machines
        sites = sites_from_data({"site": [site_data]}, "gen")
    except MachinecheckError:
        return
    a = assess(machines[0], sites[0], explain=True)
    assert a.verdict in VERDICTS
    data = result_dict(a, explain=True)
    _finite(data)
    json.dumps(data, allow_nan=False)


@given(st.sampled_from([2, 4, 6, 8, 10, 12]), st.floats(10, 400))
def test_synchronous_speed_monotonic(poles, f):
    assert speed.synchronous_speed(f, poles) > speed.synchronous_speed(f, poles + 2)
    assert speed.synchronous_speed(f * 1.1, poles) > speed.synchronous_speed(f, poles)


@given(st.floats(100, 1e6), st.floats(100, 10000), st.floats(0.5, 1), st.floats(0.5, 1))
def test_current_falls_as_voltage_rises(power, v, eta, pf):
    assert current.full_load_current(power, v * 1.05, eta, pf) < current.full_load_current(
        power, v, eta, pf)


NEMA_MOTOR = {"frequency": "60 Hz", "voltage": "460 V", "power": "50 hp", "speed": "1775 rpm",
              "efficiency": 0.93, "power_factor": 0.85}


@SETTINGS
@given(st.sampled_from(["380 V", "400 V", "460 V", "480 V", "415 V"]),
       st.sampled_from(["50 Hz", "60 Hz"]), st.integers(0, 4000), st.integers(20, 60),
       st.floats(0, 5))
def test_available_output_never_exceeds_rated_times_factors(v, f, altitude, ambient, unb):
    a = assess(machine(NEMA_MOTOR), site(voltage=v, frequency=f, altitude=f"{altitude} m",
                                         ambient=f"{ambient} degC", unbalance=f"{unb} %"))
    product = 1.0
    for _, value in a.running.derates.factors:
        assert 0 <= value <= 1
        product *= value
    assert a.available_power_w <= a.rated_power_w * product + 1e-6


@SETTINGS
@given(st.floats(0, 6), st.floats(0, 6), st.integers(0, 4500), st.integers(0, 4500))
def test_verdict_never_improves_when_conditions_worsen(u1, u2, alt1, alt2):
    low_u, high_u = sorted((u1, u2))
    low_alt, high_alt = sorted((alt1, alt2))
    m = machine(NEMA_MOTOR)
    better = assess(m, site(voltage="460 V", frequency="60 Hz", standard="NEMA",
                            unbalance=f"{low_u} %", altitude=f"{low_alt} m"))
    worse = assess(m, site(voltage="460 V", frequency="60 Hz", standard="NEMA",
                           unbalance=f"{high_u} %", altitude=f"{high_alt} m"))
    assert VERDICTS.index(worse.verdict) >= VERDICTS.index(better.verdict)
    assert worse.available_power_w <= better.available_power_w + 1e-6


@st.composite
def plates(draw):
    """Plausible three-phase plates: slip 0.5-8 %, efficiency below 1 - slip, PF 0.6-0.95."""
    f = draw(st.sampled_from([50.0, 60.0]))
    poles = draw(st.sampled_from([2, 4, 6, 8]))
    slip = draw(st.floats(0.005, 0.08))
    eta = draw(st.floats(0.6, min(0.97, 1.0 - slip - 0.01)))
    return dict(power_w=draw(st.floats(500.0, 2.0e6)), voltage_v=draw(st.sampled_from(
                [230.0, 400.0, 460.0, 690.0, 4160.0])), frequency_hz=f, poles=poles,
                speed_rpm=120.0 * f / poles * (1.0 - slip), efficiency=eta,
                power_factor=draw(st.floats(0.6, 0.95)),
                design=draw(st.sampled_from([None, "A", "B", "C", "D", "N", "H"])))


@SETTINGS
@given(plates(), st.floats(0.0, 1.0))
def test_circuit_returns_its_plate_and_behaves_at_part_load(plate, load):
    # The estimate reproduces the rated point; at lower load the speed is higher and the
    # current lower (Chapman ch. 7 torque-speed behaviour); nothing is NaN.
    from machinecheck.physics import circuit

    try:
        est = circuit.estimate(**plate)
    except MachinecheckError:
        return  # a plate no circuit fits is refused, never mis-fitted
    torque = plate["power_w"] / (plate["speed_rpm"] * math.pi / 30.0)
    rated = circuit.solve(est, plate["voltage_v"], plate["frequency_hz"], lambda n: torque)
    assert rated.speed_rpm == pytest.approx(plate["speed_rpm"], rel=1e-5)
    assert rated.efficiency == pytest.approx(plate["efficiency"], rel=1e-4)
    assert rated.power_factor == pytest.approx(plate["power_factor"], rel=1e-4)
    part = circuit.solve(est, plate["voltage_v"], plate["frequency_hz"],
                         lambda n: load * torque)
    assert part.speed_rpm >= rated.speed_rpm - 1e-6
    assert part.current_a <= rated.current_a * (1 + 1e-9)
    assert all(math.isfinite(x) for x in (part.current_a, part.power_factor, part.speed_rpm))


@SETTINGS
@given(machine_dicts())
def test_catalog_round_trips_through_a_csv_inventory(machine_data):
    # Whatever a TOML catalog accepts, its CSV form gives back the same machines.
    import dataclasses

    from machinecheck.inputs.inventory import load_inventory, to_csv

    try:
        machines = catalog_from_data({"machine": [machine_data]}, "gen").machines
    except MachinecheckError:
        return
    import tempfile

    with tempfile.TemporaryDirectory() as folder:
        path = f"{folder}/inventory.csv"
        with open(path, "w", encoding="utf-8", newline="") as handle:
            handle.write(to_csv({"machine": [machine_data]}))
        back = load_inventory(path).machines
    assert [dataclasses.replace(m, source=None) for m in back] == [
        dataclasses.replace(m, source=None) for m in machines]
    # and written as TOML, the same again
    from machinecheck.inputs.catalog import tomllib
    from machinecheck.inputs.inventory import to_toml

    again = catalog_from_data(tomllib.loads(to_toml({"machine": [machine_data]})), "gen").machines
    assert again == machines
