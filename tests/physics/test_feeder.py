import math

import pytest

from machinecheck.errors import DomainError
from machinecheck.physics import feeder as fd

# NFPA 70 Chapter 9 Table 9 (NEC 2011), metric columns "ohms to neutral per kilometre":
# (size, XL PVC/Al conduit, XL steel conduit, R uncoated copper PVC conduit). The package keeps
# the per-1000-ft columns; converted at 304.8 m they must meet the table's own per-km columns.
TABLE9_PER_KM = [
    ("14 AWG", 0.190, 0.240, 10.2), ("12 AWG", 0.177, 0.223, 6.6), ("10 AWG", 0.164, 0.207, 3.9),
    ("8 AWG", 0.171, 0.213, 2.56), ("6 AWG", 0.167, 0.210, 1.61), ("4 AWG", 0.157, 0.197, 1.02),
    ("3 AWG", 0.154, 0.194, 0.82), ("2 AWG", 0.148, 0.187, 0.62), ("1 AWG", 0.151, 0.187, 0.49),
    ("1/0 AWG", 0.144, 0.180, 0.39),
]


@pytest.mark.parametrize("size,xl_pvc,xl_steel,r_cu", TABLE9_PER_KM)
def test_table9_per_km_columns(size, xl_pvc, xl_steel, r_cu):
    # [NEC 2011 Ch. 9 Table 9]: reactance printed to 3 figures in both units (1 %), resistance
    # to 2 figures per 1000 ft (2 %)
    pvc = fd.nec_table9(size, "copper", "pvc")
    steel = fd.nec_table9(size, "copper", "steel")
    assert pvc.reactance_ohm_per_m * 1000 == pytest.approx(xl_pvc, rel=0.01)
    assert steel.reactance_ohm_per_m * 1000 == pytest.approx(xl_steel, rel=0.01)
    assert pvc.resistance_ohm_per_m * 1000 == pytest.approx(r_cu, rel=0.02)


def _effective_z_rows():
    table = fd.load_table("nec_chapter9_table9")
    for size in table["rows"]:
        for conduit in fd.CONDUITS:
            yield size, conduit


@pytest.mark.parametrize("size,conduit", list(_effective_z_rows()))
def test_table9_effective_z_at_085(size, conduit):
    # [NEC 2011 Ch. 9 Table 9, note 2]: effective Z = R cos theta + X sin theta, printed for
    # 0.85 PF. A 1 A, 1000 ft, single conductor drop at PF 0.85 must give it. Every column is
    # printed to two significant figures (three for X), so the rounding of R, X and Ze adds up
    # to 3 % from 3/0 AWG up and 6 % below (where 0.12 stands for 0.115 to 0.125).
    table = fd.load_table("nec_chapter9_table9")
    row = table["rows"][size]
    printed = row[table["columns"].index(f"ze085_copper_{conduit}")]
    c = fd.nec_table9(size, "copper", conduit)
    z = fd.feeder_impedance(c.resistance_ohm_per_m, c.reactance_ohm_per_m, 304.8)
    drop_per_conductor = fd.voltage_drop(1.0, 0.85, z, phases=3) / math.sqrt(3)
    small = size.endswith("AWG") and size not in ("3/0 AWG", "4/0 AWG")
    assert drop_per_conductor == pytest.approx(printed, rel=0.06 if small else 0.03)


def test_table9_reactance_at_50_hz():
    # Table 9 is for 60 Hz; X = 2 pi f L gives 5/6 of it at 50 Hz [NEC 2011 Ch. 9 Table 9]
    c = fd.conductor("250 kcmil", "copper", 75.0, 50.0)
    assert c.reactance_ohm_per_m == pytest.approx(0.041 / 304.8 * 5 / 6, rel=1e-12)
    assert c.resistance_ohm_per_m == pytest.approx(0.052 / 304.8, rel=1e-12)


@pytest.mark.parametrize("material,alpha75", [("copper", 0.00323), ("aluminium", 0.00330)])
def test_temperature_law_matches_nec_table8_note(material, alpha75):
    # [NEC 2011 Ch. 9 Table 8 note 2]: R2 = R1 (1 + alpha (T2 - 75)), alpha 0.00323 copper,
    # 0.00330 aluminium; our IEC 60287-1-1 law referred to 75 degC gives the same slope.
    r = fd.resistance_at_temperature(1.0, 75.0, 76.0, material)
    assert r - 1.0 == pytest.approx(alpha75, abs=5e-6)


def test_iec_conductor_at_70_degc():
    # [IEC 60228:2004 Table 2] 35 mm2 copper 0.524 ohm/km at 20 degC (from memory); at 70 degC
    # by [IEC 60287-1-1:2006 2.1.1]: 0.524 (1 + 0.00393 * 50) = 0.627 ohm/km
    c = fd.conductor("35 mm2", "copper", 70.0, 50.0)
    assert c.resistance_ohm_per_m * 1000 == pytest.approx(0.627, abs=0.001)
    assert c.reactance_is_default
    assert c.reactance_ohm_per_m == pytest.approx(0.08e-3)  # [IEC 60364-5-52:2009 G.52.1]


def test_annex_g_start_drop_35mm2():
    # [IEC 60364-5-52:2009 Annex G] data in the phase-to-phase form: 35 mm2 copper at start-up,
    # cos phi 0.35, gives 0.52 V per A per km [Electrical Installation Guide, ch. G, Fig. G28
    # (from memory)], so 500 A over 50 m drops 13 V (its example 1, from memory).
    per_a_km = math.sqrt(3) * fd.annex_g_voltage_drop(1.0, 1000.0, 35.0, "copper", 0.35)
    assert per_a_km == pytest.approx(0.52, abs=0.005)
    drop = math.sqrt(3) * fd.annex_g_voltage_drop(500.0, 50.0, 35.0, "copper", 0.35)
    assert drop == pytest.approx(13.0, abs=0.2)


def test_annex_g_single_phase_doubles():
    # b = 2 single-phase, 1 three-phase [IEC 60364-5-52:2009 G.52.1]
    one = fd.annex_g_voltage_drop(20.0, 30.0, 2.5, "copper", 1.0, phases=1)
    three = fd.annex_g_voltage_drop(20.0, 30.0, 2.5, "copper", 1.0, phases=3)
    assert one == pytest.approx(2 * three)
    assert three == pytest.approx(20 * 30 * 0.0225 / 2.5, rel=1e-12)  # 5.4 V


def test_exact_terminal_voltage_close_to_approximation():
    # The approximate drop sqrt(3) I (R cos + X sin) [IEC 60364-5-52 Annex G] against the
    # exact phasor solution [Glover, Sarma & Overbye, 5th ed., sec. 5.1]: within 1 % of the drop
    # at a 4 % drop; and the exact solution closes the phasor triangle.
    z = fd.feeder_impedance(0.627e-3, 0.08e-3, 120.0)
    drop = fd.voltage_drop(100.0, 0.85, z)
    v_t = fd.terminal_voltage(400.0, 100.0, 0.85, z)
    assert 400.0 - v_t == pytest.approx(drop, rel=0.01)
    phi = math.acos(0.85)
    v_r = complex(v_t / math.sqrt(3), 0.0)
    v_s = v_r + 100.0 * complex(math.cos(phi), -math.sin(phi)) * z
    assert abs(v_s) * math.sqrt(3) == pytest.approx(400.0, rel=1e-12)


def test_parallel_runs_divide_impedance():
    assert fd.feeder_impedance(1e-3, 1e-4, 100.0, parallel=2) == pytest.approx(complex(0.05, 0.005))


@pytest.mark.parametrize("text,key", [
    ("35 mm2", "35 mm2"), ("35mm²", "35 mm2"), ("2 AWG", "2 AWG"), ("00 awg", "2/0 AWG"),
    ("250 MCM", "250 kcmil"), ("1/0 AWG", "1/0 AWG"),
])
def test_size_names(text, key):
    assert fd.normalise_size(text) == key


@pytest.mark.parametrize("size,material", [("14 AWG", "aluminium"), ("2000 kcmil", "copper"),
                                           ("1.5 mm2", "aluminium"), ("35 mm2", "gold")])
def test_unknown_conductors(size, material):
    with pytest.raises(DomainError):
        fd.conductor(size, material, 70.0, 50.0)


@pytest.mark.parametrize("name", ["nec_chapter9_table9", "iec60228_class2"])
def test_tables_name_their_source(name):
    table = fd.load_table(name)
    assert table["source"] and table["edition"] and table["unit"]
    assert all(len(row) == len(table["columns"]) for row in table["rows"].values())
