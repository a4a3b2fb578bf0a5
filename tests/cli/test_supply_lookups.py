"""The supply-path lookups: dip, drop, protect."""

import pytest
from click.testing import CliRunner

from machinecheck.cli.main import main

ENV = {"NO_COLOR": "1", "COLUMNS": "120"}


def run(*args):
    return CliRunner().invoke(main, list(args), env=ENV)


def lines(result):
    return result.stdout.splitlines()


def test_dip_on_a_1000kva_transformer():
    # 1000 kVA 5.75 % -> 17 391 kVA [IEEE Std 141-1993 ch. 4]; 460 V, 2118 A locked rotor ->
    # 1687.5 kVA; divider 1687.5 / (1687.5 + 17 391) = 8.8 % [IEEE Std 399-1997 ch. 9]
    # (arithmetic); smallest transformer 0.0575 x 1687.5 x 0.85 / 0.15 = 550 kVA at the 15 %
    # default (common practice, no published source)
    result = run("dip", "--source", "transformer", "--rating", "1000 kVA", "--impedance",
                 "5.75 %", "--voltage", "460 V", "--locked-rotor-current", "2118 A")
    assert result.exit_code == 0
    out = lines(result)
    assert "S_sc = 17391 kVA" in out[0]
    assert out[2].split()[1] == "8.8"
    assert "550 kVA transformer" in out[3]
    assert out[-1].startswith("caution: Verify with the manufacturer")


def test_dip_star_delta_and_generator():
    # star-delta: a third of the starting kVA [IEEE Std 3002.7-2018] (ideal); generator
    # 150 kVA x''d 15 % -> 1000 kVA [IEEE Std 399-1997 ch. 9]
    result = run("dip", "--source", "generator", "--rating", "150 kVA", "--impedance", "15 %",
                 "--voltage", "460 V", "--locked-rotor-current", "300 A", "--method",
                 "star-delta")
    assert result.exit_code == 0
    out = lines(result)
    assert "S_sc = 1000 kVA" in out[0]
    s_start = 3 ** 0.5 * 460 * 300 / 3 / 1000
    assert f"{s_start:.1f} kVA" in out[1]
    assert f"{100 * s_start / (s_start + 1000):.1f} %" in out[2]
    assert "generator" in out[3]


def test_dip_needs_the_source_data():
    result = run("dip", "--source", "transformer", "--voltage", "460 V",
                 "--locked-rotor-current", "300 A")
    assert result.exit_code == 2
    assert "--rating" in result.stderr
    assert "Traceback" not in result.output


def test_drop_by_the_formula():
    # 35 mm2 copper: 0.524 ohm/km at 20 degC [IEC 60228:2004 Table 2], at 70 degC x (1 +
    # 0.00393 x 50) [IEC 60287-1-1]; X 0.08 mohm/m [IEC 60364-5-52:2009 Annex G]; drop =
    # sqrt(3) I (R cos + X sin) [IEC 60364-5-52:2009 Annex G]
    result = run("drop", "--current", "62 A", "--length", "120 m", "--size", "35 mm2",
                 "--voltage", "400 V")
    assert result.exit_code == 0
    r = 0.524e-3 * (1 + 0.00393 * 50) * 120
    x = 0.08e-3 * 120
    du = 3 ** 0.5 * 62 * (r * 0.85 + x * (1 - 0.85 ** 2) ** 0.5)
    out = lines(result)
    assert f"{du:.2f} V" in out[2]
    assert out[-1].startswith("caution:")


def test_drop_unknown_size_is_one_line():
    result = run("drop", "--current", "62 A", "--length", "120 m", "--size", "37 mm2",
                 "--voltage", "400 V")
    assert result.exit_code == 2
    assert len(result.stderr.strip().splitlines()) == 1


@pytest.mark.parametrize("edition,table", [("2020", "Table 430.52"),
                                           ("2023", "Table 430.52(C)(1)")])
def test_protect_50hp_460v(edition, table):
    # NEC Table 430.250: 50 hp 460 V -> 65 A [NFPA 70-2023]; 430.22 125 % -> 81.25 A;
    # 430.32(A)(1) SF 1.15 -> 125 % of 58 A = 72.5 A; Table 430.52 dual-element fuse 175 % ->
    # 113.75 A, next standard size 125 A (240.6(A)); inverse-time breaker 250 % -> 162.5 A ->
    # 175 A; 430.110 115 % -> 74.75 A [NFPA 70-2023]
    result = run("protect", "--power", "50 hp", "--voltage", "460 V", "--current", "58 A",
                 "--service-factor", "1.15", "--edition", edition)
    assert result.exit_code == 0
    text = result.stdout
    assert "code current      65 A" in text
    assert ">= 81.2 A" in text
    assert "overload maximum  72.5 A" in text
    assert "overload dial     58.0 A" in text
    assert "113.8 A, at most 125 A" in text
    assert "162.5 A, at most 175 A" in text
    assert f"NEC {edition} {table})" in text
    assert ">= 74.8 A" in text
    assert lines(result)[-1].startswith("caution:")


def test_protect_star_delta():
    # 430.22(C): 58 % x 125 % of 65 A = 47.1 A; relay in the windings at 58 / sqrt(3) = 33.5 A
    result = run("protect", "--power", "50 hp", "--voltage", "460 V", "--current", "58 A",
                 "--star-delta")
    assert result.exit_code == 0
    assert "motor leads       >= 47.1 A" in result.stdout
    assert "overload dial     33.5 A" in result.stdout
    # no service factor marked: 115 % (430.32(A)(1)), in the windings: 1.15 x 58 / sqrt(3)
    assert f"overload maximum  {1.15 * 58 / 3 ** 0.5:.1f} A" in result.stdout
