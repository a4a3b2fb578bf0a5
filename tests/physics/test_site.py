import pytest

from machinecheck.errors import DomainError
from machinecheck.physics import environment, unbalance


@pytest.mark.parametrize("volts,percent,precision", [
    # Largest deviation from the average over the average [NEMA MG 1-2016 §14.36]; each value
    # worked by hand from that definition (the second printed as "2.5 %" in a relay manual).
    ((462, 463, 455), 1.09, 0.01),
    ((203, 210, 212), 2.5, 0.07),
    ((460, 467, 450), 1.96, 0.01),
    ((480, 476, 472), 0.84, 0.01),
    ((400, 395, 388), 1.61, 0.01),  # (Vmax - Vmin) / Vavg would give about double
])
def test_unbalance_worked_values(volts, percent, precision):
    assert 100 * unbalance.voltage_unbalance(volts) == pytest.approx(percent, abs=precision)


@pytest.mark.parametrize("percent,factor", [
    # [NEMA MG 1-2016 Fig. 14-1] as read from a published transcription; read by eye, so +-0.02.
    (0.5, 1.00), (1.0, 1.00), (1.5, 0.97), (2.0, 0.95), (2.5, 0.93), (3.0, 0.89),
    (3.5, 0.85), (4.0, 0.82), (4.5, 0.78), (5.0, 0.76),
])
def test_unbalance_derating_curve(percent, factor):
    assert unbalance.unbalance_derating(percent / 100) == pytest.approx(factor, abs=0.02)


def test_unbalance_beyond_curve():
    with pytest.raises(DomainError):
        unbalance.unbalance_derating(0.06)


def test_unbalance_heating_rule():
    # Rule of thumb: temperature rise grows by 2 x (unbalance %)^2 %, 3 % -> 18 %
    # [NEMA MG 1-2016 §14.36] (from memory).
    assert unbalance.unbalance_heating(0.03) == pytest.approx(0.18)


@pytest.mark.parametrize("altitude,ambient,factor", [
    # Common practice, no published standard source: a motor maker's altitude x ambient table,
    # whose worked examples are 50 degC at 2000 m -> 0.86 and 55 degC at 3500 m -> 0.71.
    (2000, 50, 0.86), (3500, 55, 0.71), (1000, 40, 1.00), (1000, 45, 0.96),
    (1500, 40, 0.97), (2500, 40, 0.90), (4000, 60, 0.63),
])
def test_site_derating_table(altitude, ambient, factor):
    assert environment.site_derating(altitude, ambient) == pytest.approx(factor, abs=1e-9)


def test_site_derating_interpolates():
    assert environment.site_derating(1250, 40) == pytest.approx(0.985)


def test_site_derating_below_rated_site_is_one_or_more():
    assert environment.site_derating(0, 40) == pytest.approx(1.0)


@pytest.mark.parametrize("altitude,ambient", [(4500, 40), (1000, 65)])
def test_site_derating_outside_table(altitude, ambient):
    # IEC 60034-1: above 4000 m or 60 degC, by agreement.
    with pytest.raises(DomainError):
        environment.site_derating(altitude, ambient)
