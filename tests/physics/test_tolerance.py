import pytest

from machinecheck.physics import tolerance as tol

# Zone test points derived from the zone polygons of [IEC 60034-1:2022 §7.3] (Figure 14); the
# cut-corner placement at f = 1.00 is from memory.
ZONE_POINTS = [
    (1.00, 1.00, "A"), (1.00, 1.05, "A"), (0.98, 1.03, "A"),
    (0.98, 1.05, "B"), (1.02, 0.95, "B"), (1.03, 0.93, "B"),
    (1.03, 0.92, None), (0.95, 1.05, "B"), (0.95, 1.06, None),
    (1.04, 1.00, None), (0.94, 1.00, None),
    # further edges: zone A frequency limits and zone B voltage limits at rated frequency
    (1.02, 1.00, "A"), (0.98, 1.00, "A"), (1.00, 1.10, "B"), (1.00, 0.90, "B"),
    (1.00, 1.11, None), (1.00, 0.89, None), (1.00, 0.94, "B"), (1.021, 1.00, "B"),
]


@pytest.mark.parametrize("f,u,zone", ZONE_POINTS)
def test_iec_zones(f, u, zone):
    assert tol.iec_zone(u - 1.0, f - 1.0) == zone


# +-10 % V, +-5 % f, |dV| + |df| <= 10 % [NEMA MG 1-2016 §12.44.1]; cases derived from it.
@pytest.mark.parametrize("dv,df,ok", [
    (-0.051, 0.016, True), (0.08, -0.03, False), (0.0, 0.06, False), (-0.10, 0.0, True),
    (-0.06, 0.04, True), (0.10, 0.001, False), (-0.096, 0.0, True),
])
def test_nema_variation(dv, df, ok):
    assert tol.nema_variation(dv, df)[0] is ok


def test_nema_motor_ranges():
    # +-10 % [NEMA MG 1-2016 §12.44.1]: 230 V motor -> 207-253 V; 460 V -> 414-506 V.
    assert tol.nema_variation(207 / 230 - 1, 0)[0]
    assert tol.nema_variation(506 / 460 - 1, 0)[0]
    assert not tol.nema_variation(206 / 230 - 1, 0)[0]


def test_voltage_range_extends_zones():
    # Zones apply outward from the stamped range ends [IEC 60034-1:2022 §7.3].
    assert tol.voltage_deviation(400, 380, 415) == 0.0
    assert tol.voltage_deviation(436, 380, 415) == pytest.approx(436 / 415 - 1)
    assert tol.iec_zone(tol.voltage_deviation(435, 380, 415), 0) == "A"
    assert tol.iec_zone(tol.voltage_deviation(355, 380, 415), 0) == "B"


@pytest.mark.parametrize("system,motor", [(480, 460), (208, 200), (600, 575), (240, 230),
                                          (4160, 4000)])
def test_normal_pairings(system, motor):
    # System vs utilization voltages [ANSI C84.1-2020 Table 1].
    assert tol.is_normal_pairing(system, motor)


def test_not_a_normal_pairing():
    assert not tol.is_normal_pairing(208, 230)
